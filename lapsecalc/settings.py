"""The interpreter's setting words: their table (SETTINGS: each word's setter, or the
module that has it), how a level and a typed number are said back, and the checks of a
whole line of settings (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units, via lapsecalc.typed).
#
# A setter is f(session, new_state, args) -> the words of the "ok" line. It writes
# only into new_state (a copy; keys in lapsecalc.state); the shell commits the copy
# once every setting of the line has passed. The air's setters are in
# lapsecalc.airsettings, the balloon's in lapsecalc.balloonsettings (a line loads only
# the module of its words: a line of points aloft holds neither on a board). A new
# setting word: its setter in one of them, its entry in SETTINGS, its state keys in
# commands.CLEAR (and state.AIR_KEYS when the column depends on them), its help in
# lapsecalc.helptext. The display code (lapsecalc.output) is loaded by the functions
# here only when they say a number.
from lapsecalc.limits import DEW_SLACK_K, QNH_MIN_HPA, QNH_MAX_HPA
from lapsecalc.typed import number, shown, said, unit_of, in_unit


def parse_level(tok):
    """A level as typed: a height with its unit ("3000ft", "914m", "2.5km": m MSL),
    a flight level ("FL180": pressure altitude in hundreds of feet) or a pressure
    ("700hPa", "700mb"). Returns ("z", m MSL), ("fl", flight level) or ("p", hPa);
    ValueError naming the token. A flight level's pressure: state.fl_pressure_hpa()."""
    t = tok.lower()
    if t[:2] == "fl":
        if not (t[2:].isdigit() and 0 < len(t) - 2 <= 3):
            raise ValueError("'%s' is not a flight level; accepted FL0..FL999" % shown(tok))
        return "fl", int(t[2:])
    kind = unit_of(tok, None) if tok[:1] in "+-.0123456789" else None
    if kind in ("m", "ft", "km"):
        return "z", number(tok, "h", None)
    if kind in ("hpa", "mb", "mbar", "inhg", "mmhg", "kpa"):
        return "p", number(tok, "p", None)
    raise ValueError("'%s' is not a level; accepted a height with its unit (3000ft,"
                     " 914m, 2.5km), a flight level (FL180) or a pressure (700hPa)" % shown(tok))


def echo(s, tok, kind, bare, x):
    """The typed number tok (value x in the library's unit) said back as typed, and in
    the display unit when it was typed in another: "80.6 F (27.0 C)", "1350 ft (411 m)"."""
    from lapsecalc.output import f_h1, f_t, f_dt, f_p
    u = unit_of(tok, bare)
    text = said(tok, bare)
    other = None
    if kind == "t" and u[-1] != s.disp["t"]:  # c or degc for c, f or degf for f
        other = f_t(s, x, True)
    elif kind == "h":
        other = "%d m" % round(x) if u == "ft" else f_h1(s, x) if u != s.disp["h"] else (
            "%d ft" % round(x / 0.3048))
    elif kind == "p" and (u == "inhg") != (s.disp["p"] == "inhg") or u in ("mmhg", "kpa"):
        other = f_p(s, x, True)
    elif kind in ("w", "v") and u in ("lb", "ft3"):
        # A derived amount at a sensible precision: 680 kg, 12.3 m3, 0.45 kg.
        other = ("%.0f %s" if x >= 100.0 else "%.1f %s" if x >= 10.0 else "%.2f %s") % (
            x, "kg" if kind == "w" else "m3")
    elif kind == "dt" and u in ("f", "degf"):
        other = f_dt(s, x, True)
    return text if other is None else text + " (" + other + ")"


def aloft(s, new, args):
    from lapsecalc.aloftwords import set_aloft
    return set_aloft(s, new, args, parse_level)


def trop(s, new, args):
    from lapsecalc.aloftwords import set_trop
    return set_trop(s, new, args, echo)


def whole(s, new):
    """Check what one setting alone cannot (ValueError in the user's words and display
    units): a dewpoint above the temperature, a station pressure without a QNH in
    range, a column top too close to the field, a working envelope temperature above
    the maximum. Returns None; for a state with points aloft or a tropopause, a pair
    ("aloft", late): the caller then runs lapsecalc.aloftwords.check_whole (which
    loads the standard atmosphere's code: on a board after the setting words' code is
    let go of) and raises late, the working temperature's error or None, only if that
    finds nothing (the order of the checks stays)."""
    t, hum = new.get("t_c"), new.get("hum")
    if t is not None and hum is not None and hum[0] == "td" and hum[1] > t + DEW_SLACK_K:
        from lapsecalc.output import f_t
        raise ValueError("dew %s is above temp %s; a dewpoint cannot exceed the temperature"
                         % (f_t(s, hum[1], True), f_t(s, t, True)))
    press, elev = new.get("press"), new.get("elev_m")
    if press is not None and press[0] == "stn" and elev is not None:
        from lapsecalc import standard
        try:
            standard.qnh(press[1], elev)
        except ValueError:
            from lapsecalc.output import f_h1, f_p
            lo, hi = in_unit(QNH_MIN_HPA, s.disp["p"], "p"), in_unit(QNH_MAX_HPA, s.disp["p"], "p")
            raise ValueError("stn %s at elev %s gives a QNH outside %s..%s; check both"
                             % (f_p(s, press[1], True), f_h1(s, elev), lo[:lo.find(" ")], hi))
    top = new.get("top_m")
    if top is not None and elev is not None and top < elev + 100.0:
        from lapsecalc.output import f_h1
        raise ValueError("top %s is less than 100 m (328 ft) above the field (%s)"
                         % (f_h1(s, top), f_h1(s, elev)))
    late = None
    tmax, tenv = new.get("tmax_c"), new.get("tenv_c")
    if tmax is not None and tenv is not None and tenv > tmax:
        from lapsecalc.output import f_t
        late = ValueError("working temp tenv %s is above the maximum tmax %s; allowed up to"
                          " tmax" % (f_t(s, tenv, True), f_t(s, tmax, True)))
    if "aloft" in new or new.get("trop_m") is not None:
        return "aloft", late
    if late is not None:
        raise late
    return None


# What a setting word takes: one value, a run of numbers, or the rest of the line.
ONE, NUMBERS, REST = 1, 2, 3
# word -> (setter, what it takes, example); a setter named by its module's name
# (lapsecalc.airsettings, lapsecalc.balloonsettings: setter() loads it for a line that
# sets one). Each example starts "e.g. ": longer than 10 characters, a string a board
# does not intern (it holds it only while this module is loaded).
SETTINGS = {
    "temp": ("airsettings", ONE, "e.g. temp 27C"), "dew": ("airsettings", ONE, "e.g. dew 13C"),
    "rh": ("airsettings", ONE, "e.g. rh 45%"), "elev": ("airsettings", ONE, "e.g. elev 1350ft"),
    "qnh": ("airsettings", ONE, "e.g. qnh 1016"), "stn": ("airsettings", ONE, "e.g. stn 967hPa"),
    "elr": ("airsettings", NUMBERS, "e.g. elr 6.5"),
    "top": ("airsettings", ONE, "e.g. top 30000ft"),
    "excess": ("airsettings", ONE, "e.g. excess 2C"),
    "metar": ("airsettings", REST, "e.g. metar ... 24/M02 Q1016"),
    "env": ("balloonsettings", ONE, "e.g. env 2800m3"),
    "wt": ("balloonsettings", ONE, "e.g. wt 450kg"),
    "fill": ("balloonsettings", ONE, "e.g. fill 12m3"),
    "tmax": ("balloonsettings", ONE, "e.g. tmax 120C"),
    "tenv": ("balloonsettings", ONE, "e.g. tenv 95C"),
    "gas": ("balloonsettings", ONE, "e.g. gas helium"),
    "pure": ("balloonsettings", ONE, "e.g. pure 98%"),
    "margin": ("balloonsettings", ONE, "e.g. margin 20K"),
    "superheat": ("balloonsettings", ONE, "e.g. superheat 12K"),
    "aloft": (aloft, REST, "e.g. aloft 6000ft 9C/2C"), "trop": (trop, ONE, "e.g. trop 36000ft"),
}


def setter(w):
    """The setter of setting word w (loading lapsecalc.airsettings for the air's,
    lapsecalc.balloonsettings for a balloon's)."""
    fn = SETTINGS[w][0]
    if isinstance(fn, str):
        fn = __import__("lapsecalc." + fn, None, None, ["SETTERS"]).SETTERS[w]
    return fn
