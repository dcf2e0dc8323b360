r"""Two-dimensional pseudo-homogeneous tube: radial orthogonal collocation (method of lines).

Balances of the steady 2-D plug-flow model with effective radial transport (Froment &
Bischoff, *Chemical Reactor Analysis and Design*, 2nd ed., 1990, ch. 11, from memory for the
section), written per radial collocation point k in flows a whole tube would carry with the
composition and temperature of that point (``F_ik`` [mol/s]; the cup-mixing flow is their
quadrature mean)::

    dF_ik/dz = A_c sum_j nu_ij r_j(T_k, P, F_k) + (D_er / (R^2 u)) (B F_i)_k
    dH_k/dz  = A_c (lambda_er / R^2) (B T)_k,       H_k = sum_i F_ik h_i(T_k)
    dP/dz    = Ergun / pipe friction on the cup-mixing state (the 1-D kernel's law)
    dTc/dz   = -q_w / C_m,   dQ/dz = q_w,   q_w = pi D h_eff (Tc - T_wall)

x = r/R; B is the collocation matrix of the cylindrical Laplacian (1/x) d/dx (x d/dx) on
even polynomials in x (symmetric at the axis), Villadsen & Stewart (1967). The interior
points are the N roots of the shifted Legendre polynomial P_N(2u - 1) in u = x^2 (the
Villadsen-Stewart choice alpha = 0, beta = 0 of the Jacobi family for a cylinder), so the
interior weights are a Gauss rule in u: exact for polynomials of degree 2N - 1 in u and, as
the Laplacian of the interpolant has degree N - 1 in u, sum_k w_k (B f)_k equals the wall
flux exactly. The cup-mixing flows therefore close the element balances exactly and the
enthalpy flow changes exactly by the wall duty.

Wall: species none through the wall (dF/dx = 0 at x = 1); heat through the wall coefficient
h_w in series with the wall-to-medium coefficient U_o (``heat.overall_coefficient``, which
for the 2-D model means inner tube surface to medium: wall conduction and medium film),
1/h_eff = 1/h_w + 1/U_o, as the Robin condition -lambda_er dT/dr = h_eff (T_wall - Tc). The
wall values are eliminated through these conditions, leaving N (n + 1) + 3 equations.

The radial diffusion term uses D_er c_i = D_er F_ik / (A_c u) with one superficial velocity u
of the cup-mixing state (ideal gas) for all points: linear in F, so exactly conservative;
the variation of u across the section is neglected in that term only.

State: ``y = [F_1,1 .. F_n,1, .., F_1,N .. F_n,N, T_1 .. T_N, P, Tc, Q]``.

References: J.V. Villadsen, W.E. Stewart, "Solution of boundary-value problems by orthogonal
collocation," Chem. Eng. Sci., vol. 22, pp. 1483-1501, 1967.
"""
import math

import numpy as np
from numba import njit

from simulator.model import kernel as K1
from simulator.units import R

#: most radial collocation points accepted; more make the radial operator stiff (about 20 ms per
#: run at 10-12 points against 1.5 ms at 3-6, measured on a 2-species case)
MAX_RADIAL_POINTS = 8
# radial float parameters rp[...]
RP_DER, RP_LAM, RP_HEFF, RP_RADIUS = range(4)


def collocation(N):
    """Radial collocation points, matrices and weights for a cylinder with N interior points.

    Parameters
    ----------
    N : int
        Number of interior collocation points, [-]

    Returns
    -------
    x : ndarray
        N + 1 points in x = r/R, the last one the wall, [-]
    A : ndarray
        (N + 1, N + 1) first-derivative matrix d/dx, [-]
    B : ndarray
        (N + 1, N + 1) Laplacian matrix (1/x) d/dx (x d/dx), [-]
    w : ndarray
        N interior weights of the cup-mixing mean, integral of f 2x dx over [0, 1], [-]

    Examples
    --------
    >>> x, A, B, w = collocation(3)
    >>> float(w.sum()), float((B @ x ** 2)[0])
    (1.0, 4.0)
    """
    if not 1 <= N <= MAX_RADIAL_POINTS:
        raise ValueError(f"radial points N = {N}: accepted 1..{MAX_RADIAL_POINTS}")
    u, wu = np.polynomial.legendre.leggauss(N)
    u = 0.5 * (u + 1.0)
    x = np.append(np.sqrt(u), 1.0)
    m = 2 * np.arange(N + 1)                         # even powers x^m
    Q = x[:, None] ** m[None, :]
    C = np.where(m > 0, m * x[:, None] ** np.maximum(m - 1, 0), 0.0)
    D = np.where(m > 1, m * m * x[:, None] ** np.maximum(m - 2, 0), 0.0)
    Qi = np.linalg.inv(Q)
    return x, C @ Qi, D @ Qi, 0.5 * wu


def centre_row(x):
    """Row vector giving the value at the axis (x = 0) from the N + 1 point values, [-]."""
    m = 2 * np.arange(len(x))
    return np.linalg.inv(x[:, None] ** m[None, :])[0]


def lumped_coefficient(wall_coefficient, radial_conductivity, radius, outer=math.inf):
    r"""1-D overall coefficient equivalent to the 2-D wall and radial resistances, [W/(m^2*K)].

    Parameters
    ----------
    wall_coefficient : float
        Bed-side wall coefficient h_w, [W/(m^2*K)]
    radial_conductivity : float
        Effective radial conductivity of the bed, [W/(m*K)]
    radius : float
        Tube inner radius, [m]
    outer : float
        Inner-surface-to-medium coefficient in series, [W/(m^2*K)]

    Returns
    -------
    U : float
        Lumped coefficient, [W/(m^2*K)]

    Notes
    -----
    .. math:: \frac{1}{U} = \frac{1}{h_w} + \frac{R}{4\lambda_{er}} + \frac{1}{U_o}

    the lumping of Froment & Bischoff (1990, ch. 11; from memory); the parabolic radial
    profile it assumes holds for small Biot numbers.

    Examples
    --------
    >>> round(lumped_coefficient(100.0, 1.0, 0.04), 6)
    50.0
    """
    return 1.0 / (1.0 / wall_coefficient + radius / (4.0 * radial_conductivity) + 1.0 / outer)


@njit(cache=True)
def wall_values(F, T, Tc, n, N, A, bi):
    """Wall flows (no flux) and wall temperature (Robin, Biot number bi = h_eff R / lambda_er)."""
    Fw = np.empty(n)
    aw = A[N, N]
    for i in range(n):
        s = 0.0
        for k in range(N):
            s += A[N, k] * F[k * n + i]
        Fw[i] = -s / aw
    s = 0.0
    for k in range(N):
        s += A[N, k] * T[k]
    Tw = (bi * Tc - s) / (aw + bi)
    return Fw, Tw


@njit(cache=True)
def rhs(z, y, N, A, B, w, rp, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, dydz):
    """Right-hand side of the 2-D tube, written into ``dydz`` (layout in the module docstring)."""
    n = ip[K1.I_N]
    m = ip[K1.I_M]
    nF = N * n
    P = max(y[nF + N], fp[K1.F_PMIN])
    Tc = y[nF + N + 1]
    area = fp[K1.F_AREA]
    Rt = rp[RP_RADIUS]
    lam = rp[RP_LAM]
    heff = rp[RP_HEFF]
    bi = heff * Rt / lam
    F = y[:nF]
    T = y[nF:nF + N]
    Fw, Tw = wall_values(F, T, Tc, n, N, A, bi)
    # cup-mixing state: flows, temperature (weighted mean, for u and the pressure law only)
    Fm = np.zeros(n)
    Tm = 0.0
    for k in range(N):
        Tm += w[k] * T[k]
        for i in range(n):
            Fm[i] += w[k] * F[k * n + i]
    Ftm = 0.0
    for i in range(n):
        Ftm += max(Fm[i], 0.0)
    u = Ftm * R * Tm / (P * area)
    dfac = rp[RP_DER] / (Rt * Rt * u)
    rates = np.empty(m)
    for k in range(N):
        Fk = F[k * n:(k + 1) * n]
        Tk = T[k]
        K1.reaction_rates(Tk, P, Fk, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit, rates)
        for i in range(n):
            s = 0.0
            for j in range(m):
                s += nu[i, j] * rates[j]
            lap = B[k, N] * Fw[i]
            for q in range(N):
                lap += B[k, q] * F[q * n + i]
            dydz[k * n + i] = area * s + dfac * lap
        lapT = B[k, N] * Tw
        for q in range(N):
            lapT += B[k, q] * T[q]
        cpt = 0.0
        hdF = 0.0
        for i in range(n):
            cpt += Fk[i] * K1._cp_R(nasa[i], Tk) * R
            hdF += K1._h_RT(nasa[i], Tk) * R * Tk * dydz[k * n + i]
        dydz[nF + k] = (area * lam / (Rt * Rt) * lapT - hdF) / cpt
    # pressure: the 1-D kernel's law on the cup-mixing state (its other derivatives are not used)
    if ip[K1.I_DP] == K1.DP_NONE:
        dydz[nF + N] = 0.0
    else:
        dydz[nF + N] = _pressure_gradient(z, Fm, Tm, P, Tc, n, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit)
    qw = heff * math.pi * 2.0 * Rt * (Tc - Tw)
    if ip[K1.I_HEAT] == K1.HEAT_FLOWING:
        dydz[nF + N + 1] = -qw / fp[K1.F_MCP]
    else:
        dydz[nF + N + 1] = 0.0
    dydz[nF + N + 2] = qw


@njit(cache=True)
def _pressure_gradient(z, Fm, Tm, P, Tc, n, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
    """dP/dz of the 1-D kernel on the cup-mixing state, [Pa/m]."""
    y1 = np.empty(n + 4)
    for i in range(n):
        y1[i] = Fm[i]
    y1[n] = Tm
    y1[n + 1] = P
    y1[n + 2] = Tc
    y1[n + 3] = 0.0
    d1 = np.empty(n + 4)
    K1.rhs(z, y1, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, d1)
    return d1[n + 1]


@njit(cache=True)
def section_temperatures(ys, n, N, A, w, centre, bi, nasa, ip, crit):
    """Bed-at-wall, cup-mixing and centre-line temperatures of states ys (rows), [K].

    The cup-mixing temperature is the one at which the cup-mixing flows carry the Gauss-weighted
    enthalpy flow of the points (Newton, from the weighted mean temperature).
    """
    nz = ys.shape[0]
    nF = N * n
    T_wall = np.empty(nz)
    T_cup = np.empty(nz)
    T_centre = np.empty(nz)
    Fm = np.empty(n)
    for q in range(nz):
        y = ys[q]
        Tc = y[nF + N + 1]
        P = y[nF + N]
        Tw = wall_values(y[:nF], y[nF:nF + N], Tc, n, N, A, bi)[1]
        T_wall[q] = Tw
        H = 0.0
        Tm = 0.0
        Fm[:] = 0.0
        for k in range(N):
            H += w[k] * K1.enthalpy_flow(y[k * n:(k + 1) * n], y[nF + k], P, nasa, ip, crit)
            Tm += w[k] * y[nF + k]
            for i in range(n):
                Fm[i] += w[k] * y[k * n + i]
        T = Tm
        for _ in range(50):
            f = K1.enthalpy_flow(Fm, T, P, nasa, ip, crit) - H
            d = (K1.enthalpy_flow(Fm, T + 1e-3, P, nasa, ip, crit) - H - f) / 1e-3
            step = f / d
            T -= step
            if abs(step) < 1e-10 * T:
                break
        T_cup[q] = T
        s = centre[N] * Tw
        for k in range(N):
            s += centre[k] * y[nF + k]
        T_centre[q] = s
    return T_wall, T_cup, T_centre


@njit(cache=True)
def rhs_odeint(y, z, N, A, B, w, rp, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
    """``odeint`` calling convention: returns a new array dy/dz."""
    out = np.empty(y.shape[0])
    rhs(z, y, N, A, B, w, rp, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, out)
    return out


def _refresh_cache():
    import os

    from simulator.model.jit_cache import refresh_if_sources_changed
    from simulator.thermo import nasa7

    compiled = [wall_values, _pressure_gradient, rhs, section_temperatures, rhs_odeint]
    if not os.environ.get("NUMBA_DISABLE_JIT"):
        refresh_if_sources_changed("radial", compiled, [__file__, K1.__file__, nasa7.__file__])


_refresh_cache()
