"""ICAO standard atmosphere, pressure and density altitude, QNH and station pressure."""
# Sources:
#   ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere: layer equations,
#     geopotential heights -1000..32000 m used here.
#   ICAO Annex 3 (QNH definition); the altimeter-setting relation
#     p_stn^n = QNH^n - p0^n L h / T0, n = R L / g0, as in the Smithsonian
#     Meteorological Tables.
from math import exp, log, pow
from lapsecalc.constants import (G0, R_DRY, T0_K, ISA_T0_K, ISA_P0_HPA,
                                  ISA_LAPSE_K_PER_M)
from lapsecalc.limits import (check, check_t, check_p, check_elev, check_dew,
                              QNH_MIN_HPA, QNH_MAX_HPA, const)
from lapsecalc.moisture import _es_water, virtual_temperature_k

_ISA_MIN_M = const(-1000)
_ISA_MAX_M = const(32000)
# Densities isa_height_of_density accepts, kg/m3: about the ISA density at 32000 m
# (0.01323; the exact limit is checked after solving) up to more than air at -90 degC
# and 1100 hPa (2.09).
_RHO_MIN_KG_M3 = const(0.0132)
_RHO_MAX_KG_M3 = const(2.5)
# Layer bases, m, and temperature gradients dT/dh, K per m (ICAO Doc 7488/3).
_BASES_M = (-1000, 11000, 20000)
_GRADS_K_PER_M = (-0.0065, 0, 0.001)
# Exponent n = R L / g0 of the altimeter relation (about 0.190263).
_N = R_DRY * ISA_LAPSE_K_PER_M / G0


def ratio_ln(u):
    """ln(1 + u) / u, without cancellation near u = 0 (|u| < 1)."""
    if -0.01 < u < 0.01:
        return 1 - u * (0.5 - u * (1 / 3 - 0.25 * u))
    return log(1 + u) / u


def ratio_exp(x):
    """(exp(x) - 1) / x, without cancellation near x = 0."""
    if -0.01 < x < 0.01:
        return 1 + x * (0.5 + x * (1 / 6 + x / 24))
    return (exp(x) - 1) / x


def layer_pressure(p0_hpa, t0_k, grad_k_per_m, dz_m):
    """Hydrostatic pressure, hPa, dz_m above a level (p0_hpa, t0_k) in air whose
    temperature changes linearly by grad_k_per_m; exact for any gradient, zero too:
    ln(p0/p) = g dz / (R T0) * ln(1 + u)/u with u = grad dz / T0."""
    return p0_hpa * exp(-G0 * dz_m / (R_DRY * t0_k) * ratio_ln(grad_k_per_m * dz_m / t0_k))


def layer_height(p0_hpa, t0_k, grad_k_per_m, p_hpa):
    """Inverse of layer_pressure: the height, m, above the base where the pressure is p_hpa."""
    y = R_DRY / G0 * log(p0_hpa / p_hpa)
    return t0_k * y * ratio_exp(grad_k_per_m * y)


def _isa_layer(h_m):
    # (base_m, base_t_k, grad, base_p_hpa) of the ISA layer holding h_m; walks up from
    # sea level (three layers: no table is stored).
    base, t, p = 0, ISA_T0_K, ISA_P0_HPA
    if h_m < 11000:
        return base, t, -ISA_LAPSE_K_PER_M, p
    for i in (1, 2):
        top = _BASES_M[i]
        p = layer_pressure(p, t, _GRADS_K_PER_M[i - 1], top - base)
        t = t + _GRADS_K_PER_M[i - 1] * (top - base)
        base = top
        if i == 2 or h_m < _BASES_M[2]:
            return base, t, _GRADS_K_PER_M[i], p


def isa(h_m):
    """ICAO standard atmosphere at geopotential height h_m (-1000..32000 m).

    Returns (t_c, p_hpa, rho_kg_m3). Doc 7488/3 layer equations (6.5 K/km to 11 km,
    isothermal to 20 km, -1 K/km to 32 km); matches the printed table to 0.01 %.
    """
    h = check("h_m", h_m, _ISA_MIN_M, _ISA_MAX_M, "m")
    base, t0, grad, p0 = _isa_layer(h)
    t = t0 + grad * (h - base)
    p = layer_pressure(p0, t0, grad, h - base)
    return t - T0_K, p, 100 * p / (R_DRY * t)


def pressure_altitude(p_hpa):
    """Pressure altitude, m: the ISA height of pressure p_hpa (8.68..1139.3 hPa, the
    ISA pressures at 32000 and -1000 m). Exact inverse of isa() through every layer.
    """
    p = check("p_hpa", p_hpa, 8.68, 1139.3, "hPa")
    # The troposphere first: its closed form needs no upper layer (cheap on a board);
    # pressure falls with height, so a height past a layer's top is in a layer above.
    h = layer_height(ISA_P0_HPA, ISA_T0_K, -ISA_LAPSE_K_PER_M, p)
    for layer_m in _BASES_M[1:]:
        if h <= layer_m:
            break
        base, t0, grad, p0 = _isa_layer(layer_m)
        h = base + layer_height(p0, t0, grad, p)
    return h


def station_pressure(qnh_hpa, elev_m):
    """Station pressure, hPa, at elevation elev_m (-500..9000 m) under QNH qnh_hpa (850..1100).

    The altimeter-setting relation p^n = QNH^n - p0^n L h / T0 (n = R L / g0, ISA
    constants): an altimeter set to QNH reads the elevation. Round trip with qnh()
    within 0.001 hPa.
    """
    q = check("qnh_hpa", qnh_hpa, QNH_MIN_HPA, QNH_MAX_HPA, "hPa")
    h = check_elev("elev_m", elev_m)
    return pow(pow(q, _N) - pow(ISA_P0_HPA, _N) * ISA_LAPSE_K_PER_M * h / ISA_T0_K, 1 / _N)


def qnh(p_station_hpa, elev_m):
    """QNH, hPa, from station pressure p_station_hpa (1..1100 hPa) at elevation elev_m.

    Inverse of station_pressure(); the result must lie in 850..1100 hPa.
    """
    p = check_p("p_station_hpa", p_station_hpa)
    h = check_elev("elev_m", elev_m)
    q = pow(pow(p, _N) + pow(ISA_P0_HPA, _N) * ISA_LAPSE_K_PER_M * h / ISA_T0_K, 1 / _N)
    if q < QNH_MIN_HPA or q > QNH_MAX_HPA:
        # A thousandth of a hectopascal is rounding of a QNH at the limit (the round
        # trip through station_pressure, in float32 too), not a QNH outside it.
        if QNH_MIN_HPA - 0.001 <= q <= QNH_MAX_HPA + 0.001:
            return QNH_MIN_HPA if q < QNH_MIN_HPA else QNH_MAX_HPA
        raise ValueError("p_station_hpa=%s at elev_m=%s gives QNH %.1f hPa, outside the allowed"
                         " range %g..%g hPa" % (p, h, q, QNH_MIN_HPA, QNH_MAX_HPA))
    return q


def _density(p_hpa, t_c, e_hpa):
    # Ideal gas with the virtual temperature, kg/m3.
    return 100 * p_hpa / (R_DRY * virtual_temperature_k(t_c + T0_K, e_hpa, p_hpa))


def air_density(p_hpa, t_c, td_c=None):
    """Air density, kg/m3, at p_hpa (1..1100) and t_c degC; moist air through the
    virtual temperature when the dewpoint td_c is given, dry air otherwise."""
    p = check_p("p_hpa", p_hpa)
    if td_c is None:
        return _density(p, check_t("t_c", t_c), 0)
    t, td = check_dew(t_c, td_c)
    return _density(p, t, min(_es_water(td), 0.5 * p))


def _height_of_density(rho_kg_m3, h_m):
    # The height, m, of density rho_kg_m3 by the equation of the ISA layer holding h_m.
    base, t0, grad, p0 = _isa_layer(h_m)
    rho0 = 100 * p0 / (R_DRY * t0)
    if grad == 0:
        return base + R_DRY * t0 / G0 * log(rho0 / rho_kg_m3)
    # rho = rho0 (T/T0)^(-g/(R grad) - 1), solved for T, then z from T.
    return base + (t0 * pow(rho_kg_m3 / rho0, -1 / (G0 / (R_DRY * grad) + 1)) - t0) / grad


def isa_height_of_density(rho_kg_m3):
    """The ISA geopotential height, m, whose density is rho_kg_m3 (troposphere
    extended below -1000 m; refused above 32000 m). rho_kg_m3 0.0132..2.5."""
    rho_kg_m3 = check("rho_kg_m3", rho_kg_m3, _RHO_MIN_KG_M3, _RHO_MAX_KG_M3, "kg/m3")
    # The troposphere first: its closed form needs no upper layer (cheap on a board);
    # density falls with height through every layer, so a height past a layer's top
    # belongs to a layer above.
    z = _height_of_density(rho_kg_m3, 0.0)
    if z > _BASES_M[1]:
        z = _height_of_density(rho_kg_m3, _BASES_M[1])
        if z > _BASES_M[2]:
            z = _height_of_density(rho_kg_m3, _BASES_M[2])
    if z > _ISA_MAX_M:
        raise ValueError("rho_kg_m3=%.4g is below the ISA density at %g m; allowed %.4f..%g"
                         " kg/m3" % (rho_kg_m3, _ISA_MAX_M, isa(_ISA_MAX_M)[2], _RHO_MAX_KG_M3))
    return z


def density_altitude(p_hpa, t_c, td_c=None):
    """Density altitude, m: the ISA height with the same air density (moist air when
    td_c is given). Exact through every ISA layer; the troposphere is extended below
    -1000 m for very dense air. The 120 ft per degC rule is only a check."""
    return isa_height_of_density(air_density(p_hpa, t_c, td_c))
