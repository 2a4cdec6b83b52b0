"""Values as machines get them: numbers without float noise for json and kv, and the
kv form of every value (runs on MicroPython; loaded only by the kv and json modes)."""
# Sources: none; formats only.
#
# kv: None is an empty value, booleans 0/1, numbers as DECIMALS says, lists comma-joined,
# stability_layers bottom:top:elr:salr:class joined by ";", cloud_layers_msl_m
# bottom:top joined by ";", lists of sentences joined by " | ", a dict
# (indicated_altitude_m) as key:value pairs by sorted key joined by ";".

# Machine output (kv, json): decimals kept per key family, by the key's ending (the
# first that matches). Enough for every use, and no float noise: 1008.9999999999992
# is 1009, -2.27e-13 is 0. Keys of no family keep 6 significant digits.
DECIMALS = (("_k_per_km", 3), ("_kg_m3", 5), ("_per_m3_kg", 5),
            ("_j_kg", 1), ("_g_kg", 3), ("_g_mol", 4),
            ("_hpa", 2), ("_pct", 3), ("_m3", 3), ("_kg", 2), ("_m", 2), ("_c", 2),
            ("_k", 2), ("purity", 4))


def number_text(key, x):
    """The float x of result key as machines get it (see DECIMALS)."""
    for end, d in DECIMALS:
        if key.endswith(end):
            t = "%.*f" % (d, x)
            if "." in t:
                t = t.rstrip("0").rstrip(".")
            return "0" if t == "-0" else t
    t = "%.6g" % x
    return "0" if t == "-0" else t


def kv_value(v, key=""):
    """One value in kv form (see the module comment)."""
    if v is None:
        return ""
    if v is True or v is False:
        return "1" if v else "0"
    if isinstance(v, float):
        return number_text(key, v)
    if isinstance(v, dict):
        return ";".join("%s:%s" % (k, kv_value(v[k], k)) for k in sorted(v))
    if isinstance(v, (list, tuple)):
        if v and isinstance(v[0], dict):
            return ";".join(":".join(kv_value(r[k], k) for k in (
                "bottom_msl_m", "top_msl_m", "lapse_k_per_km", "saturated_k_per_km", "class"))
                for r in v)
        if v and isinstance(v[0], str):
            return " | ".join(v)
        if v and isinstance(v[0], list):
            return ";".join(kv_value(r, key) for r in v)  # a table: rows by ";"
        return ",".join(kv_value(x, key) for x in v)
    return str(v)


def kv_lines(values, keys):
    """key=value lines of the keys of values, in the order of keys."""
    return ["%s=%s" % (k, kv_value(values[k], k)) for k in keys if k in values]
