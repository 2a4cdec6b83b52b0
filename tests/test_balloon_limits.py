"""Balloon inputs at the edges of their documented ranges (balloon.py docstrings):
the limit itself is taken, a hair beyond it is refused naming the value. Ranges:
hot-air volume 10..20000 m3, weight 1..20000 kg (gas 0.01..20000), maximum envelope
temperature 50..150 degC, working temperature up to the maximum, margin 0..60 K, gas
envelope 0.1..2e6 m3, gas at launch 0.1..1e5 m3 and not over the envelope, purity
0.5..1, superheat 0..50 K."""
import pytest

from lapsecalc.balloon import hot_air_report, gas_report
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
