"""The interpreter's query words: their table (QUERIES: each word's module, loaded for
its line: obs base ice frost stab parcel thermal report levels cold in
lapsecalc.reportwords; chart svg in lapsecalc.chartwords; at, da, iso in
lapsecalc.atwords; balloon, sunset, loads in lapsecalc.balloonwords; show in
lapsecalc.showword) and their output in text, kv and json form (runs on MicroPython)."""
# Sources: every number comes from the library (Column, Column.report(), parcel,
#   balloon, chart); this module only picks, orders and formats them.
#
# A query is f(session, word, args) -> output lines; it reads the session and never
# changes it. Output modes: text (display units, laid out by lapsecalc.layout), kv and
# json (SI, report() keys; kv form in lapsecalc.machine); lines starting "#" are notes
# (defaults in use). chart, balloon and the text layout are imported only by the words
# that use them. A new query word: its function in a word module's WORDS and its entry
# in QUERIES; the keys it shows in lapsecalc.groups, their text labels in
# lapsecalc.labels, its help in lapsecalc.helptext.
from lapsecalc.state import assumed


def emit(s, keys, values, balloon=False, word=None, rest=True, plus=()):
    """Lines of the result keys of values in session s's mode, after the notes of the
    defaults in use. keys: the keys, or the name of their group (lapsecalc.groups),
    then with plus after them. A balloon report (kv and json; its text is
    lapsecalc.balloontext's) shows its keys not in keys too, unless rest is False.
    word: the query word whose text keys (layout.text_keys) the text mode shows."""
    # The numbers are there: a board lets go of the physics first. A word that released
    # before loading this module releases again here, on purpose: the kept report is
    # made afresh once more, now below this module's code (measured: with only the
    # word's own release, ice after points aloft needs 65 KiB on the 32-bit build).
    s.release()
    if isinstance(keys, str):
        from lapsecalc.groups import keys as group_keys
        keys = group_keys(keys) + list(plus)
    if balloon and rest:
        keys = list(keys) + sorted(k for k in values if k not in keys)
    notes = assumed(s.state, balloon, s.mode == "text" and s.disp["p"] == "inhg")
    if s.mode == "kv":
        from lapsecalc.machine import kv_lines
        return ["# assumed " + n for n in notes] + kv_lines(values, keys)
    if s.mode == "json":
        from lapsecalc.jsontext import line
        text = line(keys, values, ("assumed", notes) if notes else None,
                    s.collect if s.drop_word_modules else None, s.write)
        return [] if text is None else [text]  # None: written through s.write
    from lapsecalc.layout import text_lines, text_keys, warning_lines
    if word is not None:
        keys = text_keys(word)
    out = ["assumed " + n for n in notes]
    if "warnings" in values:
        out.extend(warning_lines(s, values, keys))
    for k in keys:
        if k in values:   # a board without the hazards module has no hazard keys
            out.extend(text_lines(s, k, values[k], None, values))
    return out


def assumed_text(s):
    # The text lines of the defaults in use, in the display unit of pressure.
    return ["assumed " + n for n in assumed(s.state, False, s.disp["p"] == "inhg")]


def kv_report(s):
    """Session s's report as key=value lines whatever the mode (or one error line)."""
    try:
        rep = s.report()
    except ValueError as e:
        from lapsecalc.aliases import shown
        return ["error: " + shown(str(e), 300)]
    from lapsecalc.groups import report_keys
    from lapsecalc.machine import kv_lines
    return kv_lines(rep, report_keys(rep))


# query word -> the name of the module whose WORDS has its function f(session, word,
# args) -> output lines (loaded only by the word's line: lapsecalc.dispatch imports it).
QUERIES = {
    "obs": "reportwords", "base": "reportwords", "ice": "reportwords", "frost": "reportwords",
    "stab": "reportwords", "parcel": "reportwords", "thermal": "reportwords",
    "da": "atwords", "at": "atwords", "iso": "atwords",
    "balloon": "balloonwords", "loads": "balloonwords", "sunset": "balloonwords",
    "report": "reportwords", "chart": "chartwords", "svg": "chartwords", "show": "showword",
    "levels": "reportwords", "cold": "reportwords",
}
