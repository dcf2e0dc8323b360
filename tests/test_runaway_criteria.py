"""Tests of the runaway criteria (simulator.screening.criteria) and of the dimensionless
reference tube (simulator.screening.reference_model).

Kinds of check value (tests/STYLE: analytic / invariant / published / regression):
- Semenov theta_c, psi_c: closed forms from the tangency condition (analytic), plus the
  table of the project notes (shared/reference/runaway.md, table 1.1) to its printed digits.
- Critical N/B (runaway.md table 1.7): REGRESSION values. They are an independent
  numpy/scipy reproduction of the published criteria, made for the project notes; they are
  NOT digits printed in the papers. The criterion definitions come from the papers named in
  each marker (citations partly from memory, see tests/sources.toml).
"""
import functools
import math

import numpy as np
import pytest
from scipy.integrate import solve_ivp
from scipy.optimize import brentq, minimize_scalar

from simulator.screening.criteria import (
    adler_enig_1964_verdict,
    barkelew_1959_critical_ratio,
    barkelew_1959_critical_scale,
    barkelew_1959_verdict,
    locate_sensitivity_maximum,
    morbidelli_varma_1988_normalized_sensitivity,
    morbidelli_varma_1988_verdict,
    semenov_1928_critical,
    semenov_1928_verdict,
    van_welsenaere_froment_1970_inflection_verdict,
    van_welsenaere_froment_1970_maxima_curve_verdict,
    van_welsenaere_froment_1970_maxima_temperature,
)
from simulator.screening.reference_model import (
    CRITERIA,
    adler_enig_1964_sign_indicator,
    critical_N_over_B,
    hot_spot,
    profile,
    thomas_bowes_1961_sign_indicator,
)
from simulator.units import R

INF = math.inf

# ---------------------------------------------------------------------------------------
# Semenov (1928)
# ---------------------------------------------------------------------------------------
# runaway.md table 1.1 (DER + REP there): gamma -> (theta_c, psi_c, 1/psi_c), 6-7 digits printed.
SEMENOV_TABLE = {
    INF: (1.0, 0.367879, 2.718282),
    50.0: (1.042119, 0.375466, 2.663354),
    30.0: (1.072799, 0.380797, 2.626072),
    20.0: (1.114562, 0.387800, 2.578652),
    10.0: (1.270167, 0.411532, 2.429945),
    5.0: (1.909830, 0.479529, 2.085381),
}


@pytest.mark.published("semenov1928", "critical condition (tangency); psi_c = 1/e at gamma = inf "
                                      "as in Williams, Combustion Theory, App. B; finite-gamma table "
                                      "of the project notes (closed form)")
@pytest.mark.parametrize("gamma", list(SEMENOV_TABLE))
def test_semenov_critical_against_closed_form_table(gamma):
    theta_c, psi_c, inv_psi_c = SEMENOV_TABLE[gamma]
    crit = semenov_1928_critical(gamma)
    assert crit.exists
    # printed to 6 decimals: half a unit of the last digit is <= 5e-7 relative for values >= 1
    assert crit.theta_c == pytest.approx(theta_c, rel=1e-6)
    assert crit.psi_c == pytest.approx(psi_c, rel=1.5e-6)
    assert 1.0 / crit.psi_c == pytest.approx(inv_psi_c, rel=1e-6)


def test_semenov_gamma_inf_is_one_over_e():
    crit = semenov_1928_critical(INF)
    assert crit.theta_c == 1.0
    assert crit.psi_c == pytest.approx(math.exp(-1.0), rel=1e-15)


@pytest.mark.parametrize("gamma", [INF, 50.0, 20.0, 10.0, 5.0, 4.5])
def test_semenov_closed_form_is_the_tangency(gamma):
    # analytic: steady states of psi*exp(theta') = theta exist on the low branch iff
    # psi <= max of theta*exp(-theta') on [0, gamma]; the closed form must be that maximum
    # and its location (found here numerically, independently of the closed form).
    eps = 0.0 if math.isinf(gamma) else 1.0 / gamma
    upper = 10.0 if math.isinf(gamma) else gamma

    def minus_psi(theta):
        return -theta * math.exp(-theta / (1.0 + eps * theta))

    res = minimize_scalar(minus_psi, bounds=(0.0, upper), method="bounded", options={"xatol": 1e-12})
    crit = semenov_1928_critical(gamma)
    assert crit.psi_c == pytest.approx(-res.fun, rel=1e-12)
    assert crit.theta_c == pytest.approx(res.x, rel=1e-5)


@pytest.mark.published("semenov1928", "no critical point for gamma <= 4 (closed form: double root at 4)")
@pytest.mark.parametrize("gamma", [4.0, 3.0, 1.0, 0.5])
def test_semenov_no_criticality_for_gamma_at_most_4(gamma):
    crit = semenov_1928_critical(gamma)
    assert not crit.exists and crit.theta_c is None and crit.psi_c is None
    # independent check: theta*exp(-theta') is monotone (no tangency) for gamma <= 4
    theta = np.linspace(0.0, 50.0 * gamma, 20001)
    psi_of_theta = theta * np.exp(-theta / (1.0 + theta / gamma))
    assert np.all(np.diff(psi_of_theta) > 0.0)
    verdict = semenov_1928_verdict(10.0, gamma)
    assert verdict["verdict"] == "safe" and verdict["critical"] is None


def test_semenov_verdict():
    below = semenov_1928_verdict(0.36, INF)
    assert below["verdict"] == "safe" and below["value"] == 0.36 and below["source"] == "semenov1928"
    assert below["critical"] == pytest.approx(math.exp(-1.0), rel=1e-15)
    above = semenov_1928_verdict(0.40, INF)
    assert above["verdict"] == "undecided" and "consumption" in above["note"]
    # finite gamma raises the critical psi: 0.38 passes at gamma = 20, fails at gamma = inf
    assert semenov_1928_verdict(0.38, 20.0)["verdict"] == "safe"
    assert semenov_1928_verdict(0.38, INF)["verdict"] == "undecided"


@pytest.mark.parametrize("bad", [0.0, -3.0, math.nan])
def test_semenov_rejects_bad_gamma(bad):
    with pytest.raises(ValueError, match="gamma"):
        semenov_1928_critical(bad)


# ---------------------------------------------------------------------------------------
# Van Welsenaere-Froment (1970) criterion I: maxima curve
# ---------------------------------------------------------------------------------------
@pytest.mark.parametrize("Tc, E", [(625.0, 13636.0 * R), (500.0, 80e3), (300.0, 40e3)])
def test_maxima_temperature_solves_its_equation(Tc, E):
    # analytic: T_m - Tc = R T_m^2/E exactly, and the reduced form is the Semenov theta_c
    T_m = van_welsenaere_froment_1970_maxima_temperature(Tc, E)
    assert T_m - Tc == pytest.approx(R * T_m**2 / E, rel=1e-12)
    gamma = E / (R * Tc)
    assert gamma * (T_m / Tc - 1.0) == pytest.approx(semenov_1928_critical(gamma).theta_c, rel=1e-12)
    assert Tc < T_m < 2.0 * Tc  # the smaller root


def test_maxima_temperature_o_xylene_example():
    # analytic (DER in the project notes, section 2): E/R = 13 636 K, Tw = 625 K gives
    # T_m - Tw = 31.62 K, against the large-gamma approximation R Tw^2/E = 28.65 K
    T_m = van_welsenaere_froment_1970_maxima_temperature(625.0, 13636.0 * R)
    assert T_m - 625.0 == pytest.approx(31.62, abs=0.01)
    assert 625.0**2 / 13636.0 == pytest.approx(28.65, abs=0.01)


def test_maxima_curve_verdict_and_limits():
    E, Tc = 13636.0 * R, 625.0
    T_m = van_welsenaere_froment_1970_maxima_temperature(Tc, E)
    below = van_welsenaere_froment_1970_maxima_curve_verdict(T_m - 0.01, Tc, E)
    above = van_welsenaere_froment_1970_maxima_curve_verdict(T_m + 0.01, Tc, E)
    assert below["verdict"] == "safe" and above["verdict"] == "runaway"
    assert below["critical"] == T_m and below["source"] == "van_welsenaere_froment1970"
    low_E = van_welsenaere_froment_1970_maxima_curve_verdict(700.0, Tc, 4.0 * R * Tc)
    assert low_E["verdict"] == "undecided" and low_E["critical"] is None
    with pytest.raises(ValueError, match=r"activation_energy .* <= 4"):
        van_welsenaere_froment_1970_maxima_temperature(Tc, 3.9 * R * Tc)
    with pytest.raises(ValueError, match="coolant_temperature"):
        van_welsenaere_froment_1970_maxima_temperature(-1.0, E)


# ---------------------------------------------------------------------------------------
# Profile-shape tests on synthetic profiles (analytic shapes)
# ---------------------------------------------------------------------------------------
def test_inflection_ignores_decaying_entrance_convexity():
    # hot feed cooled first (convex dip at the inlet), then a concave rise to a maximum
    z = np.linspace(0.0, 1.0, 2001)
    T = 600.0 + 20.0 * np.exp(-20.0 * z) + 40.0 * z * np.exp(-2.0 * z)
    d2T = 8000.0 * np.exp(-20.0 * z) + 40.0 * np.exp(-2.0 * z) * (4.0 * z - 4.0)
    assert d2T[0] > 0.0  # convex at the inlet
    out = van_welsenaere_froment_1970_inflection_verdict(z, T)
    assert out["verdict"] == "safe", out
    assert out["value"] <= 0.0
    assert out["z_hot_spot"] == pytest.approx(0.5, abs=2e-3)


def test_inflection_counts_convexity_growing_downstream():
    # concave start, then a steep sigmoidal rise (convex), then a maximum
    z = np.linspace(0.0, 1.0, 4001)
    T = 600.0 + 10.0 * (1.0 - np.exp(-5.0 * z)) + 50.0 / (1.0 + np.exp(-40.0 * (z - 0.5))) - 10.0 * z**2
    out = van_welsenaere_froment_1970_inflection_verdict(z, T)
    assert out["verdict"] == "runaway"
    assert 0.3 < out["z_convex"] < 0.5 < out["z_hot_spot"]
    assert out["references"] == ("van_welsenaere_froment1970", "thomas_bowes1961")


def test_inflection_edge_cases():
    z = np.linspace(0.0, 1.0, 101)
    falling = van_welsenaere_froment_1970_inflection_verdict(z, 600.0 - 10.0 * z)
    assert falling["verdict"] == "safe" and "does not rise" in falling["note"]
    rising = van_welsenaere_froment_1970_inflection_verdict(z, 600.0 + 10.0 * np.sqrt(z + 0.1))
    assert rising["verdict"] == "safe" and "no hot spot inside" in rising["note"]
    short = van_welsenaere_froment_1970_inflection_verdict(z[:4], 600.0 + z[:4])
    assert short["verdict"] == "undecided"
    with pytest.raises(ValueError, match="strictly increasing"):
        van_welsenaere_froment_1970_inflection_verdict(z[::-1], 600.0 + z)
    with pytest.raises(ValueError, match="non-finite"):
        van_welsenaere_froment_1970_inflection_verdict(z, np.where(z > 0.5, np.inf, 600.0))


def test_adler_enig_truncates_saturated_conversion():
    x = np.concatenate([np.linspace(0.0, 1.0, 201), np.ones(20)])
    T = 600.0 + 100.0 * np.sin(0.5 * np.pi * np.minimum(x, 1.0))  # concave, max at x = 1
    out = adler_enig_1964_verdict(x, T)
    assert out["verdict"] == "safe" and "stops increasing" in out["note"]
    assert out["source"] == "adler_enig1964"


# ---------------------------------------------------------------------------------------
# Morbidelli-Varma locator on callables with a known answer (analytic)
# ---------------------------------------------------------------------------------------
def _atan_objective(k):
    # y = exp(atan(k ln p)) has s = p y'/y = k / (1 + (k ln p)^2): max s = k at p = 1 exactly
    return lambda p: math.exp(math.atan(k * math.log(p)))


@pytest.mark.parametrize("k", [3.0, 100.0])
def test_locator_finds_known_maximum(k):
    peak = locate_sensitivity_maximum(_atan_objective(k), 0.4, 3.0, n_coarse=15, rel_step=1e-5, xtol=1e-9)
    assert peak.found and peak.decided and peak.reason == ""
    assert peak.phi == pytest.approx(1.0, abs=1e-6)
    assert peak.s_max == pytest.approx(k, rel=1e-6)
    assert peak.evaluations % 2 == 0 and 2 * 15 < peak.evaluations < 120  # 2 per s; few refinements
    assert peak.failed == 0
    s = morbidelli_varma_1988_normalized_sensitivity(_atan_objective(k), 2.0, rel_step=1e-6)
    assert s == pytest.approx(k / (1.0 + (k * math.log(2.0)) ** 2), rel=1e-8)


def test_locator_reports_edge_and_failures():
    edge = locate_sensitivity_maximum(_atan_objective(10.0), 1.5, 3.0, n_coarse=9)
    assert edge.found and not edge.decided and "lower end" in edge.reason

    def fails_deep(p):  # a simulator that fails far on one side: boundary still decided
        if p > 2.2:
            raise RuntimeError("temperature limit")
        return _atan_objective(10.0)(p)

    far = locate_sensitivity_maximum(fails_deep, 0.4, 3.0, n_coarse=14)
    assert far.decided and far.failed > 0 and "away from the maximum" in far.reason
    assert far.phi == pytest.approx(1.0, abs=1e-5)

    def fails_near(p):  # failures right next to the peak: undecided
        return math.nan if 1.02 < p < 1.3 else _atan_objective(10.0)(p)

    near = locate_sensitivity_maximum(fails_near, 0.4, 3.0, n_coarse=14)
    assert not near.decided and near.reason

    nothing = locate_sensitivity_maximum(lambda p: math.nan, 0.5, 1.5, n_coarse=5)
    assert not nothing.found and math.isnan(nothing.phi)


def test_morbidelli_varma_verdict_sides():
    rising = locate_sensitivity_maximum(_atan_objective(10.0), 0.4, 3.0)
    falling = locate_sensitivity_maximum(lambda p: 1.0 / _atan_objective(10.0)(p), 0.4, 3.0)
    assert rising.s_max > 0.0 > falling.s_max
    assert morbidelli_varma_1988_verdict(1.1, rising)["verdict"] == "runaway"
    assert morbidelli_varma_1988_verdict(0.9, rising)["verdict"] == "safe"
    assert morbidelli_varma_1988_verdict(0.9, falling)["verdict"] == "runaway"
    assert morbidelli_varma_1988_verdict(1.1, falling)["verdict"] == "safe"
    assert morbidelli_varma_1988_verdict(1.1, rising, s_threshold=20.0)["verdict"] == "safe"
    edge = locate_sensitivity_maximum(_atan_objective(10.0), 1.5, 3.0, n_coarse=9)
    assert morbidelli_varma_1988_verdict(2.0, edge)["verdict"] == "undecided"


def test_morbidelli_varma_edge_maximum_below_the_threshold_is_no_boundary():
    # |s| largest at the end of the range but tiny everywhere (a gently rising hot spot, as the
    # methanol demo's feed fraction with |s| <= 0.05): no sharp boundary in the range, not "undecided"
    gentle = locate_sensitivity_maximum(lambda p: 500.0 + 5.0 * p * p, 0.1, 0.6, n_coarse=9)
    assert gentle.found and not gentle.decided and gentle.failed == 0 and abs(gentle.s_max) < 0.1
    verdict = morbidelli_varma_1988_verdict(0.3, gentle, s_threshold=3.0)
    assert verdict["verdict"] == "safe" and "no sharp boundary" in verdict["note"]
    # without a threshold, or with a steep end, it stays undecided (a boundary may lie just beyond)
    assert morbidelli_varma_1988_verdict(0.3, gentle)["verdict"] == "undecided"
    steep = locate_sensitivity_maximum(lambda p: math.exp(5.0 * p), 1.0, 2.0, n_coarse=9)   # s = 5 p
    assert not steep.decided and abs(steep.s_max) == pytest.approx(10.0, rel=1e-6)
    assert morbidelli_varma_1988_verdict(1.5, steep, s_threshold=3.0)["verdict"] == "undecided"


# ---------------------------------------------------------------------------------------
# Reference tube: invariants and an independent integration in z
# ---------------------------------------------------------------------------------------
@pytest.mark.parametrize("B, N, gamma, n", [(10.0, 30.0, INF, 1.0), (20.0, 36.0, 20.0, 1.0),
                                          (15.0, 22.0, INF, 1.0), (15.0, 25.0, 30.0, 2.0),
                                          (15.0, 25.0, INF, 0.5)])
def test_reference_hot_spot_matches_direct_integration_in_z(B, N, gamma, n):
    # invariant: the phase-plane form must agree with the original z-equations
    # (BDF, reduced position tau = Da z, hot spot by an event on dtheta/dtau = 0)
    inv_g = 0.0 if math.isinf(gamma) else 1.0 / gamma

    def rhs(tau, y):
        x, theta = y
        rate = max(1.0 - x, 0.0) ** n * math.exp(theta / (1.0 + inv_g * theta))
        return [rate, B * rate - N * theta]

    def jac(tau, y):
        x, theta = y
        den = 1.0 + inv_g * theta
        e, a = math.exp(theta / den), 1.0 / den**2
        c, dc = max(1.0 - x, 0.0) ** n, -n * max(1.0 - x, 1e-300) ** (n - 1.0)
        return [[dc * e, c * e * a], [B * dc * e, B * c * e * a - N]]

    def peak(tau, y):
        return rhs(tau, y)[1]

    peak.terminal, peak.direction = True, -1.0
    sol = solve_ivp(rhs, (0.0, 50.0), [0.0, 0.0], method="BDF", jac=jac, events=peak, rtol=1e-11, atol=1e-13)
    assert sol.status == 1, sol.message
    x_z, theta_z = sol.y_events[0][0]
    spot = hot_spot(B, N, gamma, n)
    assert spot.theta == pytest.approx(theta_z, rel=1e-6)
    assert spot.conversion == pytest.approx(x_z, rel=1e-6)
    assert spot.position == pytest.approx(sol.t_events[0][0], rel=1e-6)
    assert spot.theta <= B * spot.conversion  # invariant: cooling only removes heat


def test_reference_zero_order_hot_spot_at_complete_conversion():
    # analytic: at zero order dtheta/dtau = B exp(theta) - N theta does not depend on x, so
    # theta rises monotonically until the reactant runs out; the maximum is at x = 1 and,
    # below the Semenov bound, under the lower steady state B exp(theta) = N theta
    strong = hot_spot(10.0, 40.0, INF, 0.0)
    assert strong.at_complete_conversion and strong.conversion == 1.0
    steady = brentq(lambda t: 10.0 * math.exp(t) - 40.0 * t, 0.0, 1.0)
    assert 0.0 < strong.theta <= steady
    weak = hot_spot(10.0, 1.0, INF, 0.0)
    assert weak.at_complete_conversion and 1.0 < weak.theta <= 10.0


def test_sensitivity_is_smooth_near_the_peak():
    # numerical property the locator relies on: with rtol 1e-10 and a 1e-4 step, |s| is
    # unimodal on a fine grid straddling the Morbidelli-Varma boundary (B = 30, gamma = inf)
    def theta_star(N):
        return hot_spot(30.0, N).theta

    ratios = np.linspace(2.030, 2.054, 25)
    s = np.abs([morbidelli_varma_1988_normalized_sensitivity(theta_star, r * 30.0) for r in ratios])
    k = int(np.argmax(s))
    assert 0 < k < ratios.size - 1
    assert np.all(np.diff(s[:k + 1]) > 0.0) and np.all(np.diff(s[k:]) < 0.0)


def test_reference_deep_runaway_does_not_overflow():
    spot = hot_spot(300.0, 30.0)  # exp(theta*) ~ exp(300) would overflow an exp(2 theta) term
    assert math.isfinite(spot.theta) and 0.9 * 300.0 < spot.theta <= 300.0 * spot.conversion


def test_sign_indicators_match_the_profile_curvatures():
    p = profile(20.0, 36.0, n_points=401)
    inside = p.position <= p.hot_spot.position
    tb = thomas_bowes_1961_sign_indicator(p.conversion, p.theta, 20.0, 36.0)
    ae = adler_enig_1964_sign_indicator(p.conversion, p.theta, 20.0, 36.0)
    assert np.array_equal(np.sign(tb[inside]), np.sign(p.d2theta_dposition2[inside]))
    assert np.array_equal(np.sign(ae[inside]), np.sign(p.d2theta_dx2[inside]))
    # independent: finite differences of the sampled profile agree with the closed forms
    fd = np.gradient(p.dtheta_dposition, p.position, edge_order=2)
    core = inside & (p.position > 0.01)
    assert np.allclose(fd[core], p.d2theta_dposition2[core], rtol=1e-3, atol=1e-3 * np.max(np.abs(fd[core])))
    # inlet value of the Thomas-Bowes indicator: B(B - n - N)
    assert thomas_bowes_1961_sign_indicator(0.0, 0.0, 20.0, 36.0) == pytest.approx(20.0 * (20.0 - 1.0 - 36.0))


def test_critical_N_over_B_rejects_unknown_criterion():
    with pytest.raises(ValueError, match=r"criterion = 'adler_enigg'.*Did you mean 'adler_enig'"):
        critical_N_over_B(20.0, INF, "adler_enigg")
    assert set(CRITERIA) >= {"morbidelli_varma", "van_welsenaere_froment_maxima", "thomas_bowes",
                             "adler_enig", "semenov"}


# ---------------------------------------------------------------------------------------
# Critical N/B, first order, T0 = Tw, long tube (runaway.md table 1.7)
# ---------------------------------------------------------------------------------------
# REGRESSION values: independent numpy/scipy reproduction in the project notes of the
# published criteria; not numbers printed in the papers. Columns: MV (phi = N),
# VW&F I (T* = T_m), VW&F II = Thomas-Bowes, Adler-Enig.
TABLE_1_7 = {
    (INF, 15.0): (1.6425, 1.9627, 1.6929, 1.6548),
    (INF, 20.0): (1.8353, 2.0774, 1.8546, 1.8387),
    (INF, 30.0): (2.0417, 2.2120, 2.0460, 2.0420),
    (INF, 50.0): (2.2305, 2.3441, 2.2310, 2.2305),
    (INF, 100.0): (2.4044, 2.4719, 2.4045, 2.4044),
    (20.0, 15.0): (1.4205, 1.8109, 1.5294, 1.4361),
    (20.0, 20.0): (1.6263, 1.9262, 1.6861, 1.6412),
    (20.0, 30.0): (1.8611, 2.0620, 1.8781, 1.8641),
    (20.0, 50.0): (2.0666, 2.1957, 2.0692, 2.0667),
    (20.0, 100.0): (2.2505, 2.3255, 2.2507, 2.2505),
}
ROWS = list(TABLE_1_7)
ROW_IDS = [f"gamma={g:g}-B={B:g}" for g, B in ROWS]
# the curvature criteria cost more per row: a subset spanning the table keeps the file fast
SHAPE_ROWS = [row for row in ROWS if row[1] in (15.0, 30.0, 100.0)]
SHAPE_IDS = [f"gamma={g:g}-B={B:g}" for g, B in SHAPE_ROWS]
COLUMN = {"morbidelli_varma": 0, "van_welsenaere_froment_maxima": 1, "thomas_bowes": 2, "adler_enig": 3}


@functools.lru_cache(maxsize=None)
def _critical_result(B, gamma, criterion):
    result = critical_N_over_B(B, gamma, criterion)
    assert result.decided, result.reason
    return result


def _critical(B, gamma, criterion):
    return _critical_result(B, gamma, criterion).value


@pytest.mark.published("morbidelli_varma1988", "criterion: maximum of the normalized hot-spot "
                       "sensitivity, phi = N; numbers: regression of the reproduction in the "
                       "project notes (runaway.md table 1.7), not digits printed in the paper")
@pytest.mark.parametrize("gamma, B", ROWS, ids=ROW_IDS)
def test_critical_N_over_B_morbidelli_varma(gamma, B):
    # +-0.3 %: the notes' tolerance for MV (finite-difference sensitivity, printed to 5 s.f.)
    assert _critical(B, gamma, "morbidelli_varma") == pytest.approx(TABLE_1_7[gamma, B][0], rel=3e-3)


@pytest.mark.published("morbidelli_varma1988", "size of the sensitivity peak: regression of the "
                       "reproduction in runaway.md section 1.7 (|s|max = 1.5, 8, 70 at B = 5, 10, 15)")
@pytest.mark.parametrize("B, s_max", [(5.0, 1.5), (10.0, 8.0), (15.0, 70.0)])
def test_sensitivity_peak_size_grows_with_B(B, s_max):
    # printed to 1-2 significant figures: tolerance half a unit of the last printed digit
    result = _critical_result(B, INF, "morbidelli_varma")
    assert result.s_max < 0.0  # theta* falls as N (cooling) rises
    assert abs(result.s_max) == pytest.approx(s_max, abs=0.05 if B == 5.0 else 0.5)


@pytest.mark.published("van_welsenaere_froment1970", "criterion I (hot spot = extremum of the maxima "
                       "curve); numbers: regression of runaway.md table 1.7, not printed in the paper")
@pytest.mark.parametrize("gamma, B", ROWS, ids=ROW_IDS)
def test_critical_N_over_B_van_welsenaere_froment_maxima(gamma, B):
    # +-0.1 %: printed to 5 s.f.; a root of theta* - theta_m, no finite-difference noise
    value = _critical(B, gamma, "van_welsenaere_froment_maxima")
    assert value == pytest.approx(TABLE_1_7[gamma, B][1], rel=1e-3)


@pytest.mark.published("thomas_bowes1961", "inflection (convexity before the hot spot) applied to T(z)")
@pytest.mark.published("van_welsenaere_froment1970", "criterion II; numbers: regression of runaway.md "
                       "table 1.7, not printed in the paper")
@pytest.mark.parametrize("gamma, B", SHAPE_ROWS, ids=SHAPE_IDS)
def test_critical_N_over_B_thomas_bowes(gamma, B):
    assert _critical(B, gamma, "thomas_bowes") == pytest.approx(TABLE_1_7[gamma, B][2], rel=1e-3)


@pytest.mark.published("adler_enig1964", "convexity of the temperature-conversion curve before the "
                       "maximum; numbers: regression of runaway.md table 1.7, not printed in the paper")
@pytest.mark.parametrize("gamma, B", SHAPE_ROWS, ids=SHAPE_IDS)
def test_critical_N_over_B_adler_enig(gamma, B):
    assert _critical(B, gamma, "adler_enig") == pytest.approx(TABLE_1_7[gamma, B][3], rel=1e-3)


@pytest.mark.published("semenov1928", "N/B bound 1/psi_c(gamma)")
@pytest.mark.published("morbidelli_varma1988", "ordering of the criteria: regression of the structural "
                       "facts stated with runaway.md table 1.7")
@pytest.mark.parametrize("gamma", [INF, 20.0])
def test_ordering_of_criteria_and_approach_to_semenov(gamma):
    semenov = critical_N_over_B(50.0, gamma, "semenov").value
    assert semenov == pytest.approx(1.0 / semenov_1928_critical(gamma).psi_c, rel=1e-15)
    B_values = sorted(B for g, B in SHAPE_ROWS if g == gamma)
    for B in B_values:  # every row here has B >= 15
        mv, vwf, tb, ae = (_critical(B, gamma, c) for c in COLUMN)
        assert semenov > vwf > tb, (B, semenov, vwf, tb)
        assert tb >= ae * (1.0 - 2e-5)  # TB >= AE (they meet at large B: 2.40446 vs 2.40445)
        assert ae == pytest.approx(mv, rel=2e-2 if B < 20 else 1e-2)  # AE ~ MV
        if B >= 20.0:
            assert tb == pytest.approx(mv, rel=4e-2)  # MV ~ AE ~ TB for B >= 20
    for criterion in COLUMN:  # rising towards 1/psi_c as B grows, still well below it at B = 100
        values = [_critical(B, gamma, criterion) for B in B_values]
        assert all(b > a for a, b in zip(values, values[1:])), (criterion, values)
        assert values[-1] < 0.95 * semenov


@pytest.mark.parametrize("criterion", list(COLUMN))
def test_lower_gamma_lowers_critical_N_over_B(criterion):
    for B in (30.0, 100.0):
        assert _critical(B, 20.0, criterion) < _critical(B, INF, criterion)


# ---------------------------------------------------------------------------------------
# The profile-based tests on reference profiles bracket the critical N/B
# ---------------------------------------------------------------------------------------
@pytest.mark.parametrize("gamma, B", [(INF, 20.0), (20.0, 30.0)])
def test_profile_tests_bracket_the_critical_point(gamma, B):
    # invariant between the two implementations: the array-based tests (finite differences,
    # no model knowledge) must flip at the critical N/B found from the exact indicators
    tb_c = _critical(B, gamma, "thomas_bowes")
    ae_c = _critical(B, gamma, "adler_enig")
    for factor, expected in ((0.995, "runaway"), (1.005, "safe")):
        p = profile(B, factor * tb_c * B, gamma)
        assert van_welsenaere_froment_1970_inflection_verdict(p.position, p.theta)["verdict"] == expected
        assert van_welsenaere_froment_1970_inflection_verdict(
            p.position, p.theta, p.dtheta_dposition, p.d2theta_dposition2)["verdict"] == expected
        q = profile(B, factor * ae_c * B, gamma)
        assert adler_enig_1964_verdict(q.conversion, q.theta)["verdict"] == expected
        exact = adler_enig_1964_verdict(q.conversion, q.theta, q.dtheta_dx, q.d2theta_dx2)
        assert exact["verdict"] == expected
    # the array test locates the hot spot where the solver event put it
    p = profile(B, 1.005 * tb_c * B, gamma)
    out = van_welsenaere_froment_1970_inflection_verdict(p.position, p.theta, p.dtheta_dposition)
    assert out["z_hot_spot"] == pytest.approx(p.hot_spot.position, rel=1e-5)


# ---------------------------------------------------------------------------------------
# Barkelew (1959): envelope of the critical N/S
# ---------------------------------------------------------------------------------------
@pytest.mark.published("barkelew1959", "envelope of critical N/S against S (closed form from memory); "
                                       "large-S limit e (Semenov, derived)")
def test_barkelew_envelope_tends_to_the_semenov_value():
    # N/S -> e = 1/psi_c(inf) as S grows: consumption stops mattering (runaway.md 1.4, derived)
    assert barkelew_1959_critical_ratio(1e9) == pytest.approx(math.e, rel=1e-5)
    values = [barkelew_1959_critical_ratio(S) for S in (5.0, 10.0, 30.0, 100.0, 1e3)]
    assert all(a < b < math.e for a, b in zip(values, values[1:]))
    # no cooling needed while S <= 2.405^1.5: the envelope is 0 there
    assert barkelew_1959_critical_ratio(3.7) == 0.0 and barkelew_1959_critical_ratio(3.8) > 0.0


@pytest.mark.published("barkelew1959", "envelope from memory, compared with the Morbidelli-Varma boundary "
                                       "for gamma = inf of the project notes' reproduction (runaway.md table 1.7), "
                                       "which the published comparisons put on Barkelew's envelope (from memory)")
@pytest.mark.parametrize("B", [10.0, 15.0, 20.0, 30.0, 50.0, 100.0])
def test_barkelew_envelope_against_the_reproduced_boundary(B):
    reproduced = {10.0: 1.3050, **{b: TABLE_1_7[INF, b][0] for g, b in TABLE_1_7 if g == INF}}[B]
    # 0.5 %: the closed form of the envelope against a 5-digit reproduction (largest gap 0.43 % at B = 100)
    assert barkelew_1959_critical_ratio(B) == pytest.approx(reproduced, rel=5e-3)


@pytest.mark.parametrize("gamma, B", [row for row in ROWS if row[0] != INF])
def test_barkelew_envelope_is_conservative_at_finite_gamma(gamma, B):
    # lower gamma lowers the true boundary (runaway.md 1.7), so the gamma = inf envelope lies above it
    assert barkelew_1959_critical_ratio(B) > TABLE_1_7[gamma, B][0]


def test_barkelew_verdict_sides_and_critical_scale():
    critical = barkelew_1959_critical_ratio(20.0)
    assert barkelew_1959_verdict(1.01 * critical * 20.0, 20.0)["verdict"] == "safe"
    assert barkelew_1959_verdict(0.99 * critical * 20.0, 20.0)["verdict"] == "runaway"
    assert barkelew_1959_verdict(math.inf, 20.0)["verdict"] == "safe"
    # the factor on S (and the feed fraction) that puts the tube on the envelope
    N, S = 49.88, 23.0
    f = barkelew_1959_critical_scale(N, S)
    assert N / (f * S) == pytest.approx(barkelew_1959_critical_ratio(f * S), rel=1e-10)
    assert barkelew_1959_verdict(N, 0.999 * f * S)["verdict"] == "safe"
    assert barkelew_1959_verdict(N, 1.001 * f * S)["verdict"] == "runaway"
    with pytest.raises(ValueError, match="S = 0.0"):
        barkelew_1959_verdict(1.0, 0.0)
