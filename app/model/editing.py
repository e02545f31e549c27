"""User edits of a document, as undo commands: every edit is built here.

The views (panels, tables, canvas, chart, case list, main window, file
import) call these functions; each builds the new design with core and
pushes one :class:`wetline.app.model.commands.DesignCommand` with readable
text (or a units or diagram-scale command).

Where an edit lands: the fill, the liquid and gravity are the active load
case's (its overrides) when the design has cases, else the file-level
values; the outline, parts, kind, width, uplift inputs and sheet header are
the file level's; groundwater and the load factor are a case's only (a
design without cases gains its one case, named as before, the first time
one is set). Outline edits that core refuses (crossing edges, too few
vertices, a cavity the structure no longer holds, a fill word the new
outline cannot take) become the document's
:class:`wetline.app.model.document.Draft` instead, marked with the fault,
so nothing typed, drawn or dragged is lost and the last valid design stays
in force. The same holds for the structure's outline.
"""

from __future__ import annotations

import dataclasses
from collections.abc import Hashable, Sequence

import numpy as np
from numpy.typing import ArrayLike

from wetline.core.case import Case, ReportInfo
from wetline.core.fill import FillError, capacity
from wetline.core.liquids import Liquid
from wetline.core.load_cases import (
    EMPTY,
    SPILL,
    TRAPPED,
    VENTED,
    Design,
    LiquidLayer,
    LoadCase,
    LoadCaseError,
)
from wetline.core.numbers import format_number
from wetline.core.section import Section, SectionError
from wetline.core.structure import Ground, Groundwater, Structure, StructureError
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

from .cases import new_case_name, rebuild
from .commands import DesignCommand, DiagramScaleCommand, NewSectionCommand, UnitsCommand
from .display import DisplayChoice
from .document import STRUCTURE, Document, Draft, fill_range, outline_fault
from .gravity import format_gravity, gravity_label

__all__ = [
    "apply_outline", "move_vertex", "insert_vertex", "delete_vertex", "set_edge_part",
    "set_parts", "propose_parts", "draw_outline", "replace_section", "start_new_section",
    "import_section", "set_kind",
    "set_width", "rename", "set_liquid", "set_gravity", "fill_to_level", "fill_to_volume",
    "fill_to_percent", "fill_to_word", "set_resistance", "set_required_factor",
    "set_report_info", "set_units", "set_diagram_scale", "discard_draft", "RESISTANCE_FIELDS",
    "add_case", "duplicate_case", "rename_case", "delete_case", "move_case",
    "set_groundwater", "set_load_factor", "set_structure", "edit_structure",
    "remove_structure", "set_ground",
    "walls_structure", "apply_structure_outline", "move_structure_vertex",
    "set_structure_part",
    "case_layers", "add_layer", "remove_layer", "move_layer", "set_layer_liquid",
    "set_layer_top", "set_layer_volume", "set_gas_pressure", "set_pockets",
    "set_atmospheric_pressure",
]

RESISTANCE_FIELDS = {"self_weight": "self-weight", "holding_down": "holding-down"}
"""The fields of a part's resistance against uplift, and their words."""


def _push(doc: Document, design: Design, text: str, merge_key: Hashable | None = None,
          active: int | None = None) -> None:
    doc.undo_stack.push(DesignCommand(doc, design, text, merge_key, active))


def _file_edit(doc: Document, case: Case, text: str,
               merge_key: Hashable | None = None) -> None:
    """Push ``case`` as the new file-level case (LoadCaseError if a case
    cannot take it)."""
    _push(doc, rebuild(doc.design, case=case), text, merge_key)


# ------------------------------------------------------------- outline
def apply_outline(doc: Document, outline: ArrayLike, parts: Sequence[str], text: str,
                  merge_key: Hashable | None = None) -> bool:
    """Make ``outline`` / ``parts`` the section, or the draft if invalid
    (core refuses it, the structure does not hold it, or a case cannot
    take it).

    Returns
    -------
    bool
        True if the outline was valid (a command was pushed or nothing
        changed), False if it was kept as a draft.
    """
    outline = np.array(outline, dtype=np.float64)
    parts = tuple(parts)
    design = doc.design
    try:
        section = doc.section.replace(outline=outline, parts=parts)
        if section == doc.section:
            doc.set_draft(None)
            return True
        new = design.with_case(design.case.with_section(section))
    except (SectionError, StructureError, LoadCaseError) as exc:
        doc.set_draft(Draft(outline, parts, outline_fault(exc)))
        return False
    _push(doc, new, text, merge_key)
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
    an untitled document (see :func:`start_new_section`). The active case's
    liquid and gravity and the uplift inputs of the parts it still has carry
    over."""
    case = _kept_inputs(doc.case, section)
    if level is not None:
        case = case.with_level(level)
    start_new_section(doc, case, text)


def start_new_section(doc: Document, case: Case | Design, text: str = "New section") -> None:
    """Make ``case`` the document's, as a new untitled section: one undo
    step that leaves the file (:class:`wetline.app.model.commands.NewSectionCommand`).
    A case becomes a design of that one case: the structure, the ground and
    the load cases of the old section do not carry over (they were made for
    its cavity). The caller asks about unsaved changes first."""
    design = case if isinstance(case, Design) else Design(case)
    doc.undo_stack.push(NewSectionCommand(doc, design, text))


def import_section(doc: Document, section: Section, text: str, new: bool = False) -> None:
    """An outline read from a drawing or a coordinate list replaces the
    section as one undo step, keeping the liquid, the uplift inputs and the
    fill if the new section can take it (else filled to its top level).

    ``new``: as a new untitled section (File > Import, see
    :func:`start_new_section`), else as an edit of the open one (a paste:
    the structure and cases stay, and must still hold the new outline,
    else it is the draft, marked)."""
    if new:
        case = doc.case.with_section(section)
        if case.fill_level is not None:
            lo, hi = fill_range(section)
            if not lo <= case.fill_level <= hi:
                case = case.with_level(section.top_level)
        start_new_section(doc, case, text)
        return
    base = doc.design.case.with_section(section)
    if base.fill_level is not None:
        lo, hi = fill_range(section)
        if not lo <= base.fill_level <= hi:
            base = base.with_level(section.top_level)
    try:
        design = doc.design.with_case(base)
    except (StructureError, LoadCaseError) as exc:
        doc.set_draft(Draft(section.outline, tuple(section.parts), outline_fault(exc)))
        return
    _push(doc, design, text)


def _section_edit(doc: Document, section: Section, text: str) -> None:
    """The file-level case with ``section`` (kind, width, name changes);
    StructureError or LoadCaseError if the structure or a case refuses it."""
    design = doc.design
    _push(doc, design.with_case(design.case.with_section(section)), text)


def set_kind(doc: Document, kind: str) -> None:
    """Switch plane / axisymmetric (may be refused: x < 0 ...)."""
    section = doc.section.replace(kind=kind)
    doc.set_draft(None)
    _section_edit(doc, section, f"Section: {kind}")


def set_width(doc: Document, width_m: float) -> None:
    section = doc.section.replace(width=float(width_m))
    _section_edit(doc, section, f"Width {doc.units.fmt_length(width_m)}")


def rename(doc: Document, name: str) -> None:
    section = doc.section.replace(name=str(name))
    _section_edit(doc, section, f"Rename to {name}")


# ------------------------------------------------- active case: fill, liquid
def _in_case(doc: Document, text: str) -> str:
    return f"{text} ({doc.active_name})" if doc.design.cases else text


def _case_edit(doc: Document, text: str, merge_key: Hashable | None,
               file_case: Case, **overrides: object) -> None:
    """Edit the active case: its overrides (``overrides``, a field left
    equal to the file level's is cleared) with cases, else the file-level
    case ``file_case``."""
    design = doc.design
    if not design.cases:
        _file_edit(doc, file_case, text, merge_key)
        return
    i = doc.active_index
    cases = list(design.cases)
    cases[i] = dataclasses.replace(cases[i], **overrides)  # type: ignore[arg-type]
    _push(doc, rebuild(design, cases=cases), _in_case(doc, text), merge_key)


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
    """The active case's liquid (the file's without cases)."""
    if liquid == doc.case.liquid:
        return
    base = doc.design.case
    _case_edit(doc, _liquid_text(liquid), None, base.with_liquid(liquid),
               liquid=None if liquid == base.liquid else liquid)


def set_gravity(doc: Document, gravity: float) -> None:
    """Set the active case's gravity [m/s2]; the undo text gives it in the
    display system's unit ("Gravity 32.174 ft/s2")."""
    gravity = float(gravity)
    if not (np.isfinite(gravity) and gravity > 0):
        raise ValueError(f"gravity must be a positive number, not {format_number(gravity)}")
    if gravity == doc.case.gravity:
        return
    u = doc.units
    base = doc.design.case
    _case_edit(doc, f"Gravity {format_gravity(u, gravity)} {gravity_label(u)}", None,
               base.with_gravity(gravity), gravity=None if gravity == base.gravity else gravity)


def fill_to_level(doc: Document, level: float, merge_key: Hashable | None = None) -> None:
    """Fill the active case to ``level`` [m]; a slider drag passes one key
    for all its steps."""
    level = float(level)
    if not np.isfinite(level):
        raise ValueError("the level must be a number")
    case = doc.case
    if case.fill_level == level and doc.active_load_case.fill_level not in (SPILL, EMPTY):
        return
    _case_edit(doc, f"Fill to {doc.units.fmt_length(level)}", merge_key,
               doc.design.case.with_level(level), fill_level=level, fill_volume=None)


def fill_to_volume(doc: Document, volume: float, merge_key: Hashable | None = None) -> None:
    """Fill the active case with ``volume`` [m3]; FillError if the section
    cannot hold it."""
    volume = float(volume)
    if not np.isfinite(volume) or volume < 0:
        raise FillError("the volume must be a number >= 0")
    cap = capacity(doc.section)
    if volume > cap * (1 + 1e-12):
        raise FillError(f"{doc.units.fmt_volume(volume)} is more than the section holds "
                        f"({doc.units.fmt_volume(cap)})")
    if doc.case.fill_volume == volume:
        return
    _case_edit(doc, f"Fill with {doc.units.fmt_volume(volume)}", merge_key,
               doc.design.case.with_volume(volume), fill_level=None, fill_volume=volume)


def fill_to_percent(doc: Document, percent: float,
                    merge_key: Hashable | None = None) -> None:
    """Fill to ``percent`` of the capacity (0 to 100)."""
    percent = float(percent)
    if not (np.isfinite(percent) and 0 <= percent <= 100):
        raise FillError("the percentage must be between 0 and 100")
    fill_to_volume(doc, capacity(doc.section) * percent / 100.0, merge_key)


def fill_to_word(doc: Document, word: str) -> None:
    """Fill the active case to ``"spill"`` (the spill level; open sections
    only) or ``"empty"``. With cases the case keeps the word (it follows the
    outline); without, the file's fill becomes that level."""
    section = doc.section
    if word == SPILL:
        if section.spill_level is None:
            raise ValueError("'spill' needs an open section (one with an 'open' edge)")
        level, text = section.spill_level, "Fill to the spill level"
    elif word == EMPTY:
        level, text = section.z_min, "Empty"
    else:
        raise ValueError(f"a fill word is 'spill' or 'empty', not {word!r}")
    if doc.design.cases:
        if doc.active_load_case.fill_level == word:
            return
    elif doc.case.fill_level == level:
        return
    _case_edit(doc, text, None, doc.design.case.with_level(level), fill_level=word,
               fill_volume=None)


# --------------------------------------------------- groundwater, load factor
def _with_one_case(doc: Document) -> tuple[Design, list[LoadCase]]:
    """The design's cases as a list; a design without cases gets its one
    default case, made explicit (same name, file-level values)."""
    design = doc.design
    return design, list(design.cases or design.load_cases)


def set_groundwater(doc: Document, groundwater: Groundwater | None) -> None:
    """The active case's groundwater (None: dry ground). Needs a structure;
    LoadCaseError if the case cannot take it (above an open section's spill
    level ...)."""
    if groundwater is not None and doc.structure is None:
        raise LoadCaseError("groundwater needs a structure: add one with Section > Structure")
    design, cases = _with_one_case(doc)
    i = doc.active_index
    if cases[i].groundwater == groundwater:
        return
    cases[i] = dataclasses.replace(cases[i], groundwater=groundwater)
    if groundwater is None:
        text = f"Dry ground ({cases[i].name})"
    else:
        text = (f"Groundwater at {doc.units.fmt_length(groundwater.level)}, "
                f"{doc.units.fmt_density(groundwater.density)} ({cases[i].name})")
    _push(doc, rebuild(design, cases=cases), text)


def set_load_factor(doc: Document, factor: float) -> None:
    """The active case's load factor (> 0; LoadCaseError otherwise)."""
    design, cases = _with_one_case(doc)
    i = doc.active_index
    factor = float(factor)
    if cases[i].load_factor == factor:
        return
    cases[i] = dataclasses.replace(cases[i], load_factor=factor)
    _push(doc, rebuild(design, cases=cases),
          f"Load factor {format_number(factor)} ({cases[i].name})")


# ------------------------------------- layers, gas and trapped air of a case
def case_layers(doc: Document) -> list[LiquidLayer]:
    """The active case's liquids bottom up, as layers: its ``layers``, or
    its one liquid as a layer of its own (the top layer gives no bound)."""
    lc = doc.active_load_case
    if lc.layers:
        return list(lc.layers)
    return [LiquidLayer(doc.case.liquid)]


def _push_layers(doc: Document, layers: Sequence[LiquidLayer], text: str,
                 merge_key: Hashable | None = None) -> None:
    """The active case with ``layers`` (one layer: a case of one liquid,
    its liquid an override only where it differs from the file's); the case
    made explicit in a design without cases. LoadCaseError (core's message)
    if the case or the design cannot take them: nothing is changed."""
    design, cases = _with_one_case(doc)
    i = doc.active_index
    layers = list(layers)
    if len(layers) == 1:
        liquid = layers[0].liquid
        new = dataclasses.replace(cases[i], layers=None,
                                  liquid=None if liquid == design.case.liquid else liquid)
    else:
        new = dataclasses.replace(cases[i], layers=tuple(layers), liquid=None)
    if new == cases[i]:
        return
    cases[i] = new
    _push(doc, rebuild(design, cases=cases), f"{text} ({new.name})", merge_key)


def _layer_word(index: int, layer: LiquidLayer) -> str:
    return f"layer {index + 1} '{layer.liquid.name}'"


def add_layer(doc: Document) -> None:
    """A new top layer of the top layer's liquid (a layer as dense as the
    one below changes no load until its liquid is chosen); the old top
    layer ends at the middle of its depth: halfway between its bottom and
    the free surface. LoadCaseError if the case holds no liquid."""
    layers = case_layers(doc)
    if doc.active_load_case.fill_level == EMPTY:
        raise LoadCaseError("an empty case holds no layers: fill it first")
    sol = doc.solution
    level = sol.level if sol is not None else doc.case.level
    bottom = doc.section.z_min if len(layers) == 1 else _interface_levels(doc)[-1]
    if not level > bottom:
        raise LoadCaseError("the free surface is not above the top interface: raise the "
                            "fill first")
    top = 0.5 * (bottom + level)
    layers[-1] = LiquidLayer(layers[-1].liquid, top=top)
    layers.append(LiquidLayer(layers[-1].liquid))
    _push_layers(doc, layers, f"Add layer {len(layers)}")


def _interface_levels(doc: Document) -> tuple[float, ...]:
    """Interface levels of the active case, bottom up [m] (from its law)."""
    r = doc.design.resolve(doc.active_name)
    return () if r.law is None else tuple(r.law.interfaces)


def remove_layer(doc: Document, index: int) -> None:
    """Remove layer ``index`` (0 = the bottom one); the layer above a
    removed one keeps its own top, and removing the top layer makes the
    layer below it the top one (its top becomes the case's fill)."""
    layers = case_layers(doc)
    if len(layers) < 2:
        raise LoadCaseError("a case holds at least one liquid")
    word = _layer_word(index, layers[index])
    del layers[index]
    last = layers[-1]
    layers[-1] = LiquidLayer(last.liquid)
    _push_layers(doc, layers, f"Remove {word}")


def move_layer(doc: Document, index: int, step: int) -> bool:
    """Swap the liquid of layer ``index`` with the one above (``step`` +1) or
    below (-1); the interfaces stay where they are. A denser liquid over a
    lighter one is refused by core (LoadCaseError).

    Returns
    -------
    bool
        True if it moved (not past either end).
    """
    layers = case_layers(doc)
    to = index + int(step)
    if not (0 <= index < len(layers) and 0 <= to < len(layers)) or to == index:
        return False
    a, b = layers[index], layers[to]
    word = _layer_word(index, a)
    layers[index] = dataclasses.replace(a, liquid=b.liquid)
    layers[to] = dataclasses.replace(b, liquid=a.liquid)
    _push_layers(doc, layers, f"Move {word} {'up' if step > 0 else 'down'}")
    return True


def set_layer_liquid(doc: Document, index: int, liquid: Liquid) -> None:
    """The liquid of layer ``index`` (a case of one liquid: its liquid, as
    :func:`set_liquid`)."""
    layers = case_layers(doc)
    if len(layers) == 1 and not doc.active_load_case.layers:
        set_liquid(doc, liquid)
        return
    if layers[index].liquid == liquid:
        return
    layers[index] = dataclasses.replace(layers[index], liquid=liquid)
    _push_layers(doc, layers, f"Layer {index + 1}: {_liquid_text(liquid)[8:]}")


def set_layer_top(doc: Document, index: int, level: float,
                  merge_key: Hashable | None = None) -> None:
    """Layer ``index`` (not the top one) up to ``level`` [m]; a drag of its
    interface passes one key for all its steps."""
    level = float(level)
    if not np.isfinite(level):
        raise ValueError("the level must be a number")
    layers = case_layers(doc)
    if index >= len(layers) - 1:
        raise LoadCaseError("the top layer reaches the free surface: set the fill instead")
    if layers[index].top == level:
        return
    layers[index] = LiquidLayer(layers[index].liquid, top=level)
    _push_layers(doc, layers, f"Top of {_layer_word(index, layers[index])} at "
                 f"{doc.units.fmt_length(level)}", merge_key)


def set_layer_volume(doc: Document, index: int, volume: float) -> None:
    """Layer ``index`` (not the top one) given by its own volume [m3]."""
    volume = float(volume)
    if not np.isfinite(volume) or volume < 0:
        raise FillError("the volume must be a number >= 0")
    layers = case_layers(doc)
    if index >= len(layers) - 1:
        raise LoadCaseError("the top layer's volume is the fill's: set the fill instead")
    if layers[index].volume == volume:
        return
    layers[index] = LiquidLayer(layers[index].liquid, volume=volume)
    _push_layers(doc, layers, f"Volume of {_layer_word(index, layers[index])} "
                 f"{doc.units.fmt_volume(volume)}")


def _case_field(doc: Document, text: str, **fields: object) -> None:
    design, cases = _with_one_case(doc)
    i = doc.active_index
    new = dataclasses.replace(cases[i], **fields)  # type: ignore[arg-type]
    if new == cases[i]:
        return
    cases[i] = new
    _push(doc, rebuild(design, cases=cases), f"{text} ({new.name})")


def set_gas_pressure(doc: Document, pressure: float) -> None:
    """The gauge pressure of the gas over the active case's free surface
    [Pa] (closed sections only; down to a full vacuum, -101325 Pa)."""
    pressure = float(pressure)
    if not np.isfinite(pressure):
        raise ValueError("the gas pressure must be a number")
    if pressure != 0.0 and doc.section.is_open:
        raise LoadCaseError("a gas pressure needs a closed section (no 'open' edge): an open "
                            "section's surface is at atmospheric pressure")
    _case_field(doc, f"Gas pressure {doc.units.fmt_pressure(pressure)}",
                gas_pressure=pressure)


def set_pockets(doc: Document, mode: str) -> None:
    """Air under ceilings ``"vented"`` or ``"trapped"`` in the active case."""
    if mode not in (VENTED, TRAPPED):
        raise ValueError(f"pockets are 'vented' or 'trapped', not {mode!r}")
    _case_field(doc, "Trapped air" if mode == TRAPPED else "Air vented", pockets=mode)


def set_atmospheric_pressure(doc: Document, pressure: float) -> None:
    """The atmospheric pressure [Pa absolute] of the active case (used by
    trapped air)."""
    pressure = float(pressure)
    if not np.isfinite(pressure):
        raise ValueError("the atmospheric pressure must be a number")
    _case_field(doc, f"Atmospheric pressure {doc.units.fmt_pressure(pressure)}",
                atmospheric_pressure=pressure)


# ------------------------------------------------------------ the case list
def add_case(doc: Document) -> None:
    """A new case named "case N", a copy of the active one, at the end of
    the list; it becomes active."""
    design, cases = _with_one_case(doc)
    name = new_case_name(c.name for c in cases)
    cases.append(dataclasses.replace(cases[doc.active_index], name=name))
    _push(doc, rebuild(design, cases=cases), f"Add case {name}", active=len(cases) - 1)


def duplicate_case(doc: Document, index: int) -> None:
    """A copy of case ``index`` right after it ("<name> copy"); it becomes active."""
    design, cases = _with_one_case(doc)
    taken = {c.name for c in cases}
    name = f"{cases[index].name} copy"
    k = 2
    while name in taken:
        name = f"{cases[index].name} copy {k}"
        k += 1
    cases.insert(index + 1, dataclasses.replace(cases[index], name=name))
    _push(doc, rebuild(design, cases=cases), f"Duplicate case {cases[index].name}",
          active=index + 1)


def rename_case(doc: Document, index: int, name: str) -> bool:
    """Rename case ``index`` (LoadCaseError for an empty or taken name).

    Returns
    -------
    bool
        True if an edit was made.
    """
    name = str(name).strip()
    design, cases = _with_one_case(doc)
    old = cases[index].name
    if name == old:
        return False
    cases[index] = dataclasses.replace(cases[index], name=name)
    _push(doc, rebuild(design, cases=cases), f"Rename case {old} to {name}")
    return True


def delete_case(doc: Document, index: int) -> None:
    """Delete case ``index``; the last case is never deleted (ValueError)."""
    design = doc.design
    cases = list(design.cases)
    if len(cases) <= 1:
        raise ValueError("the last load case cannot be deleted: a design has at least one")
    name = cases.pop(index).name
    active = doc.active_index
    if active > index or active == len(cases):
        active -= 1
    _push(doc, rebuild(design, cases=cases), f"Delete case {name}", active=active)


def move_case(doc: Document, index: int, step: int) -> bool:
    """Move case ``index`` up (``step`` -1) or down (+1) the list; the
    active case stays active.

    Returns
    -------
    bool
        True if it moved (not past either end).
    """
    design = doc.design
    cases = list(design.cases)
    to = index + int(step)
    if not cases or not (0 <= index < len(cases) and 0 <= to < len(cases)) or to == index:
        return False
    cases.insert(to, cases.pop(index))
    names = [c.name for c in design.cases]
    active_name = names[doc.active_index]
    active = [c.name for c in cases].index(active_name)
    _push(doc, rebuild(design, cases=cases),
          f"Move case {names[index]} {'up' if step < 0 else 'down'}", active=active)
    return True


# ------------------------------------------------------ structure and ground
def walls_structure(doc: Document, base: float, wall: float, roof: float, *,
                    unit_weight: float, extra_weight: float = 0.0,
                    anchorage: float = 0.0) -> Structure:
    """A structure of walls of the given thicknesses [m] around the cavity
    (:func:`wetline.core.structure.walls_of_thickness`), not yet an edit;
    ValueError or StructureError naming what is wrong."""
    from wetline.core.structure import walls_of_thickness

    outline = walls_of_thickness(doc.section, base, wall, roof)
    return Structure.build(outline, cavity=doc.section, unit_weight=unit_weight,
                           extra_weight=extra_weight, anchorage=anchorage)


def set_structure(doc: Document, structure: Structure, ground: Ground | None,
                  text: str | None = None) -> bool:
    """Make ``structure`` (checked against the cavity) and ``ground`` the
    design's; one undo step. LoadCaseError if a case cannot take them.

    Returns
    -------
    bool
        True if an edit was made.
    """
    design = doc.design
    if design.structure == structure and design.ground == ground:
        return False
    new = Design(design.case, structure=structure, ground=ground, cases=design.cases)
    if text is None:
        text = "Structure" if design.structure is None else "Change the structure"
    _push(doc, new, text)
    return True


def edit_structure(doc: Document, walls: tuple[float, float, float] | None, *,
                   unit_weight: float, extra_weight: float = 0.0, anchorage: float = 0.0,
                   ground: Ground | None = None) -> bool:
    """The Structure dialog's edit, one undo step: walls of the thicknesses
    ``walls`` = (base, wall, roof) [m] around the cavity (None: keep the
    structure's own, edited, outline), the material's ``unit_weight``
    [N/m3], ``extra_weight`` and ``anchorage`` [N/m of width or N], and the
    ``ground``. ValueError (StructureError, LoadCaseError) naming what is
    wrong; nothing changes then.

    Returns
    -------
    bool
        True if an edit was made.
    """
    s = doc.structure
    if walls is None and s is None:
        raise ValueError("give the wall thicknesses: there is no structure yet")
    if walls is not None:
        new = walls_structure(doc, *walls, unit_weight=unit_weight, extra_weight=extra_weight,
                              anchorage=anchorage)
    else:
        assert s is not None
        new = s.replace(doc.section, unit_weight=unit_weight, extra_weight=extra_weight,
                        anchorage=anchorage)
    if walls is not None:
        text = (f"Structure: walls {doc.units.fmt_length(walls[1])}, base "
                f"{doc.units.fmt_length(walls[0])}, roof {doc.units.fmt_length(walls[2])}")
    else:
        text = "Change the structure"
    return set_structure(doc, new, ground, text)


def remove_structure(doc: Document) -> bool:
    """Remove the structure and the ground; every case's groundwater goes
    with them (it acts on the structure). One undo step.

    Returns
    -------
    bool
        True if there was a structure.
    """
    design = doc.design
    if design.structure is None:
        return False
    wet = [c for c in design.cases if c.groundwater is not None]
    cases = [dataclasses.replace(c, groundwater=None) for c in design.cases]
    text = "Remove the structure"
    if wet:
        text += f" (and the groundwater of {len(wet)} case{'s' if len(wet) > 1 else ''})"
    _push(doc, Design(design.case, cases=tuple(cases)), text)
    return True


def set_ground(doc: Document, ground: Ground | None) -> None:
    """The ground around the structure (None: no soil); needs a structure."""
    design = doc.design
    if ground == design.ground:
        return
    if ground is not None and design.structure is None:
        raise LoadCaseError("ground needs a structure: add one with Section > Structure")
    text = "No ground" if ground is None else \
        f"Ground at {doc.units.fmt_length(ground.level)}"
    _push(doc, design.with_ground(ground), text)


def apply_structure_outline(doc: Document, outline: ArrayLike, parts: Sequence[str],
                            text: str) -> bool:
    """Make ``outline`` / ``parts`` the structure's outer outline, or the
    structure draft (marked with the fault) if core refuses it: crossing
    itself, crossing the cavity, not containing it.

    Returns
    -------
    bool
        True if it was valid.
    """
    s = doc.structure
    if s is None:
        raise ValueError("there is no structure to edit")
    outline = np.array(outline, dtype=np.float64)
    parts = tuple(parts)
    try:
        new = s.replace(doc.section, outline=outline, parts=parts)
        if new == s:
            doc.set_draft(None)
            return True
        design = Design(doc.design.case, structure=new, ground=doc.ground,
                        cases=doc.design.cases)
    except (StructureError, LoadCaseError) as exc:
        doc.set_draft(Draft(outline, parts, outline_fault(exc), STRUCTURE))
        return False
    _push(doc, design, text)
    return True


def move_structure_vertex(doc: Document, index: int, x: float, z: float) -> bool:
    """Move the structure's vertex ``index`` to (x, z) [m]."""
    working = doc.working_structure_outline()
    if working is None:
        raise ValueError("there is no structure to edit")
    outline = np.array(working[0])
    outline[index] = (x, z)
    return apply_structure_outline(doc, outline, working[1],
                                   f"Move structure vertex {index}")


def set_structure_part(doc: Document, edge: int, name: str) -> bool:
    """Give the structure's ``edge`` the part ``name``."""
    name = str(name).strip()
    if not name:
        raise ValueError("a part name cannot be empty")
    working = doc.working_structure_outline()
    if working is None:
        raise ValueError("there is no structure to edit")
    outline, parts = working
    if parts[edge] == name:
        return True
    parts = parts[:edge] + (name,) + parts[edge + 1:]
    return apply_structure_outline(doc, outline, parts,
                                   f"Set part of structure edge {edge} to {name}")


# ------------------------------------------------- file level: uplift, sheet
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
    case = doc.design.case
    old = case.resistance_map.get(part, PartResistance())
    values = {"self_weight": old.self_weight, "holding_down": old.holding_down}
    values[field] = float(value)
    new = PartResistance(**values)  # ValueError for a negative value
    new_case = case.with_resistance(part, None if new.total == 0 else new)
    if new_case.resistances == case.resistances:
        return
    q, label = doc.units.resistance_unit(case.section)
    shown = format_number(doc.units.units.to_display(float(value), q))
    _file_edit(doc, new_case, f"{_title(part)} {RESISTANCE_FIELDS[field]} {shown} {label}")


def set_required_factor(doc: Document, factor: float) -> None:
    """Set the required factor against uplift and flotation ("Required
    uplift factor 1.25"); CaseError if it is not positive."""
    factor = float(factor)
    if factor == doc.design.case.required_uplift_factor:
        return
    case = doc.design.case.with_required_uplift_factor(factor)  # CaseError if <= 0
    text = ("Required uplift factor: default" if factor == DEFAULT_REQUIRED_FACTOR
            else f"Required uplift factor {format_number(factor)}")
    _file_edit(doc, case, text)


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
    old = doc.design.case.report
    changed = [words for key, words in _REPORT_WORDS if getattr(old, key) != getattr(report, key)]
    if not changed:
        return False
    _file_edit(doc, doc.design.case.with_report(report), "Sheet header: " + ", ".join(changed))
    return True


def set_units(doc: Document, choice: DisplayChoice) -> None:
    if choice != doc.units:
        doc.undo_stack.push(UnitsCommand(doc, choice))


def set_diagram_scale(doc: Document, scale: float | None, text: str = "Diagram scale") -> None:
    if scale != doc.diagram_scale:
        doc.undo_stack.push(DiagramScaleCommand(doc, scale, text))


def discard_draft(doc: Document) -> None:
    doc.set_draft(None)

