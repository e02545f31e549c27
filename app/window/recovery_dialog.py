"""The offer at start of the recovery copies a crash left behind.

Lists each copy (document name, when it was written, the file it belongs
to) and offers Restore (the selected copy becomes the open document, marked
modified, with its file for Save), Discard (the selected copy is deleted)
or Later (every copy is kept and offered again at the next start). See
:mod:`wetline.app.model.recovery`.
"""

from __future__ import annotations

from PySide6.QtWidgets import (
    QDialog,
    QDialogButtonBox,
    QLabel,
    QListWidget,
    QPushButton,
    QVBoxLayout,
)

__all__ = ["RecoveryDialog"]


class RecoveryDialog(QDialog):
    """Restore, discard or keep for later the recovery copies ``copies``
    (a list of :class:`wetline.app.model.recovery.RecoveryCopy`, newest first)."""

    def __init__(self, copies, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Recover unsaved work")
        self.answer = ("later", None)
        lay = QVBoxLayout(self)
        n = len(copies)
        text = QLabel("Wetline ended without saving your changes. "
                      + ("A recovery copy was found:" if n == 1 else
                         f"{n} recovery copies were found:"))
        text.setWordWrap(True)
        lay.addWidget(text)
        self.list = QListWidget()
        for copy in copies:
            self.list.addItem(copy.describe())
        self.list.setCurrentRow(0)
        self.list.setMinimumWidth(560)
        lay.addWidget(self.list)
        note = QLabel("Restore opens the copy as an unsaved document that Save writes to its "
                      "file; Discard deletes the selected copy; Later keeps every copy for "
                      "the next start.")
        note.setWordWrap(True)
        note.setStyleSheet("color: #445;")
        lay.addWidget(note)
        buttons = QDialogButtonBox()
        self.restore_button = QPushButton("Restore")
        self.discard_button = QPushButton("Discard")
        self.later_button = QPushButton("Later")
        buttons.addButton(self.restore_button, QDialogButtonBox.ButtonRole.AcceptRole)
        buttons.addButton(self.discard_button, QDialogButtonBox.ButtonRole.DestructiveRole)
        buttons.addButton(self.later_button, QDialogButtonBox.ButtonRole.RejectRole)
        self.restore_button.setDefault(True)
        self.restore_button.clicked.connect(lambda: self._answer("restore"))
        self.discard_button.clicked.connect(lambda: self._answer("discard"))
        self.later_button.clicked.connect(lambda: self._answer("later"))
        lay.addWidget(buttons)

    def _answer(self, what):
        row = self.list.currentRow()
        self.answer = (what, max(row, 0) if what != "later" else None)
        if what == "later":
            self.reject()
        else:
            self.accept()
