"""Temperature-conversion diagram of a reactor train, with the equilibrium curve of the key reaction.

The path: each bed as its temperature against the conversion of the key species on what has been
fed so far (:meth:`simulator.solve.train.TrainResult.path_conversion`), joined by the interstage
steps (a cool-to or heat-to step is horizontal; a quench drops the conversion, since fresh key
species is mixed in, and moves the temperature to the mixed temperature).

The equilibrium curve: where the case has exactly one reversible reaction consuming the key
species (:func:`simulator.network.equilibrium_reaction`), its equilibrium conversion against
temperature (:func:`simulator.network.equilibrium_conversion`, the case's own K from the NASA-7
rows, ideal gas, the other reactions held at zero extent) from the composition of everything the
train is fed and at the pressure of bed 1's inlet. Otherwise no curve is drawn and the figure says why.

Black-and-white readable: the beds differ by line style and marker, the curve is a thick grey line
with its own label; no text of the case is read as mathtext (see :mod:`simulator.report.plots`).
"""
import math

import numpy as np

from simulator.network import equilibrium_conversion, equilibrium_reaction
from simulator.report.plots import _literal, _new_figure, _salt, _style, _to_uri
from simulator.thermo.species_data import build_species_data

#: Points of the equilibrium curve, [-]
CURVE_POINTS = 121


def train_path_data(train):
    """The diagram's numbers (SI): the path of every bed, the steps and the equilibrium curve.

    Parameters
    ----------
    train : simulator.solve.train.TrainResult
        A train run (the beds that ran are drawn).

    Returns
    -------
    dict
        ``beds``: list of (T [K], X [-]) arrays; ``steps``: list of ((T_from, X_from), (T_to, X_to));
        ``equilibrium``: (T [K], X_eq [-]) arrays or None; ``equilibrium_note``: why there is no curve
        (or what it is computed for); ``pressure``: the curve's pressure [Pa].
    """
    beds = [(np.asarray(b.T, dtype=float), np.asarray(train.path_conversion(k), dtype=float))
            for k, b in enumerate(train.beds)]
    steps = []
    for step in train.interstages:
        k = step.after_bed                     # 1-based bed before the step; bed k (0-based) after it
        if k >= len(train.beds):
            break
        X_from = float(beds[k - 1][1][-1])
        X_to = float(beds[k][1][0])
        steps.append(((step.inlet_temperature, X_from), (step.outlet_temperature, X_to)))
    case = train.case
    P = float(train.beds[0].P[0])
    j = equilibrium_reaction(case)
    out = {"beds": beds, "steps": steps, "equilibrium": None, "pressure": P, "equilibrium_note": ""}
    if j is None:
        out["equilibrium_note"] = (f"no equilibrium curve: the case has no single reversible reaction consuming "
                                   f"{case.design.key_species}")
        return out
    T_all = np.concatenate([T for T, _ in beds])
    lo, hi = float(np.min(T_all)), float(np.max(T_all))
    span = max(hi - lo, 20.0)
    temperatures = np.linspace(lo - 0.1 * span, hi + 0.15 * span, CURVE_POINTS)
    species = build_species_data(case.species, case.thermo)
    X_eq = np.array([equilibrium_conversion(case, T, P, species.nasa7, species.names, train.fresh_flows)
                     for T in temperatures])
    out["equilibrium"] = (temperatures, X_eq)
    out["equilibrium_note"] = (f"equilibrium of {case.reactions[j].equation} from the composition of everything "
                               f"fed, at {P / 1e5:.4g} bar")
    return out


def train_path_svg(train, title=None):
    """The temperature-conversion diagram as SVG text.

    Parameters
    ----------
    train : simulator.solve.train.TrainResult
        A train run.
    title : str, optional
        Figure title (default the case title), [-]
    """
    import base64

    uri = train_path_plot(train, title=title)
    return base64.b64decode(uri.split(",", 1)[1]).decode("utf-8")


def train_path_plot(train, title=None):
    """The temperature-conversion diagram as a ``data:image/svg+xml;base64,...`` URI (as the report's figures).

    Parameters
    ----------
    train : simulator.solve.train.TrainResult
        A train run.
    title : str, optional
        Figure title (default the case title), [-]
    """
    data = train_path_data(train)
    fig, ax = _new_figure(height=3.6)
    key = _literal(train.key_species)
    for k, (T, X) in enumerate(data["beds"]):
        style = _style(k)
        ax.plot(T, X, linestyle=style["linestyle"], color=style["color"], marker=style["marker"],
                markevery=[len(T) - 1], label=f"bed {k + 1}")
    for (T0, X0), (T1, X1) in data["steps"]:
        ax.annotate("", xy=(T1, X1), xytext=(T0, X0),
                    arrowprops={"arrowstyle": "->", "linestyle": ":", "color": "#444444", "linewidth": 1.0})
    if data["equilibrium"] is not None:
        T_eq, X_eq = data["equilibrium"]
        ok = np.isfinite(X_eq)
        ax.plot(T_eq[ok], X_eq[ok], color="#888888", linewidth=3.0, alpha=0.8, label="equilibrium")
    ax.set_xlabel("Temperature [K]")
    ax.set_ylabel(f"Conversion of {key} on what is fed so far [-]")
    ax.set_ylim(0.0, 1.02)
    ax.set_title(_literal(title if title is not None else train.case.title))
    ax.legend(loc="best")
    note = _literal(data["equilibrium_note"], limit=110)
    if note:
        ax.text(0.01, -0.22, note, transform=ax.transAxes, fontsize=7.0, va="top")
    X_last = float(data["beds"][-1][1][-1]) if data["beds"] else math.nan
    return _to_uri(fig, _salt(train.case.title, str(X_last), str(len(data["beds"]))))
