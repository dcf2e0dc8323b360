"""simulate_radial(case) -> Result: a ``[model] radial = "2d"`` run, reported like a 1-D run.

The 2-D tube (:mod:`simulator.model.radial`, integrated by :class:`simulator.solve.radial.RadialTube`)
gives the state at every radial collocation point. What the run reports:

* ``T`` (profile.csv ``temperature_K``), the outlet, conversion, duty and closure: on the
  cup-mixing flows and enthalpy (the Gauss-weighted means of the points), so element and
  energy closure are checked exactly as on a 1-D run;
* ``hot_spot``: the centre line (the highest temperature of a cooled tube), located by a
  dense re-integration from the output point before it (parabola through the three highest points);
  ``cup_mixing_hot_spot`` the same on the cup-mixing temperature;
* profile.csv columns ``centre_line_temperature_K``, ``cup_mixing_temperature_K`` and
  ``bed_wall_temperature_K`` (the bed at the wall, r = R, from the Robin wall condition);
* events: ``temperature_limit`` on the highest temperature over the section (the run stops
  there; in a runaway the ring that ignites last can be hotter than the axis), ``pressure_floor``,
  ``target_conversion`` on the cup-mixing conversion.

Wall resistance: the bed-side ``[bed] wall_coefficient`` h_w in series with the typed
``heat.overall_coefficient`` U (read as the part outside the bed: wall conduction and medium
film), 1/U_total = 1/h_w + 1/U. A failed integration is reported as ``status = "failed"`` with
where and why, never as a result.
"""
import math
import time

import numpy as np
from scipy.optimize import brentq

from simulator.case.plausibility import plausibility_warnings
from simulator.model.build import build_model
from simulator.model import kernel as K1
from simulator.model.heat import arrangement_of
from simulator.results import Result
from simulator.solve.checks import closure_failure, closure_warnings, compressibility_profile, range_warnings
from simulator.solve.integrate import (PRESSURE_FLOOR, RUN_STEP_BUDGET, _budget_refusal, _design_numbers,
                                      _explain_failure, model_warnings, references_used, versions)
from simulator.solve.radial import POST_STEPS, RadialTube
from simulator.units import R as R_GAS

#: located_by of the 2-D hot spots
CENTRE_LINE = "centre line of the 2-D model, maximum located on a dense re-integration"
CUP_MIXING = "cup-mixing temperature of the 2-D model, maximum located on a dense re-integration"


def simulate_radial(case, model=None, length=None):
    """Solve the 2-D tube of a case with ``model.radial = "2d"``.

    Parameters
    ----------
    case : simulator.case.schema.Case
        Validated case (packed bed, exchange with a uniform or co-current medium).
    model : simulator.model.build.Model, optional
        Pre-built 1-D model (its arrays are reused).
    length : float, optional
        Integrate to this length instead of the case's tube length, [m]

    Returns
    -------
    Result
        As :func:`simulator.solve.integrate.simulate`, with the 2-D profiles in ``extra``.
    """
    started = time.perf_counter()
    model = model or build_model(case)
    rs = case.radial
    L = case.tube.length if length is None else length
    zs = np.linspace(0.0, L, case.solver.output_points)
    tube = RadialTube(model, rs.points, rs.conductivity, rs.diffusivity, rs.wall_coefficient)
    status, termination = "completed", f"end of tube reached at z = {L:.6g} m"
    refusal = _budget_refusal(case, L)
    if refusal is not None:
        ys, good, main_time = tube.y0[None, :], 1, 0.0
        status, termination = "failed", f"solver failed after z = 0 m of {L:.6g} m (not integrated): {refusal}"
    else:
        with np.errstate(all="ignore"):
            ys, message, good = tube.run_budgeted(tube.y0, zs)
    main_time = time.perf_counter() - started
    if good < len(zs) and status != "failed":
        status = "failed"
        termination = (f"solver failed after z = {zs[good - 1]:.6g} m of {L:.6g} m (2-D model, {rs.points} radial "
                       f"points): {_explain_failure(message, case, L)}; in the 2-D model the radial profile may "
                       "also be too steep for the collocation points (check the radial parameters)")
    zs, ys = zs[:good], ys[:good]
    if status != "failed":
        status, termination, keep = _state_failure(tube, zs, ys)
        zs, ys = zs[:keep], ys[:keep]
    events = {}
    if status != "failed":
        zs, ys, status, termination = _stops(tube, case, zs, ys, events, status, termination)
    prof = tube.profiles(zs, ys, True, "")
    if status != "failed":
        defect = closure_failure(prof.closure)
        if defect:
            status, termination = "failed", f"run failed: {defect}"
    count = model.count
    ys1 = np.column_stack([prof.F_cup, prof.T_cup, prof.P, prof.Tc, prof.Q])
    design = _target(tube, case, model, zs, ys, prof, events)
    stopped = "temperature_limit" in events
    hot = _hot_spot(tube, case, zs, ys, prof.T_centre, "T_centre", CENTRE_LINE, stopped)
    cup_hot = _hot_spot(tube, case, zs, ys, prof.T_cup, "T_cup", CUP_MIXING, stopped)
    along = arrangement_of(case.heat).medium_along
    Tc = along(case.heat, zs) if along else prof.Tc
    notes = list(closure_warnings(prof.closure)) + list(range_warnings(model, ys1))
    # an interior centre-line maximum is what the 1-D checks call an event maximum (hot spot near the inlet)
    interior = dict(hot, located_by="event dT/dz = 0") if hot["located_by"] == CENTRE_LINE else hot
    notes += model_warnings(model, ys1, zs, interior) + plausibility_warnings(case) + _entrance_warning(tube, hot)
    rise, rise_info = model.adiabatic
    Z = _compressibility(model, ys1)
    elapsed = time.perf_counter() - started
    radial_block = _radial_block(tube, case, prof)
    stats = {"method": "LSODA (scipy.integrate.odeint), 2-D model by radial orthogonal collocation",
             "kernel": "compiled (numba)", "rtol": tube.rtol, "atol_scale": case.solver.atol_scale,
             "output_points": int(len(zs)), "radial_points": rs.points, "rhs_evaluations": tube.nfev,
             "steps_main_integration": tube.steps, "step_budget": RUN_STEP_BUDGET, "wall_time_s": round(elapsed, 4)}
    return Result(
        case=case, species=model.species.names, z=zs, F=np.maximum(prof.F_cup, 0.0) * count, T=prof.T_cup,
        P=prof.P, Tc=Tc, Q=prof.Q * count, Z=Z, status=status, termination=termination,
        hot_spot=hot, design=design, closure=prof.closure, warnings=tuple(notes), solver_stats=stats,
        versions=versions(),
        references=tuple(references_used(case, model, bool(np.any(np.isfinite(Z)))) + ["villadsen_stewart1967"]),
        events=events, adiabatic_temperature_rise=rise,
        extra={"adiabatic": rise_info, "viscosity": model.viscosity_note,
               "timing": {"main_integration_s": main_time, "total_s": elapsed},
               "critical_sources": dict(zip(model.species.names, model.critical_sources)),
               "radial_profiles": prof,
               "profile_columns": [("centre_line_temperature_K", prof.T_centre),
                                   ("cup_mixing_temperature_K", prof.T_cup),
                                   ("bed_wall_temperature_K", prof.T_wall)],
               "summary_blocks": {"cup_mixing_hot_spot": cup_hot, "radial_model": radial_block},
               "summary_lines": [_cup_line(cup_hot), _radial_line(radial_block)]},
    )


def _compressibility(model, ys1):
    """Z of the cup-mixing states (Peng-Robinson, NaN without critical data), as a 1-D run reports it."""
    try:
        return compressibility_profile(model, ys1)
    except (ArithmeticError, ValueError):
        return np.full(len(ys1), np.nan)


def _state_failure(tube, zs, ys):
    """(status, termination, rows kept): a temperature that is not positive or a flow more negative
    than its tolerance at any radial point fails the run there."""
    model, N = tube.model, tube.N
    n = model.n
    nF = N * n
    T = ys[:, nF:nF + N]
    F = ys[:, :nF]
    tol = max(10.0 * model.scale[0] * model.case.solver.atol_scale, 1e-9 * model.y0[:n].sum())
    bad_T = np.nonzero(~np.all(T > 0.0, axis=1))[0]
    bad_F = np.nonzero(np.any(F < -tol, axis=1))[0]
    if len(bad_T):
        k = int(bad_T[0])
        return "failed", (f"temperature not positive at a radial point at z = {zs[k]:.6g} m: the state left every "
                          "range the model describes"), max(k, 1)
    if len(bad_F):
        k = int(bad_F[0])
        return "failed", (f"a molar flow at a radial point is negative beyond its tolerance at z = {zs[k]:.6g} m "
                          f"(2-D model, {N} radial points): the radial profile is too steep for the collocation "
                          "polynomial (a runaway) or the rates consumed more than was there; check the kinetics "
                          "and the radial parameters, or set design.temperature_limit"), max(k, 1)
    return "completed", f"end of tube reached at z = {zs[-1]:.6g} m", len(zs)


def _crossing(tube, zs, ys, values, g):
    """First upward zero of g on the trajectory (``values`` = g at the output points): (z, state)
    refined by Brent on re-integrated states, or None."""
    v = np.asarray(values)
    if v[0] > 0:
        return zs[0], ys[0]
    idx = np.nonzero((v[:-1] <= 0) & (v[1:] > 0))[0]
    if not len(idx):
        return None
    k = int(idx[0])
    z0, y0 = zs[k], ys[k]

    def f(z):
        y = tube.state_at(z0, y0, z)
        if y is None:
            raise ValueError("re-integration failed")
        return g(y)

    try:
        z = brentq(f, z0, zs[k + 1], xtol=max(1e-12, 1e-10 * (zs[k + 1] - z0)), maxiter=100)
        return z, tube.state_at(z0, y0, z)
    except ValueError:          # keep the output point after the crossing, a state of the main run
        return zs[k + 1], ys[k + 1]


def _stops(tube, case, zs, ys, events, status, termination):
    """Temperature limit (highest temperature over the section) and pressure floor: the run stops at
    the first one."""
    n, N = tube.model.n, tube.N
    prof = tube.profiles(zs, ys, False, "")
    stops = []
    T_lim = case.design.temperature_limit
    if not math.isnan(T_lim):
        highest = np.maximum(prof.T_centre, prof.T_points.max(axis=1))
        hit = _crossing(tube, zs, ys, highest - T_lim, lambda y: tube.highest_temperature(y) - T_lim)
        if hit is not None:
            stops.append((*hit, "temperature_limit"))
    p_floor = PRESSURE_FLOOR * case.feed.pressure
    hit = _crossing(tube, zs, ys, p_floor - prof.P, lambda y: p_floor - y[N * n + N])
    if hit is not None:
        stops.append((*hit, "pressure_floor"))
    if not stops:
        return zs, ys, status, termination
    z_e, y_e, name = min(stops, key=lambda s: s[0])
    keep = zs < z_e
    zs = np.append(zs[keep], z_e)
    ys = np.vstack([ys[keep], y_e])
    if name == "temperature_limit":
        termination = (f"temperature limit {T_lim:.6g} K exceeded in the bed (2-D model) at z = {z_e:.6g} m "
                       "(design.temperature_limit); the run was stopped there")
    else:
        termination = (f"pressure fell below {100 * PRESSURE_FLOOR:g} % of the feed pressure at z = {z_e:.6g} m: "
                       "this tube cannot pass the feed at this pressure drop")
    events[name] = {"position_m": float(z_e), "temperature_K": float(tube.highest_temperature(y_e)),
                    "pressure_Pa": float(y_e[N * n + N])}
    return zs, ys, "stopped", termination


def _cup_flows(tube, y):
    n, N = tube.model.n, tube.N
    return tube.args[3] @ y[:N * n].reshape(N, n)


def _target(tube, case, model, zs, ys, prof, events):
    """Length to the target conversion on the cup-mixing flows (recorded; the run continues)."""
    design = {"target_conversion": None, "reached": False, "length_m": None, "volume_m3": None,
              "catalyst_mass_kg": None}
    X_t = case.design.target_conversion
    if math.isnan(X_t):
        return design
    design["target_conversion"] = X_t
    key = model.key_index
    F0 = model.y0[key]
    X = (F0 - prof.F_cup[:, key]) / F0
    hit = _crossing(tube, zs, ys, X - X_t, lambda y: (F0 - _cup_flows(tube, y)[key]) / F0 - X_t)
    if hit is not None:
        design.update(_design_numbers(case, model, hit[0]))
        events["target_conversion"] = {"position_m": float(hit[0])}
    return design


#: points of the dense re-integration around a maximum
PEAK_POINTS = 41


def _hot_spot(tube, case, zs, ys, T, attribute, how, stopped):
    """Highest value of a temperature profile (``attribute`` of RadialProfiles), refined between the
    output points around it: a dense re-integration from the point before, and the vertex of the
    parabola through the three highest dense points."""
    T0 = case.feed.temperature
    n, N = tube.model.n, tube.N
    k = len(zs) - 1 if stopped else int(np.argmax(T))
    z_m, T_m, y_m = float(zs[k]), float(T[k]), ys[k]
    if stopped:
        how = "temperature limit: the run stopped there; the true maximum is higher"
    elif 0 < k < len(zs) - 1:
        z_f = np.linspace(zs[k - 1], zs[k + 1], PEAK_POINTS)
        states, _, good = tube.run(ys[k - 1], z_f, mxstep=POST_STEPS)
        if good == PEAK_POINTS:
            T_f = getattr(tube.profiles(z_f, states, False, ""), attribute)
            j = min(max(int(np.argmax(T_f)), 1), PEAK_POINTS - 2)
            z_v, T_v = _parabola_vertex(z_f[j - 1:j + 2], T_f[j - 1:j + 2])
            if T_v >= T_m:
                z_m, T_m, y_m = z_v, T_v, states[j]
    else:
        how = f"{'outlet' if k else 'inlet'} ({how})"
    medium = float(y_m[N * n + N + 1]) if case.heat.exchange else None
    return {"temperature_K": float(T_m), "position_m": float(z_m), "rise_above_feed_K": float(T_m - T0),
            "rise_above_medium_K": None if medium is None else float(T_m - medium), "located_by": how}


def _parabola_vertex(z, T):
    """Vertex (z, T) of the parabola through three points (the middle one the highest)."""
    a, b, c = np.polyfit(z - z[1], T, 2)
    if not a < 0:
        return float(z[1]), float(T[1])
    dz = min(max(-b / (2 * a), z[0] - z[1]), z[2] - z[1])
    return float(z[1] + dz), float(c - b * b / (4 * a) if dz == -b / (2 * a) else np.polyval([a, b, c], dz))


#: reduced length zeta = lambda_er z / (G cp R^2) below which the radial collocation misstates a steep
#: wall layer (the entrance region of a feed that is not at the medium temperature; errors of 1e-4 to 3e-3
#: of the inlet step at zeta = 0.02 with 5 points, below 1e-5 from zeta = 0.1), [-]
ENTRANCE_ZETA = 0.05


def reduced_length(tube, z):
    """zeta = lambda_er z / (G cp R^2) at the feed's heat capacity, [-] (the Graetz-type variable)."""
    model = tube.model
    n = model.n
    rp = tube.args[4]
    nasa = model.args[2]
    T0 = model.y0[n]
    flow_cp = sum(model.y0[i] * K1._cp_R(nasa[i], T0) * R_GAS for i in range(n))    # [W/K] per tube
    return rp[1] * z * model.area / (flow_cp * rp[3] ** 2)


def _entrance_warning(tube, hot):
    """A centre-line maximum inside the entrance region is flagged (collocation error there)."""
    z = hot["position_m"]
    if not z > 0.0 or hot["located_by"].startswith("temperature limit"):
        return []
    zeta = reduced_length(tube, z)
    if zeta >= ENTRANCE_ZETA:
        return []
    return [f"the centre-line maximum lies in the entrance region of the 2-D model (zeta = lambda_er z / (G cp R^2) "
            f"= {zeta:.2g} < {ENTRANCE_ZETA:g}), where a few radial collocation points misstate the steep wall "
            "layer of a feed that is not at the medium temperature: that maximum is indicative only"]


def _radial_block(tube, case, prof):
    """summary.json ``radial_model``: the parameters, the series wall resistance, Biot number, basis."""
    rs = case.radial
    rp = tube.args[4]
    radius = float(rp[3])
    heff = float(rp[2])
    return {"points": rs.points, "radial_conductivity_W_per_m_K": rs.conductivity,
            "radial_diffusivity_m2_per_s": rs.diffusivity, "wall_coefficient_W_per_m2_K": rs.wall_coefficient,
            "outside_coefficient_W_per_m2_K": case.heat.overall_coefficient,
            "wall_to_medium_coefficient_W_per_m2_K": heff,
            "wall_biot_number": heff * radius / rs.conductivity,
            "basis": "2-D pseudo-homogeneous model, radial orthogonal collocation (Villadsen & Stewart 1967); "
                     "outlet, conversion and closure on the cup-mixing flows, hot_spot on the centre line; "
                     "wall: 1/U_total = 1/wall_coefficient + 1/heat.overall_coefficient (the typed coefficient "
                     "is the part outside the bed)",
            "max_centre_minus_wall_K": float(np.max(prof.T_centre - prof.T_wall)) if len(prof.z) else None}


def _cup_line(cup):
    return (f"  cup-mixing max    {cup['temperature_K']:.2f} K at z = {cup['position_m']:.4g} m "
            f"(hot spot above: centre line of the 2-D model)")


def _radial_line(block):
    return (f"  2-D model         {block['points']} radial points, wall Biot number {block['wall_biot_number']:.3g}, "
            f"wall to medium U_total = {block['wall_to_medium_coefficient_W_per_m2_K']:.4g} W/(m^2*K) "
            "(1/U_total = 1/h_w + 1/U)")
