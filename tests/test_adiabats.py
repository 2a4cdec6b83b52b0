"""Dry and saturated lapse rates and the pseudo-adiabatic ascent."""
import pytest
from hypothesis import assume, given, strategies as st

from lapsecalc import moist_lapse_rate, saturated_ascent
from lapsecalc.adiabats import dry_ascent
from lapsecalc.constants import DRY_LAPSE_K_PER_KM
from refs import pseudo_adiabat_euler, pseudo_adiabatic_dt_dz

FT_PER_KM = 1000.0 / 0.3048  # exact (REFERENCES.md, Units)


def _per_1000ft(k_per_km):
    return k_per_km * 1000.0 / FT_PER_KM


def test_dry_rate_fact():
    # Dry adiabatic lapse rate 9.8 K/km, about 3 degC per 1000 ft (common practice).
    assert abs(DRY_LAPSE_K_PER_KM - 9.8) < 0.05
    assert abs(_per_1000ft(DRY_LAPSE_K_PER_KM) - 3.0) < 0.05


@pytest.mark.parametrize("t,p,k_per_km", [(26, 1000, 3.73), (0, 850, 6.15), (-10, 700, 7.07),
                                          (-10, 1000, 7.67)])
def test_moist_rate_computed_values(t, p, k_per_km):
    # Pseudo-adiabatic lapse rate, AMS Glossary formula, computed (REFERENCES.md).
    assert abs(moist_lapse_rate(t, p) - k_per_km) < 0.02


def test_moist_rate_trade_facts():
    # Common practice: about 1.2 degC/1000 ft near +26 degC and about 2.2 near -10 degC
    # (here at 1000 hPa and 700 hPa), allow 0.25.
    assert abs(_per_1000ft(moist_lapse_rate(26.0, 1000.0)) - 1.2) < 0.25
    assert abs(_per_1000ft(moist_lapse_rate(-10.0, 700.0)) - 2.2) < 0.25


@given(st.floats(-40.0, 40.0), st.floats(200.0, 1050.0))
def test_moist_rate_bounds(t, p):
    # Between about 3 and 9.8 K/km, and below the dry rate, for air that exists:
    # nothing warmer than the pseudo-adiabat through 35 degC at 1050 hPa. (REFERENCES.md,
    # Lapse rates: 3.73 K/km at 26 degC/1000 hPa, computed from the AMS Glossary
    # formula, lower in warmer air; the dry rate 9.8 K/km is common practice.)
    assume(t <= saturated_ascent(35.0, 1050.0, p))
    g = moist_lapse_rate(t, p)
    assert 3.0 < g < DRY_LAPSE_K_PER_KM


@pytest.mark.parametrize("t0", [35.0, 25.0, 15.0, 0.0, -20.0])
def test_saturated_ascent_against_fine_reference(t0):
    # Within 0.001 K of a fine-step reference integration (tests/refs.py) from 1000 to
    # 200 hPa at the default step (README, Accuracy; 3e-5 K measured), 1e-6 K at a
    # step of 0.01 (REFERENCES.md "Moist ascent").
    ref = pseudo_adiabat_euler(t0, 1000.0, 200.0)
    assert abs(saturated_ascent(t0, 1000.0, 200.0) - ref) < 0.001
    assert abs(saturated_ascent(t0, 1000.0, 200.0, dlnp=0.01) - ref) < 1e-6


@pytest.mark.parametrize("t,p", [(26.0, 1000.0), (0.0, 850.0), (-10.0, 700.0), (40.0, 1050.0),
                                 (-60.0, 300.0), (-89.0, 100.0)])
def test_moist_rate_is_the_glossary_formula(t, p):
    # The AMS Glossary pseudo-adiabatic lapse rate coded in refs.py (Alduchov &
    # Eskridge saturation, Wallace & Hobbs constants), in a column at the parcel's
    # own temperature.
    want = -1000.0 * pseudo_adiabatic_dt_dz(t + 273.15, p, t + 273.15)
    assert abs(moist_lapse_rate(t, p) - want) < 1e-9


def test_moist_rate_in_hot_thin_air_is_capped():
    # Where e_s reaches half the pressure (60 degC: 199 hPa, at 300 hPa) the vapour
    # is capped at p/2 (adiabats._rs): r_s = eps, and the rate stays finite, under the
    # dry rate (AMS Glossary formula with r_s = eps, coded here).
    rd, cp, lv = 287.05287, 1004.0, 2.501e6
    eps, t = rd / 461.5, 333.15
    want = 1000.0 * 9.80665 * (1.0 + lv * eps / (rd * t)) / (cp + lv * lv * eps * eps / (rd * t * t))
    assert abs(moist_lapse_rate(60.0, 300.0) - want) < 1e-9
    assert 0.0 < want < DRY_LAPSE_K_PER_KM


def test_saturated_descent_reverses_ascent():
    up = saturated_ascent(20.0, 1000.0, 500.0)
    assert abs(saturated_ascent(up, 500.0, 1000.0) - 20.0) < 0.001


@given(st.floats(-30.0, 40.0), st.floats(850.0, 1050.0), st.floats(0.05, 0.6))
def test_saturated_ascent_cools_less_than_dry(t, p0, frac):
    p1 = p0 * (1.0 - frac)
    t1 = saturated_ascent(t, p0, p1)
    assert t1 < t
    assert t1 > dry_ascent(t, p0, p1)
    # Monotone: a higher end point is colder.
    assert saturated_ascent(t, p0, p1 * 0.95) < t1


def test_bad_step():
    with pytest.raises(ValueError) as err:
        saturated_ascent(20.0, 1000.0, 500.0, dlnp=0.0)
    assert "dlnp=0" in str(err.value)


def test_step_cap_and_no_step():
    # At most 2000 steps (the documented hard cap): a span of 1.9995 in ln p at 0.001
    # takes 2000, 2.0005 would take 2001 and is refused. No span, no step.
    import math
    t = saturated_ascent(20.0, 1000.0, 1000.0 * math.exp(-1.9995), dlnp=0.001)
    assert abs(t - pseudo_adiabat_euler(20.0, 1000.0, 1000.0 * math.exp(-1.9995))) < 1e-4
    with pytest.raises(ValueError) as err:
        saturated_ascent(20.0, 1000.0, 1000.0 * math.exp(-2.0005), dlnp=0.001)
    assert "at most 2000" in str(err.value)
    assert saturated_ascent(20.0, 900.0, 900.0) == 20.0


def test_very_far_ascent_does_not_overflow():
    # Regression: -90 degC air lifted from 850 to 1 hPa once overflowed the saturation
    # fit near its pole (-243 degC). With no vapour left the pseudo-adiabat is the dry
    # adiabat (Poisson's equation; AMS Glossary form with r_s = 0).
    t = saturated_ascent(-90.0, 850.0, 1.0)
    assert abs(t - dry_ascent(-90.0, 850.0, 1.0)) < 0.01


def test_step_limits_and_cost():
    # dlnp is accepted from 0.001 to 0.2; the default 0.1 takes 17 RK4 steps (68
    # saturation-pressure evaluations) from 1000 to 200 hPa (README, Performance).
    from lapsecalc import adiabats
    saturated_ascent(20.0, 1000.0, 500.0, dlnp=0.2)
    saturated_ascent(20.0, 1000.0, 500.0, dlnp=0.001)
    for bad in (0.201, 0.00099):
        with pytest.raises(ValueError):
            saturated_ascent(20.0, 1000.0, 500.0, dlnp=bad)
    calls = []
    real = adiabats._es_water
    adiabats._es_water = lambda t: calls.append(t) or real(t)
    try:
        saturated_ascent(20.0, 1000.0, 200.0)
    finally:
        adiabats._es_water = real
    assert len(calls) == 68
