"""The compiled batch integrator on Dask workers (simulator/sweeps/dask_compiled.py).

Invariants, no outside source: on a loopback cluster (two in-process workers, one thread
each) a grid sweep and an uncertainty run store exactly the rows of the local compiled
run (same integrator, tolerances and guards; cases the compiled loop hands back solved on
the worker by the per-case path); the chunk rule keeps tasks at least 0.5 s of work and
splits the rest over the worker threads; the engine that ran is printed and stored.
"""
import csv
import json
import math

import pytest

from simulator.cli import main
from simulator.sweeps.dask_compiled import (
    MAX_TASK_SECONDS, TARGET_TASK_SECONDS, TASKS_PER_THREAD, DaskChunks, chunk_size,
)

distributed = pytest.importorskip("distributed")

OXYLENE = "froment1967_oxylene_packed_tube.toml"
DEHYDRO = "dehydrogenation_heated_tube.toml"


@pytest.fixture(scope="module")
def cluster():
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=False,
                                  dashboard_address=None) as running:
        yield running


def _rows(path):
    with open(path) as handle:
        return list(csv.DictReader(handle))


# -- the chunk rule ------------------------------------------------------------------------------------
@pytest.mark.parametrize("n, threads, per_case", [
    (20000, 2, 1e-4), (20000, 2, 1e-3), (10**6, 2, 1e-4), (10**6, 64, 2e-5), (1000, 8, 1e-4), (7, 2, 1e-2),
    (50000, 3, 3e-4), (1, 1, 1.0),
])
def test_chunk_rule_keeps_tasks_long_enough_and_spreads_them(n, threads, per_case):
    size = chunk_size(n, threads, per_case)
    tasks = math.ceil(n / size)
    work = n * per_case
    assert 1 <= size <= n
    if work >= TARGET_TASK_SECONDS:              # every task but a shorter last one carries >= 0.5 s
        assert size * per_case >= TARGET_TASK_SECONDS
    else:
        assert tasks == 1                        # too little work to split at all
    assert size * per_case <= MAX_TASK_SECONDS + per_case
    if work >= TARGET_TASK_SECONDS * TASKS_PER_THREAD * threads and work <= MAX_TASK_SECONDS * threads:
        assert tasks == TASKS_PER_THREAD * threads   # enough work: several tasks per worker thread
    if work > MAX_TASK_SECONDS * TASKS_PER_THREAD * threads:
        assert tasks >= TASKS_PER_THREAD * threads


def test_chunk_rule_on_the_measured_grid():
    # reference notes section 7: 20 000 cases of about 0.1 ms on 2 worker threads ran fastest in
    # 4 tasks of 5 000 (5.3 s; 8 tasks of 2 500: 8.4 s; 2 tasks of 10 000: 6.4 s)
    assert chunk_size(20000, 2, 1e-4) == 5000
    assert chunk_size(0, 2, 1e-4) == 0


# -- identical rows on a loopback cluster --------------------------------------------------------------
def test_grid_sweep_on_dask_stores_the_rows_of_the_local_compiled_run(cases_dir, tmp_path, cluster, capsys):
    argv = ["sweep", str(cases_dir / OXYLENE), "--vary", "heat.medium.temperature=600 K..660 K in 400"]
    assert main(argv + ["--out", str(tmp_path / "local")]) == 0
    assert "(compiled engine)" in capsys.readouterr().out
    # 7 chunks of at most 60 cases, finishing in any order on the two workers
    assert main(argv + ["--out", str(tmp_path / "dask"), "--scheduler", cluster.scheduler_address,
                        "--batch-size", "60"]) == 0
    captured = capsys.readouterr()
    printed = captured.out
    assert f"(compiled engine on Dask at {cluster.scheduler_address})" in printed
    assert "400 computed now" in printed and "on 2 threads" in printed
    assert "dask: 2 worker(s), 2 thread(s) ready in" in captured.err      # the warm-up is said, not silent
    local = (tmp_path / "local" / "results.csv").read_text()
    assert local == (tmp_path / "dask" / "results.csv").read_text()
    hot = [float(row["hot_spot_temperature_K"]) for row in _rows(tmp_path / "local" / "results.csv")]
    assert max(hot) - min(hot) > 200.0     # the grid crosses the runaway boundary (quiet and runaway cases)


def test_cases_handed_back_by_the_compiled_loop_are_solved_on_the_workers_alike(cases_dir, tmp_path, cluster):
    # pre-exponentials from 4e15 1/s on: the explicit method exhausts its step budget in the fast
    # relaxation to equilibrium and the case falls back to the per-case implicit solve
    from simulator.case.load import load_case
    from simulator.model.build import build_model
    from simulator.sweeps import fast
    from simulator.sweeps.compiled_sweep import chunk_params, solve_chunk

    model = build_model(load_case(str(cases_dir / DEHYDRO)))
    paths = ["reactions.0.pre_exponential", "heat.medium.temperature"]
    cases = [(i, {paths[0]: a, paths[1]: t}) for i, (a, t) in
             enumerate((a, t) for a in (1e15, 4e15, 2e16) for t in (1240.0, 1260.0))]
    local = solve_chunk(model, chunk_params(cases, paths), paths, str(cases_dir))
    runner = DaskChunks(cluster.scheduler_address, chunk=2)
    try:
        remote = {cid: (out, k) for chunk, out in runner.solve(model, cases, paths, str(cases_dir))
                  for k, (cid, _) in enumerate(chunk)}
    finally:
        runner.close()
    assert runner.tasks == 3 and runner.threads == 2 and len(runner.warmup) == 2
    back = fast.batch_solve(model, chunk_params(cases, paths), paths, fallback=False)["fallback"]
    assert back.sum() == 4 and not back[:2].any()       # the 4e15 and 2e16 cases fell back
    for cid, _ in cases:
        out, k = remote[cid]
        for name in ("status", "hot_spot_temperature_K", "outlet_conversion", "outlet_pressure_Pa", "stop"):
            assert out[name][k] == local[name][cid], (cid, name)


def test_uncertainty_on_dask_runs_the_compiled_engine_and_stores_where(cases_dir, tmp_path, cluster, capsys):
    text = (cases_dir / OXYLENE).read_text().replace('temperature_limit = "1200 K"', 'temperature_limit = "800 K"')
    text += ('\n[[uncertainty]]\nparameter = "heat.medium.temperature"\ndistribution = "uniform"\n'
             'low = "620 K"\nhigh = "632 K"\n'
             '\n[[uncertainty]]\nparameter = "reactions.0.activation_energy"\ndistribution = "truncated-normal"\n'
             'std = "0.5 kJ/mol"\n')
    case = tmp_path / "u.toml"
    case.write_text(text)
    base = ["uncertainty", str(case), "--samples", "300", "--seed", "11"]
    assert main(base + ["--out", str(tmp_path / "local")]) == 0
    assert main(base + ["--out", str(tmp_path / "dask"), "--scheduler", cluster.scheduler_address]) == 0
    printed = capsys.readouterr().out
    assert f"compiled engine on Dask at {cluster.scheduler_address}" in printed
    local = json.loads((tmp_path / "local" / "uncertainty.json").read_text())
    remote = json.loads((tmp_path / "dask" / "uncertainty.json").read_text())
    assert (local["engine"], remote["engine"]) == ("compiled", "compiled")
    assert (local["run"]["scheduler"], remote["run"]["scheduler"]) == (None, cluster.scheduler_address)
    assert (tmp_path / "local" / "results.csv").read_text() == (tmp_path / "dask" / "results.csv").read_text()
    for key in ("samples", "probability_exceeding_limit", "percentiles"):
        assert local[key] == remote[key]


def test_uncertainty_on_dask_with_the_pool_engine_says_so(cases_dir, tmp_path, cluster):
    text = (cases_dir / OXYLENE).read_text()
    text += ('\n[[uncertainty]]\nparameter = "heat.medium.temperature"\ndistribution = "uniform"\n'
             'low = "620 K"\nhigh = "625 K"\n')
    case = tmp_path / "u.toml"
    case.write_text(text)
    assert main(["uncertainty", str(case), "--samples", "4", "--seed", "2", "--engine", "pool",
                 "--out", str(tmp_path / "pool"), "--scheduler", cluster.scheduler_address]) == 0
    data = json.loads((tmp_path / "pool" / "uncertainty.json").read_text())
    assert (data["engine"], data["run"]["scheduler"]) == ("pool", cluster.scheduler_address)


def test_a_finished_run_resumed_with_a_scheduler_contacts_none(cases_dir, tmp_path, capsys):
    # the store already holds every case: nothing is sent, so not even an address that answers is needed
    argv = ["sweep", str(cases_dir / OXYLENE), "--vary", "heat.medium.temperature=620 K..640 K in 5",
            "--out", str(tmp_path / "run")]
    assert main(argv) == 0
    before = (tmp_path / "run" / "results.csv").read_text()
    capsys.readouterr()
    assert main(argv + ["--scheduler", "tcp://127.0.0.1:9"]) == 0
    assert "0 computed now, 5 already done" in capsys.readouterr().out
    assert (tmp_path / "run" / "results.csv").read_text() == before
