"""Stability of the assumed ELR, and what the surface parcel and thermals will do."""
# Sources (definitions; Wallace & Hobbs, Atmospheric Science, 2nd ed., ch. 3 and 9):
#   stability by comparing the ELR with the dry (DALR) and saturated (SALR) rates;
#   LFC, EL, CAPE = g * integral of (Tp - Te)/Te dz over the positive area above the
#   LFC, CIN the negative area below it; lifted index Te - Tp at 500 hPa;
#   convective condensation level and convective (trigger) temperature.
#   The 0-3 km (above the field) and 700-500 hPa lapse rates: common practice.
# Plain air temperatures are used for parcel and environment, not virtual ones: the
# humidity aloft is not observed, so CAPE and CIN here are for the temperature only.
from math import log, exp, fabs, ceil
from lapsecalc.constants import G0, T0_K, KAPPA, EPS, DRY_LAPSE_K_PER_KM
from lapsecalc.limits import check, const
from lapsecalc.moisture import _dewpoint_from_e
from lapsecalc.adiabats import moist_lapse_k_per_km
from lapsecalc.standard import layer_pressure
from lapsecalc import parcel

# A lapse rate this close to a reference rate is called neutral, K/km.
_NEUTRAL_BAND_K_PER_KM = const(0.1)
# Deepest band one stability class speaks for, m (the saturated rate varies with height).
_BAND_M = const(2000)
# The general cautions of every full report (lapsecalc.hazards puts one line per hazard
# present before them).
CAUTIONS = (
    "Estimates from one surface observation and an assumed lapse rate, not a sounding.",
    "Real lapse rates change by the hour and by the place; recheck before each flight.",
    "Not an official forecast or briefing: use the official forecasts and briefings.",
    "Follow the flight manual, local regulations and licensed practice.",
)
_CCL_CAP = const(40)
_CCL_TOL_M = const(0.5)

def classify(lapse_k_per_km, saturated_k_per_km):
    """Stability class of a layer with the given ELR against the dry rate and the
    given saturated rate (both K/km): absolutely_stable, saturated_neutral (within
    0.1 K/km of the saturated rate: saturated air neither rises nor sinks on its own),
    conditionally_unstable, dry_neutral (within 0.1 K/km of the dry rate: so for
    unsaturated air), absolutely_unstable."""
    if fabs(lapse_k_per_km - DRY_LAPSE_K_PER_KM) <= _NEUTRAL_BAND_K_PER_KM:
        return "dry_neutral"
    if fabs(lapse_k_per_km - saturated_k_per_km) <= _NEUTRAL_BAND_K_PER_KM:
        return "saturated_neutral"
    if lapse_k_per_km > DRY_LAPSE_K_PER_KM:
        return "absolutely_unstable"
    if lapse_k_per_km < saturated_k_per_km:
        return "absolutely_stable"
    return "conditionally_unstable"


def layers(col, max_depth_m=_BAND_M):
    """Stability of every ELR layer, bottom first: a list of dicts (bottom_msl_m,
    top_msl_m, lapse_k_per_km, saturated_k_per_km at mid-layer, class). A cooling
    layer deeper than max_depth_m is split into equal bands no deeper than that,
    because the saturated rate changes with height inside it; an isothermal layer or
    an inversion is absolutely stable at any depth and stays whole."""
    out = []
    for z0, z1, t0, grad, p0 in col.layers:
        n = 1 if grad >= 0 else int(ceil((z1 - z0) / max_depth_m))
        lapse = -1000 * grad
        a = z0
        for i in range(n):
            b = z1 if i == n - 1 else z0 + (z1 - z0) * (i + 1) / n
            # The band [a, b], classified with the saturated rate at its middle.
            dz = 0.5 * (a + b) - z0
            salr = moist_lapse_k_per_km(t0 + grad * dz, layer_pressure(p0, t0, grad, dz))
            out.append({"bottom_msl_m": a, "top_msl_m": b, "lapse_k_per_km": lapse,
                        "saturated_k_per_km": salr, "class": classify(lapse, salr)})
            a = b
    return out


def lapse_measures(col):
    """The two lapse rates of common practice, each taken as a whole (mean ELR) and
    classified against the saturated rate at its middle: [lapse_0_3km_k_per_km, its
    class, lapse_700_500_k_per_km, its class], 0-3 km above the field and 700-500 hPa;
    None where the layer is not inside the column (700 hPa below the field, or a top
    below 3 km above the field or below 500 hPa)."""
    out = []
    z7 = z5 = None
    if col.p_hpa > 700:
        try:
            z7, z5 = col.z_at(700), col.z_at(500)
        except ValueError:  # 500 hPa above the column top
            pass
    for a, b in ((col.elev_m, col.elev_m + 3000), (z7, z5)):
        if a is None or b > col.top_m:
            out += [None, None]
            continue
        lapse = 1000 * (col.t_at(a) - col.t_at(b)) / (b - a)
        zm = 0.5 * (a + b)
        out += [lapse, classify(lapse, moist_lapse_k_per_km(col.t_at(zm) + T0_K, col.p_at(zm)))]
    return out


def _crossing(z0, b0, z1, b1):
    # Height where a quantity linear from b0 at z0 to b1 at z1 is zero.
    return z0 + (z1 - z0) * b0 / (b0 - b1)


def _refined_crossing(col, levels, i, lcl_msl_m, b0, b1):
    # Where the buoyancy changes sign between levels i-1 and i: the linear estimate,
    # then one secant step on the side that holds the root, with the parcel recomputed
    # at the estimate (the parcel curve bends between levels; the environment does not).
    z0, z1 = levels[i - 1][0], levels[i][0]
    zc = _crossing(z0, b0, z1, b1)
    te = col.t_at(zc) + T0_K
    bc = (parcel.temperature_at(col, levels, i, zc, lcl_msl_m) + T0_K - te) / te
    if bc == 0:
        return zc
    if (bc > 0) == (b0 > 0):
        return _crossing(zc, bc, z1, b1)
    return _crossing(z0, b0, zc, bc)


def _area(z0, b0, z1, b1):
    # Trapezoid of g*b over [z0, z1], split at a sign change: (positive, negative), J/kg.
    if b0 >= 0 and b1 >= 0:
        return 0.5 * G0 * (b0 + b1) * (z1 - z0), 0.0
    if b0 <= 0 and b1 <= 0:
        return 0.0, 0.5 * G0 * (b0 + b1) * (z1 - z0)
    zc = _crossing(z0, b0, z1, b1)
    a0 = 0.5 * G0 * b0 * (zc - z0)
    a1 = 0.5 * G0 * b1 * (z1 - zc)
    return (a0, a1) if b0 > 0 else (a1, a0)


def parcel_analysis(col, levels, lcl_msl_m):
    """LFC, EL, CAPE, CIN and lifted index of the surface parcel along levels
    (parcel.path). Returns a dict; None where a level does not exist; EL above the
    column top is reported as such (el_msl_m None, el_above_top True) and CAPE is
    then the area up to the top. CAPE and CIN use the plain air temperatures of parcel
    and environment, not virtual temperatures: the humidity aloft is not observed."""
    lfc = el = None
    cape = cin = 0.0
    in_positive = False
    z0, _, tp, te = levels[0]
    b0 = (tp - te) / (te + T0_K)          # buoyancy (Tp - Te) / Te
    for i in range(1, len(levels)):
        z1, _, tp, te = levels[i]
        b1 = (tp - te) / (te + T0_K)
        if z0 >= lcl_msl_m:
            if lfc is None and (b0 > 0 or b1 > 0):
                lfc = z0 if b0 > 0 else _refined_crossing(col, levels, i, lcl_msl_m, b0, b1)
                cin += _area(z0, b0, lfc, 0)[1] if lfc > z0 else 0
            if lfc is not None:
                cape += _area(z0, b0, z1, b1)[0]
                if b0 > 0 and b1 <= 0:
                    el = _refined_crossing(col, levels, i, lcl_msl_m, b0, b1)
                    in_positive = False
                elif b1 > 0:
                    in_positive = True
        if lfc is None:
            cin += _area(z0, b0, z1, b1)[1]
        z0, b0 = z1, b1
    el_above_top = lfc is not None and in_positive
    if el_above_top:
        el = None
    if lfc is None:
        cin = None
    return {"lfc_msl_m": lfc, "el_msl_m": el, "el_above_top": el_above_top,
            "cape_j_kg": cape, "cin_j_kg": cin,
            "lifted_index_c": lifted_index(col, levels, lcl_msl_m)}


def lifted_index(col, levels, lcl_msl_m, p_hpa=500):
    """Environment minus parcel temperature, degC, at p_hpa (the parcel recomputed at
    that height, parcel.temperature_at); None when the column does not reach it."""
    for i in range(1, len(levels)):
        if levels[i][1] <= p_hpa <= levels[i - 1][1]:
            z = col.z_at(p_hpa)
            return col.t_at(z) - parcel.temperature_at(col, levels, i, z, lcl_msl_m)
    return None


def thermal_top(col, excess_c=0):
    """Top, m MSL, of dry thermals: where a surface parcel at t_c + excess_c rising
    dry-adiabatically (9.77 K/km) meets the environment; the elevation when it cannot
    rise; None when it is still warmer at the column top."""
    excess = check("excess_c", excess_c, 0, 10, "K")
    tp0 = col.t_c + excess + T0_K
    for z0, z1, t0, grad, _ in col.layers:
        d0 = tp0 - DRY_LAPSE_K_PER_KM / 1000 * (z0 - col.elev_m) - t0
        d1 = tp0 - DRY_LAPSE_K_PER_KM / 1000 * (z1 - col.elev_m) - (t0 + grad * (z1 - z0))
        if d1 <= 0:
            return z0 if d0 <= 0 else _crossing(z0, d0, z1, d1)
    return None


def ccl(col, levels):
    """Convective condensation level, m MSL: where the environment temperature meets
    the dewpoint of the surface mixing ratio; None when not inside the column.
    Bracketed on the path's levels, then Illinois (regula falsi) steps, at most 40,
    to 0.5 m."""
    r = col.r_kg_kg
    if col.t_c - col.td_c <= 0:
        return col.elev_m

    def gap(p_hpa, t_c):
        # The environment's t_c minus the mixing-ratio line's dewpoint at p_hpa, K.
        return t_c - _dewpoint_from_e(r * p_hpa / (EPS + r))

    z0, p0, _, te0 = levels[0]
    g0 = gap(p0, te0)
    for z1, p1, _, te1 in levels[1:]:
        g1 = gap(p1, te1)
        if g1 <= 0:
            return _illinois(lambda z: gap(col.p_at(z), col.t_at(z)), z0, g0, z1, g1)
        z0, g0 = z1, g1
    return None


def _illinois(f, a, fa, b, fb, what="the convective condensation level"):
    # Root of f in [a, b] with fa > 0 >= fb: Illinois steps, at most 40, to 0.5 m;
    # what names the height in the error when it does not converge.
    side = 0
    for _ in range(_CCL_CAP):
        c = (a * fb - b * fa) / (fb - fa)
        fc = f(c)
        if fc > 0:
            a, fa = c, fc
            if side == 1:
                fb *= 0.5
            side = 1
        else:
            b, fb = c, fc
            if side == -1:
                fa *= 0.5
            side = -1
        if b - a < _CCL_TOL_M or fc == 0:
            return c
    raise ValueError("%s did not converge" % what)


def report_keys():
    """The report's keys from here on, in its order: add_to_report's, then
    cloud_layers_msl_m (Column.report), add_warnings' and cautions (Column.report:
    CAUTIONS, after a sentence per hazard present when lapsecalc.hazards is there:
    lapsecalc.cautions). A list made afresh: see column.report_keys."""
    return ["stability", "stability_layers", "lapse_0_3km_k_per_km", "lapse_0_3km_class",
            "lapse_700_500_k_per_km", "lapse_700_500_class", "lfc_msl_m", "el_msl_m",
            "el_above_top", "cape_j_kg", "cin_j_kg", "lifted_index_c", "thermal_excess_c",
            "thermal_top_msl_m", "thermal_kind", "ccl_msl_m", "trigger_t_c",
            "cloud_layers_msl_m", "levels_above_top", "warnings", "cautions"]


def add_to_report(col, levels, r, excess_c=0.0, heated_base_agl_m=None):
    """Add the stability, parcel and thermal keys to report dict r (lapsecalc.hazards
    adds the thermals' cloud base, usable top and capped decks). heated_base_agl_m:
    the cloud base, m AGL, of the surface parcel heated by excess_c
    (condensation.cloud_base), when the caller has it; else computed here."""
    excess_c = check("excess_c", excess_c, 0.0, 10.0, "K")
    lcl = r["cloud_base_msl_m"]
    per_layer = layers(col)
    r["stability"] = per_layer[0]["class"]
    r["stability_layers"] = per_layer
    r["lapse_0_3km_k_per_km"], r["lapse_0_3km_class"], r["lapse_700_500_k_per_km"], \
        r["lapse_700_500_class"] = lapse_measures(col)
    if lcl is None:
        pa = {"lfc_msl_m": None, "el_msl_m": None, "el_above_top": False, "cape_j_kg": 0.0,
              "cin_j_kg": None,
              "lifted_index_c": lifted_index(col, levels, col.elev_m + r["cloud_base_agl_m"])}
    else:
        pa = parcel_analysis(col, levels, lcl)
    r.update(pa)
    top = thermal_top(col, excess_c)
    if excess_c == 0.0:
        th_lcl = col.elev_m + r["cloud_base_agl_m"]
    elif heated_base_agl_m is not None:
        th_lcl = col.elev_m + heated_base_agl_m
    else:
        from lapsecalc.condensation import cloud_base
        th_lcl = col.elev_m + cloud_base(min(col.t_c + excess_c, 60.0), col.td_c, col.p_hpa)[0]
    if top is not None and top - col.elev_m < 1.0:
        kind = "none"
    elif top is None or top > th_lcl:
        kind = "cumulus"
    else:
        kind = "blue"
    r["thermal_excess_c"] = excess_c
    r["thermal_top_msl_m"] = top
    r["thermal_kind"] = kind
    z_ccl = ccl(col, levels)
    r["ccl_msl_m"] = z_ccl
    r["trigger_t_c"] = None if z_ccl is None else \
        (col.t_at(z_ccl) + T0_K) * exp(KAPPA * log(col.p_hpa / col.p_at(z_ccl))) - T0_K


def add_warnings(col, r):
    """Add levels_above_top (the report keys whose None means "above the column
    top": never reached inside it, and it may exist above; an LFC only when the column
    was cut short below its tropopause, as none forms above one; an EL only with
    el_above_top; the 700-500 hPa rate only with 700 hPa above the field) and warnings
    (plain lines
    about this column and its inputs: why it ends below the top asked for, each level
    above its top, steep layers between points aloft) to report r."""
    top = col.top_m
    out = []
    if col.end_why:
        out.append("The column ends at %.6g m MSL, below the top asked for (%.6g m): %s."
                   % (top, col.top_asked_m, col.end_why))
    keys = []
    # The keys whose None can mean "above the column top". A list, not a constant
    # tuple: a .mpy keeps a tuple's strings as copies, a list shares the module's.
    for k in ["cloud_base_msl_m", "freezing_level_msl_m", "minus10_level_msl_m",
              "minus20_level_msl_m", "parcel_freezing_level_msl_m", "lfc_msl_m", "el_msl_m",
              "thermal_top_msl_m", "ccl_msl_m", "lapse_0_3km_k_per_km", "lapse_700_500_k_per_km"]:
        if r[k] is not None or (k == "el_msl_m" and not r["el_above_top"]) or \
                (k == "lfc_msl_m" and (col.tropopause_m is not None or not col.end_why)) or \
                (k == "lapse_700_500_k_per_km" and col.p_hpa <= 700):
            continue
        keys.append(k)
        w = k.split("_msl")[0].split("_k_per")[0].replace("_", " ")
        out.append("%s: above the column top (%.0f m)" % (w.upper() if len(w) < 4 else w, top))
    if col.aloft_m:
        from lapsecalc.aloft import steep_warnings
        out.extend(steep_warnings(col))
    r["levels_above_top"] = keys
    r["warnings"] = out
