"""Points aloft read into a Column's layers: checked, sorted, a pressure point placed
at its height (the Column's building code, lapsecalc.profile, loads this module only
for a column with points aloft, and a board lets go of it after the build)."""
# Sources:
#   Hydrostatic equation for air whose temperature is linear in height (exact):
#     z1 - z0 = R / g * ln(p0 / p1) * Tlm, Tlm the log-mean of the end temperatures
#     (the inverse of standard.layer_pressure); ICAO Doc 7488/3 for R and g.
from math import isfinite, log
from lapsecalc.constants import G0, R_DRY, T0_K, EPS
from lapsecalc.moisture import _es_water
from lapsecalc.limits import T_MIN_C, T_MAX_C, DEW_SLACK_K, SAME_LEVEL_M as _SAME_M
from lapsecalc.standard import layer_pressure, ratio_ln


def _number(name, what, v, lo, hi, unit):
    try:
        x = float(v)
    except (TypeError, ValueError):
        x = None
    if x is None or not isfinite(x) or x < lo or x > hi:
        raise ValueError("%s: %s=%r is %s; allowed %g..%g %s" % (
            name, what, v, "not a number" if x is None else "outside the allowed range",
            lo, hi, unit))
    return x


def _point(i, pt):
    # One point -> (level, by_p, t_k, td_c or None, name); ValueError naming it.
    try:
        n = len(pt)
    except TypeError:
        n = 0
    if n == 4 and isinstance(pt[3], str) and pt[3].lower() in ("hpa", "m"):
        by_p = pt[3].lower() == "hpa"
    elif n == 3:
        by_p = False
    else:
        raise ValueError("aloft point %d=%r must be (z_msl_m, t_c, td_c) or (p_hpa, t_c, td_c,"
                         " \"hPa\"); td_c may be None" % (i + 1, pt))
    try:
        level = float(pt[0])
    except (TypeError, ValueError):
        level = float("nan")
    if not isfinite(level):
        raise ValueError("aloft point %d: level=%r is not a finite number; allowed a height in"
                         " m MSL or a pressure in hPa" % (i + 1, pt[0]))
    name = "aloft point %d (%g %s)" % (i + 1, level, "hPa" if by_p else "m MSL")
    t = _number(name, "t_c", pt[1], T_MIN_C, T_MAX_C, "degC")
    td = pt[2]
    if td is not None:
        td = _number(name, "td_c", td, T_MIN_C, T_MAX_C, "degC")
        if td > t + DEW_SLACK_K:
            raise ValueError("%s: td_c=%g is above t_c=%g; a dewpoint may not exceed the"
                             " temperature" % (name, td, t))
        if td > t:
            td = t
    return level, by_p, t + T0_K, td, name


def resolve(aloft, elev_m, t_k, p_hpa, top_m):
    """The points aloft as [(z_m, t_k, td_c or None), ...], lowest first, for a column
    whose surface is (elev_m, t_k, p_hpa) and whose top is top_m.

    A point is (z_msl_m, t_c, td_c) or (p_hpa, t_c, td_c, "hPa"); td_c may be None.
    Unsorted input is sorted. A pressure point lands where the column's own
    hydrostatic pressure equals it: walking up from the surface, the next node is the
    next pressure point when the next height point would have a pressure at or under
    it, else that height point; a pressure point is placed by the exact thickness of
    the linear layer from the node below. Refused with a
    ValueError naming the point: a level that is not a number, a temperature outside
    -90..60 degC, a dewpoint above its temperature, a level at or below the surface or
    above top_m, and two points at one level (both named).
    """
    try:
        items = list(aloft)
    except TypeError:
        raise ValueError("aloft=%r must be a list of points (z_msl_m, t_c, td_c)" % (aloft,))
    hs, ps = [], []
    for i, pt in enumerate(items):
        level, by_p, t, td, name = _point(i, pt)
        if by_p:
            if not 0.0 < level < p_hpa:
                raise ValueError("%s is not above the surface: allowed pressures under the"
                                 " station pressure %.2f hPa" % (name, p_hpa))
            ps.append((-level, t, td, name))
        else:
            if not elev_m < level <= top_m:
                raise ValueError("%s is outside the column: allowed heights above the elevation"
                                 " %g m up to the column top %g m MSL" % (name, elev_m, top_m))
            hs.append((level, t, td, name))
    hs.sort(key=lambda x: (x[0], len(x[3]), x[3]))  # ties in input order, on any port
    ps.sort(key=lambda x: (x[0], len(x[3]), x[3]))
    for lst, unit, sign in ((hs, "m MSL", 1.0), (ps, "hPa", -1.0)):
        for i in range(1, len(lst)):
            if lst[i][0] - lst[i - 1][0] < _SAME_M:
                raise ValueError("%s and %s are at the same level (%g %s); keep one of"
                                 " them" % (lst[i - 1][3], lst[i][3], sign * lst[i][0], unit))
    out = []
    z, t, p = elev_m, t_k, p_hpa
    ih = ip = 0
    last = None
    while ih < len(hs) or ip < len(ps):
        # The next pressure point comes first when the next height point, joined to
        # the node below, has a pressure at or under it (no height point: always).
        take_p = ip < len(ps)
        if take_p and ih < len(hs):
            zh, th = hs[ih][0], hs[ih][1]
            take_p = layer_pressure(p, t, (th - t) / (zh - z), zh - z) <= -ps[ip][0]
        if take_p:
            pn, tn, tdn, name = -ps[ip][0], ps[ip][1], ps[ip][2], ps[ip][3]
            ip += 1
            zn = z + R_DRY / G0 * (t / ratio_ln((tn - t) / t)) * log(p / pn)
            if zn > top_m:
                raise ValueError("%s lands at %.6g m MSL, above the column top %g m: allowed"
                                 " pressures inside the column" % (name, zn, top_m))
            if ih < len(hs) and zn > hs[ih][0] - _SAME_M:
                raise ValueError("%s and %s are at the same level or contradict each other"
                                 " (%.2f and %g m MSL); keep one of them"
                                 % (name, hs[ih][3], zn, hs[ih][0]))
        else:
            zn, tn, tdn, name = hs[ih]
            ih += 1
        if zn - z < _SAME_M:
            if last is None:  # the lowest point, within a centimetre of the field
                raise ValueError("%s is at the field's level (under %g m above it); allowed"
                                 " heights above the elevation %g m" % (name, _SAME_M, z))
            raise ValueError("%s and %s are at the same level (%.2f m MSL); keep one of"
                             " them" % (last, name, zn))
        p = layer_pressure(p, t, (tn - t) / (zn - z), zn - z)
        out.append((zn, tn, tdn))
        z, t, last = zn, tn, name
    return out


def build(col, aloft, layers, top_m):
    """Append the layers of the points aloft (resolve) to layers, for Column col whose
    surface is set; set col.aloft_m (the points' heights) and col.dews (the surface
    and every point with a dewpoint: [(z_m, td_c), ...]; None when no point has one)
    and col.r_aloft_kg_kg (the mixing ratio at the highest dewpoint). Returns
    (z_m, t_k, p_hpa) at the last point."""
    z, t, p = col.elev_m, col.t_c + T0_K, col.p_hpa
    dews = [(z, col.td_c)]
    col.aloft_m = []
    for zn, tn, tdn in resolve(aloft, z, t, p, top_m):
        grad = (tn - t) / (zn - z)
        layers.append((z, zn, t, grad, p))
        p = layer_pressure(p, t, grad, zn - z)
        z, t = zn, tn
        col.aloft_m.append(zn)
        if tdn is not None:
            dews.append((zn, tdn))
            col.r_aloft_kg_kg = EPS * _es_water(tdn) / (p - _es_water(tdn))
    if len(dews) > 1:
        col.dews = dews
    return z, t, p
