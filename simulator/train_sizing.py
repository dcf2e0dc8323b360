"""Length of one chosen bed of a reactor train that brings the train to its target conversion.

Every other bed, every interstage step and the feed stay as the case gives them; only the chosen bed's
``tube.length`` changes. Each trial length is a full train run (:func:`simulator.solve.train.simulate_train`),
so the later beds see the chosen bed's new outlet exactly. The overall conversion (on everything fed) is
bracketed by doubling or halving the given length, then the crossing of the target is found by Brent's
method on the length. The answer is checked by a final run at that length; its numbers are reported.

Where the target cannot be reached by this bed's length alone (a reversible reaction whose later beds are
equilibrium-limited, or a train that stops on ``design.temperature_limit`` or the pressure floor before the
target) the sizing says so, with the conversion reached and what bound it, and gives no length.
``design.max_pressure_drop`` is checked on every bed of the final run.
"""
import dataclasses
import math

from scipy.optimize import brentq

from simulator.case.limits import RANGES
from simulator.errors import CaseError
from simulator.solve.train import simulate_train
from simulator.verdicts import null_where_not_finite

#: Largest factor on the given length the bracket search tries (and the smallest, inverted), [-]
BRACKET_FACTOR = 64.0


def _with_length(case, bed, length):
    beds = list(case.train)
    entry = beds[bed - 1]
    tube = dataclasses.replace(entry.case.tube, length=length)
    beds[bed - 1] = dataclasses.replace(entry, case=dataclasses.replace(entry.case, tube=tube))
    first = beds[0].case
    return dataclasses.replace(case, tube=first.tube, train=tuple(beds))


def size_train_bed(case, bed):
    """The ``sizing.json`` dict of a train: the length of bed ``bed`` (1-based) for the train's target.

    Parameters
    ----------
    case : simulator.case.schema.Case
        A validated train case with ``design.target_conversion``.
    bed : int
        The bed whose length is sized, 1-based, [-]

    Returns
    -------
    dict
        ``train`` {``bed``, ``given_length_m``, ``feasible``, ``length_m`` (None if not feasible),
        ``binding_constraint``, ``note``, ``overall_conversion_at_given``, ``overall_conversion``
        (at ``length_m``), ``bed_lengths_m``, ``train_runs``}.
    """
    where = f"{case.source_path}: " if case.source_path else ""
    target = case.design.target_conversion
    if math.isnan(target):
        raise CaseError(f"{where}design.target_conversion: missing; sizing a bed of a train needs the train's target.")
    n = len(case.train)
    if not 1 <= bed <= n:
        raise CaseError(f"{where}--bed {bed}: the train has {n} beds; give a bed number from 1 to {n}.")
    L_min, L_max = RANGES["tube.length"]
    given = case.train[bed - 1].case.tube.length
    runs = []

    def run(length):
        train = simulate_train(_with_length(case, bed, length))
        runs.append(train)
        return train

    def excess(length):
        train = run(length)
        return train.overall_conversion - target if train.status == "completed" else math.nan

    at_given = run(given)
    g_given = at_given.overall_conversion - target if at_given.status == "completed" else math.nan
    lo = hi = given
    g_lo = g_hi = g_given
    if g_given < 0:                                 # too short: lengthen until the target is passed
        while g_hi < 0 and hi < min(L_max, BRACKET_FACTOR * given):
            lo, g_lo = hi, g_hi
            hi = min(2.0 * hi, L_max)
            g_hi = excess(hi)
    elif g_given >= 0:                              # long enough: shorten until it is no longer reached
        while g_lo >= 0 and lo > max(L_min, given / BRACKET_FACTOR):
            hi, g_hi = lo, g_lo
            lo = max(0.5 * lo, L_min)
            g_lo = excess(lo)
    result = {"bed": bed, "given_length_m": given, "target_conversion": target,
              "overall_conversion_at_given": at_given.overall_conversion if at_given.status == "completed" else None}
    last = runs[-1]
    if math.isnan(g_hi) or math.isnan(g_lo):
        stopped = next(t for t in runs if t.status != "completed")
        binding = "temperature_limit" if "temperature limit" in stopped.termination else "run"
        return _answer(case, result, runs, None, binding,
                       f"no length found: at a trial length the train did not complete ({stopped.termination})")
    if g_hi < 0:
        reached = last.overall_conversion
        return _answer(case, result, runs, None, "target_conversion",
                       f"not reachable by the length of bed {bed} alone: X = {reached:.6g} at "
                       f"{hi:.6g} m ({BRACKET_FACTOR:g} times the given length or the longest accepted), below the "
                       f"target {target:.6g} (equilibrium or the other beds limit it)")
    if g_lo >= 0:
        return _answer(case, result, runs, lo, "target_conversion",
                       f"the target is met even at {lo:.6g} m, the shortest length tried ({1 / BRACKET_FACTOR:g} of the "
                       "given length or the shortest accepted)")
    def finite_excess(length):
        g = excess(length)
        if math.isnan(g):
            raise _Incomplete
        return g

    try:
        length = brentq(finite_excess, lo, hi, xtol=1e-9 * hi, rtol=1e-12, maxiter=60)
    except _Incomplete:
        stopped = runs[-1]
        return _answer(case, result, runs, None, "run",
                       f"no length found: at a trial length the train did not complete ({stopped.termination})")
    return _answer(case, result, runs, length, "target_conversion", "")


class _Incomplete(Exception):
    """A trial run of the train did not complete (its overall conversion is not defined)."""


def _answer(case, result, runs, length, binding, note):
    """The sizing dict, with the final run at ``length`` (if any) checked against the pressure-drop limit."""
    if length is not None:
        final = simulate_train(_with_length(case, result["bed"], length))
        runs.append(final)
        dp_max = case.design.max_pressure_drop
        drops = [float(b.P[0] - b.P[-1]) for b in final.beds]
        if final.status != "completed":
            length, binding, note = None, "run", f"the run at the length found did not complete: {final.termination}"
        elif not math.isnan(dp_max) and max(drops) > dp_max:
            k = max(range(len(drops)), key=drops.__getitem__)
            note = (f"at {length:.6g} m bed {k + 1} loses {drops[k]:.6g} Pa, above design.max_pressure_drop = "
                    f"{dp_max:.6g} Pa")
            length, binding = None, "max_pressure_drop"
        result["overall_conversion"] = final.overall_conversion if final.status == "completed" else None
        result["bed_lengths_m"] = [float(b.z[-1]) for b in final.beds]
    else:
        result["overall_conversion"] = None
        result["bed_lengths_m"] = None
    result.update({"feasible": length is not None, "length_m": length, "binding_constraint": binding,
                   "note": note, "train_runs": len(runs)})
    return null_where_not_finite({"title": case.title, "train": result})


def format_train_sizing(report):
    """Terminal lines of a train bed sizing."""
    t = report["train"]
    head = f"{report['title']}\n  bed {t['bed']} of the train sized for the train's target X = {t['target_conversion']:.4g}"
    given = t["overall_conversion_at_given"]
    lines = [head, f"  given length {t['given_length_m']:.6g} m: X = "
                   f"{'not computed (the train did not complete)' if given is None else format(given, '.6g')}"]
    if t["feasible"]:
        lines.append(f"  length of bed {t['bed']}: {t['length_m']:.6g} m (X = {t['overall_conversion']:.6g}; "
                     f"{t['train_runs']} train runs)")
    else:
        lines.append(f"  no length: {t['note']} (binding: {t['binding_constraint']})")
    if t["feasible"] and t["note"]:
        lines.append(f"  note: {t['note']}")
    return "\n".join(lines)
