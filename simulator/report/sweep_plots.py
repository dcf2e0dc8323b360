"""Plots of sweep and uncertainty results (SVG text, black-and-white readable)."""
import numpy as np

from simulator.report.plots import _HEIGHT, _literal, _new_figure, _rc


def _svg(fig):
    import io

    buffer = io.StringIO()
    fig.savefig(buffer, format="svg")
    return buffer.getvalue()


def runaway_map_svg(x, y, rise, boundary_x, xlabel, ylabel, title, stopped=None):
    """Hot-spot rise over a 2-D grid with the runaway boundary; returns SVG text.

    Parameters
    ----------
    x : ndarray
        Grid values along the horizontal axis (display units), [-]
    y : ndarray
        Grid values along the vertical axis (display units), [-]
    rise : ndarray
        Hot-spot rise above the medium, shape (len(y), len(x)), [K]
    boundary_x : ndarray
        Critical x for each y (NaN where none), [-]
    xlabel : str
        Axis label with unit, [-]
    ylabel : str
        Axis label with unit, [-]
    title : str
        Plot title (case text, drawn literally), [-]
    stopped : ndarray, optional
        Boolean mask of runs stopped by the runaway guard, [-]

    Returns
    -------
    svg : str
        The figure as SVG text, [-]
    """
    with _rc("runaway-map"):
        fig, ax = _new_figure(height=4.2)
        mesh = ax.pcolormesh(x, y, rise, shading="nearest", cmap="Greys", rasterized=True)
        cbar = fig.colorbar(mesh, ax=ax)
        cbar.set_label("Hot-spot rise above the medium [K]")
        levels = [lv for lv in (10, 30, 100, 300) if np.nanmin(rise) < lv < np.nanmax(rise)]
        if levels:
            contours = ax.contour(x, y, rise, levels=levels, colors="black", linewidths=0.6, linestyles=":")
            ax.clabel(contours, fmt="%g K", fontsize=7)
        ok = np.isfinite(boundary_x)
        if ok.any():
            ax.plot(boundary_x[ok], np.asarray(y)[ok], "k-", lw=2.2, label="runaway boundary (max of s)")
            ax.plot(boundary_x[ok], np.asarray(y)[ok], "w--", lw=1.0)
        if stopped is not None and np.any(stopped):
            X, Y = np.meshgrid(x, y)
            ax.plot(X[stopped], Y[stopped], "kx", ms=3, label="stopped at the runaway guard")
        ax.set_xlabel(_literal(xlabel))
        ax.set_ylabel(_literal(ylabel))
        ax.set_title(_literal(title, 80))
        if ok.any() or (stopped is not None and np.any(stopped)):
            ax.legend(loc="best", fontsize=7, framealpha=0.9)
        return _svg(fig)


def exceedance_svg(hot_spots, limit, title, note=""):
    """Empirical exceedance curve P(T* > T) with the limit and p5/p50/p95 marked; returns SVG text.

    Parameters
    ----------
    hot_spots : ndarray
        Hot-spot temperatures of the runs in the probability's denominator (runs stopped at
        the runaway guard with their stop temperature), [K]
    limit : float
        Design temperature limit, [K]
    title : str
        Plot title, [-]
    note : str
        Lines printed under the axes: how many samples, what was left out, [-]

    Returns
    -------
    svg : str
        The figure as SVG text, [-]
    """
    T = np.sort(np.asarray(hot_spots, dtype=float))
    n = len(T)
    with _rc("exceedance"):
        fig, ax = _new_figure(height=_HEIGHT + 0.16 * len(note.splitlines()))
        if n:
            ax.step(T, 1.0 - np.arange(1, n + 1) / n, where="post", color="black", lw=1.4,
                    label=f"P(T* > T), {n} runs")
            for q, style in ((5, ":"), (50, "-."), (95, "--")):
                v = np.percentile(T, q)
                ax.axvline(v, color="0.35", ls=style, lw=1, label=f"p{q} = {v:.1f} K")
        else:
            ax.text(0.5, 0.5, "no run gave a hot spot", transform=ax.transAxes, ha="center", va="center")
        if np.isfinite(limit):
            ax.axvline(limit, color="black", lw=2, label=f"temperature limit {limit:.1f} K")
        ax.set_xlabel("Hot-spot temperature T [K]")
        ax.set_ylabel("Probability of exceeding [-]")
        ax.set_ylim(-0.02, 1.02)
        ax.set_title(_literal(title, 80))
        ax.legend(loc="best", fontsize=7)
        if note:          # a child of the axes, so the constrained layout makes room below the label
            ax.text(0.0, -0.16, "\n".join(_literal(line, 110) for line in note.splitlines()),
                    transform=ax.transAxes, fontsize=7, ha="left", va="top")
        return _svg(fig)


def exceedance_note(result):
    """Text under the exceedance figure: samples, the probability with its denominator, what was left out.

    Parameters
    ----------
    result : dict
        Content of ``uncertainty.json``.

    Returns
    -------
    str
        Two or three lines, [-]
    """
    samples = result["samples"]
    p = result["probability_exceeding_limit"]
    left = p.get("left_out", {})
    left_text = ", ".join(f"{v} {k.replace('_', ' ')}" for k, v in left.items() if v) or "nothing"
    lines = [f"{samples['n']} samples; curve and probability over {p['n']} runs; left out: {left_text}"]
    if p["estimate"] is not None:
        lo, hi = p["interval"]
        lines.append(f"P(T* > {result['temperature_limit_K']:.1f} K) = {p['exceeding']}/{p['n']} = {p['estimate']:.4f} "
                     f"({100 * p['confidence']:.0f} % interval {lo:.4f} to {hi:.4f})")
    stopped = p.get("denominator_counts", {}).get("stopped_at_guard_counted_exceeding", 0)
    if stopped:
        lines.append(f"{stopped} runs stopped at the runaway guard count as exceeding (at their stop temperature)")
    return "\n".join(lines)


def _base_temperature(raw, path):
    from simulator.sweeps.paths import get_path
    from simulator.units import parse_quantity

    try:
        return parse_quantity(get_path(raw, path), "temperature", path)
    except Exception:  # noqa: BLE001 - the field may be absent (uncooled case)
        return float("nan")


def _label(path):
    from simulator.report.context_format import path_label

    return path_label(path)


def write_sweep_figures(out_dir, raw):
    """Write the sweep's figure next to its results and return the paths written.

    Two varied parameters give ``runaway_map.svg`` (first --vary along x, the second
    along y, boundary along x for every y); one gives ``hot_spot_sweep.svg``.
    """
    from pathlib import Path

    from simulator.fileio import atomic_write_text
    from simulator.sweeps.boundary import boundary_along, boundary_on_grid
    from simulator.sweeps.store import ResultsStore

    out = Path(out_dir)
    varied = ResultsStore.read_meta(out / "results.sqlite").get("varied_paths", [])
    with ResultsStore(out / "results.sqlite", varied) as store:
        paths = store.varied_paths
        rows = store.rows()
    title = raw.get("title", "")
    cool = "heat.medium.temperature"

    def reference(row):
        if cool in row:
            return row[cool]
        base = _base_temperature(raw, cool)
        return base if np.isfinite(base) else _base_temperature(raw, "feed.temperature")

    written = []
    if len(paths) == 2:
        xs = np.array(sorted({r[paths[0]] for r in rows}))
        ys = np.array(sorted({r[paths[1]] for r in rows}))
        T = np.full((len(ys), len(xs)), np.nan)
        rise = np.full_like(T, np.nan)
        stopped = np.zeros_like(T, dtype=bool)
        ix = {v: i for i, v in enumerate(xs)}
        iy = {v: i for i, v in enumerate(ys)}
        for r in rows:
            i, j = iy[r[paths[1]]], ix[r[paths[0]]]
            if r["hot_spot_temperature_K"] is not None and r["status"] not in ("failed", "invalid"):
                T[i, j] = r["hot_spot_temperature_K"]
                rise[i, j] = T[i, j] - reference(r)
                stopped[i, j] = r["status"] == "stopped"
        boundary = boundary_on_grid(xs, ys, T)
        svg = runaway_map_svg(xs, ys, rise, boundary, _label(paths[0]), _label(paths[1]), title, stopped=stopped)
        written.append(atomic_write_text(out / "runaway_map.svg", svg))
    elif len(paths) == 1:
        pts = sorted((r[paths[0]], r["hot_spot_temperature_K"]) for r in rows
                     if r["status"] not in ("failed", "invalid") and r["hot_spot_temperature_K"] is not None)
        if len(pts) >= 2:
            x = np.array([p[0] for p in pts])
            T = np.array([p[1] for p in pts])
            xc, _ = boundary_along(x, T)
            from simulator.report.plots import sensitivity_plot

            uri = sensitivity_plot(x, T, critical_x=None if not np.isfinite(xc) else xc, xlabel=_label(paths[0]),
                                   ylabel="Hot-spot temperature [K]", title=title)
            import base64

            svg = base64.b64decode(uri.split(",", 1)[1]).decode("utf-8")
            written.append(atomic_write_text(out / "hot_spot_sweep.svg", svg))
    return written


def write_uncertainty_figure(out_dir, raw, result):
    """Write ``exceedance.svg`` next to the uncertainty results; return its path."""
    from pathlib import Path

    from simulator.fileio import atomic_write_text
    from simulator.sweeps.store import ResultsStore

    from simulator.sweeps.sampling import split_for_exceedance

    out = Path(out_dir)
    varied = ResultsStore.read_meta(out / "results.sqlite").get("varied_paths", [])
    with ResultsStore(out / "results.sqlite", varied) as store:
        parts = split_for_exceedance(store.rows(), result["temperature_limit_K"])
    hot = [r["hot_spot_temperature_K"] for r in parts["completed"] + parts["stopped_over"]]
    svg = exceedance_svg(hot, result["temperature_limit_K"], raw.get("title", ""), note=exceedance_note(result))
    return atomic_write_text(out / "exceedance.svg", svg)
