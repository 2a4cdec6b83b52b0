"""One air column: a surface observation plus an assumed environmental lapse rate (ELR)."""
# Sources:
#   Hydrostatic equation with the ideal gas law, exact for a linear temperature
#     profile (standard.layer_pressure); ICAO Doc 7488/3 for the ISA constants.
#   Freezing and icing levels: airframe icing is most likely in cloud between 0 and
#     -20 degC (common practice).
from lapsecalc.constants import T0_K, EPS
from lapsecalc.limits import check, finite, T_MAX_C, SAME_LEVEL_M
from lapsecalc.moisture import _es_water, _dewpoint_from_e, relative_humidity, wet_bulb
from lapsecalc.standard import (layer_pressure, layer_height, station_pressure,
                                pressure_altitude, isa_height_of_density, _density)
def report_keys():
    """The keys report() sets, in its order: its own, then those of
    stability.report_keys() (lapsecalc.hazards and lapsecalc.indicated add theirs
    after these). report() makes its dict from them with room for all at the start: a
    dict that grows needs a new, larger table in one piece, and late in report() a
    board's heap (never compacted) has no such piece left. A list made afresh: a
    constant tuple in a .mpy file would hold a second string object in the heap for
    each name longer than 10 characters (each module holds its own)."""
    from lapsecalc import stability
    return ["elevation_m", "top_msl_m", "t_c", "td_c", "rh_pct", "mixing_ratio_g_kg",
            "wet_bulb_c", "station_pressure_hpa", "qnh_hpa", "pressure_altitude_m",
            "air_density_kg_m3", "density_altitude_m", "cloud_base_agl_m", "cloud_base_msl_m",
            "lcl_t_c", "lcl_p_hpa", "warm_layer_aloft", "parcel_freezing_level_msl_m",
            "freezing_level_msl_m", "freezing_levels_msl_m", "minus10_level_msl_m",
            "minus10_levels_msl_m", "minus20_level_msl_m", "minus20_levels_msl_m",
            "tropopause_msl_m"] + stability.report_keys()


class Column:
    """A surface observation (t_c, td_c degC, station pressure p_hpa, elevation elev_m),
    optional temperatures aloft and an assumed ELR, up to top_m (MSL).

    aloft: points (z_msl_m, t_c, td_c) or, by pressure, (p_hpa, t_c, td_c, "hPa");
    td_c may be None (lapsecalc.aloft). The temperature is linear in height from the
    surface to the first point and between points; above the last point lapse goes on.
    lapse is a number in K/km (positive: cooling with height) or layers
    [(top_agl_m, k_per_km), ...]; the last top may be None and then runs to top_m;
    layers whose tops lie at or below the last point are the points' part.
    Above tropopause_m (MSL; ICAO standard atmosphere 11000 m, real ones lie between
    about 8 and 17 km) the assumed part is isothermal, unless points or a layer that
    starts above it say otherwise; None turns it off.
    A last layer that ends below top_m ends the column there (nothing above it is
    invented), and so does the height where the ELR would take the air below -90 degC
    (the coldest temperature the library handles); top_m then tells the real top,
    top_asked_m the one asked for and end_why the reason in words (None when it
    reached it).
    Heights are geopotential metres MSL unless a name says agl.
    """

    def __init__(self, t_c, td_c, p_hpa, elev_m, lapse=6.5, top_m=16000, aloft=None,
                 tropopause_m=11000):
        # The building code is loaded for this and, on a board, let go of after (even
        # when it refuses an input): the report's heap never holds it.
        from lapsecalc import _drop
        build = None
        try:
            from lapsecalc.profile import build
            build(self, t_c, td_c, p_hpa, elev_m, lapse, top_m, aloft, tropopause_m)
        finally:
            build = None
            _drop("profile", "aloftpoints")

    @classmethod
    def from_qnh(cls, t_c, td_c, qnh_hpa, elev_m, lapse=6.5, top_m=16000, aloft=None,
                 tropopause_m=11000):
        """The same column built from QNH (hPa) instead of station pressure."""
        return cls(t_c, td_c, station_pressure(qnh_hpa, elev_m), elev_m, lapse, top_m, aloft,
                   tropopause_m)

    def _layer(self, z_m):
        z = finite("z_m", z_m)
        # A millimetre of rounding at either end is the end itself.
        if self.elev_m - 0.001 <= z < self.elev_m:
            z = self.elev_m
        elif self.top_m < z <= self.top_m + 0.001:
            z = self.top_m
        z = check("z_m", z, self.elev_m, self.top_m, "m MSL (the column)")
        for layer in self.layers:
            if z <= layer[1]:
                return z, layer
        return z, self.layers[-1]

    def t_at(self, z_m):
        """Environment temperature, degC, at z_m MSL (inside the column)."""
        z, (z0, _, t0, grad, _) = self._layer(z_m)
        return t0 + grad * (z - z0) - T0_K

    def p_at(self, z_m):
        """Environment pressure, hPa, at z_m MSL: hydrostatic, exact per linear layer."""
        z, (z0, _, t0, grad, p0) = self._layer(z_m)
        return layer_pressure(p0, t0, grad, z - z0)

    def z_at(self, p_hpa):
        """Height, m MSL, where the environment pressure is p_hpa (inside the column)."""
        layers = self.layers
        p = check("p_hpa", p_hpa, 1, self.p_hpa, "hPa (the column)")
        # The layer that holds p: the first whose top (the next one's foot) is not
        # above it; only the last one's top pressure is computed.
        i = 0
        while i < len(layers) - 1 and layers[i + 1][4] > p:
            i += 1
        z0, z1, t0, grad, p0 = layers[i]
        z = z0 + layer_height(p0, t0, grad, p)
        if z > z1:
            lo = layer_pressure(p0, t0, grad, z1 - z0)
            check("p_hpa", p, lo * (1 - 1e-9), self.p_hpa, "hPa (the column)")
            z = z1
        return z

    def vapour_pressure_at(self, z_m, r_kg_kg=None):
        """Vapour pressure, hPa, at z_m. Up to the highest dewpoint given aloft: from the
        dewpoint linear in height between the surface and the points that carry one,
        never above the temperature (lapsecalc.aloft). Above it (or with none given):
        the mixing ratio of the highest dewpoint (else of the surface air; r_kg_kg when
        given) carried up, a well-mixed layer, capped at saturation."""
        if r_kg_kg is None:
            if self.dews is not None:
                from lapsecalc.aloft import vapour_pressure
                return vapour_pressure(self, z_m)
            r_kg_kg = self.r_kg_kg
        p = self.p_at(z_m)
        e = r_kg_kg * p / (EPS + r_kg_kg)
        es = _es_water(self.t_at(z_m))
        return es if e > es else e

    def dewpoint_at(self, z_m):
        """Dewpoint, degC (over water), at z_m MSL; humidity as vapour_pressure_at."""
        return _dewpoint_from_e(self.vapour_pressure_at(z_m))

    def density_at(self, z_m):
        """Air density, kg/m3, at z_m MSL (humidity as vapour_pressure_at)."""
        return _density(self.p_at(z_m), self.t_at(z_m), self.vapour_pressure_at(z_m))

    def density_altitude_at(self, z_m):
        """Density altitude, m, of the air at z_m MSL (humidity as vapour_pressure_at;
        more vapour than real errs toward a higher, more cautious density altitude)."""
        return isa_height_of_density(self.density_at(z_m))

    def crossings(self, t_c):
        """Every height, m MSL, where the environment temperature passes t_c degC,
        lowest first (an inversion can give several)."""
        t_k = finite("t_c", t_c) + T0_K
        out = []
        for z0, z1, t0, grad, _ in self.layers:
            if grad == 0:
                continue
            z = z0 + (t_k - t0) / grad
            if z0 <= z <= z1 and not (out and z - out[-1] < SAME_LEVEL_M):
                out.append(z)
        return out

    def level(self, t_c, crossings=None):
        """Lowest height, m MSL, at or above the surface where the environment is at or
        below t_c degC: the elevation if the surface already is; None if never.
        crossings, when given, are this column's crossings(t_c)."""
        t_c = finite("t_c", t_c)
        if self.t_c <= t_c:
            return self.elev_m
        for z in self.crossings(t_c) if crossings is None else crossings:
            return z
        return None

    def cloud_base(self, method="exact"):
        """(height_agl_m, t_c, p_hpa) of the surface parcel's LCL (condensation.cloud_base)."""
        import sys
        had = "lapsecalc.condensation" in sys.modules
        from lapsecalc import condensation
        out = condensation.cloud_base(self.t_c, self.td_c, self.p_hpa, method)
        condensation = None
        # A board lets go of that code again (a Column holds none of it), unless it
        # was loaded before (lapsecalc.station holds it: dropped, a second copy would
        # load) or an allocation count runs (the collector off: a load again would
        # count a second copy that a board never holds at once).
        import gc
        if not had and gc.isenabled():
            from lapsecalc import _drop
            _drop("condensation")
        return out

    def report(self, thermal_excess_c=0, altimetry=True):
        """Every result for this column as a dict of plain values with units in the keys;
        None where a level does not exist in the column. The hazard keys and a caution
        per hazard (lapsecalc.hazards) come when that module is installed (always on
        CPython; a board with package-full.json), the general cautions always. levels_above_top
        names the keys whose None means "above the column top" and warnings says so in
        words, with why the column ends below the top asked for (stability.add_warnings).
        altimetry: add the keys of lapsecalc.indicated (indicated_altitude_m,
        isa_deviation_c, density_altitude_dry_m) when that module is installed; they cost
        a board about 4 KB of heap. On a board with the hazard modules it lets go of
        lapsecalc.stability before the hazards that read the parcel path (a program
        that holds that module itself gets a second copy at its next import of it)."""
        # On a board (MicroPython): a collection (the garbage of building the column),
        # the cloud bases with the condensation code loaded for them and let go of
        # after (lapsecalc._drop, which collects again), then every other module
        # loaded while the heap is still whole, before the parcel path cuts it up: a
        # load (or a failed one: its message is a new interned string) needs large
        # pieces. (The core report's hard heap limit on the Unix port: 77 -> 69 KiB
        # with the first collection, 57 -> 49 KiB with the condensation and building
        # code let go of and fewer float constants.)
        excess_c = check("excess_c", thermal_excess_c, 0, 10, "K")
        from lapsecalc import _drop
        import sys
        # Kept when loaded before (lapsecalc.station holds it: dropped, a second copy
        # would load).
        had = "lapsecalc.condensation" in sys.modules
        _drop()  # the collection only
        from lapsecalc import condensation
        lcl_agl, lcl_t, lcl_p = condensation.cloud_base(self.t_c, self.td_c, self.p_hpa)
        # The heated surface parcel's cloud base (stability.add_to_report's thermal kind).
        heated_agl = lcl_agl if excess_c == 0 else condensation.cloud_base(
            min(self.t_c + excess_c, T_MAX_C), self.td_c, self.p_hpa)[0]
        condensation = None
        if not had:
            _drop("condensation")
        from lapsecalc import stability, parcel
        try:
            from lapsecalc import hazards
        except (ImportError, AttributeError):  # a core-only board: no hazard modules
            hazards = None
        indicated = None
        if altimetry:
            try:
                from lapsecalc import indicated
            except (ImportError, AttributeError):  # a core-only board
                pass
        keys = report_keys()
        if hazards is not None:
            keys += hazards.report_keys()
        if indicated is not None:
            keys += indicated.report_keys()
        r = dict.fromkeys(keys)
        keys = None
        lcl_msl = self.elev_m + lcl_agl
        # Lists, not constant tuples: a .mpy keeps a tuple's strings as copies of its
        # own, while these names are shared with report_keys().
        for t, level_key, levels_key in (
                [0, "freezing_level_msl_m", "freezing_levels_msl_m"],
                [-10, "minus10_level_msl_m", "minus10_levels_msl_m"],
                [-20, "minus20_level_msl_m", "minus20_levels_msl_m"]):
            zs = self.crossings(t)
            r[level_key] = self.level(t, zs)
            r[levels_key] = zs
        r["tropopause_msl_m"] = self.tropopause_m
        if hazards is not None:
            # The hazards that read only the column (and its freezing level) before the
            # parcel path: a board loads their code while its heap is still whole.
            hazards.add_parts(self, None, r, hazards.FIELD_PARTS)
        path = parcel.path(self, lcl_msl)
        rho = self.density_at(self.elev_m)
        r["elevation_m"] = self.elev_m
        r["top_msl_m"] = self.top_m
        r["t_c"] = self.t_c
        r["td_c"] = self.td_c
        r["rh_pct"] = relative_humidity(self.t_c, self.td_c)
        r["mixing_ratio_g_kg"] = 1000 * self.r_kg_kg
        r["wet_bulb_c"] = wet_bulb(self.t_c, self.td_c, self.p_hpa)
        r["station_pressure_hpa"] = self.p_hpa
        r["qnh_hpa"] = self.qnh_hpa
        r["pressure_altitude_m"] = pressure_altitude(self.p_hpa)
        r["air_density_kg_m3"] = rho
        r["density_altitude_m"] = isa_height_of_density(rho)
        r["cloud_base_agl_m"] = lcl_agl
        r["cloud_base_msl_m"] = lcl_msl if lcl_msl <= self.top_m else None
        r["lcl_t_c"] = lcl_t
        r["lcl_p_hpa"] = lcl_p
        r["warm_layer_aloft"] = warm_layer_aloft(self)
        r["parcel_freezing_level_msl_m"] = parcel.level(self, path, 0, lcl_msl)
        stability.add_to_report(self, path, r, excess_c, heated_agl)
        if self.dews is None:
            r["cloud_layers_msl_m"] = None
        else:
            from lapsecalc.aloft import cloud_layers
            r["cloud_layers_msl_m"] = cloud_layers(self)
        stability.add_warnings(self, r)
        r["cautions"] = stability.CAUTIONS  # lapsecalc.hazards puts its own before them
        if hazards is not None:
            # The stability code let go of on a board before the hazards that read the
            # parcel path: none of them needs it (the precipitation's, which does, ran
            # before the path). Measured on the 32-bit build: the session's lines that
            # fail between 60 and 74 KiB, 139 -> 117 in all.
            stability = None
            _drop("stability")
            # The heated parcel's cloud base for lapsecalc.thermals (the condensation
            # code that gave it is gone on a board).
            r["thermal_cloud_base_msl_m"] = self.elev_m + heated_agl
            hazards.add_to_report(self, path, r, hazards.PATH_PARTS)
        # Last, so that it sees every height key: indicated altitudes, the ISA deviation
        # and the dry density altitude (indicated.py, an extra: a core-only board gets
        # the rest of the report and keeps within its memory budget).
        if indicated is not None:
            path = None  # free the parcel path first (a board's heap is small)
            indicated.add_to_report(self, r)
        return r


def warm_layer_aloft(col):
    """True when air above 0 degC lies over air at or below 0 degC somewhere in the
    column (the freezing-rain set-up)."""
    cold_below = col.t_c <= 0
    for z0, z1, t0, grad, _ in col.layers:
        t1 = t0 + grad * (z1 - z0)
        if cold_below and (t0 > T0_K or t1 > T0_K):
            return True
        if t0 <= T0_K or t1 <= T0_K:
            cold_below = True
    return False
