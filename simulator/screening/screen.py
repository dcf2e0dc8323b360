"""Runaway screening of a cooled tube: hot spot, groups, criteria, critical values, risk.

``screen(case)`` solves the case, then judges it by published criteria
(:mod:`simulator.screening.criteria`) and locates the runaway boundary by the
Morbidelli-Varma criterion, the maximum of the normalized sensitivity
s = (phi/T*) dT*/dphi, along one operating parameter at a time.

Coarse scans. The coarse sensitivity scans along feed fraction, medium and inlet
temperature run in one batch each through the sweep engine's compiled integrator
(:mod:`simulator.sweeps.fast`, same tolerances); the refinement around the maximum
of |s| uses :func:`~simulator.solve.integrate.simulate`.

Numerics. Screening runs use a tight solver (rtol 1e-10, atol_scale 1e-12) so
that s from central differences (relative step 1e-4) is smooth, and an internal
temperature limit of T_feed + 3 dT_ad + 500 K (never the design limit, which
would clip T* and fake a sensitivity peak); a run stopped by it or failed counts
as a failed evaluation, which the sensitivity search reports.

Dominant reaction. With several reactions, the groups are those of the
reaction with the largest heat release rate (-dH_j) r_j at the feed
composition and the medium temperature (the reaction that drives the
runaway); its activation energy enters gamma and the maxima curve.

Risk rule (documented choice; thresholds are common practice, no source):
* ``runaway`` if the operating point lies on the runaway side of a located
  Morbidelli-Varma boundary (feed fraction, medium or inlet temperature), or
  the hot spot exceeds the Van Welsenaere-Froment maxima-curve temperature T_m
  by more than R Tc^2/E;
* ``sensitive`` if s - phi/T* > 1 for the inlet or medium temperature (phi/T* is
  the sensitivity of a hot spot that follows that temperature one to one, as it does
  without reaction, so only the reaction's amplification counts), |s| > 1 for the feed
  fraction, U or the mass flow, a
  relative margin in feed fraction below 10 %,
  or a medium / inlet temperature margin below R Tc^2/E;
* ``adequate margin`` otherwise.
"""
import dataclasses
import math

import numpy as np

from simulator.errors import CaseError, SimulatorError
from simulator.model import kernel as K
from simulator.model.build import build_model
from simulator.screening import criteria as C
from simulator.solve.integrate import simulate
from simulator.units import R
from simulator.verdicts import criterion_level, risk_level

CAUTIONS = (
    "Screening-level result from a one-dimensional pseudo-homogeneous plug-flow model with a lumped "
    "wall coefficient; it is not a substitute for design by qualified, licensed engineers under the codes "
    "and regulations that apply where the plant is built.",
    "Runaway criteria are model-based and parameter-sensitive: near the boundary a 1-2 % change in kinetics, "
    "U, heat capacity or feed concentration moves the hot spot by hundreds of kelvin. Judge margins, not a "
    "single pass/fail.",
    "Not covered: hazard identification and risk assessment (HAZOP, LOPA/SIL), emergency relief and vent "
    "sizing, flammability and explosion limits of the feed, dynamics, start-up, shutdown, loss of cooling "
    "and wrong-way behaviour, radial temperature gradients, catalyst deactivation and tube-to-tube "
    "maldistribution, mechanical design.",
    "Kinetic parameters and thermochemical data carry uncertainty; the results are only as good as the "
    "case's data and their validity ranges.",
)

SENSITIVITY_PARAMETERS = ("feed_mole_fraction", "inlet_temperature", "medium_temperature",
                          "overall_coefficient", "mass_flow")
SOLVER = {"rtol": 1e-10, "atol_scale": 1e-12}
#: screening parameter -> sweep path of the compiled batch integrator (KEY = the key species)
SWEEP_PATHS = {"feed_mole_fraction": "feed.mole_fractions.KEY", "medium_temperature": "heat.medium.temperature",
               "inlet_temperature": "feed.temperature"}
REL_STEP = 1e-4
#: Smallest peak |s| taken as a runaway boundary. No published value: in the first-order reference
#: model |s|max is 1.5 at B = 5 (no real runaway) and 8 at B = 10 (runaway.md 1.7); below about 3 the
#: maximum is too flat to be a boundary (common practice, no source).
S_BOUNDARY = 3.0


class _Variants:
    """Builds and solves the case with one operating parameter changed (species data reused)."""

    def __init__(self, case, limit):
        self.species = build_model(case).species
        self.case = dataclasses.replace(
            case, solver=dataclasses.replace(case.solver, **SOLVER),
            design=dataclasses.replace(case.design, temperature_limit=limit))
        self.base = {p: self.value(p) for p in SENSITIVITY_PARAMETERS}
        self.solves = 0
        self.batched = 0       # solves done in batches by the compiled integrator
        self.prefetched = {}
        self.log = []          # (parameter, value, T*) of every evaluation

    def value(self, name):
        c = self.case
        if name == "feed_mole_fraction":
            return dict(c.feed.mole_fractions)[c.design.key_species]
        if name == "inlet_temperature":
            return c.feed.temperature
        if name == "medium_temperature":
            return c.heat.medium_temperature
        if name == "overall_coefficient":
            return c.heat.overall_coefficient
        if name == "mass_flow":
            return 1.0          # a factor on the feed flow
        raise KeyError(name)

    def variant(self, name, value):
        return self.variant_of(self.case, name, value)

    @staticmethod
    def variant_of(c, name, value):
        """The case ``c`` with one operating parameter set to ``value`` (SI)."""
        if name == "feed_mole_fraction":
            key = c.design.key_species
            x = dict(c.feed.mole_fractions)
            others = 1.0 - x[key]
            scale = (1.0 - value) / others if others > 0 else 0.0
            fractions = tuple((s, value if s == key else v * scale) for s, v in c.feed.mole_fractions)
            return dataclasses.replace(c, feed=dataclasses.replace(c.feed, mole_fractions=fractions))
        if name == "inlet_temperature":
            return dataclasses.replace(c, feed=dataclasses.replace(c.feed, temperature=value))
        if name == "medium_temperature":
            return dataclasses.replace(c, heat=dataclasses.replace(c.heat, medium_temperature=value))
        if name == "overall_coefficient":
            return dataclasses.replace(c, heat=dataclasses.replace(c.heat, overall_coefficient=value))
        if name == "mass_flow":
            return dataclasses.replace(c, feed=dataclasses.replace(c.feed, flow_value=c.feed.flow_value * value))
        raise KeyError(name)

    def solve(self, name, value):
        case = self.variant(name, value)
        self.solves += 1
        return simulate(case, model=build_model(case, species=self.species))

    def hot_spot(self, name):
        def of(value):
            key = (name, float(value))
            if key in self.prefetched:
                T = self.prefetched.pop(key)
            else:
                result = self.solve(name, value)
                T = result.hot_spot["temperature_K"] if result.status == "completed" else math.nan
            self.log.append((name, float(value), T))
            return T
        return of

    def prefetch(self, name, lo, hi, n_coarse, rel_step):
        """Solve a coarse sensitivity scan in one batch through the sweep engine's compiled integrator.

        The values are exactly those :func:`criteria.locate_sensitivity_maximum` will ask for
        (phi +- rel_step |phi| on ``numpy.linspace(lo, hi, n_coarse)``); the refinement around
        the maximum still goes through :func:`simulate`. Skipped when the compiled path does not
        support the parameter (then every point is solved one by one).
        """
        path = SWEEP_PATHS.get(name, "").replace("KEY", self.case.design.key_species)
        if not path:
            return 0
        from simulator.sweeps import fast

        base = build_model(self.case, species=self.species)
        if not fast.supports([path], base):
            return 0
        phis = []
        for phi in np.linspace(lo, hi, n_coarse):
            phi = float(phi)
            h = rel_step * abs(phi)
            phis += [phi + h, phi - h]
        out = fast.batch_solve(base, np.array(phis)[:, None], [path], rtol=SOLVER["rtol"],
                               atol_scale=SOLVER["atol_scale"], temperature_limit=self.case.design.temperature_limit)
        for k, phi in enumerate(phis):
            ok = fast.STATUS_NAMES[int(out["status"][k])] == "completed"
            self.prefetched[(name, phi)] = float(out["hot_spot_temperature_K"][k]) if ok else math.nan
        self.batched += len(phis)
        return len(phis)


def dominant_reaction(model):
    """Index of the reaction with the largest heat release rate at feed composition and medium T."""
    case = model.case
    n = model.n
    Tc = case.heat.medium_temperature
    y = model.y0.copy()
    rates = np.empty(len(case.reactions))
    K.reaction_rates(Tc, case.feed.pressure, y[:n], *_rate_args(model), rates)
    nasa = model.args[2]
    h = np.array([K._h_RT(nasa[i], Tc) * R * Tc for i in range(n)])
    dH = h @ model.args[4]
    release = -dH * rates
    return int(np.argmax(release)), rates, dH


def _rate_args(model):
    ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit = model.args
    return ip, fp, nasa, nu, ordr, rexp, rx, ads, crit


def dimensionless_groups(model, j, rates, dH):
    """gamma, B, St, Da, N, psi of reaction j for one tube (definitions in runaway.md section 0)."""
    case = model.case
    n = model.n
    Tc = case.heat.medium_temperature
    key = model.key_index
    nu_key = -model.args[4][key, j]
    F0 = model.y0[:n]
    nasa = model.args[2]
    cp_flow = sum(F0[i] * K._cp_R(nasa[i], case.feed.temperature) * R for i in range(n))   # [W/K]
    E = case.reactions[j].activation_energy
    gamma = E / (R * Tc)
    dT_ad = -dH[j] * F0[key] / nu_key / cp_flow
    B = gamma * dT_ad / Tc
    L, D = case.tube.length, case.tube.inner_diameter
    St = case.heat.overall_coefficient * math.pi * D * L / cp_flow
    Da = rates[j] * nu_key * model.area * L / F0[key]
    N = St / Da if Da > 0 else math.inf
    psi = B / N if N > 0 else math.inf
    return {"reaction": case.reactions[j].equation, "gamma": gamma, "adiabatic_rise_K": dT_ad, "B": B, "St": St,
            "Da": Da, "N": N, "psi": psi, "N_over_B": N / B if B > 0 else math.inf,
            "definitions": "gamma = E/(R Tc); B = gamma dT_ad/Tc with dT_ad = (-dH) F_key0 / (|nu_key| sum F_i cp_i) "
                           "at the feed; St = U pi D L / sum F_i cp_i; Da = r(feed, Tc) |nu_key| A_c L / F_key0; "
                           "N = St/Da; psi = B/N"}


def _range(name, base, case, rise):
    Tc = case.heat.medium_temperature
    if name == "feed_mole_fraction":
        return 0.4 * base, min(2.5 * base, 0.5 * (1.0 + base))
    if name in ("medium_temperature", "inlet_temperature"):
        width = max(60.0, 0.3 * abs(rise)) if math.isfinite(rise) else 60.0
        return max(base - 0.5 * width, 0.5 * Tc), base + width
    raise KeyError(name)


def screen(case, n_coarse=21):
    """Runaway screen of a cooled case; returns the ``screening.json`` dict (SI units).

    Parameters
    ----------
    case : simulator.case.schema.Case
        A case with ``heat.mode = "exchange"`` (a medium on the shell side) and an exothermic reaction.
    n_coarse : int
        Points of each coarse sensitivity scan, [-]

    Returns
    -------
    dict
    """
    if not case.heat.exchange:
        raise CaseError(f"{case.source_path}: heat.mode = {case.heat.mode!r}: runaway screening needs a tube "
                        'cooled through its wall (heat.mode = "exchange" with a [heat.medium]).')
    base_result = simulate(case)
    if base_result.status == "failed":
        raise SimulatorError(f"the base case failed: {base_result.termination}")
    rise = base_result.adiabatic_temperature_rise
    if not (math.isfinite(rise) and rise > 0):
        what = (f"adiabatic rise {rise:+.4g} K" if math.isfinite(rise)
                else "complete conversion cannot even happen adiabatically")
        raise CaseError(f"{case.source_path}: no exothermic path for the key species {case.design.key_species} "
                        f"({what}): runaway screening does not apply.")
    limit = case.feed.temperature + 3.0 * rise + 500.0
    v = _Variants(case, limit)
    model = build_model(v.case, species=v.species)
    j, rates, dH = dominant_reaction(model)
    groups = dimensionless_groups(model, j, rates, dH)
    screened = v.solve("feed_mole_fraction", v.base["feed_mole_fraction"])
    Tc = case.heat.medium_temperature
    E = case.reactions[j].activation_energy
    T_star = screened.hot_spot["temperature_K"]
    hot = dict(screened.hot_spot)
    hot["rise_above_medium_K"] = T_star - Tc

    # criteria on the operating point
    crit = {}
    crit["semenov"] = C.semenov_1928_verdict(groups["psi"], groups["gamma"]) if math.isfinite(groups["psi"]) \
        else {"verdict": "undecided", "critical": None, "value": None, "source": "semenov1928",
              "note": "no cooling (St = 0)"}
    vwf = C.van_welsenaere_froment_1970_maxima_curve_verdict(T_star, Tc, E)
    infl, ae = _profile_criteria(screened, build_model(v.variant("feed_mole_fraction", v.base["feed_mole_fraction"]),
                                                       species=v.species))
    vwf["inflection"] = infl
    crit["van_welsenaere_froment"] = vwf
    crit["adler_enig"] = ae

    # Morbidelli-Varma boundaries along three parameters
    critical = {}
    scans = {}
    for name, key in (("feed_mole_fraction", "feed_mole_fraction"), ("medium_temperature", "medium_temperature_K"),
                      ("inlet_temperature", "inlet_temperature_K")):
        base = v.base[name]
        lo, hi = _range(name, base, case, rise)
        v.prefetch(name, lo, hi, n_coarse, REL_STEP)
        peak = C.locate_sensitivity_maximum(v.hot_spot(name), lo, hi, n_coarse=n_coarse, rel_step=REL_STEP,
                                            xtol=1e-5)
        scans[name] = peak
        verdict = C.morbidelli_varma_1988_verdict(base, peak, s_threshold=S_BOUNDARY)
        entry = {"value": peak.phi if peak.found and peak.decided else None,
                 "found": bool(peak.found and peak.decided and abs(peak.s_max) >= S_BOUNDARY),
                 "operating_value": base, "search_range": [lo, hi], "s_max": peak.s_max,
                 "verdict": verdict["verdict"], "note": verdict.get("note", ""), "evaluations": peak.evaluations}
        if entry["found"]:
            entry["margin"] = peak.phi - base
            entry["margin_relative"] = (peak.phi - base) / base
        else:
            entry["value"] = None
            entry["margin"] = None
            entry["margin_relative"] = None
        critical[key] = entry
    _criteria_boundaries(v, crit, critical["feed_mole_fraction"], Tc, E)
    mv = critical["feed_mole_fraction"]
    crit["morbidelli_varma"] = {"verdict": mv["verdict"], "critical": mv["value"], "value": mv["operating_value"],
                                "parameter": f"feed mole fraction of {case.design.key_species}",
                                "source": "morbidelli_varma1988", "note": mv["note"]}

    # normalized sensitivities at the operating point
    sensitivity = {}
    for name in SENSITIVITY_PARAMETERS:
        base = v.base[name]
        s = C.morbidelli_varma_1988_normalized_sensitivity(v.hot_spot(name), base, rel_step=REL_STEP) \
            if base > 0 else math.nan
        sensitivity[name] = None if not math.isfinite(s) else s
    excess = _excess_sensitivity(v, sensitivity, T_star)

    risk, rule = _risk(critical, excess, vwf, Tc, E, T_star)
    _attach_levels(crit, critical)
    return {
        "title": case.title,
        "key_species": case.design.key_species,
        "adiabatic_temperature_rise_K": rise,
        "hot_spot": hot,
        "medium_temperature_K": Tc,
        "groups": groups,
        "criteria": crit,
        "critical": critical,
        "sensitivity": sensitivity,
        "sensitivity_without_reaction": {k: excess[k + "_inert"] for k in TEMPERATURE_PARAMETERS},
        "sensitivity_excess": {k: excess[k] for k in SENSITIVITY_PARAMETERS},
        "risk": risk,
        "risk_level": risk_level(risk),
        "risk_rule": rule,
        "cautions": list(CAUTIONS),
        "solves": v.solves + v.batched + 1,
        "solves_batched": v.batched,
        "numerics": {"rtol": SOLVER["rtol"], "atol_scale": SOLVER["atol_scale"], "relative_step": REL_STEP,
                     "internal_temperature_limit_K": limit, "coarse_points": n_coarse,
                     "undecided": {k: scans[k].reason for k in scans if scans[k].reason}},
        "references": ["semenov1928", "van_welsenaere_froment1970", "thomas_bowes1961", "adler_enig1964",
                       "morbidelli_varma1988"],
        "_log": v.log,
    }


def _attach_levels(criteria, critical):
    """Write the level of every verdict beside it (:mod:`simulator.verdicts`)."""
    for entry in list(criteria.values()) + list(critical.values()):
        entry["level"] = criterion_level(entry["verdict"])
        inner = entry.get("inflection")
        if isinstance(inner, dict):
            inner["level"] = criterion_level(inner["verdict"])


def _profile_derivatives(result, model):
    """(z, T, X, dT/dz, dT/dX) up to the hot spot, derivatives exact from the right-hand side."""
    count = result.case.tube.count
    n = model.n
    key = model.key_index
    F0k = result.F[0, key] / count
    # the rising branch and a few points past the hot spot (so the tests see the maximum), while the
    # conversion is still below 1 (dT/dX is undefined at complete conversion)
    spacing = result.z[-1] / max(len(result.z) - 1, 1)
    mask = (result.z <= result.hot_spot["position_m"] + 3.5 * spacing) & (result.conversion < 1.0 - 1e-9)
    idx = np.flatnonzero(mask)
    d = np.array([K.rhs_odeint(np.concatenate([result.F[k] / count, [result.T[k], result.P[k], result.Tc[k],
                                                                    result.Q[k] / count]]), result.z[k], *model.args)
                  for k in idx]).reshape(len(idx), -1)
    dTdz = d[:, n] if len(idx) else np.zeros(0)
    dXdz = -d[:, key] / F0k if len(idx) else np.zeros(0)
    with np.errstate(divide="ignore", invalid="ignore"):
        dTdX = np.where(dXdz > 0, dTdz / dXdz, np.nan)
    keep = np.isfinite(dTdX)
    return (result.z[idx], result.T[idx], result.conversion[idx], dTdz, dTdX, keep)


def _profile_criteria(result, model):
    """(inflection verdict dict, Adler-Enig verdict dict) on the rising branch of a profile."""
    z, T, X, dTdz, dTdX, keep = _profile_derivatives(result, model)
    if len(z) < 5:
        undecided = {"verdict": "undecided", "critical": 0.0, "value": None, "note": "hot spot at the inlet"}
        return dict(undecided, source="van_welsenaere_froment1970"), dict(undecided, source="adler_enig1964")
    infl = C.van_welsenaere_froment_1970_inflection_verdict(z, T, dTdz)
    ae = C.adler_enig_1964_verdict(X[keep], T[keep], dT_dx=dTdX[keep]) if keep.sum() >= 5 else \
        {"verdict": "undecided", "critical": 0.0, "value": None, "source": "adler_enig1964",
         "note": "conversion does not increase before the hot spot"}
    return infl, ae


def _profile_verdicts(v, y, Tc, E):
    """(T* - T_m, inflection verdict, Adler-Enig verdict) of the case at feed fraction y."""
    case = v.variant("feed_mole_fraction", y)
    model = build_model(case, species=v.species)
    v.solves += 1
    result = simulate(case, model=model)
    if result.status != "completed":
        return math.inf, "runaway", "runaway"
    T_m = C.van_welsenaere_froment_1970_maxima_temperature(Tc, E)
    infl, ae = _profile_criteria(result, model)
    return result.hot_spot["temperature_K"] - T_m, infl["verdict"], ae["verdict"]


def _first_flip(flag, lo, hi, tol, n=21):
    """Smallest parameter where a boolean criterion flag turns True: scan, then bisection; or None.

    The scan finds the first grid point where the flag is True (deep in the runaway region a
    profile test may flip back, because the profile saturates at complete conversion), and
    bisection refines between it and the grid point before it.
    """
    grid = np.linspace(lo, hi, n)
    if flag(grid[0]):
        return None
    k = next((k for k in range(1, n) if flag(grid[k])), None)
    if k is None:
        return None
    a, b = grid[k - 1], grid[k]
    while b - a > tol:
        mid = 0.5 * (a + b)
        if flag(mid):
            b = mid
        else:
            a = mid
    return 0.5 * (a + b)


def _criteria_boundaries(v, crit, mv_entry, Tc, E):
    """Critical feed mole fraction of the key species by each profile criterion (scan + bisection)."""
    lo, hi = mv_entry["search_range"]
    tol = 1e-5 * hi
    cache = {}

    def at(y):
        y = float(y)
        if y not in cache:
            cache[y] = _profile_verdicts(v, y, Tc, E)
        return cache[y]

    for name, flag, where in (
            ("van_welsenaere_froment", lambda y: at(y)[0] > 0.0, None),
            ("van_welsenaere_froment", lambda y: at(y)[1] == "runaway", "inflection"),
            ("adler_enig", lambda y: at(y)[2] == "runaway", None)):
        target = crit[name] if where is None else crit[name][where]
        found = _first_flip(flag, lo, hi, tol)
        target["critical_feed_mole_fraction"] = None if found is None else float(found)
        target["feed_search_range"] = [lo, hi]


TEMPERATURE_PARAMETERS = ("inlet_temperature", "medium_temperature")


def _excess_sensitivity(v, sensitivity, T_star):
    """s minus the sensitivity the tube would have if its hot spot followed the parameter one to one.

    Without reaction the hot spot is the inlet or the medium temperature, so dT*/dphi = 1 and
    s_0 = phi/T* for those two parameters whatever the kinetics; only the excess over that
    baseline measures the reaction's amplification. For the other parameters s_0 = 0. Returns
    the excess per parameter and the baselines as ``<name>_inert``.
    """
    out = {}
    for name in SENSITIVITY_PARAMETERS:
        s = sensitivity[name]
        base_s = v.base[name] / T_star if name in TEMPERATURE_PARAMETERS else 0.0
        if name in TEMPERATURE_PARAMETERS:
            out[name + "_inert"] = base_s
        out[name] = None if s is None else s - base_s
    return out


def _risk(critical, sensitivity, vwf, Tc, E, T_star):
    """Risk class and the rule that set it; ``sensitivity`` is the excess over the no-reaction tube."""
    scale = R * Tc ** 2 / E
    reasons = []
    for key, entry in critical.items():
        if entry["found"] and entry["verdict"] == "runaway":
            reasons.append(f"operating point on the runaway side of the {key} boundary")
    if vwf.get("critical") and T_star > vwf["critical"] + scale:
        reasons.append("hot spot above the maxima-curve temperature T_m by more than R Tc^2/E")
    if reasons:
        return "runaway", "; ".join(reasons)
    sens = []
    for name, s in sensitivity.items():
        if s is None:
            continue
        if name in TEMPERATURE_PARAMETERS and s > 1.0:     # amplification beyond following 1:1
            sens.append(f"s - T/T* = {s:.3g} > 1 for {name}")
        elif name not in TEMPERATURE_PARAMETERS and abs(s) > 1.0:
            sens.append(f"|s| = {abs(s):.3g} > 1 for {name}")
    fm = critical["feed_mole_fraction"]
    if fm["found"] and fm["margin_relative"] is not None and abs(fm["margin_relative"]) < 0.10:
        sens.append(f"feed-fraction margin {100 * fm['margin_relative']:.1f} % < 10 %")
    for key in ("medium_temperature_K", "inlet_temperature_K"):
        e = critical[key]
        if e["found"] and e["margin"] is not None and abs(e["margin"]) < scale:
            sens.append(f"{key} margin {e['margin']:.1f} K < R Tc^2/E = {scale:.1f} K")
    if sens:
        return "sensitive", "; ".join(sens)
    return "adequate margin", (f"no s - T/T* > 1 (inlet, medium temperature) or |s| > 1 (feed fraction, U, "
                               f"mass flow), feed-fraction margin >= 10 % and temperature margins >= R Tc^2/E "
                               f"= {scale:.1f} K (thresholds: common practice, no source)")


def screening_json(report):
    """The report without its private evaluation log (what ``screening.json`` holds)."""
    return {k: v for k, v in report.items() if not k.startswith("_")}


def format_screening(report):
    """Terminal summary of a screen."""
    h, g = report["hot_spot"], report["groups"]

    def f(value, spec=".4g"):
        return "n/a" if value is None else format(value, spec)

    lines = [report["title"],
             f"  risk: {report['risk']} (level {report['risk_level']}; {report['risk_rule']})",
             f"  hot spot {h['temperature_K']:.2f} K at z = {h['position_m']:.4g} m, "
             f"{h['rise_above_medium_K']:+.2f} K above the medium; adiabatic rise "
             f"{report['adiabatic_temperature_rise_K']:.1f} K",
             f"  groups ({g['reaction']}): gamma {g['gamma']:.3g}, B {g['B']:.3g}, St {g['St']:.3g}, "
             f"Da {g['Da']:.3g}, N {g['N']:.3g}, psi {g['psi']:.3g}",
             "  criteria:"]
    for name, c in report["criteria"].items():
        extra = ""
        if c.get("critical_feed_mole_fraction") is not None:
            extra = f", critical feed fraction {c['critical_feed_mole_fraction']:.5g}"
        lines.append(f"    {name:24s}{c['verdict']:>10s} ({c['level']})  critical {f(c['critical'])}{extra}")
    lines.append("  critical values (Morbidelli-Varma):")
    for name, c in report["critical"].items():
        if c["found"]:
            lines.append(f"    {name:24s}{c['value']:.6g} (operating {c['operating_value']:.6g}, "
                         f"margin {c['margin']:+.4g})")
        else:
            lines.append(f"    {name:24s}not found in {c['search_range'][0]:.4g}-{c['search_range'][1]:.4g}"
                         f" ({c['note']})")
    lines.append("  normalized sensitivity s = (phi/T*) dT*/dphi: " + ", ".join(
        f"{k} {f(v, '+.3g')}" for k, v in report["sensitivity"].items()))
    lines.append(f"  {report['solves']} solves. Screening only: see the cautions in screening.json; defer to "
                 "licensed engineers and local codes.")
    return "\n".join(lines)


def sensitivity_rows(report):
    """Rows (parameter, value, hot_spot_temperature_K) of every evaluation, sorted, for sensitivity.csv."""
    rows = sorted(set(report["_log"]))
    out = []
    by = {}
    for name, value, T in rows:
        by.setdefault(name, []).append((value, T))
    for name, pts in by.items():
        pts.sort()
        values = np.array([p[0] for p in pts])
        T = np.array([p[1] for p in pts])
        s = np.full(len(pts), np.nan)
        ok = np.isfinite(T)
        if ok.sum() >= 3:
            vv, TT = values[ok], T[ok]
            grad = np.gradient(TT, vv)
            s[ok] = vv * grad / TT
        for k in range(len(pts)):
            out.append((name, values[k], T[k], s[k]))
    return out
