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
