"""The draggable layer interfaces of the canvas.

:class:`InterfaceGrips` is an invisible item over the interfaces the load
layer draws (:attr:`wetline.app.window.load_layer.LoadLayer.interface_levels`):
its shape is a band a few pixels high along each interface where it crosses
the cavity, so the pointer turns into an up-down cursor over an interface,
and a drag that starts there is the grips' (elsewhere it is left to the
vertex handles or the view, which pans). What a drag does is the outline
editor's (:meth:`wetline.app.window.canvas_editing.OutlineEditor.on_interface_drag`).
"""

from __future__ import annotations

import pyqtgraph as pg
from PySide6.QtCore import QRectF, Qt, Signal
from PySide6.QtGui import QPainterPath
from PySide6.QtWidgets import QGraphicsItem

from wetline.app.window.vertex_handles import PickedDrag

__all__ = ["InterfaceGrips", "GRIP_PX"]

GRIP_PX = 6.0
"""Half the height of an interface's grip [px]."""


class InterfaceGrips(PickedDrag, pg.GraphicsObject):
    """Grips along the layer interfaces (data coordinates [m]).

    Signals carry the interface's index (0 = the top of the bottom layer)
    and the pointer's position [m].
    """

    dragStarted = Signal(int, float, float)
    dragMoved = Signal(int, float, float)
    dragFinished = Signal(int, float, float)

    def __init__(self):
        super().__init__()
        self._levels = []
        self._spans = []
        self._mirror = False
        self._rect = QRectF()
        self.setCursor(Qt.CursorShape.SizeVerCursor)
        # Inside the view box (which clips its children) Qt takes an item's
        # clip path for its hit area: clipped to its shape, that is the grips.
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemClipsToShape, True)
        self.setZValue(38)  # under the vertex handles: a vertex on an interface is a vertex

    # ----------------------------------------------------------- state
    def set_interfaces(self, levels, spans, mirror=False):
        """The interfaces to grip: ``levels`` [m] bottom up, each crossing
        the cavity at the x-ranges ``spans`` [m]; ``mirror`` also grips the
        mirrored half of an axisymmetric section."""
        levels = [float(z) for z in levels]
        spans = [[(float(a), float(b)) for a, b in sp] for sp in spans]
        if levels == self._levels and spans == self._spans and mirror == self._mirror:
            return
        self.prepareGeometryChange()
        self._levels, self._spans, self._mirror = levels, spans, bool(mirror)
        xs = [x for sp in self._spans for ab in sp for x in ab]
        if not xs:
            self._rect = QRectF()
        else:
            x0, x1 = min(xs), max(xs)
            if self._mirror:
                x0 = min(x0, -x1)
            z0, z1 = min(self._levels), max(self._levels)
            # Room for the band at any sensible zoom: the shape is cut to it.
            pad = 0.5 * max(x1 - x0, z1 - z0, 1e-9)
            self._rect = QRectF(x0 - pad, z0 - pad, x1 - x0 + 2 * pad, z1 - z0 + 2 * pad)
        self.update()

    @property
    def levels(self):
        """Levels [m] of the interfaces gripped, bottom up."""
        return list(self._levels)

    def _tolerance(self):
        """(dx, dz) [m] of :data:`GRIP_PX` pixels at the current zoom."""
        w, h = self.pixelSize()
        return GRIP_PX * abs(w), GRIP_PX * abs(h)

    def pick(self, x, z):
        """Index of the interface within a grip of (x, z) [m] (the nearest),
        or None."""
        if not self._levels:
            return None
        tx, tz = self._tolerance()
        if not (tz > 0):
            return None
        r = abs(x) if self._mirror else x
        best = None
        for k, (level, spans) in enumerate(zip(self._levels, self._spans, strict=True)):
            d = abs(z - level)
            if d <= tz and any(a - tx <= r <= b + tx for a, b in spans) \
                    and (best is None or d < best[0]):
                best = (d, k)
        return None if best is None else best[1]

    # ------------------------------------------------------ QGraphicsItem
    def boundingRect(self):
        return QRectF(self._rect)

    def shape(self):
        path = QPainterPath()
        if not self._levels:
            return path
        tx, tz = self._tolerance()
        if not (tz > 0):
            return path
        for level, spans in zip(self._levels, self._spans, strict=True):
            for a, b in spans:
                for lo, hi in ((a, b), (-b, -a)) if self._mirror else ((a, b),):
                    path.addRect(QRectF(lo - tx, level - tz, hi - lo + 2 * tx, 2 * tz))
        clip = QPainterPath()
        clip.addRect(self._rect)
        return path.intersected(clip)

    def paint(self, painter, option, widget=None):
        """Nothing: the load layer draws the interfaces."""

    # ------------------------------------------------------------ mouse
    def grab_at(self, x, z):
        return self.pick(x, z)

    def started_with(self, index, pos):
        return (index, pos.x(), pos.y())

    @property
    def dragging(self):
        """Index of the interface being dragged, or None."""
        return self._dragging
