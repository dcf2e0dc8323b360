"""Frozen dataclasses that describe a validated case, in SI floats.

A :class:`Case` is data only. It is built by :func:`simulator.case.load.load_case`
from a TOML file (or a raw dict) after every field was parsed and checked.

Nomenclature (units): lengths [m], temperatures [K], pressures [Pa, absolute],
molar flows [mol/s], mass flows [kg/s], molar masses [kg/mol], heat capacities
[J/(mol*K)], enthalpies [J/mol], heat-transfer coefficients [W/(m^2*K)].
"""
import math
from dataclasses import dataclass, field
from typing import Literal, Optional

from simulator.case.radial_keys import RadialSettings

EquationOfState = Literal["ideal-gas", "peng-robinson", "liquid"]
HeatMode = Literal["isothermal", "adiabatic", "exchange"]
MediumArrangement = Literal["", "uniform", "co-current", "counter-current", "wall-profile"]
PressureDropModel = Literal["none", "ergun", "pipe-friction"]
ActivityBasis = Literal["concentration", "partial-pressure"]
RateBasis = Literal["reactor-volume", "catalyst-mass"]
RateForm = Literal["power-law", "hougen-watson"]

NAN = float("nan")


@dataclass(frozen=True)
class CustomSpecies:
    """A component not taken from a species file: constant heat capacity.

    ``standard_entropy`` is needed only by reversible reactions (equilibrium
    constants); critical constants only by the Peng-Robinson equation of state.
    """

    name: str
    molar_mass: float            # [kg/mol]
    cp: float                    # [J/(mol*K)]
    enthalpy_of_formation: float  # [J/mol] at 298.15 K
    standard_entropy: float = NAN  # [J/(mol*K)] at 298.15 K, 1 atm
    critical_temperature: float = NAN  # [K]
    critical_pressure: float = NAN     # [Pa]
    acentric_factor: float = NAN       # [-]
    normal_boiling_point: float = NAN  # [K] at 1 atm (boiling check of a liquid feed)
    heat_of_vaporization: float = NAN  # [J/mol] (Clausius-Clapeyron vapour pressure from the boiling point)


@dataclass(frozen=True)
class Thermo:
    species_file: str | None            # as written; resolved path or bundled name in ``species_path``
    species_path: str | None            # file path, or a bundled Cantera data name
    equation_of_state: EquationOfState
    custom: tuple[CustomSpecies, ...] = ()
    critical: tuple[tuple[str, float, float, float], ...] = ()  # (name, Tc [K], Pc [Pa], omega [-]) overrides
    density: float = NAN                 # [kg/m^3] liquid density at density_at (equation_of_state = "liquid")
    density_at: float = NAN              # [K] temperature of ``density``; NaN -> the feed temperature
    expansion_coefficient: float = 0.0   # [1/K] beta of rho(T) = density [1 - beta (T - density_at)]


@dataclass(frozen=True)
class InhibitionTerm:
    """One inhibition term K_m(T) * prod(a_i^beta_i) of a Hougen-Watson denominator."""

    exponents: tuple[tuple[str, float], ...]   # (species, beta)
    pre_exponential: float                     # [activity^-sum(beta)], SI
    heat_of_adsorption: float                  # [J/mol]; K = K0 exp(-dH_ads/(R T))


@dataclass(frozen=True)
class Reaction:
    """One reaction with its rate law, parsed and in SI.

    The rate is the rate of the reaction as written (per unit extent):
    species i is produced at ``nu_i`` times it.
    """

    equation: str
    stoichiometry: tuple[tuple[str, float], ...]   # (species, nu) with nu < 0 for reactants
    reversible: bool
    form: RateForm
    pre_exponential: float          # SI units implied by orders, activity basis and rate basis
    activation_energy: float        # [J/mol]
    temperature_exponent: float     # [-] k = A (T/1 K)^b exp(-E/(R T))
    orders: tuple[tuple[str, float], ...]
    in_terms_of: ActivityBasis
    rate_basis: RateBasis
    inhibition: tuple[InhibitionTerm, ...] = ()
    inhibition_power: float = 1.0
    as_written: tuple[tuple[str, str], ...] = ()   # (key, text) for reports


@dataclass(frozen=True)
class Feed:
    temperature: float               # [K]
    pressure: float                  # [Pa]
    mole_fractions: tuple[tuple[str, float], ...]
    flow_kind: Literal["molar_flow", "mass_flow", "volumetric_flow"]
    flow_value: float                # [mol/s] | [kg/s] | [m^3/s] at feed T and P, whole reactor
    inlet_flows: tuple = ()          # [mol/s] whole reactor, in Case.species order: exact inlet of a train bed


@dataclass(frozen=True)
class Tube:
    length: float                    # [m]
    inner_diameter: float            # [m]
    count: int                       # [-]
    roughness: float = 0.0           # [m]
    orientation: str = "horizontal"  # "horizontal" | "vertical-up" | "vertical-down" (hydrostatic head)


@dataclass(frozen=True)
class Bed:
    particle_diameter: float         # [m]
    void_fraction: float             # [-]
    bulk_density: float              # [kg/m^3] catalyst mass per bed volume


@dataclass(frozen=True)
class ShellSide:
    """``[heat.coefficient.shell]``: a tube bank in crossflow for ``outside = "zukauskas-1972"`` (SI)."""

    velocity: float                      # [m/s] medium velocity approaching the bank
    transverse_pitch: float              # [m] S_T
    longitudinal_pitch: float            # [m] S_L
    layout: str                          # "inline" | "staggered"
    rows: int                            # [-] rows the flow crosses
    density: float                       # [kg/m^3] medium
    viscosity: float                     # [Pa*s] medium
    conductivity: float                  # [W/(m*K)] medium
    cp: float                            # [J/(kg*K)] medium


@dataclass(frozen=True)
class HeatCoefficient:
    """``[heat.coefficient]``: U from correlations instead of a typed ``overall_coefficient``.

    U is referred to the tube's inner wall (series sum, :mod:`simulator.model.heat_coefficient`);
    only the inside (process-side) coefficient varies along the tube.
    """

    inside: str                          # "auto" | a correlation name | "value"
    inside_value: float = NAN            # [W/(m^2*K)] when inside = "value" (written as a quantity)
    wall_thickness: float = 0.0          # [m]; 0: wall resistance neglected
    wall_conductivity: float = NAN       # [W/(m*K)]
    outside: float = math.inf            # h_o on the outer area [W/(m^2*K)]; inf: no outside resistance
    fouling_inside: float = 0.0          # [m^2*K/W]
    fouling_outside: float = 0.0         # [m^2*K/W]
    conductivity: float = NAN            # process-fluid thermal conductivity [W/(m*K)]; NaN: Cantera's fits
    factor: float = 1.0                  # multiplier on U (not a case key: sensitivity screening varies it) [-]
    shell: Optional[ShellSide] = None    # outside = "zukauskas-1972": the bank, h_o computed when built


@dataclass(frozen=True)
class Heat:
    """Heat exchange through the wall.

    ``mode = "exchange"`` couples the gas to a medium on the other side of the
    wall (cooling or heating); ``arrangement`` says how the medium runs:
    ``"uniform"`` (one temperature everywhere, e.g. a boiling or well-mixed
    shell), ``"co-current"`` (enters at z = 0 with ``medium_temperature``) or
    ``"counter-current"`` (enters at z = L with ``medium_temperature``: a two-point
    boundary-value problem, see :mod:`simulator.solve.counter_current`).
    """

    mode: HeatMode
    overall_coefficient: float = 0.0     # U [W/(m^2*K)] referred to the tube inner wall
    arrangement: MediumArrangement = ""  # "" unless mode == "exchange"
    medium_temperature: float = NAN      # [K] (inlet temperature: at z = 0 co-current, z = L counter-current)
    medium_mass_flow: float = NAN        # [kg/s] whole bundle (co-/counter-current)
    medium_cp: float = NAN               # [J/(kg*K)] (co-/counter-current)
    profile_quantity: str = ""           # "temperature" | "heat_flux" (wall-profile), else ""
    profile_position: tuple = ()         # [m] rows of [[heat.medium.profile]], 0 first, increasing
    profile_value: tuple = ()            # [K] wall/flue-gas temperature or [W/m^2] inner-wall heat flux
    coefficient: Optional[HeatCoefficient] = None   # [heat.coefficient]; None: the typed overall_coefficient

    @property
    def exchange(self):
        """True when the gas exchanges heat with a medium through the wall."""
        return self.mode == "exchange"


@dataclass(frozen=True)
class PressureDrop:
    model: PressureDropModel
    viscosity: float = NAN               # [Pa*s]; NaN -> from transport data
    friction_correlation: str = "churchill-1977"
    viscosity_activation_energy: float = NAN   # [J/mol] Andrade law of a liquid around ``viscosity``
    viscosity_at: float = NAN                  # [K] temperature of ``viscosity`` (default the feed's)


@dataclass(frozen=True)
class Design:
    key_species: str
    target_conversion: float = NAN       # [-]
    temperature_limit: float = NAN       # [K]
    max_pressure_drop: float = NAN       # [Pa]
    wall_temperature_limit: float = NAN  # [K] hottest tube wall allowed (alloy limit)
    products: tuple = ()                 # named products: yield and selectivity on the key species


@dataclass(frozen=True)
class SolverOptions:
    rtol: float = 1e-8
    atol_scale: float = 1e-10            # absolute tolerance relative to each variable's scale
    output_points: int = 401
    max_step: float = 0.0                # [m]; 0 -> automatic


@dataclass(frozen=True)
class AssumptionThresholds:
    isothermal: float = NAN              # [K]; NaN -> 0.1 R T^2 / E
    isobaric: float = 0.10               # [-] dP / P_feed
    ideal_gas: float = 0.05              # [-] max |Z - 1|
    constant_moles: float = 0.05         # [-] |epsilon|


@dataclass(frozen=True)
class Case:
    """A validated case: everything in SI, nothing left to parse."""

    title: str
    source_path: str                     # case file path ("" for a dict)
    thermo: Thermo
    reactions: tuple[Reaction, ...]
    feed: Feed
    tube: Tube
    heat: Heat
    pressure_drop: PressureDrop
    design: Design
    bed: Bed | None = None
    solver: SolverOptions = field(default_factory=SolverOptions)
    assumptions: AssumptionThresholds = field(default_factory=AssumptionThresholds)
    species: tuple[str, ...] = ()        # every species of the model, in a fixed order
    raw: dict = field(default_factory=dict, compare=False, repr=False)  # the case as written
    source: str = ""                     # source key of published data, if any
    train: tuple = ()                    # TrainBed entries of a reactor train (see simulator.case.train)
    radial: RadialSettings = field(default_factory=RadialSettings)   # [model] radial (simulator.case.radial_keys)
    catalyst: object = None              # Catalyst of [catalyst] (simulator.case.catalyst_keys), or None
    mechanism: object = None             # MechanismSpec of a [mechanism] case (simulator.case.mechanism_keys)


InterstageKind = Literal["cool-to", "heat-to", "quench"]


@dataclass(frozen=True)
class QuenchStream:
    """A quench stream of its own, mixed in at the bed outlet pressure."""

    temperature: float                           # [K]
    molar_flow: float                            # [mol/s] whole reactor
    mole_fractions: tuple[tuple[str, float], ...]


@dataclass(frozen=True)
class Interstage:
    """What happens between a bed and the next one (``[[train.after]]``).

    ``cool-to`` / ``heat-to``: the gas leaves at ``temperature``, flows and pressure unchanged.
    ``quench``: ``share`` of the fresh feed (bypassing the upstream beds, at ``temperature`` or
    the feed temperature), or ``stream``, mixed in adiabatically.
    """

    kind: InterstageKind
    temperature: float = NAN                     # [K] target, or quench temperature
    share: float = NAN                           # [-] share of the fresh feed (quench)
    stream: QuenchStream | None = None


@dataclass(frozen=True)
class TrainBed:
    """One bed of a reactor train: its own case (tube, bed, heat, pressure drop) and what follows it."""

    case: Case
    after: Interstage | None = None
