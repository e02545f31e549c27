"""Keyboard shortcuts of the main window: both redo keys (the README's
table), and shortcuts working at once after a dialog closes."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QApplication

from wetline.app.model import editing


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
