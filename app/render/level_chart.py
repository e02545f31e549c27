"""The loads-against-level chart, painted with QPainter (no pyqtgraph).

For the calculation sheet and any other static output: the floor force, the
support reaction, the liquid weight and each other part's downward load from
empty to the top level (the spill level of an open section; the roof, or the
level when it stands higher, of a closed one), with the current level
marked. Downward loads are positive; a lifted part goes below zero.

:func:`paint_level_chart` paints into a rectangle with a caller's painter
(a page of a PDF, a widget, an image); :func:`render_level_chart` returns a
white :class:`QImage`. The curves come from :func:`wetline.core.level_table.level_table`
(the same closed-form integrals as the solve), converted to display units
as :func:`wetline.core.force_scope.force_scope` says.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFontMetricsF, QImage, QPainter, QPainterPath, QPen

from wetline.app.render.output import ExportError, ensure_app
from wetline.app.render.style import (
    HCENTER,
    INK,
    LEFT,
    LEVEL_MARK,
    LEVEL_SERIES,
    MUTED,
    RIGHT,
    TOP,
    VCENTER,
    WRAP,
    part_colours,
    pixel_font,
)
from wetline.core.force_scope import force_scope
from wetline.core.level_table import level_table
from wetline.core.numbers import DEFAULT_DIGITS, format_number, nice_step
from wetline.core.section import FLOOR
from wetline.core.units import display_units

__all__ = ["chart_series", "paint_level_chart", "render_level_chart", "ticks", "tick_text"]

GRID = "#e3e7eb"
"""Grid lines of the chart."""


def chart_series(case, *, level=None, units="si", steps=101):
    """The chart's data in display units.

    Parameters
    ----------
    case : wetline.core.case.Case
    level : float, optional
        Current level [m]; default the case's fill.
    units : str
        ``"si"`` or ``"us"``.
    steps : int
        Number of levels, >= 2.

    Returns
    -------
    levels : numpy.ndarray
        [display length unit]
    series : list of (str, str, str, Qt.PenStyle, numpy.ndarray)
        ``(key, label, colour, pen style, values)``, values downward loads
        at each level [display force unit of the force scope].
    current : float
        The current level [display length unit] (capped at an open
        section's spill level).
    """
    du = display_units(units)
    s = case.section
    scope = force_scope(s, du, case.length_unit)
    sol = case.solve(level)
    colours = part_colours(s.part_names)
    resolved = getattr(case, "resolved", None)
    if resolved is not None and (not resolved.is_one_liquid or s.pocket_tree.may_trap):
        # A load case's own law (layers, gas) and, where the section can trap
        # air, the same with the air trapped: both assumptions, as the window.
        tables = resolved.level_tables(max(int(steps), 2))
        levels = tables[0].levels
    else:
        top = max(s.top_level, sol.level)
        levels = np.linspace(s.z_min, top, max(int(steps), 2))
        tables = (level_table(s, case.liquid.density, case.gravity, levels=levels),)
    series = []
    for k, t in enumerate(tables):
        trapped = k > 0
        rows = [(key, label, colour, style, getattr(t, key))
                for key, label, colour, style in LEVEL_SERIES]
        rows += [(f"down:{name}", f"{name} (down)", colours[name], Qt.PenStyle.DotLine, down)
                 for name, down in t.part_down.items() if name != FLOOR]
        for key, label, colour, style, values in rows:
            shown = scope.to_display(np.interp(levels, t.levels, values) if trapped
                                     else values)
            if trapped:
                base = next((v for kk, *_, v in series if kk == key), None)
                scale = float(np.max(np.abs(shown), initial=0.0))
                if base is not None and np.allclose(shown, base, rtol=0.0,
                                                    atol=1e-9 * scale):
                    continue  # the same with the air trapped: drawn once
                key, label, style = (f"{key}:trapped", f"{label}, air trapped",
                                     Qt.PenStyle.DashDotLine)
            series.append((key, label, colour, style, shown))
    return du.to_display(levels, "length"), series, float(du.to_display(sol.level, "length"))


def ticks(lo, hi, target=6):
    """Round tick values covering [lo, hi] about ``target`` steps apart, and
    the step (a 1-2-5 number, :func:`wetline.core.numbers.nice_step`)."""
    span = hi - lo
    if not span > 0:
        span = abs(hi) or 1.0
        lo, hi = lo - 0.5 * span, hi + 0.5 * span
        span = hi - lo
    step = nice_step(span / target)
    first = math.floor(lo / step + 1e-9) * step
    last = math.ceil(hi / step - 1e-9) * step
    n = int(round((last - first) / step))
    return [first + k * step for k in range(n + 1)], step


def tick_text(value, step):
    """A tick value as text: the one number formatter with the figures its
    step needs (0 for a value that is round-off next to the step)."""
    top = abs(value) if value else step
    digits = max(DEFAULT_DIGITS, math.floor(math.log10(top)) - math.floor(math.log10(step)) + 1)
    return format_number(value, digits, scale=step)


@dataclass
class _Frame:
    """The plot area and its mapping from chart values to the painter."""

    plot: QRectF
    xlo: float
    xhi: float
    ylo: float
    yhi: float

    def px(self, xv, yv):
        p = self.plot
        return QPointF(p.left() + (xv - self.xlo) / (self.xhi - self.xlo) * p.width(),
                       p.bottom() - (yv - self.ylo) / (self.yhi - self.ylo) * p.height())


class _Chart:
    """One painting of the chart: its data, fonts, frame and the steps that draw it."""

    def __init__(self, rect, case, level, units, steps, font_px):
        self.du = display_units(units)
        self.x, self.series, self.current = chart_series(case, level=level, units=units,
                                                         steps=steps)
        self.scope = force_scope(case.section, self.du, case.length_unit)
        f = self.f = (float(font_px) if font_px
                      else max(9.0, 0.032 * min(rect.height(), rect.width())))
        self.body, self.small = pixel_font(f), pixel_font(0.88 * f)
        self.lw = max(1.0, f / 9.0)
        level_text = f"current level {format_number(self.current)} {self.du.label('length')}"
        self.labels = [label for _, label, *_ in self.series] + [level_text]
        self._lay_out(rect)

    def _lay_out(self, rect):
        f, x = self.f, self.x
        ys = np.concatenate([v for *_, v in self.series] + [np.zeros(1)])
        self.yticks, self.ystep = ticks(float(ys.min()), float(ys.max()))
        xticks, self.xstep = ticks(float(x[0]), float(x[-1]))
        xlo, xhi = float(x[0]), float(x[-1])
        if not xhi > xlo:
            xlo, xhi = xticks[0], xticks[-1]
        tol = 1e-9 * abs(self.xstep)
        self.xticks = [t for t in xticks if xlo - tol <= t <= xhi + tol]
        self.sym = 2.6 * f
        legend_w = self.sym + 0.6 * f + max(QFontMetricsF(self.body).horizontalAdvance(t)
                                            for t in self.labels)
        self.legend_w = min(legend_w, 0.36 * rect.width())
        fm = QFontMetricsF(self.small)
        self.ytick_w = max(fm.horizontalAdvance(tick_text(t, self.ystep)) for t in self.yticks)
        plot = QRectF(rect.left() + 2.0 * f + self.ytick_w + 0.6 * f, rect.top() + 0.8 * f,
                      0.0, 0.0)
        plot.setRight(rect.right() - self.legend_w - 1.4 * f)
        plot.setBottom(rect.bottom() - 3.4 * f)
        if plot.width() <= 4 * f or plot.height() <= 4 * f:
            raise ExportError("the area for the loads-against-level chart is too small")
        self.rect = rect
        self.frame = _Frame(plot, xlo, xhi, self.yticks[0], self.yticks[-1])

    def draw(self, p):
        p.save()
        try:
            p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
            p.setRenderHint(QPainter.RenderHint.TextAntialiasing, True)
            self._draw_grid(p)
            self._draw_axis_titles(p)
            self._draw_curves(p)
            self._draw_legend(p)
        finally:
            p.restore()

    def _draw_grid(self, p):
        """Grid lines, tick labels, the zero line and the plot's frame."""
        fr, f, lw = self.frame, self.f, self.lw
        plot = fr.plot
        p.setFont(self.small)
        for t in self.yticks:
            a, b = fr.px(fr.xlo, t), fr.px(fr.xhi, t)
            p.setPen(QPen(QColor(GRID), 0.8 * lw))
            p.drawLine(QLineF(a, b))
            p.setPen(QColor(INK))
            p.drawText(QRectF(plot.left() - self.ytick_w - 1.6 * f, a.y() - f,
                              self.ytick_w + f, 2 * f), RIGHT | VCENTER,
                       tick_text(t, self.ystep))
        for t in self.xticks:
            a, b = fr.px(t, fr.ylo), fr.px(t, fr.yhi)
            p.setPen(QPen(QColor(GRID), 0.8 * lw))
            p.drawLine(QLineF(a, b))
            p.setPen(QColor(INK))
            p.drawText(QRectF(a.x() - 3 * f, plot.bottom() + 0.3 * f, 6 * f, 1.3 * f),
                       HCENTER | TOP, tick_text(t, self.xstep))
        if fr.ylo < 0 < fr.yhi:
            p.setPen(QPen(QColor(MUTED), 1.0 * lw))
            p.drawLine(QLineF(fr.px(fr.xlo, 0.0), fr.px(fr.xhi, 0.0)))
        p.setPen(QPen(QColor(INK), 1.2 * lw))
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.drawRect(plot)

    def _draw_axis_titles(self, p):
        plot, f = self.frame.plot, self.f
        p.setFont(self.body)
        p.drawText(QRectF(plot.left(), plot.bottom() + 1.8 * f, plot.width(), 1.5 * f),
                   HCENTER | TOP, f"Level of the free surface [{self.du.label('length')}]")
        p.save()
        p.translate(self.rect.left() + 0.2 * f, plot.center().y())
        p.rotate(-90)
        p.drawText(QRectF(-plot.height() / 2, 0, plot.height(), 1.5 * f), HCENTER | TOP,
                   f"Downward load [{self.scope.label}] (negative: lifted)")
        p.restore()

    def _draw_curves(self, p):
        """The totals wide underneath, the parts (dotted) narrower on top, so
        a part that carries the whole support reaction shows both; then the
        current level and where it cuts each curve."""
        fr, x, lw = self.frame, self.x, self.lw
        p.save()
        p.setClipRect(fr.plot.adjusted(-lw, -lw, lw, lw))
        for k, (_, _, colour, style, y) in enumerate(self.series):
            path = QPainterPath(fr.px(float(x[0]), float(y[0])))
            for xv, yv in zip(x[1:].tolist(), y[1:].tolist(), strict=True):
                path.lineTo(fr.px(xv, yv))
            pen = QPen(QColor(colour), (2.4 if k < len(LEVEL_SERIES) else 1.7) * lw, style)
            pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
            p.setPen(pen)
            p.drawPath(path)
        p.setPen(QPen(QColor(LEVEL_MARK), 1.6 * lw, Qt.PenStyle.DashDotLine))
        p.drawLine(QLineF(fr.px(self.current, fr.ylo), fr.px(self.current, fr.yhi)))
        p.setPen(QPen(QColor(LEVEL_MARK), 1.2 * lw))
        p.setBrush(QColor("white"))
        r = 0.28 * self.f
        for *_, y in self.series:
            p.drawEllipse(fr.px(self.current, float(np.interp(self.current, x, y))), r, r)
        p.restore()

    def _draw_legend(self, p):
        """The legend to the right of the plot, and what the forces cover."""
        f, lw = self.f, self.lw
        ly = self.frame.plot.top()
        lx = self.frame.plot.right() + 1.4 * f
        p.setFont(self.body)
        items = [(colour, style, label) for _, label, colour, style, _ in self.series]
        items.append((LEVEL_MARK, Qt.PenStyle.DashDotLine, self.labels[-1]))
        for colour, style, label in items:
            cy = ly + 0.75 * f
            pen = QPen(QColor(colour), 2.2 * lw, style)
            pen.setCapStyle(Qt.PenCapStyle.FlatCap)
            p.setPen(pen)
            p.drawLine(QLineF(lx, cy, lx + self.sym, cy))
            p.setPen(QColor(INK))
            tr = QRectF(lx + self.sym + 0.6 * f, ly, self.legend_w - self.sym - 0.6 * f, 10 * f)
            br = p.boundingRect(tr, LEFT | TOP | WRAP, label)
            p.drawText(tr, LEFT | TOP | WRAP, label)
            ly += max(br.height(), 1.5 * f) + 0.35 * f
        p.setFont(self.small)
        p.setPen(QColor(MUTED))
        p.drawText(QRectF(lx, ly + 0.4 * f, self.legend_w, 4 * f), LEFT | TOP | WRAP,
                   f"Forces {self.scope.words}.")


def paint_level_chart(p, rect, case, *, level=None, units="si", steps=101, font_px=None):
    """Paint the loads-against-level chart of ``case`` into ``rect``.

    Parameters
    ----------
    p : PySide6.QtGui.QPainter
        An active painter; its state is restored afterwards.
    rect : PySide6.QtCore.QRectF
        Where to paint, in the painter's coordinates.
    case : wetline.core.case.Case
    level : float, optional
        Current level [m]; default the case's fill.
    units : str
        ``"si"`` or ``"us"``.
    steps : int
        Number of levels computed.
    font_px : float, optional
        Base font size in the painter's units; default from the height.

    Raises
    ------
    wetline.app.render.output.ExportError
        If ``rect`` is too small for the chart.
    """
    _Chart(rect, case, level, units, steps, font_px).draw(p)


def render_level_chart(case, *, level=None, units="si", size=(1200, 700), steps=101):
    """The loads-against-level chart of ``case`` on a new white image.

    Parameters as :func:`paint_level_chart`; ``size`` is (width, height)
    [px], each at least 200.

    Returns
    -------
    PySide6.QtGui.QImage
    """
    w, h = (int(v) for v in size)
    if w < 200 or h < 200:
        raise ExportError(f"a chart of {w} x {h} px is too small (at least 200 x 200)")
    ensure_app()
    image = QImage(w, h, QImage.Format.Format_RGB32)
    if image.isNull():
        raise ExportError(f"not enough memory for a {w} x {h} px image")
    image.fill(QColor("white"))
    p = QPainter(image)
    try:
        m = 0.02 * min(w, h)
        paint_level_chart(p, QRectF(m, m, w - 2 * m, h - 2 * m), case, level=level,
                          units=units, steps=steps)
    finally:
        p.end()
    return image
