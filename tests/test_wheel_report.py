"""The built wheel renders a report on its own: templates and the validation snapshot ship inside it.

The wheel is built from a copy of the source tree (so nothing is written into the
checkout), installed with ``--no-deps`` into a fresh virtual environment that sees
the heavy dependencies of the running interpreter through a ``.pth`` file listing its
site-packages folders (``--system-site-packages`` would show the base interpreter's
packages, not those of a virtual environment the tests run in), and run from a folder
outside the checkout. The checks make sure the installed copy, not the editable
checkout, is what ran: ``simulator.__file__`` and the template folder lie inside
the virtual environment, and a marker written into the installed stylesheet shows
up in the report. Measured: about 20 s in all (build 3 s, venv 4 s, report 9 s).
"""
import os
import shutil
import site
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
CASE = ROOT / "cases" / "decomposition_empty_tube.toml"
MARKER = "/* installed-copy-check */"


def _run(command, cwd, timeout=300):
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "PYTHONHOME", "PYTHONSTARTUP")}
    proc = subprocess.run(command, cwd=cwd, capture_output=True, text=True, timeout=timeout, env=env)
    assert proc.returncode == 0, f"{command}: exit {proc.returncode}\n{proc.stdout[-2000:]}\n{proc.stderr[-3000:]}"
    return proc.stdout


@pytest.fixture(scope="module")
def venv_python(tmp_path_factory):
    pytest.importorskip("build")
    work = tmp_path_factory.mktemp("wheel")
    source = work / "src"
    source.mkdir()
    for name in ("pyproject.toml", "README.md", "LICENSE"):
        shutil.copy2(ROOT / name, source / name)
    ignore = shutil.ignore_patterns("__pycache__", "*.pyc", "*.egg-info", "build", "dist")
    for name in ("simulator", "templates"):
        shutil.copytree(ROOT / name, source / name, ignore=ignore)
    _run([sys.executable, "-m", "build", "--wheel", "--outdir", str(work / "dist"), str(source)], cwd=work)
    wheels = sorted((work / "dist").glob("tubesim-*.whl"))
    assert len(wheels) == 1
    _run([sys.executable, "-m", "venv", str(work / "venv")], cwd=work)
    python = work / "venv" / "bin" / "python"
    purelib = _run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                   cwd=work).strip().splitlines()[-1]
    # the running interpreter's own site-packages (its virtual environment's, if any), after the
    # nested environment's: the installed wheel is found first, the heavy dependencies next
    outer = [p for p in site.getsitepackages() + [site.getusersitepackages()] if Path(p).is_dir()]
    (Path(purelib) / "_outer_site_packages.pth").write_text("\n".join(outer) + "\n", encoding="utf-8")
    _run([str(python), "-m", "pip", "install", "--no-deps", "--no-index", "--force-reinstall", str(wheels[0])],
         cwd=work)
    return python, work


def test_installed_copy_is_the_one_imported(venv_python):
    python, work = venv_python
    out = _run([str(python), "-c", "import simulator, simulator.report.html as h, simulator.report.validated_checks "
                "as v; print(simulator.__file__); print(h.template_dir()); print(len(v.CHECKS))"], cwd=work)
    package, templates, checks = out.strip().splitlines()[-3:]
    venv = (work / "venv").resolve()
    assert Path(package).resolve().is_relative_to(venv), package
    assert "site-packages" in package
    assert Path(templates).resolve().is_relative_to(venv) and Path(templates).name == "_templates"
    assert not Path(package).resolve().is_relative_to(ROOT)
    assert int(checks) > 0


def test_report_from_the_wheel(venv_python):
    python, work = venv_python
    templates = Path(_run([str(python), "-c", "from simulator.report.html import template_dir; "
                           "print(template_dir())"], cwd=work).strip().splitlines()[-1])
    css = templates / "report.css"
    css.write_text(css.read_text(encoding="utf-8") + "\n" + MARKER + "\n", encoding="utf-8")
    out = work / "report"
    printed = _run([str(python), "-m", "simulator", "report", str(CASE), "--out", str(out), "--no-pdf"], cwd=work)
    report = out / "report.html"
    assert report.is_file() and str(report) in printed
    assert not (out / "report.pdf").exists()
    document = report.read_text(encoding="utf-8")
    assert MARKER in document                      # rendered with the installed templates
    assert "Gas-phase decomposition in an empty tube bundle" in document
    assert "No published checks listed" not in document     # the validation snapshot shipped
    # isothermal tube without pressure drop: conversion and mole fractions; the flat temperature and
    # pressure plots are left out with a sentence each
    assert document.count("data:image/svg+xml;base64,") >= 2
    assert "No temperature plot" in document and "No pressure plot" in document
