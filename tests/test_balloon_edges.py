"""Balloon figures at their edges: the height solver on functions whose root is known,
the oxygen note above the ISA table's 32 km, and a weight exactly equal to the lift."""
import math

import pytest

from lapsecalc.column import Column
from lapsecalc.balloon import first_drop
from lapsecalc.hotreport import hot_air_report
from lapsecalc.gasballoon import gas_report
from test_balloon import dry_isa_column, hot_lift_m3

# first_drop narrows its bracket below 0.1 m and returns the middle (balloon.py
# docstring): within 0.05 m of the root, plus rounding.
ROOT_TOL_M = 0.051


def _shapes(root):
    # Functions falling through zero at root (m), known exactly: concave, convex, a flat
    # cubic and a line. Regula falsi keeps one end of the bracket on a curved function;
    # the Illinois step must move it, or the bracket never narrows (Dowell & Jarratt 1971).
    return (("concave", lambda z: 1.0 - math.exp((z - root) / 50.0)),
            ("convex", lambda z: math.exp(-(z - root) / 50.0) - 1.0),
            ("cubic", lambda z: (root - z) ** 3),
            ("line", lambda z: root - z))


@pytest.mark.parametrize("root", [1234.567, 5432.1, 10999.0, 0.04])
def test_first_drop_finds_known_roots(root):
    col = dry_isa_column()
    for name, f in _shapes(root):
        z = first_drop(col, f, 0.0)
        assert abs(z - root) < ROOT_TOL_M, (name, z)


def test_first_drop_none_when_it_never_falls_and_refuses_nan():
    col = dry_isa_column(5000.0)
    assert first_drop(col, lambda z: 1.0 + z, 0.0) is None
    # Zero is not below zero: a function that touches zero at the top stays "at or above".
    assert first_drop(col, lambda z: 5000.0 - z, 0.0) is None
    with pytest.raises(ValueError, match="not finite"):
        first_drop(col, lambda z: float("nan"), 0.0)
    with pytest.raises(ValueError, match="not finite"):
        first_drop(col, lambda z: 1.0 if z < 100.0 else float("nan"), 0.0)


def test_first_drop_in_a_layered_column_starts_where_asked():
    # Scan steps end at every layer top; a root just above a layer top and a start
    # height above an earlier root.
    col = Column(15.0, -90.0, 1013.25, 0.0, [(700.0, -2.0), (2300.0, 6.5), (None, 8.0)],
                 9000.0)
    for root in (700.02, 2299.97, 2300.3, 8999.0):
        assert abs(first_drop(col, lambda z: root - z, 0.0) - root) < ROOT_TOL_M
    # cos(z / 600 m) falls through zero at 600 (pi/2 + 2 k pi) m: 942.5 m, 4712.4 m.
    f = lambda z: math.cos(z / 600.0)
    assert abs(first_drop(col, f, 0.0) - 300.0 * math.pi) < ROOT_TOL_M
    assert abs(first_drop(col, f, 3000.0) - 600.0 * 2.5 * math.pi) < ROOT_TOL_M


def test_oxygen_note_above_the_isa_table():
    # A column colder than ISA aloft (0 degC at sea level, 6.5 K/km to 11 km, then
    # isothermal at -71.5 degC) has less than the ISA's 8.68 hPa at 32 km (ICAO Doc
    # 7488/3: 8.68 hPa is 32000 m), beyond the pressure-altitude scale: a height there
    # is above every oxygen height (common practice: 13000 ft always).
    col = Column(0.0, -90.0, 1013.25, 0.0, [(11000.0, 6.5), (None, 0.0)], 32000.0)
    assert col.p_at(32000.0) < 8.68
    r = hot_air_report(col, 20000.0, 1.0, 150.0, None, 32000.0)
    assert r["oxygen_note"] is not None and "passes 13000 ft" in r["oxygen_note"]


def test_weight_exactly_the_gross_lift():
    # A hot-air balloon weighing exactly its gross lift at the working temperature
    # floats there: the temperature it needs is the working one, not above it.
    col = dry_isa_column()
    w = hot_air_report(col, 2800.0, 1.0, 120.0)["gross_lift_kg"]
    # The gross lift itself, independently: V rho (1 - T / T_env) (ideal gas).
    assert abs(w - 2800.0 * hot_lift_m3(col, 0.0, 100.0)) < 1e-6
    r = hot_air_report(col, 2800.0, w, 120.0)
    # T / (1 - lift / rho) with lift = rho (1 - T / Te) is Te again, here to the last bit.
    assert r["envelope_t_needed_c"] == 100.0
    assert not any("above the working" in x for x in r["warnings"])
    assert not r["envelope_t_needed_over_working"]
    assert r["free_lift_kg"] == 0.0 and abs(r["payload_kg"]) < 1e-9
    # Weighing exactly the lift the ceiling search reads at the field (its closed form,
    # to the last bit), it still takes off: its ceiling is the field itself (within the
    # search's 0.1 m), not "cannot take off".
    from lapsecalc.hotair import _hot_lift
    w = 2800.0 * _hot_lift(col, col.elev_m, 100.0)
    r = hot_air_report(col, 2800.0, w, 120.0)
    assert r["ceiling_msl_m"] is not None and r["ceiling_msl_m"] < col.elev_m + 0.1
    assert not r["ceiling_above_top"]
    # A gas balloon weighing exactly its gross lift at the field lifts off (free lift
    # 0 is not "less than the weight").
    g = gas_report(col, "helium", 1.0, 500.0, 1000.0, 1.0)["gross_lift_kg"]
    r = gas_report(col, "helium", 1.0, 500.0, 1000.0, g)
    assert r["free_lift_kg"] == 0.0
    assert not any("No lift-off" in x for x in r["warnings"])
    assert r["float_msl_m"] is not None and r["float_msl_m"] >= r["full_msl_m"]
    # A gram more and it stays on the ground.
    r = gas_report(col, "helium", 1.0, 500.0, 1000.0, g + 0.001)
    assert any("No lift-off" in x for x in r["warnings"]) and r["float_msl_m"] is None


def test_half_a_kilogram_of_payload_is_no_warning():
    # A balloon half a kilogram under its gross lift at the field takes off: no
    # "too heavy" warning (the gross lift checked against V rho (1 - T / T_env)).
    col = dry_isa_column()
    g = hot_air_report(col, 2800.0, 1.0, 120.0)["gross_lift_kg"]
    assert abs(g - 2800.0 * hot_lift_m3(col, 0.0, 100.0)) < 1e-6
    r = hot_air_report(col, 2800.0, g - 0.5, 120.0)
    assert abs(r["payload_kg"] - 0.5) < 1e-9
    assert not any("Too heavy" in x for x in r["warnings"])
    r = hot_air_report(col, 2800.0, g + 0.6, 120.0)
    assert any("Too heavy" in x and "1 kg over" in x for x in r["warnings"])


def test_a_weight_equal_to_the_gross_lift_takes_off():
    # Gross lift at the working temperature (100 degC, ISA at sea level, ICAO Doc
    # 7488/3) written out in the test: a weight equal to it is no overload, whatever
    # the last bit of the two lift sums; a third of a kilogram more is, and it is not
    # shown as "0 kg".
    col = dry_isa_column()
    g = 2800.0 * hot_lift_m3(col, 0.0, 100.0)
    g_report = hot_air_report(col, 2800.0, 1.0, 120.0)["gross_lift_kg"]
    # Equal to the lift either way it is summed, or 10 g over it (rounding allowance,
    # a millionth of the weight): no overload.
    for w in (g, g_report, g + 1e-5):
        r = hot_air_report(col, 2800.0, w, 120.0)
        assert abs(r["payload_kg"]) < 2e-5
        assert not any("Too heavy" in x for x in r["warnings"]), w
    r = hot_air_report(col, 2800.0, g + 0.3, 120.0)
    assert any("Too heavy" in x and "less than 1 kg over" in x for x in r["warnings"])
    assert not any("0 kg over" in x for x in r["warnings"])
    r = hot_air_report(col, 2800.0, g + 1.005, 120.0)
    assert any("Too heavy" in x and ": 1 kg over" in x for x in r["warnings"])


def test_the_working_note_gives_the_margin_under_the_maximum():
    # The margin stated is the maximum less the working temperature: 120 - 95 = 25 K
    # set by the pilot, 120 - 100 = 20 K by default (the default 20 K margin, common
    # practice, from memory).
    col = dry_isa_column()
    note = hot_air_report(col, 2800.0, 500.0, 120.0, 95.0)["notes"][0]
    assert "95 degC (set by you, 25 K under the maximum)" in note
    assert "The 120 degC maximum" in note
    note = hot_air_report(col, 2800.0, 500.0, 120.0)["notes"][0]
    assert "100 degC (the default, 20 K under the maximum)" in note


def test_balloon_air_takes_the_humidity_aloft_the_column_has():
    # With dewpoints aloft (an invented moist layer at 1500 m over a dry field) the
    # balloon's ambient air is the column's own: the same density as Column.density_at,
    # which differs from the surface mixing ratio carried up.
    moist = Column(25.0, 2.0, 1000.0, 200.0, 6.5, top_m=8000.0,
                   aloft=[(1500.0, 16.0, 15.0), (3000.0, 6.0, 0.0)])
    for z in (200.0, 1000.0, 1500.0, 2200.0, 5000.0):
        rep = hot_air_report(moist, 2800.0, 450.0, 120.0, 100.0, z)
        assert rep["ambient_density_kg_m3"] == pytest.approx(moist.density_at(z), rel=1e-12)
        rep = gas_report(moist, "helium", 1.0, 6.0, 10.0, 4.0, z)
        assert rep["ambient_density_kg_m3"] == pytest.approx(moist.density_at(z), rel=1e-12)
    # At 1500 m the air holds much more vapour than the dry field's mixing ratio
    # carried up (EPS 0.622, common practice).
    r_surface = moist.r_kg_kg
    p = moist.p_at(1500.0)
    e_surface = r_surface * p / (0.622 + r_surface)
    assert moist.vapour_pressure_at(1500.0) > 2.0 * e_surface


def test_working_temperature_at_the_maximum_gives_one_ceiling():
    # With the working temperature at the maximum (no margin) the limit figures are the
    # working ones: the limit ceiling is the working ceiling, found to the same 0.1 m
    # (the limit search starts just under the working ceiling, never above it).
    for col in (dry_isa_column(16000.0), Column(27.0, 13.0, 967.4, 411.48, 6.5, 16000)):
        for w in (300.0, 700.0):
            r = hot_air_report(col, 2800.0, w, 120.0, 120.0)
            assert r["ceiling_msl_m"] is not None and not r["limit_ceiling_above_top"]
            assert abs(r["limit_ceiling_msl_m"] - r["ceiling_msl_m"]) < 0.1
            assert r["limit_payload_kg"] == r["payload_kg"]


def test_a_gas_balloon_too_heavy_for_its_full_envelope_floats_at_the_pressure_height():
    # In a dry ISA column the gas's gross lift hardly changes up to the pressure height
    # (ideal gas: displaced air and gas scale alike), here it is 0.0007 kg less there
    # than at the field. A weight between the two lifts off and stops where the
    # envelope becomes full: its float height is the pressure height itself.
    col = dry_isa_column()
    r = gas_report(col, "helium", 1.0, 500.0, 1000.0, 1.0)
    full = r["full_msl_m"]
    g_field = r["gross_lift_kg"]
    g_full = gas_report(col, "helium", 1.0, 500.0, 1000.0, 1.0, full)["gross_lift_kg"]
    assert 0.0 < g_field - g_full < 0.01
    r = gas_report(col, "helium", 1.0, 500.0, 1000.0, 0.5 * (g_field + g_full))
    assert not any("No lift-off" in x for x in r["warnings"])
    assert r["float_msl_m"] == full and not r["float_above_top"]
