"""Altimetry at its edges: where "above the field" starts for the cold-air warnings,
and the half-metre allowance at the ends of the column for indicated readings."""
import pytest

from lapsecalc import Column
from lapsecalc import altimetry as alt


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
    with pytest.raises(ValueError, match="outside the column; allowed FL0..FL"):
        alt.z_at_flight_level(col, fl + 0.01)
