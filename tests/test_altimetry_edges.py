"""Altimetry at its edges: where "above the field" starts for the cold-air warnings,
and the half-metre allowance at the ends of the column for indicated readings."""
import math

import pytest

from lapsecalc import Column
from lapsecalc import altimetry as alt
from test_altimetry import hydrostatic_p


def test_cold_warnings_start_one_metre_above_the_field():
    # 35 K colder than ISA at a sea-level field on 1013.25 hPa: every height above the
    # field reads high (common practice, REFERENCES.md "Altimetry"), but heights under
    # a metre above it count as the field itself (altimetry.cold_warnings).
    col = Column(-20.0, -25.0, 1013.25, 0.0, 6.5, 6000.0)
    for z, listed in ((0.5, False), (0.999, False), (1.0, True), (2.0, True)):
        r = {"x_msl_m": z}
        alt.add_to_report(col, r)
        assert r["indicated_altitude_m"]["x_msl_m"] > z
        w = alt.cold_warnings(col, r)
        assert bool(w) == listed, z
        if listed:
            assert w[0][0] == "x_msl_m" and abs(w[0][2] + 35.0) < 0.01


def test_readings_half_a_metre_past_the_ends_are_the_ends():
    # Up to 0.5 m past either end (float32 rounding of a reading on a board) is that
    # end; more is refused (altimetry.true_altitude_of).
    col = Column.from_qnh(10.0, 2.0, 1010.0, 500.0, 6.5, 8000.0)
    assert alt.true_altitude_of(col, 499.5) == 500.0
    with pytest.raises(ValueError, match="indicated_m=499.497 "):
        alt.true_altitude_of(col, 499.497)
    top = alt.indicated_altitude_at(col, col.top_m)
    assert alt.true_altitude_of(col, top + 0.499) == col.top_m
    with pytest.raises(ValueError, match="indicated_m="):
        alt.true_altitude_of(col, top + 0.503)


def test_cold_warnings_at_the_threshold_and_lowest_first():
    # "threshold_k or more colder" (altimetry.cold_warnings): a level exactly at the
    # threshold is listed.
    col = Column(4.5, 0.0, 1013.25, 0.0, 6.5, 6000.0)
    r = {"x_msl_m": 1000.0}
    alt.add_to_report(col, r)
    dev = alt.isa_deviation_at(col, 1000.0)
    assert len(alt.cold_warnings(col, r, -dev)) == 1
    assert alt.cold_warnings(col, r, -dev + 1e-9) == []
    # A field 20 K colder than ISA under a 9 K/km lapse: the air aloft falls further
    # below ISA with height, so the most negative deviation is the highest level; the
    # warnings still come lowest first, whatever the order of the keys.
    col = Column(-5.0, -9.0, 1013.25, 0.0, 9.0, 6000.0)
    r = {"c_msl_m": 3000.0, "a_msl_m": 500.0, "b_msl_m": 1500.0}
    alt.add_to_report(col, r)
    w = alt.cold_warnings(col, r)
    assert [x[0] for x in w] == ["a_msl_m", "b_msl_m", "c_msl_m"]
    assert w[0][2] > w[1][2] > w[2][2]


@pytest.mark.parametrize("fl", [50.0, 100.0, 200.0, 300.0])
def test_flight_levels_at_both_ends_of_an_isa_column(fl):
    # ISA from a sea-level field (ICAO Doc 7488/3): FL0 is the field and a column whose
    # top is FL x 100 ft has that flight level exactly at its top (both ends inside).
    col = Column(15.0, 5.0, 1013.25, 0.0, 6.5, fl * 30.48)
    assert alt.z_at_flight_level(col, 0.0) == 0.0
    assert abs(alt.z_at_flight_level(col, fl) - fl * 30.48) < 1e-6
    # The refusal names the top's own level, not the one below it (rounding).
    with pytest.raises(ValueError, match="outside the column; allowed FL0..FL%d here" % fl):
        alt.z_at_flight_level(col, fl + 0.01)


G0, RD = 9.80665, 287.05287           # ICAO Doc 7488/3
P11, P20 = 226.3206, 54.74887         # hPa at 11 and 20 km, from the layer equations


def isa_pa_m(p):
    # Pressure altitude, m, written here from the ICAO Doc 7488/3 layer equations:
    # 6.5 K/km to 11 km, isothermal 216.65 K to 20 km, then warming 1 K/km.
    if p >= P11:
        return 288.15 / 0.0065 * (1.0 - (p / 1013.25) ** (RD * 0.0065 / G0))
    if p >= P20:
        return 11000.0 + RD * 216.65 / G0 * math.log(P11 / p)
    return 20000.0 + 216.65 / 0.001 * ((p / P20) ** (-RD * 0.001 / G0) - 1.0)


def test_isa_pa_reproduces_the_reference_table():
    # REFERENCES.md "Pressure levels": 15000 m 120.445 hPa, 20000 m 54.749 hPa; the ISA
    # table: 32000 m 8.68 hPa, 11000 m 226.32 hPa.
    for h, p, tol in ((15000.0, 120.445, 0.5), (20000.0, 54.749, 0.5), (11000.0, 226.32, 1.0),
                      (32000.0, 8.68, 25.0)):
        assert abs(isa_pa_m(p) - h) < tol


def test_indicated_above_the_tropopause_against_integration():
    # A dry column 12 K colder than ISA up to 9 km, isothermal to 16 km, then warming
    # 2 K/km: the altimeter reads PA(p) - PA(QNH) (REFERENCES.md "Altimetry"), with the
    # pressure integrated in 2 m steps (test_altimetry.hydrostatic_p) and PA from the layer equations above.
    col = Column.from_qnh(3.0, -60.0, 1009.0, 200.0, [(8800.0, 6.5), (15800.0, 0.0),
                                                       (None, -2.0)], 30000.0)
    pa_qnh = isa_pa_m(1009.0)
    z = 200.0
    for z in (5000.0, 10500.0, 12000.0, 18000.0, 21000.0, 26000.0, 30000.0):
        want = isa_pa_m(hydrostatic_p(col, z, 2.0)) - pa_qnh
        assert abs(alt.indicated_altitude_at(col, z) - want) < 0.5, z
    # Beyond the ISA table (under 8.68 hPa) there is no reading: None in the report.
    cold = Column(0.0, -90.0, 1013.25, 0.0, [(11000.0, 6.5), (None, 0.0)], 32000.0)
    with pytest.raises(ValueError):
        alt.indicated_altitude_at(cold, 32000.0)
    r = {"top_msl_m": 32000.0, "low_msl_m": 100.0}
    alt.add_to_report(cold, r)
    assert r["indicated_altitude_m"]["top_msl_m"] is None
    assert abs(r["indicated_altitude_m"]["low_msl_m"] - alt.indicated_altitude_at(cold, 100.0)) \
        < 1e-9


def test_isa_deviation_and_dry_density_altitude_to_the_millimetre():
    # The field's ISA deviation is its temperature minus the ISA temperature at its
    # pressure altitude, and the dry density altitude is the ISA height of p / (R T)
    # (ICAO Doc 7488/3; REFERENCES.md "Density altitude": rho0 = p0 / (R T0)); written
    # here in closed form for the troposphere.
    for t, td, p, elev in ((30.0, 10.0, 850.0, 1400.0), (-20.0, -30.0, 1030.0, 0.0),
                           (12.0, 11.0, 700.0, 3000.0)):
        col = Column(t, td, p, elev, 6.5, elev + 3000.0)
        r = col.report()
        assert abs(r["isa_deviation_c"] - (t - (15.0 - 0.0065 * isa_pa_m(p)))) < 1e-6
        rho, rho0 = 100.0 * p / (RD * (t + 273.15)), 101325.0 / (RD * 288.15)
        da = 288.15 / 0.0065 * (1.0 - (rho / rho0) ** (1.0 / (G0 / (RD * 0.0065) - 1.0)))
        assert abs(r["density_altitude_dry_m"] - da) < 0.001


def test_column_cold_correction_over_the_whole_column():
    # 0..(top - elevation) m above the field (altimetry.column_cold_correction): at the
    # field nothing to correct (the altimeter reads the elevation on QNH), at the top
    # the reading there less the top; beyond either end refused by name.
    col = Column.from_qnh(-15.0, -20.0, 1020.0, 700.0, 6.5, 5000.0)
    assert abs(alt.column_cold_correction(col, 0.0)) < 0.01
    top = alt.column_cold_correction(col, 4300.0)
    assert abs(alt.indicated_altitude_at(col, 5000.0 - top) - 5000.0) < 0.01
    for h in (-0.01, 4300.01):
        with pytest.raises(ValueError, match="height_above_field_m="):
            alt.column_cold_correction(col, h)
