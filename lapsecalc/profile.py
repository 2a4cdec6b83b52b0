"""How a Column is built: the surface observation checked, the points aloft
(lapsecalc.aloft) and the assumed ELR laid on it as linear layers with their base
pressures, the isothermal part above the tropopause, and the end where the air would
pass -90 degC."""
# Sources: the hydrostatic equation, exact per linear layer (standard.layer_pressure).
# Column.__init__ loads this module for one build and, on a board, lets go of it
# after: the report's heap never holds the building code and its messages.
from lapsecalc.constants import T0_K
from lapsecalc.limits import (check, check_p, check_elev, check_lapse, check_dew, T_MIN_C,
                              T_MAX_C, TOP_MAX_M, SAME_LEVEL_M)
from lapsecalc.moisture import _es_water, _mixing_ratio_kg_kg
from lapsecalc.standard import layer_pressure, qnh


def _tops(lapse, elev_m, top_m):
    # [(top_msl_m, k_per_km), ...] from a number or from [(top_agl_m or None, k_per_km), ...].
    if isinstance(lapse, (int, float)):
        return [(top_m, check_lapse("lapse", lapse))]
    try:
        items = list(None if isinstance(lapse, str) else lapse)
    except TypeError:
        raise ValueError("lapse=%r must be a number in K/km (allowed -30..30) or a list of"
                         " (top_agl_m, k_per_km)" % (lapse,))
    if not items:
        raise ValueError("lapse=[] is empty; give at least one layer (top_agl_m, k_per_km)")
    tops = []
    below = 0.0
    for i, item in enumerate(items):
        try:
            top_agl, rate = item
        except (TypeError, ValueError):
            raise ValueError("lapse layer %d=%r must be a pair (top_agl_m, k_per_km)" % (i + 1, item))
        rate = check_lapse("lapse layer %d rate" % (i + 1), rate)
        if top_agl is None:
            if i != len(items) - 1:
                raise ValueError("lapse layer %d has no top; only the last layer may run to"
                                 " the column top" % (i + 1))
            tops.append((top_m, rate))
            break
        top_agl = check("lapse layer %d top_agl_m" % (i + 1), top_agl, below + 1.0,
                        TOP_MAX_M, "m (above the layer below)")
        below = top_agl
        tops.append((min(elev_m + top_agl, top_m), rate))
        if elev_m + top_agl >= top_m:
            break
    return tops


def build(col, t_c, td_c, p_hpa, elev_m, lapse, top_m, aloft, tropopause_m):
    """Set the attributes of Column col from its arguments (Column's docstring says
    what they mean): the checked surface values, qnh_hpa, r_kg_kg, layers [(z0_m,
    z1_m, t0_k, grad_k_per_m, p0_hpa), ...] from the surface up, top_m, top_asked_m,
    tropopause_m, end_why, aloft_m and dews. ValueError for an input out of range."""
    col.t_c, col.td_c = check_dew(t_c, td_c)
    col.p_hpa = check_p("p_hpa", p_hpa)
    col.elev_m = check_elev("elev_m", elev_m)
    # A station pressure that implies an impossible QNH is a mistake (often QNH or
    # an altimeter setting typed as station pressure): qnh() refuses it.
    col.qnh_hpa = qnh(col.p_hpa, col.elev_m)
    unit = "m MSL (at least 100 m above the elevation)"
    top = check("top_m", top_m, col.elev_m + 100.0, TOP_MAX_M, unit)
    trop = None if tropopause_m is None else check(
        "tropopause_m", tropopause_m, col.elev_m + 100.0, TOP_MAX_M, unit)
    col.top_asked_m = top
    col.tropopause_m = None
    col.end_why = None
    col.r_kg_kg = _mixing_ratio_kg_kg(_es_water(col.td_c), col.p_hpa)
    # Points aloft (lapsecalc.aloftpoints.build): their heights aloft_m, m MSL, and the
    # dewpoints given, dews [(z_m, td_c), ...] from the surface up; else None.
    col.aloft_m = col.dews = None
    layers = []
    z, t, p = col.elev_m, col.t_c + T0_K, col.p_hpa
    if aloft is not None:
        from lapsecalc.aloftpoints import build as from_points
        z, t, p = from_points(col, aloft, layers, top)
    tops = _tops(lapse, col.elev_m, top)
    if trop is not None:
        _tropopause(col, tops, trop, z)
    _lay(col, tops, layers, z, t, p, trop, top)


def _tropopause(col, tops, trop, z):
    # Isothermal above the tropopause trop (m MSL), unless a layer starts above it (or
    # the points go past it, up to z: then from the last point). A tropopause on a
    # layer's foot makes that layer isothermal (its zero-length part below is skipped).
    below = col.elev_m
    for i in range(len(tops)):
        z_top, rate = tops[i]
        if below <= trop < z_top:
            tops[i:i + 1] = [(trop, rate), (z_top, 0.0)]
            col.tropopause_m = trop if trop > z else z
            return
        below = z_top


def _lay(col, tops, layers, z, t, p, trop, top):
    # The assumed ELR's layers (tops) laid on layers from z (m MSL), t (K), p (hPa) up,
    # ending where the air would pass -90 degC; col's layers, top_m and end_why set.
    # (Apart from build: on a board each function's code is one piece of heap, and a
    # Column built after a report finds only small ones.)
    for z_top, rate in tops:
        if z_top <= z:
            continue
        grad = -rate / 1000.0
        t_top = t + grad * (z_top - z)
        if t_top - T0_K > T_MAX_C:
            raise ValueError("the ELR warms the air above %g degC at %.6g m MSL; allowed"
                             " -90..%g degC throughout: lower top_m or change the layers"
                             % (T_MAX_C, z + (T_MAX_C + T0_K - t) / grad, T_MAX_C))
        if t_top - T0_K < T_MIN_C:
            # The column ends where the air would pass the coldest temperature allowed.
            col.end_why = "the air reaches -90 degC, the coldest handled" + (
                "" if trop else " (no tropopause)")
            z_top = z + (T_MIN_C + T0_K - t) / grad
            if t + grad * (z_top - z) - T0_K < T_MIN_C:
                # Rounded a hair colder than allowed there (-90.00000000000003 degC was
                # seen, which the range checks of what reads the column refuse): the
                # top a level's width (1 cm) lower (float32 keeps a centimetre at 32 km).
                z_top -= SAME_LEVEL_M
            if z_top - z > 1.0:
                layers.append((z, z_top, t, grad, p))
                z = z_top
            break
        layers.append((z, z_top, t, grad, p))
        p = layer_pressure(p, t, grad, z_top - z)
        z, t = z_top, t_top
    if not layers:
        raise ValueError("t_c=%s with this ELR leaves no column above the surface; allowed"
                         " a surface above %g degC" % (col.t_c, T_MIN_C))
    if z < top and col.end_why is None:
        col.end_why = "its last layer ends there"
    if col.tropopause_m is not None and col.tropopause_m >= z:
        col.tropopause_m = None
    col.layers = layers
    col.top_m = z
