"""Adiabatic temperature rise for complete conversion of the key species.

The rise comes from the steady-flow enthalpy balance with temperature-dependent
heat capacities (NASA-7 or constant-cp rows), not from a constant-cp shortcut:

    sum_i F_i,out h_i(T_ad) = sum_i F_i,0 h_i(T_0)      (ideal-gas enthalpies)

The outlet is the worst case the declared reactions allow: among all forward
extents xi_j >= 0 that keep every flow non-negative (F_0 + nu xi >= 0), first the
largest consumption of the key species (complete conversion unless a co-reactant
runs out first), then, among those, the largest heat release at the feed
temperature (two linear programmes). With one reaction that is simply complete
conversion of the key species; with several (a selective and a total oxidation,
consecutive reactions) it is the most exothermic way to use up the key species and
what the other reactions can still burn. Reversible reactions are taken to
completion too, so for them the rise is an upper bound that equilibrium may cap.
This worst-case convention is common practice for screening (no source).
"""
import math

import numpy as np
from scipy.optimize import brentq, linprog

from simulator.thermo.nasa7 import h_RT
from simulator.units import R

T_MIN, T_MAX = 100.0, 6000.0   # search range of the adiabatic outlet temperature [K]


def stream_enthalpy(F, T, nasa):
    """Ideal-gas enthalpy flow of a stream, [W].

    Parameters
    ----------
    F : ndarray
        Molar flows, [mol/s]
    T : float
        Temperature, [K]
    nasa : ndarray
        (n, 15) NASA-7 rows, [-]

    Returns
    -------
    H : float
        Enthalpy flow including formation enthalpies, [W]
    """
    return float(sum(F[i] * h_RT(nasa[i], T) * R * T for i in range(len(F))))


def worst_case_extents(F0, T0, nu, key, nasa):
    """Forward extents of the worst-case outlet (see the module docstring), [mol/s].

    Parameters
    ----------
    F0 : ndarray
        Feed molar flows, [mol/s]
    T0 : float
        Feed temperature, [K]
    nu : ndarray
        (n, m) stoichiometric matrix, [-]
    key : int
        Index of the key species, [-]
    nasa : ndarray
        (n, 15) NASA-7 rows, [-]

    Returns
    -------
    xi : ndarray or None
        Extent of each reaction, None when no reaction consumes the key species, [mol/s]
    """
    n, m = nu.shape
    if not np.any(nu[key] < 0):
        return None
    if m == 1:       # one reaction: its extent is set by the first reactant to run out (no LP needed)
        reactants = nu[:, 0] < 0
        return np.array([float(np.min(F0[reactants] / -nu[reactants, 0]))])
    h0 = np.array([h_RT(nasa[i], T0) * R * T0 for i in range(n)])
    dH = h0 @ nu                                       # [J/mol] per unit extent
    bound = 100.0 * float(F0.sum()) / max(float(np.min(np.abs(nu[nu != 0]))), 1e-12)
    bounds = [(0.0, bound)] * m
    A_ub, b_ub = -nu, F0                               # F0 + nu xi >= 0
    first = linprog(nu[key], A_ub=A_ub, b_ub=b_ub, bounds=bounds, method="highs")
    if not first.success:
        return None
    consumed = -first.fun
    # keep that consumption (to a relative 1e-9) and release the most heat
    A2 = np.vstack([A_ub, nu[key][None, :]])
    b2 = np.concatenate([b_ub, [-consumed * (1.0 - 1e-9)]])
    second = linprog(dH, A_ub=A2, b_ub=b2, bounds=bounds, method="highs")
    xi = second.x if second.success else first.x
    return np.clip(xi, 0.0, None)


def adiabatic_rise(F0, T0, nu, key, nasa):
    """Adiabatic temperature rise for complete conversion of species ``key``, [K].

    Parameters
    ----------
    F0 : ndarray
        Feed molar flows, [mol/s]
    T0 : float
        Feed temperature, [K]
    nu : ndarray
        (n, m) stoichiometric matrix, [-]
    key : int
        Index of the key species.
    nasa : ndarray
        (n, 15) NASA-7 rows, [-]

    Returns
    -------
    rise : float
        T_ad - T0, negative for endothermic reactions, [K]
    info : dict
        ``reaction`` (index of the reaction releasing the most heat in the worst case),
        ``extents`` [mol/s] of every reaction, ``limited_by`` (index of a reactant that ran
        out, the key species if it did), ``outlet_temperature`` [K]; ``note`` when the
        balance has no solution between T_MIN and T_MAX (the rise is then NaN: complete
        conversion cannot happen adiabatically, e.g. a strongly endothermic feed)
    """
    xi = worst_case_extents(np.asarray(F0, dtype=float), T0, nu, key, nasa)
    if xi is None:
        return math.nan, {}
    F_out = np.clip(F0 + nu @ xi, 0.0, None)
    n = len(F0)
    h0 = np.array([h_RT(nasa[i], T0) * R * T0 for i in range(n)])
    heat = -(h0 @ nu) * xi
    main = int(np.argmax(heat)) if np.any(heat > 0) else int(np.argmax(xi))
    reactants = [i for i in range(n) if F0[i] > 0 and F_out[i] <= 1e-9 * F0[i]]
    limited = key if key in reactants else (reactants[0] if reactants else key)
    info = {"reaction": main, "extents": [float(v) for v in xi], "limited_by": limited}
    H0 = stream_enthalpy(F0, T0, nasa)

    def balance(T):
        return stream_enthalpy(F_out, T, nasa) - H0

    if balance(T0) < 0:      # exothermic: expand upward
        lo, hi = T0, T0 * 1.5
        while balance(hi) < 0 and hi < T_MAX:
            lo, hi = hi, min(hi * 1.5, T_MAX)
    else:                    # endothermic: expand downward
        lo, hi = T0 / 1.5, T0
        while balance(lo) > 0 and lo > T_MIN:
            hi, lo = lo, max(lo / 1.5, T_MIN)
    if not (balance(lo) * balance(hi) <= 0):     # same sign, or NaN for states outside any data (T ~ 0 K)
        info.update(outlet_temperature=math.nan, note=f"no solution between {T_MIN:g} K and {T_MAX:g} K")
        return math.nan, info
    T_ad = brentq(balance, lo, hi, xtol=1e-9, rtol=1e-13)
    info["outlet_temperature"] = T_ad
    return T_ad - T0, info
