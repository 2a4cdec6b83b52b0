"""The show word's text: the settings in force, one a line, defaults marked (runs on
MicroPython; loaded only by the show line in text mode)."""
# Sources: ICAO standard atmosphere for the defaults said (lapsecalc.state).
from lapsecalc import units
from lapsecalc.output import f_h, f_t, f_dt, f_p
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
