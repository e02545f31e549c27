"""The canvas's outline editor: what the mouse and keys do to the outline.

Mode "edit": drag a vertex (the document previews the dragged outline, so
the totals, tables and chart follow it live; one undo step on release),
drag a structure vertex (its square handle; the outline shown dashed, the
results on release, one undo step),
click to select a vertex or an edge, double-click an edge to insert a vertex
there, Delete removes the selected vertex, arrow keys nudge it by the snap
spacing (or a hundredth of the section), right-click an edge to set its
part; drag a layer interface (its up-down cursor) to move the top of the
layer below it (the view follows live; one undo step per drag; a level
core refuses, past the neighbouring interface or the free surface, keeps
the last one it took and says why in the status bar). Mode "draw": click
vertices of a new outline (on the snap grid) or type them
(:mod:`wetline.app.window.draw_input`); double-click, Enter or a click on
the first vertex closes it, Backspace takes the last one back, Esc cancels.
A closed outline gets proposed parts (floor, open top, walls) with one
click to keep or change them (:mod:`wetline.app.window.parts_proposal`).
Every edit is made by :mod:`wetline.app.model.editing`.
"""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QInputDialog, QMenu

from wetline.app.model import editing
from wetline.app.window.vertex_handles import MAX_HANDLES
from wetline.core.load_cases import LoadCaseError
from wetline.core.section import AXIS, FLOOR, OPEN

__all__ = ["OutlineEditor", "RESERVED_PART_CHOICES"]

RESERVED_PART_CHOICES = ("wall", FLOOR, OPEN, "lid", AXIS)
"""Part names offered first when assigning a part to an edge."""


class OutlineEditor:
    """Picking, dragging, clicking and keys of a
    :class:`wetline.app.window.canvas.SectionCanvas`."""

    def __init__(self, canvas, document):
        self._canvas = canvas
        self._doc = document
        self.drawn = []
        """Vertices [m] of the outline being drawn (draw mode)."""
        self._interface_drags = 0
        self._interface_live = False
        self._interface_refused = False

    # ---------------------------------------------------------- picking
    def _pixel(self):
        px = self._canvas.getPlotItem().getViewBox().viewPixelSize()
        return max(px[0], px[1], 1e-12)

    def pick_vertex(self, x, z, tolerance_px=8):
        """Index of the vertex within ``tolerance_px`` pixels of (x, z), or None."""
        outline, _ = self._doc.working_outline()
        if len(outline) > MAX_HANDLES:
            return None
        d2 = (outline[:, 0] - x) ** 2 + (outline[:, 1] - z) ** 2
        i = int(np.argmin(d2))
        return i if d2[i] <= (tolerance_px * self._pixel()) ** 2 else None

    def pick_edge(self, x, z, tolerance_px=6):
        """Index of the edge within ``tolerance_px`` pixels of (x, z), or None."""
        outline, _ = self._doc.working_outline()
        a = outline
        d = np.roll(outline, -1, axis=0) - a
        ll = (d * d).sum(axis=1)
        t = np.clip(((x - a[:, 0]) * d[:, 0] + (z - a[:, 1]) * d[:, 1])
                    / np.where(ll > 0, ll, 1.0), 0.0, 1.0)
        qx = a[:, 0] + t * d[:, 0] - x
        qz = a[:, 1] + t * d[:, 1] - z
        d2 = qx * qx + qz * qz
        i = int(np.argmin(d2))
        return i if d2[i] <= (tolerance_px * self._pixel()) ** 2 else None

    def pick_structure_vertex(self, x, z, tolerance_px=8):
        """Index of the structure's vertex within ``tolerance_px`` pixels of
        (x, z), or None (no structure, or too many vertices for handles)."""
        working = self._doc.working_structure_outline()
        if working is None or len(working[0]) > MAX_HANDLES:
            return None
        outline = working[0]
        d2 = (outline[:, 0] - x) ** 2 + (outline[:, 1] - z) ** 2
        i = int(np.argmin(d2))
        return i if d2[i] <= (tolerance_px * self._pixel()) ** 2 else None

    def pick_interface(self, x, z):
        """Index of the layer interface gripped at (x, z) [m] (0 = the top
        of the bottom layer), or None; interfaces are dragged in the case
        view of edit mode only."""
        if self._canvas.mode != "edit" or self._doc.view_mode == "envelope":
            return None
        return self._canvas.interface_grips.pick(x, z)

    def interface_hint(self, x, z):
        """What a drag at (x, z) [m] would move, for the status bar, or ""."""
        k = self.pick_interface(x, z)
        if k is None:
            return ""
        layers = editing.case_layers(self._doc)
        if k >= len(layers) - 1:
            return ""
        return f"drag: top of layer {k + 1} '{layers[k].liquid.name}'"

    # -------------------------------------------------- interface drags
    def on_interface_drag_started(self, index, x, z):
        self._interface_drags += 1
        if not self._interface_live:
            self._interface_live = True
            self._doc.begin_live_edit()  # the envelope waits for the release

    def on_interface_drag_moved(self, index, x, z):
        self._set_interface(index, z)

    def on_interface_drag_finished(self, index, x, z):
        self._set_interface(index, z)
        if self._interface_live:
            self._interface_live = False
            self._doc.end_live_edit()

    def _set_interface(self, index, z):
        """Layer ``index`` up to the pointer's level (on the snap grid, not
        below the floor); one undo step for every step of one drag. Core's
        refusal goes to the status bar and the last accepted level stays."""
        level = max(float(self._canvas.snap(0.0, z)[1]), float(self._doc.section.z_min))
        try:
            editing.set_layer_top(self._doc, index, level,
                                  merge_key=("interface", index, self._interface_drags))
        except (LoadCaseError, ValueError) as exc:
            self._interface_refused = True
            self._canvas.message.emit(f"Interface not moved: {self._doc.units.explain(exc)}")
            return
        if self._interface_refused:  # the refusal no longer holds
            self._interface_refused = False
            self._canvas.message.emit("")

    # ----------------------------------------------------- vertex drags
    def on_drag_started(self, index):
        self._doc.select_vertex(index)

    def on_drag_moved(self, index, x, z):
        # The document checks and solves the dragged outline once per
        # event-loop turn; the canvas redraws when it has (previewChanged,
        # solved).
        outline, parts = self._doc.working_outline()
        outline = np.array(outline)
        outline[index] = self._canvas.snap(x, z)
        self._doc.preview_outline(outline, parts)

    def on_drag_finished(self, index, x, z):
        x, z = self._canvas.snap(x, z)
        self._doc.end_preview()
        if not editing.move_vertex(self._doc, index, x, z):
            self._canvas.message.emit(f"Invalid outline: "
                                      f"{self._doc.units.explain(self._doc.draft.error)} "
                                      "(results keep the last valid outline)")
        self._canvas.schedule(outline=True)

    def on_structure_drag_moved(self, index, x, z):
        """A structure vertex being dragged: its outline shown dashed (the
        results follow on release, one undo step)."""
        working = self._doc.working_structure_outline()
        if working is None:
            return
        outline = np.array(working[0])
        outline[index] = self._canvas.snap(x, z)
        self._canvas.structure_layer.show_drag(outline)

    def on_structure_drag_finished(self, index, x, z):
        self._canvas.structure_layer.show_drag(None)
        if self._doc.working_structure_outline() is None:
            return
        x, z = self._canvas.snap(x, z)
        if not editing.move_structure_vertex(self._doc, index, x, z):
            why = self._doc.units.explain(self._doc.draft.error)
            self._canvas.message.emit(f"Invalid structure outline: {why} "
                                      "(results keep the last valid structure)")
        self._canvas.schedule(outline=True)

    def nudge_selected(self, dx, dz):
        """Move the selected vertex by (dx, dz) [m]; consecutive nudges of
        one vertex merge into one undo step."""
        v = self._doc.selected_vertex
        if v is None:
            return False
        outline, _ = self._doc.working_outline()
        x, z = outline[v]
        editing.move_vertex(self._doc, v, x + dx, z + dz, merge_key=("nudge", v))
        return True

    def delete_selected(self):
        """Delete the selected vertex (one undo step)."""
        v = self._doc.selected_vertex
        if v is None:
            self._canvas.message.emit("Select a vertex to delete (click it)")
            return False
        editing.delete_vertex(self._doc, v)
        self._doc.select_vertex(None)
        return True

    def insert_on_edge(self, edge, x, z):
        """Insert a vertex on ``edge`` at the point nearest (x, z)."""
        outline, _ = self._doc.working_outline()
        a = outline[edge]
        d = outline[(edge + 1) % len(outline)] - a
        t = float(np.clip(((x - a[0]) * d[0] + (z - a[1]) * d[1]) / max(d @ d, 1e-300),
                          0.05, 0.95))
        px, pz = self._canvas.snap(*(a + t * d))
        editing.insert_vertex(self._doc, edge, px, pz)
        self._doc.select_vertex(edge + 1)

    def set_part(self, edge, name):
        """Give ``edge`` the part ``name``."""
        if not editing.set_edge_part(self._doc, edge, name):
            self._canvas.message.emit(f"Invalid: {self._doc.units.explain(self._doc.draft.error)}")

    # ------------------------------------------------------------ mouse
    def on_click(self, x, z, button, double, screen_pos):
        """A click at (x, z) [m] with ``button``."""
        if self._canvas.mode == "draw":
            if button == Qt.MouseButton.LeftButton:
                self.draw_click(x, z, double)
            return
        if button == Qt.MouseButton.RightButton:
            self._context_menu(x, z, screen_pos)
            return
        if button != Qt.MouseButton.LeftButton:
            return
        v = self.pick_vertex(x, z)
        if v is not None and not double:
            self._doc.select_vertex(v)
            return
        e = self.pick_edge(x, z)
        if e is not None and double:
            self.insert_on_edge(e, x, z)
            return
        self._doc.select_edge(e)

    def _context_menu(self, x, z, screen_pos):
        v = self.pick_vertex(x, z)
        e = None if v is not None else self.pick_edge(x, z)
        menu = QMenu(self._canvas)
        if v is not None:
            self._doc.select_vertex(v)
            menu.addAction(f"Delete vertex {v}", lambda: self.delete_selected())
        elif e is not None:
            self._doc.select_edge(e)
            menu.addAction(f"Insert vertex on edge {e}", lambda: self.insert_on_edge(e, x, z))
            sub = menu.addMenu(f"Part of edge {e}")
            _, parts = self._doc.working_outline()
            for name in dict.fromkeys(RESERVED_PART_CHOICES + tuple(parts)):
                act = sub.addAction(name, lambda n=name: self.set_part(e, n))
                act.setCheckable(True)
                act.setChecked(parts[e] == name)
            sub.addSeparator()
            sub.addAction("Other name...", lambda: self._ask_part(e))
        else:
            return
        menu.popup(screen_pos.toPoint() if hasattr(screen_pos, "toPoint") else screen_pos)

    def _ask_part(self, edge):
        name, ok = QInputDialog.getText(self._canvas, "Part name", f"Part of edge {edge}:")
        if ok and name.strip():
            self.set_part(edge, name)

    # -------------------------------------------------------- draw mode
    def draw_click(self, x, z, double=False):
        """A vertex of the outline being drawn; a double click or a click on
        the first vertex closes it."""
        p = self._canvas.snap(x, z)
        if len(self.drawn) >= 3:
            fx, fz = self.drawn[0]
            if (fx - p[0]) ** 2 + (fz - p[1]) ** 2 <= (8 * self._pixel()) ** 2:
                self.finish_drawing()
                return
        if double:
            self.finish_drawing()
            return
        self.add_point(*p)

    def add_point(self, x, z):
        """Add (x, z) [m] to the outline being drawn, as it is (a typed
        vertex: no snapping)."""
        p = (float(x), float(z))
        if not self.drawn or self.drawn[-1] != p:
            self.drawn.append(p)
        self._canvas.outline_layer.show_sketch(self.drawn)

    def finish_drawing(self):
        """Close the outline being drawn and make it the section (or a draft
        marked with its fault)."""
        pts = list(self.drawn)
        if pts and not self._canvas.confirm_new_section():
            self._canvas.message.emit("The drawing is kept: finish it again once the changes "
                                      "are saved or discarded")
            return False
        self.cancel_drawing()
        if not pts:
            return False
        if not editing.draw_outline(self._doc, pts):
            self._canvas.message.emit(
                f"Invalid outline: {self._doc.units.explain(self._doc.draft.error)}")
            self._canvas.schedule(outline=True)
            return False
        self._canvas.proposal.offer(self._doc.section.parts)
        return True

    def cancel_drawing(self):
        """Drop the outline being drawn and go back to editing."""
        self.clear_drawing()
        self._canvas.set_mode("edit")

    def clear_drawing(self):
        self.drawn = []
        self._canvas.outline_layer.show_sketch([])

    # --------------------------------------------------------- keyboard
    def on_key(self, key):
        """Handle ``key``; False if it is not the editor's."""
        if self._canvas.mode == "draw":
            if key in (Qt.Key.Key_Return, Qt.Key.Key_Enter):
                self.finish_drawing()
                return True
            if key == Qt.Key.Key_Escape:
                self.cancel_drawing()
                return True
            if key == Qt.Key.Key_Backspace and self.drawn:
                self.drawn.pop()
                self._canvas.outline_layer.show_sketch(self.drawn)
                return True
        c = self._canvas
        step = c.snap_spacing if c.snap_enabled else 0.01 * max(
            np.ptp(self._doc.section.outline, axis=0).max(), 1e-9)
        moves = {Qt.Key.Key_Left: (-step, 0), Qt.Key.Key_Right: (step, 0),
                 Qt.Key.Key_Up: (0, step), Qt.Key.Key_Down: (0, -step)}
        if key in moves and self._doc.selected_vertex is not None:
            self.nudge_selected(*moves[key])
            return True
        if key == Qt.Key.Key_Escape:
            self._doc.select_edge(None)
            return True
        return False
