"""Given wall profile: a temperature Tw(z) on the far side of U, or a heat flux q''(z) on the inner wall.

For a furnace-heated coil the far side is the flue gas (or the measured tube-skin
temperature): ``[[heat.medium.profile]]`` rows of ``position`` and ``temperature``, joined by
straight lines, with q = U pi D (Tw(z) - T) [W/m] and U the typed ``overall_coefficient``
(flue gas -> process gas: outside radiation/convection, wall conduction and the inside film in
series, referred to the inner wall; with a skin temperature, the inside film alone). Rows of
``position`` and ``heat_flux`` give q = q''(z) pi D directly (W/m^2 of inner wall, a fired
coil's flux profile); there is then no medium temperature (reported as null).

Nothing flows on the far side, so there is no medium enthalpy balance: the energy closure uses
the integrated wall duty Q (as for a uniform bath). The kernel reads the table from the tail of
``fp`` (:func:`profile_table`, layout in :mod:`simulator.model.kernel`).
"""
import numpy as np

from simulator.model import kernel as K
from simulator.model.heat.base import Arrangement, unused_capacity

#: ``Heat.profile_quantity`` -> the kernel's profile kind
KINDS = {"temperature": K.PROFILE_TEMPERATURE, "heat_flux": K.PROFILE_HEAT_FLUX}


def profile_table(heat):
    """The profile table the kernel reads after the per-species tail of ``fp`` (see kernel.py), [-]."""
    z = np.asarray(heat.profile_position, dtype=float)
    v = np.asarray(heat.profile_value, dtype=float)
    return np.concatenate([[KINDS[heat.profile_quantity], len(z)], z, v])


def wall_temperature(heat, z):
    """The given wall temperature at positions z, [K]; NaN everywhere for a given heat flux.

    Parameters
    ----------
    heat : simulator.case.schema.Heat
        A ``wall-profile`` heat block
    z : ndarray
        Axial positions, [m]

    Returns
    -------
    Tw : ndarray
        Linear interpolation of the rows (end values held past the last row), [K]
    """
    z = np.asarray(z, dtype=float)
    if heat.profile_quantity != "temperature":
        return np.full(z.shape, np.nan)
    return np.interp(z, heat.profile_position, heat.profile_value)


def heat_flux(heat, z):
    """The given heat flux at positions z, [W/m^2]; NaN everywhere for a given temperature profile."""
    z = np.asarray(z, dtype=float)
    if heat.profile_quantity != "heat_flux":
        return np.full(z.shape, np.nan)
    return np.interp(z, heat.profile_position, heat.profile_value)


def _at_inlet(heat):
    # a given flux has no medium temperature: the kernel's Tc state is an unused constant (0 K)
    return float(heat.profile_value[0]) if heat.profile_quantity == "temperature" else 0.0


def uncovered_length(heat, length):
    """A one-line reason when the profile does not reach ``length`` [m], else None (never extrapolated)."""
    end = heat.profile_position[-1]
    if length > end * (1.0 + 1e-12):
        return (f"heat.medium.profile: the rows end at position = {end:g} m but the tube is {length:g} m long; "
                "a given profile is never extrapolated: add rows that cover the tube")
    return None


ARRANGEMENT = Arrangement(name="wall-profile", kernel_code=K.HEAT_PROFILE, capacity_rate=unused_capacity,
                          medium_at_inlet=_at_inlet, kernel_tail=profile_table, medium_along=wall_temperature)
