"""Sweeps and uncertainty runs on a reactor train: the whole train per case, rows from simulate_train."""
import csv
import json
import tomllib
from pathlib import Path

import pytest

from simulator.case.load import load_case_dict
from simulator.cli import main
from simulator.solve.train import simulate_train

CASE = Path(__file__).parent.parent / "cases" / "train_three_bed_converter.toml"


def test_sweep_over_a_bed_length_gives_the_rows_of_the_train_run(tmp_path):
    out = tmp_path / "sweep"
    assert main(["sweep", str(CASE), "--vary", "train.1.tube.length=0.5 m..1.5 m in 3", "--out", str(out)]) == 0
    rows = list(csv.DictReader(open(out / "results.csv")))
    assert [r["status"] for r in rows] == ["completed"] * 3
    raw = tomllib.loads(CASE.read_text())
    raw["train"][1]["tube"]["length"] = "1.5 m"
    raw["design"].pop("temperature_limit")       # sweeps ignore the design limit
    train = simulate_train(load_case_dict(raw, source_path=str(CASE), case_dir=str(CASE.parent)))
    assert float(rows[2]["outlet_conversion"]) == pytest.approx(train.overall_conversion, rel=1e-9)
    hottest = max(b.hot_spot["temperature_K"] for b in train.beds)
    assert float(rows[2]["hot_spot_temperature_K"]) == pytest.approx(hottest, rel=1e-9)
    assert float(rows[2]["outlet_temperature_K"]) == pytest.approx(float(train.beds[-1].T[-1]), rel=1e-9)


def test_uncertainty_samples_a_train(tmp_path):
    text = CASE.read_text() + ('\n[[uncertainty]]\nparameter = "train.0.tube.length"\ndistribution = "uniform"\n'
                               'low = "0.8 m"\nhigh = "1.2 m"\n')
    path = tmp_path / "train_u.toml"
    path.write_text(text)
    out = tmp_path / "u"
    assert main(["uncertainty", str(path), "--samples", "8", "--seed", "3", "--out", str(out)]) == 0
    report = json.loads((out / "uncertainty.json").read_text())
    assert report["samples"]["completed"] == 8 and report["engine"] == "pool"
    assert report["probability_exceeding_limit"] is not None
