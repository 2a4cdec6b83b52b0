"""Hazards as pilots meet them, for Column.report(): the keys of the hazard modules
(thermals, icing, precip, fieldrisk) and a caution sentence per hazard present
(lapsecalc.cautions)."""
# Sources: the hazard modules name theirs.
# This module is an extra on a board (lapsecalc/package-full.json): Column.report()
# imports it when it is there and leaves its keys out when it is not. It loads the
# hazard modules one at a time; on a board it drops each after its keys are in and
# collects the heap, so one report holds only one of them at a time. The hazards that
# read the parcel path do not load the stability code (Column.report() lets go of it
# before them; precip, which reads stability's root finder, runs before the path).

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
    the thermal keys, the parcel's 0 degC level and the cloud layers). The cautions:
    a sentence per hazard present (lapsecalc.cautions, loaded last like a hazard
    module, so that its sentences are not held while they compute), then the general
    ones Column.report() put in r["cautions"] (stability.CAUTIONS): r must hold them,
    and this runs once per report (a second run would say each hazard twice)."""
    if r.get("cautions") is None:
        raise ValueError("the hazards' cautions go before the general ones: put"
                         " stability.CAUTIONS in r['cautions'] first")
    add_parts(col, levels, r, parts)
    add_parts(col, levels, r, ("cautions",))  # last: its sentences read every hazard key
