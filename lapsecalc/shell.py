"""The line interpreter: one line in, the output lines back (runs on MicroPython)."""
# Sources: none of its own; numbers come from the library through the word modules.
#
# A line's words are read and its first word found in the word tables by
# lapsecalc.dispatch (loaded for each line; on a board let go of before the word runs),
# all new values go into a copy of the state, and only a line that passed every check
# replaces the state. Errors are caught once, in feed(), and come back as one
# "error: ..." line. feed() does no I/O; repl() and lapsecalc.cli do.
#
# Layers, top down: this module (Session: the state, the line's stages) ->
# lapsecalc.dispatch (the word tables, the refusals' words), lapsecalc.settingline (a
# line of settings) -> the word modules: lapsecalc.settings (SETTINGS, several a line,
# all-or-nothing), the query words' (lapsecalc.queries.QUERIES names them, one a line),
# lapsecalc.commands (COMMANDS: clear unit out help bye) -> lapsecalc.layout (text
# lines, loaded by text output) -> lapsecalc.groups
# (result keys), lapsecalc.output (display units, acks, kv values), lapsecalc.state
# (state keys, defaults, the Column), lapsecalc.typed (numbers, units; loaded by the
# lines that read one), lapsecalc.aliases (other names of words, slips) -> the library.
# Between lines a board's Session holds this module and lapsecalc.state only.
from lapsecalc.state import AIR_KEYS, missing, build_column, dewpoint_of, settle

# The longest line accepted, characters.
MAX_LINE = 256
PROMPT = "lc> "
# What a board's Session holds between lines: this module and lapsecalc.state. Every
# other lapsecalc module a line loads (the word tables, the words, help, chart, the
# text layout, the column and the rest of the library) is let go of after the line
# (Session._tidy, drop_line_modules), so no list of them needs keeping up (one held
# 52 names: the 32-bit build's session needed 65 KiB with it, 64 without).
# PHYSICS_MODULES: a board Session keeps no Column between lines and lets go of it and
# of these once a line's numbers are computed (Session.release), before the text
# layout loads; so too of the number readers (typed, heights) and the altimeter's
# numbers (altiwords), which the text does not use.
PHYSICS_MODULES = ("parcel", "stability", "hazards", "aloft", "aloftpoints", "altimetry",
                   "indicated", "balloon", "hotair", "hotreport", "gasballoon", "adiabats",
                   "column", "condensation", "standard", "moisture", "constants", "typed",
                   "heights", "altiwords")
# The words whose report carries the altimetry keys (isa_deviation_c,
# density_altitude_dry_m, indicated_altitude_m: Column.report(altimetry=True)).
ALTIMETRY_WORDS = ("report", "obs", "da", "levels")


def _is_kv(line):
    # "key=value" with a key of lower-case letters, digits and "_".
    i = line.find("=")
    if i < 1:
        return False
    for ch in line[:i]:
        if not ("a" <= ch <= "z" or "0" <= ch <= "9" or ch == "_"):
            return False
    return True


def drop_modules(names):
    """Forget the lapsecalc submodules names (lapsecalc._forget): the next import
    loads them afresh, and until then they hold no heap."""
    from lapsecalc import _forget
    _forget(names)


def drop_line_modules(keep=()):
    """Forget every lapsecalc submodule but this one, lapsecalc.state and those named
    in keep (full names): what a board's Session holds between lines. lapsecalc._forget's
    work done for all of them at once, without the short names _forget takes: it makes
    no new string (it runs after a line that may have run out of heap)."""
    import sys
    import lapsecalc
    gone = [k for k in sys.modules if k.startswith("lapsecalc.") and k not in keep
            and k != "lapsecalc.shell" and k != "lapsecalc.state"]
    for k in gone:
        del sys.modules[k]
    g = lapsecalc.__dict__
    for n in [n for n in g if type(g[n]) is type(sys) and g[n].__name__ in gone]:
        del g[n]


def _on_board():
    import sys
    return sys.implementation.name == "micropython"


class Session:
    """One interpreter session: the observation, the ELR, balloon settings, display
    units and output mode. feed(line) -> list of output lines.

    svg_writer, when given, is called as svg_writer(name, svg_text) by the svg word and
    returns the line to print (the CPython command line gives one; the core writes no
    files).

    write (an attribute, None by default; repl() sets it): a function that takes text
    and writes it out at once. When set, a query's line of the json mode is written
    through it in pieces, ended by a newline, and the text report section by section,
    while feed() runs; they are not among the lines feed() returns (they come before
    them): a board never makes a whole report's object (about 4 KB in one run of the
    heap) nor holds the text report's lines all at once."""

    def __init__(self, svg_writer=None):
        self.state = {}
        # Display: height, temperature, pressure units; levels as true MSL ("msl") or
        # indicated on QNH ("ind", the heights word).
        self.disp = {"h": "ft", "t": "c", "p": "hpa", "z": "msl"}
        self.mode = "text"
        self.done = False
        self.svg_writer = svg_writer
        self.write = None
        self.checks = []  # "check:" lines of the line being run (a word adds them)
        self._col = self._rep = None
        self._rep_alt = False
        # On a board, a line's modules are dropped after it (drop_line_modules) and the
        # heap collected (an allocation count sets collect_after_line False: it
        # collects between lines itself); what the program had loaded before the
        # Session stays (dropped, the program's next import of it would load a second
        # copy beside the one it holds).
        self.drop_word_modules = self.collect_after_line = _on_board()
        self._kept = ()
        if self.drop_word_modules:
            import sys
            self._kept = [k for k in sys.modules if k.startswith("lapsecalc.")]

    def feed(self, line):
        """Run one line; return its output lines (no newlines in them). In text mode
        an error is "error: ..." wrapped to 40 columns; in kv mode every line is
        key=value or starts "#"; in json mode every line is one JSON object."""
        self.checks = []
        refused = None
        try:
            out = self._run(line)
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

    def _run(self, line):
        # The line's word found (lapsecalc.dispatch), then run: on a board the word
        # tables and the reading of the line are let go of first.
        if not isinstance(line, str):
            raise ValueError("a line must be text")
        if len(line) > MAX_LINE:
            raise ValueError("line of %d characters refused; accepted at most %d"
                             % (len(line), MAX_LINE))
        from lapsecalc.dispatch import find
        todo = find(self, line)
        if todo is None:
            return []
        fn, w, args = todo
        todo = find = None
        if self.drop_word_modules:
            # Here, not through self.drop(): measured, a collection one call deeper
            # left the reading's code held (Unix port 109 -> 113 KiB).
            # The word tables (queries': and the output code, loaded again once the
            # numbers are computed) and the words' other names (lapsecalc.aliases).
            drop_modules(("dispatch", "queries", "aliases"))
            self.collect()
        if fn is not None:
            return fn(self, w, args)
        # A line of settings: read (lapsecalc.settingline, let go of after it), then the
        # new state's Column built.
        from lapsecalc.settingline import read_settings
        new, said, set_words = read_settings(self, args)
        read_settings = None
        if self.drop_word_modules:
            drop_modules(("settingline",))
            self.collect()
            settle(new)  # made among the setters' code: low in the heap now
            self.collect()
        try:
            self.commit(new)
        except ValueError as e:
            # What only the library finds (the new state's column) in the user's terms.
            from lapsecalc.dispatch import retold
            raise ValueError(retold(self, new, e))
        from lapsecalc.output import ack
        return ack(self, said, set_words)

    def _tidy(self):
        # On a board: forget the line's modules and collect. A collection here frees
        # the line's garbage and the dropped modules before the next line allocates
        # among them: less fragmentation (the hard heap limit of the full-word session
        # fell from 186 to 172 KiB).
        import gc
        if self.drop_word_modules:
            self._col = None
            try:
                drop_line_modules(self._kept)
            except MemoryError:  # after a line out of heap: its garbage freed first
                gc.collect()
                drop_line_modules(self._kept)
        if self.collect_after_line:
            gc.collect()

    def _refusal(self, e, line):
        # The error line of a refused line (lapsecalc.dispatch.refusal_text); the fixed
        # form when even the message finds no heap.
        try:
            from lapsecalc.dispatch import refusal_text
            text = refusal_text(self, e, line)
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
            self._col, self._rep = col, None

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

    def drop(self, names):
        """On a board: let go of the lapsecalc modules names (the next import loads
        them afresh) and collect. Nothing on CPython."""
        if self.drop_word_modules:
            drop_modules(names)
            self.collect()

    def read_done(self):
        """On a board: let go of the number reader (lapsecalc.typed, and the height
        reader, the units and the words' other names it loaded) once a word has read
        what was typed after it, before it computes (hold no name of them in a local
        across this call). Nothing on CPython."""
        self.drop(("typed", "heights", "units", "aliases"))

    def release(self, numbers=None):
        """On a board: let go of the Column, the parcel path and the physics code once
        a line's numbers are computed, so that the text layout loads into the heap they
        held. The report kept and numbers (a dict of the word's own results, when
        given) stay, made afresh low in the heap (state.settle): computed among the
        physics' garbage, they lie spread over the heap it leaves, and the text's
        larger pieces (a table of labels is one string of 1.3 to 1.6 KB) find no room
        between them. Nothing on CPython."""
        if self.drop_word_modules:
            self._col = None
            self.drop(PHYSICS_MODULES)
            moved = False
            for kept in (self._rep, numbers):
                if kept is not None:
                    settle(kept)  # into the holes the physics code left
                    moved = True
            if moved:
                self.collect()

    def report(self, word="report"):
        """The current Column.report() (computed once per state; the Column is built
        only to compute it: a board keeps none between lines)."""
        # After "heights ind" every level is shown indicated: the report's own readings
        # (no Column built again for the text).
        alt = word in ALTIMETRY_WORDS or self.disp["z"] == "ind"
        if self._rep is None or (alt and not self._rep_alt):
            col = self.column(word)
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
        chunk = stream.readline(MAX_LINE + 2)
        if not chunk:
            if part:
                yield part
            return
        if after_cr and chunk[0] == "\n":
            chunk = chunk[1:]  # the LF of a CRLF cut between two reads
        after_cr = chunk[-1:] == "\r"
        pieces = split_ends(chunk)
        for piece in pieces[:-1]:
            yield (part + piece)[:MAX_LINE + 2]
            part = ""
        part = (part + pieces[-1])[:MAX_LINE + 2]


def repl(session=None, stream=None, prompt=PROMPT):
    """Run lines until the end of input or bye, printing each line's output (a json
    line written in pieces as it comes: Session.write). Lines come from stream
    (read_lines) when one is given, else from input(), which on a board reads sys.stdin
    with line editing."""
    import sys
    s = session if session is not None else Session()
    if s.write is None:
        s.write = sys.stdout.write  # a json line written as it comes (Session.write)
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
