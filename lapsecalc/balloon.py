"""What hot-air and gas balloons share in one air column: the ambient air at a height
(pressure, temperature, vapour pressure, density), the lowest height where a lift falls
to a weight, and the heights where supplemental oxygen is commonly required. The
balloons themselves: lapsecalc.hotair (lift) with lapsecalc.hotreport, and
lapsecalc.gasballoon (a board loads the one it flies)."""
# Sources:
#   Archimedes' principle with the ideal gas law: gross lift = mass of the displaced
#     air - mass of the gas inside, per m3 the difference of the two densities.
#   Moist air through the virtual temperature (Wallace & Hobbs, Atmospheric Science,
#     2nd ed., eq. 3.60), as in standard._density and Column.density_at.
#   Oxygen heights: see _OXYGEN_LONG_M.
from math import isfinite
from lapsecalc.constants import EPS
from lapsecalc.limits import check, const
from lapsecalc.standard import _density, pressure_altitude
from lapsecalc.moisture import _es_water

# Input ranges.
# Total weight, kg: 20000 kg is above anything the balloons' volumes lift (the least
# weight: lapsecalc.hotair, lapsecalc.gasballoon).
WEIGHT_MAX_KG = 20000.0
# Supplemental oxygen: many regulations require it above about 10,000 ft pressure
# altitude for longer than 30 minutes and above 13,000 ft at all times (ICAO-style
# rules; others use 12,500 and 14,000 ft). Common practice, from memory: the user
# must check the rules that apply. Pressure altitude, m (exact from ft).
_OXYGEN_LONG_M = const(3048.0)
_OXYGEN_ALWAYS_M = const(3962.4)
# Densities the plain formulas accept, kg/m3 (ISA at 32 km is 0.0132; -90 degC air at
# 1100 hPa is 2.09).
RHO_MIN_KG_M3 = 0.001
RHO_MAX_KG_M3 = 2.5
# Heights: the per-1000-ft changes are taken over this step, m (1000 ft exact).
_FT1000_M = const(304.8)
# Height solvers: scan steps of at most _SCAN_M (also ending at every ELR layer top),
# then regula falsi until the bracket is narrower than _TOL_M (float32 resolves about
# 0.004 m at 32 km), at most _CAP steps. The step size is not what makes the scan sound
# (see first_drop); 1000 m keeps a board's balloon line cheap (each lift costs about
# 0.7 KB of heap there).
_SCAN_M = const(1000.0)
_TOL_M = 0.1
_CAP = const(40)


def first_drop(col, f, z_from_m):
    """Lowest height, m MSL, at or above z_from_m where f(z) (f(z_from_m) >= 0) falls
    to zero, or None when f stays at or above zero up to the column top.

    Scans the column in steps of at most 1000 m that also end at every ELR layer top,
    then narrows the first step whose top has f < 0 (regula falsi, Illinois) until the
    bracket is under 0.1 m (at most 40 steps; ValueError if not). Sound when f has no
    minimum inside a step: inside one linear layer, gas lift falls monotonically and
    hot-air lift at a fixed envelope temperature either falls or rises to one maximum
    and then falls. Where the humidity cap sets in, the slope of the lift steps up by
    about 0.0004 kg/m3 per km (vapour leaving faster): a dip below the weight inside a
    step could then reach only where the lift is that flat, a fraction of a kg over a
    step for the largest envelopes.
    """
    z = z_from_m
    fz = f(z)
    if not isfinite(fz):
        raise ValueError("first_drop: f(%g m) is not finite" % z)
    for _, z_layer_top, _, _, _ in col.layers:
        while z < z_layer_top:
            z_next = z + _SCAN_M
            if z_next > z_layer_top:
                z_next = z_layer_top
            f_next = f(z_next)
            if not f_next >= 0.0:
                if not isfinite(f_next):
                    raise ValueError("first_drop: f(%g m) is not finite" % z_next)
                return _narrow(f, z, z_next, fz, f_next)
            z, fz = z_next, f_next
    return None


def _narrow(f, lo, hi, f_lo, f_hi):
    # f(lo) = f_lo >= 0 > f_hi = f(hi). Regula falsi with the Illinois modification
    # (Dowell & Jarratt 1971: halve the value kept at an end chosen twice), each point
    # at least _TOL_M / 4 inside the bracket so that it narrows below _TOL_M; at most
    # _CAP steps (about 6 from 1000 m; plain bisection takes 14).
    side = 0
    for _ in range(_CAP):
        if hi - lo < _TOL_M:
            return 0.5 * (lo + hi)
        x = hi - f_hi * (hi - lo) / (f_hi - f_lo)
        edge = 0.25 * _TOL_M
        if x < lo + edge:
            x = lo + edge
        elif x > hi - edge:
            x = hi - edge
        fx = f(x)
        if not isfinite(fx):
            raise ValueError("first_drop: f(%g m) is not finite" % x)
        if fx < 0.0:
            hi, f_hi = x, fx
            if side == -1:
                f_lo *= 0.5
            side = -1
        else:
            lo, f_lo = x, fx
            if side == 1:
                f_hi *= 0.5
            side = 1
    raise ValueError("first_drop did not converge between %g and %g m" % (lo, hi))


def _air(col, z_m):
    # (p_hpa, t_c, e_hpa, rho_kg_m3) of the column at z_m, each computed once; the
    # vapour pressure by the column's rule (Column.vapour_pressure_at): with dewpoints
    # aloft, from them; else the surface mixing ratio, capped at saturation, without
    # computing p and T twice (boards).
    p = col.p_at(z_m)
    t = col.t_at(z_m)
    if col.dews is not None:
        e = col.vapour_pressure_at(z_m)
    else:
        r = col.r_kg_kg
        e = r * p / (EPS + r)
        es = _es_water(t)
        if e > es:
            e = es
    return p, t, e, _density(p, t, e)


def _z(col, z_m):
    if z_m is None:
        return col.elev_m
    return check("z_m", z_m, col.elev_m, col.top_m, "m MSL (the column)")


def _per_1000ft(col, z_m, f):
    # Change of f over the 1000 ft above z_m (the 1000 ft below it near the column
    # top; the whole column if it is shallower), scaled to 1000 ft. None if f is.
    za = z_m
    zb = z_m + _FT1000_M
    if zb > col.top_m:
        zb = col.top_m
        za = zb - _FT1000_M
        if za < col.elev_m:
            za = col.elev_m
    fa, fb = f(za), f(zb)
    if fa is None or fb is None:
        return None
    return (fb - fa) * _FT1000_M / (zb - za)


def oxygen_note(col, heights):
    """A note (str) when any of heights, (label, m MSL inside col or None) pairs,
    passes the pressure altitudes at which regulations commonly require supplemental
    oxygen (_OXYGEN_LONG_M, _OXYGEN_ALWAYS_M; common practice); None when none does."""
    worst = None
    for label, z in heights:
        if z is None:
            continue
        p = col.p_at(z)
        pa = pressure_altitude(p) if p > 8.68 else 32000.0
        if pa > _OXYGEN_LONG_M and (worst is None or pa > worst[1]):
            worst = (label, pa, z)
    if worst is None:
        return None
    label, pa, z = worst
    return ("Oxygen: the %s, %.0f m MSL (%.0f ft pressure altitude), passes %d ft; rules"
            " commonly require it above 10000 ft for over 30 min, 13000 ft always (common"
            " practice). Check your local regulations."
            % (label, z, pa / 0.3048, 13000 if pa > _OXYGEN_ALWAYS_M else 10000))
