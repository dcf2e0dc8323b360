"""Case keys of a liquid feed (``[thermo] equation_of_state = "liquid"``), read and cross-checked.

``density`` (required), ``density_at`` (temperature of that density, default the feed
temperature) and ``expansion_coefficient`` (beta, default 0: constant density) give
rho(T) = density [1 - beta (T - density_at)] (:mod:`simulator.model.liquid`).
"""
import math

NAN = float("nan")
LIQUID_KEYS = ("density", "density_at", "expansion_coefficient")


def liquid_density_law(ck, t, eos):
    """(density [kg/m^3], density_at [K], expansion_coefficient [1/K]) of ``[thermo]`` ``t``."""
    if eos != "liquid":
        extra = [k for k in LIQUID_KEYS if isinstance(t, dict) and k in t]
        if extra:
            ck.fail("thermo", f": {', '.join(extra)} given but equation_of_state = {eos!r} ignores them; "
                    'write equation_of_state = "liquid" or remove them.')
        return NAN, NAN, 0.0
    rho = ck.quantity(t, "density", "density", "thermo", minimum=0.0)
    rho_at = ck.quantity(t, "density_at", "temperature", "thermo", required=False, minimum=0.0)
    beta = 0.0
    if "expansion_coefficient" in t:
        beta = ck.quantity(t, "expansion_coefficient", "1/K", "thermo", required=False)
        if math.isfinite(beta) and not 0.0 <= beta < 0.01:
            ck.fail("thermo.expansion_coefficient", f" = {t['expansion_coefficient']!r}: must be >= 0 and "
                    "below 0.01 1/K (organics ~1e-3 1/K, water 2-3e-4 1/K).")
            beta = NAN
    return rho, rho_at, beta


def liquid_problems(ck, thermo, reactions):
    """Refuse what a liquid feed cannot mean: partial-pressure rates, species data not given as liquids."""
    if thermo.equation_of_state != "liquid":
        return
    for j, r in enumerate(reactions):
        if r.in_terms_of == "partial-pressure":
            ck.fail(f"reactions.{j}.in_terms_of", ' = "partial-pressure": a liquid feed has no partial pressures; '
                    'write the rate in terms of concentration (equation_of_state = "liquid").')
    if thermo.species_file is not None:
        ck.fail("thermo.species_file", f" = {thermo.species_file!r}: species files hold ideal-gas data; a liquid "
                "feed takes its species as [thermo.custom.NAME] with liquid cp and enthalpy of formation.")
