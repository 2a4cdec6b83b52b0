"""The surface parcel's path through a column: dry to the LCL, then saturated."""
# Sources:
#   Poisson's equation (dry adiabat at constant mixing ratio) below the LCL.
#   Pseudo-adiabat above it: AMS Glossary form, RK4 in ln p (adiabats.moist_step).
from math import log, ceil, exp
from lapsecalc.constants import T0_K, KAPPA
from lapsecalc.standard import layer_pressure
from lapsecalc.adiabats import moist_step

# Largest spacing of the path's levels, m; they also fall on every layer boundary
# and on the LCL, so the environment is linear between any two levels.
MAX_STEP_M = 500.0
_MAX_LEVELS = 400


def path(col, lcl_msl_m, max_step_m=MAX_STEP_M):
    """Levels of the surface parcel's ascent: a list of (z_m, p_hpa, tp_c, te_c),
    surface to column top. Below lcl_msl_m the parcel follows Poisson's equation from
    the surface; above it, the pseudo-adiabat (one RK4 step between levels, in ln p)."""
    ts_k = col.t_c + T0_K
    ps = col.p_hpa
    out = []
    t_prev = p_prev = None
    for z0, z1, t0, grad, p0 in col.layers:
        marks = [z0]
        if z0 < lcl_msl_m < z1:
            marks.append(lcl_msl_m)
        marks.append(z1)
        for j in range(len(marks) - 1):
            a, b = marks[j], marks[j + 1]
            n = int(ceil((b - a) / max_step_m))
            if n < 1:
                n = 1
            start = 0 if not out else 1
            for i in range(start, n + 1):
                z = b if i == n else a + (b - a) * i / n
                p = layer_pressure(p0, t0, grad, z - z0)
                if z <= lcl_msl_m or not out:
                    tp = ts_k * exp(KAPPA * log(p / ps))
                else:
                    tp = moist_step(t_prev, p_prev, log(p / p_prev))
                out.append((z, p, tp - T0_K, t0 + grad * (z - z0) - T0_K))
                t_prev, p_prev = tp, p
                if len(out) > _MAX_LEVELS:
                    raise ValueError("parcel path needs over %d levels; allowed max_step_m"
                                     " gives fewer" % _MAX_LEVELS)
    return out


def level(levels, t_c):
    """Lowest height, m MSL, where the parcel temperature reaches t_c degC (linear
    between levels); the surface if it starts there or colder; None if never."""
    z0, _, tp0, _ = levels[0]
    if tp0 <= t_c:
        return z0
    for z1, _, tp1, _ in levels[1:]:
        if tp1 <= t_c:
            return z0 + (z1 - z0) * (tp0 - t_c) / (tp0 - tp1)
        z0, tp0 = z1, tp1
    return None
