"""The look of Wetline's drawings: colours, the part palette, fonts and text
alignment, shared by the exported diagram, the chart image, the calculation
sheet and the live window.

An engineering-drawing look: dark ink on white, one warm hue for pressure,
one cool hue for the liquid, two strong hues for the resultants. Colours are
``"#rrggbb"`` strings (or an RGBA tuple where a fill is translucent), so a
caller makes its own ``QColor`` or pyqtgraph pen from them.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtGui import QFont

from wetline.core.section import AXIS, FLOOR, OPEN

__all__ = [
    "INK", "MUTED", "RULE", "LIQUID", "LIQUID_GHOST", "SURFACE", "DIAGRAM_FILL",
    "DIAGRAM_LINE", "DIAGRAM_TEXT", "LOAD", "UPLIFT", "LOAD_EDGE", "UPLIFT_EDGE",
    "OPEN_EDGE", "FLOOR_COLOUR", "DIMENSION", "STRUCTURE_FILL", "GROUND", "GROUNDWATER",
    "GROUNDWATER_FILL", "LAYER_TINTS", "AIR_FILL", "AIR_LINE", "INTERFACE_LINE",
    "LEVEL_SERIES", "LEVEL_MARK",
    "PART_COLOURS", "part_colours", "OK_COLOUR", "NOT_OK_COLOUR",
    "FONT_FAMILY", "Fonts", "pixel_font", "point_font",
    "LEFT", "RIGHT", "HCENTER", "VCENTER", "TOP", "WRAP",
]

INK = "#1d2530"
"""Text and frame lines."""
MUTED = "#5f6b78"
"""Secondary text: labels of values, notes, the centre line."""
RULE = "#b3bcc6"
"""Thin rules between blocks of text."""
LIQUID = "#d9eaf6"
"""The liquid below the free surface."""
LIQUID_GHOST = "#eef5fb"
"""The liquid of the mirrored half of an axisymmetric section."""
SURFACE = "#1c6aa8"
"""The free surface, its mark and label."""
DIAGRAM_FILL = (236, 156, 64, 92)
"""Fill of the pressure diagrams (RGBA)."""
DIAGRAM_LINE = "#b05e12"
"""Outer edge and hatching of the pressure diagrams."""
DIAGRAM_TEXT = "#7d3f05"
"""Pressure values."""
LOAD = "#a61e2d"
"""A resultant pressing a part outward or down."""
UPLIFT = "#5a2fa6"
"""A resultant lifting a part."""
LOAD_EDGE = "#b8646c"
"""The value of one run of a part's edges (lighter than a part's total)."""
UPLIFT_EDGE = "#8a6fbd"
"""The value of one run lifting a part (lighter than a part's total)."""
DIMENSION = "#3d4856"
"""Dimension lines, their ticks and extension lines."""
STRUCTURE_FILL = "#eceff2"
"""The structure's section between its outline and the cavity (hatched over)."""
GROUND = "#7a5c3a"
"""The ground surface and its soil mark."""
GROUNDWATER = "#1f7f9e"
"""The groundwater line, its mark and its pressure on the outer face."""
GROUNDWATER_FILL = (86, 170, 196, 70)
"""Fill of the groundwater's pressure diagram (RGBA)."""
LAYER_TINTS = ((236, 196, 92, 120), (196, 150, 220, 110), (150, 206, 140, 120))
"""The liquid layers above the bottom one, in turn, over the liquid (RGBA)."""
AIR_FILL = (250, 252, 255, 235)
"""Air trapped under a ceiling (RGBA), over the liquid."""
AIR_LINE = "#5f6b7a"
"""The outline of trapped air and its label."""
INTERFACE_LINE = "#8a5a00"
"""Interfaces between liquid layers (dashed) and their labels."""
OPEN_EDGE = "#8c96a1"
"""Open edges (no wall) and the axis."""
FLOOR_COLOUR = "#6b4a2b"
"""The part named ``floor``."""
PART_COLOURS = ("#1f4f8f", "#2b7a48", "#00727a", "#4c5b6b", "#8a6a12", "#36449c",
                "#7a4a6e", "#2f6f5f")
"""Colours of the loaded parts other than ``floor``, in order of appearance."""
OK_COLOUR = "#1d6b34"
"""A verdict that passes (the uplift check)."""
NOT_OK_COLOUR = "#b3141f"
"""A verdict that fails."""

LEVEL_SERIES = (("fluid_weight", "liquid weight", "#1d5fa6", Qt.PenStyle.DashLine),
                ("floor_force", "floor force", FLOOR_COLOUR, Qt.PenStyle.SolidLine),
                ("support_reaction", "support reaction", INK, Qt.PenStyle.SolidLine))
"""The totals of the loads-against-level chart (image and window): key of
:class:`wetline.core.level_table.LevelTable`, legend text, colour, pen style.
Each part's own load follows, dotted, in its part colour."""
LEVEL_MARK = "#d04a02"
"""The current level on the loads-against-level chart."""

FONT_FAMILY = "DejaVu Sans"
"""The one font family of exported drawings (embedded in PDF and SVG)."""

WRAP = int(Qt.TextFlag.TextWordWrap.value)
LEFT = int(Qt.AlignmentFlag.AlignLeft.value)
RIGHT = int(Qt.AlignmentFlag.AlignRight.value)
HCENTER = int(Qt.AlignmentFlag.AlignHCenter.value)
VCENTER = int(Qt.AlignmentFlag.AlignVCenter.value)
TOP = int(Qt.AlignmentFlag.AlignTop.value)


def part_colours(names):
    """The one part palette (window canvas, chart, exported diagram and
    chart image): ``floor`` its own colour, ``open`` and ``axis`` grey, the
    other parts from :data:`PART_COLOURS` in turn, in the order given.

    Parameters
    ----------
    names : sequence of str
        Part names in order of appearance (``section.part_names``); repeats
        are ignored.

    Returns
    -------
    dict of str to str
    """
    colours, k = {}, 0
    for name in dict.fromkeys(names):
        if name == FLOOR:
            colours[name] = FLOOR_COLOUR
        elif name in (OPEN, AXIS):
            colours[name] = OPEN_EDGE
        else:
            colours[name] = PART_COLOURS[k % len(PART_COLOURS)]
            k += 1
    return colours


def _no_ligatures(font):
    # "fl" must stay two letters in a PDF's or SVG's extracted text.
    font.setFeature(QFont.Tag("liga"), 0)
    return font


def pixel_font(px, bold=False):
    """A :data:`FONT_FAMILY` font ``px`` pixels high (at least 1)."""
    f = QFont(FONT_FAMILY)
    f.setPixelSize(max(1, int(round(px))))
    if bold:
        f.setWeight(QFont.Weight.Bold)
    return _no_ligatures(f)


def point_font(pt, bold=False):
    """A :data:`FONT_FAMILY` font of ``pt`` points (printed pages)."""
    f = QFont(FONT_FAMILY)
    f.setPointSizeF(pt)
    if bold:
        f.setWeight(QFont.Weight.Bold)
    return _no_ligatures(f)


class Fonts:
    """The fonts of one drawing, all in pixel sizes from one ``base`` size [px]."""

    def __init__(self, base):
        self.base = base
        self.body = pixel_font(base)
        self.small = pixel_font(base * 0.86)
        self.bold = pixel_font(base, bold=True)
        self.heading = pixel_font(base * 0.9, bold=True)
        self.title = pixel_font(base * 1.45, bold=True)
        self.label = pixel_font(base * 0.92)
        self.label_bold = pixel_font(base * 0.95, bold=True)
