"""Hazards as pilots meet them: the icing band, freezing rain and ice pellets, the
wet-bulb freezing level, frost and fog at the field, carburettor icing, what thermals
can be used, the cautions."""
# Sources:
#   Icing band: airframe icing is most likely in cloud between 0 and -20 degC (common
#     practice; REFERENCES.md "Lapse rates"); with dewpoints aloft, cloud where the
#     dewpoint depression is at most 3 K (common practice; lapsecalc.aloft).
#   Precipitation type: Bourgouin, P. (2000), "A method to determine precipitation
#     types", Weather and Forecasting 15, 583-592: the melting (positive) area of a
#     warm layer and the refreezing (negative) area of the cold layer beneath, each
#     Rd * integral of (T - 273.15) d ln p, which is g * integral of (T - T0)/T dz; the
#     thresholds below are stated from memory.
#   Wet-bulb temperature: ASHRAE Handbook - Fundamentals (2017) ch. 1 eq. 33 (as
#     moisture.wet_bulb), solved here for the height where the wet bulb is 0 degC.
#   Frost point: Hyland & Wexler (1983) over liquid water, ASHRAE Fundamentals ch. 1
#     eq. 6, for the dewpoint's vapour pressure (the Alduchov & Eskridge water fit is 3 %
#     low at -60 degC), and the library's ice curve (moisture, Alduchov & Eskridge).
#   Fog: a temperature-dewpoint spread of 3 K (5 degF) or less makes fog or low stratus
#     likely, the more so as the air cools (common practice).
#   Carburettor icing: the chart of temperature and humidity in the UK Civil Aviation
#     Authority's Safety Sense Leaflet 14, "Piston Engine Icing"; the band edges below
#     are recalled from that chart (from memory), approximate: check the leaflet.
# This module is an extra on a board (lapsecalc/package-full.json): Column.report()
# imports it when it is there and leaves its keys out when it is not.
from math import exp, log, fabs
from lapsecalc.constants import G0, T0_K, EPS, DRY_LAPSE_K_PER_KM
from lapsecalc.limits import check, check_dew
from lapsecalc.standard import ratio_ln, layer_pressure
from lapsecalc.moisture import _es_water, _AE_A, _AE_ICE, relative_humidity
from lapsecalc import parcel
from lapsecalc.stability import _illinois, NEUTRAL_BAND_K_PER_KM, CAUTIONS
from lapsecalc.condensation import cloud_base

# Coldest temperature of the icing band, degC (common practice).
ICING_COLDEST_C = -20.0
# Bourgouin (2000) thresholds, J/kg (from memory): a warm layer aloft with less
# melting area than this leaves snow; refreezing area above 66 + 0.66 * melting area
# gives ice pellets, below 46 + 0.66 * melting area freezing rain, between both.
BOURGOUIN_MELT_MIN_J_KG = 2.0
BOURGOUIN_PELLETS_J_KG = 66.0
BOURGOUIN_GLAZE_J_KG = 46.0
BOURGOUIN_SLOPE = 0.66
# Bourgouin (2000), a warm layer at the ground (from memory): below 5.6 J/kg snow
# reaches the ground, above 13.2 J/kg rain, between both a mix.
BOURGOUIN_SURFACE_SNOW_J_KG = 5.6
BOURGOUIN_SURFACE_RAIN_J_KG = 13.2
# Fog or low stratus likely at or under this temperature-dewpoint spread, K (common
# practice).
FOG_SPREAD_K = 3.0
# Carburettor icing bands, most serious first: (band, lowest and highest air
# temperature degC, least RH over water %). Recalled from the chart of the CAA Safety
# Sense Leaflet 14 (from memory, approximate). Band names are ours: any_power (serious
# icing at any power), cruise_and_glide (moderate at cruise power, serious at descent
# power), glide (serious at descent power), light (light at cruise or descent power).
CARB_BANDS = (
    ("any_power", -10.0, 20.0, 80.0),
    ("cruise_and_glide", -10.0, 30.0, 60.0),
    ("glide", -10.0, 35.0, 50.0),
    ("light", -10.0, 38.0, 30.0),
)
CARB_SERIOUS = ("any_power", "cruise_and_glide", "glide")


# Hyland & Wexler (1983) over water, ln(p / Pa) = C8/T + C9 + C10 T + C11 T^2 + C12 T^3
# + C13 ln T, T in K (ASHRAE Fundamentals ch. 1 eq. 6).
_HW_WATER = (-5.8002206e3, 1.3914993, -4.8640239e-2, 4.1764768e-5, -1.4452093e-8, 6.5459673)


def _es_water_hw(t_c):
    # Hyland & Wexler over liquid water (supercooled below 0 degC), hPa.
    c8, c9, c10, c11, c12, c13 = _HW_WATER
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


def capped_top(col, base_msl_m, pa):
    """Top, m MSL, of a cloud deck capped low: the cloud base lies in the ELR layer
    right under an inversion (air warming with height, or isothermal), or in the
    inversion itself, and the surface parcel (parcel_analysis dict pa) does not rise
    through that inversion (no LFC, or its EL inside or under it); the deck then fills
    the moist mixed layer up to the inversion's base. None otherwise."""
    n = len(col.layers)
    for i in range(n):
        z0, z1, _, grad, _ = col.layers[i]
        if z1 < base_msl_m:
            continue
        if grad >= 0.0:
            cap, cap_top = base_msl_m, z1
        elif i + 1 < n and col.layers[i + 1][3] >= 0.0:
            cap, cap_top = z1, col.layers[i + 1][1]
        else:
            return None
        if pa["lfc_msl_m"] is None or (not pa["el_above_top"] and pa["el_msl_m"] <= cap_top):
            return cap
        return None
    return None


def _thermals(col, r):
    # The heated thermals' cloud base, the usable top, capped decks and the trigger
    # wording, from the keys stability.add_to_report set.
    excess = r["thermal_excess_c"]
    th_lcl = col.elev_m + (r["cloud_base_agl_m"] if excess == 0.0 else
                           cloud_base(min(col.t_c + excess, 60.0), col.td_c, col.p_hpa)[0])
    if th_lcl > col.top_m:
        th_lcl = None
    top = r["thermal_top_msl_m"]
    cap = None
    still = top is not None and top - col.elev_m < 1.0      # no thermal rises
    reach = top
    if still:
        # Unless the lowest layer is dry-neutral: a mixed layer, stirred to its top.
        z1, grad = col.layers[0][1], col.layers[0][3]
        mixed = fabs(-1000.0 * grad - DRY_LAPSE_K_PER_KM) <= NEUTRAL_BAND_K_PER_KM
        reach = z1 if mixed else col.elev_m
    if th_lcl is not None and (reach is None or reach > th_lcl):
        cap = capped_top(col, th_lcl, r)
        kind = "capped" if cap is not None else "none" if still else "cumulus"
    else:
        kind = "none" if still else "blue"
    r["thermal_cloud_base_msl_m"] = th_lcl
    r["thermal_usable_top_msl_m"] = None if kind == "none" else (
        th_lcl if kind in ("cumulus", "capped") else top)
    r["thermal_kind"] = kind
    r["capped_cloud_top_msl_m"] = cap
    r["dry_thermals_from_t_c"] = r["trigger_t_c"] if kind == "none" else None


def _lower(a, b):
    # The lower of two heights; None is "not in the column".
    if a is None:
        return b
    return a if b is None or a < b else b


def _higher(a, b):
    # The higher of two heights; None (not reached in the column) counts as higher.
    if a is None or b is None:
        return None
    return a if a > b else b


def icing_band(col, levels, lcl_msl_m, cloud_top_msl_m, parcel_z0_msl_m):
    """The in-cloud layer at 0 to -20 degC where airframe icing is most likely
    (common practice), conservative: (bottom_msl_m, top_msl_m or None, basis), or None.

    With dewpoints aloft (col.dews): basis "layers", the cloud layers
    (lapsecalc.aloft.cloud_layers, spread at most 3 K) where the air is at 0 to
    -20 degC (icing_layers), from the lowest to the highest of them; above the highest
    dewpoint given the humidity is unknown, so when the air there reaches 0..-20 degC
    the band runs on from there (or from the layers below) with its top unknown (None);
    a convective cloud (an LFC) widens it as below.
    Convective cloud (cloud_top_msl_m given: an LFC exists; the top is the EL or the
    column top): the cloud mixes the rising parcel's air with the air around it, so the
    band runs from the lower of the two 0 degC levels (the air's and the parcel's,
    parcel_z0_msl_m from parcel.level) to the higher of the two -20 degC levels, inside
    the cloud: basis "parcel". Otherwise, or when that leaves nothing (a cloud topped
    below freezing, with the humidity aloft unknown), cloud can still lie above the
    cloud base: the band starts at the air's 0 degC level (or the cloud base, if
    higher) and its top is unknown (None): basis "air". None when there is no cloud
    base in the column, the air never reaches 0 degC, or the cloud base is above the
    air's -20 degC level."""
    return _icing_band(col, levels, lcl_msl_m, cloud_top_msl_m, parcel_z0_msl_m,
                       col.level(0.0), col.level(ICING_COLDEST_C))


def _icing_air(col, a, b):
    # [[bottom, top], ...] of [a, b] where the air is at 0 to -20 degC, lowest first:
    # cut at the 0 and -20 degC crossings (linear layers: one side between two cuts).
    marks = [a, b]
    for t in (0.0, ICING_COLDEST_C):
        for z in col.crossings(t):
            if a < z < b:
                marks.append(z)
    marks.sort()
    out = []
    for i in range(len(marks) - 1):
        lo, hi = marks[i], marks[i + 1]
        if hi - lo < 0.01:
            continue
        t = col.t_at(0.5 * (lo + hi))
        if ICING_COLDEST_C <= t <= 0.0:
            if out and lo - out[-1][1] < 0.01:
                out[-1][1] = hi
            else:
                out.append([lo, hi])
    return out


def icing_layers(col, clouds=None):
    """[[bottom_m, top_m], ...] MSL, lowest first: the parts of the cloud layers from
    dewpoints aloft (clouds, lapsecalc.aloft.cloud_layers; found when not given) where
    the air is at 0 to -20 degC (common practice); None without dewpoints aloft."""
    if clouds is None:
        if col.dews is None:
            return None
        from lapsecalc.aloft import cloud_layers
        clouds = cloud_layers(col)
    out = []
    for a, b in clouds:
        out.extend(_icing_air(col, a, b))
    return out


def _layers_band(col, pieces, convective):
    # The band from icing_layers pieces, the air above the highest dewpoint and the
    # convective band (or None): (bottom, top or None, "layers") or None.
    bottom = top = None
    if pieces:
        bottom, top = pieces[0][0], pieces[-1][1]
    if convective is not None:
        bottom = _lower(bottom, convective[0])
        if top is None or top < convective[1]:
            top = convective[1]
    z_dew = col.dews[-1][0]
    above = _icing_air(col, z_dew, col.top_m) if z_dew < col.top_m else []
    if above:
        # Humidity not given there: cloud can exist, top unknown.
        bottom, top = _lower(bottom, above[0][0]), None
    if bottom is None:
        return None
    return bottom, top, "layers"


def _icing_band(col, levels, lcl_msl_m, cloud_top_msl_m, parcel_z0_msl_m, z0a, z20a,
                pieces=None):
    # icing_band with the air's 0 and -20 degC levels (col.level) given; pieces:
    # icing_layers(col), when at hand.
    convective = None
    if lcl_msl_m is not None and z0a is not None and (z20a is None or lcl_msl_m < z20a) \
            and cloud_top_msl_m is not None:
        z20p = parcel.level(col, levels, ICING_COLDEST_C, lcl_msl_m)
        bottom = max(lcl_msl_m, _lower(z0a, parcel_z0_msl_m))
        top = _higher(z20a, z20p)
        if top is None or top > cloud_top_msl_m:
            top = cloud_top_msl_m
        if bottom < top:
            convective = (bottom, top, "parcel")
    if col.dews is not None:
        return _layers_band(col, icing_layers(col) if pieces is None else pieces, convective)
    if convective is not None:
        return convective
    if lcl_msl_m is None or z0a is None or (z20a is not None and lcl_msl_m >= z20a):
        return None
    bottom = max(lcl_msl_m, z0a)
    if bottom >= col.top_m:
        return None
    return bottom, None, "air"


def _area(col, a, b):
    # g * integral of (T - T0)/T dz over [a, b] (a < b), J/kg: per linear ELR layer,
    # exactly g dz (1 - T0 ln(Tb/Ta) / (Tb - Ta)), in ratio_ln form (no cancellation).
    out = 0.0
    for z0, z1, t0, grad, _ in col.layers:
        lo = a if a > z0 else z0
        hi = b if b < z1 else z1
        if hi <= lo:
            continue
        ta = t0 + grad * (lo - z0)
        dz = hi - lo
        out += G0 * dz * (1.0 - T0_K / ta * ratio_ln(grad * dz / ta))
    return out


def _segments(col):
    # The column cut at its 0 degC crossings: [(bottom, top, warm), ...], bottom first,
    # neighbours of the same kind merged (a touch of 0 degC does not split a layer).
    marks = [col.elev_m] + [z for z in col.crossings(0.0) if col.elev_m < z < col.top_m]
    marks.append(col.top_m)
    out = []
    for i in range(len(marks) - 1):
        a, b = marks[i], marks[i + 1]
        if b - a < 0.01:
            continue
        warm = col.t_at(0.5 * (a + b)) > 0.0
        if out and out[-1][2] == warm:
            out[-1] = (out[-1][0], b, warm)
        else:
            out.append((a, b, warm))
    return out


def _warmest(col, a, b):
    # Highest air temperature in [a, b], degC (linear layers: at an end or a boundary).
    t = col.t_at(a)
    for z0, z1, t0, grad, _ in col.layers:
        for z in (z0, z1, b):
            if a <= z <= b:
                tz = col.t_at(z)
                if tz > t:
                    t = tz
    return t


def warm_layer(col, seg=None):
    """The lowest layer of air above 0 degC that lies on air at or below 0 degC (the
    freezing-rain set-up), as a dict: warm_layer_bottom_msl_m, warm_layer_top_msl_m
    (the column top when it reaches it), warm_layer_max_t_c, cold_layer_below_depth_m
    (the sub-freezing layer right beneath), melt_area_j_kg and refreeze_area_j_kg
    (Bourgouin's positive and negative areas, J/kg, both positive). None when there is
    no such layer. seg: _segments(col), when already at hand."""
    if seg is None:
        seg = _segments(col)
    for i in range(1, len(seg)):
        a, b, warm = seg[i]
        if warm and not seg[i - 1][2]:
            c = seg[i - 1][0]
            return {"warm_layer_bottom_msl_m": a, "warm_layer_top_msl_m": b,
                    "warm_layer_max_t_c": _warmest(col, a, b),
                    "cold_layer_below_depth_m": a - c,
                    "melt_area_j_kg": _area(col, a, b),
                    "refreeze_area_j_kg": -_area(col, c, a)}
    return None


def _aloft_type(melt_j_kg, refreeze_j_kg):
    # Bourgouin (2000), a warm layer over a cold layer (from memory).
    if melt_j_kg < BOURGOUIN_MELT_MIN_J_KG:
        return "snow"
    if refreeze_j_kg > BOURGOUIN_PELLETS_J_KG + BOURGOUIN_SLOPE * melt_j_kg:
        return "pellets"
    if refreeze_j_kg < BOURGOUIN_GLAZE_J_KG + BOURGOUIN_SLOPE * melt_j_kg:
        return "glaze"
    return "glaze_or_pellets"


def precip_type(col, warm=None, seg=None):
    """Likely type of any precipitation at the ground, by Bourgouin's (2000) area
    method (thresholds from memory): "glaze" (freezing rain), "pellets" (ice pellets),
    "glaze_or_pellets", "snow", "rain_or_snow", "rain". warm is warm_layer(col) (found
    when not given; seg: _segments(col), when at hand). Precipitation is taken to start
    as snow at the column's cold top; a column above 0 degC throughout gives rain."""
    if seg is None:
        seg = _segments(col)
    if warm is None:
        warm = warm_layer(col, seg)
    if warm is None:
        kind = "rain" if seg[-1][2] else "snow"
    elif warm["warm_layer_top_msl_m"] >= col.top_m:
        # Warm to the top: the drops form liquid and fall into the cold layer.
        kind = _aloft_type(1.0e9, warm["refreeze_area_j_kg"])
    else:
        kind = _aloft_type(warm["melt_area_j_kg"], warm["refreeze_area_j_kg"])
    if not seg[0][2] or kind == "rain":
        return kind
    # A warm layer at the ground melts what falls into it.
    if kind == "glaze":
        return "rain"
    melt = _area(col, seg[0][0], seg[0][1])
    if melt > BOURGOUIN_SURFACE_RAIN_J_KG:
        return "rain"
    if melt > BOURGOUIN_SURFACE_SNOW_J_KG:
        return "rain_or_snow"
    return "snow" if kind == "snow" else "pellets"


def _wb_excess(col, z):
    # ASHRAE eq. 33 at a wet bulb of 0 degC minus the air's mixing ratio at z: negative
    # while the wet bulb there is above 0 degC (the balance grows with the wet bulb).
    # The air's vapour as Column.vapour_pressure_at: with dewpoints aloft from them
    # (lapsecalc.aloft), else from the surface mixing ratio, capped at saturation,
    # computed here with one layer lookup (a board allocates per float).
    for z0, z1, t0, grad, p0 in col.layers:
        if z <= z1:
            break
    t = t0 + grad * (z - z0) - T0_K
    p = layer_pressure(p0, t0, grad, z - z0)
    if col.dews is None:
        r = col.r_kg_kg
        e = r * p / (EPS + r)
        es = _es_water(t)
        if e > es:
            e = es
    else:
        e = col.vapour_pressure_at(z)
    return (2501.0 * EPS * _AE_A / (p - _AE_A) - 1.006 * t) / (2501.0 + 1.86 * t) \
        - EPS * e / (p - e)


def wet_bulb_zero(col):
    """Lowest height, m MSL, where the wet-bulb temperature of the column's air is
    0 degC (the snow level: falling snow melts little above it); the elevation when it
    is at or below 0 degC at the surface; None when it stays above 0 degC.

    The air's humidity is the column's (Column.vapour_pressure_at: the dewpoints aloft
    where given, else the surface mixing ratio). The wet bulb is never above the air
    temperature, so it reaches 0 degC at or below the air's 0 degC level and the
    search runs from the surface to that level (or the column top): the sign is
    sampled at the layer boundaries and the heights of the dewpoints aloft (between
    them temperature and dewpoint are linear and the wet bulb changes monotonically),
    then Illinois (regula falsi) steps, at most 40, to 0.5 m (stability._illinois)."""
    return _wet_bulb_zero(col, col.level(0.0))


def _wet_bulb_zero(col, z_frz):
    # wet_bulb_zero with the air's 0 degC level z_frz (None: not in the column) given.
    if z_frz is not None and col.dews is None:
        r = col.r_kg_kg
        if r * col.p_at(z_frz) / (EPS + r) >= _AE_A:
            # Saturated at 0 degC there: below it the dewpoint of the same mixing ratio
            # is above 0 degC (higher pressure) and so is the air, so the wet bulb too.
            return z_frz
    z_end = col.top_m if z_frz is None else z_frz
    a = col.elev_m
    fa = _wb_excess(col, a)
    if fa >= 0.0:
        return a
    marks = [layer[1] for layer in col.layers]
    if col.dews is not None:
        marks = sorted(marks + [z for z, _ in col.dews])
    for m in marks:
        if m <= a:
            continue
        b = m if m < z_end else z_end
        fb = _wb_excess(col, b)
        if fb >= 0.0:
            return _illinois(lambda z: -_wb_excess(col, z), a, -fa, b, -fb,
                             "the wet-bulb freezing level")
        if b >= z_end:
            break
        a, fa = b, fb
    # Saturated air at 0 degC: the wet bulb is 0 there too (fb short of 0 by rounding).
    return z_frz


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
    return t_c - td_c <= FOG_SPREAD_K


def _h(z_m):
    # A height for a caution sentence: metres and feet.
    return "%d m (%d ft)" % (round(z_m), round(z_m / 0.3048))


_PRECIP_WORDS = {"glaze": "freezing rain", "pellets": "ice pellets",
                 "glaze_or_pellets": "freezing rain or ice pellets", "snow": "snow",
                 "rain_or_snow": "rain or snow", "rain": "rain"}
_CARB_WORDS = {"any_power": "serious at any power",
               "cruise_and_glide": "serious at descent power, moderate at cruise power",
               "glide": "serious at descent power"}


def cautions(r):
    """The caution sentences for report r: one per hazard present, then the general
    ones (CAUTIONS). Heights MSL in metres and feet, temperatures in degC."""
    out = []
    b = r.get("icing_band_bottom_msl_m")
    if b is not None:
        t = r["icing_band_top_msl_m"]
        out.append("Icing likely in cloud from %s MSL %s." % (
            _h(b), "to %s" % _h(t) if t is not None else
            "up (no dewpoints given above)" if r["icing_band_basis"] == "layers" else
            "up (cloud tops unknown)"))
    if r.get("warm_layer_bottom_msl_m") is not None:
        out.append("Warm layer (max %+.1f degC) %s to %s MSL over freezing air %d m deep:"
                   " freezing rain or ice pellets possible, here %s." % (
                       r["warm_layer_max_t_c"], _h(r["warm_layer_bottom_msl_m"]),
                       _h(r["warm_layer_top_msl_m"]), round(r["cold_layer_below_depth_m"]),
                       _PRECIP_WORDS[r["precip_type"]]))
    if r.get("fog_risk"):
        out.append("Spread %.1f K at the field: fog or low stratus likely." % (
            r["t_c"] - r["td_c"]))
    if r.get("ice_fog_risk"):
        out.append("Air saturated over ice (%.0f %%): ice fog, ice crystals or frost; a"
                   " cloud base from the dewpoint means little." % r["rh_ice_pct"])
    if r.get("carb_icing") in CARB_SERIOUS:
        out.append("Carburettor icing %s: carb heat as the flight manual says." %
                   _CARB_WORDS[r["carb_icing"]])
    return out + list(CAUTIONS)


_WARM_KEYS = ("warm_layer_bottom_msl_m", "warm_layer_top_msl_m", "warm_layer_max_t_c",
              "cold_layer_below_depth_m")


def add_to_report(col, levels, r):
    """Add the hazard keys, the thermals' cloud base, usable top and capped decks
    (refining thermal_kind) and the cautions to report dict r (after the stability
    keys: it reads the cloud base, the LFC, the EL, the thermal keys and the parcel's
    0 degC level)."""
    _thermals(col, r)
    lcl = r["cloud_base_msl_m"]
    cloud_top = None
    if r["lfc_msl_m"] is not None:
        cloud_top = col.top_m if r["el_above_top"] else r["el_msl_m"]
    clouds = r.get("cloud_layers_msl_m")
    pieces = None if clouds is None else icing_layers(col, clouds)
    band = _icing_band(col, levels, lcl, cloud_top, r["parcel_freezing_level_msl_m"],
                       r["freezing_level_msl_m"], r["minus20_level_msl_m"], pieces)
    r["icing_layers_msl_m"] = pieces or None
    r["icing_band_bottom_msl_m"] = None if band is None else band[0]
    r["icing_band_top_msl_m"] = None if band is None else band[1]
    r["icing_band_basis"] = None if band is None else band[2]
    seg = _segments(col)
    warm = warm_layer(col, seg)
    for k in _WARM_KEYS:
        r[k] = None if warm is None else warm[k]
    r["precip_type"] = precip_type(col, warm, seg)
    r["wet_bulb_zero_msl_m"] = _wet_bulb_zero(col, r["freezing_level_msl_m"])
    t, td = col.t_c, col.td_c
    r["frost_point_c"] = frost_point(td) if td <= 0.0 else None
    r["rh_ice_pct"] = relative_humidity_ice(t, td) if t <= 0.0 else None
    r["fog_risk"] = fog_risk(t, td)
    r["ice_fog_risk"] = r["rh_ice_pct"] is not None and r["rh_ice_pct"] >= 100.0
    r["carb_icing"] = carb_icing(t, td)
    r["cautions"] = cautions(r)
