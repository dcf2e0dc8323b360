"""Design-basis report as one self-contained HTML string (jinja2 over ``templates/``).

The HTML carries its CSS inline (``templates/report.css`` included inside
``<style>``) and its figures as ``data:image/svg+xml;base64`` URIs, so the file
can be mailed or archived alone, and :func:`simulator.report.pdf.render_pdf`
needs to fetch nothing.

Safety
------
* ``autoescape=True`` (``select_autoescape`` would NOT escape ``*.j2``) and
  ``StrictUndefined``: every value from the context is escaped text, and a
  missing field raises :class:`~simulator.errors.ReportError` (chained from
  ``jinja2.UndefinedError``) instead of printing blank.
* Case text never enters CSS. The running page header gets the title and the
  case name through CSS ``string-set`` from escaped elements, never through
  ``content: "..."``.
* Figure URIs must be ``data:image/...;base64,`` (checked by the ``data_uri``
  filter); anything else raises ``ReportError``.

Context schema
--------------
``render_html(context)`` reads exactly these keys. All values are display
values prepared by ``report/context.py``: text (``str``) or numbers that are
printed as they are (round them first). "text" below means ``str``.

``title`` : text
    Report title (usually the case title; case text, shown escaped).
``case_name`` : text
    Short case name (shown on every page header).
``case_file`` : text
    Case file path as given on the command line.
``generated`` : text
    Date and time of the run, e.g. ``"2025-01-31 14:05 UTC"``.
``tool_version`` : text
    tubesim version, e.g. ``"0.1.0"``.
``summary`` : mapping
    ``numbers``: list of ``{label, value, unit}`` (the design numbers: outlet
    conversion, length/volume/catalyst mass to the target, hot spot, pressure
    drop, adiabatic rise; ``value`` may be text such as ``"not reached"``).
    ``flags``: list of *flag* (hot spot, runaway risk, each assumption).
``inputs`` : mapping
    ``rows``: list of ``{field, as_written, si_value, si_unit}``, one per case input.
    ``species``: list of ``{name, source, molar_mass, t_min, t_max}``
    (molar mass text in g/mol; validity range of the thermo data, text in K).
    ``reactions``: list of ``{label, equation, rate_form, parameters}`` (label ``R1 = reactions[0]``); ``parameters``
    is a list of ``{name, as_written, si_value, si_unit}``.
``profiles`` : mapping
    ``plots``: list of *plot* (temperature with the medium, hot spot and limit;
    conversion; pressure; mole fractions, minor species on a log panel).
    ``notes``: list of text, one per plot left out because it would be a flat
    line (an isothermal tube, a tube without pressure drop), saying why.
``wall_profile`` : mapping, optional
    ``available`` (bool; a given wall profile only), ``paragraphs`` (text), ``rows``
    (``{position, value}``), ``unit`` (text), ``plots`` (list of *plot*).
``wall`` : mapping, optional
    ``available`` (bool; heat exchange only), ``paragraphs`` (text: where U comes from, U range,
    hottest wall or why it is not resolved, the wall limit), ``plots`` (list of *plot*: U and h_i,
    wall temperatures, wall flux).
``assumptions``, ``screening``, ``numerics`` : *block* each
    ``numerics`` has one more key, ``warnings``: list of text (may be empty).
``validation`` : list of ``{key, source, compared, count}``
    One row per published source the test suite checks the tool against:
    the source key, its published citation, what was compared (plain words)
    and the number of checks. Printed as an appendix after the provenance.
``cautions`` : list of text
    Start from :data:`STANDARD_CAUTIONS`, add case-specific ones.
``key_cautions`` : list of text
    The cautions printed right after the summary verdicts (the first
    standard caution and the case-specific ones); the full list stays in the
    Cautions section.
``references`` : list of ``{key, text}``
    Every equation, correlation, criterion and data set used in this run.
``provenance`` : list of ``{label, value}``
    SHA-256 of the case file, versions (tubesim, Cantera, scipy, numpy), date,
    command line.

Building blocks:

*flag* : ``{level, label, text}``
    ``level`` is ``"acceptable"``, ``"review"`` or ``"unacceptable"`` (anything else raises
    ``ReportError``); printed as a word and a symbol (see :data:`LEVELS`) with
    colour and border pattern, so it reads in black and white. ``label`` is
    the short subject ("Hot spot"), ``text`` one verdict sentence.
*plot* : ``{title, uri, caption}``
    ``uri`` from :mod:`simulator.report.plots` (``data:image/svg+xml;base64,...``).
*table* : ``{caption, columns, rows}``
    ``columns``: list of header text; ``rows``: list of lists of *cell*; a
    cell is text/number, or a mapping ``{level, text}`` printed as a verdict.
*block* : ``{available, reason_if_not, paragraphs, flags, tables, plots}``
    ``available`` bool; when false only ``reason_if_not`` (text) is read and
    the section says "Not evaluated: <reason>". Otherwise ``paragraphs`` (list
    of text), ``flags``, ``tables`` and ``plots`` are shown in that order; the
    lists may be empty. Attribution of the ideal-vs-full differences goes
    in a table or paragraph of ``assumptions``.
"""
import functools
from importlib import resources
from pathlib import Path

from simulator.errors import ReportError

#: Section id -> heading, in report order. The template uses these headings.
SECTIONS = (
    ("summary", "Summary"),
    ("inputs", "Inputs"),
    ("profiles", "Axial profiles"),
    ("assumptions", "Assumption check"),
    ("screening", "Runaway screening"),
    ("numerics", "Numerics and conservation"),
    ("cautions", "Cautions"),
    ("references", "References"),
    ("provenance", "Provenance"),
    ("validation", "Appendix: validation against published sources"),
)
#: Sections printed as an appendix (after the provenance, lettered instead of numbered).
APPENDICES = ("validation",)

#: Verdict level (simulator.verdicts) -> printed word, symbol and CSS class (border pattern). Never colour alone.
LEVELS = {
    "acceptable": {"word": "acceptable", "symbol": "\u2713", "css": "lv-acceptable"},
    "review": {"word": "review", "symbol": "\u25c7", "css": "lv-review"},
    "unacceptable": {"word": "unacceptable", "symbol": "\u2715", "css": "lv-unacceptable"},
}

#: Cautions every design-basis report carries (common practice, no single source).
STANDARD_CAUTIONS = (
    "The results are screening-level predictions of a one-dimensional, pseudo-homogeneous "
    "plug-flow model with a lumped wall heat-transfer coefficient. They do not replace design "
    "by qualified, licensed professional engineers under the applicable local codes and "
    "standards; defer to them.",
    "Runaway criteria are model-based and sensitive to their parameters: near the boundary a "
    "change of 1-2\u00a0% in kinetics, heat-transfer coefficient, heat capacity or feed "
    "concentration can move the hot spot by hundreds of kelvin. Read the margins, not only "
    "the verdict.",
    "Radial temperature gradients, catalyst dilution and activity profiles, tube-to-tube "
    "maldistribution, shell-side (medium) temperature rise and fouling are not captured unless "
    "modelled; one-dimensional limits can be non-conservative.",
    "Steady-state screening does not cover dynamics: start-up, shut-down, feed upsets, loss "
    "of cooling, wrong-way behaviour or oscillations.",
    "Not covered: hazard identification and risk studies (e.g. HAZOP, LOPA/SIL), "
    "flammability and explosion limits of the feed, emergency relief and vent sizing, "
    "materials and mechanical design, regulatory compliance.",
    "Thermochemical data and kinetic parameters carry uncertainty; their sources and "
    "validity ranges are listed under Inputs and References.",
)

_TEMPLATE = "report.html.j2"
_DATA_URI_PREFIXES = ("data:image/svg+xml;base64,", "data:image/png;base64,")


def template_dir():
    """Folder holding ``report.html.j2`` and ``report.css``.

    The installed wheel ships the top-level ``templates/`` folder as the data
    package ``simulator._templates``; in a source checkout that package does
    not exist and the repository's ``templates/`` folder next to the package
    is used.

    Returns
    -------
    pathlib.Path
        Template folder, [-]

    Raises
    ------
    ReportError
        If neither location holds the report template.
    """
    try:
        candidate = Path(str(resources.files("simulator._templates").joinpath(_TEMPLATE))).parent
    except (ModuleNotFoundError, TypeError, ValueError):
        candidate = None
    if candidate is not None and (candidate / _TEMPLATE).is_file():
        return candidate
    checkout = Path(__file__).resolve().parents[2] / "templates"
    if (checkout / _TEMPLATE).is_file():
        return checkout
    raise ReportError(
        f"report templates: {_TEMPLATE} found neither in the installed package "
        f"simulator._templates nor in {checkout}; reinstall tubesim."
    )


def _data_uri(value):
    """Jinja filter: pass our own figure URIs, refuse anything else."""
    text = str(value)
    if not text.startswith(_DATA_URI_PREFIXES):
        raise ReportError(
            f"report context: plot uri = {text[:60]!r}: not an embedded image; expected "
            f"a 'data:image/svg+xml;base64,...' URI from simulator.report.plots."
        )
    return text


@functools.lru_cache(maxsize=4)
def _environment(folder):
    import jinja2

    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(folder),
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
        keep_trailing_newline=True,
    )
    env.filters["data_uri"] = _data_uri
    env.globals["SECTIONS"] = dict(SECTIONS)
    env.globals["SECTION_ORDER"] = [key for key, _ in SECTIONS]
    env.globals["APPENDICES"] = APPENDICES
    env.globals["LEVELS"] = LEVELS
    return env


def render_html(context, template=_TEMPLATE):
    """Render the design-basis report to one self-contained HTML string.

    Parameters
    ----------
    context : mapping
        Display values, exactly as described in the module docstring, [-]
    template : str
        Template file in :func:`template_dir` (``train_report.html.j2``: a reactor train,
        context from :mod:`simulator.report.context_train`), [-]

    Returns
    -------
    str
        Complete HTML document (inline CSS, figures as data URIs), [-]

    Raises
    ------
    ReportError
        If a field is missing (``StrictUndefined``), a verdict level is
        unknown, a figure URI is not a data URI, or the template fails.
    """
    import jinja2

    env = _environment(str(template_dir()))
    try:
        return env.get_template(template).render(context)
    except ReportError:
        raise
    except jinja2.UndefinedError as err:
        raise ReportError(
            f"report context: {err}; every field listed in the simulator.report.html "
            f"docstring is required (verdict level must be one of: {', '.join(LEVELS)})."
        ) from err
    except jinja2.TemplateError as err:
        raise ReportError(f"report template {template}: {err}") from err
