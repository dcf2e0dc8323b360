"""Plausible ranges of the dimensional inputs of a case, in SI.

A value outside its range is refused at load time: the one-dimensional
pseudo-homogeneous tube model, its correlations and its floating-point
arithmetic cannot give a meaningful answer there (a feed at 1e-300 K, a tube of
1e200 m, a flow of 1e-310 mol/s). The ranges are wide on purpose: they fence
off nonsense and typing slips, not unusual designs. They are common practice,
no source; each is listed in the README (section "Plausible ranges").

Flows are bounded per tube from below (the whole-reactor flow divided by the
tube count), far above the denormal numbers where the arithmetic loses meaning,
and for the whole reactor from above.
"""

#: field path pattern -> (lowest, highest) in SI base units, both included.
RANGES = {
    "feed.temperature": (150.0, 3500.0),                    # [K]
    "heat.medium.temperature": (150.0, 3500.0),             # [K]
    "design.temperature_limit": (150.0, 3500.0),            # [K]
    "design.wall_temperature_limit": (150.0, 3500.0),       # [K]
    "feed.pressure": (1.0e3, 1.0e8),                        # [Pa]: 1 kPa to 1000 bar
    "design.max_pressure_drop": (1.0, 1.0e8),               # [Pa]
    "tube.length": (0.01, 1.0e4),                           # [m] (long tubes: approach to equilibrium)
    "tube.inner_diameter": (1.0e-3, 1.0),                   # [m]
    "tube.count": (1, 1_000_000),                           # [-]
    "tube.roughness": (0.0, 0.01),                          # [m]
    "bed.particle_diameter": (1.0e-4, 0.1),                 # [m]
    "bed.bulk_density": (50.0, 6000.0),                     # [kg/m^3]
    "heat.overall_coefficient": (0.0, 1.0e4),               # [W/(m^2*K)]
    "heat.coefficient.wall_thickness": (0.0, 0.05),         # [m]
    "heat.coefficient.wall_conductivity": (0.01, 1000.0),   # [W/(m*K)] (refractory to copper)
    "heat.coefficient.outside": (1.0, 1.0e6),               # [W/(m^2*K)] (still gas to condensing steam)
    "heat.coefficient.inside": (1.0, 1.0e5),                # [W/(m^2*K)] a typed inside coefficient
    "heat.coefficient.fouling_inside": (0.0, 0.1),          # [m^2*K/W]
    "heat.coefficient.fouling_outside": (0.0, 0.1),         # [m^2*K/W]
    "heat.coefficient.conductivity": (1.0e-3, 100.0),       # [W/(m*K)] process fluid
    "heat.coefficient.shell.velocity": (1.0e-3, 100.0),     # [m/s]
    "heat.coefficient.shell.transverse_pitch": (1.0e-3, 1.0),    # [m]
    "heat.coefficient.shell.longitudinal_pitch": (1.0e-3, 1.0),  # [m]
    "heat.coefficient.shell.density": (0.01, 2.0e4),        # [kg/m^3] (a gas to a molten metal)
    "heat.coefficient.shell.viscosity": (1.0e-6, 10.0),     # [Pa*s]
    "heat.coefficient.shell.conductivity": (1.0e-3, 1000.0),  # [W/(m*K)]
    "heat.coefficient.shell.cp": (100.0, 1.0e5),            # [J/(kg*K)]
    "catalyst.effective_diffusivity": (1.0e-12, 1.0e-3),    # [m^2/s]
    "catalyst.volume_to_surface": (1.0e-6, 0.05),           # [m]
    "catalyst.pellet_density": (50.0, 1.0e4),               # [kg/m^3]
    "bed.radial_conductivity": (1.0e-3, 1.0e3),             # [W/(m*K)]
    "bed.radial_diffusivity": (1.0e-8, 1.0),                # [m^2/s]
    "bed.wall_coefficient": (1.0e-2, 1.0e5),                # [W/(m^2*K)]
    "heat.medium.mass_flow": (1.0e-6, 1.0e6),               # [kg/s] whole bundle
    "heat.medium.cp": (100.0, 1.0e5),                       # [J/(kg*K)]
    "pressure_drop.viscosity": (1.0e-7, 1.0e-2),            # [Pa*s]
    "feed.molar_flow": (0.0, 1.0e6),                        # [mol/s] whole reactor
    "feed.mass_flow": (0.0, 1.0e5),                         # [kg/s] whole reactor
    "feed.volumetric_flow": (0.0, 1.0e5),                   # [m^3/s] whole reactor
    "reactions.*.activation_energy": (-1.0e5, 1.0e6),       # [J/mol]
    "reactions.*.inhibition.*.heat_of_adsorption": (-5.0e5, 5.0e5),  # [J/mol]
    "thermo.custom.*.molar_mass": (1.0e-3, 2.0),            # [kg/mol]
    "thermo.custom.*.cp": (1.0, 5000.0),                    # [J/(mol*K)]
    "thermo.custom.*.enthalpy_of_formation": (-1.0e7, 1.0e7),  # [J/mol]
    "thermo.custom.*.standard_entropy": (1.0, 5000.0),      # [J/(mol*K)]
    "thermo.*.*.critical_temperature": (1.0, 5000.0),       # [K] (helium 5.2 K)
    "thermo.*.*.critical_pressure": (1.0e4, 1.0e9),         # [Pa]
    "assumptions.isothermal": (0.0, 1000.0),                # [K] temperature difference
}

#: Reaction orders and inhibition exponents accepted, [-] (negative orders: inhibition by a feed species).
ORDER_RANGE = (-5.0, 10.0)
#: Smallest reaction order that is not zero, [-]; below it an order is a slip or a denormal number.
MIN_ORDER = 1.0e-6

#: Lowest flow per tube, by flow kind, in SI: [mol/s], [kg/s], [m^3/s] (at feed T and P).
MIN_FLOW_PER_TUBE = {"molar_flow": 1.0e-9, "mass_flow": 1.0e-11, "volumetric_flow": 1.0e-11}

#: Smallest mole fraction that is not zero; below it a value is a slip or a denormal number.
MIN_MOLE_FRACTION = 1.0e-20

#: Most integration steps a tube may need at the given ``solver.max_step`` (length / max_step).
MAX_STEPS_FOR_MAX_STEP = 100_000

#: Shape of a case file: deepest nesting of tables/arrays, most entries in one table or array,
#: longest text value. A case needs a nesting depth of about 6 and tens of entries.
MAX_DEPTH, MAX_ENTRIES, MAX_TEXT = 16, 1000, 10_000
#: Largest case file read, [bytes]; a case is a few kilobytes (parsing 1.5 MB of TOML takes over a second).
MAX_FILE_BYTES = 1_000_000


def structure_problem(raw):
    """Text of the first problem with the shape of a raw case (too deep, too long), else None.

    Walks the dict without recursion, so a pathological file cannot exhaust the stack.

    Examples
    --------
    >>> structure_problem({"feed": {"mole_fractions": {"A": 1.0}}}) is None
    True
    >>> deep = 1
    >>> for _ in range(20):
    ...     deep = [deep]
    >>> structure_problem({"x": deep}).split(": ")[1]
    'nested more than 16 levels deep; a case file needs only a few'
    """
    stack = [("", raw, 0)]
    while stack:
        path, node, depth = stack.pop()
        if depth > MAX_DEPTH:
            return f"{path}: nested more than {MAX_DEPTH} levels deep; a case file needs only a few"
        if isinstance(node, str) and len(node) > MAX_TEXT:
            return f"{path}: a text of {len(node)} characters; at most {MAX_TEXT} are accepted"
        if isinstance(node, (dict, list)):
            if len(node) > MAX_ENTRIES:
                kind = "a table" if isinstance(node, dict) else "an array"
                return f"{path or 'the case'}: {kind} of {len(node)} entries; at most {MAX_ENTRIES} are accepted"
            items = node.items() if isinstance(node, dict) else enumerate(node)
            for key, value in items:
                stack.append((f"{path}.{key}" if path else str(key), value, depth + 1))
    return None


def _pattern_of(path):
    """The key of :data:`RANGES` that ``path`` falls under (list indices and names become ``*``)."""
    if path in RANGES:
        return path
    parts = path.split(".")
    for key in RANGES:
        pattern = key.split(".")
        if len(pattern) == len(parts) and all(p in ("*", q) for p, q in zip(pattern, parts)):
            return key
    return None


def range_problem(path, value, unit=""):
    """Text of the problem when ``value`` (SI) at ``path`` is outside its plausible range, else None.

    Parameters
    ----------
    path : str
        Field path, e.g. ``"tube.inner_diameter"`` or ``"reactions.0.activation_energy"``.
    value : float
        The value in SI base units.
    unit : str
        SI unit text for the message.

    Examples
    --------
    >>> range_problem("tube.inner_diameter", 1e-200, "m")
    'outside the plausible range 0.001 m to 1 m of this model (got 1e-200 m)'
    >>> range_problem("tube.inner_diameter", 0.025, "m") is None
    True
    """
    key = _pattern_of(path)
    if key is None:
        return None
    lo, hi = RANGES[key]
    if lo <= value <= hi:
        return None
    u = f" {unit}" if unit else ""
    return f"outside the plausible range {lo:g}{u} to {hi:g}{u} of this model (got {value:.6g}{u})"
