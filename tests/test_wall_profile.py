"""Given wall profiles (``heat.medium.arrangement = "wall-profile"``): temperature or heat flux.

Kinds of check (STYLE.md section 8): analytic (a linear wall temperature and a constant-cp gas
against the closed form of dT/dz = a (Tw(z) - T), derived below), invariants (a constant profile
is the uniform medium exactly; a given flux adds exactly q'' pi D L to the gas enthalpy, checked
against Cantera's enthalpy of N2 independently of the kernel), and the refusals of bad input.
"""
import dataclasses
import math

import numpy as np
import pytest
from scipy.optimize import brentq

from simulator import load_case, simulate
from simulator.cli import main
from simulator.errors import CaseError

CP = 30.0                # [J/(mol*K)] gas heat capacity (constant, custom species)
D, L = 0.05, 5.0         # [m] tube inner diameter and length
FLOW = 1.0               # [mol/s] feed, one tube


def _case(medium, overall='overall_coefficient = "40.0 W/(m^2*K)"', species="custom", T_feed=500.0, length=L):
    """One tube without reaction (A => B with a zero rate constant), no pressure drop."""
    if species == "custom":
        thermo = f'''[thermo.custom.A]
molar_mass = "28.0 g/mol"
cp = "{CP!r} J/(mol*K)"
enthalpy_of_formation = "0.0 kJ/mol"

[thermo.custom.B]
molar_mass = "28.0 g/mol"
cp = "{CP!r} J/(mol*K)"
enthalpy_of_formation = "0.0 kJ/mol"
'''
        reaction, feed = 'equation = "A => B"\norders = { A = 1 }', "{ A = 1.0 }"
    else:                  # N2 from gri30.yaml (NASA-7 cp(T)); N2 => 2 N with a zero rate
        thermo = '[thermo]\nspecies_file = "gri30.yaml"\n'
        reaction, feed = 'equation = "N2 => 2 N"\norders = { N2 = 1 }', "{ N2 = 1.0 }"
    return f'''title = "Wall-profile check tube"
{thermo}
[[reactions]]
{reaction}
pre_exponential = "0 mol/(m^3*s*Pa)"
activation_energy = "0.0 kJ/mol"
in_terms_of = "partial-pressure"

[feed]
temperature = "{T_feed!r} K"
pressure = "1e5 Pa"
molar_flow = "{FLOW!r} mol/s"
mole_fractions = {feed}

[tube]
length = "{length!r} m"
inner_diameter = "{D!r} m"
count = 1

[heat]
mode = "exchange"
{overall}

[heat.medium]
{medium}

[design]
key_species = "{"A" if species == "custom" else "N2"}"

[solver]
rtol = 1e-10
atol_scale = 1e-12
'''


def _rows(quantity, rows):
    return "arrangement = \"wall-profile\"\n" + "".join(
        f'[[heat.medium.profile]]\nposition = "{z!r} m"\n{quantity} = "{v}"\n' for z, v in rows)


def test_constant_wall_profile_is_the_uniform_medium(write_case):
    # identity: Tw(z) = 800 K everywhere is a uniform medium at 800 K; same kernel flux, same U
    given = simulate(load_case(write_case(_case(_rows("temperature", [(0.0, "800 K"), (L, "800 K")])), "p.toml")))
    uniform = simulate(load_case(write_case(_case('arrangement = "uniform"\ntemperature = "800 K"'), "u.toml")))
    assert given.status == uniform.status == "completed"
    assert np.max(np.abs(given.T - uniform.T)) < 1e-9 * 800.0
    assert given.Q[-1] == pytest.approx(uniform.Q[-1], rel=1e-9)
    assert np.all(given.Tc == 800.0)
    assert given.summary()["outlet"]["medium_temperature_K"] == 800.0


def linear_wall_solution(z, T0, Tw0, b, a):
    r"""T(z) of dT/dz = a (Tw0 + b z - T), T(0) = T0 (derivation, DER).

    With theta = T - Tw: dtheta/dz = -a theta - b, so theta = -b/a + (theta0 + b/a) e^(-a z) and

    .. math:: T(z) = T_w(z) - b/a + (T_0 - T_{w0} + b/a)\,e^{-a z}
    """
    return Tw0 + b * z - b / a + (T0 - Tw0 + b / a) * math.exp(-a * z)


def test_linear_and_kinked_wall_profile_against_the_closed_form(write_case):
    # analytic: constant cp, no reaction, no pressure drop: F cp dT/dz = U pi D (Tw(z) - T), a = U pi D/(F cp).
    # Two segments (a kink at 2 m) chain the closed form; tolerance from the solver's rtol 1e-10.
    U = 40.0
    a = U * math.pi * D / (FLOW * CP)
    rows = [(0.0, "600 K"), (2.0, "900 K"), (L, "750 K")]
    result = simulate(load_case(write_case(_case(_rows("temperature", rows)))))
    b1, b2 = 300.0 / 2.0, -150.0 / 3.0
    T2 = linear_wall_solution(2.0, 500.0, 600.0, b1, a)
    T_end = linear_wall_solution(L - 2.0, T2, 900.0, b2, a)
    k = int(np.argmin(np.abs(result.z - 2.0)))
    z_k = result.z[k]
    expected_k = linear_wall_solution(z_k, 500.0, 600.0, b1, a) if z_k <= 2.0 else \
        linear_wall_solution(z_k - 2.0, T2, 900.0, b2, a)
    assert result.T[k] == pytest.approx(expected_k, abs=1e-6)
    assert result.T[-1] == pytest.approx(T_end, abs=1e-6)
    assert result.Tc[-1] == 750.0 and result.Tc[0] == 600.0           # the profile as given
    assert result.closure["energy_relative"] < 1e-8


def test_given_heat_flux_adds_exactly_q_pi_D_L_to_the_gas(write_case):
    # invariant: the wall duty is q'' pi D L exactly; the outlet temperature against a hand integration
    # of N2's enthalpy (Cantera, gri30.yaml NASA-7 rows) outside the kernel: H(T_out) - H(T_in) = q'' pi D L / F
    q = 10e3            # outlet near 750 K: below the 1000 K joint of the NASA-7 ranges of N2
    medium = _rows("heat_flux", [(0.0, f"{q / 1e3!r} kW/m^2"), (L, f"{q / 1e3!r} kW/m^2")])
    result = simulate(load_case(write_case(_case(medium, overall="", species="gri30"))))
    duty = q * math.pi * D * L
    assert result.Q[-1] == pytest.approx(duty, rel=1e-10)
    import cantera as ct

    gas = ct.Solution("gri30.yaml")

    def h(T):
        gas.TPX = T, 1e5, "N2:1"
        return gas.enthalpy_mole / 1000.0                 # [J/mol]
    T_out = brentq(lambda T: h(T) - h(500.0) - duty / FLOW, 500.0, 3000.0, xtol=1e-10)
    assert result.T[-1] == pytest.approx(T_out, abs=1e-5)
    summary = result.summary()
    assert summary["outlet"]["medium_temperature_K"] is None
    assert summary["hot_spot"]["rise_above_medium_K"] is None
    assert result.closure["energy_relative"] < 1e-8


@pytest.mark.parametrize("medium, overall, match", [
    ('temperature = "800 K"\n' + _rows("temperature", [(0.0, "800 K"), (L, "800 K")]), None,
     r"heat\.medium\.temperature"),
    ('arrangement = "wall-profile"\n[[heat.medium.profile]]\nposition = "0 m"\ntemperature = "800 K"\n'
     '[[heat.medium.profile]]\nposition = "5 m"\nheat_flux = "10 kW/m^2"\n', None, "not both"),
    (_rows("temperature", [(0.5, "800 K"), (L, "800 K")]), None, r"profile\.0\.position.*position = 0"),
    (_rows("temperature", [(0.0, "800 K"), (3.0, "800 K"), (2.0, "800 K")]), None, "increase strictly"),
    (_rows("temperature", [(0.0, "800 K"), (4.0, "800 K")]), None, "never extrapolated"),
    (_rows("heat_flux", [(0.0, "10 kW/m^2"), (L, "10 kW/m^2")]), None, r"heat\.overall_coefficient"),
    (_rows("heat_flux", [(0.0, "10 kW/m^2"), (L, "10 K")]), "", r"profile\.1\.heat_flux"),
    (_rows("temperature", [(0.0, "800 K")]), None, "at least two"),
])
def test_bad_profiles_are_refused_naming_the_field(write_case, medium, overall, match):
    text = _case(medium) if overall is None else _case(medium, overall=overall)
    with pytest.raises(CaseError, match=match):
        load_case(write_case(text))


def test_a_tube_longer_than_its_profile_is_refused_not_extrapolated(write_case):
    case = load_case(write_case(_case(_rows("temperature", [(0.0, "800 K"), (6.0, "700 K")]))))
    assert simulate(case).status == "completed"                       # 5 m inside the 6 m profile
    longer = dataclasses.replace(case, tube=dataclasses.replace(case.tube, length=7.0))
    with pytest.raises(CaseError, match="never extrapolated"):
        simulate(longer)
    with pytest.raises(CaseError, match="never extrapolated"):
        simulate(case, length=6.5)


def test_profile_csv_carries_the_given_temperature(write_case, tmp_path):
    path = write_case(_case(_rows("temperature", [(0.0, "600 K"), (L, "700 K")])))
    assert main(["run", str(path), "--out", str(tmp_path / "out")]) == 0
    lines = (tmp_path / "out" / "profile.csv").read_text().splitlines()
    header = lines[0].split(",")
    col = header.index("medium_temperature_K")
    assert float(lines[-1].split(",")[col]) == pytest.approx(700.0, abs=1e-9)
    assert float(lines[1].split(",")[col]) == pytest.approx(600.0, abs=1e-9)


def test_report_block_shows_the_rows_and_the_flux(write_case):
    # the report's wall duty is the run's (whole reactor) and the flux of a given q'' is q'' itself
    from simulator.report.context_wall_profile import wall_profile_block

    q = 10e3
    case = load_case(write_case(_case(_rows("heat_flux", [(0.0, "10.0 kW/m^2"), (L, "10.0 kW/m^2")]), overall="")))
    block = wall_profile_block(case, simulate(case))
    assert block["available"] and [r["position"] for r in block["rows"]] == ["0", "5"]
    assert f"{q * math.pi * D * L / 1e3:.4g} kW" in block["paragraphs"][0]
    assert "peak inner-wall flux 10 kW/m^2" in block["paragraphs"][0]
    uniform = load_case(write_case(_case('arrangement = "uniform"\ntemperature = "800 K"'), "u.toml"))
    assert not wall_profile_block(uniform, simulate(uniform))["available"]


def test_screening_says_a_given_profile_is_not_a_runaway_case(write_case):
    from simulator.screening.screen import screen

    case = load_case(write_case(_case(_rows("temperature", [(0.0, "800 K"), (L, "700 K")]))))
    report = screen(case)
    assert report["applicable"] is False and "wall-profile" in report["reason"]
    assert report["hot_spot"]["rise_above_medium_K"] is None


def test_the_compiled_batch_sweep_sends_a_profile_case_to_the_per_case_path(write_case):
    from simulator.model.build import build_model
    from simulator.sweeps.fast import unsupported_reason

    model = build_model(load_case(write_case(_case(_rows("temperature", [(0.0, "800 K"), (L, "700 K")])))))
    assert "wall-profile" in unsupported_reason(["heat.overall_coefficient"], model)
