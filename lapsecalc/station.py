"""Weather-station helper: raw sensor readings to one compact key=value line."""
# Sources: the library functions it calls - moisture.dewpoint (Alduchov & Eskridge
#   1996), standard.qnh / pressure_altitude / density_altitude (ICAO Doc 7488/3),
#   condensation.cloud_base (Romps 2017). Nothing is computed here.
#
# Example firmware loop (tests/test_station.py runs this block; read_sensor() and
# send() stand for the board's own sensor driver and serial or radio link):
#
#   import time
#   from lapsecalc.station import station_line
#   ELEV_M = 411.0  # the station's surveyed elevation, m
#   while True:
#       t_c, rh_pct, p_hpa = read_sensor()  # degC, %, station pressure hPa
#       try:
#           # a humidity sensor reads a little over 100 % in fog
#           send(station_line(t_c, min(rh_pct, 100.0), p_hpa, ELEV_M))
#       except ValueError as e:  # a reading out of range: say which, keep going
#           send("err=" + str(e)[:60].replace(" ", "_"))
#       time.sleep(60)
from lapsecalc.moisture import dewpoint
from lapsecalc.standard import qnh, pressure_altitude, density_altitude
from lapsecalc.condensation import cloud_base


def station_values(t_c, rh_pct, p_station_hpa, elev_m):
    """Station results as a dict: t_c, rh_pct, td_c (degC, over water), p_hpa (station
    pressure), qnh_hpa, pa_m (pressure altitude), da_m (moist density altitude) and
    cb_agl_m (cloud base of the surface air above the station, exact LCL).

    Inputs: t_c -90..60 degC, rh_pct above 0 up to 100 %, p_station_hpa 1..1100 hPa,
    elev_m -500..9000 m; the QNH must come out in 850..1100 hPa. ValueError otherwise.
    """
    td = dewpoint(t_c, rh_pct)
    q = qnh(p_station_hpa, elev_m)
    t = float(t_c)
    p = float(p_station_hpa)
    return {"t_c": t, "rh_pct": float(rh_pct), "td_c": td, "p_hpa": p, "qnh_hpa": q,
            "pa_m": pressure_altitude(p), "da_m": density_altitude(p, t, td),
            "cb_agl_m": cloud_base(t, td, p)[0]}


# Keys of the line in order, with the number of decimals each is sent with.
LINE_KEYS = (("t_c", 1), ("rh_pct", 0), ("td_c", 1), ("p_hpa", 1), ("qnh_hpa", 1),
             ("pa_m", 0), ("da_m", 0), ("cb_agl_m", 0))


def station_line(t_c, rh_pct, p_station_hpa, elev_m):
    """One line for a serial or radio link, keys with their units, e.g.
    "t_c=27.0 rh_pct=41 td_c=12.6 p_hpa=967.4 qnh_hpa=1015.9 pa_m=389 da_m=956 cb_agl_m=1815".
    Same inputs and errors as station_values()."""
    v = station_values(t_c, rh_pct, p_station_hpa, elev_m)
    out = []
    for k, d in LINE_KEYS:
        s = ("%.1f" if d else "%.0f") % v[k]
        # "-0" and "-0.0" say nothing a plain zero does not.
        out.append(k + "=" + (s[1:] if s in ("-0", "-0.0") else s))
    return " ".join(out)
