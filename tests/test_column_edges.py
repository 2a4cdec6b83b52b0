"""The column at its edges, against closed forms for linear layers (Wallace & Hobbs,
Atmospheric Science, 2nd ed., ch. 3: T = T0 - gamma dz, p = p0 (T/T0)^(g/(Rd gamma)))
and published formulas coded in refs.py. The columns are invented."""
import pytest

from lapsecalc import Column
from refs import ae_es_hpa

G0, RD, RV = 9.80665, 287.05287, 461.5   # ICAO Doc 7488/3; Wallace & Hobbs
EPS = RD / RV


def _p(p0, t0_c, rate_k_per_km, dz):
    g = rate_k_per_km / 1000.0
    t0 = t0_c + 273.15
    return p0 * ((t0 - g * dz) / t0) ** (G0 / (RD * g))


def test_ends_take_a_millimetre_of_rounding():
    col = Column(15.0, 5.0, 1000.0, 200.0, 6.5, top_m=5000.0)
    assert col.t_at(200.0 - 0.0009) == 15.0
    assert col.t_at(5000.0 + 0.0009) == pytest.approx(15.0 - 6.5 * 4.8)
    for z in (200.0 - 0.0011, 5000.0 + 0.0011):
        with pytest.raises(ValueError):
            col.t_at(z)


def test_layer_above_the_top_is_cut_at_the_top():
    col = Column(20.0, 10.0, 1000.0, 0.0, [(5000.0, 6.5), (None, 7.0)], top_m=3000.0)
    assert col.top_m == 3000.0 and len(col.layers) == 1
    assert col.t_at(3000.0) == pytest.approx(20.0 - 19.5)
    assert col.p_at(3000.0) == pytest.approx(_p(1000.0, 20.0, 6.5, 3000.0), rel=1e-12)


def test_warming_past_60_is_refused_naming_the_height():
    # 40 degC warming at 15 K/km reaches 60 degC 1333 m above the field.
    with pytest.raises(ValueError) as err:
        Column(40.0, 10.0, 1000.0, 100.0, [(2000.0, -15.0), (None, 6.5)])
    assert "at 1433.33 m MSL" in str(err.value)


def test_vapour_aloft_is_the_surface_mixing_ratio_capped_at_saturation():
    # r = eps e / (p - e) carried up (e = r p / (eps + r)), never above e_s(T) (AE96).
    col = Column(25.0, 22.0, 1000.0, 0.0, 9.0, top_m=8000.0)
    e0 = ae_es_hpa(22.0)
    r = EPS * e0 / (1000.0 - e0)
    capped = free = 0
    for z in (0.0, 300.0, 1000.0, 3000.0, 6000.0):
        p = _p(1000.0, 25.0, 9.0, z)
        t = 25.0 - 9.0 * z / 1000.0
        want = min(r * p / (EPS + r), ae_es_hpa(t))
        assert abs(col.vapour_pressure_at(z) - want) < 1e-9 * want + 1e-12
        capped += want < r * p / (EPS + r)
        free += want == r * p / (EPS + r)
        # Ideal gas with the virtual temperature (Wallace & Hobbs eq. 3.60).
        tv = (t + 273.15) / (1.0 - want / p * (1.0 - EPS))
        assert abs(col.density_at(z) - 100.0 * p / (RD * tv)) < 1e-9
    assert capped >= 2 and free >= 2


def test_cloud_base_above_the_column_top():
    # Very dry air: the LCL (about 6 km) is above a 5.9 km column, so no cloud base MSL
    # in the column (the height above the field is still given), no free convection,
    # and the lifted index is the dry parcel's: Te(500) - Poisson(500), closed forms.
    r = Column(30.0, -20.0, 1000.0, 0.0, 6.5, top_m=5900.0).report()
    assert r["cloud_base_msl_m"] is None and r["cloud_base_agl_m"] > 5900.0
    assert (r["lfc_msl_m"], r["el_msl_m"], r["el_above_top"]) == (None, None, False)
    assert r["cape_j_kg"] == 0.0 and r["cin_j_kg"] is None
    assert r["icing_band_bottom_msl_m"] is None
    t500 = 303.15 * 0.5 ** (RD * 0.0065 / G0)
    li = t500 - 303.15 * 0.5 ** (RD / 1004.0)
    assert abs(r["lifted_index_c"] - li) < 0.01


def test_cloud_base_exactly_at_the_column_top_is_in_the_column():
    # A column whose top is the cloud base itself (elevation plus the LCL the report
    # computes, to the last bit): the base is in the column (the top belongs to it), so
    # no "above the column top" for it; a centimetre lower, it is above the top.
    from lapsecalc import cloud_base
    for elev in (0.0, 300.0):
        top = elev + cloud_base(20.0, 5.0, 1000.0)[0]
        r = Column(20.0, 5.0, 1000.0, elev, 6.5, top_m=top).report()
        assert r["cloud_base_msl_m"] == top and r["top_msl_m"] == top
        assert "cloud_base_msl_m" not in r["levels_above_top"]
        assert not [w for w in r["warnings"] if w.startswith("cloud base")]
        r = Column(20.0, 5.0, 1000.0, elev, 6.5, top_m=top - 0.01).report()
        assert r["cloud_base_msl_m"] is None and "cloud_base_msl_m" in r["levels_above_top"]


def test_parcel_that_never_freezes_has_no_icing_band():
    # Warm, moist and only 3.5 km deep: free convection to the top, but the parcel
    # stays above 0 degC (still over +5 degC at the top on the fine reference).
    from refs import fine_parcel
    col = Column(30.0, 26.0, 1000.0, 0.0, 8.0, top_m=3500.0)
    r = col.report()
    assert fine_parcel(col, r["cloud_base_msl_m"])[-1][1] > 5.0
    assert r["lfc_msl_m"] is not None and r["el_above_top"] is True
    assert r["parcel_freezing_level_msl_m"] is None
    assert r["icing_band_bottom_msl_m"] is None and r["icing_band_top_msl_m"] is None


def test_stability_is_the_lowest_band():
    # A 300 m surface inversion under 9.5 K/km: the lowest band is absolutely stable
    # (ELR below any saturated rate), the next conditionally unstable (9.5 K/km is
    # between the saturated rate and g/cp = 9.77 K/km).
    r = Column(20.0, 10.0, 1000.0, 0.0, [(300.0, -3.0), (None, 9.5)], top_m=8000.0).report()
    assert r["stability"] == "absolutely_stable"
    assert r["stability_layers"][1]["class"] == "conditionally_unstable"


def test_thermal_excess_past_60_degc():
    # The warmed parcel is capped at 60 degC (the library's range) for its own cloud
    # base; a 9 K/km column from 55 degC with 10 K of excess still reports thermals
    # (rising to the top: the dry parcel stays warmer than 9 K/km air).
    r = Column(55.0, 10.0, 1000.0, 0.0, 9.0, top_m=12000.0, tropopause_m=None).report(10.0)
    assert r["thermal_top_msl_m"] is None and r["thermal_kind"] == "cumulus"


def test_isothermal_layer_at_the_asked_temperature():
    # An isothermal layer at exactly 0 degC: the air reaches 0 degC at its foot and
    # leaves it at its top; the crossings are the layer's ends, each listed once.
    col = Column(5.0, 0.0, 1000.0, 0.0, [(1000.0, 5.0), (2000.0, 0.0), (None, 6.5)], top_m=6000.0)
    assert col.crossings(0.0) == pytest.approx([1000.0, 2000.0])
    assert col.level(0.0) == pytest.approx(1000.0)
    assert col.level(5.0) == 0.0                         # the surface already is
    assert col.level(-50.0) is None                      # never in 6 km


def test_crossings_under_a_metre_apart_are_both_listed():
    # 0 degC reached at 999.7 m (10 K/km from 9.997 degC), left again 0.1 m above the
    # 1000 m boundary (a 30 K/km warming), and reached once more in the 6.5 K/km air
    # above 1500 m: three crossings, closed forms.
    col = Column(9.997, 0.0, 1000.0, 0.0, [(1000.0, 10.0), (1500.0, -30.0), (None, 6.5)],
                 top_m=6000.0)
    t1500 = 9.997 - 10.0 + 15.0
    assert col.crossings(0.0) == pytest.approx([999.7, 1000.0 + 0.003 / 30.0 * 1000.0,
                                                1500.0 + t1500 / 6.5 * 1000.0], abs=1e-6)


def test_layer_tops_a_metre_apart():
    # Each layer top at least 1 m above the one below (the first: above the field).
    col = Column(15.0, 5.0, 1000.0, 0.0, [(1.0, -5.0), (2.0, 9.0), (None, 6.5)], top_m=3000.0)
    assert [lay[1] for lay in col.layers] == [1.0, 2.0, 3000.0]
    for layers, name in (([(0.5, 6.0), (None, 6.5)], "lapse layer 1 top_agl_m=0.5"),
                         ([(500.0, 6.0), (500.5, 7.0), (None, 6.5)], "lapse layer 2 top_agl_m=500.5"),
                         ([(500.0, 6.0), "steep"], "lapse layer 2='steep'"),
                         ([(500.0, 6.0), (None, 40.0)], "lapse layer 2 rate=40")):
        with pytest.raises(ValueError) as err:
            Column(15.0, 5.0, 1000.0, 0.0, layers)
        assert name in str(err.value)


def test_column_limits_at_their_edges():
    # The top at least 100 m above the field; warming to exactly 60 degC is allowed.
    assert Column(15.0, 5.0, 1000.0, 50.0, top_m=150.0).top_m == 150.0
    with pytest.raises(ValueError):
        Column(15.0, 5.0, 1000.0, 50.0, top_m=149.9)
    col = Column(40.0, 10.0, 1000.0, 0.0, [(2000.0, -10.0), (None, 6.5)], top_m=8000.0)
    assert col.t_at(2000.0) == pytest.approx(60.0)
    # Air reaching -90 degC ends the column there if that is over a metre up (30 K/km:
    # 0.0302 K is 1.007 m, kept; 0.025 K is 0.83 m, no column).
    assert Column(-89.9698, -90.0, 1000.0, 0.0, 30.0).top_m == pytest.approx(0.0302 / 30.0 * 1000.0)
    assert Column(-89.9698, -90.0, 1000.0, 500.0, 30.0).top_m == pytest.approx(501.0067, abs=1e-4)
    for elev in (0.0, 500.0):
        with pytest.raises(ValueError) as err:
            Column(-89.975, -90.0, 1000.0, elev, 30.0)
        assert "no column" in str(err.value)


def test_pressures_below_the_top_are_refused():
    col = Column(20.0, 10.0, 1000.0, 0.0, [(800.0, 9.0), (None, 6.0)], top_m=9000.0)
    p_top = _p(1000.0, 20.0, 9.0, 800.0)
    p_top = _p(p_top, 20.0 - 7.2, 6.0, 8200.0)
    assert col.z_at(p_top) == pytest.approx(9000.0, abs=1e-6)
    with pytest.raises(ValueError):
        col.z_at(p_top * 0.999)


def test_tropopause_at_least_100_m_above_the_field():
    # The same lower edge as top_m: 100 m above the elevation.
    col = Column(15.0, 5.0, 1000.0, 500.0, tropopause_m=600.0)
    assert col.tropopause_m == 600.0 and col.t_at(5000.0) == col.t_at(600.0)
    with pytest.raises(ValueError) as err:
        Column(15.0, 5.0, 1000.0, 500.0, tropopause_m=599.0)
    assert "tropopause_m=599.0" in str(err.value)


def test_from_qnh_defaults_to_the_isa_lapse_rate():
    # ISA troposphere lapse rate 6.5 K/km, tropopause 11 km (ICAO Doc 7488/3); top 16 km.
    col = Column.from_qnh(15.0, 5.0, 1013.25, 0.0)
    assert col.t_at(1000.0) == pytest.approx(15.0 - 6.5, abs=1e-9)
    assert col.top_asked_m == 16000.0 and col.tropopause_m == 11000.0


def test_z_at_above_the_top_names_the_top_pressure():
    # A pressure lower than the column top's is refused with the top's pressure as the
    # lower end of the range, however low it is (1 hPa is within the library's range).
    col = Column(15.0, 5.0, 1000.0, 0.0, 6.5, top_m=3000.0)
    for p in (1.005, 500.0):
        with pytest.raises(ValueError) as err:
            col.z_at(p)
        assert "range %g.." % col.p_at(3000.0) in str(err.value)


def test_z_at_edges():
    col = Column(15.0, 5.0, 1000.0, 0.0, 6.5, top_m=3000.0)
    # Below 1 hPa the library's own range is named.
    with pytest.raises(ValueError) as err:
        col.z_at(0.5)
    assert "range 1..1000" in str(err.value)
    # The top's pressure less a relative 1e-11 (rounding of a round trip) is the top.
    assert col.z_at(col.p_at(3000.0) * (1.0 - 1e-11)) == 3000.0


def test_warm_layer_over_a_surface_below_zero():
    # An invented inversion from -3 degC at the surface to +7 degC 2 km up: warm air
    # over freezing air (the layer's top, not its foot, is above 0 degC).
    col = Column(-3.0, -6.0, 1000.0, 0.0, -5.0, top_m=2000.0)
    assert col.t_at(2000.0) == pytest.approx(7.0)
    assert col.report()["warm_layer_aloft"] is True


def test_a_crossing_on_a_layer_boundary_is_one_level_after_another_crossing():
    # 0 degC is passed at 500 m, then reached again exactly where an inversion (to
    # 2000 m) meets the layer above it: both layers find 2000 m, said once (invented).
    col = Column(10.0, 0.0, 1000.0, 0.0, [(1000.0, 20.0), (2000.0, -10.0), (None, 6.5)],
                 top_m=5000.0)
    assert col.t_at(2000.0) == pytest.approx(0.0, abs=1e-9)
    assert col.crossings(0.0) == pytest.approx([500.0, 2000.0])


def test_warm_layer_over_a_surface_at_zero():
    # Air warming upward from a surface at exactly 0 degC: warm air over air at 0 degC.
    assert Column(0.0, -2.0, 1000.0, 0.0, -5.0, top_m=2000.0).report()["warm_layer_aloft"]
    assert not Column(0.5, -2.0, 1000.0, 0.0, -5.0, top_m=2000.0).report()["warm_layer_aloft"]


def test_tropopause_on_a_layer_foot_makes_the_air_above_isothermal():
    # A tropopause exactly where an ELR layer starts (ICAO standard atmosphere: 6.5 K/km
    # to 11000 m, isothermal above) is the same column as one layer run through it; a
    # layer that starts above the tropopause keeps its rate. (It was ignored, and the
    # air above went on cooling to -90 degC.)
    split = Column(15.0, 5.0, 1013.25, 0.0, [(11000.0, 6.5), (None, 6.5)], 20000.0)
    whole = Column(15.0, 5.0, 1013.25, 0.0, 6.5, 20000.0)
    assert split.layers == whole.layers and split.tropopause_m == 11000.0
    assert split.top_m == 20000.0 and split.end_why is None
    assert split.t_at(19000.0) == split.t_at(11000.0) == pytest.approx(-56.5, abs=1e-9)
    above = Column(15.0, 5.0, 1013.25, 0.0, [(11000.0, 6.5), (12000.0, -2.0), (None, 6.5)],
                   20000.0)
    assert above.tropopause_m == 11000.0 and above.t_at(12000.0) == above.t_at(11000.0)
    assert above.t_at(13000.0) < above.t_at(12000.0) - 6.0  # 6.5 K/km again above
    # No zero-thickness layer at the foot (a stability band of no depth).
    assert [lay[:2] for lay in above.layers] == [(0.0, 11000.0), (11000.0, 12000.0),
                                                 (12000.0, above.top_m)]


def test_layers_past_the_column_top_are_not_read():
    # A layer that reaches the column top ends the list: what follows it (here a top
    # below the layer before, which would be refused) is left out.
    col = Column(15.0, 5.0, 1013.25, 0.0, [(20000.0, 6.5), (100.0, 5.0)], 9000.0)
    assert col.top_m == 9000.0 and len(col.layers) == 1


def test_no_tropopause_when_the_points_end_the_column_past_it():
    # Points aloft up to 12500 m over ELR layers that end lower: the column ends at the
    # last point, above the tropopause asked for; no isothermal part is left in it.
    col = Column(15.0, 5.0, 1013.25, 0.0, [(12000.0, 6.5)], 16000.0,
                 aloft=[(12500.0, -60.0, None)], tropopause_m=11000.0)
    assert col.top_m == 12500.0 and col.tropopause_m is None
    assert col.end_why == "its last layer ends there"
