"""Unit conversions for everything a pilot or a station types."""
# Sources: exact definitions (1 ft = 0.3048 m, 1 lb = 0.45359237 kg, 1 kt = 1852 m/h);
# 1 inHg = 33.8639 hPa and 1 mmHg = 1.33322 hPa at 0 degC and standard gravity.

M_PER_FT = 0.3048
HPA_PER_INHG = 33.8639
HPA_PER_MMHG = 1.33322
KG_PER_LB = 0.45359237
M_S_PER_KT = 1852.0 / 3600.0
M3_PER_FT3 = M_PER_FT * M_PER_FT * M_PER_FT


def ft_to_m(ft):
    return ft * M_PER_FT


def m_to_ft(m):
    return m / M_PER_FT


def km_to_m(km):
    return km * 1000.0


def m_to_km(m):
    return m / 1000.0


def f_to_c(t_f):
    return (t_f - 32.0) * 5.0 / 9.0


def c_to_f(t_c):
    return t_c * 9.0 / 5.0 + 32.0


def k_to_c(t_k):
    return t_k - 273.15


def c_to_k(t_c):
    return t_c + 273.15


def inhg_to_hpa(inhg):
    return inhg * HPA_PER_INHG


def hpa_to_inhg(hpa):
    return hpa / HPA_PER_INHG


def mmhg_to_hpa(mmhg):
    return mmhg * HPA_PER_MMHG


def hpa_to_mmhg(hpa):
    return hpa / HPA_PER_MMHG


def kpa_to_hpa(kpa):
    return kpa * 10.0


def hpa_to_kpa(hpa):
    return hpa / 10.0


# A millibar is a hectopascal.
mb_to_hpa = float
hpa_to_mb = float


def c_per_1000ft_to_k_per_km(rate):
    """degC per 1000 ft -> K per km (1 degC/1000 ft = 3.2808 K/km)."""
    return rate / M_PER_FT


def k_per_km_to_c_per_1000ft(rate):
    return rate * M_PER_FT


def c_per_100m_to_k_per_km(rate):
    return rate * 10.0


def k_per_km_to_c_per_100m(rate):
    return rate / 10.0


def kt_to_m_s(kt):
    return kt * M_S_PER_KT


def m_s_to_kt(m_s):
    return m_s / M_S_PER_KT


def lb_to_kg(lb):
    return lb * KG_PER_LB


def kg_to_lb(kg):
    return kg / KG_PER_LB


def ft3_to_m3(ft3):
    return ft3 * M3_PER_FT3


def m3_to_ft3(m3):
    return m3 / M3_PER_FT3
