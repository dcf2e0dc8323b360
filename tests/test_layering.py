"""Imports inside ``simulator/`` point only downwards (STYLE.md section 2, "Layers").

Every module is mapped to a layer by its first component below ``simulator``
(``simulator/case/load.py`` -> ``case``; ``simulator/__init__.py`` -> ``__init__``).
An import of a module in a higher layer fails; imports within one layer are
allowed. A module or package missing from :data:`LAYERS` fails too, so that new
modules are placed deliberately. ``simulator/_templates`` is data and is ignored.

Imports are read with ``ast`` (nothing is imported), including imports inside
functions, relative imports and ``from simulator import name``.
"""
import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
PACKAGE_NAME = "simulator"

#: Low -> high. A module may import from its own layer and from the layers below.
LAYERS = [
    ("errors", "units", "references", "fileio", "verdicts"),
    ("case", "thermo", "kinetics"),
    ("model", "results", "network", "network_results"),
    ("solve", "output", "train_output", "mechanism"),
    ("sweeps",),
    ("screening", "assumptions", "radial_assumption", "sizing", "readiness", "train_checks", "train_sizing"),
    ("report",),
    ("cli", "__main__", "__init__"),
]
IGNORED = {"_templates", "__pycache__"}


def layer_map(layers=LAYERS):
    return {name: level for level, names in enumerate(layers) for name in names}


def _module_name(path, package_dir):
    parts = list(path.relative_to(package_dir.parent).with_suffix("").parts)
    is_package = parts[-1] == "__init__"
    if is_package:
        parts = parts[:-1]
    return parts, is_package


def _component(parts):
    """Layer component of a dotted module path given as a list (['simulator', 'case', 'load'])."""
    return parts[1] if len(parts) > 1 else "__init__"


def _exists(package_dir, component):
    return (package_dir / f"{component}.py").exists() or (package_dir / component).is_dir()


def imported_targets(tree, parts, is_package, package_dir):
    """[(lineno, component, text)] of every import of a simulator module in one file."""
    targets = []
    package = parts if is_package else parts[:-1]
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for alias in node.names:
                dotted = alias.name.split(".")
                if dotted[0] == PACKAGE_NAME:
                    targets.append((node.lineno, _component(dotted), f"import {alias.name}"))
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = package[: len(package) - (node.level - 1)] if node.level > 1 else list(package)
                dotted = base + (node.module.split(".") if node.module else [])
            else:
                dotted = (node.module or "").split(".")
            if not dotted or dotted[0] != PACKAGE_NAME:
                continue
            text = f"from {'.' * node.level}{node.module or ''} import {', '.join(a.name for a in node.names)}"
            if len(dotted) == 1:
                # from simulator import x: a submodule x, or a name from simulator/__init__.py
                for alias in node.names:
                    component = alias.name if _exists(package_dir, alias.name) else "__init__"
                    targets.append((node.lineno, component, text))
            else:
                targets.append((node.lineno, dotted[1], text))
    return targets


def check_layering(package_dir, layers=LAYERS):
    """Every layering problem under package_dir, one line each (empty list: all good)."""
    package_dir = Path(package_dir)
    levels = layer_map(layers)
    problems = []
    unmapped_reported = set()

    def unmapped(component, where):
        if component not in unmapped_reported:
            unmapped_reported.add(component)
            problems.append(
                f"{where}: '{component}' has no layer; add {component!r} to the layer map "
                f"(LAYERS in tests/test_layering.py and STYLE.md section 2)"
            )

    for path in sorted(package_dir.rglob("*.py")):
        relative = path.relative_to(package_dir)
        if IGNORED & set(relative.parts[:-1]):
            continue
        parts, is_package = _module_name(path, package_dir)
        source_component = _component(parts)
        where = str(path.relative_to(package_dir.parent))
        if source_component not in levels:
            unmapped(source_component, where)
            continue
        tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
        for lineno, target, text in imported_targets(tree, parts, is_package, package_dir):
            if target in IGNORED:
                continue
            if target not in levels:
                unmapped(target, f"{where}:{lineno}")
                continue
            if levels[target] > levels[source_component]:
                problems.append(
                    f"{where}:{lineno}: upward import '{text}': layer '{source_component}' "
                    f"(level {levels[source_component]}) must not import '{target}' "
                    f"(level {levels[target]})"
                )
    return problems


# --------------------------------------------------------------------------- the real package
def test_no_upward_imports_in_simulator():
    problems = check_layering(ROOT / PACKAGE_NAME)
    assert not problems, "\n".join(problems)


def test_layer_map_has_no_duplicates():
    names = [name for layer in LAYERS for name in layer]
    assert len(names) == len(set(names))


# --------------------------------------------------------------------------- self-tests of the checker
def _tree(tmp_path, files):
    package_dir = tmp_path / PACKAGE_NAME
    for relative, text in files.items():
        path = package_dir / relative
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(text)
    return package_dir


def test_checker_accepts_downward_and_same_layer_imports(tmp_path):
    package_dir = _tree(tmp_path, {
        "__init__.py": "from simulator.solve.integrate import simulate\n",
        "errors.py": "",
        "units.py": "from simulator.errors import UnitError\n",
        "case/__init__.py": "",
        "case/load.py": "from . import schema\nfrom simulator import units\nfrom ..thermo import base\n",
        "case/schema.py": "",
        "thermo/base.py": "",
        "solve/integrate.py": "def simulate():\n    from simulator.model.kernel import rhs\n",
        "model/kernel.py": "import simulator.results\n",
        "results.py": "",
        "_templates/page.py": "from simulator.cli import main\n",  # data: ignored
    })
    assert check_layering(package_dir) == []


def test_checker_catches_upward_imports(tmp_path):
    package_dir = _tree(tmp_path, {
        "units.py": "def f():\n    from simulator.report.html import render\n",
        "report/html.py": "",
        "model/balances.py": "from ..solve import integrate\n",
        "solve/integrate.py": "",
        "case/load.py": "from simulator import simulate\n",  # a name from simulator/__init__.py
        "__init__.py": "",
    })
    problems = check_layering(package_dir)
    assert len(problems) == 3, problems
    joined = "\n".join(problems)
    assert "simulator/units.py:2: upward import 'from simulator.report.html import render'" in joined
    assert "layer 'model' (level 2) must not import 'solve'" in joined
    assert "layer 'case' (level 1) must not import '__init__'" in joined


def test_checker_demands_a_layer_for_new_modules(tmp_path):
    package_dir = _tree(tmp_path, {
        "widgets.py": "",
        "units.py": "from simulator.gadgets import thing\n",
    })
    problems = check_layering(package_dir)
    assert any("add 'widgets' to the layer map" in p for p in problems), problems
    assert any("add 'gadgets' to the layer map" in p for p in problems), problems
