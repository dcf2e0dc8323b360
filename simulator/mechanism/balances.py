"""Tube balances with a Cantera mechanism: right-hand side and its Jacobian.

State of one tube, as in :mod:`simulator.model.kernel`: ``y = [F_1..F_n, T, P, Tc, Q]``
(mol/s, K, Pa, K, W). Steady plug flow, ideal gas, kinetic energy and the acceleration
term neglected::

    dF_k/dz = A_r w_k(T, P, x)                                   x = F / F_T
    dT/dz   = [q - A_r sum_k h_k w_k] / sum_k F_k cp_k           (0 when isothermal)
    dP/dz   = Ergun (with [bed]) | Darcy-Weisbach with a friction factor | 0
    dTc/dz  = -q / C_m (co-current medium) | 0 (uniform medium)
    dQ/dz   = q | sum_k h_k dF_k/dz (isothermal: the duty that holds T)
    q       = U pi D (Tc - T)                                    [W/m]

w_k are Cantera's net production rates [mol/(m^3 s)], h_k and cp_k its partial molar
enthalpies [J/mol] and heat capacities [J/(mol K)] (ideal gas). A_r is the volume the gas
reacts in per metre: the cross-section A, times the void fraction in a packed bed (the
mechanism's reactions are homogeneous gas-phase reactions).

Jacobian: the flow rows from Cantera's rate derivatives (``net_production_rates_ddX``,
``_ddT``, ``_ddP``, ``_ddC``) with ``derivative_settings`` skipping third-body and
falloff terms (an approximate Jacobian; Newton only needs an approximation). Cantera's ddT
and ddP are taken at constant molar concentration, so the derivatives at constant x are
``dw/dT|P,x = ddT - ddC C/T`` and ``dw/dP|T,x = ddP + ddC C/P`` (C = P/(R T)); with x = F/F_T,
``dw/dF_j = ddX (e_j - x) / F_T``. The temperature row uses those and d(h_k)/dT = cp_k; the
pressure row is a forward difference of the (cheap) friction law in T and P.

References: the balances are the usual plug-flow balances (G. F. Froment, K. B. Bischoff and
J. De Wilde, Chemical Reactor Analysis and Design, 3rd ed., Wiley, 2011, ch. 9, from memory);
rates and thermo: Cantera (D. G. Goodwin et al., Cantera 3.2, doi:10.5281/zenodo.8137090).
"""
import math

import numpy as np

from simulator.model.heat import arrangement_of
from simulator.model.pressure_drop import (FRICTION_CODES, darcy_weisbach, ergun_1952, friction_factor_by_code)
from simulator.units import R as R_GAS

#: Cantera works in kmol; tubesim in mol.
KMOL = 1000.0
APPROXIMATE_JACOBIAN = {"skip-third-bodies": True, "skip-falloff": True}


class MechanismTube:
    """Balances of one tube of a mechanism case (per-tube flows, SI).

    Parameters
    ----------
    case : simulator.case.schema.Case
        A validated case with ``case.mechanism`` set.
    gas : cantera.Solution
        The kept species and reactions (:func:`simulator.case.mechanism_keys.mechanism_solution`);
        its state is set on every call.
    """

    def __init__(self, case, gas):
        self.case = case
        self.gas = gas
        self.n = gas.n_species
        self.count = case.tube.count
        D = case.tube.inner_diameter
        self.D = D
        self.area = math.pi * D * D / 4.0
        self.reacting_area = self.area * (case.bed.void_fraction if case.bed is not None else 1.0)
        self.perimeter = math.pi * D
        heat = case.heat
        self.U = heat.overall_coefficient if heat.exchange else 0.0
        self.isothermal = 1.0 if heat.mode == "isothermal" else 0.0
        arrangement = arrangement_of(heat)
        flowing = heat.exchange and arrangement.medium_enthalpy_change is not None
        # dTc/dz = medium_factor * q: -1/C_m for a flowing medium, 0 for a uniform one
        self.medium_factor = -1.0 / arrangement.capacity_rate(heat, self.count) if flowing else 0.0
        self.medium_inlet = arrangement.medium_at_inlet(heat) if heat.exchange else float("nan")
        self.molar_mass = gas.molecular_weights / KMOL                 # [kg/mol]
        self.y0, self.mass_flow = self._inlet()
        self.G = self.mass_flow / self.area                              # [kg/(m^2 s)]
        pd = case.pressure_drop
        self.friction = pd.model
        self.viscosity_given = pd.viscosity
        self.friction_code = FRICTION_CODES.get(pd.friction_correlation, 0)
        self.relative_roughness = case.tube.roughness / D
        self.nfev = 0
        self.njev = 0
        self.last_z = 0.0

    # ------------------------------------------------------------------ inlet
    def _inlet(self):
        feed = self.case.feed
        gas = self.gas
        x = np.zeros(self.n)
        for s, v in feed.mole_fractions:
            x[gas.species_index(s)] = v
        M = float(x @ self.molar_mass)
        T, P = feed.temperature, feed.pressure
        if feed.flow_kind == "molar_flow":
            F_T = feed.flow_value
        elif feed.flow_kind == "mass_flow":
            F_T = feed.flow_value / M
        else:                                   # volumetric flow at feed T and P (ideal gas)
            F_T = feed.flow_value * P / (R_GAS * T)
        F_T /= self.count
        Tc0 = self.medium_inlet if self.case.heat.exchange else T
        y0 = np.concatenate([x * F_T, [T, P, Tc0, 0.0]])
        return y0, F_T * M

    # ------------------------------------------------------------------ state
    def set_state(self, y):
        """Put the state's T, P and composition into the Cantera object; returns (F, F_T)."""
        n = self.n
        F = y[:n]
        F_T = float(F.sum())
        self.gas.set_unnormalized_mole_fractions(F / F_T)
        self.gas.TP = y[n], y[n + 1]
        return F, F_T

    def viscosity(self):
        """Gas viscosity at the current state, [Pa s]: the given one, else Cantera's mixture rule."""
        return self.viscosity_given if not math.isnan(self.viscosity_given) else self.gas.viscosity

    def pressure_gradient(self, T, P, M, mu):
        """dP/dz [Pa/m] at T [K], P [Pa], mean molar mass M [kg/mol] and viscosity mu [Pa s]."""
        if self.friction == "none":
            return 0.0
        rho = P * M / (R_GAS * T)
        u = self.G / rho
        if self.friction == "ergun":
            bed = self.case.bed
            return ergun_1952(u, rho, mu, bed.particle_diameter, bed.void_fraction)
        Re = self.G * self.D / mu
        f = friction_factor_by_code(self.friction_code, Re, self.relative_roughness)
        return darcy_weisbach(f, rho, u, self.D)

    def wall_flux(self, T, Tc):
        """Heat into the gas per metre of one tube, [W/m]."""
        return self.U * self.perimeter * (Tc - T)

    # ------------------------------------------------------------------ right-hand side
    def rhs(self, z, y, dy):
        """Fill ``dy`` with dy/dz at (z, y) (the scikit-sundae signature)."""
        self.nfev += 1
        self.last_z = z
        n = self.n
        gas = self.gas
        F, F_T = self.set_state(y)
        T, P, Tc = y[n], y[n + 1], y[n + 2]
        w = gas.net_production_rates * KMOL
        h = gas.partial_molar_enthalpies / KMOL
        cp = gas.partial_molar_cp / KMOL
        dF = self.reacting_area * w
        q = self.wall_flux(T, Tc)
        chem = float(h @ dF)
        heat_capacity = float(F @ cp)
        dy[:n] = dF
        dy[n] = (1.0 - self.isothermal) * (q - chem) / heat_capacity
        M = self.mass_flow / F_T
        dy[n + 1] = self.pressure_gradient(T, P, M, self.viscosity() if self.friction != "none" else 1.0)
        dy[n + 2] = self.medium_factor * q
        dy[n + 3] = self.isothermal * chem + (1.0 - self.isothermal) * q

    def derivative(self, z, y):
        """dy/dz as a new array."""
        dy = np.empty_like(y)
        self.rhs(z, y, dy)
        return dy

    # ------------------------------------------------------------------ Jacobian
    def jacobian(self, z, y, fy, J):
        """Fill ``J[i, j] = d(dy_i/dz)/dy_j`` (approximate, see the module docstring)."""
        self.njev += 1
        n = self.n
        gas = self.gas
        F, F_T = self.set_state(y)
        T, P, Tc = y[n], y[n + 1], y[n + 2]
        x = F / F_T
        saved = gas.derivative_settings
        gas.derivative_settings = APPROXIMATE_JACOBIAN
        try:
            ddX = gas.net_production_rates_ddX
            ddT = gas.net_production_rates_ddT
            ddP = gas.net_production_rates_ddP
            ddC = gas.net_production_rates_ddC
        finally:
            gas.derivative_settings = saved
        if hasattr(ddX, "toarray"):
            ddX = ddX.toarray()
        C = gas.density_mole
        dw_dF = KMOL * (ddX - np.outer(ddX @ x, np.ones(n))) / F_T       # ddX (e_j - x) / F_T
        dw_dT = KMOL * (ddT - ddC * C / T)
        dw_dP = KMOL * (ddP + ddC * C / P)
        w = gas.net_production_rates * KMOL
        h = gas.partial_molar_enthalpies / KMOL
        cp = gas.partial_molar_cp / KMOL
        A = self.reacting_area
        J[:, :] = 0.0
        J[:n, :n] = A * dw_dF
        J[:n, n] = A * dw_dT
        J[:n, n + 1] = A * dw_dP
        q = self.wall_flux(T, Tc)
        dq_dT, dq_dTc = -self.U * self.perimeter, self.U * self.perimeter
        chem = A * float(h @ w)
        Ccp = float(F @ cp)
        dchem_dF = A * (h @ dw_dF)
        dchem_dT = A * (h @ dw_dT + cp @ w)
        dchem_dP = A * (h @ dw_dP)
        live = 1.0 - self.isothermal
        num = q - chem
        J[n, :n] = live * (-dchem_dF - num / Ccp * cp) / Ccp
        J[n, n] = live * (dq_dT - dchem_dT) / Ccp
        J[n, n + 1] = live * (-dchem_dP) / Ccp
        J[n, n + 2] = live * dq_dTc / Ccp
        if self.friction != "none":
            M = self.mass_flow / F_T
            mu = self.viscosity()
            g0 = fy[n + 1]
            for col, (dT, dP) in ((n, (1e-6 * T, 0.0)), (n + 1, (0.0, 1e-6 * P))):
                J[n + 1, col] = (self.pressure_gradient(T + dT, P + dP, M, mu) - g0) / (dT + dP)
        J[n + 2, n] = self.medium_factor * dq_dT
        J[n + 2, n + 2] = self.medium_factor * dq_dTc
        iso = self.isothermal
        J[n + 3, :n] = iso * dchem_dF
        J[n + 3, n] = iso * dchem_dT + live * dq_dT
        J[n + 3, n + 1] = iso * dchem_dP
        J[n + 3, n + 2] = live * dq_dTc

    # ------------------------------------------------------------------ tolerances
    def absolute_tolerance(self, atol_scale):
        """Per-variable absolute tolerance: ``atol_scale`` times each variable's scale."""
        n = self.n
        F_T, T0, P0 = float(self.y0[:n].sum()), self.y0[n], self.y0[n + 1]
        scale = np.concatenate([np.full(n, F_T), [T0, P0, T0, F_T * R_GAS * T0 * 10.0]])
        return scale * atol_scale
