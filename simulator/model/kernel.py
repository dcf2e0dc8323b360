"""Compiled right-hand side of the tube balances (numba, ``cache=True``).

One generic kernel serves every case: the case is packed into plain arrays by
:mod:`simulator.model.build`, so the compiled code is cached once on disk and
reused by every later run and sweep. The kernel never calls Cantera; it
evaluates cached NASA-7 rows (:mod:`simulator.thermo.nasa7`).

State vector of one tube (see :mod:`simulator.model.state`)::

    y = [F_1 .. F_n, T, P, Tc, Q]
    F_i  molar flow of species i [mol/s]        T   gas temperature [K]
    P    pressure [Pa]                           Tc  medium temperature [K]
    Q    heat added through the wall so far [W] (negative = removed)

Balances (z = axial position [m], A_c = pi D^2/4)::

    dF_i/dz = A_c * sum_j nu_ij * r_j * basis_j
    dT/dz   = (U pi D (Tc - T) - sum_i H_i dF_i/dz - dH/dP dP/dz) / (dH/dT)
    dP/dz   = Ergun (packed bed) | -f G^2 / (2 D rho) (empty tube) | 0,  - rho g sin(theta) (inclined)
    dTc/dz  = U pi D (T - Tc) / C_m                         (flowing medium only)

where C_m = +m_c cp_c / N_tubes for a medium flowing with the gas (co-current) and
-m_c cp_c / N_tubes for one flowing against it (counter-current): the kernel only
sees the signed capacity rate per tube, packed by :mod:`simulator.model.heat`.
    dQ/dz   = U pi D (Tc - T)      (isothermal: the duty that holds T constant)

A given wall profile (``HEAT_PROFILE``, :mod:`simulator.model.heat.wallprofile`) replaces Tc by
the piecewise-linear temperature Tw(z) on the far side of U, q = U pi D (Tw(z) - T), and the
state Tc follows it (dTc/dz = dTw/dz); a given heat flux q''(z) [W/m^2 of inner wall] gives
q = q''(z) pi D and leaves Tc unused (dTc/dz = 0). The profile table is packed after the
per-species tail (offset ``F_VISC + 5 n + 2 n^2``, written by :func:`profile_tail`)::

    fp[o]                     PROFILE_TEMPERATURE (0) or PROFILE_HEAT_FLUX (1)
    fp[o + 1]                 k, the number of rows
    fp[o + 2 .. o + 1 + k]    positions z_0 = 0 < z_1 < .. < z_(k-1) >= L, [m]
    fp[o + 2 + k .. o + 1 + 2k]  temperature [K] or heat flux [W/m^2] at each position

U is ``fp[F_U]`` (typed) unless ``ip[I_COEF]`` points at a heat-coefficient block (``[heat.coefficient]``,
packed by :mod:`simulator.model.heat.coefficient` at the end of ``fp``): U(z) is then the series sum of
the local inside coefficient (from the local Re, Pr and conductivity) and the constant wall, outside
and fouling resistances, :func:`wall_coefficient`.

Here H = sum_i F_i h_i^ig(T) + F_T h^dep(T, P, y) is the enthalpy flow; the
departure h^dep is zero for an ideal gas and from Peng-Robinson otherwise.
"""
import math

import numpy as np
from numba import njit

from simulator.model import heat_coefficient as hc
from simulator.model import liquid
from simulator.model.pressure_drop import churchill_1977, blasius_1913, colebrook_1939, friction_laminar
from simulator.thermo.nasa7 import cp_R, h_RT, s_R
from simulator.units import P_STANDARD, R

_cp_R = njit(cache=True)(cp_R)
_h_RT = njit(cache=True)(h_RT)
_s_R = njit(cache=True)(s_R)
_churchill = njit(cache=True)(churchill_1977)
_blasius = njit(cache=True)(blasius_1913)
_colebrook = njit(cache=True)(colebrook_1939)
_laminar = njit(cache=True)(friction_laminar)

# integer parameters ip[...]
I_N, I_M, I_HEAT, I_DP, I_FRICTION, I_EOS, I_KMAX, I_FROZEN, I_PHASE, I_COEF, I_PELLET = range(11)
N_IP = 11
# ip[I_PELLET]: offset in fp of the pellet block (simulator.model.pellet_block), 0 without [catalyst]
# ip[I_COEF]: offset in fp of the heat-coefficient block (simulator.model.heat_coefficient), 0 for a typed U
PHASE_GAS, PHASE_LIQUID = range(2)   # ip[I_PHASE]: the concentration closure (simulator.model.liquid)
HEAT_ISOTHERMAL, HEAT_ADIABATIC, HEAT_UNIFORM, HEAT_FLOWING, HEAT_PROFILE = range(5)
PROFILE_TEMPERATURE, PROFILE_HEAT_FLUX = 0, 1
DP_NONE, DP_ERGUN, DP_PIPE = range(3)
EOS_IDEAL, EOS_PR = range(2)
# float parameters fp[...]
(F_AREA, F_DIAM, F_U, F_TC, F_MCP, F_RHOB, F_EPS, F_DP, F_MU0, F_MUEXP, F_MUT0, F_ROUGH, F_G,
 F_PMIN, F_T0, F_P0, F_FT0, F_MUMODE, F_RHOL, F_BETA, F_TRHO, F_GSIN) = range(22)
N_FP = 22   # F_RHOL, F_BETA, F_TRHO: liquid density law rho(T) = rho_ref [1 - beta (T - T_ref)]
# F_GSIN: g sin(theta) of the flow direction above the horizontal (tube.orientation), [m/s^2]: the
# hydrostatic head adds dP/dz = -rho g sin(theta) (0 for a horizontal tube)
# per-species tail of fp (n species; independent of the feed, so a sweep may copy it), see build.py:
#   fp[F_VISC + 5 i + c]               viscosity fit of species i (Cantera's form, see viscosity)
#   fp[F_VISC + 5 n + n i + k]         (M_k / M_i)^(1/4)                          (Wilke)
#   fp[F_VISC + 5 n + n^2 + n i + k]   1 / sqrt(8 (1 + M_i / M_k))                (Wilke)
F_VISC = N_FP
VISCOSITY_CONSTANT, VISCOSITY_WILKE, VISCOSITY_ANDRADE = 0, 1, 2
#: amount below which a rate that does not vanish with its reactant is switched off, relative to
#: the total feed flow per tube, [-] (see _depletion)
DEPLETION_FRACTION = 1e-9
# reaction columns rx[j, ...]
X_A, X_B, X_E, X_ACT, X_BASIS, X_REV, X_DN, X_NDEN, X_NADS = range(9)
N_RX = 9


@njit(cache=True, inline="always")
def _pr_pure(T, Tc, Pc, w):
    """Peng-Robinson a(T) [Pa*m^6/mol^2], da/dT and b [m^3/mol] of one species.

    kappa from the 1976 paper for omega <= 0.491 and its 1978 extension above (as Cantera).
    """
    if w <= 0.491:
        kap = 0.37464 + 1.54226 * w - 0.26992 * w * w
    else:
        kap = 0.379642 + 1.48503 * w - 0.164423 * w * w + 0.016666 * w * w * w
    a0 = 0.45724 * R * R * Tc * Tc / Pc
    sq = 1.0 + kap * (1.0 - math.sqrt(T / Tc))
    return a0 * sq * sq, -a0 * sq * kap / math.sqrt(T * Tc), 0.07780 * R * Tc / Pc


@njit(cache=True)
def pr_departure(T, P, x, crit):
    """Peng-Robinson compressibility Z and enthalpy departure of a mixture.

    Parameters
    ----------
    T : float
        Temperature, [K]
    P : float
        Pressure, [Pa]
    x : ndarray
        Mole fractions, [-]
    crit : ndarray
        (n, 3) rows of critical temperature [K], critical pressure [Pa], acentric factor [-]

    Returns
    -------
    Z : float
        Compressibility factor of the vapour root, [-]
    h_dep : float
        Molar enthalpy departure h - h_ig, [J/mol]

    Notes
    -----
    Peng-Robinson with kappa from the 1976 paper for omega <= 0.491 and the
    1978 extension above it (as Cantera does); zero binary interaction
    parameters; the largest real root of the cubic (vapour).

    References
    ----------
    .. [1] D.-Y. Peng, D.B. Robinson, "A new two-constant equation of state,"
       Ind. Eng. Chem. Fundam., vol. 15, pp. 59-64, 1976.
    """
    n = x.shape[0]
    am = 0.0
    dam = 0.0  # d(a_mix)/dT
    bm = 0.0
    ai = np.empty(n)
    dai = np.empty(n)
    for i in range(n):
        ai[i], dai[i], b = _pr_pure(T, crit[i, 0], crit[i, 1], crit[i, 2])
        bm += x[i] * b
    for i in range(n):
        for k in range(n):
            s = math.sqrt(ai[i] * ai[k])
            am += x[i] * x[k] * s
            dam += x[i] * x[k] * 0.5 * (ai[i] * dai[k] + ai[k] * dai[i]) / s
    A = am * P / (R * T) ** 2
    B = bm * P / (R * T)
    # Z^3 + c2 Z^2 + c1 Z + c0 = 0
    c2 = -(1.0 - B)
    c1 = A - 3.0 * B * B - 2.0 * B
    c0 = -(A * B - B * B - B * B * B)
    Z = 1.0
    for _ in range(100):  # Newton from the ideal-gas side converges to the largest root
        f = ((Z + c2) * Z + c1) * Z + c0
        df = (3.0 * Z + 2.0 * c2) * Z + c1
        step = f / df
        Z -= step
        if abs(step) < 1e-14:
            break
    s2 = math.sqrt(2.0)
    h_dep = R * T * (Z - 1.0) + (T * dam - am) / (2.0 * s2 * bm) * math.log(
        (Z + (1.0 + s2) * B) / (Z + (1.0 - s2) * B))
    return Z, h_dep


@njit(cache=True)
def pr_ln_fugacity_coefficients(T, P, x, crit, out):
    r"""Peng-Robinson ln(phi_i) of each species in a mixture (vapour root), written to ``out``.

    Parameters
    ----------
    T : float
        Temperature, [K]
    P : float
        Pressure, [Pa]
    x : ndarray
        Mole fractions, [-]
    crit : ndarray
        (n, 3) rows of critical temperature [K], critical pressure [Pa], acentric factor [-]
    out : ndarray
        Receives ln(phi_i), [-]

    Returns
    -------
    Z : float
        Compressibility factor, [-]

    Notes
    -----
    .. math::
        \ln\varphi_i = \frac{b_i}{b}(Z-1) - \ln(Z-B) - \frac{A}{2\sqrt2 B}
        \left(\frac{2\sum_j x_j a_{ij}}{a} - \frac{b_i}{b}\right)
        \ln\frac{Z+(1+\sqrt2)B}{Z+(1-\sqrt2)B}

    with a_ij = sqrt(a_i a_j) (no binary interaction parameters).

    References
    ----------
    .. [1] D.-Y. Peng, D.B. Robinson, "A new two-constant equation of state,"
       Ind. Eng. Chem. Fundam., vol. 15, pp. 59-64, 1976.
    """
    n = x.shape[0]
    ai = np.empty(n)
    bi = np.empty(n)
    for i in range(n):
        ai[i], _, bi[i] = _pr_pure(T, crit[i, 0], crit[i, 1], crit[i, 2])
    am = 0.0
    bm = 0.0
    for i in range(n):
        bm += x[i] * bi[i]
        for k in range(n):
            am += x[i] * x[k] * math.sqrt(ai[i] * ai[k])
    Z = pr_departure(T, P, x, crit)[0]
    A = am * P / (R * T) ** 2
    B = bm * P / (R * T)
    s2 = math.sqrt(2.0)
    log_term = math.log((Z + (1.0 + s2) * B) / (Z + (1.0 - s2) * B))
    for i in range(n):
        sum_a = 0.0
        for k in range(n):
            sum_a += x[k] * math.sqrt(ai[i] * ai[k])
        out[i] = (bi[i] / bm * (Z - 1.0) - math.log(Z - B)
                  - A / (2.0 * s2 * B) * (2.0 * sum_a / am - bi[i] / bm) * log_term)
    return Z


@njit(cache=True)
def compressibility(T, P, x, ip, crit):
    """Z of the mixture (1 for an ideal gas), [-]."""
    if ip[I_EOS] == EOS_PR:
        return pr_departure(T, P, x, crit)[0]
    return 1.0


@njit(cache=True)
def enthalpy_flow(F, T, P, nasa, ip, crit):
    """Total enthalpy flow H of a stream, [W] (J/s)."""
    n = F.shape[0]
    H = 0.0
    Ft = 0.0
    for i in range(n):
        H += F[i] * _h_RT(nasa[i], T) * R * T
        Ft += F[i]
    if ip[I_EOS] == EOS_PR and Ft > 0.0:
        x = np.empty(n)
        for i in range(n):
            x[i] = max(F[i], 0.0) / Ft
        H += Ft * pr_departure(T, P, x, crit)[1]
    return H


@njit(cache=True, inline="always")
def _power(a, e):
    """a**e with the common kinetic orders done without the general pow (a >= 0)."""
    if e == 1.0:
        return a
    if e == 2.0:
        return a * a
    if e == 0.5:
        return math.sqrt(a)
    if e == 1.5:
        return a * math.sqrt(a)
    return a ** e


@njit(cache=True, inline="always")
def _depletion(F, delta):
    r"""Smooth switch-off of a rate that does not vanish with its reactant, [-].

    A reactant of order below 1 (zero, fractional, negative) would keep being consumed after
    it is gone (a zero-order rate does not depend on it at all). The forward rate is
    multiplied, for each such reactant, by

    .. math:: s(u) = u^2 (3 - 2u) \quad (0 < u < 1),\qquad s = 1\ (u \ge 1),\qquad s = 0\ (u \le 0)

    with u = F_i / delta_i: a smoothstep, continuous with its first derivative, so the stiff
    integrator sees no corner. delta = 1e-9 F_T,feed per tube (:data:`DEPLETION_FRACTION`, ten
    times the default absolute tolerance of a flow): above it the rate is the stated law
    exactly; the switch-off is common practice, no source.
    """
    if F >= delta:
        return 1.0
    if F <= 0.0:
        return 0.0
    u = F / delta
    return u * u * (3.0 - 2.0 * u)


@njit(cache=True)
def _ln_fugacity_correction(j, T, P, F, act_is_p, ip, nu, crit):
    """sum_i nu_ij ln(phi_i) (+ dn ln Z for concentration activities) at the current state, [-]."""
    n = ip[I_N]
    x = np.empty(n)
    Ft = 0.0
    for i in range(n):
        Ft += max(F[i], 0.0)
    for i in range(n):   # the mixing rules need true mole fractions (also when inv = 1/F_T,0, I_FROZEN)
        x[i] = max(F[i], 0.0) / Ft
    lnphi = np.empty(n)
    Z = pr_ln_fugacity_coefficients(T, P, x, crit, lnphi)
    total = 0.0
    dn = 0.0
    for i in range(n):
        total += nu[i, j] * lnphi[i]
        dn += nu[i, j]
    if not act_is_p:
        total += dn * math.log(Z)
    return total


@njit(cache=True, inline="always")
def _mixture(T, P, F, ip, fp, crit):
    """(1/F_T for the mole fractions, total concentration P/(Z R T), Z); no allocation for an ideal gas."""
    n = ip[I_N]
    Ft = 0.0
    for i in range(n):
        Ft += max(F[i], 0.0)
    inv = 1.0 / Ft
    if ip[I_PHASE] == PHASE_LIQUID:   # C_i = F_i rho / m_dot: no gas law, no mole change (also when frozen)
        return inv, liquid.total_concentration(T, Ft, fp[F_G] * fp[F_AREA], fp[F_RHOL], fp[F_BETA],
                                               fp[F_TRHO]), 1.0
    Z = 1.0
    if ip[I_EOS] == EOS_PR:   # Z of the true composition (normalised mole fractions), also when frozen
        x = np.empty(n)
        for i in range(n):
            x[i] = max(F[i], 0.0) * inv
        Z = pr_departure(T, P, x, crit)[0]
    if ip[I_FROZEN] == 1:  # assumption check: concentrations as if the total moles did not change
        inv = 1.0 / fp[F_FT0]
    return inv, P / (Z * R * T), Z


@njit(cache=True, inline="always")
def reaction_rate(j, T, P, F, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit):
    """Rate of reaction j per unit reactor volume, [mol/(m^3*s)].

    Activities are y_i P (partial pressure, [Pa]) or y_i P/(Z R T) (concentration,
    [mol/m^3]) with y_i = max(F_i, 0)/F_T, written as ``max(F_i, 0) * inv * scale``.
    A reversible reaction adds -(k/K) prod a^(alpha + nu), K from the NASA rows. Reverse orders
    alpha + nu may be fractional or negative (Temkin-type rates, e.g. r = k1 p_N2 (p_H2^3/p_NH3^2)^a
    - k2 (p_NH3^2/p_H2^3)^(1-a) is alpha = (1, 3a, -2a)); an activity with a negative exponent is
    held above the flow floor ``DEPLETION_FRACTION`` x the feed flow (the loader refuses a species
    whose activity is zero at the feed under a negative exponent), so a flow the solver leaves at
    zero within its tolerance gives a large, finite rate instead of an infinite one.
    """
    n = ip[I_N]
    act_is_p = rx[j, X_ACT] > 0.5
    scale = (P if act_is_p else ctot) * inv
    k = rx[j, X_A] * math.exp(-rx[j, X_E] / (R * T))
    if rx[j, X_B] != 0.0:
        k *= T ** rx[j, X_B]
    fwd = k
    floor = DEPLETION_FRACTION * fp[F_FT0]     # activity floor of a negative exponent (Temkin-type rates)
    for i in range(n):
        o = ordr[i, j]
        if o != 0.0:
            fwd *= _power((max(F[i], 0.0) if o > 0.0 else max(F[i], floor)) * scale, o)
        if o < 1.0 and nu[i, j] < 0.0:   # a rate that would not vanish with this reactant
            fwd *= _depletion(F[i], DEPLETION_FRACTION * fp[F_FT0])
    r = fwd
    if rx[j, X_REV] > 0.5:
        dG_RT = 0.0
        for i in range(n):
            v = nu[i, j]
            if v != 0.0:
                dG_RT += v * (_h_RT(nasa[i], T) - _s_R(nasa[i], T))
        # K in the activity basis: K0 * (P0/(R T))^dn for concentrations, K0 * P0^dn for pressures
        ref = P_STANDARD if act_is_p else P_STANDARD / (R * T)
        lnK = -dG_RT + rx[j, X_DN] * math.log(ref)
        if ip[I_EOS] == EOS_PR:
            # real gas: equilibrium in fugacities, f_i = phi_i y_i P; with concentration activities
            # y_i P/(Z R T) the quotient also carries Z^dn. Q_f/K0 = Q_a/K_a * prod(phi^nu) * (Z^dn)
            lnK -= _ln_fugacity_correction(j, T, P, F, act_is_p, ip, nu, crit)
        rev = k * math.exp(-lnK)
        for i in range(n):
            e = rexp[i, j]
            if e != 0.0:
                rev *= _power((max(F[i], 0.0) if e > 0.0 else max(F[i], floor)) * scale, e)
            if e < 1.0 and nu[i, j] > 0.0:   # the reverse rate consumes the products
                rev *= _depletion(F[i], DEPLETION_FRACTION * fp[F_FT0])
        r = fwd - rev
    nads = int(rx[j, X_NADS])
    if nads > 0:
        den = 1.0
        for t in range(nads):
            term = ads[j, t, 0] * math.exp(-ads[j, t, 1] / (R * T))
            for i in range(n):
                e = ads[j, t, 2 + i]
                if e != 0.0:
                    term *= _power(max(F[i], 0.0) * scale, e)
            den += term
        r /= den ** rx[j, X_NDEN]
    return r * rx[j, X_BASIS]


@njit(cache=True)
def reaction_rates(T, P, F, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit, out):
    """Rates of all reactions per unit reactor volume, [mol/(m^3*s)], written to ``out``.

    Returns the compressibility factor Z used for the concentrations. With
    ``ip[I_FROZEN] == 1`` mole fractions are taken as F_i / F_T,0 (the mole change
    of the reactions neglected in the concentrations), for the assumption check only.
    """
    inv, ctot, Z = _mixture(T, P, F, ip, fp, crit)
    for j in range(ip[I_M]):
        out[j] = reaction_rate(j, T, P, F, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit)
    return Z


@njit(cache=True)
def viscosity(T, F, fp):
    r"""Gas viscosity at the local temperature and composition, [Pa*s].

    Parameters
    ----------
    T : float
        Temperature, [K]
    F : ndarray
        Molar flows, [mol/s]
    fp : ndarray
        Float parameters with the tail laid out in the module header, [-]

    Returns
    -------
    mu : float
        Dynamic viscosity, [Pa*s]

    Notes
    -----
    ``fp[F_MUMODE] == VISCOSITY_CONSTANT``: mu0 (T/T0)^a (a given constant has a = 0).
    ``VISCOSITY_ANDRADE`` (a liquid's law, ``pressure_drop.viscosity_activation_energy``):
    mu0 exp(E_mu/R (1/T - 1/T0)) (Andrade 1930) with E_mu/R in ``fp[F_MUEXP]``.
    ``VISCOSITY_WILKE``: pure-species viscosities from the fits Cantera makes of its transport
    data, :math:`\mu_i = \sqrt{T}\,(\sum_c a_{ic} (\ln T)^c)^2`, combined with Wilke's rule [1]_

    .. math:: \mu = \sum_i \frac{x_i \mu_i}{\sum_k x_k \Phi_{ik}}, \qquad
              \Phi_{ik} = \frac{\left(1 + \sqrt{\mu_i/\mu_k}\,(M_k/M_i)^{1/4}\right)^2}
                               {\sqrt{8 (1 + M_i/M_k)}}

    which is the mixture rule of Cantera's mixture-averaged transport, so both agree.

    References
    ----------
    .. [1] C.R. Wilke, "A viscosity equation for gas mixtures," J. Chem. Phys., vol. 18,
       pp. 517-519, 1950.
    .. [2] E.N. da C. Andrade, "The viscosity of liquids," Nature, vol. 125, pp. 309-310, 1930.
    """
    if fp[F_MUMODE] == VISCOSITY_ANDRADE:    # liquid: mu0 exp(b (1/T - 1/T0)), b = E_mu/R in F_MUEXP [K]
        return fp[F_MU0] * math.exp(fp[F_MUEXP] * (1.0 / T - 1.0 / fp[F_MUT0]))
    if fp[F_MUMODE] != VISCOSITY_WILKE:
        return fp[F_MU0] * (T / fp[F_MUT0]) ** fp[F_MUEXP]
    n = F.shape[0]
    fits = F_VISC
    w_mass = fits + 5 * n
    w_den = w_mass + n * n
    lnT = math.log(T)
    sqT = math.sqrt(T)
    Ft = 0.0
    for i in range(n):
        Ft += max(F[i], 0.0)
    root = np.empty(n)          # sqrt(mu_i) / T^(1/4)
    for i in range(n):
        o = fits + 5 * i
        root[i] = fp[o] + lnT * (fp[o + 1] + lnT * (fp[o + 2] + lnT * (fp[o + 3] + lnT * fp[o + 4])))
    mu = 0.0
    for i in range(n):
        xi = max(F[i], 0.0) / Ft
        if xi == 0.0:
            continue
        den = 0.0
        for k in range(n):
            xk = max(F[k], 0.0) / Ft
            if xk == 0.0:
                continue
            t = 1.0 + root[i] / root[k] * fp[w_mass + n * i + k]
            den += xk * t * t * fp[w_den + n * i + k]
        mu += xi * root[i] * root[i] * sqT / den
    return mu


@njit(cache=True)
def pellet_modulus(j, rate, F, inv, ctot, ip, fp, nu):
    """Generalized modulus Phi of reaction j at the local bulk state, [-]; 0 where no pellet limit applies.

    Phi = L sqrt((n + 1)/2 |nu_k| r_p / (D_e C_k)) (Bischoff 1965), arguments as :func:`effectiveness`.
    """
    o = ip[I_PELLET]
    K = int(fp[o + 3])
    per = o + 6 + K + 2 * j
    k = int(fp[per])
    if k < 0 or rate == 0.0:
        return 0.0
    C = max(F[k], 0.0) * inv * ctot
    if C <= 0.0:
        return 0.0
    r_p = abs(nu[k, j] * rate) * fp[o + 2]
    return fp[o] * math.sqrt(0.5 * (fp[per + 1] + 1.0) * r_p / (fp[o + 1] * C))


@njit(cache=True)
def effectiveness(j, rate, F, inv, ctot, ip, fp, nu):
    r"""Effectiveness factor of reaction j at the local bulk state, [-] (see :mod:`simulator.model.pellet_block`).

    Parameters
    ----------
    j : int
        Reaction index, [-]
    rate : float
        Its rate per reactor volume without pellet limits, [mol/(m^3*s)]
    F : ndarray
        Molar flows, [mol/s]
    inv, ctot : float
        1/F_T [s/mol] and the total concentration [mol/m^3] (:func:`_mixture`)
    ip, fp, nu : ndarray
        Kernel parameters and the stoichiometric matrix

    Returns
    -------
    eta : float
        [-]; 1 where no pellet limit applies (``simulator.model.pellet_block``)
    """
    phi = pellet_modulus(j, rate, F, inv, ctot, ip, fp, nu)
    if phi <= 0.0:
        return 1.0
    o = ip[I_PELLET]
    K = int(fp[o + 3])
    x = (math.log(phi) - fp[o + 4]) / fp[o + 5]
    if x <= 0.0:
        return fp[o + 6]
    if x >= K - 1:
        return 1.0 / phi
    i = int(x)
    w = x - i
    return (1.0 - w) * fp[o + 6 + i] + w * fp[o + 7 + i]


@njit(cache=True)
def effectiveness_profile(zs, ys, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
    """Effectiveness factor and generalized modulus of every reaction at every output point, (N, m, 2), [-]."""
    N = zs.shape[0]
    n = ip[I_N]
    m = ip[I_M]
    out = np.ones((N, m, 2))
    if ip[I_PELLET] == 0:
        return out
    for q in range(N):
        F = ys[q, :n]
        T = ys[q, n]
        P = max(ys[q, n + 1], fp[F_PMIN])
        inv, ctot, Z = _mixture(T, P, F, ip, fp, crit)
        for j in range(m):
            r = reaction_rate(j, T, P, F, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit)
            out[q, j, 0] = effectiveness(j, r, F, inv, ctot, ip, fp, nu)
            out[q, j, 1] = pellet_modulus(j, r, F, inv, ctot, ip, fp, nu)
    return out


@njit(cache=True)
def wall_coefficient(T, P, Tc, F, ip, fp, nasa, mw):
    r"""Overall coefficient U and inside coefficient h_i at the local state, [W/(m^2*K)].

    Parameters
    ----------
    T, P, Tc : float
        Gas temperature [K], pressure [Pa] and the temperature on the far side of U [K]
    F : ndarray
        Molar flows, [mol/s]
    ip, fp, nasa, mw : ndarray
        Kernel parameters (``ip[I_COEF]`` > 0: the block offset), NASA-7 rows, molar masses [kg/mol]

    Returns
    -------
    U : float
        Overall coefficient on the inner area, [W/(m^2*K)]
    h_i : float
        Inside coefficient, [W/(m^2*K)]

    Notes
    -----
    Re and Pr from the local viscosity (:func:`viscosity`), the ideal-gas heat capacity per mass
    and the conductivity of the block (given, or Cantera's fits); the mass velocity is the
    constant ``fp[F_G]``. The direction of the flux (Tc > T: the wall heats the gas) picks the
    heating or cooling form where a correlation has both. A liquid has no ideal-gas cp here: its
    heat capacity is still the species' cp rows, per mass.
    """
    o = ip[I_COEF]
    n = F.shape[0]
    cp = 0.0
    mass = 0.0
    for i in range(n):
        Fi = max(F[i], 0.0)
        cp += Fi * _cp_R(nasa[i], T) * R
        mass += Fi * mw[i]
    cp /= mass
    k = hc.gas_conductivity(T, F, fp, o)
    mu = viscosity(T, F, fp)
    method = int(fp[o + hc.C_METHOD])
    value = fp[o + hc.C_LAMBDA] if method == hc.PACKED_LI_FINLAYSON else fp[o + hc.C_HI]
    h_i = hc.inside_coefficient(method, value, fp[F_G], fp[F_DIAM], fp[o + hc.C_DP], mu, cp, k, Tc > T)
    return hc.overall_coefficient(h_i, fp, o), h_i


@njit(cache=True, inline="always")
def wall_flux(z, T, P, Tc, F, ip, fp, nasa, mw, want_inside):
    r"""Heat flux into the gas per inner-wall area and what gives it, at one state (exchange modes only).

    Parameters
    ----------
    z, T, P, Tc : float
        Position [m], gas temperature [K], pressure [Pa], the medium state [K]
    F : ndarray
        Molar flows, [mol/s]
    ip, fp, nasa, mw : ndarray
        Kernel parameters
    want_inside : bool
        Also evaluate h_i under a given heat flux (for the wall temperatures; the balances do not need it)

    Returns
    -------
    q : float
        Flux into the gas, [W/m^2]: U (T_far - T), or the given flux
    U, h_i : float
        Overall and inside coefficient, [W/(m^2*K)]; NaN where not defined (U under a given flux, h_i
        with a typed U)
    T_far, dT_far : float
        Temperature on the far side of U (medium, or a given wall profile) [K] and its slope along a
        given profile [K/m] (0 otherwise)
    given_flux : bool
        True for a given heat-flux profile

    Notes
    -----
    One definition of the wall flux for the balances (:func:`rhs`) and the profile outputs
    (:func:`wall_columns`). Under a given flux the direction of heating for h_i is the sign of q.
    """
    dT = 0.0
    if ip[I_HEAT] == HEAT_PROFILE:   # a given wall temperature Tw(z) stands in for Tc, or a given heat flux
        o = profile_tail(ip[I_N])
        Tc, dT = given_profile(z, fp, o)
        if fp[o] == PROFILE_HEAT_FLUX:
            h_i = np.nan
            if want_inside and ip[I_COEF] != 0:
                h_i = wall_coefficient(T, P, T + Tc, F, ip, fp, nasa, mw)[1]
            return Tc, np.nan, h_i, np.nan, 0.0, True
    if ip[I_COEF] == 0:
        return fp[F_U] * (Tc - T), fp[F_U], np.nan, Tc, dT, False
    U, h_i = wall_coefficient(T, P, Tc, F, ip, fp, nasa, mw)
    return U * (Tc - T), U, h_i, Tc, dT, False


@njit(cache=True)
def wall_columns(zs, ys, ip, fp, nasa, mw):
    r"""Wall quantities at every output point, (N, 5): U, h_i, q'', T_wall_inner, T_wall_outer.

    Parameters
    ----------
    zs : ndarray
        Positions, [m]
    ys : ndarray
        (N, n_state) states, laid out as in the module header (molar flows, T, P, Tc, Q)
    ip, fp, nasa, mw : ndarray
        Kernel parameters

    Returns
    -------
    out : ndarray
        Columns U [W/(m^2*K)], h_i [W/(m^2*K)] (NaN for a typed U), heat flux q'' into the gas per
        inner-wall area [W/m^2] (positive: the wall heats the gas), inner and outer tube-wall
        temperatures [K] (NaN where U is typed: the split of the resistance is unknown)

    Notes
    -----
    q'' = U (T_far - T) with T_far the medium (or given wall) temperature; the inner wall sits one
    inside resistance from the gas, T_wi = T + q''/h_i, the outer wall one wall resistance further,
    T_wo = T_wi + q'' D_i ln(D_o/D_i)/(2 k_w) (the resistances are referred to the inner area).
    A given heat flux fixes q''; its wall temperatures need ``[heat.coefficient]`` for h_i.
    """
    N = zs.shape[0]
    n = ip[I_N]
    out = np.full((N, 5), np.nan)
    heat = ip[I_HEAT]
    if heat != HEAT_UNIFORM and heat != HEAT_FLOWING and heat != HEAT_PROFILE:
        return out
    for k in range(N):
        y = ys[k]
        T = y[n]
        q, U, h_i, _, _, _ = wall_flux(zs[k], T, max(y[n + 1], fp[F_PMIN]), y[n + 2], y[:n], ip, fp, nasa, mw, True)
        out[k, 0] = U
        out[k, 1] = h_i
        out[k, 2] = q
        if ip[I_COEF] != 0:
            out[k, 3] = T + q / h_i
            out[k, 4] = out[k, 3] + q * fp[ip[I_COEF] + hc.C_RWALL]
    return out


@njit(cache=True, inline="always")
def profile_tail(n):
    """Offset of the given-profile table in ``fp`` for n species (see the module header)."""
    return F_VISC + 5 * n + 2 * n * n


@njit(cache=True, inline="always")
def given_profile(z, fp, o):
    """Linear interpolation of the given wall profile at z: (value, d value/dz).

    Parameters
    ----------
    z : float
        Axial position, [m]
    fp : ndarray
        Float parameters with the profile table at offset o (module header), [-]
    o : int
        Offset of the table, [-]

    Returns
    -------
    value : float
        Temperature [K] or heat flux [W/m^2] at z (the end values held outside the table,
        which the loader makes cover the tube)
    slope : float
        Its derivative along z on the segment holding z, [K/m] or [W/m^3]
    """
    k = int(fp[o + 1])
    zs = o + 2
    vs = o + 2 + k
    if z <= fp[zs]:
        return fp[vs], 0.0
    for s in range(1, k):
        if z <= fp[zs + s]:
            slope = (fp[vs + s] - fp[vs + s - 1]) / (fp[zs + s] - fp[zs + s - 1])
            return fp[vs + s - 1] + slope * (z - fp[zs + s - 1]), slope
    return fp[vs + k - 1], 0.0


@njit(cache=True)
def rhs(z, y, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, dydz):
    """Right-hand side of one tube, written into ``dydz`` (see the module docstring)."""
    n = ip[I_N]
    m = ip[I_M]
    F = y[:n]
    T = y[n]
    P = max(y[n + 1], fp[F_PMIN])
    Tc = y[n + 2]
    inv, ctot, Z = _mixture(T, P, F, ip, fp, crit)
    area = fp[F_AREA]
    for i in range(n):
        dydz[i] = 0.0
    for j in range(m):
        r = reaction_rate(j, T, P, F, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit)
        if ip[I_PELLET] != 0:
            r *= effectiveness(j, r, F, inv, ctot, ip, fp, nu)
        r *= area
        for i in range(n):
            v = nu[i, j]
            if v != 0.0:
                dydz[i] += v * r
    heat = ip[I_HEAT]
    dTc = 0.0
    qw = 0.0
    if heat == HEAT_UNIFORM or heat == HEAT_FLOWING or heat == HEAT_PROFILE:
        q, U, _, T_far, dTc, given_flux = wall_flux(z, T, P, Tc, F, ip, fp, nasa, mw, False)
        # U pi D (T_far - T) in this order, as before the flux got one definition (same round-off)
        qw = q * math.pi * fp[F_DIAM] if given_flux else U * math.pi * fp[F_DIAM] * (T_far - T)
    # pressure gradient
    dP = 0.0
    if ip[I_DP] != DP_NONE or fp[F_GSIN] != 0.0:
        Ft = 0.0
        mass = 0.0
        for i in range(n):
            Fi = max(F[i], 0.0)
            Ft += Fi
            mass += Fi * mw[i]
        if ip[I_PHASE] == PHASE_LIQUID:
            rho = liquid.density(T, fp[F_RHOL], fp[F_BETA], fp[F_TRHO])
        else:
            rho = P * (mass / Ft) / (Z * R * T)
        dP = -rho * fp[F_GSIN]          # hydrostatic head of an inclined tube
    if ip[I_DP] != DP_NONE:
        G = fp[F_G]
        mu = viscosity(T, F, fp)
        if ip[I_DP] == DP_ERGUN:
            eps = fp[F_EPS]
            dp = fp[F_DP]
            u = G / rho
            dP -= (150.0 * mu * (1.0 - eps) ** 2 * u / (eps ** 3 * dp * dp)
                   + 1.75 * rho * (1.0 - eps) * u * u / (eps ** 3 * dp))
        else:
            D = fp[F_DIAM]
            Re = G * D / mu
            code = ip[I_FRICTION]
            if code == 0:
                f = _churchill(Re, fp[F_ROUGH] / D)
            elif code == 1:
                f = _colebrook(Re, fp[F_ROUGH] / D)
            elif code == 2:
                f = _blasius(Re)
            else:
                f = _laminar(Re)
            dP -= f * G * G / (2.0 * D * rho)
    dydz[n + 1] = dP
    # energy
    if heat == HEAT_ISOTHERMAL:
        dydz[n] = 0.0
        duty = 0.0
        for i in range(n):
            duty += _h_RT(nasa[i], T) * R * T * dydz[i]
        if ip[I_EOS] == EOS_PR:
            duty += _dH_dF_dep(F, T, P, nasa, ip, crit, dydz) + _dH_dP(F, T, P, nasa, ip, crit) * dP
        dydz[n + 3] = duty
    else:
        cpt = 0.0
        hdF = 0.0
        for i in range(n):
            cpt += F[i] * _cp_R(nasa[i], T) * R
            hdF += _h_RT(nasa[i], T) * R * T * dydz[i]
        extra = 0.0
        if ip[I_EOS] == EOS_PR:
            dT = 1e-4 * T
            Hp = enthalpy_flow(F, T + dT, P, nasa, ip, crit)
            Hm = enthalpy_flow(F, T - dT, P, nasa, ip, crit)
            cpt = (Hp - Hm) / (2.0 * dT)
            extra = _dH_dF_dep(F, T, P, nasa, ip, crit, dydz) + _dH_dP(F, T, P, nasa, ip, crit) * dP
        dydz[n] = (qw - hdF - extra) / cpt
        dydz[n + 3] = qw
    if heat == HEAT_FLOWING:
        dydz[n + 2] = -qw / fp[F_MCP]   # F_MCP is signed: < 0 for a medium flowing against the gas
    else:
        dydz[n + 2] = dTc               # a given wall profile's slope; 0 otherwise


@njit(cache=True)
def _dH_dF_dep(F, T, P, nasa, ip, crit, dF):
    """Departure part of sum_i (dH/dF_i) dF_i/dz by a directional difference, [W/m]."""
    n = F.shape[0]
    norm = 0.0
    Ft = 0.0
    for i in range(n):
        norm += abs(dF[i])
        Ft += abs(F[i])
    if norm == 0.0:
        return 0.0
    h = 1e-6 * Ft / norm
    Fp = np.empty(n)
    Fm = np.empty(n)
    one_sided = False
    for i in range(n):
        Fp[i] = F[i] + h * dF[i]
        Fm[i] = F[i] - h * dF[i]
        if Fm[i] < 0.0 <= F[i]:
            one_sided = True
    if one_sided:
        # a species absent (a product at the inlet): the backward point would have a negative flow,
        # which the mixture clips to zero, and the central difference would halve its share; the
        # forward difference stays on the physical side (error O(h), h ~ 1e-6 of the flow)
        return (_dep_flow(Fp, T, P, crit) - _dep_flow(F, T, P, crit)) / h
    return (_dep_flow(Fp, T, P, crit) - _dep_flow(Fm, T, P, crit)) / (2.0 * h)


@njit(cache=True)
def _dep_flow(F, T, P, crit):
    n = F.shape[0]
    Ft = 0.0
    for i in range(n):
        Ft += max(F[i], 0.0)
    x = np.empty(n)
    for i in range(n):
        x[i] = max(F[i], 0.0) / Ft
    return Ft * pr_departure(T, P, x, crit)[1]


@njit(cache=True)
def _dH_dP(F, T, P, nasa, ip, crit):
    dP = 1e-5 * P
    return (_dep_flow(F, T, P + dP, crit) - _dep_flow(F, T, P - dP, crit)) / (2.0 * dP)


@njit(cache=True)
def rhs_odeint(y, z, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
    """``odeint`` calling convention: returns a new array dy/dz."""
    out = np.empty(y.shape[0])
    rhs(z, y, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, out)
    return out


@njit(cache=True)
def derivative_profile(zs, ys, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit):
    """dy/dz at every output point, (N, n_state) (one compiled loop instead of N Python calls)."""
    out = np.empty_like(ys)
    for k in range(zs.shape[0]):
        rhs(zs[k], ys[k], ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, out[k])
    return out


@njit(cache=True)
def compressibility_profile(T, P, F, crit):
    """Peng-Robinson Z at every point of a profile; F (N, n) molar flows of the species in crit."""
    N = T.shape[0]
    n = F.shape[1]
    out = np.empty(N)
    x = np.empty(n)
    for k in range(N):
        Ft = 0.0
        for i in range(n):
            Ft += max(F[k, i], 0.0)
        for i in range(n):
            x[i] = max(F[k, i], 0.0) / Ft
        out[k] = pr_departure(T[k], P[k], x, crit)[0]
    return out


@njit(cache=True)
def pr_phase_profile(T, P, F, crit):
    r"""Peng-Robinson roots along a profile, to tell a gas from a liquid-like state.

    Parameters
    ----------
    T : ndarray
        Temperatures, [K]
    P : ndarray
        Pressures, [Pa]
    F : ndarray
        (N, n) molar flows of the species in ``crit``, [mol/s]
    crit : ndarray
        (n, 3) rows of critical temperature [K], critical pressure [Pa], acentric factor [-]

    Returns
    -------
    out : ndarray
        (N, 4): Z of the root the balances use (largest real root), Z of the smallest real
        root above B (equal to the first when the cubic has one real root), the mixture's
        ln(f/P) = sum_i x_i ln(phi_i) at the largest and at the smallest root, [-]

    Notes
    -----
    .. math:: \frac{g^{dep}}{RT} = Z - 1 - \ln(Z - B) - \frac{A}{2\sqrt2 B}
              \ln\frac{Z + (1+\sqrt2) B}{Z + (1-\sqrt2) B}

    The other roots come from the quadratic left after dividing the largest one out.
    A smaller root with a lower g^dep is a liquid at the same composition that is more stable
    than the gas: the gas would condense, which the model (one gas phase) does not describe.
    """
    N = T.shape[0]
    n = F.shape[1]
    out = np.empty((N, 4))
    x = np.empty(n)
    ai = np.empty(n)
    bi = np.empty(n)
    s2 = math.sqrt(2.0)
    for k in range(N):
        Ft = 0.0
        for i in range(n):
            Ft += max(F[k, i], 0.0)
        am = 0.0
        bm = 0.0
        for i in range(n):
            x[i] = max(F[k, i], 0.0) / Ft
            ai[i], _, bi[i] = _pr_pure(T[k], crit[i, 0], crit[i, 1], crit[i, 2])
            bm += x[i] * bi[i]
        for i in range(n):
            for j in range(n):
                am += x[i] * x[j] * math.sqrt(ai[i] * ai[j])
        A = am * P[k] / (R * T[k]) ** 2
        B = bm * P[k] / (R * T[k])
        Z1 = pr_departure(T[k], P[k], x, crit)[0]
        c2 = -(1.0 - B)
        c1 = A - 3.0 * B * B - 2.0 * B
        p = c2 + Z1                  # Z^2 + p Z + q = 0 after dividing out (Z - Z1)
        q = c1 + p * Z1
        Z2 = Z1
        disc = p * p - 4.0 * q
        if disc > 0.0:
            small = (-p - math.sqrt(disc)) / 2.0
            if small > B:
                Z2 = small
        out[k, 0] = Z1
        out[k, 1] = Z2
        for c in range(2):
            Z = out[k, c]
            out[k, 2 + c] = (Z - 1.0 - math.log(Z - B) - A / (2.0 * s2 * B)
                             * math.log((Z + (1.0 + s2) * B) / (Z + (1.0 - s2) * B)))
    return out


def _dispatchers(namespace):
    from numba.core.registry import CPUDispatcher

    return [v for v in namespace.values() if isinstance(v, CPUDispatcher)]


def _refresh_cache():
    import os

    from simulator import units
    from simulator.model import heat_coefficient as hc
    from simulator.model import liquid, pressure_drop
    from simulator.model.jit_cache import refresh_if_sources_changed
    from simulator.thermo import nasa7

    compiled = sorted(_dispatchers(globals()), key=lambda d: d.py_func.__module__ != __name__)  # own first
    if compiled and not os.environ.get("NUMBA_DISABLE_JIT"):
        refresh_if_sources_changed("kernel", compiled, [__file__, nasa7.__file__, pressure_drop.__file__, liquid.__file__,
                                                         units.__file__, hc.__file__])


_refresh_cache()
