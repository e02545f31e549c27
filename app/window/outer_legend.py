"""A legend that sits outside a plot's data: in the plot's own layout, beside
or above the view box, so no curve, outline or label runs under it.

pyqtgraph's ``PlotItem.addLegend`` floats the legend inside the view box,
over the data (the chart's "roof (down)" sat on the zero line; the cone
hopper's legend on its mirrored outline). :func:`legend_outside` puts an
:class:`OuterLegend` into a cell of the plot's grid layout instead: ``"top"``
(the title's row, entries side by side) or ``"right"`` (a column right of
the view). Curves added to the plot with a ``name`` join it as they do a
floating legend.
"""

from __future__ import annotations

import pyqtgraph as pg
from PySide6.QtCore import Qt

from wetline.app.render.style import INK

__all__ = ["OuterLegend", "legend_outside"]

_SLACK = 10.0
"""Room [px] beyond the entries' measured width (their labels' margins)."""


class OuterLegend(pg.LegendItem):
    """A legend laid out by its plot's grid layout (never over the view)."""

    def __init__(self, columns=1, **kwargs):
        super().__init__(colCount=columns, frame=False, labelTextColor=INK, **kwargs)

    def setParentItem(self, p):
        # No anchoring: the layout places the legend.
        return pg.GraphicsWidget.setParentItem(self, p)

    def updateSize(self):
        """Ask the layout for the entries' size (instead of moving itself to
        its parent's corner, as a floating legend does)."""
        if self.size is not None:
            return
        self.layout.invalidate()
        hint = self.layout.effectiveSizeHint(Qt.SizeHint.PreferredSize)
        width = hint.width() + (_SLACK if self.items else 0.0)
        self.setMinimumSize(width, hint.height())
        self.setMaximumSize(width, hint.height())
        self.updateGeometry()

    def fit_columns(self, count):
        """Entries side by side in ``count`` columns (at least 1)."""
        self.setColumnCount(max(int(count), 1))
        self.updateSize()


def legend_outside(plot, where="right", label_size="8pt"):
    """Give ``plot`` (a ``pyqtgraph.PlotItem``) an :class:`OuterLegend` in
    its layout: ``"right"`` of the view box or at the ``"top"`` (the title's
    row, which Wetline's plots leave empty). Returns the legend; curves
    added with a name join it."""
    legend = OuterLegend(labelTextSize=label_size, columns=1 if where == "right" else 8)
    if where == "top":
        plot.layout.removeItem(plot.titleLabel)
        plot.titleLabel.hide()
        plot.layout.addItem(legend, 0, 1)
    elif where == "right":
        plot.layout.addItem(legend, 2, 3)
    else:
        raise ValueError(f"a legend goes 'right' or 'top', not {where!r}")
    plot.legend = legend
    return legend
