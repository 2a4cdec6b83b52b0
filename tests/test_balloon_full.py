"""A gas balloon launched full (gas volume = envelope at the field): full at the field
itself, venting from the first metre up, and floating where the full envelope's lift
equals the weight. Independent lift per m3 from test_balloon.py (ideal gas with the
virtual temperature, molar masses; ICAO Doc 7488/3, Wallace & Hobbs); heights by
bisection (refs.py) on the closed-form ISA column."""
from lapsecalc.gasballoon import gas_report
from refs import bisect
from test_balloon import dry_isa_column, gas_lift_m3, M_HE, M_H2


def test_gas_balloon_launched_full():
    col = dry_isa_column()
    v_env = 1000.0
    for gas, m_gas in (("helium", M_HE), ("hydrogen", M_H2)):
        w = 0.8 * v_env * gas_lift_m3(col, 0.0, m_gas, 0.98)      # 20 % free lift
        r = gas_report(col, gas, 0.98, v_env, v_env, w)
        assert r["full_msl_m"] == 0.0 and abs(r["full_p_hpa"] - 1013.25) < 1e-9
        assert r["full_at_z"] is True
        assert abs(r["gross_lift_kg"] - v_env * gas_lift_m3(col, 0.0, m_gas, 0.98)) < 0.01
        assert abs(r["free_lift_kg"] - 0.25 * w) < 0.01
        # Full all the way up: it floats where V_env * lift(z) = w.
        z = bisect(lambda h: w - v_env * gas_lift_m3(col, h, m_gas, 0.98), 0.0, 11000.0)
        assert 1000.0 < z < 5000.0
        assert abs(r["float_msl_m"] - z) < 1.0
        # Above the field the envelope stays full; the gross lift is the full envelope's.
        r2 = gas_report(col, gas, 0.98, v_env, v_env, w, 1500.0)
        assert r2["full_at_z"] is True
        assert abs(r2["gross_lift_kg"] - v_env * gas_lift_m3(col, 1500.0, m_gas, 0.98)) < 0.01
