"""Docstrings agree with the code (STYLE.md sections 4 and 8).

For every public function, method and class of every module under ``simulator/``
that has a numpydoc ``Parameters`` section:

(a) the documented parameter names equal the signature's, in order (``self``,
    ``cls``, ``*args`` and ``**kwargs`` are ignored on both sides);
(b) every trailing ``[unit]`` bracket of a parameter or return description
    parses with the project's pint registry (``[-]`` means dimensionless).

Objects without a ``Parameters`` section are skipped. ``simulator/__main__.py``
is not imported (it runs the command line), and ``simulator/_templates`` is data.
"""
import importlib
import inspect
import re
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = ROOT / "simulator"
SKIP_MODULES = {"simulator.__main__"}
SKIP_DIRS = {"_templates", "__pycache__"}

_UNDERLINE = re.compile(r"^-{3,}\s*$")
_TRAILING_UNIT = re.compile(r"\[([^\[\]]*)\]\s*\.?\s*$")
_PARAMETER_SECTIONS = ("Parameters", "Other Parameters")
_UNIT_SECTIONS = ("Parameters", "Other Parameters", "Returns", "Yields")
_IGNORED_NAMES = {"self", "cls"}


# --------------------------------------------------------------------------- discovery
def module_names():
    """Dotted names of all modules under simulator/, found on disk (not by importing)."""
    names = []
    for path in sorted(PACKAGE.rglob("*.py")):
        relative = path.relative_to(ROOT)
        if SKIP_DIRS & set(relative.parts[:-1]):
            continue
        parts = list(relative.with_suffix("").parts)
        if parts[-1] == "__init__":
            parts = parts[:-1]
        name = ".".join(parts)
        if name not in SKIP_MODULES:
            names.append(name)
    return names


def public_objects(module):
    """(qualified name, object, signature callable) of every public callable defined in module."""
    found = []
    for name, obj in sorted(vars(module).items()):
        if name.startswith("_"):
            continue
        obj = getattr(obj, "py_func", obj)  # a numba dispatcher: check the Python function
        if getattr(obj, "__module__", None) != module.__name__:
            continue
        if inspect.isfunction(obj):
            found.append((name, obj, obj))
        elif inspect.isclass(obj):
            found.append((name, obj, obj))
            for attr, member in sorted(vars(obj).items()):
                if attr.startswith("_") and attr != "__init__":
                    continue
                if isinstance(member, (staticmethod, classmethod)):
                    member = member.__func__
                member = getattr(member, "py_func", member)
                if inspect.isfunction(member):
                    found.append((f"{name}.{attr}", member, member))
    return found


# --------------------------------------------------------------------------- numpydoc parsing
def numpydoc_sections(doc):
    """Split a numpydoc docstring into {section title: [lines]} (lines de-indented)."""
    lines = inspect.cleandoc(doc or "").splitlines()
    sections = {}
    current = None
    i = 0
    while i < len(lines):
        line = lines[i]
        if (
            i + 1 < len(lines)
            and line.strip()
            and not line.startswith(" ")
            and _UNDERLINE.match(lines[i + 1])
        ):
            current = line.strip()
            sections[current] = []
            i += 2
            continue
        if current is not None:
            sections[current].append(line)
        i += 1
    return sections


def section_entries(lines):
    """[(header, description)] of a Parameters/Returns-style section."""
    entries = []
    for line in lines:
        if not line.strip():
            continue
        if not line.startswith((" ", "\t")):
            entries.append([line.strip(), []])
        elif entries:
            entries[-1][1].append(line.strip())
    return [(header, " ".join(description)) for header, description in entries]


def documented_names(header):
    """Parameter names of a header line such as ``x, y : float, optional``."""
    names_part = re.split(r"\s+:\s*|\s*:\s+|:$", header, maxsplit=1)[0]
    return [name.strip() for name in names_part.split(",") if name.strip()]


def signature_names(func):
    params = inspect.signature(func).parameters.values()
    return [
        p.name
        for p in params
        if p.kind not in (p.VAR_POSITIONAL, p.VAR_KEYWORD) and p.name not in _IGNORED_NAMES
    ]


def check_unit(text, ureg):
    """None if the bracket text is a unit pint accepts, else the problem."""
    text = text.strip()
    if text == "-":
        return None
    if not text:
        return "empty unit bracket []"
    if re.fullmatch(r"[\d.\s]+", text):
        return f"[{text}] is a number, not a unit (write [-] for dimensionless, [1]_ for a citation)"
    try:
        ureg.parse_units(text)
    except Exception as err:  # pint raises several unrelated types for bad unit text
        return f"[{text}] does not parse as a unit ({err.__class__.__name__}: {err})"
    return None


def docstring_problems(qualname, obj, signature_source, ureg):
    """Every mismatch between one object's numpydoc and its code, as one line each."""
    sections = numpydoc_sections(obj.__doc__)  # own docstring only, never an inherited one
    if "Parameters" not in sections:
        return []
    problems = []
    documented = []
    for title in _PARAMETER_SECTIONS:
        for header, _ in section_entries(sections.get(title, [])):
            documented.extend(
                n for n in documented_names(header) if not n.startswith("*") and n not in _IGNORED_NAMES
            )
    try:
        actual = signature_names(signature_source)
    except (TypeError, ValueError) as err:
        problems.append(f"{qualname}: documents Parameters but has no signature ({err})")
        actual = None
    if actual is not None and documented != actual:
        missing = [n for n in actual if n not in documented]
        extra = [n for n in documented if n not in actual]
        detail = []
        if missing:
            detail.append(f"undocumented {missing}")
        if extra:
            detail.append(f"documented but not in the signature {extra}")
        if not detail:
            detail.append("same names, different order")
        problems.append(
            f"{qualname}: docstring parameters {documented} != signature {actual} ({'; '.join(detail)})"
        )
    for title in _UNIT_SECTIONS:
        for header, description in section_entries(sections.get(title, [])):
            match = _TRAILING_UNIT.search(description)
            if match is None:
                continue
            problem = check_unit(match.group(1), ureg)
            if problem:
                problems.append(f"{qualname}: {title} entry '{header}': {problem}")
    return problems


@pytest.fixture(scope="module")
def ureg():
    from simulator.units import registry

    return registry()


# --------------------------------------------------------------------------- the real package
@pytest.mark.parametrize("module_name", module_names())
def test_module_docstrings_match_code(module_name, ureg):
    module = importlib.import_module(module_name)  # an import error fails the test, on purpose
    problems = []
    for qualname, obj, signature_source in public_objects(module):
        problems.extend(docstring_problems(f"{module_name}.{qualname}", obj, signature_source, ureg))
    assert not problems, "\n".join(problems)


def test_modules_were_found():
    names = module_names()
    assert "simulator.units" in names
    assert "simulator.model.pressure_drop" in names
    assert not any(name.startswith("simulator._templates") for name in names)


# --------------------------------------------------------------------------- self-tests of the checker
def _good(superficial_velocity, density, *args, flag=False, **kwargs):
    """Synthetic function with correct documentation.

    Parameters
    ----------
    superficial_velocity : float
        Velocity, [m/s]
    density : float
        Density over two
        lines, [kg/m^3]
    *args
        Ignored.
    flag : bool, optional
        A switch with no unit.
    **kwargs
        Ignored.

    Returns
    -------
    dP_dz : float
        Gradient, [Pa/m]
    ratio : float
        A ratio, [-]
    """


def _renamed(superficial_velocity, rho):
    """Synthetic function whose docstring names a parameter that is not in the signature.

    Parameters
    ----------
    superficial_velocity : float
        Velocity, [m/s]
    density : float
        Density, [kg/m^3]
    """


def _swapped(a, b):
    """Synthetic function documenting parameters in the wrong order.

    Parameters
    ----------
    b : float
        Second, [m]
    a : float
        First, [m]
    """


def _bad_units(x):
    """Synthetic function with units pint cannot read.

    Parameters
    ----------
    x : float
        Length, [blorgs per widget]

    Returns
    -------
    y : float
        Result, [1]
    """


def _no_parameters_section(x, y):
    """Synthetic function without a Parameters section: skipped. Value [nonsense]."""


class _Synthetic:
    """Synthetic class documenting its constructor.

    Parameters
    ----------
    length : float
        Length, [m]
    """

    def __init__(self, length, width):
        self.length = length

    def method(self, value):
        """A method.

        Parameters
        ----------
        value : float
            Value, [K]
        """


def test_checker_accepts_a_correct_docstring(ureg):
    assert docstring_problems("_good", _good, _good, ureg) == []
    assert docstring_problems("_Synthetic.method", _Synthetic.method, _Synthetic.method, ureg) == []


def test_checker_catches_a_renamed_parameter(ureg):
    problems = docstring_problems("_renamed", _renamed, _renamed, ureg)
    assert len(problems) == 1
    assert "undocumented ['rho']" in problems[0]
    assert "not in the signature ['density']" in problems[0]


def test_checker_catches_wrong_order(ureg):
    problems = docstring_problems("_swapped", _swapped, _swapped, ureg)
    assert len(problems) == 1 and "different order" in problems[0]


def test_checker_catches_bad_unit_brackets(ureg):
    problems = docstring_problems("_bad_units", _bad_units, _bad_units, ureg)
    assert len(problems) == 2
    assert "blorgs per widget" in problems[0]
    assert "[1] is a number" in problems[1]


def test_checker_skips_objects_without_parameters_section(ureg):
    assert docstring_problems("_none", _no_parameters_section, _no_parameters_section, ureg) == []


def test_checker_compares_class_docstring_with_constructor(ureg):
    problems = docstring_problems("_Synthetic", _Synthetic, _Synthetic, ureg)
    assert len(problems) == 1 and "undocumented ['width']" in problems[0]


def test_parser_reads_multiline_descriptions_and_combined_names():
    sections = numpydoc_sections(_good.__doc__)
    entries = dict(section_entries(sections["Parameters"]))
    assert entries["density : float"] == "Density over two lines, [kg/m^3]"
    assert documented_names("x, y : float, optional") == ["x", "y"]
    assert documented_names("flag") == ["flag"]
