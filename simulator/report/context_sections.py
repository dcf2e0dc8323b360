"""Detailed sections of the report context: profiles, assumptions, screening, numerics.

Each function returns one section dict of the schema in
:mod:`simulator.report.html`: the profile plots with their captions, the
ideal-design-against-full-model comparison and the assumption verdicts, the runaway
screening (dimensionless groups, criteria, critical values and margins,
sensitivities and their plots) and the numerics (run status, events,
conservation closure, solver statistics). Verdict levels follow the rules of
:mod:`simulator.report.context_verdicts`.
"""
import numpy as np

from simulator.report.context_format import _DASH, _change, _finite, _pct, fixed, fmt
from simulator.verdicts import criterion_level
from simulator.report.context_verdicts import (
    _ASSUMPTION_LABELS,
    CLOSURE_OK,
    _assumption_flag,
    _basis_text,
    _design_quantity,
    _exothermic,
    _runaway_flag,
    _screening_reason,
)

_PARAMETER_LABELS = {"feed_mole_fraction": "feed mole fraction of {key}",
                     "medium_temperature": "medium temperature", "inlet_temperature": "inlet temperature",
                     "overall_coefficient": "wall heat-transfer coefficient U", "mass_flow": "feed mass flow"}


# ----------------------------------------------------------------------------- profiles
#: A profile that changes by less than this along the tube is a flat line: its plot is left out, [K] and [-]
FLAT_TEMPERATURE = 0.01
FLAT_PRESSURE_RELATIVE = 1e-9
#: Below this share of the inlet pressure the drop itself is plotted, not the absolute pressure, [-]
SMALL_PRESSURE_DROP = 0.02
#: A species whose mole fraction stays below this share of the largest one is drawn on the log panel, [-]
MINOR_SPECIES = 0.1
_PRESSURE_MODEL_NAMES = {"ergun": "Ergun (packed bed)", "pipe-friction": "pipe-friction (Darcy-Weisbach)"}


def _temperature_profile(case, result, exothermic):
    """(plot or None, note when left out) of the temperature profile."""
    from simulator.report import plots

    z, T = result.z, np.asarray(result.T, dtype=float)
    cooled = case.heat.exchange and case.heat.profile_quantity != "heat_flux"   # a given flux: no medium
    if not cooled and float(np.ptp(T)) < FLAT_TEMPERATURE:
        how = ("the tube is isothermal (heat.mode = \"isothermal\")" if case.heat.mode == "isothermal"
               else "the temperature does not change along the tube")
        return None, f"No temperature plot: {how}; the gas stays at {fixed(float(T[0]))} K from inlet to outlet."
    hot = result.hot_spot
    target = result.design.get("length_m") if result.design.get("reached") else None
    limit = case.design.temperature_limit if _finite(case.design.temperature_limit) else None
    medium = "Medium temperature"
    name = "Hot spot" if exothermic else "Highest temperature"
    uri = plots.profile_temperature_plot(
        z, T, medium_T=result.Tc if cooled else None,
        hot_spot=(hot["position_m"], hot["temperature_K"]), temperature_limit=limit,
        target_position=target, medium_label=medium, hot_spot_label=name)
    parts = [f"Process (bed) temperature along the tube; star: {name.lower()} {fixed(hot['temperature_K'])} K "
             f"at z = {fmt(hot['position_m'], 3)} m ({hot['located_by']})."]
    if cooled:
        parts.append(f"{medium}: the medium on the other side of the wall ({case.heat.arrangement}).")
    if limit is None:
        parts.append("No temperature limit is given (design.temperature_limit).")
    else:
        shown = [T] + ([np.asarray(result.Tc, dtype=float)] if cooled else [])
        if plots.limit_is_far(limit, np.concatenate(shown)):
            gap = limit - float(hot["temperature_K"])
            parts.append(f"The temperature limit {fixed(limit)} K lies off the scale, {fixed(abs(gap))} K "
                         f"{'above' if gap > 0 else 'below'} the {name.lower()} (arrow at the edge); the axis "
                         f"is scaled to the profiles.")
        else:
            parts.append(f"Dashed horizontal line: temperature limit {fixed(limit)} K.")
    if target is not None:
        parts.append(f"Dotted vertical line: target conversion reached at z = {fmt(target, 4)} m.")
    return {"title": "Temperature", "uri": uri, "caption": " ".join(parts)}, None


def _pressure_profile(case, result):
    """(plot or None, note when left out) of the pressure profile."""
    from simulator.report import plots

    P = np.asarray(result.P, dtype=float)
    pd = case.pressure_drop.model
    if float(np.ptp(P)) <= FLAT_PRESSURE_RELATIVE * float(P[0]):
        why = ("no pressure-drop model (pressure_drop.model = \"none\")" if pd == "none"
               else "the pressure does not change along the tube")
        return None, f"No pressure plot: {why}; the pressure stays at {fmt(float(P[0]) / 1e5, 5)} bar."
    model = _PRESSURE_MODEL_NAMES.get(pd, pd)
    drop = f"drop {fmt((P[0] - P[-1]) / 1e3, 4)} kPa with the {model} model"
    if float(P[0] - P.min()) < SMALL_PRESSURE_DROP * float(P[0]):
        # a drop of a fraction of a per cent: absolute pressure would read as a flat line at 100 bar
        return {"title": "Pressure drop",
                "uri": plots.profile_lines_plot(result.z, {"Drop below the inlet pressure": (P[0] - P) / 1e3},
                                                "Pressure drop from the inlet [kPa]"),
                "caption": f"Pressure below the inlet pressure of {fmt(float(P[0]) / 1e5, 5)} bar; {drop} "
                           f"({fixed(100.0 * (P[0] - P[-1]) / P[0], 2)} % of the inlet pressure)."}, None
    return {"title": "Pressure",
            "uri": plots.profile_lines_plot(result.z, {"Absolute pressure": P / 1e5}, "Pressure [bar]"),
            "caption": f"Absolute pressure (1 bar = 100 kPa); {drop}."}, None


def _mole_fraction_profile(result):
    """Plot of the mole fractions, minor species on their own log panel."""
    from simulator.report import plots

    x = result.mole_fractions
    fractions = {name: x[:, i] for i, name in enumerate(result.species)}
    major, minor, absent = plots.split_minor_species(fractions, MINOR_SPECIES)
    parts = ["Gas-phase mole fractions"]
    if major and minor:
        parts[0] += (f"; upper panel (linear axis): {', '.join(major)}; lower panel (logarithmic axis): the minor "
                     f"species {', '.join(minor)}, whose mole fraction stays below {fmt(100 * MINOR_SPECIES, 2)} % of the "
                     f"largest mole fraction")
    parts[0] += "."
    if absent:
        parts.append(f"Not drawn: {', '.join(absent)} (zero along the whole tube).")
    return {"title": "Mole fractions",
            "uri": plots.mole_fraction_plot(result.z, fractions, minor_share=MINOR_SPECIES),
            "caption": " ".join(parts)}


def _profiles(case, result):
    from simulator.report import plots

    key = case.design.key_species
    plots_out, notes = [], []
    temperature, note = _temperature_profile(case, result, _exothermic(result))
    plots_out += [temperature] if temperature else []
    notes += [note] if note else []
    X = result.conversion
    plots_out.append({"title": f"Conversion of {key}",
                      "uri": plots.profile_lines_plot(result.z, {f"Conversion of {key}": X}, "Conversion [-]"),
                      "caption": f"Conversion of the key species {key}; outlet {fixed(X[-1], 4)}"
                                 + (f", target {fmt(result.design['target_conversion'], 4)}."
                                    if result.design.get("target_conversion") is not None else ".")})
    pressure, note = _pressure_profile(case, result)
    plots_out += [pressure] if pressure else []
    notes += [note] if note else []
    plots_out.append(_mole_fraction_profile(result))
    return {"plots": plots_out, "notes": notes}


# ----------------------------------------------------------------------------- assumptions
def _assumptions_block(case, assumptions):
    if assumptions is None:
        return {"available": False, "reason_if_not": "the assumption check was not run for this report.",
                "paragraphs": [], "flags": [], "tables": [], "plots": []}
    quantity, unit = _design_quantity(assumptions)
    key = assumptions["design_quantity"]
    t, f = assumptions["ideal"], assumptions["full"]
    change = assumptions.get("design_change_percent")
    paragraphs = [
        "Ideal design: the same kinetics and mole change, but isothermal at the feed temperature, "
        "without pressure drop and with an ideal gas. Full model: the coupled mole, energy and pressure "
        "balances of the case. Attribution: each assumption is applied alone to the full model and the "
        f"change of the {quantity} needed for the target conversion is reported (variant against full model).",
    ]
    if _finite(change):
        paragraphs.append(f"Overall: the ideal design needs {fmt(t[key], 4)} {unit} of {quantity}, the full "
                          f"model {fmt(f[key], 4)} {unit}: the ideal design is {fixed(change, 1, sign=True)} % off.")
    else:
        why = ("no target conversion is given (design.target_conversion)"
               if assumptions.get("target_conversion") is None else assumptions.get("design_change_basis"))
        paragraphs.append(f"Overall: no design change can be computed: {why}. Outlet conversions: ideal "
                          f"{fixed(t['outlet_conversion'], 4)}, full {fixed(f['outlet_conversion'], 4)}.")
    entries = assumptions.get("assumptions", {})
    changes = [e.get("design_change_percent") for e in entries.values()]
    if _finite(change) and changes and all(_finite(c) for c in changes):
        paragraphs.append(f"The single-assumption changes add up to {fixed(sum(changes), 1, sign=True)} % against "
                          f"{fixed(change, 1, sign=True)} % for all together; the difference is their interaction.")
    comparison = {
        "caption": "Ideal design against full model",
        "columns": ["Quantity", "Ideal design", "Full model"],
        "rows": [["Length to the target [m]", fmt(t["length_m"], 4, "not reached"),
                  fmt(f["length_m"], 4, "not reached")],
                 [f"{quantity.capitalize()} to the target [{unit}]", fmt(t[key], 4, "not reached"),
                  fmt(f[key], 4, "not reached")],
                 ["Outlet conversion [-]", fixed(t["outlet_conversion"], 4), fixed(f["outlet_conversion"], 4)],
                 ["Run status", t["status"], f["status"]]],
    }
    if assumptions.get("target_conversion") is None:
        comparison["caption"] += " (no target conversion given: compare the outlet conversions)"
    rows = []
    for name, e in entries.items():
        flag = _assumption_flag(name, e, case, assumptions)
        unit_e = "" if e.get("unit") in ("-", None) else f" {e['unit']}"
        ch = e.get("design_change_percent")
        rows.append([f"{_ASSUMPTION_LABELS.get(name, name)}: {e.get('measure', '')}",
                     fmt(e.get("value"), 3, "not computed") + (unit_e if _finite(e.get("value")) else ""),
                     fmt(e.get("threshold"), 3) + unit_e,
                     {"level": flag["level"], "text": e.get("verdict", "")},
                     _change(ch) if _finite(ch) else _basis_text(e, assumptions),
                     e.get("threshold_source", "")])
    verdicts = {"caption": "Assumptions: measure, verdict and design change when applied alone",
                "columns": ["Assumption: measure", "Value", "Threshold", "Verdict",
                            f"Change of {quantity}", "Threshold basis"],
                "rows": rows}
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [],
            "tables": [comparison, verdicts], "plots": []}


# ----------------------------------------------------------------------------- screening
def _sensitivity_plots(case, screening):
    from simulator.report import plots

    log = screening.get("_log") or []
    crit = screening.get("critical", {})
    key = case.design.key_species
    out = []
    for name, crit_key, xlabel, title in (
            ("medium_temperature", "medium_temperature_K", "Medium temperature [K]",
             "Hot spot against medium temperature"),
            ("feed_mole_fraction", "feed_mole_fraction", f"Feed mole fraction of {key} [-]",
             "Hot spot against feed fraction")):
        points = sorted({(float(v), float(T)) for p, v, T in log if p == name})
        if len(points) < 3:
            continue
        x = np.array([p[0] for p in points])
        T = np.array([p[1] for p in points])
        entry = crit.get(crit_key, {})
        current = entry.get("operating_value")
        critical = entry.get("value") if entry.get("found") else None
        uri = plots.sensitivity_plot(x, T, current_x=current, critical_x=critical, xlabel=xlabel,
                                     ylabel="Hot-spot temperature [K]")
        failed = int(np.sum(~np.isfinite(T)))
        caption = (f"Hot-spot temperature of the screening runs ({len(points)} evaluations"
                   + (f", {failed} stopped or failed, shown as gaps" if failed else "") + "); diamond: design case "
                   f"({fmt(current, 4)}); dashed line: critical value by the Morbidelli-Varma criterion ("
                   + (fmt(critical, 5) if critical is not None else "not found in the range scanned") + ").")
        out.append({"title": title, "uri": uri, "caption": caption})
    return out


def _criteria_table(case, screening):
    c = screening.get("criteria", {})
    key = case.design.key_species
    rows, notes = [], []

    def verdict(entry):
        v = entry.get("verdict", "undecided")
        return {"level": entry.get("level") or criterion_level(v), "text": v}

    def critical_fraction(entry):
        return fmt(entry.get("critical_feed_mole_fraction"), 4, "not found")

    spec = []
    if "semenov" in c:
        e = c["semenov"]
        spec.append(("Semenov (1928), no consumption", "Semenov number ψ = B/N",
                     fmt(e.get("critical"), 4), fmt(e.get("value"), 4), _DASH, e))
    if "barkelew" in c:
        e = c["barkelew"]
        spec.append(("Barkelew (1959), envelope", "cooling-to-reaction ratio N/S", fmt(e.get("critical"), 4),
                     fmt(e.get("value"), 4), critical_fraction(e), e))
    vwf = c.get("van_welsenaere_froment")
    if vwf:
        spec.append(("Van Welsenaere-Froment (1970) I, maxima curve", "hot-spot temperature [K]",
                     fixed(vwf.get("critical")), fixed(vwf.get("value")), critical_fraction(vwf), vwf))
        infl = vwf.get("inflection")
        if infl:
            spec.append(("Van Welsenaere-Froment (1970) II / Thomas-Bowes (1961), inflection",
                         "curvature of T(z) before the hot spot [K/m²]", fmt(infl.get("critical"), 3),
                         fmt(infl.get("value"), 3), critical_fraction(infl), infl))
    if "adler_enig" in c:
        e = c["adler_enig"]
        spec.append(("Adler-Enig (1964)", "curvature of T(X) before the hot spot [K]",
                     fmt(e.get("critical"), 3), fmt(e.get("value"), 3), critical_fraction(e), e))
    if "morbidelli_varma" in c:
        e = c["morbidelli_varma"]
        spec.append(("Morbidelli-Varma (1988), generalized sensitivity", e.get("parameter", ""),
                     fmt(e.get("critical"), 4, "not found"), fmt(e.get("value"), 4),
                     fmt(e.get("critical"), 4, "not found"), e))
    for name, compares, critical, value, fraction, entry in spec:
        rows.append([name, compares, critical, value, fraction, verdict(entry)])
        if entry.get("note"):
            notes.append([name, entry["note"]])
    table = {"caption": "Runaway criteria at the operating point",
             "columns": ["Criterion", "Compares", "Critical", "Design case",
                         f"Critical feed fraction of {key}", "Verdict"],
             "rows": rows}
    note_table = {"caption": "How each verdict was reached", "columns": ["Criterion", "Note"], "rows": notes}
    return table, note_table


def _screening_block(case, result, screening, reason):
    if screening is None:
        return {"available": False, "reason_if_not": _screening_reason(case, result, reason),
                "paragraphs": [], "flags": [], "tables": [], "plots": []}
    g = screening.get("groups", {})
    hot = screening.get("hot_spot", {})
    key = case.design.key_species
    num = screening.get("numerics", {})
    paragraphs = [
        f"Risk: {screening.get('risk', 'n/a').upper()} (the rule applied is in the verdict below).",
        f"The groups belong to the reaction that releases the most heat at the feed composition and the "
        f"medium temperature ({g.get('reaction', 'n/a')}). Screening runs use rtol {fmt(num.get('rtol'), 2)} "
        f"and locate the hot spot at {fixed(hot.get('temperature_K'), 2)} K, z = {fmt(hot.get('position_m'), 4)} m "
        f"({screening.get('solves', 'n/a')} solves in all).",
        f"Definitions: {g.get('definitions', '')}.",
    ]
    if screening.get("medium_basis", {}).get("note"):
        paragraphs.append("Medium: " + screening["medium_basis"]["note"] + ".")
    if screening.get("coefficient_basis"):
        paragraphs.append("Wall coefficient: " + screening["coefficient_basis"] + ".")
    groups = {"caption": f"Dimensionless groups ({g.get('reaction', '')})", "columns": ["Group", "Value", "Meaning"],
              "rows": [["γ", fmt(g.get("gamma"), 4), "Arrhenius number E/(R·Tc)"],
                       ["ΔT_ad [K]", fixed(g.get("adiabatic_rise_K")), "adiabatic temperature rise of the "
                                                                        "dominant reaction at the feed"],
                       ["B", fmt(g.get("B"), 4), "heat-of-reaction parameter γ·ΔT_ad/Tc"],
                       ["St", fmt(g.get("St"), 4), "Stanton number U·π·D·L/(Σ F_i·cp_i)"],
                       ["Da", fmt(g.get("Da"), 4), "Damköhler number at feed composition and Tc"],
                       ["N = St/Da", fmt(g.get("N"), 4), "cooling against reaction"],
                       ["ψ = B/N", fmt(g.get("psi"), 4), "Semenov number"],
                       ["N/B", fmt(g.get("N_over_B"), 4), "compare with the critical N/B of the criteria"]]}
    criteria, notes = _criteria_table(case, screening)
    margin_rows = []
    for crit_key, entry in screening.get("critical", {}).items():
        name = crit_key.removesuffix("_K")
        label = _PARAMETER_LABELS.get(name, name).format(key=key)
        temperature = crit_key.endswith("_K")
        show = (lambda v: fixed(v, 1)) if temperature else (lambda v: fmt(v, 4))
        unit = " K" if temperature else ""
        if entry.get("found"):
            critical = show(entry["value"]) + unit
            margin = (fixed(entry["margin"], 1, sign=True) + " K") if temperature else fmt(entry["margin"], 3)
            rel = _pct(entry.get("margin_relative"))
        else:
            lo, hi = entry.get("search_range", [None, None])
            critical = f"not found in {show(lo)}-{show(hi)}{unit}"
            margin, rel = _DASH, _DASH
        margin_rows.append([label, show(entry.get("operating_value")) + unit, critical, margin, rel,
                            fmt(entry.get("s_max"), 3),
                            {"level": entry.get("level") or criterion_level(entry.get("verdict")),
                             "text": entry.get("verdict", "")}])
    margins = {"caption": "Critical values and margins (Morbidelli-Varma: maximum of the normalized sensitivity)",
               "columns": ["Parameter", "Design", "Critical", "Margin", "Relative margin", "max |s|", "Verdict"],
               "rows": margin_rows}
    sens_rows = []
    excess = screening.get("sensitivity_excess", {})
    for name, s in screening.get("sensitivity", {}).items():
        label = _PARAMETER_LABELS.get(name, name).format(key=key)
        x = excess.get(name)
        temperature = name in ("inlet_temperature", "medium_temperature")
        big = _finite(x) and (x > 1.0 if temperature else abs(x) > 1.0)
        if not _finite(s):
            reading = "not computed"
        elif temperature:
            reading = "s − φ/T* > 1: amplified, sensitive" if big else "s − φ/T* ≤ 1"
        else:
            reading = "|s| > 1: sensitive" if big else "|s| ≤ 1"
        sens_rows.append([label, fmt(s, 3), fmt(x, 3) if temperature else _DASH,
                          {"level": "review" if big else "acceptable", "text": reading}])
    sensitivity = {"caption": "Normalized sensitivity of the hot spot at the design point, s = (φ/T*)·dT*/dφ; for "
                              "the inlet and medium temperatures a hot spot that just follows them (as without "
                              "reaction) has s = φ/T*, so only the excess counts",
                   "columns": ["Parameter φ", "s", "s − φ/T*", "Reading"], "rows": sens_rows}
    flag = _runaway_flag(case, result, screening, None)
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [flag],
            "tables": [groups, criteria, notes, margins, sensitivity],
            "plots": _sensitivity_plots(case, screening)}


# ----------------------------------------------------------------------------- numerics
def _steady_states_table(result):
    """Every steady state of a counter-current run (``summary.json`` ``steady_states``), or None."""
    states = result.extra.get("steady_states")
    if not states:
        return None
    rows = [["yes" if e.get("describes_outputs") else "",
             fixed(e.get("medium_outlet_temperature_K"), 2), fixed(e.get("hot_spot_temperature_K"), 2),
             fmt(e.get("hot_spot_position_m"), 4), fixed(e.get("outlet_conversion"), 4),
             fixed(e.get("outlet_temperature_K"), 2), e.get("stability", "not determined"), e.get("status", "")]
            for e in states]
    return {"caption": "Steady states with the counter-current medium",
            "columns": ["Described", "Medium outlet (z = 0) [K]", "Hot spot [K]", "Hot spot at [m]",
                        "Outlet conversion", "Outlet T [K]", "Stability", "Status"],
            "rows": rows}


def _numerics_block(case, result, screening):
    s = result.summary()
    paragraphs = [f"Run status: {result.status}; {result.termination}."]
    for name, event in result.events.items():
        where = ", ".join(f"{k.removesuffix('_m').removesuffix('_K').removesuffix('_Pa').replace('_', ' ')} "
                          f"{fmt(v, 6)} {'m' if k.endswith('_m') else 'K' if k.endswith('_K') else 'Pa'}"
                          for k, v in event.items())
        paragraphs.append(f"Event {name.replace('_', ' ')}: {where}.")
    located = result.hot_spot.get("located_by", "not recorded")
    if case.heat.mode == "isothermal" and float(np.ptp(result.T)) < FLAT_TEMPERATURE:
        paragraphs.append("No hot spot: the gas is held at the feed temperature (isothermal tube).")
    elif _exothermic(result):
        paragraphs.append(f"Hot spot located by: {located}.")
    else:
        paragraphs.append(f"Highest temperature (no reaction hot spot: the reaction path is not exothermic) "
                          f"located by: {located}.")
    if result.extra.get("viscosity"):
        paragraphs.append(f"Gas viscosity: {result.extra['viscosity']}.")
    closure_rows = []
    for name, label in (("elements_relative", "Elements (and total mass), relative"),
                        ("energy_relative", "Energy (H_out - H_in - Q), relative")):
        value = result.closure.get(name)
        ok = _finite(value) and abs(float(value)) <= CLOSURE_OK
        closure_rows.append([label, fmt(value, 3), {"level": "acceptable" if ok else "review",
                                                    "text": f"≤ {fmt(CLOSURE_OK, 1)}" if ok
                                                    else f"> {fmt(CLOSURE_OK, 1)}"}])
    z_dev = s.get("max_compressibility_deviation")
    closure_rows.append(["Largest |Z - 1| along the tube (Peng-Robinson)", fmt(z_dev, 3, "not computed"),
                         _DASH])
    closure = {"caption": "Conservation closure and real-gas deviation", "columns": ["Check", "Value", "Verdict"],
               "rows": closure_rows}
    st = result.solver_stats
    labels = (("method", "Method"), ("rtol", "Relative tolerance"),
              ("atol_scale", "Absolute tolerance / variable scale"), ("output_points", "Output points"),
              ("steps", "Integration steps"), ("rhs_evaluations", "Right-hand-side evaluations"),
              ("jacobian_evaluations", "Jacobian evaluations"), ("integrator_calls", "Integrator calls"),
              ("wall_time_s", "Wall time of the run [s]"))
    solver = {"caption": "Solver statistics of the design run", "columns": ["Quantity", "Value"],
              "rows": [[label, st[k] if isinstance(st.get(k), str) else fmt(st.get(k), 4)]
                       for k, label in labels if k in st]}
    tables = [closure, solver]
    states = _steady_states_table(result)
    if states is not None:
        tables.insert(0, states)
        paragraphs.append(f"Counter-current medium: {len(states['rows'])} steady state(s) found by shooting on the "
                          "medium outlet temperature (a scan over the physically possible range, every sign change "
                          "refined); the profiles and results describe the one marked, the lowest branch, which a "
                          "start-up from a cold medium reaches.")
    warnings = list(result.warnings)
    if screening is not None:
        num = screening.get("numerics", {})
        tables.append({"caption": "Screening numerics", "columns": ["Quantity", "Value"],
                       "rows": [["Relative tolerance", fmt(num.get("rtol"), 2)],
                                ["Absolute tolerance / variable scale", fmt(num.get("atol_scale"), 2)],
                                ["Relative step of the sensitivities", fmt(num.get("relative_step"), 2)],
                                ["Internal temperature limit [K]", fixed(num.get("internal_temperature_limit_K"))],
                                ["Points per coarse scan", fmt(num.get("coarse_points"), 4)],
                                ["Solves", fmt(screening.get("solves"), 6)]]})
        for name, why in (num.get("undecided") or {}).items():
            warnings.append(f"screening, {name.replace('_', ' ')}: {why}")
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [], "tables": tables,
            "plots": [], "warnings": [str(w) for w in warnings]}
