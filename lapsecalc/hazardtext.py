"""Text-mode labels and words of the hazard keys (lapsecalc.hazards), loaded by the
layout only when such a key is shown."""
# Sources: none; labels and words only (40-column lines: a 13-column label, then the
#   value). Tables as in lapsecalc.layout (one string each, read by labels.find);
#   kinds as there; ztop: the icing band's top, "unknown" when a band has no known
#   top; until: the dry-thermal trigger sentence; a third field q: no line at all when
#   the value is None (a hazard not present).

LABELS = (";icing_band_bottom_msl_m:icing from:z;"
          "icing_band_top_msl_m:icing to:ztop;"
          "icing_band_basis:icing basis:s:q;"
          "icing_layers_msl_m:icing layer:zz:q;"
          "warm_layer_bottom_msl_m:warm layer:z:q;"
          "warm_layer_top_msl_m:warm to:z:q;"
          "warm_layer_max_t_c:warm max:t:q;"
          "cold_layer_below_depth_m:cold beneath:a:q;"
          "precip_type:precip type:s;"
          "wet_bulb_zero_msl_m:wet bulb 0C:z;"
          "frost_point_c:frost point:t:q;"
          "rh_ice_pct:RH over ice:pct:q;"
          "fog_risk:fog risk:b;"
          "ice_fog_risk:ice fog risk:b;"
          "carb_icing:carb icing:s;"
          "thermal_cloud_base_msl_m:thermal base:z;"
          "thermal_usable_top_msl_m:usable top:z;"
          "capped_cloud_top_msl_m:capped at:z:q;"
          "dry_thermals_from_t_c::until;")

WORDS = (";"
         # icing band basis (lapsecalc.icing.icing_band)
         "parcel:parcel and air;"
         "air:air (cloud top unknown);"
         "layers:cloud layers;"
         # precipitation type (Bourgouin's method)
         "glaze:freezing rain;"
         "pellets:ice pellets;"
         "glaze_or_pellets:frz rain/ice pellets;"
         "rain_or_snow:rain or snow;"
         # carburettor icing bands
         "any_power:serious, any power;"
         "cruise_and_glide:serious descent/mod cruise;"
         "glide:serious at descent power;")
