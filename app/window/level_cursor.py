"""The chart's cursor: a vertical line at the current level across the whole
view, with the level's value beside its top, that the user drags to set
the fill.

One light item for both. pyqtgraph's ``InfiniteLine`` with a ``TextItem``
beside it cost about 5 ms of every fill step in the chart alone (the line's
bounds found through the view's transforms in Python, its position-change
bookkeeping, the text laid out as a document for every new value), where
this one keeps its bounds from the last view change and draws its text with
``QPainter.drawText``: a move is a new position and one repaint of the old
and the new strip.
"""

from __future__ import annotations

import pyqtgraph as pg
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt, Signal
from PySide6.QtGui import QColor, QFontMetricsF, QPainterPath
from PySide6.QtWidgets import QApplication

__all__ = ["LevelCursor", "GRAB_PX", "TEXT_FILL", "TEXT_GAP_PX"]

GRAB_PX = 4.0
"""Half the width [px] of the strip in which the line is grabbed."""
TEXT_GAP_PX = 4.0
"""Between the line and its value's text [px]."""
TEXT_FILL = QColor(255, 255, 255, 190)
"""Behind the text."""


class LevelCursor(pg.GraphicsObject):
    """A vertical line at ``value()`` (the x of the view it is in) from the
    bottom to the top of the view, its text to the right of its top (to the
    left where it would run past the view's right edge).

    Signals as ``pyqtgraph.InfiniteLine``'s: ``sigDragged(self)`` at every
    step of a drag with the left button, ``sigPositionChangeFinished(self)``
    at its release.
    """

    sigDragged = Signal(object)
    sigPositionChangeFinished = Signal(object)

    def __init__(self, pen, hover_pen, text_colour):
        super().__init__()
        self._pens = (pg.mkPen(pen), pg.mkPen(hover_pen))
        self._hover = False
        self._moving = False
        self._offset = 0.0
        self._text = ""
        self._text_pen = pg.mkColor(text_colour)
        self._font = QApplication.font()
        self._metrics = QFontMetricsF(self._font)
        self._span = (0.0, 1.0)  # the view's y range [view units]
        self._px = (0.0, 0.0)  # view units per pixel (x, y)
        self._right = 1.0  # the view's right edge [view units]
        self._rect = QRectF()
        self._grab = QRectF()  # the strip where the line is grabbed
        self._text_px = 0.0  # the text's width [px], measured once per text
        self._text_w = 0.0  # its reach beside the line [view units]
        self.setZValue(15)

    # ----------------------------------------------------------- value
    def value(self):
        """The line's x in view units."""
        return float(self.pos().x())

    def setValue(self, x):
        """Put the line at ``x`` (view units)."""
        x = float(x)
        if x != self.value():
            self.setPos(x, 0.0)

    def text(self):
        """The text beside the top of the line."""
        return self._text

    def setText(self, text):
        """Show ``text`` beside the top of the line."""
        if text != self._text:
            self._text = text
            self._text_px = self._metrics.horizontalAdvance(text)
            self._fit()
            self.update()

    # ----------------------------------------------------------- geometry
    def viewTransformChanged(self):
        """The view was zoomed, panned or resized: the line spans it again."""
        vb = self.getViewBox()
        if isinstance(vb, pg.ViewBox):
            (_, x1), (y0, y1) = vb.viewRange()
            self._span = (float(y0), float(y1))
            self._right = float(x1)
            px = vb.viewPixelSize()
            self._px = (abs(float(px[0])), abs(float(px[1])))
        self._fit()
        super().viewTransformChanged()

    def _fit(self):
        y0, y1 = self._span
        px, _ = self._px
        half = GRAB_PX * px
        self._grab = QRectF(-half, y0, 2.0 * half, y1 - y0)
        self._text_w = (TEXT_GAP_PX + self._text_px + 2.0) * px
        reach = max(half, self._text_w)  # the text goes left of the line near the right edge
        rect = QRectF(-reach, y0, 2.0 * reach, y1 - y0)
        if rect != self._rect:
            self.prepareGeometryChange()
            self._rect = rect

    def boundingRect(self):
        return self._rect

    def shape(self):
        """The strip along the line where it is grabbed (not its text: a
        drag beside the line pans the chart, as anywhere else)."""
        path = QPainterPath()
        path.addRect(self._grab)
        return path

    def paint(self, painter, *_):
        y0, y1 = self._span
        painter.setPen(self._pens[1 if self._hover else 0])
        painter.drawLine(QLineF(0.0, y0, 0.0, y1))
        if self._text:
            top = painter.worldTransform().map(QPointF(0.0, y1))
            painter.resetTransform()
            painter.setFont(self._font)
            painter.setPen(self._text_pen)
            if self.value() + self._text_w <= self._right:
                x = top.x() + TEXT_GAP_PX
            else:  # it would run past the view's right edge: to the left of the line
                x = top.x() - TEXT_GAP_PX - self._text_px
            box = QRectF(x - 2.0, top.y(), self._text_px + 4.0, self._metrics.height())
            painter.fillRect(box, TEXT_FILL)  # curves under the text do not cross it
            painter.drawText(QPointF(x, top.y() + self._metrics.ascent()), self._text)

    # ----------------------------------------------------------- mouse
    def hoverEvent(self, ev):
        hover = (not ev.isExit()) and ev.acceptDrags(Qt.MouseButton.LeftButton)
        if hover != self._hover:
            self._hover = hover
            self.update()

    def mouseDragEvent(self, ev):
        if ev.button() != Qt.MouseButton.LeftButton:
            return
        if ev.isStart():
            self._moving = True
            self._offset = self.value() - self.mapToParent(ev.buttonDownPos()).x()
        ev.accept()
        if not self._moving:
            return
        self.setValue(self._offset + self.mapToParent(ev.pos()).x())
        self.sigDragged.emit(self)
        if ev.isFinish():
            self._moving = False
            self.sigPositionChangeFinished.emit(self)
