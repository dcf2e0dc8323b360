"""Ignition along a mechanism tube: where dT/dz is largest, and the residence time to it.

A tube *ignites* when its gas temperature rises at least :data:`IGNITION_RISE_K` above the
reference temperature (the feed temperature, or the hotter of feed and medium inlet when a
medium exchanges heat), so that a medium heating the gas is not taken for ignition; common
practice, no source (a 50 K rise is well above integration noise and well below a flame's
rise). Then the ignition point is the largest positive dT/dz, located on the solver's own
steps around the largest slope of the output grid (re-integrated there with every internal
step kept) and refined by a parabola through the three steps around the maximum. An
isothermal tube never ignites (null). Residence time: tau(z) = int_0^z rho / G dz' [s]
(trapezoid on the output grid and the refined steps).
"""
import math

import numpy as np

from simulator.units import R as R_GAS

#: Temperature rise above the reference that counts as ignition, [K]; common practice, no source.
IGNITION_RISE_K = 50.0


def residence_time(tube, zs, ys):
    """Residence time from the inlet to each point, [s] (per tube, plug flow)."""
    n = tube.n
    F_T = ys[:, :n].sum(axis=1)
    rho = ys[:, n + 1] * (tube.mass_flow / F_T) / (R_GAS * ys[:, n])
    inv_u = rho / tube.G
    steps = np.diff(zs) * 0.5 * (inv_u[1:] + inv_u[:-1])
    return np.concatenate([[0.0], np.cumsum(steps)])


def reference_temperature(case):
    """Temperature a rise is measured from, [K]."""
    T0 = case.feed.temperature
    if case.heat.exchange:
        return max(T0, case.heat.medium_temperature)
    return T0


def ignites(case, T):
    """True when the profile ``T`` [K] rises at least IGNITION_RISE_K above the reference."""
    if case.heat.mode == "isothermal":
        return False
    return float(np.max(T)) - reference_temperature(case) >= IGNITION_RISE_K


def locate_ignition(tube, zs, ys, dTdz, steps_between):
    """The ignition block {"position_m", "residence_time_s", "temperature_K"}, or None when nothing ignites.

    ``steps_between(z0, y0, z1)`` returns the solver's internal steps (z, y) from z0 to z1.
    """
    n = tube.n
    if not ignites(tube.case, ys[:, n]):
        return None
    k = int(np.argmax(dTdz))
    if not dTdz[k] > 0:
        return None
    lo, hi = max(k - 1, 0), min(k + 1, len(zs) - 1)
    z_fine, y_fine = steps_between(zs[lo], ys[lo], zs[hi])
    slope = np.array([tube.derivative(z, y)[n] for z, y in zip(z_fine, y_fine)])
    j = int(np.argmax(slope))
    z_ign = float(z_fine[j])
    if 0 < j < len(z_fine) - 1:
        z_ign = _parabola_peak(z_fine[j - 1:j + 2], slope[j - 1:j + 2], z_ign)
    # state at the peak: interpolated between the fine steps (they are dense there)
    T_ign = float(np.interp(z_ign, z_fine, y_fine[:, n]))
    tau_lo = float(residence_time(tube, zs[:lo + 1], ys[:lo + 1])[-1])
    keep = z_fine <= z_ign
    z_part = np.append(z_fine[keep], z_ign)
    y_part = np.vstack([y_fine[keep], [np.array([np.interp(z_ign, z_fine, y_fine[:, i])
                                                 for i in range(y_fine.shape[1])])]])
    tau = tau_lo + float(residence_time(tube, z_part, y_part)[-1])
    return {"position_m": z_ign, "residence_time_s": tau, "temperature_K": T_ign}


def _parabola_peak(z, g, fallback):
    """Vertex of the parabola through three (z, g) points; ``fallback`` when it is not a maximum inside."""
    (z0, z1, z2), (g0, g1, g2) = z, g
    denom = (z0 - z1) * (z0 - z2) * (z1 - z2)
    if denom == 0:
        return fallback
    a = (z2 * (g1 - g0) + z1 * (g0 - g2) + z0 * (g2 - g1)) / denom
    b = (z2 * z2 * (g0 - g1) + z1 * z1 * (g2 - g0) + z0 * z0 * (g1 - g2)) / denom
    if not a < 0:
        return fallback
    peak = -b / (2 * a)
    return float(peak) if z0 <= peak <= z2 and math.isfinite(peak) else fallback
