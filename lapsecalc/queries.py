"""The interpreter's query words (obs base ice frost da at iso stab parcel thermal
report chart svg balloon show) and their output in text, kv and json form (runs on
MicroPython)."""
# Sources: every number comes from the library (Column, Column.report(), parcel,
#   balloon, chart); this module only picks, orders and formats them.
#
# A query is f(session, word, args) -> output lines; it reads the session and never
# changes it. Output modes: text (display units, laid out by lapsecalc.layout), kv and
# json (SI, report() keys; kv form in lapsecalc.output); lines starting "#" are notes
# (defaults in use). chart, balloon and the text layout are imported only by the words
# that use them. A new query word: its function here and its entry in QUERIES; the
# keys it shows in lapsecalc.groups, their text labels in lapsecalc.layout, its help in
# lapsecalc.helptext.
from lapsecalc.limits import T_MIN_C, T_MAX_C
from lapsecalc.typed import number, value, shown, said, unit_kind, no_args
from lapsecalc.state import assumed, STANDARD_QNH_HPA, ISA_LAPSE_K_PER_KM, DEFAULT_TOP_M, DEFAULT_TROP_M


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


def _balloon_needs(s, w, gas):
    # Refuse a balloon word until its settings are there (hot air or this gas).
    st = s.state
    need = (("env", "env_m3"), ("wt", "wt_kg"), ("fill", "fill_m3") if gas else ("tmax", "tmax_c"))
    miss = [n for n, k in need if k not in st]
    if miss:
        raise ValueError("%s (%s) needs %s: set first, e.g. %s" % (
            w, "gas " + gas if gas else "hot air", ", ".join(miss),
            "gas helium env 10m3 fill 6m3 wt 4kg" if gas else "env 2800m3 wt 450kg tmax 120C"))
    if gas and st["fill_m3"] > st["env_m3"]:
        raise ValueError("%s: fill %g m3 is more than env %g m3; the gas fills at most the"
                         " envelope" % (w, st["fill_m3"], st["env_m3"]))


def _hot_needs(s, w, col, z, t_work):
    # A working envelope temperature below the air at z lifts nothing: said in the
    # display unit, with the words that set it.
    t_air = col.t_at(z)
    if t_work < t_air:
        from lapsecalc.output import f_t, f_h1
        raise ValueError("%s: the working envelope temp %s is below the air (%s at %s);"
                         " set tenv, tmax or margin higher" % (
                             w, f_t(s, t_work, True), f_t(s, t_air, True), f_h1(s, z)))


def _gas_report(s, w, args, gas):
    st = s.state
    col = s.column(w)
    z = _height(s, w, args, col)
    from lapsecalc.balloon import gas_report
    return gas_report(col, gas, st.get("purity", 1.0), st["fill_m3"], st["env_m3"],
                      st["wt_kg"], z, st.get("superheat_k", 0.0))


def _c_balloon(s, w, args):
    st = s.state
    gas = st.get("gas")
    _balloon_needs(s, w, gas)
    if gas:
        return emit(s, "gas", _gas_report(s, w, args, gas), True)
    return emit(s, "hot", _hot_report(s, w, args), True)


def _hot_report(s, w, args):
    # (Its own function: the column and the balloon code are let go of before the text
    # is laid out.)
    st = s.state
    col = s.column(w)
    z = _height(s, w, args, col)
    from lapsecalc import balloon
    _hot_needs(s, w, col, z, balloon.working_envelope_t(
        st["tmax_c"], st.get("tenv_c"), st.get("margin_k", balloon.DEFAULT_MARGIN_K)))
    return balloon.hot_air_report(col, st["env_m3"], st["wt_kg"], st["tmax_c"],
                                  st.get("tenv_c"), z,
                                  st.get("margin_k", balloon.DEFAULT_MARGIN_K))


def _c_sunset(s, w, args):
    gas = s.state.get("gas")
    if not gas:
        raise ValueError("sunset is for a gas balloon: set gas helium (or h2), env, fill, wt"
                         " and superheat first")
    _balloon_needs(s, w, gas)
    r = _gas_report(s, w, args, gas)
    out = emit(s, "sunset", r, True, None, False)
    if s.mode == "text" and "superheat_k" not in s.state:
        out.append("superheat not set: 0 K (superheat 12K)")
    return out


def _c_loads(s, w, args):
    # loads [EMPTY]: the load table at the working temperature, rows every 2000 ft (or
    # 500 m) up to 10000 ft (3000 m) above the field, six field temperatures (few
    # rows: every cell is a lift computed in its own column, and a board pays for each).
    st = s.state
    if st.get("gas"):
        raise ValueError("loads is for a hot-air balloon (gas none); a gas balloon: balloon")
    _balloon_needs(s, w, None)
    if len(args) > 1:
        raise ValueError("loads takes at most an empty weight, e.g. loads 420kg")
    empty = None
    if args:
        empty = value(args[0], "w", "kg", 1.0, 20000.0, w)
    col = s.column(w)
    from lapsecalc.balloon import working_envelope_t, DEFAULT_MARGIN_K
    from lapsecalc.loadtable import load_table, load_table_text
    t_work = working_envelope_t(st["tmax_c"], st.get("tenv_c"),
                                st.get("margin_k", DEFAULT_MARGIN_K))
    ft = s.disp["h"] == "ft"
    tab = load_table(col, st["env_m3"], t_work, st["tmax_c"], empty, step_m=609.6 if ft else 500.0,
                     depth_m=3048.0 if ft else 3000.0)
    if s.mode == "text":
        out = ["assumed " + n for n in assumed(st)] + load_table_text(s, tab)
        if tab["oxygen_note"]:
            from lapsecalc.layout import wrap
            out.extend(wrap((tab["oxygen_note"],), "!"))
        return out
    return emit(s, ("volume_m3", "envelope_t_c", "max_envelope_t_c", "empty_kg", "dewpoint_c",
                    "temps_c", "heights_msl_m", "gross_kg", "payload_kg", "oxygen_note"), tab)


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


def _c_show(s, w, args):
    no_args(w, args)
    st = s.state
    if s.mode == "text":
        from lapsecalc.showtext import show_text
        return show_text(s)
    # The values in force, defaults included and named in "defaults"; a setting with
    # no default and not set is empty (None).
    from lapsecalc.machine import kv_value, kv_lines, machine
    kind, hum = st.get("hum", ("td", None))
    pk, p = st.get("press", ("qnh", None))
    lapse = st.get("lapse")
    if isinstance(lapse, list):
        lapse = ";".join("%s:%s" % (kv_value(a, "_m"), kv_value(b, "_k_per_km"))
                         for a, b in lapse)
    vals = {"t_c": st.get("t_c"), "td_c": hum if kind == "td" else None,
            "rh_pct": hum if kind == "rh" else None, "elevation_m": st.get("elev_m"),
            "qnh_hpa": p if pk == "qnh" else None,
            "station_pressure_hpa": p if pk == "stn" else None, "elr_k_per_km": lapse,
            "top_msl_m": st.get("top_m"), "thermal_excess_c": st.get("excess_c"),
            "envelope_m3": st.get("env_m3"), "weight_kg": st.get("wt_kg"),
            "gas_volume_m3": st.get("fill_m3"), "max_envelope_t_c": st.get("tmax_c"),
            "envelope_t_c": st.get("tenv_c"), "margin_k": st.get("margin_k"),
            "gas": st.get("gas"), "purity": st.get("purity"),
            "superheat_k": st.get("superheat_k"), "aloft_points": None,
            "tropopause_msl_m": st.get("trop_m")}
    if "aloft" in st:
        from lapsecalc.aloftwords import point_kv
        vals["aloft_points"] = ";".join(point_kv(pt) for pt in st["aloft"])
    defaults = []
    for key, value in (("qnh_hpa", STANDARD_QNH_HPA), ("elr_k_per_km", ISA_LAPSE_K_PER_KM),
                       ("top_msl_m", DEFAULT_TOP_M), ("thermal_excess_c", 0.0),
                       ("tropopause_msl_m", None if "trop_m" in st else DEFAULT_TROP_M),
                       ("purity", 1.0 if "gas" in st else None)):
        if vals[key] is None and value is not None and not (
                key == "qnh_hpa" and pk == "stn"):
            vals[key] = value
            defaults.append(key)
    vals["defaults"] = defaults if s.mode == "json" else ",".join(defaults)
    vals["units"] = "%s,%s,%s" % (s.disp["h"], s.disp["t"], s.disp["p"])
    vals["out"] = s.mode
    keys = ("t_c", "td_c", "rh_pct", "elevation_m", "qnh_hpa", "station_pressure_hpa",
            "elr_k_per_km", "top_msl_m", "thermal_excess_c", "envelope_m3", "weight_kg",
            "gas_volume_m3", "max_envelope_t_c", "envelope_t_c", "margin_k", "gas", "purity",
            "superheat_k", "aloft_points", "tropopause_msl_m", "defaults", "units", "out")
    if s.mode == "json":
        return [s.json.dumps(machine("", vals))]
    return kv_lines(vals, keys)


def _c_altimeter(s, w, args):
    # levels and cold: their work and text in lapsecalc.altitext (loaded for the line).
    from lapsecalc.altitext import altimeter_word
    keys, vals, text = altimeter_word(s, w, args)
    if s.mode != "text":
        return emit(s, keys, vals)
    return ["assumed " + n for n in assumed(s.state)] + text


# query word -> f(session, word, args) -> output lines
QUERIES = {
    "obs": _c_group, "base": _c_group, "ice": _c_group, "frost": _c_group, "stab": _c_group,
    "parcel": _c_group, "thermal": _c_group, "da": _c_at, "at": _c_at, "iso": _c_iso,
    "balloon": _c_balloon, "loads": _c_loads, "sunset": _c_sunset, "report": _c_report,
    "chart": _c_chart, "svg": _c_svg, "show": _c_show,
    "levels": _c_altimeter, "cold": _c_altimeter,
}
