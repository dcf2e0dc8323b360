"""2-D pseudo-homogeneous tube: collocation matrices, Graetz-type series, 1-D limit, closure."""
import numpy as np
import pytest
from scipy.integrate import solve_ivp
from scipy.optimize import brentq
from scipy.special import j0, j1

from simulator.model.radial import collocation, lumped_coefficient


@pytest.mark.parametrize("N", [1, 3, 5, 8])
def test_matrices_exact_on_even_polynomials(N):
    # analytic: d/dx x^2 = 2x, laplacian(x^2) = 4, laplacian(x^4) = 16 x^2 (degree within the basis)
    x, A, B, w = collocation(N)
    assert A @ x ** 2 == pytest.approx(2 * x, rel=1e-9, abs=1e-9)
    assert B @ x ** 2 == pytest.approx(np.full_like(x, 4.0), rel=1e-9)
    if N >= 2:
        assert B @ x ** 4 == pytest.approx(16 * x ** 2, rel=1e-8, abs=1e-8)
    # Gauss weights in u = x^2: integral of u^(N-1) 2x dx over [0, 1] = 1/N
    assert w @ x[:-1] ** (2 * (N - 1)) == pytest.approx(1.0 / N, rel=1e-12)


def _graetz_exact(Bi, zeta, terms=200):
    """Classical series for plug-flow cooling with a Robin wall (beta J1(beta) = Bi J0(beta)); analytic."""
    f = lambda b: b * j1(b) - Bi * j0(b)
    grid = np.linspace(1e-6, 700.0, 200_000)
    v = f(grid)
    roots = [brentq(f, grid[k], grid[k + 1]) for k in np.nonzero(np.sign(v[:-1]) != np.sign(v[1:]))[0][:terms]]
    b = np.array(roots)
    centre = np.sum(2 * Bi / ((b ** 2 + Bi ** 2) * j0(b)) * np.exp(-b ** 2 * zeta))
    mean = np.sum(4 * Bi ** 2 / (b ** 2 * (b ** 2 + Bi ** 2)) * np.exp(-b ** 2 * zeta))
    return centre, mean


@pytest.mark.parametrize("Bi,zeta,tol", [(1.0, 0.1, 1e-4), (5.0, 0.3, 1e-4), (20.0, 0.3, 1e-4)])
def test_graetz_series_within_collocation_error(Bi, zeta, tol):
    # Source: the series solution of cooling of a cylinder with a wall (Robin) condition, theta = sum
    # 2 Bi J0(beta r)/((beta^2 + Bi^2) J0(beta)) exp(-beta^2 zeta), beta J1(beta) = Bi J0(beta)
    # (H.S. Carslaw, J.C. Jaeger, Conduction of Heat in Solids, 2nd ed., 1959, ch. 7; from memory);
    # tolerance from the collocation error with N = 5 (1e-5 to 3e-7 at these zeta)
    N = 5
    x, A, B, w = collocation(N)

    def rhs(_, th):
        tw = -A[N, :N] @ th / (A[N, N] + Bi)      # Robin wall with medium at theta = 0
        return B[:N, :N] @ th + B[:N, N] * tw

    th = solve_ivp(rhs, (0, zeta), np.ones(N), method="Radau", rtol=1e-11, atol=1e-13).y[:, -1]
    tw = -A[N, :N] @ th / (A[N, N] + Bi)
    m = 2 * np.arange(N + 1)
    centre = (np.linalg.inv(x[:, None] ** m[None, :])[0] @ np.append(th, tw))
    exact_centre, exact_mean = _graetz_exact(Bi, zeta)
    assert centre == pytest.approx(exact_centre, abs=tol)
    assert w @ th == pytest.approx(exact_mean, abs=tol)


def test_lumped_coefficient_series():
    # series resistances 1/U = 1/h_w + R/(4 lambda) + 1/U_o (G.F. Froment, K.B. Bischoff, Chemical Reactor
    # Analysis and Design, 2nd ed., Wiley, 1990, ch. 11; from memory)
    assert lumped_coefficient(100.0, 1.0, 0.04, outer=100.0) == pytest.approx(1 / (0.01 + 0.01 + 0.01))


def test_large_conductivity_equals_one_dimensional_model(cases_dir):
    # invariant/limit: lambda_er -> large, h_w -> large: the 2-D tube is the 1-D tube with U = U_o
    from simulator.case.load import load_case
    from simulator.model.build import build_model
    from simulator.solve.integrate import simulate
    from simulator.solve.radial import solve_radial

    case = load_case(cases_dir / "froment1967_oxylene_packed_tube.toml")
    model = build_model(case)
    zs = np.linspace(0, case.tube.length, 301)
    two = solve_radial(model, 5, 1e4, 1e-1, 1e12, zs)
    one = simulate(case)
    assert two.ok
    assert two.closure["elements_relative"] < 1e-8
    assert two.closure["energy_relative"] < 1e-6
    rise_1d = one.T.max() - case.feed.temperature
    assert two.T_cup.max() - case.feed.temperature == pytest.approx(rise_1d, rel=2e-3)
    assert two.T_centre.max() >= two.T_cup.max()
