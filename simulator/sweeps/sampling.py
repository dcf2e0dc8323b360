"""Uncertainty entries of a case, quasi-random sampling, and Monte Carlo statistics.

A case declares uncertain parameters as::

    [[uncertainty]]
    parameter = "reactions.0.activation_energy"
    distribution = "normal"       # mean = case value, std
    std = "2 kJ/mol"

    [[uncertainty]]
    parameter = "reactions.0.pre_exponential"
    distribution = "lognormal"    # median = case value, factor = multiplicative 1-sigma factor
    factor = 1.5

    [[uncertainty]]
    parameter = "heat.medium.temperature"
    distribution = "uniform"      # low, high (absolute values)
    low = "600 K"
    high = "700 K"

Units of ``std``, ``low`` and ``high`` must have the dimension of the case value at
``parameter``; a temperature ``std`` is a difference ("2 K" or "2 delta_degC").
Samples are drawn as points in the unit hypercube (Latin hypercube [1]_ or scrambled
Sobol' [2]_ via :mod:`scipy.stats.qmc`) and mapped through the inverse CDFs. Normal
samples are not truncated: a sample that makes the case invalid (a negative
pre-exponential factor) fails that case, which is then counted as failed.

References
----------
.. [1] M. D. McKay, R. J. Beckman and W. J. Conover, "A comparison of three methods for
   selecting values of input variables in the analysis of output from a computer code,"
   Technometrics, vol. 21, no. 2, pp. 239-245, 1979, doi:10.1080/00401706.1979.10489755.
.. [2] I. M. Sobol', "On the distribution of points in a cube and the approximate evaluation
   of integrals," USSR Comput. Math. Math. Phys., vol. 7, no. 4, pp. 86-112, 1967,
   doi:10.1016/0041-5553(67)90144-9.
"""
import difflib
import math
import secrets
import warnings
from dataclasses import dataclass

import numpy as np

from simulator.errors import CaseError, SimulatorWarning
from simulator.sweeps.paths import dimensionality_of, get_path
from simulator.units import parse_quantity

#: Distributions and the keys each one needs.
DISTRIBUTIONS = {"normal": ("std",), "lognormal": ("factor",), "uniform": ("low", "high")}
_ALLOWED_KEYS = {"parameter", "distribution", "std", "factor", "low", "high", "note"}
METHODS = ("lhs", "sobol")


@dataclass(frozen=True)
class UncertainParameter:
    """One ``[[uncertainty]]`` entry, checked and in SI.

    Attributes
    ----------
    parameter : str
        Dotted path into the raw case.
    distribution : str
        ``"normal"``, ``"lognormal"`` or ``"uniform"``.
    std : float or None
        Standard deviation of a normal distribution, in SI units
    factor : float or None
        Multiplicative one-sigma factor of a lognormal distribution (> 1), [-]
    low, high : float or None
        Bounds of a uniform distribution, in SI units
    text : dict
        The entry as written, for the record.
    """

    parameter: str
    distribution: str
    std: float = None
    factor: float = None
    low: float = None
    high: float = None
    text: dict = None

    def describe(self):
        """JSON-ready description: the entry as written plus SI values."""
        si = {k: getattr(self, k) for k in ("std", "factor", "low", "high") if getattr(self, k) is not None}
        return {"parameter": self.parameter, "distribution": self.distribution,
                "as_written": dict(self.text or {}), "si": si}


def parse_uncertainty(entries, raw, where="uncertainty"):
    """Check the case's ``[[uncertainty]]`` entries against the case and convert to SI.

    Parameters
    ----------
    entries : list of dict
        The ``uncertainty`` array of tables of the raw case.
    raw : dict
        Raw base case (the values at each ``parameter`` give mean/median and dimension).
    where : str
        Prefix of error messages (file name and key).

    Returns
    -------
    list of UncertainParameter
        One per entry, in order.

    Raises
    ------
    CaseError
        Listing every problem found (unknown keys, missing keys, wrong units, bad values).
    """
    if not entries:
        raise CaseError(f'{where}: the case has no [[uncertainty]] entries; add e.g. parameter = '
                        '"heat.medium.temperature", distribution = "normal", std = "2 K"')
    if not isinstance(entries, list):
        raise CaseError(f"{where}: expected an array of tables [[uncertainty]], got {type(entries).__name__}")
    problems, specs, seen = [], [], set()
    for index, entry in enumerate(entries):
        here = f"{where}[{index}]"
        try:
            spec = _parse_entry(entry, raw, here)
        except CaseError as err:
            problems.extend(err.problems)
            continue
        if spec.parameter in seen:
            problems.append(f"{here}.parameter = {spec.parameter!r}: declared twice; give one entry per parameter")
        seen.add(spec.parameter)
        specs.append(spec)
    if problems:
        raise CaseError(problems)
    return specs


def _parse_entry(entry, raw, here):
    if not isinstance(entry, dict):
        raise CaseError(f"{here}: expected a table with parameter, distribution and its parameters")
    problems = []
    for key in sorted(set(entry) - _ALLOWED_KEYS):
        near = difflib.get_close_matches(key, sorted(_ALLOWED_KEYS), n=1)
        hint = f" Did you mean {near[0]!r}?" if near else ""
        problems.append(f"{here}.{key}: unknown key; allowed: {', '.join(sorted(_ALLOWED_KEYS))}.{hint}")
    path = entry.get("parameter")
    dist = entry.get("distribution")
    if not isinstance(path, str):
        problems.append(f"{here}.parameter: missing; give the dotted path of a case value")
    if dist not in DISTRIBUTIONS:
        near = difflib.get_close_matches(str(dist), list(DISTRIBUTIONS), n=1)
        hint = f" Did you mean {near[0]!r}?" if near else ""
        problems.append(f"{here}.distribution = {dist!r}: choose one of: {', '.join(DISTRIBUTIONS)}.{hint}")
    if problems:
        raise CaseError(problems)
    for key in DISTRIBUTIONS[dist]:
        if key not in entry:
            problems.append(f"{here}.{key}: missing; a {dist} distribution needs {' and '.join(DISTRIBUTIONS[dist])}")
    for key in sorted({"std", "factor", "low", "high"} - set(DISTRIBUTIONS[dist])):
        if key in entry:
            takes = ", ".join(DISTRIBUTIONS[dist])
            problems.append(f"{here}.{key}: not used by a {dist} distribution; it takes {takes}")
    if problems:
        raise CaseError(problems)
    current = get_path(raw, path)
    dim = dimensionality_of(current, path)
    if isinstance(current, int) and not isinstance(current, bool):
        raise CaseError(f"{here}.parameter = {path!r}: whole-number field (case value {current!r}) "
                        "cannot take continuous samples")
    base = _value_si(current, dim, path)
    values = {}
    if dist == "normal":
        values["std"] = _given(entry["std"], dim, f"{here}.std", difference=True)
        if values["std"] <= 0:
            problems.append(f"{here}.std = {entry['std']!r}: must be > 0")
    elif dist == "lognormal":
        factor = entry["factor"]
        if isinstance(factor, bool) or not isinstance(factor, (int, float)) or not factor > 1:
            problems.append(f"{here}.factor = {factor!r}: a plain number > 1 (the multiplicative one-sigma factor)")
        else:
            values["factor"] = float(factor)
        if not base > 0:
            problems.append(f"{here}.parameter = {path!r}: lognormal needs a positive case value, got {current!r}")
    else:
        values["low"] = _given(entry["low"], dim, f"{here}.low")
        values["high"] = _given(entry["high"], dim, f"{here}.high")
        if not values["low"] < values["high"]:
            problems.append(f"{here}: low = {entry['low']!r} must be below high = {entry['high']!r}")
    if problems:
        raise CaseError(problems)
    return UncertainParameter(parameter=path, distribution=dist, text=dict(entry), **values)


def _value_si(value, dim, where):
    if dim == "dimensionless":
        if isinstance(value, str):
            return parse_quantity(value, "dimensionless", where)
        return float(value)
    return parse_quantity(value, dim, where)


def _given(value, dim, where, difference=False):
    """A distribution parameter in SI, with the dimension of the case value."""
    if dim == "dimensionless":
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            raise CaseError(f"{where} = {value!r}: the parameter is dimensionless; give a plain number")
        return float(value)
    if difference and dim == "[temperature]":
        return parse_quantity(value, "temperature_difference", where)
    return parse_quantity(value, dim, where)


def base_values(specs, raw):
    """Case values at each uncertain parameter, in SI.

    Parameters
    ----------
    specs : list of UncertainParameter
        Parsed entries.
    raw : dict
        Raw base case.

    Returns
    -------
    ndarray
        Shape ``(len(specs),)``, in SI units
    """
    out = []
    for spec in specs:
        current = get_path(raw, spec.parameter)
        out.append(_value_si(current, dimensionality_of(current, spec.parameter), spec.parameter))
    return np.array(out, dtype=float)


def fresh_seed():
    """A new random seed (48 bits) to record when the user gives none."""
    return secrets.randbits(48)


def unit_points(n, d, seed, method="lhs"):
    """``n`` points in the open unit hypercube ``(0, 1)^d``.

    Parameters
    ----------
    n : int
        Number of points.
    d : int
        Dimension.
    seed : int
        Seed of the generator.
    method : {"lhs", "sobol"}
        Latin hypercube (McKay et al. 1979, centred randomly in its cells) or
        scrambled Sobol' (Sobol' 1967; see the module References).
        Sobol' points keep their balance only for ``n`` a power of 2; other ``n`` give
        a :class:`SimulatorWarning` naming the nearest powers.

    Returns
    -------
    ndarray
        Shape ``(n, d)``, [-]
    """
    from scipy.stats import qmc

    if method not in METHODS:
        raise CaseError(f"--method {method!r}: choose one of: {', '.join(METHODS)}")
    if isinstance(n, bool) or not isinstance(n, (int, np.integer)) or n < 1:
        raise CaseError(f"--samples {n!r}: must be a whole number >= 1")
    n = int(n)
    engine_class = qmc.LatinHypercube if method == "lhs" else qmc.Sobol
    try:
        engine = engine_class(d, rng=np.random.default_rng(seed))  # scipy >= 1.15
    except TypeError:
        engine = engine_class(d, seed=np.random.default_rng(seed))
    if method == "sobol":
        m = n.bit_length() - 1
        if n == 1 << m:
            u = engine.random_base2(m)
        else:
            warnings.warn(SimulatorWarning(
                f"--samples {n} with Sobol' points: the balance properties need a power of 2 "
                f"({1 << m} or {1 << (m + 1)}); continuing with {n}"), stacklevel=2)
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", UserWarning)  # scipy's own note says the same
                u = engine.random(n)
    else:
        u = engine.random(n)
    tiny = np.finfo(float).tiny
    return np.clip(u, tiny, 1.0 - np.finfo(float).epsneg)


def sample(specs, base, n, seed, method="lhs"):
    """Samples of the uncertain parameters, in SI.

    Parameters
    ----------
    specs : list of UncertainParameter
        Parsed entries.
    base : ndarray
        Case values at the parameters (mean of normal, median of lognormal), in SI units
    n : int
        Number of samples.
    seed : int
        Seed (recorded with the results).
    method : {"lhs", "sobol"}
        Sampling design (:func:`unit_points`).

    Returns
    -------
    ndarray
        Shape ``(n, len(specs))``, in SI units

    Notes
    -----
    With ``u`` a coordinate of a unit point and :math:`\\Phi^{-1}` the standard normal
    quantile function:

    * normal: :math:`x = \\mu + \\sigma \\Phi^{-1}(u)`, :math:`\\mu` = case value;
    * lognormal: :math:`\\ln x = \\ln m + \\ln(f)\\, \\Phi^{-1}(u)`, i.e.
      :math:`\\ln X \\sim N(\\ln m, \\ln f)` with median :math:`m` = case value and factor
      :math:`f`: 68 % of samples lie within :math:`[m/f, m f]`;
    * uniform: :math:`x = a + (b - a) u`.
    """
    from scipy.stats import norm

    u = unit_points(n, len(specs), seed, method)
    out = np.empty_like(u)
    for j, spec in enumerate(specs):
        if spec.distribution == "normal":
            out[:, j] = base[j] + spec.std * norm.ppf(u[:, j])
        elif spec.distribution == "lognormal":
            out[:, j] = np.exp(np.log(base[j]) + np.log(spec.factor) * norm.ppf(u[:, j]))
        else:
            out[:, j] = spec.low + (spec.high - spec.low) * u[:, j]
    return out


# -- statistics -----------------------------------------------------------------------------
def clopper_pearson(k, n, confidence=0.95):
    """Exact (Clopper-Pearson) binomial confidence interval [3]_.

    Parameters
    ----------
    k : int
        Successes, [-]
    n : int
        Trials, [-]
    confidence : float
        Two-sided confidence level, [-]

    Returns
    -------
    tuple of float
        ``(lower, upper)``, [-]

    Notes
    -----
    .. math:: p_L = B^{-1}(\\alpha/2; k, n-k+1), \\quad p_U = B^{-1}(1-\\alpha/2; k+1, n-k)

    with :math:`B^{-1}` the beta quantile function, :math:`p_L = 0` for k = 0 and
    :math:`p_U = 1` for k = n. Coverage is at least the nominal level.

    References
    ----------
    .. [3] C. J. Clopper and E. S. Pearson, "The use of confidence or fiducial limits
       illustrated in the case of the binomial," Biometrika, vol. 26, no. 4,
       pp. 404-413, 1934, doi:10.1093/biomet/26.4.404.
    """
    from scipy.stats import beta

    alpha = 1.0 - confidence
    lower = 0.0 if k == 0 else float(beta.ppf(alpha / 2, k, n - k + 1))
    upper = 1.0 if k == n else float(beta.ppf(1 - alpha / 2, k + 1, n - k))
    return lower, upper


def wilson(k, n, confidence=0.95):
    """Wilson score binomial confidence interval [4]_.

    Parameters
    ----------
    k : int
        Successes, [-]
    n : int
        Trials, [-]
    confidence : float
        Two-sided confidence level, [-]

    Returns
    -------
    tuple of float
        ``(lower, upper)``, [-]

    Notes
    -----
    .. math:: \\frac{k + z^2/2}{n + z^2} \\pm \\frac{z}{n + z^2}\\sqrt{\\frac{k(n-k)}{n} + \\frac{z^2}{4}}

    with :math:`z` the standard normal quantile at :math:`1 - \\alpha/2`.

    References
    ----------
    .. [4] E. B. Wilson, "Probable inference, the law of succession, and statistical
       inference," J. Am. Stat. Assoc., vol. 22, no. 158, pp. 209-212, 1927,
       doi:10.1080/01621459.1927.10502953.
    """
    from scipy.stats import norm

    z = float(norm.ppf(1 - (1.0 - confidence) / 2))
    centre = (k + z * z / 2) / (n + z * z)
    half = z / (n + z * z) * math.sqrt(k * (n - k) / n + z * z / 4)
    return max(0.0, centre - half), min(1.0, centre + half)


INTERVALS = {"clopper-pearson": (clopper_pearson, "Clopper-Pearson exact binomial (Clopper & Pearson 1934)"),
             "wilson": (wilson, "Wilson score (Wilson 1927)")}


def exceedance_probability(hot_spots, limit, confidence=0.95, interval="clopper-pearson"):
    """Fraction of cases whose hot spot exceeds a limit, with a binomial confidence interval.

    Parameters
    ----------
    hot_spots : array_like
        Hot-spot temperatures of the cases that ran (failed cases removed), [K]
    limit : float
        Design temperature limit; a case exceeds it when hot spot > limit, [K]
    confidence : float
        Two-sided confidence level, [-]
    interval : {"clopper-pearson", "wilson"}
        Interval method (:func:`clopper_pearson`, :func:`wilson`).

    Returns
    -------
    dict
        ``estimate``, ``exceeding`` (k), ``n``, ``confidence``, ``interval`` [lower, upper],
        ``interval_method``; estimate and interval are None when n = 0.

    Notes
    -----
    The interval treats the cases as independent draws. Latin hypercube and scrambled
    Sobol' designs usually estimate such a fraction with a smaller variance than
    independent draws, so the interval is then conservative for smooth thresholds
    (stated from memory for LHS; not guaranteed for every integrand).
    """
    if interval not in INTERVALS:
        raise CaseError(f"interval = {interval!r}: choose one of: {', '.join(INTERVALS)}")
    values = np.asarray(hot_spots, dtype=float)
    values = values[np.isfinite(values)]
    n = int(values.size)
    k = int(np.count_nonzero(values > limit))
    function, name = INTERVALS[interval]
    bounds = list(function(k, n, confidence)) if n else None
    return {"estimate": k / n if n else None, "exceeding": k, "n": n, "confidence": confidence,
            "interval": bounds, "interval_method": name,
            "definition": "hot_spot_temperature_K > temperature_limit_K"}


def percentiles(values, q=(5, 50, 95)):
    """Percentiles ``{"p5": ..., "p50": ..., "p95": ...}`` of the finite values (None if none).

    Linear interpolation between order statistics (numpy's default, Hyndman-Fan type 7).
    """
    values = np.asarray([v for v in values if v is not None], dtype=float)
    values = values[np.isfinite(values)]
    if values.size == 0:
        return {f"p{p:g}": None for p in q}
    return {f"p{p:g}": float(np.percentile(values, p)) for p in q}


def rank_correlations(samples, target):
    """Spearman rank correlation of each parameter with a target quantity [5]_.

    Parameters
    ----------
    samples : dict
        ``{parameter: array}`` of sampled values (same cases as ``target``), in SI units
    target : array_like
        E.g. the hot-spot temperatures, [K]

    Returns
    -------
    dict
        ``{parameter: {"spearman_rho": rho, "p_value": p}}``; None where undefined
        (constant input or fewer than 3 cases).

    References
    ----------
    .. [5] C. Spearman, "The proof and measurement of association between two things,"
       Am. J. Psychol., vol. 15, no. 1, pp. 72-101, 1904, doi:10.2307/1412159.
    """
    from scipy.stats import spearmanr

    target = np.asarray(target, dtype=float)
    out = {}
    for name, values in samples.items():
        values = np.asarray(values, dtype=float)
        rho = p_value = None
        if target.size >= 3 and np.ptp(values) > 0 and np.ptp(target) > 0:
            result = spearmanr(values, target)
            rho, p_value = float(result.statistic), float(result.pvalue)
            rho = rho if math.isfinite(rho) else None
            p_value = p_value if math.isfinite(p_value) else None
        out[name] = {"spearman_rho": rho, "p_value": p_value}
    return out


def summarize(rows, specs, limit, seed, method, confidence=0.95, interval="clopper-pearson"):
    """Content of ``uncertainty.json`` from the stored rows.

    Cases with status "failed" (and any without a hot spot) are left out of every
    statistic and counted.

    Parameters
    ----------
    rows : list of dict
        Rows from :meth:`ResultsStore.rows`.
    specs : list of UncertainParameter
        The uncertain parameters (their paths are row keys).
    limit : float
        Design temperature limit, [K]
    seed : int
        Seed used.
    method : str
        Sampling design.
    confidence : float
        Confidence level of the exceedance interval, [-]
    interval : str
        Interval method.

    Returns
    -------
    dict
        JSON-ready (no NaN).
    """
    failed = [r for r in rows if r["status"] == "failed"]
    ran = [r for r in rows if r["status"] != "failed"]
    usable = [r for r in ran if r["hot_spot_temperature_K"] is not None
              and math.isfinite(r["hot_spot_temperature_K"])]
    status_counts = {}
    for r in rows:
        status_counts[r["status"]] = status_counts.get(r["status"], 0) + 1
    hot = [r["hot_spot_temperature_K"] for r in usable]
    return {
        "samples": {
            "n": len(rows), "used": len(usable), "failed": len(failed),
            "without_hot_spot": len(ran) - len(usable), "status_counts": status_counts,
            "method": {"lhs": "Latin hypercube (McKay, Beckman & Conover 1979)",
                       "sobol": "scrambled Sobol' (Sobol' 1967)"}[method],
            "seed": seed,
            "parameters": [s.describe() for s in specs],
            "values": "results.csv / results.sqlite (one column per parameter, SI)",
        },
        "temperature_limit_K": float(limit),
        "probability_exceeding_limit": exceedance_probability(hot, limit, confidence, interval),
        "percentiles": {
            "hot_spot_temperature_K": percentiles(hot),
            "outlet_conversion": percentiles([r["outlet_conversion"] for r in ran]),
            "method": "linear interpolation between order statistics (numpy default)",
        },
        "rank_correlation_with_hot_spot": rank_correlations(
            {s.parameter: [r[s.parameter] for r in usable] for s in specs}, hot),
    }
