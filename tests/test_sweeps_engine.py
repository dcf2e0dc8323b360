"""Tests of the sweep engine: paths, grids, results store, resume, failures, batching on a
process pool and on a Dask cluster (loopback), sampling and Monte Carlo statistics.

The reactor model is NOT exercised here: every run uses ``ClosedFormEvaluator``, a test
evaluator for the engine that computes its row by closed forms from the case values, so
each stored number is known exactly. The lead wires the real simulator in separately.
"""
import concurrent.futures as cf
import copy
import functools
import math
import os
import signal
import sqlite3
import subprocess
import sys
import textwrap
import time
from pathlib import Path

import numpy as np
import pytest

from simulator.errors import CaseError, SimulatorWarning
from simulator.sweeps import sampling
from simulator.sweeps.execute import (
    MIN_BATCH, SweepError, plan_batches, run_grid_sweep, run_uncertainty, worker_cache,
)
from simulator.sweeps.paths import apply_values, check_vary, get_path, grid, parse_vary, set_path
from simulator.sweeps.progress import Progress, format_duration
from simulator.sweeps.store import RESULT_FIELDS, ResultsStore, ResumeError
from simulator.units import parse_quantity

ROOT = Path(__file__).resolve().parents[1]

BASE_CASE = {
    "feed": {"temperature": "220 degC", "pressure": "2 bar",
             "mole_fractions": {"OX": 0.01, "O2": 0.2, "N2": 0.79}},
    "tube": {"count": 10, "length": "6 m"},
    "heat": {"medium": {"temperature": "600 K"}},
    "reactions": [{"pre_exponential": "1e7 1/s", "activation_energy": "80 kJ/mol"}],
    "design": {"temperature_limit": "750 K"},
}
THRESHOLD = 675.0  # K, where the test evaluator's hot spot jumps by STEP
STEP = 200.0       # K


def _build_table(log_dir):
    """Stands in for a heavy per-worker object (a Cantera Solution); logs each build."""
    if log_dir:
        with open(os.path.join(log_dir, f"builds-{os.getpid()}.log"), "a") as handle:
            handle.write("build\n")
    return {"offset": 10.0}


class ClosedFormEvaluator:
    """TEST EVALUATOR FOR THE ENGINE ONLY (no reactor physics).

    hot spot = T_c + 1000 K * y_OX + (STEP if T_c > THRESHOLD), a sharp threshold;
    conversion = 1 - exp(-(T_c - 500 K) / 100 K); position = 0.1 m * tube.count.
    Optional: log every call (per process, to count evaluations), sleep, raise for
    ``fail_count``, or kill its own process for the case ``crash_when = (T_c, count)``.
    """

    seconds_per_case = 0.001

    def __init__(self, log_dir=None, tag="run", delay=0.0, fail_count=None, crash_when=None):
        self.log_dir, self.tag, self.delay = log_dir and str(log_dir), tag, delay
        self.fail_count, self.crash_when = fail_count, crash_when

    def __call__(self, raw, case_dir):
        table = worker_cache(("closed-form-table", self.log_dir), functools.partial(_build_table, self.log_dir))
        T_c = parse_quantity(raw["heat"]["medium"]["temperature"], "temperature", "heat.medium.temperature")
        y_ox = raw["feed"]["mole_fractions"]["OX"]
        count = raw["tube"]["count"]
        assert isinstance(count, int)
        if self.log_dir:
            with open(os.path.join(self.log_dir, f"{self.tag}-{os.getpid()}.log"), "a") as handle:
                handle.write(f"{T_c!r} {count} {y_ox!r}\n")
        if self.delay:
            time.sleep(self.delay)
        if self.crash_when == (T_c, count):
            os._exit(3)
        if count == self.fail_count:
            raise ValueError(f"test evaluator rejects tube.count = {count}\nsecond line")
        hot = T_c + 1000.0 * y_ox + (STEP if T_c > THRESHOLD else 0.0)
        return {"status": "ok", "hot_spot_temperature_K": hot, "hot_spot_position_m": 0.1 * count,
                "outlet_conversion": 1.0 - math.exp(-(T_c - 500.0) / 100.0),
                "outlet_temperature_K": T_c + table["offset"],
                "outlet_pressure_Pa": parse_quantity(raw["feed"]["pressure"], "pressure", "feed.pressure") - 1e4}


class ClosedFormProbe:
    """TEST STAND-IN FOR THE CASE LOADER: refuses T_c <= 0 K and a negative pre-exponential."""

    def __init__(self):
        self.loads = 0

    def refusal(self, path, value):
        self.loads += 1
        if path == "heat.medium.temperature" and value <= 0:
            return f"heat.medium.temperature = '{value!r} K': must be > 0."
        if path == "reactions.0.pre_exponential" and value < 0:
            return f"reactions.0.pre_exponential = '{value!r} 1/s': must be >= 0."
        return None


class RefusingEvaluator(ClosedFormEvaluator):
    """The closed-form evaluator, refusing a negative pre-exponential as the case loader does."""

    def __call__(self, raw, case_dir):
        k = parse_quantity(raw["reactions"][0]["pre_exponential"], "1/s", "reactions.0.pre_exponential")
        if k < 0:
            raise CaseError(f"reactions.0.pre_exponential = {raw['reactions'][0]['pre_exponential']!r}: must be >= 0.")
        return super().__call__(raw, case_dir)


def _calls(log_dir, tag):
    lines = []
    for path in Path(log_dir).glob(f"{tag}-*.log"):
        lines += path.read_text().splitlines()
    return lines


def _key(row):
    return f"{row['heat.medium.temperature']!r} {int(row['tube.count'])}"


def _call_keys(log_dir, tag):
    return [" ".join(line.split()[:2]) for line in _calls(log_dir, tag)]


# -- paths, --vary, grid ----------------------------------------------------------------------
def test_parse_vary_converts_to_si_and_writes_si_text():
    spec = parse_vary("heat.medium.temperature=300 degC..400 degC in 3")
    # analytic: T[K] = T[degC] + 273.15 (definition of the Celsius scale)
    assert spec.values_si == pytest.approx([573.15, 623.15, 673.15], abs=1e-12)
    assert spec.values_text == ["573.15 K", "623.15 K", "673.15 K"]
    assert spec.dimensionality == "[temperature]"
    ints = parse_vary("tube.count=10..20 in 3")
    assert ints.integer and ints.values_text == ["10", "15", "20"]
    fractions = parse_vary("feed.mole_fractions.OX=0.01..0.03 in 3")
    assert fractions.values_text == ["0.01", "0.02", "0.03"] and not fractions.integer
    energy = parse_vary("reactions.0.activation_energy=70 kJ/mol..90 kJ/mol in 2")
    assert energy.values_text == ["70000.0 J/mol", "90000.0 J/mol"]


@pytest.mark.parametrize("spec, message", [
    ("heat.medium.temperature 600 K..660 K in 31", r"PATH=START\.\.STOP in N"),
    ("heat.medium.temperature=600 K..660 K", r"START\.\.STOP in N after '='"),
    ("heat.medium.temperature=600 K..660 K in 0", r"N = '0'"),
    ("heat.medium.temperature=600 K..660 K in 2.5", r"N = '2.5'"),
    # the colon form of earlier versions is refused with the new spelling
    ("heat.medium.temperature=600 K:660 K:31",
     r'no longer accepted; write "heat\.medium\.temperature=600 K\.\.660 K in 31"'),
    ("heat.medium.temperature=600 K..660 in 31", r"same dimension"),
    ("heat.medium.temperature=600 K..6 bar in 31", r"same dimension"),
    ("heat.medium.temperature=600 K..660 K in 1", r"N = 1 needs START == STOP"),
    ("heat..medium_temperature=600 K..660 K in 3", r"not a dotted path"),
    ("heat.medium.temperature=600 kelvinz..660 K in 3", r"unknown unit"),
])
def test_parse_vary_rejects_bad_options(spec, message):
    with pytest.raises(CaseError, match=message):
        parse_vary(spec)


def test_set_path_copies_and_round_trips_si_text():
    before = copy.deepcopy(BASE_CASE)
    new = set_path(BASE_CASE, "heat.medium.temperature", 612.5)
    assert BASE_CASE == before  # input never mutated
    assert new["heat"]["medium"]["temperature"] == "612.5 K"
    assert parse_quantity(new["heat"]["medium"]["temperature"], "temperature", "t") == 612.5
    new = set_path(BASE_CASE, "reactions.0.pre_exponential", 2.5e7)
    assert new["reactions"][0]["pre_exponential"] == "25000000.0 1/s"
    assert BASE_CASE["reactions"][0]["pre_exponential"] == "1e7 1/s"
    assert set_path(BASE_CASE, "tube.count", 12.0)["tube"]["count"] == 12
    assert isinstance(set_path(BASE_CASE, "tube.count", 12.0)["tube"]["count"], int)
    assert set_path(BASE_CASE, "feed.pressure", "3 bar")["feed"]["pressure"] == "3 bar"


@pytest.mark.parametrize("path, value, message", [
    ("heat.medium.temprature", 600.0,
     r"heat\.medium\.temprature: no field 'temprature' in heat\.medium; valid: temperature\. "
     r"Did you mean 'temperature'\?"),
    ("hat.medium.temperature", 600.0, r"no field 'hat' in the case; valid: design, feed, heat.*'heat'"),
    ("reactions.3.pre_exponential", 1.0, r"index 3 out of range; reactions has 1 entries"),
    ("reactions.first.pre_exponential", 1.0, r"reactions is a list; expected an index"),
    ("tube.count", 10.5, r"tube\.count = 10\.5: must be a whole number"),
    ("heat.medium.temperature.value", 1.0, r"is a value .* cannot descend"),
    ("feed.mole_fractions.XO", 0.1, r"no field 'XO' in feed\.mole_fractions; valid: N2, O2, OX"),
    ("feed.mole_fractions.OX", 1.0, r"sum to 1\.0 >= 1, leaving nothing for O2, N2"),
    ("feed.mole_fractions.OX", -0.1, r"must be between 0 and 1"),
])
def test_set_path_errors_name_the_path_and_the_choices(path, value, message):
    with pytest.raises(CaseError, match=message):
        set_path(BASE_CASE, path, value)


def test_mole_fraction_rescales_others_to_sum_one():
    # invariant: fractions sum to 1 and the untouched species keep their ratio
    new = set_path(BASE_CASE, "feed.mole_fractions.OX", 0.03)["feed"]["mole_fractions"]
    assert new["OX"] == 0.03
    assert sum(new.values()) == pytest.approx(1.0, abs=4e-16)
    assert new["O2"] / new["N2"] == pytest.approx(0.2 / 0.79, rel=1e-14)
    assert new["O2"] == pytest.approx(0.2 * 0.97 / 0.99, rel=1e-14)
    # two fractions of one feed are applied together, the rest rescaled once
    both = apply_values(BASE_CASE, {"feed.mole_fractions.OX": 0.05, "feed.mole_fractions.O2": 0.15})
    fractions = both["feed"]["mole_fractions"]
    assert (fractions["OX"], fractions["O2"]) == (0.05, 0.15)
    assert fractions["N2"] == pytest.approx(0.8, rel=1e-14)


def test_check_vary_compares_dimension_with_the_case():
    check_vary(BASE_CASE, parse_vary("heat.medium.temperature=300 degC..400 degC in 3"))
    check_vary(BASE_CASE, parse_vary("tube.count=8..12 in 5"))
    with pytest.raises(CaseError, match=r"heat\.medium\.temperature: needs units like the case value '600 K'"):
        check_vary(BASE_CASE, parse_vary("heat.medium.temperature=600..700 in 3"))
    with pytest.raises(CaseError, match=r"tube\.count: is a plain number in the case"):
        check_vary(BASE_CASE, parse_vary("tube.count=1 m..2 m in 3"))
    with pytest.raises(CaseError, match=r"has dimension \[temperature\] in the case"):
        check_vary(BASE_CASE, parse_vary("heat.medium.temperature=1 bar..2 bar in 3"))
    with pytest.raises(CaseError, match=r"whole-number field"):
        check_vary(BASE_CASE, parse_vary("tube.count=8..12 in 4"))


def test_grid_is_full_factorial_in_a_fixed_order():
    cases = grid([parse_vary("tube.count=1..2 in 2"), parse_vary("heat.medium.temperature=600 K..700 K in 3")])
    assert [cid for cid, _ in cases] == list(range(6))
    assert [tuple(v.values()) for _, v in cases] == [
        (1, 600.0), (1, 650.0), (1, 700.0), (2, 600.0), (2, 650.0), (2, 700.0)]
    with pytest.raises(CaseError, match=r"tube\.count varied more than once"):
        grid([parse_vary("tube.count=1..2 in 2"), parse_vary("tube.count=3..4 in 2")])
    with pytest.raises(CaseError, match=r"no field 'colant'"):
        get_path(BASE_CASE, "heat.colant")


def test_plan_batches_sizes():
    cases = [(i, {}) for i in range(2500)]
    batches = plan_batches(cases, seconds_per_case=0.01, workers=2)
    assert all(len(b) == 50 for b in batches) and sum(map(len, batches)) == 2500
    small = plan_batches(cases[:60], workers=2)
    assert [len(b) for b in small] == [30, 30]
    assert [len(b) for b in plan_batches(cases[:40], workers=2)] == [40]
    assert [len(b) for b in plan_batches(cases[:7], workers=2)] == [7]
    slow = plan_batches(cases[:500], seconds_per_case=0.3, workers=2)
    assert min(len(b) for b in slow) >= MIN_BATCH
    assert [len(b) for b in plan_batches(cases[:10], batch_size=4)] == [4, 4, 2]


# -- store --------------------------------------------------------------------------------------
def test_store_columns_export_and_resume_refusal(tmp_path):
    db = tmp_path / "results.sqlite"
    with ResultsStore(db, ["heat.medium.temperature", 'odd"name'], {"command": "sweep", "seed": 1}) as store:
        assert store.columns == ["case_id", "heat.medium.temperature", 'odd"name', *RESULT_FIELDS]
        store.write_rows([{"case_id": 0, "heat.medium.temperature": 600.0, 'odd"name': 1.0, "status": "ok",
                           "hot_spot_temperature_K": float("nan"), "outlet_conversion": 0.5}])
        with pytest.raises(sqlite3.IntegrityError):
            store.write_rows([{"case_id": 1, "status": "ok"}, {"case_id": 0, "status": "ok"}])
        assert store.done_ids() == {0}  # the failed transaction left nothing behind
        csv_path = store.export_csv(tmp_path / "results.csv")
    conn = sqlite3.connect(db)
    names = [row[1] for row in conn.execute("PRAGMA table_info(cases)")]
    conn.close()
    assert names == ["case_id", "heat.medium.temperature", 'odd"name', "status", "hot_spot_temperature_K",
                     "hot_spot_position_m", "outlet_conversion", "outlet_temperature_K", "outlet_pressure_Pa",
                     "error"]
    lines = csv_path.read_text().splitlines()
    assert lines[0].startswith('case_id,heat.medium.temperature,"odd""name",status')
    assert lines[1] == "0,600.0,1.0,ok,,,0.5,,,"
    with pytest.raises(ResumeError, match=r"holds a run varying \['heat.medium.temperature', 'odd\"name'\]"):
        ResultsStore(db, ["tube.count"])
    with pytest.raises(ResumeError, match=r"meta seed = 2 differs from the stored run \(1\)"):
        ResultsStore(db, ["heat.medium.temperature", 'odd"name'], {"seed": 2})
    assert ResultsStore.read_meta(db)["seed"] == 1


# -- execution on the local process pool ---------------------------------------------------------
def test_failed_cases_are_recorded_and_the_run_goes_on(tmp_path):
    vary = ["heat.medium.temperature=600 K..700 K in 5", "tube.count=12..14 in 3"]
    summary = run_grid_sweep(BASE_CASE, tmp_path, vary, ClosedFormEvaluator(tmp_path, fail_count=13),
                             tmp_path / "out", batch_size=4, progress=False)
    assert (summary.total, summary.computed, summary.failed, summary.skipped) == (15, 15, 5, 0)
    with ResultsStore(tmp_path / "out" / "results.sqlite", ["heat.medium.temperature", "tube.count"]) as store:
        rows = store.rows()
    failed = [r for r in rows if r["status"] == "failed"]
    assert {r["tube.count"] for r in failed} == {13.0}
    assert all(r["error"] == "ValueError: test evaluator rejects tube.count = 13 second line" for r in failed)
    assert all(r["hot_spot_temperature_K"] is None for r in failed)
    for r in rows:
        if r["status"] == "ok":  # closed form of the test evaluator, exact
            T_c = r["heat.medium.temperature"]
            assert r["hot_spot_temperature_K"] == T_c + 10.0 + (STEP if T_c > THRESHOLD else 0.0)
            assert r["hot_spot_position_m"] == 0.1 * r["tube.count"]
            assert r["outlet_pressure_Pa"] == 2e5 - 1e4
    assert (tmp_path / "out" / "results.csv").read_text().count("\n") == 16
    # failed cases are skipped on resume until forgotten; then exactly they run again
    with ResultsStore(tmp_path / "out" / "results.sqlite", ["heat.medium.temperature", "tube.count"]) as store:
        assert store.count(status="failed") == 5 and store.forget("failed") == 5
    again = run_grid_sweep(BASE_CASE, tmp_path, vary, ClosedFormEvaluator(tmp_path, "retry"), tmp_path / "out",
                           batch_size=4, progress=False)
    assert (again.skipped, again.computed, again.failed) == (10, 5, 0)
    assert sorted(_call_keys(tmp_path, "retry")) == sorted(_key(r) for r in failed)
    # worker_cache: the heavy object was built once per worker process, not per case or batch
    builds = [p.read_text().count("build") for p in tmp_path.glob("builds-*.log")]
    assert builds and all(b == 1 for b in builds)


class _InterruptAfter:
    """Progress stand-in that raises KeyboardInterrupt (Ctrl-C) after some stored batches."""

    def __init__(self, batches):
        self.batches = batches

    def start(self, total, done=0, failed=0):
        pass

    def update(self, n, failed=0):
        self.batches -= 1
        if self.batches == 0:
            raise KeyboardInterrupt

    def close(self):
        pass


def test_resume_after_ctrl_c_computes_each_missing_case_once(tmp_path):
    vary = ["heat.medium.temperature=600 K..700 K in 40", "tube.count=10..12 in 3"]
    out = tmp_path / "out"
    with pytest.raises(KeyboardInterrupt):
        run_grid_sweep(BASE_CASE, tmp_path, vary, ClosedFormEvaluator(tmp_path, "first", delay=0.01), out,
                       batch_size=10, progress=_InterruptAfter(2))
    paths = ["heat.medium.temperature", "tube.count"]
    with ResultsStore(out / "results.sqlite", paths) as store:
        stored = {_key(r) for r in store.rows()}
    assert 20 <= len(stored) < 120
    assert not (out / "results.csv").exists()
    summary = run_grid_sweep(BASE_CASE, tmp_path, vary, ClosedFormEvaluator(tmp_path, "second"), out,
                             batch_size=10, progress=False)
    assert summary.skipped == len(stored) and summary.computed == 120 - len(stored)
    second = _call_keys(tmp_path, "second")
    assert len(second) == len(set(second)) == 120 - len(stored)
    assert not set(second) & stored
    with ResultsStore(out / "results.sqlite", paths) as store:
        rows = store.rows()
    assert [r["case_id"] for r in rows] == list(range(120))
    assert len({_key(r) for r in rows}) == 120


def test_resume_after_sigkill_of_a_running_sweep(tmp_path):
    out = tmp_path / "out"
    vary = ["heat.medium.temperature=600 K..700 K in 50", "tube.count=10..12 in 3"]
    script = tmp_path / "sweep.py"
    script.write_text(textwrap.dedent(f"""
        from test_sweeps_engine import BASE_CASE, ClosedFormEvaluator
        from simulator.sweeps.execute import run_grid_sweep
        run_grid_sweep(BASE_CASE, {str(tmp_path)!r}, {vary!r},
                       ClosedFormEvaluator({str(tmp_path)!r}, "killed", delay=0.03),
                       {str(out)!r}, batch_size=5, progress=False)
    """))
    env = dict(os.environ, PYTHONPATH=os.pathsep.join([str(ROOT), str(ROOT / "tests")]))
    proc = subprocess.Popen([sys.executable, str(script)], env=env, start_new_session=True,
                            stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    db = out / "results.sqlite"
    deadline = time.monotonic() + 60
    count = 0
    try:
        while count < 20 and time.monotonic() < deadline and proc.poll() is None:
            time.sleep(0.02)
            if db.exists():
                conn = sqlite3.connect(db, timeout=1)
                try:
                    count = conn.execute("SELECT COUNT(*) FROM cases").fetchone()[0]
                except sqlite3.OperationalError:  # table not created yet, or briefly locked
                    pass
                finally:
                    conn.close()
        assert proc.poll() is None, f"sweep ended before it could be killed: {proc.stderr.read()!r}"
        os.killpg(proc.pid, signal.SIGKILL)  # the sweep and its pool workers (its own session)
    finally:
        if proc.poll() is None:
            os.killpg(proc.pid, signal.SIGKILL)
        proc.wait(timeout=30)
        proc.stderr.close()
    conn = sqlite3.connect(db)
    assert conn.execute("PRAGMA integrity_check").fetchone()[0] == "ok"
    conn.close()
    paths = ["heat.medium.temperature", "tube.count"]
    with ResultsStore(db, paths) as store:
        before = store.rows()
    stored = {_key(r) for r in before}
    assert 20 <= len(stored) < 150 and len(stored) % 5 == 0  # whole batches only
    summary = run_grid_sweep(BASE_CASE, tmp_path, vary, ClosedFormEvaluator(tmp_path, "resumed"), out,
                             batch_size=5, progress=False)
    assert summary.computed == 150 - len(stored)
    resumed = _call_keys(tmp_path, "resumed")
    assert len(resumed) == len(set(resumed)) == 150 - len(stored)
    assert not set(resumed) & stored
    with ResultsStore(db, paths) as store:
        after = store.rows()
    by_id = {r["case_id"]: r for r in after}
    assert all(by_id[r["case_id"]] == r for r in before)  # stored rows untouched by the resume
    assert [r["case_id"] for r in after] == list(range(150))
    assert all(r["status"] == "ok" for r in after)


def test_a_case_that_kills_its_worker_is_isolated_and_recorded(tmp_path):
    vary = ["heat.medium.temperature=600 K..700 K in 8", "tube.count=10..12 in 3"]
    T_values = parse_vary(vary[0]).values_si
    evaluator = ClosedFormEvaluator(crash_when=(float(T_values[3]), 11))
    summary = run_grid_sweep(BASE_CASE, tmp_path, vary, evaluator, tmp_path / "out", batch_size=6, progress=False)
    assert summary.computed == 24 and summary.failed == 1
    with ResultsStore(tmp_path / "out" / "results.sqlite", ["heat.medium.temperature", "tube.count"]) as store:
        rows = store.rows()
    (bad,) = [r for r in rows if r["status"] == "failed"]
    assert (bad["heat.medium.temperature"], bad["tube.count"]) == (T_values[3], 11.0)
    assert bad["error"].startswith("worker process died while computing this case")
    assert sum(r["status"] == "ok" for r in rows) == 23


class _WorkersWithoutTubesim(cf.ThreadPoolExecutor):
    """Executor whose tasks fail before the evaluator runs, like a worker missing the package."""

    def submit(self, fn, *args, **kwargs):
        def fail():
            raise ModuleNotFoundError("No module named 'simulator'")
        return super().submit(fail)


def test_platform_failure_stops_the_run_instead_of_storing_failed_cases(tmp_path):
    with _WorkersWithoutTubesim(1) as pool, pytest.raises(SweepError, match=r"failed outside the evaluator "
                                                           r"\(ModuleNotFoundError: No module named 'simulator'\)"):
        run_grid_sweep(BASE_CASE, tmp_path, ["tube.count=10..12 in 3"], ClosedFormEvaluator(), tmp_path / "out",
                       executor=pool, progress=False)
    with ResultsStore(tmp_path / "out" / "results.sqlite", ["tube.count"]) as store:
        assert store.count() == 0


def test_bad_path_fails_before_any_worker_starts(tmp_path):
    with pytest.raises(CaseError, match=r"no field 'coolant_temp' in heat"):
        run_grid_sweep(BASE_CASE, tmp_path, ["heat.coolant_temp=600 K..700 K in 3"], ClosedFormEvaluator(),
                       tmp_path / "out", progress=False)


# -- uncertainty: sampling and statistics --------------------------------------------------------------
def _uncertain_case(entries):
    raw = copy.deepcopy(BASE_CASE)
    raw["uncertainty"] = entries
    return raw


def test_parse_uncertainty_reports_every_problem():
    raw = _uncertain_case([
        {"parameter": "heat.medium.temperature", "distribution": "normal", "std": "2 bar"},
        {"parameter": "heat.medium.temperature", "distribution": "normall", "std": "2 K"},
        {"parameter": "reactions.0.pre_exponential", "distribution": "lognormal", "factor": 0.5},
        {"parameter": "reactions.0.activation_energy", "distribution": "uniform", "low": "70 kJ/mol"},
        {"parameter": "heat.medium.temperature", "distribution": "normal", "std": "2 degC"},
        {"parameter": "tube.count", "distribution": "normal", "std": 1},
        {"parameter": "heat.medium.temperature", "distribution": "normal", "sdt": "2 K", "std": "1 K"},
    ])
    with pytest.raises(CaseError) as info:
        sampling.parse_uncertainty(raw["uncertainty"], raw)
    problems = info.value.problems
    assert len(problems) == 7
    # one-line style of the case loader: field path with dots, the value as written, what is accepted
    assert problems[0] == ("uncertainty.0.std = '2 bar': the unit bar does not convert to the unit of "
                           "heat.medium.temperature ('600 K'); expected a temperature difference, "
                           'e.g. "2 K" or "2 delta_degC"')
    assert "choose one of: normal, lognormal, uniform, truncated-normal. Did you mean 'normal'?" in problems[1]
    assert "uncertainty.2.factor = 0.5: a plain number > 1" in problems[2]
    assert "uncertainty.3.high: missing" in problems[3]
    assert "temperature difference" in problems[4]
    assert "whole-number field" in problems[5]
    assert "uncertainty.6.sdt: unknown key" in problems[6] and "Did you mean 'std'?" in problems[6]
    assert not any("[" in line for line in problems)         # no raw pint dimensions, no [0] indices
    with pytest.raises(CaseError, match=r"^uncertainty\.0\.std = '2 bar': the unit bar"):
        sampling.parse_uncertainty(raw["uncertainty"][:1], raw)


def test_uncertainty_unit_errors_name_the_unit_of_a_composite_field_in_words():
    # before: "wrong dimension ([mass] * [length] ** 2 / ...); expected dimension 1 / [time]"
    raw = _uncertain_case([
        {"parameter": "reactions.0.pre_exponential", "distribution": "uniform", "low": "1 kJ/mol", "high": 2e7},
        {"parameter": "reactions.0.activation_energy", "distribution": "truncated-normal", "std": "2 kJ/mol",
         "low": "90 kJ/mol", "factor": 2},
    ])
    with pytest.raises(CaseError) as info:
        sampling.parse_uncertainty(raw["uncertainty"], raw)
    problems = info.value.problems
    assert problems[0] == ("uncertainty.0.low = '1 kJ/mol': the unit kJ / mol does not convert to the unit of "
                           "reactions.0.pre_exponential ('1e7 1/s'); expected units that convert to 1/s, "
                           'e.g. "1 1/s"')
    assert problems[1].startswith("uncertainty.1.factor = 2: not used by a truncated-normal distribution; "
                                  "it takes std, low, high")
    raw["uncertainty"] = raw["uncertainty"][1:]
    del raw["uncertainty"][0]["factor"]
    with pytest.raises(CaseError, match=r"^uncertainty\.0: the case value reactions\.0\.activation_energy = "
                                        r"'80 kJ/mol' must lie between low and high"):
        sampling.parse_uncertainty(raw["uncertainty"], raw)


def test_normal_and_lognormal_samples_follow_their_definitions():
    raw = _uncertain_case([
        {"parameter": "reactions.0.activation_energy", "distribution": "normal", "std": "2 kJ/mol"},
        {"parameter": "reactions.0.pre_exponential", "distribution": "lognormal", "factor": 1.5},
        {"parameter": "heat.medium.temperature", "distribution": "uniform", "low": "330 degC", "high": "430 degC"},
    ])
    specs = sampling.parse_uncertainty(raw["uncertainty"], raw)
    base = sampling.base_values(specs, raw)
    assert list(base) == [80000.0, 1e7, 600.0]
    x = sampling.sample(specs, base, 4000, seed=7)
    # analytic properties of the distributions; LHS stratifies each margin, so 4000 points
    # reproduce mean/std/median to far better than the 1 % allowed here
    assert x[:, 0].mean() == pytest.approx(80000.0, rel=1e-4)
    assert x[:, 0].std() == pytest.approx(2000.0, rel=1e-2)
    assert np.median(x[:, 1]) == pytest.approx(1e7, rel=1e-2)
    assert np.log(x[:, 1]).std() == pytest.approx(math.log(1.5), rel=1e-2)
    assert x[:, 2].min() >= 603.15 and x[:, 2].max() <= 703.15
    assert x[:, 2].mean() == pytest.approx(653.15, abs=0.05)
    again = sampling.sample(specs, base, 4000, seed=7)
    assert np.array_equal(x, again)  # the seed fixes the samples
    assert not np.array_equal(x, sampling.sample(specs, base, 4000, seed=8))


def test_sobol_warns_unless_power_of_two():
    with pytest.warns(SimulatorWarning, match=r"power of 2 \(64 or 128\)"):
        u = sampling.unit_points(100, 2, seed=1, method="sobol")
    assert u.shape == (100, 2)
    assert sampling.unit_points(128, 2, seed=1, method="sobol").shape == (128, 2)
    with pytest.raises(CaseError, match=r"choose one of: lhs, sobol"):
        sampling.unit_points(8, 1, seed=1, method="halton")


def test_binomial_intervals_match_their_closed_forms():
    # analytic special cases: Clopper-Pearson with k = 0 has upper (1 - (alpha/2)^(1/n)),
    # k = n has lower (alpha/2)^(1/n); Wilson with k = 0 has upper z^2 / (n + z^2).
    n, alpha = 40, 0.05
    assert sampling.clopper_pearson(0, n, 0.95) == pytest.approx((0.0, 1 - (alpha / 2) ** (1 / n)), rel=1e-12)
    assert sampling.clopper_pearson(n, n, 0.95) == pytest.approx(((alpha / 2) ** (1 / n), 1.0), rel=1e-12)
    z = 1.959963984540054
    assert sampling.wilson(0, n, 0.95) == pytest.approx((0.0, z * z / (n + z * z)), rel=1e-12)
    lo, hi = sampling.clopper_pearson(10, 40)
    wl, wh = sampling.wilson(10, 40)
    assert lo < wl < 0.25 < wh < hi  # the exact interval is the wider one here
    result = sampling.exceedance_probability([1.0, 2.0, float("nan"), 3.0, 4.0], 2.5)
    assert (result["exceeding"], result["n"], result["estimate"]) == (2, 4, 0.5)


def test_monte_carlo_known_answer_and_resume_with_recorded_seed(tmp_path):
    # Known answer (analytic): T_c ~ U(600 K, 700 K); the test evaluator's hot spot exceeds
    # the 750 K limit exactly when T_c > 675 K, so P = (700 - 675) / (700 - 600) = 0.25.
    # Its hot spot is strictly increasing in T_c, so Spearman's rho = 1 exactly.
    raw = _uncertain_case([
        {"parameter": "heat.medium.temperature", "distribution": "uniform", "low": "600 K", "high": "700 K"},
        {"parameter": "reactions.0.activation_energy", "distribution": "normal", "std": "2 kJ/mol"},
    ])
    out = tmp_path / "mc"
    result = run_uncertainty(raw, tmp_path, ClosedFormEvaluator(tmp_path, "mc"), out, 200, progress=False,
                             probe=ClosedFormProbe())
    p = result["probability_exceeding_limit"]
    lo, hi = p["interval"]
    assert lo < 0.25 < hi and hi - lo < 0.15
    # LHS puts exactly one point in each 0.5 K stratum of [600, 700] K; 675 K is a stratum
    # boundary, so exactly 50 of 200 points lie above it (analytic, no sampling error).
    assert (p["exceeding"], p["n"]) == (50, 200)
    hot = result["percentiles"]["hot_spot_temperature_K"]
    assert hot["p50"] == pytest.approx(650.0 + 10.0, abs=1.0)         # median of U(600, 700) + 10 K
    assert hot["p95"] == pytest.approx(695.0 + 10.0 + STEP, abs=1.0)  # 95th percentile + 10 K + step
    rho = result["rank_correlation_with_hot_spot"]
    assert rho["heat.medium.temperature"]["spearman_rho"] == pytest.approx(1.0, abs=1e-12)
    assert abs(rho["reactions.0.activation_energy"]["spearman_rho"]) < 0.3
    seed = result["samples"]["seed"]
    assert ResultsStore.read_meta(out / "results.sqlite")["seed"] == seed
    assert (out / "uncertainty.json").exists() and (out / "results.csv").exists()
    # rerun without a seed: the stored seed is reused, nothing is recomputed
    again = run_uncertainty(raw, tmp_path, ClosedFormEvaluator(tmp_path, "mc-again"), out, 200, progress=False,
                            probe=ClosedFormProbe())
    assert again["samples"]["seed"] == seed and again["run"]["computed"] == 0
    assert again["probability_exceeding_limit"] == p and _calls(tmp_path, "mc-again") == []
    with pytest.raises(ResumeError, match=r"meta seed"):
        run_uncertainty(raw, tmp_path, ClosedFormEvaluator(), out, 200, seed=seed + 1, progress=False,
                        probe=ClosedFormProbe())
    # Sobol' design through an executor passed in (threads here): same known answer
    with cf.ThreadPoolExecutor(2) as pool:
        sob = run_uncertainty(raw, tmp_path, ClosedFormEvaluator(), tmp_path / "sobol", 256, seed=3,
                              method="sobol", executor=pool, progress=False, probe=ClosedFormProbe())
    lo, hi = sob["probability_exceeding_limit"]["interval"]
    assert lo < 0.25 < hi
    assert sob["probability_exceeding_limit"]["estimate"] == pytest.approx(0.25, abs=0.02)


# -- truncated normal, refused distributions, invalid samples, bookkeeping ------------------------------
def test_truncated_normal_samples_follow_the_closed_form_cdf():
    # Analytic: the CDF of N(mu, sigma) cut to [a, b] is (Phi(z) - Phi(alpha)) / (Phi(beta) - Phi(alpha)),
    # z = (x - mu)/sigma, written out here with the standard normal CDF (scipy.special.ndtr), not truncnorm.
    # Inverse-CDF mapping of a Latin hypercube puts one sample in each 1/n stratum of that CDF,
    # so the Kolmogorov-Smirnov distance is at most 1/n (a property of the design, no sampling error).
    from scipy.special import ndtr
    from scipy.stats import norm

    from simulator.sweeps.uncertain_ranges import checked_against_loader

    raw = _uncertain_case([
        {"parameter": "reactions.0.pre_exponential", "distribution": "truncated-normal", "std": "1.2e7 1/s"},
        {"parameter": "heat.medium.temperature", "distribution": "truncated-normal", "std": "30 K",
         "low": "590 K", "high": "650 K"},
    ])
    specs = sampling.parse_uncertainty(raw["uncertainty"], raw)
    base = sampling.base_values(specs, raw)
    specs, ranges = checked_against_loader(specs, base, raw, ClosedFormProbe())
    assert specs[0].low == pytest.approx(0.0, abs=1e7 * 1e-6) and specs[0].high == math.inf  # the accepted range
    assert ranges["reactions.0.pre_exponential"]["share_outside"] < 1e-6
    n = 4000
    x = sampling.sample(specs, base, n, seed=3)
    for j, (mu, sigma) in enumerate([(1e7, 1.2e7), (600.0, 30.0)]):
        a, b = specs[j].low, specs[j].high
        alpha, beta = (a - mu) / sigma, (b - mu) / sigma

        def cdf(v):
            return (ndtr((v - mu) / sigma) - ndtr(alpha)) / (ndtr(beta) - ndtr(alpha))

        v = np.sort(x[:, j])
        assert v[0] >= a and v[-1] <= b
        F = cdf(v)
        ks = max(np.max(np.arange(1, n + 1) / n - F), np.max(F - np.arange(n) / n))
        assert ks <= 1.0 / n + 1e-9
        # mean of a truncated normal: mu + sigma (phi(alpha) - phi(beta)) / (Phi(beta) - Phi(alpha))
        mean = mu + sigma * (norm.pdf(alpha) - norm.pdf(beta)) / (ndtr(beta) - ndtr(alpha))
        assert v.mean() == pytest.approx(mean, rel=1e-3)


def test_a_distribution_with_much_mass_where_the_case_is_refused_is_refused():
    # before: the negative draws ran, failed and were silently left out of P(exceed)
    from simulator.sweeps.uncertain_ranges import checked_against_loader

    raw = _uncertain_case([{"parameter": "reactions.0.pre_exponential", "distribution": "normal", "std": "1e7 1/s"}])
    specs = sampling.parse_uncertainty(raw["uncertainty"], raw)
    with pytest.raises(CaseError) as info:
        checked_against_loader(specs, sampling.base_values(specs, raw), raw, ClosedFormProbe())
    (line,) = info.value.problems
    # share below 0 of N(1e7, 1e7) is Phi(-1) = 15.87 % (analytic)
    assert line.startswith("uncertainty.0: a normal distribution of reactions.0.pre_exponential (std = '1e7 1/s') "
                           "puts 15.9 % of its samples where the case is refused (below 0 1/s: must be >= 0)")
    assert "at most 0.1 % is accepted" in line and '"lognormal"' in line and '"truncated-normal"' in line
    # a truncated normal keeps the bounds it is given: cut at -1e7 1/s it still reaches below zero
    # (share below 0 of N(1e7, 1e7) cut to [-1e7, inf): (Phi(-1) - Phi(-2)) / (1 - Phi(-2)) = 13.9 %)
    raw["uncertainty"] = [{"parameter": "reactions.0.pre_exponential", "distribution": "truncated-normal",
                           "std": "1e7 1/s", "low": "-1e7 1/s"}]
    specs = sampling.parse_uncertainty(raw["uncertainty"], raw)
    with pytest.raises(CaseError, match=r"puts 13\.9 % of its samples where the case is refused"):
        checked_against_loader(specs, sampling.base_values(specs, raw), raw, ClosedFormProbe())


def test_invalid_samples_are_counted_and_the_probability_states_its_denominator(tmp_path):
    # N(1e7, 3.2e6): Phi(-3.125) = 0.089 % below 0, under the 0.1 % limit, so the run goes ahead.
    # A Latin hypercube of n = 5000 has exactly floor or ceil of 5000 * 0.00089 = 4.45 samples there.
    raw = _uncertain_case([
        {"parameter": "heat.medium.temperature", "distribution": "uniform", "low": "600 K", "high": "700 K"},
        {"parameter": "reactions.0.pre_exponential", "distribution": "normal", "std": "3.2e6 1/s"},
    ])
    out = tmp_path / "mc"
    result = run_uncertainty(raw, tmp_path, RefusingEvaluator(), out, 5000, seed=2, progress=False,
                             probe=ClosedFormProbe(), batch_size=500)
    s, p = result["samples"], result["probability_exceeding_limit"]
    summary = run_grid_sweep(_uncertain_case([]), tmp_path, ["reactions.0.pre_exponential=-1 1/s..1 1/s in 3"],
                             RefusingEvaluator(), tmp_path / "grid", progress=False)
    assert (summary.computed, summary.failed, summary.invalid) == (3, 0, 1)     # -1 1/s: refused, not failed
    assert s["invalid"] in (4, 5) and s["failed"] == 0 and s["valid"] == 5000 - s["invalid"]
    assert s["invalid_reasons"] == [{"reason": "reactions.0.pre_exponential below 0 1/s", "count": s["invalid"]}]
    assert p["denominator"] == p["n"] == 5000 - s["invalid"]
    assert p["left_out"] == {"invalid": s["invalid"], "failed": 0, "stopped_below_limit": 0, "without_hot_spot": 0}
    # the invalid rows are stored as such, with the loader's reason, not as failed runs
    with ResultsStore(out / "results.sqlite", ["heat.medium.temperature", "reactions.0.pre_exponential"]) as store:
        invalid = [r for r in store.rows() if r["status"] == "invalid"]
    assert len(invalid) == s["invalid"] and all(r["reactions.0.pre_exponential"] < 0 for r in invalid)
    assert all(r["error"].startswith("CaseError: reactions.0.pre_exponential") for r in invalid)
    text = sampling.format_summary(result)
    assert f"left out: {s['invalid']} invalid" in text and f"/{p['denominator']} " in text


def _row(status, hot, cid):
    return {"case_id": cid, "status": status, "hot_spot_temperature_K": hot, "outlet_conversion": 0.5,
            "heat.medium.temperature": 600.0 + cid, "error": None}


def test_summary_counts_every_status_and_stopped_runs_exceed():
    # bookkeeping rule (EXCEEDANCE_RULE): stopped at the guard above the limit -> exceeding;
    # failed, stopped below the limit and invalid -> left out, counted, and bracketed
    rows = ([_row("completed", 700.0, i) for i in range(6)] + [_row("completed", 760.0, 6)]
            + [_row("stopped", 1900.0, 7), _row("stopped", 1900.0, 8)]       # runaway guard
            + [_row("stopped", 720.0, 9)]                                     # pressure floor, below the limit
            + [_row("failed", None, 10), _row("invalid", None, 11)])
    specs = sampling.parse_uncertainty([{"parameter": "heat.medium.temperature", "distribution": "normal",
                                         "std": "2 K"}], BASE_CASE)
    result = sampling.summarize(rows, specs, 750.0, seed=1, method="lhs")
    p, s = result["probability_exceeding_limit"], result["samples"]
    assert (p["exceeding"], p["denominator"], p["estimate"]) == (3, 9, 3 / 9)
    assert p["denominator_counts"] == {"completed": 7, "stopped_at_guard_counted_exceeding": 2}
    assert p["left_out"] == {"invalid": 1, "failed": 1, "stopped_below_limit": 1, "without_hot_spot": 0}
    assert p["if_left_out_exceeded"] == [3 / 11, 5 / 11]
    assert (s["n"], s["valid"], s["invalid"], s["failed"], s["stopped"], s["completed"]) == (12, 11, 1, 1, 3, 7)
    assert result["percentiles"]["hot_spot_temperature_K"]["p50"] == 700.0   # over the 9 runs of the denominator


# -- --vary values checked as an array -------------------------------------------------------------------
def test_twenty_thousand_values_are_classified_with_a_few_loads():
    # before: one case load per value (20 000 loads, about a minute); now the ends, nine interior
    # values, the one nearest zero and a bisection for each refused side
    from simulator.sweeps.validity import refused_values

    probe = ClosedFormProbe()
    values = list(np.linspace(-10.0, 460.0, 20000))
    refused, reasons = refused_values(probe, "heat.medium.temperature", values)
    assert list(refused) == [i for i, v in enumerate(values) if v <= 0]
    assert probe.loads <= 30
    assert set(reasons) <= set(refused.tolist()) and reasons[0].endswith("must be > 0.")
    probe = ClosedFormProbe()
    refused, reasons = refused_values(probe, "heat.medium.temperature", list(np.linspace(300.0, 460.0, 20000)))
    assert refused.size == 0 and reasons == {} and probe.loads == 11


# -- one run per output folder ----------------------------------------------------------------------
def test_a_second_run_into_the_same_folder_is_refused_while_the_first_runs(tmp_path):
    # before: the second run inserted the same case ids and died with sqlite3.IntegrityError
    from simulator.sweeps.lock import LOCK_NAME, FolderInUseError, folder_lock

    holder = subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])
    try:
        (tmp_path / "out").mkdir()
        (tmp_path / "out" / LOCK_NAME).write_text(
            f'{{"pid": {holder.pid}, "host": "{__import__("socket").gethostname()}", "command": "sweep"}}')
        with pytest.raises(FolderInUseError, match=rf"in use by process {holder.pid} \(sweep"):
            run_grid_sweep(BASE_CASE, tmp_path, ["heat.medium.temperature=600 K..700 K in 3"],
                           ClosedFormEvaluator(), tmp_path / "out", progress=False)
        assert not (tmp_path / "out" / "results.sqlite").exists()
    finally:
        holder.kill()
        holder.wait()
    # the holder is gone: its lock is stale and is taken over; released at the end
    summary = run_grid_sweep(BASE_CASE, tmp_path, ["heat.medium.temperature=600 K..700 K in 3"],
                             ClosedFormEvaluator(), tmp_path / "out", progress=False)
    assert summary.computed == 3 and not (tmp_path / "out" / LOCK_NAME).exists()
    with folder_lock(tmp_path / "out"):
        with pytest.raises(FolderInUseError, match=rf"in use by process {os.getpid()}"):
            with folder_lock(tmp_path / "out"):
                pass
    # a live PID with another process start time: the PID was reused after the owner died, so stale
    (tmp_path / "out" / LOCK_NAME).write_text(
        f'{{"pid": {os.getpid()}, "host": "{__import__("socket").gethostname()}", "process_start": 1}}')
    with folder_lock(tmp_path / "out") as lock:
        assert f'"pid": {os.getpid()}' in lock.read_text() and '"process_start": 1,' not in lock.read_text()


# -- progress ------------------------------------------------------------------------------------------
class _FakeClock:
    def __init__(self):
        self.t = 0.0

    def __call__(self):
        return self.t


class _Stream:
    def __init__(self, tty):
        self.text, self.tty = "", tty

    def write(self, text):
        self.text += text

    def flush(self):
        pass

    def isatty(self):
        return self.tty


def test_progress_plain_lines_and_terminal_bar():
    clock, stream = _FakeClock(), _Stream(tty=False)
    bar = Progress(stream=stream, clock=clock, interval=5.0)
    bar.start(1000, done=100)
    assert stream.text == "cases: resuming, 100/1000 already stored\n"
    clock.t = 1.0
    bar.update(10)          # first update prints
    clock.t = 2.0
    bar.update(10)          # within 5 s and same 10 % step: silent
    clock.t = 4.0
    bar.update(80, failed=2)  # reaches 20 %: prints
    lines = stream.text.splitlines()
    assert len(lines) == 3
    assert lines[-1] == "cases   200/1000   20%  25 cases/s  left 0:00:32  failed 2"
    bar.close()             # nothing new since the last line: no repeat
    assert len(stream.text.splitlines()) == 3
    tty = _Stream(tty=True)
    bar = Progress(stream=tty, clock=clock)
    bar.start(100)
    clock.t += 2.0
    bar.update(50)
    bar.close()
    assert "\rcases  [##########----------]   50/100   50%  25 cases/s  left 0:00:02" in tty.text
    assert tty.text.endswith("\n")
    assert format_duration(None) == "?"
    fresh = _Stream(tty=False)              # a new run says so at once, before the first case finishes
    Progress(stream=fresh, clock=clock).start(20000)
    assert fresh.text == "cases: starting, 20000 to run\n"


# -- Dask on loopback (kept last: it starts threads in this process) ---------------------------------------
def test_dask_cluster_gives_the_same_results_as_the_local_pool(tmp_path):
    distributed = pytest.importorskip("distributed")
    vary = ["heat.medium.temperature=600 K..700 K in 20", "tube.count=12..14 in 3", "feed.mole_fractions.OX=0.01..0.02 in 2"]
    evaluator = ClosedFormEvaluator(fail_count=13)
    local = run_grid_sweep(BASE_CASE, tmp_path, vary, evaluator, tmp_path / "local", batch_size=25, progress=False)
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, host="127.0.0.1", dashboard_address=None,
                                  processes=True) as cluster:
        assert cluster.scheduler_address.startswith("tcp://127.0.0.1:")
        remote = run_grid_sweep(BASE_CASE, tmp_path, vary, evaluator, tmp_path / "dask",
                                scheduler=cluster.scheduler_address, batch_size=25, progress=False)
    assert (local.computed, remote.computed, remote.failed) == (120, 120, 40)
    assert remote.batches == 5 and remote.workers == 2
    assert (tmp_path / "local" / "results.csv").read_text() == (tmp_path / "dask" / "results.csv").read_text()


def test_a_value_the_loader_overflows_on_is_a_refusal_not_a_traceback(monkeypatch):
    # an extreme swept value may overflow inside unit parsing; the check reports it as refused
    import simulator.case.load as load
    from simulator.sweeps.validity import CaseProbe

    def overflow(raw, source_path="", case_dir=None):
        raise OverflowError(34, "Numerical result out of range")

    monkeypatch.setattr(load, "load_case_dict", overflow)
    probe = CaseProbe(BASE_CASE, ".", "case.toml")
    assert probe.refusal("heat.medium.temperature", 1e300).startswith("OverflowError: ")
