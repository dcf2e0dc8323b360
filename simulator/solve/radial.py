"""Integrate the 2-D pseudo-homogeneous tube (:mod:`simulator.model.radial`) along z.

Integrator: ODEPACK LSODA (``scipy.integrate.odeint``), as the 1-D run, on the state of
all radial points. Returns the centre-line, cup-mixing and wall profiles; the cup-mixing
flows and enthalpy are the Gauss-weighted means of the points, so element and energy closure
are checked on them exactly as on a 1-D run (:func:`simulator.solve.checks.closure`).
"""
import functools
import math
import warnings
from dataclasses import dataclass

import numpy as np
from scipy.integrate import ODEintWarning, odeint

from simulator.model import kernel as K1
from simulator.model import radial as RAD
from simulator.solve.checks import closure
from simulator.solve.integrate import SUCCESS, _integrate_budgeted, _reached


@dataclass(frozen=True)
class RadialProfiles:
    """Profiles of a 2-D run (per tube).

    Attributes
    ----------
    z : ndarray, axial position [m]
    T_points : ndarray (N_z, N), temperature at the interior collocation points [K]
    T_centre, T_cup, T_wall : ndarray, centre-line, cup-mixing and gas-at-wall temperature [K]
    F_cup : ndarray (N_z, n), cup-mixing molar flows of one tube [mol/s]
    P, Tc, Q : ndarray, pressure [Pa], medium temperature [K], wall heat added so far [W]
    closure : dict, element and energy closure on the cup-mixing flows [-]
    ok : bool, the integrator reported success
    message : str, the integrator's message
    nfev : int, right-hand-side evaluations
    states : ndarray, the integrated states [F per point, T per point, P, Tc, Q]
    F_points : ndarray (N_z, N, n), flows at the interior points (a whole tube at that point's state) [mol/s]
    """

    z: np.ndarray
    x: np.ndarray
    T_points: np.ndarray
    T_centre: np.ndarray
    T_cup: np.ndarray
    T_wall: np.ndarray
    F_cup: np.ndarray
    P: np.ndarray
    Tc: np.ndarray
    Q: np.ndarray
    closure: dict
    ok: bool
    message: str
    nfev: int
    states: np.ndarray = None
    F_points: np.ndarray = None


def effective_wall_coefficient(model, wall_coefficient):
    """Gas-at-wall to medium coefficient h_eff, 1/h_eff = 1/h_w + 1/U_o; 0 when adiabatic, [W/(m^2*K)].

    U_o is the case's typed ``heat.overall_coefficient``, read by the 2-D model as the part of the
    resistance outside the bed (wall conduction and medium film); U_o = 0 means no exchange.
    """
    ip, fp = model.args[0], model.args[1]
    if ip[K1.I_HEAT] not in (K1.HEAT_UNIFORM, K1.HEAT_FLOWING):
        return 0.0
    U_o = fp[K1.F_U]
    if not (U_o > 0.0 and wall_coefficient > 0.0):
        return 0.0
    return 1.0 / (1.0 / wall_coefficient + 1.0 / U_o)


def radial_args(model, points, conductivity, diffusivity, wall_coefficient):
    """Arguments of :func:`simulator.model.radial.rhs` after z and y."""
    x, A, B, w = RAD.collocation(points)
    rp = np.array([diffusivity, conductivity, effective_wall_coefficient(model, wall_coefficient),
                   0.5 * model.args[1][K1.F_DIAM]])
    return (points, np.ascontiguousarray(A), np.ascontiguousarray(B), w, rp) + tuple(model.args)


def initial_state(model, points):
    """Feed state at every radial point: [F per point, T per point, P, Tc, Q]."""
    n = model.n
    y0 = model.y0
    return np.concatenate([np.tile(y0[:n], points), np.full(points, y0[n]), y0[n + 1:n + 4]])


#: ODEPACK steps one output interval may take in a plain run (solve_radial)
INTERVAL_STEPS = 50_000
#: ODEPACK steps one re-integration of the post-processing (events, maxima) may take
POST_STEPS = 5_000


class RadialTube:
    """The 2-D tube of one model: integration and re-integration from a stored state.

    Parameters
    ----------
    model : simulator.model.build.Model
        Built 1-D model of the case (its rate, thermo and pressure-drop arrays are reused).
    points : int
        Interior radial collocation points, 1..8, [-]
    conductivity, diffusivity, wall_coefficient : float
        lambda_er [W/(m*K)], D_er [m^2/s], bed-side h_w [W/(m^2*K)]
    rtol, atol_scale : float, optional
        Tolerances (default: the case's), [-]
    """

    def __init__(self, model, points, conductivity, diffusivity, wall_coefficient, rtol=None, atol_scale=None):
        case = model.case
        n = model.n
        self.model = model
        self.N = points
        self.rtol = case.solver.rtol if rtol is None else rtol
        atol_scale = case.solver.atol_scale if atol_scale is None else atol_scale
        self.args = radial_args(model, points, conductivity, diffusivity, wall_coefficient)
        self.y0 = initial_state(model, points)
        sc = model.scale
        self.atol = np.concatenate([np.tile(sc[:n], points), np.full(points, sc[n]), sc[n + 1:n + 4]]) * atol_scale
        self.hmax = case.solver.max_step
        self.nfev = 0
        self.steps = 0          # steps of the main integration (run_budgeted)
        self.centre = _grid(points)[1]
        self.bi = _biot(self.args[4])

    def run(self, y0, zs, mxstep=INTERVAL_STEPS):
        """One odeint call from y0 at zs[0]; returns (states, message, outputs reached)."""
        with warnings.catch_warnings():     # the message is checked by the caller
            warnings.simplefilter("ignore", ODEintWarning)
            ys, info = odeint(RAD.rhs_odeint, y0, zs, args=self.args, rtol=self.rtol, atol=self.atol,
                              full_output=True, mxstep=mxstep, hmax=self.hmax, printmessg=False)
        if len(info["nfe"]):
            self.nfev += int(np.max(info["nfe"]))
        message = info["message"]
        finite = np.all(np.isfinite(ys), axis=1)
        if message == SUCCESS and finite.all():
            return ys, message, len(zs)
        tcur = np.asarray(info["tcur"], dtype=float)
        reached = np.concatenate([[True], tcur[:len(zs) - 1] >= zs[1:len(tcur) + 1] - 1e-12 * abs(zs[-1])])
        reached = np.concatenate([reached, np.zeros(len(zs) - len(reached), dtype=bool)]) & finite
        good = int(np.argmin(reached)) if not reached.all() else len(zs)
        return ys, (message if message != SUCCESS else "the state became non-finite"), max(good, 1)

    def run_budgeted(self, y0, zs):
        """The main integration within the 1-D run's budget of RUN_STEP_BUDGET steps in all
        (:func:`simulator.solve.integrate._integrate_budgeted`: one call, then chunks from the last
        output point reached); returns (states, message, outputs reached)."""
        ys, info = _integrate_budgeted(_CountedRuns(self), y0, zs)
        ys = np.asarray(ys)
        self.steps = int(np.max(info["nst"])) if len(info["nst"]) else 0
        message = info["message"]
        finite = np.all(np.isfinite(ys), axis=1)
        if message == SUCCESS and finite.all():
            return ys, message, len(zs)
        good = int(np.argmin(finite)) if not finite.all() else len(zs)
        if message != SUCCESS:
            good = min(good, _reached(info, zs) + 1)
        return ys, (message if message != SUCCESS else "the state became non-finite"), max(good, 1)

    def state_at(self, z0, y0, z):
        """State at z integrated from (z0, y0); None when that integration fails."""
        if z == z0:
            return y0
        ys, message, good = self.run(y0, np.array([z0, z]), mxstep=POST_STEPS)
        return ys[-1] if good == 2 else None

    def centre_temperature(self, y):
        """Temperature on the axis, [K]."""
        n, N = self.model.n, self.N
        nF = N * n
        Tw = RAD.wall_values(y[:nF], y[nF:nF + N], y[nF + N + 1], n, N, self.args[1], self.bi)[1]
        return float(self.centre @ np.append(y[nF:nF + N], Tw))

    def highest_temperature(self, y):
        """Highest temperature over the section: axis, interior points and bed at the wall, [K]."""
        n, N = self.model.n, self.N
        nF = N * n
        return max(self.centre_temperature(y), float(np.max(y[nF:nF + N])))

    def profiles(self, zs, ys, ok, message):
        """:class:`RadialProfiles` of the states ys at zs."""
        return _profiles(self.model, self.args, zs, ys, ok, message, self.nfev)


class _CountedRuns:
    """A RadialTube seen as the budgeted driver of the 1-D run expects: run -> (states, info, steps)."""

    def __init__(self, tube):
        self.tube = tube

    def run(self, y0, zs, mxstep):
        t = self.tube
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", ODEintWarning)
            sol, info = odeint(RAD.rhs_odeint, y0, zs, args=t.args, rtol=t.rtol, atol=t.atol, full_output=True,
                               mxstep=mxstep, hmax=t.hmax, printmessg=False)
        reached = _reached(info, zs)
        steps = int(info["nst"][reached - 1]) if reached else 0
        if reached:
            t.nfev += int(info["nfe"][reached - 1])
        if info["message"] != SUCCESS and "Excess work done" in info["message"]:
            steps += mxstep
        return sol, info, steps


@functools.lru_cache(maxsize=None)
def _grid(N):
    """Collocation points x (N + 1, the wall last) and the row giving the axis value, [-]."""
    x = RAD.collocation(N)[0]
    return x, RAD.centre_row(x)


def _biot(rp):
    return rp[RAD.RP_HEFF] * rp[RAD.RP_RADIUS] / rp[RAD.RP_LAM]


def solve_radial(model, points, conductivity, diffusivity, wall_coefficient, zs, rtol=None, atol_scale=None):
    """Integrate the 2-D tube on the output grid ``zs``; returns :class:`RadialProfiles`.

    Parameters
    ----------
    model : simulator.model.build.Model
        Built 1-D model of the case (its rate, thermo and pressure-drop arrays are reused).
    points : int
        Interior radial collocation points, 1..8, [-]
    conductivity : float
        Effective radial conductivity lambda_er, [W/(m*K)]
    diffusivity : float
        Effective radial diffusivity D_er, [m^2/s]
    wall_coefficient : float
        Bed-side wall coefficient h_w, [W/(m^2*K)]
    zs : ndarray
        Output positions, [m]
    rtol : float, optional
        Relative tolerance (default: the case's), [-]
    atol_scale : float, optional
        Absolute tolerance scale (default: the case's), [-]

    Notes
    -----
    A failed integration returns the profiles up to the last output point reached, with
    ``ok = False`` and the integrator's message.
    """
    tube = RadialTube(model, points, conductivity, diffusivity, wall_coefficient, rtol, atol_scale)
    ys, message, good = tube.run(tube.y0, zs)
    ok = good == len(zs)
    return tube.profiles(zs[:good], ys[:good], ok, message)


def _profiles(model, args, zs, ys, ok, message, nfev):
    n = model.n
    N, A, _, w, rp = args[:5]
    ip, fp, nasa, crit = model.args[0], model.args[1], model.args[2], model.args[9]
    x, centre = _grid(N)
    nF = N * n
    bi = _biot(rp)
    nz = len(zs)
    T_pts = ys[:, nF:nF + N]
    P = ys[:, nF + N]
    Tc = ys[:, nF + N + 1]
    Q = ys[:, nF + N + 2]
    F_pts = ys[:, :nF].reshape(nz, N, n)
    F_cup = np.einsum("k,zki->zi", w, F_pts)
    T_wall, T_cup, T_centre = RAD.section_temperatures(np.ascontiguousarray(ys), n, N, A, w, centre, bi, nasa, ip,
                                                       crit)
    # a uniform interior (the feed at z = 0) is uniform up to the axis: the polynomial through it and a
    # wall value set by the Robin condition would put a collocation artefact on the axis there
    uniform = np.ptp(T_pts, axis=1) == 0.0
    T_centre = np.where(uniform, T_pts[:, 0], T_centre)
    ys1 = np.column_stack([F_cup, T_cup, P, Tc, Q])
    clos = closure(model, ys1, K1) if ok else {"elements_relative": math.nan, "energy_relative": math.nan}
    return RadialProfiles(z=zs, x=x, T_points=T_pts, T_centre=T_centre, T_cup=T_cup, T_wall=T_wall, F_cup=F_cup,
                          P=P, Tc=Tc, Q=Q, closure=clos, ok=ok, message=message, nfev=nfev, states=ys,
                          F_points=F_pts)
