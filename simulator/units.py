"""Units at the edges: the one pint registry, text -> SI float, and constants.

Everything inside tubesim is a plain SI float (m, s, kg, mol, K, Pa absolute, J, W).
Case files give every dimensional value as text with its unit (``"5 bar"``,
``"250 degC"``); :func:`to_si` turns that into the SI number and refuses bare
numbers, wrong dimensions and gauge pressures.
"""
import functools
import math
import re

from simulator.errors import UnitError

#: Molar gas constant, [J/(mol*K)] (CODATA 2018, exact since the 2019 SI).
R = 8.314462618
#: Standard gravity, [m/s^2].
g = 9.80665
#: Reference temperature of formation enthalpies, [K].
T_REF = 298.15
#: Standard-state pressure used by Cantera's NASA data (1 atm), [Pa].
P_STANDARD = 101325.0

_NUMBER = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")
_GAUGE = re.compile(r"^(barg|psig|kpag|mpag|pag|bar_g|bar\(g\)|atmg)$", re.IGNORECASE)

#: Named dimensions a case field may ask for, as pint dimensionality strings.
DIMENSIONS = {
    "length": "[length]",
    "temperature": "[temperature]",
    "pressure": "[mass] / [length] / [time] ** 2",
    "molar_flow": "[substance] / [time]",
    "mass_flow": "[mass] / [time]",
    "volumetric_flow": "[length] ** 3 / [time]",
    "molar_mass": "[mass] / [substance]",
    "molar_heat_capacity": "[mass] * [length] ** 2 / [time] ** 2 / [temperature] / [substance]",
    "specific_heat_capacity": "[length] ** 2 / [time] ** 2 / [temperature]",
    "molar_energy": "[mass] * [length] ** 2 / [time] ** 2 / [substance]",
    "molar_entropy": "[mass] * [length] ** 2 / [time] ** 2 / [temperature] / [substance]",
    "density": "[mass] / [length] ** 3",
    "viscosity": "[mass] / [length] / [time]",
    "heat_transfer_coefficient": "[mass] / [time] ** 3 / [temperature]",
    "temperature_difference": "[temperature]",
}

_EXAMPLES = {
    "length": '"12 m" or "50 mm"',
    "temperature": '"250 degC" or "523.15 K"',
    "pressure": '"3 bar" or "300 kPa" (absolute)',
    "molar_flow": '"12 mol/s" or "43.2 kmol/h"',
    "mass_flow": '"1.5 kg/s" or "5400 kg/h"',
    "volumetric_flow": '"0.2 m^3/s"',
    "molar_mass": '"86 g/mol"',
    "molar_heat_capacity": '"150 J/(mol*K)"',
    "specific_heat_capacity": '"0.992 kJ/(kg*K)"',
    "molar_energy": '"-60 kJ/mol"',
    "molar_entropy": '"200 J/(mol*K)"',
    "density": '"1100 kg/m^3"',
    "viscosity": '"2.2e-5 Pa*s"',
    "heat_transfer_coefficient": '"180 W/(m^2*K)"',
    "temperature_difference": '"10 K" or "10 delta_degC"',
}


@functools.lru_cache(maxsize=1)
def registry():
    """The one pint UnitRegistry of tubesim (imported on first use; pint is slow to import)."""
    import pint

    try:  # the parsed definitions are cached on disk (~0.02 s instead of ~0.2 s per start)
        return pint.UnitRegistry(autoconvert_offset_to_baseunit=False, cache_folder=":auto:")
    except OSError:  # no writable cache folder: build it in memory
        return pint.UnitRegistry(autoconvert_offset_to_baseunit=False)


def _quantity(text, where):
    ureg = registry()
    match = _NUMBER.match(text)
    if match is None:
        raise UnitError(f"{where} = {text!r}: not a number followed by a unit")
    number, unit = float(match.group(1)), match.group(2)
    if _GAUGE.match(unit.replace(" ", "")):
        raise UnitError(
            f"{where} = {text!r}: gauge pressure is not accepted; give absolute pressure, "
            f'e.g. "{number + 1.01325:g} bar" for {number:g} barg.'
        )
    try:
        return ureg.Quantity(number, unit or "dimensionless")
    except Exception as err:  # pint raises several unrelated types for unknown units
        raise UnitError(f"{where} = {text!r}: unknown unit {unit!r} ({err.__class__.__name__})") from err


def parse_quantity(value, dimension, where, si_unit=None):
    """Parse a case value given as text with units and return the SI float.

    Parameters
    ----------
    value : str
        Value as written in the case file, e.g. ``"250 degC"``.
    dimension : str or pint dimensionality
        A key of :data:`DIMENSIONS`, or a pint dimensionality/unit string for
        composite fields such as a pre-exponential factor.
    where : str
        Field path used in error messages, e.g. ``"cases/a.toml: tube.length"``.
    si_unit : str, optional
        Unit to convert to; default is pint's SI base units.

    Returns
    -------
    float
        The value in SI base units (temperatures absolute, in K).

    Raises
    ------
    UnitError
        For a bare number, an unknown unit, a gauge unit or the wrong dimension.

    Examples
    --------
    >>> parse_quantity("250 degC", "temperature", "feed.temperature")
    523.15
    >>> parse_quantity("3 bar", "pressure", "feed.pressure")
    300000.0
    """
    if isinstance(value, bool) or not isinstance(value, str):
        example = _EXAMPLES.get(dimension, "a number with its unit")
        raise UnitError(
            f"{where} = {value!r}: needs a unit; write it as text with its unit, e.g. {example}."
        )
    ureg = registry()
    quantity = _quantity(value, where)
    expected = DIMENSIONS.get(dimension, dimension)
    if dimension == "temperature_difference":
        # a difference: accept K and delta_degC but not an absolute degC
        if str(quantity.units) in ("degree_Celsius", "degree_Fahrenheit"):
            raise UnitError(f'{where} = {value!r}: a temperature difference; write "K" or "delta_degC".')
    try:
        target_dim = ureg.parse_expression(expected).dimensionality if "[" not in str(expected) \
            else ureg.get_dimensionality(expected)
    except Exception:  # composite given as a unit string
        target_dim = ureg.Quantity(1, expected).dimensionality
    if quantity.dimensionality != target_dim:
        example = _EXAMPLES.get(dimension)
        hint = f"e.g. {example}" if example else f"units of {expected}"
        raise UnitError(
            f"{where} = {value!r}: wrong dimension ({quantity.dimensionality}); "
            f"expected {dimension if example else 'dimension ' + str(target_dim)}, {hint}."
        )
    si = quantity.to(si_unit) if si_unit else quantity.to_base_units()
    result = float(si.magnitude)
    if not math.isfinite(result):
        raise UnitError(f"{where} = {value!r}: not a finite number")
    return result


def si_unit_text(dimensionality_text):
    """Human-readable SI base unit of a pint expression (for error messages)."""
    return str(registry().Quantity(1, dimensionality_text).to_base_units().units)
