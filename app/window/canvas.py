"""The section canvas: the outline by part, the liquid, the pressure
diagrams and resultants, and the vertex editor.

:class:`SectionCanvas` is the widget; it observes the document and redraws
once per burst of changes, from a zero-interval single-shot timer. Its
cooperating pieces:

- :class:`wetline.app.window.outline_layer.OutlineLayer`: the outline by
  part, the mirrored half of an axisymmetric section (drawn as the vessel it
  describes: the real half, x >= 0, is the one edited) with its dash-dot
  centre line, the selection, an invalid outline with its fault;
- :class:`wetline.app.window.load_layer.LoadLayer`: the liquid, the free
  surface, the spill level, the pressure diagrams and the resultants, from
  the same geometry functions as the exported diagram
  (:mod:`wetline.app.render.geometry`);
- :class:`wetline.app.window.structure_layer.StructureLayer`: the structure
  around the cavity (hatched), the ground and groundwater lines, the soil on
  its ledges and the groundwater's pressure diagram outside it;
- :class:`wetline.app.window.canvas_labels.CanvasLabels`: the labels, laid
  out by the one layout engine with bounded work;
- :class:`wetline.app.window.canvas_editing.OutlineEditor` and
  :class:`wetline.app.window.vertex_handles.VertexHandles`: what the mouse
  and keys do to the outline, and a drag does to the structure's outline
  (its own square handles; every edit through
  :mod:`wetline.app.model.editing`).

Two parts are mixed into the widget, each in its own module:
:class:`wetline.app.window.canvas_view.CanvasView` (the view set up, its fit
and the axes in the display unit) and
:class:`wetline.app.window.canvas_pointer.CanvasPointer` (snapping, the text
under the pointer, clicks and keys passed to the editor).
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import QTimer, Signal
from PySide6.QtWidgets import QGraphicsItem

from wetline.app.model.step_timer import span
from wetline.app.render.geometry import auto_scale
from wetline.app.window.canvas_editing import RESERVED_PART_CHOICES, OutlineEditor
from wetline.app.window.canvas_items import SymbolItem
from wetline.app.window.canvas_labels import CanvasLabels
from wetline.app.window.canvas_pointer import CanvasPointer
from wetline.app.window.canvas_view import CanvasView
from wetline.app.window.interface_grips import InterfaceGrips
from wetline.app.window.load_layer import LoadLayer
from wetline.app.window.outline_layer import OutlineLayer
from wetline.app.window.parts_proposal import PartsProposal
from wetline.app.window.snap import SnapGrid
from wetline.app.window.structure_layer import StructureLayer
from wetline.app.window.vertex_handles import MAX_HANDLES, VertexHandles

__all__ = ["SectionCanvas", "RESERVED_PART_CHOICES"]


class SectionCanvas(CanvasView, CanvasPointer, pg.PlotWidget):
    """The section drawing with its loads, and the outline editor."""

    hoverText = Signal(str)
    """Text for the status bar: x, z, depth and pressure under the mouse."""
    message = Signal(str)
    """A short message for the status bar (an edit that was refused ...)."""
    modeChanged = Signal(str)
    typedStart = Signal(str)
    """A number key typed on the canvas while drawing: the typed-vertex
    field (:class:`wetline.app.window.draw_input.DrawInput`) takes it."""

    def __init__(self, document, parent=None):
        super().__init__(parent, background="w")
        self._doc = document
        self._mode = "edit"
        u = document.units
        self.snap_grid = SnapGrid(u.length_unit, float(u.length_si(1.0)))
        """Where points made with the mouse land (on by default, a round
        number of the display unit)."""
        self._solution = None
        self.pointer = None
        """Where the pointer last was over the view (x, z) [m], or None."""
        self._first_fit = True
        self._outline_dirty = True
        self.confirm_new_section = lambda: True
        """Asked before a drawn outline replaces the section (the window
        asks about unsaved changes); False keeps the drawing going."""
        self._set_up_view()
        vb = self.getPlotItem().getViewBox()
        self.load_layer = LoadLayer(vb)
        self.structure_layer = StructureLayer(vb)
        self.outline_layer = OutlineLayer(self.getPlotItem())
        self.labels = CanvasLabels(vb, self)
        self.labels.view_obstacles = self._legend_box
        self.labels.more_handles = self._structure_vertices
        self.editor = OutlineEditor(self, document)
        self.handles = VertexHandles(self.editor.pick_vertex)
        self.proposal = PartsProposal(self, document)
        """The parts proposed for an outline just drawn, with one click to change."""
        vb.addItem(self.handles)
        # The structure's vertices: square, grey, under the cavity's handles.
        self.structure_handles = VertexHandles(self.editor.pick_structure_vertex)
        self.structure_handles.setSymbol("s")
        self.structure_handles.setSize(8)
        self.structure_handles.setBrush(pg.mkBrush("#d5dae0"))
        self.structure_handles.setPen(pg.mkPen("#4a525c", width=1.2))
        self.structure_handles.setZValue(39)
        vb.addItem(self.structure_handles)
        self.interface_grips = InterfaceGrips()
        """The layer interfaces, draggable (the editor moves them)."""
        vb.addItem(self.interface_grips)
        self._redraw_timer = QTimer(self)
        self._redraw_timer.setSingleShot(True)
        self._redraw_timer.setInterval(0)
        self._redraw_timer.timeout.connect(self.redraw)
        self._connect(document)
        self._apply_units()
        self.schedule(outline=True)

    def _connect(self, document):
        document.sectionChanged.connect(self._on_sectionChanged)
        document.draftChanged.connect(self._on_draftChanged)
        document.previewChanged.connect(self._on_previewChanged)
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.diagramScaleChanged.connect(self._on_diagramScaleChanged)
        document.selectionChanged.connect(self._on_selectionChanged)
        document.structureChanged.connect(self._on_structureChanged)
        document.envelopeReady.connect(self._on_envelopeReady)
        document.viewModeChanged.connect(self._on_viewModeChanged)
        self.handles.dragStarted.connect(self.editor.on_drag_started)
        self.handles.dragMoved.connect(self.editor.on_drag_moved)
        self.handles.dragFinished.connect(self.editor.on_drag_finished)
        self.structure_handles.dragMoved.connect(self.editor.on_structure_drag_moved)
        self.structure_handles.dragFinished.connect(self.editor.on_structure_drag_finished)
        self.interface_grips.dragStarted.connect(self.editor.on_interface_drag_started)
        self.interface_grips.dragMoved.connect(self.editor.on_interface_drag_moved)
        self.interface_grips.dragFinished.connect(self.editor.on_interface_drag_finished)
        self.scene().sigMouseMoved.connect(self._on_mouseMoved)
        self.scene().sigMouseClicked.connect(self._on_mouseClicked)

    # ----------------------------------------------------------- state
    @property
    def mirrored(self):
        """True if the mirrored half of an axisymmetric section is drawn."""
        return self.outline_layer.mirrored

    @property
    def mode(self):
        return self._mode

    @property
    def display_units(self):
        """The document's display units (:class:`wetline.app.model.display.DisplayChoice`)."""
        return self._doc.units

    def set_mode(self, mode):
        """``"edit"`` (drag, select, insert) or ``"draw"`` (click a new outline)."""
        if mode not in ("edit", "draw"):
            raise ValueError(mode)
        if mode != self._mode:
            self._mode = mode
            self.editor.clear_drawing()
            if mode == "draw":
                self.proposal.hide()
            self.modeChanged.emit(mode)
            self.message.emit("Click the vertices of the new outline, or type each in the "
                              "Next vertex field; double-click or Enter closes it, Esc "
                              "cancels" if mode == "draw" else "")

    def schedule(self, outline=False):
        """Redraw at the next event-loop turn (the outline too, if asked)."""
        self._outline_dirty = self._outline_dirty or outline
        self._redraw_timer.start()

    # ------------------------------------------------------- document
    def _on_sectionChanged(self):
        self.schedule(outline=True)

    def _on_draftChanged(self):
        self.schedule(outline=True)

    def _on_previewChanged(self):
        preview = self._doc.preview
        if preview is not None and preview.error is not None:
            self.message.emit(f"Invalid outline: {self._doc.units.explain(preview.error)}")
        self.schedule(outline=True)

    def _on_solved(self, solution):
        self._solution = solution
        self.schedule()

    def _on_unitsChanged(self):
        self._apply_units()
        self.schedule()

    def _on_diagramScaleChanged(self):
        self.schedule()

    def _on_selectionChanged(self):
        self._draw_selection()

    def _on_structureChanged(self):
        self.schedule(outline=True)

    def _on_envelopeReady(self, _envelope):
        if self._doc.view_mode == "envelope":
            self.schedule()

    def _on_viewModeChanged(self):
        self.schedule()

    # --------------------------------------------------------- drawing
    def paintEvent(self, ev):
        with span("canvas paint"):
            super().paintEvent(ev)

    def redraw(self):
        """Draw everything pending now."""
        with span("canvas layers"):
            self._redraw()

    def _redraw(self):
        self._redraw_timer.stop()
        if self._outline_dirty:
            self._outline_dirty = False
            outline, parts = self._doc.working_outline()
            self.outline_layer.draw(outline, parts, self._doc.section.is_axisymmetric)
            live = self._doc.preview is not None  # a drag under way
            if len(outline) <= MAX_HANDLES:
                self.handles.set_positions(outline, live)
                self.handles.show()
            else:
                self.handles.setData(pos=np.empty((0, 2)))
                self.handles.hide()
            structure = self._doc.working_structure_outline()
            if structure is not None and len(structure[0]) <= MAX_HANDLES:
                self.structure_handles.set_positions(structure[0], live)
                self.structure_handles.show()
            else:
                self.structure_handles.setData(pos=np.empty((0, 2)))
                self.structure_handles.hide()
            self.outline_layer.draw_fault(self._doc.fault(), self._doc.units.explain)
            self._draw_selection()
            self._cache_still_items()
        solution = self._solution
        if solution is not None:
            doc = self._doc
            design = doc.shown_design
            if design.section is not solution.section:
                design = doc.design  # results of the last valid outline (a fault shown)
            solved = doc.solved_case
            loads = solved.structure if solved is not None and \
                solved.solution is solution else None
            cases = doc.envelope_cases
            envelope = (doc.view_mode == "envelope" and bool(cases)
                        and cases[0].solution.section is solution.section)
            if envelope:
                loads = None  # outside loads belong to one case: none in the envelope
            scale = doc.diagram_scale
            if scale is None:
                pmax = solution.max_pressure
                if envelope:
                    pmax = float(doc.envelope.edge_max_pressure.max(initial=0.0))
                pmax = max(pmax, self.structure_layer.max_pressure(design, loads))
                shape = solution.section if design.structure is None \
                    else design.structure.section(design.section)
                scale = auto_scale(shape, pmax)
            scope = doc.force_scope(solution.section)
            if envelope:
                self.load_layer.draw_envelope(cases, scale, doc.units, self.labels)
            else:
                self.load_layer.draw(solution, scale, scope, doc.units, self.labels)
            layer = self.load_layer
            self.interface_grips.set_interfaces(layer.interface_levels, layer.interface_spans,
                                                mirror=solution.section.is_axisymmetric)
            self.structure_layer.draw(design, loads, scale, scope, doc.units, self.labels,
                                      self._line_span(design))
            self.labels.lay_out()
            # Fit once the results drawn are the section's: a new section's
            # outline may be drawn before its results come.
            if self._first_fit and solution.section is doc.shown_design.section:
                self._first_fit = False
                self.fit()

    def _cache_still_items(self):
        """Keep a pixmap of each item that a fill step leaves as it is (the
        outline by part, the structure, the grid, the handles): a repaint
        over them (the liquid and its diagrams change under them at every
        step) copies the pixmap instead of drawing them again. Qt draws an
        item again when it changes, and when the view zooms. While a vertex
        is dragged, the handles keep the pixmap the drag found them in: the
        dragged handle is drawn on its own over them
        (:meth:`VertexHandles.set_positions`); the outline's runs of parts
        the drag leaves as they are keep theirs."""
        items = [self._grid, self.structure_handles]
        for layer in (self.outline_layer, self.structure_layer):
            for value in vars(layer).values():
                values = value.values() if isinstance(value, dict) else (
                    value if isinstance(value, list | tuple) else (value,))
                # (A symbol item is a few pixels, drawn afresh.)
                items += [v for v in values
                          if isinstance(v, QGraphicsItem) and not isinstance(v, SymbolItem)]
        mode = QGraphicsItem.CacheMode.DeviceCoordinateCache
        for item in [*items, self.handles]:
            if item.cacheMode() != mode:
                item.setCacheMode(mode)

    def _structure_vertices(self):
        """The structure's vertex handles [m] (none without a structure)."""
        structure = self._doc.structure
        return np.empty((0, 2)) if structure is None else structure.outline

    def _legend_box(self):
        """The part legend's box in view coordinates [m] (labels keep off it)."""
        legend = self.outline_layer.legend
        if legend is None or not legend.isVisible():
            return ()
        vb = self.getPlotItem().getViewBox()
        r = vb.mapSceneToView(legend.sceneBoundingRect()).boundingRect()
        return ((r.left(), r.top(), r.right(), r.bottom()),)

    @staticmethod
    def _line_span(design):
        """(x0, x1) [m] the ground and groundwater lines run across: the
        structure (both halves of an axisymmetric one) and a margin."""
        pts = design.section.outline if design.structure is None else design.structure.outline
        x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
        if design.section.is_axisymmetric:
            x0 = min(x0, -x1)
        margin = 0.25 * max(x1 - x0, float(np.ptp(pts[:, 1])), 1e-9)
        return x0 - margin, x1 + margin

    def _draw_selection(self):
        outline, _ = self._doc.working_outline()
        self.outline_layer.draw_selection(outline, self._doc.selected_edge,
                                          self._doc.selected_vertex)

    def shown_labels(self):
        """Text of the labels on the canvas, in the order placed."""
        return self.labels.shown()

    def label_boxes(self):
        """Pixel boxes (x0, y0, x1, y1, y up) of the placed labels' text."""
        return self.labels.boxes()

    # -------------------------------------------- editing (the editor's)
    def pick_edge(self, x, z, tolerance_px=6):
        """Index of the edge within ``tolerance_px`` pixels of (x, z), or None."""
        return self.editor.pick_edge(x, z, tolerance_px)

    def nudge_selected(self, dx, dz):
        """Move the selected vertex by (dx, dz) [m] (merged nudges)."""
        return self.editor.nudge_selected(dx, dz)

    def delete_selected(self):
        """Delete the selected vertex."""
        return self.editor.delete_selected()

    def insert_on_edge(self, edge, x, z):
        """Insert a vertex on ``edge`` at the point nearest (x, z) [m]."""
        self.editor.insert_on_edge(edge, x, z)

    def set_part(self, edge, name):
        """Give ``edge`` the part ``name``."""
        self.editor.set_part(edge, name)

    def add_drawn_point(self, x, z):
        """Add a vertex to the outline being drawn (as a click would)."""
        self.editor.draw_click(x, z)

    def finish_drawing(self):
        """Close the outline being drawn and make it the section (or a draft)."""
        return self.editor.finish_drawing()

    def cancel_drawing(self):
        """Drop the outline being drawn."""
        self.editor.cancel_drawing()
