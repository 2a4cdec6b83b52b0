// The page: starts the VM from the bytes in this file, copies the lapsecalc modules
// into its file system, and runs each line through lapsecalc.shell.Session.feed,
// the same call the command line makes. Nothing here computes a number.

const $ = (id) => document.getElementById(id);
const out = $("out");
const line = $("line");
const chart = $("chart");
const PROMPT = JSON.parse($("prompt").textContent);
const KEYS = { settings: "lapsecalc.page.settings", history: "lapsecalc.page.history",
  theme: "lapsecalc.page.theme" };
const MAX_HISTORY = 200;   // lines kept for up/down
const MAX_PANE = 3000;     // output lines kept on screen
// Timings for bench/page_budget.py: ms since the page started to open.
const times = (window.lcTimes = { first_output_ms: null, ready_ms: null, lines_ms: [],
  chart_ms: [] });

// Python run in the VM once the modules are in place. _pg_feed runs a line and says
// whether it changed what the session keeps (Session.snapshot()): those lines are the
// settings this page stores and replays after a reload; _pg_compact drops stored lines
// whose removal ends in the same state, so the list stays short.
const GLUE = `
import gc, json, sys
import lapsecalc
from lapsecalc.shell import Session
from lapsecalc.chartwords import chart_svg
_pg_s = Session()
_pg_banner = "lapsecalc %s, MicroPython %s" % (
    lapsecalc.__version__, ".".join(str(x) for x in sys.implementation.version[:3]))
_pg_text = _pg_svg = _pg_list = ""
_pg_kept = _pg_done = False
_pg_drawn = None

def _pg_feed(line):
    global _pg_s, _pg_text, _pg_kept, _pg_done
    before = _pg_s.snapshot()
    _pg_text = "\\n".join(_pg_s.feed(line))
    _pg_done = _pg_s.done
    _pg_kept = not _pg_done and _pg_s.snapshot() != before
    if _pg_done:
        _pg_s = Session()

def _pg_chart():
    # The chart of the session as it is now; "" when it is the one already drawn.
    global _pg_svg, _pg_drawn
    now = (_pg_s, _pg_s.snapshot())
    if now == _pg_drawn:
        _pg_svg = ""
        return
    try:
        _pg_svg = chart_svg(_pg_s)
    except ValueError as e:
        _pg_svg = "!" + str(e)
    _pg_drawn = now

def _pg_preload():
    # Import every module now, so that no line waits for a first import.
    import os
    # A module that fails here fails again, with its message, in the line that uses it.
    for n in sorted(os.listdir("/lapsecalc")):
        if n.endswith(".py") and not n.startswith("__"):
            try:
                __import__("lapsecalc." + n[:-3])
            except Exception as e:
                print("preload of %s failed: %r" % (n, e))

def _pg_end(lines):
    s = Session()
    for x in lines:
        s.feed(x)
    return s.snapshot()

def _pg_compact(text):
    global _pg_list
    lines = json.loads(text)
    want = _pg_end(lines)
    i = 0
    while i < len(lines) - 1:
        trial = lines[:i] + lines[i + 1:]
        if _pg_end(trial) == want:
            lines = trial
        else:
            i += 1
    _pg_list = json.dumps(lines)

def _pg_new():
    global _pg_s
    _pg_s = Session()
`;

let mp = null;
let kept = [];      // accepted lines that changed the settings, oldest first
let history = [];
let hpos = 0;       // position in history while stepping with up/down

function load(key, fallback) {
  try {
    const v = JSON.parse(localStorage.getItem(key));
    return Array.isArray(fallback) === Array.isArray(v) && v !== null ? v : fallback;
  } catch (e) {
    return fallback;
  }
}

function save(key, value) {
  try {
    localStorage.setItem(key, JSON.stringify(value));
  } catch (e) {
    // storage full or refused (private mode): the page still works, it just forgets
  }
}

function show(text) {
  if (text === "") return;
  const atEnd = out.scrollTop + out.clientHeight >= out.scrollHeight - 4;
  out.append(document.createTextNode((out.textContent ? "\n" : "") + text));
  if (out.childNodes.length > 400) {
    const rows = out.textContent.split("\n");
    out.textContent = rows.slice(Math.max(0, rows.length - MAX_PANE)).join("\n");
  }
  if (atEnd || text.startsWith(PROMPT)) out.scrollTop = out.scrollHeight;
}

function py(code) {
  mp.runPython(code);
}

function feed(text) {
  mp.globals.set("_pg_line", text);
  py("_pg_feed(_pg_line)");
  return { text: mp.globals.get("_pg_text"), kept: mp.globals.get("_pg_kept"),
    done: mp.globals.get("_pg_done") };
}

function drawChart() {
  py("_pg_chart()");
  const svg = mp.globals.get("_pg_svg");
  if (svg === "") return;  // the same state as the chart on the page
  if (svg.startsWith("!")) {
    const p = document.createElement("p");
    p.className = "none";
    p.textContent = "No profile yet: " + svg.slice(1).replace(/^svg /, "the chart ");
    chart.replaceChildren(p);
  } else {
    chart.innerHTML = svg;
  }
}

function compact() {
  if (kept.length < 2) return;
  mp.globals.set("_pg_line", JSON.stringify(kept));
  py("_pg_compact(_pg_line)");
  kept = JSON.parse(mp.globals.get("_pg_list"));
  save(KEYS.settings, kept);
}

// One line: its output goes on the page at once (times.lines_ms, Enter to output);
// the chart is redrawn after that output is painted (times.chart_ms, the redraw
// alone), then out.dataset.lines counts the line as done.
function run(text) {
  const t0 = performance.now();
  show(PROMPT + text);
  let r;
  try {
    r = feed(text);
  } catch (e) {
    r = { text: "error: the page's VM failed (" + String(e.message || e).split("\n").pop() + ")",
      kept: false, done: false };
  }
  show(r.text);
  if (r.done) {
    kept = [];
    save(KEYS.settings, kept);
    show("# session ended; a new one starts (settings forgotten)");
  } else if (r.kept) {
    kept.push(text);
    save(KEYS.settings, kept);
  }
  times.lines_ms.push(performance.now() - t0);
  requestAnimationFrame(() => setTimeout(() => {
    const t1 = performance.now();
    try {
      drawChart();
    } catch (e) {
      chart.textContent = "chart failed: " + String(e.message || e);
    }
    times.chart_ms.push(performance.now() - t1);
    if (r.kept) compact();
    py("gc.collect()");  // now, between lines, rather than in the middle of the next one
    out.dataset.lines = String(Number(out.dataset.lines || 0) + 1);
  }, 0));
}

function remember(text) {
  if (text.trim() && history[history.length - 1] !== text) {
    history.push(text);
    if (history.length > MAX_HISTORY) history = history.slice(-MAX_HISTORY);
    save(KEYS.history, history);
  }
  hpos = history.length;
}

function step(delta) {
  const next = Math.min(Math.max(hpos + delta, 0), history.length);
  if (next === hpos) return;
  hpos = next;
  line.value = hpos < history.length ? history[hpos] : "";
  line.setSelectionRange(line.value.length, line.value.length);
}

function insert(word, glue) {
  const v = line.value;
  if (glue) line.value = v.replace(/\s+$/, "") + word;
  else line.value = v + (v === "" || /\s$/.test(v) ? "" : " ") + word + " ";
  line.focus();
  line.setSelectionRange(line.value.length, line.value.length);
}

function onPad(ev) {
  const b = ev.target.closest("button");
  if (!b) return;
  const key = b.dataset.key;
  if (key === "up") step(-1);
  else if (key === "down") step(1);
  else if (key === "clr") line.value = "";
  else if (key === "del") line.value = line.value.replace(/\s*\S+\s*$/, "") + (/\S\s*\S/.test(line.value) ? " " : "");
  else if (key) insert(key, true);
  else insert(b.textContent, false);
  if (key === "up" || key === "down" || key === "clr" || key === "del") line.focus();
}

function setTheme(name) {
  document.documentElement.dataset.theme = name;
  $("theme").setAttribute("aria-pressed", String(name === "night"));
}

function wire() {
  $("entry").addEventListener("submit", (ev) => {
    ev.preventDefault();
    const text = line.value;
    line.value = "";
    remember(text);
    run(text);
  });
  line.addEventListener("keydown", (ev) => {
    if (ev.key === "ArrowUp") { ev.preventDefault(); step(-1); }
    else if (ev.key === "ArrowDown") { ev.preventDefault(); step(1); }
  });
  $("pad").addEventListener("click", onPad);
  $("theme").addEventListener("click", () => {
    const name = document.documentElement.dataset.theme === "night" ? "day" : "night";
    setTheme(name);
    save(KEYS.theme, name);
  });
  let armed = 0;
  $("forget").addEventListener("click", (ev) => {
    const b = ev.currentTarget;
    if (Date.now() - armed > 4000) {
      armed = Date.now();
      b.textContent = "sure?";
      setTimeout(() => { b.textContent = "forget"; }, 4000);
      return;
    }
    armed = 0;
    b.textContent = "forget";
    kept = [];
    history = [];
    hpos = 0;
    save(KEYS.settings, kept);
    save(KEYS.history, history);
    py("_pg_new()");
    drawChart();
    show("# settings and history on this device forgotten; new session");
  });
}

// Keep the 40-column layout: the largest font size (at most 15 px) at which 41 glyphs
// (40 and the scroll edge) fit the pane's width, measured with the pane's own font.
function fitColumns() {
  const probe = document.createElement("span");
  probe.style.cssText = "position:absolute;visibility:hidden;white-space:pre;font-size:100px";
  probe.style.fontFamily = getComputedStyle(out).fontFamily;
  probe.textContent = "0".repeat(40);
  document.body.append(probe);
  const glyph = probe.getBoundingClientRect().width / 4000; // glyph width per px of size
  probe.remove();
  const cs = getComputedStyle(out);
  const room = out.clientWidth - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight);
  if (glyph > 0 && room > 0) {
    out.style.fontSize = Math.min(15, Math.floor((room / (41 * glyph)) * 10) / 10) + "px";
  }
}

function bytesOf(b64) {
  const s = atob(b64.trim());
  const a = new Uint8Array(s.length);
  for (let i = 0; i < s.length; i++) a[i] = s.charCodeAt(i);
  return a;
}

async function start() {
  const stored = load(KEYS.theme, null);
  setTheme(stored === "night" || stored === "day" ? stored
    : (matchMedia("(prefers-color-scheme: dark)").matches ? "night" : "day"));
  wire();
  fitColumns();
  addEventListener("resize", fitColumns);
  history = load(KEYS.history, []).filter((x) => typeof x === "string");
  hpos = history.length;
  try {
    mp = await loadMicroPython({
      wasmBinary: bytesOf($("vm-wasm").textContent),
      heapsize: 2 * 1024 * 1024,
      stdout: (s) => console.log(s),
      stderr: (s) => console.error(s),
    });
    const files = JSON.parse($("board-files").textContent);
    for (const [target, text] of Object.entries(files)) {
      const dir = "/" + target.split("/").slice(0, -1).join("/");
      mp.FS.mkdirTree(dir);
      mp.FS.writeFile("/" + target, text);
    }
    py('import os\nos.chdir("/")\n' + GLUE);
  } catch (e) {
    show("error: the interpreter did not start (" + String(e.message || e) + ")");
    times.first_output_ms = performance.now();
    return;
  }
  times.ready_ms = performance.now();
  // Replay the settings kept on this device; a line that no longer passes is dropped.
  const again = [];
  const dropped = [];
  for (const text of load(KEYS.settings, [])) {
    if (typeof text === "string" && feed(text).kept) again.push(text);
    else dropped.push(String(text));
  }
  kept = again;
  save(KEYS.settings, kept);
  // At most 40 columns, like every line of the interpreter.
  show(mp.globals.get("_pg_banner") + "\nEnter runs a line; help lists the words.");
  show("settings kept on this device:" + (kept.length ? "\n" + kept.map((x) => "  " + x)
    .join("\n") : " none"));
  if (dropped.length) {
    show("no longer accepted, forgotten:\n" + dropped.map((x) => "  " + x).join("\n"));
  }
  drawChart();
  times.first_output_ms = performance.now();
  line.disabled = false;
  line.placeholder = "e.g. temp 27C dew 13C elev 1350ft";
  line.focus();
  // Import the remaining modules once the first output is painted.
  requestAnimationFrame(() => setTimeout(() => {
    py("_pg_preload()");
    out.dataset.ready = "1";
  }, 0));
}

start();
