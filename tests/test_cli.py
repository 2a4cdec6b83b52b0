"""The command line (lapsecalc.cli, python3 -m lapsecalc) through real subprocesses."""
import os
import subprocess
import sys
import xml.etree.ElementTree as ET

from lapsecalc.demo import DEMO_LINES
from lapsecalc.stability import CAUTIONS

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


def lapsecalc(*args, stdin=None):
    # As from a clean clone: the repository root as the working directory, no install,
    # no PYTHONPATH.
    env = dict(os.environ)
    env.pop("PYTHONPATH", None)
    return subprocess.run([sys.executable, "-m", "lapsecalc"] + list(args), cwd=ROOT, env=env,
                          input=stdin, capture_output=True, text=True, timeout=120)


def test_demo_runs_and_ends_with_the_report_and_cautions():
    p = lapsecalc("demo")
    assert p.returncode == 0, p.stderr
    lines = p.stdout.splitlines()
    assert lines[0] == "lc> " + DEMO_LINES[0]
    assert "Orlenmoor Flats" in lines[0] and "1350 ft" in lines[0]
    assert "lc> report" in lines
    tail = lines[lines.index("lc> report"):]
    assert "-- cautions" in tail
    body = " ".join(line.strip("! ") for line in tail[tail.index("-- cautions") + 1:])
    for caution in CAUTIONS:
        assert caution in body
    assert lines[-1].endswith("licensed practice.")
    assert not [line for line in lines if line.startswith("error:")]
    assert p.stderr == ""


def test_e_lines_run_and_exit():
    p = lapsecalc("-e", "temp 15 dew 5 elev 0 qnh 1013.25 elr 6.5", "-e", "out kv", "-e", "iso 0")
    assert p.returncode == 0, p.stderr
    lines = p.stdout.splitlines()
    assert lines[0].startswith("ok: temp 15 C") and lines[2].startswith("    ELR 6.5")
    assert lines[3] == "ok=out" and lines[4] == "iso_t_c=0"
    # ISA: 0 degC at 15 / 6.5 km = 2307.69 m (ICAO Doc 7488/3 lapse rate).
    assert abs(float(lines[5].split("=")[1]) - 2307.69) < 0.01


def test_e_line_with_an_error_sets_the_status():
    p = lapsecalc("-e", "temp 15", "-e", "tmep 3", "-e", "show")
    assert p.returncode == 1
    lines = p.stdout.splitlines()
    assert lines[0] == "ok: temp 15 C"
    assert lines[1:3] == ["error: unknown word 'tmep'; did you mean",
                          "  'temp'? (help lists the words)"]
    assert lines[3].startswith("temp") and "15.0 C" in lines[3]


def test_stdin_piped_has_no_prompt_and_stops_at_bye():
    p = lapsecalc(stdin="temp 20 dew 10\nelev 0\nout kv\nbase\nbye\ntemp 5\n")
    assert p.returncode == 0, p.stderr
    lines = p.stdout.splitlines()
    assert lines[0] == "ok: temp 20 C, dew 10 C"
    assert "lc>" not in p.stdout
    assert lines[-1].startswith("cloud_layers_msl_m=")
    assert "temp 5" not in p.stdout and len([x for x in lines if x == "ok=out"]) == 1


def test_cr_and_crlf_line_ends_on_stdin_and_in_e():
    # Serial terminals end a line with CR alone or CRLF (common practice).
    p = lapsecalc(stdin="temp 20 dew 10\relev 0\r\nout kv\rbase\r\nbye\rtemp 5\r")
    assert p.returncode == 0, p.stderr
    lines = p.stdout.splitlines()
    assert lines[:3] == ["ok: temp 20 C, dew 10 C", "ok: elev 0 ft (0 m) MSL", "ok=out"]
    assert lines[-1].startswith("cloud_layers_msl_m=") and "temp 5" not in p.stdout
    p = lapsecalc("-e", "temp 20 dew 10\r\nelev 0\rout kv\r", "-e", "base\r\n")
    assert p.returncode == 0, p.stdout
    lines = p.stdout.splitlines()
    assert lines[:3] == ["ok: temp 20 C, dew 10 C", "ok: elev 0 ft (0 m) MSL", "ok=out"]
    assert lines[-1].startswith("cloud_layers_msl_m=")


def test_errors_set_the_status_in_every_mode():
    for mode in ("kv", "json"):
        p = lapsecalc("-e", "out " + mode, "-e", "temp 99")
        assert p.returncode == 1, mode
        assert p.stdout.splitlines()[-1] in ("error=temp 99 C is outside -90..60 C; in F"
                                             " write 99F",
                                             '{"error": "temp 99 C is outside -90..60 C;'
                                             ' in F write 99F"}')


def test_stdin_long_line_is_refused_whole():
    p = lapsecalc(stdin="temp 20 " + "x" * 5000 + " temp 30\nshow\n")
    lines = p.stdout.splitlines()
    assert lines[:2] == ["error: line of 258 characters refused;", "  accepted at most 256"]
    assert lines[2].startswith("temp") and "not set" in lines[2]
    assert p.returncode == 1


def test_svg_option_and_word(tmp_path):
    out = tmp_path / "profile.svg"
    word = tmp_path / "word.svg"
    p = lapsecalc("demo", "-e", "svg " + str(word), "--svg", str(out))
    assert p.returncode == 0, p.stderr
    assert p.stdout.splitlines()[-2:] == ["ok: chart written to %s" % word,
                                          "ok: chart written to %s" % out]
    for f in (out, word):
        root = ET.parse(str(f)).getroot()
        assert root.tag.endswith("svg")
        assert {e.get("id") for e in root.iter("{http://www.w3.org/2000/svg}polyline")} == \
            {"environment", "parcel"}


def test_svg_option_without_a_state_fails_cleanly(tmp_path):
    p = lapsecalc("-e", "temp 20", "--svg", str(tmp_path / "x.svg"))
    assert p.returncode == 1
    assert p.stdout.splitlines()[-1].startswith("error: svg needs dew (or rh), elev")
    assert not (tmp_path / "x.svg").exists()


def test_help_option():
    p = lapsecalc("--help")
    assert p.returncode == 0 and "demo" in p.stdout and "-e LINE" in p.stdout
