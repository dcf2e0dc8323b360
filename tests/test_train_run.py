"""Reactor trains run as one solve: simulator.solve.train, simulator.solve.interstage, the train output and CLI."""
import csv
import dataclasses
import json

import numpy as np
import pytest

from simulator.case.load import load_case, load_case_dict
from simulator.errors import CaseError
from simulator.solve.integrate import simulate
from simulator.solve.interstage import mixed_temperature, stream_enthalpy
from simulator.solve.train import bed_case, simulate_train, train_closure
from simulator.thermo.nasa7 import constant_cp_coefficients

DEMO = "train_three_bed_converter.toml"
BED = {"particle_diameter": "8 mm", "void_fraction": 0.45, "bulk_density": "500 kg/m^3"}


def _bed(length, after=None, heat=None):
    bed = {"tube": {"length": length, "inner_diameter": "0.5 m", "count": 1}, "bed": dict(BED),
           "heat": heat or {"mode": "adiabatic"}}
    if after is not None:
        bed["after"] = [after]
    return bed


def _shared():
    # invented kinetics (the demo's scheme); SO2, O2, N2, SO3 from Cantera's nasa_gas.yaml
    return {
        "title": "Train test",
        "thermo": {"species_file": "nasa_gas.yaml"},
        "reactions": [{"equation": "SO2 + 0.5 O2 <=> SO3", "pre_exponential": "6.0e5 mol/(kg*s*bar^1.5)",
                       "activation_energy": "92 kJ/mol", "orders": {"SO2": 1, "O2": 0.5},
                       "in_terms_of": "partial-pressure", "rate_basis": "catalyst-mass"}],
        "feed": {"temperature": "690 K", "pressure": "1.5 bar", "molar_flow": "2 mol/s",
                 "mole_fractions": {"SO2": 0.1, "O2": 0.11, "N2": 0.79}},
        "design": {"key_species": "SO2"},
    }


def _train(*beds):
    return load_case_dict({**_shared(), "train": list(beds)})


COOLED = {"mode": "exchange", "overall_coefficient": "60 W/(m^2*K)",
          "medium": {"arrangement": "uniform", "temperature": "690 K"}}


# ----------------------------------------------------------------------------- exact chaining
def test_two_bed_train_equals_the_second_bed_fed_by_the_first_beds_exact_outlet():
    # invariant: the train passes bed 1's outlet to bed 2 exactly (molar flows, T, P; no rounding)
    case = _train(_bed("0.3 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.4 m", heat=COOLED))
    train = simulate_train(case)
    assert train.status == "completed", train.termination
    first = simulate(case.train[0].case)
    F_out = first.F[-1]
    second = simulate(bed_case(case.train[1].case, F_out, 700.0, float(first.P[-1])))
    got = train.beds[1]
    assert got.T[0] == 700.0 and got.P[0] == first.P[-1]
    np.testing.assert_allclose(got.F, second.F, rtol=1e-9, atol=1e-12)
    np.testing.assert_allclose(got.T, second.T, rtol=1e-9)
    np.testing.assert_allclose(got.P, second.P, rtol=1e-9)
    np.testing.assert_allclose(got.Q, second.Q, rtol=1e-9, atol=1e-9)
    # and the inlet flows are those of bed 1's outlet to round-off (no renormalised mole fractions)
    np.testing.assert_allclose(got.F[0], F_out, rtol=1e-14, atol=0)


def test_a_train_of_one_bed_equals_the_plain_case():
    plain = {**_shared(), "tube": {"length": "0.3 m", "inner_diameter": "0.5 m", "count": 1}, "bed": dict(BED),
             "heat": {"mode": "adiabatic"}}
    single = simulate(load_case_dict(plain))
    train = simulate_train(_train(_bed("0.3 m")))
    assert train.status == "completed" and len(train.beds) == 1
    np.testing.assert_allclose(train.beds[0].F, single.F, rtol=1e-12, atol=1e-15)
    np.testing.assert_allclose(train.beds[0].T, single.T, rtol=1e-12)
    assert train.overall_conversion == pytest.approx(single.outlet_conversion, rel=1e-12)


# ----------------------------------------------------------------------------- closure over the train
@pytest.fixture(scope="module")
def quenched():
    """Three beds: cool-to, a quench by a share of the feed, a quench by an N2 stream; bed 2 wall-cooled."""
    case = _train(_bed("0.2 m", {"kind": "cool-to", "temperature": "705 K"}),
                  _bed("0.3 m", {"kind": "quench", "share": 0.25, "temperature": "600 K"}, heat=COOLED),
                  _bed("0.3 m", {"kind": "quench", "stream": {"temperature": "450 K", "molar_flow": "0.4 mol/s",
                                                              "mole_fractions": {"N2": 0.9, "O2": 0.1}}}),
                  _bed("0.4 m"))
    return case, simulate_train(case)


def test_element_and_energy_closure_over_the_train(quenched):
    # invariant: everything fed (bed 1 feed + quenches) leaves; H_out - H_in = bed duties + interstage duties
    case, train = quenched
    assert train.status == "completed", train.termination
    assert train.closure["elements_relative"] < 1e-12
    assert train.closure["energy_relative"] < 1e-7
    assert train.beds[1].Q[-1] < 0          # the wall-cooled bed gives off heat: its duty is in the balance
    # the fed total is the whole written feed (2 mol/s, its bed 1 part reduced by the share) plus the stream
    np.testing.assert_allclose(train.fresh_flows.sum(), 2.0 + 0.4, rtol=1e-14)
    fed_SO2 = 0.2
    assert train.overall_conversion == pytest.approx((fed_SO2 - train.beds[-1].F[-1, 0]) / fed_SO2, rel=1e-12)


def test_the_train_closure_sees_a_missing_duty(quenched):
    # the closure can fail: drop the cool-to duty from the balance and it opens by that duty
    case, train = quenched
    from simulator.model.build import build_model

    model = build_model(case.train[0].case)
    inputs = [(train.beds[0].F[0], train.beds[0].T[0], train.beds[0].P[0])]
    inputs += [(s.added_flows, s.added_temperature, s.pressure) for s in train.interstages if s.kind == "quench"]
    steps = [dataclasses.replace(train.interstages[0], duty=0.0)] + list(train.interstages[1:])
    assert train_closure(model, inputs, list(train.beds), list(train.interstages))["energy_relative"] < 1e-7
    assert train_closure(model, inputs, list(train.beds), steps)["energy_relative"] > 1e-2


def test_cool_to_duty_is_the_enthalpy_change_of_the_bed_outlet(quenched):
    # invariant: duty = H(F, 705 K) - H(F, T_out), ideal gas, from Cantera's species thermo (independent rows)
    import cantera as ct

    case, train = quenched
    step, bed = train.interstages[0], train.beds[0]
    gas = ct.Solution(thermo="ideal-gas", species=[s for s in ct.Species.list_from_file("nasa_gas.yaml")
                                                   if s.name in train.species])
    order = [gas.species_index(s) for s in train.species]

    def H(T):
        gas.TP = T, 1e5
        return float(np.dot(bed.F[-1], gas.partial_molar_enthalpies[order])) / 1000.0

    assert step.duty < 0
    assert step.duty == pytest.approx(H(705.0) - H(float(bed.T[-1])), rel=1e-9)


# ----------------------------------------------------------------------------- quench mixing
@pytest.mark.published("cantera", "mixture enthalpy: Quantity mixing at constant H and P")
def test_quench_mixed_temperature_against_cantera_mixing(quenched):
    # Source: Cantera (Goodwin et al.), mixture enthalpy: two Quantity objects mixed at constant
    # enthalpy and pressure give the adiabatic mixing temperature from Cantera's own species thermo
    import cantera as ct

    case, train = quenched
    for step in train.interstages[1:]:
        bed = train.beds[step.after_bed - 1]
        gas = ct.Solution(thermo="ideal-gas", species=[s for s in ct.Species.list_from_file("nasa_gas.yaml")
                                                       if s.name in train.species])
        order = [gas.species_index(s) for s in train.species]

        def quantity(F, T):
            X = np.zeros(gas.n_species)
            X[order] = F / F.sum()
            gas.TPX = T, step.pressure, X
            return ct.Quantity(gas, moles=F.sum() / 1000.0, constant="HP")

        mixed = quantity(bed.F[-1], float(bed.T[-1])) + quantity(step.added_flows, step.added_temperature)
        assert step.outlet_temperature == pytest.approx(mixed.T, abs=1e-6)
        assert step.duty == 0.0
        np.testing.assert_allclose(step.flows, bed.F[-1] + step.added_flows, rtol=1e-15)
    assert train.beds[2].T[0] == train.interstages[1].outlet_temperature


def test_mixed_temperature_by_hand_for_constant_heat_capacities():
    # analytic: with constant cp the enthalpy balance gives T_mix = 298.15 + sum F cp (T - 298.15) / sum F cp
    # (formation enthalpies cancel: every species' flow is conserved by mixing)
    rows = np.array([constant_cp_coefficients(29.1, 0.0), constant_cp_coefficients(37.1, -393.5e3)])
    Fa, Ta, Fb, Tb = np.array([3.0, 1.0]), 850.0, np.array([0.5, 2.0]), 320.0
    by_hand = 298.15 + (np.dot(Fa, [29.1, 37.1]) * (Ta - 298.15) + np.dot(Fb, [29.1, 37.1]) * (Tb - 298.15)) \
        / np.dot(Fa + Fb, [29.1, 37.1])
    T = mixed_temperature(rows, Fa, Ta, Fb, Tb)
    assert T == pytest.approx(by_hand, rel=1e-12)
    assert stream_enthalpy(rows, Fa + Fb, T) == pytest.approx(stream_enthalpy(rows, Fa, Ta)
                                                              + stream_enthalpy(rows, Fb, Tb), rel=1e-12)


# ----------------------------------------------------------------------------- failures and stops
def _with_bed(case, k, **solver):
    beds = list(case.train)
    bed = beds[k].case
    beds[k] = dataclasses.replace(beds[k], case=dataclasses.replace(bed, solver=dataclasses.replace(bed.solver,
                                                                                                    **solver)))
    return dataclasses.replace(case, train=tuple(beds))


def test_a_failed_bed_fails_the_train_and_says_which_where_and_why(tmp_path):
    from simulator.train_output import train_summary, write_train_run

    case = _train(_bed("0.2 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.3 m", {"kind": "cool-to",
                                                                                            "temperature": "700 K"}),
                  _bed("0.3 m"))
    # a max_step the step budget cannot fit in bed 2 (the loader refuses it in a case file): bed 2 is not integrated
    train = simulate_train(_with_bed(case, 1, max_step=1e-7))
    assert train.status == "failed"
    assert train.termination.startswith("bed 2 of 3 failed: solver failed after z = 0 m")
    assert "solver.max_step" in train.termination and "bed 3 not run" in train.termination
    assert len(train.beds) == 2 and train.beds[0].status == "completed"
    s = train_summary(train)
    assert s["status"] == "failed" and s["train"]["overall_conversion"] is None
    assert s["train"]["closure"] == {"elements_relative": None, "energy_relative": None}
    assert s["train"]["outlet"] is None and s["train"]["beds"][1]["outlet"]["conversion"] is None
    assert s["outlet"]["bed"] == 2 and s["outlet"]["temperature_K"] is None and s["closure"]["energy_relative"] is None
    (tmp_path / "profile.csv").write_text("stale")
    paths = write_train_run(train, tmp_path)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["profile_until_failure.csv", "summary.json"]
    assert len(paths) == 2


def test_a_bed_stopped_by_the_temperature_limit_stops_the_train():
    raw = {**_shared(), "design": {"key_species": "SO2", "temperature_limit": "800 K"},
           "train": [_bed("0.3 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.3 m")]}
    train = simulate_train(load_case_dict(raw))
    assert train.status == "stopped" and train.termination.startswith("bed 1 of 2 stopped: temperature limit")
    assert len(train.beds) == 1 and np.isnan(train.overall_conversion)


# ----------------------------------------------------------------------------- CLI and files
def test_cli_run_on_the_demo_writes_the_train_files(cases_dir, tmp_path, capsys):
    from simulator.cli import main

    out = tmp_path / "out"
    assert main(["run", str(cases_dir / DEMO), "--out", str(out)]) == 0
    printed = capsys.readouterr().out
    assert printed.count("\nbed ") == 3 and "overall             X(SO2) = " in printed
    s = json.loads((out / "summary.json").read_text())
    t = s["train"]
    assert s["status"] == "completed" and len(t["beds"]) == 3 and len(t["interstage"]) == 2
    single_keys = set(simulate(load_case(cases_dir / DEMO).train[0].case).summary())
    for k, bed in enumerate(t["beds"], start=1):
        assert bed["bed"] == k and single_keys <= set(bed)
        assert bed["outlet"]["conversion"] > 0 and bed["hot_spot"]["temperature_K"] > 690
    assert [b["inlet"]["temperature_K"] for b in t["beds"]] == [690.0, 700.0, 700.0]
    assert all(st["kind"] == "cool-to" and st["duty_W"] < 0 for st in t["interstage"])
    assert 0.9 < t["overall_conversion"] < 1.0 and t["overall_conversion"] == t["beds"][-1]["conversion_on_fed"]
    assert t["closure"]["elements_relative"] < 1e-12 and t["closure"]["energy_relative"] < 1e-6
    assert t["interstage_duty_W"] == pytest.approx(sum(st["duty_W"] for st in t["interstage"]), rel=1e-12)
    # the top level reads like a single tube's summary: the train's outlet and its closure
    assert s["outlet"] == t["outlet"] and s["closure"] == t["closure"]
    assert s["outlet"]["conversion"] == t["overall_conversion"] and s["outlet"]["position_m"] == pytest.approx(1.9)
    assert sum(s["outlet"]["mole_fractions"].values()) == pytest.approx(1.0, abs=1e-12)
    with open(out / "profile.csv") as f:
        rows = list(csv.DictReader(f))
    assert {r["bed"] for r in rows} == {"1", "2", "3"}
    z = [float(r["position_m"]) for r in rows]
    assert z[0] == 0.0 and z[-1] == pytest.approx(0.3 + 0.6 + 1.0, rel=1e-12) and all(np.diff(z) >= 0)
    assert float(rows[-1]["train_conversion_SO2"]) == pytest.approx(t["overall_conversion"], rel=1e-12)
    assert (out / "train_path.svg").read_text().lstrip().startswith("<?xml")


def test_validate_says_the_train_runs_and_other_verbs_refuse_in_one_line(cases_dir, tmp_path, capsys):
    from simulator.cli import main

    assert main(["validate", str(cases_dir / DEMO)]) == 0
    out = capsys.readouterr().out
    assert "`run` and `report` run the train, `assumptions` and `screen` check it bed by bed, `size --bed K`" in out
    assert "`sweep` and `uncertainty` run the whole train per case" in out
    assert "not screened: train[1] (adiabatic), train[2] (adiabatic), train[3] (adiabatic)" in out
    assert main(["size", str(cases_dir / DEMO), "--out", str(tmp_path / "size")]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "give --bed K (1 to 3)" in err[0]


# ----------------------------------------------------------------------------- assumptions and screening per bed
def test_assumptions_check_every_bed_at_its_exact_inlet(tmp_path, capsys):
    from simulator.cli import main
    from simulator.train_checks import train_assumptions

    case = _train(_bed("0.3 m", {"kind": "cool-to", "temperature": "700 K"}, heat=COOLED), _bed("0.4 m", heat=COOLED))
    train = simulate_train(case)
    report = train_assumptions(case)
    beds = report["train"]["beds"]
    assert [b["bed"] for b in beds] == [1, 2]
    for bed, result in zip(beds, train.beds):
        # the full model of each bed's check is that bed of the train run (same inlet, same tube)
        assert bed["full_summary"]["outlet"]["temperature_K"] == pytest.approx(float(result.T[-1]), rel=1e-9)
        assert bed["full_summary"]["outlet"]["conversion"] == pytest.approx(result.outlet_conversion, rel=1e-9)
        assert bed["assumptions"]["isothermal"]["verdict"] in ("holds", "fails")
    path = tmp_path / "train.toml"
    path.write_text(TWO_COOLED_BEDS)
    assert main(["assumptions", str(path), "--out", str(tmp_path / "a")]) == 0
    assert capsys.readouterr().out.count("\nbed ") == 1       # "bed 1" opens the output, "bed 2" on a new line
    saved = json.loads((tmp_path / "a" / "assumptions.json").read_text())
    assert len(saved["train"]["beds"]) == 2 and "train's target" not in saved["train"]["note"]


def test_screen_screens_every_bed_and_the_train_level_is_the_worst(cases_dir, tmp_path, capsys):
    # the demo's beds are adiabatic: each bed is judged "not screened" with the reason, at the level the
    # single-tube rule gives (exothermic and uncooled: review); the train's level is the worst of them
    from simulator.cli import main
    from simulator.verdicts import worst

    assert main(["screen", str(cases_dir / DEMO), "--out", str(tmp_path)]) == 0
    printed = capsys.readouterr().out
    s = json.loads((tmp_path / "screening.json").read_text())
    beds = s["train"]["beds"]
    assert [b["bed"] for b in beds] == [1, 2, 3] and all(not b["applicable"] for b in beds)
    assert s["train"]["risk_level"] == worst([b["risk_level"] for b in beds]) == "review"
    assert f"train: risk level {s['train']['risk_level']}" in printed
    train = simulate_train(load_case(cases_dir / DEMO))
    for b, result in zip(beds, train.beds):      # screened at the bed's inlet from the train run
        assert b["hot_spot"]["temperature_K"] == pytest.approx(result.hot_spot["temperature_K"], rel=1e-9)
    assert (tmp_path / "sensitivity.csv").read_text().startswith("bed,parameter,")


TWO_COOLED_BEDS = """
title = "Two cooled beds"
[thermo]
species_file = "nasa_gas.yaml"
[[reactions]]
equation = "SO2 + 0.5 O2 <=> SO3"
pre_exponential = "6.0e5 mol/(kg*s*bar^1.5)"
activation_energy = "92 kJ/mol"
orders = { SO2 = 1, O2 = 0.5 }
in_terms_of = "partial-pressure"
rate_basis = "catalyst-mass"
[feed]
temperature = "690 K"
pressure = "1.5 bar"
molar_flow = "2 mol/s"
mole_fractions = { SO2 = 0.1, O2 = 0.11, N2 = 0.79 }
[design]
key_species = "SO2"
[[train]]
tube = { length = "0.3 m", inner_diameter = "0.5 m" }
bed = { particle_diameter = "8 mm", void_fraction = 0.45, bulk_density = "500 kg/m^3" }
heat = { mode = "exchange", overall_coefficient = "60 W/(m^2*K)", medium = { arrangement = "uniform", temperature = "690 K" } }
[[train.after]]
kind = "cool-to"
temperature = "700 K"
[[train]]
tube = { length = "0.4 m", inner_diameter = "0.5 m" }
bed = { particle_diameter = "8 mm", void_fraction = 0.45, bulk_density = "500 kg/m^3" }
heat = { mode = "exchange", overall_coefficient = "60 W/(m^2*K)", medium = { arrangement = "uniform", temperature = "690 K" } }
"""


# ----------------------------------------------------------------------------- diagram
def test_train_path_reaches_the_equilibrium_curve_in_the_first_bed(cases_dir):
    # invariant: the adiabatic first bed of the demo is long enough to come to equilibrium, so its outlet
    # lies on the curve; every bed's path stays at or below it (a reversible exothermic reaction)
    from simulator.report.train_plots import train_path_data, train_path_svg

    train = simulate_train(load_case(cases_dir / DEMO))
    data = train_path_data(train)
    T_eq, X_eq = data["equilibrium"]
    for T, X in data["beds"]:
        assert np.all(X <= np.interp(T, T_eq, X_eq) + 1e-6)
    T1, X1 = data["beds"][0]
    assert X1[-1] == pytest.approx(np.interp(T1[-1], T_eq, X_eq), abs=2e-3)
    assert [round(a[0], 6) for a, _ in data["steps"]] == [round(float(b.T[-1]), 6) for b in train.beds[:2]]
    assert "equilibrium" in train_path_svg(train)


# ----------------------------------------------------------------------------- sizing one bed
def _two_adiabatic_beds(target):
    raw = {**_shared(), "design": {"key_species": "SO2", "target_conversion": target},
           "train": [_bed("0.3 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.2 m")]}
    return load_case_dict(raw)


def test_size_gives_the_bed_length_at_which_the_train_meets_its_target():
    # invariant: the answer is the crossing: the train at that length meets the target, a little shorter it does not
    from simulator.train_sizing import _with_length, size_train_bed

    case = _two_adiabatic_beds(0.93)
    given = simulate_train(case).overall_conversion
    report = size_train_bed(case, 2)["train"]
    assert report["feasible"] and report["binding_constraint"] == "target_conversion"
    assert report["overall_conversion_at_given"] == pytest.approx(given, rel=1e-12) and given < 0.93
    L = report["length_m"]
    assert L > 0.2 and report["bed_lengths_m"] == pytest.approx([0.3, L], rel=1e-12)
    assert simulate_train(_with_length(case, 2, L)).overall_conversion == pytest.approx(0.93, abs=1e-7)
    assert simulate_train(_with_length(case, 2, 0.98 * L)).overall_conversion < 0.93


def test_size_says_when_one_beds_length_cannot_reach_the_target(tmp_path, capsys):
    # beyond what bed 2 can give at its 700 K inlet (equilibrium near 0.98 there): no length, said plainly
    from simulator.train_sizing import size_train_bed

    report = size_train_bed(_two_adiabatic_beds(0.995), 2)["train"]
    assert not report["feasible"] and report["length_m"] is None
    assert report["note"].startswith("not reachable by the length of bed 2 alone")
    with pytest.raises(CaseError, match=r"--bed 3: the train has 2 beds"):
        size_train_bed(_two_adiabatic_beds(0.9), 3)


def test_size_with_bed_on_a_single_tube_is_refused_in_one_line(cases_dir, tmp_path, capsys):
    from simulator.cli import main

    assert main(["size", str(cases_dir / "hydrogenation_cooled_packed_bed.toml"), "--bed", "1",
                 "--out", str(tmp_path)]) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "--bed 1: the case is one tube, not a reactor train" in err[0]


def test_a_cool_to_step_that_heats_is_flagged():
    train = simulate_train(_train(_bed("0.05 m", {"kind": "cool-to", "temperature": "760 K"}), _bed("0.05 m")))
    assert train.status == "completed" and train.interstages[0].duty > 0
    assert any(w.startswith("after bed 1: cool-to 760 K heats the gas") for w in train.warnings)


# ----------------------------------------------------------------------------- report
def test_report_on_the_demo_states_the_train_results(cases_dir, tmp_path, capsys):
    import html as html_lib
    import re

    from simulator.cli import main

    assert main(["report", str(cases_dir / DEMO), "--out", str(tmp_path), "--no-pdf"]) == 0
    assert sorted(p.name for p in tmp_path.iterdir()) == ["report.html"]
    document = (tmp_path / "report.html").read_text()
    body = re.sub(r"<style>.*?</style>", " ", document, flags=re.S)
    text = re.sub(r"\s+", " ", html_lib.unescape(re.sub(r"<[^>]+>", " ", re.sub(r'src="data:[^"]*"', "", body))))
    train = simulate_train(load_case(cases_dir / DEMO))
    assert f"Overall conversion of SO2 (on everything fed) {train.overall_conversion:.4f}" in text
    assert "0.975: reached at the train outlet" in text
    for k in (0, 1):      # one row per interstage step: after bed, kind, from T, to T
        assert f"{k + 1} cool-to {train.beds[k].T[-1]:.2f} 700.00" in text
    assert "train[2].tube.length 0.6 m 0.6 m" in text
    assert "Equilibrium of SO2 + 0.5 O2 <=> SO3" in text and document.count("data:image/svg+xml;base64,") == 2
    assert "licensed" in text and "tubesim screen CASE --out DIR" in text


def test_report_of_a_failed_train_is_refused(tmp_path):
    from simulator.errors import IntegrationError
    from simulator.report.train_report import write_train_report

    case = _with_bed(_train(_bed("0.2 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.3 m")), 1,
                     max_step=1e-7)
    with pytest.raises(IntegrationError, match=r"bed 2 of 2 failed"):
        write_train_report(case, tmp_path, pdf=False)
    assert list(tmp_path.iterdir()) == []
