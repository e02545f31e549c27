"""Light background grid lines for the plots, as one line-pairs curve.

pyqtgraph's axis grid and GridItem cost several milliseconds per repaint
offscreen; a few dozen plain line segments, recomputed only when the view
range changes, cost almost nothing.
"""

from __future__ import annotations

import math

import numpy as np
import pyqtgraph as pg

from wetline.core.numbers import nice_step

__all__ = ["LightGrid", "GRID_LINES"]

GRID_LINES = 10
"""About this many grid lines across the view, a 1-2-5 step apart."""


class LightGrid(pg.PlotCurveItem):
    """Grid lines following the view box's range."""

    def __init__(self, viewbox, colour="#e6e9ee"):
        super().__init__(connect="pairs", skipFiniteCheck=True, pen=pg.mkPen(colour, width=1))
        self.setZValue(-100)
        self._vb = viewbox
        self.scale = (1.0, 1.0)
        """Display units per view unit in x and y: the lines fall on round
        numbers of the unit shown on the axes (feet on a view in metres)."""
        viewbox.addItem(self, ignoreBounds=True)
        viewbox.sigRangeChanged.connect(self._on_rangeChanged)
        self._on_rangeChanged()

    def _on_rangeChanged(self, *_):
        (x0, x1), (y0, y1) = self._vb.viewRange()
        kx, ky = self.scale
        xs = self._lines(x0 * kx, x1 * kx) / kx
        ys = self._lines(y0 * ky, y1 * ky) / ky
        x = np.concatenate([np.repeat(xs, 2), np.tile([x0, x1], ys.size)])
        y = np.concatenate([np.tile([y0, y1], xs.size), np.repeat(ys, 2)])
        self.setData(x, y)

    def set_scale(self, kx, ky):
        """Round lines in display units: ``kx``, ``ky`` display units per
        view unit."""
        if (kx, ky) != self.scale:
            self.scale = (float(kx), float(ky))
            self._on_rangeChanged()

    @staticmethod
    def _lines(a, b):
        step = nice_step((b - a) / GRID_LINES)
        if not (math.isfinite(a) and math.isfinite(b)) or (b - a) / step > 200:
            return np.empty(0)
        return np.arange(math.ceil(a / step), math.floor(b / step) + 1) * step
