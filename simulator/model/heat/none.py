"""No medium: adiabatic tubes, and isothermal ones (whose duty is the kernel's integrated Q)."""
from simulator.model import kernel as K
from simulator.model.heat.base import NAN, Arrangement, unused_capacity

ADIABATIC = Arrangement(name="", kernel_code=K.HEAT_ADIABATIC, capacity_rate=unused_capacity,
                        medium_at_inlet=lambda heat: NAN)
ISOTHERMAL = Arrangement(name="", kernel_code=K.HEAT_ISOTHERMAL, capacity_rate=unused_capacity,
                         medium_at_inlet=lambda heat: NAN)
