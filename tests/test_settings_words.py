"""The setting words (lapsecalc.settings) as a user meets them: acknowledgements in the
units typed and the display units, the hints for another unit's habit and their edges,
the checks of a whole line. Expected values from exact unit factors (REFERENCES.md,
Units: 1 ft = 0.3048 m, 1 lb = 0.45359237 kg, 1 inHg = 33.8639 hPa, 1 mmHg =
1.333224 hPa, F = C * 1.8 + 32)."""
import pytest

from lapsecalc.shell import Session
from lapsecalc.settings import parse_level, echo, SETTINGS, ONE, NUMBERS, REST


def feed(s, line):
    # Wrapped lines joined back into one.
    out = []
    for x in s.feed(line):
        if x.startswith("  ") and out:
            out[-1] += " " + x.strip()
        else:
            out.append(x)
    return out


def run(script, *setup):
    s = Session()
    for line in setup:
        s.feed(line)
    for line, want in script:
        assert feed(s, line) == want, line
    return s


def test_acknowledgements_in_the_units_typed_and_shown():
    run([
        ("wt 1500lb", ["ok: weight 1500 lb (680 kg)"]),          # 680.39 kg
        ("wt 100lb", ["ok: weight 100 lb (45.4 kg)"]),           # 45.36 kg
        ("wt 20lb", ["ok: weight 20 lb (9.07 kg)"]),             # 9.072 kg
        ("env 100000ft3", ["ok: envelope 100000 ft3 (2832 m3)"]),  # 2831.7 m3
        ("fill 10ft3", ["ok: fill 10 ft3 (0.28 m3)"]),           # 0.2832 m3
        ("qnh 29.92inHg", ["ok: QNH 29.92 inHg (1013.2 hPa)"]),  # 1013.21 hPa
        ("qnh 760mmHg", ["ok: QNH 760 mmHg (1013.2 hPa)"]),      # 1013.25 hPa
        ("qnh 101.3kPa", ["ok: QNH 101.3 kPa (1013.0 hPa)"]),
        ("stn 967.4hPa", ["ok: station 967.4 hPa"]),
        ("qnh 1016", ["ok: QNH 1016 hPa"]),
        ("elev 1350ft", ["ok: elev 1350 ft (411 m) MSL"]),       # 411.48 m
        ("elev 411m", ["ok: elev 411 m (1348 ft) MSL"]),         # 1348.4 ft
        ("elev 1.5km", ["ok: elev 1.5 km (4921 ft) MSL"]),       # 4921.3 ft
        ("top 30000ft", ["ok: top 30000 ft (9144 m) MSL"]),
        ("trop 36000ft", ["ok: tropopause 36000 ft (10973 m)"]),  # 10972.8 m
        ("trop none", ["ok: tropopause none (no isothermal part)"]),
        ("unit F", ["ok: units ft F hPa"]),
        ("temp 80", ["ok: temp 80 F"]),
        ("temp 27C", ["ok: temp 27 C (80.6 F)"]),
        ("temp 300K", ["ok: temp 300 K (80.3 F)"]),              # 26.85 C
        ("excess 2F", ["ok: excess 2 F (+1.1 K)"]),              # 2 / 1.8
        ("excess 2", ["ok: excess 2 K"]),
        ("margin 18F", ["ok: margin 18 F (+10.0 K) below tmax"]),
        ("superheat 9F", ["ok: superheat 9 F (+5.0 K)"]),
        ("superheat 0", ["ok: superheat 0 K"]), ("margin 0", ["ok: margin 0 K below tmax"]),
        ("excess 0", ["ok: excess 0 K"]),
        ("tmax 120C", ["ok: tmax 120 C (248.0 F)"]),
        ("tenv 95C", ["ok: tenv 95 C (203.0 F)"]),
        ("pure 98%", ["ok: purity 98 %"]),
        ("gas h2", ["ok: gas hydrogen"]), ("gas HE", ["ok: gas helium"]),
        ("gas none", ["ok: gas none (hot air)"]),
        ("unit m C", ["ok: units m C hPa"]),
        ("elev 1350ft", ["ok: elev 1350 ft (411 m) MSL"]),
        ("elev 411", ["ok: elev 411 m (1348 ft) MSL"]),
        ("temp 27", ["ok: temp 27 C"]),
        ("temp 80.6F", ["ok: temp 80.6 F (27.0 C)"]),
    ])


def test_lapse_rates_and_layers():
    run([
        ("elr 6.5", ["ok: ELR 6.5 K/km (1.98 C/1000ft)"]),      # 6.5 * 0.3048
        ("elr 2C/1000ft", ["ok: ELR 6.6 K/km (2.00 C/1000ft)"]),  # 6.56 K/km
        ("elr -5@300m 8@2km 6.5", ["ok: ELR -5@984ft 8@6562ft 6.5 K/km"]),
        ("elr 8@1000 6", ["ok: ELR 8@1000ft 6 K/km"]),
        ("elr 8@0 6", ["error: elr layer top 0 ft is not above the field"]),
        ("elr 8@1 6", ["error: elr layer top 1 ft is not above the field"]),   # 0.3 m
        ("elr 8@300m 7@300.5m 6", [
            "error: elr layer top 300.5 m is not above the layer below (984 ft AGL)"]),
        ("elr 8", ["ok: ELR 8.0 K/km (2.44 C/1000ft)"]),
        ("elr 8@1km", ["ok: ELR 8@3281ft K/km"]),
        ("elr 8@1km 7", ["ok: ELR 8@3281ft 7 K/km"]),
        ("elr 8 7", ["error: elr '8' has no @top; only the last layer runs to the column top"]),
        ("elr 8@1@2 7", ["error: elr '8@1@2': one @ per layer, e.g. 8@2km"]),
        ("elr " + " ".join(["1@%dm" % (100 * k) for k in range(1, 13)]),
         ["ok: ELR " + " ".join("1@%dft" % round(100 * k / 0.3048) for k in range(1, 13))
          + " K/km"]),
        ("elr " + " ".join(["1@%dm" % (100 * k) for k in range(1, 14)]),
         ["error: elr 13 layers; accepted at most 12"]),
        ("elr", ["error: elr needs a rate, e.g. elr 6.5 or elr -5@300m 8@2km 6.5"]),
    ], "unit ft")
    # one metre above the layer below: accepted (the least step)
    run([("elr 8@300m 7@301m 6", ["ok: ELR 8@984ft 7@988ft 6 K/km"])])


def test_hints_for_another_units_habit_at_their_edges():
    # Inches typed bare in hPa: 2500..3300 (25.00..33.00 inHg without the point) and
    # 25..33; hPa typed bare in inHg: 850..1100.
    run([
        ("qnh 3300", ["error: qnh 3300 hPa is outside 850..1100 hPa; for 33.00 inHg write"
                      " 33.00inHg"]),
        ("qnh 3333", ["error: qnh 3333 hPa is outside 850..1100 hPa"]),
        ("qnh 2500", ["error: qnh 2500 hPa is outside 850..1100 hPa; for 25.00 inHg write"
                      " 25.00inHg"]),
        ("qnh 2499", ["error: qnh 2499 hPa is outside 850..1100 hPa"]),
        ("stn 3012", ["error: stn 3012 hPa is outside 240..1100 hPa; for 30.12 inHg write"
                      " 30.12inHg"]),
        ("qnh 25", ["error: qnh 25 hPa is outside 850..1100 hPa; for inches write 25inHg"]),
        ("stn 29.92", ["error: stn 29.92 hPa is outside 240..1100 hPa; for inches write"
                       " 29.92inHg"]),
        ("qnh 33", ["error: qnh 33 hPa is outside 850..1100 hPa; for inches write 33inHg"]),
        ("qnh 33.3", ["error: qnh 33.3 hPa is outside 850..1100 hPa"]),
        ("qnh 24.9", ["error: qnh 24.9 hPa is outside 850..1100 hPa"]),
        ("qnh 29.92mb", ["error: qnh 29.92 mb is outside 850..1100 mb; for inches write"
                         " 29.92inHg"]),
        ("unit inHg", ["ok: units ft C inHg"]),
        # 850..1100 hPa is 25.10..32.48 inHg
        ("qnh 850", ["error: qnh 850 inHg is outside 25.1..32.48 inHg; for hPa write 850hPa"]),
        ("qnh 1100", ["error: qnh 1100 inHg is outside 25.1..32.48 inHg; for hPa write"
                      " 1100hPa"]),
        ("qnh 849", ["error: qnh 849 inHg is outside 25.1..32.48 inHg"]),
        ("qnh 1101", ["error: qnh 1101 inHg is outside 25.1..32.48 inHg"]),
        ("qnh 500", ["error: qnh 500 inHg is outside 25.1..32.48 inHg"]),
        ("qnh 3012hPa", ["error: qnh 3012 hPa is outside 850..1100 hPa; for 30.12 inHg"
                         " write 30.12inHg"]),
    ])


def test_temperatures_that_look_like_fahrenheit():
    # A bare number refused in C that lies in -90..60 C read as F gets the hint:
    # -130 F = -90 C and 140 F = 60 C exactly; 141 F = 60.6 C is beyond.
    run([
        ("temp -130", ["error: temp -130 C is outside -90..60 C; in F write -130F"]),
        ("temp 140", ["error: temp 140 C is outside -90..60 C; in F write 140F"]),
        ("temp 141", ["error: temp 141 C is outside -90..60 C"]),
        ("temp -131", ["error: temp -131 C is outside -90..60 C"]),
        ("temp 140C", ["error: temp 140 C is outside -90..60 C"]),     # a unit typed: no hint
        ("temp 61.0", ["error: temp 61.0 C is outside -90..60 C; in F write 61.0F"]),
        ("temp +61", ["error: temp 61 C is outside -90..60 C"]),   # not typed as digits alone
        ("temp 50", ["ok: temp 50 C"]),
        ("temp 50.5", ["ok: temp 50.5 C", "check: temp 50.5 C is hotter than any surface air"
                                           " on record; in F write 50.5F"]),
        ("temp 55", ["ok: temp 55 C", "check: temp 55 C is hotter than any surface air on"
                                      " record; in F write 55F"]),
        ("dew 32", ["ok: dew 32 C"]),
        ("dew 32.1", ["ok: dew 32.1 C", "check: dew 32.1 C is higher than any dewpoint on"
                                        " record; in F write 32.1F"]),
        ("dew 33", ["ok: dew 33 C", "check: dew 33 C is higher than any dewpoint on record;"
                                    " in F write 33F"]),
        ("dew 60F", ["ok: dew 60 F (15.6 C)"]),
        ("temp 20 dew 59", ["error: dew 59.0 C is above temp 20.0 C; a dewpoint cannot"
                            " exceed the temperature"]),
        ("temp 20 dew 20.04", ["ok: temp 20 C, dew 20.04 C"]),   # within 0.05 K: rounding
        ("temp 20 dew 20.05", ["ok: temp 20 C, dew 20.05 C"]),   # 0.05 K over: still taken
        ("temp 20 dew 20.06", ["error: dew 20.1 C is above temp 20.0 C; a dewpoint cannot"
                               " exceed the temperature"]),
    ])


def test_humidity_as_a_fraction_is_asked_back():
    run([
        ("rh 1", ["ok: rh 1 %", "check: rh 1 %? for 100 % write 100%"]),
        ("rh 1.005", ["ok: rh 1.005 %"]),
        ("rh 0.45", ["ok: rh 0.45 %", "check: rh 0.45 %? for 45 % write 45%"]),
        ("rh .5", ["ok: rh 0.5 %", "check: rh 0.5 %? for 50 % write 50%"]),
        ("rh 45%", ["ok: rh 45 %"]),
        ("rh 0", ["error: rh 0 % has no dewpoint; accepted above 0 up to 100 %"]),
        ("rh 100.1", ["error: rh 100.1 % is outside 0..100 %"]),
    ])


def test_whole_line_checks():
    run([
        ("elev 1350ft stn 500hPa", [
            "error: stn 500.0 hPa at elev 1350 ft gives a QNH outside 850..1100 hPa; check"
            " both"]),
        ("elev 1350ft top 1600ft", [
            "error: top 1600 ft is less than 100 m (328 ft) above the field (1350 ft)"]),
        ("elev 1350ft top 1700ft", ["ok: elev 1350 ft (411 m) MSL, top 1700 ft (518 m) MSL"]),
        # exactly 100 m above the field is enough (100 m = 328.08 ft)
        ("elev 0 top 100m", ["ok: elev 0 ft (0 m) MSL, top 100 m (328 ft) MSL"]),
        ("elev 0 top 99.9m", ["error: top 328 ft is less than 100 m (328 ft) above the field"
                              " (0 ft)"]),
        ("tmax 90C tenv 95C", ["error: working temp tenv 95.0 C is above the maximum tmax"
                               " 90.0 C; allowed up to tmax"]),
        ("tmax 95C tenv 95C", ["ok: tmax 95 C, tenv 95 C"]),
        ("tmax 49C", ["error: tmax 49 C is outside 50..150 C"]),
        ("tenv -91C", ["error: tenv -91 C is outside -90..150 C"]),
        ("metar XOMF 121650Z 24010KT 9999 24/M02 Q1016", [
            "ok: METAR temp 24.0 C, dew -2.0 C, QNH 1016.0 hPa"]),
        ("metar XOMF 121650Z 24010KT 9999 24/// ", [
            "ok: METAR temp 24.0 C, no dewpoint in it (dew cleared), no pressure in it"
            " (QNH cleared)"]),
        ("show", None),
    ][:-1])


def test_metar_clears_what_it_lacks():
    s = run([], "temp 10C dew 5C qnh 1020")
    s.feed("metar XOMF 121650Z 24010KT 9999 24///")
    assert s.state["t_c"] == 24.0 and "hum" not in s.state and "press" not in s.state
    s.feed("metar XOMF 121650Z 24010KT 9999 24/M02 A2992")
    assert s.state["hum"] == ("td", -2.0)
    assert s.state["press"][1] == pytest.approx(29.92 * 33.8639, abs=0.01)


def test_parse_level():
    assert parse_level("3000ft") == ("z", pytest.approx(914.4))
    assert parse_level("914m") == ("z", 914.0)
    assert parse_level("2.5km") == ("z", 2500.0)
    assert parse_level("FL180") == ("fl", 180) and parse_level("fl5") == ("fl", 5)
    assert parse_level("FL999") == ("fl", 999) and parse_level("FL0") == ("fl", 0)
    assert parse_level("700hPa") == ("p", 700.0) and parse_level("700mb") == ("p", 700.0)
    assert parse_level("29.92inHg") == ("p", pytest.approx(1013.21, abs=0.01))
    for tok in ("FL", "FL1000", "FLx", "FL-5", "fl1.5"):
        with pytest.raises(ValueError, match="is not a flight level; accepted FL0..FL999"):
            parse_level(tok)
    for tok in ("3000", "700", "abc", "3000C", "-", ""):
        with pytest.raises(ValueError, match="is not a level; accepted a height with its unit"):
            parse_level(tok)


def test_derived_amounts_at_a_sensible_precision():
    # Three significant digits or whole units: 680, 45.4, 9.07, 0.28 (an amount typed in
    # lb said back in kg, one in ft3 in m3).
    s = Session()
    xs = (680.389, 100.0, 99.94, 45.359, 10.0, 9.996, 9.0718, 0.2832)
    assert [echo(s, "1lb", "w", "kg", x) for x in xs] == [
        "1 lb (%s kg)" % t for t in ("680", "100", "99.9", "45.4", "10.0", "10.00", "9.07",
                                     "0.28")]
    assert echo(s, "2ft3", "v", "m3", 0.0566) == "2 ft3 (0.06 m3)"
    assert echo(s, "2kg", "w", "kg", 2.0) == "2 kg"


def test_what_each_setting_takes():
    takes = dict((w, SETTINGS[w][1]) for w in SETTINGS)
    assert takes["elr"] == NUMBERS and takes["metar"] == REST and takes["aloft"] == REST
    assert all(takes[w] == ONE for w in ("temp", "dew", "rh", "elev", "qnh", "stn", "top",
                                          "trop", "tmax", "tenv", "gas", "pure"))
    assert len(set((ONE, NUMBERS, REST))) == 3


def test_a_slip_of_a_unit_after_a_number_is_suggested_as_a_unit():
    # Never a word of another kind ("elev 6500 fet" once suggested the word dew).
    run([
        ("elev 6500 fet", ["error: unknown word 'fet' after 6500; did you mean the unit:"
                           " 6500 feet?"]),
        ("qnh 1016 hpaa", ["error: unknown word 'hpaa' after 1016; did you mean the unit:"
                           " 1016 hPa?"]),
        ("elev 6500 ftt qnh 1016", ["error: unknown word 'ftt' after 6500; did you mean the"
                                    " unit: 6500 ft?"]),
        ("temp 20 tmep 5", ["error: unknown word 'tmep'; did you mean 'temp'? (help lists"
                            " the words)"]),
        ("temp 20 xyzzy", ["error: unknown word 'xyzzy'; (help lists the words)"]),
        ("elev 6500 ft", ["ok: elev 6500 ft (1981 m) MSL"]),
    ])


def test_points_aloft_against_the_station_pressure():
    # A pressure point must lie under the station pressure: the one set (stn), or
    # from QNH (1013.25 hPa, standard, when none) at the field.
    run([
        ("elev 1350ft stn 967hPa", ["ok: elev 1350 ft (411 m) MSL, station 967 hPa"]),
        ("aloft 950hPa 15C", ["ok: aloft 950hPa 15C, 1 point set"]),
        ("aloft 967hPa 15C", ["error: aloft 967.0 hPa is not above the field: its pressure"
                              " is not under the station pressure 967.0 hPa"]),
        ("clear", ["ok: cleared all settings"]),
        ("elev 0", ["ok: elev 0 ft (0 m) MSL"]),
        ("aloft 1013hPa 10C", ["ok: aloft 1013hPa 10C, 1 point set"]),
        ("aloft 1020hPa 10C", ["error: aloft 1020.0 hPa is not above the field: its pressure"
                               " is not under the station pressure 1013.2 hPa"]),
        ("qnh 1030", ["ok: QNH 1030 hPa"]),
        ("aloft 1020hPa 10C", ["ok: aloft 1020hPa 10C, 2 points set"]),
    ])


def test_whole_state_checks_at_their_edges():
    # settings.whole: a dewpoint up to 0.05 K over the temperature is rounding (limits
    # DEW_SLACK_K); a column top exactly 100 m above the field is allowed; a working
    # envelope temperature equal to the maximum is allowed.
    from lapsecalc.shell import Session
    s = Session()
    assert s.feed("temp 20C")[0].startswith("ok")
    assert s.feed("dew 20.05C") == ["ok: dew 20.05 C"]
    assert s.feed("dew 20.06C")[0] == "error: dew 20.1 C is above temp 20.0 C;"
    assert s.feed("elev 1000m") == ["ok: elev 1000 m (3281 ft) MSL"]
    assert s.feed("top 1100m") == ["ok: top 1100 m (3609 ft) MSL"]
    assert s.feed("top 1099m")[0] == "error: top 3606 ft is less than 100 m"
    assert s.feed("tmax 120C tenv 120C") == ["ok: tmax 120 C, tenv 120 C"]
    assert s.feed("tenv 120.1C")[0] == "error: working temp tenv 120.1 C is"
    # Points aloft are checked whether or not a tropopause is set.
    assert s.feed("aloft 900m 20C")[0] == "error: aloft 2953 ft is not above the"
    assert s.feed("trop 1050m")[0].startswith("error: trop")


def test_elr_takes_the_run_of_numbers_after_it():
    # elr reads every number after it and no word: the next setting starts there.
    from lapsecalc.shell import Session
    s = Session()
    assert s.feed("elr 6.5 temp 20C") == ["ok: ELR 6.5 K/km (1.98 C/1000ft),", "    temp 20 C"]
    assert s.feed("elr -4@200m 9.5@820ft 6.5 excess 2C")[0].startswith("ok: ELR")
    assert s.state["excess_c"] == 2.0 and len(s.state["lapse"]) == 3
    assert s.feed("elr excess 2C") == ["error: elr needs a rate, e.g. elr 6.5 or",
                                       "  elr -5@300m 8@2km 6.5"]


def test_a_balloon_setting_loads_its_own_module_and_an_air_one_does_not():
    # The balloon's setters live in lapsecalc.balloonsettings, which SETTINGS names:
    # a line that sets the air never loads it (a board's heap), one that sets a
    # balloon does, and settings.setter finds each word's setter.
    import sys
    import lapsecalc
    from lapsecalc import settings
    sys.modules.pop("lapsecalc.balloonsettings", None)
    lapsecalc.__dict__.pop("balloonsettings", None)
    s = Session()
    assert feed(s, "temp 20C dew 5C elev 300m") == [
        "ok: temp 20 C, dew 5 C, elev 300 m (984 ft) MSL"]
    assert "lapsecalc.balloonsettings" not in sys.modules
    assert feed(s, "env 2800m3 tmax 120C") == ["ok: envelope 2800 m3, tmax 120 C"]
    assert s.state["env_m3"] == 2800.0 and s.state["tmax_c"] == 120.0
    from lapsecalc import airsettings, balloonsettings
    for w in SETTINGS:
        f = settings.setter(w)
        if w in balloonsettings.SETTERS:
            assert SETTINGS[w][0] == "balloonsettings" and f is balloonsettings.SETTERS[w]
        elif w in airsettings.SETTERS:
            assert SETTINGS[w][0] == "airsettings" and f is airsettings.SETTERS[w]
        else:
            assert f is SETTINGS[w][0] and callable(f)
    assert sorted(balloonsettings.SETTERS) + sorted(airsettings.SETTERS) == sorted(
        w for w in SETTINGS if SETTINGS[w][0] == "balloonsettings") + sorted(
        w for w in SETTINGS if SETTINGS[w][0] == "airsettings")
    assert sorted(w for w in SETTINGS if not isinstance(SETTINGS[w][0], str)) == [
        "aloft", "trop"]


def test_a_line_of_points_aloft_loads_no_other_setters_nor_the_display_code():
    # The air's setters (lapsecalc.airsettings), the balloon's and the display code
    # (lapsecalc.output) load only for the lines that need them: a line of points aloft
    # (on a board also reading a flight level's pressure) holds none of them.
    # (The ok line's words are said by output.ack once the line is read and checked.)
    import sys
    import lapsecalc
    from lapsecalc.settingline import read_settings
    s = Session()
    feed(s, "temp 20C dew 5C elev 300m")
    for m in ("airsettings", "balloonsettings", "output"):
        sys.modules.pop("lapsecalc." + m, None)
        lapsecalc.__dict__.pop(m, None)
    new, said, words = read_settings(s, ["aloft", "FL100", "2C", "700hPa", "3C"])
    assert said == ["aloft FL100 2C, 700hPa 3C, 2 points set"] and words == ["aloft"]
    # Lowest first: FL100 lies at 696.8 hPa in the standard atmosphere (common
    # practice), above the 700 hPa level.
    assert new["aloft"] == (("p", 700.0, 3.0, None), ("fl", 100, 2.0, None))
    for m in ("airsettings", "balloonsettings", "output"):
        assert "lapsecalc." + m not in sys.modules, m
    assert read_settings(s, ["temp", "22C"])[1] == ["temp 22 C"]
    assert "lapsecalc.airsettings" in sys.modules and "lapsecalc.output" in sys.modules


def test_a_temperature_typed_in_deg_units_is_echoed_once_in_its_own_unit():
    # "degC" and "degF" are the display unit's own: said back without a conversion;
    # in the other unit converted (F = 1.8 C + 32, exact).
    s = Session()
    assert feed(s, "temp 27degC") == ["ok: temp 27 C"]
    assert feed(s, "temp 80.6degF") == ["ok: temp 80.6 F (27.0 C)"]
    s.feed("unit F")
    assert feed(s, "temp 80degF") == ["ok: temp 80 F"]
    assert feed(s, "temp 27degC") == ["ok: temp 27 C (80.6 F)"]
