"""Speed benchmark: a mechanism tube (simulator.mechanism) against Cantera's own reactor net.

Run from the repository root::

    python bench/bench_mechanism.py              # about half a minute
    python bench/bench_mechanism.py --rounds 7

Case (ours, invented operating data): an adiabatic, frictionless, isobaric H2/air tube with the
whole GRI-Mech 3.0 (53 species, 325 reactions, bundled with Cantera), 1000 K, 1 atm, 8 mm,
1 g/s, 0.1 m (ignites at about 20 mm). Variants, timed in interleaved rounds (median, ratios
within one round-robin, so the machine state is shared):

* baseline: Cantera's plain C++ ``IdealGasConstPressureReactor`` marched with ``step()`` until the
  parcel has travelled the tube (z accumulated from dz = u dt), the outlet interpolated at z = L;
* ``simulate``: the whole run (CVODE + ignition + hot spot + closure, Result built);
* ``solve_tube``: CVODE alone with the Cantera-derivative Jacobian (no post-processing);
* ``scipy LSODA`` and ``scipy BDF``: the same right-hand side and Jacobian through ``scipy.integrate.solve_ivp``.

Prints the median milliseconds, the ratio to the baseline and the outlet temperature of each
(they must agree within 1 K). Not a test: numbers depend on the machine's load.
"""
import argparse
import math
import statistics
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

LENGTH, DIAMETER, MASS_FLOW = 0.1, 0.008, 1e-3
FEED = {"H2": 0.15, "O2": 0.18, "N2": 0.67}
RTOL = 1e-8


def raw_case():
    return {"title": "bench H2/air gri30", "mechanism": {"file": "gri30.yaml"},
            "feed": {"temperature": "1000 K", "pressure": "1 atm", "mass_flow": f"{MASS_FLOW * 1e3} g/s",
                     "mole_fractions": dict(FEED)},
            "tube": {"length": f"{LENGTH} m", "inner_diameter": f"{DIAMETER * 1e3} mm"},
            "heat": {"mode": "adiabatic"}, "design": {"key_species": "H2"},
            "solver": {"rtol": RTOL, "atol_scale": 1e-12}}


def cantera_reactor():
    import cantera as ct

    gas = ct.Solution("gri30.yaml")
    gas.TPX = 1000.0, ct.one_atm, FEED
    G = MASS_FLOW / (math.pi * DIAMETER ** 2 / 4)
    reactor = ct.IdealGasConstPressureReactor(gas, clone=False)
    net = ct.ReactorNet([reactor])
    net.rtol, net.atol = RTOL, 1e-12 * 1e-3
    z, t_prev, rho_prev, T_prev = 0.0, 0.0, gas.density, gas.T
    while True:
        net.step()
        z_new = z + (net.time - t_prev) * 0.5 * (G / gas.density + G / rho_prev)
        if z_new >= LENGTH:
            return T_prev + (gas.T - T_prev) * (LENGTH - z) / (z_new - z)
        z, t_prev, rho_prev, T_prev = z_new, net.time, gas.density, gas.T


def ours_simulate(case):
    from simulator.solve.integrate import simulate

    return float(simulate(case).T[-1])


def ours_solve_tube(case):
    from simulator.case.mechanism_keys import mechanism_solution
    from simulator.mechanism.balances import MechanismTube
    from simulator.mechanism.integrate import solve_tube

    spec = case.mechanism
    tube = MechanismTube(case, mechanism_solution(spec.path, spec.phase, spec.species))
    traj = solve_tube(tube, np.array([0.0, LENGTH]), RTOL, tube.absolute_tolerance(case.solver.atol_scale))
    return float(traj.y[-1, tube.n])


def ours_scipy_lsoda(case, method="LSODA"):
    from scipy.integrate import solve_ivp

    from simulator.case.mechanism_keys import mechanism_solution
    from simulator.mechanism.balances import MechanismTube

    spec = case.mechanism
    tube = MechanismTube(case, mechanism_solution(spec.path, spec.phase, spec.species))
    size = tube.n + 4

    def jac(z, y):
        J = np.empty((size, size))
        tube.jacobian(z, y, tube.derivative(z, y), J)
        return J

    sol = solve_ivp(tube.derivative, (0.0, LENGTH), tube.y0, method=method, rtol=RTOL,
                    atol=tube.absolute_tolerance(case.solver.atol_scale), jac=jac)
    return float(sol.y[tube.n, -1])


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=5)
    args = parser.parse_args(argv)
    from simulator.case.load import load_case_dict

    case = load_case_dict(raw_case())
    variants = {"baseline: Cantera IdealGasConstPressureReactor": cantera_reactor,
                "simulate (CVODE, whole run)": lambda: ours_simulate(case),
                "solve_tube (CVODE alone)": lambda: ours_solve_tube(case),
                "scipy LSODA, same RHS and Jacobian": lambda: ours_scipy_lsoda(case),
                "scipy BDF, same RHS and Jacobian": lambda: ours_scipy_lsoda(case, "BDF")}
    for fn in variants.values():       # warm-up: imports, mechanism loads
        fn()
    times = {k: [] for k in variants}
    outlets = {}
    for _ in range(args.rounds):
        for name, fn in variants.items():
            t0 = time.perf_counter()
            outlets[name] = fn()
            times[name].append(time.perf_counter() - t0)
    base = statistics.median(times[next(iter(variants))])
    print(f"H2/air, gri30 (53 species), adiabatic isobaric, rtol {RTOL:g}, {args.rounds} interleaved rounds")
    for name in variants:
        med = statistics.median(times[name])
        print(f"  {name:48s} {1e3 * med:8.1f} ms   ratio {med / base:5.2f}   T_out {outlets[name]:.3f} K")


if __name__ == "__main__":
    main()
