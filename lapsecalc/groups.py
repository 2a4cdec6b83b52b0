"""The result keys each query word shows, in order, and the report's order (runs on
MicroPython)."""
# Sources: none; the keys are those of Column.report() and the at/iso results of
#   lapsecalc.queries (the balloon reports' keys: lapsecalc.balloontext). A list, not a dict, keeps the order
#   on a board (its dicts have none).

# query word (or result kind) -> its result keys, in the order shown, in one string
# (keys() splits it: a board holds one string per group, not a string per key).
_GROUPS = {
    "obs": ("elevation_m t_c td_c rh_pct mixing_ratio_g_kg wet_bulb_c "
            "station_pressure_hpa qnh_hpa pressure_altitude_m isa_deviation_c "
            "air_density_kg_m3 density_altitude_dry_m density_altitude_m top_msl_m"),
    "base": "cloud_base_agl_m cloud_base_msl_m lcl_t_c lcl_p_hpa cloud_layers_msl_m",
    "ice": ("freezing_level_msl_m freezing_levels_msl_m minus10_level_msl_m "
            "minus10_levels_msl_m minus20_level_msl_m minus20_levels_msl_m "
            "warm_layer_aloft parcel_freezing_level_msl_m icing_band_bottom_msl_m "
            "icing_band_top_msl_m icing_band_basis icing_layers_msl_m "
            "warm_layer_bottom_msl_m warm_layer_top_msl_m warm_layer_max_t_c "
            "cold_layer_below_depth_m precip_type wet_bulb_zero_msl_m"),
    "frost": "t_c td_c frost_point_c rh_ice_pct fog_risk ice_fog_risk carb_icing",
    "da": ("elevation_m station_pressure_hpa qnh_hpa pressure_altitude_m "
           "isa_deviation_c air_density_kg_m3 density_altitude_dry_m "
           "density_altitude_m"),
    "stab": ("stability lapse_0_3km_k_per_km lapse_0_3km_class lapse_700_500_k_per_km "
             "lapse_700_500_class tropopause_msl_m stability_layers"),
    "parcel": ("lfc_msl_m el_msl_m el_above_top cape_j_kg cin_j_kg lifted_index_c "
               "parcel_freezing_level_msl_m"),
    "thermal": ("thermal_excess_c thermal_top_msl_m thermal_cloud_base_msl_m "
                "thermal_usable_top_msl_m thermal_kind capped_cloud_top_msl_m "
                "dry_thermals_from_t_c ccl_msl_m trigger_t_c"),
    "at": ("at_msl_m at_indicated_m at_pressure_altitude_m at_isa_deviation_c at_t_c "
           "at_p_hpa at_vapour_pressure_hpa at_air_density_kg_m3 "
           "at_density_altitude_m at_parcel_t_c"),
    "iso": "iso_t_c iso_level_msl_m iso_levels_msl_m",
}

# The groups of the full report, in order (the text report's sections follow them).
REPORT_GROUPS = ("obs", "base", "ice", "frost", "stab", "parcel", "thermal")


def keys(word):
    """The result keys of query word (or result kind), in the order shown (a new list)."""
    return _GROUPS[word].split()


def has(word, key):
    """Whether key is one of query word's keys (allocates nothing)."""
    g = _GROUPS[word]
    n = len(key)
    i = g.find(key)
    while i >= 0 and n:
        if (i == 0 or g.startswith(" ", i - 1)) and (i + n == len(g) or g.startswith(" ", i + n)):
            return True
        i = g.find(key, i + 1)
    return False


def report_keys(rep):
    """Report keys in display order: the groups' order, then any others sorted."""
    seen = []
    for word in REPORT_GROUPS:
        for k in keys(word):
            if k in rep and k not in seen:
                seen.append(k)
    seen.extend(sorted(k for k in rep if k not in seen and k != "cautions"))
    if "cautions" in rep:
        seen.append("cautions")
    return seen
