"""The interpreter's session state: its keys, the defaults assumed for what was not set,
and the Column it describes (runs on MicroPython)."""
# Sources: ICAO standard atmosphere for the defaults (common practice).
#
# A state is a plain dict. Keys: t_c, hum ("td" or "rh", value), elev_m, press ("qnh"
# or "stn", hPa), lapse (K/km, or layers [(top_agl_m or None, k_per_km), ...]), top_m,
# excess_c; balloon: env_m3, wt_kg, fill_m3, tmax_c, tenv_c (the working, mean
# envelope temperature), margin_k (tmax less the default working temperature), gas,
# purity (0.5..1), superheat_k (the gas over the air); aloft (points, lapsecalc.aloftwords),
# trop_m (tropopause m MSL or None: off).
# The setting words (lapsecalc.settings) write them into a copy; the shell commits it.
# The shell holds this module between lines: what only some lines need is imported
# inside them (lapsecalc.limits, the column), and the clear word's table of state keys
# is lapsecalc.commands.CLEAR.

ISA_LAPSE_K_PER_KM = 6.5  # ICAO standard atmosphere below 11 km (common practice)
STANDARD_QNH_HPA = 1013.25  # ICAO standard sea-level pressure (common practice)
DEFAULT_TOP_M = 16000.0
DEFAULT_TROP_M = 11000.0  # ICAO standard atmosphere tropopause (common practice)

# State keys the air column depends on (others leave the cached report alone).
AIR_KEYS = ("t_c", "hum", "elev_m", "press", "lapse", "top_m", "excess_c", "aloft", "trop_m")


def dewpoint_of(st):
    """The dewpoint of state dict st, degC (from rh when rh was set)."""
    kind, v = st["hum"]
    if kind == "td":
        from lapsecalc.limits import check_dew
        return check_dew(st["t_c"], v)[1]
    from lapsecalc.moisture import dewpoint
    return dewpoint(st["t_c"], v)


def fl_pressure_hpa(fl):
    """The pressure, hPa, of flight level fl: the ICAO standard atmosphere's pressure at
    fl hundred feet (ICAO Doc 7488/3)."""
    from lapsecalc.standard import isa
    return isa(fl * 30.48)[1]


def aloft_points(aloft):
    """The state's points aloft (its "aloft": kind, level, t_c, td_c;
    lapsecalc.aloftwords) as lapsecalc.column.Column takes them."""
    out = []
    for kind, level, t, td in aloft:
        if kind == "z":
            out.append((level, t, td))
        else:
            out.append((fl_pressure_hpa(level) if kind == "fl" else level, t, td, "hPa"))
    return out


def missing(st):
    """The setting words a Column still needs, in the order to type them."""
    return [w for w, k in (("temp", "t_c"), ("dew (or rh)", "hum"), ("elev", "elev_m"))
            if k not in st]


def build_column(st):
    """The Column of a complete state dict (ValueError when the state is not valid)."""
    from lapsecalc.column import Column
    td = dewpoint_of(st)
    kind, p = st.get("press", ("qnh", STANDARD_QNH_HPA))
    lapse = st.get("lapse", ISA_LAPSE_K_PER_KM)
    top = st.get("top_m", DEFAULT_TOP_M)
    pts = None
    if "aloft" in st:
        pts = aloft_points(st["aloft"])
    trop = st["trop_m"] if "trop_m" in st else DEFAULT_TROP_M
    if kind == "qnh":
        return Column.from_qnh(st["t_c"], td, p, st["elev_m"], lapse, top, pts, trop)
    from lapsecalc.standard import qnh
    qnh(p, st["elev_m"])  # the report gives QNH: refuse a pressure without one
    return Column(st["t_c"], td, p, st["elev_m"], lapse, top, pts, trop)


def assumed(st, balloon=False, inhg=False):
    """The defaults in use for state st, said with every result (the standard QNH in
    inHg when inhg; each fits a 40-column line after "assumed ")."""
    out = []
    if "press" not in st:
        out.append("QNH 29.92 inHg (qnh not set)" if inhg else "QNH 1013.25 hPa (qnh not set)")
    if "lapse" not in st:
        out.append("ELR %.1f K/km (ISA; elr not set)" % ISA_LAPSE_K_PER_KM)
    if balloon and "gas" in st and "purity" not in st:
        out.append("gas purity 100 % (pure not set)")
    return out


def settle(rep):
    """On MicroPython, move the values of a dict kept for the session (a report, a
    word's numbers, a new state) out of the heap the computation left full of holes:
    after a collection (the caller's) each float, list, tuple and dict in it is made
    afresh, so it lands in the lowest free space, and its old place joins a larger
    hole (a board's heap is never compacted; a module's code and a long JSON line need
    pieces of a few KB). Measured on the Unix port's hard limit: the full-word session
    121 -> 119 KiB with lists and dicts moved too and once more after the physics code
    is let go of (Session.release); on the 32-bit build, the new state of a settings
    line and tuples moved too: the failing lines over 60-74 KiB summed, 31 -> 23.
    Nothing on CPython, nor while the collector is off (an allocation count runs: no
    old place would be freed)."""
    import sys
    if sys.implementation.name != "micropython":
        return
    import gc
    if gc.isenabled():
        for k in rep:
            rep[k] = _moved(rep[k])


def _moved(v):
    # v made afresh: floats, and lists, tuples and dicts with all they hold (strings,
    # often interned, stay).
    if isinstance(v, float):
        return v + 0.0
    if isinstance(v, list):
        return [_moved(x) for x in v]
    if isinstance(v, tuple):
        return tuple([_moved(x) for x in v])
    if isinstance(v, dict):
        out = dict.fromkeys(v)  # room for every key at once
        for k in v:
            out[k] = _moved(v[k])
        return out
    return v
