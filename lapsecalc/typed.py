"""What people type into the interpreter: numbers with units, the aliases of words and
the nearest known word to a slip (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units). Nothing here knows
#   the session; the word modules (settings, queries, commands) and the shell use it.
from math import isfinite
from lapsecalc import units

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
# How a unit is written back to the user.
_WRITTEN = {"c": "C", "degc": "C", "f": "F", "degf": "F", "k": "K", "hpa": "hPa",
            "mb": "mb", "mbar": "mbar", "inhg": "inHg", "mmhg": "mmHg", "kpa": "kPa",
            "k/km": "K/km", "c/km": "C/km", "c/1000ft": "C/1000ft", "k/1000ft": "K/1000ft",
            "f/1000ft": "F/1000ft", "c/100m": "C/100m", "k/100m": "K/100m"}
_ACCEPTED = {"t": "C F K", "h": "ft m km", "p": "hPa mb inHg mmHg kPa",
             "l": "K/km C/1000ft C/100m F/1000ft", "rh": "%", "v": "m3 ft3", "w": "kg lb"}

# Other names of words: typed word -> the word it stands for.
ALIASES = {"t": "temp", "td": "dew", "frz": "ice", "therm": "thermal", "units": "unit",
           "bal": "balloon", "?": "help", "quit": "bye", "exit": "bye"}


def shown(text, cap=24):
    """text as it may appear in an output line: printable ASCII, at most cap characters."""
    out = ""
    for ch in text[:cap]:
        out += ch if " " <= ch <= "~" else "?"
    return out + ("..." if len(text) > cap else "")


def split_number(tok):
    """"27.5C" -> ("27.5", "c"); None when tok does not start with a decimal number."""
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


def said(tok, bare):
    """The typed number tok as it is said back: its digits as typed and its unit
    ("700 ft" for 700 typed with ft the bare unit, "2.5 km", "45 %")."""
    sp = split_number(tok)
    if sp is None:
        return shown(tok)
    u = sp[1] or bare
    return "%s %s" % (sp[0], _WRITTEN.get(u, u))


def unit_kind(tok):
    """The quantity (a key of _ACCEPTED) of the unit written after the number tok, or
    None (no number, no unit, or an unknown one)."""
    sp = split_number(tok)
    return None if sp is None else _UNITS.get(sp[1], (None,))[0]


def no_args(word, args):
    """Refuse anything after a word that takes nothing."""
    if args:
        raise ValueError("%s takes nothing after it; got '%s'" % (word, shown(args[0])))


def starts_number(tok):
    return tok != "" and tok[0] in "0123456789+-."


def _edit_distance(a, b):
    # Levenshtein distance of two short words (callers cap them at 16 characters).
    prev = list(range(len(b) + 1))
    for i in range(1, len(a) + 1):
        cur = [i] + [0] * len(b)
        for j in range(1, len(b) + 1):
            cur[j] = min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] != b[j - 1]))
        prev = cur
    return prev[-1]


def nearest(word, known):
    """The known word closest to word (at most 2 edits, fewer than its length), or None."""
    w = word.lower()[:16]
    best, best_d = None, 3
    for k in sorted(known):
        if abs(len(k) - len(w)) < best_d:
            d = _edit_distance(w, k)
            if d < best_d and d < len(w):
                best, best_d = k, d
    return best
