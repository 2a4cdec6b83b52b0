"""Every query word of the interpreter, in a scripted session, against values computed
outside the library: closed forms for linear layers and the ICAO standard atmosphere,
published formulas coded in refs.py, slow fine-step references. (test_shell.py checks
the layout against the library's own numbers; this file checks the numbers.)

The settings are invented scenarios. Closed forms: ICAO Doc 7488/3 (standard
atmosphere, T = 15 - 6.5 h/km degC, p = 1013.25 (T/288.15)^(g/(R L)) hPa); a layer with
lapse rate gamma: p = p0 (T/T0)^(g/(Rd gamma)); Poisson's equation T = Ts (p/ps)^(Rd/cp)
(Wallace & Hobbs, Atmospheric Science, 2nd ed., ch. 3).
"""
import math

from lapsecalc.shell import Session
from refs import (romps_lcl_m, romps_pvstar_pa, hyland_wexler_water_hpa, ae_es_hpa,
                  pseudo_adiabatic_dt_dz, fine_parcel, first_crossing, bisect)

G0, RD, CP, RV = 9.80665, 287.05287, 1004.0, 461.5   # ICAO Doc 7488/3; Wallace & Hobbs
EPS, KAPPA = RD / RV, RD / CP
DRY_RATE = 1000.0 * G0 / CP
FT = 0.3048                                            # m per ft, exact (REFERENCES.md)
ISA = "temp 15 dew 5 elev 0 qnh 1013.25 elr 6.5 top 6000m"


def kv(s, line):
    # One query in kv mode: {key: float or text}; "#" lines are notes.
    out = {}
    for text in s.feed(line):
        assert not text.startswith("error"), (line, text)
        if text.startswith("#"):
            continue
        k, v = text.split("=", 1)
        try:
            out[k] = float(v)
        except ValueError:
            out[k] = v
    return out


def session(*lines):
    s = Session()
    for line in lines + ("out kv",):
        assert not s.feed(line)[0].startswith("error"), line
    return s


def isa_p(h_m):
    return 1013.25 * ((288.15 - 0.0065 * h_m) / 288.15) ** (G0 / (RD * 0.0065))


def romps_lcl_agl(t, td, p):
    rh = romps_pvstar_pa(td + 273.15) / romps_pvstar_pa(t + 273.15)
    return romps_lcl_m(t + 273.15, rh, 100.0 * p)


class _IsaColumn:
    # The ISA-like setting as a column for refs.fine_parcel: closed forms only.
    elev_m, top_m, t_c, td_c, p_hpa = 0.0, 6000.0, 15.0, 5.0, 1013.25

    def t_at(self, z):
        return 15.0 - 6.5 * z / 1000.0

    def p_at(self, z):
        return isa_p(z)


def test_obs_and_da():
    s = session(ISA)
    for word in ("obs", "da"):
        v = kv(s, word)
        assert abs(v["station_pressure_hpa"] - 1013.25) < 0.001
        assert abs(v["pressure_altitude_m"]) < 0.01            # ISA: 1013.25 hPa is 0 m
        e = ae_es_hpa(5.0)
        rho = 100.0 * 1013.25 / (RD * 288.15 / (1.0 - e / 1013.25 * (1.0 - EPS)))
        assert abs(v["air_density_kg_m3"] - rho) < 1e-5
        # ISA height of that density: rho/rho0 = (T/T0)^(g/(R L) - 1), rho0 1.2250.
        da = 288.15 / 0.0065 * (1.0 - (rho / 1.2250) ** (1.0 / (G0 / (RD * 0.0065) - 1.0)))
        assert abs(v["density_altitude_m"] - da) < 0.5
    v = kv(s, "obs")
    hw = hyland_wexler_water_hpa
    assert abs(v["rh_pct"] / (100.0 * hw(5.0) / hw(15.0)) - 1) < 0.005
    assert abs(v["mixing_ratio_g_kg"] / (1000.0 * EPS * hw(5.0) / (1013.25 - hw(5.0))) - 1) < 0.005
    assert v["top_msl_m"] == 6000.0 and v["t_c"] == 15.0 and v["td_c"] == 5.0


def test_base():
    v = kv(session(ISA), "base")
    # Romps (2017) eq. 22a (refs.py); at the LCL the surface mixing ratio saturates
    # (AE96) on Poisson's dry adiabat (0.1 K: Romps' moist exponent).
    assert abs(v["cloud_base_agl_m"] - romps_lcl_agl(15.0, 5.0, 1013.25)) < 2.0
    e = ae_es_hpa(v["lcl_t_c"])
    r_sfc = EPS * ae_es_hpa(5.0) / (1013.25 - ae_es_hpa(5.0))
    assert abs(EPS * e / (v["lcl_p_hpa"] - e) / r_sfc - 1) < 0.005
    assert abs(v["lcl_t_c"] - (288.15 * (v["lcl_p_hpa"] / 1013.25) ** KAPPA - 273.15)) < 0.1
    # The air's pressure at the base height: within 1 hPa (the parcel, warmer than the
    # air below its base, has its own hydrostatics in Romps' formula).
    assert abs(v["lcl_p_hpa"] - isa_p(v["cloud_base_msl_m"])) < 1.0


def test_ice_and_iso():
    s = session(ISA)
    v = kv(s, "ice")
    for key, t in (("freezing", 0.0), ("minus10", -10.0), ("minus20", -20.0)):
        assert abs(v[key + "_level_msl_m"] - (15.0 - t) / 6.5 * 1000.0) < 0.01
    assert v["warm_layer_aloft"] == 0.0
    z_l = romps_lcl_agl(15.0, 5.0, 1013.25)
    prof = fine_parcel(_IsaColumn(), z_l)
    assert abs(v["parcel_freezing_level_msl_m"] - first_crossing(prof, lambda r: r[1])) < 5.0
    # No LFC: the cloud top is unknown, so the band (basis air) starts at the air's
    # 0 degC level, above the cloud base, and its top is unknown (empty value).
    assert abs(v["icing_band_bottom_msl_m"] - 15.0 / 6.5 * 1000.0) < 0.01
    assert v["icing_band_top_msl_m"] == "" and v["icing_band_basis"] == "air"
    v = kv(s, "iso -15C")
    assert abs(v["iso_level_msl_m"] - 30.0 / 6.5 * 1000.0) < 0.01


def test_at():
    s = session(ISA)
    v = kv(s, "at 700hPa")
    h = 288.15 / 0.0065 * (1.0 - (700.0 / 1013.25) ** (RD * 0.0065 / G0))
    assert abs(v["at_msl_m"] - h) < 0.01
    assert abs(v["at_t_c"] - (15.0 - 6.5 * h / 1000.0)) < 0.001
    v = kv(s, "at 9842.52ft")                              # 3000 m
    assert abs(v["at_p_hpa"] - 701.09) < 0.01              # ICAO Doc 7488/3 table
    # The parcel there: above its cloud base, the fine pseudo-adiabat.
    prof = fine_parcel(_IsaColumn(), romps_lcl_agl(15.0, 5.0, 1013.25))
    tp = [row[1] for row in prof if row[0] >= 3000.0 - 1e-6][0]
    assert abs(v["at_parcel_t_c"] - tp) < 0.05


def test_stab():
    v = kv(session(ISA), "stab")
    bands = v["stability_layers"].split(";")
    assert len(bands) == 3                                 # 6000 m in bands of 2 km
    for i, band in enumerate(bands):
        bottom, top, elr, salr, cls = band.split(":")
        zm = 1000.0 + 2000.0 * i
        te = 288.15 - 6.5 * zm / 1000.0
        want = -1000.0 * pseudo_adiabatic_dt_dz(te, isa_p(zm), te)   # AMS Glossary form
        assert abs(float(salr) - want) < 0.01 and float(elr) == 6.5
        assert cls == ("conditionally_unstable" if want < 6.4 else "absolutely_stable")
    assert v["stability"] == bands[0].split(":")[4]


def test_thermal_above_the_first_layer():
    # Dry thermal (g/cp) from a 12 K/km surface layer into 6 K/km air: it gains
    # (12 - 9.7675) K per km in the first 300 m, then loses (9.7675 - 6) per km.
    s = session("temp 30 dew 5 elev 200m stn 980 elr 12@300m 6")
    v = kv(s, "thermal")
    gain = (12.0 - DRY_RATE) * 0.3
    assert abs(v["thermal_top_msl_m"] - (500.0 + gain / (DRY_RATE - 6.0) * 1000.0)) < 0.01
    assert v["thermal_kind"] == "blue"                     # LCL near 3 km: far above
    # With 2 K of excess, the same closed form.
    s.feed("excess 2K")
    v = kv(s, "thermal")
    assert abs(v["thermal_top_msl_m"] - (500.0 + (gain + 2.0) / (DRY_RATE - 6.0) * 1000.0)) < 0.01
    assert v["thermal_excess_c"] == 2.0


def test_thermal_ccl_and_trigger():
    v = kv(session(ISA), "thermal")
    r = EPS * ae_es_hpa(5.0) / (1013.25 - ae_es_hpa(5.0))

    def gap(z):
        e = r * isa_p(z) / (EPS + r)
        return bisect(lambda x: ae_es_hpa(x) - e, -90.0, 60.0) - (15.0 - 6.5 * z / 1000.0)
    z = bisect(gap, 0.0, 6000.0)
    assert abs(v["ccl_msl_m"] - z) < 1.0
    trig = (288.15 - 6.5 * z / 1000.0) * (1013.25 / isa_p(z)) ** KAPPA - 273.15
    assert abs(v["trigger_t_c"] - trig) < 0.02
    assert v["thermal_kind"] == "none" and v["thermal_top_msl_m"] == 0.0   # stable for dry


def test_parcel_buoyant_at_cloud_base():
    # 11 K/km to 1500 m: the parcel is warmer than the air at its LCL, so the LFC is
    # the cloud base (Romps) and there is no CIN.
    v = kv(session("temp 30 dew 20 elev 0 stn 1000 elr 11@1500m 6.5"), "parcel")
    assert abs(v["lfc_msl_m"] - romps_lcl_agl(30.0, 20.0, 1000.0)) < 2.0
    assert v["cin_j_kg"] == 0.0 and v["cape_j_kg"] > 1000.0


def test_parcel_lifted_index_of_a_dry_parcel():
    # Still dry at 500 hPa: LI = Te(500) - Poisson(500) in a 9.8 K/km layer.
    v = kv(session("temp 45 dew -10 elev 300m stn 1008 elr 9.8"), "parcel")
    t500 = 318.15 * (500.0 / 1008.0) ** (RD * 0.0098 / G0)
    li = (t500 - 273.15) - (318.15 * (500.0 / 1008.0) ** KAPPA - 273.15)
    assert abs(v["lifted_index_c"] - li) < 0.01


def test_report_and_show():
    s = session(ISA, "elev 2100ft")
    v = kv(s, "show")
    assert abs(v["elevation_m"] - 2100 * FT) < 1e-9        # 1 ft = 0.3048 m exactly
    v = kv(s, "report")
    # QNH 1013.25 at 640.08 m: the ISA pressure of that height (altimeter relation).
    assert abs(v["station_pressure_hpa"] - isa_p(2100 * FT)) < 0.01
    assert abs(v["freezing_level_msl_m"] - (2100 * FT + 15.0 / 6.5 * 1000.0)) < 0.01
    assert abs(v["pressure_altitude_m"] - 2100 * FT) < 0.01


def test_balloon_hot_air():
    # Envelope air is the outside air heated at the same pressure and humidity, so
    # lift per m3 = rho (1 - T / T_env) (ideal gas); here at the ISA surface.
    v = kv(session(ISA, "env 2800m3 wt 450kg tmax 120C tenv 100C"), "balloon")
    e = ae_es_hpa(5.0)
    rho = 100.0 * 1013.25 / (RD * 288.15 / (1.0 - e / 1013.25 * (1.0 - EPS)))
    per_m3 = rho * (1.0 - 288.15 / 373.15)
    assert abs(v["lift_per_m3_kg"] - per_m3) < 1e-4
    assert abs(v["gross_lift_kg"] - 2800.0 * per_m3) < 0.3
    assert abs(v["free_lift_kg"] - (2800.0 * per_m3 - 450.0)) < 0.3
    # The envelope temperature that just lifts 450 kg: rho (1 - T/Tn) 2800 = 450.
    tn = 288.15 / (1.0 - 450.0 / (2800.0 * rho)) - 273.15
    assert abs(v["envelope_t_needed_c"] - tn) < 0.05


def test_chart_marks_the_freezing_level_row():
    # Text chart: row bands of equal height from the field; the F row holds the 0 degC
    # level, 15 / 6.5 km (ISA). The row labels give the scale (band middles, ft).
    s = session(ISA)
    s.feed("out text")
    lines = s.feed("chart")
    rows = [ln for ln in lines if "|" in ln and not ln.lstrip().startswith("+")]
    labelled = [(i, float(ln.split("|")[0])) for i, ln in enumerate(rows)
                if ln.split("|")[0].strip()]
    (i0, f0), (i1, f1) = labelled[0], labelled[-1]
    band_ft = (f0 - f1) / (i1 - i0)
    i_f = [i for i, ln in enumerate(rows) if ln.rstrip().endswith("F")][0]
    mid_ft = f1 + (i1 - i_f) * band_ft
    assert abs(mid_ft * FT - 15.0 / 6.5 * 1000.0) <= band_ft * FT / 2.0


def test_svg_labels_the_freezing_level():
    written = {}
    s = session(ISA)
    s.svg_writer = lambda name, text: written.setdefault(name, text) and "ok: " + name
    s.feed("svg p.svg")
    # 15 / 6.5 km = 2307.7 m = 7571 ft (ISA lapse rate; 1 ft = 0.3048 m).
    assert ">0 deg %d ft<" % round(15.0 / 6.5 * 1000.0 / FT) in written["p.svg"]


def _moist_rho(t_c, td_c, p_hpa):
    # Ideal gas with the virtual temperature (Wallace & Hobbs eq. 3.60), AE96 e_s.
    e = ae_es_hpa(min(td_c, t_c))
    return 100.0 * p_hpa / (RD * (t_c + 273.15) / (1.0 - e / p_hpa * (1.0 - EPS)))


def test_loads_at_the_field():
    # The load table's field row: gross lift = V rho (1 - T / T_env) at each field
    # temperature (same pressure and humidity inside; ideal gas), heights every 2000 ft.
    v = kv(session(ISA, "env 2800m3 wt 450kg tmax 120C"), "loads")
    temps = [float(x) for x in v["temps_c"].split(",")]
    heights = [float(x) for x in v["heights_msl_m"].split(",")]
    assert heights == [round(2000.0 * k * FT, 6) for k in range(len(heights))]
    field = [float(x) for x in v["gross_kg"].split(";")[0].split(",")]
    for t, g in zip(temps, field):
        want = 2800.0 * _moist_rho(t, 5.0, 1013.25) * (1.0 - (t + 273.15) / 373.15)
        assert abs(g - want) < 0.01, t


def test_sunset_superheat_lift():
    # Gas at T + dT at the same pressure: its volume grows by (T + dT)/T and its
    # density falls by the same factor, so the lift gained is v0 rho_air dT / T
    # (ideal gas), and it is the ballast to drop when the superheat goes (no gas vented
    # below the full height).
    v = kv(session(ISA, "gas helium fill 500m3 env 1000m3 wt 300kg pure 100%",
                   "superheat 10K"), "sunset")
    want = 500.0 * _moist_rho(15.0, 5.0, 1013.25) * 10.0 / 288.15
    assert abs(v["superheat_lift_kg"] - want) < 0.01
    assert abs(v["ballast_superheat_lost_kg"] - want) < 0.01
    assert abs(v["gas_volume_at_z_m3"] - 500.0 * 298.15 / 288.15) < 0.001


def test_frost():
    # -10 degC, dewpoint -12 degC: the frost point where Hyland-Wexler over ice reaches
    # Hyland-Wexler over water at the dewpoint (ASHRAE Fundamentals ch. 1; refs.py),
    # RH over ice their ratio; spread 2 K: fog risk (3 K or less, common practice).
    from refs import hyland_wexler_ice_hpa
    s = session("temp -10 dew -12 elev 0 qnh 1013.25")
    v = kv(s, "frost")
    e = hyland_wexler_water_hpa(-12.0)
    fp = bisect(lambda t: hyland_wexler_ice_hpa(t) - e, -40.0, 0.0)
    assert abs(v["frost_point_c"] - fp) < 0.1
    assert abs(v["rh_ice_pct"] - 100.0 * e / hyland_wexler_ice_hpa(-10.0)) < 0.5
    assert v["fog_risk"] == 1.0 and v["ice_fog_risk"] == 0.0


def test_levels_in_the_standard_atmosphere():
    # In ISA air (15 degC at MSL, 6.5 K/km, QNH 1013.25) an altimeter on QNH reads the
    # true height and the flight level is the height in hundreds of feet (ICAO Doc
    # 7488/3; REFERENCES.md "Altimetry"); the freezing level is 15 / 6.5 km.
    s = session(ISA)
    got = s.feed("levels")
    vals = dict(x.split("=", 1) for x in got if "=" in x and not x.startswith("warnings"))
    rows = dict((k, [float(x) for x in v.split(",")]) for k, v in vals.items())
    assert abs(rows["freezing_level_msl_m"][0] - 15.0 / 0.0065) < 0.5
    assert abs(rows["top_msl_m"][0] - 6000.0) < 1e-6
    for k, (z, ind, fl) in rows.items():
        assert abs(ind - z) < 0.5, k
        assert abs(fl - z / FT / 100.0) < 0.02, k
    assert "warnings=" in got


def test_cold_by_the_pans_ops_formula():
    # -15 degC at an MSL field on QNH 1013.25: 30 K below ISA. ICAO PANS-OPS (Doc 8168
    # Vol. I; REFERENCES.md "Altimetry", formula from memory there): correction
    # (-dT/L0) ln(1 + L0 h / (T0 + L0 h_ad)), L0 = -0.0065 K/m, h_ad = 0: 31.3 m at 300 m.
    s = session("temp -15 dew -20 elev 0 qnh 1013.25 elr 6.5 top 6000m")
    v = kv(s, "cold 300m")
    assert abs(v["isa_deviation_c"] + 30.0) < 0.01
    want = (30.0 / -0.0065) * math.log(1.0 - 0.0065 * 300.0 / 288.15)
    assert abs(v["cold_correction_icao_m"] - want) < 0.01
    # The column's own, with the ISA lapse rate as the formula assumes: within 1 %.
    assert abs(v["cold_correction_column_m"] - want) < 0.01 * want


# Query words with a session above checked against an outside value (issue: at least
# one per word). A new query word fails the test below until it has one here.
CHECKED_WORDS = {"obs", "da", "base", "ice", "frost", "iso", "at", "stab", "thermal", "parcel",
                 "report",
                 "show", "balloon", "chart", "svg", "loads", "sunset", "levels", "cold"}


def test_every_query_word_has_an_outside_check():
    from lapsecalc.queries import QUERIES
    missing = sorted(set(QUERIES) - CHECKED_WORDS)
    assert not missing, ("query words with no session checked against an outside value in"
                         " tests/test_shell_values.py: %s" % missing)


def test_chart_top_at_least_30_m_above_the_field():
    # A zoomed chart's top at least 30 m (100 ft) above the field: 30 m is drawn (its
    # top row labelled with it), 29.9 m is refused, and the field elevation counts
    # (elev 500 m: 530 m MSL is the lowest top).
    s = session("temp 15 dew 5 elev 500m qnh 1013.25 elr 6.5 top 6000m", "unit m C hPa")
    s.feed("out text")
    lines = s.feed("chart 30m agl")
    assert lines[1].startswith("  530|"), lines[:2]
    assert s.feed("chart 530m")[1].startswith("  530|")
    for line in ("chart 29.9m agl", "chart 529.9m"):
        out = s.feed(line)
        assert " ".join(out) == ("error: chart: the top must be at least   100 ft (30 m)"
                                 " above the field (500 m)"), out


def test_at_heights_within_a_millimetre_of_the_column_ends():
    # A height typed within 1 mm past the field or the top (6000 m) is that end (a
    # float's rounding); 2 mm past is refused; just inside stays where it is.
    s = session(ISA, "unit m C hPa")
    for line, want in (("at -0.0005m", 0.0), ("at 0.0005m", 0.0),
                       ("at 6000.0005m", 6000.0), ("at 5999.9995m", 6000.0)):
        assert abs(kv(s, line)["at_msl_m"] - want) < 0.01, line  # kv: to the cm
    assert s.feed("at -0.002m") == ["error=at: -0.002 m is below the field (0 m)"]
    assert s.feed("at 6000.002m") == ["error=at: 6000.002 m is above the column top (6000 m)"]
    assert s.feed("at 1000m agl x")[0].startswith("error=at takes a height, e.g. at 8000ft")
    # The station pressure typed is the field itself.
    s = session("temp 15 dew 5 elev 0 stn 1013.25hPa elr 6.5 top 6000m")
    assert kv(s, "at 1013.25hPa")["at_msl_m"] == 0.0
