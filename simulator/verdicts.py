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

Margins to a runaway boundary (one rule, :func:`margin_level`): a margin is signed
so that positive is the safe side; on or past the boundary it is ``unacceptable``,
closer than its review margin ``review``, else ``acceptable``. The review margins
(:func:`review_margin`, common practice, no source) are

* a feed fraction of the key species (any criterion's critical feed fraction):
  10 % of the operating value;
* a medium or inlet temperature: R Tc^2/E, the change that moves the rate
  constant e-fold (the temperature scale of Semenov and Van Welsenaere-Froment);
* the hot spot below the maxima-curve temperature T_m (Van Welsenaere-Froment
  criterion I): a quarter of R Tc^2/E, since T_m itself lies only about R Tc^2/E
  above the medium.

Every table row, summary sentence and JSON ``level`` of a margin comes from these
two functions, so they cannot disagree.
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
RISK_LEVELS = {"adequate margin": ACCEPTABLE, "sensitive": REVIEW, "runaway": UNACCEPTABLE,
               "not applicable": ACCEPTABLE}


#: Review margin of a key-species feed fraction, relative to the operating value, [-] (common practice, no source).
FEED_FRACTION_REVIEW = 0.10
#: Review margin of a medium or inlet temperature, in units of R Tc^2/E, [-] (common practice, no source).
TEMPERATURE_REVIEW = 1.0
#: Review margin of the hot spot below T_m, in units of R Tc^2/E, [-] (common practice, no source).
HOT_SPOT_REVIEW = 0.25
#: Kinds of margin and their review margins (see :func:`review_margin`).
MARGIN_KINDS = ("feed_fraction", "temperature", "hot_spot")


def review_margin(kind, operating_value=None, temperature_scale=None):
    """The margin below which a safe-side margin of this kind is flagged for review.

    Parameters
    ----------
    kind : str
        ``"feed_fraction"`` (needs ``operating_value``), ``"temperature"`` or ``"hot_spot"``
        (need ``temperature_scale``).
    operating_value : float, optional
        Operating feed fraction of the key species, [-]
    temperature_scale : float, optional
        R Tc^2/E of the reaction that drives the runaway, [K]

    Returns
    -------
    float or None
        Same unit as the margin; None when the scale it needs is missing or not finite.

    >>> review_margin("feed_fraction", 0.05), review_margin("temperature", temperature_scale=24.0)
    (0.005000000000000001, 24.0)
    >>> review_margin("hot_spot", temperature_scale=24.0)
    6.0
    """
    if kind == "feed_fraction":
        base = operating_value
        factor = FEED_FRACTION_REVIEW
    elif kind in ("temperature", "hot_spot"):
        base = temperature_scale
        factor = TEMPERATURE_REVIEW if kind == "temperature" else HOT_SPOT_REVIEW
    else:
        raise ValueError(f"kind = {kind!r}: choose one of: {', '.join(MARGIN_KINDS)}.")
    if base is None or not math.isfinite(base):
        return None
    return factor * abs(base)


def margin_level(margin, review):
    """Level of a margin to a runaway boundary (positive = safe side).

    Parameters
    ----------
    margin : float or None
        Distance of the operating point from the boundary, positive on the safe side, in the
        boundary's own unit; None when no boundary was located.
    review : float or None
        Margin below which a safe-side margin is flagged (:func:`review_margin`).

    Returns
    -------
    str or None
        ``unacceptable`` on or past the boundary (margin <= 0), ``review`` closer than
        ``review``, ``acceptable`` otherwise; None without a margin (no boundary to judge).

    >>> margin_level(-0.1, 1.0), margin_level(0.5, 1.0), margin_level(2.0, 1.0), margin_level(None, 1.0)
    ('unacceptable', 'review', 'acceptable', None)
    """
    if margin is None or not math.isfinite(margin):
        return None
    if margin <= 0.0:
        return UNACCEPTABLE
    if review is not None and margin < review:
        return REVIEW
    return ACCEPTABLE


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
    """Level of the screening's risk class; an unknown class -> review.

    "not applicable" (nothing that can run away: the reactions take up heat in net, or their rate
    does not rise with temperature) is ``acceptable`` for the runaway risk.
    """
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
