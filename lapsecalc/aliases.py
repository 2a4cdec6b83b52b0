"""The words people type, before any number is read: other names of words (aliases),
two-word names, text safe to show, and where a typed number ends (runs on MicroPython;
loaded by the lines that read words; a slip's nearest word is lapsecalc.typed's,
loaded only for a line that needs one)."""
# Sources: none. lapsecalc.typed (numbers with units) builds on it and re-exports it.


# Other names of words: " typed=word" entries, read by look_up(). Each stands for one
# word only; "alt" (altimeter or altitude?) is refused with both (AMBIGUOUS). One
# string, not a table: a board interns each short string of a table for good.
ALIASES = (" t=temp oat=temp temperature=temp td=dew dp=dew dewpoint=dew humidity=rh"
           " elevation=elev altimeter=qnh frz=ice therm=thermal units=unit bal=balloon"
           " sh=superheat ?=help quit=bye exit=bye ")
AMBIGUOUS = {"alt": "'alt' is the altimeter setting or an altitude: write qnh (qnh"
                    " 29.92inHg), elev (elev 1350ft) or at (at 8000ft)"}
# Two typed words that are one: "field elevation".
PAIRS = {("field", "elevation"): "elev", ("field", "elev"): "elev",
         ("dew", "point"): "dew", ("altimeter", "setting"): "qnh"}


def look_up(table, key, default=None):
    """The value of key in table, a string of " key=value" entries (ALIASES), or
    default when it has none: look_up(ALIASES, "oat") == "temp"."""
    i = table.find(" " + key + "=")
    if i < 0:
        return default
    i += len(key) + 2
    return table[i:table.find(" ", i)]


def shown(text, cap=24):
    """text as it may appear in an output line: printable ASCII, at most cap characters."""
    out = ""
    for ch in text[:cap]:
        out += ch if " " <= ch <= "~" else "?"
    return out + ("..." if len(text) > cap else "")


def split_number(tok):
    """"27.5C" -> ("27.5", "c"); None when tok does not start with a decimal number."""
    n = len(tok)
    i = 1 if n and tok[0] in "+-" else 0
    start, dots = i, 0
    while i < n and ("0" <= tok[i] <= "9" or tok[i] == "."):
        dots += tok[i] == "."
        i += 1
    if i - start - dots < 1 or dots > 1:
        return None
    if i < n and tok[i] in "eE":
        k = j = i + 1 + (i + 1 < n and tok[i + 1] in "+-")
        while k < n and "0" <= tok[k] <= "9":
            k += 1
        if k > j:
            i = k
    return tok[:i], tok[i:].lower()


def no_args(word, args):
    """Refuse anything after a word that takes nothing."""
    if args:
        raise ValueError("%s takes nothing after it; got '%s'" % (word, shown(args[0])))


def starts_number(tok):
    return tok != "" and tok[0] in "0123456789+-."
