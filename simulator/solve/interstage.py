"""What happens between two beds of a reactor train: set a temperature, or mix in a quench.

One job: from a bed's outlet (molar flows, T, P) and its :class:`~simulator.case.schema.Interstage`
entry, the next bed's inlet and what the step took or gave:

* ``cool-to`` / ``heat-to``: the gas leaves at the set temperature, flows and pressure unchanged;
  the duty is the ideal-gas enthalpy change ``H(F, T_set) - H(F, T_out)`` [W] (negative = heat
  removed by the interstage exchanger).
* ``quench``: a share of the fresh feed (at the quench temperature, default the feed temperature)
  or a stream of its own is mixed in adiabatically at the bed outlet pressure; the mixed
  temperature solves ``H(F_out + F_q, T_mix) = H(F_out, T_out) + H(F_q, T_q)`` (Brent's method;
  the root lies between the two temperatures since every cp > 0). No heat crosses the boundary.

Enthalpies are ideal-gas enthalpies (formation enthalpy included) from the model's NASA-7 rows,
the same species data the kernel integrates with (a train runs on the ideal gas only,
:data:`simulator.case.train.TRAIN_EOS`).

References
----------
.. [1] B.J. McBride, M.J. Zehe, S. Gordon, "NASA Glenn coefficients for calculating thermodynamic
   properties of individual species", NASA/TP-2002-211556, 2002.
"""
import math
from dataclasses import dataclass, field

import numpy as np
from scipy.optimize import brentq

from simulator.thermo.nasa7 import h_RT
from simulator.units import R


@dataclass(frozen=True)
class InterstageStep:
    """One interstage step as it ran.

    Attributes
    ----------
    after_bed : int, 1-based number of the bed it follows
    kind : "cool-to" | "heat-to" | "quench"
    inlet_temperature : float, gas leaving the bed [K]
    outlet_temperature : float, gas entering the next bed (set, or mixed) [K]
    pressure : float, pressure of the step (the bed outlet pressure) [Pa]
    duty : float, heat added by the step (negative = removed; 0 for a quench) [W]
    added_flows : ndarray, molar flows mixed in (zeros unless a quench) [mol/s]
    added_temperature : float, temperature of what is mixed in (NaN unless a quench) [K]
    flows : ndarray, molar flows entering the next bed [mol/s]
    """

    after_bed: int
    kind: str
    inlet_temperature: float
    outlet_temperature: float
    pressure: float
    duty: float
    added_flows: np.ndarray = field(repr=False)
    added_temperature: float
    flows: np.ndarray = field(repr=False)


def stream_enthalpy(nasa, F, T):
    """Ideal-gas enthalpy flow of a stream, formation enthalpies included, [W].

    Parameters
    ----------
    nasa : ndarray
        NASA-7 rows of the species (n, 15), [-]
    F : ndarray
        Molar flows (n,), [mol/s]
    T : float
        Temperature, [K]

    Examples
    --------
    >>> from simulator.thermo.nasa7 import constant_cp_coefficients
    >>> rows = np.array([constant_cp_coefficients(30.0, 0.0)])
    >>> round(float(stream_enthalpy(rows, np.array([2.0]), 398.15)), 6)
    6000.0
    """
    return R * T * sum(float(Fi) * h_RT(nasa[i], T) for i, Fi in enumerate(F) if Fi != 0.0)


def mixed_temperature(nasa, F_a, T_a, F_b, T_b):
    """Temperature of two ideal-gas streams mixed adiabatically at constant pressure, [K].

    Parameters
    ----------
    nasa : ndarray
        NASA-7 rows of the species (n, 15), [-]
    F_a : ndarray
        Molar flows of the first stream (n,), [mol/s]
    T_a : float
        Temperature of the first stream, [K]
    F_b : ndarray
        Molar flows of the second stream (n,), [mol/s]
    T_b : float
        Temperature of the second stream, [K]

    Returns
    -------
    T_mix : float
        Temperature of the mixture, between T_a and T_b, [K]

    Examples
    --------
    >>> from simulator.thermo.nasa7 import constant_cp_coefficients
    >>> rows = np.array([constant_cp_coefficients(30.0, 0.0)])
    >>> round(mixed_temperature(rows, np.array([1.0]), 300.0, np.array([3.0]), 700.0), 9)
    600.0
    """
    F_mix = np.asarray(F_a, dtype=float) + np.asarray(F_b, dtype=float)
    target = stream_enthalpy(nasa, F_a, T_a) + stream_enthalpy(nasa, F_b, T_b)
    lo, hi = min(T_a, T_b), max(T_a, T_b)
    if hi - lo <= 1e-12 * hi:
        return float(hi)

    def excess(T):
        return stream_enthalpy(nasa, F_mix, T) - target

    # the NASA rows are continuous but their two ranges meet at T_mid with a tiny jump, so the
    # bracket is widened by a hair before root finding
    pad = 1e-9 * hi
    return float(brentq(excess, lo - pad, hi + pad, xtol=1e-12 * hi, rtol=1e-14, maxiter=200))


def apply_interstage(after, bed_number, F_out, T_out, P_out, nasa, species, fresh_flows, fresh_temperature):
    """The next bed's inlet after the interstage step ``after`` (see the module docstring).

    Parameters
    ----------
    after : simulator.case.schema.Interstage
        The ``[[train.after]]`` entry.
    bed_number : int
        1-based number of the bed the step follows, [-]
    F_out : ndarray
        Molar flows leaving the bed, whole reactor (n,), [mol/s]
    T_out : float
        Temperature leaving the bed, [K]
    P_out : float
        Pressure leaving the bed, [Pa]
    nasa : ndarray
        NASA-7 rows of the species (n, 15), [-]
    species : tuple of str
        Species order of ``F_out`` and ``nasa``
    fresh_flows : ndarray
        Molar flows of the whole fresh feed as written, before the quench shares are taken (n,), [mol/s]
    fresh_temperature : float
        Feed temperature, [K]

    Returns
    -------
    InterstageStep
    """
    F_out = np.asarray(F_out, dtype=float)
    zeros = np.zeros_like(F_out)
    if after.kind in ("cool-to", "heat-to"):
        T_set = after.temperature
        duty = stream_enthalpy(nasa, F_out, T_set) - stream_enthalpy(nasa, F_out, T_out)
        return InterstageStep(after_bed=bed_number, kind=after.kind, inlet_temperature=T_out,
                              outlet_temperature=T_set, pressure=P_out, duty=duty, added_flows=zeros,
                              added_temperature=math.nan, flows=F_out.copy())
    F_q, T_q = quench_input(after, species, fresh_flows, fresh_temperature)
    T_mix = mixed_temperature(nasa, F_out, T_out, F_q, T_q)
    return InterstageStep(after_bed=bed_number, kind=after.kind, inlet_temperature=T_out,
                          outlet_temperature=T_mix, pressure=P_out, duty=0.0, added_flows=F_q,
                          added_temperature=T_q, flows=F_out + F_q)


def quench_input(after, species, fresh_flows, fresh_temperature):
    """What a quench mixes in: (molar flows (n,) [mol/s], temperature [K]).

    ``share`` takes that share of the whole fresh feed, at the quench temperature (default the feed
    temperature); a ``stream`` gives its own molar flow, mole fractions and temperature.

    Parameters
    ----------
    after : simulator.case.schema.Interstage
        A ``kind = "quench"`` entry.
    species : tuple of str
        Species order of the flows
    fresh_flows : ndarray
        Molar flows of the whole fresh feed as written (n,), [mol/s]
    fresh_temperature : float
        Feed temperature, [K]
    """
    if not math.isnan(after.share):
        T_q = fresh_temperature if math.isnan(after.temperature) else after.temperature
        return after.share * np.asarray(fresh_flows, dtype=float), T_q
    F_q = np.zeros(len(species))
    for name, x in after.stream.mole_fractions:
        F_q[species.index(name)] += x * after.stream.molar_flow
    return F_q, after.stream.temperature
