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
