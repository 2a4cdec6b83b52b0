"""A line of settings read into a copy of the session's state and checked as a whole
(runs on MicroPython; loaded by Session._run for a line of settings once the word
tables, lapsecalc.dispatch, are let go of)."""
# Sources: none of its own.
#
# Each setting word's setter (lapsecalc.settings) writes into the copy; only a line
# that passed every check replaces the state (Session.commit, with the new Column).
from lapsecalc.aliases import ALIASES, starts_number, look_up

# The setting words' modules: let go of on a board once a line's settings are read,
# before the points aloft are checked and the new state's Column is built.
SETTING_MODULES = ("settings", "airsettings", "balloonsettings", "aloftwords", "metar", "typed",
                   "heights")
# The setters' own modules and what only they load (the display code: the ok words are
# said by output.ack after the line is read): let go of before the line is checked as
# a whole.
_SETTER_MODULES = ("airsettings", "balloonsettings", "aloftwords", "metar", "heights", "output")


def read_settings(s, words):
    """The new state of a line of settings (words, the first a setting word) read into
    a copy of session s's state and checked as a whole, and the words of its ok line:
    (new state, what each setting said, the setting words). The new state's Column is
    built by Session.commit (ValueError then in the user's words: retold with it)."""
    from lapsecalc import _forget
    from lapsecalc.settings import SETTINGS, ONE, NUMBERS, whole, setter
    new = dict(s.state)
    said = []
    set_words = []
    i = 0
    while i < len(words):
        w = words[i].lower()
        w = look_up(ALIASES, w, w)
        if w not in SETTINGS:
            from lapsecalc.dispatch import other_words, unknown_word
            if w in other_words():
                raise ValueError("'%s' cannot share a line with settings; give it its"
                                 " own line" % w)
            raise ValueError(unknown_word(words[i], True, False, words[i - 1] if i else None))
        takes, example = SETTINGS[w][1:]
        fn = setter(w)
        j = i + 2 if takes == ONE else len(words)
        if takes == NUMBERS:
            j = i + 1
            while j < len(words) and starts_number(words[j]):
                j += 1
        args = words[i + 1:j]
        if takes == ONE and not args:
            raise ValueError("%s needs a value, %s" % (w, example))
        try:
            said.append(fn(s, new, args))
            set_words.append(w)
        except ValueError as e:
            raise ValueError("%s %s" % (w, e))
        i = j
    if s.drop_word_modules:
        # The setters' own code let go of before the line is checked as a whole
        # (settings.whole loads the standard atmosphere's code for a station pressure).
        fn = None
        _forget(_SETTER_MODULES)
        s.collect()
    try:
        rest = whole(s, new)
        if s.drop_word_modules:
            # On a board the setting words' code is let go of before the points
            # aloft are checked and the new state's Column is built (commit), as
            # a query lets go of the physics before its text.
            fn = whole = SETTINGS = setter = None
            _forget(SETTING_MODULES)
            s.collect()
        if rest is not None:  # ("aloft", late): settings.whole
            from lapsecalc.aloftwords import check_whole
            check_whole(s, new)
            if s.drop_word_modules:
                # Its code let go of again before the Column is built.
                check_whole = None
                _forget(("aloftwords",))
            if rest[1] is not None:
                raise rest[1]
    except ValueError as e:
        # What only the library finds (the points aloft in the standard atmosphere) in
        # the user's terms.
        from lapsecalc.dispatch import retold
        raise ValueError(retold(s, new, e))
    return new, said, set_words
