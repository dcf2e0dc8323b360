"""Liquid feeds: Andrade viscosity, hydrostatic head of vertical tubes, boiling check, cp per mass."""
import math
import tomllib
from pathlib import Path

import numpy as np
import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.model import kernel as K
from simulator.model.build import build_model
from simulator.solve.integrate import simulate

CASE = Path(__file__).parent.parent / "cases" / "liquid_jacketed_tube.toml"
G0 = 9.80665
R = 8.314462618


def _raw(**changes):
    raw = tomllib.loads(CASE.read_text())
    raw["thermo"]["expansion_coefficient"] = "0 1/K"
    raw["heat"] = {"mode": "isothermal"}
    raw["design"].pop("temperature_limit")
    for path, value in changes.items():
        table, key = path.split(".")
        raw[table][key] = value
    return raw


@pytest.mark.published("andrade1930", "mu = A exp(B/T) of a liquid")
def test_andrade_viscosity_follows_the_law_and_moves_the_friction():
    # Andrade (1930): mu = mu0 exp(E/R (1/T - 1/T0)); at T = 60 degC the law gives mu0 exactly
    case = load_case_dict(_raw())
    model = build_model(case)
    fp = model.args[1]
    n = model.n
    for T in (300.0, 333.15, 360.0):
        expected = 1.0e-3 * math.exp(10e3 / R * (1 / T - 1 / 333.15))
        assert K.viscosity(T, model.y0[:n], fp) == pytest.approx(expected, rel=1e-12)
    # isothermal at 80 degC: the same pressure drop as a constant viscosity of mu(80 degC)
    hot = dict(_raw()["feed"], temperature="80 degC")
    mu80 = 1.0e-3 * math.exp(10e3 / R * (1 / 353.15 - 1 / 333.15))
    a = simulate(load_case_dict(_raw(**{"feed.temperature": "80 degC"})))
    raw_c = _raw(**{"feed.temperature": "80 degC"})
    raw_c["pressure_drop"] = {"model": "pipe-friction", "viscosity": f"{mu80!r} Pa*s"}
    b = simulate(load_case_dict(raw_c))
    assert hot["temperature"] == "80 degC"
    assert a.P[-1] == pytest.approx(b.P[-1], rel=1e-9)
    assert a.P[0] - a.P[-1] > 0


def test_vertical_tube_adds_the_hydrostatic_head():
    # analytic: a constant-density liquid flowing up a vertical tube loses rho g L more than a horizontal one
    up = simulate(load_case_dict(_raw(**{"tube.orientation": "vertical-up"})))
    flat = simulate(load_case_dict(_raw()))
    down = simulate(load_case_dict(_raw(**{"tube.orientation": "vertical-down"})))
    head = 850.0 * G0 * 20.0
    assert (flat.P[-1] - up.P[-1]) == pytest.approx(head, rel=1e-7)
    assert (down.P[-1] - flat.P[-1]) == pytest.approx(head, rel=1e-7)
    raw = _raw(**{"tube.orientation": "sideways"})
    with pytest.raises(CaseError, match=r"tube\.orientation"):
        load_case_dict(raw)


@pytest.mark.published("smith_van_ness2005", "Raoult's law bubble pressure with Clausius-Clapeyron vapour pressures")
def test_boiling_check_warns_where_the_bubble_pressure_exceeds_the_pressure():
    # by hand at the inlet: P_bubble = x_A P_A^sat + x_S P_S^sat, P^sat = 1 atm exp(-dh/R (1/T - 1/T_b))
    raw = _raw(**{"feed.pressure": "1.0 bar", "feed.temperature": "118 degC"})
    raw["pressure_drop"] = {"model": "none"}
    result = simulate(load_case_dict(raw))
    s = result.summary()["boiling"]
    T = 391.15
    p_sat = lambda Tb, dh: 101325.0 * math.exp(-dh / R * (1 / T - 1 / Tb))   # noqa: E731
    x_A = result.mole_fractions[0, result.species.index("A")]
    inlet = (x_A * p_sat(410.0, 38e3) + 0.9 * p_sat(384.0, 33e3)) / 1.0e5
    assert inlet > 1.0
    assert s["checked"] and s["boils_from_m"] == 0.0
    assert s["max_bubble_to_pressure_ratio"] >= inlet * (1 - 1e-9)
    assert any(w.startswith("boiling: the liquid's bubble pressure exceeds") for w in result.warnings)
    assert s["species_without_data"] == ["B"]
    assert simulate(load_case_dict(_raw())).summary()["boiling"]["boils_from_m"] is None


def test_custom_cp_per_mass_is_the_molar_cp_times_the_molar_mass():
    case = load_case_dict(_raw())
    A = next(c for c in case.thermo.custom if c.name == "A")
    assert A.cp == pytest.approx(200.0, rel=1e-12)
    raw = _raw()
    raw["thermo"]["custom"]["S"].pop("heat_of_vaporization")
    with pytest.raises(CaseError, match=r"thermo\.custom\.S: give normal_boiling_point and heat_of_vaporization"):
        load_case_dict(raw)
    assert np.isfinite(simulate(case).summary()["closure"]["energy_relative"])
