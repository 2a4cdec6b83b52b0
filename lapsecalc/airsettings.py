"""The air's setting words: temp dew rh elev qnh stn elr top excess metar (runs on
MicroPython; lapsecalc.settings.SETTINGS names this module, loaded by a line that
sets one)."""
# Sources: unit conversions by exact definition (lapsecalc.units, via lapsecalc.typed);
#   the METAR groups of WMO-No. 306 FM 15 (lapsecalc.metar, imported only by the metar
#   word).
#
# A setter is f(session, new_state, args) -> the words of the "ok" line
# (lapsecalc.settings says how a line of them is read and checked).
from lapsecalc.limits import T_MIN_C, T_MAX_C, ELEV_MIN_M, ELEV_MAX_M, const
from lapsecalc.limits import QNH_MIN_HPA, QNH_MAX_HPA, P_MAX_HPA, TOP_MAX_M
from lapsecalc.typed import number, shown, value, said, unit_of, digits
from lapsecalc.output import f_h1, f_t, f_p, f_lapse
from lapsecalc.settings import echo

_MAX_LAYERS = const(12)
# No field has a station pressure under that of the highest field (elev 9000 m) on
# the lowest QNH (850 hPa), 246.4 hPa (standard.station_pressure): 240 hPa is a
# round bound below it, so that 29.92 typed bare (inches) is refused with a hint.
_STN_MIN_HPA = const(240.0)
# Above these a temperature or dewpoint read as degC is hotter than any surface
# observation (world records about 57 C and 35 C, from memory): likely typed in F.
_HOT_T_C = const(50.0)
_HOT_TD_C = const(32.0)


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


# word -> setter (what each takes and an example: lapsecalc.settings.SETTINGS)
SETTERS = {"temp": temp, "dew": dew, "rh": rh, "elev": elev, "qnh": qnh, "stn": stn,
           "elr": elr, "top": top, "excess": excess, "metar": metar}
