"""The whole report in text, section by section (loaded only by the report word in
text mode: a group word's text stage holds lapsecalc.layout without it)."""
# Sources: none; labels and units only (lapsecalc.layout's lines, in the sections of
#   the query words' groups).
from lapsecalc.output import wrap_each as wrap
from lapsecalc.layout import PARCEL_NOTE, text_keys, text_lines, warning_lines

# Section headings of the text report: (heading line, query word of its keys).
SECTIONS = (
    ("-- surface", "obs"),
    ("-- cloud base", "base"),
    ("-- freezing and icing", "ice"),
    ("-- frost, fog, carb icing", "frost"),
    ("-- stability", "stab"),
    ("-- parcel", "parcel"),
    ("-- thermals", "thermal"),
)


def _before(n, key, has):
    # Whether a section of the text report before the n-th (SECTIONS) shows key: as
    # text_keys says (the column top with the stability, not the surface); has is
    # lapsecalc.groups.has (imported once by the caller: an import allocates).
    for m in range(n):
        word = SECTIONS[m][1]
        if key == "top_msl_m":
            if word == "stab":
                return True
        elif has(word, key):
            return True
    return False


def _written(parts, write):
    # With write (Session.write), the sections gathered in parts written out, each line
    # ended by a newline, and let go of.
    if write is not None:
        for sec in parts:
            for line in sec:
                write(line)
                write("\n")
        del parts[:]


def report_text(s, rep, extra=(), head=(), write=None):
    """The whole report in sections (the groups of lapsecalc.groups.REPORT_GROUPS),
    after the lines head: warnings first, then the keys of no group (sorted), cautions
    last; extra, when given, are the altimeter section's lines (lapsecalc.altitext). A
    key of two sections is said in the first. Each section is gathered apart and the
    list returned is made once at its length (on a board the output list is one of a
    line's largest pieces of heap; a list grown line by line doubles). write: a
    function taking text (Session.write); when given, each section is written through
    it as soon as it is made and [] is returned (a board holds one section at a time;
    out of heap midway, the sections before are already said)."""
    from lapsecalc.groups import has
    parts = [head]
    said = warning_lines(s, rep, rep)
    if said:
        parts.append(["-- warnings"] + said)
    _written(parts, write)
    for n in range(len(SECTIONS)):
        heading, word = SECTIONS[n]
        sec = [heading]
        for k in text_keys(word):
            if k in rep and not _before(n, k, has):
                sec.extend(text_lines(s, k, rep[k], rep=rep))
        if word == "parcel":
            sec.append(PARCEL_NOTE)
        parts.append(sec)
        _written(parts, write)
    if extra:
        parts.append(["-- altimeter"] + list(extra))
    sec = ["-- more"]
    for k in sorted(k for k in rep if k != "warnings" and k != "levels_above_top" and
                    k != "cautions" and not _before(len(SECTIONS), k, has)):
        sec.extend(text_lines(s, k, rep[k], rep=rep))
    if len(sec) > 1:
        parts.append(sec)
    parts.append(["-- cautions"] + wrap(rep.get("cautions", ()), "!"))
    _written(parts, write)
    n = 0
    for sec in parts:
        n += len(sec)
    out = [None] * n
    n = 0
    for sec in parts:
        for line in sec:
            out[n] = line
            n += 1
    return out
