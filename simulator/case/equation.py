"""Parse a reaction equation such as ``"A + 2 B <=> 3 C"``.

``=>`` is irreversible, ``<=>`` reversible (reverse rate from the equilibrium
constant). Terms are separated by `` + `` with spaces; a coefficient is a
number followed by a space (``2 B``). Species names are kept exactly as
written, so names with commas or parentheses (``C2H4O,ethylen``, ``CH2(S)``)
work.
"""
import re

_ARROW = re.compile(r"\s+(<=>|=>)\s+")
_PLUS = re.compile(r"\s+\+\s+")
_TERM = re.compile(r"^(?:(\d+(?:\.\d*)?|\.\d+)\s+)?(\S+)$")


def parse_equation(text):
    """Return ``(stoichiometry, reversible)`` for an equation string.

    Parameters
    ----------
    text : str
        The equation as written in the case file.

    Returns
    -------
    stoichiometry : dict
        Species name to signed coefficient (negative for reactants), [-]
    reversible : bool
        True for ``<=>``.

    Raises
    ------
    ValueError
        With a one-line explanation of what is wrong.

    Examples
    --------
    >>> parse_equation("A => 2 B")
    ({'A': -1.0, 'B': 2.0}, False)
    """
    if not isinstance(text, str):
        raise ValueError("must be text such as \"A + 2 B => C\"")
    parts = _ARROW.split(text.strip())
    if len(parts) != 3:
        raise ValueError('needs exactly one arrow, "=>" (irreversible) or "<=>" (reversible), '
                         'with spaces around it, e.g. "A + 2 B => C"')
    left, arrow, right = parts
    stoich = {}
    for side, sign in ((left, -1.0), (right, 1.0)):
        if not side.strip():
            raise ValueError("a side of the equation is empty")
        for term in _PLUS.split(side.strip()):
            match = _TERM.match(term.strip())
            if match is None:
                raise ValueError(f"cannot read the term {term!r}; write a coefficient, a space and "
                                 "the species, e.g. \"2 B\", and put spaces around \"+\"")
            coefficient = float(match.group(1)) if match.group(1) else 1.0
            if coefficient <= 0:
                raise ValueError(f"coefficient of {match.group(2)!r} must be > 0")
            name = match.group(2)
            stoich[name] = stoich.get(name, 0.0) + sign * coefficient
    stoich = {k: v for k, v in stoich.items() if v != 0.0}
    if not any(v < 0 for v in stoich.values()) or not any(v > 0 for v in stoich.values()):
        raise ValueError("needs at least one reactant and one product")
    return stoich, arrow == "<=>"
