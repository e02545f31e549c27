"""Keyboard shortcuts of the main window: both redo keys (the README's
table), and shortcuts working at once after a dialog closes."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QApplication

from wetline.app.model import editing
from wetline.app.window import dialogs


@pytest.fixture
def active(make_window, qtbot):
    w = make_window()
    w.activateWindow()
    qtbot.waitUntil(lambda: QApplication.activeWindow() is w)
    w.canvas.setFocus()
    return w


def key_target():
    """Where a key typed now goes: the focused widget of the active window."""
    return QApplication.focusWidget() or QApplication.activeWindow()


@pytest.mark.parametrize("keys", ["Ctrl+Y", "Ctrl+Shift+Z"])
def test_both_redo_keys_redo(active, qtbot, keys):
    w = active
    redo = w.actions_by_name["redo"]
    assert QKeySequence(keys) in redo.shortcuts()
    level = w.doc.case.fill_level
    editing.fill_to_level(w.doc, 1.0)
    w.actions_by_name["undo"].trigger()
    assert w.doc.case.fill_level == level
    seq = QKeySequence(keys)[0]
    qtbot.keyClick(key_target(), seq.key(), seq.keyboardModifiers())
    assert w.doc.case.fill_level == 1.0


def test_undo_key_undoes(active, qtbot):
    w = active
    level = w.doc.case.fill_level
    editing.fill_to_level(w.doc, 1.0)
    qtbot.keyClick(key_target(), Qt.Key_Z, Qt.ControlModifier)
    assert w.doc.case.fill_level == level


# The real dialog functions, taken before any fixture replaces them.
REAL = {name: getattr(dialogs, name) for name in (
    "show_error", "show_warning", "ask_save_changes", "ask_dxf_unit", "ask_export_file")}
CALLS = {
    "show_error": lambda f, w: f(w, "Cannot save", "The folder is read-only."),
    "show_warning": lambda f, w: f(w, "Imported with assumptions", "Drawn in mm."),
    "ask_save_changes": lambda f, w: f(w, "sump.section.json"),
    "ask_dxf_unit": lambda f, w: f(w, "old.dxf"),
    "ask_export_file": lambda f, w: f(w, "Export", "out.csv", "CSV files (*.csv)", ".csv"),
}


def close_the_dialog_when_it_shows(qtbot):
    """Close the modal dialog as the user would (Escape) once it is up."""
    from PySide6.QtCore import QTimer

    timer = QTimer()
    timer.setInterval(20)

    def close():
        box = QApplication.activeModalWidget()
        if box is not None:
            timer.stop()
            box.reject()

    timer.timeout.connect(close)
    timer.start()
    return timer


@pytest.mark.parametrize("name", list(CALLS))
def test_a_shortcut_works_right_after_a_dialog_closes(active, qtbot, name):
    w = active
    level = w.doc.case.fill_level
    editing.fill_to_level(w.doc, 1.0)
    timer = close_the_dialog_when_it_shows(qtbot)
    CALLS[name](REAL[name], w)
    timer.stop()
    # No waiting: the very next key goes to the main window.
    assert QApplication.activeWindow() is w
    target = key_target()
    assert target is not None and target.window() is w
    qtbot.keyClick(target, Qt.Key_Z, Qt.ControlModifier)
    assert w.doc.case.fill_level == level
