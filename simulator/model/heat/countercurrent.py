"""Counter-current medium: enters at z = L with ``temperature`` and flows against the gas.

Medium balance per tube, written along z: -C dTc/dz = -U pi D (Tc - T) with C = m_c cp_c / N_tubes,
i.e. the kernel's dTc/dz = -q / C_m with the signed C_m = -C. The medium temperature at z = 0
(its outlet) is unknown: a two-point boundary-value problem, solved by shooting on it in
:mod:`simulator.solve.counter_current`. The medium's enthalpy gain is C (Tc(0) - Tc(L)).
"""
from simulator.model import kernel as K
from simulator.model.heat.base import NAN, Arrangement, flowing_enthalpy_change, medium_capacity

ARRANGEMENT = Arrangement(name="counter-current", kernel_code=K.HEAT_FLOWING, capacity_rate=medium_capacity(-1.0),
                          medium_at_inlet=lambda heat: NAN, medium_enthalpy_change=flowing_enthalpy_change(-1.0),
                          boundary_value=True)
