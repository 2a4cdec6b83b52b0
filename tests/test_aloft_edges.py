"""Points aloft at the edges of what they accept (lapsecalc.aloftpoints.resolve docstring):
temperatures -90..60 degC, pressures under the station pressure, heights above the
field up to the top, two points one level when under 0.01 m apart; and the order of
height and pressure points when the field is not at sea level."""
import math

import pytest

from lapsecalc import Column

G0, RD = 9.80665, 287.05287  # ICAO Doc 7488/3


def test_temperature_limits_are_taken():
    col = Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0,
                 aloft=[(3000.0, 60.0, None), (6000.0, -90.0, -90.0)])
    assert col.t_at(3000.0) == 60.0 and col.t_at(6000.0) == -90.0
    for t in (60.01, -90.01):
        with pytest.raises(ValueError, match="t_c=%r" % t):
            Column(15.0, 5.0, 1000.0, 100.0, aloft=[(3000.0, t, None)])


def test_a_point_dewpoint_up_to_the_slack_above_its_temperature_is_taken_as_it():
    # DEW_SLACK_K (0.05 K, limits.py): a dewpoint that much above the temperature is
    # rounding, clipped to the temperature; a little more is refused.
    col = Column(15.0, 5.0, 1000.0, 100.0, aloft=[(3000.0, 0.0, 0.05)])
    assert col.dewpoint_at(3000.0) == 0.0 and col.t_at(3000.0) == 0.0
    with pytest.raises(ValueError, match="td_c=0.0501 is above t_c=0"):
        Column(15.0, 5.0, 1000.0, 100.0, aloft=[(3000.0, 0.0, 0.0501)])


def test_a_pressure_point_at_the_station_pressure_is_refused():
    with pytest.raises(ValueError, match=r"aloft point 1 \(1000 hPa\) is not above the surface"):
        Column(15.0, 5.0, 1000.0, 100.0, aloft=[(1000.0, 14.0, None, "hPa")])
    col = Column(15.0, 5.0, 1000.0, 100.0, aloft=[(999.9, 14.0, None, "hPa")])
    assert 100.0 < col.aloft_m[0] < 102.0


@pytest.mark.parametrize("aloft, said", [
    ([(700.0, 5.0, None, "hPa"), (700.0, 3.0, None, "hPa")], "same level (700 hPa); keep one"),
    ([(2000.0, 5.0, None), (2000.0, 3.0, None)], "same level (2000 m MSL); keep one"),
])
def test_two_points_at_one_level_say_the_level(aloft, said):
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 1000.0, 100.0, aloft=aloft)
    assert said in str(err.value)


def test_a_point_a_hundredth_of_a_metre_above_the_field_is_its_own_level():
    # Under 0.01 m apart is one level; 0.01 m is two.
    col = Column(15.0, 5.0, 1013.25, 0.0, 6.5, 11000.0, aloft=[(0.01, 15.0, None)])
    assert col.aloft_m == [0.01]


def test_height_and_pressure_points_in_order_above_a_raised_field():
    # A field at 600 m, 10 degC, 940 hPa; points at 1200 m (7 degC) and at 870 hPa
    # (4 degC). With linear temperature between nodes the 870 hPa point lies where
    # the hydrostatic thickness from the 1200 m point reaches it: dz = (R / g) Tlm
    # ln(p1 / p2), Tlm the log-mean temperature of the layer (exact for a linear
    # layer; ICAO Doc 7488/3 constants). The pressure at 1200 m is written here too.
    t0, t1, t2 = 283.15, 280.15, 277.15
    col = Column(10.0, 2.0, 940.0, 600.0, 6.5, 11000.0,
                 aloft=[(870.0, 4.0, None, "hPa"), (1200.0, 7.0, None)])
    g1 = (t1 - t0) / 600.0
    p1 = 940.0 * (t1 / t0) ** (-G0 / (RD * g1))
    assert abs(col.p_at(1200.0) - p1) < 1e-6
    tlm = (t2 - t1) / math.log(t2 / t1)
    z2 = 1200.0 + RD / G0 * tlm * math.log(p1 / 870.0)
    assert col.aloft_m[0] == 1200.0 and abs(col.aloft_m[1] - z2) < 0.01
    assert abs(col.p_at(col.aloft_m[1]) - 870.0) < 1e-6
    assert abs(col.t_at(col.aloft_m[1]) - 4.0) < 1e-9



def test_steep_layer_above_the_lowest_points_and_the_half_kelvin_margin():
    # Every layer up to the highest point is checked, not only the lowest: here the
    # 1500..2500 m layer cools 14 K/km, far past the dry rate g/cp (9.8 K/km; common
    # practice).
    col = Column(20.0, 10.0, 1000.0, 0.0,
                 aloft=[(500.0, 17.0, None), (1500.0, 11.0, None), (2500.0, -3.0, None)])
    w = col.report()["warnings"]
    assert len(w) == 1 and "14.0 K/km" in w[0] and "1500 and 2500 m" in w[0]
    # The margin is 0.5 K/km over the dry rate (typed readings are rounded): 0.503 over
    # it is warned about, 0.497 is not.
    from lapsecalc.constants import DRY_LAPSE_K_PER_KM as dry
    for over, n in ((0.503, 1), (0.497, 0)):
        c = Column(20.0, 10.0, 1000.0, 0.0, aloft=[(1000.0, 20.0 - dry - over, None)])
        assert len(c.report()["warnings"]) == n, over


def test_cloud_layer_edges_see_a_temperature_kink_between_dewpoints():
    # Dewpoints at the field (10 degC) and at 2000 m (-1 degC): linear between,
    # 10 - 5.5 z/km. The temperature has a point of its own at 1000 m (16 degC): 20 ->
    # 16 -> 0 degC, so the spread is 10 K at the field, 11.5 K at 1000 m, 1 K at 2000 m,
    # linear in each part, and the 3 K threshold (common practice) is crossed at
    # 1000 + 1000 (11.5 - 3) / 10.5 m (worked out here).
    col = Column(20.0, 10.0, 1000.0, 0.0, aloft=[(1000.0, 16.0, None), (2000.0, 0.0, -1.0)])
    (a, b), = col.report()["cloud_layers_msl_m"]
    assert abs(a - (1000.0 + 1000.0 * 8.5 / 10.5)) < 1e-6 and b == 2000.0


def test_a_pressure_point_a_metre_under_a_height_point_comes_first():
    # The field as above (600 m, 10 degC, 940 hPa), a height point at 1200 m (7 degC)
    # and a pressure point about a metre under it (7.005 degC): the pressure point is
    # the lower node. It lands where the hydrostatic thickness from the field, with the
    # temperature linear to it, reaches its pressure (log-mean temperature; ICAO Doc
    # 7488/3 constants): written here.
    t0, t1 = 283.15, 280.15
    p1 = 940.0 * (t1 / t0) ** (-G0 / (RD * (t1 - t0) / 600.0))   # pressure at 1200 m
    p_pt = p1 * math.exp(G0 * 1.0 / (RD * t1))                     # about 1 m lower
    tp = 280.155
    col = Column(10.0, 2.0, 940.0, 600.0, 6.5, 11000.0,
                 aloft=[(1200.0, 7.0, None), (p_pt, tp - 273.15, None, "hPa")])
    tlm = (tp - t0) / math.log(tp / t0)
    z_pt = 600.0 + RD / G0 * tlm * math.log(940.0 / p_pt)
    assert 1198.0 < z_pt < 1200.0
    assert abs(col.aloft_m[0] - z_pt) < 1e-6 and col.aloft_m[1] == 1200.0


def test_a_height_point_at_the_field_or_the_top():
    # Above the elevation up to the column top, both ends exact: a point at the
    # elevation itself is refused, one at the top is taken.
    with pytest.raises(ValueError, match=r"aloft point 1 \(100 m MSL\) is outside the column"):
        Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0, aloft=[(100.0, 15.0, None)])
    col = Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0, aloft=[(11000.0, -50.0, None)])
    assert col.aloft_m == [11000.0]


def test_a_point_within_a_centimetre_of_the_field_is_its_level():
    # Under 0.01 m above the field is the field's own level: refused, naming the point
    # (a height point, and a pressure point that lands there).
    for pt, name in (((100.005, 15.0, None), r"aloft point 1 \(100.005 m MSL\)"),
                     ((999.9995, 15.0, None, "hPa"), r"aloft point 1 \(1000 hPa\)")):
        with pytest.raises(ValueError, match=name + " is at the field's level"):
            Column(15.0, 5.0, 1000.0, 100.0, aloft=[pt])


def test_two_height_points_a_hundredth_of_a_metre_apart_are_two_levels():
    # 0.01 m apart is two levels (under it, one): 0.01 - 0.0 is exactly the float
    # 0.01, so the bound itself is tried.
    col = Column(15.0, 5.0, 1013.25, -10.0, 6.5, 11000.0,
                 aloft=[(0.0, 15.0, None), (0.01, 15.0, None)])
    assert col.aloft_m == [0.0, 0.01]


def test_two_pressure_points_at_one_level_are_named_in_the_order_given():
    # Same level: the message names them as typed (point 1, then point 2), whatever
    # their temperatures.
    with pytest.raises(ValueError, match=r"aloft point 1 \(700 hPa\) and aloft point 2 "
                                         r"\(700 hPa\) are at the same level"):
        Column(15.0, 5.0, 1000.0, 100.0, aloft=[(700.0, 5.0, None, "hPa"),
                                                (700.0, -3.0, None, "hPa")])


def test_a_pressure_point_keeps_its_dewpoint():
    col = Column(15.0, 5.0, 1000.0, 100.0, aloft=[(800.0, 2.0, -4.0, "hPa")])
    assert col.dews[-1] == (col.aloft_m[0], -4.0)


def _landing_pressure(z_m):
    # The pressure, and the temperature, at z_m of the column with one height point
    # at 3000 m (12 degC): a pressure point with both lands at z_m (it lies on that
    # column's own profile).
    ref = Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0, aloft=[(3000.0, 12.0, None)])
    return ref.p_at(z_m), ref.t_at(z_m)


def test_a_pressure_point_landing_within_a_centimetre_under_a_height_point():
    # It contradicts the height point (or is the same level): refused by name.
    p, t = _landing_pressure(2999.995)
    with pytest.raises(ValueError, match=r"aloft point 2 \(.* hPa\) and aloft point 1 "
                                         r"\(3000 m MSL\) are at the same level or contradict"):
        Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0,
               aloft=[(3000.0, 12.0, None), (p, t, None, "hPa")])


def test_a_pressure_point_landing_within_a_centimetre_over_a_height_point():
    p, t = _landing_pressure(3000.005)
    with pytest.raises(ValueError, match=r"aloft point 1 \(3000 m MSL\) and aloft point 2 "
                                         r"\(.* hPa\) are at the same level \(3000.00 m MSL\)"):
        Column(15.0, 5.0, 1000.0, 100.0, 6.5, 11000.0,
               aloft=[(3000.0, 12.0, None), (p, t, None, "hPa")])
