"""Case-file generator of the command-line fuzzer: the demo cases (``cases/*.toml``) mutated.

``generate_case(rng, demos)`` returns the bytes of one case file and the verb calls to run it
through; ``toml_dumps`` writes a case dict as TOML (``tomllib`` only reads). The mutations and what
they cover are described in ``bench/README.md``; ``bench/fuzz_cases.py`` runs the cases and checks
the contract, ``tests/test_fuzz_cases.py`` runs a seeded sample in the test suite.
"""
import copy
import json
import math
import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DEMO_DIR = ROOT / "cases"

#: Every verb the fuzzer knows; ``validate`` and ``run`` see every case, one other verb a share of them.
VERBS = ("validate", "run", "assumptions", "size", "screen", "sweep", "uncertainty")
ALWAYS = ("validate", "run")
#: Share of the cases that also go through one of the other verbs (besides validate and run).
OTHER_VERB_SHARE = 0.15

# --------------------------------------------------------------------------------------------
# TOML text from a dict (tomllib reads only); RawToml is written verbatim (deep nesting, bad syntax)
# --------------------------------------------------------------------------------------------
class RawToml(str):
    """A value written into the TOML text exactly as given (e.g. 5000 nested brackets)."""


_BARE_KEY = re.compile(r"^[A-Za-z0-9_-]+$")


def _key(k):
    k = str(k)
    return k if _BARE_KEY.match(k) else json.dumps(k, ensure_ascii=False)


def _value(v):
    if isinstance(v, RawToml):
        return str(v)
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, int):
        return str(v)
    if isinstance(v, float):
        if math.isnan(v):
            return "nan"
        if math.isinf(v):
            return "inf" if v > 0 else "-inf"
        return repr(v)
    if isinstance(v, str):
        return json.dumps(v, ensure_ascii=False)
    if isinstance(v, dict):
        return "{ " + ", ".join(f"{_key(k)} = {_value(x)}" for k, x in v.items()) + " }"
    if isinstance(v, (list, tuple)):
        return "[" + ", ".join(_value(x) for x in v) + "]"
    if hasattr(v, "isoformat"):
        return v.isoformat()
    raise TypeError(f"cannot write {type(v).__name__} as TOML")


def _is_table_array(v):
    return isinstance(v, list) and v and all(isinstance(x, dict) for x in v)


def toml_dumps(raw):
    """TOML text of a case dict (tables as ``[a.b]``, lists of tables as ``[[a]]``)."""
    lines = []

    def table(path, d, header):
        if header:
            lines.append(header)
        for k, v in d.items():
            if not isinstance(v, dict) and not _is_table_array(v):
                lines.append(f"{_key(k)} = {_value(v)}")
        for k, v in d.items():
            sub = f"{path}.{_key(k)}" if path else _key(k)
            if isinstance(v, dict):
                table(sub, v, f"[{sub}]")
            elif _is_table_array(v):
                for item in v:
                    table(sub, item, f"[[{sub}]]")

    table("", raw, None)
    return "\n".join(lines) + "\n"


# --------------------------------------------------------------------------------------------
# Mutations of the parsed case (dict) and of its text (bytes)
# --------------------------------------------------------------------------------------------
_QUANTITY = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")

FACTORS = (0.0, -1.0, 1e-300, 1e-200, 5e-324, 1e-310, 1e-12, 1e-6, 1e-3, 0.5, 0.999999, 1.000001, 2.0,
           1e3, 1e6, 1e12, 1e200, 1e300)
BAD_NUMBER_TEXT = ("nan", "NaN", "inf", "-inf", "1e999", "-1e999", "", "abc", "1,5", "1_000", "0x10", "½",
                   "١٢", "1e", "--3", "∞")
UNITS_BY_DIMENSION = {
    "temperature": ("K", "degC", "degF", "degR", "°C", "celsius", "kelvin", "Kelvin", "delta_degC", "mK"),
    "pressure": ("bar", "Pa", "kPa", "MPa", "atm", "psi", "psia", "psig", "barg", "kPag", "MPag", "bar gauge",
                 "kPa(g)", "bar(a)", "BAR", "mbar", "torr", "mmHg", "inHg", "kgf/cm^2"),
    "length": ("m", "mm", "cm", "um", "µm", "nm", "km", "in", "inch", "ft", "mil", "M", "Mm"),
    "flow": ("mol/s", "kmol/h", "lbmol/h", "mol/h", "kg/s", "kg/h", "t/h", "lb/h", "Nm^3/h", "m^3/s",
             "scf/min", "mol/min"),
    "energy_per_mol": ("kJ/mol", "J/mol", "cal/mol", "kcal/mol", "J/kmol", "eV", "kJ/kg", "K"),
    "other": ("1/s", "W/(m^2*K)", "kJ/(m^2*s*K)", "Pa*s", "cP", "kg/m^3", "g/mol", "J/(mol*K)", "",
              "dimensionless", "percent", "%", "m/s", "s", "h"),
}
WRONG_UNITS = ("bar", "K", "m", "mol/s", "kJ/mol", "s", "kg", "W", "1/s", "Pa*s", "J", "ohm", "lumen", "m^2",
               "banana", "K K", "m/", "**", "mol/(s", "1/0")
MAX_STEPS = ("1e-9 m", "1 um", "1e-6 m", "1 nm", "0 m", "-1 m", "1e3 m", "1e30 m", "1e-300 m", "1 s", "nan m")
HEAT_MODES = ("adiabatic", "isothermal", "exchange", "Exchange", "cooled", "", "exchange ")
ARRANGEMENTS = ("uniform", "co-current", "counter-current", "constant", "", "co_current")
EOS = ("ideal-gas", "peng-robinson", "Peng-Robinson", "peng_robinson", "van-der-waals", "")
ORDERS = (0, 0.0, 0.5, 0.3, 1.4, 0.4, -1, -0.5, 2, 3, 1e6, -1e6, 1e-300, "1", "one", float("nan"), True)
WEIRD_SPECIES = ("X", "n2", "N2 ", "", "ÄÖ", "C2H4O2", "_inert", "A" * 300, "CH3OH", "H2O", "AR", "O2", "e-")
WEIRD_STRINGS = ("", " ", "\t", "\u0000", "\u202e", "☃", "x" * 10_000, "=>", "<=>", "A =>", "=> B", "A => A",
                 "2 A => B", "A + A => 3 B", "A <=> 2 B", "A => 2 B + C", "C2H4 + H2 <=> C2H6", "A >= B")


def _leaves(node, path=()):
    """All (path, value) pairs of the case's scalar leaves and tables."""
    out = []
    if isinstance(node, dict):
        for k, v in node.items():
            out.append((path + (k,), v))
            out.extend(_leaves(v, path + (k,)))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            out.append((path + (i,), v))
            out.extend(_leaves(v, path + (i,)))
    return out


def _set(raw, path, value):
    node = raw
    for k in path[:-1]:
        node = node[k]
    node[path[-1]] = value


def _delete(raw, path):
    node = raw
    for k in path[:-1]:
        node = node[k]
    del node[path[-1]]


def _table(raw, *keys):
    """The table at ``keys``, created (as a dict) where missing or not a table."""
    node = raw
    for k in keys:
        if not isinstance(node.get(k), dict):
            node[k] = {}
        node = node[k]
    return node


def _reactions(raw):
    r = raw.get("reactions")
    return [x for x in r if isinstance(x, dict)] if isinstance(r, list) else []


def _pick_reaction(raw, rng):
    """One reaction table of the case, or None."""
    reactions = _reactions(raw)
    return rng.choice(reactions) if reactions else None


def _species(raw):
    names = set()
    feed = raw.get("feed")
    if isinstance(feed, dict) and isinstance(feed.get("mole_fractions"), dict):
        names.update(feed["mole_fractions"])
    for r in _reactions(raw):
        names.update(re.findall(r"[A-Za-z_][A-Za-z0-9_]*", str(r.get("equation", ""))))
    return sorted(names) or ["A"]


def m_drop_key(raw, rng):
    leaves = _leaves(raw)
    if leaves:
        path, _ = rng.choice(leaves)
        _delete(raw, path)
        return f"drop {'.'.join(map(str, path))}"
    return "drop nothing"


def _quantity_leaves(raw):
    return [(p, v) for p, v in _leaves(raw) if isinstance(v, str) and _QUANTITY.match(v)
            or isinstance(v, (int, float)) and not isinstance(v, bool)]


def m_scale_number(raw, rng):
    leaves = _quantity_leaves(raw)
    if not leaves:
        return "scale nothing"
    path, v = rng.choice(leaves)
    where = ".".join(map(str, path))
    if rng.random() < 0.25:
        text = rng.choice(BAD_NUMBER_TEXT)
        if isinstance(v, str):
            unit = _QUANTITY.match(v).group(2)
            _set(raw, path, f"{text} {unit}".strip())
        else:
            _set(raw, path, text)
        return f"number text {where} = {text!r}"
    factor = rng.choice(FACTORS)
    if isinstance(v, str):
        number, unit = _QUANTITY.match(v).groups()
        new = float(number) * factor
        _set(raw, path, f"{new!r} {unit}".strip())
    elif isinstance(v, int) and rng.random() < 0.5 and abs(v * factor) < 2 ** 63:
        _set(raw, path, int(v * factor))
    else:
        _set(raw, path, float(v) * factor)
    return f"scale {where} by {factor!r}"


def m_change_unit(raw, rng):
    leaves = [(p, v) for p, v in _leaves(raw) if isinstance(v, str) and _QUANTITY.match(v)]
    if not leaves:
        return "unit nothing"
    path, v = rng.choice(leaves)
    number, unit = _QUANTITY.match(v).groups()
    pool = next((units for units in UNITS_BY_DIMENSION.values() if unit in units), UNITS_BY_DIMENSION["other"])
    new_unit = rng.choice(pool) if rng.random() < 0.6 else rng.choice(WRONG_UNITS)
    if rng.random() < 0.1:
        new = new_unit                       # a unit without a number
    elif rng.random() < 0.1:
        new = f"{number}{new_unit}"          # no space
    else:
        new = f"{number} {new_unit}"
    _set(raw, path, new)
    return f"unit {'.'.join(map(str, path))} = {new!r}"


def m_swap_value(raw, rng):
    leaves = _leaves(raw)
    if len(leaves) < 2:
        return "swap nothing"
    (p1, _), (_, v2) = rng.sample(leaves, 2)
    if p1[:len(p1)] == p1 and isinstance(v2, (dict, list)) and len(str(v2)) > 5000:
        return "swap skipped"
    try:
        _set(raw, p1, copy.deepcopy(v2))
    except (KeyError, IndexError, TypeError):
        return "swap failed"
    return f"swap {'.'.join(map(str, p1))} <- {str(v2)[:40]!r}"


def m_change_type(raw, rng):
    leaves = _leaves(raw)
    if not leaves:
        return "type nothing"
    path, v = rng.choice(leaves)
    new = rng.choice((0, 1, -7, 2 ** 63 - 1, 3.5, True, False, [], [1, "a"], {}, {"x": 1}, "1", "true",
                      rng.choice(WEIRD_STRINGS)))
    _set(raw, path, new)
    return f"type {'.'.join(map(str, path))} = {str(new)[:40]!r}"


def m_deep_nesting(raw, rng):
    depth = rng.choice((10, 100, 600, 1000, 3000, 20000))
    leaves = _leaves(raw)
    path, _ = rng.choice(leaves)
    inner = rng.choice(("1", '"1 m"', "{ A = 1 }"))
    _set(raw, path, RawToml("[" * depth + inner + "]" * depth))
    return f"nest {'.'.join(map(str, path))} depth {depth}"


def m_huge_array(raw, rng):
    n = rng.choice((1000, 100_000))
    leaves = _leaves(raw)
    path, _ = rng.choice(leaves)
    if rng.random() < 0.5:
        _set(raw, path, RawToml("[" + ", ".join(["1.5"] * n) + "]"))
        return f"array {'.'.join(map(str, path))} of {n}"
    feed = _table(raw, "feed")
    fractions = {f"S{i}": 1.0 / n for i in range(n)}
    feed["mole_fractions"] = fractions
    return f"feed.mole_fractions of {n} unknown species"


def m_orders(raw, rng):
    r = _pick_reaction(raw, rng)
    if r is None:
        return "orders: no reaction"
    orders = r.get("orders") if isinstance(r.get("orders"), dict) else {}
    names = list(orders) or _species(raw)
    name = rng.choice(names + [rng.choice(_species(raw))])
    value = rng.choice(ORDERS)
    orders = dict(orders)
    orders[name] = value
    r["orders"] = orders
    total = sum(v for v in orders.values() if isinstance(v, (int, float)) and not isinstance(v, bool))
    if rng.random() < 0.7 and math.isfinite(total):        # units of the rate constant to match the orders
        match = _QUANTITY.match(str(r.get("pre_exponential", "")))
        number = match.group(1) if match else "1"
        rate = "mol/(kg*s)" if r.get("rate_basis") == "catalyst-mass" else "mol/(m^3*s)"
        activity = "bar" if r.get("in_terms_of") == "partial-pressure" else "(mol/m^3)"
        r["pre_exponential"] = f"{number} {rate}/{activity}^{total!r}"
    return f"orders {name} = {value!r}, pre_exponential = {r.get('pre_exponential')!r}"


def m_equation(raw, rng):
    r = _pick_reaction(raw, rng)
    if r is None:
        return "equation: no reaction"
    eq = str(r.get("equation", ""))
    if rng.random() < 0.6:
        new = eq.replace("<=>", "=>") if "<=>" in eq else eq.replace("=>", "<=>")
        custom = raw.get("thermo", {}).get("custom", {}) if isinstance(raw.get("thermo"), dict) else {}
        for entry in (custom.values() if isinstance(custom, dict) and rng.random() < 0.8 else ()):
            if isinstance(entry, dict):
                entry.setdefault("standard_entropy", rng.choice(("200 J/(mol*K)", "300 J/(mol*K)", "0 J/(mol*K)")))
    else:
        new = rng.choice(WEIRD_STRINGS[7:])
    r["equation"] = new
    return f"equation {new!r}"


def m_heat(raw, rng):
    heat = _table(raw, "heat")
    choice = rng.random()
    if choice < 0.4:
        heat["mode"] = rng.choice(HEAT_MODES)
        if heat["mode"] in ("adiabatic", "isothermal") and rng.random() < 0.8:
            heat.pop("overall_coefficient", None)
            heat.pop("medium", None)
        what = f"heat.mode = {heat['mode']!r}"
    elif choice < 0.7:
        medium = _table(raw, "heat", "medium")
        medium["arrangement"] = rng.choice(ARRANGEMENTS)
        if medium["arrangement"] == "co-current" and rng.random() < 0.7:
            medium["mass_flow"] = rng.choice(("5 kg/s", "0 kg/s", "1e-9 kg/s", "-1 kg/s", "1e9 kg/s"))
            medium["cp"] = rng.choice(("4.2 kJ/(kg*K)", "2 kJ/(kg*K)", "0 J/(kg*K)", "1 J/(mol*K)"))
        what = f"heat.medium = {medium}"
    elif choice < 0.85:
        heat["mode"] = "exchange"
        heat["overall_coefficient"] = rng.choice(("0 W/(m^2*K)", "1e-9 W/(m^2*K)", "1e6 W/(m^2*K)",
                                                  "-5 W/(m^2*K)", "150 W/(m^2*K)"))
        medium = _table(raw, "heat", "medium")
        medium.setdefault("arrangement", "uniform")
        medium["temperature"] = rng.choice(("300 K", "1 K", "5000 K", "1e-300 K", "-5 K", "1250 K", "420 K"))
        what = f"exchange U = {heat['overall_coefficient']}, medium T = {medium['temperature']}"
    else:
        heat.pop("medium", None)
        what = "heat.medium removed"
    return what


def m_eos(raw, rng):
    thermo = _table(raw, "thermo")
    thermo["equation_of_state"] = rng.choice(EOS) if rng.random() < 0.3 else rng.choice(EOS[:2])
    return f"equation_of_state = {thermo['equation_of_state']!r}"


def m_species_name(raw, rng):
    old = rng.choice(_species(raw))
    new = rng.choice(WEIRD_SPECIES)
    text = toml_dumps(raw)
    try:
        import tomllib

        renamed = tomllib.loads(re.sub(rf"\b{re.escape(old)}\b", new.replace("\\", ""), text, count=rng.randint(1, 3)))
    except Exception:  # noqa: BLE001 - a rename that breaks the syntax is simply not applied
        return "rename failed"
    raw.clear()
    raw.update(renamed)
    return f"rename {old} -> {new!r}"


def m_key_species(raw, rng):
    design = _table(raw, "design")
    choice = rng.random()
    if choice < 0.3:
        design["key_species"] = ""
    elif choice < 0.5:
        design.pop("key_species", None)
    elif choice < 0.8:
        design["key_species"] = rng.choice(_species(raw))
    else:
        design["key_species"] = rng.choice(WEIRD_SPECIES)
    return f"key_species = {design.get('key_species')!r}"


def m_solver(raw, rng):
    solver = _table(raw, "solver")
    key = rng.choice(("max_step", "max_step", "rtol", "atol_scale", "output_points"))
    if key == "max_step":
        solver[key] = rng.choice(MAX_STEPS)
    elif key == "output_points":
        solver[key] = rng.choice((0, 1, 2, 3, 10 ** 7, -5, 2.5))
    else:
        solver[key] = rng.choice((0.0, 1e-300, 1e-15, 1e-3, 0.5, 1.0, 10.0, -1e-6))
    return f"solver.{key} = {solver[key]!r}"


def m_design(raw, rng):
    design = _table(raw, "design")
    key = rng.choice(("target_conversion", "temperature_limit", "max_pressure_drop"))
    if key == "target_conversion":
        design[key] = rng.choice((0, 0.0, 1, 1.0, 1.0000001, 0.999999, -0.1, 2.0, 1e-12, 0.5))
    elif key == "temperature_limit":
        design[key] = rng.choice(("300 K", "1 K", "1e6 K", "650 K", "400 degC", "0 K"))
    else:
        design[key] = rng.choice(("1 Pa", "0 Pa", "0.5 bar", "1e9 bar", "-1 bar"))
    return f"design.{key} = {design[key]!r}"


def m_tube_count(raw, rng):
    tube = _table(raw, "tube")
    tube["count"] = rng.choice((0, 1, 2, 10 ** 12, 2.5, -3, "40", 10 ** 18, 49152, 100_000))
    return f"tube.count = {tube['count']!r}"


def m_feed_fractions(raw, rng):
    feed = _table(raw, "feed")
    fractions = feed.get("mole_fractions") if isinstance(feed.get("mole_fractions"), dict) else {}
    fractions = dict(fractions)
    names = list(fractions) or _species(raw)
    choice = rng.random()
    if choice < 0.3 and names:                 # a trace key species, the rest renormalised
        key = rng.choice(names)
        tiny = rng.choice((7.9e-8, 1e-12, 1e-300, 5e-324, 0.0))
        rest = [n for n in names if n != key] or names
        fractions = {n: (1.0 - tiny) / len(rest) for n in rest}
        fractions[key] = tiny
    elif choice < 0.5:                         # a product in the feed (possibly above equilibrium)
        species = _species(raw)
        extra = rng.choice(species)
        share = rng.choice((0.01, 0.3, 0.9, 1.0))
        fractions = {n: v * (1 - share) for n, v in fractions.items() if isinstance(v, (int, float))}
        fractions[extra] = fractions.get(extra, 0.0) + share
    elif choice < 0.7:                         # sum off by a little or a lot
        for n in fractions:
            if isinstance(fractions[n], (int, float)) and not isinstance(fractions[n], bool):
                fractions[n] = fractions[n] * rng.choice((1.000001, 1.0000000001, 0.99, 1.5, 0, -1))
                break
    else:                                      # one species only
        fractions = {rng.choice(names): 1.0}
    feed["mole_fractions"] = fractions
    return f"feed.mole_fractions = {fractions}"[:200]


def m_kinetics(raw, rng):
    r = _pick_reaction(raw, rng)
    if r is None:
        return "kinetics: no reaction"
    key = rng.choice(("activation_energy", "activation_energy", "pre_exponential", "temperature_exponent"))
    if key == "activation_energy":
        r[key] = rng.choice(("0 kJ/mol", "-50 kJ/mol", "1e-300 J/mol", "5000 kJ/mol", "1 J/mol", "300 kJ/mol"))
    elif key == "pre_exponential":
        text = str(r.get(key, "1 1/s"))
        match = _QUANTITY.match(text)
        unit = match.group(2) if match else "1/s"
        r[key] = f"{rng.choice(('1e30', '1e100', '1e-30', '0', '-1', '1e300'))} {unit}"
    else:
        r[key] = rng.choice((0, 1, -1, 5, -5, 0.5, 100))
    return f"reactions.{key} = {r[key]!r}"


def m_hougen_watson(raw, rng):
    r = _pick_reaction(raw, rng)
    if r is None:
        return "hw: no reaction"
    name = rng.choice(_species(raw))
    if rng.random() < 0.6:                   # a plausible term: units that match the activities
        r["form"] = "hougen-watson"
        exponent = rng.choice((1, 1, 0.5, 2))
        unit = "1/bar" if r.get("in_terms_of") == "partial-pressure" else "m^3/mol"
        entry = {"species": {name: exponent}, "pre_exponential": f"{rng.choice(('1e-3', '0.5', '1e-12', '1e6'))} "
                 f"({unit})^{exponent!r}", "heat_of_adsorption": rng.choice(("-40 kJ/mol", "40 kJ/mol", "0 J/mol"))}
        r["inhibition_power"] = rng.choice((1, 2, 1.5))
    else:
        r["form"] = rng.choice(("hougen-watson", "hougen-watson", "power-law", "lhhw", ""))
        exponent = rng.choice((1, 0.5, 2, 0, -1, "one", "1", float("nan")))
        entry = {"species": {name: exponent},
                 "pre_exponential": rng.choice(("1e-3 1/bar", "0.5 m^3/mol", "1e-3", "-1 1/bar", "1 K")),
                 "heat_of_adsorption": rng.choice(("-40 kJ/mol", "40 kJ/mol", "0 J/mol", "4000 kJ/mol", "1 bar"))}
        r["inhibition_power"] = rng.choice((1, 2, 0, -1, 0.5, "two", 1e6))
    r["inhibition"] = [entry] * rng.choice((1, 1, 2))
    return f"hougen-watson {r['form']!r} {entry} n = {r['inhibition_power']!r}"


def m_unknown_key(raw, rng):
    leaves = [(p, v) for p, v in _leaves(raw) if isinstance(v, dict)] or [((), raw)]
    path, node = rng.choice(leaves + [((), raw)])
    name = rng.choice(("lenght", "temperture", "mode ", "ÜBER", "x.y", "", "count", "1"))
    node[name] = rng.choice(("1 m", 3, {"a": 1}))
    return f"extra key {'.'.join(map(str, path + (name,)))}"


def m_custom_thermo(raw, rng):
    custom = _table(raw, "thermo", "custom")
    names = [n for n, e in custom.items() if isinstance(e, dict)]
    if not names:
        raw["thermo"].pop("custom")
        return "custom nothing"
    name = rng.choice(names)
    entry = custom[name]
    key = rng.choice(("molar_mass", "cp", "enthalpy_of_formation", "standard_entropy", "critical_temperature",
                      "critical_pressure", "acentric_factor"))
    entry[key] = rng.choice(("0 g/mol", "-1 g/mol", "1e-300 kg/mol", "0 J/(mol*K)", "-30 J/(mol*K)",
                             "1e9 kJ/mol", "200 J/(mol*K)", "500 K", "1 K", "50 bar", "0 bar", 0.2, -2.0, 100.0))
    return f"thermo.custom.{name}.{key} = {entry[key]!r}"


def m_pressure_drop(raw, rng):
    pd = _table(raw, "pressure_drop")
    choice = rng.random()
    if choice < 0.4:
        pd["model"] = rng.choice(("none", "ergun", "pipe-friction", "Ergun", "darcy"))
    elif choice < 0.7:
        pd.pop("viscosity", None)           # viscosity from transport data, which custom species lack
        pd["model"] = rng.choice(("ergun", "pipe-friction"))
    else:
        pd["viscosity"] = rng.choice(("0 Pa*s", "1e-300 Pa*s", "1 Pa*s", "-1e-5 Pa*s", "2e-5 Pa*s", "2e-5 bar"))
    if pd.get("model") == "ergun" and "bed" not in raw and rng.random() < 0.5:
        raw["bed"] = {"particle_diameter": rng.choice(("3 mm", "60 mm", "1 m", "0 mm")),
                      "void_fraction": rng.choice((0.4, 0.0, 1.0, 0.99, -0.1)),
                      "bulk_density": rng.choice(("1100 kg/m^3", "0 kg/m^3"))}
    return f"pressure_drop = {pd}"[:200]


def m_geometry(raw, rng):
    key, values = rng.choice((
        (("tube", "inner_diameter"), ("1e-200 m", "1e200 m", "1 um", "3 m", "25 mm", "1e-310 m")),
        (("tube", "length"), ("1e-200 m", "1e200 m", "1 um", "1 km", "0.01 m")),
        (("feed", "molar_flow"), ("1e-310 mol/s", "1e-30 mol/s", "1e30 mol/s", "5e-324 mol/s", "1 mol/s")),
        (("feed", "temperature"), ("1e-300 K", "0.001 K", "1 K", "1e5 K", "0 degC", "-300 degC", "1e-310 K")),
        (("feed", "pressure"), ("1e-300 Pa", "1 Pa", "1e4 bar", "1e-310 bar", "58 psig", "14.7 psia")),
        (("bed", "particle_diameter"), ("30 mm", "25 mm", "60 mm", "1 um", "5 mm")),
    ))
    node = _table(raw, *key[:-1])
    node[key[-1]] = rng.choice(values)
    if key[-1] == "molar_flow":
        node.pop("mass_flow", None)
        node.pop("volumetric_flow", None)
    return f"{'.'.join(key)} = {node[key[-1]]!r}"


def m_radial(raw, rng):
    """The 2-D radial model: switch it on or off, points, radial bed parameters (valid and not)."""
    model = _table(raw, "model")
    model["radial"] = rng.choice(("2d", "2d", "1d", "3d", "2D"))
    if rng.random() < 0.5:
        model["radial_points"] = rng.choice((1, 3, 5, 8, 9, 0, 2.5, "5"))
    if "bed" in raw and rng.random() < 0.8:
        bed = raw["bed"]
        for key, values in (("radial_conductivity", ("0.9 W/(m*K)", "1e-9 W/(m*K)", "1e3 W/(m*K)", "-1 W/(m*K)",
                                                     "0.9 W/(m^2*K)")),
                            ("radial_diffusivity", ("3e-4 m^2/s", "1e-8 m^2/s", "1 m^2/s", "3e-4 m/s")),
                            ("wall_coefficient", ("120 W/(m^2*K)", "1e-2 W/(m^2*K)", "1e5 W/(m^2*K)", "0 W/(m^2*K)"))):
            if rng.random() < 0.9:
                bed[key] = rng.choice(values)
    return f"model = {model}, bed = {raw.get('bed')}"[:200]


#: Mutations that mostly keep the case valid but push it to extremes (they exercise the solver).
SOFT_MUTATIONS = (m_orders, m_equation, m_heat, m_eos, m_solver, m_design, m_tube_count, m_feed_fractions,
                  m_kinetics, m_hougen_watson, m_custom_thermo, m_pressure_drop, m_geometry, m_radial)
#: Mutations that mostly make the case invalid (they exercise the loader's messages).
HARD_MUTATIONS = (m_drop_key, m_scale_number, m_change_unit, m_swap_value, m_change_type, m_deep_nesting,
                  m_huge_array, m_species_name, m_key_species, m_unknown_key)
#: Share of the mutations drawn from SOFT_MUTATIONS.
SOFT_SHARE = 0.7


def _text_mutation(text, rng):
    """Mutations of the file itself: encodings, binary bytes, duplicated lines, truncation."""
    choice = rng.randrange(10)
    data = text.encode("utf-8")
    if choice == 0:
        return text.encode("utf-16"), "encoded as UTF-16"
    if choice == 1:
        return b"\xef\xbb\xbf" + data, "UTF-8 byte-order mark"
    if choice == 2:
        i = rng.randrange(len(data) + 1)
        return data[:i] + bytes(rng.randrange(256) for _ in range(rng.randint(1, 8))) + data[i:], "random bytes"
    if choice == 3:
        return text.encode("latin-1", errors="replace").replace(b"=", b"=\xe9", 1), "invalid UTF-8"
    if choice == 4:
        lines = text.splitlines()
        candidates = [ln for ln in lines if "=" in ln and not ln.startswith("[")]
        if candidates:
            line = rng.choice(candidates)
            i = lines.index(line)
            lines.insert(i + 1, line)
        return ("\n".join(lines) + "\n").encode("utf-8"), "duplicated key line"
    if choice == 5:
        return data[:rng.randrange(len(data) + 1)], "truncated file"
    if choice == 6:
        return b"", "empty file"
    if choice == 7:
        return text.replace("\n", "\r\n").encode("utf-8"), "CRLF line ends"
    if choice == 8:
        return data.replace(b"\n", b"\n\x00", 1), "NUL byte"
    lines = text.splitlines()
    headers = [ln for ln in lines if ln.startswith("[")]
    if headers:
        lines.append(rng.choice(headers))     # a table declared twice
    return ("\n".join(lines) + "\n").encode("utf-8"), "table declared twice"


def uncertainty_entries(raw, rng):
    """A few ``[[uncertainty]]`` entries on paths of the case (valid ones and hostile ones)."""
    entries = []
    for _ in range(rng.randint(1, 2)):
        choice = rng.randrange(6)
        if choice == 0:
            entries.append({"parameter": "reactions.0.activation_energy", "distribution": "normal",
                            "std": rng.choice(("2 kJ/mol", "200 kJ/mol", "0 kJ/mol", "-1 kJ/mol", "2 K"))})
        elif choice == 1:
            entries.append({"parameter": "reactions.0.pre_exponential", "distribution": "lognormal",
                            "factor": rng.choice((1.5, 1.0, 0.5, 100.0, 0, -2, "x"))})
        elif choice == 2:
            entries.append({"parameter": "feed.temperature", "distribution": "uniform",
                            "low": rng.choice(("600 K", "1 K", "-5 K", "900 K")),
                            "high": rng.choice(("700 K", "650 K", "1e6 K", "1 bar"))})
        elif choice == 3:
            entries.append({"parameter": "heat.overall_coefficient", "distribution": "normal",
                            "std": rng.choice(("20 W/(m^2*K)", "500 W/(m^2*K)"))})
        elif choice == 4:
            entries.append({"parameter": rng.choice(("no.such.path", "reactions.7.pre_exponential", "",
                                                     "feed.mole_fractions", "tube.count")),
                            "distribution": rng.choice(("normal", "weibull", "truncated-normal", "")),
                            "std": "1"})
        else:
            entries.append({"parameter": "feed.pressure", "distribution": "normal",
                            "std": rng.choice(("0.1 bar", "10 bar", "1 K"))})
    return entries


SWEEP_SPECS = ("heat.medium.temperature=400 K..420 K in 2", "feed.temperature=600 K..610 K in 2",
               "feed.pressure=2 bar..3 bar in 2", "reactions.0.pre_exponential=1e3..1e4 in 2",
               "tube.count=10..20 in 2", "feed.temperature=1 K..1e6 K in 3", "heat.medium.temperature=x..y in 2",
               "tube.inner_diameter=1e-200 m..1e200 m in 2", "feed.temperature=600 K..610 K in 0",
               "no.such.path=1..2 in 2", "feed.temperature=600 K..610 K in -1")


def demo_cases():
    """(name, raw dict) of every demo case, in a fixed order."""
    import tomllib

    return [(p.name, tomllib.loads(p.read_text(encoding="utf-8"))) for p in sorted(DEMO_DIR.glob("*.toml"))]


def generate_case(rng, demos, verbs=VERBS):
    """One generated case: (file bytes, list of verbs with their extra arguments, description)."""
    name, base = rng.choice(demos)
    raw = copy.deepcopy(base)
    notes = [f"from {name}"]
    extra_verbs = [v for v in verbs if v not in ALWAYS]
    plan = [v for v in ALWAYS if v in verbs]
    if extra_verbs and rng.random() < OTHER_VERB_SHARE:
        plan.append(rng.choice(extra_verbs))
    if "uncertainty" in plan:
        raw["uncertainty"] = uncertainty_entries(raw, rng)
        notes.append(f"uncertainty {raw['uncertainty']}")
    n = rng.choice((0, 1, 1, 1, 1, 1, 2, 2, 2, 3))
    for _ in range(n):
        mutation = rng.choice(SOFT_MUTATIONS if rng.random() < SOFT_SHARE else HARD_MUTATIONS)
        try:
            notes.append(mutation(raw, rng))
        except (KeyError, IndexError, TypeError, AttributeError, ValueError) as err:
            notes.append(f"mutation skipped ({type(err).__name__})")
    text = toml_dumps(raw)
    if rng.random() < 0.05:
        data, what = _text_mutation(text, rng)
        notes.append(what)
    else:
        data = text.encode("utf-8")
    calls = []
    for verb in plan:
        args = []
        if verb == "sweep":
            args = ["--vary", rng.choice(SWEEP_SPECS)]
        elif verb == "uncertainty":
            args = ["--samples", str(rng.choice((2, 3, 5, 0, -1))), "--seed", str(rng.choice((1, 7, -1, 0)))]
        calls.append((verb, args))
    return data, calls, notes
