"""Cloud base: the lifting condensation level of a surface parcel, three ways."""
# Sources:
#   Romps (2017), Exact expression for the lifting condensation level,
#     J. Atmos. Sci. 74, 3891-3900, eqs. 22a-c (LCL height, temperature, pressure).
#   Bolton (1980), Mon. Wea. Rev. 108, 1046-1053, eq. 15 (LCL temperature from T, Td).
#   Spread rule: about 125 m per degC of temperature-dewpoint spread (common practice).
from math import exp, log, sqrt, pow, fabs
from lapsecalc.constants import G0, R_DRY, EPS, KAPPA, T0_K, DRY_LAPSE_K_PER_KM
from lapsecalc.moisture import _es_water
from lapsecalc.limits import check_p, check_dew, finite, const

_LAMBERT_CAP = const(12)
_LAMBERT_TOL = const(1e-6)
_SPREAD_M_PER_C = const(125.0)


def lambert_w_minus1(x):
    """Lower branch W_-1(x) of the Lambert W function for -1/e <= x < 0.

    Start from the branch-point series (x near -1/e) or the logarithmic asymptote,
    then Halley steps: at most 12, stopping when a step is under 1e-6 relative.
    """
    x = finite("x", x)
    if not (-0.36787944117144233 <= x < 0.0):
        if fabs(x + 0.36787944117144233) < 1e-9:
            return -1.0
        raise ValueError("lambert_w_minus1 needs -1/e <= x < 0, got %r" % x)
    if x < -0.25:
        q = 2.0 * (1.0 + 2.718281828459045 * x)
        s = -sqrt(q if q > 0.0 else 0.0)
        w = -1.0 + s * (1.0 - s * (1.0 / 3.0 - s * 11.0 / 72.0))
    else:
        l1 = log(-x)
        l2 = log(-l1)
        w = l1 - l2 + l2 / l1
        if w < -60.0:
            # exp(w) under 1e-26: W e^W = x loses its digits as exp(w) nears the end of
            # the float range (-1e-320 did not converge); the log form keeps them.
            return _lambert_log_form(w, l1)
    for _ in range(_LAMBERT_CAP):
        ew = exp(w)
        f = w * ew - x
        wp1 = w + 1.0
        if wp1 == 0.0:
            return w
        den = ew * wp1 - (w + 2.0) * f / (2.0 * wp1)
        step = f / den
        w -= step
        if fabs(step) <= _LAMBERT_TOL * fabs(w):
            return w
    raise ValueError("lambert_w_minus1 did not converge for x=%r" % x)


def _lambert_log_form(w, ln_mx):
    # W_-1 for x within about 5e-25 of 0 (w below -60), from the start w: Newton steps
    # on the log form w + ln(-w) = ln(-x), at most 12, to 1e-6 relative (float32
    # reaches it).
    for _ in range(_LAMBERT_CAP):
        step = (w + log(-w) - ln_mx) / (1.0 + 1.0 / w)
        w -= step
        if fabs(step) <= _LAMBERT_TOL * fabs(w):
            return w
    raise ValueError("lambert_w_minus1 did not converge for ln(-x)=%r" % ln_mx)


def _romps(t_c, td_c, p_hpa):
    # Romps (2017) eqs. 4 and 22a-c. The paper's constants, SI units, are kept as it
    # gives them so that its numbers are reproduced (its g 9.81 and Ra 287.04 differ
    # slightly from ours): the triple point (K, Pa), E0v (J/kg), the gas constants and
    # the heat capacities at constant volume (J/kg/K). Locals, not module names: a
    # board then holds no name for them.
    ttrip = 273.16
    ptrip = 611.65
    e0v = 2.3740e6
    ra = 287.04
    rv = 461.0
    cvv = 1418.0
    cvl = 4119.0
    cpa = 719.0 + ra                                    # cva + Ra
    cpv = cvv + rv
    # Eq. 4, saturation vapour pressure over liquid, Pa:
    #   ptrip (T / ttrip)^ea exp(eb (1 / ttrip - 1 / T)).
    ea = (cpv - cvl) / rv
    eb = (e0v - (cvv - cvl) * ttrip) / rv
    t = t_c + T0_K
    td = td_c + T0_K
    pv_t = ptrip * pow(t / ttrip, ea) * exp(eb * (1.0 / ttrip - 1.0 / t))
    rh = ptrip * pow(td / ttrip, ea) * exp(eb * (1.0 / ttrip - 1.0 / td)) / pv_t
    if rh > 1.0:
        rh = 1.0
    p = 100.0 * p_hpa
    pv = rh * pv_t
    qv = ra * pv / (rv * p + (ra - rv) * pv)
    rm = (1.0 - qv) * ra + qv * rv
    cpm = (1.0 - qv) * cpa + qv * cpv
    a = cpm / rm + (cvl - cpv) / rv
    b = -eb / t
    c = b / a
    w = lambert_w_minus1(pow(rh, 1.0 / a) * c * exp(c))
    t_lcl = c / w * t                                   # eq. 22b
    z = cpm * t / 9.81 * (1.0 - b / (a * w))            # eq. 22a (the paper's g)
    p_lcl = p_hpa * pow(t_lcl / t, cpm / rm)             # eq. 22c
    return z, t_lcl - T0_K, p_lcl


def _bolton(t_c, td_c, p_hpa):
    # LCL temperature by eq. 15; the pressure by Poisson's equation with Bolton's moist
    # exponent; the height by the hypsometric equation with the mean virtual
    # temperature of the (unsaturated, constant mixing ratio) rising air.
    t = t_c + T0_K
    td = td_c + T0_K
    t_lcl = 1.0 / (1.0 / (td - 56.0) + log(t / td) / 800.0) + 56.0   # eq. 15
    e = _es_water(td_c)
    r = EPS * e / (p_hpa - e)
    # Eq. 7's Poisson exponent for moist air, 0.2854 (1 - 0.28e-3 r) with r in g/kg;
    # here r is in kg/kg.
    kappa = 0.2854 * (1.0 - 0.28 * r)
    p_lcl = p_hpa * pow(t_lcl / t, 1.0 / kappa)                       # Poisson
    tv_mean = 0.5 * (t + t_lcl) * (1.0 + r / EPS) / (1.0 + r)
    return R_DRY * tv_mean / G0 * log(p_hpa / p_lcl), t_lcl - T0_K, p_lcl


def _spread(t_c, td_c, p_hpa):
    # The parcel rises dry: T falls at g/cp, and p follows Poisson's equation (exact
    # for that lapse rate in hydrostatic air).
    z = _SPREAD_M_PER_C * (t_c - td_c)
    t_lcl = t_c - DRY_LAPSE_K_PER_KM * z / 1000.0
    p_lcl = p_hpa * pow((t_lcl + T0_K) / (t_c + T0_K), 1.0 / KAPPA)
    return z, t_lcl, p_lcl


_METHODS = {"exact": _romps, "bolton": _bolton, "spread": _spread}


def cloud_base(t_c, td_c, p_hpa, method="exact"):
    """Lifting condensation level of a surface parcel: (height_agl_m, t_c, p_hpa).

    Inputs degC, degC, hPa (-90..60 degC, 1..1100 hPa). Methods:
      exact  - Romps (2017) eqs. 22a-c through W_-1 (own Halley iteration, capped);
               the humidity is the ratio of Romps' own saturation pressures at the
               dewpoint and the temperature. Reproduces the paper's formula to 1e-6.
      bolton - Bolton (1980) eq. 15 for the temperature, Poisson's equation with
               Bolton's moist exponent 0.2854 (1 - 0.28e-3 r) (eq. 7) for the pressure,
               the hypsometric equation with the mean virtual temperature for the
               height; within 1 % of exact up to 30 g/kg.
      spread - the 125 m per degC rule (common practice), dry adiabat for t and p.
    """
    t_c, td_c = check_dew(t_c, td_c)
    p_hpa = check_p("p_hpa", p_hpa)
    fn = _METHODS.get(method)
    if fn is None:
        raise ValueError("method=%r is not known; allowed: exact, bolton, spread" % (method,))
    if t_c - td_c <= 0.0:
        return 0.0, t_c, p_hpa
    z, t_lcl, p_lcl = fn(t_c, td_c, p_hpa)
    if z <= 0.0:
        return 0.0, t_c, p_hpa
    return z, t_lcl, p_lcl
