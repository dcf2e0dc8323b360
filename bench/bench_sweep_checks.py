"""Start-up of a long sweep and the speed of uncertainty runs, before/after ratios in one run.

Run from the repository root::

    python bench/bench_sweep_checks.py              # about 1-2 min
    python bench/bench_sweep_checks.py --per-value 2000 --samples 200

1. Checking the values of ``--vary "heat.medium.temperature=400 K..460 K in 20000"`` on the
   demo case ``cases/hydrogenation_cooled_packed_bed.toml``: the earlier check (one full case
   load per value), timed on ``--per-value`` values and extrapolated to 20 000 (said so),
   against :func:`simulator.sweeps.validity.check_vary_values` on all 20 000.
2. An uncertainty run (medium temperature normal, std 4 K; activation energy truncated
   normal, std 1 kJ/mol) on the same case: ``--samples`` samples on the per-case pool
   engine against ten times as many on the compiled engine (after one warm-up so numba's
   cache is loaded; more samples so its fixed start-up does not dominate the rate),
   as ``tubesim uncertainty`` runs them (output folders in a temporary directory).
"""
import argparse
import copy
import tempfile
import time
import tomllib
import warnings
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
CASE = ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml"


def per_value_check(raw, spec, n):
    """The earlier check: a full case load for each of the first n values; seconds."""
    from simulator.case.load import load_case_dict
    from simulator.sweeps.paths import apply_values
    from simulator.sweeps.validity import without_limit

    base = without_limit(raw)
    started = time.perf_counter()
    for value in spec.values_si[:n]:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            load_case_dict(apply_values(base, {spec.path: float(value)}), source_path=str(CASE),
                           case_dir=str(CASE.parent))
    return time.perf_counter() - started


def uncertainty_rate(raw, engine, samples, out):
    from simulator.case.load import load_case_dict
    from simulator.sweeps.engine import choose_engine
    from simulator.sweeps.evaluator import TubeEvaluator
    from simulator.sweeps.execute import run_uncertainty

    case = load_case_dict(raw, source_path=str(CASE))
    chosen, model = choose_engine(engine, case, [e["parameter"] for e in raw["uncertainty"]])
    result = run_uncertainty(raw, str(CASE.parent), TubeEvaluator(), out, samples, seed=1, progress=False,
                             engine=chosen, model=model, source_path=str(CASE))
    return chosen, result["run"]["computed"] / result["run"]["elapsed_s"]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--per-value", type=int, default=1000, help="values checked the earlier way (extrapolated)")
    parser.add_argument("--samples", type=int, default=200, help="samples per uncertainty run")
    args = parser.parse_args()

    import sys

    sys.path.insert(0, str(ROOT))
    from simulator.sweeps.paths import parse_vary
    from simulator.sweeps.validity import check_vary_values

    raw = tomllib.loads(CASE.read_text(encoding="utf-8"))
    spec = parse_vary("heat.medium.temperature=400 K..460 K in 20000")
    check_vary_values(raw, str(CASE.parent), [parse_vary("heat.medium.temperature=400 K..460 K in 2")], str(CASE))
    started = time.perf_counter()
    check_vary_values(raw, str(CASE.parent), [spec], str(CASE))
    now = time.perf_counter() - started
    before = per_value_check(raw, spec, args.per_value) * 20000 / args.per_value
    print(f"check of 20 000 --vary values: before {before:.1f} s (one load per value, timed on "
          f"{args.per_value} and extrapolated), now {now:.3f} s; ratio {before / now:.0f}")

    raw_u = copy.deepcopy(raw)
    raw_u["uncertainty"] = [
        {"parameter": "heat.medium.temperature", "distribution": "normal", "std": "4 K"},
        {"parameter": "reactions.0.activation_energy", "distribution": "truncated-normal", "std": "1 kJ/mol"},
    ]
    with tempfile.TemporaryDirectory() as tmp:
        uncertainty_rate(raw_u, "compiled", 16, Path(tmp) / "warm")
        _, pool = uncertainty_rate(raw_u, "pool", args.samples, Path(tmp) / "pool")
        _, compiled = uncertainty_rate(raw_u, "compiled", 10 * args.samples, Path(tmp) / "compiled")
    print(f"uncertainty: pool engine {pool:.1f} cases/s ({args.samples} samples), compiled engine "
          f"{compiled:.1f} cases/s ({10 * args.samples} samples); ratio {compiled / pool:.0f}")


if __name__ == "__main__":
    main()
