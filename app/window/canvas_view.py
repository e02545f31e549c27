"""The canvas's view (a part of :class:`~wetline.app.window.canvas.SectionCanvas`):
the plot set up with a locked aspect and the light grid, the range that shows
the whole section with its diagrams and resultants (never an empty one), and
the axes in the display length unit while the view stays in metres."""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QGraphicsPathItem, QGraphicsView

from wetline.app.window.canvas_items import LineItem
from wetline.app.window.grid import LightGrid
from wetline.app.window.view_range import smallest_span, usable_range

__all__ = ["CanvasView"]


class CanvasView:
    """The view range and axes of the canvas it is mixed into (a
    pyqtgraph ``PlotWidget`` with a document and its layers)."""

    def _set_up_view(self):
        plot = self.getPlotItem()
        plot.setAspectLocked(True)
        plot.setMenuEnabled(False)
        plot.hideButtons()
        self._grid = LightGrid(plot.getViewBox())
        plot.getViewBox().disableAutoRange()  # fit() sets the range, never an empty one
        self.setMouseTracking(True)
        self.setFocusPolicy(Qt.FocusPolicy.StrongFocus)
        # One rectangle around everything that changed, not Qt's default
        # region of every changed item's rectangle: a fill step changes
        # some 25 to 30 items (diagram, arrows, labels), and every item
        # painted under a clip of that many rectangles cost 1.2 to 2.8 ms
        # more a step (bench_gui, interleaved runs; the chart keeps the
        # default: its cursor's old and new strips are far apart).
        self.setViewportUpdateMode(QGraphicsView.ViewportUpdateMode.BoundingRectViewportUpdate)

    def fit(self):
        """Show the whole section with its diagrams and resultants."""
        outline, _ = self._doc.working_outline()
        structure = self._doc.working_structure_outline()
        if structure is not None:
            outline = np.vstack([outline, structure[0]])
        x0, z0 = outline.min(axis=0)
        x1, z1 = outline.max(axis=0)
        ground = self._doc.ground
        if ground is not None:
            z0, z1 = min(z0, ground.level), max(z1, ground.level)
        if self._doc.section.is_axisymmetric:
            x0 = min(x0, -x1)
        layer = self.load_layer
        outer = self.structure_layer
        px, pz = self.getPlotItem().getViewBox().viewPixelSize()
        for item in (layer.diagram, layer.down, layer.up, outer.diagram):
            if isinstance(item, LineItem):
                # its points and its pen's half width and a pixel, as a
                # pyqtgraph curve's own rectangle has them
                reach = 0.5 * item.pen().widthF() + 1.0
                r = item.path().controlPointRect().adjusted(-reach * px, -reach * pz,
                                                            reach * px, reach * pz)
            elif isinstance(item, QGraphicsPathItem):
                # Qt's own stroked rectangle (its pen's width as a margin, as
                # the fit has always had it; the items' own skip the stroke).
                r = QGraphicsPathItem.boundingRect(item)
            else:
                r = item.mapRectToView(item.boundingRect())
            if r.width() > 0 or r.height() > 0:
                x0, x1 = min(x0, r.left()), max(x1, r.right())
                z0, z1 = min(z0, r.top()), max(z1, r.bottom())
        pad = 0.08 * max(x1 - x0, z1 - z0)
        # A box around one point or along one line (an outline being drawn)
        # is widened to a tenth of the section: never an empty range.
        span = 0.1 * float(np.ptp(self._doc.section.outline, axis=0).max())
        xr = usable_range(x0 - pad, x1 + pad, span)
        zr = usable_range(z0 - pad, z1 + pad, span)
        vb = self.getPlotItem().getViewBox()
        vb.setLimits(minXRange=smallest_span(max(map(abs, xr)), 1e-3 * span),
                     minYRange=smallest_span(max(map(abs, zr)), 1e-3 * span))
        vb.setRange(xRange=xr, yRange=zr, padding=0)

    def fit_when_drawn(self):
        """Fit the view once the next results are drawn (a file opened)."""
        self._first_fit = True

    def _apply_units(self):
        """The axes, their grid and the snap spacing in the display length
        unit (ft or in in US): the view stays in metres, the ticks are
        round numbers of the unit shown."""
        u = self._doc.units
        per_m = float(u.length(1.0))  # display units per metre
        plot = self.getPlotItem()
        r = "r" if self._doc.section.is_axisymmetric else "x"
        for name, text in (("bottom", f"{r} [{u.length_unit}]"),
                           ("left", f"z [{u.length_unit}]")):
            axis = plot.getAxis(name)
            axis.enableAutoSIPrefix(False)
            axis.setScale(per_m)
            axis.setLabel(text)
        self._grid.set_scale(per_m, per_m)
        self.snap_grid.follow_units(u)
