"""Rendering tests of the design-basis report (HTML, PDF, figures).

These are rendering tests: the profiles below come from a small explicit RK4
integration of a cooled first-order A -> B packed tube written in this file,
only so the figures look like real ones. No number in them is checked against
anything; the checks are about the document (sections, figures, pages, escaping,
no fetching), i.e. invariants of the renderer.
"""
import base64
import copy
import functools
import io
import re
import subprocess
import warnings
import xml.etree.ElementTree as ET

import numpy as np
import pytest

from conftest import require_pdf_renderer, require_pdftoppm
from simulator.errors import ReportError
from simulator.report import html as report_html
from simulator.report import pdf as report_pdf
from simulator.report import plots

pypdf = pytest.importorskip("pypdf")

HOSTILE = (
    '<link rel="attachment" href="file:///etc/passwd">'
    '<img src="file:///etc/passwd"></style><style>body{display:none}</style>'
    '<script>alert(1)</script> & "q" $5 {{ 7*7 }}'
)


# ----------------------------------------------------------------------------- profiles
@functools.lru_cache(maxsize=64)
def _cooled_tube(medium_T, y_feed=0.01, n=300):
    """Explicit RK4 of a pseudo-homogeneous cooled tube, first order A -> B.

    Returns z [m], T [K], X [-], P [Pa]. Parameters are round illustrative numbers.
    """
    length, T0, P0 = 3.0, medium_T, 2.0e5
    k0, E, R = 1.0e9, 1.1e5, 8.314462618     # [1/s], [J/mol], [J/mol/K]
    u, dT_ad, St = 1.0, 200.0 * y_feed / 0.01, 2.0    # [m/s], [K], [1/m]

    def rhs(state):
        X, T = state
        k = k0 * np.exp(-E / (R * T))
        dX = k * (1.0 - X) / u
        return np.array([dX, dT_ad * dX - St * (T - medium_T)])

    z = np.linspace(0.0, length, n)
    h = z[1] - z[0]
    out = np.empty((n, 2))
    state = np.array([0.0, T0])
    for i in range(n):
        out[i] = state
        a = rhs(state)
        b = rhs(state + 0.5 * h * a)
        c = rhs(state + 0.5 * h * b)
        d = rhs(state + h * c)
        state = state + h / 6.0 * (a + 2 * b + 2 * c + d)
        state[0] = min(state[0], 1.0)
    X, T = out[:, 0], out[:, 1]
    P = P0 - 1.2e4 * z / length * (T / T0)
    for array in (z, out, P):
        array.flags.writeable = False                          # cached: shared between calls
    return z, T, X, P


def _table(caption, columns, rows):
    return {"caption": caption, "columns": columns, "rows": rows}


def _si_row(field, as_written, si_value, si_unit, key="field"):
    return {key: field, "as_written": as_written, "si_value": si_value, "si_unit": si_unit}


def build_context(title="Oxidation tube T-101, base case", text=None):
    """A full report context as simulator/report/context.py is to build it.

    ``text`` (if given) replaces every free-text field, to test escaping.
    """

    def t(value):
        return value if text is None else text

    def flag(level, label, sentence):
        return {"level": level, "label": t(label), "text": t(sentence)}

    def plot(title, caption, uri):
        return {"title": t(title), "caption": t(caption), "uri": uri}

    z, T, X, P = _cooled_tube(600.0)
    i_hot = int(np.argmax(T))
    target_z = float(np.interp(0.9, X, z))
    Tc = np.linspace(585.0, 615.0, 13)
    hot_c = np.array([_cooled_tube(tc, n=150)[1].max() for tc in Tc])
    yf = np.linspace(0.006, 0.014, 9)
    hot_y = np.array([_cooled_tube(600.0, y_feed=y, n=150)[1].max() for y in yf])
    temperature_uri = plots.profile_temperature_plot(
        z, T, medium_T=600.0, hot_spot=(z[i_hot], T[i_hot]), temperature_limit=700.0,
        target_position=target_z)
    profile_plots = [
        plot("Temperature", "Bed and medium temperature; star: hot spot.", temperature_uri),
        plot("Conversion", "Conversion of A.",
             plots.profile_lines_plot(z, {t("A"): X}, "Conversion [-]")),
        plot("Pressure", "Absolute pressure.",
             plots.profile_lines_plot(z, {"P": P / 1e5}, "Pressure [bar]")),
        plot("Mole fractions", "Gas phase.",
             plots.profile_lines_plot(z, {t("A"): 0.01 * (1 - X), "B": 0.01 * X},
                                      "Mole fraction [-]")),
    ]
    sensitivity_plots = [
        plot("Sensitivity to medium temperature", "Hot spot against medium T.",
             plots.sensitivity_plot(Tc, hot_c, current_x=600.0, critical_x=609.0,
                                    xlabel="Coolant temperature [K]")),
        plot("Sensitivity to feed fraction", "Hot spot against inlet mole fraction.",
             plots.sensitivity_plot(yf, hot_y, current_x=0.01, critical_x=0.0115,
                                    xlabel="Inlet mole fraction of A [-]")),
    ]
    verdict = {"level": "review", "text": t("4 % difference")}
    return {
        "title": title,
        "case_name": t("t101_base"),
        "case_file": t("cases/t101_base.toml"),
        "generated": "2025-01-31 14:05 UTC",
        "tool_version": "0.1.0",
        "summary": {
            "numbers": [
                {"label": t("Outlet conversion"), "value": f"{X[-1]:.3f}", "unit": "-"},
                {"label": "Length to target (X = 0.90)", "value": f"{target_z:.2f}", "unit": "m"},
                {"label": "Hot spot", "value": f"{T[i_hot]:.1f} at {z[i_hot]:.2f}",
                 "unit": "K at m"},
                {"label": "Pressure drop", "value": f"{(P[0] - P[-1]) / 1e3:.1f}", "unit": "kPa"},
                {"label": "Adiabatic temperature rise", "value": "200.0", "unit": "K"},
            ],
            "flags": [
                flag("acceptable", "Hot spot", "The hot spot stays 40 K below the temperature limit."),
                flag("review", "Runaway risk", "Margin to the critical medium T is 9 K."),
                flag("unacceptable", "Constant density", "The ideal design is 12 % off in conversion."),
            ],
        },
        "inputs": {
            "rows": [_si_row(t("tube.length"), t("3 m"), "3", "m"),
                     _si_row("feed.temperature", "326.85 degC", "600", "K"),
                     _si_row("feed.pressure", "2 bar", "2.0e5", "Pa")],
            "species": [{"name": t("A"), "source": t("custom constant cp"), "molar_mass": "28.0",
                         "t_min": "200", "t_max": "1000"},
                        {"name": "N2", "source": "Cantera nasa_gas.yaml", "molar_mass": "28.014",
                         "t_min": "200", "t_max": "6000"}],
            "reactions": [{"equation": t("A => B"), "label": t("R1 = reactions[0]"), "rate_form": t("power law, r = k(T) c_A"),
                           "parameters": [_si_row("k0", t("1e9 1/s"), "1e9", "1/s", key="name"),
                                          _si_row("E", "110 kJ/mol", "1.1e5", "J/mol",
                                                  key="name")]}],
        },
        "profiles": {"plots": profile_plots, "notes": [t("No pressure plot: constant.")]},
        "assumptions": {
            "available": True, "reason_if_not": "",
            "paragraphs": [t("Textbook model: isothermal, constant density, no pressure drop.")],
            "flags": [flag("review", "Isothermal", "Temperature varies by 60 K along the bed.")],
            "tables": [_table(t("Textbook against full model"),
                              ["Quantity", "Textbook", "Full", "Verdict"],
                              [[t("Outlet conversion"), "0.95", "0.91", verdict]])],
            "plots": [],
        },
        "screening": {
            "available": True, "reason_if_not": "",
            "paragraphs": ["Screening of the design case with published criteria."],
            "flags": [],
            "tables": [_table("Dimensionless groups", ["Group", "Value"],
                              [["B", "18.0"], ["N/S", "5.2"]]),
                       _table("Criteria", ["Criterion", "Critical", "Design", "Margin", "Verdict"],
                              [[t("Barkelew (1959)"), "609 K", "600 K", "9 K",
                                {"level": "unacceptable", "text": "inside"}]])],
            "plots": sensitivity_plots,
        },
        "numerics": {
            "available": True, "reason_if_not": "",
            "paragraphs": [],
            "flags": [],
            "tables": [_table("Conservation closure", ["Balance", "Relative error"],
                              [["Element C", "2e-12"], ["Energy", "3e-9"]]),
                       _table("Solver statistics", ["Quantity", "Value"],
                              [["nfev", "812"], ["njev", "3"]])],
            "plots": [],
            "warnings": [t("ergun1952 used at Re_p = 12000 above its stated range.")],
        },
        "validation": [{"key": "closed_form", "source": "closed form", "count": 2,
                        "compared": t("Isothermal first-order conversion")},
                       {"key": "ergun1952", "source": t("S. Ergun, 1952"), "count": 1,
                        "compared": "Ergun pressure gradient"}],
        "cautions": list(report_html.STANDARD_CAUTIONS) + [t("Case-specific caution.")],
        "key_cautions": [report_html.STANDARD_CAUTIONS[0], t("Case-specific caution.")],
        "references": [{"key": "ergun1952",
                        "text": t("S. Ergun, 'Fluid flow through packed columns', 1952.")}],
        "provenance": [{"label": "Case file SHA-256", "value": "ab" * 32},
                       {"label": "Versions",
                        "value": "tubesim 0.1.0, Cantera 3.2.0, scipy 1.17.1, numpy 2.4.6"},
                       {"label": "Command line",
                        "value": t("tubesim report cases/t101_base.toml --out out")}],
    }


# ----------------------------------------------------------------------------- fixtures
@pytest.fixture(scope="module")
def context():
    return build_context()


@pytest.fixture(scope="module")
def rendered(context):
    require_pdf_renderer()
    html = report_html.render_html(context)
    fetcher = report_pdf.data_only_fetcher()
    pdf = report_pdf.render_pdf(html, fetcher=fetcher)
    return html, pdf, fetcher


@pytest.fixture(scope="module")
def hostile_rendered():
    require_pdf_renderer()
    context = build_context(title=HOSTILE, text=HOSTILE)
    html = report_html.render_html(context)
    fetcher = report_pdf.data_only_fetcher()
    pdf = report_pdf.render_pdf(html, fetcher=fetcher)
    return html, pdf, fetcher


def _reader(pdf):
    return pypdf.PdfReader(io.BytesIO(pdf))


def _page_texts(pdf):
    return [re.sub(r"\s+", " ", page.extract_text() or "") for page in _reader(pdf).pages]


# ----------------------------------------------------------------------------- HTML
def test_template_dir_holds_template_and_css():
    folder = report_html.template_dir()
    assert (folder / "report.html.j2").is_file()
    css = (folder / "report.css").read_text()
    assert "</" not in css and "{{" not in css and "{%" not in css


def test_html_is_self_contained(rendered):
    html = rendered[0]
    assert "<link" not in html
    assert re.findall(r'src="([^"]*)"', html) and all(
        s.startswith("data:image/svg+xml;base64,") for s in re.findall(r'src="([^"]*)"', html))
    assert "file:" not in html and "http:" not in html and "https:" not in html
    assert html.count("<style>") == 1 and html.count("</style>") == 1
    assert "string-set: doctitle content()" in html          # the CSS went inline
    assert html.count("data:image/svg+xml;base64,") == 6     # 4 profiles + 2 sensitivity


def test_sections_in_required_order(rendered):
    html = rendered[0]
    positions = [html.index(f'<section id="{key}">') for key, _ in report_html.SECTIONS]
    assert positions == sorted(positions)
    assert [t for _, t in report_html.SECTIONS][:3] == ["Summary", "Inputs", "Axial profiles"]


def test_verdicts_are_words_not_colour_only(rendered):
    html = rendered[0]
    for level in ("acceptable", "review", "unacceptable"):
        badge = rf'class="badge lv-\w+"><span class="sym"[^>]*>.</span>&#160;{level}</span>'
        assert re.search(badge, html), level


def test_hostile_text_is_escaped_in_html(hostile_rendered):
    html = hostile_rendered[0]
    assert "<link" not in html
    assert '<img src="file:' not in html and "<script" not in html
    assert html.count("</style>") == 1 and html.count("<style>") == 1
    assert "&lt;link rel=&#34;attachment&#34;" in html
    assert "{{ 7*7 }}" in html                                 # never evaluated as a template
    css = html.split("<style>")[1].split("</style>")[0]
    assert "passwd" not in css and "alert" not in css          # no case text in CSS


def test_missing_field_raises_report_error(context):
    broken = copy.deepcopy(context)
    del broken["summary"]["numbers"]
    with pytest.raises(ReportError, match=r"numbers"):
        report_html.render_html(broken)
    broken = copy.deepcopy(context)
    del broken["provenance"][0]["value"]
    with pytest.raises(ReportError, match=r"value"):
        report_html.render_html(broken)


def test_unknown_level_raises_report_error(context):
    broken = copy.deepcopy(context)
    broken["summary"]["flags"][0]["level"] = "fine"
    with pytest.raises(ReportError, match=r"verdict level must be one of: acceptable, review, unacceptable"):
        report_html.render_html(broken)


def test_plot_uri_must_be_embedded_data(context):
    broken = copy.deepcopy(context)
    broken["profiles"]["plots"][0]["uri"] = "file:///etc/passwd"
    with pytest.raises(ReportError, match=r"plot uri = 'file:///etc/passwd'"):
        report_html.render_html(broken)


def test_unavailable_block_says_why(context):
    ctx = copy.deepcopy(context)
    ctx["screening"] = {"available": False, "reason_if_not": "no reaction heat in this case"}
    html = report_html.render_html(ctx)
    assert "Not evaluated:</span> no reaction heat in this case" in html


# ----------------------------------------------------------------------------- PDF
def test_pdf_pages_headings_and_running_header(rendered, context):
    pdf = rendered[1]
    texts = _page_texts(pdf)
    assert len(texts) > 1
    whole = " ".join(texts)
    for _, heading in report_html.SECTIONS:
        assert heading in whole, heading
    for number, text in enumerate(texts, start=1):
        assert context["title"] in text
        assert f"Case: {context['case_name']}" in text
        assert "tubesim 0.1.0" in text and context["generated"] in text
        assert f"Page {number} of {len(texts)}" in text


def test_pdf_has_figures(rendered):
    reader = _reader(rendered[1])
    xobjects = 0
    for page in reader.pages:
        resources = page.get("/Resources")
        if resources is not None and "/XObject" in resources:
            xobjects += len(resources["/XObject"])
    assert xobjects >= 6


def test_pdf_fetched_only_data_uris(rendered):
    fetcher = rendered[2]
    assert fetcher.refused == []
    assert fetcher.requested and all(url.startswith("data:") for url in fetcher.requested)


def test_hostile_context_pdf_fetches_and_embeds_nothing(hostile_rendered):
    _, pdf, fetcher = hostile_rendered
    assert fetcher.refused == []
    assert all(url.startswith("data:") for url in fetcher.requested)
    reader = _reader(pdf)
    assert "/Names" not in reader.trailer["/Root"] or \
        "/EmbeddedFiles" not in reader.trailer["/Root"]["/Names"]
    assert reader.attachments == {}
    for page in reader.pages:
        for annot in page.get("/Annots") or []:
            assert annot.get_object().get("/Subtype") != "/FileAttachment"
    assert b"root:x:0:0" not in pdf
    text = " ".join(_page_texts(pdf))
    assert '<link rel="attachment"' in text                    # shown as plain text


@pytest.mark.parametrize("construct", [
    '<link rel="attachment" href="{url}">',
    '<img src="{url}">',
    '<link rel="stylesheet" href="{url}">',
    '<style>@import url("{url}");</style>',
])
def test_fetcher_refuses_local_files(tmp_path, construct):
    require_pdf_renderer()
    secret = tmp_path / "secret.txt"
    secret.write_text("do-not-embed-me")
    html = f"<html><body><p>x</p>{construct.format(url=secret.as_uri())}</body></html>"
    fetcher = report_pdf.data_only_fetcher()
    with pytest.raises(ReportError, match=r"external resource"):
        report_pdf.render_pdf(html, fetcher=fetcher)
    assert fetcher.refused == [secret.as_uri()]


def test_render_pdf_accepts_only_the_data_only_fetcher():
    require_pdf_renderer()
    from weasyprint.urls import URLFetcher

    with pytest.raises(ReportError, match=r"fetcher = URLFetcher: refused"):
        report_pdf.render_pdf("<p>x</p>", fetcher=URLFetcher())


def test_missing_pango_is_one_clear_line(monkeypatch):
    def fail(name):
        raise OSError("cannot load library 'libpango-1.0-0': cannot open shared object file")

    monkeypatch.setattr(report_pdf.importlib, "import_module", fail)
    with pytest.raises(ReportError) as info:
        report_pdf.render_pdf("<p>x</p>")
    message = str(info.value)
    assert "\n" not in message
    assert "apt-get install libpango-1.0-0 libpangoft2-1.0-0" in message


def test_pdftoppm_renders_every_page(rendered, tmp_path):
    require_pdftoppm()
    pdf = rendered[1]
    (tmp_path / "report.pdf").write_bytes(pdf)
    command = ["pdftoppm", "-r", "30", "-png", str(tmp_path / "report.pdf"), str(tmp_path / "page")]
    subprocess.run(command, check=True, timeout=60)
    pngs = sorted(tmp_path.glob("page-*.png"))
    assert len(pngs) == len(_reader(pdf).pages)
    assert all(p.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" for p in pngs)


def test_write_report_writes_atomically(context, tmp_path, monkeypatch):
    out = tmp_path / "out"
    written = report_pdf.write_report(context, out, pdf=False)
    assert set(written) == {"html"} and sorted(p.name for p in out.iterdir()) == ["report.html"]
    # a render failure leaves no partial file behind
    broken = copy.deepcopy(context)
    del broken["cautions"]
    with pytest.raises(ReportError):
        report_pdf.write_report(broken, tmp_path / "other", pdf=False)
    assert not (tmp_path / "other").exists()


# ----------------------------------------------------------------------------- figures
def _svg(uri):
    assert uri.startswith("data:image/svg+xml;base64,")
    return base64.b64decode(uri.split(",", 1)[1]).decode("utf-8")


def test_plot_text_is_escaped_and_literal():
    z = np.linspace(0.0, 1.0, 20)
    short = '</svg><script>x</script> & $5 <img src="file:///x">'
    with warnings.catch_warnings():
        warnings.simplefilter("error")                      # e.g. collapsed axes from a huge label
        svg = _svg(plots.profile_lines_plot(z, {HOSTILE: z, short: z}, "y [-]", title=short))
        long_svg = _svg(plots.sensitivity_plot(z, z, title=HOSTILE, xlabel=HOSTILE))
    for text in (svg, long_svg):
        ET.fromstring(text)                                 # still well-formed XML
        assert "<script" not in text and "<link" not in text and "<img" not in text
    assert "&lt;/svg&gt;&lt;script&gt;x&lt;/script&gt; &amp; $5" in svg   # literal, no mathtext
    assert "\u2026" in long_svg                             # very long case text is cut in figures


def test_plots_are_deterministic_and_black_and_white_readable():
    z, T, X, P = _cooled_tube(600.0, n=120)
    kwargs = {"medium_T": 600.0, "hot_spot": (z[T.argmax()], T.max()),
              "temperature_limit": 800.0, "target_position": 1.0}
    first = plots.profile_temperature_plot(z, T, **kwargs)
    second = plots.profile_temperature_plot(z, T, **kwargs)
    assert first == second
    svg = _svg(first)
    assert "stroke-dasharray" in svg                        # series differ by line style
    assert "Hot spot: " in svg
    assert ("Limit 800.0 K, off the scale above" if plots.limit_is_far(800.0, T) else "Temperature limit") in svg


def test_temperature_plot_in_degC_labels_axis():
    z = np.linspace(0.0, 1.0, 10)
    svg = _svg(plots.profile_temperature_plot(z, np.full(10, 573.15), temperature_unit="degC"))
    assert "Temperature [°C]" in svg
    with pytest.raises(ValueError, match=r"temperature_unit = 'C'"):
        plots.profile_temperature_plot(z, np.full(10, 573.15), temperature_unit="C")


def test_plot_length_mismatch_raises():
    with pytest.raises(ValueError, match=r"plot data T: 3 values; expected 4"):
        plots.profile_temperature_plot([0, 1, 2, 3], [1, 2, 3])
    with pytest.raises(ValueError, match=r"hot_spot_T"):
        plots.sensitivity_plot([1, 2, 3], [1, 2])


def test_bar_plot_hatches_bars_below_reference():
    svg = _svg(plots.bar_plot(["Barkelew", "Semenov"], [0.8, 1.6], "Margin [-]", reference=1.0,
                              reference_label="criterion"))
    assert "Barkelew" in svg and 'id="h' in svg              # a hatch pattern is defined


def test_running_header_text_is_shortened_copy(context):
    ctx = copy.deepcopy(context)
    ctx["title"] = "word " * 60
    html = report_html.render_html(ctx)
    header = re.search(r'<p class="run-title" aria-hidden="true">([^<]*)</p>', html).group(1)
    assert len(header) <= 110 and header.endswith("\u2026")
    assert f'<h1 class="doc-title">{ctx["title"]}</h1>' in html      # full title in the body


# ----------------------------------------------------------------------------- scaled to the data (issue 10, item 19)
def _svg_texts(uri):
    import base64
    import re

    svg = base64.b64decode(uri.split(",", 1)[1]).decode("utf-8")
    return re.findall(r"<text[^>]*>([^<]*)</text>", svg)


def _tick_values(texts):
    values = []
    for text in texts:
        try:
            values.append(float(text.replace("\u2212", "-")))
        except ValueError:
            pass
    return values


def test_temperature_axis_is_scaled_to_the_data_and_a_far_limit_is_an_arrow():
    # Regression: a 27 K hot spot under a 650 K limit was a small bump on an axis stretched to 650 K.
    z = np.linspace(0.0, 4.0, 60)
    T = 420.0 + 27.0 * np.exp(-(((z - 0.3) / 0.3) ** 2))
    texts = _svg_texts(plots.profile_temperature_plot(z, T, medium_T=420.0, hot_spot=(0.3, 447.0),
                                                      temperature_limit=650.0))
    ticks = [v for v in _tick_values(texts) if v > 100.0]          # temperature ticks, not z ticks
    assert ticks and max(ticks) <= 460.0 and min(ticks) >= 400.0
    assert "Limit 650.0 K, off the scale above (arrow)" in texts
    assert "Temperature limit" not in texts


def test_a_limit_near_the_data_is_drawn_as_a_line_on_the_axis():
    z = np.linspace(0.0, 4.0, 60)
    T = 420.0 + 27.0 * np.exp(-(((z - 0.3) / 0.3) ** 2))
    texts = _svg_texts(plots.profile_temperature_plot(z, T, medium_T=420.0, hot_spot=(0.3, 447.0),
                                                      temperature_limit=460.0))
    assert "Temperature limit" in texts
    assert max(v for v in _tick_values(texts) if v > 100.0) >= 460.0


@pytest.mark.parametrize(("limit", "far"), [(650.0, True), (460.0, False), (474.0, False), (475.0, True),
                                            (380.0, True), (400.0, False)])
def test_limit_is_far_when_farther_than_the_data_span(limit, far):
    # data 420..447 K: span 27 K; a limit within 27 K of the data stays on the axis
    assert plots.limit_is_far(limit, np.array([420.0, 447.0, 430.0])) is far


def test_flat_profile_keeps_a_ten_kelvin_reach():
    assert plots.limit_is_far(915.0, np.full(5, 900.0)) is True
    assert plots.limit_is_far(905.0, np.full(5, 900.0)) is False


def test_minor_species_go_to_a_log_panel():
    # Regression: species at a few per cent hugged zero on one linear axis scaled to N2 at 0.8.
    z = np.linspace(0.0, 1.0, 30)
    fractions = {"N2": np.full(30, 0.8), "H2": 0.15 - 0.05 * z, "C2H4": 0.05 * np.exp(-4 * z),
                 "C2H6": 0.05 * (1 - np.exp(-4 * z)), "AR": np.zeros(30)}
    assert plots.split_minor_species(fractions) == (["N2", "H2"], ["C2H4", "C2H6"], ["AR"])
    texts = _svg_texts(plots.mole_fraction_plot(z, fractions))
    assert "Mole fraction [-] (log)" in texts and "Mole fraction [-]" in texts
    assert "AR" not in texts
    one = _svg_texts(plots.mole_fraction_plot(z, {"N2": np.full(30, 0.5), "O2": np.full(30, 0.5)}))
    assert "Mole fraction [-] (log)" not in one


def test_mole_fraction_plot_refuses_when_no_species_is_present():
    with pytest.raises(ValueError, match="no species present"):
        plots.mole_fraction_plot([0.0, 1.0], {"A": [0.0, 0.0]})


def test_design_numbers_that_are_words_print_without_a_unit():
    # Regression (issue 10, item 17): "n/a K" and "n/a kPa" in the summary table.
    from simulator.report.context import _without_units_on_words

    summary = {"numbers": [{"label": "Pressure drop", "value": "n/a", "unit": "kPa"},
                           {"label": "Hot spot: temperature", "value": "446.7", "unit": "K"},
                           {"label": "Length to the target", "value": "not reached", "unit": "m"},
                           {"label": "Hot spot: above the medium", "value": "-3.5", "unit": "K"}],
               "flags": []}
    rows = _without_units_on_words(summary)["numbers"]
    assert [(r["value"], r["unit"]) for r in rows] == [("not available", ""), ("446.7", "K"), ("not reached", ""),
                                                       ("-3.5", "K")]


def test_profile_axis_has_no_offset_text():
    # Regression (issue 10, item 19): 100 bar with a 0.6 kPa drop read "0.004 ... 0.010" under "+9.99e1".
    z = np.linspace(0.0, 8.0, 40)
    texts = _svg_texts(plots.profile_lines_plot(z, {"Absolute pressure": 100.0 - 0.0063 * z / 8.0},
                                                "Pressure [bar]"))
    assert not any("e1" in t or t.startswith("+") for t in texts), texts
    assert any(t.startswith("99.99") for t in texts)
