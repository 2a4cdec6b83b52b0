"""ICAO standard atmosphere, pressure and density altitude, QNH."""
import pytest
from hypothesis import assume, given, strategies as st

from lapsecalc import (isa, pressure_altitude, station_pressure, qnh, air_density,
                       density_altitude)
from lapsecalc.standard import isa_height_of_density

FT = 0.3048  # m per ft, exact (REFERENCES.md, Units)

# ICAO standard atmosphere table (ICAO Doc 7488/3, as computed in REFERENCES.md).
ISA_TABLE = [
    (0, 15.00, 1013.25, 1.2250), (1000, 8.50, 898.75, 1.1116), (2000, 2.00, 794.95, 1.0065),
    (3000, -4.50, 701.09, 0.9091), (5000, -17.50, 540.20, 0.7361),
    (11000, -56.50, 226.32, 0.3639), (20000, -56.50, 54.75, 0.0880), (32000, -44.50, 8.68, 0.0132),
]


@pytest.mark.parametrize("h,t,p,rho", ISA_TABLE)
def test_isa_table(h, t, p, rho):
    # ICAO Doc 7488/3: table values to 0.05 % (temperature to 0.01 K).
    t2, p2, rho2 = isa(h)
    assert abs(t2 - t) < 0.01
    assert abs(p2 / p - 1) < 0.0005
    assert abs(rho2 / rho - 1) < 0.0005 + 0.00005 / rho  # table rounded to 4 decimals


@pytest.mark.parametrize("h,t,p,rho", ISA_TABLE)
def test_pressure_altitude_inverts_table(h, t, p, rho):
    # ICAO Doc 7488/3 table pressures give back their heights (0.05 % of p ~ 5 m low).
    assert abs(pressure_altitude(p) - h) < 6.0


def test_pressure_altitude_nws_form():
    # PA_ft = 145366.45 (1 - (p/1013.25)^0.190284) (U.S. NWS form, REFERENCES.md):
    # 900 hPa -> 3241.8 ft, 700 hPa -> 9878.4 ft; that form rounds its constants, so
    # agreement to 0.05 % is expected.
    assert abs(pressure_altitude(900.0) / FT / 3241.8 - 1) < 0.0005
    assert abs(pressure_altitude(700.0) / FT / 9878.4 - 1) < 0.0005


def test_pressure_altitude_rule_of_thumb():
    # About 27-30 ft per hPa near sea level (common practice).
    ft_per_hpa = (pressure_altitude(1003.25) - pressure_altitude(1013.25)) / FT / 10.0
    assert 27.0 < ft_per_hpa < 30.0


def test_station_pressure_checks():
    # QNH 1030 hPa at 2000 m -> 808.72 hPa; QNH 990 hPa at 2000 m -> 775.86 hPa
    # (altimeter-setting relation, computed; REFERENCES.md).
    assert abs(station_pressure(1030.0, 2000.0) - 808.72) < 0.01
    assert abs(station_pressure(990.0, 2000.0) - 775.86) < 0.01


def test_standard_qnh_gives_isa_pressure():
    # With QNH 1013.25 the relation gives the ISA pressure at h (REFERENCES.md).
    for h in (-400.0, 0.0, 500.0, 3000.0, 8000.0):
        assert abs(station_pressure(1013.25, h) - isa(h)[1]) < 0.01


@given(st.floats(900.0, 1080.0), st.floats(-500.0, 4500.0))
def test_qnh_round_trip(q, h):
    # Round trip within 0.05 hPa (issue requirement).
    assume(station_pressure(q, h) <= 1100.0)
    assert abs(qnh(station_pressure(q, h), h) - q) < 0.05


@given(st.floats(-1000.0, 32000.0))
def test_isa_pressure_altitude_round_trip(h):
    assert abs(pressure_altitude(isa(h)[1]) - h) < 0.01


@given(st.floats(-1000.0, 32000.0))
def test_density_altitude_of_isa_is_height(h):
    assert abs(isa_height_of_density(isa(h)[2]) - h) < 0.01


def test_density_altitude_check():
    # Station pressure 850 hPa, 30 degC, dry -> 2296.9 m (7535.8 ft) (computed from the
    # ICAO Doc 7488/3 constants; REFERENCES.md).
    assert abs(density_altitude(850.0, 30.0) - 2296.9) < 0.5
    assert abs(pressure_altitude(850.0) / FT - 4779.2) < 4.0


def test_density_altitude_rule_of_thumb():
    # DA_ft ~ PA_ft + 120 (OAT - ISA temperature) (FAA-H-8083-25, from memory): it runs
    # a few percent high in hot conditions, 7715 ft against the exact 7536 ft (REFERENCES.md).
    pa_ft = pressure_altitude(850.0) / FT
    isa_t = isa(pressure_altitude(850.0))[0]
    thumb = pa_ft + 120.0 * (30.0 - isa_t)
    exact = density_altitude(850.0, 30.0) / FT
    assert abs(thumb - 7715) < 15
    assert 0.0 < thumb - exact < 0.04 * exact


def test_moist_air_is_lighter():
    # Humid air is less dense than dry air at the same p and T (virtual temperature).
    assert air_density(1000.0, 30.0, 25.0) < air_density(1000.0, 30.0)
    assert density_altitude(1000.0, 30.0, 25.0) > density_altitude(1000.0, 30.0)


def test_air_density_isa_sea_level():
    # 1.2250 kg/m3 at 1013.25 hPa, 15 degC (ICAO Doc 7488/3).
    assert abs(air_density(1013.25, 15.0) - 1.2250) < 0.0001


@given(st.floats(600.0, 1050.0), st.floats(-30.0, 45.0), st.floats(0.1, 5.0), st.floats(0.0, 30.0))
def test_density_altitude_monotonic(p, t, dt, spread):
    # Rises with temperature (dry and moist) and with humidity at fixed p and T.
    assert density_altitude(p, t + dt) > density_altitude(p, t)
    td = t - spread
    if td > -85.0:
        assert density_altitude(p, t, td) >= density_altitude(p, t, max(td - 5.0, -89.0))


@pytest.mark.parametrize("call,word", [
    (lambda: isa(32001), "h_m=32001"),
    (lambda: isa(float("inf")), "h_m=inf"),
    (lambda: pressure_altitude(5.0), "p_hpa=5"),
    (lambda: station_pressure(29.92, 100), "qnh_hpa=29.92"),
    (lambda: station_pressure(1013, 9500), "elev_m=9500"),
    (lambda: qnh(500, 0), "QNH"),
    (lambda: air_density(0, 15), "p_hpa=0"),
    (lambda: density_altitude(1000, 15, 16), "td_c=16"),
])
def test_bad_input(call, word):
    with pytest.raises(ValueError) as err:
        call()
    assert word in str(err.value)
    assert "allowed" in str(err.value)


def test_density_outside_the_isa_is_refused():
    # Zero, negative, NaN and too dense were a math error or a silent NaN; the ISA density
    # at 32000 m is 0.0132 kg/m3 (ICAO Doc 7488/3).
    for rho in (0.0, -1.0, float("nan"), 0.01, 5.0):
        with pytest.raises(ValueError) as err:
            isa_height_of_density(rho)
        assert "rho_kg_m3=" in str(err.value) and "0.0132..2.5 kg/m3" in str(err.value)


def test_cancellation_free_ratios():
    # ln(1+u)/u and (e^x - 1)/x near 0 by their Taylor series (math.log1p/expm1 as the
    # outside reference): within the series' own truncation error (u^4/5, x^4/120).
    import math
    from lapsecalc.standard import ratio_ln, ratio_exp
    for u in (-0.0099, -0.005, -1e-6, 1e-6, 0.005, 0.0099, -0.5, 0.02, 3.0):
        assert abs(ratio_ln(u) - math.log1p(u) / u) < 3e-9
    for x in (-0.0099, -0.005, -1e-6, 1e-6, 0.005, 0.0099, -0.5, 0.02, 3.0):
        assert abs(ratio_exp(x) - math.expm1(x) / x) < 2e-10


def test_dry_and_capped_air_density():
    # Ideal gas rho = p / (Rd T) (ICAO Doc 7488/3 constants) for dry air; with a
    # dewpoint, the virtual temperature T / (1 - (e/p)(1 - eps)) with e capped at half
    # the pressure (hot thin air: e_s(50 degC) = 123 hPa at 200 hPa).
    rd, eps = 287.05287, 287.05287 / 461.5
    assert abs(air_density(1000.0, 15.0) / (100000.0 / (rd * 288.15)) - 1) < 1e-12
    tv = 323.15 / (1.0 - 0.5 * (1.0 - eps))
    assert abs(air_density(200.0, 50.0, 50.0) / (20000.0 / (rd * tv)) - 1) < 1e-12
