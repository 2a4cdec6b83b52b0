"""The interpreter's balloon words (balloon, sunset, loads) and their output in text,
kv and json form (runs on MicroPython; loaded only by their lines)."""
# Sources: every number comes from lapsecalc.hotreport, lapsecalc.gasballoon and
#   lapsecalc.loadtable; this
#   module checks the settings the words need, picks and formats.
from lapsecalc.queries import emit, assumed_text


def _balloon_needs(s, w, gas):
    # Refuse a balloon word until its settings are there (hot air or this gas).
    st = s.state
    need = (("env", "env_m3"), ("wt", "wt_kg"), ("fill", "fill_m3") if gas else ("tmax", "tmax_c"))
    miss = [n for n, k in need if k not in st]
    if miss:
        raise ValueError("%s (%s) needs %s: set first, e.g. %s" % (
            w, "gas " + gas if gas else "hot air", ", ".join(miss),
            "gas helium env 10m3 fill 6m3 wt 4kg" if gas else "env 2800m3 wt 450kg tmax 120C"))
    if gas and st["fill_m3"] > st["env_m3"]:
        raise ValueError("%s: fill %g m3 is more than env %g m3; the gas fills at most the"
                         " envelope" % (w, st["fill_m3"], st["env_m3"]))


def _hot_needs(s, w, col, z, t_work):
    # A working envelope temperature below the air at z lifts nothing: said in the
    # display unit, with the words that set it.
    t_air = col.t_at(z)
    if t_work < t_air:
        from lapsecalc.output import f_t, f_h1
        raise ValueError("%s: the working envelope temp %s is below the air (%s at %s);"
                         " set tenv, tmax or margin higher" % (
                             w, f_t(s, t_work, True), f_t(s, t_air, True), f_h1(s, z)))


def _gas_report(s, w, args, gas):
    st = s.state
    col = s.column(w)
    from lapsecalc.heights import height
    z = height(s, w, args, col)
    height = None  # no name of it kept: release() lets go of its code
    s.read_done()
    from lapsecalc.gasballoon import gas_report
    return gas_report(col, gas, st.get("purity", 1.0), st["fill_m3"], st["env_m3"],
                      st["wt_kg"], z, st.get("superheat_k", 0.0))


def balloon(s, w, args):
    st = s.state
    gas = st.get("gas")
    _balloon_needs(s, w, gas)
    if gas:
        return _out(s, "gas", _gas_report(s, w, args, gas))
    return _out(s, "hot", _hot_report(s, w, args))


def _out(s, word, r, rest=True):
    # The lines of balloon report r (word: "hot", "gas" or "sunset") in session s's
    # mode, once the physics is let go of; the text laid out by lapsecalc.balloontext
    # without lapsecalc.layout (a board's text stage holds less).
    s.release(r)
    if s.mode != "text":
        from lapsecalc.balloontext import keys
        return emit(s, keys(word), r, True, None, rest)
    from lapsecalc.balloontext import text_lines
    return text_lines(s, word, r, rest)


def _hot_report(s, w, args):
    # (Its own function: the column and the balloon code are let go of before the text
    # is laid out.) Its functions imported by name: `from lapsecalc import hotreport` (the
    # package's __getattr__) left a reference the board's collector still found during
    # the text stage, holding the balloon and column code (about 19 KiB, Unix port).
    st = s.state
    col = s.column(w)
    from lapsecalc.heights import height
    z = height(s, w, args, col)
    height = None  # no name of it kept: release() lets go of its code
    s.read_done()
    from lapsecalc.hotair import working_envelope_t, DEFAULT_MARGIN_K
    from lapsecalc.hotreport import hot_air_report
    _hot_needs(s, w, col, z, working_envelope_t(
        st["tmax_c"], st.get("tenv_c"), st.get("margin_k", DEFAULT_MARGIN_K)))
    return hot_air_report(col, st["env_m3"], st["wt_kg"], st["tmax_c"], st.get("tenv_c"), z,
                          st.get("margin_k", DEFAULT_MARGIN_K))


def sunset(s, w, args):
    gas = s.state.get("gas")
    if not gas:
        raise ValueError("sunset is for a gas balloon: set gas helium (or h2), env, fill, wt"
                         " and superheat first")
    _balloon_needs(s, w, gas)
    r = _gas_report(s, w, args, gas)
    out = _out(s, "sunset", r, False)
    if s.mode == "text" and "superheat_k" not in s.state:
        out.append("superheat not set: 0 K (superheat 12K)")
    return out


def loads(s, w, args):
    # loads [EMPTY]: the load table at the working temperature, rows every 2000 ft (or
    # 500 m) up to 10000 ft (3000 m) above the field, six field temperatures (few
    # rows: every cell is a lift computed in its own column, and a board pays for each).
    st = s.state
    if st.get("gas"):
        raise ValueError("loads is for a hot-air balloon (gas none); a gas balloon: balloon")
    _balloon_needs(s, w, None)
    if len(args) > 1:
        raise ValueError("loads takes at most an empty weight, e.g. loads 420kg")
    empty = None
    if args:
        from lapsecalc.typed import value
        empty = value(args[0], "w", "kg", 1.0, 20000.0, w)
        value = None
        s.read_done()
    tab = _load_table(s, w, empty)
    if s.mode == "text":
        s.release()  # the numbers are there: a board lets go of the physics first
        from lapsecalc.loadtable import load_table_text
        from lapsecalc.output import wrap
        out = assumed_text(s) + load_table_text(s, tab)
        if tab["oxygen_note"]:
            out.extend(wrap(tab["oxygen_note"], "! "))
        return out
    return emit(s, ("volume_m3", "envelope_t_c", "max_envelope_t_c", "empty_kg", "dewpoint_c",
                    "temps_c", "heights_msl_m", "gross_kg", "payload_kg", "oxygen_note"), tab)


def _load_table(s, w, empty):
    # The load table's numbers (its own function: the column and the balloon code are
    # let go of before the text is laid out).
    st = s.state
    col = s.column(w)
    from lapsecalc.hotair import working_envelope_t, DEFAULT_MARGIN_K
    from lapsecalc.loadtable import load_table
    t_work = working_envelope_t(st["tmax_c"], st.get("tenv_c"),
                                st.get("margin_k", DEFAULT_MARGIN_K))
    ft = s.disp["h"] == "ft"
    return load_table(col, st["env_m3"], t_work, st["tmax_c"], empty,
                      step_m=609.6 if ft else 500.0, depth_m=3048.0 if ft else 3000.0)


# balloon word -> f(session, word, args) -> output lines (each named after its word: a board
# interns the word anyway)
WORDS = {"balloon": balloon, "loads": loads, "sunset": sunset}
