"""METAR reading: the temperature, dewpoint and pressure groups of one report."""
# Sources:
#   WMO Manual on Codes (WMO-No. 306), FM 15 METAR: temperature/dewpoint group TT/TdTd
#     in whole degC with "M" for minus (M05/M08); QNH group Qpppp in whole hPa; the
#     North American altimeter group Annnn in hundredths of inHg; the North American
#     remark group T snTTT snTdTdTd in tenths of degC (sign digit 0 plus, 1 minus).
#     Stated from memory (REFERENCES.md, Reports).
# Only these groups are read; the rest of the report (wind, visibility, weather,
# cloud) is skipped. The field elevation is not in a METAR: the user gives it.
from lapsecalc.units import inhg_to_hpa
from lapsecalc.limits import check, check_dew, shown, QNH_MIN_HPA, QNH_MAX_HPA, const

# Most groups read from one report (a report line is capped by the shell anyway).
_MAX_GROUPS = const(80)


def _digits(s):
    if not s:
        return False
    for ch in s:
        if ch < "0" or ch > "9":
            return False
    return True


def _whole_c(s):
    # "05" -> 5.0, "M05" -> -5.0; None when s is not such a group part.
    neg = s.startswith("M")
    if neg:
        s = s[1:]
    if len(s) != 2 or not _digits(s):
        return None
    return -float(int(s)) if neg else float(int(s))


def _tenths_c(s):
    # Remark form "0256" -> 25.6, "1139" -> -13.9; None otherwise.
    if len(s) != 4 or not _digits(s) or s[0] not in "01":
        return None
    v = int(s[1:]) / 10.0
    return -v if s[0] == "1" else v


def parse(text):
    """Read one METAR (or SPECI) report.

    Returns a dict: t_c, td_c (degC; td_c None when the report has no dewpoint),
    qnh_hpa (hPa; None when there is no Q or A group) and groups (the groups read).
    The remark T group, when present, replaces the whole-degree values (it has
    tenths). A Q group is preferred over an A group. Raises ValueError when there is
    no temperature group or a value is out of range.
    """
    if not isinstance(text, str):
        raise ValueError("a METAR is text; got %s" % shown(text))
    words = text.upper().split()
    if len(words) > _MAX_GROUPS:
        raise ValueError("the METAR has %d groups; accepted at most %d" % (len(words), _MAX_GROUPS))
    t = td = q_hpa = a_hpa = rt = rtd = None
    used = []
    in_remarks = False
    for g in words:
        if g == "RMK":
            in_remarks = True
        elif in_remarks:
            if rt is None and len(g) in (5, 9) and g[0] == "T":
                a = _tenths_c(g[1:5])
                b = _tenths_c(g[5:]) if len(g) == 9 else None
                if a is not None and (len(g) == 5 or b is not None):
                    rt, rtd = a, b
                    used.append(g)
        elif t is None and "/" in g:
            parts = g.split("/")
            if len(parts) == 2 or (len(parts) == 4 and g.endswith("///")):  # TT/// : no dew
                a = _whole_c(parts[0])
                b = _whole_c(parts[1])
                if a is not None and (b is not None or parts[1] == ""):
                    t, td = a, b
                    used.append(g)
        elif len(g) == 5 and g[0] == "Q" and _digits(g[1:]) and q_hpa is None:
            q_hpa = float(int(g[1:]))
            used.append(g)
        elif len(g) == 5 and g[0] == "A" and _digits(g[1:]) and a_hpa is None:
            a_hpa = inhg_to_hpa(int(g[1:]) / 100.0)
            used.append(g)
    if rt is not None:
        t = rt
        if rtd is not None:
            td = rtd
    if t is None:
        raise ValueError("no temperature group found; accepted TT/TdTd in whole degC with M for"
                         " minus (e.g. 24/M02), or RMK T02410021")
    if td is None:
        check("METAR temperature", t, -90.0, 60.0, "degC")
    else:
        t, td = check_dew(t, td)
    q = q_hpa if q_hpa is not None else a_hpa
    if q is not None:
        q = check("METAR QNH", q, QNH_MIN_HPA, QNH_MAX_HPA, "hPa (Qpppp hPa or Annnn 0.01 inHg)")
    return {"t_c": t, "td_c": td, "qnh_hpa": q, "groups": used}
