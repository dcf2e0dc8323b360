"""The report's Validation section: published checks named by the test suite's markers.

A test that compares tubesim against the outside world carries
``@pytest.mark.published("KEY", "where in the source")`` with ``KEY`` in
``tests/sources.toml``. :func:`collect_published_checks` reads those markers
with :mod:`ast` (no test is imported or run) and turns each into one row
``{key, citation, compared, where, test}``. The report prints only ``citation``
(the published citation, ``report_citation`` in ``sources.toml``) and
``compared`` (what was compared, in plain words), one row per source; the
marker's ``where`` and the test's name are internal notes of the test suite
(they may say "from memory" or name a file) and never reach the report.

An installed wheel does not ship ``tests/``. The rows are therefore kept as a
snapshot in the package, :mod:`simulator.report.validated_checks` (a plain
Python data module, so it ships with the package without any packaging
option), and :func:`published_checks` reads that snapshot. In a source
checkout, :func:`write_snapshot` regenerates it, and
``tests/test_report_end_to_end.py`` fails when the snapshot differs from the
markers, so it cannot go stale silently.

The list says which published results the test suite checks; whether this
build passes them is what the test run (CI) establishes.
"""
import ast
import pprint
import re
import tomllib
from pathlib import Path

_MARKER = "published"
_SNAPSHOT_MODULE = "validated_checks.py"
#: Phrases of internal notes that the report never prints (test notes, file paths, test names).
INTERNAL_NOTE_PATTERNS = (r"\bfrom memory\b", r"\bcheck-values\b", r"\.md\b", r"\bnotes?\b", r"\btest_\w+",
                          r"\btests?/", r"\bregression\b", r"\bhand formula\b", r"\bproject\b")


def internal_notes(text):
    """Phrases in ``text`` that are internal notes, not something a report may print.

    Parameters
    ----------
    text : str
        Text meant for the report, [-]

    Returns
    -------
    list of str
        The offending phrases found (empty when the text is fit to print), [-]
    """
    found = []
    for pattern in INTERNAL_NOTE_PATTERNS:
        found += [m.group(0) for m in re.finditer(pattern, str(text), flags=re.I)]
    return found


def source_tree_tests():
    """The ``tests/`` folder of the source checkout this module sits in, or None.

    Returns
    -------
    pathlib.Path or None
        Folder holding ``sources.toml``, or None in an installed copy, [-]
    """
    folder = Path(__file__).resolve().parents[2] / "tests"
    return folder if (folder / "sources.toml").is_file() else None


def _is_published_marker(node):
    """True for a call ``<anything>.mark.published(...)``."""
    if not isinstance(node, ast.Call):
        return False
    func = node.func
    return (isinstance(func, ast.Attribute) and func.attr == _MARKER
            and isinstance(func.value, ast.Attribute) and func.value.attr == "mark")


def _text(node):
    """Literal text of a marker argument (implicit and explicit string concatenation)."""
    if isinstance(node, ast.Constant) and isinstance(node.value, str):
        return node.value
    if isinstance(node, ast.BinOp) and isinstance(node.op, ast.Add):
        left, right = _text(node.left), _text(node.right)
        if left is not None and right is not None:
            return left + right
    return None


def _marker_args(call):
    """(key, where) of a published marker call; None for a part that is not literal text."""
    args = list(call.args)
    kwargs = {k.arg: k.value for k in call.keywords}
    key_node = args[0] if args else kwargs.get("key")
    where_node = args[1] if len(args) > 1 else kwargs.get("where")
    key = _text(key_node) if key_node is not None else None
    where = _text(where_node) if where_node is not None else ""
    return key, where


def _markers_in(nodes):
    """Every published marker call found anywhere inside ``nodes`` (decorators or an assignment)."""
    found = []
    for node in nodes:
        for sub in ast.walk(node):
            if _is_published_marker(sub):
                found.append(sub)
    return found


def _report_fields(sources, key):
    """(citation, compared) of ``key`` as the report prints them.

    ``report_citation`` and ``compared`` of the ``sources.toml`` entry; without
    them, ``citation`` and ``used`` (``tests/test_report_end_to_end.py`` fails when
    either carries an internal note, see :func:`internal_notes`).
    """
    entry = sources.get(key)
    if not isinstance(entry, dict) or not entry.get("citation"):
        return f"(no entry for {key!r} in tests/sources.toml)", ""
    citation = entry.get("report_citation") or entry["citation"]
    compared = entry.get("compared") or entry.get("used", "")
    return str(citation), str(compared)


def collect_published_checks(tests_dir):
    """Read every ``published`` marker under ``tests_dir`` (with ``ast``, nothing is run).

    Parameters
    ----------
    tests_dir : str or pathlib.Path
        Folder holding ``sources.toml`` and the ``test_*.py`` files (searched
        recursively), [-]

    Returns
    -------
    list of dict
        One ``{key, citation, compared, where, test}`` per marker, in file
        and line order. ``citation`` and ``compared`` are the report's text
        for ``key`` (``report_citation`` and ``compared`` in ``sources.toml``,
        else ``citation`` and ``used``); ``where`` is the marker's place in
        the source and ``test`` the test (or class, or module for
        ``pytestmark``), both kept for the snapshot check only, [-]

    Raises
    ------
    FileNotFoundError
        If ``tests_dir`` has no ``sources.toml``.
    SyntaxError
        If a test file does not parse.
    """
    tests_dir = Path(tests_dir)
    sources = tomllib.loads((tests_dir / "sources.toml").read_text(encoding="utf-8"))
    rows = []
    for path in sorted(tests_dir.rglob("test_*.py")):
        relative = path.relative_to(tests_dir.parent).as_posix()
        tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
        found = []      # (lineno, owner name, marker call)
        for node in tree.body:
            if isinstance(node, ast.Assign) and any(
                    isinstance(t, ast.Name) and t.id == "pytestmark" for t in node.targets):
                doc = ast.get_docstring(tree) or path.stem
                found += [(node.lineno, doc.splitlines()[0], call) for call in _markers_in([node.value])]
            elif isinstance(node, ast.ClassDef):
                found += [(node.lineno, node.name, call) for call in _markers_in(node.decorator_list)]
                for item in node.body:
                    if isinstance(item, (ast.FunctionDef, ast.AsyncFunctionDef)):
                        found += [(item.lineno, item.name, call)
                                  for call in _markers_in(item.decorator_list)]
            elif isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef)):
                found += [(node.lineno, node.name, call) for call in _markers_in(node.decorator_list)]
        for lineno, owner, call in sorted(found, key=lambda f: (f[0], f[2].lineno, f[2].col_offset)):
            key, where = _marker_args(call)
            if key is None:
                key = ast.unparse(call.args[0]) if call.args else "?"
            citation, compared = _report_fields(sources, key)
            rows.append({
                "key": key,
                "citation": citation,
                "compared": compared,
                "where": where,
                "test": f"{relative}::{owner}" if owner.isidentifier() else relative,
            })
    return rows


def snapshot_path():
    """Path of the snapshot module :mod:`simulator.report.validated_checks`.

    Returns
    -------
    pathlib.Path
        The snapshot file next to this module, [-]
    """
    return Path(__file__).resolve().parent / _SNAPSHOT_MODULE


def snapshot_text(checks):
    """Source text of the snapshot module holding ``checks``.

    Parameters
    ----------
    checks : list of dict
        Rows from :func:`collect_published_checks`, [-]

    Returns
    -------
    str
        Python source defining ``CHECKS``, a tuple of dicts, [-]
    """
    body = pprint.pformat(tuple(checks), width=110, sort_dicts=False)
    return (
        '"""Published checks of the test suite, as the report lists them (a data snapshot).\n\n'
        "Made by :func:`simulator.report.validation.write_snapshot` from the\n"
        "``@pytest.mark.published`` markers under ``tests/``, so that an installed copy\n"
        "without ``tests/`` lists them too. ``tests/test_report_end_to_end.py`` fails when\n"
        "this snapshot and the markers differ; after changing a marker, run\n"
        "``python -c \"from simulator.report.validation import write_snapshot; write_snapshot()\"``.\n"
        '"""\n'
        f"CHECKS = {body}\n"
    )


def write_snapshot(tests_dir=None):
    """Regenerate :mod:`simulator.report.validated_checks` from the markers (source checkout).

    Parameters
    ----------
    tests_dir : str or pathlib.Path, optional
        Test folder; default the checkout's ``tests/``, [-]

    Returns
    -------
    pathlib.Path
        The snapshot file written, [-]

    Raises
    ------
    FileNotFoundError
        If no test folder is given and this is not a source checkout.
    """
    from simulator.fileio import atomic_write_text

    tests_dir = tests_dir or source_tree_tests()
    if tests_dir is None:
        raise FileNotFoundError("write_snapshot: no tests/ folder next to the package; "
                                "run it in a source checkout or pass tests_dir.")
    return atomic_write_text(snapshot_path(), snapshot_text(collect_published_checks(tests_dir)))


def published_checks():
    """Published checks of this version's test suite, for the report's Validation section.

    Returns
    -------
    list of dict
        ``{key, citation, compared, where, test}`` per marker, read
        from the snapshot shipped with the package (identical to the markers in
        a checkout whose tests pass), [-]
    """
    from simulator.report.validated_checks import CHECKS

    return [dict(row) for row in CHECKS]
