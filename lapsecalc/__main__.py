"""python3 -m lapsecalc: run the line interpreter (CPython command line)."""
import sys
from lapsecalc.column import Column
from lapsecalc.demo import DEMO_COLUMN


def main(argv=None):
    args = sys.argv[1:] if argv is None else argv
    if args[:1] == ["demo"]:
        t, td, q, elev, layers = DEMO_COLUMN
        r = Column.from_qnh(t, td, q, elev, layers).report()
        for k in r:
            print("%s=%s" % (k, r[k]))
        return 0
    print("usage: python3 -m lapsecalc demo")
    return 2


if __name__ == "__main__":
    sys.exit(main())
