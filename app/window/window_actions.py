"""The main window's actions, menus and toolbar (a part of
:class:`~wetline.app.window.main_window.MainWindow`): every command with its
keyboard shortcut and status tip, where it sits in the menus, and the
toolbar's fields (view, snap, units, diagram scale)."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QAction, QActionGroup, QKeySequence
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QLabel,
    QLineEdit,
    QToolBar,
)

from wetline.app.model import editing

__all__ = ["WindowActions"]

REDO_KEYS = ("Ctrl+Y", "Ctrl+Shift+Z")
UNIT_CHOICES = (("si", "m"), ("si", "mm"), ("us", "ft"), ("us", "in"))


class WindowActions:
    """Builds the commands of the main window it is mixed into; the slots
    they call are the window's."""

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
                                  Qt.Key.Key_PageUp)
        a["lower"] = self._action("Lower level", lambda: self.fill_panel.step(-1),
                                  Qt.Key.Key_PageDown)
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

