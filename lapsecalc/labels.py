"""The result keys' text labels and kinds: one string of ";key:label:kind;" entries
and how an entry is found in it (runs on MicroPython; small: a line that needs a
label, such as the levels word's, loads this and not the text layout)."""
# Sources: none; labels and kinds only.
# A new result key: its label and kind here (LABELS), its layout in lapsecalc.layout,
# its place in lapsecalc.groups.
# Report key -> label and kind for text mode, one "key:label:kind;" entry each in one
# string (find() reads it: a board holds one string, not a tuple and strings per key).
# Kinds: z a level, shown true MSL or, after "heights ind", indicated on QNH (IND)
# (ztop: the icing band's top, "unknown" when a band has none); zt always true MSL; a
# height AGL; i indicated on QNH; pa pressure altitude (with its flight level); alt
# another altitude (density); zl list of levels, t temperature, dt temperature
# difference, p pressure, ph pressure always in hPa (aloft, vapour), rho density, pct,
# gkg, jkg, b yes/no, s word, until the dry-thermal trigger sentence. A third field q
# (lapsecalc.hazardtext): no line at all when the value is None.
LABELS = (";elevation_m:elevation:zt;"
          "top_msl_m:column top:z;"
          "t_c:temp:t;"
          "td_c:dewpoint:t;"
          "rh_pct:RH:pct;"
          "mixing_ratio_g_kg:mix ratio:gkg;"
          "wet_bulb_c:wet bulb:t;"
          "station_pressure_hpa:station p:p;"
          "qnh_hpa:QNH:p;"
          "pressure_altitude_m:press alt:pa;"
          "air_density_kg_m3:density:rho;"
          "isa_deviation_c:ISA dev:dt;"
          # Dry: what flight-manual charts use; humid: the air as it is (higher).
          "density_altitude_dry_m:DA dry:alt;"
          "density_altitude_m:DA humid:alt;"
          "cloud_base_agl_m:base:a;"
          "cloud_base_msl_m:base:z;"
          "lcl_t_c:LCL temp:t;"
          "lcl_p_hpa:LCL press:ph;"
          "freezing_level_msl_m:0C level:z;"
          "freezing_levels_msl_m:0C passes:zl;"
          "minus10_level_msl_m:-10C level:z;"
          "minus10_levels_msl_m:-10C passes:zl;"
          "minus20_level_msl_m:-20C level:z;"
          "minus20_levels_msl_m:-20C passes:zl;"
          "warm_layer_aloft:warm aloft:b;"
          "parcel_freezing_level_msl_m:parcel 0C:z;"
          "stability:lowest layer:s;"
          "lapse_0_3km_k_per_km:ELR 0-3km:lkm;"
          "lapse_0_3km_class::hide;"
          "lapse_700_500_k_per_km:ELR 700-500:lkm;"
          "lapse_700_500_class::hide;"
          "tropopause_msl_m:tropopause:z;"
          "cloud_layers_msl_m:cloud layer:zz;"
          "levels_above_top::hide;"
          "lfc_msl_m:LFC:z;"
          "el_msl_m:EL:z;"
          "el_above_top:EL above top:b;"
          "cape_j_kg:CAPE:jkg;"
          "cin_j_kg:CIN:jkg;"
          "lifted_index_c:lifted index:dt;"
          "thermal_excess_c:excess:dt;"
          "thermal_top_msl_m:thermal top:z;"
          "thermal_kind:thermals:s;"
          "ccl_msl_m:CCL:z;"
          "trigger_t_c:trigger temp:t;"
          "at_msl_m:true alt:zt;"
          "at_indicated_m:indicated:i;"
          "at_pressure_altitude_m:press alt:pa;"
          "at_isa_deviation_c:ISA dev:dt;"
          "at_t_c:temp:t;"
          "at_p_hpa:pressure:p;"
          "at_vapour_pressure_hpa:vapour p:ph;"
          "at_air_density_kg_m3:density:rho;"
          "at_density_altitude_m:DA humid:alt;"
          "at_parcel_t_c:parcel temp:t;"
          "iso_t_c:isotherm:t;"
          "iso_level_msl_m:lowest <=T:z;"
          "iso_levels_msl_m:passes:zl;"
          "warnings::say!;"
          "notes::say-;")


def find(table, key):
    """The index of the fields after key in a table of ";key:field:field;" entries
    (LABELS, WORDS, lapsecalc.hazardtext's), or -1 when key has no entry. Allocates
    nothing (a board counts every allocation of a line)."""
    n = len(key)
    i = 0
    while n:
        i = table.find(key, i + 1)
        if i < 0:
            return -1
        if table.startswith(";", i - 1) and table.startswith(":", i + n):
            return i + n + 1
    return -1


def field(table, i):
    """The field of table that starts at index i (up to the next ":" or ";")."""
    j = table.find(";", i)
    k = table.find(":", i, j)
    return table[i:j if k < 0 else k]


def find_label(table, key):
    """(label, kind) of key in table (LABELS or lapsecalc.hazardtext.LABELS), or None;
    (label, kind, True) when the key shows no line at all while its value is None
    (the third field q)."""
    i = find(table, key)
    if i < 0:
        return None
    label = field(table, i)
    i += len(label) + 1
    kind = field(table, i)
    if table.startswith(":q", i + len(kind)):
        return label, kind, True
    return label, kind
