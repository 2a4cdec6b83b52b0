"""The core's Column.report() on MicroPython, for the hard heap limit.

    micropython -X heapsize=48K board_report.py [PKG_PARENT]

Builds three invented columns one after the other (the demo field, a plain one-rate
column, a deep hot three-layer one to 32 km) and runs report() on each, keeping only
a few numbers. Prints "board report: OK" or raises (MemoryError) with exit 1.
PKG_PARENT is the folder holding lapsecalc/ (default: the current one).
"""
import sys

COLUMNS = (
    (27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)]),
    (22.0, 12.0, 1005.0, 150.0, 6.5),
    (35.0, 24.0, 1008.0, 20.0, [(1000.0, 9.0), (3000.0, 7.0), (None, 6.0)], 32000.0),
)


def main(args):
    if args:
        sys.path.insert(0, args[0])
    from lapsecalc.column import Column
    for args in COLUMNS:
        rep = Column.from_qnh(*args).report(2.0)
        print("cloud base %.0f m AGL, CAPE %.0f J/kg" % (rep["cloud_base_agl_m"],
                                                        rep["cape_j_kg"]))
        rep = None
    print("board report: OK")


if __name__ == "__main__":
    main(sys.argv[1:])
