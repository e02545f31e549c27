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
from pathlib import Path

from PySide6.QtCore import QObject, Signal
from PySide6.QtGui import QUndoStack

from wetline.core.case import Case
from wetline.core.load_cases import Design, LoadCase
from wetline.core.numbers import set_figures
from wetline.core.section import Section
from wetline.core.structure import Ground, Structure

from .cases import forget_derived, restore_derived, same_design
from .display import DisplayChoice
from .outline_preview import (
    CAVITY,
    STRUCTURE,
    Draft,
    OutlinePreview,
    Preview,
    active_case,
    outline_fault,
)
from .recompute import (
    CHART_STEPS,
    PREVIEW_MIN_STEPS,
    PREVIEW_TABLE_ELEMENTS,
    Recompute,
    fill_range,
    preview_steps,
)
from .step_timer import span
from .view_state import UNDO_LIMIT, VIEW_MODES, ViewState

__all__ = ["Document", "Draft", "Preview", "fill_range", "preview_steps", "outline_fault",
           "as_design", "UNDO_LIMIT", "CAVITY", "STRUCTURE", "VIEW_MODES", "CHART_STEPS",
           "PREVIEW_MIN_STEPS", "PREVIEW_TABLE_ELEMENTS"]


def as_design(value: Design | Case) -> Design:
    """``value`` as a :class:`Design` (a bare case is a design of one case)."""
    if isinstance(value, Design):
        return restore_derived(value)  # (one left in another document's history)
    if isinstance(value, Case):
        return Design(value)
    raise TypeError("a Document holds a core.load_cases.Design (or a core.case.Case)")


class Document(ViewState, OutlinePreview, Recompute, QObject):
    """One open design with its active case, file path, display units and results.

    Three parts are mixed in, each in its own module: the view state
    (:class:`~wetline.app.model.view_state.ViewState`: units, diagram scale,
    selection, view mode, undo limit), the outlines being edited
    (:class:`~wetline.app.model.outline_preview.OutlinePreview`: draft and
    dragged preview) and the results
    (:class:`~wetline.app.model.recompute.Recompute`: the timer, the solve,
    the level tables, the envelope). The signals are all declared here.
    """

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
    case's values (fill, liquid, groundwater, load factor); for a design
    without cases, the fill of its own case (the list's one row)."""
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
        self._case = active_case(design, 0)
        set_figures(design.case.report.significant_figures)  # the precision policy
        self._saved_design: Design | None = design if saved else None
        self._path: str | None = None if path is None else str(path)
        self._modified = not saved
        self.undo_stack = QUndoStack(self)
        self._init_view_state()
        self._init_preview()
        self._init_recompute(self)
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
    def path(self) -> str | None:
        return self._path

    @property
    def display_name(self) -> str:
        if self._path:
            return Path(self._path).name
        return self.section.name or "Untitled"

    @property
    def is_modified(self) -> bool:
        return self._modified

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

    def _apply(self, design: Design, active: int) -> None:
        old, old_case, old_active = self._design, self._case, self._active
        active = min(max(int(active), 0), len(design.names) - 1)
        case = active_case(design, active)
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
        # A design without cases lists its own case as the one case: its
        # fill is that case's.
        cases_changed = cases_changed or (not design.cases and fill_changed)
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
            # A closed section filled above the chart's range: the range grows
            # (a fill by volume stays below the roof).
            if fill_changed and case.fill_level is not None \
                    and case.fill_level > self.level_range[1]:
                self._need_table = True
        if solve or cases_changed or factor_changed:
            self._need_envelope = True
        if self._need_solve or self._need_table or self._need_envelope:
            self._timer.start()
        self._update_modified()

    def load(self, design: Design | Case, path: str | os.PathLike[str] | None = None,
             saved: bool | None = None) -> None:
        """Start over on another design (a file opened, or a recovery copy):
        clears the undo history and the draft; the first case is active. It
        counts as saved if ``saved`` (default: if a ``path`` is given). The
        display shows the file's own length unit where it offers it (mm, m
        in SI; in, ft in US units; a view, not an edit)."""
        design = as_design(design)
        shown = DisplayChoice.of_length_unit(design.case.length_unit)
        if shown is not None:
            self.set_units(shown)
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
        self._case = active_case(design, 0)
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

    def _update_modified(self) -> None:
        modified = not same_design(self._design, self._saved_design)
        if modified != self._modified:
            self._modified = modified
            self.modifiedChanged.emit(modified)
