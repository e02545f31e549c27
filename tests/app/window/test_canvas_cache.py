"""The canvas keeps pixmaps of the items a fill step leaves as they are; what
it shows is what it draws without them, after fill steps, a zoom and a pan,
and after an outline edit."""

from PySide6.QtWidgets import QGraphicsItem


def _grab(canvas, settle, window):
    settle(window)
    canvas.viewport().repaint()
    return canvas.viewport().grab().toImage()


def _uncached(canvas):
    """Every item drawn afresh at each paint, but the hatched structure (its
    hatch keeps its phase to its pixmap: the structure layer's own choice)."""
    vb = canvas.getPlotItem().getViewBox()
    hatched = (canvas.structure_layer.section, canvas.structure_layer.mirror_section)
    modes = [(item, item.cacheMode()) for item in vb.addedItems if item not in hatched]
    for item, _ in modes:
        item.setCacheMode(QGraphicsItem.NoCache)
    return modes


def test_the_canvas_shows_the_same_with_its_pixmaps(make_window, settle, sample):
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("buried_wet_well")))
    c = w.canvas
    vb = c.getPlotItem().getViewBox()
    cached = [i for i in vb.addedItems if i.cacheMode() == QGraphicsItem.DeviceCoordinateCache]
    assert c.outline_layer.highlight in cached and c.handles in cached
    assert c.load_layer.liquid not in cached  # it changes at every fill step
    slider = w.fill_panel.slider
    for v in (300, 700):
        slider.setValue(v)
        settle(w)
    (x0, x1), (z0, z1) = vb.viewRange()
    vb.setRange(xRange=(x0 + 0.3, x1 - 0.1), yRange=(z0 + 0.2, z1 - 0.3), padding=0)
    slider.setValue(500)
    settle(w)
    with_pixmaps = _grab(c, settle, w)
    modes = _uncached(c)
    without = _grab(c, settle, w)
    assert with_pixmaps == without
    for item, mode in modes:
        item.setCacheMode(mode)
    # A vertex moved: the outline drawn again, not its old pixmap.
    from wetline.app.model import editing

    x, z = w.doc.section.outline[1]
    editing.move_vertex(w.doc, 1, x + 0.2, z)
    moved = _grab(c, settle, w)
    _uncached(c)
    assert moved == _grab(c, settle, w)
    assert moved != with_pixmaps


def test_a_dragged_outline_is_drawn_as_it_moves(make_window, settle):
    """During a drag the handles keep their pixmap, the dragged one drawn on
    its own where the pointer took it; the canvas shows the dragged outline
    (what it draws with no pixmaps) and, released, the edit, every handle
    back in the one item."""
    import numpy as np

    w = make_window()
    c = w.canvas
    handles = c.handles
    x, z = w.doc.section.outline[1]
    handles.dragStarted.emit(1)
    before = _grab(c, settle, w)
    handles.dragMoved.emit(1, float(x) + 0.3, float(z))
    during = _grab(c, settle, w)
    assert handles.cacheMode() == QGraphicsItem.DeviceCoordinateCache
    assert during != before
    assert not handles.data["visible"][1] and handles.data["visible"].sum() == len(handles.data) - 1
    shown = w.doc.preview.case.section.outline[1]
    np.testing.assert_array_equal(handles.moving_points(), [shown])
    modes = _uncached(c)
    assert _grab(c, settle, w) == during
    for item, mode in modes:
        item.setCacheMode(mode)
    handles.dragFinished.emit(1, float(x) + 0.3, float(z))
    after = _grab(c, settle, w)
    assert handles.cacheMode() == QGraphicsItem.DeviceCoordinateCache
    assert handles.data["visible"].all() and handles.moving_points().shape == (0, 2)
    np.testing.assert_array_equal(np.column_stack([handles.data["x"], handles.data["y"]]),
                                  w.doc.section.outline)
    _uncached(c)
    assert _grab(c, settle, w) == after
