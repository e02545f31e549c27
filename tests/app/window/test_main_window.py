"""The main window: files, canvas edits, panels, chart, export."""


import numpy as np
import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.window import dialogs
from wetline.core.numbers import format_number
from wetline.core.section_file import read_design, read_section_file


def test_opens_every_sample(make_window, sample_path, settle):
    w = make_window()
    assert w.open_path(str(sample_path))
    settle(w)
    design = read_design(sample_path)
    expected = design.resolve().case if design.cases else design.case
    assert w.doc.case == expected
    sol = w.doc.solution
    ref = design.solve().solution  # the first case (layers, gas, pockets and all)
    assert sol.floor_force == ref.floor_force and sol.support_reaction == ref.support_reaction
    assert sample_path.name in w.windowTitle()
    assert not w.isWindowModified()
    assert w.totals.values["floor"].text().startswith(
        w.doc.force_scope(expected.section).text(ref.floor_force).split()[0])
    # every part's resultant and the diagram are drawn
    assert w.canvas.load_layer.diagram.path().elementCount() > 0


def test_drag_vertex_changes_results_and_undo_restores(make_window, settle):
    w = make_window()
    before = w.doc.case
    weight = w.doc.solution.fluid_weight
    h = w.canvas.handles
    x, z = before.section.outline[1]
    h.dragStarted.emit(1)
    for dx in np.linspace(0.05, 0.6, 8):  # live preview, nothing pushed yet
        h.dragMoved.emit(1, x + dx, z)
    assert w.doc.undo_stack.count() == 0
    assert w.doc.preview is not None
    h.dragFinished.emit(1, x + 0.6, z)
    settle(w)
    assert w.doc.undo_stack.count() == 1
    assert w.doc.solution.fluid_weight > weight
    assert w.isWindowModified()
    w.actions_by_name["undo"].trigger()
    settle(w)
    assert w.doc.case is before
    assert w.doc.solution.fluid_weight == weight


def test_drag_to_crossing_marks_fault_and_keeps_results(make_window, settle):
    w = make_window()
    before = w.doc.case
    sol = w.doc.solution
    h = w.canvas.handles
    h.dragStarted.emit(1)
    h.dragMoved.emit(1, -1.0, 2.5)
    h.dragFinished.emit(1, -1.0, 2.5)
    settle(w)
    assert w.doc.draft is not None
    assert w.canvas.outline_layer.fault_text.isVisible()
    assert str(w.doc.draft.error) in w.canvas.outline_layer.fault_text.toPlainText()
    assert w.doc.case is before and w.doc.solution is sol
    w.undo()  # drops the invalid outline
    fault_text = w.canvas.outline_layer.fault_text
    assert w.doc.draft is None and not fault_text.isVisible() or settle(w) is None


def test_slider_moves_chart_cursor_and_totals(make_window, settle):
    w = make_window()
    fp = w.fill_panel
    text = w.totals.values["volume"].text()
    fp.slider.setSliderDown(True)
    fp._on_slider_pressed()
    for v in (100, 200, 300):
        fp.slider.setValue(v)
    fp.slider.setSliderDown(False)
    settle(w)
    assert w.doc.undo_stack.count() == 1
    level = w.doc.solution.level
    assert w.chart.cursor_level == pytest.approx(level)
    assert w.totals.values["volume"].text() != text
    assert w.totals.values["level"].text() == w.doc.units.fmt_length(level)


def test_page_keys_step_the_level(make_window, settle):
    w = make_window()
    level = w.doc.case.level
    w.actions_by_name["lower"].trigger()
    w.actions_by_name["lower"].trigger()
    settle(w)
    assert w.doc.case.level < level
    assert w.doc.undo_stack.count() == 1


def test_part_change_from_vertex_table(make_window, settle):
    w = make_window()
    s0 = w.doc.solution
    lid = s0.parts["lid"].down
    assert lid < 0  # the sump lid is lifted
    model = w.vertices_table.model()
    assert model.setData(model.index(2, 2), "floor", Qt.EditRole)
    settle(w)
    s1 = w.doc.solution
    assert s1.floor_force == pytest.approx(s0.floor_force + lid)
    assert s1.support_reaction == pytest.approx(s0.support_reaction - lid, abs=1e-9)
    assert w.doc.undo_stack.undoText() == "Set part of edge 2 to floor"


def test_typed_coordinate_in_display_units(make_window, settle):
    w = make_window()
    editing.set_units(w.doc, type(w.doc.units)("si", "mm"))
    model = w.vertices_table.model()
    assert model.setData(model.index(1, 0), "2500", Qt.EditRole)
    assert w.doc.section.outline[1, 0] == pytest.approx(2.5)
    assert not model.setData(model.index(1, 0), "two", Qt.EditRole)
    assert "must be a finite decimal number" in model.last_error
    assert w.doc.section.outline[1, 0] == pytest.approx(2.5)


def test_edge_selection_syncs_table_and_canvas(make_window, settle):
    w = make_window()
    w.edges_table.selectRow(3)
    assert w.doc.selected_edge == 3
    assert len(w.canvas.outline_layer.highlight.getData()[0]) == 2
    w.doc.select_edge(1)
    assert w.edges_table.selectionModel().currentIndex().row() == 1
    x, z = (w.doc.section.outline[0] + w.doc.section.outline[1]) / 2
    assert w.canvas.pick_edge(x, z) == 0


def test_bad_file_shows_error_and_keeps_document(make_window, tmp_path, no_dialogs):
    w = make_window()
    editing.fill_to_level(w.doc, 1.0)
    before = w.doc.case
    bad = tmp_path / "bad.section.json"
    bad.write_text('{"format": "wetline-section", "version": 1, "densty": 3}')
    assert not w.open_path(str(bad), ask=False)
    assert no_dialogs and "densty" in no_dialogs[-1][1]
    assert w.doc.case is before
    assert w.doc.undo_stack.count() == 1
    broken = tmp_path / "broken.section.json"
    broken.write_text("{ not json")
    assert not w.open_path(str(broken), ask=False)
    assert "JSON" in no_dialogs[-1][1]
    assert w.doc.case is before


def test_save_and_reopen(make_window, tmp_path, monkeypatch, settle):
    w = make_window()
    editing.fill_to_level(w.doc, 1.234)
    path = tmp_path / "s.section.json"
    monkeypatch.setattr(dialogs, "ask_save_path", lambda parent, suggested: str(path))
    assert w.save()
    assert not w.isWindowModified()
    assert path.name in w.windowTitle()
    assert read_section_file(path) == w.doc.case
    assert w._recent()[0] == str(path.resolve())
    w2 = make_window()
    assert w2.open_path(str(path))
    assert w2.doc.case == w.doc.case


def test_close_with_unsaved_changes_asks(make_window, monkeypatch):
    w = make_window()
    editing.fill_to_level(w.doc, 1.0)
    asked = []
    monkeypatch.setattr(dialogs, "ask_save_changes",
                        lambda parent, name: asked.append(name) or "cancel")
    assert not w.close()
    assert asked and w.isVisible()
    monkeypatch.setattr(dialogs, "ask_save_changes", lambda parent, name: "discard")
    assert w.close()


def test_export_writes_png(make_window, tmp_path, no_dialogs):
    from PySide6.QtGui import QImage

    w = make_window()
    out = tmp_path / "d.png"
    assert w.export_to(str(out), size=(900, 640)), no_dialogs
    img = QImage(str(out))
    assert (img.width(), img.height()) == (900, 640)
    colours = {img.pixel(x, y) for x in range(0, 900, 30) for y in range(0, 640, 30)}
    assert len(colours) > 3  # not blank


def test_units_switch_is_undoable_and_relabels(make_window, settle):
    w = make_window()
    w.units_combo.setCurrentIndex(3)  # US in
    settle(w)
    assert w.doc.units.length_unit == "in"
    assert "psi" in w.totals.values["max_pressure"].text()
    assert "lbf/ft" in w.totals.values["floor"].text()
    w.undo()
    settle(w)
    assert w.doc.units.system == "si"
    assert "kPa" in w.totals.values["max_pressure"].text()
    assert w.units_combo.currentIndex() == 0


def test_bad_typed_values_are_refused_with_a_message(make_window, settle):
    w = make_window()
    lp = w.liquid_panel
    lp.kind.setCurrentIndex(3)  # custom density (a change of liquid by itself)
    before = w.doc.case
    fp = w.fill_panel
    fp.mode.setCurrentIndex(1)  # volume
    fp.value.setText("1e9")
    fp.value.editingFinished.emit()
    assert fp.error.isVisibleTo(w) and "more than the section holds" in fp.error.text()
    fp.value.setText("abc")
    fp.value.editingFinished.emit()
    assert "not a number" in fp.error.text()
    lp.density.setText("-5")
    lp.density.editingFinished.emit()
    assert "positive" in lp.error.text()
    lp.gravity.setText("zero")
    lp.gravity.editingFinished.emit()
    assert "not a number" in lp.error.text()
    assert w.doc.case == before


def test_a_refusal_goes_with_the_text_it_refused(make_window, settle):
    """A refused text stays in the box to be mended, its reason under it;
    once the fill moves by other means (the slider, a drag) the box shows
    the new fill and the reason goes with the refused text (it stayed,
    under a box that no longer held that text; seen under Xvfb)."""
    w = make_window()
    fp = w.fill_panel
    fp.value.setText("1,5 ft")
    fp.value.editingFinished.emit()
    assert "not a number" in fp.error.text() and fp.value.text() == "1,5 ft"
    settle(w)
    assert "not a number" in fp.error.text()  # a solve of the same fill keeps both
    x, z = w.doc.section.outline[1]
    editing.move_vertex(w.doc, 1, x + 0.1, z)  # the section changes: the box is written
    settle(w)
    assert fp.value.text() == format_number(w.doc.units.length(w.doc.case.fill_level), 5)
    assert fp.error.text() == "" and not fp.error.isVisibleTo(w)


def test_seawater_and_percent_fill(make_window, settle):
    w = make_window()
    lp = w.liquid_panel
    lp.kind.setCurrentIndex(1)
    lp.temperature.setText("10")
    lp.temperature.editingFinished.emit()
    settle(w)
    assert w.doc.case.liquid.preset == "seawater"
    assert w.doc.undo_stack.undoText().startswith("Liquid: seawater 10")
    fp = w.fill_panel
    fp.mode.setCurrentIndex(2)
    fp.value.setText("50")
    fp.value.editingFinished.emit()
    settle(w)
    from wetline.core.fill import capacity
    assert w.doc.solution.volume == pytest.approx(0.5 * capacity(w.doc.section), rel=1e-9)


def test_open_section_level_above_spill_is_capped_with_note(make_window, settle):
    w = make_window()
    fp = w.fill_panel
    fp.value.setText("10")
    fp.value.editingFinished.emit()
    settle(w)
    assert w.doc.solution.level == w.doc.section.spill_level
    assert "Capped" in fp.note.text()


def test_closed_section_accepts_head_above_roof(make_window, template_case, settle):
    w = make_window(template_case("closed_tank"))
    fp = w.fill_panel
    fp.value.setText("5")
    fp.value.editingFinished.emit()
    settle(w)
    assert w.doc.solution.level == 5.0
    assert "above the roof" in fp.note.text()


def test_new_from_template(make_window, monkeypatch, settle):
    from wetline.app.window.template_dialog import TemplateDialog

    w = make_window()
    dlg = TemplateDialog(w.doc.units)
    dlg.select("cone_hopper")
    dlg.fields["radius"].setText("2")
    dlg.accept()
    assert dlg.result_section.is_axisymmetric
    monkeypatch.setattr(dialogs, "ask_template", lambda parent, units: (
        dlg.result_section, dlg.result_level))
    assert w.new_from_template()
    settle(w)
    assert w.doc.section.outline[:, 0].max() == 2.0
    assert w.actions_by_name["axi"].isChecked()
    bad = TemplateDialog(w.doc.units)
    bad.select("open_tank")
    bad.fields["tank_width"].setText("-1")
    bad.accept()
    assert "positive" in bad.error.text() and bad.result_section is None
    wide = TemplateDialog(w.doc.units)
    wide.select("open_tank")
    wide.fields["tank_width"].setText("5")
    wide.width_field.setText("2")
    wide.accept()
    assert wide.result_section.outline[:, 0].max() == 5.0
    assert wide.result_section.width == 2.0


def test_draw_insert_and_delete(make_window, settle):
    w = make_window()
    c = w.canvas
    c.set_mode("draw")
    for p in [(0, 0), (3, 0), (3, 2), (0, 2)]:
        c.add_drawn_point(*p)
    assert c.finish_drawing()
    settle(w)
    assert w.doc.section.n_edges == 4
    assert w.doc.undo_stack.undoText() == "Draw new outline"
    c.insert_on_edge(0, 1.5, 0.0)
    assert w.doc.section.n_edges == 5 and w.doc.selected_vertex == 1
    c.nudge_selected(0.0, -0.5)
    c.nudge_selected(0.0, -0.5)
    assert w.doc.section.outline[1, 1] == pytest.approx(-1.0)
    assert c.delete_selected()
    assert w.doc.section.n_edges == 4


def test_hover_text_gives_depth_and_pressure(make_window):
    w = make_window()
    sol = w.doc.solution
    text = w.canvas.describe_point(1.0, sol.level - 1.0)
    p = sol.density * sol.gravity * 1.0
    assert "depth 1 m" in text and w.doc.units.fmt_pressure(p) in text


def test_launch_opens_window(qtbot, monkeypatch, no_dialogs):
    import sys

    from PySide6.QtWidgets import QApplication

    from wetline.app.window import launch as gui

    monkeypatch.setattr(sys, "excepthook", sys.excepthook)  # launch installs its own
    seen = []
    monkeypatch.setattr(QApplication, "exec", lambda *a: seen.append(
        QApplication.topLevelWidgets()) or 0)
    assert gui.launch(None) == 0
    wins = [x for x in seen[0] if x.__class__.__name__ == "MainWindow"]
    assert wins and "Wetline" in wins[-1].windowTitle()
    for x in wins:
        x.doc.set_case(x.doc.case)
        x.close()
        x.deleteLater()


def test_excepthook_shows_error_instead_of_exiting(no_dialogs, capsys):
    from wetline.app.window import launch as gui

    try:
        raise RuntimeError("boom")
    except RuntimeError as exc:
        gui.excepthook(type(exc), exc, exc.__traceback__)
    assert no_dialogs and "RuntimeError: boom" in no_dialogs[-1][1]
    assert "boom" in capsys.readouterr().err


def test_invalid_drawn_outline_is_marked(make_window, settle):
    w = make_window()
    before = w.doc.case
    c = w.canvas
    c.set_mode("draw")
    for p in [(0, 0), (2, 2), (2, 0), (0, 2)]:  # a bow tie: crosses itself
        c.add_drawn_point(*p)
    assert not c.finish_drawing()
    settle(w)
    assert "crosses itself" in str(w.doc.draft.error)
    assert w.doc.case is before
    assert w.actions_by_name["discard"].isEnabled()
    w.actions_by_name["discard"].trigger()
    assert w.doc.draft is None


def test_real_mouse_drag_moves_vertex_in_one_step(make_window, settle):
    from PySide6.QtCore import QEvent, QPointF
    from PySide6.QtGui import QMouseEvent
    from PySide6.QtWidgets import QApplication

    w = make_window()
    c = w.canvas
    vp = c.viewport()

    def at(x, z):
        return c.mapFromScene(c.getPlotItem().getViewBox().mapViewToScene(QPointF(x, z))).toPointF()

    def send(kind, pos, button, buttons):
        QApplication.sendEvent(vp, QMouseEvent(kind, pos, vp.mapToGlobal(pos), button,
                                               buttons, Qt.NoModifier))

    x, z = w.doc.section.outline[1]
    p0, p1 = at(x, z), at(x + 0.5, z)
    send(QEvent.MouseButtonPress, p0, Qt.LeftButton, Qt.LeftButton)
    for k in range(1, 11):
        send(QEvent.MouseMove, QPointF(p0.x() + (p1.x() - p0.x()) * k / 10, p0.y()),
             Qt.NoButton, Qt.LeftButton)
    assert w.doc.undo_stack.count() == 0  # live preview only
    send(QEvent.MouseButtonRelease, p1, Qt.LeftButton, Qt.NoButton)
    settle(w)
    pixel = max(c.getPlotItem().getViewBox().viewPixelSize())
    assert w.doc.section.outline[1] == pytest.approx([x + 0.5, z], abs=2 * pixel)
    assert w.doc.undo_stack.count() == 1
    assert w.doc.undo_stack.undoText() == "Move vertex 1"


def test_hover_outside_the_section_says_so(make_window):
    w = make_window()
    assert "outside the section" in w.canvas.describe_point(-1.0, 0.5)


def test_a_file_opens_shown_in_its_own_length_unit(make_window, settle, sample, tmp_path):
    """A file written in feet opens shown in feet (US units), one in mm in
    SI mm: its author's numbers, where the window showed every file in SI
    metres (the seawater intake's 14 ft fill read "4.2672 m"). The unit is
    a view, not an edit: nothing to undo. A unit the display does not offer
    (cm) leaves the display as it is."""
    import json

    from wetline.app.model.display import DisplayChoice

    w = make_window()
    assert w.open_path(str(sample("seawater_intake_bay")))
    settle(w)
    assert w.doc.units == DisplayChoice("us", "ft")
    assert w.fill_panel.value.text() == "14"
    assert w.doc.undo_stack.count() == 0 and not w.isWindowModified()
    assert w.open_path(str(sample("cone_hopper")), ask=False)
    settle(w)
    assert w.doc.units == DisplayChoice("si", "m")
    data = json.loads(sample("cone_hopper").read_text(encoding="utf-8"))
    for unit, factor, shown in (("mm", 1000, DisplayChoice("si", "mm")),
                                ("cm", 100, DisplayChoice("si", "mm"))):
        data["length_unit"] = unit
        data["outline"] = [[x * factor, z * factor] for x, z in
                           json.loads(sample("cone_hopper").read_text())["outline"]]
        data["fill"] = {"level": 1.5 * factor}
        path = tmp_path / f"hopper_{unit}.section.json"
        path.write_text(json.dumps(data), encoding="utf-8")
        assert w.open_path(str(path), ask=False)
        settle(w)
        assert w.doc.units == shown
