"""A height typed after a query word (at, da, balloon, sunset, chart): in the
session's display unit, AGL, MSL, indicated, a flight level or a pressure, inside the
column (runs on MicroPython; loaded by the lines that take one)."""
# Sources: none; the column gives the numbers (lapsecalc.column, lapsecalc.altitext).
# lapsecalc.typed is imported only when there is a height to read: a word without one
# (balloon, sunset) computes without the number reader's heap.


def height(s, w, args, col):
    """A height m MSL in column col from the args of word w: "H" (MSL, or indicated on
    QNH after "heights ind"), "H agl", "H msl", "H ind", a flight level "FL85", or a
    pressure "P" (the height of P); the field when there are no args. ValueError in
    the user's units when it is not in the column."""
    if not args:
        return col.elev_m
    if len(args) > 2:
        raise ValueError("%s takes a height, e.g. %s 8000ft, %s 2000ft agl, %s FL85, %s 700hPa"
                         % (w, w, w, w, w))
    where = args[1].lower() if len(args) > 1 else s.disp["z"]
    if args[0][:2].lower() == "fl" or where == "ind":
        from lapsecalc.altiwords import height_aloft
        return height_aloft(s, w, args, col)
    from lapsecalc.typed import number, said, unit_kind, shown
    if len(args) == 1 and unit_kind(args[0]) == "p":
        p = number(args[0], "p", "hpa")
        p_top = col.p_at(col.top_m)
        if not p_top <= p <= col.p_hpa:
            from lapsecalc.output import f_p
            raise ValueError("%s: %s is not in the column (%s at the field, %s at the top)"
                             % (w, said(args[0], "hpa"), f_p(s, col.p_hpa, True),
                                f_p(s, p_top, True)))
        return col.z_at(p)
    z = number(args[0], "h", s.disp["h"])
    if where not in ("agl", "msl"):
        raise ValueError("%s: '%s' after the height; accepted agl, msl or ind (indicated on"
                         " QNH)" % (w, shown(args[1])))
    if where == "agl":
        z += col.elev_m
    typed = said(args[0], s.disp["h"]) + (" AGL" if where == "agl" else "")
    # A millimetre of rounding at either end is the end itself. (The display code only
    # for a refusal: a board computes next, with the heap it would hold.)
    below = z < col.elev_m - 0.001
    if below or z > col.top_m + 0.001:
        from lapsecalc.output import f_h1
        raise ValueError("%s: %s is %s (%s)" % (
            w, typed, "below the field" if below else "above the column top",
            f_h1(s, col.elev_m if below else col.top_m)))
    return min(max(z, col.elev_m), col.top_m)
