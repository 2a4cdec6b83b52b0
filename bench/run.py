"""lapsecalc benchmark suite: one command, a table on stdout, a JSON file.

    python3 bench/run.py [--quick] [--no-mpy] [--out PATH]

CPython: time per call of every public function (median of timeit repeats), Column
construction and report(), interpreter throughput, report() scaling with ELR layers and
column top. Accuracy against cost: saturated_ascent's step and the parcel path's level
spacing. MicroPython (WebAssembly port through tests/mpy/run.mjs): report() time, heap
after import and per report(), .mpy sizes. A part whose tools are missing prints a
skip line. Targets are measured and printed, never asserted.
"""
import argparse
import datetime
import json
import os
import platform
import subprocess
import sys
import time

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
sys.path.insert(0, ROOT)
sys.path.insert(0, HERE)

import lapsecalc  # noqa: E402
from lapsecalc import parcel  # noqa: E402
from lapsecalc.column import Column  # noqa: E402
import cases  # noqa: E402
from timing import Settings, time_call, calibration_us  # noqa: E402
import accuracy  # noqa: E402
import mpy_runs  # noqa: E402

DEFAULT_OUT = os.path.join(HERE, "results.json")
SCHEMA = 1

# Targets of issue 7: (key, what, limit, unit, "below" or "above").
TARGETS = (
    ("report_us", "Column.report() on CPython", 1000.0, "us", "below"),
    ("report_aloft_us", "Column.report(), 9 points aloft, CPython", 500.0, "us", "below"),
    ("cloud_base_exact_us", "cloud_base(method=\"exact\") on CPython", 10.0, "us", "below"),
    ("interpreter_lines_per_s", "interpreter, session script", 5000.0, "lines/s", "above"),
)


def sig(x, digits=4):
    """x rounded to a few significant digits (None and non-floats pass through), so the
    JSON diffs stay readable."""
    if isinstance(x, float):
        return float("%.*g" % (digits, x))
    if isinstance(x, dict):
        return dict((k, sig(v, digits)) for k, v in x.items())
    if isinstance(x, list):
        return [sig(v, digits) for v in x]
    return x


# ---------------------------------------------------------------- CPython calls
def public_functions():
    """Public functions defined in each covered module, and Column's public methods."""
    import importlib
    names = []
    for mod_name in cases.COVERED_MODULES:
        try:
            mod = importlib.import_module("lapsecalc." + mod_name)
        except ImportError:
            continue
        for name in sorted(dir(mod)):
            f = getattr(mod, name)
            if name[:1] != "_" and callable(f) and not isinstance(f, type) and \
                    getattr(f, "__module__", None) == mod.__name__:
                names.append("%s.%s" % (mod_name, name))
    names += ["Column." + n for n in sorted(dir(Column))
              if n[:1] != "_" and callable(getattr(Column, n))]
    return names


def bench_calls(st):
    rows, errors = [], []
    try:
        all_cases = cases.call_cases()
    except Exception as e:  # the case table itself no longer fits the library
        return [], ["call_cases: %s: %s" % (type(e).__name__, e)], public_functions()
    for label, fn, args, kwargs in all_cases:
        try:
            fn(*args, **kwargs)
            med, best = time_call(fn, args, kwargs, st)
        except Exception as e:
            errors.append("%s: %s: %s" % (label, type(e).__name__, e))
            continue
        rows.append({"call": label, "us": med * 1e6, "min_us": best * 1e6})
    timed = set(r["call"].split("(")[0] for r in rows)
    timed |= set(r["call"].split(":")[0].replace("()", "") for r in rows)
    not_timed = [n for n in public_functions() if n not in timed]
    return rows, errors, not_timed


# ---------------------------------------------------------------- interpreter
def bench_interpreter(st):
    try:
        from lapsecalc.shell import Session
        from lapsecalc.demo import DEMO_LINES
    except Exception as e:
        return {"skipped": "lapsecalc.shell not importable (%s: %s)" % (type(e).__name__, e)}
    out = {"skipped": None}
    for name, lines in (("demo", DEMO_LINES), ("session_script", cases.SESSION_SCRIPT)):
        n = sum(1 for x in lines if x.split("#")[0].strip())
        errors = []
        s = Session()
        for line in lines:
            for o in s.feed(line):
                if o.startswith("error:"):
                    errors.append("%s -> %s" % (line, o))

        def run(lines=lines):
            s = Session()
            for line in lines:
                s.feed(line)

        med, best = time_call(run, (), {}, st)
        out[name] = {"lines": n, "ms": med * 1e3, "lines_per_s": n / med,
                     "error_lines": errors}
    return out


# ---------------------------------------------------------------- scaling
def bench_scaling(st):
    def row(col, **key):
        rep = col.report()
        levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
        med, best = time_call(col.report, (), {}, st)
        r = dict(key)
        r.update({"top_msl_m": col.top_m, "elr_layers": len(col.layers),
                  "path_levels": len(levels), "stability_rows": len(rep["stability_layers"]),
                  "report_us": med * 1e6, "report_min_us": best * 1e6})
        return r

    layers = [row(cases.scale_column(n_layers=n), layers_given=n)
              for n in sorted(cases.SCALE_LAYERS)]
    tops = [row(cases.scale_column(top_m=t), top_given_m=t) for t in cases.SCALE_TOPS_M]
    return {"surface": list(cases.SCALE_SURFACE), "by_layers": layers, "by_top": tops}


# ---------------------------------------------------------------- machine
def machine():
    def cmd(args):
        try:
            return subprocess.run(args, cwd=ROOT, stdout=subprocess.PIPE,
                                  stderr=subprocess.DEVNULL, universal_newlines=True,
                                  timeout=20).stdout.strip() or None
        except (OSError, subprocess.SubprocessError):
            return None

    cpu = None
    try:
        with open("/proc/cpuinfo") as f:
            for line in f:
                if line.startswith("model name"):
                    cpu = line.split(":", 1)[1].strip()
                    break
    except OSError:
        pass
    return {
        "date_utc": datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%d %H:%M"),
        "python": platform.python_version(),
        "implementation": platform.python_implementation(),
        "platform": platform.platform(),
        "machine": platform.machine(),
        "cpu": cpu or platform.processor() or None,
        "cores": os.cpu_count(),
        "node": cmd(["node", "--version"]),
        "lapsecalc": lapsecalc.__version__,
        "git_commit": cmd(["git", "rev-parse", "--short", "HEAD"]),
        "git_dirty": bool(cmd(["git", "status", "--porcelain", "--", "lapsecalc"])),
    }


# ---------------------------------------------------------------- output
def _fmt(x, spec="%.1f"):
    return "-" if x is None else spec % x


def print_table(res):
    w = sys.stdout.write
    m = res["machine"]
    w("lapsecalc %s bench, %s %s, %s, %s cores, %s UTC%s\n" % (
        m["lapsecalc"], m["implementation"], m["python"], m["cpu"] or m["machine"],
        m["cores"], m["date_utc"], " (quick)" if res["quick"] else ""))
    w("calibration loop %.1f us at the start, %.1f us at the end (a busy machine shows"
      " here)\n" % tuple(m["calibration_us"]))
    cp = res["cpython"]
    w("\n== CPython: time per call (median of %d timeit repeats)\n" % cp["repeats"])
    w("  %-44s %10s %10s\n" % ("", "median us", "min us"))
    units = [v for k, v in cp["calls_us"].items() if k.startswith("units.")]
    for k, v in cp["calls_us"].items():
        if not k.startswith("units."):
            w("  %-44s %10.2f %10.2f\n" % (k, v, cp["calls_min_us"][k]))
    if units:
        us = sorted(units)
        w("  %-44s %10.2f us (%.2f..%.2f)\n" % ("units.* (%d conversions, median)" % len(us),
                                               us[len(us) // 2], us[0], us[-1]))
    for e in cp["errors"]:
        w("  ERROR %s\n" % e)
    if cp["not_timed"]:
        w("  not timed (no case in bench/cases.py): %s\n" % ", ".join(cp["not_timed"]))

    it = res["interpreter"]
    w("\n== Interpreter throughput (fresh Session, every line fed)\n")
    if it.get("skipped"):
        w("  skipped: %s\n" % it["skipped"])
    else:
        for name in ("demo", "session_script"):
            r = it[name]
            w("  %-22s %3d lines %8.2f ms %9.0f lines/s\n" % (name, r["lines"], r["ms"],
                                                            r["lines_per_s"]))
            for e in r["error_lines"]:
                w("    error line: %s\n" % e)

    sc = res["scaling"]
    w("\n== report() scaling (surface %g C / %g C, %g hPa, %g m)\n" % tuple(sc["surface"]))
    w("  %-14s %10s %7s %7s %9s %11s %8s\n" % ("", "top m MSL", "layers", "levels",
                                                "stab rows", "report us", "min us"))
    for r in sc["by_layers"]:
        w("  %-14s %10.0f %7d %7d %9d %11.1f %8.1f\n" % (
            "%d ELR layers" % r["layers_given"], r["top_msl_m"], r["elr_layers"],
            r["path_levels"], r["stability_rows"], r["report_us"], r["report_min_us"]))
    for r in sc["by_top"]:
        w("  %-14s %10.0f %7d %7d %9d %11.1f %8.1f\n" % (
            "top %g m" % r["top_given_m"], r["top_msl_m"], r["elr_layers"],
            r["path_levels"], r["stability_rows"], r["report_us"], r["report_min_us"]))

    acc = res["accuracy"]["saturated_ascent"]
    w("\n== saturated_ascent %g -> %g hPa, start %s C; reference %s (vs double step %.1e K)\n"
      % (acc["from_hpa"], acc["to_hpa"], "/".join(acc["err_k_by_start_c_keys"]),
         acc["reference"], acc["reference_vs_double_step_k"]))
    w("  %7s %9s %14s %12s\n" % ("dlnp", "es evals", "max |err| K", "us/call"))
    for r in acc["rows"]:
        mark = "  <- default" if r["dlnp"] == acc["default_dlnp"] else ""
        w("  %7g %9d %14.2e %12.1f%s\n" % (r["dlnp"], r["es_evals"], r["max_abs_err_k"],
                                           r["us_per_call"], mark))

    ps = res["accuracy"]["parcel_step"]
    mpy_step = res["micropython"]["vm"].get("report_us_by_max_step_m") or {}
    mpy_alloc = res["micropython"]["vm"].get("report_alloc_bytes_by_max_step_m") or {}
    for name, c in ps["columns"].items():
        w("\n== parcel level spacing, %s column (reference CAPE %.1f J/kg)\n"
          % (name, c["reference_cape_j_kg"]))
        w("  %10s %6s %8s %9s %7s %9s %9s %8s %8s %9s\n" % (
            "max step m", "levels", "es evals", "report us", "min us", "CAPE J/kg",
            "CAPE err", "Tp err K", "mpy us", "mpy alloc"))
        for r in c["rows"]:
            mark = "  <- MAX_STEP_M" if r["max_step_m"] == ps["default_max_step_m"] else ""
            mpy_us = mpy_step.get("%g" % r["max_step_m"]) if name == "bench" else None
            mpy_b = mpy_alloc.get("%g" % r["max_step_m"]) if name == "bench" else None
            w("  %10g %6d %8d %9.1f %7.1f %9.1f %9.2f %8s %8s %9s%s\n" % (
                r["max_step_m"], r["levels"], r["es_evals"], r["report_us"],
                r["report_min_us"], r["cape_j_kg"], r["cape_err_j_kg"],
                _fmt(r["top_parcel_err_k"], "%.1e"), _fmt(mpy_us, "%.0f"),
                _fmt(mpy_b, "%d"), mark))

    mp = res["micropython"]
    w("\n== MicroPython, WebAssembly port %s (npm) under node %s; not a board\n"
      % (mp["vm"].get("port_version") or "", res["machine"]["node"] or "-"))
    vm = mp["vm"]
    if vm.get("skipped"):
        w("  skipped: %s\n" % vm["skipped"])
    else:
        w("  report() x%-4s %10s ms   (%s us each)\n" % (
            vm["report_runs"], _fmt(None if vm["report_us"] is None
                                    else vm["report_us"] * vm["report_runs"] / 1000.0),
            _fmt(vm["report_us"], "%.0f")))
        w("  heap allocated by one report() %8s bytes\n" % _fmt(vm["report_alloc_bytes"], "%d"))
        w("  heap held after import: all %s, report() needs %s, shell %s bytes\n" % (
            _fmt(vm["import_all_heap_bytes"], "%d"), _fmt(vm["import_report_heap_bytes"], "%d"),
            _fmt(vm["import_shell_heap_bytes"], "%d")))
        w("  interpreter session script: %s lines/s (%s ms, %s bytes allocated)\n" % (
            _fmt(vm["session_lines_per_s"], "%.0f"), _fmt(vm["session_ms"]),
            _fmt(vm["session_alloc_bytes"], "%d")))
        for e in vm["errors"]:
            w("  ERROR %s\n" % e)
    sz = mp["mpy"]
    if sz.get("skipped"):
        w("  .mpy sizes skipped: %s\n" % sz["skipped"])
    else:
        w("  .mpy bytes: %s; total %d\n" % (
            ", ".join("%s %d" % kv for kv in sz["modules"].items()), sz["total_bytes"]))

    w("\n== Targets (measured, not asserted)\n")
    for t in res["targets"]:
        w("  %-40s %10s %-7s %s %g %s\n" % (
            t["what"], _fmt(t["measured"]), t["unit"], t["direction"], t["limit"],
            "MET" if t["met"] else ("n/a" if t["met"] is None else "NOT MET")))


def targets(res):
    calls = res["cpython"]["calls_us"]
    it = res["interpreter"]
    got = {
        "report_us": calls.get("Column.report"),
        "report_aloft_us": calls.get("Column.report(9 points aloft)"),
        "cloud_base_exact_us": calls.get("condensation.cloud_base(exact)"),
        "interpreter_lines_per_s": None if it.get("skipped")
        else it["session_script"]["lines_per_s"],
    }
    out = []
    for key, what, limit, unit, direction in TARGETS:
        v = got[key]
        met = None if v is None else (v < limit if direction == "below" else v > limit)
        out.append({"key": key, "what": what, "measured": v, "limit": limit, "unit": unit,
                    "direction": direction, "met": met})
    return out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--quick", action="store_true", help="fewer repeats, coarser references")
    ap.add_argument("--no-mpy", action="store_true", help="skip the MicroPython parts")
    ap.add_argument("--out", default=DEFAULT_OUT, help="JSON file (default bench/results.json)")
    args = ap.parse_args(argv)
    st = Settings(args.quick)
    t_start = time.time()

    res = {"schema": SCHEMA, "quick": args.quick, "machine": machine()}
    cal0 = calibration_us(st)
    rows, errors, not_timed = bench_calls(st)
    res["cpython"] = {"repeats": st.repeats,
                      "calls_us": dict((r["call"], r["us"]) for r in rows),
                      "calls_min_us": dict((r["call"], r["min_us"]) for r in rows),
                      "errors": errors, "not_timed": not_timed}
    res["interpreter"] = bench_interpreter(st)
    res["scaling"] = bench_scaling(st)
    sat = accuracy.dlnp_curve(st)
    sat["err_k_by_start_c_keys"] = ["%g" % t for t in accuracy.START_T_C]
    res["accuracy"] = {
        "saturated_ascent": sat,
        "parcel_step": accuracy.parcel_step_curve(
            [("bench", cases.bench_column()), ("convective", Column.from_qnh(*cases.CONVECTIVE))],
            st),
    }
    if args.no_mpy:
        skip = {"skipped": "--no-mpy given"}
        res["micropython"] = {"vm": skip, "mpy": dict(skip)}
    else:
        col_args = (cases.BENCH_T_C, cases.BENCH_TD_C, cases.BENCH_QNH_HPA, cases.BENCH_ELEV_M,
                    cases.BENCH_LAPSE)
        steps = [r["max_step_m"] for r in
                 res["accuracy"]["parcel_step"]["columns"]["bench"]["rows"]]
        res["micropython"] = {"vm": mpy_runs.measure_vm(col_args, cases.SESSION_SCRIPT,
                                                        args.quick, steps),
                              "mpy": mpy_runs.mpy_sizes()}
    res["machine"]["calibration_us"] = [cal0, calibration_us(st)]
    res["targets"] = targets(res)
    res["run_s"] = time.time() - t_start
    res = sig(res)
    print_table(res)
    out = os.path.abspath(args.out)
    d = os.path.dirname(out)
    if d and not os.path.isdir(d):
        os.makedirs(d)
    with open(out, "w") as f:
        json.dump(res, f, indent=1)
        f.write("\n")
    sys.stdout.write("\nwrote %s in %.1f s\n" % (os.path.relpath(out), res["run_s"]))
    return 0


if __name__ == "__main__":
    sys.exit(main())
