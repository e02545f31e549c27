"""The document's view state (a part of :class:`~wetline.app.model.document.Document`):
the display units, the diagram scale, the "this case" / "envelope" view,
the edge or vertex selected, how forces are shown, and the undo limit.

None of these is in the file and none is undone by the design's history;
each setter emits its signal only when the value really changes.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from PySide6.QtCore import SignalInstance
from PySide6.QtGui import QUndoStack

from wetline.core.case import Case
from wetline.core.force_scope import ForceScope, force_scale
from wetline.core.hydrostatics import Solution
from wetline.core.section import Section

from .display import DisplayChoice

__all__ = ["ViewState", "VIEW_MODES", "UNDO_LIMIT"]

UNDO_LIMIT = 1000
"""Undo steps kept by default; the oldest go first."""

VIEW_MODES = ("case", "envelope")
"""What the diagrams, the part table and the chart show: the active case, or
the envelope over all cases (design values)."""


class ViewState:
    """How the document is shown, mixed into the document (which holds the
    signals and the undo stack)."""

    unitsChanged: SignalInstance
    diagramScaleChanged: SignalInstance
    selectionChanged: SignalInstance
    viewModeChanged: SignalInstance
    undo_stack: QUndoStack
    solution: Solution | None
    _case: Case

    if TYPE_CHECKING:
        @property
        def shown_case(self) -> Case: ...

    def _init_view_state(self) -> None:
        self._units = DisplayChoice()
        self._diagram_scale: float | None = None
        self._selected_edge: int | None = None
        self._selected_vertex: int | None = None
        self._view_mode = "case"
        self._scope_key: tuple[object, ...] | None = None
        self._scope: ForceScope | None = None
        self._scale_of: Solution | None = None
        self._force_scale = 0.0
        self._undo_limit = UNDO_LIMIT
        self.undo_stack.setUndoLimit(UNDO_LIMIT)

    @property
    def view_mode(self) -> str:
        """``"case"`` (the active case) or ``"envelope"`` (over all cases)."""
        return self._view_mode

    @property
    def units(self) -> DisplayChoice:
        """The :class:`wetline.app.model.display.DisplayChoice` values are shown in."""
        return self._units

    @property
    def diagram_scale(self) -> float | None:
        """Drawing length per pressure [m/Pa] of the pressure diagrams, or
        None to fit them to the section automatically."""
        return self._diagram_scale

    def force_scope(self, section: Section | None = None) -> ForceScope:
        """How forces of ``section`` (default: the shown case's) are shown:
        the :class:`wetline.core.force_scope.ForceScope` of the display units
        and the file's length unit."""
        if section is None:
            section = self.shown_case.section
        key = (section.kind, section.width, self._units, self._case.length_unit)
        if self._scope_key != key:
            self._scope_key = key
            self._scope = self._units.force_scope(section, self._case.length_unit)
        assert self._scope is not None
        return self._scope

    @property
    def force_scale(self) -> float:
        """The largest force of :attr:`solution` [N] (0 before the first
        solve): forces below :data:`wetline.core.numbers.NOISE` of it are
        round-off and show as 0."""
        sol = self.solution
        if sol is None:
            return 0.0
        if self._scale_of is not sol:
            self._scale_of = sol
            self._force_scale = force_scale(sol)
        return self._force_scale

    @property
    def selected_edge(self) -> int | None:
        return self._selected_edge

    @property
    def selected_vertex(self) -> int | None:
        return self._selected_vertex

    @property
    def undo_limit(self) -> int:
        """Undo steps kept (the stack's own limit may be an older one until
        the next :meth:`load`)."""
        return self._undo_limit

    def set_undo_limit(self, steps: int) -> None:
        """Keep at most ``steps`` undo steps: at once if nothing can be undone
        yet, else from the next :meth:`load` (Qt sets a limit only on an
        empty stack; the history is never cut behind the user's back)."""
        steps = int(steps)
        if steps < 1:
            raise ValueError(f"an undo limit is at least 1 step, not {steps}")
        self._undo_limit = steps
        if self.undo_stack.count() == 0:
            self.undo_stack.setUndoLimit(steps)

    def set_view_mode(self, mode: str) -> None:
        """Show the active case (``"case"``) or the envelope (``"envelope"``)."""
        if mode not in VIEW_MODES:
            raise ValueError(f"view mode must be one of {VIEW_MODES}, not {mode!r}")
        if mode != self._view_mode:
            self._view_mode = mode
            self.viewModeChanged.emit()

    def set_units(self, choice: DisplayChoice) -> None:
        if not isinstance(choice, DisplayChoice):
            raise TypeError("units are a DisplayChoice")
        if choice != self._units:
            self._units = choice
            self.unitsChanged.emit()

    def set_diagram_scale(self, scale: float | None) -> None:
        if scale is not None:
            scale = float(scale)
            if not (np.isfinite(scale) and scale > 0):
                raise ValueError("the diagram scale must be positive")
        if scale != self._diagram_scale:
            self._diagram_scale = scale
            self.diagramScaleChanged.emit()

    def select_edge(self, index: int | None) -> None:
        index = None if index is None else int(index)
        if index != self._selected_edge or self._selected_vertex is not None:
            self._selected_edge = index
            self._selected_vertex = None
            self.selectionChanged.emit()

    def select_vertex(self, index: int | None) -> None:
        index = None if index is None else int(index)
        if index != self._selected_vertex or self._selected_edge is not None:
            self._selected_vertex = index
            self._selected_edge = None
            self.selectionChanged.emit()
