"""``simulate_mechanism(case) -> Result``: a mechanism case through the tube balances.

Composes :class:`~simulator.mechanism.balances.MechanismTube` (balances, Jacobian),
:func:`~simulator.mechanism.integrate.solve_tube` (CVODE), the ignition locator and the
closure into the same :class:`~simulator.results.Result` as the kernel path. The Result's
``extra["summary_blocks"]`` carries the mechanism's own summary.json blocks (``ignition``,
``mechanism``, ``profile_species``), and ``extra["profile_species"]`` the species written to
profile.csv (those whose mole fraction somewhere reaches :data:`PROFILE_MOLE_FRACTION`;
summary.json has the outlet of every species).
"""
import math
import time

import numpy as np

from simulator.case.mechanism_keys import mechanism_solution
from simulator.mechanism.balances import MechanismTube
from simulator.mechanism.closure import mechanism_closure
from simulator.mechanism.ignition import IGNITION_RISE_K, locate_ignition, residence_time
from simulator.mechanism.integrate import solve_tube, steps_between
from simulator.results import Result

#: A species goes into profile.csv when its mole fraction reaches this somewhere, [-].
PROFILE_MOLE_FRACTION = 1e-6
#: Closure above which a run is failed (as simulator.solve.checks.CLOSURE_FAILURE).
CLOSURE_FAILURE = {"elements_relative": 1e-4, "energy_relative": 1e-2}


def simulate_mechanism(case, length=None):
    """Solve a mechanism case (``case.mechanism`` set); see the module docstring.

    Parameters
    ----------
    case : simulator.case.schema.Case
        Validated mechanism case.
    length : float, optional
        Integrate to this length instead of the tube length, [m]

    Returns
    -------
    Result
        ``status`` "completed", "stopped" (temperature limit, pressure floor) or "failed" (where and why).
    """
    from simulator.solve.checks import closure_failure, closure_warnings
    from simulator.solve.integrate import references_used, versions

    started = time.perf_counter()
    spec = case.mechanism
    gas = mechanism_solution(spec.path, spec.phase, spec.species)
    tube = MechanismTube(case, gas)
    n = tube.n
    L = case.tube.length if length is None else length
    opts = case.solver
    zs = np.linspace(0.0, L, opts.output_points)
    atol = tube.absolute_tolerance(opts.atol_scale)
    traj = solve_tube(tube, zs, opts.rtol, atol, opts.max_step, case.design.temperature_limit)
    zs, ys = traj.z, traj.y
    status, termination, events = "completed", f"end of tube reached at z = {L:.6g} m", {}
    if not traj.ok:
        y = ys[-1]
        status = "failed"
        termination = (f"solver failed after z = {zs[-1]:.6g} m of {L:.6g} m (T = {y[n]:.6g} K, P = {y[n + 1]:.6g} "
                       f"Pa): {traj.message}. Try solver.max_step or a tighter solver.rtol")
    elif traj.event is not None:
        status = "stopped"
        z_e, y_e = float(zs[-1]), ys[-1]
        events[traj.event] = {"position_m": z_e, "temperature_K": float(y_e[n]), "pressure_Pa": float(y_e[n + 1])}
        termination = (f"temperature limit {case.design.temperature_limit:.6g} K exceeded at z = {z_e:.6g} m "
                       "(design.temperature_limit); the run was stopped there" if traj.event == "temperature_limit"
                       else f"pressure fell below 1 % of the feed pressure at z = {z_e:.6g} m: this tube cannot "
                            "pass the feed at this pressure drop")
    negative = ys[:, :n].min() < -10 * atol[0] if len(ys) else False
    if negative and status != "failed":
        k = int(np.nonzero(ys[:, :n].min(axis=1) < -10 * atol[0])[0][0])
        status, termination = "failed", (f"a molar flow became negative beyond the solver tolerance at z = "
                                         f"{zs[k]:.6g} m: tighten solver.rtol / atol_scale")
    dTdz = np.array([tube.derivative(z, y)[n] for z, y in zip(zs, ys)]) if status != "failed" else np.zeros(len(zs))
    clos = mechanism_closure(tube, ys) if len(ys) > 1 else {"elements_relative": math.nan,
                                                            "energy_relative": math.nan}
    if status != "failed":
        defect = closure_failure(clos)
        if defect:
            status, termination = "failed", f"run failed: {defect}"
    ignition = None

    def steps(z0, y0, z1):
        return steps_between(tube, opts.rtol, atol, opts.max_step, z0, y0, z1)

    if status != "failed":
        ignition = locate_ignition(tube, zs, ys, dTdz, steps)
    hot = _hot_spot(case, zs, ys, n, dTdz, stopped=status == "stopped" and traj.event == "temperature_limit",
                    steps=steps if status != "failed" else None)
    design = _design(case, tube, zs, ys)
    notes = closure_warnings(clos) + _range_warnings(gas, ys, n)
    F = np.maximum(ys[:, :n], 0.0) * tube.count
    tau = residence_time(tube, zs, ys)
    present = np.max(F / F.sum(axis=1, keepdims=True), axis=0) >= PROFILE_MOLE_FRACTION
    profile_species = tuple(s for s, keep in zip(spec.species, present) if keep)
    Tc = ys[:, n + 2] if case.heat.exchange else np.full(len(zs), np.nan)
    elapsed = time.perf_counter() - started
    stats = {"method": "CVODE BDF (SUNDIALS via scikit-sundae), dense linear solver, Jacobian from Cantera's rate "
                       "derivatives (third-body and falloff terms skipped)",
             "kernel": "Cantera mechanism (simulator.mechanism)", "rtol": opts.rtol, "atol_scale": opts.atol_scale,
             "output_points": int(len(zs)), "rhs_evaluations": tube.nfev, "jacobian_evaluations": tube.njev,
             "wall_time_s": round(elapsed, 4)}
    blocks = {
        "ignition": None if ignition is None else {k: float(v) for k, v in ignition.items()},
        "ignition_rule": f"largest dT/dz where the gas rises at least {IGNITION_RISE_K:g} K above the feed (or "
                         "medium inlet) temperature; null: nothing ignites",
        "outlet_residence_time_s": float(tau[-1]) if status != "failed" else None,
        "mechanism": {"file": spec.file, "phase": spec.phase, "species": len(spec.species),
                      "reactions": spec.reactions_kept, "reactions_dropped": spec.reactions_dropped},
        "profile_species": {"species": list(profile_species), "rule": f"profile.csv lists the species whose mole "
                            f"fraction reaches {PROFILE_MOLE_FRACTION:g} somewhere; the outlet block lists all"},
    }
    if status == "failed":
        blocks["ignition"] = None
    references = references_used(case, None)
    references = [k for k in references if k != "hindmarsh1983"] + ["hindmarsh2005"]
    return Result(case=case, species=tuple(spec.species), z=zs, F=F, T=ys[:, n], P=ys[:, n + 1], Tc=Tc,
                  Q=ys[:, n + 3] * tube.count, Z=np.ones(len(zs)), status=status, termination=termination,
                  hot_spot=hot, design=design, closure=clos, warnings=tuple(notes), solver_stats=stats,
                  versions=versions(), references=tuple(references), events=events,
                  extra={"summary_blocks": blocks, "profile_species": profile_species,
                         "failed_summary_blocks": blocks if status == "failed" else {},
                         "residence_time_s": tau, "timing": {"total_s": elapsed}})


def _hot_spot(case, zs, ys, n, dTdz, stopped, steps=None):
    """Highest gas temperature: the highest output point, then the highest of the solver's own steps
    between its neighbours (re-integrated with ``steps(z0, y0, z1)``) when it is an interior maximum."""
    k = int(np.argmax(ys[:, n]))
    T0 = case.feed.temperature
    T_max, z_max, y_max = float(ys[k, n]), float(zs[k]), ys[k]
    interior = 0 < k < len(zs) - 1
    if interior and steps is not None and case.heat.mode != "isothermal":
        z_fine, y_fine = steps(zs[k - 1], ys[k - 1], zs[k + 1])
        j = int(np.argmax(y_fine[:, n]))
        if y_fine[j, n] > T_max:
            T_max, z_max, y_max = float(y_fine[j, n]), float(z_fine[j]), y_fine[j]
    rise_medium = T_max - float(y_max[n + 2]) if case.heat.exchange else None
    if case.heat.mode == "isothermal":
        how = "no hot spot: isothermal tube (the temperature is held at the feed value)"
    elif stopped:
        how = "temperature limit: the run stopped there; the true maximum is higher"
    elif k == len(zs) - 1:
        how = "outlet (temperature still rising)" if dTdz[-1] > 0 else "outlet"
    else:
        how = "highest point of the solver's own steps"
    return {"temperature_K": T_max, "position_m": z_max, "rise_above_feed_K": T_max - T0,
            "rise_above_medium_K": rise_medium, "located_by": how}


def _design(case, tube, zs, ys):
    """Target conversion of the key species (recorded; the run continues)."""
    design = {"target_conversion": None, "reached": False, "length_m": None, "volume_m3": None,
              "catalyst_mass_kg": None}
    X_t = case.design.target_conversion
    if math.isnan(X_t):
        return design
    k = tube.gas.species_index(case.design.key_species)
    X = (ys[0, k] - ys[:, k]) / ys[0, k]
    design["target_conversion"] = X_t
    hit = np.nonzero(X >= X_t)[0]
    if len(hit):
        j = int(hit[0])
        z = float(zs[0]) if j == 0 else float(np.interp(X_t, [X[j - 1], X[j]], [zs[j - 1], zs[j]]))
        volume = tube.area * z * tube.count
        design.update({"reached": True, "length_m": z, "volume_m3": volume,
                       "catalyst_mass_kg": volume * case.bed.bulk_density if case.bed is not None else None})
    return design


def _range_warnings(gas, ys, n):
    """Temperatures outside a present species' thermo range (its properties are extrapolated)."""
    T_lo, T_hi = float(ys[:, n].min()), float(ys[:, n].max())
    out = []
    for k, name in enumerate(gas.species_names):
        if ys[:, k].max() <= 0:
            continue
        thermo = gas.species(k).thermo
        if T_lo < thermo.min_temp or T_hi > thermo.max_temp:
            out.append(f"temperature {T_lo:.1f}-{T_hi:.1f} K leaves the data range of {name} "
                       f"({thermo.min_temp:.0f}-{thermo.max_temp:.0f} K): its properties are extrapolated")
    return out
