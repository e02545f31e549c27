"""Tests of wetline.app.render.sheet: the calculation sheet, read back with pypdf."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import io
import re

import numpy as np
import pypdf
import pytest

from wetline.app.render.sheet import ReportError, report_pdf_bytes, write_report
from wetline.core.case import Case, ReportInfo
from wetline.core.force_scope import force_scope
from wetline.core.numbers import format_number
from wetline.core.results import ASSUMPTIONS, CAUTION
from wetline.core.section import Section
from wetline.core.units import display_units
from wetline.core.uplift import REQUIRED_FACTOR_SOURCE, UPLIFT_CAUTION, PartResistance

DATE = datetime.date(2026, 1, 2)
INFO = ReportInfo(project="Inlet works upgrade", job_reference="C-0417",
                  prepared_by="design team")


@pytest.fixture(scope="session")
def sump(template_case):
    """Factory: the sump with its lid weighed and bolted down (per metre run)."""
    def make(holding_down=500.0):
        return (template_case("sump_with_lid", 2.2)
                .with_resistance("lid", PartResistance(1800.0, holding_down))
                .with_report(INFO))

    return make



def pages_text(data):
    """Text of each page, whitespace runs made single spaces."""
    reader = pypdf.PdfReader(io.BytesIO(data))
    return [" ".join(page.extract_text().split()) for page in reader.pages], reader


@pytest.fixture(scope="module")
def sheet(qapp, sump):
    case = sump()
    data = report_pdf_bytes(case, date=DATE)
    texts, reader = pages_text(data)
    return case, data, texts, reader


def test_every_page_has_the_header_with_page_n_of_m(sheet):
    _, _, texts, reader = sheet
    n = len(texts)
    assert n >= 4
    for k, text in enumerate(texts, start=1):
        assert f"Page {k} of {n}" in text, k
        for field in ("Inlet works upgrade", "C-0417", "design team", "2026-01-02",
                      "Pump sump with overhanging lid"):
            assert field in text, (k, field)


def test_pages_are_a4(sheet):
    _, _, _, reader = sheet
    for page in reader.pages:
        w, h = sorted((float(page.mediabox.width), float(page.mediabox.height)))
        assert (w, h) == pytest.approx((595.3, 841.9), abs=1.0)  # A4 in points


def test_totals_are_printed_as_the_tables_format_them(sheet):
    case, _, texts, _ = sheet
    text = " ".join(texts)
    sol = case.solve()
    du = display_units("si")
    scope = force_scope(case.section, du, case.length_unit)
    for value in (sol.fluid_weight, sol.floor_force, sol.support_reaction):
        assert scope.number(value) in text
    assert format_number(du.to_display(sol.max_pressure, "pressure")) in text
    assert format_number(sol.volume) in text
    assert "per m run" in text and "[kN/m]" in text


def test_uplift_verdict_factor_and_its_source(sheet):
    case, _, texts, _ = sheet
    text = " ".join(texts)
    (r,) = case.uplift()
    assert r.verdict == "NOT OK"
    assert f"lid: NOT OK (worst factor {format_number(r.worst_factor)}" in text
    assert format_number(r.worst_factor) in text and format_number(r.factor) in text
    assert REQUIRED_FACTOR_SOURCE in text
    assert UPLIFT_CAUTION in text
    assert "Required factor 1.111" in text


def test_uplift_ok_when_held_down_enough(sump):
    text = " ".join(pages_text(report_pdf_bytes(sump(holding_down=9000.0), date=DATE))[0])
    assert "lid: OK (worst factor" in text and "NOT OK" not in text


def test_inputs_method_and_cautions(sheet):
    case, _, texts, _ = sheet
    text = " ".join(texts)
    assert case.liquid.source in text  # IAPWS-95 ...
    assert "998.21 kg/m3" in text
    assert "9.80665 m/s2" in text
    assert "p = ρ g (h − z)" in text
    assert "Çengel & Cimbala" in text and "Munson" in text
    assert CAUTION in text
    for a in ASSUMPTIONS:
        assert a in text
    # The outline, vertex by vertex, in the display unit.
    assert "x [m] z [m] edge i part" in text


def test_per_edge_results_and_figures(sheet):
    case, _, texts, _ = sheet
    text = " ".join(texts)
    assert "6 Per-edge results" in text and "5 Figures" in text
    assert "Figure 1. Sketch and pressure diagram" in text
    assert "Figure 2. Loads against level" in text
    assert "Level of the free surface [m]" in text  # the chart's axis title
    sol = case.solve()
    for i in range(case.section.n_edges):
        if np.isfinite(sol.centre_of_pressure[i]).all():
            assert format_number(sol.centre_of_pressure[i, 1]) in text


def test_fonts_are_embedded(sheet):
    _, _, _, reader = sheet
    seen = 0
    for page in reader.pages:
        for font in page["/Resources"]["/Font"].values():
            font = font.get_object()
            desc = font.get("/DescendantFonts")
            base = desc[0].get_object() if desc else font
            fd = base["/FontDescriptor"].get_object()
            assert "/FontFile2" in fd or "/FontFile3" in fd, font["/BaseFont"]
            seen += 1
    assert seen > 0


def test_axisymmetric_sheet_lists_hoop_forces(template_case):
    case = template_case("cone_hopper")
    text = " ".join(pages_text(report_pdf_bytes(case, date=DATE))[0])
    assert "hoop start [kN/m]" in text and "N = p r / cos α" in text
    assert "over the full circumference" in text
    assert "No self-weight or holding-down resistance entered" in text


def test_us_units_and_a_section_wider_than_a_metre(template_case):
    case = template_case("open_tank")
    case = case.with_section(case.section.replace(width=2.5))
    text = " ".join(pages_text(report_pdf_bytes(case, units="us", date=DATE))[0])
    assert "lbf" in text and "psi" in text
    assert "for a width of 8.202 ft" in text  # 2.5 m / 0.3048
    assert "per m run" not in text


def test_volume_fill_is_stated(template_case):
    case = template_case("open_tank").with_volume(3.0)
    text = " ".join(pages_text(report_pdf_bytes(case, date=DATE))[0])
    assert "volume given: 3 m3" in text


@pytest.mark.slow
def test_a_long_outline_paginates_with_headers_on_every_page(bowl_case):
    """2,000 vertices: the sheet is made, every edge is listed once, and each
    page of the per-edge table repeats the column header."""
    n = 2000
    case = bowl_case(n)
    reader = pypdf.PdfReader(io.BytesIO(report_pdf_bytes(case, date=DATE)))

    def text(k):  # reading every page back would take most of a minute
        return " ".join(reader.pages[k].extract_text().split())

    total = len(reader.pages)
    start = next(k for k in range(8) if "6 Per-edge results" in text(k))
    assert total - start > 20
    last_row = -1
    for k in sorted({start, start + 1, (start + total) // 2, total - 1}):
        page = text(k)
        assert "edge part x start [m]" in page, k
        assert f"Page {k + 1} of {total}" in page
        rows = [int(v) for v in re.findall(r"(?:^|\s)(\d+) (?:wall|open) ", page)]
        assert rows == list(range(rows[0], rows[0] + len(rows))), "rows out of order"
        assert rows[0] > last_row
        last_row = rows[-1]
        if k == start:
            assert rows[0] == 0
    assert last_row == n - 1


def test_write_report_is_atomic_and_reports_progress(tmp_path, sump):
    out = tmp_path / "sheet.pdf"
    out.write_text("old")
    calls = []
    write_report(sump(), out, date="2026-01-02", progress=lambda *a: calls.append(a))
    assert out.read_bytes().startswith(b"%PDF")
    assert list(tmp_path.iterdir()) == [out]
    assert [c[0] for c in calls] == list(range(calls[0][1]))


@pytest.mark.parametrize("make_path, words", [
    (lambda d: d / "missing" / "x.pdf", "does not exist"),
    (lambda d: d, "is a folder"),
    (lambda d: d / "file.txt" / "x.pdf", "not a folder"),
])
def test_unwritable_path_is_refused_and_leaves_nothing(tmp_path, make_path, words, sump):
    (tmp_path / "file.txt").write_text("x")
    before = sorted(tmp_path.rglob("*"))
    with pytest.raises(ReportError, match=words):
        write_report(sump(), make_path(tmp_path))
    assert sorted(tmp_path.rglob("*")) == before


def test_bad_level_is_refused(sump):
    with pytest.raises(ReportError, match="finite"):
        report_pdf_bytes(sump(), level=float("inf"))
    assert issubclass(ReportError, ValueError)


def test_a_short_table_ending_at_a_page_break_leaves_no_lone_header(qapp, sample):
    # Regression: the buried wet well's first case as one plain case put the
    # one-row resistance table at the foot of page 1; Qt repeated its header
    # on page 2, over the "2 Method" heading.
    from wetline.core.section_file import read_design

    design = read_design(sample("buried_wet_well"))
    case = design.resolve(design.names[0]).as_case()
    texts, _ = pages_text(report_pdf_bytes(case, date=DATE))
    assert sum(t.count("holding-down R") for t in texts) == 1


def test_the_outline_table_echoes_the_coordinates_as_entered(qapp):
    """Defect: the sheet's note says coordinates are echoed as entered, and
    the outer outline's table does so, but the section's own vertex table
    rounded them to the results' 4 figures: a vertex typed at 2.34567 m read
    2.346 m, so a checker could not tell the drawn point from the typed one."""
    pts = [(0.0, 0.0), (2.34567, 0.0), (2.34567, 3.0), (0.0, 3.0)]
    case = Case.default(Section.build(pts, parts=["floor", "wall", "open", "wall"]), 1.5)
    text = " ".join(pages_text(report_pdf_bytes(case, date=DATE))[0])
    inputs = text[text.index("1.1 Section"):text.index("1.2 Liquid")]
    assert "1 2.34567 0 wall" in inputs and "2 2.34567 3 open" in inputs
    # the fill level typed is echoed as typed too; the level used is a result
    text = " ".join(pages_text(report_pdf_bytes(case.with_level(1.23456), date=DATE))[0])
    assert "Requested level 1.23456 m" in text and "Level used 1.235 m" in text


def test_the_sheets_warnings_are_in_its_units(sample):
    """The seawater intake bay (a file in feet) filled to 25 ft is capped at
    its 18 ft spill level; the US sheet's warning read "level 7.62 m is
    above the spill level 5.4864 m" under tables in feet."""
    from wetline.core.section_file import read_section_file

    case = read_section_file(sample("seawater_intake_bay")).with_level(7.62)
    text = " ".join(pages_text(report_pdf_bytes(case, units="us", date=DATE))[0])
    assert "level 25 ft is above the spill level 18 ft; capped at the spill level" in text
