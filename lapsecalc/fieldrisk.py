"""At the field: frost point and relative humidity over ice, fog and ice fog, and the
carburettor icing band."""
# Sources:
#   Frost point: Hyland & Wexler (1983) over liquid water, ASHRAE Fundamentals ch. 1
#     eq. 6, for the dewpoint's vapour pressure (the Alduchov & Eskridge water fit is 3 %
#     low at -60 degC), and the library's ice curve (moisture, Alduchov & Eskridge).
#   Fog: a temperature-dewpoint spread of 3 K (5 degF) or less makes fog or low stratus
#     likely, the more so as the air cools (common practice).
#   Carburettor icing: the chart of temperature and humidity in the UK Civil Aviation
#     Authority's Safety Sense Leaflet 14, "Piston Engine Icing"; every band edge below
#     is recalled from that chart (from memory), approximate: check the leaflet.
# An extra on a board, loaded by lapsecalc.hazards for one report and dropped after it.
from math import exp, log
from lapsecalc.limits import check, check_dew, const
from lapsecalc.moisture import _AE_ICE, relative_humidity

# Fog or low stratus likely at or under this temperature-dewpoint spread, K (common
# practice).
_FOG_SPREAD_K = const(3.0)
# Carburettor icing bands, most serious first: (band, lowest and highest air
# temperature degC, least RH over water %). Every edge (-10, 20, 30, 35, 38 degC; 80,
# 60, 50, 30 %) is recalled from the chart of the UK CAA Safety Sense Leaflet 14
# "Piston Engine Icing" (from memory, approximate: check the leaflet). Band names are
# ours: any_power (serious icing at any power), cruise_and_glide (moderate at cruise
# power, serious at descent power), glide (serious at descent power), light (light at
# cruise or descent power); the first three are serious (lapsecalc.cautions says so).
CARB_BANDS = (
    ("any_power", -10.0, 20.0, 80.0),
    ("cruise_and_glide", -10.0, 30.0, 60.0),
    ("glide", -10.0, 35.0, 50.0),
    ("light", -10.0, 38.0, 30.0),
)


def _es_water_hw(t_c):
    # Hyland & Wexler over liquid water (supercooled below 0 degC), hPa.
    # Hyland & Wexler (1983) over water, ln(p / Pa) = C8/T + C9 + C10 T + C11 T^2 + C12 T^3
    # + C13 ln T, T in K (ASHRAE Fundamentals ch. 1 eq. 6).
    c8, c9, c10, c11, c12, c13 = (-5.8002206e3, 1.3914993, -4.8640239e-2, 4.1764768e-5,
                                  -1.4452093e-8, 6.5459673)
    t = t_c + 273.15
    return exp(c8 / t + c9 + t * (c10 + t * (c11 + t * c12)) + c13 * log(t)) / 100.0


def frost_point(td_c):
    """Frost point, degC: the temperature at which the vapour of air with dewpoint td_c
    (degC over liquid water, -90..0) saturates over ice.

    The dewpoint's vapour pressure by Hyland-Wexler over water, then the exact inverse
    of the library's ice curve (saturation_vapour_pressure with ice, Alduchov &
    Eskridge 1996 eq. 23, within 0.13 % of Hyland-Wexler over ice); within 0.05 K of
    Hyland-Wexler over water and ice (ASHRAE Fundamentals ch. 1) for frost points of
    -60..0 degC. Above 0 degC ice does not hold and the input is refused.
    """
    td_c = check("td_c", td_c, -90.0, 0.0, "degC (a frost point needs a dewpoint at or"
                 " below 0 degC)")
    a, b, c = _AE_ICE
    g = log(_es_water_hw(td_c) / a)
    t = c * g / (b - g)
    return t if t < 0.0 else 0.0


def relative_humidity_ice(t_c, td_c):
    """Relative humidity over ice, %, of air at t_c degC (-90..0) with dewpoint td_c
    (over water): the dewpoint's vapour pressure (Hyland-Wexler over water, as
    frost_point) over the ice saturation pressure at t_c (Alduchov & Eskridge eq. 23),
    so it is 100 % at the frost point. Not capped: above 100 % the air is
    supersaturated over ice (frost, ice crystals can grow)."""
    t_c, td_c = check_dew(t_c, td_c)
    if t_c > 0.0:
        raise ValueError("t_c=%g is above 0 degC; humidity over ice needs -90..0 degC" % t_c)
    a, b, c = _AE_ICE
    return 100.0 * _es_water_hw(td_c) / (a * exp(b * t_c / (t_c + c)))


def carb_icing(t_c, td_c):
    """Carburettor icing band for air at t_c with dewpoint td_c (degC): any_power,
    cruise_and_glide, glide, light or unlikely (band names ours; edges recalled from
    the CAA Safety Sense Leaflet 14 chart, from memory: see CARB_BANDS)."""
    t_c, td_c = check_dew(t_c, td_c)
    rh = relative_humidity(t_c, td_c)
    for band, lo, hi, rh_min in CARB_BANDS:
        if lo <= t_c <= hi and rh >= rh_min:
            return band
    return "unlikely"


def fog_risk(t_c, td_c):
    """True when the temperature-dewpoint spread is 3 K or less: fog or low stratus
    likely, the more so as the air cools (common practice)."""
    t_c, td_c = check_dew(t_c, td_c)
    return t_c - td_c <= _FOG_SPREAD_K


def add_keys(col, levels, r):
    """Add frost_point_c, rh_ice_pct, fog_risk, ice_fog_risk and carb_icing (the
    field's air) to report r; levels is not used."""
    t, td = col.t_c, col.td_c
    r["frost_point_c"] = frost_point(td) if td <= 0.0 else None
    r["rh_ice_pct"] = relative_humidity_ice(t, td) if t <= 0.0 else None
    r["fog_risk"] = fog_risk(t, td)
    r["ice_fog_risk"] = r["rh_ice_pct"] is not None and r["rh_ice_pct"] >= 100.0
    r["carb_icing"] = carb_icing(t, td)
