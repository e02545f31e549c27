"""The drawing geometry added for load cases and the structure: the envelope
diagram of several cases and the soil standing on ledges (pure numpy).

References: the hydrostatic pressure rho g (h - z) (Cengel & Cimbala,
Fluid Mechanics, sec. 3-1) and core's envelope (tests/core check it)."""

import numpy as np
import pytest

from wetline.app.render.geometry import envelope_wetted_edges, soil_blocks, wetted_edges
from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import Design, LoadCase, envelope
from wetline.core.section import Section


@pytest.fixture
def tank():
    return Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
                         parts=["floor", "wall", "open", "wall"], name="tank")


def test_the_envelope_diagram_peaks_where_cores_envelope_does(tank):
    design = Design(Case(tank, custom_liquid(1000.0), fill_level=2.0), cases=(
        LoadCase("low, factored", fill_level=1.0, load_factor=1.5),
        LoadCase("high", fill_level=2.5),
        LoadCase("brine", liquid=custom_liquid(1200.0, "brine"), fill_level=2.2)))
    solved = design.solve_all()
    w = envelope_wetted_edges([s.solution for s in solved], [s.load_factor for s in solved])
    ref = envelope(solved)
    got = np.zeros(tank.n_edges)
    got[w.index] = np.maximum(w.pa, w.pb)
    np.testing.assert_allclose(got, ref.edge_max_pressure, rtol=1e-15, atol=0)
    # The wetted extent is the highest case's: the walls wetted up to 2.5 m.
    high = wetted_edges(solved[1].solution)
    np.testing.assert_array_equal(w.index, high.index)
    np.testing.assert_array_equal(w.bz, high.bz)
    # On the floor (z = 0) the brine governs: 1200 g 2.2 > 1.5 x 1000 g 1.0, 1000 g 2.5.
    g = solved[0].solution.gravity
    floor = int(np.flatnonzero(w.index == 0)[0])
    assert w.pa[floor] == pytest.approx(1200.0 * g * 2.2, rel=1e-15)


def test_one_case_is_its_own_diagram_times_its_factor(tank):
    design = Design(Case(tank, custom_liquid(1000.0), fill_level=2.0),
                    cases=(LoadCase("only", load_factor=1.35),))
    (s,) = design.solve_all()
    w = envelope_wetted_edges([s.solution], [1.35])
    one = wetted_edges(s.solution)
    np.testing.assert_allclose(w.pa, 1.35 * one.pa, rtol=1e-15, atol=0)
    np.testing.assert_allclose(w.pb, 1.35 * one.pb, rtol=1e-15, atol=0)


def test_soil_blocks_stand_on_the_ledges_up_to_the_ground():
    segments = np.array([[2.5, 2.8, 3.3, 2.8],     # a ledge under 1.2 m of soil
                         [0.0, 4.5, 1.0, 4.5],     # above the ground: none
                         [4.0, 3.5, 5.0, 4.5]])    # rising through the ground at x 4.5
    blocks = soil_blocks(segments, 4.0)
    assert len(blocks) == 2
    np.testing.assert_array_equal(blocks[0], [[2.5, 2.8], [3.3, 2.8], [3.3, 4.0], [2.5, 4.0]])
    np.testing.assert_allclose(blocks[1], [[4.0, 3.5], [4.5, 4.0], [4.5, 4.0], [4.0, 4.0]])
