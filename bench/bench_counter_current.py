"""Speed of a counter-current solve (scan + refinement) against one co-current solve of the same tube.

Run from the repository root::

    python bench/bench_counter_current.py             # 5 interleaved rounds
    python bench/bench_counter_current.py --rounds 9

The tube is ``bench/cases/cooled_packed_bed_bench.toml`` (invented data) with its uniform
medium replaced by a flowing one (20 kg/s, 2.2 kJ/(kg K), same inlet temperature), once
co-current and once counter-current. Both go through the public ``simulate``: the co-current
one is one initial-value run with its checks; the counter-current one scans the shooting
residual, refines every root (Brent) and runs each steady state in full. Rounds alternate the
two so both see the same machine state; the ratio of the medians is printed (target <= 50).
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

import tomllib  # noqa: E402

from simulator.case.load import load_case_dict  # noqa: E402
from simulator.solve.integrate import simulate  # noqa: E402

CASE = ROOT / "bench" / "cases" / "cooled_packed_bed_bench.toml"
TARGET_RATIO = 50.0


def flowing(raw, arrangement):
    """The bench case with a flowing medium of the given arrangement (raw dict copy)."""
    new = {**raw, "heat": {**raw["heat"], "medium": {**raw["heat"]["medium"], "arrangement": arrangement,
                                                    "mass_flow": "20 kg/s", "cp": "2.2 kJ/(kg*K)"}}}
    return load_case_dict(new, source_path=str(CASE), case_dir=CASE.parent)


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=5)
    args = parser.parse_args(argv)
    raw = tomllib.loads(CASE.read_text(encoding="utf-8"))
    cases = {name: flowing(raw, name) for name in ("co-current", "counter-current")}
    for case in cases.values():          # warm the compiled kernel and the thermo caches
        simulate(case)
    times = {name: [] for name in cases}
    for _ in range(args.rounds):
        for name, case in cases.items():
            t0 = time.perf_counter()
            result = simulate(case)
            times[name].append(time.perf_counter() - t0)
    counter = simulate(cases["counter-current"])
    states = counter.summary()["steady_states"]
    co, cc = (statistics.median(times[n]) for n in ("co-current", "counter-current"))
    shoot = counter.solver_stats["counter_current"]
    print(f"co-current solve        {co * 1e3:8.2f} ms (median of {args.rounds})")
    print(f"counter-current solve   {cc * 1e3:8.2f} ms (scan of {shoot['points']} marches over "
          f"{shoot['bounds_K'][0]:.1f}-{shoot['bounds_K'][1]:.1f} K, {len(states)} steady state(s))")
    print(f"ratio                   {cc / co:8.1f} (target <= {TARGET_RATIO:g})")
    return 0 if cc / co <= TARGET_RATIO and result.status != "failed" else 1


if __name__ == "__main__":
    sys.exit(main())
