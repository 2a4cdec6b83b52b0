"""Dry and saturated lapse rates and the pseudo-adiabatic ascent."""
import pytest
from hypothesis import assume, given, strategies as st

from lapsecalc import moist_lapse_rate, saturated_ascent
from lapsecalc.adiabats import dry_ascent
from lapsecalc.constants import DRY_LAPSE_K_PER_KM
from refs import pseudo_adiabat_euler

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
    # Within 0.1 K of a fine-step reference integration (tests/refs.py) from 1000 to
    # 200 hPa (issue requirement; REFERENCES.md "Moist ascent").
    ref = pseudo_adiabat_euler(t0, 1000.0, 200.0)
    assert abs(saturated_ascent(t0, 1000.0, 200.0) - ref) < 0.1
    assert abs(saturated_ascent(t0, 1000.0, 200.0, dlnp=0.01) - ref) < 0.1


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


def test_very_far_ascent_does_not_overflow():
    # Regression: -90 degC air lifted from 850 to 1 hPa once overflowed the saturation
    # fit near its pole (-243 degC). With no vapour left the pseudo-adiabat is the dry
    # adiabat (Poisson's equation; AMS Glossary form with r_s = 0).
    t = saturated_ascent(-90.0, 850.0, 1.0)
    assert abs(t - dry_ascent(-90.0, 850.0, 1.0)) < 0.01
