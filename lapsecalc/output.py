"""How the interpreter says things: numbers in the session's display units, the "ok"
line of a taken line, and values in kv form (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units).
#
# The f_* functions take the session (they read s.disp) and give a padded column
# ("   1350 ft    411 m") or, with compact, the short form for acks ("1350 ft (411 m)").
# The kv and json forms of values are in lapsecalc.machine (loaded by those modes).
from lapsecalc import units


def f_h(s, z_m, compact=False, tag=""):
    # tag: what the height is (" MSL", " AGL", " IND"), in the same string (a board
    # allocates every string).
    ft, m = round(units.m_to_ft(z_m)), round(z_m)
    if s.disp["h"] == "ft":
        return "%d ft (%d m)%s" % (ft, m, tag) if compact else "%7d ft %6d m%s" % (ft, m, tag)
    return "%d m (%d ft)%s" % (m, ft, tag) if compact else "%7d m %7d ft%s" % (m, ft, tag)


def f_h1(s, z_m):
    """A height in the display unit alone: "1350 ft"."""
    return "%d %s" % (round(units.m_to_ft(z_m) if s.disp["h"] == "ft" else z_m), s.disp["h"])


def _one(x):
    # x rounded to a tenth, with no "-0.0".
    return round(x, 1) + 0.0


def f_t(s, t_c, compact=False):
    t, u = (units.c_to_f(t_c), "F") if s.disp["t"] == "f" else (t_c, "C")
    return ("%.1f %s" if compact else "%7.1f %s") % (_one(t), u)


def f_dt(s, k, compact=False):
    """A temperature difference, always in K (a step of 1 K is a step of 1 C; never
    converted as if it were a temperature)."""
    return ("%+.1f K" if compact else "%+7.1f K") % _one(k)


def f_p(s, hpa, compact=False):
    if s.disp["p"] == "inhg":
        return ("%.2f inHg" if compact else "%7.2f inHg") % units.hpa_to_inhg(hpa)
    return ("%.1f hPa" if compact else "%7.1f hPa") % hpa


# Plain kinds: the value in a fixed format after its label.
_PLAIN = {"rho": "%7.3f kg/m3", "jkg": "%7.0f J/kg", "pct": "%7.0f %%", "gkg": "%7.1f g/kg",
          "gmol": "%7.3f g/mol"}


def value_text(s, kind, v):
    """The text after its label of a value v (not None) of a kind both text layouts say
    alike (lapsecalc.layout, lapsecalc.balloontext): t a temperature, dt a difference,
    p a pressure (session s's display units), b yes/no, frac a fraction in %, m3 a
    volume (and ft3), kg a mass (and lb), a plain kind (_PLAIN); else v as it is."""
    if kind == "t":
        return f_t(s, v)
    if kind == "dt":
        return f_dt(s, v)
    if kind == "p":
        return f_p(s, v)
    if kind == "b":
        return "    yes" if v else "     no"
    if kind in _PLAIN:
        return _PLAIN[kind] % v
    if kind == "frac":
        return "%7.1f %%" % (100.0 * v)
    if kind == "m3":
        return ("%7.0f m3 %8.0f ft3" if v >= 100.0 else "%7.2f m3 %8.1f ft3") % (
            v, units.m3_to_ft3(v))
    if kind == "kg":
        if -0.05 < v < 0.05:
            v = 0.0  # no "-0.0 kg -0 lb" (a temperature is rounded in its display unit)
        return "%7.1f kg %6.0f lb" % (v, units.kg_to_lb(v))
    return ("%.6g" % v) if isinstance(v, float) else str(v)


def f_lapse(s, lapse):
    """An ELR in the elr syntax, tops AGL in the display unit: "9.5@820ft 7.5@7874ft 6.5"."""
    if not isinstance(lapse, list):
        return "%.1f K/km (%.2f C/1000ft)" % (lapse, units.k_per_km_to_c_per_1000ft(lapse))
    h = s.disp["h"]
    return " ".join("%g" % r + ("" if t is None else "@%d%s" % (
        round(units.m_to_ft(t) if h == "ft" else t), h)) for t, r in lapse) + " K/km"


def _plain(text):
    # True when text is printable ASCII with its words separated by single spaces:
    # then its words are the runs between its spaces, in CPython as on a board.
    prev = 32
    for b in text.encode():
        if b < 32 or b > 126 or (b == 32 and prev == 32):
            return False
        prev = b
    return prev != 32


def wrap_each(items, mark, width=40):
    """Each sentence of items as lines of at most width columns (wrap), the first of
    each marked mark ("!" a warning, "-" a note)."""
    out = []
    for c in items:
        out.extend(wrap(c, mark + " ", "  ", width))
    return out


def wrap(text, first, rest="  ", width=40):
    """text as lines of at most width columns (a word longer than a line is cut), the
    first starting with first, the others with rest (first and rest end in a space or
    are empty). Each line is made once: from a slice of text when its words are
    separated by single spaces, else from its words (a board counts every string a
    line allocates)."""
    cut = max(1, width - len(rest))  # a hard bound: at least a character a piece
    if _plain(text):
        out = []
        line, a, n = first, 0, len(first)  # the line's start, its first word, its length
        i, end = 0, len(text)
        while i < end:
            j = text.find(" ", i)
            if j < 0:
                j = end
            if j - i > cut:
                break  # a word longer than a line: cut, below
            if i > a and n + 1 + j - i > width:
                out.append(line + text[a:i - 1])
                line, a, n = rest, i, len(rest)
            n += j - i + (i > a)
            i = j + 1
        else:
            out.append(line + text[a:])
            return out
    words = []
    for word in text.split():
        while len(word) > cut:  # a word longer than a line: cut
            words.append(word[:cut])
            word = word[cut:]
        words.append(word)
    out = []
    line, a, n = first, 0, len(first)  # the line's start, its first word, its length
    for i in range(len(words)):
        w = len(words[i])
        if i > a and n + 1 + w > width:
            out.append(line + " ".join(words[a:i]))
            line, a, n = rest, i, len(rest)
        n += w + (i > a)
    out.append(line + " ".join(words[a:]))
    return out


def say(s, key, text):
    """One message (key "error" or "check") in session s's mode: text mode "key: ..."
    wrapped to 40 columns; kv "key=..." on one line; json {"key": "..."}."""
    if s.mode == "kv":
        return ["%s=%s" % (key, text)]
    if s.mode == "json":
        from lapsecalc.jsontext import line
        return [line((), (), (key, text))]
    return wrap(text, key + ": ")


def ack(s, what, words=None):
    """The lines that say a line was taken: "ok: what" in text mode (wrapped to 40
    columns when several settings share the line); in kv "ok=word,word" and in json
    {"ok": [words]}, the words that were set (what itself when words is None)."""
    if s.mode != "text":
        said = words if words is not None else [what]
        if s.mode == "kv":
            return ["ok=" + ",".join(said)]
        from lapsecalc.jsontext import line
        return [line((), (), ("ok", said))]
    parts = []
    for x in ([what] if isinstance(what, str) else what):
        parts.extend(x.split(", "))
    out = ["ok: " + parts[0]]
    for x in parts[1:]:
        if len(out[-1]) + 2 + len(x) <= 40:
            out[-1] += ", " + x
        else:
            out[-1] += ","
            out.append("    " + x)
    return out
