"""Vector (SVG) export of the pressure diagram.

The same drawing as the PNG (:class:`wetline.app.render.scene.DiagramScene`), painted
through :class:`PySide6.QtSvg.QSvgGenerator` instead of onto an image, so
lines, fills and text stay vectors: the outline and the pressure diagrams
become ``<polyline>``/``<path>`` elements, every label a ``<text>`` element.
(pyqtgraph's own SVG exporter fails on Qt >= 6.11: Qt now closes paths with
'Z', which it does not expect.)

The SVG's user units are the scene's pixels (``viewBox="0 0 W H"``); its
physical size is stated at 96 px per inch, the CSS pixel, so a browser shows
it at one user unit per screen pixel. The file is written atomically: the
SVG is generated in memory, written to a temporary file in the same folder
and renamed over the target.
"""

from __future__ import annotations

from PySide6.QtCore import QBuffer, QByteArray, QIODevice, QRectF, QSize
from PySide6.QtSvg import QSvgGenerator

from wetline.app.render.case_drawing import case_drawing
from wetline.app.render.output import (
    check_level,
    check_size,
    ensure_app,
    program_name,
    write_output,
)
from wetline.app.render.scene import DiagramScene
from wetline.core.units import display_units

__all__ = ["DEFAULT_SVG_SIZE", "SVG_DPI", "export_svg", "render_svg"]

DEFAULT_SVG_SIZE = (1600, 1131)
"""Default drawing size [user units = px]: the proportions of A4 landscape."""

SVG_DPI = 96
"""Pixels per inch stated for the SVG's physical size (the CSS pixel)."""


def render_svg(subject, *, case=None, level=None, units="si", size=DEFAULT_SVG_SIZE,
               date=None):
    """The pressure diagram of one load case as SVG text.

    Parameters
    ----------
    subject : wetline.core.load_cases.Design or wetline.core.case.Case
        As for :func:`wetline.app.render.png.render_diagram`.
    case : str, optional
        The load case drawn (its name); default the first. Only for a Design.
    level : float, optional
        Free-surface height [m] instead of the case's fill.
    units : str
        ``"si"`` or ``"us"``.
    size : (int, int)
        Drawing width and height [px], as for :func:`wetline.app.render.png.render_diagram`.
    date : datetime.date or str, optional
        Date in the title block; default today.

    Returns
    -------
    bytes
        The UTF-8 SVG document.

    Raises
    ------
    wetline.app.render.output.ExportError
        For a bad size or level, or a case the design does not have.
    """
    w, h = check_size(size)
    du = display_units(units)
    level = check_level(level)
    ensure_app()
    drawing = case_drawing(subject, case, level)
    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    gen = QSvgGenerator()
    gen.setOutputDevice(buffer)
    gen.setSize(QSize(w, h))
    gen.setViewBox(QRectF(0, 0, w, h))
    gen.setResolution(SVG_DPI)
    name = drawing.case.section.name.strip() or "Untitled section"
    gen.setTitle(f"{name}: pressure diagram")
    gen.setDescription(f"Hydrostatic pressure diagram drawn by {program_name()}")
    DiagramScene(drawing.case, drawing.solution, du.name, (w, h), date,
                 structure=drawing.structure, case_name=drawing.case_name).paint(gen)
    buffer.close()
    return bytes(data.data())


def export_svg(subject, path, *, case=None, level=None, units="si", size=DEFAULT_SVG_SIZE,
               date=None):
    """Write the pressure diagram of one load case to an SVG file, atomically.

    Parameters as :func:`render_svg`; ``path`` is the file to write.

    Raises
    ------
    wetline.app.render.output.ExportError
        For a bad size or level, or a path that cannot be written (missing
        folder, a folder in the way, no permission, disk full). Nothing is
        left behind on failure.
    """
    write_output(path, "the SVG",
                 lambda: render_svg(subject, case=case, level=level, units=units, size=size,
                                    date=date))
