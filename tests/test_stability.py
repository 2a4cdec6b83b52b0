"""Stability classes, the surface parcel (LFC, EL, CAPE, CIN, LI), thermals, CCL."""
import math

import pytest
from hypothesis import assume, given, settings, strategies as st

from lapsecalc import Column, cloud_base, moist_lapse_rate
from lapsecalc.constants import DRY_LAPSE_K_PER_KM
from lapsecalc.stability import classify, thermal_top, layers

G0, RD, CP = 9.80665, 287.05287, 1004.0  # ICAO Doc 7488/3; cp Wallace & Hobbs
EPS, LV = RD / 461.5, 2.501e6            # Wallace & Hobbs (REFERENCES.md)


def _slope_dt_dz(t_k, p_hpa, te_k):
    # Pseudo-adiabatic dT/dln p (AMS Glossary, REFERENCES.md "Moist ascent") times
    # dln p/dz = -g / (R Te) of the environment the parcel rises through, K/m.
    e = 6.1094 * math.exp(17.625 * (t_k - 273.15) / (t_k - 273.15 + 243.04))
    rs = EPS * e / (p_hpa - e)
    dt_dlnp = (RD * t_k + LV * rs) / (CP + LV * LV * rs * EPS / (RD * t_k * t_k))
    return -G0 / (RD * te_k) * dt_dlnp


def reference_parcel(col, dz=2.0):
    """Slow reference: the surface parcel in fine height steps (Poisson below the LCL,
    midpoint steps of the pseudo-adiabatic dT/dz above it), and plain trapezoid
    integrals of g (Tp - Te)/Te (definitions in REFERENCES.md, Parcel quantities)."""
    z_lcl = col.elev_m + cloud_base(col.t_c, col.td_c, col.p_hpa)[0]
    n = int((col.top_m - col.elev_m) / dz)
    zs = [col.elev_m + (col.top_m - col.elev_m) * i / n for i in range(n + 1)]
    t_s = col.t_c + 273.15
    tp_prev = None
    prof = []
    for i, z in enumerate(zs):
        p = col.p_at(z)
        if z <= z_lcl:
            tp = t_s * (p / col.p_hpa) ** (RD / CP)
        else:
            h = z - zs[i - 1]
            if zs[i - 1] < z_lcl:  # start the moist part at the LCL
                tp_prev = t_s * (col.p_at(z_lcl) / col.p_hpa) ** (RD / CP)
                h = z - z_lcl
            zm = z - 0.5 * h
            tm = tp_prev + 0.5 * h * _slope_dt_dz(tp_prev, col.p_at(z - h), col.t_at(z - h) + 273.15)
            tp = tp_prev + h * _slope_dt_dz(tm, col.p_at(zm), col.t_at(zm) + 273.15)
        tp_prev = tp
        te = col.t_at(z) + 273.15
        prof.append((z, (tp - te) / te))
    lfc = el = None
    for (z0, b0), (z1, b1) in zip(prof, prof[1:]):
        if z1 > z_lcl and lfc is None and b1 > 0:
            lfc = z1 if b0 > 0 and z0 >= z_lcl else z0
            lfc = max(lfc, z_lcl)
        if lfc is not None and b0 > 0 >= b1:
            el = z1
    cape = cin = 0.0
    for (z0, b0), (z1, b1) in zip(prof, prof[1:]):
        area = 0.5 * G0 * (max(b0, 0) + max(b1, 0)) * (z1 - z0)
        if lfc is not None and z0 >= lfc and (el is None or z1 <= el):
            cape += area
        if lfc is not None and z1 <= lfc:
            cin += 0.5 * G0 * (min(b0, 0) + min(b1, 0)) * (z1 - z0)
    positive_at_top = prof[-1][1] > 0
    return lfc, (None if positive_at_top else el), cape, cin


def test_classes_at_known_rates():
    # Stability by ELR against DALR and SALR (any textbook; REFERENCES.md, Lapse rates).
    assert classify(10.5, 5.0) == "absolutely_unstable"
    assert classify(3.0, 4.0) == "absolutely_stable"
    assert classify(6.5, 5.0) == "conditionally_unstable"
    # Neutral is split: at the dry rate for unsaturated air, at the saturated rate for
    # saturated air (within 0.1 K/km either way).
    assert classify(DRY_LAPSE_K_PER_KM + 0.09, 5.0) == "dry_neutral"
    assert classify(DRY_LAPSE_K_PER_KM - 0.09, 5.0) == "dry_neutral"
    assert classify(DRY_LAPSE_K_PER_KM + 0.11, 5.0) == "absolutely_unstable"
    assert classify(DRY_LAPSE_K_PER_KM - 0.11, 5.0) == "conditionally_unstable"
    assert classify(5.09, 5.0) == "saturated_neutral"
    assert classify(4.91, 5.0) == "saturated_neutral"
    assert classify(4.89, 5.0) == "absolutely_stable"
    assert classify(5.11, 5.0) == "conditionally_unstable"


def test_column_classes_use_local_saturated_rate():
    # 10 K/km is absolutely unstable; 3 K/km absolutely stable in warm moist air; 6.5 K/km
    # conditionally unstable in mild air near the ground: the saturated rate is computed
    # (moist_lapse_rate), not assumed (common practice facts, REFERENCES.md).
    r = Column(25.0, 15.0, 1000.0, 0.0, 10.0, top_m=8000.0).report()
    assert r["stability"] == "absolutely_unstable"
    warm = Column(30.0, 25.0, 1000.0, 0.0, 3.0)
    band = layers(warm)[0]
    assert band["saturated_k_per_km"] > 3.1 and band["class"] == "absolutely_stable"
    mild = Column(15.0, 10.0, 1000.0, 0.0, 6.5)
    band = layers(mild)[0]
    zm = 0.5 * (band["bottom_msl_m"] + band["top_msl_m"])
    salr = moist_lapse_rate(mild.t_at(zm), mild.p_at(zm))
    assert abs(band["saturated_k_per_km"] - salr) < 1e-12
    assert salr < 6.5 < DRY_LAPSE_K_PER_KM and band["class"] == "conditionally_unstable"
    # Aloft the saturated rate nears the dry rate: the same 6.5 K/km is stable there.
    assert layers(mild)[-1]["class"] == "absolutely_stable"


def test_layers_split_deep_layers_and_keep_inversion():
    col = Column(20.0, 10.0, 1000.0, 0.0, [(400.0, -6.0), (None, 7.0)], top_m=9000.0)
    bands = layers(col)
    assert bands[0]["top_msl_m"] == 400.0 and bands[0]["class"] == "absolutely_stable"
    assert all(b["top_msl_m"] - b["bottom_msl_m"] <= 2000.0 + 1e-9 for b in bands)
    assert bands[-1]["top_msl_m"] == 9000.0


CASES = {
    # name: column arguments (invented test profiles)
    "unstable_day": (32.0, 22.0, 1000.0, 100.0, 7.5, 14000.0),
    "capped": (30.0, 21.0, 990.0, 150.0, [(800.0, 9.0), (1600.0, -2.0), (None, 7.8)], 15000.0),
    "stable": (15.0, 5.0, 1000.0, 0.0, 4.0, 12000.0),
    "el_above_top": (30.0, 24.0, 1000.0, 0.0, 8.0, 6000.0),
    "saturated_steep": (22.0, 22.0, 1000.0, 0.0, 8.5, 12000.0),
    "mild_marginal": (24.0, 14.0, 960.0, 420.0, 6.5, 16000.0),
}


@pytest.mark.parametrize("name", sorted(CASES))
def test_parcel_against_fine_reference(name):
    # Against a fine-step reference integration of the same definitions, to the
    # accuracy the README states (measured, bench/mutation.md): CAPE low by at most
    # 15 J/kg + 1.5 % (never over by 1 J/kg), CIN within 4 J/kg + 1 %, LFC and EL
    # within 60 m where CAPE is over 5 J/kg.
    t, td, p, elev, lapse, top = CASES[name]
    col = Column(t, td, p, elev, lapse, top_m=top)
    r = col.report()
    lfc, el, cape, cin = reference_parcel(col)
    assert (r["lfc_msl_m"] is None) == (lfc is None)
    if lfc is None:
        assert r["cape_j_kg"] == 0.0 and r["cin_j_kg"] is None
        return
    assert abs(r["lfc_msl_m"] - lfc) < 60.0
    assert -(15.0 + 0.015 * cape) <= r["cape_j_kg"] - cape <= 1.0
    assert abs(r["cin_j_kg"] - cin) <= 4.0 + 0.01 * abs(cin)
    assert r["el_above_top"] == (el is None)
    if el is not None:
        assert abs(r["el_msl_m"] - el) < 60.0


def test_shapes():
    # The invented cases have the shapes their names say; the thresholds only tell the
    # shapes apart (the values themselves are checked against the fine reference above).
    r = {k: Column(*v[:5], top_m=v[5]).report() for k, v in CASES.items()}
    assert r["unstable_day"]["cape_j_kg"] > 1000.0
    assert r["stable"]["lfc_msl_m"] is None and r["stable"]["el_msl_m"] is None
    assert r["el_above_top"]["el_msl_m"] is None and r["el_above_top"]["el_above_top"]
    assert r["saturated_steep"]["lfc_msl_m"] == 0.0       # LFC at the LCL at the surface
    assert r["saturated_steep"]["cin_j_kg"] == 0.0
    capped = r["capped"]
    assert capped["cin_j_kg"] < -10.0 and capped["cape_j_kg"] > 500.0
    assert capped["lfc_msl_m"] > 150.0 + 1600.0       # free convection only above the cap


def test_lifted_index_definition():
    # LI = Te(500) - Tp(500) (REFERENCES.md): check against the column and an independent
    # saturated ascent from the LCL.
    from lapsecalc import saturated_ascent
    col = Column(30.0, 20.0, 1000.0, 0.0, 7.0)
    z_l, _, _ = cloud_base(30.0, 20.0, 1000.0)
    p_l = col.p_at(z_l)
    t_l = 303.15 * (p_l / 1000.0) ** (RD / CP) - 273.15
    tp = saturated_ascent(t_l, p_l, 500.0, dlnp=0.005)
    te = col.t_at(col.z_at(500.0))
    assert abs(col.report()["lifted_index_c"] - (te - tp)) < 0.02
    low = Column(20.0, 10.0, 1000.0, 0.0, 6.5, top_m=4000.0).report()
    assert low["lifted_index_c"] is None


def test_thermals():
    # Superadiabatic surface layer: a parcel at 9.77 K/km meets 12 K/km air (to 300 m)
    # then 6 K/km air: with no excess it rises until its deficit is made up.
    col = Column(30.0, 5.0, 1000.0, 0.0, [(300.0, 12.0), (None, 6.0)], top_m=10000.0)
    gain = (12.0 - DRY_LAPSE_K_PER_KM) * 0.3           # K gained in the first 300 m
    expect = 300.0 + gain / (DRY_LAPSE_K_PER_KM - 6.0) * 1000.0
    assert abs(thermal_top(col) - expect) < 1e-6
    r = col.report()
    assert r["thermal_top_msl_m"] == thermal_top(col)
    assert r["thermal_kind"] == "blue"                  # dry air: LCL far above
    assert Column(20.0, 10.0, 1000.0, 0.0, 6.5).report()["thermal_kind"] == "none"
    wet = Column(25.0, 23.0, 1000.0, 0.0, [(300.0, 12.0), (None, 6.0)], top_m=10000.0)
    assert wet.report()["thermal_kind"] == "cumulus"


def test_ccl_and_trigger():
    # CCL: environment meets the surface mixing-ratio line; the trigger temperature's
    # dry adiabat reaches the CCL (definitions, REFERENCES.md).
    from lapsecalc import mixing_ratio
    col = Column(22.0, 12.0, 1000.0, 0.0, 7.0)
    r = col.report()
    z = r["ccl_msl_m"]
    assert abs(mixing_ratio(col.t_at(z), col.p_at(z)) - mixing_ratio(12.0, 1000.0)) < 0.02
    t_trig = (col.t_at(z) + 273.15) * (1000.0 / col.p_at(z)) ** (RD / CP) - 273.15
    assert abs(r["trigger_t_c"] - t_trig) < 0.01 and r["trigger_t_c"] > 22.0


def test_cautions_travel_with_report():
    c = Column(20.0, 10.0, 1000.0, 0.0).report()["cautions"]
    text = " ".join(c).lower()
    assert "not an official forecast" in text and "flight manual" in text
    assert "one surface observation" in text


col_args = st.tuples(st.floats(-10.0, 40.0), st.floats(0.0, 20.0), st.floats(960.0, 1040.0),
                     st.floats(0.0, 1500.0), st.floats(4.0, 9.5))


@settings(max_examples=60)
@given(col_args)
def test_parcel_invariants(a):
    t, spread, p, elev, lapse = a
    r = Column.from_qnh(t, t - spread, p, elev, lapse, top_m=12000.0).report()
    assert r["cape_j_kg"] >= 0.0
    if r["lfc_msl_m"] is not None:
        assert r["cin_j_kg"] <= 0.0
        assert r["lfc_msl_m"] >= r["cloud_base_msl_m"] - 1e-6
        if r["el_msl_m"] is not None:
            assert r["el_msl_m"] > r["lfc_msl_m"]


@settings(max_examples=60)
@given(col_args, st.floats(0.0, 4.0), st.floats(0.1, 4.0))
def test_warmer_surface_parcel_never_lowers_thermal_top(a, excess, more):
    # Warming the surface parcel (same dewpoint) over the same environment.
    t, spread, p, elev, lapse = a
    col = Column.from_qnh(t, t - spread, p, elev, [(300.0, lapse + 3.0), (None, lapse)],
                          top_m=12000.0)
    lo, hi = thermal_top(col, excess), thermal_top(col, excess + more)
    assert hi is None or (lo is not None and hi >= lo)


@settings(max_examples=60)
@given(col_args, st.floats(0.1, 2.0))
def test_steeper_elr_never_lowers_cape(a, steeper):
    t, spread, p, elev, lapse = a
    assume(lapse + steeper <= 9.7)
    c1 = Column.from_qnh(t, t - spread, p, elev, lapse, top_m=10000.0).report()["cape_j_kg"]
    c2 = Column.from_qnh(t, t - spread, p, elev, lapse + steeper, top_m=10000.0).report()["cape_j_kg"]
    assert c2 >= c1 - 0.5


def test_bands_tile_each_layer_exactly():
    # The bands of a layer end exactly at its top (the next layer's foot), whatever
    # the rounding of the split: the demo field's 6.5 K/km layer to 11 km is 5 bands.
    col = Column.from_qnh(27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)])
    bands = layers(col)
    tops = [b["top_msl_m"] for b in bands]
    for _, z1, _, _, _ in col.layers:
        assert z1 in tops
    assert [b["bottom_msl_m"] for b in bands[1:]] == tops[:-1]


def test_lapse_700_500_from_a_field_just_below_700_hpa():
    # A field at 705 hPa still has 700 hPa above it: the 700-500 hPa rate exists
    # (common practice: the layer's mean ELR), here the column's one rate.
    col = Column(5.0, -5.0, 705.0, 3000.0, 6.5)
    r = col.report()
    assert r["lapse_700_500_k_per_km"] == pytest.approx(6.5, abs=1e-9)


def test_thermal_top_half_a_metre_above_a_layer_foot():
    # A parcel 0.005 K warmer than the air at the top of a dry-adiabatic layer
    # (DALR g/cp = 9.7676 K/km: the difference stays 0.005 K), then isothermal air:
    # it stops 0.005 / 9.7676 km = 0.51 m above the foot (closed form).
    dalr = 1000.0 * 9.80665 / 1004.0
    col = Column(20.0, 5.0, 1000.0, 0.0, [(1000.0, dalr), (None, 0.0)], top_m=3000.0)
    assert thermal_top(col, 0.005) == pytest.approx(1000.0 + 0.005 / dalr * 1000.0,
                                                       abs=0.05)


def test_levels_above_a_top_reached_as_asked():
    # 30 degC at the field, 6.5 K/km, top 3000 m (reached as asked, no tropopause in
    # it): 0 degC would be at 4615 m, above the top, and is listed as such.
    r = Column(30.0, 10.0, 1000.0, 0.0, 6.5, top_m=3000.0).report()
    assert r["freezing_level_msl_m"] is None
    assert "freezing_level_msl_m" in r["levels_above_top"]
    assert "lfc_msl_m" not in r["levels_above_top"]
