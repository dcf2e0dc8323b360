"""Speed benchmark: tubesim's ``simulate`` against a plain ``solve_ivp(LSODA)`` script.

Run from the repository root::

    python bench/bench_core.py                 # full benchmark (about 1-2 min)
    python bench/bench_core.py --rounds 9      # more interleaved rounds
    python bench/bench_core.py --rtol 1e-8     # override the case's tolerance for both sides
    python bench/bench_core.py --no-cold       # skip the cold numba-cache subprocess
    python bench/bench_core.py --profile       # profile simulate() even if the target is met

The case is ``bench/cases/cooled_packed_bed_bench.toml`` (invented data): a cooled
packed tube, C2H4 + H2 => C2H6 with N2, uniform medium temperature, Ergun
pressure drop with a given viscosity.

The baseline below is written independently of ``simulator/``: it reads the raw
TOML with ``tomllib`` and ``pint``, takes NASA-7 coefficients and molar masses
from Cantera once, and integrates the same balances (molar flows, T, P) with a
plain numpy right-hand side and ``scipy.integrate.solve_ivp(method="LSODA")``
with the same rtol and per-variable atol, hot spot from an event on dT/dz = 0.
That is what a careful engineer's own script would look like. A second baseline
runs the same numpy right-hand side through ``scipy.integrate.odeint``.

Balances per tube (z axial position [m], A_c = pi D^2 / 4)::

    dF_i/dz = A_c rho_b sum_j nu_ij k_j(T) prod_i p_i^o_ij
    dT/dz   = (U pi D (T_c - T) - sum_i h_i(T) dF_i/dz) / sum_i F_i cp_i(T)
    dP/dz   = -(150 mu (1-eps)^2 u / (eps^3 d_p^2) + 1.75 rho (1-eps) u^2 / (eps^3 d_p)),  u = G / rho

References
----------
.. [1] S. Ergun, "Fluid flow through packed columns," Chem. Eng. Prog., vol. 48, pp. 89-94, 1952.
.. [2] B.J. McBride, M.J. Zehe, S. Gordon, "NASA Glenn coefficients for calculating
   thermodynamic properties of individual species," NASA/TP-2002-211556, 2002.
.. [3] A.C. Hindmarsh, "ODEPACK, a systematized collection of ODE solvers," in
   Scientific Computing, R.S. Stepleman et al. (eds.), North-Holland, 1983, pp. 55-64.
"""
import argparse
import cProfile
import dataclasses
import json
import math
import os
import pstats
import statistics
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

import numpy as np
from scipy.integrate import odeint, solve_ivp

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
CASE = HERE / "cases" / "cooled_packed_bed_bench.toml"
TARGET_RATIO = 15.0
TMAX_TOLERANCE = 0.1          # [K] required agreement of the hot-spot temperature
R = 8.314462618               # [J/(mol*K)] molar gas constant (exact in the 2019 SI)


# --------------------------------------------------------------------------------------------
# Baseline: an independent plain script of the same equations
# --------------------------------------------------------------------------------------------

def _parse_side(text):
    """'C2H4 + 2 H2' -> {'C2H4': 1.0, 'H2': 2.0}."""
    out = {}
    for term in text.split(" + "):
        parts = term.split()
        coef, name = (float(parts[0]), parts[1]) if len(parts) == 2 else (1.0, parts[0])
        out[name] = out.get(name, 0.0) + coef
    return out


def grid_max(zs, T):
    """Highest T on an even grid, refined by the vertex of the parabola through 3 points, ([K], [m])."""
    k = int(np.argmax(T))
    T_max, z_max = T[k], zs[k]
    if 0 < k < len(zs) - 1:
        a, b, c = T[k - 1], T[k], T[k + 1]
        den = a - 2.0 * b + c
        if den < 0.0:
            s = 0.5 * (a - c) / den
            T_max, z_max = b - 0.25 * (a - c) * s, zs[k] + s * (zs[1] - zs[0])
    return T_max, z_max


class PlainPFR:
    """Cooled packed tube as a plain numpy script (molar flows, T, P of one tube).

    Parameters
    ----------
    case_path : str or pathlib.Path
        TOML case with power-law, partial-pressure, per-catalyst-mass reactions,
        uniform medium temperature and Ergun pressure drop with a given viscosity.
    """

    def __init__(self, case_path):
        import cantera as ct
        import pint

        raw = tomllib.loads(Path(case_path).read_text(encoding="utf-8"))
        Q = pint.UnitRegistry().Quantity

        def si(text):
            return float(Q(text).to_base_units().magnitude)

        feed, tube, bed, heat, dp = raw["feed"], raw["tube"], raw["bed"], raw["heat"], raw["pressure_drop"]
        medium = heat.get("medium", {})
        if heat["mode"] != "exchange" or medium.get("arrangement", "uniform") != "uniform" or dp["model"] != "ergun":
            raise SystemExit("the baseline script handles a uniform medium + ergun cases only")
        names = list(feed["mole_fractions"])
        stoich = []
        for r in raw["reactions"]:
            if "<=>" in r["equation"] or r.get("in_terms_of") != "partial-pressure" \
                    or r.get("rate_basis") != "catalyst-mass":
                raise SystemExit("the baseline script handles irreversible partial-pressure rates per kg only")
            lhs, rhs = r["equation"].split("=>")
            nu = {s: -c for s, c in _parse_side(lhs.strip()).items()}
            for s, c in _parse_side(rhs.strip()).items():
                nu[s] = nu.get(s, 0.0) + c
            stoich.append(nu)
            names += [s for s in nu if s not in names]
        n, m = len(names), len(raw["reactions"])
        self.names = names
        self.nu = np.zeros((n, m))
        self.orders = np.zeros((n, m))
        self.A = np.zeros(m)
        self.E = np.zeros(m)
        for j, (r, nu) in enumerate(zip(raw["reactions"], stoich)):
            for s, c in nu.items():
                self.nu[names.index(s), j] = c
            orders = r.get("orders", {s: -c for s, c in nu.items() if c < 0})
            for s, o in orders.items():
                self.orders[names.index(s), j] = o
            self.A[j] = si(r["pre_exponential"])
            self.E[j] = si(r["activation_energy"])

        # thermo data from Cantera, once
        self.species_file = raw["thermo"]["species_file"]
        species = {sp.name: sp for sp in ct.Species.list_from_file(self.species_file)}
        coeffs = np.array([species[s].thermo.coeffs for s in names])   # [T_mid, a_hi(7), a_lo(7)]
        self.t_mid = coeffs[:, 0]
        self.a_hi = coeffs[:, 1:8]
        self.a_lo = coeffs[:, 8:15]
        self.mw = np.array([species[s].molecular_weight for s in names]) / 1000.0   # [kg/mol]
        self._cantera_species = [species[s] for s in names]

        D = si(tube["inner_diameter"])
        self.L = si(tube["length"])
        self.area = math.pi * D * D / 4.0
        self.perimeter = math.pi * D
        self.rho_b = si(bed["bulk_density"])
        self.eps = float(bed["void_fraction"])
        self.d_p = si(bed["particle_diameter"])
        self.U = si(heat["overall_coefficient"])
        self.Tc = si(medium["temperature"])
        self.mu = si(dp["viscosity"])
        x0 = np.array([feed["mole_fractions"].get(s, 0.0) for s in names])
        F0 = x0 / x0.sum() * si(feed["molar_flow"]) / int(tube.get("count", 1))
        self.G = float(F0 @ self.mw) / self.area
        self.T0, self.P0 = si(feed["temperature"]), si(feed["pressure"])
        self.y0 = np.concatenate([F0, [self.T0, self.P0]])
        self.scale = np.concatenate([np.full(n, F0.sum()), [self.T0, self.P0]])
        solver = raw.get("solver", {})
        self.rtol = float(solver.get("rtol", 1e-8))
        self.atol_scale = float(solver.get("atol_scale", 1e-10))
        self.n_out = int(solver.get("output_points", 401))
        self.calls = 0

    def thermo(self, T):
        """cp_i [J/(mol*K)] and h_i [J/mol] from the NASA-7 coefficients."""
        a = np.where((T >= self.t_mid)[:, None], self.a_hi, self.a_lo)
        cp = R * (a[:, 0] + T * (a[:, 1] + T * (a[:, 2] + T * (a[:, 3] + T * a[:, 4]))))
        h = R * (T * (a[:, 0] + T * (a[:, 1] / 2 + T * (a[:, 2] / 3 + T * (a[:, 3] / 4 + T * a[:, 4] / 5))))
                 + a[:, 5])
        return cp, h

    def rhs(self, z, y):
        """dy/dz of y = [F_1..F_n, T, P], [mol/(s*m), K/m, Pa/m]."""
        n = len(self.names)
        F, T, P = y[:n], y[n], y[n + 1]
        Fp = np.maximum(F, 0.0)
        Ft = Fp.sum()
        p = Fp / Ft * P
        rate = self.rho_b * self.A * np.exp(-self.E / (R * T)) * np.prod(p[:, None] ** self.orders, axis=0)
        dF = self.area * (self.nu @ rate)
        cp, h = self.thermo(T)
        dT = (self.U * self.perimeter * (self.Tc - T) - h @ dF) / (F @ cp)
        rho = P * (Fp @ self.mw) / Ft / (R * T)
        u = self.G / rho
        e3 = self.eps ** 3
        dP = -(150.0 * self.mu * (1.0 - self.eps) ** 2 * u / (e3 * self.d_p ** 2)
               + 1.75 * rho * (1.0 - self.eps) * u * u / (e3 * self.d_p))
        out = np.empty(n + 2)
        out[:n] = dF
        out[n] = dT
        out[n + 1] = dP
        return out

    def rhs_counted(self, z, y):
        self.calls += 1
        return self.rhs(z, y)

    def solve_ivp(self, rtol=None, atol_scale=None, counted=False, event=True):
        """Integrate with ``solve_ivp(method="LSODA")`` on the output grid.

        With ``event`` the hot spot comes from an event dT/dz = 0 (+ to -),
        otherwise from the output grid and a parabola through the highest point.

        Returns
        -------
        dict
            T_max [K], z_max [m], nfev (solver's count), sol
        """
        rtol = self.rtol if rtol is None else rtol
        atol = self.scale * (self.atol_scale if atol_scale is None else atol_scale)
        n = len(self.names)
        fun = self.rhs_counted if counted else self.rhs

        def hot_spot(z, y):
            return fun(z, y)[n]
        hot_spot.direction = -1.0

        zs = np.linspace(0.0, self.L, self.n_out)
        sol = solve_ivp(fun, (0.0, self.L), self.y0, method="LSODA", t_eval=zs, events=hot_spot if event else None,
                        rtol=rtol, atol=atol)
        if sol.status < 0:
            raise RuntimeError(f"baseline solve_ivp failed: {sol.message}")
        if event:
            cands = [(sol.y[n, 0], 0.0), (sol.y[n, -1], self.L)]
            cands += [(ye[n], ze) for ze, ye in zip(sol.t_events[0], sol.y_events[0])]
            T_max, z_max = max(cands)
        else:
            T_max, z_max = grid_max(zs, sol.y[n])
        return {"T_max": float(T_max), "z_max": float(z_max), "nfev": int(sol.nfev), "sol": sol}

    def odeint(self, rtol=None, atol_scale=None):
        """Same right-hand side through ``odeint``; T_max from the output grid + a parabola."""
        rtol = self.rtol if rtol is None else rtol
        atol = self.scale * (self.atol_scale if atol_scale is None else atol_scale)
        n = len(self.names)
        zs = np.linspace(0.0, self.L, self.n_out)
        ys, info = odeint(self.rhs, self.y0, zs, rtol=rtol, atol=atol, tfirst=True, full_output=True,
                          mxstep=100000)
        T_max, z_max = grid_max(zs, ys[:, n])
        return {"T_max": float(T_max), "z_max": float(z_max), "nfev": int(info["nfe"][-1])}

    def thermo_check(self):
        """Largest relative deviation of our cp, h from Cantera's own species thermo, [-]."""
        worst = 0.0
        for T in (300.0, 450.0, 999.0, 1001.0, 1500.0):
            cp, h = self.thermo(T)
            for i, sp in enumerate(self._cantera_species):
                worst = max(worst, abs(cp[i] - sp.thermo.cp(T) / 1000.0) / abs(cp[i]),
                            abs(h[i] - sp.thermo.h(T) / 1000.0) / max(abs(h[i]), 1.0))
        return worst


# --------------------------------------------------------------------------------------------
# Timing helpers
# --------------------------------------------------------------------------------------------

def _batch_reps(fn, budget):
    t = time.perf_counter()
    fn()
    once = time.perf_counter() - t
    return max(1, int(budget / max(once, 1e-6)))


def interleaved(variants, rounds, budget):
    """Per-solve wall time of each variant, measured round-robin.

    Parameters
    ----------
    variants : dict
        name -> zero-argument callable.
    rounds : int
        Number of rounds; each round runs every variant once as a batch, [-]
    budget : float
        Target wall time of one batch, [s]

    Returns
    -------
    dict
        name -> list of per-solve times, one per round, [s]
    """
    reps = {k: _batch_reps(f, budget) for k, f in variants.items()}
    names = list(variants)
    times = {k: [] for k in names}
    for r in range(rounds):
        order = names[r % len(names):] + names[:r % len(names)]
        for k in order:
            f, nrep = variants[k], reps[k]
            t = time.perf_counter()
            for _ in range(nrep):
                f()
            times[k].append((time.perf_counter() - t) / nrep)
    return times, reps


def per_call(fn, n):
    """Median over 5 batches of the time of one call, [s]."""
    out = []
    for _ in range(5):
        t = time.perf_counter()
        for _ in range(n):
            fn()
        out.append((time.perf_counter() - t) / n)
    return statistics.median(out)


def run_child(args, env=None, cwd=ROOT):
    t = time.perf_counter()
    proc = subprocess.run(args, capture_output=True, text=True, env=env, cwd=cwd)
    wall = time.perf_counter() - t
    if proc.returncode != 0:
        raise RuntimeError(f"{' '.join(map(str, args))} exited {proc.returncode}: {proc.stderr.strip()[-400:]}")
    return wall, proc.stdout


CHILD = """
import json, sys, time
t0 = time.perf_counter()
from simulator.case.load import load_case
from simulator.solve.integrate import simulate
t1 = time.perf_counter()
from simulator.model.build import build_model
case = load_case(sys.argv[1])
t2 = time.perf_counter()
model = build_model(case)
t3 = time.perf_counter()
simulate(case, model=model)
t4 = time.perf_counter()
simulate(case)
t5 = time.perf_counter()
print(json.dumps({"imports": t1 - t0, "load_case": t2 - t1, "build_model": t3 - t2, "first_simulate_prebuilt": t4 - t3,
                  "second_simulate_full": t5 - t4}))
"""


def fmt_ms(t):
    return f"{1e3 * t:8.3f} ms"


# --------------------------------------------------------------------------------------------
# Profile of simulate()
# --------------------------------------------------------------------------------------------

def _label(key):
    fname, line, func = key
    for marker in ("/simulator/", "/scipy/", "/importlib_metadata/", "/importlib/", "/numpy/"):
        if marker in fname:
            return f"{marker.strip('/')}/{fname.split(marker, 1)[1]}:{line}({func})"
    return f"{Path(fname).name}:{line}({func})" if line else func


def profile_simulate(simulate, case, model, calls=40, depth=3, share=0.03):
    """cProfile of ``calls`` runs of simulate(case, model), printed as a call tree.

    Each line is one caller -> callee edge: cumulative time per simulate() call
    spent in the callee when called from that caller, and the number of calls
    per simulate(); edges below ``share`` of the total are left out.
    """
    prof = cProfile.Profile()
    prof.enable()
    for _ in range(calls):
        simulate(case, model=model)
    prof.disable()
    stats = pstats.Stats(prof).stats
    root = next(k for k in stats if k[2] == "simulate" and k[0].endswith("integrate.py"))
    total = stats[root][3] / calls
    children = {}
    for callee, (_, _, _, _, callers) in stats.items():
        for caller, edge in callers.items():
            children.setdefault(caller, []).append((edge[3] / calls, edge[1] / calls, callee))
    print(f"  cProfile, {calls} calls of simulate(case, model): {1e3 * total:.2f} ms per call under the "
          "profiler (Python-heavy parts are inflated by it).")
    print("  Tree of caller -> callee: cumulative ms and share per simulate(), calls per simulate(); an indented"
          " line counts every call of that pair, whatever path led to the caller.")

    def walk(key, level):
        for ct, nc, callee in sorted(children.get(key, []), reverse=True):
            if ct < share * total:
                break
            print(f"  {'  ' * level}{1e3 * ct:7.3f} ms {100 * ct / total:5.1f} % {nc:7.1f}x  {_label(callee)}")
            if level + 1 < depth:
                walk(callee, level + 1)
    walk(root, 0)


# --------------------------------------------------------------------------------------------

def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--rounds", type=int, default=9, help="interleaved rounds (>= 5)")
    ap.add_argument("--budget", type=float, default=0.15, help="target seconds per timed batch")
    ap.add_argument("--rtol", type=float, default=None, help="override the case's rtol for both sides")
    ap.add_argument("--atol-scale", type=float, default=None, help="override the case's atol_scale")
    ap.add_argument("--no-cold", action="store_true", help="skip the cold numba-cache subprocess runs")
    ap.add_argument("--profile", action="store_true", help="profile simulate() even if the target is met")
    ap.add_argument("--json", help="also write the numbers to this JSON file")
    args = ap.parse_args(argv)
    if args.rounds < 5:
        ap.error("--rounds must be >= 5 (the 2 vCPUs are shared and noisy)")
    out = {}

    # ---- tubesim, first call in this process
    t = time.perf_counter()
    from simulator.case.load import load_case
    from simulator.model import kernel as K
    from simulator.model.build import build_model
    from simulator.solve.integrate import simulate
    t_import = time.perf_counter() - t
    t = time.perf_counter()
    case = load_case(CASE)
    t_load = time.perf_counter() - t
    if args.rtol is not None or args.atol_scale is not None:
        case = dataclasses.replace(case, solver=dataclasses.replace(
            case.solver, rtol=args.rtol if args.rtol is not None else case.solver.rtol,
            atol_scale=args.atol_scale if args.atol_scale is not None else case.solver.atol_scale))
    t = time.perf_counter()
    model = build_model(case)
    t_build = time.perf_counter() - t
    t = time.perf_counter()
    res = simulate(case, model=model)
    t_first = time.perf_counter() - t
    t = time.perf_counter()
    simulate(case, model=model)
    t_second = time.perf_counter() - t

    # ---- baseline
    base = PlainPFR(CASE)
    if args.rtol is not None:
        base.rtol = args.rtol
    if args.atol_scale is not None:
        base.atol_scale = args.atol_scale
    thermo_dev = base.thermo_check()
    b = base.solve_ivp()
    b2 = base.odeint()

    print(f"case: {CASE.relative_to(ROOT)}  ({case.title})")
    print(f"species {', '.join(base.names)}; rtol {base.rtol:g}, atol = {base.atol_scale:g} x scale "
          f"(flows: feed flow, T: feed T, P: feed P); {base.n_out} output points")
    print(f"python {sys.version.split()[0]}, numpy {np.__version__}, scipy {__import__('scipy').__version__}, "
          f"numba {__import__('numba').__version__}, cantera {__import__('cantera').__version__}, "
          f"{os.cpu_count()} CPUs, load average {os.getloadavg()[0]:.2f}")
    print(f"baseline NASA-7 cp/h vs Cantera species thermo: max relative deviation {thermo_dev:.1e}")
    print()
    print("first use in this process (numba cache as found on disk; these imports come after scipy/numpy):")
    print(f"  imports {fmt_ms(t_import).strip()}, load_case {fmt_ms(t_load).strip()}, first build_model "
          f"{fmt_ms(t_build).strip()}, first simulate(case, model) {fmt_ms(t_first).strip()} (loads or compiles "
          f"the numba kernel), second {fmt_ms(t_second).strip()}")
    out["first_use"] = {"imports": t_import, "load_case": t_load, "build_model": t_build,
                        "first_simulate_prebuilt": t_first, "second_simulate_prebuilt": t_second}

    # ---- agreement
    T_ts, z_ts = res.hot_spot["temperature_K"], res.hot_spot["position_m"]
    dT = abs(T_ts - b["T_max"])
    print()
    print("hot spot:")
    print(f"  tubesim            T_max = {T_ts:.4f} K at z = {z_ts:.4f} m ({res.hot_spot['located_by']}); "
          f"status {res.status}, outlet conversion {res.outlet_conversion:.4f}, "
          f"P_out {res.P[-1] / 1e5:.4f} bar")
    print(f"  solve_ivp LSODA    T_max = {b['T_max']:.4f} K at z = {b['z_max']:.4f} m (event dT/dz = 0)")
    b3 = base.solve_ivp(event=False)
    print(f"  solve_ivp, no event T_max = {b3['T_max']:.4f} K at z = {b3['z_max']:.4f} m (grid + parabola)")
    print(f"  odeint, numpy RHS  T_max = {b2['T_max']:.4f} K at z = {b2['z_max']:.4f} m (grid + parabola)")
    n = len(base.names)
    print(f"  |dT_max| tubesim vs solve_ivp = {dT:.2e} K (required <= {TMAX_TOLERANCE} K): "
          f"{'OK' if dT <= TMAX_TOLERANCE else 'FAIL'}; outlet P differs by "
          f"{abs(res.P[-1] - b['sol'].y[n + 1, -1]):.3g} Pa")
    # reference: both at rtol 1e-10
    ref_b = base.solve_ivp(rtol=1e-10, atol_scale=1e-12)
    ref_case = dataclasses.replace(case, solver=dataclasses.replace(case.solver, rtol=1e-10, atol_scale=1e-12))
    ref_t = simulate(ref_case)
    T_ref = ref_b["T_max"]
    print(f"  reference (both at rtol 1e-10, atol_scale 1e-12): solve_ivp {T_ref:.6f} K, tubesim "
          f"{ref_t.hot_spot['temperature_K']:.6f} K; error at the benchmark tolerance: tubesim "
          f"{T_ts - T_ref:+.2e} K, solve_ivp {b['T_max'] - T_ref:+.2e} K, solve_ivp no event "
          f"{b3['T_max'] - T_ref:+.2e} K, odeint {b2['T_max'] - T_ref:+.2e} K")
    out["T_max"] = {"tubesim": T_ts, "solve_ivp": b["T_max"], "solve_ivp_no_event": b3["T_max"],
                    "odeint": b2["T_max"], "reference": T_ref,
                    "reference_tubesim": ref_t.hot_spot["temperature_K"], "abs_diff": dT}

    # ---- RHS evaluations
    base.calls = 0
    base.solve_ivp(counted=True)
    ivp_calls = base.calls
    original = K.rhs_odeint
    count = [0]

    def counting(*a):
        count[0] += 1
        return original(*a)
    K.rhs_odeint = counting
    try:
        counted = simulate(case, model=model)
    finally:
        K.rhs_odeint = original
    stats = counted.solver_stats
    print()
    print("right-hand-side evaluations per solve:")
    print(f"  solve_ivp LSODA: {ivp_calls} Python calls ({b['nfev']} counted by the solver, the rest by the "
          "dT/dz event function)")
    print(f"  solve_ivp LSODA without the event: {b3['nfev']}; odeint, numpy RHS: {b2['nfev']}")
    print(f"  tubesim: {count[0]} calls of the compiled RHS: {stats['rhs_evaluations']} inside odeint over "
          f"{stats['integrator_calls']} odeint calls, {count[0] - stats['rhs_evaluations']} from Python "
          f"(dT/dz on the output grid and event refinement); {stats['steps']} steps")
    out["rhs_calls"] = {"solve_ivp": ivp_calls, "odeint_numpy": b2["nfev"], "tubesim_total": count[0],
                        "tubesim_in_odeint": stats["rhs_evaluations"], "tubesim_odeint_calls": stats["integrator_calls"]}

    # ---- interleaved timing
    zs = np.linspace(0.0, case.tube.length, case.solver.output_points)
    atol = model.scale * case.solver.atol_scale

    def core():
        odeint(K.rhs_odeint, model.y0, zs, args=model.args, rtol=case.solver.rtol, atol=atol, full_output=True,
               mxstep=100000, printmessg=False)

    def kernel_solve_ivp():
        solve_ivp(lambda z, y: K.rhs_odeint(y, z, *model.args), (0.0, case.tube.length), model.y0,
                  method="LSODA", t_eval=zs, rtol=case.solver.rtol, atol=atol)

    variants = {
        "baseline solve_ivp(LSODA), numpy RHS": base.solve_ivp,
        "baseline solve_ivp, no event": lambda: base.solve_ivp(event=False),
        "baseline odeint, numpy RHS": base.odeint,
        "tubesim simulate(case, model)": lambda: simulate(case, model=model),
        "tubesim simulate(case)": lambda: simulate(case),
        "tubesim core: one odeint call only": core,
        "tubesim kernel through solve_ivp(LSODA)": kernel_solve_ivp,
    }
    times, reps = interleaved(variants, args.rounds, args.budget)
    keys = list(variants)
    print()
    print(f"time per solve, {args.rounds} interleaved rounds (batch size in brackets):")
    for k in keys:
        v = times[k]
        print(f"  {k:<40} median {fmt_ms(statistics.median(v))}  min {fmt_ms(min(v))}  max {fmt_ms(max(v))}"
              f"  [{reps[k]}]")
    out["times_s"] = times

    def ratio(a, c):
        r = [x / y for x, y in zip(times[a], times[c])]
        return statistics.median(r), min(r), max(r)
    base_key = keys[0]
    print("ratio baseline solve_ivp / tubesim, per round (median, min-max):")
    ratios = {}
    for k in keys[1:]:
        med, lo, hi = ratio(base_key, k)
        ratios[k] = med
        print(f"  / {k:<38} {med:6.2f}x  ({lo:.2f}-{hi:.2f})")
    r_pre = ratios["tubesim simulate(case, model)"]
    print(f"target >= {TARGET_RATIO:g}x for simulate(case, model): "
          f"{'met' if r_pre >= TARGET_RATIO else 'NOT met'} ({r_pre:.1f}x)")
    out["ratios"] = ratios

    # ---- why not Cantera inside the right-hand side
    import cantera as ct
    temps = iter(np.tile(np.linspace(450.0, 480.0, 997), 100))   # a new T each call: no cached state
    X = base.y0[:n] / base.y0[:n].sum()
    small = ct.Solution(thermo="ideal-gas", species=base._cantera_species)
    full = ct.Solution(base.species_file)
    X_full = np.zeros(full.n_species)
    for name, x in zip(base.names, X):
        X_full[full.species_index(name)] = x

    def cantera_thermo(gas, x):
        gas.TPX = next(temps), 5e5, x
        return gas.partial_molar_enthalpies, gas.partial_molar_cp

    t_small = per_call(lambda: cantera_thermo(small, X), 2000)
    t_full = per_call(lambda: cantera_thermo(full, X_full), 2000)
    t_nb = per_call(lambda: K.rhs_odeint(model.y0, 0.0, *model.args), 4000)
    t_np = per_call(lambda: base.rhs(0.0, base.y0), 2000)
    print()
    print("thermo inside the RHS, per RHS call (set T, P, X; read h_i and cp_i):")
    print(f"  Cantera, {n}-species Solution {1e6 * t_small:.1f} us; whole {base.species_file} Solution "
          f"({full.n_species} species) {1e6 * t_full:.1f} us")
    print(f"  whole compiled RHS called from Python {1e6 * t_nb:.1f} us; whole numpy RHS of the baseline "
          f"{1e6 * t_np:.1f} us")
    out["per_rhs_call_s"] = {"cantera_small": t_small, "cantera_full": t_full, "compiled_rhs": t_nb,
                             "numpy_rhs": t_np}

    # ---- profile when below target
    if r_pre < TARGET_RATIO or args.profile:
        print()
        print("where simulate(case, model) spends its time:")
        ys_core = odeint(K.rhs_odeint, model.y0, zs, args=model.args, rtol=case.solver.rtol, atol=atol,
                         mxstep=100000)
        k_mid = int(np.argmax(ys_core[:, n]))
        y_mid = ys_core[k_mid]
        dz = zs[1] - zs[0]
        from importlib import metadata
        micro = {
            "compiled RHS called from Python (numba dispatch, 10 array args)":
                per_call(lambda: K.rhs_odeint(y_mid, 0.0, *model.args), 4000),
            "odeint re-integration over half an output step (as in event refinement)":
                per_call(lambda: odeint(K.rhs_odeint, y_mid, np.array([zs[k_mid], zs[k_mid] + 0.5 * dz]),
                                        args=model.args, rtol=case.solver.rtol, atol=atol, full_output=True,
                                        mxstep=100000, printmessg=False), 200),
            "importlib.metadata.version('scipy'), one call": per_call(lambda: metadata.version("scipy"), 50),
        }
        for k, v in micro.items():
            print(f"  {k:<75} {1e6 * v:9.1f} us")
        out["micro_s"] = micro
        # the post-processing stages of simulate(), timed directly (no profiler); skipped if renamed
        from simulator.solve import checks, integrate
        ys_t = ys_core
        stages = {
            "versions() (importlib.metadata, 5 packages)": (getattr(integrate, "versions", None), ()),
            "compressibility_profile(model, ys) (Peng-Robinson Z on 401 points)":
                (getattr(checks, "compressibility_profile", None), (model, ys_t)),
            "closure(model, ys) (element and energy balance with Cantera thermo)":
                (getattr(checks, "closure", None), (model, ys_t)),
            "range_warnings(model, ys)": (getattr(checks, "range_warnings", None), (model, ys_t)),
            "dT/dz on the 401 output points, one RHS call each from Python":
                (lambda: [K.rhs_odeint(y, z, *model.args) for z, y in zip(zs, ys_t)], ()),
        }
        for k, (fn, a) in stages.items():
            if fn is None:
                continue
            v = per_call(lambda: fn(*a), 5)
            out["micro_s"][k] = v
            print(f"  {k:<75} {1e6 * v:9.1f} us")
        profile_simulate(simulate, case, model)

    # ---- start-up and CLI runs in fresh processes
    print()
    print("fresh processes (wall time incl. interpreter start-up):")
    exe = sys.executable
    env = dict(os.environ)
    w_pass = statistics.median(run_child([exe, "-c", "pass"])[0] for _ in range(5))
    w_help = [run_child([exe, "-m", "simulator", "--help"])[0] for _ in range(5)]
    print(f"  python -c pass: median {fmt_ms(w_pass)}; python -m simulator --help: median "
          f"{fmt_ms(statistics.median(w_help))} (min {fmt_ms(min(w_help))}, 5 runs)")
    out["help_s"] = w_help
    with tempfile.TemporaryDirectory() as tmp:
        runs = [run_child([exe, "-m", "simulator", "run", str(CASE), "--out", str(Path(tmp) / f"r{i}")])[0]
                for i in range(4)]
        print(f"  tubesim run (warm numba cache): first {fmt_ms(runs[0])}, then "
              f"{', '.join(fmt_ms(x).strip() for x in runs[1:])}")
        warm = json.loads(run_child([exe, "-c", CHILD, str(CASE)])[1])
        print("  inside a fresh process, warm cache: " + ", ".join(f"{k} {fmt_ms(v).strip()}" for k, v in warm.items()))
        out["cli_run_s"] = runs
        out["fresh_warm"] = warm
        if not args.no_cold:
            cold_env = dict(env, NUMBA_CACHE_DIR=str(Path(tmp) / "numba_cache"))
            cold = json.loads(run_child([exe, "-c", CHILD, str(CASE)], env=cold_env)[1])
            again = json.loads(run_child([exe, "-c", CHILD, str(CASE)], env=cold_env)[1])
            print("  empty numba cache (NUMBA_CACHE_DIR=tmp, compiles): "
                  + ", ".join(f"{k} {fmt_ms(v).strip()}" for k, v in cold.items()))
            print("  same cache, next process:                          "
                  + ", ".join(f"{k} {fmt_ms(v).strip()}" for k, v in again.items()))
            out["fresh_cold"] = cold
            out["fresh_cold_then_warm"] = again
    if args.json:
        Path(args.json).write_text(json.dumps(out, indent=1))
    return 0 if dT <= TMAX_TOLERANCE else 1


if __name__ == "__main__":
    sys.exit(main())
