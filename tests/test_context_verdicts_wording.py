"""Wording of the report summary (simulator/report/context_verdicts.py): plain words, no "n/a".

Kinds of check (STYLE.md section 8): invariant (what the summary says of a case of our own).
"""
from simulator import load_case, simulate
from simulator.report.context import build_context
from test_sizing import _case


def _summary_texts(context):
    s = context["summary"]
    return [f"{n['label']} {n['value']} {n['unit']}" for n in s["numbers"]] + [f["text"] for f in s["flags"]]


def test_one_tube_and_no_placeholders(write_case):
    case = load_case(write_case(_case(count=1).replace('molar_flow = "1 mol/s"', 'molar_flow = "0.1 mol/s"')))
    assert simulate(case).design["reached"]
    result = simulate(case)
    texts = _summary_texts(build_context(case, result, None, None))
    assert not any("1 tubes" in t for t in texts)
    assert any("(1 tube)" in t for t in texts)
    assert not any("n/a" in t for t in texts), [t for t in texts if "n/a" in t]


def test_heated_tube_is_below_its_medium_not_negatively_above(write_case):
    # a heated tube stays below the medium: the summary says "below the medium", never a negative "above"
    from test_sizing import _heated

    case = load_case(write_case(_heated()))
    texts = _summary_texts(build_context(case, simulate(case), None, None))
    line = next(t for t in texts if "the medium" in t and t.startswith(("Hot spot:", "Highest temperature:")))
    assert "below the medium" in line and "-" not in line.split("medium")[1]


def test_assumption_flags_without_a_target_give_the_conversion_change(write_case):
    from simulator.assumptions import check_assumptions

    case = load_case(write_case(_case().replace("target_conversion = 0.9", "")))
    assumptions = check_assumptions(case)
    context = build_context(case, simulate(case), assumptions, None)
    flags = {f["label"]: f["text"] for f in context["summary"]["flags"]}
    for label in ("Isothermal", "Isobaric"):
        assert "no target conversion is given" in flags[label]
        assert "changes the outlet conversion by" in flags[label]
        assert "do not reach" not in flags[label] and "does not reach" not in flags[label]
