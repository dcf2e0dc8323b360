r"""``[catalyst]`` -> the pellet block of the kernel's ``fp`` (effectiveness factors along the tube).

The kernel multiplies each per-catalyst-mass rate by its effectiveness factor eta_j, found from the
local bulk state (no external film) by the generalized modulus of Bischoff (1965):

.. math::
    \Phi_j = L \sqrt{\frac{n_j + 1}{2}\,\frac{|\nu_{k,j}|\, r_{p,j}}{D_e\, C_k}},
    \qquad r_{p,j} = r_{v,j}\,\rho_p / \rho_b

with L = V_p/S_p, n_j the order of reaction j in its limiting reactant k (the key species where it
is a reactant of j, else j's first reactant), r_v the rate per reactor volume and C_k the
reactant's concentration. eta_j is the isothermal first-order closed form of the pellet's shape at
Phi_j (exact for first order; for other orders Bischoff's approximation, asymptotically exact as
Phi -> infinity), read from a table in ln Phi packed here (:data:`TABLE_POINTS` points from
Phi = 1e-3 to 1e3; eta = 1/Phi beyond, the common asymptote of the Aris normalisation). A
reaction whose order in that reactant is not positive, or with a rate per reactor volume, keeps
eta = 1. Reversible reactions take the modulus of their local net rate (an approximation: eta
tends to 1 near equilibrium).

Layout from the offset o = ``ip[I_PELLET]``::

    fp[o]              L = V_p/S_p [m]
    fp[o + 1]          D_e [m^2/s]
    fp[o + 2]          rho_p / rho_b [-]
    fp[o + 3]          K, the table size
    fp[o + 4]          ln Phi of the first table point
    fp[o + 5]          step in ln Phi
    fp[o + 6 ..]       eta at the K points
    then 2 m entries   per reaction: limiting species index (-1: eta = 1) and its order
"""
import math

import numpy as np

from simulator.model.pellet import effectiveness_first_order

TABLE_POINTS = 481
LN_PHI_RANGE = (math.log(1e-3), math.log(1e3))
HEADER = 6


def limiting_reactant(reaction, key):
    """(species, order) of the reactant whose diffusion limits ``reaction``; (None, 0) if there is none."""
    st = dict(reaction.stoichiometry)
    orders = dict(reaction.orders)
    reactants = [s for s, v in reaction.stoichiometry if v < 0]
    if not reactants:
        return None, 0.0
    species = key if key in reactants else reactants[0]
    return species, float(orders.get(species, -st[species]))


def pellet_block(case, names):
    """The block appended to ``fp`` for a case with ``[catalyst]``, (6 + K + 2 m,)."""
    cat = case.catalyst
    lo, hi = LN_PHI_RANGE
    grid = np.linspace(lo, hi, TABLE_POINTS)
    eta = np.array([effectiveness_first_order(math.exp(x), cat.shape) for x in grid])
    per_reaction = []
    index = {s: i for i, s in enumerate(names)}
    for r in case.reactions:
        species, order = limiting_reactant(r, case.design.key_species)
        usable = species is not None and order > 0.0 and r.rate_basis == "catalyst-mass"
        per_reaction += [index[species] if usable else -1.0, order if usable else 0.0]
    head = [cat.volume_to_surface, cat.effective_diffusivity, cat.pellet_density / case.bed.bulk_density,
            float(TABLE_POINTS), lo, (hi - lo) / (TABLE_POINTS - 1)]
    return np.concatenate([head, eta, per_reaction])


def pellet_summary(case, z, hot_position, profile):
    """The ``pellet`` block of summary.json from the (N, m, 2) effectiveness/modulus profile.

    ``effectiveness`` {reaction: {inlet, hot_spot, outlet, min}}, ``modulus_inlet`` and the
    Weisz-Prater number at the inlet, C_WP = eta Phi^2 2/(n + 1) (observed rate x L^2 / (D_e C)):
    well below 1, no internal limitation; well above 1, a strong one (Weisz & Prater 1954).
    """
    known = isinstance(hot_position, (int, float)) and hot_position == hot_position
    k = int(np.argmin(np.abs(np.asarray(z) - hot_position))) if known else len(z) - 1
    eff, mod, wp = {}, {}, {}
    for j, r in enumerate(case.reactions):
        species, order = limiting_reactant(r, case.design.key_species)
        e = profile[:, j, 0]
        eff[r.equation] = {"inlet": float(e[0]), "hot_spot": float(e[k]), "outlet": float(e[-1]),
                           "min": float(e.min())}
        phi = float(profile[0, j, 1])
        mod[r.equation] = phi if phi > 0 else None
        wp[r.equation] = float(e[0] * phi * phi * 2.0 / (order + 1.0)) if phi > 0 else None
    return {"model": describe(case), "effectiveness": eff, "modulus_inlet": mod, "weisz_prater_inlet": wp,
            "rates_per_reactor_volume": "keep eta = 1 (only rates per catalyst mass are limited by the pellets)"}


def describe(case):
    """One line on the pellet model, for summary.json and the report."""
    cat = case.catalyst
    return (f"{cat.shape} pellets, V_p/S_p = {cat.volume_to_surface * 1e3:.4g} mm ({cat.length_source}), D_e = "
            f"{cat.effective_diffusivity:.3g} m^2/s, pellet density {cat.pellet_density:.5g} kg/m^3 "
            f"({cat.density_source}); isothermal pellets, generalized modulus of Bischoff (1965) with the "
            "first-order closed form of the shape; no external film (surface state = bulk state)")
