"""Results of a reaction network: extents, yields, selectivities, approach to equilibrium.

Plain functions over a run's molar flows (whole reactor), temperature and pressure, called by
:mod:`simulator.results`; nothing here integrates.

* **Extents.** ``F(z) - F(0) = nu xi(z)``. When the stoichiometric matrix ``nu`` (n x m) has full
  column rank the extents are unique and are recovered exactly from the flows (least squares
  with a zero residual up to round-off). Otherwise they are not defined by the flows alone and
  are not reported (:func:`extents` returns None and :func:`extents_note` says why); the
  balances are not enlarged by extra states for them.
* **Yield and selectivity** of a product p on the key species k:
  ``yield = s (F_p - F_p,0) / F_k,0`` and ``selectivity = s (F_p - F_p,0) / (F_k,0 - F_k)``,
  with ``s`` the stoichiometric ratio along the shortest chain of reactions that leads from k to p
  (:func:`simulator.case.product_chain.product_scale`): for a reaction consuming k and forming p, ``s = -nu_k / nu_p``;
  through an intermediate q, the product of the ratios of each step (A -> B -> C: s_C = s_B s_BC).
* **Approach to equilibrium** of a reversible reaction: ``Q/K = prod (y_i P / P0)^nu_i / K0(T)``
  with K0 from the same NASA-7 rows as the kernel (standard state 1 atm), ideal-gas activities.
* **Equilibrium conversion** of the key species at a given T and P (:func:`equilibrium_conversion`):
  from the feed composition, by the case's own K of its one reversible reaction that consumes the
  key species (the irreversible reactions held at zero extent). The check against Cantera's
  ``equilibrate("TP")`` on the same species is in ``tests/test_network.py``.
"""
import math

import numpy as np

from simulator.case.product_chain import product_scale  # noqa: F401  (re-exported for results)
from simulator.thermo.nasa7 import h_RT, s_R
from simulator.units import P_STANDARD


def stoichiometric_matrix(case, species):
    """``nu`` (n_species, n_reactions) of the case in the given species order, [-]."""
    index = {s: i for i, s in enumerate(species)}
    nu = np.zeros((len(species), len(case.reactions)))
    for j, r in enumerate(case.reactions):
        for s, v in r.stoichiometry:
            nu[index[s], j] += v
    return nu


def extents(nu, F):
    """Extent of each reaction along the tube, (N, m), [mol/s]; None when nu lacks full column rank.

    Parameters
    ----------
    nu : ndarray
        Stoichiometric matrix (n_species, n_reactions), [-]
    F : ndarray
        Molar flows along the tube (N, n_species), [mol/s]

    Examples
    --------
    >>> nu = np.array([[-1.0, 0.0], [1.0, -1.0], [0.0, 1.0]])
    >>> extents(nu, np.array([[1.0, 0.0, 0.0], [0.5, 0.3, 0.2]]))[1].round(12).tolist()
    [0.5, 0.2]
    """
    if np.linalg.matrix_rank(nu) < nu.shape[1]:
        return None
    xi, *_ = np.linalg.lstsq(nu, (F - F[0]).T, rcond=None)
    return xi.T


def extents_note(nu):
    """A plain sentence when the extents cannot be told from the flows, else ''."""
    rank = int(np.linalg.matrix_rank(nu))
    if rank < nu.shape[1]:
        return (f"reaction extents not reported: the stoichiometric matrix has rank {rank} for "
                f"{nu.shape[1]} reactions, so the flows do not determine each reaction's extent")
    return ""


def yield_and_selectivity(F, key_index, product_index, scale):
    """(yield, selectivity) along the tube, [-]; selectivity NaN where nothing is converted.

    Examples
    --------
    >>> F = np.array([[1.0, 0.0], [0.6, 0.3]])
    >>> [v.tolist() for v in yield_and_selectivity(F, 0, 1, 1.0)]
    [[0.0, 0.3], [nan, 0.75]]
    """
    formed = scale * (F[:, product_index] - F[0, product_index])
    converted = F[0, key_index] - F[:, key_index]
    with np.errstate(divide="ignore", invalid="ignore"):
        sel = np.where(converted > 1e-12 * F[0, key_index], formed / converted, np.nan)
    return formed / F[0, key_index], sel


def ln_K0(nasa, nu_j, T):
    """ln K0 of one reaction at T from NASA-7 rows (standard state 1 atm), [-]."""
    dG_RT = sum(v * (h_RT(nasa[i], T) - s_R(nasa[i], T)) for i, v in enumerate(nu_j) if v != 0.0)
    return -dG_RT


def approach_to_equilibrium(nasa, nu_j, F, T, P):
    """Q/K of one reaction along the tube with ideal-gas activities, [-]; NaN where Q is not defined.

    Parameters
    ----------
    nasa : ndarray
        NASA-7 rows of the species (n, 15), [-]
    nu_j : ndarray
        Stoichiometric coefficients of the reaction (n,), [-]
    F : ndarray
        Molar flows (N, n), [mol/s]
    T : ndarray
        Temperature (N,), [K]
    P : ndarray
        Pressure (N,), [Pa]
    """
    out = np.full(len(T), np.nan)
    for k in range(len(T)):
        x = F[k] / F[k].sum()
        if any(x[i] <= 0.0 for i in np.nonzero(nu_j)[0]):
            continue
        lnQ = sum(v * math.log(x[i] * P[k] / P_STANDARD) for i, v in enumerate(nu_j) if v != 0.0)
        out[k] = math.exp(min(lnQ - ln_K0(nasa, nu_j, T[k]), 700.0))
    return out


def equilibrium_reaction(case):
    """Index of the one reversible reaction consuming the key species, or None (none, or several)."""
    key = case.design.key_species
    found = [j for j, r in enumerate(case.reactions) if r.reversible and dict(r.stoichiometry).get(key, 0.0) < 0]
    return found[0] if len(found) == 1 else None


def equilibrium_conversion(case, T, P, nasa, species, feed_flows=None):
    """Equilibrium conversion of the key species at T and P from the feed, [-]; NaN if not defined.

    Uses the case's own equilibrium constant (NASA-7 rows, 1 atm standard state, ideal gas) of its
    one reversible reaction consuming the key species; other reactions are held at zero extent.

    Parameters
    ----------
    case : Case
        The validated case
    T : float
        Temperature, [K]
    P : float
        Pressure, [Pa]
    nasa : ndarray
        NASA-7 rows in the order of ``species`` (n, 15), [-]
    species : tuple of str
        Species order of ``nasa``
    feed_flows : ndarray, optional
        Flows to start from (n,), [mol/s]; the case's feed mole fractions when omitted

    Returns
    -------
    X_eq : float
        Conversion of the key species at equilibrium, [-]
    """
    from scipy.optimize import brentq

    j = equilibrium_reaction(case)
    if j is None:
        return float("nan")
    nu = stoichiometric_matrix(case, species)[:, j]
    if feed_flows is None:
        x0 = dict(case.feed.mole_fractions)
        feed_flows = np.array([x0.get(s, 0.0) for s in species])
    F0 = np.asarray(feed_flows, dtype=float)
    k = species.index(case.design.key_species)
    lnK = ln_K0(nasa, nu, T)
    # extents keeping every flow >= 0: forward bounded by the reactants, backward by the products
    hi = min(F0[i] / -v for i, v in enumerate(nu) if v < 0)
    lo = max([-F0[i] / v for i, v in enumerate(nu) if v > 0] or [0.0])

    def g(xi):
        F = F0 + nu * xi
        Ft = F.sum()
        return sum(v * math.log(max(F[i], 1e-300) / Ft * P / P_STANDARD) for i, v in enumerate(nu) if v != 0.0) - lnK

    span = hi - lo
    a, b = lo + 1e-14 * span, hi - 1e-14 * span
    ga, gb = g(a), g(b)
    if ga * gb > 0:   # equilibrium beyond a bound within round-off: the bound itself
        xi = b if gb < 0 else a
    else:
        xi = brentq(g, a, b, xtol=1e-14 * max(span, 1e-300), rtol=1e-13)
    return float(-nu[k] * xi / F0[k])


def equilibrium_limited_sentence(target, X_eq):
    """The plain statement when a target conversion is beyond equilibrium, or ''."""
    if X_eq != X_eq or not target == target or target <= X_eq:
        return ""
    return f"equilibrium-limited: at most X = {X_eq:.3g} at the outlet conditions"
