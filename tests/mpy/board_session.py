"""The full-word board session (tests/mpy/board_session.txt) on MicroPython.

    micropython [-X heapsize=96K] board_session.py [PKG_PARENT [SESSION_FILE [account]]]

Runs every line of the session file through one lapsecalc.shell.Session (lines read
one at a time, so the script itself holds almost nothing) and exits 1 naming each
line that failed: an output line starting "error:" (a MemoryError inside a word comes
back as "error: cannot compute that (MemoryError ...)"; errors in kv and json
mode too), or, on a line marked "#!error", anything but an ordinary error. With "account" it also measures,
per line, the heap held before it (after collections) and what the line allocates
with the collector off (a collection inside the line, Session.collect(), ends a
stage: the heap just before it counts as the line's peak), and prints the largest sum (the heap the session needs when
a collection runs between lines; on the Unix port, whose collector works inside a
run). PKG_PARENT is the folder holding lapsecalc/ (default: the current one);
SESSION_FILE defaults to board_session.txt beside this script. tests/mpy/run.mjs
--session uses line_failed() to account line by line in the WebAssembly VM.
"""
import gc
import sys

EXPECT_ERROR = "#!error"


def _is_error(o):
    # An error line in any output mode: "error: ..." (text), "error=..." (kv),
    # {"error": ...} (json).
    return o[:6] in ("error:", "error=") or o[:9] == '{"error":'


def line_failed(line, out):
    """Why the output lines out of line are a failure, or None."""
    unforeseen = [o for o in out if o.find("cannot compute") >= 0]
    if line[:1] == "#" or line.find(EXPECT_ERROR) < 0:
        errors = [o for o in out if _is_error(o)]
        return (unforeseen or errors or [None])[0]
    if not out or not _is_error(out[0]) or unforeseen:
        return "wanted an ordinary error, got %r" % (out,)
    return None


def written(text):
    """A measured session's Session.write (a board's repl sets it to write to its
    console): a json line's pieces, written as they come, are let go of here."""
    return None


def held():
    gc.collect()
    gc.collect()
    return gc.mem_alloc()


def numbered_lines(f):
    """(number, line without its newline) of each line of file f, read one at a time
    (the script holds one line, not the file)."""
    n = 0
    while True:
        line = f.readline()
        if not line:
            return
        n += 1
        yield n, line.rstrip("\n")


def main(args):
    if args:
        sys.path.insert(0, args[0])
    here = __file__.rsplit("/", 1)[0] if "/" in __file__ else "."
    account = len(args) > 2 and args[2] == "account"
    f = open(args[1] if len(args) > 1 else here + "/board_session.txt")
    base = held()
    from lapsecalc.shell import Session
    s = Session()
    s.write = written  # as repl() on a board: json lines written as they come
    peak = [0]
    if account:
        s.collect_after_line = False  # collected below, between lines

        def collect():
            # A collection inside a line ends a stage: the heap just before it is a peak.
            m = gc.mem_alloc()
            if m > peak[0]:
                peak[0] = m
            gc.collect()
        s.collect = collect
        print("import_heap_bytes=%d" % (held() - base))
    worst = worst_line = n = bad = 0
    for n, line in numbered_lines(f):
        if account:
            h = held() - base
            gc.disable()
            a0 = gc.mem_alloc()
            peak[0] = 0
            out = s.feed(line)
            a = max(gc.mem_alloc(), peak[0]) - a0
            gc.enable()
            if h + a > worst:
                worst, worst_line = h + a, n
            print("line %2d held %6d alloc %6d need %6d | %s" % (n, h, a, h + a, line[:40]))
        else:
            out = s.feed(line)
        why = line_failed(line, out)
        out = None
        if why:
            print("line %d failed: %s -> %s" % (n, line, why))
            bad += 1
    f.close()
    if account:
        print("session_lines=%d" % n)
        print("session_need_bytes=%d" % worst)
        print("session_need_line=%d" % worst_line)
    if bad:
        print("board session: %d line(s) failed" % bad)
        sys.exit(1)
    print("board session: %d lines OK" % n)


if __name__ == "__main__":
    main(sys.argv[1:])
