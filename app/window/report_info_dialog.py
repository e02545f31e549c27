"""The calculation sheet's header and document control, and the precision
policy of the document's numbers.

A dialog over :class:`wetline.core.case.ReportInfo`: project, job reference
and calculation reference; prepared, checked and approved by; the current
revision and the revision history (one row per issue: revision, date,
description, prepared, checked, approved); the significant figures of
results. The main window turns its result into one undo step
(:func:`wetline.app.model.editing.set_report_info`). The fields are printed
on every page of the PDF sheet and saved in the section file (format
version 2, key ``report``).
"""

from __future__ import annotations

import datetime
import re

from PySide6.QtWidgets import (
    QAbstractItemView,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPushButton,
    QSpinBox,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
)

from wetline.core.case import REVISION_KEYS, ReportInfo, Revision
from wetline.core.numbers import FIGURES_RANGE

__all__ = ["ReportInfoDialog", "next_revision"]

_HEADERS = ("Revision", "Date", "Description", "Prepared", "Checked", "Approved")


def next_revision(mark):
    """The mark after ``mark``: "A" -> "B", "Z" -> "AA", "P1" -> "P2", "3"
    -> "4"; "A" after nothing (or a mark with no letter or number to step)."""
    mark = mark.strip()
    if not mark:
        return "A"
    m = re.fullmatch(r"(.*?)(\d+)", mark)
    if m:
        return f"{m.group(1)}{int(m.group(2)) + 1}"
    if re.fullmatch(r"[A-Z]+", mark):
        letters = list(mark)
        k = len(letters) - 1
        while k >= 0 and letters[k] == "Z":
            letters[k] = "A"
            k -= 1
        if k < 0:
            return "A" + "".join(letters)
        letters[k] = chr(ord(letters[k]) + 1)
        return "".join(letters)
    return "A"


class ReportInfoDialog(QDialog):
    """Edit the sheet's header, document control and precision policy."""

    def __init__(self, report, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Calculation sheet: header and document control")
        lay = QVBoxLayout(self)
        note = QLabel("Printed at the top of every page of the PDF calculation sheet and "
                      "saved with the section.")
        note.setWordWrap(True)
        note.setStyleSheet("color: #445;")
        lay.addWidget(note)

        header = QGroupBox("Header")
        form = QFormLayout(header)
        self.project = QLineEdit(report.project)
        self.job_reference = QLineEdit(report.job_reference)
        self.calculation_reference = QLineEdit(report.calculation_reference)
        self.calculation_reference.setPlaceholderText("the sheet's own reference")
        form.addRow("Project", self.project)
        form.addRow("Job reference", self.job_reference)
        form.addRow("Calculation reference", self.calculation_reference)
        lay.addWidget(header)

        sign = QGroupBox("Sign-off")
        form = QFormLayout(sign)
        self.prepared_by = QLineEdit(report.prepared_by)
        self.checked_by = QLineEdit(report.checked_by)
        self.approved_by = QLineEdit(report.approved_by)
        form.addRow("Prepared by", self.prepared_by)
        form.addRow("Checked by", self.checked_by)
        form.addRow("Approved by", self.approved_by)
        lay.addWidget(sign)
        for edit in (self.project, self.job_reference, self.calculation_reference,
                     self.prepared_by, self.checked_by, self.approved_by):
            edit.setMinimumWidth(360)

        revs = QGroupBox("Revisions")
        rl = QVBoxLayout(revs)
        form = QFormLayout()
        self.revision = QLineEdit(report.revision)
        self.revision.setPlaceholderText("the last row below")
        self.revision.setMaximumWidth(
            self.revision.fontMetrics().horizontalAdvance("the last row below") + 24)
        form.addRow("Current revision", self.revision)
        rl.addLayout(form)
        self.history = QTableWidget(0, len(_HEADERS))
        self.history.setHorizontalHeaderLabels(list(_HEADERS))
        self.history.verticalHeader().setVisible(False)
        self.history.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        head = self.history.horizontalHeader()
        head.setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        head.setSectionResizeMode(2, QHeaderView.ResizeMode.Stretch)
        for col, width in ((0, 70), (1, 96), (3, 80), (4, 80), (5, 80)):
            self.history.setColumnWidth(col, width)
        self.history.setMinimumSize(720, 150)
        for r in report.revisions:
            self._add_row([getattr(r, k) for k in REVISION_KEYS])
        rl.addWidget(self.history)
        buttons = QHBoxLayout()
        self.add_button = QPushButton("Add revision")
        self.add_button.setToolTip("A new row: the next revision, today's date and the "
                                   "names above")
        self.remove_button = QPushButton("Remove revision")
        self.add_button.clicked.connect(self.add_revision)
        self.remove_button.clicked.connect(self.remove_revision)
        buttons.addWidget(self.add_button)
        buttons.addWidget(self.remove_button)
        buttons.addStretch(1)
        rl.addLayout(buttons)
        lay.addWidget(revs)

        precision = QGroupBox("Precision of the numbers")
        pl = QHBoxLayout(precision)
        pl.addWidget(QLabel("Results to"))
        self.figures = QSpinBox()
        self.figures.setRange(*FIGURES_RANGE)
        self.figures.setValue(report.significant_figures)
        pl.addWidget(self.figures)
        text = QLabel("significant figures (window, tables, diagram and sheet). "
                      "Coordinates and dimensions are shown as entered; files and CSV "
                      "keep full precision.")
        text.setWordWrap(True)
        pl.addWidget(text, 1)
        lay.addWidget(precision)

        box = QDialogButtonBox(
            QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        box.accepted.connect(self.accept)
        box.rejected.connect(self.reject)
        lay.addWidget(box)

    # ------------------------------------------------------- history
    def _add_row(self, values):
        row = self.history.rowCount()
        self.history.insertRow(row)
        for col, v in enumerate(values):
            self.history.setItem(row, col, QTableWidgetItem(v))
        return row

    def _rows(self):
        out = []
        for row in range(self.history.rowCount()):
            cells = []
            for col in range(len(_HEADERS)):
                item = self.history.item(row, col)
                cells.append("" if item is None else item.text().strip())
            out.append(cells)
        return out

    def add_revision(self, date=None):
        """A new history row: the next mark, ``date`` (default today, ISO
        8601) and the sign-off names of the fields above."""
        rows = self._rows()
        last = rows[-1][0] if rows else ""
        when = (date or datetime.date.today()).isoformat()
        row = self._add_row([next_revision(last) if rows else "A", when, "",
                             self.prepared_by.text().strip(), self.checked_by.text().strip(),
                             self.approved_by.text().strip()])
        self.history.setCurrentCell(row, 2)
        return row

    def remove_revision(self):
        """Remove the selected history row (the last one if none is)."""
        row = self.history.currentRow()
        if row < 0:
            row = self.history.rowCount() - 1
        if row >= 0:
            self.history.removeRow(row)

    def result_report(self):
        """The fields as a :class:`wetline.core.case.ReportInfo` (surrounding
        spaces dropped, empty history rows left out)."""
        revisions = tuple(Revision(*cells) for cells in self._rows() if any(cells))
        return ReportInfo(project=self.project.text().strip(),
                          job_reference=self.job_reference.text().strip(),
                          prepared_by=self.prepared_by.text().strip(),
                          calculation_reference=self.calculation_reference.text().strip(),
                          revision=self.revision.text().strip(),
                          checked_by=self.checked_by.text().strip(),
                          approved_by=self.approved_by.text().strip(),
                          revisions=revisions,
                          significant_figures=self.figures.value())
