"""The load cases of the design: a list to add, duplicate, rename, delete and
reorder them, and the active case's own values.

The list shows every case with its fill, load factor and groundwater;
choosing a row makes that case the active one (not an edit), and every live
view follows it: the canvas, the totals, the part and edge tables, the
chart, the uplift and flotation panels. A name is renamed in place (double
click, or F2). Under the list, the active case's fill choice (a level, a
volume, the spill level, empty), its groundwater (none, or a level and a
density; it needs a structure) and its load factor. Every change is one undo
step built by :mod:`wetline.app.model.editing`; bad input shows its reason
in red under the fields and changes nothing.
"""

from __future__ import annotations

from PySide6.QtCore import QAbstractTableModel, QItemSelectionModel, QModelIndex, Qt
from PySide6.QtGui import QColor, QFont
from PySide6.QtWidgets import (
    QAbstractItemView,
    QCheckBox,
    QComboBox,
    QFormLayout,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPushButton,
    QTableView,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing
from wetline.app.window.message_labels import ERROR_STYLE
from wetline.app.window.panels import parse_number
from wetline.core.fill import FillError
from wetline.core.load_cases import EMPTY, SPILL
from wetline.core.numbers import format_number
from wetline.core.structure import DEFAULT_GROUNDWATER_DENSITY, Groundwater

__all__ = ["CasesModel", "CaseListPanel", "FILL_CHOICES"]

FILL_CHOICES = (("level", "Level"), ("volume", "Volume"), (SPILL, "Spill level"),
                (EMPTY, "Empty"))
"""The fill choice of a case: key and words."""

_RIGHT = int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
_GROUNDWATER_TEXT = QColor("#0f7f8c")
_BOLD = QFont()
_BOLD.setBold(True)


class CasesModel(QAbstractTableModel):
    """One row per load case: name (editable), fill, load factor, groundwater."""

    HEADERS = ("Case", "Fill", "Factor", "Groundwater")

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self._doc = document
        self._made = {}  # row: (the objects its texts follow from, the texts)
        self._rows = self._texts()
        self._active = document.active_index
        self.last_error = ""
        document.casesChanged.connect(self._on_casesChanged)
        document.activeCaseChanged.connect(self._on_casesChanged)
        document.sectionChanged.connect(self._on_casesChanged)
        document.unitsChanged.connect(self._on_unitsChanged)

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._rows)

    def columnCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self.HEADERS)

    def headerData(self, section, orientation, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DisplayRole and orientation == Qt.Orientation.Horizontal:
            return self.HEADERS[section]
        return None

    def _texts(self):
        """Each row's cells as text, and whether it has groundwater.

        A row's texts follow from its load case, its resolved case and the
        display units; where all three are the objects of the last call (a
        slider step re-resolves only the active case), the row's texts are
        those of the last call."""
        doc = self._doc
        units = doc.units
        design = doc.design
        last, made = self._made, {}
        rows = []
        for r, (lc, name) in enumerate(zip(doc.load_cases, doc.case_names, strict=True)):
            key = (lc, design.resolve(name), units)
            kept = last.get(r)
            if kept is not None and all(a is b for a, b in zip(kept[0], key, strict=True)):
                row = kept[1]
            else:
                gw = lc.groundwater
                row = (lc.name, self.fill_text(r), format_number(lc.load_factor),
                       "none" if gw is None else units.fmt_length(gw.level), gw is not None)
            made[r] = (key, row)
            rows.append(row)
        self._made = made
        return rows

    def _on_unitsChanged(self):
        self._made = {}  # (the precision policy too: every text again)
        self._on_casesChanged()

    def _on_casesChanged(self):
        rows = self._texts()
        active = self._doc.active_index
        if len(rows) != len(self._rows):
            self.beginResetModel()
            self._rows, self._active = rows, active
            self.endResetModel()
            return
        # Only the rows that changed (a slider drag changes one case's fill).
        last = len(self.HEADERS) - 1
        spans = {}
        for r, (a, b) in enumerate(zip(rows, self._rows, strict=True)):
            cols = [c for c in range(last + 1) if a[c] != b[c]]
            if cols or a[4] != b[4]:
                spans[r] = (min(cols, default=last), last if a[4] != b[4] else max(cols))
        if active != self._active:  # the active row is bold: all of both rows
            spans[active] = spans[self._active] = (0, last)
        self._rows, self._active = rows, active
        for r, (c0, c1) in sorted(spans.items()):
            self.dataChanged.emit(self.index(r, c0), self.index(r, c1))

    def flags(self, index):
        f = Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable
        return f | Qt.ItemFlag.ItemIsEditable if index.column() == 0 else f

    def fill_text(self, row):
        """The fill of case ``row`` in words (``"spill (4 m)"``, ``"3.2 m"``; a
        level typed above the spill level with the level used: ``"7 m, capped at
        4 m"``, short for the list's narrow column)."""
        doc = self._doc
        lc = doc.load_cases[row]
        resolved = doc.design.resolve(doc.case_names[row])
        units = doc.units
        if lc.fill_level == SPILL:
            return f"spill ({units.fmt_length(resolved.level)})"
        if lc.fill_level == EMPTY:
            return "empty"
        case = resolved.case
        if case.fill_volume is not None:
            return units.fmt_volume(case.fill_volume)
        typed = units.fmt_length(case.fill_level)
        spill = case.section.spill_level
        if spill is not None and case.fill_level > spill:  # solved at the spill level
            return f"{typed}, capped at {units.fmt_length(spill)}"
        return typed

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        if not index.isValid() or index.row() >= len(self._rows):
            return None
        r, c = index.row(), index.column()
        row = self._rows[r]
        if role in (Qt.ItemDataRole.DisplayRole, Qt.ItemDataRole.EditRole):
            return row[c]
        if role == Qt.ItemDataRole.TextAlignmentRole and c == 2:
            return _RIGHT
        if role == Qt.ItemDataRole.FontRole and r == self._active:
            return _BOLD
        if role == Qt.ItemDataRole.ForegroundRole and c == 3 and row[4]:
            return _GROUNDWATER_TEXT
        return None

    def setData(self, index, value, role=Qt.ItemDataRole.EditRole):
        if role != Qt.ItemDataRole.EditRole or not index.isValid() or index.column() != 0:
            return False
        try:
            editing.rename_case(self._doc, index.row(), str(value))
        except ValueError as exc:
            self.last_error = self._doc.units.explain(exc)
            self.errorRaised(self.last_error)
            return False
        self.last_error = ""
        return True

    def errorRaised(self, text):
        """Hook replaced by the panel to show a message."""


class CaseListPanel(QWidget):
    """The case list with its buttons, and the active case's fill choice,
    groundwater and load factor."""

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self._doc = document
        lay = QVBoxLayout(self)
        lay.setContentsMargins(4, 4, 4, 4)
        self.model = CasesModel(document, self)
        self.model.errorRaised = self._show_error
        self.table = QTableView()
        self.table.setModel(self.model)
        self.table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.table.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.table.setEditTriggers(QAbstractItemView.EditTrigger.DoubleClicked
                                   | QAbstractItemView.EditTrigger.EditKeyPressed)
        self.table.verticalHeader().hide()
        self.table.verticalHeader().setDefaultSectionSize(22)
        header = self.table.horizontalHeader()
        header.setSectionResizeMode(0, QHeaderView.ResizeMode.Stretch)
        # Sized to the contents when the rows change, not at every slider step
        # (resizing to contents reads every cell of the column).
        for c in (1, 2, 3):
            header.setSectionResizeMode(c, QHeaderView.ResizeMode.Interactive)
        self.table.setMinimumHeight(120)
        lay.addWidget(self.table, 1)
        row = QHBoxLayout()
        self.buttons = {}
        for key, text, tip in (
                ("add", "Add", "A new case, a copy of the active one"),
                ("duplicate", "Duplicate", "A copy of the active case, right after it"),
                ("delete", "Delete", "Delete the active case (not the last one)"),
                ("up", "Up", "Move the active case up the list"),
                ("down", "Down", "Move the active case down the list")):
            b = QPushButton(text)
            b.setToolTip(tip)
            b.setAutoDefault(False)
            row.addWidget(b)
            self.buttons[key] = b
        lay.addLayout(row)

        form = QFormLayout()
        form.setFieldGrowthPolicy(QFormLayout.FieldGrowthPolicy.AllNonFixedFieldsGrow)
        self.fill = QComboBox()
        for key, words in FILL_CHOICES:
            self.fill.addItem(words, key)
        self.fill.setToolTip("How the active case is filled; the Fill panel sets the level "
                             "or volume")
        form.addRow("Fill", self.fill)
        gw_row = QHBoxLayout()
        self.groundwater = QCheckBox("at")
        self.gw_level = QLineEdit()
        self.gw_unit = QLabel()
        gw_row.addWidget(self.groundwater)
        gw_row.addWidget(self.gw_level, 1)
        gw_row.addWidget(self.gw_unit)
        form.addRow("Groundwater", gw_row)
        dens_row = QHBoxLayout()
        self.gw_density = QLineEdit()
        self.gw_density_unit = QLabel()
        dens_row.addWidget(self.gw_density, 1)
        dens_row.addWidget(self.gw_density_unit)
        form.addRow("Groundwater density", dens_row)
        self.load_factor = QLineEdit()
        self.load_factor.setToolTip("The partial factor turning this case's characteristic "
                                    "liquid and groundwater loads into design values (the "
                                    "governing code sets it)")
        form.addRow("Load factor", self.load_factor)
        lay.addLayout(form)
        self.error = QLabel()
        self.error.setWordWrap(True)
        self.error.setStyleSheet(ERROR_STYLE)
        self.error.hide()
        lay.addWidget(self.error)

        self.buttons["add"].clicked.connect(self._on_add)
        self.buttons["duplicate"].clicked.connect(self._on_duplicate)
        self.buttons["delete"].clicked.connect(self._on_delete)
        self.buttons["up"].clicked.connect(lambda: self._on_move(-1))
        self.buttons["down"].clicked.connect(lambda: self._on_move(+1))
        self.table.selectionModel().currentRowChanged.connect(self._on_currentRowChanged)
        self.fill.activated.connect(self._on_fill_chosen)
        self.groundwater.toggled.connect(self._on_groundwater_toggled)
        self.gw_level.editingFinished.connect(self._on_groundwater_edited)
        self.gw_density.editingFinished.connect(self._on_groundwater_edited)
        self.load_factor.editingFinished.connect(self._on_load_factor_edited)
        for signal in (document.casesChanged, document.activeCaseChanged,
                       document.structureChanged, document.sectionChanged,
                       document.unitsChanged):
            signal.connect(self._write_back)
        document.fillChanged.connect(self._show_fill_choice)  # at every slider step: light
        self.model.modelReset.connect(self._select_active)
        self.model.modelReset.connect(self._fit_columns)
        self.model.dataChanged.connect(self._grow_columns)
        document.unitsChanged.connect(self._fit_columns)
        self._fit_columns()
        self._write_back()

    def _fit_columns(self):
        for c in (1, 2, 3):
            self.table.resizeColumnToContents(c)

    def _grow_columns(self, top_left, bottom_right, *_):
        """Widen a column to a changed cell that no longer fits (a slider
        step changes a cell or two: measured alone, not the whole column)."""
        for c in range(max(top_left.column(), 1), min(bottom_right.column(), 3) + 1):
            width = self.table.columnWidth(c)
            for r in range(top_left.row(), bottom_right.row() + 1):
                if self.table.sizeHintForIndex(self.model.index(r, c)).width() > width:
                    self.table.resizeColumnToContents(c)
                    break

    # ------------------------------------------------------- document -> view
    def _select_active(self):
        sm = self.table.selectionModel()
        sm.blockSignals(True)
        try:
            idx = self.model.index(self._doc.active_index, 0)
            if sm.currentIndex().row() != idx.row() or not sm.isRowSelected(idx.row()):
                sm.setCurrentIndex(idx, QItemSelectionModel.SelectionFlag.ClearAndSelect
                                   | QItemSelectionModel.SelectionFlag.Rows)
                self.table.scrollTo(idx)
                self.table.viewport().update()  # the selection model's signals were blocked
        finally:
            sm.blockSignals(False)

    def _write_back(self, *_):
        doc = self._doc
        self._select_active()
        n = len(doc.case_names)
        i = doc.active_index
        has_cases = bool(doc.design.cases)
        self.buttons["delete"].setEnabled(has_cases and n > 1)
        self.buttons["up"].setEnabled(has_cases and i > 0)
        self.buttons["down"].setEnabled(has_cases and i < n - 1)
        lc = doc.active_load_case
        units = doc.units
        widgets = (self.fill, self.groundwater, self.gw_level, self.gw_density,
                   self.load_factor)
        for w in widgets:
            w.blockSignals(True)
        try:
            self._show_fill_choice()
            spill_item = self.fill.model().item(self.fill.findData(SPILL))
            spill_item.setEnabled(doc.section.spill_level is not None)
            has_structure = doc.structure is not None
            gw = lc.groundwater
            self.groundwater.setEnabled(has_structure)
            self.groundwater.setChecked(gw is not None)
            tip = "" if has_structure else "Groundwater acts on a structure: add one with " \
                                           "Section > Structure"
            self.groundwater.setToolTip(tip)
            for w in (self.gw_level, self.gw_density):
                w.setEnabled(gw is not None)
            level = gw.level if gw is not None else self._default_groundwater_level()
            density = gw.density if gw is not None else DEFAULT_GROUNDWATER_DENSITY
            self.gw_level.setText("" if level is None else format_number(units.length(level), 6))
            self.gw_density.setText(format_number(units.density(density), 6))
            self.gw_unit.setText(units.length_unit)
            self.gw_density_unit.setText(units.units.label("density"))
            self.load_factor.setText(format_number(lc.load_factor))
        finally:
            for w in widgets:
                w.blockSignals(False)
        self._show_error("")

    def _show_fill_choice(self):
        """The fill choice of the active case in the combo box."""
        doc = self._doc
        lc = doc.active_load_case
        if lc.fill_level in (SPILL, EMPTY):
            key = lc.fill_level
        else:
            key = "volume" if doc.case.fill_volume is not None else "level"
        i = self.fill.findData(key)
        if self.fill.currentIndex() != i:
            self.fill.blockSignals(True)
            self.fill.setCurrentIndex(i)
            self.fill.blockSignals(False)

    def _default_groundwater_level(self):
        """A first groundwater level offered: the ground surface, else the
        structure's top, never above an open section's spill level."""
        doc = self._doc
        s = doc.structure
        if s is None:
            return None
        level = doc.ground.level if doc.ground is not None else float(s.outline[:, 1].max())
        spill = doc.section.spill_level
        return min(level, spill) if spill is not None else level

    def _show_error(self, text):
        self.error.setText(text)
        self.error.setVisible(bool(text))

    # ------------------------------------------------------- view -> document
    def _on_currentRowChanged(self, current, _previous):
        if current.isValid() and current.row() != self._doc.active_index:
            self._doc.select_case(current.row())

    def _on_add(self):
        editing.add_case(self._doc)

    def _on_duplicate(self):
        editing.duplicate_case(self._doc, self._doc.active_index)

    def _on_delete(self):
        try:
            editing.delete_case(self._doc, self._doc.active_index)
        except ValueError as exc:
            self._show_error(self._doc.units.explain(exc))

    def _on_move(self, step):
        editing.move_case(self._doc, self._doc.active_index, step)

    def rename(self, row, name):
        """Rename case ``row`` (as an edit in place would); False if refused."""
        return self.model.setData(self.model.index(row, 0), name)

    def _on_fill_chosen(self, index):
        key = self.fill.itemData(index)
        doc = self._doc
        try:
            if key in (SPILL, EMPTY):
                editing.fill_to_word(doc, key)
            elif key == "level":
                editing.fill_to_level(doc, doc.case.level)
            else:
                sol = doc.solution
                volume = doc.case.fill_volume if doc.case.fill_volume is not None else (
                    0.0 if sol is None else sol.volume)
                editing.fill_to_volume(doc, volume)
        except (ValueError, FillError) as exc:
            self._refuse(self._doc.units.explain(exc))

    def _refuse(self, text):
        """Show the document's values again, and why the input was refused."""
        self._write_back()
        self._show_error(text)

    def _groundwater_from_fields(self):
        units = self._doc.units
        level = units.length_si(parse_number(self.gw_level.text(), "Groundwater level"))
        density = units.density_si(parse_number(self.gw_density.text(),
                                                "Groundwater density"))
        return Groundwater(level, density)

    def _on_groundwater_toggled(self, on):
        try:
            editing.set_groundwater(self._doc, self._groundwater_from_fields() if on else None)
        except ValueError as exc:
            self._refuse(self._doc.units.explain(exc))

    def _on_groundwater_edited(self):
        if not self.groundwater.isChecked():
            return
        try:
            editing.set_groundwater(self._doc, self._groundwater_from_fields())
        except ValueError as exc:
            self._show_error(self._doc.units.explain(exc))
            return
        self._show_error("")

    def _on_load_factor_edited(self):
        try:
            value = parse_number(self.load_factor.text(), "Load factor")
            editing.set_load_factor(self._doc, value)
        except ValueError as exc:
            self._show_error(self._doc.units.explain(exc))
            return
        self._show_error("")
