"""Refuse an uncertainty distribution that puts much of its mass where the case is invalid.

A normal distribution of a positive quantity with a large standard deviation draws
negative values. Such a sample is not a case (the loader refuses it); leaving it out
silently would compute an exceedance probability over the accepted part only, and a
probability conditioned on an unstated event is a biased answer. Before any case runs,
:func:`checked_against_loader` finds, for every uncertain parameter, the interval of
values the case loader accepts (:func:`simulator.sweeps.validity.accepted_interval`,
all other values as in the case) and the share of the distribution outside it:

* more than :data:`REFUSED_SHARE_LIMIT` (0.1 %, common practice, no source): the entry
  is refused with the share, the bound, the loader's reason and the choices
  (``lognormal`` for a positive quantity, ``truncated-normal``);
* a truncated normal without ``low``/``high`` is cut to the accepted interval, so it
  draws no invalid sample;
* otherwise the few invalid samples run as cases, are stored as ``invalid`` and are
  counted and named in ``uncertainty.json``.
"""
import dataclasses
import math

from simulator.errors import CaseError

#: Largest share of a distribution's mass allowed outside the accepted range, [-]
#: (0.1 %: common practice, no source).
REFUSED_SHARE_LIMIT = 1e-3
#: Tail probability at which an unbounded distribution is probed, [-]
FAR_TAIL = 1e-12


def _far_ends(dist):
    low, high = (float(v) for v in dist.support())
    if not math.isfinite(low):
        low = float(dist.ppf(FAR_TAIL))
    if not math.isfinite(high):
        high = float(dist.ppf(1.0 - FAR_TAIL))
    return low, high


def _bound_text(value, current, spread):
    """An accepted bound in the unit the case writes (``"0 mol/(kg*s*bar^1.5)"``), rounded to 1e-4 spread."""
    if not math.isfinite(value):
        return "none"
    if spread > 0:
        value = round(value / (1e-4 * spread)) * 1e-4 * spread
    if not isinstance(current, str):
        return f"{value:.6g}"
    from simulator.sweeps.sampling import unit_part
    from simulator.units import _quantity, registry

    case_q = _quantity(current, "")
    ureg = registry()
    shown = ureg.Quantity(value, case_q.to_base_units().units).to(case_q.units)
    unit = unit_part(current) if len(current.split()) > 1 else ""
    magnitude = float(shown.magnitude)
    return f"{0.0 if abs(magnitude) < 1e-12 * max(abs(float(case_q.magnitude)), 1e-300) else magnitude:.6g} {unit}"


def checked_against_loader(specs, base, raw, probe, where="uncertainty"):
    """Check each distribution against the values the case loader accepts; fill truncated-normal bounds.

    Parameters
    ----------
    specs : list of UncertainParameter
        Parsed entries, in the order of the case's ``[[uncertainty]]`` array.
    base : ndarray
        Case values at the parameters, in SI units
    raw : dict
        Raw base case.
    probe : object
        With ``refusal(path, value) -> None or reason`` (:class:`~simulator.sweeps.validity.CaseProbe`).
    where : str
        Prefix of messages.

    Returns
    -------
    specs : list of UncertainParameter
        The entries, truncated normals with ``low``/``high`` set (``-inf``/``inf`` for no bound).
    ranges : dict
        ``{parameter: {"accepted_low", "accepted_high", "accepted_low_as_written",
        "accepted_high_as_written", "share_outside", "reasons"}}`` (SI values, None for no
        bound; the same in the unit of the case value, "none" for no bound), for
        ``uncertainty.json``.

    Raises
    ------
    CaseError
        One line per entry whose share outside exceeds :data:`REFUSED_SHARE_LIMIT`.
    """
    from simulator.sweeps.paths import get_path
    from simulator.sweeps.sampling import distribution
    from simulator.sweeps.validity import accepted_interval

    if specs:
        why = probe.refusal(specs[0].parameter, float(base[0]))
        if why is not None:
            raise CaseError(f"{where}: the case itself is refused, so no sample can run: {why}")
    problems, checked, ranges = [], [], {}
    for index, (spec, centre) in enumerate(zip(specs, base)):
        dist_spec = spec
        if spec.distribution == "truncated-normal":    # probe the parent normal's reach
            dist_spec = dataclasses.replace(spec, distribution="normal")
        dist = distribution(dist_spec, centre)
        far_low, far_high = _far_ends(dist)
        if spec.distribution == "truncated-normal":
            far_low = far_low if spec.low is None else max(far_low, spec.low)
            far_high = far_high if spec.high is None else min(far_high, spec.high)
        low, high, reasons = accepted_interval(probe, spec.parameter, float(centre), far_low, far_high, cdf=dist.cdf)
        if spec.distribution == "truncated-normal":
            # only missing bounds default to the accepted range; given ones are kept and checked below
            spec = dataclasses.replace(spec, low=low if spec.low is None else spec.low,
                                       high=high if spec.high is None else spec.high)
        actual = distribution(spec, centre)
        share = (float(actual.cdf(low)) if math.isfinite(low) else 0.0) \
            + (float(actual.sf(high)) if math.isfinite(high) else 0.0)
        current = get_path(raw, spec.parameter)
        spread = float(dist.std()) if math.isfinite(float(dist.std())) else 0.0
        ranges[spec.parameter] = {"accepted_low": low if math.isfinite(low) else None,
                                  "accepted_high": high if math.isfinite(high) else None,
                                  "accepted_low_as_written": _bound_text(low, current, spread),
                                  "accepted_high_as_written": _bound_text(high, current, spread),
                                  "share_outside": share, "reasons": reasons}
        if share > REFUSED_SHARE_LIMIT:
            side = "low" if "low" in reasons and (not math.isfinite(high) or actual.cdf(low) >= actual.sf(high)) \
                else "high"
            bound = low if side == "low" else high
            written = dict(spec.text or {})
            problems.append(
                f"{where}.{index}: a {spec.distribution} distribution of {spec.parameter} "
                f"({', '.join(f'{k} = {v!r}' for k, v in written.items() if k in ('std', 'factor', 'low', 'high'))}) "
                f"puts {100 * share:.3g} % of its samples where the case is refused "
                f"({'below' if side == 'low' else 'above'} {_bound_text(bound, current, spread)}: "
                f"{reasons[side].split(': ', 1)[-1].rstrip('.')}); "
                f"at most {100 * REFUSED_SHARE_LIMIT:g} % is accepted. Use distribution = \"lognormal\" "
                "(for a positive quantity) or \"truncated-normal\" (std, optional low and high; "
                "default the accepted range), or a smaller spread")
        checked.append(spec)
    if problems:
        raise CaseError(problems)
    return checked, ranges


def outside(ranges, values):
    """Parameters of one sample that lie outside their accepted interval (by name).

    Parameters
    ----------
    ranges : dict
        As :func:`checked_against_loader` returns.
    values : dict
        ``{parameter: value}`` of a sample, in SI units

    Returns
    -------
    list of str
        e.g. ``["reactions.0.pre_exponential below 0"]``.
    """
    out = []
    for path, rng in ranges.items():
        v = values.get(path)
        if v is None:
            continue
        if rng["accepted_low"] is not None and v < rng["accepted_low"]:
            out.append(f"{path} below {rng['accepted_low_as_written']}")
        elif rng["accepted_high"] is not None and v > rng["accepted_high"]:
            out.append(f"{path} above {rng['accepted_high_as_written']}")
    return out


def check_uncertainty_entries(raw, case_dir, source_path="", probe=None):
    """Everything ``tubesim uncertainty`` checks before a case runs (also for ``tubesim validate``).

    Parameters
    ----------
    raw : dict
        Raw case with ``[[uncertainty]]`` entries (the case itself already accepted).
    case_dir : str
        Folder of the case file.
    source_path : str
        Case file, for messages.
    probe : object, optional
        ``refusal(path, value) -> None or reason``; default the case loader
        (:class:`~simulator.sweeps.validity.CaseProbe`).

    Returns
    -------
    specs : list of UncertainParameter
        The entries, truncated normals with their bounds.
    base : ndarray
        Case values at the parameters, in SI units
    ranges : dict
        Accepted range per parameter (:func:`checked_against_loader`).

    Raises
    ------
    CaseError
        As :func:`simulator.sweeps.sampling.parse_uncertainty` and :func:`checked_against_loader`.
    """
    from simulator.sweeps import sampling
    from simulator.sweeps.validity import CaseProbe

    where = f"{source_path}: uncertainty" if source_path else "uncertainty"
    specs = sampling.parse_uncertainty(raw.get("uncertainty"), raw, where=where)
    base = sampling.base_values(specs, raw)
    probe = probe if probe is not None else CaseProbe(raw, str(case_dir), str(source_path))
    specs, ranges = checked_against_loader(specs, base, raw, probe, where=where)
    return specs, base, ranges
