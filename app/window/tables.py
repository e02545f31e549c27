"""Tables: loads per part, loads per edge, and the editable vertex table.

Item models over the document's arrays (``QAbstractTableModel``), so a
slider step only tells the views that the data changed and they ask for the
visible cells; ten thousand edges cost no more than twenty. Selecting an
edge or vertex row selects it in the document (and so on the canvas), and
the other way round.
"""

from __future__ import annotations

from PySide6.QtCore import QAbstractTableModel, QItemSelectionModel, QModelIndex, Qt
from PySide6.QtGui import QColor
from PySide6.QtWidgets import (
    QAbstractItemView,
    QComboBox,
    QHBoxLayout,
    QStyledItemDelegate,
    QTableView,
    QToolButton,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing
from wetline.app.window.panels import parse_number
from wetline.core.numbers import format_entered, format_number
from wetline.core.section import AXIS, FLOOR, OPEN

__all__ = ["PartsModel", "EdgesModel", "VerticesModel", "PartsTable", "EdgesTable",
           "VerticesTable", "VerticesPane"]

_RIGHT = int(Qt.AlignRight | Qt.AlignVCenter)
UPLIFT_TEXT = QColor("#8e24aa")


class _Model(QAbstractTableModel):
    headers = ()

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self._doc = document

    def columnCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._headers())

    def _headers(self):
        return self.headers

    def headerData(self, section, orientation, role=Qt.DisplayRole):
        if role == Qt.DisplayRole and orientation == Qt.Horizontal:
            h = self._headers()
            return h[section] if section < len(h) else None
        if role == Qt.DisplayRole and orientation == Qt.Vertical:
            return str(section)
        return None

    def refresh(self, headers=False):
        """All cells (and the headers, if asked) may have changed; same shape."""
        rows, cols = self.rowCount(), self.columnCount()
        if rows and cols:
            self.dataChanged.emit(self.index(0, 0), self.index(rows - 1, cols - 1),
                                  [Qt.DisplayRole, Qt.ForegroundRole])
        h = self._headers()
        if (headers or h != getattr(self, "_shown_headers", None)) and cols:
            self._shown_headers = h
            self.headerDataChanged.emit(Qt.Horizontal, 0, cols - 1)

    def _on_unitsChanged(self):
        self.refresh(headers=True)


class PartsModel(_Model):
    """Per part: horizontal, vertical and downward load, and its direction."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self._rows = []
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)

    def _headers(self):
        sol = self._doc.solution
        f = self._doc.force_scope(sol.section).label if sol else ""
        return ("Part", f"Fx [{f}]", f"Fz [{f}]", f"Down [{f}]", "")

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._rows)

    def _on_solved(self, solution):
        rows = list(solution.parts.items())
        if len(rows) != len(self._rows):
            self.beginResetModel()
            self._rows = rows
            self.endResetModel()
        else:
            self._rows = rows
            self.refresh()

    def data(self, index, role=Qt.DisplayRole):
        if not index.isValid():
            return None
        name, load = self._rows[index.row()]
        c = index.column()
        doc = self._doc
        scope, scale = doc.force_scope(doc.solution.section), doc.force_scale
        lifted = load.down < 0
        if role == Qt.DisplayRole:
            if c == 0:
                return name
            if c == 1:
                return "-" if load.fx is None else scope.number(load.fx, scale=scale)
            if c == 2:
                return scope.number(load.fz, scale=scale)
            if c == 3:
                return scope.number(load.down, scale=scale)
            if c == 4:
                return "uplift" if lifted else ("down" if load.down > 0 else "")
        if role == Qt.TextAlignmentRole and 0 < c < 4:
            return _RIGHT
        if role == Qt.ForegroundRole and lifted and c in (3, 4):
            return UPLIFT_TEXT
        return None


class EdgesModel(_Model):
    """Per edge: part, length, wetted length, end pressures, forces."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self._n = 0
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)

    def _headers(self):
        sol = self._doc.solution
        u = self._doc.units
        L = u.length_unit
        p = u.units.label("pressure")
        if sol is None:
            return ()
        f = self._doc.force_scope(sol.section).label
        if sol.section.is_axisymmetric:
            q = u.units.label("force_per_length")
            return ("Part", f"Length [{L}]", f"Wetted [{L}]", f"p start [{p}]",
                    f"p end [{p}]", f"Fz [{f}]", f"Hoop start [{q}]", f"Hoop end [{q}]")
        return ("Part", f"Length [{L}]", f"Wetted [{L}]", f"p start [{p}]", f"p end [{p}]",
                f"Fx [{f}]", f"Fz [{f}]", f"Resultant [{f}]")

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else self._n

    def _on_solved(self, solution):
        n = solution.section.n_edges
        if n != self._n or getattr(self, "_axi", None) != solution.section.is_axisymmetric:
            self.beginResetModel()
            self._n = n
            self._axi = solution.section.is_axisymmetric
            self.endResetModel()
        else:
            self.refresh()

    def data(self, index, role=Qt.DisplayRole):
        if not index.isValid():
            return None
        sol = self._doc.solution
        if sol is None or index.row() >= sol.section.n_edges:
            return None
        i, c = index.row(), index.column()
        if role == Qt.TextAlignmentRole and c > 0:
            return _RIGHT
        if role != Qt.DisplayRole:
            if role == Qt.ForegroundRole and c == 0 and sol.section.parts[i] in (OPEN, AXIS):
                return QColor("#7a8594")
            return None
        u = self._doc.units
        s = sol.section
        if c == 0:
            return s.parts[i]
        if c == 1:
            return format_number(u.length(s.geometry.length[i]))
        if c == 2:
            return format_number(u.length(sol.wetted_length[i]))
        if c == 3:
            return format_number(u.pressure(sol.p_start[i]))
        if c == 4:
            return format_number(u.pressure(sol.p_end[i]))
        scope, scale = self._doc.force_scope(s), self._doc.force_scale
        if s.is_axisymmetric:
            if c == 5:
                return scope.number(sol.fz[i], scale=scale)
            hoop = sol.hoop_start[i] if c == 6 else sol.hoop_end[i]
            return format_number(u.units.to_display(hoop, "force_per_length"))
        value = (sol.fx, sol.fz, sol.resultant)[c - 5][i]
        return scope.number(value, scale=scale)


class VerticesModel(_Model):
    """Vertex coordinates in the display length unit, and the part of the
    edge leaving each vertex; all editable (each edit one undo step)."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self._n = len(document.working_outline()[0])
        self.last_error = ""
        document.sectionChanged.connect(self._on_outlineChanged)
        document.draftChanged.connect(self._on_outlineChanged)
        document.previewChanged.connect(self._on_outlineChanged)  # live during a drag
        document.unitsChanged.connect(self._on_unitsChanged)

    def _headers(self):
        L = self._doc.units.length_unit
        return (f"x [{L}]", f"z [{L}]", "Part of edge to next")

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else self._n

    def _on_outlineChanged(self):
        n = len(self._doc.working_outline()[0])
        if n != self._n:
            self.beginResetModel()
            self._n = n
            self.endResetModel()
        else:
            self.refresh()

    def flags(self, index):
        return Qt.ItemIsEnabled | Qt.ItemIsSelectable | Qt.ItemIsEditable

    def data(self, index, role=Qt.DisplayRole):
        if not index.isValid():
            return None
        outline, parts = self._doc.working_outline()
        i, c = index.row(), index.column()
        if i >= len(outline):
            return None
        if role in (Qt.DisplayRole, Qt.EditRole):
            if c < 2:
                # Coordinates as entered (the precision policy), to edit too.
                return format_entered(self._doc.units.length(outline[i, c]))
            return parts[i]
        if role == Qt.TextAlignmentRole and c < 2:
            return _RIGHT
        draft = self._doc.draft
        if role == Qt.BackgroundRole and draft is not None and (
                i in draft.error.vertices or (c == 2 and i in draft.error.edges)):
            return QColor("#ffd6d6")
        return None

    def setData(self, index, value, role=Qt.EditRole):
        if role != Qt.EditRole or not index.isValid():
            return False
        i, c = index.row(), index.column()
        doc = self._doc
        try:
            if c < 2:
                outline, _ = doc.working_outline()
                if str(value).strip() == format_entered(doc.units.length(outline[i, c])):
                    return True  # the text as shown, not edited: no step
                v = doc.units.length_si(parse_number(str(value), ("x", "z")[c]))
                x, z = outline[i]
                if c == 0:
                    x = v
                else:
                    z = v
                ok = editing.move_vertex(doc, i, x, z)
            else:
                ok = editing.set_edge_part(doc, i, str(value))
        except ValueError as exc:
            self.last_error = str(exc)
            self.errorRaised(self.last_error)
            return False
        self.last_error = "" if ok else f"Invalid outline: {doc.draft.error}"
        if not ok:
            self.errorRaised(self.last_error)
        return True

    def errorRaised(self, text):
        """Hook replaced by the view to show a message."""


class PartDelegate(QStyledItemDelegate):
    """An editable combo box of part names for the vertex table."""

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self._doc = document

    def createEditor(self, parent, option, index):
        if index.column() != 2:
            return super().createEditor(parent, option, index)
        combo = QComboBox(parent)
        combo.setEditable(True)
        _, parts = self._doc.working_outline()
        combo.addItems(list(dict.fromkeys(("wall", FLOOR, OPEN, "lid", AXIS) + tuple(parts))))
        return combo

    def setEditorData(self, editor, index):
        if isinstance(editor, QComboBox):
            editor.setCurrentText(index.data(Qt.EditRole))
        else:
            super().setEditorData(editor, index)

    def setModelData(self, editor, model, index):
        if isinstance(editor, QComboBox):
            model.setData(index, editor.currentText(), Qt.EditRole)
        else:
            super().setModelData(editor, model, index)


class _SelectionSync:
    """Row selection <-> document selection (edges or vertices)."""

    def _sync_init(self, document, kind):
        self._doc = document
        self._kind = kind
        self.selectionModel().currentRowChanged.connect(self._on_currentRowChanged)
        document.selectionChanged.connect(self._on_selectionChanged)

    def _on_currentRowChanged(self, current, _previous):
        if not current.isValid():
            return
        if self._kind == "edge":
            self._doc.select_edge(current.row())
        else:
            self._doc.select_vertex(current.row())

    def _on_selectionChanged(self):
        row = self._doc.selected_edge if self._kind == "edge" else self._doc.selected_vertex
        sm = self.selectionModel()
        sm.blockSignals(True)
        try:
            if row is None or row >= self.model().rowCount():
                sm.clearSelection()
            else:
                idx = self.model().index(row, 0)
                sm.setCurrentIndex(idx, QItemSelectionModel.ClearAndSelect
                                   | QItemSelectionModel.Rows)
                self.scrollTo(idx)
        finally:
            sm.blockSignals(False)
        self.viewport().update()


class PartsTable(QTableView):
    def __init__(self, document, parent=None):
        super().__init__(parent)
        self.setModel(PartsModel(document, self))
        self.setAlternatingRowColors(True)
        self.verticalHeader().hide()
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setStretchLastSection(True)
        self.setEditTriggers(QAbstractItemView.NoEditTriggers)


class EdgesTable(QTableView, _SelectionSync):
    def __init__(self, document, parent=None):
        super().__init__(parent)
        self.setModel(EdgesModel(document, self))
        self.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.setSelectionMode(QAbstractItemView.SingleSelection)
        self.setAlternatingRowColors(True)
        self.setEditTriggers(QAbstractItemView.NoEditTriggers)
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setStretchLastSection(True)
        self._sync_init(document, "edge")


class VerticesTable(QTableView, _SelectionSync):
    def __init__(self, document, message=None, parent=None):
        super().__init__(parent)
        model = VerticesModel(document, self)
        if message is not None:
            model.errorRaised = message
        self.setModel(model)
        self.setItemDelegate(PartDelegate(document, self))
        self.setSelectionBehavior(QAbstractItemView.SelectItems)
        self.setSelectionMode(QAbstractItemView.SingleSelection)
        self.setAlternatingRowColors(True)
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setStretchLastSection(True)
        self._sync_init(document, "vertex")


class VerticesPane(QWidget):
    """The vertex table with a row of buttons above it (paste a coordinate
    list, copy the outline, import a CSV file): each button shows one of the
    window's actions, so the menu, its shortcut and the button do the same."""

    def __init__(self, table, actions=(), parent=None):
        super().__init__(parent)
        self.table = table
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(2)
        row = QHBoxLayout()
        row.setContentsMargins(2, 2, 2, 0)
        self.buttons = []
        for action in actions:
            button = QToolButton()
            button.setDefaultAction(action)
            button.setToolButtonStyle(Qt.ToolButtonTextOnly)
            row.addWidget(button)
            self.buttons.append(button)
        row.addStretch(1)
        lay.addLayout(row)
        lay.addWidget(table, 1)
