"""The loads-against-level chart's cursor sets the fill level: dragging it
(one undo step per drag, like the slider) or clicking in the chart."""

import pytest
from PySide6.QtCore import QEvent, QPointF, Qt
from PySide6.QtGui import QMouseEvent
from PySide6.QtWidgets import QApplication

from wetline.app.model.document import fill_range


def _mouse(chart):
    vp = chart.viewport()
    vb = chart.getPlotItem().getViewBox()

    def at(level_shown):
        (_, _), (y0, y1) = vb.viewRange()
        scene = vb.mapViewToScene(QPointF(level_shown, 0.5 * (y0 + y1)))
        return chart.mapFromScene(scene).toPointF()

    def send(kind, pos, button, buttons):
        QApplication.sendEvent(vp, QMouseEvent(kind, pos, vp.mapToGlobal(pos), button,
                                               buttons, Qt.NoModifier))
    return at, send


def _pixel(chart):
    return chart.getPlotItem().getViewBox().viewPixelSize()[0]


def test_dragging_the_cursor_sets_the_level_in_one_undo_step(make_window, settle):
    w = make_window()
    doc, chart = w.doc, w.chart
    before = doc.case
    at, send = _mouse(chart)
    u = doc.units
    start = u.length(doc.solution.level)
    target = u.length(1.2)
    p0, p1 = at(start), at(target)
    send(QEvent.MouseButtonPress, p0, Qt.LeftButton, Qt.LeftButton)
    levels = []
    for k in range(1, 9):
        send(QEvent.MouseMove, QPointF(p0.x() + (p1.x() - p0.x()) * k / 8, p0.y()),
             Qt.NoButton, Qt.LeftButton)
        settle(w)
        levels.append(doc.solution.level)
    send(QEvent.MouseButtonRelease, p1, Qt.LeftButton, Qt.NoButton)
    settle(w)
    # The level followed the cursor live, down towards the target.
    assert levels == sorted(levels, reverse=True) and len(set(levels)) >= 5
    # It ends where the mouse let go (the axis may have shifted a little as
    # the labels changed, so the release point is read in the final view).
    vb = chart.getPlotItem().getViewBox()
    released = u.length_si(vb.mapSceneToView(chart.mapToScene(p1.toPoint())).x())
    assert released == pytest.approx(1.2, abs=0.05)
    tol = 2 * _pixel(chart)
    assert doc.case.fill_level == pytest.approx(released, abs=u.length_si(tol))
    assert chart.cursor_level == pytest.approx(doc.solution.level)
    assert w.totals.values["level"].text() == u.fmt_length(doc.solution.level)
    assert doc.undo_stack.count() == 1
    assert doc.undo_stack.undoText().startswith("Fill to")
    w.actions_by_name["undo"].trigger()
    settle(w)
    assert doc.case is before


def test_two_drags_are_two_steps(make_window, settle):
    w = make_window()
    chart = w.chart
    for target in (1.0, 2.0):  # what InfiniteLine signals on a drag and its release
        chart.cursor.setValue(w.doc.units.length(target))
        chart.cursor.sigDragged.emit(chart.cursor)
        chart.cursor.sigDragged.emit(chart.cursor)
        chart.cursor.sigPositionChangeFinished.emit(chart.cursor)
    settle(w)
    assert w.doc.undo_stack.count() == 2
    assert w.doc.case.fill_level == pytest.approx(2.0)


def test_click_in_the_chart_sets_the_level_within_the_range(make_window, settle):
    w = make_window()
    doc, chart = w.doc, w.chart
    at, send = _mouse(chart)
    u = doc.units
    p = at(u.length(0.8))
    send(QEvent.MouseButtonPress, p, Qt.LeftButton, Qt.LeftButton)
    send(QEvent.MouseButtonRelease, p, Qt.LeftButton, Qt.NoButton)
    settle(w)
    assert doc.case.fill_level == pytest.approx(0.8, abs=u.length_si(2 * _pixel(chart)))
    assert doc.undo_stack.count() == 1
    # Past the end of the range: the level stops at the spill level.
    lo, hi = fill_range(doc.section)
    chart.set_level_at(u.length(hi + 5.0))
    settle(w)
    assert doc.case.fill_level == hi
    assert doc.undo_stack.count() == 2


def test_the_cursor_spans_the_view_and_shows_the_level(make_window, settle):
    """The cursor reads the current level beside its top and reaches from
    the bottom to the top of the view, after a zoom as well."""
    w = make_window()
    chart, u = w.chart, w.doc.units
    w.fill_panel.slider.setValue(500)
    settle(w)
    assert chart.cursor.text() == u.fmt_length(w.doc.solution.level)
    assert chart.cursor.value() == pytest.approx(u.length(w.doc.solution.level))
    vb = chart.getPlotItem().getViewBox()
    vb.setYRange(-50.0, 250.0, padding=0)
    settle(w)
    rect = chart.cursor.mapRectToView(chart.cursor.boundingRect())
    assert (rect.top(), rect.bottom()) == pytest.approx((-50.0, 250.0))
    # a few pixels either side of the line: where it is grabbed (not its text)
    px = vb.viewPixelSize()[0]
    assert rect.left() <= chart.cursor.value() - 3 * px
    assert rect.right() >= chart.cursor.value() + 3 * px
    grab = chart.cursor.mapRectToView(chart.cursor.shape().boundingRect())
    assert grab.width() == pytest.approx(8 * px, rel=1e-6)
    assert (grab.top(), grab.bottom()) == pytest.approx((-50.0, 250.0))


def test_a_drag_beside_the_cursor_leaves_the_level(make_window, settle):
    """Only the strip along the line grabs the cursor: a drag that starts
    beside it (where its value is written, at the top) changes no level."""
    w = make_window()
    doc, chart = w.doc, w.chart
    at, send = _mouse(chart)
    level = doc.solution.level
    n = doc.undo_stack.count()
    p0 = at(doc.units.length(level))
    p0 = QPointF(p0.x() + 20, p0.y())
    send(QEvent.MouseButtonPress, p0, Qt.LeftButton, Qt.LeftButton)
    for k in range(1, 6):
        send(QEvent.MouseMove, QPointF(p0.x() + 15 * k, p0.y()), Qt.NoButton, Qt.LeftButton)
        settle(w)
    send(QEvent.MouseButtonRelease, QPointF(p0.x() + 75, p0.y()), Qt.LeftButton, Qt.NoButton)
    settle(w)
    assert doc.solution.level == level and doc.undo_stack.count() == n


def test_a_head_above_the_default_range_is_on_the_chart_and_the_slider(make_window, sample,
                                                                         settle):
    """A closed tank filled to a head above the roof higher than the slider's
    default range (the roof plus the section's height) shows it: the chart
    and the slider reach the level, the cursor is at it. The closed tank
    sample opens at 4.5 m over a range to 4 m: the chart ended at 4 m with
    no cursor, the slider pinned at its end (seen under Xvfb)."""
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("closed_tank")))
    settle(w)
    doc = w.doc
    level = doc.solution.level
    assert level == 4.5 and doc.section.z_max == 2.0
    assert doc.level_table.levels[-1] == level  # the chart's table reaches it
    assert w.chart.cursor_level == level
    (x0, x1), _ = w.chart.getPlotItem().getViewBox().viewRange()
    assert x0 <= level <= x1
    slider = w.fill_panel.slider
    assert slider.value() == slider.maximum()
    slider.setValue(slider.maximum() // 2)  # the slider spans it: half way is 2.25 m
    settle(w)
    assert doc.solution.level == pytest.approx(level / 2, abs=level / slider.maximum())
    assert doc.level_table.levels[-1] == level  # the range stays while it is below
