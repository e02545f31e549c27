"""The document's case solver shares a liquid solution only between cases
whose whole pressure law is the same, and equals ``Design.solve_all``.

Reference: core's ``Design.solve_all`` (each case solved on its own; its
physics is checked against textbooks in tests/core).
"""

from wetline.app.model.cases import CaseSolver
from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import Design, LiquidLayer, LoadCase
from wetline.core.section import Section

SEWAGE = custom_liquid(1010.0, "sewage")
FAT = custom_liquid(900.0, "fat")


def test_cases_of_one_level_and_density_but_another_law_share_no_solution():
    """A grease trap (invented): sewage alone, and fat on sewage with the
    same bottom liquid and level, and sewage under a gas in a closed box:
    the solver keyed them by level, density and gravity alone and gave the
    layered case the plain one's loads."""
    open_trap = Section.build([[0, 0], [3, 0], [3, 4], [0, 4]],
                              parts=["floor", "wall", "open", "wall"], name="trap")
    d = Design(Case(open_trap, SEWAGE, fill_level=3.5), cases=(
        LoadCase("sewage"),
        LoadCase("fat on sewage", layers=(LiquidLayer(SEWAGE, top=2.9), LiquidLayer(FAT)))))
    closed = Section.build([[0, 0], [3, 0], [3, 4], [0, 4]],
                           parts=["floor", "wall", "roof", "wall"], name="box")
    g = Design(Case(closed, SEWAGE, fill_level=3.0), cases=(
        LoadCase("vented"), LoadCase("under gas", gas_pressure=5000.0)))
    for design in (d, g):
        solver = CaseSolver()
        got = solver.solve_all(design)
        ref = design.solve_all()
        for a, b in zip(got, ref, strict=True):
            assert a.solution.fz.tolist() == b.solution.fz.tolist(), a.name
            assert a.solution.max_pressure == b.solution.max_pressure, a.name
        assert got[0].solution.fz.tolist() != got[1].solution.fz.tolist()
        # One case at a time (an edit of the active case) gives the same.
        for i in (1, 0):
            assert solver.solve(design, i).solution.fz.tolist() == \
                ref[i].solution.fz.tolist()
