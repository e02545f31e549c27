"""The window on a buried wet well with load cases: the case list, every
view following the active case, the envelope view, the structure dialog,
the structure's outline in the vertex table, the flotation panel.

The numbers the views show are compared with core solving each case on its
own (``Design.solve``, ``envelope``); core's results are checked against
textbooks and Archimedes in tests/core.
"""

import numpy as np
import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.window import dialogs
from wetline.app.window.structure_dialog import StructureChoice
from wetline.core.load_cases import EMPTY, SPILL, envelope
from wetline.core.numbers import format_number


@pytest.fixture
def well(make_window, buried_wet_well, settle):
    w = make_window(buried_wet_well())
    settle(w)
    return w


def _cell(model, row, col):
    return model.data(model.index(row, col), Qt.DisplayRole)


def _case_rows(w):
    m = w.case_list.model
    return [_cell(m, r, 0) for r in range(m.rowCount())]


# --------------------------------------------------------------- the list
def test_the_list_shows_every_case_with_its_fill_factor_and_groundwater(well):
    m = well.case_list.model
    assert _case_rows(well) == ["normal top water", "overflow", "water test",
                                "empty, flood groundwater"]
    assert [_cell(m, r, 1) for r in range(4)] == ["3.2 m", "spill (4 m)", "spill (4 m)",
                                                  "empty"]
    assert [_cell(m, r, 2) for r in range(4)] == ["1.35", "1.35", "1", "1"]
    assert [_cell(m, r, 3) for r in range(4)] == ["none", "none", "none", "4 m"]


def test_each_button_is_one_undo_step(well, settle):
    doc = well.doc
    panel = well.case_list
    before = doc.design
    panel.buttons["add"].click()
    assert _case_rows(well)[-1] == "case 5" and doc.active_index == 4
    panel.buttons["up"].click()
    assert _case_rows(well)[3] == "case 5" and doc.active_index == 3
    panel.buttons["duplicate"].click()
    assert _case_rows(well)[4] == "case 5 copy"
    assert panel.rename(4, "flood, half")
    assert _case_rows(well)[4] == "flood, half"
    panel.buttons["down"].click()
    assert _case_rows(well)[5] == "flood, half"
    panel.buttons["delete"].click()
    assert "flood, half" not in _case_rows(well)
    assert doc.undo_stack.count() == 6
    for _ in range(6):
        well.undo()
    settle(well)
    assert doc.design is before
    assert _case_rows(well) == ["normal top water", "overflow", "water test",
                                "empty, flood groundwater"]


def test_a_taken_name_is_refused_with_its_reason(well):
    assert not well.case_list.rename(0, "overflow")
    assert "unique" in well.case_list.error.text()
    assert well.doc.undo_stack.count() == 0


def test_delete_is_off_for_the_last_case(make_window, buried_wet_well):
    w = make_window(buried_wet_well(cases=False))
    assert not w.case_list.buttons["delete"].isEnabled()
    w.case_list.buttons["add"].click()
    assert w.case_list.buttons["delete"].isEnabled()


def test_fill_choice_groundwater_and_load_factor_of_the_active_case(well, settle):
    doc = well.doc
    panel = well.case_list
    panel.table.selectRow(0)
    assert doc.active_index == 0
    panel.fill.setCurrentIndex(panel.fill.findData(SPILL))
    panel.fill.activated.emit(panel.fill.currentIndex())
    assert doc.design.cases[0].fill_level == SPILL
    panel.fill.setCurrentIndex(panel.fill.findData(EMPTY))
    panel.fill.activated.emit(panel.fill.currentIndex())
    assert doc.design.cases[0].fill_level == EMPTY
    panel.groundwater.setChecked(True)  # offered at the ground level
    assert doc.design.cases[0].groundwater.level == 4.0
    panel.gw_level.setText("2.5")
    panel.gw_level.editingFinished.emit()
    assert doc.design.cases[0].groundwater.level == 2.5
    panel.load_factor.setText("1.2")
    panel.load_factor.editingFinished.emit()
    assert doc.design.cases[0].load_factor == 1.2
    panel.load_factor.setText("none")
    panel.load_factor.editingFinished.emit()
    assert "not a number" in panel.error.text()
    panel.gw_level.setText("4.5")  # above the riser's spill level
    panel.gw_level.editingFinished.emit()
    assert "spill" in panel.error.text()
    assert doc.design.cases[0].groundwater.level == 2.5
    assert doc.undo_stack.count() == 5


# ----------------------------------------------- every view follows the case
@pytest.mark.parametrize("index", range(4))
def test_choosing_a_case_drives_every_view(well, settle, index):
    doc = well.doc
    editing.set_resistance(doc, "roof", "self_weight", 7500.0)  # the file level's
    settle(well)
    well.case_list.table.selectRow(index)
    settle(well)
    assert doc.active_index == index
    ref = doc.design.solve(doc.case_names[index])
    sol = ref.solution
    scope, scale = doc.force_scope(), doc.force_scale
    # totals
    assert well.totals.values["case"].text().startswith(ref.name)
    assert well.totals.values["floor"].text() == scope.text(sol.floor_force, scale=scale)
    assert well.totals.values["level"].text() == doc.units.fmt_length(sol.level)
    # part and edge tables
    parts = well.parts_table.model()
    rows = {_cell(parts, r, 0): r for r in range(parts.rowCount())}
    assert _cell(parts, rows["floor"], 3) == scope.number(sol.parts["floor"].down,
                                                          scale=scale)
    if ref.load_factor != 1.0:  # the design value beside the characteristic one
        assert _cell(parts, rows["floor"], 4) == scope.number(
            ref.load_factor * sol.parts["floor"].down, scale=ref.load_factor * scale)
    edges = well.edges_table.model()
    for i in range(doc.section.n_edges):
        assert _cell(edges, i, 3) == format_number(doc.units.pressure(sol.p_start[i]))
        assert _cell(edges, i, 4) == format_number(doc.units.pressure(sol.p_end[i]))
    # chart: the cursor at the case's level
    assert well.chart.cursor_level == pytest.approx(sol.level)
    # flotation panel: the case's StructureLoads
    f = ref.structure.flotation
    fp = well.flotation_panel
    assert fp.text("uplift") == scope.text(f.uplift, scale=scale)
    assert fp.text("resistance") == scope.text(f.resistance)
    assert fp.text("self_weight") == scope.text(ref.structure.self_weight)
    assert fp.text("soil") == scope.text(ref.structure.soil_weight)
    # uplift panel: the uplift check of the case's own solution
    results = {r.part: r for r in well.uplift_panel.results}
    for r in ref.resolved.case.uplift(sol):
        assert results[r.part].factor == r.factor
        assert results[r.part].uplift == r.uplift
    # canvas: the groundwater's diagram only where the case has groundwater
    water = well.canvas.structure_layer.water_solution
    assert (water is not None) == (ref.resolved.groundwater is not None)
    if water is not None:
        np.testing.assert_allclose(-water.fz, ref.structure.fz, rtol=0, atol=0)


def test_the_flotation_panel_shows_structure_loads(well, settle):
    doc = well.doc
    doc.select_case(3)
    settle(well)
    loads = doc.design.solve("empty, flood groundwater").structure
    f = loads.flotation
    fp = well.flotation_panel
    # Hand check, from first principles (common practice): the structure is
    # 3.6 m x 4.4 m less the riser's notch 0.8 m x 1.2 m, all below the
    # groundwater at 4 m, so U = 9806.65 x (15.84 - 0.96) = 145922.952 N/m
    # (Archimedes); G = 25000 x (14.88 - 3 x 2.5 - 2.2 x 1.5) = 102000 N/m;
    # soil on the 0.8 m ledge at 2.8 m under water, 1.2 m of
    # (20000 - 9806.65) N/m3: 9785.616 N/m; R / U = 111785.616 / 145922.952.
    assert f.uplift == pytest.approx(145922.952, rel=1e-12)
    assert f.resistance == pytest.approx(111785.616, rel=1e-12)
    assert fp.text("factor") == f"NOT OK {format_number(f.factor)} required " \
                                f"{format_number(f.required)}"
    assert format_number(f.factor) == "0.7661"
    assert fp.text("lowest").startswith("NOT OK 0.7661 in empty, flood groundwater")
    base = loads.base_net_max
    assert fp.text("base").startswith(doc.units.fmt_pressure(base.net))
    assert fp.text("base_envelope").startswith(doc.units.fmt_pressure(
        doc.envelope.base.net_upward_pressure))
    assert not fp.shown("design_factor")  # a load factor of 1
    doc.select_case(0)
    settle(well)
    assert fp.text("factor").startswith("OK") and "nothing lifts" in fp.text("factor")


# --------------------------------------------------------- the envelope view
def test_the_envelope_view_shows_cores_envelope(well, settle):
    doc = well.doc
    well.view_combo.setCurrentIndex(well.view_combo.findData("envelope"))
    settle(well)
    assert doc.view_mode == "envelope"
    assert well.actions_by_name["envelope"].isChecked()
    ref = envelope(doc.design.solve_all())
    scope = doc.force_scope()
    parts = well.parts_table.model()
    assert parts.headerData(1, Qt.Horizontal).startswith("Max down")
    shown = {_cell(parts, r, 0): [_cell(parts, r, c) for c in range(1, 5)]
             for r in range(parts.rowCount())}
    for name, p in ref.parts.items():
        assert shown[name] == [scope.number(p.max_down), p.max_down_case or "-",
                               scope.number(p.max_up), p.max_up_case or "-"]
    assert shown["floor"][1] == "overflow" and shown["roof"][3] == "overflow"
    edges = well.edges_table.model()
    for i in range(doc.section.n_edges):
        pressure, case = ref.edge(i)
        assert _cell(edges, i, 2) == format_number(doc.units.pressure(pressure))
        assert _cell(edges, i, 3) == (case or "-")
    w = well.canvas.load_layer.envelope_edges
    got = np.zeros(doc.section.n_edges)
    got[w.index] = np.maximum(w.pa, w.pb)
    np.testing.assert_allclose(got, ref.edge_max_pressure, rtol=1e-15, atol=0)
    assert any("floor max down" in t and "(overflow)" in t for t in well.chart.mark_texts)
    # Each mark's text on a light ground over the curves (it was drawn
    # straight over the roof curve and the zero line, hard to read).
    curves = max(c.zValue() for c in well.chart._curves)
    for label in well.chart._mark_labels:
        assert label.zValue() > curves and label.fill.color().alpha() >= 128
        # ... and under the cursor, whose value it hid at the spill level.
        assert label.zValue() < well.chart.cursor.zValue()
        assert label.fill.color().lightness() == 255
    well.set_view_mode("case")
    settle(well)
    assert well.chart.mark_texts == []
    assert well.canvas.load_layer.envelope_edges is None


def test_the_envelope_view_follows_an_edit(well, settle):
    doc = well.doc
    well.set_view_mode("envelope")
    doc.select_case(1)
    editing.set_load_factor(doc, 1.5)
    settle(well)
    parts = well.parts_table.model()
    rows = {_cell(parts, r, 0): r for r in range(parts.rowCount())}
    floor = envelope(doc.design.solve_all()).parts["floor"]
    assert _cell(parts, rows["floor"], 1) == doc.force_scope().number(floor.max_down)


# --------------------------------------------------------------- structure
def test_the_structure_dialog_builds_walls_and_undo_removes_them(make_window, buried_wet_well,
                                                                   monkeypatch, settle):
    design = buried_wet_well(cases=False)
    from wetline.core.load_cases import Design

    w = make_window(Design(design.case))
    asked = []
    monkeypatch.setattr(dialogs, "ask_structure", lambda parent, units, section, s, g: (
        asked.append(s) or StructureChoice(walls=(0.4, 0.3, 0.3), unit_weight=25000.0,
                                           ground=(4.0, 18000.0, 20000.0))))
    assert w.edit_structure()
    assert asked == [None]
    np.testing.assert_array_equal(w.doc.structure.outline, design.structure.outline)
    assert w.doc.ground.level == 4.0
    settle(w)
    assert w.flotation_panel.text("self_weight") == w.doc.force_scope().text(102000.0)
    assert w.doc.undo_stack.undoText().startswith("Structure: walls 0.3 m")
    w.undo()
    settle(w)
    assert w.doc.structure is None
    assert "No structure" in w.flotation_panel.note.text()


def test_the_dialog_itself_reads_its_fields(qtbot, buried_wet_well):
    from wetline.app.model.display import DisplayChoice
    from wetline.app.window.structure_dialog import StructureDialog

    d = buried_wet_well()
    dlg = StructureDialog(DisplayChoice("si", "mm"), d.section, d.structure, d.ground)
    qtbot.addWidget(dlg)
    assert not dlg.rebuild.isChecked()  # a structure there keeps its outline
    assert dlg.unit_weight.text() == "25"
    dlg.rebuild.setChecked(True)
    dlg.wall.setText("250")
    dlg.extra.setText("2.5")
    choice = dlg.read_choice()
    assert choice.walls == (0.4, 0.25, 0.3)
    assert choice.extra_weight == 2500.0 and choice.unit_weight == 25000.0
    assert choice.ground == (4.0, 18000.0, 20000.0)
    dlg.base.setText("-1")
    with pytest.raises(ValueError, match="Base thickness must be positive"):
        dlg.read_choice()
    # OK refuses it under the fields; the refusal goes once the field is
    # typed again (it stayed under a mended field).
    dlg.show()
    dlg._on_ok()
    assert "Base thickness must be positive" in dlg.error.text() and dlg.error.isVisible()
    dlg.base.selectAll()
    qtbot.keyClicks(dlg.base, "300")
    assert dlg.error.text() == "" and not dlg.error.isVisible()


def test_removing_the_structure_from_the_dialog(well, monkeypatch, settle):
    monkeypatch.setattr(dialogs, "ask_structure",
                        lambda *a: StructureChoice(remove=True))
    assert well.edit_structure()
    settle(well)
    assert well.doc.structure is None
    assert well.canvas.structure_layer.water_solution is None
    assert not well.case_list.groundwater.isEnabled()


def test_an_invalid_structure_outline_in_the_table_is_refused_and_marked(well, settle):
    pane = well.vertices_pane
    pane.set_target("structure")
    model = well.vertices_table.model()
    assert model.target == "structure"
    assert _cell(model, 1, 0) == "3.3"
    before = well.doc.design
    model.setData(model.index(1, 0), "2")  # x of (3.3, -0.4) into the cavity's span
    model.setData(model.index(1, 1), "1")
    settle(well)
    assert well.doc.design is before
    draft = well.doc.draft
    assert draft is not None and draft.target == "structure"
    assert "Invalid structure outline" in model.last_error
    bad = set(draft.error.vertices)
    assert bad and all(model.data(model.index(i, 0), Qt.BackgroundRole) is not None
                       for i in bad)
    # The canvas marks the place.
    fault = well.canvas.outline_layer.fault.data
    assert len(fault) == 1
    assert (fault["x"][0], fault["y"][0]) == pytest.approx(draft.error.location)
    well.undo()  # drops the invalid outline
    assert well.doc.draft is None
    model.setData(model.index(1, 0), "3.5")
    assert well.doc.structure.outline[1, 0] == 3.5
    assert well.doc.undo_stack.undoText() == "Move structure vertex 1"


def test_a_cavity_outline_the_structure_no_longer_holds_is_marked(well, settle):
    model = well.vertices_table.model()
    assert model.target == "cavity"
    model.setData(model.index(1, 0), "3.6")
    settle(well)
    assert well.doc.draft is not None and well.doc.undo_stack.count() == 0
    assert "outside the structure" in str(well.doc.draft.error)
    assert well.canvas.outline_layer.fault_text.isVisible()


def test_saving_and_opening_keeps_the_cases(well, tmp_path, monkeypatch, settle):
    path = tmp_path / "well.section.json"
    monkeypatch.setattr(dialogs, "ask_save_path", lambda parent, suggested="": str(path))
    editing.add_case(well.doc)
    assert well.save()
    assert not well.doc.is_modified
    design = well.doc.design
    assert well.open_path(path)
    settle(well)
    from wetline.app.model.cases import same_design

    assert same_design(well.doc.design, design)
    assert _case_rows(well)[-1] == "case 5"


# ------------------------------------------------------- looked at as a user
def test_a_screenshot_of_the_wet_well_keeps_its_labels_apart(well, settle, tmp_path):
    doc = well.doc
    for index, mode in ((3, "case"), (1, "case"), (1, "envelope")):
        doc.select_case(index)
        well.set_view_mode(mode)
        settle(well)
        well.canvas.fit()
        settle(well)
        image = well.grab()
        path = tmp_path / f"wet_well_{index}_{mode}.png"
        assert image.save(str(path)) and path.stat().st_size > 10_000
        labels = well.canvas.shown_labels()
        boxes = well.canvas.label_boxes()
        assert len(boxes) == len(labels)
        for i, a in enumerate(boxes):  # no two labels on top of each other
            for b in boxes[i + 1:]:
                overlap = min(a[2], b[2]) - max(a[0], b[0]), min(a[3], b[3]) - max(a[1], b[1])
                assert not (overlap[0] > 2 and overlap[1] > 2), (labels, a, b)
        if index == 3:
            assert "groundwater 4 m" in labels and "ground 4 m" in labels
        if mode == "envelope":
            assert labels[0] == "envelope of 4 cases (design values)"


def test_the_envelope_waits_for_the_slider_and_follows_its_release(well, settle):
    doc = well.doc
    well.set_view_mode("envelope")
    doc.select_case(0)
    settle(well)
    slider = well.fill_panel.slider
    old = doc.envelope
    slider.setSliderDown(True)
    slider.sliderPressed.emit()
    for v in (300, 500, 700):
        slider.setValue(v)
        settle(well)
    assert doc.envelope is old and not doc.envelope_current
    assert "updates on release" in well.flotation_panel.text("lowest")
    slider.setSliderDown(False)
    slider.sliderReleased.emit()
    settle(well)
    assert doc.envelope_current and doc.envelope is not old
    assert "updates on release" not in well.flotation_panel.text("lowest")
    assert doc.undo_stack.count() == 1  # one drag, one step


def test_a_restored_recovery_copy_keeps_the_cases(make_window, buried_wet_well, tmp_path,
                                                  settle):
    from wetline.app.model import recovery
    from wetline.app.model.cases import same_design

    design = buried_wet_well()
    recovery.write_copy(tmp_path, "old", design, "well", "/jobs/well.section.json")
    (copy,) = recovery.list_copies(tmp_path)
    w = make_window(recovery_folder=tmp_path / "mine")
    assert w.restore_recovery(copy)
    settle(w)
    assert same_design(w.doc.design, design) and w.doc.is_modified
    assert _case_rows(w) == list(design.names)


def test_dragging_a_structure_vertex_on_the_canvas(well, settle):
    doc = well.doc
    handles = well.canvas.structure_handles
    assert handles.isVisible() and len(handles.data) == doc.structure.n_edges
    x, z = doc.structure.outline[1]
    assert well.canvas.editor.pick_structure_vertex(x, z) == 1
    handles.dragStarted.emit(1)
    handles.dragMoved.emit(1, 3.6, -0.4)  # on the default snap spacing
    dragged = well.canvas.structure_layer.drag
    assert dragged.xData is not None and 3.6 in dragged.xData  # shown dashed
    assert doc.undo_stack.count() == 0  # not an edit yet
    handles.dragFinished.emit(1, 3.5, -0.4)
    settle(well)
    assert doc.structure.outline[1].tolist() == [3.5, -0.4]
    assert doc.undo_stack.undoText() == "Move structure vertex 1"
    assert len(dragged.xData) == 0
    # Into the cavity: refused, marked, nothing changes.
    before = doc.design
    handles.dragFinished.emit(1, 1.5, 1.0)
    settle(well)
    assert doc.design is before and doc.draft.target == "structure"
    assert well.canvas.outline_layer.fault_text.isVisible()


def test_the_list_columns_grow_to_texts_that_grow(well, settle):
    # In feet the Fill column's texts are longer ("spill (13.12 ft)" where
    # it read "spill (4 m)"); the column must show them whole, not cut.
    from wetline.app.model.display import DisplayChoice

    table = well.case_list.table
    m = well.case_list.model

    def cut_cells():
        cut = []
        for c in (1, 2, 3):
            for r in range(m.rowCount()):
                need = table.sizeHintForIndex(m.index(r, c)).width()
                if need > table.columnWidth(c):
                    cut.append((r, c, _cell(m, r, c)))
        return cut

    assert cut_cells() == []
    editing.set_units(well.doc, DisplayChoice("us", "ft"))
    settle(well)
    assert _cell(m, 1, 1) == "spill (13.12 ft)"
    assert cut_cells() == []


def test_the_list_writes_its_texts_again_for_new_units_and_precision(well, settle):
    # The rows keep their texts while their cases are the same objects (a
    # slider step changes one); new units or a new precision policy must
    # still reach every row.
    from dataclasses import replace

    from wetline.app.model.display import DisplayChoice

    m = well.case_list.model
    editing.set_units(well.doc, DisplayChoice("us", "ft"))
    settle(well)
    assert _cell(m, 1, 1) == "spill (13.12 ft)"
    report = replace(well.doc.case.report, significant_figures=6)
    assert editing.set_report_info(well.doc, report) is not False
    settle(well)
    assert _cell(m, 1, 1) == "spill (13.1234 ft)"
    slider = well.fill_panel.slider
    slider.setValue(slider.value() - 50)  # the active case's fill: its row only
    settle(well)
    assert _cell(m, 1, 1) == "spill (13.1234 ft)"
    assert _cell(m, 0, 1) == well.doc.units.fmt_length(well.doc.solution.level)


def test_a_design_without_cases_shows_its_fill_as_the_slider_moves_it(make_window, settle):
    """A file without load cases lists its own case as the one row: the row's
    fill follows the slider, its typed level and an undo (it read the
    opening fill, "2.2 m", after the slider had moved the fill elsewhere)."""
    w = make_window()  # the sump template: no load cases
    settle(w)
    m = w.case_list.model
    doc = w.doc
    assert not doc.design.cases and m.rowCount() == 1
    slider = w.fill_panel.slider
    slider.setSliderDown(True)
    slider.sliderPressed.emit()
    for v in (300, 500):
        slider.setValue(v)
        settle(w)
        assert _cell(m, 0, 1) == doc.units.fmt_length(doc.solution.level)
    slider.setSliderDown(False)
    slider.sliderReleased.emit()
    settle(w)
    assert _cell(m, 0, 1) == doc.units.fmt_length(doc.solution.level)
    editing.fill_to_level(doc, 1.25)
    settle(w)
    assert _cell(m, 0, 1) == "1.25 m"
    doc.undo_stack.undo()
    settle(w)
    assert _cell(m, 0, 1) == doc.units.fmt_length(doc.solution.level) != "1.25 m"


def test_the_envelope_of_one_case_is_told_in_the_singular(make_window, settle):
    w = make_window()  # the sump template: one case
    w.set_view_mode("envelope")
    settle(w)
    assert w.canvas.shown_labels()[0] == "envelope of 1 case (design values)"


def test_a_fill_typed_above_the_spill_level_is_listed_as_capped(well, settle):
    """A level typed above an open section's spill level is kept as typed
    (a later raised wall lets it stand) but solved at the spill level, as
    the command line and the sheet say ("capped at the spill level"); the
    list read the typed "7 m" alone, as if the well held 7 m of water."""
    doc = well.doc
    editing.fill_to_level(doc, 7.0)
    settle(well)
    assert doc.load_cases[0].fill_level == 7.0 and doc.solution.level == 4.0
    assert _cell(well.case_list.model, 0, 1) == "7 m, capped at 4 m"
    editing.fill_to_level(doc, 3.0)
    settle(well)
    assert _cell(well.case_list.model, 0, 1) == "3 m"
