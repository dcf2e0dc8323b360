"""Liquid feeds (equation_of_state = "liquid"): closed forms and refusals."""
import copy
import math
import tomllib
from pathlib import Path

import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.solve.integrate import simulate

CASE = Path(__file__).parent.parent / "cases" / "liquid_jacketed_tube.toml"


def _raw(**heat):
    raw = tomllib.loads(CASE.read_text())
    raw["pressure_drop"] = {"model": "none"}
    raw["thermo"]["expansion_coefficient"] = "0 1/K"
    raw["design"].pop("temperature_limit")
    if heat:
        raw["heat"] = heat
    return raw


@pytest.mark.published("levenspiel1999", "ch. 5, first-order plug flow of constant density (chapter from memory)")
def test_isothermal_first_order_liquid_matches_closed_form():
    # analytic: X = 1 - exp(-k tau), tau = V / Q with Q = m_dot / rho (constant density)
    raw = _raw(mode="isothermal")
    case = load_case_dict(raw)
    result = simulate(case)
    T = case.feed.temperature
    k = 4.0e9 * math.exp(-80e3 / (8.314462618 * T))
    V = math.pi * 0.05 ** 2 / 4 * 20.0
    tau = V / (0.68 / 3600.0)
    assert result.outlet_conversion == pytest.approx(1.0 - math.exp(-k * tau), rel=1e-6)


@pytest.mark.published("levenspiel1999", "ch. 9, adiabatic operating line T - T0 = dT_ad X (chapter from memory)")
def test_adiabatic_liquid_follows_the_straight_line():
    # analytic: with constant species cp, T - T0 = dT_ad X, dT_ad = (-dH) x_A0 / sum_i x_i cp_i
    case = load_case_dict(_raw(mode="adiabatic"))
    result = simulate(case)
    rise = 80e3 * 0.1 / (0.1 * 200.0 + 0.9 * 160.0)
    assert result.adiabatic_temperature_rise == pytest.approx(rise, rel=1e-9)
    T_out = result.T[-1]
    assert T_out - case.feed.temperature == pytest.approx(rise * result.outlet_conversion, rel=1e-6)


def test_density_falling_with_temperature_lowers_conversion():
    # invariant: a liquid that expands when heated flows faster and is more dilute, so with
    # beta > 0 an adiabatic (heating) run converts less than at constant density
    base = _raw(mode="adiabatic")
    expanding = copy.deepcopy(base)
    expanding["thermo"]["expansion_coefficient"] = "1e-3 1/K"
    expanding["thermo"].pop("density_at")
    X0 = simulate(load_case_dict(base)).outlet_conversion
    X1 = simulate(load_case_dict(expanding)).outlet_conversion
    assert X1 < X0


def test_liquid_refuses_partial_pressure_rates_and_species_files():
    raw = _raw(mode="isothermal")
    raw["reactions"][0]["in_terms_of"] = "partial-pressure"
    raw["reactions"][0]["pre_exponential"] = "4.0e9 mol/(m^3*s*Pa)"
    with pytest.raises(CaseError, match=r"reactions\.0\.in_terms_of"):
        load_case_dict(raw)
    raw = _raw(mode="isothermal")
    raw["thermo"]["equation_of_state"] = "ideal-gas"
    with pytest.raises(CaseError, match=r"thermo: density"):
        load_case_dict(raw)


def test_assumptions_say_ideal_gas_does_not_apply_to_a_liquid():
    from simulator.assumptions import check_assumptions
    report = check_assumptions(load_case_dict(_raw(mode="adiabatic")))
    row = report["assumptions"]["ideal_gas"]
    assert row["value"] is None and "does not apply" in row["design_change_basis"]
