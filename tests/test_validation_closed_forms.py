"""End-to-end runs of ``simulate`` against closed forms, and invariants of the demo cases.

Kinds of check (STYLE.md section 8):

* analytic: isothermal PFR volumes with expansion (first and second order),
  isothermal packed-bed pressure profile and first-order conversion with
  pressure drop, adiabatic temperature-conversion line with constant heat
  capacities. Each closed form is coded here from its source, the case is
  run through the public API (``load_case`` / ``simulate``) with a tight
  solver, and the simulator must agree to 1e-6 relative or better. The
  closed forms as coded are also checked against the tabulated numbers of
  /work/shared/reference/check-values.md at their printed precision, so a
  transcription error in a formula cannot hide.
* invariant: conservation checks on every demo case in ``cases/*.toml``.

Every dimensional value goes into the case files as text with a unit; the
closed forms use SI floats.
"""
import math
from pathlib import Path

import numpy as np
import pytest

from simulator import load_case, simulate

R = 8.314462618          # [J/(mol*K)], the value the simulator uses
# single-tube demos; a reactor train ([[train]]) runs through simulate_train (tests/test_train_run.py)
CASES = sorted(p for p in (Path(__file__).resolve().parents[1] / "cases").glob("*.toml")
               if "[[train]]" not in p.read_text())


def _species_text(species):
    """[thermo.custom.NAME] tables; ``species`` is a list of (name, g/mol, cp J/(mol K), hf kJ/mol)."""
    out = []
    for name, molar_mass, cp, hf in species:
        out.append(f'[thermo.custom.{name}]\nmolar_mass = "{molar_mass!r} g/mol"\ncp = "{cp!r} J/(mol*K)"\n'
                   f'enthalpy_of_formation = "{hf!r} kJ/mol"\n')
    return "\n".join(out)


def _inline(table):
    return "{ " + ", ".join(f"{k} = {v!r}" for k, v in table.items()) + " }"


# ---------------------------------------------------------------------------------------------
# 1. Isothermal, isobaric ideal-gas PFR with volume change (Levenspiel 1999, ch. 5)
# ---------------------------------------------------------------------------------------------
T_LEV = 500.0              # [K]
P_LEV = 2 * 101325.0       # [Pa]
V0_LEV = 0.005             # [m^3/s] at feed T and P
X_LEV = 0.8                # [-]
K1 = 0.2                   # [1/s]
K2 = 0.01                  # [m^3/(mol*s)]


def levenspiel_first_order_volume(v0, k, eps, X):
    """PFR volume for -rA = k CA with CA = CA0 (1-X)/(1+eps X), [m^3]."""
    return v0 / k * ((1 + eps) * math.log(1 / (1 - X)) - eps * X)


def levenspiel_second_order_volume(v0, k, CA0, eps, X):
    """PFR volume for -rA = k CA^2 with CA = CA0 (1-X)/(1+eps X), [m^3]."""
    return v0 / (k * CA0) * (2 * eps * (1 + eps) * math.log(1 - X) + eps ** 2 * X
                             + (1 + eps) ** 2 * X / (1 - X))


# (id, equation, species (name, g/mol, cp, hf), feed mole fractions, eps, tabulated V1, tabulated V2)
# Molar masses balance each reaction; cp and hf are irrelevant for an isothermal run.
LEVENSPIEL = [
    ("1a-1d A+B->C equimolar", "A + B => C", [("A", 40.0, 50.0, 0.0), ("B", 20.0, 50.0, 0.0),
                                              ("C", 60.0, 50.0, -10.0)],
     {"A": 0.5, "B": 0.5}, -0.5, 0.0301180, 0.0411255),
    ("1b-1e A->B pure A", "A => B", [("A", 40.0, 50.0, 0.0), ("B", 40.0, 50.0, -10.0)],
     {"A": 1.0}, 0.0, 0.0402359, 0.0410287),
    ("A->2B 50% inert", "A => 2 B", [("A", 40.0, 50.0, 0.0), ("B", 20.0, 50.0, -10.0), ("I", 28.0, 30.0, 0.0)],
     {"A": 0.5, "I": 0.5}, 0.5, 0.0503539, 0.1392071),
    ("1c-1f A->2B pure A", "A => 2 B", [("A", 40.0, 50.0, 0.0), ("B", 20.0, 50.0, -10.0)],
     {"A": 1.0}, 1.0, 0.0604719, 0.1062874),
]


def _levenspiel_case(equation, species, fractions, orders, pre_exponential):
    return f'''title = "Isothermal PFR with expansion: {equation}"
{_species_text(species)}
[[reactions]]
equation = "{equation}"
pre_exponential = "{pre_exponential}"
activation_energy = "0 kJ/mol"
orders = {_inline(orders)}

[feed]
temperature = "{T_LEV!r} K"
pressure = "2 atm"
volumetric_flow = "{V0_LEV!r} m^3/s"
mole_fractions = {_inline(fractions)}

[tube]
length = "40 m"
inner_diameter = "0.1 m"
count = 1

[heat]
mode = "isothermal"

[pressure_drop]
model = "none"

[design]
key_species = "A"
target_conversion = {X_LEV!r}

[solver]
rtol = 1e-10
atol_scale = 1e-12
'''


@pytest.mark.published("levenspiel1999", "ch. 5, PFR performance equation with expansion, first order "
                                         "(eq. 5.21 from memory)")
@pytest.mark.parametrize("label, equation, species, fractions, eps, V1_table, V2_table", LEVENSPIEL,
                         ids=[row[0] for row in LEVENSPIEL])
def test_levenspiel_first_order_volume(write_case, label, equation, species, fractions, eps, V1_table, V2_table):
    # check-values.md section 1; table printed to 6 significant figures -> half a unit in the last digit.
    expected = levenspiel_first_order_volume(V0_LEV, K1, eps, X_LEV)
    assert expected == pytest.approx(V1_table, abs=5e-8)
    case = load_case(write_case(_levenspiel_case(equation, species, fractions, {"A": 1}, f"{K1!r} 1/s")))
    result = simulate(case)
    design = result.summary()["design"]
    assert result.status == "completed"
    assert design["reached"] is True
    # Exact closed form; solver at rtol 1e-10 -> agreement far inside 1e-6 relative.
    assert design["volume_m3"] == pytest.approx(expected, rel=1e-6)


@pytest.mark.published("levenspiel1999", "ch. 5, PFR performance equation with expansion, second order "
                                         "(eq. 5.23 from memory)")
@pytest.mark.parametrize("label, equation, species, fractions, eps, V1_table, V2_table", LEVENSPIEL,
                         ids=[row[0] for row in LEVENSPIEL])
def test_levenspiel_second_order_volume(write_case, label, equation, species, fractions, eps, V1_table,
                                        V2_table):
    # -rA = k CA CB with CA = CB (equimolar A + B) is -rA = k CA^2; the rate law gives the rate of the
    # reaction as written, and nu_A = -1 in every equation here, so -rA = r.
    CA0 = fractions["A"] * P_LEV / (R * T_LEV)
    expected = levenspiel_second_order_volume(V0_LEV, K2, CA0, eps, X_LEV)
    assert expected == pytest.approx(V2_table, abs=5e-8)
    orders = {"A": 1, "B": 1} if "B" in fractions else {"A": 2}
    case = load_case(write_case(_levenspiel_case(equation, species, fractions, orders, f"{K2!r} m^3/(mol*s)")))
    result = simulate(case)
    design = result.summary()["design"]
    assert result.status == "completed"
    assert design["reached"] is True
    assert design["volume_m3"] == pytest.approx(expected, rel=1e-6)


# ---------------------------------------------------------------------------------------------
# 2. Isothermal packed bed with Ergun pressure drop, eps = 0 (closed forms derived from Ergun 1952)
# ---------------------------------------------------------------------------------------------
BED_T = 500.0              # [K]
BED_P0 = 1.0e6             # [Pa]
BED_M = 0.028              # [kg/mol]
BED_MU = 2.5e-5            # [Pa*s]
BED_D = 0.05               # [m]
BED_DP = 3e-3              # [m]
BED_PHI = 0.4              # [-]
BED_RHO_SOLID = 2000.0     # [kg/m^3] catalyst solid density of the closed form
BED_G = 5.0                # [kg/(m^2*s)]
BED_K1 = 2e-4              # [m^3/(kg*s)]


def _bed_constants():
    """(Ac [m^2], rho0 [kg/m^3], v0 [m^3/s], beta0 [Pa/m], alpha [1/kg], rho_bulk [kg/m^3])."""
    Ac = math.pi * BED_D ** 2 / 4
    rho0 = BED_P0 * BED_M / (R * BED_T)
    v0 = BED_G * Ac / rho0
    beta0 = (BED_G * (1 - BED_PHI) / (rho0 * BED_DP * BED_PHI ** 3)
             * (150 * (1 - BED_PHI) * BED_MU / BED_DP + 1.75 * BED_G))
    alpha = 2 * beta0 / (Ac * BED_RHO_SOLID * (1 - BED_PHI) * BED_P0)
    rho_bulk = BED_RHO_SOLID * (1 - BED_PHI)   # tubesim's bed.bulk_density
    return Ac, rho0, v0, beta0, alpha, rho_bulk


def _bed_case(length, k_prime):
    Ac, _, _, _, _, rho_bulk = _bed_constants()
    species = [(s, BED_M * 1000, 30.0, 0.0) for s in ("A", "B", "I")]
    return f'''title = "Isothermal packed bed, Ergun pressure drop"
{_species_text(species)}
[[reactions]]
equation = "A => B"
pre_exponential = "{k_prime!r} m^3/(kg*s)"
activation_energy = "0 kJ/mol"
orders = {{ A = 1 }}
in_terms_of = "concentration"
rate_basis = "catalyst-mass"

[feed]
temperature = "{BED_T!r} K"
pressure = "{BED_P0!r} Pa"
mass_flow = "{BED_G * Ac!r} kg/s"
mole_fractions = {{ A = 0.5, I = 0.5 }}

[tube]
length = "{length!r} m"
inner_diameter = "{BED_D!r} m"
count = 1

[bed]
particle_diameter = "{BED_DP!r} m"
void_fraction = {BED_PHI!r}
bulk_density = "{rho_bulk!r} kg/m^3"

[heat]
mode = "isothermal"

[pressure_drop]
model = "ergun"
viscosity = "{BED_MU!r} Pa*s"

[design]
key_species = "A"

[solver]
rtol = 1e-10
atol_scale = 1e-12
'''


def test_bed_constants_match_tabulated_values():
    # check-values.md section 2: rho0, v0, beta0, alpha as derived from the case inputs.
    _, rho0, v0, beta0, alpha, rho_bulk = _bed_constants()
    assert rho0 == pytest.approx(6.735252, abs=5e-7)
    assert v0 == pytest.approx(1.457626e-3, abs=5e-10)
    assert beta0 == pytest.approx(22038.894, abs=5e-4)
    assert alpha == pytest.approx(1.870719e-2, abs=5e-9)
    assert rho_bulk == pytest.approx(1200.0)


@pytest.mark.published("ergun1952", "Ergun equation; closed form P/P0 = (1 - alpha W)^(1/2) derived from it "
                                    "(isothermal, eps = 0, ideal gas; textbook section from memory)")
@pytest.mark.parametrize("length, y_table", [(5.0, 0.88295587), (20.0, 0.34415731)], ids=["2c-5m", "20m"])
def test_packed_bed_pressure_profile(write_case, length, y_table):
    # No reaction: a zero pre-exponential factor (the loader accepts A = 0), so F_T/F_T0 = 1 exactly.
    Ac, _, _, _, alpha, rho_bulk = _bed_constants()
    result = simulate(load_case(write_case(_bed_case(length, 0.0))))
    assert result.status == "completed"
    W = rho_bulk * Ac * result.z           # catalyst mass up to z, [kg]
    y_closed = np.sqrt(1 - alpha * W)
    assert y_closed[-1] == pytest.approx(y_table, abs=5e-9)   # printed to 8 decimals
    # The closed form is exact for this model (both Ergun terms scale as 1/rho ~ 1/P);
    # solver rtol 1e-10 -> 1e-7 relative along the whole profile.
    np.testing.assert_allclose(result.P / BED_P0, y_closed, rtol=1e-7, atol=0)
    assert result.P[-1] / BED_P0 == pytest.approx(y_table, rel=1e-7)


@pytest.mark.published("ergun1952", "first-order conversion with Ergun pressure drop, "
                                    "ln(1/(1-X)) = 2k'/(3 alpha v0) [1 - (1 - alpha W)^(3/2)], derived from it")
@pytest.mark.parametrize("length, X_table, y_table", [(5.0, 0.78212242, 0.88295587),
                                                      (20.0, 0.99081697, 0.34415731)], ids=["2d-5m", "20m"])
def test_packed_bed_first_order_conversion_with_pressure_drop(write_case, length, X_table, y_table):
    # A => B with equal molar masses: eps = 0, so the pressure profile is unchanged by the reaction.
    Ac, _, v0, _, alpha, rho_bulk = _bed_constants()
    result = simulate(load_case(write_case(_bed_case(length, BED_K1))))
    assert result.status == "completed"
    W = rho_bulk * Ac * result.z
    X_closed = 1 - np.exp(-(2 * BED_K1 / (3 * alpha * v0)) * (1 - (1 - alpha * W) ** 1.5))
    assert X_closed[-1] == pytest.approx(X_table, abs=5e-9)
    np.testing.assert_allclose(result.conversion, X_closed, rtol=0, atol=1e-8)
    assert result.outlet_conversion == pytest.approx(X_table, abs=1e-8)
    assert result.P[-1] / BED_P0 == pytest.approx(y_table, rel=1e-7)


# ---------------------------------------------------------------------------------------------
# 3. Adiabatic temperature-conversion line with constant heat capacities
# ---------------------------------------------------------------------------------------------
ADI_T0 = 350.0             # [K]
ADI_DH = -80000.0          # [J/mol] at 298.15 K
ADI_CP_A = 150.0           # [J/(mol*K)]
ADI_CP_I = 40.0            # [J/(mol*K)]
ADI_THETA_I = 1.5          # [-]
T_REF = 298.15             # [K]


def adiabatic_line(X, cp_B):
    """T(X) of the adiabatic enthalpy balance with constant heat capacities, [K]."""
    sum_theta_cp = ADI_CP_A + ADI_THETA_I * ADI_CP_I
    dcp = cp_B - ADI_CP_A
    return (X * (-ADI_DH) + sum_theta_cp * ADI_T0 + X * dcp * T_REF) / (sum_theta_cp + X * dcp)


def _adiabatic_case(cp_B):
    y_A = 1 / (1 + ADI_THETA_I)
    species = [("A", 60.0, ADI_CP_A, 0.0), ("B", 60.0, cp_B, ADI_DH / 1000), ("I", 18.0, ADI_CP_I, -100.0)]
    return f'''title = "Adiabatic A => B with inert, constant heat capacities"
{_species_text(species)}
[[reactions]]
equation = "A => B"
pre_exponential = "1e8 1/s"
activation_energy = "60 kJ/mol"

[feed]
temperature = "{ADI_T0!r} K"
pressure = "2 bar"
molar_flow = "1 mol/s"
mole_fractions = {{ A = {y_A!r}, I = {1 - y_A!r} }}

[tube]
length = "5 m"
inner_diameter = "0.1 m"
count = 1

[heat]
mode = "adiabatic"

[pressure_drop]
model = "none"

[design]
key_species = "A"

[solver]
rtol = 1e-10
atol_scale = 1e-12
'''


@pytest.mark.published("energy_balance", "adiabatic T-X line with constant Cp (Fogler 2006 ch. 8, "
                                         "eq. 8-29 from memory)")
@pytest.mark.parametrize("cp_B, T_table", [(150.0, 578.571429), (160.0, 570.781944)], ids=["4a-dCp0", "4b-dCp10"])
def test_adiabatic_profile_on_closed_form_line(write_case, cp_B, T_table):
    # check-values.md 4a/4b: closed form at X = 0.6, printed to 1e-6 K.
    assert adiabatic_line(0.6, cp_B) == pytest.approx(T_table, abs=5e-7)
    result = simulate(load_case(write_case(_adiabatic_case(cp_B))))
    assert result.status == "completed"
    X = result.conversion
    assert X[-1] > 0.99                      # the profile covers the whole line
    # Every profile point must lie on the line; 1e-6 K is far above the rtol 1e-10 error.
    np.testing.assert_allclose(result.T, adiabatic_line(X, cp_B), rtol=0, atol=1e-6)


@pytest.mark.published("energy_balance", "adiabatic T-X line at X = 1 (complete conversion)")
@pytest.mark.parametrize("cp_B", [150.0, 160.0], ids=["dCp0", "dCp10"])
def test_adiabatic_temperature_rise_at_complete_conversion(write_case, cp_B):
    result = simulate(load_case(write_case(_adiabatic_case(cp_B))))
    rise = result.summary()["adiabatic_temperature_rise_K"]
    assert rise == pytest.approx(adiabatic_line(1.0, cp_B) - ADI_T0, abs=1e-6)


# ---------------------------------------------------------------------------------------------
# 5. Invariants of every demo case
# ---------------------------------------------------------------------------------------------
@pytest.fixture(scope="module", params=CASES, ids=[p.name for p in CASES])
def demo_result(request):
    return simulate(load_case(request.param))


def test_demo_cases_exist():
    assert CASES, "no demo cases found in cases/*.toml"


def test_demo_case_status(demo_result):
    assert demo_result.status in ("completed", "stopped"), demo_result.termination


def test_demo_case_closure(demo_result):
    closure = demo_result.summary()["closure"]
    assert closure["elements_relative"] < 1e-9
    assert closure["energy_relative"] < 1e-6


def test_demo_case_mole_fractions(demo_result):
    x = demo_result.mole_fractions
    # Non-negative flows -> fractions within [0, 1]; -1e-9 is the negative-flow bound the simulator itself
    # warns about (relative to the total flow).
    assert np.all(x >= -1e-9) and np.all(x <= 1 + 1e-9)
    np.testing.assert_allclose(x.sum(axis=1), 1.0, rtol=0, atol=1e-12)
    outlet = demo_result.summary()["outlet"]["mole_fractions"]
    assert sum(outlet.values()) == pytest.approx(1.0, abs=1e-12)


def test_demo_case_pressure_non_increasing(demo_result):
    P = demo_result.P
    # Horizontal tube: dP/dz <= 0 everywhere; allow round-off of the stored profile only.
    assert np.all(np.diff(P) <= 1e-12 * P[0])
    assert P[-1] <= P[0]


def test_demo_case_conversion_in_range(demo_result):
    X = demo_result.conversion
    key = demo_result.key_index
    slack = 1e-9 * demo_result.F[0].sum() / demo_result.F[0, key]   # same negative-flow bound as above
    assert np.all(X >= -slack) and np.all(X <= 1 + slack)


def test_demo_case_flows_follow_stoichiometry(demo_result):
    # F_out - F_in must be a combination of the reaction columns (species balance closes on nu).
    case = demo_result.case
    index = {s: i for i, s in enumerate(demo_result.species)}
    nu = np.zeros((len(index), len(case.reactions)))
    for j, reaction in enumerate(case.reactions):
        for s, v in reaction.stoichiometry:
            nu[index[s], j] = v
    if case.mechanism is not None:       # a mechanism case: its kept reactions, species in the same order
        from simulator.case.mechanism_keys import mechanism_solution

        gas = mechanism_solution(case.mechanism.path, case.mechanism.phase, case.mechanism.species)
        nu = np.asarray(gas.product_stoich_coeffs - gas.reactant_stoich_coeffs, dtype=float)
    dF = demo_result.F[-1] - demo_result.F[0]
    extents, *_ = np.linalg.lstsq(nu, dF, rcond=None)
    assert np.max(np.abs(nu @ extents - dF)) <= 1e-9 * demo_result.F[0].sum()
