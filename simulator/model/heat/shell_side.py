r"""Shell-side (outside) coefficient of a tube in a bank in crossflow: Zukauskas (1972).

``[heat.coefficient] outside = "zukauskas-1972"`` with the bank geometry and the medium's properties
in ``[heat.coefficient.shell]``; the medium's properties are constant, so h_o is one number,
computed once when the model is built (:func:`outside_coefficient`) and added in series like a
typed ``outside``.

.. math::
    Nu_D = C\, Re_{D,max}^{m}\, Pr^{0.36}\, (S_T/S_L)^{p}\, C_n, \qquad h_o = Nu_D\, k / D_o

with Re on the outer diameter and the largest velocity between the tubes,
u_max = u S_T/(S_T - D_o) (inline), or the larger of that and u S_T/(2 (S_D - D_o)) with
S_D = sqrt(S_L^2 + (S_T/2)^2) (staggered). Constants (C, m, p) by range of Re (Zukauskas 1972 as
tabulated by Bejan 2013 and by Incropera & DeWitt; from memory, checked against ``ht``):

=========  ==========================  ===============================
Re_max     inline                      staggered
=========  ==========================  ===============================
1-100      0.9, 0.4                    1.04, 0.4 (to 500)
100-1000   0.52, 0.5                   0.71, 0.5 (500-1000)
1e3-2e5    0.27, 0.63                  0.35, 0.6, p = 0.2
2e5-2e6    0.033, 0.8                  0.031, 0.8, p = 0.2
=========  ==========================  ===============================

C_n corrects banks of fewer than 20 rows (:data:`ROW_CORRECTION`, the table for Re_max > 1000; below
Re 1000 the correction is smaller, so C_n there errs low, on the safe side for a cooled tube). The wall Prandtl-number factor
(Pr/Pr_w)^0.25 is left out (the medium's wall properties are not given: about 1 for a small
temperature difference). This is an ideal crossflow bank: a baffled reactor shell loses part of
its crossflow to leakage and bypass streams (the Bell-Delaware corrections, typically 0.5-0.8 on h),
so this h_o is an upper estimate; say so in every output that uses it.

References
----------
.. [1] A. Zukauskas, "Heat transfer from tubes in crossflow," Adv. Heat Transfer, vol. 8,
   pp. 93-160, 1972.
.. [2] A. Bejan, Convection Heat Transfer, 4th ed., Wiley, 2013.
"""
import math

#: (Re upper bound, C, m, uses the pitch-ratio factor) by range of Re_max, inline and staggered
INLINE = ((100.0, 0.9, 0.4, False), (1000.0, 0.52, 0.5, False), (2.0e5, 0.27, 0.63, False),
          (2.0e6, 0.033, 0.8, False))
STAGGERED = ((500.0, 1.04, 0.4, False), (1000.0, 0.71, 0.5, False), (2.0e5, 0.35, 0.6, True),
             (2.0e6, 0.031, 0.8, True))
#: Row correction C_n for Re_max > 1000 by number of rows (Zukauskas 1972 as tabulated by
#: Incropera & DeWitt, Table 7.6; from memory), 20 rows and more: 1
ROW_CORRECTION = {"inline": {1: 0.70, 2: 0.80, 3: 0.86, 4: 0.90, 5: 0.92, 7: 0.95, 10: 0.97, 13: 0.98, 16: 0.99},
                  "staggered": {1: 0.64, 2: 0.76, 3: 0.84, 4: 0.89, 5: 0.92, 7: 0.95, 10: 0.97, 13: 0.98,
                                16: 0.99}}
RE_RANGE = (1.0, 2.0e6)
PR_RANGE = (0.7, 500.0)


def max_velocity(velocity, D_o, transverse_pitch, longitudinal_pitch, layout):
    """Largest velocity between the tubes of the bank, [m/s].

    Parameters
    ----------
    velocity : float
        Velocity of the medium approaching the bank, [m/s]
    D_o : float
        Tube outer diameter, [m]
    transverse_pitch : float
        S_T, centre distance across the flow, [m]
    longitudinal_pitch : float
        S_L, centre distance along the flow, [m]
    layout : str
        "inline" or "staggered", [-]

    Returns
    -------
    u_max : float
        [m/s]
    """
    u = velocity * transverse_pitch / (transverse_pitch - D_o)
    if layout == "staggered":
        S_D = math.hypot(longitudinal_pitch, transverse_pitch / 2.0)
        u = max(u, velocity * transverse_pitch / (2.0 * (S_D - D_o)))
    return u


def row_correction(rows, layout):
    """C_n for a bank of ``rows`` rows (linear between the tabulated counts), [-]."""
    table = ROW_CORRECTION[layout]
    if rows >= 20:
        return 1.0
    counts = sorted(table)
    if rows <= counts[0]:
        return table[counts[0]]
    for a, b in zip(counts, counts[1:] + [20]):
        if a <= rows <= b:
            hi = table.get(b, 1.0)
            return table[a] + (hi - table[a]) * (rows - a) / (b - a)
    return 1.0


def zukauskas_1972(Re, Pr, transverse_pitch, longitudinal_pitch, layout, rows):
    """Mean Nusselt number of a tube bank in crossflow, on the outer diameter, [-].

    Parameters
    ----------
    Re : float
        Reynolds number on D_o and the largest velocity between tubes, [-]
    Pr : float
        Prandtl number of the medium, [-]
    transverse_pitch, longitudinal_pitch : float
        S_T and S_L, [m]
    layout : str
        "inline" or "staggered", [-]
    rows : int
        Tube rows the flow crosses, [-]

    Returns
    -------
    Nu : float
        [-]

    Examples
    --------
    >>> round(zukauskas_1972(1e4, 7.0, 0.05, 0.05, "inline", 20), 3)
    180.135
    """
    table = INLINE if layout == "inline" else STAGGERED
    C, m, pitch = next(((C, m, p) for top, C, m, p in table if Re <= top), table[-1][1:])
    factor = (transverse_pitch / longitudinal_pitch) ** 0.2 if pitch else 1.0
    return C * Re ** m * Pr ** 0.36 * factor * row_correction(rows, layout)


def outside_coefficient(shell, D_o):
    """(h_o [W/(m^2*K)], note, warnings) of the bank described by ``shell`` (a ShellSide).

    Parameters
    ----------
    shell : simulator.case.schema.ShellSide
        Geometry and medium properties, SI
    D_o : float
        Tube outer diameter, [m]
    """
    u = max_velocity(shell.velocity, D_o, shell.transverse_pitch, shell.longitudinal_pitch, shell.layout)
    Re = shell.density * u * D_o / shell.viscosity
    Pr = shell.cp * shell.viscosity / shell.conductivity
    h = zukauskas_1972(Re, Pr, shell.transverse_pitch, shell.longitudinal_pitch, shell.layout, shell.rows) \
        * shell.conductivity / D_o
    warnings = []
    if not RE_RANGE[0] <= Re <= RE_RANGE[1]:
        warnings.append(f"heat.coefficient.shell: Re_max = {Re:.4g}, outside {RE_RANGE[0]:g} to {RE_RANGE[1]:g} of "
                        "Zukauskas (1972)")
    if not PR_RANGE[0] <= Pr <= PR_RANGE[1]:
        warnings.append(f"heat.coefficient.shell: Pr = {Pr:.3g}, outside {PR_RANGE[0]:g} to {PR_RANGE[1]:g} of "
                        "Zukauskas (1972)")
    note = (f"Zukauskas (1972), {shell.layout} bank of {shell.rows} rows in crossflow, Re_max = {Re:.4g}, "
            f"Pr = {Pr:.3g}: h_o = {h:.4g} W/(m^2*K), an ideal bank without the leakage and bypass losses of a "
            "baffled shell (an upper estimate)")
    return h, note, warnings
