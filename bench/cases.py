"""What the bench runs: the timed calls, the interpreter scripts and the scaling columns.

Everything here is an invented scenario (made-up fields, made-up weather). Keep the
interpreter script in this one place: when the shell's words change, edit SESSION_SCRIPT.
"""
from lapsecalc import (moisture, standard, condensation, adiabats, column, parcel, hazards,
                       stability, units, icing, precip, fieldrisk)
from lapsecalc.column import Column

# Modules whose public functions should each have a timed case; run.py lists any
# public function without one as "not timed". Optional modules are skipped when they
# do not import.
COVERED_MODULES = ("moisture", "standard", "condensation", "adiabats", "column", "aloft",
                   "aloftpoints",
                   "parcel", "stability", "units", "metar", "balloon", "chart", "chartsvg")

# The benchmark column: an invented warm afternoon at an invented field (as the demo).
BENCH_T_C = 27.0
BENCH_TD_C = 13.0
BENCH_QNH_HPA = 1016.0
BENCH_ELEV_M = 411.48
BENCH_LAPSE = [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)]

# A deep-convection afternoon (invented): warm, humid, steep ELR; large CAPE, used for
# the parcel step trade-off because CAPE errors show most there.
CONVECTIVE = (32.0, 22.0, 1008.0, 150.0, [(1500.0, 9.0), (None, 7.0)])

# Scaling columns: a warm surface (30 degC, dew 18 degC, station pressure 1005 hPa at
# 100 m) and moderate rates that stay inside -90..60 degC up to 24 km.
SCALE_SURFACE = (30.0, 18.0, 1005.0, 100.0)
SCALE_LAYERS = {
    1: 6.5,
    4: [(1000.0, 9.0), (4000.0, 7.0), (11000.0, 6.5), (None, 0.0)],
    # Fifteen 1000 m layers (a steep first km, a 1 K/km slab at 4-5 km AGL,
    # otherwise 7.5 and 6 K/km by turns), then isothermal to the top.
    16: [(1000.0 * (i + 1), r) for i, r in enumerate(
        (9.0, 7.5, 6.0, 7.5, 1.0, 7.5, 6.0, 7.5, 6.0, 7.5, 6.0, 7.5, 6.0, 7.5, 6.0))]
        + [(None, 0.0)],
}
SCALE_LAYERS_TOP_M = 16000.0
# For the top scan: tropospheric ELR to 11 km, isothermal to 20 km, then a slow
# warming (the ISA's shape; 30 degC at the surface stays above -90 degC everywhere).
SCALE_TOP_LAPSE = [(1000.0, 9.0), (11000.0, 6.5), (20000.0, 0.0), (None, -1.0)]
SCALE_TOPS_M = (6000.0, 10000.0, 16000.0, 24000.0)

# A realistic interpreter session (invented hill strip "Pellinhoe Down", invented
# weather): settings change a few times and every query kind is asked.
SESSION_SCRIPT = (
    "# Pellinhoe Down (invented strip), morning check",
    "elev 2100ft",
    "temp 14C dew 9C qnh 1021",
    "base",
    "ice",
    "da",
    "elr 8@300m 6@3km 6.5",
    "stab",
    "parcel",
    "thermal",
    "excess 2C",
    "thermal",
    "# midday: warmer, drier",
    "temp 22C dew 10C",
    "base",
    "da",
    "at 6000ft",
    "at 700hPa",
    "iso -15C",
    "unit m F inHg",
    "obs",
    "base",
    "unit ft C hPa",
    "metar XPDN 121350Z 24012KT 9999 FEW045 24/11 Q1018",
    "base",
    "ice",
    "report",
    "out kv",
    "report",
    "out text",
    "show",
    "help elr",
    "top 30000ft",
    "parcel",
    "clear elr",
    "ice",
    "rh 45%",
    "base",
    "da 9500ft",
    "chart",
)


# Nine points aloft over the bench field (invented forecast-aloft and model-level
# temperatures, five with dewpoints, two by pressure), for the 0.5 ms report() target.
BENCH_ALOFT = [(914.4, 22.0, 11.0), (1828.8, 16.0, 8.0), (2743.2, 10.0, 2.0),
               (850.0, 17.0, 9.0, "hPa"), (3657.6, 3.0, None), (700.0, 7.0, -2.0, "hPa"),
               (5486.4, -9.0, None), (7315.2, -22.0, None), (9144.0, -36.0, None)]


def bench_column():
    return Column.from_qnh(BENCH_T_C, BENCH_TD_C, BENCH_QNH_HPA, BENCH_ELEV_M, BENCH_LAPSE)


def aloft_column():
    """The bench column with the nine points aloft (BENCH_ALOFT)."""
    return Column.from_qnh(BENCH_T_C, BENCH_TD_C, BENCH_QNH_HPA, BENCH_ELEV_M, BENCH_LAPSE,
                           aloft=BENCH_ALOFT)


def scale_column(n_layers=None, top_m=None):
    """A scaling column: n_layers ELR layers to 16 km, or the ISA-shaped ELR to top_m."""
    t, td, p, elev = SCALE_SURFACE
    if n_layers is not None:
        return Column(t, td, p, elev, SCALE_LAYERS[n_layers], SCALE_LAYERS_TOP_M)
    return Column(t, td, p, elev, SCALE_TOP_LAPSE, top_m)


def call_cases():
    """[(label, function, args, kwargs)]: every public call of the library with typical
    arguments (the bench column's surface). Labels name module.function; Column methods
    are Column.name."""
    col = bench_column()
    lcl_agl = col.cloud_base()[0]
    lcl = col.elev_m + lcl_agl
    levels = parcel.path(col, lcl)
    t, td, p = col.t_c, col.td_c, col.p_hpa
    z = col.elev_m + 2500.0
    aloft = aloft_column()
    cases = [
        ("moisture.saturation_vapour_pressure", moisture.saturation_vapour_pressure, (t,), {}),
        ("moisture.saturation_vapour_pressure(ice)", moisture.saturation_vapour_pressure,
         (-12.0,), {"ice": True}),
        ("moisture.dewpoint", moisture.dewpoint, (t, 42.0), {}),
        ("moisture.relative_humidity", moisture.relative_humidity, (t, td), {}),
        ("moisture.mixing_ratio", moisture.mixing_ratio, (td, p), {}),
        ("moisture.wet_bulb", moisture.wet_bulb, (t, td, p), {}),
        ("moisture.virtual_temperature_k", moisture.virtual_temperature_k,
         (t + 273.15, 15.0, p), {}),
        ("standard.ratio_ln", standard.ratio_ln, (0.05,), {}),
        ("standard.ratio_exp", standard.ratio_exp, (0.05,), {}),
        ("standard.layer_pressure", standard.layer_pressure, (p, 300.0, -0.0065, 1500.0), {}),
        ("standard.layer_height", standard.layer_height, (p, 300.0, -0.0065, 800.0), {}),
        ("standard.isa", standard.isa, (9000.0,), {}),
        ("standard.isa(25 km)", standard.isa, (25000.0,), {}),
        ("standard.pressure_altitude", standard.pressure_altitude, (p,), {}),
        ("standard.station_pressure", standard.station_pressure, (1016.0, 411.48), {}),
        ("standard.qnh", standard.qnh, (p, 411.48), {}),
        ("standard.air_density", standard.air_density, (p, t, td), {}),
        ("standard.isa_height_of_density", standard.isa_height_of_density, (1.1,), {}),
        ("standard.density_altitude", standard.density_altitude, (p, t, td), {}),
        ("condensation.lambert_w_minus1", condensation.lambert_w_minus1, (-0.2,), {}),
        ("condensation.cloud_base(exact)", condensation.cloud_base, (t, td, p),
         {"method": "exact"}),
        ("condensation.cloud_base(bolton)", condensation.cloud_base, (t, td, p),
         {"method": "bolton"}),
        ("condensation.cloud_base(spread)", condensation.cloud_base, (t, td, p),
         {"method": "spread"}),
        ("adiabats.moist_lapse_rate", adiabats.moist_lapse_rate, (10.0, 800.0), {}),
        ("adiabats.moist_lapse_k_per_km", adiabats.moist_lapse_k_per_km, (283.15, 800.0), {}),
        ("adiabats.moist_step", adiabats.moist_step, (283.15, 800.0, 760.0), {}),
        ("adiabats.saturated_ascent(1000->200)", adiabats.saturated_ascent,
         (20.0, 1000.0, 200.0), {}),
        ("adiabats.dry_ascent", adiabats.dry_ascent, (t, p, 800.0), {}),
        ("Column(): 1 layer", Column, (t, td, p, col.elev_m, 6.5), {}),
        ("Column(): 3 layers", Column, (t, td, p, col.elev_m, BENCH_LAPSE), {}),
        ("Column.from_qnh", Column.from_qnh,
         (BENCH_T_C, BENCH_TD_C, BENCH_QNH_HPA, BENCH_ELEV_M, BENCH_LAPSE), {}),
        ("Column.t_at", col.t_at, (z,), {}),
        ("Column.p_at", col.p_at, (z,), {}),
        ("Column.z_at", col.z_at, (700.0,), {}),
        ("Column.vapour_pressure_at", col.vapour_pressure_at, (z,), {}),
        ("Column.density_at", col.density_at, (z,), {}),
        ("Column.density_altitude_at", col.density_altitude_at, (z,), {}),
        ("Column.crossings", col.crossings, (0.0,), {}),
        ("Column.level", col.level, (-10.0,), {}),
        ("Column.cloud_base", col.cloud_base, (), {}),
        ("Column.report", col.report, (), {}),
        ("Column.report(excess 2C)", col.report, (2.0,), {}),
        ("Column(): 9 points aloft", aloft_column, (), {}),
        ("Column.report(9 points aloft)", aloft.report, (), {}),
        ("Column.dewpoint_at", aloft.dewpoint_at, (z,), {}),
        ("stability.add_warnings", stability.add_warnings, (col, dict(col.report())), {}),
        ("column.warm_layer_aloft", column.warm_layer_aloft, (col,), {}),
        ("parcel.path", parcel.path, (col, lcl), {}),
        ("parcel.temperature_at", parcel.temperature_at,
         (col, levels, len(levels) // 2, 0.5 * (levels[len(levels) // 2 - 1][0]
                                               + levels[len(levels) // 2][0]), lcl), {}),
        ("parcel.level", parcel.level, (col, levels, 0.0, lcl), {}),
        ("stability.classify", stability.classify, (6.5, 5.0), {}),
        ("stability.layers", stability.layers, (col,), {}),
        ("stability.lapse_measures", stability.lapse_measures, (col,), {}),
        ("stability.parcel_analysis", stability.parcel_analysis, (col, levels, lcl), {}),
        ("stability.lifted_index", stability.lifted_index, (col, levels, lcl, 500.0), {}),
        ("stability.thermal_top", stability.thermal_top, (col, 2.0), {}),
        ("stability.ccl", stability.ccl, (col, levels), {}),
        ("stability.add_to_report", stability.add_to_report,
         (col, levels, dict(col.report())), {}),
        ("icing.icing_band", icing.icing_band,
         (col, levels, lcl, 7300.0, parcel.level(col, levels, 0.0, lcl)), {}),
        ("precip.warm_layer", precip.warm_layer, (col,), {}),
        ("precip.precip_type", precip.precip_type, (col,), {}),
        ("precip.wet_bulb_zero", precip.wet_bulb_zero, (col,), {}),
        ("fieldrisk.carb_icing", fieldrisk.carb_icing, (BENCH_T_C, BENCH_TD_C), {}),
        ("hazards.add_to_report", hazards.add_to_report, (col, levels, dict(col.report())), {}),
        ("fieldrisk.frost_point", fieldrisk.frost_point, (-12.0,), {}),
    ]
    # Unit conversions: every one, each on a typical number.
    for name in sorted(dir(units)):
        f = getattr(units, name)
        if name[:1] != "_" and callable(f) and getattr(f, "__module__", None) == "lapsecalc.units":
            cases.append(("units." + name, f, (12.5,), {}))
    cases.extend(_optional_cases(col, levels))
    return cases


def _optional_cases(col, levels):
    # Modules still being written by colleagues: time them when they import.
    out = []
    try:
        from lapsecalc import aloft, aloftpoints
        acol = aloft_column()
        out += [
            ("aloftpoints.resolve", aloftpoints.resolve,
             (BENCH_ALOFT, col.elev_m, col.t_c + 273.15, col.p_hpa, col.top_m), {}),
            ("aloft.cloud_layers", aloft.cloud_layers, (acol,), {}),
            ("aloft.vapour_pressure", aloft.vapour_pressure, (acol, col.elev_m + 2500.0), {}),
            ("aloft.steep_warnings", aloft.steep_warnings, (acol,), {}),
        ]
    except ImportError:
        pass
    try:
        from lapsecalc import metar
        out.append(("metar.parse", metar.parse,
                    ("XPDN 121350Z 24012KT 9999 FEW045 24/11 Q1018 RMK T02390106",), {}))
    except ImportError:
        pass
    try:
        from lapsecalc import balloon, hotair, hotreport, gasballoon
        rho = col.density_at(col.elev_m)
        out += [
            ("gasballoon.molar_mass", gasballoon.molar_mass, ("helium",), {}),
            ("hotair.hot_air_lift_per_m3", hotair.hot_air_lift_per_m3,
             (rho, col.p_hpa, 100.0, 10.0), {}),
            ("hotair.envelope_t_for_lift", hotair.envelope_t_for_lift,
             (rho, col.t_c, 0.25), {}),
            ("gasballoon.gas_density", gasballoon.gas_density, (col.p_hpa, col.t_c, "helium"), {}),
            ("gasballoon.gas_lift_per_m3", gasballoon.gas_lift_per_m3,
             (rho, col.p_hpa, col.t_c, "helium"), {}),
            ("gasballoon.gas_volume_at", gasballoon.gas_volume_at,
             (100.0, col.p_hpa, col.t_c, 700.0, 5.0), {}),
            ("balloon.first_drop", balloon.first_drop,
             (col, lambda z: 3000.0 - (z - col.elev_m), col.elev_m), {}),
            ("hotreport.hot_air_report", hotreport.hot_air_report,
             (col, 2500.0, 350.0, 120.0), {}),
            ("gasballoon.gas_report", gasballoon.gas_report,
             (col, "helium", 1.0, 100.0, 300.0, 40.0), {}),
        ]
    except ImportError:
        pass
    try:
        from lapsecalc import chart, chartsvg
        rep = col.report()
        out += [
            ("chart.top_of", chart.top_of, (col, rep), {}),
            ("chart.parcel_t", chart.parcel_t, (levels, col.elev_m + 3000.0), {}),
            ("chart.text", chart.text, (col, rep, levels), {}),
            ("chart.frame", chart.frame, (col, levels, col.elev_m, col.elev_m + 3000.0, "c", 32),
             {}),
            ("chart.icing_span", chart.icing_span, (rep,), {}),
            ("chartsvg.svg", chartsvg.svg, (col, rep, levels), {}),
        ]
    except ImportError:
        pass
    return out
