# Self-check of lapsecalc for MicroPython and CPython alike: plain asserts (no pytest),
# then one "key=repr(value)" line per result. tests/mpy/compare.py runs it under both
# and requires every number equal to 1e-9 relative and every string equal.
#   CPython:     PYTHONPATH=. python3 tests/mpy/selfcheck.py
#   MicroPython: node tests/mpy/run.mjs tests/mpy/selfcheck.py
# The optional interpreter modules (balloon, shell, chart, metar, helptext) are checked
# when their files are present. All scenarios below are invented.
import os
import lapsecalc
from lapsecalc import (constants, limits, units, moisture, standard, condensation, adiabats,
                       column, parcel, stability)
from lapsecalc.column import Column

_PKG_DIR = lapsecalc.__file__.replace("\\", "/").rsplit("/", 1)[0]
_FILES = os.listdir(_PKG_DIR)
if "package-full.json" in _FILES:
    # CPython on the sources: hide the modules the board set does not have yet
    # (boardset.BOARD_LATER), so that both ports run the same set.
    import json
    import sys
    with open(_PKG_DIR + "/package-full.json") as _f:
        _BOARD = [t.rsplit("/", 1)[1] for t, _ in json.load(_f)["urls"]]
    for _n in list(_FILES):
        if _n.endswith(".py") and _n not in _BOARD and _n[:-3] not in ("cli", "__main__", "page"):
            sys.modules["lapsecalc." + _n[:-3]] = None
            _FILES.remove(_n)
COUNT = [0]


def has(module):
    return (module + ".py") in _FILES or (module + ".mpy") in _FILES


def put(key, v):
    # One line per plain value; dicts by sorted key (a board's dict has no order),
    # lists and tuples by index with their length.
    if isinstance(v, dict):
        for k in sorted(v):
            put(key + "." + k, v[k])
    elif isinstance(v, (list, tuple)):
        print("%s.n=%d" % (key, len(v)))
        for i in range(len(v)):
            put("%s.%d" % (key, i), v[i])
    else:
        print("%s=%r" % (key, v))
        COUNT[0] += 1


def near(a, b, tol):
    return abs(a - b) <= tol


def refused(key, fn, *args):
    # fn(*args) must raise ValueError; its message is part of the output.
    try:
        fn(*args)
    except ValueError as e:
        put("err." + key, str(e))
        return
    raise AssertionError("no ValueError from " + key)


def check_moisture():
    # Hyland-Wexler via ASHRAE (REFERENCES.md "Water vapour"): 23.388 hPa at 20 degC;
    # the Alduchov-Eskridge fit is within 0.4 %.
    es20 = moisture.saturation_vapour_pressure(20.0)
    assert near(es20, 23.388, 0.004 * 23.388)
    # 30 degC, 50 % -> dewpoint 18.45 degC (ASHRAE Hyland-Wexler, computed).
    td = moisture.dewpoint(30.0, 50.0)
    assert near(td, 18.45, 0.15)
    # 30 degC, dewpoint 20 degC, 1013.25 hPa -> wet bulb 22.94 degC (ASHRAE, computed).
    tw = moisture.wet_bulb(30.0, 20.0, 1013.25)
    assert near(tw, 22.94, 0.2)
    # Dewpoint 20 degC at 1013.25 hPa -> 14.70 g/kg (REFERENCES.md, computed).
    r = moisture.mixing_ratio(20.0, 1013.25)
    assert near(r, 14.70, 0.1)
    put("moisture.es20", es20)
    put("moisture.es_ice_m20", moisture.saturation_vapour_pressure(-20.0, True))
    put("moisture.es_m40", moisture.saturation_vapour_pressure(-40.0))
    put("moisture.td_30_50", td)
    put("moisture.td_m15_80", moisture.dewpoint(-15.0, 80.0))
    put("moisture.rh_25_10", moisture.relative_humidity(25.0, 10.0))
    put("moisture.rh_sat", moisture.relative_humidity(5.0, 5.0))
    put("moisture.r_20", r)
    put("moisture.r_m5_600", moisture.mixing_ratio(-5.0, 600.0))
    put("moisture.tw_30_20", tw)
    put("moisture.tw_2_m6_850", moisture.wet_bulb(2.0, -6.0, 850.0))
    put("moisture.tw_35_5_700", moisture.wet_bulb(35.0, 5.0, 700.0))
    put("moisture.tv", moisture.virtual_temperature_k(300.0, 20.0, 1000.0))
    refused("moisture.dewpoint_rh0", moisture.dewpoint, 20.0, 0.0)
    refused("moisture.dewpoint_t", moisture.dewpoint, 75.0, 50.0)
    refused("moisture.rh_dew_above", moisture.relative_humidity, 10.0, 12.0)
    refused("moisture.es_ice_warm", moisture.saturation_vapour_pressure, 5.0, True)


def check_standard():
    # ICAO Doc 7488/3 (REFERENCES.md table): 11000 m -> -56.50 degC, 226.32 hPa, 0.3639.
    t, p, rho = standard.isa(11000.0)
    assert near(t, -56.5, 0.01) and near(p, 226.32, 0.05) and near(rho, 0.3639, 0.0005)
    # NWS form (REFERENCES.md): 700 hPa -> 9878.4 ft; it rounds the exponent: 2 m.
    pa = standard.pressure_altitude(700.0)
    assert near(pa, 9878.4 * 0.3048, 2.0)
    # Altimeter relation (REFERENCES.md "QNH", computed): QNH 1030 at 2000 m -> 808.72.
    ps = standard.station_pressure(1030.0, 2000.0)
    assert near(ps, 808.72, 0.02)
    # REFERENCES.md "Density altitude" (computed): 850 hPa, 30 degC, dry -> 2296.9 m.
    da = standard.density_altitude(850.0, 30.0)
    assert near(da, 2296.9, 0.5)
    for h in (-500.0, 0.0, 1000.0, 5000.0, 11000.0, 15000.0, 25000.0, 32000.0):
        put("standard.isa_%d" % int(h), standard.isa(h))
    for p in (1050.0, 1013.25, 900.0, 700.0, 300.0, 100.0, 20.0):
        put("standard.pa_%d" % int(p), standard.pressure_altitude(p))
    put("standard.stn_1030_2000", ps)
    put("standard.stn_990_m300", standard.station_pressure(990.0, -300.0))
    put("standard.qnh_808_2000", standard.qnh(808.72, 2000.0))
    put("standard.rho_dry", standard.air_density(850.0, 30.0))
    put("standard.rho_moist", standard.air_density(850.0, 30.0, 20.0))
    put("standard.da_dry", da)
    put("standard.da_moist", standard.density_altitude(850.0, 30.0, 20.0))
    put("standard.da_cold", standard.density_altitude(1040.0, -30.0, -35.0))
    put("standard.h_of_rho", standard.isa_height_of_density(0.05))
    put("standard.layer_p", standard.layer_pressure(1000.0, 290.0, -0.0065, 1500.0))
    put("standard.layer_p_iso", standard.layer_pressure(1000.0, 290.0, 0.0, 1500.0))
    put("standard.layer_h", standard.layer_height(1000.0, 290.0, -0.0065, 800.0))
    put("standard.ratio_ln", (standard.ratio_ln(0.001), standard.ratio_ln(0.3)))
    put("standard.ratio_exp", (standard.ratio_exp(-0.002), standard.ratio_exp(0.7)))
    refused("standard.qnh_range", standard.qnh, 700.0, 100.0)
    refused("standard.isa_range", standard.isa, 40000.0)
    refused("standard.da_thin", standard.isa_height_of_density, 0.001)


def check_condensation():
    # Bolton (1980) eq. 15 check (REFERENCES.md, computed): 26.85 / 15.57 degC -> 13.00.
    z, t_lcl, p_lcl = condensation.cloud_base(26.85, 15.57, 1000.0, "bolton")
    assert near(t_lcl, 13.00, 0.02)
    # Spread rule: 125 m per degC (common practice).
    assert near(condensation.cloud_base(20.0, 12.0, 1000.0, "spread")[0], 1000.0, 1e-6)
    for m in ("exact", "bolton", "spread"):
        put("condensation.cb_" + m, condensation.cloud_base(26.85, 15.57, 1000.0, m))
        put("condensation.cb_cold_" + m, condensation.cloud_base(-12.0, -20.0, 820.0, m))
    put("condensation.cb_sat", condensation.cloud_base(10.0, 10.0, 950.0))
    put("condensation.w", (condensation.lambert_w_minus1(-0.3),
                           condensation.lambert_w_minus1(-0.01),
                           condensation.lambert_w_minus1(-1e-6)))
    refused("condensation.method", condensation.cloud_base, 20.0, 10.0, 1000.0, "guess")


def check_adiabats():
    # AMS Glossary pseudo-adiabat (REFERENCES.md, computed): 0 degC 850 hPa -> 6.15 K/km.
    g = adiabats.moist_lapse_rate(0.0, 850.0)
    assert near(g, 6.15, 0.05)
    put("adiabats.salr", (g, adiabats.moist_lapse_rate(26.0, 1000.0),
                          adiabats.moist_lapse_rate(-10.0, 700.0),
                          adiabats.moist_lapse_k_per_km(250.0, 400.0)))
    put("adiabats.up", adiabats.saturated_ascent(20.0, 1000.0, 300.0))
    put("adiabats.down", adiabats.saturated_ascent(-30.0, 400.0, 900.0, 0.02))
    put("adiabats.dry", adiabats.dry_ascent(25.0, 1000.0, 700.0))
    put("adiabats.step", adiabats.moist_step(290.0, 900.0, 855.0))
    refused("adiabats.dlnp", adiabats.saturated_ascent, 20.0, 1000.0, 300.0, 0.5)


def check_units():
    assert units.ft_to_m(1000.0) == 304.8   # 1 ft = 0.3048 m exactly
    assert near(units.c_to_f(100.0), 212.0, 1e-12)
    names = [n for n in dir(units) if not n.startswith("_")]
    names.sort()
    for n in names:
        f = getattr(units, n)
        if callable(f):
            put("units." + n, f(12.5))


def check_limits():
    put("limits.check", limits.check("x", "3.5", 0.0, 10.0, "m"))
    put("limits.dew", limits.check_dew(10.0, 10.03))
    refused("limits.nan", limits.check, "x", float("nan"), 0.0, 10.0, "m")
    refused("limits.text", limits.check_t, "t_c", "warm")
    refused("limits.lapse", limits.check_lapse, "lapse", 31.0)


# Invented columns: (key, t_c, td_c, p_hpa, elev_m, lapse, top_m).
def columns():
    return (
        ("plain", 22.0, 12.0, 1005.0, 150.0, 6.5, 16000.0),
        ("hot_high", 34.0, 2.0, 840.0, 1600.0, 8.8, 14000.0),
        # Cold surface under a warm layer (inversion), then a standard fall.
        ("inversion", -2.0, -4.0, 990.0, 200.0, [(300.0, -20.0), (1200.0, 4.0), (None, 6.5)],
         12000.0),
        ("moist_unstable", 29.0, 23.0, 1008.0, 40.0, [(1500.0, 9.0), (None, 7.2)], 16000.0),
        ("freezing_fog", -6.0, -6.0, 1021.0, 300.0, 3.0, 9000.0),
    )


def check_column():
    for key, t, td, p, elev, lapse, top in columns():
        col = Column(t, td, p, elev, lapse, top)
        rep = col.report(1.5 if key == "plain" else 0.0)
        # Sanity: an ordered, finite report.
        assert rep["cloud_base_agl_m"] >= 0.0
        assert rep["cape_j_kg"] >= 0.0
        assert rep["station_pressure_hpa"] == p
        if rep["freezing_level_msl_m"] is not None:
            assert elev <= rep["freezing_level_msl_m"] <= col.top_m
        put("report." + key, rep)
        zm = 0.5 * (col.elev_m + col.top_m)
        put("column.%s.at" % key, (col.t_at(zm), col.p_at(zm), col.density_at(zm),
                                   col.vapour_pressure_at(zm), col.density_altitude_at(zm)))
        put("column.%s.z_at" % key, col.z_at(0.5 * col.p_hpa))
        put("column.%s.layers" % key, col.layers)
        put("column.%s.cb_bolton" % key, col.cloud_base("bolton"))
        put("column.%s.cross_m10" % key, col.crossings(-10.0))
        put("column.%s.level_m30" % key, col.level(-30.0))
        lcl = col.elev_m + rep["cloud_base_agl_m"]
        levels = parcel.path(col, lcl)
        put("parcel.%s.n" % key, len(levels))
        put("parcel.%s.last" % key, levels[-1])
        put("parcel.%s.level_m5" % key, parcel.level(col, levels, -5.0, lcl))
        put("stability.%s.lapses" % key, stability.lapse_measures(col))
        put("stability.%s.thermal" % key, stability.thermal_top(col, 3.0))
        put("stability.%s.ccl" % key, stability.ccl(col, levels))
        put("stability.%s.li700" % key, stability.lifted_index(col, levels, lcl, 700.0))
    inv = Column(-2.0, -4.0, 990.0, 200.0, [(300.0, -20.0), (1200.0, 4.0), (None, 6.5)],
                 12000.0)
    # The inversion column is below 0 at the ground, above 0 aloft (ELR chosen so).
    assert inv.report()["warm_layer_aloft"] is True
    assert len(inv.crossings(0.0)) == 2
    q = Column.from_qnh(15.0, 5.0, 1020.0, 800.0, 6.5, 10000.0)
    put("column.from_qnh", (q.p_hpa, q.qnh_hpa, q.top_m))
    put("stability.classify", (stability.classify(11.0, 5.0), stability.classify(7.0, 5.0),
                               stability.classify(3.0, 5.0), stability.classify(5.05, 5.0)))
    refused("column.top", Column, 20.0, 10.0, 1000.0, 100.0, 6.5, 150.0)
    refused("column.layers", Column, 20.0, 10.0, 1000.0, 100.0, [(500.0, 6.5), (400.0, 6.5)])
    refused("column.warm", Column, 40.0, 10.0, 1000.0, 100.0, -30.0)


def check_hazards():
    if not has("hazards"):
        print("# hazards.py absent: skipped")
        return
    from lapsecalc import fieldrisk, precip
    # Frost point: dewpoint -10 degC -> -8.90 degC (REFERENCES.md "Frost point",
    # Hyland-Wexler via ASHRAE, computed); RH over ice 100 % there.
    fp = fieldrisk.frost_point(-10.0)
    assert near(fp, -8.90, 0.1)
    assert near(fieldrisk.relative_humidity_ice(fp, -10.0), 100.0, 1e-3)
    put("hazards.frost", (fp, fieldrisk.frost_point(-45.0), fieldrisk.frost_point(0.0)))
    put("hazards.rh_ice", (fieldrisk.relative_humidity_ice(-20.0, -20.0),
                           fieldrisk.relative_humidity_ice(-5.0, -12.0)))
    # Invented warm nose over a shallow cold layer: freezing rain (Bourgouin's rule).
    fz = Column(-3.0, -4.0, 1000.0, 100.0, [(500.0, -16.0), (None, 6.5)], 10000.0)
    assert precip.precip_type(fz) == "glaze"
    put("hazards.warm", precip.warm_layer(fz))
    put("hazards.report_fz", fz.report())
    pel = Column(-12.0, -13.0, 1000.0, 0.0, [(2500.0, -6.0), (None, 6.5)], 10000.0)
    put("hazards.pellets", precip.precip_type(pel))
    dry = Column(8.0, -6.0, 1000.0, 200.0, 6.5, 10000.0)
    put("hazards.wbz", precip.wet_bulb_zero(dry))
    for t, td in ((12.0, 10.0), (25.0, 15.0), (33.0, 20.0), (37.0, 14.0), (40.0, 30.0)):
        put("hazards.carb_%d_%d" % (t, td), fieldrisk.carb_icing(t, td))
    put("hazards.fog", (fieldrisk.fog_risk(10.0, 7.0), fieldrisk.fog_risk(10.0, 6.0)))
    capped = Column(10.0, 9.0, 1000.0, 0.0, [(600.0, 9.77), (900.0, -5.0), (None, 6.5)])
    put("hazards.capped", capped.report(1.0))
    if has("aloft"):
        # Invented dewpoints aloft: the icing band from the cloud layers.
        moist = Column(8.0, 6.0, 1000.0, 100.0, 6.5, 12000.0,
                       aloft=[(1500.0, 2.0, 1.0), (2500.0, -5.0, -6.5), (4000.0, -15.0, -30.0)])
        rep = moist.report()
        assert rep["icing_band_basis"] == "layers"
        put("hazards.report_layers", rep)
    refused("hazards.frost_warm", fieldrisk.frost_point, 2.0)


# Invented points aloft over an invented field: by height and by pressure, some with
# dewpoints (a moist layer near 700 hPa), one point above the tropopause.
ALOFT = [(914.4, 9.0, 2.0), (1828.8, 4.0, None), (850.0, 11.0, 5.0, "hPa"),
         (700.0, -1.0, -2.5, "hPa"), (5486.4, -14.0, -30.0), (500.0, -19.0, None, "hPa"),
         (12500.0, -58.0, None)]


def check_aloft():
    if not has("aloft"):
        print("# aloft.py absent: skipped")
        return
    from lapsecalc import aloft, aloftpoints
    col = Column.from_qnh(16.0, 6.0, 1012.0, 180.0, 6.5, 16000.0, ALOFT)
    rep = col.report()
    # Each pressure point lands where the column's own pressure is it (0.01 hPa).
    for z in col.aloft_m:
        assert z > 180.0
    assert near(col.p_at(col.z_at(700.0)), 700.0, 0.01)
    assert rep["tropopause_msl_m"] == 12500.0
    put("aloft.report", rep)
    put("aloft.layers", col.layers)
    put("aloft.dews", col.dews)
    put("aloft.at", [(col.t_at(z), col.p_at(z), col.dewpoint_at(z), col.density_at(z))
                     for z in (500.0, 2500.0, 3100.0, 6000.0, 14000.0)])
    put("aloft.cloud", aloft.cloud_layers(col))
    put("aloft.resolve", aloftpoints.resolve(ALOFT, 0.0, 290.0, 1013.25, 16000.0))
    # Without a tropopause, a short layered column: the warnings say where and why.
    short = Column(30.0, 10.0, 1000.0, 0.0, [(1500.0, 8.0), (3000.0, 6.0)])
    put("aloft.short", short.report()["warnings"])
    cold = Column(20.0, 10.0, 1000.0, 0.0, 9.0, 16000.0, None, None)
    put("aloft.cold", (cold.top_m, cold.report()["warnings"]))
    refused("aloft.dup", Column, 15.0, 5.0, 1000.0, 100.0, 6.5, 16000.0,
            [(1000.0, 5.0, None), (1000.0, 3.0, None)])
    refused("aloft.dew", Column, 15.0, 5.0, 1000.0, 100.0, 6.5, 16000.0, [(2000.0, 5.0, 6.0)])
    refused("aloft.below", Column, 15.0, 5.0, 1000.0, 100.0, 6.5, 16000.0,
            [(1010.0, 5.0, None, "hPa")])
    refused("aloft.nan", Column, 15.0, 5.0, 1000.0, 100.0, 6.5, 16000.0,
            [(float("nan"), 5.0, None)])
    refused("aloft.top", Column, 15.0, 5.0, 1000.0, 100.0, 6.5, 16000.0,
            [(20.0, -60.0, None, "hPa")])


def check_altimetry():
    if not has("altimetry"):
        print("# altimetry.py absent: skipped")
        return
    from lapsecalc import altimetry
    # ICAO Doc 7488/3: 701.09 hPa is 3000 m (FL98.4).
    fl = altimetry.flight_level(701.09)
    assert near(fl, 3000.0 / 30.48, 0.01)
    # REFERENCES.md "Altimetry" (PANS-OPS formula, computed): 1000 m, -20 degC -> 122.9 m.
    cc = altimetry.cold_temperature_correction(1000.0, -20.0, 0.0)
    assert near(cc, 122.9, 0.06)
    put("altimetry.fl", (fl, altimetry.flight_level(1050.0), altimetry.flight_level(50.0)))
    put("altimetry.cold", (cc, altimetry.cold_temperature_correction(500.0, -20.0, 1000.0),
                           altimetry.cold_temperature_correction(150.0, 25.0, -200.0)))
    for key, t, td, p, elev, lapse, top in columns():
        col = Column(t, td, p, elev, lapse, top)
        zm = 0.5 * (col.elev_m + col.top_m)
        ind = altimetry.indicated_altitude_at(col, zm)
        z = altimetry.true_altitude_of(col, ind)
        # An altimeter on QNH reads the elevation at the field (ICAO Annex 3).
        assert near(altimetry.indicated_altitude_at(col, elev), elev, 0.01)
        assert near(z, zm, 0.1)
        fl_mid = int(altimetry.flight_level(col.p_at(zm)))
        put("altimetry.%s" % key, (ind, z, altimetry.isa_deviation_at(col, zm),
                                   altimetry.z_at_flight_level(col, fl_mid),
                                   altimetry.column_cold_correction(col, 300.0)))
    refused("altimetry.fl", altimetry.flight_level, 2000.0)
    refused("altimetry.cold", altimetry.cold_temperature_correction, -1.0, -10.0, 0.0)


def check_station():
    if not has("station"):
        print("# station.py absent: skipped")
        return
    from lapsecalc import station
    put("station.line", station.station_line(27.0, 41.0, 967.4, 411.0))
    put("station.cold", station.station_values(-18.5, 72.0, 802.0, 1850.0))
    refused("station.rh", station.station_line, 20.0, 0.0, 1000.0, 100.0)


def check_balloon():
    if not has("balloon"):
        print("# balloon.py absent: skipped")
        return
    from lapsecalc import hotair, hotreport, gasballoon
    col = Column.from_qnh(12.0, 4.0, 1018.0, 250.0, [(400.0, 9.0), (None, 6.5)], 12000.0)
    put("balloon.hot", hotreport.hot_air_report(col, 2800.0, 450.0, 120.0))
    put("balloon.hot_z", hotreport.hot_air_report(col, 2200.0, 380.0, 110.0, 95.0, 1500.0))
    put("balloon.gas", gasballoon.gas_report(col, "helium", 0.98, 12.0, 40.0, 5.0))
    put("balloon.h2", gasballoon.gas_report(col, "hydrogen", 1.0, 3.0, 900.0, 1.2))
    put("balloon.sun", gasballoon.gas_report(col, "helium", 1.0, 600.0, 1000.0, 300.0, 900.0, 12.0))
    put("balloon.margin", hotreport.hot_air_report(col, 2800.0, 450.0, 120.0, None, None, 30.0))
    from lapsecalc import loadtable
    put("balloon.table", loadtable.load_table(col, 2800.0, 100.0, 120.0, 420.0))
    refused("balloon.over_max", hotair.working_envelope_t, 120.0, 130.0)


def session_lines():
    # A scripted session: the demo, then most words once, errors included.
    lines = []
    if has("demo"):
        from lapsecalc.demo import DEMO_LINES
        lines.extend(DEMO_LINES)
    else:
        lines.extend(("elev 1350ft", "temp 27C dew 13C qnh 1016", "elr 9.5@250m 7.5@2400m 6.5",
                      "base", "report"))
    lines.extend((
        "unit m", "obs", "ice", "stab", "parcel", "thermal", "at 2000m", "iso -10",
        "at FL85", "levels", "cold", "heights ind", "ice", "at 3000m", "heights msl",
        "temp -25C dew -28C", "cold 400m", "levels", "report", "temp 27C dew 13C",
        "excess 2C", "thermal", "show",
        "env 2800m3 wt 450kg tmax 120C", "balloon",
        "gas helium pure 98% fill 12m3 env 40m3 wt 5kg", "balloon", "gas none",
        "unit ft F inHg", "report", "out kv", "report", "out json", "obs", "report", "show", "frobnicate", "help elr", "out text",
        "temp 99C", "frobnicate", "elr", "12", "clear dew", "base", "rh 40%", "base",
        "help", "help elr", "bye",
    ))
    return lines


def check_shell():
    if not has("shell"):
        print("# shell.py absent: skipped")
        return
    from lapsecalc.shell import Session
    s = Session()
    for i, line in enumerate(session_lines()):
        out = s.feed(line)
        assert isinstance(out, list)
        for x in out:
            assert isinstance(x, str) and "\n" not in x
        put("shell.%03d" % i, [line] + out)
    assert s.done


def main():
    check_moisture()
    check_standard()
    check_condensation()
    check_adiabats()
    check_units()
    check_limits()
    check_column()
    check_hazards()
    check_aloft()
    check_altimetry()
    check_station()
    check_balloon()
    check_shell()
    put("version", lapsecalc.__version__)
    print("# selfcheck OK: %d values" % COUNT[0])


main()
