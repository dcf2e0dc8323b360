"""The assumption check: ideal branch, attribution of the design change, verdicts, CLI.

Kinds of check (STYLE.md section 8):

* published: the ideal branch of a case that is neither isothermal, isobaric
  nor ideal gas equals the closed-form isothermal, isobaric PFR volume with
  expansion (Levenspiel 1999, ch. 5), using the closed form as coded and
  checked against the tabulated values in ``test_validation_closed_forms.py``.
* invariant: when exactly one assumption fails, the ideal-versus-full design
  change equals that assumption's own design change and the others are zero;
  verdicts follow value <= threshold; thresholds from the case are used.

Every dimensional value goes into the case files as text with a unit; the
closed forms use SI floats.
"""
import json
import math

import pytest

from simulator import load_case
from simulator.assumptions import check_assumptions, mole_change
from simulator.cli import main
from test_validation_closed_forms import levenspiel_first_order_volume

R = 8.314462618          # [J/(mol*K)], the value the simulator uses
NAMES = ("isothermal", "isobaric", "ideal_gas", "constant_moles")
#: every row of the check for a packed bed: NAMES and the rows of the models that relax an assumption
#: (their own tests)
ROWS = NAMES + ("one_dimensional",)
NUMBERS = ("length_m", "volume_m3", "catalyst_mass_kg", "outlet_conversion")

# Critical constants of methane (CoolProp's reference file, check-values section 7) for the custom
# light-gas species, so that the ideal-gas check can compute Z.
LIGHT_GAS = ('critical_temperature = "190.564 K"\ncritical_pressure = "4.5992 MPa"\n'
             'acentric_factor = 0.01142\n')


def _species(name, molar_mass, hf, cp=35.0):
    return (f'[thermo.custom.{name}]\nmolar_mass = "{molar_mass!r} g/mol"\ncp = "{cp!r} J/(mol*K)"\n'
            f'enthalpy_of_formation = "{hf!r} kJ/mol"\n{LIGHT_GAS}')


def _bed_case(*, equation="A => B", molar_masses=(28.0, 28.0), hf_B=-60.0, k="2e3 m^3/(kg*s)",
              E="60 kJ/mol", y_A=0.2, T0="500 K", P0="3 bar", flow="0.05 mol/s", length="2.6 m",
              count=1, rho_b=1000.0, heat='mode = "isothermal"',
              pressure_drop='model = "ergun"\nviscosity = "2.5e-5 Pa*s"',
              eos="ideal-gas", target=0.9, extra=""):
    """A packed-bed case with custom A, B (critical constants of a light gas) in N2 from gri30."""
    return f'''title = "Assumption check: {equation}"

[thermo]
species_file = "gri30.yaml"
equation_of_state = "{eos}"

{_species("A", molar_masses[0], 0.0)}
{_species("B", molar_masses[1], hf_B)}
[[reactions]]
equation = "{equation}"
pre_exponential = "{k}"
activation_energy = "{E}"
orders = {{ A = 1 }}
rate_basis = "catalyst-mass"

[feed]
temperature = "{T0}"
pressure = "{P0}"
molar_flow = "{flow}"
mole_fractions = {{ A = {y_A!r}, N2 = {1 - y_A!r} }}

[tube]
length = "{length}"
inner_diameter = "30 mm"
count = {count}

[bed]
particle_diameter = "1.5 mm"
void_fraction = 0.40
bulk_density = "{rho_b!r} kg/m^3"

[heat]
{heat}

[pressure_drop]
{pressure_drop}

[design]
key_species = "A"
target_conversion = {target!r}
{extra}'''


# ---------------------------------------------------------------------------------------------
# Ideal branch of a non-ideal case = Levenspiel's closed form
# ---------------------------------------------------------------------------------------------
LEV = dict(T0=600.0, P0=8.0e5, F0=0.6, y_A=0.5, A=5.0e4, E=80e3, rho_b=1100.0, X=0.8, count=3)


@pytest.mark.published("levenspiel1999", "ch. 5, PFR performance equation with expansion, first order "
                                         "(eq. 5.21 from memory)")
def test_ideal_branch_equals_levenspiel_volume_with_expansion(write_case):
    # Full case: cooled, Ergun pressure drop (about half the feed pressure), Peng-Robinson, A => 2 B with
    # 50 % inert (eps = +0.5); its catalyst mass differs from the ideal one by about 20 %.
    # Its ideal branch is isothermal at the feed temperature, isobaric and ideal gas, so it must be
    # the closed form with v0 = F_T0 R T0 / P0 and k = k' rho_b exp(-E / (R T0)) per unit volume.
    p = LEV
    case = load_case(write_case(_bed_case(
        equation="A => 2 B", molar_masses=(56.0, 28.0), hf_B=-5.0, k=f"{p['A']!r} m^3/(kg*s)",
        E=f"{p['E'] / 1000!r} kJ/mol", y_A=p["y_A"], T0=f"{p['T0']!r} K", P0=f"{p['P0']!r} Pa",
        flow=f"{p['F0']!r} mol/s", length="1 m", count=p["count"], rho_b=p["rho_b"], eos="peng-robinson",
        heat='mode = "exchange"\noverall_coefficient = "100 W/(m^2*K)"\n[heat.medium]\ntemperature = "600 K"',
        target=p["X"])))
    eps, delta = mole_change(case)
    assert (eps, delta) == (pytest.approx(0.5), pytest.approx(1.0))     # eps = y_A0 * delta
    report = check_assumptions(case)
    k_volume = p["A"] * p["rho_b"] * math.exp(-p["E"] / (R * p["T0"]))  # [1/s]
    v0 = p["F0"] * R * p["T0"] / p["P0"]                               # [m^3/s], whole reactor
    V = levenspiel_first_order_volume(v0, k_volume, eps, p["X"])
    ideal = report["ideal"]
    # exact closed form; solver rtol 1e-8 and a located target event -> well inside 1e-5
    assert ideal["volume_m3"] == pytest.approx(V, rel=1e-5)
    assert ideal["catalyst_mass_kg"] == pytest.approx(V * p["rho_b"], rel=1e-5)
    area = math.pi * 0.030 ** 2 / 4
    assert ideal["length_m"] == pytest.approx(V / (p["count"] * area), rel=1e-5)
    assert ideal["outlet_conversion"] >= p["X"]
    # and the full model really is different, so the test exercises the switch-off of all three effects
    assert report["full"]["catalyst_mass_kg"] is not None
    assert abs(report["design_change_percent"]) > 1.0


# ---------------------------------------------------------------------------------------------
# Attribution when exactly one assumption fails
# ---------------------------------------------------------------------------------------------
@pytest.fixture(scope="module")
def only_isobaric_fails(tmp_path_factory):
    # Isothermal, eps = 0 (A => B, equal molar masses), ideal gas at 3 bar, Ergun drop ~30 % of P0.
    path = tmp_path_factory.mktemp("isobaric") / "case.toml"
    path.write_text(_bed_case())
    case = load_case(path)
    return case, check_assumptions(case)


@pytest.fixture(scope="module")
def only_isothermal_fails(tmp_path_factory):
    # Adiabatic exothermic, no pressure drop, eps = 0, ideal gas at 3 bar.
    path = tmp_path_factory.mktemp("isothermal") / "case.toml"
    path.write_text(_bed_case(hf_B=-10.0, heat='mode = "adiabatic"', pressure_drop='model = "none"'))
    case = load_case(path)
    return case, check_assumptions(case)


def test_attribution_when_only_isobaric_fails(only_isobaric_fails):
    case, report = only_isobaric_fails
    a = report["assumptions"]
    assert 0.15 <= a["isobaric"]["value"] <= 0.40
    assert a["isobaric"]["verdict"] == "fails"
    assert [a[n]["verdict"] for n in ("isothermal", "ideal_gas", "constant_moles")] == ["holds"] * 3
    assert report["design_change_percent"] is not None and abs(report["design_change_percent"]) > 5.0
    # The ideal design differs from the full model only by the pressure drop, so the whole design change is
    # the isobaric one.
    assert report["design_change_percent"] == pytest.approx(a["isobaric"]["design_change_percent"], rel=1e-6)
    assert abs(a["isothermal"]["design_change_percent"]) < 1e-6
    assert abs(a["constant_moles"]["design_change_percent"]) < 1e-6
    # 3 bar of a light gas: |Z - 1| < 0.1 %, so the real-gas correction is small
    assert a["ideal_gas"]["value"] < 1e-3
    assert abs(a["ideal_gas"]["design_change_percent"]) < 0.5
    # the measure is the pressure drop of the full run over the feed pressure
    drop = report["full_summary"]["outlet"]["pressure_drop_Pa"]
    assert a["isobaric"]["value"] == pytest.approx(drop / case.feed.pressure, rel=1e-12)


def test_attribution_when_only_isothermal_fails(only_isothermal_fails):
    case, report = only_isothermal_fails
    a = report["assumptions"]
    assert a["isothermal"]["verdict"] == "fails"
    assert [a[n]["verdict"] for n in ("isobaric", "ideal_gas", "constant_moles")] == ["holds"] * 3
    assert a["isobaric"]["value"] == 0.0
    assert report["design_change_percent"] == pytest.approx(a["isothermal"]["design_change_percent"], rel=1e-6)
    assert abs(a["isobaric"]["design_change_percent"]) < 1e-6
    assert abs(a["constant_moles"]["design_change_percent"]) < 1e-6
    assert abs(a["ideal_gas"]["design_change_percent"]) < 1.0
    # the measure is the largest |T - T_feed| of the full run: its hot spot for an exothermic adiabatic run
    rise = report["full_summary"]["hot_spot"]["temperature_K"] - case.feed.temperature
    assert a["isothermal"]["value"] == pytest.approx(rise, abs=1e-6)


# ---------------------------------------------------------------------------------------------
# Report structure, verdicts, thresholds
# ---------------------------------------------------------------------------------------------
def test_report_keys_and_verdicts(only_isobaric_fails, only_isothermal_fails):
    for case, report in (only_isobaric_fails, only_isothermal_fails):
        assert report["design_quantity"] == "catalyst_mass_kg"        # a packed bed is sized by mass
        for branch in ("ideal", "full"):
            assert set(NUMBERS) <= set(report[branch])
        assert set(report["assumptions"]) == set(ROWS)
        for name in NAMES:
            entry = report["assumptions"][name]
            assert {"value", "threshold", "verdict", "design_change_percent"} <= set(entry)
            assert entry["verdict"] == ("holds" if entry["value"] <= entry["threshold"] else "fails")
        # default thresholds
        E = case.reactions[0].activation_energy
        T0 = case.feed.temperature
        assert report["assumptions"]["isothermal"]["threshold"] == pytest.approx(0.1 * R * T0 ** 2 / E,
                                                                                 rel=1e-12)
        assert report["assumptions"]["isobaric"]["threshold"] == 0.10
        assert report["assumptions"]["ideal_gas"]["threshold"] == 0.05
        assert report["assumptions"]["constant_moles"]["threshold"] == 0.05


def test_thresholds_from_the_case_are_used(write_case):
    # Same case as only_isobaric_fails, thresholds moved so that every verdict flips.
    text = _bed_case(extra='\n[assumptions]\nisothermal = "0.001 K"\nisobaric = 0.5\nideal_gas = 1e-5\n'
                           'constant_moles = 1e-9\n')
    report = check_assumptions(load_case(write_case(text)))
    a = report["assumptions"]
    assert a["isothermal"]["threshold"] == pytest.approx(0.001)
    assert a["isobaric"]["threshold"] == 0.5
    assert a["ideal_gas"]["threshold"] == 1e-5
    assert a["constant_moles"]["threshold"] == 1e-9
    assert a["isobaric"]["verdict"] == "holds"          # drop ~0.3 < 0.5
    assert a["ideal_gas"]["verdict"] == "fails"         # |Z - 1| ~ 7e-4 > 1e-5
    # isothermal value 0 and eps 0 stay within any positive threshold
    assert a["isothermal"]["verdict"] == "holds" and a["constant_moles"]["verdict"] == "holds"


def test_design_change_is_null_with_a_reason_when_the_full_model_misses_the_target(write_case):
    # Tube long enough for the ideal design (2.09 m) but not for the full model with its pressure drop (2.42 m).
    report = check_assumptions(load_case(write_case(_bed_case(length="2.25 m"))))
    assert report["ideal"]["catalyst_mass_kg"] is not None
    assert report["full"]["catalyst_mass_kg"] is None
    assert report["full"]["outlet_conversion"] < 0.9
    assert report["design_change_percent"] is None
    assert "full" in report["design_change_basis"] and "does not reach" in report["design_change_basis"]
    isobaric = report["assumptions"]["isobaric"]
    assert isobaric["design_change_percent"] is None and "does not reach" in isobaric["design_change_basis"]


def test_ideal_gas_verdict_unknown_without_critical_constants(write_case):
    text = _bed_case().replace(LIGHT_GAS, "")
    report = check_assumptions(load_case(write_case(text)))
    entry = report["assumptions"]["ideal_gas"]
    assert entry["value"] is None and entry["verdict"] == "unknown" and entry["design_change_percent"] is None
    # names the species that lack them (A and B here; N2 is in Cantera's table), not "every species"
    assert "no critical constants for A, B" in entry["design_change_basis"]
    assert "every species" not in entry["design_change_basis"]


def test_cli_writes_assumptions_json(write_case, tmp_path):
    path = write_case(_bed_case(hf_B=-10.0, heat='mode = "adiabatic"', pressure_drop='model = "none"'))
    out = tmp_path / "out"
    assert main(["assumptions", str(path), "--out", str(out)]) == 0
    written = json.loads((out / "assumptions.json").read_text())
    direct = check_assumptions(load_case(path))
    assert set(written["assumptions"]) == set(ROWS)
    for branch in ("ideal", "full"):
        for key in NUMBERS:
            assert written[branch][key] == pytest.approx(direct[branch][key], rel=1e-12)
    assert written["design_change_percent"] == pytest.approx(direct["design_change_percent"], rel=1e-12)
    for name in NAMES:
        assert written["assumptions"][name]["verdict"] == direct["assumptions"][name]["verdict"]


def _no_inf_or_nan(tree):
    """Every number in a JSON tree is finite (json.loads turns 'Infinity' and 'NaN' into floats)."""
    if isinstance(tree, float):
        return math.isfinite(tree)
    if isinstance(tree, dict):
        return all(_no_inf_or_nan(v) for v in tree.values())
    if isinstance(tree, list):
        return all(_no_inf_or_nan(v) for v in tree)
    return True


def test_zero_activation_energy_writes_finite_json(write_case, tmp_path):
    # E = 0: the default isothermal threshold 0.1 R T^2 / E was inf, and writing assumptions.json raised
    # "Out of range float values are not JSON compliant: inf" with a traceback.
    path = write_case(_bed_case(E="0 kJ/mol", k="2 m^3/(kg*s)", heat='mode = "adiabatic"'))
    out = tmp_path / "out"
    assert main(["assumptions", str(path), "--out", str(out)]) == 0
    written = json.loads((out / "assumptions.json").read_text())
    assert _no_inf_or_nan(written)
    iso = written["assumptions"]["isothermal"]
    # without an activation energy the threshold is 0.1 T_feed (gas concentration, common practice)
    assert iso["threshold"] == pytest.approx(50.0) and "no activation energy" in iso["threshold_source"]
    assert iso["verdict"] in ("holds", "fails") and iso["level"] in ("acceptable", "review")


def test_without_a_target_the_measures_and_verdicts_still_come(write_case):
    text = _bed_case().replace("target_conversion = 0.9", "")
    report = check_assumptions(load_case(write_case(text)))
    assert report["target_conversion"] is None and report["design_change_percent"] is None
    assert report["design_change_basis"].startswith("no target given")
    assert "do not reach" not in report["design_change_basis"]
    for name in NAMES:
        entry = report["assumptions"][name]
        assert entry["verdict"] in ("holds", "fails") and entry["value"] is not None
        assert entry["design_change_basis"].startswith("no target given")
        # the effect that needs no target: the change of outlet conversion at the given length
        assert entry["outlet_conversion_change"] is not None and math.isfinite(entry["outlet_conversion_change"])
    assert report["outlet_conversion_change"] == pytest.approx(
        report["ideal"]["outlet_conversion"] - report["full"]["outlet_conversion"], abs=1e-15)
