"""The words that show the report (runs on MicroPython): the groups obs base ice frost
stab parcel thermal (and da without a height), report, and levels and cold (the
altimeter's view of it). Loaded for the word's line by lapsecalc.dispatch
(queries.QUERIES names this module)."""
# Sources: every number comes from the library (Column.report(), lapsecalc.altiwords);
#   this module only picks and orders them.
#
# A word computes first and loads its output code (lapsecalc.queries.emit, the text
# layout) after: on a board the word tables, the words' other names
# (lapsecalc.aliases, read here only to refuse arguments) and that code are not held
# while the report is computed.


def _nothing_after(w, args):
    # Refuse arguments after word w (lapsecalc.aliases.no_args, loaded only then).
    if args:
        from lapsecalc.aliases import no_args
        no_args(w, args)


def group_word(s, w, args):
    """A group of the report (obs base ice frost stab parcel thermal; da with no
    height): its lines."""
    _nothing_after(w, args)
    plus = ()
    if w == "base" and s.state.get("excess_c"):
        # The heated thermals' cloud base beside the unheated one.
        plus = ("thermal_excess_c", "thermal_cloud_base_msl_m")
    more = []
    if w == "base" and s.mode == "text":
        # The other methods' cloud bases: their numbers now, their text (display code)
        # after the report's, so a board's report is computed without that code held.
        for method in ("bolton", "spread"):
            more.append(s.column().cloud_base(method)[0])
    rep = s.report(w)
    s.release()  # before the output code loads (emit would after)
    from lapsecalc.queries import emit
    out = emit(s, w, rep, False, None if plus else w, True, plus)
    if more:
        from lapsecalc.output import f_h
        for label, z in zip(("Bolton LCL", "spread rule"), more):
            out.append("%-13s%s AGL" % (label, f_h(s, z)))
    if w == "parcel" and s.mode == "text":
        from lapsecalc.layout import PARCEL_NOTE
        out.append(PARCEL_NOTE)
    return out


def report(s, w, args):
    _nothing_after(w, args)
    rep = s.report(w)
    if s.mode != "text":
        s.release()
        from lapsecalc.groups import report_keys
        from lapsecalc.queries import emit
        return emit(s, report_keys(rep), rep)
    extra = _altimeter_section(s, rep)
    s.release()
    from lapsecalc.queries import assumed_text
    from lapsecalc.reporttext import report_text
    return report_text(s, rep, extra, assumed_text(s), s.write)


def _altimeter_section(s, rep):
    # The report's altimeter lines (lapsecalc.altitext); [] without loading that code
    # when there can be none: the field is not colder than ISA and the altimeter reads
    # high at no reported level.
    ind = rep.get("indicated_altitude_m") or {}
    if rep.get("isa_deviation_c", 0.0) >= 0.0:
        for k in ind:
            if ind[k] is not None and ind[k] > rep[k]:
                break
        else:
            return []
    from lapsecalc.altitext import altimeter_lines
    return altimeter_lines(s, rep)


def _c_altimeter(s, w, args):
    # levels and cold: their numbers in lapsecalc.altiwords, then their text in
    # lapsecalc.altitext (each loaded for the line).
    if w == "levels":
        # The report first (its heap peak), then, with the report's own code let go
        # of (the Column stays), the altimeter code.
        _nothing_after(w, args)
        s.report(w)
        s.drop(("parcel", "stability", "hazards", "adiabats"))
    from lapsecalc.altiwords import altimeter_word
    keys, vals, warnings = altimeter_word(s, w, args)
    altimeter_word = None
    s.release(vals)  # the Column, the physics and the altimeter's numbers' code
    # The text's largest piece (the labels, one string of 1.6 KB) loaded first, into
    # the heap the physics left (measured on the 32-bit build: the session's lines
    # that fail between 60 and 74 KiB, 117 -> 88 in all).
    from lapsecalc.labels import LABELS  # noqa: F401
    from lapsecalc.altitext import altimeter_text
    keys, vals, text = altimeter_text(s, w, keys, vals, warnings)
    altimeter_text = None
    from lapsecalc.queries import emit, assumed_text
    if s.mode != "text":
        return emit(s, keys, vals)
    return assumed_text(s) + text


# word -> f(session, word, args) -> output lines (a word's own function named after it:
# a board interns the word anyway)
WORDS = {"obs": group_word, "base": group_word, "ice": group_word, "frost": group_word,
         "stab": group_word, "parcel": group_word, "thermal": group_word,
         "report": report, "levels": _c_altimeter, "cold": _c_altimeter}
