"""Uniform medium: one temperature all along the tube (a boiling or well-mixed shell side).

dTc/dz = 0; the energy closure uses the integrated wall duty Q.
"""
from simulator.model import kernel as K
from simulator.model.heat.base import Arrangement, unused_capacity

ARRANGEMENT = Arrangement(name="uniform", kernel_code=K.HEAT_UNIFORM, capacity_rate=unused_capacity,
                          medium_at_inlet=lambda heat: heat.medium_temperature)
