"""Display formatting of the report context: rounding and unit text.

The number-to-text helpers that every part of the report context uses
(:mod:`simulator.report.context` and its ``context_*`` modules): significant
digits (:func:`fmt`), fixed decimals (:func:`fixed`), percentages, design
changes, and the readable text of a pint unit (:func:`unit_text`). Inside
tubesim everything is SI; numbers are rounded for display only in the report
context, with these helpers.
"""
import math

from simulator.units import registry

_SUPERSCRIPT = str.maketrans("-0123456789.", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹·")
_DASH = "\u2014"


# ----------------------------------------------------------------------------- numbers
def _finite(value):
    try:
        return value is not None and not isinstance(value, bool) and math.isfinite(float(value))
    except (TypeError, ValueError):
        return False


def fmt(value, sig=4, missing="n/a"):
    """Round a number to ``sig`` significant digits for display.

    Parameters
    ----------
    value : float or None
        Number to show (any unit), [-]
    sig : int
        Significant digits, [-]
    missing : str
        Text shown for None, NaN or infinity, [-]

    Returns
    -------
    str
        e.g. ``"0.9035"``, ``"6297"``, ``"1.69e-16"``, [-]

    Examples
    --------
    >>> fmt(6297.4797), fmt(16472.3), fmt(1.6857e-16, 3), fmt(None)
    ('6297', '16470', '1.69e-16', 'n/a')
    """
    if not _finite(value):
        return missing
    value = float(value)
    if 1.0 <= abs(value) < 1e7:
        digits = sig - 1 - int(math.floor(math.log10(abs(value))))
        if digits <= 0:                   # e.g. 16470 instead of 1.647e4
            return f"{round(value, digits):.0f}"
    text = f"{value:.{sig}g}"
    if "e" in text:
        mantissa, exponent = text.split("e")
        text = f"{mantissa}e{int(exponent)}"
    return text


def fixed(value, decimals=1, missing="n/a", sign=False):
    """Fixed-point display, e.g. temperatures to 0.1 K.

    Parameters
    ----------
    value : float or None
        Number to show, [-]
    decimals : int
        Digits after the point, [-]
    missing : str
        Text shown for None, NaN or infinity, [-]
    sign : bool
        Always show the sign, [-]

    Returns
    -------
    str
        Rounded text, [-]

    Examples
    --------
    >>> fixed(650.01180745), fixed(-3.14159, 2, sign=True)
    ('650.0', '-3.14')
    """
    if not _finite(value):
        return missing
    return f"{float(value):{'+' if sign else ''}.{decimals}f}"


def _si(value):
    """SI value as shown in the Inputs table: 6 significant digits."""
    return fmt(value, 6)


def _change(percent):
    """A design change in percent: one decimal, two significant digits below 0.1 %."""
    if not _finite(percent):
        return "n/a"
    if abs(percent) < 0.1:
        return "0 %" if percent == 0 else f"{percent:+.2g} %"
    return f"{percent:+.1f} %"


def _pretty_rule(text):
    """Screening rule text with parameter keys in words."""
    for key, words in (("medium_temperature_K", "medium temperature"), ("inlet_temperature_K", "inlet temperature"),
                       ("feed_mole_fraction", "feed mole fraction"), ("medium_temperature", "medium temperature"),
                       ("inlet_temperature", "inlet temperature"), ("overall_coefficient", "wall coefficient U"),
                       ("mass_flow", "feed flow"), ("Tc^2", "Tc²")):
        text = text.replace(key, words)
    return text


#: Case paths a sweep may vary -> words with the SI unit of the stored values.
_PATH_WORDS = {
    "heat.medium.temperature": "Medium temperature [K]",
    "heat.medium.mass_flow": "Medium mass flow [kg/s]",
    "heat.medium.cp": "Medium heat capacity [J/(kg·K)]",
    "heat.overall_coefficient": "Overall heat-transfer coefficient U [W/(m²·K)]",
    "feed.temperature": "Feed temperature [K]",
    "feed.pressure": "Feed pressure [Pa]",
    "feed.molar_flow": "Feed molar flow [mol/s]",
    "feed.mass_flow": "Feed mass flow [kg/s]",
    "feed.volumetric_flow": "Feed volumetric flow [m³/s]",
    "tube.count": "Tube count [-]",
    "tube.length": "Tube length [m]",
    "tube.inner_diameter": "Tube inner diameter [m]",
    "bed.particle_diameter": "Particle diameter [m]",
    "bed.void_fraction": "Bed void fraction [-]",
    "bed.bulk_density": "Bed bulk density [kg/m³]",
}
_REACTION_WORDS = {"pre_exponential": ("Pre-exponential factor", "SI units"),
                   "activation_energy": ("Activation energy", "J/mol"),
                   "temperature_exponent": ("Temperature exponent", "-")}


def path_label(path):
    """Axis words with unit for a case path, never the raw dotted path.

    >>> path_label("heat.medium.temperature"), path_label("feed.mole_fractions.OX")
    ('Medium temperature [K]', 'Feed mole fraction of OX [-]')
    >>> path_label("reactions.0.activation_energy")
    'Activation energy of R1 [J/mol]'
    """
    if path in _PATH_WORDS:
        return _PATH_WORDS[path]
    parts = path.split(".")
    if len(parts) == 3 and parts[:2] == ["feed", "mole_fractions"]:
        return f"Feed mole fraction of {parts[2]} [-]"
    if len(parts) == 3 and parts[0] == "reactions" and parts[1].isdigit() and parts[2] in _REACTION_WORDS:
        words, unit = _REACTION_WORDS[parts[2]]
        return f"{words} of R{int(parts[1]) + 1} [{unit}]"
    words = " ".join(p.replace("_", " ") for p in parts if not p.isdigit())
    return words[:1].upper() + words[1:] + " [SI units]"


def _pct(fraction, decimals=1, sign=True):
    return "n/a" if not _finite(fraction) else f"{100.0 * fraction:{'+' if sign else ''}.{decimals}f} %"


# ----------------------------------------------------------------------------- units
def unit_text(units):
    """Readable text of a pint unit: ``mol/(kg·s·Pa^1.5)``.

    Parameters
    ----------
    units : pint.Unit
        Unit to print, [-]

    Returns
    -------
    str
        Numerator/denominator text with superscript integer powers, [-]
    """
    ureg = registry()
    numerator, denominator = [], []
    for name, power in units._units.items():
        symbol = ureg.get_symbol(name)
        p = abs(power)
        if p == 1:
            text = symbol
        elif float(p).is_integer():
            text = symbol + str(int(p)).translate(_SUPERSCRIPT)
        else:
            text = f"{symbol}^{p:g}"
        (numerator if power > 0 else denominator).append(text)
    top = "·".join(numerator) or "1"
    if not denominator:
        return top
    bottom = denominator[0] if len(denominator) == 1 else f"({'·'.join(denominator)})"
    return f"{top}/{bottom}"
