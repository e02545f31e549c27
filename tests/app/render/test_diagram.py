"""Drawing geometry of the loads, checked against exact core results."""

import numpy as np
import pytest

from wetline.app.render.geometry import (
    arrow_strokes,
    chain_starts,
    diagram_polygons,
    part_runs,
    pressure_arrows,
    run_resultants,
    wetted_edges,
)
from wetline.core.case import Case
from wetline.core.section import Section

SQUARE = [[0, 0], [2, 0], [2, 3], [0, 3]]


def _polygons(x, z, connect):
    ends = np.flatnonzero(~connect) + 1
    starts = np.concatenate([[0], ends[:-1]])
    return [(x[a:b], z[a:b]) for a, b in zip(starts, ends, strict=True)]


def _shoelace(x, z):
    return 0.5 * (np.dot(x[:-1], z[1:]) - np.dot(x[1:], z[:-1]))


@pytest.mark.parametrize("key", ["sump_with_lid", "chamber_under_riser", "open_tank",
                                 "closed_tank"])
def test_diagram_area_is_scale_times_edge_loads(key, template_case):
    # Each wetted edge's diagram is a trapezoid of area scale * Lw * mean p,
    # and Lw * mean p * width is the edge's resultant from core.
    case = template_case(key)
    sol = case.solve()
    w = wetted_edges(sol)
    scale = 1e-5
    polys = _polygons(*diagram_polygons(w, scale))
    assert len(polys) == chain_starts(w).size
    area = sum(abs(_shoelace(x, z)) for x, z in polys)
    expected = scale * sol.resultant[w.index].sum() / case.section.width
    assert area == pytest.approx(expected, rel=1e-12)


def test_arrows_point_along_outward_normal_with_pressure_length(template_case):
    sol = template_case("open_tank").solve()
    w = wetted_edges(sol)
    tx, tz, px, pz = pressure_arrows(w, 1e-4, count=40)
    assert tx.size == 40
    depth = sol.level - tz
    length = np.sqrt((px - tx) ** 2 + (pz - tz) ** 2)
    assert length == pytest.approx(1e-4 * sol.density * sol.gravity * depth, rel=1e-12)
    x, z = arrow_strokes(tx, tz, px, pz, 0.05)
    assert x.size == 6 * 40


def test_run_resultants_sum_to_part_loads(template_case):
    sol = template_case("chamber_under_riser").solve()
    runs = part_runs(sol.section)
    res = run_resultants(sol, runs)
    for name, load in sol.parts.items():
        fz = sum(r[2] for r in res if r[0].part == name)
        assert fz == pytest.approx(load.fz, abs=1e-9 * sol.fluid_weight)
    # Plane: each resultant acts on its line of action (moment check).
    for run, fx, fz, px, pz in res:
        idx = np.array(run.edges)
        cp = sol.centre_of_pressure[idx]
        ok = ~np.isnan(cp[:, 0])
        m = np.sum(cp[ok, 0] * sol.fz[idx][ok] - cp[ok, 1] * sol.fx[idx][ok])
        assert px * fz - pz * fx == pytest.approx(m, abs=1e-9 * sol.fluid_weight)


@pytest.mark.parametrize("parts, runs", [
    (["floor", "wall", "open", "wall"], [("floor", (0,)), ("wall", (1,)), ("wall", (3,))]),
    (["wall", "wall", "floor", "wall"], [("floor", (2,)), ("wall", (3, 0, 1))]),
    (["wall"] * 4, [("wall", (0, 1, 2, 3))]),
])
def test_runs_split_a_part_into_its_separate_pieces(parts, runs):
    # A run may wrap past the last edge; open edges carry nothing.
    section = Section.build(SQUARE, parts=parts)
    assert [(r.part, r.edges) for r in part_runs(section)] == runs


def test_wetted_part_is_cut_at_the_free_surface():
    # Edge 1 rises from (2, 0) to (2, 3): wetted up to the level 1.5 m, with
    # p = rho g h at its foot and 0 at the surface (common practice).
    case = Case.default(Section.build(SQUARE, parts=["floor", "wall", "open", "wall"]), 1.5)
    sol = case.solve()
    w = wetted_edges(sol)
    assert list(w.index) == [0, 1, 3]  # the open edge carries nothing
    k = list(w.index).index(1)
    rg = sol.density * sol.gravity
    assert (w.ax[k], w.az[k], w.bx[k], w.bz[k]) == pytest.approx((2.0, 0.0, 2.0, 1.5))
    assert (w.pa[k], w.pb[k]) == pytest.approx((1.5 * rg, 0.0), abs=1e-9 * rg)
