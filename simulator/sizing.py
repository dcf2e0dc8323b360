"""Size the tube bundle on the full model for a target conversion.

(a) ``length for the given tube count``: integrate the full model far enough
    that the target is crossed; the crossing (a located event) is the length.
(b) ``tube count for the given length``: the total feed is fixed, so the flow
    per tube, mass velocity, pressure drop and heat removal per mole change with
    the count. The smallest count that meets every requirement is found by
    doubling and then bisection on whole numbers.

Requirements honoured: the target conversion, ``design.max_pressure_drop`` (over
the length used), ``design.temperature_limit`` (hot spot below it),
``design.wall_temperature_limit`` (the hottest tube wall below it, where given) and that the tube
passes the feed at all (pressure above 1 % of the feed pressure to its end). The
requirement that decides the answer is named as the binding constraint. With
``[heat.coefficient]`` U follows the flow per tube: every candidate count is built anew, so its
inside coefficient is that of its own mass velocity.
"""
import dataclasses
import math

from simulator.solve.integrate import simulate
from simulator.solve.target_length import length_by_resolving, moves_with_length
from simulator.verdicts import null_where_not_finite

MAX_LENGTH_FACTOR = 64.0      # search up to 64x the given length in (a)
MAX_COUNT_FACTOR = 4096       # search up to 4096x the given count in (b)


def _with(case, length=None, count=None):
    tube = dataclasses.replace(case.tube, length=case.tube.length if length is None else length,
                               count=case.tube.count if count is None else int(count))
    # flows are totals for the whole reactor, so the per-tube flow follows from the count
    return dataclasses.replace(case, tube=tube)


def _evaluate(case, kind, result=None):
    """Run one candidate (or judge its given ``result``) against the requirements.

    For a length found by (a) the tube ends at the target, so pressure drop and hot spot count up
    to there; for a count found by (b) the tube keeps the case's length, so they count over all of it.
    """
    result = simulate(case) if result is None else result
    d = result.design
    hot = result.hot_spot
    whole_tube = kind != "length for the given count"     # the tube keeps its length: judge all of it
    if d["reached"] and not whole_tube:
        z = d["length_m"]
        mask = result.z <= z + 1e-12
        T_max = float(result.T[mask].max())
        if hot["position_m"] <= z:          # the located hot spot, not only the output points
            T_max = max(T_max, hot["temperature_K"])
        dp = float(result.P[0] - result.P[mask].min())
    else:
        T_max = max(float(result.T.max()), hot["temperature_K"])
        dp = float(result.P[0] - result.P.min())
    limits = case.design
    # where a stop happened matters: a tube cut at the target (a) is not affected by a stop beyond it
    end = result.case.tube.length if whole_tube or not d["reached"] else d["length_m"]
    stop_T = result.events.get("temperature_limit", {}).get("position_m")
    stop_P = result.events.get("pressure_floor", {}).get("position_m")
    stop_W = result.events.get("wall_temperature_limit", {}).get("position_m")
    checks = {
        "target_conversion": bool(d["reached"]),
        "max_pressure_drop": math.isnan(limits.max_pressure_drop) or dp <= limits.max_pressure_drop,
        "temperature_limit": (math.isnan(limits.temperature_limit) or
                              (T_max < limits.temperature_limit and (stop_T is None or stop_T > end))),
        "tube_carries_feed": stop_P is None or stop_P > end,
    }
    if not math.isnan(limits.wall_temperature_limit):     # the run stops where the wall exceeds it
        checks["wall_temperature_limit"] = stop_W is None or stop_W > end
    if result.status == "failed":
        checks["solver"] = False
    return {
        "kind": kind, "tube_count": case.tube.count, "tube_length_m": case.tube.length,
        "length_to_target_m": d["length_m"], "volume_m3": d["volume_m3"], "catalyst_mass_kg": d["catalyst_mass_kg"],
        "outlet_conversion": result.outlet_conversion, "pressure_drop_Pa": dp, "hot_spot_K": T_max,
        "status": result.status, "meets": checks, "feasible": all(checks.values()),
    }


PRIORITY = ("temperature_limit", "wall_temperature_limit", "tube_carries_feed", "max_pressure_drop", "target_conversion",
            "solver")


def binding(cand):
    """The requirement a candidate fails first, in order of PRIORITY (a run stopped at the temperature
    limit also misses the target; the limit is the cause)."""
    return next((k for k in PRIORITY if not cand["meets"].get(k, True)), None)


def _design(case, cand):
    """The complete design of one evaluated candidate: what a re-run with its count and length gives.

    ``volume_m3`` and ``catalyst_mass_kg`` are those installed (all tubes over their whole length,
    [m^3], [kg]; catalyst None for an empty tube).
    """
    volume = cand["tube_count"] * math.pi / 4.0 * case.tube.inner_diameter ** 2 * cand["tube_length_m"]
    return {"tube_count": cand["tube_count"], "tube_length_m": cand["tube_length_m"],
            "outlet_conversion": cand["outlet_conversion"], "pressure_drop_Pa": cand["pressure_drop_Pa"],
            "hot_spot_K": cand["hot_spot_K"], "volume_m3": volume,
            "catalyst_mass_kg": None if case.bed is None else volume * case.bed.bulk_density,
            "status": cand["status"]}


def length_for_count(case):
    """(a) Length that reaches the target with the case's tube count.

    Returns a dict: ``feasible``, ``binding_constraint``, ``note``, ``design`` (the complete design of
    the case's tube count cut at the target crossing, from a re-run of exactly that tube; None when
    no length works) and the ``candidates`` evaluated.
    """
    if moves_with_length(case):
        return _length_by_resolving(case)
    length = case.tube.length
    candidates = []
    while True:
        cand = _evaluate(_with(case, length=length), "length for the given count")
        candidates.append(cand)
        reached = cand["meets"]["target_conversion"]
        stopped = cand["status"] != "completed"
        if reached or stopped or length >= MAX_LENGTH_FACTOR * case.tube.length:
            break
        length *= 4.0
    best = candidates[-1]
    failing = binding(best)
    if failing is not None:
        return {"feasible": False, "binding_constraint": failing, "note": _why_not(best), "design": None,
                "candidates": candidates}
    # the tube cut at the crossing, run as it is: the design a re-run with this count and length reproduces
    cut = _evaluate(_with(case, length=best["length_to_target_m"]), "design at the length found")
    candidates.append(cut)
    return {"feasible": True, "binding_constraint": "target_conversion", "note": "",
            "design": _design(case, cut), "candidates": candidates}


def _length_by_resolving(case):
    """(a) for a counter-current medium: the length is a root of X_out(L) - target over re-solved tubes
    (:mod:`simulator.solve.target_length`); the tube of that length is then judged like any candidate."""
    found = length_by_resolving(case)
    if not found["reached"]:
        cand = _evaluate(_with(case, length=MAX_LENGTH_FACTOR * case.tube.length), "length for the given count")
        return {"feasible": False, "binding_constraint": binding(cand) or "target_conversion",
                "note": "no feasible length with this tube count: " + found["note"], "design": None,
                "candidates": [cand]}
    # the root search already solved the tube of that length: judge its result, do not solve it again
    cand = _evaluate(_with(case, length=found["length_m"]), "design at the length found", found["result"])
    cand["solves"] = found["solves"]
    failing = binding(cand)
    note = found["note"]
    if failing is not None:
        return {"feasible": False, "binding_constraint": failing, "note": _why_not(cand), "design": None,
                "candidates": [cand]}
    return {"feasible": True, "binding_constraint": "target_conversion", "note": note,
            "design": _design(case, cand), "candidates": [cand]}


def _why_not(cand):
    failing = [k for k, ok in cand["meets"].items() if not ok]
    what = ("no feasible length with this tube count" if cand["kind"].startswith("length")
            else "no feasible tube count for this length")
    return (f"{what}: " + ", ".join(failing) +
            f" (outlet conversion {cand['outlet_conversion']:.4f}, hot spot {cand['hot_spot_K']:.1f} K, "
            f"pressure drop {cand['pressure_drop_Pa']:.4g} Pa)")


def _probes(n0, n_max):
    """Tube counts to try from n0 outwards, nearest (by ratio) first: 2 n0, n0/2, 4 n0, n0/4, ...

    >>> _probes(12, 100)
    [24, 6, 48, 3, 96, 1]
    """
    up = []
    n = n0 * 2
    while n <= n_max:
        up.append(n)
        n *= 2
    down = []
    n = n0 // 2
    while n >= 1:
        down.append(n)
        n //= 2
    if down and down[-1] != 1:
        down.append(1)
    out = []
    for k in range(max(len(up), len(down))):
        out += up[k:k + 1] + down[k:k + 1]
    return out


def _failing(cand):
    return {k for k, ok in cand["meets"].items() if not ok}


def _no_count_note(cache, split=None):
    """Why no tube count works: where each requirement fails among the counts tried.

    ``split`` = (a, b): adjacent counts where the failing requirements change over completely (a
    fails only what more tubes cure, b = a + 1 only what fewer tubes cure), so no whole number fits.
    """
    counts = sorted(cache)
    parts = []
    for req in PRIORITY:
        bad = [n for n in counts if not cache[n]["meets"].get(req, True)]
        if not bad:
            continue
        if len(bad) == len(counts):
            where = "at every count tried"
        elif bad == counts[:len(bad)]:
            where = f"with {_tubes(bad[-1])} or fewer"
        elif bad == counts[-len(bad):]:
            where = f"with {_tubes(bad[0])} or more"
        else:
            where = "at " + ", ".join(str(n) for n in bad) + " tubes"
        parts.append(f"{req} fails {where}")
    text = f"no tube count from {counts[0]} to {counts[-1]} meets every requirement ({'; '.join(parts)})"
    if split is not None:
        a, b = split
        more, fewer = sorted(_failing(cache[a])), sorted(_failing(cache[b]))
        text += (f": {' and '.join(more)} need{'s' if len(more) == 1 else ''} at least {_tubes(b)} but "
                 f"{' and '.join(fewer)} allow{'s' if len(fewer) == 1 else ''} at most {_tubes(a)}")
    return text + "; change the length, the diameter, the medium or the requirements."


def _window(ev, a, b):
    """Bisection on whole counts between a (fails only what more tubes cure) and b (fails only what
    fewer tubes cure): a feasible count, or None with the adjacent pair where the failures switch."""
    low, high = _failing(ev(a)), _failing(ev(b))
    while b - a > 1:
        mid = (a + b) // 2
        failing = _failing(ev(mid))
        if not failing:
            return mid, None
        if failing <= low:
            a = mid
        elif failing <= high:
            b = mid
        else:
            return None, (a, b)       # both kinds fail at once: the requirements overlap here
    return None, (a, b)


def count_for_length(case):
    """(b) Smallest tube count that meets every requirement with the case's tube length.

    The feed is fixed, so the count sets the flow per tube: more tubes give each mole more residence
    time, wall area and less pressure drop, but in a heated (or strongly cooled) tube they also bring
    the gas closer to the medium temperature. Requirements may therefore fail on either side of the
    case's count. The search probes counts outwards from the case's count in both directions (2 n,
    n/2, 4 n, n/4, ... down to 1 and up to :data:`MAX_COUNT_FACTOR` n). Where two neighbouring probes
    fail disjoint requirements (the lower one what more tubes cure, the upper one what fewer tubes
    cure), it bisects on whole numbers between them. From the first count that works it bisects
    downwards to the smallest. The feasible counts are taken to form one interval, as they do when
    each requirement changes monotonically with the count.

    Returns a dict: ``feasible``, ``binding_constraint`` (what one tube fewer fails), ``note``,
    ``design`` (the complete design of that count at the case's length; None when no count works)
    and the ``candidates`` evaluated.
    """
    cache = {}

    def ev(n):
        if n not in cache:
            cache[n] = _evaluate(_with(case, count=n), "count for the given length")
        return cache[n]

    def candidates():
        return [cache[k] for k in sorted(cache)]

    n0 = max(1, case.tube.count)
    found, split = (n0 if ev(n0)["feasible"] else None), None
    for n in ([] if found else _probes(n0, MAX_COUNT_FACTOR * n0)):
        if ev(n)["feasible"]:
            found = n
            break
        counts = sorted(cache)
        pairs = [(a, b) for a, b in zip(counts, counts[1:]) if not (_failing(cache[a]) & _failing(cache[b]))]
        if pairs:
            found, split = _window(ev, *pairs[0])
            break
    if found is None:
        return {"feasible": False, "binding_constraint": binding(ev(n0)), "note": _no_count_note(cache, split),
                "design": None, "candidates": candidates()}
    # bisect down to the smallest feasible count, from the nearest failing count below (or 0)
    n_hi = found
    below = [n for n in cache if n < n_hi and not cache[n]["feasible"]]
    n_lo = max(below) if below else 0
    if n_lo == 0:
        probe = n_hi // 2
        while probe >= 1 and ev(probe)["feasible"]:
            n_hi, probe = probe, probe // 2
        n_lo = probe  # infeasible (or 0)
    while n_hi - n_lo > 1:
        mid = (n_lo + n_hi) // 2
        if ev(mid)["feasible"]:
            n_hi = mid
        else:
            n_lo = mid
    bound = binding(ev(n_lo)) if n_lo >= 1 else "none (a single tube meets every requirement)"
    return {"feasible": True, "binding_constraint": bound, "note": "", "design": _design(case, ev(n_hi)),
            "candidates": candidates()}


def size(case):
    """Both sizings, kept apart; the ``sizing.json`` content.

    (a) and (b) are two separate answers, each a complete design of its own (tube count, length,
    outlet conversion, pressure drop, hot spot, volume, catalyst mass): the length of (a) belongs
    to the case's count and the count of (b) to the case's length. Taken together they are not a
    design, so nothing of either is written at the top level.
    """
    if math.isnan(case.design.target_conversion):
        from simulator.errors import CaseError

        raise CaseError(f"{case.source_path}: design.target_conversion: missing; sizing needs a target.")
    a = length_for_count(case)
    b = count_for_length(case)
    return null_where_not_finite({
        "title": case.title,
        "target_conversion": case.design.target_conversion,
        "requirements": {
            "max_pressure_drop_Pa": None if math.isnan(case.design.max_pressure_drop)
            else case.design.max_pressure_drop,
            "temperature_limit_K": None if math.isnan(case.design.temperature_limit)
            else case.design.temperature_limit,
            "wall_temperature_limit_K": None if math.isnan(case.design.wall_temperature_limit)
            else case.design.wall_temperature_limit},
        "length_for_given_count": dict({k: v for k, v in a.items() if k != "candidates"},
                                       given={"tube_count": case.tube.count}),
        "count_for_given_length": dict({k: v for k, v in b.items() if k != "candidates"},
                                       given={"tube_length_m": case.tube.length}),
        "candidates": a["candidates"] + b["candidates"],
    })


def _tubes(n):
    return f"{n} tube" if n == 1 else f"{n} tubes"


def format_sizing(report):
    """Terminal table of a sizing: the two answers, each on its own lines."""
    a, b = report["length_for_given_count"], report["count_for_given_length"]

    def f(value, spec, unit="", scale=1.0):
        return "not computed" if value is None else f"{value / scale:{spec}}{unit}"

    def design_line(d):
        return (f"      design: {_tubes(d['tube_count'])} of {d['tube_length_m']:.4g} m, outlet conversion "
                f"{f(d['outlet_conversion'], '.4f')}, pressure drop {f(d['pressure_drop_Pa'], '.4g', ' bar', 1e5)}, "
                f"hot spot {f(d['hot_spot_K'], '.1f', ' K')}")

    lines = [report["title"], f"  target conversion {report['target_conversion']:.4g}"]
    n = a["given"]["tube_count"]
    if a["feasible"]:
        lines += [f"  (a) length for the given {_tubes(n)}: {a['design']['tube_length_m']:.4g} m "
                  f"(set by {a['binding_constraint']})", design_line(a["design"])]
    else:
        lines.append(f"  (a) length for the given {_tubes(n)}: none ({a['binding_constraint']}) -- {a['note']}")
    length = b["given"]["tube_length_m"]
    if b["feasible"]:
        count = b["design"]["tube_count"]
        why = ("a single tube meets every requirement" if count == 1
               else f"one tube fewer fails {b['binding_constraint']}")
        lines += [f"  (b) tube count for the given length {length:.4g} m: {count} ({why})",
                  design_line(b["design"])]
    else:
        lines.append(f"  (b) tube count for the given length {length:.4g} m: none -- {b['note']}")
    lines += ["  (a) and (b) are separate answers: the length of (a) goes with the given count, the count of "
              "(b) with the given length.",
              f"  candidates evaluated: {len(report['candidates'])}"]
    return "\n".join(lines)
