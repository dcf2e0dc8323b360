"""A run never gives a silently wrong answer and never runs without end (issue 10, 7c / 12 / 12b / 16 / 17).

Kinds of check (DEVELOPERS.md): ``invariant`` (conversion in [0, 1], flows non-negative within
tolerance, budgets kept) and ``analytic`` (zero-order consumption: X = k V / F_A0 until A runs out).
"""
import re
import time
from pathlib import Path

import numpy as np
import pytest

from simulator import load_case, simulate
from simulator.case.load import load_case_dict
from simulator.model.build import build_model
from simulator.solve import integrate as I

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "cases"


def _variant(tmp_path, name, replacements, regex=()):
    text = (DEMO / name).read_text()
    for old, new in replacements:
        assert old in text, old
        text = text.replace(old, new)
    for pattern, new in regex:
        text = re.sub(pattern, new, text)
    path = tmp_path / name
    path.write_text(text)
    return load_case(path)


def _zero_order(tmp_path, pre_exponential):
    return _variant(tmp_path, "decomposition_empty_tube.toml",
                    [("orders = { A = 1 }", "orders = { A = 0 }"),
                     ('pre_exponential = "4.0e12 1/s"', f'pre_exponential = "{pre_exponential} mol/(m^3*s)"')])


def test_zero_order_reaction_stops_when_its_reactant_is_gone(tmp_path):
    """The decomposition demo with orders = { A = 0 } and a rate that would use up A 9 times over:
    A runs out and stays at zero (before the fix: X(A) = 9.26, a negative outlet flow, 'completed')."""
    result = simulate(_zero_order(tmp_path, "4.0e14"))
    assert result.status == "completed"
    assert result.outlet_conversion == pytest.approx(1.0, abs=1e-8)
    assert result.outlet_conversion <= 1.0
    feed_total = result.F[0].sum()
    assert result.F[:, result.key_index].min() >= -1e-9 * feed_total


def test_zero_order_rate_is_the_stated_law_while_the_reactant_lasts(tmp_path):
    """analytic: isothermal zero order, X = k V / F_A0 while X < 1 (k = A exp(-E/RT), V = all tubes);
    tolerance 1e-6 from the solver's rtol 1e-8 over the tube."""
    case = _zero_order(tmp_path, "4.0e12")
    result = simulate(case)
    k = 4.0e12 * np.exp(-170e3 / (8.314462618 * 700.0))
    volume = np.pi * 0.05 ** 2 / 4 * 12.0 * 40
    assert result.outlet_conversion == pytest.approx(k * volume / (0.7 * 12.0), rel=1e-6)


def test_a_flow_more_negative_than_the_tolerance_fails_the_run(cases_dir):
    model = build_model(load_case(cases_dir / "decomposition_empty_tube.toml"))
    zs = np.linspace(0.0, 1.0, 5)
    ys = np.tile(model.y0, (5, 1))
    ys[3:, 0] = -1e-3 * model.y0[:model.n].sum()
    atol = model.scale * 1e-10
    z, y, status, why = I._negative_flow_check(model, zs, ys, atol, "completed", "end")
    assert status == "failed"
    assert "molar flow of A negative" in why and "z = 0.75 m" in why
    assert len(z) == 3 and np.all(y[:, 0] >= 0)


def test_dilute_key_species_conversion_is_clipped_and_flagged(tmp_path):
    """N2 as key species at 7.9e-8 mole fraction, consumed completely by a zero-order reaction:
    conversion at most 1 (before: 1.0047) and a warning that the key is too dilute."""
    raw = {"title": "trace key", "thermo": {"species_file": "gri30.yaml"},
           "reactions": [{"equation": "N2 + O2 => 2 NO", "pre_exponential": "1e-2 mol/(m^3*s)",
                          "activation_energy": "10 kJ/mol", "orders": {"N2": 0, "O2": 0}}],
           "feed": {"temperature": "600 K", "pressure": "2 bar", "molar_flow": "1 mol/s",
                    "mole_fractions": {"N2": 7.9e-8, "O2": 0.2, "AR": 0.799999921}},
           "tube": {"length": "2 m", "inner_diameter": "50 mm", "count": 1},
           "heat": {"mode": "isothermal"}, "design": {"key_species": "N2"}}
    result = simulate(load_case_dict(raw))
    assert result.status == "completed"
    assert 0.99 < result.outlet_conversion <= 1.0
    assert any("key species N2 is dilute" in w for w in result.warnings)


def test_one_step_budget_per_run_refuses_a_tiny_max_step(tmp_path):
    """max_step = 1 um on a 12 m tube needs 1.2e7 steps: failed at once with the reason (before the
    fix the 100 000-step limit applied per output interval and the run took millions of steps)."""
    import dataclasses

    case = load_case(DEMO / "decomposition_empty_tube.toml")      # the loader refuses it too (test_case_inputs)
    case = dataclasses.replace(case, solver=dataclasses.replace(case.solver, max_step=1e-6))
    started = time.perf_counter()
    result = simulate(case)
    assert time.perf_counter() - started < 5.0
    assert result.status == "failed"
    assert "solver.max_step" in result.termination and str(I.RUN_STEP_BUDGET) in result.termination
    assert result.summary()["outlet"]["conversion"] is None


def test_step_budget_counts_the_whole_run(tmp_path, monkeypatch):
    """invariant: with a budget smaller than a run needs, the run fails with the reason and the steps
    taken stay within the budget plus one interval's share (never per interval)."""
    case = _zero_order(tmp_path, "4.0e14")          # about 130 steps when the budget allows
    monkeypatch.setattr(I, "RUN_STEP_BUDGET", 60)
    result = simulate(case)
    assert result.status == "failed"
    assert "budget of 60 solver steps" in result.termination
    assert result.solver_stats["steps_main_integration"] <= 60 + 1


def test_no_event_from_a_failed_re_integration(cases_dir):
    """An interior maximum above the limit that only a re-integration could confirm is not reported
    when the re-integration cannot run (budget spent): the event comes from solver states only."""
    model = build_model(load_case(cases_dir / "hydrogenation_cooled_packed_bed.toml"))
    tube = I._Tube(model, 1e-8, model.scale * 1e-10, 0.0, I.kernels.compiled)
    zs = np.array([0.0, 1.0, 2.0])
    n = model.n
    ys = np.tile(model.y0, (3, 1))
    ys[:, n] = [400.0, 410.0, 400.0]
    dTdz = np.array([30.0, 0.0, -30.0])
    dTdz[1] = -1e-9
    tube.post_budget = 0
    assert I._limit_crossing(tube, zs, ys, np.array([30.0, 25.0, -30.0]), n, 405.0) is not None  # grid point
    assert I._limit_crossing(tube, zs, ys, np.array([30.0, -25.0, -30.0]), n, 411.0) is None
    assert tube.unresolved == 1


def test_equilibrium_plateau_post_processing_stays_a_small_multiple_of_the_main_solve(tmp_path):
    """12b: the methanol demo adiabatic at 300 bar with a rate constant 1e4 times larger reaches the
    equilibrium curve within micrometres; dT/dz from the right-hand side is forward-reverse
    cancellation there. The run finishes within a bound relative to its main solve (before: minutes,
    a third of the intervals flagged and one re-integration crawling with 1e-10 m steps)."""
    case = _variant(tmp_path, "methanol_synthesis_real_gas.toml",
                    [('pressure = "100 bar"', 'pressure = "300 bar"'), ('"4.7e-7 m^9', '"4.7e-3 m^9')],
                    [(r"\[heat\][^\[]*(\[heat\.medium\][^\[]*)?", '[heat]\nmode = "adiabatic"\n\n'),
                     (r'temperature_limit = "[^"]*"\n', "")])
    simulate(case)                                  # load the compiled kernel and transport data once
    started = time.perf_counter()
    result = simulate(case)
    total = time.perf_counter() - started
    stats = result.solver_stats
    assert result.status == "completed"
    assert stats["steps"] - stats["steps_main_integration"] <= stats["post_processing_step_budget"]
    assert total < 20.0 * result.extra["timing"]["main_integration_s"] + 0.5
    assert result.hot_spot["temperature_K"] == pytest.approx(699.6527, abs=1e-3)
    assert any("particle diameters from the inlet" in w for w in result.warnings)


def test_isothermal_tube_has_no_hot_spot(cases_dir, capsys):
    from simulator.output import print_summary

    result = simulate(load_case(cases_dir / "decomposition_empty_tube.toml"))
    assert result.hot_spot["located_by"].startswith("no hot spot: isothermal tube")
    print_summary(result)
    out = capsys.readouterr().out
    assert "none: isothermal tube" in out and "at the inlet" not in out


def test_heated_tube_highest_temperature_is_not_called_a_hot_spot(cases_dir):
    result = simulate(load_case(cases_dir / "dehydrogenation_heated_tube.toml"))
    hot = result.hot_spot
    assert hot["rise_above_medium_K"] < 0
    assert "not a reaction hot spot" in hot["located_by"]


def _pure_methanol(medium, length):
    return {"title": "nearly pure methanol cooled at 63 atm", "thermo": {"species_file": "gri30.yaml",
                                                                         "equation_of_state": "peng-robinson"},
            "reactions": [{"equation": "CO + 2 H2 <=> CH3OH", "pre_exponential": "1e-20 mol/(m^3*s) / (mol/m^3)^3",
                           "activation_energy": "50 kJ/mol", "orders": {"CO": 1, "H2": 2}}],
            "feed": {"temperature": "560 K", "pressure": "63 atm", "molar_flow": "1 mol/s",
                     "mole_fractions": {"CH3OH": 0.98, "CO": 0.01, "H2": 0.01}},
            "tube": {"length": length, "inner_diameter": "30 mm", "count": 1},
            "heat": {"mode": "exchange", "overall_coefficient": "200 W/(m^2*K)", "medium": {"temperature": medium}},
            "design": {"key_species": "CO"}}


def test_peng_robinson_gas_cooled_into_the_liquid_region_fails_and_says_why():
    """Methanol (Tc 513 K) cooled at 63 atm: where a liquid root at the same composition becomes the
    more stable one the run is failed with that reason, never 'completed' with a closure warning
    (before the fix: a traceback, or 'completed' with an energy closure of 0.58)."""
    result = simulate(load_case_dict(_pure_methanol("300 K", "3 m")))
    assert result.status == "failed"
    assert "would condense" in result.termination and "CH3OH" in result.termination
    gas = simulate(load_case_dict(_pure_methanol("480 K", "1 m")))     # stays above the dew point
    assert gas.status == "completed"


def test_a_large_closure_fails_the_run():
    from simulator.solve.checks import closure_failure

    assert "energy balance closes only to 0.58" in closure_failure({"elements_relative": 0.0, "energy_relative": 0.58})
    assert closure_failure({"elements_relative": 1e-12, "energy_relative": 1e-7}) is None
    assert closure_failure({"elements_relative": float("nan"), "energy_relative": 0.0}) is not None


def _small_case(**changes):
    raw = {"title": "small", "thermo": {"species_file": "gri30.yaml"},
           "reactions": [{"equation": "C2H4 + H2 => C2H6", "pre_exponential": "1e3 m^3/(mol*s)",
                          "activation_energy": "40 kJ/mol"}],
           "feed": {"temperature": "450 K", "pressure": "5 bar", "molar_flow": "1 mol/s",
                    "mole_fractions": {"C2H4": 0.2, "H2": 0.3, "N2": 0.5}},
           "tube": {"length": "3 m", "inner_diameter": "30 mm", "count": 1},
           "heat": {"mode": "adiabatic"}, "pressure_drop": {"model": "pipe-friction", "viscosity": "2e-5 Pa*s"},
           "design": {"key_species": "C2H4"}}
    for path, value in changes.items():
        section, key = path.split("__")
        raw[section][key] = value
    return raw


def _beyond_the_loader(field, si_value):
    """The small case with one SI field set after loading: the loader refuses such values as design
    inputs (tests/test_case_inputs.py); here the model and solver must still fail cleanly."""
    import dataclasses

    case = load_case_dict(_small_case())
    section, key = field.split("__")
    if (section, key) == ("feed", "molar_flow"):
        section, key = "feed", "flow_value"
    return dataclasses.replace(case, **{section: dataclasses.replace(getattr(case, section), **{key: si_value})})


@pytest.mark.parametrize("field, value, match", [
    ("tube__inner_diameter", 1e-310, r"tube\.inner_diameter = 1e-310 m: its cross-section"),
    ("tube__inner_diameter", 1e200, r"tube\.inner_diameter = 1e\+200 m: its cross-section"),
    ("feed__molar_flow", 1e-310, r"feed flow: 1e-310 mol/s per tube is too small to integrate"),
])
def test_extreme_magnitudes_are_refused_with_the_field_not_a_traceback(field, value, match):
    """Before: ZeroDivisionError / OverflowError in build_model (a traceback, exit 1)."""
    from simulator.errors import CaseError

    with pytest.raises(CaseError, match=match):
        simulate(_beyond_the_loader(field, value))


@pytest.mark.parametrize("field, value", [
    ("feed__temperature", 1e-310),        # before: NaN in the adiabatic-rise root finder (ValueError)
    ("feed__temperature", 1.0),           # before: "Re must be > 0" from a NaN state (ValueError)
    ("tube__length", 1e200),              # before: ZeroDivisionError inside odeint
])
def test_extreme_states_end_as_a_result_with_a_status_never_an_exception(field, value):
    result = simulate(_beyond_the_loader(field, value))
    assert result.status in ("completed", "stopped", "failed")
    import json

    json.dumps(result.summary(), allow_nan=False)
    if result.status == "failed":
        assert "z = " in result.termination


def test_zero_activation_energy_and_huge_rate_constant_finish_within_the_budget():
    started = time.perf_counter()
    for changes in ({"reactions": None},):
        raw = _small_case()
        raw["reactions"][0]["activation_energy"] = "-50 kJ/mol"
        raw["reactions"][0]["pre_exponential"] = "1e30 m^3/(mol*s)"
        result = simulate(load_case_dict(raw))
        assert result.status in ("completed", "stopped", "failed")
        assert result.solver_stats["steps"] <= I.RUN_STEP_BUDGET + I.POST_CEILING
    assert time.perf_counter() - started < 15.0


def test_missing_transport_data_gives_cantera_s_first_line_and_the_fix():
    """Item 10: before, the message was a row of asterisks."""
    from simulator.errors import CaseError

    raw = _small_case(thermo__species_file="nasa_gas.yaml", pressure_drop__model="pipe-friction")
    raw["pressure_drop"] = {"model": "pipe-friction"}
    with pytest.raises(CaseError) as err:
        simulate(load_case_dict(raw))
    text = str(err.value)
    assert "Missing gas-phase transport data for species" in text
    assert "give pressure_drop.viscosity" in text and "****" not in text


def test_acceleration_term_is_flagged_in_the_dehydrogenation_demo(cases_dir):
    """7 % of the pressure drop in the dehydrogenation demo (expanding, heated gas); the term is
    G^2 (1/rho_out - 1/rho_in) computed here independently from the result's profiles (ideal gas)."""
    case = load_case(cases_dir / "dehydrogenation_heated_tube.toml")
    model = build_model(case)
    result = simulate(case, model=model)
    F = result.F / model.count
    M = model.species.molar_mass
    v = [8.314462618 * result.T[k] * F[k].sum() / (result.P[k] * float(F[k] @ M)) for k in (0, -1)]
    G = float(F[0] @ M) / model.area
    accel = G * G * (v[1] - v[0])
    assert I.acceleration_pressure_drop(model, np.column_stack([F, result.T, result.P, result.Tc, result.Q])) \
        == pytest.approx(accel, rel=1e-6)
    share = accel / (result.P[0] - result.P[-1])
    assert 0.05 < share < 0.09
    assert any("acceleration term of the momentum balance" in w and f"{100 * share:.0f} %" in w
               for w in result.warnings)


def test_summary_table_prints_numbers_that_could_not_be_computed(cases_dir, capsys):
    """Before: a summary with a null number was written and printing it raised a TypeError."""
    import dataclasses

    from simulator.output import print_summary

    result = simulate(load_case(cases_dir / "hydrogenation_cooled_packed_bed.toml"))
    broken = dataclasses.replace(result, closure={"elements_relative": float("nan"), "energy_relative": None},
                                 hot_spot=dict(result.hot_spot, temperature_K=float("nan")))
    print_summary(broken)
    out = capsys.readouterr().out
    assert "energy not computed" in out and "hot spot          not computed" in out


def test_a_fine_output_grid_still_completes_within_the_budget(cases_dir, tmp_path):
    """invariant: 20 001 output points leave 2 steps per interval to the first call; the chunked
    continuation finishes the run within the budget and agrees with the normal grid to 1e-6
    (the restarts at chunk boundaries cost accuracy of the order of rtol only)."""
    name = "hydrogenation_cooled_packed_bed.toml"
    path = tmp_path / name
    path.write_text((cases_dir / name).read_text() + '\n[solver]\noutput_points = 20001\n')
    fine = simulate(load_case(path))
    normal = simulate(load_case(cases_dir / name))
    assert fine.status == "completed"
    assert fine.solver_stats["steps_main_integration"] <= I.RUN_STEP_BUDGET
    assert fine.outlet_conversion == pytest.approx(normal.outlet_conversion, abs=1e-6)
    assert fine.hot_spot["temperature_K"] == pytest.approx(normal.hot_spot["temperature_K"], abs=1e-4)


def test_fuzzed_zero_order_with_temperature_exponent_keeps_the_invariants(tmp_path):
    """Fuzz finding: orders = { A = 0 } with temperature_exponent = 5 reported X = 1.6e13 and a mole
    fraction of -1: now X <= 1 and every reported flow and mole fraction >= 0."""
    case = _variant(tmp_path, "decomposition_empty_tube.toml",
                    [("orders = { A = 1 }", "orders = { A = 0 }"),
                     ('pre_exponential = "4.0e12 1/s"',
                      'pre_exponential = "4.0e12 mol/(m^3*s)/(mol/m^3)^0"\ntemperature_exponent = 5')])
    result = simulate(case)
    assert result.status == "completed"
    assert 0.0 <= result.outlet_conversion <= 1.0
    assert result.F.min() >= 0.0 and result.mole_fractions.min() >= 0.0


def test_a_temperature_that_is_not_positive_fails_the_run(cases_dir):
    model = build_model(load_case(cases_dir / "decomposition_empty_tube.toml"))
    zs = np.linspace(0.0, 1.0, 4)
    ys = np.tile(model.y0, (4, 1))
    ys[2:, model.n] = -1e-12
    z, y, status, why = I._negative_flow_check(model, zs, ys, model.scale * 1e-10, "completed", "end")
    assert status == "failed" and "temperature not positive at z = 0.666667 m" in why
    assert len(z) == 2


def test_a_solver_failure_in_the_continuation_ends_the_run(tmp_path):
    """Found by fuzzing: the heated dehydrogenation demo with a negative activation energy
    (-50 kJ/mol) made ODEPACK fail with repeated convergence failures inside the budgeted
    continuation; such a failure spends no counted steps, so the continuation retried the same
    chunk without end (158 604 odeint calls in 25 s). It must end as a failed run, in a few calls."""
    case = _variant(tmp_path, "dehydrogenation_heated_tube.toml", [], regex=[
        (r'activation_energy = "[^"]*"', 'activation_energy = "-50 kJ/mol"')])
    result = simulate(case)
    assert result.status == "failed"
    assert result.solver_stats["integrator_calls"] < 1_000
