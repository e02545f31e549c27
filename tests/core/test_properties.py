"""Hypothesis property tests on random valid sections of both kinds.

The invariants are those of the project's physics spec (physics-and-results.md,
"Signs"): for any vented section the floor force plus the support reaction
is the weight of the liquid, rho g V, and (plane) the horizontal forces sum
to zero, both to round-off (relative 1e-9). This is Archimedes' principle /
the divergence theorem applied to the wetted boundary (Cengel & Cimbala
sec. 3-1; Munson et al. sec. 2.3). The rest are consequences of the model's
symmetries: moving the section sideways, reversing its winding or scaling
the density cannot change the loads except as stated.

Random sections are star-shaped polygons (vertices at sorted angles around a
centre, random radii), rotated, flipped, scaled and moved, some with extra
horizontal or vertical edges; anything Section.build refuses is assumed away.
"""

import math

import numpy as np
import pytest
import shapely
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from wetline.core.fill import level_for_volume, volume_below, volume_below_many
from wetline.core.hydrostatics import solve
from wetline.core.section import FLOOR, OPEN, Section, SectionError
from wetline.core.section_file import read_section_file

RTOL = 1e-9  # round-off tolerance of the spec's checks

SETTINGS = settings(max_examples=200, deadline=None,
                    suppress_health_check=[HealthCheck.filter_too_much, HealthCheck.too_slow])

PART_NAMES = ["wall", "floor", "open", "lid", "hopper"]


@st.composite
def star_outlines(draw, min_n=3, max_n=14):
    """A simple polygon: vertices at strictly increasing angles around the
    origin with radii in [0.2, 1], optionally snapped to give horizontal or
    vertical edges, then rotated, maybe mirrored, scaled and moved."""
    n = draw(st.integers(min_n, max_n))
    gaps = draw(st.lists(st.floats(0.05, 1.0), min_size=n, max_size=n))
    t = np.cumsum(gaps)
    t = 2 * np.pi * t / t[-1]  # sorted, distinct angles in (0, 2 pi]
    r = np.array(draw(st.lists(st.floats(0.2, 1.0), min_size=n, max_size=n)))
    pts = np.column_stack([r * np.cos(t), r * np.sin(t)])
    rot = draw(st.sampled_from([0.0, 0.0, math.pi / 2, draw(st.floats(0, 2 * math.pi))]))
    c, s = math.cos(rot), math.sin(rot)
    pts = pts @ np.array([[c, s], [-s, c]])
    if draw(st.booleans()):
        pts[:, 0] = -pts[:, 0]  # mirror: reverses the winding
    # Extra horizontal / vertical edges: copy one coordinate to the next vertex.
    for _ in range(draw(st.integers(0, 3))):
        i = draw(st.integers(0, n - 1))
        axis = draw(st.integers(0, 1))
        pts[(i + 1) % n, axis] = pts[i, axis]
    scale = draw(st.sampled_from([1e-3, 0.05, 1.0, 7.5, 300.0]))
    offset = np.array([draw(st.floats(-5.0, 5.0)), draw(st.floats(-5.0, 5.0))])
    return pts * scale + offset * scale


@st.composite
def plane_sections(draw, names=PART_NAMES):
    pts = draw(star_outlines())
    n = len(pts)
    parts = draw(st.lists(st.sampled_from(names), min_size=n, max_size=n))
    width = draw(st.sampled_from([1.0, 0.3, 12.0]))
    try:
        return Section.build(pts, parts=parts, width=width)
    except SectionError:
        assume(False)


@st.composite
def axisymmetric_sections(draw):
    pts = draw(star_outlines())
    pts[:, 0] -= pts[:, 0].min()  # shift so that x >= 0
    n = len(pts)
    parts = draw(st.lists(st.sampled_from(PART_NAMES), min_size=n, max_size=n))
    # Optionally put an edge on the axis: snap a vertex and its successor to
    # x = 0 (the leftmost vertex is there already) and call the edge "axis".
    if draw(st.booleans()):
        i = int(np.argmin(pts[:, 0]))
        j = (i + draw(st.sampled_from([1, -1]))) % n
        pts[j, 0] = 0.0
        parts[min(i, j) if abs(i - j) == 1 else max(i, j)] = "axis"
    try:
        return Section.build(pts, parts=parts, kind="axisymmetric")
    except SectionError:
        assume(False)


sections = st.one_of(plane_sections(), axisymmetric_sections())


def size_of(s):
    return float(np.max(np.abs(s.outline)))


def force_scale(s, rg, h):
    """A force of the size of the problem, for absolute floors of the
    round-off checks: rho g x (the larger of the depth and the section's
    size) x (boundary length) x width (x circumference, axisymmetric)."""
    depth = max(h - s.z_min, size_of(s))
    perim = float(np.sum(s.geometry.length))
    around = 2 * np.pi * float(np.max(s.outline[:, 0])) if s.is_axisymmetric else s.width
    return rg * depth * perim * around


def levels(s, frac):
    lo, hi = s.z_min, s.top_level
    return lo + frac * (hi - lo)


# --------------------------------------------------------------- invariants


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0), rho=st.floats(500.0, 15000.0))
def test_floor_force_plus_support_reaction_is_the_weight(s, frac, rho):
    # Physics spec, "Signs": floor_force + support_reaction = rho g V.
    h = levels(s, frac)
    r = solve(s, h, rho, 9.80665)
    total = r.floor_force + r.support_reaction
    floor = RTOL * force_scale(s, rho * 9.80665, h)
    assert abs(total - r.fluid_weight) <= RTOL * abs(r.fluid_weight) + floor
    assert r.fluid_weight == pytest.approx(rho * 9.80665 * r.volume, rel=1e-12)
    assert r.volume == pytest.approx(volume_below(s, r.level), rel=RTOL, abs=1e-300)
    # The per-part totals add up to the same.
    assert sum(p.down for p in r.parts.values()) == pytest.approx(total, rel=1e-12, abs=floor)
    if FLOOR not in s.parts:
        assert r.floor_force == 0.0


@SETTINGS
@given(s=plane_sections(names=[p for p in PART_NAMES if p != OPEN]), above=st.floats(0.0, 3.0))
def test_closed_section_under_a_standpipe_still_weighs_its_contents(s, above):
    # A closed cavity under a standpipe head: the net vertical force on its
    # closed boundary is still rho g V (the constant part of the pressure
    # integrates to zero over a closed surface; Cengel & Cimbala sec. 3-1).
    h = s.z_max + above * (s.z_max - s.z_min)
    r = solve(s, h, 1000.0, 9.80665)
    assert r.volume == pytest.approx(s.area * s.width, rel=RTOL)
    floor = RTOL * force_scale(s, 1000.0 * 9.80665, h)
    assert abs(r.floor_force + r.support_reaction - r.fluid_weight) <= (
        RTOL * r.fluid_weight + floor)


@SETTINGS
@given(s=plane_sections(), frac=st.floats(0.0, 1.0))
def test_horizontal_forces_sum_to_zero(s, frac):
    # Physics spec, "Signs": the sum of fx over all walls of a plane section = 0.
    h = levels(s, frac)
    r = solve(s, h, 1000.0, 9.80665)
    total = float(np.sum(r.fx))
    magnitude = float(np.sum(np.abs(r.fx)))  # zero only when every edge is dry
    # Relative to the sum of |fx| even for a film of liquid a few ulps deep:
    # each depth h - z is one correctly rounded subtraction.
    assert abs(total) <= RTOL * magnitude
    assert abs(sum(p.fx for p in r.parts.values())) <= RTOL * magnitude


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0))
def test_level_volume_level_round_trip(s, frac):
    # Level from volume is the exact inverse of volume below a level
    # (physics spec, "Level from volume is exact").
    lo, hi = s.z_min, s.top_level
    assume(hi - lo > 1e-6 * size_of(s))
    h = lo + (0.001 + 0.998 * frac) * (hi - lo)  # strictly inside (z_min, top)
    v = volume_below(s, h)
    h2 = level_for_volume(s, v)
    assert volume_below(s, h2) == pytest.approx(v, rel=RTOL, abs=RTOL * volume_below(s, hi))
    # The level itself: dV/dh is the free-surface width (plane) or area
    # (axisymmetric), which may be tiny near a pointed bottom; bound the
    # level error by the volume round-off divided by the volume gained over
    # a small band around h.
    dz = 1e-6 * (hi - lo)
    gain = (volume_below(s, min(h + dz, hi)) - volume_below(s, max(h - dz, lo)))
    dvdh = gain / (min(h + dz, hi) - max(h - dz, lo))
    if dvdh > 0:
        tol = RTOL * volume_below(s, hi) / dvdh
        assert abs(h2 - h) <= max(tol, RTOL * size_of(s))


@SETTINGS
@given(s=sections, n=st.integers(2, 40))
def test_volume_is_monotone_in_level(s, n):
    z = np.linspace(s.z_min - 0.1 * size_of(s), s.z_max + 0.1 * size_of(s), n)
    v = volume_below_many(s, z)
    cap = volume_below(s, s.z_max)
    assert np.all(np.diff(v) >= -RTOL * cap)
    assert v[0] == 0.0
    assert v[-1] == pytest.approx(cap, rel=1e-12)
    # The vectorised form agrees with the scalar one.
    for zi, vi in zip(z[:5], v[:5], strict=True):
        assert vi == pytest.approx(volume_below(s, zi), rel=RTOL, abs=RTOL * cap)
    # The whole cavity: area x width, or the revolved volume by Pappus'
    # theorem, 2 pi x_centroid A (area and centroid from shapely).
    poly = shapely.Polygon(s.outline)
    if not s.is_axisymmetric:
        assert cap == pytest.approx(poly.area * s.width, rel=1e-9)
    else:
        assert cap == pytest.approx(2 * np.pi * poly.centroid.x * poly.area, rel=1e-9)


@SETTINGS
@given(s=plane_sections(), frac=st.floats(0.0, 1.0), shift=st.floats(-50.0, 50.0))
def test_sideways_shift_changes_nothing(s, frac, shift):
    d = shift * size_of(s)
    # A shift so small that a moved coordinate falls below the smallest one a
    # section may hold (core.limits) is refused by design, not a case here.
    assume(d == 0.0 or abs(d) >= 1e-6 * size_of(s))
    moved = Section.build(s.outline + np.array([d, 0.0]), parts=s.parts, width=s.width)
    h = levels(s, frac)
    a, b = solve(s, h, 1000.0, 9.80665), solve(moved, h, 1000.0, 9.80665)
    scale = force_scale(s, 1000.0 * 9.80665, h)
    atol = RTOL * scale
    assert b.level == a.level
    assert b.volume == pytest.approx(a.volume, rel=RTOL, abs=RTOL * s.area * s.width + 1e-300)
    np.testing.assert_allclose(b.fx, a.fx, rtol=RTOL, atol=atol)
    np.testing.assert_allclose(b.fz, a.fz, rtol=RTOL, atol=atol)
    np.testing.assert_allclose(b.p_start, a.p_start, rtol=1e-12)
    np.testing.assert_allclose(b.wetted_length, a.wetted_length, rtol=1e-12,
                               atol=1e-12 * size_of(s))
    assert b.floor_force == pytest.approx(a.floor_force, rel=RTOL, abs=atol)
    assert b.support_reaction == pytest.approx(a.support_reaction, rel=RTOL, abs=atol)
    # The centre of pressure moves with the section (dry edges: NaN in both).
    wet = ~np.isnan(a.centre_of_pressure[:, 0])
    assert np.array_equal(wet, ~np.isnan(b.centre_of_pressure[:, 0]))
    np.testing.assert_allclose(b.centre_of_pressure[wet, 0], a.centre_of_pressure[wet, 0] + d,
                               rtol=0, atol=1e-9 * (abs(d) + size_of(s)))
    np.testing.assert_allclose(b.centre_of_pressure[wet, 1], a.centre_of_pressure[wet, 1],
                               rtol=0, atol=1e-9 * size_of(s))


def reversed_section(s):
    """The same section drawn the other way round. Edge k of the reversed
    outline joins vertices n-1-k and n-2-k of the original, i.e. it is the
    original edge (n-2-k) mod n, so it keeps that edge's part."""
    n = s.n_edges
    parts = [s.parts[(n - 2 - k) % n] for k in range(n)]
    return Section.build(s.outline[::-1], parts=parts, kind=s.kind, width=s.width), [
        (n - 2 - k) % n for k in range(n)]


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0))
def test_either_winding_gives_the_same_results(s, frac):
    rev, old = reversed_section(s)
    assert rev.orientation == -s.orientation
    h = levels(s, frac)
    a, b = solve(s, h, 1000.0, 9.80665), solve(rev, h, 1000.0, 9.80665)
    atol = RTOL * force_scale(s, 1000.0 * 9.80665, h)
    assert b.volume == pytest.approx(a.volume, rel=RTOL, abs=RTOL * volume_below(s, s.z_max))
    assert b.floor_force == pytest.approx(a.floor_force, rel=RTOL, abs=atol)
    assert b.support_reaction == pytest.approx(a.support_reaction, rel=RTOL, abs=atol)
    assert set(b.parts) == set(a.parts)
    for name, load in a.parts.items():
        assert b.parts[name].fz == pytest.approx(load.fz, rel=RTOL, abs=atol)
        if load.fx is not None:
            assert b.parts[name].fx == pytest.approx(load.fx, rel=RTOL, abs=atol)
    # Edge by edge: the same edge, traversed the other way.
    np.testing.assert_allclose(b.fz, a.fz[old], rtol=RTOL, atol=atol)
    np.testing.assert_allclose(b.p_start, a.p_end[old], rtol=1e-12)
    np.testing.assert_allclose(b.p_end, a.p_start[old], rtol=1e-12)
    if not s.is_axisymmetric:
        np.testing.assert_allclose(b.fx, a.fx[old], rtol=RTOL, atol=atol)
        np.testing.assert_allclose(b.centre_of_pressure, a.centre_of_pressure[old],
                                   rtol=0, atol=1e-9 * size_of(s))
    else:
        np.testing.assert_allclose(b.hoop_start, a.hoop_end[old], rtol=1e-12)


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0), factor=st.floats(0.01, 100.0))
def test_forces_scale_with_density(s, frac, factor):
    h = levels(s, frac)
    a = solve(s, h, 1000.0, 9.80665)
    b = solve(s, h, 1000.0 * factor, 9.80665)
    atol = RTOL * force_scale(s, 1000.0 * factor * 9.80665, h)
    np.testing.assert_allclose(b.fz, factor * a.fz, rtol=RTOL, atol=atol)
    if not s.is_axisymmetric:
        np.testing.assert_allclose(b.fx, factor * a.fx, rtol=RTOL, atol=atol)
    assert b.floor_force == pytest.approx(factor * a.floor_force, rel=RTOL, abs=atol)
    assert b.support_reaction == pytest.approx(factor * a.support_reaction, rel=RTOL, abs=atol)
    assert b.fluid_weight == pytest.approx(factor * a.fluid_weight, rel=RTOL)
    assert b.max_pressure == pytest.approx(factor * a.max_pressure, rel=RTOL)
    assert b.volume == a.volume


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0))
def test_open_edges_are_dry_and_spill_caps_the_level(s, frac):
    # Section format spec: the lowest point of the open edges is the spill
    # level; physics spec: a level above it is capped, with a warning.
    h = s.z_min + frac * 2 * (s.z_max - s.z_min)
    r = solve(s, h, 1000.0, 9.80665)
    if s.is_open:
        assert r.level == min(h, s.spill_level)
        assert (h > s.spill_level) == any("spill level" in w for w in r.warnings)
        is_open = np.array([p == OPEN for p in s.parts])
        assert np.all(r.fz[is_open] == 0.0)
        assert OPEN not in r.parts
    else:
        assert r.level == h


# ------------------------------------------------ the bundled sample sections


def test_invariants_hold_on_every_sample(sample_path):
    # The same checks on the standard shapes, from empty to the file's fill
    # and beyond (capped at spill, or a standpipe head on a closed section).
    case = read_section_file(sample_path)
    s = case.section
    rho, g = case.liquid.density, case.gravity
    for h in np.linspace(s.z_min, s.z_max + 0.5 * (s.z_max - s.z_min), 13).tolist() + [
            case.level]:
        r = solve(s, h, rho, g)
        floor = RTOL * force_scale(s, rho * g, h)
        assert abs(r.floor_force + r.support_reaction - r.fluid_weight) <= (
            RTOL * r.fluid_weight + floor)
        if not s.is_axisymmetric:
            assert abs(float(np.sum(r.fx))) <= RTOL * float(np.sum(np.abs(r.fx))) + floor
        if r.level < s.top_level:
            assert level_for_volume(s, r.volume) == pytest.approx(r.level, rel=1e-9)
