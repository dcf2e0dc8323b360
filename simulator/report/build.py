"""``tubesim report``: case file -> design-basis report (report.html, report.pdf).

:func:`write_design_report` loads the case, runs what the report shows (the
design run, the assumption check and, for a cooled exothermic tube, the
runaway screening), builds the context (:mod:`simulator.report.context`) and
writes the documents atomically (:func:`simulator.report.pdf.write_report`).

The design run is solved once here for its profiles;
:func:`~simulator.assumptions.check_assumptions` and
:func:`~simulator.screening.screen.screen` solve the case again inside (a few
tens of milliseconds each, against seconds for the screening's sensitivity
scans), so nothing is gained by threading one result through them.
"""
import shlex
import time
from pathlib import Path

from simulator.errors import IntegrationError, ReportError, SimulatorError


def _screening(case):
    """(screening dict or None, reason when None)."""
    from simulator.errors import CaseError
    from simulator.screening.screen import screen

    try:
        screening = screen(case)
    except CaseError as err:
        # not a cooled tube, or no exothermic path: the report says why
        reason = " ".join(err.problems)
        prefix = f"{case.source_path}: "
        return None, reason[len(prefix):] if case.source_path and reason.startswith(prefix) else reason
    if not screening.get("applicable", True):
        return None, screening["reason"]        # screening does not apply to this tube: the report says why
    return screening, None


def compute_report_inputs(case):
    """Run everything the report shows for ``case`` and time each part.

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated case, [-]

    Returns
    -------
    dict
        ``result`` (Result), ``assumptions`` (dict), ``screening`` (dict or
        None), ``screening_reason`` (str or None) and ``timings`` (wall seconds
        per part), [-]

    Raises
    ------
    IntegrationError
        If the design run fails (the report of a failed run would be no design basis).
    """
    from simulator.assumptions import check_assumptions
    from simulator.solve.integrate import simulate

    timings = {}
    started = time.perf_counter()
    result = simulate(case)
    timings["simulate"] = time.perf_counter() - started
    if result.status == "failed":
        raise IntegrationError(result.termination)
    started = time.perf_counter()
    assumptions = check_assumptions(case)
    timings["assumptions"] = time.perf_counter() - started
    started = time.perf_counter()
    screening, reason = _screening(case)
    timings["screening"] = time.perf_counter() - started
    return {"result": result, "assumptions": assumptions, "screening": screening,
            "screening_reason": reason, "timings": timings}


def default_command_line(case_path, out_dir, pdf=True):
    """The ``tubesim report`` command equivalent to a call of :func:`write_design_report`.

    Parameters
    ----------
    case_path : str or pathlib.Path
        Case file as given, [-]
    out_dir : str or pathlib.Path
        Output folder as given, [-]
    pdf : bool
        Whether the PDF was written, [-]

    Returns
    -------
    str
        Shell-quoted command text, [-]
    """
    words = ["tubesim", "report", str(case_path), "--out", str(out_dir)] + ([] if pdf else ["--no-pdf"])
    return " ".join(shlex.quote(w) for w in words)


SWEEP_FIGURES = (
    ("runaway_map.svg", "Runaway map from the sweep",
     "Hot-spot rise above the medium over the swept grid (tubesim sweep, same output folder); thick line: "
     "runaway boundary where the normalized sensitivity along the horizontal axis peaks (Morbidelli-Varma)."),
    ("hot_spot_sweep.svg", "Hot spot along the sweep",
     "Hot-spot temperature over the swept parameter (tubesim sweep, same output folder)."),
    ("exceedance.svg", "Probability of exceeding the temperature limit",
     "Empirical probability that the hot spot exceeds a temperature, from tubesim uncertainty in the same "
     "output folder; the design temperature limit and p5/p50/p95 are marked."),
)


def _meta_of_this_case(case, out_dir):
    """Meta of the results store in ``out_dir`` if it was computed from this very case file, else None."""
    from simulator.sweeps.execute import fingerprint
    from simulator.sweeps.store import ResultsStore

    store = out_dir / "results.sqlite"
    if not store.exists():
        return None
    try:
        meta = ResultsStore.read_meta(store)
    except Exception:  # noqa: BLE001 - an unreadable store: leave its results out
        return None
    return meta if meta.get("case_sha256") == fingerprint(case.raw) else None


def sweep_figures(case, out_dir):
    """Plots of a sweep or uncertainty run found in ``out_dir`` for this very case, as report plots.

    A figure is included only when the results store next to it was computed from this case
    file (same fingerprint of the case as written), so a stale map of another case never
    enters the report.
    """
    import base64

    if _meta_of_this_case(case, out_dir) is None:
        return []
    plots = []
    for name, title, caption in SWEEP_FIGURES:
        path = out_dir / name
        if path.exists():
            uri = "data:image/svg+xml;base64," + base64.b64encode(path.read_bytes()).decode("ascii")
            plots.append({"title": title, "uri": uri, "caption": caption})
    return plots


def uncertainty_text(case, out_dir):
    """Sentences on the uncertainty run in ``out_dir`` for this very case (empty if there is none).

    Read from ``uncertainty.json`` only when the results store beside it holds an
    uncertainty run of this case file (:func:`sweep_figures` applies the same check).

    Parameters
    ----------
    case : simulator.case.schema.Case
        The case of the report, [-]
    out_dir : pathlib.Path
        Output folder of the report, [-]

    Returns
    -------
    list of str
        :func:`simulator.report.context_uncertainty.uncertainty_paragraphs`, or [], [-]
    """
    import json

    from simulator.report.context_uncertainty import uncertainty_paragraphs

    meta = _meta_of_this_case(case, out_dir)
    path = out_dir / "uncertainty.json"
    if meta is None or meta.get("command") != "uncertainty" or not path.exists():
        return []
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return []
    return uncertainty_paragraphs(data) if isinstance(data, dict) else []


def write_design_report(case_path, out_dir, pdf=True, command_line=None, *, timings=None):
    """Solve a case and write its design-basis report.

    Parameters
    ----------
    case_path : str or pathlib.Path
        Case file (TOML), [-]
    out_dir : str or pathlib.Path
        Output folder, created if needed, [-]
    pdf : bool
        Also write ``report.pdf`` (A4), [-]
    command_line : str, optional
        Command that asked for the report, printed under Provenance; default
        the equivalent ``tubesim report`` command, [-]
    timings : dict, optional
        Filled with the wall time of each step (simulate, assumptions,
        screening, context, render) and the CPU time of this process for
        the context and the rendering (context_cpu, render_cpu), [s]

    Returns
    -------
    dict of str to pathlib.Path
        ``{"html": path}`` and, with ``pdf``, ``{"pdf": path}``, [-]

    Raises
    ------
    CaseError
        If the case file is missing or invalid.
    IntegrationError
        If the design run fails.
    ReportError
        If the report cannot be built, rendered or written.
    """
    from simulator.case.load import load_case
    from simulator.report.context import build_context
    from simulator.report.pdf import write_report

    case = load_case(case_path)
    computed = compute_report_inputs(case)
    timings = {} if timings is None else timings
    timings.update(computed["timings"])
    if command_line is None:
        command_line = default_command_line(case_path, out_dir, pdf)
    started, started_cpu = time.perf_counter(), time.process_time()
    try:
        context = build_context(case, computed["result"], computed["assumptions"], computed["screening"],
                                command_line, screening_reason=computed["screening_reason"])
    except SimulatorError:
        raise
    except (KeyError, TypeError, ValueError, ArithmeticError) as err:
        raise ReportError(f"report context of {case_path}: {type(err).__name__}: {err}") from err
    extra, sentences = sweep_figures(case, Path(out_dir)), uncertainty_text(case, Path(out_dir))
    if context["screening"]["available"]:
        context["screening"]["plots"] = list(context["screening"]["plots"]) + extra
        context["screening"]["paragraphs"] = list(context["screening"]["paragraphs"]) + sentences
    else:       # not screened (e.g. an adiabatic tube): the results go with the profiles
        context["profiles"]["plots"] = list(context["profiles"]["plots"]) + extra
        context["profiles"]["notes"] = list(context["profiles"]["notes"]) + sentences
    timings["context"] = time.perf_counter() - started
    timings["context_cpu"] = time.process_time() - started_cpu
    started, started_cpu = time.perf_counter(), time.process_time()
    written = write_report(context, Path(out_dir), pdf=pdf)
    timings["render"] = time.perf_counter() - started
    timings["render_cpu"] = time.process_time() - started_cpu
    return written
