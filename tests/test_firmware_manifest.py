"""The freeze manifests (firmware/manifest-core.py, firmware/manifest.py) list the same
modules as the mip manifests (lapsecalc/package.json, package-full.json).

A manifest is run here as MicroPython's build runs it: Python with the manifest
functions in scope (package, module, include, require, metadata, options, freeze,
from MicroPython's manifest format, tools/manifestfile.py, from memory); using any
other name fails. Paths are relative to the manifest's own folder."""
import os
import sys

import pytest

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, os.path.join(HERE, "mpy"))
import boardset  # noqa: E402  (tests/mpy/boardset.py)

FIRMWARE = os.path.join(boardset.ROOT, "firmware")


def frozen_files(path):
    """[(package or module path relative to the repo, file)] a manifest freezes."""
    folder = os.path.dirname(path)
    out = []

    def package(package_path, files=None, base_path=".", opt=None):
        root = os.path.normpath(os.path.join(folder, base_path, package_path))
        assert os.path.isdir(root), root
        assert files is not None, "list the files: a package() without them freezes all"
        for f in files:
            out.append((os.path.relpath(root, boardset.ROOT), f))

    def module(module_path, base_path=".", opt=None):
        f = os.path.normpath(os.path.join(folder, base_path, module_path))
        out.append((os.path.relpath(os.path.dirname(f), boardset.ROOT), os.path.basename(f)))

    def include(manifest_path, **kwargs):
        out.extend(frozen_files(os.path.join(folder, manifest_path)))

    def unused(*args, **kwargs):
        raise AssertionError("the lapsecalc manifests only freeze files")

    names = {"package": package, "module": module, "include": include, "require": unused,
             "metadata": unused, "options": unused, "freeze": unused, "__builtins__": {}}
    with open(path) as f:
        exec(compile(f.read(), path, "exec"), names)
    return out


@pytest.mark.parametrize("freeze, mip", [
    ("manifest-core.py", boardset.CORE_MANIFEST),
    ("manifest.py", boardset.FULL_MANIFEST),
])
def test_freeze_manifest_lists_the_mip_modules(freeze, mip):
    got = frozen_files(os.path.join(FIRMWARE, freeze))
    assert set(p for p, _ in got) == {"lapsecalc"}
    files = [f for _, f in got]
    assert len(files) == len(set(files)), "a file frozen twice"
    want = [m + ".py" for m in boardset.manifest_modules(mip)]
    assert sorted(files) == sorted(want), (
        "firmware/%s and %s differ: only frozen %s, only installed %s"
        % (freeze, os.path.basename(mip), sorted(set(files) - set(want)),
           sorted(set(want) - set(files))))
    for f in files:
        assert os.path.exists(os.path.join(boardset.PKG, f)), f


def test_reader_catches_a_missing_module(tmp_path):
    # The check above can fail: a manifest that leaves out a module differs.
    src = open(os.path.join(FIRMWARE, "manifest-core.py")).read()
    bad = tmp_path / "manifest-core.py"
    bad.write_text(src.replace('"station.py",', "").replace('base_path="..",',
                                                           'base_path=%r,' % boardset.ROOT))
    files = [f for _, f in frozen_files(str(bad))]
    want = [m + ".py" for m in boardset.core_modules()]
    assert "station.py" in want and "station.py" not in files
    with pytest.raises(AssertionError):
        frozen_files_with(tmp_path, "require('os')\n")


def frozen_files_with(tmp_path, text):
    p = tmp_path / "m.py"
    p.write_text(text)
    return frozen_files(str(p))
