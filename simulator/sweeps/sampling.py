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

    [[uncertainty]]
    parameter = "heat.overall_coefficient"
    distribution = "truncated-normal"   # normal(case value, std) cut to [low, high]
    std = "60 W/(m^2*K)"
    low = "0 W/(m^2*K)"                 # optional; default the range the case loader accepts

Units of ``std``, ``low`` and ``high`` must have the dimension of the case value at
``parameter``; a temperature ``std`` is a difference ("2 K" or "2 delta_degC").
Samples are drawn as points in the unit hypercube (Latin hypercube [1]_ or scrambled
Sobol' [2]_ via :mod:`scipy.stats.qmc`) and mapped through the inverse CDFs
(:func:`distribution`; the truncated normal exactly, by :data:`scipy.stats.truncnorm`).
Normal samples are not truncated. A distribution that puts more than
:data:`~simulator.sweeps.uncertain_ranges.REFUSED_SHARE_LIMIT` of its mass where the
case loader refuses the value (a negative pre-exponential factor) is refused before
any case runs (:mod:`simulator.sweeps.uncertain_ranges`); the few invalid samples a
smaller share gives are counted as ``invalid`` and left out of the statistics, and
:func:`summarize` says so beside every probability.

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
from simulator.sweeps.paths import MAX_CASES, dimensionality_of, get_path
from simulator.units import parse_quantity

#: Distributions and the keys each one needs.
DISTRIBUTIONS = {"normal": ("std",), "lognormal": ("factor",), "uniform": ("low", "high"),
                 "truncated-normal": ("std",)}
#: Keys a distribution may take besides the ones it needs.
OPTIONAL_KEYS = {"truncated-normal": ("low", "high")}
_ALLOWED_KEYS = {"parameter", "distribution", "std", "factor", "low", "high", "note"}
_PARAMETER_KEYS = ("std", "factor", "low", "high")
METHODS = ("lhs", "sobol")


@dataclass(frozen=True)
class UncertainParameter:
    """One ``[[uncertainty]]`` entry, checked and in SI.

    Attributes
    ----------
    parameter : str
        Dotted path into the raw case.
    distribution : str
        ``"normal"``, ``"lognormal"``, ``"uniform"`` or ``"truncated-normal"``.
    std : float or None
        Standard deviation of a normal distribution (of the parent normal of a truncated
        one), in SI units
    factor : float or None
        Multiplicative one-sigma factor of a lognormal distribution (> 1), [-]
    low, high : float or None
        Bounds of a uniform or truncated-normal distribution (None for a truncated normal
        until :func:`~simulator.sweeps.uncertain_ranges.checked_against_loader` fills in
        the accepted range; ``-inf``/``inf`` for no bound), in SI units
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
        si = {k: getattr(self, k) for k in _PARAMETER_KEYS
              if getattr(self, k) is not None and math.isfinite(getattr(self, k))}
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
        here = f"{where}.{index}"
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
    takes = DISTRIBUTIONS[dist] + OPTIONAL_KEYS.get(dist, ())
    for key in sorted(set(_PARAMETER_KEYS) - set(takes)):
        if key in entry:
            problems.append(f"{here}.{key} = {entry[key]!r}: not used by a {dist} distribution; "
                            f"it takes {', '.join(takes)}")
    if problems:
        raise CaseError(problems)
    current = get_path(raw, path)
    dim = dimensionality_of(current, path)
    if isinstance(current, int) and not isinstance(current, bool):
        raise CaseError(f"{here}.parameter = {path!r}: whole-number field (case value {current!r}) "
                        "cannot take continuous samples")
    base = _value_si(current, dim, path)
    values = {}
    if dist in ("normal", "truncated-normal"):
        values["std"] = _given(entry["std"], dim, f"{here}.std", path, current, difference=True)
        if values["std"] <= 0:
            problems.append(f"{here}.std = {entry['std']!r}: must be > 0")
        if dist == "truncated-normal":
            for key in ("low", "high"):
                if key in entry:
                    values[key] = _given(entry[key], dim, f"{here}.{key}", path, current)
            low, high = values.get("low", -math.inf), values.get("high", math.inf)
            if not low <= base <= high:
                problems.append(f"{here}: the case value {path} = {current!r} must lie between low and high "
                                f"(low = {entry.get('low', 'none')!r}, high = {entry.get('high', 'none')!r}); "
                                "the case value is the centre of the parent normal")
    elif dist == "lognormal":
        factor = entry["factor"]
        if isinstance(factor, bool) or not isinstance(factor, (int, float)) or not 1 < factor < math.inf:
            problems.append(f"{here}.factor = {factor!r}: a plain number > 1 (the multiplicative one-sigma factor)")
        else:
            values["factor"] = float(factor)
        if not base > 0:
            problems.append(f"{here}.parameter = {path!r}: lognormal needs a positive case value, got {current!r}")
    else:
        values["low"] = _given(entry["low"], dim, f"{here}.low", path, current)
        values["high"] = _given(entry["high"], dim, f"{here}.high", path, current)
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


def _given(value, dim, where, path, current, difference=False):
    """A distribution parameter in SI, with the units of the case value at ``path``.

    Errors name the field (``uncertainty.0.std``), the value as written and, in words,
    what is accepted: units that convert to those of the case value, with an example.
    """
    from simulator.units import _quantity

    if dim == "dimensionless":
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            raise CaseError(f"{where} = {value!r}: {path} is a plain number in the case ({current!r}); "
                            "give a plain number")
        if not math.isfinite(value):
            raise CaseError(f"{where} = {value!r}: not a finite number")
        return float(value)
    unit = unit_part(current)
    example = "2 K" if difference and dim == "[temperature]" else f"1 {unit}"
    if not isinstance(value, str):
        raise CaseError(f"{where} = {value!r}: needs a unit; write it as text in units of {path} "
                        f"({current!r}), e.g. \"{example}\"")
    given = _quantity(value, where)
    if str(given.dimensionality or "dimensionless") != dim:
        kind = f"a temperature difference, e.g. \"{example}\" or \"2 delta_degC\"" \
            if difference and dim == "[temperature]" else f"units that convert to {unit}, e.g. \"{example}\""
        raise CaseError(f"{where} = {value!r}: the unit {given.units:~} does not convert to the unit of {path} "
                        f"({current!r}); expected {kind}")
    if difference and dim == "[temperature]":
        return parse_quantity(value, "temperature_difference", where)
    return parse_quantity(value, dim, where)


def unit_part(text):
    """Unit part of a case value such as ``"4.0e5 mol/(kg*s*bar^1.5)"`` -> ``"mol/(kg*s*bar^1.5)"``."""
    parts = str(text).strip().split(None, 1)
    return parts[1] if len(parts) == 2 else str(text)


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
    if n > MAX_CASES:
        raise CaseError(f"--samples {n!r}: at most {MAX_CASES} samples per run (a work budget)")
    if isinstance(seed, bool) or not isinstance(seed, (int, np.integer)) or not 0 <= seed < 2 ** 128:
        raise CaseError(f"--seed {seed!r}: must be a whole number from 0 to 2**128 - 1")
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


def distribution(spec, base):
    """The frozen scipy distribution of one uncertain parameter.

    Parameters
    ----------
    spec : UncertainParameter
        Parsed entry (a truncated normal with its bounds filled in; None counts as no bound).
    base : float
        Case value at the parameter (mean of the normal and of the truncated normal's
        parent normal, median of the lognormal), in SI units

    Returns
    -------
    scipy.stats.rv_continuous frozen
        With ``ppf``, ``cdf``, ``mean``, ``std``.

    Notes
    -----
    * normal: :math:`N(\\mu, \\sigma)`, :math:`\\mu` = case value;
    * lognormal: :math:`\\ln X \\sim N(\\ln m, \\ln f)`, median :math:`m` = case value, factor
      :math:`f`: 68 % of samples lie within :math:`[m/f, m f]`;
    * uniform on :math:`[a, b]`;
    * truncated normal: :math:`N(\\mu, \\sigma)` conditioned on :math:`a \\le X \\le b`
      (:data:`scipy.stats.truncnorm` with :math:`\\alpha = (a-\\mu)/\\sigma`,
      :math:`\\beta = (b-\\mu)/\\sigma`); its mean differs from :math:`\\mu` when the
      cut is not symmetric.
    """
    from scipy import stats

    if spec.distribution == "normal":
        return stats.norm(loc=base, scale=spec.std)
    if spec.distribution == "lognormal":
        return stats.lognorm(s=math.log(spec.factor), scale=base)
    if spec.distribution == "uniform":
        return stats.uniform(loc=spec.low, scale=spec.high - spec.low)
    low = -math.inf if spec.low is None else spec.low
    high = math.inf if spec.high is None else spec.high
    return stats.truncnorm((low - base) / spec.std, (high - base) / spec.std, loc=base, scale=spec.std)


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
    Each coordinate ``u`` of a unit point is mapped through the inverse CDF of its
    parameter's :func:`distribution` (exact, also for the truncated normal), so the
    stratification of the design carries over to every margin.
    """
    u = unit_points(n, len(specs), seed, method)
    out = np.empty_like(u)
    for j, spec in enumerate(specs):
        out[:, j] = distribution(spec, base[j]).ppf(u[:, j])
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


def exceedance_probability(hot_spots, limit, confidence=0.95, interval="clopper-pearson", exceeding_extra=0):
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
    exceeding_extra : int
        Further cases known to exceed without a hot spot value (runs stopped at the
        runaway guard above the limit); added to the numerator and the denominator, [-]

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
    n = int(values.size) + int(exceeding_extra)
    k = int(np.count_nonzero(values > limit)) + int(exceeding_extra)
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


#: How each stored status enters the exceedance probability (uncertainty.json ``rule``).
EXCEEDANCE_RULE = (
    "numerator: completed runs whose hot spot exceeds the limit, plus runs stopped at the runaway guard "
    "with the stop temperature at or above the limit (their hot spot is at least that: they exceed); "
    "denominator: those runs plus the completed runs below the limit. Left out and counted: invalid samples "
    "(values the case refuses; the probability is conditional on a valid case), failed runs (numerical "
    "failure), runs stopped below the limit (pressure floor; hot spot unknown) and runs without a hot spot. "
    "'if_left_out_exceeded' gives the probability if none / all of the failed and undetermined runs exceeded.")


def _hot(row):
    value = row["hot_spot_temperature_K"]
    return value if value is not None and math.isfinite(value) else None


def split_for_exceedance(rows, limit):
    """Rows by how they enter the exceedance probability (:data:`EXCEEDANCE_RULE`).

    Parameters
    ----------
    rows : list of dict
        Stored rows.
    limit : float
        Design temperature limit, [K]

    Returns
    -------
    dict
        ``completed`` (with a hot spot), ``stopped_over`` (stopped at or above the limit:
        exceeding), ``invalid``, ``failed``, ``stopped_under``, ``without_hot_spot``:
        lists of rows. The first two make the denominator.
    """
    parts = {k: [] for k in ("completed", "stopped_over", "invalid", "failed", "stopped_under", "without_hot_spot")}
    for r in rows:
        status, hot = r["status"], _hot(r)
        if status in ("invalid", "failed"):
            parts[status].append(r)
        elif status == "stopped":
            parts["stopped_over" if hot is not None and hot >= limit else "stopped_under"].append(r)
        else:
            parts["completed" if hot is not None else "without_hot_spot"].append(r)
    return parts


def _invalid_reasons(rows, ranges):
    from simulator.sweeps.uncertain_ranges import outside

    counts = {}
    for r in rows:
        why = outside(ranges or {}, r)
        key = "; ".join(why) if why else _reason_class(r.get("error"))
        counts[key] = counts.get(key, 0) + 1
    return [{"reason": k, "count": v} for k, v in sorted(counts.items(), key=lambda kv: -kv[1])]


def _reason_class(error):
    """A loader message with its numbers blanked, so samples refused for the same reason group together."""
    import re

    text = str(error or "refused by the case loader")
    return re.sub(r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?", "#", text)[:200]


def summarize(rows, specs, limit, seed, method, confidence=0.95, interval="clopper-pearson", ranges=None):
    """Content of ``uncertainty.json`` from the stored rows.

    Every sample is counted by status (:data:`EXCEEDANCE_RULE` says how each enters the
    probability): ``invalid`` (values the case refuses), ``failed`` (numerical failure),
    ``stopped`` (runaway guard, or pressure floor) and ``completed``. The probability
    states its denominator and what was left out, with the range it would span had
    every left-out run exceeded or none.

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
    ranges : dict, optional
        Accepted ranges per parameter (:func:`~simulator.sweeps.uncertain_ranges.checked_against_loader`),
        used to name why a sample was invalid.

    Returns
    -------
    dict
        JSON-ready (no NaN).
    """
    parts = split_for_exceedance(rows, limit)
    invalid, failed = parts["invalid"], parts["failed"]
    with_hot, stopped_over, stopped_under = parts["completed"], parts["stopped_over"], parts["stopped_under"]
    stopped = stopped_over + stopped_under
    completed = with_hot + parts["without_hot_spot"]
    ran = completed + stopped
    hot = _hot
    status_counts = {}
    for r in rows:
        status_counts[r["status"]] = status_counts.get(r["status"], 0) + 1
    probability = exceedance_probability([hot(r) for r in with_hot], limit, confidence, interval,
                                         exceeding_extra=len(stopped_over))
    k, n = probability["exceeding"], probability["n"]
    undetermined = len(failed) + len(stopped_under) + len(parts["without_hot_spot"])
    total = n + undetermined
    probability.update({
        "denominator": n,
        "denominator_counts": {"completed": len(with_hot), "stopped_at_guard_counted_exceeding": len(stopped_over)},
        "left_out": {"invalid": len(invalid), "failed": len(failed), "stopped_below_limit": len(stopped_under),
                     "without_hot_spot": len(parts["without_hot_spot"])},
        "if_left_out_exceeded": [k / total, (k + undetermined) / total] if total else None,
        "rule": EXCEEDANCE_RULE,
    })
    usable = with_hot + stopped_over               # the runs of the denominator
    hot_usable = [hot(r) for r in usable]
    return {
        "samples": {
            "n": len(rows), "used": n, "valid": len(rows) - len(invalid), "invalid": len(invalid),
            "failed": len(failed), "stopped": len(stopped), "completed": len(completed),
            "without_hot_spot": len(completed) - len(with_hot), "status_counts": status_counts,
            "invalid_reasons": _invalid_reasons(invalid, ranges),
            "method": {"lhs": "Latin hypercube (McKay, Beckman & Conover 1979)",
                       "sobol": "scrambled Sobol' (Sobol' 1967)"}[method],
            "seed": seed,
            "parameters": [s.describe() for s in specs],
            "accepted_ranges": ranges or {},
            "values": "results.csv / results.sqlite (one column per parameter, SI)",
        },
        "temperature_limit_K": float(limit),
        "probability_exceeding_limit": probability,
        "percentiles": {
            "hot_spot_temperature_K": percentiles(hot_usable),
            "outlet_conversion": percentiles([r["outlet_conversion"] for r in ran]),
            "method": "linear interpolation between order statistics (numpy default) over the runs of the "
                      "probability's denominator; runs stopped at the runaway guard enter with their stop "
                      "temperature, a lower bound of their hot spot",
        },
        "rank_correlation_with_hot_spot": rank_correlations(
            {s.parameter: [r[s.parameter] for r in usable] for s in specs}, hot_usable),
    }


def format_summary(result):
    """Text printed by ``tubesim uncertainty``: counts, engine, the probability with its denominator.

    Parameters
    ----------
    result : dict
        As :func:`summarize` returns it, with ``engine`` and ``run``.

    Returns
    -------
    str
        Several lines; the probability is never printed without what was left out.
    """
    s = result["samples"]
    p = result["probability_exceeding_limit"]
    run = result.get("run", {})
    rate = run.get("cases_per_second")
    where = f" on Dask at {run['scheduler']}" if run.get("scheduler") else ""
    lines = [f"{s['n']} samples (seed {s['seed']}, {result.get('engine', 'pool')} engine{where}"
             + (f", {rate:g} cases/s" if rate else "") + f"): {s['completed']} completed, {s['stopped']} stopped, "
             f"{s['failed']} failed, {s['invalid']} invalid"]
    for item in s.get("invalid_reasons", [])[:3]:
        lines.append(f"  invalid ({item['count']}): {item['reason']}")
    left = p["left_out"]
    left_text = ", ".join(f"{v} {k.replace('_', ' ')}" for k, v in left.items() if v) or "none"
    limit = result["temperature_limit_K"]
    if p["estimate"] is None:
        lines.append(f"P(hot spot > {limit:.1f} K): cannot be estimated, no run gave a hot spot (left out: {left_text})")
    else:
        lo, hi = p["interval"]
        lines.append(f"P(hot spot > {limit:.1f} K) = {p['estimate']:.4f} = {p['exceeding']}/{p['denominator']} "
                     f"({100 * p['confidence']:.0f} % interval {lo:.4f}-{hi:.4f}, {p['interval_method']}); "
                     f"left out: {left_text}")
        bracket = p.get("if_left_out_exceeded")
        if bracket and bracket[0] != bracket[1]:
            lines.append(f"  with the failed or undetermined runs counted as not exceeding / exceeding: "
                         f"{bracket[0]:.4f} / {bracket[1]:.4f}")
        if left["invalid"]:
            lines.append(f"  conditional on a valid case: {left['invalid']} of {s['n']} samples lie outside what the "
                         "case accepts and are left out")
    pct = result["percentiles"]["hot_spot_temperature_K"]
    lines.append("hot spot p5/p50/p95: " + (", ".join(f"{k} {v:.2f} K" for k, v in pct.items() if v is not None)
                                            or "none (no run gave a hot spot)"))
    return "\n".join(lines)
