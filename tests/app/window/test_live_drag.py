"""Live views during a vertex drag: the totals, the part and edge tables and
the chart show the dragged outline's results at every step (the document's
preview), the canvas marks an invalid outline, and the drag is one undo step."""

import numpy as np
import pytest
from PySide6.QtCore import QEvent, QPointF, Qt
from PySide6.QtGui import QMouseEvent
from PySide6.QtWidgets import QApplication

from wetline.core.fill import capacity, volume_below
from wetline.core.level_table import level_table
from wetline.core.numbers import format_number


def _drag_to(w, index, x, z, settle):
    w.canvas.handles.dragMoved.emit(index, x, z)
    settle(w)


def test_totals_tables_and_chart_show_the_dragged_outline(make_window, settle):
    w = make_window()
    doc, u = w.doc, w.doc.units
    before = doc.case
    x, z = before.section.outline[1]
    h = w.canvas.handles
    repaints = []  # the vertex table must be told to repaint at each step
    w.vertices_table.model().dataChanged.connect(lambda *a: repaints.append(a))
    h.dragStarted.emit(1)
    for dx in (0.1, 0.3, 0.4):  # on the default snap grid (0.1 m)
        repaints.clear()
        _drag_to(w, 1, x + dx, z, settle)
        dragged = before.section.replace(outline=np.array(doc.working_outline()[0]))
        assert dragged.outline[1, 0] == pytest.approx(x + dx)
        sol = doc.solution
        assert sol.section == dragged  # the preview's solution, not the case's
        # Totals: core's exact volume of the dragged section, as shown.
        volume = volume_below(dragged, before.level)
        assert sol.volume == volume
        assert w.totals.values["volume"].text().startswith(u.fmt_volume(volume))
        # The fill panel's spill level and capacity: the dragged outline's
        # (they read the file's while the totals read the drag's).
        assert w.fill_panel.range_label.text() == (
            f"Spill level {u.fmt_length(dragged.spill_level)}; "
            f"capacity {u.fmt_volume(capacity(dragged))}")
        scope, scale = doc.force_scope(dragged), doc.force_scale
        assert w.totals.values["weight"].text() == scope.text(sol.fluid_weight, scale=scale)
        assert w.totals.values["floor"].text() == scope.text(sol.floor_force, scale=scale)
        # Parts table: the floor row's downward load.
        parts = w.parts_table.model()
        row = [parts.index(r, 0).data() for r in range(parts.rowCount())].index("floor")
        assert parts.index(row, 3).data() == format_number(
            scope.to_display(sol.parts["floor"].down))
        # Edges table: the length of the stretched floor edge 0.
        edges = w.edges_table.model()
        assert edges.index(0, 1).data() == format_number(u.length(dragged.geometry.length[0]))
        # Chart: the liquid weight curve is the dragged section's.
        table = level_table(dragged, before.liquid.density, before.gravity,
                            levels=doc.level_table.levels)
        cx, cy = w.chart._curves[0].getData()
        assert cx == pytest.approx(u.length(table.levels))
        assert cy == pytest.approx(scope.to_display(table.fluid_weight), rel=1e-12)
        assert w.chart.cursor_level == pytest.approx(sol.level)
        # Vertex table: the dragged vertex's x as the canvas shows it.
        vertices = w.vertices_table.model()
        assert vertices.index(1, 0).data() == format_number(u.length(x + dx), 6)
        assert repaints
    assert doc.undo_stack.count() == 0 and doc.case is before
    h.dragFinished.emit(1, x + 0.4, z)
    settle(w)
    assert doc.undo_stack.count() == 1 and doc.preview is None
    assert doc.solution.section is doc.section
    assert doc.level_table.levels.size == 121  # the full table once released
    assert w.totals.values["volume"].text().startswith(u.fmt_volume(doc.solution.volume))
    w.actions_by_name["undo"].trigger()
    settle(w)
    assert doc.case is before
    assert w.totals.values["volume"].text().startswith(
        u.fmt_volume(before.solve().volume))


def test_invalid_drag_step_keeps_last_valid_results_and_marks_fault(make_window, settle):
    w = make_window()
    doc = w.doc
    before = doc.case
    x, z = before.section.outline[1]
    h = w.canvas.handles
    h.dragStarted.emit(1)
    _drag_to(w, 1, x + 0.3, z, settle)
    valid_text = w.totals.values["volume"].text()
    valid = doc.solution
    _drag_to(w, 1, -1.0, 2.5, settle)  # crosses the far wall
    assert doc.solution is valid
    assert w.totals.values["volume"].text() == valid_text
    assert w.canvas.outline_layer.fault_text.isVisible()
    assert "crosses" in w.canvas.outline_layer.fault_text.toPlainText()
    assert len(w.canvas.outline_layer.draft_curve.getData()[0]) == before.section.n_edges + 1
    _drag_to(w, 1, x + 0.2, z, settle)  # valid again: fault gone, results follow
    assert not w.canvas.outline_layer.fault_text.isVisible()
    assert doc.solution.section.outline[1, 0] == pytest.approx(x + 0.2)
    h.dragFinished.emit(1, x + 0.2, z)
    settle(w)
    assert doc.undo_stack.count() == 1 and doc.draft is None


def test_real_mouse_drag_updates_totals_before_release(make_window, settle):
    w = make_window()
    c = w.canvas
    vp = c.viewport()

    def at(x, z):
        return c.mapFromScene(c.getPlotItem().getViewBox().mapViewToScene(QPointF(x, z))).toPointF()

    def send(kind, pos, button, buttons):
        QApplication.sendEvent(vp, QMouseEvent(kind, pos, vp.mapToGlobal(pos), button,
                                               buttons, Qt.NoModifier))

    x, z = w.doc.section.outline[1]
    start_text = w.totals.values["volume"].text()
    p0, p1 = at(x, z), at(x + 0.5, z)
    send(QEvent.MouseButtonPress, p0, Qt.LeftButton, Qt.LeftButton)
    texts = []
    for k in range(1, 6):
        send(QEvent.MouseMove, QPointF(p0.x() + (p1.x() - p0.x()) * k / 5, p0.y()),
             Qt.NoButton, Qt.LeftButton)
        for _ in range(3):  # the coalescing timers fire in the event loop
            QApplication.processEvents()
        texts.append(w.totals.values["volume"].text())
    assert w.doc.undo_stack.count() == 0
    assert len(set(texts)) == 5 and start_text not in texts  # a new volume every step
    send(QEvent.MouseButtonRelease, p1, Qt.LeftButton, Qt.NoButton)
    settle(w)
    assert w.doc.undo_stack.count() == 1
    assert w.totals.values["volume"].text() == texts[-1]


def test_trapped_air_drag_samples_the_chart_and_the_worst_uplift_then_refines(
        make_window, settle, sample, monkeypatch):
    # During a drag, the tables solved level by level (trapped air) take
    # PREVIEW_MIN_STEPS levels and the uplift panel's worst level is sampled
    # (marked "~"); on release both are computed in full. Each is checked
    # against core's own functions on the dragged outline.
    from wetline.app.model.recompute import CHART_STEPS, PREVIEW_MIN_STEPS
    from wetline.app.window import uplift_panel
    from wetline.app.window.uplift_panel import SAMPLED_TIP
    from wetline.core.level_table import law_level_table
    from wetline.core.section_file import read_design
    from wetline.core.uplift import worst_uplifts_for

    asked = []  # the samples each live search was given

    def spy(solution, parts, **kw):
        asked.append((solution.section, kw.get("trapped_samples")))
        return worst_uplifts_for(solution, parts, **kw)
    monkeypatch.setattr(uplift_panel, "worst_uplifts_for", spy)
    w = make_window(read_design(sample("chamber_with_lip")))
    doc = w.doc
    doc.select_case(2)  # riser half full, air trapped under the roof
    settle(w)
    assert doc.solution.pocket_mode == "trapped"
    x, z = doc.section.outline[1]
    w.canvas.handles.dragStarted.emit(1)
    asked.clear()
    _drag_to(w, 1, float(x), float(z) - 0.1, settle)
    sol = doc.solution
    # The live search took the chart's trapped-air table of this very outline.
    assert asked and asked[-1][0] is sol.section and asked[-1][1] is not None
    assert asked[-1][1][0] is doc.level_tables[1].levels
    assert sol.section is not doc.section  # the preview's
    vented, trapped = doc.level_tables
    assert vented.levels.size == trapped.levels.size == PREVIEW_MIN_STEPS
    r = doc.design.resolve(doc.design.names[2])
    expect = law_level_table(sol.section, r.law.with_level(float(trapped.levels[-1])),
                             levels=trapped.levels, pockets="trapped",
                             atmospheric_pressure=r.atmospheric_pressure)
    assert np.array_equal(trapped.part_down["roof"], expect.part_down["roof"])
    _now, worst = w.uplift_panel.row_texts("roof")
    # Sampled at the chart's own levels (and the lips), not solved again.
    quick = worst_uplifts_for(sol, ["roof"], refine=False,
                              trapped_samples=(trapped.levels, trapped.part_down))["roof"]
    lips = [z for k, z in enumerate(sol.section.pocket_tree.level) if
            sol.section.pocket_tree.children[k]]
    assert quick[0] in set(trapped.levels.tolist()) | set(lips)
    assert "~" in worst and w.uplift_panel._rows["roof"].worst.toolTip() == SAMPLED_TIP
    assert w.uplift_panel.results[0].worst_uplift == quick[1]
    assert w.uplift_panel.results[0].worst_level == quick[0]
    w.canvas.handles.dragFinished.emit(1, float(x), float(z) - 0.1)
    settle(w)
    assert doc.preview is None and doc.solution.section is doc.section
    assert all(t.levels.size == CHART_STEPS for t in doc.level_tables)
    _now, worst = w.uplift_panel.row_texts("roof")
    full = worst_uplifts_for(doc.solution, ["roof"])["roof"]
    assert "~" not in worst and w.uplift_panel.results[0].worst_uplift == full[1]
    assert full[1] >= quick[1]
