"""Copies of a Design and views of its cases never carry a stale result.

``Design.with_case`` / ``with_cases`` / ``updated`` keep the structure's
exterior geometry when the cavity and structure are the same objects (a fill
slider step must not cut the soil pieces again) and must equal a design
built afresh; ``forget_derived`` / ``restore_derived`` drop and make again
that geometry with the same values; a ``CaseView`` changed by a ``with_*``
copy solves what it now says, not the case it was made from.

The values compared come from core itself built from scratch (the
reference here is the fresh construction; the physics is checked against
textbooks in test_load_cases.py and test_structure.py). Pressures: p = rho g
(h - z) (Cengel & Cimbala, Fluid Mechanics, sec. 3-1).
"""

import numpy as np
import pytest

from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import (
    Design,
    LiquidLayer,
    LoadCase,
    LoadCaseError,
)
from wetline.core.section import Section
from wetline.core.structure import Ground, Groundwater, Structure, walls_of_thickness


def wet_well(cases=True):
    """A buried wet well (invented), 3 m x 4 m, in 0.4 / 0.3 / 0.3 m concrete."""
    cavity = Section.build([[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
                           parts=["floor", "wall", "roof", "riser", "open", "wall"],
                           name="wet well")
    structure = Structure.build(walls_of_thickness(cavity, 0.4, 0.3, 0.3), cavity=cavity)
    case = Case(cavity, custom_liquid(1000.0, "water"), fill_level=3.2)
    load_cases = (LoadCase("normal"), LoadCase("overflow", fill_level="spill", load_factor=1.35),
                  LoadCase("flood", fill_level="empty", groundwater=Groundwater(4.0)),
                  LoadCase("grease", layers=(
                      LiquidLayer(custom_liquid(1010.0, "sewage"), top=2.9),
                      LiquidLayer(custom_liquid(900.0, "fat"))))) if cases else ()
    return Design(case, structure=structure, ground=Ground(4.0), cases=load_cases)


def same(a, b):
    """Every case of two designs solved alike (liquid and structure)."""
    assert a.names == b.names
    for x, y in zip(a.solve_all(), b.solve_all(), strict=True):
        assert x.resolved.level == y.resolved.level
        assert x.solution.fz.tolist() == y.solution.fz.tolist()
        assert x.structure.fz.tolist() == y.structure.fz.tolist()
        assert x.structure.flotation.factor == y.structure.flotation.factor


def test_with_cases_keeps_the_geometry_and_equals_a_fresh_design():
    d = wet_well()
    cases = list(d.cases) + [LoadCase("half", fill_level=2.0)]
    fast = d.with_cases(cases)
    assert fast.exterior is d.exterior
    # The cases not changed are not resolved again.
    assert fast.resolve("normal") is d.resolve("normal")
    same(fast, Design(d.case, structure=d.structure, ground=d.ground, cases=tuple(cases)))
    with pytest.raises(LoadCaseError, match="unique"):
        d.with_cases(cases + [LoadCase("half")])
    with pytest.raises(LoadCaseError, match="spill"):
        d.with_cases([LoadCase("x", groundwater=Groundwater(5.0))])
    with pytest.raises(TypeError, match="LoadCase"):
        d.with_cases(["normal"])


def test_with_case_keeps_the_geometry_for_the_same_cavity_only():
    d = wet_well()
    lighter = d.case.with_liquid(custom_liquid(980.0, "light"))
    fast = d.with_case(lighter)
    assert fast.exterior is d.exterior
    # Every case resolves again: the file-level liquid changed.
    assert fast.resolve("normal").case.liquid.density == 980.0
    same(fast, Design(lighter, structure=d.structure, ground=d.ground, cases=d.cases))
    moved = d.section.replace(outline=np.array(d.section.outline) * [0.98, 1.0])
    other = d.with_case(d.case.with_section(moved))
    assert other.exterior is not d.exterior
    same(other, Design(d.case.with_section(moved), structure=d.structure, ground=d.ground,
                       cases=d.cases))
    # One step for both: the liquid and the cases.
    both = d.updated(case=lighter, cases=d.cases[:2])
    assert both.exterior is d.exterior and both.names == ("normal", "overflow")


def test_a_design_without_cases_or_structure_copies_too():
    d = wet_well(cases=False)
    assert d.with_cases([LoadCase("a"), LoadCase("b", fill_level=1.0)]).names == ("a", "b")
    plain = Design(Case(d.section, custom_liquid(1000.0), fill_level=1.0))
    assert plain.with_case(plain.case.with_level(2.0)).solve().solution.level == 2.0


def test_forgetting_and_restoring_the_geometry_gives_the_same_values():
    d = wet_well()
    before = d.solve("flood").structure
    d.forget_derived()
    assert d.exterior is None
    assert d.restore_derived() is d
    assert d.exterior is not None
    after = d.solve("flood").structure
    assert after.fz.tolist() == before.fz.tolist()
    assert after.soil_fz.tolist() == before.soil_fz.tolist()
    assert after.flotation.factor == before.flotation.factor
    # Solving a design whose geometry was dropped makes it again first.
    d.forget_derived()
    assert d.solve("flood").structure.fz.tolist() == before.fz.tolist()


# ------------------------------------------------------------ stale views
def test_a_view_moved_to_another_level_solves_there():
    d = wet_well()
    view = d.resolve("normal").as_case()
    assert view.solve().level == 3.2
    moved = view.with_level(1.0)
    sol = moved.solve()
    assert sol.level == 1.0  # was 3.2: the view kept solving its load case's fill
    # 1 m of water on the 3 m floor: rho g h = 9806.65 Pa.
    assert sol.max_pressure == pytest.approx(1000.0 * 9.80665 * 1.0, rel=1e-15)
    # A layered case moved: its layers stay, the surface moves.
    grease = d.resolve("grease").as_case().with_level(3.5)
    sol = grease.solve()
    assert sol.level == 3.5 and len(sol.layers) == 2


def test_a_view_with_another_liquid_or_gravity_is_not_its_case_any_more():
    d = wet_well()
    view = d.resolve("normal").as_case()
    brine = view.with_liquid(custom_liquid(1200.0, "brine"))
    assert brine.solve().density == 1200.0  # was 1000: the old case's solution
    assert view.with_gravity(9.0).solve().gravity == 9.0
    # A layered case's law does not follow a new liquid: refused, not guessed.
    grease = d.resolve("grease").as_case()
    with pytest.raises(LoadCaseError, match="case 'grease'.*changed"):
        grease.with_liquid(custom_liquid(1200.0, "brine")).solve()
