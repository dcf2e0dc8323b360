"""Which right-hand side a run uses: the compiled kernel, or its pure-Python twin on a cold cache.

numba compiles :mod:`simulator.model.kernel` on its first call and caches the
machine code on disk (``cache=True``); later runs load it in a fraction of a
second. The very first run on a machine would wait ~5 s for the compiler, while
the same code run as plain Python solves a single case in 15-300 ms. So:

* ``TUBESIM_KERNEL=auto`` (default): when the on-disk cache of the kernel is warm,
  use the compiled kernel; when it is cold, use the pure-Python twin (the same
  source, loaded once more with numba's JIT disabled) for this run, and compile
  the cache in a detached background process so the next run is fast.
* ``TUBESIM_KERNEL=compiled``: always the compiled kernel (compile in-process if
  needed); the test suite and the benchmarks use it.
* ``TUBESIM_KERNEL=python``: always the twin (debugging, profiling).

Sweeps and screening call the compiled kernel directly: they run hundreds of
solves, which pay for the compilation at once.
"""
import functools
import importlib.util
import os
import subprocess
import sys

from simulator.model import kernel as compiled

#: The dispatchers a single run needs; the cache is warm when all of them are.
_RUN_FUNCTIONS = ("rhs_odeint", "derivative_profile", "compressibility_profile", "pr_departure", "pr_phase_profile",
                  "wall_columns")


def mode():
    """The ``TUBESIM_KERNEL`` setting: auto, compiled or python."""
    value = os.environ.get("TUBESIM_KERNEL", "auto").strip().lower()
    return value if value in ("auto", "compiled", "python") else "auto"


def cache_is_warm():
    """True when numba's on-disk cache holds a current entry for every function a run needs."""
    try:
        for name in _RUN_FUNCTIONS:
            cache_file = getattr(compiled, name)._cache._cache_file
            if not cache_file._load_index():     # {} when missing or stale (source changed)
                return False
        return True
    except Exception:  # noqa: BLE001 - numba internals changed: behave as before (compile on demand)
        return True


@functools.lru_cache(maxsize=1)
def python_twin():
    """The kernel module loaded again with numba's JIT disabled (plain Python, same source)."""
    import numba

    previous = numba.config.DISABLE_JIT
    numba.config.DISABLE_JIT = True
    try:
        spec = importlib.util.spec_from_file_location("simulator.model._kernel_python", compiled.__file__)
        module = importlib.util.module_from_spec(spec)
        spec.loader.exec_module(module)
    finally:
        numba.config.DISABLE_JIT = previous
    return module


def warm_in_background():
    """Start a detached process that compiles the kernel into the on-disk cache (fire and forget)."""
    try:
        subprocess.Popen([sys.executable, "-m", "simulator.solve.warmup"], stdin=subprocess.DEVNULL,
                         stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, start_new_session=True)
    except OSError:
        pass


def for_run():
    """The kernel module a single run should use (see the module docstring)."""
    setting = mode()
    if setting == "compiled":
        return compiled
    if setting == "python":
        return python_twin()
    return _auto_choice()


@functools.lru_cache(maxsize=1)
def _auto_choice():
    """Decided once per process: reading numba's cache index costs ~0.3 ms, a solve ~1 ms."""
    if cache_is_warm():
        return compiled
    warm_in_background()
    return python_twin()
