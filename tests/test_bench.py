"""Smoke test of the benchmark suite (bench/run.py): it runs and writes its JSON.

No timing is asserted (speed targets are measured, not tested). What can fail: the
bench no longer runs, a timed case no longer fits the library's signatures, the
session script has lines the interpreter refuses, or the JSON lacks a section.
"""
import json
import os
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def test_bench_quick_run_writes_json(tmp_path):
    out = tmp_path / "results.json"
    proc = subprocess.run([sys.executable, os.path.join(ROOT, "bench", "run.py"), "--quick",
                           "--no-mpy", "--out", str(out)], cwd=str(tmp_path),
                          stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                          universal_newlines=True, timeout=300)
    assert proc.returncode == 0, proc.stdout[-3000:]
    assert "== Targets" in proc.stdout
    res = json.loads(out.read_text())
    for key in ("schema", "quick", "machine", "cpython", "interpreter", "scaling", "accuracy",
                "micropython", "targets"):
        assert key in res, key
    assert res["quick"] is True
    assert res["machine"]["python"].count(".") == 2
    # Every timed case of the documented API still matches the library (edit
    # bench/cases.py when it changes); helpers inside report() may change more freely.
    api = ("moisture.", "standard.", "condensation.", "adiabats.", "Column", "column.",
           "units.")
    assert [e for e in res["cpython"]["errors"] if e.startswith(api)] == []
    calls = res["cpython"]["calls_us"]
    for name in ("Column.report", "condensation.cloud_base(exact)", "Column(): 1 layer",
                 "Column.report(9 points aloft)"):
        assert calls[name] > 0.0, name
    assert [t["key"] for t in res["targets"]] == ["report_us", "report_aloft_us",
                                                  "cloud_base_exact_us",
                                                  "interpreter_lines_per_s"]
    assert [r["layers_given"] for r in res["scaling"]["by_layers"]] == [1, 4, 16]
    assert [r["top_given_m"] for r in res["scaling"]["by_top"]] == [6000, 10000, 16000, 24000]
    # The accuracy curve shrinks with the step (RK4: about 16 times per halving).
    rows = res["accuracy"]["saturated_ascent"]["rows"]
    errs = [r["max_abs_err_k"] for r in rows]
    assert errs == sorted(errs, reverse=True)
    assert [r["es_evals"] for r in rows] == sorted(r["es_evals"] for r in rows)
    assert res["micropython"]["vm"]["skipped"] == "--no-mpy given"
    it = res["interpreter"]
    if not it.get("skipped"):
        # Lines the interpreter refuses mean SESSION_SCRIPT in bench/cases.py is stale.
        assert it["session_script"]["error_lines"] == []
        assert it["demo"]["error_lines"] == []
