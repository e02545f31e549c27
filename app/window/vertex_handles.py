"""Draggable vertex handles of the canvas's outline editor."""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt, Signal

__all__ = ["VertexHandles", "MAX_HANDLES"]

MAX_HANDLES = 3000
"""Above this many vertices the handles are hidden (edit in the table)."""


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
