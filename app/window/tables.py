"""Tables: loads per part, loads per edge, and the editable vertex table
(of the cavity, or of the structure around it).

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
from wetline.app.model.document import CAVITY, STRUCTURE
from wetline.app.model.step_timer import span
from wetline.core.number_input import parse_decimal
from wetline.core.numbers import format_entered, format_number
from wetline.core.section import AXIS, FLOOR, OPEN
from wetline.core.structure import OUTER_WALL

__all__ = ["PartsModel", "EdgesModel", "VerticesModel", "PartsTable", "EdgesTable",
           "VerticesTable", "VerticesPane"]

_RIGHT = int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
CELLS_KEPT = 6000
"""Cell values (cell and role) a model keeps as shown; more (a table
scrolled through thousands of rows) and a refresh tells of every cell."""
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

    def headerData(self, section, orientation, role=Qt.ItemDataRole.DisplayRole):
        if role == Qt.ItemDataRole.DisplayRole and orientation == Qt.Orientation.Horizontal:
            h = self._headers()
            return h[section] if section < len(h) else None
        if role == Qt.ItemDataRole.DisplayRole and orientation == Qt.Orientation.Vertical:
            return str(section)
        return None

    _shown: dict | None = None

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        """The cell's value for ``role``, as last given to the views (kept,
        so that :meth:`refresh` tells them only of the cells that changed)."""
        if not index.isValid():
            return None
        shown = self._shown
        if shown is None:
            shown = self._shown = {}
        key = (index.row(), index.column(), role)
        try:
            return shown[key]
        except KeyError:
            pass
        value = self._value(index, role)
        if len(shown) < CELLS_KEPT:
            shown[key] = value
        return value

    def _value(self, index, role):
        """The cell's value for ``role`` (the model's own)."""
        return None

    def _forget_shown(self):
        """The rows are new (a reset): nothing shown is kept."""
        self._shown = None

    def beginResetModel(self):
        self._forget_shown()
        super().beginResetModel()

    def endResetModel(self):
        self._forget_shown()
        super().endResetModel()

    def refresh(self, headers=False):
        """Any cell (and the headers, if asked) may have changed; same shape.
        The views hear of the cells whose value changed, row by row (a
        value the same as shown repaints nothing); with more cells kept
        than :data:`CELLS_KEPT`, of every cell."""
        with span("tables"):
            self._refresh(headers)

    def _refresh(self, headers):
        rows, cols = self.rowCount(), self.columnCount()
        shown = self._shown
        if shown is None or len(shown) >= CELLS_KEPT:
            self._shown = None
            if rows and cols:
                self.dataChanged.emit(self.index(0, 0), self.index(rows - 1, cols - 1))
        elif shown:
            changed = {}
            kept = {}
            for key, old in shown.items():
                r, c, role = key
                if r >= rows or c >= cols:
                    continue
                value = self._value(self.createIndex(r, c), role)  # (no bounds checks)
                kept[key] = value
                if type(value) is not type(old) or value != old:
                    changed.setdefault(r, set()).add(c)
            self._shown = kept
            for r in sorted(changed):
                c = sorted(changed[r])
                self.dataChanged.emit(self.createIndex(r, c[0]), self.createIndex(r, c[-1]))
        h = self._headers()
        if (headers or h != getattr(self, "_shown_headers", None)) and cols:
            self._shown_headers = h
            self.headerDataChanged.emit(Qt.Orientation.Horizontal, 0, cols - 1)

    def _on_unitsChanged(self):
        self.refresh(headers=True)


class PartsModel(_Model):
    """Per part: horizontal, vertical and downward load, and its direction;
    with a load factor other than 1 the design downward load beside it. In
    the envelope view: each part's largest downward load and largest uplift
    over all cases (design values) with the case giving each."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self._rows = []
        self._shape = None
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.envelopeReady.connect(self._on_envelopeReady)
        document.viewModeChanged.connect(self._on_viewModeChanged)

    @property
    def envelope(self):
        """True while the rows are the envelope's."""
        return self._doc.view_mode == "envelope" and self._doc.envelope is not None

    def _factor(self):
        solved = self._doc.solved_case
        return 1.0 if solved is None else solved.load_factor

    def _headers(self):
        sol = self._doc.solution
        f = self._doc.force_scope(sol.section).label if sol else ""
        if self.envelope:
            return ("Part", f"Max down [{f}]", "Case", f"Max uplift [{f}]", "Case")
        if self._factor() != 1.0:
            return ("Part", f"Fx [{f}]", f"Fz [{f}]", f"Down [{f}]",
                    f"Design down [{f}]", "")
        return ("Part", f"Fx [{f}]", f"Fz [{f}]", f"Down [{f}]", "")

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._rows)

    def _set_rows(self, rows):
        shape = (len(rows), self.envelope, len(self._headers()))
        if shape != self._shape:
            self.beginResetModel()
            self._rows = rows
            self._shape = shape
            self.endResetModel()
        else:
            self._rows = rows
            self.refresh()

    def _on_solved(self, solution):
        if not self.envelope:
            self._set_rows(list(solution.parts.items()))

    def _on_envelopeReady(self, env):
        if self.envelope:
            self._set_rows(list(env.parts.items()))

    def _on_viewModeChanged(self):
        if self.envelope:
            self._set_rows(list(self._doc.envelope.parts.items()))
        elif self._doc.solution is not None:
            self._set_rows(list(self._doc.solution.parts.items()))

    def _value(self, index, role):
        if index.row() >= len(self._rows):
            return None
        name, load = self._rows[index.row()]
        c = index.column()
        doc = self._doc
        scope = doc.force_scope(doc.solution.section)
        if self.envelope and hasattr(load, "max_down"):
            if role == Qt.ItemDataRole.DisplayRole:
                return (name, scope.number(load.max_down), load.max_down_case or "-",
                        scope.number(load.max_up), load.max_up_case or "-")[c]
            if role == Qt.ItemDataRole.TextAlignmentRole and c in (1, 3):
                return _RIGHT
            if role == Qt.ItemDataRole.ForegroundRole and c in (3, 4) and load.max_up > 0:
                return UPLIFT_TEXT
            return None
        if not hasattr(load, "down"):
            return None
        scale = doc.force_scale
        factor = self._factor()
        design = factor != 1.0
        lifted = load.down < 0
        last = 5 if design else 4
        if role == Qt.ItemDataRole.DisplayRole:
            if c == 0:
                return name
            if c == 1:
                return "-" if load.fx is None else scope.number(load.fx, scale=scale)
            if c == 2:
                return scope.number(load.fz, scale=scale)
            if c == 3:
                return scope.number(load.down, scale=scale)
            if c == 4 and design:
                return scope.number(factor * load.down, scale=factor * scale)
            if c == last:
                return "uplift" if lifted else ("down" if load.down > 0 else "")
        if role == Qt.ItemDataRole.TextAlignmentRole and 0 < c < last:
            return _RIGHT
        if role == Qt.ItemDataRole.ForegroundRole and lifted and c >= 3:
            return UPLIFT_TEXT
        return None


class EdgesModel(_Model):
    """Per edge: part, length, wetted length, end pressures, forces."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self._n = 0
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.envelopeReady.connect(self._on_envelopeReady)
        document.viewModeChanged.connect(self._on_viewModeChanged)

    @property
    def envelope(self):
        """True while the rows are the envelope's (same section as shown)."""
        doc = self._doc
        env, sol = doc.envelope, doc.solution
        return (doc.view_mode == "envelope" and env is not None and sol is not None
                and env.edge_max_pressure.size == sol.section.n_edges)

    def _on_envelopeReady(self, _env):
        if self._doc.view_mode == "envelope" and self._doc.solution is not None:
            self._on_solved(self._doc.solution)

    def _on_viewModeChanged(self):
        if self._doc.solution is not None:
            self._on_solved(self._doc.solution)

    def _headers(self):
        sol = self._doc.solution
        u = self._doc.units
        L = u.length_unit
        p = u.units.label("pressure")
        if sol is None:
            return ()
        if self.envelope:
            return ("Part", f"Length [{L}]", f"Max design pressure [{p}]", "Case")
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
        shape = (solution.section.is_axisymmetric, self.envelope)
        if n != self._n or getattr(self, "_shape", None) != shape:
            self.beginResetModel()
            self._n = n
            self._shape = shape
            self.endResetModel()
        else:
            self.refresh()

    def _value(self, index, role):
        sol = self._doc.solution
        if sol is None or index.row() >= sol.section.n_edges:
            return None
        i, c = index.row(), index.column()
        if role == Qt.ItemDataRole.TextAlignmentRole and c > 0:
            return _RIGHT
        if role != Qt.ItemDataRole.DisplayRole:
            if role == Qt.ItemDataRole.ForegroundRole and c == 0 \
                    and sol.section.parts[i] in (OPEN, AXIS):
                return QColor("#7a8594")
            return None
        u = self._doc.units
        s = sol.section
        if c == 0:
            return s.parts[i]
        if self.envelope:
            if c == 1:
                return format_number(u.length(s.geometry.length[i]))
            pressure, case = self._doc.envelope.edge(i)
            return format_number(u.pressure(pressure)) if c == 2 else (case or "-")
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
    edge leaving each vertex; all editable (each edit one undo step). Shows
    the cavity's outline, or the structure's (:meth:`set_target`)."""

    def __init__(self, document, parent=None):
        super().__init__(document, parent)
        self.target = CAVITY
        self._n = len(document.working_outline()[0])
        self.last_error = ""
        document.sectionChanged.connect(self._on_outlineChanged)
        document.draftChanged.connect(self._on_outlineChanged)
        document.previewChanged.connect(self._on_outlineChanged)  # live during a drag
        document.structureChanged.connect(self._on_structureChanged)
        document.unitsChanged.connect(self._on_unitsChanged)

    def set_target(self, target):
        """Show and edit the cavity's outline (``"cavity"``) or the
        structure's (``"structure"``, if there is one)."""
        if target not in (CAVITY, STRUCTURE):
            raise ValueError(target)
        if target == STRUCTURE and self._doc.structure is None:
            target = CAVITY
        if target != self.target:
            self.beginResetModel()
            self.target = target
            self._n = len(self.outline()[0])
            self.endResetModel()

    def outline(self):
        """(outline [m], parts) shown: the cavity's or the structure's being edited."""
        if self.target == STRUCTURE:
            working = self._doc.working_structure_outline()
            if working is not None:
                return working
        return self._doc.working_outline()

    def _headers(self):
        L = self._doc.units.length_unit
        return (f"x [{L}]", f"z [{L}]", "Part of edge to next")

    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else self._n

    def _on_structureChanged(self):
        if self._doc.structure is None and self.target == STRUCTURE:
            self.set_target(CAVITY)
        self._on_outlineChanged()

    def _on_outlineChanged(self):
        n = len(self.outline()[0])
        if n != self._n:
            self.beginResetModel()
            self._n = n
            self.endResetModel()
        else:
            self.refresh()

    def flags(self, index):
        return Qt.ItemFlag.ItemIsEnabled | Qt.ItemFlag.ItemIsSelectable | Qt.ItemFlag.ItemIsEditable

    def _value(self, index, role):
        outline, parts = self.outline()
        i, c = index.row(), index.column()
        if i >= len(outline):
            return None
        if role in (Qt.ItemDataRole.DisplayRole, Qt.ItemDataRole.EditRole):
            if c < 2:
                # Coordinates as entered (the precision policy), to edit too.
                return format_entered(self._doc.units.length(outline[i, c]))
            return parts[i]
        if role == Qt.ItemDataRole.TextAlignmentRole and c < 2:
            return _RIGHT
        draft = self._doc.draft
        if role == Qt.ItemDataRole.BackgroundRole and draft is not None \
                and draft.target == self.target and (
                    i in draft.error.vertices or (c == 2 and i in draft.error.edges)):
            return QColor("#ffd6d6")
        return None

    def setData(self, index, value, role=Qt.ItemDataRole.EditRole):
        if role != Qt.ItemDataRole.EditRole or not index.isValid():
            return False
        i, c = index.row(), index.column()
        doc = self._doc
        structure = self.target == STRUCTURE
        try:
            if c < 2:
                outline, _ = self.outline()
                if str(value).strip() == format_entered(doc.units.length(outline[i, c])):
                    return True  # the text as shown, not edited: no step
                # The one parser of typed decimals (as the CLI, the draw input).
                v = doc.units.length_si(parse_decimal(str(value), ("x", "z")[c]))
                x, z = outline[i]
                if c == 0:
                    x = v
                else:
                    z = v
                move = editing.move_structure_vertex if structure else editing.move_vertex
                ok = move(doc, i, x, z)
            else:
                set_part = editing.set_structure_part if structure else editing.set_edge_part
                ok = set_part(doc, i, str(value))
        except ValueError as exc:
            self.last_error = self._doc.units.explain(exc)
            self.errorRaised(self.last_error)
            return False
        what = "structure outline" if structure else "outline"
        self.last_error = "" if ok else f"Invalid {what}: {doc.units.explain(doc.draft.error)}"
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
        model = index.model()
        if getattr(model, "target", CAVITY) == STRUCTURE:
            _, parts = model.outline()
            offered = (OUTER_WALL, "base", "outer roof")
        else:
            _, parts = self._doc.working_outline()
            offered = ("wall", FLOOR, OPEN, "lid", AXIS)
        combo.addItems(list(dict.fromkeys(offered + tuple(parts))))
        return combo

    def setEditorData(self, editor, index):
        if isinstance(editor, QComboBox):
            editor.setCurrentText(index.data(Qt.ItemDataRole.EditRole))
        else:
            super().setEditorData(editor, index)

    def setModelData(self, editor, model, index):
        if isinstance(editor, QComboBox):
            model.setData(index, editor.currentText(), Qt.ItemDataRole.EditRole)
        else:
            super().setModelData(editor, model, index)


class _SelectionSync:
    """Row selection <-> document selection (edges or vertices)."""

    def _sync_init(self, document, kind):
        self._doc = document
        self._kind = kind
        self.selectionModel().currentRowChanged.connect(self._on_currentRowChanged)
        document.selectionChanged.connect(self._on_selectionChanged)

    selection_sync = True
    """False while the rows are not the document's edges or vertices (the
    structure's outline in the vertex table)."""

    def _on_currentRowChanged(self, current, _previous):
        if not current.isValid() or not self.selection_sync:
            return
        if self._kind == "edge":
            self._doc.select_edge(current.row())
        else:
            self._doc.select_vertex(current.row())

    def _on_selectionChanged(self):
        if not self.selection_sync:
            return
        row = self._doc.selected_edge if self._kind == "edge" else self._doc.selected_vertex
        sm = self.selectionModel()
        sm.blockSignals(True)
        try:
            if row is None or row >= self.model().rowCount():
                sm.clearSelection()
            else:
                idx = self.model().index(row, 0)
                sm.setCurrentIndex(idx, QItemSelectionModel.SelectionFlag.ClearAndSelect
                                   | QItemSelectionModel.SelectionFlag.Rows)
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
        self.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)

    def paintEvent(self, ev):
        with span("tables"):
            super().paintEvent(ev)


class EdgesTable(QTableView, _SelectionSync):
    def __init__(self, document, parent=None):
        super().__init__(parent)
        self.setModel(EdgesModel(document, self))
        self.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.setAlternatingRowColors(True)
        self.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setStretchLastSection(True)
        self._sync_init(document, "edge")

    def paintEvent(self, ev):
        with span("tables"):
            super().paintEvent(ev)


COORDINATE_WIDTH_TEXT = "-8888.88888888"
"""The widest coordinate the vertex table makes room for: 12 figures, a
sign and a point."""


class VerticesTable(QTableView, _SelectionSync):
    def __init__(self, document, message=None, parent=None):
        super().__init__(parent)
        model = VerticesModel(document, self)
        if message is not None:
            model.errorRaised = message
        self.setModel(model)
        self.setItemDelegate(PartDelegate(document, self))
        self.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectItems)
        self.setSelectionMode(QAbstractItemView.SelectionMode.SingleSelection)
        self.setAlternatingRowColors(True)
        self.verticalHeader().setDefaultSectionSize(22)
        self.horizontalHeader().setStretchLastSection(True)
        # x and z wide enough for a coordinate to 12 figures with its sign
        # (format_entered: a metre file's vertices shown in feet read so).
        width = self.fontMetrics().horizontalAdvance(COORDINATE_WIDTH_TEXT) + 16
        for column in (0, 1):
            self.setColumnWidth(column, max(self.columnWidth(column), width))
        self._sync_init(document, "vertex")

    def paintEvent(self, ev):
        with span("tables"):
            super().paintEvent(ev)


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
        self.target = QComboBox()
        self.target.addItem("Cavity", CAVITY)
        self.target.addItem("Structure", STRUCTURE)
        self.target.setToolTip("Edit the cavity's outline or the structure's outer outline")
        row.addWidget(self.target)
        self.buttons = []
        for action in actions:
            button = QToolButton()
            button.setDefaultAction(action)
            button.setToolButtonStyle(Qt.ToolButtonStyle.ToolButtonTextOnly)
            row.addWidget(button)
            self.buttons.append(button)
        row.addStretch(1)
        lay.addLayout(row)
        lay.addWidget(table, 1)
        self.target.currentIndexChanged.connect(self._on_target_chosen)
        doc = table.model()._doc
        self._doc = doc
        doc.structureChanged.connect(self._on_structureChanged)
        self._on_structureChanged()

    def set_target(self, target):
        """Show the cavity's (``"cavity"``) or the structure's outline."""
        self.target.setCurrentIndex(self.target.findData(target))

    def _on_target_chosen(self, index):
        target = self.target.itemData(index)
        model = self.table.model()
        model.set_target(target)
        # The coordinate list actions are the cavity's.
        for button in self.buttons:
            button.setEnabled(model.target == CAVITY)
        self.table.selection_sync = model.target == CAVITY

    def _on_structureChanged(self):
        has = self._doc.structure is not None
        item = self.target.model().item(self.target.findData(STRUCTURE))
        item.setEnabled(has)
        if not has and self.target.currentData() == STRUCTURE:
            self.set_target(CAVITY)
