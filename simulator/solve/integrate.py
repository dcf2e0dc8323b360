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

from simulator.model import kernels
from simulator.model.build import build_model
from simulator.results import Result
from simulator.solve.checks import closure, closure_warnings, compressibility_profile, range_warnings

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


class _Tube:
    """Integration of one model, with re-integration from output points for events."""

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

    def run(self, y0, zs):
        with warnings.catch_warnings():  # the status is checked and reported by simulate()
            warnings.simplefilter("ignore", ODEintWarning)
            sol, info = odeint(self.K.rhs_odeint, y0, zs, args=self.model.args, rtol=self.rtol, atol=self.atol,
                               full_output=True, hmax=self.hmax, mxstep=MAX_STEPS, printmessg=False)
        self.calls += 1
        if len(info["nfe"]):
            self.nfev += int(info["nfe"][-1])
            self.njev += int(info["nje"][-1])
            self.nsteps += int(info["nst"][-1])
        return sol, info

    def state_at(self, z0, y0, z):
        if z == z0:
            return y0
        sol, info = self.run(y0, np.array([z0, z]))
        return sol[-1]

    def derivative(self, z, y):
        return self.K.rhs_odeint(y, z, *self.model.args)


MAX_STEPS = 100000   # ODEPACK step budget of one integration


def _explain_failure(message, case, length):
    """A solver failure in plain words with the likely cause and what to change (one sentence each)."""
    text = " ".join(message.split()).rstrip(".")
    max_step = case.solver.max_step
    if not message:
        return ("the state became non-finite (overflow or a negative concentration raised to a negative or "
                "fractional order); check the kinetics, its units and the feed")
    if "Excess work done" in text:
        if max_step > 0 and length / max_step > 0.5 * MAX_STEPS:
            return (f"step budget of {MAX_STEPS} steps exhausted because solver.max_step = {max_step:g} m is far "
                    f"too small for a {length:g} m tube; raise or remove it")
        return (f"step budget of {MAX_STEPS} steps exhausted: the solution changes extremely fast here (a "
                "runaway, or rate constants far too large); check the kinetics and their units, or set "
                "design.temperature_limit to stop a runaway")
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
    except ValueError:  # no sign change on the refined trajectory (grazing): keep the grid point
        root = zs[k + 1]
    return root, tube.state_at(z0, y0, root)


STEP_ALARM = 40     # solver steps between two output points above which the interval is resolved
MAX_RESOLVED = 25   # intervals resolved at most per run


def _hermite_hidden_maximum(zs, T, dTdz):
    """Intervals whose cubic Hermite interpolant has an interior maximum although dT/dz has the same
    sign at both ends (a peak and a dip inside one output interval)."""
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
    return np.nonzero(same_sign & (disc > 0) & (a != 0) & inside)[0]


def _resolve_fast_intervals(tube, zs, ys, dTdz, info, n):
    """Insert the solver's internal steps in intervals with fast dynamics; returns (zs, ys, refined).

    An interval is resolved when ODEPACK needed more than STEP_ALARM steps across it (its step
    count is in ``info["nst"]``), or when the Hermite interpolant of T hides a maximum there. The
    interval is integrated again by scipy's LSODA (same tolerances) and its internal step points,
    which follow the dynamics, are added to the profile, so events and the hot spot are found
    on them as on any output point.
    """
    from scipy.integrate import solve_ivp

    nst = np.asarray(info["nst"], dtype=float)[:len(zs) - 1]
    steps = np.diff(np.concatenate([[0.0], nst]))
    flagged = set(np.nonzero(steps > STEP_ALARM)[0].tolist()) | set(
        _hermite_hidden_maximum(zs, ys[:, n], dTdz).tolist())
    if not flagged:
        return zs, ys, False
    K, args = tube.K, tube.model.args
    new_z, new_y = [zs], [ys]
    for k in sorted(flagged)[:MAX_RESOLVED]:
        sol = solve_ivp(lambda z, y: K.rhs_odeint(y, z, *args), (zs[k], zs[k + 1]), ys[k], method="LSODA",
                        rtol=tube.rtol, atol=tube.atol)
        inner = (sol.t > zs[k]) & (sol.t < zs[k + 1])
        if sol.status == 0 and inner.any():
            new_z.append(sol.t[inner])
            new_y.append(sol.y[:, inner].T)
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
        z_m, y_m = _locate_maximum(tube, zs, ys, k, dTdz, n)
        if y_m[n] > T_lim:
            z0, y0 = zs[k], ys[k]
            root = brentq(lambda z: tube.state_at(z0, y0, z)[n] - T_lim, z0, z_m,
                          xtol=max(1e-12, 1e-10 * (z_m - z0)), rtol=1e-12, maxiter=100)
            return root, tube.state_at(z0, y0, root)
    if k_grid is None:
        return None
    return _refine(tube, zs, ys, k_grid, lambda z, y: y[n] - T_lim)


def simulate(case, model=None, length=None):
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
    opts = case.solver
    zs = np.linspace(0.0, L, opts.output_points)
    atol = model.scale * opts.atol_scale
    tube = _Tube(model, opts.rtol, atol, opts.max_step, kernels.for_run())
    ys, info = tube.run(model.y0, zs)
    notes = []
    status, termination = "completed", f"end of tube reached at z = {L:.6g} m"
    events = {}

    ok = info["message"] == "Integration successful."
    finite = np.all(np.isfinite(ys), axis=1)
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
        termination = (f"solver failed after z = {zs[last_good]:.6g} m of {L:.6g} m (last output point: "
                       f"T = {y[n]:.6g} K, P = {y[n + 1]:.6g} Pa{beyond}): {why}")
        zs, ys = zs[:last_good + 1], ys[:last_good + 1]

    # fast dynamics between output points (a hot spot narrower than the output spacing): add the
    # solver's own steps there before looking for events
    dTdz = tube.K.derivative_profile(zs, ys, *model.args)[:, n]
    zs, ys, refined = _resolve_fast_intervals(tube, zs, ys, dTdz, info, n)
    if refined:
        dTdz = tube.K.derivative_profile(zs, ys, *model.args)[:, n]
    T_lim = case.design.temperature_limit
    stops = []
    if not math.isnan(T_lim):
        if ys[0, n] >= T_lim:
            stops.append((0.0, ys[0], "temperature_limit"))
        else:
            crossing = _limit_crossing(tube, zs, ys, dTdz, n, T_lim)
            if crossing is not None:
                stops.append((*crossing, "temperature_limit"))
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
            else:
                termination = (f"pressure fell below {100 * PRESSURE_FLOOR:g} % of the feed pressure at "
                               f"z = {z_e:.6g} m: this tube cannot pass the feed at this pressure drop")
        events[name] = {"position_m": float(z_e), "temperature_K": float(y_e[n]), "pressure_Pa": float(y_e[n + 1])}

    # target conversion (recorded, the run continues)
    key = model.key_index
    F0k = model.y0[key]
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
    Tc = ys[:, n + 2]
    Z = compressibility_profile(model, ys, tube.K)
    count = model.count
    clos = closure(model, ys, tube.K)
    notes += closure_warnings(clos)
    notes += range_warnings(model, ys)
    notes += model_warnings(model, ys, zs)
    rise, rise_info = model.adiabatic
    elapsed = time.perf_counter() - started
    stats = {"method": "LSODA (scipy.integrate.odeint)",
             "kernel": "compiled (numba)" if tube.K is kernels.compiled else "plain Python (compiled cache cold)", "rtol": opts.rtol, "atol_scale": opts.atol_scale,
             "output_points": int(len(zs)), "rhs_evaluations": tube.nfev, "jacobian_evaluations": tube.njev,
             "steps": tube.nsteps, "integrator_calls": tube.calls, "wall_time_s": round(elapsed, 4)}
    return Result(
        case=case, species=model.species.names, z=zs, F=ys[:, :n] * count, T=ys[:, n], P=ys[:, n + 1], Tc=Tc,
        Q=ys[:, n + 3] * count, Z=Z, status=status, termination=termination, hot_spot=hot, design=design,
        closure=clos, warnings=tuple(notes), solver_stats=stats, versions=versions(),
        references=tuple(references_used(case, model, np.any(np.isfinite(Z)))), events=events, adiabatic_temperature_rise=rise,
        extra={"adiabatic": rise_info, "viscosity": model.viscosity_note,
               "critical_sources": dict(zip(model.species.names, model.critical_sources))},
    )


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
        z_m, y_m = _locate_maximum(tube, zs, ys, int(k), dTdz, n)
        candidates.append((float(y_m[n]), float(z_m), y_m, "event dT/dz = 0"))
    T_max, z_max, y_max, how = max(candidates, key=lambda c: c[0])
    return {"temperature_K": T_max, "position_m": z_max, "rise_above_feed_K": T_max - T0,
            "rise_above_medium_K": _rise_above_medium(case, y_max), "located_by": how}


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
    if not case.heat.exchange:
        return None
    n = len(case.species)
    return float(y[n] - y[n + 2])


def model_warnings(model, ys, zs):
    """Warnings about the physics of this run (not about the data ranges)."""
    out = []
    n = model.n
    if np.any(ys[:, :n] < -1e-9 * model.y0[:n].sum()):
        worst = int(np.argmin(ys[:, :n].min(axis=0)))
        out.append(f"molar flow of {model.species.names[worst]} went negative "
                   f"({ys[:, worst].min():.3g} mol/s per tube); tighten [solver] rtol/atol_scale")
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
    if case.pressure_drop.model == "ergun":
        keys.append("ergun1952")
    elif case.pressure_drop.model == "pipe-friction":
        keys.append({"churchill-1977": "churchill1977", "colebrook-1939": "colebrook1939",
                     "blasius-1913": "blasius1913", "laminar": "hagen_poiseuille"}
                    [case.pressure_drop.friction_correlation])
    if case.thermo.equation_of_state == "peng-robinson" or compressibility_computed:
        keys.append("peng_robinson1976")
    return keys
