"""Report text of a ``tubesim uncertainty`` run: the exceedance probability, its interval and what was left out.

:func:`uncertainty_paragraphs` turns the content of ``uncertainty.json``
(written by :func:`simulator.sweeps.execute.run_uncertainty`) into report
sentences. The probability is never printed without its interval, its
numerator and denominator, and the samples left out of it (invalid samples,
failed runs, runs without a hot spot), so a reader sees when the estimate
rests on part of the samples only. Fields a given version of the file does
not carry are simply not printed; nothing is guessed.

The probability is the share of sampled cases whose hot spot exceeds the
limit under the model and the distributions given; the text says that it is
not a frequency of failure of a plant.
"""
from simulator.report.context_format import _finite, fixed, fmt

#: Words for the left-out classes of ``probability_exceeding_limit.left_out``.
_LEFT_OUT_WORDS = {"invalid": "invalid (values the case refuses)", "failed": "failed (numerical failure)",
                   "stopped_below_limit": "stopped below the limit (hot spot unknown)",
                   "without_hot_spot": "without a hot spot"}


def _left_out(samples, probability):
    """{class: count} of the samples left out of the probability (either file version)."""
    left = probability.get("left_out")
    if isinstance(left, dict):
        return {k: int(v) for k, v in left.items() if isinstance(v, (int, float)) and v}
    out = {}
    for key in ("invalid", "failed", "without_hot_spot"):
        value = samples.get(key)
        if isinstance(value, (int, float)) and value:
            out[key] = int(value)
    return out


def uncertainty_paragraphs(data):
    """Sentences of the report on one uncertainty run.

    Parameters
    ----------
    data : dict
        Content of ``uncertainty.json``, [-]

    Returns
    -------
    list of str
        The run (samples, method, seed), the exceedance probability with its
        confidence interval and denominator, what was left out and why, the
        hot-spot percentiles, and what the probability means, [-]
    """
    samples = data.get("samples") or {}
    probability = data.get("probability_exceeding_limit") or {}
    limit = data.get("temperature_limit_K")
    engine = f", {data['engine']} engine" if data.get("engine") else ""
    parts = [f"Uncertainty run in the same output folder: {samples.get('n', 'an unknown number of')} samples "
             f"({samples.get('method', 'sampling method not recorded')}, seed {samples.get('seed', 'not recorded')}"
             f"{engine})."]
    counts = [(samples.get(k), k) for k in ("completed", "stopped", "failed", "invalid")]
    if any(isinstance(v, int) for v, _ in counts):
        parts[0] += " Runs: " + ", ".join(f"{v} {k}" for v, k in counts if isinstance(v, int)) + "."
    out = [" ".join(parts)]
    estimate = probability.get("estimate")
    left = _left_out(samples, probability)
    left_text = ", ".join(f"{n} {_LEFT_OUT_WORDS.get(k, k.replace('_', ' '))}" for k, n in left.items()) or "none"
    where = f"P(hot spot > {fixed(limit)} K)" if _finite(limit) else "P(hot spot > limit)"
    if not _finite(estimate):
        out.append(f"{where}: cannot be estimated, no sample gave a hot spot. Left out: {left_text}.")
    else:
        denominator = probability.get("denominator", probability.get("n"))
        interval = probability.get("interval") or [None, None]
        confidence = probability.get("confidence")
        method = probability.get("interval_method", "binomial interval")
        level = f"{fixed(100.0 * confidence, 0)} %" if _finite(confidence) else "confidence"
        text = (f"{where} = {fmt(estimate, 3)} ({probability.get('exceeding')} of {denominator} samples); "
                f"{level} interval {fmt(interval[0], 3)} to {fmt(interval[1], 3)} ({method}). "
                f"Left out of the probability: {left_text}.")
        bracket = probability.get("if_left_out_exceeded")
        if isinstance(bracket, (list, tuple)) and len(bracket) == 2 and bracket[0] != bracket[1]:
            text += (f" Had none or all of the failed and undetermined samples exceeded the limit, the "
                     f"probability would be {fmt(bracket[0], 3)} or {fmt(bracket[1], 3)}.")
        if left.get("invalid"):
            text += " The probability is conditional on a valid case."
        out.append(text)
    reasons = samples.get("invalid_reasons") or []
    if reasons:
        out.append("Invalid samples: " + "; ".join(f"{r.get('count')} because {r.get('reason')}"
                                                    for r in reasons[:3]) + ".")
    pct = ((data.get("percentiles") or {}).get("hot_spot_temperature_K") or {})
    shown = [f"{k} {fixed(v)} K" for k, v in pct.items() if _finite(v)]
    if shown:
        out.append("Hot-spot temperature over the samples: " + ", ".join(shown) + ".")
    out.append("The probability is the share of sampled cases above the limit under this model and the "
               "distributions given in the case; it is not a frequency of failure of a plant.")
    return out
