"""The hot-air balloon report in one air column: lift, payload, the envelope temperature
that floats the weight and the ceilings, at the working (mean) envelope temperature and
at the maker's maximum, with warnings and notes."""
# Sources: the lift per m3 and the working temperature of lapsecalc.hotair; the height
#   solver and the oxygen heights of lapsecalc.balloon.
# Assumptions (stated in the notes): as lapsecalc.hotair's (the envelope holds ambient
#   air heated at the same pressure and humidity; the envelope temperature is the mean
#   of the envelope air).
from lapsecalc.limits import check, const
from lapsecalc.balloon import first_drop, _air, _z, _per_1000ft, oxygen_note, WEIGHT_MAX_KG, _TOL_M
from lapsecalc.hotair import (hot_air_lift_per_m3, _hot_lift, _t_needed, working_envelope_t,
                              HOT_VOLUME_MIN_M3, HOT_VOLUME_MAX_M3, HOT_WEIGHT_MIN_KG,
                              MAX_ENVELOPE_T_MIN_C, MAX_ENVELOPE_T_MAX_C, DEFAULT_MARGIN_K)

# An overload smaller than this fraction of the weight is rounding, not weight.
_NOISE_KG_PER_KG = const(1e-6)


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
    # The result made first, with room for every key: on a board its table is one
    # piece of heap, hard to find once the searches below have cut the heap up.
    out = dict.fromkeys([
        "z_msl_m", "ambient_t_c", "ambient_p_hpa", "ambient_density_kg_m3", "volume_m3",
        "weight_kg", "envelope_t_c", "envelope_t_set", "margin_k", "lift_per_m3_kg",
        "gross_lift_kg", "free_lift_kg", "payload_kg", "envelope_t_needed_c",
        "envelope_t_needed_over_working", "ceiling_msl_m", "ceiling_p_hpa",
        "ceiling_above_top", "gross_lift_per_1000ft_kg", "envelope_t_needed_per_1000ft_c",
        "max_envelope_t_c", "limit_gross_lift_kg", "limit_payload_kg",
        "envelope_t_needed_over_limit", "limit_ceiling_msl_m", "limit_ceiling_p_hpa",
        "limit_ceiling_above_top", "oxygen_note", "notes", "warnings"])
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
    if above:  # the hotter envelope's ceiling is over the top too: no scan
        limit_ceiling, limit_above = None, True
    else:
        limit_ceiling, limit_above = _ceiling(col, v, w, t_max, col.elev_m if ceiling is None
                                              else max(col.elev_m, ceiling - _TOL_M))
    warnings = _warnings(w, z, t_env, t_max, t_need, payload)
    if above:
        warnings.append("The ceiling lies above the column top (%.0f m MSL)." % col.top_m)
    oxygen = oxygen_note(col, (("planned height", z),
                               ("ceiling", col.top_m if above else ceiling)))
    if oxygen:
        warnings.append(oxygen)
    out["z_msl_m"] = z
    out["ambient_t_c"] = t_air
    out["ambient_p_hpa"] = p
    out["ambient_density_kg_m3"] = rho
    out["volume_m3"] = v
    out["weight_kg"] = w
    out["envelope_t_c"] = t_env
    out["envelope_t_set"] = envelope_t_c is not None
    out["margin_k"] = t_max - t_env
    out["lift_per_m3_kg"] = lift
    out["gross_lift_kg"] = v * lift
    out["free_lift_kg"] = v * lift - w
    out["payload_kg"] = payload
    out["envelope_t_needed_c"] = t_need
    out["envelope_t_needed_over_working"] = t_need is None or t_need > t_env
    out["ceiling_msl_m"] = ceiling
    out["ceiling_p_hpa"] = None if ceiling is None else col.p_at(ceiling)
    out["ceiling_above_top"] = above
    out["gross_lift_per_1000ft_kg"] = _per_1000ft(col, z,
                                                  lambda zz: v * _hot_lift(col, zz, t_env))
    out["envelope_t_needed_per_1000ft_c"] = _per_1000ft(col, z,
                                                        lambda zz: _t_needed(col, zz, need))
    out["max_envelope_t_c"] = t_max
    out["limit_gross_lift_kg"] = v * hot_air_lift_per_m3(rho, p, t_max, e)
    out["limit_payload_kg"] = limit_payload
    out["envelope_t_needed_over_limit"] = t_need is None or t_need > t_max
    out["limit_ceiling_msl_m"] = limit_ceiling
    out["limit_ceiling_p_hpa"] = None if limit_ceiling is None else col.p_at(limit_ceiling)
    out["limit_ceiling_above_top"] = limit_above
    out["oxygen_note"] = oxygen
    out["notes"] = _notes(t_env, t_max, envelope_t_c is not None)
    out["warnings"] = tuple(warnings)
    return out


def _warnings(w, z, t_env, t_max, t_need, payload):
    # The warnings of the weight w kg at z m MSL (a list, more may follow): too heavy
    # to take off (payload kg), the envelope temperature t_need that floats it against
    # the working t_env and the maximum t_max (hot_air_report is split so that a board
    # loads no piece of its code larger than about 1 KB).
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
    return warnings


def _notes(t_env, t_max, set_by_you):
    # The report's notes: the working temperature t_env (set by the user or the
    # default) under the maximum t_max, and what the figures assume.
    return (
        "Working figures: mean envelope air %.0f degC (%s, %.0f K under the maximum)."
        " The %.0f degC maximum is a crown limit: figures at it are the absolute limit,"
        " never a plan."
        % (t_env, "set by you" if set_by_you else "the default", t_max - t_env, t_max),
        "A crown reading runs hotter than the mean: enter it less the margin, never as"
        " it is.",
        "Envelope air is taken as the outside air heated at the same pressure with the"
        " same humidity; burner exhaust and heat losses are not modelled.",
        "Lift comes from the assumed lapse rate, not a sounding; the real air differs.",
    )
