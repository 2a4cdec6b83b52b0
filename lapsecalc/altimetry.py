"""Altimetry for one air column: indicated altitude on QNH and its inverse, flight
levels, ISA deviation, the cold-temperature correction and cold-air warnings."""
# Sources:
#   ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere: pressure altitude (the
#     altimeter's scale) through standard.pressure_altitude and standard.isa.
#   ICAO Annex 3 (QNH); the altimeter-setting relation of standard.py: an altimeter
#     set to QNH reads PA(p) - PA(QNH), so it reads the elevation at the field.
#   Flight level: pressure altitude in hundreds of feet (ICAO Annex 2, definitions).
#   Cold-temperature correction: ICAO Doc 8168, PANS-OPS Vol. I (Flight Procedures),
#     6th edition (2018), Part III, Section 1, Chapter 4 "Altimeter corrections",
#     4.3 (correction for low temperature); edition, section and formula from memory
#     (the formula as in ../shared/REFERENCES.md "Altimetry").
# Heights are geopotential metres MSL ("true"); an indicated altitude is what an
# altimeter set to the column's QNH reads, in metres.
from math import ceil, floor
from lapsecalc.constants import T0_K, ISA_T0_K, ISA_LAPSE_K_PER_M
from lapsecalc.limits import check, check_t, check_elev, const
from lapsecalc.standard import isa, pressure_altitude, ratio_ln
from lapsecalc.units import M_PER_FT
# Indicated altitude and the report keys live in lapsecalc.indicated (small: report()
# loads it); they are this module's API too.
from lapsecalc.indicated import (indicated_altitude_at, add_to_report, isa_t_c,
                                 TROPOPAUSE_M, COLD_WARNING_K)

# Flight levels accepted, hundreds of feet: up to the top of the ISA tables (32 km).
_FL_MIN = const(0.0)
_FL_MAX = const(1000.0)
# A reading this close past an end of the column is that end, m: more than float32
# rounding of a reading (up to 0.1 m at 15 km, tests/test_float32.py), under a metre.
_END_SLACK_M = const(0.5)
# The flight levels named in a refusal: a column end within this many FL of a whole
# level (0.1 ft, far above float32 rounding) is that level, not the one below.
_FL_SLACK = const(0.001)


def flight_level(p_hpa):
    """Flight level of pressure p_hpa (8.68..1139.3 hPa): its pressure altitude in
    hundreds of feet, not rounded (ICAO Doc 7488/3 pressure altitude)."""
    return pressure_altitude(p_hpa) / (100.0 * M_PER_FT)


def isa_deviation_at(col, z_msl_m):
    """ISA deviation, K, at z_msl_m: the column's temperature minus the ISA temperature
    at the same pressure altitude (ICAO Doc 7488/3)."""
    return col.t_at(z_msl_m) - isa_t_c(pressure_altitude(col.p_at(z_msl_m)))


def cold_warnings(col, r, threshold_k=COLD_WARNING_K):
    """[(key, z_msl_m, isa_deviation_k, indicated_minus_true_m), ...] for every
    reported single height of report r (with indicated_altitude_m) above the field
    where the column is threshold_k or more colder than ISA and true altitude is below
    indicated (warm air lower down can outweigh cold air aloft: then the altimeter
    reads low there, and no warning). Lowest first. At the field the altimeter reads
    right on QNH; at one height, by key name."""
    out = []
    ind = r["indicated_altitude_m"]
    for k in ind:
        if ind[k] is None or r[k] < col.elev_m + 1.0 or ind[k] <= r[k]:
            continue
        dev = isa_deviation_at(col, r[k])
        if dev <= -threshold_k:
            out.append((k, r[k], dev, ind[k] - r[k]))
    # Two keys at one height by name: every port the same (a board's dict has no order).
    out.sort(key=lambda w: (w[1], w[0]))
    return out


def altimeter_view(col, z_msl_m, p_hpa):
    """(indicated_m, pressure_altitude_m, isa_deviation_c) at true height z_msl_m of
    the column, whose pressure there is p_hpa: the altimeter on QNH, the pressure
    altitude (FL x 100 ft) and the temperature minus ISA at that pressure altitude."""
    pa = pressure_altitude(p_hpa)
    return indicated_altitude_at(col, z_msl_m), pa, col.t_at(z_msl_m) - isa_t_c(pa)


def true_altitude_of(col, indicated_m):
    """True height, m MSL, where an altimeter set to the column's QNH reads
    indicated_m (m): the exact inverse of indicated_altitude_at (no iteration: the ISA
    pressure of PA(QNH) + indicated, then the column's height of that pressure)."""
    pa_qnh = pressure_altitude(col.qnh_hpa)
    p_top = col.p_at(col.top_m)
    lo, hi = col.elev_m, pressure_altitude(p_top) - pa_qnh
    x = indicated_m
    # A reading within _END_SLACK_M past either end is that end (float32 rounding).
    if isinstance(x, (int, float)) and lo - _END_SLACK_M <= x <= hi + _END_SLACK_M:
        x = min(max(x, lo), hi)
    x = check("indicated_m", x, lo, hi, "m (indicated on QNH %.1f hPa, the column)"
              % col.qnh_hpa)
    # Rounding may put the pressure a hair outside the column's: the ends themselves.
    return col.z_at(min(max(isa(pa_qnh + x)[1], p_top), col.p_hpa))


def z_at_flight_level(col, fl):
    """True height, m MSL, of flight level fl (hundreds of feet of pressure altitude,
    0..1000) in the column."""
    f = check("fl", fl, _FL_MIN, _FL_MAX, "(flight level, hundreds of ft)")
    p = isa(f * 100.0 * M_PER_FT)[1]
    top_p = col.p_at(col.top_m)
    if p > col.p_hpa or p < top_p:
        raise ValueError("fl=%g (%.1f hPa) is outside the column; allowed FL%d..FL%d here"
                         % (f, p, int(ceil(flight_level(col.p_hpa) - _FL_SLACK)),
                            int(floor(flight_level(top_p) + _FL_SLACK))))
    return col.z_at(p)


def cold_temperature_correction(height_above_aerodrome_m, aerodrome_t_c, aerodrome_elev_m):
    """Cold-temperature correction, m, to add to a published height (indicated on QNH)
    height_above_aerodrome_m (0..11000 m minus the elevation) above an aerodrome of
    elevation aerodrome_elev_m (-500..9000 m) whose temperature is aerodrome_t_c degC.

    ICAO Doc 8168 PANS-OPS Vol. I, 6th ed., Part III, Sect. 1, Ch. 4, 4.3 (from
    memory): correction = (-dT / L0) ln(1 + L0 h / (T0 + L0 h_ad)), L0 = -0.0065 K/m,
    T0 = 288.15 K, dT = t_ad - (15 + L0 h_ad) degC. It assumes the ISA lapse rate
    above the aerodrome. Written as -dT h / (T0 + L0 h_ad) * ln(1 + u) / u (no
    cancellation near h = 0). Negative when the aerodrome is warmer than ISA:
    PANS-OPS corrects for cold air only; never subtract it from a minimum altitude."""
    h_ad = check_elev("aerodrome_elev_m", aerodrome_elev_m)
    h = check("height_above_aerodrome_m", height_above_aerodrome_m, 0.0, TROPOPAUSE_M - h_ad,
              "m (up to 11000 m MSL, the ISA troposphere)")
    t = check_t("aerodrome_t_c", aerodrome_t_c)
    t_std_k = ISA_T0_K - ISA_LAPSE_K_PER_M * h_ad
    dt = t - (t_std_k - T0_K)
    return -dt * h / t_std_k * ratio_ln(-ISA_LAPSE_K_PER_M * h / t_std_k)


def column_cold_correction(col, height_above_field_m):
    """The column's own exact value of the cold-temperature correction, m: indicated
    minus true (the negative of true minus indicated) at the indicated altitude
    elevation + height_above_field_m on QNH. Same sign as the PANS-OPS formula, which
    it matches for a column with the ISA lapse rate; the column's own lapse rates
    otherwise."""
    h = check("height_above_field_m", height_above_field_m, 0.0, col.top_m - col.elev_m,
              "m (the column above the field)")
    a = col.elev_m + h
    return a - true_altitude_of(col, a)
