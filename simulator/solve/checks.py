"""Conservation checks and data-range warnings of a finished run.

* Element closure: every element (and, for custom species without elements,
  the total mass) entering must leave: max |out - in| / in.
  The stoichiometry is checked at load, so this detects integration and round-off
  errors in the flows (and negative flows clipped away), not wrong stoichiometry.
* Energy closure: H_out - H_in - Q = 0, with the stream enthalpies evaluated
  independently of the kernel by Cantera's own species thermo (ideal-gas part)
  and Q the integrated wall heat; relative to the largest of |Q|, the reaction
  heat sum_i (F_i,out - F_i,in) h_i(T_in), the sensible heat change at the inlet
  pressure, the pressure (departure) change and a floor of 1e-3 F_T R T_in. It detects
  integration error in T and Q and any mismatch between the kernel's thermo and
  Cantera's; in an isothermal run Q is the duty the kernel integrated, so the check
  reduces to the flows and the thermo consistency.
  With a flowing medium (co- or counter-current) the balance is the exchanger's:
  H_out - H_in + (enthalpy gained by the medium) = 0, the medium's gain
  C_m (Tc(L) - Tc(0)) signed by its direction (:mod:`simulator.model.heat`), so the
  integration of the medium temperature is checked too; with a uniform medium (a
  bath of one temperature) the wall duty Q stands for it.
"""
import functools

import numpy as np

from simulator.model import kernel as compiled_kernel
from simulator.model.heat import arrangement_of


@functools.lru_cache(maxsize=32)
def _cantera_species_thermo(species_path, names, custom_key):
    """Cantera thermo objects of the model's species (cached per species set)."""
    from simulator.thermo.species_data import species_in_file

    in_file = species_in_file(species_path) if species_path else {}
    return {n: in_file[n].thermo for n in names if n in in_file and n not in custom_key}


def _enthalpy_cantera(model, F, T, P, K=compiled_kernel):
    """Stream enthalpy [W] from Cantera species thermo (custom species: exact constant-cp form)."""
    case = model.case
    custom = {c.name: c for c in case.thermo.custom}
    thermo = _cantera_species_thermo(model.species.species_path, model.species.names, tuple(sorted(custom)))
    H = 0.0
    for name, Fi in zip(model.species.names, F):
        if name in custom:
            c = custom[name]
            h = c.enthalpy_of_formation + c.cp * (T - 298.15)
        else:
            h = thermo[name].h(T) / 1000.0
        H += Fi * h
    if case.thermo.equation_of_state == "peng-robinson":
        crit = model.args[9]
        Ft = float(np.sum(np.clip(F, 0, None)))
        H += Ft * K.pr_departure(T, P, np.clip(F, 0, None) / Ft, crit)[1]
    return H


def stream_enthalpy(model, F, T, P):
    """Enthalpy flow of a stream of the model's species, [W] (Cantera species thermo, see the closure).

    Parameters
    ----------
    model : simulator.model.build.Model
        Model whose species and thermo the stream has.
    F : ndarray
        Molar flows (n,), [mol/s]
    T : float
        Temperature, [K]
    P : float
        Pressure, [Pa]
    """
    return _enthalpy_cantera(model, np.asarray(F, dtype=float), T, P)


def closure(model, ys, K=compiled_kernel):
    """Element and energy closure of a profile (per tube states), relative [-]."""
    n = model.n
    F_in, F_out = ys[0, :n], ys[-1, :n]
    elements = sorted({e for el in model.species.elements for e in el})
    worst = 0.0
    for e in elements:
        a = np.array([el.get(e, 0.0) for el in model.species.elements])
        inflow = float(a @ F_in)
        if inflow > 0:
            worst = max(worst, abs(float(a @ F_out) - inflow) / inflow)
    mw = model.species.molar_mass
    mass_in = float(mw @ F_in)
    worst = max(worst, abs(float(mw @ F_out) - mass_in) / mass_in)
    T_in, T_out = ys[0, n], ys[-1, n]
    P_in, P_out = ys[0, n + 1], ys[-1, n + 1]
    H_in = _enthalpy_cantera(model, F_in, T_in, P_in, K)
    H_out = _enthalpy_cantera(model, F_out, T_out, P_out, K)
    Q = ys[-1, n + 3]
    medium_change = arrangement_of(model.case.heat).medium_enthalpy_change
    if medium_change is not None:   # the medium's own enthalpy gain instead of the integrated wall heat
        Q = -medium_change(model.case.heat, model.count, ys[0, n + 2], ys[-1, n + 2])
    H_ref = _enthalpy_cantera(model, F_out, T_in, P_in, K)
    reaction_heat = abs(H_ref - H_in)
    sensible = abs(_enthalpy_cantera(model, F_out, T_out, P_in, K) - H_ref)
    pressure = abs(H_out - _enthalpy_cantera(model, F_out, T_out, P_in, K))
    # floor: 1e-3 of the flow's thermal scale F_T R T, so a run where nothing happens is not 0/0
    floor = 1e-3 * float(np.sum(np.abs(F_in))) * 8.314462618 * T_in
    scale = max(abs(Q), reaction_heat, sensible, pressure, floor)
    energy = abs(H_out - H_in - Q) / scale
    return {"elements_relative": worst, "energy_relative": energy}


#: Closure above which a run carries a warning, [-]
CLOSURE_LIMITS = {"elements_relative": 1e-9, "energy_relative": 1e-6}


#: Closure above which the run is failed, not merely flagged: at the tolerances a case may ask for
#: (rtol <= 1e-3) integration error stays well below these, so a larger one is a model defect
#: (a liquid root, a phase change, a state the thermo does not cover), [-]
CLOSURE_FAILURE = {"elements_relative": 1e-4, "energy_relative": 1e-2}
#: Z below which the only root of the cubic is taken as liquid-like (below the pseudo-critical
#: temperature), [-]; common practice, no source
LIQUID_LIKE_Z = 0.3


def closure_failure(closure_values):
    """Why a run's closure makes it a failed run (a phrase), or None."""
    for key, limit in CLOSURE_FAILURE.items():
        value = closure_values.get(key)
        if value is not None and not value <= limit:
            what = "element (mass)" if key.startswith("elements") else "energy"
            return (f"the {what} balance closes only to {value:.2g} (a run is failed above {limit:g}): the "
                    "results are not trustworthy")
    return None


def phase_failure(model, zs, ys, K=compiled_kernel):
    """Where the Peng-Robinson gas is not a gas (liquid-like root or a more stable liquid), or None.

    Detects, at each profile point, a cubic whose smaller root at the same composition has the
    lower Gibbs energy (the gas would condense), or a single root that is liquid-like
    (Z < :data:`LIQUID_LIKE_Z` below Kay's pseudo-critical temperature sum_i x_i Tc_i). A
    mixture can also split into two phases before either shows; that is not detected here.
    """
    if model.case.thermo.equation_of_state != "peng-robinson":
        return None
    n = model.n
    crit = model.args[9]
    F = np.ascontiguousarray(np.clip(ys[:, :n], 0.0, None))
    roots = K.pr_phase_profile(np.ascontiguousarray(ys[:, n]), np.ascontiguousarray(ys[:, n + 1]), F, crit)
    x = F / F.sum(axis=1, keepdims=True)
    T_pc = x @ crit[:, 0]
    condenses = (roots[:, 1] < roots[:, 0]) & (roots[:, 3] < roots[:, 2])
    liquid = (roots[:, 0] < LIQUID_LIKE_Z) & (ys[:, n] < T_pc)
    bad = np.nonzero(condenses | liquid)[0]
    if not len(bad):
        return None
    k = int(bad[0])
    main = int(np.argmax(x[k]))
    what = ("a liquid at the same composition is more stable than the gas (the gas would condense)"
            if condenses[k] else f"the only Peng-Robinson root is liquid-like (Z = {roots[k, 0]:.3g})")
    return (f"at z = {zs[k]:.6g} m (T = {ys[k, n]:.6g} K, P = {ys[k, n + 1]:.6g} Pa) {what}; the model has one "
            f"gas phase and no phase change (main species {model.species.names[main]}, critical temperature "
            f"{crit[main, 0]:.4g} K): raise the temperature or lower the pressure")


def closure_warnings(closure_values):
    """Warnings for closures above :data:`CLOSURE_LIMITS` (loose tolerances or a model defect)."""
    out = []
    for key, limit in CLOSURE_LIMITS.items():
        value = closure_values.get(key)
        if value is not None and value > limit:
            what = "element (mass)" if key.startswith("elements") else "energy"
            out.append(f"{what} balance closes only to {value:.2g} (limit {limit:g}): tighten [solver] rtol / "
                       "atol_scale; the results carry errors of that size")
    return out


def compressibility_profile(model, ys, K=compiled_kernel):
    """Z along the tube: the case's EOS, or Peng-Robinson as a check where critical data exist."""
    n = model.n
    crit = model.args[9]
    F = np.clip(ys[:, :n], 0.0, None)
    present = F.max(axis=0) > 0
    if not np.all(np.isfinite(crit[present])):
        return np.full(len(ys), np.nan)
    sub = np.ascontiguousarray(crit[present])
    return K.compressibility_profile(np.ascontiguousarray(ys[:, n]), np.ascontiguousarray(ys[:, n + 1]),
                                     np.ascontiguousarray(F[:, present]), sub)


def range_warnings(model, ys):
    """Warnings where the temperature left a species' data range (species present only)."""
    n = model.n
    T_lo, T_hi = float(ys[:, n].min()), float(ys[:, n].max())
    out = []
    for i, name in enumerate(model.species.names):
        if ys[:, i].max() <= 0:
            continue
        lo, hi = model.species.t_min[i], model.species.t_max[i]
        if T_lo < lo or T_hi > hi:
            out.append(f"temperature {T_lo:.1f}-{T_hi:.1f} K leaves the data range of {name} "
                       f"({lo:.0f}-{hi:.0f} K, {model.species.sources[i]}): its properties are extrapolated")
    crit_missing = [name for name, src in zip(model.species.names, model.critical_sources) if not src]
    if crit_missing and model.case.thermo.equation_of_state == "ideal-gas":
        out.append(f"no critical constants for {', '.join(crit_missing)}: the ideal-gas check (Z) is not "
                   "available; give [thermo.critical.NAME] to enable it")
    return out
