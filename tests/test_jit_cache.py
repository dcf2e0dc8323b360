"""Compiled caches are flushed when a file the compiled code depends on changes."""
from simulator.model.jit_cache import refresh_if_sources_changed


class _Cache:
    def __init__(self, folder):
        self._cache_path = str(folder)
        self.flushed = 0

    def flush(self):
        self.flushed += 1


class _Dispatcher:
    def __init__(self, folder):
        self._cache = _Cache(folder)


def test_flush_only_when_a_dependency_changes(tmp_path):
    source = tmp_path / "callee.py"
    source.write_text("x = 1\n")
    d = _Dispatcher(tmp_path / "cache")
    assert refresh_if_sources_changed("group", [d], [source])          # no marker yet: flush
    assert not refresh_if_sources_changed("group", [d], [source])      # unchanged: keep the cache
    source.write_text("x = 2\n")
    assert refresh_if_sources_changed("group", [d], [source])          # callee changed: flush
    assert d._cache.flushed == 2


def test_real_kernel_and_sweep_caches_are_registered():
    from pathlib import Path

    import simulator.model.kernel as K
    import simulator.sweeps.fast as fast

    assert (Path(K.rhs._cache._cache_path) / "tubesim-kernel.sha256").exists()
    own = next(v for v in vars(fast).values() if hasattr(v, "py_func") and v.py_func.__module__ == fast.__name__)
    assert (Path(own._cache._cache_path) / "tubesim-sweep-integrator.sha256").exists()
