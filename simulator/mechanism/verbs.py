"""What each verb does with a mechanism case: ``run`` and ``validate`` work; the others refuse in one line.

The verbs that need the compiled kernel's model (assumptions, size, screen, sweep,
uncertainty, report) do not run a mechanism case yet; each says so, naming the verb.
"""
from simulator.errors import CaseError

#: Verbs that run a mechanism case today.
WORKING_VERBS = ("validate", "run")
#: Verbs that refuse a mechanism case, with what is missing.
NOT_YET_VERBS = {
    "assumptions": "the ideal-design comparison needs the kernel's declared reactions",
    "size": "the length/tube-count search runs the compiled kernel",
    "screen": "runaway screening needs a single dominant exothermic step",
    "sweep": "sweeps run the compiled kernel",
    "uncertainty": "uncertainty samples run the compiled kernel",
    "sweep or uncertainty": "sweeps and uncertainty samples run the compiled kernel",
    "report": "the report is built from the kernel's model",
}


def refuse_for_mechanism(case, verb):
    """Raise a one-line CaseError when ``case`` is a mechanism case and ``verb`` does not run it yet."""
    if case.mechanism is None or verb in WORKING_VERBS:
        return
    why = NOT_YET_VERBS.get(verb, "")
    raise CaseError(f"{case.source_path}: mechanism: {verb} is not yet for mechanism cases ({why}); "
                    f"{' and '.join(WORKING_VERBS)} work.")


def readiness_notes(case):
    """Notes the validate verb prints for a mechanism case."""
    return [case.mechanism.describe(),
            f"{' and '.join(WORKING_VERBS)} run this case; "
            f"{', '.join(v for v in NOT_YET_VERBS if ' ' not in v)}: not yet for mechanism cases."]
