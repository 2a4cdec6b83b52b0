"""The aloft and trop words at their edges (lapsecalc.aloftwords): what the ok line
says, the most points, the same level replaced, pressure limits, a dewpoint a hair
over the temperature, a tropopause at sea level. Heights in ft are converted here
(1 ft = 0.3048 m exactly; REFERENCES.md "Units")."""
from lapsecalc.shell import Session

FT = 0.3048


def session(*lines):
    s = Session()
    for line in ("temp 27C dew 13C elev 1350ft",) + lines:
        assert s.feed(line)[0].startswith("ok"), line
    return s


def said(s, line):
    # The reply as one line (continuation lines joined).
    return " ".join(x.strip() for x in s.feed(line))


def test_ok_lines_say_what_was_set():
    s = session()
    assert said(s, "aloft 6000ft 9C/2C 3000ft 15C") == "ok: aloft 6000ft 9C/2C, 3000ft 15C, 2 points set"
    assert said(s, "aloft FL180 -14C") == "ok: aloft FL180 -14C, 3 points set"
    assert said(s, "aloft 3000ft 14C") == "ok: aloft 3000ft 14C, 3 points set"   # replaced
    assert said(s, "trop none") == "ok: tropopause none (no isothermal part)"
    assert said(s, "trop 9km") == "ok: tropopause 9 km (29528 ft)"          # 9000 / 0.3048
    assert s.state["trop_m"] == 9000.0
    assert said(s, "trop off") == "ok: tropopause none (no isothermal part)"
    assert s.state["trop_m"] is None
    s = session()
    assert said(s, "aloft 9000ft 0C") == "ok: aloft 9000ft 0C, 1 point set"


def test_at_most_twenty_four_points():
    s = session()
    for ks in (range(12), range(12, 24)):   # two lines: a line holds 256 characters
        line = "aloft " + " ".join("%dft %dC" % (2000 + 1000 * k, 20 - 2 * k) for k in ks)
        assert s.feed(line)[0].startswith("ok")
    assert len(s.state["aloft"]) == 24
    before = s.snapshot()
    assert said(s, "aloft 27000ft -30C") == (
        "error: aloft 25 points; accepted at most 24 (clear aloft forgets them)")
    assert s.snapshot() == before
    # Replacing a point keeps the count: still accepted.
    assert s.feed("aloft 2000ft 19C")[0].startswith("ok")


def test_levels_half_a_metre_apart_are_two_points():
    # Under 0.01 of the level's unit apart is the same level (replaced); 0.5 m is not.
    s = session()
    assert s.feed("aloft 2000m 5C 2000.5m 4.9C")[0].startswith("ok")
    assert s.state["aloft"] == (("z", 2000.0, 5.0, None), ("z", 2000.5, 4.9, None))
    assert s.feed("aloft 700hPa 0C 699.5hPa -0.1C")[0].startswith("ok")
    assert [pt[:2] for pt in s.state["aloft"][2:]] == [("p", 700.0), ("p", 699.5)]
    # 0.01 m apart exactly (0.26 - 0.25 is 0.010000000000000009 in binary) is two levels.
    s = session("elev -300m")
    assert s.feed("aloft 0.25m 14C 0.26m 14C")[0].startswith("ok")
    assert len(s.state["aloft"]) == 2


def test_pressure_limits_of_a_point():
    # 1..1100 hPa is the range a pressure point is read in; inside it, a point must be
    # under the station pressure and inside the column.
    s = session()
    before = s.snapshot()
    assert said(s, "aloft 1105hPa 20C") == "error: aloft 1105 hPa is outside 1..1100 hPa"
    assert said(s, "aloft 1100hPa 20C").startswith(
        "error: aloft 1100.0 hPa is not above the field: its pressure is not under the"
        " station pressure")
    assert said(s, "aloft 1hPa -50C").startswith("error: aloft 1.0 hPa lands at")
    assert "above the column top" in said(s, "aloft 1hPa -50C")
    assert said(s, "aloft 0.9hPa -50C") == "error: aloft 0.9 hPa is outside 1..1100 hPa"
    assert s.snapshot() == before


def test_a_dewpoint_a_hair_over_the_temperature_is_the_temperature():
    # Within 0.05 K (rounding of typed readings) a dewpoint over its temperature is
    # taken as the temperature; 0.06 K over is refused.
    s = session()
    assert s.feed("aloft 5000ft 5C/5.04C")[0].startswith("ok")
    assert s.state["aloft"] == (("z", 5000 * FT, 5.0, 5.0),)
    assert "dew 5.06 C is above temp 5 C" in said(s, "aloft 5000ft 5C/5.06C")


def test_tropopause_at_sea_level_over_a_field_below_it():
    # trop takes 0 m MSL and up; it must be at least 100 m above the field.
    s = session("elev -300m")
    assert said(s, "trop 0m") == "ok: tropopause 0 m (0 ft)"
    assert s.state["trop_m"] == 0.0
    assert said(s, "trop -1m").startswith("error: ")
    assert s.state["trop_m"] == 0.0


def test_ends_of_the_column_are_taken():
    # A height point may sit at the column top (16000 m by default), not above it; a
    # tropopause exactly 100 m above the field is taken, nearer is refused.
    s = session("elev 0m")
    assert s.feed("aloft 16000m -60C")[0].startswith("ok")
    assert said(s, "aloft 16000.5m -60C").startswith("error: aloft 52495 ft is above the column top")
    assert said(s, "trop 100m") == "ok: tropopause 100 m (328 ft)"
    assert said(s, "trop 99.9m").startswith("error: trop 328 ft is less than 100 m (328 ft)")
    assert s.state["trop_m"] == 100.0


def test_points_in_order_lowest_first_and_the_same_level_replaced():
    # Heights first (lowest first), then pressure levels from the highest pressure; a
    # flight level among them at its standard-atmosphere pressure (FL180 = 18000 ft,
    # about 506 hPa in the ICAO standard atmosphere, from memory; checked here only
    # against 500 and 510 hPa).
    s = session()
    assert s.feed("aloft FL180 -14C 500hPa -15C 4000ft 15C 510hPa -13C FL80 5C 800hPa 2C"
                  " 2000ft 20C")[0].startswith("ok")
    assert [pt[:2] for pt in s.state["aloft"]] == [
        ("z", 2000 * FT), ("z", 4000 * FT), ("p", 800.0), ("fl", 80), ("p", 510.0),
        ("fl", 180), ("p", 500.0)]
    # One more at a time goes in its place; a flight level and a pressure at one level
    # are one point (the later replaces the earlier), so are two equal flight levels.
    from lapsecalc.state import fl_pressure_hpa
    assert s.feed("aloft 3000ft 17C FL100 -2C")[0].startswith("ok")
    assert s.feed("aloft %.4fhPa -14.5C" % fl_pressure_hpa(180))[0].startswith("ok")
    assert s.feed("aloft FL80 4C")[0].startswith("ok")
    assert [pt[:3] for pt in s.state["aloft"]] == [
        ("z", 2000 * FT, 20.0), ("z", 3000 * FT, 17.0), ("z", 4000 * FT, 15.0),
        ("p", 800.0, 2.0), ("fl", 80, 4.0), ("fl", 100, -2.0), ("p", 510.0, -13.0),
        ("p", round(fl_pressure_hpa(180), 4), -14.5), ("p", 500.0, -15.0)]


def test_height_and_flight_level_points_need_no_standard_atmosphere(monkeypatch):
    # Heights and flight levels alone are ordered and merged by their numbers: the
    # standard atmosphere's code (state.fl_pressure_hpa) is not called for them (the
    # whole state's check, later, needs their pressures: not counted here).
    from lapsecalc import aloftwords
    from lapsecalc.settings import parse_level
    called = []
    monkeypatch.setattr(aloftwords, "fl_pressure_hpa", lambda fl: called.append(fl) or 0.0)
    s = Session()
    new = {}
    aloftwords.set_aloft(s, new, "FL180 -14C 3000ft 15C FL50 5C FL100 -2C FL50 4C".split(),
                         parse_level)
    assert [pt[:3] for pt in new["aloft"]] == [
        ("z", 3000 * FT, 15.0), ("fl", 50, 4.0), ("fl", 100, -2.0), ("fl", 180, -14.0)]
    assert called == []
    # A pressure among them: each flight level it meets is converted.
    aloftwords.set_aloft(s, new, ["700hPa", "2C"], parse_level)
    assert called and set(called) <= {50, 100, 180}


def test_heights_exactly_a_hundredth_apart_are_two_points_in_order():
    # 0.02 - 0.01 is exactly 0.01 in binary: not under 0.01, so two levels, the
    # higher after the lower whichever comes first.
    s = session("elev -300m")
    assert s.feed("aloft 0.01m 14C")[0].startswith("ok")
    assert s.feed("aloft 0.02m 13C")[0].startswith("ok")
    assert [pt[:2] for pt in s.state["aloft"]] == [("z", 0.01), ("z", 0.02)]


def test_a_pressure_point_against_the_station_pressure():
    # With a station pressure set, a pressure point is above the field when its
    # pressure is under the station's (967.4 hPa here), not under the pressure that
    # 967.4 hPa as a QNH would give at 411 m (about 918 hPa).
    s = session("elev 411m", "stn 967.4hPa")
    assert s.feed("aloft 950hPa 20C")[0].startswith("ok")
    assert said(s, "aloft 980hPa 20C") == ("error: aloft 980.0 hPa is not above the field:"
                                            " its pressure is not under the station pressure"
                                            " 967.4 hPa")


def test_a_pressure_point_at_the_station_pressure_is_refused():
    # Invented field: station pressure 967 hPa. A point at exactly that pressure is at
    # the field, not above it; a tenth of a hPa under it is aloft.
    s = session("stn 967hPa")
    assert said(s, "aloft 967hPa 20C") == ("error: aloft 967.0 hPa is not above the field:"
                                           " its pressure is not under the station"
                                           " pressure 967.0 hPa")
    assert "aloft" not in s.state
    assert said(s, "aloft 966.9hPa 20C") == "ok: aloft 966.9hPa 20C, 1 point set"
