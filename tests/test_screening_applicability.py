"""Where runaway screening applies, and one level rule for the screening's tables, summary and JSON.

Kinds of check (STYLE.md section 8): invariant only. Small packed beds of our own (custom species,
invented data) that run in milliseconds:

* a furnace-heated tube whose main reaction is endothermic, with a small exothermic side reaction:
  the reactions take up heat in net, so screening does not apply (it used to be screened, with the
  side reaction as the "dominant" one);
* a zero activation energy (gamma = 0): the rate does not rise with temperature, no thermal feedback;
* a feed beyond equilibrium: the reversible exothermic reaction runs backwards, taking up heat.

Each gives ``applicable: false`` with the reason, nothing screened, finite JSON, exit 0.
"""
import json
import math

import pytest

from simulator import load_case
from simulator.cli import main
from simulator.screening.screen import screen, screening_json


def _bed(reactions, *, feed="{ A = 0.1, N2 = 0.9 }", T_feed="500 K", T_medium="500 K", hf=(-40.0, -30.0)):
    return f'''title = "Screening applicability: packed bed of our own"

[thermo]
species_file = "gri30.yaml"

[thermo.custom.A]
molar_mass = "28 g/mol"
cp = "35 J/(mol*K)"
standard_entropy = "200 J/(mol*K)"
enthalpy_of_formation = "0 kJ/mol"

[thermo.custom.B]
molar_mass = "28 g/mol"
cp = "35 J/(mol*K)"
standard_entropy = "200 J/(mol*K)"
enthalpy_of_formation = "{hf[0]!r} kJ/mol"

[thermo.custom.C]
molar_mass = "28 g/mol"
cp = "35 J/(mol*K)"
standard_entropy = "200 J/(mol*K)"
enthalpy_of_formation = "{hf[1]!r} kJ/mol"

{reactions}

[feed]
temperature = "{T_feed}"
pressure = "5 bar"
molar_flow = "1 mol/s"
mole_fractions = {feed}

[tube]
length = "2 m"
inner_diameter = "30 mm"
count = 10

[bed]
particle_diameter = "3 mm"
void_fraction = 0.40
bulk_density = "1000 kg/m^3"

[heat]
mode = "exchange"
overall_coefficient = "150 W/(m^2*K)"

[heat.medium]
arrangement = "uniform"
temperature = "{T_medium}"

[pressure_drop]
model = "none"

[design]
key_species = "A"
'''


def _reaction(equation, k, E):
    return (f'[[reactions]]\nequation = "{equation}"\npre_exponential = "{k}"\nactivation_energy = "{E}"\n'
            f'rate_basis = "catalyst-mass"\n')


# endothermic main reaction A => B (+40 kJ/mol) and an exothermic side reaction A => C (-30 kJ/mol) at a
# tenth of its rate, heated from a 520 K feed by a 620 K medium
HEATED_COIL = _bed(_reaction("A => B", "2e3 m^3/(kg*s)", "60 kJ/mol") + _reaction("A => C", "2e2 m^3/(kg*s)",
                                                                                     "60 kJ/mol"),
                   T_feed="520 K", T_medium="620 K", hf=(40.0, -30.0))
ZERO_E = _bed(_reaction("A => B", "2 m^3/(kg*s)", "0 kJ/mol"))
BEYOND_EQUILIBRIUM = _bed(_reaction("A <=> B", "2e3 m^3/(kg*s)", "60 kJ/mol"), feed="{ A = 0.01, B = 0.2, N2 = 0.79 }",
                          hf=(-10.0, -30.0))


def _finite(tree):
    if isinstance(tree, float):
        return math.isfinite(tree)
    if isinstance(tree, dict):
        return all(_finite(v) for v in tree.values())
    if isinstance(tree, list):
        return all(_finite(v) for v in tree)
    return True


@pytest.mark.parametrize("text, words", [
    (HEATED_COIL, "take up heat in net"),
    (ZERO_E, "activation energy of 0 kJ/mol"),
    (BEYOND_EQUILIBRIUM, "take up heat in net"),
], ids=["heated-coil-with-exothermic-side-reaction", "zero-activation-energy", "feed-beyond-equilibrium"])
def test_screening_that_does_not_apply_says_so_and_screens_nothing(write_case, tmp_path, capsys, text, words):
    path = write_case(text)
    report = screen(load_case(path))
    assert report["applicable"] is False and words in report["reason"]
    assert report["reason"].endswith("runaway screening does not apply")
    assert "criteria" not in report and "critical" not in report and report["solves"] == 1
    assert report["risk"] == "not applicable" and report["risk_level"] == "acceptable"
    out = tmp_path / "out"
    assert main(["screen", str(path), "--out", str(out)]) == 0
    written = json.loads((out / "screening.json").read_text())
    assert written["applicable"] is False and _finite(written)
    printed = capsys.readouterr().out
    assert "runaway screening does not apply" in printed and "_inert" not in printed


def test_heated_coil_heat_balance_in_the_reason(write_case):
    report = screen(load_case(write_case(HEATED_COIL)))
    a = report["applicability"]
    assert a["net_heat_release_W"] < 0 < a["wall_duty_W"]
    by = a["heat_release_by_reaction_W"]
    assert by["A => B"] < 0 < by["A => C"] and abs(by["A => C"]) < abs(by["A => B"])
    assert a["largest_rise_above_medium_K"] < 0
    assert "the medium is hotter than the gas all along the tube" in report["reason"]


def test_net_exothermic_tube_is_screened_with_levels_everywhere(write_case):
    report = screening_json(screen(load_case(write_case(_bed(_reaction("A => B", "2e3 m^3/(kg*s)",
                                                                                "60 kJ/mol"))))))
    assert report["applicable"] is True and report["applicability"]["net_heat_release_W"] > 0
    for entry in report["criteria"].values():
        assert entry["level"] in ("acceptable", "review", "unacceptable")
    for entry in report["critical"].values():
        assert entry["level"] in ("acceptable", "review", "unacceptable")
    assert report["hot_spot"]["level"] in ("acceptable", "review", "unacceptable") and report["hot_spot"]["reason"]
    assert "barkelew" in report["criteria"] and "barkelew1959" in report["references"]
    assert "_inert" not in json.dumps(report) and _finite(report)


def test_screen_where_every_evaluation_fails_writes_null_not_nan(cases_dir, tmp_path):
    # found by fuzzing: the hydrogenation demo at a feed pressure of 1 Pa made screening.json carry NaN
    # ("Out of range float values are not JSON compliant: nan", traceback)
    # (the loader now refuses 1 Pa as a design input, so the pressure is set after loading)
    import dataclasses

    case = load_case(cases_dir / "hydrogenation_cooled_packed_bed.toml")
    case = dataclasses.replace(case, feed=dataclasses.replace(case.feed, pressure=1.0))
    written = json.loads(json.dumps(screening_json(screen(case)), allow_nan=False))
    assert _finite(written)
    if written["applicable"]:
        # nothing could be evaluated: the tool says so (review), it does not claim a margin
        assert written["risk_level"] != "acceptable"


def test_dominant_reaction_without_the_key_species_gives_undefined_groups_not_a_crash(write_case):
    # C => B releases most of the heat but does not consume the key species A: its B, N, psi are not
    # defined for A. The Semenov verdict was called with psi = NaN and raised ValueError.
    text = _bed(_reaction("A => B", "2e3 m^3/(kg*s)", "60 kJ/mol") + _reaction("C => B", "2e3 m^3/(kg*s)",
                                                                                "60 kJ/mol"),
                feed="{ A = 0.02, C = 0.05, N2 = 0.93 }", hf=(-40.0, 20.0))
    report = screening_json(screen(load_case(write_case(text))))
    assert report["applicable"] and report["groups"]["reaction"] == "C => B"
    assert report["groups"]["psi"] is None and "not consumed" in report["groups"]["note"]
    assert report["criteria"]["semenov"]["verdict"] == "undecided"
    assert report["criteria"]["barkelew"]["verdict"] == "undecided"
    assert _finite(report)


@pytest.mark.parametrize("E, words", [("-50 kJ/mol", "does not rise with temperature"),
                                      ("1e-300 J/mol", "<= 4"),
                                      ("10 kJ/mol", "<= 4")],
                         ids=["negative", "denormal", "gamma-below-4"])
def test_low_or_negative_activation_energy_is_not_screened(write_case, E, words):
    # found by fuzzing: E = -50 kJ/mol made the Semenov verdict raise (psi < 0); E = 1e-300 J/mol made the
    # maxima-curve temperature raise (E <= 4 R Tc); gamma = 10e3 / (R 500 K) = 2.4 has no critical point
    report = screen(load_case(write_case(_bed(_reaction("A => B", "2e3 m^3/(kg*s)", E)))))
    assert report["applicable"] is False and words in report["reason"]
    assert _finite(screening_json(report))


def test_report_words_for_a_tube_screening_does_not_apply_to(write_case):
    from simulator import simulate
    from simulator.report.build import _screening
    from simulator.report.context import build_context

    flags = {}
    for name, text in (("heated", HEATED_COIL), ("low-gamma", _bed(_reaction("A => B", "2e3 m^3/(kg*s)",
                                                                                "10 kJ/mol")))):
        case = load_case(write_case(text, name=f"{name}.toml"))
        screening, reason = _screening(case)
        assert screening is None and reason.endswith("runaway screening does not apply")
        context = build_context(case, simulate(case), None, None, screening_reason=reason)
        flags[name] = {f["label"]: f for f in context["summary"]["flags"]}
        assert flags[name]["Runaway risk"]["level"] == "acceptable"
        assert flags[name]["Runaway risk"]["text"].startswith("Not applicable")
    # heat taken up in net: no reaction hot spot; an exothermic tube with a slow-rising rate still has one
    assert flags["heated"]["Hot spot"]["text"].startswith("No reaction hot spot")
    assert flags["low-gamma"]["Hot spot"]["text"].startswith("Hot spot")
