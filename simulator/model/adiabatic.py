"""Adiabatic temperature rise for complete conversion of the key species.

The rise comes from the steady-flow enthalpy balance with temperature-dependent
heat capacities (NASA-7 or constant-cp rows), not from a constant-cp shortcut:

    sum_i F_i,out h_i(T_ad) = sum_i F_i,0 h_i(T_0)      (ideal-gas enthalpies)

With one reaction consuming the key species, its extent is F_key,0/|nu_key|,
unless another reactant runs out first (then that reactant limits). With
several reactions consuming the key species, the path with the largest heat
release per mole of key species is taken: a worst case, which is common
practice for screening (no source).
"""
import math

import numpy as np
from scipy.optimize import brentq

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


def complete_conversion_outlet(F0, nu, key):
    """Outlet flows for complete conversion of the key species, one candidate per reaction.

    Yields ``(F_out, reaction_index, limited_by)`` for every reaction that consumes
    the key species; ``limited_by`` is the index of the species that runs out
    first (the key species, or a co-reactant).
    """
    for j in range(nu.shape[1]):
        if nu[key, j] >= 0:
            continue
        extent = F0[key] / -nu[key, j]
        limited = key
        for i in range(len(F0)):
            if nu[i, j] < 0 and F0[i] / -nu[i, j] < extent:
                extent, limited = F0[i] / -nu[i, j], i
        F_out = F0 + nu[:, j] * extent
        F_out[F_out < 0] = 0.0
        yield F_out, j, limited


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
        ``reaction`` index used, ``limited_by`` species index, ``outlet_temperature`` [K];
        ``note`` when the balance has no solution between T_MIN and T_MAX (the rise is then NaN:
        complete conversion cannot happen adiabatically, e.g. a strongly endothermic feed)
    """
    H0 = stream_enthalpy(F0, T0, nasa)
    candidates = []
    for F_out, j, limited in complete_conversion_outlet(F0, nu, key):
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
        if balance(lo) * balance(hi) > 0:
            candidates.append((math.nan, {"reaction": j, "limited_by": limited, "outlet_temperature": math.nan,
                                          "note": f"no solution between {T_MIN:g} K and {T_MAX:g} K"}))
            continue
        T_ad = brentq(balance, lo, hi, xtol=1e-9, rtol=1e-13)
        candidates.append((T_ad - T0, {"reaction": j, "limited_by": limited, "outlet_temperature": T_ad}))
    finite = [c for c in candidates if math.isfinite(c[0])]
    if finite:
        return max(finite, key=lambda c: c[0])
    return candidates[0] if candidates else (math.nan, {})
