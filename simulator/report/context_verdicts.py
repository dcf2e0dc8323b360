r"""Summary of the report context: key numbers and the verdict flags.

The summary lists the design numbers (conversion, size to the target, hot
spot, pressure drop, adiabatic rise, heat duty) and one flag per verdict: run,
hot spot, runaway risk, target conversion, pressure drop and each assumption.
The flag rules below are shared with the detailed sections
(:mod:`simulator.report.context_sections`).

Verdict rules (documented choices; thresholds are common practice, no source)
------------------------------------------------------------------------------
Temperature scale: :math:`\Delta T_s = R T_r^2 / E`, with :math:`T_r` the
medium temperature of a cooled tube (else the feed temperature) and :math:`E`
the largest activation energy of the case. A temperature change of
:math:`\Delta T_s` changes the rate constant e-fold; Van Welsenaere and
Froment (1970) place the onset of runaway where the hot spot exceeds the
medium by about this amount (extremum of the maxima curve).

*Hot spot* (exothermic case, i.e. positive adiabatic rise)
    ``unacceptable`` if the run stopped at ``design.temperature_limit``, the hot
    spot reached it, or the screening risk is "runaway"; ``review`` if the
    hot spot lies more than :math:`\Delta T_s` above the medium (cooled tube),
    within :math:`\Delta T_s` of the temperature limit, or an adiabatic tube
    has no temperature limit; ``acceptable`` otherwise. An endothermic or isothermal
    case has no reaction hot spot: ``acceptable`` unless the temperature limit was
    reached.
*Runaway risk*
    From ``screening["risk"]``: "adequate margin" -> ``acceptable``, "sensitive" ->
    ``review``, "runaway" -> ``unacceptable``. Not screened: ``acceptable`` when there is
    no exothermic path (nothing to run away), ``review`` when an exothermic
    case could not be screened (not a cooled tube, or not run).
*Each assumption* (isothermal, isobaric, ideal gas, constant moles)
    "holds" -> ``acceptable``, unless applying it alone changes the design quantity
    by more than :data:`DESIGN_CHANGE_REVIEW` (then ``review``: it holds
    by its own measure but still moves the design); "fails" -> ``review``
    with its design change; "unknown" -> ``review`` with the reason.
*Target conversion* (when given): reached -> ``acceptable``; not reached in the
    tube -> ``review``.
*Pressure drop* (when ``design.max_pressure_drop`` is given): within ->
    ``acceptable``; above -> ``unacceptable``.
*Run*: a run stopped before the end of the tube -> ``unacceptable``.
*Conservation closure*: relative error up to :data:`CLOSURE_OK` -> ``acceptable``,
    else ``review``.
"""
import math

from simulator.report.context_format import _change, _finite, _pct, _pretty_rule, fixed, fmt
from simulator.units import R
from simulator.verdicts import DESIGN_CHANGE_REVIEW, RISK_LEVELS, assumption_level, risk_level, worst  # noqa: F401 (re-exported)

#: Relative conservation error accepted without comment, [-] (common practice, no source).
CLOSURE_OK = 1e-6


_ASSUMPTION_LABELS = {"isothermal": "Isothermal", "isobaric": "Isobaric", "ideal_gas": "Ideal gas",
                      "constant_moles": "Constant moles", "one_dimensional": "One-dimensional tube",
                      "no_pellet_gradients": "No pellet gradients"}


def _temperature_scale(case):
    """R T_r^2 / E_max [K] (inf without an activated reaction) and T_r [K]."""
    T_ref = case.heat.medium_temperature if case.heat.exchange else case.feed.temperature
    E = max((r.activation_energy for r in case.reactions), default=0.0)
    return (R * T_ref ** 2 / E if E > 0 else math.inf), T_ref


def _exothermic(result):
    rise = result.adiabatic_temperature_rise
    return _finite(rise) and rise > 0


def _hot_spot_flag(case, result, screening, reason=None):
    hot = result.hot_spot
    T_hot, z_hot = hot["temperature_K"], hot["position_m"]
    limit = case.design.temperature_limit
    scale, T_ref = _temperature_scale(case)
    where = f"{fixed(T_hot)} K at z = {fmt(z_hot, 3)} m"
    stopped = "temperature_limit" in result.events
    if stopped or (_finite(limit) and T_hot >= limit):
        return {"level": "unacceptable", "label": "Hot spot",
                "text": f"The temperature limit {fixed(limit)} K is reached at z = {fmt(z_hot, 3)} m; the run "
                        f"stopped there and the true maximum is higher. The design as given is not acceptable."}
    if screening is not None and screening.get("risk") == "runaway":
        return {"level": "unacceptable", "label": "Hot spot",
                "text": f"Hot spot {where}, but the operating point lies on the runaway side of the screening "
                        f"boundary: small changes can move it by hundreds of kelvin."}
    near_limit = _finite(limit) and limit - T_hot < scale
    limit_text = (f"; {fixed(limit - T_hot)} K below the temperature limit {fixed(limit)} K"
                  if _finite(limit) else "")
    if case.heat.mode == "isothermal":
        return {"level": "review" if near_limit else "acceptable", "label": "Hot spot",
                "text": f"No hot spot by construction: the case is isothermal at {fixed(case.feed.temperature)} K "
                        f"(heat.mode = \"isothermal\"); the wall duty that holds it is "
                        f"{fmt(result.Q[-1] / 1e3, 4)} kW{limit_text}."}
    from simulator.screening.screen import NO_EXOTHERMIC_PATH

    if not _exothermic(result) or (_not_applicable(reason) and NO_EXOTHERMIC_PATH in reason):
        why = ("the reaction path is not exothermic" if not _exothermic(result)
               else reason.removesuffix(".").replace(", runaway screening does not apply", "")
               .replace(": runaway screening does not apply", ""))
        return {"level": "review" if near_limit else "acceptable", "label": "Hot spot",
                "text": f"No reaction hot spot ({why}); the highest temperature "
                        f"is {where} ({hot['located_by']}){limit_text}."}
    if case.heat.exchange:
        # one rule with screening.json: the margin below the maxima curve (simulator.screening.screen)
        verdict = (screening or {}).get("hot_spot") or {}
        if "level" not in verdict:
            from simulator.screening.screen import hot_spot_verdict

            E = max((r.activation_energy for r in case.reactions), default=0.0)
            verdict = hot_spot_verdict(T_hot, T_ref, E)
        level = worst([verdict["level"], "review" if near_limit else "acceptable"])
        near = (f"; within R·T²/E = {fixed(scale)} K of the temperature limit" if near_limit else "")
        see = (" How sensitive it is to the operating conditions is judged under Runaway risk."
               if screening is not None and screening.get("risk") not in ("adequate margin", None) else "")
        reason = verdict["reason"].replace("Tc^2", "Tc²")
        return {"level": level, "label": "Hot spot",
                "text": f"Hot spot {where}: {reason}{near}{limit_text}.{see}"}
    # adiabatic
    if not _finite(limit):
        return {"level": "review", "label": "Hot spot",
                "text": f"Adiabatic tube: the highest temperature is {where}, {fixed(hot['rise_above_feed_K'])} K "
                        f"above the feed; no design.temperature_limit is given to judge it against."}
    return {"level": "review" if near_limit else "acceptable", "label": "Hot spot",
            "text": f"Adiabatic tube: the highest temperature is {where}{limit_text}."}


def _rise_text(result):
    rise = result.adiabatic_temperature_rise
    if _finite(rise):
        return f"adiabatic rise {fixed(rise, sign=True)} K"
    note = (result.extra.get("adiabatic") or {}).get("note") if isinstance(result.extra, dict) else None
    return f"adiabatic rise not defined: {note}" if note else "adiabatic rise not defined"


def _not_applicable(reason):
    """True when the screening's reason says that runaway screening does not apply to the tube."""
    from simulator.screening.screen import NOT_APPLICABLE

    return bool(reason) and NOT_APPLICABLE in reason


def _screening_reason(case, result, reason):
    """Why the runaway screening is not in the report (our own words where we can tell)."""
    if _not_applicable(reason):
        return reason.rstrip(".") + "."
    if not _exothermic(result):
        return (f"no exothermic path for {case.design.key_species} ({_rise_text(result)}): runaway "
                f"screening does not apply.")
    if not case.heat.exchange:
        return (f"heat.mode = \"{case.heat.mode}\": runaway screening needs a tube cooled through its wall "
                f"(heat.mode = \"exchange\" with a [heat.medium]).")
    return reason or "the screening was not run for this report."


def _margins_text(screening, key):
    parts = []
    crit = screening.get("critical", {})
    for name, unit in (("medium_temperature_K", "K"), ("feed_mole_fraction", ""), ("inlet_temperature_K", "K")):
        entry = crit.get(name)
        if not entry or not entry.get("found"):
            continue
        label = {"medium_temperature_K": "medium temperature", "inlet_temperature_K": "inlet temperature",
                 "feed_mole_fraction": f"feed fraction of {key}"}[name]
        if unit:
            parts.append(f"critical {label} {fixed(entry['value'])} K (margin {fixed(entry['margin'], sign=True)} K)")
        else:
            parts.append(f"critical {label} {fmt(entry['value'], 4)} (margin {_pct(entry['margin_relative'])})")
    return "; ".join(parts)


def _runaway_flag(case, result, screening, reason):
    if screening is None:
        text = _screening_reason(case, result, reason)
        if not _exothermic(result) or _not_applicable(reason):
            return {"level": "acceptable", "label": "Runaway risk", "text": f"Not applicable: {text}"}
        return {"level": "review", "label": "Runaway risk",
                "text": f"Not screened although the reaction is exothermic ({_rise_text(result)}): {text} "
                        f"Check the temperature control separately."}
    risk = screening.get("risk", "")
    level = screening.get("risk_level") or risk_level(risk)
    margins = _margins_text(screening, case.design.key_species)
    sentence = {"acceptable": "Adequate margin to the runaway boundary",
                "review": "Parametrically sensitive: the hot spot reacts strongly to small changes",
                "unacceptable": "Runaway: the operating point is on the runaway side"}[level]
    text = (f"{sentence}" + (f"; {margins}" if margins else "")
            + f". Rule applied: {_pretty_rule(screening.get('risk_rule', ''))}.")
    return {"level": level, "label": "Runaway risk", "text": text}


def _design_quantity(assumptions):
    key = assumptions.get("design_quantity", "volume_m3")
    return ("catalyst mass", "kg") if key == "catalyst_mass_kg" else ("volume", "m³")


def _basis_text(entry, assumptions):
    """Why an assumption has no design change, in words fit for a case without a target."""
    basis = str(entry.get("design_change_basis") or "not computed")
    if assumptions.get("target_conversion") is None and "outlet conversions" in basis:
        change = entry.get("outlet_conversion_change")
        effect = (f"applying it alone changes the outlet conversion by {change:+.4f} at the given length"
                  if _finite(change) else basis[basis.index("outlet conversions"):])
        return "no target conversion is given; " + effect
    return basis


def _assumption_flag(name, entry, case, assumptions):
    label = _ASSUMPTION_LABELS.get(name, name.replace("_", " ").capitalize())
    quantity, _ = _design_quantity(assumptions)
    unit = "" if entry.get("unit") in ("-", None) else f" {entry['unit']}"
    value, threshold = entry.get("value"), entry.get("threshold")
    measure = entry.get("measure", "")
    change = entry.get("design_change_percent")
    effect = (f"applying it alone changes the {quantity} to the target by {_change(change)}"
              if _finite(change) else f"effect on the design: {_basis_text(entry, assumptions)}")
    verdict = entry.get("verdict")
    # the level is the one assumptions.json carries (one rule: simulator.verdicts.assumption_level)
    level = entry.get("level") or assumption_level(verdict, change)
    if verdict == "unknown":
        return {"level": level, "label": label,
                "text": f"Not checked: {entry.get('design_change_basis', 'no data')}."}
    numbers = f"{measure} = {fmt(value, 3)}{unit}, threshold {fmt(threshold, 3)}{unit}"
    if verdict == "holds":
        if name == "isothermal" and case.heat.mode == "isothermal":
            return {"level": level, "label": label,
                    "text": "Holds by construction: the case itself is isothermal (heat.mode = \"isothermal\")."}
        if level != "acceptable":
            return {"level": level, "label": label,
                    "text": f"Holds by its measure ({numbers}), but {effect}."}
        return {"level": level, "label": label, "text": f"Holds: {numbers}; {effect}."}
    return {"level": level, "label": label, "text": f"Fails: {numbers}; {effect}."}


def _summary(case, result, assumptions, screening, screening_reason):
    s = result.summary()
    key = case.design.key_species
    d, hot, outlet = s["design"], s["hot_spot"], s["outlet"]
    numbers = [{"label": f"Outlet conversion of {key}", "value": fixed(outlet["conversion"], 4), "unit": "-"}]
    target = d["target_conversion"]
    if target is not None:
        numbers.append({"label": "Target conversion", "value": fmt(target, 4), "unit": "-"})
        if d["length_m"] is None and d.get("length_note") and (assumptions or {}).get("full", {}).get("length_m"):
            # counter-current medium: the length comes from re-solved tubes (the assumption check's full design)
            d = {**d, **{k: assumptions["full"][k] for k in ("length_m", "volume_m3", "catalyst_mass_kg")},
                 "reached": True}
        if d["reached"] and d["length_m"] is not None:
            numbers.append({"label": "Length to the target", "value": fmt(d["length_m"], 4), "unit": "m"})
            tubes = "1 tube" if case.tube.count == 1 else f"{case.tube.count} tubes"
            numbers.append({"label": f"Reactor volume to the target ({tubes})",
                            "value": fmt(d["volume_m3"], 4), "unit": "m³"})
            numbers.append({"label": "Catalyst mass to the target",
                            "value": fmt(d["catalyst_mass_kg"], 4) if d["catalyst_mass_kg"] is not None
                            else "no catalyst bed", "unit": "kg" if d["catalyst_mass_kg"] is not None else ""})
        else:
            for label in ("Length to the target", "Reactor volume to the target", "Catalyst mass to the target"):
                numbers.append({"label": label, "value": "not reached", "unit": ""})
    else:
        numbers.append({"label": "Length, volume and catalyst mass to a target",
                        "value": "no target given", "unit": ""})
    name = "Hot spot" if _exothermic(result) else "Highest temperature"
    if case.heat.mode == "isothermal":
        # held at the feed temperature by construction: no hot spot, no position, no rise to report
        numbers.append({"label": "Gas temperature (isothermal by construction)",
                        "value": fixed(case.feed.temperature), "unit": "K"})
    else:
        numbers += [
            {"label": f"{name}: temperature" if _exothermic(result) else name, "value": fixed(hot["temperature_K"]),
             "unit": "K"},
            {"label": f"{name}: position", "value": fmt(hot["position_m"], 3), "unit": "m"},
        ]
    if case.heat.mode == "isothermal":
        pass
    elif hot.get("rise_above_medium_K") is not None:
        rise_m = hot["rise_above_medium_K"]
        # a heated tube stays below its medium: say so instead of a negative rise "above" it
        numbers.append({"label": f"{name}: {'above' if rise_m >= 0 else 'below'} the medium",
                        "value": fixed(abs(rise_m)), "unit": "K"})
    else:
        numbers.append({"label": f"{name}: above the feed", "value": fixed(hot["rise_above_feed_K"], sign=True),
                        "unit": "K"})
    dp = outlet["pressure_drop_Pa"]
    if case.pressure_drop.model == "none":
        numbers.append({"label": "Pressure drop (pressure_drop.model = \"none\")", "value": "not modelled",
                        "unit": ""})
    else:
        numbers.append({"label": "Pressure drop", "value": fmt(dp / 1e3, 4) if dp is not None else "not computed",
                        "unit": "kPa" if dp is not None else ""})
        numbers.append({"label": "Pressure drop / feed pressure",
                        "value": fixed(100.0 * dp / case.feed.pressure, 2) if dp is not None else "not computed",
                        "unit": "%" if dp is not None else ""})
    rise = s["adiabatic_temperature_rise_K"]
    if rise is not None:
        numbers.append({"label": f"Adiabatic temperature rise (complete conversion of {key})",
                        "value": fixed(rise, sign=True), "unit": "K"})
    else:
        note = (s.get("adiabatic") or {}).get("note") or "not defined"
        numbers.append({"label": f"Adiabatic temperature rise (complete conversion of {key}) — not defined: {note}",
                        "value": "not defined", "unit": ""})
    numbers.append({"label": "Outlet temperature", "value": fixed(outlet["temperature_K"]), "unit": "K"})
    if case.heat.exchange or case.heat.mode == "isothermal":
        Q = outlet["heat_duty_W"]
        numbers.append({"label": "Heat through the walls (negative: removed)", "value": fmt(Q / 1e3, 4)
                        if Q is not None else "not computed", "unit": "kW" if Q is not None else ""})

    flags = []
    if result.status != "completed":
        flags.append({"level": "unacceptable", "label": "Run", "text": f"Stopped before the end of the tube: "
                      f"{result.termination}."})
    flags.append(_hot_spot_flag(case, result, screening, screening_reason))
    flags.append(_runaway_flag(case, result, screening, screening_reason))
    if target is not None:
        if d["reached"] and d["length_m"] is None:
            flags.append({"level": "acceptable", "label": "Target conversion",
                          "text": f"X = {fmt(target, 4)} is met at the outlet of the {fmt(case.tube.length, 4)} m "
                                  f"tube; {d.get('length_note', '')}."})
        elif d["reached"]:
            flags.append({"level": "acceptable", "label": "Target conversion",
                          "text": f"X = {fmt(target, 4)} is reached at z = {fmt(d['length_m'], 4)} m of "
                                  f"{fmt(case.tube.length, 4)} m."})
        else:
            flags.append({"level": "review", "label": "Target conversion",
                          "text": f"X = {fmt(target, 4)} is not reached in the {fmt(case.tube.length, 4)} m tube "
                                  f"(outlet conversion {fixed(outlet['conversion'], 4)})."})
    max_dp = case.design.max_pressure_drop
    if _finite(max_dp) and dp is not None:
        ok = dp <= max_dp
        flags.append({"level": "acceptable" if ok else "unacceptable", "label": "Pressure drop",
                      "text": f"{fmt(dp / 1e3, 4)} kPa {'within' if ok else 'above'} the allowed "
                              f"{fmt(max_dp / 1e3, 4)} kPa."})
    if assumptions is not None:
        for name, entry in assumptions.get("assumptions", {}).items():
            flags.append(_assumption_flag(name, entry, case, assumptions))
    else:
        flags.append({"level": "review", "label": "Assumptions", "text": "The assumption check was not run."})
    return {"numbers": numbers, "flags": flags}
