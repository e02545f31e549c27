"""Every modal dialog of the program, each behind one small function, so
tests can replace them (``monkeypatch.setattr(dialogs, "show_error", ...)``)
and nothing ever blocks an automated run."""

from __future__ import annotations

from PySide6.QtWidgets import QFileDialog, QMessageBox

__all__ = ["show_error", "ask_save_changes", "ask_open_path", "ask_save_path",
           "ask_export_path", "ask_template", "show_about"]

SECTION_FILTER = "Section files (*.section.json);;JSON files (*.json);;All files (*)"


def show_error(parent, title, text):
    """Tell the user what went wrong (one OK button)."""
    QMessageBox.warning(parent, title, text)


def ask_save_changes(parent, name):
    """"save", "discard" or "cancel" for a document with unsaved changes."""
    box = QMessageBox(QMessageBox.Warning, "Unsaved changes",
                      f"Save the changes to {name}?",
                      QMessageBox.Save | QMessageBox.Discard | QMessageBox.Cancel, parent)
    box.setDefaultButton(QMessageBox.Save)
    answer = box.exec()
    return {QMessageBox.Save: "save", QMessageBox.Discard: "discard"}.get(
        QMessageBox.StandardButton(answer), "cancel")


def ask_open_path(parent, folder=""):
    path, _ = QFileDialog.getOpenFileName(parent, "Open section", folder, SECTION_FILTER)
    return path or None


def ask_save_path(parent, suggested=""):
    path, _ = QFileDialog.getSaveFileName(parent, "Save section as", suggested, SECTION_FILTER)
    if path and not path.endswith(".json"):
        path += ".section.json"
    return path or None


def ask_export_path(parent, suggested=""):
    path, _ = QFileDialog.getSaveFileName(parent, "Export pressure diagram", suggested,
                                          "PNG images (*.png)")
    if path and not path.lower().endswith(".png"):
        path += ".png"
    return path or None


def ask_template(parent, units, kind=None):
    """Ask for a template and its dimensions; (section, level) or None."""
    from .templates_dialog import TemplateDialog

    dlg = TemplateDialog(units, parent)
    if dlg.exec():
        return dlg.result_section, dlg.result_level
    return None


def show_about(parent, text):
    QMessageBox.about(parent, "About Wetline", text)
