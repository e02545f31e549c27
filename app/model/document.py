"""The document: one open case, its file, display settings and results.

Views read the document and listen to its signals; they never change it
directly. Every user edit goes through an undo command (:mod:`wetline.app.model.commands`)
pushed on :attr:`Document.undo_stack`; the commands call the ``set_*``
methods here, which emit a signal only when a value really changes.

Results are recomputed by one zero-interval single-shot timer, so a burst
of edits (a slider drag) computes once per event-loop turn: :attr:`solved`
carries the :class:`wetline.core.hydrostatics.Solution`, :attr:`levelTableReady`
the :class:`wetline.core.level_table.LevelTable` (only when the geometry or the
liquid changed).

The document never holds an invalid section (core refuses to build one). An
outline being edited into an invalid shape is kept as a :class:`Draft`
beside the last valid case, until an edit makes it valid again or it is
discarded; the results keep the last valid state meanwhile.

While a vertex is dragged the outline is a :class:`Preview`, not yet an
edit: :meth:`Document.preview_outline` records it, and the same coalescing
timer checks it and, if valid, solves it, so :attr:`solved` carries the
preview's results and every view (totals, tables, chart, canvas) follows the
drag. An invalid preview keeps the last valid results and carries the fault.
The drag's one undo command is pushed on release (:mod:`wetline.app.model.editing`), after
:meth:`Document.end_preview`.
"""

from __future__ import annotations

import os
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

import numpy as np
from numpy.typing import ArrayLike
from PySide6.QtCore import QObject, QTimer, Signal
from PySide6.QtGui import QUndoStack

from wetline.core.case import Case
from wetline.core.force_scope import ForceScope, force_scale
from wetline.core.hydrostatics import Solution
from wetline.core.level_table import LevelTable, level_table
from wetline.core.numbers import set_figures
from wetline.core.section import Section, SectionError

from .display import DisplayChoice

__all__ = ["Document", "Draft", "Preview", "fill_range", "preview_steps", "UNDO_LIMIT"]

UNDO_LIMIT = 1000
"""Undo steps kept by default; the oldest go first."""

CHART_STEPS = 121
"""Levels in the loads-against-level table."""

PREVIEW_TABLE_ELEMENTS = 50_000
"""Levels x edges of the chart's table during a drag: the table costs about
0.05 us per element, so a drag step stays within a frame; the full table
follows on release."""


@dataclass(frozen=True, eq=False)
class Draft:
    """An outline being edited that core refuses to build, and why.

    Attributes
    ----------
    outline : numpy.ndarray
        (N, 2) vertices [m].
    parts : tuple of str
        One name per edge.
    error : SectionError
        The reason, with the edges, vertices and location at fault.
    """

    outline: np.ndarray
    parts: tuple[str, ...]
    error: SectionError


@dataclass(frozen=True, eq=False)
class Preview:
    """An outline being dragged, shown live before it becomes an edit.

    Attributes
    ----------
    outline : numpy.ndarray
        (N, 2) vertices [m].
    parts : tuple of str
        One name per edge.
    case : wetline.core.case.Case or None
        The case with the previewed section, once checked and valid.
    error : SectionError or None
        Why core refuses the outline, once checked and invalid.
    """

    outline: np.ndarray
    parts: tuple[str, ...]
    case: Case | None = None
    error: SectionError | None = None

    @property
    def checked(self) -> bool:
        """True once the recompute step has built (or refused) the section."""
        return self.case is not None or self.error is not None


def preview_steps(n_edges: int) -> int:
    """Levels of the chart's table during a drag of an outline with
    ``n_edges`` edges: all :data:`CHART_STEPS` for small sections, fewer
    (at least 21) for large ones."""
    return int(min(CHART_STEPS, max(21, PREVIEW_TABLE_ELEMENTS // max(n_edges, 1))))


def fill_range(section: Section) -> tuple[float, float]:
    """Levels the fill slider spans [m]: the lowest point to the spill level
    (open sections), or to the roof plus a head as high as the section
    (closed sections accept a head above the roof)."""
    lo = section.z_min
    spill = section.spill_level
    if spill is not None:
        return lo, spill
    return lo, section.z_max + (section.z_max - section.z_min)


class Document(QObject):
    """One open case with its file path, display units and results."""

    sectionChanged = Signal()
    """Outline, parts, kind, width or name changed."""
    liquidChanged = Signal()
    """Liquid or gravity changed."""
    fillChanged = Signal()
    """The requested fill (level or volume) changed."""
    unitsChanged = Signal()
    diagramScaleChanged = Signal()
    pathChanged = Signal()
    modifiedChanged = Signal(bool)
    draftChanged = Signal()
    previewChanged = Signal()
    """A dragged outline was checked (valid or not), or the drag ended."""
    selectionChanged = Signal()
    """The selected edge or vertex changed (shared by canvas and tables)."""
    solved = Signal(object)
    levelTableReady = Signal(object)
    upliftInputsChanged = Signal()
    """Part resistances or the required uplift factor changed (no solve needed)."""
    reportChanged = Signal()
    """The calculation sheet header fields changed."""

    def __init__(self, case: Case, path: str | os.PathLike[str] | None = None,
                 parent: QObject | None = None, saved: bool = True) -> None:
        super().__init__(parent)
        if not isinstance(case, Case):
            raise TypeError("a Document holds a core.case.Case")
        self._case = case
        set_figures(case.report.significant_figures)  # the document's precision policy
        self._saved_case: Case | None = case if saved else None
        self._path: str | None = None if path is None else str(path)
        self._units = DisplayChoice()
        self._diagram_scale: float | None = None
        self._draft: Draft | None = None
        self._preview: Preview | None = None
        self._preview_marked = False
        self._results_of_preview = False
        self._selected_edge: int | None = None
        self._selected_vertex: int | None = None
        self._modified = not saved
        self.solution: Solution | None = None
        """The :class:`wetline.core.hydrostatics.Solution` shown: of the valid
        preview during a drag, else of the case."""
        self.level_table: LevelTable | None = None
        self._scope_key: tuple | None = None
        self._scope: ForceScope | None = None
        self._scale_of: Solution | None = None
        self._force_scale = 0.0
        self._need_solve = True
        self._need_table = True
        self.undo_stack = QUndoStack(self)
        self._undo_limit = UNDO_LIMIT
        self.undo_stack.setUndoLimit(UNDO_LIMIT)
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(0)
        self._timer.timeout.connect(self.recompute)
        self._timer.start()

    # ------------------------------------------------------------ reading
    @property
    def case(self) -> Case:
        return self._case

    @property
    def section(self) -> Section:
        return self._case.section

    @property
    def path(self) -> str | None:
        return self._path

    @property
    def display_name(self) -> str:
        if self._path:
            return Path(self._path).name
        return self._case.section.name or "Untitled"

    @property
    def units(self) -> DisplayChoice:
        """The :class:`wetline.app.model.display.DisplayChoice` values are shown in."""
        return self._units

    @property
    def diagram_scale(self) -> float | None:
        """Drawing length per pressure [m/Pa] of the pressure diagrams, or
        None to fit them to the section automatically."""
        return self._diagram_scale

    @property
    def draft(self) -> Draft | None:
        return self._draft

    @property
    def preview(self) -> Preview | None:
        """The :class:`Preview` of an outline being dragged, or None."""
        return self._preview

    @property
    def shown_case(self) -> Case:
        """The case the results are of: the valid preview's during a drag,
        else the document's."""
        p = self._preview
        return p.case if p is not None and p.case is not None else self._case

    def fault(self) -> tuple[np.ndarray, SectionError] | None:
        """(outline [m], SectionError) of the invalid outline to mark on the
        canvas (an invalid preview first, then the draft), or None."""
        p = self._preview
        if p is not None and p.error is not None:
            return p.outline, p.error
        if self._draft is not None:
            return self._draft.outline, self._draft.error
        return None

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
    def is_modified(self) -> bool:
        return self._modified

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

    def working_outline(self) -> tuple[np.ndarray, tuple[str, ...]]:
        """(outline [m], parts) being edited: the dragged preview's if any,
        else the draft's, else the section's."""
        if self._preview is not None:
            return self._preview.outline, self._preview.parts
        if self._draft is not None:
            return self._draft.outline, self._draft.parts
        return self._case.section.outline, self._case.section.parts

    # ----------------------------------------------------------- changing
    def set_case(self, case: Case) -> None:
        """Replace the case (called by undo commands). Clears any draft."""
        if not isinstance(case, Case):
            raise TypeError("a Document holds a core.case.Case")
        old = self._case
        self._case = case
        self.end_preview()
        self.set_draft(None)
        if old.section is not case.section:
            # The old section lives on only in the undo history: keep it light.
            old.section.forget_derived()
        section_changed = old.section is not case.section and old.section != case.section
        liquid_changed = old.liquid != case.liquid or old.gravity != case.gravity
        fill_changed = (old.fill_level != case.fill_level
                        or old.fill_volume != case.fill_volume)
        if section_changed:
            n = case.section.n_edges
            if self._selected_edge is not None and self._selected_edge >= n:
                self._selected_edge = None
            if self._selected_vertex is not None and self._selected_vertex >= n:
                self._selected_vertex = None
            self.sectionChanged.emit()
        if liquid_changed:
            self.liquidChanged.emit()
        if fill_changed:
            self.fillChanged.emit()
        if (old.resistances != case.resistances
                or old.required_uplift_factor != case.required_uplift_factor):
            self.upliftInputsChanged.emit()
        if old.report != case.report:
            self.reportChanged.emit()
            if old.report.significant_figures != case.report.significant_figures:
                # The precision policy: every view writes its numbers again.
                set_figures(case.report.significant_figures)
                self.unitsChanged.emit()
        if section_changed or liquid_changed or fill_changed:
            self._need_solve = True
            self._need_table = self._need_table or section_changed or liquid_changed
            self._timer.start()
        self._update_modified()

    def load(self, case: Case, path: str | os.PathLike[str] | None = None,
             saved: bool | None = None) -> None:
        """Start over on another case (a file opened, New): clears the undo
        history and the draft. The case counts as saved if ``saved`` (default:
        if a ``path`` is given)."""
        if not isinstance(case, Case):
            raise TypeError("a Document holds a core.case.Case")
        self.undo_stack.clear()
        self.undo_stack.setUndoLimit(self._undo_limit)
        self._path = None if path is None else str(path)
        self._selected_edge = self._selected_vertex = None
        if saved is None:
            saved = path is not None
        self._saved_case = case if saved else None
        self._draft = None
        self._preview = None
        self._preview_marked = self._results_of_preview = False
        self._case = case
        set_figures(case.report.significant_figures)  # the document's precision policy
        self.draftChanged.emit()
        self.previewChanged.emit()
        self.sectionChanged.emit()
        self.liquidChanged.emit()
        self.fillChanged.emit()
        self.upliftInputsChanged.emit()
        self.reportChanged.emit()
        self.selectionChanged.emit()
        self.pathChanged.emit()
        self._need_solve = self._need_table = True
        self._timer.start()
        self._update_modified()

    @property
    def file_state(self) -> tuple[str | None, Case | None]:
        """(path, saved case) of the file the document belongs to: what
        :meth:`set_file_state` takes back (undo of a new section)."""
        return self._path, self._saved_case

    def set_file_state(self, path: str | os.PathLike[str] | None,
                       saved_case: Case | None) -> None:
        """Belong to the file at ``path`` holding ``saved_case``, or to no file
        (None, None: an untitled section that Save asks a name for)."""
        path = None if path is None else str(path)
        self._saved_case = saved_case
        if path != self._path:
            self._path = path
            self.pathChanged.emit()
        self._update_modified()

    def mark_saved(self, path: str | os.PathLike[str]) -> None:
        """The case is now in the file at ``path``."""
        self._saved_case = self._case
        if str(path) != self._path:
            self._path = str(path)
            self.pathChanged.emit()
        self._update_modified()

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

    def set_draft(self, draft: Draft | None) -> None:
        """Keep an invalid outline being edited (or None to drop it)."""
        if draft is None and self._draft is None:
            return
        self._draft = draft
        self.draftChanged.emit()

    def preview_outline(self, outline: ArrayLike, parts: Sequence[str] | None = None) -> None:
        """Show ``outline`` (a vertex being dragged) live without an edit.

        The next recompute checks it: if valid, the results (:attr:`solved`,
        :attr:`levelTableReady`) are of the previewed case; if not, they keep
        their last valid state and :meth:`fault` gives the reason. A burst of
        calls costs one check and one solve per event-loop turn.

        Parameters
        ----------
        outline : array_like
            (N, 2) vertices [m].
        parts : tuple of str, optional
            One name per edge (default: those being edited).
        """
        if parts is None:
            parts = self.working_outline()[1]
        self._preview = Preview(np.array(outline, dtype=np.float64), tuple(parts))
        self._timer.start()

    def end_preview(self) -> None:
        """Stop previewing a dragged outline; the results return to the
        document's case at the next recompute."""
        if self._preview is None:
            return
        self._preview = None
        if self._results_of_preview:
            self._results_of_preview = False
            self._need_solve = self._need_table = True
            self._timer.start()
        if self._preview_marked:
            self._preview_marked = False
            self.previewChanged.emit()

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

    def _update_modified(self) -> None:
        modified = self._saved_case is None or self._case != self._saved_case
        if modified != self._modified:
            self._modified = modified
            self.modifiedChanged.emit(modified)

    # ---------------------------------------------------------- results
    def flush(self) -> None:
        """Compute now anything pending (tests, benchmarks, export)."""
        if self._timer.isActive():
            self._timer.stop()
            self.recompute()
        elif self._need_solve or self._need_table:
            self.recompute()

    def _check_preview(self, p: Preview) -> Preview:
        """Build the pending preview's section (or record why not); the
        checked preview."""
        try:
            section = self._case.section.replace(outline=p.outline, parts=p.parts)
        except SectionError as exc:
            self._preview = Preview(p.outline, p.parts, None, exc)
        else:
            self._preview = Preview(p.outline, p.parts, self._case.with_section(section))
            self._need_solve = self._need_table = True
        self._preview_marked = True
        self.previewChanged.emit()
        return self._preview

    def recompute(self) -> None:
        """Solve the case (or the valid preview of a drag); emit
        :attr:`solved` (and :attr:`levelTableReady` when the geometry or
        liquid changed)."""
        preview = self._preview
        if preview is not None:
            if not preview.checked:
                preview = self._check_preview(preview)
            if preview.case is None:  # invalid: the last valid results stay
                return
            case = preview.case
        else:
            case = self._case
        self._results_of_preview = preview is not None
        if self._need_solve:
            self._need_solve = False
            self.solution = case.solve()
            self.solved.emit(self.solution)
        if self._need_table:
            self._need_table = False
            section = case.section
            lo, hi = fill_range(section)
            steps = CHART_STEPS if preview is None else preview_steps(section.n_edges)
            levels = np.linspace(lo, hi, steps)
            if section.is_open:
                levels[-1] = section.spill_level
            self.level_table = level_table(section, case.liquid.density, case.gravity,
                                           levels=levels)
            self.levelTableReady.emit(self.level_table)
