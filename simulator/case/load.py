"""Case files (TOML) -> validated :class:`~simulator.case.schema.Case` in SI.

Every dimensional value is text with its unit, parsed with pint; a bare number
in a dimensional field is an error. Every problem in a case is collected and
reported at once, one line each, naming the field, the value as written and
what is accepted.
"""
import difflib
import math
import tomllib
from pathlib import Path

from simulator.case.equation import parse_equation
from simulator.case.limits import (
    MAX_FILE_BYTES, MAX_STEPS_FOR_MAX_STEP, MIN_FLOW_PER_TUBE, MIN_MOLE_FRACTION, MIN_ORDER, ORDER_RANGE,
    range_problem, structure_problem,
)
from simulator.case.schema import (
    AssumptionThresholds, Bed, Case, CustomSpecies, Design, Feed, Heat, InhibitionTerm, PressureDrop,
    Reaction, SolverOptions, Thermo, Tube,
)
from simulator.case.liquid import liquid_density_law, liquid_problems
from simulator.case.radial_keys import BED_KEYS as RADIAL_BED_KEYS, radial_settings
from simulator.errors import CaseError, ThermoError, UnitError
from simulator.thermo.species_data import near, resolve_species_file, species_in_file
from simulator.units import SI_UNITS, is_normal_volume, parse_quantity

NAN = float("nan")

KEYS = {
    "": {"title", "source", "description", "thermo", "reactions", "feed", "tube", "bed", "heat",
         "pressure_drop", "design", "solver", "assumptions", "uncertainty", "train", "model", "catalyst"},
    "thermo": {"species_file", "equation_of_state", "custom", "critical", "density", "density_at",
               "expansion_coefficient"},
    "thermo.custom.*": {"molar_mass", "cp", "enthalpy_of_formation", "standard_entropy",
                        "critical_temperature", "critical_pressure", "acentric_factor",
                        "normal_boiling_point", "heat_of_vaporization"},
    "thermo.critical.*": {"critical_temperature", "critical_pressure", "acentric_factor"},
    "reactions.*": {"equation", "form", "pre_exponential", "activation_energy", "temperature_exponent",
                    "orders", "in_terms_of", "rate_basis", "inhibition", "inhibition_power"},
    "reactions.*.inhibition.*": {"species", "pre_exponential", "heat_of_adsorption"},
    "feed": {"temperature", "pressure", "molar_flow", "mass_flow", "volumetric_flow", "mole_fractions"},
    "tube": {"length", "inner_diameter", "count", "roughness", "orientation"},
    "bed": {"particle_diameter", "void_fraction", "bulk_density"} | set(RADIAL_BED_KEYS),
    "heat": {"mode", "overall_coefficient", "coefficient", "medium"},
    "heat.medium": {"arrangement", "temperature", "mass_flow", "cp", "profile"},
    "heat.medium.profile.*": {"position", "temperature", "heat_flux"},
    "pressure_drop": {"model", "viscosity", "friction_correlation", "viscosity_activation_energy", "viscosity_at"},
    "design": {"key_species", "target_conversion", "temperature_limit", "max_pressure_drop",
               "wall_temperature_limit", "products"},
    "solver": {"rtol", "atol_scale", "output_points", "max_step"},
    "assumptions": {"isothermal", "isobaric", "ideal_gas", "constant_moles"},
    "uncertainty.*": {"parameter", "distribution", "std", "factor", "low", "high"},
}
HEAT_MODES = ("adiabatic", "isothermal", "exchange")
ARRANGEMENTS = ("uniform", "co-current", "counter-current", "wall-profile")
ORIENTATIONS = ("horizontal", "vertical-up", "vertical-down")
#: g sin(theta) of each orientation (flow direction above the horizontal), [m/s^2] (standard gravity)
GRAVITY_ALONG = {"horizontal": 0.0, "vertical-up": 9.80665, "vertical-down": -9.80665}
RATE_FORMS = ("power-law", "hougen-watson")
ACTIVITY_BASES = ("concentration", "partial-pressure")
RATE_BASES = ("reactor-volume", "catalyst-mass")

#: Keys of earlier versions, refused with a pointer to the key that replaced them:
#: (table pattern, old key) -> what to write instead.
RENAMED_KEYS = {
    ("heat", "coolant_temperature"): 'heat.medium.temperature (with heat.mode = "exchange")',
    ("heat", "coolant_mass_flow"): 'heat.medium.mass_flow (with heat.medium.arrangement = "co-current")',
    ("heat", "coolant_cp"): 'heat.medium.cp (with heat.medium.arrangement = "co-current")',
    ("reactions.*", "rate_law"): 'form = "power-law" | "hougen-watson"',
    ("reactions.*", "driving_force"): 'in_terms_of = "concentration" | "partial-pressure"',
    ("reactions.*", "per"): 'rate_basis = "reactor-volume" | "catalyst-mass"',
    ("reactions.*", "adsorption"): "[[reactions.inhibition]] terms (species, pre_exponential, heat_of_adsorption)",
    ("reactions.*", "denominator_exponent"): "inhibition_power",
}
#: Values of earlier versions: (table pattern, key, old value) -> what to write instead.
RENAMED_VALUES = {
    ("heat", "mode", "constant-coolant"): 'heat.mode = "exchange" with heat.medium.arrangement = "uniform"',
    ("heat", "mode", "co-current"): 'heat.mode = "exchange" with heat.medium.arrangement = "co-current"',
    ("reactions.*", "form", "lhhw"): 'form = "hougen-watson"',
    ("reactions.*", "rate_basis", "volume"): 'rate_basis = "reactor-volume"',
}
PRESSURE_MODELS = ("none", "ergun", "pipe-friction")
#: Unknown species that get did-you-mean hints; the rest are listed plainly.
MAX_HINTS = 20
FRICTION = ("churchill-1977", "colebrook-1939", "blasius-1913", "laminar")
EOS = ("ideal-gas", "peng-robinson", "liquid")


class _Checker:
    """Collects problems; every accessor returns a usable placeholder on error."""

    def __init__(self, where):
        self.where = where
        self.problems = []

    def fail(self, path, message):
        self.problems.append(f"{self.where}{path}{message}")

    def keys(self, table, allowed, path, pattern=None):
        """Flag every key of ``table`` not in ``allowed``; a renamed key points to its new name."""
        if not isinstance(table, dict):
            self.fail(path, f": must be a table, got {table!r}")
            return
        pattern = path if pattern is None else pattern
        for key in table:
            new = RENAMED_KEYS.get((pattern, key))
            if new is not None:
                self.fail(f"{path + '.' if path else ''}{key}", f": renamed; write {new}.")
            elif key not in allowed:
                hint = difflib.get_close_matches(key, sorted(allowed), n=2)
                suggestion = f"did you mean {', '.join(repr(h) for h in hint)}? " if hint else ""
                self.fail(f"{path + '.' if path else ''}{key}",
                          f": unknown key; {suggestion}accepted: {', '.join(sorted(allowed))}.")

    def table(self, raw, key, path, required=True):
        value = raw.get(key) if isinstance(raw, dict) else None
        if value is None:
            if required:
                self.fail(path, ": missing table")
            return {}
        if not isinstance(value, dict):
            self.fail(path, f" = {value!r}: must be a table")
            return {}
        return value

    def quantity(self, table, key, dimension, path, required=True, minimum=None, strict=True):
        if key not in table:
            if required:
                self.fail(f"{path}.{key}", ": missing")
            return NAN
        try:
            value = parse_quantity(table[key], dimension, "")
        except UnitError as err:
            self.fail(f"{path}.{key}", str(err))
            return NAN
        if minimum is not None and (value <= minimum if strict else value < minimum):
            rel = ">" if strict else ">="
            self.fail(f"{path}.{key}", f" = {table[key]!r}: must be {rel} {minimum:g}.")
            return NAN
        return self.plausible(f"{path}.{key}", table[key], value, SI_UNITS.get(dimension, ""))

    def plausible(self, path, written, value, unit=""):
        """``value`` if inside its plausible range (:mod:`simulator.case.limits`), else NaN and a problem."""
        problem = range_problem(path, value, unit)
        if problem is not None:
            self.fail(path, f" = {written!r}: {problem}; check the number and its unit.")
            return NAN
        return value

    def number(self, table, key, path, default=NAN, lo=None, hi=None, lo_open=False, hi_open=False,
               integer=False, required=False):
        if key not in table:
            if required:
                self.fail(f"{path}.{key}", ": missing")
            return default
        value = table[key]
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            kind = "a whole number" if integer else "a plain number (dimensionless)"
            self.fail(f"{path}.{key}", f" = {value!r}: must be {kind}.")
            return default
        if integer and not isinstance(value, int):
            self.fail(f"{path}.{key}", f" = {value!r}: must be a whole number.")
            return default
        bad = (lo is not None and (value <= lo if lo_open else value < lo)) or \
              (hi is not None and (value >= hi if hi_open else value > hi))
        if bad or not math.isfinite(value):
            lo_s = "" if lo is None else f"{'>' if lo_open else '>='} {lo:g}"
            hi_s = "" if hi is None else f"{'<' if hi_open else '<='} {hi:g}"
            self.fail(f"{path}.{key}", f" = {value!r}: must be {' and '.join(s for s in (lo_s, hi_s) if s)}.")
            return default
        return value if self.plausible(f"{path}.{key}", value, value) == value else default

    def choice(self, table, key, path, choices, default=None, pattern=None):
        if key not in table:
            if default is None:
                self.fail(f"{path}.{key}", f": missing; choose one of: {', '.join(choices)}.")
            return default
        value = table[key]
        new = RENAMED_VALUES.get((path if pattern is None else pattern, key, value)) \
            if isinstance(value, str) else None
        if new is not None:
            self.fail(f"{path}.{key}", f" = {value!r}: renamed; write {new}.")
            return default
        if value not in choices:
            hint = difflib.get_close_matches(str(value), choices, n=1)
            self.fail(f"{path}.{key}", f" = {value!r}: unknown; choose one of: {', '.join(choices)}."
                      + (f" Did you mean {hint[0]!r}?" if hint else ""))
            return default
        return value


def load_case(path):
    """Read and validate a TOML case file.

    Parameters
    ----------
    path : str or pathlib.Path
        Case file.

    Returns
    -------
    Case

    Raises
    ------
    CaseError
        Listing every problem found, one line each.
    """
    path = Path(path)
    try:
        data = path.read_bytes()
    except OSError as err:
        raise CaseError(f"{path}: cannot read the case file ({err.strerror or err})") from err
    if len(data) > MAX_FILE_BYTES:
        raise CaseError(f"{path}: a case file of {len(data)} bytes; at most {MAX_FILE_BYTES} are read (a case is a "
                        "few kilobytes).")
    text = _decode(path, data)
    try:
        raw = tomllib.loads(text)
    except tomllib.TOMLDecodeError as err:
        raise CaseError(f"{path}: not valid TOML: {err}") from err
    except RecursionError as err:
        raise CaseError(f"{path}: not a usable case: arrays or tables nested too deeply.") from err
    return load_case_dict(raw, source_path=str(path))


def _decode(path, data):
    """The text of a case file; a file that is not UTF-8 text is refused with what it seems to be."""
    if data.startswith((b"\xff\xfe", b"\xfe\xff")) or (len(data) > 1 and b"\x00" in data[:2]):
        raise CaseError(f"{path}: the case file is saved as UTF-16; save it as UTF-8 text.")
    if b"\x00" in data:
        raise CaseError(f"{path}: not a text file (it contains NUL bytes); a case file is UTF-8 TOML text.")
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as err:
        line = data[:err.start].count(b"\n") + 1
        raise CaseError(f"{path}: not UTF-8 text (byte 0x{data[err.start]:02x} on line {line}); save the case "
                        "file as UTF-8.") from None


def load_case_dict(raw, source_path="", case_dir=None):
    """Validate a case given as the dict a TOML parser returns.

    Parameters
    ----------
    raw : dict
        The case as written (values with units are text).
    source_path : str
        File the dict came from, for messages and relative paths.
    case_dir : str, optional
        Folder for relative species files; default the folder of ``source_path``.

    Returns
    -------
    Case
    """
    where = f"{source_path}: " if source_path else ""
    shape = structure_problem(raw)
    if shape is not None:
        raise CaseError(f"{where}{shape}.")
    case_dir = case_dir or (str(Path(source_path).parent) if source_path else ".")
    if "train" in raw:                   # several beds in series: simulator.case.train
        from simulator.case.train import load_train_case

        return load_train_case(raw, source_path, case_dir, load_case_dict)
    if "mechanism" in raw:               # a Cantera mechanism is the chemistry: simulator.case.mechanism_keys
        from simulator.case.mechanism_keys import load_mechanism_case

        return load_mechanism_case(raw, source_path, case_dir)
    ck = _Checker(where)
    ck.keys(raw, KEYS[""], "")

    title = raw.get("title", "")
    if not isinstance(title, str) or not title.strip():
        ck.fail("title", f" = {title!r}: give a short title as text.")
        title = str(title)

    thermo = _thermo(ck, raw, case_dir)
    reactions = _reactions(ck, raw)
    feed = _feed(ck, raw)
    tube = _tube(ck, raw)
    bed = _bed(ck, raw)
    heat = _heat(ck, raw)
    pdrop = _pressure_drop(ck, raw, bed)
    design = _design(ck, raw)
    solver = _solver(ck, raw)
    thresholds = _thresholds(ck, raw)
    radial = radial_settings(ck, raw)                  # [model] and the radial [bed] keys
    from simulator.case.catalyst_keys import read_catalyst

    catalyst = read_catalyst(ck, raw, bed)             # [catalyst]: pellets (effectiveness factors)
    for i, entry in enumerate(raw.get("uncertainty", []) if isinstance(raw.get("uncertainty", []), list) else []):
        ck.keys(entry, KEYS["uncertainty.*"], f"uncertainty.{i}")

    if not math.isnan(design.temperature_limit) and not math.isnan(feed.temperature) \
            and design.temperature_limit <= feed.temperature:
        ck.fail("design.temperature_limit", f" = {raw['design'].get('temperature_limit')!r}: must be above the feed "
                f"temperature ({feed.temperature:.6g} K).")
    from simulator.case.heat_coefficient_keys import check_shell_geometry

    check_shell_geometry(ck, heat.coefficient, tube.inner_diameter)
    if not math.isnan(design.wall_temperature_limit):
        if heat.mode != "exchange":
            ck.fail("design.wall_temperature_limit", f" = {raw['design'].get('wall_temperature_limit')!r}: the tube "
                    f"exchanges no heat (heat.mode = {heat.mode!r}), so its wall is at the gas temperature; use "
                    "design.temperature_limit.")
        elif heat.profile_quantity == "heat_flux" and heat.coefficient is None:
            ck.fail("design.wall_temperature_limit", ": a given heat_flux profile needs [heat.coefficient] (at least "
                    "inside) to know the wall temperature T + q''/h_i; give it or remove the limit.")
    _check_sizes(ck, raw, feed, tube, bed, solver)
    if any(r.rate_basis == "catalyst-mass" for r in reactions) and bed is None:
        ck.fail("reactions", ': rate_basis = "catalyst-mass" needs a [bed] table with bulk_density.')

    liquid_problems(ck, thermo, reactions)
    if design.key_species:
        _check_products(ck, design, reactions)
    species = _species_order(feed, reactions)
    _check_species(ck, species, thermo, reactions, feed, design)

    if ck.problems:
        raise CaseError(ck.problems)
    return Case(title=title.strip(), source_path=source_path, thermo=thermo, reactions=tuple(reactions),
                feed=feed, tube=tube, heat=heat, pressure_drop=pdrop, design=design, bed=bed, solver=solver,
                assumptions=thresholds, species=tuple(species), raw=raw, source=str(raw.get("source", "")),
                radial=radial, catalyst=catalyst)


def _check_sizes(ck, raw, feed, tube, bed, solver):
    """Checks that need two fields: flow per tube, particle vs tube diameter, max_step vs length."""
    per_tube = feed.flow_value / tube.count
    lowest = MIN_FLOW_PER_TUBE[feed.flow_kind]
    if per_tube < lowest:
        unit = {"molar_flow": "mol/s", "mass_flow": "kg/s", "volumetric_flow": "m^3/s"}[feed.flow_kind]
        key = next(k for k in ("molar_flow", "mass_flow", "volumetric_flow") if k in raw["feed"])
        tubes = f"{tube.count} tube{'' if tube.count == 1 else 's'}"
        ck.fail(f"feed.{key}", f" = {raw['feed'][key]!r}: {per_tube:.3g} {unit} per tube over {tubes}, below the "
                f"plausible {lowest:g} {unit} per tube of this model; check the number, its unit and tube.count.")
    if bed is not None and bed.particle_diameter >= tube.inner_diameter:
        ck.fail("bed.particle_diameter", f" = {raw['bed']['particle_diameter']!r}: not smaller than "
                f"tube.inner_diameter ({raw['tube']['inner_diameter']!r}); the particles cannot fit in the tube.")
    if solver.max_step > 0 and tube.length / solver.max_step > MAX_STEPS_FOR_MAX_STEP:
        ck.fail("solver.max_step", f" = {raw['solver']['max_step']!r}: tube.length / max_step = "
                f"{tube.length / solver.max_step:.3g} steps, more than the {MAX_STEPS_FOR_MAX_STEP} a run may take; "
                f"give at least {tube.length / MAX_STEPS_FOR_MAX_STEP:.3g} m.")


def _thermo(ck, raw, case_dir):
    t = ck.table(raw, "thermo", "thermo", required=False)
    ck.keys(t, KEYS["thermo"], "thermo")
    eos = ck.choice(t, "equation_of_state", "thermo", EOS, default="ideal-gas")
    species_file = t.get("species_file")
    species_path = None
    if species_file is not None:
        if not isinstance(species_file, str):
            ck.fail("thermo.species_file", f" = {species_file!r}: must be a file name as text.")
        else:
            species_path = resolve_species_file(species_file, case_dir)
            if species_path is None:
                ck.fail("thermo.species_file", f" = {species_file!r}: not found next to the case file "
                        "nor among Cantera's bundled data files (e.g. gri30.yaml, nasa_gas.yaml).")
    custom = []
    for name, entry in (ck.table(t, "custom", "thermo.custom", required=False) or {}).items():
        path = f"thermo.custom.{name}"
        if not isinstance(entry, dict):
            ck.fail(path, ": must be a table")
            continue
        ck.keys(entry, KEYS["thermo.custom.*"], path)
        molar_mass = ck.quantity(entry, "molar_mass", "molar_mass", path, minimum=0.0)
        custom.append(CustomSpecies(
            name=name,
            molar_mass=molar_mass,
            cp=_custom_cp(ck, entry, path, molar_mass),
            enthalpy_of_formation=ck.quantity(entry, "enthalpy_of_formation", "molar_energy", path),
            standard_entropy=ck.quantity(entry, "standard_entropy", "molar_entropy", path, required=False),
            critical_temperature=ck.quantity(entry, "critical_temperature", "temperature", path,
                                             required=False, minimum=0.0),
            critical_pressure=ck.quantity(entry, "critical_pressure", "pressure", path, required=False,
                                          minimum=0.0),
            acentric_factor=ck.number(entry, "acentric_factor", path, lo=-1.0, hi=2.0),
            normal_boiling_point=ck.quantity(entry, "normal_boiling_point", "temperature", path, required=False,
                                             minimum=0.0),
            heat_of_vaporization=ck.quantity(entry, "heat_of_vaporization", "molar_energy", path, required=False,
                                             minimum=0.0),
        ))
        if ("normal_boiling_point" in entry) != ("heat_of_vaporization" in entry):
            ck.fail(path, ": give normal_boiling_point and heat_of_vaporization together (the vapour pressure of "
                    "the boiling check needs both).")
    critical = []
    for name, entry in (ck.table(t, "critical", "thermo.critical", required=False) or {}).items():
        path = f"thermo.critical.{name}"
        ck.keys(entry, KEYS["thermo.critical.*"], path)
        if isinstance(entry, dict):
            critical.append((name, ck.quantity(entry, "critical_temperature", "temperature", path, minimum=0.0),
                             ck.quantity(entry, "critical_pressure", "pressure", path, minimum=0.0),
                             ck.number(entry, "acentric_factor", path, lo=-1.0, hi=2.0, required=True)))
    if species_file is None and not custom:
        ck.fail("thermo", ": give species_file (a Cantera YAML file) or declare [thermo.custom.NAME] species.")
    rho, rho_at, beta = liquid_density_law(ck, t, eos)
    return Thermo(species_file=species_file, species_path=species_path, equation_of_state=eos,
                  custom=tuple(custom), critical=tuple(critical), density=rho, density_at=rho_at,
                  expansion_coefficient=beta)


def _custom_cp(ck, entry, path, M):
    """cp of a custom species, [J/(mol*K)]: molar as written, or per mass times the molar mass M [kg/mol]."""
    written = entry.get("cp")
    try:
        per_mass = parse_quantity(written, "specific_heat_capacity", "") if isinstance(written, str) else None
    except UnitError:
        per_mass = None
    if per_mass is None:
        return ck.quantity(entry, "cp", "molar_heat_capacity", path, minimum=0.0)
    if not per_mass > 0.0:
        ck.fail(f"{path}.cp", f" = {written!r}: must be > 0.")
        return NAN
    if M != M:                             # the molar mass is already reported as a problem
        return NAN
    return ck.plausible(f"{path}.cp", written, per_mass * M, "J/(mol*K)")


def _activity_unit(in_terms_of):
    return "mol/m**3" if in_terms_of == "concentration" else "Pa"


def _rate_unit(rate_basis):
    return "mol/(m**3*s)" if rate_basis == "reactor-volume" else "mol/(kg*s)"


def _reactions(ck, raw):
    entries = raw.get("reactions")
    if not isinstance(entries, list) or not entries:
        ck.fail("reactions", ": give at least one [[reactions]] entry.")
        return []
    out = []
    for j, r in enumerate(entries):
        path = f"reactions.{j}"
        if not isinstance(r, dict):
            ck.fail(path, ": must be a table")
            continue
        ck.keys(r, KEYS["reactions.*"], path, pattern="reactions.*")
        try:
            stoich, reversible = parse_equation(r.get("equation"))
        except ValueError as err:
            ck.fail(f"{path}.equation", f" = {r.get('equation')!r}: {err}.")
            continue
        form = ck.choice(r, "form", path, RATE_FORMS, default="power-law", pattern="reactions.*")
        driving = ck.choice(r, "in_terms_of", path, ACTIVITY_BASES, default="concentration",
                            pattern="reactions.*")
        per = ck.choice(r, "rate_basis", path, RATE_BASES, default="reactor-volume", pattern="reactions.*")
        orders_raw = r.get("orders")
        if orders_raw is None:
            orders = {s: -nu for s, nu in stoich.items() if nu < 0}
        elif not isinstance(orders_raw, dict):
            ck.fail(f"{path}.orders", f" = {orders_raw!r}: must be a table such as {{ A = 1 }}.")
            orders = {}
        else:
            orders = {}
            for s, o in orders_raw.items():
                if isinstance(o, bool) or not isinstance(o, (int, float)) or not math.isfinite(o):
                    ck.fail(f"{path}.orders.{s}", f" = {o!r}: must be a plain number.")
                elif 0.0 < abs(o) < MIN_ORDER:
                    ck.fail(f"{path}.orders.{s}", f" = {o!r}: below {MIN_ORDER:g} in size, too small to mean anything; "
                            "write 0 for a zero order.")
                elif not ORDER_RANGE[0] <= o <= ORDER_RANGE[1]:
                    ck.fail(f"{path}.orders.{s}", f" = {o!r}: outside the plausible range {ORDER_RANGE[0]:g} to "
                            f"{ORDER_RANGE[1]:g} of a reaction order.")
                else:
                    orders[s] = float(o)
        n = _round_order(sum(orders.values()))
        activity, rate = _activity_unit(driving), _rate_unit(per)
        expected = f"({rate}) / ({activity})**({n!r})"
        A = NAN
        if "pre_exponential" not in r:
            ck.fail(f"{path}.pre_exponential", ": missing")
        else:
            try:
                A = parse_quantity(r["pre_exponential"], expected, "")
            except UnitError as err:
                example = _rate_constant_example(n, driving, per)
                ck.fail(f"{path}.pre_exponential", f"{err}".split(": wrong dimension")[0] +
                        (f": units do not match orders (sum {n:g}), in_terms_of = {driving!r} and rate_basis = "
                         f"{per!r}; give them as rate / activity^{n:g}, e.g. \"1.0e5 {example}\" "
                         f"(k = A T^b exp(-E/RT) with T in K: b adds no unit)."
                         if "wrong dimension" in str(err) else ""))
            if not (A >= 0):
                if not math.isnan(A):
                    ck.fail(f"{path}.pre_exponential", f" = {r['pre_exponential']!r}: must be >= 0.")
        E = ck.quantity(r, "activation_energy", "molar_energy", path, required=True)
        b = ck.number(r, "temperature_exponent", path, default=0.0, lo=-10, hi=10)
        inhibition, n_den = (), 1.0
        if form == "hougen-watson":
            inhibition = _inhibition(ck, r, path, activity)
            n_den = ck.number(r, "inhibition_power", path, default=1.0, lo=0.0, hi=4.0)
        elif "inhibition" in r or "inhibition_power" in r:
            ck.fail(path, ': inhibition terms need form = "hougen-watson".')
        if reversible:
            _reverse_orders(ck, path, stoich, orders, raw)
        as_written = tuple((k, str(v)) for k, v in r.items() if k != "inhibition")
        out.append(Reaction(equation=r.get("equation"), stoichiometry=tuple(stoich.items()),
                            reversible=reversible, form=form or "power-law", pre_exponential=A,
                            activation_energy=E, temperature_exponent=b, orders=tuple(orders.items()),
                            in_terms_of=driving or "concentration", rate_basis=per or "reactor-volume",
                            inhibition=inhibition, inhibition_power=n_den, as_written=as_written))
    return out


def _round_order(total):
    """An order sum rounded to 12 significant digits (1.4 + 0.4 = 1.7999999999999998 -> 1.8).

    The unit a rate constant must have is built from it, so the rounding error of a sum of
    decimal orders does not make ``(mol/m^3)^1.8`` a different unit.

    Examples
    --------
    >>> _round_order(1.4 + 0.4)
    1.8
    """
    return float(f"{total:.12g}")


def _rate_constant_example(n, in_terms_of, rate_basis):
    """A pasteable unit for a pre-exponential factor in the user's own basis, e.g. mol/(kg*s*bar^1.5)."""
    rate = "mol/(kg*s" if rate_basis == "catalyst-mass" else "mol/(m^3*s"
    if in_terms_of == "partial-pressure":
        return f"{rate})" if n == 0 else f"{rate}*bar^{n:g})"
    if n == 0:
        return f"{rate})"
    return f"{rate}) / (mol/m^3)^{n:g}" if n != 1 else "1/s" if rate_basis == "reactor-volume" else "m^3/(kg*s)"


def _si_text(expression):
    from simulator.units import registry

    return f"{registry().Quantity(1, expression).to_base_units().units:~P}"


def _inhibition(ck, r, path, activity):
    terms = r.get("inhibition", [])
    if not isinstance(terms, list) or not terms:
        ck.fail(f"{path}.inhibition", ': form = "hougen-watson" needs [[reactions.inhibition]] terms.')
        return ()
    out = []
    for m, a in enumerate(terms):
        p = f"{path}.inhibition.{m}"
        ck.keys(a, KEYS["reactions.*.inhibition.*"], p)
        exps = a.get("species") if isinstance(a, dict) else None
        if not isinstance(exps, dict) or not exps:
            ck.fail(f"{p}.species", ": must be a table of exponents such as { A = 1 }.")
            continue
        bad = [s for s, v in exps.items()
               if isinstance(v, bool) or not isinstance(v, (int, float)) or not (0.0 <= v <= 4.0)]
        for s in bad:
            ck.fail(f"{p}.species.{s}", f" = {exps[s]!r}: an exponent must be a plain number from 0 to 4.")
        if bad:
            continue
        total = _round_order(sum(float(v) for v in exps.values()))
        K0 = NAN
        try:
            K0 = parse_quantity(a.get("pre_exponential"), f"1/({activity})**({total!r})", "")
        except UnitError as err:
            act = "bar" if activity == "Pa" else "(mol/m^3)"
            text = str(err).split(": wrong dimension")[0]
            ck.fail(f"{p}.pre_exponential", f"{text}: an inhibition constant has units of 1 / activity^{total:g}, "
                    f"e.g. \"0.1 1/{act}^{total:g}\".")
        dH = ck.quantity(a, "heat_of_adsorption", "molar_energy", p)
        out.append(InhibitionTerm(exponents=tuple((k, float(v)) for k, v in exps.items()),
                                  pre_exponential=K0, heat_of_adsorption=dH))
    return tuple(out)


def _feed(ck, raw):
    f = ck.table(raw, "feed", "feed")
    ck.keys(f, KEYS["feed"], "feed")
    T = ck.quantity(f, "temperature", "temperature", "feed", minimum=0.0)
    P = ck.quantity(f, "pressure", "pressure", "feed", minimum=0.0)
    given = [k for k in ("molar_flow", "mass_flow", "volumetric_flow") if k in f]
    kind, value = "molar_flow", NAN
    if len(given) != 1:
        ck.fail("feed", f": give exactly one of molar_flow, mass_flow, volumetric_flow (found "
                f"{', '.join(given) or 'none'}).")
    else:
        kind = given[0]
        if kind == "volumetric_flow" and is_normal_volume(f[kind]):
            # a normal volumetric flow (Nm^3/h) is a molar flow: P_N V / (R T_N), see simulator.units
            value = ck.quantity(f, kind, "molar_flow", "feed", minimum=0.0)
            kind = "molar_flow"
        else:
            value = ck.quantity(f, kind, kind, "feed", minimum=0.0)
    x = f.get("mole_fractions")
    fractions = []
    if not isinstance(x, dict) or not x:
        ck.fail("feed.mole_fractions", ": give a table such as { A = 0.7, N2 = 0.3 }.")
    else:
        ok = True
        for s, v in x.items():
            if isinstance(v, bool) or not isinstance(v, (int, float)) or not (0.0 <= v <= 1.0):
                ck.fail(f"feed.mole_fractions.{s}", f" = {v!r}: must be a plain number between 0 and 1.")
                ok = False
            elif 0.0 < v < MIN_MOLE_FRACTION:
                ck.fail(f"feed.mole_fractions.{s}", f" = {v!r}: below {MIN_MOLE_FRACTION:g}, too small to mean "
                        "anything; write 0 for an absent species.")
                ok = False
            else:
                fractions.append((s, float(v)))
        total = sum(v for _, v in fractions)
        if ok and abs(total - 1.0) > 1e-6:
            ck.fail("feed.mole_fractions", f": sum to {total:.12g}; they must sum to 1 (within 1e-6).")
        elif ok:
            fractions = [(s, v / total) for s, v in fractions]
    return Feed(temperature=T, pressure=P, mole_fractions=tuple(fractions), flow_kind=kind, flow_value=value)


def _tube(ck, raw):
    t = ck.table(raw, "tube", "tube")
    ck.keys(t, KEYS["tube"], "tube")
    return Tube(length=ck.quantity(t, "length", "length", "tube", minimum=0.0),
                inner_diameter=ck.quantity(t, "inner_diameter", "length", "tube", minimum=0.0),
                count=ck.number(t, "count", "tube", default=1, lo=1, integer=True),
                roughness=ck.quantity(t, "roughness", "length", "tube", required=False, minimum=0.0,
                                      strict=False) if "roughness" in t else 0.0,
                orientation=ck.choice(t, "orientation", "tube", ORIENTATIONS, default="horizontal") or "horizontal")


def _bed(ck, raw):
    if "bed" not in raw:
        return None
    b = ck.table(raw, "bed", "bed")
    ck.keys(b, KEYS["bed"], "bed")
    return Bed(particle_diameter=ck.quantity(b, "particle_diameter", "length", "bed", minimum=0.0),
               void_fraction=ck.number(b, "void_fraction", "bed", lo=0.0, hi=1.0, lo_open=True, hi_open=True,
                                       required=True),
               bulk_density=ck.quantity(b, "bulk_density", "density", "bed", minimum=0.0))


def _heat(ck, raw):
    h = ck.table(raw, "heat", "heat")
    ck.keys(h, KEYS["heat"], "heat")
    mode = ck.choice(h, "mode", "heat", HEAT_MODES)
    U = Tm = mass_flow = cp = NAN
    coefficient = None
    arrangement = ""
    given = ("", (), ())
    if mode == "exchange":
        m = ck.table(h, "medium", "heat.medium")
        ck.keys(m, KEYS["heat.medium"], "heat.medium")
        arrangement = ck.choice(m, "arrangement", "heat.medium", ARRANGEMENTS, default="uniform") or "uniform"
        given = _wall_profile(ck, h, m, raw) if arrangement == "wall-profile" else given
        if "coefficient" in h:
            coefficient = _heat_coefficient(ck, h, raw, given_flux=given[0] == "heat_flux")
        elif given[0] != "heat_flux":
            U = ck.quantity(h, "overall_coefficient", "heat_transfer_coefficient", "heat", minimum=0.0,
                            strict=False)
        if arrangement != "wall-profile":
            Tm = ck.quantity(m, "temperature", "temperature", "heat.medium", minimum=0.0)
        if arrangement in ("co-current", "counter-current"):
            mass_flow = ck.quantity(m, "mass_flow", "mass_flow", "heat.medium", minimum=0.0)
            cp = ck.quantity(m, "cp", "specific_heat_capacity", "heat.medium", minimum=0.0)
        elif arrangement != "wall-profile":
            extra = [k for k in ("mass_flow", "cp") if isinstance(m, dict) and k in m]
            if extra:
                ck.fail("heat.medium", f": {', '.join(extra)} given but arrangement = \"uniform\" ignores them; "
                        'remove them or write arrangement = "co-current" or "counter-current".')
    elif mode in ("isothermal", "adiabatic"):
        extra = [k for k in ("overall_coefficient", "coefficient", "medium") if k in h]
        if extra:
            ck.fail("heat", f": {', '.join(extra)} given but mode = {mode!r} ignores them; remove them or "
                    'write mode = "exchange".')
    return Heat(mode=mode or "isothermal", overall_coefficient=0.0 if math.isnan(U) else U,
                arrangement=arrangement, medium_temperature=Tm, medium_mass_flow=mass_flow, medium_cp=cp,
                profile_quantity=given[0], profile_position=given[1], profile_value=given[2],
                coefficient=coefficient)


def _heat_coefficient(ck, h, raw, given_flux):
    """``[heat.coefficient]`` (U from correlations), see :mod:`simulator.case.heat_coefficient_keys`."""
    from simulator.case.heat_coefficient_keys import read_heat_coefficient

    thermo = raw.get("thermo") if isinstance(raw.get("thermo"), dict) else {}
    return read_heat_coefficient(ck, h, packed=isinstance(raw.get("bed"), dict),
                                 liquid=thermo.get("equation_of_state") == "liquid", given_flux=given_flux)


def _wall_profile(ck, h, m, raw):
    """``[[heat.medium.profile]]`` of a wall-profile medium -> (quantity, positions [m], values [K or W/m^2])."""
    from simulator.case.wall_profile import read_wall_profile

    return read_wall_profile(ck, h, m, raw)


def _pressure_drop(ck, raw, bed):
    p = ck.table(raw, "pressure_drop", "pressure_drop", required=False)
    ck.keys(p, KEYS["pressure_drop"], "pressure_drop")
    model = ck.choice(p, "model", "pressure_drop", PRESSURE_MODELS, default="none")
    if model == "ergun" and bed is None:
        ck.fail("pressure_drop.model", ' = "ergun": needs a [bed] table (particle_diameter, void_fraction, '
                "bulk_density).")
    if model == "pipe-friction" and bed is not None:
        ck.fail("pressure_drop.model", ' = "pipe-friction": the case has a [bed]; use "ergun" for a packed tube.')
    mu = ck.quantity(p, "viscosity", "viscosity", "pressure_drop", required=False, minimum=0.0)
    corr = ck.choice(p, "friction_correlation", "pressure_drop", FRICTION, default="churchill-1977")
    E_mu = ck.quantity(p, "viscosity_activation_energy", "molar_energy", "pressure_drop", required=False,
                       minimum=0.0, strict=False)
    T_mu = ck.quantity(p, "viscosity_at", "temperature", "pressure_drop", required=False, minimum=0.0)
    if ("viscosity_activation_energy" in p or "viscosity_at" in p) and "viscosity" not in p:
        ck.fail("pressure_drop.viscosity", ": missing; the Andrade law (viscosity_activation_energy, viscosity_at) "
                "scales a given viscosity with temperature, e.g. viscosity = \"1.2e-3 Pa*s\".")
    return PressureDrop(model=model, viscosity=mu, friction_correlation=corr or "churchill-1977",
                        viscosity_activation_energy=E_mu, viscosity_at=T_mu)


def _design(ck, raw):
    d = ck.table(raw, "design", "design")
    ck.keys(d, KEYS["design"], "design")
    key = d.get("key_species")
    if not isinstance(key, str) or not key.strip():
        ck.fail("design.key_species", f" = {key!r}: name the reactant whose conversion is tracked.")
        key = ""
    return Design(key_species=key,
                  target_conversion=ck.number(d, "target_conversion", "design", lo=0.0, hi=1.0, lo_open=True,
                                              hi_open=True),
                  temperature_limit=ck.quantity(d, "temperature_limit", "temperature", "design", required=False,
                                                minimum=0.0),
                  max_pressure_drop=ck.quantity(d, "max_pressure_drop", "pressure", "design", required=False,
                                                minimum=0.0),
                  wall_temperature_limit=ck.quantity(d, "wall_temperature_limit", "temperature", "design",
                                                     required=False, minimum=0.0),
                  products=_products(ck, d))


def _reverse_orders(ck, path, stoich, orders, raw):
    """Reverse orders alpha + nu of a reversible reaction: negative ones need the species in the feed.

    The reverse rate is the forward rate x Q/K, so its orders are alpha_i + nu_i (thermodynamically
    consistent: it vanishes exactly at K). They may be fractional or negative (Temkin-type rates),
    but a negative exponent on an activity that is zero at the feed makes the rate infinite there.
    """
    feed = raw.get("feed", {}).get("mole_fractions", {}) if isinstance(raw.get("feed"), dict) else {}
    feed = feed if isinstance(feed, dict) else {}
    for s, nu in stoich.items():
        e = orders.get(s, 0.0) + nu
        if nu < 0 and e < -1e-12 and not (isinstance(feed.get(s), (int, float)) and feed.get(s) > 0):
            ck.fail(f"{path}.orders.{s}", f" = {orders.get(s, 0.0):g}: for a reversible reaction the reverse rate "
                    f"(forward rate x Q/K) has order {e:g} in {s!r}, negative, and {s!r} is not in the feed, so the "
                    f"rate would be infinite at the inlet; put {s!r} in the feed or give it an order >= its "
                    f"coefficient ({-nu:g}).")


def _products(ck, d):
    """``design.products``: a list of species names (checked against the reactions later)."""
    value = d.get("products", [])
    if not isinstance(value, list) or not all(isinstance(v, str) and v.strip() for v in value):
        ck.fail("design.products", f" = {value!r}: write a list of species names, e.g. [\"C2H4O\"].")
        return ()
    if len(set(value)) != len(value):
        ck.fail("design.products", f" = {value!r}: a species is named twice.")
    return tuple(value)


def _check_products(ck, design, reactions):
    """Each named product is formed from the key species along a chain of the reactions."""
    from simulator.case.product_chain import product_scale

    for p in design.products:
        if p == design.key_species:
            ck.fail("design.products", f": {p!r} is the key species; name the products whose yield on it you want.")
        elif product_scale(reactions, design.key_species, p)[1] == ():
            ck.fail("design.products", f": {p!r} is not formed from {design.key_species!r} by any chain of the "
                    "reactions, so its yield on the key species is not defined.")


def _solver(ck, raw):
    s = ck.table(raw, "solver", "solver", required=False)
    ck.keys(s, KEYS["solver"], "solver")
    return SolverOptions(
        rtol=ck.number(s, "rtol", "solver", default=1e-8, lo=1e-13, hi=1e-3),
        atol_scale=ck.number(s, "atol_scale", "solver", default=1e-10, lo=1e-15, hi=1e-3),
        output_points=ck.number(s, "output_points", "solver", default=401, lo=11, hi=100001, integer=True),
        max_step=ck.quantity(s, "max_step", "length", "solver", required=False, minimum=0.0)
        if "max_step" in s else 0.0)


def _thresholds(ck, raw):
    a = ck.table(raw, "assumptions", "assumptions", required=False)
    ck.keys(a, KEYS["assumptions"], "assumptions")
    return AssumptionThresholds(
        isothermal=ck.quantity(a, "isothermal", "temperature_difference", "assumptions", required=False,
                               minimum=0.0),
        isobaric=ck.number(a, "isobaric", "assumptions", default=0.10, lo=0.0, hi=1.0, lo_open=True),
        ideal_gas=ck.number(a, "ideal_gas", "assumptions", default=0.05, lo=0.0, hi=1.0, lo_open=True),
        constant_moles=ck.number(a, "constant_moles", "assumptions", default=0.05, lo=0.0, hi=1.0, lo_open=True))


def _species_order(feed, reactions):
    names = [s for s, _ in feed.mole_fractions]
    for r in reactions:
        for s, _ in r.stoichiometry:
            if s not in names:
                names.append(s)
    return names


def _check_species(ck, species, thermo, reactions, feed, design):
    custom = {c.name for c in thermo.custom}
    in_file = {}
    if thermo.species_path:
        try:
            in_file = species_in_file(thermo.species_path)
        except ThermoError as err:
            ck.fail("thermo.species_file", f": {err}")
    known = custom | set(in_file)
    where_from = f"'{thermo.species_file}' or [thermo.custom]" if thermo.species_file else "[thermo.custom]"

    unknown = []

    def check(name, path):
        if name in known:
            return True
        unknown.append(name)
        hint = near(name, known) if len(unknown) <= MAX_HINTS else []     # difflib is slow on thousands
        extra = f"; did you mean {', '.join(repr(h) for h in hint)}?" if hint else ""
        if name[:1].isdigit():
            extra += " Put a space between a coefficient and its species (\"2 B\")."
        ck.fail(path, f": unknown species {name!r} (not in {where_from}){extra}")
        return False

    for s, _ in feed.mole_fractions:
        check(s, f"feed.mole_fractions.{s}")
    for j, r in enumerate(reactions):
        ok = all([check(s, f"reactions.{j}.equation") for s, _ in r.stoichiometry])
        for s, _ in r.orders:
            if s not in {n for n, _ in r.stoichiometry} and s not in known:
                check(s, f"reactions.{j}.orders.{s}")
        for m, a in enumerate(r.inhibition):
            for s, _ in a.exponents:
                if s not in species:
                    ck.fail(f"reactions.{j}.inhibition.{m}.species.{s}",
                            f": {s!r} is neither in the feed nor in any reaction.")
        for s, o in r.orders:
            if s not in species:
                ck.fail(f"reactions.{j}.orders.{s}", f": {s!r} is neither in the feed nor in any reaction.")
            elif o < 0 and dict(feed.mole_fractions).get(s, 0.0) <= 0.0:
                ck.fail(f"reactions.{j}.orders.{s}", f" = {o:g}: a negative order needs {s!r} in the feed "
                        "(its activity is zero at the inlet, which makes the rate infinite).")
        if ok:
            _check_balance(ck, j, r, thermo, in_file)
            if r.reversible:
                no_s = [s for s, _ in r.stoichiometry if s in custom and
                        math.isnan(next(c for c in thermo.custom if c.name == s).standard_entropy)]
                if no_s:
                    ck.fail(f"reactions.{j}.equation", f": reversible, but custom species {', '.join(no_s)} "
                            "have no standard_entropy; the equilibrium constant needs it "
                            '(e.g. standard_entropy = "250 J/(mol*K)").')
    key = design.key_species
    if key:
        feed_x = dict(feed.mole_fractions)
        consumed = any(dict(r.stoichiometry).get(key, 0.0) < 0 for r in reactions)
        if check(key, "design.key_species"):
            if feed_x.get(key, 0.0) <= 0.0:
                ck.fail("design.key_species", f" = {key!r}: must be in the feed with a mole fraction > 0.")
            elif not consumed:
                ck.fail("design.key_species", f" = {key!r}: is not a reactant of any reaction.")


def _check_balance(ck, j, r, thermo, in_file):
    custom = {c.name: c for c in thermo.custom}
    mass, scale = 0.0, 0.0
    elements = {}
    all_real = True
    for s, nu in r.stoichiometry:
        if s in custom:
            m = custom[s].molar_mass
            all_real = False
        else:
            sp = in_file[s]
            m = sp.molecular_weight / 1000.0
            for e, n in sp.composition.items():
                elements[e] = elements.get(e, 0.0) + nu * n
        if not math.isnan(m):
            mass += nu * m
            scale += abs(nu * m)
    if all_real:
        bad = {e: v for e, v in elements.items() if abs(v) > 1e-9}
        if bad:
            detail = ", ".join(f"{e} {v:+g}" for e, v in bad.items())
            ck.fail(f"reactions.{j}.equation", f" = {r.equation!r}: elements do not balance ({detail}).")
            return
    if scale > 0 and abs(mass) > 1e-6 * scale:
        ck.fail(f"reactions.{j}.equation", f" = {r.equation!r}: mass does not balance (products - reactants = "
                f"{mass * 1000:+.6g} g/mol of reaction); check coefficients and molar masses.")
