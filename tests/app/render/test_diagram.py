"""Drawing geometry of the loads, checked against exact core results."""

import numpy as np
import pytest

from wetline.app.render.geometry import (
    arrow_strokes,
    chain_starts,
    diagram_polygons,
    is_corner,
    part_runs,
    pressure_arrows,
    pressure_sites,
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


def _sites_by_hand(w, n):
    """pressure_sites, written out edge by edge (the reference for the vectorised one)."""
    pmax = max(w.pa.max(), w.pb.max())
    tol = 1e-9 * pmax
    sites, at = [], {}
    for k in range(w.index.size):
        i, nx, nz = int(w.index[k]), float(w.nx[k]), float(w.nz[k])
        if abs(w.pa[k] - w.pb[k]) <= tol and w.pa[k] > tol:
            sites.append((float(w.pa[k]), 0.5 * (w.ax[k] + w.bx[k]), 0.5 * (w.az[k] + w.bz[k]),
                          1))
            continue
        for v, p, x, z in ((i, w.pa[k], w.ax[k], w.az[k]), ((i + 1) % n, w.pb[k], w.bx[k],
                                                              w.bz[k])):
            if p > tol:
                at.setdefault(v, [p, x, z, []])[3].append((nx, nz))
    deepest = max(at, key=lambda v: at[v][0]) if at else None
    for v, (p, x, z, normals) in at.items():
        if len(normals) == 2 and v != deepest and not is_corner(*normals[0], *normals[1]):
            continue
        sites.append((float(p), float(x), float(z), len(normals)))
    return sorted(sites, key=lambda s: -s[0])


@pytest.mark.parametrize("key", ["sump_with_lid", "chamber_under_riser", "cone_hopper",
                                 "flared_hopper", "closed_tank"])
def test_pressure_sites_are_the_corners_and_uniform_middles(key, template_case):
    sol = template_case(key).solve()
    w = wetted_edges(sol)
    n = sol.section.n_edges
    got = [(s.pressure, s.x, s.z, len(s.normals)) for s in pressure_sites(w, n, limit=1000)]
    want = _sites_by_hand(w, n)
    assert len(got) == len(want)
    def key_of(s):
        return round(-s[0], 6), round(s[1], 9), round(s[2], 9), s[3]

    assert sorted(map(key_of, got)) == sorted(map(key_of, want))
    # Every value is rho g depth at its point (common practice).
    for s in pressure_sites(w, n, limit=1000):
        assert s.pressure == pytest.approx(sol.density * sol.gravity * (sol.level - s.z))
    few = pressure_sites(w, n, limit=3)
    assert len(few) <= 3 and few[0].pressure == max(s[0] for s in got)


def test_pressure_sites_on_a_smooth_bowl_skip_the_bends():
    # A half-round bottom of 400 edges: no corners, so only its ends and the
    # deepest point are written (and the open top writes nothing).
    t = np.linspace(np.pi, 2 * np.pi, 401)
    pts = np.vstack([np.column_stack([2 + 2 * np.cos(t), 2 + 2 * np.sin(t)]), [[2.0, 4.0]]])
    parts = ["wall"] * 400 + ["open", "open"]
    sol = Case.default(Section.build(pts, parts=parts), 3.0).solve()
    sites = pressure_sites(wetted_edges(sol), sol.section.n_edges, limit=50)
    assert len(sites) <= 3
    assert sites[0].z == pytest.approx(0.0, abs=1e-9)  # the bottom of the bowl
