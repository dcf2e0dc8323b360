"""Sizing: length for the given tube count, smallest tube count for the given length.

Kinds of check (STYLE.md section 8): invariant only. Each answer of
``simulator.sizing.size`` is checked against direct ``simulate`` runs of case
files written here with the answer (and the answer minus one tube): the length
is the target-crossing position of a longer tube; the count meets every
requirement and one tube fewer does not; the requirement that decides is named.

The case is a small cooled packed bed (custom A => B in N2, invented data) that
runs in milliseconds.
"""
import json

import pytest

from simulator import load_case, simulate
from simulator.cli import main
from simulator.sizing import size

TARGET = 0.9


def _case(length="2 m", count=10, extra="", solver=""):
    return f'''title = "Sizing: cooled packed bed, A => B"

[thermo]
species_file = "gri30.yaml"

[thermo.custom.A]
molar_mass = "28 g/mol"
cp = "35 J/(mol*K)"
enthalpy_of_formation = "0 kJ/mol"

[thermo.custom.B]
molar_mass = "28 g/mol"
cp = "35 J/(mol*K)"
enthalpy_of_formation = "-40 kJ/mol"

[[reactions]]
equation = "A => B"
pre_exponential = "2e3 m^3/(kg*s)"
activation_energy = "60 kJ/mol"
rate_basis = "catalyst-mass"

[feed]
temperature = "500 K"
pressure = "5 bar"
molar_flow = "1 mol/s"
mole_fractions = {{ A = 0.1, N2 = 0.9 }}

[tube]
length = "{length}"
inner_diameter = "30 mm"
count = {count}

[bed]
particle_diameter = "3 mm"
void_fraction = 0.40
bulk_density = "1000 kg/m^3"

[heat]
mode = "exchange"
overall_coefficient = "150 W/(m^2*K)"

[heat.medium]
arrangement = "uniform"
temperature = "500 K"

[pressure_drop]
model = "ergun"
viscosity = "2.5e-5 Pa*s"

[design]
key_species = "A"
target_conversion = {TARGET!r}
{extra}
{solver}'''


def _run(write_case, name, **fields):
    return simulate(load_case(write_case(_case(**fields), name=name)))


def _drop_at_target(write_case, name, count, **fields):
    """Pressure drop from the inlet to the target crossing of a direct run, [Pa] (None: not reached)."""
    full = _run(write_case, name, count=count, **fields)
    z = full.design["length_m"]
    if z is None:
        return None
    upto = simulate(full.case, length=z)
    return float(upto.P[0] - upto.P[-1])


def test_length_for_count_is_the_target_crossing_of_a_longer_tube(write_case):
    # The given 1 m tube is too short (about 1.8 m is needed): sizing must extend it and find the crossing.
    report = size(load_case(write_case(_case(length="1 m"))))
    a = report["length_for_given_count"]
    assert a["feasible"] and a["design"]["tube_length_m"] > 1.0 and a["design"]["tube_count"] == 10
    assert a["binding_constraint"] == "target_conversion"
    direct = _run(write_case, "long.toml", length="8 m")
    assert direct.design["reached"]
    # Both are located events on solver trajectories with rtol 1e-8: agreement far inside 1e-6.
    assert a["design"]["tube_length_m"] == pytest.approx(direct.design["length_m"], rel=1e-6)


def test_tube_count_is_the_smallest_that_reaches_the_target(write_case):
    report = size(load_case(write_case(_case())))
    b = report["count_for_given_length"]
    n = b["design"]["tube_count"]
    assert b["feasible"] and n > 1 and b["design"]["tube_length_m"] == 2.0
    assert b["binding_constraint"] == "target_conversion"
    assert _run(write_case, "n.toml", count=n).design["reached"]
    assert not _run(write_case, "n_minus_1.toml", count=n - 1).design["reached"]


def test_max_pressure_drop_binds_when_tight(write_case):
    extra = 'max_pressure_drop = "0.2 bar"'
    report = size(load_case(write_case(_case(extra=extra))))
    n = report["count_for_given_length"]["design"]["tube_count"]
    assert report["count_for_given_length"]["binding_constraint"] == "max_pressure_drop"
    # The tube keeps its length in (b), so the drop over the whole tube counts: with n tubes it is within
    # 0.2 bar, with n - 1 the target is still reached (so the target does not decide) but the drop is not.
    n_run = _run(write_case, "n.toml", count=n)
    below = _run(write_case, "n_minus_1.toml", count=n - 1)
    assert n_run.P[0] - n_run.P[-1] <= 0.2e5
    assert below.design["reached"] and below.P[0] - below.P[-1] > 0.2e5
    # with the case's 10 tubes no length works: the drop is too large before the target is reached
    a = report["length_for_given_count"]
    assert not a["feasible"] and a["design"] is None and a["binding_constraint"] == "max_pressure_drop"


def test_temperature_limit_binds_when_tight(write_case):
    # The hot spot of this bed is about 526 K for every tube count that reaches the target: the
    # balances depend on z only through z / (flow per tube), except for the small pressure drop.
    # A 521 K limit therefore cannot be met by any length or count.
    limit = 521.0
    for count in (10, 100, 1000):
        hot = _run(write_case, f"hot{count}.toml", count=count, solver="[solver]\noutput_points = 20001")
        assert hot.design["reached"] and hot.hot_spot["temperature_K"] > limit + 4.0
    report = size(load_case(write_case(_case(extra=f'temperature_limit = "{limit!r} K"'))))
    a = report["length_for_given_count"]
    assert a["design"] is None and a["binding_constraint"] == "temperature_limit"
    # Any count claimed feasible must really keep the hot spot (located on a fine grid) below the limit.
    b = report["count_for_given_length"]
    if b["design"] is not None:
        n = b["design"]["tube_count"]
        check = _run(write_case, "claimed.toml", count=n, solver="[solver]\noutput_points = 20001")
        assert check.hot_spot["temperature_K"] < limit, (
            f"sizing claims {n} tubes meet temperature_limit {limit} K, but the hot spot of that design is "
            f"{check.hot_spot['temperature_K']:.2f} K at z = {check.hot_spot['position_m']:.4g} m")
    assert b["design"] is None and not b["feasible"]
    assert b["binding_constraint"] == "temperature_limit"


def test_cli_writes_sizing_json(write_case, tmp_path):
    path = write_case(_case())
    out = tmp_path / "out"
    assert main(["size", str(path), "--out", str(out)]) == 0
    written = json.loads((out / "sizing.json").read_text())
    assert {"length_for_given_count", "count_for_given_length", "candidates"} <= set(written)
    # the two answers are kept apart: nothing of either sits at the top level, where the length of (a)
    # and the count of (b) would read as one design that does not reach the target
    assert not {"length_m", "tube_count", "binding_constraint"} & set(written)
    direct = size(load_case(path))
    for part in ("length_for_given_count", "count_for_given_length"):
        assert written[part]["design"]["tube_count"] == direct[part]["design"]["tube_count"]
        assert written[part]["design"]["tube_length_m"] == pytest.approx(direct[part]["design"]["tube_length_m"],
                                                                          rel=1e-12)
        assert written[part]["binding_constraint"] == direct[part]["binding_constraint"]
    assert len(written["candidates"]) == len(direct["candidates"]) > 0


def test_a_tube_that_cannot_pass_the_feed_is_not_feasible(write_case):
    # a tube count so small that the pressure falls to the floor inside the tube: infeasible even
    # without a max_pressure_drop, and named as the binding requirement when it decides the count
    from simulator.sizing import _evaluate, _with

    case = load_case(write_case(_case()))
    few = _evaluate(_with(case, count=1), "count for the given length")   # one tube: pressure floor at ~0.4 m
    assert few["status"] == "stopped" and not few["meets"]["tube_carries_feed"] and not few["feasible"]
    report = size(case)
    n = report["count_for_given_length"]["design"]["tube_count"]
    assert _run(write_case, "n.toml", count=n).status == "completed"


def _heated(limit=None):
    """The sizing bed made endothermic (B 20 kJ/mol above A) and heated by a 620 K medium from a 560 K feed."""
    text = (_case(count=10).replace('enthalpy_of_formation = "-40 kJ/mol"', 'enthalpy_of_formation = "20 kJ/mol"')
            .replace('temperature = "500 K"\n\n[pressure_drop]', 'temperature = "620 K"\n\n[pressure_drop]')
            .replace('temperature = "500 K"\npressure', 'temperature = "560 K"\npressure'))
    if limit:
        text = text.replace("target_conversion = 0.9", f'target_conversion = 0.9\ntemperature_limit = "{limit}"')
    return text


def test_tube_count_search_goes_down_when_fewer_tubes_work(write_case):
    # Heated tube: with the case's 10 tubes the gas comes within 0.03 K of the 620 K medium, above a
    # 619 K limit; fewer tubes (more flow per tube, less heat per mole) stay below it, and 4 or fewer
    # cannot pass the feed. The search only went upwards before ("no count up to 40960").
    report = size(load_case(write_case(_heated("619 K"))))
    b = report["count_for_given_length"]
    assert b["feasible"], b["note"]
    n = b["design"]["tube_count"]
    assert n < 10
    fine = "[solver]\noutput_points = 20001"
    at_n = simulate(load_case(write_case(_heated("619 K").replace("count = 10", f"count = {n}") + fine,
                                         name="n.toml")))
    assert at_n.status == "completed" and at_n.design["reached"] and at_n.hot_spot["temperature_K"] < 619.0
    fewer = simulate(load_case(write_case(_heated("619 K").replace("count = 10", f"count = {n - 1}"),
                                          name="n_minus_1.toml")))
    assert fewer.status != "completed" or not fewer.design["reached"] or fewer.P.min() < 0.02 * fewer.P[0]
    assert b["binding_constraint"] in ("target_conversion", "tube_carries_feed")


def test_no_tube_count_works_says_which_requirements_collide(write_case):
    # 605 K limit: the counts that pass the feed and reach the target (5 or more) all heat the gas above
    # the limit (4 or fewer stay below it): no whole number of tubes works, and the note says why.
    report = size(load_case(write_case(_heated("605 K"))))
    b = report["count_for_given_length"]
    assert not b["feasible"] and b["design"] is None
    assert "temperature_limit allows at most 4 tubes" in b["note"]
    assert "need at least 5 tubes" in b["note"]
    counts = {c["tube_count"]: c for c in report["candidates"] if c["kind"] == "count for the given length"}
    assert not counts[4]["meets"]["target_conversion"] and not counts[5]["meets"]["temperature_limit"]


def test_each_answer_is_a_complete_design_a_rerun_reproduces(write_case):
    report = size(load_case(write_case(_case(length="1 m"))))
    for part in ("length_for_given_count", "count_for_given_length"):
        d = report[part]["design"]
        assert set(d) >= {"tube_count", "tube_length_m", "outlet_conversion", "pressure_drop_Pa", "hot_spot_K"}
        text = _case(length=f"{d['tube_length_m']!r} m", count=d["tube_count"])
        again = simulate(load_case(write_case(text, name=f"{part}.toml")))
        # the same model and solver on the same tube: agreement to the solver's rtol
        assert again.outlet_conversion == pytest.approx(d["outlet_conversion"], rel=1e-9)
        assert float(again.P[0] - again.P.min()) == pytest.approx(d["pressure_drop_Pa"], rel=1e-9)
        assert again.outlet_conversion >= TARGET - 1e-6
    # (a) ends at the target crossing: its conversion is the target
    assert report["length_for_given_count"]["design"]["outlet_conversion"] == pytest.approx(TARGET, abs=1e-6)


def test_sizing_json_is_finite_and_the_table_says_not_computed(write_case, monkeypatch):
    # a candidate whose hot spot could not be located (NaN) must give null in sizing.json, not NaN
    # (json refuses NaN: the file was lost with a traceback), and "not computed" in the table
    import simulator.sizing as sizing
    from simulator.sizing import format_sizing

    real = sizing._evaluate

    def no_hot_spot(case, kind):
        cand = real(case, kind)
        return dict(cand, hot_spot_K=float("nan"))

    monkeypatch.setattr(sizing, "_evaluate", no_hot_spot)
    report = size(load_case(write_case(_case())))
    json.dumps(report, allow_nan=False)
    assert report["count_for_given_length"]["design"]["hot_spot_K"] is None
    assert "hot spot not computed" in format_sizing(report)


def test_design_volume_and_catalyst_are_the_installed_ones(write_case):
    # (a) ends at the target, so its installed volume is the volume to the target of a direct run
    import math

    report = size(load_case(write_case(_case(length="1 m"))))
    for part in ("length_for_given_count", "count_for_given_length"):
        d = report[part]["design"]
        volume = d["tube_count"] * math.pi / 4 * 0.030 ** 2 * d["tube_length_m"]
        assert d["volume_m3"] == pytest.approx(volume, rel=1e-12)
        assert d["catalyst_mass_kg"] == pytest.approx(1000.0 * volume, rel=1e-12)
    a = report["length_for_given_count"]["design"]
    direct = _run(write_case, "long.toml", length="8 m")
    assert a["volume_m3"] == pytest.approx(direct.design["volume_m3"], rel=1e-6)
