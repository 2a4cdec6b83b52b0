"""Indicated altitude: what an altimeter set to a column's QNH reads at a true height,
and the report keys built on it (the part of altimetry that Column.report() loads)."""
# Sources:
#   ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere: pressure altitude (the
#     altimeter's scale) through standard.pressure_altitude, the ISA temperature.
#   ICAO Annex 3 (QNH); the altimeter-setting relation of standard.py: an altimeter
#     set to QNH reads PA(p) - PA(QNH), so it reads the elevation at the field.
# Kept small: a board that runs report() holds this module, not all of altimetry.py.
from math import log
from lapsecalc.constants import T0_K, ISA_T0_K, ISA_P0_HPA, ISA_LAPSE_K_PER_M, R_DRY, G0
from lapsecalc.standard import isa, pressure_altitude, isa_height_of_density, _density, _N

# The top of the ISA troposphere and of the isothermal layer above it, m (ICAO Doc
# 7488/3).
TROPOPAUSE_M = 11000.0
_ISA_20_KM_M = 20000.0
# A reported level this much colder than ISA gets a warning, K.
COLD_WARNING_K = 10.0
# T0 / L of the ISA troposphere, m (about 44331 m).
_T0_OVER_L_M = ISA_T0_K / ISA_LAPSE_K_PER_M
# The ISA at 11 km: pressure p0 (T11/T0)^(1/n), hPa (226.32), and the isothermal
# layer's scale height R T11 / g, m (ICAO Doc 7488/3).
_T11_K = ISA_T0_K - ISA_LAPSE_K_PER_M * TROPOPAUSE_M
_P11_HPA = ISA_P0_HPA * pow(_T11_K / ISA_T0_K, 1.0 / _N)
_H11_M = R_DRY * _T11_K / G0


def _zero_reading(col):
    # T0/L (QNH/p0)^n, m: in the ISA troposphere an altimeter on the column's QNH reads
    # this minus T0/L (p/p0)^n (the altimeter-setting relation, as in standard.py).
    return _T0_OVER_L_M * pow(col.qnh_hpa / ISA_P0_HPA, _N)


def indicated_altitude_at(col, z_msl_m, zero_m=None):
    """Indicated altitude, m, on an altimeter set to the column's QNH at true height
    z_msl_m (inside the column): PA(p(z)) - PA(QNH), exact through the ISA layers.
    It equals the elevation at the field; it reads high in air colder than ISA.
    zero_m, when given, is _zero_reading(col) (saves its recomputation in a loop)."""
    if zero_m is None:
        zero_m = _zero_reading(col)
    p = col.p_at(z_msl_m)
    if p >= _P11_HPA:
        # PA(p) - PA(QNH) by the altimeter-setting relation p^n = QNH^n - p0^n L h / T0
        # (ICAO Doc 7488/3 troposphere).
        return zero_m - _T0_OVER_L_M * pow(p / ISA_P0_HPA, _N)
    # Above 11 km: the isothermal layer's PA = 11 km + R T11/g ln(p11/p), every layer
    # past 20 km (standard.pressure_altitude); PA(QNH) = T0/L - zero_m.
    pa = TROPOPAUSE_M + _H11_M * log(_P11_HPA / p)
    if pa > _ISA_20_KM_M:
        pa = pressure_altitude(p)
    return pa - (_T0_OVER_L_M - zero_m)


def isa_t_c(pa_m):
    # ISA temperature, degC, at pressure altitude pa_m: the troposphere's line, isa()
    # above 11 km (ICAO Doc 7488/3).
    if pa_m <= TROPOPAUSE_M:
        return ISA_T0_K - T0_K - ISA_LAPSE_K_PER_M * pa_m
    return isa(pa_m)[0]


def _reading(col, r, ind, z, zero_m):
    # The indicated altitude of z for add_to_report: the elevation at the field (QNH's
    # definition), a reading already made for the same height (levels often coincide:
    # a board allocates every float), else computed; None beyond the ISA table's 32 km.
    if z == col.elev_m:
        return col.elev_m
    for k in ind:
        if r[k] == z:
            return ind[k]
    try:
        return indicated_altitude_at(col, z, zero_m)
    except ValueError:
        return None


def add_to_report(col, r):
    """Add to report dict r: indicated_altitude_m (every single-height *_msl_m key of r
    whose value is a number, mapped to its indicated altitude on the column's QNH; None
    where the height is None or beyond the altimeter's scale), isa_deviation_c at the
    field, and density_altitude_dry_m: the density altitude of dry air at the field's
    pressure and temperature, which is what flight-manual charts and hand calculators
    give (density_altitude_m counts the humidity: humid air is lighter, so it is higher)."""
    zero = _zero_reading(col)
    ind = {}
    for k in r:
        if not k.endswith("_msl_m"):
            continue
        z = r[k]
        if z is None:
            ind[k] = None
        elif isinstance(z, float) or isinstance(z, int) and z is not True and z is not False:
            ind[k] = _reading(col, r, ind, z, zero)
    r["indicated_altitude_m"] = ind
    pa = r.get("pressure_altitude_m")
    r["isa_deviation_c"] = col.t_c - isa_t_c(pressure_altitude(col.p_hpa) if pa is None else pa)
    r["density_altitude_dry_m"] = isa_height_of_density(_density(col.p_hpa, col.t_c, 0.0))
