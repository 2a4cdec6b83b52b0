"""micropython32 (tests/mpy/board32): MicroPython's core built with gcc -m32 and
single-precision floats under our port configuration of a 32-bit board, so that a
hard heap limit (-X heapsize) measures a board's bytes. Checked: the build is 32-bit
with float32, its command line behaves as the Unix port's, and the core report() and
the full-word session run within their board32 ceilings (bench/mpy_budget.py).
Under CI=true it must build (tests/run.sh installs gcc-multilib); elsewhere a missing
gcc -m32 is a skip."""
import os
import shutil
import struct
import subprocess
import sys

import pytest

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "mpy"))
sys.path.insert(0, os.path.join(os.path.dirname(HERE), "bench"))
import hardlimit  # noqa: E402  (tests/mpy/hardlimit.py)
import mpy_budget  # noqa: E402  (bench/mpy_budget.py)


@pytest.fixture(scope="module")
def mp32():
    mp, why = hardlimit.board32_command()
    if mp is None:
        if os.environ.get("CI") == "true":
            pytest.fail("micropython32 cannot be built under CI=true: %s" % why)
        pytest.skip("micropython32 cannot be built: %s" % why)
    return mp


@pytest.fixture(scope="module")
def staged():
    folder = hardlimit.stage()
    yield folder
    shutil.rmtree(folder, ignore_errors=True)


def _run(mp, folder, text, *args, heap="64K"):
    with open(os.path.join(str(folder), "probe.py"), "w") as f:
        f.write(text)
    return subprocess.run([mp, "-X", "heapsize=" + heap, "probe.py"] + list(args),
                          cwd=str(folder), stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                          universal_newlines=True, timeout=60)


def test_the_binary_is_a_32_bit_x86_program(mp32):
    # ELF header (System V ABI, "ELF Identification" and "ELF Header"): e_ident[EI_CLASS]
    # (byte 4) is 1 for ELFCLASS32 (2 would be 64-bit); e_machine (bytes 18-19) 3 is EM_386.
    with open(mp32, "rb") as f:
        head = f.read(20)
    assert head[:4] == b"\x7fELF" and head[4] == 1
    assert struct.unpack("<H", head[18:20])[0] == 3


PROBE = """import gc, struct, sys
print(struct.calcsize("P"), sys.maxsize)
print(1.0 + 2.0 ** -24 == 1.0, 1.0 + 2.0 ** -23 == 1.0, float("3.5e38"))
print(repr(1 / 3))
keep = [None] * 100
gc.collect()
gc.disable()
a = gc.mem_alloc()
for i in range(100):
    keep[i] = i * 0.5
print(gc.mem_alloc() - a)
"""


def test_words_are_4_bytes_and_floats_single_precision(mp32, tmp_path):
    out = _run(mp32, tmp_path, PROBE)
    assert out.returncode == 0, out.stderr
    size, maxsize, f24, f23, big, third, floats = out.stdout.split()
    # A pointer of 4 bytes; sys.maxsize 2**31 - 1 with 32-bit words.
    assert (size, maxsize) == ("4", str(2 ** 31 - 1))
    # IEEE 754 binary32 (IEEE 754-2008, table 3.5): a 24-bit significand, so 1 + 2**-24
    # rounds to 1 (ties to even) and 1 + 2**-23 does not; the largest finite value is
    # (2 - 2**-23) * 2**127 = 3.4028235e38, so 3.5e38 reads as inf. Double precision
    # would give False, False and 3.5e+38.
    assert (f24, f23, big) == ("True", "False", "inf")
    # 1/3 printed is the float32 nearest 1/3, not the double one.
    assert struct.pack("<f", float(third)) == struct.pack("<f", 1 / 3)
    assert float(third) != 1 / 3
    # Each float is a heap object of one GC block: 4 words, 16 bytes with 32-bit words
    # (MicroPython py/gc.c: BYTES_PER_BLOCK = 4 * MP_BYTES_PER_OBJ_WORD); 100 of them
    # take 1600 bytes (plus the loop's range iterator), where the 64-bit Unix port's
    # take 3200.
    assert 1600 <= int(floats) < 1700


CLI = """import sys
print(sys.argv, sys.path[0] == "", __name__, __file__)
with open("probe.py") as f:
    first = f.readline()
    rest = [line for line in f]
print(repr(first), len(rest))
f = open("probe.py")
print(len(f.read()) > 100)
f.close()
try:
    open("no such file")
except OSError as e:
    print("OSError", e.args[0])
if len(sys.argv) > 1 and sys.argv[1] == "exit":
    sys.exit(int(sys.argv[2]))
if len(sys.argv) > 1 and sys.argv[1] == "raise":
    raise ValueError("refused")
"""


def test_the_command_line_is_the_unix_ports(mp32, tmp_path):
    out = _run(mp32, tmp_path, CLI, "a", "b")
    assert out.returncode == 0, out.stderr
    lines = out.stdout.splitlines()
    assert lines[0] == "['probe.py', 'a', 'b'] True __main__ probe.py"
    assert lines[1] == "'import sys\\n' %d" % (CLI.count("\n") - 1)
    assert lines[2:] == ["True", "OSError 2"]  # ENOENT
    assert _run(mp32, tmp_path, CLI, "exit", "3").returncode == 3
    out = _run(mp32, tmp_path, CLI, "raise")
    assert out.returncode == 1
    assert out.stderr.startswith("Traceback (most recent call last):")
    assert out.stderr.rstrip().endswith("ValueError: refused")


def test_the_heap_limit_binds(mp32, staged):
    # The core report() cannot run in 16 KiB: a MemoryError ends it (exit 1).
    ok, tail = hardlimit.run(mp32, staged, "report", 16)
    assert not ok and "MemoryError" in tail


def test_core_report_within_its_board32_ceiling(mp32, staged):
    kib = mpy_budget.board32_ceiling_kib("report")
    ok, tail = hardlimit.run(mp32, staged, "report", kib)
    assert ok, "core report at %d KiB on micropython32:\n%s" % (kib, tail)


def test_session_within_its_board32_ceiling(mp32, staged):
    kib = mpy_budget.board32_ceiling_kib("session")
    ok, tail = hardlimit.run(mp32, staged, "session", kib)
    assert ok, "full-word session at %d KiB on micropython32:\n%s" % (kib, tail)


def test_board32_limits_are_the_board_budgets():
    # Sizes on micropython32 are board bytes: the budget applies as it is (factor 1).
    assert mpy_budget.board32_limit_kib("session") == 64
    assert mpy_budget.board32_limit_kib("report") == 32
    assert hardlimit.limits("board32") == {
        "session": (mpy_budget.board32_ceiling_kib("session"), 64),
        "report": (mpy_budget.board32_ceiling_kib("report"), 32)}


def test_a_second_build_is_a_no_op(mp32):
    before = os.stat(mp32).st_mtime_ns
    assert hardlimit.board32.ensure(log=lambda msg: pytest.fail(msg)) == mp32
    assert os.stat(mp32).st_mtime_ns == before


# The session's interned names against the pool they would open next: micropython32's
# pools of names double, and the name that opens the next one takes a piece of about
# 9 KiB at once, in the middle of a line (the session once crossed it, at 1270 names:
# its hard limit 84 KiB where it needs 75 below it). The count where the heap jumps is
# measured on the binary itself.
POOL_PROBE = """import gc, micropython
micropython.qstr_info()
last = None
for i in range(4000):
    getattr(None, "zq%d" % i, None)
    gc.collect()
    a = gc.mem_alloc()
    if last is not None and a - last > 8000:
        print("jump", i, a - last)
        break
    last = a
"""
SESSION_NAMES = """import sys, micropython
sys.path.insert(0, ".")
import board_session
board_session.main([%r])
micropython.qstr_info()
"""


def _names(text):
    # n_qstr of the last "qstr pool: ..." line micropython.qstr_info() printed.
    pool = [x for x in text.splitlines() if x.startswith("qstr pool:")][-1]
    return int(pool.split("n_qstr=")[1].split(",")[0])


def test_the_session_names_stay_below_the_next_pool(mp32, staged):
    probe = _run(mp32, staged, POOL_PROBE, heap="1024K")
    assert probe.returncode == 0, probe.stderr
    jump = [x.split() for x in probe.stdout.splitlines() if x.startswith("jump")][0]
    # The big pool opens at the name after the names there at the start plus i.
    opens_at = _names(probe.stdout) + int(jump[1]) + 1
    assert int(jump[2]) < 12000  # a pool of about 9 KiB: the one the session must not open
    run = _run(mp32, staged, SESSION_NAMES % hardlimit.LIB, heap="1024K")
    assert run.returncode == 0, run.stdout[-500:] + run.stderr
    assert "board session: 76 lines OK" in run.stdout or "lines OK" in run.stdout
    used = _names(run.stdout)
    # Room for about two new modules' names before the cliff; a word that needs more
    # writes private constants as const() or takes names out first (DEVELOPERS.md).
    assert used + 24 < opens_at, (used, opens_at)
