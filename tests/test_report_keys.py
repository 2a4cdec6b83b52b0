"""Every key of Column.report(), each checked against something outside the code that
computes it: a closed form for the linear layers, a published formula coded here or in
refs.py, a slow fine-step integration, or an identity with a separately tested public
function. A new report key fails test_every_key_is_checked until a check is added here.

The columns are invented. Closed forms for a layer with constant lapse rate gamma:
T = T0 - gamma dz, p = p0 (T/T0)^(g/(Rd gamma)) (Wallace & Hobbs, Atmospheric Science,
2nd ed., ch. 3); ICAO Doc 7488/3 for the standard atmosphere.
"""
import math

import pytest

from lapsecalc import Column, mixing_ratio, wet_bulb, relative_humidity, station_pressure
from refs import (romps_lcl_m, romps_pvstar_pa, hyland_wexler_water_hpa, ae_es_hpa,
                  pseudo_adiabatic_dt_dz, fine_parcel, first_crossing, bisect)
from test_stability import reference_parcel

G0, RD, CP, RV = 9.80665, 287.05287, 1004.0, 461.5   # ICAO Doc 7488/3; Wallace & Hobbs
EPS, KAPPA = RD / RV, RD / CP
DRY_RATE = 1000.0 * G0 / CP                            # K/km, g/cp
ISA_T0, ISA_P0, ISA_L, ISA_RHO0 = 288.15, 1013.25, 0.0065, 1.2250   # ICAO Doc 7488/3

# (t_c, td_c, p_hpa, elev_m, layers, top_m, thermal_excess_c): invented columns.
MAIN = (26.0, 15.0, 965.0, 420.0, [(300.0, 9.0), (2500.0, 7.0), (None, 6.5)], 14000.0, 1.5)
CHECKED = set()


def _col(spec):
    t, td, p, elev, layers, top, _ = spec
    return Column(t, td, p, elev, layers, top_m=top)


# The Column's default tropopause: isothermal above 11000 m MSL (ICAO Doc 7488/3).
TROPOPAUSE_M = 11000.0


def _layers_msl(spec):
    # [(bottom_msl, top_msl, t_bottom_c, rate_k_per_km)] from the spec, by hand, the
    # layer across the tropopause cut there and isothermal above it.
    t, _, _, elev, layers, top, _ = spec
    out, z, tz = [], elev, t
    for top_agl, rate in layers:
        z1 = top if top_agl is None else min(elev + top_agl, top)
        parts = [(z1, rate)]
        if z < TROPOPAUSE_M < z1:
            parts = [(TROPOPAUSE_M, rate), (z1, 0.0)]
        for zt, rt in parts:
            out.append((z, zt, tz, rt))
            tz -= rt * (zt - z) / 1000.0
            z = zt
    return out


def _env_t(spec, z):
    for z0, z1, t0, rate in _layers_msl(spec):
        if z <= z1:
            return t0 - rate * (z - z0) / 1000.0
    raise AssertionError(z)


def _env_p(spec, z):
    p = spec[2]
    for z0, z1, t0, rate in _layers_msl(spec):
        top = min(z, z1)
        g = rate / 1000.0
        ta, tb = t0 + 273.15, t0 + 273.15 - g * (top - z0)
        p *= (tb / ta) ** (G0 / (RD * g)) if g else math.exp(-G0 * (top - z0) / (RD * ta))
        if z <= z1:
            return p
    raise AssertionError(z)


@pytest.fixture(scope="module")
def main():
    col = _col(MAIN)
    r = col.report(MAIN[6])
    lcl_msl = MAIN[3] + r["cloud_base_agl_m"]
    return col, r, fine_parcel(col, lcl_msl)


def covers(*keys):
    # Marks the report keys a test checks (collected at import, so the coverage test
    # below does not depend on the order tests run in).
    CHECKED.update(keys)
    return lambda fn: fn


@covers("elevation_m", "top_msl_m", "t_c", "td_c", "station_pressure_hpa", "thermal_excess_c")
def test_inputs_come_back(main):
    col, r, _ = main
    t, td, p, elev, _, top, excess = MAIN
    assert (r["elevation_m"], r["top_msl_m"], r["t_c"], r["td_c"]) == (elev, top, t, td)
    assert (r["station_pressure_hpa"], r["thermal_excess_c"]) == (p, excess)


@covers("rh_pct", "mixing_ratio_g_kg", "wet_bulb_c")
def test_surface_humidity(main):
    _, r, _ = main
    t, td, p = MAIN[:3]
    # Hyland-Wexler (ASHRAE Fundamentals ch. 1) ratio, within the fit's 0.5 %.
    assert abs(r["rh_pct"] / (100.0 * hyland_wexler_water_hpa(td) / hyland_wexler_water_hpa(t)) - 1) < 0.005
    assert r["rh_pct"] == relative_humidity(t, td)
    # r = eps e / (p - e) (Wallace & Hobbs) with Hyland-Wexler e, and the identity.
    e = hyland_wexler_water_hpa(td)
    assert abs(r["mixing_ratio_g_kg"] / (1000.0 * EPS * e / (p - e)) - 1) < 0.005
    assert abs(r["mixing_ratio_g_kg"] - mixing_ratio(td, p)) < 1e-9
    # The psychrometric balance (ASHRAE Fundamentals ch. 1 eq. 33) solved by bisection.
    w = EPS * ae_es_hpa(td) / (p - ae_es_hpa(td))

    def balance(tw):
        ws = EPS * ae_es_hpa(tw) / (p - ae_es_hpa(tw))
        return ((2501.0 - 2.326 * tw) * ws - 1.006 * (t - tw)) / (2501.0 + 1.86 * t - 4.186 * tw) - w
    assert abs(r["wet_bulb_c"] - bisect(balance, td, t)) < 0.01
    assert r["wet_bulb_c"] == wet_bulb(t, td, p)


@covers("qnh_hpa", "pressure_altitude_m", "air_density_kg_m3", "density_altitude_m")
def test_pressures_and_density(main):
    _, r, _ = main
    t, td, p, elev = MAIN[:4]
    n = RD * ISA_L / G0
    # Altimeter-setting relation p^n = QNH^n - p0^n L h / T0 (REFERENCES.md), solved for h.
    h = ISA_T0 / ISA_L * (r["qnh_hpa"] ** n - p ** n) / ISA_P0 ** n
    assert abs(h - elev) < 0.01
    assert abs(station_pressure(r["qnh_hpa"], elev) - p) < 0.001
    # ISA troposphere (ICAO Doc 7488/3): p = p0 (1 - L h / T0)^(g/(R L)).
    assert abs(r["pressure_altitude_m"] - ISA_T0 / ISA_L * (1 - (p / ISA_P0) ** n)) < 0.01
    # Ideal gas with the virtual temperature (Wallace & Hobbs eq. 3.60).
    e = ae_es_hpa(td)
    tv = (t + 273.15) / (1.0 - e / p * (1.0 - EPS))
    rho = 100.0 * p / (RD * tv)
    assert abs(r["air_density_kg_m3"] - rho) < 1e-6
    # ISA height of that density: rho/rho0 = (T/T0)^(g/(R L) - 1).
    da = ISA_T0 / ISA_L * (1.0 - (rho / ISA_RHO0) ** (1.0 / (G0 / (RD * ISA_L) - 1.0)))
    assert abs(r["density_altitude_m"] - da) < 0.5


def _isa_pa_m(p):
    # Pressure altitude, ICAO Doc 7488/3: troposphere closed form, isothermal 216.65 K
    # above 11 km (226.32 hPa, REFERENCES.md table) up to 20 km.
    if p >= 226.32:
        return ISA_T0 / ISA_L * (1 - (p / ISA_P0) ** (RD * ISA_L / G0))
    return 11000.0 + RD * 216.65 / G0 * math.log(226.3206 / p)


@covers("isa_deviation_c", "density_altitude_dry_m", "indicated_altitude_m")
def test_altimetry_keys(main):
    _, r, _ = main
    t, td, p, elev = MAIN[:4]
    # ISA temperature at the field's pressure altitude (ICAO Doc 7488/3).
    pa = _isa_pa_m(p)
    assert abs(r["isa_deviation_c"] - (t - (15.0 - ISA_L * pa))) < 1e-6
    # Dry air: rho = p / (R T), then the ISA height of that density (closed form).
    rho = 100.0 * p / (RD * (t + 273.15))
    da = ISA_T0 / ISA_L * (1.0 - (rho / ISA_RHO0) ** (1.0 / (G0 / (RD * ISA_L) - 1.0)))
    assert abs(r["density_altitude_dry_m"] - da) < 0.5
    assert r["density_altitude_dry_m"] < r["density_altitude_m"]  # humid air is lighter
    # An altimeter on QNH reads PA(p) - PA(QNH) (REFERENCES.md "Altimetry"), p from the
    # closed-form layers; every single height of the report, None kept.
    ind = r["indicated_altitude_m"]
    singles = [k for k in r if k.endswith("_msl_m") and not isinstance(r[k], list)]
    assert sorted(ind) == sorted(singles) and "cloud_base_msl_m" in ind
    for k in singles:
        if r[k] is None:
            assert ind[k] is None, k
        else:
            want = _isa_pa_m(_env_p(MAIN, r[k])) - _isa_pa_m(r["qnh_hpa"])
            assert abs(ind[k] - want) < 0.5, k


@covers("cloud_base_agl_m", "cloud_base_msl_m", "lcl_t_c", "lcl_p_hpa")
def test_cloud_base(main):
    col, r, _ = main
    t, td, p, elev = MAIN[:4]
    # Romps (2017) eq. 22a with a slow W_-1 (refs.py), humidity from Romps' own e_s.
    rh = romps_pvstar_pa(td + 273.15) / romps_pvstar_pa(t + 273.15)
    ref = romps_lcl_m(t + 273.15, rh, 100.0 * p)
    assert abs(r["cloud_base_agl_m"] - ref) < 2.0 + 0.002 * ref
    assert r["cloud_base_msl_m"] == elev + r["cloud_base_agl_m"]
    # At the LCL: saturated with the surface mixing ratio (AE96 e_s), on the dry
    # adiabat from the surface (Poisson, to Romps' moist exponent: 0.1 K), and within
    # 1 hPa of the air's pressure at that height (closed form; the parcel, warmer than
    # the air below its base, has its own hydrostatics in Romps' formula).
    e_l = ae_es_hpa(r["lcl_t_c"])
    assert abs(EPS * e_l / (r["lcl_p_hpa"] - e_l) / (EPS * ae_es_hpa(td) / (p - ae_es_hpa(td))) - 1) < 0.005
    assert abs(r["lcl_t_c"] - ((t + 273.15) * (r["lcl_p_hpa"] / p) ** KAPPA - 273.15)) < 0.1
    assert abs(r["lcl_p_hpa"] - _env_p(MAIN, r["cloud_base_msl_m"])) < 1.0


@covers("freezing_level_msl_m", "minus10_level_msl_m", "minus20_level_msl_m",
           "freezing_levels_msl_m", "minus10_levels_msl_m", "minus20_levels_msl_m",
           "warm_layer_aloft")
def test_environment_levels(main):
    _, r, _ = main
    # Closed form per linear layer: z = z0 + (T0 - T) / gamma.
    for name, t_iso in (("freezing", 0.0), ("minus10", -10.0), ("minus20", -20.0)):
        want = [z0 + (t0 - t_iso) / rate * 1000.0 for z0, z1, t0, rate in _layers_msl(MAIN)
                if rate and z0 <= z0 + (t0 - t_iso) / rate * 1000.0 <= z1]
        assert len(want) == 1
        assert r[name + "_levels_msl_m"] == pytest.approx(want, abs=1e-6)
        assert r[name + "_level_msl_m"] == pytest.approx(want[0], abs=1e-6)
    assert r["warm_layer_aloft"] is False                 # cools all the way up


@covers("parcel_freezing_level_msl_m", "lfc_msl_m", "el_msl_m", "el_above_top", "cape_j_kg",
           "cin_j_kg", "lifted_index_c", "icing_band_bottom_msl_m", "icing_band_top_msl_m",
           "icing_band_basis")
def test_parcel_levels(main):
    col, r, prof = main
    # Fine-step parcel (refs.fine_parcel): 0 and -20 degC of the parcel, in cloud
    # between the LCL and the EL (the icing band; common practice 0..-20 degC).
    z0 = first_crossing(prof, lambda row: row[1])
    z20 = first_crossing(prof, lambda row: row[1] + 20.0)
    assert abs(r["parcel_freezing_level_msl_m"] - z0) < 5.0
    lfc, el, cape, cin = reference_parcel(col)
    assert abs(r["lfc_msl_m"] - lfc) < 60.0 and abs(r["el_msl_m"] - el) < 60.0
    assert r["el_above_top"] is False
    assert -(15.0 + 0.015 * cape) <= r["cape_j_kg"] - cape <= 1.0
    assert abs(r["cin_j_kg"] - cin) <= 4.0 + 0.01 * abs(cin)
    assert r["cloud_base_msl_m"] < z0 < z20 < el          # premise: the whole band in cloud
    # The conservative band (common practice 0..-20 degC in cloud; cloud air mixes the
    # parcel's with the air's): from the lower of the air's 0 degC level (closed form)
    # and the parcel's, to the higher of the two -20 degC levels, inside the cloud.
    za0 = bisect(lambda z: -_env_t(MAIN, z), MAIN[3], MAIN[5])
    za20 = bisect(lambda z: -_env_t(MAIN, z) - 20.0, MAIN[3], MAIN[5])
    assert za0 < z0 and za20 < z20                       # premise: the parcel is warmer
    assert abs(r["icing_band_bottom_msl_m"] - za0) < 0.5
    assert abs(r["icing_band_top_msl_m"] - z20) < 5.0
    assert r["icing_band_basis"] == "parcel"
    # LI = Te - Tp at 500 hPa (REFERENCES.md), 500 hPa found by bisection on the
    # closed-form pressure.
    z500 = bisect(lambda z: 500.0 - _env_p(MAIN, z), MAIN[3], MAIN[5])
    tp = [row for row in prof if row[0] >= z500][0]
    assert abs(r["lifted_index_c"] - (_env_t(MAIN, z500) - tp[1])) < 0.05


@covers("thermal_top_msl_m", "thermal_kind", "ccl_msl_m", "trigger_t_c")
def test_thermals_and_ccl(main):
    col, r, _ = main
    t, td, p, elev, _, _, excess = MAIN
    # Dry thermal at t + excess cooling at g/cp meets the air: per layer closed form.
    top = None
    for z0, z1, t0, rate in _layers_msl(MAIN):
        d0 = t + excess - DRY_RATE * (z0 - elev) / 1000.0 - t0
        d1 = t + excess - DRY_RATE * (z1 - elev) / 1000.0 - (t0 - rate * (z1 - z0) / 1000.0)
        if d1 <= 0.0:
            top = z0 + (z1 - z0) * d0 / (d0 - d1)
            break
    assert top > MAIN[4][0][0] + elev                      # premise: above the first layer
    assert abs(r["thermal_top_msl_m"] - top) < 1e-6
    # Blue: the warmed parcel's own LCL (Romps, refs.py) is above the thermal top.
    rh = romps_pvstar_pa(td + 273.15) / romps_pvstar_pa(t + excess + 273.15)
    assert elev + romps_lcl_m(t + excess + 273.15, rh, 100.0 * p) > top
    assert r["thermal_kind"] == "blue"
    # CCL: the air's temperature meets the dewpoint of the surface mixing ratio (AE96,
    # inverted by bisection); the trigger temperature's dry adiabat reaches it.
    w = EPS * ae_es_hpa(td) / (p - ae_es_hpa(td))

    def gap(z):
        e = w * _env_p(MAIN, z) / (EPS + w)
        return bisect(lambda x: ae_es_hpa(x) - e, -90.0, 60.0) - _env_t(MAIN, z)
    z_ccl = bisect(gap, elev, 8000.0)
    assert abs(r["ccl_msl_m"] - z_ccl) < 1.0
    trig = (_env_t(MAIN, z_ccl) + 273.15) * (p / _env_p(MAIN, z_ccl)) ** KAPPA - 273.15
    assert abs(r["trigger_t_c"] - trig) < 0.02


@covers("thermal_cloud_base_msl_m", "thermal_usable_top_msl_m", "dry_thermals_from_t_c",
        "capped_cloud_top_msl_m")
def test_thermal_base_and_usable_top(main):
    _, r, _ = main
    t, td, p, elev, _, _, excess = MAIN
    # The heated thermals' cloud base: Romps (2017) LCL of air at t + excess (refs.py).
    rh = romps_pvstar_pa(td + 273.15) / romps_pvstar_pa(t + excess + 273.15)
    base = elev + romps_lcl_m(t + excess + 273.15, rh, 100.0 * p)
    assert abs(r["thermal_cloud_base_msl_m"] - base) < 2.0 + 0.002 * (base - elev)
    # Usable: the lower of the dry-thermal top and that base (blue: the dry top).
    assert r["thermal_usable_top_msl_m"] == min(r["thermal_top_msl_m"],
                                                r["thermal_cloud_base_msl_m"])
    # Thermals rise (no trigger sentence); no inversion anywhere (no capped deck).
    assert r["dry_thermals_from_t_c"] is None and r["capped_cloud_top_msl_m"] is None


@covers("warm_layer_bottom_msl_m", "warm_layer_top_msl_m", "warm_layer_max_t_c",
        "cold_layer_below_depth_m", "precip_type", "wet_bulb_zero_msl_m")
def test_precipitation_keys(main):
    col, r, _ = main
    t, td, p, elev, _, top, _ = MAIN
    # Cools all the way up (slow scan): no warm layer aloft.
    assert _warm_over_cold_by_scan(MAIN) is False
    for k in ("warm_layer_bottom_msl_m", "warm_layer_top_msl_m", "warm_layer_max_t_c",
              "cold_layer_below_depth_m"):
        assert r[k] is None
    # Melting area at the ground, g * integral (T - T0)/T dz up to 0 degC (Bourgouin
    # 2000; midpoint sum): past his 13.2 J/kg (from memory), rain.
    za0 = bisect(lambda z: -_env_t(MAIN, z), elev, top)
    n = 2000
    melt = sum(G0 * (1 - 273.15 / (_env_t(MAIN, elev + (i + 0.5) * (za0 - elev) / n) + 273.15))
               * (za0 - elev) / n for i in range(n))
    assert melt > 13.2 and r["precip_type"] == "rain"
    # Wet-bulb zero: the wet bulb (ASHRAE eq. 33) of the air with the surface mixing
    # ratio (AE96), capped at saturation, scanned every 10 m, then bisected.
    w = EPS * ae_es_hpa(td) / (p - ae_es_hpa(td))

    def tw(z):
        pz, tz = _env_p(MAIN, z), _env_t(MAIN, z)
        e = min(w * pz / (EPS + w), ae_es_hpa(tz))
        return wet_bulb(tz, bisect(lambda x: ae_es_hpa(x) - e, -90.0, tz), pz)
    z = elev
    while tw(z + 10.0) > 0.0:
        z += 10.0
    zw = bisect(lambda zz: -tw(zz), z, z + 10.0)
    assert abs(r["wet_bulb_zero_msl_m"] - zw) < 2.0


@covers("frost_point_c", "rh_ice_pct", "fog_risk", "ice_fog_risk", "carb_icing")
def test_field_hazards(main):
    _, r, _ = main
    t, td = MAIN[:2]
    # Above 0 degC there is no frost point and no humidity over ice.
    assert r["frost_point_c"] is None and r["rh_ice_pct"] is None
    assert r["ice_fog_risk"] is False
    # Spread 11 K: past the 3 K of fog risk (common practice).
    assert r["fog_risk"] is False
    # RH by Hyland-Wexler (ASHRAE) about 51 %, 26 degC: the band "serious icing at
    # descent power" of the CAA Safety Sense Leaflet 14 chart (edges from memory: 50 %
    # up to 35 degC), our name "glide".
    rh = 100.0 * hyland_wexler_water_hpa(td) / hyland_wexler_water_hpa(t)
    assert 50.0 < rh < 60.0 and r["carb_icing"] == "glide"


@covers("stability", "stability_layers", "stability_column")
def test_stability_keys(main):
    col, r, _ = main
    # Bands of at most 2 km in each cooling layer (an isothermal layer or an inversion
    # is stable at any depth: one band); each class from the layer's ELR against the
    # dry rate g/cp and the saturated rate at the band's middle (AMS Glossary, refs.py).
    bands = []
    for z0, z1, t0, rate in _layers_msl(MAIN):
        n = 1 if rate <= 0.0 else int(math.ceil((z1 - z0) / 2000.0))
        bands += [(z0 + (z1 - z0) * i / n, z0 + (z1 - z0) * (i + 1) / n, rate) for i in range(n)]
    got = r["stability_layers"]
    assert len(got) == len(bands)

    def salr(z):
        te = _env_t(MAIN, z) + 273.15
        return -1000.0 * pseudo_adiabatic_dt_dz(te, _env_p(MAIN, z), te)

    for (a, b, rate), band in zip(bands, got):
        s = salr(0.5 * (a + b))
        assert band["bottom_msl_m"] == pytest.approx(a) and band["top_msl_m"] == pytest.approx(b)
        assert band["lapse_k_per_km"] == pytest.approx(rate)
        assert abs(band["saturated_k_per_km"] - s) < 0.01
        assert band["class"] == cls(rate, s)
    assert r["stability"] == got[0]["class"] == "conditionally_unstable"
    assert "stability_column" not in r


def _salr(z):
    te = _env_t(MAIN, z) + 273.15
    return -1000.0 * pseudo_adiabatic_dt_dz(te, _env_p(MAIN, z), te)


def cls(rate, s):
    # Stability by ELR against the dry and saturated rates (any textbook; REFERENCES.md
    # "Lapse rates"), neutral split into dry and saturated, within 0.1 K/km.
    if abs(rate - DRY_RATE) <= 0.1:
        return "dry_neutral"
    if abs(rate - s) <= 0.1:
        return "saturated_neutral"
    return "absolutely_unstable" if rate > DRY_RATE else \
        "absolutely_stable" if rate < s else "conditionally_unstable"


@covers("lapse_0_3km_k_per_km", "lapse_0_3km_class", "lapse_700_500_k_per_km",
        "lapse_700_500_class", "tropopause_msl_m")
def test_lapse_measures_and_tropopause(main):
    _, r, _ = main
    # The two lapse rates of common practice, from the hand-built layers: 0-3 km above
    # the field, and between the heights of 700 and 500 hPa (found by bisection on the
    # closed-form pressure); classed at the layer's middle.
    elev = MAIN[3]
    low = (MAIN[0] - _env_t(MAIN, elev + 3000.0)) / 3.0
    assert abs(r["lapse_0_3km_k_per_km"] - low) < 1e-9
    assert r["lapse_0_3km_class"] == cls(low, _salr(elev + 1500.0))
    z7 = bisect(lambda z: 700.0 - _env_p(MAIN, z), elev, 9000.0)
    z5 = bisect(lambda z: 500.0 - _env_p(MAIN, z), elev, 9000.0)
    mid = 1000.0 * (_env_t(MAIN, z7) - _env_t(MAIN, z5)) / (z5 - z7)
    assert abs(r["lapse_700_500_k_per_km"] - mid) < 1e-6
    assert r["lapse_700_500_class"] == cls(mid, _salr(0.5 * (z7 + z5)))
    # MAIN reaches 14000 m: isothermal from 11000 m (ICAO Doc 7488/3's tropopause).
    assert r["tropopause_msl_m"] == TROPOPAUSE_M


@covers("warnings", "levels_above_top", "cloud_layers_msl_m")
def test_warnings_and_cloud_layers(main):
    _, r, _ = main
    # MAIN reaches the top asked for and every level lies inside it: nothing to warn;
    # no dewpoints aloft: no cloud layers can be placed (None, not []).
    assert r["warnings"] == [] and r["levels_above_top"] == []
    assert r["cloud_layers_msl_m"] is None
    # The same column cut at 3 km: it says where and why, and the levels above it.
    t, td, p, elev, layers, _, excess = MAIN
    short = Column(t, td, p, elev, layers[:2] + [(2580.0, 6.5)]).report(excess)
    assert short["top_msl_m"] == elev + 2580.0
    assert short["warnings"][0].startswith("The column ends at 3000 m MSL, below the top"
                                           " asked for (16000 m)")
    assert "freezing_level_msl_m" in short["levels_above_top"]
    assert "freezing level: above the column top (3000 m)" in short["warnings"]
    # Dewpoints aloft: spread 2 K at 2000 m, 11 K at the field and at 4000 m: cloud
    # where the spread is at most 3 K (common practice), linear between the points.
    moist = Column(t, td, p, elev, layers, aloft=[(2000.0, 8.0, 6.0), (4000.0, -5.0, -16.0)])
    (a, b), = moist.report()["cloud_layers_msl_m"]
    assert abs(a - (elev + (2000.0 - elev) * 8.0 / 9.0)) < 1e-6
    assert abs(b - (2000.0 + 2000.0 / 9.0)) < 1e-6


@covers("icing_layers_msl_m")
def test_icing_layers(main):
    _, r, _ = main
    # No dewpoints aloft: no cloud layers, so no icing layers (None).
    assert r["icing_layers_msl_m"] is None
    # Dewpoints aloft (invented), a flat 2 degC from the field to 1500 m, spread 1 K.
    _, _, p, elev, _, _, excess = MAIN
    col = Column(2.0, 1.0, p, elev, 6.5, aloft=[(1500.0, 2.0, 1.0), (3500.0, -6.0, -12.0)])
    # Spread linear 1 K (1500 m) -> 6 K (3500 m): 3 K (cloud likely, common practice)
    # at 1500 + 2000 * 2/5 m; the air 0 degC at 1500 + 2000 * 2/8 m (icing in cloud at
    # 0..-20 degC, common practice).
    (a, b), = col.report(excess)["icing_layers_msl_m"]
    assert abs(a - 2000.0) < 1e-6 and abs(b - 2300.0) < 1e-6


@covers("cautions")
def test_cautions(main):
    _, r, _ = main
    # The usual cautions (common practice for flight-planning aids).
    text = " ".join(r["cautions"]).lower()
    assert "one surface observation" in text and "not an official forecast" in text
    assert "flight manual" in text and "local regulations" in text


def test_every_key_is_checked(main):
    _, r, _ = main
    missing = sorted(set(r) - CHECKED)
    assert not missing, "report keys with no outside check in this file: %s" % missing


def _warm_over_cold_by_scan(spec, dz=1.0):
    # Slow definition: some air above 0 degC lies over air at or below 0 degC.
    elev, top = spec[3], spec[5]
    cold = False
    for i in range(int((top - elev) / dz) + 1):
        t = _env_t(spec, min(elev + i * dz, top))
        if cold and t > 0.0:
            return True
        cold = cold or t <= 0.0
    return False


@pytest.mark.parametrize("t_c,layers,want", [
    (-5.0, [(None, 6.5)], False),                        # below freezing throughout
    (0.0, [(None, 6.5)], False),                         # exactly 0 degC at the surface
    (0.0, [(500.0, -4.0), (None, 6.5)], True),           # 0 degC under a warm inversion
    (-2.0, [(500.0, -4.0), (None, 6.5)], False),         # the inversion tops out at 0 degC
    (-2.0, [(600.0, -4.0), (None, 6.5)], True),          # ... or just above it
    (5.0, [(1000.0, 8.0), (2000.0, -6.0), (None, 6.5)], True),   # warm nose aloft
    (5.0, [(500.0, -4.0), (None, 6.5)], False),          # warm inversion over warm air
    (0.5, [(500.0, -4.0), (None, 6.5)], False),          # ... even just above 0 degC
    (5.0, [(1000.0, 5.0), (1500.0, -4.0), (None, 6.5)], True),   # 0 degC exactly, then warm
])
def test_warm_layer_aloft_edges(t_c, layers, want):
    spec = (t_c, t_c - 3.0, 1000.0, 0.0, layers, 6000.0, 0.0)
    assert _warm_over_cold_by_scan(spec) is want
    assert _col(spec).report()["warm_layer_aloft"] is want


def test_crossing_at_a_layer_boundary_is_listed_once():
    # 0 degC exactly at the 1000 m boundary, then a warm inversion and cooling again:
    # two crossings, the boundary one once (closed form per layer).
    spec = (10.0, 0.0, 1000.0, 0.0, [(1000.0, 10.0), (2000.0, -5.0), (None, 6.5)], 8000.0, 0.0)
    r = _col(spec).report()
    assert r["freezing_levels_msl_m"] == pytest.approx([1000.0, 2000.0 + 5.0 / 6.5 * 1000.0])
    assert r["freezing_level_msl_m"] == pytest.approx(1000.0)
    spec = (10.0, 0.0, 1000.0, 0.0, [(1000.0, 10.0), (None, 6.5)], 8000.0, 0.0)
    assert _col(spec).report()["minus10_levels_msl_m"] == pytest.approx([1000.0 + 10.0 / 6.5 * 1000.0])
    assert _col(spec).report()["freezing_levels_msl_m"] == pytest.approx([1000.0])


@pytest.mark.parametrize("spread", [0.0, 0.01, 0.3])
def test_ccl_of_nearly_saturated_air(spread):
    # The CCL of nearly saturated air is just above the ground: where the air (6.5 K/km)
    # meets the dewpoint of the surface mixing ratio (AE96 inverted by bisection).
    spec = (20.0, 20.0 - spread, 1000.0, 300.0, [(None, 6.5)], 8000.0, 0.0)
    r = _col(spec).report()
    if spread == 0.0:
        assert r["ccl_msl_m"] == 300.0
        return
    w = EPS * ae_es_hpa(20.0 - spread) / (1000.0 - ae_es_hpa(20.0 - spread))

    def gap(z):
        e = w * _env_p(spec, z) / (EPS + w)
        return bisect(lambda x: ae_es_hpa(x) - e, -90.0, 60.0) - _env_t(spec, z)
    z = bisect(gap, 300.0, 2000.0)
    assert z - 300.0 < 250.0 * spread                   # premise: near the ground
    assert abs(r["ccl_msl_m"] - z) < 0.6


ICING = {
    # name: spec (invented columns), what bounds the band
    "cold_base": ((2.0, 0.0, 1000.0, 0.0, [(None, 8.0)], 12000.0, 0.0), "lcl", "minus20"),
    "freezing_surface": ((-5.0, -7.0, 1000.0, 0.0, [(None, 9.0)], 10000.0, 0.0), "lcl", "minus20"),
    "el_above_top": ((30.0, 24.0, 1000.0, 0.0, [(None, 8.0)], 6000.0, 0.0), "zero", "top"),
    "deep": ((24.0, 20.0, 1000.0, 0.0, [(2500.0, 8.5), (3000.0, -8.0), (None, 6.5)], 12000.0,
              0.0), "zero", "minus20"),
    "warm_cloud": ((28.0, 24.0, 1000.0, 0.0, [(1500.0, 7.5), (2000.0, -20.0), (None, 4.0)],
                    8000.0, 0.0), None, None),
    "shallow_cumulus": ((28.0, 24.0, 1000.0, 0.0, [(1500.0, 7.5), (2000.0, -20.0), (None, 5.0)],
                         8000.0, 0.0), "air", None),
}


def _air_level(spec, t_c):
    # Lowest height where the air (closed form per layer) is at t_c, by a 10 m scan and
    # bisection; the elevation when the surface already is, None above the top.
    z, top = spec[3], spec[5]
    if _env_t(spec, z) <= t_c:
        return z
    while _env_t(spec, min(z + 10.0, top)) > t_c:
        z += 10.0
        if z >= top:
            return None
    return bisect(lambda x: t_c - _env_t(spec, x), z, min(z + 10.0, top))


@pytest.mark.parametrize("name", sorted(ICING))
def test_icing_band_edges(name):
    # In cloud at 0 to -20 degC (common practice), conservative: a convective cloud (an
    # LFC; up to the EL, or the column top when the EL is above it) mixes the parcel's
    # air with the air's, so the band runs from the lower of the two 0 degC levels to
    # the higher of the two -20 degC levels, never below the cloud base. The parcel's
    # levels from the fine-step reference (refs.fine_parcel), the EL from the fine
    # reference integration, the air's in closed form. A cloud topped below freezing
    # leaves the humidity aloft unknown: the band starts at the air's 0 degC level (or
    # the base) and its top is unknown.
    spec, bottom, top = ICING[name]
    col = _col(spec)
    r = col.report()
    lcl = spec[3] + r["cloud_base_agl_m"]
    prof = fine_parcel(col, lcl)
    zp0 = first_crossing(prof, lambda row: row[1]) if prof[0][1] > 0.0 else spec[3]
    zp20 = first_crossing(prof, lambda row: row[1] + 20.0)
    za0, za20 = _air_level(spec, 0.0), _air_level(spec, -20.0)
    lfc, el, _, _ = reference_parcel(col)
    cloud_top = col.top_m if el is None else el
    if bottom is None:
        assert za0 is None                                 # the air never freezes
        assert r["icing_band_bottom_msl_m"] is None and r["icing_band_basis"] is None
        return
    if bottom == "air":
        assert cloud_top < za0 and (zp0 is None or cloud_top < zp0)   # never freezes
        assert r["icing_band_basis"] == "air" and r["icing_band_top_msl_m"] is None
        assert abs(r["icing_band_bottom_msl_m"] - max(lcl, za0)) < 1.0
        return
    z0 = min(za0, zp0)
    z20 = None if zp20 is None or za20 is None else max(za20, zp20)
    want_bottom = {"lcl": lcl, "zero": z0}[bottom]
    want_top = {"minus20": z20, "top": col.top_m}[top]
    assert max(lcl, z0) == pytest.approx(want_bottom)
    assert r["icing_band_basis"] == "parcel"
    assert abs(r["icing_band_bottom_msl_m"] - want_bottom) < 5.0
    assert abs(r["icing_band_top_msl_m"] - want_top) < 5.0


@pytest.mark.parametrize("lapse,want", [(5.1005 + 0.0, "conditionally_unstable"),
                                         (5.0995, "saturated_neutral"),
                                         (9.7675 + 0.1005, "absolutely_unstable"),
                                         (9.7675 + 0.0995, "dry_neutral"),
                                         (4.8995, "absolutely_stable")])
def test_neutral_band_is_a_tenth_of_a_kelvin_per_km(lapse, want):
    # Neutral: within 0.1 K/km of the dry rate (g/cp: dry_neutral) or of the saturated
    # rate (saturated_neutral).
    from lapsecalc.stability import classify
    assert classify(lapse, 5.0) == want


def test_layers_deeper_than_2km_are_split():
    # Bands of at most 2 km (README): a 2010 m layer is two bands, a 2000 m one is one.
    for depth, n in ((2010.0, 2), (2000.0, 1), (4001.0, 3)):
        spec = (20.0, 10.0, 1000.0, 0.0, [(depth, 7.0), (None, 6.5)], depth + 500.0, 0.0)
        bands = _col(spec).report()["stability_layers"]
        assert len(bands) == n + 1
        assert bands[n - 1]["top_msl_m"] == pytest.approx(depth)
        assert all(b["top_msl_m"] - b["bottom_msl_m"] <= 2000.0 for b in bands)


def test_ccl_just_above_a_kink_in_the_elr():
    # The air cools at 8 K/km until the gap to the mixing-ratio dewpoint is 0.5 K, then
    # at 3 K/km: the CCL is some 400 m above the kink, not where the lower layer's
    # trend would put it (AE96 dewpoint inverted by bisection, closed-form layers).
    t, td, p = 20.0, 12.0, 1000.0
    w = EPS * ae_es_hpa(td) / (p - ae_es_hpa(td))

    def gap(spec, z):
        e = w * _env_p(spec, z) / (EPS + w)
        return bisect(lambda x: ae_es_hpa(x) - e, -90.0, 60.0) - _env_t(spec, z)
    lower = (t, td, p, 0.0, [(None, 8.0)], 6000.0, 0.0)
    z_kink = bisect(lambda z: gap(lower, z) + 0.5, 0.0, 3000.0)      # gap 0.5 K there
    spec = (t, td, p, 0.0, [(z_kink, 8.0), (None, 3.0)], 6000.0, 0.0)
    z = bisect(lambda zz: gap(spec, zz), 0.0, 6000.0)
    assert z - z_kink > 300.0
    assert abs(_col(spec).report()["ccl_msl_m"] - z) < 0.6
