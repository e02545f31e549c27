"""The pressure diagram as a PNG image, for a calculation package.

:func:`render_diagram` paints a :class:`wetline.app.render.scene.DiagramScene`
on a white :class:`QImage` (300 dpi in its metadata); :func:`export_png`
writes it atomically (:func:`wetline.app.render.output.write_output`).
``wetline export FILE --png OUT`` (:mod:`wetline.app.cli.main`) and the
window's File > Export call them with the design and the case's name
(:mod:`wetline.app.render.case_drawing`), so both draw the same case with
its structure.
"""

from __future__ import annotations

from PySide6.QtCore import QBuffer, QByteArray, QIODevice
from PySide6.QtGui import QImage

from wetline.app.render.case_drawing import case_drawing
from wetline.app.render.output import (
    ExportError,
    check_level,
    check_size,
    ensure_app,
    write_output,
)
from wetline.app.render.scene import DiagramScene
from wetline.core.units import display_units

__all__ = ["DEFAULT_SIZE", "DPI", "render_diagram", "export_png"]

DEFAULT_SIZE = (3508, 2480)
"""Default image size [px]: A4 landscape (297 x 210 mm) at 300 dpi."""
DPI = 300
"""Resolution written into the PNG [dots per inch]."""


def render_diagram(subject, *, case=None, level=None, units="si", size=DEFAULT_SIZE,
                   date=None):
    """Paint the pressure diagram of one load case on a new image.

    Parameters
    ----------
    subject : wetline.core.load_cases.Design or wetline.core.case.Case
        The design (section, liquid, gravity, fill, the structure, ground
        and load cases), or one case (a design of that case alone).
    case : str, optional
        The load case drawn (its name), with its structure, groundwater and
        ground; default the first. Only for a Design.
    level : float, optional
        Free-surface height [m] instead of the case's fill; capped at the
        spill level of an open section (the title block says so).
    units : str
        ``"si"`` (m, kPa, kN) or ``"us"`` (ft, psi, lbf).
    size : (int, int)
        Image width and height [px], each
        :data:`wetline.app.render.output.MIN_SIDE` to
        :data:`wetline.app.render.output.MAX_SIDE`. The default fits A4
        landscape at 300 dpi.
    date : datetime.date or str, optional
        Date printed in the title block; default today (ISO 8601).

    Returns
    -------
    PySide6.QtGui.QImage
        White background, 300 dpi in its metadata.

    Raises
    ------
    ExportError
        For a bad size or level, a case the design does not have, or an
        image too large for the memory.
    wetline.core.units.UnitError
        For an unknown unit system.
    """
    w, h = check_size(size)
    du = display_units(units)
    level = check_level(level)
    ensure_app()
    drawing = case_drawing(subject, case, level)
    image = QImage(w, h, QImage.Format.Format_RGB32)
    if image.isNull():
        raise ExportError(f"not enough memory for a {w} x {h} px image")
    dpm = int(round(DPI / 0.0254))
    image.setDotsPerMeterX(dpm)
    image.setDotsPerMeterY(dpm)
    DiagramScene(drawing.case, drawing.solution, du.name, (w, h), date,
                 structure=drawing.structure, case_name=drawing.case_name).paint(image)
    return image


def _png_bytes(image, path):
    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    ok = image.save(buffer, "PNG")
    buffer.close()
    if not ok:
        raise ExportError(f"cannot write {path}: saving the PNG failed")
    return bytes(data.data())


def export_png(subject, path, *, case=None, level=None, units="si", size=DEFAULT_SIZE,
               date=None):
    """Write the pressure diagram of one load case to a PNG file, atomically.

    Parameters as :func:`render_diagram`; a failed export leaves no file
    behind and any old file as it was.

    Raises
    ------
    ExportError
        For a bad size or level, or a path that cannot be written (missing
        folder, a folder in the way, no permission, disk full), naming the
        problem.
    """
    check_size(size)
    write_output(path, "the PNG", lambda: _png_bytes(
        render_diagram(subject, case=case, level=level, units=units, size=size, date=date),
        path))
