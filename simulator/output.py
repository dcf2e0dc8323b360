"""Write a run's files (summary.json, profile.csv) atomically and print its table."""
import csv
import io
from pathlib import Path

from simulator.fileio import atomic_write_json, atomic_write_text


def write_run(result, out_dir):
    """Write ``summary.json`` and ``profile.csv`` of a result into ``out_dir``; returns the paths."""
    out = Path(out_dir)
    header, rows = result.profile_table()
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(header)
    for row in rows:
        writer.writerow([_fmt(v) for v in row])
    if result.status == "failed":
        # the partial trajectory helps to see where it went wrong, under a name that says so; a
        # profile.csv of an earlier run in this folder would contradict summary.json, so it goes
        stale = out / "profile.csv"
        if stale.exists():
            stale.unlink()
        return [atomic_write_json(out / "summary.json", result.summary()),
                atomic_write_text(out / "profile_until_failure.csv", buffer.getvalue())]
    paths = [atomic_write_json(out / "summary.json", result.summary()),
             atomic_write_text(out / "profile.csv", buffer.getvalue())]
    return paths


def _fmt(value):
    value = float(value)
    return "" if value != value else repr(value)


def _f(value, spec, unit=""):
    """A number for the table with its unit, or "not computed" (never a format error on None)."""
    return "not computed" if value is None else f"{value:{spec}}{unit}"


def print_summary(result, stream=None):
    """Print the short result table a user reads first."""
    import sys

    s = result.summary()
    stream = stream or sys.stdout
    if s["status"] == "failed":
        print(f"{s['title']}\n  status            FAILED: {s['termination']}\n"
              "  no results: the integration did not reach the end of the tube", file=stream)
        return
    o, h, d = s["outlet"], s["hot_spot"], s["design"]
    if result.case.heat.mode == "isothermal":
        hot = f"  hot spot          none: isothermal tube at {_f(h['temperature_K'], '.2f', ' K')}"
    else:
        hot = (f"  hot spot          {_f(h['temperature_K'], '.2f', ' K')} at z = {_f(h['position_m'], '.4g', ' m')} "
               f"({_f(h['rise_above_feed_K'], '+.2f', ' K')} above feed; {h['located_by']})")
    pressure = None if o["pressure_Pa"] is None else o["pressure_Pa"] / 1e5
    lines = [
        f"{s['title']}",
        f"  status            {s['status']}: {s['termination']}",
        f"  outlet            X({s['key_species']}) = {_f(o['conversion'], '.4f')}   T = "
        f"{_f(o['temperature_K'], '.2f', ' K')}   P = {_f(pressure, '.4f', ' bar')}   (z = {_f(o['position_m'], '.4g', ' m')})",
        hot,
    ]
    lines += result.extra.get("summary_lines", [])     # e.g. the 2-D model's cup-mixing maximum
    if d["target_conversion"] is not None:
        if d["reached"] and d["length_m"] is None:
            lines.append(f"  target X = {d['target_conversion']:.4g}    met at the outlet of this tube; "
                         f"{d.get('length_note', 'no length to the target')}")
        elif d["reached"]:
            extra = f", catalyst {d['catalyst_mass_kg']:.4g} kg" if d["catalyst_mass_kg"] is not None else ""
            lines.append(f"  target X = {d['target_conversion']:.4g}    reached at L = {d['length_m']:.4g} m, "
                         f"V = {d['volume_m3']:.4g} m3 (all tubes){extra}")
        else:
            lines.append(f"  target X = {d['target_conversion']:.4g}    not reached in this tube")
    if "ignition" in s:                  # a mechanism run (simulator.mechanism.run)
        ig = s["ignition"]
        lines.append("  ignition          none (no rise of 50 K above the feed or medium)" if ig is None else
                     f"  ignition          z = {ig['position_m']:.4g} m, residence time {ig['residence_time_s']:.4g} s, "
                     f"T = {ig['temperature_K']:.2f} K (largest dT/dz)")
    rise = s["adiabatic_temperature_rise_K"]
    if rise is not None:
        bound = (", an upper bound: reversible reactions taken to completion"
                 if any(r.reversible for r in result.case.reactions) else "")
        lines.append(f"  adiabatic rise    {rise:+.1f} K (complete conversion of {s['key_species']}{bound})")
    elif s["adiabatic"]:
        lines.append(f"  adiabatic rise    not defined: {s['adiabatic']['note']} (complete conversion of "
                     f"{s['key_species']} cannot happen adiabatically)")
    if s.get("products"):
        lines.append("  products          " + "; ".join(
            f"{name}: yield {_f(v['yield'], '.4f')}, selectivity {_f(v['selectivity'], '.4f')}"
            for name, v in s["products"].items()) + f" (on {s['key_species']})")
    if s.get("max_wall_temperature_K") is not None:
        w = s["wall"]
        lines.append(f"  tube wall         hottest {w['max_wall_temperature_K']:.2f} K at z = "
                     f"{w['max_wall_temperature_position_m']:.4g} m; U {w['overall_coefficient_W_per_m2K']['min']:.4g} to "
                     f"{w['overall_coefficient_W_per_m2K']['max']:.4g} W/(m^2*K)"
                     if w.get("overall_coefficient_W_per_m2K") else
                     f"  tube wall         hottest {w['max_wall_temperature_K']:.2f} K at z = "
                     f"{w['max_wall_temperature_position_m']:.4g} m")
    boiling = s.get("boiling")
    if boiling and boiling.get("checked"):
        lines.append(f"  boiling check     bubble pressure at most {boiling['max_bubble_to_pressure_ratio']:.3g} x the local "
                     f"pressure (z = {boiling['position_m']:.4g} m)" + ("; the liquid boils" if boiling["boils_from_m"]
                                                                          is not None else ""))
    c = s["closure"]
    lines.append(f"  closure           elements {_f(c['elements_relative'], '.1e')}, energy "
                 f"{_f(c['energy_relative'], '.1e')}")
    for w in s["warnings"]:
        lines.append(f"  warning: {w}")
    print("\n".join(lines), file=stream)
