"""Balloon inputs at the edges of their documented ranges (hotair, hotreport, gasballoon):
the limit itself is taken, a hair beyond it is refused naming the value. Ranges:
hot-air volume 10..20000 m3, weight 1..20000 kg (gas 0.01..20000), maximum envelope
temperature 50..150 degC, working temperature up to the maximum, margin 0..60 K, gas
envelope 0.1..2e6 m3, gas at launch 0.1..1e5 m3 and not over the envelope, purity
0.5..1, superheat 0..50 K."""
import pytest

from lapsecalc.hotreport import hot_air_report
from lapsecalc.gasballoon import gas_report
from test_balloon import dry_isa_column

COL = dry_isa_column()


def hot(**kw):
    args = dict(volume_m3=2800.0, weight_kg=450.0, max_envelope_t_c=120.0)
    args.update(kw)
    return hot_air_report(COL, **args)


def gas(**kw):
    args = dict(gas="helium", purity=0.98, gas_volume_m3=500.0, envelope_m3=1000.0,
                weight_kg=300.0)
    args.update(kw)
    return gas_report(COL, **args)


@pytest.mark.parametrize("call,name,good,bad", [
    (hot, "volume_m3", (10.0, 20000.0), (9.99, 20000.1)),
    (hot, "weight_kg", (1.0, 20000.0), (0.99, 20000.1)),
    (hot, "max_envelope_t_c", (50.0, 150.0), (49.9, 150.1)),
    (hot, "margin_k", (0.0, 60.0), (-0.1, 60.1)),
    (gas, "envelope_m3", (1000.0, 2.0e6), (0.099, 2.0e6 + 1.0)),
    (gas, "gas_volume_m3", (0.1, 1000.0), (0.099, 1000.1)),
    (gas, "weight_kg", (0.01, 20000.0), (0.0099, 20000.1)),
    (gas, "purity", (0.5, 1.0), (0.499, 1.001)),
    (gas, "superheat_k", (0.0, 50.0), (-0.1, 50.1)),
])
def test_balloon_input_edges(call, name, good, bad):
    for v in good:
        assert isinstance(call(**{name: v}), dict)
    for v in bad:
        with pytest.raises(ValueError) as err:
            call(**{name: v})
        assert name in str(err.value)


def test_working_temperature_up_to_the_maximum():
    assert hot(envelope_t_c=120.0)["envelope_t_c"] == 120.0
    assert hot()["envelope_t_c"] == 100.0                 # 120 less the 20 K margin
    with pytest.raises(ValueError) as err:
        hot(envelope_t_c=120.1)
    assert "max_envelope_t_c=120" in str(err.value)


@pytest.mark.parametrize("fn,base,name,good,bad", [
    ("hot_air_lift_per_m3", dict(rho_air_kg_m3=1.2, p_hpa=1000.0, envelope_t_c=100.0),
     "rho_air_kg_m3", (0.001, 2.5), (0.00099, 2.51)),
    ("hot_air_lift_per_m3", dict(rho_air_kg_m3=1.2, p_hpa=1000.0, envelope_t_c=100.0),
     "envelope_t_c", (-90.0, 150.0), (-90.1, 150.1)),
    ("hot_air_lift_per_m3", dict(rho_air_kg_m3=1.2, p_hpa=1000.0, envelope_t_c=100.0),
     "e_hpa", (0.0, 500.0), (-0.1, 500.1)),
    ("envelope_t_for_lift", dict(rho_air_kg_m3=1.2, t_air_c=15.0, lift_per_m3_kg=0.2),
     "t_air_c", (-90.0, 60.0), (-90.1, 60.1)),
    ("envelope_t_for_lift", dict(rho_air_kg_m3=1.2, t_air_c=15.0, lift_per_m3_kg=0.2),
     "lift_per_m3_kg", (0.0, 1.19), (-0.01, 1.21)),
    ("gas_density", dict(p_hpa=1000.0, t_c=15.0, gas="helium"), "t_c", (-90.0, 60.0),
     (-90.1, 60.1)),
    ("gas_density", dict(p_hpa=1000.0, t_c=15.0, gas="helium"), "purity", (0.5, 1.0),
     (0.499, 1.001)),
    ("gas_density", dict(p_hpa=1000.0, t_c=15.0, gas="helium"), "superheat_k", (0.0, 50.0),
     (-0.1, 50.1)),
    ("gas_lift_per_m3", dict(rho_air_kg_m3=1.2, p_hpa=1000.0, t_c=15.0, gas="helium"),
     "rho_air_kg_m3", (0.001, 2.5), (0.00099, 2.51)),
    ("superheat_loss_kg", dict(rho_air_kg_m3=1.2, t_air_c=15.0, gas_volume_m3=100.0,
                               superheat_k=10.0), "t_air_c", (-90.0, 60.0), (-90.1, 60.1)),
    ("superheat_loss_kg", dict(rho_air_kg_m3=1.2, t_air_c=15.0, gas_volume_m3=100.0,
                               superheat_k=10.0), "gas_volume_m3", (0.0, 2.0e6), (-0.1, 2.0e6 + 1)),
    ("superheat_loss_kg", dict(rho_air_kg_m3=1.2, t_air_c=15.0, gas_volume_m3=100.0,
                               superheat_k=10.0), "superheat_k", (0.0, 50.0), (-0.1, 50.1)),
    ("gas_volume_at", dict(v0_m3=100.0, p0_hpa=1000.0, t0_c=15.0, p_hpa=900.0, t_c=10.0),
     "t_c", (-90.0, 150.0), (-90.1, 150.1)),
    ("gas_volume_at", dict(v0_m3=100.0, p0_hpa=1000.0, t0_c=15.0, p_hpa=900.0, t_c=10.0),
     "t0_c", (-90.0, 150.0), (-90.1, 150.1)),
    ("gas_volume_at", dict(v0_m3=100.0, p0_hpa=1000.0, t0_c=15.0, p_hpa=900.0, t_c=10.0),
     "v0_m3", (0.0, 1.0e9), (-0.1, 1.0e9 + 1)),
])
def test_plain_formula_edges(fn, base, name, good, bad):
    from lapsecalc import hotair, gasballoon
    f = getattr(hotair, fn, None) or getattr(gasballoon, fn)
    for v in good:
        f(**dict(base, **{name: v}))
    for v in bad:
        with pytest.raises(ValueError) as err:
            f(**dict(base, **{name: v}))
        assert name in str(err.value)


def test_needed_temperature_that_vanishes_aloft():
    # A load of 99.9 % of the air displaced at the field: it floats at T / (1 - 0.999)
    # there (same pressure inside; ideal gas), but 1000 ft up the air displaced weighs
    # less than the load, so no envelope temperature floats it: no rate per 1000 ft.
    from test_balloon import moist_density
    rho = moist_density(COL, 0.0)
    r = hot_air_report(COL, 1000.0, 0.999 * rho * 1000.0, 150.0)
    assert abs(r["envelope_t_needed_c"] - (288.15 / 0.001 - 273.15)) < 1.0
    assert 1000.0 * moist_density(COL, 304.8) < 0.999 * rho * 1000.0
    assert r["envelope_t_needed_per_1000ft_c"] is None


def test_superheat_note_only_with_superheat():
    assert not any("superheat goes" in n for n in gas()["notes"])
    assert any("superheat goes" in n for n in gas(superheat_k=5.0)["notes"])
    assert any("superheat goes" in n for n in gas(superheat_k=0.005)["notes"])


def test_hot_air_warnings_at_their_edges():
    # The warnings of a 1000 kg load at 500 m MSL, working at 95 degC under a 120 degC
    # maximum: over by the float-noise allowance (1e-6 of the weight) takes off; over
    # by exactly 1 kg says "1 kg", under 1 kg "less than 1"; needing exactly the
    # maximum is above the working temperature, not above the maximum.
    from lapsecalc.hotreport import _warnings
    assert _warnings(1000.0, 500.0, 95.0, 120.0, 90.0, -(1e-6 * 1000.0)) == []
    heavy = "Too heavy to take off at the working envelope temperature 95 degC: %s kg over."
    assert _warnings(1000.0, 500.0, 95.0, 120.0, 90.0, -1.0) == [heavy % "1"]
    assert _warnings(1000.0, 500.0, 95.0, 120.0, 90.0, -0.5) == [heavy % "less than 1"]
    assert _warnings(1000.0, 500.0, 95.0, 120.0, 120.0, 5.0) == [
        "Floating 1000 kg at 500 m MSL needs 120.0 degC in the envelope, above the working"
        " temperature 95 degC."]
    assert _warnings(1000.0, 500.0, 95.0, 120.0, 120.1, 5.0) == [
        "Floating 1000 kg at 500 m MSL needs 120.1 degC in the envelope, above the maximum"
        " envelope temperature 120 degC you set."]
