"""The json mode's own JSON writer (lapsecalc.jsontext) against CPython's json module.

The reference is the json mode as it was before the writer: a dict of the values with
every float rounded to float(number_text(key, x)), written by json.dumps (separators
", " and ": ", ensure_ascii): the writer must give the same text, byte for byte, on
CPython. Sources: RFC 8259 (JSON strings, escapes, surrogate pairs: section 7) and
CPython's json module and repr(float) (common practice)."""
import json
import random

import pytest
from hypothesis import given, strategies as st

from lapsecalc import jsontext
from lapsecalc.jsontext import line, number
from lapsecalc.machine import number_text, DECIMALS
from lapsecalc.shell import Session

KEYS = [e[1:] if e[0] == "_" else e for e, _ in DECIMALS] + ["x"]  # one key per family
KEYS = ["a_" + k if k != "purity" else k for k in KEYS]


def rounded(key, v):
    # Floats as the json mode rounds them (number_text's digits read back), nested
    # lists too; a nested dict's own keys name their families.
    if isinstance(v, float):
        return float(number_text(key, v))
    if isinstance(v, (list, tuple)):
        return [rounded(key, x) for x in v]
    if isinstance(v, dict):
        return dict((k, rounded(k, v[k])) for k in v)
    return v


def reference(keys, values, tail=None):
    obj = {}
    for k in keys:
        if k in values and k not in obj:
            obj[k] = rounded(k, values[k])
    if tail is not None:
        obj[tail[0]] = tail[1]
    return json.dumps(obj)


def test_objects_in_the_order_given():
    # Keys in the order asked, not the dict's; keys missing from values left out.
    assert line(["b", "a", "c"], {"a": 1, "b": 2}) == '{"b": 2, "a": 1}'
    assert line([], {}) == "{}" and line((), (), ("ok", [])) == '{"ok": []}'
    assert line(["d"], {"d": {}}) == '{"d": {}}'
    assert line(["x"], {"x": [None, True, False, 3, "s"]}) == \
        '{"x": [null, true, false, 3, "s"]}'
    assert line(["t_c"], {"t_c": 27.0}, ("assumed", ["ELR 6.5"])) == \
        '{"t_c": 27.0, "assumed": ["ELR 6.5"]}'
    # A nested dict in its own order; its keys name their families.
    assert line(["n"], {"n": {"z_m": 1.004, "a_hpa": 1012.999}}) == \
        '{"n": {"z_m": 1.0, "a_hpa": 1013.0}}'


@pytest.mark.parametrize("t, want", [
    # repr(float): ".0" on a whole number, the exponent form below 1e-4 and from
    # 1e16 on, two exponent digits at least (common practice: CPython's repr).
    ("0", "0.0"), ("1009", "1009.0"), ("-0.5", "-0.5"), ("0.0001", "0.0001"),
    ("0.00001", "1e-05"), ("-0.00012", "-0.00012"), ("1.5e-05", "1.5e-05"),
    ("1e+06", "1000000.0"), ("1.23457e+06", "1234570.0"), ("1000000000000000", "1000000000000000.0"),
    ("10000000000000000", "1e+16"), ("1.5e+16", "1.5e+16"), ("-1e-20", "-1e-20"),
    ("1e+300", "1e+300"), ("120.50", "120.5"), ("0.00010", "0.0001"), ("-1000.0", "-1000.0"),
    # More digits than a double keeps: the shortest digits that read back.
    ("12345678901234567", "1.2345678901234568e+16"), ("0.1000000000000000055511", "0.1"),
])
def test_numbers_as_cpython_writes_them(t, want):
    assert number(t) == want
    assert json.dumps(float(t)) == want  # the source of the expectations


def test_numbers_by_string_work(monkeypatch):
    # The digits of the text, not of a float read from it (a board's floats may be
    # single precision, its float formatting noisy): float() only where a double
    # keeps fewer digits than the text (16 and more) or beyond the normal range.
    read = []

    def traced(t):
        read.append(t)
        return float(t)

    monkeypatch.setattr(jsontext, "float", traced, raising=False)
    for t, want in (("123456789012345", "123456789012345.0"), ("-0.5", "-0.5"),
                    ("-0.00000000000001", "-1e-14"), ("1e-307", "1e-307"),
                    ("9.99999999999999e+307", "9.99999999999999e+307"), ("0", "0.0")):
        assert number(t) == want and read == [], t
    for t in ("1234567890123456", "1e-308", "1e+308", "0.1000000000000001"):
        assert number(t) == json.dumps(float(t)) and read[-1] == t, t


def test_fast_paths_keep_the_text():
    # A board allocates every string: a number already as CPython writes it, and a
    # printable ASCII string, are used as they are (the same object).
    for t in ("411.48", "-0.5", "0.0001", "-1234567890.125"):
        assert number(t) is t
    assert number("9999999999999999") == "1e+16"  # 16 digits: no longer exact
    for s in ("a b", " ", "~", "Icing likely in cloud from 4535 m (14877 ft) MSL up."):
        out = []
        jsontext.text(out, s)
        assert out == ['"', s, '"'] and out[1] is s
    out = []
    jsontext.text(out, "a\tb")
    assert "".join(out) == '"a\\tb"' and len(out) == 5


@pytest.mark.parametrize("s, want", [
    # RFC 8259 section 7: the two-character escapes, \u00XX for other control
    # characters, and a character above U+FFFF as its UTF-16 surrogate pair (the
    # section's G clef U+1D11E example); lower-case hex and \u for all but space..~
    # as CPython's json.dumps writes them (ensure_ascii, common practice).
    ('a"b\\c/', '"a\\"b\\\\c/"'), ('"q"', '"\\"q\\""'), ("\\n", '"\\\\n"'),
    ("a\x1f", '"a\\u001f"'), ("\b\f\n\r\t", '"\\b\\f\\n\\r\\t"'),
    ("\x00\x01\x0b\x1f", '"\\u0000\\u0001\\u000b\\u001f"'), ("~\x7f", '"~\\u007f"'),
    ("\u00e9t\u00e9", '"\\u00e9t\\u00e9"'), ("\U0001D11E", '"\\ud834\\udd1e"'),
    ("\u20ac1\uffff", '"\\u20ac1\\uffff"'), ("\ud800", '"\\ud800"'), ("", '""'),
    # The ends of UTF-8's 2, 3 and 4 byte forms (RFC 3629 section 4).
    ("\x80\u07ff\u0800", '"\\u0080\\u07ff\\u0800"'),
    ("\U00010000\U0010ffff", '"\\ud800\\udc00\\udbff\\udfff"'),
])
def test_strings_escaped(s, want):
    assert line((), (), ("k", s)) == '{"k": %s}' % want
    assert json.dumps(s) == want  # the source of the expectations


@given(st.text(alphabet=st.characters(exclude_categories=())))
def test_any_string_as_json_dumps_writes_it(s):
    # Values; keys are plain names (printable ASCII, no quote or backslash), written
    # as they are: every key of the sessions below passes through json.dumps too.
    assert line((), (), ("k", s)) == json.dumps({"k": s})
    assert line(["k_m"], {"k_m": [s, {"n": s}]}) == json.dumps({"k_m": [s, {"n": s}]})


@given(st.floats(allow_nan=False, allow_infinity=False), st.sampled_from(KEYS))
def test_any_float_of_any_family(x, key):
    assert line([key], {key: x}) == reference([key], {key: x})
    assert line(["n"], {"n": [{key: x}]}) == reference(["n"], {"n": [{key: x}]})


@given(st.floats(allow_nan=False, allow_infinity=False), st.integers(0, 20))
def test_any_decimal_text(x, digits):
    # Texts of every length, so that the shortest-digits branch (more than 15
    # significant digits) is met too.
    for t in (("%." + str(digits) + "g") % x, ("%." + str(digits) + "f") % x):
        if abs(float(t)) < float("inf"):  # "%.0g" of 1.5e308 is 2e+308
            assert number(t) == json.dumps(float(t)), t


def test_a_long_object_in_many_chunks():
    rnd = random.Random(7)
    keys = ["k%03d_m" % i for i in range(400)]
    values = dict((k, [rnd.uniform(-1e4, 1e4), "s\n"]) for k in keys)
    assert len(line(keys, values)) > 10000
    assert line(keys, values) == reference(keys, values)


def test_a_long_object_written_in_pieces():
    # With a writer the line is written segment by segment, then a newline, and never
    # made whole: the pieces are the line's text.
    rnd = random.Random(11)
    keys = ["k%03d_m" % i for i in range(400)]
    values = dict((k, [rnd.uniform(-1e4, 1e4), "s\n"]) for k in keys)
    pieces = []
    assert line(keys, values, ("note", ["a", "b"]), None, pieces.append) is None
    assert "".join(pieces) == reference(keys, values, ("note", ["a", "b"])) + "\n"
    assert len(pieces) > 10 and pieces[-1] == "\n"
    assert max(len(p) for p in pieces) < 2000
    short = []
    assert line((), (), ("ok", ["temp"]), None, short.append) is None
    assert short == ['{"ok": ["temp"]}', "\n"]


@pytest.fixture
def checked(monkeypatch):
    # Every json line the session writes goes through jsontext.line: compare each
    # with the reference.
    seen = []
    real = jsontext.line

    def spy(keys, values, rest=None, gc=None, write=None):
        assert write is None  # these sessions return every line from feed()
        got = real(keys, values, rest, gc)
        assert got == reference(keys, values, rest)
        seen.append(got)
        return got

    monkeypatch.setattr(jsontext, "line", spy)
    return seen


WORDS = ("report", "obs", "base", "ice", "frost", "stab", "parcel", "thermal", "da",
         "da 9500ft", "at 2000ft agl", "at 700hPa", "iso -15C", "levels", "cold",
         "cold 1200ft", "show", "heights ind", "ice", "at FL85", "heights msl", "chart",
         "help elr", "bogus 12", "temp 99", "unit m F inHg", "report", "unit ft C hPa")


def _settings(rnd):
    t = rnd.uniform(-25.0, 38.0)
    lines = ["temp %.1fC dew %.1fC elev %dm qnh %.1f" % (
        t, t - rnd.uniform(0.2, 25.0), rnd.randint(-50, 2500), rnd.uniform(985.0, 1040.0))]
    layers = " ".join("%.1f@%dm" % (rnd.uniform(-6.0, 9.8), 300 * (i + 1) + rnd.randint(0, 200))
                      for i in range(rnd.randint(0, 3)))
    lines.append("elr %s %.1f" % (layers, rnd.uniform(4.0, 9.0)))
    lines.append("excess %.1fK" % rnd.uniform(0.0, 3.0))
    if rnd.random() < 0.5:
        t2 = t - rnd.uniform(5.0, 15.0)
        lines.append("aloft 1500m %.0fC/%.0fC 3000m %.0fC FL180 %.0fC/%.0fC" % (
            t2, t2 - rnd.uniform(0.0, 6.0), t2 - 8, t2 - 30, t2 - 33))
    return lines


def _fed(s, text, checked):
    # Every output line of text was written by jsontext.line (and checked).
    n = len(checked)
    out = s.feed(text)
    assert sorted(out) == sorted(checked[n:]), text


def test_every_json_line_of_seeded_sessions(checked):
    rnd = random.Random(15)
    for n in range(12):
        s = Session()
        assert s.feed("out json") == ['{"ok": ["out"]}']
        for text in _settings(rnd) + list(WORDS):
            _fed(s, text, checked)
    # Balloons, loads, sunset, clear and the text words.
    s = Session()
    for text in ("out json", "temp 27C dew 13C elev 1350ft", "env 2800m3 wt 450kg tmax 120C tenv 95C",
                 "balloon", "balloon 3000ft", "clear tenv", "margin 15K", "balloon",
                 "loads 420kg", "gas helium env 10m3 fill 6m3 wt 4kg pure 98%", "balloon",
                 "sunset 2000ft agl", "show", "clear gas", "help", "svg x.svg", "clear",
                 "report", "bye"):
        _fed(s, text, checked)
    reports = [x for x in checked if '"cautions"' in x]
    assert len(reports) >= 20 and len(checked) > 500
    assert any('"text"' in x for x in checked) and any('"error"' in x for x in checked)
    assert any('"indicated_altitude_m": {' in x for x in checked)

