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
from pyqtgraph import functions as pg_functions
from pyqtgraph.graphicsItems.ScatterPlotItem import Symbols
from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QPainter, QPainterPath, QPen, QTransform
from PySide6.QtWidgets import QGraphicsItem, QGraphicsPathItem

__all__ = ["MAX_POLYGONS", "UPDATE_MARGIN_PX", "LineItem", "SymbolItem", "cosmetic_pen",
           "line_curve", "path_of", "rings_path", "edge_segments", "pairs_curve",
           "filled_path_item", "add_item", "FilledPathItem"]


def cosmetic_pen(colour, width=1.0, style=Qt.PenStyle.SolidLine):
    """A pen ``width`` pixels wide at any zoom."""
    pen = QPen(QColor(colour))
    pen.setWidthF(width)
    pen.setCosmetic(True)
    pen.setStyle(style)
    return pen


MAX_POLYGONS = 64
"""Up to this many runs of points, :func:`path_of` adds each as a polygon."""


def path_of(x, z, connect):
    """A QPainterPath of points x, z [m]; ``connect`` as for
    :func:`pyqtgraph.arrayToQPath` (False after each polygon's last point).

    The same elements as ``arrayToQPath`` gives, made faster: each run of
    connected points is written into a ``QPolygonF`` (through a numpy view
    of its memory) and added to the path as a polygon, where
    ``arrayToQPath`` streams every point through a ``QDataStream`` (about
    3 ms for the 40,000 points of a 10,000-edge diagram, against 1). A run
    of one point between two others draws nothing and is not kept (Qt
    folds a moveTo into the next).
    Past :data:`MAX_POLYGONS` runs, for a single point, or for ``connect``
    given by a name other than ``"all"``, ``arrayToQPath`` makes the path.
    """
    n = len(x)
    if n == 0:
        return QPainterPath()
    x, z = np.asarray(x, float), np.asarray(z, float)
    if isinstance(connect, str):
        starts = np.empty(0, dtype=np.int64) if connect == "all" else None
    else:
        starts = np.flatnonzero(~np.asarray(connect, dtype=bool)[:-1]) + 1
    if n == 1 or starts is None or len(starts) >= MAX_POLYGONS:
        return pg.arrayToQPath(x, z, connect=connect, finiteCheck=False)
    xz = np.column_stack([x, z])
    path = QPainterPath()
    for a, b in zip([0, *starts.tolist()], [*starts.tolist(), n], strict=True):
        polygon = pg_functions.create_qpolygonf(b - a)
        pg_functions.ndarray_from_qpolygonf(polygon)[:] = xz[a:b]
        path.addPolygon(polygon)
    return path


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


UPDATE_MARGIN_PX = 2.0
"""What Qt's view adds around every item's update for antialiasing [px]: a
cosmetic pen up to twice as wide is repainted whole though a
:class:`LineItem`'s rectangle is its points'."""


def pairs_curve(viewbox, pen, z, visible=True):
    """A ``connect='pairs'`` curve (many separate segments in one item), a
    pyqtgraph curve that may take a device-pixel cache (see
    :func:`line_curve` for one that changes at every fill step)."""
    return add_item(viewbox, pg.PlotCurveItem(connect="pairs", skipFiniteCheck=True, pen=pen),
                    z, visible)


def line_curve(viewbox, pen, z, visible=True, connect="all"):
    """A curve of points drawn with ``pen`` (anything ``pyqtgraph.mkPen``
    takes) that changes with the fill (the load layer's): a
    :class:`LineItem`, or pyqtgraph's ``PlotCurveItem`` for a pen wider than
    :data:`UPDATE_MARGIN_PX` allows (it pads its rectangle)."""
    pen = pg.mkPen(pen)
    if pen.isCosmetic() and pen.widthF() <= 2.0 * UPDATE_MARGIN_PX:
        item = LineItem(pen, connect)
    else:
        item = pg.PlotCurveItem(connect=connect, skipFiniteCheck=True, pen=pen)
    return add_item(viewbox, item, z, visible)


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


class LineItem(FilledPathItem):
    """A curve through points x, z [m] drawn with a cosmetic pen and no fill:
    the part of ``pyqtgraph.PlotCurveItem`` the canvas uses (``setData``
    with ``connect``, ``getData``, ``xData``, ``yData``, ``opts["pen"]``,
    ``setPen``), painted by Qt itself. A ``PlotCurveItem`` paints, bounds
    and measures its data in Python at every repaint, and a fill step
    repaints nearly every curve of the canvas. The pixels are pyqtgraph's,
    but that a solid connected line wider than a pixel is joined at its
    vertices where pyqtgraph draws separate segments.

    Its rectangle is its points' (:class:`FilledPathItem`): the pen's reach
    lies within the view's margin around every update, but a device-pixel
    cache would cut it off, so a line item refuses one.
    """

    def __init__(self, pen, connect="all"):
        super().__init__()
        self._connect = connect
        self.xData = np.empty(0)
        self.yData = np.empty(0)
        self.opts = {}
        self.setBrush(QBrush(Qt.BrushStyle.NoBrush))
        self.setPen(pen)

    def setPen(self, pen):
        pen = pg.mkPen(pen)
        self.opts["pen"] = pen
        super().setPen(pen)

    def setCacheMode(self, mode, size=None):
        if mode != QGraphicsItem.CacheMode.NoCache:
            raise ValueError("a LineItem is drawn afresh: its rectangle leaves out its pen")
        super().setCacheMode(mode)

    def setData(self, x, y, connect=None):
        """Draw through the points ``x``, ``y`` [m]; ``connect`` as for
        :func:`path_of` (kept for later calls, as pyqtgraph keeps it)."""
        if connect is not None:
            self._connect = connect
        self.xData = np.asarray(x, dtype=float)
        self.yData = np.asarray(y, dtype=float)
        self.setPath(path_of(self.xData, self.yData, self._connect))

    def getData(self):
        """The points drawn, (x, z) [m]."""
        return self.xData, self.yData


class SymbolItem(QGraphicsPathItem):
    """One marker at a point of the view: a pyqtgraph symbol ("o", "s" ...
    or a path) of a size in pixels whatever the zoom, with a pen and a
    brush, antialiased as pyqtgraph draws its symbols (the same pixels).
    For a marker that moves at every step of a drag (the selected vertex,
    the dragged handles): a pyqtgraph scatter item of one point costs about
    0.4 ms a frame to paint, this some microseconds."""

    def __init__(self, symbol="o", size=9.0, pen=None, brush=None, parent=None):
        super().__init__(parent)
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.setAcceptedMouseButtons(Qt.MouseButton.NoButton)
        self._style = None
        self.set_style(symbol, size, pen, brush)
        self.hide()

    def set_style(self, symbol, size, pen, brush):
        """Draw ``symbol`` of ``size`` [px] with ``pen`` and ``brush``
        (anything ``pyqtgraph.mkPen`` and ``mkBrush`` take)."""
        style = (symbol, size, pen, brush)
        if style == self._style:
            return
        self._style = style
        path = Symbols[symbol] if isinstance(symbol, str) else symbol
        self.setPath(QTransform.fromScale(size, size).map(path))
        self.setPen(pg.mkPen(pen))
        self.setBrush(pg.mkBrush(brush))

    def show_at(self, xz):
        """Show the marker at ``xz`` [m], or hide it (None)."""
        if xz is None:
            if self.isVisible():
                self.hide()
            return
        self.setPos(float(xz[0]), float(xz[1]))
        if not self.isVisible():
            self.show()

    def point(self):
        """Where the marker is shown (x, z) [m], or None (hidden)."""
        return (self.pos().x(), self.pos().y()) if self.isVisible() else None

    def setCacheMode(self, mode, size=None):
        if mode != QGraphicsItem.CacheMode.NoCache:
            # A device-pixel cache would draw it up to a pixel off its point.
            raise ValueError("a SymbolItem is drawn afresh: it is a few pixels")
        super().setCacheMode(mode)

    def paint(self, painter, option, widget=None):
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        super().paint(painter, option, widget)
