"""Report block of the tube wall: where U comes from, U along the tube, wall temperatures and flux.

For every tube that exchanges heat (``heat.mode = "exchange"``). With ``[heat.coefficient]`` the
inside coefficient follows the flow and the inner- and outer-wall temperatures are computed; with a
typed U the split of 1/U is unknown, so the wall temperature is only bounded (the hotter of gas and
far side), and the block says so. Display values only (K, W/(m^2*K), kW/m^2, m).
"""
import numpy as np

from simulator.report.context_format import fixed, fmt

EMPTY = {"available": False, "paragraphs": [], "plots": []}


def wall_block(case, result):
    """The ``wall`` block of the report context: available, paragraphs, plots.

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated case, [-]
    result : simulator.results.Result
        Its design run, [-]

    Returns
    -------
    dict
        ``available`` (bool), ``paragraphs`` (text), ``plots`` (list of {title, uri, caption}), [-]
    """
    wall = result.extra.get("wall") if case.heat.exchange else None
    if not wall or result.status == "failed":
        return EMPTY
    from simulator.report import plots

    s = result.summary()["wall"]
    z = np.asarray(result.z, dtype=float)
    U = np.asarray(wall["overall_coefficient_W_per_m2K"], dtype=float)
    paragraphs = [f"Wall heat transfer: {s['coefficient_source']}."]
    out = []
    if np.any(np.isfinite(U)):
        u = s["overall_coefficient_W_per_m2K"]
        if case.heat.coefficient is None:
            paragraphs[0] = (f"Wall heat transfer: a typed U = {fmt(u['inlet'], 4)} W/(m²·K) on the inner wall area, "
                             "constant along the tube (heat.overall_coefficient).")
        else:
            paragraphs.append(f"U on the inner wall area: {fmt(u['inlet'], 4)} W/(m²·K) at the inlet, "
                              f"{fmt(u['outlet'], 4)} at the outlet (range {fmt(u['min'], 4)} to {fmt(u['max'], 4)}).")
        if case.heat.coefficient is not None:
            series = {"Overall U (inner area)": U}
            if np.any(np.isfinite(wall["inside_coefficient_W_per_m2K"])):
                series["Inside coefficient h_i"] = wall["inside_coefficient_W_per_m2K"]
            out.append({"title": "Heat-transfer coefficient", "caption": "U and the process-side coefficient along "
                        "the tube, from the local flow (the wall, outside and fouling resistances are constant).",
                        "uri": plots.profile_lines_plot(z, series, "Coefficient [W/(m²·K)]")})
    if s["max_wall_temperature_K"] is not None:
        paragraphs.append(f"Hottest tube wall {fixed(s['max_wall_temperature_K'])} K at z = "
                          f"{fmt(s['max_wall_temperature_position_m'], 3)} m ({wall['basis'].split(' (')[0]}).")
        series = {"Gas": np.asarray(result.T, dtype=float), "Inner wall": wall["wall_temperature_inner_K"],
                  "Outer wall": wall["wall_temperature_outer_K"]}
        if case.heat.profile_quantity != "heat_flux":
            series["Far side (medium or given)"] = np.asarray(result.Tc, dtype=float)
        out.append({"title": "Wall temperatures", "caption": "Gas, inner-wall and outer-wall temperature along the "
                    "tube (and the medium or given far-side temperature).",
                    "uri": plots.profile_lines_plot(z, series, "Temperature [K]")})
    elif s["max_wall_temperature_bound_K"] is not None:
        paragraphs.append(f"The tube-wall temperature is not resolved: {wall['basis']}; here at most "
                          f"{fixed(s['max_wall_temperature_bound_K'])} K. Give [heat.coefficient] to compute it.")
    else:
        paragraphs.append(f"The tube-wall temperature is not resolved: {wall['basis']}.")
    limit = case.design.wall_temperature_limit
    if limit == limit:
        stopped = "wall_temperature_limit" in result.events
        paragraphs.append(f"Tube-wall temperature limit (design.wall_temperature_limit) {fixed(limit)} K: "
                          + ("exceeded; the run was stopped there." if stopped else "not reached."))
    flux = np.asarray(wall["wall_heat_flux_W_per_m2"], dtype=float)
    if np.any(np.isfinite(flux)) and case.heat.arrangement != "wall-profile":
        out.append({"title": "Wall heat flux", "caption": "Heat flux on the inner wall into the gas (negative: the "
                    "gas is cooled).", "uri": plots.profile_lines_plot(z, {"Heat flux into the gas": flux / 1e3},
                                                                        "Heat flux [kW/m²]")})
    spread = ("the correlations behind U carry a spread of typically 20 % or more" if case.heat.coefficient is not None
              else "a typed U is only as good as its source; the screening shows how the hot spot moves with it")
    paragraphs.append("Check the tube-metal temperature against the alloy's allowable temperature and the flux "
                      f"against the design flux by the applicable codes and licensed engineering practice; {spread}.")
    return {"available": True, "paragraphs": paragraphs, "plots": out}
