"""A line's words read and its first word found in the word tables; a refused line
worded (runs on MicroPython; loaded by Session.feed for each line and, on a board, let go
of before the word runs)."""
# Sources: none of its own.
#
# Session.feed (lapsecalc.shell) calls find(s, line): the word's function and its
# arguments come back, and on a board this module (and the word tables) is let go of
# before the word computes, so a report's heap never holds the reading of the line.
# A line of settings comes back to the shell, which lets go of this module before
# lapsecalc.settingline reads it.
from lapsecalc.aliases import ALIASES, PAIRS, shown, split_number, starts_number, look_up

# The setting words (lapsecalc.settings.SETTINGS) and the session words
# (lapsecalc.commands.COMMANDS), in their tables' order: their modules load only for a
# line that uses them (a board drops them after it).
SETTING_WORDS = ("temp", "dew", "rh", "elev", "qnh", "stn", "elr", "top", "excess", "metar",
                 "env", "wt", "fill", "tmax", "tenv", "gas", "pure", "margin", "superheat",
                 "aloft", "trop")
COMMAND_WORDS = ("clear", "unit", "heights", "out", "help", "bye")
# Words whose line never reads the report and needs much heap of its own: on a board
# the report kept for the session is let go of before such a line (the next line that
# reads it computes it again; measured: the balloon, loads and sunset lines' hard heap
# limit fell by about 9 KiB). A word missing here costs heap, one too many a recompute.
# So too before a line of settings or a clear (most change the air, and the report with
# it; measured: hard limit 117 -> 114 KiB), and da H (as at H: find).
_NO_REPORT = ("balloon", "loads", "sunset", "show", "iso", "at", "help", "cold", "clear") + \
    SETTING_WORDS


def split_line(line):
    """The words of a line: text after "#" is a comment."""
    i = line.find("#")
    return (line[:i] if i >= 0 else line).split()


def other_words():
    """Every word but the settings: the queries (lapsecalc.queries, loaded by a line
    that is not one of settings), then the session words."""
    from lapsecalc.queries import QUERIES
    return tuple(QUERIES) + COMMAND_WORDS


def unknown_word(word, settings_only=False, number_next=False, after=None):
    """The message for a word no table has (lapsecalc.typed.unknown, loaded only then):
    in a line of settings only settings are suggested; after a first word followed by
    a number, only words that take one; after: the word before it."""
    from lapsecalc.typed import unknown
    known = list(SETTING_WORDS)
    if not settings_only:
        # The query words that take a number after them (a first word followed by a
        # number is one of these or a setting).
        known += ["at", "da", "iso", "balloon", "chart"] if number_next else list(other_words())
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


def retold(s, st, e, line=None):
    """The refusal e in session s's words: one in the library's wording (argument
    names, SI) is retold by lapsecalc.retell, loaded only then, after the query word
    of line that met it; st is the state the line was checked in."""
    text = str(e)
    if "=" in text or "_" in text or "degC" in text or "aloft point" in text:
        from lapsecalc.retell import retell
        text = retell(s, st, text)
        w = split_line(line)[:1] if isinstance(line, str) else None
        w = look_up(ALIASES, w[0].lower(), w[0].lower()) if w else ""
        from lapsecalc.queries import QUERIES
        if w in QUERIES and text[:len(w)] != w:
            text = w + ": " + text
    return text


def refusal_text(s, e, line):
    """The text of the error line of a refused line: a ValueError in the user's words
    (retold when the library worded it), anything else as a corner the library did not
    foresee."""
    if isinstance(e, ValueError):
        try:
            text = retold(s, s.state, e, line)
        except MemoryError:  # no room for the retelling code: the library's words
            text = str(e)
        return shown(text, 300)
    return "cannot compute that (%s: %s); nothing changed" % (
        type(e).__name__, shown(str(e), 200))


def find(s, line):
    """(function, word, arguments) of line, the word's function to be called as
    function(s, word, arguments) for its output lines; a line with no words gives
    None. A line of settings comes back as (None, its first word, its words), for
    lapsecalc.settingline.read_settings. ValueError for a line no table knows."""
    words = joined(split_line(line))
    if not words:
        return None
    w = words[0].lower()
    w = look_up(ALIASES, w, w)
    if s.drop_word_modules and s._rep is not None and (
            w in _NO_REPORT or (w == "da" and len(words) > 1)):
        s._rep = None
        s.collect()
    if w in SETTING_WORDS:
        return None, w, words
    from lapsecalc.queries import QUERIES
    if w in QUERIES:  # the word's function, from the module that has it
        f = __import__("lapsecalc." + QUERIES[w], None, None, ["WORDS"]).WORDS[w]
        return f, w, words[1:]
    if w in COMMAND_WORDS:
        from lapsecalc.commands import COMMANDS
        return COMMANDS[w], w, words[1:]
    if starts_number(w):
        raise ValueError("a line starts with a word, e.g. temp 27C (help lists them)")
    raise ValueError(unknown_word(words[0], False, len(words) > 1 and starts_number(words[1])))
