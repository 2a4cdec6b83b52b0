"""How the interpreter says numbers (lapsecalc.output): display units, the ok line,
errors by mode; machine numbers without float noise and kv values (lapsecalc.machine). Expected texts are
worked out here from exact unit factors (REFERENCES.md, Units: 1 ft = 0.3048 m,
1 inHg = 33.8639 hPa, F = C * 1.8 + 32) and the documented formats."""
import random

import pytest

from lapsecalc import machine as machine_forms
from lapsecalc.output import f_h, f_h1, f_t, f_dt, f_p, f_lapse, wrap, say, ack
from lapsecalc.machine import number_text, kv_value, kv_lines
from lapsecalc.jsontext import line


class S:
    # The parts of a Session that output reads.
    def __init__(self, h="ft", t="c", p="hpa", mode="text"):
        self.disp = {"h": h, "t": t, "p": p, "z": "msl"}
        self.mode = mode


def test_heights_in_both_units():
    # 1000 m = 3280.84 ft; 411.48 m = 1350 ft exactly.
    assert f_h(S(), 1000.0) == "   3281 ft   1000 m"
    assert f_h(S(h="m"), 1000.0) == "   1000 m    3281 ft"
    assert f_h(S(), 411.48, True) == "1350 ft (411 m)"
    assert f_h(S(h="m"), 411.48, True, " MSL") == "411 m (1350 ft) MSL"
    assert f_h(S(), 411.48, False, " AGL") == "   1350 ft    411 m AGL"
    assert f_h1(S(), 411.48) == "1350 ft"
    assert f_h1(S(h="m"), 411.48) == "411 m"
    # rounding to the nearest: 0.4 ft and 0.6 ft (0.12192 m, 0.18288 m)
    assert f_h1(S(), 0.12192) == "0 ft" and f_h1(S(), 0.18288) == "1 ft"


def test_temperatures_and_differences():
    assert f_t(S(), 27.0) == "   27.0 C"
    assert f_t(S(), 27.0, True) == "27.0 C"
    assert f_t(S(t="f"), 27.0, True) == "80.6 F"      # 27 * 1.8 + 32
    assert f_t(S(t="f"), -40.0) == "  -40.0 F"
    assert f_t(S(), -0.04, True) == "0.0 C"           # no "-0.0"
    assert f_t(S(), 0.06, True) == "0.1 C"
    # differences are K in every unit system, signed
    assert f_dt(S(t="f"), 2.0, True) == "+2.0 K"
    assert f_dt(S(), -1.26) == "   -1.3 K"
    assert f_dt(S(), -0.01, True) == "+0.0 K"


def test_pressures():
    assert f_p(S(), 1016.0, True) == "1016.0 hPa"
    assert f_p(S(), 967.44) == "  967.4 hPa"
    assert f_p(S(p="inhg"), 1013.25, True) == "29.92 inHg"   # 1013.25 / 33.8639
    assert f_p(S(p="inhg"), 1016.0) == "  30.00 inHg"        # 30.0026


def test_lapse_rates_in_the_elr_syntax():
    # 6.5 K/km = 1.98 C/1000ft (6.5 * 0.3048)
    assert f_lapse(S(), 6.5) == "6.5 K/km (1.98 C/1000ft)"
    layers = [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)]
    assert f_lapse(S(), layers) == "9.5@820ft 7.5@7874ft 6.5 K/km"   # 250 m = 820.2 ft
    assert f_lapse(S(h="m"), layers) == "9.5@250m 7.5@2400m 6.5 K/km"
    assert f_lapse(S(h="m"), [(300.0, -5.0), (None, 8.0)]) == "-5@300m 8 K/km"


def test_wrap_fits_forty_columns():
    text = "the ELR warms the air above 60 C at 4957 ft MSL; allowed -90..60 C"
    lines = wrap(text, "error: ")
    assert lines == ["error: the ELR warms the air above 60 C",
                     "  at 4957 ft MSL; allowed -90..60 C"]
    assert all(len(x) <= 40 for x in lines)
    # exactly 40 columns stays on one line, 41 does not
    assert wrap("x" * 33, "error: ") == ["error: " + "x" * 33]
    assert wrap("x" * 32 + " y", "error: ") == ["error: " + "x" * 32, "  y"]
    assert wrap("x" * 31 + " y", "error: ") == ["error: " + "x" * 31 + " y"]
    # a word longer than a line is cut into pieces of 38 after the indent
    long = wrap("a " + "z" * 80, "! ")
    assert long == ["! a", "  " + "z" * 38, "  " + "z" * 38, "  " + "z" * 4]
    # a word of exactly 38 fills its line whole
    assert wrap("a " + "z" * 38, "! ") == ["! a", "  " + "z" * 38]
    assert wrap("", "ok: ") == ["ok: "]
    assert wrap("one two", "> ", "    ", width=10) == ["> one two"]
    assert wrap("one two three", "> ", "    ", width=10) == ["> one two", "    three"]
    # runs of white space between words count as one space; none at the ends
    assert wrap(" one\t two\n\nthree ", "> ", "  ", width=12) == ["> one two", "  three"]
    # the first line starts with first even when the first word alone fills it
    assert wrap("x" * 45 + " y", "! ", "  ", width=40) == ["! " + "x" * 38, "  xxxxxxx y"]


def _wrap_by_words(text, first, rest, width):
    # The wrapping rule as the docstring states it, word by word (the test's own
    # reading): cut words longer than width - len(rest); put a word on the line when
    # it fits after one space, else start a new line with rest.
    pieces = []
    for word in text.split():
        while len(word) > width - len(rest):
            pieces.append(word[:width - len(rest)])
            word = word[width - len(rest):]
        pieces.append(word)
    lines, line, empty = [], first, True
    for p in pieces:
        if not empty and len(line) + 1 + len(p) > width:
            lines.append(line)
            line, empty = rest, True
        line += p if empty else " " + p
        empty = False
    return lines + [line]


def test_wrap_matches_the_word_by_word_rule():
    # A seeded corpus: words of 1..50 letters, odd white space, several widths.
    r = random.Random(7)
    for _ in range(3000):
        text = "".join(r.choice(("a", "bb", " ", "  ", "\t", "ccccccccccc", "d" * 41))
                       for _ in range(r.randint(0, 30)))
        first = r.choice(("! ", "error: ", "check: ", "> "))
        rest = r.choice(("  ", "    "))
        width = r.choice((12, 20, 40))
        assert wrap(text, first, rest, width) == _wrap_by_words(text, first, rest, width)
    # Single spaces only (wrap then slices the text itself), with words up to 45 letters
    # (longer than a line: cut) and punctuation.
    for _ in range(3000):
        text = " ".join(r.choice(("a", "bb", "de,", "(f)", "g;h", "x" * r.randint(1, 45)))
                        for _ in range(r.randint(1, 25)))
        first = r.choice(("! ", "error: ", "check: ", "> "))
        rest = r.choice(("  ", "    "))
        width = r.choice((12, 20, 40))
        assert wrap(text, first, rest, width) == _wrap_by_words(text, first, rest, width)
    # a width under the indent: still at least a character a piece, never a loop
    assert wrap("abc", "> ", "  ", 2) == ["> abc"[:3], "  b", "  c"]
    # non-ASCII and control characters take the word-by-word way: the same lines
    assert wrap("caf\xe9 au lait", "> ", "  ", 10) == ["> caf\xe9 au", "  lait"]
    assert wrap("a\x1fb c", "> ", "  ", 10) == _wrap_by_words("a\x1fb c", "> ", "  ", 10)


def test_plain_text_is_printable_ascii_with_single_spaces():
    # wrap slices such a text in place (its words are the runs between its spaces, in
    # CPython as on a board); any other text is wrapped from text.split().
    from lapsecalc.output import _plain
    for text in ("a b", "!a ~", "x", "a (b) c; d, e.", "-10..60 C"):
        assert _plain(text) is True, text
    for text in ("", " ", "a  b", " a", "a ", "a\tb", "a\nb", "a\x1fb", "a\x7fb",
                 "caf\xe9", "a\xa0b", "a\x00b"):
        assert _plain(text) is False, text


def test_messages_in_each_mode():
    assert say(S(), "error", "x " * 30) == wrap("x " * 30, "error: ")
    assert say(S(mode="kv"), "check", "rh 0.45 %? for 45 % write 45%") == [
        "check=rh 0.45 %? for 45 % write 45%"]
    assert say(S(mode="json"), "error", 'a "b"') == ['{"error": "a \\"b\\""}']


def test_ok_lines():
    assert ack(S(), "temp 27 C") == ["ok: temp 27 C"]
    parts = ["temp 27 C", "dew 13 C", "QNH 1016 hPa (30.00 inHg)", "elev 1350 ft (411 m) MSL"]
    assert ack(S(), parts, ["temp", "dew", "qnh", "elev"]) == [
        "ok: temp 27 C, dew 13 C,",
        "    QNH 1016 hPa (30.00 inHg),",
        "    elev 1350 ft (411 m) MSL"]
    # parts of one setting joined by ", " are split the same way
    assert ack(S(), "a, b") == ["ok: a, b"]
    # 40 columns exactly: kept on the line
    assert ack(S(), ["x" * 20, "y" * 14]) == ["ok: " + "x" * 20 + ", " + "y" * 14]
    assert ack(S(), ["x" * 20, "y" * 15]) == ["ok: " + "x" * 20 + ",", "    " + "y" * 15]
    # after a wrapped line, a part that fits joins the last line, not the first
    assert ack(S(), ["x" * 30, "y" * 30, "z"]) == ["ok: " + "x" * 30 + ",", "    " + "y" * 30
                                                   + ", z"]
    # the room is measured on the last line, not the first
    assert ack(S(), ["x" * 34, "y" * 5, "z" * 20]) == ["ok: " + "x" * 34 + ",",
                                                       "    yyyyy, " + "z" * 20]
    assert ack(S(mode="kv"), parts, ["temp", "dew"]) == ["ok=temp,dew"]
    assert ack(S(mode="kv"), "out kv") == ["ok=out kv"]
    assert ack(S(mode="json"), "x", ["unit"]) == ['{"ok": ["unit"]}']


@pytest.mark.parametrize("key,x,want", [
    ("qnh_hpa", 1008.9999999999992, "1009"), ("lcl_p_hpa", 901.2345, "901.23"),
    ("cin_j_kg", -2.27374e-13, "0"), ("cape_j_kg", 1234.56, "1234.6"),
    ("cloud_base_agl_m", 1234.5678, "1234.57"), ("t_c", -0.004, "0"), ("t_c", 26.996, "27"),
    ("lapse_k_per_km", 6.50049, "6.5"), ("lapse_k_per_km", 6.5015, "6.502"),
    ("air_density_kg_m3", 1.2249999, "1.225"), ("air_density_kg_m3", 1.000004, "1"),
    ("lift_per_m3_kg", 0.2567891, "0.25679"), ("t_c", 12.34, "12.34"),
    ("mixing_ratio_g_kg", 9.87654, "9.877"), ("molar_mass_g_mol", 4.002616, "4.0026"),
    ("rh_pct", 45.00049, "45"), ("rh_pct", 45.0015, "45.002"), ("gas_volume_m3", 6.0004, "6"),
    ("gas_volume_m3", 6.125, "6.125"),
    ("payload_kg", 120.456, "120.46"), ("spread_k", 1.005, "1"), ("margin_k", 2.345, "2.35"),
    ("purity", 0.98765, "0.9877"), ("anything", 1234567.0, "1.23457e+06"),
    ("anything", -1e-20, "-1e-20"), ("anything", 0.1 + 0.2, "0.3")])
def test_machine_numbers_by_key_family(key, x, want):
    # Decimals by the key's ending (the documented DECIMALS table), 6 significant
    # digits for keys of no family; no float noise and no "-0".
    assert number_text(key, x) == want


def test_decimals_table_is_documented_and_ordered():
    # _k_per_km before _m and _k; _per_m3_kg before _kg: the first ending that matches.
    ends = [e for e, _ in machine_forms.DECIMALS]
    assert ends.index("_k_per_km") < ends.index("_m") and ends.index("_k_per_km") < ends.index("_k")
    assert ends.index("_per_m3_kg") < ends.index("_kg")
    assert ends.index("_kg_m3") < ends.index("_m3")


def test_machine_values_nested():
    v = {"a_m": [1.0049, None, "x"], "b_c": (-0.001,), "n": 3, "ok": True,
         "d": {"z_hpa": 1012.999999, "w_m": 0.004}}
    assert line(list(v), v) == ('{"a_m": [1.0, null, "x"], "b_c": [0.0], "n": 3, "ok": true,'
                                ' "d": {"z_hpa": 1013.0, "w_m": 0.0}}')  # 0.0, not -0.0
    assert line(["t_c", "u"], {"t_c": 27.0, "u": "x"}) == '{"t_c": 27.0, "u": "x"}'


def test_kv_values():
    assert kv_value(None) == "" and kv_value(True) == "1" and kv_value(False) == "0"
    assert kv_value(1016.00000001, "qnh_hpa") == "1016"
    assert kv_value([1.0, 2.5], "levels_msl_m") == "1,2.5"
    assert kv_value(["a caution.", "another."]) == "a caution. | another."
    assert kv_value([[1.0, 2.0], [3.0, 4.0]], "gross_kg") == "1,2;3,4"
    assert kv_value({"b_m": 2.0, "a_m": 1.004}) == "a_m:1;b_m:2"
    layer = {"bottom_msl_m": 411.48, "top_msl_m": 661.48, "lapse_k_per_km": 9.5,
             "saturated_k_per_km": 4.1234, "class": "absolutely_unstable"}
    assert kv_value([layer, layer], "stability_layers") == (
        "411.48:661.48:9.5:4.123:absolutely_unstable;" * 2)[:-1]
    assert kv_value(7) == "7" and kv_value("blue") == "blue" and kv_value([]) == ""
    # lists of one: the kind of the first item decides the form
    assert kv_value([layer], "stability_layers") == "411.48:661.48:9.5:4.123:absolutely_unstable"
    assert kv_value(["one caution."]) == "one caution."
    assert kv_value([[1.0, 2.0]], "gross_kg") == "1,2"
    assert kv_value([2.5], "levels_msl_m") == "2.5"
    assert kv_lines({"t_c": 27.0, "x_m": None, "other": 1}, ("x_m", "t_c", "nope")) == [
        "x_m=", "t_c=27"]
