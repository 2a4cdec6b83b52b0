"""The line interpreter: one line in, the output lines back (runs on MicroPython)."""
# Sources: none of its own; numbers come from the library through the word modules.
#
# A line is split into words (split_line, a pure function), its first word is looked
# up in the word tables, all new values go into a copy of the state, and only a line
# that passed every check replaces the state. Errors are caught once, in feed(), and
# come back as one "error: ..." line. feed() does no I/O; repl() and lapsecalc.cli do.
#
# Layers, top down: this module (Session: dispatch and state) -> the word modules:
# lapsecalc.settings (SETTINGS, several a line, all-or-nothing), lapsecalc.queries
# (QUERIES, one a line), lapsecalc.commands (COMMANDS: clear unit out help bye; it and
# settings are imported by the line that uses them) ->
# lapsecalc.layout (text lines, loaded by text output) -> lapsecalc.groups (result
# keys), lapsecalc.output (display units, acks, kv values), lapsecalc.state (state
# keys, defaults, the Column), lapsecalc.typed (numbers, units; loaded by the lines
# that read one), lapsecalc.aliases (other names of words, slips) -> the library.
from lapsecalc.aliases import ALIASES, PAIRS, shown, split_number, starts_number
from lapsecalc.state import AIR_KEYS, missing, build_column, dewpoint_of, settle
from lapsecalc.queries import QUERIES

try:
    from micropython import const
except ImportError:
    def const(x):
        return x

_MAX_LINE = const(256)
MAX_LINE = _MAX_LINE
PROMPT = "lc> "
# Modules loaded only for a line's work (the setting and session words, help, chart,
# svg, balloon, metar, demo; the text layout; the parcel, stability, hazards and
# points-aloft code of a report; the altimeter's numbers and text): on a board a
# Session forgets them after the line, so the heap between lines holds only the
# dispatch layer and the session's state (measured: bench/mpy_budget.py). A new module
# that only some lines need goes here. PHYSICS_MODULES: a board Session keeps no
# Column between lines and lets go of it and of these once a line's numbers are
# computed (Session.release), before the text layout loads; so too of the number
# readers (typed, heights) and the altimeter's numbers (altiwords), which the text
# does not use.
PHYSICS_MODULES = ("parcel", "stability", "hazards", "aloft", "aloftpoints", "altimetry",
                   "indicated", "balloon", "hotair", "hotreport", "gasballoon", "adiabats",
                   "column", "condensation", "standard", "moisture", "constants", "typed",
                   "heights", "altiwords")
WORD_MODULES = PHYSICS_MODULES + (
    "limits", "settings", "commands", "units", "output", "machine", "groups", "helptext", "chart", "loadtable",
    "balloontext", "metar", "demo", "layout", "showword", "jsontext",
    "balloonwords", "atwords", "hazardtext", "altitext", "aloftwords",
    "retell", "chartsvg", "balloonsettings")
# The setting words' modules: let go of on a board once a line's settings are read,
# before the new state's Column is built.
SETTING_MODULES = ("settings", "balloonsettings", "aloftwords", "metar", "typed", "heights")
# The words whose report carries the altimetry keys (isa_deviation_c,
# density_altitude_dry_m, indicated_altitude_m: Column.report(altimetry=True)).
ALTIMETRY_WORDS = ("report", "obs", "da", "levels")
# The setting words (lapsecalc.settings.SETTINGS) and the session words
# (lapsecalc.commands.COMMANDS), in their tables' order: their modules load only for a
# line that uses them (a board drops them after it).
SETTING_WORDS = ("temp", "dew", "rh", "elev", "qnh", "stn", "elr", "top", "excess", "metar",
                 "env", "wt", "fill", "tmax", "tenv", "gas", "pure", "margin", "superheat",
                 "aloft", "trop")
COMMAND_WORDS = ("clear", "unit", "heights", "out", "help", "bye")
# Every word but the settings: the queries, then the session words.
_WORDS = tuple(QUERIES) + COMMAND_WORDS


def split_line(line):
    """The words of a line: text after "#" is a comment."""
    i = line.find("#")
    return (line[:i] if i >= 0 else line).split()


# Words whose line never reads the report and needs much heap of its own: on a board
# the report kept for the session is let go of before such a line (the next line that
# reads it computes it again; measured: the balloon, loads and sunset lines' hard heap
# limit fell by about 9 KiB). A word missing here costs heap, one too many a recompute.
# So too before a line of settings or a clear (most change the air, and the report with
# it; measured: hard limit 117 -> 114 KiB), and da H (as at H: _dispatch).
_NO_REPORT = ("balloon", "loads", "sunset", "show", "iso", "at", "help", "cold", "clear") + \
    SETTING_WORDS
# Query words that take a number after them (a first word followed by a number is
# one of these or a setting).
_TAKE_NUMBER = ("at", "da", "iso", "balloon", "chart")


def _unknown(word, settings_only=False, number_next=False, after=None):
    # The error for a word no table has (lapsecalc.typed.unknown, loaded only then):
    # in a line of settings only settings are suggested; after a first word followed by
    # a number, only words that take one.
    from lapsecalc.typed import unknown
    known = list(SETTING_WORDS)
    if not settings_only:
        known += list(_TAKE_NUMBER) if number_next else list(_WORDS)
    return unknown(word, known, after)


def joined(words):
    """words with a unit typed after a space joined to its number and two-word names
    made one (lapsecalc.typed.join_words, loaded only when a line may need it: a word
    after a bare number, or a pair)."""
    for i in range(1, len(words)):
        prev = words[i - 1].split("@")[-1]
        if (words[i - 1].lower(), words[i].lower()) in PAIRS or \
                split_number(prev) == (prev, ""):
            from lapsecalc.typed import join_words
            return join_words(words)
    return words


def _is_kv(line):
    # "key=value" with a key of lower-case letters, digits and "_".
    i = line.find("=")
    if i < 1:
        return False
    for ch in line[:i]:
        if not ("a" <= ch <= "z" or "0" <= ch <= "9" or ch == "_"):
            return False
    return True


def _retold(s, st, e, line=None):
    # The refusal e in session s's words: one in the library's wording (argument
    # names, SI) is retold by lapsecalc.retell, loaded only then, after the query word
    # of line that met it; st is the state the line was checked in.
    text = str(e)
    if "=" in text or "_" in text or "degC" in text or "aloft point" in text:
        from lapsecalc.retell import retell
        text = retell(s, st, text)
        w = split_line(line)[:1] if isinstance(line, str) else None
        w = ALIASES.get(w[0].lower(), w[0].lower()) if w else ""
        if w in QUERIES and text[:len(w)] != w:
            text = w + ": " + text
    return text


def drop_modules(names):
    """Forget the lapsecalc submodules names (lapsecalc._forget): the next import
    loads them afresh, and until then they hold no heap."""
    from lapsecalc import _forget
    _forget(names)


def _on_board():
    import sys
    return sys.implementation.name == "micropython"


class Session:
    """One interpreter session: the observation, the ELR, balloon settings, display
    units and output mode. feed(line) -> list of output lines.

    svg_writer, when given, is called as svg_writer(name, svg_text) by the svg word and
    returns the line to print (the CPython command line gives one; the core writes no
    files)."""

    def __init__(self, svg_writer=None):
        self.state = {}
        # Display: height, temperature, pressure units; levels as true MSL ("msl") or
        # indicated on QNH ("ind", the heights word).
        self.disp = {"h": "ft", "t": "c", "p": "hpa", "z": "msl"}
        self.mode = "text"
        self.done = False
        self.svg_writer = svg_writer
        self.checks = []  # "check:" lines of the line being run (a word adds them)
        self._col = self._rep = self._levels = None
        self._rep_alt = False
        # On a board, WORD_MODULES are dropped after each line (drop_modules) and the
        # heap collected (an allocation count sets collect_after_line False: it
        # collects between lines itself).
        self.drop_word_modules = self.collect_after_line = _on_board()

    def feed(self, line):
        """Run one line; return its output lines (no newlines in them). In text mode
        an error is "error: ..." wrapped to 40 columns; in kv mode every line is
        key=value or starts "#"; in json mode every line is one JSON object."""
        self.checks = []
        refused = None
        try:
            out = self._dispatch(line)
        except Exception as e:  # said below, once the line's code is let go of
            refused = e
        finally:
            self._tidy()
        if refused is not None:
            try:
                return self._refusal(refused, line)
            finally:
                self._tidy()  # the message's code too
        for lines in self._say("check", self.checks):
            out.extend(lines)
        if self.mode == "json":
            # Text lines as {"text": ...} objects (one left out for want of heap).
            said = iter(self._say("text", [x for x in out if x[:1] != "{"]))
            out = [y for x in out for y in ([x] if x[:1] == "{" else next(said))]
        elif self.mode == "kv":
            out = [x if x[:1] == "#" or _is_kv(x) else "# " + x for x in out]
        return out

    def _tidy(self):
        # On a board: forget the line's modules and collect. A collection here frees
        # the line's garbage and the dropped modules before the next line allocates
        # among them: less fragmentation (the hard heap limit of the full-word session
        # fell from 186 to 172 KiB).
        if self.drop_word_modules:
            self._col = self._levels = None
            drop_modules(WORD_MODULES)
        if self.collect_after_line:
            import gc
            gc.collect()

    def _refusal(self, e, line):
        # The error line of a refused line: a ValueError in the user's words (retold
        # when the library worded it), anything else as a corner the library did not
        # foresee; the fixed form when even the message finds no heap.
        try:
            if isinstance(e, ValueError):
                try:
                    text = _retold(self, self.state, e, line)
                except MemoryError:  # no room for the retelling code: the library's words
                    text = str(e)
                text = shown(text, 300)
            else:
                text = "cannot compute that (%s: %s); nothing changed" % (
                    type(e).__name__, shown(str(e), 200))
        except MemoryError:
            return self._no_room()
        return self._say("error", [text])[0]

    def _no_room(self):
        # An error said with no heap to spare, in the session's mode: fixed text.
        text = "cannot compute that (MemoryError); nothing changed"
        if self.mode == "json":
            return ['{"error": "%s"}' % text]
        if self.mode == "kv":
            return ["error=" + text]
        return ["error: cannot compute that", "  (MemoryError); nothing changed"]

    def _say(self, key, texts):
        # The lines of each of texts as output.say says them (key "error", "check" or
        # "text"), loaded once for them (a board drops it after). A board's heap may
        # have no room left even for that code: then an error is said in the fixed
        # form and other lines left out, never a MemoryError out of feed().
        if not texts:
            return []
        try:
            from lapsecalc.output import say
            return [say(self, key, x) for x in texts]
        except MemoryError:
            return [self._no_room() if key == "error" else [] for x in texts]
        finally:
            if self.drop_word_modules:
                drop_modules(("output", "jsontext", "machine"))

    def _dispatch(self, line):
        if not isinstance(line, str):
            raise ValueError("a line must be text")
        if len(line) > _MAX_LINE:
            raise ValueError("line of %d characters refused; accepted at most %d"
                             % (len(line), _MAX_LINE))
        words = joined(split_line(line))
        if not words:
            return []
        w = words[0].lower()
        w = ALIASES.get(w, w)
        if self.drop_word_modules and self._rep is not None and (
                w in _NO_REPORT or (w == "da" and len(words) > 1)):
            self._rep = None
            self.collect()
        if w in SETTING_WORDS:
            return self._settings(words)
        if w in QUERIES:
            f = QUERIES[w]
            if isinstance(f, str):  # a word whose code is a module of its own
                f = __import__("lapsecalc." + f, None, None, ["WORDS"]).WORDS[w]
            return f(self, w, words[1:])
        if w in COMMAND_WORDS:
            from lapsecalc.commands import COMMANDS
            return COMMANDS[w](self, w, words[1:])
        if starts_number(w):
            raise ValueError("a line starts with a word, e.g. temp 27C (help lists them)")
        raise ValueError(_unknown(words[0], False, len(words) > 1 and starts_number(words[1])))

    def _settings(self, words):
        from lapsecalc.output import ack
        from lapsecalc.settings import SETTINGS, ONE, NUMBERS, whole, setter
        new = dict(self.state)
        said = []
        set_words = []
        i = 0
        while i < len(words):
            w = words[i].lower()
            w = ALIASES.get(w, w)
            if w not in SETTING_WORDS:
                if w in _WORDS:
                    raise ValueError("'%s' cannot share a line with settings; give it its"
                                     " own line" % w)
                raise ValueError(_unknown(words[i], True, False, words[i - 1] if i else None))
            takes, example = SETTINGS[w][1:]
            fn = setter(w)
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
                set_words.append(w)
            except ValueError as e:
                raise ValueError("%s %s" % (w, e))
            i = j
        try:
            rest = whole(self, new)
            if self.drop_word_modules:
                # On a board the setting words' code is let go of before the points
                # aloft are checked and the new state's Column is built (commit), as
                # a query lets go of the physics before its text.
                fn = whole = SETTINGS = setter = None
                drop_modules(SETTING_MODULES)
                self.collect()
            if rest is not None:  # ("aloft", late): settings.whole
                from lapsecalc.aloftwords import check_whole
                check_whole(self, new)
                if self.drop_word_modules:
                    # Its code let go of again before the Column is built.
                    check_whole = None
                    drop_modules(("aloftwords",))
                if rest[1] is not None:
                    raise rest[1]
            self.commit(new)
        except ValueError as e:
            # What only the library finds (the new state's column) in the user's terms.
            raise ValueError(_retold(self, new, e))
        return ack(self, said, set_words)

    def commit(self, new):
        """Check the whole new state, then replace the old one (nothing changes before)."""
        same_air = True
        for k in AIR_KEYS:
            if new.get(k) != self.state.get(k) or (k in new) != (k in self.state):
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

    def column(self, word="this"):
        """The current Column; ValueError naming the settings still missing. (A board
        Session builds it again after release().)"""
        if self._col is None:
            if missing(self.state):
                raise ValueError("%s needs %s: set first, e.g. temp 27C dew 13C elev 1350ft"
                                 % (word, ", ".join(missing(self.state))))
            self._col = build_column(self.state)
            self.collect()
        return self._col

    def collect(self):
        """On a board: collect the heap between the stages of a line (the garbage of
        one stage is freed before the next loads its code). A heap count puts its own
        in its place (tests/mpy/run.mjs --session, tests/mpy/board_session.py: the heap
        just before each collection is a peak)."""
        if self.drop_word_modules:
            import gc
            gc.collect()

    def read_done(self):
        """On a board: let go of the number reader (lapsecalc.typed) once a word has
        read what was typed after it, before it computes (hold no name of it in a
        local across this call). Nothing on CPython."""
        if self.drop_word_modules:
            drop_modules(("typed",))
            self.collect()

    def release(self):
        """On a board: let go of the Column, the parcel path and the physics code once
        a line's numbers are computed, so that the text layout loads into the heap they
        held (the report stays). Nothing on CPython."""
        if self.drop_word_modules:
            self._col = self._levels = None
            drop_modules(PHYSICS_MODULES)
            self.collect()
            if self._rep is not None:
                settle(self._rep)  # into the holes the physics code left
                self.collect()

    def report(self, word="report"):
        """The current Column.report() (computed once per state)."""
        col = self.column(word)
        # After "heights ind" every level is shown indicated: the report's own readings
        # (no Column built again for the text).
        alt = word in ALTIMETRY_WORDS or self.disp["z"] == "ind"
        if self._rep is None or (alt and not self._rep_alt):
            # The altimetry keys only for the words that show them: a board's session
            # heap has little room for them (bench/mpy_budget.py).
            self._rep = None
            if self.drop_word_modules:
                # The report's code loaded, and its loading's garbage freed, before the
                # report allocates.
                from lapsecalc import stability, parcel  # noqa: F401
                if alt:
                    from lapsecalc import indicated  # noqa: F401
                stability = parcel = indicated = None
                self.collect()
            self._rep = col.report(self.state.get("excess_c", 0.0), alt)
            self._rep_alt = alt
            # On a board the report kept is packed low in the heap (state.settle).
            self.collect()
            settle(self._rep)
        return self._rep

    def levels(self):
        """The surface parcel's path (parcel.path) in the current column."""
        if self._levels is None:
            col = self.column()
            # The report's cloud base (Column.report() takes it from cloud_base() too),
            # without computing the whole report for the words that need only the path;
            # found before the parcel code loads (a board lets go of its code after).
            # A kept report has it already.
            lcl = col.elev_m + (col.cloud_base()[0] if self._rep is None else
                                self._rep["cloud_base_agl_m"])
            from lapsecalc.parcel import path
            self._levels = path(col, lcl)
        return self._levels


def split_ends(text):
    """The lines of text ended by LF, CR alone or CRLF (serial terminals send CR)."""
    return text.replace("\r\n", "\n").replace("\r", "\n").split("\n")


def read_lines(stream):
    """The lines of stream without their ends (LF, CR alone or CRLF), one at a time.
    A line longer than the shell accepts is kept only in part (bounded memory), still
    too long to be run."""
    part = ""
    after_cr = False
    while True:
        chunk = stream.readline(_MAX_LINE + 2)
        if not chunk:
            if part:
                yield part
            return
        if after_cr and chunk[0] == "\n":
            chunk = chunk[1:]  # the LF of a CRLF cut between two reads
        after_cr = chunk[-1:] == "\r"
        pieces = split_ends(chunk)
        for piece in pieces[:-1]:
            yield (part + piece)[:_MAX_LINE + 2]
            part = ""
        part = (part + pieces[-1])[:_MAX_LINE + 2]


def repl(session=None, stream=None, prompt=PROMPT):
    """Run lines until the end of input or bye, printing each line's output. Lines
    come from stream (read_lines) when one is given, else from input(), which on a
    board reads sys.stdin with line editing."""
    import sys
    s = session if session is not None else Session()
    lines = None if stream is None else read_lines(stream)
    while not s.done:
        if lines is None:
            try:
                line = input(prompt)
            except EOFError:
                break
        else:
            if prompt:
                sys.stdout.write(prompt)
            try:
                line = next(lines)
            except StopIteration:
                break
        for piece in split_ends(line):
            try:
                for out in s.feed(piece):
                    print(out)
            except MemoryError:  # not even room to say so in the session's mode
                print("error: out of memory")
    return s
