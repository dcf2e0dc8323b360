"""Everything the verbs need from a case, checked without running the tube (the ``validate`` verb).

:func:`check_case` loads the case (every field and its plausible range), builds
the model the integrator would get (species data, critical constants for
Peng-Robinson, viscosity from transport data), parses the ``[[uncertainty]]``
entries with the sampler's own validator and collects the plausibility
warnings. A problem that only some verbs meet names those verbs.
"""
import math
from dataclasses import dataclass, field

from simulator.case.load import load_case
from simulator.case.plausibility import plausibility_warnings
from simulator.errors import CaseError, SimulatorError

#: The verbs that build the model and run the tube at least once.
TUBE_VERBS = ("run", "assumptions", "size", "screen", "report", "sweep", "uncertainty")


@dataclass(frozen=True)
class Readiness:
    """Outcome of :func:`check_case`: the case, plausibility warnings and notes per verb."""

    case: object
    warnings: list = field(default_factory=list)
    notes: list = field(default_factory=list)      # what a verb needs that the case does not give


def check_case(path):
    """Check a case file for every verb.

    Parameters
    ----------
    path : str or pathlib.Path
        Case file.

    Returns
    -------
    Readiness

    Raises
    ------
    CaseError
        Listing every problem, one line each, with the verbs that need what is missing.
    """
    from simulator.model.build import build_model
    from simulator.sweeps.sampling import parse_uncertainty

    case = load_case(path)
    if case.mechanism is not None:       # a Cantera mechanism case: simulator.mechanism.verbs
        from simulator.mechanism.verbs import readiness_notes

        return Readiness(case=case, warnings=plausibility_warnings(case), notes=readiness_notes(case))
    where = f"{case.source_path}: " if case.source_path else ""
    problems = []
    model = None
    try:
        model = build_model(case)
    except SimulatorError as err:
        lines = err.problems if isinstance(err, CaseError) else [str(err)]
        problems += [f"{line.rstrip('.')} (needed by {TUBE_VERBS[0]} and every verb that runs the tube: "
                     f"{', '.join(TUBE_VERBS[1:])})." for line in lines]
    for k, entry in enumerate(case.train[1:], start=2):     # later beds of a train (bed 1 is built above)
        try:
            build_model(entry.case)
        except SimulatorError as err:
            lines = err.problems if isinstance(err, CaseError) else [str(err)]
            problems += [f"train[{k}]: {line.rstrip('.')} (needed by run)." for line in lines]
    entries = case.raw.get("uncertainty")
    if entries is not None:
        try:
            parse_uncertainty(entries, case.raw, where=f"{where}uncertainty")
        except CaseError as err:
            problems += [f"{line.rstrip('.')} (needed by uncertainty)." for line in err.problems]
        if case.raw.get("design", {}).get("temperature_limit") is None:
            problems.append(f"{where}design.temperature_limit: missing; uncertainty estimates the probability "
                            "that the hot spot exceeds it (needed by uncertainty).")
    if problems:
        raise CaseError(problems)
    notes = []
    if case.design.target_conversion != case.design.target_conversion:    # NaN: not given
        notes.append("size needs design.target_conversion (not given); the other verbs report conversion "
                     "without a target.")
    uncooled = [(k, e.case.heat.mode) for k, e in enumerate(case.train, start=1) if not e.case.heat.exchange]
    if case.train and uncooled:      # a train is screened bed by bed
        beds = ", ".join(f"train[{k}] ({mode})" for k, mode in uncooled)
        notes.append(f"screen: runaway screening is for a bed that exchanges heat through its wall "
                     f'(heat.mode = "exchange"); not screened: {beds}.')
    elif not case.train and not case.heat.exchange:
        notes.append(f"screen: heat.mode = {case.heat.mode!r}; runaway screening is for a tube that exchanges heat "
                     'through its wall (heat.mode = "exchange").')
    rise = model.adiabatic[0]
    if not (math.isfinite(rise) and rise > 0):
        what = f"adiabatic rise {rise:+.4g} K" if math.isfinite(rise) else "no adiabatic path to complete conversion"
        notes.append(f"screen: no exothermic path for the key species {case.design.key_species} ({what}); runaway "
                     "screening does not apply.")
    if case.bed is not None and case.heat.exchange and not case.radial.given:
        notes.append("assumptions: the one_dimensional row needs [bed] radial_conductivity, radial_diffusivity and "
                     "wall_coefficient (not given); it says \"not checked\" without them.")
    if entries is None:
        notes.append("uncertainty needs [[uncertainty]] entries (none given).")
    return Readiness(case=case, warnings=plausibility_warnings(case), notes=notes)
