"""lapsecalc: cloud base, freezing level, density altitude, stability and balloon lift
from one surface observation and an assumed lapse rate. Pure Python, runs on MicroPython."""
from lapsecalc.moisture import (saturation_vapour_pressure, dewpoint, relative_humidity,
                                mixing_ratio, wet_bulb)
from lapsecalc.standard import (isa, pressure_altitude, station_pressure, qnh, air_density,
                                density_altitude)
from lapsecalc.condensation import cloud_base
from lapsecalc.adiabats import moist_lapse_rate, saturated_ascent
from lapsecalc.column import Column

__version__ = "0.1.0"
