"""Refusals of Section.build, solve and the fill functions, each with its message.

The list of what is refused comes from the section format spec
(section-format.md, "What is refused, with a one-line message naming the
problem"); the kind of message ("outline crosses itself between edges 2 and
5"; "edge 7 has zero length"; "2 vertices, need 3") from issue 2. File-level
refusals (unknown keys, types, versions, units) are in test_section_file.py.
"""

import math

import numpy as np
import pytest

from wetline.core.case import Case, CaseError
from wetline.core.fill import FillError, capacity, level_for_volume
from wetline.core.hydrostatics import solve
from wetline.core.liquids import custom_liquid
from wetline.core.section import Section, SectionError

SQUARE = [[0, 0], [2, 0], [2, 3], [0, 3]]
TANK_PARTS = ["floor", "wall", "open", "wall"]


def refusal(*args, **kwargs):
    with pytest.raises(SectionError) as info:
        Section.build(*args, **kwargs)
    message = str(info.value)
    assert "\n" not in message  # one line
    return info.value


# ------------------------------------------------------------- vertices


@pytest.mark.parametrize("outline, distinct", [
    ([[0, 0], [1, 0]], 2),
    ([[0, 0], [1, 0], [0, 0]], 2),
    ([[0, 0], [1, 1], [1, 1], [0, 0]], 2),
    ([[3, 3]], 1),
])
def test_fewer_than_three_distinct_vertices(outline, distinct):
    e = refusal(outline)
    assert str(e) == f"outline has {distinct} distinct vertices, need at least 3"


def test_empty_outline():
    e = refusal(np.zeros((0, 2)))
    assert str(e) == "outline has 0 distinct vertices, need at least 3"


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
@pytest.mark.parametrize("where", [(1, 0), (2, 1)])
def test_non_finite_coordinate_names_the_vertex(bad, where):
    outline = np.array(SQUARE, dtype=float)
    outline[where] = bad
    e = refusal(outline)
    assert str(e) == f"vertex {where[0]} has a non-finite coordinate"
    assert e.vertices == (where[0],)


@pytest.mark.parametrize("outline", [
    [[0, 0], [1, 2, 3], [1, 1]],
    [[0, 0], ["a", 1], [1, 1]],
    [0, 1, 2],
    "square",
])
def test_outline_not_number_pairs(outline):
    e = refusal(outline)
    assert str(e) == "outline must be a list of [x, z] number pairs"


# ------------------------------------------------------- shape of the outline


def test_self_intersecting_outline_names_the_two_edges():
    # A bow tie: edge 0 (0,0)-(1,1) crosses edge 2 (1,0)-(0,1) at (0.5, 0.5).
    e = refusal([[0, 0], [1, 1], [1, 0], [0, 1]])
    assert str(e) == "outline crosses itself between edges 0 and 2"
    assert e.edges == (0, 2)
    assert e.location == pytest.approx((0.5, 0.5))


def test_crossing_far_round_the_outline():
    # A tank whose wall is drawn back down through the floor: edge 3,
    # (2, 1)-(3, -1), crosses the floor, edge 0, at (2.5, 0).
    e = refusal([[0, 0], [4, 0], [4, 2], [2, 1], [3, -1], [0, 2]])
    assert str(e) == "outline crosses itself between edges 0 and 3"
    assert e.edges == (0, 3)
    assert e.location == pytest.approx((2.5, 0.0))


def test_vertex_touching_another_edge_is_refused():
    # Vertex 3 lies on edge 0: the cavity pinches to a point there.
    e = refusal([[0, 0], [2, 0], [2, 1], [1, 0], [0, 1]])
    assert str(e) == "outline crosses itself between edges 0 and 3"


def test_zero_area_outline_says_where():
    # All on one line: the outline runs out and back along itself.
    e = refusal([[0, 0], [1, 0], [2, 0]])
    assert str(e) == "outline doubles back on itself along edges 0 and 2"
    assert e.edges == (0, 2)


def test_outline_doubling_back_on_a_neighbour():
    e = refusal([[0, 0], [2, 0], [1, 0], [1, 1]])
    assert str(e) == "outline doubles back on itself along edges 0 and 1"


def test_zero_length_edge_names_the_edge_and_vertices():
    e = refusal([[0, 0], [2, 0], [2, 0], [2, 3], [0, 3]])
    assert str(e) == "edge 1 has zero length (vertices 1 and 2 coincide)"
    assert e.edges == (1,)
    assert e.vertices == (1, 2)


def test_zero_length_closing_edge():
    e = refusal([[0, 0], [2, 0], [2, 3], [0, 3], [0, 0]])
    assert str(e) == "edge 4 has zero length (vertices 4 and 0 coincide)"


# ---------------------------------------------------------------- parts


@pytest.mark.parametrize("parts", [TANK_PARTS[:3], TANK_PARTS + ["wall"], []])
def test_parts_of_the_wrong_length(parts):
    e = refusal(SQUARE, parts=parts)
    assert str(e) == f"parts has {len(parts)} names but the outline has 4 edges"


@pytest.mark.parametrize("parts", ["floor", ["floor", "wall", 3, "wall"]])
def test_parts_must_be_names(parts):
    e = refusal(SQUARE, parts=parts)
    assert str(e) == "parts must be a list of names, one per edge"


def test_empty_part_name():
    e = refusal(SQUARE, parts=["floor", " ", "open", "wall"])
    assert str(e) == "edge 1 has an empty part name"


def test_axis_part_only_in_axisymmetric_sections():
    e = refusal(SQUARE, parts=["floor", "wall", "open", "axis"])
    assert str(e) == "edge 3 is marked 'axis', which only an axisymmetric section has"


def test_axis_part_must_lie_on_the_axis():
    e = refusal([[0.5, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", "open", "axis"],
                kind="axisymmetric")
    assert str(e) == "edge 3 is marked 'axis' but does not lie on x = 0"


# -------------------------------------------------------- kind and width


def test_negative_radius_in_axisymmetric_outline():
    e = refusal([[0, 0], [2, 0], [2, 3], [-0.5, 3]], kind="axisymmetric")
    assert str(e) == ("vertex 3 has x = -0.5 m < 0; an axisymmetric outline "
                      "lies at x >= 0 (x is the radius)")
    assert e.vertices == (3,)


def test_negative_x_is_fine_in_a_plane_section():
    s = Section.build([[-1, 0], [2, 0], [2, 3], [-1, 3]])
    assert s.area == 9.0


@pytest.mark.parametrize("width, shown", [(0.0, "0"), (-2.0, "-2"), (math.nan, "nan"),
                                          (math.inf, "inf")])
def test_width_not_positive(width, shown):
    e = refusal(SQUARE, width=width)
    assert str(e) == f"width must be positive, not {shown}"


@pytest.mark.parametrize("width", ["1", None, True])
def test_width_not_a_number(width):
    e = refusal(SQUARE, width=width)
    assert str(e) == "width must be a number"


def test_unknown_kind():
    e = refusal(SQUARE, kind="prismatic")
    assert str(e) == "geometry kind must be 'plane' or 'axisymmetric', not 'prismatic'"


# ------------------------------------------------ density, gravity, fill


@pytest.mark.parametrize("density", [0.0, -1000.0, math.nan])
def test_solve_refuses_density_not_positive(density):
    s = Section.build(SQUARE, parts=TANK_PARTS)
    with pytest.raises(ValueError, match=r"^density must be positive, not "):
        solve(s, 1.0, density)


@pytest.mark.parametrize("gravity", [0.0, -9.81, math.inf])
def test_solve_refuses_gravity_not_positive(gravity):
    s = Section.build(SQUARE, parts=TANK_PARTS)
    with pytest.raises(ValueError, match=r"^gravity must be positive, not "):
        solve(s, 1.0, 1000.0, gravity)


@pytest.mark.parametrize("level", [math.nan, math.inf])
def test_solve_refuses_a_non_finite_level(level):
    s = Section.build(SQUARE, parts=TANK_PARTS)
    with pytest.raises(ValueError, match=r"^level must be a finite number"):
        solve(s, level, 1000.0)


def test_case_refuses_gravity_not_positive():
    s = Section.build(SQUARE, parts=TANK_PARTS)
    with pytest.raises(CaseError, match=r"^gravity must be a positive number, not -9.81$"):
        Case(section=s, liquid=custom_liquid(1000.0), gravity=-9.81, fill_level=1.0)


def test_fill_volume_larger_than_below_the_spill_level():
    # Open tank 2 x 3: it holds 6 m3 per metre below its spill level.
    s = Section.build(SQUARE, parts=TANK_PARTS)
    assert capacity(s) == 6.0
    with pytest.raises(FillError) as info:
        level_for_volume(s, 6.5)
    assert str(info.value) == (
        "fill volume 6.5 m3 is more than the section holds below its spill level: 6 m3")
    with pytest.raises(FillError, match="more than the section holds below its spill level"):
        Case(section=s, liquid=custom_liquid(1000.0), fill_volume=6.5)


def test_fill_volume_larger_than_a_closed_section():
    s = Section.build(SQUARE, parts=["floor", "wall", "roof", "wall"])
    with pytest.raises(FillError) as info:
        level_for_volume(s, 7.0)
    assert str(info.value) == (
        "fill volume 7 m3 is more than the section holds in all (it is closed): 6 m3")


def test_spill_level_is_the_lowest_point_of_the_open_edges():
    # An open slot in the right wall at 2 m to 2.5 m: the tank spills at 2 m.
    s = Section.build([[0, 0], [2, 0], [2, 2], [2, 2.5], [2, 3], [0, 3]],
                      parts=["floor", "wall", "open", "wall", "roof", "wall"])
    assert s.spill_level == 2.0
    assert capacity(s) == 4.0
    with pytest.raises(FillError, match="below its spill level: 4 m3"):
        level_for_volume(s, 5.0)


@pytest.mark.parametrize("volume", [-1.0, math.nan])
def test_fill_volume_must_be_a_number_not_below_zero(volume):
    s = Section.build(SQUARE, parts=TANK_PARTS)
    with pytest.raises(FillError, match=r"^fill volume must be a number >= 0"):
        level_for_volume(s, volume)


def test_the_full_capacity_is_accepted():
    s = Section.build(SQUARE, parts=TANK_PARTS)
    assert level_for_volume(s, 6.0) == 3.0
    assert level_for_volume(s, 0.0) == 0.0


# ------------------------------------------------------- accepted inputs


def test_either_winding_is_accepted_and_recorded():
    ccw = Section.build(SQUARE)
    cw = Section.build(SQUARE[::-1])
    assert ccw.orientation == 1.0 and cw.orientation == -1.0
    assert ccw.area == cw.area == 6.0
    # The file's vertex order is kept as given.
    np.testing.assert_array_equal(cw.outline, np.array(SQUARE[::-1], dtype=float))


def test_outline_is_read_only():
    s = Section.build(SQUARE)
    with pytest.raises(ValueError):
        s.outline[0, 0] = 5.0


def test_default_parts_are_walls():
    assert Section.build(SQUARE).parts == ("wall",) * 4


def test_outline_through_the_same_point_twice_is_refused():
    # A figure eight: vertex 3 repeats vertex 0, so edge 3 starts where
    # edge 0 starts; the first pair found is named, with the point.
    e = refusal([[0, 0], [1, 1], [2, 0], [0, 0], [-1, -1], [-2, 0]])
    assert str(e) == "outline crosses itself between edges 0 and 3"
    assert e.location == pytest.approx((0.0, 0.0))
