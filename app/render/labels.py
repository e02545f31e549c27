"""Where the canvas's text labels go so they do not cover each other.

Pure Python (no Qt), in pixel coordinates with y up. Labels are placed in
order of importance (resultants, then the free surface and spill level,
then pressure values, deepest first); each one either takes a free place
or is moved or skipped. Obstacles (arrow shafts, vertex handles) are boxes
no label may cover. A few dozen labels cost well under a millisecond.
"""

from __future__ import annotations

__all__ = ["LabelLayout", "label_box", "OFFSETS"]

PAD = 2.0
"""Clear space kept between two labels [px]."""

OFFSETS = ((0, 1), (0, -1), (1, 0), (-1, 0), (0, 2), (0, -2), (1, 1), (-1, 1),
           (1, -1), (-1, -1), (2, 0), (-2, 0), (0, 3), (0, -3))
"""Steps tried, in label heights (y) and half widths (x), when a label that
must show is in the way of another."""


def label_box(x, y, width, height, anchor):
    """(x0, y0, x1, y1) of a ``width`` x ``height`` label [px] whose
    ``anchor`` point (fractions of the box from its left and top, as in
    ``pyqtgraph.TextItem``) is at (x, y), y up."""
    ax, ay = anchor
    x0 = x - ax * width
    y1 = y + ay * height
    return (x0, y1 - height, x0 + width, y1)


def _overlap(a, b, pad):
    return (a[0] < b[2] + pad and b[0] < a[2] + pad
            and a[1] < b[3] + pad and b[1] < a[3] + pad)


class LabelLayout:
    """Boxes already taken, and the placing of new labels among them."""

    def __init__(self):
        self.boxes = []
        """Boxes of the labels placed, in order."""
        self.obstacles = []
        """Boxes no label may cover (not labels themselves)."""

    def add_obstacle(self, x0, y0, x1, y1):
        """Keep labels off the box (x0, y0)-(x1, y1) [px]."""
        self.obstacles.append((min(x0, x1), min(y0, y1), max(x0, x1), max(y0, y1)))

    def is_free(self, box):
        """True if ``box`` covers no placed label and no obstacle."""
        for other in self.boxes:
            if _overlap(box, other, PAD):
                return False
        for other in self.obstacles:
            if _overlap(box, other, 0.0):
                return False
        return True

    def place(self, x, y, width, height, anchor, required=False, margin=0.0):
        """Place a label; return the (dx, dy) shift [px] it takes, or None
        if it is skipped.

        ``width`` x ``height`` is the label's whole box, anchored at (x, y);
        the ``margin`` around its text inside that box may overlap others.
        An optional label is placed only where it is free. A required one
        tries the :data:`OFFSETS` in turn and, if every place is taken, is
        placed where asked (it must show).
        """
        x0, y0, x1, y1 = label_box(x, y, width, height, anchor)
        box = (x0 + margin, y0 + margin, x1 - margin, y1 - margin)
        width, height = width - 2 * margin, height - 2 * margin
        if self.is_free(box):
            self.boxes.append(box)
            return 0.0, 0.0
        if not required:
            return None
        for kx, ky in OFFSETS:
            dx = kx * 0.5 * width
            dy = ky * (height + PAD)
            moved = (box[0] + dx, box[1] + dy, box[2] + dx, box[3] + dy)
            if self.is_free(moved):
                self.boxes.append(moved)
                return dx, dy
        self.boxes.append(box)
        return 0.0, 0.0
