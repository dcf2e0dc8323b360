"""Speed of the compiled engine on Dask against the local compiled run, and of uncertainty on it.

Run from the repository root::

    python bench/bench_dask_compiled.py                 # about 2-3 min on 2 cores
    python bench/bench_dask_compiled.py --quick         # 5 000 cases, 1 round, fewer samples
    python bench/bench_dask_compiled.py --json out.json

Part 1, grid sweep: the demo case ``cases/hydrogenation_cooled_packed_bed.toml``, a grid of
200 medium temperatures (400-460 K) x 100 feed C2H4 mole fractions (0.02-0.10) = 20 000
cases (mild hot spots up to runaway peaks), run the way ``tubesim sweep`` runs it
(:func:`simulator.sweeps.compiled_sweep.run_compiled_sweep`: store, guards, fallback):

* local: the compiled batch integrator in this process, numba threads over the cores;
* Dask: ``LocalCluster(n_workers=2, threads_per_worker=1, processes=True)`` on loopback,
  the same function with ``scheduler=`` (chunks on the workers, model scattered once,
  caches warmed per worker).

The cluster's start and its first run (worker imports, numba cache loads) are timed
apart; then local and Dask runs alternate for ``--rounds`` rounds on the same machine
state and the throughput ratio Dask / local is taken per round (target >= 0.7). Every
Dask run's ``results.csv`` must equal the local one byte for byte.

Part 2, uncertainty: the o-xylene demo tube with two uncertain inputs (medium
temperature uniform 620-632 K, activation energy truncated normal, std 0.5 kJ/mol), run
by :func:`simulator.sweeps.execute.run_uncertainty` on the compiled engine (many samples)
and on the per-case engine (a local process pool, fewer samples); the ratio of the two
rates in cases/s, each as the run itself reports it (target >= 50).

Exit code 1 if a Dask run's rows differ from the local ones; a missed speed target does not
change the exit code. Numbers are for a shared 2-vCPU machine: read the ratios, not the
absolute times.
"""
import argparse
import json
import os
import shutil
import statistics
import sys
import tempfile
import time
import tomllib
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
sys.path.insert(0, str(ROOT))
os.environ.setdefault("TUBESIM_KERNEL", "compiled")

HYDRO = ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml"
OXYLENE = ROOT / "cases" / "froment1967_oxylene_packed_tube.toml"
DASK_TARGET = 0.7
UNCERTAINTY_TARGET = 50.0
UNCERTAIN = """
[[uncertainty]]
parameter = "heat.medium.temperature"
distribution = "uniform"
low = "620 K"
high = "632 K"

[[uncertainty]]
parameter = "reactions.0.activation_energy"
distribution = "truncated-normal"
std = "0.5 kJ/mol"
"""


def _grid(n_cases):
    """``--vary`` options of about n_cases cases (2 : 1 medium temperatures : fractions)."""
    n_fractions = max(int(round((n_cases / 2) ** 0.5)), 2)
    n_temperatures = max(n_cases // n_fractions, 2)
    return [f"heat.medium.temperature=400 K..460 K in {n_temperatures}",
            f"feed.mole_fractions.C2H4=0.02..0.10 in {n_fractions}"]


def _sweep(raw, model, vary, out, scheduler=None):
    from simulator.sweeps.compiled_sweep import run_compiled_sweep

    shutil.rmtree(out, ignore_errors=True)
    t0 = time.perf_counter()
    summary = run_compiled_sweep(raw, str(HYDRO.parent), vary, model, out, progress=False, scheduler=scheduler)
    return time.perf_counter() - t0, summary


def part_grid(n_cases, rounds, scratch):
    """Local compiled against Dask with 2 local workers; returns a dict of numbers."""
    import distributed

    from simulator.case.load import load_case
    from simulator.model.build import build_model

    raw = tomllib.loads(HYDRO.read_text())
    model = build_model(load_case(str(HYDRO)))
    vary = _grid(n_cases)
    wall, _ = _sweep(raw, model, vary, scratch / "local-first")     # loads the caches in this process
    print(f"grid: {vary[0]} x {vary[1]}; first local run (cache loads) {wall:.2f} s")
    t0 = time.perf_counter()
    cluster = distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True, host="127.0.0.1",
                                       dashboard_address=None)
    started = time.perf_counter() - t0
    rows_equal = True
    local_t, dask_t, ratios = [], [], []
    try:
        first, first_summary = _sweep(raw, model, vary, scratch / "dask-first", cluster.scheduler_address)
        print(f"cluster start {started:.2f} s; first Dask run (worker imports, cache loads, warm-up) {first:.2f} s, "
              f"{first_summary.batches} chunks of at most {first_summary.batch_size}")
        for r in range(rounds):
            lt, ls = _sweep(raw, model, vary, scratch / "local")
            dt, ds = _sweep(raw, model, vary, scratch / "dask", cluster.scheduler_address)
            same = (scratch / "local" / "results.csv").read_bytes() == (scratch / "dask" / "results.csv").read_bytes()
            rows_equal &= same
            local_t.append(lt)
            dask_t.append(dt)
            ratios.append(lt / dt)
            print(f"  round {r + 1}: local {lt:.2f} s ({ls.computed / lt:,.0f} cases/s, {ls.workers} threads), "
                  f"Dask {dt:.2f} s ({ds.computed / dt:,.0f} cases/s, {ds.batches} chunks of at most "
                  f"{ds.batch_size}, {ds.workers} worker threads); ratio {lt / dt:.2f}; rows identical: {same}")
    finally:
        cluster.close()
    ratio = statistics.median(ratios)
    print(f"Dask / local throughput: median {ratio:.2f} (min {min(ratios):.2f}, max {max(ratios):.2f}; "
          f"target >= {DASK_TARGET}) -> {'met' if ratio >= DASK_TARGET else 'NOT met'}")
    return {"cases": first_summary.total, "cluster_start_s": started, "first_dask_run_s": first,
            "local_s": local_t, "dask_s": dask_t, "ratios": ratios, "ratio_median": ratio,
            "rows_identical": rows_equal}


def part_uncertainty(n_compiled, n_pool, scratch):
    """Uncertainty rates on the compiled and the per-case engine; returns a dict of numbers."""
    from simulator.case.load import load_case
    from simulator.model.build import build_model
    from simulator.sweeps.evaluator import TubeEvaluator
    from simulator.sweeps.execute import run_uncertainty

    text = OXYLENE.read_text().replace('temperature_limit = "1200 K"', 'temperature_limit = "800 K"') + UNCERTAIN
    case = scratch / "uncertain.toml"
    case.write_text(text)
    raw = tomllib.loads(text)
    model = build_model(load_case(str(case)))
    rates = {}
    for engine, n in (("compiled", n_compiled), ("pool", n_pool)):
        out = scratch / f"u-{engine}"
        shutil.rmtree(out, ignore_errors=True)
        result = run_uncertainty(raw, str(scratch), TubeEvaluator(), out, n, seed=3, engine=engine,
                                 model=model if engine == "compiled" else None, progress=False,
                                 source_path=str(case))
        rates[engine] = result["run"]["cases_per_second"]
        print(f"uncertainty, {engine} engine: {n} samples, {result['run']['elapsed_s']:.2f} s, "
              f"{rates[engine]:,.1f} cases/s on {result['run']['workers']} "
              f"{'threads' if engine == 'compiled' else 'processes'}")
    ratio = rates["compiled"] / rates["pool"]
    print(f"uncertainty compiled / per-case rate: {ratio:.0f} (target >= {UNCERTAINTY_TARGET:g}) -> "
          f"{'met' if ratio >= UNCERTAINTY_TARGET else 'NOT met'}")
    return {"compiled_cases_per_s": rates["compiled"], "pool_cases_per_s": rates["pool"], "ratio": ratio}


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="5 000 cases, 1 round, fewer samples")
    parser.add_argument("--cases", type=int, default=20000, help="grid cases (default 20 000)")
    parser.add_argument("--rounds", type=int, default=3, help="alternating local/Dask rounds (default 3)")
    parser.add_argument("--json", default=None, help="also write the numbers to this file")
    args = parser.parse_args(argv)
    n_cases, rounds = (5000, 1) if args.quick else (args.cases, args.rounds)
    n_compiled, n_pool = (2000, 100) if args.quick else (20000, 400)
    with tempfile.TemporaryDirectory(prefix="bench-dask-") as tmp:
        scratch = Path(tmp)
        grid = part_grid(n_cases, rounds, scratch)
        uncertainty = part_uncertainty(n_compiled, n_pool, scratch)
    if args.json:
        Path(args.json).write_text(json.dumps({"grid": grid, "uncertainty": uncertainty}, indent=2))
    return 0 if grid["rows_identical"] else 1


if __name__ == "__main__":
    sys.exit(main())
