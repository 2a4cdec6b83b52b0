"""The balloon words' text (lapsecalc.balloontext.text_lines) line for line against
the general text layout (lapsecalc.layout.text_lines with balloontext's labels), which
balloontext repeats without loading it: every key of the hot-air, gas and sunset
reports, in every display unit, with the edge values each kind treats apart (None,
a value that rounds to -0.0, small volumes, yes/no)."""
import pytest

from lapsecalc import balloontext, layout
from lapsecalc.hotreport import hot_air_report
from lapsecalc.gasballoon import gas_report
from lapsecalc.column import Column
from lapsecalc.shell import Session
from lapsecalc.state import assumed

COL = Column(27.0, 13.0, 967.4, 411.48, 6.5, 16000)  # invented field


def by_layout(s, word, r, rest=True):
    # The lines as the general layout gives them (the path the balloon words took
    # before balloontext laid them out itself).
    out = ["assumed " + n for n in assumed(s.state, True, s.disp["p"] == "inhg")]
    for k in balloontext.keys(word, r if rest else None):
        if k in balloontext.HEADINGS:
            out.append(balloontext.HEADINGS[k])
        if k in r:
            out.extend(layout.text_lines(s, k, r[k],
                                         layout.find_label(balloontext.LABELS, k), r))
    return out


def session(units=(), gas=False):
    s = Session()
    s.feed("temp 27C dew 13C elev 1350ft stn 967.4hPa")
    for line in units:
        assert s.feed(line)[0].startswith("ok"), line
    if gas:
        s.feed("gas helium env 1000m3 fill 600m3 wt 300kg")
    return s


UNITS = ((), ("unit m F inHg",), ("unit ft C hPa",), ("heights ind",))


@pytest.mark.parametrize("units", UNITS)
def test_hot_air_lines_as_the_layout(units):
    s = session(units)
    for r in (hot_air_report(COL, 2800.0, 450.0, 120.0),
              hot_air_report(COL, 2800.0, 450.0, 120.0, 95.0, 1500.0),
              hot_air_report(COL, 900.0, 600.0, 100.0),  # too heavy: None ceilings
              hot_air_report(COL, 20000.0, 1.0, 150.0, 150.0)):  # above the top
        assert balloontext.text_lines(s, "hot", r) == by_layout(s, "hot", r)


@pytest.mark.parametrize("units", UNITS)
def test_gas_and_sunset_lines_as_the_layout(units):
    s = session(units, gas=True)
    for r in (gas_report(COL, "helium", 0.98, 600.0, 1000.0, 300.0, None, 12.0),
              gas_report(COL, "hydrogen", 1.0, 6.0, 10.0, 4.0),  # small volumes
              gas_report(COL, "helium", 1.0, 10.0, 10.0, 40.0)):  # no lift-off
        assert balloontext.text_lines(s, "gas", r) == by_layout(s, "gas", r)
        assert balloontext.text_lines(s, "sunset", r, False) == \
            by_layout(s, "sunset", r, False)


def test_edge_values_as_the_layout():
    s = session(("unit m F inHg",))
    r = hot_air_report(COL, 2800.0, 450.0, 120.0)
    for k, kind in (("z_msl_m", "z"), ("ceiling_msl_m", "z"), ("envelope_t_c", "t"),
                    ("margin_k", "dt"), ("payload_kg", "kg"), ("ambient_p_hpa", "p"),
                    ("lift_per_m3_kg", "rho"), ("volume_m3", "m3")):
        for v in (None, -0.04, 0.04, -0.05, 0.05, -0.0504, 0.0504, -0.06, 0.0, 99.99, 100.0,
                  123456.7):
            one = {k: v}
            got = balloontext.text_lines(s, "hot", one)
            assert got == by_layout(s, "hot", one), (k, kind, v)
    for v in (True, False):
        one = {"envelope_t_set": v}
        assert balloontext.text_lines(s, "hot", one) == by_layout(s, "hot", one)
    # a key with no label: its name and the value as it is
    one = {"zz_new_key": 1.5, "zz_other": "x"}
    got = balloontext.text_lines(s, "hot", one)
    assert got == by_layout(s, "hot", one)
    assert got[-2:] == ["zz_new_key   1.5", "zz_other     x"]
    assert r["oxygen_note"] is None or all(
        not line.startswith("Oxygen") for line in balloontext.text_lines(s, "hot", r))


def test_keys_in_order_then_the_rest_sorted():
    assert balloontext.keys("sunset") == [
        "z_msl_m", "ambient_t_c", "superheat_k", "gas_t_c", "gas_volume_at_z_m3",
        "full_at_z", "full_msl_m", "superheat_lift_kg", "ballast_superheat_lost_kg"]
    hot = balloontext.keys("hot")
    assert hot[:2] == ["z_msl_m", "ambient_t_c"] and hot[-3:] == [
        "oxygen_note", "warnings", "notes"]
    assert hot.index("envelope_t_c") < hot.index("max_envelope_t_c")
    assert balloontext.keys("sunset", {"b": 1, "z_msl_m": 0.0, "a": 2})[-2:] == ["a", "b"]
    # every key of the reports has its place and its label (warnings and notes are
    # said as the report's)
    r = hot_air_report(COL, 2800.0, 450.0, 120.0)
    assert sorted(balloontext.keys("hot")) == sorted(r)
    g = gas_report(COL, "helium", 0.98, 600.0, 1000.0, 300.0, None, 12.0)
    assert sorted(balloontext.keys("gas")) == sorted(g)
    for k in list(r) + list(g):
        assert (k in ("warnings", "notes")) == (layout.find(balloontext.LABELS, k) < 0), k
