"""HTML -> PDF with weasyprint, fetching nothing outside the document.

weasyprint's default URL fetcher reads ``file:`` and ``http(s):`` URLs: a
``<link rel="attachment" href="file:///etc/passwd">`` would be embedded in the
PDF. :func:`render_pdf` therefore always passes a fetcher that serves only
``data:`` URIs (our embedded figures) and aborts the render on anything else,
and never passes ``base_url`` (relative URLs then resolve to nothing).

weasyprint is imported inside the functions, so ``import simulator`` and
``tubesim --help`` stay light, and a missing system library (pango) becomes
one :class:`~simulator.errors.ReportError` line saying what to install.
"""
import contextlib
import functools
import importlib
import io
from pathlib import Path

from simulator.errors import ReportError
from simulator.fileio import atomic_write_bytes, atomic_write_text

_PANGO_HINT = (
    "PDF output needs the system libraries pango and pangoft2 ({detail}); install them, "
    "e.g. `apt-get install libpango-1.0-0 libpangoft2-1.0-0`, or skip the PDF with --no-pdf."
)


def _import_weasyprint():
    """Import weasyprint, turning a missing library into one ``ReportError`` line.

    Returns
    -------
    module
        The ``weasyprint`` module, [-]

    Raises
    ------
    ReportError
        If the Python package or a system library it loads is missing.
    """
    try:
        # weasyprint prints a multi-line banner to stdout before re-raising a
        # failed library load; keep the command's output to our one line.
        with contextlib.redirect_stdout(io.StringIO()):
            return importlib.import_module("weasyprint")
    except OSError as err:
        detail = str(err).splitlines()[0] if str(err) else type(err).__name__
        raise ReportError(_PANGO_HINT.format(detail=detail)) from err
    except ImportError as err:
        raise ReportError(
            f"PDF output needs the Python package weasyprint ({err}); install it with "
            f"`pip install weasyprint`, or skip the PDF with --no-pdf."
        ) from err


@functools.lru_cache(maxsize=1)
def _fetcher_class():
    """Build the data-only fetcher class (needs weasyprint, hence built lazily)."""
    _import_weasyprint()
    from weasyprint.urls import FatalURLFetchingError, URLFetcher

    class DataOnlyFetcher(URLFetcher):
        """Serve ``data:`` URIs; refuse ``file:``, ``http(s):`` and everything else.

        ``requested`` lists every URL weasyprint asked for and ``refused`` the
        ones refused (each shortened to 120 characters), for tests and messages.
        """

        def __init__(self, **kwargs):
            super().__init__(allowed_protocols={"data"}, allow_redirects=False, **kwargs)
            self.requested = []
            self.refused = []

        def fetch(self, url, headers=None):
            self.requested.append(str(url)[:120])
            if str(url).lower().startswith("data:"):
                return super().fetch(url, headers)
            self.refused.append(str(url)[:120])
            raise FatalURLFetchingError(f"external resource refused: {str(url)[:80]}")

    return DataOnlyFetcher


def data_only_fetcher():
    """Return a new fetcher instance that allows only ``data:`` URIs.

    Returns
    -------
    weasyprint.urls.URLFetcher
        Fetcher with ``requested`` and ``refused`` lists of URLs, [-]

    Raises
    ------
    ReportError
        If weasyprint or its system libraries are missing.
    """
    return _fetcher_class()()


def render_pdf(html, fetcher=None):
    """Render a self-contained HTML document to PDF bytes.

    Parameters
    ----------
    html : str
        Complete HTML document from :func:`simulator.report.html.render_html`, [-]
    fetcher : weasyprint.urls.URLFetcher, optional
        A fetcher from :func:`data_only_fetcher` (pass one to inspect its
        ``requested`` list afterwards); a new one is made if omitted, [-]

    Returns
    -------
    bytes
        The PDF file content, [-]

    Raises
    ------
    ReportError
        If weasyprint or pango is missing, the document asks for any resource
        other than a ``data:`` URI, or weasyprint fails.
    """
    weasyprint = _import_weasyprint()
    from weasyprint.urls import FatalURLFetchingError

    if fetcher is None:
        fetcher = data_only_fetcher()
    elif not isinstance(fetcher, _fetcher_class()):
        raise ReportError(
            f"render_pdf: fetcher = {type(fetcher).__name__}: refused; only the data-only "
            f"fetcher from simulator.report.pdf.data_only_fetcher() is accepted."
        )
    try:
        # never pass base_url: relative URLs must not resolve to local files
        return weasyprint.HTML(string=html, url_fetcher=fetcher).write_pdf()
    except FatalURLFetchingError as err:
        raise ReportError(
            f"PDF report: the document asked for an external resource ({err}); "
            f"only embedded data: URIs are allowed, nothing was fetched."
        ) from None
    except Exception as err:
        raise ReportError(f"PDF report: weasyprint failed: {type(err).__name__}: {err}") from err


def write_report(context, out_dir, pdf=True, template="report.html.j2"):
    """Render and write ``report.html`` (and ``report.pdf``) atomically.

    Both documents are rendered before either file is written, so a render
    failure leaves the folder as it was.

    Parameters
    ----------
    context : mapping
        Report context (schema in :mod:`simulator.report.html`), [-]
    out_dir : str or pathlib.Path
        Output folder, created if needed, [-]
    pdf : bool
        Also write ``report.pdf``, [-]
    template : str
        Template of :func:`simulator.report.html.render_html`, [-]

    Returns
    -------
    dict of str to pathlib.Path
        ``{"html": path}`` and, with ``pdf``, ``{"pdf": path}``, [-]

    Raises
    ------
    ReportError
        If rendering fails or a file cannot be written.
    """
    from simulator.report.html import render_html

    out_dir = Path(out_dir)
    html = render_html(context, template=template)
    pdf_bytes = render_pdf(html) if pdf else None
    written = {}
    try:
        written["html"] = atomic_write_text(out_dir / "report.html", html)
        if pdf_bytes is not None:
            written["pdf"] = atomic_write_bytes(out_dir / "report.pdf", pdf_bytes)
    except OSError as err:
        raise ReportError(f"report: cannot write to {out_dir}: {err.strerror or err}") from err
    return written
