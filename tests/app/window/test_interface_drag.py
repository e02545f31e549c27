"""Dragging a layer interface on the canvas with the mouse (real mouse
events on the view's viewport): the up-down cursor and a status-bar hint
over an interface, the view following the drag live, one undo step per
drag, and a drag past the free surface refused with core's message.

The hand value: with fat (900 kg/m3) over sewage up to the spill level
2 m and the interface at z_i, the pressure at the interface is
g * 900 * (2 - z_i) (stratified hydrostatics, Cengel & Cimbala, Fluid
Mechanics, sec. 3-1).
"""

import numpy as np
import pytest
from PySide6.QtCore import QPointF, Qt

from wetline.app.render.geometry import wetted_edges
from wetline.core.section_file import read_design


@pytest.fixture(autouse=True)
def every_move(monkeypatch):
    """pyqtgraph drops mouse moves closer than its rate limit; a test's
    moves come faster than any hand's, so none is dropped."""
    import pyqtgraph as pg

    monkeypatch.setitem(pg.CONFIG_OPTIONS, "mouseRateLimit", 0)


@pytest.fixture
def trap(make_window, sample, settle):
    w = make_window(read_design(sample("grease_trap")))
    w.doc.select_case(0)  # grease on sewage, interface at 1.85 m, surface at 2 m
    settle(w)
    w.canvas.fit()
    settle(w)
    return w


def _pixel(c, x, z):
    vb = c.getPlotItem().getViewBox()
    return c.mapFromScene(vb.mapViewToScene(QPointF(x, z)))


def _turns():
    from PySide6.QtWidgets import QApplication

    for _ in range(3):  # the coalescing timers fire in the event loop
        QApplication.processEvents()


def _drag(qtbot, w, x, z0, levels):
    """Press at (x, z0), move through ``levels`` [m], release at the last;
    returns the interface level the canvas drew after each move."""
    c = w.canvas
    vp = c.viewport()
    qtbot.mouseMove(vp, _pixel(c, x, z0))
    qtbot.mousePress(vp, Qt.LeftButton, Qt.NoModifier, _pixel(c, x, z0))
    drawn = []
    for z in levels:
        qtbot.mouseMove(vp, _pixel(c, x, z))
        _turns()
        drawn.append(list(c.load_layer.interface_levels))
    qtbot.mouseRelease(vp, Qt.LeftButton, Qt.NoModifier, _pixel(c, x, levels[-1]))
    _turns()
    return drawn


def test_hover_over_an_interface_shows_the_up_down_cursor_and_a_hint(qtbot, trap):
    c = trap.canvas
    texts = []
    c.hoverText.connect(texts.append)
    vp = c.viewport()
    qtbot.mouseMove(vp, _pixel(c, 1.25, 1.85))
    _turns()
    assert vp.cursor().shape() == Qt.SizeVerCursor
    assert "drag: top of layer 1 'raw sewage'" in texts[-1]
    qtbot.mouseMove(vp, _pixel(c, 1.25, 1.0))  # in the sewage, off the interface
    _turns()
    assert vp.cursor().shape() != Qt.SizeVerCursor
    assert "drag:" not in texts[-1]
    # The pressure under the pointer is the layered one (fat 0.15 m over
    # sewage down to z = 1.0 m), not the bottom liquid's alone.
    z = c.pointer[1]  # where the pointer is [m]
    g = trap.doc.case.gravity
    expected = g * (900 * 0.15 + 1010 * (1.85 - z))
    assert f"pressure {trap.doc.units.fmt_pressure(expected)}" in texts[-1]


def test_interface_drag_follows_live_and_is_one_undo_step(qtbot, trap, settle):
    w = trap
    doc = w.doc
    n = doc.undo_stack.count()
    # The default snap grid is 0.1 m: each step lands on it.
    drawn = _drag(qtbot, w, 1.25, 1.85, [1.7, 1.6, 1.5])
    assert [d[0] for d in drawn] == [pytest.approx(z) for z in (1.7, 1.6, 1.5)]
    settle(w)
    assert doc.undo_stack.count() == n + 1
    assert doc.active_load_case.layers[0].top == pytest.approx(1.5)
    assert "Top of layer 1" in doc.undo_stack.text(n)
    # The canvas's diagram kinks at the new interface with the hand value.
    we = wetted_edges(doc.solution)
    right = np.flatnonzero(we.index == 1)
    at = [p for zz, p in zip(np.r_[we.az[right], we.bz[right]],
                             np.r_[we.pa[right], we.pb[right]], strict=True)
          if abs(zz - 1.5) < 1e-12]
    assert at and at[0] == pytest.approx(doc.case.gravity * 900 * 0.5, rel=1e-12)
    assert w.canvas.interface_grips.levels == [pytest.approx(1.5)]
    doc.undo_stack.undo()
    settle(w)
    assert doc.active_load_case.layers[0].top == pytest.approx(1.85)
    assert w.canvas.load_layer.interface_levels == [pytest.approx(1.85)]


def test_drag_past_the_free_surface_is_refused_with_cores_message(qtbot, trap, settle):
    w = trap
    doc = w.doc
    messages = []
    w.canvas.message.connect(messages.append)
    n = doc.undo_stack.count()
    drawn = _drag(qtbot, w, 1.25, 1.85, [1.9, 2.3])
    settle(w)
    assert drawn[0] == [pytest.approx(1.9)]
    assert drawn[1] == [pytest.approx(1.9)]  # 2.3 m refused: the last accepted stays
    assert any("is not above the top of layer 1 'raw sewage'" in m for m in messages)
    assert "not above the top of layer 1" in w.statusBar().currentMessage()
    assert doc.undo_stack.count() == n + 1
    assert doc.active_load_case.layers[0].top == pytest.approx(1.9)


def test_a_drag_off_any_interface_pans_the_view(qtbot, trap):
    w = trap
    c = w.canvas
    vb = c.getPlotItem().getViewBox()
    before = vb.viewRange()
    n = w.doc.undo_stack.count()
    _drag(qtbot, w, 1.25, 1.0, [0.8, 0.6])
    assert w.doc.undo_stack.count() == n
    assert vb.viewRange() != before
