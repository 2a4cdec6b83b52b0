"""The interpreter's setting words for a balloon (env wt fill tmax tenv gas pure
margin superheat): each checks its value into a new session state (runs on
MicroPython; loaded only by a line that sets one)."""
# Sources: unit conversions by exact definition (lapsecalc.units, via lapsecalc.typed).
#
# As lapsecalc.settings' setters: f(session, new_state, args) -> the words of the "ok"
# line; the table there names this module for these words.
from lapsecalc.limits import T_MIN_C, const
from lapsecalc.typed import shown, value, said
from lapsecalc.settings import echo

# As lapsecalc.hotair.MARGIN_MAX_K, MAX_ENVELOPE_T_MIN_C (the least maximum envelope
# temperature a maker may state), ENVELOPE_T_MAX_C and lapsecalc.gasballoon's
# SUPERHEAT_MAX_K (not imported here: the balloon modules load only for the balloon
# words; tests/test_settings_limits.py holds them equal).
_MARGIN_MAX_K = const(60.0)
_SUPERHEAT_MAX_K = const(50.0)
_TMAX_MIN_C = const(50.0)
_ENVELOPE_T_MAX_C = const(150.0)


def _s_amount(key, kind, lo, hi, unit, name):
    # A setter of a balloon amount (volume or mass) in lo..hi.
    def setter(s, new, args):
        new[key] = value(args[0], kind, unit, lo, hi)
        return "%s %s" % (name, echo(s, args[0], kind, unit, new[key]))
    return setter


def _s_tballoon(key, name, lo):
    def setter(s, new, args):
        new[key] = value(args[0], "t", s.disp["t"], lo, _ENVELOPE_T_MAX_C)
        return "%s %s" % (name, echo(s, args[0], "t", s.disp["t"], new[key]))
    return setter


def gas(s, new, args):
    g = {"he": "helium", "helium": "helium", "h2": "hydrogen", "hydrogen": "hydrogen",
         "none": None, "hot": None}.get(args[0].lower(), False)
    if g is False:
        raise ValueError("'%s' not accepted; accepted helium (he), hydrogen (h2), none (hot"
                         " air)" % shown(args[0]))
    new.pop("gas", None)
    if g:
        new["gas"] = g
    return "gas " + (g or "none (hot air)")


def pure(s, new, args):
    new["purity"] = value(args[0], "rh", "%", 50.0, 100.0) / 100.0
    return "%s %s" % ("purity", said(args[0], "%"))


def margin(s, new, args):
    # A temperature difference, like excess: bare in K, F typed as F.
    new["margin_k"] = value(args[0], "dt", "k", 0.0, _MARGIN_MAX_K)
    return "margin %s below tmax" % echo(s, args[0], "dt", "k", new["margin_k"])


def superheat(s, new, args):
    new["superheat_k"] = value(args[0], "dt", "k", 0.0, _SUPERHEAT_MAX_K)
    return "%s %s" % ("superheat", echo(s, args[0], "dt", "k", new["superheat_k"]))


# word -> setter (what each takes and an example: lapsecalc.settings.SETTINGS); a
# setter named after its word, as settings' are
SETTERS = {
    "env": _s_amount("env_m3", "v", 0.1, 2.0e6, "m3", "envelope"),
    "wt": _s_amount("wt_kg", "w", 0.01, 20000.0, "kg", "weight"),
    "fill": _s_amount("fill_m3", "v", 0.1, 1.0e5, "m3", "fill"),
    "tmax": _s_tballoon("tmax_c", "tmax", _TMAX_MIN_C),
    "tenv": _s_tballoon("tenv_c", "tenv", T_MIN_C),
    "gas": gas, "pure": pure, "margin": margin, "superheat": superheat,
}
