"""`tubesim sweep` and `tubesim uncertainty` with the real tube simulator.

* The runaway boundary found on a sweep grid agrees with the Morbidelli-Varma critical feed
  fraction of the published o-xylene tube (runaway.md section 2: 0.01777 atm, reproduction of
  Froment 1967 under the Morbidelli-Varma 1988 criterion).
* The Monte Carlo estimator on a case with a known answer: the coolant temperature uniform over a
  range that crosses the sharp runaway threshold, so the exact exceedance probability is the
  fraction of the range above the threshold (a property of the uniform distribution, analytic).
* Dask and the local pool give identical results (real LocalCluster on loopback).
"""
import csv
import json
import tomllib

import numpy as np
import pytest

from simulator import load_case_dict, simulate
from simulator.cli import main
from simulator.sweeps.boundary import boundary_along

CASE = "froment1967_oxylene_packed_tube.toml"


def _rows(path):
    with open(path) as handle:
        return list(csv.DictReader(handle))


@pytest.mark.published("morbidelli_varma1988", "boundary on a sweep grid of the Froment (1967) tube; 0.01777 atm from an independent reproduction")
def test_sweep_boundary_matches_the_morbidelli_varma_critical_value(cases_dir, tmp_path):
    out = tmp_path / "sweep"
    assert main(["sweep", str(cases_dir / CASE), "--vary", "feed.mole_fractions.OX=0.0172..0.0184 in 25",
                 "--out", str(out)]) == 0
    rows = _rows(out / "results.csv")
    assert len(rows) == 25 and all(r["status"] == "completed" for r in rows)
    x = np.array([float(r["feed.mole_fractions.OX"]) for r in rows])
    T = np.array([float(r["hot_spot_temperature_K"]) for r in rows])
    order = np.argsort(x)
    x_c, s_max = boundary_along(x[order], T[order])
    assert x_c == pytest.approx(0.01777, abs=5e-5)      # grid spacing 5e-5, parabola through the peak
    assert s_max > 10
    assert (out / "hot_spot_sweep.svg").read_text().startswith("<?xml")


def test_sweep_map_writes_svg_and_resumes_without_recomputing(cases_dir, tmp_path):
    out = tmp_path / "map"
    argv = ["sweep", str(cases_dir / CASE), "--vary", "feed.mole_fractions.OX=0.014..0.019 in 4",
            "--vary", "heat.medium.temperature=620 K..635 K in 3", "--out", str(out)]
    assert main(argv) == 0
    first = (out / "results.csv").read_text()
    assert len(_rows(out / "results.csv")) == 12
    assert "runaway boundary" in (out / "runaway_map.svg").read_text()
    assert main(argv) == 0                                   # everything already done: nothing recomputed
    assert (out / "results.csv").read_text() == first


def _exact_probability(cases_dir, lo, hi, limit):
    """Fraction of [lo, hi] of coolant temperature whose hot spot exceeds the limit (bisection)."""
    raw = tomllib.loads((cases_dir / CASE).read_text())
    raw["design"]["temperature_limit"] = "3000 K"

    def hot(Tc):
        raw["heat"]["medium"]["temperature"] = f"{Tc!r} K"
        return simulate(load_case_dict(raw, str(cases_dir / CASE))).hot_spot["temperature_K"]

    a, b = lo, hi
    assert hot(a) < limit < hot(b)
    while b - a > 1e-4:
        m = 0.5 * (a + b)
        a, b = (m, b) if hot(m) < limit else (a, m)
    return (hi - 0.5 * (a + b)) / (hi - lo)


def test_monte_carlo_known_answer(cases_dir, tmp_path):
    text = (cases_dir / CASE).read_text().replace('temperature_limit = "1200 K"', 'temperature_limit = "800 K"')
    text += '\n[[uncertainty]]\nparameter = "heat.medium.temperature"\ndistribution = "uniform"\n' \
            'low = "620 K"\nhigh = "640 K"\n'
    path = tmp_path / "mc.toml"
    path.write_text(text)
    n = 120
    assert main(["uncertainty", str(path), "--samples", str(n), "--seed", "11", "--out", str(tmp_path / "mc")]) == 0
    data = json.loads((tmp_path / "mc" / "uncertainty.json").read_text())
    p = data["probability_exceeding_limit"]
    exact = _exact_probability(cases_dir, 620.0, 640.0, 800.0)
    # Latin hypercube in one dimension puts exactly one sample in each 1/n stratum: |error| <= 1/n
    assert abs(p["estimate"] - exact) <= 1.0 / n + 1e-9
    assert p["interval"][0] <= exact <= p["interval"][1]
    assert data["samples"]["seed"] == 11
    assert (tmp_path / "mc" / "exceedance.svg").exists()
    assert data["rank_correlation_with_hot_spot"]["heat.medium.temperature"]["spearman_rho"] > 0.9


def test_dask_and_local_pool_give_identical_results(cases_dir, tmp_path):
    distributed = pytest.importorskip("distributed")
    argv = ["sweep", str(cases_dir / CASE), "--vary", "heat.medium.temperature=620 K..640 K in 6", "--batch-size", "3",
            "--engine", "pool"]
    assert main(argv + ["--out", str(tmp_path / "local")]) == 0
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, host="127.0.0.1", dashboard_address=None,
                                  processes=True) as cluster:
        assert main(argv + ["--out", str(tmp_path / "dask"), "--scheduler", cluster.scheduler_address]) == 0
    assert (tmp_path / "local" / "results.csv").read_text() == (tmp_path / "dask" / "results.csv").read_text()


def test_uncertainty_without_entries_is_a_case_error(cases_dir, tmp_path, capsys):
    assert main(["uncertainty", str(cases_dir / CASE), "--samples", "4", "--out", str(tmp_path)]) == 2
    assert "no [[uncertainty]] entries" in capsys.readouterr().err


def test_compiled_engine_agrees_with_the_pool_of_lsoda_solves(cases_dir, tmp_path):
    # acceptance bound of the benchmark: |dT*| <= 0.05 K against per-case implicit solves
    argv = ["sweep", str(cases_dir / CASE), "--vary", "feed.mole_fractions.OX=0.015..0.019 in 5",
            "--vary", "heat.medium.temperature=620 K..635 K in 4"]
    assert main(argv + ["--out", str(tmp_path / "c"), "--engine", "compiled"]) == 0
    assert main(argv + ["--out", str(tmp_path / "p"), "--engine", "pool"]) == 0
    compiled = {r["case_id"]: r for r in _rows(tmp_path / "c" / "results.csv")}
    pool = {r["case_id"]: r for r in _rows(tmp_path / "p" / "results.csv")}
    assert compiled.keys() == pool.keys() and len(pool) == 20
    for cid, r in pool.items():
        c = compiled[cid]
        assert c["status"] == r["status"]
        assert float(c["hot_spot_temperature_K"]) == pytest.approx(float(r["hot_spot_temperature_K"]), abs=0.05)
        assert float(c["outlet_conversion"]) == pytest.approx(float(r["outlet_conversion"]), abs=1e-4)


def test_resume_may_switch_engines(cases_dir, tmp_path):
    out = tmp_path / "mixed"
    small = ["sweep", str(cases_dir / CASE), "--vary", "heat.medium.temperature=620 K..635 K in 4", "--out", str(out)]
    assert main(small + ["--engine", "pool"]) == 0
    before = (out / "results.csv").read_text()
    assert main(small + ["--engine", "compiled"]) == 0        # nothing left to compute
    assert (out / "results.csv").read_text() == before


def test_compiled_engine_refuses_what_it_cannot_run(cases_dir, tmp_path, capsys):
    code = main(["sweep", str(cases_dir / CASE), "--vary", "tube.length=2 m..3 m in 2", "--out", str(tmp_path),
                 "--engine", "compiled"])
    assert code == 2 and "--engine compiled: not available" in capsys.readouterr().err


def test_sweeps_accept_feed_temperatures_above_the_design_limit(cases_dir, tmp_path):
    # sweeps ignore design.temperature_limit (README), so a feed hotter than it is a valid sweep point
    assert main(["sweep", str(cases_dir / "hydrogenation_cooled_packed_bed.toml"), "--vary",
                 "feed.temperature=600 K..700 K in 2", "--out", str(tmp_path), "--engine", "pool"]) == 0
    assert len(_rows(tmp_path / "results.csv")) == 2


def _uncertain_case_file(cases_dir, tmp_path, entries, limit="1200 K"):
    text = (cases_dir / CASE).read_text().replace('temperature_limit = "1200 K"', f'temperature_limit = "{limit}"')
    for entry in entries:
        text += "\n[[uncertainty]]\n" + "".join(f"{k} = {v}\n" for k, v in entry.items())
    path = tmp_path / "u.toml"
    path.write_text(text)
    return path


def test_uncertainty_runs_on_the_compiled_engine_and_says_so(cases_dir, tmp_path, capsys):
    # before: --engine was accepted and ignored (every sample ran through the per-case pool)
    path = _uncertain_case_file(cases_dir, tmp_path, [
        {"parameter": '"heat.medium.temperature"', "distribution": '"uniform"', "low": '"620 K"', "high": '"632 K"'},
        {"parameter": '"reactions.0.activation_energy"', "distribution": '"truncated-normal"', "std": '"0.5 kJ/mol"'},
    ], limit="800 K")
    base = ["uncertainty", str(path), "--samples", "24", "--seed", "4"]
    assert main(base + ["--out", str(tmp_path / "auto")]) == 0
    assert "compiled engine" in capsys.readouterr().out
    assert main(base + ["--out", str(tmp_path / "pool"), "--engine", "pool"]) == 0
    auto = json.loads((tmp_path / "auto" / "uncertainty.json").read_text())
    pool = json.loads((tmp_path / "pool" / "uncertainty.json").read_text())
    assert (auto["engine"], pool["engine"]) == ("compiled", "pool")
    rows_c = {r["case_id"]: r for r in _rows(tmp_path / "auto" / "results.csv")}
    rows_p = {r["case_id"]: r for r in _rows(tmp_path / "pool" / "results.csv")}
    assert rows_c.keys() == rows_p.keys() and len(rows_p) == 24
    for cid, r in rows_p.items():       # same samples, same statuses, hot spots within the 0.05 K bound
        assert rows_c[cid]["status"] == r["status"]
        assert float(rows_c[cid]["hot_spot_temperature_K"]) == pytest.approx(float(r["hot_spot_temperature_K"]),
                                                                             abs=0.05)
    code = main(base + ["--out", str(tmp_path / "x"), "--engine", "compiled"])
    assert code == 0


def test_uncertainty_refuses_a_normal_that_reaches_far_into_refused_values(cases_dir, tmp_path, capsys):
    path = _uncertain_case_file(cases_dir, tmp_path, [
        {"parameter": '"heat.overall_coefficient"', "distribution": '"normal"', "std": '"60 W/(m^2*K)"'},
    ])
    assert main(["uncertainty", str(path), "--samples", "8", "--out", str(tmp_path / "o")]) == 2
    err = capsys.readouterr().err
    assert f"error: {path}: uncertainty.0: a normal distribution of heat.overall_coefficient" in err
    assert '"truncated-normal"' in err and "Traceback" not in err
    assert not (tmp_path / "o" / "results.sqlite").exists()


def test_a_sweep_into_a_folder_in_use_exits_2_naming_the_process(cases_dir, tmp_path, capsys):
    import socket
    import subprocess
    import sys

    from simulator.sweeps.lock import LOCK_NAME

    out = tmp_path / "busy"
    out.mkdir()
    holder = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        (out / LOCK_NAME).write_text(json.dumps({"pid": holder.pid, "host": socket.gethostname(),
                                                 "command": "sweep"}))
        code = main(["sweep", str(cases_dir / CASE), "--vary", "heat.medium.temperature=620 K..625 K in 2",
                     "--out", str(out)])
    finally:
        holder.kill()
        holder.wait()
    err = capsys.readouterr().err
    assert code == 2 and f"in use by process {holder.pid}" in err and "Traceback" not in err


def test_an_interrupted_sweep_prints_the_command_that_resumes_it(cases_dir, tmp_path, capsys, monkeypatch):
    import simulator.sweeps.compiled_sweep as compiled_sweep

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt

    monkeypatch.setattr(compiled_sweep, "run_compiled_sweep", interrupted)
    argv = ["sweep", str(cases_dir / CASE), "--vary", "heat.medium.temperature=620 K..625 K in 2",
            "--out", str(tmp_path / "o")]
    assert main(argv) == 130
    err = capsys.readouterr().err
    assert "the same command resumes where it stopped: tubesim sweep " in err
    assert "'heat.medium.temperature=620 K..625 K in 2'" in err


def test_exceedance_figure_states_the_samples_and_what_was_left_out(cases_dir, tmp_path):
    path = _uncertain_case_file(cases_dir, tmp_path, [
        {"parameter": '"heat.medium.temperature"', "distribution": '"uniform"', "low": '"620 K"', "high": '"640 K"'},
    ], limit="800 K")
    assert main(["uncertainty", str(path), "--samples", "16", "--seed", "2", "--out", str(tmp_path / "f")]) == 0
    data = json.loads((tmp_path / "f" / "uncertainty.json").read_text())
    p = data["probability_exceeding_limit"]
    svg = (tmp_path / "f" / "exceedance.svg").read_text()
    assert f"16 samples; curve and probability over {p['n']} runs; left out: nothing" in svg
    assert f"= {p['exceeding']}/{p['n']} = " in svg


@pytest.mark.parametrize("verb, extra, message", [
    ("uncertainty", ["--seed", "-1"], "argument --seed: '-1': must be a whole number >= 0"),       # before: numpy traceback
    ("uncertainty", ["--batch-size", "0", "--engine", "pool"], "argument --batch-size: '0': must be a whole number >= 1"),
    ("uncertainty", ["--samples", "20000000"], "--samples 20000000: at most 10000000 samples"),
    ("sweep", ["--batch-size", "0", "--engine", "pool"], "argument --batch-size: '0': must be a whole number >= 1"),
    ("sweep", ["--vary", "heat.medium.temperature=620 K..640 K in 2000000000"], "at most 10000000 values"),
])
def test_bad_sweep_options_exit_2_with_one_line_and_write_nothing(cases_dir, tmp_path, capsys, verb, extra, message):
    path = _uncertain_case_file(cases_dir, tmp_path, [
        {"parameter": '"heat.medium.temperature"', "distribution": '"uniform"', "low": '"620 K"', "high": '"640 K"'},
    ])
    out = tmp_path / "out"
    argv = [verb, str(path), "--out", str(out)]
    argv += ["--samples", "4"] if verb == "uncertainty" and "--samples" not in extra else []
    argv += ["--vary", "heat.medium.temperature=620 K..640 K in 2"] if verb == "sweep" and "--vary" not in extra else []
    assert main(argv + extra) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and err[0].startswith("error: ") and message in err[0]
    assert not out.exists()


def test_compiled_engine_stores_values_outside_the_accepted_range_as_invalid(cases_dir, tmp_path):
    # the per-case engine's loader refuses such a sample; the compiled engine must not solve it either
    from simulator.case.load import load_case
    from simulator.model.build import build_model
    from simulator.sweeps.compiled_sweep import run_compiled_cases
    from simulator.sweeps.store import ResultsStore

    model = build_model(load_case(cases_dir / CASE))
    path = "heat.medium.temperature"
    cases = [(0, {path: 620.0}), (1, {path: 700.0}), (2, {path: 625.0})]
    ranges = {path: {"accepted_low": 600.0, "accepted_high": 650.0, "accepted_low_as_written": "600 K",
                     "accepted_high_as_written": "650 K"}}
    with ResultsStore(tmp_path / "r.sqlite", [path]) as store:
        run_compiled_cases(str(cases_dir), cases, [path], model, store, progress=False, ranges=ranges)
        rows = store.rows()
    assert [r["status"] for r in rows] == ["completed", "invalid", "completed"]
    assert rows[1]["error"] == "outside the range the case accepts: heat.medium.temperature above 650 K"
    assert rows[1]["hot_spot_temperature_K"] is None


def test_uncertainty_without_a_temperature_limit_says_what_it_needs(cases_dir, tmp_path, capsys):
    # before: "design.temperature_limit: no field 'temperature_limit' in design; valid: ..."
    path = _uncertain_case_file(cases_dir, tmp_path, [
        {"parameter": '"heat.medium.temperature"', "distribution": '"uniform"', "low": '"620 K"', "high": '"640 K"'},
    ])
    path.write_text(path.read_text().replace('temperature_limit = "1200 K"\n', ""))
    assert main(["uncertainty", str(path), "--samples", "4", "--out", str(tmp_path / "o")]) == 2
    err = capsys.readouterr().err
    assert f"error: {path}: design.temperature_limit: missing; uncertainty estimates the probability" in err


@pytest.mark.parametrize("engine", ["compiled", "pool"])
def test_a_furnace_hotter_than_the_feed_plus_500_k_is_no_runaway(cases_dir, tmp_path, engine):
    # before: the guard T_feed + 3 dT_ad + 500 K = 1450 K stopped the endothermic heated coil with a
    # 1600 K furnace as a "runaway"; the gas heated by the medium must run to the outlet
    out = tmp_path / engine
    assert main(["sweep", str(cases_dir / "dehydrogenation_heated_tube.toml"), "--vary",
                 "heat.medium.temperature=1600 K..1700 K in 2", "--out", str(out), "--engine", engine]) == 0
    rows = _rows(out / "results.csv")
    assert [r["status"] for r in rows] == ["completed", "completed"]
    assert all(1450.0 < float(r["hot_spot_temperature_K"]) < float(r["heat.medium.temperature"]) for r in rows)
