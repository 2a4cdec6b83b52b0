"""Hot-air balloons in one air column: lift per m3 at an envelope temperature, the
temperature that gives a lift, the working (mean) envelope temperature, and the report
of lift, payload and ceilings at the working temperature and at the maker's maximum."""
# Sources:
#   Archimedes' principle with the ideal gas law, moist air through the virtual
#     temperature (lapsecalc.balloon: the ambient air and the height solver).
#   Working (mean) envelope temperature and its margin below the maximum: see
#     DEFAULT_MARGIN_K.
# Assumptions (stated in the report's notes): the envelope holds ambient air heated at
#   the same pressure with the same vapour pressure (the same mixing ratio); burner
#   exhaust (water vapour, CO2) is not modelled. Then rho_envelope = rho_air * T_air /
#   T_envelope exactly. The envelope temperature is the MEAN of the envelope air; the
#   crown (top) is hotter.
from lapsecalc.constants import T0_K
from lapsecalc.limits import check, check_p
from lapsecalc.standard import _density
from lapsecalc.balloon import (first_drop, _air, _z, _per_1000ft, oxygen_note, WEIGHT_MAX_KG,
                               RHO_MIN_KG_M3, RHO_MAX_KG_M3, _TOL_M)

# Input ranges.
# Hot-air envelope, m3: 10 admits model balloons; 20000 is above the largest passenger
# envelopes (about 17000 m3, 600000 ft3; from memory).
HOT_VOLUME_MIN_M3 = 10.0
HOT_VOLUME_MAX_M3 = 20000.0
# Total weight, kg: a hot-air balloon weighs at least its fabric (1 kg admits models).
HOT_WEIGHT_MIN_KG = 1.0
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
# An overload smaller than this fraction of the weight is rounding, not weight.
_NOISE_KG_PER_KG = 1e-6


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
