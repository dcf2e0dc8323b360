"""Grid sweeps through the compiled batch integrator, with the same store and resume as the pool.

Used by ``tubesim sweep`` and ``tubesim uncertainty`` (one rule,
:mod:`simulator.sweeps.engine`) when every varied or sampled path is an operating
number the compiled path supports (:func:`simulator.sweeps.fast.supports`). Locally
cases run in chunks, the first small (progress within about a second), then doubling
up to :data:`CHUNK`; with a Dask scheduler the same chunk function runs on the workers
(:mod:`simulator.sweeps.dask_compiled`). Each chunk is written to
``results.sqlite`` in one transaction, so an interrupted run resumes where it
stopped, by this engine or the process pool alike (the store's ``meta`` is the
same). As for the pool evaluator, the design temperature limit does not stop a
sweep run: the runaway guard max(T_feed, T_medium) + 3 dT_ad + 500 K does.

Tolerance: rtol 3e-6 with the case's scale-based absolute tolerance; the tests
check agreement with per-case LSODA solves at rtol 1e-10 within 0.05 K on the
hot spot (the benchmark's acceptance bound).
"""
import math
import time
from pathlib import Path

import numpy as np

from simulator.sweeps.execute import RunSummary, grid_meta
from simulator.sweeps.lock import folder_lock
from simulator.sweeps.paths import check_vary, grid, parse_vary, VarySpec
from simulator.sweeps.progress import Progress
from simulator.sweeps.store import ResultsStore

SWEEP_RTOL = 3e-6
CHUNK = 5000
#: Cases in the first chunk (progress shows within about a second, numba cache load included).
FIRST_CHUNK = 250


def compiled_supported(model, paths):
    """True when the compiled path can run a sweep of these paths on this model."""
    from simulator.sweeps import fast

    return fast.supports(paths, model)


def _guards(model, y0):
    """Runaway guard temperature of every case from its inlet state, [K]."""
    from simulator.sweeps.evaluator import guard_from_rise, guard_rise

    n = model.n
    feeds, inverse = np.unique(y0[:, :n + 1], axis=0, return_inverse=True)   # flows, T: the rise is the feed's
    rise = np.array([guard_rise(model, row[:n], row[n]) for row in feeds], dtype=float)
    return guard_from_rise(rise[np.asarray(inverse).ravel()], y0[:, n], y0[:, n + 2])


def run_compiled_sweep(base_raw, case_dir, vary, model, out_dir, progress=True, scheduler=None, chunk=None):
    """Full grid through :func:`simulator.sweeps.fast.batch_solve`; returns a RunSummary.

    Holds the output folder's lock (:func:`simulator.sweeps.lock.folder_lock`) while it writes.
    ``scheduler`` and ``chunk``: as :func:`run_compiled_cases` (Dask workers, cases per task).
    """
    specs = [spec if isinstance(spec, VarySpec) else parse_vary(spec) for spec in vary]
    for spec in specs:
        check_vary(base_raw, spec)
    cases = grid(specs)
    paths = [s.path for s in specs]
    out_dir = Path(out_dir)
    with folder_lock(out_dir, "sweep"), \
            ResultsStore(out_dir / "results.sqlite", paths, grid_meta(base_raw, specs, cases)) as store:
        summary = run_compiled_cases(case_dir, cases, paths, model, store, progress=progress,
                                     scheduler=scheduler, chunk=chunk)
        store.export_csv(out_dir / "results.csv")
    return summary


def chunk_sizes(n, first=FIRST_CHUNK, largest=CHUNK):
    """Cases per chunk: small at first so progress shows within a second, then doubling.

    Examples
    --------
    >>> chunk_sizes(3000, first=250, largest=1000)
    [250, 500, 1000, 1000, 250]
    """
    sizes, size, left = [], int(first), int(n)
    while left > 0:
        take = min(size, left)
        sizes.append(take)
        left -= take
        size = min(2 * size, int(largest))
    return sizes


def run_compiled_cases(case_dir, cases, paths, model, store, progress=True, label="cases", ranges=None,
                       scheduler=None, chunk=None):
    """Solve ``(case_id, {path: value})`` cases on the compiled engine and store their rows.

    Cases already in ``store`` are skipped (resume). Each chunk is one transaction.
    A case the case loader refuses (values outside what it accepts) is stored with
    status ``"invalid"`` and the loader's message; a run that reaches the runaway guard
    is ``"stopped"``; a numerical failure is ``"failed"``. The rows do not depend on
    where the chunks ran: the same :func:`solve_chunk` runs them in this process or, with
    ``scheduler``, on Dask workers (:mod:`simulator.sweeps.dask_compiled`).

    Parameters
    ----------
    case_dir : str or Path
        Folder of the case file (for fallback cases).
    cases : list of (int, dict)
        Case ids and values in SI units, as :func:`simulator.sweeps.paths.grid` gives them.
    paths : list of str
        The varied paths (keys of the values).
    model : simulator.model.build.Model
        Base model.
    store : ResultsStore
        Where rows go.
    progress : bool
        Show progress on stderr.
    label : str
        Word in front of the progress line.
    ranges : dict, optional
        Accepted range per path (:func:`simulator.sweeps.uncertain_ranges.checked_against_loader`):
        a case with a value outside is stored as ``"invalid"`` without solving it, as the
        case loader of the per-case engine would refuse it.
    scheduler : str, optional
        Dask scheduler address: the chunks run on its workers.
    chunk : int, optional
        Cases per Dask task (``--batch-size``); default the rule of
        :func:`simulator.sweeps.dask_compiled.chunk_size`. Not used locally.

    Returns
    -------
    RunSummary
        Counts and timing.
    """
    started = time.perf_counter()
    done = store.done_ids()
    pending = [(cid, values) for cid, values in cases if cid not in done]
    bar = Progress(interactive=None, label=label) if progress else None
    if bar:
        bar.start(len(cases), done=len(cases) - len(pending), failed=store.count(status="failed") if done else 0)
    outside = _outside_rows(pending, ranges)
    solvable = [(cid, values) for cid, values in pending if cid not in outside]
    if scheduler is not None:
        from simulator.sweeps.dask_compiled import DaskChunks

        runner = DaskChunks(scheduler, chunk=chunk, announce=bool(progress))
    else:
        runner = LocalChunks()
    counts = {"failed": 0, "invalid": 0}

    def record(rows):
        rows = [rows[cid] for cid in sorted(rows)]
        n_failed = sum(row["status"] == "failed" for row in rows)
        counts["failed"] += n_failed
        counts["invalid"] += sum(row["status"] == "invalid" for row in rows)
        store.write_rows(rows)
        if bar:
            bar.update(len(rows), n_failed)

    try:
        if outside:
            record(outside)
        for chunk_cases, out in runner.solve(model, solvable, paths, case_dir):
            record({cid: _row(out, k, cid, values) for k, (cid, values) in enumerate(chunk_cases)})
    finally:
        runner.close()
        if bar:
            bar.close()
    return RunSummary(total=len(cases), skipped=len(cases) - len(pending), computed=len(pending),
                      failed=counts["failed"], batches=runner.tasks, batch_size=runner.largest,
                      workers=runner.threads, elapsed=time.perf_counter() - started, invalid=counts["invalid"])


#: Fields of a :func:`~simulator.sweeps.fast.batch_solve` result that a store row needs.
CHUNK_FIELDS = ("status", "invalid", "error", "stop", "hot_spot_temperature_K", "hot_spot_position_m",
                "outlet_conversion", "outlet_temperature_K", "outlet_pressure_Pa", "outlet_position_m")


def solve_chunk(model, params, paths, case_dir, threads=None):
    """One chunk of cases through the compiled batch integrator; what a store row needs.

    The one task body of the compiled engine, locally and on Dask workers, so rows do not
    depend on where they were computed: rtol :data:`SWEEP_RTOL`, the runaway guard of every
    case (:func:`_guards`), and the cases the compiled loop hands back (stiff, step budget,
    values the fast map refuses) solved here by the per-case path of
    :func:`~simulator.sweeps.fast.batch_solve`.

    Parameters
    ----------
    model : simulator.model.build.Model
        Base model.
    params : ndarray (N, len(paths))
        Values per case, SI.
    paths : list of str
        The varied paths.
    case_dir : str
        Folder of the case file (fallback cases).
    threads : int, optional
        numba threads for the compiled loop; default numba's setting.

    Returns
    -------
    dict
        :data:`CHUNK_FIELDS` (arrays over the chunk, ``error`` a list) and ``seconds``, the
        wall time of the chunk, [s]
    """
    from simulator.sweeps import fast

    t0 = time.perf_counter()
    packed = fast.pack_cases(model, params, paths)
    out = fast.batch_solve(model, params, paths, rtol=SWEEP_RTOL, temperature_limit=_guards(model, packed.y0),
                           case_dir=str(case_dir), threads=threads, packed=packed)
    result = {name: out[name] for name in CHUNK_FIELDS}
    result["seconds"] = time.perf_counter() - t0
    return result


def chunk_params(chunk, paths):
    """``(N, len(paths))`` array of the values of ``(case_id, values)`` cases, SI."""
    return np.array([[values[p] for p in paths] for _, values in chunk], dtype=float).reshape(len(chunk), len(paths))


class LocalChunks:
    """Chunks solved one after the other in this process (numba ``prange`` over the cores).

    The first chunk is small (progress within about a second), then sizes double up to
    :data:`CHUNK` (:func:`chunk_sizes`).
    """

    def __init__(self):
        self.tasks = 0
        self.largest = 0
        self.threads = _threads()

    def solve(self, model, cases, paths, case_dir):
        """Yield ``(chunk, result of solve_chunk)`` in case order."""
        start = 0
        for size in chunk_sizes(len(cases)):
            chunk = cases[start:start + size]
            start += size
            self.tasks += 1
            self.largest = max(self.largest, size)
            yield chunk, solve_chunk(model, chunk_params(chunk, paths), paths, case_dir)

    def close(self):
        """Nothing to release."""


def _outside_rows(chunk, ranges):
    """``{case_id: row}`` of the cases with a value outside its accepted range (status "invalid")."""
    from simulator.sweeps.store import RESULT_FIELDS
    from simulator.sweeps.uncertain_ranges import outside

    rows = {}
    for cid, values in chunk if ranges else ():
        why = outside(ranges, values)
        if why:
            row = {name: None for name in RESULT_FIELDS}
            row.update(values, case_id=cid, status="invalid",
                       error="outside the range the case accepts: " + "; ".join(why))
            rows[cid] = row
    return rows


def _row(out, k, cid, values):
    """Store row of case ``k`` of a :func:`~simulator.sweeps.fast.batch_solve` result."""
    from simulator.sweeps import fast

    status = "invalid" if out["invalid"][k] else fast.STATUS_NAMES[int(out["status"][k])]
    row = {"case_id": cid, **values, "status": status, "error": out["error"][k]}
    for name in ("hot_spot_temperature_K", "hot_spot_position_m", "outlet_conversion",
                 "outlet_temperature_K", "outlet_pressure_Pa"):
        value = float(out[name][k])
        row[name] = value if math.isfinite(value) and status not in ("failed", "invalid") else None
    if status == "stopped" and not row["error"]:
        where = f"z = {float(out['outlet_position_m'][k]):.6g} m"
        row["error"] = {fast.STOP_TEMPERATURE: f"stopped at the runaway guard at {where}; the hot spot is a lower bound",
                        fast.STOP_PRESSURE: f"stopped at {where}: the pressure fell below "
                                            f"{100 * fast.PRESSURE_FLOOR:g} % of the feed pressure"}.get(
            int(out["stop"][k]), f"stopped at {where}")
    return row


def _threads():
    import numba

    return numba.get_num_threads()
