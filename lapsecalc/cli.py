"""Command line of the line interpreter (CPython only): stdin, -e lines, demo, --svg."""
# The interpreter itself is lapsecalc.shell (it runs on MicroPython too); this module
# adds what only a desktop needs: options, a prompt on a terminal, and file writing.
import argparse
import sys

from lapsecalc.shell import Session, PROMPT, read_lines, split_ends, repl
from lapsecalc.chartwords import chart_svg
from lapsecalc.demo import DEMO_LINES


def write_svg(name, svg_text):
    """Write an SVG document to file name; return the line the shell prints."""
    try:
        with open(name, "w", encoding="utf-8") as f:
            f.write(svg_text)
    except OSError as e:
        raise ValueError("cannot write %s: %s" % (name, e.strerror or e))
    return "ok: chart written to %s" % name


def _run(session, lines, echo, out):
    # Feed lines, print their output; the number of lines that gave an error.
    errors = 0
    for line in lines:
        if echo:
            out.write(PROMPT + line + "\n")
        for text in session.feed(line):
            errors += text.startswith(("error:", "error=", "{\"error\""))
            out.write(text + "\n")
        if session.done:
            break
    return errors


def main(argv=None):
    """lapsecalc [demo] [-e LINE ...] [--svg FILE] | lapsecalc page FILE; returns the exit
    status."""
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv[:1] == ["page"]:
        from lapsecalc.page import main as page_main
        return page_main(argv[1:])
    p = argparse.ArgumentParser(
        prog="lapsecalc",
        description="Cloud base, freezing level, density altitude and stability from one"
                    " surface observation and an assumed lapse rate. Reads interpreter lines"
                    " from stdin (type help), or runs the -e lines, or the built-in demo.",
        epilog="lapsecalc page FILE writes the offline page, one HTML file for a tablet"
               " or phone browser (lapsecalc page -h).")
    p.add_argument("what", nargs="?", choices=["demo"],
                   help="run the built-in invented scenario (Orlenmoor Flats)")
    p.add_argument("-e", dest="lines", action="append", metavar="LINE", default=[],
                   help="run LINE and exit (repeatable; runs after the demo)")
    p.add_argument("--svg", metavar="FILE",
                   help="at the end, write the profile chart as SVG to FILE")
    a = p.parse_args(argv)
    session = Session(svg_writer=write_svg)
    out = sys.stdout
    errors = 0
    try:
        if a.what == "demo":
            errors += _run(session, DEMO_LINES, True, out)
        if a.lines:
            errors += _run(session, [x for line in a.lines for x in split_ends(line)], False, out)
        if a.what is None and not a.lines:
            if sys.stdin.isatty():
                try:
                    import readline  # noqa: F401  (line editing and history for input())
                except ImportError:
                    pass
                repl(session, prompt=PROMPT)
                return 0
            errors += _run(session, read_lines(sys.stdin), False, out)
        if a.svg:
            for text in _svg_file(session, a.svg):
                errors += text.startswith(("error:", "error=", "{\"error\""))
                out.write(text + "\n")
        out.flush()
    except KeyboardInterrupt:
        out.write("\n")
        return 130
    except BrokenPipeError:
        return 0
    return 1 if errors else 0


def _svg_file(session, name):
    # The --svg option: the chart of the final state, or one error line.
    try:
        return [write_svg(name, chart_svg(session))]
    except ValueError as e:
        return ["error: %s" % e]


if __name__ == "__main__":
    sys.exit(main())
