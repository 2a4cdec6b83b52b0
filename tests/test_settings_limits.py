"""Every setting word at the edges of its documented range: the limit itself is taken
(and stored as the exact value typed, converted by the exact unit definitions), a hair
beyond it is refused with an error that leaves the session unchanged.

Ranges: limits.py and the README (temperatures -90..60 degC, elevation -500..9000 m,
QNH 850..1100 hPa, station pressure 1..1100 hPa, ELR -30..30 K/km, column top up to
32000 m, thermal excess 0..10 K, envelope 0.1 m3..2e6 m3, weight 0.01..20000 kg, gas
fill 0.1..1e5 m3, balloon temperatures -90..150 degC, purity 50..100 %). Unit
factors: 1 ft = 0.3048 m, 1 inHg = 33.8639 hPa, degF = 1.8 degC + 32 (REFERENCES.md,
Units; exact by definition)."""
import pytest

from lapsecalc.shell import Session

FT = 0.3048
INHG = 33.8639

# word, [(accepted text, show key, stored value)], [refused texts]
EDGES = [
    ("temp", [("60C", "t_c", 60.0), ("-90C", "t_c", -90.0), ("140F", "t_c", 60.0)],
     ["60.01C", "-90.01C", "140.1F"]),
    ("dew", [("60C", "td_c", 60.0), ("-90C", "td_c", -90.0)], ["60.01C", "-90.01C"]),
    ("rh", [("100%", "rh_pct", 100.0), ("0.001%", "rh_pct", 0.001)], ["100.01%", "0%", "-1%"]),
    ("elev", [("9000m", "elevation_m", 9000.0), ("-500m", "elevation_m", -500.0),
              ("29527.5ft", "elevation_m", 29527.5 * FT)], ["9000.01m", "-500.01m"]),
    ("qnh", [("1100", "qnh_hpa", 1100.0), ("850", "qnh_hpa", 850.0),
             ("29.92inHg", "qnh_hpa", 29.92 * INHG)], ["1100.01", "849.99", "29.92"]),
    # stn: down to 240 hPa, under the station pressure of a 9000 m field on QNH
    # 850 hPa: by the altimeter-setting relation p^n = QNH^n - p0^n L h / T0 (ICAO Doc
    # 7488/3, n = 0.190263, L = 6.5 K/km, T0 = 288.15 K, p0 = 1013.25 hPa) 246.4 hPa
    ("stn", [("1100hPa", "station_pressure_hpa", 1100.0),
             ("240hPa", "station_pressure_hpa", 240.0)],
     ["1100.01hPa", "239.9hPa", "29.92", "0.99hPa"]),
    ("top", [("32000m", "top_msl_m", 32000.0), ("-400m", "top_msl_m", -400.0)],
     ["32000.01m", "-400.01m"]),
    ("excess", [("10K", "thermal_excess_c", 10.0), ("0K", "thermal_excess_c", 0.0)],
     ["10.01K", "-0.01K"]),
    ("env", [("2000000m3", "envelope_m3", 2.0e6), ("0.1m3", "envelope_m3", 0.1)],
     ["2000001m3", "0.099m3"]),
    ("wt", [("20000kg", "weight_kg", 20000.0), ("0.01kg", "weight_kg", 0.01)],
     ["20000.1kg", "0.0099kg"]),
    ("fill", [("100000m3", "gas_volume_m3", 1.0e5), ("0.1m3", "gas_volume_m3", 0.1)],
     ["100001m3", "0.099m3"]),
    # tmax: the maker's maximum, 50..150 C (hotair.MAX_ENVELOPE_T_MIN_C/_MAX_C)
    ("tmax", [("150C", "max_envelope_t_c", 150.0), ("50C", "max_envelope_t_c", 50.0)],
     ["150.1C", "49.9C", "-90C"]),
    ("tenv", [("150C", "envelope_t_c", 150.0), ("-90C", "envelope_t_c", -90.0)],
     ["150.1C", "-90.1C"]),
    ("pure", [("100%", "purity", 1.0), ("50%", "purity", 0.5)], ["100.1%", "49.9%", "0%"]),
]


def _ok(out):
    # Accepted: the acknowledgement ("ok" or kv "ok=WORDS"), maybe with plausibility
    # notes ("check=..."), and no error.
    return (out[0] == "ok" or out[0].startswith("ok=")) and \
        not any(line.startswith("error") for line in out)


def _show(s):
    return dict(line.split("=", 1) for line in s.feed("show") if "=" in line)


@pytest.mark.parametrize("word,good,bad", EDGES, ids=[e[0] for e in EDGES])
def test_setting_edges(word, good, bad):
    s = Session()
    s.feed("out kv")
    for text, key, want in good:
        assert _ok(s.feed("%s %s" % (word, text))), text
        # show writes six significant digits
        assert abs(float(_show(s)[key]) - want) < 5e-6 * max(1.0, abs(want)), text
    before = _show(s)
    for text in bad:
        out = s.feed("%s %s" % (word, text))
        assert len(out) == 1 and out[0].startswith("error"), (text, out)
        assert _show(s) == before


def test_elr_edges():
    s = Session()
    s.feed("out kv")
    assert _ok(s.feed("elr 30")) and _show(s)["elr_k_per_km"] == "30"
    assert _ok(s.feed("elr -30@1m 6.5"))
    assert _show(s)["elr_k_per_km"] == "1:-30;:6.5"
    assert _ok(s.feed("elr " + " ".join("6@%dm" % (100 * k) for k in range(1, 12)) + " 6.5"))
    before = _show(s)
    for bad in ("30.01", "-30.01", "6@0.99m 6.5", "6@100m 7@100.5m 6.5", "6@32001m 6.5",
                "6@100m 7@50m 6.5", " ".join(["6@%dm" % (100 * k) for k in range(1, 13)]) + " 6.5"):
        out = s.feed("elr " + bad)
        assert out[0].startswith("error"), (bad, out)
        assert _show(s) == before


def test_qnh_limit_at_a_high_field():
    # QNH exactly 850 hPa at 9000 m: the station pressure it implies gives back 850
    # (the altimeter relation is exact; rounding must not refuse the limit itself).
    s = Session()
    s.feed("out kv")
    assert _ok(s.feed("temp -20 dew -30 elev 9000m qnh 850"))
    obs = dict(x.split("=", 1) for x in s.feed("obs") if "=" in x)
    assert abs(float(obs["qnh_hpa"]) - 850.0) < 1e-3
    # A QNH a hundredth below the limit, given as station pressure, is still refused.
    assert s.feed("stn 246.36")[0].startswith("error")


def _text(s, line):
    # One reply as a single string (wrapped text lines joined).
    return " ".join(x.strip() for x in s.feed(line))


def test_unit_hints_at_their_edges():
    # degF = 1.8 degC + 32 and 1 inHg = 33.8639 hPa (REFERENCES.md, Units): a bare
    # temperature out of range in C but within -90..60 C once read as F gets the F
    # hint; a bare pressure of 2500..3300 (inches x 100) or 25..33 (inches) the inHg
    # hint; a rh up to 1 % asks whether a fraction was meant.
    s = Session()
    assert "(27.0 C)" in _text(s, "temp 80.6F")
    for tok, hint in (("130", True), ("140", True), ("140.3", False), ("141", False),
                      ("-130", True), ("-130.3", False)):
        assert ("in F write %sF" % tok in _text(s, "temp " + tok)) is hint, tok
    for tok, hint in (("3300", True), ("3320", False), ("2500", True), ("2499", False)):
        assert ("inHg write %.2finHg" % (float(tok) / 100.0) in _text(s, "qnh " + tok)) is hint, tok
    for tok, hint in (("29.92", True), ("25", True), ("33", True), ("24.9", False),
                      ("33.1", False)):
        assert ("for inches write %sinHg" % tok in _text(s, "qnh " + tok)) is hint, tok
    assert "check" in _text(s, "rh 1%") and "check" not in _text(s, "rh 1.005%")


def test_setting_ranges_are_the_balloon_modules():
    # balloonsettings keeps copies of the balloon modules' limits (it must not import them).
    from lapsecalc import hotair, gasballoon, balloonsettings
    assert balloonsettings._TMAX_MIN_C == hotair.MAX_ENVELOPE_T_MIN_C
    assert balloonsettings._ENVELOPE_T_MAX_C == hotair.ENVELOPE_T_MAX_C == \
        hotair.MAX_ENVELOPE_T_MAX_C
    assert balloonsettings._MARGIN_MAX_K == hotair.MARGIN_MAX_K
    assert balloonsettings._SUPERHEAT_MAX_K == gasballoon.SUPERHEAT_MAX_K
