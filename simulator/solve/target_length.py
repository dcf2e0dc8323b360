"""Length of tube that reaches the target conversion, for every heat-exchange arrangement.

Where the medium's given temperature is at z = 0 (uniform, co-current) the profile of a tube of
any length is a prefix of the profile of a longer one, so the length to the target is the located
crossing of one run (``Result.design``). With a counter-current medium it is not: the medium
enters at z = L, so a shorter tube has a different profile everywhere. The length is then the root
of X_out(L) - X_target over re-solved tubes (each one shooting over every steady state, the
outputs describing the lowest branch): the length is grown by x4 until the outlet reaches the
target, then Brent's method (scipy.optimize.brentq) refines it to ``RELATIVE_LENGTH_TOLERANCE``.

A jump of X_out(L) (the described branch changing at a fold) is reported as such, not smoothed.
"""
import dataclasses
import math

from scipy.optimize import brentq

from simulator.model.heat import arrangement_of
from simulator.solve.integrate import simulate

RELATIVE_LENGTH_TOLERANCE = 1e-5
MAX_LENGTH_FACTOR = 64.0
MAX_SOLVES = 60


def moves_with_length(case):
    """True when a shorter tube is not a prefix of a longer one (the medium's given end is z = L)."""
    return arrangement_of(case.heat).boundary_value


def _with_length(case, length):
    return dataclasses.replace(case, tube=dataclasses.replace(case.tube, length=float(length)))


def _numbers(case, length):
    area = math.pi / 4.0 * case.tube.inner_diameter ** 2
    volume = area * length * case.tube.count
    mass = volume * case.bed.bulk_density if case.bed is not None else None
    return {"reached": True, "length_m": float(length), "volume_m3": float(volume),
            "catalyst_mass_kg": None if mass is None else float(mass)}


def length_by_resolving(case, model_builder=None):
    """Length [m] to ``design.target_conversion`` found by re-solving tubes of different length.

    ``model_builder`` (case -> Model, optional) builds a variant's model for each length (e.g. the
    constant-moles variant of the assumption check).

    Returns
    -------
    dict
        ``target_conversion``, ``reached``, ``length_m``, ``volume_m3``, ``catalyst_mass_kg`` (all
        tubes, over that length), ``solves`` (tubes solved), ``note`` (why not reached, or ""),
        ``result`` (the Result of the tube of the length found; None when not reached).
    """
    X_t = case.design.target_conversion
    out = {"target_conversion": X_t, "reached": False, "length_m": None, "volume_m3": None,
           "catalyst_mass_kg": None, "solves": 0, "note": "", "result": None}
    cache = {}

    def solve(length):
        if length not in cache:
            c = _with_length(case, length)
            cache[length] = simulate(c) if model_builder is None else simulate(c, model=model_builder(c))
        return cache[length]

    def residual(length):
        r = solve(length)
        if r.status == "failed":
            raise _Failed(length, r)
        return r.outlet_conversion - X_t

    L0 = case.tube.length
    lo, hi = 0.0, L0
    try:
        while residual(hi) < 0.0:
            lo, hi = hi, 4.0 * hi
            if hi > MAX_LENGTH_FACTOR * L0:
                out["note"] = (f"the target X = {X_t:.4g} is not reached in tubes up to "
                               f"{MAX_LENGTH_FACTOR * L0:.4g} m (outlet conversion {solve(lo).outlet_conversion:.4g})")
                out["solves"] = len(cache)
                return out
        if lo == 0.0:   # bracket below the case's length: shrink until the outlet misses the target
            lo = hi / 4.0
            while residual(lo) >= 0.0 and lo > L0 * 1e-6:
                hi, lo = lo, lo / 4.0
        if residual(lo) >= 0.0:     # met within a millionth of the case's length: that is the answer
            length = lo
        else:
            length = brentq(residual, lo, hi, xtol=RELATIVE_LENGTH_TOLERANCE * hi, rtol=1e-12, maxiter=MAX_SOLVES)
    except _Failed as failure:
        out["note"] = (f"the tube of {failure.length:.6g} m could not be solved ({failure.result.termination})")
        out["solves"] = len(cache)
        return out
    # the tube that meets the target: the upper end of the final bracket (a root refined from both sides)
    meets = min((L for L in cache if cache[L].status != "failed" and cache[L].outlet_conversion >= X_t),
                key=lambda L: abs(L - length))
    if abs(meets - length) > 10 * RELATIVE_LENGTH_TOLERANCE * hi:
        out["note"] = (f"the outlet conversion jumps near L = {length:.6g} m (the described steady state changes "
                       "branch there): the length given is where it first meets the target")
    out.update(_numbers(case, meets))
    out["solves"] = len(cache)
    out["result"] = cache[meets]
    return out


class _Failed(Exception):
    def __init__(self, length, result):
        super().__init__(result.termination)
        self.length, self.result = length, result
