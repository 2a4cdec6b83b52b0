"""Physical constants, one per line, each with its unit and source."""
# Sources:
#   ICAO Doc 7488/3, Manual of the ICAO Standard Atmosphere (1993).
#   Wallace & Hobbs, Atmospheric Science, 2nd ed. (2006), for the moist-air values.

# Standard gravity, m s-2, exact by definition (ICAO Doc 7488/3).
G0 = 9.80665
# Specific gas constant of dry air, J kg-1 K-1 (ICAO Doc 7488/3).
R_DRY = 287.05287
# Specific gas constant of water vapour, J kg-1 K-1 (Wallace & Hobbs).
R_VAPOUR = 461.5
# Ratio of the gas constants, dimensionless (about 0.622).
EPS = R_DRY / R_VAPOUR
# Specific heat of dry air at constant pressure, J kg-1 K-1 (Wallace & Hobbs).
CP_DRY = 1004.0
# Poisson exponent R/cp of dry air, dimensionless.
KAPPA = R_DRY / CP_DRY
# Latent heat of vaporisation at 0 degC, J kg-1 (Wallace & Hobbs).
LV0 = 2.501e6
# Dry adiabatic lapse rate g/cp, K per km (about 9.77, "9.8" in the trade).
DRY_LAPSE_K_PER_KM = 1000.0 * G0 / CP_DRY
# Zero of the Celsius scale, K (exact).
T0_K = 273.15

# ICAO standard atmosphere at mean sea level (ICAO Doc 7488/3).
ISA_T0_K = 288.15
ISA_P0_HPA = 1013.25
# ISA troposphere lapse rate, K per m (6.5 K/km).
ISA_LAPSE_K_PER_M = 0.0065
