"""Critical constants (Tc, Pc, acentric factor) for the Peng-Robinson equation of state.

Order of precedence for each species: ``[thermo.critical.NAME]`` in the case,
then the critical constants of a custom species, then :data:`SUPPLEMENT` (a few
common species that Cantera's table lacks, e.g. water), then Cantera's bundled
``critical-properties.yaml`` (the table Cantera's own Peng-Robinson phase reads).

Cantera's table is keyed by formula, with isomers as ``FORMULA-1``, ``FORMULA-2``
... and a ``descriptive-name`` (``C2H6O`` is dimethyl ether, ``C2H6O-1`` ethanol).
A species is matched by its formula; when the formula has several entries, the
species name picks one (``C2H5OH``, ``ethanol`` -> ethyl-alcohol; ``o-xylene``;
nasa_gas-style ``C8H10,ethylbenz``). A formula with several entries that the name
does not single out is ambiguous: under Peng-Robinson that is refused, naming the
candidates and asking for ``[thermo.critical.NAME]``; otherwise the species has
no critical constants. Every source text names the entry used.
"""
import functools
import re

import numpy as np

from simulator.errors import CaseError

_KEYS = ("critical-temperature", "critical-pressure", "acentric-factor")

#: Critical constants of common species missing from Cantera's table: formula -> (Tc [K], Pc [Pa],
#: omega [-], source). Water: the IAPWS-95 critical point (Wagner and Pruss 2002); the others and
#: water's acentric factor from the reference equations of state as evaluated by CoolProp (Bell et
#: al. 2014), rounded. ``tests/test_thermo_critical.py`` checks each against CoolProp.
SUPPLEMENT = {
    "H2O": (647.096, 22.064e6, 0.3443, "water, IAPWS-95 critical point; omega from the IAPWS-95 "
                                       "equation of state (CoolProp)"),
    "H3N": (405.56, 11.3634e6, 0.2557, "ammonia, reference equation of state (CoolProp)"),
    "Ar": (150.687, 4.863e6, -0.0022, "argon, reference equation of state (CoolProp)"),
    "He": (5.1953, 0.22832e6, -0.3835, "helium, reference equation of state (CoolProp)"),
    "H2S": (373.10, 8.9989e6, 0.1005, "hydrogen sulfide, reference equation of state (CoolProp)"),
    "O2S": (430.64, 7.8866e6, 0.2561, "sulfur dioxide, reference equation of state (CoolProp)"),
    "HCl": (324.68, 8.3135e6, 0.1297, "hydrogen chloride, reference equation of state (CoolProp)"),
    "Ne": (44.40, 2.6616e6, -0.0355, "neon, reference equation of state (CoolProp)"),
    "N2O": (309.52, 7.2448e6, 0.1613, "nitrous oxide, reference equation of state (CoolProp)"),
}

#: Common names and structural formulas -> the table's descriptive name (normalised, see _norm).
ALIASES = {
    "ethanol": "ethylalcohol", "c2h5oh": "ethylalcohol", "ch3ch2oh": "ethylalcohol", "etoh": "ethylalcohol",
    "dimethylether": "methylether", "dme": "methylether", "ch3och3": "methylether",
    "ch3cho": "acetaldehyde", "ethanal": "acetaldehyde", "oxirane": "ethyleneoxide",
    "ch3cooh": "aceticacid", "hcooch3": "methylformate",
    "propylene": "propene", "ch3chch2": "propene", "nbutane": "butane", "isobutene": "2methylpropene",
    "npentane": "pentane", "ipentane": "isopentane", "nhexane": "hexane", "nheptane": "heptane",
    "noctane": "octane", "isooctane": "224trimethylpentane", "ch3coch3": "acetone",
    "1propanol": "propylalcohol", "npropanol": "propylalcohol", "2propanol": "isopropylalcohol",
    "isopropanol": "isopropylalcohol", "c6h5c2h5": "ethylbenzene", "c6h5ch3": "toluene",
    "c6h5chch2": "styrene",
}


def _norm(text):
    """Lower case, letters and digits only ("o-Xylene" -> "oxylene")."""
    return re.sub(r"[^0-9a-z]", "", text.lower())


@functools.lru_cache(maxsize=1)
def _critical_entries():
    """Cantera's bundled critical-properties.yaml as a tuple of (name, descriptive name, Tc [K],
    Pc [Pa], omega [-]), in file order.

    The file is a flat list of ``- name:`` entries with a ``descriptive-name`` and a
    ``critical-parameters`` block; a line scan reads it in milliseconds (a full YAML parse
    takes ~1 s and would slow every first run). The scan is checked against the YAML parse
    in the tests.
    """
    from simulator.thermo.species_data import cantera_data_file

    path = cantera_data_file("critical-properties.yaml")
    out = []
    name, descriptive, values = None, "", {}

    def flush():
        if name is not None and all(k in values for k in _KEYS):
            out.append((name, descriptive, *(values[k] for k in _KEYS)))

    with open(path, encoding="utf-8") as handle:
        for line in handle:
            stripped = line.strip()
            if line.startswith("- name:"):
                flush()
                name, descriptive, values = stripped.split(":", 1)[1].strip().strip("'\""), "", {}
            elif name is not None and ":" in stripped:
                key, _, text = stripped.partition(":")
                if key in _KEYS:
                    values[key] = float(text)
                elif key == "descriptive-name":
                    descriptive = text.strip().strip("'\"")
    flush()
    return tuple(out)


def _critical_table():
    """{table name: (Tc [K], Pc [Pa], omega [-])} of Cantera's critical-properties.yaml."""
    return {e[0]: (e[2], e[3], e[4]) for e in _critical_entries()}


def _critical_table_yaml():
    """The same table from a full YAML parse (slow; used by the tests as the reference)."""
    from ruamel.yaml import YAML  # shipped with Cantera's dependencies

    from simulator.thermo.species_data import cantera_data_file

    with open(cantera_data_file("critical-properties.yaml"), encoding="utf-8") as handle:
        data = YAML(typ="safe").load(handle)
    out = {}
    for entry in data.get("species", []):
        cp = entry.get("critical-parameters", {})
        tc, pc, w = cp.get("critical-temperature"), cp.get("critical-pressure"), cp.get("acentric-factor")
        if tc is not None and pc is not None and w is not None:
            out[entry["name"]] = (float(tc), float(pc), float(w))
    return out


def _formula_key(composition):
    """Formula in the table's convention: C and H first, then the other elements alphabetically."""
    order = ["C", "H"] + sorted(e for e in composition if e not in ("C", "H"))
    parts = []
    for e in order:
        n = composition.get(e, 0)
        if n:
            parts.append(e + ("" if n == 1 else str(int(n))))
    return "".join(parts)


@functools.lru_cache(maxsize=1)
def _by_formula():
    """{FORMULA (upper case): [entries]} of Cantera's table; isomers share one formula."""
    groups = {}
    for entry in _critical_entries():
        formula = re.sub(r"-\d+$", "", entry[0]).upper()
        groups.setdefault(formula, []).append(entry)
    return groups


def _descriptive_names(entry):
    """Normalised descriptive names of an entry: the whole name and its parts ("propyne(methylacetylene)")."""
    descriptive = entry[1]
    return {_norm(descriptive)} | {_norm(part) for part in re.split(r"[(),]", descriptive) if _norm(part)}


def _pick_by_name(species_name, candidates):
    """The one candidate the species name points to, or None.

    A name matches an entry's isomer-tagged table name (``C2H6O-1``), its descriptive name
    or a part of it, through :data:`ALIASES`, or (five letters or more) starts exactly one
    candidate's descriptive name (nasa_gas truncates: ``ethylbenz``). The bare formula
    never picks an isomer.
    """
    formula = _norm(re.sub(r"-\d+$", "", candidates[0][0]))
    tokens = {_norm(species_name)}
    if "," in species_name:                       # nasa_gas style "C8H10,ethylbenz"
        tokens.add(_norm(species_name.split(",", 1)[1]))
    tokens |= {ALIASES[t] for t in list(tokens) if t in ALIASES}
    tokens.discard(formula)
    exact = [e for e in candidates
             if tokens & (_descriptive_names(e) | ({_norm(e[0])} if "-" in e[0] else set()))]
    if len(exact) == 1:
        return exact[0]
    prefix = [e for e in candidates
              if any(len(t) >= 5 and any(n.startswith(t) for n in _descriptive_names(e)) for t in tokens)]
    return prefix[0] if len(prefix) == 1 else None


def lookup(name, elements):
    """Critical constants of one species from the built-in tables.

    Parameters
    ----------
    name : str
        Species name as the species file spells it.
    elements : dict
        Element counts of the species (empty for a custom species).

    Returns
    -------
    values : tuple or None
        (Tc [K], Pc [Pa], omega [-]), or None when no entry fits.
    source : str
        The entry used (table and entry name), or a text listing the candidates when the
        formula has several entries and the name does not pick one; "" when nothing fits.
    ambiguous : bool
        True when several entries share the formula and the name does not pick one.
    """
    if not elements:
        return None, "", False
    formula = _formula_key(elements)
    if formula in SUPPLEMENT:
        tc, pc, w, text = SUPPLEMENT[formula]
        return (tc, pc, w), f"tubesim table: {text}", False
    candidates = _by_formula().get(formula.upper(), [])
    if not candidates:
        return None, "", False
    entry = candidates[0] if len(candidates) == 1 else _pick_by_name(name, candidates)
    if entry is None:
        listed = "; ".join(f"{e[0]} ({e[1]}: Tc {e[2]:g} K, Pc {e[3] / 1e5:g} bar, omega {e[4]:g})"
                           for e in candidates)
        return None, f"{len(candidates)} entries for {formula} in Cantera critical-properties.yaml: {listed}", True
    return (entry[2], entry[3], entry[4]), f"Cantera critical-properties.yaml, entry {entry[0]} ({entry[1]})", False


def critical_constants(case, species):
    """(n, 3) array of Tc [K], Pc [Pa], omega [-] and a tuple of source texts ('' = missing).

    Raises
    ------
    CaseError
        Under Peng-Robinson, for a species whose formula has several entries in Cantera's
        table that its name does not single out (the message lists them).
    """
    given = {name: (tc, pc, w) for name, tc, pc, w in case.thermo.critical}
    custom = {c.name: c for c in case.thermo.custom}
    rows, sources, ambiguous = [], [], []
    for name, elements in zip(species.names, species.elements):
        if name in given:
            rows.append(given[name])
            sources.append("case file [thermo.critical]")
            continue
        c = custom.get(name)
        if c is not None:
            vals = (c.critical_temperature, c.critical_pressure, c.acentric_factor)
            if all(np.isfinite(vals)):
                rows.append(vals)
                sources.append("case file [thermo.custom]")
            else:
                rows.append((np.nan, np.nan, np.nan))
                sources.append("")
            continue
        values, source, unclear = lookup(name, elements)
        if unclear:
            ambiguous.append((name, source))
        rows.append(values if values is not None else (np.nan, np.nan, np.nan))
        sources.append(source if values is not None else "")
    if ambiguous and case.thermo.equation_of_state == "peng-robinson":
        raise CaseError([f"{case.source_path}: thermo.critical: species {name!r}: its name does not say which "
                         f"isomer it is ({source}); give its critical constants under [thermo.critical.{name}] "
                         "(critical_temperature, critical_pressure, acentric_factor)."
                         for name, source in ambiguous])
    return np.array(rows, dtype=float).reshape(len(rows), 3), tuple(sources)
