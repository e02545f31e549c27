"""The uplift check panel and the calculation sheet header, from the GUI."""

import json

import numpy as np
import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.render.style import NOT_OK_COLOUR, OK_COLOUR
from wetline.app.window import dialogs
from wetline.core.case import ReportInfo
from wetline.core.numbers import format_number
from wetline.core.section_file import read_section_file
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, REQUIRED_FACTOR_SOURCE, UPLIFT_CAUTION

KN = 1000.0


def type_into(edit, text):
    """Type ``text`` into a line edit and finish editing (as Return does)."""
    edit.setText(text)
    edit.editingFinished.emit()


@pytest.fixture
def sump_window(make_window, settle, sample):
    w = make_window()
    assert w.open_path(str(sample("sump_with_lid")))
    settle(w)
    return w


def lid_weight(w, self_weight="1.8", holding_down="2.5"):
    panel = w.uplift_panel
    type_into(panel.edit("lid", "self_weight"), self_weight)
    type_into(panel.edit("lid", "holding_down"), holding_down)
    w.doc.flush()


def test_panel_shows_the_core_check_and_verdicts(sump_window, settle):
    w = sump_window
    panel = w.uplift_panel
    assert set(panel._rows) == {"floor", "wall", "lid"}  # loaded parts only
    assert panel.row_texts("lid")[0] == "-"  # nothing entered, nothing checked
    lid_weight(w)
    settle(w)
    res = w.doc.case.resistance_map["lid"]
    assert (res.self_weight, res.holding_down) == pytest.approx((1800.0, 2500.0))
    (r,) = w.doc.case.uplift()  # the core's own check of the same case
    assert r.ok_now and not r.ok  # OK at 2.2 m, NOT OK at the worst level
    now, worst = panel.row_texts("lid")
    assert now == f"OK {format_number(r.factor)}"
    assert worst == (f"NOT OK {format_number(r.worst_factor)} at "
                     f"{w.doc.units.fmt_length(r.worst_level)}")
    assert r.worst_level == pytest.approx(2.8)  # the spill level of the sump
    row = panel._rows["lid"]
    assert OK_COLOUR in row.now.text() and NOT_OK_COLOUR in row.worst.text()
    assert panel.results == [r] or panel.results[0].worst_factor == r.worst_factor
    assert "resistance 4.3 kN/m" in panel.details.text()  # 1.8 + 2.5 kN/m
    assert REQUIRED_FACTOR_SOURCE in panel.source.text()
    assert panel.caution.text() == UPLIFT_CAUTION
    assert panel.factor.text() == format_number(DEFAULT_REQUIRED_FACTOR) == "1.111"


def test_results_follow_level_vertex_and_liquid(sump_window, settle):
    w = sump_window
    panel = w.uplift_panel
    lid_weight(w)
    settle(w)
    now = panel.row_texts("lid")[0]
    editing.fill_to_level(w.doc, 2.6)  # higher: more uplift, smaller factor
    settle(w)
    assert panel.row_texts("lid")[0] != now
    assert panel.results[0].factor == pytest.approx(w.doc.case.uplift()[0].factor)
    editing.fill_to_level(w.doc, 1.0)  # below the lid: no uplift
    settle(w)
    assert panel.row_texts("lid")[0] == "OK no uplift"
    worst = panel.row_texts("lid")[1]
    editing.move_vertex(w.doc, 2, 2.4, 1.2)  # one lid end lower: more head on the lid
    settle(w)
    assert panel.row_texts("lid")[1] != worst
    from wetline.core.liquids import custom_liquid

    before = panel.results[0].worst_factor
    editing.set_liquid(w.doc, custom_liquid(1500.0))
    settle(w)
    assert panel.results[0].worst_factor == pytest.approx(before * 998.2 / 1500.0, rel=1e-3)


def test_resistance_edits_are_undo_steps_with_readable_text(sump_window, settle):
    w = sump_window
    stack = w.doc.undo_stack
    panel = w.uplift_panel
    type_into(panel.edit("lid", "self_weight"), "2.5")
    assert stack.undoText() == "Lid self-weight 2.5 kN/m"
    type_into(panel.edit("lid", "holding_down"), "4")
    assert stack.undoText() == "Lid holding-down 4 kN/m"
    type_into(panel.factor, "1.25")
    assert stack.undoText() == "Required uplift factor 1.25"
    assert stack.count() == 3
    type_into(panel.edit("lid", "holding_down"), "4")  # unchanged: no step
    assert stack.count() == 3
    w.undo()
    settle(w)
    assert w.doc.case.required_uplift_factor == DEFAULT_REQUIRED_FACTOR
    assert panel.factor.text() == format_number(DEFAULT_REQUIRED_FACTOR) == "1.111"
    w.undo()
    assert panel.edit("lid", "holding_down").text() == "0"
    w.undo()
    assert w.doc.case.resistances == ()
    assert not w.isWindowModified()
    stack.redo()
    assert panel.edit("lid", "self_weight").text() == "2.5"


def test_bad_input_shows_why_and_changes_nothing(sump_window):
    w = sump_window
    panel = w.uplift_panel
    before = w.doc.case
    type_into(panel.edit("lid", "self_weight"), "-3")
    assert panel.error.isVisibleTo(panel) and ">= 0" in panel.error.text()
    type_into(panel.edit("lid", "self_weight"), "heavy")
    assert "not a number" in panel.error.text()
    type_into(panel.factor, "0")
    assert "positive" in panel.error.text()
    assert w.doc.case is before and w.doc.undo_stack.count() == 0
    type_into(panel.edit("lid", "self_weight"), "1")
    # the factor still holds its bad input: its reason stays until corrected
    assert "not a number" not in panel.error.text() and "positive" in panel.error.text()
    type_into(panel.factor, "1.2")
    assert not panel.error.isVisibleTo(panel)


def test_default_button_restores_the_default_factor(sump_window):
    w = sump_window
    panel = w.uplift_panel
    assert not panel.default_button.isEnabled()
    type_into(panel.factor, "1.5")
    assert panel.default_button.isEnabled()
    assert "1.5 set for this case" in panel.source.text()
    panel.default_button.click()
    assert w.doc.case.required_uplift_factor == DEFAULT_REQUIRED_FACTOR
    assert w.doc.undo_stack.undoText() == "Required uplift factor: default"


def test_us_units_and_axisymmetric_totals(make_window, settle, sample):
    w = make_window()
    assert w.open_path(str(sample("sump_with_lid")))
    editing.set_units(w.doc, DisplayChoice("us", "in"))
    panel = w.uplift_panel
    assert "[lbf/ft]" in panel._headers[1].text()
    type_into(panel.edit("lid", "self_weight"), "100")
    lbf_per_ft = 4.4482216152605 / 0.3048
    assert w.doc.case.resistance_map["lid"].self_weight == pytest.approx(100 * lbf_per_ft)
    assert w.doc.undo_stack.undoText() == "Lid self-weight 100 lbf/ft"
    assert w.open_path(str(sample("cone_hopper")), ask=False)
    settle(w)
    assert w.doc.units == DisplayChoice("si", "m")  # a file opens in its own unit
    editing.set_units(w.doc, DisplayChoice("us", "in"))
    settle(w)
    assert "[lbf]" in panel._headers[1].text() and "/ft" not in panel._headers[1].text()
    editing.set_units(w.doc, DisplayChoice("si", "m"))
    part = w.doc.section.loaded_part_names[0]
    type_into(panel.edit(part, "holding_down"), "12")
    assert w.doc.case.resistance_map[part].holding_down == pytest.approx(12 * KN)
    assert w.doc.undo_stack.undoText().endswith("holding-down 12 kN")


def test_saved_v2_file_reopens_with_the_same_uplift_and_header(
        sump_window, make_window, tmp_path, monkeypatch, settle):
    w = sump_window
    lid_weight(w)
    type_into(w.uplift_panel.factor, "1.25")
    info = ReportInfo("Inlet works upgrade", "C-0417", "design team")
    monkeypatch.setattr(dialogs, "ask_report_info", lambda parent, report: info)
    assert w.edit_report_info()
    path = tmp_path / "sump.section.json"
    monkeypatch.setattr(dialogs, "ask_save_path", lambda parent, suggested: str(path))
    assert w.save_as()
    data = json.loads(path.read_text())
    assert data["version"] == 2
    assert data["uplift"] == {"required_factor": 1.25,
                              "parts": {"lid": {"self_weight": 1800.0,
                                                "holding_down": 2500.0}}}
    assert data["report"]["job_reference"] == "C-0417"
    w2 = make_window()
    assert w2.open_path(str(path))
    settle(w2)
    assert w2.doc.case == w.doc.case
    assert w2.uplift_panel.edit("lid", "self_weight").text() == "1.8"
    assert w2.uplift_panel.factor.text() == "1.25"
    assert w2.uplift_panel.row_texts("lid") == w.uplift_panel.row_texts("lid")
    assert w2.doc.case.report == info


def test_header_fields_are_one_undo_step(sump_window, monkeypatch):
    w = sump_window
    info = ReportInfo("Inlet works upgrade", "C-0417", "")
    monkeypatch.setattr(dialogs, "ask_report_info", lambda parent, report: info)
    w.actions_by_name["report_info"].trigger()
    assert w.doc.case.report == info
    assert w.doc.undo_stack.undoText() == "Sheet header: project, job reference"
    assert w.isWindowModified()
    assert not w.edit_report_info()  # same fields again: no step
    monkeypatch.setattr(dialogs, "ask_report_info", lambda parent, report: None)
    assert not w.edit_report_info()  # cancelled
    assert w.doc.undo_stack.count() == 1
    w.undo()
    assert w.doc.case.report == ReportInfo()
    assert not w.isWindowModified()


def test_header_dialog_shows_and_returns_the_fields(qtbot):
    from wetline.app.window.report_info_dialog import ReportInfoDialog

    dlg = ReportInfoDialog(ReportInfo("P", "J-1", "someone"))
    qtbot.addWidget(dlg)
    assert (dlg.project.text(), dlg.job_reference.text(), dlg.prepared_by.text()) == (
        "P", "J-1", "someone")
    dlg.project.setText("  Inlet works  ")
    dlg.prepared_by.clear()
    assert dlg.result_report() == ReportInfo("Inlet works", "J-1", "")


def test_a_renamed_part_keeps_its_resistance_out_of_the_file(
        sump_window, tmp_path, monkeypatch):
    """The lid edge becomes a wall: the lid's resistance stays for undo but
    is not written, so the saved file reads back."""
    w = sump_window
    lid_weight(w)
    model = w.vertices_table.model()
    assert model.setData(model.index(2, 2), "wall", Qt.EditRole)
    assert "lid" not in w.uplift_panel._rows
    path = tmp_path / "renamed.section.json"
    monkeypatch.setattr(dialogs, "ask_save_path", lambda parent, suggested: str(path))
    assert w.save_as()
    assert read_section_file(path).resistances == ()
    w.undo()
    assert w.uplift_panel.edit("lid", "self_weight").text() == "1.8"


@pytest.mark.parametrize("name", ["sump_with_lid", "closed_tank", "cone_hopper",
                                  "chamber_under_riser"])
def test_remembered_worst_levels_match_the_core_check(name, sample):
    """The panel's checker keeps each part's worst level while only the fill
    changes; its results equal core's at every level, above a closed roof too."""
    from wetline.app.window.uplift_panel import UpliftChecker
    from wetline.core.uplift import PartResistance

    case = read_section_file(sample(name))
    for part in case.section.loaded_part_names:
        case = case.with_resistance(part, PartResistance(500.0, 250.0))
    checker = UpliftChecker()
    s = case.section
    top = s.z_max + (0 if s.is_open else 0.5 * (s.z_max - s.z_min))
    for level in np.linspace(s.z_min - 0.1, top, 9):
        c = case.with_level(level)
        sol = c.solve()
        assert checker.check(c, sol) == c.uplift(sol), level


def test_rebuilt_rows_leave_no_widgets_behind(sump_window, settle):
    """Each change of the parts rebuilds the rows; the old widgets go at once
    (not at some later turn of the event loop), so edits never pile them up."""
    from PySide6.QtWidgets import QLabel, QLineEdit

    w = sump_window
    panel = w.uplift_panel
    labels = len(panel.findChildren(QLabel))
    for k in range(30):
        editing.set_edge_part(w.doc, 2, f"lid {k}")
        settle(w)
    assert set(panel._rows) == {"floor", "wall", "lid 29"}
    assert len(panel.findChildren(QLineEdit)) == 2 * 3 + 1  # two per part, the factor
    assert len(panel.findChildren(QLabel)) == labels


def test_letters_mark_the_field_red_with_the_reason_and_apply_nothing(sump_window, settle):
    w = sump_window
    panel = w.uplift_panel
    type_into(panel.edit("lid", "self_weight"), "1.8")
    before, count = w.doc.case, w.doc.undo_stack.count()
    field = panel.edit("lid", "self_weight")
    type_into(field, "1.8 kN")
    assert field.property("invalid") is True and NOT_OK_COLOUR in field.styleSheet()
    assert "'1.8 kN' is not a number" in field.toolTip()
    # the reason right under the fields, above the required factor
    assert panel.error.isVisibleTo(panel) and "not a number" in panel.error.text()
    assert panel.error.mapTo(panel, panel.error.rect().topLeft()).y() < \
        panel.factor.mapTo(panel, panel.factor.rect().topLeft()).y()
    assert w.doc.case is before and w.doc.undo_stack.count() == count
    # Another field's edit neither hides the fault nor puts the old value back.
    type_into(panel.edit("lid", "holding_down"), "2")
    settle(w)
    assert w.doc.case.resistance_map["lid"].self_weight == 1800.0
    assert field.text() == "1.8 kN" and field.property("invalid") is True
    assert "not a number" in panel.error.text()
    # A number clears it and is applied.
    type_into(field, "2.2")
    assert field.property("invalid") is False and NOT_OK_COLOUR not in field.styleSheet()
    assert not panel.error.isVisibleTo(panel)
    assert w.doc.case.resistance_map["lid"].self_weight == pytest.approx(2200.0)


def test_undo_of_the_field_shows_the_document_value_again(sump_window, settle):
    w = sump_window
    panel = w.uplift_panel
    field = panel.edit("lid", "self_weight")
    type_into(field, "3")
    type_into(field, "heavy")
    assert field.property("invalid") is True
    w.undo()  # the field's own value changes: the document's value is shown
    settle(w)
    assert field.text() == "0" and field.property("invalid") is False
    assert not panel.error.isVisibleTo(panel)


def test_a_bad_required_factor_is_marked_too(sump_window):
    panel = sump_window.uplift_panel
    type_into(panel.factor, "one")
    assert panel.factor.property("invalid") is True and "not a number" in panel.factor.toolTip()
    type_into(panel.factor, "1.3")
    assert panel.factor.property("invalid") is False
    assert sump_window.doc.case.required_uplift_factor == 1.3


def test_the_verdicts_fit_the_visible_panel_at_the_default_window_size(
        make_window, settle, sample):
    """Defect: in US feet at a 1500 px window, the "Worst level" column of
    the buried wet well ran past the scroll area's right edge ("at 14.76 ft"
    cut off, no scroll bar): each row's two verdict labels shared one width,
    the wider of the two, so the panel's minimum outgrew its dock."""
    w = make_window()
    w.resize(1500, 940)
    assert w.open_path(str(sample("buried_wet_well")), ask=False)
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    for value in (500, 600, 700):
        w.fill_panel.slider.setValue(value)
        settle(w)
    panel = w.uplift_panel
    scroll = w.uplift_scroll
    visible = scroll.viewport().width()
    for part, row in panel._rows.items():
        if not row.worst.text():
            continue
        right = row.worst.mapTo(scroll.widget(), row.worst.rect().topRight()).x()
        needed = row.worst.sizeHint().width()
        assert row.worst.width() >= needed, part  # its text whole
        assert right <= visible, (part, right, visible)  # and inside the view
    # the "now" column is as wide as its own texts, not as the worst column
    now_widths = {row.now.width() for row in panel._rows.values()}
    assert max(now_widths) <= max(r.now.sizeHint().width() for r in panel._rows.values())
    # a window too narrow for the checks scrolls them instead of cutting them
    w.resize(1000, 940)
    settle(w)
    widest = scroll.widget().minimumSizeHint().width()
    assert widest <= scroll.viewport().width() or scroll.horizontalScrollBar().isVisible()
