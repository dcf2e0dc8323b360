"""Reactor trains: the [[train]] case keys (simulator.case.train)."""
import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.solve.integrate import simulate


def _bed(length, after=None):
    bed = {"tube": {"length": length, "inner_diameter": "0.5 m", "count": 1},
           "bed": {"particle_diameter": "8 mm", "void_fraction": 0.45, "bulk_density": "500 kg/m^3"},
           "heat": {"mode": "adiabatic"}}
    if after is not None:
        bed["after"] = [after]
    return bed


def _train(*beds):
    return {
        "title": "Two adiabatic beds",
        "thermo": {"species_file": "nasa_gas.yaml"},
        "reactions": [{"equation": "SO2 + 0.5 O2 <=> SO3", "pre_exponential": "1.0e5 mol/(kg*s*bar^1.5)",
                       "activation_energy": "90 kJ/mol", "orders": {"SO2": 1, "O2": 0.5},
                       "in_terms_of": "partial-pressure", "rate_basis": "catalyst-mass"}],
        "feed": {"temperature": "700 K", "pressure": "1.2 bar", "molar_flow": "100 mol/s",
                 "mole_fractions": {"SO2": 0.1, "O2": 0.11, "N2": 0.79}},
        "design": {"key_species": "SO2"},
        "train": list(beds),
    }


def test_train_beds_keep_their_own_tube_and_share_the_rest():
    case = load_case_dict(_train(_bed("0.5 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.8 m")))
    assert [b.case.tube.length for b in case.train] == [0.5, 0.8]
    assert case.train[0].after.kind == "cool-to" and case.train[0].after.temperature == 700.0
    assert case.train[1].after is None
    assert case.train[1].case.reactions == case.reactions


def test_quench_share_takes_the_bypass_from_bed_1_feed():
    case = load_case_dict(_train(_bed("0.5 m", {"kind": "quench", "share": 0.25}), _bed("0.8 m")))
    assert case.train[0].case.feed.flow_value == pytest.approx(75.0, rel=1e-15)
    assert case.train[1].case.feed.flow_value == 100.0      # the fresh feed as written, for the quench


def test_bed_problems_name_the_bed_path():
    with pytest.raises(CaseError, match=r"train\[2\]\.tube\.length"):
        load_case_dict(_train(_bed("0.5 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("-1 m")))


def test_interstage_problems_name_their_path():
    with pytest.raises(CaseError, match=r"train\[1\]\.after\.kind = 'chill'"):
        load_case_dict(_train(_bed("0.5 m", {"kind": "chill"}), _bed("0.8 m")))
    with pytest.raises(CaseError, match=r"train\[2\]\.after: the last bed"):
        load_case_dict(_train(_bed("0.5 m"), _bed("0.8 m", {"kind": "cool-to", "temperature": "700 K"})))
    with pytest.raises(CaseError, match=r"train\[1\]\.after\.temperature: missing"):
        load_case_dict(_train(_bed("0.5 m", {"kind": "heat-to"}), _bed("0.8 m")))


def test_top_level_tube_is_refused_in_a_train_case():
    raw = _train(_bed("0.5 m"), _bed("0.8 m"))
    raw["tube"] = {"length": "1 m", "inner_diameter": "0.5 m"}
    with pytest.raises(CaseError, match=r"tube: a train case gives \[tube\] inside each"):
        load_case_dict(raw)


def test_no_verb_runs_a_train_as_its_first_bed_alone():
    case = load_case_dict(_train(_bed("0.5 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.8 m")))
    with pytest.raises(CaseError, match=r"train: a reactor train"):
        simulate(case)



TRAIN_TOML = """
title = "Two beds"
[thermo]
species_file = "nasa_gas.yaml"
[[reactions]]
equation = "SO2 + 0.5 O2 <=> SO3"
pre_exponential = "1.0e5 mol/(kg*s*bar^1.5)"
activation_energy = "90 kJ/mol"
orders = { SO2 = 1, O2 = 0.5 }
in_terms_of = "partial-pressure"
rate_basis = "catalyst-mass"
[feed]
temperature = "700 K"
pressure = "1.2 bar"
molar_flow = "100 mol/s"
mole_fractions = { SO2 = 0.1, O2 = 0.11, N2 = 0.79 }
[design]
key_species = "SO2"
[[train]]
tube = { length = "0.5 m", inner_diameter = "0.5 m" }
bed = { particle_diameter = "8 mm", void_fraction = 0.45, bulk_density = "500 kg/m^3" }
heat = { mode = "adiabatic" }
[[train.after]]
kind = "cool-to"
temperature = "700 K"
[[train]]
tube = { length = "0.8 m", inner_diameter = "0.5 m" }
bed = { particle_diameter = "8 mm", void_fraction = 0.45, bulk_density = "500 kg/m^3" }
heat = { mode = "adiabatic" }
"""


def test_cli_sweeps_a_train(tmp_path, capsys):
    # sweeps run the whole train per case (tests/test_train_sweep.py checks the rows)
    from simulator.cli import main

    path = tmp_path / "train.toml"
    path.write_text(TRAIN_TOML)
    assert main(["sweep", str(path), "--vary", "feed.temperature=690 K..700 K in 2", "--out", str(tmp_path / "out")]) == 0


def test_inlet_flows_enter_the_tube_exactly():
    # invariant: a bed fed by an upstream outlet gets those flows bit for bit (no renormalisation)
    import dataclasses

    from simulator.model.build import build_model

    case = load_case_dict(_train(_bed("0.5 m", {"kind": "cool-to", "temperature": "700 K"}), _bed("0.8 m")))
    bed2 = case.train[1].case
    flows = (0.1 * 100.0 / 3.0, 0.11 * 100.0, 0.79 * 100.0, 7.0 / 3.0)      # SO2, O2, N2, SO3 (whole reactor)
    feed = dataclasses.replace(bed2.feed, inlet_flows=flows, flow_value=sum(flows))
    model = build_model(dataclasses.replace(bed2, feed=feed))
    assert bed2.species == ("SO2", "O2", "N2", "SO3")
    assert tuple(model.y0[:4] * model.count) == flows
