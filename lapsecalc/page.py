"""The offline page (CPython only): one HTML file that runs the line interpreter in the
MicroPython WebAssembly VM, for a tablet or phone browser with no network.

The file holds the VM (its JavaScript loader, and its .wasm as base64, instantiated
from those bytes), every file the board manifest lapsecalc/package-full.json lists,
and the page's own markup, style and script (page.html, page.css, page.js beside
this module). No board module imports this one.
"""
import base64
import json
import os

from lapsecalc.shell import PROMPT
from lapsecalc.stability import CAUTIONS

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
VM_NAME = "@micropython/micropython-webassembly-pyscript"
# Where the test command installs the pinned VM (tests/mpy/package.json).
PIN_DIR = os.path.join(ROOT, "tests", "mpy")
VM_DIR = os.path.join(PIN_DIR, "node_modules", "@micropython", "micropython-webassembly-pyscript")

# The VM's loader is an ES module that fetches micropython.wasm beside itself. The page
# inlines it as a classic part of its own module script: the two exports become plain
# declarations, and loadMicroPython hands the .wasm bytes the page gives it to the
# emscripten module (Module.wasmBinary), so that nothing is fetched.
_LOADER_PATCHES = (
    ("export default _createMicroPythonModule;", ""),
    ("export async function loadMicroPython(", "async function loadMicroPython("),
    ("let Module={locateFile:(path,scriptDirectory)=>url||scriptDirectory+path};",
     "let Module={locateFile:(path,scriptDirectory)=>url||scriptDirectory+path,"
     "wasmBinary:options.wasmBinary};"),
)


def install_hint():
    """The command that installs the pinned VM, as one line of advice."""
    pin = pinned_version()
    return ("install it with:  (cd %s && npm ci)   (or: npm install %s@%s, then give its"
            " folder with --vm)" % (PIN_DIR, VM_NAME, pin or "VERSION"))


def pinned_version():
    """The VM version the tests pin (tests/mpy/package.json), or None outside a checkout."""
    try:
        with open(os.path.join(PIN_DIR, "package.json"), encoding="utf-8") as f:
            return json.load(f)["dependencies"][VM_NAME]
    except (OSError, ValueError, KeyError):
        return None


def read_vm(vm_dir=None):
    """(loader JavaScript, wasm bytes, version) of the VM in vm_dir (default: the one
    the test command installs); ValueError saying how to install it when missing."""
    vm_dir = vm_dir or VM_DIR
    files = [os.path.join(vm_dir, n) for n in ("micropython.mjs", "micropython.wasm",
                                               "package.json")]
    missing = [f for f in files if not os.path.isfile(f)]
    if missing:
        raise ValueError("the MicroPython WebAssembly VM is missing (no %s); %s"
                         % (missing[0], install_hint()))
    with open(files[2], encoding="utf-8") as f:
        version = json.load(f).get("version", "?")
    pin = pinned_version()
    if vm_dir == VM_DIR and pin is not None and version != pin:
        raise ValueError("the VM in %s is version %s, the tests pin %s; %s"
                         % (vm_dir, version, pin, install_hint()))
    with open(files[0], encoding="utf-8") as f:
        loader = f.read()
    for old, new in _LOADER_PATCHES:
        if loader.count(old) != 1:
            raise ValueError("the VM loader %s (version %s) is not the one this page builder"
                             " knows: %r not found once" % (files[0], version, old[:50]))
        loader = loader.replace(old, new)
    if "</script" in loader.lower():
        raise ValueError("the VM loader contains '</script' and cannot be inlined")
    with open(files[1], "rb") as f:
        wasm = f.read()
    return loader, wasm, version


def board_files():
    """{target path: text} of every file in lapsecalc/package-full.json."""
    with open(os.path.join(HERE, "package-full.json"), encoding="utf-8") as f:
        urls = json.load(f)["urls"]
    out = {}
    for target, _source in urls:
        name = target.split("/", 1)[1]
        with open(os.path.join(HERE, name), encoding="utf-8") as f:
            out[target] = f.read()
    return out


def _json_in_html(value):
    # JSON that is safe inside a <script> element: no "<" at all (so no "</script>").
    return json.dumps(value, sort_keys=True).replace("<", "\\u003c")


def _esc(text):
    return text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;")


def _template(name):
    with open(os.path.join(HERE, name), encoding="utf-8") as f:
        return f.read()


def build(vm_dir=None):
    """The page as one HTML string."""
    import lapsecalc
    loader, wasm, vm_version = read_vm(vm_dir)
    fills = {
        "STYLE": _template("page.css"),
        "SCRIPT": _template("page.js"),
        "LOADER": loader,
        "WASM": base64.b64encode(wasm).decode("ascii"),
        "FILES": _json_in_html(board_files()),
        "PROMPT": _esc(PROMPT),
        "PROMPT_JSON": _json_in_html(PROMPT),
        "CAUTIONS": "\n".join("      <li>%s</li>" % _esc(c) for c in CAUTIONS),
        "VERSION": _esc(lapsecalc.__version__),
        "VM_VERSION": _esc(vm_version),
    }
    html = _template("page.html")
    # Fill every slot of the template exactly once; slots inside the filled-in texts
    # (the loader, the modules) are never looked at.
    parts = html.split("{{")
    out = [parts[0]]
    for part in parts[1:]:
        key, sep, rest = part.partition("}}")
        if not sep or key not in fills:
            raise ValueError("page.html: unknown or repeated slot {{%s" % part[:20])
        out.append(fills.pop(key))
        out.append(rest)
    if fills:
        raise ValueError("page.html: slots not used: %s" % ", ".join(sorted(fills)))
    return "".join(out)


def write(name, vm_dir=None):
    """Build the page and write it to file name; return the line to print."""
    html = build(vm_dir)
    try:
        with open(name, "w", encoding="utf-8") as f:
            f.write(html)
    except OSError as e:
        raise ValueError("cannot write %s: %s" % (name, e.strerror or e))
    return "ok: page written to %s (%d KiB); open it in a browser, no network needed" % (
        name, (len(html.encode("utf-8")) + 1023) // 1024)


def main(argv=None):
    """lapsecalc page FILE [--vm DIR]; returns the exit status."""
    import argparse
    import sys
    p = argparse.ArgumentParser(
        prog="lapsecalc page",
        description="Write the offline page: one HTML file with the MicroPython WebAssembly"
                    " VM and the lapsecalc modules inside. Open it in a tablet or phone"
                    " browser from local storage; it needs no network.")
    p.add_argument("file", help="the HTML file to write, e.g. lapsecalc.html")
    p.add_argument("--vm", metavar="DIR",
                   help="folder of the npm package %s (default: %s)" % (VM_NAME, VM_DIR))
    a = p.parse_args(argv)
    try:
        print(write(a.file, a.vm))
    except ValueError as e:
        print("error: %s" % e, file=sys.stderr)
        return 1
    return 0
