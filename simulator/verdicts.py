"""Verdict levels: one rule per kind of verdict, shared by every JSON file and the report.

Every verdict the tool gives (an assumption that holds or fails, a runaway
criterion, the screening's risk class) carries one of three levels, written
beside it as ``level`` in the JSON files and shown as word + symbol + pattern in
the report:

``acceptable``
    nothing to act on by this measure;
``review``
    a reviewer should look at it (the measure is near or past its threshold, or
    the tool could not decide);
``unacceptable``
    the design as given fails this measure.

The thresholds here are documented choices: the 5 % design change is common
practice, no source; the criteria and risk mappings follow the criteria's own
published verdicts (see :mod:`simulator.screening.criteria`).
"""
import math

ACCEPTABLE, REVIEW, UNACCEPTABLE = "acceptable", "review", "unacceptable"
LEVELS = (ACCEPTABLE, REVIEW, UNACCEPTABLE)

#: |design change| [-] above which an assumption that holds by its own measure is still
#: flagged for review, because applying it alone moves the design (5 %, common practice, no source).
DESIGN_CHANGE_REVIEW = 0.05

#: Level of a runaway criterion's verdict.
CRITERION_LEVELS = {"safe": ACCEPTABLE, "undecided": REVIEW, "runaway": UNACCEPTABLE}
#: Level of the screening's risk class.
RISK_LEVELS = {"adequate margin": ACCEPTABLE, "sensitive": REVIEW, "runaway": UNACCEPTABLE}


def assumption_level(verdict, design_change_percent):
    """Level of one assumption of the ideal design.

    Parameters
    ----------
    verdict : str
        ``"holds"``, ``"fails"`` or ``"unknown"``.
    design_change_percent : float or None
        Change of the design quantity caused by this assumption alone, [%].

    Returns
    -------
    str
        ``acceptable`` when it holds and moves the design by at most
        :data:`DESIGN_CHANGE_REVIEW`; ``review`` otherwise (fails, unknown, or
        holds by its measure but moves the design more).

    >>> assumption_level("holds", 1.0), assumption_level("holds", -12.0), assumption_level("fails", 0.0)
    ('acceptable', 'review', 'review')
    """
    if verdict != "holds":
        return REVIEW
    if design_change_percent is not None and math.isfinite(design_change_percent) \
            and abs(design_change_percent) > 100.0 * DESIGN_CHANGE_REVIEW:
        return REVIEW
    return ACCEPTABLE


def criterion_level(verdict):
    """Level of a runaway criterion's verdict (``safe``/``undecided``/``runaway``); unknown -> review."""
    return CRITERION_LEVELS.get(verdict, REVIEW)


def risk_level(risk):
    """Level of the screening's risk class; an unknown class -> review."""
    return RISK_LEVELS.get(risk, REVIEW)


def worst(levels):
    """The most severe of some levels (``acceptable`` for none).

    >>> worst(["acceptable", "review"]), worst([])
    ('review', 'acceptable')
    """
    rank = {level: k for k, level in enumerate(LEVELS)}
    return max(levels, key=rank.__getitem__, default=ACCEPTABLE)


def null_where_not_finite(tree):
    """A copy of a JSON-ready tree with every non-finite float (inf, NaN) replaced by None.

    The tool says ``null`` where it cannot compute a number, never inf or NaN (which JSON cannot
    carry and a reader would take for a result).

    >>> null_where_not_finite({"a": float("inf"), "b": [1.0, float("nan")], "c": "x"})
    {'a': None, 'b': [1.0, None], 'c': 'x'}
    """
    if isinstance(tree, float):
        return tree if math.isfinite(tree) else None
    if isinstance(tree, dict):
        return {k: null_where_not_finite(v) for k, v in tree.items()}
    if isinstance(tree, (list, tuple)):
        return [null_where_not_finite(v) for v in tree]
    return tree
