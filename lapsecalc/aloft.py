"""Temperatures aloft at work in a Column: the humidity between dewpoints given aloft,
the cloud layers they mark, and the warnings about steep layers between points. (The
points are read into the Column's layers by lapsecalc.aloftpoints.)"""
# Sources:
#   Cloud layers: a dewpoint depression of at most 3 K marks air where cloud is likely
#     (common practice in reading soundings).
# Column imports this module only when points aloft are given.
from lapsecalc.moisture import _es_water
from lapsecalc.limits import SAME_LEVEL_M

# Dewpoint depression at or under which cloud is likely, K (common practice).
CLOUD_SPREAD_K = 3.0


def vapour_pressure(col, z_m):
    """Vapour pressure, hPa, at z_m in Column col with dewpoints aloft (col.dews): up
    to the highest one, from the dewpoint linear in height between the surface and
    the points that carry one, never above the temperature; above it, the mixing
    ratio there carried up, capped at saturation."""
    d = col.dews
    if z_m <= d[-1][0]:
        for i in range(1, len(d)):
            z1, td1 = d[i]
            if z_m <= z1:
                z0, td0 = d[i - 1]
                td = td0 + (td1 - td0) * (z_m - z0) / (z1 - z0)
                t = col.t_at(z_m)
                return _es_water(td if td < t else t)
    return col.vapour_pressure_at(z_m, col.r_aloft_kg_kg)


def _cloudy(a, da, b, db, out):
    # Add the part of [a, b] where the spread (linear from da to db) is at most the
    # threshold to out, a list of [bottom, top], merged with the layer below it.
    lo, hi = da <= CLOUD_SPREAD_K, db <= CLOUD_SPREAD_K
    if not lo and not hi:
        return
    if lo != hi:
        zc = a + (b - a) * (da - CLOUD_SPREAD_K) / (da - db)
        a, b = (a, zc) if lo else (zc, b)
    if out and a - out[-1][1] < SAME_LEVEL_M:
        out[-1][1] = b
    else:
        out.append([a, b])


def cloud_layers(col):
    """[[bottom_m, top_m], ...] MSL, lowest first, where the dewpoint depression is at
    most 3 K (common practice), from the field up to the highest dewpoint given aloft
    (above it the humidity is assumed, not given); None without dewpoints aloft.
    Temperature and dewpoint are linear between the column's layer boundaries and the
    dewpoint points, so the layer edges are exact there."""
    d = col.dews
    if d is None:
        return None
    top = d[-1][0]
    zs = [z for z, _ in d]
    for layer in col.layers:
        if layer[0] < top and layer[0] not in zs:
            zs.append(layer[0])
    zs.sort()
    out = []
    prev = None
    for z in zs:
        spread = col.t_at(z) - col.dewpoint_at(z)
        if prev is not None:
            _cloudy(prev[0], prev[1], z, spread, out)
        prev = (z, spread)
    return out


def steep_warnings(col):
    """Plain-language lines for layers between points that cool faster than the dry
    adiabatic rate (such air overturns at once: often a mistyped reading)."""
    from lapsecalc.constants import DRY_LAPSE_K_PER_KM
    out = []
    top = col.aloft_m[-1]
    for z0, z1, _, grad, _ in col.layers:
        if z1 > top:
            break
        if -1000.0 * grad > DRY_LAPSE_K_PER_KM + 0.5:
            out.append("The points aloft imply %.1f K/km between %.6g and %.6g m MSL, steeper"
                       " than the dry adiabatic rate; check those readings."
                       % (-1000.0 * grad, z0, z1))
    return out
