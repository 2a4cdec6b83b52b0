"""The built-in demo: an invented airfield on an invented summer afternoon."""
# Nothing here is observed data: the field, its elevation and the weather are made up.

DEMO_LINES = (
    "# Orlenmoor Flats (invented field), elevation 1350 ft, a warm afternoon",
    "elev 1350ft",
    "temp 27C dew 13C qnh 1016",
    "elr 9.5@250m 7.5@2400m 6.5",
    "excess 2C   # sun-warmed fields: thermals start 2 K above the air",
    "base",
    "da 9500ft",
    "chart",
    "report",
)

# The same scenario as library arguments: t_c, td_c, qnh_hpa, elev_m, layers (the
# thermal excess of 2 K is report()'s thermal_excess_c).
DEMO_COLUMN = (27.0, 13.0, 1016.0, 411.48, [(250.0, 9.5), (2400.0, 7.5), (None, 6.5)])
