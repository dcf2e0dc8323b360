"""Stoichiometric ratio of a product on the key species along a chain of reactions.

Used by the case loader (a named product must be reachable from the key species) and by
:mod:`simulator.network` (yields and selectivities).
"""


def product_scale(reactions, key, product):
    """(s, chain) for a product: the stoichiometric ratio on the key species and the reaction numbers used.

    Breadth-first over the reactions in case order from the key species: a step goes from a
    consumed species q to a formed species p of one reaction with ratio -nu_q/nu_p. The first
    (shortest) chain that reaches the product defines s. Returns (nan, ()) when no chain exists.
    """
    frontier = [(key, 1.0, ())]
    seen = {key}
    while frontier:
        nxt = []
        for q, s, chain in frontier:
            for j, r in enumerate(reactions):
                st = dict(r.stoichiometry)
                if st.get(q, 0.0) >= 0.0:
                    continue
                for p, v in r.stoichiometry:
                    if v <= 0.0 or p in seen:
                        continue
                    ratio = s * (-st[q]) / v
                    if p == product:
                        return ratio, chain + (j + 1,)
                    seen.add(p)
                    nxt.append((p, ratio, chain + (j + 1,)))
        frontier = nxt
    return float("nan"), ()
