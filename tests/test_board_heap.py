"""What Column.report() does for a board's heap: lapsecalc._drop lets go of a module
on MicroPython only; the cloud base of the heated parcel, computed once with the
condensation code (which a board then drops), reaches stability.add_to_report and
lapsecalc.thermals unchanged."""
import sys
import types

import pytest

import lapsecalc
from lapsecalc import stability, thermals
from lapsecalc.column import Column, report_keys
from lapsecalc.condensation import cloud_base
from lapsecalc.parcel import path

DEMO = (27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)])


@pytest.fixture
def spare_modules():
    # Two stand-in submodules, gone again afterwards whatever the test did.
    names = ("_spare_a", "_spare_b")
    for n in names:
        mod = types.ModuleType("lapsecalc." + n)
        sys.modules["lapsecalc." + n] = mod
        setattr(lapsecalc, n, mod)
    yield names
    for n in names:
        sys.modules.pop("lapsecalc." + n, None)
        lapsecalc.__dict__.pop(n, None)


def test_drop_keeps_modules_on_cpython(spare_modules):
    lapsecalc._drop(*spare_modules)
    for n in spare_modules:
        assert "lapsecalc." + n in sys.modules and n in lapsecalc.__dict__


def test_drop_forgets_each_module_named_on_a_board(spare_modules, monkeypatch):
    monkeypatch.setattr(sys, "implementation", types.SimpleNamespace(name="micropython"))
    lapsecalc._drop(*spare_modules)
    for n in spare_modules:
        assert "lapsecalc." + n not in sys.modules and n not in lapsecalc.__dict__
    lapsecalc._drop("_never_loaded")  # nothing to forget is no error


def _stability_keys(col, excess_c, heated):
    r = dict.fromkeys(report_keys())
    lcl_agl = col.cloud_base()[0]
    r["cloud_base_agl_m"] = lcl_agl
    r["cloud_base_msl_m"] = col.elev_m + lcl_agl
    stability.add_to_report(col, path(col, col.elev_m + lcl_agl), r, excess_c, heated)
    return r


def test_heated_cloud_base_given_is_the_one_computed():
    col = Column.from_qnh(*DEMO)
    heated = cloud_base(col.t_c + 2.0, col.td_c, col.p_hpa)[0]
    assert heated > col.cloud_base()[0] + 200.0  # 2 K of excess lifts it (about 125 m/K)
    assert _stability_keys(col, 2.0, heated) == _stability_keys(col, 2.0, None)
    assert col.report(2.0)["thermal_kind"] == _stability_keys(col, 2.0, None)["thermal_kind"]


def test_heated_cloud_base_computed_when_not_given():
    # Invented column whose dry thermals (2 K excess) top out at 2240 m AGL, between
    # the cloud bases of the surface air 2 K cooler (2017 m) and 2 K warmer (2517 m):
    # blue thermals only with the warmer parcel's base.
    col = Column.from_qnh(30.0, 12.0, 1013.0, 200.0, [(2200.0, 9.0), (None, 2.0)])
    r = _stability_keys(col, 2.0, None)
    top_agl = r["thermal_top_msl_m"] - col.elev_m
    warmer = cloud_base(col.t_c + 2.0, col.td_c, col.p_hpa)[0]
    cooler = cloud_base(col.t_c - 2.0, col.td_c, col.p_hpa)[0]
    assert cooler < top_agl < warmer and r["thermal_kind"] == "blue"
    # Without excess the surface parcel's own base: over a superadiabatic first layer
    # the dry thermals rise, to under that base here (blue).
    col = Column.from_qnh(30.0, 12.0, 1013.0, 200.0, [(1500.0, 10.0), (None, 2.0)])
    r = _stability_keys(col, 0.0, None)
    assert col.elev_m + 1.0 < r["thermal_top_msl_m"] < r["cloud_base_msl_m"]
    assert r["thermal_kind"] == "blue"


def test_heated_cloud_base_given_is_used():
    # The demo's dry thermals top out below the heated parcel's cloud base: cumulus
    # when the base given lies below their top, blue thermals when above it.
    col = Column.from_qnh(*DEMO)
    r = _stability_keys(col, 2.0, None)
    top_agl = r["thermal_top_msl_m"] - col.elev_m
    assert r["thermal_kind"] == "blue"
    assert _stability_keys(col, 2.0, top_agl - 1.0)["thermal_kind"] == "cumulus"
    assert _stability_keys(col, 2.0, top_agl + 1.0)["thermal_kind"] == "blue"
    # Without excess the surface parcel's own base counts, whatever is given.
    assert _stability_keys(col, 0.0, 1.0) == _stability_keys(col, 0.0, None)


def test_thermals_take_the_heated_base_from_the_report():
    col = Column.from_qnh(*DEMO)
    full = col.report(1.0)
    heated = cloud_base(col.t_c + 1.0, col.td_c, col.p_hpa)[0]
    assert full["thermal_cloud_base_msl_m"] == col.elev_m + heated
    levels = path(col, full["cloud_base_msl_m"])
    r = dict(full)
    r["thermal_cloud_base_msl_m"] = None  # not given: computed (the same)
    thermals.add_keys(col, levels, r)
    assert r == full
    bare = col.report(0.0)
    r = dict(bare)
    r["thermal_cloud_base_msl_m"] = None  # no excess: the surface parcel's own base
    thermals.add_keys(col, levels, r)
    assert r == bare and r["thermal_cloud_base_msl_m"] == bare["cloud_base_msl_m"]
    r["thermal_cloud_base_msl_m"] = col.top_m + 1.0  # given above the top: none in it
    thermals.add_keys(col, levels, r)
    assert r["thermal_cloud_base_msl_m"] is None
    r["thermal_cloud_base_msl_m"] = col.elev_m + 600.0
    thermals.add_keys(col, levels, r)
    assert r["thermal_cloud_base_msl_m"] == col.elev_m + 600.0


@pytest.fixture
def board(monkeypatch):
    # CPython standing in for a board (sys.implementation.name "micropython"): the
    # lapsecalc modules and the package's names are put back afterwards.
    saved = dict((k, v) for k, v in sys.modules.items() if k.startswith("lapsecalc."))
    names = dict(lapsecalc.__dict__)
    impl = dict(vars(sys.implementation), name="micropython")
    monkeypatch.setattr(sys, "implementation", types.SimpleNamespace(**impl))
    yield
    monkeypatch.undo()
    for k in [k for k in sys.modules if k.startswith("lapsecalc.")]:
        if k not in saved:
            del sys.modules[k]
    sys.modules.update(saved)
    lapsecalc.__dict__.clear()
    lapsecalc.__dict__.update(names)


def _loaded(name):
    return "lapsecalc." + name in sys.modules


def test_a_board_column_holds_neither_its_building_nor_the_cloud_base_code(board):
    import gc
    sys.modules.pop("lapsecalc.condensation")  # a board that has not loaded it yet
    lapsecalc.__dict__.pop("condensation", None)
    col = Column.from_qnh(*DEMO)
    assert not _loaded("profile")
    assert col.cloud_base() == cloud_base(col.t_c, col.td_c, col.p_hpa)
    assert not _loaded("condensation")
    r = col.report(2.0)
    # The stability code let go of before the hazards that read the parcel path (none
    # of them loads it again); their cautions come before the general ones.
    assert not _loaded("condensation") and not _loaded("stability") and _loaded("parcel")
    general = list(stability.CAUTIONS)
    assert r["cautions"][-len(general):] == general and len(r["cautions"]) > len(general)
    assert r["thermal_cloud_base_msl_m"] == col.elev_m + cloud_base(
        col.t_c + 2.0, col.td_c, col.p_hpa)[0]
    # An allocation count (the collector off) keeps what the count would load twice.
    gc.disable()
    try:
        col.cloud_base("bolton")
        assert _loaded("condensation")
    finally:
        gc.enable()


def test_a_core_only_board_report_has_the_general_cautions_and_no_hazard_keys(board):
    # Without the hazard modules (a core-only board: importing them fails) the report
    # has the general cautions alone and keeps the stability code (nothing after it).
    from lapsecalc import hazards
    sys.modules["lapsecalc.hazards"] = None  # import lapsecalc.hazards: ImportError
    lapsecalc.__dict__.pop("hazards", None)
    r = Column.from_qnh(*DEMO).report(2.0, False)
    assert list(r) == report_keys()
    assert r["cautions"] is stability.CAUTIONS and _loaded("stability")
    assert not [k for k in hazards.report_keys() if k in r]


def test_a_board_keeps_the_cloud_base_code_another_module_holds(board):
    # lapsecalc.station imports condensation for good: dropping it would make the next
    # import load a second copy beside the one station holds.
    import lapsecalc.station  # noqa: F401
    held = sys.modules["lapsecalc.condensation"]
    col = Column.from_qnh(*DEMO)
    col.cloud_base()
    assert sys.modules["lapsecalc.condensation"] is held
    col.report(2.0)
    assert sys.modules["lapsecalc.condensation"] is held


def test_a_refused_column_lets_go_of_the_building_code_too(board):
    with pytest.raises(ValueError, match="top_m"):
        Column.from_qnh(27.0, 13.0, 1016.0, 411.48, 6.5, 100.0)
    assert not _loaded("profile")


def _same_values_new_objects(old, new):
    # Equal values; every float, list, tuple (but the empty one) and dict a new object;
    # strings and None kept.
    assert new == old
    if isinstance(old, (float, list, dict)) or isinstance(old, tuple) and old:
        assert new is not old
    if isinstance(old, (list, tuple)):
        for a, b in zip(old, new):
            _same_values_new_objects(a, b)
    elif isinstance(old, dict):
        assert list(new) == list(old)
        for k in old:
            _same_values_new_objects(old[k], new[k])
    elif not isinstance(old, float):
        assert new is old


def test_settle_makes_a_kept_report_afresh_on_a_board(board):
    # state.settle: each float, list and dict of a kept report made again (it lands in
    # the lowest free space of a board's heap), values and key order unchanged.
    from lapsecalc.state import settle
    r = Column.from_qnh(*DEMO).report(2.0)
    before = dict(r)
    settle(r)
    assert list(r) == list(before)
    for k in before:
        _same_values_new_objects(before[k], r[k])
    assert isinstance(r["stability_layers"], list) and isinstance(r["indicated_altitude_m"], dict)


def test_release_makes_a_words_own_numbers_afresh_on_a_board(board):
    # Session.release(numbers): the kept report and the word's own numbers (levels,
    # a balloon's) made afresh, values unchanged, and the physics let go of.
    from lapsecalc.shell import Session
    s = Session()
    assert s.drop_word_modules  # a board
    s.feed("temp 27C dew 13C elev 1350ft")
    rep = s.report("base")
    kept = dict(rep)
    numbers = {"freezing_level_msl_m": [2940.5, 2899.25, 95.0], "note": "x"}
    before = dict(numbers)
    s.release(numbers)
    assert not _loaded("column") and not _loaded("parcel")
    for k in before:
        _same_values_new_objects(before[k], numbers[k])
    for k in kept:
        _same_values_new_objects(kept[k], s._rep[k])


def test_a_board_settings_line_makes_its_new_state_afresh(board, monkeypatch):
    # The new state of a settings line, made among the setters' code, is made afresh
    # (state.settle) before the new Column is built: equal values, new objects.
    from lapsecalc import shell
    s = shell.Session()
    s.feed("temp 27C dew 13C elev 1350ft")
    calls = []
    real = shell.settle

    def settle(d):
        before = dict(d)
        real(d)
        calls.append((before, d))
    monkeypatch.setattr(shell, "settle", settle)
    s.feed("qnh 29.92inHg elr -4@200m 6.5 aloft 1500m 16C 3000m 5C/-2C")
    assert len(calls) == 1 and calls[0][1] is s.state
    before = calls[0][0]
    assert isinstance(before["aloft"], tuple) and isinstance(before["press"], tuple)
    for k in before:
        _same_values_new_objects(before[k], s.state[k])


def test_a_board_session_records_what_was_loaded_before_it(board):
    # What the program had loaded (here lapsecalc.station) stays after each line.
    import lapsecalc.station  # noqa: F401
    from lapsecalc.shell import Session
    s = Session()
    assert "lapsecalc.station" in s._kept and "lapsecalc.shell" in s._kept


def test_settle_moves_nothing_on_cpython_or_with_the_collector_off(board, monkeypatch):
    import gc
    from lapsecalc.state import settle
    r = Column.from_qnh(*DEMO).report(2.0)
    before = dict(r)
    gc.disable()
    try:
        settle(r)  # an allocation count: no old place would be freed
    finally:
        gc.enable()
    assert all(r[k] is before[k] for k in before)
    monkeypatch.setattr(sys, "implementation", types.SimpleNamespace(name="cpython"))
    settle(r)
    assert all(r[k] is before[k] for k in before)


def test_indicated_keys_have_room_in_the_report_from_the_start():
    # Column.report() makes its dict from the key lists (a dict grown late needs a new
    # table in one piece); every key it sets is in them, in its order.
    from lapsecalc import hazards, indicated
    r = Column.from_qnh(*DEMO).report(2.0)
    assert list(r) == report_keys() + hazards.report_keys() + indicated.report_keys()
    assert list(Column.from_qnh(*DEMO).report(2.0, False)) == report_keys() + \
        hazards.report_keys()


def test_an_indicated_reading_is_shared_only_by_equal_heights():
    # indicated._reading reuses the reading of an equal height made before, never the
    # empty place of one not yet read (the dict is made with every key first).
    from lapsecalc.indicated import indicated_altitude_at
    col = Column.from_qnh(*DEMO)
    r = col.report(2.0)
    ind = r["indicated_altitude_m"]
    for k in ind:
        if r[k] is None:
            assert ind[k] is None
        elif r[k] == col.elev_m:
            assert ind[k] == col.elev_m
        else:
            assert ind[k] == pytest.approx(indicated_altitude_at(col, r[k]), abs=1e-9)
    # In this column the freezing level is also the icing band's bottom: one reading.
    same = [k for k in ind if r[k] == r["freezing_level_msl_m"]]
    assert len(same) >= 2 and ind[same[0]] is not None
    assert all(ind[k] == ind[same[0]] for k in same)


def test_the_field_hazards_are_added_before_the_parcel_path(monkeypatch):
    # Column.report() adds the hazards that read only the column (precip, fieldrisk)
    # before it computes the parcel path (a board loads their code into a heap still
    # whole), the others (thermals, icing) after it; every key is set either way.
    from lapsecalc import hazards, parcel
    calls = []
    real_parts, real_path = hazards.add_parts, parcel.path

    def parts(col, levels, r, names):
        calls.append((names, levels is None))
        return real_parts(col, levels, r, names)

    def path(*args):
        calls.append("path")
        return real_path(*args)
    monkeypatch.setattr(hazards, "add_parts", parts)
    monkeypatch.setattr(parcel, "path", path)
    r = Column.from_qnh(*DEMO).report(2.0)
    # The cautions (lapsecalc.cautions) last, loaded as a hazard module is.
    assert calls == [(("precip", "fieldrisk"), True), "path", (("thermals", "icing"), False),
                     (("cautions",), False)]
    assert set(hazards.FIELD_PARTS + hazards.PATH_PARTS) == set(hazards.PARTS)
    assert all(k in r for k in hazards.report_keys())
    assert r["precip_type"] == "rain" and r["carb_icing"] == "light"
