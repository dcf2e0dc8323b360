"""Liquid-phase closure of the tube balances: density and concentrations (compiled for the kernel).

A liquid feed (``[thermo] equation_of_state = "liquid"``) has no gas law: the
concentrations follow from the liquid density and the constant mass flow,

.. math:: C_i = \\frac{F_i\\,\\rho(T)}{\\sum_j F_j M_j}, \\qquad
          \\rho(T) = \\rho_{ref}\\,[1 - \\beta\\,(T - T_{ref})]

independent of the pressure. The species enthalpies (and so the heat of reaction and
the heat capacity of the stream) are those of the case's custom species, read as
liquid-state values: h_i = h_f,i + c_p,i (T - 298.15 K).

References
----------
.. [1] O. Levenspiel, Chemical Reaction Engineering, 3rd ed. New York: Wiley, 1999,
   ch. 5 (plug flow of a constant-density fluid).
"""
from numba import njit

#: fp entries of the liquid law (set by simulator.model.build, see simulator.model.kernel)
#: are passed in as plain floats so this module does not depend on the kernel's layout.


@njit(cache=True)
def density(T, rho_ref, beta, T_ref):
    """Liquid density from the linear law rho_ref [1 - beta (T - T_ref)], [kg/m^3].

    Parameters
    ----------
    T : float
        Temperature, [K]
    rho_ref : float
        Density at T_ref, [kg/m^3]
    beta : float
        Volumetric expansion coefficient, [1/K]
    T_ref : float
        Temperature at which rho_ref holds, [K]

    Returns
    -------
    rho : float
        Density, [kg/m^3]

    Examples
    --------
    >>> density(310.0, 800.0, 1e-3, 300.0)
    792.0
    """
    return rho_ref * (1.0 - beta * (T - T_ref))


@njit(cache=True)
def total_concentration(T, Ft, mass_flow, rho_ref, beta, T_ref):
    """Total molar concentration rho F_T / m_dot of a liquid stream, [mol/m^3].

    Parameters
    ----------
    T : float
        Temperature, [K]
    Ft : float
        Total molar flow, [mol/s]
    mass_flow : float
        Mass flow (constant along the tube), [kg/s]
    rho_ref : float
        Density at T_ref, [kg/m^3]
    beta : float
        Volumetric expansion coefficient, [1/K]
    T_ref : float
        Temperature at which rho_ref holds, [K]

    Returns
    -------
    c : float
        Total concentration, [mol/m^3]
    """
    return density(T, rho_ref, beta, T_ref) * Ft / mass_flow
