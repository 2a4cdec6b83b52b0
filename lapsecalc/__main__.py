"""python3 -m lapsecalc: the line interpreter's command line (lapsecalc.cli).

On MicroPython (no argparse) it falls back to the plain stdin loop, shell.repl()."""
import sys

try:
    from lapsecalc.cli import main
except ImportError:
    def main(argv=None):
        from lapsecalc.shell import repl
        repl()
        return 0

if __name__ == "__main__":
    sys.exit(main())
