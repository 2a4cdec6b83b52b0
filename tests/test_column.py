"""The air column: hydrostatics per layer, levels, report keys, bad input."""
import math

import pytest
from hypothesis import given, strategies as st

from lapsecalc import Column, isa, station_pressure, density_altitude, air_density, cloud_base
from lapsecalc.adiabats import saturated_ascent
from lapsecalc import parcel

G0, RD = 9.80665, 287.05287  # ICAO Doc 7488/3


def _hydrostatic_euler(col, z_to, dz=1.0):
    # Independent reference: dp/dz = -g p / (R T) with T from t_at, midpoint steps.
    z, p = col.elev_m, col.p_hpa
    n = int(math.ceil((z_to - z) / dz))
    if n == 0:
        return p
    h = (z_to - z) / n
    for _ in range(n):
        tm = col.t_at(z + 0.5 * h) + 273.15
        p *= math.exp(-G0 * h / (RD * tm))
        z += h
    return p


LAYERED = [(300.0, -8.0), (1200.0, 0.0), (4000.0, 7.0), (None, 5.5)]


def test_layered_pressure_against_integration():
    col = Column(4.0, 1.0, 950.0, 500.0, LAYERED, top_m=12000.0)
    for z in (500.0, 650.0, 800.0, 1300.0, 1700.0, 3000.0, 4500.0, 9000.0, 12000.0):
        assert abs(col.p_at(z) - _hydrostatic_euler(col, z)) < 0.01


def test_layered_temperatures():
    col = Column(4.0, 1.0, 950.0, 500.0, LAYERED, top_m=12000.0)
    assert abs(col.t_at(800.0) - 6.4) < 1e-9      # inversion of 8 K/km over 300 m
    assert abs(col.t_at(1700.0) - 6.4) < 1e-9     # isothermal to 1200 m agl
    assert abs(col.t_at(4500.0) - (6.4 - 7.0 * 2.8)) < 1e-9


def test_isa_column_matches_isa():
    # A 6.5 K/km column from 15 degC, 1013.25 hPa at sea level is the ISA troposphere
    # (ICAO Doc 7488/3).
    col = Column(15.0, 5.0, 1013.25, 0.0, 6.5, top_m=11000.0)
    for h in (0.0, 1000.0, 5000.0, 11000.0):
        t, p, _ = isa(h)
        assert abs(col.t_at(h) - t) < 1e-9
        assert abs(col.p_at(h) / p - 1) < 1e-9


@given(st.floats(0.0, 1500.0), st.floats(0.0, 1.0))
def test_z_at_inverts_p_at(elev, frac):
    col = Column(10.0, 2.0, 900.0, elev, LAYERED, top_m=15000.0)
    z = elev + frac * (col.top_m - elev)
    assert abs(col.z_at(col.p_at(z)) - z) < 0.01


def test_from_qnh():
    col = Column.from_qnh(20.0, 10.0, 1020.0, 800.0)
    assert abs(col.p_hpa - station_pressure(1020.0, 800.0)) < 1e-9
    assert abs(col.report()["qnh_hpa"] - 1020.0) < 0.001


def test_freezing_levels_simple():
    # 6.5 K/km from 13 degC at 200 m: 0 degC at 2200 m, -10 at 3738.5, -20 at 5276.9.
    col = Column(13.0, 5.0, 990.0, 200.0)
    r = col.report()
    assert abs(r["freezing_level_msl_m"] - 2200.0) < 1e-6
    assert abs(r["minus10_level_msl_m"] - (200.0 + 23000.0 / 6.5)) < 1e-6
    assert abs(r["minus20_level_msl_m"] - (200.0 + 33000.0 / 6.5)) < 1e-6
    assert r["freezing_levels_msl_m"] == [r["freezing_level_msl_m"]]
    assert r["warm_layer_aloft"] is False


def test_warm_layer_over_freezing_surface():
    # -2 degC at the surface, an inversion to +3 degC, then cooling: the freezing-rain
    # set-up must show every crossing and the freezing level at the surface.
    col = Column(-2.0, -3.0, 980.0, 100.0, [(500.0, -10.0), (None, 6.5)])
    r = col.report()
    assert r["freezing_level_msl_m"] == 100.0
    assert len(r["freezing_levels_msl_m"]) == 2
    assert abs(r["freezing_levels_msl_m"][0] - 300.0) < 1e-6
    assert abs(r["freezing_levels_msl_m"][1] - (600.0 + 3000.0 / 6.5)) < 1e-6
    assert r["warm_layer_aloft"] is True


def test_surface_below_minus20():
    col = Column(-25.0, -28.0, 1000.0, 0.0)
    r = col.report()
    assert r["freezing_level_msl_m"] == 0.0 and r["minus20_level_msl_m"] == 0.0
    assert r["freezing_levels_msl_m"] == []


def test_report_field_values():
    col = Column(24.0, 14.0, 960.0, 420.0)
    r = col.report()
    assert abs(r["density_altitude_m"] - density_altitude(960.0, 24.0, 14.0)) < 1e-6
    assert abs(r["air_density_kg_m3"] - air_density(960.0, 24.0, 14.0)) < 1e-9
    z, t, p = cloud_base(24.0, 14.0, 960.0)
    assert r["cloud_base_agl_m"] == z and r["cloud_base_msl_m"] == 420.0 + z
    assert r["lcl_t_c"] == t and r["lcl_p_hpa"] == p
    for key in ("cloud_base_agl_m", "cloud_base_msl_m", "lcl_t_c", "lcl_p_hpa",
                "freezing_level_msl_m", "minus10_level_msl_m", "minus20_level_msl_m",
                "parcel_freezing_level_msl_m", "pressure_altitude_m", "density_altitude_m",
                "air_density_kg_m3", "qnh_hpa", "station_pressure_hpa"):
        assert isinstance(r[key], float), key


def test_parcel_freezing_level_against_independent_path():
    # Dry (Poisson) to the LCL, then saturated_ascent; find 0 degC by bisection on height.
    col = Column(22.0, 12.0, 970.0, 300.0, 7.0)
    lcl_agl, t_l, _ = cloud_base(22.0, 12.0, 970.0)
    z_l = 300.0 + lcl_agl
    p_l = col.p_at(z_l)
    t_l = (22.0 + 273.15) * (p_l / 970.0) ** (RD / 1004.0) - 273.15

    def tp(z):
        return saturated_ascent(t_l, p_l, col.p_at(z), dlnp=0.005)

    lo, hi = z_l, col.top_m
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if tp(mid) > 0.0 else (lo, mid)
    assert abs(col.report()["parcel_freezing_level_msl_m"] - lo) < 5.0


def test_density_altitude_aloft():
    col = Column(30.0, 5.0, 1000.0, 100.0)
    assert abs(col.density_altitude_at(100.0) - col.report()["density_altitude_m"]) < 1e-9
    assert col.density_altitude_at(3000.0) > col.density_altitude_at(2000.0) + 900.0


def test_steep_elr_ends_at_coldest_allowed():
    # 9 K/km from 20 degC reaches -90 degC at 12222 m: with the tropopause turned off
    # the column ends there, and says so.
    col = Column(20.0, 10.0, 1000.0, 0.0, 9.0, tropopause_m=None)
    assert abs(col.top_m - 110000.0 / 9.0) < 1e-6
    assert abs(col.t_at(col.top_m) + 90.0) < 1e-9
    w = col.report()["warnings"][0]
    assert "12222.2 m" in w and "-90 degC" in w and "16000 m" in w and "tropopause" in w
    assert Column(20.0, 10.0, 1000.0, 0.0, 9.0, top_m=10000.0).top_m == 10000.0
    # With the default tropopause (11000 m) it is isothermal above -79 degC instead.
    col = Column(20.0, 10.0, 1000.0, 0.0, 9.0)
    assert col.top_m == 16000.0 and abs(col.t_at(16000.0) + 79.0) < 1e-9


def test_a_column_cut_at_the_coldest_allowed_is_never_colder_at_its_top():
    # Where the ELR takes the air to -90 degC the column ends; where rounding made the
    # top's temperature -90.00000000000003 degC (which the balloon code's range check
    # refused; found by hypothesis: helium, 9.0625 K/km), a centimetre lower.
    from lapsecalc.gasballoon import gas_density
    # (8.015625 K/km from 42.75 degC is one of those a search of the old cut found.)
    cut = 0
    for i in range(8):
        lapse = 8.0 + i / 64.0
        for t in (42.75, 44.5, 46.75, 47.25, 20.0):
            col = Column(t, t - 20.0, 1000.0, 0.0, lapse, 32000.0, tropopause_m=None)
            if col.end_why is None or "-90" not in col.end_why:
                continue
            cut += 1
            t_top = col.t_at(col.top_m)
            assert -90.0 <= t_top < -89.999, (lapse, t)
            assert gas_density(col.p_at(col.top_m), t_top, "helium") > 0.0
    assert cut == 40  # every one of them ends at -90 degC, inside 32 km


def test_an_elr_reaching_exactly_minus_90_is_not_cut_there():
    # -30 degC at 6 K/km is -90 degC (to the last bit in floats) at 10000 m: the
    # coldest handled, not past it. With the tropopause there the air above stays at
    # -90 degC up to the top asked; without it the air would cool past it, and the
    # column ends at 10000 m.
    col = Column(-30.0, -35.0, 1000.0, 0.0, 6.0, 16000.0, tropopause_m=10000.0)
    assert col.top_m == 16000.0 and col.end_why is None and col.tropopause_m == 10000.0
    assert col.t_at(10000.0) == -90.0 and col.t_at(16000.0) == -90.0
    col = Column(-30.0, -35.0, 1000.0, 0.0, 6.0, 16000.0, tropopause_m=None)
    assert col.top_m == 10000.0 and "-90 degC" in col.end_why


def test_a_cut_layer_is_kept_only_when_over_a_metre_deep():
    # 6 K/km from a field at 1000 m: -89.994 degC reaches -90 degC exactly 1 m up (in
    # floats: a search of the cut found it), no layer over 1 m deep, so no column;
    # -89.9939 degC reaches it 1.0167 m up (0.0061 K at 6 K/km), a column that thin.
    with pytest.raises(ValueError) as err:
        Column(-89.994, -89.994, 900.0, 1000.0, 6.0, 12000.0)
    assert "leaves no column above the surface" in str(err.value)
    col = Column(-89.9939, -89.9939, 900.0, 1000.0, 6.0, 12000.0)
    assert col.top_m - 1000.0 == pytest.approx(0.0061 / 0.006, abs=1e-9)
    assert "-90 degC" in col.end_why and col.t_at(col.top_m) == pytest.approx(-90.0)


def test_inversion_too_warm_is_refused():
    with pytest.raises(ValueError) as err:
        Column(40.0, 10.0, 1000.0, 0.0, [(2000.0, -15.0), (None, 6.5)])
    assert "60 degC" in str(err.value) and "allowed" in str(err.value)


def test_last_layer_top_ends_column():
    col = Column(20.0, 10.0, 1000.0, 100.0, [(500.0, -3.0), (3000.0, 6.0)])
    assert col.top_m == 3100.0
    with pytest.raises(ValueError):
        col.t_at(3200.0)


@pytest.mark.parametrize("kwargs,word", [
    (dict(lapse=31.0), "lapse=31"),
    (dict(lapse=[(500.0, 6.0), (400.0, 6.0)]), "top_agl_m=400"),
    (dict(lapse=[(None, 6.0), (400.0, 6.0)]), "only the last layer"),
    (dict(lapse=[]), "empty"),
    (dict(lapse=[(500.0, -40.0)]), "rate=-40"),
    (dict(lapse="steep"), "lapse='steep'"),
    (dict(top_m=100.0), "top_m=100"),
])
def test_bad_column(kwargs, word):
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 1000.0, 50.0, **kwargs)
    assert word in str(err.value)


@pytest.mark.parametrize("args,word", [((15.0, 16.0, 1000.0, 0.0), "td_c=16"),
                                       ((15.0, 5.0, 1000.0, 9500.0), "elev_m=9500"),
                                       ((15.0, 5.0, float("nan"), 0.0), "p_hpa=nan")])
def test_bad_observation(args, word):
    with pytest.raises(ValueError) as err:
        Column(*args)
    assert word in str(err.value) and "allowed" in str(err.value)


def test_outside_column_queries():
    col = Column(15.0, 5.0, 1000.0, 50.0, top_m=8000.0)
    for z in (0.0, 8001.0):
        with pytest.raises(ValueError) as err:
            col.t_at(z)
        assert "z_m=" in str(err.value) and "allowed" in str(err.value)
    with pytest.raises(ValueError):
        col.z_at(1010.0)


def test_parcel_path_levels_include_boundaries():
    col = Column(25.0, 15.0, 1000.0, 0.0, [(800.0, 9.0), (None, 6.5)], top_m=9000.0)
    z_l = cloud_base(25.0, 15.0, 1000.0)[0]
    levels = parcel.path(col, z_l)
    zs = [lv[0] for lv in levels]
    assert zs[0] == 0.0 and zs[-1] == 9000.0 and 800.0 in zs and z_l in zs
    assert all(b - a <= parcel.MAX_STEP_M + 1e-9 for a, b in zip(zs, zs[1:]))


@pytest.mark.parametrize("args", [
    (27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)]),
    (22.0, 12.0, 1005.0, 150.0, 6.5),
    (35.0, 24.0, 1008.0, 20.0, [(1000.0, 9.0), (3000.0, 7.0), (None, 6.0)], 32000.0),
    (-5.0, -7.0, 1020.0, 50.0, [(400.0, -12.0), (None, 6.5)], 8000.0),
])
def test_report_keys_are_the_keys_report_sets_first(args):
    # report() makes its dict from report_keys() (room for every key at the start, for
    # a board's heap): each key once, every one set by the core, the hazard and
    # altimetry keys after them (CPython keeps the insertion order).
    from lapsecalc.column import report_keys
    keys = report_keys()
    assert len(set(keys)) == len(keys) == 46
    r = Column.from_qnh(*args).report(2.0)
    assert list(r)[:len(keys)] == keys
    extra = set(r) - set(keys)
    altimetry = {"indicated_altitude_m", "isa_deviation_c", "density_altitude_dry_m"}
    assert altimetry < extra  # and the hazard keys (lapsecalc.hazards) on CPython
    r = Column.from_qnh(*args).report(0.0, altimetry=False)
    assert "indicated_altitude_m" not in r
