"""Tube-side and packed-bed coefficient correlations of simulator.model.heat_coefficient."""
import math

import numpy as np

import pytest

from simulator.model import heat_coefficient as hc


@pytest.mark.published("ht_library", "ht.conv_internal.turbulent_Gnielinski docstring example")
def test_gnielinski_against_ht_docstring_example():
    # Source: ht 1.2.0 docstring, turbulent_Gnielinski(Re=1E5, Pr=1.2, fd=0.0185) = 254.62682749359632
    # (re-run exactly); same closed form, so the tolerance is rounding only.
    assert hc.gnielinski_1976(1e5, 1.2, 0.0185) == pytest.approx(254.62682749359632, rel=1e-12)


@pytest.mark.published("ht_library", "ht.conv_internal.turbulent_Dittus_Boelter docstring examples")
def test_dittus_boelter_against_ht_docstring_examples():
    # Source: ht 1.2.0 docstrings: heating 247.40036409449127, cooling 242.9305927410295 (Re 1e5, Pr 1.2)
    assert hc.dittus_boelter_1930(1e5, 1.2, True) == pytest.approx(247.40036409449127, rel=1e-12)
    assert hc.dittus_boelter_1930(1e5, 1.2, False) == pytest.approx(242.9305927410295, rel=1e-12)


@pytest.mark.published("ht_library", "ht.conv_internal.turbulent_Gnielinski over the turbulent range")
@pytest.mark.parametrize("Re", [1.2e4, 5e4, 3e5, 2e6])
@pytest.mark.parametrize("Pr", [0.7, 1.2, 5.0])
def test_guarded_empty_tube_nusselt_equals_ht_in_the_turbulent_range(Re, Pr):
    ht = pytest.importorskip("ht")
    fd = hc.filonenko_1954(Re)
    expected = ht.conv_internal.turbulent_Gnielinski(Re, Pr, fd)
    assert hc.empty_tube_nusselt(Re, Pr, hc.EMPTY_GNIELINSKI, False) == pytest.approx(expected, rel=1e-12)


def test_regime_guard_does_not_use_the_turbulent_formula_at_re_1100():
    # analytic: below Re 2300 the guard returns the laminar fully developed 3.66, whereas the
    # unguarded Gnielinski form is meaningless there (0.66 at Re 1100, next-physics note 6.3)
    unguarded = hc.gnielinski_1976(1100.0, 0.7, hc.filonenko_1954(1100.0))
    assert unguarded < 1.0
    for method in (hc.EMPTY_GNIELINSKI, hc.EMPTY_DITTUS_BOELTER):
        assert hc.empty_tube_nusselt(1100.0, 0.7, method, False) == hc.NU_LAMINAR


@pytest.mark.parametrize("method", [1, 2])
def test_transition_blend_is_continuous_at_both_ends(method):
    # invariant: the blend meets the laminar value at Re 2300 and the turbulent one at Re 1e4
    eps = 1e-6
    lo = hc.empty_tube_nusselt(hc.RE_LAMINAR * (1 + eps), 0.7, method, False)
    assert lo == pytest.approx(hc.NU_LAMINAR, rel=1e-5)
    below = hc.empty_tube_nusselt(hc.RE_TURBULENT * (1 - eps), 0.7, method, False)
    above = hc.empty_tube_nusselt(hc.RE_TURBULENT, 0.7, method, False)
    assert below == pytest.approx(above, rel=1e-5)


def test_overall_coefficient_is_the_series_sum_and_tends_to_h_i():
    # analytic: 1/U = 1/h_i + R_fi + R_wall + R_out; with the other resistances zero U = h_i
    fp = np.zeros(hc.N_COEF)
    fp[hc.C_FACTOR] = 1.0
    assert hc.overall_coefficient(120.0, fp, 0) == pytest.approx(120.0, rel=1e-14)
    Di, Do, kw, ho = 0.0254, 0.0296, 16.0, 2000.0
    fp[hc.C_RWALL] = Di * math.log(Do / Di) / (2 * kw)
    fp[hc.C_ROUT] = Di / Do / ho
    U = hc.overall_coefficient(125.0, fp, 0)
    assert 1 / U == pytest.approx(1 / 125.0 + Di * math.log(Do / Di) / (2 * kw) + Di / Do / ho, rel=1e-14)
    # next-physics 6.2: 125 -> 117 W/m^2K with a 2.1 mm steel wall and a 2000 W/m^2K shell side (REP)
    assert U == pytest.approx(117.0, abs=1.0)


def test_packed_bed_inside_coefficient_picks_leva_form_by_flux_direction():
    # invariant: "auto" in a packed bed uses the cooling form when the gas is cooled, the heating one otherwise
    args = (1.3, 0.0254, 0.003, 3.1e-5, 1000.0, 0.047)
    cooled = hc.inside_coefficient(hc.PACKED_LEVA_AUTO, 0.0, *args, False)
    heated = hc.inside_coefficient(hc.PACKED_LEVA_AUTO, 0.0, *args, True)
    assert cooled == hc.inside_coefficient(hc.PACKED_LEVA_1950, 0.0, *args, False)
    assert heated == hc.inside_coefficient(hc.PACKED_LEVA_1949, 0.0, *args, True)
    assert cooled != heated


def test_gas_conductivity_from_fits_equals_cantera_mixture_averaged():
    # invariant: the fits and mixing rule are Cantera's own, so both agree to rounding
    ct = pytest.importorskip("cantera")
    import numpy as np

    gas = ct.Solution("gri30.yaml")
    names, x, T = ("CH4", "O2", "N2"), np.array([0.3, 0.2, 0.5]), 700.0
    fp = np.zeros(hc.N_COEF + 5 * len(names))
    fp[hc.C_KMODE] = hc.CONDUCTIVITY_FITS
    for i, s in enumerate(names):
        fp[hc.N_COEF + 5 * i:hc.N_COEF + 5 * i + 5] = gas.get_thermal_conductivity_polynomial(gas.species_index(s))
    gas.TPX = T, 1e5, dict(zip(names, x))
    assert hc.gas_conductivity(T, x * 2.0, fp, 0) == pytest.approx(gas.thermal_conductivity, rel=1e-10)
