"""The pressure law of layered liquids under a gas, and its exact edge integrals.

Physics: in a fluid at rest the pressure grows by rho_k g dz through each
layer (Cengel & Cimbala, Fluid Mechanics, sec. 3-1, "pressure in a
multi-layer fluid"); a uniform gas pressure adds to every point; forces on
plane surfaces are the integrals of the pressure diagram (sec. 3-4; Munson,
Young & Okiishi sec. 2.8). The invariants (physics spec, "Signs") are
Archimedes' principle / the divergence theorem over the wetted boundary: the
floor force plus the support reaction is the liquid's weight, and a uniform
pressure over a closed boundary has no net force.
"""

import numpy as np
import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st
from test_properties import axisymmetric_sections, force_scale, plane_sections, size_of

from wetline.core import pressure_law
from wetline.core.fill import volume_below
from wetline.core.hydrostatics import solve
from wetline.core.pressure_law import (
    Layer,
    PressureLaw,
    PressureLawError,
    integrate_edges,
    layer_tops,
    liquid_volume_below,
)
from wetline.core.section import OPEN, Section

G = 9.80665
RTOL = 1e-9
SETTINGS = settings(max_examples=120, deadline=None,
                    suppress_health_check=[HealthCheck.filter_too_much, HealthCheck.too_slow])
sections = st.one_of(plane_sections(), axisymmetric_sections())
PER_EDGE = ("wetted_length", "p_start", "p_end", "fx", "fz", "resultant",
            "centre_of_pressure", "hoop_start", "hoop_end")


def closed(s):
    """The same outline with every ``open`` edge made a roof."""
    parts = ["roof" if p == OPEN else p for p in s.parts]
    return Section.build(s.outline, parts=parts, kind=s.kind, width=s.width)


@st.composite
def layered_laws(draw, s, gas=False):
    """A law of 1 to 4 layers on ``s``: densities falling upward (ties
    allowed), interfaces strictly rising inside the section, a free
    surface from the bottom to the top level, and maybe a gas pressure."""
    lo, hi = s.z_min, s.top_level
    h = min(lo + draw(st.floats(0.0, 1.0)) * (hi - lo), hi)  # never above the spill level
    n = draw(st.integers(1, 4))
    fractions = sorted(draw(st.lists(st.floats(0.0, 1.0), min_size=n - 1, max_size=n - 1)))
    below = lo - 0.2 * (hi - lo)
    tops = [below + f * (h - below) for f in fractions] + [h]
    assume(all(b > a for a, b in zip(tops, tops[1:], strict=False)))
    rho = sorted(draw(st.lists(st.sampled_from([700.0, 900.0, 1000.0, 1025.0, 1300.0, 13546.0]),
                               min_size=n, max_size=n)), reverse=True)
    p_gas = draw(st.sampled_from([0.0, 25000.0, -60000.0, -101325.0])) if gas else 0.0
    return PressureLaw(tuple(Layer(r, t, f"liquid {i}") for i, (r, t) in
                             enumerate(zip(rho, tops, strict=True))), gas_pressure=p_gas,
                       gravity=G)


def scale(s, law):
    """A force of the size of the problem (for absolute round-off floors)."""
    rg = max(law.densities) * law.gravity
    gas = abs(law.gas_pressure) * float(np.sum(s.geometry.length)) * (
        2 * np.pi * float(np.max(s.outline[:, 0])) if s.is_axisymmetric else s.width)
    return force_scale(s, rg, law.level) + gas


# ------------------------------------------------- one liquid is solve()


@SETTINGS
@given(s=sections, frac=st.floats(0.0, 1.0), split=st.floats(0.0, 1.0),
       rho=st.floats(500.0, 15000.0))
def test_the_general_kernel_gives_what_the_one_liquid_closed_forms_give(s, frac, split, rho):
    # solve() is integrate_edges' one-liquid path (the closed forms on the
    # clipped depths, Cengel & Cimbala sec. 3-4); the general path (pressures,
    # trapezoids, cut edges, Green sums per layer), here with two layers of
    # one density, must agree with it to round-off.
    r = solve(s, s.z_min + frac * (s.top_level - s.z_min), rho, G)
    b = s.z_min + split * (r.level - s.z_min)
    assume(b < r.level)
    law = PressureLaw((Layer(rho, b, "lower"), Layer(rho, r.level, "upper")), gravity=G)
    e = pressure_law._general_edges(s, law, None, None)
    big = max(float(np.max(np.abs(r.fz))), float(np.nanmax(np.abs(r.fx), initial=0.0)))
    for name in PER_EDGE:
        a, b = getattr(r, name), getattr(e, name)
        atol = {"fx": big, "fz": big, "resultant": big}.get(name, 0.0) * 1e-12
        if name == "centre_of_pressure":
            atol = 1e-12 * size_of(s)
        elif name.startswith("hoop") or name.startswith("p_"):
            atol = 1e-12 * max(r.max_pressure, 1.0) * (
                float(np.max(s.outline[:, 0])) * 1e6 if name.startswith("hoop") else 1.0)
        np.testing.assert_allclose(b, a, rtol=1e-12, atol=atol, equal_nan=True, err_msg=name)
    assert e.volume == pytest.approx(r.volume, rel=1e-12, abs=1e-300)
    assert e.fluid_weight == pytest.approx(r.fluid_weight, rel=1e-12, abs=1e-300)
    assert e.max_pressure == pytest.approx(r.max_pressure, rel=1e-12, abs=1e-300)
    assert float(np.sum(e.layer_volumes)) == pytest.approx(r.volume, rel=1e-12, abs=1e-300)


def test_solve_is_the_one_layer_law_bit_for_bit():
    # The wrapper adds nothing: solve() and integrate_edges() with one layer
    # give the same floats (the same code path).
    for kind in ("plane", "axisymmetric"):
        s = Section.build([[0, 0], [2, 0], [2.5, 1], [2, 3], [0, 3]],
                          parts=["floor", "wall", "wall", "open", "axis" if kind != "plane"
                                 else "wall"], kind=kind)
        r = solve(s, 2.2, 1234.5, G)
        e = integrate_edges(s, PressureLaw.single(1234.5, 2.2, gravity=G))
        for name in PER_EDGE:
            np.testing.assert_array_equal(getattr(r, name), getattr(e, name), err_msg=name)
        assert (r.volume, r.fluid_weight, r.max_pressure) == (e.volume, e.fluid_weight,
                                                              e.max_pressure)


# ------------------------------------------------------------ invariants


@SETTINGS
@given(data=st.data(), s=sections)
def test_layers_and_gas_keep_equilibrium(data, s):
    # floor + supports = total liquid weight: the gas adds no net force over
    # a closed cavity, and each layer's ramp weighs its own Green volume.
    s = closed(s) if data.draw(st.booleans()) else s
    law = data.draw(layered_laws(s, gas=not s.is_open))
    e = integrate_edges(s, law)
    floor = RTOL * scale(s, law)
    down = -float(np.sum(e.fz))
    assert abs(down - e.fluid_weight) <= RTOL * e.fluid_weight + floor
    if not s.is_axisymmetric:
        assert abs(float(np.sum(e.fx))) <= RTOL * float(np.sum(np.abs(e.fx))) + floor
    # Layer volumes add up to the level's volume; their weights to the weight.
    assert float(np.sum(e.layer_volumes)) == pytest.approx(
        volume_below(s, law.level), rel=1e-12, abs=1e-12 * volume_below(s, s.z_max))
    assert float(np.sum(e.layer_weights)) == pytest.approx(
        e.fluid_weight, rel=1e-12, abs=1e-12 * scale(s, law))
    for layer, v, below_top in zip(law.layers, e.layer_volumes,
                                   np.cumsum(e.layer_volumes), strict=True):
        assert v >= 0
        assert below_top == pytest.approx(volume_below(s, layer.top), rel=1e-9,
                                          abs=1e-12 * volume_below(s, s.z_max))
    # Open edges carry nothing; the largest pressure is at the lowest point.
    is_open = np.array([p == OPEN for p in s.parts])
    assert np.all(e.fz[is_open] == 0.0)
    assert e.max_pressure == pytest.approx(float(law.pressure(s.z_min)), rel=1e-12)
    highest = float(np.max(np.maximum(e.p_start, e.p_end)))
    assert highest <= e.max_pressure + 1e-12 * abs(e.max_pressure) + 1e-9


@SETTINGS
@given(data=st.data(), s=sections)
def test_a_layer_as_dense_as_the_one_below_changes_nothing(data, s):
    # The ramp of a zero density step has no coefficient: bit for bit the
    # one-liquid result, however the interfaces are drawn.
    law = data.draw(layered_laws(s, gas=False))
    rho = law.densities[0]
    same = PressureLaw(tuple(Layer(rho, layer.top, layer.name) for layer in law.layers),
                       gravity=G)
    one = PressureLaw.single(rho, law.level, gravity=G)
    a, b = integrate_edges(s, same), integrate_edges(s, one)
    for name in PER_EDGE:
        np.testing.assert_array_equal(getattr(a, name), getattr(b, name), err_msg=name)
    assert a.fluid_weight == b.fluid_weight
    assert a.max_pressure == b.max_pressure
    assert float(np.sum(a.layer_volumes)) == pytest.approx(b.volume, rel=1e-12, abs=1e-300)


@SETTINGS
@given(data=st.data(), s=sections)
def test_few_and_many_cut_edges_agree(data, s):
    # The plain-float path for a few cut edges and the array path give the
    # same numbers (to round-off).
    law = data.draw(layered_laws(s, gas=not s.is_open))
    old = pressure_law._FEW_CUT_EDGES
    try:
        pressure_law._FEW_CUT_EDGES = 10 ** 9
        a = integrate_edges(s, law)
        pressure_law._FEW_CUT_EDGES = -1
        b = integrate_edges(s, law)
    finally:
        pressure_law._FEW_CUT_EDGES = old
    atol = 1e-12 * scale(s, law)
    for name in ("fx", "fz", "resultant"):
        np.testing.assert_allclose(getattr(a, name), getattr(b, name), rtol=1e-12, atol=atol,
                                   equal_nan=True)
    for name in ("p_start", "p_end"):
        np.testing.assert_allclose(getattr(a, name), getattr(b, name), rtol=1e-12,
                                   atol=1e-12 * (abs(a.max_pressure) + 1.0))
    np.testing.assert_allclose(a.centre_of_pressure, b.centre_of_pressure, rtol=0,
                               atol=1e-9 * size_of(s), equal_nan=True)


@SETTINGS
@given(s=sections, p_gas=st.sampled_from([1e3, 2.5e5, -101325.0]))
def test_a_gas_alone_has_no_net_force_on_a_closed_cavity(s, p_gas):
    # A uniform pressure over a closed boundary has no resultant (the
    # divergence theorem; Cengel & Cimbala sec. 3-1): empty but for the gas.
    s = closed(s)
    e = integrate_edges(s, PressureLaw.single(1000.0, s.z_min, gravity=G, gas_pressure=p_gas))
    assert e.volume == 0.0 and e.fluid_weight == 0.0
    assert np.all(e.wetted_length[s.geometry.dz != 0] == 0.0)
    total = abs(p_gas) * float(np.sum(s.geometry.length)) * (
        2 * np.pi * float(np.max(s.outline[:, 0])) if s.is_axisymmetric else s.width)
    assert abs(float(np.sum(e.fz))) <= 1e-12 * total
    if not s.is_axisymmetric:
        assert abs(float(np.sum(e.fx))) <= 1e-12 * total
        np.testing.assert_array_equal(e.p_start, np.full(s.n_edges, p_gas))


# ------------------------------------------------------- hand formulas


def test_two_layer_rectangular_tank_against_hand_formulas():
    # Open tank 2 m wide: water (1000 kg/m3) 1.2 m deep under oil (900 kg/m3)
    # 0.8 m deep, g = 9.81. Derivation (Cengel & Cimbala sec. 3-1: the
    # pressure grows by rho_k g d_k through each layer):
    #   interface  p_i = rho_oil g d_oil            = 900 * 9.81 * 0.8 = 7063.2 Pa
    #   base       p_b = p_i + rho_w g d_w           = 7063.2 + 11772  = 18835.2 Pa
    # Wall force per metre = area of the pressure diagram: the oil's
    # triangle p_i d_oil / 2 = 2825.28 N at d_oil / 3 below the interface
    # (1.2 + 0.8/3 above the base), plus the water's trapezoid
    # (p_i + p_b) d_w / 2 = 15539.04 N whose centroid lies
    # d_w (p_b + 2 p_i) / (3 (p_b + p_i)) above the base. The centre of
    # pressure is the moment-weighted mean height of the two. The floor
    # carries p_b * 2 m = 37670.4 N, the weight of both layers.
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", OPEN, "wall"])
    law = PressureLaw((Layer(1000.0, 1.2, "water"), Layer(900.0, 2.0, "oil")), gravity=9.81)
    e = integrate_edges(s, law)
    p_i, p_b = 900 * 9.81 * 0.8, 900 * 9.81 * 0.8 + 1000 * 9.81 * 1.2
    assert float(law.pressure(1.2)) == pytest.approx(p_i, rel=1e-12)
    assert e.p_start[1] == pytest.approx(p_b, rel=1e-12)  # right wall starts at the base
    f_oil, z_oil = p_i * 0.8 / 2, 1.2 + 0.8 / 3
    f_w, z_w = (p_i + p_b) * 1.2 / 2, 1.2 * (p_b + 2 * p_i) / (3 * (p_b + p_i))
    assert e.fx[1] == pytest.approx(f_oil + f_w, rel=1e-12)
    assert e.fx[3] == pytest.approx(-(f_oil + f_w), rel=1e-12)
    assert e.centre_of_pressure[1, 1] == pytest.approx(
        (f_oil * z_oil + f_w * z_w) / (f_oil + f_w), rel=1e-12)
    assert e.centre_of_pressure[1, 0] == 2.0
    assert -e.fz[0] == pytest.approx(p_b * 2, rel=1e-12)
    assert list(e.layer_volumes) == pytest.approx([2.4, 1.6], rel=1e-12)
    assert list(e.layer_weights) == pytest.approx([2.4 * 9810, 1.6 * 900 * 9.81], rel=1e-12)
    assert e.fluid_weight == pytest.approx(p_b * 2, rel=1e-12)
    assert e.wetted_length[1] == pytest.approx(2.0)
    # The interface cuts both walls: the kink sits at 1.2 m on each.
    assert e.max_pressure == pytest.approx(p_b, rel=1e-12)


def test_uniform_gas_pressure_against_hand_values():
    # Closed box 2 m wide and 3 m high, water 1 m deep (g = 10) under
    # 10 kPa of gas: the right wall carries p_gas over 3 m plus the water's
    # triangle rho g H^2 / 2; the roof p_gas * 2 m upward; the floor
    # (p_gas + rho g H) * 2 m downward. Floor minus roof is the water's
    # weight, 20 kN (common practice: a uniform pressure adds no net force
    # over a closed boundary).
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", "roof", "wall"])
    law = PressureLaw.single(1000.0, 1.0, gravity=10.0, gas_pressure=10000.0)
    e = integrate_edges(s, law)
    assert e.fx[1] == pytest.approx(10000 * 3 + 1000 * 10 * 1 / 2, rel=1e-12)
    # Centre of pressure: moments about the base, (30000 * 1.5 + 5000 / 3) / 35000.
    assert e.centre_of_pressure[1, 1] == pytest.approx((30000 * 1.5 + 5000 / 3) / 35000, rel=1e-12)
    assert e.fz[2] == pytest.approx(20000.0, rel=1e-12)
    assert e.centre_of_pressure[2, 0] == pytest.approx(1.0, rel=1e-12)  # uniform: at mid-span
    assert -e.fz[0] == pytest.approx((10000 + 10000) * 2, rel=1e-12)
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=1e-12)
    assert e.fluid_weight == pytest.approx(20000.0, rel=1e-12)
    assert e.p_end[1] == 10000.0 and e.p_start[2] == 10000.0
    assert list(e.wetted_length) == pytest.approx([2.0, 1.0, 0.0, 1.0])


def test_gas_on_an_axisymmetric_drum_against_hand_values():
    # Closed drum, radius 1 m, 2 m high, water 0.5 m deep (g = 10) under
    # 5 kPa: the lid carries p_gas pi R^2 upward; the wall's hoop force at
    # the top is p_gas R (membrane formula, N = p r).
    s = Section.build([[0, 0], [1, 0], [1, 2], [0, 2]], parts=["floor", "wall", "roof", "axis"],
                      kind="axisymmetric")
    law = PressureLaw.single(1000.0, 0.5, gravity=10.0, gas_pressure=5000.0)
    e = integrate_edges(s, law)
    assert e.fz[2] == pytest.approx(5000 * np.pi, rel=1e-12)
    assert -e.fz[0] == pytest.approx((5000 + 5000) * np.pi, rel=1e-12)
    assert e.hoop_end[1] == pytest.approx(5000.0, rel=1e-12)
    assert e.hoop_start[1] == pytest.approx(10000.0, rel=1e-12)
    assert -float(np.sum(e.fz)) == pytest.approx(1000 * 10 * np.pi * 0.5, rel=1e-12)


def test_a_full_vacuum_is_accepted_and_below_it_refused():
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", "roof", "wall"])
    law = PressureLaw.single(1000.0, 1.0, gravity=10.0, gas_pressure=-101325.0)
    e = integrate_edges(s, law)
    assert e.fz[2] == pytest.approx(-101325.0 * 2)  # the roof is pulled down
    assert -float(np.sum(e.fz)) == pytest.approx(e.fluid_weight, rel=1e-12)
    with pytest.raises(PressureLawError, match=r"below a full vacuum \(-101325 Pa gauge\)"):
        PressureLaw.single(1000.0, 1.0, gas_pressure=-101325.5)


# --------------------------------------------------------------- refusals


def test_a_denser_layer_over_a_lighter_one_is_refused_naming_both():
    with pytest.raises(PressureLawError) as err:
        PressureLaw((Layer(900.0, 1.0, "fat and grease"), Layer(1010.0, 2.0, "sewage")))
    msg = str(err.value)
    assert msg == ("layer 2 'sewage' (1010 kg/m3) lies on layer 1 'fat and grease' (900 kg/m3), "
                   "which is lighter: immiscible liquids settle densest at the bottom")
    assert isinstance(err.value, ValueError) and "\n" not in msg


@pytest.mark.parametrize("layers, gas, match", [
    ((Layer(1000.0, 2.0), Layer(900.0, 2.0)), 0.0, "layer 2 has the free surface at 2 m"),
    ((Layer(1000.0, 2.0, "a"), Layer(900.0, 1.0, "b"), Layer(800.0, 3.0)), 0.0,
     "layer 2 'b' has its top at 1 m, not above the top of layer 1 'a' at 2 m"),
    ((Layer(-5.0, 2.0),), 0.0, "layer 1 density must be between"),
    ((Layer(1000.0, float("nan")),), 0.0, "layer 1 top must be a finite number"),
    ((Layer(1000.0, 1.0),), float("inf"), "gas pressure must be a finite number"),
    ((Layer(1000.0, 1.0),), 2e9, "gas pressure 2e\\+09 Pa is above the limit"),
    ((), 0.0, "at least one layer"),
])
def test_bad_laws_are_refused_in_one_line(layers, gas, match):
    with pytest.raises(PressureLawError, match=match) as err:
        PressureLaw(layers, gas_pressure=gas)
    assert "\n" not in str(err.value)


def test_gas_over_an_open_section_is_refused():
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", OPEN, "wall"])
    with pytest.raises(PressureLawError, match="a gas pressure needs a closed section"):
        integrate_edges(s, PressureLaw.single(1000.0, 1.0, gas_pressure=100.0))


def test_bad_caps_are_refused():
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]])
    law = PressureLaw.single(1000.0, 1.0)
    with pytest.raises(PressureLawError, match="one level per edge"):
        integrate_edges(s, law, caps=[1.0, 1.0])
    with pytest.raises(PressureLawError, match="at or below the free surface"):
        integrate_edges(s, law, caps=[1.0, 1.0, 1.5, 1.0])


# --------------------------------------------------- layers given by volume


@SETTINGS
@given(s=sections, fracs=st.lists(st.floats(0.01, 0.3), min_size=1, max_size=3))
def test_interfaces_from_layer_volumes_hold_those_volumes(s, fracs):
    # Solved exactly like a fill volume: the volume below each interface is
    # the sum of the layers' own volumes (physics spec, level from volume).
    cap = volume_below(s, s.top_level)
    assume(s.top_level - s.z_min > 1e-6 * size_of(s))
    volumes = [f * cap for f in fracs]
    tops = layer_tops(s, [("volume", v) for v in volumes])
    for top, below in zip(tops, np.cumsum(volumes), strict=True):
        assert volume_below(s, top) == pytest.approx(below, rel=1e-9, abs=1e-12 * cap)


def test_layer_tops_mix_levels_and_volumes_and_refuse_too_much():
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", OPEN, "wall"])
    assert layer_tops(s, [("top", 0.5), ("volume", 2.0)]) == [0.5, 1.5]
    with pytest.raises(PressureLawError, match="layer 2 'sludge' volume 6 m3 with the layers "
                                               "below it makes 7 m3, more than the section"):
        layer_tops(s, [("volume", 1.0), ("volume", 6.0)], names=["sewage", "sludge"])
    with pytest.raises(PressureLawError, match="layer 1 volume must be >= 0"):
        layer_tops(s, [("volume", -1.0)])
    with pytest.raises(PressureLawError, match="given by 'top' or 'volume'"):
        layer_tops(s, [("depth", 1.0)])


def test_liquid_volume_with_caps_leaves_out_the_air():
    # A closed box with a pocket cap on its roof and walls: the volume below
    # 2 m with the walls' liquid surface at 1.5 m is the box below 1.5 m
    # (the roof's cap adds nothing: it is horizontal).
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]])
    assert liquid_volume_below(s, 2.0) == pytest.approx(4.0)
    assert liquid_volume_below(s, 2.0, [2.0, 1.5, 2.0, 1.5]) == pytest.approx(3.0)


def test_a_free_surface_above_the_spill_level_is_refused():
    # The caller caps the level (hydrostatics.resolve_level); an uncapped one
    # is a wiring fault, said in one line.
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]], parts=["floor", "wall", OPEN, "wall"])
    with pytest.raises(PressureLawError, match="free surface 3.5 m is above the spill level 3 m"):
        integrate_edges(s, PressureLaw.single(1000.0, 3.5))
    assert integrate_edges(s, PressureLaw.single(1000.0, 3.0)).volume == pytest.approx(6.0)


def test_a_floor_at_the_level_acts_at_its_midpoint_as_in_solve():
    # An empty section's floor at the level: wetted at zero pressure; its
    # centre of pressure is the midpoint (the limit of a floor just below the
    # surface), as solve() gives (found by hypothesis on a nonagon at frac 0).
    s = Section.build([[0, 0], [2, 0], [3, 1], [1, 2], [-1, 1]])
    r = solve(s, 0.0, 500.0, G)
    e = integrate_edges(s, PressureLaw.single(500.0, r.level, gravity=G))
    assert e.wetted_length[0] == 2.0 and e.fz[0] == 0.0
    np.testing.assert_array_equal(e.centre_of_pressure[0], [1.0, 0.0])
    np.testing.assert_array_equal(e.centre_of_pressure[0], r.centre_of_pressure[0])
