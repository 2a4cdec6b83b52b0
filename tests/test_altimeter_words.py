"""The altimeter words and the report's altimeter section at their edges
(lapsecalc.altitext): when the section appears, the metre version of its line, the cold
word's range, warnings with equal errors. Outside values as in test_shell_altimetry.py
(ICAO PANS-OPS formula, ISA pressure altitude; REFERENCES.md "Altimetry")."""
from lapsecalc.shell import Session
from lapsecalc.altitext import cold_warning_text
from test_shell_altimetry import COLD, session, icao_cold, ind_of, cold_column

ALT_LINES = ("cold corr", "  column")


def section(lines):
    return [x for x in lines if x.startswith(ALT_LINES)]


def test_report_line_in_metres_is_for_300_m():
    s = session(COLD, "unit m")
    col = cold_column()
    sec = section(s.feed("report"))
    assert sec[0] == "%-13s%+7d m at 300 m AGL" % ("cold corr", round(icao_cold(300.0, -28.0, 750.0)))
    # The column's own: the true height where the altimeter reads 1050 m, by bisection
    # on the altimeter relation written here.
    lo, hi = 750.0, 1050.0
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if ind_of(col, mid) < 1050.0 else (lo, mid)
    assert sec[1] == "%-13s%+7d m (its own ELR)" % ("  column", round(1050.0 - lo))


def test_no_section_unless_colder_than_isa():
    # ISA at a sea-level field (ICAO Doc 7488/3: 15 degC at 1013.25 hPa): no deviation,
    # nothing to correct; half a kelvin warmer neither. Half a kelvin colder: the section.
    for temp, shown in (("15C", False), ("15.5C", False), ("14.5C", True)):
        s = session("elev 0m dew 5C qnh 1013.25 elr 6.5 temp " + temp)
        assert bool(section(s.feed("report"))) == shown, temp
        cold = s.feed("cold")
        assert ("not colder than ISA: no correction" in cold) != shown, temp


def test_section_needs_the_height_inside_the_column():
    # 1000 ft (304.8 m) above a field at 750 m: a top at 1054.8 m is that height only up
    # to rounding (1054.8 - 750 < 304.8 in binary), so the line is left out and the
    # report still works; a top 0.2 m higher has it.
    for top, shown in (("1054.8m", False), ("1055m", True), ("1000m", False)):
        s = session(COLD.replace("top 9000m", "top " + top))
        got = s.feed("report")
        assert not any(x.startswith("error") for x in got), top
        assert bool(section(got)) == shown, top
    # In metres the line is for 300 m: a top exactly 300 m above the field has it.
    s = session(COLD.replace("top 9000m", "top 1050m"), "unit m")
    assert section(s.feed("report"))[0].endswith("at 300 m AGL")


def test_cold_word_from_zero_up_to_the_column_top():
    # cold H takes 0 up to the column top above the field (9000 - 750 = 8250 m here: in
    # cold air the top reads higher than it is, so the true top is the limit).
    s = session(COLD, "unit m")
    rows = [x for x in s.feed("cold 0m") if " AGL " in x]
    assert rows == ["      0 m AGL     +0 m     +0 m"]
    assert [x for x in s.feed("cold 8250m") if " AGL " in x]
    assert " ".join(s.feed("cold 8300m")) == "error: cold: 8300 m is outside 0..8250 m"


def test_cold_word_alone_shows_a_default_height_right_at_the_column_top():
    # The column top 1500 m above the field (2250 - 750; in cold air the true top is
    # the limit): the default heights 150 .. 1500 m all fit, the last one exactly.
    s = session(COLD, "unit m", "top 2250m")
    rows = [x.split()[0] for x in s.feed("cold") if " AGL " in x]
    assert rows == ["150", "300", "500", "1000", "1500"]
    s = session(COLD, "unit m", "top 2249m")
    assert [x.split()[0] for x in s.feed("cold") if " AGL " in x][-1] == "1000"


def test_equal_errors_name_the_lowest_level_once():
    # Two levels with the same altimeter error: the lowest is both the first and the
    # worst, one sentence.
    s = Session()
    w = [("cloud_base_msl_m", 1000.0, -15.0, 40.0), ("top_msl_m", 2000.0, -12.0, 40.0)]
    got = cold_warning_text(s, w)
    assert got == ["true altitude is below indicated by 131 ft at cloud base, 3281 ft MSL"
                   " (15 K colder than ISA)"]
    w[1] = ("top_msl_m", 2000.0, -12.0, 40.5)
    assert len(cold_warning_text(s, w)) == 2
