"""NASA 7-coefficient polynomials: cp, h, s of one species (numba-compatible).

Coefficient row layout (15 floats, as Cantera's ``NasaPoly2.coeffs``):
``[T_mid, a1..a7 (T >= T_mid), a1..a7 (T < T_mid)]``.

A constant-heat-capacity species is written as the same row with only a1, a6
and a7 non-zero (see :func:`constant_cp_coefficients`), so one evaluator serves
both kinds.

References
----------
.. [1] B.J. McBride, M.J. Zehe, S. Gordon, "NASA Glenn coefficients for
   calculating thermodynamic properties of individual species",
   NASA/TP-2002-211556, 2002 (7-term form of the older NASA SP-273).
"""
import math

import numpy as np

from simulator.units import R, T_REF


def cp_R(coeffs, T):
    """Dimensionless heat capacity cp/R of one species.

    Parameters
    ----------
    coeffs : ndarray
        NASA-7 coefficient row of 15 floats, [-]
    T : float
        Temperature, [K]

    Returns
    -------
    cp_over_R : float
        Heat capacity over the gas constant, [-]

    Examples
    --------
    >>> round(float(cp_R(constant_cp_coefficients(150.0, 0.0), 500.0) * R), 6)
    150.0
    """
    o = 1 if T >= coeffs[0] else 8
    return coeffs[o] + T * (coeffs[o + 1] + T * (coeffs[o + 2] + T * (coeffs[o + 3] + T * coeffs[o + 4])))


def h_RT(coeffs, T):
    """Dimensionless enthalpy h/(R T) of one species (formation enthalpy included).

    Parameters
    ----------
    coeffs : ndarray
        NASA-7 coefficient row of 15 floats, [-]
    T : float
        Temperature, [K]

    Returns
    -------
    h_over_RT : float
        Molar enthalpy over R T, [-]
    """
    o = 1 if T >= coeffs[0] else 8
    return (coeffs[o] + T * (coeffs[o + 1] / 2 + T * (coeffs[o + 2] / 3 + T * (coeffs[o + 3] / 4
            + T * coeffs[o + 4] / 5))) + coeffs[o + 5] / T)


def s_R(coeffs, T):
    """Dimensionless standard entropy s°/R of one species at 1 atm.

    Parameters
    ----------
    coeffs : ndarray
        NASA-7 coefficient row of 15 floats, [-]
    T : float
        Temperature, [K]

    Returns
    -------
    s_over_R : float
        Standard molar entropy over R, [-]
    """
    o = 1 if T >= coeffs[0] else 8
    return (coeffs[o] * math.log(T) + T * (coeffs[o + 1] + T * (coeffs[o + 2] / 2 + T * (coeffs[o + 3] / 3
            + T * coeffs[o + 4] / 4))) + coeffs[o + 6])


def constant_cp_coefficients(cp, enthalpy_of_formation, standard_entropy=0.0, T0=T_REF):
    """NASA-7 row that reproduces a constant heat capacity exactly.

    Parameters
    ----------
    cp : float
        Molar heat capacity, [J/(mol*K)]
    enthalpy_of_formation : float
        Molar enthalpy at T0, [J/mol]
    standard_entropy : float
        Standard molar entropy at T0 and 1 atm, [J/(mol*K)]
    T0 : float
        Reference temperature of the given enthalpy and entropy, [K]

    Returns
    -------
    coeffs : ndarray
        Row of 15 floats, [-]

    Examples
    --------
    >>> c = constant_cp_coefficients(150.0, -60000.0)
    >>> round(float(h_RT(c, 700.0) * R * 700.0), 6)   # -60000 + 150 * (700 - 298.15)
    277.5
    """
    a1 = cp / R
    a6 = (enthalpy_of_formation - cp * T0) / R
    a7 = (standard_entropy - cp * math.log(T0)) / R
    row = np.zeros(15)
    row[0] = 1000.0
    row[1] = row[8] = a1
    row[6] = row[13] = a6
    row[7] = row[14] = a7
    return row
