"""Units at the edges: the one pint registry, text -> SI float, and constants.

Everything inside tubesim is a plain SI float (m, s, kg, mol, K, Pa absolute, J, W).
Case files give every dimensional value as text with its unit (``"5 bar"``,
``"250 degC"``); :func:`parse_quantity` turns that into the SI number and refuses bare
numbers, wrong dimensions and gauge pressures.

Units added to pint's defaults (the one place they are defined):

- ``psia``, ``bara``: pound-force per square inch and bar, absolute (= ``psi``, ``bar``).
- ``lbmol`` (``lb_mol``, ``pound_mole``): 453.59237 mol.
- ``Nm^3`` / ``Nm3`` (normal cubic metre): the amount of ideal gas that fills 1 m^3 at
  the normal reference state :data:`T_NORMAL` = 273.15 K and :data:`P_NORMAL` =
  101.325 kPa, i.e. P V / (R T) = 44.615 mol. A normal volumetric flow such as
  ``"1200 Nm^3/h"`` is therefore a molar flow.
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
#: Atmospheric pressure assumed when a gauge pressure is turned into an absolute one in a hint, [Pa].
P_ATMOSPHERE = 101325.0
#: Normal reference state of ``Nm^3``: temperature [K] and pressure [Pa].
T_NORMAL, P_NORMAL = 273.15, 101325.0
#: Amount of ideal gas in one normal cubic metre, [mol] (P_NORMAL * 1 m^3 / (R * T_NORMAL)).
NORMAL_CUBIC_METRE = P_NORMAL / (R * T_NORMAL)

_NUMBER = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")
#: A gauge pressure unit: bar, psi, kPa, MPa, Pa or atm followed by g, _g, (g), "gauge" or " g".
_GAUGE = re.compile(r"^(bar|psi|kpa|mpa|pa|atm)[ _]?(g|\(g\)|gauge)$", re.IGNORECASE)
#: Proper spelling of each gauge base unit, its absolute counterpart in a hint, and the decimals
#: that print 1 atm in it exactly (or to 0.1 Pa for psi).
_GAUGE_BASE = {"bar": ("bar", "bar", 5), "psi": ("psi", "psia", 4), "kpa": ("kPa", "kPa", 3),
               "mpa": ("MPa", "MPa", 6), "pa": ("Pa", "Pa", 0), "atm": ("atm", "atm", 0)}
#: A normal cubic metre written as Nm^3, Nm**3, Nm3, Nm³ or "N m^3" (not a newton-metre cubed).
_NORMAL_VOLUME = re.compile(r"(?<![A-Za-z_])N\s?m(?:\^3|\*\*3|3|³)(?![0-9A-Za-z_])")

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
    "thermal_conductivity": "[mass] * [length] / [time] ** 3 / [temperature]",
    "fouling_resistance": "[time] ** 3 * [temperature] / [mass]",
    "velocity": "[length] / [time]",
    "diffusivity": "[length] ** 2 / [time]",
}

#: SI unit text of each named dimension (for messages).
SI_UNITS = {
    "length": "m", "temperature": "K", "pressure": "Pa", "molar_flow": "mol/s", "mass_flow": "kg/s",
    "volumetric_flow": "m^3/s", "molar_mass": "kg/mol", "molar_heat_capacity": "J/(mol*K)",
    "specific_heat_capacity": "J/(kg*K)", "molar_energy": "J/mol", "molar_entropy": "J/(mol*K)",
    "density": "kg/m^3", "viscosity": "Pa*s", "heat_transfer_coefficient": "W/(m^2*K)",
    "temperature_difference": "K", "thermal_conductivity": "W/(m*K)", "fouling_resistance": "m^2*K/W",
    "velocity": "m/s",
    "diffusivity": "m^2/s",
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
    "thermal_conductivity": '"16 W/(m*K)"',
    "fouling_resistance": '"2e-4 m^2*K/W"',
    "velocity": '"0.8 m/s"',
    "diffusivity": '"3e-4 m^2/s"',
}


@functools.lru_cache(maxsize=1)
def registry():
    """The one pint UnitRegistry of tubesim (imported on first use; pint is slow to import)."""
    import pint

    try:  # the parsed definitions are cached on disk (~0.02 s instead of ~0.2 s per start)
        ureg = pint.UnitRegistry(autoconvert_offset_to_baseunit=False, cache_folder=":auto:")
    except OSError:  # no writable cache folder: build it in memory
        ureg = pint.UnitRegistry(autoconvert_offset_to_baseunit=False)
    ureg.define("psia = psi")
    ureg.define("bara = bar")
    ureg.define("pound_mole = 453.59237 * mole = lbmol = lb_mol")
    ureg.define(f"normal_cubic_meter = {NORMAL_CUBIC_METRE!r} * mole = normal_cubic_metre")
    return ureg


def is_normal_volume(text):
    """True when a value is written in normal cubic metres (``"1200 Nm^3/h"``): a molar amount.

    Examples
    --------
    >>> is_normal_volume("1200 Nm^3/h"), is_normal_volume("3 m^3/h")
    (True, False)
    """
    return isinstance(text, str) and _NORMAL_VOLUME.search(text) is not None


def gauge_hint(number, unit):
    """The absolute pressure for a gauge value, as text in the unit written, or None if not gauge.

    Absolute = gauge + 1 atm (:data:`P_ATMOSPHERE`, 101.325 kPa) expressed in the gauge's
    own unit, e.g. ``gauge_hint(58, "psig")`` -> ``"72.6959 psia"``.

    Examples
    --------
    >>> gauge_hint(58.0, "psig")
    '72.6959 psia'
    >>> gauge_hint(5.0, "bar gauge")
    '6.01325 bar'
    >>> gauge_hint(2000.0, "kPa(g)")
    '2101.325 kPa'
    >>> gauge_hint(5.0, "bar") is None
    True
    """
    match = _GAUGE.match(unit.strip())
    if match is None:
        return None
    base, absolute, decimals = _GAUGE_BASE[match.group(1).lower()]
    atmosphere = registry().Quantity(P_ATMOSPHERE, "Pa").to(base).magnitude
    written = repr(float(number)).partition(".")[2]
    decimals = min(9, max(decimals, 0 if "e" in written or written == "0" else len(written)))
    text = f"{number + atmosphere:.{decimals}f}"
    return f"{text.rstrip('0').rstrip('.') if '.' in text else text} {absolute}"


def _quantity(text, where):
    ureg = registry()
    match = _NUMBER.match(text)
    if match is None:
        raise UnitError(f"{where} = {text!r}: not a number followed by a unit")
    number, unit = float(match.group(1)), match.group(2)
    hint = gauge_hint(number, unit)
    if hint is not None:
        raise UnitError(
            f"{where} = {text!r}: gauge pressure is not accepted; give absolute pressure, e.g. "
            f'"{hint}" (gauge + atmospheric, assuming an atmospheric pressure of 101.325 kPa; '
            "use the local one if it differs)."
        )
    unit = _NORMAL_VOLUME.sub("normal_cubic_meter", unit)
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
    try:
        result = _to_si(value, dimension, where, si_unit)
    except (OverflowError, ZeroDivisionError, ArithmeticError) as err:
        raise UnitError(f"{where} = {value!r}: cannot be converted to SI units ({err.__class__.__name__}); "
                        "check the exponents.") from err
    if not math.isfinite(result):
        raise UnitError(f"{where} = {value!r}: not a finite number")
    return result


def _to_si(value, dimension, where, si_unit):
    """Body of :func:`parse_quantity`: parse, check the dimension, convert (may overflow)."""
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
    if not same_dimension(quantity.dimensionality, target_dim):
        example = _EXAMPLES.get(dimension)
        hint = f"e.g. {example}" if example else f"units of {expected}"
        raise UnitError(
            f"{where} = {value!r}: wrong dimension ({quantity.dimensionality}); "
            f"expected {dimension if example else 'dimension ' + str(target_dim)}, {hint}."
        )
    si = quantity.to(si_unit) if si_unit else quantity.to_base_units()
    return float(si.magnitude)


def same_dimension(first, second, tolerance=1e-9):
    """True when two pint dimensionalities have the same exponents within ``tolerance``.

    Exponents built from decimal reaction orders carry rounding errors (3 * 1.8 - 3 =
    2.4000000000000004), so an exact comparison would refuse a unit written as m^2.4.

    Examples
    --------
    >>> ureg = registry()
    >>> same_dimension(ureg.Quantity(1, "m**2.4").dimensionality,
    ...                ureg.Quantity(1, "m**(3 * 1.8 - 3)").dimensionality)
    True
    """
    keys = set(first) | set(second)
    return all(abs(first.get(k, 0.0) - second.get(k, 0.0)) <= tolerance for k in keys)


def si_unit_text(dimensionality_text):
    """Human-readable SI base unit of a pint expression (for error messages)."""
    return str(registry().Quantity(1, dimensionality_text).to_base_units().units)
