"""Tests of core.dxf_io: outlines from DXF drawings, and the round trip back.

Every drawing is made here with ezdxf itself, in ``tmp_path``. Outside facts
used: the $INSUNITS codes of the AutoCAD DXF Reference (1 in, 2 ft, 4 mm,
5 cm, 6 m, 10 yd, 14 dm; 0 unitless); 1 in = 0.0254 m exactly (international
yard and pound agreement, 1959); the bulge of a polyline vertex is
tan(included angle / 4), positive counter-clockwise (AutoCAD DXF Reference,
LWPOLYLINE group 42); the sagitta of a chord of angle phi on a circle of
radius r is r (1 - cos(phi / 2)) and the area of a circular segment of angle
theta is r^2 (theta - sin theta) / 2 (standard circle geometry, common
practice); the arbitrary axis algorithm maps an OCS with normal (0, 0, -1) to
world x = -x, y = y (AutoCAD DXF Reference, "Arbitrary Axis Algorithm").
"""

import itertools
import math
import os

import ezdxf
import numpy as np
import pytest

from wetline.core.dxf_io import (
    ARC_SAGITTA_RATIO,
    OUTLINE_LAYER,
    DxfError,
    choose_outline,
    insunits_code,
    list_outlines,
    read_outline,
    write_outline,
)
from wetline.core.section import Section

INCH = 0.0254  # [m], exact since 1959

SUMP_MM = [(0, 0), (2400, 0), (2400, 1600), (1900, 1600), (1900, 2800), (0, 2800)]
SUMP_AREA = 2.4 * 1.6 + 1.9 * 1.2  # [m2]: a 2.4 x 1.6 box under a 1.9 x 1.2 riser, by hand


def drawing(units=4):
    """A new R2010 document with ``$INSUNITS = units`` and its modelspace."""
    doc = ezdxf.new("R2010")
    doc.units = units
    return doc, doc.modelspace()


def save(doc, tmp_path, name="drawing.dxf"):
    path = tmp_path / name
    doc.saveas(path)
    return path


# --------------------------------------------------------------- reading
def test_closed_lwpolyline_in_mm_is_read_in_metres(tmp_path):
    doc, msp = drawing(units=4)
    line = msp.add_lwpolyline(SUMP_MM, close=True, dxfattribs={"layer": "OUTLINE"})
    path = save(doc, tmp_path, "sump.dxf")
    (o,) = list_outlines(path)
    assert (o.index, o.handle, o.layer, o.entity, o.unit) == (
        0, line.dxf.handle, "OUTLINE", "LWPOLYLINE", "mm")
    assert o.n_vertices == 6 and o.parts is None and o.warnings == ()
    np.testing.assert_allclose(o.vertices, np.array(SUMP_MM) / 1000.0, rtol=1e-15)
    assert not o.vertices.flags.writeable
    assert o.area == pytest.approx(SUMP_AREA, rel=1e-14)
    assert o.bounds == pytest.approx((0.0, 0.0, 2.4, 2.8), rel=1e-15)
    assert o.describe() == f"#0 layer OUTLINE (LWPOLYLINE {o.handle}), 6 vertices, 2400 x 2800 mm"

    section, warnings = read_outline(path)
    assert warnings == []
    assert section.name == "sump" and section.kind == "plane"
    assert section.parts == ("wall",) * 6
    # x = drawing x, z = drawing y
    np.testing.assert_allclose(section.outline, np.array(SUMP_MM) / 1000.0, rtol=1e-15)
    assert section.area == pytest.approx(SUMP_AREA, rel=1e-14)


def test_closed_2d_polyline_in_inches(tmp_path):
    doc, msp = drawing(units=1)
    msp.add_polyline2d([(0, 0), (100, 0), (100, 50), (0, 50)], close=True,
                       dxfattribs={"layer": "TANK"})
    (o,) = list_outlines(save(doc, tmp_path))
    assert o.entity == "POLYLINE" and o.unit == "in"
    np.testing.assert_array_equal(o.vertices[2], [100 * INCH, 50 * INCH])
    assert o.area == pytest.approx(5000 * INCH ** 2, rel=1e-14)


@pytest.mark.parametrize("entity", ["LWPOLYLINE", "POLYLINE"])
def test_unflagged_polyline_whose_last_vertex_repeats_the_first_is_closed(tmp_path, entity):
    doc, msp = drawing(units=6)
    pts = [(0, 0), (3, 0), (3, 2), (0, 2), (0, 0)]
    if entity == "LWPOLYLINE":
        msp.add_lwpolyline(pts)
    else:
        msp.add_polyline2d(pts)
    (o,) = list_outlines(save(doc, tmp_path))
    assert o.n_vertices == 4  # the repeated closing vertex is dropped
    assert o.area == pytest.approx(6.0, rel=1e-15)
    assert o.warnings == ()


def test_flagged_closed_with_a_repeated_closing_vertex_drops_it(tmp_path):
    doc, msp = drawing(units=6)
    msp.add_lwpolyline([(0, 0), (3, 0), (3, 2), (0, 0)], close=True)
    (o,) = list_outlines(save(doc, tmp_path))
    assert o.n_vertices == 3


def test_consecutive_repeated_vertices_are_dropped_with_a_warning(tmp_path):
    doc, msp = drawing(units=6)
    msp.add_lwpolyline([(0, 0), (3, 0), (3, 0), (3, 2), (0, 2)], close=True)
    section, warnings = read_outline(save(doc, tmp_path))
    assert section.n_edges == 4
    assert warnings == ["1 repeated vertex dropped"]


def test_mirrored_polyline_is_converted_to_world_coordinates(tmp_path):
    doc, msp = drawing(units=6)
    # OCS with normal (0, 0, -1): world x = -x, y = y (arbitrary axis algorithm)
    msp.add_lwpolyline([(1, 0), (3, 0), (3, 2)], close=True,
                       dxfattribs={"extrusion": (0, 0, -1)})
    (o,) = list_outlines(save(doc, tmp_path))
    np.testing.assert_allclose(o.vertices, [[-1, 0], [-3, 0], [-3, 2]], atol=1e-15)


def test_binary_dxf_is_read(tmp_path):
    doc, msp = drawing(units=4)
    msp.add_lwpolyline(SUMP_MM, close=True)
    path = tmp_path / "binary.dxf"
    doc.saveas(path, fmt="bin")
    (o,) = list_outlines(path)
    assert o.area == pytest.approx(SUMP_AREA, rel=1e-14)


# ------------------------------------------------------ several and none
@pytest.fixture
def three(tmp_path):
    """A drawing with three closed polylines on layers OUTLINE, LID, LID."""
    doc, msp = drawing(units=4)
    msp.add_lwpolyline(SUMP_MM, close=True, dxfattribs={"layer": "OUTLINE"})
    msp.add_lwpolyline([(0, 0), (10, 0), (10, 5)], close=True, dxfattribs={"layer": "LID"})
    msp.add_polyline2d([(0, 0), (20, 0), (20, 5), (0, 5)], close=True,
                       dxfattribs={"layer": "LID"})
    msp.add_lwpolyline([(0, 0), (1, 1), (2, 0)], dxfattribs={"layer": "WALLS"})  # open
    return save(doc, tmp_path, "three.dxf")


def test_several_closed_polylines_need_a_choice_and_are_listed(three):
    with pytest.raises(DxfError) as err:
        read_outline(three)
    msg = str(err.value)
    assert "\n" not in msg
    assert msg.startswith("3 closed polylines in three.dxf: #0 layer OUTLINE")
    assert "#1 layer LID" in msg and "#2 layer LID (POLYLINE" in msg
    assert "6 vertices" in msg and msg.endswith("choose one by number, handle or layer")


def test_choose_by_layer_index_and_handle(three):
    outlines = list_outlines(three)
    assert [o.index for o in outlines] == [0, 1, 2]
    section, _ = read_outline(three, choose="outline")  # layer names ignore case in DXF
    assert section.n_edges == 6
    assert read_outline(three, choose=2)[0].n_edges == 4
    assert choose_outline(outlines, "#1") is outlines[1]
    assert choose_outline(outlines, "1") is outlines[1]
    assert choose_outline(outlines, outlines[2].handle.lower()) is outlines[2]


def test_a_choice_that_matches_several_or_none_is_refused(three):
    outlines = list_outlines(three)
    with pytest.raises(DxfError, match=r"^2 closed polylines on layer LID in the drawing: #1"):
        choose_outline(outlines, "LID")
    with pytest.raises(DxfError, match=r"has no closed polyline #7 \(it has 3: #0"):
        choose_outline(outlines, 7)
    with pytest.raises(DxfError, match=r"no closed polyline in the drawing has the number, "
                                       r"handle or layer 'ROOF'"):
        choose_outline(outlines, "ROOF")
    with pytest.raises(DxfError, match="not True"):
        choose_outline(outlines, True)


def test_open_polylines_only_are_named(tmp_path):
    doc, msp = drawing()
    for k in range(3):
        msp.add_lwpolyline([(0, k), (1, k + 1), (2, k)], dxfattribs={"layer": "WALLS"})
    msp.add_polyline2d([(0, 0), (5, 5)], dxfattribs={"layer": "0"})
    with pytest.raises(DxfError) as err:
        read_outline(save(doc, tmp_path))
    assert str(err.value) == ("drawing.dxf has no closed polyline (found 3 open LWPOLYLINEs "
                              "on layer WALLS, 1 open POLYLINE on layer 0)")


def test_an_empty_drawing_and_loose_lines_get_a_hint(tmp_path):
    doc, msp = drawing()
    with pytest.raises(DxfError, match=r"^drawing.dxf has no closed polyline in its "
                                       r"modelspace$"):
        list_outlines(save(doc, tmp_path))
    for a, b in [((0, 0), (1, 0)), ((1, 0), (1, 1)), ((1, 1), (0, 0))]:
        msp.add_line(a, b)
    msp.add_arc((0, 0), 1, 0, 90)
    block = doc.blocks.new("TANK")
    block.add_lwpolyline([(0, 0), (1, 0), (1, 1)], close=True)
    msp.add_blockref("TANK", (0, 0))
    with pytest.raises(DxfError) as err:
        list_outlines(save(doc, tmp_path))
    msg = str(err.value)
    assert "it holds 3 LINEs, 1 ARC: join the outline into one closed polyline" in msg
    assert "1 block reference not searched: explode them first" in msg


def test_closed_polyline_with_two_vertices_is_named_not_used(tmp_path):
    doc, msp = drawing()
    e = msp.add_lwpolyline([(0, 0), (5, 5)], close=True, dxfattribs={"layer": "OUTLINE"})
    with pytest.raises(DxfError) as err:
        read_outline(save(doc, tmp_path))
    assert str(err.value) == (
        "drawing.dxf has no closed polyline with 3 or more vertices (found closed "
        f"LWPOLYLINE {e.dxf.handle} on layer OUTLINE with only 2 distinct vertices)")


def test_3d_polyline_is_not_read_and_says_so(tmp_path):
    doc, msp = drawing()
    msp.add_polyline3d([(0, 0, 0), (1, 0, 1), (1, 1, 0)], close=True,
                       dxfattribs={"layer": "PIPE"})
    with pytest.raises(DxfError, match=r"found 1 3D POLYLINE on layer PIPE"):
        list_outlines(save(doc, tmp_path))


# --------------------------------------------------------------- units
def test_unitless_drawing_is_read_as_mm_with_a_warning(tmp_path):
    doc, msp = drawing(units=0)
    msp.add_lwpolyline(SUMP_MM, close=True)
    path = save(doc, tmp_path)
    section, warnings = read_outline(path)
    assert section.outline[1, 0] == pytest.approx(2.4, rel=1e-15)
    assert warnings == ["drawing.dxf states no units ($INSUNITS = 0); read as millimetres: "
                        "give the unit if that is wrong"]
    section, warnings = read_outline(path, unit="m")
    assert section.outline[1, 0] == 2400.0 and warnings == []


def test_unitless_drawing_that_looks_like_metres_says_so(tmp_path):
    doc, msp = drawing(units=0)
    msp.add_lwpolyline([(0, 0), (2.4, 0), (2.4, 2.8), (0, 2.8)], close=True)
    _, warnings = read_outline(save(doc, tmp_path))
    assert len(warnings) == 2
    assert warnings[1] == ("read as millimetres the outline is only 2.8 mm across; "
                           "if the drawing is in metres, give the unit m")


def test_a_unit_given_overrides_the_header_with_a_warning(tmp_path):
    doc, msp = drawing(units=4)
    msp.add_lwpolyline([(0, 0), (2, 0), (2, 3)], close=True)
    section, warnings = read_outline(save(doc, tmp_path), unit="ft")
    assert section.outline[1, 0] == pytest.approx(2 * 0.3048, rel=1e-15)
    assert warnings == ["drawing.dxf states its units as mm; read in ft as asked"]


def test_header_units_that_cannot_be_converted_need_a_unit(tmp_path):
    doc, msp = drawing()
    doc.header["$INSUNITS"] = 22  # US survey inch: no pint unit
    msp.add_lwpolyline([(0, 0), (2, 0), (2, 3)], close=True)
    path = save(doc, tmp_path)
    with pytest.raises(DxfError, match=r"\$INSUNITS = 22 .*give the unit"):
        list_outlines(path)
    (o,) = list_outlines(path, unit="in")
    assert o.vertices[1, 0] == pytest.approx(2 * INCH, rel=1e-15)


@pytest.mark.parametrize("unit, code", [
    ("in", 1), ("inch", 1), ("ft", 2), ("mm", 4), ("millimeter", 4), ("cm", 5),
    ("m", 6), ("yd", 10), ("dm", 14)])
def test_insunits_codes_follow_the_dxf_reference(unit, code):
    assert insunits_code(unit) == code


def test_unknown_units_are_refused():
    assert insunits_code("furlong") is None
    with pytest.raises(DxfError, match="unknown length unit 'parsnips'"):
        insunits_code("parsnips")


def test_unknown_unit_argument_is_refused(tmp_path):
    doc, msp = drawing()
    msp.add_lwpolyline(SUMP_MM, close=True)
    with pytest.raises(DxfError, match="unknown length unit 'cubits'"):
        read_outline(save(doc, tmp_path), unit="cubits")


# ----------------------------------------------------------------- arcs
def arc_drawing(tmp_path, bulge, units=6):
    """A 2 x 2 square whose bottom edge is an arc with the given bulge."""
    doc, msp = drawing(units=units)
    msp.add_lwpolyline([(0, 0, bulge), (2, 0, 0), (2, 2, 0), (0, 2, 0)], format="xyb",
                       close=True)
    return save(doc, tmp_path)


def arc_geometry(bulge, chord=2.0):
    """Included angle [rad], radius [m] and centre of the bottom arc."""
    theta = 4 * math.atan(abs(bulge))
    r = chord / 2 / math.sin(theta / 2)
    # the centre lies on the chord's perpendicular bisector, r cos(theta/2) from
    # the chord, on the left of travel for a counter-clockwise (positive) bulge
    d = r * math.cos(theta / 2)
    return theta, r, np.array([1.0, d if bulge > 0 else -d])


@pytest.mark.parametrize("bulge", [1.0, math.tan(math.pi / 8), -math.tan(math.pi / 8), 0.05])
def test_bulge_is_flattened_onto_the_arc_within_the_sagitta(tmp_path, bulge):
    (o,) = list_outlines(arc_drawing(tmp_path, bulge))
    theta, r, centre = arc_geometry(bulge)
    n_chords = o.n_vertices - 3
    assert o.n_arcs == 1
    assert o.warnings == (f"1 arc segment flattened into {n_chords} straight edges "
                          "(chords within 0.1% of the arc's radius)",)
    arc = o.vertices[:n_chords + 1]  # from (0, 0) along the arc to (2, 0)
    np.testing.assert_allclose(arc[0], [0, 0], atol=1e-15)
    np.testing.assert_allclose(arc[-1], [2, 0], atol=1e-15)
    # every vertex on the circle
    np.testing.assert_allclose(np.hypot(*(arc - centre).T), r, rtol=1e-12)
    # sagitta of each chord: r - distance from the centre to the chord's midpoint
    mid = (arc[1:] + arc[:-1]) / 2
    sagitta = r - np.hypot(*(mid - centre).T)
    assert sagitta.max() <= ARC_SAGITTA_RATIO * r * (1 + 1e-9)
    # and not much finer than asked: one chord fewer would break the tolerance
    phi = theta / (n_chords - 1) if n_chords > 1 else theta
    assert r * (1 - math.cos(phi / 2)) > ARC_SAGITTA_RATIO * r * (1 - 1e-9)
    # the area of the flattened outline: the square plus (bulging out, bulge > 0)
    # or minus (bulging in) the circular segment, less what the chords cut off
    segment = r ** 2 * (theta - math.sin(theta)) / 2
    phi = theta / n_chords
    lost = n_chords * r ** 2 * (phi - math.sin(phi)) / 2
    s = 1 if bulge > 0 else -1
    assert o.area == pytest.approx(4 + s * (segment - lost), rel=1e-12)


def test_flattened_area_converges_to_the_circular_segment(tmp_path):
    bulge = 1.0  # a semicircle of radius 1 m below the square
    exact = 4 + math.pi / 2
    errors = []
    for tol in (1e-2, 1e-4, 1e-6, 1e-8):
        section, warnings = read_outline(arc_drawing(tmp_path, bulge), arc_tolerance=tol)
        errors.append(abs(section.area - exact) / exact)
        assert warnings[0].endswith(f"(chords within {tol:g} m of the arc)")
    # chord area loss ~ (2/3) r theta s: halving s halves it; here s drops 100x a step
    assert all(b < a / 50 for a, b in itertools.pairwise(errors))
    assert errors[-1] < 1e-8


def test_bulge_of_a_2d_polyline_is_flattened_too(tmp_path):
    doc, msp = drawing(units=6)
    msp.add_polyline2d([(0, 0, 0, 0, 1.0), (2, 0), (2, 2), (0, 2)], format="xyseb",
                       close=True)
    section, warnings = read_outline(save(doc, tmp_path), arc_tolerance=1e-9)
    assert section.area == pytest.approx(4 + math.pi / 2, rel=1e-8)  # square + semicircle
    assert warnings[0].startswith("1 arc segment flattened into")


def test_arc_tolerance_is_in_metres_whatever_the_drawing_unit(tmp_path):
    (o_m,) = list_outlines(arc_drawing(tmp_path, 1.0, units=6), arc_tolerance=1e-3)
    doc, msp = drawing(units=4)
    msp.add_lwpolyline([(0, 0, 1.0), (2000, 0, 0), (2000, 2000, 0), (0, 2000, 0)],
                       format="xyb", close=True)
    (o_mm,) = list_outlines(save(doc, tmp_path, "mm.dxf"), arc_tolerance=1e-3)
    assert o_m.n_vertices == o_mm.n_vertices
    np.testing.assert_allclose(o_m.vertices, o_mm.vertices, rtol=1e-12, atol=1e-15)


def test_several_arcs_and_straight_edges_keep_their_order(tmp_path):
    # A stadium: a 4 x 2 m rectangle with a semicircle of radius 1 m on each
    # short side (bulge 1 = half a circle, AutoCAD DXF Reference), drawn
    # counter-clockwise. Area 8 + pi r^2 less what the chords cut off, n r^2
    # (phi - sin phi) / 2 for each arc of n chords of angle phi (circle
    # geometry, common practice).
    doc, msp = drawing(units=6)
    msp.add_lwpolyline([(0, 0, 0), (4, 0, 1.0), (4, 2, 0), (0, 2, 1.0)], format="xyb",
                       close=True)
    (o,) = list_outlines(save(doc, tmp_path))
    v = o.vertices
    assert o.n_arcs == 2
    n = (o.n_vertices - 2) // 2  # chords per arc, the same for both
    assert o.n_vertices == 2 * n + 2
    np.testing.assert_allclose(v[[0, 1, n + 1, n + 2]], [[0, 0], [4, 0], [4, 2], [0, 2]],
                               atol=1e-15)
    right, left = v[1:n + 2], np.vstack([v[n + 2:], v[:1]])
    for arc, centre, start in ((right, (4, 1), -np.pi / 2), (left, (0, 1), np.pi / 2)):
        np.testing.assert_allclose(np.hypot(*(arc - centre).T), 1.0, rtol=1e-14)
        angle = np.unwrap(np.arctan2(arc[:, 1] - centre[1], arc[:, 0] - centre[0]))
        np.testing.assert_allclose(angle - angle[0], np.linspace(0, np.pi, n + 1),
                                   atol=1e-12)  # equal steps, counter-clockwise
        assert angle[0] == pytest.approx(start)
    phi = np.pi / n
    assert o.area == pytest.approx(8 + np.pi - 2 * n * (phi - np.sin(phi)) / 2, rel=1e-13)


def test_an_arc_that_reaches_beyond_the_coordinate_limit_is_named(tmp_path):
    # A bulge of 1e15 on a 2 m chord is an arc of almost a full turn on a
    # circle of radius 1 / sin(2 atan(1e15)) ~ 5e14 m: beyond core.limits.COORDINATE_LIMIT.
    doc, msp = drawing(units=6)
    e = msp.add_lwpolyline([(0, 0, 1e15), (2, 0, 0), (2, 2, 0), (0, 2, 0)], format="xyb",
                           close=True)
    with pytest.raises(DxfError, match=rf"found closed LWPOLYLINE {e.dxf.handle} on layer 0 "
                                       r"with an arc that reaches beyond the 1e\+07 m "
                                       r"Wetline reads\)$"):
        list_outlines(save(doc, tmp_path))


@pytest.mark.parametrize("bad", [0, -1.0, math.nan, "1 mm", True, 1e-10])
def test_bad_arc_tolerance_is_refused(tmp_path, bad):
    with pytest.raises(DxfError, match="arc tolerance must be a positive length in metres"):
        list_outlines(arc_drawing(tmp_path, 1.0), arc_tolerance=bad)


# --------------------------------------------------------- bad drawings
def test_garbage_file_is_not_a_dxf(tmp_path):
    path = tmp_path / "notes.dxf"
    path.write_text("this is a shopping list\neggs\n")
    with pytest.raises(DxfError, match=r"^notes.dxf is not a DXF file$"):
        list_outlines(path)


def test_truncated_dxf_is_not_readable(tmp_path):
    doc, msp = drawing()
    msp.add_lwpolyline(SUMP_MM, close=True)
    path = save(doc, tmp_path, "cut.dxf")
    text = path.read_text()
    path.write_text(text[: len(text) // 2])
    with pytest.raises(DxfError, match=r"^cut.dxf is not a readable DXF file \(.*\)$"):
        list_outlines(path)


def test_missing_file_folder_and_dwg(tmp_path):
    with pytest.raises(DxfError, match="no such file"):
        read_outline(tmp_path / "nope.dxf")
    with pytest.raises(DxfError, match="is a folder, not a DXF file"):
        read_outline(tmp_path)
    dwg = tmp_path / "plan.dxf"
    dwg.write_bytes(b"AC1032" + bytes(100))  # the version stamp every DWG starts with
    with pytest.raises(DxfError, match="plan.dxf is a DWG file, not DXF"):
        read_outline(dwg)


def test_an_outline_that_crosses_itself_says_where(tmp_path):
    doc, msp = drawing(units=6)
    msp.add_lwpolyline([(0, 0), (2, 0), (0, 2), (2, 2)], close=True,
                       dxfattribs={"layer": "OUTLINE"})
    with pytest.raises(DxfError) as err:
        read_outline(save(doc, tmp_path))
    assert str(err.value) == ("drawing.dxf: polyline #0 on layer OUTLINE: outline crosses "
                              "itself between edges 1 and 3")
    assert err.value.edges == (1, 3)
    assert err.value.location == pytest.approx((1.0, 1.0))


def test_axisymmetric_needs_x_at_least_zero(tmp_path):
    doc, msp = drawing(units=6)
    msp.add_lwpolyline([(-1, 0), (2, 0), (2, 3)], close=True)
    path = save(doc, tmp_path)
    with pytest.raises(DxfError, match=r"vertex 0 has x = -1 m < 0"):
        read_outline(path, kind="axisymmetric")
    assert read_outline(path)[0].kind == "plane"


# ---------------------------------------------------------- round trip
def star(n, seed):
    """A simple polygon: n vertices at random radii around a point, in angle order."""
    rng = np.random.default_rng(seed)
    angle = np.sort(rng.uniform(0, 2 * np.pi, n))
    radius = rng.uniform(0.3, 1.0, n) * 3.7
    return np.column_stack([5.1 + radius * np.cos(angle), 2.9 + radius * np.sin(angle)])


PARTS = ["floor", "wall", "lid", "open", "north wall", "lid/hatch", "Wall", "wall"]


@pytest.mark.parametrize("unit", ["m", "mm", "in", "ft", "cm"])
@pytest.mark.parametrize("seed", [1, 2])
def test_export_then_import_gives_the_same_outline_and_parts(tmp_path, unit, seed):
    pts = star(40, seed)
    parts = [PARTS[i % len(PARTS)] for i in range(40)]
    section = Section.build(pts, parts=parts, name="star")
    path = tmp_path / "star.dxf"
    write_outline(section, path, unit=unit)
    back, warnings = read_outline(path)
    assert warnings == []
    np.testing.assert_allclose(back.outline, section.outline, rtol=1e-9, atol=0)
    assert np.abs(back.outline - section.outline).max() <= 4e-16 * np.abs(pts).max()
    assert back.parts == section.parts  # "Wall" and "wall" kept apart, odd names exact
    assert back.name == "star"


def test_exported_drawing_has_part_layers_lines_and_units(tmp_path):
    section = Section.build([[0, 0], [2.4, 0], [2.4, 1.6], [0, 1.6]],
                            parts=["floor", "wall", "open", "lid/hatch"])
    path = tmp_path / "box.dxf"
    write_outline(section, path, unit="mm")
    doc = ezdxf.readfile(path)
    assert doc.dxfversion == "AC1024"  # R2010
    assert doc.header["$INSUNITS"] == 4
    msp = doc.modelspace()
    lines = list(msp.query("LINE"))
    assert [e.dxf.layer for e in lines] == ["WETLINE-floor", "WETLINE-wall", "WETLINE-open",
                                            "WETLINE-lid_hatch"]
    assert lines[0].dxf.start == (0, 0, 0) and lines[0].dxf.end == (2400, 0, 0)
    (poly,) = msp.query("LWPOLYLINE")
    assert poly.dxf.layer == OUTLINE_LAYER and poly.closed
    assert [tuple(p) for p in poly.get_points("xy")] == [(0, 0), (2400, 0), (2400, 1600),
                                                        (0, 1600)]


def test_parts_come_back_from_layer_names_alone(tmp_path):
    # what a CAD program that drops extended data would leave
    doc, msp = drawing(units=6)
    pts = [(0, 0), (2, 0), (2, 1), (0, 1)]
    for i, layer in enumerate(["WETLINE-floor", "WETLINE-wall", "WETLINE-open",
                               "WETLINE-wall"]):
        msp.add_line(pts[i], pts[(i + 1) % 4], dxfattribs={"layer": layer})
    msp.add_lwpolyline(pts[::-1], close=True, dxfattribs={"layer": "MY-OUTLINE"})
    section, warnings = read_outline(save(doc, tmp_path))
    # drawn the other way round: edge i of the polyline is line (2 - i) mod 4
    assert section.parts == ("open", "wall", "floor", "wall") and warnings == []


def test_wetline_outline_with_a_missing_part_line_warns(tmp_path):
    section = Section.build([[0, 0], [2, 0], [2, 1], [0, 1]],
                            parts=["floor", "wall", "open", "wall"])
    path = tmp_path / "box.dxf"
    write_outline(section, path)
    doc = ezdxf.readfile(path)
    msp = doc.modelspace()
    msp.delete_entity(msp.query("LINE")[2])
    doc.saveas(path)
    back, warnings = read_outline(path)
    assert back.parts == ("wall",) * 4
    assert warnings == ["1 edge of this Wetline outline has no part line; parts not "
                        "recovered (all 'wall')"]


def test_write_is_atomic_and_replaces(tmp_path):
    section = Section.build([[0, 0], [2, 0], [2, 1], [0, 1]])
    path = tmp_path / "box.dxf"
    path.write_text("old")
    write_outline(section, path)
    assert os.listdir(tmp_path) == ["box.dxf"]  # no temporary file left
    assert read_outline(path)[0].area == pytest.approx(2.0)
    with pytest.raises(DxfError, match="'furlong' has no DXF unit code"):
        write_outline(section, tmp_path / "f.dxf", unit="furlong")
    assert os.listdir(tmp_path) == ["box.dxf"]


# ------------------------------------------- damaged and oversized drawings
def test_a_utf8_byte_order_mark_is_accepted(tmp_path):
    # Some editors save text with a UTF-8 byte-order mark (EF BB BF, the
    # Unicode Standard, sec. 23.8); the drawing behind it is plain DXF.
    doc, msp = drawing(units=4)
    msp.add_lwpolyline(SUMP_MM, close=True, dxfattribs={"layer": "OUTLINE"})
    plain = save(doc, tmp_path, "plain.dxf")
    marked = tmp_path / "marked.dxf"
    marked.write_bytes(b"\xef\xbb\xbf" + plain.read_bytes())
    (a,), (b,) = list_outlines(plain), list_outlines(marked)
    assert (b.layer, b.handle, b.unit, b.warnings) == (a.layer, a.handle, "mm", ())
    np.testing.assert_array_equal(b.vertices, a.vertices)


def test_a_byte_order_mark_before_garbage_is_still_not_a_dxf(tmp_path):
    path = tmp_path / "notes.dxf"
    path.write_bytes(b"\xef\xbb\xbfthis is a shopping list\neggs\n")
    with pytest.raises(DxfError, match=r"^notes.dxf is not a DXF file$"):
        list_outlines(path)


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
@pytest.mark.parametrize("column", [0, 1])
def test_a_non_finite_coordinate_is_named_with_its_vertex(tmp_path, bad, column):
    doc, msp = drawing(units=4)
    pts = [list(p) for p in SUMP_MM]
    pts[2][column] = bad
    e = msp.add_lwpolyline(pts, close=True, dxfattribs={"layer": "OUTLINE"})
    with pytest.raises(DxfError) as err:
        list_outlines(save(doc, tmp_path))
    assert str(err.value) == (
        "drawing.dxf has no usable closed polyline (found closed LWPOLYLINE "
        f"{e.dxf.handle} on layer OUTLINE with a non-finite coordinate at vertex 2)")


def test_a_non_finite_vertex_of_a_2d_polyline_is_named_too(tmp_path):
    doc, msp = drawing(units=6)
    e = msp.add_polyline2d([(0, 0), (2, 0), (2, math.nan), (0, 2)], close=True)
    with pytest.raises(DxfError, match=rf"found closed POLYLINE {e.dxf.handle} on layer 0 "
                                       r"with a non-finite coordinate at vertex 2\)$"):
        list_outlines(save(doc, tmp_path))


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_a_non_finite_bulge_is_refused_naming_the_polyline(tmp_path, bad):
    doc, msp = drawing(units=6)
    e = msp.add_lwpolyline([(0, 0, 0), (2, 0, bad), (2, 2, 0), (0, 2, 0)], format="xyb",
                           close=True, dxfattribs={"layer": "OUTLINE"})
    with pytest.raises(DxfError) as err:
        list_outlines(save(doc, tmp_path))
    assert str(err.value) == (
        "drawing.dxf has no usable closed polyline (found closed LWPOLYLINE "
        f"{e.dxf.handle} on layer OUTLINE with a non-finite bulge at vertex 1)")


def test_a_damaged_polyline_beside_a_good_one_is_skipped_with_a_warning(tmp_path):
    doc, msp = drawing(units=4)
    msp.add_lwpolyline(SUMP_MM, close=True, dxfattribs={"layer": "OUTLINE"})
    bad = msp.add_lwpolyline([(0, 0), (math.nan, 0), (1, 1)], close=True,
                             dxfattribs={"layer": "JUNK"})
    (o,) = list_outlines(save(doc, tmp_path))
    assert o.layer == "OUTLINE"
    assert o.warnings == (f"skipped closed LWPOLYLINE {bad.dxf.handle} on layer JUNK with "
                          "a non-finite coordinate at vertex 1",)


def test_a_polyline_with_more_vertices_than_the_limit_is_refused_at_once(tmp_path,
                                                                        monkeypatch):
    # core.limits.MAX_VERTICES (200,000) lowered so that the drawing stays small.
    import wetline.core.dxf_io as dxf_io

    monkeypatch.setattr(dxf_io, "MAX_VERTICES", 40)
    doc, msp = drawing(units=6)
    t = np.linspace(0, 2 * np.pi, 41, endpoint=False)
    e = msp.add_lwpolyline(np.c_[np.cos(t), np.sin(t)].tolist(), close=True)
    with pytest.raises(DxfError, match=rf"found closed LWPOLYLINE {e.dxf.handle} on layer 0 "
                                       r"with 41 vertices, more than the 40 an outline may "
                                       r"have\)$"):
        list_outlines(save(doc, tmp_path))
    monkeypatch.setattr(dxf_io, "MAX_VERTICES", 41)  # the limit itself is allowed
    (o,) = list_outlines(save(doc, tmp_path))
    assert o.n_vertices == 41


def test_arcs_that_would_flatten_beyond_the_vertex_limit_are_refused(tmp_path):
    # A semicircle of radius 1000 m within 1e-9 m: each chord may span
    # 4 asin(sqrt(s / 2r)) = 2.8e-6 rad, so pi needs 1.1 million chords
    # (sagitta s = r (1 - cos(phi / 2)), common practice), over core.limits.MAX_VERTICES.
    doc, msp = drawing(units=6)
    e = msp.add_lwpolyline([(0, 0, 1.0), (2000, 0, 0), (2000, 2000, 0), (0, 2000, 0)],
                           format="xyb", close=True)
    with pytest.raises(DxfError) as err:
        list_outlines(save(doc, tmp_path), arc_tolerance=1e-9)
    assert str(err.value) == (
        "drawing.dxf has no usable closed polyline (found closed LWPOLYLINE "
        f"{e.dxf.handle} on layer 0 with 1110724 vertices once its arcs are flattened, more "
        "than the 200000 an outline may have: give a larger arc tolerance)")


def test_a_coordinate_beyond_the_limit_is_named(tmp_path):
    # core.limits.COORDINATE_LIMIT: 1e7 m; 2e10 mm is 2e7 m.
    doc, msp = drawing(units=4)
    e = msp.add_lwpolyline([(0, 0), (1000, 0), (1000, 2e10), (0, 1000)], close=True)
    with pytest.raises(DxfError, match=rf"found closed LWPOLYLINE {e.dxf.handle} on layer 0 "
                                       r"with vertex 2 at 2e\+07 m from the origin, beyond "
                                       r"the 1e\+07 m Wetline reads\)$"):
        list_outlines(save(doc, tmp_path))


def test_a_file_over_the_size_limit_is_refused_before_reading(tmp_path):
    # core.limits.MAX_FILE_BYTES is 64 MiB; a sparse file of that size plus
    # one byte takes no room on disk.
    path = tmp_path / "huge.dxf"
    with open(path, "wb") as fh:
        fh.truncate(64 * 1024 * 1024 + 1)
    with pytest.raises(DxfError, match=r"^huge.dxf is larger than the 64 MiB Wetline reads "
                                       r"\(64\.0 MiB\)$"):
        list_outlines(path)


def test_the_area_of_an_outline_far_from_the_origin_is_exact(tmp_path):
    # Site coordinates: a star 2 m across at x = 5,000 km. Reference: the
    # shoelace formula in exact rational arithmetic on the stored floats.
    from fractions import Fraction

    pts = star(9, 4) + [5e6, 0.0]
    doc, msp = drawing(units=6)
    msp.add_lwpolyline(pts.tolist(), close=True)
    (o,) = list_outlines(save(doc, tmp_path))
    v = [(Fraction(x), Fraction(z)) for x, z in o.vertices.tolist()]
    exact = abs(sum(v[i][0] * v[i - 1][1] - v[i - 1][0] * v[i][1] for i in range(len(v)))) / 2
    assert o.area == pytest.approx(float(exact), rel=1e-15)


@pytest.mark.parametrize("pts, fmt, tolerance", [
    ([(0, 0), (1e-320, 0), (1e-320, 1e-320)], "xy", None),        # subnormal drawing
    ([(0, 0, 1), (1e-300, 0, 0), (1e-300, 1e-300, 0)], "xyb", 1e-3),  # tolerance >> chord
    ([(0, 0, 5e-324), (1, 0, 0), (1, 1, 0)], "xyb", 1e-9),        # a bulge of one ulp
    ([(0, 0, -1e300), (1, 0, 0), (1, 1, 0)], "xyb", 1e-9),        # nearly a full turn
    ([(0, 0), (1e300, 0), (1e300, 1e300)], "xy", None),           # far beyond the limit
])
def test_extreme_drawings_give_an_answer_and_no_numpy_warning(tmp_path, pts, fmt, tolerance):
    doc, msp = drawing(units=6)
    msp.add_lwpolyline(pts, format=fmt, close=True)
    msp.add_line((1e300, 1e300), (-1e300, 0), dxfattribs={"layer": "WETLINE-wall"})
    path = save(doc, tmp_path)
    with np.errstate(over="raise", divide="raise", invalid="raise"):
        try:
            outlines = list_outlines(path, arc_tolerance=tolerance)
        except DxfError as exc:
            assert str(exc).startswith("drawing.dxf has no ")
        else:
            assert all(np.isfinite(o.vertices).all() for o in outlines)
