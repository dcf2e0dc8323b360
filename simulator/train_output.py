"""A reactor train's files (summary.json with a ``train`` block, profile.csv with a ``bed`` column) and table.

The data come from :class:`simulator.solve.train.TrainResult`; each bed's block keeps every key of
the single-tube ``summary.json`` (:meth:`simulator.results.Result.summary`) and adds its number and
inlet. A failed train writes its summary (what failed, where and why; no overall numbers) and the
trajectory up to the failure as ``profile_until_failure.csv``, never as ``profile.csv``.
"""
import csv
import io
import math
from pathlib import Path

from simulator.fileio import atomic_write_json, atomic_write_text
from simulator.output import print_summary

#: Cautions a train summary carries (common practice, no source).
TRAIN_CAUTIONS = (
    "Screening-level estimate from one-dimensional plug-flow beds with ideal interstage steps (the set "
    "temperature is reached exactly, quench streams mix completely, no heat loss); it does not replace design "
    "by qualified, licensed engineers under the codes that apply where the plant is built.",
    "In a train of exothermic beds a loss of interstage cooling or a hotter bed inlet carries into every later "
    "bed: check each bed's hot spot against the catalyst and vessel limits for upset inlet temperatures too.",
    "Not covered: condensation or dew points in the interstage exchangers (acid or water), exchanger design, "
    "flammability of the mixtures formed, toxic release and relief sizing, dynamics and start-up.",
)


def _num(value):
    if value is None:
        return None
    value = float(value)
    return value if math.isfinite(value) else None


def train_summary(train):
    """The ``summary.json`` dict of a train run (SI units, whole reactor of each bed)."""
    failed = train.status == "failed"
    beds = []
    for k, result in enumerate(train.beds):
        block = {"bed": k + 1, **result.summary()}
        block["inlet"] = {"temperature_K": _num(result.T[0]), "pressure_Pa": _num(result.P[0]),
                          "molar_flows_mol_per_s": {s: _num(v) for s, v in zip(train.species, result.F[0])}}
        X = train.path_conversion(k)
        block["conversion_on_fed"] = None if result.status == "failed" else _num(X[-1])
        beds.append(block)
    steps = [{"after_bed": s.after_bed, "kind": s.kind, "inlet_temperature_K": _num(s.inlet_temperature),
              "outlet_temperature_K": _num(s.outlet_temperature), "pressure_Pa": _num(s.pressure),
              "duty_W": _num(s.duty),
              "added_molar_flow_mol_per_s": _num(s.added_flows.sum()) if s.kind == "quench" else None,
              "added_temperature_K": _num(s.added_temperature) if s.kind == "quench" else None}
             for s in train.interstages]
    last = train.beds[-1]
    complete = train.status == "completed"
    X_end = train.path_conversion(len(train.beds) - 1)[-1]
    outlet = {"bed": len(train.beds), "position_m": _num(sum(float(b.z[-1]) for b in train.beds)),
              "conversion": None if failed else _num(X_end),
              "temperature_K": None if failed else _num(last.T[-1]),
              "pressure_Pa": None if failed else _num(last.P[-1]),
              "molar_flows_mol_per_s": {s: (None if failed else _num(v)) for s, v in zip(train.species, last.F[-1])},
              "mole_fractions": {s: (None if failed else _num(v / last.F[-1].sum()))
                                 for s, v in zip(train.species, last.F[-1])}}
    solver = train.case.solver
    steps_taken = sum(int(b.solver_stats.get("steps", 0)) for b in train.beds)
    target = train.case.design.target_conversion
    design = {"target_conversion": _num(target),
              "reached": bool(complete and not math.isnan(target) and train.overall_conversion >= target)}
    block = {
        "beds": beds,
        "interstage": steps,
        "overall_conversion": _num(train.overall_conversion) if complete else None,
        "overall_conversion_basis": f"{train.key_species} converted over everything fed: bed 1 feed and every "
                                    "quench",
        "fed_molar_flows_mol_per_s": {s: _num(v) for s, v in zip(train.species, train.fresh_flows)},
        "outlet": outlet if complete else None,
        "bed_duty_W": None if failed else _num(sum(float(b.Q[-1]) for b in train.beds)),
        "interstage_duty_W": None if failed else _num(sum(s.duty for s in train.interstages)),
        "closure": {k: (None if failed else _num(v)) for k, v in train.closure.items()},
        "design": design,
    }
    # the top level reads like a single tube's: where the gas leaves the train (or stopped), the closure
    # over the train, the shared solver options
    return {"title": train.case.title, "status": train.status, "termination": train.termination,
            "key_species": train.key_species, "outlet": outlet, "closure": block["closure"],
            "train": block, "warnings": list(train.warnings),
            "solver": {"rtol": solver.rtol, "atol_scale": solver.atol_scale, "steps": steps_taken},
            "cautions": list(TRAIN_CAUTIONS)}


def train_profile_table(train):
    """(header, rows) of the train's ``profile.csv``: the bed number, the position from the first bed's
    inlet, the position in the bed, the conversion on the key species fed so far, then the single-tube
    columns of each bed (their ``conversion_KEY`` on that bed's inlet, ``heat_added_W`` from that bed's inlet)."""
    header0, _ = train.beds[0].profile_table()
    key = train.key_species
    header = ["bed", "position_m", "bed_position_m", f"train_conversion_{key}"]
    header += [h if h != f"conversion_{key}" else f"bed_conversion_{key}" for h in header0[1:]]
    rows, start = [], 0.0
    for k, result in enumerate(train.beds):
        _, bed_rows = result.profile_table()
        X = train.path_conversion(k)
        for row, x in zip(bed_rows, X):
            rows.append([k + 1, start + row[0], row[0], x] + row[1:])
        start += float(result.z[-1])
    return header, rows


def write_train_run(train, out_dir):
    """Write ``summary.json`` and ``profile.csv`` (``profile_until_failure.csv`` if failed); returns the paths."""
    out = Path(out_dir)
    header, rows = train_profile_table(train)
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(header)
    for row in rows:
        writer.writerow([str(row[0])] + [_fmt(v) for v in row[1:]])
    summary = atomic_write_json(out / "summary.json", train_summary(train))
    if train.status == "failed":
        stale = out / "profile.csv"
        if stale.exists():
            stale.unlink()
        return [summary, atomic_write_text(out / "profile_until_failure.csv", buffer.getvalue())]
    return [summary, atomic_write_text(out / "profile.csv", buffer.getvalue())]


def _fmt(value):
    value = float(value)
    return "" if value != value else repr(value)


def print_train_summary(train, stream=None):
    """Print one table per bed, the interstage steps and the overall line."""
    import sys

    stream = stream or sys.stdout
    s = train_summary(train)
    t = s["train"]
    print(f"{s['title']}\n  train             {len(train.case.train)} beds: {s['status']}: {s['termination']}",
          file=stream)
    steps = {step["after_bed"]: step for step in t["interstage"]}
    for k, result in enumerate(train.beds):
        print(f"bed {k + 1}", file=stream)
        print_summary(result, stream=_Indented(stream))
        X = t["beds"][k]["conversion_on_fed"]
        if X is not None:
            print(f"    on the key species fed so far: X({s['key_species']}) = {X:.4f}", file=stream)
        step = steps.get(k + 1)
        if step is not None:
            print(f"after bed {k + 1}: {_step_line(step)}", file=stream)
    if t["overall_conversion"] is None:
        why = "the train failed" if s["status"] == "failed" else "the train stopped before its last outlet"
        print(f"overall             not computed: {why}", file=stream)
    else:
        c = t["closure"]
        print(f"overall             X({s['key_species']}) = {t['overall_conversion']:.4f} on everything fed; "
              f"outlet T = {t['outlet']['temperature_K']:.2f} K, P = {t['outlet']['pressure_Pa'] / 1e5:.4f} bar",
              file=stream)
        print(f"  duties            beds {t['bed_duty_W']:.6g} W, interstage {t['interstage_duty_W']:.6g} W; "
              f"closure over the train: elements {c['elements_relative']:.1e}, energy {c['energy_relative']:.1e}",
              file=stream)
        d = t["design"]
        if d["target_conversion"] is not None:
            word = "reached" if d["reached"] else "not reached"
            print(f"  target X = {d['target_conversion']:.4g}    {word} at the train outlet", file=stream)
    for w in s["warnings"]:
        print(f"  warning: {w}", file=stream)
    print(f"  caution: {TRAIN_CAUTIONS[0]}", file=stream)


def _step_line(step):
    if step["kind"] == "quench":
        return (f"quench {step['added_molar_flow_mol_per_s']:.6g} mol/s at {step['added_temperature_K']:.2f} K: "
                f"{step['inlet_temperature_K']:.2f} K -> {step['outlet_temperature_K']:.2f} K (adiabatic mixing)")
    return (f"{step['kind']} {step['outlet_temperature_K']:.2f} K from {step['inlet_temperature_K']:.2f} K, "
            f"duty {step['duty_W']:.6g} W")


class _Indented:
    """A text stream that indents every line written to it by two spaces (a bed's table in the train's)."""

    def __init__(self, stream):
        self.stream = stream

    def write(self, text):
        self.stream.write("\n".join(("  " + line) if line else line for line in text.split("\n")))

    def flush(self):
        self.stream.flush()
