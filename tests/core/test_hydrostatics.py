"""Edge cases of solve(): edges at the free surface, tiny values, no warnings.

The rule is the physics spec's (physics-and-results.md, "Model"): every wall
point at height z <= h is wetted and carries p = rho g (h - z). A horizontal
edge lying exactly at the free surface is therefore wetted over its whole
length, at zero pressure, and carries no force.
"""

import warnings
from fractions import Fraction

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from wetline.core.fill import capacity, level_for_volume, volume_below_many
from wetline.core.hydrostatics import solve
from wetline.core.level_table import level_table, part_down_at
from wetline.core.limits import EXTENT_RANGE
from wetline.core.section import Section, SectionError

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


# ------------------------------------------- extreme but valid inputs
def _quiet(fn, *args, **kw):
    """Call fn with every numpy floating-point warning an error (underflow
    aside: numpy ignores it by default, as it should, and it is harmless)."""
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        with np.errstate(over="raise", divide="raise", invalid="raise"):
            return fn(*args, **kw)


@st.composite
def extreme_sections(draw):
    """Sections at the edges of core.limits: extents from 1e-6 m to 1e7 m,
    coordinates up to 1e7 m, nearly flat edges (rises down to 1e-300 m),
    vertices at tiny heights; widths 1e-6 to 1e7 m."""
    size = draw(st.sampled_from([1e-6, 1e-3, 1.0, 1e4, 4e6]))
    n = draw(st.integers(3, 9))
    t = np.cumsum(draw(st.lists(st.floats(0.1, 1.0), min_size=n, max_size=n)))
    t = 2 * np.pi * t / t[-1]
    r = np.array(draw(st.lists(st.floats(0.3, 1.0), min_size=n, max_size=n)))
    pts = np.c_[r * np.cos(t), r * np.sin(t)] * (size / 2)
    kind = draw(st.sampled_from(["plane", "axisymmetric"]))
    if kind == "axisymmetric":
        pts[:, 0] -= pts[:, 0].min()
    else:
        pts[:, 0] += draw(st.sampled_from([0.0, 1e7 - size]))
    pts[:, 1] += draw(st.sampled_from([0.0, 0.0, 1e7 - size]))
    for _ in range(draw(st.integers(0, 3))):  # flat or nearly flat edges
        i = draw(st.integers(0, n - 1))
        if draw(st.booleans()):  # an edge from z = 0 rising by a tiny amount
            pts[i, 1] = 0.0
        rise = draw(st.sampled_from([0.0, 1e-307, 1e-300, 1e-200, 5e-16 * size]))
        pts[(i + 1) % n, 1] = pts[i, 1] + rise
    parts = draw(st.lists(st.sampled_from(["wall", "floor", "open", "lid"]),
                          min_size=n, max_size=n))
    width = draw(st.sampled_from([1e-6, 1.0, 1e7]))
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            s = Section.build(pts, parts=parts, kind=kind, width=width)
    except (SectionError, RuntimeWarning):
        assume(False)
    # core.limits.EXTENT_RANGE holds for the width and the height
    assume(min(np.ptp(s.outline, axis=0)) >= EXTENT_RANGE[0])
    # The winding from an exact shoelace sum: Section.build's float sum at
    # absolute coordinates is round-off for a 1 um outline 1e7 m out, and
    # the winding is not what this test is about.
    q = [(Fraction(x), Fraction(z)) for x, z in s.outline.tolist()]
    twice = sum(q[i - 1][0] * q[i][1] - q[i][0] * q[i - 1][1] for i in range(len(q)))
    s = Section(outline=s.outline, parts=s.parts, kind=s.kind, width=s.width,
                orientation=1.0 if twice > 0 else -1.0)
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            s.geometry  # noqa: B018 - built here, so that its own warnings are not counted
    except RuntimeWarning:
        assume(False)
    return s


@settings(max_examples=400, deadline=None,
          suppress_health_check=[HealthCheck.filter_too_much, HealthCheck.too_slow])
@given(s=extreme_sections(), frac=st.sampled_from([0.0, 5e-324, 1e-300, 1e-16, 0.5, 1.0, 1.5]),
       rho=st.sampled_from([1e-3, 1000.0, 1e5]), g=st.sampled_from([1e-3, G0, 1e3]))
def test_no_numpy_warning_at_the_limits(s, frac, rho, g):
    h = s.z_min + frac * (s.z_max - s.z_min)
    r = _quiet(solve, s, h, rho, g)
    assert np.isfinite(r.volume) and np.isfinite(r.fz).all() and np.isfinite(r.wetted_length).all()
    _quiet(level_table, s, rho, g, steps=7)
    _quiet(part_down_at, s, s.parts[0], [h, s.z_max], rho, g) if s.parts[0] != "open" else None
    cap = _quiet(capacity, s)
    for v in (0.0, min(5e-324, cap), 1e-300 * cap, 0.3 * cap, cap):
        level = _quiet(level_for_volume, s, v)
        assert s.z_min <= level <= s.top_level
    _quiet(volume_below_many, s, np.linspace(s.z_min, s.z_max, 5))
