"""Loads against level: floor force, support reaction, liquid weight and
each part's downward load from empty to the spill level (or above the roof
of a closed section), with a cursor at the current level.

The curves are redrawn only when a new level table arrives (geometry or
liquid changed, or a dragged outline was previewed) or the units change; a
slider step only moves the cursor. The cursor is also an input: dragging it
(one undo step per drag, like the slider) or clicking in the chart sets the
fill level.

In the envelope view the chart still shows the active case's curves, and
marks on them each part's envelope values (design values): its largest
downward load and largest uplift over all cases, at the governing case's
level, named.
"""

from __future__ import annotations

import math

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.model.step_timer import span
from wetline.app.render.style import FLOOR_COLOUR, LEVEL_MARK, LEVEL_SERIES, part_colours
from wetline.app.window.canvas_items import LineItem, add_item
from wetline.app.window.grid import LightGrid
from wetline.app.window.level_cursor import LevelCursor
from wetline.app.window.outer_legend import legend_outside
from wetline.app.window.view_range import smallest_span, usable_range
from wetline.core.section import FLOOR

__all__ = ["LoadChart", "LevelCurve"]

CURSOR_COLOUR = LEVEL_MARK
FLOOR_FORCE_COLOUR = FLOOR_COLOUR
"""The floor force curve's colour (the floor part's envelope marks)."""
MARK_LABEL_FILL = pg.mkBrush(255, 255, 255, 200)
"""The ground of an envelope mark's text: the chart's white, the curves under it
still seen through it."""
MARK_LABEL_Z = 14
"""Depth of an envelope mark's text: over the curves (0), under the cursor
(15) and the marks (20)."""
LEGEND_ROWS = 6
"""Entries per column of the legend right of the curves."""


class LevelCurve(LineItem):
    """One curve of the chart: a line Qt paints itself
    (:class:`wetline.app.window.canvas_items.LineItem`; a pyqtgraph data
    item works through its data in Python at every step of a drag, where
    the curves follow the dragged outline), with its name in the legend."""

    def __init__(self, name, pen):
        super().__init__(pen)
        self._name = name

    def name(self):
        """The curve's name in the legend."""
        return self._name


class LoadChart(pg.PlotWidget):
    """The loads-against-level chart of a document."""

    def __init__(self, document, parent=None):
        super().__init__(parent, background="w")
        self._doc = document
        plot = self.getPlotItem()
        self._grid = LightGrid(plot.getViewBox())
        plot.setMenuEnabled(False)
        plot.hideButtons()
        # Right of the curves, outside the data (never over a curve).
        self._legend = legend_outside(plot, "right")
        # The ranges are set from the level table (never left to pyqtgraph's
        # auto-range, which hands a view the empty range of constant data).
        plot.getViewBox().disableAutoRange()
        self._curves = []
        self._series_key = None
        self.cursor = LevelCursor(pg.mkPen(CURSOR_COLOUR, width=1.5),
                                  pg.mkPen(CURSOR_COLOUR, width=3), CURSOR_COLOUR)
        """The cursor at the current level, its value beside its top."""
        self.cursor.setCursor(Qt.CursorShape.SizeHorCursor)
        self.cursor.setToolTip("Drag to set the fill level (or click in the chart)")
        plot.addItem(self.cursor, ignoreBounds=True)
        self._zero = pg.InfiniteLine(angle=0, movable=False, pos=0,
                                     pen=pg.mkPen("#888888", width=1))
        plot.addItem(self._zero, ignoreBounds=True)
        self._drags = 0
        self._dragging = False
        self.cursor.sigDragged.connect(self._on_cursorDragged)
        self.cursor.sigPositionChangeFinished.connect(self._on_cursorReleased)
        self.scene().sigMouseClicked.connect(self._on_mouseClicked)
        self.marks = pg.ScatterPlotItem(size=11, symbol="d", pen=pg.mkPen("#1d2530", width=1))
        self.marks.setZValue(20)
        plot.addItem(self.marks, ignoreBounds=True)
        self.marks.hide()  # shown with marks: an empty scatter item still paints (0.3 ms)
        self._mark_labels = []
        self.mark_texts = []
        """The envelope marks' texts, in order (empty in the case view)."""
        document.levelTableReady.connect(self._on_levelTableReady)
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.envelopeReady.connect(self._on_envelopeReady)
        document.viewModeChanged.connect(self._on_envelopeReady)

    def paintEvent(self, ev):
        with span("chart paint"):
            super().paintEvent(ev)

    @property
    def cursor_level(self):
        """Level [m] where the cursor stands."""
        return self._doc.units.length_si(self.cursor.value())

    # ------------------------------------------------------- document
    def _on_unitsChanged(self):
        if self._doc.level_table is not None:
            self._on_levelTableReady(self._doc.level_table)
        if self._doc.solution is not None:
            self._on_solved(self._doc.solution)
        self._on_envelopeReady()

    def _on_envelopeReady(self, *_):
        with span("chart update"):
            self._draw_marks()

    def _draw_marks(self):
        """Mark each part's envelope values (envelope view), or clear the marks."""
        doc = self._doc
        env = doc.envelope
        plot = self.getPlotItem()
        for item in self._mark_labels:
            plot.removeItem(item)
        self._mark_labels = []
        self.mark_texts = []
        if doc.view_mode != "envelope" or env is None or not doc.envelope_cases:
            self.marks.setData([], [])
            self.marks.hide()
            return
        section = doc.section
        u = doc.units
        scope = doc.force_scope(section)
        levels = {s.name: s.solution.level for s in doc.envelope_cases}
        colours = part_colours(list(section.part_names))
        spots = []
        for name, p in env.parts.items():
            colour = FLOOR_FORCE_COLOUR if name == FLOOR else colours.get(name, "#1d2530")
            for value, case, words in ((p.max_down, p.max_down_case, "max down"),
                                       (-p.max_up, p.max_up_case, "max uplift")):
                if case is None:
                    continue
                x = float(u.length(levels[case]))
                y = float(scope.to_display(value))
                spots.append({"pos": (x, y), "brush": pg.mkBrush(colour)})
                text = f"{name} {words} {scope.number(abs(value))} ({case})"
                (vx0, vx1), (vy0, vy1) = plot.getViewBox().viewRange()
                # The text on the side with room (the view grows to the marks below).
                right = x > 0.5 * (vx0 + vx1)
                high = y > 0.5 * (vy0 + vy1)
                # On a white ground: the text stays readable over the curves.
                label = pg.TextItem(text, color=colour, fill=MARK_LABEL_FILL,
                                    anchor=(1 if right else 0, 0 if high else 1))
                # Over the curves, under the marks and the cursor with its value.
                label.setZValue(MARK_LABEL_Z)
                label.setPos(x, y)
                plot.addItem(label, ignoreBounds=True)
                self._mark_labels.append(label)
                self.mark_texts.append(text)
        self.marks.setData(spots)
        self.marks.setVisible(bool(spots))
        if spots:  # design values may stand above the characteristic curves
            vb = plot.getViewBox()
            (_, _), (y0, y1) = vb.viewRange()
            ys = [sp["pos"][1] for sp in spots]
            lo, hi = min(min(ys), y0), max(max(ys), y1)
            if lo < y0 or hi > y1:
                pad = 0.08 * (hi - lo)
                vb.setYRange(lo - (pad if lo < y0 else 0.0), hi + (pad if hi > y1 else 0.0),
                             padding=0)

    def _on_levelTableReady(self, table):
        with span("chart update"):
            self._draw_curves(table)

    def _draw_curves(self, table):
        plot = self.getPlotItem()
        section = self._doc.shown_case.section
        u = self._doc.units
        x = u.length(table.levels)
        series = [(getattr(table, key), name, colour, style) for key, name, colour, style
                  in LEVEL_SERIES]
        # The table may still be of the last outline (its parts as well).
        colours = part_colours(list(section.part_names) + list(table.part_down))
        names = tuple(n for n in table.part_down if n != FLOOR)  # floor = floor force
        for name in names:
            series.append((table.part_down[name], f"{name} (down)", colours[name],
                           Qt.PenStyle.DotLine))
        # Where air can be trapped under a ceiling: the same loads with the air
        # trapped, wherever they differ from vented (dash-dot, same colours),
        # so the designer sees which assumption governs the uplift.
        trapped = [t for t in self._doc.level_tables[1:] if t.levels.shape == table.levels.shape]
        for t in trapped:
            for key, name, colour, _style in LEVEL_SERIES:
                y = getattr(t, key)
                if not np.allclose(y, getattr(table, key), rtol=1e-9, atol=0.0):
                    series.append((y, f"{name}, air trapped", colour, Qt.PenStyle.DashDotLine))
            for name in names:
                y = t.part_down.get(name)
                if y is not None and not np.allclose(y, table.part_down[name], rtol=1e-9,
                                                     atol=0.0):
                    series.append((y, f"{name} (down), air trapped", colours[name],
                                   Qt.PenStyle.DashDotLine))
        key = tuple((name, colour) for _, name, colour, _ in series)
        if key != self._series_key:
            # Other parts: new curves and legend. Otherwise (a slider, a
            # dragged vertex) the same curves take the new values.
            vb = plot.getViewBox()
            for c in self._curves:
                self._legend.removeItem(c)
                vb.removeItem(c)
            self._curves = [LevelCurve(name, pg.mkPen(colour, width=2, style=style))
                            for _, name, colour, style in series]
            for c in self._curves:
                add_item(vb, c, 0)
                self._legend.addItem(c, c.name())
            # One column of up to six entries beside the curves, then more columns.
            self._legend.fit_columns(math.ceil(len(series) / LEGEND_ROWS))
            self._series_key = key
        scope = self._doc.force_scope(section)
        ys = [scope.to_display(y) for y, *_rest in series]
        vb = plot.getViewBox()
        for curve, y in zip(self._curves, ys, strict=True):
            curve.setData(x, y)
        if not (self._doc.preview is not None and self._inside_view(vb, x, ys)):
            # (A drag step whose curves fit the view keeps the axes: fitting
            # them again every step relabels and repaints both axes.)
            self._fit_view(vb, section, x, ys)
        layered = len(self._doc.active_load_case.layers or ()) > 1
        labels = (f"Level [{u.length_unit}]"
                  + (" (the top layer rising over the layers below)" if layered else ""),
                  f"Load [{scope.label}]")
        if labels != getattr(self, "_axis_labels", None):  # a new label repaints the axis
            self._axis_labels = labels
            plot.setLabel("bottom", labels[0])
            plot.setLabel("left", labels[1])

    def _fit_view(self, vb, section, x, ys):
        """Show every curve: the levels and loads of the table, padded, each
        axis at least a usable span (the level range collapses when the
        section spills at its lowest point; the loads are all zero when it
        holds nothing)."""
        u = self._doc.units
        height = float(u.length(max(section.z_max - section.z_min, 1e-6)))
        x_span = smallest_span(0.0, 1e-3 * height)
        lo = min(float(y.min()) for y in ys)
        hi = max(float(y.max()) for y in ys)
        peak = max(abs(lo), abs(hi))
        y_span = smallest_span(peak, 1e-3 * peak if peak > 0 else 1.0)
        xr = usable_range(float(x.min()), float(x.max()), x_span, pad=0.02)
        yr = usable_range(lo, hi, y_span, pad=0.05)
        # The user's zoom stays above the same spans.
        vb.setLimits(minXRange=smallest_span(max(map(abs, xr)), x_span),
                     minYRange=smallest_span(max(map(abs, yr)), y_span))
        vb.setRange(xRange=xr, yRange=yr, padding=0)

    @staticmethod
    def _inside_view(vb, x, ys):
        (x0, x1), (y0, y1) = vb.viewRange()
        lo = min(float(y.min()) for y in ys)
        hi = max(float(y.max()) for y in ys)
        return x0 <= float(x.min()) and float(x.max()) <= x1 and y0 <= lo and hi <= y1

    def _on_solved(self, solution):
        with span("chart update"):
            self._move_cursor(solution)

    def _move_cursor(self, solution):
        u = self._doc.units
        x = float(u.length(solution.level))
        self.cursor.setValue(x)
        self.cursor.setText(u.fmt_length(solution.level))

    # ----------------------------------------------------------- user
    def _level_range(self):
        return self._doc.level_range

    def set_level_at(self, value, merge_key=None):
        """Fill to the level ``value`` on the chart's axis (display length
        unit), kept within the slider's range."""
        lo, hi = self._level_range()
        level = min(max(self._doc.units.length_si(float(value)), lo), hi)
        editing.fill_to_level(self._doc, level, merge_key)

    def _on_cursorDragged(self, line):
        if not self._dragging:
            self._dragging = True
            self._drags += 1
            self._doc.begin_live_edit()  # the envelope waits for the release
        self.set_level_at(line.value(), ("chart cursor", self._drags))

    def _on_cursorReleased(self, line):
        if self._dragging:
            self._dragging = False
            self.set_level_at(line.value(), ("chart cursor", self._drags))
            self._doc.end_live_edit()

    def _on_mouseClicked(self, ev):
        if ev.button() != Qt.MouseButton.LeftButton or ev.isAccepted():
            return
        vb = self.getPlotItem().getViewBox()
        pos = ev.scenePos()
        if not vb.sceneBoundingRect().contains(pos):
            return
        if self._legend.isVisible() and self._legend.sceneBoundingRect().contains(pos):
            return
        ev.accept()
        self.set_level_at(vb.mapSceneToView(pos).x())
