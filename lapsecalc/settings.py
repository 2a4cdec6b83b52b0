"""The interpreter's setting words: each checks its value into a new session state
(runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units, via lapsecalc.typed);
#   the METAR groups of WMO-No. 306 FM 15 (lapsecalc.metar, imported only by the metar
#   word).
#
# A setter is f(session, new_state, args) -> the words of the "ok" line. It writes
# only into new_state (a copy; keys in lapsecalc.state); the shell commits the copy
# once every setting of the line has passed. A new setting word: a setter here, its
# entry in SETTINGS, its state keys in state.CLEAR (and state.AIR_KEYS when the column
# depends on them), its help in lapsecalc.helptext.
from lapsecalc.limits import check, check_t, check_elev, check_p, check_lapse
from lapsecalc.limits import QNH_MIN_HPA, QNH_MAX_HPA
from lapsecalc.column import TOP_MAX_M
from lapsecalc.typed import number, shown
from lapsecalc.output import f_h, f_t, f_dt, f_p, f_lapse

try:
    from micropython import const
except ImportError:
    def const(x):
        return x

_MAX_LAYERS = const(12)


# ---- settings: f(session, new_state, args) -> words for the "ok" line ----

def _s_temp(s, new, args):
    new["t_c"] = check_t("temp", number(args[0], "t", s.disp["t"]))
    return "temp " + f_t(s, new["t_c"], True)


def _s_dew(s, new, args):
    new["hum"] = ("td", check_t("dew", number(args[0], "t", s.disp["t"])))
    return "dew " + f_t(s, new["hum"][1], True)


def _s_rh(s, new, args):
    v = check("rh", number(args[0], "rh", "%"), 0.0, 100.0, "%")
    if v <= 0.0:
        raise ValueError("rh=0 has no dewpoint; accepted above 0 up to 100 %")
    new["hum"] = ("rh", v)
    return "rh %.1f %%" % v


def _s_elev(s, new, args):
    new["elev_m"] = check_elev("elev", number(args[0], "h", s.disp["h"]))
    return "elev " + f_h(s, new["elev_m"], True)


def _s_qnh(s, new, args):
    v = number(args[0], "p", s.disp["p"])
    if not (QNH_MIN_HPA <= v <= QNH_MAX_HPA):
        raise ValueError("qnh=%g hPa is outside %g..%g hPa%s" % (
            v, QNH_MIN_HPA, QNH_MAX_HPA,
            " (for inches write %sinHg)" % shown(args[0]) if 25.0 < v < 35.0 else ""))
    new["press"] = ("qnh", v)
    return "QNH " + f_p(s, v, True)


def _s_stn(s, new, args):
    new["press"] = ("stn", check_p("stn", number(args[0], "p", s.disp["p"])))
    return "station " + f_p(s, new["press"][1], True)


def _s_elr(s, new, args):
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
        rate = check_lapse("elr", number(parts[0], "l", "k/km"))
        top = None
        if len(parts) == 2:
            top = below = check("layer top", number(parts[1], "h", s.disp["h"]), below + 1.0,
                                TOP_MAX_M, "m above the field (above the layer below)")
        elif k != len(args) - 1:
            raise ValueError("'%s' has no @top; only the last layer runs to the column top"
                             % shown(a))
        layers.append((top, rate))
    new["lapse"] = layers[0][1] if len(layers) == 1 and layers[0][0] is None else layers
    return "ELR " + f_lapse(s, new["lapse"])


def _s_top(s, new, args):
    new["top_m"] = check("top", number(args[0], "h", s.disp["h"]), -400.0, TOP_MAX_M, "m MSL")
    return "top " + f_h(s, new["top_m"], True)


def _s_excess(s, new, args):
    new["excess_c"] = check("excess", number(args[0], "dt", s.disp["t"]), 0.0, 10.0, "K")
    return "excess " + f_dt(s, new["excess_c"], True)


def _s_metar(s, new, args):
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


def _s_amount(key, kind, lo, hi, unit, name):
    # A setter of a balloon amount (volume or mass) in lo..hi.
    def setter(s, new, args):
        new[key] = check(name, number(args[0], kind, unit), lo, hi, unit)
        return "%s %.6g %s" % (name, new[key], unit)
    return setter


def _s_tballoon(key, name):
    def setter(s, new, args):
        new[key] = check(name, number(args[0], "t", s.disp["t"]), -90.0, 150.0, "degC")
        return name + " " + f_t(s, new[key], True)
    return setter


def _s_gas(s, new, args):
    g = {"he": "helium", "helium": "helium", "h2": "hydrogen", "hydrogen": "hydrogen",
         "none": None, "hot": None}.get(args[0].lower(), False)
    if g is False:
        raise ValueError("'%s' not accepted; accepted helium (he), hydrogen (h2), none (hot"
                         " air)" % shown(args[0]))
    new.pop("gas", None)
    if g:
        new["gas"] = g
    return "gas " + (g or "none (hot air)")


def _s_pure(s, new, args):
    new["purity"] = check("pure", number(args[0], "rh", "%"), 50.0, 100.0, "%") / 100.0
    return "purity %.1f %%" % (100.0 * new["purity"])


# What a setting word takes: one value, a run of numbers, or the rest of the line.
ONE, NUMBERS, REST = 1, 2, 3
# word -> (setter, what it takes, example)
SETTINGS = {
    "temp": (_s_temp, ONE, "temp 27C"), "dew": (_s_dew, ONE, "dew 13C"),
    "rh": (_s_rh, ONE, "rh 45%"), "elev": (_s_elev, ONE, "elev 1350ft"),
    "qnh": (_s_qnh, ONE, "qnh 1016"), "stn": (_s_stn, ONE, "stn 967hPa"),
    "elr": (_s_elr, NUMBERS, "elr 6.5"), "top": (_s_top, ONE, "top 30000ft"),
    "excess": (_s_excess, ONE, "excess 2C"),
    "metar": (_s_metar, REST, "metar ... 24/M02 Q1016"),
    "env": (_s_amount("env_m3", "v", 0.1, 2.0e6, "m3", "envelope"), ONE, "env 2800m3"),
    "wt": (_s_amount("wt_kg", "w", 0.01, 20000.0, "kg", "weight"), ONE, "wt 450kg"),
    "fill": (_s_amount("fill_m3", "v", 0.1, 1.0e5, "m3", "fill"), ONE, "fill 12m3"),
    "tmax": (_s_tballoon("tmax_c", "tmax"), ONE, "tmax 120C"),
    "tenv": (_s_tballoon("tenv_c", "tenv"), ONE, "tenv 95C"),
    "gas": (_s_gas, ONE, "gas helium"), "pure": (_s_pure, ONE, "pure 98%"),
}
