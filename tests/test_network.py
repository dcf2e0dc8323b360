"""Network results (simulator.network) against independent computations."""
from types import SimpleNamespace as NS

import numpy as np
import pytest

from simulator.network import approach_to_equilibrium, equilibrium_conversion, stoichiometric_matrix

SPECIES = ("N2", "H2", "NH3", "AR")
FEED = (("N2", 0.24), ("H2", 0.72), ("NH3", 0.0), ("AR", 0.04))


def _case():
    reaction = NS(reversible=True, stoichiometry=(("N2", -1.0), ("H2", -3.0), ("NH3", 2.0)))
    return NS(design=NS(key_species="N2"), feed=NS(mole_fractions=FEED), reactions=(reaction,))


def _nasa(gas):
    rows = []
    for s in SPECIES:   # Cantera's NASA-7 layout (T_mid, high range, low range); gri30 is at 1 atm
        rows.append(gas.species(s).thermo.coeffs)
    return np.array(rows)


@pytest.mark.parametrize("T, P", [(700.0, 200e5), (800.0, 100e5), (650.0, 300e5)])
def test_equilibrium_conversion_matches_cantera_equilibrate_TP(T, P):
    # independent check: Cantera's Gibbs minimisation on the same four species (ideal gas)
    ct = pytest.importorskip("cantera")
    full = ct.Solution("gri30.yaml")
    gas = ct.Solution(thermo="ideal-gas", species=[full.species(s) for s in SPECIES])
    gas.TPX = T, P, dict(FEED)
    gas.equilibrate("TP")
    x = dict(zip(gas.species_names, gas.X))
    # conversion of N2 from the equilibrium composition: per mole of feed, F_T = 1 - 2 xi, x_NH3 = 2 xi / F_T
    xi = x["NH3"] / (2.0 + 2.0 * x["NH3"])
    expected = xi / 0.24
    got = equilibrium_conversion(_case(), T, P, _nasa(full), SPECIES)
    assert got == pytest.approx(expected, rel=1e-6)


def test_approach_is_one_at_the_equilibrium_cantera_computes():
    ct = pytest.importorskip("cantera")
    full = ct.Solution("gri30.yaml")
    gas = ct.Solution(thermo="ideal-gas", species=[full.species(s) for s in SPECIES])
    gas.TPX = 720.0, 150e5, dict(FEED)
    gas.equilibrate("TP")
    nu = stoichiometric_matrix(_case(), SPECIES)[:, 0]
    q = approach_to_equilibrium(_nasa(full), nu, gas.X[None, :], np.array([720.0]), np.array([150e5]))
    assert q[0] == pytest.approx(1.0, rel=1e-6)


@pytest.mark.published("levenspiel1999", "ch. 8, reactions in series A -> R -> S, plug flow: tau_max and "
                       "C_R,max/C_A0 = (k1/k2)^(k2/(k2-k1)) (equation numbers from memory)")
def test_series_yield_maximum_against_closed_form():
    # flows of the closed form itself (no solve): checks the extents, the yield and the selectivity rule
    from simulator.network import extents, yield_and_selectivity

    k1, k2 = 2.0, 0.5                      # [1/s]
    t = np.linspace(0.0, 6.0, 60001)       # residence time [s]
    A = np.exp(-k1 * t)
    B = k1 / (k2 - k1) * (np.exp(-k1 * t) - np.exp(-k2 * t))
    F = np.column_stack([A, B, 1.0 - A - B])
    nu = np.array([[-1.0, 0.0], [1.0, -1.0], [0.0, 1.0]])
    xi = extents(nu, F)
    assert np.allclose(xi[:, 0], 1.0 - A) and np.allclose(xi[:, 1], 1.0 - A - B)
    y_B, s_B = yield_and_selectivity(F, 0, 1, 1.0)
    k = int(np.argmax(y_B))
    assert t[k] == pytest.approx(np.log(k2 / k1) / (k2 - k1), abs=1e-4)     # grid spacing 1e-4 s
    assert y_B[k] == pytest.approx((k1 / k2) ** (k2 / (k2 - k1)), rel=1e-8)
    assert s_B[k] == pytest.approx(y_B[k] / (1.0 - A[k]), rel=1e-12)
    assert np.isnan(s_B[0])    # nothing converted at the inlet: selectivity not defined
