"""Every kind of result checked against a named published source or closed form.

The check values and their tolerances are those of the project's reference
list (shared REFERENCES.md). Each check names its source in a comment. Book
answers are printed to three or four figures and use the book's own g or unit
weight; the tests use that same g. Where a value is a closed form the test
recomputes it here from the formula and compares to 1e-9 relative, and
compares the printed figure separately with a tolerance fitting its rounding.

Curved walls are polygons in Wetline. Those tests build the arc with n
straight edges and check (a) the engine against the exact integral over that
polygon, to 1e-9, and (b) the polygon against the arc's value within a bound
derived from n (the error of an inscribed polygon falls as 1/n^2), and show
the order of convergence by comparing n and 2n.

Not modelled: the circular gate in a sloped wall (Munson, Young & Okiishi,
Example 2.6: D = 4 m, wall at 60 deg, 1.23 MN). A circle is a plane area in
3-D; a Wetline section is either a prism (every plane wall is a rectangle
``width`` deep) or a solid of revolution about a vertical axis, and neither
can hold a circular plate in an inclined wall. No test pretends to.
"""

import math

import numpy as np
import pytest
import shapely
from fluids.geometry import TANK, V_from_h, V_vertical_conical

from wetline.core.fill import capacity, level_for_volume, volume_below
from wetline.core.hydrostatics import solve
from wetline.core.section import Section
from wetline.core.section_file import case_from_dict

G0 = 9.80665  # standard gravity [m/s2], exact: 3rd CGPM (1901), SI Brochure
RHO_W = 1000.0  # [kg/m3], the density the textbooks use for water
TIGHT = 1e-9  # relative tolerance of a check against a closed form

# Exact definitions: 1 ft = 0.3048 m (international foot, 1959);
# 1 lb = 0.45359237 kg (same agreement); 1 lbf = 1 lb x g0 = 4.4482216152605 N.
FT = 0.3048
LB = 0.45359237
LBF = LB * G0


def arc(centre, radius, t0, t1, n):
    """n + 1 points on a circular arc from angle t0 to t1 [rad], ends exact."""
    t = np.linspace(t0, t1, n + 1)
    pts = np.column_stack([centre[0] + radius * np.cos(t), centre[1] + radius * np.sin(t)])
    return pts


def part_sum(r, part, values):
    """Sum of a per-edge array over the edges of one part."""
    mask = np.array([p == part for p in r.section.parts])
    return float(np.sum(values[mask]))


# ---------------------------------------------------------------- plane walls


def test_vertical_wall_per_metre():
    # Standard formula F = rho g H^2 / 2 acting H/3 above the base
    # (Cengel & Cimbala, Fluid Mechanics, sec. 3-4; Munson et al., sec. 2.8).
    H = 3.0
    s = Section.build([[0, 0], [2, 0], [2, H], [0, H]], parts=["floor", "wall", "open", "wall"])
    r = solve(s, H, RHO_W, G0)
    F = RHO_W * G0 * H**2 / 2
    assert r.fx[1] == pytest.approx(F, rel=TIGHT)  # right wall pushed outward (+x)
    assert r.fx[3] == pytest.approx(-F, rel=TIGHT)  # left wall pushed outward (-x)
    assert r.fz[1] == 0.0
    assert r.centre_of_pressure[1, 1] == pytest.approx(H / 3, rel=TIGHT)
    assert r.centre_of_pressure[3, 1] == pytest.approx(H / 3, rel=TIGHT)
    # REFERENCES.md: printed 44.130 kN/m (rounding of the last digit: 0.5 N).
    assert r.fx[1] / 1e3 == pytest.approx(44.130, abs=5e-4)


def test_pool_wall():
    # Cengel & Cimbala, end-of-chapter problem ("aboveground pool"), printed
    # answer: 4 m wide wall, 1.5 m deep, g = 9.81: 44.1 kN at 0.5 m above the
    # floor; tolerance 0.1 kN. The section's width is the wall's 4 m.
    g = 9.81
    s = Section.build([[0, 0], [4, 0], [4, 1.5], [0, 1.5]],
                      parts=["floor", "wall", "open", "wall"], width=4.0)
    r = solve(s, 1.5, RHO_W, g)
    assert r.fx[1] / 1e3 == pytest.approx(44.1, abs=0.1)
    # Closed form rho g H^2 w / 2 at H/3 (same book, sec. 3-4).
    assert r.fx[1] == pytest.approx(RHO_W * g * 1.5**2 / 2 * 4.0, rel=TIGHT)
    assert r.centre_of_pressure[1, 1] == pytest.approx(0.5, rel=TIGHT)


def test_submerged_door():
    # Cengel & Cimbala, worked example (car in a lake), from memory, recomputed:
    # a door 1.2 m wide and 1 m high with its top edge 8 m below the surface,
    # g = 9.81: F = rho g h_c A = 100.06 kN (book 100 kN), centre of pressure
    # y_p = y_c + I_xx / (y_c A) = 8.510 m deep; tolerance 0.5 %.
    #
    # How it is modelled: the pressure depends only on depth, so the load on
    # the door is exactly the load on a 1.2 m wide strip of a vertical wall
    # between depths 8 m and 9 m. The section is prismatic with its
    # out-of-plane width set to the door's 1.2 m; its right wall is split so
    # that one edge, the part "door", spans heights 2 m to 3 m, and the water
    # stands at 11 m, so the door's top edge is 8 m deep.
    g, w, b, top_depth = 9.81, 1.2, 1.0, 8.0
    z_bottom, level = 2.0, 11.0
    s = Section.build(
        [[0, 0], [3, 0], [3, z_bottom], [3, z_bottom + b], [3, 12], [0, 12]],
        parts=["floor", "wall", "door", "wall", "open", "wall"], width=w)
    r = solve(s, level, RHO_W, g)
    door = r.parts["door"]
    hc = top_depth + b / 2
    F = RHO_W * g * hc * w * b
    y_p = hc + (w * b**3 / 12) / (hc * w * b)
    assert door.fx == pytest.approx(F, rel=TIGHT)
    assert door.fz == 0.0
    cp_depth = level - r.centre_of_pressure[2, 1]
    assert cp_depth == pytest.approx(y_p, rel=TIGHT)
    assert r.centre_of_pressure[2, 0] == 3.0
    # The book's printed figures, 0.5 %.
    assert door.fx / 1e3 == pytest.approx(100.0, rel=5e-3)
    assert cp_depth == pytest.approx(8.510, rel=5e-3)


def test_inclined_plane_60_degrees():
    # Derived, common practice (REFERENCES.md "Inclined plane per metre"):
    # a plane wall at 60 deg from the horizontal, water 3 m deep, g0.
    # Normal force rho g (H/2) L with L = H / sin 60 the wetted slant length;
    # horizontal component = force on the vertical projection, rho g H^2/2;
    # vertical component = weight of the wedge of water above the wall,
    # rho g H (H / tan 60) / 2; centre of pressure 2/3 of the way down the
    # slant from the surface. Tolerance 1e-9.
    H, beta = 3.0, math.radians(60.0)
    run = H / math.tan(beta)
    bottom, top = np.array([2.0, 0.0]), np.array([2.0 + run, H])
    s = Section.build([[0, 0], bottom, top, [0, H]], parts=["floor", "slope", "open", "wall"])
    r = solve(s, H, RHO_W, G0)
    L = H / math.sin(beta)
    normal = RHO_W * G0 * H / 2 * L
    horizontal = RHO_W * G0 * H**2 / 2
    wedge = RHO_W * G0 * H * run / 2
    assert r.resultant[1] == pytest.approx(normal, rel=TIGHT)
    assert r.fx[1] == pytest.approx(horizontal, rel=TIGHT)
    assert r.fz[1] == pytest.approx(-wedge, rel=TIGHT)  # pushed down
    cp = r.centre_of_pressure[1]
    assert np.linalg.norm(cp - top) == pytest.approx(2 / 3 * L, rel=TIGHT)
    assert np.linalg.norm(cp - bottom) == pytest.approx(L / 3, rel=TIGHT)
    # The force is normal to the wall: (fx, fz) parallel to (sin b, -cos b).
    assert r.fx[1] * math.cos(beta) + r.fz[1] * math.sin(beta) == pytest.approx(
        0.0, abs=TIGHT * normal)
    # Printed figures: 50.957 / 44.130 / 25.478 kN/m, 2.309 m (last digit).
    assert r.resultant[1] / 1e3 == pytest.approx(50.957, abs=5e-4)
    assert r.fx[1] / 1e3 == pytest.approx(44.130, abs=5e-4)
    assert -r.fz[1] / 1e3 == pytest.approx(25.478, abs=5e-4)
    assert np.linalg.norm(cp - top) == pytest.approx(2.309, abs=5e-4)


# ------------------------------------------------------------ curved surfaces


def _cylinder_gate(n):
    """Cengel & Cimbala's gravity-controlled cylindrical gate: a cylinder of
    R = 0.8 m lying on the floor (centre (0, R)), water to its left 5 m deep.
    The lower-left quarter of the cylinder, from its bottom (0, 0) to its
    side (-R, R), is n straight edges of part "gate"; the water under that
    quarter is part of the cavity, as in the book's free body."""
    R = 0.8
    gate = arc((0.0, R), R, -math.pi / 2, -math.pi, n)
    outline = np.vstack([[[-4.0, 0.0]], gate, [[-R, 6.0], [-4.0, 6.0]]])
    parts = ["floor"] + ["gate"] * n + ["wall", "open", "wall"]
    return Section.build(outline, parts=parts), R


def _cylinder_gate_loads(n):
    s, R = _cylinder_gate(n)
    r = solve(s, 5.0, RHO_W, 9.81)
    return r.parts["gate"], R


def test_cylindrical_gate_polygon_exact():
    # Exact polygon integral (closed form, common practice): the horizontal
    # force on any surface equals that on its vertical projection, rho g h_c A,
    # whatever the shape; the vertical force is the weight of water between
    # the polygon and the free surface, rho g (h R - R^2 + pi R^2 / 4) for the
    # arc, less the n circular segments cut off by the chords,
    # n R^2 (theta - sin theta) / 2 with theta = (pi/2) / n.
    g, h = 9.81, 5.0
    for n in (4, 16, 64):
        gate, R = _cylinder_gate_loads(n)
        theta = (math.pi / 2) / n
        fh = RHO_W * g * (h - R / 2) * R
        fv_arc = RHO_W * g * (h * R - R**2 + math.pi * R**2 / 4)
        segments = n * R**2 * (theta - math.sin(theta)) / 2
        assert gate.fx == pytest.approx(fh, rel=TIGHT)
        assert gate.fz == pytest.approx(fv_arc - RHO_W * g * segments, rel=TIGHT)


def test_cylindrical_gate_converges_to_the_arc():
    # Cengel & Cimbala, worked example (gravity-controlled cylindrical gate),
    # R = 0.8 m, 5 m deep, 1 m long, g = 9.81: horizontal 36.10 kN, vertical
    # net 37.89 kN, resultant 52.34 kN at 46.4 deg; tolerance 0.2 %.
    g, h = 9.81, 5.0
    R = 0.8
    fv_arc = RHO_W * g * (h * R - R**2 + math.pi * R**2 / 4)
    errors = {}
    for n in (8, 16, 32, 64):
        gate, _ = _cylinder_gate_loads(n)
        err = fv_arc - gate.fz
        # Bound from n: segment area theta - sin theta <= theta^3 / 6, so the
        # polygon's shortfall is at most rho g R^2 (pi/2)^3 / (12 n^2).
        bound = RHO_W * g * R**2 * (math.pi / 2) ** 3 / (12 * n**2)
        assert 0 < err <= bound
        errors[n] = err
    # Second order: doubling n divides the error by 4.
    for n in (8, 16, 32):
        assert errors[n] / errors[2 * n] == pytest.approx(4.0, rel=0.02)
        assert math.log2(errors[n] / errors[2 * n]) == pytest.approx(2.0, abs=0.01)
    gate, _ = _cylinder_gate_loads(64)  # shortfall below 0.5 N: 1e-5 relative
    resultant = math.hypot(gate.fx, gate.fz)
    angle = math.degrees(math.atan2(gate.fz, gate.fx))
    assert gate.fx / 1e3 == pytest.approx(36.10, rel=2e-3)
    assert gate.fz / 1e3 == pytest.approx(37.89, rel=2e-3)  # upward
    assert resultant / 1e3 == pytest.approx(52.34, rel=2e-3)
    assert angle == pytest.approx(46.4, rel=2e-3)


def _munson_conduit(m):
    """Munson et al., Example 2.9: a 6 ft drainage conduit half full of water,
    drawn as a circle of 4m edges in a section file in feet, 1 ft long
    (width 1 in the file's unit). BC, the quarter from the bottom C to the
    side B at the centre line, is the part "BC" (m edges).

    Units: the book's unit weight is gamma = 62.4 lbf/ft3. With g = g0 that is
    a density of 62.4 lb/ft3 = 62.4 x 0.45359237 / 0.3048^3 kg/m3 (exact
    definitions of lb and ft), so rho g0 is exactly 62.4 lbf/ft3 in SI. The
    engine answers in N; dividing by 1 lbf = 0.45359237 x 9.80665 N gives lb.
    """
    R = 3.0  # ft
    ring = arc((0.0, R), R, -math.pi / 2, 3 * math.pi / 2, 4 * m)[:-1]  # from C, CCW
    parts = ["BC"] * m + ["wall"] * (3 * m)
    case = case_from_dict({
        "format": "wetline-section", "version": 1, "length_unit": "ft",
        "geometry": {"kind": "plane", "width": 1.0},
        "outline": ring.tolist(), "parts": parts,
        "fluid": {"density": 62.4 * LB / FT**3},
        "gravity": G0,
        "fill": {"level": R},
    })
    return case, R


def test_half_full_conduit_quarter_circle():
    # Munson, Young & Okiishi, Fundamentals of Fluid Mechanics, Example 2.9
    # (from memory, recomputed): horizontal 281 lb acting 1 ft above the
    # bottom; vertical 441 lb (the weight of water above BC) acting
    # 4R/(3 pi) = 1.27 ft from the vertical centre line; resultant 523 lb;
    # tolerance 0.5 %.
    gamma = 62.4  # lbf/ft3
    errors = {}
    for m in (4, 8, 16, 32, 64):
        case, R = _munson_conduit(m)
        r = case.solve()
        assert r.level == pytest.approx(R * FT, rel=TIGHT)
        fx = part_sum(r, "BC", r.fx) / LBF
        fz = part_sum(r, "BC", r.fz) / LBF
        cp = r.centre_of_pressure
        mask = np.array([p == "BC" for p in case.section.parts])
        z_h = float(np.sum(r.fx[mask] * cp[mask, 1]) / np.sum(r.fx[mask])) / FT
        x_v = float(np.sum(r.fz[mask] * cp[mask, 0]) / np.sum(r.fz[mask])) / FT
        # Exact polygon integral: horizontal = force on the vertical
        # projection, gamma (R/2) R, at R/3 above the bottom for any polygon;
        # vertical = weight of the water above BC, a fan of m triangles from
        # the centre, area m R^2 sin(theta) / 2 with theta = (pi/2)/m, acting
        # through the fan's centroid.
        theta = (math.pi / 2) / m
        pts = arc((0.0, R), R, -math.pi / 2, 0.0, m)
        tri = 0.5 * (pts[:-1, 0] * (pts[1:, 1] - R) - pts[1:, 0] * (pts[:-1, 1] - R))
        tri_x = (pts[:-1, 0] + pts[1:, 0]) / 3
        fan_area = m * R**2 * math.sin(theta) / 2
        assert np.sum(np.abs(tri)) == pytest.approx(fan_area, rel=TIGHT)
        assert fx == pytest.approx(gamma * R / 2 * R, rel=TIGHT)
        assert z_h == pytest.approx(R / 3, rel=TIGHT)
        assert -fz == pytest.approx(gamma * fan_area, rel=TIGHT)  # pushed down
        assert x_v == pytest.approx(float(np.sum(np.abs(tri) * tri_x)) / fan_area, rel=TIGHT)
        # Arc value: a quarter disc, shortfall of the inscribed polygon at most
        # R^2 (pi/2)^3 / (12 m^2) of area.
        quarter = math.pi * R**2 / 4
        err = gamma * quarter - (-fz)
        assert 0 < err <= gamma * R**2 * (math.pi / 2) ** 3 / (12 * m**2)
        errors[m] = err
    for m in (4, 8, 16, 32):
        assert math.log2(errors[m] / errors[2 * m]) == pytest.approx(2.0, abs=0.02)
    # Book figures with m = 64 (polygon shortfall 1.3e-4 relative).
    assert fx == pytest.approx(281, rel=5e-3)
    assert -fz == pytest.approx(441, rel=5e-3)
    assert math.hypot(fx, fz) == pytest.approx(523, rel=5e-3)
    assert z_h == pytest.approx(1.0, rel=5e-3)
    assert x_v == pytest.approx(1.27, rel=5e-3)
    assert x_v == pytest.approx(4 * R / (3 * math.pi), rel=5e-3)


def _roller_gate(n):
    """Bansal's semicircular roller gate: a cylinder of D = 4 m, L = 8 m
    (the section's width) lying on the floor, centre (0, 2); water to its left
    up to its crest (level 4 m). The wetted half, from the bottom round the
    left side to the crest, is n straight edges of part "gate"."""
    R = 2.0
    gate = arc((0.0, R), R, -math.pi / 2, -3 * math.pi / 2, n)
    outline = np.vstack([[[-6.0, 0.0]], gate, [[-6.0, 2 * R]]])
    parts = ["floor"] + ["gate"] * n + ["open", "wall"]
    s = Section.build(outline, parts=parts, width=8.0)
    return solve(s, 2 * R, RHO_W, 9.81), R


def test_semicircular_roller_gate():
    # R.K. Bansal, Fluid Mechanics and Hydraulic Machines (attribution from
    # memory): D = 4 m, L = 8 m, water at the crest, g = 9.81: horizontal
    # 627.8 kN, vertical 493.1 kN up, resultant 798.3 kN at 38.15 deg; 0.2 %.
    g, L = 9.81, 8.0
    errors = {}
    for n in (8, 16, 32, 64, 128):
        r, R = _roller_gate(n)
        gate = r.parts["gate"]
        # Exact polygon integral: horizontal on the projection rho g R (2R) L;
        # vertical = buoyancy of the half polygon (fan of n triangles,
        # area n R^2 sin(pi/n) / 2): the upper half is pushed down by the
        # water above it, the lower half up by the water column above it.
        fh = RHO_W * g * R * 2 * R * L
        fan = n * R**2 * math.sin(math.pi / n) / 2
        assert gate.fx == pytest.approx(fh, rel=TIGHT)
        assert gate.fz == pytest.approx(RHO_W * g * fan * L, rel=TIGHT)
        half_disc = math.pi * R**2 / 2
        err = RHO_W * g * L * (half_disc - fan)
        # Bound from n: R^2 pi^3 / (12 n^2) of area.
        assert 0 < err <= RHO_W * g * L * R**2 * math.pi**3 / (12 * n**2)
        errors[n] = RHO_W * g * L * half_disc - gate.fz
    for n in (8, 16, 32, 64):
        assert math.log2(errors[n] / errors[2 * n]) == pytest.approx(2.0, abs=0.02)
    # n = 128: shortfall 1e-4 relative.
    assert gate.fx / 1e3 == pytest.approx(627.8, rel=2e-3)
    assert gate.fz / 1e3 == pytest.approx(493.1, rel=2e-3)
    assert math.hypot(gate.fx, gate.fz) / 1e3 == pytest.approx(798.3, rel=2e-3)
    assert math.degrees(math.atan2(gate.fz, gate.fx)) == pytest.approx(38.15, rel=2e-3)


# ----------------------------------------------- floor force and walls' share
# Principle (REFERENCES.md "Floor force and the walls' share"): the pressure
# on a floor depends on its depth only (Cengel & Cimbala sec. 3-1; Munson
# sec. 2.3), so the floor force is rho g H A_floor whatever the walls do; the
# walls take the difference between it and the weight (totals: common
# practice). Tolerance 1e-9 against the formula recomputed here; the printed
# figures (0.01 kN) are compared to within half their last digit.

PRINTED = 5e-3 + 1e-9  # [kN], half the last printed digit of 0.01 kN


def test_floor_force_rectangle_and_narrowing_section():
    H, b = 2.0, 5.0
    rect = Section.build([[0, 0], [b, 0], [b, H], [0, H]], parts=["floor", "wall", "open", "wall"])
    # Walls slope inward at 45 deg from the 5 m floor to a 1 m top.
    narrow = Section.build([[0, 0], [b, 0], [3, H], [2, H]],
                           parts=["floor", "wall", "open", "wall"])
    floor = RHO_W * G0 * H * b
    overhang = RHO_W * G0 * (H * H / 2)  # triangle of water above each wall
    water = RHO_W * G0 * (b + 1.0) / 2 * H
    r1, r2 = solve(rect, H, RHO_W, G0), solve(narrow, H, RHO_W, G0)
    assert r1.floor_force == pytest.approx(floor, rel=TIGHT)
    assert r2.floor_force == pytest.approx(floor, rel=TIGHT)
    assert r1.support_reaction == pytest.approx(0.0, abs=TIGHT * floor)
    assert r2.fluid_weight == pytest.approx(water, rel=TIGHT)
    assert -r2.fz[1] == pytest.approx(-overhang, rel=TIGHT)  # pushed up
    assert -r2.fz[3] == pytest.approx(-overhang, rel=TIGHT)
    assert r2.parts["wall"].down == pytest.approx(-2 * overhang, rel=TIGHT)
    assert r2.support_reaction == pytest.approx(water - floor, rel=TIGHT)
    # Printed: floor 98.07 kN/m for both; water 58.84; overhang 19.61 up;
    # walls' net -39.23 kN/m.
    assert r1.floor_force / 1e3 == pytest.approx(98.07, abs=PRINTED)
    assert r2.floor_force / 1e3 == pytest.approx(98.07, abs=PRINTED)
    assert r2.fluid_weight / 1e3 == pytest.approx(58.84, abs=PRINTED)
    assert r2.fz[1] / 1e3 == pytest.approx(19.61, abs=PRINTED)
    assert r2.parts["wall"].down / 1e3 == pytest.approx(-39.23, abs=PRINTED)


def test_floor_force_flaring_section():
    H = 2.0
    s = Section.build([[2, 0], [3, 0], [5, H], [0, H]], parts=["floor", "wall", "open", "wall"])
    r = solve(s, H, RHO_W, G0)
    floor = RHO_W * G0 * H * 1.0
    water = RHO_W * G0 * (1.0 + 5.0) / 2 * H
    assert r.floor_force == pytest.approx(floor, rel=TIGHT)
    assert r.fluid_weight == pytest.approx(water, rel=TIGHT)
    assert r.support_reaction == pytest.approx(water - floor, rel=TIGHT)  # walls carry it down
    # Printed: floor 19.61 kN/m; water 58.84; walls 39.23 down.
    assert r.floor_force / 1e3 == pytest.approx(19.61, abs=PRINTED)
    assert r.fluid_weight / 1e3 == pytest.approx(58.84, abs=PRINTED)
    assert r.support_reaction / 1e3 == pytest.approx(39.23, abs=PRINTED)


def test_floor_force_axisymmetric_cylinder_and_frustum():
    H, R, r_top = 2.0, 2.0, 1.0
    parts = ["floor", "wall", "open", "axis"]
    cyl = Section.build([[0, 0], [R, 0], [R, H], [0, H]], parts=parts, kind="axisymmetric")
    fru = Section.build([[0, 0], [R, 0], [r_top, H], [0, H]], parts=parts, kind="axisymmetric")
    floor = RHO_W * G0 * H * math.pi * R**2
    # Frustum volume pi H (R^2 + R r + r^2) / 3 (common geometry).
    water = RHO_W * G0 * math.pi * H * (R**2 + R * r_top + r_top**2) / 3
    a, b = solve(cyl, H, RHO_W, G0), solve(fru, H, RHO_W, G0)
    assert a.floor_force == pytest.approx(floor, rel=TIGHT)
    assert b.floor_force == pytest.approx(floor, rel=TIGHT)
    assert a.fluid_weight == pytest.approx(floor, rel=TIGHT)
    assert b.fluid_weight == pytest.approx(water, rel=TIGHT)
    assert b.parts["wall"].down == pytest.approx(water - floor, rel=TIGHT)  # lifted
    assert b.parts["wall"].fx is None  # no net horizontal force over a revolution
    # Printed: both floors 246.47 kN; frustum water 143.77 kN; wall lifted 102.70 kN.
    assert a.floor_force / 1e3 == pytest.approx(246.47, abs=PRINTED)
    assert b.floor_force / 1e3 == pytest.approx(246.47, abs=PRINTED)
    assert b.fluid_weight / 1e3 == pytest.approx(143.77, abs=PRINTED)
    # The printed lift is the difference of the two rounded figures above
    # (246.47 - 143.77), so it carries both roundings: 0.01 kN.
    assert -b.parts["wall"].down / 1e3 == pytest.approx(102.70, abs=2 * PRINTED)


def test_lid_under_a_standpipe():
    # Common practice (REFERENCES.md "Lid under a standpipe"): a closed box,
    # lid 2 m wide (per metre), water standing 1.5 m above the lid's underside
    # in a standpipe: the lid is pushed up by rho g 1.5 x 2 = 29.42 kN/m at
    # its centroid. Tolerance 1e-9.
    s = Section.build([[0, 0], [2, 0], [2, 1], [0, 1]], parts=["floor", "wall", "lid", "wall"])
    r = solve(s, 2.5, RHO_W, G0)
    up = RHO_W * G0 * 1.5 * 2.0
    assert r.parts["lid"].fz == pytest.approx(up, rel=TIGHT)
    assert r.parts["lid"].down == pytest.approx(-up, rel=TIGHT)
    np.testing.assert_allclose(r.centre_of_pressure[2], [1.0, 1.0], rtol=TIGHT)
    assert r.parts["lid"].fz / 1e3 == pytest.approx(29.42, abs=PRINTED)
    assert r.head_above_top == pytest.approx(1.5, rel=TIGHT)
    assert any("standpipe head" in w for w in r.warnings)


# --------------------------------------------------------- volume and level


def test_cone_with_cylinder_against_fluids():
    # fluids.geometry.V_vertical_conical(D, a, h): vertical tank with a conical
    # bottom of depth a (REFERENCES.md; V = pi/12 at D = 2, a = 2, h = 1).
    # The section: cone of radius 1 m, 2 m deep, apex down, under a cylinder
    # 3 m high, revolved about x = 0. Tolerance 1e-9.
    s = Section.build([[0, 0], [1, 2], [1, 5], [0, 5]],
                      parts=["cone", "shell", "open", "axis"], kind="axisymmetric")
    assert volume_below(s, 1.0) == pytest.approx(math.pi / 12, rel=TIGHT)
    for h in (0.25, 1.0, 1.9, 2.0, 2.5, 4.2, 5.0):
        assert volume_below(s, h) == pytest.approx(V_vertical_conical(2.0, 2.0, h), rel=TIGHT)
    tank = TANK(D=2.0, L=3.0, horizontal=False, sideA="conical", sideA_a=2.0)
    assert capacity(s) == pytest.approx(tank.V_total, rel=TIGHT)


def test_frustum_volume():
    # V = pi h (R^2 + R r + r^2) / 3 (frustum of a cone): r 0.5 -> 1 over 1 m,
    # 1.832596 m3 (REFERENCES.md). Tolerance 1e-9.
    s = Section.build([[0, 0], [0.5, 0], [1, 1], [0, 1]], kind="axisymmetric")
    exact = math.pi * 1.0 * (1.0 + 0.5 + 0.25) / 3
    assert volume_below(s, 1.0) == pytest.approx(exact, rel=TIGHT)
    assert volume_below(s, 1.0) == pytest.approx(1.832596, abs=5e-7)
    # Part-way up: radius 0.5 + 0.5 z.
    assert volume_below(s, 0.4) == pytest.approx(
        math.pi * 0.4 * (0.7**2 + 0.7 * 0.5 + 0.5**2) / 3, rel=TIGHT)


def _horizontal_cylinder(n, D=2.0):
    # Circle of diameter D as n straight edges (inscribed), bottom at z = 0;
    # a vertex at the bottom and, for n divisible by 4, at mid-height.
    ring = arc((0.0, D / 2), D / 2, -math.pi / 2, 3 * math.pi / 2, n)[:-1]
    return Section.build(ring), ring


def test_horizontal_cylinder_volume_by_polygon_convergence():
    # fluids.geometry.V_from_h(h, D, L, horizontal=True): circular segment
    # area x L (REFERENCES.md: D = 2 m, L = 1 m; 0.614185 m3 at h = 0.5,
    # pi/2 at h = 1.0).
    D, L = 2.0, 1.0
    R = D / 2
    assert V_from_h(0.5, D, L, horizontal=True) == pytest.approx(0.614185, abs=5e-7)
    assert V_from_h(1.0, D, L, horizontal=True) == pytest.approx(math.pi / 2, rel=TIGHT)
    errors = {}
    for n in (16, 32, 64, 128, 256):
        s, ring = _horizontal_cylinder(n)
        poly = shapely.Polygon(ring)
        for h in (0.1, 0.5, 1.0, 1.37, 2.0):
            # Exact polygon integral: the area of the polygon below h, from
            # shapely's clip (an independent exact computation).
            clipped = poly.intersection(shapely.box(-2 * D, -1.0, 2 * D, h)).area
            v = volume_below(s, h)
            assert v == pytest.approx(clipped * L, rel=TIGHT)
            # The arc: the inscribed polygon misses n segments of area
            # R^2 (theta - sin theta)/2, theta = 2 pi / n, at most
            # R^2 (2 pi)^3 / (12 n^2) in all, and below h only some of them.
            bound = R**2 * (2 * math.pi) ** 3 / (12 * n**2) * L
            arc_value = V_from_h(h, D, L, horizontal=True)
            assert 0 <= arc_value - v <= bound
        errors[n] = V_from_h(1.0, D, L, horizontal=True) - volume_below(s, 1.0)
    for n in (16, 32, 64, 128):
        assert math.log2(errors[n] / errors[2 * n]) == pytest.approx(2.0, abs=0.01)


def test_level_for_volume_against_fluids_tank():
    # fluids TANK(...).h_from_V, whose inverse is good to about 5e-7 relative
    # (REFERENCES.md; at 20 % full it is 6.5e-7 off the closed form below, so
    # the comparison allows 1e-6). A vertical tank of D = 2 m with a conical
    # bottom 2 m deep and a 3 m cylinder is exact as a section; heights from
    # the apex.
    s = Section.build([[0, 0], [1, 2], [1, 5], [0, 5]],
                      parts=["cone", "shell", "open", "axis"], kind="axisymmetric")
    tank = TANK(D=2.0, L=3.0, horizontal=False, sideA="conical", sideA_a=2.0)
    R, a = 1.0, 2.0
    v_cone = math.pi * R**2 * a / 3
    for frac in (0.001, 0.01, 0.05, 0.2, 0.5, 0.7, 0.99):
        V = frac * tank.V_total
        h = level_for_volume(s, V)
        assert h == pytest.approx(tank.h_from_V(V), rel=1e-6)
        # Closed form (cone V = pi (R h / a)^2 h / 3, then a cylinder),
        # to 1e-9: the inverse is exact, not iterated to a tolerance.
        exact = a * (V / v_cone) ** (1 / 3) if V <= v_cone else a + (V - v_cone) / (math.pi * R**2)
        assert h == pytest.approx(exact, rel=TIGHT)
        assert volume_below(s, h) == pytest.approx(V, rel=TIGHT)


def test_level_for_volume_horizontal_cylinder_against_fluids_tank():
    # TANK(D=2, L=1, horizontal=True).h_from_V (good to about 5e-7) against
    # the level in a polygon of n edges. The polygon holds less than the
    # circle below any level, by at most dV = R^2 (2 pi)^3 / (12 n^2) L
    # (see the volume test), so at equal volume its level is higher by at
    # most dV / (L b), b the chord of the circle at the lower of the two
    # levels (the narrowest free surface in between; levels below the middle).
    D, L, R = 2.0, 1.0, 1.0
    tank = TANK(D=D, L=L, horizontal=True)
    for n in (64, 1024):
        s, _ = _horizontal_cylinder(n)
        dV = R**2 * (2 * math.pi) ** 3 / (12 * n**2) * L
        for frac in (0.05, 0.2, 0.45):
            V = frac * math.pi * R**2 * L
            h_ref = tank.h_from_V(V)
            h = level_for_volume(s, V)
            chord = 2 * math.sqrt(R**2 - (R - h_ref) ** 2)
            assert h >= h_ref * (1 - 5e-7)
            assert h - h_ref <= dV / (L * chord) + 5e-7 * h_ref
            assert volume_below(s, h) == pytest.approx(V, rel=TIGHT)


# --------------------------------------------------------------- hoop force


def test_hoop_force_cylinder():
    # Membrane formula N = gamma H r (REFERENCES.md; compare the one-foot
    # method of API 650 sec. 5.6.3.2): D = 10 m, water 6 m deep, g0:
    # 294.2 kN/m at the base, 279.5 kN/m at 0.3 m up; 0.1 %.
    s = Section.build([[0, 0], [5, 0], [5, 0.3], [5, 8], [0, 8]],
                      parts=["floor", "shell", "shell", "open", "axis"], kind="axisymmetric")
    r = solve(s, 6.0, RHO_W, G0)
    assert r.hoop_start[1] == pytest.approx(RHO_W * G0 * 6.0 * 5.0, rel=TIGHT)
    assert r.hoop_end[1] == pytest.approx(RHO_W * G0 * 5.7 * 5.0, rel=TIGHT)
    assert r.hoop_start[2] == pytest.approx(RHO_W * G0 * 5.7 * 5.0, rel=TIGHT)
    assert r.hoop_start[1] / 1e3 == pytest.approx(294.2, rel=1e-3)
    assert r.hoop_end[1] / 1e3 == pytest.approx(279.5, rel=1e-3)
    # Above the water the shell carries nothing; the floor has no hoop force.
    assert r.hoop_end[2] == 0.0
    assert np.isnan(r.hoop_start[0]) and np.isnan(r.hoop_end[0])


def test_hoop_force_cone_apex_down():
    # D. Johnson, Advanced Structural Mechanics, 2nd ed. 2000, eq. 4.39;
    # Timoshenko & Woinowsky-Krieger (from memory): N = p r / cos(beta), a
    # cone apex down with its wall 45 deg from the vertical, 4 m deep: at a
    # height z above the apex r = z and p = rho g (4 - z), so
    # N = rho g (4 - z) z / cos 45, largest at mid-depth: 55.47 kN/m.
    # A vertex every 0.5 m puts the maximum at a vertex. Tolerance 1e-9.
    z = np.arange(0.0, 4.01, 0.5)
    outline = np.column_stack([z, z])  # r = z: 45 deg from the vertical
    outline = np.vstack([outline, [[0.0, 4.0]]])
    parts = ["cone"] * (len(z) - 1) + ["open", "axis"]
    s = Section.build(outline, parts=parts, kind="axisymmetric")
    r = solve(s, 4.0, RHO_W, G0)
    beta = math.radians(45.0)
    cone = slice(0, len(z) - 1)
    expected_start = RHO_W * G0 * (4 - z[:-1]) * z[:-1] / math.cos(beta)
    expected_end = RHO_W * G0 * (4 - z[1:]) * z[1:] / math.cos(beta)
    np.testing.assert_allclose(r.hoop_start[cone], expected_start, rtol=TIGHT, atol=0)
    np.testing.assert_allclose(r.hoop_end[cone], expected_end, rtol=TIGHT, atol=0)
    peak = RHO_W * G0 * 2.0 * 2.0 / math.cos(beta)
    assert np.nanmax(np.concatenate([r.hoop_start, r.hoop_end])) == pytest.approx(peak, rel=TIGHT)
    k = int(np.argmax(r.hoop_end[cone]))
    assert z[k + 1] == 2.0
    assert peak / 1e3 == pytest.approx(55.47, abs=5e-3)
    assert r.hoop_end[k] / 1e3 == pytest.approx(55.47, abs=5e-3)


# psi and feet of water against NIST SP 811 are checked through core.units in
# tests/core/test_units.py (test_psi_against_nist, test_conventional_foot_of_water).
