"""Catalyst pellets in runs ([catalyst]): effectiveness factors along the tube, outputs, refusals."""
import math

import numpy as np
import pytest

from simulator.case.load import load_case_dict
from simulator.errors import CaseError
from simulator.model.pellet import effectiveness_first_order
from simulator.solve.integrate import simulate

R = 8.314462618


def _raw(shape="sphere", k="2e-3 m^3/(kg*s)", D_e="2e-7 m^2/s", **catalyst):
    """Isothermal first-order A => B over pellets, no mole change, custom species (invented data)."""
    species = {"molar_mass": "0.03 kg/mol", "cp": "30 J/(mol*K)", "enthalpy_of_formation": "0 kJ/mol"}
    return {
        "title": "first-order reaction over catalyst pellets (invented data)",
        "thermo": {"custom": {"A": dict(species), "B": dict(species), "N": dict(species)}},
        "reactions": [{"equation": "A => B", "pre_exponential": k, "activation_energy": "0 kJ/mol",
                       "orders": {"A": 1}, "in_terms_of": "concentration", "rate_basis": "catalyst-mass"}],
        "feed": {"temperature": "500 K", "pressure": "2 bar", "molar_flow": "0.05 mol/s",
                 "mole_fractions": {"A": 0.1, "N": 0.9}},
        "tube": {"length": "2 m", "inner_diameter": "30 mm", "count": 1},
        "bed": {"particle_diameter": "6 mm", "void_fraction": 0.4, "bulk_density": "900 kg/m^3"},
        "heat": {"mode": "isothermal"},
        "design": {"key_species": "A"},
        "catalyst": {"shape": shape, "effective_diffusivity": D_e, "external_film": False, **catalyst},
    }


@pytest.mark.parametrize("shape", ["sphere", "cylinder", "slab"])
@pytest.mark.published("aris1975", "isothermal first-order effectiveness factors (closed forms, Aris-normalised)")
def test_isothermal_first_order_tube_is_the_closed_form_with_eta_k(shape):
    # analytic: constant eta along an isothermal first-order tube, X = 1 - exp(-eta k rho_b V / Q),
    # eta the closed form at Phi = L sqrt(k rho_p / D_e) (Aris 1975; Bischoff 1965 for the modulus)
    raw = _raw(shape)
    case = load_case_dict(raw)
    result = simulate(case)
    d = 6e-3
    L = {"sphere": d / 6, "cylinder": d / 4, "slab": d / 2}[shape]
    rho_b, eps, k, D_e = 900.0, 0.4, 2e-3, 2e-7
    phi = L * math.sqrt(k * rho_b / (1 - eps) / D_e)
    eta = effectiveness_first_order(phi, shape)
    assert 0.05 < eta < 0.95                        # a real diffusion limit, not a trivial check
    Q = 0.05 * R * 500.0 / 2e5                      # volumetric flow [m^3/s], no mole change
    V = math.pi * 0.03 ** 2 / 4 * 2.0
    X = 1 - math.exp(-eta * k * rho_b * V / Q)
    # tolerance: the table in ln Phi is interpolated linearly (481 points over 1e-3..1e3)
    assert result.outlet_conversion == pytest.approx(X, rel=2e-4)
    s = result.summary()["pellet"]
    assert s["effectiveness"]["A => B"]["outlet"] == pytest.approx(eta, rel=1e-4)
    header, rows = result.profile_table()
    col = header.index("effectiveness_R1")
    assert np.allclose([r[col] for r in rows], eta, rtol=1e-4)


def test_large_modulus_follows_the_one_over_phi_asymptote():
    # generalized-modulus asymptote eta -> 1/Phi for Phi -> infinity (Aris 1975; any order)
    result = simulate(load_case_dict(_raw(D_e="1e-12 m^2/s")))
    phi = 1e-3 * math.sqrt(2e-3 * 1500.0 / 1e-12)
    assert phi > 1e3                                  # beyond the table: the asymptote itself
    eta = result.summary()["pellet"]["effectiveness"]["A => B"]["inlet"]
    assert eta == pytest.approx(1 / phi, rel=1e-9)
    assert eta == pytest.approx(effectiveness_first_order(phi, "sphere"), rel=1e-3)   # closed form, 1 - 1/(3 Phi)
    wp = result.summary()["pellet"]["weisz_prater_inlet"]["A => B"]
    assert wp == pytest.approx(eta * phi ** 2, rel=1e-9)     # Weisz-Prater number of a first-order rate


def test_pellet_inputs_are_checked():
    raw = _raw()
    raw["catalyst"]["external_film"] = True
    with pytest.raises(CaseError, match=r"catalyst\.external_film = True: the film .* not modelled yet"):
        load_case_dict(raw)
    raw = _raw()
    raw["catalyst"]["shape"] = "ring"
    with pytest.raises(CaseError, match=r"catalyst\.shape"):
        load_case_dict(raw)
    raw = _raw()
    del raw["bed"]
    raw["reactions"][0]["rate_basis"] = "reactor-volume"
    raw["reactions"][0]["pre_exponential"] = "1 1/s"
    with pytest.raises(CaseError, match=r"catalyst: needs a packed bed"):
        load_case_dict(raw)
    case = load_case_dict(_raw(pellet_density="1600 kg/m^3", volume_to_surface="0.8 mm"))
    assert case.catalyst.pellet_density == 1600.0 and case.catalyst.volume_to_surface == pytest.approx(8e-4)


def test_assumptions_row_no_pellet_gradients_measures_eta_and_its_design_change():
    from simulator.assumptions import check_assumptions

    raw = _raw()
    raw["design"]["target_conversion"] = 0.4
    report = check_assumptions(load_case_dict(raw))
    row = report["assumptions"]["no_pellet_gradients"]
    eta = report["full_summary"]["pellet"]["effectiveness"]["A => B"]["min"]
    assert row["value"] == pytest.approx(1 - eta, rel=1e-12)
    assert row["verdict"] == "fails" and row["level"] in ("review", "unacceptable")
    # isothermal first order: the catalyst mass to a conversion scales with 1/eta, so the variant
    # without pellet limits needs eta times the mass (a design change of (eta - 1) in per cent)
    assert row["design_change_percent"] == pytest.approx(100 * (eta - 1), rel=2e-3)
    assert row["details"]["weisz_prater_inlet"]["A => B"] > 0


def test_compiled_sweep_applies_the_effectiveness_factor_as_a_single_run():
    from simulator.model.build import build_model
    from simulator.sweeps.fast import batch_solve

    case = load_case_dict(_raw())
    model = build_model(case)
    res = batch_solve(model, np.array([[500.0], [520.0]]), ["feed.temperature"])
    one = simulate(load_case_dict({**_raw(), "feed": {**_raw()["feed"], "temperature": "520 K"}}))
    assert res["outlet_conversion"][1] == pytest.approx(one.outlet_conversion, rel=1e-5)
