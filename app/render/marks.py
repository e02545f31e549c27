"""Drawing symbols painted with a QPainter: an arrow with a filled head and
the free-surface mark. Used by the diagram and its legend."""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QPointF, Qt
from PySide6.QtGui import QPen, QPolygonF

__all__ = ["draw_arrow", "draw_surface_mark"]


def draw_arrow(p, tail, head, colour, width, head_len):
    """A straight arrow from ``tail`` to ``head`` (QPointF) with a filled
    head ``head_len`` long (at most 0.6 of the arrow), in ``colour`` (QColor)."""
    dx, dy = head.x() - tail.x(), head.y() - tail.y()
    length = math.hypot(dx, dy)
    if length == 0:
        return
    ux, uy = dx / length, dy / length
    head_len = min(head_len, 0.6 * length)
    half = 0.42 * head_len
    base = QPointF(head.x() - ux * head_len, head.y() - uy * head_len)
    pen = QPen(colour, width)
    pen.setCapStyle(Qt.PenCapStyle.FlatCap)
    p.setPen(pen)
    neck = QPointF(base.x() + ux * 0.2 * head_len, base.y() + uy * 0.2 * head_len)
    p.drawLine(QLineF(tail, neck))
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(colour)
    p.drawPolygon(QPolygonF([head, QPointF(base.x() - uy * half, base.y() + ux * half),
                             QPointF(base.x() + uy * half, base.y() - ux * half)]))


def draw_surface_mark(p, apex, size, colour, width):
    """The usual free-surface mark: an open triangle standing on its apex on
    the line, and two short lines below."""
    p.setPen(QPen(colour, width))
    p.setBrush(Qt.BrushStyle.NoBrush)
    tri = QPolygonF([apex, QPointF(apex.x() - size, apex.y() - 1.5 * size),
                     QPointF(apex.x() + size, apex.y() - 1.5 * size)])
    p.drawPolygon(tri)
    for k, half in ((1, 0.75), (2, 0.4)):
        y = apex.y() + 0.5 * k * size
        p.drawLine(QLineF(apex.x() - half * size, y, apex.x() + half * size, y))
