"""What thermals can be used: the heated thermals' cloud base, the usable top (the
lower of the dry-thermal top and that cloud base), cloud decks capped under an
inversion, and the temperature dry thermals need."""
# Sources: definitions (Wallace & Hobbs, Atmospheric Science, 2nd ed., ch. 3 and 9):
#   the LCL of a heated surface parcel (condensation.cloud_base), the dry-thermal top
#   and the convective (trigger) temperature (lapsecalc.stability).
# An extra on a board, loaded by lapsecalc.hazards for one report and dropped after it.


def capped_top(col, base_msl_m, pa):
    """Top, m MSL, of a cloud deck capped low: the cloud base lies in the ELR layer
    right under an inversion (air warming with height, or isothermal), or in the
    inversion itself, and the surface parcel (parcel_analysis dict pa) does not rise
    through that inversion (no LFC, or its EL inside or under it); the deck then fills
    the moist mixed layer up to the inversion's base. None otherwise."""
    n = len(col.layers)
    for i in range(n):
        z0, z1, _, grad, _ = col.layers[i]
        if z1 < base_msl_m:
            continue
        if grad >= 0.0:
            cap, cap_top = base_msl_m, z1
        elif i + 1 < n and col.layers[i + 1][3] >= 0.0:
            cap, cap_top = z1, col.layers[i + 1][1]
        else:
            return None
        if pa["lfc_msl_m"] is None or (not pa["el_above_top"] and pa["el_msl_m"] <= cap_top):
            return cap
        return None
    return None


def add_keys(col, levels, r):
    """Add thermal_cloud_base_msl_m, thermal_usable_top_msl_m, capped_cloud_top_msl_m
    and dry_thermals_from_t_c to report r and refine thermal_kind (none, blue,
    cumulus, capped), from the keys stability.add_to_report set; levels is not used.
    thermal_cloud_base_msl_m may hold on entry the heated surface parcel's cloud base,
    m MSL (Column.report puts it there: a board has let go of the condensation code)."""
    th_lcl = r.get("thermal_cloud_base_msl_m")
    if th_lcl is None:
        excess = r["thermal_excess_c"]
        if excess == 0.0:
            th_lcl = col.elev_m + r["cloud_base_agl_m"]
        else:
            from lapsecalc.condensation import cloud_base
            th_lcl = col.elev_m + cloud_base(min(col.t_c + excess, 60.0), col.td_c,
                                             col.p_hpa)[0]
    if th_lcl > col.top_m:
        th_lcl = None
    top = r["thermal_top_msl_m"]
    cap = None
    still = top is not None and top - col.elev_m < 1.0      # no thermal rises
    reach = top
    if still:
        # Unless the lowest layer is dry-neutral: a mixed layer, stirred to its top.
        # (The report's stability, the lowest band's class by stability.classify, whose
        # dry-neutral test comes first; read from the report: a board has let go of the
        # stability code.)
        mixed = r["stability"] == "dry_neutral"
        reach = col.layers[0][1] if mixed else col.elev_m
    if th_lcl is not None and (reach is None or reach > th_lcl):
        cap = capped_top(col, th_lcl, r)
        kind = "capped" if cap is not None else "none" if still else "cumulus"
    else:
        kind = "none" if still else "blue"
    r["thermal_cloud_base_msl_m"] = th_lcl
    r["thermal_usable_top_msl_m"] = None if kind == "none" else (
        th_lcl if kind in ("cumulus", "capped") else top)
    r["thermal_kind"] = kind
    r["capped_cloud_top_msl_m"] = cap
    r["dry_thermals_from_t_c"] = r["trigger_t_c"] if kind == "none" else None
