"""Every refusal the user sees speaks the display units and the words the user typed,
never the library's argument names or SI values the user did not type, and fits 40
columns: a corpus of refused lines (tests/refusal_corpus.py) and scripted cases."""
import pytest

from lapsecalc.shell import Session
from lapsecalc.retell import retell
from tests.refusal_corpus import corpus, fuzz_lines, run, faults

M_PER_FT = 0.3048  # exact by definition (common practice)


def one(out):
    # A text-mode error as one line: its wrapped lines joined.
    assert out[0].startswith("error: "), out
    return " ".join([out[0]] + [x.strip() for x in out[1:]])


def session(*lines):
    s = Session()
    for line in lines:
        out = s.feed(line)
        assert not out or not out[0].startswith("error"), (line, out)
    return s


DEMO = ("elev 1350ft", "temp 27C dew 13C qnh 1016")


def test_the_corpus_has_no_refusal_in_library_wording():
    pairs = corpus() + fuzz_lines()
    found = run(pairs)
    bad = [(ctx[-1], line, out, f) for ctx, line, out, f in found if f]
    assert not bad, bad[:5]
    # The corpus reaches the refusals only the library finds, in every unit system.
    text = [one(out) for _, _, out, _ in found]
    for phrase in ("warms the air above", "lands at", "gives a dewpoint below",
                   "the indicated height", "is outside the column; allowed FL",
                   "is below the air", "is not above the field"):
        assert any(phrase in t for t in text), phrase
    assert len(found) > 15000


@pytest.mark.parametrize("mode", ["kv", "json"])
def test_machine_modes_get_the_same_words(mode):
    s = session(*DEMO)
    s.feed("out " + mode)
    out = s.feed("elr -30")
    assert len(out) == 1
    assert "top_m" not in out[0] and "degC" not in out[0] and "set top lower" in out[0]


def test_the_check_finds_library_wording():
    # The check is not vacuous: the library's own sentences fail it.
    s = session(*DEMO)
    for line, msg in (
            ("elr -30", "error: the ELR warms the air above 60 degC at 1511 m MSL; allowed"),
            ("aloft FL600 -50C", "error: aloft point 1 (71.7163 hPa) lands at 18415 m"),
            ("iso 700", "error: iso=700.0 is outside the allowed range -90..60"),
            ("balloon", "error: max_envelope_t_c=16 is outside the allowed range 50..150"),
            ("tmax 40C", "error: tmax 40 C is outside 50..150 C and this line is much too"
                         " long for a screen")):
        assert faults(s, line, [msg]), msg
    assert not faults(s, "at 700", ["error: at: 700 ft is below the field", "  (1350 ft)"])


def test_the_elr_warmer_than_60_c_aloft():
    # 27 C at 1350 ft warming 30 K/km reaches 60 C 1.1 km up: 411.48 + 1100 m MSL
    # (closed form) = 4958.9 ft.
    s = session(*DEMO)
    msg = one(s.feed("elr -30"))
    assert msg.startswith("error: the ELR warms the air above 60 C at ")
    ft = float(msg.split(" at ")[1].split(" ")[0])
    assert abs(ft - (411.48 + 1100.0) / M_PER_FT) < 0.5
    assert msg.endswith("allowed -90..60 C throughout: set top lower or change elr")
    s.feed("unit m F")
    msg = one(s.feed("elr -30"))
    assert "above 140 F at 1511 m MSL; allowed -130..140 F" in msg  # 60 C = 140 F exactly


def test_points_aloft_refused_by_their_level():
    s = session(*DEMO)
    before = s.snapshot()
    # FL600 is 71.72 hPa in the ICAO standard atmosphere (ICAO Doc 7488/3); with -50 C
    # from 27 C at the field it lands far above the 16000 m (52493 ft) column top.
    msg = one(s.feed("aloft FL600 -50C"))
    assert msg.startswith("error: aloft FL600 lands at ")
    assert msg.endswith("ft MSL, above the column top 52493 ft: allowed pressures inside"
                        " the column")
    # 700 hPa lies near 3000 m (ISA: 3012 m, from memory); with -89 C at 3000 m the
    # air below is so dense that 700 hPa lands above that point, which contradicts
    # the order of the points.
    s.feed("unit m")
    msg = one(s.feed("aloft 3000m -89C 700hPa -5C"))
    assert msg.startswith("error: aloft 700.0 hPa and aloft 3000 m are at the same"
                          " level or contradict each other (")
    assert msg.endswith(" and 3000 m MSL); keep one of them")
    s.feed("unit inHg")
    msg = one(s.feed("aloft 10hPa -50C"))
    assert msg.startswith("error: aloft 0.30 inHg lands at ")  # 10 hPa = 0.2953 inHg
    assert s.snapshot()[0] == before[0]


def test_humidity_that_gives_no_dewpoint():
    s = session(*DEMO)
    assert one(s.feed("rh 1% temp -89C")) == (
        "error: rh 1 % at temp -89 C gives a dewpoint below -90 C; allowed 0..100 % with a"
        " dewpoint of at least -90 C")
    s.feed("unit F")
    # -89 C = -128.2 F, -90 C = -130 F (exact conversion)
    assert one(s.feed("rh 1% temp -89C")).startswith(
        "error: rh 1 % at temp -128 F gives a dewpoint below -130 F")


def test_query_words_refuse_in_the_users_unit():
    s = session(*DEMO)
    assert one(s.feed("iso 700")) == "error: iso: 700 C is outside -90..60 C"
    # 400 K = 126.85 C; -90..60 C = 183.15..333.15 K (exact)
    assert one(s.feed("iso 400K")) == "error: iso: 400 K is outside 183..333 K"
    assert one(s.feed("da 1e40")) == "error: '1e40' is too large a number; accepted up to 1e30"
    # FL10: 977.2 hPa (ICAO Doc 7488/3), under the field's 967 hPa
    assert one(s.feed("at FL10")).startswith(
        "error: at: FL10 (977 hPa) is outside the column; allowed FL")


def test_balloon_refusals_name_the_settings():
    s = session(*DEMO)
    assert one(s.feed("tmax 40C")) == "error: tmax 40 C is outside 50..150 C"
    assert one(s.feed("tmax 104F")) == "error: tmax 104 F is outside 122..302 F"
    s = session("elev 200m", "temp 45C dew -10C", "env 2800m3 wt 450kg tmax 120C tenv 30C")
    assert one(s.feed("balloon")) == (
        "error: balloon: the working envelope temp 30.0 C is below the air (45.0 C at 656"
        " ft); set tenv, tmax or margin higher")
    s = session(*DEMO + ("gas he fill 11m3 env 10m3 wt 4kg",))
    assert one(s.feed("balloon")) == (
        "error: balloon: fill 11 m3 is more than env 10 m3; the gas fills at most the"
        " envelope")


def test_cold_stays_under_the_indicated_top_of_a_warm_column():
    # Hot air to a low top: the top reads lower on the altimeter than it is, and cold
    # asks for no height above that reading.
    s = session("elev 200m", "temp 45C dew -10C", "elr 9.8", "top 849m", "out kv")
    out = s.feed("cold")
    kv = dict(x.split("=", 1) for x in out if "=" in x)
    hs = [float(h) for h in kv["cold_height_agl_m"].split(",")]
    assert hs == pytest.approx([500 * M_PER_FT, 1000 * M_PER_FT, 1500 * M_PER_FT])
    # 2000 ft above the field reads above the top: main once refused the word


def test_retell_leaves_the_users_words_alone():
    s = session(*DEMO)
    for msg in ("unknown word 'top_m'; (help lists the words)",
                "'a=b' is not a number"):
        assert retell(s, s.state, msg) == msg


def test_a_point_aloft_in_a_sharp_corner_is_drawn():
    # A warm point just above the field with a cold one above: the chart's temperature
    # range holds the points (it once indexed past the plot).
    s = session("unit m", "elev 200m", "temp 45C dew -10C", "elr 9.8",
                "aloft FL10 59C 6000ft 30C")
    out = s.feed("chart")
    assert not out[0].startswith("error"), out
    assert sum(line.count("*") for line in out[1:17]) == 2
    assert all(len(line) <= 40 for line in out)
