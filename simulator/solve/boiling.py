r"""Boiling check of a liquid feed: where the liquid's bubble pressure exceeds the local pressure.

The balances describe one liquid phase. With the species' vapour pressures (Clausius-Clapeyron
from the normal boiling point and the heat of vaporization, ``[thermo.custom.NAME]``
``normal_boiling_point`` + ``heat_of_vaporization``)

.. math:: P_i^{sat}(T) = P_{atm} \exp\left[-\frac{\Delta h_{vap,i}}{R}\left(\frac1T - \frac1{T_{b,i}}\right)\right],
          \qquad P_{bubble} = \sum_i x_i P_i^{sat}(T)

(Raoult's law, an ideal liquid), the liquid starts to boil where P_bubble > P. Species without the
two keys are left out of the sum (and named), so the bubble pressure is then a lower bound.

References
----------
.. [1] J.M. Smith, H.C. Van Ness, M.M. Abbott, Introduction to Chemical Engineering
   Thermodynamics, 7th ed., McGraw-Hill, 2005, ch. 10 (Raoult's law) and ch. 6
   (Clausius-Clapeyron) (chapters from memory).
"""
import math

import numpy as np

from simulator.units import P_STANDARD, R


def bubble_ratio(case, species, T, P, F):
    """P_bubble / P along the tube and the species left out, or (None, names) when none has data.

    Parameters
    ----------
    case : simulator.case.schema.Case
        A liquid case
    species : sequence of str
        Species order of ``F``
    T, P : ndarray
        Temperature [K] and pressure [Pa] along the tube
    F : ndarray
        (N, n) molar flows, [mol/s]

    Returns
    -------
    ratio : ndarray or None
        (N,) bubble pressure over the local pressure, [-]
    missing : list of str
        Species without vapour-pressure data
    """
    data = {c.name: (c.normal_boiling_point, c.heat_of_vaporization) for c in case.thermo.custom}
    usable = [i for i, s in enumerate(species) if s in data and all(v == v for v in data[s])]
    missing = [s for i, s in enumerate(species) if i not in usable]
    if not usable:
        return None, missing
    x = np.clip(F, 0.0, None) / np.clip(F, 0.0, None).sum(axis=1, keepdims=True)
    bubble = np.zeros(len(T))
    for i in usable:
        Tb, dh = data[species[i]]
        bubble += x[:, i] * P_STANDARD * np.exp(-dh / R * (1.0 / T - 1.0 / Tb))
    return bubble / P, missing


def boiling_block(case, species, z, T, P, F):
    """(summary block, warnings) of the boiling check; the block is None for a gas."""
    if case.thermo.equation_of_state != "liquid":
        return None, []
    ratio, missing = bubble_ratio(case, species, T, P, F)
    if ratio is None:
        return ({"checked": False, "note": "not checked: give normal_boiling_point and heat_of_vaporization under "
                                           "[thermo.custom.NAME] for the volatile species"}, [])
    k = int(np.argmax(ratio))
    boils = ratio > 1.0
    block = {"checked": True, "max_bubble_to_pressure_ratio": float(ratio[k]), "position_m": float(z[k]),
             "boils_from_m": float(z[int(np.argmax(boils))]) if boils.any() else None,
             "species_without_data": missing,
             "basis": "Raoult's law with Clausius-Clapeyron vapour pressures from each species' normal boiling point "
                      "and heat of vaporization"}
    warnings = []
    if boils.any():
        warnings.append(f"boiling: the liquid's bubble pressure exceeds the local pressure from z = "
                        f"{block['boils_from_m']:.4g} m (at most {ratio[k]:.3g} times it, at z = {z[k]:.4g} m): the "
                        "liquid would boil there, which this one-phase model does not describe; raise the pressure "
                        "or lower the temperature")
    if missing and math.isfinite(ratio[k]):
        block["note"] = f"species without vapour-pressure data left out (a lower bound): {', '.join(missing)}"
    return block, warnings
