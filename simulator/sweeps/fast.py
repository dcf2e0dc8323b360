"""Compiled batch solver for sweeps over numeric operating parameters.

A sweep whose cases differ from one base case only in numbers such as the medium
temperature, the feed composition or a rate constant does not need a case file,
Cantera or a Python integrator per case. This module

1. maps each supported case path to the entries of the packed model it changes
   (:func:`pack_cases`): a batch is built by copying one base
   :class:`~simulator.model.build.Model`'s arrays and overwriting entries, with the
   same arithmetic as the case loader and :func:`~simulator.model.build.build_model`
   (so a packed case equals the normally built one, array for array);
2. integrates every case with its own step-size control in one compiled loop
   (:func:`batch_solve`): the Dormand-Prince 5(4) pair [1]_ with a per-variable
   tolerance, its continuous extension [2]_ for events inside a step, and numba
   ``prange`` over cases;
3. hands the cases the explicit method should not take (step budget exhausted,
   step size collapsed, non-finite state, optionally stiffness detected by the
   test of [3]_, or parameters the case loader would reject) to the normal path:
   raw case -> :func:`~simulator.case.load.load_case_dict` ->
   :func:`~simulator.model.build.build_model` ->
   :func:`~simulator.solve.integrate.simulate` (LSODA, implicit when stiff).

Semantics are those of :func:`~simulator.solve.integrate.simulate`: the hot spot is
the highest of the inlet, the outlet and the interior maxima where dT/dz changes sign
from + to -; the run stops where T first reaches ``design.temperature_limit`` (hot spot
and outlet are then the state there) or where P falls below 1 % of the feed pressure.
Inside a step, sign changes of dT/dz and threshold crossings are found on the
continuous extension (a quartic in the step fraction) at five sample points and
refined by bisection.

Only the sweep path imports this module (numba compiles on the first call and then
loads from its on-disk cache); ``tubesim run`` never does.

References
----------
.. [1] J.R. Dormand, P.J. Prince, "A family of embedded Runge-Kutta formulae,"
   J. Comput. Appl. Math., vol. 6, no. 1, pp. 19-26, 1980, doi:10.1016/0771-050X(80)90013-3.
.. [2] L.F. Shampine, "Some practical Runge-Kutta formulas," Math. Comp., vol. 46,
   no. 173, pp. 135-150, 1986, doi:10.1090/S0025-5718-1986-0815836-3.
.. [3] E. Hairer, S.P. Norsett, G. Wanner, Solving Ordinary Differential Equations I,
   2nd ed., Springer, 1993, section IV.2 (stiffness detection in DOPRI5).
"""
import dataclasses
import math
import re
import time

import numba
import numpy as np
from numba import njit, prange

from simulator.errors import CaseError
from simulator.model import kernel as K
from simulator.model.build import feed_molar_flow
from simulator.sweeps.paths import get_path

#: Status codes of :func:`batch_solve`, as the text ``simulate()`` uses.
STATUS_NAMES = ("completed", "stopped", "failed")
COMPLETED, STOPPED, FAILED = 0, 1, 2
#: Why a compiled run stopped (``stop`` of :func:`batch_solve`; 0: it did not, or the normal path ran it).
STOP_TEMPERATURE, STOP_PRESSURE = 1, 2
#: Why a case went to the normal (LSODA) path; index into this tuple.
FALLBACK_REASONS = ("none", "step budget exhausted", "step size collapsed", "non-finite state",
                    "stiffness detected", "parameters rejected by the fast map", "compiled loop raised")
_R_NONE, _R_BUDGET, _R_COLLAPSE, _R_NONFINITE, _R_STIFF, _R_INVALID, _R_RAISED = range(7)

#: Default relative tolerance of the compiled integrator, [-]. Chosen by measurement
#: against simulate() at rtol 1e-10: hot spot within 6e-4 K on the 2 500-case benchmark
#: map and 5e-3 K on a 12 x 12 o-xylene runaway grid, outlet conversion within 1e-5
#: (bench/bench_sweep.py, tests/test_sweeps_fast.py).
DEFAULT_RTOL = 1e-6
#: Default step budget (accepted + rejected steps) per case before falling back, [-]
DEFAULT_MAX_STEPS = 4000
#: Fraction of the feed pressure below which a run stops (as simulate()), [-]
PRESSURE_FLOOR = 0.01

_FRACTION = re.compile(r"^feed\.mole_fractions\.([^.]+)$")
_REACTION = re.compile(r"^reactions\.(\d+)\.(pre_exponential|activation_energy|temperature_exponent)$")
_FLOWS = ("molar_flow", "mass_flow", "volumetric_flow")
_SIMPLE = ("heat.medium.temperature", "heat.overall_coefficient", "feed.temperature", "feed.pressure")
_FEED_PATHS = ("feed.temperature", "feed.pressure") + tuple(f"feed.{k}" for k in _FLOWS)
_RX_COLUMN = {"pre_exponential": K.X_A, "activation_energy": K.X_E, "temperature_exponent": K.X_B}

# result columns of the compiled integrator
(_T_HOT, _Z_HOT, _X_OUT, _T_OUT, _P_OUT, _Z_OUT, _N_ACC, _N_REJ, _N_FEV, _STIFF) = range(10)
_N_RES = 10
# integrator outcomes
_OK, _STOP_LIMIT, _STOP_FLOOR, _BUDGET, _COLLAPSE, _NONFINITE, _STIFFNESS = range(7)


# -- which paths the fast map handles -----------------------------------------------------------
def unsupported_reason(paths, model=None):
    """Why the fast path cannot take these swept paths, or None if it can.

    Parameters
    ----------
    paths : sequence of str
        Dotted case paths varied in the sweep.
    model : simulator.model.build.Model, optional
        Base model; with it the case-specific conditions are checked too (heat mode,
        species in the feed table, reaction index, flow kind).

    Returns
    -------
    str or None
        One line naming the first path that is not supported and why.
    """
    paths = list(paths)
    if not paths:
        return "no varied paths"
    if len(set(paths)) != len(paths):
        return "a path is given twice"
    case = model.case if model is not None else None
    if case is not None and case.train:
        return "train: a reactor train is not run by the compiled batch integrator"
    if case is not None and case.heat.exchange and case.heat.arrangement == "counter-current":
        return ('heat.medium.arrangement = "counter-current": a two-point boundary-value problem, solved per '
                "case by shooting (not by the compiled batch integrator)")
    if case is not None and case.heat.arrangement == "wall-profile":
        return 'heat.medium.arrangement = "wall-profile": a given profile table, solved per case'
    if case is not None and case.radial.two_dimensional:
        return 'model.radial = "2d": the 2-D model is solved per case (not by the compiled batch integrator)'
    if case is not None and case.thermo.equation_of_state == "liquid":
        return 'thermo.equation_of_state = "liquid": solved per case (not by the compiled batch integrator)'
    for path in paths:
        if case is not None:
            try:
                get_path(case.raw, path)
            except CaseError as err:
                return str(err)
        frac = _FRACTION.match(path)
        react = _REACTION.match(path)
        if path in _SIMPLE:
            if case is not None and path.startswith("heat.") and not case.heat.exchange:
                return f"{path}: heat.mode = {case.heat.mode!r} has no medium"
        elif path in tuple(f"feed.{k}" for k in _FLOWS):
            if case is not None and path != f"feed.{case.feed.flow_kind}":
                return f"{path}: the case gives feed.{case.feed.flow_kind}"
        elif frac:
            if case is not None:
                table = case.raw.get("feed", {}).get("mole_fractions", {})
                if frac.group(1) not in table:
                    return f"{path}: {frac.group(1)!r} is not in the case's feed.mole_fractions"
        elif react:
            if case is not None:
                j = int(react.group(1))
                if j >= len(case.reactions):
                    return f"{path}: the case has {len(case.reactions)} reaction(s)"
        else:
            return (f"{path}: not in the fast parameter map (supported: {', '.join(_SIMPLE)}, feed.<flow>, "
                    "feed.mole_fractions.<species>, reactions.<j>.pre_exponential|activation_energy|"
                    "temperature_exponent)")
    if model is not None:
        ordr, rexp, ads = model.args[5], model.args[6], model.args[8]
        if np.any(ordr < 0.0) or np.any(rexp < 0.0) or np.any(ads[:, :, 2:] < 0.0):
            # 0 ** negative raises inside the compiled kernel, which a parallel loop cannot catch
            return "a reaction order or adsorption exponent is negative"
    return None


def supports(paths, model=None):
    """True if :func:`batch_solve` can sweep these paths (else use the per-case path).

    Parameters
    ----------
    paths : sequence of str
        Dotted case paths varied in the sweep, e.g. ``["heat.medium.temperature",
        "feed.mole_fractions.C2H4"]``.
    model : simulator.model.build.Model, optional
        Base model, for the case-specific checks of :func:`unsupported_reason`.

    Returns
    -------
    bool
    """
    return unsupported_reason(paths, model) is None


# -- the parameter map -------------------------------------------------------------------------
@dataclasses.dataclass(frozen=True)
class PackedCases:
    """Kernel arrays of a batch of cases, one row per case.

    Attributes
    ----------
    y0 : ndarray (N, n+4), initial state of one tube per case
    fp : ndarray (N, N_FP), float parameters (``kernel.F_*``)
    rx : ndarray (N, m, N_RX), reaction columns (``kernel.X_*``)
    scale : ndarray (N, n+4), state scales for the absolute tolerance
    feed_molar_flow : ndarray (N,), whole-reactor feed molar flow [mol/s]
    valid : ndarray of bool (N,), False where the case loader would reject the values
    shared : tuple, the arrays common to all cases (ip, nasa, mw, nu, ordr, rexp, ads, crit)
    """

    y0: np.ndarray
    fp: np.ndarray
    rx: np.ndarray
    scale: np.ndarray
    feed_molar_flow: np.ndarray
    valid: np.ndarray
    shared: tuple

    def args(self, i):
        """The ``kernel.rhs`` argument tuple of case ``i`` (as ``Model.args``)."""
        ip, nasa, mw, nu, ordr, rexp, ads, crit = self.shared
        return (ip, self.fp[i], nasa, mw, nu, ordr, rexp, self.rx[i], ads, crit)


def _fractions(raw_table, changes):
    """Feed mole fractions as apply_values + the case loader produce them; None if rejected."""
    table = {k: v for k, v in raw_table.items()}
    for v in changes.values():
        if not (0.0 <= v <= 1.0):
            return None
    if any(isinstance(v, bool) or not isinstance(v, (int, float)) for v in table.values()):
        return None
    varied_sum = sum(changes.values())
    others = {k: float(v) for k, v in table.items() if k not in changes}
    others_sum = sum(others.values())
    if others:
        if varied_sum >= 1.0 or others_sum <= 0.0:
            return None
        scale = (1.0 - varied_sum) / others_sum
        for k, v in others.items():
            table[k] = v * scale
    elif not math.isclose(varied_sum, 1.0, rel_tol=0.0, abs_tol=1e-12):
        return None
    table.update(changes)
    fractions = [(s, float(v)) for s, v in table.items()]
    if not all(0.0 <= v <= 1.0 for _, v in fractions):
        return None
    total = sum(v for _, v in fractions)
    if abs(total - 1.0) > 1e-6:
        return None
    return tuple((s, v / total) for s, v in fractions)


def _feed_state(model, T0, P0, flow, changes):
    """(F0 per tube, F_total, mu0, mu_exponent) for one feed, exactly as build_model; None if rejected."""
    case, species = model.case, model.species
    out = None
    if changes:
        fractions = _fractions(case.raw["feed"]["mole_fractions"], changes)
    else:
        fractions = case.feed.mole_fractions
    if fractions is not None:
        feed = dataclasses.replace(case.feed, temperature=T0, pressure=P0, mole_fractions=fractions,
                                   flow_value=flow)
        shadow = dataclasses.replace(case, feed=feed)
        names = species.names
        F_total = feed_molar_flow(shadow, species)
        x0 = np.array([dict(fractions).get(s, 0.0) for s in names])
        F0 = x0 * F_total / case.tube.count
        mu0, mu_exp = model.args[1][K.F_MU0], model.args[1][K.F_MUEXP]
        ok = True
        if case.pressure_drop.model != "none" and math.isnan(case.pressure_drop.viscosity):
            ok, mu0, mu_exp = _viscosity_law(shadow, species, x0)
        if ok:
            out = (F0, F_total, mu0, mu_exp)
    return out


def _viscosity_law(case, species, x0):
    """(ok, mu0, exponent) of mu = mu0 (T/T_feed)^a, as build_model derives it from Cantera."""
    from simulator.errors import ThermoError
    from simulator.thermo.species_data import mixture_viscosity

    T0, P0 = case.feed.temperature, case.feed.pressure
    try:
        mu0 = mixture_viscosity(species, case.thermo, T0, P0, x0)
        mu1 = mixture_viscosity(species, case.thermo, T0 + 100.0, P0, x0)
    except ThermoError:
        return False, math.nan, math.nan
    return True, mu0, float(np.log(mu1 / mu0) / np.log((T0 + 100.0) / T0))


def pack_cases(model, params, paths):
    """Kernel arrays of many cases from one base model and a table of swept values.

    Parameters
    ----------
    model : simulator.model.build.Model
        Base model (``build_model`` of the base case).
    params : array_like (N, len(paths))
        Values of the swept paths per case, in SI units of each path (as
        :func:`simulator.sweeps.paths.grid` gives them).
    paths : sequence of str
        Swept paths; :func:`supports` must be True for them.

    Returns
    -------
    PackedCases
        Rows equal to ``build_model`` of the case that ``apply_values`` and
        ``load_case_dict`` make from the same values; ``valid`` is False where the
        loader would reject the values (those cases take the normal path).

    Raises
    ------
    ValueError
        If the paths are not supported for this model.
    """
    why = unsupported_reason(paths, model)
    if why is not None:
        raise ValueError(f"fast sweep: {why}")
    params = np.asarray(params, dtype=float)
    paths = list(paths)
    if params.ndim != 2 or params.shape[1] != len(paths):
        raise ValueError(f"fast sweep: params has shape {params.shape}; expected (cases, {len(paths)})")
    case = model.case
    N = params.shape[0]
    n = model.n
    ip, fp0, nasa, mw, nu, ordr, rexp, rx0, ads, crit = model.args
    y0 = np.tile(model.y0, (N, 1))
    fp = np.tile(fp0, (N, 1))
    rx = np.tile(rx0, (N, 1, 1))
    scale = np.tile(model.scale, (N, 1))
    flows = np.full(N, model.feed_molar_flow)
    valid = np.all(np.isfinite(params), axis=1)
    col = {p: params[:, k] for k, p in enumerate(paths)}

    for path, v in col.items():
        react = _REACTION.match(path)
        if path == "heat.medium.temperature":
            valid &= v > 0.0
            fp[:, K.F_TC] = v
            y0[:, n + 2] = v
            scale[:, n + 2] = np.maximum(v, 1.0)
        elif path == "heat.overall_coefficient":
            valid &= v >= 0.0
            fp[:, K.F_U] = v
        elif react:
            j, what = int(react.group(1)), react.group(2)
            if what == "pre_exponential":
                valid &= v >= 0.0
            elif what == "temperature_exponent":
                valid &= (v >= -10.0) & (v <= 10.0)
            rx[:, j, _RX_COLUMN[what]] = v

    fraction_paths = [(p, _FRACTION.match(p).group(1)) for p in paths if _FRACTION.match(p)]
    if fraction_paths or any(p in col for p in _FEED_PATHS):
        T_col = col.get("feed.temperature")
        P_col = col.get("feed.pressure")
        flow_col = col.get(f"feed.{case.feed.flow_kind}")
        feed_T = np.full(N, case.feed.temperature) if T_col is None else T_col
        feed_P = np.full(N, case.feed.pressure) if P_col is None else P_col
        flow_v = np.full(N, case.feed.flow_value) if flow_col is None else flow_col
        valid &= (feed_T > 0.0) & (feed_P > 0.0) & (flow_v > 0.0)
        # one feed computation per distinct feed (a grid repeats each feed many times)
        feed_cols = np.column_stack([feed_T, feed_P, flow_v] + [col[p] for p, _ in fraction_paths])
        rows = np.nonzero(valid)[0]
        unique, inverse = np.unique(feed_cols[rows], axis=0, return_inverse=True)
        inverse = inverse.reshape(-1)
        U = unique.shape[0]
        F0u = np.zeros((U, n))
        Ftot_u = np.zeros(U)
        mu_u = np.zeros((U, 2))
        ok_u = np.zeros(U, dtype=bool)
        for u in range(U):
            T0, P0, flow = (float(v) for v in unique[u, :3])
            changes = {s: float(unique[u, 3 + k]) for k, (_, s) in enumerate(fraction_paths)}
            state = _feed_state(model, T0, P0, flow, changes)
            if state is not None:
                F0u[u], Ftot_u[u], mu_u[u, 0], mu_u[u, 1] = state
                ok_u[u] = True
        valid[rows[~ok_u[inverse]]] = False
        rows, inverse = rows[ok_u[inverse]], inverse[ok_u[inverse]]
        F0 = F0u[inverse]
        Ft0u = np.array([F0u[u].sum() for u in range(U)])
        Gu = np.array([float(F0u[u] @ mw) / model.area for u in range(U)])
        Ft0 = Ft0u[inverse]
        T0 = feed_T[rows]
        P0 = feed_P[rows]
        Tc0 = fp[rows, K.F_TC] if case.heat.exchange else T0
        y0[rows, :n] = F0
        y0[rows, n] = T0
        y0[rows, n + 1] = P0
        y0[rows, n + 2] = Tc0
        flows[rows] = Ftot_u[inverse]
        fp[rows, K.F_G] = Gu[inverse]
        fp[rows, K.F_PMIN] = 1e-3 * P0
        fp[rows, K.F_T0] = T0
        fp[rows, K.F_P0] = P0
        fp[rows, K.F_FT0] = Ft0
        fp[rows, K.F_MUT0] = T0
        fp[rows, K.F_MU0] = mu_u[inverse, 0]
        fp[rows, K.F_MUEXP] = mu_u[inverse, 1]
        scale[rows, :n] = Ft0[:, None]
        scale[rows, n] = T0
        scale[rows, n + 1] = P0
        scale[rows, n + 2] = np.maximum(Tc0, 1.0)
        scale[rows, n + 3] = Ft0 * 30.0 * np.maximum(T0, 300.0)
    return PackedCases(y0=y0, fp=np.ascontiguousarray(fp), rx=np.ascontiguousarray(rx), scale=scale,
                       feed_molar_flow=flows, valid=valid,
                       shared=(ip, nasa, mw, nu, ordr, rexp, ads, crit))


# -- the compiled integrator ---------------------------------------------------------------------
# Dormand-Prince 5(4): nodes, stage coefficients, 5th-order weights, error weights (y5 - y4) [1]
_C = np.array([0.0, 1 / 5, 3 / 10, 4 / 5, 8 / 9, 1.0, 1.0])
_A = np.array([
    [0.0, 0.0, 0.0, 0.0, 0.0, 0.0],
    [1 / 5, 0.0, 0.0, 0.0, 0.0, 0.0],
    [3 / 40, 9 / 40, 0.0, 0.0, 0.0, 0.0],
    [44 / 45, -56 / 15, 32 / 9, 0.0, 0.0, 0.0],
    [19372 / 6561, -25360 / 2187, 64448 / 6561, -212 / 729, 0.0, 0.0],
    [9017 / 3168, -355 / 33, 46732 / 5247, 49 / 176, -5103 / 18656, 0.0],
    [35 / 384, 0.0, 500 / 1113, 125 / 192, -2187 / 6784, 11 / 84],
])
_E = np.array([-71 / 57600, 0.0, 71 / 16695, -71 / 1920, 17253 / 339200, -22 / 525, 1 / 40])
# continuous extension [2]: y(z + x h) = y + h sum_j Q_j x^(j+1), Q = K^T P (as scipy's RK45)
_P = np.array([
    [1.0, -8048581381 / 2820520608, 8663915743 / 2820520608, -12715105075 / 11282082432],
    [0.0, 0.0, 0.0, 0.0],
    [0.0, 131558114200 / 32700410799, -68118460800 / 10900136933, 87487479700 / 32700410799],
    [0.0, -1754552775 / 470086768, 14199869525 / 1410260304, -10690763975 / 1880347072],
    [0.0, 127303824393 / 49829197408, -318862633887 / 49829197408, 701980252875 / 199316789632],
    [0.0, -282668133 / 205662961, 2019193451 / 616988883, -1453857185 / 822651844],
    [0.0, 40617522 / 29380423, -110615467 / 29380423, 69997945 / 29380423],
])
_SAMPLES = np.array([0.0, 0.25, 0.5, 0.75, 1.0])
_BISECTIONS = 48


@njit(cache=True, inline="always")
def _store_counts(res, n_acc, n_rej, nfev):
    """Record the accepted and rejected steps and the right-hand-side calls of one case."""
    res[_N_ACC] = n_acc
    res[_N_REJ] = n_rej
    res[_N_FEV] = nfev


@njit(cache=True, error_model="numpy")
def _q_row(Kst, i, P, q):
    for j in range(4):
        s = 0.0
        for k in range(7):
            s += Kst[k, i] * P[k, j]
        q[j] = s


@njit(cache=True, error_model="numpy")
def _ext(q, x):
    """sum_j q_j x^(j+1): (y(x) - y(0)) / h on the continuous extension."""
    return x * (q[0] + x * (q[1] + x * (q[2] + x * q[3])))


@njit(cache=True, error_model="numpy")
def _dext(q, x):
    """dy/dz on the continuous extension at step fraction x."""
    return q[0] + x * (2.0 * q[1] + x * (3.0 * q[2] + x * 4.0 * q[3]))


@njit(cache=True, error_model="numpy")
def _cross(q, y_start, h, level, lo, hi):
    """Step fraction in [lo, hi] where y_start + h ext(x) crosses level (sign differs at lo, hi)."""
    f_lo = y_start + h * _ext(q, lo) - level
    for _ in range(_BISECTIONS):
        mid = 0.5 * (lo + hi)
        f_mid = y_start + h * _ext(q, mid) - level
        if (f_mid > 0.0) == (f_lo > 0.0):
            lo, f_lo = mid, f_mid
        else:
            hi = mid
    return hi


@njit(cache=True, error_model="numpy")
def _peak(q, lo, hi):
    """Step fraction in [lo, hi] where dT/dz changes sign from + (at lo) to - (at hi)."""
    for _ in range(_BISECTIONS):
        mid = 0.5 * (lo + hi)
        if _dext(q, mid) > 0.0:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi)


@njit(cache=True, error_model="numpy")
def _sane(y, n, frozen):
    """True if the kernel can evaluate this state: finite, T > 0, some positive flow."""
    total = 0.0
    for i in range(y.shape[0]):
        if not math.isfinite(y[i]):
            return False
    for i in range(n):
        total += max(y[i], 0.0)
    return (total > 0.0 or frozen) and y[n] > 0.0


@njit(cache=True, error_model="numpy")
def _rms(v, w):
    s = 0.0
    for i in range(v.shape[0]):
        e = v[i] / w[i]
        s += e * e
    return math.sqrt(s / v.shape[0])


@njit(cache=True, error_model="numpy")
def _integrate(y0, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, atol, rtol, length, hmax,
               max_steps, T_lim, p_floor, key, stiff_check, res):
    """One tube from z = 0 to ``length`` with its own step control; writes ``res``, returns an outcome code."""
    nv = y0.shape[0]
    n = ip[K.I_N]
    Kst = np.empty((7, nv))
    y = y0.copy()
    yn = np.empty(nv)
    yt = np.empty(nv)
    y6 = np.empty(nv)
    w = np.empty(nv)
    e = np.empty(nv)
    q = np.empty(4)
    qa = np.empty((nv, 4))
    z = 0.0
    frozen = ip[K.I_FROZEN] == 1
    nfev = 0
    if not _sane(y, n, frozen):
        res[_N_FEV] = nfev
        return _NONFINITE
    K.rhs(z, y, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, Kst[0])
    nfev = 1
    n_acc = 0
    n_rej = 0
    stiff_count = 0
    calm_count = 0
    stiff_seen = 0
    F0k = y0[key]
    T_hot = y[n]
    z_hot = 0.0
    res[_N_ACC] = 0.0
    res[_N_REJ] = 0.0
    res[_STIFF] = 0.0
    if y[n] >= T_lim:  # already at the limit at the inlet
        res[_T_HOT] = y[n]
        res[_Z_HOT] = 0.0
        res[_X_OUT] = 0.0
        res[_T_OUT] = y[n]
        res[_P_OUT] = y[n + 1]
        res[_Z_OUT] = 0.0
        res[_N_FEV] = nfev
        return _STOP_LIMIT
    for i in range(nv):
        if not math.isfinite(Kst[0, i]):
            res[_N_FEV] = nfev
            return _NONFINITE
        w[i] = atol[i] + rtol * abs(y[i])
    # initial step (Hairer, Norsett, Wanner, section II.4)
    d0 = _rms(y, w)
    d1 = _rms(Kst[0], w)
    h0 = 1e-6 * length if (d0 < 1e-5 or d1 < 1e-5) else 0.01 * d0 / d1
    h0 = min(h0, length)
    for i in range(nv):
        yt[i] = y[i] + h0 * Kst[0, i]
    d2 = math.inf
    if _sane(yt, n, frozen):
        K.rhs(h0, yt, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, Kst[1])
        nfev += 1
        for i in range(nv):
            e[i] = (Kst[1, i] - Kst[0, i]) / h0
        d2 = _rms(e, w)
        if not math.isfinite(d2):
            d2 = math.inf
    if max(d1, d2) <= 1e-15:
        h1 = max(1e-6 * length, h0 * 1e-3)
    else:
        h1 = (0.01 / max(d1, d2)) ** 0.2
    h = min(100.0 * h0, h1, hmax)
    if not h > 0.0:
        h = 1e-6 * length
    h_min = 1e-12 * length
    rejected_last = False
    while True:
        last = False
        if z + 1.0001 * h >= length:
            h = length - z
            last = True
        finite = True
        for s in range(1, 7):
            for i in range(nv):
                acc = 0.0
                for k in range(s):
                    acc += _A[s, k] * Kst[k, i]
                yt[i] = y[i] + h * acc
            if not _sane(yt, n, frozen):  # the kernel would divide by zero or take 0**negative
                finite = False
                break
            nfev += 1
            if s == 6:
                for i in range(nv):
                    yn[i] = yt[i]
                K.rhs(z + h, yn, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, Kst[6])
            else:
                if s == 5:
                    for i in range(nv):
                        y6[i] = yt[i]
                K.rhs(z + _C[s] * h, yt, ip, fp, nasa, mw, nu, ordr, rexp, rx, ads, crit, Kst[s])
        if finite:
            for i in range(nv):
                acc = 0.0
                for k in range(7):
                    acc += _E[k] * Kst[k, i]
                e[i] = h * acc
                w[i] = atol[i] + rtol * max(abs(y[i]), abs(yn[i]))
                if not math.isfinite(Kst[6, i]):
                    finite = False
        err = _rms(e, w) if finite else math.inf
        if err <= 1.0:
            # stiffness test of DOPRI5: h * |f(y1) - f(y6)| / |y1 - y6| > 3.25 on 15 steps in a row
            num = 0.0
            den = 0.0
            for i in range(nv):
                a = (Kst[6, i] - Kst[5, i]) / w[i]
                b = (yn[i] - y6[i]) / w[i]
                num += a * a
                den += b * b
            if den > 0.0 and h * math.sqrt(num / den) > 3.25:
                calm_count = 0
                stiff_count += 1
                if stiff_count >= 15:
                    stiff_seen = 1
                    if stiff_check:
                        _store_counts(res, n_acc, n_rej, nfev)
                        res[_STIFF] = 1.0
                        return _STIFFNESS
            else:
                calm_count += 1
                if calm_count >= 6:
                    stiff_count = 0
            # events inside the accepted step, on the continuous extension
            x_floor = 2.0
            if yn[n + 1] < p_floor:
                _q_row(Kst, n + 1, _P, q)
                x_floor = _cross(q, y[n + 1], h, p_floor, 0.0, 1.0)
            _q_row(Kst, n, _P, q)
            T_a = y[n]
            g_prev = Kst[0, n]
            x_prev = 0.0
            x_lim_hi = -1.0
            for t in range(1, 5):
                xs = _SAMPLES[t]
                g = Kst[6, n] if t == 4 else _dext(q, xs)
                if g_prev > 0.0 and g <= 0.0:
                    xm = _peak(q, x_prev, xs)
                    if xm >= x_floor:
                        break
                    Tm = T_a + h * _ext(q, xm)
                    if Tm >= T_lim:
                        x_lim_hi = xm
                        break
                    if Tm > T_hot:
                        T_hot = Tm
                        z_hot = z + xm * h
                g_prev = g
                x_prev = xs
            if x_lim_hi < 0.0 and yn[n] >= T_lim:
                x_lim_hi = 1.0
            x_stop = 2.0
            outcome = _OK
            if x_lim_hi >= 0.0:
                x_stop = _cross(q, T_a, h, T_lim, 0.0, x_lim_hi)
                outcome = _STOP_LIMIT
            if x_floor < x_stop:
                x_stop = x_floor
                outcome = _STOP_FLOOR
            n_acc += 1
            if outcome != _OK:
                for i in range(nv):
                    _q_row(Kst, i, _P, qa[i])
                    yt[i] = y[i] + h * _ext(qa[i], x_stop)
                z_e = z + x_stop * h
                if outcome == _STOP_LIMIT:
                    T_hot = yt[n]
                    z_hot = z_e
                elif yt[n] > T_hot:  # pressure floor: the stop point is the outlet
                    T_hot = yt[n]
                    z_hot = z_e
                res[_T_HOT] = T_hot
                res[_Z_HOT] = z_hot
                res[_X_OUT] = (F0k - yt[key]) / F0k
                res[_T_OUT] = yt[n]
                res[_P_OUT] = yt[n + 1]
                res[_Z_OUT] = z_e
                _store_counts(res, n_acc, n_rej, nfev)
                res[_STIFF] = stiff_seen
                return outcome
            z = length if last else z + h
            for i in range(nv):
                y[i] = yn[i]
                Kst[0, i] = Kst[6, i]
            if last:
                break
            fac = 10.0 if err == 0.0 else min(10.0, 0.9 * err ** -0.2)
            if rejected_last:
                fac = min(fac, 1.0)
            h = min(h * fac, hmax)
            rejected_last = False
        else:
            n_rej += 1
            fac = 0.25 if not finite else max(0.2, 0.9 * err ** -0.2)
            h *= fac
            rejected_last = True
            if h < h_min:
                _store_counts(res, n_acc, n_rej, nfev)
                return _NONFINITE if not finite else _COLLAPSE
        if n_acc + n_rej >= max_steps:
            _store_counts(res, n_acc, n_rej, nfev)
            return _BUDGET
    if y[n] > T_hot:
        T_hot = y[n]
        z_hot = length
    res[_T_HOT] = T_hot
    res[_Z_HOT] = z_hot
    res[_X_OUT] = (F0k - y[key]) / F0k
    res[_T_OUT] = y[n]
    res[_P_OUT] = y[n + 1]
    res[_Z_OUT] = length
    _store_counts(res, n_acc, n_rej, nfev)
    res[_STIFF] = stiff_seen
    return _OK


@njit(cache=True, parallel=True, error_model="numpy")
def _solve_batch(order, y0, fp, rx, atol, p_floor, ip, nasa, mw, nu, ordr, rexp, ads, crit, rtol, length, hmax,
                 max_steps, T_lim, key, stiff_check, res, code):
    for k in prange(order.shape[0]):
        c = order[k]
        code[c] = _integrate(y0[c], ip, fp[c], nasa, mw, nu, ordr, rexp, rx[c], ads, crit, atol[c], rtol, length,
                             hmax, max_steps, T_lim[c], p_floor[c], key, stiff_check, res[c])


_RESULT_NAMES = ("hot_spot_temperature_K", "hot_spot_position_m", "outlet_conversion", "outlet_temperature_K",
                 "outlet_pressure_Pa", "outlet_position_m")


# -- driver --------------------------------------------------------------------------------------
def _solve_normally(model, paths, values, temperature_limit, case_dir):
    """The per-case path: raw case -> Case -> Model -> simulate(); returns a result dict."""
    from simulator.case.load import load_case_dict
    from simulator.model.build import build_model
    from simulator.solve.integrate import simulate
    from simulator.sweeps.paths import apply_values

    case = model.case
    try:
        raw = apply_values(case.raw, dict(zip(paths, (float(v) for v in values))))
        new = load_case_dict(raw, source_path=case.source_path, case_dir=case_dir)
        built = build_model(new, species=model.species)
        limit = math.nan if math.isinf(temperature_limit) else float(temperature_limit)
        new = dataclasses.replace(new, design=dataclasses.replace(new.design, temperature_limit=limit))
        result = simulate(new, model=built)
    except CaseError as err:  # the loader refuses these values: an invalid case, not a numerical failure
        text = "; ".join(" ".join(line.split()) for line in err.problems) or "(no message)"
        return {"status": FAILED, "error": f"{type(err).__name__}: {text}", "invalid": True}
    except Exception as err:  # noqa: BLE001 - recorded per case, as the sweep engine does
        text = " ".join(str(err).split()) or "(no message)"
        return {"status": FAILED, "error": f"{type(err).__name__}: {text}"}
    out = {"status": STATUS_NAMES.index(result.status), "error": None,
           "hot_spot_temperature_K": result.hot_spot["temperature_K"],
           "hot_spot_position_m": result.hot_spot["position_m"],
           "outlet_conversion": result.outlet_conversion,
           "outlet_temperature_K": float(result.T[-1]), "outlet_pressure_Pa": float(result.P[-1]),
           "outlet_position_m": float(result.z[-1]),
           "steps": int(result.solver_stats.get("steps", -1)),
           "rhs_evaluations": int(result.solver_stats.get("rhs_evaluations", -1))}
    if result.status == "failed":
        out["error"] = result.termination
    return out


def _order(N, threads):
    """Case order handed to prange: interleaved, so each thread's share mixes the whole map."""
    t = max(int(threads), 1)
    return np.concatenate([np.arange(r, N, t) for r in range(t)]).astype(np.int64)


def batch_solve(model, params, paths, *, rtol=DEFAULT_RTOL, atol_scale=None, max_steps=DEFAULT_MAX_STEPS,
                temperature_limit=None, threads=None, stiffness_fallback=False, fallback=True, case_dir=None,
                packed=None):
    """Solve many cases that differ from the base case only in swept numbers.

    Parameters
    ----------
    model : simulator.model.build.Model
        Base model (``build_model`` of the base case).
    params : array_like (N, len(paths))
        Swept values per case, in SI units of each path.
    paths : sequence of str
        Swept dotted paths (see :func:`supports`).
    rtol : float
        Relative tolerance of the compiled integrator, [-]
    atol_scale : float, optional
        Absolute tolerance per variable = state scale x atol_scale; default the case's
        ``[solver] atol_scale``, [-]
    max_steps : int
        Steps (accepted + rejected) per case before the case falls back to LSODA, [-]
    temperature_limit : float or array_like (N,), optional
        Temperature at which a run stops, per case or for all; NaN or inf for none;
        default the case's ``design.temperature_limit``. The fallback cases use the
        same value, [K]
    threads : int, optional
        numba threads for this call; default numba's current setting, [-]
    stiffness_fallback : bool
        Also fall back when the stiffness test of DOPRI5 fires (15 stiff steps in a row).
    fallback : bool
        Solve the fallback cases with ``simulate()``; if False they are left as NaN
        with status "failed" (for measuring the compiled part alone).
    case_dir : str, optional
        Folder that relative paths in the case resolve against, for the fallback cases;
        default the folder of the base case's file.
    packed : PackedCases, optional
        :func:`pack_cases` of the same ``model``, ``params`` and ``paths``, when the caller
        already has it (it is not packed again).

    Returns
    -------
    dict
        ``status`` (int8, index into :data:`STATUS_NAMES`), ``hot_spot_temperature_K``,
        ``hot_spot_position_m``, ``outlet_conversion``, ``outlet_temperature_K``,
        ``outlet_pressure_Pa``, ``outlet_position_m`` (float arrays, SI; the outlet is
        the stop point of a stopped run), ``fallback`` (bool),
        ``fallback_reason`` (int8, index into :data:`FALLBACK_REASONS`), ``error``
        (list, text for failed cases else None), ``invalid`` (bool: the case loader
        refused the values; status "failed"), ``stop`` (int: :data:`STOP_TEMPERATURE`,
        :data:`STOP_PRESSURE` or 0), ``steps``, ``rhs_evaluations`` (int
        arrays), ``stiff`` (bool: the stiffness test fired, informational) and
        ``timing`` (dict of seconds: pack, compiled, fallback).
    """
    t0 = time.perf_counter()
    paths = list(paths)
    if packed is None:
        packed = pack_cases(model, params, paths)
    params = np.asarray(params, dtype=float)
    case = model.case
    N = packed.y0.shape[0]
    if atol_scale is None:
        atol_scale = case.solver.atol_scale
    atol = packed.scale * atol_scale
    if temperature_limit is None:
        temperature_limit = case.design.temperature_limit
    T_lim = np.broadcast_to(np.asarray(temperature_limit, dtype=float), (N,)).copy()
    T_lim[np.isnan(T_lim)] = math.inf
    p_floor = PRESSURE_FLOOR * packed.y0[:, model.n + 1]
    length = float(case.tube.length)
    hmax = float(case.solver.max_step) if case.solver.max_step > 0 else length
    res = np.full((N, _N_RES), np.nan)
    code = np.full(N, -1, dtype=np.int64)
    ip, nasa, mw, nu, ordr, rexp, ads, crit = packed.shared
    t1 = time.perf_counter()
    old_threads = numba.get_num_threads()
    if threads is not None:
        numba.set_num_threads(max(1, min(int(threads), numba.config.NUMBA_NUM_THREADS)))
    try:
        use = np.nonzero(packed.valid)[0]
        order = use[_order(len(use), numba.get_num_threads())]
        try:
            with numba.parallel_chunksize(4):
                _solve_batch(order, packed.y0, packed.fp, packed.rx, atol, p_floor, ip, nasa, mw, nu, ordr, rexp,
                             ads, crit, float(rtol), length, hmax, int(max_steps), T_lim, int(model.key_index),
                             bool(stiffness_fallback), res, code)
        except (SystemError, ArithmeticError, ValueError):
            pass  # an exception in the compiled loop: the cases it left unfinished go to the normal path
    finally:
        numba.set_num_threads(old_threads)
    t2 = time.perf_counter()

    status = np.full(N, FAILED, dtype=np.int8)
    status[(code == _OK)] = COMPLETED
    status[(code == _STOP_LIMIT) | (code == _STOP_FLOOR)] = STOPPED
    reason = np.zeros(N, dtype=np.int8)
    reason[code == _BUDGET] = _R_BUDGET
    reason[code == _COLLAPSE] = _R_COLLAPSE
    reason[code == _NONFINITE] = _R_NONFINITE
    reason[code == _STIFFNESS] = _R_STIFF
    reason[packed.valid & (code == -1)] = _R_RAISED
    reason[~packed.valid] = _R_INVALID
    back = reason != _R_NONE
    out = {
        "status": status,
        "hot_spot_temperature_K": res[:, _T_HOT].copy(),
        "hot_spot_position_m": res[:, _Z_HOT].copy(),
        "outlet_conversion": res[:, _X_OUT].copy(),
        "outlet_temperature_K": res[:, _T_OUT].copy(),
        "outlet_pressure_Pa": res[:, _P_OUT].copy(),
        "outlet_position_m": res[:, _Z_OUT].copy(),
        "fallback": back,
        "fallback_reason": reason,
        "error": [None] * N,
        "steps": np.nan_to_num(res[:, _N_ACC], nan=0.0).astype(np.int64),
        "rhs_evaluations": np.nan_to_num(res[:, _N_FEV], nan=0.0).astype(np.int64),
        "stiff": res[:, _STIFF] == 1.0,
        "invalid": np.zeros(N, dtype=bool),
        "stop": np.where(code == _STOP_LIMIT, STOP_TEMPERATURE, np.where(code == _STOP_FLOOR, STOP_PRESSURE, 0)),
    }
    for name in _RESULT_NAMES:
        out[name][back] = np.nan
    for i in np.nonzero(back)[0]:
        if not fallback:
            out["error"][i] = f"fell back ({FALLBACK_REASONS[reason[i]]}); fallback disabled"
            continue
        one = _solve_normally(model, paths, params[i], T_lim[i], case_dir)
        out["status"][i] = one["status"]
        out["error"][i] = one["error"]
        out["invalid"][i] = one.get("invalid", False)
        out["stop"][i] = 0
        for name in _RESULT_NAMES + ("steps", "rhs_evaluations"):
            if name in one:
                out[name][i] = one[name]
    t3 = time.perf_counter()
    out["timing"] = {"pack": t1 - t0, "compiled": t2 - t1, "fallback": t3 - t2}
    return out


def _refresh_cache():
    """Flush this module's compiled cache when it or the kernel it calls changed (see jit_cache)."""
    from numba.core.registry import CPUDispatcher

    from simulator import units
    from simulator.model import pressure_drop
    from simulator.model.jit_cache import refresh_if_sources_changed
    from simulator.thermo import nasa7

    compiled = [v for v in globals().values() if isinstance(v, CPUDispatcher)]
    if compiled:
        refresh_if_sources_changed("sweep-integrator", compiled,
                                   [__file__, K.__file__, nasa7.__file__, pressure_drop.__file__, units.__file__])


_refresh_cache()
