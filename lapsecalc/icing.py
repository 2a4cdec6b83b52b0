"""The icing band: the in-cloud layer at 0 to -20 degC where airframe icing is most
likely, with its basis (the rising parcel, the air, or the cloud layers from dewpoints
aloft)."""
# Sources:
#   Icing band: airframe icing is most likely in cloud between 0 and -20 degC (common
#     practice; REFERENCES.md "Lapse rates"); with dewpoints aloft, cloud where the
#     dewpoint depression is at most 3 K (common practice; lapsecalc.aloft).
# An extra on a board, loaded by lapsecalc.hazards for one report and dropped after it.
from lapsecalc import parcel
from lapsecalc.limits import const

# Coldest temperature of the icing band, degC (common practice).
_ICING_COLDEST_C = const(-20.0)


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
    zs = col.crossings(0.0)
    z20s = col.crossings(_ICING_COLDEST_C)
    return _icing_band(col, levels, lcl_msl_m, cloud_top_msl_m, parcel_z0_msl_m,
                       col.level(0.0, zs), col.level(_ICING_COLDEST_C, z20s), None, zs + z20s)


def _icing_air(col, a, b, crossings):
    # [[bottom, top], ...] of [a, b] where the air is at 0 to -20 degC, lowest first:
    # cut at the 0 and -20 degC crossings (given in one list; linear layers: one side
    # between two cuts).
    marks = [a, b]
    for z in crossings:
        if a < z < b:
            marks.append(z)
    marks.sort()
    out = []
    for i in range(len(marks) - 1):
        lo, hi = marks[i], marks[i + 1]
        if hi - lo < 0.01:
            continue
        t = col.t_at(0.5 * (lo + hi))
        if _ICING_COLDEST_C <= t <= 0.0:
            if out and lo - out[-1][1] < 0.01:
                out[-1][1] = hi
            else:
                out.append([lo, hi])
    return out


def icing_layers(col, clouds=None, crossings=None):
    """[[bottom_m, top_m], ...] MSL, lowest first: the parts of the cloud layers from
    dewpoints aloft (clouds, lapsecalc.aloft.cloud_layers; found when not given) where
    the air is at 0 to -20 degC (common practice); None without dewpoints aloft.
    crossings: the column's crossings(0) and crossings(-20) in one list (found when
    not given)."""
    if clouds is None:
        if col.dews is None:
            return None
        from lapsecalc.aloft import cloud_layers
        clouds = cloud_layers(col)
    if crossings is None:
        crossings = col.crossings(0.0) + col.crossings(_ICING_COLDEST_C)
    out = []
    for a, b in clouds:
        out.extend(_icing_air(col, a, b, crossings))
    return out


def _layers_band(col, pieces, convective, crossings):
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
    above = _icing_air(col, z_dew, col.top_m, crossings) if z_dew < col.top_m else []
    if above:
        # Humidity not given there: cloud can exist, top unknown.
        bottom, top = _lower(bottom, above[0][0]), None
    if bottom is None:
        return None
    return bottom, top, "layers"


def _icing_band(col, levels, lcl_msl_m, cloud_top_msl_m, parcel_z0_msl_m, z0a, z20a,
                pieces, crossings):
    # icing_band with the air's 0 and -20 degC levels (col.level) and crossings (as
    # icing_layers takes them) given; pieces: icing_layers(col), when at hand.
    convective = None
    if lcl_msl_m is not None and z0a is not None and (z20a is None or lcl_msl_m < z20a) \
            and cloud_top_msl_m is not None:
        z20p = parcel.level(col, levels, _ICING_COLDEST_C, lcl_msl_m)
        bottom = max(lcl_msl_m, _lower(z0a, parcel_z0_msl_m))
        top = _higher(z20a, z20p)
        if top is None or top > cloud_top_msl_m:
            top = cloud_top_msl_m
        if bottom < top:
            convective = (bottom, top, "parcel")
    if col.dews is not None:
        if pieces is None:
            pieces = icing_layers(col, None, crossings)
        return _layers_band(col, pieces, convective, crossings)
    if convective is not None:
        return convective
    if lcl_msl_m is None or z0a is None or (z20a is not None and lcl_msl_m >= z20a):
        return None
    bottom = max(lcl_msl_m, z0a)
    if bottom >= col.top_m:
        return None
    return bottom, None, "air"


def add_keys(col, levels, r):
    """Add icing_band_bottom_msl_m, icing_band_top_msl_m, icing_band_basis and
    icing_layers_msl_m to report r (after the stability keys and cloud_layers_msl_m)."""
    lcl = r["cloud_base_msl_m"]
    cloud_top = None
    if r["lfc_msl_m"] is not None:
        cloud_top = col.top_m if r["el_above_top"] else r["el_msl_m"]
    clouds = r.get("cloud_layers_msl_m")
    crossings = pieces = None
    if clouds is not None:
        # Found once for every cloud layer (and the air above the highest dewpoint).
        crossings = col.crossings(0.0) + col.crossings(_ICING_COLDEST_C)
        pieces = icing_layers(col, clouds, crossings)
    band = _icing_band(col, levels, lcl, cloud_top, r["parcel_freezing_level_msl_m"],
                       r["freezing_level_msl_m"], r["minus20_level_msl_m"], pieces, crossings)
    r["icing_layers_msl_m"] = pieces or None
    r["icing_band_bottom_msl_m"] = None if band is None else band[0]
    r["icing_band_top_msl_m"] = None if band is None else band[1]
    r["icing_band_basis"] = None if band is None else band[2]
