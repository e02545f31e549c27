"""The PNG and SVG diagrams of a design's load case: the case drawn with its
structure, ground and groundwater, and a title block that keeps its legend
and caution whatever the case.

The loads drawn are core's (``Design.solve``), checked in tests/core against
Archimedes and hand-worked flotation examples; here the diagram must be of
the case asked for.
"""

import re

import numpy as np
import pytest

from wetline.app.render.case_drawing import case_drawing
from wetline.app.render.output import ExportError
from wetline.app.render.png import DEFAULT_SIZE
from wetline.app.render.scene import DiagramScene
from wetline.app.render.svg import DEFAULT_SVG_SIZE, render_svg
from wetline.core.results import CAUTION
from wetline.core.section_file import read_design


def _design(sample, name="buried_wet_well"):
    return read_design(sample(name))


def test_the_drawing_is_the_case_with_its_structure(sample):
    d = _design(sample)
    for name in d.names:
        drawing = case_drawing(d, name)
        solved = d.solve(name)
        assert drawing.case_name == name
        assert drawing.solution.fz.tolist() == solved.solution.fz.tolist()
        a, b = drawing.structure, solved.structure
        assert a.flotation.uplift == b.flotation.uplift
        assert a.flotation.resistance == b.flotation.resistance
        assert (a.groundwater is None) == (b.groundwater is None)
    # A level of its own: the structure's loads follow the liquid there.
    low = case_drawing(d, d.names[0], level=1.0)
    assert low.solution.level == 1.0
    assert np.isclose(low.solution.volume, 3.0 * 1.0)  # 3 m wide, 1 m deep, per m run
    assert low.structure.groundwater.level == 2.25


def test_a_case_the_design_does_not_have_is_refused_in_one_line(sample, template_case):
    d = _design(sample)
    with pytest.raises(ExportError, match="no load case named 'flood'"):
        case_drawing(d, "flood")
    with pytest.raises(ExportError, match="a case name .* is for a design with load cases"):
        case_drawing(template_case("open_tank"), "normal")
    plain = case_drawing(template_case("open_tank"))
    assert plain.structure is None and plain.case_name is None


def test_the_svg_of_a_flood_case_has_its_groundwater_legend_and_caution(qapp, sample):
    d = _design(sample)
    flood = d.names[3]
    text = render_svg(d, case=flood).decode("utf-8")
    words = " ".join(re.sub(r"<[^>]+>", " ", text).split())
    assert f"Load case {flood}" in words
    assert "spill level = groundwater = ground 4.5 m" in words
    for item in ("structure around the cavity", "ground surface", "groundwater level"):
        assert item in words, item
    # The caution wraps over lines; its first words are enough.
    assert " ".join(CAUTION.split()[:6]) in words


@pytest.mark.parametrize("size", [DEFAULT_SIZE, DEFAULT_SVG_SIZE, (1131, 1600)])
def test_every_title_block_fits_for_every_case_of_every_sample(qapp, samples_dir, size):
    """The title block's blocks all fit its panel (nothing dropped, the
    caution drawn), for each case of each bundled sample at the PNG's and
    the SVG's default sizes and a portrait page."""
    from PySide6.QtCore import QRectF

    for path in sorted(samples_dir.glob("*.section.json")):
        d = read_design(path)
        for name in d.names:
            dr = case_drawing(d, name)
            scene = DiagramScene(dr.case, dr.solution, "si", size, "2026-01-02",
                                 structure=dr.structure, case_name=dr.case_name)
            m = scene.margin
            frame = QRectF(m, m, scene.width - 2 * m, scene.height - 2 * m)
            panel, columns, fonts, _ = scene.title_block.fit(frame)
            assert scene.title_block.flow(fonts, panel, columns), (path.name, name, size)
            assert fonts.base >= max(7.0, scene.min_font) - 1e-9


@pytest.mark.parametrize("size, with_structure", [((501.7, 250.0), False),
                                                   ((501.7, 330.0), True),
                                                   ((501.7, 620.0), True)])
def test_a_sheet_figure_keeps_its_whole_legend_inside_its_frame(qapp, samples_dir, size,
                                                                with_structure):
    """The calculation sheet's figures (in points, 8.7 pt text, the body's
    width of an A4 page): half a page for two cases a page without a
    structure, the chart page's share and a whole page with one. The
    drawing has a positive scale and the legend of every case of every
    sample lies inside the figure's frame (a half-page figure of a
    structure clipped the last items of a legend put beside it)."""
    from PySide6.QtCore import QRectF

    from wetline.app.render.sheet import FIGURE_FONT_PT

    for path in sorted(samples_dir.glob("*.section.json")):
        d = read_design(path)
        if d.structure is not None and not with_structure:
            continue
        for name in d.names:
            dr = case_drawing(d, name)
            scene = DiagramScene(dr.case, dr.solution, "si", size, "2026-01-02",
                                 structure=dr.structure, figure=True,
                                 font_px=FIGURE_FONT_PT, case_name=dr.case_name)
            m = scene.margin
            frame = QRectF(m, m, scene.width - 2 * m, scene.height - 2 * m)
            view, _, blocks, fonts = scene.figure_layout(frame)
            assert view.px_per_m > 0
            assert frame.contains(view.area)
            for block, x, y, width in blocks:
                where = (path.name, name, size)
                assert x + width <= frame.right() + 1e-9, where
                assert y + block.measure(fonts, width) <= frame.bottom() + 1e-9, where
