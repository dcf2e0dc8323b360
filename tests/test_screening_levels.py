"""One level rule: the report's summary, criteria table, margins table and screening.json agree.

Kinds of check (STYLE.md section 8): invariant. For each demo case with a runaway screening, the
levels the report shows are read from the report context and compared with screening.json, and
each level is checked against the margin rule of :mod:`simulator.verdicts` (feed fractions within
10 % of a critical one, temperatures within R Tc^2/E, the hot spot within a quarter of R Tc^2/E of
T_m: review; past a boundary: unacceptable). Before this rule, the hydrogenation demo's summary said
"review: hot spot 1.1 K below the maxima-curve temperature" while its criteria table said safe
(acceptable), and a 15.3 K medium-temperature margin (below R Tc^2/E = 24.4 K) was acceptable in the
margins table but "sensitive" in the risk rule.
"""
import re
from pathlib import Path

import pytest

from simulator import load_case, simulate
from simulator.report.context import build_context
from simulator.screening.screen import screen, screening_json
from simulator.verdicts import LEVELS, review_margin, worst

CASES = Path(__file__).parents[1] / "cases"
RANK = {level: k for k, level in enumerate(LEVELS)}
#: internal names that must never reach a reader
INTERNAL = re.compile(r"_inert|sensitivity_without_reaction|sensitivity_excess|[a-z]+_temperature_K|"
                      r"feed_mole_fraction|overall_coefficient|mass_flow\b|morbidelli_varma|van_welsenaere")


def _flag(context, label):
    return next(f for f in context["summary"]["flags"] if f["label"] == label)


def _table(block, caption_start):
    return next(t for t in block["tables"] if t["caption"].startswith(caption_start))


def _texts(tree):
    if isinstance(tree, str):
        yield tree
    elif isinstance(tree, dict):
        for v in tree.values():
            yield from _texts(v)
    elif isinstance(tree, list):
        for v in tree:
            yield from _texts(v)


def check_levels_agree(case, screening):
    """Assert that every level shown for the screening follows the one rule and matches the JSON."""
    data = screening_json(screening)
    result = simulate(case)
    context = build_context(case, result, None, screening)
    scale = data["temperature_scale_K"]
    operating = data["critical"]["feed_mole_fraction"]["operating_value"]

    # JSON: every criterion and critical value carries a level that follows the margin rule
    for name, entry in data["criteria"].items():
        assert entry["level"] in LEVELS, name
        fraction = entry.get("critical_feed_mole_fraction")
        if entry["verdict"] == "safe" and fraction is not None:
            if 0 < fraction - operating < review_margin("feed_fraction", operating):
                assert entry["level"] != "acceptable", (name, fraction, operating)
    vwf = data["criteria"]["van_welsenaere_froment"]
    if vwf["verdict"] == "safe" and vwf["critical"] - vwf["value"] < review_margin("hot_spot", temperature_scale=scale):
        assert vwf["level"] != "acceptable"
    for key, entry in data["critical"].items():
        if entry["found"]:
            kind = "temperature" if key.endswith("_K") else "feed_fraction"
            small = entry["margin"] < review_margin(kind, entry["operating_value"], scale)
            assert (entry["level"] != "acceptable") == small, (key, entry["margin"], entry["level"])
    counted = [e["level"] for n, e in data["criteria"].items()
               if not (n == "semenov" and e["verdict"] == "undecided")]
    counted += [e["level"] for e in data["critical"].values()]
    counted += [lv for lv in data["sensitivity_levels"].values() if lv is not None]
    assert data["risk_level"] == worst(counted)

    # report tables carry the same levels as the JSON, row for row
    block = context["screening"]
    criteria_rows = _table(block, "Runaway criteria")["rows"]
    shown = {row[0]: row[-1]["level"] for row in criteria_rows}
    assert shown["Van Welsenaere-Froment (1970) I, maxima curve"] == vwf["level"]
    assert shown["Semenov (1928), no consumption"] == data["criteria"]["semenov"]["level"]
    assert shown["Adler-Enig (1964)"] == data["criteria"]["adler_enig"]["level"]
    assert shown["Barkelew (1959), envelope"] == data["criteria"]["barkelew"]["level"]
    margin_rows = _table(block, "Critical values and margins")["rows"]
    assert [row[-1]["level"] for row in margin_rows] == [e["level"] for e in data["critical"].values()]

    # summary: the runaway flag is the risk level, the hot-spot flag the JSON's hot-spot verdict
    assert _flag(context, "Runaway risk")["level"] == data["risk_level"]
    hot = _flag(context, "Hot spot")
    expected = "unacceptable" if data["risk"] == "runaway" else data["hot_spot"]["level"]
    assert RANK[hot["level"]] >= RANK[expected]
    if hot["level"] != expected:          # only the temperature limit may make it worse
        assert "temperature limit" in hot["text"]
    # a hot spot flagged for its closeness to T_m is never "acceptable" in the criteria table
    assert RANK[vwf["level"]] >= RANK[data["hot_spot"]["level"]]

    # no internal labels in anything a reader sees
    for text in list(_texts(block)) + [hot["text"], _flag(context, "Runaway risk")["text"], data["risk_rule"]]:
        assert not INTERNAL.search(text), text


@pytest.mark.parametrize("name", ["hydrogenation_cooled_packed_bed.toml", "methanol_synthesis_real_gas.toml"])
def test_levels_agree_on_the_demo_cases(name):
    case = load_case(CASES / name)
    check_levels_agree(case, screen(case))
