"""Isothermal effectiveness factor of a catalyst pellet (closed forms and asymptotes).

Plain functions of SI floats; the tube kernel does not call them yet. Every modulus here is
Aris-normalised: the characteristic length is L = V_p/S_p (slab: half-thickness, infinite
cylinder: R/2, sphere: R/3), so all shapes share the asymptote eta -> 1/Phi for Phi -> infinity.

References
----------
.. [1] E.W. Thiele, "Relation between catalytic activity and size of particle,"
   Ind. Eng. Chem., vol. 31, pp. 916-920, 1939 (from memory).
.. [2] R. Aris, The Mathematical Theory of Diffusion and Reaction in Permeable Catalysts,
   vol. 1, Clarendon Press, Oxford, 1975 (from memory).
.. [3] K.B. Bischoff, "Effectiveness factors for general reaction rate forms," AIChE J.,
   vol. 11, pp. 351-355, 1965 (from memory).
.. [4] P.B. Weisz, C.D. Prater, "Interpretation of measurements in experimental catalysis,"
   Adv. Catal., vol. 6, pp. 143-196, 1954 (from memory).
"""
import math

from scipy.special import i0e, i1e

#: V_p/S_p over the radius (or half-thickness) of each shape, [-]
LENGTH_OVER_RADIUS = {"slab": 1.0, "cylinder": 0.5, "sphere": 1.0 / 3.0}


def aris_modulus(k, effective_diffusivity, length):
    r"""First-order Thiele modulus in the Aris normalisation [2]_.

    Parameters
    ----------
    k : float
        First-order rate constant per pellet volume, [1/s]
    effective_diffusivity : float
        Effective diffusivity in the pellet, [m^2/s]
    length : float
        Characteristic length V_p/S_p, [m]

    Returns
    -------
    phi : float
        :math:`\Phi = L \sqrt{k/D_e}`, [-]

    Examples
    --------
    >>> aris_modulus(4.0, 1e-6, 1e-3)
    2.0
    """
    return length * math.sqrt(k / effective_diffusivity)


def generalized_modulus(k, order, surface_concentration, effective_diffusivity, length):
    r"""Generalized (Aris-Bischoff) modulus of an n-th order reaction [3]_.

    Parameters
    ----------
    k : float
        Rate constant per pellet volume, rate = k c^n, [mol/m^3/s]
    order : float
        Reaction order n in the key species, > -1, [-]
    surface_concentration : float
        Key species concentration at the pellet surface, [mol/m^3]
    effective_diffusivity : float
        Effective diffusivity of the key species, [m^2/s]
    length : float
        Characteristic length V_p/S_p, [m]

    Returns
    -------
    phi : float
        :math:`\Phi_n = L \sqrt{(n+1)/2 \; k c_s^{n-1} / D_e}`, [-]

    Notes
    -----
    For Phi_n -> infinity eta -> 1/Phi_n exactly for any order and shape [3]_. k here has the
    unit of the rate; with c_s^(n-1) the product k c_s^(n-1) is in 1/s.

    Examples
    --------
    >>> generalized_modulus(4.0, 1.0, 10.0, 1e-6, 1e-3)
    2.0
    """
    return length * math.sqrt(0.5 * (order + 1.0) * k * surface_concentration ** (order - 1.0)
                              / effective_diffusivity)


def effectiveness_first_order(phi, shape):
    r"""Effectiveness factor of an isothermal first-order reaction, closed forms [1]_ [2]_.

    Parameters
    ----------
    phi : float
        Aris-normalised Thiele modulus, > 0, [-]
    shape : str
        "slab", "cylinder" (infinite) or "sphere"

    Returns
    -------
    eta : float
        Effectiveness factor, [-]

    Notes
    -----
    In terms of the radius-based modulus phi_R = R sqrt(k/D_e):
    slab tanh(phi_R)/phi_R, cylinder 2 I1(phi_R)/(phi_R I0(phi_R)),
    sphere 3/phi_R (1/tanh(phi_R) - 1/phi_R). The Aris modulus is Phi = (L/R) phi_R.
    The sphere uses its series 1 - x^2/15 + 2 x^4/315 below phi_R = 1e-2 (cancellation).

    Examples
    --------
    >>> round(effectiveness_first_order(1.0, "slab"), 6)
    0.761594
    """
    if phi <= 0.0:
        raise ValueError(f"phi = {phi!r}: must be > 0")
    x = phi / LENGTH_OVER_RADIUS[shape]          # radius-based modulus
    if shape == "slab":
        return math.tanh(x) / x
    if shape == "cylinder":
        return 2.0 * float(i1e(x)) / (x * float(i0e(x)))
    if x < 1e-2:                                  # series: the closed form cancels below this
        return 1.0 - x * x / 15.0 + 2.0 * x ** 4 / 315.0
    return 3.0 / x * (1.0 / math.tanh(x) - 1.0 / x)


def effectiveness_zero_order_slab(phi):
    r"""Effectiveness factor of a zero-order reaction in a slab, exact [2]_.

    Parameters
    ----------
    phi : float
        Generalized modulus Phi_0 = L sqrt(k/(2 D_e c_s)), [-]

    Returns
    -------
    eta : float
        1 for Phi_0 <= 1 (reactant reaches the centre), 1/Phi_0 beyond (dead zone), [-]

    Examples
    --------
    >>> effectiveness_zero_order_slab(4.0)
    0.25
    """
    return 1.0 if phi <= 1.0 else 1.0 / phi


def weisz_prater_number(observed_rate, length, effective_diffusivity, surface_concentration):
    r"""Weisz-Prater number of an observed rate [4]_.

    Parameters
    ----------
    observed_rate : float
        Observed rate per pellet volume, [mol/m^3/s]
    length : float
        Characteristic length V_p/S_p, [m]
    effective_diffusivity : float
        Effective diffusivity of the key species, [m^2/s]
    surface_concentration : float
        Key species concentration at the surface, [mol/m^3]

    Returns
    -------
    N_WP : float
        :math:`r_{obs} L^2 / (D_e c_s) = \eta \Phi^2` for first order, [-]

    Notes
    -----
    Internal diffusion is negligible for N_WP << 1 (Weisz and Prater give 1 for first order
    with L = V_p/S_p; a stricter 0.3 is common practice, no source).

    Examples
    --------
    >>> weisz_prater_number(2.0, 1e-3, 1e-6, 10.0)
    0.2
    """
    return observed_rate * length * length / (effective_diffusivity * surface_concentration)
