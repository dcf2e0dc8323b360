r"""Result -> report context: the ONLY place with display units and rounding.

:func:`build_context` turns one run (the :class:`~simulator.results.Result`, the
``assumptions.json`` dict and the ``screening.json`` dict) into the display
dict that :func:`simulator.report.html.render_html` reads (schema in the
:mod:`simulator.report.html` docstring). Everything inside tubesim is SI; here
numbers are rounded, pressures shown in kPa or bar and heat duties in kW. The
Inputs section shows every case value as written next to its SI value.

Verdict rules (documented choices; thresholds are common practice, no source)
------------------------------------------------------------------------------
Temperature scale: :math:`\Delta T_s = R T_r^2 / E`, with :math:`T_r` the
coolant temperature of a cooled tube (else the feed temperature) and :math:`E`
the largest activation energy of the case. A temperature change of
:math:`\Delta T_s` changes the rate constant e-fold; Van Welsenaere and
Froment (1970) place the onset of runaway where the hot spot exceeds the
coolant by about this amount (extremum of the maxima curve).

*Hot spot* (exothermic case, i.e. positive adiabatic rise)
    ``danger`` if the run stopped at ``design.temperature_limit``, the hot
    spot reached it, or the screening risk is "runaway"; ``attention`` if the
    hot spot lies more than :math:`\Delta T_s` above the coolant (cooled tube),
    within :math:`\Delta T_s` of the temperature limit, or an adiabatic tube
    has no temperature limit; ``ok`` otherwise. An endothermic or isothermal
    case has no reaction hot spot: ``ok`` unless the temperature limit was
    reached.
*Runaway risk*
    From ``screening["risk"]``: "adequate margin" -> ``ok``, "sensitive" ->
    ``attention``, "runaway" -> ``danger``. Not screened: ``ok`` when there is
    no exothermic path (nothing to run away), ``attention`` when an exothermic
    case could not be screened (not a cooled tube, or not run).
*Each assumption* (isothermal, isobaric, ideal gas, constant moles)
    "holds" -> ``ok``, unless applying it alone changes the design quantity
    by more than :data:`DESIGN_CHANGE_ATTENTION` (then ``attention``: it holds
    by its own measure but still moves the design); "fails" -> ``attention``
    with its design change; "unknown" -> ``attention`` with the reason.
*Target conversion* (when given): reached -> ``ok``; not reached in the
    tube -> ``attention``.
*Pressure drop* (when ``design.max_pressure_drop`` is given): within ->
    ``ok``; above -> ``danger``.
*Run*: a run stopped before the end of the tube -> ``danger``.
*Conservation closure*: relative error up to :data:`CLOSURE_OK` -> ``ok``,
    else ``attention``.
"""
import datetime as _dt
import hashlib
import math
import platform
import re
from importlib import metadata
from pathlib import Path

import numpy as np

from simulator.references import lookup
from simulator.units import R, registry

#: |design change| above which an assumption that "holds" is still flagged, [-]
#: (5 %, common practice, no source).
DESIGN_CHANGE_ATTENTION = 0.05
#: Relative conservation error accepted without comment, [-] (common practice, no source).
CLOSURE_OK = 1e-6

RISK_LEVELS = {"adequate margin": "ok", "sensitive": "attention", "runaway": "danger"}
VERDICT_LEVELS = {"safe": "ok", "runaway": "danger", "undecided": "attention"}
COOLED = ("constant-coolant", "co-current")

#: Case fields with a unit -> (dimension for :func:`simulator.units.parse_quantity`, SI unit shown).
#: ``*`` matches one path component. Composite units (pre-exponential factors) are built per reaction.
FIELD_UNITS = {
    "feed.temperature": ("temperature", "K"),
    "feed.pressure": ("pressure", "Pa"),
    "feed.molar_flow": ("molar_flow", "mol/s"),
    "feed.mass_flow": ("mass_flow", "kg/s"),
    "feed.volumetric_flow": ("volumetric_flow", "m³/s"),
    "tube.length": ("length", "m"),
    "tube.inner_diameter": ("length", "m"),
    "tube.roughness": ("length", "m"),
    "bed.particle_diameter": ("length", "m"),
    "bed.bulk_density": ("density", "kg/m³"),
    "heat.overall_coefficient": ("heat_transfer_coefficient", "W/(m²·K)"),
    "heat.coolant_temperature": ("temperature", "K"),
    "heat.coolant_mass_flow": ("mass_flow", "kg/s"),
    "heat.coolant_cp": ("specific_heat_capacity", "J/(kg·K)"),
    "pressure_drop.viscosity": ("viscosity", "Pa·s"),
    "design.temperature_limit": ("temperature", "K"),
    "design.max_pressure_drop": ("pressure", "Pa"),
    "solver.max_step": ("length", "m"),
    "assumptions.isothermal": ("temperature_difference", "K"),
    "thermo.custom.*.molar_mass": ("molar_mass", "kg/mol"),
    "thermo.custom.*.cp": ("molar_heat_capacity", "J/(mol·K)"),
    "thermo.custom.*.enthalpy_of_formation": ("molar_energy", "J/mol"),
    "thermo.custom.*.standard_entropy": ("molar_entropy", "J/(mol·K)"),
    "thermo.custom.*.critical_temperature": ("temperature", "K"),
    "thermo.custom.*.critical_pressure": ("pressure", "Pa"),
    "thermo.critical.*.critical_temperature": ("temperature", "K"),
    "thermo.critical.*.critical_pressure": ("pressure", "Pa"),
    "activation_energy": ("molar_energy", "J/mol"),
    "heat_of_adsorption": ("molar_energy", "J/mol"),
}

_ASSUMPTION_LABELS = {"isothermal": "Isothermal", "isobaric": "Isobaric", "ideal_gas": "Ideal gas",
                      "constant_moles": "Constant moles"}
_PARAMETER_LABELS = {"feed_mole_fraction": "feed mole fraction of {key}",
                     "coolant_temperature": "coolant temperature", "inlet_temperature": "inlet temperature",
                     "overall_coefficient": "wall heat-transfer coefficient U", "mass_flow": "feed mass flow"}
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
    for key, words in (("coolant_temperature_K", "coolant temperature"), ("inlet_temperature_K", "inlet temperature"),
                       ("feed_mole_fraction", "feed mole fraction"), ("coolant_temperature", "coolant temperature"),
                       ("inlet_temperature", "inlet temperature"), ("overall_coefficient", "wall coefficient U"),
                       ("mass_flow", "feed flow"), ("Tc^2", "Tc²")):
        text = text.replace(key, words)
    return text


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


def _pre_exponential_unit(reaction):
    """SI unit (pint expression, display text) of a reaction's pre-exponential factor."""
    n = sum(o for _, o in reaction.orders)
    rate = "mol/(m**3*s)" if reaction.per == "volume" else "mol/(kg*s)"
    activity = "mol/m**3" if reaction.driving_force == "concentration" else "Pa"
    expression = f"({rate}) / ({activity})**({n!r})"
    ureg = registry()
    simplified = ureg.Quantity(1.0, expression)
    if reaction.driving_force == "concentration":
        simplified = simplified.to_base_units()
    return expression, unit_text(simplified.units)


def _adsorption_unit(reaction, exponents):
    activity = "mol/m**3" if reaction.driving_force == "concentration" else "Pa"
    total = sum(float(v) for v in exponents.values() if isinstance(v, (int, float)))
    expression = f"1/({activity})**({total!r})"
    quantity = registry().Quantity(1.0, expression)
    if reaction.driving_force == "concentration":
        quantity = quantity.to_base_units()
    return expression, unit_text(quantity.units)


def _si_of(text, dimension):
    """SI value of a case string with a unit; None if it does not parse."""
    from simulator.errors import UnitError
    from simulator.units import parse_quantity

    try:
        return parse_quantity(text, dimension, "")
    except UnitError:
        return None


def _field_unit(path):
    parts = path.split(".")
    for pattern, unit in FIELD_UNITS.items():
        p = pattern.split(".")
        if len(p) == 1 and parts[-1] == p[0]:
            return unit
        if len(p) == len(parts) and all(a == "*" or a == b for a, b in zip(p, parts)):
            return unit
    return None


def _as_written(value):
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value)
    return str(value)


def _input_row(path, value, key="field"):
    """One Inputs row: ``{field, as_written, si_value, si_unit}``."""
    written = _as_written(value)
    if isinstance(value, bool):
        return {key: path, "as_written": written, "si_value": _DASH, "si_unit": ""}
    if isinstance(value, (int, float)):
        return {key: path, "as_written": written, "si_value": _si(value), "si_unit": "-"}
    unit = _field_unit(path)
    if unit is not None:
        si = _si_of(value, unit[0])
        if si is not None:
            return {key: path, "as_written": written, "si_value": _si(si), "si_unit": unit[1]}
    return {key: path, "as_written": written, "si_value": _DASH, "si_unit": ""}


def _walk(prefix, value, skip=()):
    """(path, leaf value) of a TOML table in file order; lists by index."""
    if isinstance(value, dict):
        for k, v in value.items():
            path = f"{prefix}.{k}" if prefix else str(k)
            if path in skip:
                continue
            yield from _walk(path, v, skip)
    elif isinstance(value, list) and value and all(isinstance(v, dict) for v in value):
        for i, v in enumerate(value):
            yield from _walk(f"{prefix}.{i}", v, skip)
    else:
        yield prefix, value


# ----------------------------------------------------------------------------- sections
def _species(case, result):
    """Species rows and the SpeciesData (for heats of reaction)."""
    from simulator.model.build import build_model

    data = build_model(case).species
    critical = result.extra.get("critical_sources", {}) if isinstance(result.extra, dict) else {}
    rows = []
    for i, name in enumerate(data.names):
        source = data.sources[i]
        crit = critical.get(name) or ""
        source += f"; critical constants: {crit}" if crit else "; critical constants: none"
        t_min, t_max = float(data.t_min[i]), float(data.t_max[i])
        ranged = math.isfinite(t_max) and t_min > 0
        rows.append({"name": name, "source": source, "molar_mass": fixed(data.molar_mass[i] * 1000.0, 3),
                     "t_min": fixed(t_min, 0) if ranged else "no stated range",
                     "t_max": fixed(t_max, 0) if ranged else _DASH})
    return rows, data


def _heat_of_reaction(reaction, data, T):
    """Reaction enthalpy of a reaction as written at T from the species data, [J/mol]."""
    from simulator.thermo.nasa7 import h_RT

    index = {s: i for i, s in enumerate(data.names)}
    return sum(nu * h_RT(data.nasa7[index[s]], T) * R * T for s, nu in reaction.stoichiometry)


def _rate_law_text(reaction):
    law = "LHHW (Langmuir-Hinshelwood-Hougen-Watson)" if reaction.rate_law == "lhhw" else "Power law"
    basis = ("per unit tube volume, r in mol/(m³·s)" if reaction.per == "volume"
             else "per unit catalyst mass, r in mol/(kg·s)")
    activity = ("concentrations c_i in mol/m³" if reaction.driving_force == "concentration"
                else "partial pressures p_i in Pa")
    orders = " · ".join(f"{'c' if reaction.driving_force == 'concentration' else 'p'}_{s}^{o:g}"
                        for s, o in reaction.orders) or "1"
    k = "k = A · (T/1 K)^b · exp(-E/(R·T))" if reaction.temperature_exponent else "k = A · exp(-E/(R·T))"
    text = f"{law}, {basis}; driving force: {activity}; r = k(T) · {orders}"
    if reaction.rate_law == "lhhw":
        text += f" / (1 + Σ K_m(T) · Π a_i^β)^{reaction.denominator_exponent:g}"
    text += f"; {k}; "
    text += ("reversible: reverse rate from the equilibrium constant of the species data."
             if reaction.reversible else "irreversible.")
    return text


def _reactions(case, data):
    out = []
    raw_reactions = case.raw.get("reactions", []) if isinstance(case.raw, dict) else []
    for j, reaction in enumerate(case.reactions):
        raw = raw_reactions[j] if j < len(raw_reactions) and isinstance(raw_reactions[j], dict) else {}
        params = []
        for path, value in _walk("", raw, skip=("equation",)):
            if path == "pre_exponential":
                expression, shown = _pre_exponential_unit(reaction)
                si = _si_of(value, expression)
                params.append({"name": path, "as_written": _as_written(value),
                               "si_value": _si(si) if si is not None else _DASH, "si_unit": shown})
            elif re.fullmatch(r"adsorption\.\d+\.pre_exponential", path):
                m = int(path.split(".")[1])
                exps = raw["adsorption"][m].get("species", {})
                expression, shown = _adsorption_unit(reaction, exps if isinstance(exps, dict) else {})
                si = _si_of(value, expression)
                params.append({"name": path, "as_written": _as_written(value),
                               "si_value": _si(si) if si is not None else _DASH, "si_unit": shown})
            else:
                params.append(_input_row(path, value, key="name"))
        for label, T in (("heat of reaction at the feed temperature (computed)", case.feed.temperature),
                         ("heat of reaction at 298.15 K (computed)", 298.15)):
            dH = _heat_of_reaction(reaction, data, T)
            params.append({"name": label, "as_written": _DASH, "si_value": _si(dH), "si_unit": "J/mol"})
        out.append({"equation": reaction.equation, "rate_law": _rate_law_text(reaction), "parameters": params})
    return out


def _inputs(case, result):
    raw = case.raw if isinstance(case.raw, dict) else {}
    rows = [_input_row(path, value) for path, value in _walk("", raw, skip=("reactions",))]
    species, data = _species(case, result)
    return {"rows": rows, "species": species, "reactions": _reactions(case, data)}, data


def _temperature_scale(case):
    """R T_r^2 / E_max [K] (inf without an activated reaction) and T_r [K]."""
    T_ref = case.heat.coolant_temperature if case.heat.mode in COOLED else case.feed.temperature
    E = max((r.activation_energy for r in case.reactions), default=0.0)
    return (R * T_ref ** 2 / E if E > 0 else math.inf), T_ref


def _exothermic(result):
    rise = result.adiabatic_temperature_rise
    return _finite(rise) and rise > 0


def _hot_spot_flag(case, result, screening):
    hot = result.hot_spot
    T_hot, z_hot = hot["temperature_K"], hot["position_m"]
    limit = case.design.temperature_limit
    scale, T_ref = _temperature_scale(case)
    where = f"{fixed(T_hot)} K at z = {fmt(z_hot, 3)} m"
    stopped = "temperature_limit" in result.events
    if stopped or (_finite(limit) and T_hot >= limit):
        return {"level": "danger", "label": "Hot spot",
                "text": f"The temperature limit {fixed(limit)} K is reached at z = {fmt(z_hot, 3)} m; the run "
                        f"stopped there and the true maximum is higher. The design as given is not acceptable."}
    if screening is not None and screening.get("risk") == "runaway":
        return {"level": "danger", "label": "Hot spot",
                "text": f"Hot spot {where}, but the operating point lies on the runaway side of the screening "
                        f"boundary: small changes can move it by hundreds of kelvin."}
    near_limit = _finite(limit) and limit - T_hot < scale
    limit_text = (f"; {fixed(limit - T_hot)} K below the temperature limit {fixed(limit)} K"
                  if _finite(limit) else "")
    if case.heat.mode == "isothermal":
        return {"level": "attention" if near_limit else "ok", "label": "Hot spot",
                "text": f"No hot spot by construction: the case is isothermal at {fixed(case.feed.temperature)} K "
                        f"(heat.mode = \"isothermal\"); the wall duty that holds it is "
                        f"{fmt(result.Q[-1] / 1e3, 4)} kW{limit_text}."}
    if not _exothermic(result):
        return {"level": "attention" if near_limit else "ok", "label": "Hot spot",
                "text": f"No reaction hot spot (the reaction path is not exothermic); the highest temperature "
                        f"is {where} ({hot['located_by']}){limit_text}."}
    scale_text = f"R·T²/E = {fixed(scale)} K at {fixed(T_ref)} K"
    if case.heat.mode in COOLED:
        rise = hot.get("rise_above_coolant_K")
        rise = T_hot - T_ref if rise is None else rise
        T_m = None
        if screening is not None:
            T_m = screening.get("criteria", {}).get("van_welsenaere_froment", {}).get("critical")
        if _finite(T_m):
            beyond = T_hot > T_m
            criterion = (f"the maxima-curve temperature T_m = {fixed(T_m)} K (Van Welsenaere-Froment, where "
                         f"runaway sets in by that criterion)")
        else:
            beyond = rise > scale
            criterion = f"{scale_text} (the approximate distance to the maxima curve)"
        close = _finite(T_m) and not beyond and T_m - T_hot < 0.25 * scale
        if beyond or near_limit or close:
            if beyond:
                why = f"it lies {fixed(rise)} K above the coolant and exceeds {criterion}"
            elif close:
                why = (f"it lies {fixed(rise)} K above the coolant, only {fixed(T_m - T_hot)} K below {criterion}; "
                       f"closer than a quarter of {scale_text}")
            else:
                why = f"it is within {scale_text} of the temperature limit"
            return {"level": "attention", "label": "Hot spot",
                    "text": f"Hot spot {where}: {why}{limit_text}."}
        see = (" How sensitive it is to the operating conditions is judged under Runaway risk."
               if screening is not None and screening.get("risk") != "adequate margin" else "")
        below = (f"below T_m = {fixed(T_m)} K of the maxima curve" if _finite(T_m) else f"below {scale_text}")
        return {"level": "ok", "label": "Hot spot",
                "text": f"Hot spot {where}, {fixed(rise)} K above the coolant, {below}{limit_text}.{see}"}
    # adiabatic
    if not _finite(limit):
        return {"level": "attention", "label": "Hot spot",
                "text": f"Adiabatic tube: the highest temperature is {where}, {fixed(hot['rise_above_feed_K'])} K "
                        f"above the feed; no design.temperature_limit is given to judge it against."}
    return {"level": "attention" if near_limit else "ok", "label": "Hot spot",
            "text": f"Adiabatic tube: the highest temperature is {where}{limit_text}."}


def _rise_text(result):
    rise = result.adiabatic_temperature_rise
    if _finite(rise):
        return f"adiabatic rise {fixed(rise, sign=True)} K"
    note = (result.extra.get("adiabatic") or {}).get("note") if isinstance(result.extra, dict) else None
    return f"adiabatic rise not defined: {note}" if note else "adiabatic rise not defined"


def _screening_reason(case, result, reason):
    """Why the runaway screening is not in the report (our own words where we can tell)."""
    if not _exothermic(result):
        return (f"no exothermic path for {case.design.key_species} ({_rise_text(result)}): runaway "
                f"screening does not apply.")
    if case.heat.mode not in COOLED:
        return (f"heat.mode = \"{case.heat.mode}\": runaway screening needs a cooled tube "
                f"(\"constant-coolant\" or \"co-current\").")
    return reason or "the screening was not run for this report."


def _margins_text(screening, key):
    parts = []
    crit = screening.get("critical", {})
    for name, unit in (("coolant_temperature_K", "K"), ("feed_mole_fraction", ""), ("inlet_temperature_K", "K")):
        entry = crit.get(name)
        if not entry or not entry.get("found"):
            continue
        label = {"coolant_temperature_K": "coolant temperature", "inlet_temperature_K": "inlet temperature",
                 "feed_mole_fraction": f"feed fraction of {key}"}[name]
        if unit:
            parts.append(f"critical {label} {fixed(entry['value'])} K (margin {fixed(entry['margin'], sign=True)} K)")
        else:
            parts.append(f"critical {label} {fmt(entry['value'], 4)} (margin {_pct(entry['margin_relative'])})")
    return "; ".join(parts)


def _runaway_flag(case, result, screening, reason):
    if screening is None:
        text = _screening_reason(case, result, reason)
        if not _exothermic(result):
            return {"level": "ok", "label": "Runaway risk", "text": f"Not applicable: {text}"}
        return {"level": "attention", "label": "Runaway risk",
                "text": f"Not screened although the reaction is exothermic ({_rise_text(result)}): {text} "
                        f"Check the temperature control separately."}
    risk = screening.get("risk", "")
    level = RISK_LEVELS.get(risk, "attention")
    margins = _margins_text(screening, case.design.key_species)
    sentence = {"ok": "Adequate margin to the runaway boundary",
                "attention": "Parametrically sensitive: the hot spot reacts strongly to small changes",
                "danger": "Runaway: the operating point is on the runaway side"}[level]
    text = (f"{sentence}" + (f"; {margins}" if margins else "")
            + f". Rule applied: {_pretty_rule(screening.get('risk_rule', ''))}.")
    return {"level": level, "label": "Runaway risk", "text": text}


def _design_quantity(assumptions):
    key = assumptions.get("design_quantity", "volume_m3")
    return ("catalyst mass", "kg") if key == "catalyst_mass_kg" else ("volume", "m³")


def _basis_text(entry, assumptions):
    """Why an assumption has no design change, in words fit for a case without a target."""
    basis = str(entry.get("design_change_basis", "n/a"))
    if assumptions.get("target_conversion") is None and "outlet conversions" in basis:
        return "no target conversion is given; " + basis[basis.index("outlet conversions"):]
    return basis


def _assumption_flag(name, entry, case, assumptions):
    label = _ASSUMPTION_LABELS.get(name, name.replace("_", " ").capitalize())
    quantity, _ = _design_quantity(assumptions)
    unit = "" if entry.get("unit") in ("-", None) else f" {entry['unit']}"
    value, threshold = entry.get("value"), entry.get("threshold")
    measure = entry.get("measure", "")
    change = entry.get("design_change_percent")
    effect = (f"applying it alone changes the {quantity} to the target by {_change(change)}"
              if _finite(change) else f"effect on the design: {_basis_text(entry, assumptions)}")
    verdict = entry.get("verdict")
    if verdict == "unknown":
        return {"level": "attention", "label": label,
                "text": f"Not checked: {entry.get('design_change_basis', 'no data')}."}
    numbers = f"{measure} = {fmt(value, 3)}{unit}, threshold {fmt(threshold, 3)}{unit}"
    if verdict == "holds":
        if name == "isothermal" and case.heat.mode == "isothermal":
            return {"level": "ok", "label": label,
                    "text": "Holds by construction: the case itself is isothermal (heat.mode = \"isothermal\")."}
        if _finite(change) and abs(change) > 100.0 * DESIGN_CHANGE_ATTENTION:
            return {"level": "attention", "label": label,
                    "text": f"Holds by its measure ({numbers}), but {effect}."}
        return {"level": "ok", "label": label, "text": f"Holds: {numbers}; {effect}."}
    return {"level": "attention", "label": label, "text": f"Fails: {numbers}; {effect}."}


def _summary(case, result, assumptions, screening, screening_reason):
    s = result.summary()
    key = case.design.key_species
    d, hot, outlet = s["design"], s["hot_spot"], s["outlet"]
    numbers = [{"label": f"Outlet conversion of {key}", "value": fixed(outlet["conversion"], 4), "unit": "-"}]
    target = d["target_conversion"]
    if target is not None:
        numbers.append({"label": "Target conversion", "value": fmt(target, 4), "unit": "-"})
        if d["reached"]:
            numbers.append({"label": "Length to the target", "value": fmt(d["length_m"], 4), "unit": "m"})
            numbers.append({"label": f"Reactor volume to the target ({case.tube.count} tubes)",
                            "value": fmt(d["volume_m3"], 4), "unit": "m³"})
            numbers.append({"label": "Catalyst mass to the target",
                            "value": fmt(d["catalyst_mass_kg"], 4) if d["catalyst_mass_kg"] is not None
                            else "no catalyst bed", "unit": "kg" if d["catalyst_mass_kg"] is not None else ""})
        else:
            for label in ("Length to the target", "Reactor volume to the target", "Catalyst mass to the target"):
                numbers.append({"label": label, "value": "not reached", "unit": ""})
    else:
        numbers.append({"label": "Length, volume and catalyst mass to a target",
                        "value": "no target given", "unit": ""})
    name = "Hot spot" if _exothermic(result) else "Highest temperature"
    numbers += [
        {"label": f"{name}: temperature" if _exothermic(result) else name, "value": fixed(hot["temperature_K"]),
         "unit": "K"},
        {"label": f"{name}: position", "value": fmt(hot["position_m"], 3), "unit": "m"},
    ]
    if hot.get("rise_above_coolant_K") is not None:
        medium = "coolant" if _exothermic(result) or float(np.mean(result.Tc)) <= case.feed.temperature \
            else "heating medium"
        numbers.append({"label": f"{name}: above the {medium}", "value": fixed(hot["rise_above_coolant_K"], sign=True),
                        "unit": "K"})
    else:
        numbers.append({"label": f"{name}: above the feed", "value": fixed(hot["rise_above_feed_K"], sign=True),
                        "unit": "K"})
    dp = outlet["pressure_drop_Pa"]
    label = "Pressure drop" if case.pressure_drop.model != "none" else \
        "Pressure drop (not modelled: pressure_drop.model = \"none\")"
    numbers.append({"label": label, "value": fmt(dp / 1e3, 4) if dp is not None else "n/a", "unit": "kPa"})
    numbers.append({"label": "Pressure drop / feed pressure",
                    "value": fixed(100.0 * dp / case.feed.pressure, 2) if dp is not None else "n/a",
                    "unit": "%"})
    rise = s["adiabatic_temperature_rise_K"]
    if rise is not None:
        numbers.append({"label": f"Adiabatic temperature rise (complete conversion of {key})",
                        "value": fixed(rise, sign=True), "unit": "K"})
    else:
        note = (s.get("adiabatic") or {}).get("note") or "not defined"
        numbers.append({"label": f"Adiabatic temperature rise (complete conversion of {key})",
                        "value": "not defined", "unit": ""})
        numbers[-1]["label"] += f": {note}"
    numbers.append({"label": "Outlet temperature", "value": fixed(outlet["temperature_K"]), "unit": "K"})
    if case.heat.mode in COOLED or case.heat.mode == "isothermal":
        Q = outlet["heat_duty_W"]
        numbers.append({"label": "Heat through the walls (negative: removed)", "value": fmt(Q / 1e3, 4)
                        if Q is not None else "n/a", "unit": "kW"})

    flags = []
    if result.status != "completed":
        flags.append({"level": "danger", "label": "Run", "text": f"Stopped before the end of the tube: "
                      f"{result.termination}."})
    flags.append(_hot_spot_flag(case, result, screening))
    flags.append(_runaway_flag(case, result, screening, screening_reason))
    if target is not None:
        if d["reached"]:
            flags.append({"level": "ok", "label": "Target conversion",
                          "text": f"X = {fmt(target, 4)} is reached at z = {fmt(d['length_m'], 4)} m of "
                                  f"{fmt(case.tube.length, 4)} m."})
        else:
            flags.append({"level": "attention", "label": "Target conversion",
                          "text": f"X = {fmt(target, 4)} is not reached in the {fmt(case.tube.length, 4)} m tube "
                                  f"(outlet conversion {fixed(outlet['conversion'], 4)})."})
    max_dp = case.design.max_pressure_drop
    if _finite(max_dp) and dp is not None:
        ok = dp <= max_dp
        flags.append({"level": "ok" if ok else "danger", "label": "Pressure drop",
                      "text": f"{fmt(dp / 1e3, 4)} kPa {'within' if ok else 'above'} the allowed "
                              f"{fmt(max_dp / 1e3, 4)} kPa."})
    if assumptions is not None:
        for name, entry in assumptions.get("assumptions", {}).items():
            flags.append(_assumption_flag(name, entry, case, assumptions))
    else:
        flags.append({"level": "attention", "label": "Assumptions", "text": "The assumption check was not run."})
    return {"numbers": numbers, "flags": flags}


# ----------------------------------------------------------------------------- profiles
def _profiles(case, result):
    from simulator.report import plots

    z = result.z
    key = case.design.key_species
    cooled = case.heat.mode in COOLED
    hot = result.hot_spot
    target = result.design.get("length_m") if result.design.get("reached") else None
    limit = case.design.temperature_limit if _finite(case.design.temperature_limit) else None
    heating = cooled and float(np.mean(result.Tc)) > case.feed.temperature and not _exothermic(result)
    medium = "Heating-medium temperature" if heating else "Coolant temperature"
    uri = plots.profile_temperature_plot(
        z, result.T, coolant_T=result.Tc if cooled else None,
        hot_spot=(hot["position_m"], hot["temperature_K"]), temperature_limit=limit,
        target_position=target, coolant_label=medium)
    parts = [f"Process (bed) temperature along the tube; star: highest temperature {fixed(hot['temperature_K'])} K "
             f"at z = {fmt(hot['position_m'], 3)} m ({hot['located_by']})."]
    if cooled:
        parts.append(f"{medium} ({case.heat.mode}).")
    parts.append(f"Dashed horizontal line: temperature limit {fixed(limit)} K." if limit is not None
                 else "No temperature limit is given (design.temperature_limit).")
    if target is not None:
        parts.append(f"Dotted vertical line: target conversion reached at z = {fmt(target, 4)} m.")
    out = [{"title": "Temperature", "uri": uri, "caption": " ".join(parts)}]
    X = result.conversion
    out.append({"title": f"Conversion of {key}",
                "uri": plots.profile_lines_plot(z, {f"Conversion of {key}": X}, "Conversion [-]"),
                "caption": f"Conversion of the key species {key}; outlet {fixed(X[-1], 4)}"
                           + (f", target {fmt(result.design['target_conversion'], 4)}."
                              if result.design.get("target_conversion") is not None else ".")})
    P_bar = result.P / 1e5
    pd = case.pressure_drop.model
    out.append({"title": "Pressure",
                "uri": plots.profile_lines_plot(z, {"Absolute pressure": P_bar}, "Pressure [bar]"),
                "caption": (f"Absolute pressure (1 bar = 100 kPa); drop {fmt((result.P[0] - result.P[-1]) / 1e3, 4)} "
                            f"kPa with the {pd} model." if pd != "none" else
                            "Absolute pressure (1 bar = 100 kPa); constant: no pressure-drop model "
                            "(pressure_drop.model = \"none\").")})
    x = result.mole_fractions
    series = {name: x[:, i] for i, name in enumerate(result.species)}
    out.append({"title": "Mole fractions",
                "uri": plots.profile_lines_plot(z, series, "Mole fraction [-]"),
                "caption": "Gas-phase mole fractions of every species."})
    return {"plots": out}


# ----------------------------------------------------------------------------- assumptions
def _assumptions_block(case, assumptions):
    if assumptions is None:
        return {"available": False, "reason_if_not": "the assumption check was not run for this report.",
                "paragraphs": [], "flags": [], "tables": [], "plots": []}
    quantity, unit = _design_quantity(assumptions)
    key = assumptions["design_quantity"]
    t, f = assumptions["textbook"], assumptions["full"]
    change = assumptions.get("design_change_percent")
    paragraphs = [
        "Textbook model: the same kinetics and mole change, but isothermal at the feed temperature, "
        "without pressure drop and with an ideal gas. Full model: the coupled mole, energy and pressure "
        "balances of the case. Attribution: each assumption is applied alone to the full model and the "
        f"change of the {quantity} needed for the target conversion is reported (variant against full model).",
    ]
    if _finite(change):
        paragraphs.append(f"Overall: the textbook design needs {fmt(t[key], 4)} {unit} of {quantity}, the full "
                          f"model {fmt(f[key], 4)} {unit}: the textbook is {fixed(change, 1, sign=True)} % off.")
    else:
        why = ("no target conversion is given (design.target_conversion)"
               if assumptions.get("target_conversion") is None else assumptions.get("design_change_basis"))
        paragraphs.append(f"Overall: no design change can be computed: {why}. Outlet conversions: textbook "
                          f"{fixed(t['outlet_conversion'], 4)}, full {fixed(f['outlet_conversion'], 4)}.")
    entries = assumptions.get("assumptions", {})
    changes = [e.get("design_change_percent") for e in entries.values()]
    if _finite(change) and changes and all(_finite(c) for c in changes):
        paragraphs.append(f"The single-assumption changes add up to {fixed(sum(changes), 1, sign=True)} % against "
                          f"{fixed(change, 1, sign=True)} % for all together; the difference is their interaction.")
    comparison = {
        "caption": "Textbook against full model",
        "columns": ["Quantity", "Textbook", "Full model"],
        "rows": [["Length to the target [m]", fmt(t["length_m"], 4, "not reached"),
                  fmt(f["length_m"], 4, "not reached")],
                 [f"{quantity.capitalize()} to the target [{unit}]", fmt(t[key], 4, "not reached"),
                  fmt(f[key], 4, "not reached")],
                 ["Outlet conversion [-]", fixed(t["outlet_conversion"], 4), fixed(f["outlet_conversion"], 4)],
                 ["Run status", t["status"], f["status"]]],
    }
    if assumptions.get("target_conversion") is None:
        comparison["caption"] += " (no target conversion given: compare the outlet conversions)"
    rows = []
    for name, e in entries.items():
        flag = _assumption_flag(name, e, case, assumptions)
        unit_e = "" if e.get("unit") in ("-", None) else f" {e['unit']}"
        ch = e.get("design_change_percent")
        rows.append([f"{_ASSUMPTION_LABELS.get(name, name)}: {e.get('measure', '')}",
                     fmt(e.get("value"), 3) + (unit_e if _finite(e.get("value")) else ""),
                     fmt(e.get("threshold"), 3) + unit_e,
                     {"level": flag["level"], "text": e.get("verdict", "")},
                     _change(ch) if _finite(ch) else _basis_text(e, assumptions),
                     e.get("threshold_source", "")])
    verdicts = {"caption": "Assumptions: measure, verdict and design change when applied alone",
                "columns": ["Assumption: measure", "Value", "Threshold", "Verdict",
                            f"Change of {quantity}", "Threshold basis"],
                "rows": rows}
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [],
            "tables": [comparison, verdicts], "plots": []}


# ----------------------------------------------------------------------------- screening
def _sensitivity_plots(case, screening):
    from simulator.report import plots

    log = screening.get("_log") or []
    crit = screening.get("critical", {})
    key = case.design.key_species
    out = []
    for name, crit_key, xlabel, title in (
            ("coolant_temperature", "coolant_temperature_K", "Coolant temperature [K]",
             "Hot spot against coolant temperature"),
            ("feed_mole_fraction", "feed_mole_fraction", f"Feed mole fraction of {key} [-]",
             "Hot spot against feed fraction")):
        points = sorted({(float(v), float(T)) for p, v, T in log if p == name})
        if len(points) < 3:
            continue
        x = np.array([p[0] for p in points])
        T = np.array([p[1] for p in points])
        entry = crit.get(crit_key, {})
        current = entry.get("operating_value")
        critical = entry.get("value") if entry.get("found") else None
        uri = plots.sensitivity_plot(x, T, current_x=current, critical_x=critical, xlabel=xlabel,
                                     ylabel="Hot-spot temperature [K]")
        failed = int(np.sum(~np.isfinite(T)))
        caption = (f"Hot-spot temperature of the screening runs ({len(points)} evaluations"
                   + (f", {failed} stopped or failed, shown as gaps" if failed else "") + "); diamond: design case "
                   f"({fmt(current, 4)}); dashed line: critical value by the Morbidelli-Varma criterion ("
                   + (fmt(critical, 5) if critical is not None else "not found in the range scanned") + ").")
        out.append({"title": title, "uri": uri, "caption": caption})
    return out


def _criteria_table(case, screening):
    c = screening.get("criteria", {})
    key = case.design.key_species
    rows, notes = [], []

    def verdict(entry):
        v = entry.get("verdict", "undecided")
        return {"level": VERDICT_LEVELS.get(v, "attention"), "text": v}

    def critical_fraction(entry):
        return fmt(entry.get("critical_feed_mole_fraction"), 4, "not found")

    spec = []
    if "semenov" in c:
        e = c["semenov"]
        spec.append(("Semenov (1928), no consumption", "Semenov number ψ = B/N",
                     fmt(e.get("critical"), 4), fmt(e.get("value"), 4), _DASH, e))
    vwf = c.get("van_welsenaere_froment")
    if vwf:
        spec.append(("Van Welsenaere-Froment (1970) I, maxima curve", "hot-spot temperature [K]",
                     fixed(vwf.get("critical")), fixed(vwf.get("value")), critical_fraction(vwf), vwf))
        infl = vwf.get("inflection")
        if infl:
            spec.append(("Van Welsenaere-Froment (1970) II / Thomas-Bowes (1961), inflection",
                         "curvature of T(z) before the hot spot [K/m²]", fmt(infl.get("critical"), 3),
                         fmt(infl.get("value"), 3), critical_fraction(infl), infl))
    if "adler_enig" in c:
        e = c["adler_enig"]
        spec.append(("Adler-Enig (1964)", "curvature of T(X) before the hot spot [K]",
                     fmt(e.get("critical"), 3), fmt(e.get("value"), 3), critical_fraction(e), e))
    if "morbidelli_varma" in c:
        e = c["morbidelli_varma"]
        spec.append(("Morbidelli-Varma (1988), generalized sensitivity", e.get("parameter", ""),
                     fmt(e.get("critical"), 4, "not found"), fmt(e.get("value"), 4),
                     fmt(e.get("critical"), 4, "not found"), e))
    for name, compares, critical, value, fraction, entry in spec:
        rows.append([name, compares, critical, value, fraction, verdict(entry)])
        if entry.get("note"):
            notes.append([name, entry["note"]])
    table = {"caption": "Runaway criteria at the operating point",
             "columns": ["Criterion", "Compares", "Critical", "Design case",
                         f"Critical feed fraction of {key}", "Verdict"],
             "rows": rows}
    note_table = {"caption": "How each verdict was reached", "columns": ["Criterion", "Note"], "rows": notes}
    return table, note_table


def _screening_block(case, result, screening, reason):
    if screening is None:
        return {"available": False, "reason_if_not": _screening_reason(case, result, reason),
                "paragraphs": [], "flags": [], "tables": [], "plots": []}
    g = screening.get("groups", {})
    hot = screening.get("hot_spot", {})
    key = case.design.key_species
    num = screening.get("numerics", {})
    paragraphs = [
        f"Risk: {screening.get('risk', 'n/a').upper()} (the rule applied is in the verdict below).",
        f"The groups belong to the reaction that releases the most heat at the feed composition and the "
        f"coolant temperature ({g.get('reaction', 'n/a')}). Screening runs use rtol {fmt(num.get('rtol'), 2)} "
        f"and locate the hot spot at {fixed(hot.get('temperature_K'), 2)} K, z = {fmt(hot.get('position_m'), 4)} m "
        f"({screening.get('solves', 'n/a')} solves in all).",
        f"Definitions: {g.get('definitions', '')}.",
    ]
    groups = {"caption": f"Dimensionless groups ({g.get('reaction', '')})", "columns": ["Group", "Value", "Meaning"],
              "rows": [["γ", fmt(g.get("gamma"), 4), "Arrhenius number E/(R·Tc)"],
                       ["ΔT_ad [K]", fixed(g.get("adiabatic_rise_K")), "adiabatic temperature rise of the "
                                                                        "dominant reaction at the feed"],
                       ["B", fmt(g.get("B"), 4), "heat-of-reaction parameter γ·ΔT_ad/Tc"],
                       ["St", fmt(g.get("St"), 4), "Stanton number U·π·D·L/(Σ F_i·cp_i)"],
                       ["Da", fmt(g.get("Da"), 4), "Damköhler number at feed composition and Tc"],
                       ["N = St/Da", fmt(g.get("N"), 4), "cooling against reaction"],
                       ["ψ = B/N", fmt(g.get("psi"), 4), "Semenov number"],
                       ["N/B", fmt(g.get("N_over_B"), 4), "compare with the critical N/B of the criteria"]]}
    criteria, notes = _criteria_table(case, screening)
    margin_rows = []
    for crit_key, entry in screening.get("critical", {}).items():
        name = crit_key.removesuffix("_K")
        label = _PARAMETER_LABELS.get(name, name).format(key=key)
        temperature = crit_key.endswith("_K")
        show = (lambda v: fixed(v, 1)) if temperature else (lambda v: fmt(v, 4))
        unit = " K" if temperature else ""
        if entry.get("found"):
            critical = show(entry["value"]) + unit
            margin = (fixed(entry["margin"], 1, sign=True) + " K") if temperature else fmt(entry["margin"], 3)
            rel = _pct(entry.get("margin_relative"))
        else:
            lo, hi = entry.get("search_range", [None, None])
            critical = f"not found in {show(lo)}-{show(hi)}{unit}"
            margin, rel = _DASH, _DASH
        margin_rows.append([label, show(entry.get("operating_value")) + unit, critical, margin, rel,
                            fmt(entry.get("s_max"), 3),
                            {"level": VERDICT_LEVELS.get(entry.get("verdict"), "attention"),
                             "text": entry.get("verdict", "")}])
    margins = {"caption": "Critical values and margins (Morbidelli-Varma: maximum of the normalized sensitivity)",
               "columns": ["Parameter", "Design", "Critical", "Margin", "Relative margin", "max |s|", "Verdict"],
               "rows": margin_rows}
    sens_rows = []
    excess = screening.get("sensitivity_excess", {})
    for name, s in screening.get("sensitivity", {}).items():
        label = _PARAMETER_LABELS.get(name, name).format(key=key)
        x = excess.get(name)
        temperature = name in ("inlet_temperature", "coolant_temperature")
        big = _finite(x) and (x > 1.0 if temperature else abs(x) > 1.0)
        if not _finite(s):
            reading = "not computed"
        elif temperature:
            reading = "s − φ/T* > 1: amplified, sensitive" if big else "s − φ/T* ≤ 1"
        else:
            reading = "|s| > 1: sensitive" if big else "|s| ≤ 1"
        sens_rows.append([label, fmt(s, 3), fmt(x, 3) if temperature else _DASH,
                          {"level": "attention" if big else "ok", "text": reading}])
    sensitivity = {"caption": "Normalized sensitivity of the hot spot at the design point, s = (φ/T*)·dT*/dφ; for "
                              "the inlet and coolant temperatures a hot spot that just follows them (as without "
                              "reaction) has s = φ/T*, so only the excess counts",
                   "columns": ["Parameter φ", "s", "s − φ/T*", "Reading"], "rows": sens_rows}
    flag = _runaway_flag(case, result, screening, None)
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [flag],
            "tables": [groups, criteria, notes, margins, sensitivity],
            "plots": _sensitivity_plots(case, screening)}


# ----------------------------------------------------------------------------- numerics
def _numerics_block(case, result, screening):
    s = result.summary()
    paragraphs = [f"Run status: {result.status}; {result.termination}."]
    for name, event in result.events.items():
        where = ", ".join(f"{k.removesuffix('_m').removesuffix('_K').removesuffix('_Pa').replace('_', ' ')} "
                          f"{fmt(v, 6)} {'m' if k.endswith('_m') else 'K' if k.endswith('_K') else 'Pa'}"
                          for k, v in event.items())
        paragraphs.append(f"Event {name.replace('_', ' ')}: {where}.")
    paragraphs.append(f"Hot spot located by: {result.hot_spot.get('located_by', 'n/a')}.")
    if result.extra.get("viscosity"):
        paragraphs.append(f"Gas viscosity: {result.extra['viscosity']}.")
    closure_rows = []
    for name, label in (("elements_relative", "Elements (and total mass), relative"),
                        ("energy_relative", "Energy (H_out - H_in - Q), relative")):
        value = result.closure.get(name)
        ok = _finite(value) and abs(float(value)) <= CLOSURE_OK
        closure_rows.append([label, fmt(value, 3), {"level": "ok" if ok else "attention",
                                                    "text": f"≤ {fmt(CLOSURE_OK, 1)}" if ok
                                                    else f"> {fmt(CLOSURE_OK, 1)}"}])
    z_dev = s.get("max_compressibility_deviation")
    closure_rows.append(["Largest |Z - 1| along the tube (Peng-Robinson)", fmt(z_dev, 3, "not computed"),
                         _DASH])
    closure = {"caption": "Conservation closure and real-gas deviation", "columns": ["Check", "Value", "Verdict"],
               "rows": closure_rows}
    st = result.solver_stats
    labels = (("method", "Method"), ("rtol", "Relative tolerance"),
              ("atol_scale", "Absolute tolerance / variable scale"), ("output_points", "Output points"),
              ("steps", "Integration steps"), ("rhs_evaluations", "Right-hand-side evaluations"),
              ("jacobian_evaluations", "Jacobian evaluations"), ("integrator_calls", "Integrator calls"),
              ("wall_time_s", "Wall time of the run [s]"))
    solver = {"caption": "Solver statistics of the design run", "columns": ["Quantity", "Value"],
              "rows": [[label, st[k] if isinstance(st.get(k), str) else fmt(st.get(k), 4)]
                       for k, label in labels if k in st]}
    tables = [closure, solver]
    warnings = list(result.warnings)
    if screening is not None:
        num = screening.get("numerics", {})
        tables.append({"caption": "Screening numerics", "columns": ["Quantity", "Value"],
                       "rows": [["Relative tolerance", fmt(num.get("rtol"), 2)],
                                ["Absolute tolerance / variable scale", fmt(num.get("atol_scale"), 2)],
                                ["Relative step of the sensitivities", fmt(num.get("relative_step"), 2)],
                                ["Internal temperature limit [K]", fixed(num.get("internal_temperature_limit_K"))],
                                ["Points per coarse scan", fmt(num.get("coarse_points"), 4)],
                                ["Solves", fmt(screening.get("solves"), 6)]]})
        for name, why in (num.get("undecided") or {}).items():
            warnings.append(f"screening, {name.replace('_', ' ')}: {why}")
    return {"available": True, "reason_if_not": "", "paragraphs": paragraphs, "flags": [], "tables": tables,
            "plots": [], "warnings": [str(w) for w in warnings]}


# ----------------------------------------------------------------------------- cautions, references
def _cautions(case, result, screening, reason, data):
    from simulator.report.html import STANDARD_CAUTIONS

    out = list(STANDARD_CAUTIONS)
    constant = [n for n, src in zip(data.names, data.sources) if src.startswith("case file")]
    if constant:
        out.append(f"Species {', '.join(constant)} use constant heat capacities given in the case file, without a "
                   f"stated validity range.")
    if case.source:
        out.append(f"This case is built from published data (source key {case.source!r}); its reproduction is a "
                   f"check of the model, not a design basis for another plant.")
    if case.bed is not None and case.pressure_drop.model == "none":
        out.append("The packed bed is modelled without pressure drop (pressure_drop.model = \"none\").")
    if "still rising" in str(result.hot_spot.get("located_by", "")):
        out.append("The temperature is still rising at the outlet: the highest temperature of a longer tube "
                   "would be higher.")
    if screening is None and _exothermic(result):
        out.append(f"Runaway screening was not evaluated: {_screening_reason(case, result, reason)}")
    if any("data range" in str(w) for w in result.warnings):
        out.append("Some species properties were extrapolated beyond their data range; see Numerics.")
    return out


def _references(case, result, assumptions, screening):
    keys = list(result.references)
    if assumptions is not None:
        keys.append("levenspiel1999")             # expansion factor of the constant-moles measure
        if assumptions.get("assumptions", {}).get("ideal_gas", {}).get("verdict") in ("holds", "fails"):
            keys.append("peng_robinson1976")      # real-gas check of the ideal-gas assumption
    if _exothermic(result) and case.heat.mode in COOLED:
        keys.append("van_welsenaere_froment1970")  # R T^2 / E scale of the hot-spot verdict
    if screening is not None:
        keys += list(screening.get("references", []))
        for entry in screening.get("criteria", {}).values():
            keys += list(entry.get("references", []))
            keys += list((entry.get("inflection") or {}).get("references", []))
    if case.source:
        keys.append(case.source)
    return [{"key": k, "text": text} for k, text in lookup(keys)]


def _distribution_version(name):
    try:
        return metadata.version(name)
    except metadata.PackageNotFoundError:
        return "not installed"


def case_file_sha256(path):
    """SHA-256 of the case file's bytes, or a note when it cannot be read.

    Parameters
    ----------
    path : str or pathlib.Path
        Case file, [-]

    Returns
    -------
    str
        64 hex digits, or ``"not available (...)"``, [-]
    """
    if not path:
        return "not available (case given as a dict, no file)"
    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError as err:
        return f"not available ({err.strerror or err})"


def _provenance(case, result, generated, command_line):
    v = result.versions
    return [
        {"label": "Case file", "value": case.source_path or "(none: case given as a dict)"},
        {"label": "Case file SHA-256", "value": case_file_sha256(case.source_path)},
        {"label": "Generated (UTC)", "value": generated},
        {"label": "tubesim", "value": v.get("tubesim", "n/a")},
        {"label": "Cantera", "value": v.get("cantera", "n/a")},
        {"label": "scipy", "value": v.get("scipy", "n/a")},
        {"label": "numpy", "value": v.get("numpy", "n/a")},
        {"label": "numba", "value": v.get("numba", "n/a")},
        {"label": "Report libraries", "value": ", ".join(
            f"{name} {_distribution_version(name)}" for name in ("matplotlib", "jinja2", "weasyprint"))},
        {"label": "Python", "value": f"{platform.python_version()} ({platform.system()} {platform.machine()})"},
        {"label": "Command line", "value": command_line or "(not recorded: called from Python)"},
    ]


def _validation_rows(checks):
    """One row per source: every check of that source with where it is in the source."""
    by_key = {}
    for c in checks:
        key = c.get("key", c["source"])
        row = by_key.setdefault(key, {"checks": [], "source": c.get("citation", c["source"])})
        item = f"{c['check']} ({c['where']})" if c.get("where") else c["check"]
        if item not in row["checks"]:
            row["checks"].append(item)
    return [{"check": "; ".join(row["checks"]), "source": f"[{key}] {row['source']}"}
            for key, row in by_key.items()]


# ----------------------------------------------------------------------------- driver
def build_context(case, result, assumptions=None, screening=None, command_line="", *,
                  screening_reason=None, generated=None):
    """Build the report context of one run (schema: :mod:`simulator.report.html`).

    Parameters
    ----------
    case : simulator.case.schema.Case
        The validated case, [-]
    result : simulator.results.Result
        The design run of ``case``, [-]
    assumptions : dict, optional
        ``assumptions.json`` content from :func:`simulator.assumptions.check_assumptions`, [-]
    screening : dict, optional
        ``screening.json`` content from :func:`simulator.screening.screen.screen`,
        with its ``_log`` of evaluations for the sensitivity plots, [-]
    command_line : str
        Command that produced the report, for provenance, [-]
    screening_reason : str, optional
        Why ``screening`` is None (e.g. the message of the ``CaseError`` that
        :func:`~simulator.screening.screen.screen` raised), [-]
    generated : datetime.datetime, optional
        Time stamp of the report; default now, in UTC, [-]

    Returns
    -------
    dict
        The context; every number rounded and printed with its unit, [-]
    """
    from simulator.report.validation import published_checks

    stamp = generated or _dt.datetime.now(_dt.timezone.utc)
    stamp = stamp.astimezone(_dt.timezone.utc).strftime("%Y-%m-%d %H:%M UTC")
    inputs, data = _inputs(case, result)
    source = Path(case.source_path).name if case.source_path else "(dict)"
    checks = published_checks()
    numerics = _numerics_block(case, result, screening)
    return {
        "title": case.title or source,
        "case_name": Path(source).stem,
        "case_file": case.source_path or "(none)",
        "generated": stamp,
        "tool_version": result.versions.get("tubesim", "n/a"),
        "summary": _summary(case, result, assumptions, screening, screening_reason),
        "inputs": inputs,
        "profiles": _profiles(case, result),
        "assumptions": _assumptions_block(case, assumptions),
        "screening": _screening_block(case, result, screening, screening_reason),
        "numerics": numerics,
        "validation": _validation_rows(checks),
        "cautions": _cautions(case, result, screening, screening_reason, data),
        "references": _references(case, result, assumptions, screening),
        "provenance": _provenance(case, result, stamp, command_line),
    }
