"""Text-mode layout of the interpreter's results (loaded only when text output is asked)."""
# Sources: none; labels and units only. Every line fits a 40-column screen: a
#   13-column label, then the value in the session's display units.
# The labels first: their table is one string of 1.6 KB, the largest piece the text
# stage needs in one run of the heap (loaded before the rest cuts it up).
from lapsecalc.labels import LABELS, find, field, find_label
from lapsecalc import units
from lapsecalc.output import f_h, f_t, value_text, wrap_each as wrap

# Words for the stability classes and thermal kinds in text mode ("value:word;").
WORDS = (";absolutely_stable:abs stable;"
         "conditionally_unstable:cond unstable;"
         "absolutely_unstable:abs unstable;"
         "dry_neutral:dry neutral;"
         "saturated_neutral:sat neutral;"
         "none:none (stable at ground);"
         "blue:blue (dry, no cumulus);"
         "cumulus:cumulus;"
         "capped:capped layer, not cumulus;")


def word_text(table, v):
    """The text word of value v in table (WORDS or lapsecalc.hazardtext.WORDS), then in
    WORDS, else v as it is."""
    if isinstance(v, str):
        for t in (table, WORDS):
            i = find(t, v)
            if i >= 0:
                return field(t, i)
    return str(v)


# Said under the parcel results (stability.parcel_analysis integrates the plain
# temperature difference: the humidity aloft, needed for virtual temperatures, is not
# observed).
PARCEL_NOTE = "CAPE/CIN use air temps (not virtual)"


def level(s, z_m, ind_m=None):
    """A level z_m (m MSL) in session s's display: true MSL, or indicated on QNH after
    "heights ind" (ind_m, the report's reading of it, when it has one; true MSL where
    no altimeter reading exists)."""
    if s.disp.get("z") == "ind":
        if ind_m is not None:
            return f_h(s, ind_m, False, " IND")
        from lapsecalc.indicated import indicated_altitude_at
        try:
            return f_h(s, indicated_altitude_at(s.column(), z_m), False, " IND")
        except ValueError:
            pass
    return f_h(s, z_m, False, " MSL")


# Kinds shown as one number and a fixed unit.
# What a report's level line says when the level lies above the column top (the
# library's levels_above_top); the top follows on the next line.
ABOVE = "above the column top"


def warning_lines(s, rep, keys):
    """The report's warnings that concern keys, as "!" lines for the text mode: the
    ones about the whole column and its inputs, and "LABEL above the column top (N)"
    in the display unit for each key whose level lies above the top."""
    said = [w for w in rep["warnings"] if ": %s (" % ABOVE not in w]
    # The library's sentences speak m and degC: one with a height and ft shown, or a
    # temperature and F shown, is said again (lapsecalc.retell, loaded only then: a
    # board's heap); else only "degC" is said "C".
    for i in range(len(said)):
        w = said[i]
        if (s.disp["h"] == "ft" and " m " in w) or (s.disp["t"] == "f" and " degC" in w):
            from lapsecalc.retell import retell
            said[i] = retell(s, s.state, w)
        else:
            said[i] = w.replace(" degC", " C")
    for k in rep.get("levels_above_top", ()):
        if k in keys:
            said.append("%s: %s (%s)" % (find_label(LABELS, k)[0].strip(), ABOVE,
                                         f_h(s, rep["top_msl_m"], True)))
    return wrap(said, "!")


def text_lines(s, key, v, label_kind=None, rep=None):
    """Text-mode lines of one result key and value for session s (its display units),
    a list or, for none, the empty tuple () (one shared object: a board allocates
    every new list, never it); rep, when given, is the whole result (some
    lines depend on another key). The hazard keys' labels and words are in
    lapsecalc.hazardtext, loaded only for them."""
    if key == "stability_layers":
        return layer_lines(s, v)
    words = WORDS
    if label_kind:  # (label, kind) or find_label's (label, kind, True): balloon, show
        label, kind = label_kind[0], label_kind[1]
        if v is None and len(label_kind) > 2:
            return ()
    else:
        # The label and kind read from the table in place (no tuple: a board counts
        # every allocation of a line).
        table = LABELS
        i = find(table, key)
        if i < 0 and key != "cautions":
            try:
                from lapsecalc import hazardtext
            except (ImportError, AttributeError):  # a board without the hazard modules
                hazardtext = None
            if hazardtext is not None:
                table = hazardtext.LABELS
                i = find(table, key)
                words = hazardtext.WORDS
        if i < 0:
            label, kind = key, "?"
        else:
            label = field(table, i)
            i += len(label) + 1
            kind = field(table, i)
            if v is None and table.startswith(":q", i + len(kind)):
                return ()  # quiet when None: a hazard not present
    return _kind_lines(s, key, v, label, kind, words, rep)


def _kind_lines(s, key, v, label, kind, words, rep):
    # text_lines once the label and kind of key are known: the kinds said in several
    # lines or none, then one line of the value (text_lines is split in three so that
    # a board loads no piece of code larger than about 1 KB: a heap full of small
    # holes still takes it).
    if kind == "until":
        return () if v is None else wrap(
            ["no dry thermals until the surface reaches %s" % f_t(s, v, True)], "-")
    if kind == "ztop":
        if v is None and rep is not None and rep.get("icing_band_basis") is not None:
            return ["%-13s%s" % (label, "   unknown")]
        kind = "z"
    if kind == "hide" or (key == "warnings" and rep is not None and "levels_above_top" in rep):
        return ()
    if isinstance(v, dict):
        return ()  # indicated_altitude_m: the levels word and "heights ind" show it
    if key == "cautions" or kind == "say!":
        return wrap(v, "!")
    if kind == "say1":
        return ()  # said among the warnings
    if kind == "say-":
        return wrap(v, "-")
    if v is None and rep is not None and key in rep.get("levels_above_top", ()):
        return ["%-13s%s" % (label, ABOVE), "%-13s(%s)" % ("", f_h(s, rep["top_msl_m"], True))]
    if kind == "lkm" and v is not None:
        # The rate and its class (the report's key ..._class) on one line.
        c = rep.get(key.replace("k_per_km", "class")) if rep else None
        return ["%-13s%7.1f K/km %s" % (label, v, word_text(WORDS, c) if c else "")]
    if kind == "zz":
        if v is None:
            return ()  # no dewpoints aloft: the assumed humidity places no layers
        if not v:
            return ["%-13s%s" % (label + "s", "   none (spread > 3 K)")]
        return ["%-13s%s" % (label if i == 0 else "", "%s-%s" % (
            f_h(s, a, True).split(" (")[0], f_h(s, b, True))) for i, (a, b) in enumerate(v)]
    if kind == "zl":
        # Every pass only when there is more than one (else the level line says it).
        if len(v) < 2:
            return ()
        return ["%-13s%s" % (label if i == 0 else "", level(s, z)) for i, z in enumerate(v)]
    if v is None:
        return ["%-13s%s" % (label, "   none in column" if kind == "z" else "   none")]
    return ["%-13s%s" % (label, _value_text(s, key, v, kind, words, rep))]


def _value_text(s, key, v, kind, words, rep):
    # The text of value v (not None) of key, of kind kind, after its label: the kinds
    # of the report's own, then those every layout shares (output.value_text).
    if kind == "z":
        # The report's own reading, if it has one: no Column built again for the text.
        ind = rep.get("indicated_altitude_m") if rep else None
        return level(s, v, ind.get(key) if ind else None)
    if kind in ("zt", "a", "i", "alt"):
        # The tag says what the height is (DA: its label does).
        return f_h(s, v, False, " MSL" if kind == "zt" else " AGL" if kind == "a" else
                   " IND" if kind == "i" else "")
    if kind == "pa":
        return f_h(s, v, False, " FL%d" % round(units.m_to_ft(v) / 100.0))
    if kind == "ph":
        return "%7.1f hPa" % v  # aloft and vapour: hPa whatever the display unit
    if kind == "s":
        return " " + word_text(words, v)
    return value_text(s, kind, v)


def layer_lines(s, rows):
    """The stability layers as a small table in the display height unit."""
    out = ["layer %s MSL     ELR SALR K/km" % s.disp["h"]]
    for r in rows:
        a, b = r["bottom_msl_m"], r["top_msl_m"]
        if s.disp["h"] == "ft":
            a, b = units.m_to_ft(a), units.m_to_ft(b)
        out.append("%6d-%-6d %5.1f %4.1f %s" % (round(a), round(b), r["lapse_k_per_km"],
                                                 r["saturated_k_per_km"],
                                                 word_text(WORDS, r["class"])))
    return out


def text_keys(word):
    """The keys of query word's group in text: the column top is said with the
    stability of the whole column (after the tropopause), not in the surface block."""
    from lapsecalc.groups import keys as group_keys
    keys = group_keys(word)
    if word == "obs":
        return [k for k in keys if k != "top_msl_m"]
    if word == "stab":
        return list(keys[:-1]) + ["top_msl_m"] + list(keys[-1:])
    return keys
