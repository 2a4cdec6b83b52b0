"""Profile chart (lapsecalc.chart): the 40-column text art and the SVG text."""
import xml.etree.ElementTree as ET

import pytest

from lapsecalc.column import Column
from lapsecalc import chart, chartsvg, parcel

SVG = "{http://www.w3.org/2000/svg}"
# Half a pixel: positions in the SVG are written with one decimal.
PX_TOL = 0.5


def _isa_column(**kw):
    # ICAO standard atmosphere below 11 km: 15 degC at sea level, 6.5 K/km, 1013.25 hPa
    # (ICAO Doc 7488/3); dewpoint 5 degC (a 10 degC spread).
    return Column.from_qnh(kw.get("t", 15.0), kw.get("td", 5.0), kw.get("qnh", 1013.25),
                           kw.get("elev", 0.0), kw.get("lapse", 6.5), kw.get("top", 16000.0))


def _draw(col, **kw):
    rep = col.report()
    levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
    return rep, levels, chart.text(col, rep, levels, **kw)


def _margin(row):
    # The right margin: the icing column, then the marker letters.
    return row.split("|")[2]


def _plot(row):
    return row.split("|")[1]


def test_width_and_height():
    cols = [_isa_column(), _isa_column(t=-5.0, td=-8.0, elev=1200.0),
            _isa_column(t=30.0, td=22.0, lapse=[(300.0, -5.0), (1500.0, 9.0), (None, 6.5)]),
            _isa_column(t=35.0, td=24.0, lapse=9.7), _isa_column(top=1500.0),
            _isa_column(t=22.0, td=21.9, lapse=[(2000.0, 4.0), (None, 8.0)], top=9000.0)]
    for col in cols:
        for h_unit, t_unit in (("ft", "c"), ("m", "f")):
            lines = _draw(col, h_unit=h_unit, t_unit=t_unit)[2]
            assert all(len(line) <= 40 for line in lines), lines
            # A third legend line when a point aloft or the tropopause is on the chart.
            third = lines[-1] == "* point aloft P tropopause"
            assert len(lines) == 1 + chart.ROWS + 4 + third
            for row in lines[1:1 + chart.ROWS]:
                # 5 label + "|" + 27 plot + "|" + icing column + 5 letters = 40.
                assert row.count("|") == 2 and len(row.split("|")[1]) == 27


def test_markers_at_the_right_rows():
    # ISA: 0 degC at 15 / 6.5 km = 2307.7 m (ICAO Doc 7488/3 lapse rate and sea-level
    # temperature). With the chart from 0 to 6000 m in 16 rows of 375 m, 2307.7 m lies
    # in band 6 from the bottom: row 16 - 1 - 6 = 9 from the top.
    col = _isa_column()
    rep, _, lines = _draw(col, h_unit="m", top_m=6000.0)
    rows = lines[1:1 + chart.ROWS]
    assert "F" in _margin(rows[9])
    assert sum("F" in _margin(r) for r in rows) == 1
    # Cloud base by the spread rule, about 125 m per degC (common practice): 10 degC
    # spread, about 1250 m, band 3 (1125..1500 m), row 12. Its row is shaded "-".
    assert "B" in _margin(rows[12]) and "-" in rows[12].split("|")[1]
    # A stable ISA column: no LFC, so the cloud top is unknown; the icing band (basis
    # "air") starts at the 0 degC level, above the cloud base, and is drawn up to the
    # air's -20 degC level, 35 / 6.5 km = 5384.6 m (ISA, ICAO Doc 7488/3): bands 6..14
    # from the bottom, rows 1..9 from the top.
    assert rep["icing_band_basis"] == "air" and rep["icing_band_top_msl_m"] is None
    assert abs(rep["icing_band_bottom_msl_m"] - 15.0 / 6.5e-3) < 0.01
    assert [r for r in range(chart.ROWS) if _margin(rows[r]).startswith(":")] == list(range(1, 10))
    # The 0-degree isotherm column "." meets the environment in the F row.
    dots = [r.split("|")[1].find(".") for r in rows if "." in r.split("|")[1]]
    x0 = dots[0]
    assert all(d == x0 for d in dots)
    plot = rows[9].split("|")[1]
    env_x = [i for i, ch in enumerate(plot) if ch in "#X"]
    assert min(abs(i - x0) for i in env_x) <= 1
    # The environment cools upward: its column moves left, row by row, never right.
    first = [min(i for i, ch in enumerate(r.split("|")[1]) if ch in "#X") for r in rows]
    assert all(first[i] <= first[i + 1] for i in range(len(first) - 1))
    # Parcel and environment start together at the surface.
    assert "X" in rows[-1].split("|")[1]
    assert rows[-1].startswith("    0|")


def test_icing_band_in_the_margin_only():
    # A warm, humid, conditionally unstable column whose cloud reaches 0..-20 degC.
    col = _isa_column(t=30.0, td=22.0, lapse=8.0)
    rep, _, lines = _draw(col, h_unit="m")
    ib, it = rep["icing_band_bottom_msl_m"], rep["icing_band_top_msl_m"]
    assert ib is not None and it is not None
    # Rows by the layout the docstring states: row r spans lo + (ROWS-1-r)*dz to
    # lo + (ROWS-r)*dz, lo the field, dz = (top - lo) / ROWS; a row is marked when it
    # overlaps the band.
    lo = col.elev_m
    dz = (chart.top_of(col, rep) - lo) / chart.ROWS
    want = [r for r in range(chart.ROWS)
            if lo + (chart.ROWS - r) * dz > ib and lo + (chart.ROWS - 1 - r) * dz < it]
    rows = lines[1:1 + chart.ROWS]
    got = [r for r, row in enumerate(rows) if _margin(row).startswith(":")]
    assert got == want and len(got) >= 3
    # The band never fills the plot: the environment stays visible in every band row.
    for r in got:
        assert ":" not in _plot(rows[r])
        assert "#" in _plot(rows[r]) or "X" in _plot(rows[r])
    assert ":icing" in lines[1 + chart.ROWS + 2]


def test_svg_parses_with_expected_elements():
    col = _isa_column()
    rep = col.report()
    levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
    text = chartsvg.svg(col, rep, levels, "ft", "c", top_m=6000.0)
    root = ET.fromstring(text)
    assert root.tag == SVG + "svg"
    lines = {e.get("id"): e for e in root.iter(SVG + "polyline")}
    env = lines["environment"].get("points").split()
    par = lines["parcel"].get("points").split()
    assert len(env) == len(par) == 65
    # Plot box: 56..344 px wide, 34..416 px high; 0..6000 m; temperatures in the box.
    x_first, y_first = (float(v) for v in env[0].split(","))
    assert abs(y_first - 416.0) < PX_TOL
    y_last = float(env[-1].split(",")[1])
    assert abs(y_last - 34.0) < PX_TOL
    assert all(56.0 - PX_TOL <= float(p.split(",")[0]) <= 344.0 + PX_TOL for p in env + par)
    marks = {e.get("id"): e for e in root.iter(SVG + "line")}
    # ISA freezing level 2307.7 m (ICAO Doc 7488/3): y = 34 + (6000 - 2307.7) / 6000 * 382.
    y_frz = 34.0 + (6000.0 - 15.0 / 6.5 * 1000.0) / 6000.0 * 382.0
    assert abs(float(marks["freezing-level"].get("y1")) - y_frz) < PX_TOL
    assert "cloud-base" in marks and "isotherm-0" in marks
    # The 0 degC isotherm crosses the environment at the freezing level: the env
    # polyline passes through (x of the isotherm, y_frz) within a pixel.
    x0 = float(marks["isotherm-0"].get("x1"))
    pts = [tuple(float(v) for v in p.split(",")) for p in env]
    near = min(pts, key=lambda p: abs(p[1] - y_frz))
    assert abs(near[0] - x0) < 3.0
    assert any("ft MSL" in (t.text or "") for t in root.iter(SVG + "text"))


def test_svg_icing_rect():
    col = _isa_column(t=30.0, td=22.0, lapse=8.0)
    rep = col.report()
    levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
    root = ET.fromstring(chartsvg.svg(col, rep, levels, "m", "f"))
    rects = [e for e in root.iter(SVG + "rect") if e.get("id") == "icing"]
    assert len(rects) == 1 and float(rects[0].get("height")) > 0.0


def test_parcel_t_interpolates():
    levels = [(0.0, 1000.0, 20.0, 20.0), (1000.0, 900.0, 10.0, 13.5)]
    assert chart.parcel_t(levels, 500.0) == 15.0
    assert chart.parcel_t(levels, 0.0) == 20.0


def test_markers_sharing_a_row_never_read_as_a_word():
    # A column whose freezing level and LFC fall in one row (the demo's, chart
    # top 30000 ft: "F" and "L" side by side read as "FL", a flight level).
    col = Column.from_qnh(27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5),
                                                        (None, 6.5)])
    rep, _, lines = _draw(col)
    rows = lines[1:1 + chart.ROWS]
    margins = [_margin(r)[1:] for r in rows]
    shared = [m for m in margins if len(m) > 1]
    assert shared, margins
    for m in margins:
        letters = m.split("+")
        assert all(len(x) == 1 and x in "BFLET" for x in letters if m), m
        assert "FL" not in m and "BF" not in m


def test_top_row_is_labelled_and_chart_zooms():
    col = _isa_column(elev=0.0)
    rep, _, lines = _draw(col, h_unit="ft", top_m=609.6)
    rows = lines[1:1 + chart.ROWS]
    # 609.6 m = 2000 ft exactly (1 ft = 0.3048 m, REFERENCES.md Units): the top row
    # says the chart's top, the bottom row the field.
    assert rows[0].startswith(" 2000|") and rows[-1].startswith("    0|")
    # The environment cools 6.5 K/km: over 609.6 m about 4 K, spread across the plot
    # (a zoomed chart, not a sliver of the 16 km column).
    xs = [min(i for i, ch in enumerate(_plot(r)) if ch in "#X") for r in rows]
    assert xs[-1] - xs[0] >= 5
    # Without the zoom those 2000 ft are the bottom row or two of a chart of kilometres.
    whole = _draw(col, h_unit="ft")[2][1:1 + chart.ROWS]
    assert int(whole[0][:5].replace("k", "000")) > 10000
    assert all(len(x) <= 40 for x in lines)


def _text_boxes(svg_text):
    # (x0, y0, x1, y1) of each <text>, from its anchor, the font size 11 and about
    # 6.5 px per character (sans-serif at 11 px is narrower).
    root = ET.fromstring(svg_text)
    boxes = []
    for e in root.iter(SVG + "text"):
        x, y, n = float(e.get("x")), float(e.get("y")), len(e.text) * 6.5
        anchor = e.get("text-anchor", "start")
        x0 = x - n if anchor == "end" else x - n / 2 if anchor == "middle" else x
        boxes.append((x0, y - 11.0, x0 + n, y, e.text))
    return boxes


def test_svg_labels_do_not_overlap():
    # Columns whose marked levels crowd together: cloud base at the LFC (a saturated
    # surface), a freezing level near the base, the demo.
    cols = [_isa_column(t=30.0, td=29.5, lapse=9.5),
            _isa_column(t=6.0, td=4.0, lapse=9.0),
            Column.from_qnh(27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5),
                                                          (None, 6.5)])]
    for col in cols:
        rep = col.report(2.0)
        levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
        for h_unit in ("ft", "m"):
            boxes = _text_boxes(chartsvg.svg(col, rep, levels, h_unit, "c"))
            for i, a in enumerate(boxes):
                for b in boxes[i + 1:]:
                    apart = a[2] <= b[0] or b[2] <= a[0] or a[3] <= b[1] or b[3] <= a[1]
                    assert apart, (a[4], b[4])


def test_points_aloft_and_tropopause_are_marked():
    # ISA temperatures as points (ICAO Doc 7488/3: 8.5 C at 1000 m, -4.5 C at 3000 m),
    # a tropopause at 5000 m. Chart 0..6000 m in 16 rows of 375 m: 1000 m is band 2
    # (row 13), 3000 m band 8 (row 7), 5000 m band 13 (row 2).
    col = Column.from_qnh(15.0, 5.0, 1013.25, 0.0, 6.5, 16000.0,
                          aloft=[(3000.0, -4.5, None), (1000.0, 8.5, None)], tropopause_m=5000.0)
    rep, levels, lines = _draw(col, h_unit="m", top_m=6000.0)
    rows = lines[1:1 + chart.ROWS]
    assert [r for r in range(chart.ROWS) if "*" in _plot(rows[r])] == [7, 13]
    t_lo, t_hi = chart.frame(col, levels, 0.0, 6000.0, "c", 2 * chart.ROWS)[3:5]
    for r, t in ((13, 8.5), (7, -4.5)):
        assert _plot(rows[r]).index("*") == int(round((t - t_lo) / (t_hi - t_lo) * 26))
    assert [r for r in range(chart.ROWS) if "P" in _margin(rows[r])] == [2]
    assert lines[-1] == "* point aloft P tropopause" and len(lines) == 1 + chart.ROWS + 5
    # Without points and with the tropopause above the chart: no third legend line.
    assert len(_draw(_isa_column(), h_unit="m", top_m=6000.0)[2]) == 1 + chart.ROWS + 4
    root = ET.fromstring(chartsvg.svg(col, rep, levels, "m", "c", top_m=6000.0))
    dots = [e for e in root.iter(SVG + "circle") if e.get("class") == "aloft-point"]
    # y = 34 + (6000 - z) / 6000 * 382 (the plot box of the SVG test above).
    assert sorted(float(e.get("cy")) for e in dots) == [
        round(34.0 + 3000.0 / 6000.0 * 382.0, 1), round(34.0 + 5000.0 / 6000.0 * 382.0, 1)]
    trop = [e for e in root.iter(SVG + "line") if e.get("id") == "tropopause"]
    assert len(trop) == 1 and abs(float(trop[0].get("y1")) - (34.0 + 382.0 / 6.0)) < PX_TOL


COLOUR_WORDS = ("black", "white", "red", "blue", "green", "grey", "gray", "yellow",
                "orange", "cyan", "dark", "light")


def test_svg_legend_shows_samples_and_names_no_colour():
    # The legend shows each paint beside its name instead of naming colours, so any
    # recolouring of the whole chart (the page's night mode inverts it) keeps legend
    # and curves alike.
    col = _isa_column(t=30.0, td=22.0, lapse=8.0)
    rep = col.report()
    levels = parcel.path(col, col.elev_m + rep["cloud_base_agl_m"])
    root = ET.fromstring(chartsvg.svg(col, rep, levels, "ft", "c"))
    words = " ".join((t.text or "") for t in root.iter(SVG + "text")).lower().split()
    assert not [w for w in words if w.strip(";:,()") in COLOUR_WORDS], words
    paint = ("fill", "stroke", "stroke-width", "stroke-dasharray", "fill-opacity")
    curves = {e.get("id"): e for e in root.iter(SVG + "polyline")}
    samples = [e for e in root.iter() if e.get("class") == "legend"]
    icing = [e for e in root.iter(SVG + "rect") if e.get("id") == "icing"][0]
    assert len(samples) == 3
    for sample, shown in zip(samples, (curves["environment"], curves["parcel"], icing)):
        assert [sample.get(a) for a in paint] == [shown.get(a) for a in paint]
    texts = [t.text for t in root.iter(SVG + "text")]
    assert "environment (ELR)" in texts and "surface parcel" in texts
    assert "icing band (0 to -20 C in cloud)" in texts


class _Line:
    # A made-up column for chart.frame: temperature falling linearly from t0 at z = 0
    # by rate K per metre, with points aloft at the heights given.
    def __init__(self, t0, rate, aloft=None):
        self.t0, self.rate, self.aloft_m = t0, rate, aloft

    def t_at(self, z):
        return self.t0 - self.rate * z


def test_frame_samples_evenly_and_rounds_the_range_outward():
    # Heights lo..hi in n equal steps; environment and parcel at each; the range: the
    # lowest value less 1 degree down to a multiple of 5, the highest plus 1 up to one.
    col = _Line(20.5, 0.004)  # 20.5 C at 0 m, 8.5 C at 3000 m
    levels = [(0.0, 0.0, 24.0, 0.0), (3000.0, 0.0, 12.5, 0.0)]  # parcel 24 -> 12.5 C
    zs, env, par, t_lo, t_hi = chart.frame(col, levels, 0.0, 3000.0, "c", 6)
    assert zs == [0.0, 500.0, 1000.0, 1500.0, 2000.0, 2500.0, 3000.0]
    assert env == [pytest.approx(20.5 - 0.004 * z) for z in zs]
    assert par == [pytest.approx(24.0 - 11.5 * z / 3000.0) for z in zs]
    # lowest 8.5 -> 7.5 -> 5; highest 24 -> 25 -> 25
    assert (t_lo, t_hi) == (5.0, 25.0)
    # a field above sea level: the heights start there
    zs = chart.frame(col, levels, 400.0, 1000.0, "c", 2)[0]
    assert zs == [400.0, 700.0, 1000.0]
    # highest 24.2 -> 25.2 -> 30 (one more step up), lowest 20.6 -> 19.6 -> 15
    col = _Line(20.6, 0.0)
    levels = [(0.0, 0.0, 24.2, 0.0), (3000.0, 0.0, 24.2, 0.0)]
    assert chart.frame(col, levels, 0.0, 3000.0, "c", 4)[3:] == (15.0, 30.0)
    # F: the same values converted (24.2 C = 75.56 F -> 80; 20.6 C = 69.08 F -> 65)
    assert chart.frame(col, levels, 0.0, 3000.0, "f", 4)[3:] == (65.0, 80.0)
    # the edges of a step: 21 - 1 = 20 is a multiple of 5 itself; 6.02 - 1 = 5.02 is just
    # above one (the step is 5 degrees, not a little more)
    for t, want in ((21.0, 20.0), (6.02, 5.0)):
        assert chart.frame(_Line(t, 0.0), levels, 0.0, 3000.0, "c", 4)[3] == want, t


def test_frame_range_holds_the_points_aloft_it_shows():
    # A point aloft is a corner of the environment between the samples: the range
    # holds it when it lies within lo..hi, not otherwise (one at an end is a sample).
    class Corner(_Line):
        def t_at(self, z):
            return -31.0 if z == 1234.0 else 0.0 if z == 3000.0 or z == 0.0 else 10.0

    levels = [(0.0, 0.0, 10.0, 0.0), (3000.0, 0.0, 10.0, 0.0)]
    assert chart.frame(Corner(0, 0, [1234.0]), levels, 0.0, 3000.0, "c", 4)[3] == -35.0
    assert chart.frame(Corner(0, 0, [5000.0]), levels, 0.0, 3000.0, "c", 4)[3] == -5.0


def test_point_aloft_at_the_charts_top_is_drawn():
    # A chart zoomed to exactly the height of a point aloft (ISA temperatures, ICAO Doc
    # 7488/3: -4.5 C at 3000 m) draws the point in its top row; the figure holds the
    # points inside the chart with their temperatures in the display unit.
    col = Column.from_qnh(15.0, 5.0, 1013.25, 0.0, 6.5, 16000.0,
                          aloft=[(3000.0, -4.5, None), (1000.0, 8.5, None)])
    rep, levels, lines = _draw(col, h_unit="m", top_m=3000.0)
    rows = lines[1:1 + chart.ROWS]
    assert [r for r in range(chart.ROWS) if "*" in _plot(rows[r])] == [0, 10]
    fig = chart.figure(col, rep, levels, "f", 3000.0)
    assert fig[:2] == (0.0, 3000.0)
    assert [z for z, _ in fig[-1]] == [1000.0, 3000.0]
    assert abs(fig[-1][1][1] - 23.9) < 1e-9  # -4.5 C = 23.9 F
    assert chart.figure(col, rep, levels, "c", 2999.0)[-1] == [(1000.0, 8.5)]


class _Col:
    # The two heights top_of reads of a Column, m MSL.
    elev_m, top_m = 500.0, 12000.0


def test_top_of_the_chart():
    # Its rules (chart.top_of's docstring): the top asked for within the field (1 m
    # above it) and the column top; else 1.15 times the highest marked level's height
    # above the field, at least 3000 m above it (5000 m with no level marked), never
    # above the column top; the column top when the EL lies above it.
    col = _Col()
    assert chart.top_of(col, {}, 4000.0) == 4000.0
    assert chart.top_of(col, {}, 20000.0) == 12000.0
    assert chart.top_of(col, {}, 100.0) == 501.0
    assert chart.top_of(col, {"el_above_top": True}) == 12000.0
    assert chart.top_of(col, {}) == 5500.0
    assert chart.top_of(col, {"cloud_base_msl_m": 2500.0}) == 3500.0
    assert chart.top_of(col, {"thermal_top_msl_m": 11000.0}) == 12000.0
    assert chart.top_of(col, {"tropopause_msl_m": 9000.0, "ccl_msl_m": None}) == 5500.0
    for k in ("cloud_base_msl_m", "freezing_level_msl_m", "minus20_level_msl_m",
              "lfc_msl_m", "el_msl_m", "icing_band_top_msl_m", "thermal_top_msl_m",
              "ccl_msl_m"):
        rep = {"cloud_base_msl_m": 2500.0}
        rep[k] = 6500.0
        assert chart.top_of(col, rep) == pytest.approx(500.0 + 1.15 * 6000.0, abs=1e-6), k
