"""File > Export and File > Import, and pasting coordinates, from the GUI."""

import csv
import io
import xml.etree.ElementTree as ET

import ezdxf
import numpy as np
import pypdf
import pytest
from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QApplication, QPushButton

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.window import dialogs
from wetline.core.case import ReportInfo
from wetline.core.dxf_io import read_outline
from wetline.core.liquids import custom_liquid

# Two closed polylines [mm]: a sump and a small hatch boundary.
SUMP_MM = [(0, 0), (2400, 0), (2400, 1600), (1900, 1600), (1900, 2800), (0, 2800)]
BOX_MM = [(5000, 0), (6000, 0), (6000, 500), (5000, 500)]


@pytest.fixture
def sump_window(make_window, settle, sample):
    w = make_window()
    assert w.open_path(str(sample("sump_with_lid")))
    editing.set_liquid(w.doc, custom_liquid(1100.0))  # something an import must keep
    editing.set_resistance(w.doc, "lid", "self_weight", 1800.0)
    settle(w)
    return w


def wait_pdf(qtbot, window, timeout=60000):
    """(status, text) once the window has handled the end of the sheet."""
    qtbot.waitUntil(lambda: window.transfer.pdf_result is not None, timeout=timeout)
    return window.transfer.pdf_result


def drawing(tmp_path, polylines, units=4, name="sump.dxf"):
    doc = ezdxf.new("R2010")
    doc.units = units
    msp = doc.modelspace()
    for layer, pts in polylines:
        msp.add_lwpolyline(pts, close=True, dxfattribs={"layer": layer})
    path = tmp_path / name
    doc.saveas(path)
    return path


# ---------------------------------------------------------------- menus
def test_file_menu_has_import_export_and_header(make_window):
    w = make_window()
    exports = [a.text() for a in w.export_menu.actions()]
    assert exports == ["Calculation sheet P&DF...", "Diagram &PNG...", "Diagram &SVG...",
                       "Per-edge results &CSV...", "&Loads against level CSV...",
                       "Outline &DXF..."]
    assert [a.text() for a in w.import_menu.actions()] == ["Outline from &DXF...",
                                                           "Coordinates from CS&V..."]
    assert w.actions_by_name["paste_coords"].shortcut().toString() == "Ctrl+Shift+V"
    assert [b.text() for b in w.vertices_pane.buttons] == [
        "Paste coordinates", "Copy coordinates", "Import CSV"]


# ---------------------------------------------------------------- exports
def test_pdf_sheet_from_the_menu_states_the_uplift_verdict(
        sump_window, qtbot, tmp_path, monkeypatch, no_dialogs):
    w = sump_window
    assert editing.set_report_info(
        w.doc, ReportInfo("Inlet works upgrade", "C-0417", "design team"))
    out = tmp_path / "calc.pdf"
    asked = []
    monkeypatch.setattr(dialogs, "ask_export_file",
                        lambda parent, title, suggested, flt, ext: asked.append(
                            (suggested, ext)) or str(out))
    with qtbot.waitSignal(w.transfer.pdfStarted):
        w.actions_by_name["export_pdf"].trigger()
    assert w.transfer.progress is not None and w.transfer.progress.isVisible()
    assert wait_pdf(qtbot, w) == ("ok", str(out))
    assert w.transfer.progress is None  # closed
    assert asked[0][1] == ".pdf" and asked[0][0].endswith("sump_with_lid.pdf")
    reader = pypdf.PdfReader(str(out))
    text = " ".join(" ".join(p.extract_text().split()) for p in reader.pages)
    (r,) = w.doc.case.uplift()
    assert r.verdict == "NOT OK" and "NOT OK" in text
    assert "C-0417" in text and "Inlet works upgrade" in text
    assert not no_dialogs
    assert "Wrote the calculation sheet" in w.statusBar().currentMessage()


def test_pdf_sheet_failure_is_shown_and_nothing_crashes(sump_window, qtbot, tmp_path,
                                                        no_dialogs):
    w = sump_window
    w.transfer.export_pdf_to(tmp_path / "missing" / "calc.pdf")
    assert wait_pdf(qtbot, w)[0] == "failed"
    assert no_dialogs and "does not exist" in no_dialogs[-1][1]
    assert w.transfer.progress is None


def test_the_sheet_is_written_by_a_process_of_its_own(sump_window, qtbot, tmp_path,
                                                      no_dialogs):
    """The sheet's layout runs in a child process, never in a thread of the
    window's: PySide6 holds the GIL through calls into Qt, and a worker thread
    creating Qt objects while the event loop deleted one hung both (seen about
    once in a hundred sheets in the test suite). The PDF is the program's own
    sheet of the same design."""
    import os
    import threading

    from wetline.app.render.sheet import report_pdf_bytes

    w = sump_window
    out = tmp_path / "calc.pdf"
    threads = threading.active_count()
    job = w.transfer.export_pdf_to(out)
    qtbot.waitUntil(lambda: job.process_id() != 0 or job.status is not None, timeout=30000)
    assert job.process_id() not in (0, os.getpid())
    assert threading.active_count() == threads  # no thread of the window's own
    assert wait_pdf(qtbot, w) == ("ok", str(out))

    def text(data):
        return [" ".join(p.extract_text().split())
                for p in pypdf.PdfReader(io.BytesIO(data)).pages]

    assert text(out.read_bytes()) == text(report_pdf_bytes(w.doc.design, units="si"))
    assert not no_dialogs


def test_a_sheet_cancelled_before_its_process_runs_writes_nothing(sump_window, qtbot,
                                                                  tmp_path, no_dialogs):
    w = sump_window
    out = tmp_path / "calc.pdf"
    job = w.transfer.export_pdf_to(out)
    job.cancel()  # the process is still starting
    assert wait_pdf(qtbot, w) == ("cancelled", "")
    assert not out.exists() and not list(tmp_path.glob("*.pdf*"))
    assert not no_dialogs and "cancelled" in w.statusBar().currentMessage()


def test_a_sheet_process_that_dies_is_reported(sump_window, qtbot, tmp_path, no_dialogs,
                                               monkeypatch):
    from wetline.app.window.files import PdfJob

    monkeypatch.setattr(PdfJob, "ARGUMENTS", (
        "-c", "import sys; sys.stderr.write('MemoryError: out of memory\\n'); sys.exit(9)"))
    w = sump_window
    w.transfer.export_pdf_to(tmp_path / "calc.pdf")
    status, text = wait_pdf(qtbot, w)
    assert status == "failed"
    assert "stopped unexpectedly (exit code 9): MemoryError: out of memory" in text
    assert no_dialogs and "MemoryError" in no_dialogs[-1][1]
    assert w.transfer.progress is None and not (tmp_path / "calc.pdf").exists()


def test_a_sheet_process_that_cannot_start_is_reported(sump_window, qtbot, tmp_path,
                                                       no_dialogs, monkeypatch):
    import sys

    monkeypatch.setattr(sys, "executable", str(tmp_path / "no-such-python"))
    w = sump_window
    w.transfer.export_pdf_to(tmp_path / "calc.pdf")
    status, text = wait_pdf(qtbot, w)
    assert status == "failed" and "cannot start the sheet writer" in text
    assert "no-such-python" in text
    assert w.transfer.progress is None


@pytest.mark.slow
def test_long_pdf_sheet_keeps_the_window_responsive_and_can_be_cancelled(
        make_window, qtbot, tmp_path, no_dialogs, bowl_case):
    """2,000 vertices take seconds: the work runs beside the event loop, the
    progress dialog moves, and Cancel stops it with nothing written."""
    w = make_window(bowl_case(2000))
    ticks = []
    timer = QTimer()
    timer.timeout.connect(lambda: ticks.append(1))
    timer.start(20)
    out = tmp_path / "bowl.pdf"
    job = w.transfer.export_pdf_to(out)
    # The first step as the progress dialog shows it (the window listens from
    # before the job starts; a slot connected here could miss that step,
    # and then waited for the end of the job: a failure seen once in CI).
    qtbot.waitUntil(lambda: w.transfer.progress is None or w.transfer.progress.value() >= 1,
                    timeout=30000)
    assert w.transfer.progress is not None and job.isRunning(), "the sheet ended before Cancel"
    w.transfer.progress.findChild(QPushButton).click()  # the user presses Cancel
    assert wait_pdf(qtbot, w)[0] == "cancelled"
    timer.stop()
    assert len(ticks) >= 3  # the event loop ran while the sheet was laid out
    assert not out.exists() and list(tmp_path.iterdir()) == []
    assert not no_dialogs
    assert "cancelled" in w.statusBar().currentMessage()


def test_svg_export_parses_and_holds_the_drawing(sump_window, tmp_path, monkeypatch):
    w = sump_window
    out = tmp_path / "d.svg"
    monkeypatch.setattr(dialogs, "ask_export_file", lambda *a: str(out))
    w.actions_by_name["export_svg"].trigger()
    root = ET.parse(out).getroot()
    assert root.tag.endswith("svg")
    texts = " ".join(e.text or "" for e in root.iter() if e.tag.endswith("text"))
    assert "lid" in texts


def test_edge_csv_in_the_display_units(sump_window, tmp_path, monkeypatch):
    w = sump_window
    editing.set_units(w.doc, DisplayChoice("us", "in"))
    out = tmp_path / "edges.csv"
    monkeypatch.setattr(dialogs, "ask_export_file", lambda *a: str(out))
    w.actions_by_name["export_edges_csv"].trigger()
    rows = list(csv.reader(io.StringIO(out.read_text())))
    header = rows[0]
    assert header[:3] == ["edge", "part", "x start [in]"]
    # The sump is 1 m wide: forces per run, in lbf/ft (NIST SP 811: 1 lbf =
    # 4.4482216152605 N, 1 ft = 0.3048 m).
    assert w.doc.section.width == 1.0
    assert "p start [psi]" in header and "fz [lbf/ft]" in header
    assert len(rows) - 1 == w.doc.section.n_edges
    fz = sum(float(r[header.index("fz [lbf/ft]")]) for r in rows[1:] if r[1] == "floor")
    sol = w.doc.solution
    assert fz == pytest.approx(sol.parts["floor"].fz / (4.4482216152605 / 0.3048))


def test_level_table_csv(sump_window, tmp_path, monkeypatch):
    w = sump_window
    out = tmp_path / "levels.csv"
    monkeypatch.setattr(dialogs, "ask_export_file", lambda *a: str(out))
    w.actions_by_name["export_level_csv"].trigger()
    rows = list(csv.reader(io.StringIO(out.read_text())))
    assert rows[0][0] == "level [m]" and any("[kN/m]" in h for h in rows[0])
    assert len(rows) == 1 + 51
    assert float(rows[-1][0]) == pytest.approx(2.8)


def test_dxf_export_reads_back_the_same_outline(sump_window, tmp_path, monkeypatch):
    w = sump_window
    out = tmp_path / "outline.dxf"
    monkeypatch.setattr(dialogs, "ask_export_file", lambda *a: str(out))
    w.actions_by_name["export_dxf"].trigger()
    section, _ = read_outline(out)
    assert np.allclose(section.outline, w.doc.section.outline, atol=1e-9, rtol=0)
    assert section.parts == w.doc.section.parts


def test_export_errors_are_shown(sump_window, tmp_path, no_dialogs):
    w = sump_window
    t = w.transfer
    for export in (t.export_svg_to, t.export_edges_csv_to, t.export_level_csv_to,
                   t.export_dxf_to):
        n = len(no_dialogs)
        assert not export(str(tmp_path))  # a folder is in the way
        assert len(no_dialogs) == n + 1 and "folder" in no_dialogs[-1][1]


# ---------------------------------------------------------------- imports
def test_dxf_with_two_outlines_asks_and_imports_the_chosen_one(
        sump_window, tmp_path, monkeypatch, no_dialogs, settle):
    w = sump_window
    before, count = w.doc.case, w.doc.undo_stack.count()
    path = drawing(tmp_path, [("HATCH", BOX_MM), ("OUTLINE", SUMP_MM)])
    shown = []
    monkeypatch.setattr(dialogs, "ask_import_file", lambda *a: str(path))
    monkeypatch.setattr(dialogs, "ask_dxf_outline",
                        lambda parent, source, lines: shown.append((source, lines)) or 1)
    w.actions_by_name["import_dxf"].trigger()
    settle(w)
    (source, lines), = shown
    assert source == "sump.dxf" and len(lines) == 2
    assert lines[1].startswith("#1 layer OUTLINE") and "2400 x 2800 mm" in lines[1]
    assert w.doc.undo_stack.count() == count + 1
    assert w.doc.undo_stack.undoText().startswith("Import outline from sump.dxf (#1")
    assert np.allclose(w.doc.section.outline, np.array(SUMP_MM) / 1000.0)
    assert set(w.doc.section.parts) == {"wall"}
    case = w.doc.case
    assert case.liquid == before.liquid and case.fill_level == before.fill_level
    assert case.resistances == before.resistances  # kept for when the lid is marked
    assert not no_dialogs
    w.undo()
    assert w.doc.case is before


def test_choosing_nothing_keeps_the_document(sump_window, tmp_path, monkeypatch):
    w = sump_window
    before, count = w.doc.case, w.doc.undo_stack.count()
    path = drawing(tmp_path, [("HATCH", BOX_MM), ("OUTLINE", SUMP_MM)])
    monkeypatch.setattr(dialogs, "ask_dxf_outline", lambda *a: None)
    assert not w.transfer.import_dxf_from(path)
    assert w.doc.case is before and w.doc.undo_stack.count() == count


def test_unitless_drawing_asks_its_unit_and_a_far_away_outline_is_refilled(
        sump_window, tmp_path, monkeypatch, settle):
    w = sump_window
    far = [(x, z + 10000) for x, z in SUMP_MM]  # drawn 10 m up the sheet
    path = drawing(tmp_path, [("0", far)], units=0, name="old.dxf")
    asked, warned = [], []
    monkeypatch.setattr(dialogs, "ask_dxf_unit",
                        lambda parent, source, default="mm": asked.append(source) or "mm")
    monkeypatch.setattr(dialogs, "show_warning", lambda parent, title, text: warned.append(text))
    assert w.transfer.import_dxf_from(path)
    settle(w)
    assert asked == ["old.dxf"] and not warned  # the user said mm: nothing assumed
    assert w.doc.section.outline[:, 0].max() == 2.4  # 2400 mm, exactly
    assert w.doc.case.fill_level == pytest.approx(w.doc.section.top_level)  # 2.2 m is below it
    assert w.doc.section.name == "old"


def test_unitless_drawing_in_another_unit_or_cancelled(sump_window, tmp_path, monkeypatch):
    w = sump_window
    path = drawing(tmp_path, [("0", SUMP_MM)], units=0, name="old.dxf")
    before, count = w.doc.case, w.doc.undo_stack.count()
    monkeypatch.setattr(dialogs, "ask_dxf_unit", lambda *a, **k: None)
    assert not w.transfer.import_dxf_from(path)
    assert w.doc.case is before and w.doc.undo_stack.count() == count
    monkeypatch.setattr(dialogs, "ask_dxf_unit", lambda *a, **k: "cm")
    monkeypatch.setattr(dialogs, "show_warning", lambda *a: None)
    assert w.transfer.import_dxf_from(path)
    assert w.doc.section.outline[:, 0].max() == 24.0  # 2400 cm


@pytest.mark.parametrize("content, words", [
    ("this is not a drawing", "sump.dxf"),
    (None, "no closed polyline"),
])
def test_broken_dxf_shows_an_error_and_keeps_the_document(
        sump_window, tmp_path, no_dialogs, content, words):
    w = sump_window
    before, count = w.doc.case, w.doc.undo_stack.count()
    path = tmp_path / "sump.dxf"
    if content is None:
        doc = ezdxf.new("R2010")
        doc.modelspace().add_lwpolyline([(0, 0), (10, 0), (10, 10)], close=False)
        doc.saveas(path)
    else:
        path.write_text(content)
    assert not w.transfer.import_dxf_from(path)
    assert no_dialogs and words in no_dialogs[-1][1]
    assert w.doc.case is before and w.doc.undo_stack.count() == count


def test_crossing_dxf_outline_is_refused(sump_window, tmp_path, no_dialogs):
    w = sump_window
    before = w.doc.case
    path = drawing(tmp_path, [("OUTLINE", [(0, 0), (1000, 1000), (1000, 0), (0, 1000)])])
    assert not w.transfer.import_dxf_from(path)
    assert "crosses" in no_dialogs[-1][1]
    assert w.doc.case is before


def test_pasted_coordinates_with_a_bad_line_name_it_and_keep_the_document(
        sump_window, no_dialogs):
    w = sump_window
    before, count = w.doc.case, w.doc.undo_stack.count()
    QApplication.clipboard().setText("x\tz\n0\t0\n2.4\tabc\n2.4\t1.6\n")
    w.actions_by_name["paste_coords"].trigger()
    title, text = no_dialogs[-1]
    assert "line 3" in text and "'abc' is not a number" in text
    assert w.doc.case is before and w.doc.undo_stack.count() == count


def test_paste_coordinates_from_a_spreadsheet_is_one_step(sump_window, settle):
    w = sump_window
    editing.set_units(w.doc, DisplayChoice("si", "mm"))
    count = w.doc.undo_stack.count()
    QApplication.clipboard().setText(
        "x [mm]\tz [mm]\tpart\n0\t0\tfloor\n3000\t0\twall\n3000\t2000\topen\n0\t2000\twall\n")
    w.vertices_pane.buttons[0].click()  # the vertex table's Paste button
    settle(w)
    assert w.doc.undo_stack.count() == count + 1
    assert w.doc.undo_stack.undoText() == "Paste 4 vertices"
    assert np.allclose(w.doc.section.outline, [[0, 0], [3, 0], [3, 2], [0, 2]])
    assert w.doc.section.parts == ("floor", "wall", "open", "wall")
    assert w.vertices_table.model().rowCount() == 4
    w.undo()
    assert w.doc.section.n_edges == 6


def test_paste_without_parts_keeps_them_when_the_count_matches(sump_window):
    w = sump_window
    parts = w.doc.section.parts
    QApplication.clipboard().setText("0 0\n2.5 0\n2.5 1.6\n1.9 1.6\n1.9 2.8\n0 2.8\n")
    assert w.actions_by_name["paste_coords"].isEnabled()
    w.transfer.paste_coordinates()
    assert w.doc.section.parts == parts
    assert w.doc.section.outline[1, 0] == pytest.approx(2.5)


def test_pasted_outline_that_crosses_itself_is_refused(sump_window, no_dialogs):
    w = sump_window
    before = w.doc.case
    assert not w.transfer.paste_coordinates_text("0 0\n1 1\n1 0\n0 1\n")
    assert "crosses" in no_dialogs[-1][1]
    assert w.doc.case is before and w.doc.draft is None


def test_coordinates_from_a_csv_file(sump_window, tmp_path, monkeypatch, no_dialogs):
    w = sump_window
    good = tmp_path / "pts.csv"
    good.write_text("x [m],z [m]\n0,0\n2,0\n2,1\n0,1\n")
    monkeypatch.setattr(dialogs, "ask_import_file", lambda *a: str(good))
    w.actions_by_name["import_csv"].trigger()
    assert w.doc.undo_stack.undoText() == "Import 4 vertices from pts.csv"
    before = w.doc.case
    wrong_unit = tmp_path / "mm.csv"
    wrong_unit.write_text("x [mm],z [mm]\n0,0\n2000,0\n2000,1000\n")
    assert not w.transfer.import_coordinates_from(wrong_unit)
    assert "mm.csv" in no_dialogs[-1][1] and "mm" in no_dialogs[-1][1]
    binary = tmp_path / "b.csv"
    binary.write_bytes(b"\xff\xfe\x00\x81")
    assert not w.transfer.import_coordinates_from(binary)
    assert not w.transfer.import_coordinates_from(tmp_path / "gone.csv")
    assert w.doc.case is before


def test_copy_coordinates_pastes_back(sump_window):
    w = sump_window
    before = w.doc.case
    w.actions_by_name["copy_coords"].trigger()
    text = QApplication.clipboard().text()
    assert text.startswith("x [m]\tz [m]\tpart")
    w.transfer.paste_coordinates()
    assert w.doc.section == before.section


def test_closing_the_window_while_a_sheet_is_written_stops_it_cleanly(
        sump_window, tmp_path, no_dialogs):
    w = sump_window
    job = w.transfer.export_pdf_to(tmp_path / "calc.pdf")
    assert w.close()
    assert not job.isRunning() and w.transfer.progress is None
    assert not no_dialogs
