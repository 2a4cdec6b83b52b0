"""Typed numbers and words of the interpreter (lapsecalc.typed), against outside
definitions: the decimal-number grammar as Python's own float() reads it, the
Levenshtein distance computed by plain recursion, exact unit factors (REFERENCES.md,
Units)."""
import re

import pytest

from lapsecalc.typed import split_number, number, shown, nearest
from lapsecalc.typed import _edit_distance

# A decimal number with an optional sign, at least one digit, at most one point and an
# optional exponent (the grammar float() accepts, without inf/nan/underscores).
_DECIMAL = re.compile(r"[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?")


@pytest.mark.parametrize("tok", ["27.5C", "1e3", "1E-3ft", "-2.5e2m", "+.5C", "5.", ".5",
                                 "3e", "3e+", "3e+x", "3E-", "1e+3hPa", "-", ".", "+", "1.2.3",
                                 "e5", "12abc", "0.0", "-0", "7e-02km", ""])
def test_split_number_is_the_decimal_grammar(tok):
    m = _DECIMAL.match(tok)
    run = re.match(r"[+-]?[0-9.]*", tok).group(0)
    if m is None or run.count(".") > 1:      # "1.2.3" is no number, not 1.2 and ".3"
        assert split_number(tok) is None
        return
    head = m.group(0)
    assert split_number(tok) == (head, tok[len(head):].lower())
    assert float(head) == float(split_number(tok)[0])


def test_lapse_rate_units():
    # 9 F/1000ft = 5 C/1000ft = 5 / 0.3048 K/km; 1 C/100m = 10 K/km.
    assert number("9F/1000ft", "l", "k/km") == pytest.approx(5.0 / 0.3048, rel=1e-12)
    assert number("-1.8f/1000ft", "l", "k/km") == pytest.approx(-1.0 / 0.3048, rel=1e-12)
    assert number("0.65C/100m", "l", "k/km") == pytest.approx(6.5, rel=1e-12)
    assert number("2K/1000ft", "l", "k/km") == pytest.approx(2.0 / 0.3048, rel=1e-12)


def test_numbers_beyond_any_quantity_are_refused():
    assert number("1e30", "h", "m") == 1e30
    for tok in ("1.005e30", "-1.005e30", "1e31ft", "9" * 40):
        with pytest.raises(ValueError, match="too large a number; accepted up to 1e30"):
            number(tok, "h", "m")


def test_numbers_with_exponents_and_units():
    # 1 ft = 0.3048 m, 1 km = 1000 m (exact).
    assert number("1.5e+3ft", "h", "m") == pytest.approx(1500 * 0.3048, abs=1e-9)
    assert number("2e-3km", "h", "m") == pytest.approx(2.0, abs=1e-12)
    assert number("-4.5E1", "t", "c") == -45.0


def _levenshtein(a, b):
    # Plain recursive definition (insert, delete, substitute, each 1).
    if not a or not b:
        return len(a) + len(b)
    return min(_levenshtein(a[1:], b) + 1, _levenshtein(a, b[1:]) + 1,
               _levenshtein(a[1:], b[1:]) + (a[0] != b[0]))


@pytest.mark.parametrize("a,b", [("tmep", "temp"), ("qhn", "qnh"), ("", "abc"), ("abc", ""),
                                 ("kitten", "sitting"), ("report", "reprot"), ("a", "b"),
                                 ("ballon", "balloon"), ("elr", "elev")])
def test_edit_distance_is_levenshtein(a, b):
    assert _edit_distance(a, b) == _levenshtein(a, b)


def test_shown_caps_at_24_printable_characters():
    # The documented cap: at most 24 characters of what was typed, then "...";
    # anything outside printable ASCII as "?".
    assert shown("x" * 24) == "x" * 24
    assert shown("x" * 25) == "x" * 24 + "..."
    assert shown("a\tb\u00e9") == "a?b?"


def test_nearest_takes_at_most_two_edits():
    known = ["temp", "dew", "report", "qnh", "elev", "elr"]
    assert nearest("tepm", known) == "temp"          # 2 edits
    assert nearest("tpxm", known) is None            # 3 edits
    assert nearest("ELRV", known) in ("elr", "elev")
    assert nearest("de", known) == "dew"
    assert nearest("d", known) is None               # not fewer edits than letters


# ---- said back, bounds in the user's unit, words joined (exact unit factors:
# REFERENCES.md, Units: 1 ft = 0.3048 m, 1 inHg = 33.8639 hPa, 1 mmHg = 1.333224 hPa,
# 1 lb = 0.45359237 kg, F = C * 1.8 + 32) ----

from lapsecalc.typed import (in_unit, digits, said, value, unit_of, unit_kind, join_words,
                             is_unit, starts_number, no_args, ALIASES, AMBIGUOUS, PAIRS,
                             look_up)


def test_units_written_back_and_the_units_accepted_per_quantity():
    # The unit spellings of the README's interpreter section (K/km, C/1000ft, inHg, ...).
    from lapsecalc.typed import written, accepted
    typed = ("c", "degc", "f", "degf", "k", "hpa", "inhg", "mmhg", "kpa", "k/km", "c/km",
             "c/1000ft", "k/1000ft", "f/1000ft", "c/100m", "k/100m")
    assert [written(u) for u in typed] == [
        "C", "C", "F", "F", "K", "hPa", "inHg", "mmHg", "kPa", "K/km", "C/km", "C/1000ft",
        "K/1000ft", "F/1000ft", "C/100m", "K/100m"]
    # Units written as typed, and text that is no unit of the table, come back as given.
    for u in ("ft", "m", "km", "mb", "mbar", "%", "m3", "ft3", "kg", "lb", "degk", "", "hp",
              "c/1000", "hpa=hPa", "hPa", "/km", "deg"):
        assert written(u) == u
    assert [accepted(q) for q in ("t", "h", "p", "l", "rh", "v", "w")] == [
        "C F K", "ft m km", "hPa mb inHg mmHg kPa", "K/km C/1000ft C/100m F/1000ft", "%",
        "m3 ft3", "kg lb"]


def test_look_up_reads_only_whole_entries():
    table = " a=one ab=two b=three "
    assert [look_up(table, k) for k in ("a", "ab", "b")] == ["one", "two", "three"]
    for k in ("", "c", "one", "a=one", "=", "bb", " a"):
        assert look_up(table, k) is None and look_up(table, k, "x") == "x"


def test_shown_keeps_the_printable_ends():
    assert shown(" ~") == " ~" and shown("\x1f\x7f") == "??"


@pytest.mark.parametrize("x,u,kind,want", [
    (850.0, "inhg", "p", "25.1 inHg"), (1100.0, "inhg", "p", "32.48 inHg"),  # 25.100, 32.483
    (1.0, "kpa", "p", "0.1 kPa"), (1013.25, "kpa", "p", "101.3 kPa"),
    (1013.25, "mmhg", "p", "760 mmHg"), (1013.25, "hpa", "p", "1013 hPa"),
    (9000.0, "km", "h", "9 km"), (411.48, "km", "h", "0.4 km"), (-500.0, "ft", "h", "-1640 ft"),
    (30.0, "c/1000ft", "l", "9.14 C/1000ft"), (30.0, "k/1000ft", "l", "9.14 K/1000ft"),
    (30.0, "f/1000ft", "l", "16.5 F/1000ft"), (25.0, "c/100m", "l", "2.5 C/100m"),
    (25.0, "k/100m", "l", "2.5 K/100m"), (30.0, "k/km", "l", "30 K/km"),
    (26.4, "c/100m", "l", "2.6 C/100m"), (26.4, "k/100m", "l", "2.6 K/100m"),
    (1013.25, "kpa", "p", "101.3 kPa"), (33.0, "c/1000ft", "l", "10.06 C/1000ft"),
    (60.0, "f", "t", "140 F"), (-90.0, "k", "t", "183 K"), (5.55, "c", "t", "5.55 C"),
    (-0.001, "c", "t", "0 C"), (9.999, "c", "t", "10 C"), (10.0, "m", "h", "10 m"),
    (10.05, "c", "t", "10 C"),
    (1.0, "f", "dt", "1.8 F"), (10.0, "degf", "dt", "18 F"), (10.0, "k", "dt", "10 K"),
    (0.1, "m3", "v", "0.1 m3"), (0.1, "ft3", "v", "3.53 ft3"), (1.0, "lb", "w", "2.2 lb")])
def test_bounds_said_in_the_users_unit(x, u, kind, want):
    assert in_unit(x, u, kind) == want


@pytest.mark.parametrize("tok,want", [(".5", "0.5"), ("-.5", "-0.5"), ("5.", "5"),
                                      ("-0", "0"), ("-0.0", "0.0"), ("+3", "3"),
                                      ("1.50", "1.50"), ("0.45", "0.45"), ("-3.5C", "-3.5"),
                                      ("1e3", "1e3"), ("+.25%", "0.25")])
def test_digits_as_typed(tok, want):
    assert digits(tok) == want


def test_said_and_value_in_the_users_words():
    assert said("700", "ft") == "700 ft" and said("2.5km", "ft") == "2.5 km"
    assert said("45%", "%") == "45 %" and said("-0C", "f") == "0 C"
    assert said("abc", "ft") == "abc" and said("27degf", "c") == "27 F"
    # the digits said back: at most 16 of them
    assert said("1234567890123456", "ft") == "1234567890123456 ft"
    assert said("12345678901234567", "ft") == "1234567890123456... ft"
    assert value("1100", "p", "hpa", 850.0, 1100.0) == 1100.0
    assert value("850", "p", "hpa", 850.0, 1100.0) == 850.0
    with pytest.raises(ValueError, match=r"^99 C is outside -90\.\.60 C$"):
        value("99", "t", "c", -90.0, 60.0)
    with pytest.raises(ValueError, match=r"^iso: 141 F is outside -130\.\.140 F$"):
        value("141F", "t", "c", -90.0, 60.0, "iso")
    with pytest.raises(ValueError, match=r"^1100\.1 hPa is outside 850\.\.1100 hPa$"):
        value("1100.1", "p", "hpa", 850.0, 1100.0)
    with pytest.raises(ValueError, match=r"too large a number"):
        value("2e30", "h", "m", 0.0, 1e40)
    assert value("1e30", "h", "m", 0.0, 1e40) == 1e30


def test_units_of_typed_numbers():
    assert unit_of("27", "c") == "c" and unit_of("27F", "c") == "f" and unit_of("x", "m") == "m"
    assert unit_kind("27F") == "t" and unit_kind("3km") == "h" and unit_kind("2inHg") == "p"
    assert unit_kind("27") is None and unit_kind("27zz") is None and unit_kind("abc") is None
    assert is_unit("ft") and is_unit("FEET") and is_unit("hPa") and not is_unit("temp")
    assert starts_number("-3") and starts_number(".5") and starts_number("+1")
    assert not starts_number("") and not starts_number("e5")
    no_args("show", [])
    with pytest.raises(ValueError, match="show takes nothing after it; got 'x'"):
        no_args("show", ["x"])


def test_words_joined():
    assert join_words(["field", "elevation", "1350", "ft"]) == ["elev", "1350ft"]
    assert join_words(["temp", "20", "field", "elevation", "411", "m"]) == [
        "temp", "20", "elev", "411m"]
    assert join_words(["Field", "Elev", "411", "m"]) == ["elev", "411m"]
    assert join_words(["dew", "point", "13", "C"]) == ["dew", "13C"]
    assert join_words(["altimeter", "setting", "29.92", "inHg"]) == ["qnh", "29.92inHg"]
    assert join_words(["elr", "8@2", "km"]) == ["elr", "8@2km"]
    # the unit joins the top after "@", whatever the rate carries
    assert join_words(["elr", "2C/1000ft@3000", "ft"]) == ["elr", "2C/1000ft@3000ft"]
    assert join_words(["elev", "6500", "feet"]) == ["elev", "6500ft"]
    assert join_words(["elev", "6500ft", "ft"]) == ["elev", "6500ft", "ft"]
    assert join_words(["ft", "6500"]) == ["ft", "6500"]
    assert join_words(["metar", "X", "24/M02", "Q", "ft"]) == ["metar", "X", "24/M02", "Q", "ft"]
    assert join_words(["temp", "27", "C", "metar", "field", "elevation"]) == [
        "temp", "27C", "metar", "field", "elevation"]
    # every pair and alias names a word of one meaning; alt is refused as ambiguous
    assert set(PAIRS.values()) <= {"elev", "dew", "qnh"}
    assert look_up(ALIASES, "altimeter") == "qnh" and look_up(ALIASES, "elevation") == "elev"
    assert look_up(ALIASES, "oat") == "temp" and look_up(ALIASES, "dp") == "dew"
    assert look_up(ALIASES, "dewpoint") == "dew" and look_up(ALIASES, "t") == "temp"
    assert look_up(ALIASES, "exit") == "bye" and look_up(ALIASES, "?") == "help"
    # Only a whole typed word is an alias; anything else is itself (the default).
    for w in ("alt", "temp", "dew", "e", "oat=temp", "", "=", "it", "exi", "xit"):
        assert look_up(ALIASES, w) is None and look_up(ALIASES, w, w) == w
    assert "qnh" in AMBIGUOUS["alt"] and "elev" in AMBIGUOUS["alt"]


def test_exponent_digits_and_nearest_ties():
    assert split_number("2e9") == ("2e9", "") and split_number("1E-9ft") == ("1E-9", "ft")
    # ties go to the first known word in sorted order
    assert nearest("ab", ["bb", "ax"]) == "ax"
    # a word is compared by its first 16 letters: 2 edits there, 3 in 17
    assert nearest("abcdefghijklmnxyz", ["abcdefghijklmnop"]) == "abcdefghijklmnop"
    # not as many edits as the word has letters: "ab" is not a slip of "xy"
    assert nearest("ab", ["xy"]) is None and nearest("abc", ["xyc"]) == "xyc"


def test_unknown_word_suggests_aliases_of_three_letters_or_more_of_the_words_allowed():
    # An alias joins the suggestions when it stands for an allowed word and has more
    # than two letters: "oat" (temp) does, "sh" (superheat) does not (too short to
    # tell a slip from another word), "frz" (ice) not where only settings may stand.
    from lapsecalc.typed import unknown
    settings = ["temp", "dew", "rh", "superheat", "fill", "trop"]
    assert unknown("oatt", list(settings)) == \
        "unknown word 'oatt'; did you mean 'temp'? (help lists the words)"
    assert unknown("sj", list(settings)) == "unknown word 'sj'; (help lists the words)"
    assert unknown("frzz", list(settings)) == "unknown word 'frzz'; (help lists the words)"
    assert unknown("frzz", settings + ["ice"]) == \
        "unknown word 'frzz'; did you mean 'ice'? (help lists the words)"
    # Right after a number a slip of a unit is a unit; elsewhere it is only a word.
    assert unknown("fet", list(settings), "6500") == \
        "unknown word 'fet' after 6500; did you mean the unit: 6500 feet?"
    assert unknown("fet", list(settings), "elev") == \
        "unknown word 'fet'; did you mean 'dew'? (help lists the words)"
    # A unit alone, and a name of two words, are said to be what they are.
    assert unknown("ft", list(settings)) == \
        "'ft' is a unit: write it after its number, e.g. elev 6500 ft"
    assert unknown("ALT", list(settings)) == AMBIGUOUS["alt"]
