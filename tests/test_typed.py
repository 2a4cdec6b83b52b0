"""Typed numbers and words of the interpreter (lapsecalc.typed), against outside
definitions: the decimal-number grammar as Python's own float() reads it, the
Levenshtein distance computed by plain recursion, exact unit factors (REFERENCES.md,
Units)."""
import re

import pytest

from lapsecalc.typed import split_number, number, shown, nearest, _edit_distance

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
