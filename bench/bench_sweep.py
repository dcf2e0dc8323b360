"""Speed benchmark of a 2 500-case map: compiled batch solver against per-case solves.

Run from the repository root::

    python bench/bench_sweep.py                # about 3-4 min (most of it the tight reference)
    python bench/bench_sweep.py --quick        # reference and simulate() loop on every 5th case
    python bench/bench_sweep.py --no-cold      # skip the two fresh processes that time compilation
    python bench/bench_sweep.py --json out.json

The map: the demo case ``cases/hydrogenation_cooled_packed_bed.toml`` (C2H4 + H2 => C2H6
with N2, 4 species from gri30.yaml, energy balance, uniform medium temperature, Ergun
pressure drop), 50 medium temperatures (400-460 K) x 50 feed C2H4 mole fractions
(0.02-0.10, the other species rescaled), no temperature limit (as the sweep verb runs:
runaway cases run on to the end of the tube). It spans mild hot spots and runaway peaks
of up to about 820 K.

Variants, all on the same machine state (interleaved where timed repeatedly):

1. a plain script: numpy right-hand side written below, ``solve_ivp(method="LSODA")``
   per case with the case's rtol and per-variable atol and an event dT/dz = 0 for the
   hot spot; timed on 100 evenly spread cases and extrapolated to 2 500 (said so);
2. ``simulate()`` per case, serially: the model prebuilt per case (build not timed),
   and the whole per-case path of the sweep engine (apply_values -> load_case_dict ->
   build_model -> simulate) for comparison;
3. ``fast.batch_solve`` on 1 numba thread and on 2 (``threads=``) at its defaults (rtol 1e-6,
   the case's atol_scale), and on 2 threads at rtol 3e-6, atol_scale 1e-8; 7 interleaved
   rounds, each with a parallel busy loop that measures how many cores the process got.

Accuracy: every variant against tight per-case ``simulate()`` solves (rtol 1e-10,
atol_scale 1e-12).
"""
import argparse
import json
import math
import os
import statistics
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

import numpy as np
from scipy.integrate import solve_ivp

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
sys.path.insert(0, str(ROOT))

CASE = ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml"
PATHS = ["heat.medium.temperature", "feed.mole_fractions.C2H4"]
COOLANT = np.linspace(400.0, 460.0, 50)      # [K]
FRACTION = np.linspace(0.02, 0.10, 50)       # [-]
TARGET = 20000.0                             # [cases/s] on 2 cores
T_TOL = 0.05                                 # [K]
X_TOL = 1e-4                                 # [-]
TIGHT = {"rtol": 1e-10, "atol_scale": 1e-12}
R = 8.314462618                              # [J/(mol*K)]


# --------------------------------------------------------------------------------------------
# Variant 1: a plain script (numpy right-hand side, solve_ivp LSODA)
# --------------------------------------------------------------------------------------------
class PlainTube:
    """Cooled packed tube of one case as a plain numpy script: y = [F_1..F_n, T, P] of one tube.

    Parameters
    ----------
    case : simulator.case.schema.Case
        Loaded case (SI numbers only are read from it; irreversible power laws per kg of
        catalyst, uniform medium temperature, Ergun with a given viscosity).
    nasa : ndarray
        NASA-7 rows of the species (Cantera's layout), [-]
    molar_mass : ndarray
        Molar masses of the species, [kg/mol]
    """

    def __init__(self, case, nasa, molar_mass):
        names = list(case.species)
        n, m = len(names), len(case.reactions)
        self.n = n
        self.nu = np.zeros((n, m))
        self.orders = np.zeros((n, m))
        self.A = np.array([r.pre_exponential for r in case.reactions])
        self.E = np.array([r.activation_energy for r in case.reactions])
        for j, r in enumerate(case.reactions):
            if r.reversible or r.rate_basis != "catalyst-mass" or r.in_terms_of != "partial-pressure":
                raise SystemExit("the plain script handles irreversible partial-pressure rates per kg only")
            for s, v in r.stoichiometry:
                self.nu[names.index(s), j] = v
            for s, o in r.orders:
                self.orders[names.index(s), j] = o
        self.t_mid = nasa[:, 0]
        self.a_hi = nasa[:, 1:8]
        self.a_lo = nasa[:, 8:15]
        self.mw = molar_mass
        D = case.tube.inner_diameter
        self.L = case.tube.length
        self.area = math.pi * D * D / 4.0
        self.perimeter = math.pi * D
        self.rho_b = case.bed.bulk_density
        self.eps = case.bed.void_fraction
        self.d_p = case.bed.particle_diameter
        self.U = case.heat.overall_coefficient
        self.Tc = case.heat.medium_temperature
        self.mu = case.pressure_drop.viscosity
        x0 = np.array([dict(case.feed.mole_fractions).get(s, 0.0) for s in names])
        F0 = x0 * case.feed.flow_value / case.tube.count
        self.G = float(F0 @ self.mw) / self.area
        self.y0 = np.concatenate([F0, [case.feed.temperature, case.feed.pressure]])
        self.atol = np.concatenate([np.full(n, F0.sum()), [case.feed.temperature, case.feed.pressure]]) \
            * case.solver.atol_scale
        self.rtol = case.solver.rtol

    def rhs(self, z, y):
        """dy/dz, [mol/(s*m), K/m, Pa/m]."""
        n = self.n
        F, T, P = y[:n], y[n], y[n + 1]
        Fp = np.maximum(F, 0.0)
        Ft = Fp.sum()
        p = Fp / Ft * P
        rate = self.rho_b * self.A * np.exp(-self.E / (R * T)) * np.prod(p[:, None] ** self.orders, axis=0)
        dF = self.area * (self.nu @ rate)
        a = np.where((T >= self.t_mid)[:, None], self.a_hi, self.a_lo)
        cp = R * (a[:, 0] + T * (a[:, 1] + T * (a[:, 2] + T * (a[:, 3] + T * a[:, 4]))))
        h = R * (T * (a[:, 0] + T * (a[:, 1] / 2 + T * (a[:, 2] / 3 + T * (a[:, 3] / 4 + T * a[:, 4] / 5))))
                 + a[:, 5])
        dT = (self.U * self.perimeter * (self.Tc - T) - h @ dF) / (F @ cp)
        rho = P * (Fp @ self.mw) / Ft / (R * T)
        u = self.G / rho
        e3 = self.eps ** 3
        dP = -(150.0 * self.mu * (1.0 - self.eps) ** 2 * u / (e3 * self.d_p ** 2)
               + 1.75 * rho * (1.0 - self.eps) * u * u / (e3 * self.d_p))
        return np.concatenate([dF, [dT, dP]])

    def solve(self):
        """(T_max [K], X_out [-]) with solve_ivp LSODA and an event dT/dz = 0 (+ to -)."""
        n = self.n

        def peak(z, y):
            return self.rhs(z, y)[n]
        peak.direction = -1.0
        sol = solve_ivp(self.rhs, (0.0, self.L), self.y0, method="LSODA", rtol=self.rtol, atol=self.atol,
                        events=peak)
        if sol.status < 0:
            raise RuntimeError(sol.message)
        T = [sol.y[n, 0], sol.y[n, -1]] + [ye[n] for ye in sol.y_events[0]]
        return max(T), (self.y0[0] - sol.y[0, -1]) / self.y0[0]


# --------------------------------------------------------------------------------------------
COMPILE_CHILD = r"""
import json, sys, time
import numpy as np
t0 = time.perf_counter()
from simulator.sweeps import fast
from simulator.case.load import load_case
from simulator.model.build import build_model
t1 = time.perf_counter()
model = build_model(load_case(sys.argv[1]))
t2 = time.perf_counter()
params = np.array([[420.0, 0.05], [440.0, 0.08]])
fast.batch_solve(model, params, ["heat.medium.temperature", "feed.mole_fractions.C2H4"])
t3 = time.perf_counter()
fast.batch_solve(model, params, ["heat.medium.temperature", "feed.mole_fractions.C2H4"])
t4 = time.perf_counter()
print(json.dumps({"import_s": t1 - t0, "load_and_build_s": t2 - t1, "first_batch_solve_s": t3 - t2,
                  "second_batch_solve_s": t4 - t3}))
"""


def compile_cost():
    """First batch_solve in a fresh process with an empty numba cache, then with it filled."""
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join(filter(None, [str(ROOT), env.get("PYTHONPATH")]))
    out = {}
    with tempfile.TemporaryDirectory() as tmp:
        env["NUMBA_CACHE_DIR"] = str(Path(tmp) / "numba_cache")
        for label in ("empty_cache", "filled_cache"):
            t = time.perf_counter()
            done = subprocess.run([sys.executable, "-c", COMPILE_CHILD, str(CASE)], env=env, cwd=ROOT,
                                  capture_output=True, text=True)
            if done.returncode != 0:
                raise RuntimeError(done.stderr[-1500:])
            out[label] = json.loads(done.stdout.strip().splitlines()[-1])
            out[label]["process_wall_s"] = time.perf_counter() - t
    return out


def rhs_cost(model):
    """Time of one compiled kernel.rhs call at the feed state, [s] (median of 5 x 100 000)."""
    from numba import njit

    from simulator.model import kernel as K

    @njit
    def loop(count, y, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
        out = np.empty(y.shape[0])
        acc = 0.0
        for _ in range(count):
            y[0] *= 1.0 + 1e-12
            K.rhs(0.0, y, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, out)
            acc += out[0]
        return acc

    y = model.y0.copy()
    loop(10, y, *model.args)
    times = []
    for _ in range(5):
        t = time.perf_counter()
        loop(100000, y, *model.args)
        times.append((time.perf_counter() - t) / 100000)
    return statistics.median(times)


def make_spin():
    """A compiled, perfectly parallel busy loop: its 1-thread / 2-thread time ratio is the
    number of cores this process actually got at that moment (the host is shared)."""
    from numba import njit, prange

    @njit(parallel=True, cache=False)
    def spin(count):
        acc = np.zeros(64)
        for k in prange(64):
            s = 0.0
            for i in range(count):
                s += math.sqrt(i + k + 1.0)
            acc[k] = s
        return acc.sum()

    spin(10)
    return spin


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--quick", action="store_true", help="reference and simulate() loop on every 5th case only")
    ap.add_argument("--rounds", type=int, default=7, help="interleaved rounds of the compiled variants")
    ap.add_argument("--no-cold", action="store_true", help="skip timing compilation in fresh processes")
    ap.add_argument("--json", default=None, help="also write the numbers to this file")
    args = ap.parse_args(argv)

    import numba

    from simulator.case.load import load_case_dict
    from simulator.model.build import build_model
    from simulator.solve.integrate import simulate
    from simulator.sweeps import fast
    from simulator.sweeps.paths import apply_values

    report = {"machine": {"cpus": os.cpu_count(), "load_average": os.getloadavg(),
                          "numba_threads": numba.get_num_threads(), "python": sys.version.split()[0],
                          "numba": numba.__version__}}
    print(f"host: {os.cpu_count()} CPUs, load average {os.getloadavg()[0]:.2f} (shared host: compare within "
          "this run only)")
    raw = tomllib.loads(CASE.read_text(encoding="utf-8"))
    del raw["design"]["temperature_limit"]          # runaway cases run on, as in the sweep verb
    base_case = load_case_dict(raw, source_path=str(CASE))
    base = build_model(base_case)
    params = np.array([[tc, y] for tc in COOLANT for y in FRACTION])
    N = len(params)
    every = 5 if args.quick else 1
    ref_idx = np.arange(0, N, every)
    print(f"map: {N} cases = {len(COOLANT)} medium temperatures {COOLANT[0]:g}-{COOLANT[-1]:g} K x "
          f"{len(FRACTION)} C2H4 fractions {FRACTION[0]:g}-{FRACTION[-1]:g}; {base.n} species, energy, Ergun")

    def case_of(values, solver=None):
        new = apply_values(raw, dict(zip(PATHS, (float(v) for v in values))))
        if solver is not None:
            new["solver"] = dict(solver)
        c = load_case_dict(new, source_path=str(CASE))
        return c, build_model(c, species=base.species)

    # --- compile cost (fresh processes) ---------------------------------------------------------
    if not args.no_cold:
        cc = compile_cost()
        report["compile"] = cc
        print("\ncompile cost, fresh process, 2-case batch_solve:")
        for label, v in cc.items():
            print(f"  {label:13s} import fast {v['import_s']:.2f} s, "
                  f"first batch_solve {v['first_batch_solve_s']:.2f} s, second {v['second_batch_solve_s'] * 1e3:.1f} ms, whole process {v['process_wall_s']:.2f} s")

    # --- tight reference ------------------------------------------------------------------------
    print(f"\ntight reference: simulate() rtol 1e-10, atol_scale 1e-12 on "
          f"{len(ref_idx)} cases ...", flush=True)
    t = time.perf_counter()
    ref = {}
    for i in ref_idx:
        c, m = case_of(params[i], TIGHT)
        r = simulate(c, model=m)
        ref[i] = (r.status, r.hot_spot["temperature_K"], r.outlet_conversion, r.hot_spot["position_m"])
    print(f"  took {time.perf_counter() - t:.1f} s; statuses {sorted({v[0] for v in ref.values()})}; "
          f"hot spots {min(v[1] for v in ref.values()):.1f}-{max(v[1] for v in ref.values()):.1f} K")

    def accuracy(T, X, idx):
        dT = np.array([T[k] - ref[i][1] for k, i in enumerate(idx)])
        dX = np.array([X[k] - ref[i][2] for k, i in enumerate(idx)])
        w = int(np.argmax(np.abs(dT)))
        return {"max_abs_dT_K": float(np.max(np.abs(dT))), "max_abs_dX": float(np.max(np.abs(dX))),
                "worst_case": {"medium_K": float(params[idx[w], 0]), "y_C2H4": float(params[idx[w], 1]),
                               "T_star_ref_K": float(ref[idx[w]][1]), "dT_K": float(dT[w])}}

    # --- variant 1: plain solve_ivp script --------------------------------------------------------
    plain_idx = np.linspace(0, N - 1, 100).round().astype(int)
    plain_idx = np.array([i for i in plain_idx if i in ref])
    tubes = []
    for i in plain_idx:
        c, m = case_of(params[i])
        tubes.append(PlainTube(c, m.args[2], m.args[3]))
    t = time.perf_counter()
    plain = [tube.solve() for tube in tubes]
    t_plain = (time.perf_counter() - t) / len(tubes)
    acc_plain = accuracy([p[0] for p in plain], [p[1] for p in plain], plain_idx)

    # --- variant 2: simulate() per case ----------------------------------------------------------
    loop_idx = ref_idx
    models = [case_of(params[i]) for i in loop_idx]
    t = time.perf_counter()
    sim = [simulate(c, model=m) for c, m in models]
    t_sim = (time.perf_counter() - t) / len(models)
    acc_sim = accuracy([r.hot_spot["temperature_K"] for r in sim], [r.outlet_conversion for r in sim], loop_idx)
    sub = loop_idx[:: max(1, len(loop_idx) // 100)]
    t = time.perf_counter()
    for i in sub:
        c, m = case_of(params[i])
        simulate(c, model=m)
    t_path = (time.perf_counter() - t) / len(sub)

    # --- variant 3: compiled batch ---------------------------------------------------------------
    fast.batch_solve(base, params[:4], PATHS)     # loads (or compiles) the kernels
    spin = make_spin()
    loose = {"rtol": 3e-6, "atol_scale": 1e-8}
    times = {1: [], 2: [], "loose": []}
    cores = []
    outs = {}
    for rnd in range(args.rounds):
        spun = {}
        for threads in ((1, 2) if rnd % 2 == 0 else (2, 1)):
            numba.set_num_threads(threads)
            t = time.perf_counter()
            spin(300000)
            spun[threads] = time.perf_counter() - t
            numba.set_num_threads(2)
            t = time.perf_counter()
            outs[threads] = fast.batch_solve(base, params, PATHS, threads=threads)
            times[threads].append(time.perf_counter() - t)
        t = time.perf_counter()
        outs["loose"] = fast.batch_solve(base, params, PATHS, threads=2, **loose)
        times["loose"].append(time.perf_counter() - t)
        cores.append(spun[1] / spun[2])
    out = outs[2]
    for name in ("hot_spot_temperature_K", "outlet_conversion", "status"):
        assert np.array_equal(outs[1][name], outs[2][name]), name
    acc_fast = accuracy(out["hot_spot_temperature_K"][ref_idx], out["outlet_conversion"][ref_idx], ref_idx)
    acc_loose = accuracy(outs["loose"]["hot_spot_temperature_K"][ref_idx], outs["loose"]["outlet_conversion"][ref_idx],
                         ref_idx)
    status_ok = all(fast.STATUS_NAMES[out["status"][i]] == ref[i][0] for i in ref_idx)
    t_rhs = rhs_cost(base)
    nfev = out["rhs_evaluations"][~out["fallback"]]

    # --- report ----------------------------------------------------------------------------------
    numba.set_num_threads(2)
    med = {k: statistics.median(v) for k, v in times.items()}
    rate = {k: N / v for k, v in med.items()}
    rows = [
        ("1 plain solve_ivp(LSODA) loop, numpy RHS (100 cases, extrapolated)", N * t_plain, acc_plain),
        (f"2 simulate(case, model) loop ({len(loop_idx)} cases{', extrapolated' if every > 1 else ''})",
         N * t_sim, acc_sim),
        (f"2' per-case sweep path: apply_values+load+build+simulate ({len(sub)} cases, extrapolated)",
         N * t_path, None),
        ("3 fast.batch_solve, 1 thread", med[1], acc_fast),
        ("3 fast.batch_solve, 2 threads", med[2], acc_fast),
        ("3 fast.batch_solve, 2 threads, rtol 3e-6, atol_scale 1e-8", med["loose"], acc_loose),
    ]
    print(f"\n{'variant':78s} {'2500 cases':>10s} {'cases/s':>9s} {'x plain':>8s} {'max|dT*|':>9s} {'max|dX|':>8s}")
    for label, total, acc in rows:
        a = f"{acc['max_abs_dT_K']:9.4f} {acc['max_abs_dX']:8.1e}" if acc else f"{'-':>9s} {'-':>8s}"
        print(f"{label:78s} {total:9.3f}s {N / total:9.0f} {N * t_plain / total:7.1f}x {a}")
    print(f"  effective cores during the rounds (parallel busy loop, 1-thread / 2-thread time): "
          f"{', '.join(f'{c:.2f}' for c in cores)}")
    for k in (1, 2, "loose"):
        print(f"  batch_solve {k} thread(s): {len(times[k])} interleaved rounds, median {med[k]:.3f} s "
              f"(min {min(times[k]):.3f}, max {max(times[k]):.3f}); split of the last round: "
              + ", ".join(f"{n} {v * 1e3:.1f} ms" for n, v in outs[k]["timing"].items()))
    print(f"  2 threads / 1 thread: {med[1] / med[2]:.2f}x; 2 threads / simulate() loop: {N * t_sim / med[2]:.0f}x")
    reasons = ", ".join(f"{fast.FALLBACK_REASONS[r]}: {int(np.sum(out['fallback_reason'] == r))}"
                        for r in np.unique(out["fallback_reason"]) if r) or "none"
    print(f"\nfallbacks to simulate(): {int(out['fallback'].sum())} of {N} ({reasons}); "
          f"stiffness test fired (informational) on {int(out['stiff'].sum())}")
    print(f"statuses equal to the reference on all compared cases: {status_ok}")
    print(f"accuracy of batch_solve (rtol {fast.DEFAULT_RTOL:g}, case atol_scale) against the tight reference: "
          f"max |dT*| = {acc_fast['max_abs_dT_K']:.4f} K at T_c = {acc_fast['worst_case']['medium_K']:.2f} K, "
          f"y_C2H4 = {acc_fast['worst_case']['y_C2H4']:.4f} (T* = {acc_fast['worst_case']['T_star_ref_K']:.2f} K); "
          f"max |dX_out| = {acc_fast['max_abs_dX']:.1e}")
    print(f"  simulate() at the case's own settings (rtol 1e-8, 401 points): max |dT*| = "
          f"{acc_sim['max_abs_dT_K']:.4f} K at T_c = {acc_sim['worst_case']['medium_K']:.2f} K, y_C2H4 = "
          f"{acc_sim['worst_case']['y_C2H4']:.4f}")
    per_case = min(times[1]) / N
    compiled = outs[1]["timing"]["compiled"]
    print(f"\nwhere the time goes (1 thread, best round): {per_case * 1e6:.0f} us per case = "
          f"{nfev.mean():.0f} RHS evaluations (mean; {out['steps'].mean():.1f} accepted steps, "
          f"{out['rhs_evaluations'].max()} at most) x {compiled / nfev.sum() * 1e9:.0f} ns per evaluation "
          f"(integrator included); one kernel.rhs call alone at the feed state: {t_rhs * 1e9:.0f} ns; "
          f"packing {outs[1]['timing']['pack'] * 1e3:.1f} ms per map, fallback loop "
          f"{outs[1]['timing']['fallback'] * 1e3:.1f} ms")
    met = rate[2] >= TARGET and acc_fast["max_abs_dT_K"] <= T_TOL and acc_fast["max_abs_dX"] <= X_TOL
    met_loose = rate["loose"] >= TARGET and acc_loose["max_abs_dT_K"] <= T_TOL and acc_loose["max_abs_dX"] <= X_TOL
    print(f"target >= {TARGET:.0f} cases/s on 2 threads with |dT*| <= {T_TOL} K, |dX| <= {X_TOL}: defaults "
          f"{'met' if met else 'NOT met'} ({rate[2]:.0f} cases/s, best round {N / min(times[2]):.0f}); "
          f"rtol 3e-6/atol_scale 1e-8 {'met' if met_loose else 'NOT met'} ({rate['loose']:.0f} cases/s, best round "
          f"{N / min(times['loose']):.0f})")
    report.update({
        "cases": N, "plain_solve_ivp_s_per_case": t_plain, "simulate_s_per_case": t_sim,
        "per_case_path_s_per_case": t_path, "batch_1_thread_s": times[1], "batch_2_threads_s": times[2],
        "batch_2_threads_loose_s": times["loose"], "effective_cores": cores,
        "cases_per_s": {"plain": 1 / t_plain, "simulate": 1 / t_sim, "batch_1": rate[1], "batch_2": rate[2],
                        "batch_2_loose": rate["loose"]},
        "accuracy": {"plain": acc_plain, "simulate_default": acc_sim, "batch": acc_fast, "batch_loose": acc_loose},
        "fallbacks": int(out["fallback"].sum()), "stiff_flags": int(out["stiff"].sum()),
        "rhs_evaluations_mean": float(nfev.mean()), "rhs_call_s": t_rhs, "target_met": bool(met),
    })
    if args.json:
        Path(args.json).write_text(json.dumps(report, indent=2, default=float))
    return 0 if acc_fast["max_abs_dT_K"] <= T_TOL and acc_fast["max_abs_dX"] <= X_TOL and status_ok else 1


if __name__ == "__main__":
    sys.exit(main())
