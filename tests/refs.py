"""Independent reference formulas for the tests (never imported by the package)."""
import math


def hyland_wexler_water_hpa(t_c):
    # Hyland & Wexler (1983) over liquid water, as given in the ASHRAE Handbook -
    # Fundamentals ch. 1; coefficients from memory, checked in test_moisture against
    # the tabulated values in ../shared/REFERENCES.md.
    t = t_c + 273.15
    return math.exp(-5.8002206e3 / t + 1.3914993 - 4.8640239e-2 * t + 4.1764768e-5 * t * t
                    - 1.4452093e-8 * t ** 3 + 6.5459673 * math.log(t)) / 100.0


def hyland_wexler_ice_hpa(t_c):
    # Hyland & Wexler (1983) over ice (ASHRAE Handbook - Fundamentals ch. 1); from memory,
    # checked against the tabulated values like the water form.
    t = t_c + 273.15
    return math.exp(-5.6745359e3 / t + 6.3925247 - 9.6778430e-3 * t + 6.2215701e-7 * t * t
                    + 2.0747825e-9 * t ** 3 - 9.4840240e-13 * t ** 4 + 4.1635019 * math.log(t)) / 100.0


def bisect(f, lo, hi, n=200):
    # Plain bisection for an increasing f with f(lo) < 0 < f(hi).
    for _ in range(n):
        mid = 0.5 * (lo + hi)
        if f(mid) < 0.0:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi)


def _romps_lcl(t_k, rh, p_pa):
    # Romps (2017), J. Atmos. Sci. 74, 3891-3900, eqs. 22a-c as printed in
    # ../shared/REFERENCES.md, evaluated with a slow bisection for W_-1 (independent
    # of the package's Halley iteration): (height m, temperature K, pressure Pa).
    ttrip, ptrip, e0v, ggr = 273.16, 611.65, 2.3740e6, 9.81
    ra, rv, cva, cvv, cvl = 287.04, 461.0, 719.0, 1418.0, 4119.0
    cpa, cpv = cva + ra, cvv + rv
    pvstar = ptrip * (t_k / ttrip) ** ((cpv - cvl) / rv) * math.exp(
        (e0v - (cvv - cvl) * ttrip) / rv * (1 / ttrip - 1 / t_k))
    pv = rh * pvstar
    qv = ra * pv / (rv * p_pa + (ra - rv) * pv)
    rm = (1 - qv) * ra + qv * rv
    cpm = (1 - qv) * cpa + qv * cpv
    a = cpm / rm + (cvl - cpv) / rv
    b = -(e0v - (cvv - cvl) * ttrip) / (rv * t_k)
    c = b / a
    x = rh ** (1 / a) * c * math.exp(c)
    # W_-1: w e^w decreasing in w for w < -1; solve w e^w = x on [-800, -1].
    w = bisect(lambda w: x - w * math.exp(w), -800.0, -1.0)
    t_lcl = c / w * t_k
    return cpm * t_k / ggr * (1 - b / (a * w)), t_lcl, p_pa * (t_lcl / t_k) ** (cpm / rm)


def romps_lcl_m(t_k, rh, p_pa):
    # Romps (2017) eq. 22a: LCL height, m.
    return _romps_lcl(t_k, rh, p_pa)[0]


def romps_lcl_t_p(t_k, rh, p_pa):
    # Romps (2017) eqs. 22b and 22c: LCL temperature, K, and pressure, Pa.
    return _romps_lcl(t_k, rh, p_pa)[1:]


def romps_pvstar_pa(t_k):
    # Romps (2017) saturation vapour pressure over liquid (REFERENCES.md).
    ttrip, ptrip, e0v = 273.16, 611.65, 2.3740e6
    rv, cvv, cvl = 461.0, 1418.0, 4119.0
    cpv = cvv + rv
    return ptrip * (t_k / ttrip) ** ((cpv - cvl) / rv) * math.exp(
        (e0v - (cvv - cvl) * ttrip) / rv * (1 / ttrip - 1 / t_k))


def pseudo_adiabat_euler(t_c, p_from, p_to, n=20000):
    # Pseudo-adiabatic dT/dp (AMS Glossary, REFERENCES.md "Moist ascent"), plain
    # midpoint steps in ln p, very fine: a slow reference for saturated_ascent.
    rd, rv, cp, lv = 287.05287, 461.5, 1004.0, 2.501e6
    eps = rd / rv

    def slope(t, p):
        e = 6.1094 * math.exp(17.625 * (t - 273.15) / (t - 273.15 + 243.04))
        rs = eps * e / (p - e)
        return (rd * t + lv * rs) / (cp + lv * lv * rs * eps / (rd * t * t))

    t = t_c + 273.15
    h = math.log(p_to / p_from) / n
    lnp = math.log(p_from)
    for _ in range(n):
        tm = t + 0.5 * h * slope(t, math.exp(lnp))
        t += h * slope(tm, math.exp(lnp + 0.5 * h))
        lnp += h
    return t - 273.15


# Constants of the independent references below: ICAO Doc 7488/3 (g, Rd); cp, Rv and
# Lv from Wallace & Hobbs (REFERENCES.md); Alduchov & Eskridge (1996) eq. 21.
G0_REF, RD_REF, CP_REF, RV_REF, LV_REF = 9.80665, 287.05287, 1004.0, 461.5, 2.501e6


def ae_es_hpa(t_c):
    # Alduchov & Eskridge (1996) eq. 21 over water, hPa (the published fit, coded here).
    return 6.1094 * math.exp(17.625 * t_c / (t_c + 243.04))


def pseudo_adiabatic_dt_dz(t_k, p_hpa, te_k):
    # Pseudo-adiabatic dT/dln p (AMS Glossary, REFERENCES.md "Moist ascent") times
    # dln p/dz = -g / (Rd Te) of the environment the parcel rises through, K/m.
    eps = RD_REF / RV_REF
    e = ae_es_hpa(t_k - 273.15)
    rs = eps * e / (p_hpa - e)
    dt_dlnp = (RD_REF * t_k + LV_REF * rs) / (CP_REF + LV_REF * LV_REF * rs * eps / (RD_REF * t_k * t_k))
    return -G0_REF / (RD_REF * te_k) * dt_dlnp


def fine_parcel(col, z_lcl, dz=2.0):
    # The surface parcel in fine height steps through col: Poisson below z_lcl (MSL),
    # midpoint steps of the pseudo-adiabatic dT/dz above it. [(z_m, tp_c, te_c), ...].
    n = int(math.ceil((col.top_m - col.elev_m) / dz))
    zs = [col.elev_m + (col.top_m - col.elev_m) * i / n for i in range(n + 1)]
    if col.elev_m < z_lcl < col.top_m:
        zs = sorted(zs + [z_lcl])
    ts = col.t_c + 273.15
    out = []
    tp = None
    for i, z in enumerate(zs):
        if z <= z_lcl:
            tp = ts * (col.p_at(z) / col.p_hpa) ** (RD_REF / CP_REF)
        else:
            h = z - zs[i - 1]
            zm = z - 0.5 * h
            tm = tp + 0.5 * h * pseudo_adiabatic_dt_dz(tp, col.p_at(z - h), col.t_at(z - h) + 273.15)
            tp = tp + h * pseudo_adiabatic_dt_dz(tm, col.p_at(zm), col.t_at(zm) + 273.15)
        out.append((z, tp - 273.15, col.t_at(z)))
    return out


def first_crossing(profile, f):
    # Lowest z of [(z, ...), ...] where f(row) changes from > 0 to <= 0, linear between rows.
    for a, b in zip(profile, profile[1:]):
        fa, fb = f(a), f(b)
        if fa > 0.0 >= fb:
            return a[0] + (b[0] - a[0]) * fa / (fa - fb)
    return None
