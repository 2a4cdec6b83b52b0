"""A refusal of the library retold in the interpreter's terms: the words the user
types and the display units (runs on MicroPython; loaded only when a line is refused
in library wording, dropped after the line on a board)."""
# Sources: unit conversions by exact definition (lapsecalc.typed, lapsecalc.units).
#
# The library names its arguments and speaks SI ("top_m", "t_c=16.11 is outside the
# allowed range 50..150 degC", "aloft point 1 (71.7163 hPa) lands at 18415 m MSL").
# The interpreter checks what it can in the user's terms before it calls the library;
# what only the library can find (a profile warmer than 60 degC aloft, a pressure
# point above the column top, a working envelope temperature below the ambient air)
# comes back here and is said again: each "name=value" as the word and the value in
# the display unit, each "value unit" and "lo..hi unit" in the display unit, a point
# aloft as its level, every other argument name as the word that sets it.

# Library argument name -> (what the user calls it, quantity: t degC, h m, p hPa,
# dt K; or the unit its number is said in as it is).
NAMES = {
    "t_c": ("temp", "t"), "td_c": ("dew", "t"), "rh_pct": ("rh", "%"),
    "elev_m": ("elev", "h"), "p_hpa": ("pressure", "p"), "qnh_hpa": ("qnh", "p"),
    "top_m": ("top", "h"), "tropopause_m": ("trop", "h"),
    "z_m": ("the height", "h"), "h_m": ("the height", "h"), "iso": ("iso", "t"),
    "excess_c": ("excess", "dt"), "max_envelope_t_c": ("tmax", "t"),
    "envelope_t_c": ("the working temp", "t"), "envelope_m3": ("env", "m3"),
    "gas_volume_m3": ("fill", "m3"), "volume_m3": ("env", "m3"), "weight_kg": ("wt", "kg"),
    "empty_kg": ("the empty weight", "kg"), "purity": ("pure", ""),
    "margin_k": ("margin", "dt"), "superheat_k": ("superheat", "dt"),
    "indicated_m": ("the indicated height", "h"), "t_air_c": ("the air temp", "t"),
    "height_above_field_m": ("the height above the field", "h"),
    "height_above_aerodrome_m": ("the height above the field", "h"),
    "aerodrome_t_c": ("temp", "t"), "aerodrome_elev_m": ("elev", "h"),
    "p_station_hpa": ("the station pressure (stn)", "p"), "fl": ("the flight level", ""),
    "value": ("the number", ""),
}
_QUANTITY = ("t", "h", "p", "dt")
# Phrases of the library said otherwise (before anything else is retold).
PHRASES = (("lower top_m or change the layers", "set top lower or change elr"),
           (" (working) is below", " is below"))
# Units the library writes after a number -> quantity.
_UNIT_KIND = {"degC": "t", "m": "h", "hPa": "p"}
_PUNCT = ",;:)"


def _strip(tok):
    # (opening "(" or "", the token's core, closing punctuation).
    head = "(" if tok[:1] == "(" else ""
    core = tok[len(head):]
    tail = ""
    while core and core[-1] in _PUNCT:
        tail = core[-1] + tail
        core = core[:-1]
    return head, core, tail


def _num(text):
    try:
        return float(text)
    except ValueError:
        return None


def _display(s, kind):
    # The unit the session shows quantity kind in.
    if kind == "t":
        return s.disp["t"]
    if kind == "h":
        return s.disp["h"]
    if kind == "p":
        return s.disp["p"]
    return "k"


def said_as(s, x, kind):
    """x (the library's unit of kind) as the session says it: "60 C", "15866 ft"."""
    from lapsecalc.typed import in_unit
    return in_unit(x, _display(s, kind), kind)


def _bound(s, x, kind):
    # A range bound without its unit.
    text = said_as(s, x, kind)
    return text[:text.find(" ")]


def _point(st, i):
    # The level of point i (1-based) of state st's points aloft, as the user sees it.
    pts = st.get("aloft", ())
    return pts[i - 1] if 0 < i <= len(pts) else None


def retell(s, st, msg):
    """msg, a refusal in the library's wording, in the words of session s (display
    units, the words that set each value); st is the state the line was checked in
    (its points aloft name "aloft point N")."""
    msg = msg.replace(" the allowed range ", " ").replace(" is not a number in ", " is outside ")
    for a, b in PHRASES:
        msg = msg.replace(a, b)
    toks = msg.split(" ")
    out = []
    i = 0
    n = len(toks)
    while i < n:
        head, core, tail = _strip(toks[i])
        nxt = _strip(toks[i + 1]) if i + 1 < n else ("", "", "")
        if core == "aloft" and nxt[1] == "point" and i + 2 < n:
            h2, idx, t2 = _strip(toks[i + 2])
            pt = _point(st, int(idx)) if idx.isdigit() else None
            if pt is not None:
                from lapsecalc.aloftwords import level_text
                j = i + 3
                # the library's own "(71.7163 hPa)" after it
                if j < n and toks[j][:1] == "(":
                    while j < n - 1 and ")" not in toks[j]:
                        j += 1
                    tail = _strip(toks[j])[2].replace(")", "", 1)
                    j += 1
                else:
                    tail = t2
                out.append(head + "aloft " + level_text(s, pt) + tail)
                i = j
                continue
        if "=" in core and core[:1] != "'":
            name, val = core.split("=", 1)
            word, kind = NAMES.get(name, (name, ""))
            x = _num(val)
            if name == "fl" and x is not None:
                word, val = "FL%g" % x, ""
            elif x is not None and kind in _QUANTITY:
                val = said_as(s, x, kind)
            elif x is not None:
                val = ("%g " % x + kind).rstrip()
            out.append(head + (word + " " + val).rstrip() + tail)
            i += 1
            continue
        if core in NAMES:
            out.append(head + NAMES[core][0] + tail)
            i += 1
            continue
        kind = _UNIT_KIND.get(nxt[1]) if not tail else None
        if kind is not None:
            if ".." in core[1:]:
                k = core.find("..", 1)
                lo, hi = _num(core[:k]), _num(core[k + 2:])
                if lo is not None and hi is not None:
                    said = said_as(s, hi, kind)
                    out.append(head + _bound(s, lo, kind) + ".." + said + nxt[2])
                    i += 2
                    continue
            x = _num(core)
            if x is not None:
                out.append(head + said_as(s, x, kind) + nxt[2])
                i += 2
                continue
        # "A and B m MSL": both in B's unit
        if _num(core) is not None and nxt[1] == "and" and i + 3 < n:
            b = _strip(toks[i + 2])
            u = _strip(toks[i + 3])
            k2 = _UNIT_KIND.get(u[1])
            if k2 is not None and _num(b[1]) is not None and not b[2]:
                out.append(head + _bound(s, _num(core), k2) + tail + " and " + b[0]
                           + said_as(s, _num(b[1]), k2) + u[2])
                i += 4
                continue
        out.append(toks[i])
        i += 1
    return " ".join(out)
