"""Network outputs of a run: [design] products (yield, selectivity), extents, approach to equilibrium."""
import copy
import csv
import json
import math
import tomllib
from pathlib import Path

import numpy as np
import pytest

from simulator.case.load import load_case, load_case_dict
from simulator.errors import CaseError
from simulator.solve.integrate import simulate

ROOT = Path(__file__).parent.parent
LIQUID = ROOT / "cases" / "liquid_jacketed_tube.toml"
ETHANE = ROOT / "cases" / "dehydrogenation_heated_tube.toml"
R = 8.314462618


def _series(k2_factor=0.5):
    """The liquid demo made isothermal with constant density and a consecutive step B => C."""
    raw = tomllib.loads(LIQUID.read_text())
    raw["pressure_drop"] = {"model": "none"}
    raw["thermo"]["expansion_coefficient"] = "0 1/K"
    raw["thermo"]["custom"]["C"] = copy.deepcopy(raw["thermo"]["custom"]["B"])
    raw["design"].pop("temperature_limit", None)
    raw["heat"] = {"mode": "isothermal"}
    second = copy.deepcopy(raw["reactions"][0])
    second.update(equation="B => C", orders={"B": 1}, pre_exponential=f"{4.0e9 * k2_factor} 1/s")
    raw["reactions"].append(second)
    raw["design"]["products"] = ["B", "C"]
    return raw


@pytest.mark.published("levenspiel1999", "ch. 8, first-order reactions in series A -> B -> C in plug flow "
                                         "(chapter from memory)")
def test_series_yields_match_the_closed_form_in_a_run():
    # analytic (constant density, isothermal): y_B = k1/(k2 - k1) (exp(-k1 tau) - exp(-k2 tau)),
    # y_C = 1 - exp(-k1 tau) - y_B, selectivity = yield / conversion
    case = load_case_dict(_series())
    result = simulate(case)
    T = case.feed.temperature
    k1 = 4.0e9 * math.exp(-80e3 / (R * T))
    k2 = 0.5 * k1
    tau = math.pi * 0.05 ** 2 / 4 * 20.0 / (0.68 / 3600.0)
    X = 1 - math.exp(-k1 * tau)
    yB = k1 / (k2 - k1) * (math.exp(-k1 * tau) - math.exp(-k2 * tau))
    s = result.summary()
    assert s["products"]["B"]["yield"] == pytest.approx(yB, rel=1e-6)
    assert s["products"]["C"]["yield"] == pytest.approx(X - yB, rel=1e-5)
    assert s["products"]["B"]["selectivity"] == pytest.approx(yB / X, rel=1e-6)
    header, rows = result.profile_table()
    for col in ("yield_B", "selectivity_B", "yield_C", "extent_R1_mol_per_s", "extent_R2_mol_per_s"):
        assert col in header
    xi1 = np.array([r[header.index("extent_R1_mol_per_s")] for r in rows])
    F_A = result.F[:, result.species.index("A")]
    assert np.allclose(xi1, F_A[0] - F_A, rtol=1e-10, atol=1e-12 * F_A[0])   # A is consumed by R1 only


def test_products_must_be_formed_from_the_key_species():
    raw = _series()
    raw["design"]["products"] = ["S"]
    with pytest.raises(CaseError, match=r"design\.products: 'S' is not formed from 'A'"):
        load_case_dict(raw)
    raw["design"]["products"] = "B"
    with pytest.raises(CaseError, match=r"design\.products = 'B': write a list of species names"):
        load_case_dict(raw)


def test_target_beyond_equilibrium_is_said_plainly(write_case, tmp_path):
    # the dehydrogenation demo's reversible reaction: X_eq at the outlet T and P from the feed, by the
    # case's own K (checked against Cantera equilibrate("TP") in tests/test_network.py)
    text = ETHANE.read_text().replace("target_conversion = 0.55", "target_conversion = 0.95")
    path = write_case(text, name="eq.toml")
    result = simulate(load_case(path))
    s = result.summary()
    eq = s["equilibrium"]
    assert eq["target_beyond_equilibrium"] is True
    assert eq["note"] == f"equilibrium-limited: at most X = {eq['outlet_equilibrium_conversion']:.3g} at the outlet " \
                         "conditions"
    assert eq["note"] in s["warnings"]
    assert s["outlet"]["conversion"] < eq["outlet_equilibrium_conversion"] < 0.95
    assert 0.0 < eq["outlet_approach_Q_over_K"] < 1.0          # still short of equilibrium, forward
    from simulator.cli import main

    out = tmp_path / "out"
    assert main(["run", str(path), "--out", str(out)]) == 0
    rows = list(csv.DictReader(open(out / "profile.csv")))
    assert "approach_to_equilibrium_R1" in rows[0] and "equilibrium_conversion_C2H6" in rows[0]
    assert json.loads((out / "summary.json").read_text())["equilibrium"]["target_beyond_equilibrium"] is True
