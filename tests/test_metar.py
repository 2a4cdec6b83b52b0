"""METAR reading (lapsecalc.metar): plain asserts, so the file also runs on MicroPython.

Group forms: WMO Manual on Codes (WMO-No. 306), FM 15 METAR, as summarised in
REFERENCES.md, Reports (stated from memory). The reports below are invented: the
station XOMF and its weather do not exist."""
from lapsecalc.metar import parse

# One hundredth of a hectopascal: the A group converts with an exact factor.
HPA_TOL = 0.01


def _refused(text):
    try:
        parse(text)
    except ValueError as e:
        return str(e)
    return None


def test_whole_degrees_and_q_group():
    # TT/TdTd in whole degC, Qpppp in whole hPa (WMO-No. 306 FM 15; REFERENCES.md).
    m = parse("METAR XOMF 121650Z 24010KT 9999 FEW045 24/08 Q1016")
    assert m["t_c"] == 24.0 and m["td_c"] == 8.0 and m["qnh_hpa"] == 1016.0
    assert m["groups"] == ["24/08", "Q1016"]


def test_minus_sign():
    # "M" before a negative value, e.g. M05/M08 (WMO-No. 306 FM 15; REFERENCES.md).
    m = parse("XOMF 010550Z 00000KT 0800 FG M05/M08 Q1030")
    assert m["t_c"] == -5.0 and m["td_c"] == -8.0
    m = parse("XOMF 010550Z 03/M01 Q1002")
    assert m["t_c"] == 3.0 and m["td_c"] == -1.0


def test_a_group_in_inches():
    # Annnn in hundredths of inHg; 1 inHg = 33.8639 hPa (REFERENCES.md, Units).
    m = parse("XOMF 121653Z 18006KT 10SM CLR 31/12 A2992")
    assert abs(m["qnh_hpa"] - 29.92 * 33.8639) < HPA_TOL
    assert abs(m["qnh_hpa"] - 1013.21) < HPA_TOL


def test_q_preferred_over_a():
    m = parse("XOMF 121653Z 20/10 A2992 Q1020")
    assert m["qnh_hpa"] == 1020.0


def test_remark_t_group_gives_tenths():
    # T02560139 = 25.6 / 13.9 degC (REFERENCES.md, Reports: sign digit 0 plus, 1 minus).
    m = parse("XOMF 121653Z 18006KT 10SM FEW050 26/14 A2990 RMK AO2 SLP118 T02560139")
    assert abs(m["t_c"] - 25.6) < 1e-9 and abs(m["td_c"] - 13.9) < 1e-9
    m = parse("XOMF 121653Z M02/M04 A3001 RMK T10171039")
    assert abs(m["t_c"] + 1.7) < 1e-9 and abs(m["td_c"] + 3.9) < 1e-9
    # Temperature only in the remark: the dewpoint stays the whole-degree one.
    m = parse("XOMF 121653Z 10/05 A3001 RMK T0104")
    assert abs(m["t_c"] - 10.4) < 1e-9 and m["td_c"] == 5.0


def test_other_groups_with_slashes_are_skipped():
    # Visibility fractions, runway visual range and missing cloud groups are not
    # temperature groups.
    m = parse("XOMF 121653Z 1/2SM M1/4SM R24/P2000N BKN020/// 15/11 Q0998")
    assert m["t_c"] == 15.0 and m["td_c"] == 11.0 and m["qnh_hpa"] == 998.0


def test_missing_parts():
    m = parse("XOMF 121653Z 15/ Q1011")
    assert m["t_c"] == 15.0 and m["td_c"] is None
    m = parse("xkfl 121653z 15/09")
    assert m["qnh_hpa"] is None and m["td_c"] == 9.0


def test_refusals_name_what_is_accepted():
    assert "TT/TdTd" in _refused("XOMF 121653Z 24010KT 9999 Q1016")
    assert "td_c" in _refused("XOMF 121653Z 10/12 Q1016")
    assert "850..1100" in _refused("XOMF 121653Z 10/02 Q0500")
    assert "at most" in _refused("X " * 100)
    assert _refused("") is not None


def test_missing_groups_clear_the_old_setting():
    # WMO-No. 306 FM 15 (REFERENCES.md): a missing dewpoint is reported as "//"; the
    # older dewpoint or pressure must not pass for part of the new observation.
    from lapsecalc.shell import Session
    s = Session()
    s.feed("elev 100m")
    s.feed("dew 3 qnh 1000")
    out = s.feed("metar XOMF 041350Z 27012KT 9999 14/// Q1009")
    assert out[0].startswith("ok: METAR temp 14.0 C")
    assert any("dew cleared" in line for line in out)
    assert "hum" not in s.state and s.state["press"] == ("qnh", 1009.0)
    out = s.feed("metar XOMF 041350Z 27012KT 9999 M04/M07")
    assert any("QNH cleared" in line for line in out) and "press" not in s.state
    assert s.state["hum"] == ("td", -7.0) and s.state["t_c"] == -4.0
    assert all(len(line) <= 40 for line in out)


def test_vertical_visibility_groups_are_not_temperatures():
    # VVhhh is the vertical visibility in hundreds of ft, VV/// when it is not
    # measured (WMO-No. 306 FM 15; REFERENCES.md, Reports); both hold "/" or digits
    # but are not the TT/TdTd group that follows them.
    m = parse("XOMF 041350Z 00000KT 0100 FG VV/// 02/02 Q1021")
    assert m["t_c"] == 2.0 and m["td_c"] == 2.0 and m["qnh_hpa"] == 1021.0
    assert m["groups"] == ["02/02", "Q1021"]
    m = parse("XOMF 041350Z 00000KT 0200 FG VV002 M01/M01 A3005")
    assert m["t_c"] == -1.0 and m["td_c"] == -1.0
    assert abs(m["qnh_hpa"] - 30.05 * 33.8639) < HPA_TOL
    assert "no temperature group" in _refused("XOMF 041350Z 0100 FG VV/// Q1021")


def test_malformed_temperature_groups_are_refused():
    # TT/TdTd has two digits on each side (WMO-No. 306 FM 15): 5/M03 or 05/M3 is
    # not a temperature group, so a report with only that is refused, naming the form.
    for bad in ("5/M03", "05/M3", "005/M03", "M5/M03", "0A/01"):
        msg = _refused("XOMF 041350Z 24010KT 9999 %s Q1016" % bad)
        assert msg is not None and "TT/TdTd" in msg, bad
    # A well-formed group after the malformed one is read.
    m = parse("XOMF 041350Z 5/M03 05/M03 Q1016")
    assert m["t_c"] == 5.0 and m["td_c"] == -3.0 and m["groups"] == ["05/M03", "Q1016"]


def test_remark_group_needs_both_halves_or_five_characters():
    # RMK T snTTT [snTdTdTd] (REFERENCES.md, Reports): a broken dewpoint half keeps
    # the whole-degree values; a temperature-only remark keeps the whole dewpoint.
    m = parse("XOMF 121653Z 10/05 A3001 RMK T0104X039")
    assert m["t_c"] == 10.0 and m["td_c"] == 5.0
    m = parse("XOMF 121653Z 10/05 A3001 RMK T01041039")
    assert abs(m["t_c"] - 10.4) < 1e-9 and abs(m["td_c"] + 3.9) < 1e-9
    m = parse("XOMF 121653Z 10/05 A3001 RMK T2104")
    assert m["t_c"] == 10.0
    # Only the first remark T group counts.
    m = parse("XOMF 121653Z 10/05 A3001 RMK T01040039 T02000100")
    assert abs(m["t_c"] - 10.4) < 1e-9 and abs(m["td_c"] - 3.9) < 1e-9


def test_other_remark_groups_are_not_the_t_group():
    # The 6-hourly maximum and minimum temperature remarks 1snTTT and 2snTTT
    # (10142 = 14.2 degC; REFERENCES.md, Reports) look like half a T group: only the
    # group starting with T is read.
    m = parse("XKFL 121653Z 10/05 A3001 RMK AO2 10142 20089 T01040039")
    assert abs(m["t_c"] - 10.4) < 1e-9 and abs(m["td_c"] - 3.9) < 1e-9


def test_garbled_groups_are_skipped():
    # A letter O for a zero, an A or Q group with a letter, a group with more
    # slashes: none is read (the report stays readable).
    m = parse("XKFL 121653Z 12/05/24/36 10/05 Q1O16 AX992 QA123")
    assert m["t_c"] == 10.0 and m["td_c"] == 5.0 and m["qnh_hpa"] is None
    assert m["groups"] == ["10/05"]
    # Only the first temperature group counts.
    m = parse("XKFL 121653Z 10/05 Q1016 12/08")
    assert m["t_c"] == 10.0 and m["td_c"] == 5.0 and m["groups"] == ["10/05", "Q1016"]


def test_group_count_limit():
    # At most 80 groups in one report (metar._MAX_GROUPS, named in the refusal).
    body = " ".join(["9999"] * 77)
    assert parse("XKFL 121653Z %s 10/05" % body)["t_c"] == 10.0          # 80 groups
    assert "at most 80" in _refused("XKFL 121653Z %s 9999 10/05" % body)


def test_remark_temperature_range():
    # A temperature-only report is still held to -90..60 degC: -90.5 from the
    # remark group is refused, -89.5 read.
    assert "-90" in _refused("XKFL 121653Z M89/// RMK T1905")
    assert parse("XKFL 121653Z M89/// RMK T1895")["t_c"] == -89.5
    assert "60" in _refused("XKFL 121653Z 60/// RMK T0605")
    assert parse("XKFL 121653Z 59/// RMK T0595")["t_c"] == 59.5
