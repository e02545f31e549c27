"""The outline layer draws each part's edges as one curve; drawing again
after a vertex moved gives every part exactly its edges (the reference: the
section's own edge list, vertex i to i + 1), while the curves of parts the
move did not touch are left as they were (same data arrays, no new pen)."""

import numpy as np
import pyqtgraph as pg
import pytest

from wetline.app.window.outline_layer import OutlineLayer


def _square(dz=0.0):
    # floor 0 -> 1, walls 1 -> 2 and 3 -> 0, an open top 2 -> 3
    pts = np.array([[0.0, 0.0], [2.0, 0.0], [2.0, 2.0], [0.0, 2.0], [1.0, -0.5 + dz]])
    order = [0, 4, 1, 2, 3]
    return pts[order], ["floor", "floor", "wall", "open", "wall"]


def _expected(outline, parts, name):
    n = len(outline)
    pairs = [(outline[i], outline[(i + 1) % n]) for i, p in enumerate(parts) if p == name]
    return np.array([q for pair in pairs for q in pair])


def _each_part_has_its_edges(curves, outline, parts):
    for name, curve in curves.items():
        x, z = curve.getData()
        assert np.array_equal(np.column_stack([x, z]), _expected(outline, parts, name))


@pytest.fixture
def square_layer(qtbot):
    """An outline layer that has drawn the square; (layer, outline, parts)
    while the plot holding it lives (the fixture keeps it)."""
    plot = pg.PlotWidget()
    qtbot.addWidget(plot)
    layer = OutlineLayer(plot.getPlotItem())
    outline, parts = _square()
    layer.draw(outline, parts, axisymmetric=False)
    yield layer, outline, parts
    del plot


def test_parts_redrawn_only_where_vertices_moved(square_layer):
    layer, outline, parts = square_layer
    curves = layer._part_curves
    before = {name: (c.getData()[0], c.opts["pen"]) for name, c in curves.items()}
    moved, _ = _square(dz=-0.2)  # the floor's middle vertex down
    layer.draw(moved, parts, axisymmetric=False)
    _each_part_has_its_edges(curves, moved, parts)
    assert curves["floor"].getData()[0] is not before["floor"][0]
    for name in ("wall", "open"):  # untouched: the very same data and pen
        assert curves[name].getData()[0] is before[name][0]
        assert curves[name].opts["pen"] is before[name][1]
    # a part renamed: its curve goes, the new one has its edges
    renamed = ["floor", "floor", "wall", "open", "side"]
    layer.draw(moved, renamed, axisymmetric=False)
    assert set(curves) == {"floor", "wall", "open", "side"}
    _each_part_has_its_edges(curves, moved, renamed)


def test_shared_vertex_and_new_vertex_redraw_the_parts_they_touch(square_layer):
    """A vertex shared by two parts redraws both; a vertex added (the count
    changes) redraws every part; the outline given may be changed in place
    after the draw (the layer keeps its own copy to compare with)."""
    layer, outline, parts = square_layer
    curves = layer._part_curves
    before = {name: c.getData()[0] for name, c in curves.items()}
    outline[2] = [2.5, 0.0]  # the corner between the floor and the right wall
    layer.draw(outline, parts, axisymmetric=False)
    _each_part_has_its_edges(curves, outline, parts)
    assert curves["floor"].getData()[0] is not before["floor"]
    assert curves["wall"].getData()[0] is not before["wall"]
    assert curves["open"].getData()[0] is before["open"]
    grown = np.insert(outline, 3, [[2.5, 1.0]], axis=0)
    grown_parts = ["floor", "floor", "wall", "wall", "open", "wall"]
    before = {name: c.getData()[0] for name, c in curves.items()}
    layer.draw(grown, grown_parts, axisymmetric=False)
    _each_part_has_its_edges(curves, grown, grown_parts)
    assert all(curves[name].getData()[0] is not before[name] for name in curves)
