"""Integrate the 2-D pseudo-homogeneous tube (:mod:`simulator.model.radial`) along z.

Integrator: ODEPACK LSODA (``scipy.integrate.odeint``), as the 1-D run, on the state of
all radial points. Returns the centre-line, cup-mixing and wall profiles; the cup-mixing
flows and enthalpy are the Gauss-weighted means of the points, so element and energy closure
are checked on them exactly as on a 1-D run (:func:`simulator.solve.checks.closure`).
"""
import math
from dataclasses import dataclass

import numpy as np
from scipy.integrate import odeint

from simulator.model import kernel as K1
from simulator.model import radial as RAD
from simulator.solve.checks import closure


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


def effective_wall_coefficient(model, wall_coefficient):
    """Gas-at-wall to medium coefficient h_eff, 1/h_eff = 1/h_w + 1/U_o; 0 when adiabatic, [W/(m^2*K)]."""
    ip, fp = model.args[0], model.args[1]
    if ip[K1.I_HEAT] not in (K1.HEAT_UNIFORM, K1.HEAT_FLOWING):
        return 0.0
    U_o = fp[K1.F_U]
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
    """
    case = model.case
    n = model.n
    N = points
    rtol = case.solver.rtol if rtol is None else rtol
    atol_scale = case.solver.atol_scale if atol_scale is None else atol_scale
    args = radial_args(model, N, conductivity, diffusivity, wall_coefficient)
    y0 = initial_state(model, N)
    sc = model.scale
    atol = np.concatenate([np.tile(sc[:n], N), np.full(N, sc[n]), sc[n + 1:n + 4]]) * atol_scale
    ys, info = odeint(RAD.rhs_odeint, y0, zs, args=args, rtol=rtol, atol=atol, full_output=True,
                      mxstep=50_000, printmessg=False)
    ok = info["message"] == "Integration successful." and bool(np.all(np.isfinite(ys)))
    return _profiles(model, args, zs, ys, ok, info["message"], int(info["nfe"][-1]) if len(info["nfe"]) else 0)


def _profiles(model, args, zs, ys, ok, message, nfev):
    n = model.n
    N, A, _, w, rp = args[:5]
    ip, fp, nasa, crit = model.args[0], model.args[1], model.args[2], model.args[9]
    x = RAD.collocation(N)[0]
    centre = RAD.centre_row(x)
    nF = N * n
    bi = rp[RAD.RP_HEFF] * rp[RAD.RP_RADIUS] / rp[RAD.RP_LAM]
    nz = len(zs)
    T_pts = ys[:, nF:nF + N]
    P = ys[:, nF + N]
    Tc = ys[:, nF + N + 1]
    Q = ys[:, nF + N + 2]
    F_pts = ys[:, :nF].reshape(nz, N, n)
    F_cup = np.einsum("k,zki->zi", w, F_pts)
    T_wall = np.empty(nz)
    T_cup = np.empty(nz)
    for q in range(nz):
        T_wall[q] = RAD.wall_values(ys[q, :nF], T_pts[q], Tc[q], n, N, A, bi)[1]
        H = sum(w[k] * K1.enthalpy_flow(F_pts[q, k], T_pts[q, k], P[q], nasa, ip, crit) for k in range(N))
        T_cup[q] = _temperature_of(F_cup[q], H, float(w @ T_pts[q]), P[q], nasa, ip, crit)
    T_centre = np.hstack([T_pts, T_wall[:, None]]) @ centre
    ys1 = np.column_stack([F_cup, T_cup, P, Tc, Q])
    clos = closure(model, ys1, K1) if ok else {"elements_relative": math.nan, "energy_relative": math.nan}
    return RadialProfiles(z=zs, x=x, T_points=T_pts, T_centre=T_centre, T_cup=T_cup, T_wall=T_wall, F_cup=F_cup,
                          P=P, Tc=Tc, Q=Q, closure=clos, ok=ok, message=message, nfev=nfev)


def _temperature_of(F, H, guess, P, nasa, ip, crit):
    """Temperature at which the stream F has the enthalpy flow H (Newton), [K]."""
    T = guess
    for _ in range(50):
        f = K1.enthalpy_flow(F, T, P, nasa, ip, crit) - H
        dT = 1e-3
        d = (K1.enthalpy_flow(F, T + dT, P, nasa, ip, crit) - f - H) / dT
        step = f / d
        T -= step
        if abs(step) < 1e-10 * T:
            break
    return T
