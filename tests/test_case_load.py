"""Case-file loading: the contract example, units, and every bad-input message."""
import pytest

from simulator.case.load import load_case
from simulator.errors import CaseError

ISSUE_EXAMPLE = (__import__("pathlib").Path(__file__).parents[1] / "cases" / "decomposition_empty_tube.toml")

PACKED = """
title = "packed"
[thermo]
species_file = "gri30.yaml"
[[reactions]]
equation = "C2H4 + H2 => C2H6"
pre_exponential = "1e2 mol/(kg*s*bar^2)"
activation_energy = "50 kJ/mol"
in_terms_of = "partial-pressure"
rate_basis = "catalyst-mass"
[feed]
temperature = "250 degC"
pressure = "5 bar"
mass_flow = "1 kg/s"
mole_fractions = { C2H4 = 0.1, H2 = 0.2, N2 = 0.7 }
[tube]
length = "3 m"
inner_diameter = "25 mm"
count = 100
[bed]
particle_diameter = "3 mm"
void_fraction = 0.40
bulk_density = "1100 kg/m^3"
[heat]
mode = "exchange"
overall_coefficient = "180 W/(m^2*K)"

[heat.medium]
arrangement = "uniform"
temperature = "520 K"
[pressure_drop]
model = "ergun"
viscosity = "2.2e-5 Pa*s"
[design]
key_species = "C2H4"
temperature_limit = "800 K"
"""


def test_contract_example_is_accepted_with_its_meaning():
    case = load_case(ISSUE_EXAMPLE)
    assert case.feed.temperature == 700.0
    assert case.feed.pressure == 3e5
    assert case.feed.flow_kind == "molar_flow" and case.feed.flow_value == 12.0
    assert dict(case.feed.mole_fractions) == {"A": 0.7, "N2": 0.3}
    assert case.tube.length == 12.0 and case.tube.inner_diameter == pytest.approx(0.05) and case.tube.count == 40
    r = case.reactions[0]
    assert dict(r.stoichiometry) == {"A": -1.0, "B": 2.0} and not r.reversible
    assert r.pre_exponential == 4.0e12 and r.activation_energy == 170e3
    assert r.in_terms_of == "concentration" and r.rate_basis == "reactor-volume"
    custom = {c.name: c for c in case.thermo.custom}
    assert custom["A"].molar_mass == pytest.approx(0.086) and custom["A"].cp == 150.0
    assert custom["B"].enthalpy_of_formation == -10e3
    assert case.heat.mode == "isothermal" and case.pressure_drop.model == "none"
    assert case.design.key_species == "A" and case.design.target_conversion == 0.9


def test_packed_cooled_form_is_accepted(write_case):
    case = load_case(write_case(PACKED))
    assert case.feed.temperature == pytest.approx(523.15)
    assert case.bed.bulk_density == 1100.0 and case.bed.void_fraction == 0.4
    assert case.heat.overall_coefficient == 180.0 and case.heat.medium_temperature == 520.0
    assert case.pressure_drop.viscosity == pytest.approx(2.2e-5)
    assert case.design.temperature_limit == 800.0
    # default orders are the reactant coefficients; 1e2 mol/(kg s bar^2) in SI
    assert dict(case.reactions[0].orders) == {"C2H4": 1.0, "H2": 1.0}
    assert case.reactions[0].pre_exponential == pytest.approx(1e2 / 1e10)


def _errors(write_case, text):
    with pytest.raises(CaseError) as info:
        load_case(write_case(text))
    return info.value.problems


@pytest.mark.parametrize("old, new, pattern", [
    ('length = "3 m"', "length = 3", r"tube\.length = 3: needs a unit"),
    ('length = "3 m"', 'length = "-3 m"', r"tube\.length = '-3 m': must be > 0"),
    ('pressure = "5 bar"', 'pressure = "4 barg"', r"feed\.pressure .*gauge pressure is not accepted"),
    ('temperature = "250 degC"', 'temperature = "250 bar"', r"feed\.temperature .*expected temperature"),
    ('mode = "exchange"', 'mode = "cooled"', r"heat\.mode = 'cooled': unknown; choose one of"),
    ("N2 = 0.7", "N2 = 0.6", r"feed\.mole_fractions: sum to 0\.9"),
    ("N2 = 0.7", "N3 = 0.7", r"unknown species 'N3'.*did you mean .*'N2'"),
    ('"C2H4 + H2 => C2H6"', '"C2H4 + 2 H2 => C2H6"', r"elements do not balance \(H -2\)"),
    ('"C2H4 + H2 => C2H6"', '"C2H4 + H2 -> C2H6"', r"reactions\.0\.equation .*exactly one arrow"),
    ('"1e2 mol/(kg*s*bar^2)"', '"1e2 1/s"', r"reactions\.0\.pre_exponential .*units do not match orders"),
    ("count = 100", "count = 2.5", r"tube\.count = 2\.5: must be a whole number"),
    ("void_fraction = 0.40", "void_fraction = 1.2", r"bed\.void_fraction = 1\.2: must be"),
    ('viscosity = "2.2e-5 Pa*s"', 'viscosity = "2.2e-5 Pa*s"\nviscocity = 1', r"did you mean 'viscosity'"),
    ('key_species = "C2H4"', 'key_species = "C2H6"', r"design\.key_species = 'C2H6': must be in the feed"),
])
def test_bad_field_is_named_with_value_and_accepted_values(write_case, old, new, pattern):
    assert old in PACKED
    problems = _errors(write_case, PACKED.replace(old, new, 1))
    assert any(__import__("re").search(pattern, p) for p in problems), problems


def test_every_problem_is_reported_at_once(write_case):
    text = PACKED.replace('length = "3 m"', "length = 3").replace("N2 = 0.7", "N3 = 0.7").replace(
        'mode = "exchange"', 'mode = "cooled"')
    problems = _errors(write_case, text)
    assert len(problems) >= 3
    assert all(p.startswith(str(__import__("pathlib").Path(p.split(":")[0]))) for p in problems)


def test_ergun_without_bed_is_an_error(write_case):
    start = PACKED.index("[bed]")
    end = PACKED.index("[heat]")
    text = PACKED[:start] + PACKED[end:]
    problems = _errors(write_case, text)
    assert any("needs a [bed] table" in p for p in problems)
    assert any('"catalyst-mass" needs a [bed]' in p for p in problems)


def test_custom_species_mass_balance_is_checked(write_case):
    text = ISSUE_EXAMPLE.read_text().replace('molar_mass = "43 g/mol"', 'molar_mass = "40 g/mol"')
    problems = _errors(write_case, text)
    assert any("mass does not balance" in p for p in problems)


def test_reversible_with_custom_species_needs_entropy(write_case):
    text = ISSUE_EXAMPLE.read_text().replace('"A => 2 B"', '"A <=> 2 B"')
    problems = _errors(write_case, text)
    assert any("standard_entropy" in p for p in problems)


def test_not_toml_is_one_clear_error(write_case):
    problems = _errors(write_case, "title = \n")
    assert len(problems) == 1 and "not valid TOML" in problems[0]
