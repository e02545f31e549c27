"""Blocks of text for a drawing's title block: a title, headings, label-value
rows, notes, a small table, the legend and the caution box.

Each block measures its height for a column width and draws itself there
with a QPainter, in the pixel fonts of :class:`wetline.app.render.style.Fonts`;
:mod:`wetline.app.render.title_block` flows them into columns.
"""

from __future__ import annotations

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFontMetricsF, QPen, QPolygonF

from wetline.app.render.marks import draw_arrow, draw_surface_mark
from wetline.app.render.style import (
    AIR_FILL,
    DIAGRAM_FILL,
    DIAGRAM_LINE,
    GROUNDWATER_FILL,
    HCENTER,
    INK,
    LAYER_TINTS,
    LEFT,
    LIQUID,
    LOAD,
    MUTED,
    RIGHT,
    RULE,
    STRUCTURE_FILL,
    SURFACE,
    TOP,
    VCENTER,
    WRAP,
)

__all__ = ["Block", "Title", "Heading", "Rows", "Note", "Table", "Legend", "Caution", "Space",
           "text_height"]


def text_height(font, width, text):
    """Height [px] of ``text`` in ``font`` wrapped at ``width``."""
    fm = QFontMetricsF(font)
    r = fm.boundingRect(QRectF(0, 0, max(width, 1.0), 1e7), LEFT | TOP | WRAP, text)
    return r.height()


class Block:
    """A piece of the title block: measure(width) -> height, draw(...)."""

    def measure(self, fonts, width):  # pragma: no cover - interface
        raise NotImplementedError

    def draw(self, p, fonts, x, y, width):  # pragma: no cover - interface
        raise NotImplementedError


class Title(Block):
    def __init__(self, title, subtitle):
        self.title, self.subtitle = title, subtitle

    def measure(self, fonts, width):
        return (text_height(fonts.title, width, self.title) + 0.25 * fonts.base
                + text_height(fonts.body, width, self.subtitle))

    def draw(self, p, fonts, x, y, width):
        h1 = text_height(fonts.title, width, self.title)
        p.setPen(QColor(INK))
        p.setFont(fonts.title)
        p.drawText(QRectF(x, y, width, h1 + 2), LEFT | TOP | WRAP, self.title)
        y += h1 + 0.25 * fonts.base
        p.setPen(QColor(MUTED))
        p.setFont(fonts.body)
        p.drawText(QRectF(x, y, width, 1e6), LEFT | TOP | WRAP, self.subtitle)


class Heading(Block):
    def __init__(self, text):
        self.text = text

    def measure(self, fonts, width):
        return 0.9 * fonts.base + QFontMetricsF(fonts.heading).height() + 0.3 * fonts.base

    def draw(self, p, fonts, x, y, width):
        y += 0.45 * fonts.base
        p.setPen(QPen(QColor(RULE), max(1.0, fonts.base / 14)))
        p.drawLine(QLineF(x, y, x + width, y))
        y += 0.45 * fonts.base
        p.setPen(QColor(MUTED))
        p.setFont(fonts.heading)
        p.drawText(QRectF(x, y, width, 1e6), LEFT | TOP, self.text.upper())


class Rows(Block):
    """Label-value rows in two columns; a value may wrap and have a colour."""

    def __init__(self, rows):
        self.rows = rows  # (label, value, colour or None)

    def _label_width(self, fonts, width):
        fm = QFontMetricsF(fonts.body)
        widest = max(fm.horizontalAdvance(r[0]) for r in self.rows)
        return min(widest + 0.8 * fonts.base, 0.46 * width)

    def _row_height(self, fonts, lw, width, row):
        return max(text_height(fonts.body, lw - 0.4 * fonts.base, row[0]),
                   text_height(fonts.bold, width - lw, row[1])) + 0.22 * fonts.base

    def measure(self, fonts, width):
        lw = self._label_width(fonts, width)
        return sum(self._row_height(fonts, lw, width, r) for r in self.rows)

    def draw(self, p, fonts, x, y, width):
        lw = self._label_width(fonts, width)
        for row in self.rows:
            label, value, colour = row
            h = self._row_height(fonts, lw, width, row)
            p.setFont(fonts.body)
            p.setPen(QColor(MUTED))
            p.drawText(QRectF(x, y, lw - 0.4 * fonts.base, h), LEFT | TOP | WRAP, label)
            p.setFont(fonts.bold)
            p.setPen(QColor(colour or INK))
            p.drawText(QRectF(x + lw, y, width - lw, h), LEFT | TOP | WRAP, value)
            y += h


class Note(Block):
    def __init__(self, text, colour=MUTED):
        self.text, self.colour = text, colour

    def measure(self, fonts, width):
        return text_height(fonts.small, width, self.text) + 0.25 * fonts.base

    def draw(self, p, fonts, x, y, width):
        p.setFont(fonts.small)
        p.setPen(QColor(self.colour))
        p.drawText(QRectF(x, y, width, 1e6), LEFT | TOP | WRAP, self.text)


class Table(Block):
    """A small table: the first column left-aligned, the others right."""

    def __init__(self, header, rows):
        self.header = header
        self.rows = rows  # list of list of (text, colour or None)

    def _columns(self, fonts, width):
        fm_b, fm = QFontMetricsF(fonts.heading), QFontMetricsF(fonts.body)
        n = len(self.header)
        need = [fm_b.horizontalAdvance(h) for h in self.header]
        fm_v = QFontMetricsF(fonts.bold)
        for row in self.rows:
            for i, (t, _) in enumerate(row):
                need[i] = max(need[i], (fm if i == 0 else fm_v).horizontalAdvance(t))
        pad = 0.9 * fonts.base
        rest = [need[i] + pad for i in range(1, n)]
        first = width - sum(rest)
        if first < 0.25 * width:  # squeeze the number columns evenly
            first = 0.25 * width
            total = sum(rest)
            rest = [r * (width - first) / total for r in rest]
        return [first] + rest

    def fits(self, fonts, width):
        """True if every cell fits ``width`` [px] without squeezing the
        number columns (they would run into each other)."""
        return self._columns(fonts, width)[0] > 0.25 * width

    def measure(self, fonts, width):
        line = QFontMetricsF(fonts.body).height() + 0.2 * fonts.base
        return line * (len(self.rows) + 1) + 0.2 * fonts.base

    def draw(self, p, fonts, x, y, width):
        widths = self._columns(fonts, width)
        line = QFontMetricsF(fonts.body).height() + 0.2 * fonts.base
        p.setFont(fonts.heading)
        p.setPen(QColor(MUTED))
        cx = x
        for i, h in enumerate(self.header):
            align = LEFT if i == 0 else RIGHT
            p.drawText(QRectF(cx, y, widths[i], line), align | VCENTER, h)
            cx += widths[i]
        y += line
        p.setPen(QPen(QColor(RULE), max(1.0, fonts.base / 14)))
        p.drawLine(QLineF(x, y, x + width, y))
        y += 0.1 * fonts.base
        for row in self.rows:
            cx = x
            for i, (t, colour) in enumerate(row):
                p.setFont(fonts.body if i == 0 else fonts.bold)
                p.setPen(QColor(colour or INK))
                align = LEFT if i == 0 else RIGHT
                fm = QFontMetricsF(p.font())
                text = fm.elidedText(t, Qt.TextElideMode.ElideRight, widths[i] - 0.3 * fonts.base) \
                    if i == 0 else t
                p.drawText(QRectF(cx, y, widths[i], line), align | VCENTER, text)
                cx += widths[i]
            y += line


class Legend(Block):
    """Symbol and text, one item a line: kinds line, dash, dashdot, fill,
    diagram, surface, arrow_down, arrow_up, arrow_side, arrow_edge, vertex,
    edge, dimension, structure, ground, groundwater, groundwater_diagram."""

    def __init__(self, items):
        self.items = items  # (kind, colour, text)

    def split(self, columns):
        """The items in ``columns`` legends of about equal length, in order."""
        n = len(self.items)
        per = -(-n // max(int(columns), 1))
        return [Legend(self.items[k:k + per]) for k in range(0, n, per)] or [Legend([])]

    def _sym(self, fonts):
        return 2.6 * fonts.base

    @staticmethod
    def _columns(fonts, width):
        """Two columns where the block is wide enough, else one."""
        return 2 if width >= 26 * fonts.base else 1

    def _halves(self, fonts, width):
        cols = self._columns(fonts, width)
        if cols == 1:
            return [self.items], width
        per = -(-len(self.items) // 2)
        gap = 1.0 * fonts.base
        return [self.items[:per], self.items[per:]], (width - gap) / 2

    def measure(self, fonts, width):
        groups, cw = self._halves(fonts, width)
        tw = cw - self._sym(fonts) - 0.6 * fonts.base
        return max(sum(max(text_height(fonts.body, tw, t), 1.2 * fonts.base) + 0.2 * fonts.base
                       for _, _, t in items) for items in groups)

    def draw(self, p, fonts, x, y, width):
        groups, cw = self._halves(fonts, width)
        for k, items in enumerate(groups):
            self._draw_items(p, fonts, x + k * (width - cw), y, cw, items)

    def _draw_items(self, p, fonts, x, y, width, items):
        sym = self._sym(fonts)
        tw = width - sym - 0.6 * fonts.base
        lw = max(1.2, fonts.base / 8)
        for kind, colour, text in items:
            h = max(text_height(fonts.body, tw, text), 1.2 * fonts.base)
            cy = y + 0.62 * QFontMetricsF(fonts.body).height()
            c = QColor(colour)
            p.save()
            if kind in ("line", "dash", "dashdot", "surface"):
                pen = QPen(c, lw * (2.2 if kind == "line" else 1.4))
                pen.setCapStyle(Qt.PenCapStyle.FlatCap)
                if kind == "dash":
                    pen.setStyle(Qt.PenStyle.DashLine)
                elif kind == "dashdot":
                    pen.setStyle(Qt.PenStyle.DashDotLine)
                p.setPen(pen)
                p.drawLine(QLineF(x, cy, x + sym, cy))
                if kind == "surface":
                    s = 0.42 * fonts.base
                    draw_surface_mark(p, QPointF(x + 0.6 * sym, cy), s, c, lw)
            elif kind == "fill":
                r = QRectF(x, cy - 0.45 * fonts.base, sym, 0.9 * fonts.base)
                p.fillRect(r, c)
                p.setPen(QPen(QColor(SURFACE), lw))
                p.drawLine(QLineF(r.left(), r.top(), r.right(), r.top()))
            elif kind in ("layer", "air"):
                r = QRectF(x, cy - 0.45 * fonts.base, sym, 0.9 * fonts.base)
                p.fillRect(r, QColor(LIQUID))
                if kind == "layer":
                    p.fillRect(r.adjusted(0, 0, 0, -0.45 * fonts.base),
                               QColor(*LAYER_TINTS[0]))
                    pen = QPen(c, lw * 1.1)
                    pen.setStyle(Qt.PenStyle.DashLine)
                    p.setPen(pen)
                    p.drawLine(QLineF(r.left(), r.center().y(), r.right(), r.center().y()))
                else:
                    top = r.adjusted(0, 0, 0, -0.45 * fonts.base)
                    p.fillRect(top, QColor(*AIR_FILL))
                    p.setPen(QPen(c, lw * 0.7))
                    p.drawRect(top)
                    p.setPen(QPen(QColor(SURFACE), lw * 1.1))
                    p.drawLine(QLineF(r.left(), r.center().y(), r.right(), r.center().y()))
            elif kind == "diagram":
                r = QRectF(x, cy - 0.5 * fonts.base, sym, fonts.base)
                poly = QPolygonF([r.bottomLeft(), r.bottomRight(),
                                  QPointF(r.right(), r.top())])
                p.setPen(Qt.PenStyle.NoPen)
                p.setBrush(QColor(*DIAGRAM_FILL))
                p.drawPolygon(poly)
                p.setPen(QPen(QColor(DIAGRAM_LINE), lw * 0.6))
                for k in range(1, 6):
                    xx = r.left() + sym * k / 6
                    p.drawLine(QLineF(xx, r.bottom(), xx, r.bottom() - r.height() * k / 6))
                p.setPen(QPen(QColor(DIAGRAM_LINE), lw * 1.2))
                p.setBrush(Qt.BrushStyle.NoBrush)
                p.drawPolygon(poly)
            elif kind in ("vertex", "edge"):
                r = QRectF(x + 0.5 * sym - 0.55 * fonts.base, cy - 0.55 * fonts.base,
                           1.1 * fonts.base, 1.1 * fonts.base)
                p.setPen(QPen(c, lw * 0.7) if kind == "edge" else Qt.PenStyle.NoPen)
                p.setBrush(QColor("white"))
                p.drawRoundedRect(r, 0.15 * fonts.base, 0.15 * fonts.base)
                p.setFont(fonts.small)
                p.setPen(c)
                p.drawText(r, HCENTER | VCENTER, "3")
            elif kind == "dimension":
                p.setPen(QPen(c, lw * 0.7))
                p.drawLine(QLineF(x, cy, x + sym, cy))
                for xx in (x + 0.15 * sym, x + 0.85 * sym):
                    s = 0.3 * fonts.base
                    p.drawLine(QLineF(xx - s, cy + s, xx + s, cy - s))
            elif kind == "structure":
                r = QRectF(x, cy - 0.45 * fonts.base, sym, 0.9 * fonts.base)
                p.fillRect(r, QColor(STRUCTURE_FILL))
                p.fillRect(r, QBrush(c, Qt.BrushStyle.BDiagPattern))
                p.setPen(QPen(QColor(INK), lw * 0.8))
                p.drawRect(r)
            elif kind == "ground":
                p.setPen(QPen(c, lw * 1.2))
                p.drawLine(QLineF(x, cy, x + sym, cy))
                xx = x + 0.3 * fonts.base
                while xx < x + sym:
                    p.drawLine(QLineF(xx, cy, xx - 0.4 * fonts.base, cy + 0.4 * fonts.base))
                    xx += 0.9 * fonts.base
            elif kind == "groundwater":
                pen = QPen(c, lw)
                pen.setStyle(Qt.PenStyle.DashLine)
                p.setPen(pen)
                p.drawLine(QLineF(x, cy, x + sym, cy))
                draw_surface_mark(p, QPointF(x + 0.6 * sym, cy), 0.42 * fonts.base, c, lw)
            elif kind == "groundwater_diagram":
                r = QRectF(x, cy - 0.5 * fonts.base, sym, fonts.base)
                poly = QPolygonF([r.topLeft(), r.bottomLeft(), QPointF(r.right(), r.bottom())])
                p.setPen(QPen(c, lw * 0.8))
                p.setBrush(QColor(*GROUNDWATER_FILL))
                p.drawPolygon(poly)
            elif kind in ("arrow_down", "arrow_up", "arrow_side", "arrow_edge"):
                if kind in ("arrow_side", "arrow_edge"):
                    a, b = QPointF(x, cy), QPointF(x + sym, cy)
                else:
                    mid = x + 0.5 * sym
                    top, bot = cy - 0.6 * fonts.base, cy + 0.6 * fonts.base
                    a, b = ((QPointF(mid, top), QPointF(mid, bot)) if kind == "arrow_down"
                            else (QPointF(mid, bot), QPointF(mid, top)))
                draw_arrow(p, a, b, c, lw * 1.6, 0.6 * fonts.base)
            p.restore()
            p.setFont(fonts.body)
            p.setPen(QColor(INK))
            p.drawText(QRectF(x + sym + 0.6 * fonts.base, y, tw, h), LEFT | TOP | WRAP,
                       text)
            y += h + 0.2 * fonts.base


class Caution(Block):
    def __init__(self, text):
        self.text = text

    def measure(self, fonts, width):
        return text_height(fonts.bold, width - 1.2 * fonts.base, self.text) + 1.0 * fonts.base

    def draw(self, p, fonts, x, y, width):
        h = self.measure(fonts, width)
        r = QRectF(x, y + 0.1 * fonts.base, width, h - 0.2 * fonts.base)
        p.setPen(QPen(QColor(LOAD), max(1.2, fonts.base / 9)))
        p.setBrush(QColor("#fff6f4"))
        p.drawRect(r)
        p.setFont(fonts.bold)
        p.setPen(QColor(LOAD))
        p.drawText(r.adjusted(0.6 * fonts.base, 0.4 * fonts.base, -0.6 * fonts.base, 0),
                   LEFT | TOP | WRAP, self.text)


class Space(Block):
    def __init__(self, ems):
        self.ems = ems

    def measure(self, fonts, width):
        return self.ems * fonts.base

    def draw(self, p, fonts, x, y, width):
        pass
