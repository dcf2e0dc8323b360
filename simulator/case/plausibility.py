"""Plausibility warnings a reviewer expects on a loaded case (the case stays valid).

:func:`plausibility_warnings` returns one line per finding. Refusals (a particle
that does not fit in the tube, values outside :mod:`simulator.case.limits`) are
made by :mod:`simulator.case.load`; what is here is unusual but may be meant.
The bounds are common practice, no source.
"""
from simulator.units import R

#: Tube-to-particle diameter ratio below which wall channelling matters, [-] (common practice, no source).
MIN_TUBE_TO_PARTICLE_RATIO = 8.0
#: Superficial gas velocity at the feed above which a design is far outside usual practice, [m/s]
#: (common practice, no source): packed beds run at a few m/s at most; empty reaction tubes
#: (furnace coils included) rarely exceed about 100 m/s.
MAX_SUPERFICIAL_VELOCITY = {"packed": 5.0, "empty": 100.0}


def plausibility_warnings(case):
    """Unusual but possible inputs of a validated case, one line each.

    Parameters
    ----------
    case : simulator.case.schema.Case

    Returns
    -------
    list of str
        Findings (empty when nothing is unusual).
    """
    out = []
    bed, tube = case.bed, case.tube
    if bed is not None and tube.inner_diameter / bed.particle_diameter < MIN_TUBE_TO_PARTICLE_RATIO:
        out.append(f"tube.inner_diameter / bed.particle_diameter = {tube.inner_diameter / bed.particle_diameter:.3g} "
                   f"(below {MIN_TUBE_TO_PARTICLE_RATIO:g}): the bed is looser at the wall than inside (wall "
                   "channelling), so the pressure drop and wall heat transfer of this uniform-bed model are less "
                   "reliable (common practice, no source).")
    velocity = feed_superficial_velocity(case)
    kind = "packed" if bed is not None else "empty"
    limit = MAX_SUPERFICIAL_VELOCITY[kind]
    if velocity is not None and velocity > limit:
        out.append(f"superficial gas velocity at the feed {velocity:.3g} m/s is far above usual practice for "
                   f"{'a packed' if bed is not None else 'an empty'} tube (about {limit:g} m/s at most; common "
                   "practice, no source): check the flow, its unit, tube.count and tube.inner_diameter.")
    for j, r in enumerate(case.reactions):
        for m, term in enumerate(r.inhibition):
            if term.heat_of_adsorption > 0:
                out.append(f"reactions.{j}.inhibition.{m}.heat_of_adsorption = "
                           f"{term.heat_of_adsorption / 1000:g} kJ/mol is positive: K = K0*exp(-dH_ads/(R*T)) "
                           "then grows with temperature. Adsorption is exothermic, dH_ads < 0; if the number is "
                           "the heat released on adsorption (as often quoted), write it with a minus sign.")
    return out


def feed_superficial_velocity(case):
    """Superficial gas velocity at the feed as an ideal gas, [m/s], or None if unknown.

    u = F R T / (P A) per tube for a molar flow; a mass flow needs the feed molar mass
    (species file or custom species), a volumetric flow is already at feed T and P.
    """
    tube, feed = case.tube, case.feed
    area = 3.141592653589793 * tube.inner_diameter ** 2 / 4.0
    if feed.flow_kind == "volumetric_flow":
        return feed.flow_value / tube.count / area
    molar = feed.flow_value
    if feed.flow_kind == "mass_flow":
        molar_mass = feed_molar_mass(case)
        if molar_mass is None:
            return None
        molar = feed.flow_value / molar_mass
    return molar / tube.count * R * feed.temperature / feed.pressure / area


def feed_molar_mass(case):
    """Mean molar mass of the feed, [kg/mol], or None when a species' molar mass is unknown."""
    from simulator.thermo.species_data import species_in_file

    custom = {c.name: c.molar_mass for c in case.thermo.custom}
    in_file = species_in_file(case.thermo.species_path) if case.thermo.species_path else {}
    total = 0.0
    for name, x in case.feed.mole_fractions:
        if name in custom:
            total += x * custom[name]
        elif name in in_file:
            total += x * in_file[name].molecular_weight / 1000.0
        else:
            return None
    return total
