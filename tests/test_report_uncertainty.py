"""The report prints the exceedance probability of an uncertainty run with its interval and what was left out.

Regression for issue 10, item 19: the report showed only the exceedance figure; the probability,
its confidence interval, its denominator and the samples left out of it were not in the text.
Every check is an invariant of the report text (no published value is compared).
"""
import re
from pathlib import Path

from simulator.cli import main
from simulator.report.context_uncertainty import uncertainty_paragraphs

ROOT = Path(__file__).resolve().parents[1]
CASE = "froment1967_oxylene_packed_tube.toml"

#: uncertainty.json as the sweeps layer writes it with invalid/failed counts and the denominator.
WITH_COUNTS = {
    "samples": {"n": 500, "used": 490, "valid": 498, "invalid": 2, "failed": 3, "stopped": 4, "completed": 491,
                "without_hot_spot": 1, "method": "Latin hypercube (McKay, Beckman & Conover 1979)", "seed": 7,
                "invalid_reasons": [{"reason": "heat.overall_coefficient below 0 W/(m^2*K)", "count": 2}]},
    "temperature_limit_K": 650.0,
    "probability_exceeding_limit": {
        "estimate": 21 / 494, "exceeding": 21, "n": 494, "denominator": 494, "confidence": 0.95,
        "interval": [0.0265, 0.0642], "interval_method": "Clopper-Pearson",
        "left_out": {"invalid": 2, "failed": 3, "stopped_below_limit": 0, "without_hot_spot": 1},
        "if_left_out_exceeded": [21 / 498, 25 / 498]},
    "percentiles": {"hot_spot_temperature_K": {"p5": 431.2, "p50": 446.7, "p95": 603.9}},
    "engine": "compiled",
}
#: The older file: failed runs counted in samples, no denominator or left_out fields.
WITHOUT_COUNTS = {
    "samples": {"n": 40, "used": 38, "failed": 2, "without_hot_spot": 0, "method": "scrambled Sobol' (Sobol' 1967)",
                "seed": 3},
    "temperature_limit_K": 800.0,
    "probability_exceeding_limit": {"estimate": 0.25, "exceeding": 10, "n": 38, "confidence": 0.9,
                                    "interval": [0.14, 0.38], "interval_method": "Wilson"},
    "percentiles": {"hot_spot_temperature_K": {"p5": None, "p50": None, "p95": None}},
}


def test_probability_with_interval_denominator_and_what_was_left_out():
    text = " ".join(uncertainty_paragraphs(WITH_COUNTS))
    assert "P(hot spot > 650.0 K) = 0.0425 (21 of 494 samples)" in text
    assert "95 % interval 0.0265 to 0.0642 (Clopper-Pearson)" in text
    assert "2 invalid (values the case refuses), 3 failed (numerical failure), 1 without a hot spot" in text
    assert "0.0422 or 0.0502" in text                      # bracket if all / none of the left-out exceeded
    assert "conditional on a valid case" in text
    assert "2 because heat.overall_coefficient below 0 W/(m^2*K)" in text
    assert "p5 431.2 K, p50 446.7 K, p95 603.9 K" in text
    assert "compiled engine" in text and "not a frequency of failure" in text


def test_older_file_without_denominator_still_names_what_was_left_out():
    text = " ".join(uncertainty_paragraphs(WITHOUT_COUNTS))
    assert "P(hot spot > 800.0 K) = 0.25 (10 of 38 samples); 90 % interval 0.14 to 0.38 (Wilson)" in text
    assert "Left out of the probability: 2 failed (numerical failure)." in text
    assert "conditional on a valid case" not in text
    assert "None" not in text and "nan" not in text.lower()


def test_no_estimate_is_said_plainly():
    data = {**WITHOUT_COUNTS, "probability_exceeding_limit": {"estimate": None, "exceeding": 0, "n": 0}}
    text = " ".join(uncertainty_paragraphs(data))
    assert "P(hot spot > 800.0 K): cannot be estimated" in text
    assert not re.search(r"P\(hot spot > 800.0 K\) =", text)


def test_uncertainty_run_of_the_same_case_is_printed_in_the_report(tmp_path, capsys):
    text = (ROOT / "cases" / CASE).read_text().replace('temperature_limit = "1200 K"', 'temperature_limit = "800 K"')
    text += ('\n[[uncertainty]]\nparameter = "heat.medium.temperature"\ndistribution = "uniform"\n'
             'low = "620 K"\nhigh = "640 K"\n')
    case = tmp_path / "mc.toml"
    case.write_text(text)
    out = tmp_path / "out"
    assert main(["uncertainty", str(case), "--samples", "8", "--seed", "5", "--out", str(out)]) == 0
    assert main(["report", str(case), "--out", str(out), "--no-pdf"]) == 0
    capsys.readouterr()
    document = (out / "report.html").read_text(encoding="utf-8")
    assert re.search(r"P\(hot spot &gt; 800\.0 K\) = [0-9.]+ \(\d+ of \d+ samples\); 95 % interval", document)
    assert "Left out of the probability:" in document
    # another case in the same folder does not pick the run up
    other = ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml"
    assert main(["report", str(other), "--out", str(out), "--no-pdf"]) == 0
    assert "P(hot spot &gt;" not in (out / "report.html").read_text(encoding="utf-8")
