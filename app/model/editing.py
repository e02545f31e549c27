"""User edits of a document, as undo commands: every edit is built here.

The views (panels, tables, canvas, chart, main window, file import) call
these functions; each builds the new case with core and pushes one
:class:`wetline.app.model.commands.CaseCommand` with readable text (or a
units or diagram-scale command). Outline edits that core refuses (crossing
edges, too few vertices) become the document's
:class:`wetline.app.model.document.Draft` instead, so nothing typed, drawn
or dragged is lost and the last valid case stays in force.
"""

from __future__ import annotations

from collections.abc import Hashable, Sequence

import numpy as np
from numpy.typing import ArrayLike

from wetline.core.case import Case, ReportInfo
from wetline.core.fill import FillError, capacity
from wetline.core.liquids import Liquid
from wetline.core.numbers import format_number
from wetline.core.section import Section, SectionError
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

from .commands import CaseCommand, DiagramScaleCommand, NewSectionCommand, UnitsCommand
from .display import DisplayChoice
from .document import Document, Draft, fill_range
from .gravity import format_gravity, gravity_label

__all__ = [
    "apply_outline", "move_vertex", "insert_vertex", "delete_vertex", "set_edge_part",
    "set_parts", "propose_parts", "draw_outline", "replace_section", "start_new_section",
    "import_section", "set_kind",
    "set_width", "rename", "set_liquid", "set_gravity", "fill_to_level", "fill_to_volume",
    "fill_to_percent", "set_resistance", "set_required_factor", "set_report_info", "set_units",
    "set_diagram_scale", "discard_draft", "RESISTANCE_FIELDS",
]

RESISTANCE_FIELDS = {"self_weight": "self-weight", "holding_down": "holding-down"}
"""The fields of a part's resistance against uplift, and their words."""


def apply_outline(doc: Document, outline: ArrayLike, parts: Sequence[str], text: str,
                  merge_key: Hashable | None = None) -> bool:
    """Make ``outline`` / ``parts`` the section, or the draft if invalid.

    Returns
    -------
    bool
        True if the outline was valid (a command was pushed or nothing
        changed), False if it was kept as a draft.
    """
    outline = np.array(outline, dtype=np.float64)
    parts = tuple(parts)
    try:
        section = doc.section.replace(outline=outline, parts=parts)
    except SectionError as exc:
        doc.set_draft(Draft(outline, parts, exc))
        return False
    if section == doc.section:
        doc.set_draft(None)
        return True
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_section(section), text, merge_key))
    return True


def move_vertex(doc: Document, index: int, x: float, z: float,
                merge_key: Hashable | None = None) -> bool:
    """Move vertex ``index`` to (x, z) [m]."""
    outline, parts = doc.working_outline()
    outline = np.array(outline)
    outline[index] = (x, z)
    return apply_outline(doc, outline, parts, f"Move vertex {index}", merge_key)


def insert_vertex(doc: Document, edge: int, x: float, z: float) -> bool:
    """Split ``edge`` at (x, z) [m]; both halves keep the edge's part."""
    outline, parts = doc.working_outline()
    outline = np.insert(np.array(outline), edge + 1, (x, z), axis=0)
    parts = parts[:edge + 1] + (parts[edge],) + parts[edge + 1:]
    return apply_outline(doc, outline, parts, f"Insert vertex on edge {edge}")


def delete_vertex(doc: Document, index: int) -> bool:
    """Remove vertex ``index``; the edge arriving there takes over."""
    outline, parts = doc.working_outline()
    n = len(outline)
    outline = np.delete(np.array(outline), index, axis=0)
    # Edges index-1 and index merge into one that keeps the part of edge index-1.
    parts = parts[:index] + parts[index + 1:] if index > 0 else parts[1:-1] + (parts[-1],)
    if n - 1 < 1:
        return False
    return apply_outline(doc, outline, parts, f"Delete vertex {index}")


def set_edge_part(doc: Document, edge: int, name: str) -> bool:
    """Give ``edge`` the part ``name`` (reserved or any typed name)."""
    name = str(name).strip()
    outline, parts = doc.working_outline()
    if not name:
        raise ValueError("a part name cannot be empty")
    if parts[edge] == name:
        return True
    parts = parts[:edge] + (name,) + parts[edge + 1:]
    return apply_outline(doc, outline, parts, f"Set part of edge {edge} to {name}")


def set_parts(doc: Document, parts: Sequence[str], text: str = "Set parts") -> bool:
    """Give every edge its part (one undo step; the draft if core refuses)."""
    outline, old = doc.working_outline()
    parts = tuple(str(p).strip() for p in parts)
    if len(parts) != len(old) or not all(parts):
        raise ValueError("one part name (not empty) for every edge")
    if parts == tuple(old):
        return True
    return apply_outline(doc, outline, parts, text)


def propose_parts(points: ArrayLike, kind: str = "plane") -> tuple[str, ...]:
    """Parts for an outline drawn vertex by vertex: the lowest horizontal
    edge(s) ``floor``, the highest horizontal edge(s) ``open`` (a shape open
    at its top), edges on the axis x = 0 of an axisymmetric section ``axis``,
    every other edge ``wall``. Level is within a billionth of the outline's
    size; an edge that is both lowest and highest (a flat outline) is a floor.

    >>> propose_parts([[0, 0], [3, 0], [3, 2], [0, 2]])
    ('floor', 'wall', 'open', 'wall')
    >>> propose_parts([[0, 0], [1, 0], [1.5, 2], [0, 2]], "axisymmetric")
    ('floor', 'wall', 'open', 'axis')
    """
    pts = np.asarray(points, dtype=np.float64).reshape(-1, 2)
    n = len(pts)
    if n < 3:
        return ("wall",) * n
    nxt = np.roll(pts, -1, axis=0)
    size = float(max(np.ptp(pts[:, 0]), np.ptp(pts[:, 1]), 1e-300))
    tol = 1e-9 * size
    flat = np.abs(nxt[:, 1] - pts[:, 1]) <= tol
    z_lo, z_hi = float(pts[:, 1].min()), float(pts[:, 1].max())
    parts = ["wall"] * n
    for i in range(n):
        if kind == "axisymmetric" and abs(pts[i, 0]) <= tol and abs(nxt[i, 0]) <= tol:
            parts[i] = "axis"
        elif flat[i] and abs(pts[i, 1] - z_lo) <= tol:
            parts[i] = "floor"
        elif flat[i] and abs(pts[i, 1] - z_hi) <= tol:
            parts[i] = "open"
    return tuple(parts)


def draw_outline(doc: Document, points: ArrayLike, part: str | None = None,
                 text: str = "Draw new outline") -> bool:
    """A new outline drawn vertex by vertex, keeping the section's kind,
    width and name; its parts as :func:`propose_parts` proposes (or every
    edge ``part``, if given; all walls where the proposal is refused); the
    draft if core refuses the outline.

    Returns
    -------
    bool
        True if the outline became the section.
    """
    old = doc.section
    outline = np.array(points, dtype=np.float64).reshape(-1, 2)
    proposals = [(part,) * len(outline)] if part is not None else [
        propose_parts(outline, old.kind), ("wall",) * len(outline)]
    error: SectionError | None = None
    for parts in proposals:
        try:
            section = Section.build(outline, parts=parts, kind=old.kind, width=old.width,
                                    name=old.name)
        except SectionError as exc:
            error = error or exc
            continue
        replace_section(doc, section, text=text)
        return True
    # A new untitled section still, shown as the invalid outline to fix.
    assert error is not None  # every proposal was refused
    start_new_section(doc, doc.case, text)
    doc.set_draft(Draft(outline, proposals[0], error))
    return False


def _kept_inputs(case: Case, section: Section) -> Case:
    """``case`` with ``section``, keeping the uplift inputs of the parts the
    section still has (a resistance for a part that is gone is dropped)."""
    case = case.with_section(section)
    names = set(section.loaded_part_names)
    for name, _ in case.resistances:
        if name not in names:
            case = case.with_resistance(name, None)
    return case


def replace_section(doc: Document, section: Section, level: float | None = None,
                    text: str = "New section") -> None:
    """A whole new section (template, drawn outline), optionally refilled:
    an untitled document (see :func:`start_new_section`). The liquid,
    gravity and the uplift inputs of the parts it still has carry over."""
    case = _kept_inputs(doc.case, section)
    if level is not None:
        case = case.with_level(level)
    start_new_section(doc, case, text)


def start_new_section(doc: Document, case: Case, text: str = "New section") -> None:
    """Make ``case`` the document's, as a new untitled section: one undo
    step that leaves the file (:class:`wetline.app.model.commands.NewSectionCommand`).
    The caller asks about unsaved changes first."""
    doc.undo_stack.push(NewSectionCommand(doc, case, text))


def import_section(doc: Document, section: Section, text: str, new: bool = False) -> None:
    """An outline read from a drawing or a coordinate list replaces the
    section as one undo step, keeping the liquid, the uplift inputs and the
    fill if the new section can take it (else filled to its top level).

    ``new``: as a new untitled section (File > Import, see
    :func:`start_new_section`), else as an edit of the open one (a paste)."""
    case = doc.case.with_section(section)
    if case.fill_level is not None:
        lo, hi = fill_range(section)
        if not lo <= case.fill_level <= hi:
            case = case.with_level(section.top_level)
    if new:
        start_new_section(doc, case, text)
    else:
        doc.undo_stack.push(CaseCommand(doc, case, text))


def set_kind(doc: Document, kind: str) -> None:
    """Switch plane / axisymmetric (may be refused: x < 0 ...)."""
    section = doc.section.replace(kind=kind)
    doc.set_draft(None)
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_section(section),
                                    f"Section: {kind}"))


def set_width(doc: Document, width_m: float) -> None:
    section = doc.section.replace(width=float(width_m))
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_section(section),
                                    f"Width {doc.units.fmt_length(width_m)}"))


def rename(doc: Document, name: str) -> None:
    section = doc.section.replace(name=str(name))
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_section(section), f"Rename to {name}"))


def _liquid_text(liquid: Liquid) -> str:
    if liquid.preset == "seawater":
        return (f"Liquid: seawater {format_number(liquid.temperature, 3)} C, "
                f"{format_number(liquid.salinity, 3)} g/kg")
    if liquid.preset == "fresh water":
        return f"Liquid: fresh water {format_number(liquid.temperature, 3)} C"
    if liquid.preset:
        return f"Liquid: {liquid.name}"
    return f"Liquid: {liquid.name}, {format_number(liquid.density, 5)} kg/m3"


def set_liquid(doc: Document, liquid: Liquid) -> None:
    if liquid == doc.case.liquid:
        return
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_liquid(liquid), _liquid_text(liquid)))


def set_gravity(doc: Document, gravity: float) -> None:
    """Set gravity [m/s2]; the undo text gives it in the display system's
    unit ("Gravity 32.174 ft/s2")."""
    gravity = float(gravity)
    if not (np.isfinite(gravity) and gravity > 0):
        raise ValueError(f"gravity must be a positive number, not {format_number(gravity)}")
    if gravity == doc.case.gravity:
        return
    u = doc.units
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_gravity(gravity),
                                    f"Gravity {format_gravity(u, gravity)} {gravity_label(u)}"))


def fill_to_level(doc: Document, level: float, merge_key: Hashable | None = None) -> None:
    """Fill to ``level`` [m]; a slider drag passes one key for all its steps."""
    level = float(level)
    if not np.isfinite(level):
        raise ValueError("the level must be a number")
    if doc.case.fill_level == level:
        return
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_level(level),
                                    f"Fill to {doc.units.fmt_length(level)}", merge_key))


def fill_to_volume(doc: Document, volume: float, merge_key: Hashable | None = None) -> None:
    """Fill with ``volume`` [m3]; FillError if the section cannot hold it."""
    volume = float(volume)
    if not np.isfinite(volume) or volume < 0:
        raise FillError("the volume must be a number >= 0")
    cap = capacity(doc.section)
    if volume > cap * (1 + 1e-12):
        raise FillError(f"{doc.units.fmt_volume(volume)} is more than the section holds "
                        f"({doc.units.fmt_volume(cap)})")
    if doc.case.fill_volume == volume:
        return
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_volume(volume),
                                    f"Fill with {doc.units.fmt_volume(volume)}", merge_key))


def fill_to_percent(doc: Document, percent: float,
                    merge_key: Hashable | None = None) -> None:
    """Fill to ``percent`` of the capacity (0 to 100)."""
    percent = float(percent)
    if not (np.isfinite(percent) and 0 <= percent <= 100):
        raise FillError("the percentage must be between 0 and 100")
    fill_to_volume(doc, capacity(doc.section) * percent / 100.0, merge_key)


def _title(part: str) -> str:
    return part[:1].upper() + part[1:]


def set_resistance(doc: Document, part: str, field: str, value: float) -> None:
    """Set one part's self-weight or holding-down resistance ("Lid
    self-weight 2.5 kN/m"): ``field`` one of :data:`RESISTANCE_FIELDS`,
    ``value`` [N/m of width for plane sections, N for axisymmetric] >= 0
    (ValueError otherwise). A part left with nothing holding it down is not
    checked (and not saved)."""
    if field not in RESISTANCE_FIELDS:
        raise ValueError(f"no resistance field {field!r}")
    case = doc.case
    old = case.resistance_map.get(part, PartResistance())
    values = {"self_weight": old.self_weight, "holding_down": old.holding_down}
    values[field] = float(value)
    new = PartResistance(**values)  # ValueError for a negative value
    new_case = case.with_resistance(part, None if new.total == 0 else new)
    if new_case.resistances == case.resistances:
        return
    q, label = doc.units.resistance_unit(case.section)
    shown = format_number(doc.units.units.to_display(float(value), q))
    doc.undo_stack.push(CaseCommand(doc, new_case,
                                    f"{_title(part)} {RESISTANCE_FIELDS[field]} {shown} {label}"))


def set_required_factor(doc: Document, factor: float) -> None:
    """Set the required factor against uplift ("Required uplift factor
    1.25"); CaseError if it is not positive."""
    factor = float(factor)
    if factor == doc.case.required_uplift_factor:
        return
    case = doc.case.with_required_uplift_factor(factor)  # CaseError if <= 0
    text = ("Required uplift factor: default" if factor == DEFAULT_REQUIRED_FACTOR
            else f"Required uplift factor {format_number(factor)}")
    doc.undo_stack.push(CaseCommand(doc, case, text))


_REPORT_WORDS = (("project", "project"), ("job_reference", "job reference"),
                 ("prepared_by", "prepared by"),
                 ("calculation_reference", "calculation reference"),
                 ("revision", "revision"), ("checked_by", "checked by"),
                 ("approved_by", "approved by"), ("revisions", "revision history"),
                 ("significant_figures", "significant figures"))


def set_report_info(doc: Document, report: ReportInfo) -> bool:
    """Set the calculation sheet's header, document control and precision
    policy ("Sheet header: project, checked by"); one undo step, nothing if
    they are unchanged.

    Returns
    -------
    bool
        True if an edit was made.
    """
    old = doc.case.report
    changed = [words for key, words in _REPORT_WORDS if getattr(old, key) != getattr(report, key)]
    if not changed:
        return False
    doc.undo_stack.push(CaseCommand(doc, doc.case.with_report(report),
                                    "Sheet header: " + ", ".join(changed)))
    return True


def set_units(doc: Document, choice: DisplayChoice) -> None:
    if choice != doc.units:
        doc.undo_stack.push(UnitsCommand(doc, choice))


def set_diagram_scale(doc: Document, scale: float | None, text: str = "Diagram scale") -> None:
    if scale != doc.diagram_scale:
        doc.undo_stack.push(DiagramScaleCommand(doc, scale, text))


def discard_draft(doc: Document) -> None:
    doc.set_draft(None)
