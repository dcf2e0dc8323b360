"""Reading a given wall profile, ``[[heat.medium.profile]]`` (``heat.medium.arrangement = "wall-profile"``).

Each row has a ``position`` and either a ``temperature`` (wall or flue-gas temperature on the far
side of U) or a ``heat_flux`` (W/m^2 on the inner wall), the same one in every row. Positions start
at 0, increase strictly and reach the tube length; the kernel joins the rows by straight lines.
"""
from simulator.errors import UnitError
from simulator.units import parse_quantity

#: Plausible values of the rows (common practice, no source): temperatures as for any medium, [K];
#: inner-wall fluxes of fired coils are tens of kW/m^2, so |q''| above 1 MW/m^2 is a slip, [W/m^2].
TEMPERATURE_RANGE = (150.0, 3500.0)
MAX_HEAT_FLUX = 1.0e6
HEAT_FLUX = "[mass] / [time] ** 3"
QUANTITIES = ("temperature", "heat_flux")


def read_wall_profile(ck, h, m, raw):
    """Check the rows and return (quantity, positions [m], values [K or W/m^2]); problems go to ``ck``."""
    path = "heat.medium.profile"
    for key in ("temperature", "mass_flow", "cp"):
        if key in m:
            ck.fail(f"heat.medium.{key}", ': given but arrangement = "wall-profile" takes the far side from '
                    "[[heat.medium.profile]]; remove it.")
    rows = m.get("profile")
    if not isinstance(rows, list) or len(rows) < 2 or not all(isinstance(r, dict) for r in rows):
        ck.fail(path, ": needs at least two [[heat.medium.profile]] rows of position and temperature (or "
                "position and heat_flux).")
        return "", (), ()
    kinds = {q for r in rows for q in QUANTITIES if q in r}
    if len(kinds) != 1:
        ck.fail(path, ": give temperature in every row or heat_flux in every row, not both and not neither "
                "(one kind of profile per case).")
        return "", (), ()
    quantity = kinds.pop()
    if quantity == "heat_flux" and "overall_coefficient" in h:
        ck.fail("heat.overall_coefficient", ": given but a heat_flux profile fixes the flux itself; remove it.")
    positions, values = [], []
    for i, r in enumerate(rows):
        p = f"{path}.{i}"
        ck.keys(r, {"position", quantity}, p, pattern="heat.medium.profile.*")
        if quantity not in r:
            ck.fail(f"{p}.{quantity}", ": missing")
            return "", (), ()
        z = ck.quantity(r, "position", "length", p, minimum=0.0, strict=False)
        v = _value(ck, r[quantity], quantity, f"{p}.{quantity}")
        positions.append(z)
        values.append(v)
    if any(x != x for x in positions + values):
        return "", (), ()
    if positions[0] != 0.0:
        ck.fail(f"{path}.0.position", f" = {rows[0]['position']!r}: the first row must be at position = 0 m.")
    if any(b <= a for a, b in zip(positions, positions[1:])):
        ck.fail(path, ": positions must increase strictly from row to row.")
    length = _tube_length(raw)
    if length is not None and positions[-1] < length * (1.0 - 1e-12):
        ck.fail(f"{path}.{len(rows) - 1}.position", f" = {rows[-1]['position']!r}: the rows must reach the tube "
                f"length ({length:g} m); a given profile is never extrapolated.")
    return quantity, tuple(positions), tuple(values)


def _value(ck, written, quantity, path):
    dimension = "temperature" if quantity == "temperature" else HEAT_FLUX
    try:
        v = parse_quantity(written, dimension, "")
    except UnitError as err:
        hint = ' e.g. "45 kW/m^2"' if quantity == "heat_flux" else ""
        ck.fail(path, f"{err}{hint}")
        return float("nan")
    lo, hi = TEMPERATURE_RANGE if quantity == "temperature" else (-MAX_HEAT_FLUX, MAX_HEAT_FLUX)
    if not lo <= v <= hi:
        unit = "K" if quantity == "temperature" else "W/m^2"
        ck.fail(path, f" = {written!r}: outside {lo:g} to {hi:g} {unit}; check the number and its unit.")
        return float("nan")
    return v


def _tube_length(raw):
    try:
        return parse_quantity(raw["tube"]["length"], "length", "")
    except (KeyError, TypeError, UnitError):
        return None      # reported by the tube checks
