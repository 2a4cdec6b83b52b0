"""JSON text of the interpreter's json mode, written here rather than by a json module:
keys in the order given on every port, numbers without float noise (the digits of
lapsecalc.machine.number_text), the same text as CPython's json.dumps (runs on
MicroPython; loaded only by the json mode)."""
# Sources: RFC 8259 (the JSON text: objects, arrays, strings, escapes, numbers);
#   CPython's json.dumps (separators ", " and ": ", ensure_ascii: every character
#   outside space..~ as \uXXXX in lower-case hex, a pair of surrogates above U+FFFF,
#   \b \t \n \f \r \" \\ as such) and repr(float) (the shortest digits that read back,
#   exponent form below 1e-4 and from 1e16 on): common practice, the writer copies them.
#
# A line is written in pieces (shared strings mostly: keys, separators; a number's
# text as number_text made it when it is already as CPython writes it), joined about
# every 100 pieces into a segment and the segments once at the end (or, for a session
# that writes its output as it comes, the segments written one after the other). On a board a
# collection before each segment puts it in the lowest hole that holds it, so that
# the line finds one run of the heap above the garbage of its numbers (measured,
# hardlimit --lines, the json report: 43 KiB of free heap needed, 45 without).
from lapsecalc.machine import number_text

collect = None  # a board's collection (Session.collect) while line() writes a line


def line(keys, values, rest=None, gc=None, write=None):
    """The JSON object of the keys of values in the order of keys (those values has),
    then rest (a (key, value) pair) if given; floats rounded by their key's family
    (lapsecalc.machine.DECIMALS; a nested dict's own keys name theirs). gc: a board's
    collection (Session.collect), for a long line. write: a function taking text
    (Session.write); when given, the line's segments, once all are made, are written
    through it and then a newline, and None is returned: the line is never made whole
    (on a board, no run of the heap as long as the line)."""
    global collect
    collect = gc
    out = [[]]  # the segments made, then the pieces of the next one
    sep = "{"
    for k in keys:
        if k in values:
            put(out, k, values[k], sep)
            sep = ", "
    if rest is not None:
        put(out, rest[0], rest[1], sep)
    elif sep == "{":
        out.append(sep)
    out.append("}")
    seg(out, 0)
    out = out[0]
    if gc is not None:
        gc()
    collect = None
    if write is None:
        return "".join(out)
    for piece in out:
        write(piece)
    write("\n")
    return None


def seg(out, n=100):
    # The pieces of out (after its list of segments) as one more segment when they
    # are more than n.
    if len(out) > n + 1:
        if collect is not None:
            collect()
        done = out[0]
        out[0] = ""
        done.append("".join(out))
        del out[1:]
        out[0] = done


def put(out, key, v, sep=None):
    """Append to out the JSON text of v, the value of result key key, in pieces; with
    sep, the pair "key": v after sep (a key is a plain name: printable ASCII, no quote
    or backslash, as every key of the interpreter; written as it is)."""
    if sep is not None:
        seg(out)
        out.append(sep)
        out.append('"')
        out.append(key)
        out.append('": ')
    if v is None:
        out.append("null")
    elif v is True:
        out.append("true")
    elif v is False:
        out.append("false")
    elif isinstance(v, float):
        out.append(number(number_text(key, v)))
    elif isinstance(v, str):
        text(out, v)
    elif isinstance(v, dict):
        sep = "{"
        for k in v:
            put(out, k, v[k], sep)
            sep = ", "
        if sep == "{":
            out.append(sep)
        out.append("}")
    elif isinstance(v, (list, tuple)):
        out.append("[")
        sep = ""
        for x in v:
            seg(out)
            out.append(sep)
            put(out, key, x)
            sep = ", "
        out.append("]")
    else:
        out.append(str(v))  # an int


def number(t):
    """The decimal text t of a finite number ("1009", "-0.5", "1.5e-05"; no zero
    ahead of its first digit but in "0.") as CPython writes float(t): "1009.0",
    "-0.5", "1.5e-05"; by string work, so that a board prints the digits of t
    whatever its floats (no noise, float32 alike)."""
    neg = t[:1] == "-"
    if len(t) < 16 and t.find("e") < 0:  # 15 digits at most, below 1e16
        if "." not in t:
            return t + ".0"
        if t[-1:] != "0" and not t.startswith("0.0000", neg):
            return t  # from 1e-4 on, no zero at the end: as CPython writes it
    u = t[neg:]
    i = u.find("e")
    p = 0  # the decimal point: after p digits of d
    if i >= 0:
        p = int(u[i + 1:])
        u = u[:i]
    i = u.find(".")
    if i < 0:
        i = len(u)
    d = u[:i] + u[i + 1:]
    n = len(d)
    d = d.lstrip("0")
    p += i - n + len(d)
    d = d.rstrip("0")
    n = len(d)
    if not n:
        d, n, p = "0", 1, 1
    elif n > 15 or not -307 < p < 309:
        # More digits than every double keeps, or beyond the normal range: the
        # shortest digits that read back are no longer t's own.
        return repr(float(t))
    if -4 < p < 17:
        u = "0" * (1 - p) + d + "0" * (p + 1 - n)  # 0.00d, d.d, d00.0: the point after
        p = max(p, 1)                               # the first max(p, 1) digits
        u = u[:p] + "." + u[p:]
    else:
        u = "%s%s%se%+03d" % (d[0], "." if n > 1 else "", d[1:], p - 1)
    return "-" + u if neg else u


def text(out, s):
    """Append to out the JSON string of s in pieces (see the module's sources); a
    printable ASCII one as it is."""
    b = s.encode("utf-8", "surrogatepass")  # CPython: a lone surrogate too
    out.append('"')
    if not b or 31 < min(b) and max(b) < 127 and b.find(b'"') < 0 and b.find(b"\\") < 0:
        out.append(s)
        out.append('"')
        return
    a = i = 0
    n = len(b)
    while i < n:
        o = b[i]
        if 31 < o < 127 and o != 34 and o != 92:
            i += 1
            continue
        if a < i:
            out.append(b[a:i].decode())
        i += 1
        if o > 127:  # a UTF-8 lead byte: 1 to 3 bytes of 6 bits follow
            m = 1 + (o > 223) + (o > 239)
            o &= 63 >> m
            while m:
                o = o << 6 | b[i] & 63
                i += 1
                m -= 1
        a = i
        if o == 34 or o == 92 or 7 < o < 14 and o != 11:
            m = 6 if o == 34 else 7 if o == 92 else o - 8
            out.append('\\b\\t\\n  \\f\\r\\"\\\\'[2 * m:2 * m + 2])
        elif o > 65535:
            o -= 65536
            out.append("\\u%04x\\u%04x" % (55296 + (o >> 10), 56320 + (o & 1023)))
        else:
            out.append("\\u%04x" % o)
    if a < n:
        out.append(b[a:].decode())
    out.append('"')
