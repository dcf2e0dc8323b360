"""Rate laws, heat-transfer modes and pressure drop of the balances, against hand calculations,
Cantera and invariants."""
import math

import numpy as np
import pytest

from simulator import load_case, simulate
from simulator.model import kernel as K
from simulator.model.build import build_model
from simulator.units import R

BASE = """
title = "balances"
[thermo]
species_file = "gri30.yaml"
{thermo_extra}
[[reactions]]
{reaction}
[feed]
temperature = "{T} K"
pressure = "{P} bar"
{flow}
mole_fractions = {x}
[tube]
length = "{L} m"
inner_diameter = "25 mm"
count = 10
{tube_extra}
{bed}
[heat]
{heat}
[pressure_drop]
{pdrop}
[design]
key_species = "{key}"
[solver]
rtol = 1e-10
atol_scale = 1e-12
"""


def _case(write_case, name="c.toml", reaction="", T=600.0, P=5.0, flow='molar_flow = "10 mol/s"', x="",
          L=3.0, heat='mode = "isothermal"', pdrop='model = "none"', key="", bed="", tube_extra="", thermo_extra=""):
    return load_case(write_case(BASE.format(reaction=reaction, T=T, P=P, flow=flow, x=x, L=L, heat=heat,
                                            pdrop=pdrop, key=key, bed=bed, tube_extra=tube_extra,
                                            thermo_extra=thermo_extra), name))


LHHW = """equation = "C2H4 + H2 => C2H6"
form = "hougen-watson"
pre_exponential = "5 mol/(kg*s*bar^2)"
activation_energy = "40 kJ/mol"
orders = { C2H4 = 1, H2 = 1 }
in_terms_of = "partial-pressure"
rate_basis = "catalyst-mass"
inhibition_power = 2
[[reactions.inhibition]]
species = { C2H4 = 1 }
pre_exponential = "0.02 1/bar"
heat_of_adsorption = "-30 kJ/mol"
[[reactions.inhibition]]
species = { H2 = 0.5 }
pre_exponential = "0.1 1/bar^0.5"
heat_of_adsorption = "-10 kJ/mol"
"""
BED = '[bed]\nparticle_diameter = "3 mm"\nvoid_fraction = 0.4\nbulk_density = "1200 kg/m^3"'


@pytest.mark.published("hougen_watson1947", "LHHW rate form evaluated by hand")
def test_lhhw_rate_equals_the_hand_formula(write_case):
    # Langmuir-Hinshelwood-Hougen-Watson form: r = k pA pB / (1 + K_A pA + K_H sqrt(pH))^2, K = K0 exp(-dH/RT)
    case = _case(write_case, reaction=LHHW, x="{ C2H4 = 0.2, H2 = 0.3, N2 = 0.5 }", key="C2H4", bed=BED)
    model = build_model(case)
    T, P = 600.0, 5e5
    F = model.y0[:model.n]
    rates = np.empty(1)
    K.reaction_rates(T, P, F, *(model.args[i] for i in (0, 1, 2, 4, 5, 6, 7, 8, 9)), rates)
    bar = 1e5
    pA, pH = 0.2 * P / bar, 0.3 * P / bar                           # in bar, as the constants were given
    k = 5.0 * math.exp(-40e3 / (R * T))
    KA = 0.02 * math.exp(30e3 / (R * T))
    KH = 0.1 * math.exp(10e3 / (R * T))
    r_mass = k * pA * pH / (1 + KA * pA + KH * math.sqrt(pH)) ** 2   # mol/(kg s)
    assert rates[0] == pytest.approx(r_mass * 1200.0, rel=1e-12)       # per m^3 of bed


@pytest.mark.published("cantera", "equilibrate('TP'): Gibbs minimisation on the same species data")
def test_reversible_rate_runs_to_the_equilibrium_cantera_computes(write_case):
    # water-gas shift, isothermal and long enough to equilibrate; Cantera's equilibrate("TP") on the same
    # species is an independent calculation of the same equilibrium (Gibbs minimisation, not our K)
    import cantera as ct

    reaction = """equation = "CO + H2O <=> CO2 + H2"
pre_exponential = "1e6 m^3/(mol*s)"
activation_energy = "60 kJ/mol"
"""
    case = _case(write_case, reaction=reaction, T=700.0, P=10.0, L=50.0, key="CO",
                 x="{ CO = 0.1, H2O = 0.3, CO2 = 0.05, H2 = 0.1, N2 = 0.45 }")
    result = simulate(case)
    x_out = dict(zip(result.species, result.mole_fractions[-1]))
    gas = ct.Solution(thermo="ideal-gas", species=[s for s in ct.Species.list_from_file("gri30.yaml")
                                                   if s.name in ("CO", "H2O", "CO2", "H2", "N2")])
    gas.TPX = 700.0, 10e5, {k: v for k, v in dict(case.feed.mole_fractions).items()}
    gas.equilibrate("TP")
    for name in ("CO", "H2O", "CO2", "H2"):
        assert x_out[name] == pytest.approx(gas[name].X[0], rel=1e-6)


def test_adiabatic_is_the_limit_of_zero_wall_coefficient(write_case):
    reaction = 'equation = "C2H4 + H2 => C2H6"\npre_exponential = "2e5 m^3/(mol*s)"\nactivation_energy = "50 kJ/mol"'
    x = "{ C2H4 = 0.05, H2 = 0.1, N2 = 0.85 }"
    adiabatic = simulate(_case(write_case, "a.toml", reaction=reaction, x=x, key="C2H4", T=500.0,
                               heat='mode = "adiabatic"'))
    cooled = simulate(_case(write_case, "b.toml", reaction=reaction, x=x, key="C2H4", T=500.0,
                            heat='mode = "exchange"\noverall_coefficient = "0 W/(m^2*K)"\n'
                                 '[heat.medium]\ntemperature = "300 K"'))
    assert np.allclose(adiabatic.T, cooled.T, rtol=1e-12, atol=0)
    assert adiabatic.T[-1] > 550.0


def test_co_current_medium_takes_up_exactly_the_heat_the_gas_loses(write_case):
    reaction = 'equation = "C2H4 + H2 => C2H6"\npre_exponential = "2e3 m^3/(mol*s)"\nactivation_energy = "50 kJ/mol"'
    heat = ('mode = "exchange"\noverall_coefficient = "150 W/(m^2*K)"\n[heat.medium]\narrangement = "co-current"\n'
            'temperature = "480 K"\nmass_flow = "2 kg/s"\ncp = "2.5 kJ/(kg*K)"')
    result = simulate(_case(write_case, reaction=reaction, x="{ C2H4 = 0.05, H2 = 0.1, N2 = 0.85 }",
                            key="C2H4", T=500.0, heat=heat))
    gained_by_medium = 2.0 * 2500.0 * (result.Tc[-1] - result.Tc[0])      # [W], whole bundle
    assert result.Q[-1] < 0                                                 # gas is cooled
    assert -result.Q[-1] == pytest.approx(gained_by_medium, rel=1e-8)
    assert result.Tc[-1] > 480.0 and result.closure["energy_relative"] < 1e-7


@pytest.mark.published("fluids", "fluids.friction.Clamond (Colebrook solved exactly) in Darcy-Weisbach")
def test_pipe_friction_gradient_equals_darcy_weisbach_with_fluids(write_case):
    # inlet gradient of an inert flow against the independent fluids package (Colebrook via Clamond)
    fluids = pytest.importorskip("fluids")
    reaction = 'equation = "CO + H2O => CO2 + H2"\npre_exponential = "0 m^3/(mol*s)"\nactivation_energy = "1 kJ/mol"'
    case = _case(write_case, reaction=reaction, x="{ CO = 0.5, H2O = 0.5 }", key="CO", P=2.0,
                 flow='mass_flow = "0.3 kg/s"', pdrop='model = "pipe-friction"\nviscosity = "2.5e-5 Pa*s"\n'
                                                     'friction_correlation = "colebrook-1939"',
                 tube_extra='roughness = "0.05 mm"')
    model = build_model(case)
    dydz = K.rhs_odeint(model.y0, 0.0, *model.args)
    D, A = 0.025, math.pi * 0.025 ** 2 / 4
    m_tube = 0.3 / 10
    M = float(model.species.molar_mass @ (model.y0[:model.n] / model.y0[:model.n].sum()))
    rho = 2e5 * M / (R * 600.0)
    u = m_tube / A / rho
    Re = rho * u * D / 2.5e-5
    f = fluids.friction.Clamond(Re, 0.05e-3 / D)
    assert dydz[model.n + 1] == pytest.approx(-f * rho * u ** 2 / (2 * D), rel=1e-9)


@pytest.mark.parametrize("flow", ['mass_flow = "0.3 kg/s"', 'volumetric_flow = "0.5 m^3/s"'])
def test_feed_given_as_mass_or_volumetric_flow(write_case, flow):
    reaction = 'equation = "CO + H2O => CO2 + H2"\npre_exponential = "0 m^3/(mol*s)"\nactivation_energy = "1 kJ/mol"'
    case = _case(write_case, reaction=reaction, x="{ CO = 0.5, H2O = 0.5 }", key="CO", flow=flow)
    model = build_model(case)
    total = model.y0[:model.n].sum() * 10
    if flow.startswith("mass"):
        M = 0.5 * (28.010 + 18.015) / 1000
        assert total == pytest.approx(0.3 / M, rel=1e-4)
    else:
        assert total == pytest.approx(0.5 * 5e5 / (R * 600.0), rel=1e-12)


@pytest.mark.published("cantera", "enthalpy balance at fixed composition (HPX) on the same NASA data")
def test_adiabatic_rise_takes_the_worst_case_over_several_reactions(write_case):
    # C2H4 + H2 => C2H6 then C2H6 + H2 => 2 CH4 with H2 in excess: the worst case converts all
    # ethylene and then hydrogenolyses all the ethane (extents 0.1 and 0.1 per mol of feed). The
    # outlet temperature is checked against Cantera's own enthalpy balance at fixed composition
    # (gas.HPX), an independent evaluation of the same NASA data.
    import cantera as ct

    text = BASE.format(reaction='equation = "C2H4 + H2 => C2H6"\npre_exponential = "1 m^3/(mol*s)"\n'
                                'activation_energy = "60 kJ/mol"\n[[reactions]]\nequation = "C2H6 + H2 => 2 CH4"\n'
                                'pre_exponential = "1 m^3/(mol*s)"\nactivation_energy = "80 kJ/mol"',
                       T=500.0, P=5.0, flow='molar_flow = "10 mol/s"', x="{ C2H4 = 0.1, H2 = 0.5, N2 = 0.4 }",
                       L=1.0, heat='mode = "adiabatic"', pdrop='model = "none"', key="C2H4", bed="",
                       tube_extra="", thermo_extra="")
    result = simulate(load_case(write_case(text)))
    extents = result.summary()["adiabatic"]["extents_mol_per_s"]
    assert extents["C2H4 + H2 => C2H6"] == pytest.approx(1.0, rel=1e-6)       # 0.1 x 10 mol/s
    assert extents["C2H6 + H2 => 2 CH4"] == pytest.approx(1.0, rel=1e-6)
    gas = ct.Solution("gri30.yaml")
    gas.TPX = 500.0, 5e5, "C2H4:0.1, H2:0.5, N2:0.4"
    h_feed = gas.enthalpy_mass                         # [J/kg]; mass is conserved, so h per kg is too
    gas.HPX = h_feed, 5e5, "CH4:0.2, H2:0.3, N2:0.4"
    assert result.adiabatic_temperature_rise + 500.0 == pytest.approx(gas.T, abs=1e-3)
