// lapsecalc board32: py/modsys.c includes this header of MicroPython's extmod/, which
// the sdist does not ship; sys uses nothing from it in this build, so it is empty.
