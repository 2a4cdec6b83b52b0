"""Text labels of the balloon words (balloon, sunset), loaded only by those words (runs
on MicroPython)."""
# Sources: none; labels and units only. Every line fits a 40-column screen: a
#   13-column label, then the value (lapsecalc.layout.text_lines lays it out).

# ";key:label:kind;" entries, as lapsecalc.layout.LABELS (read by layout.find_label:
# one string, where a dict of tuples cost a board about 7 KiB of heap), for the keys
# of lapsecalc.balloon's reports.
LABELS = (";"
          "z_msl_m:height:z;"
          "ambient_t_c:air temp:t;"
          "ambient_p_hpa:air press:p;"
          "ambient_density_kg_m3:air density:rho;"
          "volume_m3:envelope:m3;"
          "envelope_m3:envelope:m3;"
          "weight_kg:weight:kg;"
          "envelope_t_c:working temp:t;"
          "envelope_t_set:set by you:b;"
          "margin_k:below max:dt;"
          "lift_per_m3_kg:lift per m3:rho;"
          "gross_lift_kg:gross lift:kg;"
          "free_lift_kg:free lift:kg;"
          "payload_kg:field payload:kg;"
          "envelope_t_needed_c:temp to float:t;"
          "envelope_t_needed_over_working:over working:b;"
          "ceiling_msl_m:ceiling:z;"
          "ceiling_p_hpa:ceiling p:p;"
          "ceiling_above_top:ceil abv top:b;"
          "gross_lift_per_1000ft_kg:lift/1000ft:kg;"
          "envelope_t_needed_per_1000ft_c:temp/1000ft:dt;"
          # the absolute limit: figures at the maker's maximum, labelled LIMIT
          "max_envelope_t_c:LIMIT temp:t;"
          "limit_gross_lift_kg:LIMIT gross:kg;"
          "limit_payload_kg:LIMIT payload:kg;"
          "envelope_t_needed_over_limit:over max:b;"
          "limit_ceiling_msl_m:LIMIT ceiling:z;"
          "limit_ceiling_p_hpa:LIMIT ceil p:p;"
          "limit_ceiling_above_top:LIMIT abv top:b;"
          "oxygen_note::say1;"
          "gas:gas:s;"
          "gas_molar_mass_g_mol:molar mass:gmol;"
          "purity:purity:frac;"
          "gas_volume_m3:fill:m3;"
          "gas_density_kg_m3:gas density:rho;"
          "gas_volume_at_z_m3:gas volume:m3;"
          "full_at_z:full here:b;"
          "full_msl_m:press height:z;"
          "full_p_hpa:press ht p:p;"
          "full_above_top:full abv top:b;"
          "float_msl_m:float at:z;"
          "float_above_top:float abv top:b;"
          "ballast_to_hold_kg:ballast drop:kg;"
          "superheat_k:superheat:dt;"
          "gas_t_c:gas temp:t;"
          "superheat_lift_kg:sun lift:kg;"
          "ballast_superheat_lost_kg:ballast @dusk:kg;")

# Headings put before a key in text mode (the hot-air report's two parts).
HEADINGS = {
    "envelope_t_c": "-- working temp (mean envelope air)",
    "max_envelope_t_c": "-- absolute limit: never plan on it",
}
