"""The canvas's pointer and keys (a part of :class:`~wetline.app.window.canvas.SectionCanvas`):
where a point made with the mouse lands (the snap grid), the status-bar text
under the pointer (x, z, depth and the pressure of the case's law), and the
mouse clicks and keys passed on to the outline editor."""

from __future__ import annotations

import shapely
from PySide6.QtCore import Qt

from wetline.app.window.draw_input import STARTS
from wetline.core.numbers import format_entered

__all__ = ["CanvasPointer"]


class CanvasPointer:
    """The pointer, snapping and keys of the canvas it is mixed into (a
    pyqtgraph ``PlotWidget`` with a document, a snap grid and an editor)."""

    @property
    def snap_enabled(self):
        """True if points made with the mouse snap to the grid."""
        return self.snap_grid.enabled

    @snap_enabled.setter
    def snap_enabled(self, on):
        self.snap_grid.enabled = bool(on)

    @property
    def snap_spacing(self):
        """Snap grid spacing [m] (a round number of the display unit)."""
        return self.snap_grid.spacing

    @snap_spacing.setter
    def snap_spacing(self, metres):
        self.snap_grid.set_spacing(metres)

    def snap(self, x, z):
        """(x, z) [m] of a point made with the mouse: on the snap grid if
        snapping is on, else rounded to the 1-2-5 step of the display unit
        under one screen pixel (:class:`wetline.app.window.snap.SnapGrid`)."""
        px = self.getPlotItem().getViewBox().viewPixelSize()
        return self.snap_grid.point(x, z, pixel=min(px) if px[0] > 0 and px[1] > 0 else None)

    def _view_point(self, scene_pos):
        p = self.getPlotItem().getViewBox().mapSceneToView(scene_pos)
        return p.x(), p.y()

    def _on_mouseMoved(self, scene_pos):
        if not self.getPlotItem().getViewBox().sceneBoundingRect().contains(scene_pos):
            return
        x, z = self._view_point(scene_pos)
        self.pointer = (x, z)
        self.hoverText.emit(self.describe_point(x, z))
        if self._mode == "draw" and self.editor.drawn:
            self.outline_layer.show_sketch(self.editor.drawn + [self.snap(x, z)])

    def _on_mouseClicked(self, ev):
        if ev.isAccepted() and ev.button() != Qt.MouseButton.LeftButton:
            return
        x, z = self._view_point(ev.scenePos())
        self.editor.on_click(x, z, ev.button(), ev.double(), ev.screenPos())

    def keyPressEvent(self, ev):
        if self._mode == "draw" and ev.text() and ev.text() in STARTS:
            self.typedStart.emit(ev.text())
            return
        if not self.editor.on_key(ev.key()):
            super().keyPressEvent(ev)

    def describe_point(self, x, z):
        """x, z, depth below the free surface and pressure there, as text."""
        units = self._doc.units
        sol = self._solution
        text = f"x {units.fmt_length(x)}   z {units.fmt_length(z)}"
        if self._mode == "draw":  # where a click would put the vertex
            sx, sz = self.snap(x, z)
            text = (f"x {format_entered(units.length(sx))} {units.length_unit}   "
                    f"z {format_entered(units.length(sz))} {units.length_unit}   "
                    f"(snap {self.snap_grid.text() if self.snap_enabled else 'off'})")
        if sol is None:
            return text
        hint = self.editor.interface_hint(x, z)
        if hint:
            text += f"   {hint}"
        depth = sol.level - z
        poly = self.load_layer.polygon(sol.section)
        # The mirrored half of an axisymmetric section is the same vessel.
        r = abs(x) if sol.section.is_axisymmetric else x
        if not shapely.contains_xy(poly, r, z):
            return text + "   outside the section"
        if depth > 0:  # the case's law: layers and gas too
            p = sol.law.pressure_at(z) if sol.law is not None else \
                sol.density * sol.gravity * depth
            text += f"   depth {units.fmt_length(depth)}   pressure {units.fmt_pressure(p)}"
        else:
            text += f"   {units.fmt_length(-depth)} above the free surface"
        return text
