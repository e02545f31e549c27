"""The calculation sheet a checking engineer signs (issue 11), read back
from the PDF with pypdf: document control and revision history, a sketch
with vertex numbers and dimensions, text no smaller than 7 pt, one
precision policy, every load case and the envelope of a design."""

import datetime
import io
import math
import re

import numpy as np
import pypdf
import pytest

from wetline.app.render.sheet import ReportError, report_pdf_bytes
from wetline.core.case import Case, ReportInfo, Revision
from wetline.core.liquids import fresh_water
from wetline.core.load_cases import Design, LoadCase, envelope
from wetline.core.numbers import format_number, using_figures
from wetline.core.structure import Ground, Groundwater, Structure, walls_of_thickness
from wetline.core.templates import TEMPLATES

DATE = datetime.date(2026, 1, 2)
CONTROL = ReportInfo(
    project="Inlet works upgrade", job_reference="C-0417", prepared_by="A. Designer",
    calculation_reference="C-0417-HYD-003", checked_by="C. Checker", approved_by="D. Lead",
    revisions=(Revision("A", "2026-01-12", "first issue", "AD", "CC", "DL"),
               Revision("B", "2026-02-03", "lid level to the new survey", "AD", "CC", "DL")))


def _mul(m1, m2):
    a1, b1, c1, d1, e1, f1 = m1
    a2, b2, c2, d2, e2, f2 = m2
    return (a1 * a2 + b1 * c2, a1 * b2 + b1 * d2, c1 * a2 + d1 * c2, c1 * b2 + d1 * d2,
            e1 * a2 + f1 * c2 + e2, e1 * b2 + f1 * d2 + f2)


def text_runs(page):
    """(text, size at print size [pt]) of every piece of text on a page."""
    runs = []

    def visit(text, cm, tm, font, size):
        if text.strip():
            a, b, c, d, _, _ = _mul([float(v) for v in tm], [float(v) for v in cm])
            runs.append((" ".join(text.split()), size * math.sqrt(abs(a * d - b * c))))

    page.extract_text(visitor_text=visit)
    return runs


def read(data):
    reader = pypdf.PdfReader(io.BytesIO(data))
    return reader, [" ".join(p.extract_text().split()) for p in reader.pages]


@pytest.fixture(scope="module")
def chamber(qapp, template_case):
    case = template_case("chamber_under_riser", 2.688).with_report(CONTROL)
    return case, *read(report_pdf_bytes(case, date=DATE))


def _figure_page(texts):
    return next(k for k, t in enumerate(texts) if "5 Figures" in t)


def test_document_control_is_on_every_page_and_in_full_up_front(chamber):
    _, _, texts = chamber
    for k, text in enumerate(texts, start=1):
        for field in ("C-0417-HYD-003", "A. Designer", "C. Checker", "D. Lead",
                      f"Page {k} of {len(texts)}"):
            assert field in text, (k, field)
        assert re.search(r"REVISION\s+B\b|Revision\s+B\b", text, re.I), k
    first = texts[0]
    assert "Document control" in first and "Revision history" in first
    for row in ("A 2026-01-12 first issue AD CC DL",
                "B 2026-02-03 lid level to the new survey AD CC DL"):
        assert row in first


def test_the_sketch_has_vertex_numbers_and_dimensions(chamber):
    case, reader, texts = chamber
    k = _figure_page(texts)
    runs = {t for t, _ in text_runs(reader.pages[k])}
    n = case.section.n_edges
    # Every vertex and edge number of the tables is written on the sketch.
    assert {str(i) for i in range(n)} <= runs
    page = texts[k]
    s, sol = case.section, case.solve()
    width = format_number(float(np.ptp(s.outline[:, 0])))
    height = format_number(s.z_max - s.z_min)
    # Overall width and height (4 m and 5 m) and the levels that matter.
    for dim in (f"{width} m", f"{height} m", "floor 0 m", "free surface 2.688 m",
                f"spill level {height} m"):
        assert dim in page, dim
    # Each part's total once; the runs named by their edges.
    roof = format_number(sol.parts["roof"].fz / 1000)
    assert page.count(f"roof: total uplift {roof} kN/m") == 1
    assert f"floor: {format_number(sol.floor_force / 1000)} kN/m" in page
    assert not re.search(r"wall: \d", page)  # no run value reads as the part's


def test_no_text_on_the_sheet_is_smaller_than_7_pt(chamber):
    # The figures none at all; the text pages none but the subscripts of the
    # method's formulas (t with a subscript a ...).
    _, reader, texts = chamber
    figure = _figure_page(texts)
    for k, page in enumerate(reader.pages):
        small = [(t, round(s, 2)) for t, s in text_runs(page) if s < 7.0 - 1e-6
                 and (k in (figure, figure + 1) or len(t) > 2)]
        assert not small, (k + 1, small[:5])


def test_the_figure_is_at_least_half_a_page_wide(chamber):
    # The figure's frame spans the body of the page: measured as the spread
    # of its text (the level names at its left, the legend at its right).
    _, reader, texts = chamber
    page = reader.pages[_figure_page(texts)]
    xs = []

    def visit(text, cm, tm, font, size):
        if text.strip() and size:
            xs.append(_mul([float(v) for v in tm], [float(v) for v in cm])[4])

    page.extract_text(visitor_text=visit)
    width = float(page.mediabox.width)
    assert max(xs) - min(xs) > 0.5 * width


@pytest.mark.parametrize("n", [3, 4, 5])
def test_no_number_has_more_figures_than_the_policy(qapp, template_case, n):
    # Results are written to n significant figures; inputs echoed with the
    # figures that identify them (density, gravity), coordinates as entered.
    case = template_case("sump_with_lid", 2.2).with_report(
        ReportInfo(significant_figures=n, calculation_reference="S-1"))
    _, texts = read(report_pdf_bytes(case, date=DATE))
    echoes = {format_number(case.liquid.density, 5), format_number(case.gravity, 7)}
    body = " ".join(texts)
    body = re.sub(r"Page \d+ of \d+|page \d+ of \d+|\d{4}-\d\d-\d\d|Wetline \S+", " ", body)
    too_many = []
    for token in re.findall(r"(?<![\w.])-?\d+\.\d+(?:e[+-]?\d+)?", body):
        if token.lstrip("-") in echoes:
            continue
        mantissa = token.lstrip("-").split("e")[0].replace(".", "").lstrip("0")
        if len(mantissa) > n:
            too_many.append(token)
    assert not too_many, too_many[:10]
    assert f"results to {n} significant figures" in body


def test_the_policy_changes_the_results_written(qapp, template_case):
    case = template_case("sump_with_lid", 2.2)
    sol = case.solve()
    _, four = read(report_pdf_bytes(case, date=DATE))
    _, six = read(report_pdf_bytes(case.with_report(ReportInfo(significant_figures=6)),
                                   date=DATE))
    with using_figures(6):
        floor6 = format_number(sol.floor_force / 1000)
    assert format_number(sol.floor_force / 1000) in " ".join(four)
    assert floor6 in " ".join(six) and floor6 not in " ".join(four)


# ------------------------------------------------------------ load cases
def buried_wet_well():
    """An invented buried wet well at a pumping station: normal top water,
    overflow, a water test, and empty in flood groundwater."""
    s = TEMPLATES["open_tank"].build(name="Buried wet well, pumping station",
                                     tank_width=3.0, height=4.0)
    case = Case(s, fresh_water(10.0), fill_level=3.2).with_report(CONTROL)
    st = Structure.build(walls_of_thickness(s, 0.4, 0.3, 0.3), cavity=s)
    cases = (LoadCase("normal"), LoadCase("overflow", fill_level="spill", load_factor=1.35),
             LoadCase("water test", fill_level=3.8),
             LoadCase("empty, flood", fill_level="empty", groundwater=Groundwater(3.5),
                      load_factor=1.5))
    return Design(case, structure=st, ground=Ground(3.8), cases=cases)


@pytest.fixture(scope="module")
def wet_well(qapp):
    d = buried_wet_well()
    return d, *read(report_pdf_bytes(d, date=DATE))


def test_every_case_and_the_envelope_are_on_one_sheet(wet_well):
    design, reader, texts = wet_well
    text = " ".join(texts)
    solved = design.solve_all()
    # The load-case table: name, liquid, level, groundwater, factor.
    assert "Load cases" in text
    assert "overflow fresh water, 999.7 kg/m3 4 (spill level) none 1.35" in text
    assert "empty, flood fresh water, 999.7 kg/m3 0 (empty) 3.5 1.5" in text
    for k, sc in enumerate(solved, start=1):
        assert f"3.{k} Case {sc.name} (load factor {format_number(sc.load_factor)})" in text
    # Characteristic beside design: the overflow floor force x 1.35.
    over = solved[1].solution
    assert (f"floor force {format_number(over.floor_force / 1000)} "
            f"{format_number(1.35 * over.floor_force / 1000)} kN/m") in text
    env = envelope(solved)
    assert "Envelope of the 4 cases (design values)" in text
    floor = env.parts["floor"]
    assert f"floor {format_number(floor.max_down / 1000)} {floor.max_down_case}" in text
    fl = env.flotation
    assert (f"Lowest flotation factor {format_number(fl.factor)} in case {fl.case} against "
            f"{format_number(fl.required)} required: NOT OK") in text
    base = env.base
    assert (f"Governing base pressure {format_number(base.net_upward_pressure / 1000)} kPa "
            f"net upward, case {base.case}") in text
    assert "lateral earth pressure is not computed" in text


def test_each_case_is_drawn_with_the_structure(wet_well):
    design, reader, texts = wet_well
    figures = [t for t in texts if "sketch and pressure diagram" in t]
    for sc in design.solve_all():
        assert any(f"Case {sc.name}: sketch and pressure diagram" in t for t in figures), sc.name
    flood = next(t for t in figures if "Case empty, flood:" in t)
    for dim in ("outside 3.6 m", "ground 3.8 m", "groundwater 3.5 m", "structure around the",
                "groundwater pressure on the"):
        assert dim in flood, dim


def test_a_case_alone_and_a_plain_case(qapp, template_case):
    d = buried_wet_well()
    _, texts = read(report_pdf_bytes(d, case="overflow", date=DATE))
    text = " ".join(texts)
    assert "3.1 Case overflow" in text and "Case normal" not in text
    with pytest.raises(ReportError, match="no load case named 'flood'"):
        report_pdf_bytes(d, case="flood")
    with pytest.raises(ReportError, match="a level for the sheet is for a file without"):
        report_pdf_bytes(d, level=2.0)
    # A plain Case is a design of one case: no load-case table, no envelope.
    _, texts = read(report_pdf_bytes(template_case("open_tank"), date=DATE))
    text = " ".join(texts)
    assert "Load cases" not in text and "Envelope" not in text and "3.1 Totals" in text
