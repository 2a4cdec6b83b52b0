"""Gas (helium, hydrogen) balloons in one air column: the lifting gas's density and lift
per m3, its volume at a height, the lift lost when its superheat goes, and the report of
a zero-pressure balloon: lift, pressure (full) height, float height, superheat."""
# Sources:
#   Archimedes' principle with the ideal gas law (lapsecalc.balloon: the ambient air,
#     moist, and the height solver).
#   ICAO Doc 7488/3: gas constant of dry air (constants.R_DRY) and molar mass of dry
#     air, 28.9644 g/mol; the two give the universal gas constant 8314.32 J/(kmol K).
#   Molar masses of helium and hydrogen: from memory (below).
#   Zero-pressure gas balloon: the gas is at the ambient pressure, the volume grows
#     as T/p until the envelope is full, then gas vents through the open appendix
#     (common practice). The pressure height is where it becomes full.
# Assumptions (stated in the report's notes): the gas is at the ambient temperature
#   plus a superheat the user sets (0 when not set), the same at every height, and dry;
#   its impurity is dry air; purity is a volume (mole) fraction. The fill is the gas
#   volume at the field at the ambient temperature (before any superheat).
from lapsecalc.constants import R_DRY, T0_K
from lapsecalc.limits import check, check_p, const
from lapsecalc.balloon import (first_drop, _air, _z, _per_1000ft, oxygen_note, WEIGHT_MAX_KG,
                               RHO_MIN_KG_M3, RHO_MAX_KG_M3)

# Molar masses, g/mol (= kg/kmol).
_M_AIR_G_MOL = const(28.9644)  # dry air, ICAO Doc 7488/3
_M_HELIUM_G_MOL = const(4.0026)  # helium, standard atomic weight rounded (from memory)
_M_HYDROGEN_G_MOL = const(2.016)  # hydrogen H2, twice the atomic weight 1.008 (from memory)

# Input ranges.
# Gas envelope, m3: 0.1 admits pilot and toy balloons; 2e6 admits the largest
# zero-pressure research balloons (about 1.1e6 m3; from memory). The gas at launch is
# at most 100000 m3 (a research balloon launches with a small part of its volume).
_GAS_VOLUME_MIN_M3 = const(0.1)
_GAS_VOLUME_MAX_M3 = const(100000.0)
_ENVELOPE_MAX_M3 = const(2.0e6)
# Total weight, kg: a small gas balloon can weigh grams.
_GAS_WEIGHT_MIN_KG = const(0.01)
# Superheat of the lifting gas over the outside air, K: 0..50 admits a dark envelope
# in strong sun (tens of kelvin; common practice, from memory).
SUPERHEAT_MAX_K = 50.0
# Purity of the lifting gas, volume fraction; below one half it is mostly air.
_PURITY_MIN = const(0.5)


def molar_mass(gas):
    """Molar mass, g/mol, of the lifting gas "helium" or "hydrogen" (from memory)."""
    if gas == "helium":
        return _M_HELIUM_G_MOL
    if gas == "hydrogen":
        return _M_HYDROGEN_G_MOL
    raise ValueError("gas=%r is not known; allowed helium or hydrogen" % (gas,))


def gas_density(p_hpa, t_c, gas, purity=1.0, superheat_k=0.0):
    """Density, kg/m3, of the lifting gas ("helium" or "hydrogen", volume fraction
    purity 0.5..1, the rest dry air) at p_hpa (1..1100) and t_c degC (-90..60, the
    outside air) plus superheat_k (0..50 K: the gas that much warmer than the air).

    Ideal gas: rho = p M / (R* T) with R* = R_DRY * M_air (ICAO Doc 7488/3), so
    rho = rho_dry_air(p, T) * (purity M_gas / M_air + 1 - purity), T = t_c + superheat.
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, _PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    p = check_p("p_hpa", p_hpa)
    t = check("t_c", t_c, -90.0, 60.0, "degC")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    return 100.0 * p / (R_DRY * (t + dt + T0_K)) * (f * m_gas / _M_AIR_G_MOL + 1.0 - f)


def gas_lift_per_m3(rho_air_kg_m3, p_hpa, t_c, gas, purity=1.0, superheat_k=0.0):
    """Gross lift, kg per m3 of gas at the ambient p_hpa and t_c plus superheat_k:
    ambient density rho_air_kg_m3 (0.001..2.5, moist or dry) less
    gas_density(p_hpa, t_c, gas, purity, superheat_k).
    Pure helium in the ISA at sea level: 1.0557 kg/m3."""
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    return rho - gas_density(p_hpa, t_c, gas, purity, superheat_k)


def superheat_loss_kg(rho_air_kg_m3, t_air_c, gas_volume_m3, superheat_k):
    """Lift lost, kg, when gas of volume gas_volume_m3 (m3, 0..2e6, as it is with
    superheat_k 0..50 K) cools to the air temperature t_air_c (-90..60 degC) at the
    same pressure, in air of density rho_air_kg_m3: the ballast to drop to hold
    level when the superheat goes (sunset, cloud shadow).

    Same gas mass, same pressure: the volume shrinks by the factor T / (T + dT), so the
    air displaced falls by rho_air V dT / (T + dT) (ideal gas).
    """
    rho = check("rho_air_kg_m3", rho_air_kg_m3, RHO_MIN_KG_M3, RHO_MAX_KG_M3, "kg/m3")
    t = check("t_air_c", t_air_c, -90.0, 60.0, "degC") + T0_K
    v = check("gas_volume_m3", gas_volume_m3, 0.0, _ENVELOPE_MAX_M3, "m3")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    return rho * v * dt / (t + dt)


def gas_volume_at(v0_m3, p0_hpa, t0_c, p_hpa, t_c):
    """Volume, m3, of a gas that filled v0_m3 at (p0_hpa, t0_c) once it is at
    (p_hpa, t_c): V = V0 (p0 / p) (T / T0), ideal gas at constant mass. v0_m3 at
    least 0 (finite), pressures 1..1100 hPa, gas temperatures -90..150 degC."""
    v0 = check("v0_m3", v0_m3, 0.0, 1.0e9, "m3")
    p0, p = check_p("p0_hpa", p0_hpa), check_p("p_hpa", p_hpa)
    t0 = check("t0_c", t0_c, -90.0, 150.0, "degC")
    t = check("t_c", t_c, -90.0, 150.0, "degC")
    return v0 * p0 / p * (t + T0_K) / (t0 + T0_K)


def gas_report(col, gas, purity, gas_volume_m3, envelope_m3, weight_kg, z_m=None,
               superheat_k=0.0):
    """Zero-pressure gas balloon in the column col (a Column): a dict of plain values.

    gas "helium" or "hydrogen"; purity 0.5..1 (volume fraction, the rest air);
    gas_volume_m3 0.1..100000, the gas volume at the field at launch (not more than
    the envelope); envelope_m3 0.1..2e6, the full envelope; weight_kg 0.01..20000,
    everything that flies except the gas, ballast included; z_m MSL (default field);
    superheat_k 0..50 K, the gas warmer than the air (sun on the envelope), taken the
    same at every height.

    The gas is at the ambient pressure and the ambient temperature plus superheat_k;
    below the full height all of it is aboard and its volume grows as T/p; above, the
    envelope stays full and the excess vents (the balloon is assumed to have climbed
    straight from the field).

    Keys: z_msl_m, ambient_t_c, ambient_p_hpa, ambient_density_kg_m3, gas, purity,
    gas_density_kg_m3, lift_per_m3_kg (at z), gas_volume_at_z_m3, full_at_z (bool),
    gross_lift_kg, free_lift_kg (gross less weight at z), full_msl_m and full_p_hpa
    (where the gas fills the envelope: the pressure height, zero-pressure ceiling;
    None when above the column top), full_above_top (bool), float_msl_m (where the
    full envelope's lift equals the weight, at or above the full height; None if it
    cannot take off or it is above the column top), float_above_top (bool),
    ballast_to_hold_kg (ballast to drop at z to stop sinking there: weight less gross
    lift, 0 when the free lift is positive; then free_lift_kg is the lift to spend,
    by valving gas, to hold z), gross_lift_per_1000ft_kg, superheat_k, gas_t_c,
    superheat_lift_kg (gross lift at z gained by the superheat over the same balloon
    without it), ballast_superheat_lost_kg (ballast to drop at z to hold level when
    the superheat goes: superheat_loss_kg of the gas aboard; more than the lift gained
    once gas vented while warm), oxygen_note (str or None: the planned height or the
    float height passes the oxygen heights), notes, warnings.
    """
    m_gas = molar_mass(gas)
    f = check("purity", purity, _PURITY_MIN, 1.0, "(volume fraction of the gas; the rest air)")
    v_env = check("envelope_m3", envelope_m3, _GAS_VOLUME_MIN_M3, _ENVELOPE_MAX_M3, "m3")
    v0 = check("gas_volume_m3", gas_volume_m3, _GAS_VOLUME_MIN_M3, min(v_env, _GAS_VOLUME_MAX_M3),
               "m3 (not more than envelope_m3)")
    w = check("weight_kg", weight_kg, _GAS_WEIGHT_MIN_KG, WEIGHT_MAX_KG, "kg")
    dt = check("superheat_k", superheat_k, 0.0, SUPERHEAT_MAX_K, "K")
    z = _z(col, z_m)
    # The result made first, with room for every key: on a board its table is one
    # piece of heap, hard to find once the searches below have cut the heap up.
    out = dict.fromkeys([
        "z_msl_m", "ambient_t_c", "ambient_p_hpa", "ambient_density_kg_m3", "gas",
        "gas_molar_mass_g_mol", "purity", "gas_volume_m3", "envelope_m3", "weight_kg",
        "gas_density_kg_m3", "lift_per_m3_kg", "gas_volume_at_z_m3", "full_at_z",
        "gross_lift_kg", "free_lift_kg", "full_msl_m", "full_p_hpa", "full_above_top",
        "float_msl_m", "float_above_top", "oxygen_note", "ballast_to_hold_kg",
        "gross_lift_per_1000ft_kg", "superheat_k", "gas_t_c", "superheat_lift_kg",
        "ballast_superheat_lost_kg", "notes", "warnings"])
    p0, t0 = col.p_hpa, col.t_c

    def volume(zz, heat=dt):
        return gas_volume_at(v0, p0, t0, col.p_at(zz), col.t_at(zz) + heat)

    def lift_m3(zz, heat=dt):
        pp, tt, _, rr = _air(col, zz)
        return gas_lift_per_m3(rr, pp, tt, gas, f, heat)

    def gross(zz, heat=dt):
        return min(volume(zz, heat), v_env) * lift_m3(zz, heat)

    p, t_air, _, rho = _air(col, z)
    v_z = volume(z)
    g_z = gross(z)
    lift_off = gross(col.elev_m) >= w
    if volume(col.elev_m) >= v_env:
        full = col.elev_m
    else:
        full = first_drop(col, lambda zz: v_env - volume(zz), col.elev_m)
    flt = None
    if lift_off and full is not None:
        if v_env * lift_m3(full) < w:
            flt = full
        else:
            flt = first_drop(col, lambda zz: v_env * lift_m3(zz) - w, full)
    flt_above = lift_off and flt is None
    warnings = []
    if not lift_off:
        warnings.append("No lift-off: the gas lifts %.1f kg, %.1f kg less than the weight."
                        % (gross(col.elev_m), w - gross(col.elev_m)))
    if full is None:
        warnings.append("The envelope is not full below the column top (%.0f m MSL)." % col.top_m)
    oxygen = oxygen_note(col, (("planned height", z),
                               ("float height", col.top_m if flt_above else flt)))
    if oxygen:
        warnings.append(oxygen)
    out["z_msl_m"] = z
    out["ambient_t_c"] = t_air
    out["ambient_p_hpa"] = p
    out["ambient_density_kg_m3"] = rho
    out["gas"] = gas
    out["gas_molar_mass_g_mol"] = m_gas
    out["purity"] = f
    out["gas_volume_m3"] = v0
    out["envelope_m3"] = v_env
    out["weight_kg"] = w
    out["gas_density_kg_m3"] = gas_density(p, t_air, gas, f, dt)
    out["lift_per_m3_kg"] = lift_m3(z)
    out["gas_volume_at_z_m3"] = v_z if v_z < v_env else v_env
    out["full_at_z"] = full is not None and z >= full
    out["gross_lift_kg"] = g_z
    out["free_lift_kg"] = g_z - w
    out["full_msl_m"] = full
    out["full_p_hpa"] = None if full is None else col.p_at(full)
    out["full_above_top"] = full is None
    out["float_msl_m"] = flt
    out["float_above_top"] = flt_above
    out["oxygen_note"] = oxygen
    out["ballast_to_hold_kg"] = w - g_z if w > g_z else 0.0
    out["gross_lift_per_1000ft_kg"] = _per_1000ft(col, z, gross)
    out["superheat_k"] = dt
    out["gas_t_c"] = t_air + dt
    out["superheat_lift_kg"] = g_z - gross(z, 0.0)
    out["ballast_superheat_lost_kg"] = superheat_loss_kg(rho, t_air, min(v_z, v_env), dt)
    out["notes"] = _notes(dt, gas)
    out["warnings"] = tuple(warnings)
    return out


def _notes(superheat_k, gas):
    # The report's notes: what the figures assume, and what the superheat and the gas
    # ask for (gas_report is split so that a board loads no piece of its code larger
    # than about 1 KB).
    notes = [
        "The gas is taken at the outside pressure and at the outside temperature plus the"
        " superheat you set (%.1f K), the same at every height; its impurity is dry air."
        % superheat_k,
        "Zero-pressure envelope: below the full height all the gas is aboard and the lift"
        " hardly changes; above it gas vents and the lift falls with the air density.",
        "ballast_to_hold_kg is the ballast to drop at this height to stop sinking there;"
        " with free lift, valve gas instead.",
    ]
    if superheat_k > 0.0:
        notes.append("When the superheat goes (sunset, shade) drop ballast_superheat_lost_kg"
                     " to hold level; gas vented while warm makes it more than it gave.")
    if gas == "hydrogen":
        notes.append("Hydrogen burns in air: handle it under the rules that apply to it.")
    return tuple(notes)
