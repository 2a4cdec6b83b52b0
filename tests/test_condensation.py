"""Cloud base (lifting condensation level): Romps, Bolton, spread rule; Lambert W."""
import math

import pytest
from hypothesis import given, strategies as st

from lapsecalc import cloud_base
from lapsecalc.moisture import mixing_ratio
from lapsecalc.condensation import lambert_w_minus1
from refs import romps_lcl_m, romps_lcl_t_p, romps_pvstar_pa, bisect


def _romps_dewpoint_c(t_k, rh):
    # Dewpoint consistent with Romps' own saturation formula (REFERENCES.md note).
    target = rh * romps_pvstar_pa(t_k)
    return bisect(lambda x: romps_pvstar_pa(x) - target, 150.0, t_k) - 273.15


def test_romps_check_value():
    # T 300 K, RH 50 %, p 1000 hPa -> 1433.8 m (Romps 2017, computed; REFERENCES.md).
    td = _romps_dewpoint_c(300.0, 0.5)
    z, t_lcl, p_lcl = cloud_base(300.0 - 273.15, td, 1000.0)
    assert abs(z - 1433.8) < 0.1


@pytest.mark.parametrize("t_k,rh,p", [(300.0, 0.5, 100000.0), (310.0, 0.1, 95000.0),
                                      (273.0, 0.9, 80000.0), (250.0, 0.3, 70000.0),
                                      (320.0, 0.05, 101000.0), (290.0, 0.99, 100000.0)])
def test_romps_against_paper_formula(t_k, rh, p):
    # Romps (2017) eqs. 22a-c with a slow bisection for W_-1 (tests/refs.py): the
    # formula itself, to 1e-6 (README, Accuracy).
    ref = romps_lcl_m(t_k, rh, p)
    t_ref, p_ref = romps_lcl_t_p(t_k, rh, p)
    z, t_l, p_l = cloud_base(t_k - 273.15, _romps_dewpoint_c(t_k, rh), p / 100.0)
    assert abs(z - ref) < 1e-6 * ref + 1e-6
    assert abs(t_l + 273.15 - t_ref) < 1e-6 * t_ref
    assert abs(p_l - p_ref / 100.0) < 1e-6 * p_ref / 100.0


def test_tiny_spread_has_a_tiny_cloud_base():
    # A spread of 0.005 K: the LCL is well under a metre up, not the surface itself
    # (Romps 2017 eq. 22a, refs.py; about 125 m per degC, common practice).
    t_k = 288.15
    rh = romps_pvstar_pa(t_k - 0.005) / romps_pvstar_pa(t_k)
    z, t_l, p_l = cloud_base(15.0, 14.995, 1000.0)
    assert 0.3 < z < 1.0
    assert abs(z - romps_lcl_m(t_k, rh, 100000.0)) < 1e-6
    assert t_l < 15.0 and p_l < 1000.0


def test_bolton_temperature_check():
    # T 26.85 degC, Td 15.57 degC -> T_L 13.00 degC (Bolton 1980 eq. 15, computed;
    # REFERENCES.md).
    assert abs(cloud_base(26.85, 15.57, 1000.0, "bolton")[1] - 13.00) < 0.01


def test_methods_agree_roughly():
    # Bolton and the spread rule (125 m per degC, common practice) bracket Romps within
    # about 3 % for an ordinary day.
    exact = cloud_base(25.0, 12.0, 980.0)[0]
    assert abs(cloud_base(25.0, 12.0, 980.0, "bolton")[0] / exact - 1) < 0.03
    assert abs(cloud_base(25.0, 12.0, 980.0, "spread")[0] - 125.0 * 13.0) < 1e-9
    assert abs(cloud_base(25.0, 12.0, 980.0, "spread")[0] / exact - 1) < 0.05


def test_lcl_temperature_and_pressure_consistent():
    # At the LCL the parcel is saturated: its mixing ratio equals the surface one.
    from lapsecalc import mixing_ratio
    z, t_l, p_l = cloud_base(28.0, 10.0, 1000.0)
    assert abs(mixing_ratio(t_l, p_l) / mixing_ratio(10.0, 1000.0) - 1) < 0.01


def test_saturated_surface_is_zero():
    assert cloud_base(15.0, 15.0, 1000.0) == (0.0, 15.0, 1000.0)
    assert cloud_base(15.0, 15.04, 1000.0)[0] == 0.0
    # A spread at rounding level gives the surface itself, never a height below it.
    assert cloud_base(15.0, 15.0 - 1e-14, 1000.0) == (0.0, 15.0, 1000.0)


@given(st.floats(-5.0, 40.0), st.floats(0.5, 25.0), st.floats(0.1, 5.0), st.floats(700.0, 1050.0))
def test_cloud_base_rises_with_spread(t, spread, more, p):
    assert cloud_base(t, t - spread - more, p)[0] > cloud_base(t, t - spread, p)[0]


def test_lambert_w_at_the_branch_point():
    # W(-1/e) = -1 (definition of the branch point); a rounding below -1/e as well.
    x = -0.36787944117144233
    assert lambert_w_minus1(x) == -1.0
    assert lambert_w_minus1(x - 1e-12) == -1.0
    assert abs(lambert_w_minus1(x + 1e-12) + 1.0) < 1e-5


def test_lambert_w_identity():
    for x in (-0.3678794, -0.36, -0.3, -0.25, -0.2, -0.1, -1e-3, -1e-8, -1e-30):
        w = lambert_w_minus1(x)
        assert w <= -1.0
        assert abs(w * math.exp(w) - x) < 1e-9 * abs(x) + 1e-15


def test_lambert_w_bad_input():
    for x in (0.0, 0.005, 0.1, -0.5, float("nan")):
        with pytest.raises(ValueError) as err:
            lambert_w_minus1(x)
        # The value and the allowed range are named (nan by the generic check).
        assert ("-1/e <= x < 0, got %r" % x) in str(err.value) or x != x


@pytest.mark.parametrize("args,word", [((20, 25, 1000), "td_c=25"), ((20, 10, 1200), "p_hpa=1200"),
                                       ((70, 10, 1000), "t_c=70")])
def test_bad_input(args, word):
    with pytest.raises(ValueError) as err:
        cloud_base(*args)
    assert word in str(err.value)


def test_bad_method():
    with pytest.raises(ValueError) as err:
        cloud_base(20, 10, 1000, "guess")
    assert "exact" in str(err.value)


def test_spread_rule_temperature_and_pressure():
    # 125 m per degC of spread (common practice); the parcel rises dry to that height:
    # T falls at g/cp (9.7675 K/km, ICAO g, cp Wallace & Hobbs) and p follows Poisson's
    # equation p = p0 (T/T0)^(cp/Rd), the dry adiabat's closed form.
    z, t_l, p_l = cloud_base(25.0, 12.0, 980.0, "spread")
    assert abs(z - 1625.0) < 1e-9
    assert abs(t_l - (25.0 - 9.80665 / 1004.0 * 1625.0)) < 1e-9
    assert abs(p_l - 980.0 * ((t_l + 273.15) / 298.15) ** (1004.0 / 287.05287)) < 1e-6
    z, t_l, p_l = cloud_base(-5.0, -7.0, 700.0, "spread")
    assert abs(z - 250.0) < 1e-9 and abs(t_l - (-5.0 - 9.80665 / 1004.0 * 250.0)) < 1e-9
    assert abs(p_l - 700.0 * ((t_l + 273.15) / 268.15) ** (1004.0 / 287.05287)) < 1e-6


def test_bolton_height_and_pressure():
    # Bolton's T_L (eq. 15, checked above) with Poisson's equation for p, using
    # Bolton's moist exponent 0.2854 (1 - 0.28e-3 r), r in g/kg (Bolton 1980 eq. 7),
    # and the hypsometric equation for z with the mean virtual temperature
    # (Wallace & Hobbs ch. 3), computed here.
    t, td, p = 26.85, 15.57, 1000.0
    z, t_l, p_l = cloud_base(t, td, p, "bolton")
    t_k, td_k = t + 273.15, td + 273.15
    t_l_ref = 1.0 / (1.0 / (td_k - 56.0) + math.log(t_k / td_k) / 800.0) + 56.0
    assert abs(t_l + 273.15 - t_l_ref) < 1e-9
    r_g = mixing_ratio(td, p)                               # g/kg
    kappa = 0.2854 * (1.0 - 0.28e-3 * r_g)
    p_ref = p * (t_l_ref / t_k) ** (1.0 / kappa)
    assert abs(p_l - p_ref) < 1e-6
    r = r_g / 1000.0
    tv = 0.5 * (t_k + t_l_ref) * (1.0 + r / (287.05287 / 461.5)) / (1.0 + r)
    assert abs(z - 287.05287 * tv / 9.80665 * math.log(p / p_ref)) < 1e-6


def test_lambert_w_near_zero_where_exp_underflows():
    # W e^W = x in log form, w + ln(-w) = ln(-x), which holds where exp(w) underflows
    # (identity of the definition); x down to the smallest subnormal float.
    for x in (-5e-324, -1e-320, -1e-310, -1e-300, -1e-200, -1e-30, -4e-25, -1e-20):
        w = lambert_w_minus1(x)
        assert w < -40.0
        assert abs(w + math.log(-w) - math.log(-x)) < 1e-9 * abs(math.log(-x))
