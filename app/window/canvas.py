"""The section canvas: the outline by part, the liquid, the pressure
diagrams and resultants, and the vertex editor.

Drawing is batched (see STACK-NOTES): one path for the liquid, one for all
pressure diagrams, one ``connect='pairs'`` curve for all pressure arrows,
one curve per part for the edges, a small pool of text labels. A burst of
changes redraws once, from a zero-interval single-shot timer.

Editing (mode "edit"): drag a vertex (the document previews the dragged
outline, so the totals, tables and chart follow it live; one undo step on
release), double-click an edge to insert a vertex there, Delete removes the
selected vertex, arrow keys nudge it by the snap spacing, right-click an edge
to set its part. Mode "draw": click vertices of a new outline; double-click,
Enter or a click on the first vertex closes it, Esc cancels.

An axisymmetric section is drawn as the vessel it describes: the real half
(x >= 0, the one edited) and, faintly, its mirror image x -> -x, with the
axis as a dash-dot centre line.

The liquid, free surface, diagrams, resultants and the places of the
pressure values come from :mod:`wetline.app.render.geometry`, the same
functions the exported diagram draws from, in the same part colours
(:func:`wetline.app.render.style.part_colours`). Labels are laid out by the
one layout engine, :class:`wetline.app.render.labels.LabelLayout`: the most
important first (resultants, largest first; the free surface; pressure
values, deepest first); a label that would cover another, an arrow or a
vertex handle is moved (if it must show) or left out. Its work per label is
bounded, however far a vertex is dragged.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
import shapely
from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtGui import QBrush, QColor, QFont, QFontMetricsF, QPainterPath, QPen, QTransform
from PySide6.QtWidgets import QGraphicsPathItem, QInputDialog, QMenu

from wetline.app.model import editing
from wetline.app.render.geometry import (
    arrow_strokes,
    auto_scale,
    carrying_edges,
    diagram_polygons,
    liquid_rings,
    part_runs,
    pressure_arrows,
    pressure_sites,
    run_resultants,
    surface_spans,
    wetted_edges,
)
from wetline.app.render.labels import LabelLayout
from wetline.app.render.style import (
    DIAGRAM_FILL,
    DIAGRAM_LINE,
    DIAGRAM_TEXT,
    LOAD,
    SURFACE,
    UPLIFT,
    part_colours,
)
from wetline.app.window.grid import LightGrid
from wetline.core.section import AXIS, FLOOR, OPEN

__all__ = ["SectionCanvas", "VertexHandles", "RESERVED_PART_CHOICES"]

RESERVED_PART_CHOICES = ("wall", FLOOR, OPEN, "lid", AXIS)
"""Part names offered first when assigning a part to an edge."""

LIQUID_BRUSH = QColor(126, 178, 226, 95)
SURFACE_COLOUR = SURFACE
DIAGRAM_BRUSH = QColor(*DIAGRAM_FILL[:3], 80)
DIAGRAM_PEN = QColor(DIAGRAM_LINE)
ARROW_COLOUR = DIAGRAM_LINE
DOWN_COLOUR = LOAD
UPLIFT_COLOUR = UPLIFT
PRESSURE_TEXT = DIAGRAM_TEXT
HIGHLIGHT_COLOUR = "#f2b705"
FAULT_COLOUR = "#d00000"
MAX_HANDLES = 3000
"""Above this many vertices the handles are hidden (edit in the table)."""
MAX_PRESSURE_LABELS = 16
MAX_RESULTANT_LABELS = 30
MIRROR_COLOUR = QColor(52, 80, 110, 90)
"""Pen of the mirrored half of an axisymmetric section."""
MIRROR_LIQUID_BRUSH = QColor(126, 178, 226, 45)
CENTRE_LINE_COLOUR = "#5a6b7d"
MAX_HANDLE_OBSTACLES = 120
"""Up to this many vertices, labels keep off the vertex handles."""
LABEL_MARGIN = 4.0
"""The text item's document margin around its text [px]."""
LABEL_FILL = pg.mkBrush(255, 255, 255, 170)
"""Behind each label, so lines under it do not cross its text."""
SAME_VALUE_PX = 150.0
"""A pressure value already labelled this near [px] is not labelled again."""
SHAFT_CLEARANCE = 4.0
"""Labels keep this far [px] off a resultant's shaft."""


def _cosmetic_pen(colour, width=1.0, style=Qt.SolidLine):
    pen = QPen(QColor(colour))
    pen.setWidthF(width)
    pen.setCosmetic(True)
    pen.setStyle(style)
    return pen


def _path(x, z, connect):
    if len(x) == 0:
        return QPainterPath()
    return pg.arrayToQPath(np.asarray(x, float), np.asarray(z, float), connect=connect,
                           finiteCheck=False)


def _rings_path(rings):
    """One odd-even path of closed rings ((N, 2) arrays [m])."""
    if not rings:
        return QPainterPath()
    connect = []
    for ring in rings:
        c = np.ones(len(ring), dtype=bool)
        c[-1] = False
        connect.append(c)
    pts = np.concatenate(rings)
    return _path(pts[:, 0], pts[:, 1], np.concatenate(connect))


def _segments(outline, edges):
    """x, z point pairs of the given edges for a ``connect='pairs'`` curve."""
    n = len(outline)
    a = outline[edges]
    b = outline[(np.asarray(edges) + 1) % n]
    xy = np.empty((len(edges) * 2, 2))
    xy[0::2] = a
    xy[1::2] = b
    return xy[:, 0], xy[:, 1]


class VertexHandles(pg.ScatterPlotItem):
    """Draggable vertex handles (the CustomGraphItem pattern: the item
    handles its own drags, so the view pans when no vertex is grabbed).

    Signals carry vertex indices and positions in data coordinates [m].
    """

    dragStarted = Signal(int)
    dragMoved = Signal(int, float, float)
    dragFinished = Signal(int, float, float)

    def __init__(self, pick):
        super().__init__(size=9, pen=pg.mkPen("#203040", width=1.2),
                         brush=pg.mkBrush("#ffffff"), pxMode=True)
        self._pick = pick
        self._dragging = None
        self.setZValue(40)

    def mouseDragEvent(self, ev):
        if ev.button() != Qt.LeftButton:
            ev.ignore()
            return
        if ev.isStart():
            pos = ev.buttonDownPos()
            i = self._pick(pos.x(), pos.y())
            if i is None:
                ev.ignore()
                return
            self._dragging = i
            self.dragStarted.emit(i)
        elif self._dragging is None:
            ev.ignore()
            return
        ev.accept()
        p = ev.pos()
        if ev.isFinish():
            i, self._dragging = self._dragging, None
            self.dragFinished.emit(i, p.x(), p.y())
        else:
            self.dragMoved.emit(self._dragging, p.x(), p.y())

    def cancel_drag(self):
        self._dragging = None

    def set_positions(self, pos):
        """Show handles at ``pos`` ((N, 2) [m]). When only a few moved (a
        drag), they are moved in place: rebuilding a few thousand spots
        costs milliseconds a frame."""
        pos = np.asarray(pos, dtype=np.float64)
        data = self.data
        if len(data) == len(pos) and len(pos) > 0:
            moved = np.flatnonzero((data["x"] != pos[:, 0]) | (data["y"] != pos[:, 1]))
            if moved.size == 0:
                return
            if moved.size <= 8:
                data["x"][moved] = pos[moved, 0]
                data["y"][moved] = pos[moved, 1]
                self.prepareGeometryChange()
                self.informViewBoundsChanged()
                self.bounds = [None, None]
                self.invalidate()
                return
        self.setData(pos=pos)


class SectionCanvas(pg.PlotWidget):
    """The section drawing with its loads, and the outline editor."""

    hoverText = Signal(str)
    """Text for the status bar: x, z, depth and pressure under the mouse."""
    message = Signal(str)
    """A short message for the status bar (an edit that was refused ...)."""
    modeChanged = Signal(str)

    def __init__(self, document, parent=None):
        super().__init__(parent, background="w")
        self._doc = document
        self._mode = "edit"
        self.snap_enabled = False
        self.snap_spacing = 0.1
        """Snap grid spacing [m]."""
        self._drawn = []
        self._polygon = None
        self._runs = None
        self._solution = None

        plot = self.getPlotItem()
        plot.setAspectLocked(True)
        self._grid = LightGrid(plot.getViewBox())
        plot.setMenuEnabled(False)
        plot.hideButtons()
        self.setMouseTracking(True)
        self.setFocusPolicy(Qt.StrongFocus)
        vb = plot.getViewBox()
        self._vb = vb

        self._liquid = QGraphicsPathItem()
        self._liquid.setBrush(QBrush(LIQUID_BRUSH))
        self._liquid.setPen(QPen(Qt.NoPen))
        self._liquid.setZValue(-10)
        vb.addItem(self._liquid)
        self._diagram = QGraphicsPathItem()
        self._diagram.setBrush(QBrush(DIAGRAM_BRUSH))
        self._diagram.setPen(_cosmetic_pen(DIAGRAM_PEN, 1.0))
        self._diagram.setZValue(-5)
        vb.addItem(self._diagram)
        self._arrows = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True,
                                        pen=pg.mkPen(ARROW_COLOUR, width=1))
        self._arrows.setZValue(-4)
        vb.addItem(self._arrows)
        self._surface = pg.PlotCurveItem(pen=pg.mkPen(SURFACE_COLOUR, width=2))
        self._surface.setZValue(5)
        vb.addItem(self._surface)
        self._spill = pg.PlotCurveItem(pen=pg.mkPen("#5a6b7d", width=1, style=Qt.DashLine))
        vb.addItem(self._spill)
        self._down = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True,
                                      pen=pg.mkPen(DOWN_COLOUR, width=3))
        self._up = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True,
                                    pen=pg.mkPen(UPLIFT_COLOUR, width=3))
        for item in (self._down, self._up):
            item.setZValue(30)
            vb.addItem(item)
        self._highlight = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True,
                                           pen=pg.mkPen(HIGHLIGHT_COLOUR, width=7))
        self._highlight.setZValue(8)
        vb.addItem(self._highlight)
        self._draft_curve = pg.PlotCurveItem(pen=pg.mkPen(FAULT_COLOUR, width=2,
                                                          style=Qt.DashLine))
        self._draft_curve.setZValue(20)
        vb.addItem(self._draft_curve)
        self._fault = pg.ScatterPlotItem(size=16, symbol="x", pen=pg.mkPen(FAULT_COLOUR, width=2),
                                         brush=pg.mkBrush(FAULT_COLOUR))
        self._fault.setZValue(50)
        vb.addItem(self._fault)
        self._fault_text = pg.TextItem(color=FAULT_COLOUR, anchor=(0, 1),
                                       fill=pg.mkBrush(255, 255, 255, 220))
        self._fault_text.setZValue(60)
        self._fault_text.hide()
        vb.addItem(self._fault_text)
        # The mirrored half of an axisymmetric section (drawn, never edited).
        self._mirror = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True,
                                        pen=_cosmetic_pen(MIRROR_COLOUR, 2.0))
        self._mirror.setZValue(9)
        vb.addItem(self._mirror)
        self._mirror_liquid = QGraphicsPathItem()
        self._mirror_liquid.setBrush(QBrush(MIRROR_LIQUID_BRUSH))
        self._mirror_liquid.setPen(QPen(Qt.NoPen))
        self._mirror_liquid.setZValue(-11)
        vb.addItem(self._mirror_liquid)
        self._centre_line = pg.PlotCurveItem(pen=pg.mkPen(CENTRE_LINE_COLOUR, width=1,
                                                          style=Qt.DashDotLine))
        self._centre_line.setZValue(11)
        vb.addItem(self._centre_line)
        for item in (self._mirror, self._mirror_liquid, self._centre_line):
            item.setVisible(False)
        self._sketch = pg.PlotCurveItem(pen=pg.mkPen("#1a1a1a", width=1.5, style=Qt.DashLine),
                                        symbol=None)
        self._sketch.setZValue(45)
        vb.addItem(self._sketch)
        self.handles = VertexHandles(self._pick_vertex)
        vb.addItem(self.handles)
        self._selected = pg.ScatterPlotItem(size=13, pen=pg.mkPen("#000000", width=2),
                                            brush=pg.mkBrush(HIGHLIGHT_COLOUR))
        self._selected.setZValue(41)
        vb.addItem(self._selected)
        self._part_curves = {}
        self._legend = plot.addLegend(offset=(10, 10), labelTextSize="9pt")
        self._labels = []
        self._labels_used = 0
        self._label_requests = []
        self._arrow_shafts = []
        self._label_outline = np.empty((0, 2))
        self._layout = LabelLayout()
        self._px = (1e-9, 1e-9)
        self._text_sizes = {}
        self._fonts = None
        self._label_timer = QTimer(self)
        self._label_timer.setSingleShot(True)
        self._label_timer.setInterval(0)
        self._label_timer.timeout.connect(self.layout_labels)
        # Labels are laid out in pixels: again when the view zooms or pans.
        vb.sigRangeChanged.connect(self._on_rangeChanged)

        self._redraw_timer = QTimer(self)
        self._redraw_timer.setSingleShot(True)
        self._redraw_timer.setInterval(0)
        self._redraw_timer.timeout.connect(self.redraw)
        self._outline_dirty = True

        document.sectionChanged.connect(self._on_sectionChanged)
        document.draftChanged.connect(self._on_draftChanged)
        document.previewChanged.connect(self._on_previewChanged)
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.diagramScaleChanged.connect(self._on_diagramScaleChanged)
        document.selectionChanged.connect(self._on_selectionChanged)
        self.handles.dragStarted.connect(self._on_dragStarted)
        self.handles.dragMoved.connect(self._on_dragMoved)
        self.handles.dragFinished.connect(self._on_dragFinished)
        self.scene().sigMouseMoved.connect(self._on_mouseMoved)
        self.scene().sigMouseClicked.connect(self._on_mouseClicked)
        self._first_fit = True
        self._schedule(outline=True)

    # ----------------------------------------------------------- state
    @property
    def _preview(self):
        """The document's preview of the outline being dragged, or None."""
        return self._doc.preview

    @property
    def mirrored(self):
        """True if the mirrored half of an axisymmetric section is drawn."""
        return self._mirror.isVisible()

    @property
    def mode(self):
        return self._mode

    def set_mode(self, mode):
        if mode not in ("edit", "draw"):
            raise ValueError(mode)
        if mode != self._mode:
            self._mode = mode
            self._drawn = []
            self._sketch.setData([], [])
            self.modeChanged.emit(mode)
            self.message.emit("Click the vertices of the new outline; double-click or Enter "
                              "closes it, Esc cancels" if mode == "draw" else "")

    def fit(self):
        """Show the whole section with its diagrams and resultants."""
        outline, _ = self._doc.working_outline()
        x0, z0 = outline.min(axis=0)
        x1, z1 = outline.max(axis=0)
        if self._doc.section.is_axisymmetric:
            x0 = min(x0, -x1)
        for item in (self._diagram, self._down, self._up):
            r = item.mapRectToView(item.boundingRect()) if hasattr(item, "mapRectToView") \
                else item.boundingRect()
            if r.width() > 0 or r.height() > 0:
                x0, x1 = min(x0, r.left()), max(x1, r.right())
                z0, z1 = min(z0, r.top()), max(z1, r.bottom())
        pad = 0.08 * max(x1 - x0, z1 - z0, 1e-9)
        self._vb.setRange(xRange=(x0 - pad, x1 + pad), yRange=(z0 - pad, z1 + pad), padding=0)

    def snap(self, x, z):
        if self.snap_enabled and self.snap_spacing > 0:
            s = self.snap_spacing
            return round(x / s) * s, round(z / s) * s
        return x, z

    def _schedule(self, outline=False):
        self._outline_dirty = self._outline_dirty or outline
        self._redraw_timer.start()

    # ------------------------------------------------------- document
    def _on_sectionChanged(self):
        self._parts_key = None
        self._polygon = None
        self._schedule(outline=True)

    def _on_draftChanged(self):
        self._schedule(outline=True)

    def _on_previewChanged(self):
        preview = self._doc.preview
        if preview is not None and preview.error is not None:
            self.message.emit(f"Invalid outline: {preview.error}")
        self._schedule(outline=True)

    def _on_solved(self, solution):
        self._solution = solution
        self._schedule()

    def _on_unitsChanged(self):
        self._schedule()

    def _on_diagramScaleChanged(self):
        self._schedule()

    def _on_selectionChanged(self):
        self._draw_selection()

    # --------------------------------------------------------- drawing
    def redraw(self):
        """Draw everything pending now."""
        self._redraw_timer.stop()
        if self._outline_dirty:
            self._outline_dirty = False
            self._draw_outline()
            self._draw_draft()
            self._draw_selection()
        solution = self._solution
        if solution is not None:
            self._draw_results(solution)
            if self._first_fit:
                self._first_fit = False
                self.fit()

    def _draw_outline(self, outline=None, parts=None):
        if outline is None:
            outline, parts = self._doc.working_outline()
        names = tuple(dict.fromkeys(parts))
        colours = part_colours(names)
        parts_arr = np.array(parts, dtype=object)
        for name in list(self._part_curves):
            if name not in names:
                curve = self._part_curves.pop(name)
                self._legend.removeItem(curve)
                self.getPlotItem().removeItem(curve)
        for name in names:
            edges = np.flatnonzero(parts_arr == name)
            x, z = _segments(outline, edges)
            curve = self._part_curves.get(name)
            colour = colours[name]
            style = (Qt.DashLine if name == OPEN else Qt.DashDotLine if name == AXIS
                     else Qt.SolidLine)
            width = 1.5 if name in (OPEN, AXIS) else 3
            if curve is None:
                curve = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True, name=name)
                curve.setZValue(10)
                self.getPlotItem().addItem(curve)
                self._part_curves[name] = curve
            curve.setPen(pg.mkPen(colour, width=width, style=style))
            curve.setData(x, z)
        self._draw_mirror(outline, parts_arr)
        if len(outline) <= MAX_HANDLES:
            self.handles.set_positions(outline)
            self.handles.show()
        else:
            self.handles.setData(pos=np.empty((0, 2)))
            self.handles.hide()

    def _draw_mirror(self, outline, parts_arr):
        """The other half of an axisymmetric section, faintly (x -> -x), and
        the axis as a centre line; hidden for plane sections."""
        if not self._doc.section.is_axisymmetric:
            for item in (self._mirror, self._mirror_liquid, self._centre_line):
                if item.isVisible():
                    item.setVisible(False)
            return
        edges = np.flatnonzero((parts_arr != AXIS) & (parts_arr != OPEN))
        x, z = _segments(outline, edges)
        self._mirror.setData(-x, z)
        z0, z1 = float(outline[:, 1].min()), float(outline[:, 1].max())
        over = 0.06 * max(z1 - z0, float(np.ptp(outline[:, 0])), 1e-9)
        self._centre_line.setData([0.0, 0.0], [z0 - over, z1 + over])
        for item in (self._mirror, self._mirror_liquid, self._centre_line):
            if not item.isVisible():
                item.setVisible(True)

    def _draw_draft(self):
        fault = self._doc.fault()
        if fault is None:
            self._draft_curve.setData([], [])
            self._fault.setData([], [])
            self._fault_text.hide()
            return
        outline, error = fault
        pts = np.vstack([outline, outline[:1]])
        self._draft_curve.setData(pts[:, 0], pts[:, 1])
        where = self._fault_location(outline, error)
        self._fault.setData([where[0]], [where[1]])
        self._fault_text.setText(str(error))
        self._fault_text.setPos(where[0], where[1])
        self._fault_text.show()

    @staticmethod
    def _fault_location(outline, error):
        err = error
        pts = outline
        if err.location is not None:
            return err.location
        if err.vertices:
            return tuple(pts[err.vertices[0] % len(pts)])
        if err.edges:
            i = err.edges[0] % len(pts)
            return tuple((pts[i] + pts[(i + 1) % len(pts)]) / 2)
        return tuple(pts.mean(axis=0)) if len(pts) else (0.0, 0.0)

    def _draw_selection(self):
        outline, _ = self._doc.working_outline()
        e = self._doc.selected_edge
        if e is not None and e < len(outline):
            x, z = _segments(outline, np.array([e]))
            self._highlight.setData(x, z)
        else:
            self._highlight.setData([], [])
        v = self._doc.selected_vertex
        if v is not None and v < len(outline):
            self._selected.setData(pos=outline[v:v + 1])
        else:
            self._selected.setData(pos=np.empty((0, 2)))

    def _scale(self, solution):
        s = self._doc.diagram_scale
        return s if s is not None else auto_scale(solution.section, solution.max_pressure)

    def _draw_results(self, solution):
        section = solution.section
        units = self._doc.units
        h = solution.level
        outline = section.outline
        xmin, xmax = float(outline[:, 0].min()), float(outline[:, 0].max())
        zmin = section.z_min
        size = max(xmax - xmin, section.z_max - zmin, 1e-9)
        # Liquid: the cavity clipped below the free surface.
        if self._polygon is None or self._polygon_section is not section:
            self._polygon = shapely.Polygon(outline)
            self._polygon_section = section
        axi = section.is_axisymmetric
        path = _rings_path(liquid_rings(section, h, self._polygon))
        self._liquid.setPath(path)
        if axi:
            self._mirror_liquid.setPath(QTransform.fromScale(-1.0, 1.0).map(path))
        margin = 0.04 * size
        left_end = -xmax if axi else xmin
        if h > zmin:
            spans = surface_spans(section, h)
            if not spans:  # level above a closed section's roof: a standpipe head
                spans = [(left_end - margin, xmax + margin)]
            elif axi:  # across the whole vessel
                spans += [(-b, -a) for a, b in spans]
            sx = np.array(spans, dtype=float).ravel()
            self._surface.setData(sx, np.full(sx.size, h), connect="pairs")
        else:
            self._surface.setData([], [])
        spill = section.spill_level
        if spill is not None:
            self._spill.setData([left_end - 2 * margin, xmax + 2 * margin], [spill, spill])
        else:
            self._spill.setData([], [])

        if not self._parts_cached(section):
            self._carries = carrying_edges(section)
            self._runs = part_runs(section)
            self._parts_key = section.parts
        # On an axisymmetric section the edges on the axis carry nothing,
        # and a drag may move a vertex onto or off the axis.
        carries = carrying_edges(section) if axi else self._carries
        w = wetted_edges(solution, carries)
        scale = self._scale(solution)
        x, z, connect = diagram_polygons(w, scale)
        path = _path(x, z, connect)
        path.setFillRule(Qt.WindingFill)
        self._diagram.setPath(path)
        tx, tz, px, pz = pressure_arrows(w, scale)
        ax, az = arrow_strokes(tx, tz, px, pz, 0.02 * size)
        self._arrows.setData(ax, az)

        self._label_requests = []
        self._arrow_shafts = []
        self._label_outline = outline
        self._draw_resultants(solution, w, size, units)
        if h > zmin:
            sx = self._surface.getData()[0]
            left = float(np.min(sx)) if sx is not None and len(sx) else left_end
            self._label(left - 0.5 * margin, h, f"free surface {units.fmt_length(h)}",
                        SURFACE_COLOUR, (1, 0.5))
        if spill is not None:
            self._label(xmax + 2 * margin, spill, "spill level", "#5a6b7d", (0, 0.5))
        self._label_pressures(w, scale, section.n_edges, units)
        self.layout_labels()

    def _parts_cached(self, section):
        """True if the part runs and load-carrying mask are of ``section``'s
        parts (they depend on nothing else, so a dragged outline keeps them)."""
        key = getattr(self, "_parts_key", None)
        return key is not None and (key is section.parts or key == section.parts)

    def _polygon_section_is(self, section):
        return self._polygon is not None and getattr(self, "_polygon_section", None) is section

    def _text_size(self, text, bold):
        """(width, height) [px] of a label's whole text item (text plus the
        item's document margin), cached by text."""
        key = (text, bold)
        size = self._text_sizes.get(key)
        if size is None:
            if self._fonts is None:
                probe = pg.TextItem()
                regular = QFont(probe.textItem.font())
                strong = QFont(regular)
                strong.setWeight(QFont.DemiBold)
                self._fonts = (QFontMetricsF(regular), QFontMetricsF(strong))
            fm = self._fonts[1 if bold else 0]
            size = (fm.horizontalAdvance(text) + 2 * LABEL_MARGIN,
                    fm.height() + 2 * LABEL_MARGIN)
            if len(self._text_sizes) > 2000:
                self._text_sizes.clear()
            self._text_sizes[key] = size
        return size

    def _label(self, x, z, text, colour, anchor, bold=False, optional=False, once=False):
        """Ask for ``text`` at (x, z) [m], in order of importance: shown
        unless (``optional``) the place is taken; a label that must show
        steps aside instead. ``once``: not shown if the same text is already
        shown nearby."""
        self._label_requests.append((x, z, text, colour, anchor, bold, optional, once))

    def _on_rangeChanged(self, *_):
        if self._label_requests:
            self._label_timer.start()

    def layout_labels(self):
        """Place the labels asked for at the current zoom (pixel sizes)."""
        self._label_timer.stop()
        px = self._vb.viewPixelSize()
        self._px = (px[0] or 1e-9, px[1] or 1e-9)
        # The view and as much again around it: obstacles and arrows far off
        # the view are dropped or clipped, so a vertex dragged far away costs
        # no more than one near by.
        (x0, x1), (z0, z1) = self._vb.viewRange()
        bx0, bx1 = x0 / self._px[0], x1 / self._px[0]
        bz0, bz1 = z0 / self._px[1], z1 / self._px[1]
        wx, wz = bx1 - bx0, bz1 - bz0
        self._layout = LabelLayout(bounds=(bx0 - wx, bz0 - wz, bx1 + wx, bz1 + wz))
        outline = self._label_outline
        if len(outline) <= MAX_HANDLE_OBSTACLES:
            for vx, vz in outline / self._px:
                self._layout.add_obstacle(vx - 5, vz - 5, vx + 5, vz + 5)
        for x0, z0, x1, z1 in self._arrow_shafts:  # labels keep off the shafts
            self._layout.add_line(x0 / self._px[0], z0 / self._px[1], x1 / self._px[0],
                                  z1 / self._px[1], clearance=SHAFT_CLEARANCE, soft=False)
        self._labels_used = 0
        for x, z, text, colour, anchor, bold, optional, once in self._label_requests:
            X, Y = x / self._px[0], z / self._px[1]
            if once and self._layout.seen_near(text, X, Y, SAME_VALUE_PX):
                continue
            self._place_label(x, z, text, colour, anchor, bold, optional)
        for item in self._labels[self._labels_used:]:
            if item.isVisible():
                item.hide()

    def _place_label(self, x, z, text, colour, anchor, bold, optional):
        width, height = self._text_size(text, bold)
        shift = self._layout.place_anchored(x / self._px[0], z / self._px[1], width, height,
                                            anchor, required=not optional, margin=LABEL_MARGIN,
                                            key=text)
        if shift is None:
            return None
        x += shift[0] * self._px[0]
        z += shift[1] * self._px[1]
        if self._labels_used < len(self._labels):
            item = self._labels[self._labels_used]
        else:
            item = pg.TextItem(anchor=anchor, fill=LABEL_FILL)
            item.setZValue(35)
            self._vb.addItem(item)
            self._labels.append(item)
        self._labels_used += 1
        key = (text, colour, bold)
        if getattr(item, "_key", None) != key:
            item._key = key
            if getattr(item, "_bold", False) != bold:  # plain text and a font: no HTML
                item._bold = bold
                font = QFont(item.textItem.font())
                font.setWeight(QFont.DemiBold if bold else QFont.Normal)
                item.textItem.setFont(font)
            item.setText(text, color=colour)
        item.setAnchor(anchor)
        item.setPos(x, z)
        if not item.isVisible():
            item.show()
        return item

    def shown_labels(self):
        """Text of the labels on the canvas, in the order placed."""
        return [item.toPlainText() for item in self._labels[:self._labels_used]]

    def label_boxes(self):
        """Pixel boxes (x0, y0, x1, y1, y up) of the placed labels' text."""
        return list(self._layout.boxes)

    def _label_pressures(self, w, scale, n_vertices, units):
        """The pressure at the places of
        :func:`wetline.app.render.geometry.pressure_sites` (the same as the
        exported diagram's), deepest first, where there is room."""
        for site in pressure_sites(w, n_vertices, MAX_PRESSURE_LABELS):
            dx, dz = site.direction
            x, z = site.tip(scale)
            # One value once in a neighbourhood (both ends of a lid ...).
            self._label(x, z, units.fmt_pressure(site.pressure), PRESSURE_TEXT,
                        (0.5 - 0.5 * dx, 0.5 + 0.5 * dz), optional=True, once=True)

    def _draw_resultants(self, solution, w, size, units):
        section = solution.section
        res = run_resultants(solution, self._runs, w)
        if not res:
            self._down.setData([], [])
            self._up.setData([], [])
            return
        mags = np.array([np.hypot(0.0 if np.isnan(fx) else fx, fz) for _, fx, fz, _, _ in res])
        biggest = float(mags.max()) or 1.0
        down_t, up_t, labels = [], [], []
        for k in np.argsort(-mags, kind="stable"):  # the largest first
            run, fx, fz, cx, cz = res[k]
            mag = mags[k]
            if not mag > 1e-9 * biggest:
                continue
            fxx = 0.0 if np.isnan(fx) else fx
            length = size * (0.12 + 0.13 * mag / biggest)
            ux, uz = fxx / mag, fz / mag
            uplift = fz > 1e-9 * biggest
            tip = (cx + length * ux, cz + length * uz)
            (up_t if uplift else down_t).append((cx, cz, *tip))
            self._arrow_shafts.append((cx, cz, *tip))
            if len(labels) < MAX_RESULTANT_LABELS:
                labels.append((run.part, mag, uplift, tip, ux, uz))
        # The arrows are obstacles (layout_labels); the labels, largest first.
        scope = self._doc.force_scope(section)
        for part, mag, uplift, tip, ux, uz in labels:
            text = f"{part}: {scope.text(mag)}" + (" uplift" if uplift else "")
            # The tip on the box's edge facing back along the arrow.
            m = max(abs(ux), abs(uz))
            self._label(tip[0], tip[1], text, UPLIFT_COLOUR if uplift else DOWN_COLOUR,
                        (0.5 - 0.5 * ux / m, 0.5 + 0.5 * uz / m), bold=True)
        for item, arrows in ((self._down, down_t), (self._up, up_t)):
            if arrows:
                a = np.array(arrows)
                x, z = arrow_strokes(a[:, 0], a[:, 1], a[:, 2], a[:, 3], 0.045 * size)
                item.setData(x, z)
            else:
                item.setData([], [])

    # ------------------------------------------------------ picking
    def _pixel(self):
        px = self._vb.viewPixelSize()
        return max(px[0], px[1], 1e-12)

    def _pick_vertex(self, x, z, tolerance_px=8):
        outline, _ = self._doc.working_outline()
        if len(outline) > MAX_HANDLES:
            return None
        d2 = (outline[:, 0] - x) ** 2 + (outline[:, 1] - z) ** 2
        i = int(np.argmin(d2))
        return i if d2[i] <= (tolerance_px * self._pixel()) ** 2 else None

    def pick_edge(self, x, z, tolerance_px=6):
        """Index of the edge within ``tolerance_px`` pixels of (x, z), or None."""
        outline, _ = self._doc.working_outline()
        a = outline
        b = np.roll(outline, -1, axis=0)
        d = b - a
        ll = (d * d).sum(axis=1)
        t = np.clip(((x - a[:, 0]) * d[:, 0] + (z - a[:, 1]) * d[:, 1])
                    / np.where(ll > 0, ll, 1.0), 0.0, 1.0)
        qx = a[:, 0] + t * d[:, 0] - x
        qz = a[:, 1] + t * d[:, 1] - z
        d2 = qx * qx + qz * qz
        i = int(np.argmin(d2))
        return i if d2[i] <= (tolerance_px * self._pixel()) ** 2 else None

    # ------------------------------------------------------ vertex drags
    def _on_dragStarted(self, index):
        self._doc.select_vertex(index)

    def _dragged_outline(self, index, x, z):
        outline, parts = self._doc.working_outline()
        outline = np.array(outline)
        outline[index] = self.snap(x, z)
        return outline, parts

    def _on_dragMoved(self, index, x, z):
        # The document checks and solves the dragged outline once per
        # event-loop turn; the canvas redraws when it has (previewChanged,
        # solved).
        outline, parts = self._dragged_outline(index, x, z)
        self._doc.preview_outline(outline, parts)

    def _on_dragFinished(self, index, x, z):
        x, z = self.snap(x, z)
        self._doc.end_preview()
        if not editing.move_vertex(self._doc, index, x, z):
            self.message.emit(f"Invalid outline: {self._doc.draft.error} "
                              "(results keep the last valid outline)")
        self._schedule(outline=True)

    def nudge_selected(self, dx, dz):
        """Move the selected vertex by (dx, dz) [m]; consecutive nudges of
        one vertex merge into one undo step."""
        v = self._doc.selected_vertex
        if v is None:
            return False
        outline, _ = self._doc.working_outline()
        x, z = outline[v]
        editing.move_vertex(self._doc, v, x + dx, z + dz, merge_key=("nudge", v))
        return True

    def delete_selected(self):
        v = self._doc.selected_vertex
        if v is None:
            self.message.emit("Select a vertex to delete (click it)")
            return False
        editing.delete_vertex(self._doc, v)
        self._doc.select_vertex(None)
        return True

    # ------------------------------------------------------- mouse
    def _view_point(self, scene_pos):
        p = self._vb.mapSceneToView(scene_pos)
        return p.x(), p.y()

    def _on_mouseMoved(self, scene_pos):
        if not self._vb.sceneBoundingRect().contains(scene_pos):
            return
        x, z = self._view_point(scene_pos)
        self.hoverText.emit(self.describe_point(x, z))
        if self._mode == "draw" and self._drawn:
            pts = np.array(self._drawn + [self.snap(x, z)])
            self._sketch.setData(pts[:, 0], pts[:, 1])

    def describe_point(self, x, z):
        """x, z, depth below the free surface and pressure there, as text."""
        units = self._doc.units
        sol = self._solution
        text = f"x {units.fmt_length(x)}   z {units.fmt_length(z)}"
        if sol is None:
            return text
        depth = sol.level - z
        poly = self._polygon if self._polygon_section_is(sol.section) else None
        # The mirrored half of an axisymmetric section is the same vessel.
        r = abs(x) if sol.section.is_axisymmetric else x
        if poly is not None and not shapely.contains_xy(poly, r, z):
            return text + "   outside the section"
        if depth > 0:
            p = sol.density * sol.gravity * depth
            text += f"   depth {units.fmt_length(depth)}   pressure {units.fmt_pressure(p)}"
        else:
            text += f"   {units.fmt_length(-depth)} above the free surface"
        return text

    def _on_mouseClicked(self, ev):
        if ev.isAccepted() and ev.button() != Qt.LeftButton:
            return
        x, z = self._view_point(ev.scenePos())
        if self._mode == "draw":
            if ev.button() == Qt.LeftButton:
                self._draw_click(x, z, ev.double())
            return
        if ev.button() == Qt.RightButton:
            self._context_menu(x, z, ev.screenPos())
            return
        if ev.button() != Qt.LeftButton:
            return
        v = self._pick_vertex(x, z)
        if v is not None and not ev.double():
            self._doc.select_vertex(v)
            return
        e = self.pick_edge(x, z)
        if e is not None and ev.double():
            self.insert_on_edge(e, x, z)
            return
        self._doc.select_edge(e)

    def insert_on_edge(self, edge, x, z):
        """Insert a vertex on ``edge`` at the point nearest (x, z)."""
        outline, _ = self._doc.working_outline()
        a = outline[edge]
        b = outline[(edge + 1) % len(outline)]
        d = b - a
        t = float(np.clip(((x - a[0]) * d[0] + (z - a[1]) * d[1]) / max(d @ d, 1e-300),
                          0.05, 0.95))
        px, pz = self.snap(*(a + t * d))
        editing.insert_vertex(self._doc, edge, px, pz)
        self._doc.select_vertex(edge + 1)

    def _context_menu(self, x, z, screen_pos):
        v = self._pick_vertex(x, z)
        e = None if v is not None else self.pick_edge(x, z)
        menu = QMenu(self)
        if v is not None:
            self._doc.select_vertex(v)
            menu.addAction(f"Delete vertex {v}", lambda: self.delete_selected())
        elif e is not None:
            self._doc.select_edge(e)
            menu.addAction(f"Insert vertex on edge {e}", lambda: self.insert_on_edge(e, x, z))
            sub = menu.addMenu(f"Part of edge {e}")
            _, parts = self._doc.working_outline()
            names = list(dict.fromkeys(RESERVED_PART_CHOICES + tuple(parts)))
            for name in names:
                act = sub.addAction(name, lambda n=name: self.set_part(e, n))
                act.setCheckable(True)
                act.setChecked(parts[e] == name)
            sub.addSeparator()
            sub.addAction("Other name...", lambda: self._ask_part(e))
        else:
            return
        menu.popup(screen_pos.toPoint() if hasattr(screen_pos, "toPoint") else screen_pos)

    def _ask_part(self, edge):
        name, ok = QInputDialog.getText(self, "Part name", f"Part of edge {edge}:")
        if ok and name.strip():
            self.set_part(edge, name)

    def set_part(self, edge, name):
        if not editing.set_edge_part(self._doc, edge, name):
            self.message.emit(f"Invalid: {self._doc.draft.error}")

    # --------------------------------------------------------- draw mode
    def _draw_click(self, x, z, double):
        p = self.snap(x, z)
        if self._drawn and len(self._drawn) >= 3:
            fx, fz = self._drawn[0]
            if (fx - p[0]) ** 2 + (fz - p[1]) ** 2 <= (8 * self._pixel()) ** 2:
                self.finish_drawing()
                return
        if double:
            self.finish_drawing()
            return
        if not self._drawn or self._drawn[-1] != p:
            self._drawn.append(p)
        pts = np.array(self._drawn)
        self._sketch.setData(pts[:, 0], pts[:, 1])

    def add_drawn_point(self, x, z):
        """Add a vertex to the outline being drawn (as a click would)."""
        self._draw_click(x, z, False)

    def finish_drawing(self):
        """Close the outline being drawn and make it the section (or a draft
        marked with its fault)."""
        pts = list(self._drawn)
        self._drawn = []
        self._sketch.setData([], [])
        self.set_mode("edit")
        if not pts:
            return False
        if not editing.draw_outline(self._doc, pts):
            self.message.emit(f"Invalid outline: {self._doc.draft.error}")
            self._schedule(outline=True)
            return False
        return True

    def cancel_drawing(self):
        self._drawn = []
        self._sketch.setData([], [])
        self.set_mode("edit")

    # ------------------------------------------------------- keyboard
    def keyPressEvent(self, ev):
        key = ev.key()
        if self._mode == "draw":
            if key in (Qt.Key_Return, Qt.Key_Enter):
                self.finish_drawing()
                return
            if key == Qt.Key_Escape:
                self.cancel_drawing()
                return
            if key == Qt.Key_Backspace and self._drawn:
                self._drawn.pop()
                pts = np.array(self._drawn).reshape(-1, 2)
                self._sketch.setData(pts[:, 0], pts[:, 1])
                return
        step = self.snap_spacing if self.snap_enabled else 0.01 * max(
            np.ptp(self._doc.section.outline, axis=0).max(), 1e-9)
        moves = {Qt.Key_Left: (-step, 0), Qt.Key_Right: (step, 0),
                 Qt.Key_Up: (0, step), Qt.Key_Down: (0, -step)}
        if key in moves and self._doc.selected_vertex is not None:
            self.nudge_selected(*moves[key])
            return
        if key == Qt.Key_Escape:
            self._doc.select_edge(None)
            return
        super().keyPressEvent(ev)
