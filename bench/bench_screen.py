"""Benchmark: a full runaway screen of a 5-species cooled packed tube, critical values included.

Target (issue): <= 10 s on a 2-core machine; prints the number of solves it needed.
Run: python bench/bench_screen.py [CASE]
"""
import sys
import time
from pathlib import Path

from simulator import load_case, simulate
from simulator.screening.screen import screen

HERE = Path(__file__).parent


def main(argv=None):
    argv = sys.argv[1:] if argv is None else argv
    path = Path(argv[0]) if argv else HERE / "cases" / "hydrogenation_5_species.toml"
    case = load_case(path)
    simulate(case)                      # load the compiled kernel once (not part of the screen)
    times = []
    for _ in range(3):
        t0 = time.perf_counter()
        report = screen(case)
        times.append(time.perf_counter() - t0)
    times.sort()
    print(f"case: {path.name} ({len(case.species)} species)")
    print(f"full screen: median {times[1]:.2f} s (min {times[0]:.2f}, max {times[2]:.2f}) over 3 runs; "
          f"{report['solves']} solves ({1000 * times[1] / report['solves']:.1f} ms per solve)")
    print(f"target <= 10 s: {'met' if times[1] <= 10 else 'MISSED'}")
    print(f"risk: {report['risk']}; critical values: " + ", ".join(
        f"{k} {v['value']:.6g}" if v["found"] else f"{k} not found" for k, v in report["critical"].items()))
    return 0


if __name__ == "__main__":
    sys.exit(main())
