"""The balloon reports' keys in the order shown and the text of the balloon words
(balloon, sunset), loaded only by those words (runs on MicroPython)."""
# Sources: none; labels and units only. Every line fits a 40-column screen: a
#   13-column label, then the value, in the forms of lapsecalc.layout.text_lines
#   (tests/test_balloon_text.py holds the two to the same lines). This module lays its
#   lines out without loading lapsecalc.layout and lapsecalc.groups: on a board the
#   balloon line's text stage then holds about 13 KiB less (Unix port, measured).
from lapsecalc.state import assumed
from lapsecalc.output import f_h, value_text, wrap

# balloon report kind -> its keys in the order shown, one string each (_GROUPS as in
# lapsecalc.groups). "hot": working-temperature figures first, the absolute limit (at
# the maximum) after; "sunset": the superheat and the ballast it costs when it goes.
_GROUPS = {
    "hot": ("z_msl_m ambient_t_c ambient_p_hpa ambient_density_kg_m3 volume_m3 "
            "weight_kg envelope_t_c envelope_t_set margin_k lift_per_m3_kg "
            "gross_lift_kg free_lift_kg payload_kg envelope_t_needed_c "
            "envelope_t_needed_over_working ceiling_msl_m ceiling_p_hpa "
            "ceiling_above_top gross_lift_per_1000ft_kg "
            "envelope_t_needed_per_1000ft_c max_envelope_t_c limit_gross_lift_kg "
            "limit_payload_kg envelope_t_needed_over_limit limit_ceiling_msl_m "
            "limit_ceiling_p_hpa limit_ceiling_above_top oxygen_note warnings notes"),
    "gas": ("z_msl_m ambient_t_c ambient_p_hpa ambient_density_kg_m3 gas "
            "gas_molar_mass_g_mol purity gas_volume_m3 envelope_m3 weight_kg "
            "gas_density_kg_m3 lift_per_m3_kg gas_volume_at_z_m3 full_at_z "
            "gross_lift_kg free_lift_kg full_msl_m full_p_hpa full_above_top "
            "float_msl_m float_above_top ballast_to_hold_kg gross_lift_per_1000ft_kg "
            "superheat_k gas_t_c superheat_lift_kg ballast_superheat_lost_kg "
            "oxygen_note warnings notes"),
    "sunset": ("z_msl_m ambient_t_c superheat_k gas_t_c gas_volume_at_z_m3 full_at_z "
               "full_msl_m superheat_lift_kg ballast_superheat_lost_kg"),
}


def keys(word, r=None):
    """The keys of balloon report word ("hot", "gas", "sunset"), a new list; with the
    report r, then its other keys, sorted."""
    out = _GROUPS[word].split()
    if r is not None:
        out += sorted(k for k in r if k not in out)
    return out


# ";key:label:kind;" entries, as lapsecalc.labels.LABELS (one string, where a dict of
# tuples cost a board about 7 KiB of heap), for the keys of lapsecalc.balloon's
# reports; their warnings and notes are said as the report's ("!" and "-" lines).
LABELS = (";"
          "z_msl_m:height:z;"
          "ambient_t_c:air temp:t;"
          "ambient_p_hpa:air press:p;"
          "ambient_density_kg_m3:air density:rho;"
          "volume_m3:envelope:m3;"
          "envelope_m3:envelope:m3;"
          "weight_kg:weight:kg;"
          "envelope_t_c:working temp:t;"
          "envelope_t_set:set by you:b;"
          "margin_k:below max:dt;"
          "lift_per_m3_kg:lift per m3:rho;"
          "gross_lift_kg:gross lift:kg;"
          "free_lift_kg:free lift:kg;"
          "payload_kg:field payload:kg;"
          "envelope_t_needed_c:temp to float:t;"
          "envelope_t_needed_over_working:over working:b;"
          "ceiling_msl_m:ceiling:z;"
          "ceiling_p_hpa:ceiling p:p;"
          "ceiling_above_top:ceil abv top:b;"
          "gross_lift_per_1000ft_kg:lift/1000ft:kg;"
          "envelope_t_needed_per_1000ft_c:temp/1000ft:dt;"
          # the absolute limit: figures at the maker's maximum, labelled LIMIT
          "max_envelope_t_c:LIMIT temp:t;"
          "limit_gross_lift_kg:LIMIT gross:kg;"
          "limit_payload_kg:LIMIT payload:kg;"
          "envelope_t_needed_over_limit:over max:b;"
          "limit_ceiling_msl_m:LIMIT ceiling:z;"
          "limit_ceiling_p_hpa:LIMIT ceil p:p;"
          "limit_ceiling_above_top:LIMIT abv top:b;"
          "oxygen_note::say1;"
          "gas:gas:s;"
          "gas_molar_mass_g_mol:molar mass:gmol;"
          "purity:purity:frac;"
          "gas_volume_m3:fill:m3;"
          "gas_density_kg_m3:gas density:rho;"
          "gas_volume_at_z_m3:gas volume:m3;"
          "full_at_z:full here:b;"
          "full_msl_m:press height:z;"
          "full_p_hpa:press ht p:p;"
          "full_above_top:full abv top:b;"
          "float_msl_m:float at:z;"
          "float_above_top:float abv top:b;"
          "ballast_to_hold_kg:ballast drop:kg;"
          "superheat_k:superheat:dt;"
          "gas_t_c:gas temp:t;"
          "superheat_lift_kg:sun lift:kg;"
          "ballast_superheat_lost_kg:ballast @dusk:kg;")

# Headings put before a key in text mode (the hot-air report's two parts).
HEADINGS = {
    "envelope_t_c": "-- working temp (mean envelope air)",
    "max_envelope_t_c": "-- absolute limit: never plan on it",
}


def text_lines(s, word, r, rest=True):
    """The text lines of balloon report r (word "hot", "gas" or "sunset"; its other
    keys after them unless rest is False) in session s's display units, after the
    defaults in use."""
    out = ["assumed " + n for n in assumed(s.state, True, s.disp["p"] == "inhg")]
    for k in keys(word, r if rest else None):
        if k in HEADINGS:
            out.append(HEADINGS[k])
        if k not in r:
            continue
        v = r[k]
        if k == "warnings" or k == "notes":
            for text in v:
                out.extend(wrap(text, "! " if k == "warnings" else "- "))
            continue
        label, kind = k, "?"
        i = LABELS.find(";" + k + ":")
        if i >= 0:
            i += len(k) + 2
            j = LABELS.find(":", i)
            label, kind = LABELS[i:j], LABELS[j + 1:LABELS.find(";", j)]
        if kind != "say1":  # else said among the warnings
            out.append("%-13s%s" % (label, _value_text(s, kind, v)))
    return out


def _value_text(s, kind, v):
    # The text of value v of kind kind after its label: a height (MSL, or indicated as
    # the layout reads it) or a word, then the kinds every layout shares
    # (output.value_text).
    if v is None:
        return "   none in column" if kind == "z" else "   none"
    if kind == "z":
        if s.disp.get("z") == "ind":  # indicated on QNH: the layout's reading
            from lapsecalc.layout import level
            return level(s, v)
        return f_h(s, v, False, " MSL")
    if kind == "s":
        return " " + str(v)
    return value_text(s, kind, v)
