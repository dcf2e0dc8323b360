"""Stiff integration of a mechanism tube: SUNDIALS CVODE (BDF) through scikit-sundae.

The Jacobian is :meth:`simulator.mechanism.balances.MechanismTube.jacobian` (dense linear
solver). Terminal events, located by CVODE's root finding on its own trajectory (exact to
the solver tolerance): ``temperature_limit`` (T - T_limit crosses zero upward) and
``pressure_floor`` (P falls below 1 % of the feed pressure).

A solve that fails (CVODE error, an exception in Cantera, non-finite states) returns what it
reached with ``ok = False`` and the reason: the caller reports it as a failed run, never as a
result.

Reference: A. C. Hindmarsh et al., "SUNDIALS: Suite of nonlinear and differential/algebraic
equation solvers," ACM Trans. Math. Softw., vol. 31, no. 3, pp. 363-396, 2005,
doi:10.1145/1089014.1089020.
"""
import math
from dataclasses import dataclass

import numpy as np

#: Fraction of the feed pressure below which a run stops (as :mod:`simulator.solve.integrate`).
PRESSURE_FLOOR = 0.01
#: CVODE steps allowed per output interval.
MAX_STEPS_PER_INTERVAL = 20_000
EVENT_NAMES = ("temperature_limit", "pressure_floor")


@dataclass
class Trajectory:
    """What one CVODE solve reached: states at ``z`` (per tube), whether it got to the end, events."""

    z: np.ndarray
    y: np.ndarray
    ok: bool
    message: str
    event: str | None = None          # name of the terminal event that stopped it
    steps_note: str = ""


def solve_tube(tube, zs, rtol, atol, max_step=0.0, temperature_limit=float("nan")):
    """Integrate ``tube`` (a MechanismTube) over the output points ``zs`` [m].

    Parameters
    ----------
    tube : MechanismTube
        Balances and Jacobian.
    zs : ndarray
        Output positions, increasing, ``zs[0]`` the inlet, [m]
    rtol : float
        Relative tolerance, [-]
    atol : ndarray
        Absolute tolerance per state variable (SI units of each)
    max_step : float
        Largest step, [m]; 0: no limit
    temperature_limit : float
        Stop where T reaches it, [K]; NaN: no limit

    Returns
    -------
    Trajectory
    """
    from sksundae.cvode import CVODE

    n = tube.n
    P_floor = PRESSURE_FLOOR * tube.y0[n + 1]
    T_lim = temperature_limit

    def events(z, y, g):
        g[0] = y[n] - T_lim if not math.isnan(T_lim) else 1.0
        g[1] = y[n + 1] - P_floor

    events.terminal = [True, True]
    events.direction = [1, -1]
    solver = CVODE(tube.rhs, method="BDF", rtol=rtol, atol=atol, jacfn=tube.jacobian, linsolver="dense",
                   max_step=max_step, max_num_steps=MAX_STEPS_PER_INTERVAL, eventsfn=events, num_events=2)
    try:
        soln = solver.solve(np.asarray(zs, dtype=float), tube.y0.copy())
    except (ArithmeticError, ValueError, RuntimeError) as err:    # CanteraError is a RuntimeError
        z_fail = tube.last_z
        message = f"the balances could not be evaluated near z = {z_fail:.6g} m ({_first_line(err)})"
        z, y = _reached_before(solver, tube, np.asarray(zs, dtype=float), z_fail)
        return Trajectory(z=z, y=y, ok=False, message=message)
    z, y = np.asarray(soln.t, dtype=float), np.asarray(soln.y, dtype=float)
    finite = np.all(np.isfinite(y), axis=1)
    if not finite.all():
        k = int(np.argmin(finite))
        return Trajectory(z=z[:max(k, 1)], y=y[:max(k, 1)], ok=False,
                          message=f"the state is not finite at z = {z[k]:.6g} m")
    if not soln.success:
        return Trajectory(z=z, y=y, ok=False, message=f"CVODE: {soln.message} (status {soln.status})")
    event = None
    if soln.status == 2 and soln.i_events is not None and len(soln.i_events):
        flags = np.asarray(soln.i_events)[-1]
        event = EVENT_NAMES[int(np.nonzero(flags)[0][0])]
    return Trajectory(z=z, y=y, ok=True, message="integration successful", event=event)


def _reached_before(solver, tube, zs, z_fail):
    """The output points before ``z_fail`` (the same solve again, stopped short of it); just the inlet when
    that fails too. The balances raised there, so the trajectory beyond is never used."""
    short = zs[zs < z_fail]
    if len(short) >= 3:                  # the last point below z_fail may need a step beyond it: leave it out
        try:
            soln = solver.solve(short[:-1], tube.y0.copy())
            if soln.success:
                return np.asarray(soln.t, dtype=float), np.asarray(soln.y, dtype=float)
        except (ArithmeticError, ValueError, RuntimeError):
            pass                         # the inlet alone is what is known to be good
    return zs[:1], tube.y0[None, :].copy()


def _first_line(err):
    text = str(err).strip().splitlines()
    lines = [t for t in text if t.strip() and not set(t.strip()) <= {"*"}]
    return lines[-1].strip() if lines else type(err).__name__


def steps_between(tube, rtol, atol, max_step, z0, y0, z1):
    """The solver's internal steps (z, y) from (z0, y0) to z1 (re-integration for a located point)."""
    from sksundae.cvode import CVODE

    solver = CVODE(tube.rhs, method="BDF", rtol=rtol, atol=atol, jacfn=tube.jacobian, linsolver="dense",
                   max_step=max_step, max_num_steps=MAX_STEPS_PER_INTERVAL)
    soln = solver.solve(np.array([z0, z1]), np.asarray(y0, dtype=float).copy())
    return np.asarray(soln.t, dtype=float), np.asarray(soln.y, dtype=float)
