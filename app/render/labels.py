"""Where text labels go so they do not cover each other: the one layout
engine of the live canvas and the exported diagram.

Pure Python (no Qt), in pixel coordinates; a box is ``(x0, y0, x1, y1)``
with ``x0 <= x1`` and ``y0 <= y1`` (y up on the canvas, down in an image:
the engine does not care). Labels are placed in order of importance (the
caller asks for resultants first, then the free surface and spill level,
then pressure values, deepest first); each takes the first free place among
its candidates (a label that must show is offered many more), or is left
out: no two labels ever overlap, and none leaves the bounds.

What a label keeps off:

- other labels, with :attr:`LabelLayout.pad` between them;
- obstacles: boxes no label may cover (arrow heads, vertex handles), and
  thick lines (arrow shafts);
- lines it avoids when it can (the outline, the free surface): a label
  crosses one only if no candidate place is clear of it.

The work per label is bounded, however large or odd the drawing: at most
:data:`MAX_CANDIDATES` candidate places are tried; items are kept in a
spatial grid of cells, so a test looks only at the items in the cells a
candidate covers; a cell holding more than :data:`MAX_PER_CELL` items counts
as full (no label goes there, or only across the lines that fill it); an
item covering more than :data:`MAX_CELLS` cells is kept in a short list of
at most :data:`MAX_WIDE` items that every test looks at; lines and
obstacles are clipped to the layout's bounds, and at most :data:`MAX_ITEMS`
are kept. :attr:`LabelLayout.box_tests` counts the item tests made, so a
test can check the bound.
"""

from __future__ import annotations

import math

import numpy as np

__all__ = ["LabelLayout", "label_box", "OFFSETS", "PAD", "MAX_CANDIDATES", "MAX_PER_CELL",
           "MAX_CELLS", "MAX_WIDE", "MAX_ITEMS", "MAX_LABELS"]

PAD = 2.0
"""Clear space kept between two labels [px] (by default)."""

OFFSETS = ((0, 1), (0, -1), (1, 0), (-1, 0), (0, 2), (0, -2), (1, 1), (-1, 1),
           (1, -1), (-1, -1), (2, 0), (-2, 0), (0, 3), (0, -3), (2, 1), (-2, 1),
           (2, -1), (-2, -1), (1, 2), (-1, 2), (1, -2), (-1, -2), (0, 4))
"""Steps tried by :meth:`LabelLayout.place_anchored`, in label heights (y)
and half widths (x), when a label that must show is in the way of another."""

MAX_CANDIDATES = 24
"""Candidate places tried per label at most."""
MAX_PER_CELL = 48
"""Items a grid cell holds before it counts as full."""
MAX_CELLS = 64
"""Grid cells an item may cover before it goes on the short list of wide items."""
MAX_WIDE = 256
"""Wide items kept at most (more are ignored)."""
MAX_ITEMS = 20000
"""Obstacles and lines kept at most (more are ignored)."""
MAX_LABELS = 400
"""Labels placed at most; any later label is left out."""


def label_box(x, y, width, height, anchor):
    """(x0, y0, x1, y1) of a ``width`` x ``height`` label [px] whose
    ``anchor`` point (fractions of the box from its left and top, as in
    ``pyqtgraph.TextItem``) is at (x, y), y up."""
    ax, ay = anchor
    x0 = x - ax * width
    y1 = y + ay * height
    return (x0, y1 - height, x0 + width, y1)


def _boxes_overlap(a, b, pad):
    return (a[0] < b[2] + pad and b[0] < a[2] + pad
            and a[1] < b[3] + pad and b[1] < a[3] + pad)


def _segment_hits_box(seg, box):
    """True if the segment (x0, y0, x1, y1, clearance) comes within its
    clearance of ``box`` (separating axes: x, y and the segment's normal)."""
    x0, y0, x1, y1, r = seg
    left, bottom, right, top = box[0] - r, box[1] - r, box[2] + r, box[3] + r
    if max(x0, x1) < left or min(x0, x1) > right or max(y0, y1) < bottom or min(y0, y1) > top:
        return False
    dx, dy = x1 - x0, y1 - y0
    sides = [dx * (cy - y0) - dy * (cx - x0)
             for cx, cy in ((left, bottom), (right, bottom), (right, top), (left, top))]
    return min(sides) <= 0.0 <= max(sides)


def _clip_segment(seg, bounds):
    """The part of a segment inside ``bounds`` (Liang-Barsky), or None."""
    x0, y0, x1, y1, r = seg
    bx0, by0, bx1, by1 = bounds[0] - r, bounds[1] - r, bounds[2] + r, bounds[3] + r
    dx, dy = x1 - x0, y1 - y0
    t0, t1 = 0.0, 1.0
    for p, q in ((-dx, x0 - bx0), (dx, bx1 - x0), (-dy, y0 - by0), (dy, by1 - y0)):
        if p == 0:
            if q < 0:
                return None
            continue
        t = q / p
        if p < 0:
            t0 = max(t0, t)
        else:
            t1 = min(t1, t)
        if t0 > t1:
            return None
    return (x0 + t0 * dx, y0 + t0 * dy, x0 + t1 * dx, y0 + t1 * dy, r)


class LabelLayout:
    """Labels placed so far, the things they keep off, and the placing of new ones.

    Parameters
    ----------
    bounds : (x0, y0, x1, y1), optional
        A label must lie inside these [px]; obstacles and lines outside them
        are dropped, and lines are clipped to them.
    pad : float
        Clear space between two labels [px].
    cell : float
        Side of a grid cell [px]; about the height of a few labels.
    """

    def __init__(self, bounds=None, pad=PAD, cell=64.0):
        self.bounds = None if bounds is None else tuple(float(v) for v in bounds)
        self.pad = float(pad)
        self.cell = float(cell) if cell > 0 else 64.0
        self.boxes = []
        """Boxes of the labels placed, in order."""
        self.obstacles = []
        """Boxes no label may cover (not labels themselves)."""
        self.box_tests = 0
        """Item tests made so far (the work done, bounded per label)."""
        self.candidates_tried = 0
        """Candidate places looked at so far."""
        self._items = []  # (kind, data): "label" box, "obstacle" box, "line"/"thick" segment
        self._grid = {}
        self._full = {}  # cell -> True if full of obstacles, False if of soft lines
        self._wide = []
        self._kept = 0
        self._placed = []  # (key, x, y) of labels placed with a key
        self.dropped = []
        """Keys (or None) of the labels that had to show but found no free
        place, so were left out rather than laid over another."""

    # ----------------------------------------------------------- grid
    def _cells(self, box):
        c = self.cell
        i0, i1 = math.floor(box[0] / c), math.floor(box[2] / c)
        j0, j1 = math.floor(box[1] / c), math.floor(box[3] / c)
        return i0, i1, j0, j1

    def _insert(self, kind, data, box):
        self._insert_cells(kind, data, *self._cells(box))

    def _insert_cells(self, kind, data, i0, i1, j0, j1):
        k = len(self._items)
        self._items.append((kind, data))
        if (i1 - i0 + 1) * (j1 - j0 + 1) > MAX_CELLS:
            if len(self._wide) < MAX_WIDE or kind == "label":
                self._wide.append(k)
            return
        for i in range(i0, i1 + 1):
            for j in range(j0, j1 + 1):
                cell = self._grid.setdefault((i, j), [])
                if len(cell) >= MAX_PER_CELL and kind != "label":
                    self._full[i, j] = self._full.get((i, j), False) or kind != "line"
                else:
                    cell.append(k)

    def _inside(self, box):
        b = self.bounds
        return b is None or (b[0] <= box[0] and b[1] <= box[1] and box[2] <= b[2]
                             and box[3] <= b[3])

    # ------------------------------------------------------ obstacles
    def add_obstacle(self, x0, y0, x1, y1):
        """Keep labels off the box (x0, y0)-(x1, y1) [px]. Returns the box
        (to pass as ``ignore``), or None if it is outside the bounds or the
        layout holds :data:`MAX_ITEMS` already."""
        box = (min(x0, x1), min(y0, y1), max(x0, x1), max(y0, y1))
        if self._kept >= MAX_ITEMS:
            return None
        b = self.bounds
        if b is not None and not _boxes_overlap(box, b, 0.0):
            return None
        self._kept += 1
        self.obstacles.append(box)
        self._insert("obstacle", box, box)
        return box

    def add_obstacles(self, boxes):
        """:meth:`add_obstacle` for each row (x0, y0, x1, y1) of ``boxes``
        [px] (the vertex handles of an outline in one call); the same as
        adding them one by one."""
        rows = np.asarray(boxes, dtype=np.float64).reshape(-1, 4)
        if not len(rows):
            return
        lo = np.minimum(rows[:, :2], rows[:, 2:])
        hi = np.maximum(rows[:, :2], rows[:, 2:])
        keep = np.isfinite(rows).all(axis=1)
        b = self.bounds
        if b is not None:  # as _boxes_overlap(box, bounds, 0.0)
            keep &= (lo[:, 0] < b[2]) & (b[0] < hi[:, 0]) & (lo[:, 1] < b[3]) & (b[1] < hi[:, 1])
        lo, hi = lo[keep], hi[keep]
        room = max(MAX_ITEMS - self._kept, 0)
        lo, hi = lo[:room], hi[:room]
        self._kept += len(lo)
        c = self.cell
        cells = np.floor(np.column_stack([lo[:, 0], hi[:, 0], lo[:, 1], hi[:, 1]]) / c)
        for (a, e, f, g), (i0, i1, j0, j1) in zip(np.column_stack([lo, hi]).tolist(),
                                                  cells.astype(np.int64).tolist(), strict=True):
            box = (a, e, f, g)
            self.obstacles.append(box)
            self._insert_cells("obstacle", box, i0, i1, j0, j1)

    def add_line(self, x0, y0, x1, y1, clearance=0.0, soft=True):
        """Keep labels off the segment (x0, y0)-(x1, y1) [px]: within
        ``clearance`` [px] of it. A ``soft`` line (the outline) is crossed
        when no candidate is clear of it; a hard one (an arrow shaft) never.
        Returns False if the segment is outside the bounds or not kept."""
        seg = (float(x0), float(y0), float(x1), float(y1), float(clearance))
        if not all(math.isfinite(v) for v in seg) or self._kept >= MAX_ITEMS:
            return False
        if self.bounds is not None:
            seg = _clip_segment(seg, self.bounds)
            if seg is None:
                return False
        self._kept += 1
        r = seg[4]
        box = (min(seg[0], seg[2]) - r, min(seg[1], seg[3]) - r,
               max(seg[0], seg[2]) + r, max(seg[1], seg[3]) + r)
        self._insert("line" if soft else "thick", seg, box)
        return True

    def add_lines(self, rows, clearance=0.0, soft=True):
        """:meth:`add_line` for each row (x0, y0, x1, y1) of ``rows`` (an
        outline of ten thousand edges in one call)."""
        rows = np.asarray(rows, dtype=np.float64).reshape(-1, 4)
        rows = rows[np.isfinite(rows).all(axis=1)]
        r = float(clearance)
        lo = np.minimum(rows[:, :2], rows[:, 2:]) - r
        hi = np.maximum(rows[:, :2], rows[:, 2:]) + r
        if self.bounds is not None:
            b = self.bounds
            inside = ((lo[:, 0] >= b[0]) & (lo[:, 1] >= b[1]) & (hi[:, 0] <= b[2])
                      & (hi[:, 1] <= b[3]))
            for row in rows[~inside]:  # the few that cross the bounds: clipped
                self.add_line(*row, clearance=r, soft=soft)
            rows, lo, hi = rows[inside], lo[inside], hi[inside]
        room = max(MAX_ITEMS - self._kept, 0)
        rows, lo, hi = rows[:room], lo[:room], hi[:room]
        self._kept += len(rows)
        c = self.cell
        cells = np.column_stack([np.floor(lo[:, 0] / c), np.floor(hi[:, 0] / c),
                                 np.floor(lo[:, 1] / c), np.floor(hi[:, 1] / c)]).astype(np.int64)
        kind = "line" if soft else "thick"
        for row, (i0, i1, j0, j1) in zip(rows.tolist(), cells.tolist(), strict=True):
            self._insert_cells(kind, (*row, r), i0, i1, j0, j1)

    # --------------------------------------------------------- tests
    def is_free(self, box, ignore=None, lines=True):
        """True if ``box`` lies in the bounds, covers no placed label (with
        the pad) and no obstacle other than ``ignore``, and (if ``lines``)
        crosses no soft line."""
        if not self._inside(box):
            return False
        p = self.pad
        i0, i1, j0, j1 = self._cells((box[0] - p, box[1] - p, box[2] + p, box[3] + p))
        if (i1 - i0 + 1) * (j1 - j0 + 1) > MAX_CELLS:
            return False  # a label larger than the grid is meant for
        seen = set()
        for i in range(i0, i1 + 1):
            for j in range(j0, j1 + 1):
                full = self._full.get((i, j))
                if full or (full is not None and lines):
                    return False
                for k in self._grid.get((i, j), ()):
                    if k not in seen:
                        seen.add(k)
                        if self._hits(k, box, ignore, lines):
                            return False
        for k in self._wide:
            if k not in seen and self._hits(k, box, ignore, lines):
                return False
        return True

    def _hits(self, k, box, ignore, lines):
        self.box_tests += 1
        kind, data = self._items[k]
        if kind == "label":
            return _boxes_overlap(box, data, self.pad)
        if kind == "obstacle":
            return data is not ignore and _boxes_overlap(box, data, 0.0)
        if kind == "line" and not lines:
            return False
        return _segment_hits_box(data, box)

    # -------------------------------------------------------- placing
    def _take(self, box, key=None):
        self.boxes.append(box)
        self._insert("label", box, box)
        if key is not None:
            self._placed.append((key, 0.5 * (box[0] + box[2]), 0.5 * (box[1] + box[3])))
        return box

    def seen_near(self, key, x, y, radius):
        """True if a label placed with ``key`` has its centre within
        ``radius`` [px] of (x, y) (the same value written close by)."""
        r2 = radius * radius
        return any(k == key and (a - x) ** 2 + (b - y) ** 2 < r2 for k, a, b in self._placed)

    def place(self, candidates, required=False, ignore=None, key=None):
        """Take the first free box of ``candidates`` (at most
        :data:`MAX_CANDIDATES` are tried): clear of the soft lines if one
        is, else crossing them. If none is free the label is left out: a
        ``required`` one is recorded in :attr:`dropped`. A label never
        covers another, an obstacle, or the edge of the bounds.

        Parameters
        ----------
        candidates : sequence of (x0, y0, x1, y1)
            Places in order of preference [px].
        required : bool
            The label should show: recorded in :attr:`dropped` if it cannot.
        ignore : box, optional
            An obstacle (from :meth:`add_obstacle`) the label may cover: its
            own arrow.
        key : hashable, optional
            Recorded with the label for :meth:`seen_near`.

        Returns
        -------
        tuple or None
            The box taken, or None if the label is left out.
        """
        boxes = list(candidates[:MAX_CANDIDATES])
        if not boxes:
            return None
        if len(self.boxes) < MAX_LABELS:
            for lines in (True, False):
                for box in boxes:
                    self.candidates_tried += 1
                    if self.is_free(box, ignore, lines):
                        return self._take(box, key)
        if required:
            self.dropped.append(key)
        return None

    def place_anchored(self, x, y, width, height, anchor, required=False, margin=0.0,
                       key=None, offsets=None):
        """Place a label anchored at (x, y) [px, y up]; return the (dx, dy)
        shift [px] it takes, or None if it is skipped.

        ``width`` x ``height`` is the label's whole box (see
        :func:`label_box`); the ``margin`` around its text inside that box
        may overlap others. An optional label is placed only where asked
        and only if that is free; a required one tries the :data:`OFFSETS`
        in turn and, if every place is taken, is left out (and recorded in
        :attr:`dropped`).
        ``key`` is recorded for :meth:`seen_near` with the anchor (x, y).
        ``offsets``: how many of the :data:`OFFSETS` a required label tries
        (default all; the first ten stay within a label's height and half
        its width of the place asked).
        """
        x0, y0, x1, y1 = label_box(x, y, width, height, anchor)
        box = (x0 + margin, y0 + margin, x1 - margin, y1 - margin)
        candidates = [box]
        if required:
            w, h = width - 2 * margin, height - 2 * margin
            candidates += [(box[0] + kx * 0.5 * w, box[1] + ky * (h + self.pad),
                            box[2] + kx * 0.5 * w, box[3] + ky * (h + self.pad))
                           for kx, ky in OFFSETS[:offsets]]
        taken = self.place(candidates, required=required)
        if taken is None:
            return None
        if key is not None:
            self._placed.append((key, x, y))
        return taken[0] - box[0], taken[1] - box[1]
