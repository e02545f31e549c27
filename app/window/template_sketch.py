"""A labelled sketch of a template: its outline with a dimension line for
each of its named dimensions, so "wet well width" and "access shaft width"
are plain to see.

Which span a dimension measures is found from the template itself
(:func:`dimension_spans`): the dimension is changed a little and the pair of
vertex coordinates whose distance is the dimension and moves with it is the
span. No template needs to describe its own drawing, and a new template
gets its sketch too.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, QSize, Qt
from PySide6.QtGui import QColor, QFontMetricsF, QPainter, QPen, QPolygonF
from PySide6.QtWidgets import QSizePolicy, QWidget

from wetline.app.render.marks import draw_arrow
from wetline.app.render.style import DIMENSION, INK, LIQUID, OPEN_EDGE, part_colours, pixel_font
from wetline.core.numbers import format_entered
from wetline.core.section import OPEN, SectionError

__all__ = ["Span", "dimension_spans", "TemplateSketch"]


@dataclass(frozen=True)
class Span:
    """What one dimension of a template measures on its outline.

    Attributes
    ----------
    key, label : str
        The dimension's key and its words ("Wet well width").
    axis : int
        0: a horizontal distance (between two x), 1: a vertical one (z).
    first, second : int
        The vertices whose coordinates it spans.
    """

    key: str
    label: str
    axis: int
    first: int
    second: int


def dimension_spans(template, values=None):
    """The :class:`Span` of each dimension of ``template`` at ``values``
    (default its defaults) that measures a distance between two vertices;
    a dimension that does not (an angle ...) is left out.

    The span of a dimension is the pair of vertex coordinates (x or z)
    whose difference equals the dimension and grows by as much as the
    dimension when it grows a little.

    Examples
    --------
    >>> from wetline.core.templates import TEMPLATES
    >>> [(s.label, s.axis) for s in dimension_spans(TEMPLATES["open_tank"])]
    [('Inside width', 0), ('Wall height', 1)]
    """
    values = dict(template.defaults() if values is None else values)
    base = template.build(**values).outline
    size = float(max(np.ptp(base[:, 0]), np.ptp(base[:, 1]), 1e-12))
    spans = []
    for d in template.dimensions:
        v = values[d.key]
        moved = None
        for delta in (0.05 * v, -0.05 * v):
            try:
                moved = template.build(**{**values, d.key: v + delta}).outline
            except SectionError:
                continue
            break
        if moved is None or moved.shape != base.shape:
            continue
        tol = 1e-9 * size
        found = None
        for axis in (0, 1):
            c, m = base[:, axis], moved[:, axis]
            for i in range(len(c)):
                for j in range(len(c)):
                    if (abs(c[j] - c[i] - v) <= tol and abs(m[j] - m[i] - (v + delta)) <= tol):
                        found = Span(d.key, d.label, axis, i, j)
                        break
                if found:
                    break
            if found:
                break
        if found:
            spans.append(found)
    return spans


class TemplateSketch(QWidget):
    """The outline of a template's section with its dimensions labelled."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.setMinimumSize(420, 320)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Expanding)
        self._section = None
        self._spans = []
        self._unit = "m"
        self._factor = 1.0
        self._listed = []
        self._span_texts = []
        self.texts = []
        """The dimension texts of the sketch ("Wet well width 2.4 m"), in the
        template's order: on the outline, or listed under it."""

    def sizeHint(self):
        return QSize(460, 340)

    def show_template(self, template, values, units):
        """Sketch ``template`` at ``values`` [m] with lengths in ``units``
        (a :class:`wetline.app.model.display.DisplayChoice`); keeps the last
        sketch if the values do not build."""
        try:
            section = template.build(**values)
            spans = dimension_spans(template, values)
        except SectionError:
            return False
        self._section, self._spans = section, spans
        self._unit, self._factor = units.length_unit, float(units.length_si(1.0))
        found = {sp.key for sp in spans}
        # Dimensions that are not a span of the cavity (a wall thickness, a
        # liquid layer's thickness) are listed under the sketch.
        self._listed = [
            f"{d.label} {format_entered(values[d.key] / self._factor)} {self._unit}"
            for d in template.dimensions if d.key not in found]
        self._span_texts = [self._text(sp) for sp in spans]
        by_key = {sp.key: t for sp, t in zip(spans, self._span_texts, strict=True)}
        listed = iter(self._listed)
        self.texts = [by_key[d.key] if d.key in by_key else next(listed)
                      for d in template.dimensions]
        self.update()
        return True

    def _text(self, span):
        pts = self._section.outline
        v = abs(pts[span.second, span.axis] - pts[span.first, span.axis]) / self._factor
        return f"{span.label} {format_entered(v)} {self._unit}"

    def paintEvent(self, _event):
        p = QPainter(self)
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        p.fillRect(self.rect(), QColor("white"))
        if self._section is None:
            p.end()
            return
        s = self._section
        pts = s.outline
        font = pixel_font(12)
        fm = QFontMetricsF(font)
        texts = self._span_texts
        listed_h = len(self._listed) * fm.height()
        h_spans = [k for k, sp in enumerate(self._spans) if sp.axis == 0]
        v_spans = [k for k, sp in enumerate(self._spans) if sp.axis == 1]
        row = 2 * fm.height() + 6
        left_w = max((fm.horizontalAdvance(texts[k]) for k in v_spans), default=0) + 16
        x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
        z0, z1 = float(pts[:, 1].min()), float(pts[:, 1].max())
        mid_z = 0.5 * (z0 + z1)
        below = [k for k in h_spans if pts[self._spans[k].first, 1] <= mid_z]
        above = [k for k in h_spans if k not in below]
        area = QRectF(self.rect()).adjusted(8 + left_w, 8 + row * len(above), -8,
                                            -8 - row * len(below) - listed_h)
        scale = min(area.width() / max(x1 - x0, 1e-12), area.height() / max(z1 - z0, 1e-12))
        ox = area.center().x() - scale * 0.5 * (x0 + x1)
        oz = area.center().y() + scale * 0.5 * (z0 + z1)

        def px(x, z):
            return QPointF(ox + scale * x, oz - scale * z)

        # The cavity, its parts in their colours.
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(LIQUID))
        p.drawPolygon(QPolygonF([px(x, z) for x, z in pts.tolist()]))
        colours = part_colours(s.part_names)
        n = s.n_edges
        for i in range(n):
            j = (i + 1) % n
            pen = QPen(QColor(OPEN_EDGE if s.parts[i] == OPEN else colours[s.parts[i]]),
                       1.2 if s.parts[i] == OPEN else 3.0)
            if s.parts[i] == OPEN:
                pen.setStyle(Qt.PenStyle.DashLine)
            p.setPen(pen)
            p.drawLine(QLineF(px(*pts[i]), px(*pts[j])))
        # Dimension lines: widths below or above, heights to the left.
        p.setFont(font)
        colour = QColor(DIMENSION)
        ext = QPen(colour, 0.8)
        ext.setStyle(Qt.PenStyle.DotLine)
        for rank, k in enumerate(below):
            self._horizontal(p, px, self._spans[k], texts[k], area.bottom() + row * rank + 8,
                             colour, ext, fm, 1)
        for rank, k in enumerate(above):
            self._horizontal(p, px, self._spans[k], texts[k], area.top() - row * rank - 8,
                             colour, ext, fm, -1)
        # Heights in a chain left of the outline; one that overlaps another
        # of the chain goes a step further left.
        columns = []
        for k in v_spans:
            sp = self._spans[k]
            lo, hi = sorted((pts[sp.first, 1], pts[sp.second, 1]))
            col = 0
            while any(c == col and lo < h2 and l2 < hi for c, l2, h2 in columns):
                col += 1
            columns.append((col, lo, hi))
            self._vertical(p, px, sp, texts[k], area.left() - 8 - 14 * col, colour, ext, fm)
        p.setPen(QColor(INK))
        for rank, text in enumerate(self._listed):
            y = self.height() - 6 - (len(self._listed) - rank) * fm.height()
            p.drawText(QRectF(8, y, self.width() - 16, fm.height()),
                       int(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter), text)
        p.end()

    def _horizontal(self, p, px, span, text, y, colour, ext, fm, side):
        pts = self._section.outline
        a, b = pts[span.first], pts[span.second]
        pa, pb = px(*a), px(*b)
        p.setPen(ext)
        p.drawLine(QLineF(pa.x(), pa.y(), pa.x(), y))
        p.drawLine(QLineF(pb.x(), pb.y(), pb.x(), y))
        mid = QPointF(0.5 * (pa.x() + pb.x()), y)
        draw_arrow(p, mid, QPointF(pa.x(), y), colour, 1.0, 7)
        draw_arrow(p, mid, QPointF(pb.x(), y), colour, 1.0, 7)
        w = fm.horizontalAdvance(text) + 6
        top = y + 2 if side > 0 else y - fm.height() - 2
        box = QRectF(mid.x() - w / 2, top, w, fm.height())
        box.moveLeft(min(max(box.left(), 2.0), self.width() - w - 2))
        p.fillRect(box, QColor("white"))
        p.setPen(QColor(INK))
        p.drawText(box, int(Qt.AlignmentFlag.AlignCenter), text)

    def _vertical(self, p, px, span, text, x, colour, ext, fm):
        pts = self._section.outline
        a, b = pts[span.first], pts[span.second]
        pa, pb = px(*a), px(*b)
        p.setPen(ext)
        p.drawLine(QLineF(pa.x(), pa.y(), x, pa.y()))
        p.drawLine(QLineF(pb.x(), pb.y(), x, pb.y()))
        mid = QPointF(x, 0.5 * (pa.y() + pb.y()))
        if abs(pa.y() - pb.y()) > 16:
            draw_arrow(p, mid, QPointF(x, pa.y()), colour, 1.0, 7)
            draw_arrow(p, mid, QPointF(x, pb.y()), colour, 1.0, 7)
        p.setPen(QColor(INK))
        w = fm.horizontalAdvance(text) + 4
        p.drawText(QRectF(x - w - 4, mid.y() - fm.height() / 2, w, fm.height()),
                   int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter), text)

