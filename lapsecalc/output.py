"""How the interpreter says things: numbers in the session's display units, the "ok"
line of a taken line, and values in kv form (runs on MicroPython)."""
# Sources: unit conversions by exact definition (lapsecalc.units).
#
# The f_* functions take the session (they read s.disp) and give a padded column
# ("   1350 ft    411 m") or, with compact, the short form for acks ("1350 ft (411 m)").
# kv: None is an empty value, booleans 0/1, numbers %.6g, lists comma-joined,
# stability_layers bottom:top:elr:salr:class joined by ";", lists of sentences joined
# by " | ".
from lapsecalc import units


def f_h(s, z_m, compact=False):
    ft, m = round(units.m_to_ft(z_m)), round(z_m)
    if s.disp["h"] == "ft":
        return "%d ft (%d m)" % (ft, m) if compact else "%7d ft %6d m" % (ft, m)
    return "%d m (%d ft)" % (m, ft) if compact else "%7d m %7d ft" % (m, ft)


def f_h1(s, z_m):
    """A height in the display unit alone: "1350 ft"."""
    return "%d %s" % (round(units.m_to_ft(z_m) if s.disp["h"] == "ft" else z_m), s.disp["h"])


def f_t(s, t_c, compact=False):
    t, u = (units.c_to_f(t_c), "F") if s.disp["t"] == "f" else (t_c, "C")
    return ("%.1f %s" if compact else "%7.1f %s") % (t, u)


def f_dt(s, k, compact=False):
    d, u = (k * 1.8, "F") if s.disp["t"] == "f" else (k, "K")
    return ("%+.1f %s" if compact else "%+7.1f %s") % (d, u)


def f_p(s, hpa, compact=False):
    if s.disp["p"] == "inhg":
        return ("%.2f inHg" if compact else "%7.2f inHg") % units.hpa_to_inhg(hpa)
    return ("%.1f hPa" if compact else "%7.1f hPa") % hpa


def f_lapse(s, lapse):
    """An ELR in the elr syntax, tops AGL in the display unit: "9.5@820ft 7.5@7874ft 6.5"."""
    if not isinstance(lapse, list):
        return "%.1f K/km (%.2f C/1000ft)" % (lapse, units.k_per_km_to_c_per_1000ft(lapse))
    h = s.disp["h"]
    return " ".join("%g" % r + ("" if t is None else "@%d%s" % (
        round(units.m_to_ft(t) if h == "ft" else t), h)) for t, r in lapse) + " K/km"


def ack(s, what):
    """The lines that say a line was taken: "ok: what" in text mode (wrapped to 40
    columns when several settings share the line), else "ok"."""
    if s.mode != "text":
        return ["ok"]
    parts = []
    for x in ([what] if isinstance(what, str) else what):
        parts.extend(x.split(", "))
    out = ["ok: " + parts[0]]
    for x in parts[1:]:
        if len(out[-1]) + 2 + len(x) <= 40:
            out[-1] += ", " + x
        else:
            out[-1] += ","
            out.append("    " + x)
    return out


def kv_value(v):
    """One value in kv form (see the module comment)."""
    if v is None:
        return ""
    if v is True or v is False:
        return "1" if v else "0"
    if isinstance(v, float):
        return "%.6g" % v
    if isinstance(v, (list, tuple)):
        if v and isinstance(v[0], dict):
            return ";".join(":".join(kv_value(r[k]) for k in (
                "bottom_msl_m", "top_msl_m", "lapse_k_per_km", "saturated_k_per_km", "class"))
                for r in v)
        if v and isinstance(v[0], str):
            return " | ".join(v)
        return ",".join(kv_value(x) for x in v)
    return str(v)


def kv_lines(values, keys):
    """key=value lines of the keys of values, in the order of keys."""
    return ["%s=%s" % (k, kv_value(values[k])) for k in keys if k in values]
