"""Network outputs of one run: yields, selectivities, extents, approach to equilibrium (computed on demand).

:class:`simulator.results.Result` asks for these when it writes ``summary.json`` and
``profile.csv``; a sweep that reads only the hot spot never pays for them. The definitions are
in :mod:`simulator.network` (and in the README, section "Reaction networks").

* ``products`` (``[design] products``): yield and selectivity of each named product on the key
  species at the outlet, and as profile columns;
* extents of every reaction along the tube (profile columns, two reactions or more, where the
  flows determine them);
* for each reversible reaction its approach to equilibrium Q/K along the tube, and for the one
  reversible reaction that consumes the key species the equilibrium conversion at the local T and
  P from the feed; at the outlet, the plain statement when the target lies beyond it.
"""
import numpy as np

from simulator import network


def network_of(result):
    """The network dict of a run (cached in ``result.extra``): see the module docstring.

    Returns
    -------
    dict
        ``columns``: {profile.csv header: array}; ``products``: {name: {yield, selectivity}} at the
        outlet; ``equilibrium``: dict or None; ``notes``: list of plain sentences.
    """
    if "network" in result.extra:
        return result.extra["network"]
    out = _compute(result)
    result.extra["network"] = out
    return out


def _compute(result):
    case = result.case
    species = tuple(result.species)
    nasa = result.extra.get("nasa")
    F = np.asarray(result.F, dtype=float)
    nu = network.stoichiometric_matrix(case, species)
    key = species.index(case.design.key_species)
    columns, products, notes = {}, {}, []
    for name in case.design.products:
        scale, _ = network.product_scale(case.reactions, case.design.key_species, name)
        y, sel = network.yield_and_selectivity(F, key, species.index(name), scale)
        columns[f"yield_{name}"] = y
        columns[f"selectivity_{name}"] = sel
        products[name] = {"yield": float(y[-1]), "selectivity": float(sel[-1])}
    if len(case.reactions) >= 2:
        xi = network.extents(nu, F)
        if xi is None:
            notes.append(network.extents_note(nu))
        else:
            for j in range(xi.shape[1]):
                columns[f"extent_R{j + 1}_mol_per_s"] = xi[:, j]
    equilibrium = None
    if nasa is not None:
        T, P = np.asarray(result.T, dtype=float), np.asarray(result.P, dtype=float)
        for j, r in enumerate(case.reactions):
            if r.reversible:
                columns[f"approach_to_equilibrium_R{j + 1}"] = network.approach_to_equilibrium(nasa, nu[:, j], F, T, P)
        j = network.equilibrium_reaction(case)
        if j is not None:
            feed = F[0] / case.tube.count
            X_eq = np.array([network.equilibrium_conversion(case, T[k], P[k], nasa, species, feed)
                             for k in range(len(T))])
            columns[f"equilibrium_conversion_{case.design.key_species}"] = X_eq
            target = case.design.target_conversion
            sentence = network.equilibrium_limited_sentence(target, float(X_eq[-1]))
            equilibrium = {"reaction": r_label(case, j), "outlet_equilibrium_conversion": float(X_eq[-1]),
                           "outlet_approach_Q_over_K": float(columns[f"approach_to_equilibrium_R{j + 1}"][-1]),
                           "target_beyond_equilibrium": bool(sentence), "note": sentence}
            if sentence:
                notes.append(sentence)
    return {"columns": columns, "products": products, "equilibrium": equilibrium, "notes": notes}


def r_label(case, j):
    """``R<j+1>: <equation>`` of reaction j."""
    return f"R{j + 1}: {case.reactions[j].equation}"
