"""Draggable vertex handles of the canvas's outline editor."""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt, Signal

from wetline.app.window.canvas_items import SymbolItem

__all__ = ["PickedDrag", "VertexHandles", "MAX_HANDLES"]

MAX_HANDLES = 3000
"""Above this many vertices the handles are hidden (edit in the table)."""
LIVE_MOVES = 8
"""Up to this many handles moved by a live drag are drawn over the others
(:meth:`VertexHandles.set_positions`)."""


class PickedDrag:
    """The left-button drag of a canvas item that picks what it grabs: the
    press picks an index with ``grab_at(x, z)`` (data coordinates [m]; None:
    the drag is left to the view, which pans), then ``dragStarted``,
    ``dragMoved`` and ``dragFinished`` follow with that index and the
    pointer's position. ``started_with(index, pos)`` gives the arguments of
    ``dragStarted`` (default: the index alone)."""

    _dragging = None

    def grab_at(self, x, z):
        raise NotImplementedError

    def started_with(self, index, pos):
        return (index,)

    def mouseDragEvent(self, ev):
        if ev.button() != Qt.MouseButton.LeftButton:
            ev.ignore()
            return
        if ev.isStart():
            pos = ev.buttonDownPos()
            k = self.grab_at(pos.x(), pos.y())
            if k is None:
                ev.ignore()
                return
            self._dragging = k
            self.dragStarted.emit(*self.started_with(k, pos))
        elif self._dragging is None:
            ev.ignore()
            return
        ev.accept()
        p = ev.pos()
        if ev.isFinish():
            k, self._dragging = self._dragging, None
            self.dragFinished.emit(k, p.x(), p.y())
        else:
            self.dragMoved.emit(self._dragging, p.x(), p.y())


class VertexHandles(PickedDrag, pg.ScatterPlotItem):
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
        self.setZValue(40)
        # The handles a live drag moves, drawn over the others: the item
        # itself (and its pixmap) stays as the drag found it, those
        # handles hidden in it (see set_positions).
        self._moving = [SymbolItem(parent=self) for _ in range(LIVE_MOVES)]
        self._hidden = np.empty(0, dtype=np.intp)

    def grab_at(self, x, z):
        return self._pick(x, z)

    def moving_points(self):
        """Where the handles a live drag moves are drawn ((K, 2) [m]; none
        between drags)."""
        shown = [h.point() for h in self._moving if h.isVisible()]
        return np.array(shown, dtype=np.float64).reshape(-1, 2)

    def set_positions(self, pos, live=False):
        """Show handles at ``pos`` ((N, 2) [m]). When only a few moved (a
        drag), they are moved in place: rebuilding a few thousand spots
        costs milliseconds a frame. ``live`` (a drag under way): the few
        that moved are drawn on their own (:meth:`moving_points`) and
        hidden here, so this item keeps its pixmap through the drag
        (drawing a few thousand handles afresh at every step costs about a
        millisecond); the next call that is not live puts them back."""
        pos = np.asarray(pos, dtype=np.float64)
        data = self.data
        if len(data) == len(pos) and len(pos) > 0:
            moved = np.flatnonzero((data["x"] != pos[:, 0]) | (data["y"] != pos[:, 1]))
            if live and moved.size <= LIVE_MOVES:
                self._show_moving(pos, moved)
                return
            self._end_moving()
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
        self._end_moving()
        self.setData(pos=pos)

    def _show_moving(self, pos, moved):
        if not np.array_equal(moved, self._hidden):
            self._set_hidden(moved)
        o = self.opts
        for k, handle in enumerate(self._moving):
            if k < moved.size:
                handle.set_style(o["symbol"], o["size"], o["pen"], o["brush"])
            handle.show_at(pos[moved[k]] if k < moved.size else None)

    def _end_moving(self):
        if self._hidden.size:
            self._set_hidden(np.empty(0, dtype=np.intp))
        for handle in self._moving:
            handle.show_at(None)

    def _set_hidden(self, hidden):
        visible = np.ones(len(self.data), dtype=bool)
        visible[hidden] = False
        self.setPointsVisible(visible)
        self._hidden = hidden
