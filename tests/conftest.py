"""Shared fixtures and the ``published`` marker check.

A test that compares against the outside world carries
``@pytest.mark.published("KEY", "where in the source")``; KEY must be in
``tests/sources.toml`` (author, title, year, what is used).
"""
import os
import tomllib
from pathlib import Path

# The suite tests the compiled kernel (and its twin explicitly in test_kernels.py); no background
# compiler processes are started from tests. Subprocesses inherit the setting.
os.environ.setdefault("TUBESIM_KERNEL", "compiled")

import pytest

ROOT = Path(__file__).resolve().parents[1]
SOURCES = tomllib.loads((ROOT / "tests" / "sources.toml").read_text())


def pytest_collection_modifyitems(config, items):
    for item in items:
        for mark in item.iter_markers("published"):
            key = mark.args[0] if mark.args else None
            if key not in SOURCES:
                raise pytest.UsageError(
                    f"{item.nodeid}: published source key {key!r} is not in tests/sources.toml"
                )


@pytest.fixture
def cases_dir():
    return ROOT / "cases"


@pytest.fixture
def write_case(tmp_path):
    """Write TOML text to a case file in a temporary folder and return its path."""

    def _write(text, name="case.toml"):
        path = tmp_path / name
        path.write_text(text)
        return path

    return _write


#: Debian packages for what pip cannot bring: the PDF renderer's pango, the page rasteriser.
PANGO_APT = "apt-get install libpango-1.0-0 libpangoft2-1.0-0"
POPPLER_APT = "apt-get install poppler-utils"


def pdf_renderer_available():
    """True when weasyprint loads with its system libraries (pango)."""
    try:
        import weasyprint  # noqa: F401
    except OSError:
        return False
    return True


def require_pdf_renderer():
    """Skip the calling test when weasyprint cannot load its system libraries (pango), naming the fix.

    ``.ci/run`` installs them, so CI runs every PDF test; a developer machine without them gets a
    skip with the apt line instead of an error.
    """
    try:
        import weasyprint  # noqa: F401
    except OSError as err:                   # the wheel installs, the shared library is missing
        pytest.skip(f"PDF rendering needs the pango library ({err.__class__.__name__}: {str(err)[:80]}); {PANGO_APT}")


def require_pdftoppm():
    """Skip the calling test when poppler's pdftoppm is not installed, naming the fix."""
    import shutil

    if shutil.which("pdftoppm") is None:
        pytest.skip(f"pdftoppm (poppler-utils) is not installed; {POPPLER_APT}")
