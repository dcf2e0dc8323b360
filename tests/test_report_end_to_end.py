"""The design-basis report end to end: demo case -> run -> report.html (and report.pdf).

Every check here is an invariant of the report (sections, verdicts, numbers
equal to summary.json, escaping, nothing fetched, the validation snapshot
equal to the test markers); no value is compared with a published number.
"""
import hashlib
import html as html_lib
import io
import json
import re
import subprocess
import tomllib
from pathlib import Path

import pytest

from conftest import pdf_renderer_available, require_pdf_renderer, require_pdftoppm
from simulator.case.load import load_case
from simulator.cli import main
from simulator.errors import CaseError
from simulator.report import html as report_html
from simulator.report import pdf as report_pdf
from simulator.report.build import write_design_report
from simulator.report.validation import collect_published_checks, internal_notes, published_checks, snapshot_text

ROOT = Path(__file__).resolve().parents[1]
# single-tube demos: a reactor train gets the train report (tests/test_train_run.py); mechanism demos
# ([mechanism]) are left out: report refuses them in one line for now (tests/test_mechanism.py)
DEMOS = sorted(p.name for p in (ROOT / "cases").glob("*.toml")
               if "[[train]]" not in p.read_text() and not p.name.startswith("mechanism_"))
PDF_CASE = "hydrogenation_cooled_packed_bed.toml"     # cooled, exothermic: every section filled
FAST_CASE = "decomposition_empty_tube.toml"          # isothermal: no screening, quick

HOSTILE = ('Tube <b>bold</b> <link rel="attachment" href="file:///etc/passwd">'
           '<img src="file:///etc/passwd"></style><script>alert(1)</script> & {{ 7*7 }}')

pypdf = pytest.importorskip("pypdf")


# ----------------------------------------------------------------------------- helpers
def _visible_text(document):
    body = re.sub(r"<style>.*?</style>", " ", document, flags=re.S)
    body = re.sub(r'src="data:[^"]*"', "", body)
    return re.sub(r"\s+", " ", html_lib.unescape(re.sub(r"<[^>]+>", " ", body)))


def _section(document, key):
    start = document.index(f'<section id="{key}">')
    return document[start:document.index("</section>", start)]


def _design_numbers(document):
    rows = re.findall(r'<tr><th scope="row">(.*?)</th><td class="num">(.*?)</td><td class="unit">(.*?)</td></tr>',
                      _section(document, "summary"))
    return {html_lib.unescape(label): (html_lib.unescape(value), html_lib.unescape(unit))
            for label, value, unit in rows}


def _flags(fragment):
    """[(word, label, text)] of the verdict rows in an HTML fragment."""
    rows = re.findall(r'<tr class="flag-lv-\w+">\s*<td class="flag-level">.*?&#160;(\w+)</span></td>\s*'
                      r'<td class="flag-label">(.*?)</td>\s*<td class="flag-text">(.*?)</td>', fragment, flags=re.S)
    return [(word, html_lib.unescape(label), html_lib.unescape(text)) for word, label, text in rows]


def _page_texts(pdf_bytes):
    reader = pypdf.PdfReader(io.BytesIO(pdf_bytes))
    return [re.sub(r"\s+", " ", page.extract_text() or "") for page in reader.pages]


# ----------------------------------------------------------------------------- fixtures
@pytest.fixture(scope="module")
def reports(tmp_path_factory):
    """{case file name: (html text, out dir, timings)} for every demo case; PDF for PDF_CASE only
    (when the PDF renderer's system libraries are there; the PDF tests skip otherwise)."""
    out = {}
    for name in DEMOS:
        folder = tmp_path_factory.mktemp(name.removesuffix(".toml"))
        timings = {}
        written = write_design_report(ROOT / "cases" / name, folder, pdf=(name == PDF_CASE and pdf_renderer_available()),
                                      command_line=f"tubesim report cases/{name} --out out", timings=timings)
        assert set(written) == ({"html", "pdf"} if name == PDF_CASE and pdf_renderer_available() else {"html"})
        out[name] = (written["html"].read_text(encoding="utf-8"), folder, timings)
    return out


@pytest.fixture(scope="module")
def hostile(tmp_path_factory):
    """A real case file whose title and description are hostile markup, through the whole pipeline."""
    folder = tmp_path_factory.mktemp("hostile")
    raw = (ROOT / "cases" / FAST_CASE).read_text(encoding="utf-8")
    raw = re.sub(r'^title = ".*"$', "title = " + json.dumps(HOSTILE), raw, count=1, flags=re.M)
    raw = raw.replace("[thermo]", "description = " + json.dumps(HOSTILE) + "\n\n[thermo]", 1)
    case = folder / "hostile.toml"
    case.write_text(raw, encoding="utf-8")
    assert load_case(case).title == HOSTILE
    fetchers = []
    real = report_pdf.data_only_fetcher

    def recording():
        fetcher = real()
        fetchers.append(fetcher)
        return fetcher

    with pytest.MonkeyPatch.context() as mp:
        mp.setattr(report_pdf, "data_only_fetcher", recording)
        require_pdf_renderer()
        written = write_design_report(case, folder / "out", pdf=True)
    return written["html"].read_text(encoding="utf-8"), written["pdf"].read_bytes(), fetchers


# ----------------------------------------------------------------------------- every demo case
def test_demo_cases_found():
    assert {"decomposition_empty_tube.toml", "hydrogenation_cooled_packed_bed.toml",
            "dehydrogenation_heated_tube.toml", "froment1967_oxylene_packed_tube.toml"} <= set(DEMOS)


@pytest.mark.parametrize("name", DEMOS)
def test_sections_in_order_with_their_headings(reports, name):
    document = reports[name][0]
    positions = [document.index(f'<section id="{key}">') for key, _ in report_html.SECTIONS]
    assert positions == sorted(positions)
    headings = re.findall(r"<h2[^>]*>(.*?)</h2>", document)
    assert headings == [title for _, title in report_html.SECTIONS]
    assert [t for _, t in report_html.SECTIONS] == [
        "Summary", "Inputs", "Axial profiles", "Assumption check", "Runaway screening",
        "Numerics and conservation", "Cautions", "References", "Provenance",
        "Appendix: validation against published sources"]


@pytest.mark.parametrize("name", DEMOS)
def test_design_numbers_and_verdicts_in_words(reports, name):
    document = reports[name][0]
    case = load_case(ROOT / "cases" / name)
    numbers = _design_numbers(document)
    key = case.design.key_species
    assert f"Outlet conversion of {key}" in numbers
    if case.heat.mode == "isothermal":          # no hot spot, position or rise for a tube held at one T
        assert "Gas temperature (isothermal by construction)" in numbers
        assert not any(label.startswith(("Hot spot", "Highest temperature")) for label in numbers)
    else:
        assert any(label.startswith(("Hot spot: temperature", "Highest temperature")) for label in numbers)
    if case.pressure_drop.model == "none":
        assert numbers['Pressure drop (pressure_drop.model = "none")'][0] == "not modelled"
    assert any(label.startswith("Pressure drop") for label in numbers)
    assert any(label.startswith("Adiabatic temperature rise") for label in numbers)
    if case.design.target_conversion == case.design.target_conversion:      # a target is given
        for label in ("Length to the target", "Catalyst mass to the target"):
            assert label in numbers
        assert any(label.startswith("Reactor volume to the target") for label in numbers)
    for label, (value, unit) in numbers.items():
        assert value.strip(), label
    flags = _flags(_section(document, "summary"))
    labels = [label for _, label, _ in flags]
    for required in ("Hot spot", "Runaway risk", "Isothermal", "Isobaric", "Ideal gas", "Constant moles"):
        assert required in labels, required
    for word, label, text in flags:
        assert word in ("acceptable", "review", "unacceptable"), (label, word)
        assert text.endswith("."), (label, text)            # one verdict sentence


@pytest.mark.parametrize("name", DEMOS)
def test_no_nan_or_none_in_the_text(reports, name):
    text = _visible_text(reports[name][0])
    assert not re.search(r"\bnan\b", text, flags=re.I), re.search(r".{60}\bnan\b.{20}", text, flags=re.I)
    assert not re.search(r"\bNone\b", text), re.search(r".{60}\bNone\b.{20}", text)
    assert "{{" not in text.replace("{{ 7*7 }}", "")


@pytest.mark.parametrize("name", DEMOS)
def test_hot_spot_equals_summary_json(reports, name, tmp_path, capsys):
    assert main(["run", str(ROOT / "cases" / name), "--out", str(tmp_path)]) in (0, 1)
    capsys.readouterr()
    summary = json.loads((tmp_path / "summary.json").read_text())
    numbers = _design_numbers(reports[name][0])
    if load_case(ROOT / "cases" / name).heat.mode == "isothermal":
        value, unit = numbers["Gas temperature (isothermal by construction)"]
        assert unit == "K" and float(value) == pytest.approx(summary["outlet"]["temperature_K"], abs=0.05)
        return
    label = "Hot spot: temperature" if "Hot spot: temperature" in numbers else "Highest temperature"
    value, unit = numbers[label]
    assert unit == "K"
    assert float(value) == pytest.approx(summary["hot_spot"]["temperature_K"], abs=0.05 + 1e-9)
    position = next(v for k, v in numbers.items() if k.endswith(": position"))[0]
    assert float(position) == pytest.approx(summary["hot_spot"]["position_m"], rel=5e-3, abs=1e-9)
    outlet = numbers[f"Outlet conversion of {summary['key_species']}"][0]
    assert float(outlet) == pytest.approx(summary["outlet"]["conversion"], abs=5e-5 + 1e-12)


@pytest.mark.parametrize("name", DEMOS)
def test_inputs_show_every_case_value_as_written_and_in_si(reports, name):
    from simulator.report.context import _walk

    case = load_case(ROOT / "cases" / name)
    inputs = _section(reports[name][0], "inputs")
    rows = re.findall(r'<tr><td class="mono">(.*?)</td><td>(.*?)</td><td class="num">(.*?)</td>'
                      r'<td class="nowrap">(.*?)</td></tr>', inputs)
    table = {html_lib.unescape(f): (html_lib.unescape(w), v, html_lib.unescape(u)) for f, w, v, u in rows}
    assert table
    for path, value in _walk("", case.raw, skip=("reactions",)):
        assert path in table, path
        if isinstance(value, str):
            assert table[path][0] == value, path
        elif isinstance(value, list):       # a list of names (design.products), as written in TOML
            assert table[path][0] == "[" + ", ".join(f'"{v}"' for v in value) + "]", path
        elif not isinstance(value, bool):
            assert float(table[path][0]) == value, path
            assert float(table[path][1]) == pytest.approx(value, rel=1e-5), path
    assert float(table["feed.temperature"][1]) == pytest.approx(case.feed.temperature, rel=1e-6)
    assert table["feed.temperature"][2] == "K"
    assert float(table["feed.pressure"][1]) == pytest.approx(case.feed.pressure, rel=1e-6)
    assert table["feed.pressure"][2] == "Pa"
    assert float(table["tube.length"][1]) == pytest.approx(case.tube.length, rel=1e-6)
    # every reaction: its equation and its pre-exponential factor in SI, equal to the loaded case
    pre = re.findall(r'<td class="mono">pre_exponential</td><td>.*?</td><td class="num">(.*?)</td>', inputs)
    assert len(pre) == len(case.reactions)
    for reaction, si in zip(case.reactions, pre):
        assert html_lib.escape(reaction.equation, quote=False) in inputs
        assert float(si) == pytest.approx(reaction.pre_exponential, rel=1e-5)
    for species in case.species:
        assert f'<td class="mono">{species}</td>' in inputs


@pytest.mark.parametrize("name", DEMOS)
def test_flat_profiles_are_left_out_and_the_text_says_why(reports, name):
    # Regression (issue 10, item 19): an isothermal tube got a flat temperature plot with a "hot spot" at
    # the inlet, and a tube without pressure drop a flat pressure plot.
    case = load_case(ROOT / "cases" / name)
    section = _section(reports[name][0], "profiles")
    titles = re.findall(r'<span class="fig-title">(.*?)\.</span>', section)
    text = _visible_text(section)
    numerics = _visible_text(_section(reports[name][0], "numerics"))
    if case.heat.mode == "isothermal":
        assert "Temperature" not in titles and "No temperature plot: the tube is isothermal" in text
        assert "Hot spot" not in text
        assert "Hot spot located by" not in numerics and "No hot spot: the gas is held at the feed" in numerics
    else:
        assert "Temperature" in titles
    if case.pressure_drop.model == "none":
        assert "Pressure" not in titles and "No pressure plot: no pressure-drop model" in text
    else:
        assert {"Pressure", "Pressure drop"} & set(titles)
    assert "Mole fractions" in titles and f"Conversion of {case.design.key_species}" in titles


@pytest.mark.parametrize("name", DEMOS)
def test_assumption_levels_in_the_report_are_the_json_levels(reports, name):
    # one rule: the report shows the level assumptions.json carries (simulator.verdicts)
    from simulator.assumptions import check_assumptions

    labels = {"isothermal": "Isothermal", "isobaric": "Isobaric", "ideal_gas": "Ideal gas",
              "constant_moles": "Constant moles", "one_dimensional": "One-dimensional tube"}
    flags = {label: word for word, label, _ in _flags(_section(reports[name][0], "summary"))}
    report = check_assumptions(load_case(ROOT / "cases" / name))
    for key, entry in report["assumptions"].items():
        assert flags[labels[key]] == entry["level"], key


@pytest.mark.parametrize("name", DEMOS)
def test_screening_section_filled_or_says_why(reports, name):
    case = load_case(ROOT / "cases" / name)
    section = _section(reports[name][0], "screening")
    summary_flags = {label: (word, text) for word, label, text in _flags(_section(reports[name][0], "summary"))}
    if "Not evaluated:" in section:
        reason = _visible_text(section).split("Not evaluated:")[1]
        assert ("cooled through its wall" in reason and not case.heat.exchange) or \
            "no exothermic path" in reason
        assert summary_flags["Runaway risk"][1].startswith(("Not applicable", "Not screened"))
    else:
        assert case.heat.exchange
        text = _visible_text(section)
        for caption in ("Dimensionless groups", "Runaway criteria at the operating point",
                        "Critical values and margins", "Normalized sensitivity"):
            assert caption in text
        assert "Hot spot against medium temperature" in text and "Hot spot against feed fraction" in text
        assert section.count("data:image/svg+xml;base64,") == 2
        assert summary_flags["Runaway risk"][0] in ("acceptable", "review", "unacceptable")


@pytest.mark.parametrize("name", DEMOS)
def test_references_provenance_and_validation(reports, name):
    document = reports[name][0]
    refs = re.findall(r'<td class="ref-key">\[(.*?)\]</td>', _section(document, "references"))
    from simulator.solve.integrate import simulate

    for key in simulate(load_case(ROOT / "cases" / name)).references:
        assert key in refs, key
    provenance = _visible_text(_section(document, "provenance"))
    digest = hashlib.sha256((ROOT / "cases" / name).read_bytes()).hexdigest()
    assert digest in provenance
    for label in ("tubesim", "Cantera", "scipy", "numpy", "Generated (UTC)", "Command line"):
        assert label in provenance
    assert f"tubesim report cases/{name} --out out" in provenance
    validation = _visible_text(_section(document, "validation"))
    for check in published_checks():
        assert f"[{check['key']}] {check['citation']}" in validation, check["key"]
        assert check["compared"] in validation, check["key"]


@pytest.mark.parametrize("name", DEMOS)
def test_validation_appendix_names_sources_and_comparisons_not_internal_notes(reports, name):
    # Regression (issue 10, item 18): the table printed "from memory", "check-values 2a", the path of
    # a reference note and test names ("Lhhw rate equals the hand formula"), and stood before the
    # cautions. It is now an appendix after the provenance with one row per source.
    document = reports[name][0]
    validation = _visible_text(_section(document, "validation"))
    assert internal_notes(validation) == [], internal_notes(validation)
    for check in published_checks():
        assert check["test"].split("::")[-1] not in validation
    assert "Lhhw rate equals" not in validation and "runaway.md" not in validation
    rows = re.findall(r"<tr><td><span class=\"ref-key\">\[(.*?)\]</span>", _section(document, "validation"))
    assert rows == list(dict.fromkeys(c["key"] for c in published_checks()))   # one row per source
    assert document.index('<section id="provenance">') < document.index('<section id="validation"')


def test_report_text_of_every_source_is_free_of_internal_notes():
    # Every source a marker names prints a published citation and what was compared; a new source key
    # without report_citation/compared in tests/sources.toml falls back to citation/used and fails here
    # if those carry notes ("from memory", file paths, test names).
    for check in published_checks():
        assert check["compared"], check["key"]
        assert internal_notes(check["citation"]) == [], (check["key"], check["citation"])
        assert internal_notes(check["compared"]) == [], (check["key"], check["compared"])


@pytest.mark.parametrize("name", DEMOS)
def test_key_cautions_stand_right_after_the_summary_verdicts(reports, name):
    # Regression (issue 10, item 18): the cautions stood only at the end, pages after the verdicts.
    document = reports[name][0]
    summary = _section(document, "summary")
    verdicts, cautions = summary.index("<h3>Verdicts</h3>"), summary.index("<h3>Cautions</h3>")
    assert verdicts < cautions
    key = _visible_text(summary[cautions:])
    assert _visible_text(report_html.STANDARD_CAUTIONS[0]) in key
    full = _visible_text(_section(document, "cautions"))
    for extra in re.findall(r"<li>(.*?)</li>", summary[cautions:], flags=re.S):
        assert _visible_text(extra).strip() in full          # the full list keeps every caution


def test_internal_notes_finds_what_the_report_must_not_print():
    assert internal_notes("eq. 5.21 from memory") == ["from memory"]
    assert internal_notes("hand value of check-values 2b") == ["check-values"]
    assert internal_notes("(shared/reference/runaway.md, section 2)") == [".md"]
    assert internal_notes("S. Ergun, 'Fluid flow through packed columns', Chem. Eng. Prog. 48(2), 89-94, 1952") == []


def test_validation_snapshot_equals_the_test_markers():
    # The installed wheel ships the snapshot, not tests/: it must equal the markers of this suite.
    # If this fails after a marker was added or changed, regenerate:
    #   python -c "from simulator.report.validation import write_snapshot; write_snapshot()"
    live = collect_published_checks(ROOT / "tests")
    assert live == published_checks()
    assert snapshot_text(live) == (ROOT / "simulator" / "report" / "validated_checks.py").read_text()
    sources = tomllib.loads((ROOT / "tests" / "sources.toml").read_text())
    assert live and all(row["key"] in sources for row in live)
    for row in live:
        entry = sources[row["key"]]
        assert row["citation"] == entry.get("report_citation", entry["citation"])
        assert row["compared"] == entry.get("compared", entry["used"])


def test_marker_parser_reads_decorators_classes_and_pytestmark(tmp_path):
    (tmp_path / "test_x.py").write_text(
        '"""Module about things."""\nimport pytest\n'
        'pytestmark = pytest.mark.published("b2001", "whole module")\n\n'
        '@pytest.mark.slow\n@pytest.mark.published("a2000", "Table 3, " "run 2")\n'
        'def test_pressure_at_0_5_m():\n    pass\n\n'
        'class TestThing:\n    @pytest.mark.published(key="a2000", where="eq. 4")\n'
        '    def test_inner(self):\n        pass\n\n'
        'def test_unmarked():\n    pass\n')
    (tmp_path / "sources.toml").write_text('[a2000]\ncitation = "A. Author, Title, 2000 (from memory)"\nused = "x"\n'
                                           'report_citation = "A. Author, Title, 2000"\n'
                                           'compared = "pressure against the printed table"\n'
                                           '[b2001]\ncitation = "B. Author, Other, 2001"\nused = "y"\n')
    rows = collect_published_checks(tmp_path)
    assert [(r["key"], r["where"]) for r in rows] == [("b2001", "whole module"), ("a2000", "Table 3, run 2"),
                                                      ("a2000", "eq. 4")]
    assert (rows[0]["citation"], rows[0]["compared"]) == ("B. Author, Other, 2001", "y")   # fallback
    assert (rows[1]["citation"], rows[1]["compared"]) == ("A. Author, Title, 2000",
                                                          "pressure against the printed table")
    assert rows[0]["test"] == f"{tmp_path.name}/test_x.py"
    assert rows[2]["test"] == "tmp_path_name/test_x.py::test_inner".replace("tmp_path_name", tmp_path.name)


# ----------------------------------------------------------------------------- PDF
def test_pdf_pages_headings_running_header_and_figures(reports):
    require_pdf_renderer()
    document, folder, timings = reports[PDF_CASE]
    pdf_bytes = (folder / "report.pdf").read_bytes()
    texts = _page_texts(pdf_bytes)
    assert len(texts) >= 5
    whole = " ".join(texts)
    numbered = [title for key, title in report_html.SECTIONS if key not in report_html.APPENDICES]
    headings = [f"{i}. {title}" for i, title in enumerate(numbered, start=1)]
    headings += [f"A. {title}" for key, title in report_html.SECTIONS if key in report_html.APPENDICES]
    positions = [whole.index(h) for h in headings if h in whole]
    assert len(positions) == len(report_html.SECTIONS) and positions == sorted(positions)
    case = load_case(ROOT / "cases" / PDF_CASE)
    generated = re.search(r'<td class="run-date">(.*?)</td>', document).group(1)
    version = re.search(r'<span class="run-version">(.*?)</span>', document).group(1)
    for number, text in enumerate(texts, start=1):
        assert case.title in text
        assert f"Case: {PDF_CASE.removesuffix('.toml')}" in text
        assert f"tubesim {version}" in text and generated in text
        assert f"Page {number} of {len(texts)}" in text
    reader = pypdf.PdfReader(io.BytesIO(pdf_bytes))
    images = 0
    for page in reader.pages:
        resources = page.get("/Resources")
        if resources is not None and "/XObject" in resources:
            images += len(resources["/XObject"])
    assert images >= 6                # 4 profiles + 2 sensitivity plots
    # the step timings are recorded (speed itself is measured by bench/bench_report.py, not by a test)
    assert all(timings[k] >= 0.0 for k in ("context", "render", "context_cpu", "render_cpu"))


def test_pdf_pages_render_to_png(reports, tmp_path):
    require_pdf_renderer()
    require_pdftoppm()
    pdf = reports[PDF_CASE][1] / "report.pdf"
    subprocess.run(["pdftoppm", "-r", "30", "-png", str(pdf), str(tmp_path / "page")], check=True, timeout=120)
    pngs = sorted(tmp_path.glob("page-*.png"))
    assert len(pngs) == len(pypdf.PdfReader(str(pdf)).pages)
    assert all(p.stat().st_size > 1000 and p.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" for p in pngs)


# ----------------------------------------------------------------------------- hostile case text
def test_hostile_case_text_is_escaped_and_nothing_is_fetched(hostile):
    document, pdf_bytes, fetchers = hostile
    assert "<link" not in document and "<script" not in document and "<b>bold</b>" not in document
    assert document.count("<style>") == 1 and document.count("</style>") == 1
    assert all(src.startswith("data:image/") for src in re.findall(r'src="([^"]*)"', document))
    assert "&lt;link rel=&#34;attachment&#34; href=&#34;file:///etc/passwd&#34;&gt;" in document
    assert "{{ 7*7 }}" in document and ">49<" not in document
    css = document.split("<style>")[1].split("</style>")[0]
    assert "passwd" not in css and "alert" not in css
    assert len(fetchers) == 1
    assert fetchers[0].refused == []
    assert fetchers[0].requested and all(url.startswith("data:") for url in fetchers[0].requested)
    reader = pypdf.PdfReader(io.BytesIO(pdf_bytes))
    assert reader.attachments == {}
    for page in reader.pages:
        for annot in page.get("/Annots") or []:
            assert annot.get_object().get("/Subtype") != "/FileAttachment"
    assert b"root:x:0:0" not in pdf_bytes
    text = " ".join(_page_texts(pdf_bytes))
    assert '<link rel="attachment"' in text                      # shown as text, not obeyed


# ----------------------------------------------------------------------------- a stopped run
def test_run_stopped_at_the_temperature_limit_is_reported_as_unacceptable(tmp_path):
    # The cooled demo bed made adiabatic with a low limit: the run stops at the limit (a design
    # event, not an error) and the report must say so in its verdicts, in words.
    raw = (ROOT / "cases" / "hydrogenation_cooled_packed_bed.toml").read_text(encoding="utf-8")
    raw = re.sub(r'^overall_coefficient = .*$', "", raw, flags=re.M)
    raw = re.sub(r'^\[heat\.medium\]\n(?:[^\[\n].*\n|\n)*', "", raw, flags=re.M)
    raw = raw.replace('mode = "exchange"', 'mode = "adiabatic"')
    raw = raw.replace('temperature_limit = "650 K"', 'temperature_limit = "500 K"')
    case = tmp_path / "stopped.toml"
    case.write_text(raw, encoding="utf-8")
    written = write_design_report(case, tmp_path / "out", pdf=False)
    document = written["html"].read_text(encoding="utf-8")
    flags = {label: (word, text) for word, label, text in _flags(_section(document, "summary"))}
    assert flags["Run"][0] == "unacceptable" and "temperature limit 500 K" in flags["Run"][1]
    assert flags["Hot spot"][0] == "unacceptable" and "true maximum is higher" in flags["Hot spot"][1]
    assert flags["Runaway risk"][0] == "review" and "Not screened" in flags["Runaway risk"][1]
    assert flags["Target conversion"][0] == "review"
    assert "Hot spot: above the feed" in _design_numbers(document)
    assert not re.search(r"\bnan\b", _visible_text(document), flags=re.I)


# ----------------------------------------------------------------------------- command line and errors
def test_cli_report_no_pdf_writes_html_only(tmp_path, capsys):
    out = tmp_path / "out"
    assert main(["report", str(ROOT / "cases" / FAST_CASE), "--out", str(out), "--no-pdf"]) == 0
    assert sorted(p.name for p in out.iterdir()) == ["report.html"]
    printed = capsys.readouterr().out
    assert str(out / "report.html") in printed and "report.pdf" not in printed
    assert "Not evaluated:" in (out / "report.html").read_text(encoding="utf-8")


def test_missing_case_file_is_a_case_error(tmp_path):
    with pytest.raises(CaseError, match=r"cannot read the case file"):
        write_design_report(tmp_path / "missing.toml", tmp_path / "out", pdf=False)
    assert not (tmp_path / "out").exists()


def test_sweep_figures_of_the_same_case_enter_the_report(tmp_path):
    from pathlib import Path

    from simulator.cli import main

    case = Path(__file__).parents[1] / "cases" / "froment1967_oxylene_packed_tube.toml"
    out = tmp_path / "out"
    assert main(["sweep", str(case), "--vary", "feed.mole_fractions.OX=0.014..0.019 in 4",
                 "--vary", "heat.medium.temperature=620 K..635 K in 3", "--out", str(out)]) == 0
    assert main(["report", str(case), "--out", str(out), "--no-pdf"]) == 0
    html = (out / "report.html").read_text()
    assert "Runaway map from the sweep" in html
    # a report of another case in the same folder must not pick the map up
    other = Path(__file__).parents[1] / "cases" / "hydrogenation_cooled_packed_bed.toml"
    assert main(["report", str(other), "--out", str(out), "--no-pdf"]) == 0
    assert "Runaway map from the sweep" not in (out / "report.html").read_text()
