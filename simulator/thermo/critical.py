"""Critical constants (Tc, Pc, acentric factor) for the Peng-Robinson equation of state.

Order of precedence for each species: ``[thermo.critical.NAME]`` in the case,
then the critical constants of a custom species, then Cantera's bundled
``critical-properties.yaml`` (the table Cantera's own Peng-Robinson phase reads,
keyed by formula). Species without data get NaN and an empty source.
"""
import functools

import numpy as np

_KMOL = 1000.0


@functools.lru_cache(maxsize=1)
def _critical_table():
    """Cantera's bundled critical-properties.yaml as {formula: (Tc [K], Pc [Pa], omega [-])}.

    The file is a flat list of ``- name:`` entries with a ``critical-parameters``
    block; a line scan reads it in milliseconds (a full YAML parse takes ~1 s and
    would slow every first run). The scan is checked against the YAML parse in
    the tests.
    """
    from simulator.thermo.species_data import cantera_data_file

    path = cantera_data_file("critical-properties.yaml")
    out = {}
    name, values = None, {}

    def flush():
        if name is not None and all(k in values for k in ("critical-temperature", "critical-pressure",
                                                           "acentric-factor")):
            out[name] = (values["critical-temperature"], values["critical-pressure"], values["acentric-factor"])

    with open(path, encoding="utf-8") as handle:
        for line in handle:
            stripped = line.strip()
            if line.startswith("- name:"):
                flush()
                name, values = stripped.split(":", 1)[1].strip().strip("'\""), {}
            elif name is not None and ":" in stripped:
                key, _, text = stripped.partition(":")
                if key in ("critical-temperature", "critical-pressure", "acentric-factor"):
                    values[key] = float(text)
    flush()
    return out


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
    order = ["C", "H"] + sorted(e for e in composition if e not in ("C", "H"))
    parts = []
    for e in order:
        n = composition.get(e, 0)
        if n:
            parts.append(e + ("" if n == 1 else str(int(n))))
    return "".join(parts)


def critical_constants(case, species):
    """(n, 3) array of Tc [K], Pc [Pa], omega [-] and a tuple of source texts ('' = missing)."""
    given = {name: (tc, pc, w) for name, tc, pc, w in case.thermo.critical}
    custom = {c.name: c for c in case.thermo.custom}
    rows, sources = [], []
    table = None
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
        if table is None:
            table = _critical_table()
        entry = table.get(_formula_key(elements))
        if entry is None:
            rows.append((np.nan, np.nan, np.nan))
            sources.append("")
        else:
            rows.append(entry)
            sources.append("Cantera critical-properties.yaml")
    return np.array(rows, dtype=float).reshape(len(rows), 3), tuple(sources)
