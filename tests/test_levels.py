"""settings.parse_level: the level tokens of the interpreter (height with unit, flight
level, pressure), shared by the words that take a level."""
import pytest

from lapsecalc.settings import parse_level
from lapsecalc.state import fl_pressure_hpa


@pytest.mark.parametrize("tok,kind,value", [
    ("3000ft", "z", 914.4),          # 1 ft = 0.3048 m exactly (REFERENCES.md, Units)
    ("914m", "z", 914.0), ("2.5km", "z", 2500.0),
    ("FL180", "fl", 180), ("fl85", "fl", 85),
    ("700hPa", "p", 700.0), ("700mb", "p", 700.0),
    ("29.92inHg", "p", 29.92 * 33.8639),   # 1 inHg = 33.8639 hPa (REFERENCES.md, Units)
])
def test_levels_as_typed(tok, kind, value):
    k, v = parse_level(tok)
    assert k == kind and abs(v - value) < 1e-9


def test_flight_level_pressure():
    # FL180 is pressure altitude 18000 ft: the NWS form PA_ft = 145366.45 (1 -
    # (p/1013.25)^0.190284) (REFERENCES.md) gives it back within its rounded exponent
    # (10 ft); the library's exact inverse (pressure_altitude, tested on its own) to 1 mm.
    from lapsecalc import pressure_altitude
    p = fl_pressure_hpa(180)
    assert abs(145366.45 * (1.0 - (p / 1013.25) ** 0.190284) - 18000.0) < 10.0
    assert abs(pressure_altitude(p) - 18000.0 * 0.3048) < 0.001
    assert fl_pressure_hpa(0) == 1013.25


@pytest.mark.parametrize("tok", ["3000", "FLx", "FL1000", "15C", "abc", "FL", "hPa"])
def test_not_a_level(tok):
    with pytest.raises(ValueError) as err:
        parse_level(tok)
    assert "'%s'" % tok in str(err.value) and "accepted" in str(err.value)
