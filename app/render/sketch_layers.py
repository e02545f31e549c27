"""Layers of the exported diagram that make it a dimensioned sketch: vertex
and edge numbers (the same indices as every table), the dimension lines of
the overall width and height with the levels that matter, and the structure
around the cavity (hatched section, ground and groundwater lines, the
groundwater's pressure on the outer face).

Each function paints with a QPainter into a
:class:`wetline.app.render.diagram_view.DiagramView`; what is dimensioned
comes from :func:`wetline.app.render.geometry.dimension_levels` and
:func:`wetline.app.render.geometry.numbered`, in the display length unit.
"""

from __future__ import annotations

import math

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QBrush, QColor, QFontMetricsF, QPainterPath, QPen, QPolygonF

from wetline.app.render.geometry import diagram_polygons, numbered
from wetline.app.render.label_painter import Label
from wetline.app.render.marks import draw_arrow, draw_surface_mark
from wetline.app.render.style import (
    DIMENSION,
    GROUND,
    GROUNDWATER,
    GROUNDWATER_FILL,
    INK,
    MUTED,
    RIGHT,
    STRUCTURE_FILL,
    VCENTER,
)

__all__ = ["draw_numbers", "draw_dimensions", "draw_structure", "draw_outer_diagram",
           "MAX_NUMBERS"]

MAX_NUMBERS = 48
"""Vertices and edges numbered at most (every k-th and the corners beyond)."""


def _unit(dx, dy):
    n = math.hypot(dx, dy)
    return (dx / n, dy / n) if n > 0 else (0.0, -1.0)


def draw_numbers(p, view):
    """Vertex numbers outside each corner and edge numbers, boxed, inside
    the cavity beside each edge's middle: the indices of the tables (edge i
    runs from vertex i to vertex i + 1). Placed before any other label."""
    s = view.scene.section
    pts = s.outline
    n = s.n_edges
    geo = s.geometry
    f = view.f
    vertices, edges = numbered(s, MAX_NUMBERS)
    font = view.fonts.small
    for i in vertices.tolist():
        # Outward: between the normals of the edges meeting here (screen y down).
        a, b = (i - 1) % n, i
        ux, uy = _unit(geo.nx[a] + geo.nx[b], -(geo.nz[a] + geo.nz[b]))
        at = view.to_px(pts[i, 0], pts[i, 1])
        cands = [(at, (ux, uy), 0.25 * f), (at, (ux + uy, uy - ux), 0.25 * f),
                 (at, (ux - uy, uy + ux), 0.25 * f), (at, (-uy, ux), 0.35 * f),
                 (at, (uy, -ux), 0.35 * f), (at, (ux, uy), 1.1 * f)]
        view.labels.place(p, Label(str(i), font, INK), cands, force=True)
    for i in edges.tolist():
        j = (i + 1) % n
        ix, iy = -geo.nx[i], geo.nz[i]  # inward, screen y down
        cands = []
        for t in (0.5, 0.35, 0.65, 0.2, 0.8):
            at = view.to_px(pts[i, 0] + t * (pts[j, 0] - pts[i, 0]),
                            pts[i, 1] + t * (pts[j, 1] - pts[i, 1]))
            cands.append((at, (ix, iy), 0.35 * f))
        view.labels.place(p, Label(str(i), font, MUTED, frame=MUTED), cands, force=True)


def _tick(p, at, size):
    """A dimension tick: a short 45-degree stroke through ``at``."""
    p.drawLine(QLineF(at.x() - size, at.y() + size, at.x() + size, at.y() - size))


def draw_dimensions(p, view):
    """The overall height with the levels that matter (a vertical dimension
    line left of the drawing, a tick and the level's name and height at
    each) and the overall width (a horizontal dimension line below it; the
    diameter of an axisymmetric section; the structure's outside too)."""
    sc = view.scene
    s, du = sc.section, sc.units
    f, lw = view.f, view.lw
    levels = view.levels
    if not levels:
        return
    pen = QPen(QColor(DIMENSION), 0.8 * lw)
    ext = QPen(QColor(DIMENSION), 0.5 * lw)
    ext.setStyle(Qt.PenStyle.DotLine)
    x_rail = view.rail_x
    low, high = levels[0].z, levels[-1].z
    p.save()
    # Extension lines from the rail to the drawing at each level.
    left = view.drawing_left
    p.setPen(ext)
    for lv in levels:
        y = view.to_px(0.0, lv.z).y()
        p.drawLine(QLineF(x_rail, y, left, y))
    p.setPen(pen)
    top_px, bottom_px = view.to_px(0.0, high).y(), view.to_px(0.0, low).y()
    if bottom_px - top_px > 1.5 * f:
        mid = QPointF(x_rail, 0.5 * (top_px + bottom_px))
        draw_arrow(p, mid, QPointF(x_rail, top_px), QColor(DIMENSION), 0.8 * lw, 0.8 * f)
        draw_arrow(p, mid, QPointF(x_rail, bottom_px), QColor(DIMENSION), 0.8 * lw, 0.8 * f)
    else:
        p.drawLine(QLineF(x_rail, top_px, x_rail, bottom_px))
    p.setPen(pen)
    for lv in levels:
        _tick(p, QPointF(x_rail, view.to_px(0.0, lv.z).y()), 0.3 * f)
    # The overall height, written along the line (turned), in the middle
    # of the longest stretch between two levels.
    height = du.text(high - low, "length")
    zs = [lv.z for lv in levels]
    k = max(range(len(zs) - 1), key=lambda i: zs[i + 1] - zs[i]) if len(zs) > 1 else 0
    z_mid = 0.5 * (zs[k] + zs[min(k + 1, len(zs) - 1)])
    p.setFont(view.fonts.label)
    p.setPen(QColor(INK))
    p.save()
    p.translate(x_rail + 0.25 * f, view.to_px(0.0, z_mid).y())
    p.rotate(-90)
    p.drawText(QRectF(-6 * f, -1.3 * f, 12 * f, 1.2 * f),
               int(Qt.AlignmentFlag.AlignHCenter | Qt.AlignmentFlag.AlignBottom), height)
    p.restore()
    # Level names and heights, right-aligned left of the rail, spread apart.
    font = view.fonts.label
    step = 1.15 * view.text_h
    ys = _spread([view.to_px(0.0, lv.z).y() for lv in levels], step,
                 view.labels.bounds.top() + 0.5 * step, view.labels.bounds.bottom() - 0.5 * step)
    p.setFont(font)
    for lv, y in zip(levels, ys, strict=True):
        text = lv.text(du)
        box = QRectF(view.area.left() + 0.3 * f, y - 0.5 * step, x_rail - view.area.left()
                     - 0.9 * f, step)
        p.setPen(QColor(INK))
        p.drawText(box, RIGHT | VCENTER, text)
        true_y = view.to_px(0.0, lv.z).y()
        if abs(true_y - y) > 0.1 * f:  # a leader to the level it names
            p.setPen(ext)
            p.drawLine(QLineF(x_rail - 0.7 * f, y, x_rail - 0.15 * f, true_y))
        view.labels.reserve(box)
    # The overall width below everything.
    y0 = view.width_y
    pts = s.outline
    spans = []
    if sc.axisymmetric:
        r = float(pts[:, 0].max())
        spans.append((-r, r, f"diameter {du.text(2 * r, 'length')}"))
    else:
        x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
        spans.append((x0, x1, du.text(x1 - x0, "length")))
    st = sc.structure
    if st is not None:
        ox = st.outline[:, 0]
        a, b = float(ox.min()), float(ox.max())
        if sc.axisymmetric:
            spans.append((-b, b, f"outside diameter {du.text(2 * b, 'length')}"))
        else:
            spans.append((a, b, f"outside {du.text(b - a, 'length')}"))
    for k, (a, b, text) in enumerate(spans):
        y = y0 + k * 2.1 * view.text_h
        pa, pb = view.to_px(a, low), view.to_px(b, low)
        p.setPen(ext)
        for x in (pa.x(), pb.x()):
            p.drawLine(QLineF(x, view.drawing_bottom, x, y + 0.4 * f))
        p.setPen(pen)
        if pb.x() - pa.x() > 2.0 * f:
            mid = QPointF(0.5 * (pa.x() + pb.x()), y)
            draw_arrow(p, mid, QPointF(pa.x(), y), QColor(DIMENSION), 0.8 * lw, 0.8 * f)
            draw_arrow(p, mid, QPointF(pb.x(), y), QColor(DIMENSION), 0.8 * lw, 0.8 * f)
        else:
            p.drawLine(QLineF(pa.x(), y, pb.x(), y))
        p.setFont(font)
        p.setPen(QColor(INK))
        tw = QFontMetricsF(font).horizontalAdvance(text) + 0.4 * f
        box = QRectF(0.5 * (pa.x() + pb.x()) - 0.5 * tw, y + 0.15 * f, tw, view.text_h)
        p.drawText(box, int(Qt.AlignmentFlag.AlignHCenter | Qt.AlignmentFlag.AlignTop), text)
        # No label is laid over a dimension.
        view.labels.reserve(box)
        view.labels.reserve(QRectF(pa.x(), y - 0.35 * f, pb.x() - pa.x(), 0.7 * f))
    p.restore()


def _spread(ys, step, lo, hi):
    """Positions near ``ys`` (screen y, any order) at least ``step`` apart,
    within [lo, hi] where they fit; their order is kept.

    >>> _spread([10.0, 11.0, 50.0], 5.0, 0.0, 100.0)
    [10.0, 15.0, 50.0]
    """
    order = sorted(range(len(ys)), key=lambda k: ys[k])
    out = [0.0] * len(ys)
    prev = -math.inf
    for k in order:
        out[k] = prev = max(ys[k], prev + step, lo)
    nxt = math.inf
    for k in reversed(order):
        out[k] = nxt = min(out[k], nxt - step, hi)
    return out


def _ring_path(view, ring):
    path = QPainterPath()
    path.addPolygon(QPolygonF([view.to_px(x, z) for x, z in np.asarray(ring).tolist()]))
    path.closeSubpath()
    return path


def draw_structure(p, view):
    """The structure around the cavity: the section between the outer
    outline and the cavity, hatched (and its mirror image, faint, on an
    axisymmetric section); the ground surface with its soil mark and the
    groundwater line with its mark, across the drawing."""
    sc = view.scene
    st = sc.structure
    if st is None:
        return
    lw, f = view.lw, view.f
    cavity = _ring_path(view, sc.section.outline)
    outer = _ring_path(view, st.outline)
    solid = outer.subtracted(cavity)
    p.save()
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(QColor(STRUCTURE_FILL))
    p.drawPath(solid)
    hatch = QBrush(QColor(MUTED), Qt.BrushStyle.BDiagPattern)
    p.setBrush(hatch)
    p.drawPath(solid)
    p.setBrush(Qt.BrushStyle.NoBrush)
    p.setPen(QPen(QColor(INK), 1.4 * lw))
    p.drawPath(outer)
    if sc.axisymmetric:
        mirror = QPainterPath()
        mirror.addPolygon(QPolygonF([view.to_px(-x, z) for x, z in st.outline.tolist()]))
        mirror.closeSubpath()
        p.setPen(QPen(QColor(MUTED), 0.8 * lw))
        p.drawPath(mirror)
    p.restore()
    left, right = view.drawing_left, view.drawing_right
    ground, water = sc.ground_level, sc.groundwater_level
    p.save()
    if ground is not None:
        y = view.to_px(0.0, ground).y()
        p.setPen(QPen(QColor(GROUND), 1.4 * lw))
        for a, b in _outside_spans(view, ground, left, right):
            p.drawLine(QLineF(a, y, b, y))
            x = a + 0.4 * f
            while x < b - 0.4 * f:  # the soil mark: short strokes under the line
                p.drawLine(QLineF(x, y, x - 0.5 * f, y + 0.5 * f))
                x += 1.1 * f
    if water is not None:
        y = view.to_px(0.0, water).y()
        pen = QPen(QColor(GROUNDWATER), 1.2 * lw)
        pen.setStyle(Qt.PenStyle.DashLine)
        p.setPen(pen)
        spans = _outside_spans(view, water, left, right)
        for a, b in spans:
            p.drawLine(QLineF(a, y, b, y))
        if spans:
            a, b = max(spans, key=lambda ab: ab[1] - ab[0])
            draw_surface_mark(p, QPointF(a + 0.5 * (b - a), y), 0.45 * f, QColor(GROUNDWATER),
                              1.0 * lw)
    p.restore()


def _outside_spans(view, z, left, right):
    """Pixel x-ranges at height ``z`` [m] outside the structure, from
    ``left`` to ``right`` [px] (the whole width where the level is above it)."""
    st = view.scene.structure
    pts = st.outline
    xs = []
    n = len(pts)
    for i in range(n):
        (x0, z0), (x1, z1) = pts[i], pts[(i + 1) % n]
        if (z0 - z) * (z1 - z) < 0 or (z0 == z and z1 != z):
            xs.append(x0 + (z - z0) * (x1 - x0) / (z1 - z0) if z1 != z0 else x0)
    if view.scene.axisymmetric:
        xs += [-x for x in xs]
    if len(xs) < 2:
        return [(left, right)]
    a, b = view.to_px(min(xs), z).x(), view.to_px(max(xs), z).x()
    return [(left, a), (b, right)]


def draw_outer_diagram(p, view):
    """The groundwater's pressure on the outer face, drawn outward into the
    ground in the groundwater's colours (the liquid's diagrams are drawn
    outward from the cavity's walls, into the structure)."""
    w = view.outer_wetted
    k = view.pressure_scale
    if w is None or w.index.size == 0 or k <= 0:
        return
    path = QPainterPath()
    x, z, connect = diagram_polygons(w, k)
    ends = np.flatnonzero(~connect) + 1
    start = 0
    for end in ends.tolist():
        path.addPolygon(QPolygonF([view.to_px(a, b) for a, b in
                                   zip(x[start:end].tolist(), z[start:end].tolist(),
                                       strict=True)]))
        path.closeSubpath()
        start = end
    path.setFillRule(Qt.FillRule.WindingFill)
    p.save()
    p.setPen(QPen(QColor(GROUNDWATER), 1.0 * view.lw))
    p.setBrush(QColor(*GROUNDWATER_FILL))
    p.drawPath(path)
    p.restore()
    # The largest groundwater pressure, once.
    pmax = max(float(w.pa.max()), float(w.pb.max()))
    at = int(np.argmax(np.maximum(w.pa, w.pb)))
    use_a = w.pa[at] >= w.pb[at]
    px, pz = (w.ax[at], w.az[at]) if use_a else (w.bx[at], w.bz[at])
    tip = view.ordinate(px, pz, w.nx[at], w.nz[at], pmax)
    view.labels.place(p, Label(view.scene.pressure(pmax), view.fonts.label, GROUNDWATER),
                      [(tip, (w.nx[at], -w.nz[at]), 0.3 * view.f),
                       (tip, (0, 1), 0.3 * view.f), (tip, (0, -1), 0.3 * view.f)])

