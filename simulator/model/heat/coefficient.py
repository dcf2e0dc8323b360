r"""``[heat.coefficient]`` -> the heat-coefficient block of the kernel's ``fp``, and its range checks.

The kernel computes U(z) from this block at every right-hand-side evaluation
(:func:`simulator.model.kernel.wall_coefficient`); an arrangement (uniform, co-current,
counter-current, wall-profile) does not need to know whether U is typed or correlated. The block
(offsets :data:`simulator.model.heat_coefficient.C_METHOD` ...) holds the inside method, the given
inside value, the constant resistances referred to the inner area and the conductivity law::

    R_wall = D_i ln(D_o / D_i) / (2 k_w)         D_o = D_i + 2 t
    R_out  = (D_i / D_o) (R_f,o + 1 / h_o)
    R_in   = R_f,i

followed by the 5 n pure-species conductivity fits when the conductivity comes from Cantera.

Validity ranges (checked along the profile, a warning for each range left):

* Gnielinski (1976): 2300 < Re < 5e6 (turbulent branch; the regime guard blends below 1e4),
  0.5 < Pr < 2000;
* Dittus-Boelter (1930): Re > 1e4, 0.7 < Pr < 160;
* Leva (1949, 1950): 0.05 < d_p/d_t < 0.3 and Re_p up to about 2000 (as usually quoted, from memory);
* Li & Finlayson (1977): 20 < Re_p < 7600 and 0.05 < d_p/d_t < 0.3 (spheres; as usually quoted), its
  wall coefficient lumped with ``[bed] radial_conductivity`` into h_i (1/h_i = 1/h_w + R/(4 lambda_er)).
"""
import math

import numpy as np

from simulator.case.heat_coefficient_keys import describe_inside
from simulator.errors import CaseError, ThermoError
from simulator.model import heat_coefficient as hc

METHODS = {"gnielinski-1976": hc.EMPTY_GNIELINSKI, "dittus-boelter-1930": hc.EMPTY_DITTUS_BOELTER,
           "leva-1949": hc.PACKED_LEVA_1949, "leva-1950": hc.PACKED_LEVA_1950,
           "li-finlayson-1977": hc.PACKED_LI_FINLAYSON, "value": hc.INSIDE_VALUE}
#: (Re low, Re high, Pr low, Pr high) of the empty-tube correlations, [-] (see the module docstring)
EMPTY_RANGES = {hc.EMPTY_GNIELINSKI: (2300.0, 5.0e6, 0.5, 2000.0, "Gnielinski (1976)"),
                hc.EMPTY_DITTUS_BOELTER: (1.0e4, math.inf, 0.7, 160.0, "Dittus-Boelter (1930)")}
#: Leva's validity as usually quoted (from memory): d_p/d_t and the particle Reynolds number, [-]
LEVA_RATIO, LEVA_RE_MAX = (0.05, 0.3), 2000.0
#: Li & Finlayson's particle Reynolds range (spheres), as usually quoted (from memory), [-]
LI_FINLAYSON_RE = (20.0, 7600.0)


def method_code(coefficient, packed):
    """Kernel code of the inside method (``"auto"`` by the tube: Gnielinski, or Leva by flux direction)."""
    if coefficient.inside == "auto":
        return hc.PACKED_LEVA_AUTO if packed else hc.EMPTY_GNIELINSKI
    return METHODS[coefficient.inside]


def coefficient_block(case, species):
    """The block appended to ``fp`` for a case with ``[heat.coefficient]``, (N_COEF + 5 n,).

    Raises
    ------
    CaseError
        When the conductivity must come from transport data that the species lack.
    """
    from simulator.thermo.species_data import conductivity_fits

    c = case.heat.coefficient
    D_i = case.tube.inner_diameter
    D_o = D_i + 2.0 * c.wall_thickness
    n = len(species.names)
    block = np.zeros(hc.N_COEF + 5 * n)
    block[hc.C_METHOD] = method_code(c, case.bed is not None)
    block[hc.C_HI] = c.inside_value if c.inside == "value" else 0.0
    block[hc.C_RWALL] = D_i * math.log(D_o / D_i) / (2.0 * c.wall_conductivity) if c.wall_thickness > 0 else 0.0
    h_o = c.outside if c.shell is None else shell_coefficient(case)[0]
    block[hc.C_ROUT] = (D_i / D_o) * (c.fouling_outside + 1.0 / h_o)
    block[hc.C_RFIN] = c.fouling_inside
    block[hc.C_DP] = case.bed.particle_diameter if case.bed is not None else 0.0
    block[hc.C_FACTOR] = c.factor
    if c.inside == "li-finlayson-1977":
        conductivity = case.radial.conductivity
        if not conductivity == conductivity:
            raise CaseError(f"{case.source_path}: heat.coefficient.inside = \"li-finlayson-1977\": the wall coefficient "
                            "of the two-dimensional model is lumped with the bed's radial conduction; give [bed] "
                            "radial_conductivity (e.g. \"0.9 W/(m*K)\").")
        block[hc.C_LAMBDA] = conductivity
    if not math.isnan(c.conductivity) or c.inside == "value":
        block[hc.C_KMODE] = hc.CONDUCTIVITY_GIVEN
        block[hc.C_KGAS] = 0.0 if math.isnan(c.conductivity) else c.conductivity
        return block
    try:
        block[hc.N_COEF:] = conductivity_fits(species, case.thermo).ravel()
    except ThermoError as err:
        raise CaseError(f"{case.source_path}: heat.coefficient.conductivity: {err}") from err
    block[hc.C_KMODE] = hc.CONDUCTIVITY_FITS
    return block


def shell_coefficient(case):
    """(h_o [W/(m^2*K)], note, warnings) of ``outside = "zukauskas-1972"`` (:mod:`simulator.model.heat.shell_side`)."""
    from simulator.model.heat.shell_side import outside_coefficient

    c = case.heat.coefficient
    return outside_coefficient(c.shell, case.tube.inner_diameter + 2.0 * c.wall_thickness)


def describe(case):
    """One line: which correlation gives U and what adds in series (for summary.json and the report)."""
    c = case.heat.coefficient
    parts = [f"inside: {describe_inside(c, case.bed is not None)}"]
    if c.wall_thickness > 0:
        parts.append(f"wall {c.wall_thickness * 1e3:.3g} mm at {c.wall_conductivity:.3g} W/(m*K)")
    else:
        parts.append("wall resistance neglected")
    flux = case.heat.profile_quantity == "heat_flux"
    if not flux:
        parts.append("outside: " + (shell_coefficient(case)[1] if c.shell is not None else
                                    f"{c.outside:.4g} W/(m^2*K)" if math.isfinite(c.outside) else "no resistance"))
    if c.fouling_inside or c.fouling_outside:
        parts.append(f"fouling {c.fouling_inside:.3g} / {c.fouling_outside:.3g} m^2*K/W (inside / outside)")
    conductivity = ("given " + f"{c.conductivity:.4g} W/(m*K)" if not math.isnan(c.conductivity)
                    else "Cantera's transport fits, mixture rule of Mathur, Tondon and Saxena (1967)")
    if c.inside != "value":
        parts.append(f"process-fluid conductivity: {conductivity}")
    if flux:
        return "given heat flux; the inside coefficient and the wall give the tube-wall temperatures; " + "; ".join(parts)
    return "U from correlations, in series on the inner area; " + "; ".join(parts)


def validity_warnings(model, zs, ys):
    """Warnings where the inside correlation is used outside its validity range along the profile.

    Parameters
    ----------
    model : simulator.model.build.Model
    zs : ndarray
        Positions, [m]
    ys : ndarray
        (N, n_state) states

    Returns
    -------
    list of str
    """
    from simulator.model import kernel as K

    case = model.case
    ip, fp, nasa, mw = model.args[0], model.args[1], model.args[2], model.args[3]
    o = int(ip[K.I_COEF])
    if o == 0:
        return []
    code = int(fp[o + hc.C_METHOD])
    shell = shell_coefficient(case)[2] if case.heat.coefficient.shell is not None else []
    if code == hc.INSIDE_VALUE:
        return shell
    n = model.n
    G, D = fp[K.F_G], fp[K.F_DIAM]
    mu = np.array([K.viscosity(ys[k, n], ys[k, :n], fp) for k in range(len(zs))])
    warnings = []
    if code in EMPTY_RANGES:
        re_lo, re_hi, pr_lo, pr_hi, name = EMPTY_RANGES[code]
        Re = G * D / mu
        cp = np.array([_cp_mass(ys[k, n], ys[k, :n], nasa, mw) for k in range(len(zs))])
        k_gas = np.array([hc.gas_conductivity(ys[k, n], ys[k, :n], fp, o) for k in range(len(zs))])
        Pr = cp * mu / k_gas
        if Re.min() < re_lo or Re.max() > re_hi:
            regime = ""
            if Re.min() <= hc.RE_LAMINAR:
                regime = " (laminar there: Nu = 3.66 of fully developed flow at a constant wall temperature is used)"
            elif Re.min() < hc.RE_TURBULENT:
                regime = " (transition there: the turbulent value is blended with the laminar one, Gnielinski 2013)"
            warnings.append(f"heat.coefficient.inside: Re = {Re.min():.4g} to {Re.max():.4g} along the tube, outside "
                            f"{re_lo:g} to {re_hi:g} of {name}{regime}")
        if Pr.min() < pr_lo or Pr.max() > pr_hi:
            warnings.append(f"heat.coefficient.inside: Pr = {Pr.min():.3g} to {Pr.max():.3g} along the tube, outside "
                            f"{pr_lo:g} to {pr_hi:g} of {name}")
        return warnings + shell
    d_p = fp[o + hc.C_DP]
    ratio = d_p / D
    Re_p = G * d_p / mu
    if code == hc.PACKED_LI_FINLAYSON:
        lo, hi = LI_FINLAYSON_RE
        if Re_p.min() < lo or Re_p.max() > hi or not LEVA_RATIO[0] <= ratio <= LEVA_RATIO[1]:
            warnings.append(f"heat.coefficient.inside: Re_p = {Re_p.min():.4g} to {Re_p.max():.4g}, d_p/d_t = "
                            f"{ratio:.3g}; Li & Finlayson (1977) as usually quoted: {lo:g} < Re_p < {hi:g}, "
                            f"{LEVA_RATIO[0]:g} < d_p/d_t < {LEVA_RATIO[1]:g}")
        return warnings + shell
    if not LEVA_RATIO[0] <= ratio <= LEVA_RATIO[1]:
        warnings.append(f"heat.coefficient.inside: d_p/d_t = {ratio:.3g}, outside {LEVA_RATIO[0]:g} to "
                        f"{LEVA_RATIO[1]:g} of Leva's correlations (as usually quoted)")
    if Re_p.max() > LEVA_RE_MAX:
        warnings.append(f"heat.coefficient.inside: Re_p = {Re_p.max():.4g}, above about {LEVA_RE_MAX:g} of Leva's "
                        "correlations (as usually quoted)")
    return warnings + shell


def _cp_mass(T, F, nasa, mw):
    """Ideal-gas heat capacity per mass of the mixture, [J/(kg*K)]."""
    from simulator.thermo.nasa7 import cp_R
    from simulator.units import R

    F = np.clip(F, 0.0, None)
    return float(sum(Fi * cp_R(nasa[i], T) * R for i, Fi in enumerate(F)) / (F @ mw))


#: profile.csv columns of the wall quantities, in the order of :func:`simulator.model.kernel.wall_columns`
WALL_COLUMNS = ("overall_coefficient_W_per_m2K", "inside_coefficient_W_per_m2K", "wall_heat_flux_W_per_m2",
                "wall_temperature_inner_K", "wall_temperature_outer_K")


def wall_along(model, zs, ys, kernel):
    """Wall quantities along a profile: a dict of the :data:`WALL_COLUMNS` arrays and how they were found.

    Parameters
    ----------
    model : simulator.model.build.Model
    zs : ndarray
        Positions, [m]
    ys : ndarray
        (N, n_state) states of one tube
    kernel : module
        The kernel namespace of the run (compiled or its Python twin)

    Returns
    -------
    dict
        The five arrays (SI), ``bound`` (N,): the hottest the tube wall can be where its temperature is
        not resolved (a typed U: the wall lies between the gas and the far-side temperature, [K]; NaN
        where nothing bounds it), and ``basis`` (one line).
    """
    ip, fp, nasa, mw = model.args[0], model.args[1], model.args[2], model.args[3]
    cols = kernel.wall_columns(np.asarray(zs, dtype=float), np.ascontiguousarray(ys), ip, fp, nasa, mw)
    out = {name: cols[:, i] for i, name in enumerate(WALL_COLUMNS)}
    n = model.n
    heat = model.case.heat
    far = far_side_temperature(model, zs, ys)
    resolved = heat.coefficient is not None
    if resolved:
        out["bound"] = np.full(len(zs), np.nan)
        out["basis"] = "inner wall T + q''/h_i, outer wall one wall resistance further (see coefficient_source)"
    elif heat.profile_quantity == "heat_flux":
        out["bound"] = np.full(len(zs), np.nan)
        out["basis"] = ("not resolved: a given heat flux without [heat.coefficient] leaves the inside coefficient, and "
                        "so the wall temperature, unknown")
    else:
        out["bound"] = np.maximum(ys[:, n], far)
        out["basis"] = ("not resolved with a typed overall_coefficient (the split of 1/U between the inside, the wall "
                        "and the outside is unknown); the wall lies between the gas and the far-side temperature, "
                        "so the hotter of the two bounds it")
    return out


def far_side_temperature(model, zs, ys):
    """Temperature on the far side of U along a profile (medium, or a given wall profile), [K]."""
    from simulator.model.heat import arrangement_of

    along = arrangement_of(model.case.heat).medium_along
    return along(model.case.heat, zs) if along else ys[:, model.n + 2]


def hottest_wall(wall, zs):
    """(temperature [K], position [m], resolved) of the hottest tube wall; (NaN, NaN, False) when unknown."""
    T = wall["wall_temperature_inner_K"]
    T = np.fmax(T, wall["wall_temperature_outer_K"])
    resolved = bool(np.any(np.isfinite(T)))
    if not resolved:
        T = wall["bound"]
    if not np.any(np.isfinite(T)):
        return math.nan, math.nan, False
    k = int(np.nanargmax(T))
    return float(T[k]), float(zs[k]), resolved
