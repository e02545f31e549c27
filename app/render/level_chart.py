"""The loads-against-level chart, painted with QPainter (no pyqtgraph).

For the calculation sheet and any other static output: the floor force, the
support reaction, the liquid weight and each other part's downward load from
empty to the top level (the spill level of an open section; the roof, or the
level when it stands higher, of a closed one), with the current level
marked. Downward loads are positive; a lifted part goes below zero.

:func:`paint_level_chart` paints into a rectangle with a caller's painter
(a page of a PDF, a widget, an image); :func:`render_level_chart` returns a
white :class:`QImage`. The curves come from :func:`wetline.core.level_table.level_table`
(the same closed-form integrals as the solve), converted to display units.
"""

from __future__ import annotations

import math

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFont, QFontMetricsF, QImage, QPainter, QPainterPath, QPen

from wetline.app.render.scene import (
    FONT_FAMILY,
    INK,
    MUTED,
    ExportError,
    _ensure_app,
    _fmt_length,
    _part_colours,
)
from wetline.core.level_table import level_table
from wetline.core.report_tables import force_scope
from wetline.core.section import FLOOR
from wetline.core.units import display_units

__all__ = ["LEVEL_MARK", "chart_series", "paint_level_chart", "render_level_chart"]

LEVEL_MARK = "#d04a02"
"""Colour of the current-level marker."""

_FIXED = (("fluid_weight", "liquid weight", "#1d5fa6", Qt.PenStyle.DashLine),
          ("floor_force", "floor force", "#6b4a2b", Qt.PenStyle.SolidLine),
          ("support_reaction", "support reaction", "#1d2530", Qt.PenStyle.SolidLine))
_LEFT = Qt.AlignmentFlag.AlignLeft
_RIGHT = Qt.AlignmentFlag.AlignRight
_HCENTER = Qt.AlignmentFlag.AlignHCenter
_VCENTER = Qt.AlignmentFlag.AlignVCenter
_TOP = Qt.AlignmentFlag.AlignTop


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
        [display force unit] at each level.
    current : float
        The current level [display length unit] (capped at an open
        section's spill level).
    """
    du = display_units(units)
    s = case.section
    sol = case.solve(level)
    top = max(s.top_level, sol.level)
    levels = np.linspace(s.z_min, top, max(int(steps), 2))
    t = level_table(s, case.liquid.density, case.gravity, levels=levels)
    colours = _part_colours(s)
    series = [(key, label, colour, style, du.to_display(getattr(t, key), "force"))
              for key, label, colour, style in _FIXED]
    for name, down in t.part_down.items():
        if name == FLOOR:
            continue  # the floor's load is the floor force
        series.append((f"down:{name}", f"{name} (down)", colours[name],
                       Qt.PenStyle.DotLine, du.to_display(down, "force")))
    return du.to_display(levels, "length"), series, float(du.to_display(sol.level, "length"))


def _nice_ticks(lo, hi, target=6):
    """Round tick values covering [lo, hi]."""
    span = hi - lo
    if not span > 0:
        span = abs(hi) or 1.0
        lo, hi = lo - 0.5 * span, hi + 0.5 * span
        span = hi - lo
    raw = span / target
    e = math.floor(math.log10(raw))
    step = 10.0 ** e
    for m in (1.0, 2.0, 2.5, 5.0, 10.0):
        if m * 10.0 ** e >= raw:
            step = m * 10.0 ** e
            break
    first = math.floor(lo / step + 1e-9) * step
    last = math.ceil(hi / step - 1e-9) * step
    n = int(round((last - first) / step))
    return [first + k * step for k in range(n + 1)], step


def _tick_text(v, step):
    """A tick value with just the decimals its step needs."""
    decimals = 0
    while decimals < 6 and abs(step * 10 ** decimals - round(step * 10 ** decimals)) > 1e-6:
        decimals += 1
    text = f"{v:.{decimals}f}"
    return "0" if float(text) == 0 else text


def _font(px, bold=False):
    f = QFont(FONT_FAMILY)
    f.setPixelSize(max(1, int(round(px))))
    if bold:
        f.setWeight(QFont.Weight.Bold)
    f.setFeature(QFont.Tag("liga"), 0)  # text reads back as typed (PDF, SVG)
    return f


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
    """
    du = display_units(units)
    x, series, current = chart_series(case, level=level, units=units, steps=steps)
    s = case.section
    f = float(font_px) if font_px else max(9.0, 0.032 * min(rect.height(), rect.width()))
    body, small = _font(f), _font(0.88 * f)
    lw = max(1.0, f / 9.0)
    fm = QFontMetricsF(small)
    L, F = du.label("length"), du.label("force")

    ys = np.concatenate([v for *_, v in series] + [np.zeros(1)])
    yticks, ystep = _nice_ticks(float(ys.min()), float(ys.max()))
    xticks, xstep = _nice_ticks(float(x[0]), float(x[-1]))
    xlo, xhi = float(x[0]), float(x[-1])
    if not xhi > xlo:
        xlo, xhi = xticks[0], xticks[-1]
    xticks = [t for t in xticks if xlo - 1e-9 * abs(xstep) <= t <= xhi + 1e-9 * abs(xstep)]
    ylo, yhi = yticks[0], yticks[-1]

    # Legend to the right of the plot.
    labels = [label for _, label, *_ in series] + [f"current level {_fmt_length(current)} {L}"]
    sym = 2.6 * f
    legend_w = sym + 0.6 * f + max(QFontMetricsF(body).horizontalAdvance(t) for t in labels)
    legend_w = min(legend_w, 0.36 * rect.width())
    ytick_w = max(fm.horizontalAdvance(_tick_text(t, ystep)) for t in yticks)
    plot = QRectF(rect.left() + 2.0 * f + ytick_w + 0.6 * f, rect.top() + 0.8 * f,
                  0.0, 0.0)
    plot.setRight(rect.right() - legend_w - 1.4 * f)
    plot.setBottom(rect.bottom() - 3.4 * f)
    if plot.width() <= 4 * f or plot.height() <= 4 * f:
        raise ExportError("the area for the loads-against-level chart is too small")

    def px(xv, yv):
        return QPointF(plot.left() + (xv - xlo) / (xhi - xlo) * plot.width(),
                       plot.bottom() - (yv - ylo) / (yhi - ylo) * plot.height())

    p.save()
    try:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        p.setRenderHint(QPainter.RenderHint.TextAntialiasing, True)
        # Grid, ticks and tick labels.
        p.setFont(small)
        for t in yticks:
            a, b = px(xlo, t), px(xhi, t)
            p.setPen(QPen(QColor("#e3e7eb"), 0.8 * lw))
            p.drawLine(QLineF(a, b))
            p.setPen(QColor(INK))
            p.drawText(QRectF(plot.left() - ytick_w - 1.6 * f, a.y() - f, ytick_w + f, 2 * f),
                       _RIGHT | _VCENTER, _tick_text(t, ystep))
        for t in xticks:
            a, b = px(t, ylo), px(t, yhi)
            p.setPen(QPen(QColor("#e3e7eb"), 0.8 * lw))
            p.drawLine(QLineF(a, b))
            p.setPen(QColor(INK))
            p.drawText(QRectF(a.x() - 3 * f, plot.bottom() + 0.3 * f, 6 * f, 1.3 * f),
                       _HCENTER | _TOP, _tick_text(t, xstep))
        if ylo < 0 < yhi:
            p.setPen(QPen(QColor(MUTED), 1.0 * lw))
            p.drawLine(QLineF(px(xlo, 0.0), px(xhi, 0.0)))
        p.setPen(QPen(QColor(INK), 1.2 * lw))
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.drawRect(plot)
        # Axis titles.
        p.setFont(body)
        p.drawText(QRectF(plot.left(), plot.bottom() + 1.8 * f, plot.width(), 1.5 * f),
                   _HCENTER | _TOP, f"Level of the free surface [{L}]")
        p.save()
        p.translate(rect.left() + 0.2 * f, plot.center().y())
        p.rotate(-90)
        p.drawText(QRectF(-plot.height() / 2, 0, plot.height(), 1.5 * f), _HCENTER | _TOP,
                   f"Downward load [{F}] (negative: lifted)")
        p.restore()
        # Curves.
        p.save()
        p.setClipRect(plot.adjusted(-lw, -lw, lw, lw))
        # The totals wide underneath, the parts (dotted) narrower on top, so
        # a part that carries the whole support reaction shows both.
        for k, (_, _, colour, style, y) in enumerate(series):
            path = QPainterPath(px(float(x[0]), float(y[0])))
            for xv, yv in zip(x[1:].tolist(), y[1:].tolist(), strict=True):
                path.lineTo(px(xv, yv))
            pen = QPen(QColor(colour), (2.4 if k < len(_FIXED) else 1.7) * lw, style)
            pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
            p.setPen(pen)
            p.drawPath(path)
        # The current level, and where it cuts each curve.
        pen = QPen(QColor(LEVEL_MARK), 1.6 * lw, Qt.PenStyle.DashDotLine)
        p.setPen(pen)
        p.drawLine(QLineF(px(current, ylo), px(current, yhi)))
        p.setPen(QPen(QColor(LEVEL_MARK), 1.2 * lw))
        p.setBrush(QColor("white"))
        r = 0.28 * f
        for *_, y in series:
            c = px(current, float(np.interp(current, x, y)))
            p.drawEllipse(c, r, r)
        p.restore()
        # Legend.
        ly = plot.top()
        lx = plot.right() + 1.4 * f
        p.setFont(body)
        items = [(colour, style, label) for _, label, colour, style, _ in series]
        items.append((LEVEL_MARK, Qt.PenStyle.DashDotLine, labels[-1]))
        for colour, style, label in items:
            cy = ly + 0.75 * f
            pen = QPen(QColor(colour), 2.2 * lw, style)
            pen.setCapStyle(Qt.PenCapStyle.FlatCap)
            p.setPen(pen)
            p.drawLine(QLineF(lx, cy, lx + sym, cy))
            p.setPen(QColor(INK))
            tr = QRectF(lx + sym + 0.6 * f, ly, legend_w - sym - 0.6 * f, 10 * f)
            br = p.boundingRect(tr, int(_LEFT | _TOP) | int(Qt.TextFlag.TextWordWrap), label)
            p.drawText(tr, int(_LEFT | _TOP) | int(Qt.TextFlag.TextWordWrap), label)
            ly += max(br.height(), 1.5 * f) + 0.35 * f
        note = f"Forces {force_scope(s, du)}."
        p.setFont(small)
        p.setPen(QColor(MUTED))
        p.drawText(QRectF(lx, ly + 0.4 * f, legend_w, 4 * f),
                   int(_LEFT | _TOP) | int(Qt.TextFlag.TextWordWrap), note)
    finally:
        p.restore()


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
    _ensure_app()
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
