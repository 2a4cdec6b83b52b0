"""The interpreter's words for temperatures aloft: `aloft LEVEL TEMP[/DEW] ...` and
`trop H|none` (runs on MicroPython; loaded only by these words and by show)."""
# Sources: flight level pressures from the ICAO standard atmosphere (ICAO Doc 7488/3,
#   via state.fl_pressure_hpa).
# Layer: under settings, layout and queries (which import it inside the words), over
# state, typed and output.
#
# State keys (lapsecalc.state): "aloft", a tuple of points (kind, level, t_c, td_c or
# None), kind "z" (level m MSL), "p" (hPa) or "fl" (flight level); lowest first.
# "trop_m": the tropopause, m MSL, or None (off); absent means the ICAO 11000 m.
from lapsecalc.limits import T_MIN_C, T_MAX_C, DEW_SLACK_K, TOP_MAX_M, const
from lapsecalc.aliases import shown
from lapsecalc.state import DEFAULT_TOP_M, fl_pressure_hpa

# At most this many points (a board's session heap).
_MAX_POINTS = const(24)
# Two points closer than this (m, or hPa) are one level: the new one replaces the old.
_SAME = const(0.01)


def _level(pt, by_p=True):
    # A point's place among its kind, lowest first: m for a height point, -p hPa for a
    # pressure level. A flight level is a pressure (state.fl_pressure_hpa: the standard
    # atmosphere's code) when by_p; against another flight level (not by_p) its number
    # places it the same way, and two are one level only when their numbers are
    # (flight levels 100 ft apart differ by more than 0.05 hPa; _SAME is 0.01).
    kind, level = pt[0], pt[1]
    if kind == "fl":
        return -fl_pressure_hpa(level) if by_p else level
    return level if kind == "z" else -level


def _apart(a, b):
    # The keys' difference of points a and b (b less a; None when one is a height and
    # the other a pressure level): a flight level's pressure only against a pressure.
    if (a[0] == "z") != (b[0] == "z"):
        return None
    by_p = a[0] != b[0]
    return _level(b, by_p) - _level(a, by_p)


def _below(a, b):
    # Whether point a lies below point b (a height point below every pressure level).
    d = _apart(a, b)
    return a[0] == "z" if d is None else d > 0.0


def _same(a, b):
    # Whether points a and b are at one level (the new one replaces the old).
    d = _apart(a, b)
    return d is not None and abs(d) < _SAME


def set_aloft(s, new, args, parse_level):
    """Merge the points LEVEL TEMP[/DEW] typed in args into new["aloft"]; the words of
    the ok line. parse_level is settings.parse_level. ValueError in the user's words;
    new is then left as it was."""
    if not args or len(args) % 2:
        raise ValueError("takes pairs LEVEL TEMP[/DEW], e.g. aloft 6000ft 9C/2C FL180 -14C")
    from lapsecalc.typed import value, said
    pts = list(new.get("aloft", ()))
    told = []
    bare = s.disp["t"]
    for i in range(0, len(args), 2):
        lev, tt = args[i], args[i + 1]
        kind, level = parse_level(lev)
        if kind == "p" and not 1.0 <= level <= 1100.0:
            raise ValueError("%s is outside 1..1100 hPa" % said(lev, "hpa"))
        parts = tt.split("/")
        if len(parts) > 2:
            raise ValueError("'%s': write TEMP or TEMP/DEW, e.g. 9C/2C" % shown(tt))
        t = value(parts[0], "t", bare, T_MIN_C, T_MAX_C)
        td = None
        if len(parts) == 2:
            td = value(parts[1], "t", bare, T_MIN_C, T_MAX_C)
            if td > t + DEW_SLACK_K:
                raise ValueError("%s: dew %s is above temp %s; a dewpoint cannot exceed the"
                                 " temperature" % (shown(lev), said(parts[1], bare),
                                                   said(parts[0], bare)))
            td = t if td > t else td
        pt = (kind, level, t, td)
        # The points stay in order, lowest first: the new one replaces one at its
        # level and goes in before the first above it.
        pts = [q for q in pts if not _same(q, pt)]
        j = 0
        while j < len(pts) and _below(pts[j], pt):
            j += 1
        pts.insert(j, pt)
        told.append("%s %s" % (shown(lev), shown(tt)))
    if len(pts) > _MAX_POINTS:
        raise ValueError("%d points; accepted at most %d (clear aloft forgets them)"
                         % (len(pts), _MAX_POINTS))
    new["aloft"] = tuple(pts)
    return "aloft %s, %d point%s set" % (", ".join(told), len(pts),
                                          "" if len(pts) == 1 else "s")


def set_trop(s, new, args, echo):
    """trop H (m MSL, display unit when bare) or trop none; echo is settings.echo."""
    if args[0].lower() in ("none", "off"):
        new["trop_m"] = None
        return "tropopause none (no isothermal part)"
    from lapsecalc.typed import value
    new["trop_m"] = value(args[0], "h", s.disp["h"], 0.0, TOP_MAX_M)
    return "tropopause " + echo(s, args[0], "h", s.disp["h"], new["trop_m"])


def level_text(s, pt):
    """A point's level as shown: "6000 ft", "FL180", "700.0 hPa"."""
    from lapsecalc.output import f_h1, f_p
    kind, level = pt[0], pt[1]
    if kind == "fl":
        return "FL%03d" % level
    return f_h1(s, level) if kind == "z" else f_p(s, level, True)


def point_text(s, pt):
    """One point as show lists it: "6000 ft 9.0 C/2.0 C"."""
    from lapsecalc.output import f_t
    td = "" if pt[3] is None else "/" + f_t(s, pt[3], True)
    return "%s %s%s" % (level_text(s, pt), f_t(s, pt[2], True), td)


def point_kv(pt):
    """One point in kv/json form: "z914.4:15:" (kind and level, degC, dew degC or empty)."""
    return "%s%g:%g:%s" % (pt[0], pt[1], pt[2], "" if pt[3] is None else "%g" % pt[3])


def check(s, new, p_stn):
    """What one point alone cannot tell: a height point at or below the field or above
    the column top, a pressure point at or above the station pressure p_stn (hPa, None
    when not known yet), a tropopause too close to the field. ValueError in the user's
    display units (the display code, lapsecalc.output, loaded only to say one)."""
    elev = new.get("elev_m")
    top = new.get("top_m", DEFAULT_TOP_M)
    for pt in new.get("aloft", ()):
        if pt[0] == "z":
            if elev is not None and pt[1] <= elev:
                from lapsecalc.output import f_h1
                raise ValueError("aloft %s is not above the field (elev %s)"
                                 % (level_text(s, pt), f_h1(s, elev)))
            if pt[1] > top:
                from lapsecalc.output import f_h1
                raise ValueError("aloft %s is above the column top (top %s)"
                                 % (level_text(s, pt), f_h1(s, top)))
        elif p_stn is not None and -_level(pt) >= p_stn:
            from lapsecalc.output import f_p
            raise ValueError("aloft %s is not above the field: its pressure is not under"
                             " the station pressure %s" % (level_text(s, pt), f_p(s, p_stn, True)))
    trop = new.get("trop_m")
    if trop is not None and elev is not None and trop < elev + 100.0:
        from lapsecalc.output import f_h1
        raise ValueError("trop %s is less than 100 m (328 ft) above the field (%s)"
                         % (f_h1(s, trop), f_h1(s, elev)))


def check_whole(s, new):
    """check() for the state new with the station pressure it gives (None without a
    field elevation): settings.whole leaves it to the caller (lapsecalc.shell), which
    runs it once the setting words' code is let go of."""
    press, elev = new.get("press"), new.get("elev_m")
    p_stn = None
    if press is not None and press[0] == "stn":
        p_stn = press[1]
    elif elev is not None:
        from lapsecalc.standard import station_pressure
        from lapsecalc.state import STANDARD_QNH_HPA
        p_stn = station_pressure(press[1] if press is not None else STANDARD_QNH_HPA, elev)
    check(s, new, p_stn)
