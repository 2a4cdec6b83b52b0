"""The line interpreter: one line in, the output lines back (runs on MicroPython)."""
# Sources: none of its own; numbers come from the library, units and METAR reading
#   from lapsecalc.settings, results from lapsecalc.queries.
#
# A line is split into words (split_line, a pure function), its first word is looked
# up in a table, all new values go into a copy of the state, and only a line that
# passed every check replaces the state. Errors are caught once, in feed(), and come
# back as one "error: ..." line. feed() does no I/O; repl() and lapsecalc.cli do.
#
# Words (help gives them in short):
#   settings, several a line, all-or-nothing (lapsecalc.settings): temp dew rh elev qnh
#     stn elr top excess metar (takes the rest of the line); balloon: env wt tmax tenv
#     gas pure fill
#   queries, one a line (lapsecalc.queries): obs base ice da at iso stab parcel thermal
#     report chart svg balloon show
#   session words (here): unit out clear help bye
# Output modes: text (display units), kv and json (SI, report() keys); see queries.
from lapsecalc import units
from lapsecalc.settings import (SETTINGS, CLEAR, AIR_KEYS, ONE, NUMBERS, shown, starts_number,
                                dewpoint_of, missing, build_column, STANDARD_QNH_HPA,
                                ISA_LAPSE_K_PER_KM)
from lapsecalc.queries import QUERIES, report_keys, kv_lines, no_args
# Names this module gave before it was split, kept importable from lapsecalc.shell.
from lapsecalc.settings import number, DEFAULT_TOP_M  # noqa: F401
from lapsecalc.queries import GROUPS, kv_value  # noqa: F401

try:
    from micropython import const
except ImportError:
    def const(x):
        return x

_MAX_LINE = const(256)
MAX_LINE = _MAX_LINE
PROMPT = "lc> "
_SETTINGS = SETTINGS
_ALIASES = {"t": "temp", "td": "dew", "frz": "ice", "therm": "thermal", "units": "unit",
            "bal": "balloon", "?": "help", "quit": "bye", "exit": "bye"}


def split_line(line):
    """The words of a line: text after "#" is a comment."""
    i = line.find("#")
    return (line[:i] if i >= 0 else line).split()


def _edit_distance(a, b):
    # Levenshtein distance of two short words (callers cap them at 16 characters).
    prev = list(range(len(b) + 1))
    for i in range(1, len(a) + 1):
        cur = [i] + [0] * len(b)
        for j in range(1, len(b) + 1):
            cur[j] = min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] != b[j - 1]))
        prev = cur
    return prev[-1]


def nearest(word, known):
    """The known word closest to word (at most 2 edits, fewer than its length), or None."""
    w = word.lower()[:16]
    best, best_d = None, 3
    for k in sorted(known):
        if abs(len(k) - len(w)) < best_d:
            d = _edit_distance(w, k)
            if d < best_d and d < len(w):
                best, best_d = k, d
    return best


def _unknown(word):
    near = nearest(word, list(_SETTINGS) + list(_COMMANDS))
    return "unknown word '%s'; %s(help lists the words)" % (
        shown(word), "did you mean '%s'? " % near if near else "")


class Session:
    """One interpreter session: the observation, the ELR, balloon settings, display
    units and output mode. feed(line) -> list of output lines.

    svg_writer, when given, is called as svg_writer(name, svg_text) by the svg word and
    returns the line to print (the CPython command line gives one; the core writes no
    files)."""

    def __init__(self, svg_writer=None):
        self.state = {}
        self.disp = {"h": "ft", "t": "c", "p": "hpa"}
        self.mode = "text"
        self.done = False
        self.svg_writer = svg_writer
        self.json = None  # the json module, once "out json" was asked for
        self._col = self._rep = self._levels = None

    def feed(self, line):
        """Run one line; return its output lines (no newlines in them)."""
        try:
            out = self._dispatch(line)
        except ValueError as e:
            return ["error: " + shown(str(e), 300)]
        except Exception as e:  # a corner the library did not foresee: still one line
            return ["error: cannot compute that (%s: %s); nothing changed"
                    % (type(e).__name__, shown(str(e), 200))]
        if self.mode == "json":
            out = [x if x[:1] == "{" else self.json.dumps({"text": x}) for x in out]
        return out

    def _dispatch(self, line):
        if not isinstance(line, str):
            raise ValueError("a line must be text")
        if len(line) > _MAX_LINE:
            raise ValueError("line of %d characters refused; accepted at most %d"
                             % (len(line), _MAX_LINE))
        words = split_line(line)
        if not words:
            return []
        w = words[0].lower()
        w = _ALIASES.get(w, w)
        if w in _SETTINGS:
            return self._settings(words)
        if w in _COMMANDS:
            return _COMMANDS[w](self, w, words[1:])
        if starts_number(w):
            raise ValueError("a line starts with a word, e.g. temp 27C (help lists them)")
        raise ValueError(_unknown(words[0]))

    def _settings(self, words):
        new = dict(self.state)
        said = []
        i = 0
        while i < len(words):
            w = words[i].lower()
            w = _ALIASES.get(w, w)
            if w not in _SETTINGS:
                if w in _COMMANDS:
                    raise ValueError("'%s' cannot share a line with settings; give it its"
                                     " own line" % w)
                raise ValueError(_unknown(words[i]))
            fn, takes, example = _SETTINGS[w]
            j = i + 2 if takes == ONE else len(words)
            if takes == NUMBERS:
                j = i + 1
                while j < len(words) and starts_number(words[j]):
                    j += 1
            args = words[i + 1:j]
            if takes == ONE and not args:
                raise ValueError("%s needs a value, e.g. %s" % (w, example))
            try:
                said.append(fn(self, new, args))
            except ValueError as e:
                raise ValueError("%s: %s" % (" ".join([w] + args)[:40], e))
            i = j
        self._commit(new)
        return self.ack(said)

    def ack(self, what):
        """The lines that say a line was taken: "ok: what" in text mode (wrapped to 40
        columns when several settings share the line), else "ok"."""
        if self.mode != "text":
            return ["ok"]
        parts = []
        for x in ([what] if isinstance(what, str) else what):
            parts.extend(x.split(", "))
        what = parts
        out = ["ok: " + what[0]]
        for x in what[1:]:
            if len(out[-1]) + 2 + len(x) <= 40:
                out[-1] += ", " + x
            else:
                out[-1] += ","
                out.append("    " + x)
        return out

    def _commit(self, new):
        # Check the whole new state, then replace the old one (nothing changes before).
        same_air = True
        for k in AIR_KEYS:
            if new.get(k) != self.state.get(k):
                same_air = False
        col = self._col
        if not same_air:
            col = None
            if not missing(new):
                col = build_column(new)
            elif "t_c" in new and "hum" in new:
                dewpoint_of(new)
        self.state = new
        if not same_air:
            self._col, self._rep, self._levels = col, None, None

    def snapshot(self):
        """Everything a line may change, as a comparable value."""
        return sorted(self.state.items()), sorted(self.disp.items()), self.mode, self.done

    # ---- what queries need ----
    def column(self, word="this"):
        """The current Column; ValueError naming the settings still missing."""
        if self._col is None:
            raise ValueError("%s needs %s: set first, e.g. temp 27C dew 13C elev 1350ft"
                             % (word, ", ".join(missing(self.state))))
        return self._col

    def report(self, word="report"):
        """The current Column.report() (computed once per state)."""
        col = self.column(word)
        if self._rep is None:
            self._rep = col.report(self.state.get("excess_c", 0.0))
        return self._rep

    def levels(self):
        """The surface parcel's path (parcel.path) in the current column."""
        if self._levels is None:
            from lapsecalc.parcel import path
            col = self.column()
            self._levels = path(col, col.elev_m + self.report()["cloud_base_agl_m"])
        return self._levels

    def notes(self, balloon=False):
        """Defaults in use, announced with every result."""
        out = []
        if "press" not in self.state:
            out.append("QNH %.2f hPa (standard; qnh not set)" % STANDARD_QNH_HPA)
        if "lapse" not in self.state:
            out.append("ELR %.1f K/km (ISA; elr not set)" % ISA_LAPSE_K_PER_KM)
        if balloon and "gas" in self.state and "purity" not in self.state:
            out.append("gas purity 100 % (pure not set)")
        return out

    def kv_report(self):
        """The report as key=value lines whatever the mode (or one error line)."""
        try:
            rep = self.report()
        except ValueError as e:
            return ["error: " + shown(str(e), 300)]
        return kv_lines(rep, report_keys(rep))

    def chart_svg(self):
        """The profile chart of the current state as SVG text."""
        from lapsecalc.chart import svg
        return svg(self.column("svg"), self.report("svg"), self.levels(), self.disp["h"],
                   self.disp["t"])

    # ---- numbers in the display units, padded for columns or compact ----
    def f_h(self, z_m, compact=False):
        ft, m = round(units.m_to_ft(z_m)), round(z_m)
        if self.disp["h"] == "ft":
            return "%d ft (%d m)" % (ft, m) if compact else "%7d ft %6d m" % (ft, m)
        return "%d m (%d ft)" % (m, ft) if compact else "%7d m %7d ft" % (m, ft)

    def f_t(self, t_c, compact=False):
        t, u = (units.c_to_f(t_c), "F") if self.disp["t"] == "f" else (t_c, "C")
        return ("%.1f %s" if compact else "%7.1f %s") % (t, u)

    def f_dt(self, k, compact=False):
        d, u = (k * 1.8, "F") if self.disp["t"] == "f" else (k, "K")
        return ("%+.1f %s" if compact else "%+7.1f %s") % (d, u)

    def f_p(self, hpa, compact=False):
        if self.disp["p"] == "inhg":
            return ("%.2f inHg" if compact else "%7.2f inHg") % units.hpa_to_inhg(hpa)
        return ("%.1f hPa" if compact else "%7.1f hPa") % hpa

    def f_lapse(self, lapse):
        # In the elr syntax, tops AGL in the display unit: "9.5@820ft 7.5@7874ft 6.5".
        if not isinstance(lapse, list):
            return "%.1f K/km (%.2f C/1000ft)" % (lapse, units.k_per_km_to_c_per_1000ft(lapse))
        h = self.disp["h"]
        return " ".join("%g" % r + ("" if t is None else "@%d%s" % (
            round(units.m_to_ft(t) if h == "ft" else t), h)) for t, r in lapse) + " K/km"


def _c_clear(s, w, args):
    new = {} if not args else dict(s.state)
    for a in args:
        if a.lower() not in CLEAR:
            raise ValueError("clear: '%s' is not a setting; accepted %s"
                             % (shown(a), " ".join(sorted(CLEAR))))
        for k in CLEAR[a.lower()]:
            new.pop(k, None)
    s._commit(new)
    return s.ack("cleared " + (" ".join(a.lower() for a in args) if args else "all settings"))


_DISPLAY = {"ft": ("h", "ft"), "m": ("h", "m"), "c": ("t", "c"), "degc": ("t", "c"),
            "f": ("t", "f"), "degf": ("t", "f"), "hpa": ("p", "hpa"), "mb": ("p", "hpa"),
            "inhg": ("p", "inhg")}


def _c_unit(s, w, args):
    disp = dict(s.disp)
    for a in args:
        if a.lower() not in _DISPLAY:
            raise ValueError("unit: '%s' not accepted; accepted ft m C F hPa inHg" % shown(a))
        k, v = _DISPLAY[a.lower()]
        disp[k] = v
    s.disp = disp
    return s.ack("units %s %s %s" % (disp["h"], disp["t"].upper(),
                                     "hPa" if disp["p"] == "hpa" else "inHg"))


def _c_out(s, w, args):
    mode = args[0].lower() if len(args) == 1 else ""
    if mode not in ("text", "kv", "json"):
        raise ValueError("out needs one of text, kv, json")
    if mode == "json" and s.json is None:
        try:
            import json
        except ImportError:
            raise ValueError("out json needs the json module, missing here; accepted text, kv")
        s.json = json
    s.mode = mode
    return s.ack("out " + mode)


def _c_help(s, w, args):
    from lapsecalc.helptext import OVERVIEW, HELP
    if not args:
        return list(OVERVIEW)
    word = args[0].lower()
    word = _ALIASES.get(word, word)
    if len(args) > 1 or word not in HELP:
        raise ValueError("help takes one word of the list, e.g. help elr; help alone lists them")
    return list(HELP[word])


def _c_bye(s, w, args):
    no_args(w, args)
    s.done = True
    return []


# Every word but the settings: the queries, then the session words.
_COMMANDS = dict(QUERIES)
_COMMANDS.update({"clear": _c_clear, "unit": _c_unit, "out": _c_out, "help": _c_help,
                  "bye": _c_bye})


def read_line(stream):
    """One line of stream without its newline, None at the end. A line longer than the
    shell accepts is kept only in part (bounded memory), still too long to be run."""
    line = stream.readline(_MAX_LINE + 2)
    if not line:
        return None
    if len(line) > _MAX_LINE and line[-1] != "\n":
        rest = line
        while rest and rest[-1] != "\n":
            rest = stream.readline(_MAX_LINE)
    return line.rstrip("\r\n")


def repl(session=None, stream=None, prompt=PROMPT):
    """Run lines until the end of input or bye, printing each line's output. Lines
    come from stream (read_line) when one is given, else from input(), which on a
    board reads sys.stdin with line editing."""
    import sys
    s = session if session is not None else Session()
    while not s.done:
        if stream is None:
            try:
                line = input(prompt)
            except EOFError:
                break
        else:
            if prompt:
                sys.stdout.write(prompt)
            line = read_line(stream)
            if line is None:
                break
        for out in s.feed(line):
            print(out)
    return s
