"""The interpreter's at, da H and iso words: the air at one height, the level of one
temperature (runs on MicroPython; loaded only by their lines)."""
# Sources: every number comes from the Column, lapsecalc.parcel and lapsecalc.altimetry;
#   this module only picks them.
# lapsecalc.typed (iso's temperature), lapsecalc.heights and lapsecalc.limits are
# imported inside the words: a module-level name would keep their code alive through
# the text.
from lapsecalc.queries import emit


def at(s, w, args):
    if w == "da" and not args:  # the field's density altitude: a group of the report
        from lapsecalc.reportwords import group_word
        return group_word(s, w, args)
    if not args:
        raise ValueError("at needs a height, e.g. at 8000ft, at 2000ft agl, at 700hPa")
    col = s.column(w)
    from lapsecalc.heights import height
    z = height(s, w, args, col)
    height = None  # no name of it kept: release() lets go of its code
    s.read_done()
    p = col.p_at(z)
    t_parcel = _parcel_t(s, col, z)
    from lapsecalc.altimetry import altimeter_view, COLD_WARNING_K
    ind, pa, dev = altimeter_view(col, z, p)
    vals = {"at_msl_m": z, "at_t_c": col.t_at(z), "at_p_hpa": p,
            "at_vapour_pressure_hpa": col.vapour_pressure_at(z),
            "at_air_density_kg_m3": col.density_at(z),
            "at_density_altitude_m": col.density_altitude_at(z),
            "at_parcel_t_c": t_parcel, "at_indicated_m": ind, "at_pressure_altitude_m": pa,
            "at_isa_deviation_c": dev}
    col = altimeter_view = None  # let go of before the text is laid out
    out = emit(s, "at", vals)
    if s.mode == "text" and dev <= -COLD_WARNING_K and ind > z:
        from lapsecalc.altitext import cold_warning_lines
        out.extend(cold_warning_lines(s, [("at_msl_m", z, dev, ind - z)]))
    return out


def _parcel_t(s, col, z):
    # The parcel temperature at z recomputed between the path's levels, as the report's
    # parcel levels are (parcel.temperature_at); the chart's linear interpolation is
    # for drawing only and is up to a few tenths of a K off on the moist adiabat. The
    # path from the report's cloud base (cloud_base_agl_m, found before the parcel code
    # loads) is this function's own: on a board it and the parcel code are let go of
    # before the altimeter code loads.
    lcl = col.elev_m + col.cloud_base()[0]
    from lapsecalc.parcel import path, temperature_at
    levels = path(col, lcl)
    t = levels[-1][2]
    for i in range(1, len(levels)):
        if z <= levels[i][0]:
            t = temperature_at(col, levels, i, z, lcl)
            break
    levels = path = temperature_at = None
    if s.drop_word_modules:
        from lapsecalc import _forget
        _forget(("parcel", "adiabats"))
        s.collect()
    return t


def iso(s, w, args):
    if len(args) != 1:
        raise ValueError("iso needs one temperature, e.g. iso -15C")
    col = s.column(w)
    from lapsecalc.typed import value
    from lapsecalc.limits import T_MIN_C, T_MAX_C
    t = value(args[0], "t", s.disp["t"], T_MIN_C, T_MAX_C, w)
    value = None
    s.read_done()
    vals = {"iso_t_c": t, "iso_level_msl_m": col.level(t), "iso_levels_msl_m": col.crossings(t)}
    col = None  # let go of before the text is laid out
    return emit(s, "iso", vals)


# word -> f(session, word, args) -> output lines (each named after its word: a board
# interns the word anyway)
WORDS = {"at": at, "da": at, "iso": iso}
