"""Forces in every headless drawing follow the one unit rule: a plane
section one unit of run wide (1 m, or 1 ft in a file in ft) is shown per
run, in lbf/ft in US units, converted.

The case (``run_case``, tests/conftest.py) is a 2 m wide tank filled to
1.5 m: per metre run the floor carries gamma h x 2 m = 29419.95 N/m and
each wall gamma h^2 / 2 = 11032.48 N/m (Cengel & Cimbala, Fluid
Mechanics, sec. 3-4), 2016 lbf/ft and 756 lbf/ft (NIST SP 811 App. B:
1 lbf/ft = 14.5939029372 N/m), whatever the run.
"""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import io
import xml.etree.ElementTree as ET

import numpy as np
import pypdf
import pytest

from wetline.app.render import text_blocks
from wetline.app.render.label_painter import LabelPainter
from wetline.app.render.level_chart import chart_series
from wetline.app.render.png import render_diagram
from wetline.app.render.sheet import report_pdf_bytes
from wetline.app.render.svg import render_svg

SMALL = (900, 640)
DATE = datetime.date(2026, 1, 2)
RUNS = ["m", "ft"]


@pytest.fixture
def painted(monkeypatch):
    """Texts of the diagram's labels and title-block rows as they are painted."""
    texts = []
    real_label = LabelPainter.draw_label

    def label(self, p, lab, rect):
        texts.append(lab.text)
        return real_label(self, p, lab, rect)

    real_rows = text_blocks.Rows.draw

    def rows(self, p, fonts, x, y, width):
        texts.extend(f"{k}: {v}" for k, v, _ in self.rows)
        return real_rows(self, p, fonts, x, y, width)

    monkeypatch.setattr(LabelPainter, "draw_label", label)
    monkeypatch.setattr(text_blocks.Rows, "draw", rows)
    return texts


@pytest.mark.parametrize("run", RUNS)
def test_png_labels_are_per_foot_run_in_us_units(run, run_case, painted):
    render_diagram(run_case(run), units="us", size=SMALL, date=DATE)
    assert "floor: 2016 lbf/ft" in painted
    # A side wall's value is named by its edge (the part's total is 0), never
    # written as if it were the part's.
    assert {"edge 1: 756 lbf/ft", "edge 3: 756 lbf/ft"} & set(painted)
    assert "wall: 756 lbf/ft" not in painted
    assert "Floor force: 2016 lbf/ft" in painted
    assert any(t.startswith("Units: US customary") and "lbf/ft (per ft run)" in t
               for t in painted)
    assert not any("per m run" in t for t in painted)


@pytest.mark.parametrize("run", RUNS)
def test_png_in_si_is_per_metre_run(run, run_case, painted):
    render_diagram(run_case(run), units="si", size=SMALL, date=DATE)
    assert "floor: 29.42 kN/m" in painted and "Floor force: 29.42 kN/m" in painted


def test_a_foot_wide_section_in_a_metre_file_is_a_force_for_that_width(run_case, painted):
    case = run_case("ft").with_length_unit("m")
    render_diagram(case, units="us", size=SMALL, date=DATE)
    # 2016 lbf/ft on 1 ft of width: 2016 lbf.
    assert "floor: 2016 lbf" in painted and "Floor force: 2016 lbf" in painted
    assert not any("lbf/ft" in t for t in painted)


@pytest.mark.parametrize("run", RUNS)
def test_svg_text_is_per_foot_run(run, run_case):
    root = ET.fromstring(render_svg(run_case(run), units="us", size=SMALL, date=DATE))
    texts = [e.text or "" for e in root.iter("{http://www.w3.org/2000/svg}text")]
    assert "2016 lbf/ft" in texts and "floor: 2016 lbf/ft" in texts
    assert not any("per m run" in t for t in texts)


@pytest.mark.parametrize("run", RUNS)
def test_pdf_sheet_is_per_foot_run(run, run_case):
    data = report_pdf_bytes(run_case(run), units="us", date=DATE)
    text = " ".join(" ".join(p.extract_text().split())
                    for p in pypdf.PdfReader(io.BytesIO(data)).pages)
    assert "per ft run" in text and "per m run" not in text
    assert "fx [lbf/ft]" in text and "resultant [lbf/ft]" in text
    assert "2016" in text and "756" in text


@pytest.mark.parametrize("run", RUNS)
def test_chart_curves_are_per_foot_run(run, run_case):
    levels, series, current = chart_series(run_case(run), units="us", steps=31)
    floor = dict((key, values) for key, _, _, _, values in series)["floor_force"]
    assert current == pytest.approx(1.5 / 0.3048)
    assert float(np.interp(current, levels, floor)) == pytest.approx(2015.905, rel=1e-5)
