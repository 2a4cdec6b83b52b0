"""The interpreter's query words (obs base ice da at iso stab parcel thermal report
chart svg balloon show) and their output in kv and json form (runs on MicroPython)."""
# Sources: every number comes from the library (Column, Column.report(), parcel,
#   balloon, chart); this module only picks, orders and formats them.
#
# A query is f(session, word, args) -> output lines; it reads the session and never
# changes it. Output modes: text (display units, laid out by lapsecalc.layout), kv and
# json (SI, report() keys). kv: None is an empty value, booleans 0/1, numbers %.6g,
# lists comma-joined, stability_layers bottom:top:elr:salr:class joined by ";", lists
# of sentences joined by " | "; lines starting "#" are notes (defaults in use).
# chart, balloon and the text layout are imported only by the words that use them.
from lapsecalc.limits import check, check_t
from lapsecalc.settings import number, shown, unit_kind

# Report keys of each query, in the order shown (dicts have no order on a board).
GROUPS = {
    "obs": ("elevation_m", "t_c", "td_c", "rh_pct", "mixing_ratio_g_kg", "wet_bulb_c",
            "station_pressure_hpa", "qnh_hpa", "pressure_altitude_m", "air_density_kg_m3",
            "density_altitude_m", "top_msl_m"),
    "base": ("cloud_base_agl_m", "cloud_base_msl_m", "lcl_t_c", "lcl_p_hpa"),
    "ice": ("freezing_level_msl_m", "freezing_levels_msl_m", "minus10_level_msl_m",
            "minus10_levels_msl_m", "minus20_level_msl_m", "minus20_levels_msl_m",
            "warm_layer_aloft", "parcel_freezing_level_msl_m", "icing_band_bottom_msl_m",
            "icing_band_top_msl_m"),
    "da": ("elevation_m", "station_pressure_hpa", "qnh_hpa", "pressure_altitude_m",
           "air_density_kg_m3", "density_altitude_m"),
    "stab": ("stability", "stability_column", "stability_layers"),
    "parcel": ("lfc_msl_m", "el_msl_m", "el_above_top", "cape_j_kg", "cin_j_kg",
               "lifted_index_c", "parcel_freezing_level_msl_m"),
    "thermal": ("thermal_excess_c", "thermal_top_msl_m", "thermal_kind", "ccl_msl_m",
                "trigger_t_c"),
    "at": ("at_msl_m", "at_t_c", "at_p_hpa", "at_vapour_pressure_hpa", "at_air_density_kg_m3",
           "at_density_altitude_m", "at_parcel_t_c"),
    "iso": ("iso_t_c", "iso_level_msl_m", "iso_levels_msl_m"),
    "hot": ("z_msl_m", "ambient_t_c", "ambient_p_hpa", "ambient_density_kg_m3", "volume_m3",
            "weight_kg", "max_envelope_t_c", "envelope_t_c", "lift_per_m3_kg",
            "gross_lift_kg", "free_lift_kg", "max_payload_kg", "envelope_t_needed_c",
            "envelope_t_needed_over_limit", "ceiling_msl_m", "ceiling_p_hpa",
            "ceiling_above_top", "gross_lift_per_1000ft_kg",
            "envelope_t_needed_per_1000ft_c", "warnings", "notes"),
    "gas": ("z_msl_m", "ambient_t_c", "ambient_p_hpa", "ambient_density_kg_m3", "gas",
            "gas_molar_mass_g_mol", "purity", "gas_volume_m3", "envelope_m3", "weight_kg",
            "gas_density_kg_m3", "lift_per_m3_kg", "gas_volume_at_z_m3", "full_at_z",
            "gross_lift_kg", "free_lift_kg", "full_msl_m", "full_p_hpa", "full_above_top",
            "float_msl_m", "float_above_top", "ballast_to_hold_kg",
            "gross_lift_per_1000ft_kg", "warnings", "notes"),
}
REPORT_GROUPS = ("obs", "base", "ice", "stab", "parcel", "thermal")


def report_keys(rep):
    """Report keys in display order: the groups' order, then any others sorted."""
    seen = []
    for word in REPORT_GROUPS:
        for k in GROUPS[word]:
            if k in rep and k not in seen:
                seen.append(k)
    rest = sorted(k for k in rep if k not in seen and k != "cautions")
    return seen + rest + (["cautions"] if "cautions" in rep else [])


def kv_value(v):
    """One value in kv form (see the module comment)."""
    if v is None:
        return ""
    if v is True or v is False:
        return "1" if v else "0"
    if isinstance(v, float):
        return "%.6g" % v
    if isinstance(v, (list, tuple)):
        if v and isinstance(v[0], dict):
            return ";".join(":".join(kv_value(r[k]) for k in (
                "bottom_msl_m", "top_msl_m", "lapse_k_per_km", "saturated_k_per_km", "class"))
                for r in v)
        if v and isinstance(v[0], str):
            return " | ".join(v)
        return ",".join(kv_value(x) for x in v)
    return str(v)


def kv_lines(values, keys):
    return ["%s=%s" % (k, kv_value(values[k])) for k in keys if k in values]


def emit(s, keys, values, balloon=False):
    """Lines of the result keys of values in session s's mode, after the notes of the
    defaults in use. A balloon report shows its keys not in keys too."""
    if balloon:
        keys = list(keys) + sorted(k for k in values if k not in keys)
    notes = s.notes(balloon)
    if s.mode == "kv":
        return ["# assumed " + n for n in notes] + kv_lines(values, keys)
    if s.mode == "json":
        obj = {}
        for k in keys:
            if k in values:
                obj[k] = values[k]
        if notes:
            obj["assumed"] = notes
        return [s.json.dumps(obj)]
    from lapsecalc.layout import text_lines
    out = ["assumed " + n for n in notes]
    for k in keys:
        out.extend(text_lines(s, k, values[k]))
    return out


# ---- the query words ----

def no_args(word, args):
    """Refuse anything after a word that takes nothing."""
    if args:
        raise ValueError("%s takes nothing after it; got '%s'" % (word, shown(args[0])))


def _c_group(s, w, args):
    no_args(w, args)
    out = emit(s, GROUPS[w], s.report(w))
    if w == "base" and s.mode == "text":
        for method, label in (("bolton", "Bolton LCL"), ("spread", "spread rule")):
            out.append("%-13s%s AGL" % (label, s.f_h(s.column().cloud_base(method)[0])))
    if w == "parcel" and s.mode == "text":
        from lapsecalc.layout import PARCEL_NOTE
        out.append(PARCEL_NOTE)
    return out


def _c_report(s, w, args):
    no_args(w, args)
    rep = s.report(w)
    if s.mode != "text":
        return emit(s, report_keys(rep), rep)
    from lapsecalc.layout import report_text
    return ["assumed " + n for n in s.notes()] + report_text(s, rep, report_keys(rep))


def _height(s, w, args, col):
    # A height m MSL from "H", "H agl", "H msl", or a pressure "P" (the height of P);
    # the field when there are no args.
    if not args:
        return col.elev_m
    if len(args) > 2:
        raise ValueError("%s takes a height, e.g. %s 8000ft, %s 2000ft agl, %s 700hPa"
                         % (w, w, w, w))
    if len(args) == 1 and unit_kind(args[0]) == "p":
        return col.z_at(number(args[0], "p", "hpa"))
    z = number(args[0], "h", s.disp["h"])
    where = args[1].lower() if len(args) > 1 else "msl"
    if where not in ("agl", "msl"):
        raise ValueError("%s: '%s' after the height; accepted agl or msl" % (w, shown(args[1])))
    if where == "agl":
        z += col.elev_m
    return check("height", z, col.elev_m, col.top_m, "m MSL (field to column top)")


def _c_at(s, w, args):
    if w == "da" and not args:
        return _c_group(s, w, args)
    if not args:
        raise ValueError("at needs a height, e.g. at 8000ft, at 2000ft agl, at 700hPa")
    col = s.column(w)
    z = _height(s, w, args, col)
    vals = {"at_msl_m": z, "at_t_c": col.t_at(z), "at_p_hpa": col.p_at(z),
            "at_vapour_pressure_hpa": col.vapour_pressure_at(z),
            "at_air_density_kg_m3": col.density_at(z),
            "at_density_altitude_m": col.density_altitude_at(z),
            "at_parcel_t_c": _parcel_t(s, col, z)}
    return emit(s, GROUPS["at"], vals)


def _parcel_t(s, col, z):
    # The parcel temperature at z recomputed between the path's levels, as the report's
    # parcel levels are (parcel.temperature_at); the chart's linear interpolation is
    # for drawing only and is up to a few tenths of a K off on the moist adiabat.
    from lapsecalc.parcel import temperature_at
    levels = s.levels()
    for i in range(1, len(levels)):
        if z <= levels[i][0]:
            lcl = col.elev_m + s.report()["cloud_base_agl_m"]
            return temperature_at(col, levels, i, z, lcl)
    return levels[-1][2]


def _c_iso(s, w, args):
    if len(args) != 1:
        raise ValueError("iso needs one temperature, e.g. iso -15C")
    col = s.column(w)
    t = check_t("iso", number(args[0], "t", s.disp["t"]))
    return emit(s, GROUPS["iso"], {"iso_t_c": t, "iso_level_msl_m": col.level(t),
                                  "iso_levels_msl_m": col.crossings(t)})


def _c_balloon(s, w, args):
    st = s.state
    gas = st.get("gas")
    need = (("env", "env_m3"), ("wt", "wt_kg"), ("fill", "fill_m3") if gas else ("tmax", "tmax_c"))
    miss = [n for n, k in need if k not in st]
    if miss:
        raise ValueError("balloon (%s) needs %s: set first, e.g. %s" % (
            "gas " + gas if gas else "hot air", ", ".join(miss),
            "gas helium env 10m3 fill 6m3 wt 4kg" if gas else "env 2800m3 wt 450kg tmax 120C"))
    col = s.column(w)
    z = _height(s, w, args, col)
    from lapsecalc import balloon
    if gas:
        r = balloon.gas_report(col, gas, st.get("purity", 1.0), st["fill_m3"], st["env_m3"],
                               st["wt_kg"], z)
    else:
        r = balloon.hot_air_report(col, st["env_m3"], st["wt_kg"], st["tmax_c"],
                                   st.get("tenv_c"), z)
    return emit(s, GROUPS["gas" if gas else "hot"], r, True)


def _c_chart(s, w, args):
    no_args(w, args)
    from lapsecalc.chart import text
    return text(s.column(w), s.report(w), s.levels(), s.disp["h"], s.disp["t"])


def _c_svg(s, w, args):
    if len(args) != 1:
        raise ValueError("svg needs one file name, e.g. svg profile.svg")
    if s.svg_writer is None:
        raise ValueError("svg writes a file: only the CPython command line does"
                         " (lapsecalc --svg FILE)")
    return [s.svg_writer(args[0], s.chart_svg())]


def _c_show(s, w, args):
    no_args(w, args)
    st = s.state
    if s.mode == "text":
        from lapsecalc.layout import show_text
        return show_text(s)
    kind, hum = st.get("hum", ("td", None))
    pk, p = st.get("press", ("qnh", None))
    lapse = st.get("lapse")
    if isinstance(lapse, list):
        lapse = ";".join("%s:%s" % (kv_value(a), kv_value(b)) for a, b in lapse)
    vals = {"t_c": st.get("t_c"), "td_c": hum if kind == "td" else None,
            "rh_pct": hum if kind == "rh" else None, "elevation_m": st.get("elev_m"),
            "qnh_hpa": p if pk == "qnh" else None,
            "station_pressure_hpa": p if pk == "stn" else None, "elr_k_per_km": lapse,
            "top_msl_m": st.get("top_m"), "thermal_excess_c": st.get("excess_c"),
            "envelope_m3": st.get("env_m3"), "weight_kg": st.get("wt_kg"),
            "gas_volume_m3": st.get("fill_m3"), "max_envelope_t_c": st.get("tmax_c"),
            "envelope_t_c": st.get("tenv_c"), "gas": st.get("gas"),
            "purity": st.get("purity"),
            "units": "%s,%s,%s" % (s.disp["h"], s.disp["t"], s.disp["p"]), "out": s.mode}
    if s.mode == "json":
        return [s.json.dumps(vals)]
    return kv_lines(vals, ("t_c", "td_c", "rh_pct", "elevation_m", "qnh_hpa",
                           "station_pressure_hpa", "elr_k_per_km", "top_msl_m",
                           "thermal_excess_c", "envelope_m3", "weight_kg", "gas_volume_m3",
                           "max_envelope_t_c", "envelope_t_c", "gas", "purity", "units", "out"))


# query word -> f(session, word, args) -> output lines
QUERIES = {
    "obs": _c_group, "base": _c_group, "ice": _c_group, "stab": _c_group,
    "parcel": _c_group, "thermal": _c_group, "da": _c_at, "at": _c_at, "iso": _c_iso,
    "balloon": _c_balloon, "report": _c_report, "chart": _c_chart, "svg": _c_svg,
    "show": _c_show,
}
