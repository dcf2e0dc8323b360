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

Applicability (decided from the whole tube, :func:`applicability`). Runaway
screening applies when the reactions release heat in net along the tube
(sum_i (F_in,i - F_out,i) h_i(T_feed) > 0), the key species has an exothermic
path (positive adiabatic rise) and the reaction that releases the most heat has
gamma = E/(R Tc) > 4 (at E <= 0 its rate does not rise with temperature; for
gamma <= 4 the Semenov model has no critical point, Semenov 1928, and the
maxima curve no extremum, Van Welsenaere-Froment 1970: no thermal runaway). Where it does not apply, ``screen`` says so
plainly (``applicable: false`` with the reason) and screens nothing. A tube
heated by its medium with a net-exothermic reaction is still screened: an
exothermic reaction heated to ignition can run away.

Dominant reaction. With several reactions, the groups are those of the
reaction that releases the most heat along the tube (the integral of
(-dH_j) r_j over the design run), evaluated at the feed composition and the
medium temperature; its activation energy enters gamma and the maxima curve.

Risk rule (one rule with the tables, :mod:`simulator.verdicts`): every
criterion and every critical value carries a level; margins take theirs from
:func:`simulator.verdicts.margin_level` (feed fractions within 10 % of a
critical one, medium or inlet temperatures within R Tc^2/E, the hot spot within
a quarter of R Tc^2/E below T_m: ``review``; on or past a boundary:
``unacceptable``), the sensitivities from :func:`sensitivity_level`
(s - phi/T* > 1 for the inlet or medium temperature, where phi/T* is the
sensitivity of a hot spot that follows that temperature one to one as it does
without reaction; |s| > 1 for the feed fraction, U or the mass flow:
``review``). The risk is the worst of these levels: ``runaway``
(unacceptable), ``sensitive`` (review) or ``adequate margin`` (acceptable). The
Semenov bound is only sufficient, so its "undecided" (psi >= psi_c) does not
count towards the risk.
"""
import dataclasses
import math

import numpy as np

from simulator.errors import SimulatorError
from simulator.model import kernel as K
from simulator.model.build import build_model
from simulator.screening import criteria as C
from simulator.solve.integrate import simulate
from simulator.units import R
from simulator.verdicts import (ACCEPTABLE, REVIEW, UNACCEPTABLE, criterion_level, margin_level,
                                null_where_not_finite, review_margin, risk_level, worst)

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

#: The words that end every reason why screening does not apply (the report looks for them).
NOT_APPLICABLE = "runaway screening does not apply"
#: The words that open the reason when the reactions release no heat in net (no reaction hot spot).
NO_EXOTHERMIC_PATH = "no exothermic path"
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
        model = build_model(case)
        self.species = model.species
        self.coefficient = float(model.args[1][K.F_U])   # typed U, or U(z) from [heat.coefficient] at the feed
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
            return self.coefficient
        if name == "mass_flow":
            return 1.0          # a factor on the feed flow
        raise KeyError(name)

    def variant(self, name, value):
        if name == "overall_coefficient" and self.case.heat.coefficient is not None:
            # U from correlations: scale U(z) so that its value at the feed is ``value``
            c = self.case
            factor = c.heat.coefficient.factor * value / self.base["overall_coefficient"]
            coefficient = dataclasses.replace(c.heat.coefficient, factor=factor)
            return dataclasses.replace(c, heat=dataclasses.replace(c.heat, coefficient=coefficient))
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
    """Rates and heats of reaction at feed composition and medium T: (rates [mol/(m^3*s)], dH [J/mol])."""
    case = model.case
    n = model.n
    Tc = case.heat.medium_temperature
    y = model.y0.copy()
    rates = np.empty(len(case.reactions))
    K.reaction_rates(Tc, case.feed.pressure, y[:n], *_rate_args(model), rates)
    dH = _enthalpies(model, Tc) @ model.args[4]
    return rates, dH


def _enthalpies(model, T):
    """Molar enthalpies of the species at T, [J/mol]."""
    nasa = model.args[2]
    return np.array([K._h_RT(nasa[i], T) * R * T for i in range(model.n)])


def _rate_args(model):
    ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit = model.args
    return ip, fp, nasa, nu, ordr, rexp, rx, ads, crit


def net_heat_release(result, model):
    """Heat the reactions release in all tubes, sum_i (F_in,i - F_out,i) h_i(T_feed), [W].

    Positive when the reactions release heat in net (products brought back to the feed
    temperature); exact from the flows, whatever the reactions.
    """
    h = _enthalpies(model, result.case.feed.temperature)
    return float((result.F[0] - result.F[-1]) @ h)


def heat_release_by_reaction(result, model):
    """Heat each reaction releases along the tube, integral of (-dH_j(T)) r_j A dz in all tubes, [W].

    Trapezoidal rule on the output points of the design run (enough to rank the reactions).
    """
    from scipy.integrate import trapezoid

    count = result.case.tube.count
    nu = model.args[4]
    rates = np.empty(len(result.case.reactions))
    q = np.empty((len(result.z), len(rates)))
    for k in range(len(result.z)):
        K.reaction_rates(result.T[k], result.P[k], result.F[k] / count, *_rate_args(model), rates)
        q[k] = -(_enthalpies(model, result.T[k]) @ nu) * rates * model.area * count
    return trapezoid(q, result.z, axis=0)


def applicability(case, result, model):
    """Whether runaway screening applies to the tube, decided from the whole design run.

    Parameters
    ----------
    case : simulator.case.schema.Case
    result : simulator.results.Result
        The design run of ``case``.
    model : simulator.model.build.Model
        The model of ``case``.

    Returns
    -------
    dict
        ``applicable`` (bool), ``reason`` (one line; empty when it applies), ``dominant`` (index
        of the reaction that releases the most heat along the tube), ``net_heat_release_W``,
        ``heat_release_by_reaction_W`` (reaction equation -> W), ``wall_duty_W`` (heat into the
        gas through the walls, negative when removed), ``largest_rise_above_medium_K``
        (max of T - T_medium along the tube; negative when the medium is hotter everywhere).
    """
    q_net = net_heat_release(result, model)
    by_reaction = heat_release_by_reaction(result, model)
    j = int(np.argmax(by_reaction))
    duty = float(result.Q[-1])
    above = float(np.max(result.T - result.Tc))
    rise = result.adiabatic_temperature_rise
    reasons = []
    if not q_net > 0.0:
        reasons.append(f"{NO_EXOTHERMIC_PATH} along the tube: the reactions take up heat in net (net heat release "
                       f"{q_net / 1e3:+.4g} kW)")
    elif not (math.isfinite(rise) and rise > 0.0):
        what = (f"adiabatic rise {rise:+.4g} K" if math.isfinite(rise)
                else "complete conversion cannot even happen adiabatically")
        reasons.append(f"{NO_EXOTHERMIC_PATH} for the key species {case.design.key_species} ({what})")
    if reasons and duty > 0.0 and above <= 0.0:
        reasons.append(f"the medium is hotter than the gas all along the tube and supplies {duty / 1e3:.4g} kW")
    E = case.reactions[j].activation_energy
    gamma = E / (R * case.heat.medium_temperature)
    if not reasons and not E > 0.0:
        reasons.append(f"the reaction that releases the most heat ({case.reactions[j].equation}) has an activation "
                       f"energy of {E / 1e3:.4g} kJ/mol (gamma = E/(R Tc) = {gamma:.3g}): "
                       "its rate does not rise with temperature, so there is no thermal feedback to run away")
    elif not reasons and not gamma > 4.0:
        reasons.append(f"the reaction that releases the most heat ({case.reactions[j].equation}) has gamma = "
                       f"E/(R Tc) = {gamma:.3g} <= 4: its rate rises too slowly with temperature for a thermal "
                       "runaway (the Semenov and maxima-curve criteria have no critical point there)")
    return {"applicable": not reasons,
            "reason": ("; ".join(reasons) + ": " + NOT_APPLICABLE) if reasons else "",
            "dominant": j, "net_heat_release_W": q_net,
            "heat_release_by_reaction_W": {r.equation: float(q) for r, q in zip(case.reactions, by_reaction)},
            "wall_duty_W": duty, "largest_rise_above_medium_K": above}


def dimensionless_groups(model, j, rates, dH):
    """gamma, B, St, Da, N, psi of reaction j for one tube (definitions in runaway.md section 0).

    N, psi and N/B are None where they are not defined: N needs a forward rate at the feed and
    the medium temperature (Da > 0; not so for a feed beyond equilibrium), N/B a positive B.
    """
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
    dT_ad = -dH[j] * F0[key] / nu_key / cp_flow if nu_key > 0 else math.nan
    B = gamma * dT_ad / Tc
    L, D = case.tube.length, case.tube.inner_diameter
    St = model.args[1][K.F_U] * math.pi * D * L / cp_flow    # the typed U, or U(z) at the feed
    Da = rates[j] * nu_key * model.area * L / F0[key]
    N = St / Da if Da > 0 else None
    psi = B / N if N is not None and N > 0 and math.isfinite(B) else None
    notes = []
    if not nu_key > 0:
        notes.append(f"the key species {case.design.key_species} is not consumed by {case.reactions[j].equation}, "
                     "so dT_ad, B, Da, N and psi of that reaction are not defined")
    elif N is None:
        notes.append(f"Da = {Da:.3g} <= 0: the reaction does not run forward at the feed and the medium temperature "
                     "(feed at or beyond equilibrium), so N and psi are not defined")
    return {"reaction": case.reactions[j].equation, "gamma": gamma, "adiabatic_rise_K": float(dT_ad), "B": float(B),
            "St": St, "Da": float(Da), "N": None if N is None else float(N), "psi": None if psi is None else float(psi),
            "N_over_B": float(N / B) if N is not None and B > 0 else None, "note": "; ".join(notes),
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
        A case with ``heat.mode = "exchange"`` (a medium on the other side of the wall).
    n_coarse : int
        Points of each coarse sensitivity scan, [-]

    Returns
    -------
    dict
        With ``applicable``: False (and the ``reason``, nothing screened) where runaway screening
        does not apply to the tube (see :func:`applicability`).

    A tube that exchanges no heat with a medium (``heat.mode`` not ``"exchange"``) is not screened
    either: ``applicable`` False with the reason (the cooled-tube criteria need a medium).
    """
    base_result = simulate(case)
    if base_result.status == "failed":
        raise SimulatorError(f"the base case failed: {base_result.termination}")
    if not case.heat.exchange:
        # a valid case that the cooled-tube criteria cannot judge: say so and screen nothing
        return _not_applicable(case, base_result, {
            "applicable": False, "dominant": None, "net_heat_release_W": None, "heat_release_by_reaction_W": {},
            "wall_duty_W": float(base_result.Q[-1]), "largest_rise_above_medium_K": None,
            "reason": f'heat.mode = "{case.heat.mode}": runaway screening needs a tube cooled through its wall '
                      '(heat.mode = "exchange" with a [heat.medium]); nothing was screened'})
    if case.heat.arrangement == "wall-profile":
        # a given wall temperature or flux is not a coolant whose removal competes with the reaction
        return _not_applicable(case, base_result, {
            "applicable": False, "dominant": None, "net_heat_release_W": None, "heat_release_by_reaction_W": {},
            "wall_duty_W": float(base_result.Q[-1]), "largest_rise_above_medium_K": None,
            "reason": 'heat.medium.arrangement = "wall-profile": the tube is heated or cooled by a given wall '
                      "temperature or heat-flux profile, not by a medium at one temperature, which the runaway "
                      "criteria assume; nothing was screened"})
    applies = applicability(case, base_result, build_model(case))
    if not applies["applicable"]:
        return _not_applicable(case, base_result, applies)
    rise = base_result.adiabatic_temperature_rise
    limit = case.feed.temperature + 3.0 * rise + 500.0
    v = _Variants(case, limit)
    model = build_model(v.case, species=v.species)
    j = applies["dominant"]
    rates, dH = dominant_reaction(model)
    groups = dimensionless_groups(model, j, rates, dH)
    screened = v.solve("feed_mole_fraction", v.base["feed_mole_fraction"])
    Tc = case.heat.medium_temperature
    E = case.reactions[j].activation_energy
    scale = R * Tc ** 2 / E
    T_star = screened.hot_spot["temperature_K"]
    hot = dict(screened.hot_spot)
    hot["rise_above_medium_K"] = T_star - Tc

    # criteria on the operating point
    crit = {}
    crit["semenov"] = C.semenov_1928_verdict(groups["psi"], groups["gamma"]) if groups["psi"] is not None \
        else {"verdict": "undecided", "critical": None, "value": None, "source": "semenov1928",
              "note": groups["note"] or "no cooling (St = 0)"}
    barkelew_applies = groups["N"] is not None and groups["B"] > 0      # False for a NaN B too
    crit["barkelew"] = C.barkelew_1959_verdict(groups["N"], groups["B"]) if barkelew_applies else \
        {"verdict": "undecided", "critical": None, "value": None, "source": "barkelew1959",
         "note": groups["note"] or "B is not positive at the feed"}
    if barkelew_applies:
        f = C.barkelew_1959_critical_scale(groups["N"], groups["B"])
        crit["barkelew"]["critical_feed_mole_fraction"] = None if f is None else f * v.base["feed_mole_fraction"]
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
    excess, without_reaction = _excess_sensitivity(v, sensitivity, T_star)

    _attach_levels(crit, critical, v.base["feed_mole_fraction"], scale)
    hot.update(hot_spot_verdict(T_star, Tc, E))
    sensitivity_levels = {k: sensitivity_level(k, x) for k, x in excess.items()}
    risk, rule = _risk(crit, critical, excess, sensitivity_levels, scale, case.design.key_species)
    return _finished({
        "title": case.title,
        "key_species": case.design.key_species,
        "applicable": True,
        "reason": "",
        "applicability": {k: v_ for k, v_ in applies.items() if k not in ("applicable", "reason", "dominant")},
        "adiabatic_temperature_rise_K": rise,
        "hot_spot": hot,
        "medium_temperature_K": Tc,
        "medium_basis": medium_basis(case, base_result, scale),
        "coefficient_basis": coefficient_basis(case, base_result, v.base["overall_coefficient"]),
        "temperature_scale_K": scale,
        "groups": groups,
        "criteria": crit,
        "critical": critical,
        "sensitivity": sensitivity,
        "sensitivity_without_reaction": without_reaction,
        "sensitivity_excess": excess,
        "sensitivity_levels": sensitivity_levels,
        "risk": risk,
        "risk_level": risk_level(risk),
        "risk_rule": rule,
        "cautions": list(CAUTIONS),
        "solves": v.solves + v.batched + 1,
        "solves_batched": v.batched,
        "numerics": {"rtol": SOLVER["rtol"], "atol_scale": SOLVER["atol_scale"], "relative_step": REL_STEP,
                     "internal_temperature_limit_K": limit, "coarse_points": n_coarse,
                     "undecided": {k: scans[k].reason for k in scans if scans[k].reason}},
        "references": ["semenov1928", "barkelew1959", "van_welsenaere_froment1970", "thomas_bowes1961",
                       "adler_enig1964", "morbidelli_varma1988"],
        "_log": v.log,
    })


def coefficient_basis(case, result, U0):
    """Note on the U the criteria take when U follows the flow ([heat.coefficient]); "" for a typed U.

    ``U0`` is that U, at the feed state, [W/(m^2*K)].
    """
    if case.heat.coefficient is None:
        return ""
    s = result.summary().get("wall", {}).get("overall_coefficient_W_per_m2K") or {}
    span = (f"; along the tube it runs from {s['min']:.4g} to {s['max']:.4g} W/(m^2*K)"
            if s.get("min") is not None else "")
    return (f"U comes from correlations ([heat.coefficient]); the criteria take its value at the feed, "
            f"{U0:.4g} W/(m^2*K){span}; the full-model boundaries use U(z)")


def medium_basis(case, result, scale):
    """What medium temperature the criteria take, and how far a flowing medium departs from it.

    The published criteria (Semenov, Barkelew, Van Welsenaere-Froment, Adler-Enig) are derived for a
    medium at one temperature; the screen evaluates them at the medium's given (inlet) temperature
    ``heat.medium.temperature`` (for a counter-current medium that is its temperature at z = L) and
    the Morbidelli-Varma boundaries vary that same temperature through the full model. A flowing
    medium whose temperature changes along the tube by more than a quarter of R Tc^2/E makes the
    constant-medium criteria approximate: the note says so (the full-model boundaries stay exact).

    Returns
    -------
    dict
        ``arrangement``, ``criteria_medium_temperature_K`` [K], ``medium_range_K`` ([min, max] along
        the tube, [K]), ``medium_change_K`` [K], ``note`` (plain words; "" for a uniform medium).
    """
    Tc = np.asarray(result.Tc, dtype=float)
    Tc = Tc[np.isfinite(Tc)]
    lo, hi = (float(Tc.min()), float(Tc.max())) if Tc.size else (math.nan, math.nan)
    change = hi - lo
    note = ""
    if case.heat.arrangement != "uniform" and Tc.size:
        note = (f"the criteria assume a medium at one temperature; they take {case.heat.medium_temperature:.5g} K, "
                f"where the {case.heat.arrangement} medium enters; along the tube it runs from {lo:.5g} to "
                f"{hi:.5g} K")
        note += (" (less than a quarter of R Tc^2/E, so the constant-medium criteria apply)"
                 if change <= 0.25 * scale else
                 f" ({change:.3g} K, more than a quarter of R Tc^2/E = {scale:.3g} K): the constant-medium "
                 "criteria are approximate here; the Morbidelli-Varma boundaries are from the full model")
    return {"arrangement": case.heat.arrangement, "criteria_medium_temperature_K": case.heat.medium_temperature,
            "medium_range_K": [lo, hi], "medium_change_K": change, "note": note}


def _finished(report):
    """The report with null for every number that could not be computed (the private log keeps its NaN gaps)."""
    out = null_where_not_finite({k: v for k, v in report.items() if not k.startswith("_")})
    out.update({k: v for k, v in report.items() if k.startswith("_")})
    return out


def _not_applicable(case, result, applies):
    """The screening.json of a tube that is not screened: the reason, nothing screened.

    Where screening does not apply (nothing can run away) the risk is "not applicable"
    (acceptable). A tube without a cooling medium is "not screened": its risk level is review
    when the reaction path is exothermic (the temperature control must be judged otherwise), else
    acceptable; its hot spot is not judged here (level null).
    """
    hot = dict(result.hot_spot)
    hot["rise_above_medium_K"] = applies["largest_rise_above_medium_K"]
    hot["margin_to_maxima_curve_K"] = None
    if case.heat.exchange and case.heat.arrangement != "wall-profile":
        risk, level = "not applicable", risk_level("not applicable")
        hot.update({"level": ACCEPTABLE, "reason": "no runaway hot spot: " + applies["reason"]})
    else:
        rise = result.adiabatic_temperature_rise
        exothermic = math.isfinite(rise) and rise > 0.0
        risk, level = "not screened", REVIEW if exothermic else ACCEPTABLE
        hot.update({"level": None, "reason": "not judged by the screening: " + applies["reason"]})
        applies = dict(applies, net_heat_release_W=net_heat_release(result, build_model(case)))
    return _finished({
        "title": case.title,
        "key_species": case.design.key_species,
        "applicable": False,
        "reason": applies["reason"],
        "applicability": {k: v for k, v in applies.items() if k not in ("applicable", "reason", "dominant")},
        "adiabatic_temperature_rise_K": result.adiabatic_temperature_rise,
        "hot_spot": hot,
        "medium_temperature_K": case.heat.medium_temperature if case.heat.exchange else None,
        "risk": risk,
        "risk_level": level,
        "risk_rule": applies["reason"],
        "cautions": list(CAUTIONS),
        "solves": 1,
        "references": [],
        "_log": [],
    })


#: Readable names of the screening parameters, for rule texts and notes.
PARAMETER_WORDS = {"feed_mole_fraction": "feed mole fraction", "inlet_temperature": "inlet temperature",
                   "medium_temperature": "medium temperature", "overall_coefficient": "wall coefficient U",
                   "mass_flow": "feed flow", "feed_mole_fraction_K": "feed mole fraction",
                   "inlet_temperature_K": "inlet temperature", "medium_temperature_K": "medium temperature"}
CRITERION_WORDS = {"semenov": "Semenov", "barkelew": "Barkelew", "van_welsenaere_froment":
                   "Van Welsenaere-Froment maxima curve", "inflection": "Van Welsenaere-Froment inflection",
                   "adler_enig": "Adler-Enig", "morbidelli_varma": "Morbidelli-Varma"}


def sensitivity_level(name, excess):
    """Level of a normalized sensitivity at the operating point (the rule of the risk and the tables).

    ``excess`` is s minus the sensitivity of a hot spot that follows the parameter one to one
    (phi/T* for the inlet and medium temperatures, 0 otherwise). ``review`` if it exceeds 1 (for
    the inlet and medium temperatures) or |s| > 1 (feed fraction, U, mass flow): the hot spot
    moves by more than the parameter in relative terms (common practice, no source); None when s
    was not computed.

    >>> sensitivity_level("medium_temperature", 1.78), sensitivity_level("mass_flow", -0.2)
    ('review', 'acceptable')
    """
    if excess is None:
        return None
    big = excess > 1.0 if name in TEMPERATURE_PARAMETERS else abs(excess) > 1.0
    return REVIEW if big else ACCEPTABLE


def _feed_fraction_margin(entry, operating, key="critical_feed_mole_fraction"):
    """(level, text) of a criterion's critical feed fraction against the operating one (None if not found)."""
    critical = entry.get(key)
    if critical is None:
        return None, ""
    margin = critical - operating
    level = margin_level(margin, review_margin("feed_fraction", operating))
    return level, (f"critical feed fraction {critical:.5g} is {100.0 * margin / operating:+.1f} % from the "
                   f"operating {operating:.5g} (review below {100.0 * review_margin('feed_fraction', 1.0):.0f} %)")


def _attach_levels(criteria, critical, operating_fraction, scale):
    """Write the level of every verdict beside it, by the rules of :mod:`simulator.verdicts`.

    A criterion's level is the worst of its own verdict's level and the level of its margins (the
    hot spot below T_m for the maxima curve; its critical feed fraction against the operating one);
    a Morbidelli-Varma critical value's level is its margin's (or its verdict's when no boundary
    was located). The margin sentence is added to the note, so the level can be read.
    """
    for name, entry in criteria.items():
        levels = [criterion_level(entry["verdict"])]
        if entry["verdict"] == "safe":
            texts = []
            if name == "van_welsenaere_froment" and entry.get("critical") is not None:
                margin = entry["critical"] - entry["value"]
                review = review_margin("hot_spot", temperature_scale=scale)
                levels.append(margin_level(margin, review))
                texts.append(f"hot spot {margin:.1f} K below T_m (review below {review:.1f} K, a quarter of "
                             f"R Tc^2/E)")
            level, text = _feed_fraction_margin(entry, operating_fraction)
            if level is not None:
                levels.append(level)
                texts.append(text)
            if texts:
                entry["note"] = "; ".join([entry["note"]] + texts) if entry.get("note") else "; ".join(texts)
        entry["level"] = worst([lv for lv in levels if lv is not None])
        inner = entry.get("inflection")
        if isinstance(inner, dict):
            inner_levels = [criterion_level(inner["verdict"])]
            level, text = _feed_fraction_margin(inner, operating_fraction) if inner["verdict"] == "safe" \
                else (None, "")
            if level is not None:
                inner_levels.append(level)
                inner["note"] = "; ".join(x for x in (inner.get("note", ""), text) if x)
            inner["level"] = worst(inner_levels)
    for key, entry in critical.items():
        if entry["found"] and entry["margin"] is not None:
            kind = "temperature" if key.endswith("_K") else "feed_fraction"
            review = review_margin(kind, entry["operating_value"], scale)
            entry["review_margin"] = review
            entry["level"] = margin_level(entry["margin"], review)
        else:
            entry["review_margin"] = None
            entry["level"] = criterion_level(entry["verdict"])


def hot_spot_verdict(hot_spot_temperature, medium_temperature, activation_energy):
    """Level and one-line reason of a cooled tube's hot spot: its margin below the maxima curve.

    One rule for ``screening.json`` and the report's hot-spot flag: the margin T_m - T* to the
    Van Welsenaere-Froment maxima-curve temperature, judged by
    :func:`simulator.verdicts.margin_level` with a review margin of a quarter of R Tc^2/E.

    Parameters
    ----------
    hot_spot_temperature : float
        Hot-spot temperature T*, [K]
    medium_temperature : float
        Medium (wall) temperature Tc, [K]
    activation_energy : float
        Activation energy of the reaction that drives the heat release, [J/mol]

    Returns
    -------
    dict
        ``level``, ``reason`` (one line) and ``margin_to_maxima_curve_K`` (None without a maxima curve).
    """
    T_star, Tc, E = hot_spot_temperature, medium_temperature, activation_energy
    if not E > 4.0 * R * Tc:
        return {"level": REVIEW, "margin_to_maxima_curve_K": None,
                "reason": f"{T_star - Tc:+.1f} K from the medium; no maxima-curve temperature to judge it against "
                          f"(E/(R Tc) = {E / (R * Tc):.3g} <= 4)"}
    T_m = C.van_welsenaere_froment_1970_maxima_temperature(Tc, E)
    scale = R * Tc ** 2 / E
    margin = T_m - T_star
    review = review_margin("hot_spot", temperature_scale=scale)
    where = "above" if margin <= 0 else "below"
    return {"level": margin_level(margin, review), "margin_to_maxima_curve_K": margin,
            "reason": f"{T_star - Tc:+.1f} K from the medium, {abs(margin):.1f} K {where} the maxima-curve "
                      f"temperature T_m = {T_m:.1f} K (Van Welsenaere-Froment; review within {review:.1f} K, a "
                      f"quarter of R Tc^2/E = {scale:.1f} K)"}


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
        undecided = {"verdict": "undecided", "critical": 0.0, "value": None,
                     "note": "the highest temperature is at or next to the inlet: no rising branch of the profile "
                             "to test"}
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
    (excess per parameter, baseline s_0 per temperature parameter).
    """
    excess, baseline = {}, {}
    for name in SENSITIVITY_PARAMETERS:
        s = sensitivity[name]
        base_s = v.base[name] / T_star if name in TEMPERATURE_PARAMETERS else 0.0
        if name in TEMPERATURE_PARAMETERS:
            baseline[name] = base_s
        excess[name] = None if s is None else s - base_s
    return excess, baseline


def _risk(criteria, critical, excess, sensitivity_levels, scale, key):
    """Risk class and the rule that set it: the worst level of the criteria, margins and sensitivities."""
    found = {ACCEPTABLE: [], REVIEW: [], UNACCEPTABLE: []}
    for name, entry in criteria.items():
        if name == "semenov" and entry["verdict"] == "undecided":
            continue        # a sufficient bound only: undecided means "apply a criterion with consumption"
        if name == "morbidelli_varma":
            continue        # stated with its critical feed fraction below
        found[entry["level"]].append(f"{CRITERION_WORDS[name]}: {entry['verdict']}"
                                     + (f" ({entry['note']})" if entry.get("note") else ""))
        inner = entry.get("inflection")
        if isinstance(inner, dict):
            found[inner["level"]].append(f"{CRITERION_WORDS['inflection']}: {inner['verdict']}"
                                         + (f" ({inner['note']})" if inner.get("note") else ""))
    for name, entry in critical.items():
        words = PARAMETER_WORDS[name]
        if entry["found"]:
            unit = " K" if name.endswith("_K") else ""
            found[entry["level"]].append(
                f"critical {words} {entry['value']:.5g}{unit} by Morbidelli-Varma, margin {entry['margin']:+.4g}{unit}"
                + (f" (review below {entry['review_margin']:.3g}{unit})" if entry["review_margin"] else ""))
        elif entry["level"] != ACCEPTABLE:
            found[entry["level"]].append(f"Morbidelli-Varma boundary along the {words} not decided ({entry['note']})")
    for name, level in sensitivity_levels.items():
        if level == REVIEW:
            x = excess[name]
            found[REVIEW].append(f"s - phi/T* = {x:.3g} > 1 for the {PARAMETER_WORDS[name]}"
                                 if name in TEMPERATURE_PARAMETERS
                                 else f"|s| = {abs(x):.3g} > 1 for the {PARAMETER_WORDS[name]}")
    level = UNACCEPTABLE if found[UNACCEPTABLE] else REVIEW if found[REVIEW] else ACCEPTABLE
    risk = {UNACCEPTABLE: "runaway", REVIEW: "sensitive", ACCEPTABLE: "adequate margin"}[level]
    if level != ACCEPTABLE:
        return risk, "; ".join(found[level])
    semenov = criteria.get("semenov", {}).get("verdict")
    aside = " (the Semenov bound, only sufficient, is exceeded)" if semenov == "undecided" else ""
    return risk, (f"every criterion safe{aside}, every margin outside its review margin (feed fractions 10 %, "
                  f"temperatures R Tc^2/E = {scale:.1f} K, hot spot below T_m a quarter of that) and no "
                  f"sensitivity above 1 (thresholds: common practice, no source)")


def screening_json(report):
    """The report without its private evaluation log (what ``screening.json`` holds)."""
    return {k: v for k, v in report.items() if not k.startswith("_")}


def format_screening(report):
    """Terminal summary of a screen."""
    h = report["hot_spot"]

    def f(value, spec=".4g"):
        return "not computed" if value is None else format(value, spec)

    if not report["applicable"]:
        a = report["applicability"]
        reason = report["reason"] if NOT_APPLICABLE in report["reason"] else \
            f"not screened: {report['reason']}"
        return "\n".join([
            report["title"],
            f"  {reason}.",
            f"  net heat release of the reactions {a['net_heat_release_W'] / 1e3:+.4g} kW, heat through the walls "
            f"{a['wall_duty_W'] / 1e3:+.4g} kW (into the gas when positive); highest temperature "
            f"{h['temperature_K']:.2f} K at z = {h['position_m']:.4g} m.",
            "  Nothing was screened. Screening only: see the cautions in screening.json; defer to licensed "
            "engineers and local codes."])
    g = report["groups"]
    lines = [report["title"],
             f"  risk: {report['risk']} (level {report['risk_level']}; {report['risk_rule']})",
             f"  hot spot {h['temperature_K']:.2f} K at z = {h['position_m']:.4g} m, "
             f"{h['rise_above_medium_K']:+.2f} K above the medium ({h['level']}: {h['reason']}); adiabatic rise "
             f"{report['adiabatic_temperature_rise_K']:.1f} K",
             f"  groups ({g['reaction']}): gamma {g['gamma']:.3g}, B {g['B']:.3g}, St {g['St']:.3g}, "
             f"Da {g['Da']:.3g}, N {f(g['N'], '.3g')}, psi {f(g['psi'], '.3g')}"]
    if report.get("medium_basis", {}).get("note"):
        lines.append(f"  medium: {report['medium_basis']['note']}")
    if report.get("coefficient_basis"):
        lines.append(f"  wall coefficient: {report['coefficient_basis']}")
    lines.append("  criteria:")
    for name, c in report["criteria"].items():
        extra = ""
        if c.get("critical_feed_mole_fraction") is not None:
            extra = f", critical feed fraction {c['critical_feed_mole_fraction']:.5g}"
        lines.append(f"    {CRITERION_WORDS[name]:38s}{c['verdict']:>10s} ({c['level']})  critical "
                     f"{f(c['critical'])}{extra}")
    lines.append("  critical values (Morbidelli-Varma):")
    for name, c in report["critical"].items():
        words = PARAMETER_WORDS[name]
        if c["found"]:
            lines.append(f"    {words:24s}{c['value']:.6g} (operating {c['operating_value']:.6g}, "
                         f"margin {c['margin']:+.4g}; {c['level']})")
        else:
            lines.append(f"    {words:24s}not found in {c['search_range'][0]:.4g}-{c['search_range'][1]:.4g}"
                         f" ({c['note']}; {c['level']})")
    lines.append("  normalized sensitivity s = (phi/T*) dT*/dphi: " + ", ".join(
        f"{PARAMETER_WORDS[k]} {f(v, '+.3g')}" for k, v in report["sensitivity"].items()))
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
