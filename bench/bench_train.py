"""Reactor train: what the train driver costs over solving its beds one by one.

    python bench/bench_train.py             # the three-bed demo, 5 interleaved rounds
    python bench/bench_train.py --rounds 9

Baseline (measured in the same run): the beds solved by hand as separate cases, each fed by the previous
bed's outlet through ``Feed.inlet_flows`` after setting the interstage temperature, exactly what a user
would script: ``simulate(bed_case(...))`` per bed. Measured: ``simulate_train(case)`` (species data once,
interstage enthalpy balances, closure over the train). Printed: median wall times and their ratio
(train / baseline). Not a test; a ratio near 1 means the driver adds little over the beds' own solves.
"""
import argparse
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from simulator.case.load import load_case  # noqa: E402
from simulator.solve.integrate import simulate  # noqa: E402
from simulator.solve.train import bed_case, simulate_train  # noqa: E402


def beds_by_hand(case):
    """The baseline: each bed as its own case, chained by hand (cool-to steps only)."""
    result = simulate(case.train[0].case)
    for k in range(1, len(case.train)):
        after = case.train[k - 1].after
        result = simulate(bed_case(case.train[k].case, result.F[-1], after.temperature, float(result.P[-1])))
    return result


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--case", default=str(ROOT / "cases" / "train_three_bed_converter.toml"))
    parser.add_argument("--rounds", type=int, default=5)
    args = parser.parse_args(argv)
    case = load_case(args.case)
    if any(e.after is not None and e.after.kind == "quench" for e in case.train):
        sys.exit("bench_train: the hand-chained baseline covers cool-to / heat-to steps only")
    train = simulate_train(case)          # warm-up: compiled kernel, species data, Cantera caches
    last = beds_by_hand(case)
    if abs(float(last.T[-1]) - float(train.beds[-1].T[-1])) > 1e-6:
        sys.exit("bench_train: the train and the hand-chained beds disagree at the outlet")
    t_train, t_hand = [], []
    for _ in range(args.rounds):
        started = time.perf_counter()
        beds_by_hand(case)
        t_hand.append(time.perf_counter() - started)
        started = time.perf_counter()
        simulate_train(case)
        t_train.append(time.perf_counter() - started)
    hand, driver = statistics.median(t_hand), statistics.median(t_train)
    print(f"case: {args.case} ({len(case.train)} beds), {args.rounds} rounds")
    print(f"beds chained by hand (baseline): {hand * 1e3:9.1f} ms")
    print(f"simulate_train:                  {driver * 1e3:9.1f} ms")
    print(f"ratio train / baseline:          {driver / hand:9.3f}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
