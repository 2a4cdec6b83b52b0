"""The interpreter's heights as the pilot flies them: MSL / AGL / IND / FL labels, the
heights setting, flight levels as input, the levels and cold words, the report's
altimeter section and the cold-air warning. Scripted sessions; outside values name
their source. The fields are invented."""
import math

import pytest

from lapsecalc.column import Column
from lapsecalc.shell import Session

M_PER_FT = 0.3048  # exact (REFERENCES.md "Units")
RD, G0 = 287.05287, 9.80665  # ICAO Doc 7488/3

# An invented arctic strip: 750 m, -28 degC, dewpoint -31 degC, QNH 1031 hPa, ISA lapse.
COLD = "elev 750m temp -28C dew -31C qnh 1031 elr 6.5 top 9000m"
COLD_COL = (-28.0, -31.0, 1031.0, 750.0, 6.5, 9000.0)


def isa_pa(p_hpa):
    # Pressure altitude, m, ISA troposphere (ICAO Doc 7488/3): T0/L (1 - (p/p0)^(R L/g0)).
    return 288.15 / 0.0065 * (1.0 - (p_hpa / 1013.25) ** (RD * 0.0065 / G0))


def ind_of(col, z):
    # An altimeter set to QNH reads PA(p) - PA(QNH) (REFERENCES.md "Altimetry").
    return isa_pa(col.p_at(z)) - isa_pa(col.qnh_hpa)


def icao_cold(h, t_ad, h_ad):
    # ICAO PANS-OPS (Doc 8168 Vol. I) formula as in REFERENCES.md "Altimetry" (from
    # memory there): (-dT/L0) ln(1 + L0 h / (T0 + L0 h_ad)).
    l0 = -0.0065
    dt = t_ad - (15.0 + l0 * h_ad)
    return (-dt / l0) * math.log(1.0 + l0 * h / (288.15 + l0 * h_ad))


def ft(z_m):
    return round(z_m / M_PER_FT)


def one(lines):
    # An error wrapped at 40 columns, as one line (continuations start "  ").
    out = []
    for line in lines:
        if out and line.startswith("  "):
            out[-1] += " " + line.strip()
        else:
            out.append(line)
    return out


def session(*lines):
    s = Session()
    for line in lines:
        out = s.feed(line)
        assert not any(x.startswith("error") for x in out), (line, out)
    return s


def cold_column():
    t, td, q, elev, lapse, top = COLD_COL
    return Column.from_qnh(t, td, q, elev, lapse, top)


def test_every_height_line_says_what_it_is():
    s = session(COLD)
    for word in ("obs", "base", "ice", "parcel", "thermal", "at 2000m", "iso -35C", "report",
                 "levels", "cold", "show"):
        for line in s.feed(word):
            assert len(line) <= 40 or word == "show", (word, line)
            if (" ft " in line + " " and " m " in line + " ") and not line.startswith(
                    ("DA", "!", " ", "layer")):
                assert line.endswith((" MSL", " AGL", " IND")) or " FL" in line, (word, line)


def test_heights_setting_shows_levels_indicated_and_back():
    s = session(COLD)
    col = cold_column()
    r = col.report()
    base = r["cloud_base_msl_m"]
    assert "base            %4d ft   %4d m MSL" % (ft(base), round(base)) in s.feed("base")
    assert s.feed("heights ind") == ["ok: heights IND (on QNH)"]
    got = s.feed("base")
    ind = ind_of(col, base)
    assert "base            %4d ft   %4d m IND" % (ft(ind), round(ind)) in got
    # Cold air: the altimeter reads high (common practice, REFERENCES.md "Altimetry").
    assert ind > base + 40.0
    # The AGL line stays AGL.
    assert any(x.startswith("base") and x.endswith(" AGL") for x in got)
    assert s.feed("heights true") == ["ok: heights MSL (true)"]
    before = s.snapshot()
    assert one(s.feed("heights up"))[0].startswith(
        "error: heights needs msl (true heights) or ind")
    assert s.feed("heights")[0].startswith("error:")
    assert s.snapshot() == before


def test_flight_levels_wherever_a_height_is():
    # ISA column with QNH 1013.25 hPa: FL100 is 3048 m, FL85 2590.8 m (ICAO Doc 7488/3).
    s = session("elev 0 temp 15C dew 5C qnh 1013.25 elr 6.5", "out kv")
    for line, z in (("at FL100", 3048.0), ("da FL85", 2590.8), ("at fl180", 5486.4)):
        got = dict(x.split("=", 1) for x in s.feed(line) if "=" in x)
        assert abs(float(got["at_msl_m"]) - z) < 1.0, line
        assert abs(float(got["at_indicated_m"]) - z) < 1.0, line
        assert abs(float(got["at_pressure_altitude_m"]) - z) < 1.0, line
        assert abs(float(got["at_isa_deviation_c"])) < 0.01, line
    # In the cold column FL100 lies far lower than 3048 m: the pressure altitude of its
    # true height is still 10000 ft (the NWS form is rounded: 2 m).
    s = session(COLD, "out kv")
    got = dict(x.split("=", 1) for x in s.feed("at FL100") if "=" in x)
    z = float(got["at_msl_m"])
    col = cold_column()
    pa_ft = 145366.45 * (1.0 - (col.p_at(z) / 1013.25) ** 0.190284)  # NWS (REFERENCES.md)
    assert abs(pa_ft - 10000.0) < 7.0
    assert z < 3048.0 - 150.0
    s.feed("heights ind")
    s.feed("env 2800m3 wt 450kg tmax 120C")
    assert s.feed("balloon FL50")[0].startswith("z_msl_m=")


def test_flight_level_and_indicated_input_refused_cleanly():
    s = session(COLD)
    before = s.snapshot()
    for line, want in (
            ("at FL", "error: 'FL' is not a flight level; accepted FL and a number"),
            ("at FLx", "error: 'FLx' is not a flight level"),
            ("at FL-5", "error: 'FL-5' is not a flight level"),
            ("at FL85 agl", "error: at: nothing may follow a flight level"),
            # FL10 is 977 hPa (ICAO Doc 7488/3 pressure at 1000 ft), not in this column
            ("at FL10", "error: at: FL10 (977 hPa) is outside the column; allowed FL"),
            ("at FL400", "error: at: FL400 (188 hPa) is outside the column; allowed FL"),
            ("at 1000ft ind", "error: at: the indicated height 1000 ft is outside 2461.."),
            ("at 3000ft up", "error: at: 'up' after the height; accepted agl, msl or ind")):
        got = one(s.feed(line))
        assert len(got) == 1 and got[0].startswith(want), (line, got)
        assert s.snapshot() == before


def test_at_indicated_reads_back():
    s = session(COLD, "out kv")
    col = cold_column()
    got = dict(x.split("=", 1) for x in s.feed("at 8000ft ind") if "=" in x)
    assert abs(float(got["at_indicated_m"]) - 8000 * M_PER_FT) < 0.01
    z = float(got["at_msl_m"])
    assert abs(ind_of(col, z) - 8000 * M_PER_FT) < 0.5
    # After "heights ind" a bare height is indicated too.
    s.feed("heights ind")
    got2 = dict(x.split("=", 1) for x in s.feed("at 8000ft") if "=" in x)
    assert got2["at_msl_m"] == got["at_msl_m"]
    got3 = dict(x.split("=", 1) for x in s.feed("at 8000ft msl") if "=" in x)
    assert abs(float(got3["at_msl_m"]) - 8000 * M_PER_FT) < 1e-6


def test_levels_word():
    s = session(COLD)
    col = cold_column()
    r = col.report()
    got = s.feed("levels")
    assert got[0] == "level, ft        MSL     IND     FL"
    rows = [x for x in got[1:] if not x.startswith(("!", " "))]
    heights = []
    for line in rows:
        msl, ind, fl = line[13:].split()
        heights.append(int(msl))
        assert fl.startswith("FL")
    assert heights == sorted(heights)
    base = r["cloud_base_msl_m"]
    ind = ind_of(col, base)
    assert "%-13s%7d %7d %6s" % ("base", ft(base), ft(ind), "FL%d" % round(
        isa_pa(col.p_at(base)) / 30.48)) in rows
    # Warm day (the issue's own example): the 0 degC level at 13,514 ft true reads about
    # 13,000 ft on QNH; checked here with the altimeter relation.
    s = session("elev 1350ft temp 27C dew 13C qnh 1016 elr 9.5@250m 7.5@2400m 6.5")
    row = [x for x in s.feed("levels") if x.startswith("0C level")][0]
    msl, ind, _ = row[13:].split()
    warm = Column.from_qnh(27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5),
                                                         (None, 6.5)])
    z0 = warm.level(0.0)
    assert int(msl) == ft(z0) == 13514
    assert int(ind) == ft(ind_of(warm, z0))
    assert abs(int(ind) - 13000) < 50
    # No warning on a warm day.
    assert not any(x.startswith("!") for x in s.feed("levels"))


def test_levels_kv():
    s = session(COLD, "out kv")
    col = cold_column()
    got = s.feed("levels")
    vals = dict(x.split("=", 1) for x in got if "=" in x)
    z, ind, fl = (float(v) for v in vals["cloud_base_msl_m"].split(","))
    assert abs(ind - ind_of(col, z)) < 0.5
    assert abs(fl - isa_pa(col.p_at(z)) / 30.48) < 0.02
    assert "true altitude is below indicated" in vals["warnings"]


def test_cold_word():
    s = session(COLD)
    col = cold_column()
    got = s.feed("cold")
    assert got[0] == "cold-temperature correction"
    assert got[1] == "%-13s%+7.1f K" % ("field ISA dev", -28.0 - (15.0 - 0.0065 * isa_pa(
        col.p_hpa)))
    rows = [x for x in got if " AGL " in x]
    assert [int(x.split()[0]) for x in rows] == [500, 1000, 1500, 2000, 3000, 5000]
    for line in rows:
        h = int(line.split()[0]) * M_PER_FT
        icao, mine = int(line.split()[3]), int(line.split()[5])
        assert icao == ft(icao_cold(h, -28.0, 750.0))
        # The column's own value: the true height of the indicated one on QNH (by
        # bisection on the altimeter relation), below it by the correction.
        lo, hi = 750.0, 750.0 + h
        for _ in range(60):
            mid = 0.5 * (lo + hi)
            lo, hi = (mid, hi) if ind_of(col, mid) < 750.0 + h else (lo, mid)
        assert mine == ft(750.0 + h - lo)
        # Same lapse rate as ISA: the two within 10 % (issue 11's check).
        assert abs(mine - icao) <= 0.1 * icao
    one = s.feed("cold 1200ft")
    assert [x for x in one if " AGL " in x] == [
        "%7d ft AGL %+6d ft %+6d ft" % (1200, ft(icao_cold(1200 * M_PER_FT, -28.0, 750.0)),
                                          ft(750.0 + 1200 * M_PER_FT - col_true(col, 1200)))]
    s.feed("unit m")
    assert [x.split()[0] for x in s.feed("cold") if " AGL " in x] == [
        "150", "300", "500", "1000", "1500"]
    for line in ("cold -10ft", "cold 1000ft 2000ft", "cold warm"):
        assert s.feed(line)[0].startswith("error: "), line
    warm = session("elev 100m temp 25C dew 10C qnh 1015")
    got = warm.feed("cold")
    assert "not colder than ISA: no correction" in got
    assert not any(" AGL " in x for x in got)


def col_true(col, h_ft):
    # True height, m MSL, where the altimeter on QNH reads elevation + h_ft (bisection).
    target = col.elev_m + h_ft * M_PER_FT
    lo, hi = col.elev_m, target
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if ind_of(col, mid) < target else (lo, mid)
    return lo


def test_cold_kv():
    s = session(COLD, "out kv")
    vals = dict(x.split("=", 1) for x in s.feed("cold 300m") if "=" in x)
    assert abs(float(vals["cold_height_agl_m"]) - 300.0) < 1e-9
    assert abs(float(vals["cold_correction_icao_m"]) - icao_cold(300.0, -28.0, 750.0)) < 0.01
    assert float(vals["cold_correction_column_m"]) > 0.0


def test_report_altimeter_section_and_warning():
    s = session(COLD)
    col = cold_column()
    r = col.report()
    got = s.feed("report")
    sec = got[got.index("-- altimeter") + 1:got.index("-- cautions")]
    h = 1000 * M_PER_FT
    assert sec[0] == "%-13s%+7d ft at 1000 ft AGL" % ("cold corr", ft(icao_cold(h, -28.0, 750.0)))
    assert sec[1] == "%-13s%+7d ft (its own ELR)" % ("  column", ft(
        750.0 + h - col_true(col, 1000)))
    text = " ".join(x.strip("! ") for x in sec[2:])
    base = r["cloud_base_msl_m"]
    # The warning names the lowest level 10 K or more colder than ISA and the error there.
    assert ("true altitude is below indicated by %d ft at cloud base, %d ft MSL"
            % (ft(ind_of(col, base) - base), ft(base))) in text
    assert "K colder than ISA" in text
    assert all(len(x) <= 40 for x in got)
    # The warm demo field has neither the section nor a warning.
    warm = session("elev 1350ft temp 27C dew 13C qnh 1016 elr 9.5@250m 7.5@2400m 6.5")
    got = warm.feed("report")
    assert "-- altimeter" not in got
    assert not any("true altitude is below" in x for x in got)


def test_report_altimeter_section_for_a_warm_field_under_cold_air():
    # Invented: a field 5.7 K warmer than ISA under air far colder than ISA aloft
    # (-10 C at 2000 m, -35 C at 4000 m): the altimeter reads high aloft, so the
    # report has its altimeter section though the field is not cold.
    s = session("elev 100m temp 20C dew 5C qnh 1013 aloft 2000m -10C 4000m -35C")
    col = s.column()
    r = col.report()
    assert r["isa_deviation_c"] > 5.0
    got = s.feed("report")
    sec = got[got.index("-- altimeter") + 1:got.index("-- cautions")]
    text = " ".join(x.strip("! ") for x in sec)
    base = r["cloud_base_msl_m"]
    assert ind_of(col, base) - base > 15.0
    assert ("true altitude is below indicated by %d ft at cloud base, %d ft MSL"
            % (ft(ind_of(col, base) - base), ft(base))) in text


@pytest.mark.parametrize("t", ["15.005C", "15.5C"])
def test_report_of_a_field_warmer_than_isa_loads_no_altimeter_text(t, monkeypatch):
    # A sea-level field on the standard QNH a little warmer than ISA (15 C, ICAO Doc
    # 7488/3), with no level where the altimeter reads high: the report has no
    # altimeter section and never loads its text code (lapsecalc.altitext).
    import sys
    s = session("elev 0m dew 5C qnh 1013.25 temp " + t)
    rep = s.column().report()
    assert 0.0 < rep["isa_deviation_c"] < 0.6
    assert not any(v is not None and v > rep[k]
                   for k, v in rep["indicated_altitude_m"].items())
    monkeypatch.delitem(sys.modules, "lapsecalc.altitext", raising=False)
    got = s.feed("report")
    assert "-- altimeter" not in got and "-- cautions" in got
    assert "lapsecalc.altitext" not in sys.modules


def test_at_warns_in_cold_air():
    s = session(COLD)
    col = cold_column()
    got = s.feed("at 3000m")
    text = " ".join(x.strip("! ") for x in got if x.startswith(("!", "  ")))
    assert "true altitude is below indicated by %d ft at this height" % ft(
        ind_of(col, 3000.0) - 3000.0) in text
    warm = session("elev 100m temp 25C dew 10C qnh 1015")
    assert not any(x.startswith("!") for x in warm.feed("at 2000m"))


@pytest.mark.parametrize("word", ["heights", "levels", "cold"])
def test_help_knows_the_new_words(word):
    s = Session()
    got = s.feed("help " + word)
    assert got and all(len(x) <= 40 for x in got)
    assert any(word in x for x in s.feed("help"))


def test_readme_cold_day_session_is_what_the_interpreter_says():
    # The README's invented cold day: indicated and true side by side, as the
    # interpreter answers today (lines after "lc> " are its output).
    import os
    root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
    text = open(os.path.join(root, "README.md")).read()
    block = text[text.index("lc> elev 2460ft"):]
    block = block[:block.index("```")]
    s = Session()
    want, got = [], []
    for line in block.splitlines():
        if line.startswith("lc> "):
            got.extend(s.feed(line[4:].split("#")[0].strip()))
        else:
            want.append(line)
    assert got == want
    assert any(x.startswith("true alt") and x.endswith(" MSL") for x in got)
    assert any(x.startswith("indicated") and x.endswith(" IND") for x in got)
