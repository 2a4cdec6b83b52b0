"""The chart words (runs on MicroPython): chart, the column's profile drawn in text,
and svg, the same as an SVG file (written only by the CPython command line). Loaded
for the word's line by lapsecalc.dispatch (queries.QUERIES names this module)."""
# Sources: every number comes from the library (Column, Column.report(), the parcel
#   path; lapsecalc.chart and lapsecalc.chartsvg draw them).


def chart(s, w, args):
    # chart [TOP [agl]]: TOP zooms (a 2000 ft marine layer fills the picture).
    # Its numbers first (chart.figure), then the Column, the parcel path and the
    # physics code let go of (Session.release) before the lines are drawn.
    col = s.column(w)
    top = None
    if args:
        from lapsecalc.heights import height
        top = height(s, w, args, col)
        height = None  # no name of it kept: release() lets go of its code
        if top < col.elev_m + 30.0:
            from lapsecalc.output import f_h1
            raise ValueError("chart: the top must be at least 100 ft (30 m) above the"
                             " field (%s)" % f_h1(s, col.elev_m))
    from lapsecalc.chart import figure, draw
    rep = s.report(w)
    fig = figure(col, rep, _path(col, rep), s.disp["t"], top)
    col = figure = None
    s.release()
    return draw(fig, rep, s.disp["h"], s.disp["t"])


def svg(s, w, args):
    if len(args) != 1:
        raise ValueError("svg needs one file name, e.g. svg profile.svg")
    if s.svg_writer is None:
        raise ValueError("svg writes a file: only the CPython command line does"
                         " (lapsecalc --svg FILE)")
    line = s.svg_writer(args[0], chart_svg(s))
    if s.mode == "text":
        return [line]
    from lapsecalc.output import ack
    return ack(s, line, ["svg"])


def chart_svg(s):
    """The profile chart of session s's state as SVG text."""
    from lapsecalc import chartsvg
    col, rep = s.column("svg"), s.report("svg")
    return chartsvg.svg(col, rep, _path(col, rep), s.disp["h"], s.disp["t"])


def _path(col, rep):
    # The surface parcel's path (parcel.path) from the report's cloud base, as
    # Column.report() computed it.
    from lapsecalc.parcel import path
    return path(col, col.elev_m + rep["cloud_base_agl_m"])


# word -> f(session, word, args) -> output lines (a word's own function named after it:
# a board interns the word anyway)
WORDS = {"chart": chart, "svg": svg}
