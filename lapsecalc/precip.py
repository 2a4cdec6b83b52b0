"""Freezing rain and ice pellets: the warm layer over freezing air, the likely
precipitation type (Bourgouin's area method), and the wet-bulb freezing level (the snow
level)."""
# Sources:
#   Precipitation type: Bourgouin, P. (2000), "A method to determine precipitation
#     types", Weather and Forecasting 15, 583-592: the melting (positive) area of a
#     warm layer and the refreezing (negative) area of the cold layer beneath, each
#     Rd * integral of (T - 273.15) d ln p, which is g * integral of (T - T0)/T dz; the
#     thresholds below are stated from memory.
#   Wet-bulb temperature: ASHRAE Handbook - Fundamentals (2017) ch. 1 eq. 33 (as
#     moisture.wet_bulb), solved here for the height where the wet bulb is 0 degC.
# An extra on a board, loaded by lapsecalc.hazards for one report and dropped after it.
from lapsecalc.constants import G0, T0_K, EPS
from lapsecalc.standard import ratio_ln, layer_pressure
from lapsecalc.moisture import _es_water, _AE_A, _mixing_ratio_kg_kg
from lapsecalc.stability import _illinois
from lapsecalc.limits import const

# Bourgouin (2000) thresholds, J/kg (from memory): a warm layer aloft with less
# melting area than this leaves snow; refreezing area above 66 + 0.66 * melting area
# gives ice pellets, below 46 + 0.66 * melting area freezing rain, between both.
_BOURGOUIN_MELT_MIN_J_KG = const(2.0)
_BOURGOUIN_PELLETS_J_KG = const(66.0)
_BOURGOUIN_GLAZE_J_KG = const(46.0)
_BOURGOUIN_SLOPE = const(0.66)
# Bourgouin (2000), a warm layer at the ground (from memory): below 5.6 J/kg snow
# reaches the ground, above 13.2 J/kg rain, between both a mix.
_BOURGOUIN_SURFACE_SNOW_J_KG = const(5.6)
_BOURGOUIN_SURFACE_RAIN_J_KG = const(13.2)


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
    if melt_j_kg < _BOURGOUIN_MELT_MIN_J_KG:
        return "snow"
    if refreeze_j_kg > _BOURGOUIN_PELLETS_J_KG + _BOURGOUIN_SLOPE * melt_j_kg:
        return "pellets"
    if refreeze_j_kg < _BOURGOUIN_GLAZE_J_KG + _BOURGOUIN_SLOPE * melt_j_kg:
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
    return _ground_type(kind, _area(col, seg[0][0], seg[0][1]))


def _ground_type(kind, melt_j_kg):
    # Bourgouin (2000), from memory: what reaches the ground through a warm layer at the
    # ground with melting area melt_j_kg, falling into it as kind (snow or ice).
    if melt_j_kg > _BOURGOUIN_SURFACE_RAIN_J_KG:
        return "rain"
    if melt_j_kg > _BOURGOUIN_SURFACE_SNOW_J_KG:
        return "rain_or_snow"
    return "snow" if kind == "snow" else "pellets"


def _wb_excess(col, z):
    # ASHRAE eq. 33 at a wet bulb of 0 degC minus the air's mixing ratio at z: negative
    # while the wet bulb there is above 0 degC (the balance grows with the wet bulb).
    # The air's vapour as Column.vapour_pressure_at: with dewpoints aloft from them
    # (lapsecalc.aloft), else from the surface mixing ratio, capped at saturation,
    # computed here with one layer lookup (a board allocates per float; calling it
    # would look the layer up twice more per Illinois step). The first term is
    # wet_bulb's balance at 0 degC, written out (its saturation pressure is _AE_A).
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
        - _mixing_ratio_kg_kg(e, p)


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


_WARM_KEYS = ("warm_layer_bottom_msl_m", "warm_layer_top_msl_m", "warm_layer_max_t_c",
              "cold_layer_below_depth_m")


def add_keys(col, levels, r):
    """Add the warm-layer keys (_WARM_KEYS), precip_type and wet_bulb_zero_msl_m to
    report r (after freezing_level_msl_m); levels is not used."""
    seg = _segments(col)
    warm = warm_layer(col, seg)
    for k in _WARM_KEYS:
        r[k] = None if warm is None else warm[k]
    r["precip_type"] = precip_type(col, warm, seg)
    r["wet_bulb_zero_msl_m"] = _wet_bulb_zero(col, r["freezing_level_msl_m"])
