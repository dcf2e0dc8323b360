"""Temkin-type reversible rates: fractional and negative orders with the reverse orders alpha + nu."""
import math

import numpy as np
import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.model import kernel as K
from simulator.model.build import build_model
from simulator.solve.integrate import simulate

ALPHA = 0.5


def _raw(nh3=0.04, length="6 m"):
    """Ammonia synthesis with a Temkin-type rate (alpha = 0.5; invented constant), isothermal."""
    return {
        "title": "Temkin-type ammonia rate (invented constant)",
        "thermo": {"species_file": "gri30.yaml"},
        "reactions": [{"equation": "N2 + 3 H2 <=> 2 NH3", "pre_exponential": "2e-3 mol/(kg*s*Pa^1.5)",
                       "activation_energy": "80 kJ/mol",
                       "orders": {"N2": 1.0, "H2": 3 * ALPHA, "NH3": -2 * ALPHA},
                       "in_terms_of": "partial-pressure", "rate_basis": "catalyst-mass"}],
        "feed": {"temperature": "700 K", "pressure": "150 bar", "molar_flow": "2 mol/s",
                 "mole_fractions": {"N2": 0.24, "H2": 0.72, "NH3": nh3}},
        "tube": {"length": length, "inner_diameter": "50 mm", "count": 1},
        "bed": {"particle_diameter": "6 mm", "void_fraction": 0.4, "bulk_density": "2200 kg/m^3"},
        "heat": {"mode": "isothermal"},
        "design": {"key_species": "N2"},
    }


@pytest.mark.published("cantera", "equilibrate('TP') of N2/H2/NH3 (gri30 thermo, ideal gas)")
def test_temkin_rate_vanishes_at_the_equilibrium_cantera_computes():
    # Independent check: Cantera's equilibrate("TP") on the same three species and NASA-7 data; the
    # Temkin form r = k p_N2 (p_H2^3/p_NH3^2)^a [1 - Q/K] vanishes there (reverse orders alpha + nu)
    ct = pytest.importorskip("cantera")
    model = build_model(load_case_dict(_raw()))
    names = list(model.species.names)
    gas = ct.Solution(thermo="ideal-gas", species=[ct.Solution("gri30.yaml").species(s) for s in names])
    gas.TPX = 700.0, 150e5, dict(zip(names, [0.24, 0.72, 0.04]))
    gas.equilibrate("TP")
    F = gas.X * 2.0
    ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit = model.args
    inv, ctot, _ = K._mixture(700.0, 150e5, F, ip, fp, crit)
    r = K.reaction_rate(0, 700.0, 150e5, F, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit)
    k = 2e-3 * math.exp(-80e3 / (8.314462618 * 700.0))
    p = gas.X * 150e5
    i = {s: names.index(s) for s in names}
    forward = k * p[i["N2"]] * (p[i["H2"]] ** 3 / p[i["NH3"]] ** 2) ** ALPHA
    assert abs(r) < 1e-8 * forward * 2200.0      # reaction_rate is per reactor volume: x bulk density
    # off equilibrium the rate is the Temkin form exactly, with k2 = k1 / K
    F0 = np.array([dict(N2=0.24, H2=0.72, NH3=0.04)[s] for s in names]) * 2.0
    inv, ctot, _ = K._mixture(700.0, 150e5, F0, ip, fp, crit)
    r0 = K.reaction_rate(0, 700.0, 150e5, F0, inv, ctot, ip, fp, nasa, nu, ordr, rexp, rx, ads, crit)
    p0 = F0 / F0.sum() * 150e5
    Kp = (p[i["NH3"]] ** 2 / (p[i["N2"]] * p[i["H2"]] ** 3))     # Cantera's equilibrium, in Pa^-2
    by_hand = k * p0[i["N2"]] * (p0[i["H2"]] ** 3 / p0[i["NH3"]] ** 2) ** ALPHA \
        - k / Kp * (p0[i["NH3"]] ** 2 / p0[i["H2"]] ** 3) ** (1 - ALPHA)
    assert r0 == pytest.approx(by_hand * 2200.0, rel=1e-6)   # per kg of catalyst x bulk density


def test_a_long_tube_approaches_the_equilibrium_conversion():
    from simulator.network import equilibrium_conversion

    case = load_case_dict(_raw(length="40 m"))
    result = simulate(case)
    assert result.status == "completed"
    X_eq = equilibrium_conversion(case, 700.0, 150e5, result.extra["nasa"], tuple(result.species))
    assert result.outlet_conversion == pytest.approx(X_eq, rel=1e-4)
    assert result.summary()["equilibrium"]["outlet_approach_Q_over_K"] == pytest.approx(1.0, abs=1e-3)


def test_negative_reverse_order_without_the_species_in_the_feed_is_refused():
    raw = _raw()
    raw["reactions"][0]["orders"] = {"N2": 1.0, "H2": 1.5}      # no NH3 order: reverse order in H2 = -1.5
    raw["feed"]["mole_fractions"] = {"N2": 0.25, "H2": 0.0, "NH3": 0.75}
    with pytest.raises(CaseError, match=r"reactions\.0\.orders\.H2 = 1\.5: .*has order -1\.5 in 'H2'.*not in the feed"):
        load_case_dict(raw)
    raw = _raw(nh3=0.0)     # a negative forward order on NH3 needs NH3 in the feed
    with pytest.raises(CaseError, match=r"reactions\.0\.orders\.NH3"):
        load_case_dict(raw)
