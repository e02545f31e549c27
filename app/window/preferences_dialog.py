"""Edit > Preferences: how often a recovery copy of unsaved changes is
written, and how many undo steps are kept. Stored in the settings
(QSettings) by the main window."""

from __future__ import annotations

from PySide6.QtWidgets import QDialog, QDialogButtonBox, QFormLayout, QLabel, QSpinBox

__all__ = ["PreferencesDialog", "MAX_AUTOSAVE_S", "UNDO_LIMIT_RANGE"]

MAX_AUTOSAVE_S = 3600
"""Longest autosave interval offered [s]."""

UNDO_LIMIT_RANGE = (10, 100_000)
"""Fewest and most undo steps offered."""


class PreferencesDialog(QDialog):
    """The autosave interval [s] (0 = off) and the undo steps kept."""

    def __init__(self, values, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Preferences")
        form = QFormLayout(self)
        self.autosave = QSpinBox()
        self.autosave.setRange(0, MAX_AUTOSAVE_S)
        self.autosave.setSuffix(" s")
        self.autosave.setSpecialValueText("off")
        self.autosave.setValue(int(values["autosave_interval_s"]))
        self.autosave.setToolTip("How often a recovery copy of unsaved changes is written "
                                 "(the first one a few seconds after the first edit); 0 = off")
        form.addRow("Recovery copy every", self.autosave)
        self.undo_limit = QSpinBox()
        self.undo_limit.setRange(*UNDO_LIMIT_RANGE)
        self.undo_limit.setSingleStep(100)
        self.undo_limit.setValue(int(values["undo_limit"]))
        self.undo_limit.setToolTip("Undo steps kept; the oldest go first")
        form.addRow("Undo steps kept", self.undo_limit)
        note = QLabel("Recovery copies are kept in the application data folder, not beside "
                      "your files, and offered at the next start if Wetline ends without "
                      "saving. A new number of undo steps applies from the next section "
                      "opened.")
        note.setWordWrap(True)
        note.setStyleSheet("color: #445;")
        form.addRow(note)
        buttons = QDialogButtonBox(
            QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def values(self):
        """The settings as edited: {"autosave_interval_s": int, "undo_limit": int}."""
        return {"autosave_interval_s": self.autosave.value(),
                "undo_limit": self.undo_limit.value()}
