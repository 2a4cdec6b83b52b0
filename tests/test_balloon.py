"""Balloon lift: hot-air and gas balloons in one air column."""
import math

import pytest
from hypothesis import assume, given, strategies as st

from lapsecalc.column import Column
from lapsecalc.hotair import (hot_air_lift_per_m3, envelope_t_for_lift, working_envelope_t,
                              DEFAULT_MARGIN_K)
from lapsecalc.hotreport import hot_air_report
from lapsecalc.gasballoon import (gas_density, gas_lift_per_m3, gas_volume_at, molar_mass,
                                  gas_report, superheat_loss_kg)
from lapsecalc.loadtable import load_table
from refs import bisect

# Constants of the independent computations below (ICAO Doc 7488/3 unless marked).
G0 = 9.80665            # m/s2
R_DRY = 287.05287       # J/(kg K)
M_AIR = 28.9644         # g/mol, dry air
M_HE = 4.0026           # g/mol, helium (issue 6; standard atomic weight, from memory)
M_H2 = 2.016            # g/mol, hydrogen (from memory)
EPS = R_DRY / 461.5     # Rd/Rv (Wallace & Hobbs, standard textbook value)
K = 273.15
FT1000 = 304.8          # m, exact
ONE_KG = 1.0
ONE_M = 1.0


def dry_isa_column(top_m=11000.0):
    # ISA sea level (ICAO Doc 7488/3) with a dewpoint so low the air is dry to 1e-7.
    return Column(15.0, -90.0, 1013.25, 0.0, 6.5, top_m)


def moist_density(col, z):
    # Independent of balloon.py: rho = p / (Rd Tv), Tv = T / (1 - (e/p)(1 - eps))
    # (virtual temperature, Wallace & Hobbs eq. 3.60), from the column's p, T, e.
    p, t, e = col.p_at(z), col.t_at(z) + K, col.vapour_pressure_at(z)
    return 100.0 * p / (R_DRY * t / (1.0 - e / p * (1.0 - EPS)))


def hot_lift_m3(col, z, t_env_c):
    # Same pressure and humidity inside: rho_env = rho_air T_air / T_env.
    return moist_density(col, z) * (1.0 - (col.t_at(z) + K) / (t_env_c + K))


def gas_lift_m3(col, z, m_gas, purity):
    p, t = col.p_at(z), col.t_at(z) + K
    rho_gas = 100.0 * p * (purity * m_gas + (1.0 - purity) * M_AIR) / (R_DRY * M_AIR * t)
    return moist_density(col, z) - rho_gas


# ---- outside checks ----------------------------------------------------------------

def test_hot_air_100c_in_isa_sea_level():
    # Hot air at 100 degC inside against 15 degC ISA sea level outside gives about
    # 0.28 kg of gross lift per m3: computed from the ideal gas law and the ISA
    # density, ICAO Doc 7488/3 (1.2250 - 101325 / (287.05287 * 373.15) = 0.2790).
    lift = hot_air_lift_per_m3(1.2250, 1013.25, 100.0)
    assert abs(lift - 0.28) < 0.005
    assert abs(lift - (1.2250 - 101325.0 / (R_DRY * 373.15))) < 1e-9
    # The working (mean) temperature, 100 degC, is the default for a 120 degC maximum
    # (20 K margin, common practice): the same figure at the working temperature.
    r = hot_air_report(dry_isa_column(), 1000.0, 100.0, 120.0)
    assert r["envelope_t_c"] == 100.0 and not r["envelope_t_set"] and r["margin_k"] == 20.0
    assert abs(r["gross_lift_kg"] - 279.04) < 0.05
    assert abs(r["free_lift_kg"] - 179.04) < 0.05
    assert abs(r["payload_kg"] - 179.04) < 0.05
    # At the 120 degC limit: 1.2250 - 101325 / (287.05287 * 393.15) = 0.32718 kg/m3.
    assert abs(r["limit_gross_lift_kg"] - 1000.0 * (1.2250 - 101325.0 / (R_DRY * 393.15))) < 0.05
    assert abs(r["limit_payload_kg"] - (r["limit_gross_lift_kg"] - 100.0)) < 1e-9


def test_helium_lifts_a_little_over_1_kg_per_m3():
    # Helium lifts a little over 1 kg per m3 at sea level (common practice); computed
    # from the molar masses (helium 4.0026 g/mol, dry air 28.9644 g/mol and the ISA
    # density, ICAO Doc 7488/3): 1.2250 (1 - 4.0026 / 28.9644) = 1.0557 kg/m3.
    lift = gas_lift_per_m3(1.2250, 1013.25, 15.0, "helium")
    assert 1.0 < lift < 1.1
    assert abs(lift - 1.2250 * (1.0 - M_HE / M_AIR)) < 1e-6
    # Hydrogen H2, 2.016 g/mol (from memory): 1.2250 (1 - 2.016 / 28.9644) = 1.1397.
    assert abs(gas_lift_per_m3(1.2250, 1013.25, 15.0, "hydrogen")
               - 1.2250 * (1.0 - M_H2 / M_AIR)) < 1e-6
    # 95 % helium, 5 % air: the lift scales with the purity (molar masses as above).
    assert abs(gas_lift_per_m3(1.2250, 1013.25, 15.0, "helium", 0.95)
               - 0.95 * 1.2250 * (1.0 - M_HE / M_AIR)) < 1e-6
    r = gas_report(dry_isa_column(), "helium", 1.0, 100.0, 100.0, 50.0)
    assert abs(r["gross_lift_kg"] - 105.57) < 0.01


def test_gas_density_from_molar_masses():
    # rho = p M / (R* T), R* = 287.05287 * 28.9644 = 8314.32 J/(kmol K) (ICAO Doc 7488/3).
    assert abs(gas_density(1013.25, 15.0, "helium") - 101325 * M_HE / (8314.32 * 288.15)) < 1e-5
    assert molar_mass("hydrogen") == M_H2


def test_hot_air_per_1000ft_in_isa():
    # ISA troposphere (ICAO Doc 7488/3): T = 288.15 - 0.0065 h, p = p0 (T/T0)^5.25588.
    def isa_lift(h, t_env_k):
        t = 288.15 - 0.0065 * h
        p = 101325.0 * (t / 288.15) ** (G0 / (R_DRY * 0.0065))
        return p / R_DRY * (1.0 / t - 1.0 / t_env_k)
    r = hot_air_report(dry_isa_column(), 3000.0, 600.0, 110.0, 100.0, 500.0)
    want = 3000.0 * (isa_lift(500.0 + FT1000, 373.15) - isa_lift(500.0, 373.15))
    assert abs(r["gross_lift_per_1000ft_kg"] - want) < 0.01
    assert abs(r["gross_lift_kg"] - 3000.0 * isa_lift(500.0, 373.15)) < 0.01


def test_hot_air_lift_rises_with_height_under_dry_adiabatic_elr():
    # Counter-example to "lift falls with height in any ELR" for hot air at a fixed
    # envelope temperature: with a 9.8 K/km ELR, 15 degC outside and 100 degC inside,
    # the outside air cools faster than its density falls. Independent: linear-layer
    # hydrostatics p = p0 (T/T0)^(g/(R G)) with the ICAO Doc 7488/3 constants.
    col = Column(15.0, -90.0, 1013.25, 0.0, 9.8, 5000.0)

    def lift(h):
        t = 288.15 - 0.0098 * h
        p = 101325.0 * (t / 288.15) ** (G0 / (R_DRY * 0.0098))
        return p / R_DRY * (1.0 / t - 1.0 / 373.15)
    assert lift(1000.0) > lift(0.0)
    for h in (0.0, 1000.0):
        r = hot_air_report(col, 2000.0, 400.0, 120.0, 100.0, h)
        assert abs(r["gross_lift_kg"] - 2000.0 * lift(h)) < 0.01
    assert hot_air_report(col, 2000.0, 400.0, 120.0, 100.0)["gross_lift_per_1000ft_kg"] > 0.0


def test_gas_full_height_isa():
    # Gas filling half the envelope at ISA sea level is full where the ISA density is
    # half (gas at ambient T: V ~ T/p ~ 1/rho): ICAO Doc 7488/3 troposphere,
    # rho/rho0 = (T/T0)^4.25588 -> h = (1 - 0.5^(1/4.25588)) 288.15 / 0.0065.
    h = (1.0 - 0.5 ** (1.0 / (G0 / (R_DRY * 0.0065) - 1.0))) * 288.15 / 0.0065
    r = gas_report(dry_isa_column(), "helium", 1.0, 500.0, 1000.0, 100.0)
    assert abs(r["full_msl_m"] - h) < ONE_M
    assert abs(r["full_p_hpa"] - 1013.25 * ((288.15 - 0.0065 * h) / 288.15) ** 5.25588) < 0.05


def independent_profile(layers_spec, t0_c, p0_hpa, elev_m, top_m):
    # The column's (z, T, p) as a function of height, written here from the ELR spec:
    # per linear layer p = p_b (T/T_b)^(g/(R G)), isothermal p = p_b exp(-g dz / (R T))
    # (also for |G| under 1e-6 K/km, where the power form loses all its digits).
    bounds = []
    zb, tb, pb = elev_m, t0_c + K, p0_hpa
    for top_agl, rate in layers_spec:
        zt = top_m if top_agl is None else min(elev_m + top_agl, top_m)
        bounds.append((zb, zt, tb, rate / 1000.0, pb))
        tt = tb - rate / 1000.0 * (zt - zb)
        pb = pb * (math.exp(-G0 * (zt - zb) / (R_DRY * tb)) if abs(rate) < 1e-6
                   else (tt / tb) ** (G0 / (R_DRY * rate / 1000.0)))
        zb, tb = zt, tt
        if zt >= top_m:
            break

    def at(z):
        for z0, z1, t0, lapse, p0 in bounds:
            if z <= z1 or (z0, z1) == bounds[-1][:2]:
                t = t0 - lapse * (z - z0)
                if abs(lapse) < 1e-9:
                    return t, p0 * math.exp(-G0 * (z - z0) / (R_DRY * t0))
                return t, p0 * (t / t0) ** (G0 / (R_DRY * lapse))
    return at, zb


# ---- property tests (layered ELRs) ----------------------------------------------

@st.composite
def columns(draw):
    elev = draw(st.floats(0.0, 2500.0))
    t = draw(st.floats(-15.0, 40.0))
    td = t - draw(st.floats(0.0, 25.0))
    p = draw(st.floats(700.0, 1040.0))
    n = draw(st.integers(0, 3))
    spec, top = [], 0.0
    for _ in range(n):
        top += draw(st.floats(300.0, 3000.0))
        spec.append((top, draw(st.floats(-8.0, 12.0))))
    spec.append((None, draw(st.floats(2.0, 9.8))))
    top_m = elev + 9000.0
    try:
        col = Column(t, td, p, elev, spec, top_m, tropopause_m=None)
    except ValueError:
        assume(False)
    return col, spec


@given(columns(), st.floats(0.0, 1.0), st.floats(0.0, 1.0),
       st.sampled_from(("helium", "hydrogen")), st.floats(0.5, 1.0))
def test_gas_lift_per_m3_falls_with_height_in_any_elr(cs, a, b, gas, purity):
    col, _ = cs
    z1 = col.elev_m + min(a, b) * (col.top_m - col.elev_m)
    z2 = col.elev_m + max(a, b) * (col.top_m - col.elev_m)
    assume(z2 - z1 > 1.0)
    l1 = gas_lift_per_m3(col.density_at(z1), col.p_at(z1), col.t_at(z1), gas, purity)
    l2 = gas_lift_per_m3(col.density_at(z2), col.p_at(z2), col.t_at(z2), gas, purity)
    assert l2 < l1


@given(columns(), st.floats(0.0, 1.0), st.floats(60.0, 150.0))
def test_hot_air_lift_with_height_follows_the_sign_rule(cs, a, t_env):
    # d ln(lift)/dz = (1/T)(G Te / (Te - T) - g/R) for lift = p/(R T) (1 - T/Te) in a
    # layer of lapse rate G (hydrostatic equation, ideal gas; derived here): lift falls
    # with height where G Te / (Te - T) < g/R, in any ELR, and rises where it exceeds
    # g/R (steep ELRs, envelope not much warmer than the air). Cases within 20 % of
    # the boundary are skipped (the humidity cap shifts it a little).
    col, _ = cs
    z = col.elev_m + a * (col.top_m - col.elev_m - 20.0)
    layer = [lay for lay in col.layers if lay[0] <= z and z + 20.0 <= lay[1]]
    assume(layer)
    lapse = -layer[0][3]
    ta = col.t_at(z) + K
    te = t_env + K
    assume(te - ta > 5.0)
    crit = lapse * te / (te - ta) - G0 / R_DRY
    assume(abs(crit) > 0.2 * G0 / R_DRY)
    l1 = hot_air_lift_per_m3(col.density_at(z), col.p_at(z), t_env, col.vapour_pressure_at(z))
    z2 = z + 20.0
    l2 = hot_air_lift_per_m3(col.density_at(z2), col.p_at(z2), t_env, col.vapour_pressure_at(z2))
    assert (l2 < l1) == (crit < 0.0)


@given(columns(), st.floats(0.0, 1.0), st.floats(0.0, 90.0), st.floats(0.0, 90.0))
def test_hot_air_lift_rises_with_envelope_temperature(cs, a, d1, d2):
    col, _ = cs
    z = col.elev_m + a * (col.top_m - col.elev_m)
    t_air = col.t_at(z)
    t1, t2 = t_air + min(d1, d2), t_air + max(d1, d2)
    assume(t2 - t1 > 0.01 and t2 <= 150.0)
    r1 = hot_air_report(col, 2500.0, 300.0, 150.0, t1, z)
    r2 = hot_air_report(col, 2500.0, 300.0, 150.0, t2, z)
    assert r2["gross_lift_kg"] > r1["gross_lift_kg"]


def check_ceiling(col, volume, w, t_env, payload, c, above):
    # The ceiling at t_env: where lift equals weight within 1 kg (issue 6), and the
    # lowest such height (an independent 25 m scan stays above the weight).
    field = volume * hot_lift_m3(col, col.elev_m, t_env) - w
    assert abs(payload - field) < 1e-6 * w
    if field < 0.0:
        assert c is None and not above
        return
    end = col.top_m if c is None else c
    assert above == (c is None)
    if c is not None:
        assert abs(volume * hot_lift_m3(col, c, t_env) - w) < ONE_KG
    n = int((end - col.elev_m) / 25.0)
    for i in range(n + 1):
        z = col.elev_m + (end - col.elev_m) * i / max(n, 1)
        assert volume * hot_lift_m3(col, z, t_env) > w - ONE_KG


@given(columns(), st.floats(500.0, 20000.0), st.floats(0.05, 0.4), st.floats(70.0, 150.0),
       st.floats(0.0, 60.0))
def test_ceiling_is_where_lift_equals_weight(cs, volume, load, t_max, margin):
    # Both ceilings: at the working temperature (the maximum less the margin) and at
    # the maximum (the absolute limit), each against the ideal-gas lift of the test.
    col, _ = cs
    w = volume * load
    assume(t_max - margin > col.t_c + 1.0)
    r = hot_air_report(col, volume, w, t_max, None, None, margin)
    assert abs(r["envelope_t_c"] - (t_max - margin)) < 1e-9
    check_ceiling(col, volume, w, t_max - margin, r["payload_kg"], r["ceiling_msl_m"],
                  r["ceiling_above_top"])
    check_ceiling(col, volume, w, t_max, r["limit_payload_kg"], r["limit_ceiling_msl_m"],
                  r["limit_ceiling_above_top"])
    if r["payload_kg"] < 0.0:
        assert any(s.startswith("Too heavy") for s in r["warnings"])
    for c, p in ((r["ceiling_msl_m"], r["ceiling_p_hpa"]),
                 (r["limit_ceiling_msl_m"], r["limit_ceiling_p_hpa"])):
        assert (p is None) if c is None else abs(p - col.p_at(c)) < 1e-9
    # The limit is never below the working ceiling (more lift at a hotter envelope).
    if r["ceiling_msl_m"] is not None and r["limit_ceiling_msl_m"] is not None:
        assert r["limit_ceiling_msl_m"] >= r["ceiling_msl_m"] - ONE_M


@given(columns(), st.floats(0.0, 1.0), st.floats(500.0, 20000.0), st.floats(0.02, 0.6))
def test_needed_temperature_round_trip(cs, a, volume, load):
    col, _ = cs
    z = col.elev_m + a * (col.top_m - col.elev_m)
    w = volume * load
    r = hot_air_report(col, volume, w, 120.0, None, z, 0.0)
    t_need = r["envelope_t_needed_c"]
    if t_need is None:
        assert w >= volume * moist_density(col, z)
        assert r["envelope_t_needed_over_limit"] and r["warnings"]
        return
    assert abs(volume * hot_lift_m3(col, z, t_need) - w) < 1e-6 * w
    assert r["envelope_t_needed_over_limit"] == (t_need > 120.0)
    # The over-limit warning (others, e.g. too heavy at the field, may stand too).
    assert any(s.startswith("Floating") for s in r["warnings"]) == (t_need > 120.0)
    if t_need <= 120.0:
        r2 = hot_air_report(col, volume, w, 120.0, t_need, z)
        assert abs(r2["gross_lift_kg"] - w) < 1e-6 * w
        assert abs(r2["free_lift_kg"]) < 1e-6 * w


@given(columns(), st.sampled_from(("helium", "hydrogen")), st.floats(0.5, 1.0),
       st.floats(0.05, 1.0), st.floats(0.0, 1.0))
def test_gas_full_height_against_independent_profile(cs, gas, purity, fill, a):
    col, spec = cs
    at, top = independent_profile(spec, col.t_c, col.p_hpa, col.elev_m, col.top_m)
    v_env = 5000.0
    v0 = fill * v_env
    z = col.elev_m + a * (col.top_m - col.elev_m)
    r = gas_report(col, gas, purity, v0, v_env, 200.0, z)
    t0 = col.t_c + K

    def excess(h):  # volume - envelope; rises with height (rho = p/(R T) falls)
        t, p = at(h)
        return v0 * col.p_hpa / p * t / t0 - v_env
    if excess(top) < 0.0:
        assert r["full_msl_m"] is None and r["full_above_top"]
    else:
        want = col.elev_m if fill >= 1.0 else bisect(excess, col.elev_m, top)
        assert abs(r["full_msl_m"] - want) < ONE_M
        assert abs(r["full_p_hpa"] - at(want)[1]) < 0.1
    # Gross lift at z: all the gas below the full height, the full envelope above it.
    t, p = at(z)
    v_z = min(v0 * col.p_hpa / p * t / t0, v_env)
    m_gas = M_HE if gas == "helium" else M_H2
    assert abs(r["gross_lift_kg"] - v_z * gas_lift_m3(col, z, m_gas, purity)) < 0.01


@given(columns(), st.floats(0.05, 1.0), st.floats(0.3, 1.2))
def test_gas_float_height_and_ballast(cs, fill, load):
    col, _ = cs
    v_env = 2000.0
    v0 = fill * v_env
    w = load * v0  # about 0.3..1.2 kg per m3 of gas at launch
    r = gas_report(col, "helium", 0.98, v0, v_env, w)
    launch = v0 * gas_lift_m3(col, col.elev_m, M_HE, 0.98)
    assert abs(r["free_lift_kg"] - (launch - w)) < 0.01
    assert abs(r["ballast_to_hold_kg"] - max(0.0, w - launch)) < 0.01
    if launch < w:
        assert r["float_msl_m"] is None and not r["float_above_top"] and r["warnings"]
    elif r["float_msl_m"] is not None:
        f = r["float_msl_m"]
        assert f >= r["full_msl_m"]
        if f > r["full_msl_m"]:
            assert abs(v_env * gas_lift_m3(col, f, M_HE, 0.98) - w) < ONE_KG
    else:
        assert r["float_above_top"]


# ---- reports, notes and bad input -----------------------------------------------

def test_hot_air_notes_and_limit_warnings():
    col = dry_isa_column()
    r = hot_air_report(col, 2000.0, 600.0, 100.0, None, 2000.0)
    assert any("crown limit" in s and "The 100 degC maximum" in s for s in r["notes"])
    assert r["envelope_t_needed_c"] > 100.0 and r["envelope_t_needed_over_limit"]
    assert any("above the maximum envelope temperature" in s for s in r["warnings"])
    r = hot_air_report(col, 2000.0, 300.0, 100.0, 90.0)
    assert not r["envelope_t_needed_over_limit"] and not r["envelope_t_needed_over_working"]
    # Between the working temperature and the maximum: over working, not over limit.
    r = hot_air_report(col, 2000.0, 500.0, 120.0, 80.0)
    assert 80.0 < r["envelope_t_needed_c"] < 120.0
    assert r["envelope_t_needed_over_working"] and not r["envelope_t_needed_over_limit"]
    assert any("above the working temperature" in s for s in r["warnings"])
    # Margin 0: the working temperature is the limit, and the report says so.
    r = hot_air_report(col, 2000.0, 300.0, 100.0, None, None, 0.0)
    assert r["envelope_t_c"] == 100.0 and any("no margin" in s for s in r["warnings"])
    # Too heavy at the working envelope temperature: no ceiling, a warning.
    r = hot_air_report(col, 500.0, 400.0, 100.0)
    assert r["payload_kg"] < 0.0 and r["ceiling_msl_m"] is None
    assert not r["ceiling_above_top"] and r["warnings"]
    # Light enough to rise past the column top.
    r = hot_air_report(dry_isa_column(1500.0), 3000.0, 100.0, 120.0)
    assert r["ceiling_msl_m"] is None and r["ceiling_above_top"]
    assert r["limit_ceiling_msl_m"] is None and r["limit_ceiling_above_top"]


def test_gas_heavier_than_lift_needs_ballast():
    col = dry_isa_column()
    r = gas_report(col, "hydrogen", 1.0, 100.0, 400.0, 150.0, 1000.0)
    assert r["ballast_to_hold_kg"] > 0.0
    assert abs(r["ballast_to_hold_kg"] + r["free_lift_kg"]) < 1e-9
    assert r["float_msl_m"] is None and any("Hydrogen" in s for s in r["notes"])


def test_envelope_t_for_lift_inverts_lift():
    # Round trip through the closed form with a dry envelope at 850 hPa, 5 degC.
    rho = 85000.0 / (R_DRY * 278.15)
    t = envelope_t_for_lift(rho, 5.0, 0.25)
    assert abs(hot_air_lift_per_m3(rho, 850.0, t) - 0.25) < 1e-9
    assert abs(gas_volume_at(100.0, 1000.0, 15.0, 500.0, 15.0) - 200.0) < 1e-9


BAD_HOT = [
    ("volume_m3", dict(volume_m3=5.0)), ("volume_m3", dict(volume_m3=30000.0)),
    ("weight_kg", dict(weight_kg=0.5)), ("weight_kg", dict(weight_kg=float("nan"))),
    ("max_envelope_t_c", dict(max_envelope_t_c=40.0)),
    ("max_envelope_t_c", dict(max_envelope_t_c=200.0)),
    ("envelope_t_c", dict(envelope_t_c=10.0)), ("envelope_t_c", dict(envelope_t_c=151.0)),
    ("z_m", dict(z_m=-10.0)), ("z_m", dict(z_m=20000.0)), ("volume_m3", dict(volume_m3="x")),
]


@pytest.mark.parametrize("name,kw", BAD_HOT)
def test_hot_air_bad_input(name, kw):
    args = dict(volume_m3=2000.0, weight_kg=400.0, max_envelope_t_c=120.0)
    args.update(kw)
    with pytest.raises(ValueError) as err:
        hot_air_report(dry_isa_column(), **args)
    msg = str(err.value)
    assert msg.startswith(name + "=") and ".." in msg


BAD_GAS = [
    ("gas", dict(gas="neon")), ("purity", dict(purity=0.4)), ("purity", dict(purity=1.01)),
    ("gas_volume_m3", dict(gas_volume_m3=0.01)), ("gas_volume_m3", dict(gas_volume_m3=1500.0)),
    ("envelope_m3", dict(envelope_m3=3e6)), ("weight_kg", dict(weight_kg=0.0)),
    ("weight_kg", dict(weight_kg=25000.0)), ("z_m", dict(z_m=12000.0)),
]


@pytest.mark.parametrize("name,kw", BAD_GAS)
def test_gas_bad_input(name, kw):
    args = dict(gas="helium", purity=1.0, gas_volume_m3=500.0, envelope_m3=1000.0,
                weight_kg=100.0)
    args.update(kw)
    with pytest.raises(ValueError) as err:
        gas_report(dry_isa_column(), **args)
    assert str(err.value).startswith(name + "=")


def test_plain_formula_bad_input():
    for call, name in ((lambda: hot_air_lift_per_m3(0.0, 1000.0, 100.0), "rho_air_kg_m3"),
                       (lambda: hot_air_lift_per_m3(1.2, 1000.0, 100.0, 600.0), "e_hpa"),
                       (lambda: envelope_t_for_lift(1.2, 15.0, 1.2), "lift_per_m3_kg"),
                       (lambda: gas_density(1000.0, 15.0, "helium", 0.3), "purity"),
                       (lambda: gas_lift_per_m3(1.2, 1000.0, 99.0, "helium"), "t_c")):
        with pytest.raises(ValueError) as err:
            call()
        assert str(err.value).startswith(name + "=")


# ---- working temperature, load table, oxygen, superheat ------------------------------

@given(st.floats(50.0, 150.0))
def test_default_working_temperature_is_below_the_maximum(t_max):
    # The maximum is a crown limit; the mean envelope air runs below it (common
    # practice), so the default working temperature is strictly below the maximum.
    t = working_envelope_t(t_max)
    assert t < t_max and abs(t_max - t - DEFAULT_MARGIN_K) < 1e-9
    assert DEFAULT_MARGIN_K >= 10.0  # a margin a crew would notice, not a rounding
    assert working_envelope_t(t_max, None, 5.0) == t_max - 5.0
    assert working_envelope_t(t_max, t_max - 1.0) == t_max - 1.0


def test_working_temperature_above_the_maximum_is_refused():
    for call in (lambda: working_envelope_t(120.0, 130.0),
                 lambda: hot_air_report(dry_isa_column(), 2800.0, 450.0, 120.0, 130.0),
                 lambda: load_table(dry_isa_column(), 2800.0, 130.0, 120.0)):
        with pytest.raises(ValueError) as err:
            call()
        msg = str(err.value)
        assert "envelope_t_c=130" in msg and "max_envelope_t_c=120" in msg
    # Equal to the maximum is allowed (the limit itself), a hair above is not.
    assert working_envelope_t(120.0, 120.0) == 120.0
    with pytest.raises(ValueError):
        working_envelope_t(120.0, 120.001)
    with pytest.raises(ValueError) as err:
        working_envelope_t(120.0, None, 61.0)
    assert str(err.value).startswith("margin_k=")
    with pytest.raises(ValueError):
        working_envelope_t(120.0, None, -1.0)


def test_issue_example_working_against_limit():
    # 2800 m3, 700 kg, 120 degC maximum in the ISA at sea level (ICAO Doc 7488/3, dry):
    # lift per m3 = p / R (1/T - 1/Te) (ideal gas, computed here). At the 100 degC
    # working temperature the gross lift is 2800 * 101325 / 287.05287 * (1/373.15 -
    # 1/393.15) = 134.7 kg less than at the 120 degC limit.
    col = dry_isa_column()
    r = hot_air_report(col, 2800.0, 700.0, 120.0)
    gross = 2800.0 * 101325.0 / R_DRY * (1.0 / 288.15 - 1.0 / 373.15)
    limit = 2800.0 * 101325.0 / R_DRY * (1.0 / 288.15 - 1.0 / 393.15)
    assert abs(r["gross_lift_kg"] - gross) < 0.05
    assert abs(r["limit_gross_lift_kg"] - limit) < 0.05
    assert abs((limit - gross) - 134.7) < 0.1
    assert r["ceiling_msl_m"] < r["limit_ceiling_msl_m"]
    assert any("absolute limit" in n for n in r["notes"])
    assert any("crown" in n for n in r["notes"])


def field_col(col, spec, t):
    # Independent of loadtable._field_column: the column rebuilt from the test's own ELR
    # spec with the field temperature t, the same station pressure, and the dewpoint
    # kept (capped at t).
    try:
        return Column(t, min(col.td_c, t), col.p_hpa, col.elev_m, spec, col.top_m)
    except ValueError:
        return None


@given(columns(), st.lists(st.floats(-30.0, 45.0), min_size=1, max_size=6),
       st.floats(60.0, 150.0), st.floats(100.0, 1500.0))
def test_load_table_cells_equal_direct_lift(cs, temps, t_env, step):
    # Every cell is the lift computed directly (ideal gas with the virtual
    # temperature, Wallace & Hobbs eq. 3.60, in the test's own column at that field
    # temperature) times the volume.
    col, spec = cs
    tab = load_table(col, 2800.0, t_env, None, None, temps, None, step)
    assert tab["temps_c"] == temps
    hs = tab["heights_msl_m"]
    assert hs[0] == col.elev_m and hs[-1] <= min(col.top_m, col.elev_m + 3000.0)
    assert all(b > a for a, b in zip(hs, hs[1:]))
    assert len(tab["gross_kg"]) == len(hs)
    for z, row in zip(hs, tab["gross_kg"]):
        assert len(row) == len(temps)
        for t, g in zip(temps, row):
            c = field_col(col, spec, t)
            if c is None or z > c.top_m:
                assert g is None
                continue
            assert abs(g - 2800.0 * hot_lift_m3(c, z, t_env)) < 1e-6 * 2800.0
    # The column's own field temperature gives the report's own lift.
    tab = load_table(col, 2800.0, t_env, None, None, [col.t_c], [col.elev_m])
    assert abs(tab["gross_kg"][0][0] - 2800.0 * hot_lift_m3(col, col.elev_m, t_env)) < 1e-6


@given(columns(), st.floats(-30.0, 40.0), st.floats(0.5, 10.0), st.floats(0.0, 1.0),
       st.floats(60.0, 150.0))
def test_load_table_falls_with_warmer_field(cs, t, dt, a, t_env):
    # Warmer field air at a fixed envelope temperature: lift = p/R (1/T - 1/Te) at a
    # height dz above the field, with p(z) from the shifted column. d ln(lift)/dT0 =
    # (1/T)(g dz/(R T0) - 1 - T/(Te - T)) (hydrostatic equation, ideal gas; derived
    # here): negative when dz < R T0 / g (8 km and more), which every row below 5 km
    # above the field meets. The humidity rule keeps the dewpoint, so the sign holds
    # for moist columns too (vapour shifts the magnitude, not the sign, at 1 K and up).
    col, spec = cs
    z = col.elev_m + a * min(5000.0, col.top_m - col.elev_m)
    tab = load_table(col, 2800.0, t_env, None, None, [t, t + dt], [z])
    g1, g2 = tab["gross_kg"][0]
    assume(g1 is not None and g2 is not None)
    assume(field_col(col, spec, t).t_at(z) + K + 5.0 < t_env + K)
    assert g2 < g1


@given(columns(), st.floats(-20.0, 40.0), st.floats(60.0, 150.0), st.floats(100.0, 1000.0))
def test_load_table_with_height_follows_the_sign_rule(cs, t, t_env, step):
    # With height, the rule this project found for hot envelopes (see
    # test_hot_air_lift_with_height_follows_the_sign_rule): lift falls where
    # G Te / (Te - T) < g/R in every layer between two rows, and rises where it
    # exceeds g/R in all of them. Pairs within 20 % of the boundary are skipped.
    col, spec = cs
    tab = load_table(col, 2800.0, t_env, None, None, [t], None, step)
    c = field_col(col, spec, t)
    te = t_env + K
    hs = tab["heights_msl_m"]
    for i in range(len(hs) - 1):
        g1, g2 = tab["gross_kg"][i][0], tab["gross_kg"][i + 1][0]
        if g1 is None or g2 is None:
            continue
        signs = []
        for z0, z1, _, grad, _ in c.layers:
            lo, hi = max(z0, hs[i]), min(z1, hs[i + 1])
            if hi <= lo:
                continue
            for zz in (lo, hi):
                ta = c.t_at(zz) + K
                crit = (-grad * te / (te - ta) - G0 / R_DRY) if te - ta > 5.0 else None
                signs.append(None if crit is None or abs(crit) < 0.2 * G0 / R_DRY
                             else crit < 0.0)
        if signs and all(x is True for x in signs):
            assert g2 < g1
        elif signs and all(x is False for x in signs):
            assert g2 > g1


def test_load_table_rows_and_payload():
    # Steep 9.8 K/km-free ISA column (ICAO Doc 7488/3); payload = gross - empty weight
    # in every cell, and the rows run from the field to the last height where some
    # field temperature still lifts the empty balloon.
    col = Column(15.0, 5.0, 1013.25, 300.0, 6.5, 11000.0)
    tab = load_table(col, 2800.0, 100.0, 120.0, 500.0)
    assert tab["heights_msl_m"][:3] == [300.0, 500.0, 1000.0]
    for grow, prow in zip(tab["gross_kg"], tab["payload_kg"]):
        for g, p in zip(grow, prow):
            assert abs(p - (g - 500.0)) < 1e-9
    assert any(p >= 0.0 for p in tab["payload_kg"][-1])
    nxt = tab["heights_msl_m"][-1] + 500.0
    beyond = load_table(col, 2800.0, 100.0, 120.0, 500.0, TEMPS, [nxt])["payload_kg"][0]
    assert all(p < 0.0 for p in beyond)
    # Colder air lifts more: the -10 degC column is the first to reach the top row.
    assert tab["payload_kg"][-1][0] == max(tab["payload_kg"][-1])
    # No empty weight: no payload, 3000 m of rows by default.
    tab = load_table(col, 2800.0, 100.0)
    assert tab["payload_kg"] is None and tab["heights_msl_m"][-1] == 3000.0
    # Default field temperatures -10..40 degC by 10 (the 40-column screen's six).
    assert tab["temps_c"] == [-10.0, 0.0, 10.0, 20.0, 30.0, 40.0]
    # From a sea-level field the rows end exactly at the 3000 m default depth.
    isa = dry_isa_column()
    assert load_table(isa, 2800.0, 100.0)["heights_msl_m"] == [0.0, 500.0, 1000.0, 1500.0,
                                                               2000.0, 2500.0, 3000.0]
    # An empty weight no field temperature lifts: only the field row stays, all "-".
    heavy = load_table(isa, 500.0, 100.0, None, 5000.0)
    assert heavy["heights_msl_m"] == [0.0] and all(p < 0.0 for p in heavy["payload_kg"][0])
    # Forty temperatures or rows at most; a step of at least 50 m.
    assert len(load_table(isa, 500.0, 100.0, None, None, [10.0] * 40, [0.0])["temps_c"]) == 40
    for kw, name in ((dict(temps_c=[10.0] * 41), "temps_c"),
                     (dict(heights_msl_m=[0.0] * 41), "heights_msl_m"),
                     (dict(heights_msl_m=[]), "heights_msl_m"),
                     (dict(step_m=49.0), "step_m"), (dict(depth_m=40001.0), "depth_m")):
        with pytest.raises(ValueError) as err:
            load_table(isa, 500.0, 100.0, **kw)
        assert str(err.value).startswith(name)
    with pytest.raises(ValueError) as err:
        load_table(col, 2800.0, 100.0, None, None, [])
    assert str(err.value).startswith("temps_c")
    with pytest.raises(ValueError) as err:
        load_table(col, 2800.0, 100.0, None, None, [70.0])
    assert str(err.value).startswith("t_c=70")


TEMPS = (-10.0, 0.0, 10.0, 20.0, 30.0, 40.0)


def test_oxygen_note_at_the_common_heights():
    # Supplemental oxygen is commonly required above 10000 ft pressure altitude for
    # more than 30 min and above 13000 ft at all times (common practice). In the ISA
    # (ICAO Doc 7488/3) pressure altitude equals the height: 3000 m = 9843 ft (no
    # note), 3100 m = 10171 ft, 4000 m = 13123 ft.
    col = dry_isa_column()
    heavy = 2000.0  # 2800 m3 at 100 degC cannot lift 2000 kg: no ceiling to pass
    r = hot_air_report(col, 2800.0, heavy, 120.0, None, 3000.0)
    assert r["oxygen_note"] is None
    r = hot_air_report(col, 2800.0, heavy, 120.0, None, 3100.0)
    assert "passes 10000 ft" in r["oxygen_note"] and "13000 ft always" in r["oxygen_note"]
    assert "local regulations" in r["oxygen_note"] and r["oxygen_note"] in r["warnings"]
    assert "10171 ft" in r["oxygen_note"]
    r = hot_air_report(col, 2800.0, heavy, 120.0, None, 4000.0)
    assert "passes 13000 ft" in r["oxygen_note"]
    # A light balloon's ceiling passes the heights even from the field.
    r = hot_air_report(col, 2800.0, 500.0, 120.0)
    assert r["ceiling_msl_m"] > 3962.4 and "ceiling" in r["oxygen_note"]
    # A gas balloon: the planned height, or the float height (ISA: 1000 m3 of helium
    # from a half-full envelope floats 800 kg near 9 km, above 13000 ft; ICAO Doc 7488/3).
    g = gas_report(col, "helium", 1.0, 1000.0, 2000.0, 800.0, 1000.0)
    assert g["float_msl_m"] > 3962.4 and "float height" in g["oxygen_note"]
    assert g["oxygen_note"] in g["warnings"]
    g = gas_report(col, "helium", 1.0, 1000.0, 1000.0, 1050.0, 1000.0)
    assert g["float_msl_m"] < 3000.0 and g["oxygen_note"] is None
    assert "planned height" in gas_report(col, "helium", 1.0, 1000.0, 1000.0, 1050.0,
                                          3100.0)["oxygen_note"]
    assert load_table(col, 2800.0, 100.0, None, None, TEMPS, [0.0, 3000.0])["oxygen_note"] is None
    assert load_table(col, 2800.0, 100.0, None, None, TEMPS, [0.0, 3200.0])["oxygen_note"]


def superheat_gross(col, v0, v_env, z, dt, m_gas, purity):
    # Ideal gas, written here: the gas filled v0 at the field at the air temperature;
    # at z it is at p(z) and T(z) + dt, so V = v0 (p0 / p) (T + dt) / T0 until the
    # envelope is full; lift = V (rho_air - p M / (R* (T + dt))), R* = 8314.32.
    p, t = col.p_at(z), col.t_at(z) + K
    v = min(v0 * col.p_hpa / p * (t + dt) / (col.t_c + K), v_env)
    m = purity * m_gas + (1.0 - purity) * M_AIR
    rho_gas = 100.0 * p * m / (R_DRY * M_AIR * (t + dt))
    return v, v * (moist_density(col, z) - rho_gas), v * rho_gas


@given(columns(), st.floats(0.05, 1.0), st.floats(0.0, 1.0), st.floats(0.0, 50.0),
       st.sampled_from(("helium", "hydrogen")), st.floats(0.5, 1.0))
def test_superheat_against_the_ideal_gas_law(cs, fill, a, dt, gas, purity):
    col, _ = cs
    z = col.elev_m + a * (col.top_m - col.elev_m)
    v_env = 3000.0
    r = gas_report(col, gas, purity, fill * v_env, v_env, 200.0, z, dt)
    m_gas = M_HE if gas == "helium" else M_H2
    v, lift, mass = superheat_gross(col, fill * v_env, v_env, z, dt, m_gas, purity)
    _, lift0, _ = superheat_gross(col, fill * v_env, v_env, z, 0.0, m_gas, purity)
    assert abs(r["gross_lift_kg"] - lift) < 0.01
    assert abs(r["superheat_lift_kg"] - (lift - lift0)) < 0.01
    assert r["superheat_k"] == dt and abs(r["gas_t_c"] - col.t_at(z) - dt) < 1e-9
    # Sunset: the same gas mass cooled to the air at the same pressure displaces
    # mass / rho_gas(T) of air; the lift lost is the ballast to hold level.
    p, t = col.p_at(z), col.t_at(z) + K
    m = purity * m_gas + (1.0 - purity) * M_AIR
    v_cool = mass / (100.0 * p * m / (R_DRY * M_AIR * t))
    lost = lift - (v_cool * moist_density(col, z) - mass)
    assert abs(r["ballast_superheat_lost_kg"] - lost) < 0.01
    if not r["full_at_z"]:
        # Slack envelope: nothing vented, so the ballast equals the lift gained.
        assert abs(r["ballast_superheat_lost_kg"] - r["superheat_lift_kg"]) < 0.01
    else:
        # Gas vented while warm: the cooling costs more than the sun gave.
        assert r["ballast_superheat_lost_kg"] >= r["superheat_lift_kg"] - 1e-9


def test_superheat_worked_example():
    # 1000 m3 of helium in the ISA at sea level (ICAO Doc 7488/3, dry), 15 K superheat,
    # envelope large enough to stay slack: the gas expands by 303.15/288.15, so the
    # lift gained is rho V dT / T = 1.2250 * 1000 * 15 / 288.15 = 63.77 kg, and the
    # ballast at sunset equals it (ideal gas, computed here).
    col = dry_isa_column()
    r = gas_report(col, "helium", 1.0, 1000.0, 2000.0, 500.0, None, 15.0)
    assert abs(r["superheat_lift_kg"] - 63.77) < 0.02
    assert abs(r["ballast_superheat_lost_kg"] - 63.77) < 0.02
    assert abs(superheat_loss_kg(1.2250, 15.0, 1000.0 * 303.15 / 288.15, 15.0) - 63.77) < 0.02
    assert gas_report(col, "helium", 1.0, 1000.0, 2000.0, 500.0)["ballast_superheat_lost_kg"] == 0.0
    # The superheat lowers the pressure height: full where V0 (p0/p)(T+15)/T0 = Venv.
    r0 = gas_report(col, "helium", 1.0, 1000.0, 2000.0, 500.0)
    assert r["full_msl_m"] < r0["full_msl_m"]
    z = r["full_msl_m"]
    v = 1000.0 * 1013.25 / col.p_at(z) * (col.t_at(z) + K + 15.0) / 288.15
    assert abs(v - 2000.0) < 0.1
    # Full at launch once the superheat swells a tight fill past the envelope.
    assert gas_report(col, "helium", 1.0, 1000.0, 1040.0, 500.0, None, 15.0)["full_msl_m"] == 0.0
    assert gas_report(col, "helium", 1.0, 1000.0, 1040.0, 500.0)["full_msl_m"] > 0.0
    with pytest.raises(ValueError) as err:
        gas_report(col, "helium", 1.0, 1000.0, 2000.0, 500.0, None, 51.0)
    assert str(err.value).startswith("superheat_k=")


def test_oxygen_note_names_the_first_of_the_highest_pressure_altitudes():
    # ISA + 20 K at the field (35 degC, 1013.25 hPa, 6.5 K/km; ICAO Doc 7488/3 for the
    # pressure altitude): warm air, so the pressure altitude lies below the height.
    from lapsecalc.balloon import oxygen_note
    from lapsecalc.standard import pressure_altitude
    col = Column.from_qnh(35.0, 5.0, 1013.25, 0.0, 6.5, 16000.0)
    pa = pressure_altitude(col.p_at(4100.0))
    assert 3048.0 < pressure_altitude(col.p_at(4000.0)) < pa < 3962.4 < 4000.0
    note = oxygen_note(col, [("lower", 4000.0), ("upper", 4100.0), ("none", None)])
    assert note.startswith("Oxygen: the upper, 4100 m MSL (%.0f ft pressure altitude),"
                           " passes 10000 ft;" % (pa / 0.3048))
    assert oxygen_note(col, [("first", 4500.0), ("second", 4500.0)]).startswith(
        "Oxygen: the first, 4500 m MSL") and "passes 13000 ft" in oxygen_note(
        col, [("first", 4500.0)])
    assert oxygen_note(col, [("low", 2000.0), ("none", None)]) is None
