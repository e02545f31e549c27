"""The main window: the canvas in the middle, liquid and fill on the left,
results on the right, the loads-against-level chart below; menus, toolbar,
files, undo and export."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings, Qt
from PySide6.QtWidgets import (
    QDockWidget,
    QInputDialog,
    QLabel,
    QMainWindow,
    QScrollArea,
    QSplitter,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing, recovery
from wetline.app.model.display import DisplayChoice
from wetline.app.model.document import Document
from wetline.app.window import dialogs
from wetline.app.window.canvas import SectionCanvas
from wetline.app.window.case_list import CaseListPanel
from wetline.app.window.chart import LoadChart
from wetline.app.window.draw_input import DrawInput
from wetline.app.window.file_commands import FileCommands
from wetline.app.window.files import Transfer
from wetline.app.window.flotation_panel import FlotationPanel
from wetline.app.window.layers_panel import GasPanel
from wetline.app.window.panels import FillPanel, LiquidPanel, TotalsPanel, parse_number
from wetline.app.window.tables import EdgesTable, PartsTable, VerticesPane, VerticesTable
from wetline.app.window.uplift_panel import UpliftPanel
from wetline.app.window.window_actions import UNIT_CHOICES, WindowActions
from wetline.core.load_cases import LoadCaseError
from wetline.core.number_input import parse_decimal
from wetline.core.numbers import format_entered, format_number
from wetline.core.results import CAUTION
from wetline.core.section import SectionError
from wetline.core.structure import Ground, StructureError

__all__ = ["MainWindow"]



class MainWindow(WindowActions, FileCommands, QMainWindow):
    """Wetline's main window on one document."""

    def __init__(self, case, path=None, settings=None, saved=None, recovery_folder=None):
        """``recovery_folder``: where recovery copies of unsaved changes go
        (:func:`wetline.app.model.recovery.default_folder` for the program);
        None: no autosave."""
        super().__init__()
        self.settings = settings if settings is not None else QSettings("Wetline", "Wetline")
        self.doc = Document(case, path, parent=self,
                            saved=(path is not None) if saved is None else saved)
        doc = self.doc
        doc.set_undo_limit(self.undo_limit())
        self.setWindowTitle("Wetline")
        self.resize(1500, 940)

        self.canvas = SectionCanvas(doc)
        # A drawn outline replaces the section: unsaved changes are asked about.
        self.canvas.confirm_new_section = self.maybe_save
        central = QWidget()
        lay = QVBoxLayout(central)
        lay.setContentsMargins(0, 0, 0, 0)
        lay.setSpacing(0)
        lay.addWidget(self.canvas, 1)
        self.caution = QLabel(CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setStyleSheet("background: #fff4d6; color: #5a4300; padding: 4px 8px; "
                                   "border-top: 1px solid #e0c878;")
        lay.addWidget(self.caution)
        self.setCentralWidget(central)

        self.liquid_panel = LiquidPanel(doc)
        self.fill_panel = FillPanel(doc)
        left = QWidget()
        ll = QVBoxLayout(left)
        ll.addWidget(self.fill_panel)
        ll.addWidget(self.liquid_panel)
        self.gas_panel = GasPanel(doc)
        ll.addWidget(self.gas_panel)
        ll.addStretch(1)
        scroll = QScrollArea()
        scroll.setWidget(left)
        scroll.setWidgetResizable(True)
        # wide enough for the liquid choices and their source text unclipped
        scroll.setMinimumWidth(left.sizeHint().width() + 24)
        scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self._dock("Fill and liquid", scroll, Qt.DockWidgetArea.LeftDockWidgetArea)
        self.case_list = CaseListPanel(doc)
        self._dock("Load cases", self.case_list, Qt.DockWidgetArea.LeftDockWidgetArea)

        self.totals = TotalsPanel(doc)
        self.parts_table = PartsTable(doc)
        self.edges_table = EdgesTable(doc)
        self.vertices_table = VerticesTable(doc, message=self._status)
        self.uplift_panel = UpliftPanel(doc)
        self.flotation_panel = FlotationPanel(doc)
        self.transfer = Transfer(self)
        self._build_actions()
        # The uplift check sits under the loads per part it is about.
        parts_page = QSplitter(Qt.Orientation.Vertical)
        parts_page.setChildrenCollapsible(False)
        parts_page.addWidget(self.parts_table)
        self.parts_table.setMinimumHeight(118)  # the header and three parts
        checks = QWidget()
        cl = QVBoxLayout(checks)
        cl.setContentsMargins(0, 0, 0, 0)
        cl.addWidget(self.uplift_panel)
        cl.addWidget(self.flotation_panel)
        cl.addStretch(1)
        uplift_scroll = QScrollArea()
        uplift_scroll.setWidget(checks)
        uplift_scroll.setWidgetResizable(True)
        # a dock narrower than the checks scrolls them rather than cutting
        # their right-hand column off
        uplift_scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAsNeeded)
        parts_page.addWidget(uplift_scroll)
        self.uplift_scroll = uplift_scroll
        parts_page.setSizes([125, 400])
        self.parts_page = parts_page
        a = self.actions_by_name
        self.vertices_pane = VerticesPane(
            self.vertices_table, (a["paste_coords"], a["copy_coords"], a["import_csv"]))
        tabs = QTabWidget()
        tabs.addTab(parts_page, "Parts, uplift, flotation")
        tabs.addTab(self.edges_table, "Edges")
        tabs.addTab(self.vertices_pane, "Vertices")
        self.tabs = tabs
        right = QWidget()
        rl = QVBoxLayout(right)
        rl.setContentsMargins(4, 4, 4, 4)
        rl.addWidget(self.totals)
        rl.addWidget(tabs, 1)
        self._dock("Results", right, Qt.DockWidgetArea.RightDockWidgetArea)
        self.chart = LoadChart(doc)
        self.chart.setMinimumHeight(200)
        self._dock("Loads against level", self.chart, Qt.DockWidgetArea.BottomDockWidgetArea)
        self.resizeDocks([self.findChild(QDockWidget, "Loads against level")], [240],
                         Qt.Orientation.Vertical)
        self.resizeDocks([self.findChild(QDockWidget, "Fill and liquid"),
                          self.findChild(QDockWidget, "Results")], [300, 450],
                         Qt.Orientation.Horizontal)
        self.resizeDocks([self.findChild(QDockWidget, "Fill and liquid"),
                          self.findChild(QDockWidget, "Load cases")], [420, 330],
                         Qt.Orientation.Vertical)

        self.hover = QLabel()
        self.statusBar().addWidget(self.hover, 1)
        # While drawing: the next vertex, typed (coordinates, or a length and a way).
        self.draw_input = DrawInput(self.canvas)
        self.statusBar().addPermanentWidget(self.draw_input)
        self._build_menus()
        self._build_toolbar()

        doc.pathChanged.connect(self._on_pathChanged)
        doc.modifiedChanged.connect(self._on_modifiedChanged)
        doc.sectionChanged.connect(self._on_sectionChanged)
        doc.unitsChanged.connect(self._on_unitsChanged)
        doc.draftChanged.connect(self._on_draftChanged)
        self.canvas.hoverText.connect(self.hover.setText)
        self.canvas.message.connect(self._status)
        self.canvas.modeChanged.connect(self._on_modeChanged)
        self._on_pathChanged()
        self._on_modifiedChanged(doc.is_modified)
        self._on_sectionChanged()
        self._refresh_recent()
        self.autosaver = None
        if recovery_folder is not None:
            self.autosaver = recovery.Autosaver(doc, recovery_folder,
                                                self.autosave_interval_s())
            self.autosaver.failed.connect(self._status)

    def _dock(self, title, widget, area):
        dock = QDockWidget(title, self)
        dock.setObjectName(title)
        dock.setWidget(widget)
        dock.setFeatures(QDockWidget.DockWidgetFeature.DockWidgetMovable
                         | QDockWidget.DockWidgetFeature.DockWidgetFloatable)
        self.addDockWidget(area, dock)
        return dock

    # -------------------------------------------------------- document
    def _status(self, text):
        if text:
            self.statusBar().showMessage(text, 8000)
        else:  # a hint that no longer holds (the drawing hint once drawn)
            self.statusBar().clearMessage()

    def _on_pathChanged(self):
        if self.doc.path:
            name = Path(self.doc.path).name
        else:  # no file: Save asks for a name
            section = self.doc.section.name.strip()
            name = f"Untitled ({section})" if section else "Untitled"
        self.setWindowTitle(f"{name}[*] - Wetline")
        self.setWindowFilePath(self.doc.path or "")

    def _on_modifiedChanged(self, modified):
        self.setWindowModified(modified)

    def _on_sectionChanged(self):
        if not self.doc.path:
            self._on_pathChanged()  # the title names the untitled section
        axi = self.doc.section.is_axisymmetric
        self.actions_by_name["axi" if axi else "plane"].setChecked(True)
        self.actions_by_name["width"].setEnabled(not axi)

    def _on_draftChanged(self):
        draft = self.doc.draft
        if hasattr(self, "_tb_undo"):
            self._tb_undo.setEnabled(draft is not None or self.doc.undo_stack.canUndo())
        self.actions_by_name["discard"].setEnabled(draft is not None)
        if draft is not None:
            self._status(f"Invalid outline: {self.doc.units.explain(draft.error)} - results "
                         "show the last valid "
                         "outline; fix it, undo, or discard it")

    def _on_modeChanged(self, mode):
        self.actions_by_name["draw"].setChecked(mode == "draw")

    def _on_unitsChanged(self):
        u = self.doc.units
        i = UNIT_CHOICES.index((u.system, u.length_unit))
        for w in (self.units_combo, self.snap_spacing, self.scale_edit, self.scale_auto):
            w.blockSignals(True)
        self.units_combo.setCurrentIndex(i)
        self.actions_by_name["units"][i].setChecked(True)
        self.snap_spacing.setText(format_entered(self.canvas.snap_grid.step))
        self.snap_unit.setText(u.length_unit + " ")
        p = u.units.label("pressure")
        self.scale_unit.setText(f"{p} per {u.length_unit} ")
        scale = self.doc.diagram_scale
        self.scale_auto.setChecked(scale is None)
        self.scale_edit.setEnabled(scale is not None)
        if scale is not None:
            # scale [m/Pa] -> pressure per display length
            self.scale_edit.setText(format_number(u.pressure(u.length_si(1.0) / scale), 4))
        for w in (self.units_combo, self.snap_spacing, self.scale_edit, self.scale_auto):
            w.blockSignals(False)

    # ---------------------------------------------------------- editing
    def undo(self):
        if self.doc.draft is not None:
            editing.discard_draft(self.doc)
            self._status("Invalid outline discarded")
        else:
            self.doc.undo_stack.undo()

    def set_units(self, system, length_unit):
        editing.set_units(self.doc, DisplayChoice(system, length_unit))

    def _on_units_combo(self, i):
        self.set_units(*self.units_combo.itemData(i))

    def _on_snap_toggled(self, on):
        self.canvas.snap_enabled = on

    def _on_snap_spacing_edited(self):
        try:
            v = parse_decimal(self.snap_spacing.text(), "Snap spacing")
            if not v > 0:
                raise ValueError("Snap spacing must be positive")
        except ValueError as exc:
            self._status(str(exc))
            self.snap_spacing.setText(format_entered(self.canvas.snap_grid.step))
            return
        self.canvas.snap_grid.set_step(v)

    def _on_scale_edited(self, *_):
        u = self.doc.units
        if self.scale_auto.isChecked():
            editing.set_diagram_scale(self.doc, None, "Diagram scale: automatic")
            return
        self.scale_edit.setEnabled(True)
        try:
            v = parse_number(self.scale_edit.text() or "0", "Diagram scale")
            if not v > 0:
                raise ValueError("Diagram scale must be positive")
        except ValueError as exc:
            self._status(str(exc))
            return
        scale = u.length_si(1.0) / u.units.from_display(v, "pressure")
        editing.set_diagram_scale(
            self.doc, scale, f"Diagram scale {format_number(v)} {u.units.label('pressure')} "
                             f"per {u.length_unit}")

    def set_view_mode(self, mode):
        """Show the active case (``"case"``) or the envelope (``"envelope"``)."""
        self.doc.set_view_mode(mode)

    def _on_view_combo(self, i):
        self.set_view_mode(self.view_combo.itemData(i))

    def _toggle_envelope(self, on):
        self.set_view_mode("envelope" if on else "case")

    def _on_viewModeChanged(self):
        mode = self.doc.view_mode
        self.view_combo.blockSignals(True)
        self.view_combo.setCurrentIndex(self.view_combo.findData(mode))
        self.view_combo.blockSignals(False)
        self.actions_by_name["envelope"].setChecked(mode == "envelope")

    def edit_structure(self):
        """Section > Structure and ground: one undo step if anything changed."""
        doc = self.doc
        choice = dialogs.ask_structure(self, doc.units, doc.section, doc.structure, doc.ground)
        if choice is None:
            return False
        return self.apply_structure_choice(choice)

    def apply_structure_choice(self, choice):
        """Turn the Structure dialog's answer (a
        :class:`wetline.app.window.structure_dialog.StructureChoice`) into
        one edit; a refusal is shown and changes nothing."""
        doc = self.doc
        if choice.remove:
            return editing.remove_structure(doc)
        try:
            ground = None if choice.ground is None else Ground(*choice.ground)
            changed = editing.edit_structure(
                doc, choice.walls, unit_weight=choice.unit_weight,
                extra_weight=choice.extra_weight, anchorage=choice.anchorage, ground=ground)
        except ValueError as exc:  # StructureError, LoadCaseError, a value out of range
            dialogs.show_error(self, "Structure", self.doc.units.explain(exc))
            return False
        if changed:
            self.canvas.fit()
        return changed

    def _toggle_draw(self, on):
        self.canvas.set_mode("draw" if on else "edit")
        self.canvas.setFocus()

    def _set_kind(self, kind):
        if kind == self.doc.section.kind:
            return
        try:
            editing.set_kind(self.doc, kind)
        except (SectionError, StructureError, LoadCaseError) as exc:
            self._status(f"Cannot switch to {kind}: {self.doc.units.explain(exc)}")
            self._on_sectionChanged()

    def _ask_width(self):
        u = self.doc.units
        text, ok = QInputDialog.getText(self, "Width", f"Width out of the drawing "
                                        f"[{u.length_unit}]:",
                                        text=format_number(u.length(self.doc.section.width), 6))
        if ok:
            self.set_width_text(text)

    def set_width_text(self, text):
        try:
            editing.set_width(self.doc, self.doc.units.length_si(parse_number(text, "Width")))
        except (ValueError, SectionError) as exc:
            self._status(self.doc.units.explain(exc))

    def _ask_name(self):
        name, ok = QInputDialog.getText(self, "Name", "Section name:",
                                        text=self.doc.section.name)
        if ok:
            editing.rename(self.doc, name)

    def closeEvent(self, ev):
        if self.maybe_save():
            self.transfer.shutdown()
            if self.autosaver is not None:
                self.autosaver.close()  # saved or given up: no copy stays
            ev.accept()
        else:
            ev.ignore()
