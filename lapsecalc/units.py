"""Unit conversions for everything a pilot or a station types."""
# Sources: exact definitions (1 ft = 0.3048 m, 1 lb = 0.45359237 kg, 1 kt = 1852 m/h);
# 1 inHg = 33.8639 hPa and 1 mmHg = 1.33322 hPa at 0 degC and standard gravity.
# Every conversion takes a number (int or float) within +-1e30 and refuses anything
# else (text, None, NaN, infinities, huge ints) with ValueError.
from lapsecalc.limits import finite as _finite, const

M_PER_FT = 0.3048
_HPA_PER_INHG = const(33.8639)
_HPA_PER_MMHG = const(1.33322)
_KG_PER_LB = const(0.45359237)
M_S_PER_KT = 1852.0 / 3600.0
M3_PER_FT3 = M_PER_FT * M_PER_FT * M_PER_FT


def _lin(x, mul, div=1.0, before=0.0, after=0.0):
    # (x + before) * mul / div + after for a number x within +-1e30 (every result is
    # then finite, in single precision too).
    return (_finite("value", x) + before) * mul / div + after


def ft_to_m(ft):
    return _lin(ft, M_PER_FT)


def m_to_ft(m):
    return _lin(m, 1.0, M_PER_FT)


def km_to_m(km):
    return _lin(km, 1000.0)


def m_to_km(m):
    return _lin(m, 1.0, 1000.0)


def f_to_c(t_f):
    return _lin(t_f, 5.0, 9.0, -32.0)


def c_to_f(t_c):
    return _lin(t_c, 9.0, 5.0, 0.0, 32.0)


def k_to_c(t_k):
    return _lin(t_k, 1.0, 1.0, -273.15)


def c_to_k(t_c):
    return _lin(t_c, 1.0, 1.0, 273.15)


def inhg_to_hpa(inhg):
    return _lin(inhg, _HPA_PER_INHG)


def hpa_to_inhg(hpa):
    return _lin(hpa, 1.0, _HPA_PER_INHG)


def mmhg_to_hpa(mmhg):
    return _lin(mmhg, _HPA_PER_MMHG)


def hpa_to_mmhg(hpa):
    return _lin(hpa, 1.0, _HPA_PER_MMHG)


def kpa_to_hpa(kpa):
    return _lin(kpa, 10.0)


def hpa_to_kpa(hpa):
    return _lin(hpa, 1.0, 10.0)


# A millibar is a hectopascal.
def mb_to_hpa(mb):
    return _finite("mb", mb)


def hpa_to_mb(hpa):
    return _finite("hpa", hpa)


def c_per_1000ft_to_k_per_km(rate):
    """degC per 1000 ft -> K per km (1 degC/1000 ft = 3.2808 K/km)."""
    return _lin(rate, 1.0, M_PER_FT)


def k_per_km_to_c_per_1000ft(rate):
    return _lin(rate, M_PER_FT)


def c_per_100m_to_k_per_km(rate):
    return _lin(rate, 10.0)


def k_per_km_to_c_per_100m(rate):
    return _lin(rate, 1.0, 10.0)


def kt_to_m_s(kt):
    return _lin(kt, M_S_PER_KT)


def m_s_to_kt(m_s):
    return _lin(m_s, 1.0, M_S_PER_KT)


def lb_to_kg(lb):
    return _lin(lb, _KG_PER_LB)


def kg_to_lb(kg):
    return _lin(kg, 1.0, _KG_PER_LB)


def ft3_to_m3(ft3):
    return _lin(ft3, M3_PER_FT3)


def m3_to_ft3(m3):
    return _lin(m3, 1.0, M3_PER_FT3)
