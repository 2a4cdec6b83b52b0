"""The altimeter words' numbers (levels, cold: their text is lapsecalc.altitext's,
loaded after the numbers) and the altimeter's input: a flight level, an indicated
height (runs on MicroPython; loaded only by the lines that use them)."""
# Sources: every number comes from lapsecalc.altimetry and the Column; this module only
#   picks them. lapsecalc.typed (a large module) is loaded only to read a typed height.
from lapsecalc import units
from lapsecalc.aliases import split_number, shown, no_args


def altimeter_word(s, w, args):
    """The levels or cold word (w) of session s: (keys, values, cold-air warnings: None
    for cold). The numbers only: the caller lets go of the Column and of this code
    (Session.release) before the text (lapsecalc.altitext.altimeter_text)."""
    if w == "levels":
        no_args(w, args)
        return levels_word(s, w)
    keys, vals = cold_word(s, w, args)
    return keys, vals, None


def levels_word(s, w):
    """The levels word's numbers: (keys, values, cold-air warnings). Every single
    height of the report as [true MSL, indicated on QNH, flight level], lowest first."""
    col = s.column(w)
    rep = s.report(w)
    from lapsecalc.altimetry import flight_level, cold_warnings
    ind = rep["indicated_altitude_m"]
    vals = {}
    keys = []
    for z, k in sorted((rep[k], k) for k in ind if ind[k] is not None):
        vals[k] = [z, ind[k], flight_level(col.p_at(z))]
        keys.append(k)
    return keys, vals, cold_warnings(col, rep)


def cold_word(s, w, args):
    """The cold word: (keys, values) of the cold-temperature correction (PANS-OPS
    formula and the column's own) for a few heights above the field, or for the one in
    args (cold 1200ft)."""
    col = s.column(w)
    if len(args) > 1:
        raise ValueError("cold takes one height above the field, e.g. cold 1500ft; alone"
                         " it gives a few")
    if args:
        # The number read, and the reader let go of (Session.read_done), before the
        # altimeter code loads; the reader again only to refuse it in the user's words.
        from lapsecalc.typed import number
        h = number(args[0], "h", s.disp["h"])
        number = None
        s.read_done()
    from lapsecalc.altimetry import (cold_temperature_correction, column_cold_correction,
                                     isa_deviation_at, indicated_altitude_at, TROPOPAUSE_M)
    # Up to the tropopause and to the column top, true and as indicated (in warm air
    # the top reads lower than it is; the column's correction needs the reading there).
    room = min(col.top_m, TROPOPAUSE_M, indicated_altitude_at(col, col.top_m)) - col.elev_m
    if args:
        if not 0.0 <= h <= room:
            from lapsecalc.typed import value
            value(args[0], "h", s.disp["h"], 0.0, room, w)
        hs = [h]
    else:
        # The heights above the field shown when none is asked for, in the display unit.
        hs = [150.0, 300.0, 500.0, 1000.0, 1500.0]
        if s.disp["h"] == "ft":
            hs = [h * units.M_PER_FT for h in (500.0, 1000.0, 1500.0, 2000.0, 3000.0, 5000.0)]
        hs = [h for h in hs if h <= room]
    vals = {"isa_deviation_c": isa_deviation_at(col, col.elev_m), "cold_height_agl_m": hs,
            "cold_correction_icao_m": [cold_temperature_correction(h, col.t_c, col.elev_m)
                                       for h in hs],
            "cold_correction_column_m": [column_cold_correction(col, h) for h in hs]}
    return ("isa_deviation_c", "cold_height_agl_m", "cold_correction_icao_m",
            "cold_correction_column_m"), vals


def flight_level_token(tok):
    """The flight level (hundreds of feet of pressure altitude) a token "FL85" or
    "fl180" names, or None when tok does not start with FL."""
    if tok[:2].lower() != "fl":
        return None
    sp = split_number(tok[2:])
    if sp is None or sp[1] or tok[2:3] in "+-":
        raise ValueError("'%s' is not a flight level; accepted FL and a number, e.g. FL85,"
                         " FL180" % shown(tok))
    return float(sp[0])


def height_aloft(s, w, args, col):
    """The height, m MSL, of a flight level ("FL85") or of an indicated height on QNH
    ("5000ft ind", or a bare height after "heights ind") in column col."""
    fl = flight_level_token(args[0])
    if fl is not None:
        if len(args) > 1:
            raise ValueError("%s: nothing may follow a flight level, e.g. %s FL85" % (w, w))
        from lapsecalc.altimetry import z_at_flight_level
        return z_at_flight_level(col, fl)
    # The number read, and the reader let go of (Session.read_done), before the
    # altimeter code loads.
    from lapsecalc.typed import number
    x = number(args[0], "h", s.disp["h"])
    number = None
    s.read_done()
    from lapsecalc.altimetry import true_altitude_of
    return true_altitude_of(col, x)
