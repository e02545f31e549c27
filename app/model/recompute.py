"""The document's results (a part of :class:`~wetline.app.model.document.Document`):
the active case solved, the chart's level tables and the envelope over every
case, recomputed by one zero-interval single-shot timer.

A burst of edits (a slider drag) computes once per event-loop turn. The
level tables follow only when the geometry or the active liquid changed; the
envelope waits while a drag or a slider move is under way
(:meth:`Recompute.begin_live_edit`, a vertex drag's preview) and follows on
release. During a drag the results are of the valid preview.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

import numpy as np
from PySide6.QtCore import QObject, QTimer, SignalInstance

from wetline.core.case import Case
from wetline.core.hydrostatics import Solution
from wetline.core.level_table import LevelTable
from wetline.core.load_cases import Design, Envelope, SolvedCase
from wetline.core.section import Section

from .cases import CaseSolver
from .level_tables import case_level_tables
from .outline_preview import Preview
from .step_timer import span

__all__ = ["Recompute", "fill_range", "level_range", "top_interface", "preview_steps",
           "CHART_STEPS", "PREVIEW_MIN_STEPS", "PREVIEW_TABLE_ELEMENTS"]

CHART_STEPS = 121
"""Levels in the loads-against-level table."""

PREVIEW_TABLE_ELEMENTS = 50_000
"""Levels x edges of the chart's table during a drag: the table costs about
0.05 us per element, so a drag step stays within a frame; the full table
follows on release."""


PREVIEW_MIN_STEPS = 11
"""Levels of the chart's table during a drag at least, and at most where
the table is solved level by level (layers, a gas, trapped air); the full
table follows on release."""


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


def level_range(section: Section, level: float | None = None,
                interface: float | None = None) -> tuple[float, float]:
    """Levels the fill slider and the chart span [m]: :func:`fill_range`,
    its top raised to ``level`` (a fill level, or None for a fill by volume)
    for a closed section filled to a head above the roof higher than that
    (the file's or a typed level: it is allowed, and must be on the chart
    and the slider); with layers, from just above the top ``interface``
    (a millionth of the range above it, as the chart's table starts: the
    free surface must lie above every layer but the top one).

    >>> from wetline.core.section import Section
    >>> tank = Section.build([[0, 0], [3, 0], [3, 2], [0, 2]])
    >>> level_range(tank), level_range(tank, 4.5), level_range(tank, 1.0)
    ((0.0, 4.0), (0.0, 4.5), (0.0, 4.0))
    >>> level_range(tank, interface=1.0)
    (1.000003, 4.0)
    """
    lo, hi = fill_range(section)
    if level is not None and section.spill_level is None and level > hi:
        hi = float(level)
    if interface is not None and interface < hi:
        lo = max(lo, interface + 1e-6 * (hi - interface))
    return lo, hi


def top_interface(design: Design, active: int) -> float | None:
    """The top interface [m] of case ``active``'s layers (None for one
    liquid, or a case core cannot resolve)."""
    law = design.resolve(design.names[active]).law
    return law.interfaces[-1] if law is not None and law.interfaces else None


class Recompute:
    """The recompute pipeline, mixed into the document (which holds the
    signals, the design and the outline being previewed)."""

    solved: SignalInstance
    levelTableReady: SignalInstance
    envelopeReady: SignalInstance
    _design: Design
    _case: Case
    _active: int
    _preview: Preview | None
    _results_of_preview: bool

    if TYPE_CHECKING:
        def _check_preview(self, p: Preview) -> Preview: ...

    def _init_recompute(self, owner: QObject) -> None:
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
        self.level_tables_section: Section | None = None
        """The section (the document's, or a dragged outline's) the tables
        are of."""
        self._level_range: tuple[float, float] | None = None
        self._solver = CaseSolver()
        self._live = 0
        self._need_solve = True
        self._need_table = True
        self._need_envelope = True
        self._timer = QTimer(owner)
        self._timer.setSingleShot(True)
        self._timer.setInterval(0)
        self._timer.timeout.connect(self.recompute)

    @property
    def level_range(self) -> tuple[float, float]:
        """The levels [m] the slider and the chart span: the last chart
        table's (:func:`level_range`), the section's before the first."""
        if self._level_range is None:
            return level_range(self._case.section, self._case.fill_level,
                               top_interface(self._design, self._active))
        return self._level_range

    @property
    def envelope_current(self) -> bool:
        """True if :attr:`envelope` is of the design as it is now (False while
        it waits for a drag or slider move to end, or for the next turn)."""
        return self.envelope is not None and not self._need_envelope

    @property
    def live_edit(self) -> bool:
        """True while a drag or slider move is under way."""
        return self._live > 0 or self._preview is not None

    def begin_live_edit(self) -> None:
        """A drag or slider move starts: the envelope waits until it ends."""
        self._live += 1

    def end_live_edit(self) -> None:
        """The drag or slider move ended: the envelope follows at once."""
        if self._live > 0:
            self._live -= 1
        if self._live == 0 and self._need_envelope:
            self._timer.start()

    def flush(self) -> None:
        """Compute now anything pending (tests, benchmarks, export); the
        envelope too, unless a drag or slider move is under way."""
        if self._timer.isActive():
            self._timer.stop()
            self.recompute()
        elif self._need_solve or self._need_table or (self._need_envelope
                                                      and not self.live_edit):
            self.recompute()

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
        solved, self._need_solve = self._need_solve, False
        if solved:
            with span("solve and cases"):
                self.solved_case = self._solver.solve(design, self._active)
                self.solution = self.solved_case.solution
        tabled, self._need_table = self._need_table, False
        if tabled:
            section = case.section
            with span("level table"):
                lo, hi = self._level_range = level_range(
                    section, case.fill_level, top_interface(design, self._active))
                steps = CHART_STEPS if preview is None else preview_steps(section.n_edges)
                levels = np.linspace(lo, hi, steps)
                if section.is_open:
                    levels[-1] = section.spill_level
                self.level_tables = case_level_tables(
                    design, self._active, levels,
                    solved_levels=None if preview is None else PREVIEW_MIN_STEPS)
                self.level_table = self.level_tables[0]
                self.level_tables_section = section
        # The views hear of the results once the tables are of the same
        # outline too (the uplift panel samples a preview's trapped air from
        # the chart's table).
        if solved:
            with span("other views"):
                self.solved.emit(self.solution)
        if tabled:
            with span("other views"):
                self.levelTableReady.emit(self.level_table)
        if self._need_envelope and not self.live_edit:
            self._need_envelope = False
            with span("envelope"):
                self.envelope_cases, self.envelope = self._solver.envelope(self._design)
            with span("other views"):
                self.envelopeReady.emit(self.envelope)
