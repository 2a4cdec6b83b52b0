# Freeze manifest (MicroPython's manifest format) for all of lapsecalc a board can
# run: the core (manifest-core.py) and the line interpreter; the same modules as
# lapsecalc/package-full.json. Frozen modules run from the firmware image: their
# bytecode and strings stay in flash, not in the heap. Build steps: README,
# "Building it into the firmware". tests/test_firmware_manifest.py keeps this list
# equal to the mip manifest.
include("manifest-core.py")
package(
    "lapsecalc",
    files=(
        "aloft.py",
        "aloftwords.py",
        "altimetry.py",
        "altitext.py",
        "balloon.py",
        "balloontext.py",
        "chart.py",
        "chartsvg.py",
        "commands.py",
        "demo.py",
        "fieldrisk.py",
        "groups.py",
        "hazards.py",
        "hazardtext.py",
        "helptext.py",
        "icing.py",
        "indicated.py",
        "layout.py",
        "showword.py",
        "balloonwords.py",
        "atwords.py",
        "heights.py",
        "loadtable.py",
        "machine.py",
        "metar.py",
        "output.py",
        "precip.py",
        "queries.py",
        "retell.py",
        "settings.py",
        "shell.py",
        "state.py",
        "thermals.py",
        "typed.py",
        "aliases.py",
        "units.py",
    ),
    base_path="..",
)
