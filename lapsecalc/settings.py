"""The interpreter's settings: typed numbers with units, and the setting words that
check them into a new session state (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units); the METAR groups of
#   WMO-No. 306 FM 15 (lapsecalc.metar, imported only by the metar word).
#
# A setter is f(session, new_state, args) -> the words of the "ok" line. It writes
# only into new_state (a copy); the shell commits the copy once every setting of the
# line has passed. State keys: t_c, hum ("td" or "rh", value), elev_m, press ("qnh" or
# "stn", hPa), lapse (K/km, or layers [(top_agl_m or None, k_per_km), ...]), top_m,
# excess_c; balloon: env_m3, wt_kg, fill_m3, tmax_c, tenv_c, gas, purity (0.5..1).
from math import isfinite
from lapsecalc import units
from lapsecalc.limits import check, check_t, check_elev, check_p, check_lapse, check_dew
from lapsecalc.limits import QNH_MIN_HPA, QNH_MAX_HPA
from lapsecalc.column import Column, TOP_MAX_M

try:
    from micropython import const
except ImportError:
    def const(x):
        return x

_MAX_LAYERS = const(12)
ISA_LAPSE_K_PER_KM = 6.5  # ICAO standard atmosphere below 11 km (common practice)
STANDARD_QNH_HPA = 1013.25  # ICAO standard sea-level pressure (common practice)
DEFAULT_TOP_M = 16000.0


# Unit suffix (lower case) -> (quantity, converter to the library's unit or None).
# Quantities: t degC, h m, p hPa, l K/km, rh %, v m3, w kg.
_UNITS = {
    "c": ("t", None), "degc": ("t", None), "f": ("t", units.f_to_c),
    "degf": ("t", units.f_to_c), "k": ("t", units.k_to_c),
    "m": ("h", None), "ft": ("h", units.ft_to_m), "km": ("h", units.km_to_m),
    "hpa": ("p", None), "mb": ("p", None), "mbar": ("p", None),
    "inhg": ("p", units.inhg_to_hpa), "mmhg": ("p", units.mmhg_to_hpa),
    "kpa": ("p", units.kpa_to_hpa),
    "k/km": ("l", None), "c/km": ("l", None),
    "c/1000ft": ("l", units.c_per_1000ft_to_k_per_km),
    "k/1000ft": ("l", units.c_per_1000ft_to_k_per_km),
    "f/1000ft": ("l", lambda x: units.c_per_1000ft_to_k_per_km(x * 5.0 / 9.0)),
    "c/100m": ("l", units.c_per_100m_to_k_per_km),
    "k/100m": ("l", units.c_per_100m_to_k_per_km),
    "%": ("rh", None), "m3": ("v", None), "ft3": ("v", units.ft3_to_m3),
    "kg": ("w", None), "lb": ("w", units.lb_to_kg),
}
_ACCEPTED = {"t": "C F K", "h": "ft m km", "p": "hPa mb inHg mmHg kPa",
             "l": "K/km C/1000ft C/100m F/1000ft", "rh": "%", "v": "m3 ft3", "w": "kg lb"}


def shown(text, cap=24):
    """text as it may appear in an output line: printable ASCII, at most cap characters."""
    out = ""
    for ch in text[:cap]:
        out += ch if " " <= ch <= "~" else "?"
    return out + ("..." if len(text) > cap else "")


def split_number(tok):
    # "27.5C" -> ("27.5", "c"); None when tok does not start with a decimal number.
    n = len(tok)
    i = 1 if n and tok[0] in "+-" else 0
    start, dots = i, 0
    while i < n and ("0" <= tok[i] <= "9" or tok[i] == "."):
        dots += tok[i] == "."
        i += 1
    if i - start - dots < 1 or dots > 1:
        return None
    if i < n and tok[i] in "eE":
        k = j = i + 1 + (i + 1 < n and tok[i + 1] in "+-")
        while k < n and "0" <= tok[k] <= "9":
            k += 1
        if k > j:
            i = k
    return tok[:i], tok[i:].lower()


def number(tok, kind, bare):
    """Value of the typed number tok in the library's unit of quantity kind (a key of
    _ACCEPTED, or "dt" for a temperature difference); bare is the unit of a number
    without a suffix. Raises ValueError naming what is accepted."""
    want = "t" if kind == "dt" else kind
    sp = split_number(tok)
    if sp is None:
        raise ValueError("'%s' is not a number; accepted e.g. 12, -3.5, 1e3, with a unit %s"
                         % (shown(tok), _ACCEPTED[want]))
    x = float(sp[0])
    if not isfinite(x):
        raise ValueError("'%s' is not a finite number" % shown(tok))
    u = sp[1] or bare
    entry = _UNITS.get(u)
    if entry is None or entry[0] != want:
        raise ValueError("'%s': unit '%s' not accepted here; accepted %s"
                         % (shown(tok), shown(u), _ACCEPTED[want]))
    if kind == "dt":
        return x * 5.0 / 9.0 if u in ("f", "degf") else x
    return x if entry[1] is None else entry[1](x)



def unit_kind(tok):
    """The quantity (a key of _ACCEPTED) of the unit written after the number tok, or
    None (no number, no unit, or an unknown one)."""
    sp = split_number(tok)
    return None if sp is None else _UNITS.get(sp[1], (None,))[0]


def starts_number(tok):
    return tok != "" and tok[0] in "0123456789+-."


def dewpoint_of(st):
    """The dewpoint of state dict st, degC (from rh when rh was set)."""
    kind, v = st["hum"]
    if kind == "td":
        return check_dew(st["t_c"], v)[1]
    from lapsecalc.moisture import dewpoint
    return dewpoint(st["t_c"], v)


def missing(st):
    return [w for w, k in (("temp", "t_c"), ("dew (or rh)", "hum"), ("elev", "elev_m"))
            if k not in st]


def build_column(st):
    """The Column of a complete state dict (ValueError when the state is not valid)."""
    td = dewpoint_of(st)
    kind, p = st.get("press", ("qnh", STANDARD_QNH_HPA))
    lapse = st.get("lapse", ISA_LAPSE_K_PER_KM)
    top = st.get("top_m", DEFAULT_TOP_M)
    if kind == "qnh":
        return Column.from_qnh(st["t_c"], td, p, st["elev_m"], lapse, top)
    from lapsecalc.standard import qnh
    qnh(p, st["elev_m"])  # the report gives QNH: refuse a pressure without one
    return Column(st["t_c"], td, p, st["elev_m"], lapse, top)


# ---- settings: f(session, new_state, args) -> words for the "ok" line ----

def _s_temp(s, new, args):
    new["t_c"] = check_t("temp", number(args[0], "t", s.disp["t"]))
    return "temp " + s.f_t(new["t_c"], True)


def _s_dew(s, new, args):
    new["hum"] = ("td", check_t("dew", number(args[0], "t", s.disp["t"])))
    return "dew " + s.f_t(new["hum"][1], True)


def _s_rh(s, new, args):
    v = check("rh", number(args[0], "rh", "%"), 0.0, 100.0, "%")
    if v <= 0.0:
        raise ValueError("rh=0 has no dewpoint; accepted above 0 up to 100 %")
    new["hum"] = ("rh", v)
    return "rh %.1f %%" % v


def _s_elev(s, new, args):
    new["elev_m"] = check_elev("elev", number(args[0], "h", s.disp["h"]))
    return "elev " + s.f_h(new["elev_m"], True)


def _s_qnh(s, new, args):
    v = number(args[0], "p", s.disp["p"])
    if not (QNH_MIN_HPA <= v <= QNH_MAX_HPA):
        raise ValueError("qnh=%g hPa is outside %g..%g hPa%s" % (
            v, QNH_MIN_HPA, QNH_MAX_HPA,
            " (for inches write %sinHg)" % shown(args[0]) if 25.0 < v < 35.0 else ""))
    new["press"] = ("qnh", v)
    return "QNH " + s.f_p(v, True)


def _s_stn(s, new, args):
    new["press"] = ("stn", check_p("stn", number(args[0], "p", s.disp["p"])))
    return "station " + s.f_p(new["press"][1], True)


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
    return "ELR " + s.f_lapse(new["lapse"])


def _s_top(s, new, args):
    new["top_m"] = check("top", number(args[0], "h", s.disp["h"]), -400.0, TOP_MAX_M, "m MSL")
    return "top " + s.f_h(new["top_m"], True)


def _s_excess(s, new, args):
    new["excess_c"] = check("excess", number(args[0], "dt", s.disp["t"]), 0.0, 10.0, "K")
    return "excess " + s.f_dt(new["excess_c"], True)


def _s_metar(s, new, args):
    from lapsecalc.metar import parse
    m = parse(" ".join(args))
    new["t_c"] = m["t_c"]
    said = ["METAR temp " + s.f_t(m["t_c"], True)]
    # A group the report lacks clears the old setting: an older dewpoint or pressure
    # must not pass for part of this observation.
    if m["td_c"] is not None:
        new["hum"] = ("td", m["td_c"])
        said.append("dew " + s.f_t(m["td_c"], True))
    else:
        new.pop("hum", None)
        said.append("no dewpoint in it (dew cleared)")
    if m["qnh_hpa"] is not None:
        new["press"] = ("qnh", m["qnh_hpa"])
        said.append("QNH " + s.f_p(m["qnh_hpa"], True))
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
        return name + " " + s.f_t(new[key], True)
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
# clear WORD -> state keys it forgets
CLEAR = {"temp": ("t_c",), "dew": ("hum",), "rh": ("hum",), "elev": ("elev_m",),
         "qnh": ("press",), "stn": ("press",), "elr": ("lapse",), "top": ("top_m",),
         "excess": ("excess_c",), "env": ("env_m3",), "wt": ("wt_kg",), "fill": ("fill_m3",),
         "tmax": ("tmax_c",), "tenv": ("tenv_c",), "gas": ("gas",), "pure": ("purity",)}
# State keys the air column depends on (others leave the cached report alone).
AIR_KEYS = ("t_c", "hum", "elev_m", "press", "lapse", "top_m", "excess_c")
