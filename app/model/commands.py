"""Undo commands: the three kinds of document state an edit changes.

Each command keeps the state before and after (immutable
:class:`wetline.core.load_cases.Design` values with the active case, a
:class:`wetline.app.model.display.DisplayChoice`, a diagram scale), so undo
returns the document exactly. Commands given the same ``merge_key`` one after
another merge into one undo step: the nudges of one vertex, the steps of one
slider drag. The edits themselves (the new case and the words for the Edit
menu) are built in :mod:`wetline.app.model.editing`, and only there.
"""

from __future__ import annotations

from collections.abc import Hashable
from typing import TYPE_CHECKING

from PySide6.QtGui import QUndoCommand

from wetline.core.load_cases import Design

from .cases import same_design
from .display import DisplayChoice

if TYPE_CHECKING:
    from .document import Document

__all__ = ["DesignCommand", "CaseCommand", "NewSectionCommand", "UnitsCommand",
           "DiagramScaleCommand"]

_CASE_ID = 1001
_SCALE_ID = 1002


class DesignCommand(QUndoCommand):
    """Replace the document's design (and which case is active).

    Parameters
    ----------
    document : wetline.app.model.document.Document
    design : wetline.core.load_cases.Design
        The design after the edit.
    text : str
        What the edit did, for the Edit menu ("Move vertex 3").
    merge_key : hashable or None
        Consecutive commands with the same key merge into one step.
    active : int or None
        The case active after the edit (default: the one active before);
        undo makes the one active before active again.
    """

    def __init__(self, document: Document, design: Design, text: str,
                 merge_key: Hashable | None = None, active: int | None = None) -> None:
        super().__init__(text)
        self._doc = document
        self._old: Design = document.design
        self._old_active = document.active_index
        self._new: Design = design
        self._new_active = document.active_index if active is None else int(active)
        self._key = merge_key

    def id(self) -> int:
        return -1 if self._key is None else _CASE_ID

    def mergeWith(self, other: QUndoCommand) -> bool:
        if not isinstance(other, DesignCommand) or self._key is None or other._key != self._key:
            return False
        self._new = other._new
        self._new_active = other._new_active
        self.setText(other.text())
        if same_design(self._new, self._old) and self._new_active == self._old_active:
            self.setObsolete(True)
        return True

    def redo(self) -> None:
        self._doc.set_design(self._new, self._new_active)

    def undo(self) -> None:
        self._doc.set_design(self._old, self._old_active)


CaseCommand = DesignCommand
"""The name of old for :class:`DesignCommand` (a design of one case)."""


class NewSectionCommand(DesignCommand):
    """Start a new, untitled section (a template, a drawn outline, an
    import): the document leaves its file, so Save asks for a name and never
    overwrites the file the old section came from. Undo returns the old
    design with its file and saved state.

    Parameters
    ----------
    document : wetline.app.model.document.Document
    design : wetline.core.load_cases.Design
        The new section's design.
    text : str
        What started it ("New section: Open tank").
    """

    def __init__(self, document: Document, design: Design, text: str) -> None:
        super().__init__(document, design, text, active=0)
        self._old_file = document.file_state

    def redo(self) -> None:
        self._doc.set_file_state(None, None)
        self._doc.set_design(self._new, self._new_active)

    def undo(self) -> None:
        self._doc.set_design(self._old, self._old_active)
        self._doc.set_file_state(*self._old_file)


class UnitsCommand(QUndoCommand):
    """Switch the display units ("Units: US customary, in")."""

    def __init__(self, document: Document, choice: DisplayChoice) -> None:
        super().__init__(f"Units: {choice.title}")
        self._doc = document
        self._old = document.units
        self._new = choice

    def redo(self) -> None:
        self._doc.set_units(self._new)

    def undo(self) -> None:
        self._doc.set_units(self._old)


class DiagramScaleCommand(QUndoCommand):
    """Change the pressure-diagram scale; consecutive changes merge."""

    def __init__(self, document: Document, scale: float | None, text: str) -> None:
        super().__init__(text)
        self._doc = document
        self._old = document.diagram_scale
        self._new = scale

    def id(self) -> int:
        return _SCALE_ID

    def mergeWith(self, other: QUndoCommand) -> bool:
        if not isinstance(other, DiagramScaleCommand):
            return False
        self._new = other._new
        self.setText(other.text())
        return True

    def redo(self) -> None:
        self._doc.set_diagram_scale(self._new)

    def undo(self) -> None:
        self._doc.set_diagram_scale(self._old)
