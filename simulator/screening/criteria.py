r"""Runaway criteria for cooled tubular reactors, one plain function per published criterion.

Every ``*_verdict`` function returns a plain dict::

    {"verdict": "safe" | "runaway" | "undecided",
     "critical": <the criterion's critical value, SI or [-], None if it has none>,
     "value": <the operating value compared with it>,
     "source": <key in the reference list, e.g. "semenov1928">,
     "note": <one line: how to read the verdict, or why it is undecided>}

"undecided" is returned whenever the criterion cannot be applied (no critical point for
this activation energy, no finite maximum of the sensitivity, failed evaluations next to
the maximum, too few points); the note says why. Nothing here integrates a reactor: the
profile-based tests take arrays, and the sensitivity locator takes any callable, so the
same functions serve the dimensionless reference model
(:mod:`simulator.screening.reference_model`) and the full tube simulator.

Symbols: ``gamma`` = E/(R*Tw) Arrhenius number, ``theta`` = gamma*(T - Tw)/Tw reduced
temperature, ``psi`` = B/N Semenov number of the tube (B heat-of-reaction parameter, N =
St/Da cooling-to-reaction ratio).
"""
import math
from dataclasses import dataclass

import numpy as np
from scipy.optimize import minimize_scalar

from simulator.errors import SimulatorError
from simulator.units import R

#: Verdict strings used by every criterion.
VERDICTS = ("safe", "runaway", "undecided")

#: Exceptions from a hot-spot callable that count as "this evaluation failed".
EVALUATION_ERRORS = (SimulatorError, ArithmeticError, ValueError, RuntimeError)


def _result(verdict, critical, value, source, note=""):
    return {"verdict": verdict, "critical": critical, "value": value, "source": source, "note": note}


def _check_positive(name, value, allow_inf=False):
    value = float(value)
    if math.isnan(value) or value <= 0.0 or (math.isinf(value) and not allow_inf):
        accepted = "a number > 0 (inf allowed)" if allow_inf else "a finite number > 0"
        raise ValueError(f"{name} = {value!r}: must be {accepted}.")
    return value


# ---------------------------------------------------------------------------------------
# Semenov (1928)
# ---------------------------------------------------------------------------------------
@dataclass(frozen=True)
class SemenovCritical:
    """Critical point of the Semenov lumped model.

    Attributes
    ----------
    gamma : float
        Arrhenius number E/(R*Ta), [-]
    exists : bool
        False for gamma <= 4, where the model has no critical point, [-]
    theta_c : float or None
        Critical reduced temperature rise gamma*(Tc - Ta)/Ta, None if none exists, [-]
    psi_c : float or None
        Critical Semenov number, None if none exists, [-]
    """

    gamma: float
    exists: bool
    theta_c: float | None
    psi_c: float | None


def semenov_1928_critical(gamma):
    r"""Critical reduced temperature and Semenov number of a lumped exothermic system [1]_.

    Parameters
    ----------
    gamma : float
        Arrhenius number E/(R*Ta) at the ambient (coolant) temperature; ``math.inf`` for the
        exponential approximation, [-]

    Returns
    -------
    SemenovCritical
        ``exists`` is False (and ``theta_c``, ``psi_c`` are None) for gamma <= 4.

    Raises
    ------
    ValueError
        If gamma is not a number > 0.

    Notes
    -----
    Model :math:`d\theta/d\tau = \psi\exp(\theta/(1+\varepsilon\theta)) - \theta`,
    :math:`\varepsilon = 1/\gamma`, no reactant consumption. Criticality is the tangency of the
    heat-generation and heat-removal curves, which gives
    :math:`\theta = (1+\varepsilon\theta)^2` (equivalently :math:`T_c - T_a = R T_c^2/E`), whose
    smaller root is

    .. math::
        \theta_c = \frac{1 - 2\varepsilon - \sqrt{1-4\varepsilon}}{2\varepsilon^2}
                 = \frac{2}{1 - 2\varepsilon + \sqrt{1-4\varepsilon}},\qquad
        \psi_c = \theta_c \exp\left(-\frac{\theta_c}{1+\varepsilon\theta_c}\right)

    The second form of :math:`\theta_c` is used (no cancellation at large gamma); at
    gamma = inf it gives :math:`\theta_c = 1`, :math:`\psi_c = 1/e`. For gamma <= 4 the two
    roots merge or become complex: no critical point, the steady temperature rises smoothly
    with psi. For a cooled tube, psi = B/N < psi_c is a sufficient condition for a bounded
    profile (consumption ignored).

    References
    ----------
    .. [1] N.N. Semenov, "Zur Theorie des Verbrennungsprozesses," Z. Phys., vol. 48,
       pp. 571-582, 1928 (citation from memory; the finite-gamma closed form follows from
       the tangency condition). The gamma = inf value 1/e is stated in F.A. Williams,
       Combustion Theory, 2nd ed., Addison-Wesley, 1985, App. B.

    Examples
    --------
    >>> semenov_1928_critical(math.inf).psi_c
    0.36787944117144233
    >>> semenov_1928_critical(20.0).theta_c
    1.1145618000168
    >>> semenov_1928_critical(4.0).exists
    False
    """
    gamma = _check_positive("gamma", gamma, allow_inf=True)
    if gamma <= 4.0:
        return SemenovCritical(gamma=gamma, exists=False, theta_c=None, psi_c=None)
    eps = 0.0 if math.isinf(gamma) else 1.0 / gamma
    theta_c = 2.0 / (1.0 - 2.0 * eps + math.sqrt(1.0 - 4.0 * eps))
    psi_c = theta_c * math.exp(-theta_c / (1.0 + eps * theta_c))
    return SemenovCritical(gamma=gamma, exists=True, theta_c=theta_c, psi_c=psi_c)


def semenov_1928_verdict(psi, gamma):
    """Semenov screen of a cooled tube: psi = B/N against psi_c(gamma) [1]_.

    Parameters
    ----------
    psi : float
        Semenov number of the tube, B/N = B*Da/St: heat generation at the coolant
        temperature over heat removal at a rise of R*Tw^2/E, [-]
    gamma : float
        Arrhenius number E/(R*Tw), ``math.inf`` allowed, [-]

    Returns
    -------
    dict
        ``verdict`` "safe" if psi < psi_c; "undecided" otherwise, because ignoring
        consumption makes the test only sufficient: a tube that fails it must be screened by
        a criterion that accounts for consumption. ``critical`` = psi_c, ``value`` = psi,
        ``source`` = "semenov1928".

    Notes
    -----
    For gamma <= 4 the Semenov model has no critical point: the verdict is "safe" (no
    ignition jump exists), ``critical`` is None and the note says so.

    References
    ----------
    .. [1] N.N. Semenov, "Zur Theorie des Verbrennungsprozesses," Z. Phys., vol. 48,
       pp. 571-582, 1928 (citation from memory).

    Examples
    --------
    >>> semenov_1928_verdict(0.30, math.inf)["verdict"]
    'safe'
    """
    psi = float(psi)
    if math.isnan(psi) or psi < 0.0 or math.isinf(psi):
        raise ValueError(f"psi = {psi!r}: must be a finite number >= 0.")
    crit = semenov_1928_critical(gamma)
    if not crit.exists:
        return _result("safe", None, psi, "semenov1928",
                       f"gamma = {crit.gamma:g} <= 4: the Semenov model has no critical point")
    if psi < crit.psi_c:
        return _result("safe", crit.psi_c, psi, "semenov1928",
                       "psi < psi_c: bounded even without reactant consumption (sufficient condition)")
    return _result("undecided", crit.psi_c, psi, "semenov1928",
                   "psi >= psi_c: the no-consumption bound is exceeded; apply a criterion with consumption")


# ---------------------------------------------------------------------------------------
# Barkelew (1959): envelope of the critical N/S against S
# ---------------------------------------------------------------------------------------
#: Coefficient of the S^(-2/3) correction of the Barkelew envelope, [-] (from memory; see below).
BARKELEW_COEFFICIENT = 2.405


def barkelew_1959_critical_ratio(S):
    r"""Critical N/S of the Barkelew envelope at the heat-of-reaction parameter S [1]_.

    Parameters
    ----------
    S : float
        Heat-of-reaction parameter S = B = gamma dT_ad / Tw, the adiabatic rise in units of
        R Tw^2/E, [-]

    Returns
    -------
    ratio : float
        Critical N/S: the tube is safe by the criterion if its N/S lies above it; 0 where
        no cooling is needed (S at or below :math:`2.405^{3/2} pprox 3.73`), [-]

    Raises
    ------
    ValueError
        If S is not a finite number > 0.

    Notes
    -----
    Barkelew integrated many cooled-tube profiles (first order, exponential approximation of the
    Arrhenius law, inlet at the wall temperature) and summarised the runaway boundary as a lower
    envelope of the critical N/S against S, N = St/Da. The envelope is written here in closed form

    .. math:: \left(\frac{N}{S}\right)_c = e\left(1 - 2.405\,S^{-2/3}\right)

    which tends to the Semenov value e as S grows (no consumption matters when the rise is
    large). The closed form and its coefficient are recalled from memory, not read off the
    paper's chart; they agree with an independent reproduction of the Morbidelli-Varma boundary
    for gamma -> inf to within 0.5 % for S = 10-100 (project notes, runaway.md table 1.7), which
    is the comparison the published studies make. A finite gamma lowers the true boundary, so
    the envelope is conservative there; for other reaction orders it is an estimate.

    Validity: the range of the source's chart was not seen; below S of about 5 no boundary is
    sharp (the maximum of the normalized sensitivity is O(1) there, runaway.md 1.7).

    References
    ----------
    .. [1] C.H. Barkelew, "Stability of chemical reactors," Chem. Eng. Prog. Symp. Ser.,
       vol. 55, no. 25, pp. 37-46, 1959 (from memory).

    Examples
    --------
    >>> round(barkelew_1959_critical_ratio(20.0), 4)
    1.831
    >>> barkelew_1959_critical_ratio(3.0)
    0.0
    """
    S = _check_positive("S", S)
    return max(0.0, math.e * (1.0 - BARKELEW_COEFFICIENT * S ** (-2.0 / 3.0)))


def barkelew_1959_verdict(N, S):
    """Barkelew screen of a cooled tube: N/S against the critical envelope [1]_.

    Parameters
    ----------
    N : float
        Cooling-to-reaction ratio St/Da of the tube; ``math.inf`` when nothing reacts at the
        wall temperature, [-]
    S : float
        Heat-of-reaction parameter B of the tube, [-]

    Returns
    -------
    dict
        ``verdict`` "safe" if N/S is above the critical value, else "runaway";
        ``critical`` = critical N/S, ``value`` = N/S, ``source`` = "barkelew1959".

    References
    ----------
    .. [1] C.H. Barkelew, "Stability of chemical reactors," Chem. Eng. Prog. Symp. Ser.,
       vol. 55, no. 25, pp. 37-46, 1959 (from memory).

    Examples
    --------
    >>> barkelew_1959_verdict(49.9, 23.0)["verdict"]
    'safe'
    """
    S = _check_positive("S", S)
    N = _check_positive("N", N, allow_inf=True)
    critical = barkelew_1959_critical_ratio(S)
    ratio = N / S
    if ratio > critical:
        return _result("safe", critical, ratio, "barkelew1959", "N/S above the critical envelope")
    return _result("runaway", critical, ratio, "barkelew1959", "N/S at or below the critical envelope")


def barkelew_1959_critical_scale(N, S):
    """Factor f on the heat-release parameter at which the tube meets the Barkelew envelope.

    Scaling the feed fraction of the key species by f scales S by f and leaves N unchanged (both
    Da and St are per mole of key species), so the critical feed fraction is f times the
    operating one. Solves N/(f S) = (N/S)_c(f S) by bisection of the monotone difference.

    Parameters
    ----------
    N : float
        Cooling-to-reaction ratio of the tube, [-]
    S : float
        Heat-of-reaction parameter of the tube at the operating point, [-]

    Returns
    -------
    f : float or None
        The critical factor, None if N is infinite, [-]

    >>> f = barkelew_1959_critical_scale(49.9, 23.0)
    >>> round(49.9 / (f * 23.0) - barkelew_1959_critical_ratio(f * 23.0), 9)
    0.0
    """
    S = _check_positive("S", S)
    N = _check_positive("N", N, allow_inf=True)
    if math.isinf(N):
        return None
    from scipy.optimize import brentq

    def gap(log_f):
        f = math.exp(log_f)
        return N / (f * S) - barkelew_1959_critical_ratio(f * S)

    lo, hi = math.log(BARKELEW_COEFFICIENT ** 1.5 / S), math.log(1e6 * N / S)
    return math.exp(brentq(gap, lo, hi, xtol=1e-12))


# ---------------------------------------------------------------------------------------
# Van Welsenaere & Froment (1970), criterion I: maxima curve
# ---------------------------------------------------------------------------------------
def van_welsenaere_froment_1970_maxima_temperature(coolant_temperature, activation_energy):
    r"""Temperature of the extremum of the maxima curve, T_m - Tc = R*T_m^2/E [1]_.

    Parameters
    ----------
    coolant_temperature : float
        Coolant (wall) temperature Tc, [K]
    activation_energy : float
        Activation energy E, [J/mol]

    Returns
    -------
    T_m : float
        The smaller root of :math:`T_m - T_c = R T_m^2/E`, [K]

    Raises
    ------
    ValueError
        If an input is not > 0, or if E <= 4*R*Tc: the maxima curve then has no extremum.

    Notes
    -----
    The locus of dT/dz = 0 in the (partial pressure, T) plane is
    :math:`p_m(T) \propto (T - T_c)/k(T)`; with an Arrhenius k it has its extremum where
    :math:`T - T_c = R T^2/E`. The exact smaller root, written without cancellation, is

    .. math:: T_m = \frac{2 T_c}{1 + \sqrt{1 - 4 R T_c/E}}

    In reduced form this is the Semenov :math:`\theta_c(\gamma)`; for
    :math:`E \gg R T_c` it tends to :math:`T_c + R T_c^2/E`.

    References
    ----------
    .. [1] R.J. Van Welsenaere, G.F. Froment, "Parametric sensitivity and runaway in fixed
       bed catalytic reactors," Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970.

    Examples
    --------
    >>> round(van_welsenaere_froment_1970_maxima_temperature(625.0, 13636.0 * R), 3)
    656.618
    """
    Tc = _check_positive("coolant_temperature", coolant_temperature)
    E = _check_positive("activation_energy", activation_energy)
    ratio = 4.0 * R * Tc / E
    if ratio >= 1.0:
        raise ValueError(
            f"activation_energy = {E!r} J/mol: E/(R*Tc) = {E / (R * Tc):.6g} <= 4 at Tc = {Tc:g} K; "
            "the maxima curve has no extremum (criterion I needs E > 4*R*Tc)."
        )
    return 2.0 * Tc / (1.0 + math.sqrt(1.0 - ratio))


def van_welsenaere_froment_1970_maxima_curve_verdict(hot_spot_temperature, coolant_temperature,
                                                     activation_energy):
    """Van Welsenaere-Froment criterion I: runaway if the hot spot exceeds T_m [1]_.

    Parameters
    ----------
    hot_spot_temperature : float
        Hot-spot (maximum) temperature T* of the profile, [K]
    coolant_temperature : float
        Coolant (wall) temperature Tc, [K]
    activation_energy : float
        Activation energy E, [J/mol]

    Returns
    -------
    dict
        ``verdict`` "runaway" if T* > T_m else "safe"; "undecided" if E <= 4*R*Tc (no
        extremum). ``critical`` = T_m [K], ``value`` = T* [K], ``source`` =
        "van_welsenaere_froment1970".

    Notes
    -----
    The criterion is the most conservative of the consumption-aware criteria for a tube with
    inlet temperature equal to the coolant temperature; the Semenov bound is more conservative
    still. See :func:`van_welsenaere_froment_1970_maxima_temperature`.

    References
    ----------
    .. [1] R.J. Van Welsenaere, G.F. Froment, "Parametric sensitivity and runaway in fixed
       bed catalytic reactors," Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970
       (statement of criterion I from memory).

    Examples
    --------
    >>> van_welsenaere_froment_1970_maxima_curve_verdict(650.0, 625.0, 113.4e3)["verdict"]
    'safe'
    """
    T_hot = _check_positive("hot_spot_temperature", hot_spot_temperature)
    Tc = _check_positive("coolant_temperature", coolant_temperature)
    E = _check_positive("activation_energy", activation_energy)
    if E <= 4.0 * R * Tc:
        return _result("undecided", None, T_hot, "van_welsenaere_froment1970",
                       f"E/(R*Tc) = {E / (R * Tc):.4g} <= 4: the maxima curve has no extremum")
    T_m = van_welsenaere_froment_1970_maxima_temperature(Tc, E)
    if T_hot > T_m:
        return _result("runaway", T_m, T_hot, "van_welsenaere_froment1970",
                       "hot spot above the extremum of the maxima curve")
    return _result("safe", T_m, T_hot, "van_welsenaere_froment1970",
                   "hot spot below the extremum of the maxima curve")


# ---------------------------------------------------------------------------------------
# Profile-shape criteria: Van Welsenaere-Froment II / Thomas-Bowes, Adler-Enig
# ---------------------------------------------------------------------------------------
def _profile_arrays(name_x, x, name_y, y, dy, d2y):
    x = np.asarray(x, dtype=float)
    y = np.asarray(y, dtype=float)
    if x.ndim != 1 or y.shape != x.shape:
        raise ValueError(f"{name_x}, {name_y}: must be 1-D arrays of equal length; "
                         f"got shapes {x.shape} and {y.shape}.")
    arrays = {name_x: x, name_y: y}
    for label, arr in (("first derivative", dy), ("second derivative", d2y)):
        if arr is not None:
            arr = np.asarray(arr, dtype=float)
            if arr.shape != x.shape:
                raise ValueError(f"{label}: shape {arr.shape} differs from {name_x} {x.shape}.")
            arrays[label] = arr
    for label, arr in arrays.items():
        if not np.all(np.isfinite(arr)):
            raise ValueError(f"{label}: contains non-finite values; "
                             "pass the profile up to a finite hot spot.")
    return x, y, (None if dy is None else arrays["first derivative"]), \
        (None if d2y is None else arrays["second derivative"])


def _convexity_before_maximum(coord, y, dy, d2y, rtol):
    """Shared core of the inflection tests. Returns a dict of findings (see callers)."""
    if dy is None:
        dy = np.gradient(y, coord, edge_order=2)
    if d2y is None:
        d2y = np.gradient(dy, coord, edge_order=2)
    rising = np.flatnonzero(dy > 0.0)
    if rising.size == 0:
        return {"status": "no_rise"}
    i0 = int(rising[0])
    after = np.flatnonzero(dy[i0:] <= 0.0)
    inside = after.size > 0
    k = i0 + int(after[0]) if inside else coord.size - 1
    if inside:
        # hot spot between k-1 and k: linear interpolation of dy to zero
        d0, d1 = dy[k - 1], dy[k]
        c_hot = coord[k - 1] + (coord[k] - coord[k - 1]) * d0 / (d0 - d1)
    else:
        c_hot = coord[k]
    curv = d2y[i0:k + 1]
    scale = float(np.max(np.abs(curv)))
    running_min = np.minimum.accumulate(curv)
    # curvature that is positive AND has risen above its running minimum: a convex stretch
    # that grew downstream, not the decaying convexity of the entrance region
    excess = np.minimum(curv, curv - running_min)
    j = int(np.argmax(excess))
    value = float(excess[j])
    counted = np.flatnonzero(excess > rtol * scale) if scale > 0.0 else np.array([], dtype=int)
    return {"status": "ok", "inside": inside, "c_hot": float(c_hot), "value": value,
            "convex": counted.size > 0,
            "c_convex": float(coord[i0 + counted[0]]) if counted.size else None,
            "c_start": float(coord[i0])}


def van_welsenaere_froment_1970_inflection_verdict(z, T, dT_dz=None, d2T_dz2=None, *, rtol=1e-6):
    r"""Van Welsenaere-Froment criterion II (Thomas-Bowes): convex T(z) before the hot spot [1]_, [2]_.

    Parameters
    ----------
    z : array_like
        Axial positions, strictly increasing, [m]
    T : array_like
        Temperatures at z, [K]
    dT_dz : array_like, optional
        Axial temperature gradient at z; computed by second-order finite differences if
        omitted, [K/m]
    d2T_dz2 : array_like, optional
        Second derivative of T at z; finite differences of dT_dz if omitted, [K/m^2]
    rtol : float, optional
        Curvature counted as positive only above rtol times the largest |d2T/dz2| on the
        rising branch; guards against finite-difference noise, [-]

    Returns
    -------
    dict
        ``verdict`` "runaway" / "safe" / "undecided"; ``critical`` = 0.0 (zero curvature,
        the tangency) [K/m^2]; ``value`` = largest counted curvature (see Notes; <= 0 when
        safe) [K/m^2]; ``source`` = "van_welsenaere_froment1970"; plus ``z_hot_spot`` [m],
        ``z_convex`` (first counted convex point, or None) [m] and ``references`` =
        ("van_welsenaere_froment1970", "thomas_bowes1961").

    Notes
    -----
    Runaway if the profile becomes convex (:math:`d^2T/dz^2 > 0`) upstream of the hot spot;
    critical at tangency, i.e. when the largest curvature before the hot spot just touches
    zero. Along a plug-flow tube z is proportional to the residence time, so this is the
    Thomas-Bowes test applied to T(z).

    *Hot spot*: the first local maximum of T, located where dT/dz changes sign from + to -
    (linear interpolation between the two samples). Only the first hot spot is judged. If T
    never stops rising, the whole rising branch is judged and the note says the hot spot is
    not inside the profile.

    *Entrance region*: the test looks only at the rising branch, from the first point with
    dT/dz > 0 to the hot spot, and counts a point as convex only if its curvature is
    positive **and** has risen above the lowest curvature met so far on the branch:
    ``value = max(min(c, c - min_so_far(c)))``. Convexity that is largest at the start of
    the branch and then decays (the bottom of a cooling dip when T0 > Tc, or any start-up
    transient) belongs to the entrance region and is not counted; convexity that grows
    downstream is counted, whatever the sign of the curvature at the inlet. For T0 = Tc and
    first-order kinetics the inlet curvature is
    :math:`B\,Da^2(B - n - N)` in reduced units, negative whenever N > B - n, which holds at
    every critical point of the reference table (N/B > 1); there the rule is the same as
    "any positive curvature before the hot spot".

    References
    ----------
    .. [1] R.J. Van Welsenaere, G.F. Froment, "Parametric sensitivity and runaway in fixed
       bed catalytic reactors," Chem. Eng. Sci., vol. 25, pp. 1503-1516, 1970.
    .. [2] P.H. Thomas, P.C. Bowes, "Some aspects of the self-heating and ignition of solid
       cellulosic materials," Br. J. Appl. Phys., vol. 12, p. 222, 1961 (from memory).

    Examples
    --------
    >>> z = np.linspace(0.0, 1.0, 201)
    >>> van_welsenaere_froment_1970_inflection_verdict(z, 600.0 + 50.0 * np.sin(np.pi * z))["verdict"]
    'safe'
    """
    z, T, dT_dz, d2T_dz2 = _profile_arrays("z", z, "T", T, dT_dz, d2T_dz2)
    return _inflection_result(z, T, dT_dz, d2T_dz2, rtol, "z", "van_welsenaere_froment1970",
                              ("van_welsenaere_froment1970", "thomas_bowes1961"))


def _inflection_result(coord, y, dy, d2y, rtol, cname, source, references):
    if coord.size < 5:
        out = _result("undecided", 0.0, None, source, f"{coord.size} points: at least 5 are needed")
        out.update({f"{cname}_hot_spot": None, f"{cname}_convex": None, "references": references})
        return out
    if np.any(np.diff(coord) <= 0.0):
        raise ValueError(f"{cname}: must be strictly increasing.")
    rtol = float(rtol)
    if not 0.0 <= rtol < 1.0:
        raise ValueError(f"rtol = {rtol!r}: must be in [0, 1).")
    found = _convexity_before_maximum(coord, y, dy, d2y, rtol)
    if found["status"] == "no_rise":
        out = _result("safe", 0.0, None, source, "the temperature does not rise along the profile")
        out.update({f"{cname}_hot_spot": float(coord[0]), f"{cname}_convex": None, "references": references})
        return out
    where = "" if found["inside"] else "; no hot spot inside the profile, judged up to its end"
    if found["convex"]:
        verdict, note = "runaway", f"convex before the hot spot from {cname} = {found['c_convex']:.6g}{where}"
    else:
        verdict, note = "safe", f"no convex stretch before the hot spot beyond the entrance region{where}"
    out = _result(verdict, 0.0, found["value"], source, note)
    out.update({f"{cname}_hot_spot": found["c_hot"], f"{cname}_convex": found["c_convex"],
                "references": references})
    return out


def adler_enig_1964_verdict(conversion, temperature, dT_dx=None, d2T_dx2=None, *, rtol=1e-6):
    r"""Adler-Enig test: convex temperature-conversion curve before the maximum [1]_.

    Parameters
    ----------
    conversion : array_like
        Conversion of the limiting reactant along the tube, increasing, [-]
    temperature : array_like
        Temperature at each conversion (a reduced temperature works equally), [K]
    dT_dx : array_like, optional
        dT/dx along the curve; finite differences if omitted, [K]
    d2T_dx2 : array_like, optional
        d2T/dx2 along the curve; finite differences of dT_dx if omitted, [K]
    rtol : float, optional
        Curvature counted as positive only above rtol times the largest |d2T/dx2| on the
        rising branch, [-]

    Returns
    -------
    dict
        As :func:`van_welsenaere_froment_1970_inflection_verdict` with x in place of z:
        ``critical`` = 0.0 [K], ``value`` = largest counted curvature [K], ``x_hot_spot``,
        ``x_convex`` [-], ``source`` = "adler_enig1964".

    Notes
    -----
    Runaway if :math:`d^2T/dx^2 > 0` before the temperature maximum in the
    temperature-conversion plane; critical at tangency. The hot spot and the entrance
    region are treated exactly as in
    :func:`van_welsenaere_froment_1970_inflection_verdict`. The arrays are used up to the
    first point where the conversion stops increasing (after a runaway the conversion
    saturates at 1 and x no longer parametrises the curve); the note says where. For the
    first-order reference model the sign of :math:`d^2\theta/dx^2` is known in closed form:
    :func:`simulator.screening.reference_model.adler_enig_1964_sign_indicator`.

    References
    ----------
    .. [1] J. Adler, J.W. Enig, "The critical conditions in thermal explosion theory with
       reactant consumption," Combust. Flame, vol. 8, pp. 97-103, 1964 (from memory).

    Examples
    --------
    >>> x = np.linspace(0.0, 0.5, 101)
    >>> adler_enig_1964_verdict(x, 600.0 + 100.0 * x - 80.0 * x**2)["verdict"]
    'safe'
    """
    x, T, dT_dx, d2T_dx2 = _profile_arrays("conversion", conversion, "temperature", temperature,
                                           dT_dx, d2T_dx2)
    stop = np.flatnonzero(np.diff(x) <= 0.0)
    cut_note = ""
    if stop.size:
        end = int(stop[0]) + 1
        cut_note = f" (arrays used up to x = {x[end - 1]:.6g}, where the conversion stops increasing)"
        x, T = x[:end], T[:end]
        dT_dx = None if dT_dx is None else dT_dx[:end]
        d2T_dx2 = None if d2T_dx2 is None else d2T_dx2[:end]
    out = _inflection_result(x, T, dT_dx, d2T_dx2, rtol, "x", "adler_enig1964", ("adler_enig1964",))
    out["note"] += cut_note
    return out


# ---------------------------------------------------------------------------------------
# Morbidelli & Varma (1982, 1988): maximum of the normalized sensitivity
# ---------------------------------------------------------------------------------------
def _evaluate(hot_spot_of, phi):
    """Call the objective; return nan for a failed evaluation (exception or non-finite)."""
    try:
        value = float(hot_spot_of(phi))
    except EVALUATION_ERRORS:
        return math.nan
    return value if math.isfinite(value) else math.nan


def _sensitivity(hot_spot_of, phi, rel_step):
    """(s, number of failed evaluations) by central differences; s is nan on failure."""
    h = rel_step * abs(phi)
    y_plus = _evaluate(hot_spot_of, phi + h)
    y_minus = _evaluate(hot_spot_of, phi - h)
    failed = int(math.isnan(y_plus)) + int(math.isnan(y_minus))
    y_mid = 0.5 * (y_plus + y_minus)
    if failed or y_mid == 0.0:
        return math.nan, failed
    return phi * (y_plus - y_minus) / (2.0 * h * y_mid), 0


def morbidelli_varma_1988_normalized_sensitivity(hot_spot_of, phi, rel_step=1e-4):
    r"""Normalized sensitivity s = (phi/y*)*dy*/dphi of a hot-spot objective [1]_, [2]_.

    Parameters
    ----------
    hot_spot_of : callable
        ``hot_spot_of(phi) -> float``: the hot-spot objective y* (the hot-spot temperature
        T*, or the rise T* - Tc, or a reduced theta*) at the parameter value phi. A failed
        solve may raise (SimulatorError, ArithmeticError, ValueError, RuntimeError) or return
        nan, [K]
    phi : float
        Operating parameter (inlet partial pressure, coolant temperature, U, N, ...), any
        unit; only ratios enter, [-]
    rel_step : float, optional
        Relative central-difference step; 1e-6 to 1e-4 with a solver rtol <= 1e-10, [-]

    Returns
    -------
    s : float
        Normalized sensitivity, nan if an evaluation failed or y* = 0, [-]

    Notes
    -----
    .. math::
        s = \frac{\phi}{y^*}\frac{\partial y^*}{\partial\phi}
          \approx \frac{\phi\,[y^*(\phi+h) - y^*(\phi-h)]}{2h\,\bar{y}^*},\qquad
        h = \text{rel\_step}\,|\phi|,\quad \bar{y}^* = \tfrac12[y^*(\phi+h)+y^*(\phi-h)]

    The mean of the two evaluations stands for y*(phi) (an O(h^2) approximation, like the
    difference quotient), so each s costs two solves. The choice of objective matters away
    from the large-B limit: the maximum of s for y* = theta* (the rise) and for y* = T*
    (absolute temperature) lie at slightly different phi.

    References
    ----------
    .. [1] M. Morbidelli, A. Varma, "Parametric sensitivity and runaway in tubular
       reactors," AIChE J., vol. 28, pp. 705-713, 1982 (from memory).
    .. [2] M. Morbidelli, A. Varma, "A generalized criterion for parametric sensitivity:
       application to thermal explosion theory," Chem. Eng. Sci., vol. 43, pp. 91-102,
       1988 (from memory).

    Examples
    --------
    >>> round(morbidelli_varma_1988_normalized_sensitivity(lambda p: p**3, 2.0), 6)
    3.0
    """
    phi = float(phi)
    if not math.isfinite(phi) or phi == 0.0:
        raise ValueError(f"phi = {phi!r}: must be finite and non-zero (s is normalised by phi).")
    rel_step = _check_positive("rel_step", rel_step)
    return _sensitivity(hot_spot_of, phi, rel_step)[0]


@dataclass(frozen=True)
class SensitivityMaximum:
    """Where the normalized sensitivity |s| peaks over a parameter range.

    Attributes
    ----------
    found : bool
        A finite maximum of |s| was located, [-]
    decided : bool
        The maximum is interior, refined, and no failed evaluation lies next to it, [-]
    reason : str
        Why the result is not decided (empty when decided), or a remark on failures away
        from the maximum, [-]
    phi : float
        Parameter value at the maximum of |s|: the Morbidelli-Varma critical value, nan if
        not found, [-]
    s_max : float
        Signed s at phi (s > 0: the objective rises with phi), [-]
    evaluations : int
        Calls of the hot-spot callable, [-]
    failed : int
        Calls that raised or returned a non-finite value, [-]
    scan_phi : tuple of float
        Coarse-scan parameter values, [-]
    scan_s : tuple of float
        s at the coarse-scan values (nan where an evaluation failed), [-]
    """

    found: bool
    decided: bool
    reason: str
    phi: float
    s_max: float
    evaluations: int
    failed: int
    scan_phi: tuple
    scan_s: tuple


def locate_sensitivity_maximum(hot_spot_of, lo, hi, n_coarse=25, rel_step=1e-4, xtol=1e-6,
                               spacing="linear"):
    r"""Locate the maximum of |s| over [lo, hi]: coarse scan, then bounded refinement [1]_.

    Parameters
    ----------
    hot_spot_of : callable
        ``hot_spot_of(phi) -> float`` hot-spot objective (see
        :func:`morbidelli_varma_1988_normalized_sensitivity`); it may raise one of
        :data:`EVALUATION_ERRORS` or return nan when a solve fails. A run stopped by a
        temperature-limit event must return nan, not the limit: a clipped T* makes a false
        peak of s where T* first reaches the limit, [K]
    lo : float
        Lower end of the parameter range, non-zero, [-]
    hi : float
        Upper end of the parameter range, > lo, [-]
    n_coarse : int, optional
        Number of coarse-scan points (>= 5), [-]
    rel_step : float, optional
        Relative central-difference step for s, [-]
    xtol : float, optional
        Relative tolerance on the located phi, [-]
    spacing : {"linear", "log"}, optional
        Spacing of the coarse grid; "log" needs 0 < lo, [-]

    Returns
    -------
    SensitivityMaximum
        ``found``, ``decided``/``reason``, critical ``phi``, signed ``s_max``, number of
        evaluations and failures, and the coarse scan.

    Notes
    -----
    1. Coarse scan: s at ``n_coarse`` points (2 evaluations each).
    2. The largest finite |s| on the scan picks the bracket between its two neighbours.
       If it is the first or last point, the maximum may lie outside the range: the result
       is found but not decided ("widen the range").
    3. Refinement: scipy's bounded Brent minimisation of -|s| inside the bracket, to
       ``xtol*|phi|``. A failed evaluation during refinement counts as s = 0 and makes the
       result undecided.
    4. Failed coarse points next to the maximum make it undecided (the peak may hide
       there); failed points elsewhere are reported in ``reason`` but keep it decided, so a
       simulator that fails only deep in the runaway region still gets a boundary.

    A scan that is too coarse can miss a peak narrower than its spacing only if |s| is not
    unimodal between neighbours; |s| of a hot spot decays slowly on both sides of the
    boundary, so 15-30 points over a factor-of-two range are enough in the reference model.

    References
    ----------
    .. [1] M. Morbidelli, A. Varma, "A generalized criterion for parametric sensitivity:
       application to thermal explosion theory," Chem. Eng. Sci., vol. 43, pp. 91-102,
       1988 (from memory).

    Examples
    --------
    >>> peak = locate_sensitivity_maximum(lambda p: 1.0 + math.atan(50.0 * (p - 1.0)), 0.5, 1.5)
    >>> peak.decided, round(peak.phi, 4)
    (True, 1.0)
    """
    lo, hi = float(lo), float(hi)
    if not (math.isfinite(lo) and math.isfinite(hi)) or hi <= lo:
        raise ValueError(f"lo, hi = {lo!r}, {hi!r}: need finite lo < hi.")
    n_coarse = int(n_coarse)
    if n_coarse < 5:
        raise ValueError(f"n_coarse = {n_coarse!r}: must be >= 5.")
    rel_step = _check_positive("rel_step", rel_step)
    xtol = _check_positive("xtol", xtol)
    if spacing == "linear":
        grid = np.linspace(lo, hi, n_coarse)
    elif spacing == "log":
        if lo <= 0.0:
            raise ValueError(f"lo = {lo!r}: spacing = 'log' needs lo > 0.")
        grid = np.geomspace(lo, hi, n_coarse)
    else:
        raise ValueError(f"spacing = {spacing!r}: choose one of: linear, log.")
    if np.any(grid == 0.0):
        raise ValueError(f"lo, hi = {lo!r}, {hi!r}: the grid contains phi = 0 (s is normalised by phi).")

    evaluations = 0
    failed = 0
    scan = []
    for phi in grid:
        s, bad = _sensitivity(hot_spot_of, float(phi), rel_step)
        evaluations += 2
        failed += bad
        scan.append(s)
    scan_s = np.array(scan)
    scan_phi = tuple(float(p) for p in grid)
    finite = np.isfinite(scan_s)
    if not np.any(finite):
        return SensitivityMaximum(False, False, "every evaluation of the coarse scan failed", math.nan,
                                  math.nan, evaluations, failed, scan_phi, tuple(scan_s))
    k = int(np.nanargmax(np.abs(np.where(finite, scan_s, np.nan))))
    failed_coarse = [float(grid[i]) for i in np.flatnonzero(~finite)]
    if k in (0, n_coarse - 1):
        end = "lower" if k == 0 else "upper"
        return SensitivityMaximum(True, False,
                                  f"maximum of |s| at the {end} end of the range; widen the range",
                                  float(grid[k]), float(scan_s[k]), evaluations, failed, scan_phi,
                                  tuple(scan_s))
    if not (finite[k - 1] and finite[k + 1]):
        return SensitivityMaximum(True, False, "failed evaluations next to the maximum of |s|",
                                  float(grid[k]), float(scan_s[k]), evaluations, failed, scan_phi,
                                  tuple(scan_s))

    refine_failed = 0
    refine_calls = 0
    best = {"phi": float(grid[k]), "s": float(scan_s[k])}

    def objective(phi):
        nonlocal refine_failed, refine_calls
        s, bad = _sensitivity(hot_spot_of, phi, rel_step)
        refine_calls += 2
        refine_failed += bad
        if math.isnan(s):
            return 0.0
        if abs(s) > abs(best["s"]):
            best.update(phi=float(phi), s=float(s))
        return -abs(s)

    a, b = float(grid[k - 1]), float(grid[k + 1])
    res = minimize_scalar(objective, bounds=(a, b), method="bounded",
                          options={"xatol": xtol * max(abs(a), abs(b)), "maxiter": 200})
    evaluations += refine_calls
    failed += refine_failed
    phi_best, s_best = best["phi"], best["s"]
    reasons = []
    decided = True
    if refine_failed:
        decided = False
        reasons.append(f"{refine_failed} evaluations failed while refining the maximum")
    if not res.success:
        decided = False
        reasons.append(f"refinement did not converge: {res.message}")
    if failed_coarse:
        reasons.append(f"{len(failed_coarse)} coarse point(s) failed, away from the maximum "
                       f"(phi = {', '.join(f'{p:.6g}' for p in failed_coarse)})")
    return SensitivityMaximum(True, decided, "; ".join(reasons), phi_best, float(s_best), evaluations,
                              failed, scan_phi, tuple(float(v) for v in scan_s))


def morbidelli_varma_1988_verdict(phi, maximum, s_threshold=None):
    """Morbidelli-Varma verdict for an operating point, from a located sensitivity maximum [1]_.

    Parameters
    ----------
    phi : float
        Operating value of the parameter that was scanned, same unit as the scan, [-]
    maximum : SensitivityMaximum
        Result of :func:`locate_sensitivity_maximum` over a range containing phi, [-]
    s_threshold : float, optional
        If given, a maximum with |s_max| below it is read as "no sharp boundary in the range"
        and the verdict is "safe"; so is a maximum at an end of the range below it when no
        evaluation failed (the largest |s| in the range is then below the threshold). No
        published value; the project notes suggest ~1 (common practice, no source), [-]

    Returns
    -------
    dict
        ``verdict``; ``critical`` = the parameter value at max |s| (nan if not found);
        ``value`` = phi; ``source`` = "morbidelli_varma1988"; plus ``s_max``.

    Notes
    -----
    The runaway side follows from the sign of s at the maximum: if the objective rises with
    phi (s > 0: inlet partial pressure, coolant temperature) the reactor runs away for
    phi >= phi_c; if it falls (s < 0: heat-transfer coefficient, N) it runs away for
    phi <= phi_c. An undecided maximum gives an "undecided" verdict with its reason.

    References
    ----------
    .. [1] M. Morbidelli, A. Varma, "A generalized criterion for parametric sensitivity:
       application to thermal explosion theory," Chem. Eng. Sci., vol. 43, pp. 91-102,
       1988 (from memory).
    """
    phi = float(phi)
    out = _result("undecided", float(maximum.phi), phi, "morbidelli_varma1988")
    out["s_max"] = float(maximum.s_max)
    if maximum.found and not maximum.decided and maximum.failed == 0 and s_threshold is not None \
            and abs(maximum.s_max) < float(s_threshold):
        # the largest |s| of a scan without failures lies at an end of the range but is still below the
        # threshold: no sharp boundary anywhere in the range (it is the largest |s| there)
        out.update(verdict="safe",
                   note=(f"|s| at most {abs(maximum.s_max):.3g} < {float(s_threshold):g} over the range (largest "
                         "at its end): no sharp boundary in the range"))
        return out
    if not maximum.found or not maximum.decided:
        out["note"] = maximum.reason or "no maximum of |s| located"
        return out
    if s_threshold is not None and abs(maximum.s_max) < float(s_threshold):
        out.update(verdict="safe",
                   note=(f"|s|max = {abs(maximum.s_max):.3g} < {float(s_threshold):g}: "
                         "no sharp boundary in the range"))
        return out
    rises = maximum.s_max > 0.0
    runaway = phi >= maximum.phi if rises else phi <= maximum.phi
    side = "above" if rises else "below"
    out.update(verdict="runaway" if runaway else "safe",
               note=f"runaway side is phi {side} the maximum of |s| (|s|max = {abs(maximum.s_max):.3g})")
    return out
