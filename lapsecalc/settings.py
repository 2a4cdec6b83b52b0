"""The interpreter's setting words: each checks its value into a new session state
(runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units, via lapsecalc.typed);
#   the METAR groups of WMO-No. 306 FM 15 (lapsecalc.metar, imported only by the metar
#   word).
#
# A setter is f(session, new_state, args) -> the words of the "ok" line. It writes
# only into new_state (a copy; keys in lapsecalc.state); the shell commits the copy
# once every setting of the line has passed. A new setting word: a setter here, its
# entry in SETTINGS, its state keys in commands.CLEAR (and state.AIR_KEYS when the column
# depends on them), its help in lapsecalc.helptext.
from lapsecalc.limits import T_MIN_C, T_MAX_C, ELEV_MIN_M, ELEV_MAX_M, DEW_SLACK_K, const
from lapsecalc.limits import QNH_MIN_HPA, QNH_MAX_HPA, P_MAX_HPA, TOP_MAX_M
from lapsecalc.typed import number, shown, value, said, unit_of, digits, in_unit
from lapsecalc.output import f_h1, f_t, f_dt, f_p, f_lapse

try:
    from micropython import const
except ImportError:
    def const(x):
        return x

_MAX_LAYERS = const(12)
# No field has a station pressure under that of the highest field (elev 9000 m) on
# the lowest QNH (850 hPa), 246.4 hPa (standard.station_pressure): 240 hPa is a
# round bound below it, so that 29.92 typed bare (inches) is refused with a hint.
_STN_MIN_HPA = const(240.0)
# Above these a temperature or dewpoint read as degC is hotter than any surface
# observation (world records about 57 C and 35 C, from memory): likely typed in F.
_HOT_T_C = const(50.0)
_HOT_TD_C = const(32.0)


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


def _temp(s, tok, what, hot):
    # A temperature or dewpoint setting: (value degC, ack text); a check line when it
    # is hotter than any surface observation.
    bare = s.disp["t"]
    try:
        x = value(tok, "t", bare, T_MIN_C, T_MAX_C)
    except ValueError as e:
        # For a bare temperature read in C that is out of range but fits in F: a hint.
        x = number(tok, "t", bare)
        hint = ""
        if unit_of(tok, bare) == "c" and tok == digits(tok) and \
                T_MIN_C <= (x - 32.0) / 1.8 <= T_MAX_C:
            hint = "; in F write %sF" % tok
        raise ValueError(str(e) + hint)
    if x > hot and unit_of(tok, bare) == "c":
        s.checks.append("%s %s is %s on record; in F write %sF" % (
            what, said(tok, bare), "higher than any dewpoint" if what == "dew" else
            "hotter than any surface air", digits(tok)))
    return x, "%s %s" % (what, echo(s, tok, "t", bare, x))


# ---- settings: f(session, new_state, args) -> words for the "ok" line ----
# Each setter is named after its word: a board interns the word anyway, and a name of
# its own ("_s_temp") would be one more name held for good.

def temp(s, new, args):
    new["t_c"], text = _temp(s, args[0], "temp", _HOT_T_C)
    return text


def dew(s, new, args):
    td, text = _temp(s, args[0], "dew", _HOT_TD_C)
    new["hum"] = ("td", td)
    return text


def rh(s, new, args):
    v = value(args[0], "rh", "%", 0.0, 100.0)
    if v <= 0.0:
        raise ValueError("0 % has no dewpoint; accepted above 0 up to 100 %")
    if v <= 1.0:
        # A fraction typed for a percentage (0.45 for 45 %): possible, but rare.
        s.checks.append("rh %s %%? for %g %% write %g%%" % (digits(args[0]), v * 100.0,
                                                           v * 100.0))
    new["hum"] = ("rh", v)
    return "rh " + said(args[0], "%")


def elev(s, new, args):
    new["elev_m"] = value(args[0], "h", s.disp["h"], ELEV_MIN_M, ELEV_MAX_M)
    return "elev %s MSL" % echo(s, args[0], "h", s.disp["h"], new["elev_m"])


def _pressure(s, tok, lo, hi):
    # A pressure within lo..hi hPa, refused with a hint for the other unit's habit:
    # 3012 or 29.92 read as hPa (inches typed bare), 1013 read as inHg.
    bare = s.disp["p"]
    x = number(tok, "p", bare)
    if lo <= x <= hi:
        return x
    u = unit_of(tok, bare)
    n = float(digits(tok))
    hint = ""
    if u in ("hpa", "mb", "mbar") and 2500.0 <= n <= 3300.0:
        hint = "; for %.2f inHg write %.2finHg" % (n / 100.0, n / 100.0)
    elif u in ("hpa", "mb", "mbar") and 25.0 <= n <= 33.0:
        hint = "; for inches write %sinHg" % digits(tok)
    elif u == "inhg" and 850.0 <= n <= 1100.0:
        hint = "; for hPa write %shPa" % digits(tok)
    try:
        return value(tok, "p", bare, lo, hi)
    except ValueError as e:
        raise ValueError(str(e) + hint)


def qnh(s, new, args):
    v = _pressure(s, args[0], QNH_MIN_HPA, QNH_MAX_HPA)
    new["press"] = ("qnh", v)
    return "QNH " + echo(s, args[0], "p", s.disp["p"], v)


def stn(s, new, args):
    v = _pressure(s, args[0], _STN_MIN_HPA, P_MAX_HPA)
    new["press"] = ("stn", v)
    return "station " + echo(s, args[0], "p", s.disp["p"], v)


def elr(s, new, args):
    if not args:
        raise ValueError("needs a rate, e.g. elr 6.5 or elr -5@300m 8@2km 6.5")
    if len(args) > _MAX_LAYERS:
        raise ValueError("%d layers; accepted at most %d" % (len(args), _MAX_LAYERS))
    layers = []
    below = 0.0
    for k, a in enumerate(args):
        parts = a.split("@")
        if len(parts) > 2:
            raise ValueError("'%s': one @ per layer, e.g. 8@2km" % shown(a))
        rate = value(parts[0], "l", "k/km", -30.0, 30.0)
        top = None
        if len(parts) == 2:
            top = number(parts[1], "h", s.disp["h"])
            if top < below + 1.0:
                if not below:
                    raise ValueError("layer top %s is not above the field"
                                     % said(parts[1], s.disp["h"]))
                raise ValueError("layer top %s is not above the layer below (%s AGL)"
                                 % (said(parts[1], s.disp["h"]), f_h1(s, below)))
            top = below = value(parts[1], "h", s.disp["h"], below + 1.0, TOP_MAX_M)
        elif k != len(args) - 1:
            raise ValueError("'%s' has no @top; only the last layer runs to the column top"
                             % shown(a))
        layers.append((top, rate))
    new["lapse"] = layers[0][1] if len(layers) == 1 and layers[0][0] is None else layers
    return "ELR " + f_lapse(s, new["lapse"])


def top(s, new, args):
    new["top_m"] = value(args[0], "h", s.disp["h"], -400.0, TOP_MAX_M)
    return "top " + echo(s, args[0], "h", s.disp["h"], new["top_m"]) + " MSL"


def excess(s, new, args):
    # A temperature difference: bare in K (or C: the same step), F typed as F.
    new["excess_c"] = value(args[0], "dt", "k", 0.0, 10.0)
    return "excess " + echo(s, args[0], "dt", "k", new["excess_c"])


def metar(s, new, args):
    from lapsecalc.metar import parse
    m = parse(" ".join(args))
    new["t_c"] = m["t_c"]
    said = ["METAR temp " + f_t(s, m["t_c"], True)]
    # A group the report lacks clears the old setting: an older dewpoint or pressure
    # must not pass for part of this observation.
    if m["td_c"] is not None:
        new["hum"] = ("td", m["td_c"])
        said.append("dew " + f_t(s, m["td_c"], True))
    else:
        new.pop("hum", None)
        said.append("no dewpoint in it (dew cleared)")
    if m["qnh_hpa"] is not None:
        new["press"] = ("qnh", m["qnh_hpa"])
        said.append("QNH " + f_p(s, m["qnh_hpa"], True))
    else:
        new.pop("press", None)
        said.append("no pressure in it (QNH cleared)")
    return ", ".join(said)


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
        raise ValueError("dew %s is above temp %s; a dewpoint cannot exceed the temperature"
                         % (f_t(s, hum[1], True), f_t(s, t, True)))
    press, elev = new.get("press"), new.get("elev_m")
    if press is not None and press[0] == "stn" and elev is not None:
        from lapsecalc import standard
        try:
            standard.qnh(press[1], elev)
        except ValueError:
            lo, hi = in_unit(QNH_MIN_HPA, s.disp["p"], "p"), in_unit(QNH_MAX_HPA, s.disp["p"], "p")
            raise ValueError("stn %s at elev %s gives a QNH outside %s..%s; check both"
                             % (f_p(s, press[1], True), f_h1(s, elev), lo[:lo.find(" ")], hi))
    top = new.get("top_m")
    if top is not None and elev is not None and top < elev + 100.0:
        raise ValueError("top %s is less than 100 m (328 ft) above the field (%s)"
                         % (f_h1(s, top), f_h1(s, elev)))
    late = None
    tmax, tenv = new.get("tmax_c"), new.get("tenv_c")
    if tmax is not None and tenv is not None and tenv > tmax:
        late = ValueError("working temp tenv %s is above the maximum tmax %s; allowed up to"
                          " tmax" % (f_t(s, tenv, True), f_t(s, tmax, True)))
    if "aloft" in new or new.get("trop_m") is not None:
        return "aloft", late
    if late is not None:
        raise late
    return None


# What a setting word takes: one value, a run of numbers, or the rest of the line.
ONE, NUMBERS, REST = 1, 2, 3
# word -> (setter, what it takes, example); the balloon's setters are in
# lapsecalc.balloonsettings (the name of that module here: the shell loads it only for
# a line that sets one). Each example starts "e.g. ": longer than 10 characters, a
# string a board does not intern (it holds it only while this module is loaded).
SETTINGS = {
    "temp": (temp, ONE, "e.g. temp 27C"), "dew": (dew, ONE, "e.g. dew 13C"),
    "rh": (rh, ONE, "e.g. rh 45%"), "elev": (elev, ONE, "e.g. elev 1350ft"),
    "qnh": (qnh, ONE, "e.g. qnh 1016"), "stn": (stn, ONE, "e.g. stn 967hPa"),
    "elr": (elr, NUMBERS, "e.g. elr 6.5"), "top": (top, ONE, "e.g. top 30000ft"),
    "excess": (excess, ONE, "e.g. excess 2C"),
    "metar": (metar, REST, "e.g. metar ... 24/M02 Q1016"),
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
    """The setter of setting word w (loading lapsecalc.balloonsettings for a balloon's)."""
    fn = SETTINGS[w][0]
    if isinstance(fn, str):
        fn = __import__("lapsecalc." + fn, None, None, ["SETTERS"]).SETTERS[w]
    return fn
