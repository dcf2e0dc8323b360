"""Co-current medium: enters at z = 0 with ``temperature`` and flows with the gas.

Medium balance per tube: C_m dTc/dz = -U pi D (Tc - T), C_m = m_c cp_c / N_tubes > 0.
An initial-value problem: the medium temperature at z = 0 is given.
"""
from simulator.model import kernel as K
from simulator.model.heat.base import Arrangement, flowing_enthalpy_change, medium_capacity

ARRANGEMENT = Arrangement(name="co-current", kernel_code=K.HEAT_FLOWING, capacity_rate=medium_capacity(+1.0),
                          medium_at_inlet=lambda heat: heat.medium_temperature,
                          medium_enthalpy_change=flowing_enthalpy_change(+1.0))
