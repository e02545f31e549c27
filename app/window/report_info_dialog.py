"""The calculation sheet header: project, job reference, prepared by.

A small dialog over :class:`wetline.core.case.ReportInfo`; the main window turns its
result into one undo step (:func:`wetline.app.model.editing.set_report_info`). The
fields are printed on every page of the PDF sheet and saved in the section
file (format version 2, key ``report``).
"""

from __future__ import annotations

from PySide6.QtWidgets import QDialog, QDialogButtonBox, QFormLayout, QLabel, QLineEdit

from wetline.core.case import ReportInfo

__all__ = ["ReportInfoDialog"]


class ReportInfoDialog(QDialog):
    """Edit the three header fields of the calculation sheet."""

    def __init__(self, report, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Calculation sheet header")
        form = QFormLayout(self)
        note = QLabel("Printed at the top of every page of the PDF calculation sheet and "
                      "saved with the section.")
        note.setWordWrap(True)
        note.setStyleSheet("color: #445;")
        form.addRow(note)
        self.project = QLineEdit(report.project)
        self.job_reference = QLineEdit(report.job_reference)
        self.prepared_by = QLineEdit(report.prepared_by)
        for edit in (self.project, self.job_reference, self.prepared_by):
            edit.setMinimumWidth(320)
        form.addRow("Project", self.project)
        form.addRow("Job reference", self.job_reference)
        form.addRow("Prepared by", self.prepared_by)
        buttons = QDialogButtonBox(QDialogButtonBox.Ok | QDialogButtonBox.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def result_report(self):
        """The fields as a :class:`wetline.core.case.ReportInfo` (surrounding spaces dropped)."""
        return ReportInfo(project=self.project.text().strip(),
                          job_reference=self.job_reference.text().strip(),
                          prepared_by=self.prepared_by.text().strip())
