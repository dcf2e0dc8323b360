"""``[mechanism]``: a Cantera YAML mechanism as the chemistry of a case.

Keys (issue 13)::

    [mechanism]
    file = "gri30.yaml"      # bundled name or a path relative to the case file
    phase = "gri30"          # optional, default the file's first phase
    species = ["H2", ...]    # optional subset; reactions among the kept species are kept

A mechanism case has no ``[[reactions]]`` (together with them: planned, refused for now) and
no ``[thermo]`` (the species thermo is the mechanism's, ideal gas). The rest of the case
(feed, tube, bed, heat, pressure_drop, design, solver) is read by the ordinary loader
functions of :mod:`simulator.case.load`, so its checks and messages are the same.

Only ideal-gas phases with gas kinetics are run: a surface or edge phase and non-ideal
equations of state are refused as "not supported yet". Heat exchange: adiabatic, isothermal or
a medium that is uniform or co-current with a typed ``heat.overall_coefficient``; other
arrangements, ``[heat.coefficient]`` and ``design.wall_temperature_limit`` are refused for now.
"""
import functools
from dataclasses import dataclass

from simulator.errors import CaseError

MECHANISM_KEYS = {"file", "phase", "species"}
#: YAML ``thermo`` models of a phase that is a surface or an edge (not a gas).
SURFACE_MODELS = {"ideal-surface", "coverage-dependent-surface", "edge"}
#: Heat-medium arrangements a mechanism tube runs (an initial-value problem with a typed U).
MECHANISM_ARRANGEMENTS = ("uniform", "co-current")
NOT_YET = "not yet for mechanism cases"


@dataclass(frozen=True)
class MechanismSpec:
    """A validated ``[mechanism]`` table.

    ``species`` are the kept species in the mechanism's order; ``reactions_kept`` and
    ``reactions_dropped`` count the mechanism's reactions among them and those that name a
    dropped species (reactant, product or explicit collider).
    """

    file: str                  # as written
    path: str                  # resolved file path
    phase: str                 # phase name used
    species: tuple             # kept species, mechanism order
    reactions_kept: int
    reactions_dropped: int
    subset: bool               # True when ``species`` was given

    def describe(self):
        """One line for validate and the run's notes."""
        drop = (f"; {self.reactions_dropped} reaction{'' if self.reactions_dropped == 1 else 's'} dropped because "
                "they name a species outside mechanism.species") if self.subset else ""
        return (f"mechanism {self.file} (phase {self.phase}): {len(self.species)} species, "
                f"{self.reactions_kept} reactions{drop}")


def _yaml_phases(path):
    """[(name, thermo model, kinetics model)] of a Cantera YAML file, read without building phases."""
    import yaml

    with open(path, encoding="utf-8") as handle:
        data = yaml.safe_load(handle)
    phases = data.get("phases") if isinstance(data, dict) else None
    if not isinstance(phases, list):
        return []
    return [(p.get("name"), p.get("thermo"), p.get("kinetics")) for p in phases if isinstance(p, dict)]


@functools.lru_cache(maxsize=8)
def _full_solution(path, phase):
    import cantera as ct

    return ct.Solution(path, phase, transport_model=None)


def _kept_reactions(full, keep):
    """Reactions of ``full`` whose reactants, products and explicit colliders are all in ``keep``."""
    kept = []
    for r in full.reactions():
        if not (set(r.reactants) | set(r.products)) <= keep:
            continue
        tb = r.third_body
        if tb is not None and tb.default_efficiency == 0.0 and \
                not {k for k, v in tb.efficiencies.items() if v > 0.0} <= keep:
            continue              # an explicit collider (e.g. "+ AR") that was dropped
        kept.append(r)
    return kept


@functools.lru_cache(maxsize=8)
def mechanism_solution(path, phase, species):
    """The Cantera ``Solution`` of the kept species and reactions (cached per process).

    Transport is mixture-averaged when the file has transport data for every kept species,
    else none (then pipe friction needs ``pressure_drop.viscosity``). Callers set the state
    before every use (never rely on a state left in it).
    """
    import cantera as ct

    full = _full_solution(path, phase)
    if tuple(full.species_names) == tuple(species):
        reactions = full.reactions()
    else:
        reactions = _kept_reactions(full, set(species))
    spec = [full.species(s) for s in species]
    model = "mixture-averaged" if all(s.transport is not None for s in spec) else None
    return ct.Solution(thermo="ideal-gas", kinetics="gas", transport_model=model, species=spec,
                       reactions=reactions)


def has_transport(solution):
    """True when ``solution`` can give a viscosity."""
    return solution.transport_model not in ("none", "None", "", None)


def read_mechanism(ck, raw, case_dir):
    """Validate ``[mechanism]`` into a :class:`MechanismSpec` (None after a problem, which ``ck`` holds)."""
    from simulator.thermo.species_data import cantera_message, resolve_species_file

    m = ck.table(raw, "mechanism", "mechanism")
    ck.keys(m, MECHANISM_KEYS, "mechanism")
    file = m.get("file")
    if not isinstance(file, str) or not file.strip():
        ck.fail("mechanism.file", f" = {file!r}: give a Cantera YAML file, e.g. \"gri30.yaml\".")
        return None
    path = resolve_species_file(file, case_dir)
    if path is None:
        ck.fail("mechanism.file", f" = {file!r}: not found next to the case file nor among Cantera's bundled data "
                "files (e.g. gri30.yaml, h2o2.yaml).")
        return None
    import yaml

    try:
        phases = _yaml_phases(path)
    except (OSError, UnicodeDecodeError, yaml.YAMLError) as err:
        first = str(err).splitlines()[0] if str(err) else type(err).__name__
        ck.fail("mechanism.file", f" = {file!r}: cannot be read as a Cantera YAML file ({first}).")
        return None
    names = [p[0] for p in phases]
    if not phases:
        ck.fail("mechanism.file", f" = {file!r}: has no 'phases' list; a Cantera YAML mechanism defines at least one.")
        return None
    phase = m.get("phase", names[0])
    if phase not in names:
        ck.fail("mechanism.phase", f" = {phase!r}: not a phase of {file!r}; choose one of: "
                f"{', '.join(str(n) for n in names)}.")
        return None
    _, thermo_model, kinetics = phases[names.index(phase)]
    if thermo_model in SURFACE_MODELS:
        ck.fail("mechanism.phase", f" = {phase!r}: a surface phase ({thermo_model}); surface chemistry is not "
                "supported yet: give a gas phase of the file.")
        return None
    if thermo_model != "ideal-gas":
        ck.fail("mechanism.phase", f" = {phase!r}: thermo model {thermo_model!r}; only ideal-gas phases are supported "
                "yet.")
        return None
    try:
        full = _full_solution(path, phase)
    except Exception as err:                                  # noqa: BLE001 - CanteraError is a RuntimeError
        ck.fail("mechanism.file", f" = {file!r}: Cantera cannot load phase {phase!r}: {cantera_message(err)}")
        return None
    available = list(full.species_names)
    subset = "species" in m
    if subset:
        wanted = m["species"]
        if not isinstance(wanted, list) or not wanted or not all(isinstance(s, str) for s in wanted):
            ck.fail("mechanism.species", f" = {wanted!r}: give a list of species names, e.g. [\"H2\", \"O2\", \"N2\"].")
            return None
        unknown = [s for s in wanted if s not in available]
        for s in unknown:
            from simulator.thermo.species_data import near

            hint = near(s, available)
            ck.fail("mechanism.species", f": unknown species {s!r} in mechanism {file!r}"
                    + (f"; did you mean {', '.join(repr(h) for h in hint)}?" if hint else "."))
        if unknown:
            return None
        keep = set(wanted)
        species = tuple(s for s in available if s in keep)
        kept = len(_kept_reactions(full, keep))
    else:
        species = tuple(available)
        kept = full.n_reactions
    return MechanismSpec(file=file, path=path, phase=phase, species=species, reactions_kept=kept,
                         reactions_dropped=full.n_reactions - kept, subset=subset)


def load_mechanism_case(raw, source_path, case_dir):
    """A whole case with ``[mechanism]`` -> :class:`~simulator.case.schema.Case` (every problem at once)."""
    from simulator.case import load as base
    from simulator.case.schema import Case, Thermo

    ck = base._Checker(f"{source_path}: " if source_path else "")
    ck.keys(raw, base.KEYS[""] | {"mechanism"}, "")
    title = raw.get("title", "")
    if not isinstance(title, str) or not title.strip():
        ck.fail("title", f" = {title!r}: give a short title as text.")
        title = str(title)
    spec = read_mechanism(ck, raw, case_dir)
    if "reactions" in raw:
        ck.fail("reactions", ": [[reactions]] together with [mechanism] (user rate laws on top of the mechanism) is "
                "planned but not supported yet; remove [[reactions]] to run the mechanism's reactions.")
    if "thermo" in raw:
        ck.fail("thermo", ": with [mechanism] the species thermo is the mechanism's (ideal gas); remove [thermo] "
                "(a [thermo] table on top of a mechanism is not supported yet).")
    feed = base._feed(ck, raw)
    tube = base._tube(ck, raw)
    bed = base._bed(ck, raw)
    heat = base._heat(ck, raw)
    pdrop = base._pressure_drop(ck, raw, bed)
    design = base._design(ck, raw)
    solver = base._solver(ck, raw)
    thresholds = base._thresholds(ck, raw)
    for i, entry in enumerate(raw.get("uncertainty", []) if isinstance(raw.get("uncertainty", []), list) else []):
        ck.keys(entry, base.KEYS["uncertainty.*"], f"uncertainty.{i}")
    base._check_sizes(ck, raw, feed, tube, bed, solver)
    _refuse_unsupported(ck, raw, heat, design, feed)
    if spec is not None:
        _check_mechanism_species(ck, spec, feed, design, pdrop, heat)
    if ck.problems:
        raise CaseError(ck.problems)
    thermo = Thermo(species_file=spec.file, species_path=spec.path, equation_of_state="ideal-gas")
    return Case(title=title.strip(), source_path=source_path, thermo=thermo, reactions=(), feed=feed, tube=tube,
                heat=heat, pressure_drop=pdrop, design=design, bed=bed, solver=solver, assumptions=thresholds,
                species=spec.species, raw=raw, source=str(raw.get("source", "")), mechanism=spec)


def _refuse_unsupported(ck, raw, heat, design, feed):
    """What a mechanism tube does not run yet, one line each."""
    import math

    if heat.exchange and heat.arrangement not in MECHANISM_ARRANGEMENTS:
        ck.fail("heat.medium.arrangement", f" = {heat.arrangement!r}: {NOT_YET}; choose one of: "
                f"{', '.join(MECHANISM_ARRANGEMENTS)}.")
    if heat.coefficient is not None:
        ck.fail("heat.coefficient", f": U from correlations is {NOT_YET}; give heat.overall_coefficient.")
    if not math.isnan(design.wall_temperature_limit):
        ck.fail("design.wall_temperature_limit", f": {NOT_YET}; remove it (design.temperature_limit works).")


def _check_mechanism_species(ck, spec, feed, design, pdrop, heat):
    from simulator.thermo.species_data import near

    kept = set(spec.species)
    where = f"mechanism {spec.file!r}" + (" (mechanism.species)" if spec.subset else "")
    for s, _ in feed.mole_fractions:
        if s not in kept:
            hint = near(s, spec.species)
            ck.fail(f"feed.mole_fractions.{s}", f": feed species {s!r} is not in {where}"
                    + (f"; did you mean {', '.join(repr(h) for h in hint)}?" if hint else "."))
    key = design.key_species
    if key:
        if key not in kept:
            ck.fail("design.key_species", f" = {key!r}: not a species of {where}.")
        elif dict(feed.mole_fractions).get(key, 0.0) <= 0.0:
            ck.fail("design.key_species", f" = {key!r}: must be in the feed with a mole fraction > 0.")
    import math

    if pdrop.model != "none" and math.isnan(pdrop.viscosity):
        if not has_transport(mechanism_solution(spec.path, spec.phase, spec.species)):
            ck.fail("pressure_drop.viscosity", f": missing; {spec.file!r} has no transport data for the kept "
                    "species, so the friction needs the viscosity, e.g. viscosity = \"3e-5 Pa*s\".")

