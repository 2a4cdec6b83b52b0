"""The show word: the settings in force, defaults marked, one a line in text mode,
as keys in kv and json (runs on MicroPython; loaded only by the show line)."""
# Sources: ICAO standard atmosphere for the defaults said (lapsecalc.state).
from lapsecalc import units
from lapsecalc.output import f_h, f_t, f_dt, f_p
from lapsecalc.aliases import no_args
from lapsecalc.state import dewpoint_of, STANDARD_QNH_HPA, ISA_LAPSE_K_PER_KM, DEFAULT_TOP_M
from lapsecalc.state import DEFAULT_TROP_M


def show_text(s):
    """The settings of session s, one a line, defaults marked."""
    st = s.state
    out = []

    def put(label, text):
        out.append("%-13s%s" % (label, text))

    unset = "   not set"
    put("temp", f_t(s, st["t_c"]) if "t_c" in st else unset)
    kind, hum = st.get("hum", ("td", None))
    if kind == "rh":
        dew = " (dew %s)" % f_t(s, dewpoint_of(st), True) if "t_c" in st else ""
        put("rh", "%7.1f %%%s" % (hum, dew))
    else:
        put("dew", f_t(s, hum) if hum is not None else unset)
    put("elev", f_h(s, st["elev_m"], False, " MSL") if "elev_m" in st else unset)
    pk, p = st.get("press", ("qnh", None))
    if p is None:
        put("qnh", "%7.2f hPa ISA, assumed" % STANDARD_QNH_HPA)
    else:
        put("qnh" if pk == "qnh" else "stn", f_p(s, p))
    lapse = st.get("lapse")
    if lapse is None:
        put("elr", "%7.1f K/km ISA, assumed" % ISA_LAPSE_K_PER_KM)
    elif isinstance(lapse, list):
        for i, (top, rate) in enumerate(lapse):
            put("elr" if i == 0 else "", "%7.1f K/km %s" % (
                rate, "to top" if top is None else "to %d %s AGL" % (
                    round(units.m_to_ft(top) if s.disp["h"] == "ft" else top), s.disp["h"])))
    else:
        put("elr", "%7.1f K/km (%.2f C/1000ft)" % (lapse, units.k_per_km_to_c_per_1000ft(lapse)))
    top = st.get("top_m")
    put("top" if top is not None else "top (default)",
        f_h(s, DEFAULT_TOP_M if top is None else top, False, " MSL"))
    put("excess", f_dt(s, st.get("excess_c", 0.0)))
    if "aloft" in st or "trop_m" in st:
        from lapsecalc.aloftwords import point_text
        for i, pt in enumerate(st.get("aloft", ())):
            put("aloft" if i == 0 else "", point_text(s, pt))
        trop = st.get("trop_m", DEFAULT_TROP_M)
        put("trop" if "trop_m" in st else "trop (default)",
            "   none" if trop is None else f_h(s, trop))
    for key, label, kind in (("env_m3", "env", "m3"), ("wt_kg", "wt", "kg"),
                             ("fill_m3", "fill", "m3"), ("tmax_c", "tmax", "t"),
                             ("tenv_c", "tenv", "t"), ("margin_k", "margin", "dt"),
                             ("gas", "gas", "s"), ("purity", "pure", "frac"),
                             ("superheat_k", "superheat", "dt")):
        if key in st:
            from lapsecalc.layout import text_lines
            out.extend(text_lines(s, key, st[key], (label, kind)))
    put("units", "%s %s %s, out %s" % (s.disp["h"], s.disp["t"].upper(),
                                       "hPa" if s.disp["p"] == "hpa" else "inHg", s.mode))
    return out


def show(s, w, args):
    no_args(w, args)
    st = s.state
    if s.mode == "text":
        return show_text(s)
    # The values in force, defaults included and named in "defaults"; a setting with
    # no default and not set is empty (None).
    from lapsecalc.machine import kv_value, kv_lines
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
        from lapsecalc.jsontext import line
        return [line(keys, vals)]
    return kv_lines(vals, keys)


# show -> its function (named after the word: a board interns the word anyway)
WORDS = {"show": show}
