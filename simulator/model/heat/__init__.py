"""Heat-exchange arrangements: what each one hands the compiled kernel and the checks.

The kernel (:mod:`simulator.model.kernel`) knows one wall flux, q = U pi D (Tc - T)
[W/m], and one medium derivative, dTc/dz = -q / C_m with a signed capacity rate
C_m [W/K] per tube. Each arrangement is a small module that supplies, through
:class:`Arrangement`:

* ``kernel_code``: which heat branch of the kernel runs (none, uniform medium, flowing medium);
* ``capacity_rate(heat, count)``: the signed C_m per tube, [W/K] (+ with the gas, - against it);
* ``medium_at_inlet(heat)``: the medium temperature at z = 0 when it is known there, [K]
  (NaN when it is the unknown of a two-point boundary-value problem);
* ``medium_enthalpy_change(heat, count, Tc_in, Tc_out)``: enthalpy gained by the medium of
  one tube between z = 0 and the end of the profile, [W], or None when the medium is a
  uniform bath (the closure then uses the wall duty).

Adding an arrangement means adding a module and a line in :data:`ARRANGEMENTS`; no branch
in the kernel or the builder. Two-point problems (counter-current) are solved around
``simulate()`` by :mod:`simulator.solve.counter_current`.
"""
from simulator.model.heat.base import Arrangement
from simulator.model.heat import cocurrent, countercurrent, none, uniform, wallprofile

#: ``heat.medium.arrangement`` -> Arrangement (with ``heat.mode = "exchange"``)
ARRANGEMENTS = {"uniform": uniform.ARRANGEMENT, "co-current": cocurrent.ARRANGEMENT,
                "counter-current": countercurrent.ARRANGEMENT, "wall-profile": wallprofile.ARRANGEMENT}
#: ``heat.mode`` without a medium -> Arrangement
WITHOUT_MEDIUM = {"adiabatic": none.ADIABATIC, "isothermal": none.ISOTHERMAL}


def arrangement_of(heat):
    """The :class:`Arrangement` of a case's ``[heat]``."""
    return ARRANGEMENTS[heat.arrangement] if heat.exchange else WITHOUT_MEDIUM[heat.mode]


__all__ = ["ARRANGEMENTS", "WITHOUT_MEDIUM", "Arrangement", "arrangement_of"]
