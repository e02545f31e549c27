"""Edge cases of solve(): edges at the free surface, tiny values, no warnings.

The rule is the physics spec's (physics-and-results.md, "Model"): every wall
point at height z <= h is wetted and carries p = rho g (h - z). A horizontal
edge lying exactly at the free surface is therefore wetted over its whole
length, at zero pressure, and carries no force.
"""

import warnings

import numpy as np
import pytest

from wetline.core.hydrostatics import solve
from wetline.core.level_table import level_table, part_down_at
from wetline.core.section import Section

G0 = 9.80665

# A tank 2 m wide with a ledge: the right wall steps in at z = 1 m.
#   (0,3) ------ (1.5,3)
#     |             |
#     |          (1.5,1) -- (2,1)      edge 3 is the ledge, from (2,1) to (1.5,1)
#     |                       |
#   (0,0) ----------------- (2,0)
LEDGE = Section.build([(0, 0), (2, 0), (2, 1), (1.5, 1), (1.5, 3), (0, 3)],
                      parts=["floor", "wall", "ledge", "wall", "open", "wall"])


def test_a_horizontal_edge_at_the_free_surface_is_wetted_with_no_force():
    r = solve(LEDGE, 1.0, 1000.0, G0)
    assert r.wetted_length[2] == 0.5  # the ledge, whole
    assert r.p_start[2] == 0.0 and r.p_end[2] == 0.0
    assert r.fx[2] == 0.0 and r.fz[2] == 0.0 and r.resultant[2] == 0.0
    # its centre of pressure: the midpoint, the limit of the uniform
    # diagram of a ledge just below the surface
    np.testing.assert_array_equal(r.centre_of_pressure[2], [1.75, 1.0])
    assert r.parts["ledge"].fz == 0.0 and r.parts["ledge"].down == 0.0
    # the rest as just below: the walls below it wetted to the ledge
    assert r.wetted_length.tolist()[:2] == [2.0, 1.0]
    assert r.wetted_length[3] == 0.0  # the wall above the ledge rises from the surface: dry
    assert np.isnan(r.centre_of_pressure[3]).all()
    # a hair lower, the ledge is dry
    below = solve(LEDGE, np.nextafter(1.0, 0.0), 1000.0, G0)
    assert below.wetted_length[2] == 0.0 and np.isnan(below.centre_of_pressure[2]).all()


def test_the_floor_at_the_level_of_an_empty_section_is_wetted_at_zero_pressure():
    r = solve(LEDGE, 0.0, 1000.0, G0)
    assert r.wetted_length.tolist() == [2.0, 0.0, 0.0, 0.0, 0.0, 0.0]
    assert r.volume == 0.0 and r.floor_force == 0.0 and r.fz[0] == 0.0
    np.testing.assert_array_equal(r.centre_of_pressure[0], [1.0, 0.0])


def test_a_horizontal_edge_a_hair_under_the_surface_is_wetted_whole():
    # A floor at z = 0 under a film 1e-250 m deep: the film covers it all.
    s = Section.build([(0, 0), (2, 0), (2, 1), (0, 1)], parts=["floor", "wall", "open", "wall"])
    r = solve(s, 1e-250, 1000.0, G0)
    assert r.wetted_length[0] == 2.0
    np.testing.assert_array_equal(r.centre_of_pressure[0], [1.0, 0.0])


def test_axisymmetric_edge_at_the_surface_is_wetted_too():
    # A cylinder of radius 1 m with a shelf (annulus) at z = 1 m.
    s = Section.build([(0, 0), (1, 0), (1, 1), (0.5, 1), (0.5, 2), (0, 2)],
                      parts=["floor", "wall", "shelf", "wall", "wall", "axis"],
                      kind="axisymmetric")
    r = solve(s, 1.0, 1000.0, G0)
    assert r.wetted_length[2] == 0.5 and r.fz[2] == 0.0
    assert np.isnan(r.hoop_start[2]) and np.isnan(r.hoop_end[2])  # not defined on it


def test_level_table_agrees_with_solve_at_the_surface_edge():
    t = level_table(LEDGE, 1000.0, G0, levels=[1.0])
    r = solve(LEDGE, 1.0, 1000.0, G0)
    assert t.part_down["ledge"][0] == 0.0
    assert t.floor_force[0] == pytest.approx(r.floor_force, rel=1e-14)
    np.testing.assert_array_equal(part_down_at(LEDGE, "ledge", [1.0, 2.0], 1000.0, G0)[0], 0.0)


@pytest.mark.parametrize("kind", ["plane", "axisymmetric"])
@pytest.mark.parametrize("level", [0.0, 1e-300, 5e-324, 1.0, 2.9999999999999996, 3.0, 4.0])
@pytest.mark.parametrize("rho, g", [(1e-3, 1e-3), (1e5, 1e3), (1000.0, G0)])
def test_no_numpy_warning_for_inputs_in_range(kind, level, rho, g):
    # core.limits: densities 1e-3 to 1e5 kg/m3, gravity 1e-3 to 1e3 m/s2.
    s = Section.build([(0, 0), (2, 0), (2, 1), (1.5, 1), (1.5, 3), (0, 3)],
                      parts=["floor", "wall", "ledge", "wall", "lid", "wall"], kind=kind)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        with np.errstate(over="raise", divide="raise", invalid="raise"):
            r = solve(s, level, rho, g)
            level_table(s, rho, g, steps=5)
            level_table(s, rho, g, levels=[level])
            part_down_at(s, "lid", [level, 2.0], rho, g)
    assert np.isfinite(r.fz).all() and np.isfinite(r.volume)
