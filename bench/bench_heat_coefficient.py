"""Cost of U from correlations ([heat.coefficient]) against a typed U, on the same tube.

Run from the repository root::

    python bench/bench_heat_coefficient.py             # 5 interleaved rounds
    python bench/bench_heat_coefficient.py --rounds 9

The tube is ``bench/cases/cooled_packed_bed_bench.toml`` (invented data): once with its typed
U = 150 W/(m^2 K), once with ``[heat.coefficient]`` (Leva by the flux direction, a steel wall,
a shell-side coefficient, the gas conductivity from Cantera's fits and the viscosity from
Cantera's fits by Wilke's rule, so every right-hand side evaluates both mixture rules). Both go
through the public ``simulate``; rounds alternate so both see the same machine state; the ratio
of the medians is printed. A compiled sweep of 2 000 feed temperatures on each is timed too
(the batch integrator evaluates U(z) in the same kernel). Not a timed test: no target is asserted.
"""
import argparse
import os
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("TUBESIM_KERNEL", "compiled")

import numpy as np  # noqa: E402
import tomllib  # noqa: E402

from simulator.case.load import load_case_dict  # noqa: E402
from simulator.model.build import build_model  # noqa: E402
from simulator.solve.integrate import simulate  # noqa: E402

CASE = ROOT / "bench" / "cases" / "cooled_packed_bed_bench.toml"
COEFFICIENT = {"inside": "auto", "wall_thickness": "2 mm", "wall_conductivity": "16 W/(m*K)",
               "outside": "1500 W/(m^2*K)"}


def variants(raw):
    """(typed, correlated) cases of the bench tube."""
    typed = load_case_dict(raw, source_path=str(CASE), case_dir=CASE.parent)
    heat = {k: v for k, v in raw["heat"].items() if k != "overall_coefficient"}
    pd = {k: v for k, v in raw["pressure_drop"].items() if k != "viscosity"}
    new = {**raw, "heat": {**heat, "coefficient": COEFFICIENT}, "pressure_drop": pd}
    return typed, load_case_dict(new, source_path=str(CASE), case_dir=CASE.parent)


def sweep_time(case, N=2000):
    """Seconds of one compiled batch over N feed temperatures (after a warm call)."""
    from simulator.sweeps.fast import batch_solve

    model = build_model(case)
    T = np.linspace(case.feed.temperature - 5.0, case.feed.temperature + 5.0, N)[:, None]
    batch_solve(model, T[:10], ["feed.temperature"])
    t0 = time.perf_counter()
    batch_solve(model, T, ["feed.temperature"])
    return time.perf_counter() - t0


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=5)
    args = parser.parse_args(argv)
    raw = tomllib.loads(CASE.read_text(encoding="utf-8"))
    cases = dict(zip(("typed U", "correlated U"), variants(raw)))
    for case in cases.values():          # warm the compiled kernel and the thermo caches
        simulate(case)
    times = {name: [] for name in cases}
    for _ in range(args.rounds):
        for name, case in cases.items():
            t0 = time.perf_counter()
            simulate(case)
            times[name].append(time.perf_counter() - t0)
    typed, corr = (statistics.median(times[n]) for n in cases)
    U = simulate(cases["correlated U"]).summary()["wall"]["overall_coefficient_W_per_m2K"]
    print(f"typed U solve           {typed * 1e3:8.2f} ms (median of {args.rounds})")
    print(f"correlated U solve      {corr * 1e3:8.2f} ms (U {U['min']:.4g} to {U['max']:.4g} W/(m^2 K))")
    print(f"ratio correlated/typed  {corr / typed:8.2f}")
    s_typed, s_corr = (sweep_time(c) for c in cases.values())
    print(f"compiled sweep, 2000 cases: typed {2000 / s_typed:8.0f} cases/s, correlated {2000 / s_corr:8.0f} "
          f"cases/s, ratio {s_corr / s_typed:.2f}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
