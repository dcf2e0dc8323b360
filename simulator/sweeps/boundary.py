"""Runaway boundary on a sweep grid by the Morbidelli-Varma criterion.

Along one axis of a grid of hot-spot temperatures T*(x), the normalized
sensitivity s = (x/T*) dT*/dx (central differences, ``numpy.gradient``) peaks
at the runaway boundary; the peak is refined by a parabola through the largest
|s| and its two neighbours. A line whose |s| stays below ``s_threshold`` has no
boundary in the range (no sharp boundary: common practice, no source, for the
threshold 1).

References
----------
.. [1] M. Morbidelli, A. Varma, "A generalized criterion for parametric
   sensitivity: application to thermal explosion theory," Chem. Eng. Sci.,
   vol. 43, pp. 91-102, 1988.
"""
import numpy as np


def boundary_along(x, T_star, s_threshold=1.0):
    """Critical x on one line of a grid, or NaN.

    Parameters
    ----------
    x : ndarray
        Parameter values, strictly increasing, [-]
    T_star : ndarray
        Hot-spot temperatures at x (NaN where a case failed), [K]
    s_threshold : float
        Smallest peak |s| taken as a boundary, [-]

    Returns
    -------
    x_c : float
        Parameter value at the maximum of |s| (NaN if none or at the edge of the range), [-]
    s_max : float
        Signed s there, [-]
    """
    x = np.asarray(x, dtype=float)
    T = np.asarray(T_star, dtype=float)
    ok = np.isfinite(T)
    if ok.sum() < 3:
        return np.nan, np.nan
    xs, Ts = x[ok], T[ok]
    s = xs * np.gradient(Ts, xs) / Ts
    k = int(np.argmax(np.abs(s)))
    if abs(s[k]) < s_threshold or k in (0, len(xs) - 1):
        return np.nan, float(s[k])
    x0, x1, x2 = xs[k - 1:k + 2]
    y0, y1, y2 = np.abs(s[k - 1:k + 2])
    denom = (x0 - x1) * (x0 - x2) * (x1 - x2)
    a = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / denom
    b = (x2 ** 2 * (y0 - y1) + x1 ** 2 * (y2 - y0) + x0 ** 2 * (y1 - y2)) / denom
    xc = -b / (2 * a) if a < 0 else x1
    return float(min(max(xc, x0), x2)), float(s[k])


def boundary_on_grid(x, y, T_star, s_threshold=1.0):
    """Boundary x_c(y) for every y of a grid ``T_star[len(y), len(x)]`` (NaN where none)."""
    T_star = np.asarray(T_star, dtype=float)
    out = np.full(len(y), np.nan)
    for i in range(len(y)):
        out[i] = boundary_along(x, T_star[i], s_threshold)[0]
    return out
