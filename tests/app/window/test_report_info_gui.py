"""The sheet's document control and the precision policy in the window:
the dialog, one undo step per edit, every view writing its numbers again."""

import datetime

from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.window import dialogs
from wetline.app.window.report_info_dialog import ReportInfoDialog, next_revision
from wetline.core.case import ReportInfo, Revision
from wetline.core.numbers import figures


def test_the_dialog_edits_document_control_and_history(qtbot):
    old = ReportInfo(project="Inlet works upgrade", prepared_by="AD",
                     revisions=(Revision("A", "2026-01-12", "first issue", "AD", "CC", "DL"),))
    dlg = ReportInfoDialog(old)
    qtbot.addWidget(dlg)
    dlg.checked_by.setText(" C. Checker ")
    dlg.approved_by.setText("D. Lead")
    dlg.calculation_reference.setText("C-0417-HYD-003")
    row = dlg.add_revision(datetime.date(2026, 2, 3))
    dlg.history.item(row, 2).setText("lid level to the new survey")
    dlg.figures.setValue(5)
    info = dlg.result_report()
    assert info.checked_by == "C. Checker" and info.approved_by == "D. Lead"
    assert info.calculation_reference == "C-0417-HYD-003"
    assert info.revisions[-1] == Revision("B", "2026-02-03", "lid level to the new survey",
                                          "AD", "C. Checker", "D. Lead")
    assert info.current_revision == "B"
    assert info.significant_figures == 5
    dlg.history.setCurrentCell(0, 0)
    dlg.remove_revision()
    assert [r.revision for r in dlg.result_report().revisions] == ["B"]


def test_revision_marks_step_on():
    assert [next_revision(m) for m in ("", "A", "C", "Z", "AZ", "P1", "P09", "3", "rev")] == [
        "A", "B", "D", "AA", "BA", "P2", "P10", "4", "A"]


def test_figures_are_one_undo_step_and_every_view_follows(make_window, monkeypatch, settle):
    w = make_window()
    model = w.parts_table.model()
    floor = [r for r in range(model.rowCount()) if model.index(r, 0).data() == "floor"][0]

    def floor_down():
        cols = [model.headerData(c, Qt.Horizontal, Qt.DisplayRole)
                for c in range(model.columnCount())]
        return model.index(floor, next(c for c, h in enumerate(cols)
                                       if str(h).startswith("Down"))).data()

    before = floor_down()
    assert len(before.replace("-", "").replace(".", "")) <= 4
    info = ReportInfo(checked_by="C. Checker", significant_figures=6)
    monkeypatch.setattr(dialogs, "ask_report_info", lambda parent, report: info)
    assert w.edit_report_info()
    settle(w)
    assert w.doc.undo_stack.undoText() == "Sheet header: checked by, significant figures"
    assert figures() == 6
    after = floor_down()
    assert after != before and len(after.replace("-", "").replace(".", "")) == 6
    assert any(len(t.split(":")[1].split()[0].replace(".", "")) == 6
               for t in w.canvas.shown_labels() if t.startswith("floor:"))
    w.doc.undo_stack.undo()
    settle(w)
    assert figures() == 4 and floor_down() == before
    assert editing.set_report_info(w.doc, ReportInfo(significant_figures=4)) is False


def test_the_window_and_the_sheet_write_the_same_numbers(make_window, settle, qapp):
    # One policy: at 5 figures the totals panel and the sheet print the same
    # floor force and liquid weight (and neither at 4).
    import io

    import pypdf

    from wetline.app.render.sheet import report_pdf_bytes
    from wetline.core.numbers import format_number

    w = make_window()
    editing.set_report_info(w.doc, ReportInfo(significant_figures=5))
    settle(w)
    case, sol = w.doc.case, w.doc.solution
    text = " ".join(" ".join(p.extract_text().split()) for p in
                    pypdf.PdfReader(io.BytesIO(report_pdf_bytes(case))).pages)
    for key, value in (("floor", sol.floor_force), ("weight", sol.fluid_weight)):
        shown = w.totals.values[key].text().split()[0]
        assert shown == format_number(value / 1000, 5)
        assert f"{shown} kN/m" in text
    floor4 = format_number(sol.floor_force / 1000, 4)
    assert floor4 != format_number(sol.floor_force / 1000, 5) and floor4 not in text.split()
