"""Undo commands: the three kinds of document state an edit changes.

Each command keeps the state before and after (immutable
:class:`wetline.core.case.Case` values, a
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

from wetline.core.case import Case

from .display import DisplayChoice

if TYPE_CHECKING:
    from .document import Document

__all__ = ["CaseCommand", "NewSectionCommand", "UnitsCommand", "DiagramScaleCommand"]

_CASE_ID = 1001
_SCALE_ID = 1002


class CaseCommand(QUndoCommand):
    """Replace the document's case.

    Parameters
    ----------
    document : wetline.app.model.document.Document
    case : wetline.core.case.Case
        The case after the edit.
    text : str
        What the edit did, for the Edit menu ("Move vertex 3").
    merge_key : hashable or None
        Consecutive commands with the same key merge into one step.
    """

    def __init__(self, document: Document, case: Case, text: str,
                 merge_key: Hashable | None = None) -> None:
        super().__init__(text)
        self._doc = document
        self._old: Case = document.case
        self._new: Case = case
        self._key = merge_key

    def id(self) -> int:
        return -1 if self._key is None else _CASE_ID

    def mergeWith(self, other: QUndoCommand) -> bool:
        if not isinstance(other, CaseCommand) or self._key is None or other._key != self._key:
            return False
        self._new = other._new
        self.setText(other.text())
        if self._new == self._old:
            self.setObsolete(True)
        return True

    def redo(self) -> None:
        self._doc.set_case(self._new)

    def undo(self) -> None:
        self._doc.set_case(self._old)


class NewSectionCommand(CaseCommand):
    """Start a new, untitled section (a template, a drawn outline, an
    import): the document leaves its file, so Save asks for a name and never
    overwrites the file the old section came from. Undo returns the old case
    with its file and saved state.

    Parameters
    ----------
    document : wetline.app.model.document.Document
    case : wetline.core.case.Case
        The new section's case.
    text : str
        What started it ("New section: Open tank").
    """

    def __init__(self, document: Document, case: Case, text: str) -> None:
        super().__init__(document, case, text)
        self._old_file = document.file_state

    def redo(self) -> None:
        self._doc.set_file_state(None, None)
        self._doc.set_case(self._new)

    def undo(self) -> None:
        self._doc.set_case(self._old)
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
