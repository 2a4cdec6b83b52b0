"""Altimetry: indicated altitude on QNH, flight levels, ISA deviation, cold-temperature
correction, and the report keys they add. Outside checks name their source."""
import math

import pytest
from hypothesis import given, strategies as st

from lapsecalc import Column, isa
from lapsecalc import altimetry as alt

M_PER_FT = 0.3048  # exact by definition (REFERENCES.md "Units")
G0, RD = 9.80665, 287.05287  # ICAO Doc 7488/3
ONE_M = 1.0
TENTH_M = 0.1

# ISA columns (ICAO Doc 7488/3 layers: 6.5 K/km to 11 km, isothermal to 20 km, then
# warming 1 K/km), from a field at elevation elev_m with the ISA temperature and pressure.
ISA_LAYERS = [(11000.0, 6.5), (20000.0, 0.0), (None, -1.0)]


def isa_column(elev_m, dev_k=0.0, lapse=None, top_m=32000.0):
    t, p, _ = isa(elev_m)
    if lapse is None:
        lapse = [(11000.0 - elev_m, 6.5), (20000.0 - elev_m, 0.0), (None, -1.0)]
    return Column(t + dev_k, t + dev_k - 5.0, p, elev_m, lapse, top_m)


def isa_troposphere_pa_m(p_hpa):
    # ICAO Doc 7488/3 troposphere, solved for height: H = T0/L (1 - (p/p0)^(R L / g0)).
    return 288.15 / 0.0065 * (1.0 - (p_hpa / 1013.25) ** (RD * 0.0065 / G0))


def hydrostatic_p(col, z_to, dz=1.0):
    # Independent: dp/dz = -g p / (R T), T from t_at, midpoint steps of about 1 m.
    n = max(1, int(math.ceil((z_to - col.elev_m) / dz)))
    h = (z_to - col.elev_m) / n
    z, p = col.elev_m, col.p_hpa
    for _ in range(n):
        p *= math.exp(-G0 * h / (RD * (col.t_at(z + 0.5 * h) + 273.15)))
        z += h
    return p


def icao_formula_m(h, t_ad, h_ad):
    # ICAO PANS-OPS (Doc 8168 Vol. I) cold-temperature correction, as written in
    # REFERENCES.md "Altimetry" (from memory there), typed here in its literal form.
    l0, t0 = -0.0065, 288.15
    dt = t_ad - (15.0 + l0 * h_ad)
    return (-dt / l0) * math.log(1.0 + l0 * h / (t0 + l0 * h_ad))


# --- ISA: indicated equals true, flight level equals pressure altitude ---------------

@pytest.mark.parametrize("elev", [0.0, 450.0, 1500.0, 3200.0])
def test_isa_column_indicated_equals_true(elev):
    # In the ICAO standard atmosphere (Doc 7488/3) with QNH 1013.25 hPa an altimeter
    # reads the true height everywhere.
    col = isa_column(elev)
    assert abs(col.qnh_hpa - 1013.25) < 0.01
    z = elev
    while z <= col.top_m:
        assert abs(alt.indicated_altitude_at(col, z) - z) < ONE_M, z
        assert abs(alt.true_altitude_of(col, z) - z) < ONE_M, z
        z += 250.0


def test_flight_level_is_pressure_altitude_in_hundreds_of_feet():
    # ICAO Doc 7488/3: pressure altitude is the ISA height of the pressure; FL = PA / 100 ft.
    for h in (0.0, 1000.0, 3000.0, 5000.0, 11000.0, 20000.0, 32000.0):
        p = isa(h)[1]
        assert abs(alt.flight_level(p) - h / 30.48) < 0.01, h
    # REFERENCES.md ISA table: 701.09 hPa is 3000 m (FL98.4); the NWS form gives
    # 700 hPa -> 9878.4 ft (its rounded exponent: within 2 m, i.e. 0.07 FL).
    assert abs(alt.flight_level(701.09) - 3000.0 / 30.48) < 0.01
    assert abs(alt.flight_level(700.0) - 98.784) < 0.07
    assert abs(alt.flight_level(1013.25)) < 1e-9


def test_z_at_flight_level():
    # ISA (Doc 7488/3): FL100 is 3048 m; FL180 5486.4 m; FL350 10668 m.
    col = isa_column(0.0)
    for fl in (0.0, 85.0, 100.0, 180.0, 350.0, 450.0):
        assert abs(alt.z_at_flight_level(col, fl) - fl * 30.48) < ONE_M, fl
    # In cold air a flight level lies lower than in ISA; it is always the level whose
    # pressure altitude is fl hundred feet.
    cold = isa_column(0.0, -25.0, 6.5, 15000.0)
    for fl in (50.0, 180.0, 390.0):
        z = alt.z_at_flight_level(cold, fl)
        assert z < fl * 30.48 - 100.0
        assert abs(alt.flight_level(cold.p_at(z)) - fl) < 1e-6


def test_z_at_flight_level_outside_the_column():
    col = Column.from_qnh(5.0, 0.0, 1000.0, 600.0, 6.5, 9000.0)
    with pytest.raises(ValueError, match="fl=10 .*outside the column; allowed FL"):
        alt.z_at_flight_level(col, 10.0)   # below the field
    with pytest.raises(ValueError, match="fl=400 "):
        alt.z_at_flight_level(col, 400.0)  # above the top
    with pytest.raises(ValueError, match=r"fl=-5(\.0)? .*0\.\.1000"):
        alt.z_at_flight_level(col, -5.0)
    with pytest.raises(ValueError, match="fl='high'"):
        alt.z_at_flight_level(col, "high")


# --- indicated altitude in a non-standard column --------------------------------------

LAYERED = [(300.0, -8.0), (1200.0, 0.0), (4000.0, 7.0), (None, 5.5)]


@pytest.mark.parametrize("case", [
    (-2.0, -6.0, 1030.0, 2000.0, 6.5),     # REFERENCES.md "QNH": 1030 hPa at 2000 m
    (-25.0, -28.0, 1032.0, 150.0, LAYERED),
    (31.0, 12.0, 1003.0, 1350.0, 8.5),
])
def test_indicated_against_independent_integration(case):
    # Independent: pressure by 1 m hydrostatic steps, then the ISA troposphere's pressure
    # altitude (Doc 7488/3) of p minus that of QNH; the altimeter reads PA(p) - PA(QNH)
    # (REFERENCES.md "Altimetry").
    t, td, q, elev, lapse = case
    col = Column.from_qnh(t, td, q, elev, lapse, 12000.0)
    for dz in (0.0, 300.0, 1000.0, 2500.0, 5000.0):
        z = elev + dz
        want = isa_troposphere_pa_m(hydrostatic_p(col, z)) - isa_troposphere_pa_m(q)
        assert abs(alt.indicated_altitude_at(col, z) - want) < 0.5, z


def test_altimeter_reads_the_elevation_at_the_field():
    # ICAO Annex 3 (QNH; REFERENCES.md "Altimetry"): on QNH it reads the field elevation.
    for t, q, elev in ((-30.0, 1040.0, 0.0), (35.0, 995.0, 1600.0), (0.0, 1013.25, -300.0)):
        col = Column.from_qnh(t, t - 4.0, q, elev, 6.5)
        assert abs(alt.indicated_altitude_at(col, elev) - elev) < 0.01
        assert abs(alt.true_altitude_of(col, elev) - elev) < 0.01


def test_cold_air_reads_high_warm_air_reads_low():
    # Common practice (REFERENCES.md "Altimetry"): true altitude is below indicated in cold
    # air, above it in warm air.
    cold = isa_column(300.0, -20.0, 6.5, 10000.0)
    warm = isa_column(300.0, 20.0, 6.5, 10000.0)
    for z in (800.0, 3000.0, 9000.0):
        assert alt.indicated_altitude_at(cold, z) > z + 10.0
        assert alt.indicated_altitude_at(warm, z) < z - 10.0


@given(st.floats(-400.0, 3000.0), st.floats(-45.0, 40.0), st.floats(960.0, 1045.0),
       st.sampled_from([6.5, 9.0, [(800.0, -3.0), (None, 6.5)], LAYERED,
                        [(500.0, 0.0), (None, 7.5)]]),
       st.floats(0.0, 1.0))
def test_round_trip_over_the_whole_column(elev, t, q, lapse, frac):
    col = Column.from_qnh(t, t - 3.0, q, elev, lapse, 16000.0)
    z = col.elev_m + frac * (col.top_m - col.elev_m)
    assert abs(alt.true_altitude_of(col, alt.indicated_altitude_at(col, z)) - z) < TENTH_M


def test_true_altitude_of_refuses_readings_outside_the_column():
    col = Column.from_qnh(10.0, 2.0, 1010.0, 500.0, 6.5, 8000.0)
    with pytest.raises(ValueError, match=r"indicated_m=400(\.0)? .*allowed range 500\.\.8041"):
        alt.true_altitude_of(col, 400.0)
    with pytest.raises(ValueError, match=r"indicated_m=20000(\.0)? "):
        alt.true_altitude_of(col, 20000.0)
    with pytest.raises(ValueError, match="indicated_m=nan"):
        alt.true_altitude_of(col, float("nan"))
    # The ends of the column themselves are in range, and readings up to half a metre
    # past them (float32 rounding on a board) are the ends.
    assert alt.true_altitude_of(col, 500.0) == 500.0
    assert alt.true_altitude_of(col, 499.5) == 500.0
    with pytest.raises(ValueError, match="indicated_m=499.4 "):
        alt.true_altitude_of(col, 499.4)
    top = alt.indicated_altitude_at(col, col.top_m)
    assert abs(alt.true_altitude_of(col, top) - col.top_m) < TENTH_M
    assert alt.true_altitude_of(col, top + 0.4) == col.top_m
    with pytest.raises(ValueError, match="indicated_m=%r " % (top + 0.6)):
        alt.true_altitude_of(col, top + 0.6)


# --- ISA deviation -------------------------------------------------------------------

def test_isa_deviation():
    # ICAO Doc 7488/3: zero in ISA at every height; a sea-level field at 1013.25 hPa
    # that is dT warmer than 15 degC deviates by exactly dT there.
    col = isa_column(0.0)
    for z in (0.0, 2000.0, 11000.0, 15000.0, 25000.0):
        assert abs(alt.isa_deviation_at(col, z)) < 1e-6, z
    for dev in (-35.0, -10.0, 12.0):
        c = Column(15.0 + dev, 15.0 + dev - 5.0, 1013.25, 0.0, 6.5)
        assert abs(alt.isa_deviation_at(c, 0.0) - dev) < 1e-9
    # At 5000 m of a column 20 K colder than ISA all the way, the altimeter reads high
    # (pressure altitude above 5000 m) where ISA is colder still: the deviation there is
    # -20 K plus 6.5 K/km times (PA - z), worked out by hand from the ISA lapse rate.
    c = Column(-5.0, -10.0, 1013.25, 0.0, 6.5)
    pa = alt.flight_level(c.p_at(5000.0)) * 30.48
    assert abs(alt.isa_deviation_at(c, 5000.0) - (-20.0 + 0.0065 * (pa - 5000.0))) < 1e-6
    assert pa - 5000.0 > 300.0


# --- cold-temperature correction -----------------------------------------------------

@pytest.mark.parametrize("h, t_ad, want", [
    # REFERENCES.md "Altimetry", computed from the PANS-OPS formula, aerodrome at 0 m.
    (300.0, 0.0, 15.7), (300.0, -10.0, 26.1), (300.0, -20.0, 36.6), (300.0, -30.0, 47.0),
    (1000.0, 0.0, 52.7), (1000.0, -10.0, 87.8), (1000.0, -20.0, 122.9),
    (1000.0, -30.0, 158.0),
])
def test_cold_correction_reference_values(h, t_ad, want):
    assert abs(alt.cold_temperature_correction(h, t_ad, 0.0) - want) < 0.06


def test_cold_correction_against_the_icao_formula():
    # REFERENCES.md "Altimetry" (PANS-OPS, from memory): aerodrome at 1000 m, -20 degC,
    # h = 500 m -> 50.9 m; and the literal formula across a grid, within a millimetre.
    assert abs(alt.cold_temperature_correction(500.0, -20.0, 1000.0) - 50.9) < 0.06
    for h_ad in (-200.0, 0.0, 1000.0, 2500.0):
        for t_ad in (-50.0, -31.0, -15.0, -2.0, 8.0):
            for h in (60.0, 200.0, 450.0, 1000.0, 1500.0, 3000.0):
                assert abs(alt.cold_temperature_correction(h, t_ad, h_ad)
                           - icao_formula_m(h, t_ad, h_ad)) < 0.001
    # At ISA there is nothing to correct; warmer than ISA it is negative (never applied).
    assert abs(alt.cold_temperature_correction(1000.0, 15.0 - 6.5, 1000.0)) < 1e-9
    assert alt.cold_temperature_correction(1000.0, 30.0, 0.0) < 0.0
    assert alt.cold_temperature_correction(0.0, -40.0, 0.0) == 0.0


def test_cold_correction_refuses_bad_input():
    with pytest.raises(ValueError, match=r"height_above_aerodrome_m=-10(\.0)? .*0\.\.11000"):
        alt.cold_temperature_correction(-10.0, -10.0, 0.0)
    with pytest.raises(ValueError, match=r"height_above_aerodrome_m=9000(\.0)? .*0\.\.8000"):
        alt.cold_temperature_correction(9000.0, -10.0, 3000.0)
    with pytest.raises(ValueError, match=r"aerodrome_t_c=-95(\.0)? "):
        alt.cold_temperature_correction(300.0, -95.0, 0.0)
    with pytest.raises(ValueError, match=r"aerodrome_elev_m=9500(\.0)? "):
        alt.cold_temperature_correction(300.0, -10.0, 9500.0)


@pytest.mark.parametrize("elev", [0.0, 800.0, 2400.0])
@pytest.mark.parametrize("dev", [-8.0, -20.0, -35.0, -50.0])
def test_column_value_matches_icao_for_an_isa_lapse_column(elev, dev):
    # The check: for a column with the ISA lapse rate, colder than ISA, the
    # column's exact indicated-minus-true is within 10 % of the PANS-OPS formula (which
    # assumes that lapse rate). Measured: within 4.9 % over these cases, the largest
    # far above the field in very cold air.
    col = isa_column(elev, dev, 6.5, elev + 6000.0)
    for h in (100.0, 300.0, 1000.0, 1500.0, 4000.0):
        exact = alt.column_cold_correction(col, h)
        icao = alt.cold_temperature_correction(h, col.t_c, elev)
        assert exact > 0.0
        assert abs(exact - icao) <= 0.10 * icao


def test_column_value_sees_an_inversion_the_formula_cannot():
    # A cold field under a warm inversion: the air aloft is warmer than the ISA-lapse
    # assumption, so less correction is needed than the formula says; both are
    # checked against the indicated reading at the true height they give.
    col = Column.from_qnh(-20.0, -23.0, 1025.0, 200.0, [(400.0, -15.0), (None, 6.5)], 8000.0)
    exact = alt.column_cold_correction(col, 1000.0)
    icao = alt.cold_temperature_correction(1000.0, -20.0, 200.0)
    assert 0.0 < exact < icao - 10.0
    z = 1200.0 - exact
    assert abs(alt.indicated_altitude_at(col, z) - 1200.0) < 1e-6


@pytest.mark.parametrize("elev", [0.0, 1200.0])
@pytest.mark.parametrize("dev", [-20.0, -10.0, 10.0, 20.0])
def test_four_percent_per_ten_degrees(elev, dev):
    # Common practice (REFERENCES.md "Altimetry"): true altitude differs from indicated
    # by about 4 % of the height above the field per 10 degC of ISA deviation, lower in
    # cold air, higher in warm. Stated tolerance: 1 % of the height per 10 degC (the rule
    # runs high: the exact value for an ISA-lapse column is dT / T_field, 3.5 % at sea level).
    col = isa_column(elev, dev, 6.5, elev + 5000.0)
    for h in (300.0, 1000.0, 3000.0):
        diff = alt.true_altitude_of(col, elev + h) - (elev + h)
        rule = 0.04 * dev / 10.0 * h
        assert math.copysign(1.0, diff) == math.copysign(1.0, dev)
        assert abs(diff - rule) <= 0.01 * abs(dev) / 10.0 * h


# --- report keys -----------------------------------------------------------------------

def test_dry_density_altitude_in_report():
    # REFERENCES.md "Density altitude" (computed): 850 hPa, 30 degC, dry -> 2296.9 m.
    col = Column(30.0, 10.0, 850.0, 1400.0, 6.5)
    r = col.report()
    assert abs(r["density_altitude_dry_m"] - 2296.9) < 0.5
    # Humid air is lighter, so its density altitude is higher (any textbook).
    assert r["density_altitude_m"] > r["density_altitude_dry_m"] + 10.0


def test_report_indicated_altitudes_cover_every_height_key():
    col = Column.from_qnh(-12.0, -15.0, 1036.0, 250.0, [(300.0, -6.0), (None, 6.5)], 11000.0)
    r = col.report()
    ind = r["indicated_altitude_m"]
    singles = [k for k in r if k.endswith("_msl_m") and not isinstance(r[k], list)]
    assert sorted(ind) == sorted(singles)
    for k in ("cloud_base_msl_m", "freezing_level_msl_m", "top_msl_m", "lfc_msl_m"):
        assert k in ind
    for k in singles:
        if r[k] is None:
            assert ind[k] is None, k
        else:
            assert abs(ind[k] - alt.indicated_altitude_at(col, r[k])) < 1e-9, k
    # Cold air: every height above the field reads high.
    assert ind["top_msl_m"] > r["top_msl_m"] + 100.0
    assert abs(r["isa_deviation_c"] - alt.isa_deviation_at(col, 250.0)) < 1e-12
    assert r["isa_deviation_c"] < -20.0


def test_report_keys_added_later_are_covered():
    # add_to_report maps any *_msl_m number, including keys other code adds later;
    # lists and non-height keys are left out.
    col = Column.from_qnh(-5.0, -9.0, 1020.0, 100.0, 6.5, 9000.0)
    r = {"some_new_level_msl_m": 2500.0, "gone_msl_m": None, "many_msl_m": [1000.0],
         "cloud_base_agl_m": 800.0, "count_msl_m": 3000}
    alt.add_to_report(col, r)
    ind = r["indicated_altitude_m"]
    assert sorted(ind) == ["count_msl_m", "gone_msl_m", "some_new_level_msl_m"]
    assert ind["gone_msl_m"] is None
    assert abs(ind["some_new_level_msl_m"] - alt.indicated_altitude_at(col, 2500.0)) < 1e-9


def test_cold_warnings():
    # 10 K or more colder than ISA at a reported level: listed with indicated minus true.
    cold = Column.from_qnh(-30.0, -33.0, 1030.0, 300.0, 6.5, 9000.0)
    r = cold.report()
    w = alt.cold_warnings(cold, r)
    assert w and w == sorted(w, key=lambda x: x[1])
    listed = set(x[0] for x in w)
    for k, z in r.items():
        if k in r["indicated_altitude_m"] and r["indicated_altitude_m"][k] is not None:
            dev = alt.isa_deviation_at(cold, z)
            # Levels at the field are left out: there the altimeter reads right on QNH.
            reads_high = r["indicated_altitude_m"][k] > z
            assert (k in listed) == (dev <= -10.0 and z > 301.0 and reads_high), k
    for k, z, dev, diff in w:
        assert dev <= -10.0
        assert abs(diff - (r["indicated_altitude_m"][k] - z)) < 1e-9
        assert diff > 0.5
    # The top of the column is far above the field: a large error there.
    assert dict((x[0], x[3]) for x in w)["top_msl_m"] > 500.0
    assert "freezing_level_msl_m" not in listed and r["freezing_level_msl_m"] == 300.0
    warm = Column.from_qnh(25.0, 10.0, 1015.0, 300.0, 6.5, 9000.0)
    assert alt.cold_warnings(warm, warm.report()) == []
    # Cold aloft over a hot field: 16 km is more than 10 K colder than ISA, yet the warm
    # air below makes the altimeter read low there: no warning.
    hot = Column.from_qnh(27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5),
                                                        (None, 6.5)], 16000.0, None, None)
    rh = hot.report()
    assert alt.isa_deviation_at(hot, 16000.0) < -15.0
    assert rh["indicated_altitude_m"]["top_msl_m"] < 16000.0
    assert alt.cold_warnings(hot, rh) == []
    # The threshold itself counts: listed exactly when 10 K or more colder than ISA.
    seen = set()
    for t in (4.0, 4.25, 4.5, 4.75, 5.0, 5.25):
        c = Column(t, t - 5.0, 1013.25, 0.0, 6.5, 6000.0)
        r = {"x_msl_m": 1000.0}
        alt.add_to_report(c, r)
        cold_enough = alt.isa_deviation_at(c, 1000.0) <= -10.0
        seen.add(cold_enough)
        assert len(alt.cold_warnings(c, r)) == (1 if cold_enough else 0)
        assert len(alt.cold_warnings(c, r, 5.0)) == 1
    assert seen == {True, False}


def test_report_without_altimetry_keys():
    # report(altimetry=False) leaves out exactly the three keys (a board's session heap).
    col = Column.from_qnh(-5.0, -9.0, 1020.0, 100.0, 6.5, 9000.0)
    full, lean = col.report(), col.report(0.0, False)
    assert sorted(set(full) - set(lean)) == ["density_altitude_dry_m", "indicated_altitude_m",
                                             "isa_deviation_c"]
    for k in lean:
        assert lean[k] == full[k], k


def test_cold_warnings_at_one_height_are_in_name_order():
    # Two report keys at the same height (the thermal top and the usable top often
    # are): listed by key name, so every port says the same (a board's dict keeps no
    # insertion order). An invented winter column 20 K colder than ISA.
    from lapsecalc.altimetry import cold_warnings
    from lapsecalc.indicated import indicated_altitude_at
    col = Column.from_qnh(-5.0, -12.0, 1013.25, 200.0, 6.5, 8000.0)
    z = 2500.0
    ind = indicated_altitude_at(col, z)
    r = {"zeta_top_msl_m": z, "alpha_top_msl_m": z, "indicated_altitude_m": {
        "zeta_top_msl_m": ind, "alpha_top_msl_m": ind}}
    got = cold_warnings(col, r)
    assert [w[0] for w in got] == ["alpha_top_msl_m", "zeta_top_msl_m"]
    assert got[0][1] == z and got[0][2] <= -10.0 and got[0][3] == ind - z > 0.0
