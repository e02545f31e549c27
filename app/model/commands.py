"""Undo commands: every user edit of the document, with readable text.

Each command keeps the document state before and after (immutable
:class:`wetline.core.case.Case` values or :class:`wetline.app.model.display.DisplayChoice`), so
undo returns the document exactly. Commands given the same ``merge_key``
one after another merge into one undo step: the nudges of one vertex, the
steps of one slider drag.
"""

from __future__ import annotations

from PySide6.QtGui import QUndoCommand

from wetline.core.numbers import format_number
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

__all__ = ["CaseCommand", "UnitsCommand", "DiagramScaleCommand", "ResistanceCommand",
           "RequiredFactorCommand", "ReportInfoCommand", "resistance_unit"]

_CASE_ID = 1001
_UNITS_ID = 1002
_SCALE_ID = 1003


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

    def __init__(self, document, case, text, merge_key=None):
        super().__init__(text)
        self._doc = document
        self._old = document.case
        self._new = case
        self._key = merge_key

    def id(self):
        return -1 if self._key is None else _CASE_ID

    def mergeWith(self, other):
        if not isinstance(other, CaseCommand) or self._key is None or other._key != self._key:
            return False
        self._new = other._new
        self.setText(other.text())
        if self._new == self._old:
            self.setObsolete(True)
        return True

    def redo(self):
        self._doc.set_case(self._new)

    def undo(self):
        self._doc.set_case(self._old)


class UnitsCommand(QUndoCommand):
    """Switch the display units ("Units: US customary, in")."""

    def __init__(self, document, choice):
        super().__init__(f"Units: {choice.title}")
        self._doc = document
        self._old = document.units
        self._new = choice

    def redo(self):
        self._doc.set_units(self._new)

    def undo(self):
        self._doc.set_units(self._old)


class DiagramScaleCommand(QUndoCommand):
    """Change the pressure-diagram scale; consecutive changes merge."""

    def __init__(self, document, scale, text):
        super().__init__(text)
        self._doc = document
        self._old = document.diagram_scale
        self._new = scale

    def id(self):
        return _SCALE_ID

    def mergeWith(self, other):
        if not isinstance(other, DiagramScaleCommand):
            return False
        self._new = other._new
        self.setText(other.text())
        return True

    def redo(self):
        self._doc.set_diagram_scale(self._new)

    def undo(self):
        self._doc.set_diagram_scale(self._old)


def resistance_unit(document):
    """(quantity, label) of a part's self-weight and holding-down resistance
    in the display system: per metre of width for plane sections ("kN/m",
    "lbf/ft"), totals for axisymmetric ones ("kN", "lbf")."""
    q = "force" if document.section.is_axisymmetric else "force_per_length"
    return q, document.units.units.label(q)


def _title(part):
    return part[:1].upper() + part[1:]


class ResistanceCommand(CaseCommand):
    """Set one part's self-weight or holding-down resistance
    ("Lid self-weight 2.5 kN/m", "Lid holding-down 4 kN/m").

    Parameters
    ----------
    document : wetline.app.model.document.Document
    part : str
    field : str
        ``"self_weight"`` or ``"holding_down"``.
    value : float
        [N/m of width for plane sections, N for axisymmetric], >= 0.
    """

    WORDS = {"self_weight": "self-weight", "holding_down": "holding-down"}

    def __init__(self, document, part, field, value):
        if field not in self.WORDS:
            raise ValueError(f"no resistance field {field!r}")
        case = document.case
        old = case.resistance_map.get(part, PartResistance())
        values = {"self_weight": old.self_weight, "holding_down": old.holding_down}
        values[field] = float(value)
        new = PartResistance(**values)  # ValueError for a negative value
        # A part with nothing holding it down is not checked (and not saved).
        new_case = case.with_resistance(part, None if new.total == 0 else new)
        q, label = resistance_unit(document)
        shown = format_number(document.units.units.to_display(float(value), q))
        super().__init__(document, new_case,
                         f"{_title(part)} {self.WORDS[field]} {shown} {label}")


class RequiredFactorCommand(CaseCommand):
    """Set the required factor against uplift ("Required uplift factor 1.25")."""

    def __init__(self, document, factor):
        factor = float(factor)
        new_case = document.case.with_required_uplift_factor(factor)  # CaseError if <= 0
        text = ("Required uplift factor: default" if factor == DEFAULT_REQUIRED_FACTOR
                else f"Required uplift factor {format_number(factor)}")
        super().__init__(document, new_case, text)


class ReportInfoCommand(CaseCommand):
    """Set the calculation sheet header fields ("Sheet header: project, job
    reference")."""

    NAMES = (("project", "project"), ("job_reference", "job reference"),
             ("prepared_by", "prepared by"))

    def __init__(self, document, report):
        old = document.case.report
        changed = [words for key, words in self.NAMES
                   if getattr(old, key) != getattr(report, key)]
        text = "Sheet header: " + (", ".join(changed) if changed else "unchanged")
        super().__init__(document, document.case.with_report(report), text)
