"""Report figures: matplotlib -> SVG -> ``data:image/svg+xml;base64,...`` URI.

Every function returns a URI string that the report template places in an
``<img src="...">``; nothing is written to disk and nothing global is changed:
figures are built with :class:`matplotlib.figure.Figure` (no pyplot, no backend
switch) and saved inside a :func:`matplotlib.rc_context` with
``svg.fonttype = "none"`` (text stays text: small, sharp, searchable) and a
per-figure ``svg.hashsalt`` (deterministic element ids, so two renders of the
same data give the same bytes).

Figures are readable in black and white: every series differs by line style
and marker, not by colour alone, and marked points carry a text label.

All caller-supplied strings (titles, labels, legend entries) are drawn
literally: ``$`` never switches on mathtext, so case text such as a title with
a dollar sign cannot break a figure. matplotlib escapes ``<``, ``>`` and ``&``
in the SVG it writes.

Inputs are SI floats (positions [m], temperatures [K]) except where a
function says that the caller passes display values (``profile_lines_plot``,
``bar_plot``: the caller chooses the unit and names it in ``ylabel``).
"""
import base64
import hashlib
import io

import numpy as np

#: Line styles and markers cycled through series; distinct in black and white.
_STYLES = (
    ("-", "o"), ("--", "s"), (":", "^"), ("-.", "D"),
    ((0, (5, 1, 1, 1, 1, 1)), "v"), ((0, (1, 3)), "x"), ((0, (8, 3)), "+"),
)
#: Dark, print-friendly colours (also distinct in grey levels with the styles above).
_COLOURS = ("#1b1b1b", "#1f4e8c", "#a1331b", "#2e6b30", "#6b3d8c", "#8c6b1f", "#444444")

_WIDTH = 6.4    # figure width [in]; the report scales images to the text width
_HEIGHT = 3.0   # figure height [in]

_RC = {
    "svg.fonttype": "none",
    "font.family": "DejaVu Sans",
    "font.size": 9.0,
    "axes.titlesize": 9.5,
    "axes.labelsize": 9.0,
    "legend.fontsize": 8.0,
    "xtick.labelsize": 8.0,
    "ytick.labelsize": 8.0,
    "axes.grid": True,
    "grid.color": "#c8c8c8",
    "grid.linewidth": 0.5,
    "axes.linewidth": 0.8,
    "lines.linewidth": 1.5,
    "lines.markersize": 5.0,
    "legend.frameon": True,
    "legend.framealpha": 0.9,
    "legend.edgecolor": "#888888",
}

_TEMPERATURE_UNITS = {"K": ("K", 0.0), "degC": ("°C", -273.15)}


def _literal(text, limit=90):
    """Return caller text made safe to draw: literal ``$``, at most ``limit`` characters.

    Parameters
    ----------
    text : str or None
        Caller text (may be case text), [-]
    limit : int
        Longest text kept; longer text is cut and ends in an ellipsis (the
        report's HTML carries the full text), [-]

    Returns
    -------
    str or None
        Text that matplotlib draws as given (no mathtext), [-]
    """
    if text is None:
        return None
    text = " ".join(str(text).split())
    if len(text) > limit:
        text = text[: limit - 1] + "\u2026"
    return text.replace("$", r"\$")


def _new_figure(height=_HEIGHT):
    """Return a matplotlib ``Figure`` (not registered with pyplot) and its axes."""
    from matplotlib.figure import Figure

    with _rc():
        fig = Figure(figsize=(_WIDTH, height), layout="constrained")
        ax = fig.add_subplot()
    return fig, ax


def _rc(salt="tubesim"):
    import matplotlib

    return matplotlib.rc_context({**_RC, "svg.hashsalt": salt})


def _style(i):
    line, marker = _STYLES[i % len(_STYLES)]
    return {"linestyle": line, "marker": marker, "color": _COLOURS[i % len(_COLOURS)]}


def _markevery(n):
    """Marker spacing giving about 8 markers per curve."""
    return max(1, int(n) // 8)


def _to_uri(fig, salt_source):
    """Save ``fig`` as SVG and return a base64 ``data:`` URI.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        The finished figure, [-]
    salt_source : bytes
        Bytes identifying the figure content; hashed into ``svg.hashsalt``, [-]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...``, [-]
    """
    salt = hashlib.sha256(salt_source).hexdigest()[:16]
    buffer = io.BytesIO()
    with _rc(salt):
        fig.savefig(buffer, format="svg", metadata={"Date": None})
    encoded = base64.b64encode(buffer.getvalue()).decode("ascii")
    return f"data:image/svg+xml;base64,{encoded}"


def _salt(*parts):
    digest = hashlib.sha256()
    for part in parts:
        if part is None:
            digest.update(b"\x00none")
        elif isinstance(part, np.ndarray):
            digest.update(np.ascontiguousarray(part, dtype=float).tobytes())
        else:
            digest.update(repr(part).encode("utf-8"))
    return digest.digest()


def _as_1d(name, values, n=None):
    array = np.asarray(values, dtype=float).reshape(-1)
    if array.size == 0:
        raise ValueError(f"plot data {name}: empty array; expected at least one value.")
    if n is not None and array.size != n:
        raise ValueError(
            f"plot data {name}: {array.size} values; expected {n} (one per axial position)."
        )
    return array


def _temperature_unit(temperature_unit):
    if temperature_unit not in _TEMPERATURE_UNITS:
        raise ValueError(
            f"temperature_unit = {temperature_unit!r}: unknown; choose one of: "
            f"{', '.join(sorted(_TEMPERATURE_UNITS))}."
        )
    return _TEMPERATURE_UNITS[temperature_unit]


def limit_is_far(limit, values):
    """True when a limit line would stretch the axis: farther from the data than their own span.

    The axis is scaled to the data; a limit farther away than the larger of
    the data span and 10 (in the data's unit) is marked by an arrow and a
    legend entry instead of a line (common practice, no source).

    Parameters
    ----------
    limit : float
        Limit value, in the unit of ``values``
    values : array_like
        Plotted data, [-]

    Returns
    -------
    bool
        Whether the limit lies off the data-scaled axis, [-]
    """
    values = np.asarray(values, dtype=float)
    values = values[np.isfinite(values)]
    if values.size == 0:
        return False
    low, high = float(values.min()), float(values.max())
    reach = max(high - low, 10.0)
    return limit > high + reach or limit < low - reach


def _temperature_limit(ax, limit, shown, symbol):
    """Draw the temperature limit: a line near the data, else an arrow and a legend entry.

    ``limit`` and the arrays in ``shown`` are in the displayed unit ``symbol``.
    """
    data = np.concatenate([np.asarray(v, dtype=float).reshape(-1) for v in shown])
    style = {"color": "#a1331b", "linestyle": (0, (6, 2)), "linewidth": 1.2}
    if not limit_is_far(limit, data):
        ax.axhline(limit, label="Temperature limit", **style)
        return
    above = limit > float(np.nanmax(data))
    ax.plot([], [], label=f"Limit {limit:.1f} {symbol}, off the scale {'above' if above else 'below'} (arrow)",
            **style)
    y_tip, y_tail = (1.0, 0.84) if above else (0.0, 0.16)
    ax.annotate("", xy=(0.985, y_tip), xytext=(0.985, y_tail), xycoords="axes fraction",
                arrowprops={"arrowstyle": "-|>", "color": "#a1331b", "linewidth": 1.4})


def profile_temperature_plot(z, T, medium_T=None, hot_spot=None, temperature_limit=None,
                             target_position=None, *, temperature_unit="K", title=None,
                             medium_label="Medium temperature", hot_spot_label="Hot spot"):
    """Axial temperature profile with hot spot, limit and target position marked.

    The temperature axis is scaled to the plotted temperatures; a limit far
    from them (:func:`limit_is_far`) is marked by an arrow at the edge of the
    axes and named with its value in the legend instead of stretching the axis.

    Parameters
    ----------
    z : array_like
        Axial positions, [m]
    T : array_like
        Process-side (bed) temperature at ``z``, [K]
    medium_T : array_like or float, optional
        Medium temperature at ``z`` (array) or constant medium temperature, [K]
    hot_spot : tuple of float, optional
        Position and temperature of the hot spot, ``(z_hot [m], T_hot [K])``
    temperature_limit : float, optional
        Highest allowed process temperature: a horizontal line near the data,
        an arrow off the scale otherwise, [K]
    target_position : float, optional
        Position where the target conversion is reached, drawn as a vertical line, [m]
    temperature_unit : {"K", "degC"}
        Unit shown on the axis; inputs are always kelvin, [-]
    title : str, optional
        Figure title, drawn literally (may be case text), [-]
    medium_label : str
        Legend text of the medium curve, e.g. "Heating-medium temperature"
        for a heated tube, drawn literally, [-]
    hot_spot_label : str
        Legend word of the marked maximum, e.g. "Highest temperature" where
        no reaction heat makes a hot spot, drawn literally, [-]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...`` URI of the SVG figure, [-]

    Raises
    ------
    ValueError
        If arrays are empty or of different lengths, or the unit is unknown.
    """
    symbol, offset = _temperature_unit(temperature_unit)
    z = _as_1d("z", z)
    T = _as_1d("T", T, z.size)
    fig, ax = _new_figure(_HEIGHT + 0.4)
    shown = [T + offset]
    with _rc():
        ax.plot(z, T + offset, label="Process (bed) temperature",
                markevery=_markevery(z.size), **_style(0))
        if medium_T is not None:
            medium = np.asarray(medium_T, dtype=float)
            if medium.ndim == 0:
                medium = np.full(z.size, float(medium))
            medium = _as_1d("medium_T", medium, z.size)
            shown.append(medium + offset)
            ax.plot(z, medium + offset, label=_literal(medium_label, 40),
                    markevery=_markevery(z.size), **_style(1))
        if temperature_limit is not None:
            _temperature_limit(ax, float(temperature_limit) + offset, shown, symbol)
        if target_position is not None:
            ax.axvline(float(target_position), color="#1f4e8c", linestyle=":", linewidth=1.4,
                       label="Target conversion reached")
        if hot_spot is not None:
            z_hot, T_hot = (float(v) for v in hot_spot)
            ax.plot([z_hot], [T_hot + offset], linestyle="none", marker="*", markersize=13,
                    markerfacecolor="white", markeredgecolor="black", markeredgewidth=1.2,
                    label=f"{_literal(hot_spot_label, 30)}: {T_hot + offset:.1f} {symbol} at z = {z_hot:.3g} m")
        ax.set_xlabel("Axial position z [m]")
        ax.set_ylabel(f"Temperature [{symbol}]")
        ax.set_xlim(z[0], z[-1])
        ax.margins(y=0.12)
        if title:
            ax.set_title(_literal(title))
        fig.legend(loc="outside lower center", ncols=2)
    return _to_uri(fig, _salt("temperature", z, T, medium_T if medium_T is None
                                 else np.asarray(medium_T, dtype=float).reshape(-1),
                                 hot_spot, temperature_limit, target_position,
                                 temperature_unit, title, medium_label, hot_spot_label))


def profile_lines_plot(z, series, ylabel, title=None, *, xlabel="Axial position z [m]",
                       log_y=False):
    """Several axial profiles on one axis (conversion, pressure, mole fractions).

    The caller passes values already in the unit named in ``ylabel`` (for
    example pressure converted to bar in the report context).

    Parameters
    ----------
    z : array_like
        Axial positions, [m]
    series : dict of str to array_like
        Legend label (drawn literally) -> values at ``z``, in the unit named in ``ylabel``
    ylabel : str
        Axis label including the unit, e.g. ``"Pressure [bar]"``, [-]
    title : str, optional
        Figure title, drawn literally, [-]
    xlabel : str
        Horizontal axis label, [-]
    log_y : bool
        Logarithmic vertical axis (useful for mole fractions spanning decades), [-]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...`` URI of the SVG figure, [-]

    Raises
    ------
    ValueError
        If ``series`` is empty or an array length differs from ``z``.
    """
    z = _as_1d("z", z)
    if not series:
        raise ValueError("plot data series: empty; expected at least one {label: values}.")
    fig, ax = _new_figure()
    arrays = []
    with _rc():
        for i, (label, values) in enumerate(series.items()):
            y = _as_1d(f"series[{label!r}]", values, z.size)
            arrays.append(y)
            ax.plot(z, y, label=_literal(label, 40), markevery=_markevery(z.size), **_style(i))
        ax.set_xlabel(_literal(xlabel, 70))
        ax.set_ylabel(_literal(ylabel, 50))
        ax.set_xlim(z[0], z[-1])
        if log_y:
            ax.set_yscale("log")
        else:
            ax.ticklabel_format(axis="y", useOffset=False)   # no "+9.99e1" offset: ticks read as values
        if title:
            ax.set_title(_literal(title))
        ax.legend(loc="best", ncols=2 if len(series) > 4 else 1)
    return _to_uri(fig, _salt("lines", z, *arrays, tuple(series), ylabel, title, xlabel, log_y))


def split_minor_species(fractions, minor_share=0.1):
    """Split species into major and minor ones by their largest mole fraction along the tube.

    A species is minor when its largest mole fraction stays below ``minor_share``
    times the largest mole fraction of any species: on a linear axis scaled to
    the main species it would hug zero (common practice, no source).

    Parameters
    ----------
    fractions : dict of str to array_like
        Species name -> mole fraction at each axial position, [-]
    minor_share : float
        Share of the largest mole fraction below which a species is minor, [-]

    Returns
    -------
    tuple of (list of str, list of str, list of str)
        Major species, minor species (present somewhere) and species absent
        (zero everywhere), each in the order given, [-]
    """
    peaks = {name: float(np.nanmax(np.asarray(values, dtype=float))) for name, values in fractions.items()}
    top = max([v for v in peaks.values() if v > 0.0], default=0.0)
    major, minor, absent = [], [], []
    for name, peak in peaks.items():
        if not peak > 0.0:
            absent.append(name)
        elif peak < minor_share * top:
            minor.append(name)
        else:
            major.append(name)
    return major, minor, absent


def mole_fraction_plot(z, fractions, *, minor_share=0.1, title=None):
    """Mole fractions along the tube: major species on a linear axis, minor ones on a log axis below.

    A minor species (:func:`split_minor_species`) would hug zero on a linear
    axis; it goes to a second panel with a logarithmic axis that spans
    at most eight decades below the largest minor fraction. Species absent
    everywhere are left out (the caller says so in the caption).

    Parameters
    ----------
    z : array_like
        Axial positions, [m]
    fractions : dict of str to array_like
        Species name (drawn literally) -> mole fraction at ``z``, [-]
    minor_share : float
        Threshold of :func:`split_minor_species`, [-]
    title : str, optional
        Figure title, drawn literally, [-]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...`` URI of the SVG figure, [-]

    Raises
    ------
    ValueError
        If no species is present or an array length differs from ``z``.
    """
    from matplotlib.figure import Figure

    z = _as_1d("z", z)
    arrays = {name: _as_1d(f"fractions[{name!r}]", v, z.size) for name, v in fractions.items()}
    major, minor, _ = split_minor_species(arrays, minor_share)
    if not major and not minor:
        raise ValueError("plot data fractions: no species present; expected at least one positive fraction.")
    panels = [(names, log) for names, log in ((major, False), (minor, True)) if names]
    with _rc():
        fig = Figure(figsize=(_WIDTH, _HEIGHT if len(panels) == 1 else _HEIGHT * 1.75), layout="constrained")
        axes = fig.subplots(len(panels), 1, sharex=True, squeeze=False)[:, 0]
        style = 0
        for ax, (names, log) in zip(axes, panels):
            for name in names:
                y = arrays[name]
                if log:
                    y = np.where(y > 0.0, y, np.nan)
                ax.plot(z, y, label=_literal(name, 40), markevery=_markevery(z.size), **_style(style))
                style += 1
            if log:
                ax.set_yscale("log")
                top = max(float(np.nanmax(arrays[n])) for n in names)
                low = min(float(np.nanmin(np.where(arrays[n] > 0.0, arrays[n], np.inf))) for n in names)
                ax.set_ylim(max(low, top * 1e-8) / 1.5, top * 1.5)
                ax.set_ylabel("Mole fraction [-] (log)")
            else:
                ax.set_ylabel("Mole fraction [-]")
            ax.set_xlim(z[0], z[-1])
            ax.legend(loc="best", ncols=2 if len(names) > 4 else 1)
        axes[-1].set_xlabel("Axial position z [m]")
        if title:
            axes[0].set_title(_literal(title))
    return _to_uri(fig, _salt("fractions", z, *arrays.values(), tuple(arrays), minor_share, title))


def _unit_of(label):
    """' K' from 'Medium temperature [K]'; '' for a dimensionless or unit-less label."""
    if label.endswith("]") and "[" in label:
        unit = label[label.rindex("[") + 1:-1].strip()
        return "" if unit in ("-", "") else f" {unit}"
    return ""


def sensitivity_plot(x, hot_spot_T, current_x=None, critical_x=None, *,
                     xlabel="Medium temperature [K]", ylabel="Hot-spot temperature [K]",
                     title=None, x_offset=0.0, y_offset=0.0):
    """Hot-spot temperature against one parameter, current and critical points marked.

    ``NaN`` entries in ``hot_spot_T`` (runs that stopped, e.g. on a temperature
    limit) leave gaps in the curve.

    Parameters
    ----------
    x : array_like
        Swept parameter values (e.g. medium temperature [K] or inlet mole
        fraction [-]), in the unit named in ``xlabel``
    hot_spot_T : array_like
        Hot-spot temperature for each ``x``, [K]
    current_x : float, optional
        Parameter value of the design case, marked with an open diamond; unit as ``x``
    critical_x : float, optional
        Critical value (runaway boundary) from the screening, marked with a
        dashed vertical line; unit as ``x``
    xlabel : str
        Horizontal axis label with unit, drawn literally, [-]
    ylabel : str
        Vertical axis label with unit, drawn literally, [-]
    title : str, optional
        Figure title, drawn literally, [-]
    x_offset : float
        Added to ``x``, ``current_x`` and ``critical_x`` for display (e.g. -273.15
        to show a medium temperature in degC); unit as ``x``
    y_offset : float
        Added to ``hot_spot_T`` for display (e.g. -273.15 for degC), [K]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...`` URI of the SVG figure, [-]

    Raises
    ------
    ValueError
        If the arrays are empty or of different lengths.
    """
    x = _as_1d("x", x)
    y = _as_1d("hot_spot_T", hot_spot_T, x.size)
    order = np.argsort(x)
    xs, ys = x[order] + x_offset, y[order] + y_offset
    fig, ax = _new_figure()
    with _rc():
        ax.plot(xs, ys, label="Hot-spot temperature", markersize=3.5,
                markevery=1 if xs.size <= 25 else _markevery(xs.size), **_style(0))
        if critical_x is not None:
            xc = float(critical_x) + x_offset
            ax.axvline(xc, color="#a1331b", linestyle="--", linewidth=1.4,
                       label=f"Critical value {xc:.4g}{_unit_of(xlabel)}")
        if current_x is not None:
            xd = float(current_x) + x_offset
            finite = np.isfinite(ys)
            if finite.sum() >= 2 and xs[finite][0] <= xd <= xs[finite][-1]:
                yd = float(np.interp(xd, xs[finite], ys[finite]))
                ax.plot([xd], [yd], linestyle="none", marker="D", markersize=9,
                        markerfacecolor="white", markeredgecolor="black", markeredgewidth=1.8,
                        label=f"Design case {xd:.4g}{_unit_of(xlabel)}")
            else:
                ax.axvline(xd, color="black", linestyle=":", linewidth=1.4,
                           label=f"Design case {xd:.4g}{_unit_of(xlabel)}")
        ax.set_xlabel(_literal(xlabel, 70))
        ax.set_ylabel(_literal(ylabel, 50))
        if title:
            ax.set_title(_literal(title))
        ax.legend(loc="best")
    return _to_uri(fig, _salt("sensitivity", x, y, current_x, critical_x, xlabel, ylabel,
                              title, x_offset, y_offset))


def bar_plot(labels, values, xlabel, *, reference=None, reference_label=None, title=None):
    """Horizontal bars, e.g. margins to runaway criteria or closure errors.

    Bars whose value lies below ``reference`` are hatched, so the distinction
    survives black-and-white printing.

    Parameters
    ----------
    labels : sequence of str
        One label per bar, drawn literally, [-]
    values : array_like
        Bar lengths, in the unit named in ``xlabel``
    xlabel : str
        Axis label with unit, [-]
    reference : float, optional
        Reference value drawn as a dashed line (e.g. 1 for a margin ratio); unit as ``values``
    reference_label : str, optional
        Legend text of the reference line, [-]
    title : str, optional
        Figure title, drawn literally, [-]

    Returns
    -------
    str
        ``data:image/svg+xml;base64,...`` URI of the SVG figure, [-]

    Raises
    ------
    ValueError
        If there are no bars or labels and values differ in number.
    """
    labels = [_literal(label, 40) for label in labels]
    values = _as_1d("values", values, len(labels) if labels else None)
    height = min(6.0, 0.9 + 0.32 * len(labels))
    fig, ax = _new_figure(height)
    with _rc():
        positions = np.arange(len(labels))[::-1]
        below = np.zeros(values.size, dtype=bool) if reference is None else values < reference
        ax.barh(positions, values, height=0.6, color=np.where(below, "#f2d0c8", "#d9d9d9"),
                edgecolor="black", linewidth=0.8)
        for patch, is_below in zip(ax.patches, below):
            if is_below:
                patch.set_hatch("///")
        if reference is not None:
            ax.axvline(float(reference), color="black", linestyle="--", linewidth=1.2,
                       label=_literal(reference_label, 40) if reference_label else None)
            if reference_label:
                ax.legend(loc="best")
        ax.set_yticks(positions, labels)
        ax.set_xlabel(_literal(xlabel, 70))
        ax.grid(axis="y", visible=False)
        if title:
            ax.set_title(_literal(title))
    return _to_uri(fig, _salt("bars", values, tuple(labels), xlabel, reference,
                              reference_label, title))
