"""Small helpers that make the canvas's graphics items and paths.

pyqtgraph curves and Qt path items in data coordinates (metres, z up),
cosmetic pens that keep their pixel width at any zoom, and paths built from
numpy arrays in one call: one path or ``connect='pairs'`` curve holds
thousands of segments (see DEVELOPERS.md, "The desktop program", for what
that saves).
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QPainterPath, QPen
from PySide6.QtWidgets import QGraphicsPathItem

__all__ = ["cosmetic_pen", "path_of", "rings_path", "edge_segments", "pairs_curve",
           "filled_path_item", "add_item", "FilledPathItem"]


def cosmetic_pen(colour, width=1.0, style=Qt.PenStyle.SolidLine):
    """A pen ``width`` pixels wide at any zoom."""
    pen = QPen(QColor(colour))
    pen.setWidthF(width)
    pen.setCosmetic(True)
    pen.setStyle(style)
    return pen


def path_of(x, z, connect):
    """A QPainterPath of points x, z [m]; ``connect`` as for
    :func:`pyqtgraph.arrayToQPath` (False after each polygon's last point)."""
    if len(x) == 0:
        return QPainterPath()
    return pg.arrayToQPath(np.asarray(x, float), np.asarray(z, float), connect=connect,
                           finiteCheck=False)


def rings_path(rings):
    """One odd-even path of closed rings ((N, 2) arrays [m])."""
    if not rings:
        return QPainterPath()
    connect = []
    for ring in rings:
        c = np.ones(len(ring), dtype=bool)
        c[-1] = False
        connect.append(c)
    pts = np.concatenate(rings)
    return path_of(pts[:, 0], pts[:, 1], np.concatenate(connect))


def edge_segments(outline, edges):
    """x, z point pairs of the given edges for a ``connect='pairs'`` curve."""
    n = len(outline)
    a = outline[edges]
    b = outline[(np.asarray(edges) + 1) % n]
    xy = np.empty((len(edges) * 2, 2))
    xy[0::2] = a
    xy[1::2] = b
    return xy[:, 0], xy[:, 1]


def add_item(viewbox, item, z, visible=True):
    """Add ``item`` to ``viewbox`` at depth ``z``; returns it."""
    item.setZValue(z)
    item.setVisible(visible)
    viewbox.addItem(item)
    return item


def pairs_curve(viewbox, pen, z, visible=True):
    """A ``connect='pairs'`` curve (many separate segments in one item)."""
    return add_item(viewbox, pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True, pen=pen),
                    z, visible)


class FilledPathItem(QGraphicsPathItem):
    """A path item whose bounding rectangle is its path's control points
    (plus a non-cosmetic pen's reach): Qt's own, with a pen, strokes the whole
    path to find it, about 6 ms at every change of a diagram of 10,000
    edges. A cosmetic pen's half pixel lies within the 2 px Qt's view adds
    around every update for antialiasing."""

    _rect = None

    def setPath(self, path):
        self.prepareGeometryChange()
        self._rect = None
        super().setPath(path)

    def setPen(self, pen):
        self.prepareGeometryChange()
        self._rect = None
        super().setPen(pen)

    def boundingRect(self):
        rect = self._rect
        if rect is None:
            rect = self.path().controlPointRect()
            pen = self.pen()
            if pen.style() != Qt.PenStyle.NoPen and not pen.isCosmetic():
                # Square caps reach 0.71 widths out, mitres the miter limit
                # (in widths) past the stroke's half width.
                k = pen.miterLimit() + 0.5 if pen.joinStyle() == Qt.PenJoinStyle.MiterJoin else 1.0
                pad = max(k, 1.0) * pen.widthF()
                rect = rect.adjusted(-pad, -pad, pad, pad)
            self._rect = rect
        return rect


def filled_path_item(viewbox, brush, z, pen=None, visible=True):
    """A path item filled with ``brush`` (and outlined with ``pen``)."""
    item = FilledPathItem()
    item.setBrush(QBrush(brush))
    item.setPen(pen if pen is not None else QPen(Qt.PenStyle.NoPen))
    return add_item(viewbox, item, z, visible)
