"""The offline page (lapsecalc.page; python3 -m lapsecalc page FILE): the builder, and
the page itself in headless Chromium with networking disabled, opened from a file://
path. Its output is compared with CPython's Session().feed at test time, line for
line, so the comparison follows the interpreter as its words change.

The browser leg needs the OS's chromium and chromium-driver (tests/run.sh installs them
under CI=true) and selenium (the test extra); without them it is one skip line, and a
failure under CI=true. Screenshots go to test-output/page/ (git-ignored)."""
import json
import os
import re
import subprocess
import sys
import xml.etree.ElementTree as ET

import pytest

import lapsecalc
from lapsecalc import page
from lapsecalc.demo import DEMO_LINES
from lapsecalc.chartwords import chart_svg
from lapsecalc.shell import PROMPT, Session
from lapsecalc.stability import CAUTIONS

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
SHOTS = os.path.join(ROOT, "test-output", "page")
sys.path.insert(0, HERE)
sys.path.insert(0, os.path.join(ROOT, "bench"))
import browser  # noqa: E402  (tests/browser.py)
sys.path.insert(0, os.path.join(HERE, "mpy"))
import compare  # noqa: E402  (tests/mpy/compare.py)
sys.path.insert(0, os.path.join(HERE, "mpy"))
import boardset  # noqa: E402  (tests/mpy/boardset.py)
import page_budget  # noqa: E402  (bench/page_budget.py)

CI = os.environ.get("CI") == "true"
HAVE_VM = os.path.isfile(os.path.join(page.VM_DIR, "micropython.wasm"))
try:
    import selenium  # noqa: F401
    HAVE_SELENIUM = True
except ImportError:
    HAVE_SELENIUM = False
MISSING = [what for what, ok in (
    ("chromium and chromium-driver (%s)" % browser.INSTALL, browser.find() is not None),
    ("selenium (pip install -e '.[test]')", HAVE_SELENIUM),
    ("the MicroPython VM (cd tests/mpy && npm ci)", HAVE_VM)) if not ok]
if MISSING and CI:
    raise RuntimeError("browser leg: under CI=true it must run; missing " + ", ".join(MISSING))
needs_browser = pytest.mark.skipif(bool(MISSING), reason="browser leg skipped: missing "
                                   + ", ".join(MISSING))
needs_vm = pytest.mark.skipif(not HAVE_VM, reason="the MicroPython VM is not installed"
                              " (cd tests/mpy && npm ci)")

# Invented sessions (made-up fields and weather), each run from a fresh session. They
# cover the output modes, display units, errors, METAR, balloons and the help text;
# a line that a later interpreter refuses still compares (both sides say so).
SESSIONS = (
    DEMO_LINES,
    ("unit m C hPa", "temp 12C rh 78% elev 640m qnh 1022", "elr -5@300m 8@1500m 6.5",
     "base", "ice", "stab", "thermal", "out kv", "report", "iso -15C", "at 700hPa",
     "out json", "obs", "da", "show", "report", "out text", "chart", "parcel"),
    ("tmep 3", "temp 99C", "base", "temp 20 dew 10 qnh 5000",
     "metar XOMF 121650Z 24010KT 9999 FEW045 24/M02 Q1016 RMK T02410021",
     "elev 2900ft", "excess 3C", "parcel", "thermal", "clear qnh", "obs", "help",
     "help elr", "svg a.svg", "unit F inhg", "base", "da 9500ft", "clear", "base", "",
     "# a comment alone"),
    ("t 80F td 50F elev 5000ft qnh 29.92inHg top 30000ft", "env 2800m3 wt 450kg tmax 120C",
     "balloon", "bal 1000ft agl", "gas he fill 6m3 env 10m3 wt 4kg", "balloon",
     "pure 98%", "out json", "balloon", "out kv", "ice", "unit m", "at 3000ft agl"),
)


def expected(lines):
    """CPython's session output: the prompt and line, then Session().feed's lines, with the
    board's modules only (boardset.hide_later)."""
    undo = boardset.hide_later()
    try:
        s = Session()
        out = []
        for line in lines:
            out.append([PROMPT + line] + s.feed(line))
    finally:
        undo()
    return out, s


def same_line(want, got):
    # Equal text; a json line may differ only in the key order of an object inside it
    # (a board's dict keeps none: tests/mpy/compare.py's rule).
    return compare.same(want, got)


def svg_tree(text):
    root = ET.fromstring(text)
    return [(el.tag, sorted(el.attrib.items()), (el.text or "").strip()) for el in root.iter()]


def same_svg(want, got):
    # Element for element, attribute for attribute. The coordinates are printed with
    # "%.1f": a value on a rounding tie (x.x5) may round either way on another float
    # printer, so numbers may differ by one in the last printed place, never more.
    a, b = svg_tree(want), svg_tree(got)
    if len(a) != len(b):
        return False
    for (tag_a, attr_a, text_a), (tag_b, attr_b, text_b) in zip(a, b):
        if tag_a != tag_b or text_a != text_b or [k for k, _ in attr_a] != [k for k, _ in attr_b]:
            return False
        for (_, va), (_, vb) in zip(attr_a, attr_b):
            ta, tb = re.split(r"([-0-9.]+)", va), re.split(r"([-0-9.]+)", vb)
            if len(ta) != len(tb):
                return False
            for x, y in zip(ta, tb):
                if x != y and not (NUMBER.match(x) and NUMBER.match(y)
                                   and abs(float(x) - float(y)) <= 0.1 + 1e-9):
                    return False
    return True


NUMBER = re.compile(r"^-?[0-9]+\.[0-9]$")


# ---------------------------------------------------------------- the builder


@needs_vm
def test_page_is_one_file_with_the_vm_and_every_manifest_file(tmp_path):
    name = str(tmp_path / "lc.html")
    env = dict(os.environ)
    env.pop("PYTHONPATH", None)
    p = subprocess.run([sys.executable, "-m", "lapsecalc", "page", name], cwd=ROOT, env=env,
                       capture_output=True, text=True, timeout=120)
    assert p.returncode == 0, p.stderr
    html = open(name, encoding="utf-8").read()
    size = len(html.encode("utf-8"))
    assert size == os.path.getsize(name)
    assert p.stdout == ("ok: page written to %s (%d KiB); open it in a browser, no network"
                        " needed\n" % (name, -(-size // 1024)))
    # The size budget (bench/page_budget.py: under 1.5 MiB) is a size, not a timing.
    assert size < page_budget.BUDGETS["page_bytes"], size
    # The .wasm, byte for byte, as base64 in the file.
    import base64
    start = html.index('id="vm-wasm">') + len('id="vm-wasm">')
    wasm = base64.b64decode(html[start:html.index("</script>", start)])
    assert wasm == open(os.path.join(page.VM_DIR, "micropython.wasm"), "rb").read()
    # Every file the board manifest lists, with its text unchanged; nothing else.
    start = html.index('id="board-files">') + len('id="board-files">')
    files = json.loads(html[start:html.index("</script>", start)])
    manifest = json.load(open(os.path.join(ROOT, "lapsecalc", "package-full.json")))
    assert sorted(files) == sorted(t for t, _ in manifest["urls"])
    for target, text in files.items():
        assert text == open(os.path.join(ROOT, target), encoding="utf-8").read(), target
    assert "lapsecalc/cli.py" not in files and "lapsecalc/page.py" not in files
    # No address to fetch from in the page's own parts, and a policy that forbids
    # every load.
    assert "default-src 'none'" in html and "connect-src 'none'" in html
    for part in ("page.html", "page.css", "page.js"):
        text = page._template(part)
        assert "http:" not in text and "https:" not in text and "//cdn" not in text, part
    for c in CAUTIONS:
        assert c in html
    # The slots are all filled, and every id a test drives is there.
    assert "{{" not in html[:html.index('id="vm-wasm"')]
    for tag in ('<input id="line"', '<pre id="out"', 'id="chart"'):
        assert tag in html, tag


def test_builder_says_how_to_install_a_missing_vm(tmp_path):
    name = str(tmp_path / "lc.html")
    p = subprocess.run([sys.executable, "-m", "lapsecalc", "page", name, "--vm",
                        str(tmp_path / "none")], cwd=ROOT, capture_output=True, text=True,
                       timeout=60)
    assert p.returncode == 1 and p.stdout == ""
    assert "MicroPython WebAssembly VM is missing" in p.stderr
    # The command that installs it, with the version the tests pin.
    pin = json.load(open(os.path.join(HERE, "mpy", "package.json")))["dependencies"][page.VM_NAME]
    assert "(cd %s && npm ci)" % os.path.join(ROOT, "tests", "mpy") in p.stderr
    assert "npm install %s@%s" % (page.VM_NAME, pin) in p.stderr
    assert not os.path.exists(name)


def test_builder_refuses_a_vm_other_than_the_pinned_one(tmp_path, monkeypatch):
    vm = tmp_path / "vm"
    vm.mkdir()
    (vm / "micropython.mjs").write_text("")
    (vm / "micropython.wasm").write_bytes(b"\0asm")
    (vm / "package.json").write_text('{"version": "0.0.1"}')
    pin = json.load(open(os.path.join(HERE, "mpy", "package.json")))["dependencies"][page.VM_NAME]
    assert page.pinned_version() == pin
    monkeypatch.setattr(page, "VM_DIR", str(vm))
    with pytest.raises(ValueError, match="is version 0.0.1, the tests pin %s" % re.escape(pin)):
        page.read_vm()


def test_builder_refuses_a_loader_it_does_not_know(tmp_path):
    vm = tmp_path / "vm"
    vm.mkdir()
    (vm / "micropython.mjs").write_text("export async function other() {}\n")
    (vm / "micropython.wasm").write_bytes(b"\0asm")
    (vm / "package.json").write_text('{"version": "0.0.1"}')
    with pytest.raises(ValueError, match="not the one this page builder knows"):
        page.build(str(vm))


@needs_vm
def test_builder_fills_each_slot_once(monkeypatch):
    real = page._template

    def template_with(html):
        monkeypatch.setattr(page, "_template", lambda n: html if n == "page.html" else real(n))

    slots = "".join("{{%s}}" % k for k in ("STYLE", "SCRIPT", "LOADER", "WASM", "FILES", "PROMPT",
                                           "PROMPT_JSON", "CAUTIONS", "VERSION", "VM_VERSION"))
    template_with("<p>" + slots + "</p>")
    html = page.build()
    assert html.startswith("<p>" + real("page.css")) and html.endswith("</p>")
    template_with(slots + "{{NOPE}}")
    with pytest.raises(ValueError, match="unknown or repeated slot {{NOPE"):
        page.build()
    template_with(slots + "{{WASM")
    with pytest.raises(ValueError, match="unknown or repeated slot"):
        page.build()
    template_with(slots.replace("{{VERSION}}", ""))
    with pytest.raises(ValueError, match="slots not used: VERSION"):
        page.build()
    template_with(slots + "{{VERSION}}")
    with pytest.raises(ValueError, match="unknown or repeated slot {{VERSION"):
        page.build()


def test_json_in_html_never_closes_the_script():
    text = page._json_in_html({"a": "</script><!-- x"})
    assert "<" not in text and json.loads(text) == {"a": "</script><!-- x"}


def test_help_lists_the_page_subcommand():
    p = subprocess.run([sys.executable, "-m", "lapsecalc", "--help"], cwd=ROOT,
                       capture_output=True, text=True, timeout=60)
    assert p.returncode == 0 and "lapsecalc page FILE" in p.stdout


# ---------------------------------------------------------------- in the browser


@pytest.fixture(scope="module")
def built(tmp_path_factory):
    name = str(tmp_path_factory.mktemp("page") / "lapsecalc.html")
    page.write(name)
    return name


@pytest.fixture
def tab(built):
    opened = []

    def open_tab(width=768, height=1024, profile=None):
        t = browser.Page(browser.file_url(built), width, height, profile)
        opened.append(t)
        t.ready(60)
        return t

    yield open_tab
    for t in opened:
        t.close()


def lines_of(text):
    return text.split("\n") if text else []


@needs_browser
def test_page_output_equals_cpython_line_for_line(tab):
    t = tab()
    # The document itself is the only request; nothing after it.
    assert t.network() == [t.url]
    # The page's own first lines: which code runs, in 40 columns.
    head = t.out_text().split("\n")
    assert head[0].startswith("lapsecalc %s, MicroPython 1." % lapsecalc.__version__)
    assert head[-1] == "settings kept on this device: none"
    assert max(map(len, head)) <= 40, head
    for n, session in enumerate(SESSIONS):
        want, cpython = expected(session)
        for line, want_lines in zip(session, want):
            got = lines_of(t.type_line(line))
            assert len(got) == len(want_lines), (line, want_lines, got)
            for w, g in zip(want_lines, got):
                assert same_line(w, g), (line, w, g)
        if n == 0:
            # The demo's chart: the same SVG as CPython's, element for element.
            svg = t.driver.execute_script(
                "const s = document.querySelector('#chart svg');"
                "return s ? new XMLSerializer().serializeToString(s) : ''")
            assert svg and same_svg(chart_svg(cpython), svg)
            points = t.driver.execute_script(
                "return [...document.querySelectorAll('#chart polyline')]"
                ".map(p => p.getAttribute('points').split(' ').length)")
            assert len(points) >= 2 and min(points) > 10
            box = t.driver.execute_script(
                "const r = document.querySelector('#chart svg').getBoundingClientRect();"
                "return [r.width, r.height]")
            assert box[0] > 200 and box[1] > 200
        # bye ends the session: the page starts a new one (and forgets the settings).
        got = lines_of(t.type_line("bye"))
        assert got == [PROMPT + "bye"] + cpython.feed("bye") + [
            "# session ended; a new one starts (settings forgotten)"]
        assert t.driver.execute_script("return localStorage.getItem('lapsecalc.page.settings')") \
            == "[]"
    assert lines_of(t.type_line("show")) == [PROMPT + "show"] + Session().feed("show")
    assert "No profile yet" in t.driver.find_element("id", "chart").text
    assert t.network() == [], "the page made requests after it loaded"
    errors = [m for level, m in t.console() if level == "SEVERE"]
    assert errors == []


@needs_browser
def test_settings_history_and_theme_survive_a_reload(tab, tmp_path):
    from selenium.webdriver.common.keys import Keys
    profile = str(tmp_path / "profile")
    t = tab(profile=profile)
    typed = ("temp 27C dew 13C elev 1350ft", "base", "unit m", "temp 25C", "tmep 4",
             "temp 22C", "out kv", "out text", "excess 2C", "da")
    for line in typed:
        t.type_line(line)
    t.wait("true")
    t.driver.find_element("id", "theme").click()
    assert t.driver.execute_script("return document.documentElement.dataset.theme") == "night"
    kept = t.wait("JSON.parse(localStorage.getItem('lapsecalc.page.settings')).length <= 4"
                  " && localStorage.getItem('lapsecalc.page.settings')")
    # Only lines that changed the session are kept, and the compaction dropped those a
    # later line overrides (temp 25C by temp 22C, out kv by out text).
    assert json.loads(kept) == ["temp 27C dew 13C elev 1350ft", "unit m", "temp 22C",
                                "excess 2C"]
    t.driver.quit()
    t2 = tab(profile=profile)
    assert t2.driver.execute_script("return document.documentElement.dataset.theme") == "night"
    assert "  temp 22C" in t2.out_text()
    want, _ = expected(json.loads(kept) + ["show", "report"])
    for line, want_lines in zip(["show", "report"], want[-2:]):
        got = lines_of(t2.type_line(line))
        assert len(got) == len(want_lines) and all(map(same_line, want_lines, got)), line
    assert t2.driver.find_element("css selector", "#chart svg") is not None
    # History: up steps back through the lines typed before the reload too.
    box = t2.driver.find_element("id", "line")
    box.send_keys(Keys.ARROW_UP)
    assert box.get_attribute("value") == "report"
    box.send_keys(Keys.ARROW_UP, Keys.ARROW_UP)
    assert box.get_attribute("value") == "da"
    box.send_keys(Keys.ARROW_DOWN, Keys.ARROW_DOWN, Keys.ARROW_DOWN)
    assert box.get_attribute("value") == ""
    assert t2.network() == [t2.url]
    # A stored line that no longer passes is dropped on the next start, and said so.
    t2.driver.execute_script("localStorage.setItem('lapsecalc.page.settings',"
                             " JSON.stringify(['temp 27C', 'frobnicate 3', 'dew 13C']))")
    t2.driver.refresh()
    t2.ready(60)
    text = t2.out_text()
    assert "settings kept on this device:\n  temp 27C\n  dew 13C\n" in text
    assert text.endswith("no longer accepted, forgotten:\n  frobnicate 3")
    assert t2.driver.execute_script("return localStorage.getItem('lapsecalc.page.settings')") \
        == '["temp 27C","dew 13C"]'
    # forget (tapped twice) clears the settings and the history, and starts afresh.
    forget = t2.driver.find_element("id", "forget")
    forget.click()
    assert forget.text == "sure?"
    forget.click()
    assert t2.out_text().endswith("# settings and history on this device forgotten; new session")
    for key in ("settings", "history"):
        assert t2.driver.execute_script(
            "return localStorage.getItem('lapsecalc.page.%s')" % key) == "[]"
    assert lines_of(t2.type_line("show")) == [PROMPT + "show"] + Session().feed("show")


@needs_browser
def test_word_buttons_insert_words(tab):
    t = tab(390, 844)
    d = t.driver
    pad = {b.text: b for b in d.find_elements("css selector", "#pad button")}
    for word in ("temp", "dew", "base", "report", "elr"):
        assert word in pad, word
    pad["temp"].click()
    d.find_element("id", "line").send_keys("27")
    pad["C"].click()
    pad["dew"].click()
    d.find_element("id", "line").send_keys("13")
    pad["C"].click()
    pad["elev"].click()
    d.find_element("id", "line").send_keys("400")
    pad["m"].click()
    assert d.find_element("id", "line").get_attribute("value") == "temp 27C dew 13C elev 400m"
    pad["del"].click()
    assert d.find_element("id", "line").get_attribute("value") == "temp 27C dew 13C elev "
    pad["del"].click()
    assert d.find_element("id", "line").get_attribute("value") == "temp 27C dew 13C "
    pad["\u2715"].click()
    pad["base"].click()
    assert d.find_element("id", "line").get_attribute("value") == "base "
    d.find_element("id", "run").click()
    t.wait("Number(document.getElementById('out').dataset.lines) === 1")
    assert t.out_text().endswith(PROMPT + "base \n" + "\n".join(Session().feed("base")))


def _layout_facts(t):
    # Sizes a person would check: 40 columns fit the pane, touch targets, cautions.
    return t.driver.execute_script("""
        const out = document.getElementById('out');
        const probe = document.createElement('span');
        probe.textContent = '0'.repeat(40);
        out.append(probe);
        const cols40 = probe.getBoundingClientRect().width;
        probe.remove();
        const cs = getComputedStyle(out);
        const room = out.clientWidth - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight);
        const buttons = [...document.querySelectorAll('button')].map(b => {
            const r = b.getBoundingClientRect(); return [b.textContent, r.width, r.height]; });
        const cautions = [...document.querySelectorAll('.cautions li')].map(li => {
            const r = li.getBoundingClientRect(); return [li.textContent, r.bottom]; });
        return {cols40, room, font: parseFloat(cs.fontSize), buttons, cautions,
                inner: [innerWidth, innerHeight], scrollW: document.documentElement.scrollWidth};
    """)


@needs_browser
@pytest.mark.parametrize("width,height", [(768, 1024), (390, 844)])
def test_layout_and_screenshots(tab, width, height):
    os.makedirs(SHOTS, exist_ok=True)
    t = tab(width, height)
    for line in DEMO_LINES[:5] + ("base",):
        t.type_line(line)
    f = _layout_facts(t)
    assert f["inner"] == [width, height]
    assert f["scrollW"] <= width, "the page scrolls sideways"
    assert f["cols40"] <= f["room"] and f["font"] >= 11, f
    # Touch targets at least 44 px each way (common practice: the platforms' guidance
    # for touch, from memory).
    small = [b for b in f["buttons"] if b[1] < 44 or b[2] < 44]
    assert not small, small
    # The cautions are on the first screen, whole.
    assert [c[0] for c in f["cautions"]] == list(CAUTIONS)
    assert all(c[1] <= height for c in f["cautions"]), f["cautions"]
    t.driver.save_screenshot(os.path.join(SHOTS, "page-%d-day.png" % width))
    t.driver.find_element("id", "theme").click()
    bg = t.driver.execute_script("return getComputedStyle(document.body).backgroundColor")
    rgb = [int(x) for x in bg[bg.index("(") + 1:bg.index(")")].split(",")[:3]]
    assert max(rgb) < 40, bg  # night: a dark page
    t.driver.save_screenshot(os.path.join(SHOTS, "page-%d-night.png" % width))
    # Scrolled down: the chart of the demo field.
    t.type_line("chart")
    t.driver.execute_script("document.getElementById('chart').scrollIntoView()")
    t.driver.save_screenshot(os.path.join(SHOTS, "page-%d-night-chart.png" % width))
    # Night mode recolours the whole chart with one filter; the legend shows samples
    # of the paints inside it, so they change with the curves, and names no colour
    # (a colour word would be wrong under the filter).
    f = t.driver.execute_script("""
        const svg = document.querySelector('#chart svg');
        return {filter: getComputedStyle(svg).filter,
                samples: svg.querySelectorAll('.legend').length,
                words: Array.from(svg.querySelectorAll('text'), (x) => x.textContent)};""")
    assert "invert" in f["filter"] and f["samples"] == 3, f
    words = " ".join(f["words"]).lower().replace(";", " ").replace(":", " ").split()
    assert not set(words) & {"black", "red", "blue", "white", "grey", "gray"}, words
    assert t.network() == [t.url]
