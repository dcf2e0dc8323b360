"""Inputs section of the report context: case values as written and in SI.

Every value of the case file is shown as written next to its SI value and unit
(:data:`FIELD_UNITS`); the species table (data source, molar mass, stated
temperature range) and, per reaction, its rate form in words, its parameters
with the composite units of pre-exponential factors and the computed heat of
reaction.
"""
import math
import re

from simulator.report.context_format import _DASH, _si, fixed, unit_text
from simulator.units import R, registry

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
    "heat.medium.temperature": ("temperature", "K"),
    "heat.medium.mass_flow": ("mass_flow", "kg/s"),
    "heat.medium.cp": ("specific_heat_capacity", "J/(kg·K)"),
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
    "thermo.density": ("density", "kg/m³"),
    "thermo.density_at": ("temperature", "K"),
    "thermo.custom.*.normal_boiling_point": ("temperature", "K"),
    "thermo.custom.*.heat_of_vaporization": ("molar_energy", "J/mol"),
    "pressure_drop.viscosity_at": ("temperature", "K"),
    "pressure_drop.viscosity_activation_energy": ("molar_energy", "J/mol"),
    "design.wall_temperature_limit": ("temperature", "K"),
    "heat.medium.profile.*.position": ("length", "m"),
    "heat.medium.profile.*.temperature": ("temperature", "K"),
    "heat.coefficient.wall_thickness": ("length", "m"),
    "heat.coefficient.wall_conductivity": ("thermal_conductivity", "W/(m·K)"),
    "heat.coefficient.outside": ("heat_transfer_coefficient", "W/(m²·K)"),
    "heat.coefficient.inside": ("heat_transfer_coefficient", "W/(m²·K)"),
    "heat.coefficient.fouling_inside": ("fouling_resistance", "m²·K/W"),
    "heat.coefficient.fouling_outside": ("fouling_resistance", "m²·K/W"),
    "heat.coefficient.conductivity": ("thermal_conductivity", "W/(m·K)"),
    "heat.coefficient.shell.velocity": ("velocity", "m/s"),
    "heat.coefficient.shell.transverse_pitch": ("length", "m"),
    "heat.coefficient.shell.longitudinal_pitch": ("length", "m"),
    "heat.coefficient.shell.density": ("density", "kg/m³"),
    "heat.coefficient.shell.viscosity": ("viscosity", "Pa·s"),
    "heat.coefficient.shell.conductivity": ("thermal_conductivity", "W/(m·K)"),
    "heat.coefficient.shell.cp": ("specific_heat_capacity", "J/(kg·K)"),
    "bed.radial_conductivity": ("thermal_conductivity", "W/(m·K)"),
    "bed.radial_diffusivity": ("diffusivity", "m²/s"),
    "bed.wall_coefficient": ("heat_transfer_coefficient", "W/(m²·K)"),
    "catalyst.effective_diffusivity": ("diffusivity", "m²/s"),
    "catalyst.volume_to_surface": ("length", "m"),
    "catalyst.pellet_density": ("density", "kg/m³"),
}


def _pre_exponential_unit(reaction):
    """SI unit (pint expression, display text) of a reaction's pre-exponential factor."""
    n = sum(o for _, o in reaction.orders)
    rate = "mol/(m**3*s)" if reaction.rate_basis == "reactor-volume" else "mol/(kg*s)"
    activity = "mol/m**3" if reaction.in_terms_of == "concentration" else "Pa"
    expression = f"({rate}) / ({activity})**({n!r})"
    ureg = registry()
    simplified = ureg.Quantity(1.0, expression)
    if reaction.in_terms_of == "concentration":
        simplified = simplified.to_base_units()
    return expression, unit_text(simplified.units)


def _inhibition_unit(reaction, exponents):
    activity = "mol/m**3" if reaction.in_terms_of == "concentration" else "Pa"
    total = sum(float(v) for v in exponents.values() if isinstance(v, (int, float)))
    expression = f"1/({activity})**({total!r})"
    quantity = registry().Quantity(1.0, expression)
    if reaction.in_terms_of == "concentration":
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
    if isinstance(value, list):        # e.g. design.products, as written in TOML
        return "[" + ", ".join(f'"{v}"' if isinstance(v, str) else _as_written(v) for v in value) + "]"
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


def _rate_form_text(reaction):
    law = "Hougen-Watson (inhibition terms in the denominator)" if reaction.form == "hougen-watson" \
        else "Power law"
    basis = ("per unit reactor volume, r in mol/(m³·s)" if reaction.rate_basis == "reactor-volume"
             else "per unit catalyst mass, r in mol/(kg·s)")
    activity = ("concentrations c_i in mol/m³" if reaction.in_terms_of == "concentration"
                else "partial pressures p_i in Pa")
    orders = " · ".join(f"{'c' if reaction.in_terms_of == 'concentration' else 'p'}_{s}^{o:g}"
                        for s, o in reaction.orders) or "1"
    k = "k = A · (T/1 K)^b · exp(-E/(R·T))" if reaction.temperature_exponent else "k = A · exp(-E/(R·T))"
    text = f"{law}, {basis}; in terms of {activity}; r = k(T) · {orders}"
    if reaction.form == "hougen-watson":
        text += f" / (1 + Σ K_m(T) · Π a_i^β)^{reaction.inhibition_power:g}"
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
            elif re.fullmatch(r"inhibition\.\d+\.pre_exponential", path):
                m = int(path.split(".")[1])
                exps = raw["inhibition"][m].get("species", {})
                expression, shown = _inhibition_unit(reaction, exps if isinstance(exps, dict) else {})
                si = _si_of(value, expression)
                params.append({"name": path, "as_written": _as_written(value),
                               "si_value": _si(si) if si is not None else _DASH, "si_unit": shown})
            else:
                params.append(_input_row(path, value, key="name"))
        for label, T in (("heat of reaction at the feed temperature (computed)", case.feed.temperature),
                         ("heat of reaction at 298.15 K (computed)", 298.15)):
            dH = _heat_of_reaction(reaction, data, T)
            params.append({"name": label, "as_written": _DASH, "si_value": _si(dH), "si_unit": "J/mol"})
        out.append({"label": f"R{j + 1} = reactions[{j}]", "equation": reaction.equation,
                    "rate_form": _rate_form_text(reaction), "parameters": params})
    return out


def _inputs(case, result):
    raw = case.raw if isinstance(case.raw, dict) else {}
    rows = [_input_row(path, value) for path, value in _walk("", raw, skip=("reactions",))]
    species, data = _species(case, result)
    return {"rows": rows, "species": species, "reactions": _reactions(case, data)}, data
