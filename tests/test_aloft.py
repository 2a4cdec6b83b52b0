"""Temperatures aloft, the tropopause, humidity aloft, cloud layers, warnings, the two
lapse-rate measures and Bolton's moist cloud base."""
import math
import random

import pytest
from hypothesis import assume, given, settings, strategies as st

from lapsecalc import Column, cloud_base, isa, mixing_ratio, air_density, moist_lapse_rate
from lapsecalc.aloft import CLOUD_SPREAD_K
from lapsecalc.constants import DRY_LAPSE_K_PER_KM

G0, RD = 9.80665, 287.05287  # ICAO Doc 7488/3
EPS = RD / 461.5             # Wallace & Hobbs (REFERENCES.md)


def _isa_p(h):
    # ICAO Doc 7488/3 layer equations, written out here: 6.5 K/km to 11 km, then
    # isothermal (the test's own formula, not the library's).
    if h <= 11000.0:
        return 1013.25 * (1.0 - 0.0065 * h / 288.15) ** (G0 / (RD * 0.0065))
    p11 = 1013.25 * (216.65 / 288.15) ** (G0 / (RD * 0.0065))
    return p11 * math.exp(-G0 * (h - 11000.0) / (RD * 216.65))


# ---- outside sources: ICAO standard atmosphere (ICAO Doc 7488/3) --------------------

def test_icao_points_reproduce_the_table():
    # Points at the ICAO temperatures at 1, 2, 5, 8 and 11 km over a 15 degC, 1013.25 hPa
    # sea-level surface; the assumed ELR (3 K/km here) must not matter below 11 km.
    pts = [(h, 15.0 - 6.5 * h / 1000.0, None) for h in (1000.0, 2000.0, 5000.0, 8000.0,
                                                        11000.0)]
    col = Column(15.0, 5.0, 1013.25, 0.0, 3.0, top_m=20000.0, aloft=pts)
    # ICAO Doc 7488/3 table (REFERENCES.md): 898.75, 794.95, 540.20, 226.32 hPa.
    for h, p in ((1000.0, 898.75), (2000.0, 794.95), (5000.0, 540.20), (11000.0, 226.32)):
        assert abs(col.p_at(h) / p - 1.0) < 1e-4, h
    # 8 km is not in the printed excerpt: the layer equation (computed).
    assert abs(col.p_at(8000.0) / _isa_p(8000.0) - 1.0) < 1e-4
    # With the default tropopause (11000 m) the column goes on isothermal:
    # 15000 m 120.445 hPa, 20000 m 54.749 hPa (ICAO Doc 7488/3, REFERENCES.md).
    assert abs(col.p_at(15000.0) / 120.445 - 1.0) < 1e-4
    assert abs(col.p_at(20000.0) / 54.749 - 1.0) < 1e-4
    assert abs(col.t_at(20000.0) + 56.5) < 1e-9
    assert col.report()["tropopause_msl_m"] == 11000.0


def test_default_column_has_the_icao_tropopause():
    # No points: 6.5 K/km then isothermal from 11 km: the ISA to 20 km (ICAO Doc 7488/3:
    # 20000 m -56.50 degC, 54.75 hPa; REFERENCES.md).
    col = Column(15.0, 5.0, 1013.25, 0.0, top_m=20000.0)
    assert abs(col.p_at(20000.0) - 54.75) < 0.01
    assert abs(col.t_at(20000.0) + 56.5) < 1e-9 and abs(col.t_at(11000.0) + 56.5) < 1e-9
    r = col.report()
    assert r["tropopause_msl_m"] == 11000.0 and r["top_msl_m"] == 20000.0
    assert r["warnings"] == []


def test_isa_pressure_points_land_at_the_table_heights():
    # ISA 700 hPa 3012.2 m, 500 hPa 5574.4 m, 300 hPa 9164.0 m (computed from the
    # Doc 7488/3 layer equations, REFERENCES.md "Pressure levels").
    pts = [(p, isa(z)[0], None, "hPa") for p, z in ((700.0, 3012.2), (500.0, 5574.4),
                                                    (300.0, 9164.0))]
    col = Column(15.0, 5.0, 1013.25, 0.0, 6.5, aloft=pts)
    for (p, _, _, _), z_ref, z in zip(pts, (3012.2, 5574.4, 9164.0), col.aloft_m):
        assert abs(z - z_ref) < 0.15
        assert abs(col.p_at(z) - p) < 0.01      # lands where its own pressure is p


def test_pressure_point_in_a_non_standard_column():
    # A cold, inverted column: a pressure point lands where the column's own pressure
    # is it, to 0.01 hPa, checked against a fine-step hydrostatic integration (ideal gas,
    # dp/dz = -g p / (R T), T from t_at).
    pts = [(300.0, -8.0, -12.0), (900.0, -2.0, None), (850.0, -6.0, -9.0, "hPa"),
           (2500.0, -14.0, None), (600.0, -30.0, -40.0, "hPa")]
    col = Column(-15.0, -17.0, 1025.0, 120.0, 6.0, aloft=pts)
    z, p = col.elev_m, col.p_hpa
    for target in (850.0, 600.0):
        while p > target:
            h = 0.05
            tm = col.t_at(z + 0.5 * h) + 273.15
            p_next = p * math.exp(-G0 * h / (RD * tm))
            if p_next <= target:
                z += h * math.log(p / target) / math.log(p / p_next)
                p = target
                break
            z, p = z + h, p_next
        assert any(abs(zp - z) < 0.2 for zp in col.aloft_m), target
        zp = min(col.aloft_m, key=lambda x: abs(x - z))
        assert abs(col.p_at(zp) - target) < 0.01


# ---- the profile ---------------------------------------------------------------------

def test_linear_between_points_and_lapse_above():
    col = Column(20.0, 10.0, 1000.0, 100.0, 6.0, aloft=[(1100.0, 25.0, None),
                                                      (3100.0, 5.0, None)])
    assert abs(col.t_at(600.0) - 22.5) < 1e-9      # inversion of 5 K/km
    assert abs(col.t_at(2100.0) - 15.0) < 1e-9     # 10 K/km between the points
    assert abs(col.t_at(4100.0) - (5.0 - 6.0)) < 1e-9   # the ELR goes on above
    # Layers: their tops at or below the last point belong to the points; the layer
    # holding the last point goes on from it at its own rate.
    col = Column(20.0, 10.0, 1000.0, 100.0, [(1000.0, 9.0), (4000.0, 3.0), (None, 7.0)],
                 aloft=[(2100.0, 8.0, None)])
    assert abs(col.t_at(3100.0) - 5.0) < 1e-9 and abs(col.t_at(4100.0) - 2.0) < 1e-9
    assert abs(col.t_at(5100.0) + 5.0) < 1e-9


def test_strong_surface_inversion_is_allowed():
    # 40 K/km over 300 m: far beyond a typed ELR's limit, physically possible.
    col = Column(-25.0, -27.0, 1030.0, 200.0, aloft=[(500.0, -13.0, None)])
    assert abs(col.t_at(350.0) + 19.0) < 1e-9
    assert col.report()["warnings"] == []


def test_steep_layer_between_points_is_warned_about():
    col = Column(20.0, 10.0, 1000.0, 0.0, aloft=[(500.0, 12.0, None), (1500.0, 5.0, None)])
    w = col.report()["warnings"]
    assert len(w) == 1 and "16.0 K/km" in w[0] and "0 and 500 m" in w[0]
    # 10.2 K/km (0.43 over the dry rate) passes, 10.4 does not (0.5 K/km margin).
    assert Column(20.0, 10.0, 1000.0, 0.0, aloft=[(1000.0, 9.8, None)]).report()["warnings"] == []
    assert len(Column(20.0, 10.0, 1000.0, 0.0, aloft=[(1000.0, 9.6, None)]
                      ).report()["warnings"]) == 1


# ---- the tropopause -------------------------------------------------------------------

def test_tropopause_off_and_moved():
    on = Column(25.0, 15.0, 1005.0, 0.0)
    off = Column(25.0, 15.0, 1005.0, 0.0, tropopause_m=None)
    assert on.t_at(14000.0) == on.t_at(11000.0)
    assert abs(off.t_at(14000.0) - (25.0 - 6.5 * 14.0)) < 1e-9
    assert off.report()["tropopause_msl_m"] is None
    high = Column(25.0, 15.0, 1005.0, 0.0, tropopause_m=15500.0)
    assert high.report()["tropopause_msl_m"] == 15500.0
    assert abs(high.t_at(16000.0) - (25.0 - 6.5 * 15.5)) < 1e-9
    # Above the column top: no tropopause in it.
    assert Column(25.0, 15.0, 1005.0, 0.0, top_m=9000.0).report()["tropopause_msl_m"] is None


def test_points_and_explicit_layers_above_the_tropopause_win():
    # A point above it: the points say otherwise; isothermal from the last point.
    col = Column(25.0, 15.0, 1005.0, 0.0, aloft=[(12500.0, -62.0, None)])
    assert abs(col.t_at(11000.0) - (25.0 - 87.0 * 11.0 / 12.5)) < 1e-9
    assert col.t_at(15000.0) == -62.0 and col.tropopause_m == 12500.0
    # A layer that starts above the tropopause keeps its rate; the one below is cut.
    col = Column(15.0, 5.0, 1013.25, 0.0, [(12000.0, 6.5), (None, -2.0)], top_m=20000.0)
    assert abs(col.t_at(11500.0) + 56.5) < 1e-9
    assert abs(col.t_at(20000.0) - (-56.5 + 2.0 * 8.0)) < 1e-9
    assert col.tropopause_m == 11000.0


def test_tropopause_refused_below_the_field():
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 900.0, 1000.0, tropopause_m=1050.0)
    assert "tropopause_m=1050" in str(err.value) and "allowed" in str(err.value)


# ---- humidity aloft -------------------------------------------------------------------

def test_dewpoint_linear_between_points_and_capped():
    col = Column(20.0, 18.0, 1000.0, 0.0, 6.5, aloft=[(1000.0, 10.0, None),
                                                     (2000.0, 14.0, 14.0),
                                                     (3000.0, 4.0, -6.0)])
    # Between the surface (18) and 2000 m (14), linear; the point without a dewpoint
    # does not count. Above 250 m the line is above the temperature: capped there.
    assert abs(col.dewpoint_at(100.0) - 17.8) < 1e-9
    assert abs(col.dewpoint_at(500.0) - 15.0) < 1e-9
    assert abs(col.dewpoint_at(1000.0) - 10.0) < 1e-9
    assert abs(col.dewpoint_at(1500.0) - 12.0) < 1e-9
    assert abs(col.dewpoint_at(2500.0) - 4.0) < 1e-9
    # Above the highest dewpoint its mixing ratio goes up (REFERENCES.md: r = eps e/(p-e)).
    r = mixing_ratio(-6.0, col.p_at(3000.0)) / 1000.0
    p = col.p_at(4000.0)
    assert abs(col.vapour_pressure_at(4000.0) - r * p / (EPS + r)) < 1e-9
    # ... capped at saturation far up.
    assert abs(col.dewpoint_at(12000.0) - col.t_at(12000.0)) < 1e-9
    # Density follows: the same as air_density with that dewpoint (virtual temperature).
    z = 2500.0
    assert abs(col.density_at(z) - air_density(col.p_at(z), col.t_at(z), 4.0)) < 1e-12
    # No dewpoints aloft: the surface mixing ratio is carried up, as before.
    dry = Column(20.0, 18.0, 1000.0, 0.0, 6.5, aloft=[(1000.0, 10.0, None)])
    r0 = mixing_ratio(18.0, 1000.0) / 1000.0
    p = dry.p_at(100.0)
    assert abs(dry.vapour_pressure_at(100.0) - r0 * p / (EPS + r0)) < 1e-9
    assert dry.report()["cloud_layers_msl_m"] is None


def test_cloud_layers_exact_edges():
    # Spread 10 K at the surface, 1 K at 1500 m, 10 K at 3000 m, linear between: the
    # 3 K threshold (common practice) is crossed at 1166.67 and 1833.33 m.
    assert CLOUD_SPREAD_K == 3.0
    col = Column(20.0, 10.0, 1000.0, 0.0, aloft=[(1500.0, 10.0, 9.0), (3000.0, 0.0, -10.0)])
    layers = col.report()["cloud_layers_msl_m"]
    assert len(layers) == 1
    assert abs(layers[0][0] - 3500.0 / 3.0) < 1e-6 and abs(layers[0][1] - 5500.0 / 3.0) < 1e-6
    # Two layers, fog at the field included; none above the highest dewpoint.
    col = Column(5.0, 4.0, 1000.0, 0.0, aloft=[(600.0, 2.0, -8.0), (1800.0, -5.0, -6.0),
                                              (2400.0, -9.0, -25.0)])
    layers = col.report()["cloud_layers_msl_m"]
    # Spreads 1, 10, 1, 16 K at 0, 600, 1800, 2400 m: edges at 133.33, 1533.33, 1880 m.
    assert len(layers) == 2 and layers[0][0] == 0.0
    assert abs(layers[0][1] - 400.0 / 3.0) < 1e-6
    assert abs(layers[1][0] - 4600.0 / 3.0) < 1e-6 and abs(layers[1][1] - 1880.0) < 1e-6
    assert Column(20.0, 5.0, 1000.0, 0.0, aloft=[(1500.0, 10.0, 0.0)]).report()[
        "cloud_layers_msl_m"] == []


def test_cloud_layer_threshold_edge():
    # Spread 2.9 K at a point (threshold 3 K, common practice) gives a thin layer with
    # edges where the linear spread is 3 K: 1000 * 12 / 12.1 and 1000 + 1000 * 0.1 / 17.1.
    at = Column(20.0, 5.0, 1000.0, 0.0, aloft=[(1000.0, 10.0, 7.1), (2000.0, 0.0, -20.0)])
    (a, b), = at.report()["cloud_layers_msl_m"]
    assert abs(a - 12000.0 / 12.1) < 1e-6 and abs(b - (1000.0 + 100.0 / 17.1)) < 1e-6
    off = Column(20.0, 5.0, 1000.0, 0.0, aloft=[(1000.0, 10.0, 6.9), (2000.0, 0.0, -20.0)])
    assert off.report()["cloud_layers_msl_m"] == []


# ---- warnings and levels above the top ------------------------------------------------

def test_short_column_says_where_and_why():
    col = Column(30.0, 10.0, 1000.0, 0.0, [(1500.0, 8.0), (3000.0, 6.0)])
    r = col.report()
    assert col.top_m == 3000.0 and col.top_asked_m == 16000.0
    assert r["warnings"][0].startswith("The column ends at 3000 m MSL")
    assert "its last layer ends there" in r["warnings"][0]
    # 30 degC - 12 - 9 = 9 degC at the top: every isotherm lies above it.
    for k in ("freezing_level_msl_m", "minus10_level_msl_m", "minus20_level_msl_m"):
        assert r[k] is None and k in r["levels_above_top"]
    assert "freezing level: above the column top (3000 m)" in r["warnings"]
    assert "lapse_700_500_k_per_km" in r["levels_above_top"]
    assert r["lfc_msl_m"] is None and "lfc_msl_m" in r["levels_above_top"]


def test_full_column_has_no_above_top_claims():
    r = Column(15.0, 5.0, 1013.25, 0.0).report()
    assert r["warnings"] == [] and r["levels_above_top"] == []
    # A stable column to the tropopause: no LFC, and none is claimed above the top.
    r = Column(10.0, 0.0, 1013.25, 0.0, 4.0).report()
    assert r["lfc_msl_m"] is None and "lfc_msl_m" not in r["levels_above_top"]
    # EL above the top only with el_above_top.
    r = Column(30.0, 24.0, 1000.0, 0.0, 8.0, top_m=6000.0).report()
    assert r["el_above_top"] and "el_msl_m" in r["levels_above_top"]
    assert "EL: above the column top (6000 m)" in r["warnings"]


# ---- the lapse-rate measures ----------------------------------------------------------

def test_lapse_0_3km_and_700_500():
    col = Column(15.0, 5.0, 1013.25, 0.0)
    r = col.report()
    assert "stability_column" not in r
    assert abs(r["lapse_0_3km_k_per_km"] - 6.5) < 1e-9
    assert abs(r["lapse_700_500_k_per_km"] - 6.5) < 1e-9
    # Classified against the saturated rate at the layer's middle (AMS Glossary form).
    z7, z5 = col.z_at(700.0), col.z_at(500.0)
    zm = 0.5 * (z7 + z5)
    salr = moist_lapse_rate(col.t_at(zm), col.p_at(zm))
    assert 6.6 < salr and r["lapse_700_500_class"] == "absolutely_stable"
    salr_low = moist_lapse_rate(col.t_at(1500.0), col.p_at(1500.0))
    assert salr_low < 6.4 and r["lapse_0_3km_class"] == "conditionally_unstable"
    # Points change them: 0-3 km from the points.
    col = Column(25.0, 15.0, 1000.0, 200.0, aloft=[(1200.0, 16.0, None), (3200.0, 1.0, None)])
    assert abs(col.report()["lapse_0_3km_k_per_km"] - 8.0) < 1e-9
    # A dry-adiabatic surface layer is dry_neutral.
    col = Column(30.0, 0.0, 1000.0, 0.0, DRY_LAPSE_K_PER_KM, top_m=5000.0)
    assert col.report()["lapse_0_3km_class"] == "dry_neutral"


def test_saturated_neutral_0_3km():
    # A rate equal to the saturated rate at 1.5 km in its own column (fixed point).
    lapse = 5.0
    for _ in range(30):
        col = Column(25.0, 24.0, 1000.0, 0.0, lapse, top_m=8000.0)
        lapse = moist_lapse_rate(col.t_at(1500.0), col.p_at(1500.0))
    r = Column(25.0, 24.0, 1000.0, 0.0, lapse, top_m=8000.0).report()
    assert r["lapse_0_3km_class"] == "saturated_neutral"
    r = Column(25.0, 24.0, 1000.0, 0.0, lapse + 0.3, top_m=8000.0).report()
    assert r["lapse_0_3km_class"] == "conditionally_unstable"


def test_700_500_not_inside():
    high = Column(10.0, 0.0, 690.0, 3200.0).report()
    assert high["lapse_700_500_k_per_km"] is None and high["lapse_700_500_class"] is None
    assert "lapse_700_500_k_per_km" not in high["levels_above_top"]
    low = Column(10.0, 0.0, 1000.0, 0.0, top_m=4000.0).report()
    assert low["lapse_700_500_k_per_km"] is None
    assert "lapse_700_500_k_per_km" in low["levels_above_top"]


# ---- Bolton against the exact method ---------------------------------------------------

def test_bolton_within_one_percent_of_romps_to_30_g_kg():
    # Romps (2017) exact LCL (the library's exact method, itself checked against the
    # paper's formula in test_condensation) against Bolton (1980) eq. 15 with his moist
    # Poisson exponent and virtual temperature: within 1 % up to 30 g/kg.
    worst = 0.0
    n = 0
    for p in (1013.25, 950.0, 850.0, 700.0):
        for t in range(0, 46, 3):
            for spread in (1.0, 2.0, 4.0, 8.0, 12.0, 16.0, 20.0, 25.0, 30.0):
                td = t - spread
                if mixing_ratio(td, p) > 30.0:
                    continue
                exact = cloud_base(t, td, p)[0]
                bolton = cloud_base(t, td, p, "bolton")[0]
                worst = max(worst, abs(bolton / exact - 1.0))
                n += 1
    assert n > 200 and worst < 0.01
    # The moist air is what matters: in tropical air (about 28 g/kg) within 0.5 %.
    td = 31.0
    assert mixing_ratio(td, 1013.25) > 27.0
    assert abs(cloud_base(35.0, td, 1013.25, "bolton")[0] /
               cloud_base(35.0, td, 1013.25)[0] - 1.0) < 0.005


# ---- bad points --------------------------------------------------------------------------

@pytest.mark.parametrize("aloft,words", [
    ([(1000.0, 5.0, None), (1000.0, 3.0, None)], ("aloft point 1", "aloft point 2", "same level")),
    ([(700.0, 5.0, None, "hPa"), (700.0, 3.0, None, "hPa")], ("point 1", "point 2", "700 hPa")),
    ([(50.0, 5.0, None)], ("aloft point 1 (50 m MSL)", "outside the column", "elevation 100 m")),
    ([(100.0, 5.0, None)], ("aloft point 1 (100 m MSL)",)),
    ([(1010.0, 5.0, None, "hPa")], ("aloft point 1 (1010 hPa)", "station pressure")),
    ([(float("nan"), 5.0, None)], ("aloft point 1", "level=nan")),
    ([(2000.0, float("nan"), None)], ("aloft point 1 (2000 m MSL)", "t_c=nan")),
    ([(2000.0, 5.0, float("nan"))], ("aloft point 1 (2000 m MSL)", "td_c=nan")),
    ([(2000.0, 5.0, 6.0)], ("aloft point 1 (2000 m MSL)", "td_c=6", "t_c=5")),
    ([(3000.0, 5.0, None), (2000.0, 61.0, None)], ("aloft point 2 (2000 m MSL)", "t_c=61")),
    ([(20.0, -60.0, None, "hPa")], ("aloft point 1 (20 hPa)", "above the column top")),
    ([(17000.0, -60.0, None)], ("aloft point 1 (17000 m MSL)", "outside the column")),
    ([(2000.0, 5.0)], ("aloft point 1",)),
    ([(700.0, 5.0, None, "mb")], ("aloft point 1",)),
    ([(2000.0, "warm", None)], ("aloft point 1 (2000 m MSL)", "t_c='warm'")),
    (5.0, ("aloft=5.0",)),
])
def test_bad_points_are_refused_naming_them(aloft, words):
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 1000.0, 100.0, aloft=aloft)
    for w in words:
        assert w in str(err.value), (w, str(err.value))


def test_height_and_pressure_point_at_one_level_names_both():
    col = Column(15.0, 5.0, 1000.0, 100.0, aloft=[(700.0, -2.0, None, "hPa")])
    z = col.aloft_m[0]
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 1000.0, 100.0, aloft=[(700.0, -2.0, None, "hPa"),
                                               (z + 0.005, -2.0, None)])
    assert "aloft point 1 (700 hPa)" in str(err.value) and "aloft point 2" in str(err.value)


# ---- properties (hypothesis) -------------------------------------------------------------

@st.composite
def profiles(draw):
    elev = draw(st.floats(0.0, 2000.0))
    t = draw(st.floats(-20.0, 40.0))
    n = draw(st.integers(1, 6))
    z, pts = elev, []
    tz = t
    for _ in range(n):
        z += draw(st.floats(50.0, 2500.0))
        tz = max(-85.0, min(55.0, tz + draw(st.floats(-25.0, 15.0)) * 1.0))
        dew = draw(st.one_of(st.none(), st.floats(0.0, 20.0)))
        pts.append((z, tz, None if dew is None else max(-89.0, tz - dew)))
    lapse = draw(st.floats(3.0, 9.0))
    return (t, t - draw(st.floats(0.0, 15.0)), draw(st.floats(850.0, 1040.0)), elev, lapse,
            pts)


def _build(args, pts, **kw):
    t, td, qnh, elev, lapse, _ = args
    return Column.from_qnh(t, td, qnh, elev, lapse, aloft=pts, **kw)


@settings(max_examples=80)
@given(profiles(), st.floats(0.0, 1.0))
def test_point_on_the_profile_changes_nothing(args, frac):
    try:
        col = _build(args, args[5])
    except ValueError:
        assume(False)
    # Between the surface and the last point the profile is linear between nodes (above
    # it, the ELR's layers and the tropopause make kinks a new point would cut off).
    z_new = col.elev_m + 1.0 + frac * (col.aloft_m[-1] - col.elev_m - 2.0)
    assume(all(abs(z_new - z) > 1.0 for z in col.aloft_m))
    more = _build(args, args[5] + [(z_new, col.t_at(z_new), None)])
    for i in range(41):
        z = col.elev_m + (col.top_m - col.elev_m) * i / 40.0
        assert abs(more.t_at(z) - col.t_at(z)) < 1e-6
        assert abs(more.p_at(z) - col.p_at(z)) < 0.01


@settings(max_examples=60)
@given(profiles(), st.randoms(use_true_random=False))
def test_shuffled_points_give_the_same_column(args, rnd):
    try:
        col = _build(args, args[5])
    except ValueError:
        assume(False)
    pts = list(args[5])
    rnd.shuffle(pts)
    other = _build(args, pts)
    assert other.layers == col.layers and other.dews == col.dews


@settings(max_examples=60)
@given(profiles(), st.lists(st.tuples(st.floats(0.05, 0.95), st.floats(-15.0, 15.0)),
                            min_size=1, max_size=4))
def test_points_between_two_move_pressure_only_as_their_hydrostatics_imply(args, extra):
    # New points between the lowest two (or the surface and the first) change the
    # temperature only between them: below, pressure is unchanged; at and above the
    # upper one, ln p moves by exactly g/R * integral (1/T_old - 1/T_new) dz over the
    # interval (hydrostatic equation, ideal gas), bounded here by a fine midpoint sum.
    try:
        col = _build(args, args[5])
    except ValueError:
        assume(False)
    lo, hi = col.elev_m, col.aloft_m[0]
    assume(hi - lo > 100.0)
    new = [(lo + f * (hi - lo), max(-88.0, min(58.0, col.t_at(lo + f * (hi - lo)) + dt)), None)
           for f, dt in extra]
    zs = sorted(z for z, _, _ in new)
    assume(all(b - a > 1.0 for a, b in zip([lo] + zs, zs + [hi])))
    try:
        more = _build(args, args[5] + new)
    except ValueError:
        assume(False)
    n = 4000
    h = (hi - lo) / n
    integral = sum(abs(1.0 / (col.t_at(lo + (i + 0.5) * h) + 273.15)
                       - 1.0 / (more.t_at(lo + (i + 0.5) * h) + 273.15)) for i in range(n)) * h
    bound = G0 / RD * integral
    for z in (hi, 0.5 * (hi + col.top_m), col.top_m):
        assert abs(math.log(more.p_at(z) / col.p_at(z))) <= bound * 1.01 + 1e-9
    assert more.p_at(lo) == col.p_at(lo)


@settings(max_examples=60)
@given(profiles(), st.data())
def test_a_point_by_its_own_pressure_is_the_same_point(args, data):
    # Each height point given instead by the pressure the column has there lands at the
    # same height (0.01 m) and the column keeps its pressures (0.01 hPa).
    try:
        col = _build(args, args[5])
    except ValueError:
        assume(False)
    swap = [data.draw(st.booleans()) for _ in args[5]]
    pts = [(col.p_at(z), t, td, "hPa") if s else (z, t, td)
           for (z, t, td), s in zip(args[5], swap)]
    other = _build(args, pts)
    for a, b in zip(col.aloft_m, other.aloft_m):
        assert abs(a - b) < 0.01
    for z in col.aloft_m + [col.top_m]:
        assert abs(other.p_at(min(z, other.top_m)) - col.p_at(z)) < 0.01
