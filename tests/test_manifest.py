"""The mip manifests: lapsecalc/package.json (core) and lapsecalc/package-full.json
(core plus the interpreter extras) list exactly the board modules that exist."""
import ast
import os
import re
import sys

import lapsecalc

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "mpy"))
import boardset  # noqa: E402  (tests/mpy/boardset.py)


def _optional(tree):
    # Import nodes inside a try whose handler catches ImportError: optional modules
    # (Column.report() takes lapsecalc.hazards when a board has it).
    out = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Try) and any(
                "ImportError" in [n.id for n in ast.walk(h.type) if isinstance(n, ast.Name)]
                for h in node.handlers if h.type is not None):
            for stmt in node.body:
                out.update(id(n) for n in ast.walk(stmt))
    return out


def _lapsecalc_imports(module, optional_too=True):
    # Every lapsecalc module the source imports, at the top or inside a function;
    # without those guarded by "except ImportError" unless optional_too.
    tree = ast.parse(open(os.path.join(boardset.PKG, module + ".py")).read())
    skip = set() if optional_too else _optional(tree)
    out = set()
    for node in ast.walk(tree):
        if id(node) in skip:
            continue
        if isinstance(node, ast.ImportFrom) and node.module:
            if node.module == "lapsecalc":
                # Submodules only (a name defined in __init__.py, such as _drop, is none).
                out.update(a.name for a in node.names
                           if os.path.exists(os.path.join(boardset.PKG, a.name + ".py")))
            elif node.module.startswith("lapsecalc."):
                out.add(node.module.split(".")[1])
        elif isinstance(node, ast.Import):
            for a in node.names:
                if a.name.startswith("lapsecalc."):
                    out.add(a.name.split(".")[1])
    return out


def test_manifests_have_mip_shape():
    # mip's package.json: {"urls": [[target, source], ...], "deps": [...], "version"}
    # (REFERENCES.md "MicroPython facts").
    for path in (boardset.CORE_MANIFEST, boardset.FULL_MANIFEST):
        m = boardset.read_manifest(path)
        assert sorted(m) == ["deps", "urls", "version"], path
        assert m["deps"] == [], path
        for target, source in m["urls"]:
            assert re.match(r"^lapsecalc/[a-z_]+\.py$", target), target
            # OWNER/REPO stays a placeholder: the docs say to put the real names in.
            assert source == "github:OWNER/REPO/" + target, source
        names = [t for t, _ in m["urls"]]
        assert len(names) == len(set(names)), path


def test_versions_match_package():
    pyproject = open(os.path.join(boardset.ROOT, "pyproject.toml")).read()
    assert 'version = "%s"' % lapsecalc.__version__ in pyproject
    for path in (boardset.CORE_MANIFEST, boardset.FULL_MANIFEST):
        assert boardset.read_manifest(path)["version"] == lapsecalc.__version__, path


def test_full_manifest_is_every_board_module():
    board = boardset.board_modules()
    expected = [m for m in boardset.source_modules()
                if m not in boardset.CPYTHON_ONLY and m not in boardset.BOARD_LATER]
    unlisted = sorted(set(expected) - set(board))
    gone = sorted(set(board) - set(expected))
    assert not unlisted, "add to lapsecalc/package-full.json (and package.json if core): %s" \
        % unlisted
    assert not gone, "listed in lapsecalc/package-full.json but no such file: %s" % gone
    for m in boardset.CPYTHON_ONLY:
        assert m not in board


def test_core_is_part_of_full_and_has_what_a_station_needs():
    core = boardset.core_modules()
    board = boardset.board_modules()
    assert board[:len(core)] == core  # full = core first, then the extras
    for m in ("__init__", "constants", "limits", "moisture", "standard", "condensation",
              "column", "station"):
        assert m in core, m


# Extras a core module may import inside a function, for an input only the full set
# takes: Column(aloft=...) loads aloftpoints.py (through profile.py) and aloft.py
# (temperatures aloft; kept
# out of the core's import heap budget, a station never gives them).
CORE_OPTIONAL = {"profile": {"aloftpoints"}, "column": {"aloft"}, "stability": {"aloft"}}


def _top_level_imports(module):
    tree = ast.parse(open(os.path.join(boardset.PKG, module + ".py")).read())
    out = set()
    for node in tree.body:
        if isinstance(node, ast.ImportFrom) and node.module and \
                node.module.startswith("lapsecalc."):
            out.add(node.module.split(".")[1])
    return out


def test_core_imports_only_core():
    # A board with only package.json installed must be able to import everything in it.
    # An import guarded by "except ImportError" is optional (an extra the core uses
    # when installed).
    core = set(boardset.core_modules())
    for m in core:
        outside = _lapsecalc_imports(m, optional_too=False) - core - CORE_OPTIONAL.get(m, set())
        assert not outside, "core module %s imports %s" % (m, sorted(outside))
        # The optional extras only inside functions, never at import.
        assert not (_top_level_imports(m) & CORE_OPTIONAL.get(m, set())), m
    for m, extras in CORE_OPTIONAL.items():
        assert m in core and not (extras & core)


def test_optional_import_is_seen_as_optional():
    # column.report() tries indicated.py, only under "except ImportError".
    assert "indicated" in _lapsecalc_imports("column")
    assert "indicated" not in _lapsecalc_imports("column", optional_too=False)


def test_board_modules_never_import_cpython_only_ones():
    board = set(boardset.board_modules())
    for m in board:
        outside = _lapsecalc_imports(m, optional_too=False) - board
        assert not outside, "board module %s imports %s" % (m, sorted(outside))


# The interpreter's layers, top down (lapsecalc/shell.py says why): a module imports
# only modules of the layers below its own, at the top or inside a function.
INTERPRETER_LAYERS = (
    ("shell",),
    ("settingline",),  # a line of settings (shell loads it for one, without dispatch)
    ("dispatch",),  # the word tables, a refusal's words (shell loads it per line)
    ("balloonwords", "showword", "atwords", "balloonsettings", "airsettings"),
    ("reportwords", "chartwords"),  # atwords' da says a group of the report
    ("settings", "queries", "commands"),
    ("heights",),
    ("altiwords",),
    ("altitext", "chartsvg", "balloontext", "reporttext"),
    ("layout", "chart", "metar", "helptext", "loadtable"),
    ("labels",),  # the result keys' labels (layout and the altimeter text read them)
    ("retell",),  # the library's sentences in the user's terms (layout says warnings)
    ("aloftwords",),
    ("hotreport", "gasballoon", "groups", "output", "state", "typed", "hazardtext"),
    ("jsontext",),  # the json mode's lines (output's say and ack too)
    ("machine",),
    ("hotair",),  # hot-air lift: the hot-air report and the load table read it
    ("balloon",),  # what hot air and gas share
    ("aliases",),
    ("altimetry",),  # library extras over the core: altimetry.py over indicated.py,
    ("indicated",),  # which column.report() tries under "except ImportError"
)


# Library modules a board installs with the interpreter only (not core), below every
# interpreter layer.
LIBRARY_EXTRAS = {"aloft", "aloftpoints", "units", "hazards", "thermals", "icing", "precip", "fieldrisk",
                  "cautions"}


def test_interpreter_layers_import_downward():
    core = set(boardset.core_modules())
    below = core | LIBRARY_EXTRAS
    for m in LIBRARY_EXTRAS:
        # The core and one another (hazards' modules read the cloud layers of aloft;
        # test_no_module_imports_in_a_circle keeps that acyclic).
        assert _lapsecalc_imports(m) <= core | LIBRARY_EXTRAS, m
    for layer in reversed(INTERPRETER_LAYERS):
        for m in layer:
            wrong = _lapsecalc_imports(m) - below
            assert not wrong, "%s imports %s from its own layer or above" % (m, sorted(wrong))
        below |= set(layer)
    listed = set(m for layer in INTERPRETER_LAYERS for m in layer)
    assert listed | core | LIBRARY_EXTRAS | {"demo"} == set(boardset.board_modules())


def test_no_module_imports_in_a_circle():
    modules = boardset.board_modules()
    deps = dict((m, _lapsecalc_imports(m) & set(modules)) for m in modules)

    def reach(start):
        seen, todo = set(), list(deps[start])
        while todo:
            m = todo.pop()
            if m not in seen:
                seen.add(m)
                todo.extend(deps[m])
        return seen

    for m in modules:
        assert m not in reach(m), "%s imports itself through others" % m
