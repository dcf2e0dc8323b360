"""Reading ``[heat.coefficient]``: U from correlations instead of a typed ``heat.overall_coefficient``.

The two are alternatives: a case gives one of them, never both. ``inside`` names the
process-side correlation (or is a value with its unit); the wall and the outside add in
series (:mod:`simulator.model.heat_coefficient`)::

    [heat.coefficient]
    inside = "auto"                  # or a correlation name below, or "450 W/(m^2*K)"
    wall_thickness = "2.1 mm"        # with wall_conductivity; both or neither (then no wall resistance)
    wall_conductivity = "16 W/(m*K)"
    outside = "2000 W/(m^2*K)"       # medium side, on the outer area; leave out for none
    fouling_inside = "0 m^2*K/W"     # optional
    fouling_outside = "0 m^2*K/W"    # optional
    conductivity = "0.05 W/(m*K)"    # optional process-fluid conductivity; default Cantera's transport data
"""
from simulator.case.schema import HeatCoefficient, ShellSide
from simulator.errors import UnitError
from simulator.units import parse_quantity

NAN = float("nan")
KEYS = {"inside", "wall_thickness", "wall_conductivity", "outside", "fouling_inside", "fouling_outside",
        "conductivity", "shell"}
SHELL_KEYS = {"velocity", "transverse_pitch", "longitudinal_pitch", "layout", "rows", "density", "viscosity",
              "conductivity", "cp"}
#: outside correlations (the bank geometry and the medium's properties in [heat.coefficient.shell])
OUTSIDE = ("zukauskas-1972",)
LAYOUTS = ("inline", "staggered")
#: inside correlations of an empty tube and of a packed bed (names of the form author-year)
EMPTY_TUBE = ("gnielinski-1976", "dittus-boelter-1930")
PACKED_BED = ("leva-1949", "leva-1950", "li-finlayson-1977")
AUTO = {"empty tube": "auto, Gnielinski (1976) with the laminar/transition guard",
        "packed bed": "auto, Leva (1949 heating, 1950 cooling, by the direction of the flux)",
        "li-finlayson-1977": "Li & Finlayson (1977) wall coefficient lumped with the bed's radial conductivity "
                             "(1/h_i = 1/h_w + R/(4 lambda_er))"}


def read_heat_coefficient(ck, h, packed, liquid, given_flux=False):
    """Check ``[heat.coefficient]`` of an exchange case; returns a HeatCoefficient (problems go to ``ck``).

    Parameters
    ----------
    ck : simulator.case.load._Checker
        Collects the problems.
    h : dict
        The ``[heat]`` table as written.
    packed : bool
        True when the case has a ``[bed]``.
    liquid : bool
        True for a liquid feed (no transport data: the conductivity must be given).
    given_flux : bool
        True for a given heat-flux profile (U is not used; h_i and the wall give the wall temperatures).
    """
    path = "heat.coefficient"
    c = ck.table(h, "coefficient", path)
    ck.keys(c, KEYS, path)
    if "overall_coefficient" in h:
        ck.fail("heat.overall_coefficient", ": given together with [heat.coefficient]; give one of them (a typed U "
                "or U from correlations), not both.")
    inside, value = _inside(ck, c, packed, path)
    thickness = ck.quantity(c, "wall_thickness", "length", path, required=False, minimum=0.0, strict=False)
    k_wall = ck.quantity(c, "wall_conductivity", "thermal_conductivity", path, required=False, minimum=0.0)
    if ("wall_thickness" in c) != ("wall_conductivity" in c):
        ck.fail(path, ": give wall_thickness and wall_conductivity together (the wall's conduction resistance "
                "needs both), or neither to neglect it.")
    shell = None
    if c.get("outside") in OUTSIDE:
        outside = NAN
        shell = _shell(ck, c, h, path)
    else:
        outside = ck.quantity(c, "outside", "heat_transfer_coefficient", path, required=False, minimum=0.0)
        if "shell" in c:
            ck.fail(f"{path}.shell", f": given but outside is not a shell-side correlation; write outside = "
                    f"{OUTSIDE[0]!r} to use it, or remove it.")
    if given_flux:
        extra = [k for k in ("outside", "fouling_outside") if k in c]
        if extra:
            ck.fail(f"{path}.{extra[0]}", ": given but a heat_flux profile fixes the flux on the inner wall, so "
                    "nothing outside the wall enters; remove it (the inside coefficient and the wall give the "
                    "tube-metal temperatures).")
    k_fluid = ck.quantity(c, "conductivity", "thermal_conductivity", path, required=False, minimum=0.0)
    if liquid and "conductivity" not in c and inside != "value":
        ck.fail(f"{path}.conductivity", ": missing; a liquid feed has no transport data here, give its thermal "
                "conductivity (e.g. \"0.15 W/(m*K)\") or a typed inside coefficient.")
    fouling = [ck.quantity(c, key, "fouling_resistance", path, required=False, minimum=0.0, strict=False)
               for key in ("fouling_inside", "fouling_outside")]
    return HeatCoefficient(inside=inside, inside_value=value,
                           wall_thickness=0.0 if thickness != thickness else thickness,
                           wall_conductivity=k_wall,
                           outside=float("inf") if outside != outside else outside,
                           fouling_inside=0.0 if fouling[0] != fouling[0] else fouling[0],
                           fouling_outside=0.0 if fouling[1] != fouling[1] else fouling[1],
                           conductivity=k_fluid, shell=shell)


def _shell(ck, c, h, path):
    """``[heat.coefficient.shell]`` -> ShellSide (problems go to ``ck``); cp defaults to heat.medium.cp."""
    p = f"{path}.shell"
    sh = ck.table(c, "shell", p)
    ck.keys(sh, SHELL_KEYS, p)
    medium = h.get("medium") if isinstance(h.get("medium"), dict) else {}
    if "cp" in sh:
        cp = ck.quantity(sh, "cp", "specific_heat_capacity", p, minimum=0.0)
    elif "cp" in medium:
        cp = ck.quantity(medium, "cp", "specific_heat_capacity", "heat.medium", minimum=0.0)
    else:
        ck.fail(f"{p}.cp", ": missing; give the medium's heat capacity here (or heat.medium.cp).")
        cp = NAN
    layout = ck.choice(sh, "layout", p, LAYOUTS, default="staggered") or "staggered"
    rows = ck.number(sh, "rows", p, default=20, lo=1, hi=1000, integer=True)
    values = {key: ck.quantity(sh, key, dim, p, minimum=0.0) for key, dim in
              (("velocity", "velocity"), ("transverse_pitch", "length"), ("longitudinal_pitch", "length"),
               ("density", "density"), ("viscosity", "viscosity"), ("conductivity", "thermal_conductivity"))}
    return ShellSide(layout=layout, rows=int(rows) if rows == rows else 20, cp=cp, **values)


def check_shell_geometry(ck, coefficient, inner_diameter):
    """Refuse pitches that leave no gap between tubes of the outer diameter (problems go to ``ck``)."""
    shell = coefficient.shell if coefficient is not None else None
    if shell is None or inner_diameter != inner_diameter:
        return
    D_o = inner_diameter + 2.0 * coefficient.wall_thickness
    for key in ("transverse_pitch", "longitudinal_pitch"):
        pitch = getattr(shell, key)
        if pitch == pitch and pitch <= D_o * (1.0 if key == "transverse_pitch" else 0.5):
            ck.fail(f"heat.coefficient.shell.{key}", f" = {pitch:g} m: the tubes of outer diameter {D_o:g} m "
                    "(tube.inner_diameter + 2 wall_thickness) would touch or overlap; give the bank's pitch.")


def _inside(ck, c, packed, path):
    """(method name, value [W/(m^2*K)] or NaN) of ``inside``."""
    written = c.get("inside", "auto")
    kind = "packed bed" if packed else "empty tube"
    allowed = PACKED_BED if packed else EMPTY_TUBE
    other = EMPTY_TUBE if packed else PACKED_BED
    if not isinstance(written, str):
        ck.fail(f"{path}.inside", f" = {written!r}: write \"auto\", one of {', '.join(allowed)} or a value with its "
                "unit, e.g. \"450 W/(m^2*K)\".")
        return "auto", NAN
    if written in ("auto",) + allowed:
        return written, NAN
    if written in other:
        ck.fail(f"{path}.inside", f" = {written!r}: a correlation for a {'n empty tube' if packed else ' packed bed'}"
                f", but this case is a {kind}; use \"auto\" or one of {', '.join(allowed)}.")
        return "auto", NAN
    try:
        value = parse_quantity(written, "heat_transfer_coefficient", "")
    except UnitError:
        ck.fail(f"{path}.inside", f" = {written!r}: not a correlation or a coefficient; accepted for a {kind}: "
                f"\"auto\", {', '.join(allowed)}, or a value with its unit, e.g. \"450 W/(m^2*K)\".")
        return "auto", NAN
    if not value > 0.0:
        ck.fail(f"{path}.inside", f" = {written!r}: must be > 0.")
        return "auto", NAN
    value = ck.plausible(f"{path}.inside", written, value, "W/(m^2*K)")
    return "value", value


def describe_inside(coefficient, packed):
    """The inside method in words, for notes and reports."""
    if coefficient.inside == "value":
        return f"given, {coefficient.inside_value:.4g} W/(m^2*K)"
    if coefficient.inside == "auto":
        return AUTO["packed bed" if packed else "empty tube"]
    return AUTO.get(coefficient.inside, coefficient.inside)
