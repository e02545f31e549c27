"""Load cases in the document: comparing and rebuilding designs, and solving
every case with its envelope, fast enough for live views.

No widgets. :class:`CaseSolver` keeps, between edits, what the cases of a
design share: the liquid solution of each situation (level, density,
gravity) and, through :func:`wetline.core.structure.exterior_loads`' cache,
the groundwater and soil loads of each groundwater situation. An edit of
the active case (its fill, its liquid) then solves that one case again and
reuses every other case's results, so the envelope follows within a frame.

:func:`rebuild` makes the design after an edit of its cases or its
file-level liquid and fill, reusing the structure's case-independent
geometry when neither the cavity nor the structure changed (checking the
structure against the cavity and cutting its soil and base pieces takes
milliseconds at 2,000 vertices; a fill slider step must not pay it):
core's :meth:`wetline.core.load_cases.Design.updated` does that.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from typing import Any

from wetline.core.case import Case
from wetline.core.hydrostatics import Solution
from wetline.core.load_cases import (
    Design,
    Envelope,
    LoadCase,
    ResolvedCase,
    SolvedCase,
    envelope,
)
from wetline.core.structure import ExteriorGeometry, exterior_loads

__all__ = ["same_design", "rebuild", "forget_derived", "restore_derived", "new_case_name",
           "CaseSolver"]


def same_design(a: Design | None, b: Design | None) -> bool:
    """True if two designs hold the same values (:class:`Design` compares by
    identity): file-level case, structure, ground and cases."""
    if a is b:
        return True
    if a is None or b is None:
        return False
    return (a.case == b.case and a.structure == b.structure and a.ground == b.ground
            and a.cases == b.cases)


def rebuild(design: Design, *, case: Case | None = None,
            cases: Sequence[LoadCase] | None = None) -> Design:
    """``design`` with another file-level ``case`` and/or ``cases``, checked
    as :class:`Design` checks them (LoadCaseError naming the case at fault):
    :meth:`wetline.core.load_cases.Design.updated`, which reuses the
    structure's exterior geometry and the cases that did not change."""
    return design.updated(case=case, cases=cases)


def forget_derived(design: Design) -> None:
    """Drop ``design``'s exterior geometry: it lives on only in the undo
    history (:meth:`wetline.core.load_cases.Design.forget_derived`)."""
    design.forget_derived()


def restore_derived(design: Design) -> Design:
    """``design`` with its exterior geometry
    (:meth:`wetline.core.load_cases.Design.restore_derived`)."""
    return design.restore_derived()


def new_case_name(names: Iterable[str]) -> str:
    """``"case N"`` for the smallest N above the count of ``names`` that no
    case has yet."""
    taken = set(names)
    n = len(taken) + 1
    while f"case {n}" in taken:
        n += 1
    return f"case {n}"


class CaseSolver:
    """Solves the cases of a design, reusing what did not change.

    The liquid solutions are kept per section, keyed as
    :meth:`wetline.core.load_cases.Design.solve_all` keys them (level,
    density, gravity, an ``"empty"`` fill); the groundwater and soil loads
    per exterior geometry. What the last design did not use is dropped
    after each :meth:`solve_all`, so a slider drag keeps no history.
    """

    def __init__(self) -> None:
        self._section: object = None
        self._exterior: ExteriorGeometry | None = None
        self._liquids: dict[tuple[Any, ...], Solution] = {}
        self._outside: dict[Any, Any] = {}

    def _reset_for(self, design: Design) -> None:
        if design.section is not self._section:
            self._section = design.section
            self._liquids = {}
        if design.exterior is not self._exterior:
            self._exterior = design.exterior
            self._outside = {}

    @staticmethod
    def _key(r: ResolvedCase) -> tuple[Any, ...]:
        return r.solution_key  # the whole law: layers, gas, pockets too

    def solve(self, design: Design, index: int) -> SolvedCase:
        """The :class:`SolvedCase` of case ``index`` of ``design``."""
        self._reset_for(design)
        return self._solve(design, design.resolve(design.names[index]))

    def _solve(self, design: Design, r: ResolvedCase) -> SolvedCase:
        key = self._key(r)
        sol = self._liquids.get(key)
        if sol is None:
            sol = self._liquids[key] = r.solve()
        loads = None
        if design.structure is not None:
            loads = exterior_loads(design.structure, design.section, groundwater=r.groundwater,
                                   ground=design.ground, liquid_solution=sol,
                                   required_factor=design.required_factor,
                                   geometry=design.exterior, cache=self._outside)
        return SolvedCase(resolved=r, solution=sol, structure=loads)

    def solve_all(self, design: Design) -> tuple[SolvedCase, ...]:
        """Every case of ``design`` solved, in order (equal to
        ``design.solve_all()``)."""
        self._reset_for(design)
        solved = tuple(self._solve(design, design.resolve(n)) for n in design.names)
        used = {self._key(s.resolved) for s in solved}
        for key in [k for k in self._liquids if k not in used]:
            del self._liquids[key]
        if design.structure is not None:
            gws = {(None if s.resolved.groundwater is None else
                    (s.resolved.groundwater.level, s.resolved.groundwater.density),
                    s.resolved.case.gravity, design.ground) for s in solved}
            for key in [k for k in self._outside if k not in gws]:
                del self._outside[key]
        return solved

    def envelope(self, design: Design) -> tuple[tuple[SolvedCase, ...], Envelope]:
        """(every case solved, their :func:`wetline.core.load_cases.envelope`)."""
        solved = self.solve_all(design)
        return solved, envelope(solved)
