r"""The ``one_dimensional`` row of ``assumptions``: is the packed tube free of radial gradients?

Made for packed beds (an empty tube gets no such row: its radial model is not built). The 1-D
model lumps the bed's radial resistance into one coefficient (Froment & Bischoff,
*Chemical Reactor Analysis and Design*, 2nd ed., 1990, ch. 11; from memory)

.. math:: \frac{1}{U_{1D}} = \frac{1}{h_w} + \frac{R}{4\lambda_{er}} + \frac{1}{U_o}

and so reports the cup-mixing temperature, not the centre line. The row solves the 2-D model
(:mod:`simulator.solve.radial_run`) on the same case and compares its centre-line hot-spot
rise above the medium with the 1-D rise of the tube lumped as above:

* value = |rise_2D - rise_1D| / max(|rise_2D|, 1 K), the share of the centre-line rise the 1-D
  model misses (or adds); threshold 0.2 (common practice, no source);
* verdict and level by the rule of every row (:func:`simulator.verdicts.assumption_level`);
* design change: the catalyst mass to the target, 1-D against 2-D (cup-mixing conversion).

Both tubes run without ``design.temperature_limit`` (as the ideal variants do), so each rise is the
true maximum; ``details.above_temperature_limit`` says which model's hot spot reaches the limit.

Which coefficient is which: with ``model.radial = "2d"`` the typed ``heat.overall_coefficient``
is U_o (outside the bed) and the 1-D tube compared gets U_1D from the formula; with
``model.radial = "1d"`` the typed coefficient is U_1D itself and the 2-D run gets
U_o = 1 / (1/U_1D - 1/h_w - R/(4 lambda_er)) (refused when that is not positive).

Details (numbers only, not the verdict): the tube-to-particle diameter ratio D/d_p against 8
(common practice, no source) and the radial heat-transport criterion of Mears (1971)
(from memory)

.. math:: \frac{|\Delta H| r_v R^2}{\lambda_{er} T_w} < \frac{0.4\, R_g T_w / E}{1 + 8 r_p / (R\, Bi_w)},
          \qquad Bi_w = h_w r_p / \lambda_{er}

with the heat release per bed volume |dH| r_v at the inlet state and T_w the medium temperature.

Without ``[bed] radial_conductivity``, ``radial_diffusivity`` and ``wall_coefficient`` the row
says it is not checked and asks for them; it never makes a number up.

References: D.E. Mears, "Diagnostic criteria for heat transport limitations in fixed bed
reactors," J. Catal., vol. 20, pp. 127-131, 1971 (from memory).
"""
import dataclasses
import math

import numpy as np

from simulator.model import kernel as K1
from simulator.model.build import build_model
from simulator.model.radial import lumped_coefficient
from simulator.solve.integrate import simulate
from simulator.units import R
from simulator.verdicts import assumption_level

#: share of the centre-line rise the 1-D model may miss, [-] (common practice, no source)
ONE_DIMENSIONAL_THRESHOLD = 0.20
#: rise below which the relative difference is taken against this many kelvin, [K] (a near-flat tube)
RISE_FLOOR = 1.0
#: tube-to-particle diameter ratio below which the bed's wall region dominates, [-] (common practice, no source)
TUBE_TO_PARTICLE_MIN = 8.0
MEASURE = ("|rise_2D - rise_1D| / |rise_2D|: centre-line hot-spot rise above the medium of the 2-D model against "
           "the 1-D model with the lumped U (1/U = 1/h_w + R/(4 lambda_er) + 1/U_o)")
THRESHOLD_SOURCE = "20 % of the centre-line rise (common practice, no source)"
UNIT = "-"


def applies(case):
    """Why the row does not apply (a sentence), or None when it does (the row is made for packed beds only)."""
    if not case.heat.exchange:
        return (f"does not apply: heat.mode = {case.heat.mode!r}, no heat crosses the wall, so there is no radial "
                "temperature gradient")
    return None


def one_dimensional_entry(case, full_result, numbers, change_of, conversion_change):
    """The ``one_dimensional`` row (same keys as the other rows, plus ``details``).

    Parameters
    ----------
    case : simulator.case.schema.Case
    full_result : simulator.results.Result
        The case's own run (2-D when the case says ``model.radial = "2d"``).
    numbers, change_of, conversion_change : callable
        The assumption check's design numbers of a result, design change and conversion
        change (:mod:`simulator.assumptions`), so this row measures as the others do.
    """
    base = {"threshold": ONE_DIMENSIONAL_THRESHOLD, "unit": UNIT, "measure": MEASURE,
            "threshold_source": THRESHOLD_SOURCE}
    reason = applies(case)
    if reason is not None:
        return _row(base, None, "holds", None, reason, None, {})
    rs = case.radial
    details = {"tube_to_particle_ratio": case.tube.inner_diameter / case.bed.particle_diameter,
               "tube_to_particle_minimum": TUBE_TO_PARTICLE_MIN,
               "tube_to_particle_source": "D/d_p > 8 (common practice, no source)"}
    if not rs.given:
        return _row(base, None, "unknown", None,
                    "the 2-D model needs [bed] radial_conductivity, radial_diffusivity and wall_coefficient; "
                    "give them to check this (no correlation is used in their place)", None, details)
    if case.heat.arrangement not in ("uniform", "co-current"):
        return _row(base, None, "unknown", None,
                    f"the 2-D model is not built for a {case.heat.arrangement} medium", None, details)
    if case.thermo.equation_of_state != "ideal-gas":
        return _row(base, None, "unknown", None, "the 2-D model is built for an ideal gas only", None, details)
    radius = 0.5 * case.tube.inner_diameter
    # both tubes without the temperature limit, so that each rise is the true maximum (the limit is
    # judged in the details); the case's own run is reused when the limit did not stop it
    free = dataclasses.replace(case, design=dataclasses.replace(case.design, temperature_limit=math.nan))
    own = full_result if full_result.status != "stopped" else simulate(free)
    if rs.two_dimensional:
        two = own
        U_1d = lumped_coefficient(rs.wall_coefficient, rs.conductivity, radius, _outer(case.heat.overall_coefficient))
        one = simulate(dataclasses.replace(free, radial=dataclasses.replace(rs, dimension="1d"),
                                           heat=dataclasses.replace(case.heat, overall_coefficient=U_1d)))
    else:
        one = own
        U_1d = case.heat.overall_coefficient
        inside = 1.0 / rs.wall_coefficient + radius / (4.0 * rs.conductivity)
        if not U_1d > 0.0 or 1.0 / U_1d <= inside:
            return _row(base, None, "unknown", None,
                        f"heat.overall_coefficient = {U_1d:.4g} W/(m^2*K) is not below the bed-side "
                        f"limit 1/(1/h_w + R/(4 lambda_er)) = {1.0 / inside:.4g} W/(m^2*K), so no outside "
                        "coefficient fits the 2-D model; check the coefficients", None, details)
        U_o = 1.0 / (1.0 / U_1d - inside)
        two = simulate(dataclasses.replace(free, radial=dataclasses.replace(rs, dimension="2d"),
                                           heat=dataclasses.replace(case.heat, overall_coefficient=U_o)))
    details.update(mears_radial(case))
    details["lumped_coefficient_W_per_m2_K"] = U_1d
    if "failed" in (one.status, two.status):
        which = " and ".join(lab for lab, r in (("1-D", one), ("2-D", two)) if r.status == "failed")
        details["runs"] = {"1d": one.termination, "2d": two.termination}
        return _row(base, None, "unknown", None, f"the {which} run failed ({_failed(one, two)})",
                    None, details)
    rise_1d = _rise(one.hot_spot)
    rise_2d = _rise(two.hot_spot)
    details.update({"centre_line_rise_2d_K": rise_2d, "rise_1d_K": rise_1d,
                    "cup_mixing_rise_2d_K": _rise(two.summary().get("cup_mixing_hot_spot", {})),
                    "hot_spot_2d_K": two.hot_spot["temperature_K"], "hot_spot_1d_K": one.hot_spot["temperature_K"],
                    "ratio_1d_to_2d": rise_1d / rise_2d if rise_2d else None,
                    "temperature_limit_K": case.design.temperature_limit,
                    "above_temperature_limit": [lab for lab, r in (("1-D", one), ("2-D", two))
                                                if r.hot_spot["temperature_K"] >= case.design.temperature_limit],
                    "stopped": [lab for lab, r in (("1-D", one), ("2-D", two)) if r.status == "stopped"]})
    value = abs(rise_2d - rise_1d) / max(abs(rise_2d), RISE_FLOOR)
    n1, n2 = numbers(one), numbers(two)
    change, basis = change_of(case, n1, n2, "1-D (lumped U)", "2-D")
    verdict = "holds" if value <= ONE_DIMENSIONAL_THRESHOLD else "fails"
    return _row(base, value, verdict, change, basis, conversion_change(n1, n2), details)


def _outer(U):
    return U if U > 0.0 else math.inf


def _rise(hot):
    value = hot.get("rise_above_medium_K")
    if value is None:
        value = hot.get("rise_above_feed_K")
    return None if value is None else float(value)


def _failed(one, two):
    return "; ".join(f"{lab}: {r.termination}" for lab, r in (("1-D", one), ("2-D", two)) if r.status == "failed")


def _row(base, value, verdict, change, basis, conversion_change, details):
    return {**base, "value": value, "verdict": verdict, "level": assumption_level(verdict, change),
            "design_change_percent": change, "design_change_basis": basis,
            "outlet_conversion_change": conversion_change, "details": details}


def mears_radial(case):
    """Radial heat-transport criterion of Mears (1971, from memory) at the inlet state.

    Returns
    -------
    dict
        ``mears_radial_value`` (left side), ``mears_radial_limit`` (right side), both [-],
        and ``mears_radial_source``.
    """
    rs = case.radial
    model = build_model(case)
    n = model.n
    radius = 0.5 * case.tube.inner_diameter
    r_p = 0.5 * case.bed.particle_diameter
    T_w = case.heat.medium_temperature if not math.isnan(case.heat.medium_temperature) else case.feed.temperature
    d = np.empty(len(model.y0))
    K1.rhs(0.0, model.y0.copy(), *model.args, d)
    T0 = model.y0[n]
    nasa = model.args[2]
    release = -sum(K1._h_RT(nasa[i], T0) * R * T0 * d[i] for i in range(n)) / model.area   # [W/m^3]
    E = max(abs(r.activation_energy) for r in case.reactions)
    bi_w = rs.wall_coefficient * r_p / rs.conductivity
    lhs = abs(release) * radius ** 2 / (rs.conductivity * T_w)
    rhs = (0.4 * R * T_w / E) / (1.0 + 8.0 * r_p / (radius * bi_w)) if E > 0 else math.inf
    return {"mears_radial_value": lhs, "mears_radial_limit": rhs, "mears_radial_holds": bool(lhs < rhs),
            "mears_radial_source": "D.E. Mears, J. Catal. 20 (1971) 127-131, radial heat criterion at the inlet "
                                   "state (from memory)"}
