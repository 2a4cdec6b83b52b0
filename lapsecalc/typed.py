"""What people type into the interpreter: numbers with units, the words of a line
joined (a unit after a space, two-word names), the nearest known word to a slip and
the refusal of a word no table has; the aliases of words are in lapsecalc.aliases,
named here too (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units). Nothing here knows
#   the session; the word modules (settings, queries, commands) and the shell use it.
from math import isfinite
from lapsecalc import units
from lapsecalc.aliases import (ALIASES, AMBIGUOUS, PAIRS, shown, split_number,  # noqa: F401
                               no_args, starts_number, look_up)

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


def written(u):
    """The unit u (lower case, as typed) as it is written back to the user: "hPa" for
    hpa, "C" for degc; a unit written as it is typed (ft, m, mb, %) is u itself."""
    # One string of " typed=written" entries, not a table of short strings (a board
    # interns each string of up to 10 characters for good).
    table = (" c=C f=F k=K hpa=hPa inhg=inHg mmhg=mmHg kpa=kPa k/km=K/km c/km=C/km"
             " c/1000ft=C/1000ft k/1000ft=K/1000ft f/1000ft=F/1000ft c/100m=C/100m"
             " k/100m=K/100m ")
    return look_up(table, u[3:] if u in ("degc", "degf") else u, u)


def accepted(kind):
    """The units accepted for quantity kind (t degC, h m, p hPa, l K/km, rh %, v m3,
    w kg), as an error message lists them: "C F K"."""
    # One string of ";quantity:units" entries (as written(): no short strings).
    table = (";t:C F K;h:ft m km;p:hPa mb inHg mmHg kPa;l:K/km C/1000ft C/100m F/1000ft"
             ";rh:%;v:m3 ft3;w:kg lb;")
    i = table.find(";" + kind + ":") + len(kind) + 2
    return table[i:table.find(";", i)]

def number(tok, kind, bare):
    """Value of the typed number tok in the library's unit of quantity kind (one that
    accepted() knows, or "dt" for a temperature difference); bare is the unit of a number
    without a suffix. Raises ValueError naming what is accepted."""
    want = "t" if kind == "dt" else kind
    sp = split_number(tok)
    if sp is None:
        raise ValueError("'%s' is not a number; accepted e.g. 12, -3.5, 1e3, with a unit %s"
                         % (shown(tok), accepted(want)))
    x = float(sp[0])
    if not isfinite(x):
        raise ValueError("'%s' is not a finite number" % shown(tok))
    if abs(x) > 1e30:
        # No quantity here comes near; converting it would leave the library's range.
        raise ValueError("'%s' is too large a number; accepted up to 1e30" % shown(tok))
    u = sp[1] or bare
    entry = _UNITS.get(u)
    if entry is None or entry[0] != want:
        raise ValueError("'%s': unit '%s' not accepted here; accepted %s"
                         % (shown(tok), shown(u), accepted(want)))
    if kind == "dt":
        return x * 5.0 / 9.0 if u in ("f", "degf") else x
    return x if entry[1] is None else entry[1](x)


# Library unit -> the unit u: converters for the units that are not the library's.
_FROM_LIB = {"f": units.c_to_f, "degf": units.c_to_f, "k": units.c_to_k,
             "ft": units.m_to_ft, "km": units.m_to_km, "inhg": units.hpa_to_inhg,
             "mmhg": units.hpa_to_mmhg, "kpa": units.hpa_to_kpa,
             "c/1000ft": units.k_per_km_to_c_per_1000ft,
             "k/1000ft": units.k_per_km_to_c_per_1000ft,
             "f/1000ft": lambda x: units.k_per_km_to_c_per_1000ft(x) * 1.8,
             "c/100m": units.k_per_km_to_c_per_100m, "k/100m": units.k_per_km_to_c_per_100m,
             "ft3": units.m3_to_ft3, "lb": units.kg_to_lb}


def unit_of(tok, bare):
    """The unit (lower case) the typed number tok is in: its own or bare."""
    sp = split_number(tok)
    return (sp[1] if sp is not None and sp[1] else bare)


def in_unit(x, u, kind="t"):
    """x in the library's unit of kind said in unit u, as text with u ("140 F")."""
    if kind == "dt":
        v = x * 1.8 if u in ("f", "degf") else x
    else:
        conv = _FROM_LIB.get(u)
        v = x if conv is None else conv(x)
    # The decimals of a range bound said in unit u (by its size for a unit not listed).
    d = look_up(" inhg=2 km=1 kpa=1 c/1000ft=2 k/1000ft=2 f/1000ft=1 c/100m=1 k/100m=1 ", u)
    text = "%.*f" % (int(d) if d else 0 if abs(v) >= 10.0 else 2, v)
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    return ("0" if text == "-0" else text) + " " + written(u)


def value(tok, kind, bare, lo, hi, word=""):
    """The typed number tok (number()) within lo..hi (the library's unit), else a
    ValueError in the user's unit and words: "99 C is outside -90..60 C" (after
    "word: " when a query word is given)."""
    x = number(tok, kind, bare)
    if not lo <= x <= hi:
        u = unit_of(tok, bare)
        lo_t, hi_t = in_unit(lo, u, kind), in_unit(hi, u, kind)
        raise ValueError("%s%s is outside %s..%s" % (word and word + ": ", said(tok, bare),
                                                     lo_t[:lo_t.find(" ")], hi_t))
    return x


def digits(tok):
    """The digits of the typed number tok as said back: no "+", no "-0", "0.5" for
    ".5" (the precision typed is kept: "0.45", "27.0")."""
    d = split_number(tok)[0]
    if d[:1] == "+":
        d = d[1:]
    if d[:1] == "-" and float(d) == 0.0:
        d = d[1:]
    if d.lstrip("-")[:1] == ".":
        d = d.replace(".", "0.", 1)
    if d[-1:] == ".":
        d = d[:-1]
    return d


def said(tok, bare):
    """The typed number tok as it is said back: its digits as typed and its unit
    ("700 ft" for 700 typed with ft the bare unit, "2.5 km", "45 %")."""
    sp = split_number(tok)
    if sp is None:
        return shown(tok)
    u = sp[1] or bare
    return "%s %s" % (shown(digits(tok), 16), written(u))


def unit_kind(tok):
    """The quantity (one that accepted() knows) of the unit written after the number tok, or
    None (no number, no unit, or an unknown one)."""
    sp = split_number(tok)
    return None if sp is None else _UNITS.get(sp[1], (None,))[0]


def is_unit(word):
    """True when word is a unit name (ft, hPa, %...), not a word of the interpreter."""
    return word.lower() in _UNITS or word.lower() == "feet"


def join_words(words):
    """The words of a line with a unit typed after a space joined to its number
    ("6500", "ft" -> "6500ft"; "8@2", "km" -> "8@2km") and two-word names made one
    ("field elevation" -> "elev"). A METAR (the rest of its line) is left as it is."""
    out = []
    rest = False
    for w in words:
        low = w.lower()
        if rest:
            out.append(w)
            continue
        rest = low == "metar"
        if out and (out[-1].lower(), low) in PAIRS:
            out[-1] = PAIRS[(out[-1].lower(), low)]
            continue
        if out and is_unit(w):
            prev = out[-1].split("@")[-1]
            sp = split_number(prev)
            if sp is not None and sp[1] == "" and sp[0] == prev:
                out[-1] += "ft" if low == "feet" else w
                continue
        out.append(w)
    return out


def _edit_distance(a, b):
    # Levenshtein distance of two short words (callers cap them at 16 characters).
    prev = list(range(len(b) + 1))
    for i in range(1, len(a) + 1):
        cur = [i] + [0] * len(b)
        for j in range(1, len(b) + 1):
            cur[j] = min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] != b[j - 1]))
        prev = cur
    return prev[-1]


def nearest(word, words):
    """The one of words closest to word (at most 2 edits, fewer than its length), or None."""
    w = word.lower()[:16]
    best, best_d = None, 3
    for k in sorted(words):
        if abs(len(k) - len(w)) < best_d:
            d = _edit_distance(w, k)
            if d < best_d and d < len(w):
                best, best_d = k, d
    return best


def unknown(word, words, after=None):
    """The error for word, which no table has. A suggestion is only of the same kind:
    a unit is said to be one; right after a number (after, the word before it) a slip
    of a unit is a unit ("6500 fet"); else the nearest of words (those that may stand
    there, the caller's list: it is extended by their aliases)."""
    if is_unit(word):
        return "'%s' is a unit: write it after its number, e.g. elev 6500 ft" % shown(word)
    if word.lower() in AMBIGUOUS:
        return AMBIGUOUS[word.lower()]
    unit = None
    if after is not None and starts_number(after):
        unit = nearest(word, list(_UNITS) + ["feet"])
    if unit is not None:
        return "unknown word '%s' after %s; did you mean the unit: %s %s?" % (
            shown(word), shown(after), shown(after), written(unit))
    for entry in ALIASES.split():
        a, stands_for = entry.split("=")
        if stands_for in words and len(a) > 2:
            words.append(a)
    near = nearest(word, words)
    if near is not None:
        near = look_up(ALIASES, near, near)
    return "unknown word '%s'; %s(help lists the words)" % (
        shown(word), "did you mean '%s'? " % near if near else "")
