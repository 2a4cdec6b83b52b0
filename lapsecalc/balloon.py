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
#     (common practice). The pressure height is where it becomes full.
#   Working (mean) envelope temperature and its margin below the maximum: see
#     DEFAULT_MARGIN_K. Oxygen heights: see OXYGEN_LONG_M.
# Assumptions (stated in the reports' notes):
#   Hot air: the envelope holds ambient air heated at the same pressure with the same
#     vapour pressure (the same mixing ratio); burner exhaust (water vapour, CO2) is
#     not modelled. Then rho_envelope = rho_air * T_air / T_envelope exactly. The
#     envelope temperature is the MEAN of the envelope air; the crown (top) is hotter.
#   Gas: the gas is at the ambient temperature plus a superheat the user sets (0 when
#     not set), the same at every height, and dry; its impurity is dry air; purity is
#     a volume (mole) fraction. The fill is the gas volume at the field at the
#     ambient temperature (before any superheat).
from math import isfinite
from lapsecalc.constants import R_DRY, T0_K, EPS
from lapsecalc.limits import check, check_p
from lapsecalc.standard import _density, pressure_altitude
from lapsecalc.moisture import _es_water

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
# The working envelope temperature: the MEAN temperature of the air in the envelope,
# which every hot-air figure uses. The maker's maximum is a limit read at the crown
# (the top of the envelope, where the air is hottest); the mean runs well below it.
# When the user sets no working temperature it is the maximum less this margin, K:
# flight-manual load charts are commonly drawn for a mean of about 100 degC against a
# 120 degC maximum (common practice; from memory). The user can set another margin
# (0..MARGIN_MAX_K) or the working temperature itself.
DEFAULT_MARGIN_K = 20.0
MARGIN_MAX_K = 60.0
# Superheat of the lifting gas over the outside air, K: 0..50 admits a dark envelope
# in strong sun (tens of kelvin; common practice, from memory).
SUPERHEAT_MAX_K = 50.0
# Supplemental oxygen: many regulations require it above about 10,000 ft pressure
# altitude for longer than 30 minutes and above 13,000 ft at all times (ICAO-style
# rules; others use 12,500 and 14,000 ft). Common practice, from memory: the user
# must check the rules that apply. Pressure altitude, m (exact from ft).
OXYGEN_LONG_M = 3048.0
OXYGEN_ALWAYS_M = 3962.4
# Purity of the lifting gas, volume fraction; below one half it is mostly air.
PURITY_MIN = 0.5
# Densities the plain formulas accept, kg/m3 (ISA at 32 km is 0.0132; -90 degC air at
# 1100 hPa is 2.09).
RHO_MIN_KG_M3 = 0.001
RHO_MAX_KG_M3 = 2.5
# Heights: the per-1000-ft changes are taken over this step, m (1000 ft exact).
FT1000_M = 304.8
# Height solvers: scan steps of at most _SCAN_M (also ending at every ELR layer top),
# then regula falsi until the bracket is narrower than _TOL_M (float32 resolves about
# 0.004 m at 32 km), at most _CAP steps. The step size is not what makes the scan sound
# (see first_drop); 1000 m keeps a board's balloon line cheap (each lift costs about
# 0.7 KB of heap there).
_SCAN_M = 1000.0
_TOL_M = 0.1
_CAP = 40
# An overload smaller than this fraction of the weight is rounding, not weight.
_NOISE_KG_PER_KG = 1e-6


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


def gas_density(p_hpa, t_c, gas, purity=1.0, superheat_k=0.0):
    """Density, kg/m3, of the lifting gas ("helium" or "hydrogen", volume fraction
    purity 0.5..1, the rest dry air) at p_hpa (1..1100) and t_c degC (-90..60, the
    outside air) plus superheat_k (0..50 K: the gas that much warmer than the air).

    Ideal gas: rho = p M / (R* T) with R* = R_DRY * M_air (ICAO Doc 7488/3), so
    rho = rho_dry_air(p, T) * (purity M_gas / M_air + 1 - purity), T = t_c + superheat.
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    p = check_p("p_hpa", p_hpa)
    t = check("t_c", t_c, -90.0, 60.0, "degC")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    return 100.0 * p / (R_DRY * (t + dt + T0_K)) * (f * m_gas / M_AIR_G_MOL + 1.0 - f)


def gas_lift_per_m3(rho_air_kg_m3, p_hpa, t_c, gas, purity=1.0, superheat_k=0.0):
    """Gross lift, kg per m3 of gas at the ambient p_hpa and t_c plus superheat_k:
    ambient density rho_air_kg_m3 (0.001..2.5, moist or dry) less
    gas_density(p_hpa, t_c, gas, purity, superheat_k).
    Pure helium in the ISA at sea level: 1.0557 kg/m3."""
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    return rho - gas_density(p_hpa, t_c, gas, purity, superheat_k)


def superheat_loss_kg(rho_air_kg_m3, t_air_c, gas_volume_m3, superheat_k):
    """Lift lost, kg, when gas of volume gas_volume_m3 (m3, 0..2e6, as it is with
    superheat_k 0..50 K) cools to the air temperature t_air_c (-90..60 degC) at the
    same pressure, in air of density rho_air_kg_m3: the ballast to drop to hold
    level when the superheat goes (sunset, cloud shadow).

    Same gas mass, same pressure: the volume shrinks by the factor T / (T + dT), so the
    air displaced falls by rho_air V dT / (T + dT) (ideal gas).
    """
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    t = check("t_air_c", t_air_c, -90.0, 60.0, "degC") + T0_K
    v = check("gas_volume_m3", gas_volume_m3, 0.0, ENVELOPE_MAX_M3, "m3")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    return rho * v * dt / (t + dt)


def gas_volume_at(v0_m3, p0_hpa, t0_c, p_hpa, t_c):
    """Volume, m3, of a gas that filled v0_m3 at (p0_hpa, t0_c) once it is at
    (p_hpa, t_c): V = V0 (p0 / p) (T / T0), ideal gas at constant mass. v0_m3 at
    least 0 (finite), pressures 1..1100 hPa, gas temperatures -90..150 degC."""
    v0 = check("v0_m3", v0_m3, 0.0, 1.0e9, "m3")
    p0, p = check_p("p0_hpa", p0_hpa), check_p("p_hpa", p_hpa)
    t0 = check("t0_c", t0_c, -90.0, 150.0, "degC")
    t = check("t_c", t_c, -90.0, 150.0, "degC")
    return v0 * p0 / p * (t + T0_K) / (t0 + T0_K)


def first_drop(col, f, z_from_m):
    """Lowest height, m MSL, at or above z_from_m where f(z) (f(z_from_m) >= 0) falls
    to zero, or None when f stays at or above zero up to the column top.

    Scans the column in steps of at most 1000 m that also end at every ELR layer top,
    then narrows the first step whose top has f < 0 (regula falsi, Illinois) until the
    bracket is under 0.1 m (at most 40 steps; ValueError if not). Sound when f has no
    minimum inside a step: inside one linear layer, gas lift falls monotonically and
    hot-air lift at a fixed envelope temperature either falls or rises to one maximum
    and then falls. Where the humidity cap sets in, the slope of the lift steps up by
    about 0.0004 kg/m3 per km (vapour leaving faster): a dip below the weight inside a
    step could then reach only where the lift is that flat, a fraction of a kg over a
    step for the largest envelopes.
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
            if not f_next >= 0.0:
                if not isfinite(f_next):
                    raise ValueError("first_drop: f(%g m) is not finite" % z_next)
                return _narrow(f, z, z_next, fz, f_next)
            z, fz = z_next, f_next
    return None


def _narrow(f, lo, hi, f_lo, f_hi):
    # f(lo) = f_lo >= 0 > f_hi = f(hi). Regula falsi with the Illinois modification
    # (Dowell & Jarratt 1971: halve the value kept at an end chosen twice), each point
    # at least _TOL_M / 4 inside the bracket so that it narrows below _TOL_M; at most
    # _CAP steps (about 6 from 1000 m; plain bisection takes 14).
    side = 0
    for _ in range(_CAP):
        if hi - lo < _TOL_M:
            return 0.5 * (lo + hi)
        x = hi - f_hi * (hi - lo) / (f_hi - f_lo)
        edge = 0.25 * _TOL_M
        if x < lo + edge:
            x = lo + edge
        elif x > hi - edge:
            x = hi - edge
        fx = f(x)
        if not isfinite(fx):
            raise ValueError("first_drop: f(%g m) is not finite" % x)
        if fx < 0.0:
            hi, f_hi = x, fx
            if side == -1:
                f_lo *= 0.5
            side = -1
        else:
            lo, f_lo = x, fx
            if side == 1:
                f_hi *= 0.5
            side = 1
    raise ValueError("first_drop did not converge between %g and %g m" % (lo, hi))


def _air(col, z_m):
    # (p_hpa, t_c, e_hpa, rho_kg_m3) of the column at z_m, each computed once; the
    # vapour pressure by the column's rule (Column.vapour_pressure_at): with dewpoints
    # aloft, from them; else the surface mixing ratio, capped at saturation, without
    # computing p and T twice (boards).
    p = col.p_at(z_m)
    t = col.t_at(z_m)
    if col.dews is not None:
        e = col.vapour_pressure_at(z_m)
    else:
        r = col.r_kg_kg
        e = r * p / (EPS + r)
        es = _es_water(t)
        if e > es:
            e = es
    return p, t, e, _density(p, t, e)


def _hot_lift(col, z_m, envelope_t_c):
    # Gross lift, kg/m3, at z_m of ambient air heated to envelope_t_c: the closed form
    # of hot_air_lift_per_m3 (same p and e inside: rho_env = rho T_air / T_env).
    _, t, _, rho = _air(col, z_m)
    return rho * (1.0 - (t + T0_K) / (envelope_t_c + T0_K))


def _t_needed(col, z_m, lift_per_m3_kg):
    # Envelope temperature, degC, for lift_per_m3_kg at z_m; None if none suffices.
    _, t, _, rho = _air(col, z_m)
    if lift_per_m3_kg >= rho:
        return None
    return (t + T0_K) / (1.0 - lift_per_m3_kg / rho) - T0_K  # envelope_t_for_lift


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


def working_envelope_t(max_envelope_t_c, envelope_t_c=None, margin_k=DEFAULT_MARGIN_K):
    """The working (mean) envelope temperature, degC, that hot-air figures use.

    max_envelope_t_c 50..150 degC, the maker's maximum (a limit, read at the crown);
    envelope_t_c, when given, the mean envelope-air temperature the crew plans to fly
    (-90 up to max_envelope_t_c; above it is refused naming both); when None, the
    maximum less margin_k (0..60 K, default DEFAULT_MARGIN_K, common practice).
    """
    t_max = check("max_envelope_t_c", max_envelope_t_c, MAX_ENVELOPE_T_MIN_C,
                  MAX_ENVELOPE_T_MAX_C, "degC (the envelope maker's figure)")
    if envelope_t_c is None:
        return t_max - check("margin_k", margin_k, 0.0, MARGIN_MAX_K, "K (below the maximum)")
    t = check("envelope_t_c", envelope_t_c, -90.0, ENVELOPE_T_MAX_C, "degC")
    if t > t_max:
        raise ValueError("envelope_t_c=%g is above max_envelope_t_c=%g; the working"
                         " temperature is allowed up to %g degC (the maximum is a limit)"
                         % (t, t_max, t_max))
    return t


def oxygen_note(col, heights):
    """A note (str) when any of heights, (label, m MSL inside col or None) pairs,
    passes the pressure altitudes at which regulations commonly require supplemental
    oxygen (OXYGEN_LONG_M, OXYGEN_ALWAYS_M; common practice); None when none does."""
    worst = None
    for label, z in heights:
        if z is None:
            continue
        p = col.p_at(z)
        pa = pressure_altitude(p) if p > 8.68 else 32000.0
        if pa > OXYGEN_LONG_M and (worst is None or pa > worst[1]):
            worst = (label, pa, z)
    if worst is None:
        return None
    label, pa, z = worst
    return ("Oxygen: the %s, %.0f m MSL (%.0f ft pressure altitude), passes %s; rules"
            " commonly require it above 10000 ft for over 30 min, 13000 ft always (common"
            " practice). Check your local regulations."
            % (label, z, pa / 0.3048, "13000 ft" if pa > OXYGEN_ALWAYS_M else "10000 ft"))


def _ceiling(col, v, w, t_env, z_from):
    # (ceiling m MSL or None, above the top) at t_env, the lift at z_from (the field,
    # or a height known to lie under this ceiling) at least the weight; None, False
    # when too heavy at the field.
    if v * _hot_lift(col, col.elev_m, t_env) < w:
        return None, False
    c = first_drop(col, lambda zz: v * _hot_lift(col, zz, t_env) - w, z_from)
    return c, c is None


def hot_air_report(col, volume_m3, weight_kg, max_envelope_t_c, envelope_t_c=None, z_m=None,
                   margin_k=DEFAULT_MARGIN_K):
    """Hot-air balloon in the column col (a Column): a dict of plain values.

    volume_m3 10..20000; weight_kg 1..20000, everything that flies (envelope, basket,
    burners, fuel, people); max_envelope_t_c 50..150 degC, the envelope maker's
    maximum, set by the user: a LIMIT; envelope_t_c the working (mean) envelope
    temperature (working_envelope_t: default the maximum less margin_k), from the
    ambient temperature at z up to the maximum; z_m MSL inside the column (default
    the field).

    Working-temperature keys (what to plan with): z_msl_m, ambient_t_c, ambient_p_hpa,
    ambient_density_kg_m3, volume_m3, weight_kg, envelope_t_c, envelope_t_set (bool:
    given, not the default), margin_k (maximum less working), lift_per_m3_kg,
    gross_lift_kg and free_lift_kg (at z), payload_kg (gross less weight at the field:
    the most extra load that still takes off; negative = that much too heavy),
    envelope_t_needed_c (floats the weight at z; None if no temperature does),
    envelope_t_needed_over_working (bool), ceiling_msl_m and ceiling_p_hpa (lowest
    height where the lift falls to the weight; None if it cannot take off or if the
    ceiling is above the column top), ceiling_above_top, gross_lift_per_1000ft_kg and
    envelope_t_needed_per_1000ft_c (change over the 1000 ft above z).
    Absolute-limit keys (at the maximum; never to plan on): max_envelope_t_c,
    limit_gross_lift_kg (at z), limit_payload_kg, envelope_t_needed_over_limit,
    limit_ceiling_msl_m, limit_ceiling_p_hpa, limit_ceiling_above_top.
    oxygen_note (str or None), notes, warnings (tuples of str, empty when none).
    """
    v = check("volume_m3", volume_m3, HOT_VOLUME_MIN_M3, HOT_VOLUME_MAX_M3, "m3")
    w = check("weight_kg", weight_kg, HOT_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    t_max = check("max_envelope_t_c", max_envelope_t_c, MAX_ENVELOPE_T_MIN_C,
                  MAX_ENVELOPE_T_MAX_C, "degC (the envelope maker's figure)")
    t_env = working_envelope_t(t_max, envelope_t_c, margin_k)
    z = _z(col, z_m)
    p, t_air, e, rho = _air(col, z)
    if t_env < t_air:
        raise ValueError("envelope_t_c=%g (working) is below the ambient %.1f degC at %.0f m MSL;"
                         " allowed %.1f..%g degC" % (t_env, t_air, z, t_air, t_max))
    lift = hot_air_lift_per_m3(rho, p, t_env, e)
    need = w / v
    t_need = _t_needed(col, z, need)
    payload = v * _hot_lift(col, col.elev_m, t_env) - w
    limit_payload = v * _hot_lift(col, col.elev_m, t_max) - w
    ceiling, above = _ceiling(col, v, w, t_env, col.elev_m)
    # A hotter envelope lifts more at every height, so the limit ceiling lies at or
    # above the working one: its scan starts just under it (the lower end of the
    # working ceiling's final bracket, where the lift is at least the weight).
    limit_ceiling, limit_above = _ceiling(col, v, w, t_max, col.elev_m if ceiling is None
                                          else max(col.elev_m, ceiling - _TOL_M))
    if above:
        limit_ceiling, limit_above = None, True
    warnings = []
    # Float noise of the two lift sums (about 1e-13 kg in double, 1e-4 in single
    # precision) is no overload: a weight equal to the gross lift takes off.
    if payload < -_NOISE_KG_PER_KG * w:
        over = -payload
        warnings.append("Too heavy to take off at the working envelope temperature %.0f degC:"
                        " %s kg over." % (t_env, "%.0f" % over if over >= 1.0
                                          else "less than 1"))
    if t_need is None:
        warnings.append("No envelope temperature floats %.0f kg at %.0f m MSL." % (w, z))
    elif t_need > t_max:
        warnings.append("Floating %.0f kg at %.0f m MSL needs %.1f degC in the envelope, above"
                        " the maximum envelope temperature %.0f degC you set."
                        % (w, z, t_need, t_max))
    elif t_need > t_env:
        warnings.append("Floating %.0f kg at %.0f m MSL needs %.1f degC in the envelope, above"
                        " the working temperature %.0f degC." % (w, z, t_need, t_env))
    if t_env == t_max:
        warnings.append("Working temperature = maximum: all figures are the limit, no margin.")
    if above:
        warnings.append("The ceiling lies above the column top (%.0f m MSL)." % col.top_m)
    oxygen = oxygen_note(col, (("planned height", z),
                               ("ceiling", col.top_m if above else ceiling)))
    if oxygen:
        warnings.append(oxygen)
    return {
        "z_msl_m": z,
        "ambient_t_c": t_air,
        "ambient_p_hpa": p,
        "ambient_density_kg_m3": rho,
        "volume_m3": v,
        "weight_kg": w,
        "envelope_t_c": t_env,
        "envelope_t_set": envelope_t_c is not None,
        "margin_k": t_max - t_env,
        "lift_per_m3_kg": lift,
        "gross_lift_kg": v * lift,
        "free_lift_kg": v * lift - w,
        "payload_kg": payload,
        "envelope_t_needed_c": t_need,
        "envelope_t_needed_over_working": t_need is None or t_need > t_env,
        "ceiling_msl_m": ceiling,
        "ceiling_p_hpa": None if ceiling is None else col.p_at(ceiling),
        "ceiling_above_top": above,
        "gross_lift_per_1000ft_kg": _per_1000ft(col, z, lambda zz: v * _hot_lift(col, zz, t_env)),
        "envelope_t_needed_per_1000ft_c": _per_1000ft(col, z, lambda zz: _t_needed(col, zz, need)),
        "max_envelope_t_c": t_max,
        "limit_gross_lift_kg": v * hot_air_lift_per_m3(rho, p, t_max, e),
        "limit_payload_kg": limit_payload,
        "envelope_t_needed_over_limit": t_need is None or t_need > t_max,
        "limit_ceiling_msl_m": limit_ceiling,
        "limit_ceiling_p_hpa": None if limit_ceiling is None else col.p_at(limit_ceiling),
        "limit_ceiling_above_top": limit_above,
        "oxygen_note": oxygen,
        "notes": (
            "Working figures: mean envelope air %.0f degC (%s, %.0f K under the maximum)."
            " The %.0f degC maximum is a crown limit: figures at it are the absolute limit,"
            " never a plan."
            % (t_env, "set by you" if envelope_t_c is not None else "the default",
               t_max - t_env, t_max),
            "A crown reading runs hotter than the mean: enter it less the margin, never as"
            " it is.",
            "Envelope air is taken as the outside air heated at the same pressure with the"
            " same humidity; burner exhaust and heat losses are not modelled.",
            "Lift comes from the assumed lapse rate, not a sounding; the real air differs.",
        ),
        "warnings": tuple(warnings),
    }


def gas_report(col, gas, purity, gas_volume_m3, envelope_m3, weight_kg, z_m=None,
               superheat_k=0.0):
    """Zero-pressure gas balloon in the column col (a Column): a dict of plain values.

    gas "helium" or "hydrogen"; purity 0.5..1 (volume fraction, the rest air);
    gas_volume_m3 0.1..100000, the gas volume at the field at launch (not more than
    the envelope); envelope_m3 0.1..2e6, the full envelope; weight_kg 0.01..20000,
    everything that flies except the gas, ballast included; z_m MSL (default field);
    superheat_k 0..50 K, the gas warmer than the air (sun on the envelope), taken the
    same at every height.

    The gas is at the ambient pressure and the ambient temperature plus superheat_k;
    below the full height all of it is aboard and its volume grows as T/p; above, the
    envelope stays full and the excess vents (the balloon is assumed to have climbed
    straight from the field).

    Keys: z_msl_m, ambient_t_c, ambient_p_hpa, ambient_density_kg_m3, gas, purity,
    gas_density_kg_m3, lift_per_m3_kg (at z), gas_volume_at_z_m3, full_at_z (bool),
    gross_lift_kg, free_lift_kg (gross less weight at z), full_msl_m and full_p_hpa
    (where the gas fills the envelope: the pressure height, zero-pressure ceiling;
    None when above the column top), full_above_top (bool), float_msl_m (where the
    full envelope's lift equals the weight, at or above the full height; None if it
    cannot take off or it is above the column top), float_above_top (bool),
    ballast_to_hold_kg (ballast to drop at z to stop sinking there: weight less gross
    lift, 0 when the free lift is positive; then free_lift_kg is the lift to spend,
    by valving gas, to hold z), gross_lift_per_1000ft_kg, superheat_k, gas_t_c,
    superheat_lift_kg (gross lift at z gained by the superheat over the same balloon
    without it), ballast_superheat_lost_kg (ballast to drop at z to hold level when
    the superheat goes: superheat_loss_kg of the gas aboard; more than the lift gained
    once gas vented while warm), oxygen_note (str or None: the planned height or the
    float height passes the oxygen heights), notes, warnings.
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    v_env = check("envelope_m3", envelope_m3, GAS_VOLUME_MIN_M3, ENVELOPE_MAX_M3, "m3")
    v0 = check("gas_volume_m3", gas_volume_m3, GAS_VOLUME_MIN_M3, min(v_env, GAS_VOLUME_MAX_M3),
               "m3 (not more than envelope_m3)")
    w = check("weight_kg", weight_kg, GAS_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    z = _z(col, z_m)
    p0, t0 = col.p_hpa, col.t_c

    def volume(zz, heat=dt):
        return gas_volume_at(v0, p0, t0, col.p_at(zz), col.t_at(zz) + heat)

    def lift_m3(zz, heat=dt):
        pp, tt, _, rr = _air(col, zz)
        return gas_lift_per_m3(rr, pp, tt, gas, f, heat)

    def gross(zz, heat=dt):
        return min(volume(zz, heat), v_env) * lift_m3(zz, heat)

    p, t_air, _, rho = _air(col, z)
    v_z = volume(z)
    g_z = gross(z)
    lift_off = gross(col.elev_m) >= w
    if volume(col.elev_m) >= v_env:
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
    oxygen = oxygen_note(col, (("planned height", z),
                               ("float height", col.top_m if flt_above else flt)))
    if oxygen:
        warnings.append(oxygen)
    notes = [
        "The gas is taken at the outside pressure and at the outside temperature plus the"
        " superheat you set (%.1f K), the same at every height; its impurity is dry air."
        % dt,
        "Zero-pressure envelope: below the full height all the gas is aboard and the lift"
        " hardly changes; above it gas vents and the lift falls with the air density.",
        "ballast_to_hold_kg is the ballast to drop at this height to stop sinking there;"
        " with free lift, valve gas instead.",
    ]
    if dt > 0.0:
        notes.append("When the superheat goes (sunset, shade) drop ballast_superheat_lost_kg"
                     " to hold level; gas vented while warm makes it more than it gave.")
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
        "gas_density_kg_m3": gas_density(p, t_air, gas, f, dt),
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
        "oxygen_note": oxygen,
        "ballast_to_hold_kg": w - g_z if w > g_z else 0.0,
        "gross_lift_per_1000ft_kg": _per_1000ft(col, z, gross),
        "superheat_k": dt,
        "gas_t_c": t_air + dt,
        "superheat_lift_kg": g_z - gross(z, 0.0),
        "ballast_superheat_lost_kg": superheat_loss_kg(rho, t_air, min(v_z, v_env), dt),
        "notes": tuple(notes),
        "warnings": tuple(warnings),
    }
