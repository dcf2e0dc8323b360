"""Case + species data -> the packed arrays the compiled kernel integrates.

This is the one place that turns a validated :class:`~simulator.case.schema.Case`
into numbers per tube: feed split evenly over the tubes, mass velocity, viscosity
law, rate-constant arrays and critical constants.
"""
import math
import sys
from dataclasses import dataclass

import numpy as np

from simulator.errors import CaseError, ThermoError
from simulator.model import kernel as K
from simulator.model.adiabatic import adiabatic_rise
from simulator.model.heat import arrangement_of
from simulator.thermo.critical import critical_constants
from simulator.thermo.species_data import SpeciesData, build_species_data, mixture_viscosity, viscosity_fits
from simulator.units import R

DP_CODES = {"none": K.DP_NONE, "ergun": K.DP_ERGUN, "pipe-friction": K.DP_PIPE}
FRICTION_CODES = {"churchill-1977": 0, "colebrook-1939": 1, "blasius-1913": 2, "laminar": 3}


@dataclass(frozen=True)
class Model:
    """Everything the integrator needs for one tube, plus the names to read it back.

    ``args`` is the tuple of arrays passed to :func:`simulator.model.kernel.rhs`.
    """

    case: object
    species: SpeciesData
    args: tuple
    y0: np.ndarray
    scale: np.ndarray          # typical magnitude of each state variable (for atol)
    key_index: int
    count: int
    area: float                # [m^2] cross-section of one tube
    feed_molar_flow: float     # [mol/s] whole reactor
    viscosity_note: str
    critical_sources: tuple    # where each species' critical constants came from (or "")
    adiabatic: tuple = (float("nan"), {})   # (rise [K], info) for complete conversion of the key species

    @property
    def n(self):
        return len(self.species.names)


def feed_molar_flow(case, species):
    """Total feed molar flow of the whole reactor from the case's flow spec, [mol/s]."""
    x = np.array([dict(case.feed.mole_fractions).get(s, 0.0) for s in species.names])
    kind, value = case.feed.flow_kind, case.feed.flow_value
    if kind == "molar_flow":
        return value
    if kind == "mass_flow":
        return value / float(x @ species.molar_mass)
    if case.thermo.equation_of_state == "liquid":   # volumetric flow of the liquid at the feed temperature
        th = case.thermo
        T_ref = case.feed.temperature if np.isnan(th.density_at) else th.density_at
        rho = float(K.liquid.density(case.feed.temperature, th.density, th.expansion_coefficient, T_ref))
        return value * rho / float(x @ species.molar_mass)
    # volumetric flow at feed T and P with the case's equation of state
    Z = 1.0
    if case.thermo.equation_of_state == "peng-robinson":
        crit, _ = critical_constants(case, species)
        Z = K.pr_departure(case.feed.temperature, case.feed.pressure, x, crit)[0]
    return value * case.feed.pressure / (Z * R * case.feed.temperature)


def build_model(case, species=None, constant_moles=False):
    """Pack a validated case into kernel arrays.

    Parameters
    ----------
    case : simulator.case.schema.Case
    species : SpeciesData, optional
        Reuse already loaded species data (sweeps).
    constant_moles : bool
        Neglect the mole change in the concentrations (assumption check only).

    Returns
    -------
    Model
    """
    if case.mechanism is not None:      # runs in simulator.mechanism, not in the compiled kernel
        raise CaseError(f"{case.source_path}: mechanism: not yet for mechanism cases (this verb runs the compiled "
                        "kernel, which has no Cantera mechanism); run works.")
    species = species or build_species_data(case.species, case.thermo)
    names = species.names
    n, m = len(names), len(case.reactions)
    index = {s: i for i, s in enumerate(names)}
    tube = case.tube
    with np.errstate(all="ignore"):     # extreme inputs give inf/0 here, refused just below
        area = float(np.pi * np.float64(tube.inner_diameter) ** 2 / 4.0)
        F_total = float(feed_molar_flow(case, species))
        x0 = np.array([dict(case.feed.mole_fractions).get(s, 0.0) for s in names])
        F0 = x0 * F_total / tube.count
        if case.feed.inlet_flows:        # a train bed: the upstream outlet, passed exactly
            F0 = np.array(case.feed.inlet_flows, dtype=float) / tube.count
        G = float(np.float64(F0 @ species.molar_mass) / area) if area > 0 else math.inf
    _check_magnitudes(case, area, F_total, G)

    nu = np.zeros((n, m))
    ordr = np.zeros((n, m))
    rexp = np.zeros((n, m))
    rx = np.zeros((m, K.N_RX))
    kmax = max([len(r.inhibition) for r in case.reactions] + [1])
    ads = np.zeros((m, kmax, 2 + n))
    for j, r in enumerate(case.reactions):
        for s, v in r.stoichiometry:
            nu[index[s], j] = v
        for s, o in r.orders:
            ordr[index[s], j] = o
        rexp[:, j] = ordr[:, j] + nu[:, j] if r.reversible else 0.0
        basis = case.bed.bulk_density if r.rate_basis == "catalyst-mass" else 1.0
        rx[j] = [r.pre_exponential, r.temperature_exponent, r.activation_energy,
                 1.0 if r.in_terms_of == "partial-pressure" else 0.0, basis,
                 1.0 if r.reversible else 0.0, nu[:, j].sum(), r.inhibition_power, len(r.inhibition)]
        for t, a in enumerate(r.inhibition):
            ads[j, t, 0] = a.pre_exponential
            ads[j, t, 1] = a.heat_of_adsorption
            for s, e in a.exponents:
                ads[j, t, 2 + index[s]] = e

    crit, crit_sources = critical_constants(case, species)
    eos = K.EOS_PR if case.thermo.equation_of_state == "peng-robinson" else K.EOS_IDEAL
    if eos == K.EOS_PR:
        missing = [s for s, src in zip(names, crit_sources) if not src]
        if missing:
            raise CaseError(f"{case.source_path}: thermo.equation_of_state = \"peng-robinson\": no critical "
                            f"constants for {', '.join(missing)}; give them under [thermo.critical.NAME] "
                            "(critical_temperature, critical_pressure, acentric_factor).")

    heat = case.heat
    exchange = arrangement_of(heat)
    tail = exchange.kernel_tail(heat) if exchange.kernel_tail else np.zeros(0)   # a given profile's table
    if exchange.kernel_tail:
        check_profile_covers(case, tube.length)
    fp = np.zeros(K.N_FP + 5 * n + 2 * n * n + tail.size)       # fixed entries, the per-species tail, then it
    fp[K.profile_tail(n):] = tail
    fp[K.F_AREA] = area
    fp[K.F_DIAM] = tube.inner_diameter
    fp[K.F_U] = heat.overall_coefficient
    fp[K.F_TC] = heat.medium_temperature
    fp[K.F_MCP] = exchange.capacity_rate(heat, tube.count)
    fp[K.F_ROUGH] = tube.roughness
    from simulator.case.load import GRAVITY_ALONG

    fp[K.F_GSIN] = GRAVITY_ALONG[tube.orientation]
    fp[K.F_G] = G
    fp[K.F_PMIN] = 1e-3 * case.feed.pressure
    fp[K.F_T0] = case.feed.temperature
    fp[K.F_P0] = case.feed.pressure
    fp[K.F_FT0] = F0.sum()
    liquid = case.thermo.equation_of_state == "liquid"
    if liquid:
        fp[K.F_RHOL], fp[K.F_BETA] = case.thermo.density, case.thermo.expansion_coefficient
        fp[K.F_TRHO] = case.feed.temperature if np.isnan(case.thermo.density_at) else case.thermo.density_at
    if case.bed is not None:
        fp[K.F_RHOB] = case.bed.bulk_density
        fp[K.F_EPS] = case.bed.void_fraction
        fp[K.F_DP] = case.bed.particle_diameter
    note = ""
    fp[K.F_MUT0] = case.feed.temperature
    fp[K.F_MU0] = 1.0
    correlated = heat.coefficient is not None and heat.coefficient.inside != "value"
    needs_viscosity = case.pressure_drop.model != "none" or correlated
    if needs_viscosity and liquid and np.isnan(case.pressure_drop.viscosity):
        raise CaseError(f"{case.source_path}: pressure_drop.viscosity: missing; a liquid feed needs its viscosity "
                        "(e.g. \"1.2e-3 Pa*s\") for its friction and heat-transfer coefficient: there are no "
                        "transport data for liquids")
    if needs_viscosity:
        note = _viscosity_law(case, species, fp, x0)
    pellet_at = 0
    if getattr(case, "catalyst", None) is not None:     # [catalyst]: the pellet block at the end of fp
        from simulator.model.pellet_block import pellet_block

        pellet_at = fp.size
        fp = np.concatenate([fp, pellet_block(case, names)])
    coefficient_at = 0
    if heat.coefficient is not None:      # U(z) from correlations: its block goes at the end of fp
        from simulator.model.heat.coefficient import coefficient_block

        coefficient_at = fp.size
        fp = np.concatenate([fp, coefficient_block(case, species)])

    ip = np.array([n, m, exchange.kernel_code, DP_CODES[case.pressure_drop.model],
                   FRICTION_CODES[case.pressure_drop.friction_correlation], eos, kmax,
                   1 if constant_moles else 0, K.PHASE_LIQUID if liquid else K.PHASE_GAS, coefficient_at, pellet_at],
                  dtype=np.int64)
    # the medium at z = 0; a counter-current medium's is the unknown of the shooting method
    # (simulator.solve.counter_current sets it), its inlet temperature at z = L stands in here
    Tc0 = exchange.medium_at_inlet(heat)
    if math.isnan(Tc0):
        Tc0 = heat.medium_temperature if heat.exchange else case.feed.temperature
    y0 = np.concatenate([F0, [case.feed.temperature, case.feed.pressure, Tc0, 0.0]])
    if coefficient_at:    # a representative U (at the feed) for the estimates that need one number (NTU)
        fp[K.F_U] = K.wall_coefficient(y0[n], y0[n + 1], Tc0, F0, ip, fp, np.ascontiguousarray(species.nasa7),
                                     species.molar_mass)[0]
    Ft0 = F0.sum()
    cp_scale = Ft0 * 30.0 * max(case.feed.temperature, 300.0)
    scale = np.concatenate([np.full(n, Ft0), [case.feed.temperature, case.feed.pressure, max(Tc0, 1.0),
                                              cp_scale]])
    args = (ip, fp, np.ascontiguousarray(species.nasa7), species.molar_mass.copy(), nu, ordr, rexp, rx, ads, crit)
    key = index[case.design.key_species]
    return Model(case=case, species=species, args=args, y0=y0, scale=scale,
                 key_index=key, count=tube.count, area=area,
                 feed_molar_flow=F_total, viscosity_note=note, critical_sources=tuple(crit_sources),
                 adiabatic=adiabatic_rise(F0, case.feed.temperature, nu, key, args[2]))


def check_profile_covers(case, length):
    """Refuse to integrate a given wall profile beyond its last row (e.g. ``size`` lengthening the tube)."""
    from simulator.model.heat.wallprofile import uncovered_length

    problem = uncovered_length(case.heat, length) if case.heat.arrangement == "wall-profile" else None
    if problem:
        raise CaseError(f"{case.source_path}: {problem}.")


def _check_magnitudes(case, area, F_total, G):
    """Refuse numbers the balances cannot be written with (a CaseError naming the field).

    The loader checks plausible ranges; this is the last line for cases built otherwise: a
    cross-section, feed flow or mass velocity that underflows to zero or overflows to inf.
    """
    where = case.source_path
    D = case.tube.inner_diameter
    if not (area > 0 and math.isfinite(area)):
        raise CaseError(f"{where}: tube.inner_diameter = {D:g} m: its cross-section ({area:g} m^2) is not a "
                        "finite positive number; give the inner diameter of a real tube")
    if not (F_total > 0 and math.isfinite(F_total)):
        raise CaseError(f"{where}: feed flow: the molar flow ({F_total:g} mol/s) is not a finite positive "
                        "number; give a feed flow of a real reactor")
    per_tube = F_total / case.tube.count
    if per_tube * case.solver.atol_scale < 1e6 * sys.float_info.min:
        raise CaseError(f"{where}: feed flow: {per_tube:g} mol/s per tube is too small to integrate (its absolute "
                        f"tolerance would be a subnormal number below {1e6 * sys.float_info.min:.3g}); give a feed "
                        "flow of a real reactor")
    if not (G > 0 and math.isfinite(G)):
        raise CaseError(f"{where}: tube.inner_diameter = {D:g} m with the feed flow {F_total:g} mol/s: the mass "
                        f"velocity ({G:g} kg/(m^2*s)) is not a finite positive number")


def _viscosity_law(case, species, fp, x0):
    """Fill the viscosity entries of ``fp`` (see :func:`simulator.model.kernel.viscosity`); returns the note.

    A viscosity given in the case is used as a constant. Otherwise the viscosity follows the
    local temperature and composition: Cantera's pure-species fits of its transport data,
    combined by Wilke's rule in the kernel (the mixture-averaged rule of Cantera itself).
    ``F_MU0`` and ``F_MUEXP`` then hold the feed gas's law mu0 (T/T_feed)^a for reference (the
    note, and sweeps that map parameters as this function does); the kernel does not use them.
    """
    pd = case.pressure_drop
    if not np.isnan(pd.viscosity) and not np.isnan(pd.viscosity_activation_energy):
        fp[K.F_MUMODE] = K.VISCOSITY_ANDRADE
        T_ref = case.feed.temperature if np.isnan(pd.viscosity_at) else pd.viscosity_at
        fp[K.F_MU0], fp[K.F_MUT0] = pd.viscosity, T_ref
        fp[K.F_MUEXP] = pd.viscosity_activation_energy / R
        return (f"Andrade law mu = {pd.viscosity:.4g} Pa*s exp(E/R (1/T - 1/{T_ref:.6g} K)), E = "
                f"{pd.viscosity_activation_energy / 1e3:.4g} kJ/mol (Andrade 1930)")
    if not np.isnan(pd.viscosity):
        fp[K.F_MUMODE] = K.VISCOSITY_CONSTANT
        fp[K.F_MU0], fp[K.F_MUEXP] = pd.viscosity, 0.0
        return "given in the case (constant)"
    T0, P0 = case.feed.temperature, case.feed.pressure
    try:
        fits = viscosity_fits(species, case.thermo)
        mu0 = mixture_viscosity(species, case.thermo, T0, P0, x0)
        mu1 = mixture_viscosity(species, case.thermo, T0 + 100.0, P0, x0)
    except ThermoError as err:
        raise CaseError(f"{case.source_path}: pressure_drop.viscosity: {err}") from err
    n = len(species.names)
    M = species.molar_mass
    base = K.F_VISC
    fp[K.F_MUMODE] = K.VISCOSITY_WILKE
    fp[K.F_MU0], fp[K.F_MUEXP] = mu0, float(np.log(mu1 / mu0) / np.log((T0 + 100.0) / T0))
    fp[base:base + 5 * n] = fits.ravel()
    fp[base + 5 * n:base + 5 * n + n * n] = ((M[None, :] / M[:, None]) ** 0.25).ravel()
    fp[base + 5 * n + n * n:base + 5 * n + 2 * n * n] = (1.0 / np.sqrt(8.0 * (1.0 + M[:, None] / M[None, :]))).ravel()
    return (f"local temperature and composition: pure-species viscosities from Cantera's transport data "
            f"(its fits in ln T) combined by Wilke's rule (Wilke 1950); {mu0:.4g} Pa*s for the feed at {T0:.1f} K")
