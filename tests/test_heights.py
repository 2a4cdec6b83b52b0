"""A height typed after a query word (lapsecalc/heights.py) at the column's ends: the
field and the top themselves are inside, a millimetre of rounding past either end is
that end, anything more is refused in the units typed. 1 ft = 0.3048 m exactly (the
international foot, common practice)."""

from lapsecalc.jsontext import line
from lapsecalc.shell import Session


def _session():
    s = Session()
    for line in ("elev 1350ft", "temp 20C dew 5C", "stn 967.4", "top 10000ft"):
        assert s.feed(line)[0].startswith("ok:"), line
    return s


def _true_alt(out):
    # The "true alt" line of at's text: feet first.
    line = [x for x in out if x.startswith("true alt")][0]
    return int(line.split()[2])


def test_the_field_and_the_top_themselves_are_in_the_column():
    s = _session()
    assert _true_alt(s.feed("at 1350ft")) == 1350
    assert _true_alt(s.feed("at 0ft agl")) == 1350
    assert _true_alt(s.feed("at 10000ft")) == 10000
    assert _true_alt(s.feed("at 8650ft agl")) == 10000


def test_a_millimetre_past_an_end_is_the_end():
    # 0.0015 ft = 0.457 mm: under the 1 mm allowance at both ends.
    s = _session()
    assert _true_alt(s.feed("at 1349.9985ft")) == 1350
    assert _true_alt(s.feed("at 10000.0015ft")) == 10000


def test_three_centimetres_past_an_end_is_refused_in_feet():
    # 0.1 ft = 3.05 cm: past the allowance.
    s = _session()
    out = s.feed("at 1349.9ft")
    assert out[0].startswith("error: at: 1349.9 ft is below the field"), out
    out = s.feed("at 10000.1ft")
    assert out[0].startswith("error: at: 10000.1 ft is above the"), out


def test_the_field_pressure_itself_is_in_the_column():
    # stn 967.4 makes the field's pressure exactly 967.4 hPa.
    s = _session()
    assert _true_alt(s.feed("at 967.4hPa")) == 1350
    assert s.feed("at 967.5hPa")[0].startswith("error: at: 967.5 hPa is not in the")


def test_machine_numbers_have_no_negative_zero():
    # A value that rounds to zero is written 0.0, never -0.0 (json of -0.0 is "-0.0").
    for v in (-1e-9, -0.0, -0.004):
        assert line(["t_c"], {"t_c": v}) == '{"t_c": 0.0}', v


def test_more_than_a_height_and_its_frame_is_refused():
    s = _session()
    assert _true_alt(s.feed("at 2000ft agl")) == 3350
    out = s.feed("at 2000 ft agl")
    assert _true_alt(out) == 3350, out
    out = s.feed("at 2000ft agl msl")
    assert out[0].startswith("error: at takes a height, e.g."), out
