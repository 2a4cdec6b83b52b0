"""Profile chart as SVG text: height against temperature, the curves, the icing band
and the marked levels (loaded only by the svg word, the --svg option and the offline
page)."""
# Sources: none beyond the library; the frame (heights, temperatures of environment
# and parcel, the range) and the marked levels are lapsecalc.chart's. Returns text;
# writing a file is the command line's job.
from lapsecalc.units import c_to_f
from lapsecalc.chart import MARKS, top_of, frame, in_unit, icing_span

# Height of a line of SVG text (font-size 11) with a little air, px.
_LINE_PX = 13
# The paints of the curves and the icing band, used by the legend's samples too.
_ENV_PAINT = 'fill="none" stroke="black" stroke-width="2"'
_PARCEL_PAINT = 'fill="none" stroke="#c33" stroke-width="2" stroke-dasharray="6 3"'
_ICING_PAINT = 'fill="#9cd" fill-opacity="0.35"'


def _esc(s):
    return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def svg(col, rep, levels, h_unit="ft", t_unit="c", top_m=None):
    """The profile as an SVG document (a string): polylines "environment" and
    "parcel", an "icing" band rectangle, lines for the 0-degree isotherm and for each
    marked level (ids cloud-base, freezing-level, lfc, el, thermal-top, tropopause),
    a dot (class aloft-point) on the environment at each point aloft, axes and
    labels in the display units."""
    w, h = 360, 480
    left, right, top, bottom = 56, 16, 34, 64
    pw, ph = w - left - right, h - top - bottom
    lo = col.elev_m
    hi = top_of(col, rep, top_m)
    zs, env, par, t_lo, t_hi = frame(col, levels, lo, hi, t_unit, 64)

    def px(t):
        return left + (t - t_lo) / (t_hi - t_lo) * pw

    def py(z):
        return top + (hi - z) / (hi - lo) * ph

    def pts(curve):
        return " ".join("%.1f,%.1f" % (px(t), py(z)) for z, t in zip(zs, curve))

    out = ['<svg xmlns="http://www.w3.org/2000/svg" width="%d" height="%d" viewBox="0 0 %d %d"'
           ' font-family="sans-serif" font-size="11">' % (w, h, w, h),
           "<title>lapsecalc profile: height against temperature</title>",
           '<rect x="0" y="0" width="%d" height="%d" fill="white"/>' % (w, h)]
    ib, it = icing_span(rep)
    if ib is not None and it is not None:
        y1, y0 = py(min(it, hi)), py(max(ib, lo))
        out.append('<rect id="icing" x="%d" y="%.1f" width="%d" height="%.1f" %s/>'
                   % (left, y1, pw, max(y0 - y1, 0.0), _ICING_PAINT))
    freeze = 0.0 if t_unit == "c" else 32.0
    if t_lo < freeze < t_hi:
        out.append('<line id="isotherm-0" x1="%.1f" y1="%d" x2="%.1f" y2="%d" stroke="#36c"'
                   ' stroke-dasharray="2 3"/>' % (px(freeze), top, px(freeze), top + ph))
    out.append('<rect x="%d" y="%d" width="%d" height="%d" fill="none" stroke="black"/>'
               % (left, top, pw, ph))
    for i in range(5):
        z = lo + (hi - lo) * i / 4
        out.append('<text x="%d" y="%.1f" text-anchor="end">%d</text>'
                   % (left - 4, py(z) + 4, round(in_unit(z, h_unit))))
    t = t_lo
    while t <= t_hi + 0.01:
        out.append('<text x="%.1f" y="%d" text-anchor="middle">%d</text>'
                   % (px(t), top + ph + 16, round(t)))
        t += 10.0 if t_hi - t_lo > 40.0 else 5.0
    out.append('<text x="%d" y="%d">%s MSL</text>' % (4, top - 10, h_unit))
    out.append('<text x="%d" y="%d" text-anchor="middle">temperature %s</text>'
               % (left + pw // 2, top + ph + 30, t_unit.upper()))
    out.append('<polyline id="environment" points="%s" %s/>' % (pts(env), _ENV_PAINT))
    out.append('<polyline id="parcel" points="%s" %s/>' % (pts(par), _PARCEL_PAINT))
    names = {"cloud_base_msl_m": ("cloud-base", "cloud base"),
             "freezing_level_msl_m": ("freezing-level", "0 deg"), "lfc_msl_m": ("lfc", "LFC"),
             "el_msl_m": ("el", "EL"), "thermal_top_msl_m": ("thermal-top", "thermal top"),
             "tropopause_msl_m": ("tropopause", "tropopause")}
    for z in col.aloft_m or ():
        if lo <= z <= hi:
            t = col.t_at(z)
            out.append('<circle class="aloft-point" cx="%.1f" cy="%.1f" r="3" fill="black"/>'
                       % (px(c_to_f(t) if t_unit == "f" else t), py(z)))
    shown = [(py(rep[key]), key) for key, _ in MARKS
             if rep.get(key) is not None and lo <= rep[key] <= hi]
    shown.sort()
    shown.reverse()  # lowest level first: a crowded label moves up, into the plot
    above = None  # baseline of the label below: the next is at least one line higher
    for y, key in shown:
        ident, name = names[key]
        out.append('<line id="%s" x1="%d" y1="%.1f" x2="%d" y2="%.1f" stroke="#666"/>'
                   % (ident, left, y, left + pw, y))
        ty = y - 3 if above is None else min(y - 3, above - _LINE_PX)
        above = ty
        out.append('<text x="%d" y="%.1f" text-anchor="end" fill="#444">%s %d %s</text>'
                   % (left + pw - 2, ty, _esc(name), round(in_unit(rep[key], h_unit)), h_unit))
    # The legend shows a sample of each paint beside its name and names no colour: a
    # page that recolours the chart (the offline page's night mode inverts it)
    # recolours the samples alike, so legend and curves always agree.
    for x, y, paint, name in ((4, h - 18, _ENV_PAINT, "environment (ELR)"),
                              (150, h - 18, _PARCEL_PAINT, "surface parcel")):
        out.append('<line class="legend" x1="%d" y1="%d" x2="%d" y2="%d" %s/>'
                   % (x, y - 4, x + 22, y - 4, paint))
        out.append('<text x="%d" y="%d">%s</text>' % (x + 26, y, name))
    out.append('<rect class="legend" x="4" y="%d" width="22" height="10" %s/>'
               % (h - 14, _ICING_PAINT))
    out.append('<text x="30" y="%d">icing band (0 to -20 C in cloud)</text>' % (h - 5))
    out.append("</svg>")
    return "\n".join(out) + "\n"
