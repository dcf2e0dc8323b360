"""Report context of a reactor train (``templates/train_report.html.j2``): display values only.

From a :class:`simulator.solve.train.TrainResult`: the train's numbers (overall conversion on everything
fed, outlet, duties, closure over the train), one row per bed, one row per interstage step, the
temperature-conversion diagram with the equilibrium curve (:mod:`simulator.report.train_plots`) and the
temperature along the train, the cautions (the standard ones and the train's own) and provenance. Numbers
are rounded here only (:mod:`simulator.report.context_format`); the run itself stays SI.

This report states the train's results; it does not judge them: the per-bed assumption check and runaway
screening are the ``assumptions`` and ``screen`` verbs (``assumptions.json``, ``screening.json`` with the
levels), and the report says so instead of showing a verdict it did not compute.
"""
import datetime as _dt
from pathlib import Path

import numpy as np

from simulator.report.context import _provenance, _references
from simulator.report.context_inputs import _input_row, _inputs, _walk
from simulator.report.context_format import fixed, fmt
from simulator.report.plots import profile_lines_plot
from simulator.report.train_plots import train_path_data, train_path_plot
from simulator.train_output import TRAIN_CAUTIONS, train_summary

NOT_IN_THIS_REPORT = (
    "Assumption check of each bed (ideal design against the full model): tubesim assumptions CASE --out DIR.",
    "Runaway screening of each bed that exchanges heat through its wall, with verdict levels: tubesim screen "
    "CASE --out DIR.",
    "Length of one bed for the train's target conversion: tubesim size CASE --bed K --out DIR.",
)


def _K(value):
    return fixed(value, 2)


def _kW(value):
    return fmt(None if value is None else value / 1e3)


def _bar(value):
    return fmt(None if value is None else value / 1e5, 5)


def _summary_rows(s):
    t = s["train"]
    o = s["outlet"]
    d = t["design"]
    if d["target_conversion"] is None:
        target = "no target given (design.target_conversion)"
    else:
        target = f"{fmt(d['target_conversion'])}: {'reached' if d['reached'] else 'not reached'} at the train outlet"
    c = t["closure"]
    return [
        {"label": f"Overall conversion of {s['key_species']} (on everything fed)",
         "value": fmt(t["overall_conversion"]), "unit": "-"},
        {"label": "Target conversion", "value": target, "unit": ""},
        {"label": "Outlet temperature", "value": _K(o["temperature_K"]), "unit": "K"},
        {"label": "Outlet pressure", "value": _bar(o["pressure_Pa"]), "unit": "bar"},
        {"label": "Heat through the bed walls (all beds)", "value": _kW(t["bed_duty_W"]), "unit": "kW"},
        {"label": "Interstage duty (all steps; negative = removed)", "value": _kW(t["interstage_duty_W"]),
         "unit": "kW"},
        {"label": "Closure over the train: elements / energy",
         "value": f"{fmt(c['elements_relative'], 2)} / {fmt(c['energy_relative'], 2)}", "unit": "-"},
    ]


def _bed_table(train, s):
    rows = []
    for k, (bed, result) in enumerate(zip(s["train"]["beds"], train.beds)):
        h = bed["hot_spot"]
        rows.append([str(k + 1), fmt(result.case.tube.length), _K(bed["inlet"]["temperature_K"]),
                     _K(bed["outlet"]["temperature_K"]),
                     f"{_K(h['temperature_K'])} at {fmt(h['position_m'])} m",
                     fmt(bed["outlet"]["conversion"]), fmt(bed["conversion_on_fed"]),
                     fmt(None if bed["outlet"]["pressure_drop_Pa"] is None else bed["outlet"]["pressure_drop_Pa"] / 1e3),
                     _kW(bed["outlet"]["heat_duty_W"]), f"{bed['status']}: {bed['termination']}"])
    return {"caption": "Beds in series (conversion of the bed on its own inlet, and on everything fed so far)",
            "columns": ["Bed", "Length [m]", "Inlet T [K]", "Outlet T [K]", "Hot spot [K]", "X bed [-]",
                        "X on fed [-]", "Pressure drop [kPa]", "Wall duty [kW]", "Status"],
            "rows": rows}


def _step_table(s):
    rows = []
    for st in s["train"]["interstage"]:
        quench = st["kind"] == "quench"
        rows.append([str(st["after_bed"]), st["kind"], _K(st["inlet_temperature_K"]),
                     _K(st["outlet_temperature_K"]), _kW(st["duty_W"]),
                     fmt(st["added_molar_flow_mol_per_s"]) if quench else "-",
                     _K(st["added_temperature_K"]) if quench else "-"])
    return {"caption": "Interstage steps (cool-to / heat-to: set temperature and duty; quench: adiabatic mixing)",
            "columns": ["After bed", "Kind", "From T [K]", "To T [K]", "Duty [kW]", "Quench flow [mol/s]",
                        "Quench T [K]"],
            "rows": rows}


def _plots(train):
    data = train_path_data(train)
    path = {"title": "Temperature-conversion path of the train", "uri": train_path_plot(train),
            "caption": f"Each bed's temperature against the conversion of {train.key_species} on what is fed so "
                       f"far; dotted arrows: interstage steps. {data['equilibrium_note'][:1].upper()}{data['equilibrium_note'][1:]}."}
    z, T, start = [], [], 0.0
    for result in train.beds:
        z.append(start + np.asarray(result.z))
        T.append(np.asarray(result.T))
        start += float(result.z[-1])
    along = {"title": "Gas temperature along the train",
             "uri": profile_lines_plot(np.concatenate(z), {"gas temperature": np.concatenate(T)},
                                       "Temperature [K]", xlabel="Position from the inlet of bed 1 [m]"),
             "caption": "Beds one after the other (the interstage steps take no length here)."}
    return [path, along]


#: interstage keys converted like the single-tube key of the same quantity
_AS_SINGLE_TUBE = {"after.0.temperature": "feed.temperature", "after.0.stream.temperature": "feed.temperature",
                   "after.0.stream.molar_flow": "feed.molar_flow"}


def _train_inputs(case, train):
    """The Inputs block: the shared keys, then each bed's keys as ``train[k].…`` (1-based, as in messages).

    A bed's key is converted as the same key of a single tube (``tube.length`` in m, ...); an interstage
    key (``after.temperature``) as a temperature.
    """
    inputs = _inputs(case, train.beds[0])[0]
    raw = case.raw if isinstance(case.raw, dict) else {}
    rows = [_input_row(path, value) for path, value in _walk("", raw, skip=("reactions", "train"))]
    for k, entry in enumerate(raw.get("train", []), start=1):
        for path, value in _walk("", entry):
            row = _input_row(_AS_SINGLE_TUBE.get(path, path), value)
            row["field"] = f"train[{k}].{path.replace('after.0.', 'after.', 1)}"
            rows.append(row)
    return dict(inputs, rows=rows)


def train_context(case, train, command_line="", generated=None):
    """The context of ``train_report.html.j2``.

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated train case, [-]
    train : simulator.solve.train.TrainResult
        Its run (completed or stopped; a failed train has no report), [-]
    command_line : str
        Command that produced the report, for provenance, [-]
    generated : datetime.datetime, optional
        Time stamp; default now, in UTC, [-]
    """
    from simulator.report.html import STANDARD_CAUTIONS

    stamp = (generated or _dt.datetime.now(_dt.timezone.utc)).astimezone(_dt.timezone.utc)
    stamp = stamp.strftime("%Y-%m-%d %H:%M UTC")
    source = Path(case.source_path).name if case.source_path else "(dict)"
    s = train_summary(train)
    status = (f"The train stopped: {train.termination}. The overall numbers are not computed."
              if train.status == "stopped" else "")
    warnings = list(s["warnings"]) + [f"bed {k + 1}: {w}" for k, b in enumerate(train.beds) for w in b.warnings]
    return {
        "title": case.title or source,
        "case_name": Path(source).stem,
        "case_file": case.source_path or "(none)",
        "generated": stamp,
        "tool_version": train.beds[0].versions.get("tubesim", "n/a"),
        "status_note": status,
        "numbers": _summary_rows(s) if train.status == "completed" else [],
        "beds": _bed_table(train, s),
        "steps": _step_table(s),
        "plots": _plots(train),
        "not_in_this_report": list(NOT_IN_THIS_REPORT),
        "warnings": list(dict.fromkeys(warnings)),
        "inputs": _train_inputs(case, train),
        "references": list({r["key"]: r for b in train.beds for r in _references(b.case, b, None, None)}.values()),
        "cautions": list(STANDARD_CAUTIONS) + list(TRAIN_CAUTIONS),
        "provenance": _provenance(case, train.beds[0], stamp, command_line),
    }
