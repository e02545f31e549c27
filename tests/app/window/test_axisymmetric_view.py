"""An axisymmetric section is drawn as the vessel it describes: the real
half and, faintly, its mirror image (x -> -x) about a dash-dot centre line;
editing stays on the real half."""

import numpy as np
import pytest
from PySide6.QtCore import Qt

from wetline.core.section import AXIS, OPEN
from wetline.core.section_file import read_section_file


def _pairs(outline, parts):
    keep = [i for i, p in enumerate(parts) if p not in (AXIS, OPEN)]
    n = len(outline)
    return sorted((tuple(outline[i]), tuple(outline[(i + 1) % n])) for i in keep)


def test_mirrored_half_drawn_for_axisymmetric_only(make_window, settle, sample):
    case = read_section_file(sample("cone_hopper"))
    assert case.section.is_axisymmetric
    w = make_window(case)
    c = w.canvas
    layer = c.outline_layer
    assert c.mirrored and layer.mirror.isVisible() and layer.centre_line.isVisible()
    x, z = c.outline_layer.mirror.getData()
    mirrored = sorted(((-x[k], z[k]), (-x[k + 1], z[k + 1])) for k in range(0, len(x), 2))
    assert mirrored == _pairs(case.section.outline, case.section.parts)
    assert (x <= 0).all()
    # The centre line is the axis, dash-dot, reaching past the section.
    cx, cz = c.outline_layer.centre_line.getData()
    assert list(cx) == [0.0, 0.0]
    assert cz[0] < case.section.z_min and cz[1] > case.section.z_max
    assert c.outline_layer.centre_line.opts["pen"].style() == Qt.DashDotLine
    # The liquid of the other half, faint, is the real half's mirrored.
    real = c.load_layer.liquid.path().boundingRect()
    mirror = c.load_layer.mirror_liquid.path().boundingRect()
    assert not mirror.isEmpty()
    assert mirror.left() == pytest.approx(-real.right())
    assert mirror.right() == pytest.approx(-real.left())
    loads = c.load_layer
    assert loads.mirror_liquid.brush().color().alpha() < loads.liquid.brush().color().alpha()
    # The view takes in the whole vessel.
    c.fit()
    (x0, x1), _ = c.getPlotItem().getViewBox().viewRange()
    assert x0 < -case.section.outline[:, 0].max()


def test_plane_section_has_no_mirror(make_window, settle):
    w = make_window()  # the sump: plane
    assert not w.canvas.mirrored
    assert not w.canvas.outline_layer.centre_line.isVisible()


def test_switching_kind_shows_and_hides_the_mirror(make_window, settle):
    from wetline.core.case import Case
    from wetline.core.section import Section

    s = Section.build([[0, 0], [1, 0], [1, 2], [0, 2]], parts=["floor", "wall", OPEN, "wall"],
                      kind="plane")
    w = make_window(Case.default(s, 1.0))
    assert not w.canvas.mirrored
    w._set_kind("axisymmetric")
    settle(w)
    assert w.canvas.mirrored
    w.actions_by_name["undo"].trigger()
    settle(w)
    assert not w.canvas.mirrored


def test_editing_only_on_the_real_half(make_window, settle, sample):
    w = make_window(read_section_file(sample("cone_hopper")))
    c = w.canvas
    outline = w.doc.section.outline
    i = int(np.argmax(outline[:, 0]))
    x, z = outline[i]
    assert c.editor.pick_vertex(x, z) == i
    assert c.editor.pick_vertex(-x, z) is None  # the mirror image is not a handle
    assert c.pick_edge(-x, z) is None
    assert (c.handles.data["x"] >= 0).all()
    # Hovering over the mirrored half still reads the liquid there.
    sol = w.doc.solution
    text = c.describe_point(-0.5 * x, sol.level - 0.5)
    assert "outside" not in text and "depth 0.5 m" in text
