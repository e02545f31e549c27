"""The canvas's text labels: asked for in order of importance while the
loads are drawn, laid out in pixels by the one layout engine
(:class:`wetline.app.render.labels.LabelLayout`) and shown with a small pool
of :class:`LabelItem` (a text in a box, drawn with ``QPainter.drawText``).

The most important are asked for first (each part's total, largest first;
the runs of parts loaded on several runs; the free surface and spill level;
pressure values, deepest first). A label that would cover another, a
resultant's shaft or (on small outlines) a vertex handle steps aside if it
must show, or is left out; no label reaches past the edge of the view (it
would be cut). The layout is made again when the view zooms or pans, since
it is in pixels. Its work per label is bounded: arrows and handles off the
view are clipped or dropped, so a vertex dragged a million sizes away costs
no more than one near by.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import QRectF, Qt, QTimer
from PySide6.QtGui import QFont, QFontMetricsF, QPainter
from PySide6.QtWidgets import QGraphicsItem

from wetline.app.model.step_timer import span
from wetline.app.render.labels import LabelLayout

__all__ = ["CanvasLabels", "LabelItem", "LABEL_MARGIN", "MAX_HANDLE_OBSTACLES", "SAME_VALUE_PX",
           "SHAFT_CLEARANCE", "VIEW_EDGE", "NEAR_OFFSETS"]

MAX_HANDLE_OBSTACLES = 120
"""Up to this many vertices, labels keep off the vertex handles."""
LABEL_MARGIN = 4.0
"""The margin of a label's box around its text [px]."""
LABEL_FILL = pg.mkBrush(255, 255, 255, 170)
"""Behind each label, so lines under it do not cross its text."""
SAME_VALUE_PX = 150.0
"""A pressure value already labelled this near [px] is not labelled again."""
SHAFT_CLEARANCE = 4.0
"""Labels keep this far [px] off a resultant's shaft."""
NEAR_OFFSETS = 10
"""Places a label asked ``near`` tries beside its own (within its height)."""
VIEW_EDGE = 2.0
"""Labels keep this far [px] inside the view's edge."""
_SIZE_CACHE = 2000
"""Text sizes kept before the cache starts again."""


class LabelItem(QGraphicsItem):
    """One label: a text in a translucent box of :data:`LABEL_MARGIN` around
    it, in screen pixels whatever the zoom (``ItemIgnoresTransformations``),
    placed by an anchor as ``pyqtgraph.TextItem`` is ((0, 0) its top left
    at the position, (1, 1) its bottom right).

    A new text costs one width from cached font metrics and a repaint of the
    box: a live step changes most labels' texts, and a text document laid
    out again for each (``pyqtgraph.TextItem``) was the dearest part of the
    labels.
    """

    def __init__(self, fonts):
        super().__init__()
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemIgnoresTransformations)
        self.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        self._fonts = fonts  # (regular, bold): (QFont, QFontMetricsF) each
        self._text = ""
        self._pen = pg.mkColor("k")
        self.bold = False
        self.anchor = (0.0, 0.0)
        self._size = (2 * LABEL_MARGIN, 2 * LABEL_MARGIN)
        self._rect = QRectF(0.0, 0.0, *self._size)
        self._key = None  # (text, colour, bold) and place, kept by CanvasLabels
        self._pos = None

    def set_label(self, text, colour, bold, size):
        """Show ``text`` in ``colour`` (anything ``pyqtgraph.mkColor`` takes),
        demi-bold if ``bold``, in a box of ``size`` (width, height) [px]
        (:meth:`CanvasLabels._text_size`, the size the layout placed)."""
        self._text, self.bold = text, bool(bold)
        self._pen = pg.mkColor(colour)
        self._size = size
        self._place_box()

    def set_anchor(self, anchor):
        """The anchor (ax, ay), fractions of the box's width and height."""
        self.anchor = (float(anchor[0]), float(anchor[1]))
        self._place_box()

    def _place_box(self):
        self.prepareGeometryChange()
        w, h = self._size
        self._rect = QRectF(-self.anchor[0] * w, -self.anchor[1] * h, w, h)
        self.update()

    def toPlainText(self):
        """The text shown."""
        return self._text

    def box_in_scene(self):
        """The box (text and margin) in scene coordinates (QRectF): its
        pixels offset from the anchor's place (a pyqtgraph view's scene is
        in the view's pixels; ``mapRectToScene`` would apply the data
        transform this item ignores)."""
        return self._rect.translated(self.scenePos())

    def boundingRect(self):
        return self._rect

    def paint(self, painter, option, widget=None):
        painter.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        painter.setPen(Qt.PenStyle.NoPen)
        painter.setBrush(LABEL_FILL)
        painter.drawRect(self._rect)
        painter.setFont(self._fonts[1 if self.bold else 0][0])
        painter.setPen(self._pen)
        text = self._rect.adjusted(LABEL_MARGIN, LABEL_MARGIN, -LABEL_MARGIN, -LABEL_MARGIN)
        painter.drawText(text, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop,
                         self._text)


class CanvasLabels:
    """The labels of one view box.

    Attributes
    ----------
    requests : list
        The labels asked for since :meth:`clear`, in order of importance.
    items : list of LabelItem
        The pool; the first :attr:`used` show labels.
    layout : LabelLayout
        The last layout (pixels, y up).
    px : (float, float)
        Metres per pixel in x and z at the last layout.
    """

    def __init__(self, viewbox, parent):
        self._vb = viewbox
        self.requests = []
        self.items = []
        self.used = 0
        self.layout = LabelLayout()
        self.px = (1e-9, 1e-9)
        self._shafts = []
        self._handles = np.empty((0, 2))
        self.view_obstacles = lambda: ()
        self.more_handles = lambda: np.empty((0, 2))
        """Further vertex handles the labels keep off ((M, 2) [m]): the
        structure's, where there is one."""
        """Boxes (x0, z0, x1, z1) [m] labels keep off whatever is drawn: the
        legend over the view (set by the canvas)."""
        self._sizes = {}
        regular = QFont()
        strong = QFont(regular)
        strong.setWeight(QFont.Weight.DemiBold)
        self._fonts = ((regular, QFontMetricsF(regular)), (strong, QFontMetricsF(strong)))
        self._timer = QTimer(parent)
        self._timer.setSingleShot(True)
        self._timer.setInterval(0)
        self._timer.timeout.connect(self.lay_out)
        viewbox.sigRangeChanged.connect(self._on_rangeChanged)

    # ------------------------------------------------------- requests
    def clear(self, outline):
        """Start a new set of labels for a drawing of ``outline`` ((N, 2) [m],
        whose vertex handles the labels keep off on small outlines)."""
        self.requests = []
        self._shafts = []
        more = np.asarray(self.more_handles(), dtype=np.float64).reshape(-1, 2)
        handles = np.concatenate([np.asarray(outline, dtype=np.float64).reshape(-1, 2), more])
        self._handles = handles if len(handles) <= MAX_HANDLE_OBSTACLES else np.empty((0, 2))

    def keep_off_shaft(self, x0, z0, x1, z1):
        """Keep labels off the arrow shaft (x0, z0)-(x1, z1) [m]."""
        self._shafts.append((x0, z0, x1, z1))

    def ask(self, x, z, text, colour, anchor, bold=False, optional=False, once=False,
            near=False):
        """Ask for ``text`` at (x, z) [m], in order of importance: shown
        unless (``optional``) the place is taken; a label that must show
        steps aside instead (``near``: only close by, else it is left out).
        ``once``: not shown if the same text is already shown nearby.
        ``anchor`` as for ``pyqtgraph.TextItem``."""
        self.requests.append((x, z, text, colour, anchor, bold, optional, once, near))

    def _on_rangeChanged(self, *_):
        if self.requests:
            self._timer.start()

    # --------------------------------------------------------- layout
    def lay_out(self):
        """Place the labels asked for at the current zoom (pixel sizes)."""
        with span("label layout"):
            self._lay_out()

    def _lay_out(self):
        self._timer.stop()
        vb = self._vb
        px = vb.viewPixelSize()
        self.px = (px[0] or 1e-9, px[1] or 1e-9)
        sx, sz = self.px
        # Labels stay inside the view (a label past its edge is cut);
        # obstacles and arrows off the view are dropped or clipped.
        (x0, x1), (z0, z1) = vb.viewRange()
        e = VIEW_EDGE
        self.layout = LabelLayout(bounds=(x0 / sx + e, z0 / sz + e, x1 / sx - e, z1 / sz - e))
        v = np.asarray(self._handles, dtype=np.float64).reshape(-1, 2) / self.px
        self.layout.add_obstacles(np.column_stack([v - 5.0, v + 5.0]))
        for a, b, c, d in self.view_obstacles():
            self.layout.add_obstacle(a / sx, b / sz, c / sx, d / sz)
        for a, b, c, d in self._shafts:
            self.layout.add_line(a / sx, b / sz, c / sx, d / sz, clearance=SHAFT_CLEARANCE,
                                 soft=False)
        placed = []
        for x, z, text, colour, anchor, bold, optional, once, near in self.requests:
            if once and self.layout.seen_near(text, x / sx, z / sz, SAME_VALUE_PX):
                continue
            shift = self._place(x, z, text, bold, anchor, optional, near)
            if shift is not None:
                placed.append(((text, colour, bold), anchor,
                               (x + shift[0] * sx, z + shift[1] * sz)))
        self._show(placed)

    def _show(self, placed):
        """Show the labels ``placed`` ((text, colour, bold), anchor, (x, z)
        [m]) with the pool's items: an item that showed the same text
        before shows it again (a text set again lays its document out
        again, the dearest part of a label), and an item is moved or
        re-anchored only if its place changed."""
        by_key = {}
        for item in reversed(self.items):  # (popped in the pool's order)
            by_key.setdefault(item._key, []).append(item)
        order = [None] * len(placed)
        for k, (key, _, _) in enumerate(placed):
            same = by_key.get(key)
            if same:
                order[k] = same.pop()
        taken = {id(item) for item in order if item is not None}
        spare = iter([item for item in self.items if id(item) not in taken])
        shown = []
        for k, (key, anchor, pos) in enumerate(placed):
            item = order[k]
            if item is None:
                item = next(spare, None)
                if item is None:
                    item = self._new_item()
            self._set(item, key, anchor, pos)
            shown.append(item)
        ids = {id(item) for item in shown}
        rest = [item for item in self.items if id(item) not in ids]
        for item in rest:
            if item.isVisible():
                item.hide()
        self.items = shown + rest  # the first `used` show labels, in the order placed
        self.used = len(shown)

    def _text_size(self, text, bold):
        """(width, height) [px] of a label's box (text plus margin), cached
        by text."""
        key = (text, bold)
        size = self._sizes.get(key)
        if size is None:
            fm = self._fonts[1 if bold else 0][1]
            size = (fm.horizontalAdvance(text) + 2 * LABEL_MARGIN,
                    fm.height() + 2 * LABEL_MARGIN)
            if len(self._sizes) > _SIZE_CACHE:
                self._sizes.clear()
            self._sizes[key] = size
        return size

    def _place(self, x, z, text, bold, anchor, optional, near=False):
        """The (dx, dy) shift [px] the label takes, or None if left out."""
        width, height = self._text_size(text, bold)
        return self.layout.place_anchored(x / self.px[0], z / self.px[1], width, height,
                                          anchor, required=not optional, margin=LABEL_MARGIN,
                                          key=text, offsets=NEAR_OFFSETS if near else None)

    def _set(self, item, key, anchor, pos):
        """``item`` showing ``key`` (text, colour, bold) anchored at ``pos``."""
        if item._key != key:
            item._key = key
            text, colour, bold = key
            item.set_label(text, colour, bold, self._text_size(text, bold))
        anchor = tuple(anchor)
        if item.anchor != anchor:
            item.set_anchor(anchor)
        if item._pos != pos:
            item._pos = pos
            item.setPos(*pos)
        if not item.isVisible():
            item.show()

    def _new_item(self):
        """A new label for the pool."""
        item = LabelItem(self._fonts)
        item.setZValue(35)
        self._vb.addItem(item, ignoreBounds=True)
        self.items.append(item)
        return item

    # ---------------------------------------------------------- reading
    def shown(self):
        """Text of the labels shown, in the order placed."""
        return [item.toPlainText() for item in self.items[:self.used]]

    def boxes(self):
        """Pixel boxes (x0, y0, x1, y1, y up) of the placed labels' text."""
        return list(self.layout.boxes)
