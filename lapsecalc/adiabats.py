"""Dry and saturated (pseudo-adiabatic) ascent of a parcel."""
# Sources:
#   AMS Glossary of Meteorology, "pseudoadiabatic lapse rate":
#     dT/dz = -g (1 + Lv rs / (Rd T)) / (cp + Lv^2 rs eps / (Rd T^2)),
#     and in pressure dT/dln p = (Rd T + Lv rs) / (cp + Lv^2 rs eps / (Rd T^2)).
#   Saturation over liquid water: Alduchov & Eskridge (1996) eq. 21 (moisture.py).
from math import exp, log, ceil, fabs
from lapsecalc.constants import G0, R_DRY, CP_DRY, EPS, LV0, T0_K, KAPPA
from lapsecalc.limits import check, check_t, check_p
from lapsecalc.moisture import _es_water

# Most RK4 steps one call may take; the default step in ln p (about 50 hPa near 1000 hPa).
_ASCENT_CAP = 2000
DEFAULT_DLNP = 0.05


def _rs(t_k, p_hpa):
    # Saturation mixing ratio over water, kg/kg; capped where e_s nears p (hot, thin air).
    e = _es_water(t_k - T0_K)
    if e > 0.5 * p_hpa:
        e = 0.5 * p_hpa
    return EPS * e / (p_hpa - e)


def moist_lapse_rate(t_c, p_hpa):
    """Pseudo-adiabatic (saturated) lapse rate, K per km, at t_c degC and p_hpa.

    AMS Glossary form with constant Lv and cp of dry air; about 3.7 K/km in warm
    humid air near 1000 hPa, approaching the dry rate (9.77 K/km) in cold thin air.
    Valid -90..60 degC, 1..1100 hPa.
    """
    t = check_t("t_c", t_c) + T0_K
    p = check_p("p_hpa", p_hpa)
    rs = _rs(t, p)
    return 1000.0 * G0 * (1.0 + LV0 * rs / (R_DRY * t)) / \
        (CP_DRY + LV0 * LV0 * rs * EPS / (R_DRY * t * t))


def _dt_dlnp(t_k, p_hpa):
    # Pseudo-adiabatic slope dT/d(ln p), K.
    rs = _rs(t_k, p_hpa)
    return (R_DRY * t_k + LV0 * rs) / (CP_DRY + LV0 * LV0 * rs * EPS / (R_DRY * t_k * t_k))


def moist_step(t_k, p_hpa, dlnp):
    """One fourth-order Runge-Kutta step along the pseudo-adiabat: the parcel
    temperature, K, at p_hpa * exp(dlnp) starting from t_k at p_hpa."""
    ph = p_hpa * exp(0.5 * dlnp)
    p1 = p_hpa * exp(dlnp)
    k1 = _dt_dlnp(t_k, p_hpa)
    k2 = _dt_dlnp(t_k + 0.5 * dlnp * k1, ph)
    k3 = _dt_dlnp(t_k + 0.5 * dlnp * k2, ph)
    k4 = _dt_dlnp(t_k + dlnp * k3, p1)
    return t_k + dlnp * (k1 + 2.0 * (k2 + k3) + k4) / 6.0


def saturated_ascent(t_c, p_from_hpa, p_to_hpa, dlnp=DEFAULT_DLNP):
    """Temperature, degC, of a saturated parcel taken from (t_c, p_from_hpa) to p_to_hpa
    along the pseudo-adiabat (up or down).

    Fourth-order Runge-Kutta in ln p with equal steps of at most dlnp (0.001..0.2;
    the default 0.05 is about 50 hPa near 1000 hPa), at most 2000 steps; within
    0.001 K of a fine-step reference from 1000 to 200 hPa at the default step.
    """
    t = check_t("t_c", t_c) + T0_K
    p0 = check_p("p_from_hpa", p_from_hpa)
    p1 = check_p("p_to_hpa", p_to_hpa)
    h = check("dlnp", dlnp, 0.001, 0.2, "")
    span = log(p1 / p0)
    n = int(ceil(fabs(span) / h))
    if n > _ASCENT_CAP:
        raise ValueError("dlnp=%g needs %d steps; at most %d allowed" % (h, n, _ASCENT_CAP))
    if n == 0:
        return t - T0_K
    step = span / n
    p = p0
    for i in range(n):
        t = moist_step(t, p, step)
        p = p0 * exp(step * (i + 1))
    return t - T0_K


def dry_ascent(t_c, p_from_hpa, p_to_hpa):
    """Temperature, degC, of an unsaturated parcel taken dry-adiabatically (Poisson's
    equation, dry kappa) from (t_c, p_from_hpa) to p_to_hpa."""
    t = check_t("t_c", t_c) + T0_K
    p0 = check_p("p_from_hpa", p_from_hpa)
    p1 = check_p("p_to_hpa", p_to_hpa)
    return t * exp(KAPPA * log(p1 / p0)) - T0_K
