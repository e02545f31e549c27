"""Loads against level: floor force, support reaction, liquid weight and
each part's downward load from empty to the spill level (or above the roof
of a closed section), with a cursor at the current level.

The curves are redrawn only when a new level table arrives (geometry or
liquid changed) or the units change; a slider step only moves the cursor.
"""

from __future__ import annotations

import numpy as np
import pyqtgraph as pg
from PySide6.QtCore import Qt

from core.section import FLOOR

from .canvas import part_colour
from .grid import LightGrid

__all__ = ["LoadChart"]

_FIXED = (("fluid_weight", "liquid weight", "#1d5fa6", Qt.DashLine),
          ("floor_force", "floor force", "#7a5230", Qt.SolidLine),
          ("support_reaction", "support reaction", "#222222", Qt.SolidLine))


class LoadChart(pg.PlotWidget):
    """The loads-against-level chart of a document."""

    def __init__(self, document, parent=None):
        super().__init__(parent, background="w")
        self._doc = document
        plot = self.getPlotItem()
        self._grid = LightGrid(plot.getViewBox())
        plot.setMenuEnabled(False)
        plot.hideButtons()
        self._legend = plot.addLegend(offset=(8, 8), labelTextSize="8pt")
        self._curves = []
        self.cursor = pg.InfiniteLine(angle=90, movable=False,
                                      pen=pg.mkPen("#d04a02", width=1.5))
        self.cursor_label = pg.TextItem(color="#d04a02", anchor=(0, 0))
        plot.addItem(self.cursor, ignoreBounds=True)
        plot.addItem(self.cursor_label, ignoreBounds=True)
        self._zero = pg.InfiniteLine(angle=0, movable=False, pos=0,
                                     pen=pg.mkPen("#888888", width=1))
        plot.addItem(self._zero, ignoreBounds=True)
        document.levelTableReady.connect(self._on_levelTableReady)
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)

    @property
    def cursor_level(self):
        """Level [m] where the cursor stands."""
        return self._doc.units.length_si(self.cursor.value())

    def _on_unitsChanged(self):
        if self._doc.level_table is not None:
            self._on_levelTableReady(self._doc.level_table)
        if self._doc.solution is not None:
            self._on_solved(self._doc.solution)

    def _on_levelTableReady(self, table):
        plot = self.getPlotItem()
        for c in self._curves:
            self._legend.removeItem(c)
            plot.removeItem(c)
        self._curves = []
        section = self._doc.section
        u = self._doc.units
        x = u.length(table.levels)
        series = [(getattr(table, key), name, colour, style) for key, name, colour, style
                  in _FIXED]
        names = tuple(n for n in table.part_down if n != FLOOR)  # floor = floor force
        for name in names:
            series.append((table.part_down[name], f"{name} (down)",
                           part_colour(name, section.part_names), Qt.DotLine))
        for y, name, colour, style in series:
            curve = plot.plot(x, u.force(section, y), name=name,
                              pen=pg.mkPen(colour, width=2, style=style))
            self._curves.append(curve)
        plot.setLabel("bottom", f"Level [{u.length_unit}]")
        plot.setLabel("left", f"Load [{u.force_label(section)}]")
        plot.enableAutoRange()

    def _on_solved(self, solution):
        u = self._doc.units
        x = float(u.length(solution.level))
        self.cursor.setValue(x)
        vr = self.getPlotItem().getViewBox().viewRange()
        self.cursor_label.setText(f"{u.fmt_length(solution.level)}")
        self.cursor_label.setPos(x, vr[1][1])
