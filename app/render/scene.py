"""The pressure diagram of one design case, laid out for one page or image.

:class:`DiagramScene` is what the PNG (:mod:`wetline.app.render.png`), the
SVG (:mod:`wetline.app.render.svg`) and the calculation sheet
(:mod:`wetline.app.render.sheet`) paint: QtGui only (no widgets, no
pyqtgraph), so it runs offscreen and from the command line. It holds what
every piece of the drawing shares (the case, its solution, the display
units and force scope, sizes) and lays the page out: the drawing on the left
(or above, on a tall page) and the title block beside it (or below), in a
frame. The pieces that paint:

- :class:`wetline.app.render.title_block.TitleBlock`: section name, liquid,
  density and its source, gravity, level, key totals, loads by part, the
  legend, units, date and the caution;
- :class:`wetline.app.render.diagram_view.DiagramView`: the drawing area,
  mapping the section [m] onto the page [px], with its labels;
- :mod:`wetline.app.render.section_layers`: the outline by part (``open``
  edges dashed, the axis of an axisymmetric section as a centre line with a
  faint mirror image of the other half), the liquid, the free surface
  (above the roof of a closed section under a standpipe head), the spill
  level and the length and pressure scales;
- :mod:`wetline.app.render.load_layers`: the pressure diagram along every
  wetted wall, drawn outward from the wall (filled and hatched) with the
  pressure at its corners, and the resultant of each run of a part as an
  arrow pointing at the wall; upward loads in their own colour, labelled
  "uplift".

The geometry comes from :mod:`wetline.app.render.geometry`, the same as the
window's canvas. Fonts and line widths scale with the page, so the default
A4-at-300-dpi image and a small 800 x 600 one are both legible. Values
inside are SI (m, Pa, N), converted only for the labels.
"""

from __future__ import annotations

import math

from PySide6.QtCore import QLineF, QRectF, Qt
from PySide6.QtGui import QColor, QPainter, QPen

from wetline.app.render.diagram_view import DiagramView
from wetline.app.render.geometry import part_runs, wetted_edges
from wetline.app.render.output import ExportError, date_text
from wetline.app.render.style import INK, Fonts, part_colours
from wetline.app.render.title_block import TitleBlock
from wetline.core.force_scope import force_scale, force_scope
from wetline.core.numbers import is_noise
from wetline.core.units import display_units

__all__ = ["DiagramScene"]


class DiagramScene:
    """The pressure diagram of ``case`` at ``solution`` laid out for ``size``.

    Parameters
    ----------
    case : wetline.core.case.Case
    solution : wetline.core.hydrostatics.Solution
        The case solved at the level to draw.
    units : str
        ``"si"`` or ``"us"``.
    size : (int, int)
        Width and height the scene is laid out for [px].
    date : datetime.date or str or None
        Date in the title block (default today).
    structure : wetline.core.structure.StructureLoads, optional
        The structure around the cavity in this case: drawn hatched, with
        the ground and groundwater lines and the groundwater's pressure on
        its outer face.
    figure : bool
        Lay out a figure for a page of text (the calculation sheet): the
        drawing over the whole size and a legend along its foot, no title
        block (the sheet's tables say what it would).
    font_px : float, optional
        Body text size [px] (default from the size: 8.7 pt on an A4 page
        at 300 dpi); never shrunk below it.
    case_name : str, optional
        The load case drawn, named in the title block.
    """

    def __init__(self, case, solution, units, size, date, *, structure=None, figure=False,
                 font_px=None, case_name=None):
        self.case = case
        self.solution = solution
        self.section = solution.section
        self.units = display_units(units)
        self.width, self.height = size
        self.date = date_text(date)
        self.figure = figure
        self.case_name = case_name
        d = min(self.width / math.sqrt(2.0), float(self.height))
        self.base_font = font_px if font_px is not None else max(12.0, 0.0147 * d)
        """Body text size [px]: 36 px on an A4 page at 300 dpi (8.7 pt, its
        smallest text 7.5 pt); the title block may shrink it, not below
        :attr:`min_font`."""
        self.min_font = self.base_font if font_px is not None else min(self.base_font,
                                                                       0.0138 * d)
        self.structure_loads = structure
        self.structure = None if structure is None else structure.structure
        gw = None if structure is None else structure.groundwater
        self.groundwater_level = None if gw is None else gw.level
        self.groundwater_density = None if gw is None else gw.density
        ground = None if structure is None else structure.ground
        self.ground_level = None if ground is None else ground.level
        self.interfaces = _interfaces(solution)
        self.line_width = (self.base_font / 13.0 if font_px is not None
                           else max(1.1, d / 900.0))
        """Unit line width [px]."""
        self.margin = max(8.0, 0.02 * d)
        self.colours = part_colours(self.section.part_names)
        self.scope = force_scope(self.section, self.units, case.length_unit)
        """How forces are shown (:mod:`wetline.core.force_scope`)."""
        self.force_scale = force_scale(solution)
        """The largest force [N]: round-off below it shows as 0."""
        self.wetted = wetted_edges(solution)
        self.runs = part_runs(self.section)
        self.title_block = TitleBlock(self)

    # ------------------------------------------------------------- text
    @property
    def axisymmetric(self):
        return self.section.is_axisymmetric

    def length(self, metres):
        """``"2.5 m"``: a length in the display units."""
        return self.units.text(metres, "length")

    def pressure(self, pascals):
        """``"24.52 kPa"``: a pressure in the display units."""
        return self.units.text(pascals, "pressure")

    def force(self, newtons):
        """``"12.35 kN/m"``: a force as the force scope shows it."""
        return self.scope.text(newtons, scale=self.force_scale)

    def without_noise(self, newtons):
        """``newtons`` [N], or 0 if it is round-off next to the largest force."""
        return 0.0 if is_noise(newtons, self.force_scale) else newtons

    # ----------------------------------------------------------- paint
    def paint(self, device):
        """Paint the scene on ``device``: a QImage, a QSvgGenerator, a
        QPdfWriter ... The scene is laid out for its size; a device of
        another size gets it scaled to its own width and height."""
        p = QPainter(device)
        if not p.isActive():
            raise ExportError("cannot paint the diagram: the output could not be opened")
        try:
            sx, sy = device.width() / self.width, device.height() / self.height
            if (sx, sy) != (1.0, 1.0):
                p.scale(sx, sy)
            self.draw(p)
        finally:
            p.end()

    def draw(self, p):
        """Paint with the active painter ``p``, whose coordinates span
        (0, 0) to the scene's (width, height)."""
        p.save()
        try:
            p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
            p.setRenderHint(QPainter.RenderHint.TextAntialiasing, True)
            p.fillRect(QRectF(0, 0, self.width, self.height), QColor("white"))
            m = self.margin
            frame = QRectF(m, m, self.width - 2 * m, self.height - 2 * m)
            if self.figure:
                self._draw_figure(p, frame)
                return
            panel, columns, fonts, beside = self.title_block.fit(frame)
            if beside:
                area = QRectF(frame.left(), frame.top(), frame.width() - panel.width(),
                              frame.height())
            else:
                area = QRectF(frame.left(), frame.top(), frame.width(),
                              frame.height() - panel.height())
            DiagramView(self, area, fonts).draw(p)
            self.title_block.draw(p, panel, columns, fonts)
            self._draw_frame(p, frame, panel, beside)
        finally:
            p.restore()

    def figure_layout(self, frame):
        """Where a figure's parts go in ``frame``: the drawing's
        :class:`DiagramView`, the rule between it and the legend, the
        legend's blocks as ``(block, x, y, width)`` and the fonts. The
        legend goes below the drawing (in 2 to 4 columns) or beside it (in
        one or two columns, only where it fits the frame's height: a
        structure's legend is long), wherever the drawing comes out largest
        (the drawing's own scale, its labels and dimension lines counted)."""
        fonts = Fonts(self.base_font)
        legend = self.title_block.legend_block()
        pad = 0.9 * fonts.base
        gap = 1.2 * fonts.base
        columns = max(2, min(4, int(frame.width() // (16 * fonts.base))))
        cw = (frame.width() - 2 * pad - gap * (columns - 1)) / columns
        below_h = max(b.measure(fonts, cw) for b in legend.split(columns)) + 2 * pad
        area = QRectF(frame.left(), frame.top(), frame.width(), frame.height() - below_h)
        best = (DiagramView(self, area, fonts),
                QLineF(frame.left(), area.bottom(), frame.right(), area.bottom()),
                [(block, frame.left() + pad + k * (cw + gap), area.bottom() + pad, cw)
                 for k, block in enumerate(legend.split(columns))])
        column_w = 15.5 * fonts.base - 2 * pad  # a legend column beside the drawing
        for n in (1, 2):
            side_w = n * column_w + (n - 1) * gap + 2 * pad
            parts = legend.split(n)
            if (max(b.measure(fonts, column_w) for b in parts) + 2 * pad > frame.height()
                    or side_w > 0.6 * frame.width()):
                continue
            area = QRectF(frame.left(), frame.top(), frame.width() - side_w, frame.height())
            view = DiagramView(self, area, fonts)
            if view.px_per_m > best[0].px_per_m:
                best = (view, QLineF(area.right(), frame.top(), area.right(), frame.bottom()),
                        [(block, area.right() + pad + k * (column_w + gap), frame.top() + pad,
                          column_w) for k, block in enumerate(parts)])
        return (*best, fonts)

    def _draw_figure(self, p, frame):
        """The drawing over ``frame`` with its legend (:meth:`figure_layout`)."""
        view, rule, blocks, fonts = self.figure_layout(frame)
        for block, x, y, width in blocks:
            block.draw(p, fonts, x, y, width)
        view.draw(p)
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setPen(QPen(QColor(INK), 1.0 * self.line_width))
        p.drawRect(frame)
        p.drawLine(rule)

    def _draw_frame(self, p, frame, panel, beside):
        """The frame and the rule between drawing and title block, drawn last."""
        p.setBrush(Qt.BrushStyle.NoBrush)
        p.setPen(QPen(QColor(INK), 1.6 * self.line_width))
        p.drawRect(frame)
        p.setPen(QPen(QColor(INK), 1.0 * self.line_width))
        if beside:
            p.drawLine(QLineF(panel.left(), panel.top(), panel.left(), panel.bottom()))
        else:
            p.drawLine(QLineF(panel.left(), panel.top(), panel.right(), panel.top()))


def _interfaces(solution):
    """(name, level [m]) of the interfaces between liquid layers of a
    solution that has them (the top of every layer but the last)."""
    layers = getattr(solution, "layers", None) or ()
    out = []
    for layer in list(layers)[:-1]:
        if isinstance(layer, dict):
            top, name = layer.get("top"), layer.get("name")
        else:
            top, name = getattr(layer, "top", None), getattr(layer, "name", None)
        if top is not None:
            out.append((f"top of {name}" if name else "interface", float(top)))
    return out
