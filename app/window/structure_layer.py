"""The canvas's drawing of the structure around the cavity and of what acts
on it from outside: the structure as a hatched section, the ground surface
and the groundwater line with their levels, the soil standing on its ledges,
and the groundwater's pressure diagram on the outer faces.

The outer diagram is drawn outside the structure (along the outer faces'
outward normals, into the ground) in a cool colour family, so it never
mixes with the liquid's warm diagrams inside the cavity; both share one
pressure scale, so their sizes compare. The groundwater's loads are a
:class:`wetline.core.hydrostatics.Solution` of the outer outline (as
:func:`wetline.core.structure.exterior_loads` computes them), made and cut
into wetted edges by the same functions as the exported diagram's
(:func:`wetline.app.render.geometry.groundwater_solution`,
:func:`~wetline.app.render.geometry.outer_wetted`) and drawn with the same
geometry functions as the liquid's (:mod:`wetline.app.render.geometry`).
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QPen, QTransform
from PySide6.QtWidgets import QGraphicsItem

from wetline.app.render.geometry import (
    arrow_strokes,
    diagram_polygons,
    groundwater_solution,
    outer_wetted,
    pressure_arrows,
    pressure_sites,
    soil_blocks,
)
from wetline.app.window.canvas_items import (
    add_item,
    cosmetic_pen,
    filled_path_item,
    pairs_curve,
    path_of,
    rings_path,
)

__all__ = ["StructureLayer", "STRUCTURE_INK", "GROUND_COLOUR", "GROUNDWATER_COLOUR",
           "OUTER_DIAGRAM_LINE", "OUTER_DIAGRAM_TEXT", "MAX_OUTER_PRESSURE_LABELS",
           "MAX_SOIL_LABELS"]

STRUCTURE_INK = "#4a525c"
"""The structure's outer outline and hatching."""
GROUND_COLOUR = "#7a5a36"
"""The ground surface, its ticks and label, the soil on ledges."""
GROUNDWATER_COLOUR = "#0f7f8c"
"""The groundwater line and its label."""
OUTER_DIAGRAM_FILL = QColor(31, 150, 168, 70)
OUTER_DIAGRAM_LINE = "#137382"
"""Outer edge of the groundwater's pressure diagram."""
OUTER_DIAGRAM_TEXT = "#0b5864"
"""Groundwater pressure values."""
SOIL_FILL = QColor(176, 138, 92, 55)
MAX_OUTER_PRESSURE_LABELS = 6
"""Groundwater pressure values labelled at most."""
MAX_SOIL_LABELS = 4
"""Ledges whose soil weight is labelled at most (the heaviest)."""


class StructureLayer:
    """The structure's and the ground's graphics items in a view box."""

    def __init__(self, viewbox):
        vb = viewbox
        hatch = QBrush(QColor(STRUCTURE_INK), Qt.BrushStyle.BDiagPattern)
        self.section = filled_path_item(vb, QColor(0, 0, 0, 0), -12)
        self.section.setBrush(hatch)
        self.section.setPen(QPen(Qt.PenStyle.NoPen))
        self.mirror_section = filled_path_item(vb, QColor(0, 0, 0, 0), -12, visible=False)
        self.mirror_section.setBrush(QBrush(QColor(74, 82, 92, 110), Qt.BrushStyle.BDiagPattern))
        self.mirror_section.setPen(QPen(Qt.PenStyle.NoPen))
        self.outline = add_item(vb, pg.PlotCurveItem(pen=cosmetic_pen(STRUCTURE_INK, 1.6)), 9)
        self.mirror_outline = add_item(vb, pg.PlotCurveItem(
            pen=cosmetic_pen(QColor(74, 82, 92, 110), 1.2)), 9, visible=False)
        self.soil = filled_path_item(vb, SOIL_FILL, -13)
        self.soil.setBrush(QBrush(SOIL_FILL))
        self.ground = add_item(vb, pg.PlotCurveItem(pen=cosmetic_pen(GROUND_COLOUR, 2.0)), 6)
        self.ground_ticks = pairs_curve(vb, cosmetic_pen(GROUND_COLOUR, 1.0), 6)
        for item in (self.section, self.mirror_section, self.soil, self.outline,
                     self.mirror_outline, self.ground, self.ground_ticks):
            # Hatching a large area costs milliseconds a paint: kept as a
            # pixmap until the view moves or the outline changes.
            item.setCacheMode(QGraphicsItem.CacheMode.DeviceCoordinateCache)
        self.groundwater = add_item(vb, pg.PlotCurveItem(
            pen=cosmetic_pen(GROUNDWATER_COLOUR, 1.6, Qt.PenStyle.DashLine)), 6)
        self.groundwater_mark = add_item(vb, pg.ScatterPlotItem(
            size=11, symbol="t", pen=pg.mkPen(GROUNDWATER_COLOUR, width=1.2),
            brush=pg.mkBrush(255, 255, 255, 230)), 7)
        self.drag = add_item(vb, pg.PlotCurveItem(
            pen=cosmetic_pen(STRUCTURE_INK, 1.4, Qt.PenStyle.DashLine)), 21)
        self.diagram = filled_path_item(vb, OUTER_DIAGRAM_FILL, -6,
                                        pen=cosmetic_pen(OUTER_DIAGRAM_LINE, 1.0))
        self.arrows = pairs_curve(vb, pg.mkPen(OUTER_DIAGRAM_LINE, width=1), -4)
        self.water_solution = None
        """The groundwater's :class:`wetline.core.hydrostatics.Solution` on
        the outer outline last drawn (None in dry ground)."""
        self._water_key = None
        self._section_key = None
        self._soil_key = None
        self._ground_key = None
        self._water_drawn = None
        self._water_edges = None

    # ------------------------------------------------------------ state
    def clear(self):
        """Nothing drawn (no structure)."""
        if self._section_key is None and self._ground_key is None \
                and self._water_drawn is None:
            return  # nothing is drawn: a slider step of a section without structure
        for item in (self.outline, self.mirror_outline, self.ground, self.ground_ticks,
                     self.groundwater, self.arrows):
            item.setData([], [])
        self.groundwater_mark.setData([], [])
        for item in (self.section, self.mirror_section, self.soil, self.diagram):
            item.setPath(path_of([], [], []))
        self.mirror_section.setVisible(False)
        self.mirror_outline.setVisible(False)
        self.water_solution = None
        self._water_key = self._section_key = self._soil_key = None
        self._ground_key = self._water_drawn = self._water_edges = None
        self._section_objects = None

    def show_drag(self, outline):
        """The structure's outline being dragged ((N, 2) [m]) dashed, or none."""
        if outline is None:
            self.drag.setData([], [])
            return
        ring = np.vstack([outline, outline[:1]])
        self.drag.setData(ring[:, 0], ring[:, 1])

    def groundwater_solution(self, design, loads):
        """The groundwater's loads on the outer outline as a Solution (kept
        while the structure, cavity and groundwater stay), or None."""
        if design.structure is None or loads is None or loads.groundwater is None:
            return None
        gw = loads.groundwater
        key = (design.structure, design.section, gw.level, gw.density, loads.gravity)
        if self._water_key is None or not _same_key(self._water_key, key):
            self.water_solution = groundwater_solution(design.structure, design.section,
                                                       gw.level, gw.density, loads.gravity)
            self._water_key = key
        return self.water_solution

    def max_pressure(self, design, loads):
        """The largest groundwater pressure on the structure [Pa] (0 dry)."""
        sol = self.groundwater_solution(design, loads)
        return 0.0 if sol is None else float(sol.max_pressure)

    # ---------------------------------------------------------- drawing
    def draw(self, design, loads, scale, scope, units, labels, span):
        """Draw ``design``'s structure and ground with ``loads`` (its
        :class:`wetline.core.structure.StructureLoads` in the case shown, or
        None) at pressure ``scale`` [m/Pa]; ``span`` is the (x0, x1) [m] the
        ground and groundwater lines run across."""
        s = design.structure
        if s is None:
            self.clear()
            return
        cavity = design.section
        if loads is not None and (loads.structure is not s or loads.cavity is not cavity):
            loads = None  # results of another outline: drawn once they are solved
        axi = cavity.is_axisymmetric
        outer = np.asarray(s.outline)
        if self._section_key != (id(s), id(cavity)) or self._section_key is None:
            # The same structure and cavity (a slider drag): nothing to draw again.
            self._section_key = (id(s), id(cavity))
            self._section_objects = (s, cavity)  # keeps the ids meaningful
            path = rings_path([outer, np.asarray(cavity.outline)])
            path.setFillRule(Qt.FillRule.OddEvenFill)
            self.section.setPath(path)
            ring = np.vstack([outer, outer[:1]])
            self.outline.setData(ring[:, 0], ring[:, 1])
            if axi:
                flip = QTransform.fromScale(-1.0, 1.0)
                self.mirror_section.setPath(flip.map(path))
                self.mirror_outline.setData(-ring[:, 0], ring[:, 1])
            for item in (self.mirror_section, self.mirror_outline):
                if item.isVisible() != axi:
                    item.setVisible(axi)
        x0, x1 = span
        size = max(x1 - x0, float(np.ptp(outer[:, 1])), 1e-9)
        ground = design.ground
        if ground is not None:
            g = ground.level
            if self._ground_key != (x0, x1, g, size):
                self._ground_key = (x0, x1, g, size)
                self.ground.setData([x0, x1], [g, g])
                ticks = np.linspace(x0, x1, 25)
                d = 0.018 * size
                tx = np.column_stack([ticks, ticks - d]).ravel()
                tz = np.column_stack([np.full(ticks.size, g),
                                      np.full(ticks.size, g - d)]).ravel()
                self.ground_ticks.setData(tx, tz)
            # Just left of the structure, above the line (the view's corners
            # hold the legend and the spill level's label).
            sx0 = float(outer[:, 0].min())
            if axi:
                sx0 = min(sx0, -float(outer[:, 0].max()))
            labels.ask(sx0 - 0.03 * size, g, f"ground {units.fmt_length(g)}", GROUND_COLOUR,
                       (1, 1))
            segments = design.exterior.soil_segments
            key = self._soil_key
            if key is None or key[0] is not s or key[1] != g \
                    or not np.array_equal(key[2], segments):
                # (A dragged cavity vertex leaves the soil as it was.)
                self._soil_key = (s, g, segments)
                self.soil.setPath(rings_path(_soil_rings(design, g)))
        elif self._ground_key is not None:
            self.ground.setData([], [])
            self.ground_ticks.setData([], [])
            self.soil.setPath(path_of([], [], []))
            self._soil_key = self._ground_key = None
        water = self.groundwater_solution(design, loads)
        if water is not None:
            zw = loads.groundwater.level
            key = (id(water), scale, x0, x1, size)
            if self._water_drawn != key:  # the same water at the same scale: as drawn
                self._water_drawn = key
                self.groundwater.setData([x0, x1], [zw, zw])
                self.groundwater_mark.setData([x1 - 0.04 * size], [zw + 0.012 * size])
                w = outer_wetted(water)
                self._water_edges = w
                x, z, connect = diagram_polygons(w, scale)
                p = path_of(x, z, connect)
                p.setFillRule(Qt.FillRule.WindingFill)
                self.diagram.setPath(p)
                tx, tz, px, pz = pressure_arrows(w, scale, count=40)
                # Arrows point at the wall: the water pushes on the structure.
                self.arrows.setData(*arrow_strokes(px, pz, tx, tz, 0.02 * size))
            w = self._water_edges
            # Just right of the structure, under the line.
            labels.ask(float(outer[:, 0].max()) + 0.03 * size, zw,
                       f"groundwater {units.fmt_length(zw)}", GROUNDWATER_COLOUR, (0, 0))
            for site in pressure_sites(w, water.section.n_edges, MAX_OUTER_PRESSURE_LABELS):
                dx, dz = site.direction
                sx, sz = site.tip(scale)
                labels.ask(sx, sz, units.fmt_pressure(site.pressure), OUTER_DIAGRAM_TEXT,
                           (0.5 - 0.5 * dx, 0.5 + 0.5 * dz), optional=True, once=True)
        elif self._water_drawn is not None:
            self._water_drawn = None
            self.groundwater.setData([], [])
            self.groundwater_mark.setData([], [])
            self.diagram.setPath(path_of([], [], []))
            self.arrows.setData([], [])
        if loads is not None and ground is not None:
            self._ask_soil(design, loads, scope, labels)

    @staticmethod
    def _ask_soil(design, loads, scope, labels):
        """The soil's weight on each ledge (a run of consecutive outer edges
        carrying soil), in the middle of the soil standing on it: the
        largest stepping aside where its place is taken, the next few
        (:data:`MAX_SOIL_LABELS` in all) only where there is room."""
        fz = loads.soil_fz
        carrying = fz < 0
        if not carrying.any():
            return
        g = design.ground.level
        outline = design.structure.outline
        n = len(outline)
        idx = np.flatnonzero(carrying)
        # Runs of consecutive edges (wrapping past the last edge).
        breaks = np.flatnonzero(np.diff(idx) != 1) + 1
        runs = np.split(idx, breaks)
        if len(runs) > 1 and runs[0][0] == 0 and runs[-1][-1] == n - 1:
            runs = [np.concatenate([runs[-1], runs[0]])] + runs[1:-1]
        weights = [float(-fz[r].sum()) for r in runs]
        order = np.argsort(weights)[::-1][:MAX_SOIL_LABELS]
        for rank, k in enumerate(order):
            r = runs[k]
            a, b = outline[r[0]], outline[(r[-1] + 1) % n]
            xm = 0.5 * (a[0] + b[0])
            zt = 0.5 * (min(max(a[1], b[1]), g) + g)
            labels.ask(xm, zt, f"soil {scope.text(weights[k])}", GROUND_COLOUR, (0.5, 0.5),
                       optional=rank > 0)


def _soil_rings(design, ground_level):
    """Rings of the soil standing on the structure's ledges up to the ground,
    the structure itself cut out (a ledge under an overhang is drawn only
    where the soil would be)."""
    import shapely

    blocks = soil_blocks(design.exterior.soil_segments, ground_level)
    if not blocks:
        return []
    soil = shapely.union_all(shapely.polygons(blocks))
    soil = shapely.difference(soil, shapely.Polygon(design.structure.outline))
    rings = []
    for poly in shapely.get_parts(soil):
        if poly.geom_type != "Polygon" or poly.is_empty:
            continue
        for ring in [poly.exterior, *poly.interiors]:
            rings.append(shapely.get_coordinates(ring))
    return rings


def _same_key(a, b):
    return (a[0] is b[0] or a[0] == b[0]) and (a[1] is b[1] or a[1] == b[1]) and a[2:] == b[2:]
