"""Profile chart: height against temperature, as 40-column text art (the SVG form is
lapsecalc.chartsvg, over the frame and marks here)."""
# Sources: none beyond the library; the environment is linear inside each ELR layer,
# the parcel is parcel.path (dry to the LCL, then the pseudo-adiabat).
# Both forms return text; writing a file is the command line's job.
from math import floor, ceil
from lapsecalc.units import m_to_ft, c_to_f
from lapsecalc.limits import const

ROWS = 16
_WIDTH = const(40)
# Columns of the text plot: 5 label + "|" + plot + "|" + 1 icing margin + 5 for the
# marker letters = _WIDTH. The icing band is marked in its margin column, not across the
# plot, so the curves inside the band stay visible. Letters sharing a row are joined by
# "+" ("F+L"), so that two never read as a word or a code (as "FL" would).
_PLOT_W = _WIDTH - 13
_MARKS_PER_ROW = const(3)
# Right-margin letters: report key -> letter, in the order they are written.
MARKS = (("cloud_base_msl_m", "B"), ("freezing_level_msl_m", "F"), ("lfc_msl_m", "L"),
         ("el_msl_m", "E"), ("thermal_top_msl_m", "T"), ("tropopause_msl_m", "P"))


def top_of(col, rep, top_m=None):
    """Upper height, m MSL, of the chart: top_m when given, else a little above the
    highest marked level (at least 3000 m above the field), never above the column."""
    if top_m is not None:
        return max(min(top_m, col.top_m), col.elev_m + 1.0)
    if rep.get("el_above_top"):
        return col.top_m
    hi = col.elev_m + 5000.0
    marks = [rep[k] for k in ("cloud_base_msl_m", "freezing_level_msl_m", "minus20_level_msl_m",
                              "lfc_msl_m", "el_msl_m", "icing_band_top_msl_m",
                              "thermal_top_msl_m", "ccl_msl_m") if rep.get(k) is not None]
    if marks:
        hi = col.elev_m + 1.15 * (max(marks) - col.elev_m)
    return min(max(hi, col.elev_m + 3000.0), col.top_m)


def parcel_t(levels, z_m):
    """Parcel temperature, degC, at z_m by linear interpolation of parcel.path levels."""
    for i in range(1, len(levels)):
        z0, _, t0, _ = levels[i - 1]
        z1, _, t1, _ = levels[i]
        if z0 <= z_m <= z1:
            return t0 if z1 == z0 else t0 + (t1 - t0) * (z_m - z0) / (z1 - z0)
    return levels[-1][2]


def frame(col, levels, lo, hi, t_unit, n):
    """Temperatures (display unit) of environment and parcel at n+1 heights lo..hi,
    and the rounded temperature range that holds them (5-degree steps): (heights,
    environment, parcel, low, high)."""
    conv = c_to_f if t_unit == "f" else float
    # Lists made at their length and the range found without joining them (on a
    # board a list built item by item doubles, and every list is one piece of heap).
    zs, env, par = [0.0] * (n + 1), [0.0] * (n + 1), [0.0] * (n + 1)
    for i in range(n + 1):
        z = zs[i] = lo + (hi - lo) * i / n
        env[i] = conv(col.t_at(z))
        par[i] = conv(parcel_t(levels, z))
    t_min, t_max = min(min(env), min(par)), max(max(env), max(par))
    # The points aloft shown are corners of the environment between the heights
    # sampled: the range holds them too.
    for z in col.aloft_m or ():
        if lo <= z <= hi:
            t = conv(col.t_at(z))
            t_min, t_max = min(t_min, t), max(t_max, t)
    t_lo = 5.0 * floor((t_min - 1.0) / 5.0)
    t_hi = 5.0 * ceil((t_max + 1.0) / 5.0)
    return zs, env, par, t_lo, t_hi


def in_unit(z_m, h_unit):
    """A height z_m (m) in the display unit h_unit."""
    return m_to_ft(z_m) if h_unit == "ft" else z_m


def _label(v):
    return "%5d" % round(v) if v < 99999.5 else "%4dk" % round(v / 1000.0)


def icing_span(rep):
    """(bottom, top) of the icing band to draw, m MSL: a band whose top is unknown
    (lapsecalc.hazards, basis "air") is drawn up to the air's -20 degC level or the
    column top. (None, None) without a band."""
    ib, it = rep.get("icing_band_bottom_msl_m"), rep.get("icing_band_top_msl_m")
    if ib is not None and it is None:
        it = rep.get("minus20_level_msl_m") or rep["top_msl_m"]
    return ib, it


def figure(col, rep, levels, t_unit="c", top_m=None, rows=ROWS):
    """The numbers the text chart draws, taken from the column and the parcel path
    (levels), so that a board can let go of both before draw(): (lo, hi, heights,
    environment, parcel, low, high, points aloft). lo is the field, hi the chart's top
    (top_of); the heights, temperatures and range are frame()'s at 2*rows+1 heights;
    the points aloft inside the chart are (z_m, temperature in t_unit)."""
    lo = col.elev_m
    hi = top_of(col, rep, top_m)
    conv = c_to_f if t_unit == "f" else float
    # Index 2b+1 of the frame's lists is the middle of row band b (b = 0 at the bottom).
    fig = (lo, hi) + frame(col, levels, lo, hi, t_unit, 2 * rows)
    return fig + ([(z, conv(col.t_at(z))) for z in (col.aloft_m or ()) if lo <= z <= hi],)


def text(col, rep, levels, h_unit="ft", t_unit="c", top_m=None, rows=ROWS):
    """The profile chart of column col as text lines: draw(figure(...))."""
    return draw(figure(col, rep, levels, t_unit, top_m, rows), rep, h_unit, t_unit, rows)


def draw(fig, rep, h_unit="ft", t_unit="c", rows=ROWS):
    """The profile (fig: figure()) as lines of at most 40 columns: environment "#",
    parcel "o" ("X" where both fall), the 0-degree isotherm ".", the cloud base row
    shaded "-", the icing band as ":" in the margin column right of the plot, and
    letters after it (B cloud base, F freezing level, L LFC, E EL, T thermal top; "+"
    between letters of one row). Row r (0 at the top) spans the heights
    lo + (rows-1-r)*dz .. lo + (rows-r)*dz with lo the field and dz = (hi-lo)/rows. The
    bottom row is labelled with the field, the top row with the chart's top (top_m
    when given: a zoom), every fourth row between with its middle height. Points
    aloft are "*" on the environment in their row, the tropopause the letter P; a
    third legend line names them when the chart shows either."""
    lo, hi, zs, env, par, t_lo, t_hi, points = fig
    dz = (hi - lo) / rows
    span = t_hi - t_lo

    def x(t):
        return int(round((t - t_lo) / span * (_PLOT_W - 1)))

    def row_of(z):
        if z is None or z < lo or z > hi:
            return None
        return rows - 1 - min(int((z - lo) / dz), rows - 1)

    ib, it = icing_span(rep)
    base_row = row_of(rep.get("cloud_base_msl_m"))
    x0 = x(0.0 if t_unit == "c" else 32.0) if t_lo < (0.0 if t_unit == "c" else 32.0) < t_hi \
        else None
    marks = {}
    for key, letter in MARKS:
        r = row_of(rep.get(key))
        if r is not None and len(marks.get(r, "")) < 2 * _MARKS_PER_ROW - 1:
            marks[r] = marks[r] + "+" + letter if r in marks else letter
    out = ["%s MSL vs temperature %s" % (h_unit, t_unit.upper())]
    for r in range(rows):
        b = rows - 1 - r
        z_bot, z_top = zs[2 * b], zs[2 * b + 2]
        icing = ib is not None and it is not None and z_top > ib and z_bot < it
        bg = "-" if r == base_row else " "
        cells = [bg] * _PLOT_W
        if x0 is not None and bg == " ":
            cells[x0] = "."
        for curve, ch in ((env, "#"), (par, "o")):
            # The row's middle value, joined by a run of cells to the row below (the
            # bottom row: to the surface value, which both curves share).
            a, c = x(curve[2 * b + 1]), x(curve[2 * b - 1] if b else curve[0])
            step = 1 if c > a else -1
            end = c + step if b == 0 else (c if abs(c - a) > 1 else a + step)
            for i in range(a, end, step):
                if cells[i] not in "#X":
                    cells[i] = ch
                elif ch == "o" and (i == a or b == 0):
                    cells[i] = "X"
        for z, t in points:
            if row_of(z) == r:
                cells[x(t)] = "*"
        # Labelled: the field (bottom row), the top of the chart (top row) and the
        # middle of every fourth row between.
        label = _label(in_unit(lo, h_unit)) if b == 0 else _label(in_unit(hi, h_unit)) if (
            b == rows - 1) else (_label(in_unit(zs[2 * b + 1], h_unit)) if b % 4 == 0 and (
                b < rows - 2) else "     ")
        out.append(("%s|%s|%s%s" % (label, "".join(cells), ":" if icing else " ",
                                    marks.get(r, ""))).rstrip())
    out.append("     +" + "-" * _PLOT_W + "+")
    ticks = [" "] * (_WIDTH - 2)
    for t in (t_lo, t_hi) + ((0.0 if t_unit == "c" else 32.0,) if x0 is not None else ()):
        s = "%d" % round(t)
        pos = 6 + x(t) - len(s) // 2
        pos = max(0, min(pos, len(ticks) - len(s)))
        if all(c == " " for c in ticks[max(0, pos - 1):pos + len(s) + 1]):
            ticks[pos:pos + len(s)] = list(s)
    out.append("".join(ticks).rstrip())
    out.append("#env o parcel X both .0C -base :icing")
    out.append("B base F 0C L LFC E EL T thermal top")
    if points or row_of(rep.get("tropopause_msl_m")) is not None:
        out.append("* point aloft P tropopause")
    return out
