"""Element and energy closure of a mechanism run, from Cantera's species data.

Same definitions as :func:`simulator.solve.checks.closure`: elements max |out - in| / in
(and the total mass); energy |H_out - H_in - Q| relative to the largest of |Q|, the reaction
heat at the inlet temperature, the sensible heat change and a floor of 1e-3 F_T R T_in. The
stream enthalpies come from each species' own Cantera thermo (``Species.thermo.h``,
ideal gas), independently of the partial molar enthalpies the balances used; with a
co-current medium Q is the medium's enthalpy loss (so its integration is checked too).
"""
import numpy as np

from simulator.model.heat import arrangement_of
from simulator.units import R as R_GAS

KMOL = 1000.0


def stream_enthalpy(gas, F, T):
    """Enthalpy flow of molar flows ``F`` [mol/s] at ``T`` [K], [W] (ideal gas)."""
    h = np.array([gas.species(k).thermo.h(T) for k in range(gas.n_species)]) / KMOL
    return float(np.asarray(F) @ h)


def mechanism_closure(tube, ys):
    """{"elements_relative", "energy_relative"} of per-tube states ``ys`` (rows [F, T, P, Tc, Q])."""
    gas, n = tube.gas, tube.n
    F_in, F_out = ys[0, :n], ys[-1, :n]
    worst = 0.0
    for e in gas.element_names:
        a = np.array([gas.n_atoms(k, e) for k in range(n)])
        inflow = float(a @ F_in)
        if inflow > 0:
            worst = max(worst, abs(float(a @ F_out) - inflow) / inflow)
    mass_in = float(tube.molar_mass @ F_in)
    worst = max(worst, abs(float(tube.molar_mass @ F_out) - mass_in) / mass_in)
    T_in, T_out = ys[0, n], ys[-1, n]
    H_in, H_out = stream_enthalpy(gas, F_in, T_in), stream_enthalpy(gas, F_out, T_out)
    Q = ys[-1, n + 3]
    heat = tube.case.heat
    change = arrangement_of(heat).medium_enthalpy_change if heat.exchange else None
    if change is not None:
        Q = -change(heat, tube.count, ys[0, n + 2], ys[-1, n + 2])
    H_ref = stream_enthalpy(gas, F_out, T_in)
    floor = 1e-3 * float(np.sum(np.abs(F_in))) * R_GAS * T_in
    scale = max(abs(Q), abs(H_ref - H_in), abs(H_out - H_ref), floor)
    return {"elements_relative": worst, "energy_relative": abs(H_out - H_in - Q) / scale}
