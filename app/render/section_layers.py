"""Layers of the exported diagram that show the section and its liquid: the
outline by part, the mirrored half and axis of an axisymmetric section, the
liquid, its layers and their interfaces, trapped air, the free surface (and
a standpipe head above a roof), the spill level, the gas over the surface,
and the length and pressure scales.

Each function paints with a QPainter into a
:class:`wetline.app.render.diagram_view.DiagramView`; the geometry (the
liquid, the surface spans) comes from :mod:`wetline.app.render.geometry`,
as on the window's canvas.
"""

from __future__ import annotations

from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QColor, QFontMetricsF, QPainterPath, QPen, QPolygonF

from wetline.app.render.geometry import (
    air_marks,
    axis_edges,
    gas_mark,
    layer_bands,
    layer_interfaces,
    liquid_rings,
    surface_spans,
)
from wetline.app.render.label_painter import Label
from wetline.app.render.marks import draw_arrow, draw_surface_mark
from wetline.app.render.style import (
    AIR_FILL,
    AIR_LINE,
    DIAGRAM_FILL,
    DIAGRAM_LINE,
    DIAGRAM_TEXT,
    HCENTER,
    INK,
    INTERFACE_LINE,
    LAYER_TINTS,
    LEFT,
    LIQUID,
    LIQUID_GHOST,
    MUTED,
    OPEN_EDGE,
    RULE,
    SURFACE,
    TOP,
    VCENTER,
)
from wetline.core.numbers import format_number, nice_step
from wetline.core.section import OPEN

__all__ = ["draw_mirror", "draw_liquid", "draw_outline", "draw_surface", "draw_spill",
           "draw_scales", "draw_layers", "draw_air", "draw_layer_labels", "layer_texts"]


def _liquid_path(view, mirror=False):
    sign = -1.0 if mirror else 1.0
    path = QPainterPath()
    s = view.scene.section
    for ring in liquid_rings(s, view.scene.solution.level):
        path.addPolygon(QPolygonF([view.to_px(sign * x, z) for x, z in ring.tolist()]))
        path.closeSubpath()
    return path


def draw_liquid(p, view):
    """The liquid below the free surface."""
    p.save()
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(QColor(LIQUID))
    p.drawPath(_liquid_path(view))
    p.restore()


def draw_mirror(p, view):
    """The other half of an axisymmetric section, faintly, and the axis as
    a long-dash-dot centre line past both ends."""
    s, sol, lw = view.scene.section, view.scene.solution, view.lw
    p.save()
    p.setPen(Qt.PenStyle.NoPen)
    p.setBrush(QColor(LIQUID_GHOST))
    p.drawPath(_liquid_path(view, mirror=True))
    pen = QPen(QColor(RULE), 1.2 * lw)
    dashed = QPen(pen)
    dashed.setStyle(Qt.PenStyle.DashLine)
    p.setBrush(Qt.BrushStyle.NoBrush)
    pts = s.outline
    n = s.n_edges
    on_axis = axis_edges(s)
    lines, open_lines = [], []
    for i in range(n):
        if on_axis[i]:
            continue
        j = (i + 1) % n
        line = QLineF(view.to_px(-pts[i, 0], pts[i, 1]), view.to_px(-pts[j, 0], pts[j, 1]))
        (open_lines if s.parts[i] == OPEN else lines).append(line)
    p.setPen(pen)
    p.drawLines(lines)
    p.setPen(dashed)
    p.drawLines(open_lines)
    ext = view.axis_extension
    top = max(s.z_max, sol.level if sol.head_above_top > 0 else s.z_max) + ext
    cpen = QPen(QColor(MUTED), 1.0 * lw)
    cpen.setStyle(Qt.PenStyle.DashDotLine)
    p.setPen(cpen)
    p.drawLine(QLineF(view.to_px(0, s.z_min - ext), view.to_px(0, top)))
    p.restore()


def draw_outline(p, view):
    """Each wall edge in the colour of its part; ``open`` edges dashed; the
    axis is left to the centre line."""
    s = view.scene.section
    colours = view.scene.colours
    pts = s.outline
    n = s.n_edges
    on_axis = axis_edges(s)
    lines = {}
    for i in range(n):
        if not on_axis[i]:
            j = (i + 1) % n
            lines.setdefault(s.parts[i], []).append(
                QLineF(view.to_px(pts[i, 0], pts[i, 1]), view.to_px(pts[j, 0], pts[j, 1])))
    p.save()
    for part, group in lines.items():  # one pen per part
        if part == OPEN:
            pen = QPen(QColor(OPEN_EDGE), 1.2 * view.lw)
            pen.setStyle(Qt.PenStyle.DashLine)
        else:
            pen = QPen(QColor(colours[part]), 3.0 * view.lw)
            pen.setCapStyle(Qt.PenCapStyle.RoundCap)
        p.setPen(pen)
        p.drawLines(group)
    p.restore()


def draw_surface(p, view):
    """The free surface across the cavity (dashed above a closed section's
    roof, with the standpipe head as a dimension) and its mark; then the
    spill level if the liquid stands below it. Their heights are written on
    the levels' dimension line."""
    sc = view.scene
    s, sol = sc.section, sc.solution
    f, lw = view.f, view.lw
    colour = QColor(SURFACE)
    standpipe = sol.head_above_top > 0
    if sol.level <= s.z_min:
        return
    if standpipe:
        spans = [(float(s.outline[:, 0].min()), float(s.outline[:, 0].max()))]
        if sc.axisymmetric:
            spans = [(-spans[0][1], spans[0][1])]
    else:
        spans = surface_spans(s, sol.level)
        if sc.axisymmetric:
            spans += [(-b, -a) for a, b in spans]
    if not spans:
        return
    p.save()
    pen = QPen(colour, 1.5 * lw)
    if standpipe:
        pen.setStyle(Qt.PenStyle.DashLine)
    p.setPen(pen)
    for a, b in spans:
        pa, pb = view.to_px(a, sol.level), view.to_px(b, sol.level)
        p.drawLine(QLineF(pa, pb))
        view.labels.avoid_lines([(pa.x(), pa.y(), pb.x(), pb.y())])
    if standpipe:
        _draw_head(p, view, colour)
    # The mark and its label on the widest span.
    a, b = max(spans, key=lambda ab: ab[1] - ab[0])
    apex = view.to_px(a + 0.7 * (b - a), sol.level)
    size = 0.5 * f
    draw_surface_mark(p, apex, size, colour, 1.1 * lw)
    p.restore()
    # Its level is written on the levels' dimension line
    # (:func:`wetline.app.render.sketch_layers.draw_dimensions`); the mark
    # keeps its place.
    view.labels.reserve(QRectF(apex.x() - size, apex.y() - 1.5 * size, 2 * size, 2.5 * size))
    if sol.spill_level is not None and sol.spill_level > sol.level + 1e-9 * max(
            s.z_max - s.z_min, 1e-12):
        draw_spill(p, view)


def _draw_head(p, view, colour):
    """The head above the roof of a closed section, as a dimension line."""
    sc = view.scene
    s, sol = sc.section, sc.solution
    f, lw = view.f, view.lw
    xr = float(s.outline[:, 0].max())
    top = view.to_px(xr, sol.level)
    roof = view.to_px(xr, s.z_max)
    x = top.x() + 1.2 * f
    mid = QPointF(x, (top.y() + roof.y()) / 2)
    p.setPen(QPen(colour, 0.9 * lw))
    p.drawLine(QLineF(top.x(), top.y(), x + 0.6 * f, top.y()))
    draw_arrow(p, mid, QPointF(x, top.y()), colour, 0.9 * lw, 0.7 * f)
    draw_arrow(p, mid, QPointF(x, roof.y()), colour, 0.9 * lw, 0.7 * f)
    view.labels.place(p, Label(f"head {sc.length(sol.head_above_top)}", view.fonts.label,
                               SURFACE), [(mid, (1, 0), 0.4 * f)])


def draw_spill(p, view):
    """A short dashed line at the lowest point of the open edges: the spill
    level (its height is on the levels' dimension line)."""
    sc = view.scene
    s = sc.section
    f = view.f
    z = s.spill_level
    pts = s.outline
    n = s.n_edges
    best = None
    for i, part in enumerate(s.parts):
        if part != OPEN:
            continue
        for v in (i, (i + 1) % n):
            if pts[v, 1] == z and (best is None or pts[v, 0] > best[0]):
                best = (float(pts[v, 0]), z)
    if best is None:
        return
    pt = view.to_px(*best)
    length = 2.2 * f
    p.save()
    pen = QPen(QColor(MUTED), 1.0 * view.lw)
    pen.setStyle(Qt.PenStyle.DashLine)
    p.setPen(pen)
    p.drawLine(QLineF(pt.x() - 0.4 * f, pt.y(), pt.x() + length, pt.y()))
    p.restore()


def draw_scales(p, view, band):
    """The length scale (four alternating cells) and the pressure scale
    (the ordinate of a round pressure) along the foot of ``band``."""
    du, f, lw = view.scene.units, view.f, view.lw
    x = band.left()
    y = band.bottom() - 1.3 * f
    per_unit = view.px_per_m * du.factor("length")  # px per display length unit
    step = nice_step(0.22 * band.width() / per_unit / 4, down=True)
    cell = step * per_unit
    h = 0.45 * f
    p.save()
    p.setPen(QPen(QColor(INK), 0.8 * lw))
    for k in range(4):
        p.setBrush(QColor(INK) if k % 2 == 0 else QColor("white"))
        p.drawRect(QRectF(x + k * cell, y - h, cell, h))
    p.setFont(view.fonts.small)
    p.setPen(QColor(INK))
    for k in (0, 2, 4):
        t = format_number(k * step) + (f" {du.label('length')}" if k == 4 else "")
        p.drawText(QRectF(x + k * cell - 3 * f, y - h - 1.5 * f, 6 * f, 1.3 * f),
                   HCENTER | VCENTER, t)
    p.drawText(QRectF(x, y + 0.2 * f, 4 * cell + 10 * f, 1.2 * f), LEFT | TOP, "length scale")
    if view.pressure_scale > 0:
        x2 = x + 4 * cell + 5.5 * f
        per_p = view.px_per_m * view.pressure_scale * du.factor("pressure")
        pstep = nice_step(0.18 * band.width() / per_p, down=True)
        bar = pstep * per_p
        p.setPen(Qt.PenStyle.NoPen)
        p.setBrush(QColor(*DIAGRAM_FILL))
        p.drawPolygon(QPolygonF([QPointF(x2, y), QPointF(x2 + bar, y),
                                 QPointF(x2 + bar, y - h * 2.2)]))
        p.setPen(QPen(QColor(DIAGRAM_LINE), 1.0 * lw))
        p.drawLine(QLineF(x2, y, x2 + bar, y))
        p.drawLine(QLineF(x2, y - 0.5 * h, x2, y + 0.5 * h))
        p.drawLine(QLineF(x2 + bar, y - h * 2.2, x2 + bar, y + 0.5 * h))
        p.setFont(view.fonts.small)
        p.setPen(QColor(DIAGRAM_TEXT))
        p.drawText(QRectF(x2 + bar + 0.5 * f, y - 1.4 * f, 10 * f, 1.3 * f), LEFT | VCENTER,
                   f"{format_number(pstep)} {du.label('pressure')}")
        p.setPen(QColor(INK))
        p.drawText(QRectF(x2, y + 0.2 * f, bar + 12 * f, 1.2 * f), LEFT | TOP,
                   "pressure scale")
    p.restore()


def _rings_path(view, rings, mirror=False):
    path = QPainterPath()
    for sign in ((1.0, -1.0) if mirror else (1.0,)):
        for ring in rings:
            path.addPolygon(QPolygonF([view.to_px(sign * x, z) for x, z in ring.tolist()]))
            path.closeSubpath()
    return path


def _spans_both(view, spans):
    """``spans`` [m] and, on an axisymmetric section, their mirror images."""
    spans = list(spans)
    if view.scene.axisymmetric:
        spans += [(-b, -a) for a, b in spans]
    return spans


def draw_layers(p, view):
    """The liquid layers above the bottom one, tinted over the liquid
    (:func:`wetline.app.render.geometry.layer_bands`), and each interface
    dashed across the cavity (:func:`wetline.app.render.geometry.layer_interfaces`);
    their labels come with :func:`draw_layer_labels`."""
    sc = view.scene
    sol = sc.solution
    if len(getattr(sol, "layers", ()) or ()) < 2:
        return
    p.save()
    p.setPen(Qt.PenStyle.NoPen)
    for k, rings in enumerate(layer_bands(sol)):
        p.setBrush(QColor(*LAYER_TINTS[k % len(LAYER_TINTS)]))
        p.drawPath(_rings_path(view, rings, mirror=sc.axisymmetric))
    pen = QPen(QColor(INTERFACE_LINE), 1.3 * view.lw)
    pen.setStyle(Qt.PenStyle.DashLine)
    p.setPen(pen)
    for face in layer_interfaces(sol):
        for a, b in _spans_both(view, face.spans):
            pa, pb = view.to_px(a, face.level), view.to_px(b, face.level)
            p.drawLine(QLineF(pa, pb))
            view.labels.avoid_lines([(pa.x(), pa.y(), pb.x(), pb.y())])
    p.restore()


def draw_air(p, view):
    """Each pocket of trapped air (:func:`wetline.app.render.geometry.air_marks`):
    its air in a light fill with its outline, and its compressed
    interface in the free surface's colour; labelled by
    :func:`draw_layer_labels`."""
    sc = view.scene
    sol = sc.solution
    if not getattr(sol, "pockets", ()):
        return
    p.save()
    for m in view.air_marks:
        p.setPen(QPen(QColor(AIR_LINE), 0.9 * view.lw))
        p.setBrush(QColor(*AIR_FILL))
        p.drawPath(_rings_path(view, m.rings, mirror=sc.axisymmetric))
        p.setPen(QPen(QColor(SURFACE), 1.5 * view.lw))
        for a, b in _spans_both(view, m.spans):
            pa, pb = view.to_px(a, m.interface), view.to_px(b, m.interface)
            p.drawLine(QLineF(pa, pb))
            view.labels.avoid_lines([(pa.x(), pa.y(), pb.x(), pb.y())])
    p.restore()


def layer_texts(scene):
    """The texts :func:`draw_layer_labels` writes, in order: each interface
    (``"fats, oils and grease on raw sewage 1.85 m"``), each pocket
    (``"trapped air 23.58 kPa"``) and the gas (``"gas 20 kPa"``)."""
    sol = scene.solution
    texts = [f"{face.text} {scene.length(face.level)}" for face in layer_interfaces(sol)]
    texts += [f"trapped air {scene.pressure(m.air_pressure)}" for m in air_marks(sol)]
    gas = gas_mark(sol)
    if gas is not None:
        texts.append(f"gas {scene.pressure(gas.pressure)}")
    return texts


def _along(view, label, left, right, f):
    """Candidates for a label along a level line from ``left`` to ``right``
    [px]: above it, then below it, at its left end, its middle, its right
    end."""
    w = QFontMetricsF(label.font).horizontalAdvance(label.text) + 2 * view.labels.pad
    y = left.y()
    xs = [left.x() + 0.3 * f + 0.5 * w, 0.5 * (left.x() + right.x()),
          right.x() - 0.3 * f - 0.5 * w]
    return [(QPointF(x, y), (0, d), 0.15 * f) for d in (-1, 1) for x in xs]


def draw_layer_labels(p, view):
    """The labels of the interfaces (the liquids and the level, along the
    interface), the pockets (their air pressure, in the air or beside it)
    and the gas over the surface (its pressure, in the gas space). Placed
    after the resultants' labels, where there is room."""
    sc = view.scene
    sol = sc.solution
    f = view.f
    font = view.fonts.label
    for face in layer_interfaces(sol):
        spans = _spans_both(view, face.spans)
        if not spans:
            continue
        a, b = max(spans, key=lambda ab: ab[1] - ab[0])
        label = Label(f"{face.text} {sc.length(face.level)}", font, INTERFACE_LINE)
        left, right = view.to_px(a, face.level), view.to_px(b, face.level)
        if view.labels.place(p, label, _along(view, label, left, right, f)) is not None:
            continue
        # No room along it (a small drawing): above the section, with a
        # leader down to the interface.
        above = view.to_px(a, max(sc.section.z_max, sol.level)).y() - 1.2 * f
        w = QFontMetricsF(font).horizontalAdvance(label.text) + 2 * view.labels.pad
        candidates = [(QPointF(x + 0.5 * w, above - k * 1.6 * f), (0, -1), 0.0)
                      for k in range(3) for x in (left.x() - 0.5 * w, left.x(),
                                                  right.x() - w)]
        rect = view.labels.place(p, label, candidates)
        if rect is not None:
            x = min(max(left.x() + 0.5 * f, rect.left() + 0.5 * f), rect.right() - 0.5 * f)
            x = min(max(x, left.x() + 0.3 * f), right.x() - 0.3 * f)
            p.save()
            p.setPen(QPen(QColor(INTERFACE_LINE), 0.7 * view.lw))
            p.drawLine(QLineF(x, rect.bottom(), x, left.y()))
            p.restore()
    for m in view.air_marks:
        label = Label(f"trapped air {sc.pressure(m.air_pressure)}", font, AIR_LINE)
        at = view.to_px(*m.at)
        candidates = [(at, (0, 0), 0.0)]
        if m.spans:
            a, b = max(m.spans, key=lambda ab: ab[1] - ab[0])
            candidates += _along(view, label, view.to_px(a, m.interface),
                                 view.to_px(b, m.interface), f)[3:]  # below the interface
        # Over its ceiling: just above it, then above the ceiling's diagram.
        top = max(float(r[:, 1].max()) for r in m.rings)
        over = top + view.pressure_scale * max(m.air_pressure, 0.0)
        for z, gap in ((top, 0.4 * f), (over, 0.3 * f)):
            candidates += [(view.to_px(m.at[0], z) + QPointF(dx * f, 0.0), (0, -1), gap)
                           for dx in (0.0, -3.0, 3.0)]
        view.labels.place(p, label, candidates)
    gas = gas_mark(sol)
    if gas is not None:
        label = Label(f"gas {sc.pressure(gas.pressure)}", font, DIAGRAM_TEXT)
        at = view.to_px(*gas.at)
        candidates = [(at, (0, 0), 0.0), (at, (0, -1), 0.3 * f), (at, (0, 1), 0.3 * f)]
        spans = surface_spans(sc.section, sol.level)
        if spans:  # just over the free surface, along it
            a, b = max(spans, key=lambda ab: ab[1] - ab[0])
            candidates += _along(view, label, view.to_px(a, sol.level),
                                 view.to_px(b, sol.level), f)[:3]
        view.labels.place(p, label, candidates)
