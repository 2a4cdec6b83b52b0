"""The load table of a hot-air balloon: the greatest gross weight (and payload) over
the field temperature and the height, in one air column shifted warmer or colder; and
its 40-column text for the interpreter's loads word."""
# Sources: the lift per m3 is lapsecalc.hotair's (Archimedes' principle with the ideal
#   gas law, moist air through the virtual temperature); each field temperature gets
#   its own Column (lapsecalc.column: hydrostatic per linear layer, humidity aloft the
#   surface mixing ratio capped at saturation), so the table follows the same lapse
#   rate and the same humidity rule as every other figure.
# Assumption: through the day the field temperature changes, the dewpoint stays (the
#   air mass's moisture changes slowly; common practice), capped at the temperature;
#   the field pressure and the ELR stay as observed and assumed.
# The column and balloon code are imported by the functions that compute, the display
# units by the text: on a board the loads word lets go of the physics (Session.release)
# before it lays out the table, and a Column per field temperature is built, used for
# its cells and let go of before the next.
from math import floor
from lapsecalc.limits import check, const

# The load table: row spacing and depth, m; at most _TABLE_MAX rows or columns (a
# 40-column screen shows six field temperatures, load_table's default -10..40 degC).
_TABLE_STEP_M = const(500.0)
_TABLE_DEPTH_M = const(3000.0)
_TABLE_MAX = const(40)


def _field_column(col, t):
    # The column col with the field temperature t degC (-60..60, checked by load_table):
    # the same field pressure, elevation, ELR layers and top, the same dewpoint (capped
    # at t), so the same humidity rule aloft. The load table's columns; a Column, or
    # None when this ELR leaves no column above the field at t.
    from lapsecalc.column import Column
    spec = [(z1 - col.elev_m, -1000.0 * grad) for _, z1, _, grad, _ in col.layers]
    try:
        return Column(t, col.td_c if col.td_c < t else t, col.p_hpa, col.elev_m, spec, col.top_m)
    except ValueError:
        return None


def _heights(col, heights_msl_m, step_m, depth_m):
    if heights_msl_m is not None:
        from lapsecalc.balloon import _z
        hs = [_z(col, z) for z in heights_msl_m]
        if not hs or len(hs) > _TABLE_MAX:
            raise ValueError("heights_msl_m has %d heights; allowed 1..%d" % (len(hs), _TABLE_MAX))
        return hs
    step = check("step_m", step_m, 50.0, 5000.0, "m")
    end = col.elev_m + check("depth_m", depth_m, 1.0, 40000.0, "m")
    if end > col.top_m:
        end = col.top_m
    hs = [col.elev_m]
    # The first multiple of the step above the field (floor: also below sea level);
    # one a metre or less above the field would repeat the field row.
    z = (floor(col.elev_m / step) + 1) * step
    while z <= end and len(hs) < _TABLE_MAX:
        if z - col.elev_m > 1.0:
            hs.append(z)
        z += step
    return hs


def load_table(col, volume_m3, envelope_t_c, max_envelope_t_c=None, empty_kg=None,
               temps_c=(-10.0, 0.0, 10.0, 20.0, 30.0, 40.0), heights_msl_m=None,
               step_m=_TABLE_STEP_M,
               depth_m=None):
    """The greatest gross weight, kg, a hot-air balloon of volume_m3 (10..20000) lifts
    at the working envelope temperature envelope_t_c (-90..150 degC; not above
    max_envelope_t_c when that is given) over field temperatures and heights.

    For each field temperature in temps_c (1..40 values, -60..60 degC) the column is
    _field_column(col, t): the same pressure at the field, ELR and dewpoint rule, the
    air shifted warmer or colder. Heights: heights_msl_m (1..40, inside col), or the
    field and every multiple of step_m MSL above it (one 1 m or less above the field
    left out) up to depth_m above the field (the column top at most; default 3000 m,
    or the column top with empty_kg); with empty_kg (1..20000, the balloon with fuel
    and crew but no payload) the rows end where no field temperature lifts the empty
    weight any more.

    Returns temps_c, heights_msl_m, gross_kg (one row per height, one value per
    temperature; None where the column at that temperature ends below the height),
    payload_kg (gross less empty_kg, same shape; None without empty_kg), volume_m3,
    envelope_t_c, max_envelope_t_c, empty_kg, dewpoint_c, oxygen_note.
    """
    from lapsecalc.balloon import oxygen_note, WEIGHT_MAX_KG
    from lapsecalc.hotair import (_hot_lift, working_envelope_t, HOT_VOLUME_MIN_M3,
                                  HOT_VOLUME_MAX_M3, HOT_WEIGHT_MIN_KG, ENVELOPE_T_MAX_C)
    v = check("volume_m3", volume_m3, HOT_VOLUME_MIN_M3, HOT_VOLUME_MAX_M3, "m3")
    if max_envelope_t_c is None:
        t_env = check("envelope_t_c", envelope_t_c, -90.0, ENVELOPE_T_MAX_C, "degC")
    else:
        t_env = working_envelope_t(max_envelope_t_c, envelope_t_c)
    empty = None
    if empty_kg is not None:
        empty = check("empty_kg", empty_kg, HOT_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    temps = list(temps_c)
    if not temps or len(temps) > _TABLE_MAX:
        raise ValueError("temps_c has %d temperatures; allowed 1..%d" % (len(temps), _TABLE_MAX))
    temps = [check("t_c", t, -60.0, 60.0, "degC (field temperature)") for t in temps]
    if depth_m is None:
        depth_m = _TABLE_DEPTH_M if empty is None else col.top_m - col.elev_m
    hs = _heights(col, heights_msl_m, step_m, depth_m)
    # Rows made at their length (on a board a list grown item by item leaves holes
    # between the columns' pieces).
    n = len(temps)
    gross = [[None] * n for z in hs]
    for j in range(n):
        # One field temperature's column at a time (a board holds one, not six).
        c = _field_column(col, temps[j])
        for i in range(len(hs)):
            if c is not None and hs[i] <= c.top_m:
                gross[i][j] = v * _hot_lift(c, hs[i], t_env)
        c = None
    payload = None
    if empty is not None:
        if heights_msl_m is None:
            while len(gross) > 1 and all(g is None or g < empty for g in gross[-1]):
                gross.pop()
                hs.pop()
        payload = [[None if g is None else g - empty for g in row] for row in gross]
    return {
        "temps_c": temps,
        "heights_msl_m": hs,
        "gross_kg": gross,
        "payload_kg": payload,
        "volume_m3": v,
        "envelope_t_c": t_env,
        "max_envelope_t_c": max_envelope_t_c,
        "empty_kg": empty,
        "dewpoint_c": col.td_c,
        "oxygen_note": oxygen_note(col, (("table's top row", hs[-1]),)),
    }


def load_table_text(s, tab):
    """The load table (load_table) for session s in at most 40 columns: heights
    MSL down, field temperatures across, kg in each cell; "-" cannot lift (payload
    or gross below zero), "." the column ends below that height. The oxygen note,
    when there is one, is the caller's to wrap."""
    from lapsecalc import units
    from lapsecalc.output import f_t
    ft, fahr = s.disp["h"] == "ft", s.disp["t"] == "f"
    head = "ft MSL" if ft else " m MSL"
    for t in tab["temps_c"]:
        head += "%5s" % ("%d%s" % (round(units.c_to_f(t) if fahr else t), "F" if fahr else "C"))
    out = ["load table %.0f m3, %s working" % (tab["volume_m3"],
                                               f_t(s, tab["envelope_t_c"], True))]
    grids = [("greatest gross weight, kg", tab["gross_kg"])]
    if tab["payload_kg"] is not None:
        grids.append(("payload kg (empty %.0f kg)" % tab["empty_kg"], tab["payload_kg"]))
    for title, grid in grids:
        out.append(title)
        out.append(head)
        for z, row in zip(tab["heights_msl_m"], grid):
            cells = ["%6d" % round(units.m_to_ft(z) if ft else z)]
            for g in row:
                if g is None:
                    cells.append("    .")
                elif g < 0.0:
                    cells.append("    -")
                else:
                    cells.append("%5.0f" % g if g < 9999.5 else "%4.0fk" % (g / 1000.0))
            out.append("".join(cells))  # joined once: each "+" costs a string on a board
    out.append("field temp across; dew %s kept" % f_t(s, tab["dewpoint_c"], True))
    out.append("- cannot lift it  . above column")
    return out
