"""Which lapsecalc modules go on a board: read from the mip manifests.

lapsecalc/package.json lists the core (what a weather station needs) and
lapsecalc/package-full.json the whole board set (core plus the interpreter
extras). Every other lapsecalc/*.py is CPython-only (listed below).
Plain Python, used by compile_mpy.py, bench/mpy_budget.py and the tests.
"""
import json
import os

ROOT = os.path.abspath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
PKG = os.path.join(ROOT, "lapsecalc")
CORE_MANIFEST = os.path.join(PKG, "package.json")
FULL_MANIFEST = os.path.join(PKG, "package-full.json")
# Modules that need CPython (argparse, files): never installed on a board.
CPYTHON_ONLY = ("__main__", "cli", "page")
# Modules written in the MicroPython subset (tests/test_subset.py checks them) that the
# board manifests do not list yet (when the board session heap, bench/mpy_budget.py,
# has no room for them): none now. The core's Column.report() uses hazards when it is
# installed.
BOARD_LATER = ()


def hide_later():
    """Hide the BOARD_LATER modules from CPython's imports, so that CPython runs the
    board set (for comparisons with the VM); returns a function that shows them again."""
    import sys
    pkg = sys.modules.get("lapsecalc")
    saved, attrs = {}, {}
    for m in BOARD_LATER:
        saved[m] = sys.modules.get("lapsecalc." + m)
        sys.modules["lapsecalc." + m] = None
        if pkg is not None and m in pkg.__dict__:
            attrs[m] = pkg.__dict__.pop(m)

    def undo():
        for m in BOARD_LATER:
            if saved[m] is None:
                sys.modules.pop("lapsecalc." + m, None)
            else:
                sys.modules["lapsecalc." + m] = saved[m]
            if m in attrs:
                setattr(pkg, m, attrs[m])
    return undo


def read_manifest(path):
    with open(path) as f:
        return json.load(f)


def manifest_modules(path):
    """Module names (no .py) of the files a manifest installs, in its order."""
    out = []
    for target, _ in read_manifest(path)["urls"]:
        folder, name = target.rsplit("/", 1)
        if folder != "lapsecalc" or not name.endswith(".py"):
            raise ValueError("%s: %r is not lapsecalc/NAME.py" % (path, target))
        out.append(name[:-3])
    return out


def core_modules():
    return manifest_modules(CORE_MANIFEST)


def board_modules():
    return manifest_modules(FULL_MANIFEST)


def extra_modules():
    core = core_modules()
    return [m for m in board_modules() if m not in core]


def source_modules(pkg=PKG):
    """Every lapsecalc/*.py module name, sorted."""
    return sorted(n[:-3] for n in os.listdir(pkg) if n.endswith(".py"))
