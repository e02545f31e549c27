"""Air trapped under ceilings: the pockets, their interfaces and their loads.

Physics: Boyle's law for an isothermal ideal gas, p_abs V = const (Cengel &
Cimbala, Fluid Mechanics, sec. 2-2), with the air weightless and the liquid
at rest (sec. 3-1): the air in a pocket stands at the liquid's pressure at
its interface. Equilibrium of the contents (Archimedes / the divergence
theorem) still gives floor force + support reaction = the liquid's weight,
since a uniform air pressure has no net force over its closed pocket. The
pockets' shapes are checked against shapely (the parts of the cavity above a
level, their areas) and their loads against hand formulas.
"""

import numpy as np
import pytest
import shapely
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st
from test_properties import axisymmetric_sections, force_scale, plane_sections, size_of

from wetline.core.fill import FillError, volume_below
from wetline.core.pockets import (
    STANDARD_ATMOSPHERE,
    PocketError,
    find_pockets,
    level_for_liquid_volume,
    trap_air,
)
from wetline.core.pressure_law import (
    Layer,
    PressureLaw,
    integrate_edges,
    liquid_volume_below,
)
from wetline.core.section import OPEN, Section

G = 9.81
RTOL = 1e-9
P_ATM = STANDARD_ATMOSPHERE
SETTINGS = settings(max_examples=150, deadline=None,
                    suppress_health_check=[HealthCheck.filter_too_much, HealthCheck.too_slow])
sections = st.one_of(plane_sections(), axisymmetric_sections())


def closed(s):
    parts = ["roof" if p == OPEN else p for p in s.parts]
    return Section.build(s.outline, parts=parts, kind=s.kind, width=s.width)


def chamber(lip=2.2, roof=3.0, riser=6.0, width=10.0):
    """A chamber with a flat roof from x = 1 to ``width`` and a riser at
    x = 0..0.8 open at the top; the riser's wall (x = 0.8..1) reaches down
    to ``lip`` below the roof, so the roof's air is sealed at ``lip``."""
    pts = [[0, 0], [width, 0], [width, roof], [1, roof], [1, lip], [0.8, lip], [0.8, riser],
           [0, riser]]
    parts = ["floor", "wall", "roof", "riser wall", "riser wall", "riser wall", OPEN, "wall"]
    return Section.build(pts, parts=parts)


def bell(c=12.0, d=10.0, rb=1.0, t=0.1, radius=3.0, height=20.0):
    """Axisymmetric tank of ``radius`` open at ``height``, with a bell on
    the axis: ceiling at ``c`` over r < ``rb``, skirt down to ``d``."""
    pts = [[0, 0], [radius, 0], [radius, height], [0, height], [0, c + t], [rb + t, c + t],
           [rb + t, d], [rb, d], [rb, c], [0, c]]
    parts = ["floor", "wall", OPEN, "axis", "bell", "bell", "bell", "bell", "bell", "axis"]
    return Section.build(pts, parts=parts, kind="axisymmetric")


def roots_in(coeffs, lo, hi):
    """Real roots of the polynomial (ascending coefficients) in [lo, hi]."""
    r = np.polynomial.polynomial.polyroots(coeffs)
    r = r[np.abs(r.imag) < 1e-9].real
    return r[(r >= lo - 1e-12) & (r <= hi + 1e-12)]


def solved(s, law, p_atm=P_ATM):
    tree = find_pockets(s)
    state = trap_air(tree, law, p_atm)
    return tree, state, integrate_edges(s, law, state.caps)


# --------------------------------------------------- the merge tree itself


def components_above(s, z):
    """shapely: the parts of the cavity above z."""
    poly = shapely.Polygon(s.outline)
    x0, z0, x1, z1 = poly.bounds
    pad = 1 + (x1 - x0) + (z1 - z0)
    got = shapely.intersection(poly, shapely.box(x0 - pad, z, x1 + pad, z1 + pad))
    return [g for g in shapely.get_parts(got) if g.area > 0]


def revolved(g, s):
    """Volume of a part: area x width, or by Pappus 2 pi x_c A."""
    return g.area * s.width if not s.is_axisymmetric else 2 * np.pi * g.centroid.x * g.area


def check_tree_against_shapely(s, fracs):
    """At any level, the nodes alive (below their own level, at or above
    their parent's) are exactly the parts of the cavity above it, with the
    same volumes, and the vent where the vent is."""
    tree = find_pockets(s)
    for f in fracs:
        z = s.z_min + f * (s.z_max - s.z_min)
        parts = components_above(s, z)
        if tree.n_nodes == 0:
            assert len(parts) == 1
            continue
        if np.any(np.isclose(tree.level, z, rtol=0, atol=1e-9 * size_of(s))):
            continue  # a critical level: parts touch there
        alive = [k for k in range(tree.n_nodes) if z < tree.level[k]
                 and (tree.parent[k] < 0 or z >= tree.level[tree.parent[k]])]
        assert len(alive) == len(parts)
        for k in alive:
            apex = shapely.Point(tree.apex[k])
            d = [shapely.distance(g, apex) for g in parts]
            g = parts[int(np.argmin(d))]
            assert min(d) <= 1e-9 * size_of(s)
            v = tree.volume_above(k, z)
            assert v == pytest.approx(revolved(g, s), rel=1e-9, abs=1e-12 * revolved(
                shapely.Polygon(s.outline), s))
            if s.is_open and z < s.spill_level:
                opens = shapely.union_all([shapely.LineString([s.outline[i],
                                                               s.outline[(i + 1) % s.n_edges]])
                                           for i, p in enumerate(s.parts) if p == OPEN])
                assert tree.vented[k] == (shapely.distance(g, opens) <= 1e-9 * size_of(s))


@SETTINGS
@given(s=sections, fracs=st.lists(st.floats(0.001, 0.999), min_size=1, max_size=4))
def test_the_tree_has_one_node_per_part_of_the_cavity_above_any_level(s, fracs):
    check_tree_against_shapely(s, fracs)


def test_no_saddle_no_tree():
    # A convex tank, an open tank and a hopper can trap nothing.
    for pts in ([[0, 0], [2, 0], [2, 3], [0, 3]], [[0, 1], [1, 0], [2, 1], [2, 3], [0, 3]]):
        t = find_pockets(Section.build(pts))
        assert not t.may_trap and t.n_nodes == 0
        st_ = trap_air(t, PressureLaw.single(1000.0, 2.5))
        assert st_.pockets == () and st_.caps is None


def test_a_closed_roof_whose_domes_both_reach_the_top_traps_nothing():
    # Decision (DEVELOPERS): every part of a closed section that reaches its
    # top belongs to the gas space.
    s = Section.build([[0, 0], [3, 0], [3, 2], [1.2, 2], [1.2, 1.5], [1, 1.5], [1, 2], [0, 2]])
    t = find_pockets(s)
    assert t.n_nodes == 3 and not t.may_trap
    assert trap_air(t, PressureLaw.single(1000.0, 1.8)).pockets == ()


# ------------------------------------------------------- hand formulas


def test_diving_bell_against_boyles_law():
    # The classical diving-bell problem (Boyle's law with the hydrostatic
    # pressure at the water surface inside the bell; from memory, as set in
    # introductory physics texts). Bell of radius 1 m, ceiling at 12 m, rim
    # at 10 m, water up to 20 m: the air (sealed at the rim with pi 1^2 2 m3
    # at one atmosphere) stands at z_i with
    #   p_atm (c - d) = (p_atm + rho g (h - z_i)) (c - z_i),
    # a quadratic in z_i.
    s = bell()
    law = PressureLaw.single(1000.0, 20.0, gravity=G)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    rg = 1000.0 * G
    coeffs = np.polynomial.polynomial.polymul([P_ATM + rg * 20.0, -rg], [12.0, -1.0])
    coeffs[0] -= P_ATM * 2.0
    (z_i,) = roots_in(coeffs, 10.0, 12.0)
    assert p.sealed_at == 10.0
    assert p.interface == pytest.approx(z_i, rel=1e-12, abs=1e-9)
    assert p.air_pressure == pytest.approx(rg * (20.0 - z_i), rel=1e-9)
    assert p.air_volume == pytest.approx(np.pi * (12.0 - z_i), rel=1e-9)
    # The bell's ceiling is pushed up by the air pressure over pi r^2.
    ceiling = 8  # edge (rb, c) -> (0, c)
    assert e.fz[ceiling] == pytest.approx(p.air_pressure * np.pi, rel=1e-9)
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    assert e.volume == pytest.approx(volume_below(s, 20.0) - p.air_volume, rel=1e-12)


def test_doubling_the_absolute_pressure_halves_the_air():
    # Boyle: at twice the absolute pressure the air takes half its volume.
    # With the interface 1 atmosphere of water head below the surface
    # (p_atm / (rho g), about 10.3 m: "one atmosphere every 10 m of water",
    # common practice), a straight-sided bell is half full.
    s = bell(c=12.0, d=10.0, height=30.0)
    head = P_ATM / (1000.0 * G)
    law = PressureLaw.single(1000.0, 11.0 + head, gravity=G)
    (p,) = trap_air(find_pockets(s), law).pockets
    assert p.interface == pytest.approx(11.0, rel=1e-12)
    assert p.air_volume == pytest.approx(np.pi * 1.0, rel=1e-12)
    assert p.air_pressure == pytest.approx(P_ATM, rel=1e-12)


def test_chamber_with_a_lip_traps_the_roofs_air():
    # Roof 9 m wide (x = 1..10) at 3 m, sealed at the lip 2.2 m: 7.2 m2 of
    # air at one atmosphere. Water up the riser to 6 m (g = 9.81):
    #   p_atm 9 (3 - 2.2) = (p_atm + rho g (6 - z_i)) 9 (3 - z_i).
    s = chamber()
    law = PressureLaw.single(1000.0, 6.0, gravity=G)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    rg = 1000.0 * G
    coeffs = np.polynomial.polynomial.polymul([P_ATM + rg * 6.0, -rg], [3.0, -1.0])
    coeffs[0] -= P_ATM * 0.8
    (z_i,) = roots_in(coeffs, 2.2, 3.0)
    assert p.interface == pytest.approx(z_i, rel=1e-12)
    assert p.sealed_at == 2.2 and p.split_at is None
    # The roof is pushed up by the air, p(z_i) over 9 m, not by the liquid's
    # pressure at its own depth, rho g (6 - 3), as it would be vented.
    roof = 2
    assert e.fz[roof] == pytest.approx(rg * (6.0 - z_i) * 9.0, rel=1e-12)
    vented = integrate_edges(s, law)
    assert vented.fz[roof] == pytest.approx(rg * 3.0 * 9.0, rel=1e-12)
    assert e.fz[roof] > vented.fz[roof]
    # The air is weightless: equilibrium still holds, with less liquid.
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    assert abs(float(np.sum(e.fx))) <= RTOL * float(np.sum(np.abs(e.fx)))
    assert e.volume == pytest.approx(vented.volume - p.air_volume, rel=1e-12)
    # The right wall: air pressure down to z_i, then the liquid's.
    wall = 1
    assert e.wetted_length[wall] == pytest.approx(z_i, rel=1e-12)
    area = p.air_pressure * (3.0 - z_i) + rg * ((6.0 - z_i) + 6.0) / 2 * z_i
    assert e.fx[wall] == pytest.approx(area, rel=1e-12)
    # The air's polygon, for drawing.
    region = p.air_region(s)
    assert region.area == pytest.approx(p.air_volume, rel=1e-12)
    assert region.bounds == pytest.approx((1.0, z_i, 10.0, 3.0))


def test_nested_pockets_split_at_the_beam():
    # Two domes under one lip: roof at 3.0 over x = 1..6, a beam x = 6..6.4
    # down to 2.6, roof at 3.4 over x = 6.4..10; lip at 2.2 (riser to 40 m).
    # Sealed at 2.2 with V0 = 5 (0.8) + 0.4 (0.4) + 3.6 (1.2) = 8.48 m2;
    # V(z) = 28.28 - 9 z below the beam. The air reaches the beam's tip when
    # p_atm 8.48 = (p_atm + rho g (h - 2.6)) 4.88, and divides there into
    # 2.0 m2 (left) and 2.88 m2 (right) at the pressure p_s = p_atm 8.48 / 4.88.
    # Each then follows (p_atm + rho g (h - z)) w (top - z) = p_s V_split.
    pts = [[0, 0], [10, 0], [10, 3.4], [6.4, 3.4], [6.4, 2.6], [6, 2.6], [6, 3], [1, 3],
           [1, 2.2], [0.8, 2.2], [0.8, 40], [0, 40]]
    parts = ["floor", "wall", "roof", "beam", "beam", "beam", "roof", "wall", "wall", "wall",
             OPEN, "wall"]
    s = Section.build(pts, parts=parts)
    rg = 1000.0 * G
    h_split = 2.6 + P_ATM * (8.48 / 4.88 - 1) / rg
    # Below the split level: one pocket.
    law = PressureLaw.single(1000.0, h_split - 0.5, gravity=G)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    c = np.polynomial.polynomial.polymul([P_ATM + rg * law.level, -rg], [28.28, -9.0])
    c[0] -= P_ATM * 8.48
    assert p.interface == pytest.approx(roots_in(c, 2.2, 2.6)[0], rel=1e-12)
    assert p.air_volume == pytest.approx(28.28 - 9 * p.interface, rel=1e-9)
    # Above it: two, each with its share of the air.
    h = 30.0
    law = PressureLaw.single(1000.0, h, gravity=G)
    tree, state, e = solved(s, law)
    left, right = sorted(state.pockets, key=lambda q: q.apex[0])
    p_s = P_ATM * 8.48 / 4.88
    for q, width, top, v_split in ((left, 5.0, 3.0, 2.0), (right, 3.6, 3.4, 2.88)):
        c = np.polynomial.polynomial.polymul([P_ATM + rg * h, -rg], [width * top, -width])
        c[0] -= p_s * v_split
        assert q.interface == pytest.approx(roots_in(c, 2.6, top)[0], rel=1e-12)
        assert q.sealed_at == 2.2 and q.split_at == 2.6
        assert (P_ATM + q.air_pressure) * q.air_volume == pytest.approx(p_s * v_split, rel=1e-9)
        assert q.air_region(s).area == pytest.approx(q.air_volume, rel=1e-9)
    assert left.interface != pytest.approx(right.interface, rel=1e-6)
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    # The beam's soffit is in the liquid now; its pressure is the liquid's.
    assert e.fz[4] == pytest.approx(rg * (h - 2.6) * 0.4, rel=1e-12)


def test_a_column_standing_in_the_pocket_belongs_to_it():
    # A floor spike: a column x = 4.2..4.4 rising from the floor to 2.6,
    # above the lip (2.2), under the roof at 3: its top and sides above the
    # interface carry the air pressure.
    pts = [[0, 0], [4.2, 0], [4.2, 2.6], [4.4, 2.6], [4.4, 0], [10, 0], [10, 3], [1, 3],
           [1, 2.2], [0.8, 2.2], [0.8, 6], [0, 6]]
    parts = ["floor", "column", "column", "column", "floor", "wall", "roof", "wall", "wall",
             "wall", OPEN, "wall"]
    s = Section.build(pts, parts=parts)
    law = PressureLaw.single(1000.0, 5.0, gravity=G)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    assert {1, 2, 3} <= set(p.edges.tolist())
    # V(z) = 9 (3 - z) - 0.2 (2.6 - z) below the column's top.
    rg = 1000.0 * G
    c = np.polynomial.polynomial.polymul([P_ATM + rg * 5.0, -rg], [27.0 - 0.52, -8.8])
    c[0] -= P_ATM * (9 * 0.8 - 0.2 * 0.4)
    (z_i,) = roots_in(c, 2.2, 2.6)
    assert p.interface == pytest.approx(z_i, rel=1e-12)
    assert e.fz[2] == pytest.approx(-p.air_pressure * 0.2, rel=1e-12)  # its top, pushed down
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    assert p.air_region(s).area == pytest.approx(p.air_volume, rel=1e-12)


def test_gas_pressure_in_a_closed_chamber_seals_into_its_pockets():
    # A closed chamber under 30 kPa of gas: its roof's air sealed at the lip
    # at p_atm + p_gas; at the level h, (p_atm + p_gas) V0 =
    # (p_atm + p_gas + rho g (h - z_i)) V(z_i).
    pts = [[0, 0], [10, 0], [10, 3], [1, 3], [1, 2.2], [0.8, 2.2], [0.8, 6], [0, 6]]
    s = Section.build(pts, parts=["floor", "wall", "roof", "wall", "wall", "wall", "top",
                                  "wall"])
    law = PressureLaw.single(1000.0, 4.0, gravity=G, gas_pressure=30000.0)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    rg = 1000.0 * G
    c = np.polynomial.polynomial.polymul([P_ATM + 30000.0 + rg * 4.0, -rg], [27.0, -9.0])
    c[0] -= (P_ATM + 30000.0) * 7.2
    assert p.interface == pytest.approx(roots_in(c, 2.2, 3.0)[0], rel=1e-12)
    assert p.air_pressure == pytest.approx(30000.0 + rg * (4.0 - p.interface), rel=1e-12)
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    # The top of the riser carries the gas.
    assert e.fz[6] == pytest.approx(30000.0 * 0.8, rel=1e-12)


def test_layers_with_a_pocket():
    # Grease (900) 1 m thick over sewage (1010) with its interface at 3 m,
    # the roof's air sealed at 2.2 m: the interface of the air is in the
    # sewage, and P(z_i) = 900 g 1 + 1010 g (3 - z_i).
    s = chamber()
    law = PressureLaw((Layer(1010.0, 3.0, "sewage"), Layer(900.0, 4.0, "grease")), gravity=G)
    tree, state, e = solved(s, law)
    (p,) = state.pockets
    c = np.polynomial.polynomial.polymul([P_ATM + 900 * G + 1010 * G * 3.0, -1010 * G],
                                         [27.0, -9.0])
    c[0] -= P_ATM * 7.2
    assert p.interface == pytest.approx(roots_in(c, 2.2, 3.0)[0], rel=1e-12)
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=RTOL)
    # The air displaces sewage only.
    assert e.layer_volumes[1] == pytest.approx(0.8 * 1.0, rel=1e-12)  # the riser, 3 m to 4 m
    assert e.layer_volumes[0] == pytest.approx(volume_below(s, 3.0) - p.air_volume, rel=1e-12)


# -------------------------------------------------------------- behaviour


def test_the_interface_rises_with_the_level():
    for s, levels in ((chamber(riser=40.0), np.linspace(2.21, 40.0, 40)),
                      (bell(height=60.0), np.linspace(10.01, 60.0, 40))):
        tree = find_pockets(s)
        z = [trap_air(tree, PressureLaw.single(1000.0, h, gravity=G)).pockets[0].interface
             for h in levels]
        assert np.all(np.diff(z) > 0)


def test_infinitely_compressible_air_is_the_vented_case():
    # p_atm -> 0: the sealed air has no "mass" left and the pocket floods.
    # Its volume p_atm V0 / (p_atm + P(z_i)) goes to zero with p_atm, and
    # every load tends to the vented one.
    s = chamber()
    law = PressureLaw.single(1000.0, 5.0, gravity=G)
    vented = integrate_edges(s, law)
    rg = 1000.0 * G
    for p_atm in (1e-2, 1e-5):
        tree, state, e = solved(s, law, p_atm)
        (p,) = state.pockets
        bound = p_atm * 7.2 / (rg * (5.0 - 3.0))  # the air's volume at most
        assert p.air_volume <= bound
        assert 3.0 - p.interface <= bound / 9.0
        assert vented.volume - e.volume == pytest.approx(p.air_volume, rel=1e-6)
        # Loads differ by at most rho g (3 - z_i) over the roof and walls.
        np.testing.assert_allclose(e.fz, vented.fz, rtol=0, atol=rg * bound / 9.0 * 10.0)
        np.testing.assert_allclose(e.fx, vented.fx, rtol=0, atol=rg * bound / 9.0 * 10.0)


def test_incompressible_air_stays_at_the_lip():
    # p_atm -> infinity: the air keeps its volume, its interface stays at the
    # lip and the roof carries the liquid's pressure at the lip. (Not the
    # vented case: that is the other limit, p_atm -> 0.)
    s = chamber()
    law = PressureLaw.single(1000.0, 5.0, gravity=G)
    for p_atm in (1e10, 1e14):
        tree, state, e = solved(s, law, p_atm)
        (p,) = state.pockets
        assert p.interface - 2.2 < 1e-5 * 1e10 / p_atm * 10
        assert e.fz[2] == pytest.approx(1000.0 * G * (5.0 - 2.2) * 9.0, rel=1e-5)


def test_either_winding_gives_the_same_pockets():
    s = chamber()
    n = s.n_edges
    rev = Section.build(s.outline[::-1], parts=[s.parts[(n - 2 - k) % n] for k in range(n)])
    law = PressureLaw.single(1000.0, 5.0, gravity=G)
    a = trap_air(find_pockets(s), law).pockets
    b = trap_air(find_pockets(rev), law).pockets
    assert len(a) == len(b) == 1
    got = [(p.sealed_at, p.interface, p.air_volume, p.air_pressure) for p in (a[0], b[0])]
    assert got[1] == pytest.approx(got[0], rel=1e-12)


def test_fill_by_volume_with_the_pockets_in_place():
    s = chamber()
    tree = find_pockets(s)
    law = PressureLaw.single(1000.0, 5.0, gravity=G)
    for h in (1.0, 2.3, 3.5, 5.99):
        state = trap_air(tree, law.with_level(h))
        v = liquid_volume_below(s, h, state.caps)
        got = level_for_liquid_volume(tree, law, v)
        assert got == pytest.approx(h, rel=1e-12)
    # With the air in place, a volume needs a higher level than vented.
    v = volume_below(s, 2.5)
    assert level_for_liquid_volume(tree, law, v) > 3.0  # the air fills the roof space
    with pytest.raises(FillError, match="with air trapped in its pockets"):
        level_for_liquid_volume(tree, law, volume_below(s, 6.0))


def test_refusals():
    s = chamber()
    tree = find_pockets(s)
    with pytest.raises(PocketError, match="atmospheric pressure must be a positive number"):
        trap_air(tree, PressureLaw.single(1000.0, 5.0), 0.0)
    pts = [[0, 0], [10, 0], [10, 3], [1, 3], [1, 2.2], [0.8, 2.2], [0.8, 6], [0, 6]]
    closed_chamber = Section.build(pts)
    with pytest.raises(PocketError, match="below a full vacuum under an atmosphere of 90000 Pa"):
        trap_air(find_pockets(closed_chamber),
                 PressureLaw.single(1000.0, 5.0, gas_pressure=-95000.0), 90000.0)
    with pytest.raises(FillError, match="fill volume must be a number >= 0"):
        level_for_liquid_volume(tree, PressureLaw.single(1000.0, 5.0), -1.0)
    layered = PressureLaw((Layer(1300.0, 1.0, "sludge"), Layer(1000.0, 5.0, "water")))
    with pytest.raises(FillError, match="does not reach the top interface at 1 m: the layers "
                                        "below it hold 10 m3"):
        level_for_liquid_volume(tree, layered, 5.0)


def test_a_full_vacuum_leaves_no_air_to_trap():
    pts = [[0, 0], [10, 0], [10, 3], [1, 3], [1, 2.2], [0.8, 2.2], [0.8, 6], [0, 6]]
    s = Section.build(pts)
    law = PressureLaw.single(1000.0, 4.0, gravity=G, gas_pressure=-P_ATM)
    assert trap_air(find_pockets(s), law).pockets == ()


# ----------------------------------------------- random sections, invariants


@st.composite
def trapped_cases(draw):
    s = draw(sections)
    if draw(st.booleans()):
        s = closed(s)
    tree = find_pockets(s)
    assume(tree.may_trap)
    lo, hi = s.z_min, s.top_level if s.is_open else s.z_max + 0.3 * (s.z_max - s.z_min)
    h = min(lo + draw(st.floats(0.0, 1.0)) * (hi - lo), hi)
    layers = [Layer(1000.0, h, "water")]
    if draw(st.booleans()):
        b = lo + draw(st.floats(0.0, 1.0)) * (h - lo)
        assume(b < h)
        layers = [Layer(1300.0, b, "sludge"), Layer(1000.0, h, "water")]
    p_atm = draw(st.sampled_from([P_ATM, 3000.0, 1e7]))
    p_gas = 0.0 if s.is_open else draw(st.sampled_from([0.0, 40000.0, -0.5 * min(p_atm, P_ATM)]))
    law = PressureLaw(tuple(layers), gas_pressure=p_gas, gravity=G)
    return s, tree, law, p_atm


@SETTINGS
@given(case=trapped_cases())
def test_trapped_air_keeps_equilibrium_and_boyles_law(case):
    s, tree, law, p_atm = case
    state = trap_air(tree, law, p_atm)
    e = integrate_edges(s, law, state.caps)
    rg = 1300.0 * G
    floor = RTOL * (force_scale(s, rg, law.level) + abs(law.gas_pressure) * float(
        np.sum(s.geometry.length)) * (2 * np.pi * float(np.max(s.outline[:, 0]))
                                      if s.is_axisymmetric else s.width))
    assert abs(-float(np.sum(e.fz)) - e.fluid_weight) <= RTOL * e.fluid_weight + floor
    if not s.is_axisymmetric:
        assert abs(float(np.sum(e.fx))) <= RTOL * float(np.sum(np.abs(e.fx))) + floor
    whole = volume_below(s, s.z_max)
    air_below_h = 0.0
    groups = {}
    for p in state.pockets:
        assert p.sealed_at < law.level
        assert p.sealed_at <= p.interface <= min(law.level, tree.top[p.node])
        assert p.air_pressure == pytest.approx(law.pressure_at(p.interface), rel=1e-12)
        above_h = tree.volume_above(p.node, law.level) if law.level < tree.top[p.node] else 0.0
        air_below_h += p.air_volume - above_h
        # Boyle over each pocket as it was sealed (its parts, if it split).
        k = p.node
        while tree.level[tree.parent[k]] != p.sealed_at:
            k = tree.parent[k]
        groups.setdefault(k, []).append(p)
    assert e.volume == pytest.approx(volume_below(s, law.level) - air_below_h,
                                     rel=1e-9, abs=1e-9 * whole)
    for k, ps in groups.items():
        sealed = (p_atm + law.gas_pressure) * tree.volume_above(k, ps[0].sealed_at)
        now = sum((p_atm + p.air_pressure) * p.air_volume for p in ps)
        assert now == pytest.approx(sealed, rel=1e-9, abs=1e-12 * p_atm * whole)


@SETTINGS
@given(case=trapped_cases())
def test_fill_by_volume_finds_the_level_back(case):
    s, tree, law, p_atm = case
    h = min(law.level, s.top_level)
    assume(h > (law.interfaces[-1] if law.interfaces else s.z_min))
    law = law.with_level(h)
    state = trap_air(tree, law, p_atm)
    v = liquid_volume_below(s, h, state.caps)
    got = level_for_liquid_volume(tree, law, v, p_atm)
    state2 = trap_air(tree, law.with_level(got), p_atm)
    whole = volume_below(s, s.z_max)
    assert liquid_volume_below(s, got, state2.caps) == pytest.approx(v, rel=1e-9, abs=1e-12 * whole)


@st.composite
def skyline_chambers(draw):
    """A chamber under a roof of flat bays at repeated heights separated by
    downstand beams at repeated levels (ties and runs of equal z), with floor
    columns (floor spikes), and a riser at the left behind a lip; open or
    closed at the riser's top; plane or axisymmetric (x the radius)."""
    k = draw(st.integers(1, 5))
    heights = [draw(st.sampled_from([2.5, 3.0, 3.5])) for _ in range(k)]
    dips = [draw(st.sampled_from([1.8, 2.0, 2.2, 2.4])) for _ in range(k - 1)]
    widths = [draw(st.sampled_from([1.0, 1.5, 2.0])) for _ in range(k)]
    lip = draw(st.sampled_from([1.5, 2.0, 2.2]))
    bays, x = [], 1.0
    for w in widths:
        bays.append((x, x + w))
        x += w + 0.2
    right = bays[-1][1]
    pts = [[0.0, 0.0]]
    for _ in range(draw(st.integers(0, 2))):
        a = draw(st.sampled_from([1.3, 2.1, 3.4, 4.6, 6.2]))
        if a + 0.2 < right and all(abs(a - p[0]) > 0.3 for p in pts[1:]):
            c = draw(st.sampled_from([0.5, 1.9, 2.3]))
            pts += [[a, 0.0], [a, c], [a + 0.2, c], [a + 0.2, 0.0]]
    pts += [[right, 0.0]]
    for i in range(k - 1, -1, -1):
        pts += [[bays[i][1], heights[i]], [bays[i][0], heights[i]]]
        if i > 0:
            pts += [[bays[i][0], dips[i - 1]], [bays[i - 1][1], dips[i - 1]]]
    pts += [[1.0, lip], [0.8, lip], [0.8, 6.0], [0.0, 6.0]]
    parts = ["wall"] * len(pts)
    parts[len(pts) - 2] = OPEN if draw(st.booleans()) else "top"
    kind = draw(st.sampled_from(["plane", "axisymmetric"]))
    if kind == "axisymmetric":
        parts[-1] = "axis"
    try:
        return Section.build(pts, parts=parts, kind=kind)
    except ValueError:
        assume(False)


@SETTINGS
@given(s=skyline_chambers(), fracs=st.lists(st.floats(0.001, 0.999), min_size=1, max_size=3),
       p_atm=st.sampled_from([P_ATM, 3000.0]), gas=st.sampled_from([0.0, 20000.0]))
def test_skyline_roofs_keep_the_tree_boyle_and_equilibrium(s, fracs, p_atm, gas):
    check_tree_against_shapely(s, fracs)
    tree = find_pockets(s)
    assert tree.may_trap
    rg = 1000.0 * G
    gas = 0.0 if s.is_open else gas
    for f in fracs:
        h = s.z_min + f * (s.top_level - s.z_min) * (1.0 if s.is_open else 1.2)
        law = PressureLaw.single(1000.0, h, gravity=G, gas_pressure=gas)
        state = trap_air(tree, law, p_atm)
        e = integrate_edges(s, law, state.caps)
        floor = RTOL * (force_scale(s, rg, h) + gas * 100.0 * (
            2 * np.pi * 6.0 if s.is_axisymmetric else 1.0))
        assert abs(-float(np.sum(e.fz)) - e.fluid_weight) <= RTOL * e.fluid_weight + floor
        if not s.is_axisymmetric:
            assert abs(float(np.sum(e.fx))) <= RTOL * float(np.sum(np.abs(e.fx))) + floor
        for p in state.pockets:
            assert p.sealed_at < h and p.interface <= h
            region = p.air_region(s)
            assert revolved(region, s) == pytest.approx(p.air_volume, rel=1e-9, abs=1e-12)
        if s.is_open or h <= s.z_max:
            v = liquid_volume_below(s, h, state.caps)
            got = level_for_liquid_volume(tree, law, v, p_atm)
            assert got == pytest.approx(h, rel=1e-9, abs=1e-9)
