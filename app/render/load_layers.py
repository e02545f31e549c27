"""Layers of the exported diagram that show the loads: the pressure diagram
along every wetted wall (filled, hatched, outlined), the resultant of each
run of a part as an arrow pointing at the wall it loads, and the pressure
values at the diagrams' corners.

The diagrams, resultants and the places of the pressure values come from
:mod:`wetline.app.render.geometry`, the same functions the window's canvas
draws from; here they are mapped to the page by a
:class:`wetline.app.render.diagram_view.DiagramView` and painted.
"""

from __future__ import annotations

import math

import numpy as np
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QPainterPath, QPen, QPolygonF

from wetline.app.render.geometry import (
    diagram_polygons,
    load_marks,
    pressure_arrows,
    pressure_sites,
)
from wetline.app.render.label_painter import Label
from wetline.app.render.marks import draw_arrow
from wetline.app.render.style import (
    DIAGRAM_FILL,
    DIAGRAM_LINE,
    DIAGRAM_TEXT,
    LOAD,
    LOAD_EDGE,
    UPLIFT,
    UPLIFT_EDGE,
)

__all__ = ["draw_diagrams", "draw_resultants", "draw_resultant_arrows",
           "draw_resultant_labels", "draw_pressure_values", "MAX_PRESSURE_VALUES",
           "MAX_HATCH_LINES"]

MAX_PRESSURE_VALUES = 40
"""Pressure values written at most (the deepest, then spread over the range)."""
MAX_HATCH_LINES = 4000
"""Hatch lines of the diagrams at most."""


def draw_diagrams(p, view):
    """The pressure diagrams: one filled polygon per chain of joined wetted
    edges (:func:`wetline.app.render.geometry.diagram_polygons`), hatched with
    ordinates at even spacing along the wetted walls."""
    w = view.scene.wetted
    k = view.pressure_scale
    if w.index.size == 0 or k <= 0:
        return
    fill = _path(view, *diagram_polygons(w, k), close=True)
    fill.setFillRule(Qt.FillRule.WindingFill)
    edge = _path(view, *diagram_polygons(w, k, closed=False), close=False)
    lw = view.lw
    step = max(3.0 * lw, 0.55 * view.scene.base_font)
    length = float(np.sqrt((w.bx - w.ax) ** 2 + (w.bz - w.az) ** 2).sum()) * view.px_per_m
    count = min(int(length / step), MAX_HATCH_LINES)
    hatch = []
    if count > 0:
        tx, tz, hx, hz = pressure_arrows(w, k, count)
        for a, b, c, d in zip(tx.tolist(), tz.tolist(), hx.tolist(), hz.tolist(), strict=True):
            tail, tip = view.to_px(a, b), view.to_px(c, d)
            if math.hypot(tip.x() - tail.x(), tip.y() - tail.y()) > 0.5 * lw:
                hatch.append(QLineF(tail, tip))
    p.save()
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(QColor(*DIAGRAM_FILL))
    p.drawPath(fill)
    hc = QColor(DIAGRAM_LINE)
    hc.setAlpha(150)
    p.setPen(QPen(hc, 0.55 * lw))
    p.drawLines(hatch)
    pen = QPen(QColor(DIAGRAM_LINE), 1.1 * lw)
    pen.setJoinStyle(Qt.PenJoinStyle.RoundJoin)
    p.setPen(pen)
    p.setBrush(Qt.BrushStyle.NoBrush)
    p.drawPath(edge)
    p.restore()


def _path(view, x, z, connect, close):
    """A page path [px] of the pieces of x, z [m] that ``connect`` separates."""
    path = QPainterPath()
    ends = np.flatnonzero(~connect) + 1
    px = view.px_per_m
    xs = (view.to_px(0.0, 0.0).x() + px * x).tolist()
    zs = (view.to_px(0.0, 0.0).y() - px * z).tolist()
    start = 0
    for end in ends.tolist():
        poly = QPolygonF([QPointF(a, b) for a, b in zip(xs[start:end], zs[start:end],
                                                       strict=True)])
        path.addPolygon(poly)
        if close:
            path.closeSubpath()
        start = end
    return path


def _room_behind(view, head, direction):
    """Pixel distance from ``head`` along ``direction`` to the outline."""
    seg = view.outline_px
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


def draw_resultants(p, view):
    """:func:`draw_resultant_arrows` and then :func:`draw_resultant_labels`."""
    draw_resultant_arrows(p, view)
    draw_resultant_labels(p, view)


def draw_resultant_arrows(p, view):
    """An arrow per run of a loaded part, pointing at the wall it loads, at
    the point of :func:`wetline.app.render.geometry.load_marks`; upward ones
    in the uplift colour. Each part's total is labelled once (bold, framed):
    at its arrow if the part is loaded on one run, else at the resultant of
    all its edges; the runs of such a part are labelled in a lighter style,
    named by their edges ("edge 2: 72.35 kN/m"). The labels keep off every
    arrow but their own: the labels wait in ``view.pending`` for
    :func:`draw_resultant_labels` (so that other marks may be placed between
    the arrows and their labels, clear of both)."""
    sc = view.scene
    f = view.f
    view.pending = []
    marks = load_marks(sc.solution, sc.runs, sc.wetted)
    if not marks:
        return
    biggest = max(m.magnitude for m in marks)
    bounds = view.labels.bounds
    full = max(4.5 * f, 0.1 * min(bounds.width(), bounds.height()))
    drawn, totals = [], []
    for m in marks:
        mag = m.magnitude
        up = m.is_uplift(biggest)
        value = sc.force(mag)
        text = m.text(value, biggest, sc.force(m.fz))
        if not m.arrow:
            if mag > 1e-9 * biggest:
                totals.append((text, UPLIFT if up else LOAD, m))
            continue
        if mag < 1e-9 * biggest:
            continue
        colour = (UPLIFT if up else LOAD) if m.total else (UPLIFT_EDGE if up else LOAD_EDGE)
        head = view.to_px(m.x, m.z)
        gx = 0.0 if math.isnan(m.fx) else m.fx
        ux, uy = gx / mag, -m.fz / mag  # screen direction of the force
        # Short enough to stay inside a narrow cavity (a riser).
        room = _room_behind(view, head, (-ux, -uy))
        length = max(min(full, 0.42 * room), 3.2 * f)
        tail = QPointF(head.x() - ux * length, head.y() - uy * length)
        p.save()
        draw_arrow(p, tail, head, QColor(colour), (2.2 if m.total else 1.6) * view.lw,
                   (1.1 if m.total else 0.9) * f)
        p.restore()
        own = view.labels.reserve(QRectF(tail, head).normalized().adjusted(
            -0.3 * f, -0.3 * f, 0.3 * f, 0.3 * f))
        if m.total:
            label = Label(text, view.fonts.label_bold, colour, frame=colour)
        else:
            label = Label(text, view.fonts.label, colour)
        drawn.append((label, tail, head, (-ux, -uy), own))
    view.pending = (drawn, totals)


def draw_resultant_labels(p, view):
    """The labels of :func:`draw_resultant_arrows`: the parts' totals first
    (bold, framed), then the runs' values."""
    drawn, totals = getattr(view, "pending", None) or ([], [])
    view.pending = []
    f = view.f
    for label, tail, head, direction, own in [d for d in drawn if d[0].frame]:
        _label_arrow(p, view, label, tail, head, direction, own)
    for text, colour, m in totals:
        at = view.to_px(m.x, m.z)
        cands = [(at, (0.0, -1.0), -0.5 * view.text_h)]  # centred on the resultant
        cands += [(at, d, g) for g in (0.6 * f, 1.8 * f, 3.2 * f)
                  for d in ((0, -1), (0, 1), (1, 0), (-1, 0), (1, -1), (-1, 1))]
        view.labels.place(p, Label(text, view.fonts.label_bold, colour, frame=colour),
                          cands, force=True)
    for label, tail, head, direction, own in [d for d in drawn if not d[0].frame]:
        _label_arrow(p, view, label, tail, head, direction, own)


def _label_arrow(p, view, label, tail, head, direction, own):
    """Beside the shaft (the upper or right side first), else past the tail."""
    f = view.f
    dx, dy = direction
    mid = QPointF(0.5 * (tail.x() + head.x()), 0.5 * (tail.y() + head.y()))
    side = (dy, -dx) if -dx < dx else (-dy, dx)
    if abs(dx) < 1e-6:  # an upright arrow: right side first
        side = (1.0, 0.0)
    other = (-side[0], -side[1])
    vertical = (0.0, 1.0 if dy > 0 else -1.0)
    horizontal = (1.0 if dx > 0 else -1.0, 0.0)
    beyond = (-dx, -dy)  # past the head, across the wall it loads
    h = view.labels.rect_for(label, mid, (0.0, -1.0), 0.0).height()
    on_shaft = [(QPointF(tail.x() + t * (head.x() - tail.x()),
                         tail.y() + t * (head.y() - tail.y())), (0.0, -1.0), -0.5 * h)
                for t in (0.5, 0.3, 0.7, 0.15)]
    view.labels.place(p, label, [
        (mid, side, 0.6 * f), (mid, other, 0.6 * f),
        (tail, vertical, 0.3 * f), (tail, horizontal, 0.3 * f),
        (tail, (dx, dy), 0.3 * f),
        (tail, (dx + side[0], dy + side[1]), 0.5 * f),
        (tail, (dx + other[0], dy + other[1]), 0.5 * f),
        (head, beyond, 1.0 * f), (head, beyond, 3.0 * f), (head, beyond, 5.5 * f),
        (head, beyond, 8.5 * f),
        (head, (beyond[0] + side[0], beyond[1] + side[1]), 2.0 * f),
        (head, (beyond[0] + other[0], beyond[1] + other[1]), 2.0 * f),
        *on_shaft,  # on its own arrow, on a white box
        (tail, (dx, dy), 2.5 * f), (tail, (dx, dy), 4.5 * f),
        (mid, side, 2.5 * f), (mid, other, 2.5 * f),
    ], force=True, ignore=own)


def draw_pressure_values(p, view):
    """The pressure at the places of
    :func:`wetline.app.render.geometry.pressure_sites`, deepest first: the
    middle of a uniform diagram, each corner and end of the others; a value
    already written close by is not written again."""
    sc = view.scene
    k = view.pressure_scale
    if sc.wetted.index.size == 0 or k <= 0:
        return
    f = view.f
    for site in pressure_sites(sc.wetted, sc.section.n_edges, MAX_PRESSURE_VALUES):
        cands = []
        if site.uniform:
            (nx, nz), = site.normals
            ax, az, bx, bz = site.along
            for t in (0.5, 0.3, 0.7, 0.15, 0.85):
                tip = view.ordinate(ax + t * (bx - ax), az + t * (bz - az), nx, nz,
                                    site.pressure)
                cands.append((tip, (nx, -nz), 0.3 * f))
        else:
            dx, dz = site.direction
            cands.append((view.to_px(*site.tip(k)), (dx, -dz), 0.3 * f))
            for nx, nz in site.normals:
                t = view.ordinate(site.x, site.z, nx, nz, site.pressure)
                cands += [(t, (nx, -nz), 0.3 * f),
                          (t, (nx - 0.9 * nz, -nz - 0.9 * nx), 0.3 * f),
                          (t, (nx + 0.9 * nz, -nz + 0.9 * nx), 0.3 * f),
                          (t, (nx, -nz), 1.5 * f)]
        view.labels.place(p, Label(sc.pressure(site.pressure), view.fonts.label, DIAGRAM_TEXT),
                          cands, unique_within=7.0 * f)
