"""Compiled batch solver for sweeps (simulator/sweeps/fast.py).

Regression checks against our own per-case path, not validation: the fast parameter
map must build exactly the arrays ``build_model`` builds, and ``batch_solve`` must
agree with ``simulate()`` at tight tolerances.

Reference solves are ``simulate()`` with ``[solver] rtol = 1e-10``, ``atol_scale = 1e-12``.
Their hot spot was checked against an independent DOP853 solve at rtol 1e-13 on the
sharpest peak of the o-xylene grid (T_c = 632.86 K, y_OX = 0.01629: 1148.8082 K, within
4e-6 K).
"""
import copy
import math
import subprocess
import sys
import tomllib
from pathlib import Path

import numpy as np
import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.model.build import build_model
from simulator.solve.integrate import simulate
from simulator.sweeps import fast
from simulator.sweeps.paths import apply_values

ROOT = Path(__file__).resolve().parents[1]
HYDRO = ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml"
OXYLENE = ROOT / "cases" / "froment1967_oxylene_packed_tube.toml"
DEHYDRO = ROOT / "cases" / "dehydrogenation_heated_tube.toml"
METHANOL = ROOT / "cases" / "methanol_synthesis_real_gas.toml"

#: Agreement required of the fast path (the sweep specification: |dT*| <= 0.05 K,
#: |dX_out| <= 1e-4 against tight per-case solves).
T_TOL = 0.05          # [K]
X_TOL = 1e-4          # [-]
#: Outlet temperature and relative outlet pressure: same order as the hot spot (our choice).
T_OUT_TOL = 0.05      # [K]
P_OUT_RTOL = 1e-6     # [-]
#: Stop position at the temperature limit: the limit is crossed steeply, so the
#: position is well conditioned (our choice).
Z_STOP_TOL = 1e-4     # [m]


def _raw(path):
    with open(path, "rb") as fh:
        return tomllib.load(fh)


def _model(raw, path):
    return build_model(load_case_dict(raw, source_path=str(path)))


def _normal(raw, path, paths, values, species, solver=None):
    """The per-case path: apply_values -> load_case_dict -> build_model (-> simulate)."""
    new = apply_values(raw, dict(zip(paths, (float(v) for v in values))))
    if solver is not None:
        new["solver"] = dict(solver)
    case = load_case_dict(new, source_path=str(path))
    return case, build_model(case, species=species)


TIGHT = {"rtol": 1e-10, "atol_scale": 1e-12}


def _grid(a, b, n=6):
    return np.array([[x, y] for x in np.linspace(a[0], b[0], n) for y in np.linspace(a[1], b[1], n)])


# -- the parameter map reproduces build_model -------------------------------------------------------
def _volumetric(raw):
    raw = copy.deepcopy(raw)
    del raw["feed"]["molar_flow"]
    raw["feed"]["volumetric_flow"] = "1.8 m^3/s"
    return raw


def _with_exponent(raw):
    raw = copy.deepcopy(raw)
    raw["reactions"][0]["temperature_exponent"] = 0.0
    return raw


MAP_CASES = [
    ("hydrogenation", HYDRO, _with_exponent,
     ["heat.medium.temperature", "heat.overall_coefficient", "feed.temperature", "feed.pressure",
      "feed.molar_flow", "feed.mole_fractions.C2H4", "reactions.0.pre_exponential",
      "reactions.0.activation_energy", "reactions.0.temperature_exponent"],
     [[405.0, 150.0, 430.0, 4.0e5, 120.0, 0.06, 3.0e5, 6.2e4, 0.0],
      [437.3, 212.5, 401.1, 6.5e5, 171.0, 0.0317, 5.5e5, 5.7e4, 0.5],
      [455.0, 0.0, 455.0, 5.0e5, 150.0, 0.05, 4.0e5, 6.0e4, -1.0]]),
    ("two fractions at once", HYDRO, None,
     ["feed.mole_fractions.H2", "feed.mole_fractions.C2H4", "heat.medium.temperature"],
     [[0.2, 0.07, 430.0], [0.1, 0.03, 415.5], [0.33, 0.011, 440.0]]),
    ("volumetric flow", HYDRO, _volumetric,
     ["feed.temperature", "feed.pressure", "feed.volumetric_flow", "feed.mole_fractions.N2"],
     [[420.0, 5.0e5, 1.8, 0.8], [398.7, 7.1e5, 2.3, 0.71], [441.0, 3.3e5, 1.1, 0.9]]),
    ("mass flow, custom species", OXYLENE, None,
     ["feed.mole_fractions.OX", "feed.mass_flow", "feed.temperature", "heat.medium.temperature"],
     [[0.015, 6.59e-4, 625.0, 625.0], [0.0187, 7.0e-4, 631.2, 618.4], [0.0101, 5.5e-4, 612.0, 640.0]]),
    ("viscosity from Cantera, reversible", DEHYDRO, None,
     ["feed.temperature", "feed.mole_fractions.C2H6", "heat.medium.temperature"],
     [[950.0, 0.6, 1250.0], [905.5, 0.45, 1210.0]]),
    ("Peng-Robinson, viscosity from Cantera", METHANOL, None,
     ["heat.medium.temperature", "feed.mole_fractions.CO", "feed.pressure"],
     [[500.0, 0.3, 1.0e7], [510.0, 0.24, 9.0e6], [492.0, 0.33, 1.1e7]]),
]


@pytest.mark.parametrize("label, path, edit, paths, rows", MAP_CASES, ids=[c[0] for c in MAP_CASES])
def test_parameter_map_reproduces_build_model(label, path, edit, paths, rows):
    raw = _raw(path)
    if edit is not None:
        raw = edit(raw)
    base = _model(raw, path)
    assert fast.supports(paths, base), fast.unsupported_reason(paths, base)
    packed = fast.pack_cases(base, np.array(rows), paths)
    assert packed.valid.all()
    for i, values in enumerate(rows):
        _, normal = _normal(raw, path, paths, values, base.species)
        fast_args = packed.args(i)
        for k, (a, b) in enumerate(zip(normal.args, fast_args)):
            np.testing.assert_array_equal(a, b, err_msg=f"{label}: case {i}, kernel argument {k}")
        np.testing.assert_array_equal(normal.y0, packed.y0[i], err_msg=f"{label}: case {i}, y0")
        np.testing.assert_array_equal(normal.scale, packed.scale[i], err_msg=f"{label}: case {i}, scale")
        assert normal.feed_molar_flow == packed.feed_molar_flow[i]


def test_values_the_loader_rejects_are_marked_and_take_the_normal_path():
    raw = _raw(HYDRO)
    base = _model(raw, HYDRO)
    paths = ["feed.mole_fractions.C2H4", "heat.medium.temperature"]
    rows = np.array([[1.2, 420.0], [0.05, -3.0], [0.05, 420.0], [math.nan, 420.0]])
    packed = fast.pack_cases(base, rows, paths)
    assert packed.valid.tolist() == [False, False, True, False]
    for values in rows[[0, 1]]:
        with pytest.raises(CaseError):
            _normal(raw, HYDRO, paths, values, base.species)
    out = fast.batch_solve(base, rows[:3], paths)
    assert out["fallback"].tolist() == [True, True, False]
    assert [fast.STATUS_NAMES[s] for s in out["status"][:2]] == ["failed", "failed"]
    assert all("CaseError" in out["error"][i] for i in (0, 1))
    assert out["invalid"].tolist() == [True, True, False]      # refused by the loader: invalid, not a failed run
    assert out["error"][2] is None and np.isfinite(out["hot_spot_temperature_K"][2])


def test_runaway_guard_when_the_adiabatic_rise_has_no_root(monkeypatch):
    # before: the ValueError of the root finder escaped the compiled sweep as a traceback
    from simulator.model import adiabatic
    from simulator.sweeps.compiled_sweep import _guards

    base = _model(_raw(HYDRO), HYDRO)

    def no_root(*args, **kwargs):
        raise ValueError("The function value at x=6.7e-311 is NaN; solver cannot continue.")

    monkeypatch.setattr(adiabatic, "adiabatic_rise", no_root)
    y0 = np.tile(base.y0, (2, 1))
    assert _guards(base, y0).tolist() == [base.y0[base.n] + 500.0] * 2


# -- supported paths ---------------------------------------------------------------------------------
def test_supports():
    raw = _raw(HYDRO)
    base = _model(raw, HYDRO)
    assert fast.supports(["heat.medium.temperature", "feed.mole_fractions.C2H4"])
    assert fast.supports(["reactions.0.activation_energy"], base)
    assert not fast.supports(["tube.length"])
    assert not fast.supports(["bed.void_fraction"], base)
    assert not fast.supports(["heat.medium.temperature", "heat.medium.temperature"])
    assert not fast.supports(["feed.mass_flow"], base)            # the case gives molar_flow
    assert not fast.supports(["feed.mole_fractions.CH4"], base)   # not in the feed table
    assert not fast.supports(["reactions.1.pre_exponential"], base)
    assert not fast.supports([])
    adiabatic = copy.deepcopy(raw)
    adiabatic["heat"] = {"mode": "adiabatic"}
    assert not fast.supports(["heat.medium.temperature"], _model(adiabatic, HYDRO))
    with pytest.raises(ValueError, match="tube.length"):
        fast.batch_solve(base, np.array([[3.0]]), ["tube.length"])


# -- agreement with simulate() -----------------------------------------------------------------------
def _compare(path, paths, params, raw=None):
    raw = _raw(path) if raw is None else raw
    base = _model(raw, path)
    out = fast.batch_solve(base, params, paths)
    worst = {"T": 0.0, "X": 0.0}
    statuses = []
    for i, values in enumerate(params):
        case, model = _normal(raw, path, paths, values, base.species, solver=TIGHT)
        ref = simulate(case, model=model)
        where = f"{paths} = {list(values)}"
        status = fast.STATUS_NAMES[out["status"][i]]
        statuses.append(status)
        assert status == ref.status, where
        dT = out["hot_spot_temperature_K"][i] - ref.hot_spot["temperature_K"]
        dX = out["outlet_conversion"][i] - ref.outlet_conversion
        assert abs(dT) <= T_TOL, f"{where}: hot spot {dT:+.4f} K"
        assert abs(dX) <= X_TOL, f"{where}: outlet conversion {dX:+.2e}"
        assert abs(out["outlet_temperature_K"][i] - ref.T[-1]) <= T_OUT_TOL, where
        assert abs(out["outlet_pressure_Pa"][i] - ref.P[-1]) <= P_OUT_RTOL * ref.P[0], where
        if status == "stopped":
            assert abs(out["outlet_position_m"][i] - ref.z[-1]) <= Z_STOP_TOL, where
        worst["T"] = max(worst["T"], abs(dT))
        worst["X"] = max(worst["X"], abs(dX))
    return out, statuses, worst


def test_agrees_with_simulate_around_the_oxylene_runaway_boundary():
    # coolant = feed temperature varied together is the source's setting; here the coolant
    # alone, across the boundary (runaway sets in near y_OX = 0.018 at 625 K)
    params = _grid((615.0, 0.013), (635.0, 0.020))
    out, statuses, worst = _compare(OXYLENE, ["heat.medium.temperature", "feed.mole_fractions.OX"], params)
    assert "stopped" in statuses and "completed" in statuses  # both sides of the boundary
    assert np.nanmax(out["hot_spot_temperature_K"]) >= 1200.0 - 1e-6  # runaway reaches the case's limit
    assert not out["fallback"].any()


def test_agrees_with_simulate_on_the_hydrogenation_case():
    params = _grid((405.0, 0.03), (455.0, 0.09))
    out, statuses, worst = _compare(HYDRO, ["heat.medium.temperature", "feed.mole_fractions.C2H4"], params)
    assert "stopped" in statuses and "completed" in statuses
    assert not out["fallback"].any()


def test_agrees_with_simulate_without_a_limit_on_runaway_peaks():
    # the sweep verb lets runaway cases run on (no design limit): sharp peaks up to ~800 K
    raw = _raw(HYDRO)
    del raw["design"]["temperature_limit"]
    params = _grid((420.0, 0.06), (455.0, 0.10), n=4)
    out, statuses, worst = _compare(HYDRO, ["heat.medium.temperature", "feed.mole_fractions.C2H4"], params,
                                    raw=raw)
    assert set(statuses) == {"completed"}
    assert np.max(out["hot_spot_temperature_K"]) > 750.0


def test_agrees_with_simulate_on_a_real_gas_case():
    params = np.array([[500.0, 0.3, 1.0e7], [510.0, 0.24, 9.0e6], [492.0, 0.33, 1.1e7]])
    out, statuses, worst = _compare(METHANOL, ["heat.medium.temperature", "feed.mole_fractions.CO",
                                               "feed.pressure"], params)
    assert not out["fallback"].any()


def test_temperature_limit_argument_per_case():
    raw = _raw(HYDRO)
    base = _model(raw, HYDRO)
    paths = ["heat.medium.temperature", "feed.mole_fractions.C2H4"]
    params = np.array([[445.0, 0.09], [445.0, 0.09]])
    out = fast.batch_solve(base, params, paths, temperature_limit=[650.0, math.inf])
    assert [fast.STATUS_NAMES[s] for s in out["status"]] == ["stopped", "completed"]
    assert out["hot_spot_temperature_K"][0] == pytest.approx(650.0, abs=1e-6)
    assert out["hot_spot_temperature_K"][1] > 700.0


# -- fallback to the implicit per-case path ----------------------------------------------------------
def test_fallback_path_equals_simulate():
    raw = _raw(OXYLENE)
    base = _model(raw, OXYLENE)
    paths = ["heat.medium.temperature", "feed.mole_fractions.OX"]
    params = np.array([[625.0, 0.015], [630.0, 0.019], [620.0, 0.012]])
    out = fast.batch_solve(base, params, paths, max_steps=5)   # far too few steps: every case falls back
    assert out["fallback"].all()
    assert (out["fallback_reason"] == fast.FALLBACK_REASONS.index("step budget exhausted")).all()
    for i, values in enumerate(params):
        case, model = _normal(raw, OXYLENE, paths, values, base.species)
        ref = simulate(case, model=model)
        assert fast.STATUS_NAMES[out["status"][i]] == ref.status
        assert out["hot_spot_temperature_K"][i] == ref.hot_spot["temperature_K"]
        assert out["hot_spot_position_m"][i] == ref.hot_spot["position_m"]
        assert out["outlet_conversion"][i] == ref.outlet_conversion
        assert out["outlet_temperature_K"][i] == ref.T[-1]
        assert out["outlet_pressure_Pa"][i] == ref.P[-1]


def test_stiffness_detection_marks_cases_for_fallback():
    # the reversible dehydrogenation with 100x faster kinetics: a fast relaxation to equilibrium
    # along the tube, where the explicit method is held back by stability, not accuracy
    raw = _raw(DEHYDRO)
    base = _model(raw, DEHYDRO)
    paths = ["reactions.0.pre_exponential", "heat.medium.temperature"]
    params = np.array([[4.0e14, 1250.0]])
    quiet = fast.batch_solve(base, params, paths)
    assert quiet["stiff"][0] and not quiet["fallback"][0]
    loud = fast.batch_solve(base, params, paths, stiffness_fallback=True)
    assert loud["fallback"][0]
    assert fast.FALLBACK_REASONS[loud["fallback_reason"][0]] == "stiffness detected"
    case, model = _normal(raw, DEHYDRO, paths, params[0], base.species)
    assert loud["hot_spot_temperature_K"][0] == simulate(case, model=model).hot_spot["temperature_K"]
    case, model = _normal(raw, DEHYDRO, paths, params[0], base.species, solver=TIGHT)
    ref = simulate(case, model=model)
    assert abs(quiet["hot_spot_temperature_K"][0] - ref.hot_spot["temperature_K"]) <= T_TOL
    assert abs(quiet["outlet_conversion"][0] - ref.outlet_conversion) <= X_TOL


def test_one_and_two_threads_give_identical_results():
    raw = _raw(HYDRO)
    base = _model(raw, HYDRO)
    paths = ["heat.medium.temperature", "feed.mole_fractions.C2H4"]
    params = _grid((405.0, 0.03), (455.0, 0.09), n=5)
    one = fast.batch_solve(base, params, paths, threads=1)
    two = fast.batch_solve(base, params, paths, threads=2)
    for name in ("hot_spot_temperature_K", "outlet_conversion", "outlet_pressure_Pa", "status"):
        np.testing.assert_array_equal(one[name], two[name])


def test_run_command_does_not_import_the_fast_module(tmp_path):
    code = ("import sys, simulator.cli as c\n"
            f"rc = c.main(['run', {str(HYDRO)!r}, '--out', {str(tmp_path / 'out')!r}])\n"
            "print(rc, 'simulator.sweeps.fast' in sys.modules)\n")
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr[-2000:]
    assert done.stdout.split()[-2:] == ["0", "False"]
