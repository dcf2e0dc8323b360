"""simulate(case) -> Result: integrate the tube balances and locate the design events.

Integrator: ODEPACK LSODA (``scipy.integrate.odeint``), which switches between
non-stiff and stiff (BDF) methods, with the compiled right-hand side of
:mod:`simulator.model.kernel` and a per-variable absolute tolerance. Events are
located on the solver's own trajectory: a sign change of the event function
between output points is bracketed and then refined by root finding (Brent) on
states re-integrated from the last output point, so an event is exact to the
solver tolerance, not to the output grid:

* ``temperature_limit``: T - T_limit crosses zero upward -> the run stops there;
* ``pressure_floor``: P falls below 1 % of the feed pressure -> the run stops;
* ``target_conversion``: X_key - X_target crosses zero -> recorded (sizing);
* ``hot_spot``: dT/dz crosses zero from + to - -> local maxima; the hot spot is
  the highest of these and of the end points.

A failed integration (solver error, non-finite state) gives a Result with
``status = "failed"`` and where and why in ``termination``; callers treat it
as a failure, never as a design result.
"""
import functools
import math
import time
import warnings
from importlib import metadata

import numpy as np
from scipy.integrate import ODEintWarning, odeint
from scipy.optimize import brentq

from simulator.case.plausibility import plausibility_warnings
from simulator.model import kernel as model_kernel
from simulator.model import kernels
from simulator.model.build import build_model, check_profile_covers
from simulator.model.heat import arrangement_of
from simulator.model.heat.coefficient import hottest_wall, validity_warnings, wall_along
from simulator.solve.boiling import boiling_block
from simulator.results import Result
from simulator.units import R as R_GAS
from simulator.solve.checks import (closure, closure_failure, closure_warnings, compressibility_profile,
                                    phase_failure, range_warnings)

PRESSURE_FLOOR = 0.01   # fraction of the feed pressure below which the run stops


@functools.lru_cache(maxsize=1)
def versions():
    """Versions of tubesim and the numerical libraries, for provenance."""
    out = {}
    for dist, key in (("tubesim", "tubesim"), ("cantera", "cantera"), ("scipy", "scipy"), ("numpy", "numpy"),
                      ("numba", "numba")):
        try:
            out[key] = metadata.version(dist)
        except metadata.PackageNotFoundError:
            out[key] = "not installed"
    return out


#: Work budget of one run, in ODEPACK steps: the main integration may take at most this many
#: steps in all (not per output interval; about 4 s at the worst observed cost of a step); the
#: post-processing (events, hot spot, fast intervals) at most POST_FACTOR times the steps the main
#: integration took, never fewer than POST_FLOOR and never more than POST_CEILING.
RUN_STEP_BUDGET = 50_000
POST_FACTOR, POST_FLOOR, POST_CEILING = 4, 1_000, 10_000
SUCCESS = "Integration successful."
BALANCE_ERROR = "the balances could not be evaluated"
#: what the plain-Python kernel raises on overflow, division by zero or a log/sqrt of a negative number
ARITHMETIC_ERRORS = (ArithmeticError, ValueError)


class ReintegrationFailed(Exception):
    """A re-integration from an output point failed or its budget is spent: its states are not used."""


class _Tube:
    """Integration of one model, with re-integration from output points for events.

    ``post_budget`` is the number of steps the re-integrations may still take (set by
    :func:`simulate` once the main integration is done); a re-integration that fails or would
    exceed it raises :class:`ReintegrationFailed`, so no event is ever found on a failed one.
    """

    def __init__(self, model, rtol, atol, hmax, kernel):
        self.model = model
        self.K = kernel
        self.rtol = rtol
        self.atol = atol
        self.hmax = hmax
        self.nfev = 0
        self.njev = 0
        self.nsteps = 0
        self.calls = 0
        self.post_budget = None
        self.unresolved = 0        # maxima between output points the re-integrations could not resolve

    def run(self, y0, zs, mxstep):
        """One odeint call; an arithmetic error inside the balances (the plain-Python kernel raises
        where the compiled one returns inf/NaN) becomes a failed call with that message."""
        with warnings.catch_warnings():  # the status is checked and reported by simulate()
            warnings.simplefilter("ignore", ODEintWarning)
            try:
                sol, info = odeint(self.K.rhs_odeint, y0, zs, args=self.model.args, rtol=self.rtol,
                                   atol=self.atol, full_output=True, hmax=self.hmax, mxstep=mxstep,
                                   printmessg=False)
            except ARITHMETIC_ERRORS as err:
                self.calls += 1
                sol = np.full((len(zs), len(y0)), np.nan)
                sol[0] = y0
                return sol, {"message": f"{BALANCE_ERROR} ({err})", "tcur": np.array([zs[0]]),
                             "nst": np.zeros(0), "nfe": np.zeros(0), "nje": np.zeros(0)}, 0
        self.calls += 1
        steps = 0
        # after a failure odeint leaves the entries of the outputs it did not reach unset: count only
        # the reached ones (tcur[i] >= zs[i + 1]), and the interval that ran out of steps in full
        reached = _reached(info, zs)
        if reached:
            self.nfev += int(info["nfe"][reached - 1])
            self.njev += int(info["nje"][reached - 1])
            steps = int(info["nst"][reached - 1])
        if info["message"] != SUCCESS and "Excess work done" in info["message"]:
            steps += mxstep
        self.nsteps += steps
        return sol, info, steps

    def spend(self, steps):
        """Take ``steps`` from the post-processing budget; raises when it is spent."""
        if self.post_budget is not None:
            self.post_budget -= steps
            if self.post_budget < 0:
                raise ReintegrationFailed("post-processing step budget spent")

    def remaining(self):
        return RUN_STEP_BUDGET if self.post_budget is None else max(int(self.post_budget), 0)

    def state_at(self, z0, y0, z):
        """State at z re-integrated from (z0, y0); raises ReintegrationFailed when that fails."""
        if z == z0:
            return y0
        if self.remaining() <= 0:
            raise ReintegrationFailed("post-processing step budget spent")
        sol, info, steps = self.run(y0, np.array([z0, z]), mxstep=self.remaining())
        self.spend(steps)
        if info["message"] != SUCCESS or not np.all(np.isfinite(sol[-1])):
            raise ReintegrationFailed(info["message"])
        return sol[-1]

    def derivative(self, z, y):
        return self.K.rhs_odeint(y, z, *self.model.args)


def _guarded(compute, fallback):
    """compute() or, when the state makes its arithmetic fail (overflow, division by zero), fallback."""
    try:
        return compute()
    except ARITHMETIC_ERRORS:
        return fallback


def _reached(info, zs):
    """How many output intervals of an odeint call were completed (all when it succeeded)."""
    if info["message"] == SUCCESS:
        return len(zs) - 1
    tcur = np.asarray(info["tcur"], dtype=float)
    ok = tcur[:len(zs) - 1] >= zs[1:len(tcur) + 1] - 1e-12 * abs(zs[-1])
    return int(np.argmin(ok)) if not ok.all() else len(ok)


#: steps an output interval may take in one call of the continuation (see _integrate_budgeted)
CHUNK_STEPS = 1_000


def _integrate_budgeted(tube, y0, zs):
    """Main integration on the output grid within RUN_STEP_BUDGET steps in all.

    One ODEPACK call over the whole grid with a per-interval step limit of the budget divided
    over the intervals (so that call alone stays within the budget; a normal run never comes
    near it). If an interval needs more, the run continues from the last output point reached
    in calls over chunks of c intervals, each interval allowed (what is left of the budget) / c
    steps, with c = (what is left) / CHUNK_STEPS, so no call can overrun the budget and c
    shrinks to 1 (the whole rest for one interval) as the budget is used up. Returns (ys, info)
    with the ``message``, ``tcur`` and cumulative ``nst`` of odeint's ``full_output``.
    """
    n_int = len(zs) - 1
    per_interval = max(RUN_STEP_BUDGET // n_int, 1)
    ys, info, used = tube.run(y0, zs, mxstep=per_interval)
    if info["message"] == SUCCESS:
        return ys, info
    single = info["message"].startswith(BALANCE_ERROR)   # where it happened: one interval per call
    if not single and "Excess work done" not in info["message"]:
        return ys, info
    k = 0 if single else _reached(info, zs)
    nst = list(np.asarray(info["nst"], dtype=float)[:k])
    tcur = list(np.asarray(info["tcur"], dtype=float)[:k])
    message = SUCCESS
    while k < n_int:
        left = RUN_STEP_BUDGET - used
        if left <= 0:
            message = "Excess work done on this call (run step budget)."
            tcur.append(zs[k])
            break
        c = 1 if single else max(1, min(n_int - k, left // CHUNK_STEPS))
        sol, part, steps = tube.run(ys[k], zs[k:k + c + 1], mxstep=max(left // c, 1))
        r = _reached(part, zs[k:k + c + 1]) if not part["message"].startswith(BALANCE_ERROR) else 0
        ys[k + 1:k + 1 + r] = sol[1:1 + r]
        nst += [used + float(v) for v in np.asarray(part["nst"], dtype=float)[:r]]
        tcur += list(zs[k + 1:k + 1 + r])
        used += steps
        k += r
        if part["message"] == SUCCESS:
            continue
        if c > 1:                     # retry from the point reached, with what is left (smaller c)
            # a failure that is not the step limit (e.g. repeated error-test failures) spends no
            # counted steps: retry one interval at a time, so the next failure ends the run
            single = single or "Excess work done" not in part["message"]
            continue
        message = part["message"]
        tcur.append(float(np.max(part["tcur"])) if len(part["tcur"]) else zs[k])
        break
    if message != SUCCESS:
        ys[k + 1:] = np.nan
    return ys, {"message": message, "tcur": np.array(tcur), "nst": np.array(nst + [used] * (n_int - len(nst)))}


def _post_budget(main_steps):
    """Steps the post-processing of a run may take, [-]."""
    return min(max(POST_FACTOR * main_steps, POST_FLOOR), POST_CEILING)


def _budget_refusal(case, length):
    """Why the run cannot fit its step budget before it starts (solver.max_step too small), or None."""
    max_step = case.solver.max_step
    if max_step > 0 and length / max_step > RUN_STEP_BUDGET:
        return (f"solver.max_step = {max_step:g} m needs at least {length / max_step:.3g} steps for a "
                f"{length:g} m tube, more than the run's budget of {RUN_STEP_BUDGET} steps; raise or remove it")
    return None


def _explain_failure(message, case, length):
    """A solver failure in plain words with the likely cause and what to change (one sentence each)."""
    text = " ".join(message.split()).rstrip(".")
    max_step = case.solver.max_step
    if text.startswith(BALANCE_ERROR):
        return (f"{text}: overflow, division by zero or a logarithm of a negative number in the rates or "
                "properties; check the kinetics, their units and the feed")
    if not message:
        return ("the state became non-finite (overflow or a negative concentration raised to a negative or "
                "fractional order); check the kinetics, its units and the feed")
    if "Excess work done" in text:
        if max_step > 0 and length / max_step > 0.5 * RUN_STEP_BUDGET:
            return (f"the run's budget of {RUN_STEP_BUDGET} solver steps is spent because solver.max_step = "
                    f"{max_step:g} m is far too small for a {length:g} m tube; raise or remove it")
        return (f"the run's budget of {RUN_STEP_BUDGET} solver steps is spent: the solution changes extremely "
                "fast here (a runaway, or rate constants far too large); check the kinetics and their units, "
                "or set design.temperature_limit to stop a runaway")
    if "Excess accuracy requested" in text:
        return "the tolerances are tighter than double precision allows; loosen [solver] rtol / atol_scale"
    if "Illegal input" in text:
        return ("the solver was given an invalid state (for example a negative flow raised to a fractional or "
                "negative order); check the orders and the feed")
    if "error test" in text.lower() or "convergence" in text.lower():
        return ("the solution changes too sharply to follow (a runaway or a discontinuity in the kinetics); "
                "check the kinetics, or set design.temperature_limit to stop a runaway")
    return f"{text} (ODEPACK LSODA)"


def _first_crossing(values):
    """Index k of the first upward sign change between k and k+1, or None."""
    v = np.asarray(values)
    idx = np.nonzero((v[:-1] <= 0) & (v[1:] > 0))[0]
    return int(idx[0]) if len(idx) else None


def _refine(tube, zs, ys, k, g):
    """Root of g(z, y(z)) in [zs[k], zs[k+1]] on re-integrated states; returns (z, y)."""
    z0, y0 = zs[k], ys[k]
    span = zs[k + 1] - z0

    def f(z):
        return g(z, tube.state_at(z0, y0, z))

    try:
        root = brentq(f, z0, zs[k + 1], xtol=max(1e-12, 1e-10 * span), rtol=1e-12, maxiter=100)
        return root, tube.state_at(z0, y0, root)
    except (ValueError, ReintegrationFailed):
        # no sign change on the refined trajectory (grazing), or a re-integration failed or ran out of
        # budget: keep the output point after the crossing, a state of the main integration
        return zs[k + 1], ys[k + 1]


STEP_ALARM = 40     # solver steps between two output points above which the interval is resolved
MAX_RESOLVED = 25   # intervals resolved at most per run


def _hermite_hidden_maximum(zs, T, dTdz, noise=0.0):
    """Intervals whose cubic Hermite interpolant has an interior maximum although dT/dz has the same
    sign at both ends (a peak and a dip inside one output interval), rising more than ``noise`` [K]
    above both ends.

    On an equilibrium plateau dT/dz from the right-hand side is the small difference of large
    forward and reverse terms and does not match the trajectory; the interpolant then shows
    "peaks" of the size of the solver's own error. Those are not resolved (a hot spot missed by
    less than the tolerance changes nothing)."""
    h = np.diff(zs)
    T0, T1, d0, d1 = T[:-1], T[1:], dTdz[:-1], dTdz[1:]
    a = 6 * (T0 - T1) + 3 * h * (d0 + d1)
    b = -6 * (T0 - T1) - 2 * h * (2 * d0 + d1)
    c = h * d0
    disc = b * b - 4 * a * c
    same_sign = (d0 > 0) == (d1 > 0)
    with np.errstate(divide="ignore", invalid="ignore"):
        r1 = (-b - np.sqrt(np.maximum(disc, 0))) / (2 * a)
        r2 = (-b + np.sqrt(np.maximum(disc, 0))) / (2 * a)
    inside = (r1 > 0) & (r1 < 1) & (r2 > 0) & (r2 < 1)
    k = np.nonzero(same_sign & (disc > 0) & (a != 0) & inside)[0]
    if not len(k):
        return k

    def value(t):   # the cubic Hermite interpolant at t in [0, 1] on the candidate intervals
        return ((2 * t ** 3 - 3 * t ** 2 + 1) * T0[k] + (t ** 3 - 2 * t ** 2 + t) * h[k] * d0[k]
                + (-2 * t ** 3 + 3 * t ** 2) * T1[k] + (t ** 3 - t ** 2) * h[k] * d1[k])

    rise = np.maximum(value(r1[k]), value(r2[k])) - np.maximum(T0[k], T1[k])
    return k[rise > np.broadcast_to(noise, T0.shape)[k]]


def _resolve_fast_intervals(tube, zs, ys, dTdz, info, n):
    """Insert the solver's internal steps in intervals with fast dynamics; returns (zs, ys, refined).

    An interval is resolved when ODEPACK needed more than STEP_ALARM steps across it (its step
    count is in ``info["nst"]``), or when the Hermite interpolant of T hides a maximum there. The
    interval is integrated again by scipy's LSODA (same tolerances) and its internal step points,
    which follow the dynamics, are added to the profile, so events and the hot spot are found
    on them as on any output point. The steps come out of the post-processing budget.
    """
    from scipy.integrate import LSODA

    nst = np.asarray(info["nst"], dtype=float)[:len(zs) - 1]
    steps = np.diff(np.concatenate([[0.0], nst]))
    noise = 10.0 * (tube.rtol * np.abs(ys[:-1, n]) + tube.atol[n])
    flagged = set(np.nonzero(steps > STEP_ALARM)[0].tolist()) | set(
        _hermite_hidden_maximum(zs, ys[:, n], dTdz, noise).tolist())
    if not flagged:
        return zs, ys, False
    K, args = tube.K, tube.model.args
    new_z, new_y = [zs], [ys]
    for k in sorted(flagged)[:MAX_RESOLVED]:
        if tube.remaining() <= 0:
            break
        solver = LSODA(lambda z, y: K.rhs_odeint(y, z, *args), zs[k], ys[k], zs[k + 1], rtol=tube.rtol,
                       atol=tube.atol)
        points, states, budget = [], [], tube.remaining()
        try:
            with warnings.catch_warnings():     # a failed step sets the solver's status, checked below
                warnings.simplefilter("ignore", UserWarning)
                while solver.status == "running" and len(points) < budget:
                    solver.step()
                    points.append(solver.t)
                    states.append(solver.y.copy())
        except ARITHMETIC_ERRORS:       # the balances failed inside this interval: keep what was reached
            solver.status = "failed"
        tube.post_budget -= len(points)
        z_in = np.array(points)
        inner = (z_in > zs[k]) & (z_in < zs[k + 1])
        # a finished interval's step points are the solver's own trajectory, and so are those of one
        # whose budget ran out (kept if finite); a failed one's are not used
        if inner.any() and solver.status != "failed":
            y_in = np.array(states)[inner]
            good = np.all(np.isfinite(y_in), axis=1)
            new_z.append(z_in[inner][good])
            new_y.append(y_in[good])
    z_all = np.concatenate(new_z)
    order = np.argsort(z_all, kind="stable")
    return z_all[order], np.ascontiguousarray(np.vstack(new_y)[order]), len(new_z) > 1


def _limit_crossing(tube, zs, ys, dTdz, n, T_lim):
    """First upward crossing of T_lim on the trajectory, also between output points; (z, y) or None.

    A crossing shows either as an output point above the limit, or as a local
    maximum between two output points (dT/dz changes sign there) whose exact
    temperature exceeds the limit although both output points are below it.
    """
    k_grid = _first_crossing(ys[:, n] - T_lim)
    last = len(zs) - 1 if k_grid is None else k_grid
    for k in np.nonzero((dTdz[:last] > 0) & (dTdz[1:last + 1] <= 0))[0]:
        k = int(k)
        if max(ys[k, n], ys[k + 1, n]) >= T_lim:
            continue
        try:   # an event is reported only from successful re-integrations
            z_m, y_m = _locate_maximum(tube, zs, ys, k, dTdz, n)
            if y_m[n] > T_lim:
                z0, y0 = zs[k], ys[k]
                root = brentq(lambda z: tube.state_at(z0, y0, z)[n] - T_lim, z0, z_m,
                              xtol=max(1e-12, 1e-10 * (z_m - z0)), rtol=1e-12, maxiter=100)
                return root, tube.state_at(z0, y0, root)
        except ReintegrationFailed:
            tube.unresolved += 1
    if k_grid is None:
        return None
    return _refine(tube, zs, ys, k_grid, lambda z, y: y[n] - T_lim)


def simulate(case, model=None, length=None):
    """Solve the mole, energy and pressure balances along the tube (see :func:`_simulate`).

    numpy's floating-point warnings are silenced inside: every non-finite number a run meets is
    checked explicitly and turned into a failed run or a refused case with where and why.
    A counter-current medium (a two-point boundary-value problem) is solved by shooting around
    the initial-value run (:mod:`simulator.solve.counter_current`): every steady state is in
    ``extra["steady_states"]`` and the result describes the one a start-up from a cold medium reaches.
    """
    if case.train:
        from simulator.errors import CaseError

        raise CaseError(f"{case.source_path}: train: a reactor train ([[train]]) is not one tube; it runs through "
                        "simulator.solve.train.simulate_train (tubesim run).")
    if case.radial.two_dimensional and case.heat.exchange and case.bed is not None:
        # [model] radial = "2d" (an isothermal or adiabatic variant of it has no radial gradient: 1-D)
        from simulator.solve.radial_run import simulate_radial

        return simulate_radial(case, model, length)
    with np.errstate(all="ignore"):
        if case.mechanism is not None:   # a Cantera mechanism as the chemistry: simulator.mechanism
            from simulator.mechanism.run import simulate_mechanism

            return simulate_mechanism(case, length)
        if case.heat.exchange and arrangement_of(case.heat).boundary_value:
            from simulator.solve.counter_current import simulate_counter_current

            return simulate_counter_current(case, _simulate, model, length)
        return _simulate(case, model, length)


def _simulate(case, model=None, length=None):
    """Solve the mole, energy and pressure balances along the tube.

    Parameters
    ----------
    case : simulator.case.schema.Case
        Validated case.
    model : simulator.model.build.Model, optional
        Pre-built model (reused by sweeps and sizing).
    length : float, optional
        Integrate to this length instead of the case's tube length, [m]

    Returns
    -------
    Result
        ``status`` is "completed" (end of tube), "stopped" (temperature limit or
        pressure floor) or "failed" (solver failure; ``termination`` says where and why).
    """
    started = time.perf_counter()
    model = model or build_model(case)
    n = model.n
    L = case.tube.length if length is None else length
    check_profile_covers(case, L)
    opts = case.solver
    zs = np.linspace(0.0, L, opts.output_points)
    atol = model.scale * opts.atol_scale
    tube = _Tube(model, opts.rtol, atol, opts.max_step, kernels.for_run())
    notes = []
    status, termination = "completed", f"end of tube reached at z = {L:.6g} m"
    events = {}
    refusal = _budget_refusal(case, L)
    failure_where = why = None
    if refusal is None:
        ys, info = _integrate_budgeted(tube, model.y0, zs)
        ok = info["message"] == SUCCESS
        finite = np.all(np.isfinite(ys), axis=1)
    else:
        zs, ys, info, ok, finite = zs[:1], model.y0[None, :].copy(), {"nst": np.zeros(0)}, True, np.ones(1, bool)
        status, termination = "failed", f"solver failed after z = 0 m of {L:.6g} m (not integrated): {refusal}"
    main_steps, main_time = tube.nsteps, time.perf_counter() - started
    tube.post_budget = _post_budget(main_steps)
    last_good = len(zs) - 1
    if not ok or not finite.all():
        # output k (k >= 1) is valid when the solver reached zs[k] (tcur[k-1] >= zs[k]); after a failure
        # odeint leaves the remaining rows and tcur entries unset, so everything from the first
        # unreached output on is discarded
        tcur = np.asarray(info["tcur"], dtype=float)
        reached = np.concatenate([[True], tcur[:len(zs) - 1] >= zs[1:len(tcur) + 1] - 1e-12 * L]) \
            if ok or len(tcur) else np.zeros(len(zs), dtype=bool)
        reached = np.concatenate([reached, np.zeros(len(zs) - len(reached), dtype=bool)])
        if not ok:
            reached[1:] &= np.cumprod(reached[1:]).astype(bool)
        bad = np.nonzero(~finite | ~reached)[0]
        last_good = int(bad[0]) - 1 if len(bad) else len(zs) - 1
        last_good = max(last_good, 0)
        y = ys[last_good]
        status = "failed"
        why = _explain_failure(info["message"] if not ok else "", case, L)
        # tcur[k] is where the solver got while computing output k+1; entries after it are unset
        furthest = zs[last_good]
        if last_good < len(tcur) and zs[last_good] <= tcur[last_good] <= zs[min(last_good + 1, len(zs) - 1)]:
            furthest = float(tcur[last_good])
        beyond = f"; the solver itself got to z = {furthest:.6g} m" if furthest > zs[last_good] else ""
        failure_where = (f"solver failed after z = {zs[last_good]:.6g} m of {L:.6g} m (last output point: "
                         f"T = {y[n]:.6g} K, P = {y[n + 1]:.6g} Pa{beyond})")
        termination = f"{failure_where}: {why}"
        zs, ys = zs[:last_good + 1], ys[:last_good + 1]

    if status != "failed":
        zs, ys, status, termination = _negative_flow_check(model, zs, ys, atol, status, termination)
    # fast dynamics between output points (a hot spot narrower than the output spacing): add the
    # solver's own steps there before looking for events
    dTdz = _slopes(tube, zs, ys, n)
    zs, ys, refined = _resolve_fast_intervals(tube, zs, ys, dTdz, info, n)
    if refined:
        dTdz = _slopes(tube, zs, ys, n)
    if not np.all(np.isfinite(dTdz)):   # a state the balances cannot be evaluated at: never a result
        bad = int(np.nonzero(~np.isfinite(dTdz))[0][0])
        zs, ys, dTdz = zs[:max(bad, 1)], ys[:max(bad, 1)], dTdz[:max(bad, 1)]
        if status != "failed":
            status = "failed"
            termination = (f"the balances are not finite at z = {zs[-1] if bad == 0 else zs[bad - 1]:.6g} m "
                           "(overflow or division by zero in the rates or properties): check the kinetics, "
                           "their units and the feed")
        dTdz = np.where(np.isfinite(dTdz), dTdz, 0.0)
    T_lim = case.design.temperature_limit
    stops = []
    if not math.isnan(T_lim):
        if ys[0, n] >= T_lim:
            stops.append((0.0, ys[0], "temperature_limit"))
        else:
            crossing = _limit_crossing(tube, zs, ys, dTdz, n, T_lim)
            if crossing is not None:
                stops.append((*crossing, "temperature_limit"))
    W_lim = case.design.wall_temperature_limit
    if not math.isnan(W_lim) and case.heat.exchange:
        crossing = _wall_limit_crossing(tube, model, zs, ys, W_lim)
        if crossing is not None:
            stops.append((*crossing, "wall_temperature_limit"))
    p_floor = PRESSURE_FLOOR * case.feed.pressure
    k = _first_crossing(p_floor - ys[:, n + 1])
    if k is not None:
        z_e, y_e = _refine(tube, zs, ys, k, lambda z, y: p_floor - y[n + 1])
        stops.append((z_e, y_e, "pressure_floor"))
    if stops:
        z_e, y_e, name = min(stops, key=lambda s: s[0])
        keep = zs < z_e
        zs = np.append(zs[keep], z_e)
        ys = np.vstack([ys[keep], y_e])
        dTdz = np.append(dTdz[keep], tube.derivative(z_e, y_e)[n])
        if status != "failed":
            status = "stopped"
            if name == "temperature_limit":
                termination = (f"temperature limit {T_lim:.6g} K exceeded at z = {z_e:.6g} m "
                               f"(design.temperature_limit); the run was stopped there")
            elif name == "wall_temperature_limit":
                wall_T = _hottest_wall_at(model, tube, z_e, y_e)
                termination = (f"tube-wall temperature limit {W_lim:.6g} K exceeded at z = {z_e:.6g} m "
                               f"(design.wall_temperature_limit; {wall_T[1]}); the run was stopped there")
            else:
                termination = (f"pressure fell below {100 * PRESSURE_FLOOR:g} % of the feed pressure at "
                               f"z = {z_e:.6g} m: this tube cannot pass the feed at this pressure drop")
        events[name] = {"position_m": float(z_e), "temperature_K": float(y_e[n]), "pressure_Pa": float(y_e[n + 1])}
        if name == "wall_temperature_limit":
            events[name]["wall_temperature_K"] = float(_hottest_wall_at(model, tube, z_e, y_e)[0])

    # target conversion (recorded, the run continues)
    key = model.key_index
    F0k = model.y0[key]
    if not F0k > 0 and status != "failed":
        status = "failed"
        termination = (f"design.key_species = {case.design.key_species!r} is not in the feed (or so dilute that "
                       "its flow per tube underflows to zero): its conversion is not defined; choose a main "
                       "reactant of the feed")
    X = (F0k - ys[:, key]) / F0k
    design = {"target_conversion": None, "reached": False, "length_m": None, "volume_m3": None,
              "catalyst_mass_kg": None}
    X_t = case.design.target_conversion
    if not math.isnan(X_t):
        design["target_conversion"] = X_t
        k = _first_crossing(X - X_t)
        if k is not None:
            z_t, _ = _refine(tube, zs, ys, k, lambda z, y: (F0k - y[key]) / F0k - X_t)
            design.update(_design_numbers(case, model, z_t))
            events["target_conversion"] = {"position_m": float(z_t)}
        elif X[0] >= X_t:
            design.update(_design_numbers(case, model, 0.0))

    hot = _hot_spot(tube, zs, ys, dTdz, n, case, stopped_by_limit="temperature_limit" in events)
    along = arrangement_of(case.heat).medium_along
    Tc = along(case.heat, zs) if along else ys[:, n + 2]   # a given wall profile exactly as given
    Z = _guarded(lambda: compressibility_profile(model, ys, tube.K), np.full(len(zs), np.nan))
    count = model.count
    clos = _guarded(lambda: closure(model, ys, tube.K), {"elements_relative": math.nan, "energy_relative": math.nan})
    phase = _guarded(lambda: phase_failure(model, zs, ys, tube.K), None)
    if phase and status == "failed":       # the likely cause of a solver failure, first, in plain words
        termination = (f"{failure_where}: {phase}; the solver then stopped: {why}" if failure_where
                       else f"{termination}; {phase}")
    elif status != "failed":
        defect = phase or closure_failure(clos)
        if defect:
            status, termination = "failed", f"run failed: {defect}"
    wall = _guarded(lambda: wall_along(model, zs, ys, tube.K), None) if case.heat.exchange else None
    if wall is not None and case.heat.coefficient is not None:
        notes += _guarded(lambda: validity_warnings(model, zs, ys), [])
    pellet = None
    if getattr(case, "catalyst", None) is not None and status != "failed":
        pellet = _guarded(lambda: tube.K.effectiveness_profile(zs, np.ascontiguousarray(ys), *model.args), None)
    boiling, boiling_notes = _guarded(lambda: boiling_block(case, model.species.names, zs, ys[:, n], ys[:, n + 1],
                                                            ys[:, :n]), (None, []))
    notes += boiling_notes
    notes += closure_warnings(clos)
    notes += range_warnings(model, ys)
    notes += model_warnings(model, ys, zs, hot)
    notes += plausibility_warnings(case)
    rise, rise_info = model.adiabatic
    elapsed = time.perf_counter() - started
    stats = {"method": "LSODA (scipy.integrate.odeint)",
             "kernel": "compiled (numba)" if tube.K is kernels.compiled else "plain Python (compiled cache cold)", "rtol": opts.rtol, "atol_scale": opts.atol_scale,
             "output_points": int(len(zs)), "rhs_evaluations": tube.nfev, "jacobian_evaluations": tube.njev,
             "steps": tube.nsteps, "integrator_calls": tube.calls, "wall_time_s": round(elapsed, 4),
             "steps_main_integration": main_steps, "step_budget": RUN_STEP_BUDGET, "post_processing_step_budget": _post_budget(main_steps)}
    return Result(
        case=case, species=model.species.names, z=zs, F=np.maximum(ys[:, :n], 0.0) * count, T=ys[:, n], P=ys[:, n + 1], Tc=Tc,
        Q=ys[:, n + 3] * count, Z=Z, status=status, termination=termination, hot_spot=hot, design=design,
        closure=clos, warnings=tuple(notes), solver_stats=stats, versions=versions(),
        references=tuple(references_used(case, model, np.any(np.isfinite(Z)))), events=events, adiabatic_temperature_rise=rise,
        extra={"adiabatic": rise_info, "viscosity": model.viscosity_note,
               "timing": {"main_integration_s": main_time, "total_s": elapsed},
               "critical_sources": dict(zip(model.species.names, model.critical_sources)), "wall": wall,
               "nasa": model.args[2], **_extra_blocks(case, zs, hot, boiling, pellet)},
    )


def _extra_blocks(case, zs, hot, boiling, pellet):
    """``summary_blocks`` and ``profile_columns`` of the boiling check and the pellets (where they apply)."""
    blocks, columns = {}, []
    if boiling:
        blocks["boiling"] = boiling
    if pellet is not None:
        from simulator.model.pellet_block import pellet_summary

        blocks["pellet"] = pellet_summary(case, zs, hot.get("position_m", math.nan), pellet)
        columns = [(f"effectiveness_R{j + 1}", pellet[:, j, 0]) for j in range(pellet.shape[1])]
    out = {"summary_blocks": blocks} if blocks else {}
    if columns:
        out["profile_columns"] = columns
    return out


def _hottest_wall_at(model, tube, z, y):
    """(hottest tube-wall temperature [K], how it was found) at one state (see :func:`wall_along`)."""
    w = wall_along(model, np.array([z]), y[None, :], tube.K)
    T, _, resolved = hottest_wall(w, np.array([z]))
    return T, ("computed wall temperature" if resolved else "bound: the hotter of gas and far side, typed U")


def _wall_limit_crossing(tube, model, zs, ys, limit):
    """(z, y) where the hottest tube wall first exceeds ``limit``, refined; None if it never does."""
    def excess(z, y):
        return _hottest_wall_at(model, tube, z, y)[0] - limit

    w = _guarded(lambda: wall_along(model, zs, ys, tube.K), None)
    if w is None:
        return None
    T = np.fmax(w["wall_temperature_inner_K"], w["wall_temperature_outer_K"])
    T = np.where(np.isfinite(T), T, w["bound"])
    if T[0] >= limit:
        return 0.0, ys[0]
    k = _first_crossing(T - limit)
    return None if k is None else _refine(tube, zs, ys, k, excess)


def _slopes(tube, zs, ys, n):
    """dT/dz at every profile point from the right-hand side; NaN where it cannot be evaluated."""
    try:
        return tube.K.derivative_profile(zs, ys, *tube.model.args)[:, n]
    except ARITHMETIC_ERRORS:
        out = np.full(len(zs), np.nan)
        for k in range(len(zs)):
            try:
                out[k] = tube.derivative(zs[k], ys[k])[n]
            except ARITHMETIC_ERRORS:
                break
        return out


def _negative_flow_check(model, zs, ys, atol, status, termination):
    """Fail the run where T is not positive, or a molar flow is more negative than the tolerance allows.

    Tolerance: ten times the flow's absolute tolerance and never below 1e-9 of the feed flow
    per tube. A flow below it is a wrong answer (a rate that kept consuming what is gone, or
    an integration error), so the profile ends before it and the run is failed.
    """
    n = model.n
    # only the part before the pressure floor counts: the run stops there (a pressure_floor event)
    floor = np.nonzero(ys[:, n + 1] < PRESSURE_FLOOR * model.y0[n + 1])[0]
    upto = int(floor[0]) + 1 if len(floor) else len(zs)
    cold = np.nonzero(~(ys[:upto, n] > 0.0))[0]
    if len(cold):
        k = int(cold[0])
        return zs[:max(k, 1)], ys[:max(k, 1)], "failed", (
            f"temperature not positive at z = {zs[k]:.6g} m (T = {ys[k, n]:.6g} K): the state left every "
            "range the model describes")
    tol = np.maximum(10.0 * atol[:n], 1e-9 * model.y0[:n].sum())
    if ys[:upto, :n].min() >= -tol.min():          # the usual case, without a per-point test
        return zs, ys, status, termination
    below = np.any(ys[:upto, :n] < -tol, axis=1)
    if not below.any():
        return zs, ys, status, termination
    k = int(np.argmax(below))
    worst = int(np.argmin(ys[k, :n] + tol))
    name = model.species.names[worst]
    reason = (f"molar flow of {name} negative ({ys[k, worst]:.3g} mol/s per tube, tolerance {tol[worst]:.2g}) at "
              f"z = {zs[k]:.6g} m: the rates consumed more than was there; check the orders and rate "
              "constants, or tighten [solver] rtol / atol_scale")
    keep = max(k, 1)
    return zs[:keep], ys[:keep], "failed", reason


def _design_numbers(case, model, z):
    volume = model.area * z * model.count
    mass = volume * case.bed.bulk_density if case.bed is not None else None
    return {"reached": True, "length_m": float(z), "volume_m3": float(volume),
            "catalyst_mass_kg": None if mass is None else float(mass)}


def _hot_spot(tube, zs, ys, dTdz, n, case, stopped_by_limit):
    """Highest temperature: interior maxima located where dT/dz changes sign + to -.

    The event dT/dz = 0 is located on the dense output of the trajectory: a cubic
    Hermite interpolant through T and the exact dT/dz (from the right-hand side) at
    the two output points around the sign change, as ``solve_ivp`` locates events
    on its own dense output. The state at that position is then integrated exactly
    from the last output point, so T* is the solver's value there (an error dz in
    the position changes T* only by T'' dz^2 / 2).
    """
    T0 = case.feed.temperature
    if stopped_by_limit:
        return {"temperature_K": float(ys[-1, n]), "position_m": float(zs[-1]),
                "rise_above_feed_K": float(ys[-1, n] - T0),
                "rise_above_medium_K": _rise_above_medium(case, ys[-1]),
                "located_by": "temperature limit: the run stopped there; the true maximum is higher"}
    candidates = [(float(ys[0, n]), float(zs[0]), ys[0], "inlet"),
                  (float(ys[-1, n]), float(zs[-1]), ys[-1], "outlet (temperature still rising)"
                   if dTdz[-1] > 0 else "outlet")]
    idx = np.nonzero((dTdz[:-1] > 0) & (dTdz[1:] <= 0))[0]
    for k in sorted(idx, key=lambda k: -max(ys[k, n], ys[k + 1, n]))[:5]:
        try:
            z_m, y_m = _locate_maximum(tube, zs, ys, int(k), dTdz, n)
            candidates.append((float(y_m[n]), float(z_m), y_m, "event dT/dz = 0"))
        except ReintegrationFailed:   # keep the highest state of the solver's own trajectory there
            tube.unresolved += 1
            j = int(k) if ys[k, n] >= ys[k + 1, n] else int(k) + 1
            candidates.append((float(ys[j, n]), float(zs[j]), ys[j], "highest point of the solver's trajectory"))
    T_max, z_max, y_max, how = max(candidates, key=lambda c: c[0])
    rise_medium = _rise_above_medium(case, y_max)
    if case.heat.mode == "isothermal":
        how = NO_HOT_SPOT_ISOTHERMAL
    elif rise_medium is not None and rise_medium < 0:
        how = f"{how}; {HEATED_NOT_HOT_SPOT}"
    return {"temperature_K": T_max, "position_m": z_max, "rise_above_feed_K": T_max - T0,
            "rise_above_medium_K": rise_medium, "located_by": how}


#: ``located_by`` texts where the highest temperature is not a reaction hot spot
NO_HOT_SPOT_ISOTHERMAL = "no hot spot: isothermal tube (the temperature is held at the feed value)"
HEATED_NOT_HOT_SPOT = ("the gas stays below the medium temperature there (a heated tube): the highest gas "
                       "temperature, not a reaction hot spot")
#: a hot spot closer to the inlet than this many particle diameters is flagged (common practice, no source)
HOT_SPOT_INLET_PARTICLES = 5


def _locate_maximum(tube, zs, ys, k, dTdz, n, tolerance=1e-6):
    """Root of dT/dz in [zs[k], zs[k+1]] (d > 0 at k, <= 0 at k+1); returns (z, exact state).

    First guess from the cubic Hermite interpolant; the slope d of the exact state there
    tells how good the guess is: near a maximum the temperature missed is about
    d^2 / (2 |T''|), with T'' from the two output slopes. Below ``tolerance`` K the guess
    stands; otherwise (a peak much sharper than the output spacing) Brent's method on
    re-integrated states finishes the job inside the bracket the guess leaves.
    """
    z0, z1 = zs[k], zs[k + 1]
    z_m = _hermite_stationary_point(z0, z1, ys[k, n], ys[k + 1, n], dTdz[k], dTdz[k + 1])
    y_m = tube.state_at(z0, ys[k], z_m)
    d_m = tube.derivative(z_m, y_m)[n]
    curvature = max(abs(dTdz[k + 1] - dTdz[k]) / (z1 - z0), 1e-300)
    if d_m * d_m / (2.0 * curvature) <= tolerance:
        return z_m, y_m
    lo, hi = (z_m, z1) if d_m > 0 else (z0, z_m)
    if hi <= lo:
        return z_m, y_m

    def slope(z):
        return tube.derivative(z, tube.state_at(z0, ys[k], z))[n]

    if slope(lo) * slope(hi) > 0:
        lo, hi = z0, z1
        if slope(lo) * slope(hi) > 0:   # the re-integrated trajectory shows no sign change (loose tolerances)
            return z_m, y_m
    root = brentq(slope, lo, hi, xtol=max(1e-12, 1e-10 * (z1 - z0)), rtol=1e-12, maxiter=100)
    return root, tube.state_at(z0, ys[k], root)


def _hermite_stationary_point(z0, z1, T0, T1, d0, d1):
    """Position in [z0, z1] where the cubic Hermite interpolant of T has zero slope (d0 > 0 >= d1)."""
    h = z1 - z0
    # p'(t)/1 on t in [0, 1]: a t^2 + b t + c with the Hermite basis derivatives
    a = 6 * (T0 - T1) + 3 * h * (d0 + d1)
    b = -6 * (T0 - T1) - 2 * h * (2 * d0 + d1)
    c = h * d0
    if abs(a) < 1e-14 * (abs(b) + abs(c)):
        t = -c / b
    else:
        disc = max(b * b - 4 * a * c, 0.0)
        roots = [(-b - math.sqrt(disc)) / (2 * a), (-b + math.sqrt(disc)) / (2 * a)]
        inside = [r for r in roots if -1e-12 <= r <= 1 + 1e-12]
        t = min(inside) if inside else d0 / (d0 - d1)
    return z0 + h * min(max(t, 0.0), 1.0)


def _rise_above_medium(case, y):
    if not case.heat.exchange or case.heat.profile_quantity == "heat_flux":   # a given flux: no medium
        return None
    n = len(case.species)
    return float(y[n] - y[n + 2])


def _hot_spot_near_inlet(case, hot):
    """Warning when a packed bed's hot spot lies within a few particle diameters of the inlet."""
    if case.bed is None or hot.get("located_by") != "event dT/dz = 0":
        return []
    d_p = case.bed.particle_diameter
    if hot["position_m"] >= HOT_SPOT_INLET_PARTICLES * d_p:
        return []
    return [f"the hot spot lies {hot['position_m'] / d_p:.2g} particle diameters from the inlet (z = "
            f"{hot['position_m']:.3g} m): a one-dimensional pseudo-homogeneous model does not resolve the "
            f"bed there (fewer than {HOT_SPOT_INLET_PARTICLES} particle diameters; common practice, no source); "
            "its hot-spot temperature is indicative only"]


#: share of the pressure drop above which the neglected acceleration term is flagged, [-]
ACCELERATION_SHARE = 0.03


def acceleration_pressure_drop(model, ys):
    """Pressure drop the neglected acceleration term would add, G^2 (1/rho_out - 1/rho_in), [Pa].

    The momentum balance integrated is dP/dz = -(friction); the full one has
    -d(G^2/rho)/dz besides, with G the (constant) mass velocity. Its integral over the tube is
    G^2 (1/rho_out - 1/rho_in), positive when the gas expands (heating, mole increase, pressure loss).
    """
    n = model.n
    G = model.args[1][model_kernel.F_G]
    crit = model.args[9]

    def specific_volume(y):
        F = np.clip(y[:n], 0.0, None)
        Z = 1.0
        if model.case.thermo.equation_of_state == "peng-robinson":
            Z = model_kernel.pr_departure(y[n], y[n + 1], F / F.sum(), crit)[0]
        return Z * R_GAS * y[n] * F.sum() / (y[n + 1] * float(F @ model.species.molar_mass))

    return G * G * (specific_volume(ys[-1]) - specific_volume(ys[0]))


def _acceleration_warning(model, ys):
    """Warning when the neglected acceleration term exceeds ACCELERATION_SHARE of the pressure drop."""
    if model.case.pressure_drop.model == "none" or len(ys) < 2:
        return []
    n = model.n
    friction = ys[0, n + 1] - ys[-1, n + 1]
    accel = acceleration_pressure_drop(model, ys)
    if not (friction > 0 and abs(accel) > ACCELERATION_SHARE * friction):
        return []
    return [f"the acceleration term of the momentum balance (G^2 change of 1/rho, {accel:.3g} Pa) is "
            f"{100 * accel / friction:.0f} % of the computed pressure drop ({friction:.3g} Pa) and is neglected: "
            "the pressure drop is underestimated by about that much"]


def model_warnings(model, ys, zs, hot=None):
    """Warnings about the physics of this run (not about the data ranges)."""
    hot = hot or {}
    out = []
    n = model.n
    key = model.key_index
    x_key = model.y0[key] / model.y0[:n].sum()
    resolution = model.case.solver.atol_scale / x_key if x_key > 0 else math.inf
    if resolution > 1e-4:
        out.append(f"key species {model.species.names[key]} is dilute (feed mole fraction {x_key:.2g}): its "
                   f"conversion is resolved only to about {resolution:.1g} (the solver's absolute tolerance); "
                   "choose a main reactant as design.key_species or tighten [solver] atol_scale")
    out += _hot_spot_near_inlet(model.case, hot)
    out += _acceleration_warning(model, ys)
    if model.case.pressure_drop.model != "none":
        dp = ys[0, n + 1] - ys[-1, n + 1]
        if dp > 0.3 * ys[0, n + 1]:
            out.append(f"pressure drop is {100 * dp / ys[0, n + 1]:.0f} % of the feed pressure: check the tube "
                       "count, particle size or flow (the momentum balance neglects acceleration)")
    return out


def references_used(case, model, compressibility_computed=False):
    """Reference keys of the components that ran in this case."""
    keys = ["cantera", "hindmarsh1983", "arrhenius1889"]
    if case.thermo.species_file:
        base = case.thermo.species_file.rsplit("/", 1)[-1]
        keys.append({"gri30.yaml": "gri30", "nasa_gas.yaml": "nasa_gas"}.get(base, "mcbride2002"))
        keys.append("mcbride2002")
    if any(r.form == "hougen-watson" for r in case.reactions):
        keys.append("hougen_watson1947")
    if case.pressure_drop.model != "none" and math.isnan(case.pressure_drop.viscosity):
        keys.append("wilke1950")
    if case.pressure_drop.model == "ergun":
        keys.append("ergun1952")
    elif case.pressure_drop.model == "pipe-friction":
        keys.append({"churchill-1977": "churchill1977", "colebrook-1939": "colebrook1939",
                     "blasius-1913": "blasius1913", "laminar": "hagen_poiseuille"}
                    [case.pressure_drop.friction_correlation])
    if case.thermo.equation_of_state == "peng-robinson" or compressibility_computed:
        keys.append("peng_robinson1976")
    c = case.heat.coefficient if case.heat.exchange else None
    if c is not None and c.inside != "value":
        keys += {"gnielinski-1976": ["gnielinski1976", "gnielinski2013"], "dittus-boelter-1930":
                 ["dittus_boelter1930", "gnielinski2013"], "li-finlayson-1977": ["li_finlayson1977"]}.get(
                     c.inside, ["leva1949"] if case.bed is not None else ["gnielinski1976", "gnielinski2013"])
        if math.isnan(case.pressure_drop.viscosity):
            keys.append("wilke1950")
        if math.isnan(c.conductivity):
            keys.append("mathur1967")
    if c is not None and c.shell is not None:
        keys.append("zukauskas1972")
    if getattr(case, "catalyst", None) is not None:
        keys += ["bischoff1965", "aris1975", "weisz_prater1954"]
    if case.pressure_drop.viscosity_activation_energy == case.pressure_drop.viscosity_activation_energy:
        keys.append("andrade1930")
    if any(x.normal_boiling_point == x.normal_boiling_point for x in case.thermo.custom) \
            and case.thermo.equation_of_state == "liquid":
        keys.append("smith_van_ness2005")
    return list(dict.fromkeys(keys))
