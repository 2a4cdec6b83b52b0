// Run lapsecalc under the MicroPython WebAssembly VM (Node.js >= 20).
//
//   node tests/mpy/run.mjs [--pkg DIR] [--manifest FILE|none] [--heap KIB] [--pystack WORDS] SCRIPT.py [...]
//   node tests/mpy/run.mjs [--pkg DIR] [--manifest FILE|none] --mem [--modules a,b] [--snippet CODE] [--time N]
//   node tests/mpy/run.mjs [--pkg DIR] [--manifest FILE|none] --mem --modules shell --session FILE
//
// The package's *.py and *.mpy files are copied to /lapsecalc/ in the VM: only the
// modules a mip manifest lists (default DIR/package-full.json when it exists, i.e.
// the board modules: cli.py and __main__.py are CPython-only), every file with
// --manifest none or when DIR has no package-full.json (an .mpy build).
// Each script runs in its own runPython call with fresh globals, so a
// gc.collect() in a later call can free what an earlier one allocated.
// --heap is the initial GC heap (default 2048 KiB); this port adds heap areas
// when it runs out, so it is not a cap. --pystack is the Python stack in
// 4-byte words (port default 2048); a big list literal can exhaust it.
// --session FILE (with --mem) feeds each line of FILE (tests/mpy/board_session.txt)
// to one lapsecalc.shell.Session, each line in its own call with collections before
// it, and prints per line the heap held before it and what it allocates with the
// collector off (a collection inside the line, Session.collect(), ends a stage: the
// heap just before it counts as the line's peak; this VM defers a collection asked for
// inside a call to the call's end, as it cannot scan its WebAssembly locals, so here a
// line is one stage); session_need_bytes is the largest sum (lines checked by
// tests/mpy/board_session.py's line_failed; session_failed counts the failures).
import { existsSync, readFileSync, readdirSync } from "node:fs";
import { basename, dirname, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { loadMicroPython } from "@micropython/micropython-webassembly-pyscript";

const HERE = dirname(fileURLToPath(import.meta.url));

function usage(msg) {
  if (msg) console.error(`run.mjs: ${msg}`);
  console.error(
    "usage: node run.mjs [--pkg DIR] [--heap KIB] [--pystack WORDS] SCRIPT.py [...]\n" +
      "       node run.mjs [--pkg DIR] [--heap KIB] --mem [--modules a,b] [--snippet CODE] [--time N]",
  );
  process.exit(2);
}

function parseArgs(argv) {
  const opt = { pkg: resolve(HERE, "../../lapsecalc"), manifest: null, heapKiB: 2048, pystack: 2048, mem: false,
    modules: null, snippet: "", time: 0, session: null, scripts: [] };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = () => (i + 1 < argv.length ? argv[++i] : usage(`${a} needs a value`));
    if (a === "--pkg") opt.pkg = resolve(value());
    else if (a === "--manifest") opt.manifest = value();
    else if (a === "--heap") opt.heapKiB = Number(value());
    else if (a === "--pystack") opt.pystack = Number(value());
    else if (a === "--mem") opt.mem = true;
    else if (a === "--modules") opt.modules = value().split(",").filter(Boolean);
    else if (a === "--snippet") opt.snippet = value();
    else if (a === "--time") opt.time = Number(value());
    else if (a === "--session") opt.session = resolve(value());
    else if (a === "-h" || a === "--help") usage();
    else if (a.startsWith("--")) usage(`unknown option ${a}`);
    else opt.scripts.push(resolve(a));
  }
  if (!opt.mem && opt.scripts.length === 0) usage("no script given");
  if (!(opt.heapKiB > 0) || !(opt.pystack > 0) || !(opt.time >= 0)) usage("bad --heap, --pystack or --time");
  if (opt.time > 0 && !opt.snippet) usage("--time needs --snippet");
  if (opt.session && (!opt.mem || opt.snippet)) usage("--session needs --mem and no --snippet");
  return opt;
}

// Module names (no extension) a mip manifest installs, or null for "every file".
function manifestModules(opt) {
  let file = opt.manifest;
  if (file === "none") return null;
  if (file === null) {
    file = resolve(opt.pkg, "package-full.json");
    if (!existsSync(file)) return null;
  }
  const urls = JSON.parse(readFileSync(file, "utf8")).urls ?? [];
  return new Set(urls.map(([target]) => basename(target).replace(/\.py$/, "")));
}

// Copy the *.py / *.mpy files (not subfolders) of srcDir into the VM folder vmDir;
// only the modules in keep when keep is a Set.
function copyDir(FS, srcDir, vmDir, exts, keep = null) {
  FS.mkdirTree(vmDir);
  const names = readdirSync(srcDir)
    .filter((n) => exts.some((e) => n.endsWith(e)))
    .filter((n) => keep === null || keep.has(n.replace(/\.m?py$/, "")))
    .sort();
  for (const n of names) FS.writeFile(`${vmDir}/${n}`, readFileSync(resolve(srcDir, n)));
  return names;
}

// Python helpers defined once in __main__; all names start with _lc_.
const PRELUDE = `
import sys, gc
# Pre-create every result global so that setting one later does not grow
# the __main__ dict in the middle of a measurement.
_lc_rc = _lc_name = _lc_m0 = _lc_m1 = _lc_a0 = _lc_a1 = _lc_b = _lc_ms = _lc_ns = _lc_snip = 0
_lc_s = _lc_o = _lc_h = _lc_why = _lc_lf = _lc_pk = 0
def _lc_run(path, folder):
    global _lc_rc
    _lc_rc = 0
    sys.path.insert(0, folder)
    try:
        with open(path) as f:
            code = compile(f.read(), path, "exec")
        exec(code, {"__name__": "__main__", "__file__": path})
    except SystemExit as e:
        c = e.args[0] if e.args else None
        if c is None:
            _lc_rc = 0
        elif isinstance(c, int):
            _lc_rc = c
        else:
            print(c)
            _lc_rc = 1
    finally:
        sys.path.remove(folder)
`;

// The VM's output arrives byte by byte; pass it through in chunks.
function makeStream(stream) {
  let buf = [];
  const flush = () => {
    if (buf.length) stream.write(Buffer.from(buf));
    buf = [];
  };
  const put = (bytes) => {
    for (const b of bytes) buf.push(b);
    if (buf.length > 4096 || bytes.includes(10)) flush();
  };
  return { put, flush };
}

function pyStr(s) {
  return JSON.stringify(s); // a JSON string literal is a valid Python str literal
}

async function main() {
  const opt = parseArgs(process.argv.slice(2));
  const out = makeStream(process.stdout);
  const err = makeStream(process.stderr);
  const mp = await loadMicroPython({
    heapsize: opt.heapKiB * 1024,
    pystack: opt.pystack,
    linebuffer: false,
    stdout: out.put,
    stderr: err.put,
  });
  // Run one piece of code in its own call; on a Python exception print the
  // traceback (without the harness's own <stdin> frames) and exit 1.
  const call = (code) => {
    try {
      mp.runPython(code);
    } catch (e) {
      out.flush();
      err.flush();
      const tb = String(e.message ?? e).split("\n").filter((l) => !l.includes('File "<stdin>"'));
      process.stderr.write(tb.join("\n"));
      process.exit(1);
    }
    out.flush();
    err.flush();
  };

  if (!existsSync(opt.pkg)) usage(`package folder not found: ${opt.pkg}`);
  const keep = manifestModules(opt);
  const pkgFiles = copyDir(mp.FS, opt.pkg, "/lapsecalc", [".py", ".mpy"], keep);
  if (keep !== null) {
    const missing = [...keep].filter((m) => !pkgFiles.some((n) => n.replace(/\.m?py$/, "") === m));
    if (missing.length) {
      console.error(`run.mjs: the manifest lists modules not in ${opt.pkg}: ${missing.join(", ")}`);
      process.exit(2);
    }
  }
  if (!pkgFiles.some((n) => n.startsWith("__init__."))) {
    console.error(`run.mjs: no __init__.py or __init__.mpy in ${opt.pkg}`);
    process.exit(2);
  }
  call(`import os\nos.chdir("/")\n${PRELUDE}`); // "" on sys.path is /, so "import lapsecalc" works

  if (opt.mem) return memMode(opt, pkgFiles, call, mp);

  const copied = new Map();
  for (const script of opt.scripts) {
    const folder = dirname(script);
    if (!copied.has(folder)) {
      const vmDir = `/scripts/${copied.size}`;
      copyDir(mp.FS, folder, vmDir, [".py", ".txt"]);
      copied.set(folder, vmDir);
    }
    const vmDir = copied.get(folder);
    call(`_lc_run(${pyStr(`${vmDir}/${basename(script)}`)}, ${pyStr(vmDir)})`);
    const rc = mp.globals.get("_lc_rc");
    if (rc !== 0) process.exit(rc);
    call("gc.collect()");
  }
}

// Memory / timing measurements, each step in its own runPython call.
function memMode(opt, pkgFiles, call, mp) {
  // Default: every module except __init__ and __main__ (importing that would run it).
  const all = pkgFiles.map((n) => n.replace(/\.m?py$/, "")).filter((n) => !n.startsWith("__"));
  const modules = opt.modules ?? [...new Set(all)];
  const get = (name) => mp.globals.get(name);
  // One collect right after a call may miss garbage that call left behind
  // (stale roots); a second collect in a later call always got it in tests.
  const settle = () => { call("gc.collect()"); call("gc.collect()"); };

  if (opt.session) {
    // The line checker, loaded before the baseline so that it is not counted.
    const src = readFileSync(resolve(HERE, "board_session.py"), "utf8");
    call(`_lc_ns = {"__name__": "board_session", "__file__": "board_session.py"}
exec(${pyStr(src)}, _lc_ns)
_lc_lf = _lc_ns["line_failed"]
_lc_wr = _lc_ns["written"]
_lc_ns = 0`);
  }
  settle();
  call("_lc_m0 = gc.mem_alloc()");
  console.log(`baseline_heap_bytes=${get("_lc_m0")}`);

  const imports = ["lapsecalc", ...modules.map((m) => `lapsecalc.${m}`)];
  call(`for _lc_name in ${pyStr(imports.join(" "))}.split():
    try:
        __import__(_lc_name)
    except Exception:
        print("import failed:", _lc_name)
        raise
_lc_name = 0`);
  settle();
  call("_lc_m1 = gc.mem_alloc()");
  console.log(`import_modules=${modules.join(",")}`);
  console.log(`import_heap_bytes=${get("_lc_m1") - get("_lc_m0")}`);

  if (opt.session) return sessionMode(opt, call, get, settle);
  if (!opt.snippet) return;
  // The snippet becomes the body of a function in a namespace that holds the imports.
  const body = opt.snippet.split("\n").map((l) => "    " + l).join("\n");
  const src = `import lapsecalc\n${modules.map((m) => `from lapsecalc import ${m}`).join("\n")}\ndef _lc_snip():\n${body}\n`;
  call(`_lc_ns = {}\nexec(${pyStr(src)}, _lc_ns)\n_lc_snip = _lc_ns["_lc_snip"]`);
  call("_lc_snip()"); // warm-up: first-use caches etc. are not counted below
  settle();
  call("_lc_a0 = gc.mem_alloc()");
  call("gc.disable()\n_lc_b = gc.mem_alloc()\n_lc_snip()\n_lc_b = gc.mem_alloc() - _lc_b\ngc.enable()");
  settle();
  call("_lc_a1 = gc.mem_alloc()");
  console.log(`snippet_alloc_bytes=${get("_lc_b")}`);
  console.log(`snippet_held_bytes=${get("_lc_a1") - get("_lc_a0")}`);

  if (opt.time > 0) {
    call(`import time
def _lc_timeit(n):
    f = _lc_snip
    if hasattr(time, "ticks_ms"):
        t = time.ticks_ms()
        for _ in range(n):
            f()
        return time.ticks_diff(time.ticks_ms(), t)
    t = time.time()
    for _ in range(n):
        f()
    return (time.time() - t) * 1000
_lc_ms = _lc_timeit(${opt.time})`);
    const ms = get("_lc_ms");
    console.log(`time_runs=${opt.time}`);
    console.log(`time_total_ms=${ms}`);
    console.log(`time_per_run_us=${((ms * 1000) / opt.time).toFixed(1)}`);
  }
}

// One Session fed the lines of opt.session, accounted line by line (see the top).
function sessionMode(opt, call, get, settle) {
  const lines = readFileSync(opt.session, "utf8").split("\n");
  if (lines.length && lines[lines.length - 1] === "") lines.pop();
  // As repl() on a board (board_session.py): json lines written as they come.
  call("from lapsecalc.shell import Session\n_lc_s = Session()\n_lc_s.collect_after_line = False\n_lc_s.write = _lc_wr");
  // A collection inside a line (Session.collect) records the heap just before it.
  call(`def _lc_collect():
    global _lc_pk
    m = gc.mem_alloc()
    if m > _lc_pk:
        _lc_pk = m
    gc.collect()
_lc_s.collect = _lc_collect`);
  let worst = 0, worstLine = 0, failed = 0;
  lines.forEach((line, i) => {
    settle();
    call("_lc_h = gc.mem_alloc() - _lc_m0");
    call(`gc.disable()
_lc_a0 = gc.mem_alloc()
_lc_pk = 0
_lc_o = _lc_s.feed(${pyStr(line)})
_lc_a1 = gc.mem_alloc()
if _lc_pk > _lc_a1:
    _lc_a1 = _lc_pk
gc.enable()
_lc_why = _lc_lf(${pyStr(line)}, _lc_o)
_lc_o = 0`);
    const h = get("_lc_h"), a = get("_lc_a1") - get("_lc_a0"), why = get("_lc_why");
    if (h + a > worst) [worst, worstLine] = [h + a, i + 1];
    console.log(`line ${String(i + 1).padStart(2)} held ${String(h).padStart(6)} alloc ${String(a).padStart(6)}` +
      ` need ${String(h + a).padStart(6)} | ${line.slice(0, 40)}`);
    if (why !== null && why !== undefined) {
      failed += 1;
      console.log(`line ${i + 1} failed: ${why}`);
    }
  });
  console.log(`session_lines=${lines.length}`);
  console.log(`session_need_bytes=${worst}`);
  console.log(`session_need_line=${worstLine}`);
  console.log(`session_failed=${failed}`);
}

await main();
