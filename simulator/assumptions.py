"""How wrong is the ideal design for this case? Assumption check and attribution.

The ideal design sizes a tube isothermal at the feed temperature, isobaric at the
feed pressure and with an ideal gas (same kinetics, same mole change). This
module solves that ideal model and the full case, compares the quantity that
reaches the target (volume for an empty tube, catalyst mass for a bed), and
attributes the error to each assumption by switching off one effect at a time in
the full model.

Thresholds (overridable in the case's ``[assumptions]`` table):

* ``isothermal``: max |T - T_feed| below 0.1 R T_feed^2 / E_max — the
  temperature change that alters the largest-activation-energy rate constant by
  about 10 % (first-order expansion of the Arrhenius law, d ln k / dT = E/(R T^2));
  the 10 % is common practice, no source.
* ``isobaric``: pressure drop below 10 % of the feed pressure — common practice,
  no source.
* ``ideal_gas``: max |Z - 1| below 5 % along the tube — common practice, no source.
* ``constant_moles``: |epsilon| = |y_key,0 * delta| below 5 %, with delta the change
  in total moles per mole of key species of the reaction that consumes it most —
  common practice, no source (the expansion factor itself is the classical one,
  Levenspiel 1999, ch. 3).
* ``no_pellet_gradients`` (with ``[catalyst]``): 1 - min eta along the tube (eta from the pellet
  model) against 0.05; the variant is the same case with eta = 1.
* ``one_dimensional`` (packed beds only): the centre-line hot-spot rise of the 2-D model against
  the 1-D one, see :mod:`simulator.radial_assumption`.
"""
import dataclasses
import math

import numpy as np

from simulator.model.build import build_model
from simulator.radial_assumption import one_dimensional_entry
from simulator.solve.integrate import simulate
from simulator.solve.target_length import length_by_resolving, moves_with_length
from simulator.units import R
from simulator.verdicts import assumption_level, null_where_not_finite

NAN = float("nan")


def ideal_case(case):
    """The case made isothermal at the feed temperature, isobaric and ideal gas (no temperature limit)."""
    return dataclasses.replace(
        case,
        heat=dataclasses.replace(case.heat, mode="isothermal", overall_coefficient=0.0, arrangement="",
                                 medium_temperature=NAN,
                                 medium_mass_flow=NAN, medium_cp=NAN, coefficient=None),
        catalyst=None,                       # intrinsic rates: the textbook design has no pellet limits
        pressure_drop=dataclasses.replace(case.pressure_drop, model="none"),
        thermo=case.thermo if case.thermo.equation_of_state == "liquid"   # a liquid stays a liquid
        else dataclasses.replace(case.thermo, equation_of_state="ideal-gas"),
        design=dataclasses.replace(case.design, temperature_limit=NAN, wall_temperature_limit=NAN),
    )


def _design_quantity(case):
    return ("catalyst_mass_kg", "catalyst mass") if case.bed is not None else ("volume_m3", "volume")


def _numbers(result, model_builder=None):
    """Design numbers of one solved variant; with a counter-current medium the length to the target
    comes from re-solved tubes (:func:`simulator.solve.target_length.length_by_resolving`)."""
    d = result.design
    if moves_with_length(result.case) and d.get("target_conversion") is not None and result.status != "failed":
        d = length_by_resolving(result.case, model_builder)
    return {"length_m": d["length_m"], "volume_m3": d["volume_m3"], "catalyst_mass_kg": d["catalyst_mass_kg"],
            "outlet_conversion": result.outlet_conversion, "status": result.status,
            "termination": result.termination}


def _change(case, variant, reference, label_variant, label_reference):
    """(variant - reference) / reference * 100 for the sizing quantity, or None with the reason."""
    key, name = _design_quantity(case)
    v, r = variant[key], reference[key]
    outlets = (f"outlet conversions {label_variant} {variant['outlet_conversion']:.4f}, "
               f"{label_reference} {reference['outlet_conversion']:.4f}")
    if math.isnan(case.design.target_conversion):
        return None, (f"no target given (design.target_conversion): the design change is measured on the "
                      f"{name} to a target; {outlets}")
    if v is None or r is None or r == 0.0:
        missing = [lab for lab, val in ((label_variant, v), (label_reference, r)) if val is None]
        if not missing:
            return None, f"the target is reached at the inlet: no {name} to compare; {outlets}"
        verb = "does" if len(missing) == 1 else "do"
        return None, (f"the {' and the '.join(missing)} model{'s' if len(missing) > 1 else ''} {verb} not reach "
                      f"the target conversion {case.design.target_conversion:.4g} in the given tube; {outlets}")
    return (v - r) / r * 100.0, f"{name} to reach the target"


def _conversion_change(variant, reference):
    """Outlet conversion of the variant minus that of the reference, [-] (needs no target)."""
    a, b = variant["outlet_conversion"], reference["outlet_conversion"]
    return None if a is None or b is None else a - b


def mole_change(case):
    """(epsilon, delta) of the key species: delta = sum(nu) / |nu_key| of its main reaction, eps = y_key,0 * delta.

    (None, None) when no reaction consumes the key species.
    """
    key = case.design.key_species
    y0 = dict(case.feed.mole_fractions)[key]
    best = None
    for r in case.reactions:
        nu = dict(r.stoichiometry)
        if nu.get(key, 0.0) < 0:
            delta = sum(nu.values()) / -nu[key]
            if best is None or abs(delta) > abs(best):
                best = delta
    return (None, None) if best is None else (y0 * best, best)


def isothermal_threshold(case):
    """Default limit of max |T - T_feed| [K] and where it comes from.

    0.1 R T_feed^2 / |E|_max: the temperature change that moves the most temperature-sensitive rate
    constant by about 10 % (d ln k / dT = E / (R T^2)). Without an activation energy the rate
    constants do not depend on T, but the gas concentrations do (c = P / (Z R T)): 0.1 T_feed then
    moves them by about 10 %. The 10 % is common practice, no source.
    """
    T0 = case.feed.temperature
    E = max(abs(r.activation_energy) for r in case.reactions)
    if E > 0:
        return 0.1 * R * T0 ** 2 / E, "0.1 R T_feed^2 / E_max: about 10 % change of the rate constant (common practice)"
    return 0.1 * T0, ("0.1 T_feed: no activation energy, so about 10 % change of the gas concentrations "
                      "(common practice)")


def check_assumptions(case):
    """Solve the ideal and full models, measure each assumption and attribute the design change.

    Parameters
    ----------
    case : simulator.case.schema.Case

    Returns
    -------
    dict
        The ``assumptions.json`` content (SI units).
    """
    full_result = simulate(case)
    ideal_result = simulate(ideal_case(case))
    full, ideal = _numbers(full_result), _numbers(ideal_result)
    change, basis = _change(case, ideal, full, "ideal", "full")
    T0, P0 = case.feed.temperature, case.feed.pressure
    th = case.assumptions
    entries = {}

    # isothermal
    value = float(np.max(np.abs(full_result.T - T0)))
    limit, limit_source = isothermal_threshold(case)
    if not math.isnan(th.isothermal):
        limit, limit_source = th.isothermal, "case [assumptions] table"
    variant = _numbers(simulate(dataclasses.replace(case, heat=ideal_case(case).heat,
                                                    design=ideal_case(case).design)))
    entries["isothermal"] = _entry(value, limit, "K", variant, full, case, "isothermal variant", "full",
                                   "max |T - T_feed| along the tube", limit_source)
    # isobaric
    value = float((full_result.P[0] - full_result.P.min()) / P0)
    variant = _numbers(simulate(dataclasses.replace(
        case, pressure_drop=dataclasses.replace(case.pressure_drop, model="none"))))
    entries["isobaric"] = _entry(value, th.isobaric, "-", variant, full, case, "isobaric variant", "full",
                                 "pressure drop / feed pressure", "10 % of the feed pressure (common practice)"
                                 if th.isobaric == 0.10 else "case [assumptions] table")
    # ideal gas: compare ideal gas with Peng-Robinson, all else as in the case
    entries["ideal_gas"] = _ideal_gas_entry(case, full_result, full)
    # constant moles
    eps, delta = mole_change(case)
    variant = _numbers(simulate(case, model=build_model(case, constant_moles=True)),
                       lambda c: build_model(c, constant_moles=True))
    entries["constant_moles"] = _entry(None if eps is None else abs(eps), th.constant_moles, "-", variant, full,
                                       case, "constant-moles variant", "full",
                                       f"|epsilon| = |y_key,0 * delta| (delta = {delta:+.4g})" if delta is not None
                                       else f"|epsilon|: no reaction consumes {case.design.key_species}",
                                       "5 % (common practice)" if th.constant_moles == 0.05
                                       else "case [assumptions] table")
    entries["constant_moles"]["epsilon"] = eps
    # pellets free of internal gradients ([catalyst]): the same case with eta = 1
    if getattr(case, "catalyst", None) is not None:
        entries["no_pellet_gradients"] = _pellet_entry(case, full_result, full)
    # one-dimensional tube (packed beds): the 2-D model of the same case (simulator.radial_assumption)
    if case.bed is not None:
        entries["one_dimensional"] = one_dimensional_entry(case, full_result, _numbers, _change, _conversion_change)

    key, name = _design_quantity(case)
    return null_where_not_finite({
        "title": case.title,
        "key_species": case.design.key_species,
        "target_conversion": None if math.isnan(case.design.target_conversion) else case.design.target_conversion,
        "design_quantity": key,
        "ideal": ideal,
        "full": full,
        "design_change_percent": change,
        "design_change_basis": basis,
        "outlet_conversion_change": _conversion_change(ideal, full),
        "assumptions": entries,
        "adiabatic_temperature_rise_K": _finite(full_result.adiabatic_temperature_rise),
        "full_summary": full_result.summary(),
    })


def _finite(value):
    return value if value is not None and math.isfinite(value) else None


def _entry(value, threshold, unit, variant, full, case, label_variant, label_full, measure, threshold_source):
    change, basis = _change(case, variant, full, label_variant, label_full)
    measurable = value is not None and math.isfinite(value)
    verdict = ("holds" if value <= threshold else "fails") if measurable else "unknown"
    return {"value": value if measurable else None, "threshold": threshold, "unit": unit,
            "verdict": verdict, "level": assumption_level(verdict, change),
            "design_change_percent": change, "design_change_basis": basis,
            "outlet_conversion_change": _conversion_change(variant, full),
            "measure": measure, "threshold_source": threshold_source}


#: largest loss of rate to pellet diffusion, 1 - eta, taken as none, [-] (common practice, no source)
PELLET_THRESHOLD = 0.05


def _pellet_entry(case, full_result, full):
    """``no_pellet_gradients``: 1 - min eta along the tube against 0.05; the variant is the case with eta = 1.

    eta from the pellet model of the run (:mod:`simulator.model.pellet_block`); details give the
    Weisz-Prater number at the inlet (Weisz & Prater 1954: well below 1 no internal limitation).
    """
    block = full_result.summary().get("pellet")
    value = None
    if block:
        value = 1.0 - min(e["min"] for e in block["effectiveness"].values())
    variant = _numbers(simulate(dataclasses.replace(case, catalyst=None)))
    entry = _entry(value, PELLET_THRESHOLD, "-", variant, full, case, "variant without pellet limits (eta = 1)",
                   "full", "1 - min eta: the largest share of a rate lost to diffusion in the pellets",
                   "eta >= 0.95 (common practice, no source)")
    entry["details"] = {"weisz_prater_inlet": block["weisz_prater_inlet"] if block else None,
                        "weisz_prater_source": "Weisz & Prater (1954): C_WP << 1 no internal limitation, >> 1 strong",
                        "pellet_model": block["model"] if block else None}
    return entry


def _ideal_gas_entry(case, full_result, full):
    th = case.assumptions.ideal_gas
    if case.thermo.equation_of_state == "liquid":   # no gas law is used, so none is assumed
        return {"value": None, "threshold": th, "unit": "-", "verdict": "holds",
                "level": assumption_level("holds", 0.0), "design_change_percent": None,
                "design_change_basis": "does not apply: a liquid feed has no gas law (concentrations from the "
                                       "liquid density, independent of the pressure)",
                "outlet_conversion_change": None, "measure": "does not apply to a liquid feed",
                "threshold_source": "-"}
    Z = full_result.Z
    source = "5 % (common practice)" if th == 0.05 else "case [assumptions] table"
    if not np.any(np.isfinite(Z)):
        model = build_model(case)
        missing = [n for n, src in zip(model.species.names, model.critical_sources) if not src]
        lacking = (f"no critical constants for {', '.join(missing)}" if missing
                   else "Z could not be computed along the tube")
        return {"value": None, "threshold": th, "unit": "-", "verdict": "unknown",
                "level": assumption_level("unknown", None), "design_change_percent": None,
                "design_change_basis": f"{lacking}: Z cannot be computed; give them under [thermo.critical.NAME] "
                                       "(critical_temperature, critical_pressure, acentric_factor)",
                "outlet_conversion_change": None,
                "measure": "max |Z - 1| along the tube (Peng-Robinson)", "threshold_source": source}
    value = float(np.nanmax(np.abs(Z - 1.0)))
    if case.thermo.equation_of_state == "peng-robinson":
        ideal = _numbers(simulate(dataclasses.replace(
            case, thermo=dataclasses.replace(case.thermo, equation_of_state="ideal-gas"))))
        change, basis = _change(case, ideal, full, "ideal-gas variant", "full")
    else:
        real = _numbers(simulate(dataclasses.replace(
            case, thermo=dataclasses.replace(case.thermo, equation_of_state="peng-robinson"))))
        change, basis = _change(case, full, real, "full (ideal-gas)", "Peng-Robinson variant")
        basis += " (the case is ideal gas: compared with the same case on Peng-Robinson)"
    verdict = "holds" if value <= th else "fails"
    variant, reference = (ideal, full) if case.thermo.equation_of_state == "peng-robinson" else (full, real)
    return {"value": value, "threshold": th, "unit": "-", "verdict": verdict,
            "level": assumption_level(verdict, change), "design_change_percent": change, "design_change_basis": basis,
            "outlet_conversion_change": _conversion_change(variant, reference),
            "measure": "max |Z - 1| along the tube (Peng-Robinson)", "threshold_source": source}


def format_table(report):
    """Plain-text table of an assumption check for the terminal."""
    key = report["design_quantity"]
    unit = "kg" if key == "catalyst_mass_kg" else "m3"

    def fmt(value, spec=".4g", missing="-"):
        return missing if value is None else format(value, spec)

    t, f = report["ideal"], report["full"]
    size_missing = "not reached" if report["target_conversion"] is not None else "no target"
    lines = [report["title"],
             "  target conversion: " + (f"{report['target_conversion']:.4g}" if report["target_conversion"]
                                        is not None else "no target given (design.target_conversion)"),
             f"  {'':22s}{'ideal':>14s}{'full':>14s}",
             f"  {'length to target [m]':22s}{fmt(t['length_m'], missing=size_missing):>14s}"
             f"{fmt(f['length_m'], missing=size_missing):>14s}",
             f"  {key.replace('_', ' ')[:-3] + ' [' + unit + ']':22s}{fmt(t[key], missing=size_missing):>14s}"
             f"{fmt(f[key], missing=size_missing):>14s}",
             f"  {'outlet conversion':22s}{fmt(t['outlet_conversion']):>14s}{fmt(f['outlet_conversion']):>14s}",
             f"  design change (ideal vs full): "
             + (f"{report['design_change_percent']:+.1f} %" if report["design_change_percent"] is not None
                else f"not computed ({report['design_change_basis']})"),
             f"  {'assumption':20s}{'value':>12s}{'threshold':>12s}{'unit':>5s}{'verdict':>9s}{'level':>13s}{'design change':>16s}"]
    for name, e in report["assumptions"].items():
        change = "-" if e["design_change_percent"] is None else f"{e['design_change_percent']:+.2f} %"
        lines.append(f"  {name:20s}{fmt(e['value']):>12s}{fmt(e['threshold']):>12s}{e['unit']:>5s}"
                     f"{e['verdict']:>9s}{e['level']:>13s}{change:>16s}")
    rise = report["adiabatic_temperature_rise_K"]
    lines.append("  adiabatic temperature rise: " + ("not defined" if rise is None else f"{rise:+.1f} K"))
    return "\n".join(lines)
