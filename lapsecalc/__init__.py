"""lapsecalc: cloud base, freezing level, density altitude, stability and balloon lift
from one surface observation and an assumed lapse rate. Pure Python, runs on MicroPython."""
# The public names load their module on first use (PEP 562 module __getattr__, which
# MicroPython has too): `import lapsecalc` costs a board almost no RAM, and a station
# that only asks for QNH never loads the parcel code.

__version__ = "0.1.0"

_WHERE = {
    "saturation_vapour_pressure": "moisture", "dewpoint": "moisture",
    "relative_humidity": "moisture", "mixing_ratio": "moisture", "wet_bulb": "moisture",
    "isa": "standard", "pressure_altitude": "standard", "station_pressure": "standard",
    "qnh": "standard", "air_density": "standard", "density_altitude": "standard",
    "cloud_base": "condensation",
    "moist_lapse_rate": "adiabats", "saturated_ascent": "adiabats",
    "Column": "column",
}
__all__ = list(_WHERE)


def __getattr__(name):
    # A public name loads its module; a submodule's name loads the submodule (a board's
    # `from lapsecalc import units` comes here).
    module = _WHERE.get(name)
    try:
        found = __import__("lapsecalc." + (module or name), None, None, ["_"])
    except ImportError:
        raise AttributeError("lapsecalc has no %r" % (name,))
    return found if module is None else getattr(found, name)


def _forget(names):
    # Forget the submodules lapsecalc.<name> of names: the next import loads one
    # afresh, and until then it holds no heap (lapsecalc.shell drops a line's word
    # modules with it).
    import sys
    for name in names:
        sys.modules.pop("lapsecalc." + name, None)
        globals().pop(name, None)


def _drop(*names):
    # On a board (MicroPython): _forget(names) and collect, so that what comes next
    # gets their room; no collection while the collector is off (an allocation count
    # runs). Nothing on CPython.
    import sys
    if sys.implementation.name != "micropython":
        return
    _forget(names)
    import gc
    if gc.isenabled():
        gc.collect()
