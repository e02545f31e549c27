"""What a diagram draws of one load case: the case, its solution, the loads
on its structure and its name.

The PNG and SVG diagrams (:mod:`wetline.app.render.png`,
:mod:`wetline.app.render.svg`) take a :class:`wetline.core.load_cases.Design`
and a case name, as the calculation sheet does, so a diagram written by the
window (File > Export) and by ``wetline export FILE --case NAME`` is of the
same case with the same structure, ground and groundwater. A bare
:class:`wetline.core.case.Case` is still accepted: a design of one case
without a structure.
"""

from __future__ import annotations

from dataclasses import dataclass

from wetline.app.render.output import ExportError
from wetline.core.case import Case
from wetline.core.hydrostatics import Solution
from wetline.core.load_cases import Design, LoadCaseError
from wetline.core.structure import StructureLoads, exterior_loads

__all__ = ["CaseDrawing", "case_drawing"]

@dataclass(frozen=True, eq=False)
class CaseDrawing:
    """One case as the diagram scene takes it.

    Attributes
    ----------
    case : Case
        The case drawn: for a load case its
        :class:`wetline.core.load_cases.CaseView` (liquid, gravity and fill
        as numbers; ``solve`` gives the case's own solution, drawn with its
        layers, gas and trapped air).
    solution : Solution
        The liquid's loads drawn (characteristic).
    structure : StructureLoads or None
        The loads on the structure around the cavity in this case
        (groundwater, soil, flotation), None without a structure.
    case_name : str or None
        The load case's name for the title block; None for a file without
        load cases.
    """

    case: Case
    solution: Solution
    structure: StructureLoads | None
    case_name: str | None


def case_drawing(subject: Design | Case, case: str | None = None,
                 level: float | None = None) -> CaseDrawing:
    """The :class:`CaseDrawing` of load case ``case`` of ``subject``.

    Parameters
    ----------
    subject : Design or Case
        A design (every case of a file, its structure and ground), or one
        case (a design of that case alone, without a structure).
    case : str, optional
        The load case's name; default the first. Only for a Design.
    level : float, optional
        Free-surface height [m] instead of the case's fill (the layers
        below the top one where they are); the structure's loads follow
        the liquid at that level.

    Returns
    -------
    CaseDrawing

    Raises
    ------
    ExportError
        For a case name the design does not have (naming its cases), or a
        name given with a bare Case.
    TypeError
        For a subject that is neither.
    """
    if isinstance(subject, Case):
        if case is not None:
            raise ExportError(f"a case name ({case!r}) is for a design with load cases; "
                              "this is one case")
        return CaseDrawing(subject, subject.solve(level), None, None)
    if not isinstance(subject, Design):
        raise TypeError(f"a diagram is of a Design or a Case, not {type(subject).__name__}")
    try:
        resolved = subject.resolve(case)
    except LoadCaseError as exc:
        raise ExportError(str(exc)) from None
    view = resolved.as_case()
    solution = view.solve(level)
    loads = None
    if subject.structure is not None:
        loads = exterior_loads(subject.structure, subject.section,
                               groundwater=resolved.groundwater, ground=subject.ground,
                               liquid_solution=solution, required_factor=subject.required_factor,
                               geometry=subject.exterior)
    return CaseDrawing(view, solution, loads, resolved.name if subject.cases else None)
