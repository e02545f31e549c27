"""The document: one open design (its load cases, the structure and the
ground), the active case, its file, display settings and results.

The document holds a :class:`wetline.core.load_cases.Design`: the file-level
case (section, liquid, fill, gravity, uplift inputs, report), the optional
structure and ground, and the load cases. One case is *active*
(:attr:`Document.active_index`); :attr:`Document.case` is that case resolved
(a :class:`wetline.core.case.Case` with its own liquid, gravity and fill), so
every view that shows one case shows the active one. A design without cases
has one, the file-level case itself.

Views read the document and listen to its signals; they never change it
directly. Every user edit goes through an undo command (:mod:`wetline.app.model.commands`)
pushed on :attr:`Document.undo_stack`; the commands call the ``set_*``
methods here, which emit a signal only when a value really changes.
Choosing the active case (:meth:`Document.select_case`) and the "this case" /
"envelope" view (:meth:`Document.set_view_mode`) are not edits (nothing in the
file changes) and are not undone.

Results are recomputed by one zero-interval single-shot timer, so a burst
of edits (a slider drag) computes once per event-loop turn: :attr:`solved`
carries the active case's :class:`wetline.core.hydrostatics.Solution`
(:attr:`Document.solved_case` its :class:`wetline.core.load_cases.SolvedCase`,
with the loads on the structure), :attr:`levelTableReady` the
:class:`wetline.core.level_table.LevelTable` (only when the geometry or the
active liquid changed), :attr:`envelopeReady` the envelope over every case
(:class:`wetline.core.load_cases.Envelope`, design values). The envelope
waits while a drag or a slider move is under way (:meth:`begin_live_edit`,
a vertex drag's preview) and follows on release.

The document never holds an invalid section (core refuses to build one), nor
a structure that does not hold the cavity. An outline being edited into an
invalid shape is kept as a :class:`Draft` beside the last valid design,
until an edit makes it valid again or it is discarded; the results keep the
last valid state meanwhile.

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
from wetline.core.level_table import LevelTable
from wetline.core.load_cases import Design, Envelope, LoadCase, LoadCaseError, SolvedCase
from wetline.core.numbers import set_figures
from wetline.core.section import Section, SectionError
from wetline.core.structure import Ground, Structure, StructureError

from .cases import CaseSolver, forget_derived, restore_derived, same_design
from .display import DisplayChoice
from .level_tables import case_level_tables
from .step_timer import span

__all__ = ["Document", "Draft", "Preview", "fill_range", "preview_steps", "outline_fault",
           "as_design", "UNDO_LIMIT", "CAVITY", "STRUCTURE", "VIEW_MODES"]

UNDO_LIMIT = 1000
"""Undo steps kept by default; the oldest go first."""

CHART_STEPS = 121
"""Levels in the loads-against-level table."""

PREVIEW_TABLE_ELEMENTS = 50_000
"""Levels x edges of the chart's table during a drag: the table costs about
0.05 us per element, so a drag step stays within a frame; the full table
follows on release."""

CAVITY = "cavity"
"""Draft target: the cavity's outline."""
STRUCTURE = "structure"
"""Draft target: the structure's outer outline."""

VIEW_MODES = ("case", "envelope")
"""What the diagrams, the part table and the chart show: the active case, or
the envelope over all cases (design values)."""


def outline_fault(exc: ValueError) -> SectionError:
    """A fault to mark on the canvas (a :class:`SectionError`) for a
    structure or load case refusal of an outline edit: the message, the
    edges and vertices at fault of the outline being edited, the place."""
    if isinstance(exc, SectionError):
        return exc
    if isinstance(exc, StructureError):
        return SectionError(str(exc), edges=exc.edges or exc.cavity_edges,
                            vertices=exc.vertices or exc.cavity_vertices,
                            location=exc.location)
    return SectionError(str(exc))


def as_design(value: Design | Case) -> Design:
    """``value`` as a :class:`Design` (a bare case is a design of one case)."""
    if isinstance(value, Design):
        return restore_derived(value)  # (one left in another document's history)
    if isinstance(value, Case):
        return Design(value)
    raise TypeError("a Document holds a core.load_cases.Design (or a core.case.Case)")


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
        The reason, with the edges, vertices and location at fault (a
        structure's refusal as :func:`outline_fault` gives it).
    target : str
        :data:`CAVITY` or :data:`STRUCTURE`: which outline it is.
    """

    outline: np.ndarray
    parts: tuple[str, ...]
    error: SectionError
    target: str = CAVITY


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
        The active case with the previewed section, once checked and valid.
    error : SectionError or None
        Why core refuses the outline, once checked and invalid.
    design : wetline.core.load_cases.Design or None
        The design with the previewed section, once checked and valid.
    """

    outline: np.ndarray
    parts: tuple[str, ...]
    case: Case | None = None
    error: SectionError | None = None
    design: Design | None = None

    @property
    def checked(self) -> bool:
        """True once the recompute step has built (or refused) the section."""
        return self.case is not None or self.error is not None


PREVIEW_MIN_STEPS = 11
"""Levels of the chart's table during a drag at least (the full table
follows on release)."""


def preview_steps(n_edges: int) -> int:
    """Levels of the chart's table during a drag of an outline with
    ``n_edges`` edges: all :data:`CHART_STEPS` for small sections, fewer
    (at least :data:`PREVIEW_MIN_STEPS`: 11 at 10,000 edges, where 21 cost
    about 5 ms a step) for large ones.

    >>> preview_steps(100), preview_steps(2000), preview_steps(10_000)
    (121, 25, 11)
    """
    return int(min(CHART_STEPS, max(PREVIEW_MIN_STEPS,
                                    PREVIEW_TABLE_ELEMENTS // max(n_edges, 1))))


def fill_range(section: Section) -> tuple[float, float]:
    """Levels the fill slider spans [m]: the lowest point to the spill level
    (open sections), or to the roof plus a head as high as the section
    (closed sections accept a head above the roof)."""
    lo = section.z_min
    spill = section.spill_level
    if spill is not None:
        return lo, spill
    return lo, section.z_max + (section.z_max - section.z_min)


def _active_case(design: Design, index: int) -> Case:
    """The case the views show: the file-level case of a design without
    cases, else case ``index`` resolved."""
    if not design.cases:
        return design.case
    return design.resolve(design.names[index]).case


class Document(QObject):
    """One open design with its active case, file path, display units and results."""

    sectionChanged = Signal()
    """Outline, parts, kind, width or name changed."""
    liquidChanged = Signal()
    """The active case's liquid or gravity changed."""
    fillChanged = Signal()
    """The active case's requested fill (level or volume) changed."""
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
    casesChanged = Signal()
    """The load cases changed: added, removed, renamed, reordered, or any
    case's values (fill, liquid, groundwater, load factor)."""
    activeCaseChanged = Signal()
    """Another case became the active one (by choice, or as an edit moved it)."""
    structureChanged = Signal()
    """The structure (outline, parts, unit weight, extra weight, anchorage)
    or the ground changed, or was added or removed."""
    envelopeReady = Signal(object)
    """The envelope over every case was recomputed (:attr:`Document.envelope`)."""
    viewModeChanged = Signal()
    """The views switched between "this case" and "envelope"."""

    def __init__(self, design: Design | Case, path: str | os.PathLike[str] | None = None,
                 parent: QObject | None = None, saved: bool = True) -> None:
        super().__init__(parent)
        design = as_design(design)
        self._design = design
        self._active = 0
        self._case = _active_case(design, 0)
        set_figures(design.case.report.significant_figures)  # the precision policy
        self._saved_design: Design | None = design if saved else None
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
        self._view_mode = "case"
        self.solution: Solution | None = None
        """The :class:`wetline.core.hydrostatics.Solution` shown: of the valid
        preview during a drag, else of the active case."""
        self.solved_case: SolvedCase | None = None
        """The :class:`wetline.core.load_cases.SolvedCase` of :attr:`solution`:
        the liquid and, with a structure, the loads on it."""
        self.envelope: Envelope | None = None
        """The :class:`wetline.core.load_cases.Envelope` over every case
        (design values), None before the first; see :attr:`envelope_current`."""
        self.envelope_cases: tuple[SolvedCase, ...] = ()
        """Every case solved, as the last :attr:`envelope` was made of them."""
        self.level_table: LevelTable | None = None
        self.level_tables: tuple[LevelTable, ...] = ()
        """The chart's tables: :attr:`level_table` (pockets vented) and, where
        the section can trap air, the same with the air trapped."""
        self._solver = CaseSolver()
        self._live = 0
        self._scope_key: tuple[object, ...] | None = None
        self._scope: ForceScope | None = None
        self._scale_of: Solution | None = None
        self._force_scale = 0.0
        self._need_solve = True
        self._need_table = True
        self._need_envelope = True
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
    def design(self) -> Design:
        """The :class:`wetline.core.load_cases.Design` (every case, structure, ground)."""
        return self._design

    @property
    def case(self) -> Case:
        """The active case, resolved (the file-level case without cases)."""
        return self._case

    @property
    def file_case(self) -> Case:
        """The file-level case: what every case starts from."""
        return self._design.case

    @property
    def section(self) -> Section:
        return self._design.case.section

    @property
    def structure(self) -> Structure | None:
        return self._design.structure

    @property
    def ground(self) -> Ground | None:
        return self._design.ground

    @property
    def active_index(self) -> int:
        """Position of the active case in :attr:`case_names`."""
        return self._active

    @property
    def case_names(self) -> tuple[str, ...]:
        """Names of the cases, in order (one, the default, without cases)."""
        return self._design.names

    @property
    def active_name(self) -> str:
        return self._design.names[self._active]

    @property
    def load_cases(self) -> tuple[LoadCase, ...]:
        """The cases as :class:`wetline.core.load_cases.LoadCase` values (the
        one default case of a design without cases)."""
        return self._design.load_cases

    @property
    def active_load_case(self) -> LoadCase:
        return self._design.load_cases[self._active]

    @property
    def view_mode(self) -> str:
        """``"case"`` (the active case) or ``"envelope"`` (over all cases)."""
        return self._view_mode

    @property
    def envelope_current(self) -> bool:
        """True if :attr:`envelope` is of the design as it is now (False while
        it waits for a drag or slider move to end, or for the next turn)."""
        return self.envelope is not None and not self._need_envelope

    @property
    def live_edit(self) -> bool:
        """True while a drag or slider move is under way."""
        return self._live > 0 or self._preview is not None

    @property
    def path(self) -> str | None:
        return self._path

    @property
    def display_name(self) -> str:
        if self._path:
            return Path(self._path).name
        return self.section.name or "Untitled"

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

    @property
    def shown_design(self) -> Design:
        """The design the results are of: the valid preview's during a drag,
        else the document's."""
        p = self._preview
        return p.design if p is not None and p.design is not None else self._design

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
        """(outline [m], parts) of the cavity being edited: the dragged
        preview's if any, else the cavity draft's, else the section's."""
        if self._preview is not None:
            return self._preview.outline, self._preview.parts
        if self._draft is not None and self._draft.target == CAVITY:
            return self._draft.outline, self._draft.parts
        return self.section.outline, self.section.parts

    def working_structure_outline(self) -> tuple[np.ndarray, tuple[str, ...]] | None:
        """(outline [m], parts) of the structure being edited: the structure
        draft's if any, else the structure's; None without a structure."""
        if self._draft is not None and self._draft.target == STRUCTURE:
            return self._draft.outline, self._draft.parts
        s = self._design.structure
        return None if s is None else (s.outline, tuple(s.parts))

    # ----------------------------------------------------------- changing
    def set_design(self, design: Design, active: int | None = None) -> None:
        """Replace the design (called by undo commands), with case ``active``
        (default: the same position) active. Clears any draft."""
        if not isinstance(design, Design):
            raise TypeError("a Document holds a core.load_cases.Design")
        with span("edit"):
            self.end_preview()
            self.set_draft(None)
            self._apply(design, self._active if active is None else active)

    def set_case(self, case: Case) -> None:
        """Replace the file-level case (the case itself, for a design without
        cases), keeping the structure, ground and cases."""
        if not isinstance(case, Case):
            raise TypeError("a case is a core.case.Case")
        self.set_design(self._design.with_case(case))

    def select_case(self, index: int) -> None:
        """Make case ``index`` the active one (not an edit: nothing to undo)."""
        index = int(index)
        if not 0 <= index < len(self._design.names):
            raise IndexError(f"no case {index}: the design has {len(self._design.names)}")
        if index != self._active:
            self._apply(self._design, index)

    def set_view_mode(self, mode: str) -> None:
        """Show the active case (``"case"``) or the envelope (``"envelope"``)."""
        if mode not in VIEW_MODES:
            raise ValueError(f"view mode must be one of {VIEW_MODES}, not {mode!r}")
        if mode != self._view_mode:
            self._view_mode = mode
            self.viewModeChanged.emit()

    def begin_live_edit(self) -> None:
        """A drag or slider move starts: the envelope waits until it ends."""
        self._live += 1

    def end_live_edit(self) -> None:
        """The drag or slider move ended: the envelope follows at once."""
        if self._live > 0:
            self._live -= 1
        if self._live == 0 and self._need_envelope:
            self._timer.start()

    def _apply(self, design: Design, active: int) -> None:
        old, old_case, old_active = self._design, self._case, self._active
        active = min(max(int(active), 0), len(design.names) - 1)
        case = _active_case(design, active)
        restore_derived(design)
        self._design, self._active, self._case = design, active, case
        if old.section is not design.section:
            # The old section lives on only in the undo history: keep it light.
            old.section.forget_derived()
        if old is not design and old.exterior is not None \
                and old.exterior is not design.exterior:
            forget_derived(old)
        section_changed = old.section is not design.section and old.section != design.section
        liquid_changed = (old_case.liquid != case.liquid or old_case.gravity != case.gravity)
        fill_changed = (old_case.fill_level != case.fill_level
                        or old_case.fill_volume != case.fill_volume)
        structure_changed = (old.structure != design.structure or old.ground != design.ground)
        cases_changed = old.cases != design.cases or old.names != design.names
        active_changed = old_active != active or old.names[old_active] != design.names[active]
        old_lc = old.load_cases[old_active]
        new_lc = design.load_cases[active]
        outside_changed = (old_lc.groundwater != new_lc.groundwater
                           or old_lc.load_factor != new_lc.load_factor)
        # Layers, gas and trapped air are the case's liquid too.
        law_changed = (old_lc.layers != new_lc.layers
                       or old_lc.gas_pressure != new_lc.gas_pressure
                       or old_lc.pockets != new_lc.pockets
                       or old_lc.atmospheric_pressure != new_lc.atmospheric_pressure)
        liquid_changed = liquid_changed or law_changed
        factor_changed = old_case.required_uplift_factor != case.required_uplift_factor
        if section_changed:
            n = design.section.n_edges
            if self._selected_edge is not None and self._selected_edge >= n:
                self._selected_edge = None
            if self._selected_vertex is not None and self._selected_vertex >= n:
                self._selected_vertex = None
            self.sectionChanged.emit()
        if liquid_changed:
            self.liquidChanged.emit()
        if fill_changed:
            self.fillChanged.emit()
        if structure_changed:
            self.structureChanged.emit()
        if cases_changed:
            self.casesChanged.emit()
        if active_changed:
            self.activeCaseChanged.emit()
        if old_case.resistances != case.resistances or factor_changed:
            self.upliftInputsChanged.emit()
        if old_case.report != case.report:
            self.reportChanged.emit()
            if old_case.report.significant_figures != case.report.significant_figures:
                # The precision policy: every view writes its numbers again.
                set_figures(case.report.significant_figures)
                self.unitsChanged.emit()
        solve = (section_changed or liquid_changed or fill_changed or structure_changed
                 or active_changed or outside_changed
                 or (factor_changed and design.structure is not None))
        if solve:
            self._need_solve = True
            self._need_table = self._need_table or section_changed or liquid_changed
        if solve or cases_changed or factor_changed:
            self._need_envelope = True
        if self._need_solve or self._need_table or self._need_envelope:
            self._timer.start()
        self._update_modified()

    def load(self, design: Design | Case, path: str | os.PathLike[str] | None = None,
             saved: bool | None = None) -> None:
        """Start over on another design (a file opened, New): clears the undo
        history and the draft; the first case is active. It counts as saved
        if ``saved`` (default: if a ``path`` is given)."""
        design = as_design(design)
        self.undo_stack.clear()
        self.undo_stack.setUndoLimit(self._undo_limit)
        self._path = None if path is None else str(path)
        self._selected_edge = self._selected_vertex = None
        if saved is None:
            saved = path is not None
        self._saved_design = design if saved else None
        self._draft = None
        self._preview = None
        self._preview_marked = self._results_of_preview = False
        self._design = design
        self._active = 0
        self._case = _active_case(design, 0)
        set_figures(design.case.report.significant_figures)  # the precision policy
        self.envelope = None
        self.envelope_cases = ()
        self.draftChanged.emit()
        self.previewChanged.emit()
        self.sectionChanged.emit()
        self.liquidChanged.emit()
        self.fillChanged.emit()
        self.structureChanged.emit()
        self.casesChanged.emit()
        self.activeCaseChanged.emit()
        self.upliftInputsChanged.emit()
        self.reportChanged.emit()
        self.selectionChanged.emit()
        self.pathChanged.emit()
        self._need_solve = self._need_table = self._need_envelope = True
        self._timer.start()
        self._update_modified()

    @property
    def file_state(self) -> tuple[str | None, Design | None]:
        """(path, saved design) of the file the document belongs to: what
        :meth:`set_file_state` takes back (undo of a new section)."""
        return self._path, self._saved_design

    def set_file_state(self, path: str | os.PathLike[str] | None,
                       saved_design: Design | None) -> None:
        """Belong to the file at ``path`` holding ``saved_design``, or to no
        file (None, None: an untitled section that Save asks a name for)."""
        path = None if path is None else str(path)
        self._saved_design = saved_design
        if path != self._path:
            self._path = path
            self.pathChanged.emit()
        self._update_modified()

    def mark_saved(self, path: str | os.PathLike[str]) -> None:
        """The design is now in the file at ``path``."""
        self._saved_design = self._design
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
        calls costs one check and one solve per event-loop turn. The
        envelope waits for the drag to end.

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
        document's design at the next recompute."""
        if self._preview is None:
            return
        self._preview = None
        if self._results_of_preview:
            self._results_of_preview = False
            self._need_solve = self._need_table = True
            self._timer.start()
        if self._need_envelope:
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
        modified = not same_design(self._design, self._saved_design)
        if modified != self._modified:
            self._modified = modified
            self.modifiedChanged.emit(modified)

    # ---------------------------------------------------------- results
    def flush(self) -> None:
        """Compute now anything pending (tests, benchmarks, export); the
        envelope too, unless a drag or slider move is under way."""
        if self._timer.isActive():
            self._timer.stop()
            self.recompute()
        elif self._need_solve or self._need_table or (self._need_envelope
                                                      and not self.live_edit):
            self.recompute()

    def _check_preview(self, p: Preview) -> Preview:
        """Build the pending preview's section and design (or record why
        not); the checked preview."""
        design = self._design
        try:
            section = self.section.replace(outline=p.outline, parts=p.parts)
            new = Design(design.case.with_section(section), structure=design.structure,
                         ground=design.ground, cases=design.cases)
        except (SectionError, StructureError, LoadCaseError) as exc:
            self._preview = Preview(p.outline, p.parts, None, outline_fault(exc))
        else:
            self._preview = Preview(p.outline, p.parts, _active_case(new, self._active),
                                    design=new)
            self._need_solve = self._need_table = True
        self._preview_marked = True
        self.previewChanged.emit()
        return self._preview

    def recompute(self) -> None:
        """Solve the active case (or the valid preview of a drag); emit
        :attr:`solved` (and :attr:`levelTableReady` when the geometry or
        liquid changed, :attr:`envelopeReady` when the design changed and
        no drag or slider move is under way)."""
        preview = self._preview
        if preview is not None:
            if not preview.checked:
                with span("solve and cases"):  # the dragged outline checked
                    preview = self._check_preview(preview)
            if preview.case is None or preview.design is None:
                return  # invalid: the last valid results stay
            case, design = preview.case, preview.design
        else:
            case, design = self._case, self._design
        self._results_of_preview = preview is not None
        if self._need_solve:
            self._need_solve = False
            with span("solve and cases"):
                self.solved_case = self._solver.solve(design, self._active)
                self.solution = self.solved_case.solution
            with span("other views"):
                self.solved.emit(self.solution)
        if self._need_table:
            self._need_table = False
            section = case.section
            with span("level table"):
                lo, hi = fill_range(section)
                steps = CHART_STEPS if preview is None else preview_steps(section.n_edges)
                levels = np.linspace(lo, hi, steps)
                if section.is_open:
                    levels[-1] = section.spill_level
                self.level_tables = case_level_tables(design, self._active, levels)
                self.level_table = self.level_tables[0]
            with span("other views"):
                self.levelTableReady.emit(self.level_table)
        if self._need_envelope and not self.live_edit:
            self._need_envelope = False
            with span("envelope"):
                self.envelope_cases, self.envelope = self._solver.envelope(self._design)
            with span("other views"):
                self.envelopeReady.emit(self.envelope)
