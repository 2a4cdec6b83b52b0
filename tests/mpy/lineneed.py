"""Each line of the full-word board session: the heap it finds held and the least
free heap it needs, on MicroPython (the Unix port, by tests/mpy/hardlimit.py --lines).

    micropython -X heapsize=1024K lineneed.py [PKG_PARENT [SESSION_FILE]]

For every line: collect, then fill the free heap with ballast (bytearrays, largest
first, so that holes are filled too) until only F KiB are free, and feed the line; a
line that fails (MemoryError, or an error line where none is wanted: board_session's
line_failed) leaves the session state as it was, so it is run again with more room.
A bisection finds the least F in 1 KiB steps, each run from the session as the line
found it (need_kib). Prints per line
"held H need N total T | line" in KiB: a hard heap limit must be at least about the
largest total (fragmentation adds a little). The last line that ran is then fed once
more without ballast, so the session goes on as in board_session.py.
"""
import gc
import sys

_MAX_KIB = 512


def ballast(free_bytes):
    """Allocations that leave about free_bytes of the heap free."""
    gc.collect()
    gc.collect()
    keep = []
    size = 16384
    while size >= 16:
        while gc.mem_free() - size - 16 > free_bytes:
            try:
                keep.append(bytearray(size))
            except MemoryError:
                break
        size //= 2
    return keep


def runs(s, line, free_kib, line_failed):
    keep = ballast(free_kib * 1024)
    try:
        out = s.feed(line)
    except MemoryError:
        out = ["error: cannot compute that (MemoryError)"]
    keep = None
    gc.collect()
    return line_failed(line, out) is None


def need_kib(s, line, line_failed):
    """The least free heap (KiB) line runs in, None when not even in _MAX_KIB. Every
    run starts from the session as the line found it: its state, and the report kept
    or not (a kept one computed afresh before each run, none held here: a line that
    lets go of it frees it), so a line that computes the report computes it each time."""
    before = (s.state, dict(s.disp), s.mode)
    kept = None if s._rep is None else ("report" if s._rep_alt else "base")

    def restore():
        s.state, disp, s.mode = before
        s.disp = dict(disp)
        s._col = s._rep = None
        if kept is not None:
            s.report(kept)
            s.release()

    def again(free_kib):
        restore()
        return runs(s, line, free_kib, line_failed)
    lo, hi = 0, _MAX_KIB
    if not again(hi):
        restore()
        return None
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if again(mid):
            hi = mid
        else:
            lo = mid
    restore()
    return hi


def main(args):
    if args:
        sys.path.insert(0, args[0])
    here = __file__.rsplit("/", 1)[0] if "/" in __file__ else "."
    sys.path.insert(0, here)
    from board_session import line_failed, held, numbered_lines, written
    f = open(args[1] if len(args) > 1 else here + "/board_session.txt")
    base = held()
    from lapsecalc.shell import Session
    s = Session()
    s.write = written  # as repl() on a board (board_session.py)
    worst = 0
    for n, line in numbered_lines(f):
        if not line.strip() or line[0] == "#":
            s.feed(line)
            continue
        h = (held() - base) / 1024
        need = need_kib(s, line, line_failed)
        s.feed(line)
        if need is None:
            print("line %2d held %5.1f need  >%d | %s" % (n, h, _MAX_KIB, line[:40]))
            continue
        worst = max(worst, h + need)
        print("line %2d held %5.1f need %3d total %5.1f | %s" % (n, h, need, h + need, line[:40]))
    f.close()
    print("lines_worst_total_kib=%.1f" % worst)


if __name__ == "__main__":
    main(sys.argv[1:])
