"""A corpus of refused interpreter lines and the check that their wording is the
user's: display units or units typed, no internal names, 40 columns.

Used by tests/test_refusal_words.py and by hand (PYTHONPATH=. python3
tests/refusal_corpus.py lists the
offending refusals)."""
import copy
import random
import re

from lapsecalc.shell import Session

# Display unit systems (a unit line) and the units each makes "spoken".
SYSTEMS = ("unit ft C hPa", "unit m F inHg", "unit m C hPa", "unit ft F inHg")
SETUPS = (
    ("elev 1350ft", "temp 27C dew 13C qnh 1016", "elr 9.5@250m 7.5@2400m 6.5"),
    ("elev 0", "temp -30C dew -35C qnh 1040"),
    ("elev 4500m", "temp 5C rh 30%", "top 9000m"),
    ("elev 200m", "temp 45C dew -10C", "elr 9.8"),
)
MAGNITUDES = ("-1e30", "-100000", "-5000", "-401", "-150", "-91", "-60", "-30", "-0.5",
              "0", "0.001", "0.45", "1", "5", "11", "29.92", "35", "50", "61", "100",
              "150", "151", "400", "700", "849", "1101", "2992", "5000", "9999", "16001",
              "30000", "60000", "1e6", "1e30")
UNITS = {"t": ("", "C", "F", "K"), "h": ("", "ft", "m", "km"),
         "p": ("", "hPa", "inHg", "mmHg", "kPa", "mb"),
         "l": ("", "K/km", "C/1000ft", "C/100m", "F/1000ft"), "rh": ("", "%"),
         "v": ("", "m3", "ft3"), "w": ("", "kg", "lb"), "dt": ("", "K", "C", "F")}
WORDS = {"temp": "t", "dew": "t", "rh": "rh", "elev": "h", "qnh": "p", "stn": "p",
         "elr": "l", "top": "h", "excess": "dt", "env": "v", "wt": "w", "fill": "v",
         "tmax": "t", "tenv": "t", "pure": "rh", "margin": "dt", "superheat": "dt",
         "trop": "h", "at": "h", "da": "h", "iso": "t", "chart": "h", "balloon": "h",
         "sunset": "h", "cold": "h", "loads": "w"}
BALLOON = ("env 2800m3 wt 450kg tmax 120C", "gas he fill 6m3 env 10m3 wt 4kg")
QUERIES = ("report", "obs", "base", "ice", "frost", "da", "stab", "parcel", "thermal",
           "chart", "levels", "cold", "at 3000ft", "balloon", "loads", "show")


def tokens(kind, rng, n):
    """n tokens of quantity kind: magnitudes with each unit, typed or after a space."""
    out = []
    for _ in range(n):
        m = rng.choice(MAGNITUDES)
        u = rng.choice(UNITS[kind])
        out.append(m + (" " if u and rng.random() < 0.2 else "") + u)
    return out


def corpus(seed=13, per_word=14):
    """(context lines, line) pairs, each line run after its context in a new session."""
    rng = random.Random(seed)
    out = []
    for system in SYSTEMS:
        for setup in SETUPS:
            ctx = (system,) + setup
            for word, kind in WORDS.items():
                for tok in tokens(kind, rng, per_word):
                    out.append((ctx, "%s %s" % (word, tok)))
                    if kind in ("h",) and word in ("at", "da", "chart", "balloon", "sunset"):
                        out.append((ctx, "%s %s agl" % (word, tok)))
            # flight levels and indicated heights
            for word in ("at", "da", "balloon"):
                for fl in ("FL0", "FL5", "FL10", "FL85", "FL400", "FL999", "FL-5", "FL1e3"):
                    out.append((ctx, "%s %s" % (word, fl)))
                for tok in tokens("h", rng, 4):
                    out.append((ctx, "%s %s ind" % (word, tok)))
                    out.append((ctx + ("heights ind",), "%s %s" % (word, tok)))
            # elr layers and contradictions among settings
            for _ in range(per_word):
                rate = rng.choice(("-30", "-20", "-10", "-5", "0", "9.8", "15", "30"))
                top = rng.choice(("100ft", "300m", "2km", "9000ft", "15000m", "60000ft"))
                out.append((ctx, "elr %s@%s %s" % (rate, top, rng.choice(("6.5", "-8", "30")))))
                out.append((ctx, "temp %s elr %s top %s" % (
                    rng.choice(("55C", "60C", "140F", "-80C", "-90C")),
                    rng.choice(("-30", "-15", "30", "20")),
                    rng.choice(("16000m", "50000ft", "20km", "3000m")))))
                out.append((ctx, "stn %s elev %s" % (rng.choice(("500hPa", "1080hPa", "14inHg")),
                                                     rng.choice(("0", "4000m", "26000ft")))))
                out.append((ctx, "temp %s dew %s" % (rng.choice(("-20C", "10C", "30F")),
                                                     rng.choice(("-10C", "12C", "40F")))))
                out.append((ctx, "rh %s temp %s" % (rng.choice(("0.1%", "1%", "100%")),
                                                    rng.choice(("-89C", "59C", "-129F")))))
                out.append((ctx, "top %s trop %s" % (rng.choice(("2000ft", "5km", "100000ft")),
                                                     rng.choice(("1000ft", "3km", "none")))))
            # points aloft: extreme, contradictory, several
            for _ in range(per_word):
                lev = rng.choice(("FL600", "FL999", "FL0", "FL10", "FL180", "100hPa", "10hPa",
                                  "1hPa", "1050hPa", "850hPa", "500hPa", "2inHg", "60000ft",
                                  "15km", "500ft", "3000m", "20000ft"))
                t = rng.choice(("-50C", "-89C", "59C", "40C", "-70C", "0C", "-40F", "100F",
                                "10C/12C", "-20C/-60C", "15C/15C"))
                lev2 = rng.choice(("FL100", "FL200", "6000ft", "700hPa", "3km", "400hPa"))
                t2 = rng.choice(("30C", "-60C", "-5C", "20C/-5C", "-80C"))
                out.append((ctx, "aloft %s %s" % (lev, t)))
                out.append((ctx, "aloft %s %s %s %s" % (lev, t, lev2, t2)))
            for b in BALLOON:
                for word in ("balloon", "sunset", "loads"):
                    for tok in tokens("h" if word != "loads" else "w", rng, 3):
                        out.append((ctx + (b,), "%s %s" % (word, tok)))
                for tok in tokens("t", rng, 4):
                    out.append((ctx + (b,), "tmax %s" % tok))
                    out.append((ctx + (b,), "tenv %s" % tok))
    return out


def fuzz_lines(seed=20240604, n=3000):
    """Lines drawn as the shell fuzz draws them (tests/test_shell.py)."""
    from tests.test_shell import VALID, PIECES, mutate
    rng = random.Random(seed)
    out = []
    for _ in range(n):
        ops = [(rng.randrange(6), rng.randrange(300), rng.choice(PIECES + VALID))
               for _ in range(rng.randrange(1, 4))]
        out.append((SETUPS[0], mutate(rng.choice(VALID), ops)))
    return out


_IDENT = re.compile(r"[A-Za-z]\w*_\w+|\b[a-z]\w*=")
# A value stated with its unit after a space ("60 degC"); "27C" is a typed form (an
# example or a hint: "in F write 61F").
_NUM_UNIT = re.compile(r"(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?) (degC|degF|ft|km|m|hPa|inHg|mmHg|kPa|mb|C|F|K)\b")
_SPOKEN = {"ft": ("ft",), "m": ("m", "km"), "c": ("C", "K"), "f": ("F", "K"),
           "hpa": ("hPa", "mb"), "inhg": ("inHg",)}
_KIND = {"ft": "h", "m": "h", "km": "h", "C": "t", "F": "t", "K": "t", "degC": "t",
         "degF": "t", "hPa": "p", "mb": "p", "inHg": "p", "mmHg": "p", "kPa": "p"}


def faults(session, line, lines):
    """What is wrong with the wording of the refusal lines (text mode) of line."""
    bad = []
    for x in lines:
        if len(x) > 40:
            bad.append("over 40 columns: %r" % x)
    text = " ".join(x[2:].strip() if x.startswith("  ") else x for x in lines)
    text = text[len("error: "):]
    bare = re.sub(r"'[^']*'", "''", text)  # words quoted are what the user typed
    for m in _IDENT.finditer(bare):
        bad.append("internal name %r" % m.group(0))
    if "cannot compute that" in text:
        bad.append("not a ValueError")
    typed = line.lower()
    spoken = set()
    for v in session.disp.values():
        spoken.update(_SPOKEN.get(v, ()))
    spoken.add("K")
    for m in _NUM_UNIT.finditer(text):
        num, u = m.group(1), m.group(2)
        if u in spoken or u.lower() in typed:
            continue
        # A value in another unit is fine beside its display-unit twin ("100 m (330
        # ft)", "100 ft (30 m)"), and in a hint for another unit's habit ("for 29.92
        # inHg write 29.92inHg").
        rest = text[m.end():m.end() + 20]
        twin = _NUM_UNIT.match(rest.lstrip(" (")) if rest.lstrip()[:1] == "(" else None
        if twin and twin.group(2) in spoken:
            continue
        before = _NUM_UNIT.search(text[max(0, m.start() - 24):m.start()])
        if text[m.start() - 1:m.start()] == "(" and before and before.group(2) in spoken:
            continue
        if text[max(0, m.start() - 4):m.start()] == "for ":
            continue
        bad.append("%s %s: a unit the user neither chose nor typed" % (num, u))
    for m in re.finditer(r"\d+\.\d{3,}", text):
        if m.group(0) not in line:
            bad.append("%s: more digits than typed or shown" % m.group(0))
    return bad


def run(pairs):
    """[(ctx, line, output, faults)] for the refused lines of pairs (text mode)."""
    bases = {}
    found = []
    for ctx, line in pairs:
        if ctx not in bases:
            s = Session()
            for c in ctx:
                s.feed(c)
            bases[ctx] = s
        s = copy.deepcopy(bases[ctx])
        out = s.feed(line)
        if not (out and out[0].startswith("error:")):
            # taken: the queries of the new state may be refused in their turn
            for q in QUERIES:
                qo = s.feed(q)
                if qo and qo[0].startswith("error:"):
                    found.append((ctx + (line,), q, qo, faults(s, line + " " + q, qo)))
            continue
        found.append((ctx, line, out, faults(s, line, out)))
    return found


if __name__ == "__main__":
    import sys
    pairs = corpus() + fuzz_lines()
    res = run(pairs)
    bad = [r for r in res if r[3]]
    print("lines %d, refusals %d, faulty %d" % (len(pairs), len(res), len(bad)))
    seen = set()
    for ctx, line, out, f in bad:
        key = re.sub(r"-?[\d.]+", "N", out[0][:28])
        if key in seen and "-v" not in sys.argv:
            continue
        seen.add(key)
        print("---", ctx[0], "|", line)
        print("\n".join(out))
        print("  =>", f)
