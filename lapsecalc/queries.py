"""The interpreter's query words (obs base ice frost da stab parcel thermal report
chart svg levels cold; at, da H, iso in lapsecalc.atwords; balloon, sunset, loads in
lapsecalc.balloonwords; show in lapsecalc.showword) and their output in text, kv and
json form (runs on MicroPython)."""
# Sources: every number comes from the library (Column, Column.report(), parcel,
#   balloon, chart); this module only picks, orders and formats them.
#
# A query is f(session, word, args) -> output lines; it reads the session and never
# changes it. Output modes: text (display units, laid out by lapsecalc.layout), kv and
# json (SI, report() keys; kv form in lapsecalc.machine); lines starting "#" are notes
# (defaults in use). chart, balloon and the text layout are imported only by the words
# that use them. A new query word: its function here and its entry in QUERIES; the
# keys it shows in lapsecalc.groups, their text labels in lapsecalc.layout, its help in
# lapsecalc.helptext.
from lapsecalc.aliases import shown, no_args
from lapsecalc.state import assumed


def emit(s, keys, values, balloon=False, word=None, rest=True, plus=()):
    """Lines of the result keys of values in session s's mode, after the notes of the
    defaults in use. keys: the keys, or the name of their group (lapsecalc.groups),
    then with plus after them. A balloon report (kv and json; its text is
    lapsecalc.balloontext's) shows its keys not in keys too, unless rest is False.
    word: the query word whose text keys (layout.text_keys) the text mode shows."""
    s.release()  # the numbers are there: a board lets go of the physics first
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


# ---- the query words ----

def _c_group(s, w, args):
    no_args(w, args)
    plus = ()
    if w == "base" and s.state.get("excess_c"):
        # The heated thermals' cloud base beside the unheated one.
        plus = ("thermal_excess_c", "thermal_cloud_base_msl_m")
    more = []
    if w == "base" and s.mode == "text":
        # The other methods' cloud bases: their numbers now, their text (display code)
        # after the report's, so a board's report is computed without that code held.
        for method in ("bolton", "spread"):
            more.append(s.column().cloud_base(method)[0])
    out = emit(s, w, s.report(w), False, None if plus else w, True, plus)
    if more:
        from lapsecalc.output import f_h
        for label, z in zip(("Bolton LCL", "spread rule"), more):
            out.append("%-13s%s AGL" % (label, f_h(s, z)))
    if w == "parcel" and s.mode == "text":
        from lapsecalc.layout import PARCEL_NOTE
        out.append(PARCEL_NOTE)
    return out


def _c_report(s, w, args):
    no_args(w, args)
    rep = s.report(w)
    if s.mode != "text":
        s.release()
        from lapsecalc.groups import report_keys
        return emit(s, report_keys(rep), rep)
    extra = _altimeter_section(s, rep)
    s.release()
    from lapsecalc.layout import report_text
    return report_text(s, rep, extra, assumed_text(s), s.write)


def _altimeter_section(s, rep):
    # The report's altimeter lines (lapsecalc.altitext); [] without loading that code
    # when there can be none: the field is not colder than ISA and the altimeter reads
    # high at no reported level.
    ind = rep.get("indicated_altitude_m") or {}
    if rep.get("isa_deviation_c", 0.0) >= 0.0:
        for k in ind:
            if ind[k] is not None and ind[k] > rep[k]:
                break
        else:
            return []
    from lapsecalc.altitext import altimeter_lines
    return altimeter_lines(s, rep)


def _c_chart(s, w, args):
    # chart [TOP [agl]]: TOP zooms (a 2000 ft marine layer fills the picture).
    # Its numbers first (chart.figure), then the Column, the parcel path and the
    # physics code let go of (Session.release) before the lines are drawn.
    col = s.column(w)
    top = None
    if args:
        from lapsecalc.heights import height
        top = height(s, w, args, col)
        height = None  # no name of it kept: release() lets go of its code
        if top < col.elev_m + 30.0:
            from lapsecalc.output import f_h1
            raise ValueError("chart: the top must be at least 100 ft (30 m) above the"
                             " field (%s)" % f_h1(s, col.elev_m))
    from lapsecalc.chart import figure, draw
    rep = s.report(w)
    fig = figure(col, rep, s.levels(), s.disp["t"], top)
    col = figure = None
    s.release()
    return draw(fig, rep, s.disp["h"], s.disp["t"])


def _c_svg(s, w, args):
    if len(args) != 1:
        raise ValueError("svg needs one file name, e.g. svg profile.svg")
    if s.svg_writer is None:
        raise ValueError("svg writes a file: only the CPython command line does"
                         " (lapsecalc --svg FILE)")
    line = s.svg_writer(args[0], chart_svg(s))
    if s.mode == "text":
        return [line]
    from lapsecalc.output import ack
    return ack(s, line, ["svg"])


def chart_svg(s):
    """The profile chart of session s's state as SVG text."""
    from lapsecalc.chartsvg import svg
    return svg(s.column("svg"), s.report("svg"), s.levels(), s.disp["h"], s.disp["t"])


def kv_report(s):
    """Session s's report as key=value lines whatever the mode (or one error line)."""
    try:
        rep = s.report()
    except ValueError as e:
        return ["error: " + shown(str(e), 300)]
    from lapsecalc.groups import report_keys
    from lapsecalc.machine import kv_lines
    return kv_lines(rep, report_keys(rep))


def _c_altimeter(s, w, args):
    # levels and cold: their numbers in lapsecalc.altiwords, then their text in
    # lapsecalc.altitext (each loaded for the line).
    if w == "levels":
        # The report first (its heap peak), then, with the report's own code let go
        # of (the Column stays), the altimeter code.
        no_args(w, args)
        s.report(w)
        s.drop(("parcel", "stability", "hazards", "adiabats"))
    from lapsecalc.altiwords import altimeter_word
    keys, vals, warnings = altimeter_word(s, w, args)
    altimeter_word = None
    s.release()  # the Column, the physics and the altimeter's numbers' code
    from lapsecalc.altitext import altimeter_text
    keys, vals, text = altimeter_text(s, w, keys, vals, warnings)
    altimeter_text = None
    if s.mode != "text":
        return emit(s, keys, vals)
    return assumed_text(s) + text


# query word -> f(session, word, args) -> output lines, or the name of the module
# whose WORDS has that f (loaded only by the word's line; lapsecalc.shell imports it)
QUERIES = {
    "obs": _c_group, "base": _c_group, "ice": _c_group, "frost": _c_group, "stab": _c_group,
    "parcel": _c_group, "thermal": _c_group, "da": "atwords", "at": "atwords", "iso": "atwords",
    "balloon": "balloonwords", "loads": "balloonwords", "sunset": "balloonwords",
    "report": _c_report, "chart": _c_chart, "svg": _c_svg, "show": "showword",
    "levels": _c_altimeter, "cold": _c_altimeter,
}
