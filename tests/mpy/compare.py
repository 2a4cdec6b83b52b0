"""Run tests/mpy/selfcheck.py under CPython and in the MicroPython VM and compare.

    python3 tests/mpy/compare.py [--pkg DIR]...

Each --pkg is a package folder to run in the VM (default lapsecalc/, e.g. also the
.mpy build of compile_mpy.py); CPython always runs the sources. Every number must
agree to 1e-9 relative (1e-9 absolute for numbers that are zero on one side; both
ports compute in doubles), every other value exactly. A string holding a JSON object
(a line of the interpreter's json output mode) must be the same text, except that the
keys of an object inside it may come in another order (a board's dict keeps no
insertion order: the report's indicated_altitude_m); its numbers are compared as
written. Needs node and tests/mpy/node_modules.
"""
import argparse
import ast
import json
import os
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.abspath(os.path.join(HERE, "..", ".."))
SELFCHECK = os.path.join(HERE, "selfcheck.py")
REL_TOL = 1e-9
ABS_TOL = 1e-9


def parse(text):
    """selfcheck output -> {key: value}; comment lines (#) skipped."""
    out = {}
    for line in text.splitlines():
        if not line or line.startswith("#"):
            continue
        key, sep, rep = line.partition("=")
        if not sep:
            raise ValueError("not key=value: %r" % line)
        if key in out:
            raise ValueError("key twice: %s" % key)
        if rep in ("inf", "-inf", "nan"):
            out[key] = float(rep)
        else:
            out[key] = ast.literal_eval(rep)
    return out


def _is_number(x):
    return isinstance(x, (int, float)) and not isinstance(x, bool)


def same(a, b):
    """True when two selfcheck values agree (numbers to the tolerance)."""
    if _is_number(a) and _is_number(b):
        if a == b:
            return True
        if a != a or b != b:            # nan
            return a != a and b != b
        d = abs(a - b)
        return d <= REL_TOL * max(abs(a), abs(b)) or d <= ABS_TOL
    if isinstance(a, str) and isinstance(b, str) and a != b and a[:1] == "{" and b[:1] == "{":
        try:
            ja, jb = json_pairs(a), json_pairs(b)
        except ValueError:
            return False
        return same_json(ja, jb, True)
    if isinstance(a, dict) and isinstance(b, dict):
        return sorted(a) == sorted(b) and all(same(a[k], b[k]) for k in a)
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(same(x, y) for x, y in zip(a, b))
    return type(a) is type(b) and a == b


def json_pairs(text):
    """A JSON text with each object as ("{}", [(key, value), ...]) in the text's order
    and every number as its text."""
    return json.loads(text, object_pairs_hook=lambda pairs: ("{}", pairs),
                      parse_float=str, parse_int=str)


def same_json(a, b, top=False):
    """True when two json_pairs values are equal, the keys of the top object in the
    same order, those of nested objects in any."""
    if isinstance(a, tuple) and isinstance(b, tuple):
        pa, pb = a[1], b[1]
        if not top:
            pa, pb = sorted(pa, key=lambda kv: kv[0]), sorted(pb, key=lambda kv: kv[0])
        return len(pa) == len(pb) and all(
            ka == kb and same_json(va, vb) for (ka, va), (kb, vb) in zip(pa, pb))
    if isinstance(a, list) and isinstance(b, list):
        return len(a) == len(b) and all(same_json(x, y) for x, y in zip(a, b))
    return type(a) is type(b) and a == b


def compare(ref, got):
    """Differences between two parsed outputs, as lines (empty: they agree)."""
    diffs = []
    for k in sorted(set(ref) | set(got)):
        if k not in got:
            diffs.append("%s: missing in MicroPython (CPython %r)" % (k, ref[k]))
        elif k not in ref:
            diffs.append("%s: missing in CPython (MicroPython %r)" % (k, got[k]))
        elif not same(ref[k], got[k]):
            diffs.append("%s: CPython %r != MicroPython %r" % (k, ref[k], got[k]))
    return diffs


def max_rel_diff(ref, got):
    worst = 0.0
    for k, a in ref.items():
        b = got.get(k)
        if _is_number(a) and _is_number(b) and a != b and a == a and b == b:
            worst = max(worst, abs(a - b) / max(abs(a), abs(b)))
    return worst


def run_cpython(python=sys.executable):
    env = dict(os.environ, PYTHONPATH=ROOT)
    proc = subprocess.run([python, SELFCHECK], cwd=ROOT, env=env, stdout=subprocess.PIPE,
                          stderr=subprocess.STDOUT, universal_newlines=True)
    if proc.returncode != 0:
        raise RuntimeError("selfcheck failed under CPython:\n" + proc.stdout[-3000:])
    return proc.stdout


def run_vm(pkg=None):
    cmd = ["node", os.path.join(HERE, "run.mjs")]
    if pkg:
        cmd += ["--pkg", pkg]
    proc = subprocess.run(cmd + [SELFCHECK], cwd=ROOT, stdout=subprocess.PIPE,
                          stderr=subprocess.STDOUT, universal_newlines=True)
    if proc.returncode != 0:
        raise RuntimeError("selfcheck failed in the MicroPython VM (%s):\n%s"
                           % (pkg or "lapsecalc/", proc.stdout[-3000:]))
    return proc.stdout


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--pkg", action="append", default=[],
                    help="package folder for the VM (repeatable; default lapsecalc/)")
    ap.add_argument("--python", default=sys.executable, help="CPython for the reference run")
    args = ap.parse_args()
    try:
        ref = parse(run_cpython(args.python))
        failed = False
        for pkg in args.pkg or [None]:
            got = parse(run_vm(pkg))
            diffs = compare(ref, got)
            where = pkg or "lapsecalc/"
            if diffs:
                failed = True
                print("selfcheck %s: %d differences from CPython:" % (where, len(diffs)))
                for d in diffs[:40]:
                    print("  " + d)
            else:
                print("selfcheck %s: %d values equal to CPython's (largest relative"
                      " difference %.1e)" % (where, len(ref), max_rel_diff(ref, got)))
    except RuntimeError as e:
        print(e)
        return 1
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
