"""The surface parcel's path through a column: dry to the LCL, then saturated."""
# Sources:
#   Poisson's equation (dry adiabat at constant mixing ratio) below the LCL.
#   Pseudo-adiabat above it: AMS Glossary form, RK4 in ln p (adiabats.moist_step).
from math import log, ceil, exp
from lapsecalc.constants import T0_K, KAPPA
from lapsecalc.standard import layer_pressure
from lapsecalc.adiabats import moist_step
from lapsecalc.limits import const

# Largest spacing of the path's levels, m; they also fall on every layer boundary
# and on the LCL, so the environment is linear between any two levels. 1250 m keeps a
# board's report() under 64 KiB of allocation (one RK4 step a level, under 0.01 K from
# the pseudo-adiabat); crossings are refined by temperature_at(), and CAPE's trapezoid
# reads low by at most 15 J/kg + 1.5 % against a 2 m reference (README, Accuracy).
MAX_STEP_M = 1250.0
_MAX_LEVELS = const(400)
# Below this parcel temperature, K (-60 degC), less than 0.1 g/kg of vapour is left and
# the pseudo-adiabat is followed as a dry adiabat (within 0.2 K), with levels up to
# 5000 m apart: a board's report() then stays under 64 KiB of allocation even for a
# column to 32 km with a deep isothermal stratosphere.
_DRY_BELOW_K = const(213.15)


def _saturated(t_k, p0_hpa, p1_hpa):
    # The saturated parcel from (t_k, p0_hpa) to p1_hpa, K.
    if t_k < _DRY_BELOW_K:
        return t_k * exp(KAPPA * log(p1_hpa / p0_hpa))
    return moist_step(t_k, p0_hpa, p1_hpa)


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
            n = int(ceil((b - a) / max_step_m))    # at least 1: every mark is above the last
            cold = False
            i = 0 if not out else 1
            while i <= n:
                z = b if i == n else a + (b - a) * i / n
                dz = z - z0
                p = layer_pressure(p0, t0, grad, dz)
                if z <= lcl_msl_m or not out:
                    tp = ts_k * exp(KAPPA * log(p / ps))
                else:
                    tp = _saturated(t_prev, p_prev, p)
                out.append((z, p, tp - T0_K, t0 + grad * dz - T0_K))
                t_prev, p_prev = tp, p
                if len(out) > _MAX_LEVELS:
                    raise ValueError("parcel path needs over %d levels; allowed max_step_m"
                                     " gives fewer" % _MAX_LEVELS)
                i += 1
                if not cold and i <= n and z >= lcl_msl_m and tp < _DRY_BELOW_K:
                    # Above the LCL a parcel colder than -60 degC follows a dry adiabat,
                    # exact over any step: the rest of the interval in levels four
                    # times as far apart.
                    cold = True
                    a, n, i = z, int(ceil((b - z) / (4 * max_step_m))), 1
    return out


def temperature_at(col, levels, i, z_m, lcl_msl_m):
    """Parcel temperature, degC, at z_m between levels[i-1] and levels[i], computed
    afresh (Poisson below the LCL, one RK4 step from levels[i-1] above it)."""
    z0, p0, tp0, _ = levels[i - 1]
    p = col.p_at(z_m)
    if z0 < lcl_msl_m:
        return (col.t_c + T0_K) * exp(KAPPA * log(p / col.p_hpa)) - T0_K
    return _saturated(tp0 + T0_K, p0, p) - T0_K


def level(col, levels, t_c, lcl_msl_m):
    """Lowest height, m MSL, where the parcel temperature reaches t_c degC: the
    surface if it starts there or colder; None if never. Linear between levels, then
    one secant step with the parcel recomputed there (temperature_at)."""
    z0, _, tp0, _ = levels[0]
    if tp0 <= t_c:
        return z0
    for i in range(1, len(levels)):
        z1, _, tp1, _ = levels[i]
        if tp1 <= t_c:
            zc = z0 + (z1 - z0) * (tp0 - t_c) / (tp0 - tp1)
            tc = temperature_at(col, levels, i, zc, lcl_msl_m)
            if tc > t_c:
                return zc + (z1 - zc) * (tc - t_c) / (tc - tp1)
            if tc < t_c:
                return z0 + (zc - z0) * (tp0 - t_c) / (tp0 - tc)
            return zc
        z0, tp0 = z1, tp1
    return None
