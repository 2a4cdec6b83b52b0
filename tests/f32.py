"""Single-precision emulation for the tests: lapsecalc as a board with 32-bit floats
runs it.

load() returns a fresh copy of the package, importable as "lapsecalc_f32", whose
modules were compiled from lapsecalc/*.py after an AST rewrite:
  - every float literal becomes F32(literal), so constants and literals are float32;
  - float(x) becomes F32(x), so checked inputs are float32;
  - "from math import ..." / "import math" take the float32 shim MATH instead;
  - "lapsecalc" imports become "lapsecalc_f32" imports, and so do module paths in
    strings ("lapsecalc.x", as __init__'s lazy __import__ has), so that a lazily
    imported module (column.report's stability and parcel) is the float32 copy too;
  - range(NAME) over a module constant named *_CAP becomes a counting range that
    records how many passes each capped loop took and whether it ran out.
F32 is a float whose every arithmetic result (with float, int or F32 on either side)
is rounded to the nearest float32 (struct "f", round-to-nearest-even like the board's
FPU or soft-float), the other operand rounded first. Results too large become inf.
Nothing here touches the real lapsecalc modules.
"""
import ast
import importlib.abc
import importlib.util
import math
import os
import struct
import sys
import types

PKG_DIR = os.path.join(os.path.dirname(os.path.dirname(os.path.abspath(__file__))), "lapsecalc")
NAME = "lapsecalc_f32"
MATH_NAME = "lapsecalc_f32_math"
_F32_MAX = 3.4028234663852886e38

_pack = struct.Struct("f")


def r32(x):
    """x rounded to the nearest float32, as a Python float (inf past the range)."""
    x = float(x)
    try:
        return _pack.unpack(_pack.pack(x))[0]
    except OverflowError:
        return math.copysign(math.inf, x)


class F32(float):
    """A float that stays float32: every result of arithmetic is rounded."""
    __slots__ = ()

    def __new__(cls, x=0.0):
        return float.__new__(cls, r32(x))

    def __repr__(self):
        return "F32(%r)" % float(self)


def _binary(name):
    op = getattr(float, name)

    def method(self, other):
        if isinstance(other, bool) or not isinstance(other, (int, float)):
            return NotImplemented
        got = op(float(self), r32(other))
        if got is NotImplemented:
            return got
        if isinstance(got, tuple):                      # divmod
            return tuple(F32(g) for g in got)
        return F32(got)
    method.__name__ = name
    return method


def _unary(name):
    op = getattr(float, name)

    def method(self):
        return F32(op(float(self)))
    method.__name__ = name
    return method


for _n in ("add", "sub", "mul", "truediv", "floordiv", "mod", "pow", "divmod"):
    setattr(F32, "__%s__" % _n, _binary("__%s__" % _n))
    setattr(F32, "__r%s__" % _n, _binary("__r%s__" % _n))
for _n in ("neg", "pos", "abs"):
    setattr(F32, "__%s__" % _n, _unary("__%s__" % _n))


def _wrap1(fn):
    def f(x):
        return F32(fn(r32(x)))
    f.__name__ = fn.__name__
    return f


def _wrap2(fn):
    def f(x, y):
        return F32(fn(r32(x), r32(y)))
    f.__name__ = fn.__name__
    return f


def _make_math():
    m = types.ModuleType(MATH_NAME)
    m.__doc__ = "math for float32: arguments and results rounded to float32"
    for n in ("exp", "sqrt", "fabs"):
        setattr(m, n, _wrap1(getattr(math, n)))

    def log(x, *base):
        if base:
            return F32(r32(math.log(r32(x))) / r32(math.log(r32(base[0]))))
        return F32(math.log(r32(x)))
    m.log = log
    m.pow = _wrap2(math.pow)
    m.copysign = _wrap2(math.copysign)
    # floor/ceil return ints; the predicates bools (as on MicroPython).
    m.floor = lambda x: math.floor(r32(x))
    m.ceil = lambda x: math.ceil(r32(x))
    m.isfinite = lambda x: math.isfinite(r32(x))
    m.isnan = lambda x: math.isnan(x)
    m.isinf = lambda x: math.isinf(r32(x))
    m.pi = F32(math.pi)
    m.e = F32(math.e)
    return m


MATH = _make_math()

# Capped loops: {"module.NAME": {"cap": n, "calls": k, "max_used": j, "ran_out": r}}.
CAPS = {}


def capped_range(cap, where):
    rec = CAPS.setdefault(where, {"cap": cap, "calls": 0, "max_used": 0, "ran_out": 0})
    rec["calls"] += 1
    used = 0
    for i in range(cap):
        used = i + 1
        if used > rec["max_used"]:
            rec["max_used"] = used
        yield i
    rec["ran_out"] += 1


def _rename(module):
    if module == "math":
        return MATH_NAME
    if module == "lapsecalc" or module.startswith("lapsecalc."):
        return NAME + module[len("lapsecalc"):]
    return module


class _Rewrite(ast.NodeTransformer):
    def __init__(self, modname):
        self.modname = modname

    def visit_Constant(self, node):
        if type(node.value) is float:
            return ast.copy_location(ast.Call(ast.Name("_F32", ast.Load()), [node], []), node)
        if type(node.value) is str and (node.value == "lapsecalc" or
                                        node.value.startswith("lapsecalc.")):
            # A module path in a string (__init__'s lazy __import__): the float32 copy's.
            return ast.copy_location(ast.Constant(_rename(node.value)), node)
        return node

    def visit_Call(self, node):
        self.generic_visit(node)
        f = node.func
        if isinstance(f, ast.Name) and f.id == "float":
            node.func = ast.copy_location(ast.Name("_F32", ast.Load()), f)
        elif isinstance(f, ast.Name) and f.id == "range" and len(node.args) == 1 and \
                isinstance(node.args[0], ast.Name) and node.args[0].id.endswith("_CAP"):
            where = "%s.%s" % (self.modname, node.args[0].id)
            node.func = ast.copy_location(ast.Name("_capped_range", ast.Load()), f)
            node.args.append(ast.Constant(where))
        return node

    def visit_ImportFrom(self, node):
        if node.module and not node.level:
            node.module = _rename(node.module)
        return node

    def visit_Import(self, node):
        for a in node.names:
            new = _rename(a.name)
            if new != a.name:
                if a.asname is None:
                    if "." in a.name:
                        raise ImportError("f32: 'import %s' without 'as' is not rewritten"
                                          % a.name)
                    a.asname = a.name
                a.name = new
        return node


def transform(src, modname):
    """The source of a lapsecalc module rewritten for float32 (see the module doc)."""
    tree = _Rewrite(modname).visit(ast.parse(src))
    return ast.fix_missing_locations(tree)


class _Loader(importlib.abc.Loader):
    def create_module(self, spec):
        return None

    def exec_module(self, module):
        short = module.__name__[len(NAME):].lstrip(".") or "__init__"
        path = os.path.join(PKG_DIR, short + ".py")
        with open(path) as f:
            tree = transform(f.read(), short)
        module.__dict__["_F32"] = F32
        module.__dict__["_capped_range"] = capped_range
        exec(compile(tree, path, "exec"), module.__dict__)


class _Finder(importlib.abc.MetaPathFinder):
    def find_spec(self, fullname, path=None, target=None):
        if fullname == NAME:
            return importlib.util.spec_from_file_location(
                fullname, os.path.join(PKG_DIR, "__init__.py"), loader=_Loader(),
                submodule_search_locations=[])
        if fullname.startswith(NAME + "."):
            short = fullname[len(NAME) + 1:]
            file = os.path.join(PKG_DIR, short + ".py")
            if os.path.exists(file):
                return importlib.util.spec_from_file_location(fullname, file, loader=_Loader())
        return None


_FINDER = _Finder()


def load(*modules):
    """A fresh float32 copy of lapsecalc with the named submodules imported; returns
    the package module (submodules as attributes). Earlier copies are dropped."""
    for k in [k for k in sys.modules if k == NAME or k.startswith(NAME + ".")]:
        del sys.modules[k]
    sys.modules[MATH_NAME] = MATH
    if _FINDER not in sys.meta_path:
        sys.meta_path.insert(0, _FINDER)
    pkg = importlib.import_module(NAME)
    for m in modules:
        importlib.import_module(NAME + "." + m)
    return pkg
