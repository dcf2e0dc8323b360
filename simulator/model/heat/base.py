"""The interface every heat-exchange arrangement supplies (see :mod:`simulator.model.heat`)."""
from dataclasses import dataclass
from typing import Callable, Optional

NAN = float("nan")


@dataclass(frozen=True)
class Arrangement:
    """What the kernel builder and the energy closure need from one arrangement.

    Attributes
    ----------
    name : str
        The ``heat.medium.arrangement`` value ("" without a medium).
    kernel_code : int
        Heat branch of :func:`simulator.model.kernel.rhs` (``HEAT_*``).
    capacity_rate : callable
        (heat, count) -> signed medium capacity rate per tube C_m, [W/K]; 1.0 where unused.
    medium_at_inlet : callable
        heat -> medium temperature at z = 0, [K]; NaN when it is the unknown of a
        two-point boundary-value problem.
    medium_enthalpy_change : callable or None
        (heat, count, Tc_at_0, Tc_at_end) -> enthalpy gained by the medium of one tube, [W];
        None for a uniform bath (the energy closure then uses the wall duty).
    boundary_value : bool
        True when the medium's given temperature is at z = L (a two-point problem).
    kernel_tail : callable or None
        heat -> extra float parameters appended to ``fp`` (a given profile's table), or None.
    medium_along : callable or None
        (heat, z) -> the medium temperature at z when it is given rather than integrated, [K]
        (NaN where there is none); None: the kernel's Tc state is the medium temperature.
    """

    name: str
    kernel_code: int
    capacity_rate: Callable
    medium_at_inlet: Callable
    medium_enthalpy_change: Optional[Callable] = None
    boundary_value: bool = False
    kernel_tail: Optional[Callable] = None
    medium_along: Optional[Callable] = None


def unused_capacity(heat, count):
    """Capacity rate placeholder of arrangements without a flowing medium, [W/K]."""
    return 1.0


def flowing_enthalpy_change(sign):
    """Medium enthalpy gain C_m (Tc(L) - Tc(0)) with the signed capacity rate, as a closure (one tube)."""
    def change(heat, count, Tc_at_0, Tc_at_end):
        return sign * heat.medium_mass_flow * heat.medium_cp / count * (Tc_at_end - Tc_at_0)
    return change


def medium_capacity(sign):
    """Signed capacity rate sign * m_c cp_c / N_tubes per tube, [W/K], as a closure."""
    def capacity(heat, count):
        return sign * heat.medium_mass_flow * heat.medium_cp / count
    return capacity
