"""Counter-current medium: shooting over every steady state, against closed forms and exact identities.

Kinds of check (STYLE.md section 8): published closed forms (the epsilon-NTU relations of a
counter-current and a co-current exchanger), invariants (energy closure with the medium; the
overall adiabatic balance and T - Tc = const of an autothermal tube), and limits (a medium of
very large capacity rate is a uniform medium).
"""
import math

import numpy as np
import pytest

from simulator import load_case, simulate
from simulator.model.build import build_model
from simulator.solve.checks import closure
from simulator.solve.counter_current import steady_states
from simulator.solve.integrate import _simulate

R = 8.314462618          # [J/(mol*K)], the value the simulator uses
CP = 30.0                # [J/(mol*K)] gas heat capacity (both species, constant)
D, L = 0.05, 5.0         # [m] tube inner diameter and length
AREA = math.pi * D * L   # [m^2] inner wall area of the tube


def _case(arrangement="counter-current", U=1.0, T_feed=500.0, T_medium=300.0, medium_mass_flow=0.05,
          medium_cp=1000.0, pre_exponential="0 mol/(m^3*s*Pa)", activation_energy=0.0, hf_B=0.0,
          feed_flow=1.0, rtol=1e-10):
    """One tube, A => B first order in partial pressure, constant cp; the medium as given."""
    medium = f'temperature = "{T_medium!r} K"\n'
    if arrangement != "uniform":
        medium += f'mass_flow = "{medium_mass_flow!r} kg/s"\ncp = "{medium_cp!r} J/(kg*K)"\n'
    return f'''title = "Counter-current check tube"
[thermo.custom.A]
molar_mass = "28.0 g/mol"
cp = "{CP!r} J/(mol*K)"
enthalpy_of_formation = "0.0 kJ/mol"

[thermo.custom.B]
molar_mass = "28.0 g/mol"
cp = "{CP!r} J/(mol*K)"
enthalpy_of_formation = "{hf_B!r} kJ/mol"

[[reactions]]
equation = "A => B"
pre_exponential = "{pre_exponential}"
activation_energy = "{activation_energy!r} kJ/mol"
orders = {{ A = 1 }}
in_terms_of = "partial-pressure"

[feed]
temperature = "{T_feed!r} K"
pressure = "1e5 Pa"
molar_flow = "{feed_flow!r} mol/s"
mole_fractions = {{ A = 1.0 }}

[tube]
length = "{L!r} m"
inner_diameter = "{D!r} m"
count = 1

[heat]
mode = "exchange"
overall_coefficient = "{U!r} W/(m^2*K)"

[heat.medium]
arrangement = "{arrangement}"
{medium}
[design]
key_species = "A"

[solver]
rtol = {rtol!r}
atol_scale = 1e-12
'''


def counterflow_effectiveness(ntu, cr):
    """epsilon of a counter-current exchanger (Kays & London 1984; Incropera & DeWitt 2007), [-]."""
    e = math.exp(-ntu * (1.0 - cr))
    return (1.0 - e) / (1.0 - cr * e)


def parallel_flow_effectiveness(ntu, cr):
    """epsilon of a co-current (parallel-flow) exchanger (Kays & London 1984; Incropera & DeWitt 2007), [-]."""
    return (1.0 - math.exp(-ntu * (1.0 + cr))) / (1.0 + cr)


# exchanger without reaction: gas C_g = 1 mol/s * 30 J/(mol K) = 30 W/K (C_min), medium 50 W/K
C_GAS, C_MEDIUM = 1.0 * CP, 0.05 * 1000.0
NTU = 1.0
U_NTU1 = NTU * C_GAS / AREA


def test_effectiveness_closed_forms_as_coded_match_tabulated_values():
    # Incropera & DeWitt, Table 11.3 / Kays & London: epsilon(NTU = 1, Cr = 0.5) from the same
    # closed forms, printed to 4 decimals (from memory: 0.5647 counterflow, 0.5179 parallel flow)
    assert counterflow_effectiveness(1.0, 0.5) == pytest.approx(0.5647, abs=5e-5)
    assert parallel_flow_effectiveness(1.0, 0.5) == pytest.approx(0.5179, abs=5e-5)


@pytest.mark.published("kays_london1984", "counter-current effectiveness, NTU = 1, Cr = 0.6")
def test_counter_current_exchanger_matches_epsilon_ntu(write_case):
    # Source: Kays & London 1984 / Incropera & DeWitt 2007 (tests/sources.toml), counterflow
    # epsilon-NTU closed form; constant heat capacities and no reaction make it exact, so the
    # tolerance is the solver's (rtol 1e-10).
    result = simulate(load_case(write_case(_case(U=U_NTU1))))
    assert result.status == "completed"
    states = result.summary()["steady_states"]
    assert len(states) == 1 and states[0]["stability"] == "unique" and states[0]["describes_outputs"]
    eps = C_GAS * (500.0 - result.T[-1]) / (C_GAS * (500.0 - 300.0))
    assert eps == pytest.approx(counterflow_effectiveness(NTU, C_GAS / C_MEDIUM), rel=1e-7)
    assert result.Tc[-1] == pytest.approx(300.0, abs=1e-6)          # the medium enters at z = L
    assert states[0]["medium_outlet_temperature_K"] == pytest.approx(result.Tc[0], abs=1e-9)
    assert result.closure["energy_relative"] < 1e-7


@pytest.mark.published("kays_london1984", "parallel-flow effectiveness, NTU = 1, Cr = 0.6")
def test_co_current_exchanger_matches_epsilon_ntu(write_case):
    # Source: as above, parallel-flow closed form; exact for constant heat capacities.
    result = simulate(load_case(write_case(_case(arrangement="co-current", U=U_NTU1))))
    eps = (500.0 - result.T[-1]) / (500.0 - 300.0)
    assert eps == pytest.approx(parallel_flow_effectiveness(NTU, C_GAS / C_MEDIUM), rel=1e-7)
    assert "steady_states" not in result.summary()


def test_energy_closure_includes_the_medium(write_case):
    # the closure is process + medium enthalpy change = 0; a medium temperature that is off by 1 K
    # at the end must show (before the medium entered the closure it did not: Q alone balanced)
    for arrangement in ("co-current", "counter-current"):
        case = load_case(write_case(_case(arrangement=arrangement, U=U_NTU1), name=f"{arrangement}.toml"))
        result = simulate(case)
        model = build_model(case)
        ys = np.column_stack([result.F, result.T, result.P, result.Tc, result.Q])
        assert closure(model, ys)["energy_relative"] < 1e-7
        ys[-1, model.n + 2] += 1.0
        assert closure(model, ys)["energy_relative"] > 1e-2


def test_medium_of_large_capacity_rate_is_a_uniform_medium(write_case):
    # limit: C_m -> infinity keeps the medium at its inlet temperature all along, so counter-current,
    # co-current and uniform must agree; C_g / C_m = 3e-7: the ~5 kW taken up move the medium by 5e-5 K
    reacting = dict(U=100.0, T_feed=600.0, T_medium=600.0, pre_exponential="1e4 mol/(m^3*s*Pa)",
                    activation_energy=80.0, hf_B=-5.0, medium_mass_flow=1e5)
    counter = simulate(load_case(write_case(_case(**reacting), name="c.toml")))
    uniform = simulate(load_case(write_case(_case(arrangement="uniform", **reacting), name="u.toml")))
    assert counter.hot_spot["temperature_K"] - 600.0 > 5.0          # a real hot spot, not a flat profile
    assert counter.hot_spot["temperature_K"] == pytest.approx(uniform.hot_spot["temperature_K"], abs=1e-3)
    assert counter.T[-1] == pytest.approx(uniform.T[-1], abs=1e-3)


# autothermal tube (van Heerden configuration; next-physics measured case A): first order,
# E/R = 10 000 K, dT_ad = 250 K, NTU = 3, Da = k(300 K) A P L / F = 2e-3, equal capacity rates
E_R, DT_AD, NTU_A, DA, T_FEED = 10_000.0, 250.0, 3.0, 2e-3, 300.0


def _autothermal_case(write_case):
    k300 = DA * 1.0 / (math.pi * D ** 2 / 4 * 1e5 * L)                 # [mol/(m^3 s Pa)]
    return load_case(write_case(_case(
        U=NTU_A * C_GAS / AREA, T_feed=T_FEED, T_medium=T_FEED, medium_mass_flow=C_GAS / 1000.0,
        pre_exponential=f"{k300 * math.exp(E_R / T_FEED)!r} mol/(m^3*s*Pa)",
        activation_energy=E_R * R / 1000.0, hf_B=-DT_AD * CP / 1000.0, rtol=1e-9), name="auto.toml"))


@pytest.mark.published("van_heerden1953", "autothermal tube with three steady states (configuration; identities derived)")
def test_autothermal_tube_has_three_steady_states_with_exact_identities(write_case):
    states, scan = steady_states(_autothermal_case(write_case), _simulate, autothermal=True)
    assert [e["stability"] for e, _ in states] == ["stable", "unstable", "stable"]
    low, middle, high = states
    # identity 1 (overall adiabatic balance: the medium is the feed): T_out = T_feed + dT_ad X_out
    for entry, result in states:
        assert result.status == "completed"
        assert entry["outlet_temperature_K"] == pytest.approx(T_FEED + DT_AD * entry["outlet_conversion"], abs=1e-4)
    # identity 2 (complete conversion at the inlet, equal capacity rates): T - Tc = dT_ad all along,
    # so the feed enters at T(0) = Tc(0) = T_feed + NTU dT_ad = 1050 K
    assert high[0]["medium_outlet_temperature_K"] == pytest.approx(T_FEED + NTU_A * DT_AD, abs=1e-3)
    r = high[1]
    past_ignition = r.z > 0.01 * L
    assert np.allclose(r.T[past_ignition] - r.Tc[past_ignition], DT_AD, atol=1e-3)
    assert high[0]["outlet_conversion"] == pytest.approx(1.0, abs=1e-9)
    # the lower two as measured while planning (next-physics.md section 2.2, printed to 0.01 K / 1e-4)
    assert low[0]["medium_outlet_temperature_K"] == pytest.approx(300.83, abs=0.01)
    assert middle[0]["medium_outlet_temperature_K"] == pytest.approx(337.90, abs=0.01)
    assert low[0]["outlet_conversion"] == pytest.approx(0.0022, abs=1e-4)
    assert middle[0]["outlet_conversion"] == pytest.approx(0.0858, abs=1e-4)


def test_outputs_describe_the_lowest_branch_and_warn_of_the_others(write_case, monkeypatch):
    # the autothermal states through simulate(): the summary lists all three, marks the lowest
    # (start-up from a cold medium) and the run carries a warning naming the others
    from simulator.solve import counter_current as cc

    case = _autothermal_case(write_case)
    found = steady_states(case, _simulate, autothermal=True)
    monkeypatch.setattr(cc, "steady_states", lambda *a, **k: found)
    result = simulate(case)
    summary = result.summary()
    marked = [e["describes_outputs"] for e in summary["steady_states"]]
    assert marked == [True, False, False]
    assert summary["outlet"]["temperature_K"] == pytest.approx(summary["steady_states"][0]["outlet_temperature_K"])
    assert any(w.startswith("3 steady states found") for w in summary["warnings"])


def test_no_steady_state_found_is_a_failed_run(write_case, monkeypatch):
    # a scan range that holds no root (forced here) must give a failed run with the reason, no profile
    from simulator.solve import counter_current as cc

    monkeypatch.setattr(cc, "scan_range", lambda *a, **k: (600.0, 700.0))
    result = simulate(load_case(write_case(_case(U=U_NTU1))))
    summary = result.summary()
    assert result.status == "failed"
    assert result.termination.startswith("no steady state found")
    assert summary["outlet"]["temperature_K"] is None and summary["steady_states"] == []
    assert len(result.z) == 1


def test_collocation_polish_keeps_the_root_it_starts_from(write_case, monkeypatch):
    # where marching is unstable the root is polished by solve_bvp from the marched profile; forced
    # here on a well-behaved exchanger, the polished root must be the marched one (to the solver's tolerance)
    from simulator.solve import counter_current as cc

    case = load_case(write_case(_case(U=U_NTU1)))
    marched = steady_states(case, _simulate)[0][0][0]
    monkeypatch.setattr(cc, "UNSTABLE_SLOPE", 0.0)
    polished = steady_states(case, _simulate)[0][0][0]
    assert polished["solved_by"].startswith("polished by collocation")
    assert polished["medium_outlet_temperature_K"] == pytest.approx(marched["medium_outlet_temperature_K"], abs=1e-4)


def test_counter_current_needs_mass_flow_and_cp(write_case):
    from simulator.errors import CaseError

    text = _case(U=U_NTU1).replace('mass_flow = "0.05 kg/s"\n', "")
    with pytest.raises(CaseError, match=r"heat\.medium.*mass_flow"):
        load_case(write_case(text))


def test_compiled_batch_path_refuses_a_counter_current_case(write_case):
    # the compiled batch integrator marches an initial-value problem: it would silently run the
    # counter-current medium as if it entered at z = 0; sweeps and screening must take the
    # per-case path (simulate, shooting) instead
    from simulator.sweeps import fast

    model = build_model(load_case(write_case(_case(U=U_NTU1))))
    assert not fast.supports(["heat.medium.temperature"], model)
    assert "counter-current" in fast.unsupported_reason(["heat.medium.temperature"], model)


def test_python_twin_finds_the_same_steady_state(write_case, monkeypatch):
    # the shooting marches with the kernel a single run uses; the pure-Python twin (cold cache) must
    # give the compiled kernel's steady state
    case = load_case(write_case(_case(U=U_NTU1)))
    compiled = simulate(case).summary()["steady_states"][0]
    monkeypatch.setenv("TUBESIM_KERNEL", "python")
    twin = simulate(case)
    assert twin.solver_stats["kernel"].startswith("plain Python")
    assert twin.summary()["steady_states"][0]["medium_outlet_temperature_K"] == pytest.approx(
        compiled["medium_outlet_temperature_K"], abs=1e-7)


def test_scan_whose_marches_fail_is_a_failed_run_that_says_why(write_case):
    # a strongly cooled packed tube (NTU of the gas ~50) with a small counter-current medium flow: the
    # marches from z = 0 leave the physical temperatures before z = L, so no steady state is found by
    # single shooting; the run must fail and say so (not return an initial-value profile)
    from pathlib import Path

    demo = (Path(__file__).resolve().parents[1] / "cases" / "hydrogenation_cooled_packed_bed.toml").read_text()
    text = demo.replace('arrangement = "uniform"\ntemperature = "420 K"',
                        'arrangement = "counter-current"\ntemperature = "400 K"\nmass_flow = "0.5 kg/s"\n'
                        'cp = "2.2 kJ/(kg*K)"')
    assert "counter-current" in text
    result = simulate(load_case(write_case(text, name="hcc.toml")))
    assert result.status == "failed"
    assert "no steady state found" in result.termination
    assert "left the range of physical temperatures" in result.termination
    assert "multiple shooting is not implemented" in result.termination
    assert result.summary()["outlet"]["temperature_K"] is None


def _with_target(text, target):
    return text.replace('[design]\nkey_species = "A"', f'[design]\nkey_species = "A"\ntarget_conversion = {target!r}')


@pytest.mark.published("levenspiel1999", "isothermal first-order plug flow, X = 1 - exp(-k tau)")
def test_length_to_target_with_a_counter_current_medium_matches_the_closed_form(write_case):
    # no heat of reaction and medium = feed temperature: the tube stays isothermal, F_A = F0 exp(-k A P z / F),
    # so L = -ln(1 - X) F / (k A P). The length comes from re-solved tubes (the medium enters at z = L),
    # not from one run's crossing, so this checks the root search on X_out(L) itself.
    from simulator.solve.target_length import length_by_resolving

    k = 2e-4                                   # [mol/(m^3 s Pa)]; L to X = 0.9 about 59 m
    case = load_case(write_case(_with_target(_case(U=50.0, T_feed=500.0, T_medium=500.0,
                                                   pre_exponential=f"{k!r} mol/(m^3*s*Pa)"), 0.9)))
    found = length_by_resolving(case)
    exact = -math.log(1 - 0.9) * 1.0 / (k * math.pi * D ** 2 / 4 * 1e5)
    assert found["reached"] and found["solves"] > 3
    assert found["length_m"] == pytest.approx(exact, rel=1e-4)
    assert found["result"].outlet_conversion >= 0.9


def test_sizing_a_counter_current_tube_re_solves_the_length(write_case):
    # regression: the length was the crossing inside the given tube, whose medium enters at its own end;
    # the tube of that length (medium entering there) missed the target (0.93 instead of 0.95 on the
    # hydrogenation demo with a counter-current medium)
    from simulator.sizing import length_for_count

    reacting = dict(U=100.0, T_feed=600.0, T_medium=600.0, pre_exponential="1e4 mol/(m^3*s*Pa)",
                    activation_energy=80.0, hf_B=-5.0, medium_mass_flow=0.02, rtol=1e-8)
    case = load_case(write_case(_with_target(_case(**reacting), 0.8)))
    run = simulate(case)
    assert run.design["length_m"] is None and "tubesim size" in run.design["length_note"]
    crossing = run.events["target_conversion"]["position_m"]
    sized = length_for_count(case)
    assert sized["feasible"]
    assert sized["design"]["outlet_conversion"] == pytest.approx(0.8, abs=1e-4)
    assert abs(sized["design"]["tube_length_m"] - crossing) > 1e-3 * crossing   # the crossing is not the answer


def test_screening_states_which_medium_temperature_its_criteria_take(write_case):
    # the constant-medium criteria take the medium's given temperature; a counter-current medium that warms
    # by more than a quarter of R Tc^2/E is said to make them approximate (and a small change is said to be small)
    from simulator.screening.screen import medium_basis

    reacting = dict(U=100.0, T_feed=600.0, T_medium=600.0, pre_exponential="1e4 mol/(m^3*s*Pa)",
                    activation_energy=80.0, hf_B=-5.0, rtol=1e-8)
    warm = simulate(load_case(write_case(_case(medium_mass_flow=0.02, **reacting), name="w.toml")))
    big = simulate(load_case(write_case(_case(medium_mass_flow=1e5, **reacting), name="b.toml")))
    scale = R * 600.0 ** 2 / 80e3
    b = medium_basis(warm.case, warm, scale)
    assert b["criteria_medium_temperature_K"] == 600.0
    assert b["medium_change_K"] == pytest.approx(np.nanmax(warm.Tc) - np.nanmin(warm.Tc))
    assert b["medium_change_K"] > 0.25 * scale and "approximate" in b["note"]
    assert "apply" in medium_basis(big.case, big, scale)["note"]


def test_report_lists_every_steady_state(write_case):
    from simulator.report.context_sections import _steady_states_table

    result = simulate(_autothermal_case(write_case))
    table = _steady_states_table(result)
    assert len(table["rows"]) == len(result.extra["steady_states"]) == 3
    assert [row[0] for row in table["rows"]].count("yes") == 1


def test_marches_that_diverge_keep_the_sign_of_the_side_they_leave(write_case):
    # regression: a medium of small capacity rate diverges from the gas in the march from z = 0; such
    # marches were "failed" (NaN), so the scan saw no sign change and the run failed although a steady state
    # exists. Hydrogenation demo with a counter-current medium of 2 kg/s: the medium heats up and the tube
    # runs to the temperature limit (a real answer: stopped, not failed)
    from pathlib import Path

    demo = (Path(__file__).resolve().parents[1] / "cases" / "hydrogenation_cooled_packed_bed.toml").read_text()
    text = demo.replace('arrangement = "uniform"\ntemperature = "420 K"',
                        'arrangement = "counter-current"\ntemperature = "415 K"\nmass_flow = "2 kg/s"\n'
                        'cp = "2.2 kJ/(kg*K)"')
    case = load_case(write_case(text, name="hcc2.toml"))
    result = simulate(case)
    assert result.status == "stopped" and "temperature limit" in result.termination
    (state,) = result.extra["steady_states"]
    # the march from the state's medium outlet temperature (no temperature-limit stop) meets the far
    # boundary condition: the medium enters at z = L at the given 415 K
    from simulator.solve.counter_current import shooting_problem

    shooting = shooting_problem(case)
    assert abs(shooting.residual(state["medium_outlet_temperature_K"])) < 1e-3
    assert shooting.march(state["medium_outlet_temperature_K"]) is not None
