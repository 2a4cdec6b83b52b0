"""Balloon lift in one air column: hot-air balloons and gas (helium, hydrogen) balloons."""
# Sources:
#   Archimedes' principle with the ideal gas law: gross lift = mass of the displaced
#     air - mass of the gas inside, per m3 the difference of the two densities.
#   ICAO Doc 7488/3: gas constant of dry air (constants.R_DRY) and molar mass of dry
#     air, 28.9644 g/mol; the two give the universal gas constant 8314.32 J/(kmol K).
#   Moist air through the virtual temperature (Wallace & Hobbs, Atmospheric Science,
#     2nd ed., eq. 3.60), as in standard._density and Column.density_at.
#   Molar masses of helium and hydrogen: from memory (below).
#   Zero-pressure gas balloon: the gas is at the ambient pressure, the volume grows
#     as T/p until the envelope is full, then gas vents through the open appendix
#     (common practice).
# Assumptions (stated in the reports' notes):
#   Hot air: the envelope holds ambient air heated at the same pressure with the same
#     vapour pressure (the same mixing ratio); burner exhaust (water vapour, CO2) is
#     not modelled. Then rho_envelope = rho_air * T_air / T_envelope exactly.
#   Gas: the gas is at the ambient temperature (no superheat in sunshine) and dry;
#     its impurity is dry air; purity is a volume (mole) fraction.
from math import isfinite
from lapsecalc.constants import R_DRY, T0_K
from lapsecalc.limits import check, check_p
from lapsecalc.standard import _density

# Molar masses, g/mol (= kg/kmol).
M_AIR_G_MOL = 28.9644       # dry air, ICAO Doc 7488/3
M_HELIUM_G_MOL = 4.0026     # helium, standard atomic weight rounded (from memory)
M_HYDROGEN_G_MOL = 2.016    # hydrogen H2, twice the atomic weight 1.008 (from memory)

# Input ranges.
# Hot-air envelope, m3: 10 admits model balloons; 20000 is above the largest passenger
# envelopes (about 17000 m3, 600000 ft3; from memory).
HOT_VOLUME_MIN_M3 = 10.0
HOT_VOLUME_MAX_M3 = 20000.0
# Gas envelope, m3: 0.1 admits pilot and toy balloons; 2e6 admits the largest
# zero-pressure research balloons (about 1.1e6 m3; from memory). The gas at launch is
# at most 100000 m3 (a research balloon launches with a small part of its volume).
GAS_VOLUME_MIN_M3 = 0.1
GAS_VOLUME_MAX_M3 = 100000.0
ENVELOPE_MAX_M3 = 2.0e6
# Total weight, kg: a hot-air balloon weighs at least its fabric (1 kg admits models);
# a small gas balloon can weigh grams. 20000 kg is above anything these volumes lift.
HOT_WEIGHT_MIN_KG = 1.0
GAS_WEIGHT_MIN_KG = 0.01
WEIGHT_MAX_KG = 20000.0
# Maximum envelope temperature, degC, the maker's figure set by the user: makers of
# nylon envelopes state about 120-125 degC (from memory); 50..150 admits every
# rating we know of with room, and 50 is the least that lifts anything on a hot day.
MAX_ENVELOPE_T_MIN_C = 50.0
MAX_ENVELOPE_T_MAX_C = 150.0
# An envelope temperature asked for runs from the ambient temperature up to this, degC.
ENVELOPE_T_MAX_C = 150.0
# Purity of the lifting gas, volume fraction; below one half it is mostly air.
PURITY_MIN = 0.5
# Densities the plain formulas accept, kg/m3 (ISA at 32 km is 0.0132; -90 degC air at
# 1100 hPa is 2.09).
RHO_MIN_KG_M3 = 0.001
RHO_MAX_KG_M3 = 2.5
# Heights: the per-1000-ft changes are taken over this step, m (1000 ft exact).
FT1000_M = 304.8
# Height solvers: scan steps of at most _SCAN_M (also ending at every ELR layer top),
# then bisection until the bracket is narrower than _TOL_M (float32 resolves about
# 0.004 m at 32 km), at most _CAP steps.
_SCAN_M = 500.0
_TOL_M = 0.1
_CAP = 40


def molar_mass(gas):
    """Molar mass, g/mol, of the lifting gas "helium" or "hydrogen" (from memory)."""
    if gas == "helium":
        return M_HELIUM_G_MOL
    if gas == "hydrogen":
        return M_HYDROGEN_G_MOL
    raise ValueError("gas=%r is not known; allowed helium or hydrogen" % (gas,))


def hot_air_lift_per_m3(rho_air_kg_m3, p_hpa, envelope_t_c, e_hpa=0.0):
    """Gross lift, kg per m3 of envelope: ambient density rho_air_kg_m3 (0.001..2.5)
    less the density of the envelope air at envelope_t_c degC (-90..150) and the same
    pressure p_hpa (1..1100), holding vapour pressure e_hpa (0 = dry; up to half of p).

    Ideal gas with the virtual temperature (standard._density); negative when the
    envelope air is denser than the air outside.
    """
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    p = check_p("p_hpa", p_hpa)
    t = check("envelope_t_c", envelope_t_c, -90.0, ENVELOPE_T_MAX_C, "degC")
    e = check("e_hpa", e_hpa, 0.0, 0.5 * p, "hPa (up to half of p_hpa)")
    return rho - _density(p, t, e)


def envelope_t_for_lift(rho_air_kg_m3, t_air_c, lift_per_m3_kg):
    """Envelope temperature, degC, that gives a gross lift of lift_per_m3_kg (0 up to,
    not including, rho_air_kg_m3) in air of density rho_air_kg_m3 and temperature
    t_air_c (-90..60 degC), the envelope holding that air heated at the same pressure.

    Same pressure and vapour pressure make the virtual factor cancel:
    rho_env = rho_air T_air / T_env, so T_env = T_air / (1 - lift / rho_air) exactly
    (no iteration). Inverse of hot_air_lift_per_m3 with e_hpa the ambient value.
    """
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    t_air = check("t_air_c", t_air_c, -90.0, 60.0, "degC")
    lift = check("lift_per_m3_kg", lift_per_m3_kg, 0.0, rho, "kg/m3 (below the air density)")
    if lift >= rho:
        raise ValueError("lift_per_m3_kg=%g needs an infinitely hot envelope; allowed"
                         " 0..%g kg/m3 (below the air density)" % (lift, rho))
    return (t_air + T0_K) / (1.0 - lift / rho) - T0_K


def gas_density(p_hpa, t_c, gas, purity=1.0):
    """Density, kg/m3, of the lifting gas ("helium" or "hydrogen", volume fraction
    purity 0.5..1, the rest dry air) at p_hpa (1..1100) and t_c degC (-90..60).

    Ideal gas: rho = p M / (R* T) with R* = R_DRY * M_air (ICAO Doc 7488/3), so
    rho = rho_dry_air(p, T) * (purity M_gas / M_air + 1 - purity).
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    p = check_p("p_hpa", p_hpa)
    t = check("t_c", t_c, -90.0, 60.0, "degC")
    return 100.0 * p / (R_DRY * (t + T0_K)) * (f * m_gas / M_AIR_G_MOL + 1.0 - f)


def gas_lift_per_m3(rho_air_kg_m3, p_hpa, t_c, gas, purity=1.0):
    """Gross lift, kg per m3 of gas at the ambient p_hpa and t_c: ambient density
    rho_air_kg_m3 (0.001..2.5, moist or dry) less gas_density(p_hpa, t_c, gas, purity).
    Pure helium in the ISA at sea level: 1.0557 kg/m3."""
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    return rho - gas_density(p_hpa, t_c, gas, purity)


def gas_volume_at(v0_m3, p0_hpa, t0_c, p_hpa, t_c):
    """Volume, m3, of a gas that filled v0_m3 at (p0_hpa, t0_c) once it is at
    (p_hpa, t_c): V = V0 (p0 / p) (T / T0), ideal gas at constant mass."""
    return v0_m3 * p0_hpa / p_hpa * (t_c + T0_K) / (t0_c + T0_K)


def first_drop(col, f, z_from_m):
    """Lowest height, m MSL, at or above z_from_m where f(z) (f(z_from_m) >= 0) falls
    to zero, or None when f stays at or above zero up to the column top.

    Scans the column in steps of at most 500 m that also end at every ELR layer top,
    then bisects the first step whose top has f < 0 until the bracket is under 0.1 m
    (at most 40 steps; ValueError if not). Sound when f has no minimum inside a step:
    inside one linear layer, gas lift falls monotonically and hot-air lift at a fixed
    envelope temperature either falls or rises to one maximum and then falls.
    """
    z = z_from_m
    fz = f(z)
    if not isfinite(fz):
        raise ValueError("first_drop: f(%g m) is not finite" % z)
    for _, z_layer_top, _, _, _ in col.layers:
        while z < z_layer_top:
            z_next = z + _SCAN_M
            if z_next > z_layer_top:
                z_next = z_layer_top
            f_next = f(z_next)
            if f_next < 0.0:
                return _bisect(f, z, z_next)
            z = z_next
    return None


def _bisect(f, lo, hi):
    # f(lo) >= 0 > f(hi); bisection to _TOL_M, at most _CAP steps.
    for _ in range(_CAP):
        if hi - lo < _TOL_M:
            return 0.5 * (lo + hi)
        mid = 0.5 * (lo + hi)
        f_mid = f(mid)
        if not isfinite(f_mid):
            raise ValueError("first_drop: f(%g m) is not finite" % mid)
        if f_mid < 0.0:
            hi = mid
        else:
            lo = mid
    if hi - lo < _TOL_M:
        return 0.5 * (lo + hi)
    raise ValueError("first_drop did not converge between %g and %g m" % (lo, hi))


def _air(col, z_m):
    # (p_hpa, t_c, e_hpa, rho_kg_m3) of the column at z_m, each computed once.
    p = col.p_at(z_m)
    t = col.t_at(z_m)
    e = col.vapour_pressure_at(z_m)
    return p, t, e, _density(p, t, e)


def _hot_lift(col, z_m, envelope_t_c):
    # Gross lift, kg/m3, at z_m of ambient air heated to envelope_t_c.
    p, t, e, rho = _air(col, z_m)
    return hot_air_lift_per_m3(rho, p, envelope_t_c, e)


def _t_needed(col, z_m, lift_per_m3_kg):
    # Envelope temperature, degC, for lift_per_m3_kg at z_m; None if none suffices.
    _, t, _, rho = _air(col, z_m)
    if lift_per_m3_kg >= rho:
        return None
    return envelope_t_for_lift(rho, t, lift_per_m3_kg)


def _z(col, z_m):
    if z_m is None:
        return col.elev_m
    return check("z_m", z_m, col.elev_m, col.top_m, "m MSL (the column)")


def _per_1000ft(col, z_m, f):
    # Change of f over the 1000 ft above z_m (the 1000 ft below it near the column
    # top; the whole column if it is shallower), scaled to 1000 ft. None if f is.
    za = z_m
    zb = z_m + FT1000_M
    if zb > col.top_m:
        zb = col.top_m
        za = zb - FT1000_M
        if za < col.elev_m:
            za = col.elev_m
    fa, fb = f(za), f(zb)
    if fa is None or fb is None:
        return None
    return (fb - fa) * FT1000_M / (zb - za)


def hot_air_report(col, volume_m3, weight_kg, max_envelope_t_c, envelope_t_c=None, z_m=None):
    """Hot-air balloon in the column col (a Column): a dict of plain values.

    volume_m3 10..20000; weight_kg 1..20000, everything that flies (envelope, basket,
    burners, fuel, people); max_envelope_t_c 50..150 degC, the envelope maker's figure,
    set by the user; envelope_t_c (default max_envelope_t_c) from the ambient
    temperature at z up to 150 degC; z_m MSL inside the column (default the field).

    Keys: z_msl_m, ambient_t_c, ambient_p_hpa, ambient_density_kg_m3, volume_m3,
    weight_kg, max_envelope_t_c, envelope_t_c, lift_per_m3_kg and gross_lift_kg (at z
    and envelope_t_c), free_lift_kg (gross less weight), max_payload_kg (gross less
    weight at the field at max_envelope_t_c: the most extra load that still takes off;
    negative = that much too heavy), envelope_t_needed_c (floats the weight at z; None
    if no temperature does), envelope_t_needed_over_limit (bool), ceiling_msl_m and
    ceiling_p_hpa (lowest height where the lift at max_envelope_t_c falls to the
    weight; None if it cannot take off or if the ceiling is above the column top),
    ceiling_above_top (bool), gross_lift_per_1000ft_kg and
    envelope_t_needed_per_1000ft_c (change over the 1000 ft above z), notes (tuple of
    str), warnings (tuple of str, empty when none).
    """
    v = check("volume_m3", volume_m3, HOT_VOLUME_MIN_M3, HOT_VOLUME_MAX_M3, "m3")
    w = check("weight_kg", weight_kg, HOT_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    t_max = check("max_envelope_t_c", max_envelope_t_c, MAX_ENVELOPE_T_MIN_C,
                  MAX_ENVELOPE_T_MAX_C, "degC (the envelope maker's figure)")
    z = _z(col, z_m)
    p, t_air, e, rho = _air(col, z)
    if envelope_t_c is None:
        t_env = t_max
        if t_env < t_air:
            raise ValueError("max_envelope_t_c=%g is below the ambient %.1f degC at %.0f m MSL;"
                             " allowed %.1f..%g degC" % (t_max, t_air, z, t_air, ENVELOPE_T_MAX_C))
    else:
        t_env = check("envelope_t_c", envelope_t_c, t_air, ENVELOPE_T_MAX_C,
                      "degC (from the ambient temperature at z)")
    lift = hot_air_lift_per_m3(rho, p, t_env, e)
    need = w / v
    t_need = _t_needed(col, z, need)
    payload = v * _hot_lift(col, col.elev_m, t_max) - w
    ceiling = None
    above = False
    if payload >= 0.0:
        ceiling = first_drop(col, lambda zz: v * _hot_lift(col, zz, t_max) - w, col.elev_m)
        above = ceiling is None
    warnings = []
    if payload < 0.0:
        warnings.append("Too heavy to take off at the maximum envelope temperature %.0f degC:"
                        " %.0f kg over." % (t_max, -payload))
    if t_need is None:
        warnings.append("No envelope temperature floats %.0f kg at %.0f m MSL." % (w, z))
    elif t_need > t_max:
        warnings.append("Floating %.0f kg at %.0f m MSL needs %.1f degC in the envelope, above"
                        " the maximum envelope temperature %.0f degC you set."
                        % (w, z, t_need, t_max))
    if t_env > t_max:
        warnings.append("The envelope temperature asked for, %.1f degC, is above the maximum"
                        " envelope temperature %.0f degC you set." % (t_env, t_max))
    if above:
        warnings.append("The ceiling lies above the column top (%.0f m MSL)." % col.top_m)
    return {
        "z_msl_m": z,
        "ambient_t_c": t_air,
        "ambient_p_hpa": p,
        "ambient_density_kg_m3": rho,
        "volume_m3": v,
        "weight_kg": w,
        "max_envelope_t_c": t_max,
        "envelope_t_c": t_env,
        "lift_per_m3_kg": lift,
        "gross_lift_kg": v * lift,
        "free_lift_kg": v * lift - w,
        "max_payload_kg": payload,
        "envelope_t_needed_c": t_need,
        "envelope_t_needed_over_limit": t_need is None or t_need > t_max,
        "ceiling_msl_m": ceiling,
        "ceiling_p_hpa": None if ceiling is None else col.p_at(ceiling),
        "ceiling_above_top": above,
        "gross_lift_per_1000ft_kg": _per_1000ft(col, z, lambda zz: v * _hot_lift(col, zz, t_env)),
        "envelope_t_needed_per_1000ft_c": _per_1000ft(col, z, lambda zz: _t_needed(col, zz, need)),
        "notes": (
            "The maximum envelope temperature, %.0f degC, is the envelope maker's figure as"
            " you set it; lapsecalc does not know your envelope." % t_max,
            "Envelope air is taken as the outside air heated at the same pressure with the"
            " same humidity; burner exhaust and heat losses are not modelled.",
            "Lift comes from the assumed lapse rate, not a sounding; the real air differs.",
        ),
        "warnings": tuple(warnings),
    }


def gas_report(col, gas, purity, gas_volume_m3, envelope_m3, weight_kg, z_m=None):
    """Zero-pressure gas balloon in the column col (a Column): a dict of plain values.

    gas "helium" or "hydrogen"; purity 0.5..1 (volume fraction, the rest air);
    gas_volume_m3 0.1..100000, the gas volume at the field at launch (not more than
    the envelope); envelope_m3 0.1..2e6, the full envelope; weight_kg 0.01..20000,
    everything that flies except the gas, ballast included; z_m MSL (default field).

    The gas is at the ambient pressure and temperature; below the full height all of
    it is aboard and its volume grows as T/p; above, the envelope stays full and the
    excess vents (the balloon is assumed to have climbed straight from the field).

    Keys: z_msl_m, ambient_t_c, ambient_p_hpa, ambient_density_kg_m3, gas, purity,
    gas_density_kg_m3, lift_per_m3_kg (at z), gas_volume_at_z_m3, full_at_z (bool),
    gross_lift_kg, free_lift_kg (gross less weight at z), full_msl_m and full_p_hpa
    (where the gas fills the envelope: the pressure height, zero-pressure ceiling;
    None when above the column top), full_above_top (bool), float_msl_m (where the
    full envelope's lift equals the weight, at or above the full height; None if it
    cannot take off or it is above the column top), float_above_top (bool),
    ballast_to_hold_kg (ballast to drop at z to stop sinking there: weight less gross
    lift, 0 when the free lift is positive; then free_lift_kg is the lift to spend,
    by valving gas, to hold z), gross_lift_per_1000ft_kg, notes, warnings.
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    v_env = check("envelope_m3", envelope_m3, GAS_VOLUME_MIN_M3, ENVELOPE_MAX_M3, "m3")
    v0 = check("gas_volume_m3", gas_volume_m3, GAS_VOLUME_MIN_M3, min(v_env, GAS_VOLUME_MAX_M3),
               "m3 (not more than envelope_m3)")
    w = check("weight_kg", weight_kg, GAS_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    z = _z(col, z_m)
    p0, t0 = col.p_hpa, col.t_c

    def volume(zz):
        return gas_volume_at(v0, p0, t0, col.p_at(zz), col.t_at(zz))

    def lift_m3(zz):
        pp, tt, _, rr = _air(col, zz)
        return gas_lift_per_m3(rr, pp, tt, gas, f)

    def gross(zz):
        return min(volume(zz), v_env) * lift_m3(zz)

    p, t_air, _, rho = _air(col, z)
    v_z = volume(z)
    g_z = gross(z)
    lift_off = gross(col.elev_m) >= w
    if v0 >= v_env:
        full = col.elev_m
    else:
        full = first_drop(col, lambda zz: v_env - volume(zz), col.elev_m)
    flt = None
    if lift_off and full is not None:
        if v_env * lift_m3(full) < w:
            flt = full
        else:
            flt = first_drop(col, lambda zz: v_env * lift_m3(zz) - w, full)
    flt_above = lift_off and flt is None
    warnings = []
    if not lift_off:
        warnings.append("No lift-off: the gas lifts %.1f kg, %.1f kg less than the weight."
                        % (gross(col.elev_m), w - gross(col.elev_m)))
    if full is None:
        warnings.append("The envelope is not full below the column top (%.0f m MSL)." % col.top_m)
    notes = [
        "The gas is taken at the outside temperature and pressure (no warming in sunshine,"
        " no cooling at night); its impurity is dry air.",
        "Zero-pressure envelope: below the full height all the gas is aboard and the lift"
        " hardly changes; above it gas vents and the lift falls with the air density.",
        "ballast_to_hold_kg is the ballast to drop at this height to stop sinking there;"
        " with free lift, valve gas instead.",
    ]
    if gas == "hydrogen":
        notes.append("Hydrogen burns in air: handle it under the rules that apply to it.")
    return {
        "z_msl_m": z,
        "ambient_t_c": t_air,
        "ambient_p_hpa": p,
        "ambient_density_kg_m3": rho,
        "gas": gas,
        "gas_molar_mass_g_mol": m_gas,
        "purity": f,
        "gas_volume_m3": v0,
        "envelope_m3": v_env,
        "weight_kg": w,
        "gas_density_kg_m3": gas_density(p, t_air, gas, f),
        "lift_per_m3_kg": lift_m3(z),
        "gas_volume_at_z_m3": v_z if v_z < v_env else v_env,
        "full_at_z": full is not None and z >= full,
        "gross_lift_kg": g_z,
        "free_lift_kg": g_z - w,
        "full_msl_m": full,
        "full_p_hpa": None if full is None else col.p_at(full),
        "full_above_top": full is None,
        "float_msl_m": flt,
        "float_above_top": flt_above,
        "ballast_to_hold_kg": w - g_z if w > g_z else 0.0,
        "gross_lift_per_1000ft_kg": _per_1000ft(col, z, gross),
        "notes": tuple(notes),
        "warnings": tuple(warnings),
    }
