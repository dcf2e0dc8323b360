"""Dotted paths into a raw case, ``--vary`` specifications and full-factorial grids.

A *raw case* is the dict that :func:`tomllib.load` returns for a case file: values with
units are still text (``"600 K"``). Sweeps change a raw case, never a loaded ``Case``,
so the lead's loader validates every swept case exactly as it validates a hand-written
one. Every new value is written back as text in coherent SI units (``"612.5 K"``), so
the loader needs no special path for sweeps.

Path grammar: keys separated by dots; a part made only of digits indexes a list
(``reactions.0.pre_exponential``). Mole fractions are special: setting
``feed.mole_fractions.X`` rescales the other species of that feed so that the
fractions still sum to 1 (see :func:`apply_values`).
"""
import copy
import difflib
import functools
import itertools
import math
import re
from dataclasses import dataclass

import numpy as np

from simulator.errors import CaseError
from simulator.units import parse_quantity, registry

#: Key whose children are mole fractions that must keep summing to 1.
MOLE_FRACTIONS_KEY = "mole_fractions"

# Coherent SI units written back into swept cases, by pint dimensionality. Coherent
# means the factor to pint's base units is exactly 1, so the float survives the round
# trip unchanged. Anything not listed falls back to pint's abbreviated base units.
_NICE_SI_UNITS = (
    "K", "m", "Pa", "s", "kg", "mol", "J", "W", "m^2", "m^3", "m/s", "1/s",
    "mol/s", "kg/s", "m^3/s", "kg/mol", "J/mol", "J/(mol*K)", "J/(kg*K)", "kg/m^3",
    "Pa*s", "W/(m^2*K)", "W/(m*K)", "mol/m^3", "kg/(m^2*s)", "mol/(m^3*s)",
    "mol/(kg*s)", "m^3/(mol*s)",
)
_INT_TEXT = re.compile(r"^\s*[-+]?\d+\s*$")
#: Most cases one sweep or uncertainty run may plan (memory and time budget; common practice, no source).
MAX_CASES = 10_000_000


@dataclass(frozen=True)
class VarySpec:
    """One ``--vary "PATH=START..STOP in N"`` option, parsed.

    Attributes
    ----------
    path : str
        Dotted path into the raw case, e.g. ``"heat.medium.temperature"``.
    values_si : ndarray
        The N values, evenly spaced from START to STOP, in SI base units (unit of the field)
    values_text : list of str
        The same values as text with their SI unit (``"612.5 K"``) or as plain numbers.
    dimensionality : str
        pint dimensionality of START/STOP (``"[temperature]"``), or ``"dimensionless"``
        for plain numbers.
    integer : bool
        True when START and STOP are whole numbers without units and every value is whole.
    """

    path: str
    values_si: np.ndarray
    values_text: list
    dimensionality: str = "dimensionless"
    integer: bool = False


def _split_path(path):
    parts = path.split(".")
    if not path or any(part == "" for part in parts):
        raise CaseError(f"{path!r}: not a dotted path such as 'heat.medium.temperature'")
    return parts


def _missing_key(path, parts, depth, container):
    level = ".".join(parts[:depth]) or "the case"
    wanted = parts[depth]
    keys = sorted(str(key) for key in container)
    near = difflib.get_close_matches(wanted, keys, n=3, cutoff=0.6)
    hint = f" Did you mean {', '.join(repr(k) for k in near)}?" if near else ""
    return CaseError(
        f"{path}: no field {wanted!r} in {level}; valid: {', '.join(keys) or '(none)'}.{hint}"
    )


def _walk(raw, path, parts):
    """Return (container, last_key) for ``path``; raise CaseError naming the failing level."""
    node = raw
    for depth, part in enumerate(parts[:-1]):
        node = _child(node, path, parts, depth)
    last = parts[-1]
    _child(node, path, parts, len(parts) - 1)  # existence check with a clear message
    return node, (int(last) if isinstance(node, list) else last)


def _child(node, path, parts, depth):
    part = parts[depth]
    level = ".".join(parts[:depth]) or "the case"
    if isinstance(node, dict):
        if part not in node:
            raise _missing_key(path, parts, depth, node)
        return node[part]
    if isinstance(node, list):
        if not part.isdigit():
            raise CaseError(f"{path}: {level} is a list; expected an index 0..{len(node) - 1}, got {part!r}")
        index = int(part)
        if index >= len(node):
            raise CaseError(
                f"{path}: index {index} out of range; {level} has {len(node)} entries (0..{len(node) - 1})"
            )
        return node[index]
    raise CaseError(f"{path}: {level} is a value ({node!r}), not a table or list; cannot descend into {part!r}")


def get_path(raw, path):
    """Value of the raw case at a dotted path.

    Parameters
    ----------
    raw : dict
        Raw case as read by :mod:`tomllib`.
    path : str
        Dotted path, list indices as digits, e.g. ``"reactions.0.pre_exponential"``.

    Returns
    -------
    object
        The value as written in the case (text with units, number, table or list).

    Raises
    ------
    CaseError
        If a key is missing (valid keys and near matches are listed) or an index is out of range.
    """
    parts = _split_path(path)
    node = raw
    for depth in range(len(parts)):
        node = _child(node, path, parts, depth)
    return node


def dimensionality_of(value, where):
    """pint dimensionality string of a case value: ``"dimensionless"`` for plain numbers.

    Parameters
    ----------
    value : str or int or float
        Case value as written (``"250 degC"``, ``0.2``, ``12``).
    where : str
        Field path for error messages.

    Returns
    -------
    str
        e.g. ``"[temperature]"``, ``"[mass] / [length] / [time] ** 2"`` or ``"dimensionless"``.
    """
    if isinstance(value, bool):
        raise CaseError(f"{where} = {value!r}: a true/false option cannot be swept or sampled")
    if isinstance(value, (int, float)):
        return "dimensionless"
    if isinstance(value, str):
        return _text_dimensionality(value, where)
    raise CaseError(f"{where}: holds a {type(value).__name__}, not a single value; choose a field inside it")


@functools.lru_cache(maxsize=1024)
def _text_dimensionality(text, where):
    from simulator.units import _quantity  # the package's own text -> pint parser

    dim = _quantity(text, where).dimensionality
    return "dimensionless" if not dim else str(dim)


def si_text(value, dimensionality):
    """SI float -> case text with a coherent SI unit, e.g. ``612.5, "[temperature]" -> "612.5 K"``.

    Parameters
    ----------
    value : float
        Value in SI base units (unit of the field)
    dimensionality : str
        pint dimensionality string as returned by :func:`dimensionality_of`.

    Returns
    -------
    str
        Text that :func:`simulator.units.parse_quantity` reads back to exactly ``value``.
    """
    return f"{float(value)!r} {_si_unit_for(dimensionality)}"


@functools.lru_cache(maxsize=256)
def _si_unit_for(dimensionality):
    ureg = registry()
    if dimensionality == "dimensionless":
        return ""
    for unit in _NICE_SI_UNITS:
        if str(ureg.Quantity(1.0, unit).dimensionality) == dimensionality:
            return unit
    # fall back: SI base units for this dimensionality, abbreviated
    dims = ureg.get_dimensionality(dimensionality)
    units = ureg.Quantity(1.0, "dimensionless")
    symbols = {"[length]": "m", "[mass]": "kg", "[time]": "s", "[temperature]": "K",
               "[substance]": "mol", "[current]": "A", "[luminosity]": "cd"}
    for dim, power in dims.items():
        units = units * ureg.Quantity(1.0, symbols[dim]) ** power
    return f"{units.units:~}"


_RANGE = re.compile(r"^(?P<start>.*?)\.\.(?P<stop>.*?)\bin\s+(?P<n>\S+)\s*$")
_EXAMPLE = '"heat.medium.temperature=600 K..660 K in 31"'


def parse_vary(spec):
    """Parse one ``--vary "PATH=START..STOP in N"`` option.

    Parameters
    ----------
    spec : str
        ``PATH=START..STOP in N``. START and STOP both carry units of the same dimension
        (``"heat.medium.temperature=600 K..660 K in 31"``), or are both plain numbers for
        dimensionless fields (``"feed.mole_fractions.OX=0.01..0.03 in 5"``,
        ``"tube.count=100..200 in 3"``). N is the number of evenly spaced values, a whole
        number >= 1; N = 1 requires START == STOP. The colon form of earlier versions
        (START:STOP:N) is refused with the new spelling.

    Returns
    -------
    VarySpec
        Path, the N values in SI, the same values as SI text, the dimensionality.

    Raises
    ------
    CaseError
        With one line naming the option, what is wrong and what is accepted.
    """
    where = f"--vary {spec!r}"
    if not isinstance(spec, str) or "=" not in spec:
        raise CaseError(f"{where}: expected PATH=START..STOP in N, e.g. {_EXAMPLE}")
    path, _, rng = spec.partition("=")
    path = path.strip()
    _split_path(path)
    match = _RANGE.match(rng)
    if match is None:
        pieces = rng.split(":")
        if len(pieces) == 3 and ".." not in rng:
            a, b, c = (piece.strip() for piece in pieces)
            raise CaseError(f"{where}: the START:STOP:N form is no longer accepted; write "
                            f'"{path}={a}..{b} in {c}" (N evenly spaced values from START to STOP)')
        raise CaseError(f"{where}: expected START..STOP in N after '=', e.g. {_EXAMPLE}")
    start_text, stop_text, n_text = (match.group(k).strip() for k in ("start", "stop", "n"))
    if not _INT_TEXT.match(n_text) or int(n_text) < 1:
        raise CaseError(f"{where}: N = {n_text!r}: must be a whole number >= 1 (the number of values)")
    n = int(n_text)
    if n > MAX_CASES:
        raise CaseError(f"{where}: N = {n_text!r}: at most {MAX_CASES} values per sweep (a work budget); "
                        "split the range into several sweeps")
    start, start_dim = _parse_end(start_text, where, "START")
    stop, stop_dim = _parse_end(stop_text, where, "STOP")
    if start_dim != stop_dim:
        raise CaseError(
            f"{where}: START {start_text!r} ({start_dim}) and STOP {stop_text!r} ({stop_dim}) "
            "must have the same dimension (both with units, or both plain numbers)"
        )
    if n == 1 and start != stop:
        raise CaseError(f"{where}: N = 1 needs START == STOP; use N >= 2 for a range")
    # 15 significant digits: 0.019999999999999997 from linspace becomes 0.02
    values = np.array([float(f"{v:.15g}") for v in np.linspace(start, stop, n)])
    integer = (start_dim == "dimensionless" and bool(_INT_TEXT.match(start_text))
               and bool(_INT_TEXT.match(stop_text)) and bool(np.all(values == np.round(values))))
    if integer:
        values = np.round(values)
        text = [str(int(v)) for v in values]
    elif start_dim == "dimensionless":
        text = [repr(float(v)) for v in values]
    else:
        text = [si_text(v, start_dim) for v in values]
    return VarySpec(path=path, values_si=values, values_text=text, dimensionality=start_dim, integer=integer)


def _parse_end(text, where, name):
    if not text:
        raise CaseError(f"{where}: {name} is empty; expected a number, with its unit where the field has one")
    try:
        number = float(text)
    except ValueError:
        pass
    else:
        if not math.isfinite(number):
            raise CaseError(f"{where}: {name} = {text!r}: not a finite number")
        return number, "dimensionless"
    dim = dimensionality_of(text, f"{where}: {name}")
    return parse_quantity(text, dim, f"{where}: {name}"), dim


def check_vary(raw, spec):
    """Check a parsed ``--vary`` against the base case before any case runs.

    The path must exist and START/STOP must have the dimension of the case value
    there (units for a field with units, plain numbers for a dimensionless one;
    whole numbers for an integer field such as ``tube.count``).

    Parameters
    ----------
    raw : dict
        Raw base case.
    spec : VarySpec
        Parsed ``--vary`` option.

    Raises
    ------
    CaseError
        If the path is missing or the dimensions disagree.
    """
    current = get_path(raw, spec.path)
    case_dim = dimensionality_of(current, spec.path)
    if case_dim != spec.dimensionality:
        if spec.dimensionality == "dimensionless":
            problem = f"needs units like the case value {current!r}"
        elif case_dim == "dimensionless":
            problem = f"is a plain number in the case ({current!r}); give START and STOP without units"
        else:
            problem = f"has dimension {case_dim} in the case ({current!r}), not {spec.dimensionality}"
        raise CaseError(f"--vary {spec.path}: {problem}")
    if isinstance(current, int) and not spec.integer:
        raise CaseError(f"--vary {spec.path}: whole-number field (case value {current!r}); "
                        "give whole START and STOP and an N that yields whole steps")


def set_path(raw, path, value):
    """Return a copy of the raw case with one value changed (the input is never mutated).

    Parameters
    ----------
    raw : dict
        Raw base case.
    path : str
        Dotted path to an existing field.
    value : str or float or int
        New value. Text is written as given. A number is written in SI: as text with
        the coherent SI unit when the case field has units (``612.5 -> "612.5 K"``),
        as a number for a dimensionless field (an ``int`` for whole-number fields).
        ``feed.mole_fractions.X`` rescales the other species (see :func:`apply_values`).

    Returns
    -------
    dict
        A deep copy with the value changed.

    Raises
    ------
    CaseError
        For a missing key (valid keys listed), an index out of range, a fraction that
        cannot be rescaled, or a non-integer value for a whole-number field.
    """
    return apply_values(raw, {path: value})


def apply_values(raw, values):
    """Return a copy of the raw case with several values changed at once.

    Mole fractions under the same ``mole_fractions`` table are applied together: the
    listed species take their new values and every other species of that table is
    scaled by ``(1 - sum(new)) / sum(others)``, so the fractions still sum to 1 and
    keep their ratios. Fields outside ``mole_fractions`` change only where listed.

    Parameters
    ----------
    raw : dict
        Raw base case (not mutated).
    values : dict
        ``{path: value}``; numbers in SI units of each field

    Returns
    -------
    dict
        The changed deep copy.

    Raises
    ------
    CaseError
        As :func:`set_path`.
    """
    new = copy.deepcopy(raw)
    fraction_groups = {}
    for path, value in values.items():
        parts = _split_path(path)
        if len(parts) >= 2 and parts[-2] == MOLE_FRACTIONS_KEY:
            fraction_groups.setdefault(".".join(parts[:-1]), {})[parts[-1]] = value
            continue
        container, key = _walk(new, path, parts)
        container[key] = _converted(container[key], value, path)
    for table_path, changes in fraction_groups.items():
        _set_fractions(new, table_path, changes)
    return new


def _converted(current, value, path):
    if isinstance(value, str):
        return value
    if isinstance(value, bool) or not isinstance(value, (int, float, np.integer, np.floating)):
        raise CaseError(f"{path} = {value!r}: expected a number or text with units")
    value = float(value)
    if not math.isfinite(value):
        raise CaseError(f"{path} = {value!r}: not a finite number")
    dim = dimensionality_of(current, path)
    if isinstance(current, str):
        return si_text(value, dim) if dim != "dimensionless" else repr(value)
    if isinstance(current, int):
        if value != round(value):
            raise CaseError(f"{path} = {value!r}: must be a whole number (case value {current!r})")
        return int(round(value))
    return value


def _set_fractions(new, table_path, changes):
    parts = _split_path(table_path)
    table = get_path(new, table_path)
    if not isinstance(table, dict):
        raise CaseError(f"{table_path}: expected a table of species = mole fraction")
    for species, value in changes.items():
        path = f"{table_path}.{species}"
        if species not in table:
            raise _missing_key(path, parts + [species], len(parts), table)
        if isinstance(value, str):
            try:
                value = float(value)
            except ValueError:
                raise CaseError(f"{path} = {value!r}: a mole fraction is a plain number") from None
        if not (0.0 <= float(value) <= 1.0):
            raise CaseError(f"{path} = {value!r}: must be between 0 and 1")
        changes[species] = float(value)
    for species, current in table.items():
        if isinstance(current, bool) or not isinstance(current, (int, float)):
            raise CaseError(f"{table_path}.{species} = {current!r}: a mole fraction is a plain number")
    varied_sum = sum(changes.values())
    others = {k: float(v) for k, v in table.items() if k not in changes}
    others_sum = sum(others.values())
    listed = ", ".join(f"{k} = {v!r}" for k, v in changes.items())
    if others:
        if varied_sum >= 1.0:
            raise CaseError(f"{table_path}: {listed}: the varied fractions sum to {varied_sum!r} >= 1, "
                            f"leaving nothing for {', '.join(others)}")
        if others_sum <= 0.0:
            raise CaseError(f"{table_path}: {listed}: the other species all have fraction 0, "
                            "so they cannot be rescaled to make the sum 1")
        scale = (1.0 - varied_sum) / others_sum
        for k, v in others.items():
            table[k] = v * scale
    elif not math.isclose(varied_sum, 1.0, rel_tol=0.0, abs_tol=1e-12):
        raise CaseError(f"{table_path}: {listed}: these are all the species and they sum to {varied_sum!r}, not 1")
    table.update(changes)


def grid(vary_specs):
    """Full-factorial grid over several ``--vary`` options.

    Parameters
    ----------
    vary_specs : sequence of VarySpec
        One per varied path; the first varies slowest (row-major order, as
        :func:`itertools.product`).

    Returns
    -------
    list of (int, dict)
        ``(case_id, {path: value_si})`` with case_id 0, 1, 2, ... in a deterministic order;
        whole-number specs give ``int`` values, others ``float``, in SI units

    Raises
    ------
    CaseError
        If the same path is varied twice.
    """
    paths = [spec.path for spec in vary_specs]
    twice = sorted({p for p in paths if paths.count(p) > 1})
    if twice:
        raise CaseError(f"--vary: {', '.join(twice)} varied more than once; give each path once")
    total = math.prod(len(spec.values_si) for spec in vary_specs)
    if total > MAX_CASES:
        raise CaseError(f"--vary: the grid has {total} cases; at most {MAX_CASES} per sweep (a work budget); "
                        "use fewer values or several sweeps")
    columns = [
        [int(v) for v in spec.values_si] if spec.integer else [float(v) for v in spec.values_si]
        for spec in vary_specs
    ]
    return [(case_id, dict(zip(paths, combo)))
            for case_id, combo in enumerate(itertools.product(*columns))]
