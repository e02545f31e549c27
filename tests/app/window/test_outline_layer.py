"""The outline layer draws each part's edges as one curve; drawing again
after a vertex moved gives every part exactly its edges (the reference: the
section's own edge list, vertex i to i + 1), while the curves of parts the
move did not touch are left as they were (same data arrays, no new pen)."""

import numpy as np
import pyqtgraph as pg

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


def test_parts_redrawn_only_where_vertices_moved(qtbot):
    plot = pg.PlotWidget()
    qtbot.addWidget(plot)
    layer = OutlineLayer(plot.getPlotItem())
    outline, parts = _square()
    layer.draw(outline, parts, axisymmetric=False)
    curves = layer._part_curves
    before = {name: (c.getData()[0], c.opts["pen"]) for name, c in curves.items()}
    moved, _ = _square(dz=-0.2)  # the floor's middle vertex down
    layer.draw(moved, parts, axisymmetric=False)
    for name, curve in curves.items():
        x, z = curve.getData()
        assert np.array_equal(np.column_stack([x, z]), _expected(moved, parts, name))
    assert curves["floor"].getData()[0] is not before["floor"][0]
    for name in ("wall", "open"):  # untouched: the very same data and pen
        assert curves[name].getData()[0] is before[name][0]
        assert curves[name].opts["pen"] is before[name][1]
    # a part renamed: its curve goes, the new one has its edges
    renamed = ["floor", "floor", "wall", "open", "side"]
    layer.draw(moved, renamed, axisymmetric=False)
    assert set(curves) == {"floor", "wall", "open", "side"}
    for name, curve in curves.items():
        x, z = curve.getData()
        assert np.array_equal(np.column_stack([x, z]), _expected(moved, renamed, name))
