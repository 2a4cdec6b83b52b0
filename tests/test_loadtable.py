"""The load table (lapsecalc.loadtable): its rows, where it ends with an empty weight,
and its 40-column text, against lift computed here (ideal gas with the virtual
temperature; test_balloon.hot_lift_m3) and row heights worked out by hand."""
import math

import pytest

from lapsecalc.column import Column
from lapsecalc.shell import Session
from lapsecalc.loadtable import load_table, load_table_text
from test_balloon import hot_lift_m3, field_col

FT = 0.3048   # m per ft, exact (REFERENCES.md "Units")


def isa_from(elev_m, lapse=6.5, top_m=11000.0, t_c=15.0):
    return Column(t_c, t_c - 10.0, 1013.25, elev_m, lapse, top_m)


@pytest.mark.parametrize("elev, step, depth, top, want", [
    # The field, then every multiple of the step MSL above it, to depth above the field.
    (1350 * FT, 500.0, 3000.0, 11000.0,
     [1350 * FT, 500.0, 1000.0, 1500.0, 2000.0, 2500.0, 3000.0]),
    # Below sea level the first multiple above the field is 0 m.
    (-300.0, 500.0, 3000.0, 11000.0, [-300.0, 0.0, 500.0, 1000.0, 1500.0, 2000.0, 2500.0]),
    # A field on a multiple: the next row is one step up.
    (500.0, 500.0, 1500.0, 11000.0, [500.0, 1000.0, 1500.0, 2000.0]),
    # A multiple a metre or less above the field repeats it and is left out; 1.005 m
    # above it is a row of its own.
    (499.5, 500.0, 1000.0, 11000.0, [499.5, 1000.0]),
    (498.9, 500.0, 1000.0, 11000.0, [498.9, 500.0, 1000.0]),
    (499.0, 500.0, 1000.0, 11000.0, [499.0, 1000.0]),
    (498.995, 500.0, 1000.0, 11000.0, [498.995, 500.0, 1000.0]),
    # The rows stop at the column top, the top itself included when it is a multiple.
    (0.0, 1000.0, 9000.0, 4000.0, [0.0, 1000.0, 2000.0, 3000.0, 4000.0]),
    (0.0, 1000.0, 3500.0, 11000.0, [0.0, 1000.0, 2000.0, 3000.0]),
    (0.0, 1000.0, 3000.0, 11000.0, [0.0, 1000.0, 2000.0, 3000.0]),
])
def test_row_heights(elev, step, depth, top, want):
    col = isa_from(elev, 6.5, top)
    hs = load_table(col, 2800.0, 100.0, None, None, [10.0], None, step, depth)["heights_msl_m"]
    assert hs == pytest.approx(want, abs=1e-9)


def test_at_most_forty_rows():
    col = isa_from(0.0, 2.0, 32000.0)
    hs = load_table(col, 2800.0, 100.0, None, None, [10.0], None, 50.0, 32000.0)["heights_msl_m"]
    assert hs == pytest.approx([50.0 * k for k in range(40)])


def test_rows_end_where_no_field_temperature_lifts_the_empty_weight():
    # 9.8 K/km: the -60 degC column reaches -90 degC (the coldest air the columns take)
    # 30 / 9.8 km = 3061 m up and ends there; the 20 degC column lifts under 900 kg
    # everywhere (lift computed here), the -60 degC one about 1600 kg at 3000 m. So the
    # rows end at 3000 m: the last row where some field temperature lifts 900 kg.
    col = Column(20.0, 5.0, 1013.25, 0.0, 9.8, 6000.0)
    temps = [-60.0, 20.0]
    tab = load_table(col, 2800.0, 100.0, None, 900.0, temps, None, 500.0)
    assert tab["heights_msl_m"] == [0.0, 500.0, 1000.0, 1500.0, 2000.0, 2500.0, 3000.0]
    cold, warm = field_col(col, 9.8, -60.0), field_col(col, 9.8, 20.0)
    assert abs(cold.top_m - 30.0 / 9.8 * 1000.0) < 1e-6
    for z, grow, prow in zip(tab["heights_msl_m"], tab["gross_kg"], tab["payload_kg"]):
        g_cold, g_warm = 2800.0 * hot_lift_m3(cold, z, 100.0), 2800.0 * hot_lift_m3(warm, z, 100.0)
        assert g_warm < 900.0 < g_cold
        assert grow == pytest.approx([g_cold, g_warm], rel=1e-6)
        assert prow == pytest.approx([g_cold - 900.0, g_warm - 900.0], rel=1e-6)
    # Without the empty weight the rows go on to 3000 m above the field; the cold
    # column's cells above its top are None.
    tab = load_table(col, 2800.0, 100.0, None, None, temps, [3000.0, 3500.0])
    assert tab["gross_kg"][1][0] is None and tab["gross_kg"][1][1] > 0.0
    # An empty weight exactly equal to the best lift of the last row still lifts.
    best = load_table(col, 2800.0, 100.0, None, None, temps, [3000.0])["gross_kg"][0][0]
    tab = load_table(col, 2800.0, 100.0, None, best, temps, None, 500.0)
    assert tab["heights_msl_m"][-1] == 3000.0 and tab["payload_kg"][-1][0] == 0.0
    # In the text a payload of exactly 0 kg is "0": it lifts, with nothing to spare.
    s = Session()
    s.feed("unit m C")
    assert load_table_text(s, tab)[-3] == "  3000    0    -"


def test_empty_weight_rows_run_to_the_column_top():
    # With an empty weight and no depth the rows may run to the column top (not the
    # 3000 m default): a light balloon in a 6 km column.
    col = isa_from(0.0, 6.5, 6000.0)
    tab = load_table(col, 2800.0, 100.0, None, 100.0, [0.0], None, 1000.0)
    assert tab["heights_msl_m"] == [0.0, 1000.0, 2000.0, 3000.0, 4000.0, 5000.0, 6000.0]
    assert tab["empty_kg"] == 100.0 and tab["envelope_t_c"] == 100.0
    assert tab["dewpoint_c"] == col.td_c and tab["volume_m3"] == 2800.0
    # A field below sea level: the rows still reach the top (the depth is the top less
    # the field, 6400 m here, not the top plus it).
    col = isa_from(-400.0, 6.5, 6000.0)
    tab = load_table(col, 2800.0, 100.0, None, 100.0, [0.0], None, 1000.0)
    assert tab["heights_msl_m"] == [-400.0, 0.0, 1000.0, 2000.0, 3000.0, 4000.0, 5000.0,
                                    6000.0]


def _cells(line):
    # The cells of a text row after the 6-column height: 5 columns each.
    return [line[6 + 5 * i:11 + 5 * i] for i in range((len(line) - 6) // 5)]


def test_text_cells_against_lift_computed_here():
    s = Session()
    s.feed("unit m C")
    col = Column(20.0, 5.0, 1013.25, 0.0, 9.8, 6000.0)
    temps = [-60.0, -20.0, 20.0, 40.0]
    # 20000 m3 at 150 degC: the -60 degC air lifts over 9999.5 kg ("16k"), 40 degC
    # under it; the -60 degC column ends at 3061 m (".").
    tab = load_table(col, 20000.0, 150.0, None, 9000.0, temps, [0.0, 3000.0, 3500.0])
    got = load_table_text(s, tab)
    assert all(len(line) <= 40 for line in got)
    assert got[0] == "load table 20000 m3, 150.0 C working"
    assert got[1] == "greatest gross weight, kg"
    assert got[2] == " m MSL -60C -20C  20C  40C"
    lift = [[None if z > field_col(col, 9.8, t).top_m
             else 20000.0 * hot_lift_m3(field_col(col, 9.8, t), z, 150.0) for t in temps]
            for z in (0.0, 3000.0, 3500.0)]
    for line, z, row in zip(got[3:6], (0.0, 3000.0, 3500.0), lift):
        assert line[:6] == "%6d" % z
        for cell, g in zip(_cells(line), row):
            if g is None:
                assert cell == "    ."
            elif g >= 9999.5 + 0.01:
                assert cell.endswith("k") and abs(float(cell[:-1]) - g / 1000.0) <= 0.5
            else:
                assert abs(float(cell) - g) <= 0.5 + 1e-5 * g
    assert lift[0][0] > 10000.0 and _cells(got[3])[0] == "  16k"
    i = got.index("payload kg (empty 9000 kg)")
    assert got[i + 1] == got[2]
    for line, row in zip(got[i + 2:i + 5], lift):
        for cell, g in zip(_cells(line), row):
            if g is None:
                assert cell == "    ."
            elif g < 9000.0:
                assert cell == "    -"
            else:
                assert abs(float(cell) - (g - 9000.0)) <= 0.5 + 1e-5 * g
    assert got[-2] == "field temp across; dew 5.0 C kept"
    assert got[-1] == "- cannot lift it  . above column"


def test_text_switches_to_thousands_at_9999_5_kg():
    # Volumes chosen (from the lift computed here) so that the field cell is 10600 kg,
    # 9990 kg and exactly 9999.5 kg: from 9999.5 kg on (it would print as 10000, five
    # digits with no space before them) a cell is in thousands.
    s = Session()
    s.feed("unit ft F")
    col = isa_from(0.0, 6.5, 6000.0, 15.0)
    per_m3 = hot_lift_m3(field_col(col, 6.5, -40.0), 0.0, 150.0)
    for kg, cell in ((10600.0, "  11k"), (9990.0, " 9990"), (9999.5, "  10k")):
        v = kg / per_m3
        for _ in range(50):      # the volume whose cell is exactly kg, to the last bit
            tab = load_table(col, v, 150.0, None, None, [-40.0], [0.0])
            g = tab["gross_kg"][0][0]
            if abs(g - kg) > 1e-6 * kg or g == kg:
                break
            v = math.nextafter(v, math.inf if g < kg else -math.inf)
        assert abs(g - kg) < 1e-6 * kg
        got = load_table_text(s, tab)
        assert got[2] == "ft MSL -40F"
        assert got[3] == "     0" + cell
        assert got[-2] == "field temp across; dew 41.0 F kept"
    assert g == 9999.5


def test_input_edges():
    # The documented ranges (load_table docstring): 1..40 heights, step 50..5000 m,
    # depth 1..40000 m; the limits themselves are taken.
    col = isa_from(0.0, 6.5, 11000.0)
    hs = [100.0 * k for k in range(40)]
    assert load_table(col, 2800.0, 100.0, None, None, [10.0], hs)["heights_msl_m"] == hs
    assert load_table(col, 2800.0, 100.0, None, None, [10.0], None, 50.0, 1.0)[
        "heights_msl_m"] == [0.0]
    assert load_table(col, 2800.0, 100.0, None, None, [10.0], None, 5000.0, 40000.0)[
        "heights_msl_m"] == [0.0, 5000.0, 10000.0]
    for kw, name in ((dict(depth_m=0.99), "depth_m"), (dict(step_m=5000.1), "step_m"),
                     (dict(heights_msl_m=[11000.1]), "z_m")):
        with pytest.raises(ValueError) as err:
            load_table(col, 2800.0, 100.0, **kw)
        assert str(err.value).startswith(name)


def test_temperature_edges():
    # Field temperatures -60..60 degC and working envelope temperatures -90..150 degC
    # (load_table docstring): the limits are taken, beyond them refused by name. An
    # envelope at -90 degC is colder than any field air: it cannot lift ("-").
    col = isa_from(0.0, 6.5, 11000.0)
    tab = load_table(col, 2800.0, -90.0, None, None, [-60.0, 60.0], [0.0])
    assert all(g < 0.0 for g in tab["gross_kg"][0])
    for kw, name in ((dict(envelope_t_c=-90.1), "envelope_t_c"),
                     (dict(envelope_t_c=150.1), "envelope_t_c"),
                     (dict(temps_c=[60.1]), "t_c=60.1"), (dict(temps_c=[-60.1]), "t_c=-60.1")):
        args = dict(col=col, volume_m3=2800.0, envelope_t_c=100.0)
        args.update(kw)
        with pytest.raises(ValueError) as err:
            load_table(**args)
        assert str(err.value).startswith(name)
