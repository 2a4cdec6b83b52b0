"""Water vapour in air: saturation pressure, dewpoint, humidity, mixing ratio, wet bulb."""
# Sources:
#   Alduchov & Eskridge (1996), J. Appl. Meteor. 35, 601-609: saturation fits,
#     eq. 21 (water, called AERK) and eq. 23 (ice, AERKi).
#   ASHRAE Handbook - Fundamentals (2017), ch. 1, eq. 33: the psychrometric
#     balance that defines the thermodynamic wet-bulb temperature.
from math import exp, log
from lapsecalc.constants import EPS
from lapsecalc.limits import check, check_t, check_p, check_dew, const

# Alduchov & Eskridge (1996) coefficients: hPa, dimensionless, degC.
_AE_A = 6.1094
_AE_B = const(17.625)
_AE_C = const(243.04)
_AE_ICE = (6.1121, 22.587, 273.86)
_WET_BULB_CAP = const(40)
_WET_BULB_TOL_K = const(0.005)


def _es_water(t_c):
    # Alduchov & Eskridge (1996) eq. 21, hPa; no range check (internal, hot paths).
    return _AE_A * exp(_AE_B * t_c / (t_c + _AE_C))


def saturation_vapour_pressure(t_c, ice=False):
    """Saturation vapour pressure, hPa, at t_c degC (-90..60).

    Over liquid water (supercooled below 0 degC, the WMO convention) unless ice is
    true (then t_c must be at or below 0 degC). Alduchov & Eskridge (1996) eq. 21 and
    23; within 0.4 % of Hyland-Wexler over -40..50 degC (water), -80..0 (ice).
    """
    t_c = check_t("t_c", t_c)
    if ice:
        if t_c > 0:
            raise ValueError("t_c=%s is above 0 degC with ice=True; allowed -90..0 degC over ice"
                             % t_c)
        a, b, c = _AE_ICE
        return a * exp(b * t_c / (t_c + c))
    return _es_water(t_c)


def _dewpoint_from_e(e_hpa):
    # Inverse of eq. 21: the temperature, degC, whose saturation pressure is e_hpa.
    g = log(e_hpa / _AE_A)
    return _AE_C * g / (_AE_B - g)


def dewpoint(t_c, rh_pct):
    """Dewpoint, degC, over liquid water, from t_c degC and relative humidity rh_pct (0..100 %).

    Exact inverse of saturation_vapour_pressure (Alduchov & Eskridge eq. 21); within
    0.15 degC of Hyland-Wexler. A humidity so low that the dewpoint falls below
    -90 degC is refused.
    """
    t_c = check_t("t_c", t_c)
    rh = check("rh_pct", rh_pct, 0, 100, "%")
    if rh <= 0:
        raise ValueError("rh_pct=0 has no dewpoint; allowed above 0 up to 100 %")
    td = _dewpoint_from_e(rh / 100 * _es_water(t_c))
    if td < -90:
        raise ValueError("rh_pct=%s at t_c=%s gives a dewpoint below -90 degC; allowed 0..100 %%"
                         " with a dewpoint of at least -90 degC" % (rh, t_c))
    return min(td, t_c)


def relative_humidity(t_c, td_c):
    """Relative humidity over liquid water, %, from t_c and dewpoint td_c (degC, -90..60)."""
    t_c, td_c = check_dew(t_c, td_c)
    rh = 100 * _es_water(td_c) / _es_water(t_c)
    return 100.0 if rh > 100.0 else rh


def _mixing_ratio_kg_kg(e_hpa, p_hpa):
    # eps e / (p - e), kg/kg.
    return EPS * e_hpa / (p_hpa - e_hpa)


def mixing_ratio(td_c, p_hpa):
    """Mixing ratio, g/kg, of air with dewpoint td_c degC at pressure p_hpa (1..1100 hPa).

    r = eps e / (p - e) with e the saturation pressure at the dewpoint (over water).
    Refused where e is not small against p (e above half of p).
    """
    td_c = check_t("td_c", td_c)
    p_hpa = check_p("p_hpa", p_hpa)
    e = _es_water(td_c)
    if e > 0.5 * p_hpa:
        raise ValueError("p_hpa=%s is too low for td_c=%s (vapour pressure %.1f hPa);"
                         " allowed p_hpa above %.1f hPa" % (p_hpa, td_c, e, 2 * e))
    return 1000 * _mixing_ratio_kg_kg(e, p_hpa)


def wet_bulb(t_c, td_c, p_hpa):
    """Isobaric (thermodynamic) wet-bulb temperature, degC.

    Solves the psychrometric balance of ASHRAE Fundamentals (2017) ch. 1 eq. 33,
      W = ((2501 - 2.326 Tw) Ws(Tw) - 1.006 (T - Tw)) / (2501 + 1.86 T - 4.186 Tw),
    for Tw between the dewpoint and the temperature, with saturation over water.
    Illinois (regula falsi) iteration, at most 40 steps, stops within 0.005 K.
    Accurate to 0.2 degC over -10..45 degC and 700..1050 hPa.
    """
    t_c, td_c = check_dew(t_c, td_c)
    p_hpa = check_p("p_hpa", p_hpa)
    if _es_water(t_c) > 0.5 * p_hpa:
        raise ValueError("p_hpa=%s is too low for t_c=%s; allowed p_hpa above %.1f hPa"
                         % (p_hpa, t_c, 2.0 * _es_water(t_c)))
    w = _mixing_ratio_kg_kg(_es_water(td_c), p_hpa)
    den_t = 2501.0 + 1.86 * t_c     # the part of the denominator that Tw leaves alone

    def balance(tw):
        ws = _mixing_ratio_kg_kg(_es_water(tw), p_hpa)
        return ((2501.0 - 2.326 * tw) * ws - 1.006 * (t_c - tw)) / (den_t - 4.186 * tw) - w

    lo, hi = td_c, t_c
    f_lo, f_hi = balance(lo), balance(hi)
    if f_lo >= 0.0:
        return lo
    if f_hi <= 0.0:
        return hi
    side = 0
    for _ in range(_WET_BULB_CAP):
        mid = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        f_mid = balance(mid)
        if f_mid < 0.0:
            lo, f_lo = mid, f_mid
            if side == -1:
                f_hi *= 0.5
            side = -1
        else:
            hi, f_hi = mid, f_mid
            if side == 1:
                f_lo *= 0.5
            side = 1
        if hi - lo < _WET_BULB_TOL_K or f_mid == 0.0:
            return mid
    raise ValueError("wet_bulb did not converge for t_c=%s td_c=%s p_hpa=%s"
                     % (t_c, td_c, p_hpa))


def virtual_temperature_k(t_k, e_hpa, p_hpa):
    """Virtual temperature, K: T / (1 - (e/p)(1 - eps)) (Wallace & Hobbs eq. 3.60)."""
    return t_k / (1 - e_hpa / p_hpa * (1 - EPS))
