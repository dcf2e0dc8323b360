r"""Overall wall heat-transfer coefficient U from correlations (plain math, written for the compiled kernel).

Meant for the planned ``[heat.coefficient]`` that replaces a typed ``overall_coefficient``. U is referred to
the tube's inner wall and is the series sum of the resistances

.. math::
    \frac{1}{U} = \frac{1}{h_i} + R_{f,i} + \frac{D_i \ln(D_o/D_i)}{2 k_w}
                + \frac{D_i}{D_o}\left(R_{f,o} + \frac{1}{h_o}\right)

where only :math:`h_i` varies along the tube: it follows the local Reynolds and Prandtl
numbers of the gas (its viscosity, heat capacity and thermal conductivity at the local
temperature and composition). The functions are plain math written for numba (the kernel can
wrap them like :mod:`simulator.model.pressure_drop`); the constant resistances are meant to be
packed once in a block of ``fp`` at an offset ``o`` (:data:`C_*` below).

The case file's ``[heat.coefficient]`` (:mod:`simulator.case.heat_coefficient_keys`) is packed by
:mod:`simulator.model.heat.coefficient`; the kernel calls :func:`inside_coefficient` and
:func:`overall_coefficient` at every right-hand-side evaluation.

Inside coefficients (method codes ``fp[o + C_METHOD]``):

* empty tube, ``"gnielinski-1976"`` and ``"dittus-boelter-1930"`` (``"auto"`` is Gnielinski),
  both behind one regime guard, :func:`empty_tube_nusselt`: laminar fully developed flow at a
  constant wall temperature (Nu = 3.66) below Re 2300; a linear blend in Re between the laminar
  Nu at 2300 and the turbulent one at 10^4 (Gnielinski 2013); the turbulent correlation above.
  So a turbulent correlation is never evaluated at a laminar Reynolds number (Gnielinski's form
  gives Nu = 0.66 at Re 1100, meaningless).
* packed bed, ``"leva-1950"`` (gas cooled), ``"leva-1949"`` (gas heated), ``"auto"`` picks by
  the local direction of the flux: Leva's correlations are bed-side coefficients of the
  one-dimensional model (measured from the mean bed temperature), so no radial lumping is made.
* a value with units: a constant h_i.

The gas conductivity is either a given constant or the
mixture-averaged value from Cantera's pure-species fits, :func:`gas_conductivity`.
"""
import math

from numba import njit

# inside-coefficient methods fp[o + C_METHOD]
(INSIDE_VALUE, EMPTY_GNIELINSKI, EMPTY_DITTUS_BOELTER, PACKED_LEVA_AUTO, PACKED_LEVA_1949, PACKED_LEVA_1950,
 PACKED_LI_FINLAYSON) = range(7)
# conductivity modes fp[o + C_KMODE]
CONDUCTIVITY_GIVEN, CONDUCTIVITY_FITS = range(2)
# the coefficient block of fp, from an offset o (planned: a new fixed fp entry); the 5 n conductivity fits follow it
(C_METHOD, C_HI, C_RWALL, C_ROUT, C_RFIN, C_KMODE, C_KGAS, C_DP, C_FACTOR, C_LAMBDA) = range(10)
N_COEF = 10
#: fp[o + C_LAMBDA]: effective radial conductivity of the bed lambda_er for the lumping of a wall
#: coefficient of the two-dimensional model into the one-dimensional h_i (Li-Finlayson), [W/(m*K)]
#: fp[o + C_RWALL], C_ROUT and C_RFIN are resistances referred to the inner area, [m^2*K/W]:
#: D_i ln(D_o/D_i)/(2 k_w); (D_i/D_o)(R_f,o + 1/h_o); R_f,i

#: Reynolds numbers of the empty-tube regime guard [-]: laminar below, turbulent above the second
RE_LAMINAR, RE_TURBULENT = 2300.0, 1.0e4
NU_LAMINAR = 3.66     # fully developed laminar flow, constant wall temperature [-]


@njit(cache=True)
def filonenko_1954(Re):
    r"""Darcy friction factor of a smooth tube, turbulent flow, [-].

    Parameters
    ----------
    Re : float
        Reynolds number, [-]

    Returns
    -------
    fd : float
        Darcy friction factor, [-]

    Notes
    -----
    .. math:: f_d = (1.82 \log_{10} Re - 1.64)^{-2}

    The friction factor Gnielinski (1976) used in his Nusselt correlation. Validity: 10^4 < Re < 10^7
    as usually quoted (from memory).

    References
    ----------
    .. [1] G.K. Filonenko, "Hydraulic resistance in pipes," Teploenergetika, vol. 1, no. 4,
       pp. 40-44, 1954.

    Examples
    --------
    >>> round(filonenko_1954(1e5), 5)
    0.01797
    """
    return (1.82 * math.log10(Re) - 1.64) ** -2


@njit(cache=True)
def gnielinski_1976(Re, Pr, fd):
    r"""Nusselt number of turbulent flow in a tube (Gnielinski), [-].

    Parameters
    ----------
    Re : float
        Reynolds number, [-]
    Pr : float
        Prandtl number, [-]
    fd : float
        Darcy friction factor, [-]

    Returns
    -------
    Nu : float
        Nusselt number on the tube diameter, [-]

    Notes
    -----
    .. math:: Nu = \frac{(f_d/8)(Re - 1000) Pr}{1 + 12.7 \sqrt{f_d/8}\,(Pr^{2/3} - 1)}

    Validity: 2300 < Re < 5e6, 0.5 < Pr < 2000 (the source). No regime check here: call
    :func:`empty_tube_nusselt`.

    References
    ----------
    .. [1] V. Gnielinski, "New equations for heat and mass transfer in turbulent pipe and
       channel flow," Int. Chem. Eng., vol. 16, no. 2, pp. 359-368, 1976.

    Examples
    --------
    >>> gnielinski_1976(1e5, 1.2, 0.0185)
    254.62682749359632
    """
    f8 = fd / 8.0
    return f8 * (Re - 1000.0) * Pr / (1.0 + 12.7 * math.sqrt(f8) * (Pr ** (2.0 / 3.0) - 1.0))


@njit(cache=True)
def dittus_boelter_1930(Re, Pr, heating):
    r"""Nusselt number of turbulent flow in a tube (Dittus-Boelter), [-].

    Parameters
    ----------
    Re : float
        Reynolds number, [-]
    Pr : float
        Prandtl number, [-]
    heating : bool
        True when the fluid is heated (exponent 0.4), False when cooled (0.3), [-]

    Returns
    -------
    Nu : float
        Nusselt number on the tube diameter, [-]

    Notes
    -----
    .. math:: Nu = 0.023\, Re^{0.8} Pr^{n}, \quad n = 0.4 \text{ heating}, 0.3 \text{ cooling}

    Validity: Re > 1e4, 0.7 < Pr < 160, L/D > 10 (as quoted by Incropera & DeWitt).

    References
    ----------
    .. [1] F.W. Dittus and L.M.K. Boelter, "Heat transfer in automobile radiators of the tubular
       type," Univ. Calif. Publ. Eng., vol. 2, pp. 443-461, 1930.

    Examples
    --------
    >>> dittus_boelter_1930(1e5, 1.2, True)
    247.40036409449127
    """
    return 0.023 * Re ** 0.8 * Pr ** (0.4 if heating else 0.3)


@njit(cache=True)
def empty_tube_nusselt(Re, Pr, method, heating):
    r"""Nusselt number of an empty tube with the regime guard, [-].

    Parameters
    ----------
    Re : float
        Reynolds number on the inner diameter, [-]
    Pr : float
        Prandtl number, [-]
    method : int
        ``EMPTY_GNIELINSKI`` or ``EMPTY_DITTUS_BOELTER``, [-]
    heating : bool
        True when the gas is heated, [-]

    Returns
    -------
    Nu : float
        Nusselt number on the tube diameter, [-]

    Notes
    -----
    Re <= 2300: 3.66 (laminar, fully developed, constant wall temperature; entry effects,
    which raise Nu, are neglected: conservative for cooling). 2300 < Re < 10^4: the linear
    blend Nu = (1 - g) 3.66 + g Nu_turb(10^4), g = (Re - 2300)/(10^4 - 2300), of
    Gnielinski (2013) [1]_ (from memory), so Nu is continuous in Re. Re >= 10^4: the turbulent
    correlation with Filonenko's friction factor (Gnielinski) or Dittus-Boelter.

    References
    ----------
    .. [1] V. Gnielinski, "On heat transfer in tubes," Int. J. Heat Mass Transfer, vol. 63,
       pp. 134-140, 2013.

    Examples
    --------
    >>> empty_tube_nusselt(1100.0, 0.7, 1, False)
    3.66
    """
    if Re <= RE_LAMINAR:
        return NU_LAMINAR
    Re_t = max(Re, RE_TURBULENT)
    if method == EMPTY_DITTUS_BOELTER:
        Nu_t = dittus_boelter_1930(Re_t, Pr, heating)
    else:
        Nu_t = gnielinski_1976(Re_t, Pr, filonenko_1954(Re_t))
    if Re >= RE_TURBULENT:
        return Nu_t
    g = (Re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR)
    return (1.0 - g) * NU_LAMINAR + g * Nu_t


@njit(cache=True)
def leva_1949_1950(Re_p, dp_over_dt, heating):
    r"""Bed-side Nusselt number h d_t / k of a packed tube (Leva 1949 heating, 1950 cooling), [-].

    Parameters
    ----------
    Re_p : float
        Particle Reynolds number d_p G / mu, [-]
    dp_over_dt : float
        Particle-to-tube diameter ratio, [-]
    heating : bool
        True when the wall heats the gas (1949 form), False when it cools it (1950 form), [-]

    Returns
    -------
    Nu : float
        Nusselt number on the tube diameter, [-]

    Notes
    -----
    .. math::
        \frac{h d_t}{k} = 0.813\, Re_p^{0.9} e^{-6 d_p/d_t} \text{ (heating)}, \qquad
        3.50\, Re_p^{0.7} e^{-4.6 d_p/d_t} \text{ (cooling)}

    Coefficients of the one-dimensional model (from the mean bed temperature), so no radial
    lumping applies. Constants and validity (0.05 < d_p/d_t < 0.3, Re_p up to ~2000) as usually
    quoted, from memory: to be checked against the originals before a published test.

    References
    ----------
    .. [1] M. Leva, "Packed-tube heat transfer," Ind. Eng. Chem., vol. 41, p. 1206, 1949, and
       M. Leva et al., "Cooling of gases through packed tubes," Ind. Eng. Chem., 1950
       (citations from memory).

    Examples
    --------
    >>> round(leva_1949_1950(100.0, 0.1, True), 3), round(leva_1949_1950(100.0, 0.1, False), 3)
    (28.152, 55.5)
    """
    if heating:
        return 0.813 * Re_p ** 0.9 * math.exp(-6.0 * dp_over_dt)
    return 3.50 * Re_p ** 0.7 * math.exp(-4.6 * dp_over_dt)


@njit(cache=True)
def li_finlayson_1977(Re_p):
    r"""Wall Nusselt number h_w d_p / k of a packed bed of spheres (Li & Finlayson), [-].

    Parameters
    ----------
    Re_p : float
        Particle Reynolds number d_p G / mu, [-]

    Returns
    -------
    Nu_w : float
        Nusselt number on the particle diameter, [-]

    Notes
    -----
    .. math:: \frac{h_w d_p}{k} = 0.17\, Re_p^{0.79}

    The wall coefficient of the two-dimensional model (spheres; 20 < Re_p < 7600,
    0.05 < d_p/d_t < 0.3; constants and ranges as usually quoted, from memory). For the
    one-dimensional model it is lumped with the bed's radial conduction,
    :func:`lumped_wall_coefficient`.

    References
    ----------
    .. [1] C.-H. Li and B.A. Finlayson, "Heat transfer in packed beds - a reevaluation,"
       Chem. Eng. Sci., vol. 32, pp. 1055-1066, 1977.

    Examples
    --------
    >>> round(li_finlayson_1977(130.0), 4)
    7.9518
    """
    return 0.17 * Re_p ** 0.79


@njit(cache=True)
def lumped_wall_coefficient(h_w, radial_conductivity, radius):
    r"""One-dimensional bed-side coefficient from a wall coefficient and the radial conductivity, [W/(m^2*K)].

    Parameters
    ----------
    h_w : float
        Wall coefficient of the two-dimensional model, [W/(m^2*K)]
    radial_conductivity : float
        Effective radial conductivity lambda_er, [W/(m*K)]
    radius : float
        Tube inner radius R, [m]

    Returns
    -------
    h : float
        [W/(m^2*K)]

    Notes
    -----
    .. math:: \frac{1}{h} = \frac{1}{h_w} + \frac{R}{4 \lambda_{er}}

    the lumping of a parabolic radial profile (as in Froment & Bischoff, from memory); the
    same form as :func:`simulator.model.radial.lumped_coefficient`. Dixon's form,
    R/(3 lambda_er) (Bi + 3)/(Bi + 4), gives a few per cent less.

    Examples
    --------
    >>> round(lumped_wall_coefficient(125.0, 0.91, 0.0127), 2)
    87.04
    """
    return 1.0 / (1.0 / h_w + radius / (4.0 * radial_conductivity))


@njit(cache=True)
def gas_conductivity(T, F, fp, o):
    r"""Thermal conductivity of the gas at the local temperature and composition, [W/(m*K)].

    Parameters
    ----------
    T : float
        Temperature, [K]
    F : ndarray
        Molar flows, [mol/s]
    fp : ndarray
        Float parameters of the kernel, [-]
    o : int
        Offset of the coefficient block in fp, [-]

    Returns
    -------
    k : float
        Thermal conductivity, [W/(m*K)]

    Notes
    -----
    Given: a constant. Otherwise Cantera's pure-species fits :math:`k_i = \sqrt{T}\sum_c a_{ic}(\ln T)^c`
    combined by the rule of Cantera's mixture-averaged transport [1]_

    .. math:: k = \tfrac12\left(\sum_i x_i k_i + \Big(\sum_i x_i/k_i\Big)^{-1}\right)

    References
    ----------
    .. [1] S. Mathur, P.K. Tondon and S.C. Saxena, "Thermal conductivity of binary, ternary and
       quaternary mixtures of rare gases," Mol. Phys., vol. 12, pp. 569-579, 1967.
    """
    if fp[o + C_KMODE] != CONDUCTIVITY_FITS:
        return fp[o + C_KGAS]
    n = F.shape[0]
    base = o + N_COEF
    lnT = math.log(T)
    sqT = math.sqrt(T)
    Ft = 0.0
    for i in range(n):
        Ft += max(F[i], 0.0)
    linear = 0.0
    harmonic = 0.0
    for i in range(n):
        xi = max(F[i], 0.0) / Ft
        if xi == 0.0:
            continue
        b = base + 5 * i
        ki = sqT * (fp[b] + lnT * (fp[b + 1] + lnT * (fp[b + 2] + lnT * (fp[b + 3] + lnT * fp[b + 4]))))
        linear += xi * ki
        harmonic += xi / ki
    return 0.5 * (linear + 1.0 / harmonic)


@njit(cache=True)
def inside_coefficient(method, value, G, D, d_p, mu, cp, k, heating):
    r"""Inside (gas-side) coefficient h_i of one method, [W/(m^2*K)].

    Parameters
    ----------
    method : int
        One of the ``INSIDE_*``/``EMPTY_*``/``PACKED_*`` codes, [-]
    value : float
        The given h_i (``INSIDE_VALUE``), [W/(m^2*K)], or the bed's radial conductivity
        lambda_er (``PACKED_LI_FINLAYSON``), [W/(m*K)]
    G : float
        Mass velocity per tube cross-section, [kg/(m^2*s)]
    D : float
        Tube inner diameter, [m]
    d_p : float
        Particle diameter (packed bed), [m]
    mu : float
        Gas viscosity, [Pa*s]
    cp : float
        Gas heat capacity per mass, [J/(kg*K)]
    k : float
        Gas thermal conductivity, [W/(m*K)]
    heating : bool
        True when the wall heats the gas, [-]

    Returns
    -------
    h : float
        Inside coefficient, [W/(m^2*K)]
    """
    if method == INSIDE_VALUE:
        return value
    if method == EMPTY_GNIELINSKI or method == EMPTY_DITTUS_BOELTER:
        return empty_tube_nusselt(G * D / mu, cp * mu / k, method, heating) * k / D
    Re_p = G * d_p / mu
    if method == PACKED_LI_FINLAYSON:      # lambda_er is passed in ``value`` for this method
        return lumped_wall_coefficient(li_finlayson_1977(Re_p) * k / d_p, value, 0.5 * D)
    if method != PACKED_LEVA_AUTO:
        heating = method == PACKED_LEVA_1949
    return leva_1949_1950(Re_p, d_p / D, heating) * k / D


@njit(cache=True)
def overall_coefficient(h_i, fp, o):
    r"""U on the inner area from h_i and the packed constant resistances, [W/(m^2*K)].

    Parameters
    ----------
    h_i : float
        Inside coefficient, [W/(m^2*K)]
    fp : ndarray
        Float parameters of the kernel, [-]
    o : int
        Offset of the coefficient block in fp, [-]

    Returns
    -------
    U : float
        Overall coefficient on the inner area, [W/(m^2*K)]

    Notes
    -----
    ``fp[o + C_FACTOR]`` multiplies the series sum (1 in a case; the sensitivity screening varies it).
    """
    return fp[o + C_FACTOR] / (1.0 / h_i + fp[o + C_RFIN] + fp[o + C_RWALL] + fp[o + C_ROUT])
