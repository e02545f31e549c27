"""Volumes, levels and loads of sections far from the origin.

A section drawn in site coordinates (a national grid puts x at hundreds of
kilometres) must give the same volume and loads as the same shape near the
origin. The references here are exact: the stored float coordinates are
rational numbers, so the area and first moment of the outline (clipped at a
level) are computed with ``fractions.Fraction`` by the shoelace and polygon
centroid formulas (standard plane geometry), and revolved volumes by
Pappus's second centroid theorem, V = 2 pi x_c A (standard; compare
``fluids.geometry`` for cones and cylinders in test_reference_values.py).
Only the final conversion to float and the factor pi are rounded.

The invariance property translates every section by an exactly
representable offset (all coordinates on a grid of 2**-31 m), so that the
moved section is the same set of real numbers moved, and any difference in
the results is the engine's round-off.
"""

import math
from fractions import Fraction

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from wetline.core.fill import (
    FillError,
    capacity,
    level_for_volume,
    volume_below,
    volume_below_many,
)
from wetline.core.hydrostatics import solve
from wetline.core.level_table import level_table
from wetline.core.limits import COORDINATE_LIMIT
from wetline.core.section import Section, SectionError

G0 = 9.80665


def clipped(pts, h):
    """The polygon ``pts`` (Fractions) cut to z <= h (Sutherland-Hodgman
    clipping against one half-plane, exact in rational arithmetic)."""
    out = []
    n = len(pts)
    for i in range(n):
        (x0, z0), (x1, z1) = pts[i], pts[(i + 1) % n]
        if z0 <= h:
            out.append((x0, z0))
        if (z0 - h) * (z1 - h) < 0:
            t = (h - z0) / (z1 - z0)
            out.append((x0 + t * (x1 - x0), h))
    return out


def area_and_moment(pts):
    """Signed area and first moment about x = 0 (integral of x dA) of a
    polygon of Fractions: shoelace and polygon-centroid formulas."""
    a = m = Fraction(0)
    n = len(pts)
    for i in range(n):
        (x0, z0), (x1, z1) = pts[i], pts[(i + 1) % n]
        cross = x0 * z1 - x1 * z0
        a += cross
        m += (x0 + x1) * cross
    return a / 2, m / 6


def exact_volume(section, h):
    """Volume below h [m3] of the stored outline, exactly (then rounded)."""
    pts = [(Fraction(x), Fraction(z)) for x, z in section.outline.tolist()]
    a, m = area_and_moment(clipped(pts, Fraction(h)))
    if section.is_axisymmetric:
        return 2 * math.pi * abs(float(m))  # Pappus: 2 pi x_c A, x_c A = m
    return abs(float(a)) * section.width


def star(rng, n, centre, radius):
    ang = np.sort(rng.uniform(0, 2 * np.pi, n))
    r = rng.uniform(0.3, 1.0, n) * radius
    return np.c_[centre[0] + r * np.cos(ang), centre[1] + r * np.sin(ang)]


# ------------------------------------------------------ far in x (plane)
@pytest.mark.parametrize("x", [1e5, 5e6, COORDINATE_LIMIT - 10.0])
def test_plane_volume_far_along_x_is_exact(x):
    rng = np.random.default_rng(7)
    for _ in range(40):
        try:
            s = Section.build(star(rng, 9, (x, 2.0), 1.0))
        except SectionError:
            continue
        for h in (1.4, 2.1, s.z_max):
            # To round-off: numpy's sums take other SIMD paths on other
            # CPUs (4.5e-15 seen on one at 1e6 m from the axis, 4e-15 on
            # another), so a few tens of ulps, not an exact tie.
            assert volume_below(s, h) == pytest.approx(exact_volume(s, h), rel=1e-14)
        assert capacity(s) == pytest.approx(exact_volume(s, s.z_max), rel=4e-15)


def test_a_thin_wedge_far_along_x_keeps_the_balance():
    # A sloping slot 1 mm thick at x = 100 km (issue 7): floor plus supports
    # must equal rho g V to round-off (physics spec, "Signs").
    x, t = 1e5, 1e-3
    s = Section.build([(x, 0), (x + t, 0), (x + t + 2, 3), (x + 2, 3)],
                      parts=["floor", "wall", "open", "wall"])
    r = solve(s, 2.0, 1000.0, G0)
    assert r.volume == pytest.approx(exact_volume(s, 2.0), rel=1e-13)
    assert r.floor_force + r.support_reaction == pytest.approx(r.fluid_weight, rel=1e-12)


@pytest.mark.parametrize("kind", ["plane", "axisymmetric"])
def test_the_exact_capacity_far_from_the_origin_is_accepted(kind):
    # Issue 7: --volume equal to the exact capacity was refused as "more than
    # the section holds" when the capacity came out a few 1e-9 low.
    rng = np.random.default_rng(3)
    checked = 0
    for _ in range(60):
        try:
            s = Section.build(star(rng, 8, (5e6, 2.0), 1.0), kind=kind)
        except SectionError:
            continue
        full = exact_volume(s, s.z_max)
        assert capacity(s) == pytest.approx(full, rel=4e-15)
        h = level_for_volume(s, full)  # accepted, at the top to round-off in volume
        assert volume_below(s, h) == pytest.approx(full, rel=4e-15)
        with pytest.raises(FillError, match="more than the section holds"):
            level_for_volume(s, full * (1 + 1e-11))
        checked += 1
    assert checked > 20


# ---------------------------------------------- far from the axis (revolved)
@pytest.mark.parametrize("x", [1e4, 1e6, COORDINATE_LIMIT - 10.0])
def test_revolved_volume_of_a_ring_far_from_the_axis_is_exact(x):
    # A ring-shaped channel: a small outline revolved at a large radius.
    rng = np.random.default_rng(11)
    for _ in range(40):
        try:
            s = Section.build(star(rng, 9, (x, 2.0), 1.0), kind="axisymmetric")
        except SectionError:
            continue
        for h in (1.4, 2.1, s.z_max):
            # To round-off: numpy's sums take other SIMD paths on other
            # CPUs (4.5e-15 seen on one at 1e6 m from the axis, 4e-15 on
            # another), so a few tens of ulps, not an exact tie.
            assert volume_below(s, h) == pytest.approx(exact_volume(s, h), rel=1e-14)
        r = solve(s, 2.1, 1000.0, G0)
        assert r.floor_force + r.support_reaction == pytest.approx(r.fluid_weight, rel=1e-12)


def test_level_table_far_from_the_origin_is_exact():
    s = Section.build([(5e6, 0), (5e6 + 2.5, 0.25), (5e6 + 2.2, 3), (5e6 + 0.1, 2.9)],
                      parts=["floor", "wall", "open", "wall"])
    t = level_table(s, 1000.0, G0, steps=9)
    for h, v in zip(t.levels.tolist(), t.volume.tolist(), strict=True):
        assert v == pytest.approx(exact_volume(s, h), rel=4e-15, abs=1e-300)
    np.testing.assert_allclose(t.floor_force + t.support_reaction, t.fluid_weight,
                               rtol=1e-12, atol=0)
    np.testing.assert_allclose(volume_below_many(s, t.levels), t.volume, rtol=0, atol=0)


# ------------------------------------------------ translation invariance
GRID = 2.0 ** -31  # [m]: every coordinate below 2**21 m is exact on this grid


def on_grid(v):
    return np.round(np.asarray(v, dtype=np.float64) / GRID) * GRID


@st.composite
def grid_sections(draw):
    """A star-shaped section of size 1 mm to 300 m, either kind, every
    coordinate a multiple of GRID, with random parts."""
    n = draw(st.integers(3, 12))
    gaps = draw(st.lists(st.floats(0.05, 1.0), min_size=n, max_size=n))
    t = np.cumsum(gaps)
    t = 2 * np.pi * t / t[-1]
    r = np.array(draw(st.lists(st.floats(0.2, 1.0), min_size=n, max_size=n)))
    scale = draw(st.sampled_from([1e-3, 0.05, 1.0, 7.5, 300.0]))
    pts = np.c_[r * np.cos(t), r * np.sin(t)] * scale
    kind = draw(st.sampled_from(["plane", "axisymmetric"]))
    if kind == "axisymmetric":
        pts[:, 0] -= pts[:, 0].min() - draw(st.sampled_from([0.0, 0.5, 3.0])) * scale
    pts = on_grid(pts)
    parts = draw(st.lists(st.sampled_from(["wall", "floor", "open", "lid"]),
                          min_size=n, max_size=n))
    try:
        return Section.build(pts, parts=parts, kind=kind)
    except SectionError:
        assume(False)


def largest(*arrays):
    return max(float(np.max(np.abs(np.nan_to_num(a)))) for a in arrays)


@settings(max_examples=300, deadline=None,
          suppress_health_check=[HealthCheck.filter_too_much, HealthCheck.too_slow])
@given(s=grid_sections(), frac=st.floats(0.0, 1.0),
       dx=st.floats(-1e6, 1e6), dz=st.floats(-1e6, 1e6))
def test_translating_a_section_changes_nothing_but_its_position(s, frac, dx, dz):
    # Plane sections move in x and z; revolved ones only in z (x is the
    # radius). The results must not change by more than 1e-12 of the
    # largest value of their kind (issue 7).
    if s.is_axisymmetric:
        dx = 0.0
    shift = on_grid([dx, dz])
    # The moved section keeps the original's winding (what is tested here is
    # the loads and volumes, not how Section.build finds the winding).
    moved = Section(outline=s.outline + shift, parts=s.parts, kind=s.kind, width=s.width,
                    orientation=s.orientation)
    assert np.array_equal(moved.outline - shift, s.outline)  # the move itself is exact
    h = float(on_grid(s.z_min + frac * (s.top_level - s.z_min)))
    a = solve(s, h, 1000.0, G0)
    b = solve(moved, h + shift[1], 1000.0, G0)
    assert b.volume == pytest.approx(a.volume, rel=1e-12, abs=1e-300)
    forces = largest(a.fz, a.fx, b.fz, b.fx)
    for name in ("fz", "fx", "resultant"):
        np.testing.assert_allclose(getattr(b, name), getattr(a, name), rtol=0,
                                   atol=1e-12 * forces)
    totals = largest([a.fluid_weight, a.floor_force, a.support_reaction])
    for name in ("fluid_weight", "floor_force", "support_reaction"):
        assert getattr(b, name) == pytest.approx(getattr(a, name), rel=0, abs=1e-12 * totals)
    for name, load in a.parts.items():
        assert b.parts[name].fz == pytest.approx(load.fz, rel=0, abs=1e-12 * forces)
    # Level from volume: the same level, moved, to 1e-12 of the largest level.
    # Only where the volume is well above its own round-off (about 1e-16 of
    # the capacity): at a cone's tip V grows as (h - z0)^3, and a level
    # 6e-8 of the height above the tip holds 1e-21 of the capacity, which no
    # inverse can resolve to 1e-9 of the height. The same holds under a
    # pointed top, where the volume left above the level shrinks as fast
    # (hypothesis found a level 1e-5 of the height below an apex of a
    # revolved section: 1.1e-12 apart when moved by 1 m).
    if 1e-6 * capacity(s) < a.volume < (1.0 - 1e-6) * capacity(s):
        ha = level_for_volume(s, a.volume)
        hb = level_for_volume(moved, a.volume)
        assert hb - shift[1] == pytest.approx(ha, rel=0, abs=1e-12 * max(abs(ha), abs(hb)))
        assert abs(ha - a.level) <= 1e-9 * (s.z_max - s.z_min) + 1e-12 * abs(a.level)
