"""Accuracy against cost: the step of saturated_ascent and the parcel path's level spacing.

The references here are the bench's own integrations, written apart from the library:
the same pseudo-adiabatic slope (AMS Glossary form, the model the library uses, so only
the step error is measured), integrated by RK4 in ln p with a very fine step.
"""
from math import exp, log

from lapsecalc import adiabats, parcel
from lapsecalc.constants import R_DRY, CP_DRY, EPS, LV0, T0_K, KAPPA, G0
from timing import time_call

START_T_C = (30.0, 20.0, 0.0, -20.0)
P_FROM_HPA = 1000.0
P_TO_HPA = 200.0
DLNP_STEPS = (0.2, 0.1, 0.05, 0.02, 0.01, 0.005)
MAX_STEPS_M = (250.0, 500.0, 1000.0, 2000.0)


def _slope(t_k, p_hpa):
    # dT/dln p on the pseudo-adiabat, K (AMS Glossary, "pseudoadiabatic lapse rate"),
    # saturation over water by Alduchov & Eskridge (1996) eq. 21, e capped at p/2 as in
    # the library.
    t_c = t_k - T0_K
    e = 6.1094 * exp(17.625 * t_c / (t_c + 243.04))
    if e > 0.5 * p_hpa:
        e = 0.5 * p_hpa
    rs = EPS * e / (p_hpa - e)
    return (R_DRY * t_k + LV0 * rs) / (CP_DRY + LV0 * LV0 * rs * EPS / (R_DRY * t_k * t_k))


def reference_ascent_k(t_k, p0_hpa, p1_hpa, h):
    """Parcel temperature, K, at p1_hpa: classic RK4 in x = ln p with steps close to h."""
    x0, x1 = log(p0_hpa), log(p1_hpa)
    n = max(1, int(abs(x1 - x0) / h + 0.5))
    dx = (x1 - x0) / n
    t = t_k
    for i in range(n):
        x = x0 + i * dx
        k1 = _slope(t, exp(x))
        k2 = _slope(t + 0.5 * dx * k1, exp(x + 0.5 * dx))
        k3 = _slope(t + 0.5 * dx * k2, exp(x + 0.5 * dx))
        k4 = _slope(t + dx * k3, exp(x + dx))
        t += dx * (k1 + 2.0 * (k2 + k3) + k4) / 6.0
    return t


class _Counter:
    # Stands in for adiabats._es_water and counts the calls.
    def __init__(self, f):
        self.f, self.n = f, 0

    def __call__(self, t_c):
        self.n += 1
        return self.f(t_c)


def count_es_calls(fn, *args):
    """(result, number of saturation-pressure evaluations in adiabats) of fn(*args)."""
    orig = adiabats._es_water
    c = _Counter(orig)
    adiabats._es_water = c
    try:
        out = fn(*args)
    finally:
        adiabats._es_water = orig
    return out, c.n


def dlnp_curve(st):
    """Error of saturated_ascent (1000 -> 200 hPa) against the fine reference, for each
    offered step, with the counted saturation-pressure evaluations."""
    h_ref = 1e-3 if st.quick else 1e-4
    refs = {}
    spread = 0.0
    for t0 in START_T_C:
        r = reference_ascent_k(t0 + T0_K, P_FROM_HPA, P_TO_HPA, h_ref)
        r2 = reference_ascent_k(t0 + T0_K, P_FROM_HPA, P_TO_HPA, 2.0 * h_ref)
        spread = max(spread, abs(r - r2))
        refs[t0] = r - T0_K
    rows = []
    for h in DLNP_STEPS:
        errs = {}
        evals = 0
        for t0 in START_T_C:
            got, n = count_es_calls(adiabats.saturated_ascent, t0, P_FROM_HPA, P_TO_HPA, h)
            errs["%g" % t0] = got - refs[t0]
            evals = max(evals, n)
        us = 1e6 * time_call(adiabats.saturated_ascent, (20.0, P_FROM_HPA, P_TO_HPA, h),
                             {}, st)[0]
        rows.append({"dlnp": h, "es_evals": evals,
                     "max_abs_err_k": max(abs(e) for e in errs.values()),
                     "err_k_by_start_c": errs, "us_per_call": us})
    return {"from_hpa": P_FROM_HPA, "to_hpa": P_TO_HPA,
            "reference": "RK4 in ln p, dlnp %g (bench/accuracy.py)" % h_ref,
            "reference_vs_double_step_k": spread,
            "reference_t_c_by_start_c": dict(("%g" % k, v) for k, v in refs.items()),
            "default_dlnp": adiabats.DEFAULT_DLNP, "rows": rows}


def reference_cape(col, dz_m=5.0, h=2e-3):
    """(CAPE J/kg, parcel temperature degC at the column top) of the surface parcel by the bench's own fine path: Poisson to the
    LCL (as the library), then the pseudo-adiabat by RK4 (reference_ascent_k) between
    levels dz_m apart; positive buoyancy g (Tp - Te)/Te integrated above the LCL by
    trapezoids split at sign changes."""
    lcl = col.elev_m + col.cloud_base()[0]
    if lcl >= col.top_m:
        return 0.0, None
    ts_k, ps = col.t_c + T0_K, col.p_hpa
    p = col.p_at(lcl)
    tp = ts_k * exp(KAPPA * log(p / ps))
    z = lcl
    b0 = (tp - (col.t_at(z) + T0_K)) / (col.t_at(z) + T0_K)
    cape = 0.0
    while z < col.top_m:
        z1 = min(z + dz_m, col.top_m)
        p1 = col.p_at(z1)
        tp = reference_ascent_k(tp, p, p1, h)
        te1 = col.t_at(z1) + T0_K
        b1 = (tp - te1) / te1
        if b0 >= 0.0 and b1 >= 0.0:
            cape += 0.5 * G0 * (b0 + b1) * (z1 - z)
        elif b0 > 0.0 or b1 > 0.0:
            zc = z + (z1 - z) * b0 / (b0 - b1)
            cape += 0.5 * G0 * (b0 * (zc - z) if b0 > 0.0 else b1 * (z1 - zc))
        z, p, b0 = z1, p1, b1
    return cape, tp - T0_K


def parcel_step_curve(columns, st):
    """For each named column and each level spacing: report() time, CAPE, its error
    against reference_cape, the parcel temperature error at the top (the RK4 part of
    the error; the rest is the quadrature between levels), LFC and EL, path levels and saturation-pressure
    evaluations per report()."""
    orig = parcel.path
    out = {"default_max_step_m": parcel.MAX_STEP_M, "columns": {}}
    for name, col in columns:
        ref, ref_top_c = reference_cape(col, 20.0 if st.quick else 5.0)
        rows = []
        for step in sorted(set(MAX_STEPS_M + (parcel.MAX_STEP_M,))):
            def path(c, lcl_msl_m, max_step_m=step):
                return orig(c, lcl_msl_m, max_step_m)
            parcel.path = path
            try:
                rep, n = count_es_calls(col.report)
                levels = orig(col, col.elev_m + rep["cloud_base_agl_m"], step)
                med, best = time_call(col.report, (), {}, st)
            finally:
                parcel.path = orig
            rows.append({"max_step_m": step, "report_us": med * 1e6,
                         "report_min_us": best * 1e6, "levels": len(levels),
                         "es_evals": n, "cape_j_kg": rep["cape_j_kg"],
                         "cape_err_j_kg": rep["cape_j_kg"] - ref,
                         "top_parcel_err_k": None if ref_top_c is None
                         else levels[-1][2] - ref_top_c,
                         "lfc_msl_m": rep["lfc_msl_m"], "el_msl_m": rep["el_msl_m"],
                         "lifted_index_c": rep["lifted_index_c"]})
        out["columns"][name] = {"reference_cape_j_kg": ref, "reference_top_parcel_c": ref_top_c,
                                "rows": rows}
    return out
