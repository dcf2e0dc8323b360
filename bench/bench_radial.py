"""Speed of a 2-D (radial) run against the 1-D run of the same tube, measured in the same run.

Run from the repository root::

    python bench/bench_radial.py                 # 7 interleaved rounds, 5 radial points
    python bench/bench_radial.py --points 3 5 8  # several point counts
    python bench/bench_radial.py --rounds 11

The tube is the demo ``cases/wide_tube_partial_oxidation.toml`` (our own scenario): once as the
case says (``model.radial = "1d"``, the lumped U) and once with ``model.radial = "2d"`` and the
outside coefficient that gives the same lumped U. Both go through the public ``simulate`` with a
model built once (as sweeps use it), so the ratio is the integration and post-processing of the
two models. Rounds alternate the variants so both see the same machine state; the ratio of the
medians is printed (target <= 5 with 5 points).
"""
import argparse
import dataclasses
import os
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("TUBESIM_KERNEL", "compiled")

from simulator.case.load import load_case  # noqa: E402
from simulator.model.build import build_model  # noqa: E402
from simulator.solve.integrate import simulate  # noqa: E402

CASE = ROOT / "cases" / "wide_tube_partial_oxidation.toml"
TARGET_RATIO = 5.0


def variants(points):
    """(1-D case, 2-D case) of the demo, the 2-D one with the outside coefficient of the same lumped U."""
    one = load_case(CASE)
    rs = one.radial
    radius = 0.5 * one.tube.inner_diameter
    outside = 1.0 / (1.0 / one.heat.overall_coefficient - 1.0 / rs.wall_coefficient
                     - radius / (4.0 * rs.conductivity))
    two = dataclasses.replace(one, radial=dataclasses.replace(rs, dimension="2d", points=points),
                              heat=dataclasses.replace(one.heat, overall_coefficient=outside))
    return one, two


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=7)
    parser.add_argument("--points", type=int, nargs="+", default=[5])
    args = parser.parse_args(argv)
    worst = 0.0
    for points in args.points:
        one, two = variants(points)
        models = {"1-D": build_model(one), "2-D": build_model(two)}
        cases = {"1-D": one, "2-D": two}
        for name in cases:                   # warm the compiled kernels
            simulate(cases[name], model=models[name])
        times = {name: [] for name in cases}
        for _ in range(args.rounds):
            for name in cases:
                t0 = time.perf_counter()
                result = simulate(cases[name], model=models[name])
                times[name].append(time.perf_counter() - t0)
                assert result.status != "failed", result.termination
        t1, t2 = (statistics.median(times[n]) for n in ("1-D", "2-D"))
        ratio = t2 / t1
        worst = max(worst, ratio) if points == 5 else worst
        print(f"{points} radial points: 1-D {t1 * 1e3:8.2f} ms, 2-D {t2 * 1e3:8.2f} ms (medians of {args.rounds}); "
              f"ratio {ratio:5.2f}" + (f" (target <= {TARGET_RATIO:g})" if points == 5 else ""))
    if 5 in args.points:
        print("target met" if worst <= TARGET_RATIO else "target missed")
    return 0


if __name__ == "__main__":
    sys.exit(main())
