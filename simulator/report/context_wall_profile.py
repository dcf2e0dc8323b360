"""Report block of a given wall profile (``heat.medium.arrangement = "wall-profile"``).

The rows as given, the wall (flue-gas) temperature or the heat flux along the tube, and the
heat flux into the gas it gives: q'' = U (Tw - T) on the inner wall for a given temperature,
the given q'' itself otherwise. Display values only (K, kW/m^2, m), as the rest of the context.
"""
import numpy as np

from simulator.report.context_format import fixed, fmt


def wall_profile_block(case, result):
    """The ``wall_profile`` block of the report context: available, paragraphs, rows, plots.

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated case, [-]
    result : simulator.results.Result
        Its design run, [-]

    Returns
    -------
    dict
        ``available`` (bool), ``paragraphs`` (text), ``rows`` ({position, value}), ``unit`` (text),
        ``plots`` (list of {title, uri, caption}), [-]
    """
    heat = case.heat
    if heat.arrangement != "wall-profile":
        return {"available": False, "paragraphs": [], "rows": [], "unit": "", "plots": []}
    from simulator.model.heat.wallprofile import heat_flux
    from simulator.report import plots

    given_T = heat.profile_quantity == "temperature"
    D = case.tube.inner_diameter
    z = np.asarray(result.z, dtype=float)
    wall = result.extra.get("wall")
    if wall is not None:                       # U(z) from [heat.coefficient] or the typed U, as the run used it
        flux = np.asarray(wall["wall_heat_flux_W_per_m2"], dtype=float)
    elif given_T:
        flux = heat.overall_coefficient * (np.asarray(result.Tc, dtype=float) - np.asarray(result.T, dtype=float))
    else:
        flux = heat_flux(heat, z)
    duty = float(result.Q[-1])                 # whole reactor (Result flows and duty are for all tubes)
    rows = [{"position": fmt(p, 4), "value": fixed(v) if given_T else fmt(v / 1e3, 4)}
            for p, v in zip(heat.profile_position, heat.profile_value)]
    U_text = ("U from [heat.coefficient]" if heat.coefficient is not None
              else f"U = {fmt(heat.overall_coefficient, 4)} W/(m^2*K)")
    if given_T:
        what = (f"a given temperature on the far side of {U_text} "
                "(flue gas or tube skin), joined by straight lines between the rows; the heat flux into the gas is "
                "U (Tw - T) on the inner wall")
    else:
        what = ("a given heat flux on the inner wall, joined by straight lines between the rows; there is no medium "
                "temperature (none is reported)")
    paragraphs = [f"The tube is heated by {what}. Wall duty of the whole reactor {fmt(duty / 1e3, 4)} kW; peak "
                  f"inner-wall flux {fmt(float(np.max(flux)) / 1e3, 4)} kW/m^2. The profile is never extrapolated: "
                  f"it covers 0 to {fmt(heat.profile_position[-1], 4)} m of the {fmt(case.tube.length, 4)} m tube.",
                  ("The tube-metal temperature is computed from [heat.coefficient] (see the tube-wall section below); "
                   if heat.coefficient is not None else
                   "The tube-metal temperature is not computed without [heat.coefficient] (the inside coefficient is "
                   "unknown): ")
                  + "check it against the alloy's limit, and the flux against the coil's design flux, by the furnace "
                    "designer's method and the applicable codes."]
    series = {"Heat flux into the gas": flux / 1e3}
    out = [{"title": "Heat flux into the gas", "uri": plots.profile_lines_plot(z, series, "Heat flux [kW/m^2]"),
            "caption": ("Heat flux on the inner wall along the tube"
                        + (", from U and the given wall temperature (the wall temperature is in the temperature "
                           "plot)." if given_T else ", as given."))}]
    return {"available": True, "paragraphs": paragraphs, "rows": rows,
            "unit": "K" if given_T else "kW/m^2", "plots": out}
