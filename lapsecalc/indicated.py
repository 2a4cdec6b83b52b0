"""Indicated altitude: what an altimeter set to a column's QNH reads at a true height,
and the report keys built on it (the part of altimetry that Column.report() loads)."""
# Sources:
#   ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere: pressure altitude (the
#     altimeter's scale) through standard.pressure_altitude, the ISA temperature.
#   ICAO Annex 3 (QNH); the altimeter-setting relation of standard.py: an altimeter
#     set to QNH reads PA(p) - PA(QNH), so it reads the elevation at the field.
# Kept small: a board that runs report() holds this module, not all of altimetry.py.
from lapsecalc.standard import isa, pressure_altitude, isa_height_of_density, _density

# The top of the ISA troposphere, m (ICAO Doc 7488/3).
TROPOPAUSE_M = 11000.0
# A reported level this much colder than ISA gets a warning, K.
COLD_WARNING_K = 10.0


def indicated_altitude_at(col, z_msl_m, pa_qnh_m=None):
    """Indicated altitude, m, on an altimeter set to the column's QNH at true height
    z_msl_m (inside the column): PA(p(z)) - PA(QNH), exact through the ISA layers
    (ValueError past the ISA table's 32 km). It equals the elevation at the field; it
    reads high in air colder than ISA. pa_qnh_m, when given, is
    pressure_altitude(col.qnh_hpa) (saves its recomputation in a loop)."""
    if pa_qnh_m is None:
        pa_qnh_m = pressure_altitude(col.qnh_hpa)
    return pressure_altitude(col.p_at(z_msl_m)) - pa_qnh_m


def isa_t_c(pa_m):
    # ISA temperature, degC, at pressure altitude pa_m (ICAO Doc 7488/3).
    return isa(pa_m)[0]


def _reading(col, r, ind, z, pa_qnh_m):
    # The indicated altitude of z for add_to_report: the elevation at the field (QNH's
    # definition), a reading already made for the same height (levels often coincide:
    # a board allocates every float), else computed; None beyond the ISA table's 32 km.
    if z == col.elev_m:
        return col.elev_m
    for k in ind:
        if r[k] == z and ind[k] is not None:
            return ind[k]
    try:
        return indicated_altitude_at(col, z, pa_qnh_m)
    except ValueError:
        return None


def report_keys():
    """The keys add_to_report adds, in its order (a list made afresh: see
    column.report_keys)."""
    return ["indicated_altitude_m", "isa_deviation_c", "density_altitude_dry_m"]


def add_to_report(col, r):
    """Add to report dict r: indicated_altitude_m (every single-height *_msl_m key of r
    whose value is a number, mapped to its indicated altitude on the column's QNH; None
    where the height is None or beyond the altimeter's scale), isa_deviation_c at the
    field, and density_altitude_dry_m: the density altitude of dry air at the field's
    pressure and temperature, which is what flight-manual charts and hand calculators
    give (density_altitude_m counts the humidity: humid air is lighter, so it is higher)."""
    pa_qnh = pressure_altitude(col.qnh_hpa)
    # Made with room for every key at the start (see column.report_keys).
    ind = dict.fromkeys([k for k in r if k.endswith("_msl_m") and (
        r[k] is None or isinstance(r[k], (int, float)) and not isinstance(r[k], bool))])
    for k in ind:
        if r[k] is not None:
            ind[k] = _reading(col, r, ind, r[k], pa_qnh)
    r["indicated_altitude_m"] = ind
    pa = r.get("pressure_altitude_m")
    r["isa_deviation_c"] = col.t_c - isa_t_c(pressure_altitude(col.p_hpa) if pa is None else pa)
    r["density_altitude_dry_m"] = isa_height_of_density(_density(col.p_hpa, col.t_c, 0.0))
