"""The compiled kernel and its pure-Python twin give the same run; a cold cache uses the twin."""
import json
import os
import subprocess
import sys

import pytest

from simulator import load_case, simulate
from simulator.model import kernels


def test_python_twin_is_plain_python_and_gives_the_same_result(cases_dir, monkeypatch):
    case = load_case(cases_dir / "hydrogenation_cooled_packed_bed.toml")
    compiled = simulate(case)
    monkeypatch.setenv("TUBESIM_KERNEL", "python")
    twin = simulate(case)
    assert twin.solver_stats["kernel"].startswith("plain Python")
    assert compiled.solver_stats["kernel"] == "compiled (numba)"
    assert twin.hot_spot["temperature_K"] == pytest.approx(compiled.hot_spot["temperature_K"], rel=1e-12)
    assert twin.outlet_conversion == pytest.approx(compiled.outlet_conversion, rel=1e-12)
    assert not hasattr(kernels.python_twin().rhs, "py_func")        # really not a numba dispatcher


def test_cold_cache_uses_the_twin_and_warmup_fills_the_cache(cases_dir, tmp_path):
    env = dict(os.environ, TUBESIM_KERNEL="auto", NUMBA_CACHE_DIR=str(tmp_path / "numba"))
    probe = ("import json, sys; from simulator import load_case, simulate; from simulator.model import kernels; "
             "kernels.warm_in_background = lambda: None; "
             f"r = simulate(load_case({str(cases_dir / 'decomposition_empty_tube.toml')!r})); "
             "print(json.dumps([kernels.cache_is_warm(), r.solver_stats['kernel']]))")
    cold = json.loads(subprocess.run([sys.executable, "-c", probe], env=env, capture_output=True, text=True,
                                     check=True).stdout)
    assert cold == [False, "plain Python (compiled cache cold)"]
    subprocess.run([sys.executable, "-m", "simulator.solve.warmup"], env=env, check=True, timeout=600)
    warm = json.loads(subprocess.run([sys.executable, "-c", probe], env=env, capture_output=True, text=True,
                                     check=True).stdout)
    assert warm == [True, "compiled (numba)"]
