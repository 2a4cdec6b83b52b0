"""A small mutation tester: how many one-token mistakes in a module do the tests catch?

    python3 bench/mutate.py --module stability [--max 60] [--seed 1] [--tests FILES...]
    python3 bench/mutate.py --module metar --list          # the mutants, nothing run
    python3 bench/mutate.py --module parcel --key 'level '  # only mutants whose key matches

Each mutant is one change to the module's syntax tree, with the operators of the
mutation-testing literature: `+`/`-` and `*`/`/` swapped (also in `+=` etc.), `<`/`<=`
and `>`/`>=` swapped, `and`/`or` swapped, a numeric constant nudged by 1 % (an integer
by at least 1) or set to 0 or 1, and `return x` replaced by `return None`. The mutants
of a module are listed in source order, then a seeded sample of `--max` of them is run
(the same seed and source give the same sample). Every mutant runs in a temporary copy
of the repository (never the working tree, so an interrupted run leaves nothing
mutated): `pytest -x -q` on the module's test files (or `--tests`), with a timeout of
three times the unmutated run plus 10 s. A mutant is killed when pytest fails or times
out, survives when it passes.

A survivor is equivalent when no input can tell it from the original (a tolerance in a
loop that converges anyway, a redundant guard). `bench/mutation_equivalent.txt` lists
them, one a line `MODULE KEY -- reason`, and the score leaves them out:
score = killed / (run - equivalent). The key of a mutant (`function op #n`, n counting
the same op in the same function in source order) survives edits elsewhere in the
module; line numbers are printed too. Results go to `--out` (default
bench/mutation.json), one entry per module, merged with the entries already there.

Needs nothing beyond the test extra; uses `.venv/bin/python` when it exists. Run it
with `nice`: a full module takes minutes.
"""
import argparse
import ast
import json
import os
import random
import re
import shutil
import signal
import subprocess
import sys
import tempfile
import time

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
EQUIV_FILE = os.path.join(HERE, "mutation_equivalent.txt")
DEFAULT_OUT = os.path.join(HERE, "mutation.json")

# The test files that exercise each module, fastest and most direct first (-x stops at
# the first failure, so a killed mutant costs little; a survivor costs the whole list).
DEFAULT_TESTS = {
    "moisture": ["test_moisture.py", "test_station.py", "test_report_keys.py", "test_column.py",
                 "test_stability.py"],
    "standard": ["test_standard.py", "test_station.py", "test_report_keys.py", "test_column.py"],
    "condensation": ["test_condensation.py", "test_report_keys.py", "test_parcel.py",
                     "test_column.py", "test_stability.py", "test_station.py"],
    "adiabats": ["test_adiabats.py", "test_parcel.py", "test_stability.py", "test_column.py"],
    "column": ["test_column.py", "test_column_edges.py", "test_report_keys.py", "test_parcel.py",
               "test_stability.py", "test_balloon.py", "test_station.py", "test_board_heap.py"],
    "profile": ["test_column.py", "test_column_edges.py", "test_report_keys.py", "test_parcel.py",
                "test_stability.py", "test_balloon.py", "test_station.py", "test_aloft.py",
                "test_aloft_edges.py", "test_errors.py", "test_board_heap.py"],
    "parcel": ["test_parcel.py", "test_report_keys.py", "test_stability.py", "test_column.py"],
    "stability": ["test_stability.py", "test_parcel.py", "test_report_keys.py",
                  "test_column_edges.py", "test_column.py", "test_board_heap.py"],
    "balloon": ["test_balloon_edges.py", "test_balloon_limits.py", "test_balloon.py",
                "test_balloon_full.py", "test_shell_values.py"],
    "hotair": ["test_balloon_edges.py", "test_balloon_limits.py", "test_balloon.py",
               "test_loadtable.py", "test_shell_values.py"],
    "hotreport": ["test_balloon_edges.py", "test_balloon_limits.py", "test_balloon.py",
                  "test_shell_values.py"],
    "gasballoon": ["test_balloon_edges.py", "test_balloon_limits.py", "test_balloon.py",
                   "test_balloon_full.py", "test_shell_values.py"],
    "settings": ["test_settings_limits.py", "test_settings_words.py", "test_shell.py",
                 "test_shell_values.py", "test_metar.py", "test_aloft_words.py"],
    "airsettings": ["test_settings_limits.py", "test_settings_words.py", "test_shell.py",
                    "test_shell_values.py", "test_metar.py", "test_aloft_words.py"],
    "settingline": ["test_settings_words.py", "test_settings_limits.py", "test_shell.py",
                    "test_aloft_words.py", "test_board_session.py"],
    "typed": ["test_typed.py", "test_settings_limits.py", "test_shell.py", "test_units.py"],
    "metar": ["test_metar.py", "test_settings_limits.py", "test_shell.py"],
    "indicated": ["test_altimetry_edges.py", "test_altimetry.py", "test_report_keys.py",
                  "test_float32.py"],
    "altimetry": ["test_altimetry_edges.py", "test_altimetry.py", "test_shell_altimetry.py",
                  "test_shell_values.py", "test_column.py"],
    "altitext": ["test_altimeter_words.py", "test_shell_altimetry.py", "test_shell_values.py"],
    "altiwords": ["test_altimeter_words.py", "test_shell_altimetry.py", "test_shell_values.py"],
    "hazards": ["test_hazards.py", "test_report_keys.py", "test_shell.py",
                "test_board_heap.py"],
    "cautions": ["test_hazards.py", "test_board_heap.py", "test_report_keys.py",
                 "test_shell.py"],
    "thermals": ["test_hazards.py", "test_report_keys.py", "test_stability.py",
                 "test_board_heap.py"],
    "icing": ["test_hazards.py", "test_report_keys.py", "test_column_edges.py", "test_chart.py"],
    "precip": ["test_hazards.py", "test_report_keys.py", "test_float32.py"],
    "fieldrisk": ["test_hazards.py", "test_report_keys.py"],
    "loadtable": ["test_loadtable.py", "test_balloon.py", "test_shell_values.py"],
    "aloft": ["test_aloft_edges.py", "test_aloft.py", "test_report_keys.py", "test_column.py"],
    "aloftpoints": ["test_aloft_edges.py", "test_aloft.py", "test_column.py"],
    "aloftwords": ["test_aloft_words.py",
                   "test_shell.py::test_aloft_points_merge_replace_and_build_the_column",
                   "test_shell.py::test_aloft_and_trop_refusals_change_nothing",
                   "test_shell.py::test_trop_sets_and_turns_off_the_isothermal_part",
                   "test_shell.py::test_isa_temperatures_as_points_give_the_isa_pressures",
                   "test_chart.py::test_points_aloft_and_tropopause_are_marked"],
    "balloonwords": ["test_balloon_text.py", "test_shell_values.py", "test_board_session.py",
                     "test_shell.py"],
    "balloontext": ["test_balloon_text.py", "test_shell_values.py", "test_shell.py"],
    "heights": ["test_heights.py", "test_shell_altimetry.py", "test_shell_values.py",
                "test_shell.py"],
    "machine": ["test_heights.py", "test_output.py", "test_shell.py"],
    "jsontext": ["test_jsontext.py", "test_output.py"],
    "layout": ["test_text_tables.py", "test_balloon_text.py", "test_shell.py",
               "test_shell_values.py"],
    "reporttext": ["test_text_tables.py", "test_shell.py", "test_shell_values.py",
                   "test_shell_altimetry.py", "test_board_session.py"],
    "queries": ["test_text_tables.py", "test_shell_values.py", "test_jsontext.py",
                "test_output.py", "test_shell.py"],
    "groups": ["test_text_tables.py", "test_shell_values.py"],
    "hazardtext": ["test_text_tables.py", "test_hazards.py"],
    "output": ["test_output.py"],
    "chart": ["test_chart.py"],
    "chartwords": ["test_chart.py", "test_shell.py", "test_shell_values.py"],
    "reportwords": ["test_text_tables.py", "test_shell_values.py", "test_shell_altimetry.py",
                    "test_altimeter_words.py", "test_shell.py", "test_board_session.py"],
    "chartsvg": ["test_chart.py"],
    "dispatch": ["test_dispatch.py", "test_settings_words.py", "test_shell.py",
                 "test_refusal_words.py", "test_board_session.py"],
    "shell": ["test_shell.py", "test_jsontext.py", "test_board_session.py"],
}
COPY = ("lapsecalc", "tests", "bench", "README.md", "DEVELOPERS.md", "pyproject.toml")

_BIN = {ast.Add: ast.Sub, ast.Sub: ast.Add, ast.Mult: ast.Div, ast.Div: ast.Mult}
_CMP = {ast.Lt: ast.LtE, ast.LtE: ast.Lt, ast.Gt: ast.GtE, ast.GtE: ast.Gt}
_BOOL = {ast.And: ast.Or, ast.Or: ast.And}


def _is_number(node):
    return isinstance(node, ast.Constant) and type(node.value) in (int, float)


def _is_str(node):
    return isinstance(node, (ast.JoinedStr,)) or (
        isinstance(node, ast.Constant) and isinstance(node.value, str))


def _nudged(v):
    if isinstance(v, int):
        return v + max(1, abs(v) // 100)
    return v * 1.01 if v != 0.0 else 0.01


def _annotate(tree):
    # Parent links, the enclosing function's qualified name and the nodes to skip
    # (docstrings and raise statements: their numbers are messages, not behaviour).
    skip = set()
    for node in ast.walk(tree):
        for child in ast.iter_child_nodes(node):
            child._parent = node
        if isinstance(node, ast.Raise):
            for sub in ast.walk(node):
                skip.add(id(sub))
    return skip


def _qualname(node):
    names = []
    while node is not None:
        if isinstance(node, (ast.FunctionDef, ast.ClassDef, ast.Lambda)):
            names.append(getattr(node, "name", "<lambda>"))
        node = getattr(node, "_parent", None)
    return ".".join(reversed(names)) or "<module>"


def _candidates(node):
    # (description, apply) pairs for one node; apply mutates the node in place.
    out = []
    if isinstance(node, (ast.BinOp, ast.AugAssign)) and type(node.op) in _BIN:
        if isinstance(node, ast.BinOp) and (_is_str(node.left) or _is_str(node.right)):
            return out
        new = _BIN[type(node.op)]
        out.append(("%s->%s" % (type(node.op).__name__, new.__name__),
                    lambda n, new=new: setattr(n, "op", new())))
    elif isinstance(node, ast.Compare):
        for k, op in enumerate(node.ops):
            if type(op) in _CMP:
                new = _CMP[type(op)]

                def apply(n, k=k, new=new):
                    n.ops[k] = new()
                out.append(("%s->%s" % (type(op).__name__, new.__name__), apply))
    elif isinstance(node, ast.BoolOp):
        new = _BOOL[type(node.op)]
        out.append(("%s->%s" % (type(node.op).__name__, new.__name__),
                    lambda n, new=new: setattr(n, "op", new())))
    elif _is_number(node):
        v = node.value
        for w in (_nudged(v), type(v)(0), type(v)(1)):
            if w != v:
                out.append(("const %r->%r" % (v, w), lambda n, w=w: setattr(n, "value", w)))
    elif isinstance(node, ast.Return) and node.value is not None and not (
            isinstance(node.value, ast.Constant) and node.value.value is None):
        out.append(("return->None", lambda n: setattr(n, "value", ast.Constant(None))))
    return out


def _is_docstring(node):
    parent = getattr(node, "_parent", None)
    return (isinstance(parent, ast.Expr) and isinstance(node, ast.Constant)
            and isinstance(node.value, str))


def mutants(source):
    """Every mutant of source, in source order: a list of dicts (index into the
    walk, variant, line, function, description, key)."""
    tree = ast.parse(source)
    skip = _annotate(tree)
    found = []
    for idx, node in enumerate(ast.walk(tree)):
        if id(node) in skip or _is_docstring(node):
            continue
        for var, (desc, _) in enumerate(_candidates(node)):
            found.append({"node": idx, "variant": var, "line": node.lineno,
                          "col": node.col_offset, "function": _qualname(node), "desc": desc})
    found.sort(key=lambda m: (m["line"], m["col"], m["node"], m["variant"]))
    seen = {}
    for m in found:
        base = "%s %s" % (m["function"], m["desc"])
        seen[base] = seen.get(base, 0) + 1
        m["key"] = "%s #%d" % (base, seen[base])
    return found


def mutated_source(source, m):
    """The module's source with mutant m applied (regenerated from the tree)."""
    tree = ast.parse(source)
    _annotate(tree)
    for idx, node in enumerate(ast.walk(tree)):
        if idx == m["node"]:
            _candidates(node)[m["variant"]][1](node)
            break
    return ast.unparse(ast.fix_missing_locations(tree)) + "\n"


def load_equivalent(path=EQUIV_FILE):
    """{module: {key: reason}} from the equivalent-survivors file."""
    out = {}
    if not os.path.exists(path):
        return out
    with open(path) as f:
        for line in f:
            line = line.strip()
            if not line or line.startswith("#"):
                continue
            head, _, reason = line.partition(" -- ")
            module, _, key = head.partition(" ")
            out.setdefault(module, {})[key.strip()] = reason.strip()
    return out


def _copy_repo(dst):
    ignore = shutil.ignore_patterns("__pycache__", "node_modules", ".hypothesis", "*.pyc")
    for name in COPY:
        src = os.path.join(ROOT, name)
        if os.path.isdir(src):
            shutil.copytree(src, os.path.join(dst, name), ignore=ignore)
        elif os.path.exists(src):
            shutil.copy2(src, os.path.join(dst, name))
    nm = os.path.join(ROOT, "tests", "mpy", "node_modules")
    if os.path.isdir(nm):
        os.symlink(nm, os.path.join(dst, "tests", "mpy", "node_modules"))


def _run(cmd, cwd, env, timeout):
    # pytest in its own process group, killed whole on timeout. (returncode, seconds)
    # with returncode None on timeout.
    t0 = time.time()
    proc = subprocess.Popen(cmd, cwd=cwd, env=env, stdout=subprocess.PIPE,
                            stderr=subprocess.STDOUT, start_new_session=True)
    try:
        out, _ = proc.communicate(timeout=timeout)
        return proc.returncode, time.time() - t0, out.decode("utf-8", "replace")
    except subprocess.TimeoutExpired:
        os.killpg(proc.pid, signal.SIGKILL)
        proc.communicate()
        return None, time.time() - t0, ""


def _python():
    venv = os.path.join(ROOT, ".venv", "bin", "python")
    return venv if os.path.exists(venv) else sys.executable


def _sample(muts, module, n, seed):
    if n is None or n >= len(muts):
        return list(muts)
    rng = random.Random("%s:%d" % (module, seed))
    picked = sorted(rng.sample(range(len(muts)), n))
    return [muts[i] for i in picked]


def run_module(module, tests, max_n, seed, key_filter, python, verbose):
    path = os.path.join(ROOT, "lapsecalc", module + ".py")
    with open(path) as f:
        source = f.read()
    allm = mutants(source)
    if key_filter:
        allm = [m for m in allm if re.search(key_filter, m["key"])]
    chosen = _sample(allm, module, max_n, seed)
    equiv = load_equivalent().get(module, {})
    tmp = tempfile.mkdtemp(prefix="lc-mutate-")
    try:
        _copy_repo(tmp)
        target = os.path.join(tmp, "lapsecalc", module + ".py")
        env = dict(os.environ, PYTHONDONTWRITEBYTECODE="1", HYPOTHESIS_PROFILE="ci",
                   PYTHONPATH=tmp, CI="true")
        where = subprocess.run([python, "-c", "import lapsecalc; print(lapsecalc.__file__)"],
                               cwd=tmp, env=env, stdout=subprocess.PIPE,
                               universal_newlines=True).stdout.strip()
        if not where.startswith(tmp):
            raise SystemExit("the temporary copy is not the one imported (%s)" % where)
        with open(target, "w") as f:    # the regenerated (unparsed) source must pass too
            f.write(ast.unparse(ast.parse(source)) + "\n")
        sel = [os.path.join("tests", t) if not t.startswith("tests") else t for t in tests]
        cmd = [python, "-m", "pytest", "-x", "-q", "-p", "no:cacheprovider",
               "-o", "addopts=", *sel]
        rc, base_s, out = _run(cmd, tmp, env, 600)
        if rc != 0:
            raise SystemExit("the unmutated tests fail (%s):\n%s" % (rc, out[-3000:]))
        timeout = 3.0 * base_s + 10.0
        print("%s: %d mutants, running %d; tests %s (%.1f s unmutated)"
              % (module, len(allm), len(chosen), " ".join(tests), base_s), flush=True)
        results = []
        for i, m in enumerate(chosen, 1):
            with open(target, "w") as f:
                f.write(mutated_source(source, m))
            rc, secs, _ = _run(cmd, tmp, env, timeout)
            status = "timeout" if rc is None else ("survived" if rc == 0 else "killed")
            if status == "survived" and m["key"] in equiv:
                status = "equivalent"
            results.append(dict(m, status=status))
            if verbose or status == "survived":
                print("  [%d/%d] %-10s L%-4d %s" % (i, len(chosen), status, m["line"], m["key"]),
                      flush=True)
        with open(target, "w") as f:
            f.write(source)
    finally:
        shutil.rmtree(tmp, ignore_errors=True)
    lines = source.splitlines()
    count = {s: sum(1 for r in results if r["status"] == s)
             for s in ("killed", "timeout", "survived", "equivalent")}
    judged = len(results) - count["equivalent"]
    score = (count["killed"] + count["timeout"]) / judged if judged else 1.0
    entry = {"mutants": len(allm), "run": len(results), "seed": seed, "max": max_n,
             "key_filter": key_filter or None, "tests": tests, **count,
             "score": round(score, 4),
             "survivors": [{"line": r["line"], "key": r["key"],
                            "code": lines[r["line"] - 1].strip()}
                           for r in results if r["status"] == "survived"],
             "equivalent_seen": [r["key"] for r in results if r["status"] == "equivalent"]}
    return entry


def _rejudged(e, equiv):
    # A run's entry with the survivors judged equivalent since (now in the equivalent
    # file) counted as equivalent, and its score recomputed.
    moved = [x for x in e["survivors"] if x["key"] in equiv]
    if not moved:
        return e
    e = dict(e, survivors=[x for x in e["survivors"] if x["key"] not in equiv],
             survived=e["survived"] - len(moved), equivalent=e["equivalent"] + len(moved),
             equivalent_seen=list(e["equivalent_seen"]) + [x["key"] for x in moved])
    judged = e["run"] - e["equivalent"]
    e["score"] = (e["killed"] + e["timeout"]) / judged if judged else 1.0
    return e


def markdown(after, before, equiv):
    """The per-module table (before and after) and the equivalent survivors, as
    Markdown lines."""
    out = ["| module | mutants | run | killed | timeout | survived | equivalent | score |"
           " before |", "|---|---|---|---|---|---|---|---|---|"]
    tot = dict.fromkeys(("mutants", "run", "killed", "timeout", "survived", "equivalent"), 0)
    btot = [0, 0]
    # An entry named "MODULE [functions]" is a --key run of MODULE (its own row).
    after = dict((name, _rejudged(e, equiv.get(name.split(" ")[0], {})))
                 for name, e in after.items())
    for name in sorted(after):
        e = after[name]
        b = before.get(name)
        for k in tot:
            tot[k] += e[k]
        if b:
            btot[0] += b["killed"] + b["timeout"]
            btot[1] += b["run"] - b.get("equivalent", 0)
        out.append("| %s | %d | %d | %d | %d | %d | %d | %.1f %% | %s |" % (
            name, e["mutants"], e["run"], e["killed"], e["timeout"], e["survived"],
            e["equivalent"], 100 * e["score"],
            "%.1f %% (%d run)" % (100 * b["score"], b["run"]) if b else "-"))
    judged = tot["run"] - tot["equivalent"]
    out.append("| all | %d | %d | %d | %d | %d | %d | %.1f %% | %s |" % (
        tot["mutants"], tot["run"], tot["killed"], tot["timeout"], tot["survived"],
        tot["equivalent"], 100.0 * (tot["killed"] + tot["timeout"]) / max(judged, 1),
        "%.1f %%" % (100.0 * btot[0] / btot[1]) if btot[1] else "-"))
    out += ["", "Survivors judged equivalent (from `bench/mutation_equivalent.txt`; those"
            " met in this run are marked *):", ""]
    for module in sorted(equiv):
        seen = set(k for name in after if name.split(" ")[0] == module
                   for k in after[name].get("equivalent_seen", ()))
        for key, reason in sorted(equiv[module].items()):
            out.append("- %s`%s %s`: %s" % ("*" if key in seen else "", module, key, reason))
    left = [(m, s) for m in sorted(after) for s in after[m]["survivors"]]
    if left:
        out += ["", "Survivors not judged equivalent:", ""]
        out += ["- `%s %s` (line %d): `%s`" % (m, s["key"], s["line"], s["code"]) for m, s in left]
    return out


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--module", action="append", default=[],
                    help="module of lapsecalc (repeatable), e.g. stability")
    ap.add_argument("--max", type=int, default=None, help="sample at most this many mutants")
    ap.add_argument("--seed", type=int, default=1)
    ap.add_argument("--tests", nargs="+", help="test files (default: the module's list)")
    ap.add_argument("--key", help="only mutants whose key matches this regular expression")
    ap.add_argument("--list", action="store_true", help="list the mutants, run nothing")
    ap.add_argument("--show", help="print the mutated line(s) of the mutant with this key")
    ap.add_argument("--out", default=DEFAULT_OUT, help="JSON file (default bench/mutation.json)")
    ap.add_argument("--no-write", action="store_true", help="print only")
    ap.add_argument("-v", "--verbose", action="store_true", help="a line per mutant")
    ap.add_argument("--markdown", metavar="PATH",
                    help="write the table of --out (with bench/mutation_before.json) and the"
                    " equivalent survivors as Markdown to PATH, run nothing")
    args = ap.parse_args(argv)
    signal.signal(signal.SIGTERM, lambda *a: (_ for _ in ()).throw(KeyboardInterrupt()))
    if args.markdown:
        with open(args.out) as f:
            after = json.load(f)
        before_path = os.path.join(HERE, "mutation_before.json")
        before = {}
        if os.path.exists(before_path):
            with open(before_path) as f:
                before = json.load(f)
        with open(args.markdown, "w") as f:
            f.write("\n".join(markdown(after, before, load_equivalent())) + "\n")
        return 0
    if not args.module:
        ap.error("--module is required")
    summary = {}
    for module in args.module:
        with open(os.path.join(ROOT, "lapsecalc", module + ".py")) as f:
            source = f.read()
        if args.list or args.show:
            for m in mutants(source):
                if args.show and m["key"] != args.show:
                    continue
                print("L%-4d %s" % (m["line"], m["key"]))
                if args.show:
                    print(mutated_source(source, m))
            continue
        tests = args.tests or DEFAULT_TESTS.get(module)
        if not tests:
            raise SystemExit("no default tests for %s: give --tests" % module)
        summary[module] = run_module(module, tests, args.max, args.seed, args.key,
                                     _python(), args.verbose)
        e = summary[module]
        print("%s: score %.1f %% (%d killed, %d timeout, %d survived, %d equivalent of %d run)"
              % (module, 100 * e["score"], e["killed"], e["timeout"], e["survived"],
                 e["equivalent"], e["run"]), flush=True)
        for s in e["survivors"]:
            print("  survivor L%-4d %-40s %s" % (s["line"], s["key"], s["code"][:70]))
    if summary and not args.no_write:
        data = {}
        if os.path.exists(args.out):
            with open(args.out) as f:
                data = json.load(f)
        data.update(summary)
        with open(args.out, "w") as f:
            json.dump(data, f, indent=1, sort_keys=True)
            f.write("\n")
    return 0


if __name__ == "__main__":
    sys.exit(main())
