"""Which values of one case path the case loader accepts, found with a few loads, not one per value.

A sweep of 20 000 values used to reload the whole case for every value (about 3 ms
each, a minute before the first case ran). The loader's checks on a single number
are bounds (``> 0``, between 0 and 1, below a limit), so the values it accepts at
one path, all else as in the base case, form an interval. This module

* checks a sweep's values as an array: the smallest and largest value, nine values
  spread over the range and the value nearest zero are loaded; if any is refused,
  the boundary is found by bisection on the sorted values (about 15 loads for
  20 000 values), so every value is classified exactly under the interval rule;
* finds the interval of accepted values of an uncertain parameter (bisection from
  the case value towards each far tail of its distribution), from which
  :mod:`~simulator.sweeps.uncertain_ranges` computes the share of the distribution
  the loader would refuse.

Every case is still checked when it runs (the per-case evaluator loads it; the
compiled engine sends refused values to the loader), so a check that does not fit
the interval rule ends as an ``invalid`` row, never as a silent result.
"""
import math
import warnings
from dataclasses import dataclass

import numpy as np

from simulator.errors import CaseError
from simulator.sweeps.paths import apply_values

#: Values spread over a sweep range that are always loaded besides its ends.
INTERIOR_PROBES = 9
#: Largest number of refused-value lines printed per path.
MAX_LINES = 4


def without_limit(raw):
    """The raw case without ``design.temperature_limit`` (sweeps and Monte Carlo ignore it)."""
    return dict(raw, design={k: v for k, v in raw.get("design", {}).items() if k != "temperature_limit"})


@dataclass
class CaseProbe:
    """Loads the base case with one value changed and says whether the loader accepts it.

    Parameters
    ----------
    raw : dict
        Raw base case (``design.temperature_limit`` is ignored).
    case_dir : str
        Folder of the case file.
    source_path : str
        Case file, for the loader's messages.
    loads : int
        Case loads so far (counted, for tests and benchmarks), [-]
    """

    raw: dict
    case_dir: str
    source_path: str = ""
    loads: int = 0

    def __post_init__(self):
        self.raw = without_limit(self.raw)

    def refusal(self, path, value):
        """None if the loader accepts ``value`` at ``path``, else its one-line reason (field path first)."""
        from simulator.case.load import load_case_dict

        self.loads += 1
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                load_case_dict(apply_values(self.raw, {path: value}), source_path=self.source_path,
                               case_dir=self.case_dir)
        except (CaseError, ValueError, ArithmeticError) as err:   # overflow of an extreme value: refused too
            lines = err.problems if isinstance(err, CaseError) else [f"{type(err).__name__}: {err}"]
            prefix = f"{self.source_path}: "
            return "; ".join(line[len(prefix):] if self.source_path and line.startswith(prefix) else line
                             for line in lines)
        return None


def _edge(probe, path, values, good, bad):
    """Bisection on sorted ``values`` between an accepted index and a refused one; returns (good, bad) adjacent."""
    while abs(bad - good) > 1:
        mid = (good + bad) // 2
        if probe.refusal(path, values[mid]) is None:
            good = mid
        else:
            bad = mid
    return good, bad


def refused_values(probe, path, values):
    """Indices of ``values`` the loader refuses, with one reason per side, from a few loads.

    Parameters
    ----------
    probe : CaseProbe
        Loader access.
    path : str
        Dotted case path.
    values : array_like
        Values in SI units of the field (int for whole-number fields).

    Returns
    -------
    refused : ndarray of int
        Indices into ``values`` that are refused (sorted).
    reasons : dict
        ``{index: reason}`` for the refused values that were loaded.
    """
    values = list(values)
    if not values:
        return np.array([], dtype=int), {}
    order = sorted(range(len(values)), key=lambda i: values[i])
    ordered = [values[i] for i in order]
    n = len(ordered)
    spots = {0, n - 1, *(round(k * (n - 1) / (INTERIOR_PROBES + 1)) for k in range(1, INTERIOR_PROBES + 1))}
    spots.add(int(np.argmin(np.abs(np.asarray(ordered, dtype=float)))))
    reasons = {}
    for k in sorted(spots):
        why = probe.refusal(path, ordered[k])
        if why is not None:
            reasons[k] = why
    if not reasons:
        return np.array([], dtype=int), {}
    accepted = [k for k in sorted(spots) if k not in reasons]
    if not accepted:                              # every probe refused: call every value refused
        return np.array(sorted(order), dtype=int), {order[k]: why for k, why in reasons.items()}
    low_ok, high_ok = accepted[0], accepted[-1]
    refused = set()
    if 0 in reasons:
        good, bad = _edge(probe, path, ordered, low_ok, max(k for k in reasons if k < low_ok))
        refused.update(range(0, bad + 1))
        reasons.setdefault(bad, probe.refusal(path, ordered[bad]))
    if n - 1 in reasons:
        good, bad = _edge(probe, path, ordered, high_ok, min(k for k in reasons if k > high_ok))
        refused.update(range(bad, n))
        reasons.setdefault(bad, probe.refusal(path, ordered[bad]))
    refused.update(k for k in reasons if low_ok < k < high_ok)   # a refusal inside: not an interval
    return (np.array(sorted(order[k] for k in refused), dtype=int),
            {order[k]: why for k, why in reasons.items() if k in refused})


def check_vary_values(raw, case_dir, specs, case_path=""):
    """Every value of every ``--vary``, applied alone to the case, must give a case the loader accepts.

    Parameters
    ----------
    raw : dict
        Raw base case.
    case_dir : str
        Folder of the case file.
    specs : sequence of VarySpec
        Parsed ``--vary`` options (their paths checked against the case).
    case_path : str
        Case file, for messages.

    Raises
    ------
    CaseError
        One line per refused value shown (the smallest and largest refused ones of each
        path with the loader's reason) and a count per path.
    """
    from simulator.sweeps.paths import check_vary

    probe = CaseProbe(raw, str(case_dir), str(case_path))
    problems = []
    for spec in specs:
        check_vary(probe.raw, spec)
        values = [int(v) for v in spec.values_si] if spec.integer else [float(v) for v in spec.values_si]
        refused, reasons = refused_values(probe, spec.path, values)
        if refused.size == 0:
            continue
        shown = sorted(reasons)[:MAX_LINES]
        for index in shown:
            problems.append(f"--vary {spec.path} = {spec.values_text[index]}: " + reasons[index].split(": ", 1)[-1])
        if refused.size > len(shown):
            problems.append(f"--vary {spec.path}: {refused.size} of {len(values)} values refused in all "
                            f"(from {spec.values_text[refused[0]]} to {spec.values_text[refused[-1]]})")
    if problems:
        raise CaseError(problems)


def accepted_interval(probe, path, base, low_probe, high_probe, cdf=None, tolerance=1e-7, max_loads=60):
    """Interval around the case value where the loader accepts the value at ``path``.

    Parameters
    ----------
    probe : CaseProbe
        Loader access.
    path : str
        Dotted case path.
    base : float
        Case value (accepted), in SI units of the field
    low_probe, high_probe : float
        Far ends to test (e.g. quantiles 1e-12 and 1 - 1e-12 of a distribution), in SI units of the field
    cdf : callable, optional
        Distribution function; bisection stops when the bracket holds less than
        ``tolerance`` of probability. Without it, at a relative width of 1e-9.
    tolerance : float
        Probability precision of the bound, [-]
    max_loads : int
        Bisection steps per side at most, [-]

    Returns
    -------
    low, high : float
        Accepted bounds (``-inf``/``inf`` where the far end is accepted), in SI units of the field
    reasons : dict
        ``{"low": reason, "high": reason}`` for the sides that have a bound.
    """
    bounds, reasons = [-math.inf, math.inf], {}
    for side, far in ((0, low_probe), (1, high_probe)):
        if not math.isfinite(far) or (far <= base if side == 1 else far >= base):
            continue
        why = probe.refusal(path, far)
        if why is None:
            continue
        good, bad = base, far
        for _ in range(max_loads):
            if cdf is not None:
                if abs(float(cdf(good)) - float(cdf(bad))) < tolerance:
                    break
            elif abs(good - bad) <= 1e-9 * max(abs(good), abs(bad), 1e-300):
                break
            mid = 0.5 * (good + bad)
            reason = probe.refusal(path, mid)
            if reason is None:
                good = mid
            else:
                bad, why = mid, reason
        bounds[side] = good
        reasons["low" if side == 0 else "high"] = why
    return bounds[0], bounds[1], reasons
