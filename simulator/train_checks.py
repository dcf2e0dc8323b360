"""Assumption check and runaway screen of a reactor train, bed by bed.

The train is run first (:func:`simulator.solve.train.simulate_train`); each bed is then checked as
the tube it is, fed by its exact inlet from the run (:func:`simulator.solve.train.standalone_case`):
the assumption check (:func:`simulator.assumptions.check_assumptions`) and the runaway screen
(:func:`simulator.screening.screen.screen`) of each bed, unchanged. A train that did not complete is
not checked (the beds after a failure or a stop have no inlet): one line says which bed and why.

The screening's train-level risk level is the worst of the beds' levels
(:func:`simulator.verdicts.worst`), the same rule the single-tube screening applies to its criteria.
"""
from simulator.assumptions import check_assumptions, format_table
from simulator.errors import SimulatorError
from simulator.screening.screen import format_screening, screen, screening_json, sensitivity_rows
from simulator.solve.train import simulate_train, standalone_case
from simulator.verdicts import worst


def _bed_cases(case):
    """[(bed number, standalone case)] of every bed of a completed train run."""
    train = simulate_train(case)
    if train.status != "completed":
        raise SimulatorError(f"the train run did not complete, so its beds have no inlets to check: "
                             f"{train.termination}")
    return [(k + 1, standalone_case(result.case)) for k, result in enumerate(train.beds)]


def train_assumptions(case):
    """The ``assumptions.json`` dict of a train: one single-tube assumption report per bed."""
    beds = [{"bed": k, **check_assumptions(bed)} for k, bed in _bed_cases(case)]
    target = case.design.target_conversion
    note = ("each bed is checked on its own outlet conversion: a bed has no target of its own"
            + ("" if target != target else f" (the train's target X = {target:.4g} applies to the train outlet)"))
    return {"title": case.title, "key_species": case.design.key_species, "train": {"beds": beds, "note": note}}


def format_train_assumptions(report):
    """Terminal tables of a train's assumption check, one per bed."""
    lines = [f"bed {b['bed']}\n{format_table(b)}" for b in report["train"]["beds"]]
    return "\n".join(lines + [f"train: {report['train']['note']}"])


def train_screening(case):
    """The screening of every bed: (``screening.json`` dict, sensitivity rows with the bed number).

    Returns
    -------
    dict, list
        ``train`` {``beds`` (each bed's screening.json dict with ``bed``), ``risk_level`` (worst of the
        beds), ``risk_rule``}; rows ``(bed, parameter, value_SI, hot_spot_temperature_K,
        normalized_sensitivity)``.
    """
    beds, rows = [], []
    for k, bed in _bed_cases(case):
        report = screen(bed)
        beds.append({"bed": k, **screening_json(report)})
        rows += [(k, *row) for row in sensitivity_rows(report)]
    level = worst([b["risk_level"] for b in beds])
    summary = {"title": case.title, "key_species": case.design.key_species,
               "train": {"beds": beds, "risk_level": level,
                         "risk_rule": "the worst of the beds' risk levels (each bed screened as the tube it is, "
                                      "fed by its inlet from the train run)"}}
    return summary, rows


def format_train_screening(summary):
    """Terminal summary of a train's screening: each bed's, then the train's level."""
    lines = []
    for b in summary["train"]["beds"]:
        lines += [f"bed {b['bed']}", format_screening(b)]
    t = summary["train"]
    lines.append(f"train: risk level {t['risk_level']} ({t['risk_rule']})")
    return "\n".join(lines)
