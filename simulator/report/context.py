r"""Result -> report context: the ONLY place with display units and rounding.

:func:`build_context` turns one run (the :class:`~simulator.results.Result`, the
``assumptions.json`` dict and the ``screening.json`` dict) into the display
dict that :func:`simulator.report.html.render_html` reads (schema in the
:mod:`simulator.report.html` docstring). Everything inside tubesim is SI; here
numbers are rounded, pressures shown in kPa or bar and heat duties in kW. The
Inputs section shows every case value as written next to its SI value.

This module and four ``context_*`` modules, one job each, build the context
(together they are the only place with display units and rounding):

* :mod:`simulator.report.context_format`: rounding and unit text
  (:func:`fmt`, :func:`fixed`, :func:`unit_text`, re-exported here);
* :mod:`simulator.report.context_inputs`: the Inputs section (case values,
  species, kinetics);
* :mod:`simulator.report.context_verdicts`: the summary numbers and the
  verdict flags, with the verdict rules in its docstring;
* :mod:`simulator.report.context_sections`: profiles, assumptions, screening
  and numerics sections;
* :mod:`simulator.report.context_uncertainty`: sentences on an uncertainty
  run found in the output folder (added by :mod:`simulator.report.build`);
* this module: cautions (the full list and the short one next to the
  summary verdicts), references, provenance, the validation appendix (one row
  per published source) and the assembly (:func:`build_context`).
"""
import datetime as _dt
import hashlib
import platform
from importlib import metadata
from pathlib import Path

from simulator.references import lookup
from simulator.report.context_format import fixed, fmt, unit_text  # re-exported
from simulator.report.context_inputs import FIELD_UNITS, _inputs, _walk  # re-exported
from simulator.report.context_sections import (
    _assumptions_block,
    _numerics_block,
    _profiles,
    _screening_block,
)
from simulator.report.context_verdicts import (  # constants re-exported
    CLOSURE_OK,
    DESIGN_CHANGE_REVIEW,
    RISK_LEVELS,
    _exothermic,
    _screening_reason,
    _summary,
)


# ----------------------------------------------------------------------------- cautions, references
def _cautions(case, result, screening, reason, data):
    from simulator.report.html import STANDARD_CAUTIONS

    out = list(STANDARD_CAUTIONS)
    constant = [n for n, src in zip(data.names, data.sources) if src.startswith("case file")]
    if constant:
        out.append(f"Species {', '.join(constant)} use constant heat capacities given in the case file, without a "
                   f"stated validity range.")
    if case.source:
        out.append(f"This case is built from published data (source key {case.source!r}); its reproduction is a "
                   f"check of the model, not a design basis for another plant.")
    if case.bed is not None and case.pressure_drop.model == "none":
        out.append("The packed bed is modelled without pressure drop (pressure_drop.model = \"none\").")
    if "still rising" in str(result.hot_spot.get("located_by", "")):
        out.append("The temperature is still rising at the outlet: the highest temperature of a longer tube "
                   "would be higher.")
    if screening is None and _exothermic(result):
        out.append(f"Runaway screening was not evaluated: {_screening_reason(case, result, reason)}")
    if any("data range" in str(w) for w in result.warnings):
        out.append("Some species properties were extrapolated beyond their data range; see Numerics.")
    return out


def _key_cautions(cautions, screening):
    """The cautions printed next to the summary verdicts: the standing caution, and the case's own.

    The first standard caution (model limits, defer to licensed engineering
    practice and local codes) always; the one on runaway criteria when the
    screening was evaluated; then every caution added for this case.
    """
    from simulator.report.html import STANDARD_CAUTIONS

    out = [STANDARD_CAUTIONS[0]]
    if screening is not None:
        out.append(STANDARD_CAUTIONS[1])
    return out + [c for c in cautions if c not in STANDARD_CAUTIONS]


def _references(case, result, assumptions, screening):
    keys = list(result.references)
    if assumptions is not None:
        keys.append("levenspiel1999")             # expansion factor of the constant-moles measure
        if assumptions.get("assumptions", {}).get("ideal_gas", {}).get("verdict") in ("holds", "fails"):
            keys.append("peng_robinson1976")      # real-gas check of the ideal-gas assumption
    if _exothermic(result) and case.heat.exchange:
        keys.append("van_welsenaere_froment1970")  # R T^2 / E scale of the hot-spot verdict
    if screening is not None:
        keys += list(screening.get("references", []))
        for entry in screening.get("criteria", {}).values():
            keys += list(entry.get("references", []))
            keys += list((entry.get("inflection") or {}).get("references", []))
    if case.source:
        keys.append(case.source)
    return [{"key": k, "text": text} for k, text in lookup(keys)]


def _distribution_version(name):
    try:
        return metadata.version(name)
    except metadata.PackageNotFoundError:
        return "not installed"


def case_file_sha256(path):
    """SHA-256 of the case file's bytes, or a note when it cannot be read.

    Parameters
    ----------
    path : str or pathlib.Path
        Case file, [-]

    Returns
    -------
    str
        64 hex digits, or ``"not available (...)"``, [-]
    """
    if not path:
        return "not available (case given as a dict, no file)"
    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError as err:
        return f"not available ({err.strerror or err})"


def _provenance(case, result, generated, command_line):
    v = result.versions
    return [
        {"label": "Case file", "value": case.source_path or "(none: case given as a dict)"},
        {"label": "Case file SHA-256", "value": case_file_sha256(case.source_path)},
        {"label": "Generated (UTC)", "value": generated},
        {"label": "tubesim", "value": v.get("tubesim", "n/a")},
        {"label": "Cantera", "value": v.get("cantera", "n/a")},
        {"label": "scipy", "value": v.get("scipy", "n/a")},
        {"label": "numpy", "value": v.get("numpy", "n/a")},
        {"label": "numba", "value": v.get("numba", "n/a")},
        {"label": "Report libraries", "value": ", ".join(
            f"{name} {_distribution_version(name)}" for name in ("matplotlib", "jinja2", "weasyprint"))},
        {"label": "Python", "value": f"{platform.python_version()} ({platform.system()} {platform.machine()})"},
        {"label": "Command line", "value": command_line or "(not recorded: called from Python)"},
    ]


def _validation_rows(checks):
    """One row per published source: its citation, what was compared, and how many checks.

    Only the report's text of each source is printed (``citation`` and
    ``compared`` of :func:`simulator.report.validation.published_checks`); the
    markers' internal notes and test names are not.
    """
    by_key = {}
    for c in checks:
        row = by_key.setdefault(c["key"], {"key": c["key"], "source": c["citation"], "compared": c["compared"],
                                           "count": 0})
        row["count"] += 1
    return list(by_key.values())


def _without_units_on_words(summary):
    """A design number that is not a number ("n/a", "not reached") is printed without a unit.

    Parameters
    ----------
    summary : dict
        ``{numbers, flags}`` of the summary; changed in place and returned, [-]
    """
    for row in summary["numbers"]:
        value = str(row["value"]).strip()
        if not any(ch.isdigit() for ch in value):
            row["value"] = "not available" if value in ("n/a", "") else value
            row["unit"] = ""
    return summary


# ----------------------------------------------------------------------------- driver
def build_context(case, result, assumptions=None, screening=None, command_line="", *,
                  screening_reason=None, generated=None):
    """Build the report context of one run (schema: :mod:`simulator.report.html`).

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated case, [-]
    result : simulator.results.Result
        The design run of ``case``, [-]
    assumptions : dict, optional
        ``assumptions.json`` content from :func:`simulator.assumptions.check_assumptions`, [-]
    screening : dict, optional
        ``screening.json`` content from :func:`simulator.screening.screen.screen`,
        with its ``_log`` of evaluations for the sensitivity plots, [-]
    command_line : str
        Command that produced the report, for provenance, [-]
    screening_reason : str, optional
        Why ``screening`` is None (e.g. the message of the ``CaseError`` that
        :func:`~simulator.screening.screen.screen` raised), [-]
    generated : datetime.datetime, optional
        Time stamp of the report; default now, in UTC, [-]

    Returns
    -------
    dict
        The context; every number rounded and printed with its unit, [-]
    """
    from simulator.report.context_wall import wall_block
    from simulator.report.context_wall_profile import wall_profile_block
    from simulator.report.validation import published_checks

    stamp = generated or _dt.datetime.now(_dt.timezone.utc)
    stamp = stamp.astimezone(_dt.timezone.utc).strftime("%Y-%m-%d %H:%M UTC")
    inputs, data = _inputs(case, result)
    source = Path(case.source_path).name if case.source_path else "(dict)"
    checks = published_checks()
    numerics = _numerics_block(case, result, screening)
    cautions = _cautions(case, result, screening, screening_reason, data)
    return {
        "title": case.title or source,
        "case_name": Path(source).stem,
        "case_file": case.source_path or "(none)",
        "generated": stamp,
        "tool_version": result.versions.get("tubesim", "n/a"),
        "summary": _without_units_on_words(_summary(case, result, assumptions, screening, screening_reason)),
        "inputs": inputs,
        "profiles": _profiles(case, result),
        "wall_profile": wall_profile_block(case, result),
        "wall": wall_block(case, result),
        "assumptions": _assumptions_block(case, assumptions),
        "screening": _screening_block(case, result, screening, screening_reason),
        "numerics": numerics,
        "validation": _validation_rows(checks),
        "cautions": cautions,
        "key_cautions": _key_cautions(cautions, screening),
        "references": _references(case, result, assumptions, screening),
        "provenance": _provenance(case, result, stamp, command_line),
    }
