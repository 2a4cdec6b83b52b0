"""The text layout's tables (lapsecalc.layout, lapsecalc.hazardtext: one string of
";key:label:kind;" entries each, read without allocating) and the result key groups
(lapsecalc.groups: one string per group). Each table is parsed here independently
(plain str.split) and every lookup compared with that parse; the key orders are checked
against the documented rules (group order, then the others sorted, cautions last)."""
import pytest

from lapsecalc import balloontext, groups, hazardtext, layout, reporttext
from lapsecalc.layout import find, field, find_label, word_text, LABELS, WORDS


def parse(table):
    # key -> its fields, by plain splitting (the test's own reading of the format).
    assert table[0] == ";" and table[-1] == ";"
    out = {}
    for e in table[1:-1].split(";"):
        f = e.split(":")
        assert f[0] not in out, "key twice: %s" % f[0]
        out[f[0]] = f[1:]
    return out


TABLES = (("layout.LABELS", LABELS), ("hazardtext.LABELS", hazardtext.LABELS),
          ("layout.WORDS", WORDS), ("hazardtext.WORDS", hazardtext.WORDS),
          ("balloontext.LABELS", balloontext.LABELS))


@pytest.mark.parametrize("name,table", TABLES)
def test_every_entry_is_found_with_its_fields(name, table):
    for key, fields in parse(table).items():
        i = find(table, key)
        assert i >= 0, key
        assert field(table, i) == fields[0], key
        if len(fields) > 1:
            assert field(table, i + len(fields[0]) + 1) == fields[1], key


@pytest.mark.parametrize("name,table", TABLES)
def test_labels_and_words_are_no_keys(name, table):
    # A label, a kind or a word text is never taken for a key, nor a piece of a key.
    parsed = parse(table)
    for key, fields in parsed.items():
        for f in fields:
            if f and f not in parsed:
                assert find(table, f) == -1, f
        for cut in (key[1:], key[:-1], key + "x", "x" + key):
            if cut not in parsed:
                assert find(table, cut) == -1, cut
    assert find(table, "") == -1
    assert find(table, "no_such_key") == -1


def test_a_key_inside_another_key_is_found_alone():
    # "t_c" sits inside "lcl_t_c", "td_c" and others: each finds its own entry.
    assert find_label(LABELS, "t_c") == ("temp", "t")
    assert find_label(LABELS, "lcl_t_c") == ("LCL temp", "t")
    assert find_label(LABELS, "el_msl_m") == ("EL", "z")
    assert find_label(LABELS, "lfc_msl_m") == ("LFC", "z")
    # the first and the last entries
    assert find_label(LABELS, "elevation_m") == ("elevation", "zt")
    assert find_label(LABELS, "notes") == ("", "say-")
    assert find_label(LABELS, "lapse_0_3km_class") == ("", "hide")


def test_find_label_matches_the_parse_and_marks_the_quiet_keys():
    for table in (LABELS, hazardtext.LABELS):
        for key, f in parse(table).items():
            want = (f[0], f[1], True) if f[2:] == ["q"] else (f[0], f[1])
            assert find_label(table, key) == want, key
    quiet = [k for k, f in parse(hazardtext.LABELS).items() if f[2:] == ["q"]]
    # The hazards that say nothing when absent (lapsecalc.hazards: None = not present).
    assert sorted(quiet) == sorted([
        "warm_layer_bottom_msl_m", "warm_layer_top_msl_m", "warm_layer_max_t_c",
        "cold_layer_below_depth_m", "capped_cloud_top_msl_m", "frost_point_c",
        "rh_ice_pct", "icing_band_basis", "icing_layers_msl_m"])
    assert find_label(LABELS, "cautions") is None


def test_word_text_looks_in_the_table_then_in_words():
    assert word_text(hazardtext.WORDS, "glaze") == "freezing rain"
    assert word_text(hazardtext.WORDS, "parcel") == "parcel and air"
    # not in the hazard words: the layout's words, then the value itself
    assert word_text(hazardtext.WORDS, "absolutely_stable") == "abs stable"
    assert word_text(WORDS, "capped") == "capped layer, not cumulus"
    assert word_text(WORDS, "helium") == "helium"
    assert word_text(WORDS, 3) == "3"
    # a word's text is no value of its own
    assert word_text(WORDS, "abs stable") == "abs stable"


def test_every_report_key_of_a_group_has_a_label():
    labels = parse(LABELS)
    labels.update(parse(hazardtext.LABELS))
    for word in groups.REPORT_GROUPS + ("da", "at", "iso"):
        for k in groups.keys(word):
            assert k in labels or k == "stability_layers", (word, k)


def test_group_keys_are_a_fresh_list_each_time():
    a = groups.keys("base")
    assert a == ["cloud_base_agl_m", "cloud_base_msl_m", "lcl_t_c", "lcl_p_hpa",
                 "cloud_layers_msl_m"]
    a.append("x")
    assert "x" not in groups.keys("base")


def test_has_finds_whole_keys_only():
    for word in ("obs", "base", "ice", "frost", "stab", "parcel", "thermal", "at", "iso", "da"):
        keys = groups.keys(word)
        for k in keys:
            assert groups.has(word, k), (word, k)
        # a key's pieces and extensions are no keys (the groups' keys share many)
        for k in keys:
            for cut in (k[1:], k[:-1], k + "_x", "x_" + k):
                assert groups.has(word, cut) == (cut in keys), (word, cut)
    # "t_c" is inside "lcl_t_c" (base) and "td_c" is no part of "t_c": whole keys only
    assert not groups.has("base", "t_c") and groups.has("frost", "t_c")
    assert groups.has("obs", "elevation_m") and groups.has("obs", "top_msl_m")  # both ends
    assert not groups.has("obs", "") and not groups.has("obs", " ")


def test_report_keys_order():
    rep = {"zz_other": 1, "cautions": [], "t_c": 20.0, "aa_other": 2, "cloud_base_msl_m": 1.0,
           "elevation_m": 0.0, "frost_point_c": 1.0, "trigger_t_c": 3.0}
    # group order (obs, base, ..., frost, thermal), t_c once (obs and frost have it),
    # then the others sorted, cautions last
    assert groups.report_keys(rep) == ["elevation_m", "t_c", "cloud_base_msl_m",
                                       "frost_point_c", "trigger_t_c", "aa_other",
                                       "zz_other", "cautions"]
    assert groups.report_keys({"t_c": 1.0}) == ["t_c"]
    assert groups.report_keys({}) == []


def test_the_text_report_says_each_key_once():
    # t_c and td_c belong to the surface and the frost groups, the parcel's freezing
    # level to the icing and the parcel groups: the report says each once, in its first
    # section; every label of the report's keys appears on one line only.
    from lapsecalc.shell import Session
    s = Session()
    s.feed("temp 27C dew 13C elev 1350ft qnh 1016")
    got = s.feed("report")
    rep = s.report()
    for key, label in (("t_c", "temp"), ("td_c", "dewpoint"),
                       ("parcel_freezing_level_msl_m", "parcel 0C")):
        assert key in rep
        assert sum(1 for line in got if line.startswith("%-13s" % label)) == 1, label
    assert got.index("%-13s%s" % ("temp", "   27.0 C")) < got.index("-- cloud base")


class _S:
    # The parts of a Session the text layout reads.
    def __init__(self):
        self.disp = {"h": "ft", "t": "c", "p": "hpa", "z": "msl"}
        self.state = {}


def test_report_text_sections_more_and_head():
    # A made-up result: two surface keys (t_c also in the frost group), one key of no
    # group (said under "-- more", "%.6g"), a caution; the head lines come first.
    rep = {"t_c": 20.0, "td_c": 10.0, "zz_extra": 1.5, "cautions": ["Mind the gap."],
           "warnings": [], "levels_above_top": []}
    got = reporttext.report_text(_S(), rep, (), ["assumed x"])
    assert got == ["assumed x", "-- surface", "temp            20.0 C",
                   "dewpoint        10.0 C", "-- cloud base", "-- freezing and icing",
                   "-- frost, fog, carb icing", "-- stability", "-- parcel",
                   layout.PARCEL_NOTE, "-- thermals", "-- more", "zz_extra     1.5",
                   "-- cautions", "! Mind the gap."]
    # nothing of no group: no "-- more"; the altimeter lines after the thermals
    del rep["zz_extra"]
    got = reporttext.report_text(_S(), rep, ["cold corr x"])
    assert "-- more" not in got
    assert got[got.index("-- thermals") + 1:] == ["-- altimeter", "cold corr x", "-- cautions",
                                                  "! Mind the gap."]


def test_report_text_says_warnings_first():
    from lapsecalc.shell import Session
    s = Session()
    s.feed("temp 27C dew 13C elev 1350ft qnh 1016")
    s.feed("top 3000ft")  # the cloud base and the 0C level lie above this top
    got = s.feed("report")
    heads = [line for line in got if line.startswith("-- ")]
    assert heads[:2] == ["-- warnings", "-- surface"]
    assert got[got.index("-- warnings") + 1].startswith("! base: above the column top")


def test_text_lines_takes_a_label_with_or_without_the_quiet_mark():
    # A label found by find_label in a table of its own (the balloon's) may carry the
    # third item (quiet when None): no line then; a plain (label, kind) says the value.
    from lapsecalc.shell import Session
    s = Session()
    assert layout.text_lines(s, "x_m", None, ("float", "z", True)) == ()
    plain = layout.text_lines(s, "x_m", None, ("float", "z"))
    assert len(plain) == 1 and plain[0].startswith("float")
    assert layout.text_lines(s, "x_m", 1000.0, ("float", "z", True)) == \
        layout.text_lines(s, "x_m", 1000.0, ("float", "z"))


def test_values_within_a_twentieth_of_zero_are_said_as_zero():
    # A temperature is rounded in its display unit, with no "-0.0"; a mass under 0.05
    # kg from zero is said as 0 (no "-0 lb"), from 0.05 out it is rounded as it is.
    # F = 1.8 C + 32 and lb = kg / 0.45359237 (exact definitions): -0.05 C is 31.91 F,
    # -0.04 C is 31.928 F, 0.04 C is 32.072 F, 0.0502 C is 32.09 F, 0.5 C is 32.9 F.
    s = _S()
    s.disp["t"] = "f"
    for v, t, kg in ((-0.05, "   31.9 F", "   -0.1 kg     -0 lb"),
                     (-0.0502, "   31.9 F", "   -0.1 kg     -0 lb"),
                     (-0.04, "   31.9 F", "    0.0 kg      0 lb"),
                     (0.04, "   32.1 F", "    0.0 kg      0 lb"),
                     (0.0502, "   32.1 F", "    0.1 kg      0 lb"),
                     (0.05, "   32.1 F", "    0.1 kg      0 lb"),
                     (0.5, "   32.9 F", "    0.5 kg      1 lb")):
        assert layout._value_text(s, "x", v, "t", None, None) == t, v
        assert layout._value_text(s, "x", v, "kg", None, None) == kg, v
        assert balloontext._value_text(s, "t", v) == t, v
        assert balloontext._value_text(s, "kg", v) == kg, v
    s.disp["t"] = "c"
    assert layout._value_text(s, "x", -0.04, "t", None, None) == "    0.0 C"
    assert layout._value_text(s, "x", -0.04, "dt", None, None) == "   +0.0 K"
    assert balloontext._value_text(s, "dt", -0.04) == "   +0.0 K"


def test_said_kinds_become_marked_lines_or_none():
    # cautions (no label) and warnings (kind say!) are said after "! ", notes (say-)
    # after "- "; the report's warnings (it has levels_above_top) are said apart, as is
    # the balloon's oxygen note (say1: among its warnings).
    s = _S()
    assert layout.text_lines(s, "cautions", ["Mind the gap."]) == ["! Mind the gap."]
    assert layout.text_lines(s, "warnings", ["Too hot."], None, {"warnings": []}) == \
        ["! Too hot."]
    assert layout.text_lines(s, "warnings", ["Too hot."], None,
                             {"warnings": [], "levels_above_top": []}) == ()
    assert layout.text_lines(s, "notes", ["Calm air."], None, {}) == ["- Calm air."]
    assert layout.text_lines(s, "oxygen_note", "Oxygen above 10000 ft.",
                             layout.find_label(balloontext.LABELS, "oxygen_note"), {}) == ()


def test_cloud_layers_each_on_a_line_or_none():
    # Invented dewpoints aloft: two layers with a spread of 3 K or less (the surface's
    # 2 K up to 1167 m, and 2214..2591 m), each "bottom-top" with the top in the other
    # unit too; with every spread over 3 K, "none".
    from lapsecalc.shell import Session
    s = Session()
    for line in ("unit m C hPa", "elev 100m", "temp 8C dew 6C", "stn 1000hPa",
                 "aloft 1000m 3C/2.5C 1500m 0C/-8C 2500m -5C/-6C 3000m -8C/-20C"
                 " 4000m -15C/-30C"):
        assert s.feed(line)[0].startswith("ok"), line
    got = s.feed("report")
    i = got.index("cloud layer  100 m-1167 m (3828 ft)")
    assert got[i + 1] == "             2214 m-2591 m (8500 ft)"
    s.feed("unit ft")
    got = s.feed("base")
    i = got.index("cloud layer  328 ft-3828 ft (1167 m)")
    assert got[i + 1] == "             7265 ft-8500 ft (2591 m)"
    s.feed("dew 0C")
    s.feed("clear aloft")
    s.feed("aloft 1500m 2C/-10C 3000m -8C/-25C")
    assert "cloud layers    none (spread > 3 K)" in s.feed("base")


def test_balloon_kinds_in_the_layout():
    # A fraction as a percentage; a volume in m3 and ft3 (1 ft = 0.3048 m exactly:
    # 1 m3 = 35.3147 ft3), whole from 100 m3, to two decimals below; a mass in kg and
    # lb (1 lb = 0.45359237 kg exactly).
    s = _S()
    for kind, v, want in (("frac", 0.123, "   12.3 %"),
                          ("m3", 250.0, "    250 m3     8829 ft3"),
                          ("m3", 100.0, "    100 m3     3531 ft3"),
                          ("m3", 99.99, "  99.99 m3   3531.1 ft3"),
                          ("kg", 450.0, "  450.0 kg    992 lb")):
        assert layout._value_text(s, "x", v, kind, None, None) == want, (kind, v)
        assert balloontext._value_text(s, kind, v) == want, (kind, v)
