"""Run many cases in batches on a process pool or a Dask cluster, storing rows as they finish.

The seam is :class:`concurrent.futures.Executor`: a local
``ProcessPoolExecutor`` (fork on Linux) by default, or
``distributed.Client(address).get_executor()`` for a Dask scheduler started with
``dask scheduler`` / ``dask worker``. The same batch function runs on both, so
results do not depend on where they were computed.

Evaluator
---------
An *evaluator* is a picklable object (a top-level class instance, or a top-level
function) called in the worker as ``evaluator(raw_case, case_dir) -> dict`` with the
keys of :data:`RESULT_FIELDS` (SI values; ``status`` text such as ``"ok"``; missing
numbers may be None). ``raw_case`` is the base case with this case's values already
applied (text in SI units, see :mod:`simulator.sweeps.paths`). Any exception it raises
becomes a row with ``status = "failed"`` and the one-line reason; the run goes on.
An optional attribute ``seconds_per_case`` (a rough estimate, [s]) sizes the batches.

Heavy objects (Cantera ``Solution``\\ s, compiled kernels) must not travel with every
task: pickling a Solution costs ~0.3 s and many are not picklable at all. Build them
inside the worker through :func:`worker_cache`, which keeps one object per key per
process for the life of the worker::

    def __call__(self, raw_case, case_dir):
        gas = worker_cache(("solution", self.mechanism), lambda: ct.Solution(self.mechanism))

The key must contain everything the object depends on (mechanism path, species).
For a remote cluster, ``case_dir`` (mechanism files are relative to it) must be
readable at the same path on every worker, e.g. on a shared file system.

Measured on this project's 2-vCPU machine (reference notes §4): per-task overhead
0.09 ms for a process pool, 2.7-6.7 ms for dask, 5-15 ms per PFR case; hence batches
of at least 25-50 cases (about 0.2-1 s of work) per task.
"""
import concurrent.futures as cf
import hashlib
import json
import math
import multiprocessing
import os
import pickle
import sys
import time
from dataclasses import dataclass
from pathlib import Path

from simulator.errors import CaseError, SimulatorError
from simulator.sweeps.lock import folder_lock
from simulator.sweeps.paths import apply_values, check_vary, grid, parse_vary, VarySpec
from simulator.sweeps.progress import Progress
from simulator.sweeps.store import RESULT_FIELDS, ResultsStore
from simulator.units import parse_quantity

#: Per-process cache of heavy objects (see :func:`worker_cache`). Module level, so it
#: lives as long as the worker process; never shipped between processes.
WORKER_CACHE = {}

#: Numeric result fields (SI) an evaluator returns besides ``status`` and ``error``.
NUMERIC_FIELDS = tuple(f for f in RESULT_FIELDS if f not in ("status", "error"))

#: Minimum cases per task when the batch size is chosen automatically.
MIN_BATCH = 25
#: Work per task the automatic batch size aims at, [s]
TARGET_TASK_SECONDS = 0.5
#: Assumed cost of one case when the evaluator gives no ``seconds_per_case``, [s]
DEFAULT_SECONDS_PER_CASE = 0.01
#: Longest error text stored per failed case (characters).
MAX_ERROR_CHARS = 500


class SweepError(SimulatorError):
    """A sweep cannot start (no scheduler at the address, unpicklable evaluator, ...)."""


def worker_cache(key, factory):
    """Object cached once per worker process: ``factory()`` on the first call for ``key``.

    Parameters
    ----------
    key : hashable
        Identifies the object and everything it depends on, e.g. ``("gas", mech_path)``.
    factory : callable
        Builds the object; called at most once per process and key.

    Returns
    -------
    object
        The cached object.
    """
    try:
        return WORKER_CACHE[key]
    except KeyError:
        value = WORKER_CACHE[key] = factory()
        return value


@dataclass(frozen=True)
class RunSummary:
    """What :func:`run_cases` did.

    Attributes
    ----------
    total : int
        Cases in the plan.
    skipped : int
        Cases already in the store at the start (resume).
    computed : int
        Cases computed and stored by this call.
    failed : int
        Of ``computed``, cases stored with status "failed".
    batches : int
        Tasks submitted (more than planned if a worker died and batches were split).
    batch_size : int
        Cases per task as planned.
    workers : int
        Worker processes (local) or worker threads (Dask) available.
    elapsed : float
        Wall time of the call, [s]
    invalid : int
        Of ``computed``, cases stored with status "invalid" (the case refused the values).
    """

    total: int
    skipped: int
    computed: int
    failed: int
    batches: int
    batch_size: int
    workers: int
    elapsed: float
    invalid: int = 0


def one_line_error(err):
    """``"<Type>: <message>"`` on one line, shortened to :data:`MAX_ERROR_CHARS`."""
    text = " ".join(str(err).split()) or "(no message)"
    text = f"{type(err).__name__}: {text}"
    return text if len(text) <= MAX_ERROR_CHARS else text[: MAX_ERROR_CHARS - 3] + "..."


def _normalised(result):
    if not isinstance(result, dict):
        raise TypeError(f"evaluator returned {type(result).__name__}, expected a dict of {', '.join(RESULT_FIELDS)}")
    unknown = sorted(set(result) - set(RESULT_FIELDS))
    if unknown:
        raise KeyError(f"evaluator returned unknown field(s) {unknown}; allowed: {', '.join(RESULT_FIELDS)}")
    row = {"status": str(result.get("status", "ok")), "error": result.get("error")}
    for name in NUMERIC_FIELDS:
        value = result.get(name)
        row[name] = None if value is None else float(value)
    return row


def evaluate_case(evaluator, base_raw, case_dir, case_id, values):
    """Apply one case's values to the base case, evaluate it, return its row (never raises Exception).

    Parameters
    ----------
    evaluator : callable
        ``evaluator(raw_case, case_dir) -> dict`` (see module docstring).
    base_raw : dict
        Raw base case.
    case_dir : str
        Folder of the case file (relative paths in the case resolve against it).
    case_id : int
        Case number in the plan.
    values : dict
        ``{path: value}`` for this case, in SI units

    Returns
    -------
    dict
        ``case_id``, the values and the result fields; ``status = "invalid"`` with the
        loader's reason if the case refuses the values (:class:`CaseError`),
        ``status = "failed"`` with the reason in ``error`` if anything else raised.
    """
    try:
        row = _normalised(evaluator(apply_values(base_raw, values), case_dir))
    except CaseError as err:  # the case refuses these values: an invalid sample, not a failed run
        row = {name: None for name in RESULT_FIELDS}
        row.update(status="invalid", error=one_line_error(err))
    except Exception as err:  # noqa: BLE001 - any failure of one case is recorded, not raised
        row = {name: None for name in RESULT_FIELDS}
        row.update(status="failed", error=one_line_error(err))
    row.update(values)
    row["case_id"] = case_id
    return row


def evaluate_batch(evaluator, base_raw, case_dir, batch):
    """Task body run in a worker: evaluate a list of ``(case_id, values)``; return the rows."""
    return [evaluate_case(evaluator, base_raw, case_dir, case_id, values) for case_id, values in batch]


def check_batch_size(batch_size):
    """Refuse a ``--batch-size`` below 1 (None: automatic) before anything is written."""
    if batch_size is not None and (isinstance(batch_size, bool) or int(batch_size) != batch_size
                                   or batch_size < 1):
        raise CaseError(f"--batch-size {batch_size!r}: must be a whole number >= 1")


def plan_batches(cases, batch_size=None, seconds_per_case=None, workers=1):
    """Split cases into tasks.

    Automatic size: about :data:`TARGET_TASK_SECONDS` of work per task, at least
    :data:`MIN_BATCH` cases (unless there are fewer cases), at most 1000, enough tasks
    to give every worker about four, and batches of equal size (within one case).

    Parameters
    ----------
    cases : list
        ``(case_id, values)`` pairs still to run.
    batch_size : int, optional
        Fixed cases per task (any value >= 1); overrides the automatic choice.
    seconds_per_case : float, optional
        Estimated cost of one case, [s]
    workers : int
        Number of workers.

    Returns
    -------
    list of list
        The batches, in case order.
    """
    n = len(cases)
    check_batch_size(batch_size)
    if n == 0:
        return []
    if batch_size is not None:
        size = int(batch_size)
        return [cases[i:i + size] for i in range(0, n, size)]
    per_case = seconds_per_case or DEFAULT_SECONDS_PER_CASE
    target = min(max(math.ceil(TARGET_TASK_SECONDS / per_case), MIN_BATCH), 1000)
    n_batches = max(math.ceil(n / target), min(4 * max(workers, 1), n // MIN_BATCH), 1)
    n_batches = min(n_batches, max(n // MIN_BATCH, 1))
    bounds = [round(i * n / n_batches) for i in range(n_batches + 1)]
    return [cases[bounds[i]:bounds[i + 1]] for i in range(n_batches)]


def _cpu_count():
    try:
        return len(os.sched_getaffinity(0))
    except AttributeError:  # not on Linux
        return os.cpu_count() or 1


def _local_pool(workers):
    context = multiprocessing.get_context("fork") if sys.platform.startswith("linux") else None
    return cf.ProcessPoolExecutor(max_workers=workers, mp_context=context)


def _dask_executor(address):
    client = dask_client(address)
    workers = sum(client.nthreads().values()) or 1
    # pure=False: never reuse a cached result of an identical earlier task
    return client, client.get_executor(pure=False), workers


def dask_client(address):
    """A ``distributed.Client`` of the scheduler at ``address``, or one line saying why there is none.

    Raises
    ------
    SweepError
        dask.distributed is not installed, or no scheduler answers at the address.
    """
    try:
        from distributed import Client
    except ImportError as err:
        raise SweepError(f"--scheduler {address}: dask.distributed is not installed; "
                         "pip install 'dask[distributed]'") from err
    try:
        client = Client(address, set_as_default=False, timeout="20s")
    except Exception as err:  # noqa: BLE001 - OSError, TimeoutError, ValueError for a bad address
        raise SweepError(f"--scheduler {address}: cannot reach a Dask scheduler ({one_line_error(err)}); "
                         "start one with `dask scheduler` and workers with `dask worker ADDRESS`") from err
    return client


def _is_worker_death(err):
    if isinstance(err, cf.BrokenExecutor):
        return True
    return type(err).__name__ == "KilledWorker"  # distributed.scheduler.KilledWorker


def run_cases(base_raw, case_dir, cases, evaluator, store, executor=None, scheduler=None,
              batch_size=None, progress=None):
    """Evaluate cases in batches in parallel and store each batch as it finishes.

    Cases whose case_id is already in ``store`` are skipped (resume). A case that
    raises is stored as ``status = "failed"`` with the reason. A worker process that
    dies (segfault, out of memory) takes down its batch only: the batch is retried and,
    if it dies again, split in halves until the single culprit case is found and stored
    as failed. On Ctrl-C the batches already finished are stored, the rest cancelled,
    and KeyboardInterrupt propagates; the store holds whole batches only.

    Parameters
    ----------
    base_raw : dict
        Raw base case (as read by tomllib).
    case_dir : str or Path
        Folder of the case file.
    cases : list of (int, dict)
        ``(case_id, {path: value})`` as from :func:`simulator.sweeps.paths.grid`, in SI units
    evaluator : callable
        Picklable ``evaluator(raw_case, case_dir) -> dict`` (module docstring).
    store : ResultsStore
        Where rows go; written only by this (parent) process.
    executor : concurrent.futures.Executor, optional
        Use this executor (not shut down here). Default: a local process pool.
    scheduler : str, optional
        Address of a Dask scheduler, e.g. ``"tcp://10.0.0.5:8786"``.
    batch_size : int, optional
        Cases per task; default automatic (:func:`plan_batches`).
    progress : Progress or bool, optional
        A :class:`~simulator.sweeps.progress.Progress` (or any object with
        ``start(total, done, failed)``, ``update(n, failed)``, ``close()``); True for
        the default one on stderr; None or False for none.

    Returns
    -------
    RunSummary
        Counts and timing.

    Raises
    ------
    SweepError
        If the evaluator cannot be pickled, the scheduler cannot be reached, or a task
        fails outside the evaluator.
    CaseError
        If the first pending case cannot even be built from the base case (bad path).
    """
    t0 = time.perf_counter()
    if executor is not None and scheduler is not None:
        raise ValueError("give either executor or scheduler, not both")
    case_dir = str(case_dir)
    done = store.done_ids()
    pending = [(cid, values) for cid, values in cases if cid not in done]
    skipped = len(cases) - len(pending)
    if progress is True:
        progress = Progress()
    elif progress is False:
        progress = None
    try:
        pickle.dumps((evaluator, base_raw))
    except Exception as err:  # noqa: BLE001 - report any pickling failure in one line
        raise SweepError(f"the evaluator cannot be sent to worker processes ({one_line_error(err)}); "
                         "define it at module level and keep heavy objects in worker_cache") from err
    if pending:
        apply_values(base_raw, pending[0][1])  # a bad path fails here, before any worker starts

    client = None
    own_pool = False
    if executor is not None:
        workers = getattr(executor, "_max_workers", None) or _cpu_count()
    elif not pending:  # nothing to do: start no pool and contact no scheduler
        workers = 0
    elif scheduler is not None:
        client, executor, workers = _dask_executor(scheduler)
    else:
        workers = _cpu_count()
        executor = _local_pool(workers)
        own_pool = True

    batches = plan_batches(pending, batch_size, getattr(evaluator, "seconds_per_case", None), workers)
    planned_size = max((len(b) for b in batches), default=0)
    failed_before = _count_failed(store) if progress and skipped else 0
    if progress:
        progress.start(len(cases), skipped, failed_before)
    computed = failed = submitted = invalid = 0
    running = {}  # future -> (batch, deaths)

    def submit(batch, deaths):
        nonlocal submitted
        try:
            future = executor.submit(evaluate_batch, evaluator, base_raw, case_dir, batch)
        except cf.BrokenExecutor as err:  # the pool broke again meanwhile: handled like a death
            future = cf.Future()
            future.set_exception(err)
        running[future] = (batch, deaths)
        submitted += 1

    def record(rows):
        nonlocal computed, failed, invalid
        store.write_rows(rows)
        n_failed = sum(row["status"] == "failed" for row in rows)
        computed += len(rows)
        failed += n_failed
        invalid += sum(row["status"] == "invalid" for row in rows)
        if progress:
            progress.update(len(rows), n_failed)

    try:
        for batch in batches:
            submit(batch, 0)
        while running:
            finished, _ = cf.wait(list(running), return_when=cf.FIRST_COMPLETED)
            broken = []
            for future in finished:
                batch, deaths = running.pop(future)
                err = future.exception()
                if err is None:
                    record(future.result())
                elif _is_worker_death(err):
                    broken.append((batch, deaths, err))
                else:
                    # evaluate_case records every failure of a case, so this is the platform
                    # (a worker that cannot import the evaluator, a lost connection): stop,
                    # rather than store good cases as failed; a rerun resumes.
                    raise SweepError(f"a task failed outside the evaluator ({one_line_error(err)}); "
                                     f"cases {batch[0][0]}..{batch[-1][0]} not run. Check that every "
                                     "worker can import tubesim, then rerun with the same --out to resume")
            pool_error = next((e for _, _, e in broken if isinstance(e, cf.BrokenExecutor)), None)
            if pool_error is not None and not own_pool:
                raise SweepError(f"the executor broke ({one_line_error(pool_error)}); it was passed in, "
                                 "so the sweep cannot restart it. Rerun with the same --out to resume")
            if pool_error is not None:
                # a dead local worker breaks the whole pool: every unfinished batch comes back
                for future in list(running):
                    batch, deaths = running.pop(future)
                    broken.append((batch, deaths, pool_error))
                executor.shutdown(wait=True, cancel_futures=True)
                executor = _local_pool(workers)
            for batch, deaths, err in broken:
                if len(batch) == 1 and deaths >= 1:
                    cid, values = batch[0]
                    if isinstance(err, cf.BrokenExecutor) and not _dies_alone(evaluator, base_raw, case_dir, batch):
                        submit(batch, 0)  # it was an innocent bystander of another crash
                        continue
                    record([_failed_row(cid, values, f"worker process died while computing this case "
                                                     f"({one_line_error(err)})")])
                elif deaths >= 1:
                    half = len(batch) // 2
                    submit(batch[:half], deaths + 1)
                    submit(batch[half:], deaths + 1)
                else:
                    submit(batch, deaths + 1)
    except BaseException:
        # Ctrl-C or a store failure: keep what already finished, cancel the rest.
        for future in list(running):
            if future.done() and not future.cancelled() and future.exception() is None:
                try:
                    store.write_rows(future.result())
                except Exception:  # noqa: BLE001 - best effort while stopping; original error wins
                    break
        _shutdown(executor, client, own_pool, cancel=True)
        raise
    else:
        _shutdown(executor, client, own_pool, cancel=False)
    finally:
        if progress:
            progress.close()
    return RunSummary(total=len(cases), skipped=skipped, computed=computed, failed=failed,
                      batches=submitted, batch_size=planned_size, workers=workers,
                      elapsed=time.perf_counter() - t0, invalid=invalid)


def _dies_alone(evaluator, base_raw, case_dir, batch):
    """Run one case alone in a fresh one-process pool; True if that worker dies too."""
    with _local_pool(1) as pool:
        future = pool.submit(evaluate_batch, evaluator, base_raw, case_dir, batch)
        try:
            future.result()
        except cf.BrokenExecutor:
            return True
    return False


def _failed_row(case_id, values, reason):
    row = {name: None for name in RESULT_FIELDS}
    row.update(values)
    row.update(case_id=case_id, status="failed", error=reason[:MAX_ERROR_CHARS])
    return row


def _count_failed(store):
    return store.count(status="failed")


def _shutdown(executor, client, own_pool, cancel):
    if client is not None:
        try:
            executor.shutdown(wait=not cancel)
        finally:
            client.close()
    elif own_pool and executor is not None:
        executor.shutdown(wait=True, cancel_futures=cancel)


# -- drivers -------------------------------------------------------------------------------------
def fingerprint(obj):
    """SHA-256 of a JSON rendering of ``obj`` (keys sorted; non-JSON values via str)."""
    text = json.dumps(obj, sort_keys=True, default=str, separators=(",", ":"))
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def _tool_version():
    """tubesim's version: a run is resumed only by the version that started it."""
    from simulator.solve.integrate import versions

    return versions()["tubesim"]


def grid_meta(base_raw, specs, cases):
    """The ``meta`` of a grid sweep's store (the same for every engine, so a resume may switch engines)."""
    return {
        "command": "sweep",
        "tubesim_version": _tool_version(),
        "vary": [f"{s.path}={s.values_text[0]}:{s.values_text[-1]}:{len(s.values_text)}" for s in specs],
        "n_cases": len(cases),
        "case_sha256": fingerprint(base_raw),
        "plan_sha256": fingerprint(cases),
    }


def run_grid_sweep(base_raw, case_dir, vary, evaluator, out_dir, *, executor=None, scheduler=None,
                   batch_size=None, progress=True):
    """Full grid over one or more case parameters: ``tubesim sweep CASE --vary ... --out DIR``.

    Writes ``DIR/results.sqlite`` as cases finish and ``DIR/results.csv`` at the end.
    Rerunning with the same ``out_dir`` and options resumes. The folder is locked while
    the run writes (:func:`~simulator.sweeps.lock.folder_lock`).

    Parameters
    ----------
    base_raw : dict
        Raw base case (as read by tomllib).
    case_dir : str or Path
        Folder of the case file.
    vary : sequence of str or VarySpec
        ``"PATH=START..STOP in N"`` options.
    evaluator : callable
        Picklable ``evaluator(raw_case, case_dir) -> dict``.
    out_dir : str or Path
        Output folder.
    executor, scheduler, batch_size, progress
        As :func:`run_cases`.

    Returns
    -------
    RunSummary
        Counts and timing.
    """
    specs = [spec if isinstance(spec, VarySpec) else parse_vary(spec) for spec in vary]
    if not specs:
        raise CaseError('--vary: give at least one "PATH=START..STOP in N"')
    for spec in specs:
        check_vary(base_raw, spec)
    check_batch_size(batch_size)
    cases = grid(specs)
    out_dir = Path(out_dir)
    meta = grid_meta(base_raw, specs, cases)
    with folder_lock(out_dir, "sweep"), ResultsStore(out_dir / "results.sqlite", [s.path for s in specs], meta) as store:
        summary = run_cases(base_raw, case_dir, cases, evaluator, store, executor=executor,
                            scheduler=scheduler, batch_size=batch_size, progress=progress)
        store.export_csv(out_dir / "results.csv")
    return summary


def run_uncertainty(base_raw, case_dir, evaluator, out_dir, n_samples, *, seed=None, method="lhs",
                    temperature_limit=None, confidence=0.95, interval="clopper-pearson",
                    executor=None, scheduler=None, batch_size=None, progress=True,
                    engine="pool", model=None, probe=None, source_path=""):
    """Monte Carlo over the case's ``[[uncertainty]]`` entries: ``tubesim uncertainty``.

    Before any case runs, every distribution is checked against the values the case
    accepts (:func:`simulator.sweeps.uncertain_ranges.checked_against_loader`): more
    than 0.1 % of its mass outside is refused; truncated normals are cut to that range.
    Writes ``DIR/results.sqlite`` as cases finish, ``DIR/results.csv`` and
    ``DIR/uncertainty.json`` at the end; the folder is locked meanwhile. Without
    ``seed``, a resumed run reuses the stored seed and a new run draws one; the seed is
    recorded either way.

    Parameters
    ----------
    base_raw : dict
        Raw base case with ``uncertainty`` entries.
    case_dir : str or Path
        Folder of the case file.
    evaluator : callable
        Picklable ``evaluator(raw_case, case_dir) -> dict`` (the pool engine).
    out_dir : str or Path
        Output folder.
    n_samples : int
        Number of samples (cases).
    seed : int, optional
        Seed of the sampler.
    method : {"lhs", "sobol"}
        Latin hypercube or scrambled Sobol' points.
    temperature_limit : float, optional
        Hot-spot limit; default ``design.temperature_limit`` of the case, [K]
    confidence : float
        Confidence level of the exceedance interval, [-]
    interval : {"clopper-pearson", "wilson"}
        Binomial confidence interval.
    executor, scheduler, batch_size, progress
        As :func:`run_cases` (pool engine).
    engine : {"pool", "compiled"}
        ``"compiled"``: the samples run through the compiled batch integrator
        (:func:`simulator.sweeps.compiled_sweep.run_compiled_cases`, the path of
        ``tubesim sweep``), on the Dask workers when ``scheduler`` is given (chunks of
        ``batch_size`` cases, default :func:`simulator.sweeps.dask_compiled.chunk_size`);
        needs ``model``.
    model : simulator.model.build.Model, optional
        Base model, for the compiled engine.
    probe : object, optional
        ``refusal(path, value) -> None or reason``; default the case loader
        (:class:`simulator.sweeps.validity.CaseProbe`).
    source_path : str
        Case file, for messages.

    Returns
    -------
    dict
        The content written to ``uncertainty.json`` (with ``engine`` and ``run``, which
        names the ``scheduler``: null for a local run).
    """
    from simulator.fileio import atomic_write_json
    from simulator.sweeps import sampling
    from simulator.sweeps.uncertain_ranges import check_uncertainty_entries

    if engine not in ("pool", "compiled"):
        raise ValueError(f"engine = {engine!r}: choose pool or compiled")
    if engine == "compiled" and model is None:
        raise ValueError("engine = 'compiled' needs the base model")
    check_batch_size(batch_size)
    specs, base, ranges = check_uncertainty_entries(base_raw, case_dir, source_path, probe)
    if temperature_limit is None:
        prefix = f"{source_path}: " if source_path else ""
        text = base_raw.get("design", {}).get("temperature_limit") if isinstance(base_raw.get("design"), dict) \
            else None
        if text is None:
            raise CaseError(f"{prefix}design.temperature_limit: missing; uncertainty estimates the probability "
                            'that the hot spot exceeds it; give it, e.g. temperature_limit = "650 K"')
        temperature_limit = parse_quantity(text, "temperature", f"{prefix}design.temperature_limit")
    out_dir = Path(out_dir)
    db = out_dir / "results.sqlite"
    with folder_lock(out_dir, "uncertainty"):
        if seed is None:
            seed = ResultsStore.read_meta(db).get("seed")
            if seed is None:
                seed = sampling.fresh_seed()
        samples = sampling.sample(specs, base, n_samples, seed, method=method)
        paths = [s.parameter for s in specs]
        cases = [(i, dict(zip(paths, (float(v) for v in samples[i])))) for i in range(samples.shape[0])]
        meta = {
            "command": "uncertainty",
            "tubesim_version": _tool_version(),
            "seed": int(seed),
            "method": method,
            "n_samples": int(n_samples),
            "distributions": [s.describe() for s in specs],
            "case_sha256": fingerprint(base_raw),
            "plan_sha256": fingerprint(cases),
        }
        with ResultsStore(db, paths, meta) as store:
            if engine == "compiled":
                from simulator.sweeps.compiled_sweep import run_compiled_cases

                summary = run_compiled_cases(case_dir, cases, paths, model, store, progress=bool(progress),
                                             label="samples", ranges=ranges, scheduler=scheduler,
                                             chunk=batch_size)
            else:
                summary = run_cases(base_raw, case_dir, cases, evaluator, store, executor=executor,
                                    scheduler=scheduler, batch_size=batch_size, progress=progress)
            store.export_csv(out_dir / "results.csv")
            result = sampling.summarize(store.rows(), specs, temperature_limit, seed=int(seed), method=method,
                                        confidence=confidence, interval=interval, ranges=ranges)
        result["engine"] = engine
        result["run"] = {"scheduler": scheduler, "skipped": summary.skipped, "computed": summary.computed,
                         "elapsed_s": round(summary.elapsed, 3), "workers": summary.workers,
                         "cases_per_second": round(summary.computed / summary.elapsed, 1)
                         if summary.computed and summary.elapsed > 0 else None}
        atomic_write_json(out_dir / "uncertainty.json", result)
    return result
