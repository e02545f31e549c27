"""Headless PNG export of the pressure diagram, for a calculation package.

:func:`render_diagram` paints one design case on a white :class:`QImage`
with :class:`QPainter` (QtGui only, no widgets, no pyqtgraph), so it runs
with ``QT_QPA_PLATFORM=offscreen`` and from the command line:

- the section outline, each edge in the colour of its part, ``open`` edges
  dashed and an axisymmetric section's axis as a centre line (with a faint
  mirror image of the other half);
- the liquid shaded below the free surface, the free surface marked (above
  the roof of a closed section under a standpipe head), the spill level;
- along every wetted wall its pressure diagram, drawn outward from the wall
  (filled and hatched), scaled so that the largest ordinate is about a fifth
  of the section's size, with the pressure at the ends and at every kink;
- the resultant of each loaded part as an arrow pointing at the wall; a part
  that appears as several separate runs of edges (the two side walls of a
  tank) gets one arrow per run. Plane sections: the arrow acts at the
  force-weighted mean of the run's edge centres of pressure. Axisymmetric
  sections have no centre of pressure: the arrow is drawn at the midpoint of
  the run's wetted length. Upward loads are drawn in their own colour and
  labelled "uplift";
- a title block: section name, liquid, density and its source, gravity,
  level, key totals, loads by part, legend, units, date and the caution.

Fonts and line widths scale with the image, so the default A4-at-300-dpi
image and a small 800 x 600 one are both legible. :func:`export_png` writes
the image atomically (a temporary file in the same folder, then a rename);
``wetline export FILE --png OUT`` (:mod:`wetline.app.cli.main`) calls it. The scene
paints on any QPaintDevice (``_Scene.paint``) or with a caller's painter
(``_Scene.draw``): :mod:`wetline.app.render.svg` and :mod:`wetline.app.render.sheet` use it.

Values inside are SI (m, Pa, N); they are converted only for the labels,
through :mod:`wetline.core.units`.
"""

from __future__ import annotations

import datetime
import math
from dataclasses import dataclass

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import (
    QColor,
    QFont,
    QFontMetricsF,
    QGuiApplication,
    QImage,
    QPainter,
    QPainterPath,
    QPen,
    QPolygonF,
)

from wetline.core.atomic_write import WriteError, atomic_path, check_target
from wetline.core.report_tables import force_scope
from wetline.core.section import AXIS, FLOOR, OPEN
from wetline.core.units import display_units, length_factor

__all__ = [
    "CAUTION",
    "DEFAULT_SIZE",
    "MAX_SIDE",
    "MIN_SIDE",
    "ExportError",
    "export_png",
    "render_diagram",
]

DEFAULT_SIZE = (3508, 2480)
"""Default image size [px]: A4 landscape (297 x 210 mm) at 300 dpi."""
MIN_SIDE = 200
"""Smallest image side [px] that still holds a legible diagram."""
MAX_SIDE = 20000
"""Largest image side [px] (a 20000 px square already needs 1.6 GB)."""
DPI = 300
"""Resolution written into the PNG [dots per inch]."""

CAUTION = ("Hydrostatic loads only: no sloshing, seismic, wind, surge or "
           "structural capacity. Verify against local codes and licensed practice.")
"""The caution printed on every export."""


class ExportError(ValueError):
    """An export that cannot be made (bad size, unwritable path); the
    message names the problem."""


# --------------------------------------------------------------------- style
# An engineering-drawing look: dark ink on white, one warm hue for pressure,
# one cool hue for the liquid, two strong hues for the resultants.
INK = "#1d2530"
MUTED = "#5f6b78"
RULE = "#b3bcc6"
LIQUID = "#d9eaf6"
LIQUID_GHOST = "#eef5fb"
SURFACE = "#1c6aa8"
DIAGRAM_FILL = (236, 156, 64, 92)
DIAGRAM_LINE = "#b05e12"
DIAGRAM_TEXT = "#7d3f05"
LOAD = "#a61e2d"
UPLIFT = "#5a2fa6"
OPEN_EDGE = "#8c96a1"
FLOOR_COLOUR = "#6b4a2b"
PART_COLOURS = ("#1f4f8f", "#2b7a48", "#00727a", "#4c5b6b", "#8a6a12", "#36449c",
                "#7a4a6e", "#2f6f5f")
"""Colours of the loaded parts other than ``floor``, in order of appearance."""
FONT_FAMILY = "DejaVu Sans"

_TEXT_WRAP = int(Qt.TextFlag.TextWordWrap.value)
_LEFT = int(Qt.AlignmentFlag.AlignLeft.value)
_RIGHT = int(Qt.AlignmentFlag.AlignRight.value)
_HCENTER = int(Qt.AlignmentFlag.AlignHCenter.value)
_VCENTER = int(Qt.AlignmentFlag.AlignVCenter.value)
_TOP = int(Qt.AlignmentFlag.AlignTop.value)

_APP = None
_KINK_COS = math.cos(math.radians(3.0))
"""Walls meeting at less than 3 degrees are a smooth bend: no pressure label."""


def _ensure_app():
    """The running QGuiApplication, or a new offscreen one (headless use)."""
    global _APP
    app = QGuiApplication.instance()
    if app is None:
        # An export never needs a display: "-platform offscreen" overrides
        # any QT_QPA_PLATFORM, so the command line runs on a bare server.
        app = _APP = QGuiApplication(["wetline-export", "-platform", "offscreen"])
    return app


# ----------------------------------------------------------------- numbers
def _fmt(value, digits=4):
    """``value`` with ``digits`` significant digits in plain notation."""
    v = float(value)
    if not math.isfinite(v):
        return "-"
    if v == 0:
        return "0"
    a = abs(v)
    if a >= 1e9 or a < 1e-4:
        return f"{v:.{digits - 1}e}"
    decimals = max(0, digits - 1 - int(math.floor(math.log10(a))))
    text = f"{v:.{decimals}f}"
    return "0" if float(text) == 0 else text


def _fmt_length(value):
    """A length for labels: three decimals (mm or thousandths of a foot)."""
    text = f"{float(value):.3f}"
    return "0.000" if text == "-0.000" else text


def _nice_step(target):
    """The 1-2-5 number nearest below ``target`` (> 0)."""
    if not target > 0 or not math.isfinite(target):
        return 1.0
    e = math.floor(math.log10(target))
    for m in (5.0, 2.0, 1.0):
        if m * 10.0 ** e <= target:
            return m * 10.0 ** e
    return 10.0 ** e


def _check_size(size):
    try:
        w, h = size
    except (TypeError, ValueError):
        raise ExportError(f"image size must be a pair (width, height) in pixels, "
                          f"not {size!r}") from None
    for what, v in (("width", w), ("height", h)):
        if isinstance(v, bool) or not isinstance(v, (int, np.integer)):
            if isinstance(v, float) and v.is_integer():
                continue
            raise ExportError(f"image {what} must be a whole number of pixels, not {v!r}")
    w, h = int(w), int(h)
    for what, v in (("width", w), ("height", h)):
        if v <= 0:
            raise ExportError(f"image {what} must be positive, not {v} px")
        if v < MIN_SIDE:
            raise ExportError(f"image {what} of {v} px is too small to draw a legible "
                              f"diagram (at least {MIN_SIDE} px)")
        if v > MAX_SIDE:
            raise ExportError(f"image {what} of {v} px is too large (at most {MAX_SIDE} px)")
    return w, h


def _program():
    """``Wetline`` and its version, when the package is installed."""
    from importlib import metadata

    try:
        return f"Wetline {metadata.version('wetline')}"
    except metadata.PackageNotFoundError:
        return "Wetline"


def _date_text(date):
    if date is None:
        return datetime.date.today().isoformat()
    if isinstance(date, (datetime.date, datetime.datetime)):
        return date.isoformat()[:10]
    return str(date)


# ------------------------------------------------------------ text blocks
class _Fonts:
    """The fonts of one image, all in pixel sizes from one base size."""

    def __init__(self, base):
        self.base = base
        self.body = self._make(base)
        self.small = self._make(base * 0.86)
        self.bold = self._make(base, bold=True)
        self.heading = self._make(base * 0.9, bold=True)
        self.title = self._make(base * 1.45, bold=True)
        self.label = self._make(base * 0.92)
        self.label_bold = self._make(base * 0.95, bold=True)

    @staticmethod
    def _make(px, bold=False):
        f = QFont(FONT_FAMILY)
        f.setPixelSize(max(1, int(round(px))))
        # no ligatures: "fl" must stay two letters in a PDF's extracted text
        f.setFeature(QFont.Tag("liga"), 0)
        if bold:
            f.setWeight(QFont.Weight.Bold)
        return f


def _text_height(font, width, text):
    fm = QFontMetricsF(font)
    r = fm.boundingRect(QRectF(0, 0, max(width, 1.0), 1e7), _LEFT | _TOP | _TEXT_WRAP, text)
    return r.height()


class _Block:
    """A piece of the title block: measure(width) -> height, draw(...)."""

    gap_before = 0.0

    def measure(self, fonts, width):  # pragma: no cover - interface
        raise NotImplementedError

    def draw(self, p, fonts, x, y, width):  # pragma: no cover - interface
        raise NotImplementedError


class _Title(_Block):
    def __init__(self, title, subtitle):
        self.title, self.subtitle = title, subtitle

    def measure(self, fonts, width):
        return (_text_height(fonts.title, width, self.title) + 0.25 * fonts.base
                + _text_height(fonts.body, width, self.subtitle))

    def draw(self, p, fonts, x, y, width):
        h1 = _text_height(fonts.title, width, self.title)
        p.setPen(QColor(INK))
        p.setFont(fonts.title)
        p.drawText(QRectF(x, y, width, h1 + 2), _LEFT | _TOP | _TEXT_WRAP, self.title)
        y += h1 + 0.25 * fonts.base
        p.setPen(QColor(MUTED))
        p.setFont(fonts.body)
        p.drawText(QRectF(x, y, width, 1e6), _LEFT | _TOP | _TEXT_WRAP, self.subtitle)


class _Heading(_Block):
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
        p.drawText(QRectF(x, y, width, 1e6), _LEFT | _TOP, self.text.upper())


class _Rows(_Block):
    """Label-value rows in two columns; a value may wrap and have a colour."""

    def __init__(self, rows):
        self.rows = rows  # (label, value, colour or None)

    def _label_width(self, fonts, width):
        fm = QFontMetricsF(fonts.body)
        widest = max(fm.horizontalAdvance(r[0]) for r in self.rows)
        return min(widest + 0.8 * fonts.base, 0.46 * width)

    def _row_height(self, fonts, lw, width, row):
        return max(_text_height(fonts.body, lw - 0.4 * fonts.base, row[0]),
                   _text_height(fonts.bold, width - lw, row[1])) + 0.22 * fonts.base

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
            p.drawText(QRectF(x, y, lw - 0.4 * fonts.base, h), _LEFT | _TOP | _TEXT_WRAP, label)
            p.setFont(fonts.bold)
            p.setPen(QColor(colour or INK))
            p.drawText(QRectF(x + lw, y, width - lw, h), _LEFT | _TOP | _TEXT_WRAP, value)
            y += h


class _Note(_Block):
    def __init__(self, text, colour=MUTED):
        self.text, self.colour = text, colour

    def measure(self, fonts, width):
        return _text_height(fonts.small, width, self.text) + 0.25 * fonts.base

    def draw(self, p, fonts, x, y, width):
        p.setFont(fonts.small)
        p.setPen(QColor(self.colour))
        p.drawText(QRectF(x, y, width, 1e6), _LEFT | _TOP | _TEXT_WRAP, self.text)


class _Table(_Block):
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
            align = _LEFT if i == 0 else _RIGHT
            p.drawText(QRectF(cx, y, widths[i], line), align | _VCENTER, h)
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
                align = _LEFT if i == 0 else _RIGHT
                fm = QFontMetricsF(p.font())
                text = fm.elidedText(t, Qt.TextElideMode.ElideRight, widths[i] - 0.3 * fonts.base) \
                    if i == 0 else t
                p.drawText(QRectF(cx, y, widths[i], line), align | _VCENTER, text)
                cx += widths[i]
            y += line


class _Legend(_Block):
    """Symbol and text, one item a line: kinds line, dash, dashdot, fill,
    diagram, surface, arrow_down, arrow_up."""

    def __init__(self, items):
        self.items = items  # (kind, colour, text)

    def _sym(self, fonts):
        return 2.6 * fonts.base

    def measure(self, fonts, width):
        tw = width - self._sym(fonts) - 0.6 * fonts.base
        return sum(max(_text_height(fonts.body, tw, t), 1.2 * fonts.base) + 0.2 * fonts.base
                   for _, _, t in self.items)

    def draw(self, p, fonts, x, y, width):
        sym = self._sym(fonts)
        tw = width - sym - 0.6 * fonts.base
        lw = max(1.2, fonts.base / 8)
        for kind, colour, text in self.items:
            h = max(_text_height(fonts.body, tw, text), 1.2 * fonts.base)
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
                    _surface_mark(p, QPointF(x + 0.6 * sym, cy), s, c, lw)
            elif kind == "fill":
                r = QRectF(x, cy - 0.45 * fonts.base, sym, 0.9 * fonts.base)
                p.fillRect(r, c)
                p.setPen(QPen(QColor(SURFACE), lw))
                p.drawLine(QLineF(r.left(), r.top(), r.right(), r.top()))
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
            elif kind in ("arrow_down", "arrow_up", "arrow_side"):
                if kind == "arrow_side":
                    a, b = QPointF(x, cy), QPointF(x + sym, cy)
                else:
                    mid = x + 0.5 * sym
                    top, bot = cy - 0.6 * fonts.base, cy + 0.6 * fonts.base
                    a, b = ((QPointF(mid, top), QPointF(mid, bot)) if kind == "arrow_down"
                            else (QPointF(mid, bot), QPointF(mid, top)))
                _arrow(p, a, b, c, lw * 1.6, 0.6 * fonts.base)
            p.restore()
            p.setFont(fonts.body)
            p.setPen(QColor(INK))
            p.drawText(QRectF(x + sym + 0.6 * fonts.base, y, tw, h), _LEFT | _TOP | _TEXT_WRAP,
                       text)
            y += h + 0.2 * fonts.base


class _Caution(_Block):
    def __init__(self, text):
        self.text = text

    def measure(self, fonts, width):
        return _text_height(fonts.bold, width - 1.2 * fonts.base, self.text) + 1.0 * fonts.base

    def draw(self, p, fonts, x, y, width):
        h = self.measure(fonts, width)
        r = QRectF(x, y + 0.1 * fonts.base, width, h - 0.2 * fonts.base)
        p.setPen(QPen(QColor(LOAD), max(1.2, fonts.base / 9)))
        p.setBrush(QColor("#fff6f4"))
        p.drawRect(r)
        p.setFont(fonts.bold)
        p.setPen(QColor(LOAD))
        p.drawText(r.adjusted(0.6 * fonts.base, 0.4 * fonts.base, -0.6 * fonts.base, 0),
                   _LEFT | _TOP | _TEXT_WRAP, self.text)


class _Space(_Block):
    def __init__(self, ems):
        self.ems = ems

    def measure(self, fonts, width):
        return self.ems * fonts.base

    def draw(self, p, fonts, x, y, width):
        pass


# ------------------------------------------------------------ drawing aids
def _arrow(p, tail, head, colour, width, head_len):
    """A straight arrow from ``tail`` to ``head`` with a filled head."""
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


def _surface_mark(p, apex, size, colour, width):
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


@dataclass
class _Label:
    text: str
    font: QFont
    colour: str
    frame: str | None = None


class _Placer:
    """Places labels next to anchors without overlapping each other."""

    def __init__(self, bounds, pad):
        self.bounds = bounds
        self.pad = pad
        self.taken = []
        self.segments = np.empty((0, 4))

    def avoid_lines(self, lines):
        """Keep labels off these pixel segments, (M, 4) rows x0, y0, x1, y1."""
        lines = np.asarray(lines, dtype=float).reshape(-1, 4)
        self.segments = np.vstack([self.segments, lines])

    def _crosses_lines(self, rect):
        s = self.segments
        if not len(s):
            return False
        left, top, right, bottom = rect.left(), rect.top(), rect.right(), rect.bottom()
        x0, y0, x1, y1 = s[:, 0], s[:, 1], s[:, 2], s[:, 3]
        near = ((np.maximum(x0, x1) >= left) & (np.minimum(x0, x1) <= right)
                & (np.maximum(y0, y1) >= top) & (np.minimum(y0, y1) <= bottom))
        if not near.any():
            return False
        x0, y0, x1, y1 = x0[near], y0[near], x1[near], y1[near]
        # The segment's line separates the rectangle's corners, or it does not.
        cx = np.array([left, right, right, left])[:, None]
        cy = np.array([top, top, bottom, bottom])[:, None]
        side = (x1 - x0) * (cy - y0) - (y1 - y0) * (cx - x0)
        return bool(((side.min(axis=0) <= 0) & (side.max(axis=0) >= 0)).any())

    def rect_for(self, label, anchor, direction, gap):
        fm = QFontMetricsF(label.font)
        w = fm.horizontalAdvance(label.text) + 2 * self.pad
        h = fm.height() + 0.6 * self.pad
        dx, dy = direction
        n = math.hypot(dx, dy)
        dx, dy = (dx / n, dy / n) if n > 0 else (0.0, -1.0)
        reach = gap + 0.5 * (abs(dx) * w + abs(dy) * h)
        cx, cy = anchor.x() + dx * reach, anchor.y() + dy * reach
        return QRectF(cx - w / 2, cy - h / 2, w, h)

    def free(self, rect, ignore=None, lines=True):
        if not self.bounds.contains(rect):
            return False
        if any(rect.intersects(r) for r in self.taken if r is not ignore):
            return False
        return not (lines and self._crosses_lines(rect))

    def place(self, p, label, candidates, force=False, ignore=None):
        """Draw ``label`` at the first free candidate (anchor, direction,
        gap); if none is free, at the first when ``force``. ``ignore``: a
        reserved rect the label may overlap (its own arrow). Returns the rect."""
        rects = [self.rect_for(label, a, d, g) for a, d, g in candidates]
        # Off the outline if possible; else across it; else (forced) anywhere.
        rect = next((r for r in rects if self.free(r, ignore)), None)
        if rect is None and force:
            rect = next((r for r in rects if self.free(r, ignore, lines=False)),
                        rects[0] if rects else None)
        if rect is None:
            return None
        self.taken.append(rect)
        self._draw(p, label, rect)
        return rect

    def reserve(self, rect):
        self.taken.append(rect)
        return rect

    def _draw(self, p, label, rect):
        p.save()
        bg = QColor(255, 255, 255, 225)
        if label.frame:
            p.setPen(QPen(QColor(label.frame), max(1.0, self.pad / 3)))
        else:
            p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(bg)
        radius = 0.35 * self.pad
        p.drawRoundedRect(rect, radius, radius)
        p.setFont(label.font)
        p.setPen(QColor(label.colour))
        p.drawText(rect, _HCENTER | _VCENTER, label.text)
        p.restore()


# --------------------------------------------------------------- geometry
def _wetted_segment(x0, z0, x1, z1, level, rg):
    """The wetted part of one edge: (xa, za, pa, xb, zb, pb) or None."""
    d0, d1 = level - z0, level - z1
    if d0 <= 0 and d1 <= 0:
        return None
    if d0 > 0 and d1 > 0:
        return x0, z0, rg * d0, x1, z1, rg * d1
    t = d0 / (d0 - d1)  # where the surface crosses the edge
    xc, zc = x0 + t * (x1 - x0), z0 + t * (z1 - z0)
    if d0 > 0:
        return x0, z0, rg * d0, xc, zc, 0.0
    return xc, zc, 0.0, x1, z1, rg * d1


def _runs(parts):
    """Runs of consecutive edges with the same part name (the outline is
    closed, so a run may wrap round): list of (name, [edge indices])."""
    n = len(parts)
    start = next((i for i in range(n) if parts[i] != parts[i - 1]), None)
    if start is None:
        return [(parts[0], list(range(n)))]
    runs = []
    for k in range(n):
        i = (start + k) % n
        if runs and runs[-1][0] == parts[i] and k > 0 and parts[i] == parts[i - 1]:
            runs[-1][1].append(i)
        else:
            runs.append((parts[i], [i]))
    return runs


def _part_colours(section):
    colours, k = {}, 0
    for name in section.part_names:
        if name == FLOOR:
            colours[name] = FLOOR_COLOUR
        elif name in (OPEN, AXIS):
            colours[name] = OPEN_EDGE
        else:
            colours[name] = PART_COLOURS[k % len(PART_COLOURS)]
            k += 1
    return colours


# ------------------------------------------------------------------ render
class _Scene:
    """Everything one image needs; ``paint`` does the work."""

    def __init__(self, case, solution, units, size, date):
        self.case = case
        self.sol = solution
        self.section = solution.section
        self.du = display_units(units)
        self.w, self.h = size
        self.date = _date_text(date)
        d = min(self.w / math.sqrt(2.0), float(self.h))
        self.d = d
        self.base_font = max(12.0, 0.0135 * d)
        self.lw = max(1.1, d / 900.0)
        self.margin = max(8.0, 0.02 * d)
        self.colours = _part_colours(self.section)
        s = self.section
        self.axi = s.is_axisymmetric
        self.rg = solution.density * solution.gravity
        self.level = solution.level
        self.noise = 1e-9 * max(solution.fluid_weight,
                                float(np.nanmax(np.abs(solution.resultant), initial=0.0)))
        # Edges that carry a pressure diagram: walls, not openings or the axis.
        x = s.outline[:, 0]
        on_axis = np.zeros(s.n_edges, dtype=bool)
        if self.axi:
            on_axis = (x == 0) & (np.roll(x, -1) == 0)
        self.drawn = np.array([p not in (OPEN, AXIS) for p in s.parts]) & ~on_axis
        self.on_axis = on_axis | np.array([p == AXIS for p in s.parts])

    # ------------------------------------------------------------- units
    def length(self, m):
        return f"{_fmt_length(self.du.to_display(m, 'length'))} {self.du.label('length')}"

    def pressure(self, pa, digits=4):
        return f"{_fmt(self.du.to_display(pa, 'pressure'), digits)} {self.du.label('pressure')}"

    def force(self, n, digits=4):
        if abs(n) <= self.noise:  # sums of opposite forces leave round-off
            n = 0.0
        return f"{_fmt(self.du.to_display(n, 'force'), digits)} {self.du.label('force')}"

    def force_scope(self):
        return force_scope(self.section, self.du)

    def paint(self, device):
        """Paint the scene on ``device``: a QImage, a QSvgGenerator, a
        QPdfWriter ... The scene is laid out for ``size``; a device of
        another size gets it scaled to its own width and height."""
        p = QPainter(device)
        if not p.isActive():
            raise ExportError("cannot paint the diagram: the output could not be opened")
        try:
            sx, sy = device.width() / self.w, device.height() / self.h
            if (sx, sy) != (1.0, 1.0):
                p.scale(sx, sy)
            self.draw(p)
        finally:
            p.end()

    def draw(self, p):
        """Paint with the active painter ``p``, whose coordinates span
        (0, 0) to the scene's (width, height)."""
        p.save()
        try:
            p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
            p.setRenderHint(QPainter.RenderHint.TextAntialiasing, True)
            p.fillRect(QRectF(0, 0, self.w, self.h), QColor("white"))
            m = self.margin
            frame = QRectF(m, m, self.w - 2 * m, self.h - 2 * m)
            side = self.w >= 1.15 * self.h
            if side:
                columns = 1
                # The title block takes 30 % of the width, up to 45 % if its
                # text needs room; only then does the text get smaller.
                sizes = [0.30, 0.33, 0.36, 0.40, 0.45]
                pw0 = max(0.3 * frame.width(), min(24 * self.base_font, 0.42 * frame.width()))
                panels = [QRectF(frame.right() - pw, frame.top(), pw, frame.height())
                          for pw in sorted({max(pw0, s * frame.width()) for s in sizes})]
            else:
                columns = max(2, min(3, int(frame.width() // (20 * self.base_font))))
                sizes = [0.36, 0.40, 0.45, 0.50]
                ph0 = max(0.36 * frame.height(), min(18 * self.base_font, 0.5 * frame.height()))
                panels = [QRectF(frame.left(), frame.bottom() - ph, frame.width(), ph)
                          for ph in sorted({max(ph0, s * frame.height()) for s in sizes})]
            panel = next((r for r in panels if self._flow(_Fonts(self.base_font), r, columns)),
                         panels[-1])
            fonts = self._fit_panel(panel, columns)
            if side:
                drawing = QRectF(frame.left(), frame.top(), frame.width() - panel.width(),
                                 frame.height())
            else:
                drawing = QRectF(frame.left(), frame.top(), frame.width(),
                                 frame.height() - panel.height())
            self.fonts = fonts
            self._draw_drawing(p, drawing, fonts)
            self._draw_panel(p, panel, columns, fonts)
            # Frame and the rule between drawing and title block, drawn last.
            p.setBrush(Qt.BrushStyle.NoBrush)
            p.setPen(QPen(QColor(INK), 1.6 * self.lw))
            p.drawRect(frame)
            p.setPen(QPen(QColor(INK), 1.0 * self.lw))
            if side:
                p.drawLine(QLineF(panel.left(), panel.top(), panel.left(), panel.bottom()))
            else:
                p.drawLine(QLineF(panel.left(), panel.top(), panel.right(), panel.top()))
        finally:
            p.restore()

    # ------------------------------------------------------- title block
    def _blocks(self):
        s, sol, du, liq = self.section, self.sol, self.du, self.case.liquid
        name = s.name.strip() or "Untitled section"
        if self.axi:
            sub = "Axisymmetric section, revolved about the axis x = 0 (x is the radius)"
        else:
            sub = f"Plane section, {self.length(s.width)} wide out of the drawing"
        blocks = [_Title(name, sub)]

        density = f"{_fmt(du.to_display(liq.density, 'density'), 5)} {du.label('density')}"
        if du.name == "us":
            density += f"  ({_fmt(liq.density, 5)} kg/m3)"
        if du.name == "us":
            gravity = f"{_fmt(sol.gravity / length_factor('ft'), 6)} ft/s2"
        else:
            gravity = f"{_fmt(sol.gravity, 6)} m/s2"
        blocks += [_Heading("Liquid"),
                   _Rows([("Liquid", liq.name, None), ("Density", density, None),
                          ("Gravity", gravity, None)]),
                   _Note(f"Density source: {liq.source}")]

        rows = [("Level", self.length(sol.level), None)]
        notes = []
        capped = sol.spill_level is not None and sol.requested_level > sol.level + 1e-12
        if capped:
            rows[0] = ("Level", f"{self.length(sol.level)}, capped at spill level", None)
            notes.append(f"Requested level {self.length(sol.requested_level)} is above the "
                         "spill level; the liquid spills there.")
        if sol.spill_level is not None:
            rows.append(("Spill level", self.length(sol.spill_level), None))
        else:
            rows.append(("Spill level", "none (closed section)", None))
        if sol.head_above_top > 0:
            rows.append(("Head above roof", self.length(sol.head_above_top), UPLIFT))
            notes.append("The level stands above the roof of the closed section: the cavity "
                         "is full under a standpipe head and the roof is pushed up.")
        if sol.level <= s.z_min:
            notes.append("The section is empty at this level: no loads.")
        blocks += [_Heading("Fill"), _Rows(rows)] + [_Note(t) for t in notes]

        support = sol.support_reaction
        if support < 0:
            support_text = f"{self.force(-support)} held down"
            support_colour = UPLIFT
        else:
            support_text, support_colour = self.force(support), None
        scope = self.force_scope()
        blocks += [
            _Heading(f"Totals ({scope})" if not self.axi else "Totals"),
            _Rows([
                ("Liquid volume", f"{_fmt(du.to_display(sol.volume, 'volume'))} "
                                  f"{du.label('volume')}", None),
                ("Liquid weight", self.force(sol.fluid_weight), None),
                ("Floor force", self.force(sol.floor_force), None),
                ("Support reaction", support_text, support_colour),
                ("Max. pressure", self.pressure(sol.max_pressure), None),
            ]),
        ]
        if self.axi:
            blocks.append(_Note("Forces are for the full circumference."))
        if sol.parts:
            unit = du.label("force")
            header = ["Part", f"Horiz. {unit}", f"Down {unit}"]
            table = []
            noise = self.noise  # sums of opposite forces leave round-off
            for part, load in sol.parts.items():
                colour = self.colours.get(part)
                fx = 0.0 if load.fx is not None and abs(load.fx) <= noise else load.fx
                h = "-" if fx is None else _fmt(du.to_display(fx, "force"))
                down = 0.0 if abs(load.down) <= noise else load.down
                if down < 0:
                    v = (f"{_fmt(du.to_display(-down, 'force'))} uplift", UPLIFT)
                else:
                    v = (_fmt(du.to_display(down, "force")), None)
                table.append([(part, colour), (h, None), v])
            blocks += [_Heading("Loads by part"), _Table(header, table)]
            note = ("Horizontal: net, positive to the right; a part on both sides "
                    "nets out." if not self.axi else
                    "No net horizontal force over the full circumference.")
            blocks.append(_Note(note))

        items = []
        for part in s.loaded_part_names:
            items.append(("line", self.colours[part], part))
        if OPEN in s.parts:
            items.append(("dash", OPEN_EDGE, "open (no wall)"))
        if self.axi:
            items.append(("dashdot", MUTED, "axis of revolution"))
        items += [("fill", LIQUID, "liquid"),
                  ("surface", SURFACE, "free surface"),
                  ("diagram", DIAGRAM_LINE, "pressure on the wall, drawn outward"),
                  ("arrow_down", LOAD, "resultant on a part"),
                  ("arrow_up", UPLIFT, "resultant lifting a part (uplift)")]
        blocks += [_Heading("Legend"), _Legend(items)]
        return blocks

    def _footer(self):
        du = self.du
        units = (f"{du.title}: {du.label('length')}, {du.label('pressure')}, "
                 f"{du.label('force')} ({self.force_scope()})")
        return [_Space(0.4),
                _Caution(CAUTION),
                _Rows([("Units", units, None), ("Date", self.date, None),
                       ("Program", _program(), None)])]

    def _flow(self, fonts, panel, columns, draw_painter=None):
        """Lay the blocks out in ``columns``; True if everything fits."""
        pad = 0.9 * fonts.base
        gap = 1.2 * fonts.base
        inner = panel.adjusted(pad, pad, -pad, -pad)
        cw = (inner.width() - gap * (columns - 1)) / columns
        if cw <= 4 * fonts.base:
            return False
        footer = self._footer()
        fh = sum(b.measure(fonts, cw) for b in footer)
        col, y = 0, inner.top()
        for b in self._blocks():
            h = b.measure(fonts, cw)
            limit = inner.bottom() - (fh if col == columns - 1 else 0.0)
            if y + h > limit:
                if isinstance(b, _Heading) or y > inner.top():
                    col += 1
                    y = inner.top()
                    if col >= columns:
                        return False
                    limit = inner.bottom() - (fh if col == columns - 1 else 0.0)
                if y + h > limit:
                    return False
            if isinstance(b, _Heading) and y == inner.top():
                h = b.measure(fonts, cw)
            if draw_painter is not None:
                x = inner.left() + col * (cw + gap)
                b.draw(draw_painter, fonts, x, y, cw)
            y += h
        if draw_painter is not None:
            x = inner.left() + (columns - 1) * (cw + gap)
            y = inner.bottom() - fh
            for b in footer:
                b.draw(draw_painter, fonts, x, y, cw)
                y += b.measure(fonts, cw)
        return True

    def _fit_panel(self, panel, columns):
        base = self.base_font
        while True:
            fonts = _Fonts(base)
            if base <= 7.0 or self._flow(fonts, panel, columns):
                return fonts
            base *= 0.93

    def _draw_panel(self, p, panel, columns, fonts):
        self._flow(fonts, panel, columns, draw_painter=p)

    # ---------------------------------------------------------- drawing
    def _draw_drawing(self, p, area, fonts):
        s, sol = self.section, self.sol
        f = fonts.base
        pad = 0.9 * f
        scale_h = 3.6 * f
        inner = area.adjusted(pad, pad, -pad, -pad)
        p.setFont(fonts.bold)
        p.setPen(QColor(INK))
        p.drawText(QRectF(inner.left(), inner.top(), inner.width(), 1.4 * f), _LEFT | _TOP,
                   "PRESSURE DIAGRAM")
        kind = "half-section" if self.axi else "cross-section"
        caption = (f"Gauge pressure on the walls of the {kind}, drawn outward from the wall; "
                   f"resultants point at the wall they load.")
        ch = _text_height(fonts.small, inner.width(), caption)
        p.setFont(fonts.small)
        p.setPen(QColor(MUTED))
        p.drawText(QRectF(inner.left(), inner.top() + 1.35 * f, inner.width(), ch + 2),
                   _LEFT | _TOP | _TEXT_WRAP, caption)
        caption_h = 1.35 * f + ch + 0.3 * f

        pts = s.outline
        xmin, xmax = float(pts[:, 0].min()), float(pts[:, 0].max())
        zmin, zmax = float(pts[:, 1].min()), float(pts[:, 1].max())
        size = max(xmax - xmin, zmax - zmin)
        pmax = sol.max_pressure
        # World length of one pascal of ordinate: the largest one is a fifth
        # of the section's size.
        self.k = 0.2 * size / pmax if pmax > 0 else 0.0

        geo = s.geometry
        segs = []
        bx = [xmin, xmax]
        bz = [zmin, zmax]
        if self.axi:
            bx.append(-xmax)
        for i in range(s.n_edges):
            if not self.drawn[i] or sol.wetted_length[i] <= 0:
                continue
            j = (i + 1) % s.n_edges
            seg = _wetted_segment(pts[i, 0], pts[i, 1], pts[j, 0], pts[j, 1], self.level, self.rg)
            if seg is None:
                continue
            nx, nz = float(geo.nx[i]), float(geo.nz[i])
            segs.append((i, seg, nx, nz))
            xa, za, pa, xb, zb, pb = seg
            for (xx, zz, pp) in ((xa, za, pa), (xb, zb, pb)):
                bx.append(xx + nx * self.k * pp)
                bz.append(zz + nz * self.k * pp)
        self.segs = segs
        if sol.head_above_top > 0:
            bz.append(self.level)
        if sol.spill_level is not None:
            bz.append(sol.spill_level)
        if self.axi:  # room for the centre line past both ends
            self.axis_ext = 0.06 * max(zmax - zmin, 1e-12)
            bz += [min(bz) - self.axis_ext, max(bz) + self.axis_ext]

        fm = QFontMetricsF(fonts.label)
        label_w = fm.horizontalAdvance("0000.0 " + self.du.label("pressure")) + f
        plot = QRectF(inner.left() + label_w, inner.top() + caption_h + 3.0 * f,
                      inner.width() - 2 * label_w,
                      inner.height() - caption_h - scale_h - 4.8 * f)
        wx = max(max(bx) - min(bx), 1e-9 * max(size, 1e-9))
        wz = max(max(bz) - min(bz), 1e-9 * max(size, 1e-9))
        scale = min(plot.width() / wx, plot.height() / wz)
        cx = 0.5 * (max(bx) + min(bx))
        cz = 0.5 * (max(bz) + min(bz))
        ox = plot.center().x() - scale * cx
        oz = plot.center().y() + scale * cz
        self.scale = scale
        self.to_px = lambda x, z: QPointF(ox + scale * x, oz - scale * z)
        self.placer = _Placer(inner.adjusted(0, caption_h, 0, -scale_h), 0.35 * f)
        px = np.column_stack([ox + scale * pts[:, 0], oz - scale * pts[:, 1]])
        walls = ~self.on_axis
        self.placer.avoid_lines(np.hstack([px, np.roll(px, -1, axis=0)])[walls])

        p.save()
        p.setClipRect(area.adjusted(0, caption_h + pad, 0, 0))
        if self.axi:
            self._draw_ghost(p)
        self._draw_liquid(p)
        self._draw_diagrams(p)
        self._draw_outline(p)
        self._draw_surface(p, fonts)
        self._draw_resultants(p, fonts)
        self._draw_pressure_labels(p, fonts)
        self._draw_scales(p, fonts, QRectF(inner.left(), inner.bottom() - scale_h,
                                           inner.width(), scale_h))
        p.restore()

    def _outline_path(self, mirror=False):
        path = QPainterPath()
        sign = -1.0 if mirror else 1.0
        poly = QPolygonF([self.to_px(sign * x, z) for x, z in self.section.outline.tolist()])
        path.addPolygon(poly)
        path.closeSubpath()
        return path

    def _liquid_path(self, mirror=False):
        outline = self._outline_path(mirror)
        if self.level <= self.section.z_min:
            return QPainterPath()
        if self.level >= self.section.z_max:
            return outline
        y = self.to_px(0.0, self.level).y()
        r = outline.boundingRect().adjusted(-10, -10, 10, 10)
        below = QPainterPath()
        below.addRect(QRectF(r.left(), y, r.width(), r.bottom() - y))
        return outline.intersected(below)

    def _draw_ghost(self, p):
        p.save()
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(LIQUID_GHOST))
        p.drawPath(self._liquid_path(mirror=True))
        pen = QPen(QColor(RULE), 1.2 * self.lw)
        p.setPen(pen)
        p.setBrush(Qt.BrushStyle.NoBrush)
        pts = self.section.outline
        lines = []
        for i in range(self.section.n_edges):
            if self.on_axis[i]:
                continue
            j = (i + 1) % self.section.n_edges
            style = self.section.parts[i] == OPEN
            a, b = self.to_px(-pts[i, 0], pts[i, 1]), self.to_px(-pts[j, 0], pts[j, 1])
            if style:
                dpen = QPen(pen)
                dpen.setStyle(Qt.PenStyle.DashLine)
                p.setPen(dpen)
                p.drawLine(QLineF(a, b))
                p.setPen(pen)
            else:
                lines.append(QLineF(a, b))
        p.drawLines(lines)
        # The axis: a long-dash-dot centre line past both ends.
        zmin, zmax = self.section.z_min, self.section.z_max
        ext = self.axis_ext
        top = max(zmax, self.level if self.sol.head_above_top > 0 else zmax) + ext
        cpen = QPen(QColor(MUTED), 1.0 * self.lw)
        cpen.setStyle(Qt.PenStyle.DashDotLine)
        p.setPen(cpen)
        p.drawLine(QLineF(self.to_px(0, zmin - ext), self.to_px(0, top)))
        p.restore()

    def _draw_liquid(self, p):
        p.save()
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(LIQUID))
        p.drawPath(self._liquid_path())
        p.restore()

    def _ordinate(self, x, z, nx, nz, pa):
        """Pixel tip of the pressure ordinate ``pa`` at wall point (x, z)."""
        return self.to_px(x + nx * self.k * pa, z + nz * self.k * pa)

    def _chains(self):
        """The wetted wall segments joined into chains that bend smoothly
        (less than 3 degrees at each shared vertex): lists of ``self.segs``
        entries. A kink starts a new chain."""
        n = self.section.n_edges
        chains = []
        for entry in self.segs:
            i, seg, nx, nz = entry
            if chains:
                j, pseg, pnx, pnz = chains[-1][-1]
                if (i == j + 1 and pseg[3:5] == seg[0:2]
                        and pnx * nx + pnz * nz > _KINK_COS):
                    chains[-1].append(entry)
                    continue
            chains.append([entry])
        if len(chains) > 1:  # the outline is closed: join across the last edge
            (j, pseg, pnx, pnz), (i, seg, nx, nz) = chains[-1][-1], chains[0][0]
            if (j == n - 1 and i == 0 and pseg[3:5] == seg[0:2]
                    and pnx * nx + pnz * nz > _KINK_COS):
                chains[0] = chains.pop() + chains[0]
        return chains

    def _draw_diagrams(self, p):
        if not self.segs or self.k <= 0:
            return
        fill = QPainterPath()
        fill.setFillRule(Qt.FillRule.WindingFill)
        edge = QPainterPath()
        hatch = []
        step = max(3.0 * self.lw, 0.55 * self.base_font)
        for chain in self._chains():
            wall, tips = [], []
            for k, (_, (xa, za, pa, xb, zb, pb), nx, nz) in enumerate(chain):
                if k == 0:
                    wall.append(self.to_px(xa, za))
                    tips.append(self._ordinate(xa, za, nx, nz, pa))
                else:  # a smooth bend: the mean of both ordinates
                    t = self._ordinate(xa, za, nx, nz, pa)
                    tips[-1] = QPointF(0.5 * (tips[-1].x() + t.x()), 0.5 * (tips[-1].y() + t.y()))
                wall.append(self.to_px(xb, zb))
                tips.append(self._ordinate(xb, zb, nx, nz, pb))
            fill.addPolygon(QPolygonF(wall + tips[::-1]))
            fill.closeSubpath()
            edge.moveTo(wall[0])
            for t in tips:
                edge.lineTo(t)
            edge.lineTo(wall[-1])
            # Ordinates at even spacing along the whole chain.
            w = np.array([(q.x(), q.y()) for q in wall])
            t = np.array([(q.x(), q.y()) for q in tips])
            arc = np.concatenate([[0.0], np.cumsum(np.sqrt(((w[1:] - w[:-1]) ** 2).sum(axis=1)))])
            if arc[-1] <= step:
                continue
            at = np.arange(step, arc[-1], step)
            at = at[at < arc[-1] - 0.25 * step]
            k = np.clip(np.searchsorted(arc, at) - 1, 0, len(arc) - 2)
            span = arc[k + 1] - arc[k]
            u = np.where(span > 0, (at - arc[k]) / np.where(span > 0, span, 1.0), 0.0)[:, None]
            wp = w[k] + u * (w[k + 1] - w[k])
            tp = t[k] + u * (t[k + 1] - t[k])
            long_enough = np.sqrt(((tp - wp) ** 2).sum(axis=1)) > 0.5 * self.lw
            hatch += [QLineF(a[0], a[1], b[0], b[1])
                      for a, b in zip(wp[long_enough].tolist(), tp[long_enough].tolist(),
                                      strict=True)]
        p.save()
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(*DIAGRAM_FILL))
        p.drawPath(fill)
        hc = QColor(DIAGRAM_LINE)
        hc.setAlpha(150)
        p.setPen(QPen(hc, 0.55 * self.lw))
        p.drawLines(hatch)
        pen = QPen(QColor(DIAGRAM_LINE), 1.1 * self.lw)
        pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
        p.setPen(pen)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.drawPath(edge)
        p.restore()

    def _draw_outline(self, p):
        s = self.section
        pts = s.outline
        p.save()
        for i in range(s.n_edges):
            j = (i + 1) % s.n_edges
            a, b = self.to_px(pts[i, 0], pts[i, 1]), self.to_px(pts[j, 0], pts[j, 1])
            part = s.parts[i]
            if self.on_axis[i]:
                continue  # drawn as the centre line
            if part == OPEN:
                pen = QPen(QColor(OPEN_EDGE), 1.2 * self.lw)
                pen.setStyle(Qt.PenStyle.DashLine)
            else:
                pen = QPen(QColor(self.colours[part]), 3.0 * self.lw)
                pen.setCapStyle(Qt.PenCapStyle.RoundCap)
            p.setPen(pen)
            p.drawLine(QLineF(a, b))
        p.restore()

    def _surface_spans(self, level):
        """x-ranges where the horizontal line z = level crosses the cavity."""
        pts = self.section.outline
        size = max(self.section.z_max - self.section.z_min, 1e-12)
        h = level - 1e-9 * size
        x0, z0 = pts[:, 0], pts[:, 1]
        x1, z1 = np.roll(x0, -1), np.roll(z0, -1)
        cross = (z0 > h) != (z1 > h)
        with np.errstate(divide="ignore", invalid="ignore"):
            xs = x0[cross] + (h - z0[cross]) * (x1[cross] - x0[cross]) / (z1[cross] - z0[cross])
        xs = np.sort(xs)
        return [(float(xs[k]), float(xs[k + 1])) for k in range(0, len(xs) - 1, 2)]

    def _draw_surface(self, p, fonts):
        s, sol = self.section, self.sol
        f = fonts.base
        lw = self.lw
        colour = QColor(SURFACE)
        standpipe = sol.head_above_top > 0
        if sol.level <= s.z_min:
            return
        if standpipe:
            spans = [(s.outline[:, 0].min(), s.outline[:, 0].max())]
            if self.axi:
                spans = [(-spans[0][1], spans[0][1])]
        else:
            spans = self._surface_spans(sol.level)
            if self.axi:
                spans += [(-b, -a) for a, b in spans]
        if not spans:
            return
        p.save()
        pen = QPen(colour, 1.5 * lw)
        if standpipe:
            pen.setStyle(Qt.PenStyle.DashLine)
        p.setPen(pen)
        for a, b in spans:
            pa, pb = self.to_px(a, sol.level), self.to_px(b, sol.level)
            p.drawLine(QLineF(pa, pb))
            self.placer.avoid_lines([pa.x(), pa.y(), pb.x(), pb.y()])
        if standpipe:
            # The head above the roof, as a dimension line.
            xr = float(s.outline[:, 0].max())
            top = self.to_px(xr, sol.level)
            roof = self.to_px(xr, s.z_max)
            x = top.x() + 1.2 * f
            p.setPen(QPen(colour, 0.9 * lw))
            p.drawLine(QLineF(top.x(), top.y(), x + 0.6 * f, top.y()))
            _arrow(p, QPointF(x, (top.y() + roof.y()) / 2), QPointF(x, top.y()), colour,
                   0.9 * lw, 0.7 * f)
            _arrow(p, QPointF(x, (top.y() + roof.y()) / 2), QPointF(x, roof.y()), colour,
                   0.9 * lw, 0.7 * f)
            self.placer.place(p, _Label(f"head {self.length(sol.head_above_top)}", fonts.label,
                                        SURFACE),
                              [(QPointF(x, (top.y() + roof.y()) / 2), (1, 0), 0.4 * f)])
        # The mark and its label on the widest span.
        a, b = max(spans, key=lambda ab: ab[1] - ab[0])
        xm = a + 0.7 * (b - a)
        apex = self.to_px(xm, sol.level)
        size = 0.5 * f
        _surface_mark(p, apex, size, colour, 1.1 * lw)
        p.restore()
        text = f"free surface {self.length(sol.level)}"
        if standpipe:
            text = f"free surface (standpipe head) {self.length(sol.level)}"
        elif sol.spill_level is not None and sol.requested_level > sol.level + 1e-12:
            text += ", capped at spill level"
        lift = QPointF(apex.x(), apex.y() - 1.5 * size)
        self.placer.reserve(QRectF(apex.x() - size, apex.y() - 1.5 * size, 2 * size, 2.5 * size))
        self.placer.place(p, _Label(text, fonts.label_bold, SURFACE),
                          [(lift, (1, -0.25), 0.5 * f), (lift, (-1, -0.25), 0.5 * f),
                           (lift, (0, -1), 0.5 * f), (lift, (1, -1), 1.5 * f),
                           (apex, (1, 1), 1.5 * f)], force=True)
        # Spill level, when the liquid stands below it.
        if sol.spill_level is not None and sol.spill_level > sol.level + 1e-9 * max(
                s.z_max - s.z_min, 1e-12):
            self._draw_spill(p, fonts)

    def _draw_spill(self, p, fonts):
        s = self.section
        f = fonts.base
        z = s.spill_level
        pts = s.outline
        n = s.n_edges
        # The lowest point of the open edges.
        best = None
        for i, part in enumerate(s.parts):
            if part != OPEN:
                continue
            for v in (i, (i + 1) % n):
                if pts[v, 1] == z and (best is None or pts[v, 0] > best[0]):
                    best = (float(pts[v, 0]), z)
        if best is None:
            return
        pt = self.to_px(*best)
        length = 2.2 * f
        p.save()
        pen = QPen(QColor(MUTED), 1.0 * self.lw)
        pen.setStyle(Qt.PenStyle.DashLine)
        p.setPen(pen)
        p.drawLine(QLineF(pt.x() - 0.4 * f, pt.y(), pt.x() + length, pt.y()))
        p.restore()
        self.placer.place(p, _Label(f"spill level {self.length(z)}", fonts.label, MUTED),
                          [(QPointF(pt.x() + length, pt.y()), (1, 0), 0.3 * f),
                           (QPointF(pt.x(), pt.y()), (0.3, -1), 0.3 * f),
                           (QPointF(pt.x(), pt.y()), (-1, -1), 0.3 * f)])

    def _draw_resultants(self, p, fonts):
        s, sol = self.section, self.sol
        f = fonts.base
        n = s.n_edges
        fx = np.zeros(n) if self.axi else np.nan_to_num(sol.fx)
        fz = sol.fz
        loads = []
        for part, edges in _runs(s.parts):
            if part in (OPEN, AXIS):
                continue
            edges = [e for e in edges if self.drawn[e] and sol.wetted_length[e] > 0]
            if not edges:
                continue
            gx, gz = float(fx[edges].sum()), float(fz[edges].sum())
            mag = math.hypot(gx, gz)
            if mag <= 0:
                continue
            if self.axi:
                where = self._wetted_midpoint(edges)
            else:
                w = sol.resultant[edges]
                cp = sol.centre_of_pressure[edges]
                ok = np.isfinite(cp).all(axis=1) & (w > 0)
                if not ok.any():
                    continue
                where = tuple((cp[ok] * w[ok, None]).sum(axis=0) / w[ok].sum())
            loads.append((part, gx, gz, mag, where))
        if not loads:
            return
        biggest = max(m for _, _, _, m, _ in loads)
        full = max(4.5 * f, 0.1 * min(self.placer.bounds.width(), self.placer.bounds.height()))
        drawn = []
        for part, gx, gz, mag, where in loads:
            if mag < 1e-9 * biggest:
                continue
            up = gz > 1e-9 * mag
            colour = UPLIFT if up else LOAD
            head = self.to_px(*where)
            ux, uy = gx / mag, -gz / mag  # screen direction of the force
            # Short enough to stay inside a narrow cavity (a riser).
            room = self._room_behind(head, (-ux, -uy))
            length = max(min(full, 0.42 * room), 3.2 * f)
            tail = QPointF(head.x() - ux * length, head.y() - uy * length)
            p.save()
            _arrow(p, tail, head, QColor(colour), 2.2 * self.lw, 1.1 * f)
            p.restore()
            value = self.force(mag)
            text = f"{part}: uplift {value}" if up else f"{part}: {value}"
            # Keep the labels of other arrows off this one.
            own = self.placer.reserve(QRectF(tail, head).normalized().adjusted(
                -0.3 * f, -0.3 * f, 0.3 * f, 0.3 * f))
            drawn.append((text, colour, tail, head, (-ux, -uy), own))
        for text, colour, tail, head, (dx, dy), own in drawn:
            label = _Label(text, fonts.label_bold, colour, frame=colour)
            mid = QPointF(0.5 * (tail.x() + head.x()), 0.5 * (tail.y() + head.y()))
            # Beside the shaft, the upper (or right) side first.
            side = (dy, -dx) if -dx < dx else (-dy, dx)
            if abs(dx) < 1e-6:  # an upright arrow: right side first
                side = (1.0, 0.0)
            other = (-side[0], -side[1])
            vertical = (0.0, 1.0 if dy > 0 else -1.0)
            horizontal = (1.0 if dx > 0 else -1.0, 0.0)
            self.placer.place(p, label, [
                (mid, side, 0.6 * f), (mid, other, 0.6 * f),
                (tail, vertical, 0.3 * f), (tail, horizontal, 0.3 * f),
                (tail, (dx, dy), 0.3 * f),
                (tail, (dx + side[0], dy + side[1]), 0.5 * f),
                (tail, (dx + other[0], dy + other[1]), 0.5 * f),
                (tail, (dx, dy), 2.5 * f), (tail, (dx, dy), 4.5 * f),
            ], force=True, ignore=own)

    def _room_behind(self, head, direction):
        """Pixel distance from ``head`` along ``direction`` to the outline."""
        seg = self.placer.segments
        hx, hy = head.x(), head.y()
        rx, ry = direction
        ax, ay = seg[:, 0] - hx, seg[:, 1] - hy
        ex, ey = seg[:, 2] - seg[:, 0], seg[:, 3] - seg[:, 1]
        denom = rx * ey - ry * ex
        with np.errstate(divide="ignore", invalid="ignore"):
            t = (ax * ey - ay * ex) / denom
            u = (ax * ry - ay * rx) / denom
        hit = (denom != 0) & (t > 1.0) & (u >= 0) & (u <= 1)
        return float(t[hit].min()) if hit.any() else math.inf

    def _wetted_midpoint(self, edges):
        """The point halfway along the wetted length of a run of edges."""
        s = self.section
        pts = s.outline
        pieces = []
        for e in edges:
            j = (e + 1) % s.n_edges
            seg = _wetted_segment(pts[e, 0], pts[e, 1], pts[j, 0], pts[j, 1], self.level, self.rg)
            if seg is not None:
                pieces.append((seg[0], seg[1], seg[3], seg[4]))
        lengths = [math.hypot(b - a, d - c) for a, c, b, d in pieces]
        half = 0.5 * sum(lengths)
        for (xa, za, xb, zb), length in zip(pieces, lengths, strict=True):
            if half <= length and length > 0:
                t = half / length
                return xa + t * (xb - xa), za + t * (zb - za)
            half -= length
        xa, za, xb, zb = pieces[-1]
        return xb, zb

    def _draw_pressure_labels(self, p, fonts):
        """Pressure values: at the middle of every uniform diagram (a
        horizontal wall), and at each wetted vertex of a sloping or upright
        wall (its ends and kinks), highest pressure first."""
        if not self.segs or self.k <= 0:
            return
        s = self.section
        f = fonts.base
        n = s.n_edges
        pts = s.outline
        tol = 1e-9 * self.sol.max_pressure
        jobs = []  # (pressure, candidates)
        at = {}
        for i, (xa, za, pa, xb, zb, pb), nx, nz in self.segs:
            d = (nx, -nz)
            if abs(pa - pb) <= tol:
                cands = []
                for t in (0.5, 0.3, 0.7, 0.15, 0.85):
                    x, z = xa + t * (xb - xa), za + t * (zb - za)
                    tip = self._ordinate(x, z, nx, nz, pa)
                    cands.append((tip, d, 0.3 * f))
                jobs.append((pa, cands))
                continue
            for v, pv in ((i, pa), ((i + 1) % n, pb)):
                if pv > 0:
                    at.setdefault(v, [pv, []])[1].append((nx, nz))
        deepest = max(at, key=lambda v: at[v][0]) if at else None
        for v, (pv, normals) in at.items():
            if len(normals) == 2 and v != deepest:
                (ax, az), (bx, bz) = normals
                if ax * bx + az * bz > _KINK_COS:
                    continue  # a smooth bend (a polyline curve), not a kink
            x, z = float(pts[v, 0]), float(pts[v, 1])
            sx = sum(nx for nx, _ in normals)
            sz = sum(nz for _, nz in normals)
            norm = math.hypot(sx, sz)
            if norm < 1e-6:
                sx, sz, norm = normals[0][0], normals[0][1], 1.0
            dx, dz = sx / norm, sz / norm
            reach = max(self.k * pv * (nx * dx + nz * dz) for nx, nz in normals)
            tip = self.to_px(x + dx * max(reach, 0.0), z + dz * max(reach, 0.0))
            cands = [(tip, (dx, -dz), 0.3 * f)]
            for nx, nz in normals:
                t = self._ordinate(x, z, nx, nz, pv)
                cands.append((t, (nx, -nz), 0.3 * f))
                cands.append((t, (nx - 0.9 * nz, -nz - 0.9 * nx), 0.3 * f))
                cands.append((t, (nx + 0.9 * nz, -nz + 0.9 * nx), 0.3 * f))
                cands.append((t, (nx, -nz), 1.5 * f))
            jobs.append((pv, cands))
        jobs.sort(key=lambda job: -job[0])
        placed = []  # (text, centre) of labels drawn
        near = 7.0 * f
        for pv, cands in jobs:
            text = self.pressure(pv)
            anchor = cands[0][0]
            if any(t == text and math.hypot(c.x() - anchor.x(), c.y() - anchor.y()) < near
                   for t, c in placed):
                continue  # the same value is already written close by
            rect = self.placer.place(p, _Label(text, fonts.label, DIAGRAM_TEXT), cands)
            if rect is not None:
                placed.append((text, rect.center()))

    def _draw_scales(self, p, fonts, band):
        f = fonts.base
        du = self.du
        lw = self.lw
        x = band.left()
        y = band.bottom() - 1.3 * f
        # Length scale: four alternating cells.
        unit = du.label("length")
        per_unit = self.scale * du.factor("length")  # px per display length unit
        step = _nice_step(0.22 * band.width() / per_unit / 4)
        cell = step * per_unit
        h = 0.45 * f
        p.save()
        p.setPen(QPen(QColor(INK), 0.8 * lw))
        for k in range(4):
            r = QRectF(x + k * cell, y - h, cell, h)
            p.setBrush(QColor(INK) if k % 2 == 0 else QColor("white"))
            p.drawRect(r)
        p.setFont(fonts.small)
        p.setPen(QColor(INK))
        for k in (0, 2, 4):
            t = f"{k * step:g}"
            if k == 4:
                t += f" {unit}"
            tx = x + k * cell
            p.drawText(QRectF(tx - 3 * f, y - h - 1.5 * f, 6 * f, 1.3 * f),
                       _HCENTER | _VCENTER, t)
        p.drawText(QRectF(x, y + 0.2 * f, 4 * cell + 10 * f, 1.2 * f), _LEFT | _TOP,
                   "length scale")
        x2 = x + 4 * cell + 5.5 * f
        if self.k > 0:
            # Pressure scale: the ordinate of a round pressure.
            pu = du.label("pressure")
            per_p = self.scale * self.k * du.factor("pressure")  # px per display pressure unit
            pstep = _nice_step(0.18 * band.width() / per_p)
            bar = pstep * per_p
            poly = QPolygonF([QPointF(x2, y), QPointF(x2 + bar, y), QPointF(x2 + bar, y - h * 2.2)])
            p.setPen(Qt.PenStyle.NoPen)
            p.setBrush(QColor(*DIAGRAM_FILL))
            p.drawPolygon(poly)
            p.setPen(QPen(QColor(DIAGRAM_LINE), 1.0 * lw))
            p.drawLine(QLineF(x2, y, x2 + bar, y))
            p.drawLine(QLineF(x2, y - 0.5 * h, x2, y + 0.5 * h))
            p.drawLine(QLineF(x2 + bar, y - h * 2.2, x2 + bar, y + 0.5 * h))
            p.setFont(fonts.small)
            p.setPen(QColor(DIAGRAM_TEXT))
            p.drawText(QRectF(x2 + bar + 0.5 * f, y - 1.4 * f, 10 * f, 1.3 * f),
                       _LEFT | _VCENTER, f"{pstep:g} {pu}")
            p.setPen(QColor(INK))
            p.drawText(QRectF(x2, y + 0.2 * f, bar + 12 * f, 1.2 * f), _LEFT | _TOP,
                       "pressure scale")
        p.restore()


# --------------------------------------------------------------------- API
def render_diagram(case, *, level=None, units="si", size=DEFAULT_SIZE, date=None):
    """Paint the pressure diagram of ``case`` on a new image.

    Parameters
    ----------
    case : wetline.core.case.Case
        The section, liquid, gravity and fill.
    level : float, optional
        Free-surface height [m] instead of the case's fill; capped at the
        spill level of an open section (the title block says so).
    units : str
        ``"si"`` (m, kPa, kN) or ``"us"`` (ft, psi, lbf).
    size : (int, int)
        Image width and height [px], each ``MIN_SIDE`` to ``MAX_SIDE``.
        The default fits A4 landscape at 300 dpi.
    date : datetime.date or str, optional
        Date printed in the title block; default today (ISO 8601).

    Returns
    -------
    PySide6.QtGui.QImage
        White background, 300 dpi in its metadata.

    Raises
    ------
    ExportError
        For a bad size, or an image too large for the memory.
    core.units.UnitError
        For an unknown unit system.
    """
    w, h = _check_size(size)
    du = display_units(units)
    _ensure_app()
    if level is not None:
        level = float(level)
        if not math.isfinite(level):
            raise ExportError(f"level must be a finite number, not {level}")
    solution = case.solve(level)
    image = QImage(w, h, QImage.Format.Format_RGB32)
    if image.isNull():
        raise ExportError(f"not enough memory for a {w} x {h} px image")
    dpm = int(round(DPI / 0.0254))
    image.setDotsPerMeterX(dpm)
    image.setDotsPerMeterY(dpm)
    _Scene(case, solution, du.name, (w, h), date).paint(image)
    return image


def export_png(case, path, *, level=None, units="si", size=DEFAULT_SIZE, date=None):
    """Write the pressure diagram of ``case`` to a PNG file, atomically.

    The image is written to a temporary file in the same folder, then
    renamed over ``path``, so a failed export never leaves a half-written
    or stray file. Parameters as :func:`render_diagram`.

    Raises
    ------
    ExportError
        For a bad size or a path that cannot be written (missing folder, a
        folder in the way, no permission, disk full), naming the problem.
    """
    w, h = _check_size(size)
    try:
        check_target(path, "the PNG")
        image = render_diagram(case, level=level, units=units, size=(w, h), date=date)
        with atomic_path(path) as tmp:
            if not image.save(tmp, "PNG"):
                raise ExportError(f"cannot write {path}: saving the PNG failed "
                                  "(disk full or no permission?)")
    except WriteError as exc:
        raise ExportError(str(exc)) from None
