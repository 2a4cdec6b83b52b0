"""Dry and saturated (pseudo-adiabatic) ascent of a parcel."""
# Sources:
#   AMS Glossary of Meteorology, "pseudoadiabatic lapse rate":
#     dT/dz = -g (1 + Lv rs / (Rd T)) / (cp + Lv^2 rs eps / (Rd T^2)),
#     and in pressure dT/dln p = (Rd T + Lv rs) / (cp + Lv^2 rs eps / (Rd T^2)).
#   Saturation over liquid water: Alduchov & Eskridge (1996) eq. 21 (moisture.py).
from math import exp, log, sqrt, ceil, fabs
from lapsecalc.constants import G0, R_DRY, CP_DRY, EPS, LV0, T0_K, KAPPA
from lapsecalc.limits import check, check_t, check_p, const
from lapsecalc.moisture import _es_water

# Most RK4 steps one call may take; the default step in ln p (about 100 hPa near 1000
# hPa: within 3e-5 K of a fine integration from 1000 to 200 hPa, see bench/).
_ASCENT_CAP = const(2000)
DEFAULT_DLNP = 0.1
# Lv^2 eps / Rd, the constant of the pseudo-adiabat's denominator, J K / kg.
_LV2_EPS_RD = LV0 * LV0 * EPS / R_DRY
# Parcel temperature below which no vapour is counted, K (-150 degC).
_DRY_T_K = const(123.15)


def _rs(t_k, p_hpa):
    # Saturation mixing ratio over water, kg/kg; capped where e_s nears p (hot, thin air).
    # Below -150 degC it is taken as zero (under 1e-11 kg/kg even at 1 hPa): the fit's
    # pole at -243 degC would overflow a parcel lifted very far.
    if t_k < _DRY_T_K:
        return 0.0
    e = _es_water(t_k - T0_K)
    d = p_hpa - e
    if d < e:
        return EPS          # e capped at p/2: eps e / (p - e) with e = p - e
    return EPS * e / d


def moist_lapse_rate(t_c, p_hpa):
    """Pseudo-adiabatic (saturated) lapse rate, K per km, at t_c degC and p_hpa.

    AMS Glossary form with constant Lv and cp of dry air; about 3.7 K/km in warm
    humid air near 1000 hPa, approaching the dry rate (9.77 K/km) in cold thin air.
    Valid -90..60 degC, 1..1100 hPa.
    """
    return moist_lapse_k_per_km(check_t("t_c", t_c) + T0_K, check_p("p_hpa", p_hpa))


def moist_lapse_k_per_km(t_k, p_hpa):
    """moist_lapse_rate without the input checks (t in K), for callers that have them."""
    rs = _rs(t_k, p_hpa)
    return 1000 * G0 * (1 + LV0 * rs / (R_DRY * t_k)) / \
        (CP_DRY + _LV2_EPS_RD * rs / (t_k * t_k))


def _dt_dlnp(t_k, p_hpa):
    # Pseudo-adiabatic slope dT/d(ln p), K.
    rs = _rs(t_k, p_hpa)
    return (R_DRY * t_k + LV0 * rs) / (CP_DRY + _LV2_EPS_RD * rs / (t_k * t_k))


def moist_step(t_k, p0_hpa, p1_hpa):
    """One fourth-order Runge-Kutta step along the pseudo-adiabat in ln p: the parcel
    temperature, K, at p1_hpa starting from t_k at p0_hpa."""
    h = log(p1_hpa / p0_hpa)
    half = 0.5 * h
    ph = sqrt(p0_hpa * p1_hpa)
    k1 = _dt_dlnp(t_k, p0_hpa)
    k2 = _dt_dlnp(t_k + half * k1, ph)
    k3 = _dt_dlnp(t_k + half * k2, ph)
    k4 = _dt_dlnp(t_k + h * k3, p1_hpa)
    return t_k + h * (k1 + 2 * (k2 + k3) + k4) / 6


def saturated_ascent(t_c, p_from_hpa, p_to_hpa, dlnp=DEFAULT_DLNP):
    """Temperature, degC, of a saturated parcel taken from (t_c, p_from_hpa) to p_to_hpa
    along the pseudo-adiabat (up or down).

    Fourth-order Runge-Kutta in ln p with equal steps of at most dlnp (0.001..0.2;
    the default 0.1 is about 100 hPa near 1000 hPa), at most 2000 steps; within
    3e-5 K of a fine-step reference from 1000 to 200 hPa at the default step.
    The result is not range-checked: a long ascent can end below -90 degC.
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
        p_next = p0 * exp(step * (i + 1))
        t = moist_step(t, p, p_next)
        p = p_next
    return t - T0_K


def dry_ascent(t_c, p_from_hpa, p_to_hpa):
    """Temperature, degC, of an unsaturated parcel taken dry-adiabatically (Poisson's
    equation, dry kappa) from (t_c, p_from_hpa) to p_to_hpa."""
    t = check_t("t_c", t_c) + T0_K
    p0 = check_p("p_from_hpa", p_from_hpa)
    p1 = check_p("p_to_hpa", p_to_hpa)
    return t * exp(KAPPA * log(p1 / p0)) - T0_K
