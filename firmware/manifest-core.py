# Freeze manifest (MicroPython's manifest format) for the lapsecalc core: what a
# weather station or a handheld needs (the same modules as lapsecalc/package.json).
# Frozen modules run from the firmware image: their bytecode and strings stay in
# flash, not in the heap. Build steps: README, "Building it into the firmware".
# tests/test_firmware_manifest.py keeps this list equal to the mip manifest.
package(
    "lapsecalc",
    files=(
        "__init__.py",
        "constants.py",
        "limits.py",
        "moisture.py",
        "standard.py",
        "condensation.py",
        "adiabats.py",
        "column.py",
        "profile.py",
        "parcel.py",
        "stability.py",
        "station.py",
    ),
    base_path="..",
)
