"""2-D runs through case files: keys, Graetz-type series, 1-D limit, closure, CLI columns, the
one_dimensional assumption row and the refusals."""
import csv
import json
import math
import tomllib

import numpy as np
import pytest
from test_radial import _graetz_exact

from simulator.case.load import load_case, load_case_dict
from simulator.case.radial_keys import MAX_RADIAL_POINTS as CASE_MAX
from simulator.cli import main
from simulator.errors import CaseError
from simulator.model.radial import MAX_RADIAL_POINTS as MODEL_MAX, lumped_coefficient
from simulator.solve.checks import CLOSURE_LIMITS
from simulator.solve.integrate import simulate

DEMO = "wide_tube_partial_oxidation.toml"
#: the demo's outside coefficient for model.radial = "2d": 1/65 = 1/150 + 0.0225/(4 * 0.9) + 1/U_o
DEMO_OUTSIDE = 1.0 / (1.0 / 65.0 - 1.0 / 150.0 - 0.0225 / 3.6)


def _raw(cases_dir, name=DEMO):
    return tomllib.loads((cases_dir / name).read_text())


def _two_d(raw, outside=DEMO_OUTSIDE):
    raw["model"] = {"radial": "2d"}
    raw["heat"]["overall_coefficient"] = f"{outside!r} W/(m^2*K)"
    return raw


def _demo_text_2d(cases_dir, drop_limit=True):
    """The demo case file as text, switched to model.radial = "2d" with the outside coefficient."""
    text = (cases_dir / DEMO).read_text()
    text = text.replace('[model]\nradial = "1d"', '[model]\nradial = "2d"').replace(
        'overall_coefficient = "65 W/(m^2*K)"', f'overall_coefficient = "{DEMO_OUTSIDE!r} W/(m^2*K)"')
    assert 'radial = "2d"' in text and repr(DEMO_OUTSIDE) in text
    return text.replace('temperature_limit = "800 K"\n', "") if drop_limit else text


def test_case_and_model_agree_on_the_point_cap():
    # invariant: the loader refuses exactly what the model cannot take
    assert CASE_MAX == MODEL_MAX


# ------------------------------------------------------------------ Graetz-type series (no reaction)
R_TUBE = 0.025          # [m]
LAMBDA = 1.0            # [W/(m*K)]
CP = 29.24416           # [J/(mol*K)]
T_FEED, T_MEDIUM = 700.0, 600.0


def _graetz_case(Bi, zeta_end, points=5, output_points=31):
    """No heat of reaction, negligible rate: the 2-D tube is plug-flow cooling with a Robin wall."""
    h_eff = Bi * LAMBDA / R_TUBE
    h_w = U_o = 2.0 * h_eff                       # 1/h_eff = 1/h_w + 1/U_o
    flow = 1.0                                    # [mol/s]
    length = zeta_end * flow * CP / (math.pi * LAMBDA)   # zeta = lambda z A / (F cp R^2)
    species = "".join(f'[thermo.custom.{s}]\nmolar_mass = "29.48 g/mol"\ncp = "{CP} J/(mol*K)"\n'
                      f'enthalpy_of_formation = "0 kJ/mol"\n' for s in ("A", "B"))
    return f"""title = "Graetz-type cooling"
{species}
[[reactions]]
equation = "A => B"
pre_exponential = "1e-20 1/s"
activation_energy = "0 kJ/mol"
orders = {{ A = 1 }}
[feed]
temperature = "{T_FEED} K"
pressure = "10 bar"
molar_flow = "{flow} mol/s"
mole_fractions = {{ A = 0.5, B = 0.5 }}
[tube]
length = "{length!r} m"
inner_diameter = "{2 * R_TUBE} m"
[bed]
particle_diameter = "5 mm"
void_fraction = 0.4
bulk_density = "1000 kg/m^3"
radial_conductivity = "{LAMBDA} W/(m*K)"
radial_diffusivity = "1e-4 m^2/s"
wall_coefficient = "{h_w!r} W/(m^2*K)"
[model]
radial = "2d"
radial_points = {points}
[heat]
mode = "exchange"
overall_coefficient = "{U_o!r} W/(m^2*K)"
[heat.medium]
temperature = "{T_MEDIUM} K"
[design]
key_species = "A"
[solver]
rtol = 1e-11
atol_scale = 1e-13
output_points = {output_points}
"""


@pytest.mark.published("carslaw_jaeger1959", "series for the cylinder with a surface condition (chapter from memory)")
@pytest.mark.parametrize("Bi,points,tol", [(1.0, 8, 1e-5), (5.0, 8, 1e-5), (20.0, 8, 1e-5), (5.0, 5, 1e-4)])
def test_graetz_series_through_a_case_file(write_case, Bi, points, tol):
    # Source: the series solution of plug-flow cooling of a cylinder with a wall (Robin) condition,
    # theta = sum 2 Bi J0(beta x) / ((beta^2 + Bi^2) J0(beta)) exp(-beta^2 zeta), beta J1(beta) = Bi J0(beta),
    # cup mean sum 4 Bi^2 / (beta^2 (beta^2 + Bi^2)) exp(-beta^2 zeta) (H.S. Carslaw, J.C. Jaeger, Conduction of
    # Heat in Solids, 2nd ed., Oxford, 1959, ch. 7; from memory), zeta = lambda_er z / (G cp R^2).
    # Tolerance: the collocation error at zeta >= 0.1: below 3e-6 with 8 points, about 3e-5 with 5
    # (Gauss-Legendre points in u = x^2), with a margin of 3.
    result = simulate(load_case(write_case(_graetz_case(Bi, 0.3, points))))
    assert result.status == "completed"
    prof = result.extra["radial_profiles"]
    zeta = np.linspace(0.0, 0.3, 31)
    for k in (10, 20, 30):                       # zeta = 0.1, 0.2, 0.3
        centre, mean = _graetz_exact(Bi, zeta[k])
        assert (prof.T_centre[k] - T_MEDIUM) / (T_FEED - T_MEDIUM) == pytest.approx(centre, abs=tol)
        assert (prof.T_cup[k] - T_MEDIUM) / (T_FEED - T_MEDIUM) == pytest.approx(mean, abs=tol)
    # no reaction heat: the axis stays at the feed temperature in the entrance region; a maximum the
    # polynomial puts above it there is flagged as indicative, never passed off as a hot spot
    if result.hot_spot["rise_above_feed_K"] > tol * (T_FEED - T_MEDIUM):
        assert any("entrance region of the 2-D model" in w for w in result.warnings)


# ------------------------------------------------------------------ 1-D limit
@pytest.mark.published("froment_bischoff1990", "ch. 11, lumped U of the 2-D model (from memory)")
def test_large_conductivity_and_wall_coefficient_equal_the_lumped_one_dimensional_tube(cases_dir):
    # limit: 1/U = 1/h_w + R/(4 lambda_er) + 1/U_o (G.F. Froment, K.B. Bischoff, Chemical Reactor Analysis
    # and Design, 2nd ed., Wiley, 1990, ch. 11; from memory): with lambda_er and h_w large the wall Biot
    # number is 1e-3, the radial profile flat to about Bi/8 of the rise, and the 2-D tube is the 1-D one
    raw = _raw(cases_dir, "froment1967_oxylene_packed_tube.toml")
    raw["bed"].update(radial_conductivity="1000 W/(m*K)", radial_diffusivity="1 m^2/s",
                      wall_coefficient="1e5 W/(m^2*K)")
    raw["model"] = {"radial": "2d"}
    two = simulate(load_case_dict(raw, "froment2d.toml", str(cases_dir)))
    U = lumped_coefficient(1e5, 1000.0, 0.0127, 96.0)
    raw1 = _raw(cases_dir, "froment1967_oxylene_packed_tube.toml")
    raw1["heat"]["overall_coefficient"] = f"{U!r} W/(m^2*K)"
    one = simulate(load_case_dict(raw1, "froment1d.toml", str(cases_dir)))
    assert two.status == one.status == "completed"
    rise_1d = one.hot_spot["rise_above_medium_K"]
    assert two.hot_spot["rise_above_medium_K"] == pytest.approx(rise_1d, rel=2e-3)
    assert two.summary()["cup_mixing_hot_spot"]["rise_above_medium_K"] == pytest.approx(rise_1d, rel=2e-3)
    assert two.outlet_conversion == pytest.approx(one.outlet_conversion, rel=1e-3)


# ------------------------------------------------------------------ closure and the run's outputs
@pytest.fixture(scope="module")
def demo_2d_result():
    from pathlib import Path

    cases = Path(__file__).resolve().parents[1] / "cases"
    return simulate(load_case_dict(_two_d(_raw(cases)), "demo2d.toml", str(cases)))


def test_two_dimensional_run_closes_elements_and_energy(demo_2d_result):
    # invariant: the cup-mixing flows carry the Gauss-weighted means, exact for the collocation polynomial
    r = demo_2d_result
    assert r.status == "stopped"          # the 2-D centre line reaches the demo's 800 K limit
    assert r.closure["elements_relative"] < CLOSURE_LIMITS["elements_relative"]
    assert r.closure["energy_relative"] < CLOSURE_LIMITS["energy_relative"]
    assert "temperature_limit" in r.events
    assert r.events["temperature_limit"]["temperature_K"] == pytest.approx(800.0, abs=1e-6)


def test_co_current_medium_and_ergun_pressure_drop_in_two_dimensions(cases_dir):
    # invariants: closure with a flowing medium (its enthalpy gain enters the balance) and a pressure
    # drop that follows the 1-D law on the cup-mixing state (same tube with the lumped U: the pressure
    # drop depends on the temperatures only through the gas density, so it agrees closely)
    medium = {"arrangement": "co-current", "temperature": "420 K", "mass_flow": "50 kg/s", "cp": "2 kJ/(kg*K)"}
    raw = _raw(cases_dir, "hydrogenation_cooled_packed_bed.toml")
    raw["model"] = {"radial": "2d"}
    raw["heat"]["overall_coefficient"] = "1028 W/(m^2*K)"
    raw["heat"]["medium"] = dict(medium)
    two = simulate(load_case_dict(raw, "h2d.toml", str(cases_dir)))
    raw1 = _raw(cases_dir, "hydrogenation_cooled_packed_bed.toml")
    raw1["heat"]["overall_coefficient"] = f"{lumped_coefficient(400.0, 1.5, 0.0125, 1028.0)!r} W/(m^2*K)"
    raw1["heat"]["medium"] = dict(medium)
    one = simulate(load_case_dict(raw1, "h1d.toml", str(cases_dir)))
    assert two.status == one.status == "completed"
    assert two.closure["elements_relative"] < CLOSURE_LIMITS["elements_relative"]
    assert two.closure["energy_relative"] < CLOSURE_LIMITS["energy_relative"]
    assert two.P[0] - two.P[-1] == pytest.approx(one.P[0] - one.P[-1], rel=1e-3)
    assert two.Tc[-1] > two.Tc[0]                      # the co-current medium is heated along the tube


def test_centre_line_is_hotter_than_cup_mixing_and_wall(demo_2d_result):
    # invariant of a cooled exothermic tube before the hot spot: axis > cup-mixing mean > bed at the wall
    p = demo_2d_result.extra["radial_profiles"]
    inner = slice(1, len(p.z))
    assert np.all(p.T_centre[inner] > p.T_cup[inner])
    assert np.all(p.T_cup[inner] > p.T_wall[inner])
    assert np.all(p.T_wall[inner] > 625.0)


def test_cli_run_writes_the_radial_columns_and_blocks(cases_dir, tmp_path):
    path = tmp_path / "wide2d.toml"
    path.write_text(_demo_text_2d(cases_dir))
    assert main(["run", str(path), "--out", str(tmp_path / "out")]) == 0
    with open(tmp_path / "out" / "profile.csv") as f:
        rows = list(csv.DictReader(f))
    for column in ("centre_line_temperature_K", "cup_mixing_temperature_K", "bed_wall_temperature_K"):
        assert column in rows[0]
    summary = json.loads((tmp_path / "out" / "summary.json").read_text())
    T_centre = np.array([float(r["centre_line_temperature_K"]) for r in rows])
    T = np.array([float(r["temperature_K"]) for r in rows])
    # temperature_K is the cup-mixing temperature; the hot spot is the centre line's, refined between points
    assert np.allclose(T, [float(r["cup_mixing_temperature_K"]) for r in rows])
    assert summary["hot_spot"]["temperature_K"] >= T_centre.max() - 1e-9
    assert summary["hot_spot"]["temperature_K"] < T_centre.max() + 0.5
    assert summary["cup_mixing_hot_spot"]["temperature_K"] < summary["hot_spot"]["temperature_K"]
    assert summary["outlet"]["temperature_K"] == pytest.approx(T[-1])
    assert summary["radial_model"]["points"] == 5
    assert summary["radial_model"]["wall_to_medium_coefficient_W_per_m2_K"] == pytest.approx(
        1.0 / (1.0 / 150.0 + 1.0 / DEMO_OUTSIDE))
    assert "villadsen_stewart1967" in summary["references"]


def test_failed_two_dimensional_run_is_reported_as_failed(cases_dir):
    # a feed far past runaway without a temperature limit: the reactant vanishes at the hot points
    # faster than the collocation polynomial can follow, a point's flow goes negative; the run must
    # say so (status, where, why) and the summary must carry no result-looking numbers
    raw = _two_d(_raw(cases_dir))
    raw["design"].pop("temperature_limit")
    raw["feed"]["mole_fractions"] = {"OX": 0.03, "AIR": 0.97}
    result = simulate(load_case_dict(raw, "runaway2d.toml", str(cases_dir)))
    summary = result.summary()
    assert result.status == "failed"
    assert "2-D model" in result.termination and "z = " in result.termination
    assert summary["outlet"]["conversion"] is None and summary["hot_spot"]["temperature_K"] is None
    assert "cup_mixing_hot_spot" not in summary


def test_two_dimensional_run_keeps_the_step_budget_of_a_run(cases_dir):
    # a max_step that cannot fit the run's budget is refused before integrating, as for a 1-D run
    raw = _two_d(_raw(cases_dir))
    raw["solver"]["max_step"] = "4e-5 m"            # 75 000 steps: accepted, past the budget
    result = simulate(load_case_dict(raw, "budget2d.toml", str(cases_dir)))
    assert result.status == "failed" and "not integrated" in result.termination
    assert "solver.max_step" in result.termination


# ------------------------------------------------------------------ the assumption row
def test_demo_one_dimensional_holds_but_the_radial_row_asks_for_review(cases_dir):
    from simulator.assumptions import check_assumptions

    case = load_case(cases_dir / DEMO)
    report = check_assumptions(case)
    full = report["full_summary"]
    # the 1-D design holds: completed, hot spot below the temperature limit
    assert full["status"] == "completed"
    assert full["hot_spot"]["temperature_K"] < case.design.temperature_limit
    row = report["assumptions"]["one_dimensional"]
    assert row["verdict"] == "fails" and row["level"] == "review"
    assert row["value"] > row["threshold"]
    d = row["details"]
    assert d["centre_line_rise_2d_K"] > d["rise_1d_K"]
    assert row["value"] == pytest.approx(1.0 - d["rise_1d_K"] / d["centre_line_rise_2d_K"])
    assert d["above_temperature_limit"] == ["2-D"]
    assert d["tube_to_particle_ratio"] == pytest.approx(9.0)
    assert d["mears_radial_value"] > 0 and d["mears_radial_limit"] > 0
    assert row["design_change_percent"] is not None


def test_row_is_the_same_whichever_model_the_case_runs(cases_dir):
    # invariant: "1d" with U_1D and "2d" with the U_o of the same lumping describe one tube, so the row
    # compares the same two models either way
    from simulator.assumptions import _change, _conversion_change, _numbers
    from simulator.radial_assumption import one_dimensional_entry

    rows = []
    for raw in (_raw(cases_dir), _two_d(_raw(cases_dir))):
        case = load_case_dict(raw, "row.toml", str(cases_dir))
        rows.append(one_dimensional_entry(case, simulate(case), _numbers, _change, _conversion_change))
    assert rows[1]["details"]["lumped_coefficient_W_per_m2_K"] == pytest.approx(65.0, rel=1e-12)
    assert rows[1]["value"] == pytest.approx(rows[0]["value"], rel=1e-6)
    assert rows[1]["design_change_percent"] == pytest.approx(rows[0]["design_change_percent"], rel=1e-6)


def test_row_without_radial_parameters_says_it_cannot_answer(cases_dir):
    from simulator.assumptions import _change, _conversion_change, _numbers
    from simulator.radial_assumption import one_dimensional_entry

    case = load_case(cases_dir / "froment1967_oxylene_packed_tube.toml")
    row = one_dimensional_entry(case, simulate(case), _numbers, _change, _conversion_change)
    assert row["value"] is None and row["verdict"] == "unknown" and row["level"] == "review"
    assert "radial_conductivity" in row["design_change_basis"]


def test_validate_notes_what_the_row_needs(cases_dir, capsys):
    from simulator.readiness import check_case

    notes = check_case(cases_dir / "froment1967_oxylene_packed_tube.toml").notes
    assert any("one_dimensional row needs [bed] radial_conductivity" in n for n in notes)
    assert not any("one_dimensional" in n for n in check_case(cases_dir / DEMO).notes)


def test_row_of_an_adiabatic_bed_does_not_apply(cases_dir):
    from simulator.radial_assumption import applies

    raw = _raw(cases_dir, "froment1967_oxylene_packed_tube.toml")
    raw["heat"] = {"mode": "adiabatic"}
    assert "no heat crosses the wall" in applies(load_case_dict(raw, "a.toml", str(cases_dir)))


# ------------------------------------------------------------------ refusals
@pytest.mark.parametrize("change,match", [
    (lambda r: r["model"].update(radial_points=12), r"model\.radial_points = 12: must be a whole number from 1 to 8"),
    (lambda r: r["model"].update(radial_points=2.5), r"model\.radial_points = 2\.5"),
    (lambda r: r["model"].update(radial="3d"), r"model\.radial = '3d': unknown; choose one of: 1d, 2d"),
    (lambda r: r["model"].update(radial_count=3), r"model\.radial_count: unknown key"),
    (lambda r: r["bed"].pop("wall_coefficient"), r'bed\.wall_coefficient: missing; model\.radial = "2d" needs it'),
    (lambda r: r["heat"]["medium"].update(arrangement="counter-current", mass_flow="1 kg/s", cp="1 kJ/(kg*K)"),
     r"heat\.medium\.arrangement = 'counter-current': the 2-D model .* is not built"),
    (lambda r: r.update(heat={"mode": "adiabatic"}), r"heat\.mode = 'adiabatic': model\.radial = \"2d\" needs heat"),
    (lambda r: r["bed"].update(radial_conductivity="-1 W/(m*K)"),
     r"bed\.radial_conductivity = '-1 W/\(m\*K\)': must be > 0"),
    (lambda r: r["bed"].update(radial_diffusivity="1e6 m^2/s"), r"bed\.radial_diffusivity = '1e6 m\^2/s'"),
])
def test_bad_radial_keys_are_refused_in_one_line(cases_dir, change, match):
    raw = _two_d(_raw(cases_dir))
    change(raw)
    with pytest.raises(CaseError, match=match) as err:
        load_case_dict(raw, "bad.toml", str(cases_dir))
    assert len(err.value.problems) == 1          # one line, naming the field


def test_radial_keys_with_the_wrong_dimension_name_the_field(cases_dir):
    raw = _raw(cases_dir)
    raw["bed"]["radial_conductivity"] = "0.9 W/(m^2*K)"
    with pytest.raises(CaseError, match=r"bed\.radial_conductivity.*wrong dimension"):
        load_case_dict(raw, "bad.toml", str(cases_dir))


def test_two_d_without_a_bed_and_points_without_two_d_are_refused(cases_dir):
    raw = _raw(cases_dir)
    raw["model"]["radial_points"] = 4              # radial = "1d"
    with pytest.raises(CaseError, match=r'model\.radial_points = 4 given but model\.radial = "1d" ignores it'):
        load_case_dict(raw, "bad.toml", str(cases_dir))
    raw = _raw(cases_dir, "decomposition_empty_tube.toml")
    raw["model"] = {"radial": "2d"}
    with pytest.raises(CaseError, match=r'model\.radial = "2d": needs a packed bed'):
        load_case_dict(raw, "bad.toml", str(cases_dir))


def test_cli_refuses_a_bad_radial_key_with_exit_2_and_one_line(cases_dir, tmp_path, capsys):
    path = tmp_path / "bad.toml"
    path.write_text(_demo_text_2d(cases_dir).replace('[model]\n', '[model]\nradial_points = 9\n'))
    assert main(["run", str(path), "--out", str(tmp_path / "out")]) == 2
    err = capsys.readouterr().err
    assert "model.radial_points = 9" in err and "Traceback" not in err
    assert not (tmp_path / "out" / "summary.json").exists()
