"""Every modal dialog of the program, each behind one small function, so
tests can replace them (``monkeypatch.setattr(dialogs, "show_error", ...)``)
and nothing ever blocks an automated run.

When a dialog closes, the window it was over is active again and its
focused widget has the focus back, so the next keyboard shortcut works at
once (:func:`returning_focus`).
"""

from __future__ import annotations

import functools
from contextlib import contextmanager

import shiboken6
from PySide6.QtCore import QEventLoop, Qt
from PySide6.QtWidgets import QApplication, QFileDialog, QMessageBox, QProgressDialog

__all__ = ["show_error", "ask_save_changes", "ask_open_path", "ask_save_path",
           "ask_export_path", "ask_template", "show_about", "show_warning",
           "ask_export_file", "ask_import_file", "ask_dxf_outline", "ask_report_info",
           "ask_recovery", "ask_preferences", "ask_structure", "make_progress"]

SECTION_FILTER = "Section files (*.section.json);;JSON files (*.json);;All files (*)"


@contextmanager
def returning_focus(parent):
    """Around a modal dialog: afterwards the window of ``parent`` (or the
    window active before) is active again, with the focus where it was."""
    window = parent.window() if parent is not None else QApplication.activeWindow()
    focus = QApplication.focusWidget()
    try:
        yield
    finally:
        _give_back(window, focus)


def _alive(widget):
    return widget is not None and shiboken6.isValid(widget)


def _give_back(window, focus):
    if not _alive(window) or not window.isVisible():
        return
    window.activateWindow()
    window.raise_()
    # The activation is a window-system event: handle it now, not at the
    # next turn of the event loop (a key pressed at once would go nowhere).
    QApplication.processEvents(QEventLoop.ProcessEventsFlag.ExcludeUserInputEvents)
    if _alive(focus) and focus.window() is window and focus.isVisible():
        focus.setFocus(Qt.FocusReason.ActiveWindowFocusReason)
    elif QApplication.focusWidget() is None:
        window.setFocus(Qt.FocusReason.ActiveWindowFocusReason)


def _modal(function):
    """Run ``function(parent, ...)`` (it shows a modal dialog) inside
    :func:`returning_focus`."""
    @functools.wraps(function)
    def wrapper(parent, *args, **kwargs):
        with returning_focus(parent):
            return function(parent, *args, **kwargs)
    return wrapper


@_modal
def show_error(parent, title, text):
    """Tell the user what went wrong (one OK button)."""
    QMessageBox.warning(parent, title, text)


@_modal
def ask_save_changes(parent, name):
    """"save", "discard" or "cancel" for a document with unsaved changes."""
    box = QMessageBox(QMessageBox.Icon.Warning, "Unsaved changes",
                      f"Save the changes to {name}?",
                      QMessageBox.StandardButton.Save | QMessageBox.StandardButton.Discard
                      | QMessageBox.StandardButton.Cancel, parent)
    box.setDefaultButton(QMessageBox.StandardButton.Save)
    answer = box.exec()
    sb = QMessageBox.StandardButton
    return {sb.Save: "save", sb.Discard: "discard"}.get(sb(answer), "cancel")


@_modal
def ask_open_path(parent, folder=""):
    path, _ = QFileDialog.getOpenFileName(parent, "Open section", folder, SECTION_FILTER)
    return path or None


@_modal
def ask_save_path(parent, suggested=""):
    path, _ = QFileDialog.getSaveFileName(parent, "Save section as", suggested, SECTION_FILTER)
    if path and not path.endswith(".json"):
        path += ".section.json"
    return path or None


@_modal
def ask_export_path(parent, suggested=""):
    path, _ = QFileDialog.getSaveFileName(parent, "Export pressure diagram", suggested,
                                          "PNG images (*.png)")
    if path and not path.lower().endswith(".png"):
        path += ".png"
    return path or None


@_modal
def ask_template(parent, units, kind=None):
    """Ask for a template and its dimensions; (section, level) or None."""
    from wetline.app.window.template_dialog import TemplateDialog

    dlg = TemplateDialog(units, parent)
    if dlg.exec():
        return dlg.result_section, dlg.result_level
    return None


@_modal
def show_about(parent, text):
    QMessageBox.about(parent, "About Wetline", text)


@_modal
def show_warning(parent, title, text):
    """Tell the user something was assumed (a drawing without units ...)."""
    QMessageBox.information(parent, title, text)


@_modal
def ask_export_file(parent, title, suggested, file_filter, extension):
    """A path to write an export to, ending in ``extension`` (".pdf"), or None."""
    path, _ = QFileDialog.getSaveFileName(parent, title, suggested, file_filter)
    if path and not path.lower().endswith(extension):
        path += extension
    return path or None


@_modal
def ask_import_file(parent, title, folder, file_filter):
    """A file to import from, or None."""
    path, _ = QFileDialog.getOpenFileName(parent, title, folder, file_filter)
    return path or None


@_modal
def ask_dxf_outline(parent, source, lines):
    """Which of several closed polylines of drawing ``source`` to import:
    its index in ``lines`` (one ``describe()`` line each), or None."""
    from PySide6.QtWidgets import QInputDialog

    item, ok = QInputDialog.getItem(
        parent, "Choose the outline",
        f"{source} has {len(lines)} closed polylines. Import which one?", list(lines), 0,
        False)
    if not ok:
        return None
    return list(lines).index(item)


@_modal
def ask_dxf_unit(parent, source, default="mm"):
    """The unit a drawing that states none is drawn in, or None (cancel)."""
    from PySide6.QtWidgets import QInputDialog

    units = ["mm", "cm", "m", "in", "ft"]
    choice, ok = QInputDialog.getItem(
        parent, "Drawing units",
        f"{source} does not say which unit it is drawn in.\nRead its coordinates in:",
        units, units.index(default), False)
    return choice if ok else None


@_modal
def ask_report_info(parent, report):
    """Edit the calculation sheet header; the new ReportInfo or None."""
    from wetline.app.window.report_info_dialog import ReportInfoDialog

    dlg = ReportInfoDialog(report, parent)
    if dlg.exec():
        return dlg.result_report()
    return None


@_modal
def ask_recovery(parent, copies):
    """What to do with the recovery copies found at start (a list of
    :class:`wetline.app.model.recovery.RecoveryCopy`, newest first):
    ("restore", index), ("discard", index) or ("later", None)."""
    from wetline.app.window.recovery_dialog import RecoveryDialog

    dlg = RecoveryDialog(copies, parent)
    dlg.exec()
    return dlg.answer


@_modal
def ask_preferences(parent, values):
    """Edit > Preferences: the edited ``values`` (a dict as given) or None."""
    from wetline.app.window.preferences_dialog import PreferencesDialog

    dlg = PreferencesDialog(values, parent)
    if dlg.exec():
        return dlg.values()
    return None


@_modal
def ask_structure(parent, units, section, structure, ground):
    """Section > Structure: a
    :class:`wetline.app.window.structure_dialog.StructureChoice` or None."""
    from wetline.app.window.structure_dialog import StructureDialog

    dlg = StructureDialog(units, section, structure, ground, parent)
    if dlg.exec():
        return dlg.choice
    return None


def make_progress(parent, title, text, steps):
    """A window-modal progress dialog shown at once (it does not block; the
    caller moves it and closes it)."""
    dlg = QProgressDialog(text, "Cancel", 0, steps, parent)
    dlg.setWindowTitle(title)
    dlg.setWindowModality(Qt.WindowModality.WindowModal)
    dlg.setMinimumDuration(0)
    dlg.setAutoClose(False)
    dlg.setAutoReset(False)
    dlg.setValue(0)
    dlg.show()
    return dlg
