"""The interpreter's query words (obs base ice frost da at iso stab parcel thermal
report chart svg levels cold; balloon, sunset, loads in lapsecalc.balloonwords, show
in lapsecalc.showword) and their output in text, kv and json form (runs on
MicroPython)."""
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
from lapsecalc.limits import T_MIN_C, T_MAX_C
from lapsecalc.typed import number, value, shown, said, unit_kind, no_args
from lapsecalc.state import assumed


def emit(s, keys, values, balloon=False, word=None, rest=True, plus=()):
    """Lines of the result keys of values in session s's mode, after the notes of the
    defaults in use. keys: the keys, or the name of their group (lapsecalc.groups),
    then with plus after them. A balloon report (text labels from
    lapsecalc.balloontext) shows its keys not in keys too, unless rest is False.
    word: the query word whose text keys (layout.text_keys) the text mode shows."""
    s.release()  # the numbers are there: a board lets go of the physics first
    if isinstance(keys, str):
        from lapsecalc.groups import GROUPS
        keys = GROUPS[keys] + plus
    if balloon and rest:
        keys = list(keys) + sorted(k for k in values if k not in keys)
    notes = assumed(s.state, balloon)
    if s.mode == "kv":
        from lapsecalc.machine import kv_lines
        return ["# assumed " + n for n in notes] + kv_lines(values, keys)
    if s.mode == "json":
        from lapsecalc.machine import machine
        obj = {}
        for k in keys:
            if k in values:
                obj[k] = machine(k, values[k])
        if notes:
            obj["assumed"] = notes
        if s.drop_word_modules:
            # On a board: the line is one string of a few KiB that grows as it is
            # written; collecting first leaves it the largest free run of the heap.
            s.collect()
        return [s.json.dumps(obj)]
    from lapsecalc.layout import text_lines, text_keys, warning_lines
    if word is not None:
        keys = text_keys(word)
    labels, heads = {}, {}
    if balloon:
        from lapsecalc.balloontext import LABELS as labels, HEADINGS as heads
    out = ["assumed " + n for n in notes]
    if not balloon and "warnings" in values:
        out.extend(warning_lines(s, values, keys))
    for k in keys:
        if k in heads:
            out.append(heads[k])
        if k in values:   # a board without the hazards module has no hazard keys
            out.extend(text_lines(s, k, values[k], labels.get(k), values))
    return out


# ---- the query words ----

def _c_group(s, w, args):
    no_args(w, args)
    plus = ()
    if w == "base" and s.state.get("excess_c"):
        # The heated thermals' cloud base beside the unheated one.
        plus = ("thermal_excess_c", "thermal_cloud_base_msl_m")
    more = []
    if w == "base" and s.mode == "text":
        from lapsecalc.output import f_h
        for method, label in (("bolton", "Bolton LCL"), ("spread", "spread rule")):
            more.append("%-13s%s AGL" % (label, f_h(s, s.column().cloud_base(method)[0])))
    out = emit(s, w, s.report(w), False, None if plus else w, True, plus) + more
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
    from lapsecalc.groups import report_keys
    from lapsecalc.layout import report_text
    return ["assumed " + n for n in assumed(s.state)] + report_text(
        s, rep, report_keys(rep), extra)


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


def _height(s, w, args, col):
    # A height m MSL from "H" (MSL, or indicated on QNH after "heights ind"), "H agl",
    # "H msl", "H ind", a flight level "FL85", or a pressure "P" (the height of P); the
    # field when there are no args.
    if not args:
        return col.elev_m
    if len(args) > 2:
        raise ValueError("%s takes a height, e.g. %s 8000ft, %s 2000ft agl, %s FL85, %s 700hPa"
                         % (w, w, w, w, w))
    where = args[1].lower() if len(args) > 1 else s.disp["z"]
    if args[0][:2].lower() == "fl" or where == "ind":
        from lapsecalc.altitext import height_aloft
        return height_aloft(s, w, args, col)
    if len(args) == 1 and unit_kind(args[0]) == "p":
        p = number(args[0], "p", "hpa")
        p_top = col.p_at(col.top_m)
        if not p_top <= p <= col.p_hpa:
            from lapsecalc.output import f_p
            raise ValueError("%s: %s is not in the column (%s at the field, %s at the top)"
                             % (w, said(args[0], "hpa"), f_p(s, col.p_hpa, True),
                                f_p(s, p_top, True)))
        return col.z_at(p)
    z = number(args[0], "h", s.disp["h"])
    if where not in ("agl", "msl"):
        raise ValueError("%s: '%s' after the height; accepted agl, msl or ind (indicated on"
                         " QNH)" % (w, shown(args[1])))
    if where == "agl":
        z += col.elev_m
    typed = said(args[0], s.disp["h"]) + (" AGL" if where == "agl" else "")
    # A millimetre of rounding at either end is the end itself.
    from lapsecalc.output import f_h1
    if z < col.elev_m - 0.001:
        raise ValueError("%s: %s is below the field (%s)" % (w, typed, f_h1(s, col.elev_m)))
    if z > col.top_m + 0.001:
        raise ValueError("%s: %s is above the column top (%s)"
                         % (w, typed, f_h1(s, col.top_m)))
    return min(max(z, col.elev_m), col.top_m)


def _c_at(s, w, args):
    if w == "da" and not args:
        return _c_group(s, w, args)
    if not args:
        raise ValueError("at needs a height, e.g. at 8000ft, at 2000ft agl, at 700hPa")
    col = s.column(w)
    z = _height(s, w, args, col)
    p = col.p_at(z)
    vals = {"at_msl_m": z, "at_t_c": col.t_at(z), "at_p_hpa": p,
            "at_vapour_pressure_hpa": col.vapour_pressure_at(z),
            "at_air_density_kg_m3": col.density_at(z),
            "at_density_altitude_m": col.density_altitude_at(z),
            "at_parcel_t_c": _parcel_t(s, col, z)}
    from lapsecalc.altimetry import altimeter_view, COLD_WARNING_K
    ind, pa, dev = altimeter_view(col, z, p)
    vals["at_indicated_m"], vals["at_pressure_altitude_m"], vals["at_isa_deviation_c"] = \
        ind, pa, dev
    col = None  # let go of before the text is laid out
    out = emit(s, "at", vals)
    if s.mode == "text" and dev <= -COLD_WARNING_K and ind > z:
        from lapsecalc.altitext import cold_warning_lines
        out.extend(cold_warning_lines(s, [("at_msl_m", z, dev, ind - z)]))
    return out


def _parcel_t(s, col, z):
    # The parcel temperature at z recomputed between the path's levels, as the report's
    # parcel levels are (parcel.temperature_at); the chart's linear interpolation is
    # for drawing only and is up to a few tenths of a K off on the moist adiabat.
    from lapsecalc.parcel import temperature_at
    levels = s.levels()
    for i in range(1, len(levels)):
        if z <= levels[i][0]:
            lcl = col.elev_m + s.report("at")["cloud_base_agl_m"]
            return temperature_at(col, levels, i, z, lcl)
    return levels[-1][2]


def _c_iso(s, w, args):
    if len(args) != 1:
        raise ValueError("iso needs one temperature, e.g. iso -15C")
    col = s.column(w)
    t = value(args[0], "t", s.disp["t"], T_MIN_C, T_MAX_C, w)
    vals = {"iso_t_c": t, "iso_level_msl_m": col.level(t), "iso_levels_msl_m": col.crossings(t)}
    col = None  # let go of before the text is laid out
    return emit(s, "iso", vals)


def _c_chart(s, w, args):
    # chart [TOP [agl]]: TOP zooms (a 2000 ft marine layer fills the picture).
    col = s.column(w)
    top = None
    if args:
        top = _height(s, w, args, col)
        if top < col.elev_m + 30.0:
            from lapsecalc.output import f_h1
            raise ValueError("chart: the top must be at least 100 ft (30 m) above the"
                             " field (%s)" % f_h1(s, col.elev_m))
    from lapsecalc.chart import text
    return text(col, s.report(w), s.levels(), s.disp["h"], s.disp["t"], top)


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
    from lapsecalc.chart import svg
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
    # levels and cold: their work and text in lapsecalc.altitext (loaded for the line).
    from lapsecalc.altitext import altimeter_word
    keys, vals, text = altimeter_word(s, w, args)
    if s.mode != "text":
        return emit(s, keys, vals)
    return ["assumed " + n for n in assumed(s.state)] + text


# query word -> f(session, word, args) -> output lines, or the name of the module
# whose WORDS has that f (loaded only by the word's line; lapsecalc.shell imports it)
QUERIES = {
    "obs": _c_group, "base": _c_group, "ice": _c_group, "frost": _c_group, "stab": _c_group,
    "parcel": _c_group, "thermal": _c_group, "da": _c_at, "at": _c_at, "iso": _c_iso,
    "balloon": "balloonwords", "loads": "balloonwords", "sunset": "balloonwords",
    "report": _c_report, "chart": _c_chart, "svg": _c_svg, "show": "showword",
    "levels": _c_altimeter, "cold": _c_altimeter,
}
