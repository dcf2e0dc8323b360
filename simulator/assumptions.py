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
"""
import dataclasses
import math

import numpy as np

from simulator.model.build import build_model
from simulator.solve.integrate import simulate
from simulator.units import R
from simulator.verdicts import assumption_level

NAN = float("nan")


def ideal_case(case):
    """The case made isothermal at the feed temperature, isobaric and ideal gas (no temperature limit)."""
    return dataclasses.replace(
        case,
        heat=dataclasses.replace(case.heat, mode="isothermal", overall_coefficient=0.0, arrangement="",
                                 medium_temperature=NAN,
                                 medium_mass_flow=NAN, medium_cp=NAN),
        pressure_drop=dataclasses.replace(case.pressure_drop, model="none"),
        thermo=dataclasses.replace(case.thermo, equation_of_state="ideal-gas"),
        design=dataclasses.replace(case.design, temperature_limit=NAN),
    )


def _design_quantity(case):
    return ("catalyst_mass_kg", "catalyst mass") if case.bed is not None else ("volume_m3", "volume")


def _numbers(result):
    d = result.design
    return {"length_m": d["length_m"], "volume_m3": d["volume_m3"], "catalyst_mass_kg": d["catalyst_mass_kg"],
            "outlet_conversion": result.outlet_conversion, "status": result.status,
            "termination": result.termination}


def _change(case, variant, reference, label_variant, label_reference):
    """(variant - reference) / reference * 100 for the sizing quantity, or None with the reason."""
    key, name = _design_quantity(case)
    v, r = variant[key], reference[key]
    if v is None or r is None:
        missing = [lab for lab, val in ((label_variant, v), (label_reference, r)) if val is None]
        verb = "does" if len(missing) == 1 else "do"
        return None, (f"the {' and the '.join(missing)} model{'s' if len(missing) > 1 else ''} {verb} not reach "
                      f"the target conversion in the given "
                      f"tube; outlet conversions {label_variant} {variant['outlet_conversion']:.4f}, "
                      f"{label_reference} {reference['outlet_conversion']:.4f}")
    return (v - r) / r * 100.0, f"{name} to reach the target"


def mole_change(case):
    """(epsilon, delta) of the key species: delta = sum(nu) / |nu_key| of its main reaction, eps = y_key,0 * delta."""
    key = case.design.key_species
    y0 = dict(case.feed.mole_fractions)[key]
    best = None
    for r in case.reactions:
        nu = dict(r.stoichiometry)
        if nu.get(key, 0.0) < 0:
            delta = sum(nu.values()) / -nu[key]
            if best is None or abs(delta) > abs(best):
                best = delta
    return y0 * best, best


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
    E_max = max(r.activation_energy for r in case.reactions)
    th = case.assumptions
    entries = {}

    # isothermal
    value = float(np.max(np.abs(full_result.T - T0)))
    limit = th.isothermal if not math.isnan(th.isothermal) else (0.1 * R * T0 ** 2 / E_max if E_max > 0 else math.inf)
    variant = _numbers(simulate(dataclasses.replace(case, heat=ideal_case(case).heat,
                                                    design=ideal_case(case).design)))
    entries["isothermal"] = _entry(value, limit, "K", variant, full, case, "isothermal variant", "full",
                                   "max |T - T_feed| along the tube",
                                   "0.1 R T_feed^2 / E_max: about 10 % change of the rate constant (common practice)"
                                   if math.isnan(th.isothermal) else "case [assumptions] table")
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
    variant = _numbers(simulate(case, model=build_model(case, constant_moles=True)))
    entries["constant_moles"] = _entry(abs(eps), th.constant_moles, "-", variant, full, case,
                                       "constant-moles variant", "full",
                                       f"|epsilon| = |y_key,0 * delta| (delta = {delta:+.4g})",
                                       "5 % (common practice)" if th.constant_moles == 0.05
                                       else "case [assumptions] table")
    entries["constant_moles"]["epsilon"] = eps

    key, name = _design_quantity(case)
    return {
        "title": case.title,
        "key_species": case.design.key_species,
        "target_conversion": None if math.isnan(case.design.target_conversion) else case.design.target_conversion,
        "design_quantity": key,
        "ideal": ideal,
        "full": full,
        "design_change_percent": change,
        "design_change_basis": basis,
        "assumptions": entries,
        "adiabatic_temperature_rise_K": _finite(full_result.adiabatic_temperature_rise),
        "full_summary": full_result.summary(),
    }


def _finite(value):
    return value if value is not None and math.isfinite(value) else None


def _entry(value, threshold, unit, variant, full, case, label_variant, label_full, measure, threshold_source):
    change, basis = _change(case, variant, full, label_variant, label_full)
    verdict = "holds" if value <= threshold else "fails"
    return {"value": value, "threshold": threshold, "unit": unit,
            "verdict": verdict, "level": assumption_level(verdict, change),
            "design_change_percent": change, "design_change_basis": basis,
            "measure": measure, "threshold_source": threshold_source}


def _ideal_gas_entry(case, full_result, full):
    th = case.assumptions.ideal_gas
    Z = full_result.Z
    source = "5 % (common practice)" if th == 0.05 else "case [assumptions] table"
    if not np.any(np.isfinite(Z)):
        return {"value": None, "threshold": th, "unit": "-", "verdict": "unknown",
                "level": assumption_level("unknown", None), "design_change_percent": None,
                "design_change_basis": "no critical constants for every species: Z cannot be computed; give "
                                       "[thermo.critical.NAME]",
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
    return {"value": value, "threshold": th, "unit": "-", "verdict": verdict,
            "level": assumption_level(verdict, change), "design_change_percent": change, "design_change_basis": basis,
            "measure": "max |Z - 1| along the tube (Peng-Robinson)", "threshold_source": source}


def format_table(report):
    """Plain-text table of an assumption check for the terminal."""
    key = report["design_quantity"]
    unit = "kg" if key == "catalyst_mass_kg" else "m3"

    def fmt(value, spec=".4g"):
        return "n/a" if value is None else format(value, spec)

    t, f = report["ideal"], report["full"]
    lines = [report["title"],
             f"  {'':22s}{'ideal':>14s}{'full':>14s}",
             f"  {'length to target [m]':22s}{fmt(t['length_m']):>14s}{fmt(f['length_m']):>14s}",
             f"  {key.replace('_', ' ')[:-3] + ' [' + unit + ']':22s}{fmt(t[key]):>14s}{fmt(f[key]):>14s}",
             f"  {'outlet conversion':22s}{fmt(t['outlet_conversion']):>14s}{fmt(f['outlet_conversion']):>14s}",
             f"  design change (ideal vs full): "
             + (f"{report['design_change_percent']:+.1f} %" if report["design_change_percent"] is not None
                else f"n/a ({report['design_change_basis']})"),
             f"  {'assumption':16s}{'value':>12s}{'threshold':>12s}{'unit':>5s}{'verdict':>9s}{'level':>13s}{'design change':>16s}"]
    for name, e in report["assumptions"].items():
        change = "n/a" if e["design_change_percent"] is None else f"{e['design_change_percent']:+.2f} %"
        lines.append(f"  {name:16s}{fmt(e['value']):>12s}{fmt(e['threshold']):>12s}{e['unit']:>5s}"
                     f"{e['verdict']:>9s}{e['level']:>13s}{change:>16s}")
    rise = report["adiabatic_temperature_rise_K"]
    lines.append(f"  adiabatic temperature rise: {fmt(rise, '+.1f')} K")
    return "\n".join(lines)
