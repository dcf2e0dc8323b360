"""The compiled batch integrator on Dask workers: chunks of cases, the model sent once per worker.

``tubesim sweep`` and ``tubesim uncertainty`` with ``--scheduler`` run their cases here
when the compiled engine supports every varied or sampled path
(:mod:`simulator.sweeps.engine`); other paths keep the per-case path on Dask
(:mod:`simulator.sweeps.execute`). Every task runs
:func:`simulator.sweeps.compiled_sweep.solve_chunk`, the function the local compiled
run uses, with the same integrator, tolerances and runaway guards, and solves the
cases the compiled loop hands back (stiff, step budget exhausted, values its fast map
refuses) on the worker by the per-case path, as the local run does in process. So the
rows equal the local compiled run's, bit for bit.

How a run goes (:class:`DaskChunks`):

1. The packed base model (a few kB) is scattered to every worker once
   (``client.scatter(..., broadcast=True)``); tasks then carry only their parameter
   slice (8 bytes per value) and return compact arrays.
2. Warm-up: one task pinned to each worker (:func:`warm_worker`) loads, or compiles,
   numba's on-disk caches of the sweep integrator and of the kernel before any chunk
   runs, so no chunk waits on the compiler (a cold worker spent 49 s compiling inside
   its first task, reference notes section 7). It runs in the worker's task thread,
   not in its event loop. One worker per host goes first (:func:`warmup_waves`): the
   others on that host then load what it compiled instead of compiling it too.
3. A first chunk of :data:`PROBE_CHUNK` cases measures the cost of one case on this
   case and cluster (progress shows at once); the rest is split by :func:`chunk_size`.

Chunk rule (:func:`chunk_size`): a task is at least :data:`TARGET_TASK_SECONDS`
(0.5 s) of work, since a Dask task costs 3-10 ms of scheduling and a compiled case
about 0.1 ms (50 cases per task left the 2 workers slower than one local core);
within that, up to :data:`TASKS_PER_THREAD` tasks per worker thread so the load
balances (runaway cases take ten times the steps of quiet ones); and at most
:data:`MAX_TASK_SECONDS` of work per task, so progress moves and a lost worker
loses little. On 20 000 cases at 0.1 ms on 2 worker threads that is 4 tasks of
5 000 cases, the fastest split measured (reference notes section 7: chunks of 5 000
ran in 5.3 s, 2 500 in 8.4 s, 10 000 in 6.4 s). ``--batch-size`` fixes the size instead.

Threads: one numba thread per task (:data:`NUMBA_THREADS_PER_TASK`); start workers with
one thread per core (``dask worker ADDRESS --nworkers N --nthreads 1``), as measured
fastest (two workers x two numba threads each oversubscribed the cores).

A worker that dies stops the run with one line (the chunks already stored stay; the
same command resumes); a task that fails outside the per-case handling (a worker that
cannot import tubesim, a lost connection) likewise.
"""
import asyncio
import math
import sys
import time

from simulator.sweeps.compiled_sweep import chunk_params, solve_chunk
from simulator.sweeps.execute import SweepError, dask_client, one_line_error

#: Work per task the chunk rule aims at as the least, [s]
TARGET_TASK_SECONDS = 0.5
#: Work per task above which the rule splits further, [s]
MAX_TASK_SECONDS = 5.0
#: Tasks per worker thread the rule aims at when the work allows, [-]
TASKS_PER_THREAD = 4
#: Cases of the first chunk, which measures the cost of a case, [-]
PROBE_CHUNK = 250
#: Cost of a case when nothing was measured (a warm core, bench/README.md), [s]
DEFAULT_SECONDS_PER_CASE = 1e-4
#: numba threads inside one task (one per Dask worker thread), [-]
NUMBA_THREADS_PER_TASK = 1
#: How long to wait for the first worker to join the scheduler, [s]
WORKER_WAIT_SECONDS = 60.0


def chunk_size(n, threads, seconds_per_case, target=TARGET_TASK_SECONDS, longest=MAX_TASK_SECONDS,
               per_thread=TASKS_PER_THREAD):
    """Cases per Dask task for ``n`` cases on ``threads`` worker threads.

    Tasks = max(min(per_thread x threads, floor(work / target)), ceil(work / longest), 1)
    with work = n x seconds_per_case; cases per task = ceil(n / tasks).

    Parameters
    ----------
    n : int
        Cases to run.
    threads : int
        Worker threads of the cluster.
    seconds_per_case : float
        Measured (or assumed) cost of one case on one thread, [s]
    target, longest : float
        Least and most work per task, [s]
    per_thread : int
        Tasks per worker thread wanted for load balancing.

    Returns
    -------
    int
        Cases per task (0 for no cases).

    Examples
    --------
    >>> chunk_size(20000, 2, 1e-4)        # 2 s of work: 4 tasks of 0.5 s
    5000
    >>> chunk_size(20000, 2, 1e-3)        # 20 s: 4 tasks per thread, 2.5 s each
    2500
    >>> chunk_size(10**6, 2, 1e-4)        # 100 s: at most 5 s per task
    50000
    >>> chunk_size(1000, 8, 1e-4)         # 0.1 s in all: one task
    1000
    """
    n = int(n)
    if n <= 0:
        return 0
    work = n * max(float(seconds_per_case), 0.0)
    wanted = per_thread * max(int(threads), 1)
    allowed = math.floor(work / target)
    needed = math.ceil(work / longest)
    tasks = min(max(min(wanted, allowed), needed, 1), n)
    return math.ceil(n / tasks)


def warm_worker(model, params, paths, case_dir):
    """Load or compile numba's caches on this worker before its first chunk (a Dask task body).

    Compiles the kernel (:func:`simulator.solve.warmup.main`) when its on-disk cache is
    cold, then solves one case through :func:`~simulator.sweeps.compiled_sweep.solve_chunk`,
    which loads (or compiles) the sweep integrator with the argument types every chunk uses.

    Returns
    -------
    dict
        ``seconds`` (wall time, [s]), ``kernel_was_cold`` (bool), ``cache_dir`` (numba's
        cache folder; empty: beside the sources, in ``__pycache__``).
    """
    import numba

    from simulator.model.kernels import cache_is_warm

    t0 = time.perf_counter()
    cold = not cache_is_warm()
    if cold:
        from simulator.solve import warmup

        warmup.main()
    solve_chunk(model, params, paths, case_dir, threads=NUMBA_THREADS_PER_TASK)
    return {"seconds": time.perf_counter() - t0, "kernel_was_cold": cold,
            "cache_dir": str(numba.config.CACHE_DIR or "")}


def warmup_waves(hosts):
    """Workers to warm in turn: first one per host, then the rest.

    Workers on one host usually share numba's cache folder; the first compiles what is
    missing and the others then only load it, instead of all compiling the same code at
    once on the same cores.

    Parameters
    ----------
    hosts : dict
        ``{worker address: host}``.

    Returns
    -------
    list of list of str
        One or two waves of worker addresses.

    Examples
    --------
    >>> warmup_waves({"tcp://a:1": "a", "tcp://a:2": "a", "tcp://b:1": "b"})
    [['tcp://a:1', 'tcp://b:1'], ['tcp://a:2']]
    """
    first, rest, seen = [], [], set()
    for address, host in hosts.items():
        (rest if host in seen else first).append(address)
        seen.add(host)
    return [wave for wave in (first, rest) if wave]


def _solve_on_worker(model, params, paths, case_dir):
    """Task body: one chunk on one numba thread."""
    return solve_chunk(model, params, paths, case_dir, threads=NUMBA_THREADS_PER_TASK)


class DaskChunks:
    """Chunks of compiled cases on the workers of a Dask scheduler (module docstring).

    Parameters
    ----------
    address : str
        Scheduler address, e.g. ``"tcp://10.0.0.5:8786"``.
    chunk : int, optional
        Fixed cases per task; default :func:`chunk_size` from a measured first chunk.
    announce : bool
        Say on stderr when the warm-up starts and how long it took (it may take a minute on
        cold workers, before any progress).

    Attributes
    ----------
    tasks, largest, threads : int
        Chunks submitted, cases in the largest, worker threads.
    warmup : list of dict
        What :func:`warm_worker` returned on each worker.
    """

    def __init__(self, address, chunk=None, announce=False):
        self.address = address
        self.chunk = chunk
        self.announce = announce
        self.tasks = 0
        self.largest = 0
        self.threads = 0
        self.warmup = []
        self._client = None
        self._futures = set()   # submitted and not yet collected (a collected result is released)

    def _connect(self):
        client = self._client = dask_client(self.address)
        try:
            client.wait_for_workers(1, timeout=WORKER_WAIT_SECONDS)
        except Exception as err:  # noqa: BLE001 - TimeoutError and friends, in one line
            raise SweepError(f"--scheduler {self.address}: no worker joined within {WORKER_WAIT_SECONDS:g} s "
                             f"({one_line_error(err)}); start workers with `dask worker {self.address}`") from err
        self.threads = sum(client.nthreads().values()) or 1
        return client

    def _say(self, text):
        if self.announce:
            print(text, file=sys.stderr, flush=True)

    def _result(self, future, chunk, task=None):
        try:
            result = future.result()
            self._futures.discard(future)
            future.release()
            return result
        except (Exception, asyncio.CancelledError) as err:  # noqa: BLE001 - KilledWorker, a lost scheduler, an
            # import error on the worker; a future the scheduler cancelled raises a BaseException
            died = type(err).__name__ == "KilledWorker"
            task = task or f"cases {chunk[0][0]}..{chunk[-1][0]}"
            what = "a worker died while computing" if died else "a task failed outside the per-case handling of"
            raise SweepError(f"{what} {task} ({one_line_error(err)}); the finished "
                             "chunks are stored: check the workers (each must import tubesim and read the case "
                             "folder), then rerun with the same --out to resume") from err

    def _submit(self, client, model_future, chunk, paths, case_dir, **where):
        self.tasks += 1
        self.largest = max(self.largest, len(chunk))
        future = client.submit(_solve_on_worker, model_future, chunk_params(chunk, paths), paths, str(case_dir),
                               pure=False, **where)
        self._futures.add(future)
        return future

    def solve(self, model, cases, paths, case_dir):
        """Yield ``(chunk, result of solve_chunk)`` as the chunks finish (any order)."""
        if not cases:
            return
        from distributed import as_completed

        client = self._connect()
        model_future = client.scatter(model, broadcast=True, hash=False)
        first = chunk_params(cases[:1], paths)
        info = client.scheduler_info()["workers"]
        workers = list(info)
        self._say(f"dask: loading or compiling numba's caches on {len(workers)} worker(s) before the first chunk")
        started = time.perf_counter()
        for wave in warmup_waves({address: info[address].get("host", address) for address in workers}):
            warm = [client.submit(warm_worker, model_future, first, paths, str(case_dir), pure=False,
                                  workers=[address], allow_other_workers=False)
                    for address in wave]
            self._futures.update(warm)
            self.warmup += [self._result(future, cases[:1], task="the warm-up") for future in warm]
        cold = sum(w["kernel_was_cold"] for w in self.warmup)
        self._say(f"dask: {len(workers)} worker(s), {self.threads} thread(s) ready in "
                  f"{time.perf_counter() - started:.1f} s" + (f" ({cold} compiled the kernel)" if cold else ""))
        rest = cases
        size = self.chunk
        if size is None:
            probe, rest = cases[:PROBE_CHUNK], cases[PROBE_CHUNK:]
            out = self._result(self._submit(client, model_future, probe, paths, case_dir), probe)
            yield probe, out
            per_case = out["seconds"] / len(probe) if out["seconds"] > 0 else DEFAULT_SECONDS_PER_CASE
            size = chunk_size(len(rest), self.threads, per_case)
        chunks = [rest[i:i + size] for i in range(0, len(rest), size)] if rest else []
        running = {self._submit(client, model_future, chunk, paths, case_dir): chunk for chunk in chunks}
        for future in as_completed(list(running), loop=client.loop):
            chunk = running.pop(future)
            yield chunk, self._result(future, chunk)

    def close(self):
        """Cancel what is still running and close the connection."""
        if self._client is None:
            return
        try:
            pending = [f for f in self._futures if not f.done()]
            if pending:
                self._client.cancel(pending)
        finally:
            self._client.close()
            self._client = None
