"""Counter-current medium: every steady state, by shooting on the medium temperature at z = 0.

The medium enters at z = L with its given temperature T_in and leaves at z = 0, so the
balances are a two-point boundary-value problem. It is solved by shooting on the one
unknown s = Tc(0), the medium's outlet temperature:

1. **Scan.** The residual R(s) = Tc(L; s) - T_in (one initial-value integration of the
   compiled kernel per value) is evaluated on :data:`SCAN_POINTS` values spread evenly
   over the physically possible range of s (:func:`scan_range`). Between neighbouring
   values where R keeps its sign but |R| has a local minimum, the extremum is located
   (bounded Brent minimisation) so that a close pair of roots is not missed.
2. **Bracket and refine.** Every sign change of R is a bracket; each is refined by Brent's
   method (``scipy.optimize.brentq``). Every root is a steady state: all are reported.
3. **Polish where marching is unstable.** When the shooting residual is so sensitive that
   the integration error of one march moves the medium inlet temperature by more than
   :data:`MARCHING_TOLERANCE` (|dR/ds| above :data:`UNSTABLE_SLOPE`), the root's profile is
   polished by collocation (``scipy.integrate.solve_bvp``) started from the marched
   profile, never from a guessed one; without that condition no collocation runs.
4. **Full run.** Each steady state is then run through :func:`simulate` with its s
   (events, hot spot, closure, checks), so every number of a state comes from the same
   machinery as any other run.

Stability label (a property of the S-shaped residual, not of a dynamic model). Along the
scan the roots of a continuous R with simple roots alternate in the sign of dR/ds. When
the number of roots is odd, the two outermost share their sign; they are the extinguished
and the ignited states of the classical S-curve of a tube with heat feedback (van Heerden
1953), which are stable, and the states between them alternate: a root whose slope has the
sign of the outermost ones is labelled ``"stable"``, the others ``"unstable"``. One root is
``"unique"``. An even number of roots (a tangent root, or a part of the range that could
not be integrated) gives ``"not determined"`` for all of them.

Which state the outputs describe: the one a start-up from a cold medium reaches, taken as
the lowest branch: the state with the lowest hot-spot temperature among those labelled
``"stable"`` or ``"unique"`` (the lowest overall if none is). A warning names the others.

References
----------
C. van Heerden, "Autothermic processes: properties and reactor design," Ind. Eng. Chem.,
vol. 45, no. 6, pp. 1242-1247, 1953 (multiple steady states of a reactor with heat feedback).
"""
import dataclasses
import math
import time
import warnings

import numpy as np
from scipy.integrate import ODEintWarning, odeint, solve_bvp
from scipy.optimize import brentq, minimize_scalar

from simulator.model import kernel as K
from simulator.model import kernels
from simulator.model.build import build_model
from simulator.results import _num
from simulator.thermo.nasa7 import cp_R
from simulator.units import R as R_GAS

#: values of s = Tc(0) in the scan of the shooting residual, [-]
SCAN_POINTS = 64
#: widening of the energy-balance bounds of s on each side, as a fraction of their span, [-]
#: (covers heat capacities that change with temperature; common practice, no source)
RANGE_MARGIN = 0.25
#: |dR/ds| above which marching from z = 0 amplifies integration errors so much that the
#: root is polished by collocation, [-]
UNSTABLE_SLOPE = 1e4
#: medium inlet temperature error a marched profile may carry before it is polished, [K]
MARCHING_TOLERANCE = 1e-3
#: solver steps one march of the scan may take (a march that needs more has left the physical states), [-]
STEP_BUDGET = 5_000
#: output points of the march that looks for where a diverging medium leaves the band, [-]
EXIT_POINTS = 129


@dataclasses.dataclass(frozen=True)
class Shooting:
    """One shooting problem: the model, which unknown sets which entries of y0, and the target."""

    model: object
    length: float
    target: float           # medium temperature at z = L, [K]
    autothermal: bool       # the feed is the medium: T(0) = Tc(0) = s as well
    kernel: object
    rtol: float
    atol: np.ndarray
    hmax: float

    def y0(self, s):
        n = self.model.n
        y = self.model.y0.copy()
        y[n + 2] = s
        if self.autothermal:
            y[n] = s
        return y

    def march(self, s, zs=None):
        """States along [0, L] from Tc(0) = s (rows of zs, default the two ends), or None if it fails."""
        zs = np.array([0.0, self.length]) if zs is None else zs
        with warnings.catch_warnings(), np.errstate(all="ignore"):
            warnings.simplefilter("ignore", ODEintWarning)
            try:
                ys, info = odeint(self.kernel.rhs_odeint, self.y0(s), zs, args=self.model.args, rtol=self.rtol,
                                  atol=self.atol, full_output=True, hmax=self.hmax, mxstep=STEP_BUDGET,
                                  printmessg=False)
            except (ArithmeticError, ValueError):
                return None
        if info["message"] != "Integration successful." or not np.all(np.isfinite(ys)):
            return None
        return ys

    def residual(self, s):
        """R(s) = Tc(L; s) - T_in, [K]; NaN where the march fails.

        A march that fails because its medium left every temperature a steady state can have
        (:meth:`exit_residual`) gets the residual of the side it left on, so the scan keeps the
        sign there (a strongly cooled tube: most marches diverge before z = L).
        """
        ys = self.march(s)
        if ys is None:
            return self.exit_residual(s)
        return float(ys[-1, self.model.n + 2] - self.target)

    def exit_residual(self, s):
        """Residual of a march whose medium leaves the band of possible temperatures, [K]; NaN otherwise.

        In the march from z = 0 a counter-current medium runs away from the gas: with the signed
        C_m < 0, dTc/dz = U pi D (Tc - T) / |C_m|, and the gas follows the medium. Once the medium is
        outside :func:`exit_band` (the energy-balance range of Tc(0) widened by its span on each
        side: no steady state has a medium temperature there, by the maximum principle of
        :func:`scan_range`), it is on the far side of the gas and keeps moving away, so Tc(L) is
        beyond the exit and R(s) has the sign of the side it left on. The value returned is
        Tc(exit) - T_in (not Tc(L) - T_in): good for bracketing; a root is only accepted from a march
        that reaches z = L (:func:`find_roots` refines with these values and then marches the root).
        """
        lo, hi = exit_band(self.model, self.target, self.autothermal, self.length)
        zs = np.linspace(0.0, self.length, EXIT_POINTS)
        with warnings.catch_warnings(), np.errstate(all="ignore"):
            warnings.simplefilter("ignore", ODEintWarning)
            try:
                ys = odeint(self.kernel.rhs_odeint, self.y0(s), zs, args=self.model.args, rtol=self.rtol,
                            atol=self.atol, hmax=self.hmax, mxstep=STEP_BUDGET, printmessg=False)
            except (ArithmeticError, ValueError):
                return math.nan
        Tc = ys[:, self.model.n + 2]
        for value in Tc:
            if not math.isfinite(value):
                return math.nan
            if value < lo or value > hi:
                return float(value - self.target)
        return math.nan


def gas_capacity_rate(model):
    """Heat capacity rate of the feed of one tube at the feed temperature, sum_i F_i cp_i, [W/K]."""
    n = model.n
    T0 = model.y0[n]
    nasa = model.args[2]
    return float(sum(model.y0[i] * cp_R(nasa[i], T0) * R_GAS for i in range(n)))


def exit_band(model, target, autothermal=False, length=None):
    """Medium temperatures no steady state reaches: outside (low, high) [K], the range of
    :func:`scan_range` widened by its span on each side (at least 1 K above absolute zero)."""
    lo, hi = scan_range(model, target, autothermal, length)
    span = hi - lo
    return max(lo - span, 1.0), hi + span


def scan_range(model, target, autothermal=False, length=None):
    r"""Physically possible range of the medium temperature at z = 0, (low, high) [K].

    Parameters
    ----------
    model : simulator.model.build.Model
        Packed model of one tube.
    target : float
        Medium temperature at z = L, [K]
    autothermal : bool
        The feed is the medium (T(0) = Tc(0)).
    length : float, optional
        Tube length, [m]; the case's by default.

    Returns
    -------
    bounds : tuple of float
        Lowest and highest medium temperature at z = 0, [K]

    Notes
    -----
    Energy balance of the whole exchanger with C_g, C_m the gas and medium capacity rates:
    C_m (Tc(0) - T_in) = C_g (T_feed - T_out) + (heat released by the reactions). With the
    reaction heat at most C_g dT_ad (complete conversion of the key species, the adiabatic
    rise of :mod:`simulator.model.adiabatic`) and no temperature outside the inlet temperatures
    widened by the reaction (a maximum principle),

    .. math:: T_{in} - r\,(T_{hi} - T_{feed} + \Delta T_{ad}^-) \le T_c(0)
              \le T_{in} + r\,(T_{feed} - T_{lo} + \Delta T_{ad}^+), \qquad r = C_g / C_m

    with T_lo, T_hi the lower and higher of T_feed and T_in. For an autothermal tube (the feed
    preheated by the products) the highest is T_in + (1 + NTU) dT_ad, NTU = U pi D L / C_g. Both
    are widened by :data:`RANGE_MARGIN` of their span (heat capacities change with
    temperature) on the side the reaction heat acts; on the other side the bound is the lower
    (exothermic) or higher (endothermic) inlet temperature, -/+ 1 K.
    """
    n = model.n
    fp = model.args[1]
    L = model.case.tube.length if length is None else length
    Cg = gas_capacity_rate(model)
    Cm = abs(fp[K.F_MCP])
    rise = model.adiabatic[0]
    rise = 0.0 if not math.isfinite(rise) else rise
    if autothermal:
        ntu = fp[K.F_U] * math.pi * fp[K.F_DIAM] * L / Cg
        lo, hi = target - (1.0 + ntu) * max(-rise, 0.0), target + (1.0 + ntu) * max(rise, 0.0)
    else:
        T_feed = model.y0[n]
        r = Cg / Cm
        t_lo, t_hi = min(T_feed, target), max(T_feed, target)
        lo = target - r * (t_hi - T_feed + max(-rise, 0.0))
        hi = target + r * (T_feed - t_lo + max(rise, 0.0))
    span = max(hi - lo, 1.0)
    # no temperature falls below the lower inlet temperature unless the reactions take up heat,
    # nor rises above the higher one unless they release it: the margin goes only where the
    # heat capacities matter
    t_lo = min(model.y0[n], target)
    t_hi = max(model.y0[n], target)
    lo = lo - RANGE_MARGIN * span if rise < 0.0 else t_lo - 1.0
    hi = hi + RANGE_MARGIN * span if rise > 0.0 else t_hi + 1.0
    return max(lo, 0.05 * target, 1.0), hi


def find_roots(shooting, bounds, points=SCAN_POINTS):
    """Every root of the shooting residual over ``bounds``: (roots, scan) with roots a list of dicts.

    Each root: ``s`` [K], ``slope`` dR/ds at it [-] (from its bracket), ``bracket`` (a, b) [K].
    ``scan`` holds the scanned ``s`` and ``residual`` arrays, ``failed`` (values whose march failed)
    and ``unresolved`` (brackets whose refinement met a failed march: not reported as roots).
    """
    s = np.linspace(bounds[0], bounds[1], points)
    r = np.array([shooting.residual(v) for v in s])
    brackets = []
    for k in range(points - 1):
        a, b, ra, rb = s[k], s[k + 1], r[k], r[k + 1]
        if not (math.isfinite(ra) and math.isfinite(rb)):
            continue
        if ra == 0.0:
            brackets.append((a, a, ra, ra))
        elif ra * rb < 0.0:
            brackets.append((a, b, ra, rb))
    brackets += _hidden_pairs(shooting, s, r)
    roots, unresolved = [], []
    for a, b, ra, rb in sorted(brackets):
        if a == b:
            root, slope = a, _slope(shooting, a, bounds)
        else:
            try:
                root = brentq(_finite(shooting.residual), a, b, xtol=1e-9 * max(abs(a), 1.0), rtol=1e-12)
            except ArithmeticError as err:
                unresolved.append(f"a sign change between {a:.6g} and {b:.6g} K was not refined: {err}")
                continue
            slope = (rb - ra) / (b - a)
            if shooting.march(root) is None:
                # the sign changed between marches that left the band on either side: the root is
                # where marching cannot follow (the error of the march grows too fast), not a state
                unresolved.append(f"a sign change between {a:.6g} and {b:.6g} K narrowed to {root:.8g} K, "
                                  "where the march from z = 0 still leaves the physical temperatures")
                continue
        if roots and abs(root - roots[-1]["s"]) <= 1e-7 * max(abs(root), 1.0):
            continue
        roots.append({"s": float(root), "slope": float(slope), "bracket": (float(a), float(b))})
    return roots, {"s": s, "residual": r, "failed": int(np.sum(~np.isfinite(r))), "unresolved": unresolved}


def _finite(f):
    """f with NaN (a failed march inside a bracket) turned into an error brentq reports."""
    def g(x):
        v = f(x)
        if not math.isfinite(v):
            raise ArithmeticError(f"the march from Tc(0) = {x:.6g} K failed inside a bracket")
        return v
    return g


def _slope(shooting, s, bounds):
    h = 1e-6 * (bounds[1] - bounds[0])
    return (shooting.residual(s + h) - shooting.residual(s - h)) / (2.0 * h)


def _hidden_pairs(shooting, s, r):
    """Brackets of a close pair of roots between scan points: R keeps its sign around a local
    extremum of |R|; the extremum is located, and if R changes sign there, two brackets result."""
    out = []
    for k in range(1, len(s) - 1):
        trio = r[k - 1:k + 2]
        if not np.all(np.isfinite(trio)) or not (np.sign(trio[0]) == np.sign(trio[1]) == np.sign(trio[2])):
            continue
        if not (abs(trio[1]) < abs(trio[0]) and abs(trio[1]) < abs(trio[2])):
            continue
        sign = np.sign(trio[1])
        best = minimize_scalar(lambda x: sign * _or_large(shooting.residual(x)), bounds=(s[k - 1], s[k + 1]),
                               method="bounded", options={"xatol": 1e-6 * max(abs(s[k]), 1.0)})
        x, rx = float(best.x), shooting.residual(float(best.x))
        if math.isfinite(rx) and rx * sign < 0.0:
            out.append((float(s[k - 1]), x, float(trio[0]), rx))
            out.append((x, float(s[k + 1]), rx, float(trio[2])))
    return out


def _or_large(v):
    return v if math.isfinite(v) else 1e300


def stability_labels(roots):
    """Labels of the roots in order of s (see the module docstring)."""
    if len(roots) == 1:
        return ["unique"]
    if len(roots) % 2 == 0:
        return ["not determined"] * len(roots)
    outer = np.sign(roots[0]["slope"])
    if np.sign(roots[-1]["slope"]) != outer or outer == 0:
        return ["not determined"] * len(roots)
    return ["stable" if np.sign(rt["slope"]) == outer else "unstable" for rt in roots]


def polish(shooting, s, nodes=200):
    """Collocation (solve_bvp) from the marched profile of Tc(0) = s; returns (s, note).

    Used only where marching is unstable (see the module docstring). The polished s is kept
    when the collocation converges and its medium temperature at z = L meets the target;
    otherwise the marched root is kept and the note says so.
    """
    model = shooting.model
    n = model.n
    zs = np.linspace(0.0, shooting.length, nodes)
    ys = shooting.march(s, zs)
    if ys is None:
        return s, "collocation not run: the march of this root failed"
    y_first = shooting.y0(s)
    free = n + 2

    def fun(z, y):
        return np.column_stack([shooting.kernel.rhs_odeint(np.ascontiguousarray(y[:, k]), z[k], *model.args)
                                for k in range(len(z))])

    def bc(ya, yb):
        res = ya - y_first
        res[free] = yb[free] - shooting.target
        if shooting.autothermal:
            res[n] = ya[n] - ya[free]
        return res

    with np.errstate(all="ignore"):
        sol = solve_bvp(fun, bc, zs, ys.T, tol=1e-6, max_nodes=20_000)
    if sol.status != 0:
        return s, f"collocation did not converge ({sol.message}); the marched root is kept"
    s_new = float(sol.y[free, 0])
    return s_new, f"polished by collocation (solve_bvp): Tc(0) {s:.6g} K -> {s_new:.6g} K"


def marching_instability(model, length=None):
    r"""How fast marching from z = 0 amplifies an error in the medium temperature, as a dict.

    Parameters
    ----------
    model : simulator.model.build.Model
        Packed model of one tube.
    length : float, optional
        Tube length, [m]; the case's by default.

    Returns
    -------
    info : dict
        ``ntu_gas`` = U pi D L / C_g, ``ntu_medium`` = U pi D L / C_m and ``growth_exponent``
        = |NTU_medium - NTU_gas|, [-]

    Notes
    -----
    Without reaction, d(T - Tc)/dz = -(UπD/C_g - UπD/C_m)(T - Tc) for a counter-current medium,
    so a disturbance of T - Tc at z = 0 grows (or decays) by exp(NTU_m - NTU_g) along the
    tube; above about 30 (e^30 ~ 1e13) a march in double precision cannot hit the far boundary
    condition, and the reaction only adds to that. A large NTU with balanced capacity rates
    also makes the residual steep: Tc(0) must then be known to within about the inlet
    temperature difference / NTU.
    """
    fp = model.args[1]
    L = model.case.tube.length if length is None else length
    UA = fp[K.F_U] * math.pi * fp[K.F_DIAM] * L
    ntu_g, ntu_m = UA / gas_capacity_rate(model), UA / abs(fp[K.F_MCP])
    return {"ntu_gas": ntu_g, "ntu_medium": ntu_m, "growth_exponent": abs(ntu_m - ntu_g)}


def shooting_problem(case, model=None, length=None, autothermal=False):
    """The :class:`Shooting` problem of a counter-current case (the kernel a single run would use)."""
    model = model or build_model(case)
    L = case.tube.length if length is None else length
    kernel = kernels.for_run()
    target = case.feed.temperature if autothermal else case.heat.medium_temperature
    return Shooting(model=model, length=L, target=target, autothermal=autothermal, kernel=kernel,
                    rtol=case.solver.rtol, atol=model.scale * case.solver.atol_scale, hmax=case.solver.max_step)


def steady_states(case, run, model=None, length=None, autothermal=False, points=SCAN_POINTS):
    """Every steady state of a counter-current case, each run in full.

    Parameters
    ----------
    case : simulator.case.schema.Case
        A case with ``heat.medium.arrangement = "counter-current"``.
    run : callable
        (case, model, length) -> Result: one initial-value run (the inner ``simulate``).
    model : simulator.model.build.Model, optional
        Pre-built model.
    length : float, optional
        Tube length, [m]
    autothermal : bool
        The feed is the medium entering at z = L with the feed temperature (T(0) = Tc(0)); a
        Python-level option for the classical autothermal tube, not a case key.
    points : int
        Values of s in the scan, [-]

    Returns
    -------
    states : list of (dict, Result)
        Each steady state's ``steady_states`` entry and its full result, in order of s.
    scan : dict
        ``bounds`` [K], ``points``, ``failed`` (marches that failed), ``polished`` notes.
    """
    shooting = shooting_problem(case, model, length, autothermal)
    bounds = scan_range(shooting.model, shooting.target, autothermal, shooting.length)
    roots, scan = find_roots(shooting, bounds, points)
    labels = stability_labels(roots)
    states, notes = [], []
    for root, label in zip(roots, labels):
        s = root["s"]
        note = "marched (shooting); no collocation needed"
        if abs(root["slope"]) > UNSTABLE_SLOPE:
            s, note = polish(shooting, s)
        result = run(case, dataclasses.replace(shooting.model, y0=shooting.y0(s)), length)
        hot = result.hot_spot
        entry = {
            "medium_outlet_temperature_K": _num(s),
            "medium_inlet_temperature_K": _num(result.Tc[-1]) if result.z[-1] >= shooting.length * (1 - 1e-12)
            else None,
            "hot_spot_temperature_K": _num(hot.get("temperature_K")) if result.status != "failed" else None,
            "hot_spot_position_m": _num(hot.get("position_m")) if result.status != "failed" else None,
            "outlet_conversion": _num(result.outlet_conversion) if result.status != "failed" else None,
            "outlet_temperature_K": _num(result.T[-1]) if result.status != "failed" else None,
            "stability": label,
            "residual_slope": _num(root["slope"]),
            "status": result.status,
            "solved_by": note,
            "describes_outputs": False,
        }
        notes.append(note)
        states.append((entry, result))
    return states, {"bounds_K": [float(bounds[0]), float(bounds[1])], "points": points,
                    "failed_marches": scan["failed"], "unresolved_brackets": scan["unresolved"], "collocation": [x for x in notes if x.startswith(("polished",
                                                                                                       "collocation"))]}


def described_state(states):
    """Index of the state the outputs describe: the lowest branch (see the module docstring), or None."""
    usable = [k for k, (e, _) in enumerate(states) if e["status"] != "failed" and e["hot_spot_temperature_K"] is not None]
    if not usable:
        return None
    preferred = [k for k in usable if states[k][0]["stability"] in ("stable", "unique")] or usable
    return min(preferred, key=lambda k: states[k][0]["hot_spot_temperature_K"])


def simulate_counter_current(case, run, model=None, length=None):
    """Result of a counter-current case: the described steady state, with all states in ``extra``.

    A case for which no steady state is found is a failed run whose termination says why.
    """
    started = time.perf_counter()
    states, scan = steady_states(case, run, model, length)
    Tin = case.heat.medium_temperature
    k = described_state(states)
    if k is None:
        base = run(case, model, length)   # only for the case echo, versions and references; no profile kept
        changed = "changed sign only where marching could not follow" if scan["unresolved_brackets"] else \
            "did not change sign"
        why = (f"no steady state found: the shooting residual Tc(L) - {Tin:.6g} K {changed} for a "
               f"medium outlet temperature between {scan['bounds_K'][0]:.6g} and {scan['bounds_K'][1]:.6g} K "
               f"({scan['points']} values, {scan['failed_marches']} of them could not be integrated)")
        instability = marching_instability(build_model(case) if model is None else model, length)
        if scan["failed_marches"] or scan["unresolved_brackets"]:
            if scan["unresolved_brackets"]:
                why += "; " + "; ".join(scan["unresolved_brackets"])
            why += (f": the marches from z = 0 left the range of physical temperatures (NTU of the gas "
                    f"{instability['ntu_gas']:.3g}, of the medium {instability['ntu_medium']:.3g}; an error in the "
                    f"medium outlet temperature grows about e^{instability['growth_exponent']:.3g} along the tube "
                    "without reaction): one march from z = 0 cannot hit the far boundary condition, and multiple "
                    "shooting is not implemented yet; check U and the medium flow, or treat the medium as uniform "
                    "if its temperature change is small")
        if states:
            why = (f"no usable steady state: {len(states)} found, every full run failed "
                   f"({states[0][1].termination})")
        return dataclasses.replace(
            base, status="failed", termination=why, z=base.z[:1], F=base.F[:1], T=base.T[:1], P=base.P[:1],
            Tc=np.full(1, math.nan), Q=base.Q[:1], Z=base.Z[:1], events={},
            extra={**base.extra, "steady_states": [e for e, _ in states], "shooting": scan})
    entries = [e for e, _ in states]
    entries[k]["describes_outputs"] = True
    result = states[k][1]
    notes = list(result.warnings)
    if scan["failed_marches"] or scan["unresolved_brackets"]:
        notes.insert(0, f"the counter-current scan could not integrate {scan['failed_marches']} of its "
                        f"{scan['points']} medium outlet temperatures" + "".join(
                            f"; {u}" for u in scan["unresolved_brackets"])
                     + ": a steady state there may be missing from steady_states")
    reached = entries[k]["medium_inlet_temperature_K"]
    if reached is not None and abs(reached - Tin) > MARCHING_TOLERANCE:
        notes.insert(0, f"the profile of the counter-current steady state reaches the medium inlet (z = L) at "
                        f"{reached:.6g} K instead of the given {Tin:.6g} K: marching from z = 0 amplifies the "
                        f"integration error here ({entries[k]['solved_by']}); the profile is approximate by "
                        "that much")
    if len(entries) > 1:
        others = "; ".join(f"Tc(0) = {e['medium_outlet_temperature_K']:.6g} K, hot spot "
                           + (f"{e['hot_spot_temperature_K']:.6g} K" if e["hot_spot_temperature_K"] is not None
                              else "not available") + f" ({e['stability']})"
                           for j, e in enumerate(entries) if j != k)
        notes.insert(0, f"{len(entries)} steady states found with the counter-current medium: the outputs describe "
                        f"the lowest branch (the state a start-up from a cold medium reaches, hot spot "
                        f"{entries[k]['hot_spot_temperature_K']:.6g} K); the others: {others}. Which one the "
                        "plant runs at depends on its start-up and history: review every state")
    stats = {**result.solver_stats, "wall_time_s": round(time.perf_counter() - started, 4),
             "counter_current": {"method": "shooting on Tc(0): scan, Brent, collocation where marching is unstable",
                                 "steady_states": len(entries), **scan}}
    return dataclasses.replace(result, warnings=tuple(notes), solver_stats=stats, design=_design_in_place(case, result),
                               extra={**result.extra, "steady_states": entries, "shooting": scan})


LENGTH_NOTE = ("with a counter-current medium the medium enters at z = L, so a shorter tube has another profile: "
               "the position where this tube crosses the target is not the length to the target; `tubesim size` "
               "re-solves tubes of different length for it")


def _design_in_place(case, result):
    """The design block of a counter-current run: whether this tube meets the target, no length.

    The located crossing stays an event (``events.target_conversion``: a position in this tube).
    """
    design = dict(result.design)
    if design.get("target_conversion") is None:
        return design
    design.update(reached=bool(result.outlet_conversion >= design["target_conversion"]), length_m=None,
                  volume_m3=None, catalyst_mass_kg=None, length_note=LENGTH_NOTE)
    return design
