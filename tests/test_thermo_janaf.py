"""tubesim's thermo path against NIST-JANAF (Chase 1998): heats of formation and reaction, Cp.

The path under test is the one every run uses: :func:`build_species_data`
collects NASA-7 rows from a Cantera species file (kmol -> mol converted there)
and :mod:`simulator.thermo.nasa7` evaluates them (``h_RT``, ``cp_R``).

Check kinds (STYLE.md section 8):

* published: JANAF values in ``tests/data/chase1998_*.csv``. Tolerances follow
  /work/shared/reference/check-values.md sections 5 and 6: +-0.3 kJ/mol for
  formation and reaction enthalpies (the data files use the Gurvich 1991 CH4
  value, -74.600 kJ/mol, against JANAF -74.873: 0.27 kJ/mol, carried in full by
  the methanation reactions); +-0.5 % for Cp, except CH4 at 1000 K where the
  NASA fit includes anharmonic terms that the 1961 JANAF CH4 table omits
  (Cantera is 2.5 % above JANAF there): +-3 %.
* invariant: the NASA-7 evaluation reproduces Cantera's own species thermo
  (same coefficients, independent evaluator), to round-off.
"""
import csv
from pathlib import Path

import numpy as np
import pytest

from simulator.case.schema import Thermo
from simulator.thermo.nasa7 import cp_R, h_RT, s_R
from simulator.thermo.species_data import build_species_data, cantera_data_file, species_in_file
from simulator.units import R

DATA = Path(__file__).resolve().parent / "data"
FILES = ("gri30.yaml", "nasa_gas.yaml")
T_REF = 298.15   # [K]


def _read(name):
    lines = (DATA / name).read_text().splitlines()
    return list(csv.DictReader(line for line in lines if not line.startswith("#")))


JANAF_HF = {row["species"]: float(row["delta_f_H"]) * 1000.0 for row in _read("chase1998_formation_enthalpy.csv")}
JANAF_CP = [(row["species"], float(row["T"]), float(row["cp"])) for row in _read("chase1998_heat_capacity.csv")]

# check-values.md section 6: reaction, and the JANAF heat of reaction at 298.15 K printed there [kJ/mol]
REACTIONS = {
    "6a CO + 3 H2 -> CH4 + H2O": ({"CO": -1, "H2": -3, "CH4": 1, "H2O": 1}, -206.172),
    "6b CO2 + 4 H2 -> CH4 + 2 H2O": ({"CO2": -1, "H2": -4, "CH4": 1, "H2O": 2}, -165.003),
    "6c N2 + 3 H2 -> 2 NH3": ({"N2": -1, "H2": -3, "NH3": 2}, -91.796),
    "6d SO2 + 1/2 O2 -> SO3": ({"SO2": -1, "O2": -0.5, "SO3": 1}, -98.923),
    "6f CO + H2O -> CO2 + H2": ({"CO": -1, "H2O": -1, "CO2": 1, "H2": 1}, -41.169),
}


def _species_data(species_file, names):
    """tubesim's species data for ``names`` from a bundled Cantera file."""
    path = cantera_data_file(species_file)
    assert path is not None, f"{species_file} is not bundled with this Cantera"
    thermo = Thermo(species_file=species_file, species_path=path, equation_of_state="ideal-gas")
    return build_species_data(tuple(names), thermo)


def _in_file(species_file, names):
    return set(names) <= set(species_in_file(cantera_data_file(species_file)))


def _enthalpy(data, name, T):
    """Molar enthalpy of one species from tubesim's rows, [J/mol]."""
    return h_RT(data.nasa7[data.names.index(name)], T) * R * T


def _cases(items, files=FILES):
    out = []
    for key, names in items:
        for species_file in files:
            if _in_file(species_file, names):
                out.append(pytest.param(key, species_file, id=f"{key.split()[0]}-{species_file}"))
    return out


@pytest.mark.published("chase1998", "standard enthalpies of formation at 298.15 K (ideal gas)")
@pytest.mark.parametrize("species, species_file", _cases([(s, [s]) for s in JANAF_HF]))
def test_formation_enthalpy_against_janaf(species, species_file):
    data = _species_data(species_file, [species])
    # NASA convention: h(298.15 K) = standard enthalpy of formation.
    assert _enthalpy(data, species, T_REF) == pytest.approx(JANAF_HF[species], abs=300.0)


@pytest.mark.published("chase1998", "heats of reaction at 298.15 K from JANAF enthalpies of formation")
@pytest.mark.parametrize("reaction, species_file", _cases([(k, list(v[0])) for k, v in REACTIONS.items()]))
def test_heat_of_reaction_against_janaf(reaction, species_file):
    nu, printed = REACTIONS[reaction]
    janaf = sum(v * JANAF_HF[s] for s, v in nu.items())
    assert janaf / 1000.0 == pytest.approx(printed, abs=5e-4)   # data file agrees with the printed sum
    data = _species_data(species_file, list(nu))
    dH = sum(v * _enthalpy(data, s, T_REF) for s, v in nu.items())
    assert dH == pytest.approx(janaf, abs=300.0)


def test_all_listed_reactions_are_checked():
    # 6a, 6b, 6c, 6f with gri30.yaml (no sulfur there) and 6d with nasa_gas.yaml, as check-values.md asks.
    gri = {k.split()[0] for k, (nu, _) in REACTIONS.items() if _in_file("gri30.yaml", nu)}
    nasa = {k.split()[0] for k, (nu, _) in REACTIONS.items() if _in_file("nasa_gas.yaml", nu)}
    assert gri == {"6a", "6b", "6c", "6f"}
    assert "6d" in nasa


@pytest.mark.published("chase1998", "ideal-gas heat capacity tables")
@pytest.mark.parametrize("species, T, cp_janaf, species_file",
                         [pytest.param(s, T, cp, f, id=f"{s}-{T:g}K-{f}") for s, T, cp in JANAF_CP
                          for f in FILES if _in_file(f, [s])])
def test_heat_capacity_against_janaf(species, T, cp_janaf, species_file):
    data = _species_data(species_file, [species])
    cp = cp_R(data.nasa7[0], T) * R
    # CH4 above ~600 K: the NASA fit has anharmonic terms, the JANAF table (reviewed 1961) does not.
    rel = 0.03 if (species == "CH4" and T > 600.0) else 0.005
    assert cp == pytest.approx(cp_janaf, rel=rel)


@pytest.mark.parametrize("species_file", FILES)
def test_nasa7_rows_reproduce_cantera(species_file):
    # Invariant: same coefficients, independent evaluator; differences are round-off only.
    names = [s for s in ("CH4", "CO", "CO2", "H2O", "NH3", "H2", "N2", "O2", "SO2", "SO3")
             if _in_file(species_file, [s])]
    data = _species_data(species_file, names)
    file_species = species_in_file(cantera_data_file(species_file))
    for i, name in enumerate(names):
        ct_thermo = file_species[name].thermo
        for T in (300.0, 500.0, 999.0, 1001.0, 1500.0, 2500.0):
            row = data.nasa7[i]
            # Cantera: J/kmol and J/(kmol K); tubesim: J/mol and J/(mol K).
            np.testing.assert_allclose(h_RT(row, T) * R * T, ct_thermo.h(T) / 1000.0, rtol=1e-10, atol=1e-6)
            np.testing.assert_allclose(cp_R(row, T) * R, ct_thermo.cp(T) / 1000.0, rtol=1e-10)
            np.testing.assert_allclose(s_R(row, T) * R, ct_thermo.s(T) / 1000.0, rtol=1e-10)
        assert data.molar_mass[i] == pytest.approx(file_species[name].molecular_weight / 1000.0, rel=1e-12)
