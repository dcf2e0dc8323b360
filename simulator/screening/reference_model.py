r"""Dimensionless cooled plug-flow tube used as the reference for the runaway criteria.

Pseudo-homogeneous 1-D plug flow, one n-th order exothermic reaction, constant properties,
coolant (wall) temperature Tw equal to the inlet temperature, tube long enough to hold the
hot spot:

.. math::
    \frac{dx}{dz} = Da\,(1-x)^n e^{\theta'},\qquad
    \frac{d\theta}{dz} = B\,Da\,(1-x)^n e^{\theta'} - St\,\theta,\qquad
    \theta' = \frac{\theta}{1+\theta/\gamma},\qquad x(0) = \theta(0) = 0

with z = axial position/L, theta = gamma*(T - Tw)/Tw, gamma = E/(R*Tw), B = gamma*dT_ad/Tw
and N = St/Da. With T0 = Tw the hot spot depends only on (B, N, gamma, n), so every criterion
reduces to a critical N/B as a function of (B, gamma, n).

Numerics. The model is integrated in the phase plane with the conversion variable
q = -ln(1 - x) as the independent variable (called s in the project notes)::

    dtheta/dq = B exp(-q) - N theta exp(-theta') exp((n-1) q)
    dtau/dq   = exp(-theta') exp((n-1) q)              tau = Da*z (reduced position)

Only exp(-theta') appears, so nothing overflows however far the reactor runs away (theta
is bounded by B), and the steep temperature front in z becomes a smooth curve in q. The hot
spot is a terminal solver event on dtheta/dq = 0 (same sign as dtheta/dz, since dx/dz > 0),
not an argmax on a grid. Default solver LSODA (stiff-capable), rtol 1e-10, atol 1e-12.
"""
import difflib
import functools
import math
from dataclasses import dataclass

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import brentq, minimize_scalar

from simulator.errors import IntegrationError
from simulator.screening.criteria import locate_sensitivity_maximum, semenov_1928_critical

#: Largest heat-of-reaction parameter accepted (exp(-q) must stay representable).
B_MAX = 500.0

_SOURCES = {
    "morbidelli_varma": "morbidelli_varma1988",
    "van_welsenaere_froment_maxima": "van_welsenaere_froment1970",
    "thomas_bowes": "thomas_bowes1961",
    "van_welsenaere_froment_inflection": "van_welsenaere_froment1970",
    "adler_enig": "adler_enig1964",
    "semenov": "semenov1928",
}


def _validate(B, N, gamma, n):
    B, N, gamma, n = float(B), float(N), float(gamma), float(n)
    if not (math.isfinite(B) and 0.0 < B <= B_MAX):
        raise ValueError(f"B = {B!r}: must be > 0 and <= {B_MAX:g}.")
    if not (math.isfinite(N) and N > 0.0):
        raise ValueError(f"N = {N!r}: must be a finite number > 0 (N = St/Da).")
    if math.isnan(gamma) or gamma <= 0.0:
        raise ValueError(f"gamma = {gamma!r}: must be > 0 (math.inf allowed).")
    if not (math.isfinite(n) and 0.0 <= n <= 4.0):
        raise ValueError(f"n = {n!r}: reaction order must be in [0, 4].")
    return B, N, gamma, n


def _q_end(B, N, gamma, n):
    """An upper bound of q at the hot spot: exp(-n q*) = (N/B) theta* exp(-theta'*)."""
    if n == 0.0:
        return 40.0  # x = 1 - 4e-18: complete conversion in double precision
    bound = (min(B, gamma) + max(0.0, -math.log(N / B)) + 60.0) / n
    return min(bound, 700.0)


def _system(B, N, gamma, n):
    inv_gamma = 0.0 if math.isinf(gamma) else 1.0 / gamma
    nm1 = n - 1.0

    def rhs(q, y):
        theta = y[0]
        damp = math.exp(-theta / (1.0 + inv_gamma * theta) + nm1 * q)
        return [B * math.exp(-q) - N * theta * damp, damp]

    def jac(q, y):
        theta = y[0]
        den = 1.0 + inv_gamma * theta
        a = 1.0 / (den * den)
        damp = math.exp(-theta / den + nm1 * q)
        return [[-N * damp * (1.0 - a * theta), 0.0], [-a * damp, 0.0]]

    def hot_spot_event(q, y):
        return rhs(q, y)[0]

    hot_spot_event.terminal = True
    hot_spot_event.direction = -1.0
    return rhs, jac, hot_spot_event


def _integrate(B, N, gamma, n, method, rtol, atol, dense):
    rhs, jac, event = _system(B, N, gamma, n)
    q_end = _q_end(B, N, gamma, n)
    jac_arg = {"jac": jac} if method in ("LSODA", "Radau", "BDF") else {}
    sol = solve_ivp(rhs, (0.0, q_end), [0.0, 0.0], method=method, events=event, rtol=rtol,
                    atol=atol, dense_output=dense, **jac_arg)
    if sol.status == -1:
        raise IntegrationError(
            f"reference tube B = {B:g}, N = {N:g}, gamma = {gamma:g}, n = {n:g}: solver stopped at "
            f"q = {sol.t[-1]:.6g} (theta = {sol.y[0, -1]:.6g}): {sol.message}"
        )
    if sol.status == 0 and n > 0.0:
        raise IntegrationError(
            f"reference tube B = {B:g}, N = {N:g}, gamma = {gamma:g}, n = {n:g}: no hot spot before "
            f"q = {q_end:.6g} (theta = {sol.y[0, -1]:.6g}). Check the inputs."
        )
    return sol


@dataclass(frozen=True)
class HotSpot:
    """Hot spot of the reference tube.

    Attributes
    ----------
    theta : float
        Reduced hot-spot rise theta* = gamma*(T* - Tw)/Tw, [-]
    conversion : float
        Conversion at the hot spot, [-]
    position : float
        Reduced position Da*z* (z* = axial position / tube length), [-]
    q : float
        Phase-plane variable -ln(1 - x*) at the hot spot, [-]
    at_complete_conversion : bool
        True when the reactant runs out before dtheta/dz = 0, so the maximum sits at
        x = 1; this is always the case at zero order (dtheta/dz does not depend on x there,
        so theta cannot pass a maximum), [-]
    """

    theta: float
    conversion: float
    position: float
    q: float
    at_complete_conversion: bool

    def temperature_ratio(self, gamma):
        """T*/Tw = 1 + theta*/gamma, [-]."""
        return 1.0 + (0.0 if math.isinf(gamma) else self.theta / gamma)


@functools.lru_cache(maxsize=8192)
def _hot_spot_cached(B, N, gamma, n, method, rtol, atol):
    sol = _integrate(B, N, gamma, n, method, rtol, atol, dense=False)
    if sol.status == 1:
        q, (theta, tau) = float(sol.t_events[0][0]), sol.y_events[0][0]
        return HotSpot(float(theta), -math.expm1(-q), float(tau), q, False)
    q, theta, tau = float(sol.t[-1]), float(sol.y[0, -1]), float(sol.y[1, -1])
    return HotSpot(theta, 1.0, tau, q, True)


def hot_spot(B, N, gamma=math.inf, n=1.0, *, method="LSODA", rtol=1e-10, atol=1e-12):
    r"""Hot spot of the reference cooled tube (T0 = Tw, long tube) [1]_.

    Parameters
    ----------
    B : float
        Heat-of-reaction parameter gamma*dT_ad/Tw (Barkelew's S), (0, 500], [-]
    N : float
        Cooling-to-reaction ratio St/Da, > 0, [-]
    gamma : float, optional
        Arrhenius number E/(R*Tw); ``math.inf`` for the exponential approximation, [-]
    n : float, optional
        Reaction order in the limiting reactant, [0, 4], [-]
    method : str, optional
        scipy ``solve_ivp`` method; LSODA (default), Radau and BDF get the analytic
        Jacobian, [-]
    rtol : float, optional
        Relative tolerance, [-]
    atol : float, optional
        Absolute tolerance on theta and Da*z, [-]

    Returns
    -------
    HotSpot

    Raises
    ------
    ValueError
        For inputs out of range.
    IntegrationError
        If the solver fails or finds no hot spot.

    Notes
    -----
    See the module docstring for the phase-plane form and the hot-spot event. Results are
    cached (the MV locator asks for the same point more than once).

    References
    ----------
    .. [1] R.J. Van Welsenaere, G.F. Froment, "Parametric sensitivity and runaway in fixed
       bed catalytic reactors," Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970
       (the model; the phase-plane form is derived here).

    Examples
    --------
    >>> round(hot_spot(10.0, 30.0).theta, 6)
    0.424632
    """
    B, N, gamma, n = _validate(B, N, gamma, n)
    return _hot_spot_cached(B, N, gamma, n, str(method), float(rtol), float(atol))


# ---------------------------------------------------------------------------------------
# Curvature sign indicators (exact for this model)
# ---------------------------------------------------------------------------------------
def _slope_x(q, theta, B, N, gamma, n):
    """theta_x = d theta/dx and a = d theta'/d theta, as numpy arrays."""
    inv_gamma = 0.0 if math.isinf(gamma) else 1.0 / gamma
    den = 1.0 + inv_gamma * theta
    a = 1.0 / (den * den)
    cool = N * np.exp(-theta / den + n * q)  # N exp(-theta') (1-x)^-n
    return B - cool * theta, a, cool


def _adler_enig_q(q, theta, B, N, gamma, n):
    theta_x, a, _ = _slope_x(q, theta, B, N, gamma, n)
    return theta_x * (a * theta - 1.0) - n * theta * np.exp(q)


def _thomas_bowes_q(q, theta, B, N, gamma, n):
    theta_x, a, cool = _slope_x(q, theta, B, N, gamma, n)
    return B * (a * theta_x - n * np.exp(q)) - cool * theta_x


def adler_enig_1964_sign_indicator(conversion, theta, B, N, gamma=math.inf, n=1.0):
    r"""A quantity with the sign of d2theta/dx2 in the reference tube [1]_.

    Parameters
    ----------
    conversion : float or ndarray
        Conversion x, [0, 1), [-]
    theta : float or ndarray
        Reduced temperature rise at x, [-]
    B : float
        Heat-of-reaction parameter, [-]
    N : float
        St/Da, [-]
    gamma : float, optional
        Arrhenius number, ``math.inf`` allowed, [-]
    n : float, optional
        Reaction order, [-]

    Returns
    -------
    float or ndarray
        :math:`\theta_x(a\theta - 1) - n\theta/(1-x)`, same sign as
        :math:`d^2\theta/dx^2`, [-]

    Notes
    -----
    With the phase-plane slope :math:`\theta_x = B - N\theta e^{-\theta'}(1-x)^{-n}` and
    :math:`a = d\theta'/d\theta = (1+\theta/\gamma)^{-2}`,

    .. math::
        \theta_{xx} = N e^{-\theta'}(1-x)^{-n}\left[\theta_x(a\theta-1) - \frac{n\theta}{1-x}\right]

    (derived in the project notes and re-derived here). The Adler-Enig critical point is the
    tangency of the trajectory with the zero set of the bracket before the maximum.

    References
    ----------
    .. [1] J. Adler, J.W. Enig, "The critical conditions in thermal explosion theory with
       reactant consumption," Combust. Flame, vol. 8, pp. 97-103, 1964 (from memory).

    Examples
    --------
    >>> adler_enig_1964_sign_indicator(0.0, 0.0, 20.0, 40.0)
    -20.0
    """
    q = -np.log1p(-np.asarray(conversion, dtype=float))
    out = _adler_enig_q(q, np.asarray(theta, dtype=float), float(B), float(N), float(gamma), float(n))
    return float(out) if np.ndim(out) == 0 else out


def thomas_bowes_1961_sign_indicator(conversion, theta, B, N, gamma=math.inf, n=1.0):
    r"""A quantity with the sign of d2theta/dz2 in the reference tube [1]_, [2]_.

    Parameters
    ----------
    conversion : float or ndarray
        Conversion x, [0, 1), [-]
    theta : float or ndarray
        Reduced temperature rise at x, [-]
    B : float
        Heat-of-reaction parameter, [-]
    N : float
        St/Da, [-]
    gamma : float, optional
        Arrhenius number, ``math.inf`` allowed, [-]
    n : float, optional
        Reaction order, [-]

    Returns
    -------
    float or ndarray
        :math:`(d^2\theta/d\tau^2)/r^2 = B(a\theta_x - n/(1-x)) - N\theta_x e^{-\theta'}(1-x)^{-n}`
        with :math:`\tau = Da\,z`, :math:`r = (1-x)^n e^{\theta'}`, [-]

    Notes
    -----
    From :math:`d\theta/d\tau = r\,\theta_x` and :math:`dr/d\tau = r^2(a\theta_x - n/(1-x))`;
    dividing by :math:`r^2 > 0` keeps the sign and removes the overflow-prone
    :math:`e^{2\theta'}`. At the inlet (x = theta = 0) it equals B(B - n - N).

    References
    ----------
    .. [1] P.H. Thomas, P.C. Bowes, "Some aspects of the self-heating and ignition of solid
       cellulosic materials," Br. J. Appl. Phys., vol. 12, p. 222, 1961 (from memory).
    .. [2] R.J. Van Welsenaere, G.F. Froment, "Parametric sensitivity and runaway in fixed
       bed catalytic reactors," Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970 (criterion II).

    Examples
    --------
    >>> thomas_bowes_1961_sign_indicator(0.0, 0.0, 20.0, 40.0)
    -420.0
    """
    q = -np.log1p(-np.asarray(conversion, dtype=float))
    out = _thomas_bowes_q(q, np.asarray(theta, dtype=float), float(B), float(N), float(gamma), float(n))
    return float(out) if np.ndim(out) == 0 else out


# ---------------------------------------------------------------------------------------
# Profiles (for checking the array-based tests)
# ---------------------------------------------------------------------------------------
@dataclass(frozen=True)
class Profile:
    """Reference-tube profile sampled uniformly in q = -ln(1 - x).

    Attributes
    ----------
    position : ndarray
        Reduced position Da*z, increasing, [-]
    conversion : ndarray
        Conversion x, [-]
    theta : ndarray
        Reduced temperature rise, [-]
    dtheta_dposition : ndarray
        d theta/d(Da z), [-]
    d2theta_dposition2 : ndarray
        d2 theta/d(Da z)^2, [-]
    dtheta_dx : ndarray
        d theta/dx, [-]
    d2theta_dx2 : ndarray
        d2 theta/dx2, [-]
    hot_spot : HotSpot
        The hot spot found by the solver event.
    """

    position: np.ndarray
    conversion: np.ndarray
    theta: np.ndarray
    dtheta_dposition: np.ndarray
    d2theta_dposition2: np.ndarray
    dtheta_dx: np.ndarray
    d2theta_dx2: np.ndarray
    hot_spot: HotSpot


def profile(B, N, gamma=math.inf, n=1.0, *, n_points=801, beyond=0.5, rtol=1e-10, atol=1e-12):
    """Axial profile of the reference tube up to (1 + beyond) times the hot-spot q.

    Parameters
    ----------
    B : float
        Heat-of-reaction parameter, [-]
    N : float
        St/Da, [-]
    gamma : float, optional
        Arrhenius number, ``math.inf`` allowed, [-]
    n : float, optional
        Reaction order, > 0, [-]
    n_points : int, optional
        Number of samples, uniform in q, [-]
    beyond : float, optional
        How far past the hot spot to go, as a fraction of its q, [-]
    rtol : float, optional
        Relative tolerance of LSODA, [-]
    atol : float, optional
        Absolute tolerance, [-]

    Returns
    -------
    Profile

    Raises
    ------
    ValueError
        If the z-derivatives would overflow (theta' > 300): use the sign indicators instead.
    """
    B, N, gamma, n = _validate(B, N, gamma, n)
    if n == 0.0:
        raise ValueError("n = 0.0: profile() needs n > 0 (zero order reaches x = 1 at finite z).")
    spot = hot_spot(B, N, gamma, n, rtol=rtol, atol=atol)
    q = np.linspace(0.0, (1.0 + float(beyond)) * spot.q, int(n_points))
    rhs, jac, _ = _system(B, N, gamma, n)
    sol = solve_ivp(rhs, (0.0, q[-1]), [0.0, 0.0], method="LSODA", jac=jac, t_eval=q, rtol=rtol, atol=atol)
    if sol.status != 0:
        raise IntegrationError(f"reference tube profile B = {B:g}, N = {N:g}: {sol.message}")
    theta, tau = sol.y
    inv_gamma = 0.0 if math.isinf(gamma) else 1.0 / gamma
    theta_p = theta / (1.0 + inv_gamma * theta)
    if np.max(theta_p) > 300.0:
        raise ValueError(f"B = {B:g}, N = {N:g}: theta' reaches {np.max(theta_p):.4g} > 300; "
                         "the z-derivatives overflow; use the sign indicators.")
    theta_x, _, cool = _slope_x(q, theta, B, N, gamma, n)
    r = np.exp(theta_p - n * q)
    return Profile(position=tau, conversion=-np.expm1(-q), theta=theta,
                   dtheta_dposition=r * theta_x,
                   d2theta_dposition2=r * r * _thomas_bowes_q(q, theta, B, N, gamma, n),
                   dtheta_dx=theta_x,
                   d2theta_dx2=cool * _adler_enig_q(q, theta, B, N, gamma, n),
                   hot_spot=spot)


# ---------------------------------------------------------------------------------------
# Critical N/B for each criterion
# ---------------------------------------------------------------------------------------
@dataclass(frozen=True)
class CriticalNOverB:
    """Critical N/B of one criterion: safe if N/B is larger.

    Attributes
    ----------
    criterion : str
        Name of the criterion, [-]
    value : float
        Critical N/B, nan if undecided, [-]
    decided : bool
        False if the criterion could not place the boundary, [-]
    reason : str
        Why not decided, or remarks, [-]
    source : str
        Reference key of the criterion, [-]
    solves : int
        Number of hot-spot solves used, [-]
    s_max : float
        Morbidelli-Varma only: signed normalized sensitivity at the boundary (nan for the
        other criteria); |s_max| of order 1 means no sharp boundary, [-]
    """

    criterion: str
    value: float
    decided: bool
    reason: str
    source: str
    solves: int
    s_max: float = math.nan


def _default_bracket(gamma):
    crit = semenov_1928_critical(gamma)
    upper = 1.01 / crit.psi_c if crit.exists else 3.5
    return 0.5, upper


def _max_along_trajectory(B, N, gamma, n, indicator):
    """Largest value of indicator(q, theta) between the inlet and the hot spot."""
    sol = _integrate(B, N, gamma, n, "LSODA", 1e-10, 1e-12, dense=True)
    q_star = float(sol.t[-1])
    grid = np.union1d(sol.t, np.linspace(0.0, q_star, 201))
    values = indicator(grid, sol.sol(grid)[0], B, N, gamma, n)
    j = int(np.argmax(values))
    best = float(values[j])
    if 0 < j < grid.size - 1:
        res = minimize_scalar(lambda qq: -float(indicator(qq, sol.sol(qq)[0], B, N, gamma, n)),
                              bounds=(grid[j - 1], grid[j + 1]), method="bounded",
                              options={"xatol": 1e-12 * max(q_star, 1.0)})
        best = max(best, -float(res.fun))
    return best


def _root_in_bracket(h, B, lo, hi, xtol):
    """Brent root of h(N/B) (h > 0 on the runaway side, low N/B)."""
    calls = 0

    def counted(r):
        nonlocal calls
        calls += 1
        return h(r * B)

    h_lo, h_hi = counted(lo), counted(hi)
    if not (h_lo > 0.0 > h_hi):
        return math.nan, False, (f"no sign change on N/B in [{lo:g}, {hi:g}] "
                                 f"(indicator {h_lo:.3g} at {lo:g}, {h_hi:.3g} at {hi:g})"), calls
    root = brentq(counted, lo, hi, xtol=xtol * lo, rtol=4.0 * np.finfo(float).eps, maxiter=200)
    return float(root), True, "", calls


def _critical_semenov(B, gamma, n, options):
    crit = semenov_1928_critical(gamma)
    if not crit.exists:
        return math.nan, False, "gamma <= 4: no Semenov critical point", 0
    return 1.0 / crit.psi_c, True, "", 0


def _critical_vwf_maxima(B, gamma, n, options):
    crit = semenov_1928_critical(gamma)  # theta_m of the maxima curve = Semenov theta_c
    if not crit.exists:
        return math.nan, False, "gamma <= 4: the maxima curve has no extremum", 0
    lo, hi = options["bracket"] or _default_bracket(gamma)
    return _root_in_bracket(lambda N: hot_spot(B, N, gamma, n).theta - crit.theta_c, B, lo, hi,
                            options["xtol"])


def _critical_thomas_bowes(B, gamma, n, options):
    lo, hi = options["bracket"] or _default_bracket(gamma)
    return _root_in_bracket(lambda N: _max_along_trajectory(B, N, gamma, n, _thomas_bowes_q), B, lo, hi,
                            options["xtol"])


def _critical_adler_enig(B, gamma, n, options):
    lo, hi = options["bracket"] or _default_bracket(gamma)
    return _root_in_bracket(lambda N: _max_along_trajectory(B, N, gamma, n, _adler_enig_q), B, lo, hi,
                            options["xtol"])


def _critical_morbidelli_varma(B, gamma, n, options):
    lo, hi = options["bracket"] or _default_bracket(gamma)
    if options["objective"] == "theta":
        def objective(N):
            return hot_spot(B, N, gamma, n).theta
    else:
        def objective(N):
            return hot_spot(B, N, gamma, n).temperature_ratio(gamma)
    # the peak cannot be placed more finely than the difference step: refine to rel_step/10
    xtol = max(options["xtol"], 0.1 * options["rel_step"])
    peak = locate_sensitivity_maximum(objective, lo * B, hi * B, n_coarse=options["n_coarse"],
                                      rel_step=options["rel_step"], xtol=xtol)
    value = peak.phi / B if peak.found else math.nan
    return value, peak.decided, peak.reason, peak.evaluations, peak.s_max


_CRITERIA = {
    "morbidelli_varma": _critical_morbidelli_varma,
    "van_welsenaere_froment_maxima": _critical_vwf_maxima,
    "thomas_bowes": _critical_thomas_bowes,
    "van_welsenaere_froment_inflection": _critical_thomas_bowes,
    "adler_enig": _critical_adler_enig,
    "semenov": _critical_semenov,
}

#: Criterion names accepted by :func:`critical_N_over_B`.
CRITERIA = tuple(sorted(_CRITERIA))


def critical_N_over_B(B, gamma=math.inf, criterion="morbidelli_varma", n=1.0, *, objective="theta",
                      bracket=None, n_coarse=13, rel_step=1e-4, xtol=1e-8):
    r"""Critical N/B of the reference tube by one runaway criterion.

    Parameters
    ----------
    B : float
        Heat-of-reaction parameter gamma*dT_ad/Tw, [-]
    gamma : float, optional
        Arrhenius number E/(R*Tw), ``math.inf`` allowed, [-]
    criterion : str, optional
        One of :data:`CRITERIA`: "morbidelli_varma" (max of |s| with phi = N),
        "van_welsenaere_froment_maxima" (theta* = theta_m), "thomas_bowes" (alias
        "van_welsenaere_froment_inflection": d2theta/dz2 touches 0 before the hot spot),
        "adler_enig" (d2theta/dx2 touches 0 before the maximum), "semenov" (1/psi_c), [-]
    n : float, optional
        Reaction order, [-]
    objective : {"theta", "temperature"}, optional
        Morbidelli-Varma only: normalise the sensitivity of theta* (the reduced rise; the
        choice that reproduces the table in the project notes and the only one usable at
        gamma = inf) or of T*/Tw = 1 + theta*/gamma, [-]
    bracket : tuple of float, optional
        (low, high) range of N/B searched; default (0.5, 1.01/psi_c(gamma)), [-]
    n_coarse : int, optional
        Morbidelli-Varma coarse-scan points, [-]
    rel_step : float, optional
        Morbidelli-Varma relative difference step in N, [-]
    xtol : float, optional
        Relative tolerance on the critical N/B (Morbidelli-Varma: at least rel_step/10, since
        the peak cannot be placed more finely than the difference step), [-]

    Returns
    -------
    CriticalNOverB
        Safe if N/B exceeds ``value``.

    Notes
    -----
    The root-type criteria (maxima curve, Thomas-Bowes, Adler-Enig) solve h(N/B) = 0 by
    Brent's method, where h is theta* - theta_m, or the largest value between the inlet and
    the hot spot of the exact curvature sign indicator
    (:func:`thomas_bowes_1961_sign_indicator`, :func:`adler_enig_1964_sign_indicator`),
    evaluated on the solver's dense output and refined by bounded Brent. The maxima-curve
    temperature is the Semenov theta_c(gamma): T_m - Tw = R*T_m^2/E in reduced form. The
    largest curvature is taken over the whole stretch from the inlet; for T0 = Tw the inlet
    curvature B(B - n - N) is negative whenever N/B > 1 - n/B, so no entrance region has to be
    excluded near any critical point.

    Examples
    --------
    >>> round(critical_N_over_B(20.0, criterion="semenov").value, 6)
    2.718282
    """
    if criterion not in _CRITERIA:
        close = difflib.get_close_matches(str(criterion), CRITERIA, n=2)
        hint = f" Did you mean {', '.join(repr(c) for c in close)}?" if close else ""
        raise ValueError(f"criterion = {criterion!r}: unknown; choose one of: {', '.join(CRITERIA)}.{hint}")
    if objective not in ("theta", "temperature"):
        raise ValueError(f"objective = {objective!r}: choose one of: temperature, theta.")
    B, _, gamma, n = _validate(B, 1.0, gamma, n)
    if objective == "temperature" and math.isinf(gamma):
        raise ValueError("objective = 'temperature': T*/Tw = 1 at gamma = inf; use objective = 'theta'.")
    if bracket is not None:
        lo, hi = (float(v) for v in bracket)
        if not (0.0 < lo < hi and math.isfinite(hi)):
            raise ValueError(f"bracket = {bracket!r}: need 0 < low < high (N/B values).")
        bracket = (lo, hi)
    options = {"bracket": bracket, "objective": objective, "n_coarse": n_coarse,
               "rel_step": rel_step, "xtol": xtol}
    value, decided, reason, solves, *rest = _CRITERIA[criterion](B, gamma, n, options)
    s_max = float(rest[0]) if rest else math.nan
    return CriticalNOverB(criterion, float(value), bool(decided), reason, _SOURCES[criterion], int(solves),
                          s_max)
