"""The full-word board session (tests/mpy/board_session.txt): it uses every word of
the interpreter, and every line does what the file says under CPython. The
MicroPython leg runs the same file from .mpy (bench/mpy_budget.py, accounting in the
WebAssembly VM; tests/mpy/hardlimit.py, a hard heap limit in the Unix port)."""
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "mpy"))
import board_session  # noqa: E402  (tests/mpy/board_session.py)

from lapsecalc import shell, settings

SESSION = os.path.join(HERE, "mpy", "board_session.txt")


def session_lines():
    with open(SESSION) as f:
        return [line.rstrip("\n") for line in f]


def interpreter_words():
    """Every word the interpreter dispatches on (settings, queries, session words)."""
    return set(settings.SETTINGS) | set(shell._WORDS)


def test_every_word_is_in_the_session():
    used = set()
    for line in session_lines():
        words = shell.split_line(line)
        for w in words:
            if w.lower() in interpreter_words():
                used.add(w.lower())
    missing = sorted(interpreter_words() - used)
    assert not missing, "add a line using %s to tests/mpy/board_session.txt" % missing
    # report in all three output modes (text before any "out"), help alone and with a word.
    lines = [x.strip() for x in session_lines() if shell.split_line(x)]
    assert "report" in lines[:lines.index("out kv")]
    for mode in ("kv", "json"):
        assert lines[lines.index("out " + mode) + 1] == "report", mode
    assert "help" in lines and "help elr" in lines


def test_every_line_passes_under_cpython():
    s = shell.Session()
    failed = []
    for n, line in enumerate(session_lines(), 1):
        out = s.feed(line)
        why = board_session.line_failed(line, out)
        if why:
            failed.append((n, line, why))
    assert failed == []
    assert s.done, "the session ends with bye"


def test_line_check_rules():
    ok = board_session.line_failed
    assert ok("temp 27C", ["ok: temp 27.0 C"]) is None
    assert ok("temp 99C", ["error: temp 99C: t=99 is outside"]) is not None
    assert ok("chart", ["x", "error: cannot compute that (MemoryError: ...)"]) is not None
    marked = "svg a.svg  " + board_session.EXPECT_ERROR
    assert ok(marked, ["error: svg writes a file"]) is None
    assert ok(marked, ["ok"]) is not None
    assert ok(marked, ["error: cannot compute that (MemoryError: x); nothing changed"]) \
        is not None
    # A comment that names the marker is still a comment.
    assert ok("# a line marked " + board_session.EXPECT_ERROR, []) is None
