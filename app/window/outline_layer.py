"""The canvas's drawing of the outline itself: each part in its colour (with
a legend above the drawing), the mirrored half and centre line of an axisymmetric section, the
selected edge and vertex, an invalid outline with its fault, and the outline
being drawn in draw mode.

Colours come from the one part palette
(:func:`wetline.app.render.style.part_colours`), so the window and the
exported diagram colour each part alike.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt
from PySide6.QtGui import QColor

from wetline.app.render.style import MUTED, part_colours
from wetline.app.window.canvas_items import (
    SymbolItem,
    add_item,
    cosmetic_pen,
    edge_segments,
    pairs_curve,
)
from wetline.app.window.outer_legend import legend_outside
from wetline.core.section import AXIS, OPEN

__all__ = ["OutlineLayer", "HIGHLIGHT_COLOUR", "FAULT_COLOUR"]

HIGHLIGHT_COLOUR = "#f2b705"
"""The selected edge and vertex."""
FAULT_COLOUR = "#d00000"
"""An invalid outline and the mark at its fault."""
MIRROR_COLOUR = QColor(52, 80, 110, 90)
"""Pen of the mirrored half of an axisymmetric section."""


class OutlineLayer:
    """The outline's graphics items in a plot, and their drawing."""

    def __init__(self, plot):
        self._plot = plot
        vb = plot.getViewBox()
        self._part_curves = {}
        self._drawn = {}  # part name: (pen key, its edges) as last drawn
        self._groups_key = None  # (parts, what _groups made of them)
        self._last_outline = None  # the outline as last drawn (a copy)
        # Above the view, outside the drawing (never over the outline).
        self._legend = legend_outside(plot, "top", label_size="9pt")
        self.highlight = pairs_curve(vb, pg.mkPen(HIGHLIGHT_COLOUR, width=7), 8)
        self.selected = add_item(vb, SymbolItem("o", 13, pg.mkPen("#000000", width=2),
                                                pg.mkBrush(HIGHLIGHT_COLOUR)), 41)
        self.draft_curve = add_item(vb, pg.PlotCurveItem(
            pen=pg.mkPen(FAULT_COLOUR, width=2, style=Qt.PenStyle.DashLine)), 20)
        self.fault = add_item(vb, pg.ScatterPlotItem(
            size=16, symbol="x", pen=pg.mkPen(FAULT_COLOUR, width=2),
            brush=pg.mkBrush(FAULT_COLOUR)), 50, visible=False)
        self.fault_text = add_item(vb, pg.TextItem(color=FAULT_COLOUR, anchor=(0, 1),
                                                   fill=pg.mkBrush(255, 255, 255, 220)), 60,
                                   visible=False)
        # The mirrored half of an axisymmetric section (drawn, never edited).
        self.mirror = pairs_curve(vb, cosmetic_pen(MIRROR_COLOUR, 2.0), 9, visible=False)
        self.centre_line = add_item(vb, pg.PlotCurveItem(
            pen=pg.mkPen(MUTED, width=1, style=Qt.PenStyle.DashDotLine)), 11, visible=False)
        self.sketch = add_item(vb, pg.PlotCurveItem(
            pen=pg.mkPen("#1a1a1a", width=1.5, style=Qt.PenStyle.DashLine)), 45)

    @property
    def legend(self):
        """The part legend over the view (pyqtgraph's LegendItem)."""
        return self._legend

    @property
    def mirrored(self):
        """True if the mirrored half of an axisymmetric section is drawn."""
        return self.mirror.isVisible()

    def draw(self, outline, parts, axisymmetric):
        """Each part's edges as one curve in its colour, and the mirror.

        A part whose edges, vertices and pen are as last drawn keeps its
        curve as it is: a vertex drag moves the runs of at most two parts,
        the others keep their path and cached pixmap (the vertices that
        moved are found by comparing the outline with the last one)."""
        names, index, mirrored = self._groups(parts)
        colours = part_colours(names)
        moved = self._moved_edges(outline)
        for name in list(self._part_curves):
            if name not in index:
                curve = self._part_curves.pop(name)
                self._legend.removeItem(curve)
                self._plot.removeItem(curve)
                self._drawn.pop(name, None)
        for name in names:
            edges = index[name]
            curve = self._part_curves.get(name)
            style = (Qt.PenStyle.DashLine if name == OPEN
                     else Qt.PenStyle.DashDotLine if name == AXIS else Qt.PenStyle.SolidLine)
            width = 1.5 if name in (OPEN, AXIS) else 3
            if curve is None:
                curve = pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True, name=name)
                curve.setZValue(10)
                self._plot.addItem(curve)
                self._part_curves[name] = curve
            key = (colours[name], width, style)
            last = self._drawn.get(name)
            if last is not None and last[0] == key and last[1] is edges \
                    and moved is not None and not moved[edges].any():
                continue
            curve.setPen(pg.mkPen(colours[name], width=width, style=style))
            curve.setData(*edge_segments(outline, edges))
            self._drawn[name] = (key, edges)
        self._legend.fit_columns(len(names))
        self._draw_mirror(outline, mirrored, axisymmetric)

    def _groups(self, parts):
        """(names in order, {name: its edges (array)}, the edges a mirror
        draws (neither open nor axis)) of the edges' ``parts``, made again
        only when the parts change."""
        parts = parts if isinstance(parts, tuple) else tuple(parts)
        key = self._groups_key
        if key is None or not (key[0] is parts or key[0] == parts):
            names = tuple(dict.fromkeys(parts))
            arr = np.array(parts, dtype=object)
            index = {name: np.flatnonzero(arr == name) for name in names}
            mirrored = np.flatnonzero((arr != AXIS) & (arr != OPEN))
            self._groups_key = key = (parts, (names, index, mirrored))
        return key[1]

    def _moved_edges(self, outline):
        """Mask of the edges with a vertex other than at the last draw (None:
        every edge, the vertex count having changed or nothing drawn yet)."""
        outline = np.array(outline, dtype=float)  # a copy, kept for the next draw
        last, self._last_outline = self._last_outline, outline
        if last is None or last.shape != outline.shape:
            return None
        moved = np.any(outline != last, axis=1)
        return moved | np.roll(moved, -1)  # edge i runs from vertex i to i + 1

    def _draw_mirror(self, outline, edges, axisymmetric):
        """The other half of an axisymmetric section, faintly (x -> -x), and
        the axis as a centre line (``edges``: those it mirrors); hidden for
        plane sections."""
        items = (self.mirror, self.centre_line)
        if not axisymmetric:
            for item in items:
                if item.isVisible():
                    item.setVisible(False)
            return
        x, z = edge_segments(outline, edges)
        self.mirror.setData(-x, z)
        z0, z1 = float(outline[:, 1].min()), float(outline[:, 1].max())
        over = 0.06 * max(z1 - z0, float(np.ptp(outline[:, 0])), 1e-9)
        self.centre_line.setData([0.0, 0.0], [z0 - over, z1 + over])
        for item in items:
            if not item.isVisible():
                item.setVisible(True)

    def draw_fault(self, fault, explain=str):
        """An invalid outline dashed, and its fault marked and told:
        ``fault`` is (outline [m], SectionError) or None; ``explain`` gives
        the error's words (the display's, in its length unit)."""
        if fault is None:
            # Cleared once, then left alone: a drag redraws the outline at
            # every step, and an empty scatter item still costs about 0.2 ms
            # a frame to paint (hidden, nothing).
            if self.fault.isVisible():
                self.draft_curve.setData([], [])
                self.fault.setData([], [])
                self.fault.hide()
                self.fault_text.hide()
            return
        outline, error = fault
        pts = np.vstack([outline, outline[:1]])
        self.draft_curve.setData(pts[:, 0], pts[:, 1])
        where = fault_location(outline, error)
        self.fault.setData([where[0]], [where[1]])
        self.fault.show()
        self.fault_text.setText(explain(error))
        self.fault_text.setPos(where[0], where[1])
        self.fault_text.show()

    def draw_selection(self, outline, edge, vertex):
        """The selected ``edge`` and ``vertex`` (indices or None)."""
        if edge is not None and edge < len(outline):
            self.highlight.setData(*edge_segments(outline, np.array([edge])))
        else:
            self.highlight.setData([], [])
        self.selected.show_at(outline[vertex] if vertex is not None and vertex < len(outline)
                              else None)

    def show_sketch(self, points):
        """The outline being drawn: (N, 2) points [m], or none."""
        pts = np.asarray(points, dtype=float).reshape(-1, 2)
        self.sketch.setData(pts[:, 0], pts[:, 1])


def fault_location(outline, error):
    """Where to mark ``error`` (a SectionError) on ``outline`` [m]: its
    location, else its first vertex, the middle of its first edge, or the
    outline's centre."""
    pts = outline
    if error.location is not None:
        return error.location
    if error.vertices:
        return tuple(pts[error.vertices[0] % len(pts)])
    if error.edges:
        i = error.edges[0] % len(pts)
        return tuple((pts[i] + pts[(i + 1) % len(pts)]) / 2)
    return tuple(pts.mean(axis=0)) if len(pts) else (0.0, 0.0)
