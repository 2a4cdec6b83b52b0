"""The altimeter words' text (levels, cold, heights; their numbers are
lapsecalc.altiwords'), the report's altimeter section and the cold-air warning;
loaded only by the lines that show them."""
# Sources: none; labels and units only (the numbers come from lapsecalc.indicated and
#   lapsecalc.altimetry). Every line fits a 40-column screen.
from lapsecalc import units
from lapsecalc.output import f_dt, ack

# The text layout (lapsecalc.layout) is imported by the functions that use its labels:
# the cold word in kv mode needs none of it.


def _h_number(s, z_m):
    # A height as a whole number in the display unit.
    return round(units.m_to_ft(z_m) if s.disp["h"] == "ft" else z_m)


def _label(k):
    # A key's text label: lapsecalc.labels', or the hazard keys' (lapsecalc.hazardtext);
    # the text layout's code is not loaded for it.
    from lapsecalc.labels import LABELS, find_label
    lk = find_label(LABELS, k)
    if lk is None:
        try:
            from lapsecalc.hazardtext import LABELS as HAZARD_LABELS
            lk = find_label(HAZARD_LABELS, k)
        except ImportError:  # a board without the hazard modules
            pass
    return (lk or (k,))[0]


def levels_text(s, keys, vals, warnings):
    """The levels word: each level true MSL, indicated on QNH and its flight level in
    the display unit, lowest first; then the cold-air warnings."""
    out = ["%-13s%7s %7s %6s" % ("level, " + s.disp["h"], "MSL", "IND", "FL")]
    for k in keys:
        z, ind, fl = vals[k]
        out.append("%-13s%7d %7d %6s" % (_label(k)[:12], _h_number(s, z),
                                          _h_number(s, ind), "FL%d" % round(fl)))
    return out + cold_warning_lines(s, warnings)


def altimeter_text(s, w, keys, vals, warnings):
    """The levels or cold word's (w) output from its numbers (lapsecalc.altiwords):
    (keys, values, text lines); in kv and json mode no text (None) and, for levels,
    the warning sentences as the value "warnings"."""
    if w == "cold":
        return keys, vals, cold_text(s, vals) if s.mode == "text" else None
    if s.mode != "text":
        vals["warnings"] = cold_warning_text(s, warnings)
        return keys + ["warnings"], vals, None
    return keys, vals, levels_text(s, keys, vals, warnings)


# Names in the warnings for keys whose label reads oddly there.
_WHERE = {"at_msl_m": "this height", "cloud_base_msl_m": "cloud base"}


def cold_warning_text(s, warnings):
    """The warning sentences for altimetry.cold_warnings entries: at the lowest level
    that is 10 K or more colder than ISA and at the one with the largest error."""
    if not warnings:
        return []
    picks = [warnings[0]]
    worst = warnings[0]
    for w in warnings:
        if w[3] > worst[3]:
            worst = w
    if worst is not warnings[0]:
        picks.append(worst)
    u = s.disp["h"]
    return ["true altitude is below indicated by %d %s at %s, %d %s MSL (%.0f K colder than"
            " ISA)" % (_h_number(s, diff), u, _WHERE.get(k) or _label(k),
                       _h_number(s, z), u, -dev) for k, z, dev, diff in picks]


def cold_warning_lines(s, warnings):
    """The warning sentences as text lines, marked "!", at most 40 columns."""
    from lapsecalc.output import wrap_each
    return wrap_each(cold_warning_text(s, warnings), "!")


def altimeter_lines(s, rep):
    """The report's altimeter section: the cold-temperature correction when the field
    is colder than ISA, and the cold-air warnings; [] when there is nothing to say."""
    col = s.column()
    out = []
    # The height above the field the cold-temperature line is for, by unit.
    h = 1000.0 * units.M_PER_FT if s.disp["h"] == "ft" else 300.0
    if rep.get("isa_deviation_c", 0.0) < 0.0:
        from lapsecalc.altimetry import (cold_temperature_correction, column_cold_correction,
                                         indicated_altitude_at)
        # Only when the height fits under the column top, true and as indicated (the
        # column's correction reads the altimeter there), computed as column_cold_correction
        # checks it (elevation + h may round past the top); the field is under 9 km, so
        # the height is always inside the ISA troposphere the PANS-OPS formula needs.
        if h <= min(col.top_m, indicated_altitude_at(col, col.top_m)) - col.elev_m:
            # Labels padded to 13 columns, as the report's others.
            out.append("cold corr    %+7d %s at %d %s AGL" % (
                _h_number(s, cold_temperature_correction(h, col.t_c, col.elev_m)),
                s.disp["h"], _h_number(s, h), s.disp["h"]))
            out.append("  column     %+7d %s (its own ELR)" % (
                _h_number(s, column_cold_correction(col, h)), s.disp["h"]))
    if "indicated_altitude_m" in rep:
        from lapsecalc.altimetry import cold_warnings
        out.extend(cold_warning_lines(s, cold_warnings(col, rep)))
    return out


def cold_text(s, vals):
    """The cold word: the correction to add to indicated heights above the field, by
    the PANS-OPS formula and by the column itself."""
    u = s.disp["h"]
    dev = vals["isa_deviation_c"]
    out = ["cold-temperature correction",
           "%-13s%s" % ("field ISA dev", f_dt(s, dev))]
    if dev >= 0.0:
        return out + ["not colder than ISA: no correction", "(PANS-OPS corrects cold air)"]
    out.append("%-13s%8s %8s" % ("above field", "PANS-OPS", "column"))
    for h, a, b in zip(vals["cold_height_agl_m"], vals["cold_correction_icao_m"],
                       vals["cold_correction_column_m"]):
        out.append("%7d %s AGL %+6d %s %+6d %s" % (_h_number(s, h), u, _h_number(s, a), u,
                                                  _h_number(s, b), u))
    return out + ["add to indicated (QNH) heights"]


def heights_word(s, w, args):
    """The heights word: levels shown true (msl) or indicated on QNH (ind)."""
    # heights WORD -> how levels are shown: true (geopotential) MSL or indicated on QNH.
    word = args[0].lower() if len(args) == 1 else ""
    mode = "msl" if word in ("msl", "true") else "ind" if word in ("ind", "qnh") else None
    if mode is None:
        raise ValueError("heights needs msl (true heights) or ind (indicated on QNH)")
    disp = dict(s.disp)
    disp["z"] = mode
    s.disp = disp
    return ack(s, "heights " + ("MSL (true)" if mode == "msl" else "IND (on QNH)"), ["heights"])
