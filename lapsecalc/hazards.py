"""Hazards as pilots meet them, for Column.report(): the keys of the hazard modules
(thermals, icing, precip, fieldrisk) and a caution sentence per hazard present."""
# Sources: the hazard modules name theirs; the sentences here are our wording.
# This module is an extra on a board (lapsecalc/package-full.json): Column.report()
# imports it when it is there and leaves its keys out when it is not. It loads the
# hazard modules one at a time; on a board it drops each after its keys are in and
# collects the heap, so one report holds only one of them at a time.
from lapsecalc.stability import CAUTIONS

# The hazard modules: those that read only the column and its freezing level (which
# Column.report() adds before it computes the parcel path), and those that read the
# parcel path and the stability keys; none reads another's keys.
FIELD_PARTS = ("precip", "fieldrisk")
PATH_PARTS = ("thermals", "icing")
PARTS = PATH_PARTS + FIELD_PARTS


def report_keys():
    """The keys add_to_report adds to those of column.report_keys(), in its order (a
    list made afresh, so that report() makes its dict with room for them at the start:
    see column.report_keys)."""
    return ["thermal_cloud_base_msl_m", "thermal_usable_top_msl_m", "capped_cloud_top_msl_m",
            "dry_thermals_from_t_c", "icing_layers_msl_m", "icing_band_bottom_msl_m",
            "icing_band_top_msl_m", "icing_band_basis", "warm_layer_bottom_msl_m",
            "warm_layer_top_msl_m", "warm_layer_max_t_c", "cold_layer_below_depth_m",
            "precip_type", "wet_bulb_zero_msl_m", "frost_point_c", "rh_ice_pct", "fog_risk",
            "ice_fog_risk", "carb_icing"]


def _h(z_m):
    # A height for a caution sentence: metres and feet.
    return "%d m (%d ft)" % (round(z_m), round(z_m / 0.3048))


# The serious carburettor icing bands (lapsecalc.fieldrisk.CARB_SERIOUS) in words.
_CARB_WORDS = {"any_power": "serious at any power",
               "cruise_and_glide": "serious at descent power, moderate at cruise power",
               "glide": "serious at descent power"}


def cautions(r):
    """The caution sentences for report r: one per hazard present, then the general
    ones (CAUTIONS). Heights MSL in metres and feet, temperatures in degC."""
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
    return out + list(CAUTIONS)


def add_parts(col, levels, r, parts):
    """Add the keys of the hazard modules named in parts to report dict r: each
    loaded for it and, on a board, let go of after (lapsecalc._drop)."""
    from lapsecalc import _drop
    for name in parts:
        mod = __import__("lapsecalc." + name, None, None, ("add_keys",))
        try:
            mod.add_keys(col, levels, r)
        finally:
            mod = None
            _drop(name)


def add_to_report(col, levels, r, parts=PARTS):
    """Add the hazard keys of parts (all by default), the thermals' cloud base, usable
    top and capped decks (refining thermal_kind) and the cautions to report dict r
    (after the stability keys: the hazard modules read the cloud base, the LFC, the EL,
    the thermal keys, the parcel's 0 degC level and the cloud layers)."""
    add_parts(col, levels, r, parts)
    r["cautions"] = cautions(r)
