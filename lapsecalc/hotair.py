"""Hot-air lift in one air column: lift per m3 at an envelope temperature, the
temperature that gives a lift, the working (mean) envelope temperature, and the input
ranges of a hot-air balloon (its report: lapsecalc.hotreport; the load table,
lapsecalc.loadtable, needs only this)."""
# Sources:
#   Archimedes' principle with the ideal gas law, moist air through the virtual
#     temperature (lapsecalc.balloon: the ambient air and the height solver).
#   Working (mean) envelope temperature and its margin below the maximum: see
#     DEFAULT_MARGIN_K.
# Assumptions (stated in lapsecalc.hotreport's notes): the envelope holds ambient air heated at
#   the same pressure with the same vapour pressure (the same mixing ratio); burner
#   exhaust (water vapour, CO2) is not modelled. Then rho_envelope = rho_air * T_air /
#   T_envelope exactly. The envelope temperature is the MEAN of the envelope air; the
#   crown (top) is hotter.
from lapsecalc.constants import T0_K
from lapsecalc.limits import check, check_p
from lapsecalc.standard import _density
from lapsecalc.balloon import _air, RHO_MIN_KG_M3, RHO_MAX_KG_M3

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
