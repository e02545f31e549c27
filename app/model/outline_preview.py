"""Outlines being edited (a part of :class:`~wetline.app.model.document.Document`):
the :class:`Draft` of an outline core refuses to build, kept beside the last
valid design, and the :class:`Preview` of a vertex being dragged, shown live
before it becomes an edit.

The document never holds an invalid section, nor a structure that does not
hold the cavity: an outline edited into an invalid shape is a draft until an
edit makes it valid again or it is discarded. A dragged outline is recorded
by :meth:`OutlinePreview.preview_outline` and checked by the next recompute
(:meth:`OutlinePreview._check_preview`); an invalid one carries the fault and
the results keep their last valid state.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np
from numpy.typing import ArrayLike
from PySide6.QtCore import QTimer, SignalInstance

from wetline.core.case import Case
from wetline.core.load_cases import Design, LoadCaseError
from wetline.core.section import Section, SectionError
from wetline.core.structure import StructureError

__all__ = ["OutlinePreview", "Draft", "Preview", "outline_fault", "active_case",
           "CAVITY", "STRUCTURE"]

CAVITY = "cavity"
"""Draft target: the cavity's outline."""
STRUCTURE = "structure"
"""Draft target: the structure's outer outline."""


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


def active_case(design: Design, index: int) -> Case:
    """The case the views show: the file-level case of a design without
    cases, else case ``index`` resolved."""
    if not design.cases:
        return design.case
    return design.resolve(design.names[index]).case


class OutlinePreview:
    """The draft and the dragged preview, mixed into the document (which
    holds the signals, the design and the recompute timer)."""

    draftChanged: SignalInstance
    previewChanged: SignalInstance
    _design: Design
    _case: Case
    _active: int
    _timer: QTimer
    _need_solve: bool
    _need_table: bool
    _need_envelope: bool

    if TYPE_CHECKING:
        @property
        def section(self) -> Section: ...

    def _init_preview(self) -> None:
        self._draft: Draft | None = None
        self._preview: Preview | None = None
        self._preview_marked = False
        self._results_of_preview = False

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
            self._preview = Preview(p.outline, p.parts, active_case(new, self._active),
                                    design=new)
            self._need_solve = self._need_table = True
        self._preview_marked = True
        self.previewChanged.emit()
        return self._preview
