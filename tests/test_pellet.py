"""Effectiveness factors of simulator.model.pellet against closed forms and asymptotes."""
import math

import pytest

from simulator.model.pellet import (aris_modulus, effectiveness_first_order, effectiveness_zero_order_slab,
                                    generalized_modulus, weisz_prater_number)

# Closed forms (Thiele 1939; Aris 1975), Aris-normalised Phi = (V_p/S_p) sqrt(k/D_e), evaluated to
# 6 decimals independently (tanh, Bessel I0/I1, coth); tolerance: half the last printed digit.
ARIS_TABLE = {
    "slab": {0.1: 0.996680, 0.5: 0.924234, 1.0: 0.761594, 2.0: 0.482014, 10.0: 0.100000, 50.0: 0.020000},
    "cylinder": {0.1: 0.995033, 0.5: 0.892780, 1.0: 0.697775, 2.0: 0.431761, 10.0: 0.097467, 50.0: 0.019900},
    "sphere": {0.1: 0.994051, 0.5: 0.876249, 1.0: 0.671636, 2.0: 0.416673, 10.0: 0.096667, 50.0: 0.019867},
}


@pytest.mark.published("aris1975", "first-order closed forms, slab, cylinder and sphere")
@pytest.mark.parametrize("shape", ["slab", "cylinder", "sphere"])
def test_first_order_closed_forms(shape):
    for phi, eta in ARIS_TABLE[shape].items():
        assert effectiveness_first_order(phi, shape) == pytest.approx(eta, abs=5e-7)


@pytest.mark.published("aris1975", "large-modulus asymptote eta -> 1/Phi with L = V_p/S_p")
@pytest.mark.parametrize("shape", ["slab", "cylinder", "sphere"])
def test_first_order_asymptote(shape):
    phi = 1e4
    assert effectiveness_first_order(phi, shape) * phi == pytest.approx(1.0, rel=1e-3)


def test_sphere_series_joins_the_closed_form():
    # analytic: the series branch below phi_R = 1e-2 and the closed form agree across the switch
    # (their difference across 2 % of phi_R is the slope, ~3e-7, not a jump)
    lo = effectiveness_first_order(0.99e-2 / 3.0, "sphere")
    hi = effectiveness_first_order(1.01e-2 / 3.0, "sphere")
    assert lo == pytest.approx(hi, abs=5e-7) and hi < lo < 1.0


@pytest.mark.published("aris1975", "zero order in a slab: eta = 1 up to Phi_0 = 1, 1/Phi_0 beyond")
def test_zero_order_slab():
    assert effectiveness_zero_order_slab(0.5) == 1.0
    assert effectiveness_zero_order_slab(1.0) == 1.0
    assert effectiveness_zero_order_slab(2.5) == pytest.approx(0.4)


@pytest.mark.published("bischoff1965", "generalized modulus Phi_n = L sqrt((n+1)/2 k c_s^(n-1)/D_e)")
def test_generalized_modulus_reduces_to_aris_for_first_order_and_scales_for_other_orders():
    k1, D, L, cs = 4.0, 1e-6, 1e-3, 10.0
    assert generalized_modulus(k1, 1.0, cs, D, L) == pytest.approx(aris_modulus(k1, D, L))
    # second order: (n+1)/2 = 1.5 and c_s^(n-1) = 10 -> sqrt(15) times the first-order value
    assert generalized_modulus(k1, 2.0, cs, D, L) == pytest.approx(math.sqrt(15.0) * 2.0)


@pytest.mark.published("weisz_prater1954", "N_WP = r_obs L^2/(D_e c_s), by hand")
def test_weisz_prater_number_by_hand_and_first_order_identity():
    # by hand: 2 mol/m3/s * (1e-3 m)^2 / (1e-6 m2/s * 10 mol/m3) = 0.2
    assert weisz_prater_number(2.0, 1e-3, 1e-6, 10.0) == pytest.approx(0.2)
    # first order: r_obs = eta k c_s, so N_WP = eta Phi^2
    k, D, L, cs = 4.0, 1e-6, 1e-3, 10.0
    phi = aris_modulus(k, D, L)
    eta = effectiveness_first_order(phi, "sphere")
    assert weisz_prater_number(eta * k * cs, L, D, cs) == pytest.approx(eta * phi ** 2)


def test_bad_modulus_refused():
    with pytest.raises(ValueError, match="phi"):
        effectiveness_first_order(0.0, "slab")
