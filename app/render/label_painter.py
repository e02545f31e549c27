"""Labels of the exported diagram, placed by the one layout engine
(:class:`wetline.app.render.labels.LabelLayout`) and painted with a QPainter.

A label asks for a place next to an anchor: candidate (anchor, direction,
gap) triples in order of preference become boxes of the label's measured
size; the layout takes the first free one. Pixel coordinates of the page,
y down.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from PySide6.QtCore import QRectF, Qt
from PySide6.QtGui import QColor, QFont, QFontMetricsF, QPen

from wetline.app.render.labels import LabelLayout
from wetline.app.render.style import HCENTER, VCENTER

__all__ = ["Label", "LabelPainter"]


@dataclass
class Label:
    """A label's text, font, colour and optional frame colour."""

    text: str
    font: QFont
    colour: str
    frame: str | None = None


def _rect(box):
    return QRectF(box[0], box[1], box[2] - box[0], box[3] - box[1])


def _box(rect):
    return (rect.left(), rect.top(), rect.right(), rect.bottom())


class LabelPainter:
    """Places and paints the labels of one drawing area.

    Parameters
    ----------
    bounds : QRectF
        Labels stay inside it [px].
    pad : float
        Padding around a label's text [px]; the grid cell of the layout is a
        dozen of them.
    """

    def __init__(self, bounds, pad):
        self.bounds = bounds
        self.pad = pad
        self.layout = LabelLayout(bounds=_box(bounds), pad=0.0, cell=max(12.0 * pad, 8.0))

    def avoid_lines(self, rows):
        """Keep labels off these pixel segments where they can: rows
        (x0, y0, x1, y1)."""
        self.layout.add_lines(rows)

    def reserve(self, rect):
        """Keep labels off ``rect`` (an arrow, a mark); returns the handle to
        pass as ``ignore`` (or None if it is off the drawing)."""
        return self.layout.add_obstacle(*_box(rect))

    def rect_for(self, label, anchor, direction, gap):
        """The label's box beside ``anchor`` (QPointF), ``gap`` [px] away
        along ``direction`` (dx, dy)."""
        fm = QFontMetricsF(label.font)
        w = fm.horizontalAdvance(label.text) + 2 * self.pad
        h = fm.height() + 0.6 * self.pad
        dx, dy = direction
        n = math.hypot(dx, dy)
        dx, dy = (dx / n, dy / n) if n > 0 else (0.0, -1.0)
        reach = gap + 0.5 * (abs(dx) * w + abs(dy) * h)
        cx, cy = anchor.x() + dx * reach, anchor.y() + dy * reach
        return QRectF(cx - w / 2, cy - h / 2, w, h)

    def place(self, p, label, candidates, force=False, ignore=None, unique_within=0.0):
        """Draw ``label`` at the first free candidate (anchor, direction,
        gap): off the outline if possible, else across it; if none is free,
        at the first when ``force``. ``ignore``: a reserved box the label
        may overlap (its own arrow). ``unique_within`` [px]: left out if the
        same text is already written that near the first anchor. Returns the
        QRectF taken, or None."""
        if not candidates:
            return None
        if unique_within > 0:
            a = candidates[0][0]
            if self.layout.seen_near(label.text, a.x(), a.y(), unique_within):
                return None
        boxes = [_box(self.rect_for(label, a, d, g)) for a, d, g in candidates]
        box = self.layout.place(boxes, required=force, ignore=ignore, key=label.text)
        if box is None:
            return None
        rect = _rect(box)
        self.draw_label(p, label, rect)
        return rect

    def draw_label(self, p, label, rect):
        """Paint ``label`` in ``rect``: its text on a white rounded box."""
        p.save()
        if label.frame:
            p.setPen(QPen(QColor(label.frame), max(1.0, self.pad / 3)))
        else:
            p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(255, 255, 255, 225))
        radius = 0.35 * self.pad
        p.drawRoundedRect(rect, radius, radius)
        p.setFont(label.font)
        p.setPen(QColor(label.colour))
        p.drawText(rect, HCENTER | VCENTER, label.text)
        p.restore()
