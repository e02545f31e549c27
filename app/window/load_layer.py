"""The canvas's drawing of the liquid and its loads: the liquid (and its
mirror image on an axisymmetric section), the free surface, the spill
level, the pressure diagrams with their arrows, and each run's resultant;
and the labels they ask for.

What is drawn comes from :mod:`wetline.app.render.geometry`, the same
functions the exported diagram draws from. Drawing is batched (DEVELOPERS.md, "The
desktop program"): one path for the liquid, one for all pressure diagrams, one
``connect='pairs'`` curve for all pressure arrows and one per direction of
the resultants.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
import shapely
from PySide6.QtCore import Qt
from PySide6.QtGui import QColor, QTransform

from wetline.app.render.geometry import (
    air_marks,
    arrow_strokes,
    carrying_edges,
    diagram_polygons,
    envelope_wetted_edges,
    gas_mark,
    layer_bands,
    layer_interfaces,
    liquid_rings,
    load_marks,
    part_runs,
    pressure_arrows,
    pressure_sites,
    surface_spans,
    wetted_edges,
)
from wetline.app.render.style import (
    AIR_FILL,
    AIR_LINE,
    DIAGRAM_FILL,
    DIAGRAM_LINE,
    DIAGRAM_TEXT,
    INTERFACE_LINE,
    LAYER_TINTS,
    LOAD,
    LOAD_EDGE,
    MUTED,
    SURFACE,
    UPLIFT_EDGE,
)
from wetline.app.render.style import UPLIFT as UPLIFT_COLOUR
from wetline.app.window.canvas_items import (
    cosmetic_pen,
    filled_path_item,
    line_curve,
    path_of,
    rings_path,
)
from wetline.core.numbers import count_of

__all__ = ["LoadLayer", "MAX_PRESSURE_LABELS", "MAX_RESULTANT_LABELS"]

LIQUID_BRUSH = QColor(126, 178, 226, 95)
MIRROR_LIQUID_BRUSH = QColor(126, 178, 226, 45)
LAYER_BRUSHES = tuple(QColor(*rgba) for rgba in LAYER_TINTS)
"""The layers above the bottom one, in turn (over the liquid's blue)."""
AIR_BRUSH = QColor(*AIR_FILL)
DIAGRAM_BRUSH = QColor(*DIAGRAM_FILL[:3], 80)
MAX_PRESSURE_LABELS = 16
"""Pressure values labelled at most."""
MAX_RESULTANT_LABELS = 30
"""Resultants labelled at most (the largest)."""


class LoadLayer:
    """The liquid's and the loads' graphics items in a view box, and their drawing."""

    def __init__(self, viewbox):
        vb = viewbox
        self.liquid = filled_path_item(vb, LIQUID_BRUSH, -10)
        self.mirror_liquid = filled_path_item(vb, MIRROR_LIQUID_BRUSH, -11, visible=False)
        self.diagram = filled_path_item(vb, DIAGRAM_BRUSH, -5,
                                        pen=cosmetic_pen(QColor(DIAGRAM_LINE), 1.0))
        self.arrows = line_curve(vb, pg.mkPen(DIAGRAM_LINE, width=1), -4, connect="pairs")
        self.surface = line_curve(vb, pg.mkPen(SURFACE, width=2), 5)
        self.layer_fills = [filled_path_item(vb, brush, -9, visible=False)
                            for brush in LAYER_BRUSHES]
        self.interfaces = line_curve(vb, pg.mkPen(INTERFACE_LINE, width=1.5,
                                                   style=Qt.PenStyle.DashLine), 6, connect="pairs")
        self.air = filled_path_item(vb, AIR_BRUSH, -8, pen=cosmetic_pen(QColor(AIR_LINE), 1.0))
        self.air_lines = line_curve(vb, pg.mkPen(SURFACE, width=2), 6, connect="pairs")
        self.interface_levels = []
        """Levels [m] of the layer interfaces drawn (bottom up), for dragging."""
        self.interface_spans = []
        """Where each interface crosses the cavity: x-ranges [m], bottom up."""
        self.air_texts = []
        """The labels asked for the pockets of trapped air, in order."""
        self.gas_text = None
        """The label asked for the gas over the free surface, or None."""
        self.spill = line_curve(vb, pg.mkPen(MUTED, width=1, style=Qt.PenStyle.DashLine), 0)
        self.down = line_curve(vb, pg.mkPen(LOAD, width=3), 30, connect="pairs")
        self.up = line_curve(vb, pg.mkPen(UPLIFT_COLOUR, width=3), 30, connect="pairs")
        self._polygon = self._polygon_section = None
        self.envelope_edges = None
        """The WettedEdges of the envelope diagram last drawn (None in case view)."""
        self._parts_key = self._carries = self._runs = None
        self._shafts = []

    def polygon(self, section):
        """The cavity of ``section`` as a shapely polygon (kept per section)."""
        if self._polygon is None or self._polygon_section is not section:
            self._polygon = shapely.Polygon(section.outline)
            self._polygon_section = section
        return self._polygon

    def draw(self, solution, scale, scope, units, labels):
        """Draw ``solution`` with pressure ``scale`` [m/Pa]; forces shown by
        ``scope`` (:class:`wetline.core.force_scope.ForceScope`), lengths and
        pressures in ``units``; the labels asked of ``labels``
        (:class:`wetline.app.window.canvas_labels.CanvasLabels`)."""
        section = solution.section
        self.envelope_edges = None
        size = max(float(np.ptp(section.outline[:, 0])), section.z_max - section.z_min, 1e-9)
        labels.clear(section.outline)
        surface_labels = self._draw_liquid(solution, size, units)
        carries, runs = self._parts_of(section)
        w = wetted_edges(solution, carries)
        x, z, connect = diagram_polygons(w, scale)
        path = path_of(x, z, connect)
        path.setFillRule(Qt.FillRule.WindingFill)
        self.diagram.setPath(path)
        tx, tz, px, pz = pressure_arrows(w, scale)
        self.arrows.setData(*arrow_strokes(tx, tz, px, pz, 0.02 * size))
        totals, pieces = self._draw_resultants(solution, w, runs, size, scope)
        for shaft in self._shafts:
            labels.keep_off_shaft(*shaft)
        # In order of importance: the parts' totals, the free surface and
        # spill level, the runs' values (near their arrows), the totals of
        # parts whose runs cancel (where there is room), the pressures.
        for args, kw in totals:
            labels.ask(*args, **kw)
        for ask in surface_labels:
            labels.ask(*ask)
        for args, kw in pieces:
            labels.ask(*args, **kw)
        self._ask_pressures(w, scale, section.n_edges, units, labels)

    def draw_envelope(self, solved, scale, units, labels):
        """Draw the envelope of the solved cases ``solved``
        (:class:`wetline.core.load_cases.SolvedCase`, one section): each
        edge's largest design pressure
        (:func:`wetline.app.render.geometry.envelope_wetted_edges`), with
        its values; no liquid, free surface or resultants (they belong to
        one case), the spill level kept."""
        section = solved[0].solution.section
        size = max(float(np.ptp(section.outline[:, 0])), section.z_max - section.z_min, 1e-9)
        labels.clear(section.outline)
        for item in (self.liquid, self.mirror_liquid, self.air, *self.layer_fills):
            item.setPath(rings_path([]))
        self.surface.setData([], [])
        self.interfaces.setData([], [])
        self.air_lines.setData([], [])
        self.interface_levels = []
        self.interface_spans = []
        self.air_texts = []
        self.gas_text = None
        self.down.setData([], [])
        self.up.setData([], [])
        spill = section.spill_level
        xmax = float(section.outline[:, 0].max())
        left = -xmax if section.is_axisymmetric else float(section.outline[:, 0].min())
        margin = 0.04 * size
        if spill is not None:
            self.spill.setData([left - 2 * margin, xmax + 2 * margin], [spill, spill])
        else:
            self.spill.setData([], [])
        carries, _ = self._parts_of(section)
        w = envelope_wetted_edges([s.solution for s in solved], [s.load_factor for s in solved],
                                  carries)
        self.envelope_edges = w
        x, z, connect = diagram_polygons(w, scale)
        path = path_of(x, z, connect)
        path.setFillRule(Qt.FillRule.WindingFill)
        self.diagram.setPath(path)
        tx, tz, px, pz = pressure_arrows(w, scale)
        self.arrows.setData(*arrow_strokes(tx, tz, px, pz, 0.02 * size))
        z_top = float(section.outline[:, 1].max())
        labels.ask(left, z_top + 2 * margin,
                   f"envelope of {count_of(len(solved), 'case')} (design values)",
                   DIAGRAM_TEXT, (0, 0), bold=True)
        if spill is not None:
            labels.ask(xmax + 2 * margin, spill, "spill level", MUTED, (0, 0.5))
        self._ask_pressures(w, scale, section.n_edges, units, labels)

    def _parts_of(self, section):
        """The edges that carry a diagram and the runs of parts. They depend
        on the parts only, so a dragged outline keeps them; except that on an
        axisymmetric section a drag may move a vertex onto or off the axis."""
        key = self._parts_key
        if key is None or not (key is section.parts or key == section.parts):
            self._carries = carrying_edges(section)
            self._runs = part_runs(section)
            self._parts_key = section.parts
        carries = carrying_edges(section) if section.is_axisymmetric else self._carries
        return carries, self._runs

    def _draw_liquid(self, solution, size, units):
        """The liquid below the free surface, the surface across the cavity
        (across the whole width above a closed section's roof) and the spill
        level; returns the labels they ask for (asked after the resultants,
        which come first)."""
        section = solution.section
        h = solution.level
        xmin, xmax = float(section.outline[:, 0].min()), float(section.outline[:, 0].max())
        axi = section.is_axisymmetric
        path = rings_path(liquid_rings(section, h, self.polygon(section)))
        self.liquid.setPath(path)
        if axi:
            self.mirror_liquid.setPath(QTransform.fromScale(-1.0, 1.0).map(path))
        if self.mirror_liquid.isVisible() != axi:
            self.mirror_liquid.setVisible(axi)
        margin = 0.04 * size
        left_end = -xmax if axi else xmin
        asks = []
        if h > section.z_min:
            spans = surface_spans(section, h)
            if not spans:  # level above a closed section's roof: a standpipe head
                spans = [(left_end - margin, xmax + margin)]
            elif axi:  # across the whole vessel
                spans += [(-b, -a) for a, b in spans]
            sx = np.array(spans, dtype=float).ravel()
            self.surface.setData(sx, np.full(sx.size, h), connect="pairs")
            asks.append((float(sx.min()) - 0.5 * margin, h, f"free surface {units.fmt_length(h)}",
                         SURFACE, (1, 0.5)))
        else:
            self.surface.setData([], [])
        spill = section.spill_level
        if spill is not None:
            self.spill.setData([left_end - 2 * margin, xmax + 2 * margin], [spill, spill])
            asks.append((xmax + 2 * margin, spill, "spill level", MUTED, (0, 0.5)))
        else:
            self.spill.setData([], [])
        return asks + self._draw_layers_and_air(solution, margin, units)

    def _draw_layers_and_air(self, solution, margin, units):
        """The layers above the bottom one (tinted), their interfaces across
        the cavity (dashed, labelled with the liquids and level), and each
        pocket of trapped air (a light fill, its interface, its pressure).
        Returns the labels they ask for."""
        section = solution.section
        asks = []
        bands = layer_bands(solution, self.polygon(section)) if len(solution.layers) > 1 \
            else []
        for k, item in enumerate(self.layer_fills):
            rings = bands[k] if k < len(bands) else []
            item.setPath(rings_path(rings))
            if item.isVisible() != bool(rings):
                item.setVisible(bool(rings))
        faces = layer_interfaces(solution)
        self.interface_levels = [f.level for f in faces]
        self.interface_spans = [list(f.spans) for f in faces]
        xs, zs = [], []
        for face in faces:
            for a, b in face.spans:
                xs += [a, b]
                zs += [face.level, face.level]
            if face.spans:
                a = min(sp[0] for sp in face.spans)
                asks.append((a + 0.25 * margin, face.level,
                             f"{face.text} {units.fmt_length(face.level)}",
                             INTERFACE_LINE, (0, 1)))
        self.interfaces.setData(np.array(xs, dtype=float), np.array(zs, dtype=float))
        marks = air_marks(solution) if solution.pockets else []
        rings = [r for m in marks for r in m.rings]
        self.air.setPath(rings_path(rings))
        ax, az = [], []
        self.air_texts = []
        for m in marks:
            for a, b in m.spans:
                ax += [a, b]
                az += [m.interface, m.interface]
            text = f"trapped air {units.fmt_pressure(m.air_pressure)}"
            self.air_texts.append(text)
            asks.append((m.at[0], m.at[1], text, AIR_LINE, (0.5, 0.5)))
        self.air_lines.setData(np.array(ax, dtype=float), np.array(az, dtype=float))
        gas = gas_mark(solution, self.polygon(section))
        self.gas_text = None if gas is None else f"gas {units.fmt_pressure(gas.pressure)}"
        if gas is not None:
            asks.append((gas.at[0], gas.at[1], self.gas_text, DIAGRAM_TEXT, (0.5, 0.5)))
        return asks

    def _draw_resultants(self, solution, w, runs, size, scope):
        """An arrow per run of a part from the point where it acts, longer
        for larger loads; each part's total labelled once (bold, at its
        resultant), the runs of a part loaded on several runs named by their
        edges in a lighter style (:func:`wetline.app.render.geometry.load_marks`);
        the arrows kept clear of the labels. Returns the labels to ask for:
        (totals, the rest), each a list of (args, keywords) of
        :meth:`wetline.app.window.canvas_labels.CanvasLabels.ask`."""
        self._shafts = []
        marks = load_marks(solution, runs, w)
        if not marks:
            self.down.setData([], [])
            self.up.setData([], [])
            return [], []
        biggest = max(m.magnitude for m in marks) or 1.0
        arrows = [m for m in marks if m.arrow and m.magnitude > 1e-9 * biggest]
        top = max((m.magnitude for m in arrows), default=1.0) or 1.0
        down_t, up_t, tips = [], [], {}
        for m in arrows:
            mag = m.magnitude
            ux, uz = (0.0 if np.isnan(m.fx) else m.fx) / mag, m.fz / mag
            length = size * (0.12 + 0.13 * mag / top)
            tip = (m.x + length * ux, m.z + length * uz)
            (up_t if m.is_uplift(biggest) else down_t).append((m.x, m.z, *tip))
            self._shafts.append((m.x, m.z, *tip))
            tips[id(m)] = (tip, ux, uz)
        totals, pieces, cancelled = [], [], []
        for m in marks[:MAX_RESULTANT_LABELS]:
            up = m.is_uplift(biggest)
            text = m.text(scope.text(m.magnitude, scale=biggest), biggest,
                          scope.text(m.fz, scale=biggest))
            if m.total:
                colour = UPLIFT_COLOUR if up else LOAD
            else:
                colour = UPLIFT_EDGE if up else LOAD_EDGE
            cancels = m.magnitude <= 1e-9 * biggest  # a total whose runs cancel
            if id(m) in tips:
                tip, ux, uz = tips[id(m)]
                # The tip on the box's edge facing back along the arrow.
                k = max(abs(ux), abs(uz))
                ask = ((tip[0], tip[1], text, colour, (0.5 - 0.5 * ux / k, 0.5 + 0.5 * uz / k)),
                       {"bold": m.total, "near": not m.total})
            else:  # a part's total on several runs: at its resultant, no arrow
                ask = ((m.x, m.z, text, colour, (0.5, 0.5)),
                       {"bold": True, "optional": cancels})
            (cancelled if cancels else totals if m.total else pieces).append(ask)
        for item, arrows_ in ((self.down, down_t), (self.up, up_t)):
            if arrows_:
                a = np.array(arrows_)
                item.setData(*arrow_strokes(a[:, 0], a[:, 1], a[:, 2], a[:, 3], 0.045 * size))
            else:
                item.setData([], [])
        return totals, pieces + cancelled

    @staticmethod
    def _ask_pressures(w, scale, n_vertices, units, labels):
        """The pressure at the places of
        :func:`wetline.app.render.geometry.pressure_sites` (the same as the
        exported diagram's), deepest first, where there is room."""
        for site in pressure_sites(w, n_vertices, MAX_PRESSURE_LABELS):
            dx, dz = site.direction
            x, z = site.tip(scale)
            # One value once in a neighbourhood (both ends of a lid ...).
            labels.ask(x, z, units.fmt_pressure(site.pressure), DIAGRAM_TEXT,
                       (0.5 - 0.5 * dx, 0.5 + 0.5 * dz), optional=True, once=True)
