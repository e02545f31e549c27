"""The drawing area of the exported diagram: the section mapped onto the page.

:class:`DiagramView` fits the section, its pressure diagrams, the free
surface and the spill level into the area left by the title block (one
scale for x and z, z up), sets the scale of the pressure ordinates (the
largest is a fifth of the section's size), and keeps the labels of the
area (:class:`wetline.app.render.label_painter.LabelPainter`) off the
outline. :meth:`DiagramView.draw` paints the layers in order: the mirrored
half, the liquid, its layers and trapped air, the diagrams, the outline,
the free surface, the resultants, the labels of the interfaces, pockets and
gas, the pressure values and the scales.
"""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import QPointF, QRectF
from PySide6.QtGui import QColor, QFontMetricsF

from wetline.app.render import load_layers, section_layers, sketch_layers
from wetline.app.render.geometry import (
    air_marks,
    axis_edges,
    dimension_levels,
    outer_wetted_edges,
)
from wetline.app.render.label_painter import LabelPainter
from wetline.app.render.style import INK, LEFT, MUTED, TOP, WRAP
from wetline.app.render.text_blocks import text_height

__all__ = ["DiagramView", "ORDINATE_SHARE"]

ORDINATE_SHARE = 0.2
"""The largest pressure ordinate, as a share of the section's size."""


class DiagramView:
    """The drawing area of a scene, with the mapping from metres to pixels.

    Attributes
    ----------
    pressure_scale : float
        Drawing length of one pascal of ordinate [m/Pa] (0 without pressure).
    px_per_m : float
        Pixels per metre of the section.
    labels : LabelPainter
        The area's labels.
    outline_px : numpy.ndarray
        (M, 4) pixel segments of the outline's walls (not the axis).
    """

    def __init__(self, scene, area, fonts):
        self.scene = scene
        self.area = area
        self.fonts = fonts
        f = self.f = fonts.base
        self.lw = scene.line_width
        pad = 0.9 * f
        self.scale_height = 3.6 * f
        self.inner = area.adjusted(pad, pad, -pad, -pad)
        self.text_h = QFontMetricsF(fonts.label).height()
        kind = "half-section" if scene.axisymmetric else "cross-section"
        self.caption = (f"Gauge pressure on the walls of the {kind}, drawn outward from the "
                        f"wall; resultants point at the wall they load. Vertex numbers at the "
                        f"corners, edge numbers boxed (edge i runs from vertex i to i + 1); "
                        f"dimensions in {scene.units.label('length')}.")
        # A figure of the calculation sheet has its caption on the page.
        self.show_caption = not scene.figure
        self.caption_height = (1.35 * f + text_height(fonts.small, self.inner.width(),
                                                      self.caption) + 0.3 * f
                               if self.show_caption else 0.0)
        s, sol = scene.section, scene.solution
        pts = s.outline
        st = scene.structure
        self.outer_wetted = None
        if st is not None and scene.groundwater_level is not None:
            self.outer_wetted = outer_wetted_edges(st, s, scene.groundwater_level,
                                                   scene.groundwater_density, sol.gravity)
        every = pts if st is None else np.vstack([pts, st.outline])
        size = max(float(np.ptp(every[:, 0])), float(np.ptp(every[:, 1])))
        peak = sol.max_pressure
        w = self.outer_wetted
        if w is not None and w.index.size:
            peak = max(peak, float(w.pa.max()), float(w.pb.max()))
        self.pressure_scale = ORDINATE_SHARE * size / peak if peak > 0 else 0.0
        self.axis_extension = 0.06 * max(s.z_max - s.z_min, 1e-12)
        self.levels = dimension_levels(s, sol, groundwater=scene.groundwater_level,
                                       ground=scene.ground_level,
                                       interfaces=scene.interfaces)
        du = scene.units
        fm = QFontMetricsF(fonts.label)
        self.level_text_w = max((fm.horizontalAdvance(lv.text(du)) for lv in self.levels),
                                default=0.0)
        self.width_spans = 1 if st is None else 2
        self._fit(size)
        self.labels = LabelPainter(self.inner.adjusted(0, self.caption_height, 0,
                                                       -self.scale_height), 0.35 * f)
        px = np.column_stack([self._ox + self.px_per_m * pts[:, 0],
                              self._oz - self.px_per_m * pts[:, 1]])
        segments = np.hstack([px, np.roll(px, -1, axis=0)])
        self.outline_px = segments[~axis_edges(s)]
        self.labels.avoid_lines(self.outline_px)
        self.air_marks = air_marks(sol) if getattr(sol, "pockets", ()) else []
        """The pockets of trapped air drawn (:func:`wetline.app.render.geometry.air_marks`)."""

    def _fit(self, size):
        """One scale for x and z that fits everything drawn into the plot
        area, with room left of it for the levels' dimension line and below
        it for the widths'."""
        sc = self.scene
        s, sol, w = sc.section, sc.solution, sc.wetted
        k = self.pressure_scale
        pts = s.outline
        bx = [float(pts[:, 0].min()), float(pts[:, 0].max())]
        bz = [s.z_min, s.z_max]
        st = sc.structure
        if st is not None:
            bx += [float(st.outline[:, 0].min()), float(st.outline[:, 0].max())]
            bz += [float(st.outline[:, 1].min()), float(st.outline[:, 1].max())]
        if sc.axisymmetric:
            bx.append(-max(bx))
        for ww in (w, self.outer_wetted):
            if ww is None or not ww.index.size:
                continue
            for xs, zs, ps in ((ww.ax, ww.az, ww.pa), (ww.bx, ww.bz, ww.pb)):
                bx += [float((xs + ww.nx * k * ps).min()), float((xs + ww.nx * k * ps).max())]
                bz += [float((zs + ww.nz * k * ps).min()), float((zs + ww.nz * k * ps).max())]
        bz += [lv.z for lv in self.levels]
        if sol.head_above_top > 0:
            bz.append(sol.level)
        if sol.spill_level is not None:
            bz.append(sol.spill_level)
        if st is not None:  # the ground and groundwater lines run past the structure
            reach = 0.08 * (max(bx) - min(bx))
            bx += [min(bx) - reach, max(bx) + reach]
        if sc.axisymmetric:  # room for the centre line past both ends
            bz += [min(bz) - self.axis_extension, max(bz) + self.axis_extension]
        f = self.f
        label_w = QFontMetricsF(self.fonts.label).horizontalAdvance(
            "0000.0 " + sc.units.label("pressure")) + f
        inner = self.inner
        rail_band = self.level_text_w + 1.6 * f
        dims_band = self.width_spans * 2.1 * self.text_h + 1.2 * f
        top = 3.0 * f if self.show_caption else 1.5 * f
        plot = QRectF(inner.left() + rail_band + label_w,
                      inner.top() + self.caption_height + top,
                      inner.width() - rail_band - 2 * label_w,
                      inner.height() - self.caption_height - self.scale_height - top
                      - 1.8 * f - dims_band)
        wx = max(max(bx) - min(bx), 1e-9 * max(size, 1e-9))
        wz = max(max(bz) - min(bz), 1e-9 * max(size, 1e-9))
        scale = min(plot.width() / wx, plot.height() / wz)
        self.px_per_m = scale
        self._ox = plot.center().x() - scale * 0.5 * (max(bx) + min(bx))
        self._oz = plot.center().y() + scale * 0.5 * (max(bz) + min(bz))
        self.drawing_left = self._ox + scale * min(bx)
        self.drawing_right = self._ox + scale * max(bx)
        self.drawing_bottom = self._oz - scale * min(bz)
        self.rail_x = inner.left() + self.level_text_w + 1.2 * f
        self.width_y = self.drawing_bottom + 1.6 * f

    def to_px(self, x, z):
        """The page point [px] of the section point (x, z) [m]."""
        return QPointF(self._ox + self.px_per_m * x, self._oz - self.px_per_m * z)

    def ordinate(self, x, z, nx, nz, pressure):
        """Pixel tip of the pressure ordinate ``pressure`` [Pa] drawn from
        the wall point (x, z) [m] along the outward normal (nx, nz)."""
        k = self.pressure_scale * pressure
        return self.to_px(x + nx * k, z + nz * k)

    def draw(self, p):
        """Paint the caption and every layer of the drawing."""
        f, inner = self.f, self.inner
        if self.show_caption:
            p.setFont(self.fonts.bold)
            p.setPen(QColor(INK))
            p.drawText(QRectF(inner.left(), inner.top(), inner.width(), 1.4 * f), LEFT | TOP,
                       "PRESSURE DIAGRAM")
            p.setFont(self.fonts.small)
            p.setPen(QColor(MUTED))
            p.drawText(QRectF(inner.left(), inner.top() + 1.35 * f, inner.width(),
                              self.caption_height), LEFT | TOP | WRAP, self.caption)
        p.save()
        p.setClipRect(self.area.adjusted(0, self.caption_height + (0.9 * f if self.show_caption
                                                                   else 0.0), 0, 0))
        sketch_layers.draw_structure(p, self)
        if self.scene.axisymmetric:
            section_layers.draw_mirror(p, self)
        section_layers.draw_liquid(p, self)
        section_layers.draw_layers(p, self)
        section_layers.draw_air(p, self)
        sketch_layers.draw_outer_diagram(p, self)
        load_layers.draw_diagrams(p, self)
        section_layers.draw_outline(p, self)
        sketch_layers.draw_dimensions(p, self)
        section_layers.draw_surface(p, self)
        load_layers.draw_resultant_arrows(p, self)
        sketch_layers.draw_numbers(p, self)
        load_layers.draw_resultant_labels(p, self)
        section_layers.draw_layer_labels(p, self)
        load_layers.draw_pressure_values(p, self)
        section_layers.draw_scales(p, self, QRectF(inner.left(),
                                                   inner.bottom() - self.scale_height,
                                                   inner.width(), self.scale_height))
        p.restore()
