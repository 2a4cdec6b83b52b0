"""The cautions of a report with the hazard keys (lapsecalc.hazards): a sentence per
hazard present, before the general ones."""
# Sources: none; the sentences are our wording (the hazard modules name the sources of
#   what they say).
# An extra on a board, loaded by lapsecalc.hazards after the hazard modules, for one
# report: its sentences are not held while they compute.


def _h(z_m):
    # A height for a caution sentence: metres and feet.
    return "%d m (%d ft)" % (round(z_m), round(z_m / 0.3048))


# The serious carburettor icing bands (lapsecalc.fieldrisk.CARB_SERIOUS) in words.
_CARB_WORDS = {"any_power": "serious at any power",
               "cruise_and_glide": "serious at descent power, moderate at cruise power",
               "glide": "serious at descent power"}


def sentences(r):
    """The caution sentences of the hazards present in report r, one each. Heights MSL
    in metres and feet, temperatures in degC."""
    out = []
    b = r.get("icing_band_bottom_msl_m")
    if b is not None:
        t = r["icing_band_top_msl_m"]
        out.append("Icing likely in cloud from %s MSL %s." % (
            _h(b), "to %s" % _h(t) if t is not None else
            "up (no dewpoints given above)" if r["icing_band_basis"] == "layers" else
            "up (cloud tops unknown)"))
    if r.get("warm_layer_bottom_msl_m") is not None:
        # The precipitation type (lapsecalc.precip) in words.
        precip = {"glaze": "freezing rain", "pellets": "ice pellets",
                  "glaze_or_pellets": "freezing rain or ice pellets", "snow": "snow",
                  "rain_or_snow": "rain or snow", "rain": "rain"}[r["precip_type"]]
        out.append("Warm layer (max %+.1f degC) %s to %s MSL over freezing air %d m deep:"
                   " freezing rain or ice pellets possible, here %s." % (
                       r["warm_layer_max_t_c"], _h(r["warm_layer_bottom_msl_m"]),
                       _h(r["warm_layer_top_msl_m"]), round(r["cold_layer_below_depth_m"]),
                       precip))
    if r.get("fog_risk"):
        out.append("Spread %.1f K at the field: fog or low stratus likely." % (
            r["t_c"] - r["td_c"]))
    if r.get("ice_fog_risk"):
        out.append("Air saturated over ice (%.0f %%): ice fog, ice crystals or frost; a"
                   " cloud base from the dewpoint means little." % r["rh_ice_pct"])
    if r.get("carb_icing") in _CARB_WORDS:
        out.append("Carburettor icing %s: carb heat as the flight manual says." %
                   _CARB_WORDS[r["carb_icing"]])
    return out


def add_keys(col, levels, r):
    """Put the sentences of the hazards present (sentences()) before the general
    cautions that Column.report() put in r["cautions"] (stability.CAUTIONS); col and
    levels are not used."""
    r["cautions"] = sentences(r) + list(r["cautions"])
