"""Input ranges and the checks that enforce them (every public function uses these)."""

# const: on MicroPython the compiler's, so that a private module constant written
# _NAME = const(literal) is put in the code where it is used and keeps no name (a board
# interns every name for good, and a session's names opening one more pool costs a
# 32-bit board 9 KiB of heap in one piece); on CPython the value itself.
try:
    from micropython import const
except ImportError:
    def const(x):
        return x

T_MIN_C = -90.0
T_MAX_C = 60.0
_P_MIN_HPA = const(1.0)
P_MAX_HPA = 1100.0
QNH_MIN_HPA = 850.0
QNH_MAX_HPA = 1100.0
ELEV_MIN_M = -500.0
ELEV_MAX_M = 9000.0
_LAPSE_MIN_K_PER_KM = const(-30.0)
_LAPSE_MAX_K_PER_KM = const(30.0)
# How far a dewpoint may exceed the temperature before it is an error (rounding), K.
DEW_SLACK_K = 0.05
# The highest column top, m MSL (lapsecalc.profile; here so that the setting words check
# a top without loading the column's code).
TOP_MAX_M = 32000.0
# Heights closer than this are one level (points aloft, crossings found in two layers,
# cloud layers), m.
SAME_LEVEL_M = 0.01


def shown(value):
    """value as an error message shows it: every digit of a float (100.0001, not 100),
    anything else by repr, at most 24 characters."""
    text = repr(value)
    return text if len(text) <= 24 else text[:21] + "..."


def check(name, value, lo, hi, unit):
    """Return value as a float, or raise ValueError naming it as given and the range
    lo..hi. Never OverflowError or TypeError: an int too big for a float, None, text,
    NaN and infinities are all refused the same way."""
    try:
        x = float(value)
    except (TypeError, ValueError, OverflowError):
        x = None
    if x is None or not lo <= x <= hi:  # NaN fails every comparison
        raise ValueError("%s=%s is %s allowed range %g..%g %s" % (
            name, shown(value), "outside the" if x is not None else "not a number in the",
            lo, hi, unit))
    return x


def finite(name, value):
    """value as a float within +-1e30 (any physical value a caller can mean), else
    ValueError naming it."""
    return check(name, value, -1e30, 1e30, "")


def check_t(name, t_c):
    return check(name, t_c, T_MIN_C, T_MAX_C, "degC")


def check_p(name, p_hpa):
    return check(name, p_hpa, _P_MIN_HPA, P_MAX_HPA, "hPa")


def check_elev(name, elev_m):
    return check(name, elev_m, ELEV_MIN_M, ELEV_MAX_M, "m")


def check_lapse(name, lapse):
    return check(name, lapse, _LAPSE_MIN_K_PER_KM, _LAPSE_MAX_K_PER_KM, "K/km")


def check_dew(t_c, td_c):
    """Check a temperature and dewpoint pair; returns (t_c, td_c), td clipped to t."""
    t = check_t("t_c", t_c)
    td = check_t("td_c", td_c)
    if td > t + DEW_SLACK_K:
        raise ValueError("td_c=%r is above t_c=%r; a dewpoint may not exceed the temperature"
                         " (allowed -90..%r degC)" % (td, t, t))
    if td > t:
        td = t
    return t, td
