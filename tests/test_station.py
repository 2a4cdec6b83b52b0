"""lapsecalc.station: the weather-station line, checked against outside values."""
import os
import time

import pytest

from lapsecalc.station import station_line, station_values, LINE_KEYS
from refs import hyland_wexler_water_hpa

HERE = os.path.dirname(os.path.abspath(__file__))
STATION_PY = os.path.join(HERE, "..", "lapsecalc", "station.py")

FT = 0.3048  # m, exact by definition


def parse_line(line):
    pairs = [w.split("=", 1) for w in line.split(" ")]
    return [(k, float(v)) for k, v in pairs]


def test_dewpoint_matches_published_value():
    # 30 degC at 50 % RH -> dewpoint 18.45 degC (ASHRAE Hyland-Wexler, computed;
    # REFERENCES.md "Water vapour"). The library's fit is within 0.15 degC of it.
    v = station_values(30.0, 50.0, 1000.0, 100.0)
    assert abs(v["td_c"] - 18.45) < 0.15


def test_qnh_matches_altimeter_relation():
    # QNH 1030 hPa at 2000 m -> station pressure 808.72 hPa (altimeter-setting relation,
    # computed; REFERENCES.md "QNH"). A hundredth of a hPa in the input moves QNH by
    # about 0.013 hPa.
    v = station_values(5.0, 60.0, 808.72, 2000.0)
    assert abs(v["qnh_hpa"] - 1030.0) < 0.02


def test_pressure_altitude_matches_nws_form():
    # 900 hPa -> 3241.8 ft (U.S. National Weather Service form, computed; REFERENCES.md
    # "ICAO standard atmosphere"). That form rounds the exponent, so allow one metre.
    v = station_values(10.0, 50.0, 900.0, 1000.0)
    assert abs(v["pa_m"] - 3241.8 * FT) < 1.0


def _slow_density_altitude_m(t_c, rh_pct, p_hpa):
    # Independent: vapour pressure from the Hyland-Wexler saturation pressure (ASHRAE),
    # density through the virtual temperature (Wallace & Hobbs eq. 3.60), then the ISA
    # troposphere height of that density, H = (T0/L) (1 - (rho/rho0)^0.234969)
    # (REFERENCES.md "Density altitude", ICAO Doc 7488/3 constants).
    e = rh_pct / 100.0 * hyland_wexler_water_hpa(t_c)
    t_k = t_c + 273.15
    tv = t_k / (1.0 - e / p_hpa * (1.0 - 287.05287 / 461.5))
    rho = 100.0 * p_hpa / (287.05287 * tv)
    return 288.15 / 0.0065 * (1.0 - (rho / 1.2250) ** 0.234969)


@pytest.mark.parametrize("t_c, rh_pct, p_hpa, elev_m", [
    (30.0, 40.0, 850.0, 1500.0),     # hot high field
    (-5.0, 80.0, 1005.0, 120.0),     # cold damp lowland
    (22.0, 95.0, 960.0, 450.0),      # humid morning
])
def test_density_altitude_matches_independent_computation(t_c, rh_pct, p_hpa, elev_m):
    v = station_values(t_c, rh_pct, p_hpa, elev_m)
    # Two metres: the two saturation formulas differ by up to 0.4 % (a few hundredths
    # of a hPa of vapour pressure, well under a metre of density altitude).
    assert abs(v["da_m"] - _slow_density_altitude_m(t_c, rh_pct, p_hpa)) < 2.0


def test_dry_limit_density_altitude_check_value():
    # 850 hPa, 30 degC, dry air -> 2296.9 m (REFERENCES.md "Density altitude", computed).
    # 1 % humidity adds about a metre (independent computation above).
    v = station_values(30.0, 1.0, 850.0, 1500.0)
    extra = _slow_density_altitude_m(30.0, 1.0, 850.0) - _slow_density_altitude_m(30.0, 1e-9, 850.0)
    assert 0.0 < extra < 3.0
    assert abs(v["da_m"] - (2296.9 + extra)) < 0.5


def test_cloud_base_matches_romps_check_value():
    # T 300 K, RH 50 %, p 1000 hPa -> LCL 1433.8 m (Romps 2017 formula, computed;
    # REFERENCES.md "Cloud base"). Romps' RH is relative to his own saturation
    # pressure; ours goes through an Alduchov-Eskridge dewpoint, which moves the
    # humidity by a few tenths of a percent: allow 3 m.
    v = station_values(300.0 - 273.15, 50.0, 1000.0, 100.0)
    assert abs(v["cb_agl_m"] - 1433.8) < 3.0


def test_saturated_air_has_cloud_base_at_ground():
    # Saturated air condenses where it is (definition of the LCL).
    v = station_values(8.0, 100.0, 990.0, 50.0)
    assert v["td_c"] == pytest.approx(8.0, abs=1e-9)
    assert v["cb_agl_m"] == 0.0


def test_line_is_values_rounded_in_order():
    t, rh, p, elev = 27.0, 41.0, 967.4, 411.0
    line = station_line(t, rh, p, elev)
    v = station_values(t, rh, p, elev)
    got = parse_line(line)
    assert [k for k, _ in got] == [k for k, _ in LINE_KEYS]
    for (key, x), (_, decimals) in zip(got, LINE_KEYS):
        assert abs(x - v[key]) <= 0.5 * 10.0 ** -decimals + 1e-9, key
    assert len(line) < 100  # fits one small radio frame


def test_line_never_shows_minus_zero():
    line = station_line(-0.04, 100.0, 1013.25, 0.0)
    assert "=-0 " not in line + " " and "=-0.0 " not in line + " "
    assert line.startswith("t_c=0.0 ")


@pytest.mark.parametrize("args, name", [
    ((20.0, 0.0, 1000.0, 100.0), "rh_pct"),
    ((20.0, 101.0, 1000.0, 100.0), "rh_pct"),
    ((75.0, 50.0, 1000.0, 100.0), "t_c"),
    ((20.0, 50.0, 1000.0, 9500.0), "elev_m"),
    ((20.0, 50.0, 1300.0, 100.0), "p_station_hpa"),
    ((20.0, 50.0, 700.0, 100.0), "p_station_hpa"),   # QNH would be about 712 hPa
    ((20.0, "wet", 1000.0, 100.0), "rh_pct"),
])
def test_bad_reading_raises_naming_the_input(args, name):
    with pytest.raises(ValueError) as e:
        station_line(*args)
    assert name in str(e.value)


def _example_block():
    # The firmware example is the indented comment block after "Example firmware loop".
    lines = open(STATION_PY).read().splitlines()
    start = next(i for i, l in enumerate(lines) if "Example firmware loop" in l)
    code = []
    for line in lines[start + 1:]:
        if not line.startswith("#"):
            break
        if line.startswith("#   "):
            code.append(line[4:])
        elif code and line.strip() == "#":
            code.append("")
    return "\n".join(code)


class _Done(Exception):
    pass


def test_firmware_example_runs(monkeypatch):
    readings = [(27.0, 41.0, 967.4), (12.5, 100.6, 1001.0), (20.0, 50.0, 1300.0)]
    sent, slept = [], []

    def read_sensor():
        if not readings:
            raise _Done()
        return readings.pop(0)

    monkeypatch.setattr(time, "sleep", slept.append)
    code = _example_block()
    assert "while True:" in code and "station_line" in code
    with pytest.raises(_Done):
        exec(code, {"read_sensor": read_sensor, "send": sent.append})
    assert sent[0] == station_line(27.0, 41.0, 967.4, 411.0)
    # 100.6 % is taken as 100 %: fog, cloud base at the ground.
    assert dict(parse_line(sent[1]))["cb_agl_m"] == 0.0
    assert sent[2].startswith("err=p_station_hpa=1300") and " " not in sent[2]
    assert slept == [60, 60, 60]

