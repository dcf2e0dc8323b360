"""Grid sweeps through the compiled batch integrator, with the same store and resume as the pool.

Used by ``tubesim sweep`` when every varied path is an operating number the
compiled path supports (:func:`simulator.sweeps.fast.supports`) and no Dask
scheduler is given. Cases run in chunks; each chunk is written to
``results.sqlite`` in one transaction, so an interrupted run resumes where it
stopped, by this engine or the process pool alike (the store's ``meta`` is the
same). As for the pool evaluator, the design temperature limit does not stop a
sweep run: the runaway guard T_feed + 3 dT_ad + 500 K does.

Tolerance: rtol 3e-6 with the case's scale-based absolute tolerance; the tests
check agreement with per-case LSODA solves at rtol 1e-10 within 0.05 K on the
hot spot (the benchmark's acceptance bound).
"""
import math
import time
from pathlib import Path

import numpy as np

from simulator.sweeps.execute import RunSummary, grid_meta
from simulator.sweeps.paths import check_vary, grid, parse_vary, VarySpec
from simulator.sweeps.progress import Progress
from simulator.sweeps.store import ResultsStore

SWEEP_RTOL = 3e-6
CHUNK = 5000


def compiled_supported(model, paths):
    """True when the compiled path can run a sweep of these paths on this model."""
    from simulator.sweeps import fast

    return fast.supports(paths, model)


def _guards(model, y0):
    """Runaway guard temperature of every case from its inlet state, [K]."""
    from simulator.model.adiabatic import adiabatic_rise

    n = model.n
    feeds, inverse = np.unique(y0[:, :n + 1], axis=0, return_inverse=True)
    guard = np.empty(len(feeds))
    for k, row in enumerate(feeds):
        rise = adiabatic_rise(row[:n], row[n], model.args[4], model.key_index, model.args[2])[0]
        guard[k] = row[n] + 3.0 * (rise if math.isfinite(rise) and rise > 0 else 0.0) + 500.0
    return guard[np.asarray(inverse).ravel()]


def run_compiled_sweep(base_raw, case_dir, vary, model, out_dir, progress=True):
    """Full grid through :func:`simulator.sweeps.fast.batch_solve`; returns a RunSummary."""
    from simulator.sweeps import fast

    started = time.perf_counter()
    specs = [spec if isinstance(spec, VarySpec) else parse_vary(spec) for spec in vary]
    for spec in specs:
        check_vary(base_raw, spec)
    cases = grid(specs)
    paths = [s.path for s in specs]
    out_dir = Path(out_dir)
    with ResultsStore(out_dir / "results.sqlite", paths, grid_meta(base_raw, specs, cases)) as store:
        done = store.done_ids()
        pending = [(cid, values) for cid, values in cases if cid not in done]
        bar = Progress(interactive=None) if progress else None
        if bar:
            bar.start(len(cases), done=len(cases) - len(pending))
        failed = 0
        for start in range(0, len(pending), CHUNK):
            chunk = pending[start:start + CHUNK]
            params = np.array([[values[p] for p in paths] for _, values in chunk], dtype=float)
            packed = fast.pack_cases(model, params, paths)
            out = fast.batch_solve(model, params, paths, rtol=SWEEP_RTOL, temperature_limit=_guards(model, packed.y0),
                                   case_dir=str(case_dir))
            rows = []
            for k, (cid, values) in enumerate(chunk):
                status = fast.STATUS_NAMES[int(out["status"][k])]
                failed += status == "failed"
                row = {"case_id": cid, **values, "status": status, "error": out["error"][k]}
                for name in ("hot_spot_temperature_K", "hot_spot_position_m", "outlet_conversion",
                             "outlet_temperature_K", "outlet_pressure_Pa"):
                    value = float(out[name][k])
                    row[name] = value if math.isfinite(value) and status != "failed" else None
                if status == "stopped" and not row["error"]:
                    row["error"] = (f"stopped at the runaway guard at z = {float(out['outlet_position_m'][k]):.6g} m; "
                                    "the hot spot is a lower bound")
                rows.append(row)
            store.write_rows(rows)
            if bar:
                bar.update(len(chunk))
        if bar:
            bar.close()
        store.export_csv(out_dir / "results.csv")
    return RunSummary(total=len(cases), skipped=len(cases) - len(pending), computed=len(pending), failed=failed,
                      batches=math.ceil(len(pending) / CHUNK), batch_size=CHUNK,
                      workers=_threads(), elapsed=time.perf_counter() - started)


def _threads():
    import numba

    return numba.get_num_threads()
