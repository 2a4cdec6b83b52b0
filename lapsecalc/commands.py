"""The interpreter's session words: clear, unit, heights, out, help, bye (runs on
MicroPython)."""
# Sources: none; they change the session's state, display units, output mode or end it.
#
# A session word is f(session, word, args) -> output lines, like a query, but it may
# change the session: it checks everything first and changes only at the end, so a
# refused line leaves the session as it was.
from lapsecalc.typed import ALIASES, shown, no_args, look_up
from lapsecalc.output import ack

# clear WORD -> state keys it forgets (the keys: lapsecalc.state)
CLEAR = {"temp": ("t_c",), "dew": ("hum",), "rh": ("hum",), "elev": ("elev_m",),
         "qnh": ("press",), "stn": ("press",), "elr": ("lapse",), "top": ("top_m",),
         "excess": ("excess_c",), "env": ("env_m3",), "wt": ("wt_kg",), "fill": ("fill_m3",),
         "tmax": ("tmax_c",), "tenv": ("tenv_c",), "gas": ("gas",), "pure": ("purity",),
         "margin": ("margin_k",), "superheat": ("superheat_k",),
         "aloft": ("aloft",), "trop": ("trop_m",)}


def clear(s, w, args):
    new = {} if not args else dict(s.state)
    for a in args:
        if a.lower() not in CLEAR:
            raise ValueError("clear: '%s' is not a setting; accepted %s"
                             % (shown(a), " ".join(sorted(CLEAR))))
        for k in CLEAR[a.lower()]:
            new.pop(k, None)
    s.commit(new)
    return ack(s, "cleared " + (" ".join(a.lower() for a in args) if args else "all settings"),
               ["clear"])


def unit(s, w, args):
    disp = dict(s.disp)
    for a in args:
        # unit WORD -> " WORD=quantity:display unit" (h heights, t temperatures, p pressures).
        entry = look_up(" ft=h:ft m=h:m c=t:c degc=t:c f=t:f degf=t:f hpa=p:hpa mb=p:hpa"
                        " inhg=p:inhg ", a.lower())
        if entry is None:
            raise ValueError("unit: '%s' not accepted; accepted ft m C F hPa inHg" % shown(a))
        k, v = entry.split(":")
        disp[k] = v
    s.disp = disp
    return ack(s, "units %s %s %s" % (disp["h"], disp["t"].upper(),
                                      "hPa" if disp["p"] == "hpa" else "inHg"), ["unit"])


def heights(s, w, args):
    from lapsecalc.altitext import heights_word
    return heights_word(s, w, args)


def out(s, w, args):
    mode = args[0].lower() if len(args) == 1 else ""
    if mode not in ("text", "kv", "json"):
        raise ValueError("out needs one of text, kv, json")
    s.mode = mode
    return ack(s, "out " + mode, ["out"])


def help(s, w, args):
    from lapsecalc.helptext import OVERVIEW, HELP
    if not args:
        return list(OVERVIEW)
    word = args[0].lower()
    word = look_up(ALIASES, word, word)
    if len(args) > 1 or word not in HELP:
        raise ValueError("help takes one word of the list, e.g. help elr; help alone lists them")
    return list(HELP[word])


def bye(s, w, args):
    no_args(w, args)
    s.done = True
    return []


# session word -> f(session, word, args) -> output lines; each function is named after
# its word (a board interns the word anyway, a name of its own would be one more)
COMMANDS = {"clear": clear, "unit": unit, "heights": heights, "out": out, "help": help,
            "bye": bye}
