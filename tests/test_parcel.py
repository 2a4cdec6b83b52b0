"""The surface parcel: LFC, EL, CAPE, CIN, lifted index and its freezing level, each
against a computation outside the library: closed forms for a linear layer, the
fine-step reference integration of test_stability.py, or the definitions integrated
here from the path's own samples.

Closed forms (Wallace & Hobbs, Atmospheric Science, 2nd ed., ch. 3): Poisson's
equation T = Ts (p/ps)^(Rd/cp) for the unsaturated parcel; for a layer with constant
lapse rate gamma, p = p0 (T/T0)^(g/(Rd gamma)). Definitions of LFC, EL, CAPE, CIN and
the lifted index: REFERENCES.md, Parcel quantities. The columns are invented.
"""
import pytest

from lapsecalc import Column, cloud_base
from lapsecalc import parcel, stability
from lapsecalc.demo import DEMO_COLUMN
from test_stability import reference_parcel
from refs import fine_parcel, first_crossing

G0, RD, CP = 9.80665, 287.05287, 1004.0  # ICAO Doc 7488/3; cp Wallace & Hobbs
KAPPA = RD / CP

# Accuracy of the parcel quantities against the fine (2 m) reference, as stated in the
# README's accuracy table (measured over 70 random columns, bench/mutation.md): the
# trapezoid over levels up to 1250 m apart reads CAPE low, by up to about 36 J/kg.
CAPE_TOL_J_KG, CAPE_TOL_REL, CAPE_HIGH_J_KG = 15.0, 0.015, 1.0
CIN_TOL_J_KG, CIN_TOL_REL = 4.0, 0.01
LEVEL_TOL_M = 60.0


def poisson_c(t_c, p_hpa, ps_hpa):
    return (t_c + 273.15) * (p_hpa / ps_hpa) ** KAPPA - 273.15


def linear_layer_z(t0_c, p0_hpa, z0_m, lapse_k_per_km, p_hpa):
    # Height of p_hpa in a layer cooling at lapse_k_per_km from (t0, p0) at z0:
    # T = T0 (p/p0)^(Rd gamma/g), z = z0 + (T0 - T)/gamma.
    g = lapse_k_per_km / 1000.0
    t0 = t0_c + 273.15
    return z0_m + (t0 - t0 * (p_hpa / p0_hpa) ** (RD * g / G0)) / g


def linear_layers_tp(t_c, p_hpa, layers, dz_m):
    # Temperature, degC, and pressure, hPa, dz_m above the surface of layered lapse
    # rates [(top_agl_m or None, k_per_km), ...], layer by layer in closed form.
    t, p, below = t_c + 273.15, p_hpa, 0.0
    for top, rate in layers:
        h = min(dz_m, top if top is not None else dz_m) - below
        g = rate / 1000.0
        t1 = t - g * h
        p = p * (t1 / t) ** (G0 / (RD * g))
        t, below = t1, below + h
        if below >= dz_m:
            break
    return t - 273.15, p


def assert_cape_cin(r, ref_cape, ref_cin):
    assert -(CAPE_TOL_J_KG + CAPE_TOL_REL * ref_cape) <= r["cape_j_kg"] - ref_cape <= CAPE_HIGH_J_KG
    assert abs(r["cin_j_kg"] - ref_cin) <= CIN_TOL_J_KG + CIN_TOL_REL * abs(ref_cin)


@pytest.mark.parametrize("args", [(30.0, 20.0, 1000.0, 0.0, [(1500.0, 11.0), (None, 6.5)]),
                                  (25.0, 15.0, 1013.0, 0.0, [(800.0, 25.0), (None, 6.0)])])
def test_lfc_is_cloud_base_when_buoyant_there(args):
    # Superadiabatic air under the cloud base: the parcel is warmer than the air at the
    # LCL, so free convection starts at the cloud base, with no CIN.
    col = Column(*args)
    t, td, p, elev, layers = args
    z_l = cloud_base(t, td, p)[0]
    # Independent check of the premise: Poisson parcel against the layered air.
    te_l, p_l = linear_layers_tp(t, p, layers, z_l)
    assert poisson_c(t, p_l, p) > te_l + 1.0
    r = col.report()
    assert r["lfc_msl_m"] == pytest.approx(elev + z_l, abs=1e-6)
    assert r["cin_j_kg"] == 0.0
    lfc, el, cape, cin = reference_parcel(col)
    assert abs(r["lfc_msl_m"] - lfc) < LEVEL_TOL_M
    assert abs(r["el_msl_m"] - el) < LEVEL_TOL_M
    assert_cape_cin(r, cape, cin)


SMALL_CAPE = {
    # Marginal convection: the positive area is one or two levels deep, so CAPE is
    # mostly the partial segments where the buoyancy changes sign (invented columns).
    "demo": None,
    "weak_6.8": (20.0, 12.0, 1000.0, 0.0, 6.8, 12000.0),
    "weak_6.5": (18.0, 12.0, 1000.0, 0.0, 6.5, 12000.0),
    "weak_6.2": (22.0, 16.0, 1000.0, 0.0, 6.2, 14000.0),
}


def _column(name):
    if SMALL_CAPE[name] is None:
        return Column.from_qnh(*DEMO_COLUMN)
    t, td, p, elev, lapse, top = SMALL_CAPE[name]
    return Column(t, td, p, elev, lapse, top_m=top)


@pytest.mark.parametrize("name", sorted(SMALL_CAPE))
def test_small_cape_against_fine_reference(name):
    col = _column(name)
    r = col.report()
    lfc, el, cape, cin = reference_parcel(col)
    assert 1.0 < cape < 150.0 and el is not None       # the premise: marginal CAPE
    assert abs(r["lfc_msl_m"] - lfc) < LEVEL_TOL_M
    assert abs(r["el_msl_m"] - el) < LEVEL_TOL_M
    assert not r["el_above_top"]
    assert_cape_cin(r, cape, cin)


def _slices(z0, b0, z1, b1, n=400):
    # [z0, z1] in n slices of the linear b: (za, ba, zb, bb).
    return [(z0 + (z1 - z0) * k / n, b0 + (b1 - b0) * k / n,
             z0 + (z1 - z0) * (k + 1) / n, b0 + (b1 - b0) * (k + 1) / n) for k in range(n)]


def _integrate_samples(levels, lfc_msl_m):
    # The definitions applied to the path's own samples, buoyancy b = (Tp - Te)/Te
    # linear between samples and summed in fine slices: CAPE the positive area from the
    # sample interval that holds the LFC upwards; CIN the negative area below the LFC,
    # b running linearly to zero at the LFC (the refined crossing, itself checked
    # against the fine reference).
    prof = [(z, (tp - te) / (te + 273.15)) for z, _, tp, te in levels]
    cape = cin = 0.0
    for (z0, b0), (z1, b1) in zip(prof, prof[1:]):
        if z1 > lfc_msl_m:
            for za, ba, zb, bb in _slices(z0, b0, z1, b1):
                cape += 0.5 * G0 * (max(ba, 0.0) + max(bb, 0.0)) * (zb - za)
        if z0 < lfc_msl_m:
            top, b_top = (z1, b1) if z1 <= lfc_msl_m else (lfc_msl_m, 0.0)
            for za, ba, zb, bb in _slices(z0, b0, top, b_top):
                cin += 0.5 * G0 * (min(ba, 0.0) + min(bb, 0.0)) * (zb - za)
    return cape, cin


@pytest.mark.parametrize("name", sorted(SMALL_CAPE) + ["deep"])
def test_cape_cin_are_the_areas_of_the_path(name):
    # Holds the integration itself to a thousandth of a J/kg (the fine slices' own
    # error): a 1 % change of g or of a partial segment cannot hide inside the
    # method's error against the fine reference.
    col = Column(30.0, 20.0, 1000.0, 0.0, [(1500.0, 11.0), (None, 6.5)]) if name == "deep" \
        else _column(name)
    lcl = col.elev_m + cloud_base(col.t_c, col.td_c, col.p_hpa)[0]
    levels = parcel.path(col, lcl)
    r = stability.parcel_analysis(col, levels, lcl)
    cape, cin = _integrate_samples(levels, r["lfc_msl_m"])
    assert abs(r["cape_j_kg"] - cape) <= 0.001
    assert abs(r["cin_j_kg"] - cin) <= 1e-6


@pytest.mark.parametrize("p_hpa,elev_m", [(1020.0, 0.0), (960.0, 450.0)])
def test_parcel_freezing_level_below_cloud_base(p_hpa, elev_m):
    # 10 degC, dewpoint 0 degC: the parcel reaches 0 degC dry, below its cloud base.
    # Poisson gives the pressure, the 3 K/km layer's closed form the height.
    col = Column(10.0, 0.0, p_hpa, elev_m, 3.0)
    p0 = p_hpa * (273.15 / 283.15) ** (1.0 / KAPPA)
    z0 = linear_layer_z(10.0, p_hpa, elev_m, 3.0, p0)
    r = col.report()
    assert z0 < r["cloud_base_msl_m"]
    assert abs(r["parcel_freezing_level_msl_m"] - z0) < 0.5
    # -1 degC, still below the cloud base: same closed forms, through parcel.level.
    lcl = r["cloud_base_msl_m"]
    p5 = p_hpa * (272.15 / 283.15) ** (1.0 / KAPPA)
    z5 = linear_layer_z(10.0, p_hpa, elev_m, 3.0, p5)
    assert z5 < lcl
    assert abs(parcel.level(col, parcel.path(col, lcl), -1.0, lcl) - z5) < 0.5


@pytest.mark.parametrize("t_c", [0.0, -5.0])
def test_parcel_freezing_level_at_a_freezing_surface(t_c):
    # A parcel that starts at or below 0 degC is frozen at the surface itself.
    assert Column(t_c, t_c - 3.0, 1000.0, 200.0).report()["parcel_freezing_level_msl_m"] == 200.0


def test_lifted_index_of_a_dry_parcel():
    # 45 degC and dewpoint -10 degC: the parcel is still dry at 500 hPa (LCL near
    # 6.9 km), so LI = Te(500) - Poisson(500), both closed forms (9.8 K/km layer).
    col = Column(45.0, -10.0, 1008.0, 300.0, 9.8)
    z500 = linear_layer_z(45.0, 1008.0, 300.0, 9.8, 500.0)
    te = 45.0 - 9.8 * (z500 - 300.0) / 1000.0
    li = te - poisson_c(45.0, 500.0, 1008.0)
    r = col.report()
    assert r["cloud_base_msl_m"] > z500
    assert abs(li + 0.173) < 0.01                      # the closed forms themselves
    assert abs(r["lifted_index_c"] - li) < 0.01


def test_lifted_index_at_high_fields():
    # 500 hPa only 300-odd m above the field: inside the path's first segment.
    col = Column(0.0, -10.0, 520.0, 5200.0, 6.5)
    z500 = linear_layer_z(0.0, 520.0, 5200.0, 6.5, 500.0)
    li = (0.0 - 6.5 * (z500 - 5200.0) / 1000.0) - poisson_c(0.0, 500.0, 520.0)
    assert abs(col.report()["lifted_index_c"] - li) < 0.01
    # A field at 500 hPa: parcel and air are the same there.
    assert abs(Column(-5.0, -15.0, 500.0, 5500.0).report()["lifted_index_c"]) < 1e-9
    # A field above the 500 hPa level has no lifted index.
    assert Column(-5.0, -15.0, 480.0, 5800.0).report()["lifted_index_c"] is None


def _expected_levels(col, lcl_msl_m, spacing=1250.0):
    # Marks at every layer boundary and at the LCL; each interval cut into the fewest
    # equal parts no longer than the spacing (README, Performance: levels every
    # 1250 m at most, on every layer boundary and on the LCL).
    marks = sorted(set([lay[0] for lay in col.layers] + [col.top_m] +
                       ([lcl_msl_m] if col.elev_m < lcl_msl_m < col.top_m else [])))
    out = [marks[0]]
    for a, b in zip(marks, marks[1:]):
        n = int(-(-(b - a) // spacing))
        out += [a + (b - a) * i / n for i in range(1, n + 1)]
    return out


@pytest.mark.parametrize("args,top", [
    ((25.0, 15.0, 1000.0, 0.0, [(800.0, 9.0), (None, 6.5)]), 9000.0),
    ((18.0, 18.0, 990.0, 200.0, [(300.0, -2.0), (2800.0, 7.0), (None, 6.0)]), 12000.0),
    ((10.0, 2.0, 950.0, 500.0, 6.5), 3000.0),
    ((15.0, 15.0, 1000.0, 0.0, 6.5), 2510.0),       # 2510 m: three levels apart, not two
])
def test_path_levels(args, top):
    # The path's heights are the documented levels, strictly rising (a saturated
    # surface puts the LCL on the first level: it is not repeated); below the LCL the
    # parcel is Poisson's, the environment the closed form of the layers.
    col = Column(*args, top_m=top, tropopause_m=None)  # the reference has no tropopause
    lcl = col.elev_m + cloud_base(col.t_c, col.td_c, col.p_hpa)[0]
    levels = parcel.path(col, lcl)
    zs = [lv[0] for lv in levels]
    assert zs == pytest.approx(_expected_levels(col, lcl), abs=1e-6)
    assert all(b > a for a, b in zip(zs, zs[1:]))
    layers = args[4] if isinstance(args[4], list) else [(None, args[4])]
    for z, p, tp, te in levels:
        te_ref, p_ref = linear_layers_tp(col.t_c, col.p_hpa, layers, z - col.elev_m)
        assert abs(te - te_ref) < 1e-9 and abs(p - p_ref) < 1e-6 * p_ref
        if z <= lcl:
            assert abs(tp - poisson_c(col.t_c, p, col.p_hpa)) < 1e-9


def test_path_level_cap():
    # At most 400 levels (a hard cap, named in the error): 399 intervals fit, 400 not.
    col = Column(20.0, 10.0, 1000.0, 0.0, 6.5, top_m=11970.0, tropopause_m=None)
    lcl = cloud_base(20.0, 10.0, 1000.0)[0]
    assert len(parcel.path(col, 1e9, max_step_m=30.0)) == 400
    with pytest.raises(ValueError) as err:
        parcel.path(col, 1e9, max_step_m=29.9)
    assert "400 levels" in str(err.value)
    assert len(parcel.path(col, lcl)) < 20


def test_path_dry_in_very_cold_air():
    # Below -60 degC (213.15 K) the saturated parcel is followed as a dry adiabat
    # (parcel.py: under 0.1 g/kg of vapour left): Poisson's equation between levels
    # there; at or above it, the pseudo-adiabat (warmer than Poisson: latent heat).
    for t_c, lapse in ((24.0, 7.0), (29.0, 7.5)):
        col = Column(t_c, t_c - 10.0, 1000.0, 0.0, lapse, top_m=16000.0, tropopause_m=None)
        lcl = cloud_base(t_c, t_c - 10.0, 1000.0)[0]
        levels = parcel.path(col, lcl)
        cold = warm = 0
        wide = False
        for (z0, p0, t0, _), (z1, p1, t1, _) in zip(levels, levels[1:]):
            if z0 < lcl:
                continue
            dry = poisson_c(t0, p1, p0)
            if t0 + 273.15 < 213.15:
                assert abs(t1 - dry) < 1e-9
                # Exact over any step: levels there up to 4 x 1250 m apart.
                assert z1 - z0 <= 5000.0 + 1e-6
                wide = wide or z1 - z0 > 1250.0 + 1e-6
                cold += 1
            else:
                assert t1 > dry + 0.005
                warm += 1 if t0 + 273.15 < 215.3 else 0
        assert cold >= 1 and wide and warm == 1


@pytest.mark.parametrize("args", [(5.0, 3.0, 1000.0, 0.0, 6.5), (8.0, 2.0, 990.0, 300.0, 7.0),
                                  (20.0, 12.0, 980.0, 200.0, 7.0)])
def test_parcel_freezing_level_in_cloud(args):
    # Above the cloud base, between path levels: within 1 m of the fine-step
    # pseudo-adiabat (refs.fine_parcel, 1 m steps).
    col = Column(*args)
    lcl = args[3] + cloud_base(*args[:3])[0]
    ref = first_crossing(fine_parcel(col, lcl, dz=1.0), lambda row: row[1])
    assert ref > lcl
    assert abs(col.report()["parcel_freezing_level_msl_m"] - ref) < 1.0
    # The -10 and -20 degC levels of the parcel (the icing band's top) the same way.
    levels = parcel.path(col, lcl)
    for t_c in (-10.0, -20.0):
        ref = first_crossing(fine_parcel(col, lcl, dz=1.0), lambda row: row[1] - t_c)
        assert abs(parcel.level(col, levels, t_c, lcl) - ref) < 1.0


def test_parcel_level_of_a_path_temperature_is_that_level():
    # Asking for the parcel temperature of one of the path's own levels (an identity)
    # gives that level's height, wherever the level is: dry, at the LCL, in cloud.
    col = Column(24.0, 14.0, 990.0, 150.0, [(600.0, 8.0), (None, 6.5)], top_m=12000.0)
    lcl = 150.0 + cloud_base(24.0, 14.0, 990.0)[0]
    levels = parcel.path(col, lcl)
    for z, _, tp, _ in levels[1:]:
        assert abs(parcel.level(col, levels, tp, lcl) - z) < 1e-6
    assert parcel.level(col, levels, levels[0][2], lcl) == 150.0
    assert parcel.level(col, levels, levels[-1][2] - 0.01, lcl) is None
