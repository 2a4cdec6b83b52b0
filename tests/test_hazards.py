"""Hazards: icing band, freezing rain and ice pellets, wet-bulb zero, frost point and
RH over ice, fog, carburettor icing, thermal cloud base and the thermal wording.
Every profile here is invented."""
import math

import pytest
from hypothesis import assume, given, strategies as st

import refs
from lapsecalc import Column, cloud_base, dewpoint, wet_bulb
from lapsecalc import hazards, stability
from lapsecalc.fieldrisk import carb_icing, fog_risk
from lapsecalc.precip import precip_type, warm_layer, wet_bulb_zero
from lapsecalc.moisture import _dewpoint_from_e
from lapsecalc.fieldrisk import frost_point, relative_humidity_ice

G0 = 9.80665   # ICAO Doc 7488/3


# ---- frost point and RH over ice ----

# REFERENCES.md "Frost point" (Hyland-Wexler over water and ice, ASHRAE Fundamentals
# ch. 1; computed): dewpoint -> frost point, degC.
FROST_TABLE = ((-5.0, -4.43), (-10.0, -8.90), (-20.0, -17.94), (-30.0, -27.13),
               (-40.0, -36.46))


@pytest.mark.parametrize("td, want", FROST_TABLE)
def test_frost_point_table(td, want):
    # Within 0.1 K of Hyland-Wexler (issue requirement); the table has two decimals.
    assert abs(frost_point(td) - want) < 0.1 - 0.005


def test_frost_point_against_hyland_wexler_minus60_to_0():
    # Hyland-Wexler over water gives the dewpoint's vapour pressure; the frost point is
    # where Hyland-Wexler over ice reaches it (ASHRAE Fundamentals ch. 1, tests/refs.py).
    for i in range(0, 66):
        td = -0.99 * i
        e = refs.hyland_wexler_water_hpa(td)
        want = refs.bisect(lambda t: refs.hyland_wexler_ice_hpa(t) - e, -90.0, 0.0)
        if want < -60.0:
            break
        assert abs(frost_point(td) - want) < 0.1, td
    # The frost point lies between the dewpoint and 0 degC (ice holds its vapour
    # tighter than water below 0 degC; any textbook).
    assert -10.0 < frost_point(-10.0) < 0.0 and frost_point(0.0) == 0.0


def test_rh_over_ice_is_100_at_the_frost_point():
    # 100 % where the dewpoint's vapour pressure equals the ice saturation pressure.
    for td in (-1.0, -7.5, -15.0, -33.0, -55.0):
        assert abs(relative_humidity_ice(frost_point(td), td) - 100.0) < 1e-6
    # REFERENCES.md "Frost point": dewpoint -10 degC, frost point -8.90 degC (two
    # decimals: 0.005 K is 0.05 % of RH).
    assert abs(relative_humidity_ice(-8.90, -10.0) - 100.0) < 0.3
    # Saturated over water below 0 degC is supersaturated over ice: at -20 degC by the
    # ratio of the Hyland-Wexler pressures 1.2563 / 1.0326 hPa (REFERENCES.md).
    assert abs(relative_humidity_ice(-20.0, -20.0) - 100.0 * 1.2563 / 1.0326) < 0.5


def test_frost_and_rh_ice_refuse_warm_input():
    with pytest.raises(ValueError, match="td_c=2"):
        frost_point(2.0)
    # Dewpoints -90..0 degC (the library's range; ice needs 0 degC or below).
    with pytest.raises(ValueError, match="td_c=0.005"):
        frost_point(0.005)
    with pytest.raises(ValueError, match="td_c=-90.5"):
        frost_point(-90.5)
    assert frost_point(-90.0) < -80.0
    with pytest.raises(ValueError, match="t_c=3"):
        relative_humidity_ice(3.0, -5.0)
    with pytest.raises(ValueError, match="t_c=0.005"):
        relative_humidity_ice(0.005, -5.0)
    assert relative_humidity_ice(0.0, -5.0) < 100.0


def test_report_frost_fog_and_ice_fog():
    # Ice fog: -30 degC, dewpoint -31 degC (over water) is saturated over ice.
    r = Column(-30.0, -31.0, 1030.0, 100.0, 6.5).report()
    assert r["frost_point_c"] == pytest.approx(frost_point(-31.0))
    assert r["rh_ice_pct"] > 100.0 and r["ice_fog_risk"] is True
    assert r["fog_risk"] is True      # spread 1 K <= 3 K (common practice)
    assert "Spread 1.0 K at the field: fog or low stratus likely." in r["cautions"]
    assert any("saturated over ice" in c for c in r["cautions"])
    warm = Column(20.0, 10.0, 1000.0, 0.0).report()
    assert warm["frost_point_c"] is None and warm["rh_ice_pct"] is None
    assert warm["fog_risk"] is False and warm["ice_fog_risk"] is False
    assert not any("fog" in c for c in warm["cautions"])


def test_frost_point_and_rh_ice_at_exactly_0_c():
    # A dewpoint of exactly 0 degC has a frost point (0 degC: water and ice saturate
    # alike there); air at exactly 0 degC has an RH over ice.
    r = Column(2.0, 0.0, 1000.0, 0.0).report()
    assert r["frost_point_c"] == 0.0 and r["rh_ice_pct"] is None
    r = Column(0.0, -3.0, 1000.0, 0.0).report()
    assert r["rh_ice_pct"] == pytest.approx(relative_humidity_ice(0.0, -3.0))
    assert r["frost_point_c"] == pytest.approx(frost_point(-3.0))


def test_ice_fog_from_100_percent_over_ice():
    # Saturated over ice (RH over ice 100 % or more) flags ice fog: 0.05 K under the
    # frost point (about 100.5 %) it does, 0.05 K over it (about 99.5 %) it does not.
    td = -25.0
    fp = frost_point(td)
    wet = Column(fp - 0.05, td, 1000.0, 0.0).report()
    dry = Column(fp + 0.05, td, 1000.0, 0.0).report()
    assert 100.0 < wet["rh_ice_pct"] < 101.0 and wet["ice_fog_risk"] is True
    assert 99.0 < dry["rh_ice_pct"] < 100.0 and dry["ice_fog_risk"] is False


def test_fog_threshold_is_3_k():
    # Spread 3 K or less: fog or low stratus likely (common practice).
    assert fog_risk(10.0, 7.0) is True
    assert fog_risk(10.0, 6.98) is False


# ---- carburettor icing ----

def _td(t, rh):
    return dewpoint(t, rh)


# Band corners, recalled from the chart of the CAA Safety Sense Leaflet 14 "Piston
# Engine Icing" (from memory): (t_c, rh_pct, band just inside, band just outside).
CARB_CORNERS = (
    (20.0, 80.0, "any_power", "cruise_and_glide"),
    (30.0, 60.0, "cruise_and_glide", "glide"),
    (35.0, 50.0, "glide", "light"),
    (38.0, 30.0, "light", "unlikely"),
    (-10.0, 80.0, "any_power", "unlikely"),
)


@pytest.mark.parametrize("t, rh, inside, outside", CARB_CORNERS)
def test_carb_icing_band_corners(t, rh, inside, outside):
    assert carb_icing(t, _td(t, rh + 0.2)) == inside
    # Just past the corner in temperature (0.1 K), then in humidity (0.2 %).
    step = 0.1 if t > 0.0 else -0.05
    assert carb_icing(t + step, _td(t + step, rh + 0.2)) == outside
    if outside != "unlikely" or rh > 30.0:
        assert carb_icing(t, _td(t, rh - 0.2)) != inside


@pytest.mark.parametrize("rh, band", ((85.0, "any_power"), (65.0, "cruise_and_glide"),
                                      (55.0, "glide"), (35.0, "light")))
def test_carb_icing_bands_start_at_minus_10(rh, band):
    # Every band's cold edge is -10 degC (CAA Safety Sense Leaflet 14 chart, from
    # memory): inside at -10 and at -5 degC, outside just below -10 degC.
    assert carb_icing(-10.0, _td(-10.0, rh)) == band
    assert carb_icing(-5.0, _td(-5.0, rh)) == band
    assert carb_icing(-10.05, _td(-10.05, rh)) == "unlikely"


def test_carb_icing_report_and_caution():
    r = Column(12.0, 10.0, 1000.0, 0.0).report()     # RH 88 %: serious at any power
    assert r["carb_icing"] == "any_power"
    assert any("Carburettor icing" in c for c in r["cautions"])
    r = Column(36.0, 5.0, 1000.0, 0.0).report()      # RH 15 %
    assert r["carb_icing"] == "unlikely"
    assert not any("Carburettor" in c for c in r["cautions"])


# ---- freezing rain and ice pellets ----

def _fine_area(col, a, b, n=4000):
    # g * integral (T - T0)/T dz by a fine midpoint sum (Bourgouin's area, J/kg).
    dz = (b - a) / n
    return sum(G0 * (1.0 - 273.15 / (col.t_at(a + (i + 0.5) * dz) + 273.15)) * dz
               for i in range(n))


def test_warm_nose_over_shallow_cold_layer_is_freezing_rain():
    # Surface -3 degC, inversion +16 K/km to 500 m AGL (+5 degC), then cooling 6.5 K/km.
    col = Column(-3.0, -4.0, 1000.0, 100.0, [(500.0, -16.0), (None, 6.5)], 10000.0)
    w = warm_layer(col)
    z_bot = 100.0 + 3.0 / 16.0 * 1000.0                 # 0 degC on the way up
    z_top = 600.0 + 5.0 / 6.5 * 1000.0                  # 0 degC on the way down
    assert w["warm_layer_bottom_msl_m"] == pytest.approx(z_bot)
    assert w["warm_layer_top_msl_m"] == pytest.approx(z_top)
    assert w["warm_layer_max_t_c"] == pytest.approx(5.0)
    assert w["cold_layer_below_depth_m"] == pytest.approx(z_bot - 100.0)
    assert w["melt_area_j_kg"] == pytest.approx(_fine_area(col, z_bot, z_top), rel=1e-4)
    assert w["refreeze_area_j_kg"] == pytest.approx(-_fine_area(col, 100.0, z_bot), rel=1e-4)
    # Bourgouin (2000) (from memory): refreezing area under 46 + 0.66 * melting area.
    assert w["refreeze_area_j_kg"] < 46.0 + 0.66 * w["melt_area_j_kg"]
    assert precip_type(col) == "glaze"
    r = col.report()
    assert r["precip_type"] == "glaze"
    assert r["warm_layer_bottom_msl_m"] == pytest.approx(z_bot)
    assert any("Warm layer" in c and "freezing rain" in c for c in r["cautions"])


def test_warm_nose_over_deep_cold_layer_is_ice_pellets():
    # Surface -12 degC warming 6 K/km for 2.5 km (+3 degC), then cooling 6.5 K/km.
    col = Column(-12.0, -13.0, 1000.0, 0.0, [(2500.0, -6.0), (None, 6.5)], 10000.0)
    w = warm_layer(col)
    assert w["cold_layer_below_depth_m"] == pytest.approx(2000.0)
    assert w["refreeze_area_j_kg"] > 66.0 + 0.66 * w["melt_area_j_kg"]   # Bourgouin
    assert precip_type(col) == "pellets"


def test_no_warm_nose():
    cold = Column(-5.0, -7.0, 1000.0, 0.0, 6.5, 10000.0)
    assert warm_layer(cold) is None and precip_type(cold) == "snow"
    r = cold.report()
    assert r["warm_layer_bottom_msl_m"] is None and r["cold_layer_below_depth_m"] is None
    assert not any("Warm layer" in c for c in r["cautions"])
    # Warm ground, 0 degC 2 km up: the melting area at the ground (about 70 J/kg) is
    # past Bourgouin's 13.2 J/kg: rain.
    assert precip_type(Column(13.0, 5.0, 1000.0, 0.0, 6.5, 10000.0)) == "rain"
    # 0 degC 150 m up: little melting (under 5.6 J/kg): snow reaches the ground.
    assert precip_type(Column(1.0, 0.0, 1000.0, 0.0, 6.5, 10000.0)) == "snow"


# Bourgouin (2000) thresholds, stated from memory (as in lapsecalc/precip.py): a warm
# layer aloft with a melting area under 2 J/kg leaves snow; refreezing area over
# 66 + 0.66 x melting area gives ice pellets, under 46 + 0.66 x freezing rain; at the
# ground, melting over 13.2 J/kg gives rain, over 5.6 J/kg rain or snow.
@pytest.mark.parametrize("melt, refreeze, want", (
    (1.99, 0.0, "snow"), (1.99, 500.0, "snow"), (2.01, 0.0, "glaze"),
    (10.0, 52.5, "glaze"), (10.0, 52.7, "glaze_or_pellets"),
    (10.0, 72.5, "glaze_or_pellets"), (10.0, 72.7, "pellets"),
    (100.0, 111.9, "glaze"), (100.0, 112.1, "glaze_or_pellets"),
    (100.0, 131.9, "glaze_or_pellets"), (100.0, 132.1, "pellets")))
def test_bourgouin_aloft_thresholds(melt, refreeze, want):
    from lapsecalc.precip import _aloft_type
    assert _aloft_type(melt, refreeze) == want


@pytest.mark.parametrize("kind, melt, want", (
    ("snow", 5.5, "snow"), ("pellets", 5.5, "pellets"), ("snow", 5.7, "rain_or_snow"),
    ("pellets", 13.1, "rain_or_snow"), ("snow", 13.3, "rain"), ("pellets", 13.3, "rain")))
def test_bourgouin_ground_thresholds(kind, melt, want):
    from lapsecalc.precip import _ground_type
    assert _ground_type(kind, melt) == want


def test_warm_to_the_column_top():
    # Invented: -5 degC at the field warming 5 K/km to a 3000 m top (+10 degC): by hand
    # the warm layer runs from 1000 m to the top over 1000 m of freezing air; drops
    # form liquid up there (no snow to melt), so Bourgouin's rule sees freezing rain.
    col = Column(-5.0, -6.0, 1000.0, 0.0, -5.0, 3000.0)
    w = warm_layer(col)
    assert w["warm_layer_bottom_msl_m"] == pytest.approx(1000.0)
    assert w["warm_layer_top_msl_m"] == pytest.approx(3000.0)
    assert w["warm_layer_max_t_c"] == pytest.approx(10.0)
    assert w["cold_layer_below_depth_m"] == pytest.approx(1000.0)
    assert w["refreeze_area_j_kg"] == pytest.approx(-_fine_area(col, 0.0, 1000.0), rel=1e-4)
    assert precip_type(col) == "glaze"


def test_a_point_at_exactly_0_c_does_not_split_the_cold_layer():
    # Invented: -5 degC at the field, touching 0 degC at 1000 m, -5 degC at 2000 m, a
    # warm nose to +3 degC at 2500 m, -10 degC at 3500 m. By hand the air passes
    # 0 degC at 2000 + 5/8 * 500 m and 2500 + 3/13 * 1000 m: the cold layer beneath
    # the warm one runs from the field (the touch at 1000 m does not end it).
    pts = [(1000.0, 0.0, -1.0), (2000.0, -5.0, -6.0), (2500.0, 3.0, 2.0),
           (3500.0, -10.0, -11.0)]
    col = Column(-5.0, -6.0, 1000.0, 0.0, 6.5, 9000.0, aloft=pts)
    w = warm_layer(col)
    assert w["warm_layer_bottom_msl_m"] == pytest.approx(2312.5)
    assert w["warm_layer_top_msl_m"] == pytest.approx(2500.0 + 3000.0 / 13.0)
    assert w["cold_layer_below_depth_m"] == pytest.approx(2312.5)
    assert w["warm_layer_max_t_c"] == pytest.approx(3.0)


def test_weak_warm_nose_leaves_snow():
    # Barely above 0 degC (+0.2 degC) for a few hundred metres: melting area under
    # Bourgouin's 2 J/kg, snow.
    col = Column(-2.0, -3.0, 1000.0, 0.0, [(200.0, -11.0), (300.0, 0.0), (None, 6.5)], 9000.0)
    w = warm_layer(col)
    assert w is not None and w["melt_area_j_kg"] < 2.0
    assert precip_type(col) == "snow"


# ---- wet-bulb freezing level ----

def _wb_at(col, z):
    e = col.vapour_pressure_at(z)
    return wet_bulb(col.t_at(z), min(_dewpoint_from_e(e), col.t_at(z)), col.p_at(z))


def test_wet_bulb_zero_against_wet_bulb():
    # Dry air: the wet bulb (ASHRAE eq. 33, moisture.wet_bulb) reaches 0 degC well below
    # the air's 0 degC level.
    col = Column(8.0, -6.0, 1000.0, 200.0, 6.5, 10000.0)
    z = wet_bulb_zero(col)
    assert z < col.level(0.0) - 300.0
    assert abs(_wb_at(col, z)) < 0.02
    assert _wb_at(col, z - 50.0) > 0.0 > _wb_at(col, z + 50.0)
    assert col.report()["wet_bulb_zero_msl_m"] == z
    # At or below 0 degC wet bulb at the ground: the elevation.
    assert wet_bulb_zero(Column(1.0, -8.0, 1000.0, 300.0, 6.5, 8000.0)) == 300.0


@given(st.floats(-5.0, 30.0), st.floats(0.5, 20.0), st.floats(3.0, 9.5))
def test_wet_bulb_zero_not_above_freezing_level(t, spread, lapse):
    col = Column(t, t - spread, 1000.0, 0.0, lapse, 12000.0)
    z = wet_bulb_zero(col)
    z0 = col.level(0.0)
    assert z is not None and z <= z0 + 1.0
    if z > col.elev_m:
        assert abs(_wb_at(col, z)) < 0.05


# ---- icing band ----

def test_stable_cloud_band_starts_at_the_freezing_level():
    # 5 degC, dewpoint 4 degC, ISA: cloud base about 125 m, 0 degC at 769 m, no LFC.
    r = Column(5.0, 4.0, 1013.25, 0.0, 6.5).report()
    assert r["lfc_msl_m"] is None
    assert r["icing_band_basis"] == "air"
    assert r["icing_band_bottom_msl_m"] == pytest.approx(5.0 / 6.5e-3)
    assert r["icing_band_top_msl_m"] is None
    assert any("cloud tops unknown" in c for c in r["cautions"])


def test_stable_cloud_above_the_freezing_level_starts_at_the_base():
    # Dry air below freezing: the cloud base is above the 0 degC level.
    r = Column(2.0, -10.0, 1000.0, 0.0, 6.5).report()
    assert r["icing_band_bottom_msl_m"] == pytest.approx(r["cloud_base_msl_m"])
    assert r["cloud_base_msl_m"] > r["freezing_level_msl_m"]


def test_convective_band_runs_from_the_lower_zero_to_the_higher_minus20():
    # A tropical-style day: the parcel is warmer than the air in cloud, so its 0 degC
    # level is higher; the band starts at the air's.
    col = Column(32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0)
    r = col.report()
    assert r["icing_band_basis"] == "parcel"
    assert r["parcel_freezing_level_msl_m"] > r["freezing_level_msl_m"]
    assert r["icing_band_bottom_msl_m"] == pytest.approx(r["freezing_level_msl_m"])
    from lapsecalc import parcel
    levels = parcel.path(col, r["cloud_base_msl_m"])
    z20p = parcel.level(col, levels, -20.0, r["cloud_base_msl_m"])
    assert z20p > r["minus20_level_msl_m"]
    cloud_top = r["el_msl_m"] or r["top_msl_m"]        # EL, or above the column top
    assert r["icing_band_top_msl_m"] == pytest.approx(min(z20p, cloud_top))


def test_no_band_without_cloud_base_or_freezing():
    # Column entirely above 0 degC (top below the freezing level).
    r = Column(30.0, 20.0, 1000.0, 0.0, 6.5, 3000.0).report()
    assert r["icing_band_bottom_msl_m"] is None and r["icing_band_basis"] is None
    # Cloud base above the -20 degC level: colder than the band.
    r = Column(-18.0, -40.0, 1000.0, 0.0, 6.5, 10000.0).report()
    assert r["cloud_base_msl_m"] > r["minus20_level_msl_m"]
    assert r["icing_band_bottom_msl_m"] is None


@given(st.floats(-15.0, 40.0), st.floats(0.0, 25.0), st.floats(-5.0, 10.0),
       st.floats(2.0, 9.7), st.floats(200.0, 3000.0))
def test_icing_band_never_empty_when_cloud_can_reach_the_band(t, spread, inv, lapse, h):
    # Issue requirement: the cloud base below the -20 degC level and the column reaching
    # 0 degC: a band, starting at or above the cloud base, below its known top.
    col = Column(t, t - spread, 1000.0, 0.0, [(h, inv), (None, lapse)], 14000.0)
    r = col.report()
    base, z0, z20 = r["cloud_base_msl_m"], r["freezing_level_msl_m"], r["minus20_level_msl_m"]
    assume(base is not None and z0 is not None and (z20 is None or base < z20))
    b, top = r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"]
    assert b is not None and b >= base - 1e-6
    assert (top is None) == (r["icing_band_basis"] == "air")
    assert top is None or b < top
    assert z20 is None or b < z20


# ---- icing band from dewpoints aloft (cloud layers) ----

def _interp(nodes, z):
    # Linear interpolation in height over [(z, value), ...] (z increasing), by hand.
    for (z0, v0), (z1, v1) in zip(nodes, nodes[1:]):
        if z0 <= z <= z1:
            return v0 + (v1 - v0) * (z - z0) / (z1 - z0)
    raise AssertionError(z)


def _icing_cloud_heights(sfc, points, dz=2.0):
    # Heights, up to the highest dewpoint given, where the spread is at most 3 K (cloud
    # likely, common practice) and the air is at 0 to -20 degC (icing, common
    # practice); temperature and dewpoint linear in height between the points (the
    # Column's definition of points aloft), computed here by hand.
    elev, t, td = sfc
    ts = [(elev, t)] + [(z, tz) for z, tz, _ in points]
    ds = [(elev, td)] + [(z, d) for z, _, d in points if d is not None]
    out = []
    for i in range(int((ds[-1][0] - elev) / dz) + 1):
        z = elev + i * dz
        tz = _interp(ts, z)
        if -20.0 <= tz <= 0.0 and tz - min(_interp(ds, z), tz) <= 3.0:
            out.append(z)
    return out


# An invented morning: a moist layer 1500-2500 m over a moist field, dry above.
MOIST_POINTS = [(1500.0, 2.0, 1.0), (2500.0, -5.0, -6.5), (4000.0, -15.0, -30.0),
                (6000.0, -30.0, -45.0)]


def test_band_from_cloud_layers():
    col = Column(8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0, aloft=MOIST_POINTS)
    r = col.report()
    # By hand (linear between points): 0 degC at 1500 + 2/7 km; spread 3 K between
    # 2500 m (1.5 K) and 4000 m (15 K) at 2500 + 1.5/13.5 * 1500 m; -20 degC at
    # 4000 + 5/15 * 2000 m, below the highest dewpoint (6000 m): the top is known.
    z0, z_dry = 1500.0 + 2.0 / 7.0 * 1000.0, 2500.0 + 1.5 / 13.5 * 1500.0
    assert r["icing_band_basis"] == "layers" and r["lfc_msl_m"] is None
    assert r["icing_band_bottom_msl_m"] == pytest.approx(z0, abs=1e-6)
    assert r["icing_band_top_msl_m"] == pytest.approx(z_dry, abs=1e-6)
    assert r["icing_layers_msl_m"] == [pytest.approx([z0, z_dry], abs=1e-6)]
    # The same by sampling every 2 m.
    zs = _icing_cloud_heights((100.0, 8.0, 6.0), MOIST_POINTS)
    assert abs(zs[0] - z0) < 2.0 and abs(zs[-1] - z_dry) < 2.0
    assert any("Icing likely in cloud from 1786 m (5859 ft) MSL to 2667 m" in c
               for c in r["cautions"])
    # Without the dewpoints aloft the old rule holds: from the air's 0 degC level, top
    # unknown (basis air).
    plain = Column(8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0,
                   aloft=[(z, t, None) for z, t, _ in MOIST_POINTS]).report()
    assert plain["icing_band_basis"] == "air" and plain["icing_band_top_msl_m"] is None
    assert plain["icing_layers_msl_m"] is None


def test_band_top_unknown_above_the_highest_dewpoint():
    # Dewpoints only to 4000 m, below the -20 degC level: cloud can exist above, so
    # the band runs on with its top unknown; the layers below are still listed.
    pts = MOIST_POINTS[:3]
    r = Column(8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0, aloft=pts).report()
    assert r["icing_band_basis"] == "layers" and r["icing_band_top_msl_m"] is None
    assert r["icing_band_bottom_msl_m"] == pytest.approx(1500.0 + 2.0 / 7.0 * 1000.0)
    assert len(r["icing_layers_msl_m"]) == 1
    assert any("up (no dewpoints given above)" in c for c in r["cautions"])
    # Dry everywhere given, and dewpoints above the -20 degC level: no icing cloud.
    dry = [(1500.0, 2.0, -10.0), (6000.0, -30.0, -45.0)]
    r = Column(8.0, -2.0, 1000.0, 100.0, 6.5, 12000.0, aloft=dry).report()
    assert r["cloud_layers_msl_m"] == [] and r["lfc_msl_m"] is None
    assert r["icing_band_bottom_msl_m"] is None and r["icing_band_basis"] is None
    assert r["icing_layers_msl_m"] is None
    # Dry up to 3000 m, nothing given above while the air reaches 0..-20 degC there:
    # the band starts at the highest dewpoint, top unknown.
    r = Column(8.0, -2.0, 1000.0, 100.0, 6.5, 12000.0, aloft=[(3000.0, -5.0, -20.0)]).report()
    assert r["icing_band_bottom_msl_m"] == pytest.approx(3000.0)
    assert r["icing_band_top_msl_m"] is None and r["icing_band_basis"] == "layers"


def test_a_thin_cloud_layer_into_the_icing_range_counts():
    # Invented: the air 8 degC at 100 m, 5 K/km to -1.5 degC at 2000 m (0 degC at
    # 1700 m by hand); the spread (linear between the points) falls to 3 K at 1690 m
    # and rises past it at 1700.5 m: a cloud layer reaching 0.5 m into the icing range.
    # Conservative: that half metre is a band (the top unknown: no dewpoint above 2000 m).
    pts = [(1695.0, 0.025, 0.025 - 2.978), (2000.0, -1.5, -5.698)]
    r = Column(8.0, -2.0, 1000.0, 100.0, 6.5, 16000.0, aloft=pts).report()
    (a, b), = r["cloud_layers_msl_m"]
    assert a == pytest.approx(1690.0, abs=0.01) and b == pytest.approx(1700.5, abs=0.01)
    assert r["icing_layers_msl_m"] == [pytest.approx([1700.0, 1700.5], abs=0.01)]
    assert r["icing_band_bottom_msl_m"] == pytest.approx(1700.0, abs=0.01)
    assert r["icing_band_top_msl_m"] is None and r["icing_band_basis"] == "layers"


def test_icing_band_function_matches_the_report():
    # icing.icing_band (the public function) gives the report's band.
    from lapsecalc import icing, parcel
    for args in ((5.0, 4.0, 1013.25, 0.0, 6.5, 16000.0),
                 (32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0),
                 (2.0, -10.0, 1000.0, 0.0, 6.5, 16000.0)):
        col = Column(*args)
        r = col.report()
        lcl = r["cloud_base_msl_m"]
        top = None if r["lfc_msl_m"] is None else (col.top_m if r["el_above_top"] else
                                                    r["el_msl_m"])
        band = icing.icing_band(col, parcel.path(col, lcl), lcl, top,
                                r["parcel_freezing_level_msl_m"])
        assert band == (r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"],
                        r["icing_band_basis"])


def test_two_icing_layers_and_the_public_functions_match_the_report():
    # Invented: MOIST_POINTS' cloud, dry at 3000 m, cloud again 3500-4500 m, dry above.
    pts = [(1500.0, 2.0, 1.0), (2500.0, -5.0, -6.5), (3000.0, -8.0, -20.0),
           (3500.0, -11.0, -12.0), (4500.0, -17.0, -18.0), (5000.0, -20.0, -35.0),
           (7000.0, -35.0, -50.0)]
    from lapsecalc import icing
    col = Column(8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0, aloft=pts)
    r = col.report()
    # By hand (linear between points): 0 degC at 1500 + 2/7 km; the spread 3 K at
    # 2500 + 1.5/10.5 * 500 m, at 3000 + 9/11 * 500 m and at 4500 + 2/14 * 500 m; -20
    # degC at 5000 m, above the second layer: the band's top is that layer's.
    want = [[1500.0 + 2.0 / 7.0 * 1000.0, 2500.0 + 1.5 / 10.5 * 500.0],
            [3000.0 + 9.0 / 11.0 * 500.0, 4500.0 + 2.0 / 14.0 * 500.0]]
    assert r["icing_layers_msl_m"] == [pytest.approx(w, abs=1e-6) for w in want]
    assert (r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"]) == pytest.approx(
        (want[0][0], want[1][1]), abs=1e-6)
    # The public functions (crossings found by themselves) give the same.
    assert icing.icing_layers(col) == r["icing_layers_msl_m"]
    assert icing.icing_band(col, None, r["cloud_base_msl_m"], None,
                            r["parcel_freezing_level_msl_m"]) == (
        r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"], "layers")
    # A field just above 0 degC under a cloud base lower than the 0 degC level: the
    # band starts at the air's 0 degC level, 0.8 / 6.5 km up (by hand), not at the field.
    col = Column(0.8, 0.75, 1000.0, 0.0, 6.5, 9000.0)
    r = col.report()
    band = icing.icing_band(col, None, r["cloud_base_msl_m"], None,
                            r["parcel_freezing_level_msl_m"])
    assert band == (pytest.approx(800.0 / 6.5, abs=1e-6), None, "air")
    assert band == (r["icing_band_bottom_msl_m"], None, r["icing_band_basis"])


def test_a_point_at_exactly_0_c_does_not_split_an_icing_layer():
    # Invented: -5 degC at the field, a point at exactly 0 degC at 1500 m, colder above;
    # the air touches 0 degC there and turns back: one cloud layer (spread 1 K up to
    # 3000 m, 20 K at 5000 m: 3 K at 3000 + 2000 * 2/19 m by hand), one icing layer.
    pts = [(1500.0, 0.0, -1.0), (3000.0, -10.0, -11.0), (5000.0, -30.0, -50.0)]
    r = Column(-5.0, -6.0, 1000.0, 0.0, 6.5, 9000.0, aloft=pts).report()
    assert r["freezing_levels_msl_m"] == [1500.0]
    top = 3000.0 + 2000.0 * 2.0 / 19.0
    assert r["cloud_layers_msl_m"] == [pytest.approx([0.0, top])]
    assert r["icing_layers_msl_m"] == [pytest.approx([0.0, top])]
    assert (r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"]) == pytest.approx((0.0, top))


@pytest.mark.parametrize("t, want", ((0.0, (1000.0, None)), (-20.0, (0.0, 2000.0)),
                                     (0.005, (2001.0, None))))
def test_isothermal_cloud_at_the_band_edges(t, want):
    # Invented: a cloud layer isothermal at t from 1000 to 2000 m, 5 K/km colder above
    # to 3000 m (dewpoints to there), 3 K/km warmer below. 0 and -20 degC belong to the
    # band (0 to -20 degC, common practice); +0.005 degC does not: by hand the band
    # starts at 1000 m (0 degC), at the field (-17 degC there; ends at 2000 m where the
    # air passes -20 degC) or at 2001 m (where the air passes 0 degC).
    pts = [(1000.0, t, t - 1.0), (2000.0, t, t - 1.0), (3000.0, t - 5.0, t - 25.0)]
    r = Column(t + 3.0, t + 2.0, 1000.0, 0.0, 6.5, 9000.0, aloft=pts).report()
    got = (r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"])
    assert got[0] == pytest.approx(want[0], abs=0.01)
    assert (got[1] is None) == (want[1] is None)
    if want[1] is not None:
        assert got[1] == pytest.approx(want[1], abs=0.01)


def test_band_from_layers_and_cumulus_reaches_the_higher_top():
    # A moist layer near 5-6 km (icing layer) under the cumulus of a hot moist field:
    # the band runs to the convective band's top (about 8.8 km), above the layer's.
    pts = [(3000.0, 9.5, 0.0), (5500.0, -8.0, -9.0), (12000.0, -60.0, -75.0)]
    r = Column(32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0, aloft=pts).report()
    bare = Column(32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0,
                  aloft=[(z, t, None) for z, t, _ in pts]).report()
    (a, b), = r["icing_layers_msl_m"]
    assert bare["icing_band_basis"] == "parcel" and b < bare["icing_band_top_msl_m"]
    assert r["icing_band_basis"] == "layers"
    assert r["icing_band_top_msl_m"] == pytest.approx(bare["icing_band_top_msl_m"])
    assert r["icing_band_bottom_msl_m"] == pytest.approx(min(a, bare["icing_band_bottom_msl_m"]))


def test_band_from_layers_keeps_the_convective_cloud():
    # A hot moist field with dewpoints aloft: the cumulus (an LFC) widens the band
    # (conservative): it reaches at least the convective band's top.
    col = Column(32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0,
                 aloft=[(3000.0, 9.5, 0.0), (12000.0, -60.0, -75.0)])
    r = col.report()
    assert r["lfc_msl_m"] is not None and r["icing_band_basis"] == "layers"
    bare = Column(32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0,
                  aloft=[(3000.0, 9.5, None), (12000.0, -60.0, None)]).report()
    assert bare["icing_band_basis"] == "parcel"
    assert r["icing_band_bottom_msl_m"] <= bare["icing_band_bottom_msl_m"] + 1e-6
    assert r["icing_band_top_msl_m"] >= bare["icing_band_top_msl_m"] - 1e-6


@given(st.floats(-10.0, 30.0), st.floats(0.0, 15.0),
       st.lists(st.tuples(st.floats(300.0, 9000.0), st.floats(2.0, 9.0),
                          st.floats(0.0, 12.0)), min_size=1, max_size=4))
def test_band_never_empty_when_a_cloud_layer_is_at_0_to_minus20(t, spread, steps):
    # Points aloft cooling 2-9 K/km, each with a spread of 0-12 K: wherever the spread
    # is at most 3 K and the air at 0 to -20 degC (sampled by hand every 2 m), the band
    # exists and covers that height.
    pts, z, tz = [], 0.0, t
    for dz, rate, sp in steps:
        z, tz = z + dz, tz - rate * dz / 1000.0
        if tz - sp < -89.0 or z > 15000.0:
            break
        pts.append((z, tz, tz - sp))
    assume(pts)
    r = Column(t, t - spread, 1000.0, 0.0, 6.5, 16000.0, aloft=pts).report()
    zs = _icing_cloud_heights((0.0, t, t - spread), pts)
    assert r["icing_band_basis"] in (None, "layers")
    if zs:
        b, top = r["icing_band_bottom_msl_m"], r["icing_band_top_msl_m"]
        assert b is not None and b <= zs[0] + 1e-6
        assert top is None or top >= zs[-1] - 1e-6
        for a, c in r["icing_layers_msl_m"]:
            assert b - 1e-6 <= a < c and (top is None or c <= top + 1e-6)


def test_ice_word_shows_the_cloud_layer_basis():
    from lapsecalc.shell import Session
    s = Session()
    for line in ("unit m C hPa", "elev 100m", "temp 8C dew 6C", "stn 1000hPa",
                 "aloft 1500m 2C/1C 2500m -5C/-6.5C 4000m -15C/-30C 6000m -30C/-45C"):
        s.feed(line)
    got = s.feed("ice")
    assert "icing basis   cloud layers" in got
    assert "icing layer  1786 m-2667 m MSL" in got or \
        any(line.startswith("icing layer  1786") for line in got)
    assert any(line.startswith("icing to") and "2667" in line for line in got)
    s.feed("clear aloft")
    s.feed("aloft 1500m 2C/1C 2500m -5C/-6.5C 4000m -15C/-30C")
    got = s.feed("ice")
    assert any(line.startswith("icing to") and "unknown" in line for line in got)
    h = " ".join(s.feed("help ice"))
    assert "dewpoints aloft" in h and "cloud" in h and "layers" in h


# ---- wet-bulb zero with humidity aloft ----

def test_wet_bulb_zero_uses_the_dewpoints_aloft():
    # A dry field under a moist layer: with the dewpoints aloft the wet bulb stays
    # near the air temperature up there, so it reaches 0 degC close to the air's
    # 0 degC level, far above where the surface humidity would put it.
    pts = [(1000.0, 4.0, 3.0), (2000.0, -2.0, -3.0), (5000.0, -20.0, -25.0)]
    col = Column(10.0, -5.0, 1000.0, 0.0, 6.5, 10000.0, aloft=pts)
    dry = Column(10.0, -5.0, 1000.0, 0.0, 6.5, 10000.0,
                 aloft=[(z, t, None) for z, t, _ in pts])
    z = wet_bulb_zero(col)
    assert z > wet_bulb_zero(dry) + 300.0
    assert z < col.level(0.0) == pytest.approx(1000.0 + 4.0 / 6.0 * 1000.0)

    def wb(zz):
        # The wet bulb (ASHRAE Fundamentals ch. 1 eq. 33, moisture.wet_bulb) of the air
        # at zz, its dewpoint linear in height between the points (by hand).
        td = _interp([(0.0, -5.0)] + [(a, d) for a, _, d in pts], zz)
        return wet_bulb(col.t_at(zz), min(td, col.t_at(zz)), col.p_at(zz))

    assert abs(wb(z)) < 0.02
    assert wb(z - 20.0) > 0.0 > wb(z + 20.0)
    assert col.report()["wet_bulb_zero_msl_m"] == z
    # Saturated at the air's 0 degC level: the wet bulb is 0 there; below it the dry
    # field still gives a wet bulb under 0 degC at the ground.
    sat = Column(3.0, -12.0, 1000.0, 0.0, 6.5, 9000.0, aloft=[(1000.0, -3.0, -3.0)])
    assert wet_bulb_zero(sat) == 0.0 and wb.__name__ == "wb"


# ---- thermals ----

@given(st.floats(-10.0, 40.0), st.floats(0.0, 20.0), st.floats(0.0, 10.0),
       st.floats(-200.0, 1000.0))
def test_thermal_cloud_base_is_the_heated_parcels_lcl(t, spread, excess, elev):
    # Issue requirement: cloud_base(t + excess, td, p) above the field.
    col = Column(t, t - spread, 950.0, elev, 7.0, 16000.0)
    r = col.report(excess)
    want = elev + cloud_base(min(t + excess, 60.0), t - spread, 950.0)[0]
    assert r["thermal_cloud_base_msl_m"] == pytest.approx(want, abs=1e-6)
    if excess == 0.0:
        assert r["thermal_cloud_base_msl_m"] == pytest.approx(r["cloud_base_msl_m"])


def test_thermal_cloud_base_with_a_tiny_excess():
    # 0.01 K is an excess too: the heated base (cloud_base(t + 0.01, td, p)) is about
    # 1.2 m above the unheated one (Romps: about 122 m per K of spread).
    r = Column(20.0, 10.0, 1000.0, 0.0, 7.0).report(0.01)
    want = cloud_base(20.01, 10.0, 1000.0)[0]
    assert r["thermal_cloud_base_msl_m"] == pytest.approx(want, abs=1e-9)
    assert 1.0 < want - r["cloud_base_agl_m"] < 1.5


def test_usable_thermal_top_is_the_lower_of_dry_top_and_cloud_base():
    # Superadiabatic 12 K/km to 300 m, then 6 K/km: dry thermals rise about 470 m.
    dry = Column(30.0, 5.0, 1000.0, 0.0, [(300.0, 12.0), (None, 6.0)], 10000.0).report(1.0)
    assert dry["thermal_kind"] == "blue"
    assert dry["thermal_usable_top_msl_m"] == dry["thermal_top_msl_m"]
    assert dry["thermal_top_msl_m"] < dry["thermal_cloud_base_msl_m"]
    wet = Column(25.0, 23.0, 1000.0, 0.0, [(300.0, 12.0), (None, 6.0)], 10000.0).report(1.0)
    assert wet["thermal_kind"] == "cumulus"
    assert wet["thermal_usable_top_msl_m"] == wet["thermal_cloud_base_msl_m"]
    assert wet["thermal_top_msl_m"] > wet["thermal_cloud_base_msl_m"]


def test_no_dry_thermals_until_the_trigger_temperature():
    # Moist and conditionally unstable, but stable for dry thermals at the surface:
    # large CAPE and no dry thermals until the convective (trigger) temperature.
    r = Column(30.0, 24.0, 1000.0, 0.0, 6.5).report()
    assert r["cape_j_kg"] > 1000.0
    assert r["thermal_kind"] == "none"
    assert r["dry_thermals_from_t_c"] == r["trigger_t_c"] and r["trigger_t_c"] > 30.0
    assert r["thermal_usable_top_msl_m"] is None


def test_capped_deck_under_a_low_inversion():
    # A moist mixed layer (about the dry rate) to 600 m AGL under a 300 m inversion:
    # the cloud fills the layer from its base to the inversion, a capped deck.
    col = Column(10.0, 9.0, 1000.0, 0.0, [(600.0, 9.77), (900.0, -5.0), (None, 6.5)])
    r = col.report(1.0)
    assert r["thermal_kind"] == "capped"
    assert r["capped_cloud_top_msl_m"] == pytest.approx(600.0)
    assert r["thermal_cloud_base_msl_m"] < 600.0
    # The same without the inversion: cumulus, no cap.
    r = Column(10.0, 9.0, 1000.0, 0.0, [(600.0, 9.77), (900.0, 6.0), (None, 6.5)]).report(1.0)
    assert r["thermal_kind"] == "cumulus" and r["capped_cloud_top_msl_m"] is None


# Invented columns for the capped-deck rule (thermals.capped_top): the heated cloud base
# (cloud_base(t + excess, td, p), Romps) in the ELR layer under an inversion or
# isothermal layer, or in that layer itself; the unheated parcel not rising through it.
def _kind(t, td, layers, top, excess):
    r = Column(t, td, 1000.0, 0.0, layers, top).report(excess)
    return r["thermal_kind"], r["capped_cloud_top_msl_m"], r


def test_capped_deck_variants():
    # Base (about 834 m) inside an isothermal layer 300-1500 m: the deck is capped at its
    # own base (no room above it under the inversion).
    kind, cap, r = _kind(20.0, 19.5, [(300.0, 9.77), (1500.0, 0.0), (None, 4.0)], 8000.0, 6.0)
    want = cloud_base(26.0, 19.5, 1000.0)[0]
    assert 300.0 < want < 1500.0 and kind == "capped" and cap == pytest.approx(want)
    assert r["el_msl_m"] < 1500.0
    # Base in the mixed layer right under an isothermal layer: capped at its base.
    kind, cap, _ = _kind(10.0, 9.0, [(600.0, 9.77), (3000.0, 0.0), (None, 6.5)], 16000.0, 1.0)
    assert kind == "capped" and cap == pytest.approx(600.0)
    # The inversion is the column's last layer: still a cap.
    kind, cap, _ = _kind(10.0, 9.0, [(600.0, 9.77), (None, -5.0)], 3000.0, 1.0)
    assert kind == "capped" and cap == pytest.approx(600.0)
    # Base in the second layer, the parcel buoyant (an LFC) but its EL inside the
    # inversion above (1500-2000 m): capped at 1500 m.
    kind, cap, r = _kind(22.0, 19.0, [(200.0, 8.0), (1500.0, 9.77), (2000.0, -20.0), (None, 6.5)],
                         8000.0, 1.0)
    assert r["lfc_msl_m"] is not None and 1500.0 < r["el_msl_m"] < 2000.0
    assert kind == "capped" and cap == pytest.approx(1500.0)
    # A cooling layer above the base (no inversion): cumulus, even where the parcel's EL
    # is low; a single steep layer: cumulus.
    kind, cap, r = _kind(15.0, 14.0, [(300.0, 12.0), (None, 4.0)], 8000.0, 1.0)
    assert r["thermal_cloud_base_msl_m"] < 300.0
    assert kind == "cumulus" and cap is None and r["el_msl_m"] < 8000.0
    kind, cap, _ = _kind(25.0, 20.0, 10.0, 8000.0, 1.0)
    assert kind == "cumulus" and cap is None


def test_dry_neutral_mixed_layer_is_stirred_to_its_top():
    # The lowest layer within 0.1 K/km of the dry rate (9.7676 K/km, g/cp; the neutral
    # band of stability.classify): a mixed layer even with no excess, so the deck under
    # the inversion above it is capped there. At 9.6 K/km (0.17 K/km under the dry
    # rate: stable for dry thermals) no thermal rises and it says from which surface
    # temperature they would.
    for elev, p in ((0.0, 1000.0), (300.0, 965.0)):
        r = Column(10.0, 9.0, p, elev, [(600.0, 9.7), (900.0, -5.0), (None, 6.5)]).report(0.0)
        assert r["thermal_top_msl_m"] == elev
        assert r["thermal_kind"] == "capped" and r["capped_cloud_top_msl_m"] == elev + 600.0
        assert r["thermal_usable_top_msl_m"] == r["thermal_cloud_base_msl_m"]
        assert r["dry_thermals_from_t_c"] is None
    r = Column(10.0, 9.0, 1000.0, 0.0, [(600.0, 9.6), (900.0, -5.0), (None, 6.5)]).report(0.0)
    assert r["thermal_kind"] == "none" and r["capped_cloud_top_msl_m"] is None
    assert r["thermal_usable_top_msl_m"] is None
    assert r["dry_thermals_from_t_c"] == r["trigger_t_c"] > 10.0


def test_thermal_cloud_base_caps_the_heated_surface_at_60_c():
    # 57 degC plus 5 K: the heated parcel is taken at 60 degC, the warmest the library
    # handles (its input range), never refused.
    col = Column(57.0, 20.0, 1000.0, 0.0, 9.0, 12000.0)
    r = col.report(5.0)
    want = cloud_base(60.0, 20.0, 1000.0)[0]
    assert r["thermal_cloud_base_msl_m"] == pytest.approx(want)
    # The same where thermals computes the heated base itself (a report given to it
    # without one: Column.report() puts it in, a caller of hazards may not).
    from lapsecalc import thermals
    r["thermal_cloud_base_msl_m"] = None
    thermals.add_keys(col, None, r)
    assert r["thermal_cloud_base_msl_m"] == pytest.approx(want, abs=1e-9)


def test_a_thermal_top_a_metre_above_the_field_is_a_thermal():
    # thermals.add_keys: a dry-thermal top under 1 m above the field is no thermal
    # (none: it says from which temperature they would rise), from 1 m up it is one
    # (blue here: the cloud base is far above). The report of a superadiabatic column
    # with its thermal top set by hand, the lowest layer not dry-neutral.
    from lapsecalc import thermals
    col = Column(30.0, 5.0, 1000.0, 0.0, [(300.0, 12.0), (None, 6.0)], 10000.0)
    full = col.report(1.0)
    assert full["stability_layers"][0]["class"] != "dry_neutral"
    for up, kind in ((1.005, "blue"), (1.0, "blue"), (0.995, "none")):
        r = dict(full, thermal_top_msl_m=up)
        thermals.add_keys(col, None, r)
        assert r["thermal_kind"] == kind, up
        assert r["thermal_usable_top_msl_m"] == (up if kind == "blue" else None), up
        assert r["dry_thermals_from_t_c"] == (None if kind == "blue" else full["trigger_t_c"])


def test_a_mixed_layer_under_the_cloud_base_lifts_no_thermal_to_it():
    # A dry-neutral layer (9.7 K/km) to 300 m under an inversion to 1500 m, spread
    # 6.5 K: the heated base (Romps: about 813 m) lies in the inversion, above the mixed
    # layer's top, so nothing is stirred up to it: no thermals, no deck.
    r = Column(10.0, 3.5, 1000.0, 0.0, [(300.0, 9.7), (1500.0, -2.0), (None, 6.5)]).report(0.0)
    assert r["thermal_top_msl_m"] == 0.0
    assert r["stability_layers"][0]["class"] == "dry_neutral"
    assert 300.0 < r["thermal_cloud_base_msl_m"] < 1500.0
    assert r["thermal_cloud_base_msl_m"] == pytest.approx(cloud_base(10.0, 3.5, 1000.0)[0])
    assert r["thermal_kind"] == "none" and r["capped_cloud_top_msl_m"] is None
    assert r["thermal_usable_top_msl_m"] is None
    assert r["dry_thermals_from_t_c"] == r["trigger_t_c"] > 10.0


def test_hazard_keys_are_made_with_the_report():
    # report() makes its dict with room for the hazard keys at the start (a board's
    # heap): every key the hazard modules set is in hazards.report_keys(), once, right
    # after the core's (column.report_keys()), in the order they are set.
    from lapsecalc.column import report_keys
    keys, more = report_keys(), hazards.report_keys()
    assert len(set(more)) == len(more) and not set(keys) & set(more)
    for args in ((-3.0, -4.0, 1000.0, 100.0, [(500.0, -16.0), (None, 6.5)], 10000.0),
                 (8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0, MOIST_POINTS)):
        r = Column(*args).report(1.0, altimetry=False)
        assert list(r) == keys + more
        bare = dict.fromkeys(keys)
        col = Column(*args)
        full = col.report(1.0, altimetry=False)
        for k in keys:
            bare[k] = full[k]
        # The general cautions alone, as Column.report() puts them before the hazards'.
        bare["cautions"] = stability.CAUTIONS
        from lapsecalc import parcel
        hazards.add_to_report(col, parcel.path(col, full["cloud_base_msl_m"]), bare)
        assert list(bare) == keys + more and bare == full


def test_hazard_cautions_need_the_general_ones_first():
    # hazards.add_to_report puts its sentences before the general cautions that
    # Column.report() put in r["cautions"]: without them, a clear refusal.
    from lapsecalc.column import report_keys
    col = Column(-3.0, -4.0, 1000.0, 100.0, [(500.0, -16.0), (None, 6.5)], 10000.0)
    full = col.report(1.0, altimetry=False)
    r = dict.fromkeys(report_keys() + hazards.report_keys())
    for k in report_keys():
        if k != "cautions":
            r[k] = full[k]
    from lapsecalc import parcel
    levels = parcel.path(col, full["cloud_base_msl_m"])
    with pytest.raises(ValueError, match="general ones"):
        hazards.add_to_report(col, levels, r)


def test_cautions_keep_the_general_ones_last():
    r = Column(-3.0, -4.0, 1000.0, 100.0, [(500.0, -16.0), (None, 6.5)], 10000.0).report()
    assert list(r["cautions"][-len(stability.CAUTIONS):]) == list(stability.CAUTIONS)
    text = " ".join(r["cautions"]).lower()
    assert "not an official forecast" in text and "flight manual" in text
    for c in r["cautions"]:
        assert math.isfinite(len(c)) and "None" not in c
