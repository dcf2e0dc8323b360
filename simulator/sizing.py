"""Size the tube bundle on the full model for a target conversion.

(a) ``length for the given tube count``: integrate the full model far enough
    that the target is crossed; the crossing (a located event) is the length.
(b) ``tube count for the given length``: the total feed is fixed, so the flow
    per tube, mass velocity, pressure drop and heat removal per mole change with
    the count. The smallest count that meets every requirement is found by
    doubling and then bisection on whole numbers.

Requirements honoured: the target conversion, ``design.max_pressure_drop`` (over
the length used), ``design.temperature_limit`` (hot spot below it) and that the tube
passes the feed at all (pressure above 1 % of the feed pressure to its end). The
requirement that decides the answer is named as the binding constraint.
"""
import dataclasses
import math

from simulator.solve.integrate import simulate

MAX_LENGTH_FACTOR = 64.0      # search up to 64x the given length in (a)
MAX_COUNT_FACTOR = 4096       # search up to 4096x the given count in (b)


def _with(case, length=None, count=None):
    tube = dataclasses.replace(case.tube, length=case.tube.length if length is None else length,
                               count=case.tube.count if count is None else int(count))
    # flows are totals for the whole reactor, so the per-tube flow follows from the count
    return dataclasses.replace(case, tube=tube)


def _evaluate(case, kind):
    """Run one candidate and judge it against the requirements.

    For a length found by (a) the tube ends at the target, so pressure drop and hot spot count up
    to there; for a count found by (b) the tube keeps the case's length, so they count over all of it.
    """
    result = simulate(case)
    d = result.design
    hot = result.hot_spot
    whole_tube = kind == "count for the given length"     # the tube keeps its length: judge all of it
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
    checks = {
        "target_conversion": bool(d["reached"]),
        "max_pressure_drop": math.isnan(limits.max_pressure_drop) or dp <= limits.max_pressure_drop,
        "temperature_limit": (math.isnan(limits.temperature_limit) or
                              (T_max < limits.temperature_limit and (stop_T is None or stop_T > end))),
        "tube_carries_feed": stop_P is None or stop_P > end,
    }
    if result.status == "failed":
        checks["solver"] = False
    return {
        "kind": kind, "tube_count": case.tube.count, "tube_length_m": case.tube.length,
        "length_to_target_m": d["length_m"], "volume_m3": d["volume_m3"], "catalyst_mass_kg": d["catalyst_mass_kg"],
        "outlet_conversion": result.outlet_conversion, "pressure_drop_Pa": dp, "hot_spot_K": T_max,
        "status": result.status, "meets": checks, "feasible": all(checks.values()),
    }


PRIORITY = ("temperature_limit", "tube_carries_feed", "max_pressure_drop", "target_conversion", "solver")


def binding(cand):
    """The requirement a candidate fails first, in order of PRIORITY (a run stopped at the temperature
    limit also misses the target; the limit is the cause)."""
    return next((k for k in PRIORITY if not cand["meets"].get(k, True)), None)


def length_for_count(case):
    """(a) Length that reaches the target with the case's tube count; dict with the answer and candidates."""
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
    answer = best["length_to_target_m"] if failing is None else None
    return {"tube_count": case.tube.count, "length_m": answer, "feasible": answer is not None,
            "binding_constraint": failing or "target_conversion", "volume_m3": best["volume_m3"] if answer else None,
            "catalyst_mass_kg": best["catalyst_mass_kg"] if answer else None,
            "pressure_drop_Pa": best["pressure_drop_Pa"] if answer else None,
            "hot_spot_K": best["hot_spot_K"] if answer else None,
            "note": "" if answer else _why_not(best), "candidates": candidates}


def _why_not(cand):
    failing = [k for k, ok in cand["meets"].items() if not ok]
    what = ("no feasible length with this tube count" if cand["kind"].startswith("length")
            else "no feasible tube count for this length")
    return (f"{what}: " + ", ".join(failing) +
            f" (outlet conversion {cand['outlet_conversion']:.4f}, hot spot {cand['hot_spot_K']:.1f} K, "
            f"pressure drop {cand['pressure_drop_Pa']:.4g} Pa)")


def count_for_length(case):
    """(b) Smallest tube count that meets every requirement with the case's tube length."""
    cache = {}

    def ev(n):
        if n not in cache:
            cache[n] = _evaluate(_with(case, count=n), "count for the given length")
        return cache[n]

    n_hi = max(1, case.tube.count)
    while not ev(n_hi)["feasible"] and n_hi < MAX_COUNT_FACTOR * max(1, case.tube.count):
        n_hi *= 2
    if not ev(n_hi)["feasible"]:
        worst = ev(n_hi)
        return {"length_m": case.tube.length, "tube_count": None, "feasible": False,
                "binding_constraint": binding(worst),
                "note": f"no count up to {n_hi} meets the requirements; " + _why_not(worst),
                "candidates": [cache[k] for k in sorted(cache)]}
    n_lo = 0
    # find an infeasible lower bound by halving
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
    chosen = ev(n_hi)
    if n_lo >= 1:
        bound = binding(ev(n_lo))
    else:
        bound = "none (a single tube meets every requirement)"
    return {"length_m": case.tube.length, "tube_count": n_hi, "feasible": True, "binding_constraint": bound,
            "volume_m3": chosen["volume_m3"], "catalyst_mass_kg": chosen["catalyst_mass_kg"],
            "length_to_target_m": chosen["length_to_target_m"], "pressure_drop_Pa": chosen["pressure_drop_Pa"],
            "hot_spot_K": chosen["hot_spot_K"], "note": "",
            "candidates": [cache[k] for k in sorted(cache)]}


def size(case):
    """Both sizings; the ``sizing.json`` content."""
    if math.isnan(case.design.target_conversion):
        from simulator.errors import CaseError

        raise CaseError(f"{case.source_path}: design.target_conversion: missing; sizing needs a target.")
    a = length_for_count(case)
    b = count_for_length(case)
    return {
        "title": case.title,
        "target_conversion": case.design.target_conversion,
        "requirements": {
            "max_pressure_drop_Pa": None if math.isnan(case.design.max_pressure_drop)
            else case.design.max_pressure_drop,
            "temperature_limit_K": None if math.isnan(case.design.temperature_limit)
            else case.design.temperature_limit},
        "length_m": a["length_m"],
        "tube_count": b["tube_count"],
        "binding_constraint": b["binding_constraint"],
        "length_for_given_count": {k: v for k, v in a.items() if k != "candidates"},
        "count_for_given_length": {k: v for k, v in b.items() if k != "candidates"},
        "candidates": a["candidates"] + b["candidates"],
    }


def format_sizing(report):
    """Terminal table of a sizing."""
    a, b = report["length_for_given_count"], report["count_for_given_length"]

    def f(v, spec=".4g"):
        return "n/a" if v is None else format(v, spec)

    lines = [report["title"],
             f"  target conversion {report['target_conversion']:.4g}",
             f"  (a) {a['tube_count']} tubes: length {f(a['length_m'])} m, binding {a['binding_constraint']}"
             + (f" -- {a['note']}" if a["note"] else ""),
             f"  (b) length {f(b['length_m'])} m: {f(b['tube_count'])} tubes, binding {b['binding_constraint']}"
             + (f" -- {b['note']}" if b["note"] else ""),
             f"  candidates evaluated: {len(report['candidates'])}"]
    return "\n".join(lines)
