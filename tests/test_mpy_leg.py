"""The MicroPython leg from pytest: the self-check under CPython, its comparison with
the VM (skipped without node or tests/mpy/node_modules; tests/mpy/leg.sh runs it again
and fails under CI=true without node), and the subset guard's lists against the VM."""
import os
import shutil
import subprocess
import sys

import pytest

HERE = os.path.dirname(os.path.abspath(__file__))
MPY = os.path.join(HERE, "mpy")
sys.path.insert(0, MPY)
import compare  # noqa: E402  (tests/mpy/compare.py)
import test_subset  # noqa: E402

VM_PKG = os.path.join(MPY, "node_modules", "@micropython", "micropython-webassembly-pyscript")
NO_VM = shutil.which("node") is None or not os.path.isdir(VM_PKG)
needs_vm = pytest.mark.skipif(NO_VM, reason="node or tests/mpy/node_modules missing"
                              " (tests/mpy/leg.sh installs it and runs the comparison)")


def test_selfcheck_passes_under_cpython():
    values = compare.parse(compare.run_cpython())
    # Every public part is in it (the optional modules when their files exist).
    prefixes = {k.split(".")[0] for k in values}
    for p in ("moisture", "standard", "condensation", "adiabats", "units", "limits",
              "report", "column", "parcel", "stability", "err", "version"):
        assert p in prefixes, p
    for module, prefix in (("station", "station"), ("balloon", "balloon"), ("shell", "shell")):
        if os.path.exists(os.path.join(compare.ROOT, "lapsecalc", module + ".py")):
            assert prefix in prefixes, prefix


def test_comparison_rules():
    ref = compare.parse("a=1.0\nb='x'\nc=None\nd=[1.0, 2]\ne=inf\n# note\n"
                        "j='{\"k\": 1.0, \"m\": \"n\"}'")
    assert ref["e"] == float("inf")
    assert compare.compare(ref, dict(ref)) == []
    # 1e-10 relative passes, 1e-8 does not; zero against 1e-12 passes.
    assert compare.same(1000.0, 1000.0 * (1 + 1e-10))
    assert not compare.same(1000.0, 1000.0 * (1 + 1e-8))
    assert compare.same(0.0, 1e-12) and not compare.same(0.0, 1e-6)
    assert not compare.same(1.0, True) and not compare.same(None, 0.0)
    assert not compare.same("a", "b")
    # A json mode line: the same text, but for the key order of a nested object
    # (a board's dict keeps none); numbers as written, no tolerance.
    assert compare.same('{"k": {"a": 1.0, "b": [2]}, "m": "n"}',
                        '{"k": {"b": [2], "a": 1.0}, "m": "n"}')
    assert not compare.same('{"k": 1.0, "m": "n"}', '{"m": "n", "k": 1.0}')
    assert not compare.same('{"k": 1.0}', '{"k": 1.0000000000001}')
    assert not compare.same('{"k": 1.0}', '{"k": 1}')
    assert not compare.same('{"k": {"a": 1.0}}', '{"k": {"a": 1.0, "b": 1.0}}')
    assert not compare.same('{"k": [{"a": 1.0, "b": 2.0}]}', '{"k": [{"a": 1.0}]}')
    got = dict(ref)
    del got["a"]
    got["z"] = 1
    diffs = compare.compare(ref, got)
    assert len(diffs) == 2 and "missing in MicroPython" in diffs[0]


@needs_vm
def test_vm_results_equal_cpython():
    ref = compare.parse(compare.run_cpython())
    got = compare.parse(compare.run_vm())
    assert compare.compare(ref, got) == []


_PROBE = """import builtins, math
print("builtins=" + " ".join(sorted(dir(builtins))))
print("math=" + " ".join(sorted(dir(math))))
m = set()
for t in (str, bytes, int, float, list, dict, tuple, set):
    for n in dir(t):
        m.add(n)
print("methods=" + " ".join(sorted(m)))
"""


@needs_vm
def test_subset_lists_match_the_vm(tmp_path):
    probe = tmp_path / "probe.py"
    probe.write_text(_PROBE)
    out = subprocess.run(["node", os.path.join(MPY, "run.mjs"), str(probe)],
                         stdout=subprocess.PIPE, universal_newlines=True, check=True).stdout
    got = dict(line.split("=", 1) for line in out.splitlines() if "=" in line)
    builtins_vm = set(got["builtins"].split())
    assert set(test_subset.MICROPYTHON_BUILTINS) <= builtins_vm
    assert set(test_subset.ALLOWED_MATH) <= set(got["math"].split())
    assert not set(test_subset.MISSING_METHODS) & set(got["methods"].split())
