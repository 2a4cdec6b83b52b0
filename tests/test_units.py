"""Unit helpers against the exact factors (REFERENCES.md, Units)."""
from lapsecalc import units


def test_exact_factors():
    # 1 ft = 0.3048 m; 1 inHg = 33.8639 hPa; 1 mmHg = 1.33322 hPa; 1 kt = 1852 m / 3600 s;
    # degF = degC * 9/5 + 32 (REFERENCES.md, Units).
    assert units.ft_to_m(1000.0) == 304.8
    assert abs(units.inhg_to_hpa(29.92) - 1013.207888) < 1e-6
    assert abs(units.mmhg_to_hpa(760.0) - 1013.2472) < 1e-6
    assert abs(units.kt_to_m_s(1.0) - 0.514444444) < 1e-8
    assert units.c_to_f(100.0) == 212.0 and units.f_to_c(-40.0) == -40.0
    assert units.kpa_to_hpa(101.325) == 1013.25
    assert units.mb_to_hpa(1000) == 1000.0
    # 1 lb = 0.45359237 kg (exact by definition; from memory).
    assert units.lb_to_kg(1.0) == 0.45359237


def test_lapse_units():
    # 2 degC per 1000 ft (ISA, common practice: 6.5 K/km is about 1.98 degC/1000 ft).
    assert abs(units.k_per_km_to_c_per_1000ft(6.5) - 1.98) < 0.005
    assert abs(units.c_per_1000ft_to_k_per_km(3.0) - 9.8425) < 0.0001
    assert units.c_per_100m_to_k_per_km(1.0) == 10.0


def test_round_trips():
    for x in (-40.0, 0.0, 12.5, 3000.0):
        assert abs(units.m_to_ft(units.ft_to_m(x)) - x) < 1e-9
        assert abs(units.c_to_f(units.f_to_c(x)) - x) < 1e-9
        assert abs(units.hpa_to_inhg(units.inhg_to_hpa(x)) - x) < 1e-9
        assert abs(units.kg_to_lb(units.lb_to_kg(x)) - x) < 1e-9
        assert abs(units.m3_to_ft3(units.ft3_to_m3(x)) - x) < 1e-6
        assert abs(units.k_to_c(units.c_to_k(x)) - x) < 1e-9
