"""Detailed gas-phase mechanisms in a tube (simulator.mechanism, [mechanism] keys).

Checks against the outside world name their source beside them. The oracle is Cantera's
own ``IdealGasConstPressureReactor`` (D.G. Goodwin et al., Cantera 3.2, tests/sources.toml
key ``cantera``) marched in time on the same species and reactions, time mapped to position
with the local velocity (dz = u dt, u = G / rho).
"""
import json
import math
import re

import numpy as np
import pytest

from simulator.case.load import load_case, load_case_dict
from simulator.errors import CaseError
from simulator.solve.integrate import simulate

H2O2_SPECIES = ["H2", "O2", "H2O", "H", "O", "OH", "HO2", "H2O2", "N2", "AR"]
FEED_X = {"H2": 0.15, "O2": 0.18, "N2": 0.67}
MASS_FLOW = 1e-3            # [kg/s]
DIAMETER = 0.008            # [m]
LENGTH = 0.1                # [m]


def tube_case(**changes):
    """An H2/air tube with a gri30 subset; ``changes`` replace top-level tables."""
    raw = {"title": "H2/air tube", "mechanism": {"file": "gri30.yaml", "species": list(H2O2_SPECIES)},
           "feed": {"temperature": "1000 K", "pressure": "1 atm", "mass_flow": f"{MASS_FLOW * 1000} g/s",
                    "mole_fractions": dict(FEED_X)},
           "tube": {"length": f"{LENGTH} m", "inner_diameter": f"{DIAMETER * 1000} mm"},
           "heat": {"mode": "adiabatic"}, "design": {"key_species": "H2"},
           "solver": {"rtol": 1e-9, "atol_scale": 1e-14}}
    raw.update(changes)
    return raw


def _oracle_solution():
    import cantera as ct

    full = ct.Solution("gri30.yaml")
    keep = set(H2O2_SPECIES)
    reactions = [r for r in full.reactions() if (set(r.reactants) | set(r.products)) <= keep and not (
        r.third_body is not None and r.third_body.default_efficiency == 0 and not set(r.third_body.efficiencies) <= keep)]
    return ct.Solution(thermo="ideal-gas", kinetics="gas", species=[full.species(s) for s in H2O2_SPECIES],
                       reactions=reactions)


def cantera_reactor_along_tube():
    """Cantera's constant-pressure reactor marched in time; z accumulated with dz = u dt (trapezoid on its
    own fine steps). Returns z [m], T [K], X (by species name) and dT/dz [K/m] along it."""
    import cantera as ct

    gas = _oracle_solution()
    gas.TPX = 1000.0, ct.one_atm, FEED_X
    G = MASS_FLOW / (math.pi * DIAMETER ** 2 / 4)
    reactor = ct.IdealGasConstPressureReactor(gas, clone=False)
    net = ct.ReactorNet([reactor])
    net.rtol, net.atol = 1e-10, 1e-20

    def slope():   # dT/dt of the constant-pressure reactor, divided by u: dT/dz
        return -float(gas.partial_molar_enthalpies @ gas.net_production_rates) / (gas.density * gas.cp_mass) \
            / (G / gas.density)

    z, t = [0.0], [0.0]
    T, X, rho, dTdz = [gas.T], [gas.X.copy()], [gas.density], [slope()]
    while z[-1] < 1.2 * LENGTH:
        net.step()
        t.append(net.time)
        T.append(gas.T)
        X.append(gas.X.copy())
        rho.append(gas.density)
        dTdz.append(slope())
        z.append(z[-1] + (t[-1] - t[-2]) * 0.5 * (G / rho[-1] + G / rho[-2]))
    X = np.array(X)
    return np.array(z), np.array(T), {s: X[:, k] for k, s in enumerate(gas.species_names)}, np.array(dTdz)


@pytest.fixture(scope="module")
def adiabatic_run():
    return simulate(load_case_dict(tube_case()))


@pytest.fixture(scope="module")
def oracle():
    return cantera_reactor_along_tube()


@pytest.mark.published("cantera", "IdealGasConstPressureReactor marched in time, the same species and reactions")
def test_adiabatic_isobaric_tube_outlet_equals_cantera_reactor_marched_in_time(adiabatic_run, oracle):
    # Source: Cantera 3.2 (Goodwin et al., tests/sources.toml key "cantera"), its constant-pressure reactor
    # marched in time on the gri30 subset; position from dz = u dt. Both at rtol <= 1e-9: outlet T to 1e-3 K;
    # mole fractions to 1e-4 relative (1e-9 absolute for traces): the radicals still relax towards equilibrium
    # at the outlet, and the reactor's z, a trapezoid sum over its own steps, carries an error of that order.
    z, T, X, _ = oracle
    r = adiabatic_run
    assert r.status == "completed"
    assert r.T[-1] == pytest.approx(float(np.interp(LENGTH, z, T)), abs=1e-3)
    x_out = dict(zip(r.species, r.mole_fractions[-1]))
    for s in H2O2_SPECIES:
        assert x_out[s] == pytest.approx(float(np.interp(LENGTH, z, X[s])), rel=1e-4, abs=1e-9), s


@pytest.mark.published("cantera", "IdealGasConstPressureReactor marched in time: largest dT/dz")
def test_ignition_position_within_one_percent_of_cantera_reactor(adiabatic_run, oracle):
    # Source: as above; ignition = the largest dT/dz = (dT/dt)/u on the reactor's own steps.
    z, T, _, dTdz = oracle
    ignition = adiabatic_run.summary()["ignition"]
    z_ref = float(z[int(np.argmax(dTdz))])
    assert 0.1 * LENGTH < z_ref < 0.9 * LENGTH          # the case ignites well inside the tube
    assert ignition["position_m"] == pytest.approx(z_ref, rel=0.01)
    assert ignition["temperature_K"] == pytest.approx(float(np.interp(z_ref, z, T)), rel=0.01)
    assert ignition["residence_time_s"] > 0


def test_adiabatic_run_closes_elements_and_energy(adiabatic_run):
    # invariant: element and energy closure from Cantera's species enthalpies
    assert adiabatic_run.closure["elements_relative"] < 1e-10
    assert adiabatic_run.closure["energy_relative"] < 1e-6


def test_summary_lists_every_species_and_profile_only_those_present(adiabatic_run, tmp_path):
    from simulator.output import write_run

    write_run(adiabatic_run, tmp_path)
    summary = json.loads((tmp_path / "summary.json").read_text())
    assert set(summary["outlet"]["mole_fractions"]) == set(H2O2_SPECIES)
    assert summary["mechanism"]["reactions"] + summary["mechanism"]["reactions_dropped"] == 325
    header = (tmp_path / "profile.csv").read_text().splitlines()[0].split(",")
    assert "mole_fraction_OH" in header
    assert "mole_fraction_AR" not in header        # absent everywhere: left out of profile.csv
    assert summary["profile_species"]["species"] == [c[len("mole_fraction_"):] for c in header
                                                     if c.startswith("mole_fraction_")]


def test_nothing_ignites_in_a_cold_tube():
    r = simulate(load_case_dict(tube_case(feed={"temperature": "700 K", "pressure": "1 atm",
                                                "mass_flow": "1 g/s", "mole_fractions": dict(FEED_X)})))
    assert r.status == "completed"
    assert r.summary()["ignition"] is None


def cooled(U, pressure_drop=None):
    return tube_case(heat={"mode": "exchange", "overall_coefficient": f"{U} W/(m^2*K)",
                           "medium": {"arrangement": "uniform", "temperature": "1000 K"}},
                     pressure_drop=pressure_drop or {"model": "pipe-friction"},
                     solver={"rtol": 1e-8, "atol_scale": 1e-11})


def test_cooled_tube_with_friction_closes_and_loses_pressure():
    r = simulate(load_case_dict(cooled(300.0)))
    assert r.status == "completed"
    assert r.closure["elements_relative"] < 1e-10 and r.closure["energy_relative"] < 1e-6
    assert np.all(np.diff(r.P) <= 0) and r.P[-1] < r.P[0]
    assert r.Q[-1] < 0                                 # the flame heat goes to the medium
    assert r.T[-1] < r.T.max() - 100                   # and the gas is cooled after ignition


def test_vanishing_coefficient_equals_the_adiabatic_tube():
    # limit: U -> 0 is the adiabatic tube (same friction in both)
    friction = {"model": "pipe-friction", "viscosity": "4e-5 Pa*s"}
    weak = simulate(load_case_dict(cooled(1e-6, friction)))
    adiabatic = simulate(load_case_dict(tube_case(pressure_drop=friction, solver={"rtol": 1e-8,
                                                                                   "atol_scale": 1e-11})))
    assert weak.T[-1] == pytest.approx(adiabatic.T[-1], abs=1e-2)
    assert weak.P[-1] == pytest.approx(adiabatic.P[-1], rel=1e-8)


def test_isothermal_tube_holds_temperature_and_closes_energy_with_its_duty():
    r = simulate(load_case_dict(tube_case(heat={"mode": "isothermal"},
                                          feed={"temperature": "1100 K", "pressure": "1 atm", "mass_flow": "1 g/s",
                                                "mole_fractions": dict(FEED_X)})))
    assert r.status == "completed"
    assert np.allclose(r.T, 1100.0)
    assert r.outlet_conversion > 0.5
    assert r.closure["energy_relative"] < 1e-6
    assert r.summary()["ignition"] is None


def test_temperature_limit_stops_the_run_there():
    raw = tube_case(design={"key_species": "H2", "temperature_limit": "1500 K"})
    r = simulate(load_case_dict(raw))
    assert r.status == "stopped"
    assert r.T[-1] == pytest.approx(1500.0, abs=1e-3)
    assert "temperature_limit" in r.events


def test_demo_case_runs(cases_dir):
    r = simulate(load_case(cases_dir / "mechanism_h2_air_tube.toml"))
    assert r.status == "completed"
    assert r.summary()["ignition"] is not None


# ---------------------------------------------------------------- bad input: one line naming the field

@pytest.mark.parametrize("change, match", [
    ({"mechanism": {"file": "no_such_mech.yaml"}}, r"mechanism\.file = 'no_such_mech\.yaml': not found"),
    ({"mechanism": {"file": "gri30.yaml", "phase": "gri31"}}, r"mechanism\.phase = 'gri31': not a phase.*gri30"),
    ({"mechanism": {"file": "gri30.yaml", "species": ["H2", "O2", "N2", "OHH"]}},
     r"mechanism\.species: unknown species 'OHH'"),
    ({"mechanism": {"file": "ptcombust.yaml", "phase": "Pt_surf"}}, r"surface phase.*not supported yet"),
    ({"mechanism": {"file": "gri30.yaml", "species": ["H2", "O2", "H2O"]}},
     r"feed\.mole_fractions\.N2: feed species 'N2' is not in mechanism"),
    ({"reactions": [{"equation": "H2 + O2 => H2O2", "pre_exponential": "1 m^3/(mol*s)",
                     "activation_energy": "0 J/mol"}]}, r"reactions: \[\[reactions\]\] together with \[mechanism\].*planned"),
    ({"thermo": {"species_file": "gri30.yaml"}}, r"thermo: with \[mechanism\]"),
    ({"design": {"key_species": "CH4"}}, r"design\.key_species = 'CH4': not a species"),
    ({"heat": {"mode": "exchange", "overall_coefficient": "10 W/(m^2*K)",
               "medium": {"arrangement": "counter-current", "temperature": "900 K", "mass_flow": "1 kg/s",
                          "cp": "1 kJ/(kg*K)"}}}, r"heat\.medium\.arrangement = 'counter-current': not yet"),
])
def test_bad_mechanism_input_is_refused_naming_the_field(change, match):
    with pytest.raises(CaseError, match=match):
        load_case_dict(tube_case(**change))


def test_species_subset_reports_dropped_reactions():
    case = load_case_dict(tube_case())
    assert case.mechanism.reactions_kept == 29
    assert "296 reactions dropped" in case.mechanism.describe()


@pytest.mark.parametrize("verb", ["assumptions", "size", "screen", "report"])
def test_other_verbs_refuse_a_mechanism_case_in_one_line(verb, cases_dir, tmp_path, capsys):
    from simulator.cli import main

    code = main([verb, str(cases_dir / "mechanism_h2_air_tube.toml"), "--out", str(tmp_path)])
    err = capsys.readouterr().err
    assert code == 2
    assert f"{verb} is not yet for mechanism cases" in err and len(err.strip().splitlines()) == 1


@pytest.mark.published("cantera", "equilibrate('HP') on the same species")
def test_long_adiabatic_tube_reaches_cantera_equilibrium():
    # Source: Cantera 3.2 (tests/sources.toml key "cantera"), equilibrium by Gibbs minimisation at constant
    # enthalpy and pressure on the kept species. 3 m of tube is ~40 ms after ignition: the outlet has relaxed
    # to within 0.05 K and 1e-5 in mole fraction (the last radical recombination is slow).
    import cantera as ct

    r = simulate(load_case_dict(tube_case(tube={"length": "3 m", "inner_diameter": "8 mm"},
                                          solver={"rtol": 1e-8, "atol_scale": 1e-12})))
    gas = _oracle_solution()
    gas.TPX = 1000.0, ct.one_atm, FEED_X
    gas.equilibrate("HP")
    assert r.status == "completed"
    assert r.T[-1] == pytest.approx(gas.T, abs=0.05)
    x_out = dict(zip(r.species, r.mole_fractions[-1]))
    for s in ("H2O", "O2", "OH", "H2"):
        assert x_out[s] == pytest.approx(gas[s].X[0], abs=1e-5), s


def test_packed_tube_with_ergun_and_a_co_current_medium_closes():
    # invariant: element and energy closure with the co-current medium's own enthalpy change; Ergun loses pressure
    raw = tube_case(bed={"particle_diameter": "2 mm", "void_fraction": 0.4, "bulk_density": "1500 kg/m^3"},
                    pressure_drop={"model": "ergun"},
                    heat={"mode": "exchange", "overall_coefficient": "200 W/(m^2*K)",
                          "medium": {"arrangement": "co-current", "temperature": "950 K", "mass_flow": "2 g/s",
                                     "cp": "1.1 kJ/(kg*K)"}},
                    solver={"rtol": 1e-8, "atol_scale": 1e-12},
                    feed={"temperature": "1000 K", "pressure": "1 atm", "mass_flow": "0.02 g/s",
                          "mole_fractions": dict(FEED_X)})
    r = simulate(load_case_dict(raw))
    assert r.status == "completed", r.termination
    assert r.closure["elements_relative"] < 1e-10 and r.closure["energy_relative"] < 1e-6
    assert r.P[-1] < r.P[0] and np.all(np.diff(r.P) <= 0)
    assert r.Tc[-1] > 950.0                           # the medium took up heat


def test_a_failing_evaluation_is_a_failed_run_with_where_and_why(monkeypatch):
    from simulator.mechanism.balances import MechanismTube

    original = MechanismTube.rhs

    def breaking(self, z, y, dy):
        if z > 0.03:
            raise RuntimeError("CanteraError thrown by test: rates not available")
        original(self, z, y, dy)

    monkeypatch.setattr(MechanismTube, "rhs", breaking)
    r = simulate(load_case_dict(tube_case()))
    s = r.summary()
    assert r.status == "failed"
    assert re.search(r"could not be evaluated near z = 0\.0[23]", r.termination)
    assert 0.02 < r.z[-1] < 0.03                      # what was reached before, kept for profile_until_failure.csv
    assert s["outlet"]["temperature_K"] is None and s["ignition"] is None


def test_cli_run_writes_the_ignition_block(cases_dir, tmp_path, capsys):
    from simulator.cli import main

    assert main(["run", str(cases_dir / "mechanism_h2_air_tube.toml"), "--out", str(tmp_path)]) == 0
    summary = json.loads((tmp_path / "summary.json").read_text())
    assert set(summary["ignition"]) == {"position_m", "residence_time_s", "temperature_K"}
    assert "ignition" in capsys.readouterr().out


def cantera_parcel_with_wall_and_friction(U, Tc, viscosity):
    """Cantera's ExtensibleIdealGasConstPressureReactor carried along the tube: two extra states (z, P); wall heat
    U (4 V / D) (Tc - T) on the parcel's volume at its current pressure; dP/dt = u dP/dz with the Darcy factor of
    the ``fluids`` package (Churchill 1977, an implementation independent of ours) at the parcel's density.
    Cantera evaluates the chemistry inside ``eval`` at the reactor's stored pressure (the feed pressure): with a
    pressure drop of 0.5 % of P here, the rates differ from the tube's by at most that much."""
    import cantera as ct
    from fluids.friction import Churchill_1977

    gas = _oracle_solution()
    gas.TPX = 1000.0, ct.one_atm, FEED_X
    P0 = ct.one_atm
    G = MASS_FLOW / (math.pi * DIAMETER ** 2 / 4)

    class Parcel(ct.ExtensibleIdealGasConstPressureReactor):
        def after_initialize(self, t0):
            self.n_vars += 2
            self.z, self.P, self.m = 0.0, P0, 0.0

        def after_get_state(self, y):          # the current extra states, or they read as constants
            y[-2], y[-1] = self.z, self.P

        def after_update_state(self, y):
            self.m, self.z, self.P = y[0], y[-2], y[-1]

        def after_eval(self, t, LHS, RHS):
            rho = self.P * gas.mean_molecular_weight / (ct.gas_constant * gas.T)   # at the parcel's pressure
            u = G / rho
            RHS[1] += U * (4 * self.m / rho / DIAMETER) * (Tc - gas.T)
            dPdz = -Churchill_1977(G * DIAMETER / viscosity, 0.0) * rho * u * u / (2 * DIAMETER)
            LHS[-2], RHS[-2] = 1.0, u
            LHS[-1], RHS[-1] = 1.0, u * dPdz

    net = ct.ReactorNet([Parcel(gas, clone=False)])
    net.rtol, net.atol = 1e-10, 1e-20
    z, T, P = [0.0], [gas.T], [P0]
    while z[-1] < LENGTH:
        net.step()
        y = net.get_state()
        z.append(y[-2])
        T.append(gas.T)
        P.append(y[-1])
    return np.array(z), np.array(T), np.array(P)


@pytest.mark.published("cantera", "ExtensibleIdealGasConstPressureReactor with wall and pressure hooks")
def test_cooled_tube_with_friction_equals_cantera_reactor_with_wall_and_pressure_hooks():
    # Source: Cantera 3.2 (tests/sources.toml key "cantera"), its extensible constant-pressure reactor marched in
    # time with the wall and friction added through its hooks (above); friction factor from the fluids package.
    # Tolerances: outlet T 0.1 K and ignition 1 % (measured 0.02 K and 0.02 %: the oracle's rates sit at the feed
    # pressure), outlet P 0.5 Pa of a 520 Pa drop (measured 0.02 Pa).
    U, Tc, mu = 300.0, 1000.0, 4e-5
    z, T, P = cantera_parcel_with_wall_and_friction(U, Tc, mu)
    raw = cooled(U, {"model": "pipe-friction", "viscosity": f"{mu} Pa*s"})
    raw["solver"] = {"rtol": 1e-10, "atol_scale": 1e-14}
    r = simulate(load_case_dict(raw))
    assert r.status == "completed"
    assert r.P[0] - r.P[-1] > 400                      # the friction matters
    assert r.T[-1] == pytest.approx(float(np.interp(LENGTH, z, T)), abs=0.1)
    assert r.P[-1] == pytest.approx(float(np.interp(LENGTH, z, P)), abs=0.5)
    dTdz = np.gradient(T, z)
    assert r.summary()["ignition"]["position_m"] == pytest.approx(float(z[np.argmax(dTdz)]), rel=0.01)
