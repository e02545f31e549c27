"""The main window: the canvas in the middle, liquid and fill on the left,
results on the right, the loads-against-level chart below; menus, toolbar,
files, undo and export."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings, Qt
from PySide6.QtGui import QAction, QActionGroup, QKeySequence
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QDockWidget,
    QInputDialog,
    QLabel,
    QLineEdit,
    QMainWindow,
    QScrollArea,
    QSplitter,
    QTabWidget,
    QToolBar,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing, recovery
from wetline.app.model.display import DisplayChoice
from wetline.app.model.document import UNDO_LIMIT, Document
from wetline.app.window import dialogs
from wetline.app.window.canvas import SectionCanvas
from wetline.app.window.case_list import CaseListPanel
from wetline.app.window.chart import LoadChart
from wetline.app.window.draw_input import DrawInput
from wetline.app.window.files import Transfer
from wetline.app.window.flotation_panel import FlotationPanel
from wetline.app.window.layers_panel import GasPanel
from wetline.app.window.panels import FillPanel, LiquidPanel, TotalsPanel, parse_number
from wetline.app.window.tables import EdgesTable, PartsTable, VerticesPane, VerticesTable
from wetline.app.window.uplift_panel import UpliftPanel
from wetline.core.load_cases import LoadCaseError
from wetline.core.number_input import parse_decimal
from wetline.core.numbers import format_entered, format_number
from wetline.core.results import CAUTION
from wetline.core.section import SectionError
from wetline.core.section_file import SectionFileError, read_design, write_design
from wetline.core.structure import Ground, StructureError

__all__ = ["MainWindow"]

MAX_RECENT = 8
REDO_KEYS = ("Ctrl+Y", "Ctrl+Shift+Z")
UNIT_CHOICES = (("si", "m"), ("si", "mm"), ("us", "ft"), ("us", "in"))


class MainWindow(QMainWindow):
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
        scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        self._dock("Fill and liquid", scroll, Qt.LeftDockWidgetArea)
        self.case_list = CaseListPanel(doc)
        self._dock("Load cases", self.case_list, Qt.LeftDockWidgetArea)

        self.totals = TotalsPanel(doc)
        self.parts_table = PartsTable(doc)
        self.edges_table = EdgesTable(doc)
        self.vertices_table = VerticesTable(doc, message=self._status)
        self.uplift_panel = UpliftPanel(doc)
        self.flotation_panel = FlotationPanel(doc)
        self.transfer = Transfer(self)
        self._build_actions()
        # The uplift check sits under the loads per part it is about.
        parts_page = QSplitter(Qt.Vertical)
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
        uplift_scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        parts_page.addWidget(uplift_scroll)
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
        self._dock("Results", right, Qt.RightDockWidgetArea)
        self.chart = LoadChart(doc)
        self.chart.setMinimumHeight(200)
        self._dock("Loads against level", self.chart, Qt.BottomDockWidgetArea)
        self.resizeDocks([self.findChild(QDockWidget, "Loads against level")], [240],
                         Qt.Vertical)
        self.resizeDocks([self.findChild(QDockWidget, "Fill and liquid"),
                          self.findChild(QDockWidget, "Results")], [300, 450], Qt.Horizontal)
        self.resizeDocks([self.findChild(QDockWidget, "Fill and liquid"),
                          self.findChild(QDockWidget, "Load cases")], [420, 330], Qt.Vertical)

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
        dock.setFeatures(QDockWidget.DockWidgetMovable | QDockWidget.DockWidgetFloatable)
        self.addDockWidget(area, dock)
        return dock

    # ------------------------------------------------------------ actions
    def _action(self, text, slot, shortcut=None, tip=None, checkable=False):
        act = QAction(text, self)
        if shortcut is not None:
            act.setShortcut(QKeySequence(shortcut))
        if tip:
            act.setStatusTip(tip)
            act.setToolTip(tip)
        act.setCheckable(checkable)
        act.triggered.connect(slot)
        self.addAction(act)
        return act

    def _build_actions(self):
        S = QKeySequence.StandardKey
        a = {}
        a["new"] = self._action("&New from template...", self.new_from_template, S.New)
        a["open"] = self._action("&Open...", self.open_dialog, S.Open)
        a["save"] = self._action("&Save", self.save, S.Save)
        a["save_as"] = self._action("Save &as...", self.save_as, S.SaveAs)
        a["export"] = self._action("Diagram &PNG...", self.export_dialog, "Ctrl+E",
                                   "Export the pressure diagram as a PNG for a calc package")
        a["export"].setIconText("Export PNG")
        t = self.transfer
        a["export_pdf"] = self._action(
            "Calculation sheet P&DF...", t.export_pdf, "Ctrl+Shift+E",
            "Write the calculation sheet (inputs, method, results, uplift check, figures)")
        a["export_svg"] = self._action("Diagram &SVG...", t.export_svg, None,
                                       "Export the pressure diagram as a vector drawing")
        a["export_edges_csv"] = self._action(
            "Per-edge results &CSV...", t.export_edges_csv, None,
            "Pressures, forces and centres of pressure of every edge, in the display units")
        a["export_level_csv"] = self._action(
            "&Loads against level CSV...", t.export_level_csv, None,
            "Totals at 51 levels from empty to full, in the display units")
        a["export_dxf"] = self._action(
            "Outline &DXF...", t.export_dxf, None,
            "The outline as a closed polyline, each edge on a layer named after its part")
        a["import_dxf"] = self._action(
            "Outline from &DXF...", t.import_dxf, "Ctrl+I",
            "Replace the outline by a closed polyline of a drawing")
        a["import_csv"] = self._action(
            "Coordinates from CS&V...", t.import_coordinates, None,
            "Replace the outline by a list of x, z (and part) in the display length unit")
        a["import_csv"].setIconText("Import CSV")
        a["report_info"] = self._action(
            "Calculation sheet &header and precision...", self.edit_report_info, None,
            "Project, references, sign-off, revision history and the significant figures of "
            "results, printed on the sheet")
        a["quit"] = self._action("&Quit", self.close, S.Quit)
        a["preferences"] = self._action(
            "Pre&ferences...", self.edit_preferences, None,
            "How often a recovery copy of unsaved changes is written")
        undo = self.doc.undo_stack.createUndoAction(self, "&Undo")
        undo.setShortcut(QKeySequence(S.Undo))
        redo = self.doc.undo_stack.createRedoAction(self, "&Redo")
        # Both common redo keys on every platform (the standard key is only
        # one of them: Ctrl+Y on some desktops, Ctrl+Shift+Z on others).
        redo.setShortcuts([QKeySequence(k) for k in REDO_KEYS])
        # Undo with an invalid outline pending drops that outline first.
        undo.triggered.disconnect()
        undo.triggered.connect(self.undo)
        a["undo"], a["redo"] = undo, redo
        a["delete"] = self._action("&Delete vertex", self.canvas.delete_selected,
                                   QKeySequence.StandardKey.Delete)
        a["paste_coords"] = self._action(
            "&Paste coordinates", t.paste_coordinates, "Ctrl+Shift+V",
            "Replace the outline by x, z (and part) columns copied from a spreadsheet, "
            "in the display length unit")
        a["copy_coords"] = self._action(
            "&Copy coordinates", t.copy_coordinates, "Ctrl+Shift+C",
            "Copy the outline as tab-separated x, z, part for a spreadsheet")
        a["discard"] = self._action("Discard invalid outline",
                                    lambda: editing.discard_draft(self.doc))
        a["draw"] = self._action("Draw &new outline", self._toggle_draw, "Ctrl+D",
                                 "Click the vertices of a new outline", checkable=True)
        a["fit"] = self._action("&Fit view", self.canvas.fit, "F")
        a["raise"] = self._action("Raise level", lambda: self.fill_panel.step(+1),
                                  Qt.Key_PageUp)
        a["lower"] = self._action("Lower level", lambda: self.fill_panel.step(-1),
                                  Qt.Key_PageDown)
        a["width"] = self._action("Set &width...", self._ask_width)
        a["rename"] = self._action("Re&name section...", self._ask_name)
        a["structure"] = self._action(
            "&Structure and ground...", self.edit_structure, None,
            "Walls of a thickness around the cavity, their weight and anchorage, the ground")
        a["envelope"] = self._action(
            "&Envelope of all cases", self._toggle_envelope, "Ctrl+Shift+A",
            "Show the envelope over every load case (design values) instead of this case",
            checkable=True)
        a["plane"] = self._action("&Plane", lambda: self._set_kind("plane"), checkable=True)
        a["axi"] = self._action("&Axisymmetric", lambda: self._set_kind("axisymmetric"),
                                checkable=True)
        group = QActionGroup(self)
        group.addAction(a["plane"])
        group.addAction(a["axi"])
        self.units_group = QActionGroup(self)
        a["units"] = []
        for system, unit in UNIT_CHOICES:
            label = f"{'SI' if system == 'si' else 'US customary'} ({unit})"
            act = self._action(label, lambda _=False, s=system, u=unit: self.set_units(s, u),
                               checkable=True)
            self.units_group.addAction(act)
            a["units"].append(act)
        self.actions_by_name = a

    def _build_menus(self):
        a = self.actions_by_name
        mb = self.menuBar()
        m = mb.addMenu("&File")
        for k in ("new", "open"):
            m.addAction(a[k])
        self.recent_menu = m.addMenu("Open &recent")
        for k in ("save", "save_as"):
            m.addAction(a[k])
        m.addSeparator()
        im = m.addMenu("&Import")
        for k in ("import_dxf", "import_csv"):
            im.addAction(a[k])
        em = m.addMenu("&Export")
        for k in ("export_pdf", "export", "export_svg", "export_edges_csv",
                  "export_level_csv", "export_dxf"):
            em.addAction(a[k])
        self.import_menu, self.export_menu = im, em
        m.addAction(a["report_info"])
        m.addSeparator()
        m.addAction(a["quit"])
        m = mb.addMenu("&Edit")
        m.addAction(a["undo"])
        m.addAction(a["redo"])
        m.addSeparator()
        m.addAction(a["draw"])
        m.addAction(a["delete"])
        m.addAction(a["discard"])
        m.addSeparator()
        m.addAction(a["paste_coords"])
        m.addAction(a["copy_coords"])
        m.addSeparator()
        m.addAction(a["preferences"])
        m = mb.addMenu("&Section")
        m.addAction(a["plane"])
        m.addAction(a["axi"])
        m.addAction(a["width"])
        m.addAction(a["rename"])
        m.addSeparator()
        m.addAction(a["structure"])
        m = mb.addMenu("F&ill")
        m.addAction(a["raise"])
        m.addAction(a["lower"])
        m = mb.addMenu("&View")
        m.addAction(a["fit"])
        m.addAction(a["envelope"])
        um = m.addMenu("&Units")
        for act in a["units"]:
            um.addAction(act)

    def _build_toolbar(self):
        a = self.actions_by_name
        tb = QToolBar("Main")
        tb.setObjectName("Main toolbar")
        tb.setMovable(False)
        self.addToolBar(tb)
        for k in ("new", "open", "save"):
            tb.addAction(a[k])
        tb.addSeparator()
        # Short fixed texts on the toolbar; the Edit menu says what is undone.
        stack = self.doc.undo_stack
        tb_undo = QAction("Undo", self)
        tb_undo.triggered.connect(self.undo)
        tb_redo = QAction("Redo", self)
        tb_redo.triggered.connect(stack.redo)
        stack.canUndoChanged.connect(
            lambda on: tb_undo.setEnabled(on or self.doc.draft is not None))
        stack.canRedoChanged.connect(tb_redo.setEnabled)
        tb_undo.setEnabled(stack.canUndo())
        tb_redo.setEnabled(stack.canRedo())
        self._tb_undo = tb_undo
        tb.addAction(tb_undo)
        tb.addAction(tb_redo)
        tb.addSeparator()
        tb.addAction(a["draw"])
        tb.addAction(a["fit"])
        tb.addSeparator()
        tb.addWidget(QLabel(" Show "))
        self.view_combo = QComboBox()
        self.view_combo.addItem("This case", "case")
        self.view_combo.addItem("Envelope", "envelope")
        self.view_combo.setToolTip("The diagrams, the part table and the chart of the active "
                                   "case, or the envelope over all cases (design values)")
        tb.addWidget(self.view_combo)
        tb.addSeparator()
        self.snap_box = QCheckBox("Snap")
        self.snap_box.setToolTip("Snap vertices to a grid of round numbers of the display unit")
        self.snap_box.setChecked(self.canvas.snap_enabled)
        self.snap_spacing = QLineEdit()
        self.snap_spacing.setMaximumWidth(70)
        self.snap_spacing.setToolTip("Snap grid spacing (display length unit)")
        self.snap_unit = QLabel()
        tb.addWidget(self.snap_box)
        tb.addWidget(self.snap_spacing)
        tb.addWidget(self.snap_unit)
        tb.addSeparator()
        tb.addWidget(QLabel(" Units "))
        self.units_combo = QComboBox()
        for system, unit in UNIT_CHOICES:
            self.units_combo.addItem(f"{'SI' if system == 'si' else 'US'} {unit}",
                                     (system, unit))
        tb.addWidget(self.units_combo)
        tb.addSeparator()
        tb.addWidget(QLabel(" Diagram scale "))
        self.scale_auto = QCheckBox("auto")
        self.scale_edit = QLineEdit()
        self.scale_edit.setMaximumWidth(80)
        self.scale_unit = QLabel()
        tb.addWidget(self.scale_auto)
        tb.addWidget(self.scale_edit)
        tb.addWidget(self.scale_unit)
        tb.addSeparator()
        tb.addAction(a["export"])
        tb.addAction(a["export_pdf"])

        self.snap_box.toggled.connect(self._on_snap_toggled)
        self.snap_spacing.editingFinished.connect(self._on_snap_spacing_edited)
        self.units_combo.currentIndexChanged.connect(self._on_units_combo)
        self.view_combo.currentIndexChanged.connect(self._on_view_combo)
        self.doc.viewModeChanged.connect(self._on_viewModeChanged)
        self.scale_auto.toggled.connect(self._on_scale_edited)
        self.scale_edit.editingFinished.connect(self._on_scale_edited)
        self.doc.diagramScaleChanged.connect(self._on_unitsChanged)
        self._on_unitsChanged()

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
            self._status(f"Invalid outline: {draft.error} - results show the last valid "
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
            dialogs.show_error(self, "Structure", str(exc))
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
            self._status(f"Cannot switch to {kind}: {exc}")
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
            self._status(str(exc))

    def _ask_name(self):
        name, ok = QInputDialog.getText(self, "Name", "Section name:",
                                        text=self.doc.section.name)
        if ok:
            editing.rename(self.doc, name)

    # ------------------------------------------------------------- files
    def maybe_save(self):
        """True if it is fine to drop the current document."""
        if not self.doc.is_modified:
            return True
        answer = dialogs.ask_save_changes(self, self.doc.display_name)
        if answer == "save":
            return self.save()
        return answer == "discard"

    def new_from_template(self):
        if not self.maybe_save():
            return False
        result = dialogs.ask_template(self, self.doc.units)
        if result is None:
            return False
        section, level = result
        editing.replace_section(self.doc, section, level,
                                text=f"New section: {section.name}")
        self.canvas.fit()
        return True

    def last_folder(self):
        """The folder a section file was last opened from or saved to
        (remembered in the settings), or "" if none is known or it is gone."""
        folder = self.settings.value("last_folder", "")
        folder = str(folder) if folder else ""
        return folder if folder and Path(folder).is_dir() else ""

    def _remember_folder(self, path):
        self.settings.setValue("last_folder", str(Path(path).resolve().parent))

    def open_dialog(self):
        if not self.maybe_save():
            return False
        folder = str(Path(self.doc.path).parent) if self.doc.path else self.last_folder()
        path = dialogs.ask_open_path(self, folder)
        return self.open_path(path, ask=False) if path else False

    def open_path(self, path, ask=True):
        """Open a section file; on failure say why and keep the document."""
        if ask and not self.maybe_save():
            return False
        try:
            design = read_design(path)
        except SectionFileError as exc:
            dialogs.show_error(self, "Cannot open the file", str(exc))
            return False
        except Exception as exc:  # an unexpected reader fault must not lose work
            dialogs.show_error(self, "Cannot open the file", f"{path}: {exc}")
            return False
        self.doc.load(design, path)
        self.canvas.fit_when_drawn()
        self._add_recent(path)
        self._remember_folder(path)
        self._status(f"Opened {path}")
        return True

    def save(self):
        if not self.doc.path:
            return self.save_as()
        return self._write(self.doc.path)

    def save_as(self):
        suggested = self.doc.path
        if not suggested:
            stem = (self.doc.section.name.strip() or "section").replace("/", "-")
            folder = self.last_folder()
            suggested = str(Path(folder) / f"{stem}.section.json") if folder \
                else f"{stem}.section.json"
        path = dialogs.ask_save_path(self, suggested)
        return self._write(path) if path else False

    def _write(self, path):
        design = recovery.design_to_save(self.doc.design)
        try:
            write_design(design, path)
        except OSError as exc:
            dialogs.show_error(self, "Cannot save", f"{path}: {exc.strerror or exc}")
            return False
        except ValueError as exc:
            dialogs.show_error(self, "Cannot save", f"{path}: {exc}")
            return False
        self.doc.mark_saved(path)
        self._add_recent(path)
        self._remember_folder(path)
        self._status(f"Saved {path}")
        return True

    def edit_report_info(self):
        """File > Calculation sheet header: one undo step if anything changed."""
        report = dialogs.ask_report_info(self, self.doc.case.report)
        return report is not None and editing.set_report_info(self.doc, report)

    def export_dialog(self):
        if self.transfer.refuse_stale("diagram"):
            return False
        base = Path(self.doc.path).name.split(".")[0] if self.doc.path else "diagram"
        folder = self.transfer._folder()  # beside the file, else the last folder used
        path = dialogs.ask_export_path(self, str(Path(folder) / f"{base}.png") if folder
                                       else f"{base}.png")
        return self.export_to(path) if path else False

    def export_to(self, path, size=None):
        """Write the pressure diagram PNG of the active case with its
        structure (through :mod:`wetline.app.render.png`, as ``wetline export
        --case``); refused while the outline being edited is invalid."""
        if self.transfer.refuse_stale("diagram"):
            return False
        try:
            from wetline.app.render import png
        except ImportError as exc:
            dialogs.show_error(self, "Export", f"PNG export is not available: {exc}")
            return False
        kwargs = {"units": self.doc.units.system}
        if size is not None:
            kwargs["size"] = size
        try:
            self.doc.flush()
            png.export_png(self.doc.design, path, case=self.doc.active_name, **kwargs)
        except Exception as exc:
            dialogs.show_error(self, "Export failed", str(exc))
            return False
        self._status(f"Exported {path}")
        return True

    def _add_recent(self, path):
        path = str(Path(path).resolve())
        recent = [p for p in self._recent() if p != path]
        recent.insert(0, path)
        self.settings.setValue("recent_files", recent[:MAX_RECENT])
        self._refresh_recent()

    def _recent(self):
        value = self.settings.value("recent_files", [])
        if isinstance(value, str):
            value = [value]
        return [str(v) for v in (value or [])]

    def _refresh_recent(self):
        self.recent_menu.clear()
        recent = self._recent()
        for p in recent:
            self.recent_menu.addAction(p, lambda _=False, p=p: self.open_path(p))
        self.recent_menu.setEnabled(bool(recent))

    # ------------------------------------------------ autosave, recovery
    def autosave_interval_s(self):
        """Seconds between recovery copies, from the settings (0: off)."""
        value = self.settings.value("autosave_interval_s", recovery.DEFAULT_INTERVAL_S)
        try:
            value = int(value)
        except (TypeError, ValueError):
            return recovery.DEFAULT_INTERVAL_S
        return value if value >= 0 else recovery.DEFAULT_INTERVAL_S

    def undo_limit(self):
        """Undo steps kept, from the settings."""
        value = self.settings.value("undo_limit", UNDO_LIMIT)
        try:
            value = int(value)
        except (TypeError, ValueError):
            return UNDO_LIMIT
        return value if value >= 1 else UNDO_LIMIT

    def edit_preferences(self):
        """Edit > Preferences: stored in the settings and applied (a new undo
        limit from the next section opened, if there is history now)."""
        values = dialogs.ask_preferences(
            self, {"autosave_interval_s": self.autosave_interval_s(),
                   "undo_limit": self.undo_limit()})
        if values is None:
            return False
        self.settings.setValue("autosave_interval_s", int(values["autosave_interval_s"]))
        self.settings.setValue("undo_limit", int(values["undo_limit"]))
        if self.autosaver is not None:
            self.autosaver.set_interval(self.autosave_interval_s())
        self.doc.set_undo_limit(self.undo_limit())
        return True

    def offer_recovery(self):
        """Offer the recovery copies a crash left (restore, discard, later);
        True if one was restored."""
        if self.autosaver is None:
            return False
        folder = self.autosaver.folder
        copies = recovery.list_copies(folder)
        while copies:
            answer, index = dialogs.ask_recovery(self, copies)
            if answer == "restore":
                return self.restore_recovery(copies[index])
            if answer != "discard":
                break  # later: every copy stays for the next start
            recovery.remove_copy(folder, copies.pop(index).id)
        return False

    def restore_recovery(self, copy):
        """Open a recovery copy as the document: modified, with its original
        file for Save. Once this program has its own copy the old one goes."""
        try:
            design = recovery.read_copy(copy)
        except SectionFileError as exc:
            dialogs.show_error(self, "Cannot restore the recovery copy", str(exc))
            return False
        self.doc.load(design, copy.original_path, saved=False)
        self.canvas._first_fit = True
        if self.autosaver is not None and self.autosaver.write_now() is not None:
            recovery.remove_copy(self.autosaver.folder, copy.id)
        self._status(f"Restored {copy.describe()}: save it to keep it")
        return True

    def closeEvent(self, ev):
        if self.maybe_save():
            self.transfer.shutdown()
            if self.autosaver is not None:
                self.autosaver.close()  # saved or given up: no copy stays
            ev.accept()
        else:
            ev.ignore()
