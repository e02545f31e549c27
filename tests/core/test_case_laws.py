"""Load cases with the full pressure law: layers, gas, trapped pockets.

Hand values are derived from first principles in the comments (hydrostatics
of immiscible layers and Boyle's law, Cengel & Cimbala, Fluid Mechanics,
sec. 3-1 to 3-4 and 2-2); each check says what it checks against.
"""

import math

import numpy as np
import pytest

from wetline.core.case import Case
from wetline.core.fill import volume_below
from wetline.core.hydrostatics import solve, solve_law
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import (
    EMPTY,
    SPILL,
    Design,
    LiquidLayer,
    LoadCase,
    LoadCaseError,
)
from wetline.core.pockets import STANDARD_ATMOSPHERE
from wetline.core.pressure_law import Layer, PressureLaw, liquid_volume_below
from wetline.core.section import Section
from wetline.core.structure import Groundwater, Structure
from wetline.core.uplift import PartResistance

G0 = 9.80665
SEWAGE = custom_liquid(1010.0, "sewage")
FAT = custom_liquid(900.0, "fat")
WATER = custom_liquid(1000.0, "water")


def tank(top="open"):
    """A rectangular tank 2 m wide, 4 m high, per metre run."""
    return Section.build([[0, 0], [2, 0], [2, 4], [0, 4]],
                         parts=["floor", "wall", top, "wall"], name="tank")


def chamber():
    """A chamber whose roof (z = 2, x from 1 to 3) lies below the top of an
    open riser (x from 0 to 0.8, to z = 4); the riser's wall reaches down to
    a lip at z = 1.5, so the roof's air is trapped when the water seals it."""
    return Section.build([[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5], [0.8, 1.5], [0.8, 4],
                          [0, 4]],
                         parts=["floor", "wall", "roof", "lip", "lip", "riser", "open",
                                "riser"], name="chamber")


def design(section, *cases, level=3.2, **kw):
    return Design(Case(section, WATER, fill_level=level, **kw), cases=tuple(cases))


# ------------------------------------------------------------------ layers
def test_fat_on_sewage_against_hand_formulas():
    # Fat 900 kg/m3 from 2.9 m to 3.2 m on sewage 1010 kg/m3, tank 2 m wide:
    # p(2.9) = 900 g 0.3; p(0) = p(2.9) + 1010 g 2.9; the wall carries
    # int p dz = 900 g 0.3^2 / 2 + 900 g 0.3 x 2.9 + 1010 g 2.9^2 / 2, at the
    # centroid of the kinked diagram; the floor 2 p(0) = the weight of both.
    d = design(tank(), LoadCase("grease", layers=(LiquidLayer(SEWAGE, top=2.9),
                                                   LiquidLayer(FAT))))
    r = d.solve().solution
    g = G0
    p_i = 900 * g * 0.3
    p_0 = p_i + 1010 * g * 2.9
    wall = 900 * g * 0.3 ** 2 / 2 + 900 * g * 0.3 * 2.9 + 1010 * g * 2.9 ** 2 / 2
    # Moment about z = 0 of the three pressure pieces (triangle, rectangle,
    # triangle) for the height of the centre of pressure.
    moment = (900 * g * 0.3 ** 2 / 2 * (2.9 + 0.3 / 3) + 900 * g * 0.3 * 2.9 * 1.45
              + 1010 * g * 2.9 ** 2 / 2 * (2.9 / 3))
    assert r.max_pressure == pytest.approx(p_0, rel=1e-12)
    assert r.density == 1010.0
    assert r.fx[1] == pytest.approx(wall, rel=1e-12)
    assert r.centre_of_pressure[1, 1] == pytest.approx(moment / wall, rel=1e-12)
    assert r.floor_force == pytest.approx(2 * p_0, rel=1e-12)
    assert r.fluid_weight == pytest.approx(g * (1010 * 5.8 + 900 * 0.6), rel=1e-12)
    assert [(la.name, la.bottom, la.top) for la in r.layers] == [
        ("sewage", 0.0, 2.9), ("fat", 2.9, 3.2)]
    assert [la.volume for la in r.layers] == pytest.approx([5.8, 0.6], rel=1e-12)
    assert [la.weight for la in r.layers] == pytest.approx(
        [1010 * g * 5.8, 900 * g * 0.6], rel=1e-12)


def test_layer_by_volume_and_fill_by_volume():
    # 4 m3 of sewage in a tank 2 m wide: its interface at 2 m; 5 m3 in all:
    # the surface at 2.5 m.
    d = design(tank(), LoadCase("by volume", fill_volume=5.0,
                                layers=(LiquidLayer(SEWAGE, volume=4.0), LiquidLayer(FAT))))
    r = d.resolve("by volume")
    assert r.law.interfaces == pytest.approx((2.0,), rel=1e-12)
    assert r.level == pytest.approx(2.5, rel=1e-12)
    assert r.solve().volume == pytest.approx(5.0, rel=1e-12)


def test_one_liquid_cases_are_solve_bit_for_bit():
    s = tank()
    r = design(s, LoadCase("plain")).solve("plain").solution
    ref = solve(s, 3.2, 1000.0)
    for name in ("p_start", "p_end", "fx", "fz", "centre_of_pressure"):
        np.testing.assert_array_equal(getattr(r, name), getattr(ref, name))
    assert r.pocket_mode == "vented" and r.pockets == () and r.gas_pressure == 0.0
    assert [la.name for la in r.layers] == [""] and r.layers[0].volume == r.volume


def test_layer_refusals_name_the_case_and_the_layers():
    with pytest.raises(LoadCaseError, match=r"^case 'g': layer 2 'sewage' \(1010 kg/m3\) lies on "
                                            r"layer 1 'fat' \(900 kg/m3\), which is lighter: "
                                            r"immiscible liquids settle densest at the bottom$"):
        LoadCase("g", layers=(LiquidLayer(FAT, top=1.0), LiquidLayer(SEWAGE)))
    with pytest.raises(LoadCaseError, match=r"^case 'g': layer 2 'fat' has its top at 1 m, not "
                                            r"above the top of layer 1 'sewage' at 2 m: layer "
                                            r"tops must rise$"):
        LoadCase("g", layers=(LiquidLayer(SEWAGE, top=2.0), LiquidLayer(FAT, top=1.0),
                              LiquidLayer(custom_liquid(800.0, "oil"))))
    with pytest.raises(LoadCaseError, match=r"^case 'g': layer 1 'sewage' needs a top \(the "
                                            r"level of its upper interface\) or a volume$"):
        LoadCase("g", layers=(LiquidLayer(SEWAGE), LiquidLayer(FAT)))
    with pytest.raises(LoadCaseError, match=r"^case 'g': the top layer \(layer 2 'fat'\) reaches "
                                            r"the case's fill level: give the fill \(level or "
                                            r"volume\), not a top of the top layer$"):
        LoadCase("g", layers=(LiquidLayer(SEWAGE, top=2.0), LiquidLayer(FAT, top=3.0)))
    with pytest.raises(LoadCaseError, match=r"^case 'g': give a liquid or layers, not both$"):
        LoadCase("g", liquid=WATER, layers=(LiquidLayer(WATER),))
    with pytest.raises(LoadCaseError, match=r"^case 'g': layers must hold at least one layer$"):
        LoadCase("g", layers=())
    with pytest.raises(LoadCaseError, match=r"^a layer gives one of top and volume, not both$"):
        LiquidLayer(SEWAGE, top=1.0, volume=2.0)
    with pytest.raises(LoadCaseError, match=r"^layer volume must be >= 0, not -1$"):
        LiquidLayer(SEWAGE, volume=-1.0)


def test_a_fill_level_below_an_interface_is_refused_naming_the_case_and_layer():
    s = tank()
    layers = (LiquidLayer(SEWAGE, top=2.9), LiquidLayer(FAT))
    with pytest.raises(LoadCaseError, match=r"^case 'low': the fill level 2\.5 m is not above the "
                                            r"top of layer 1 'sewage' at 2\.9 m: every layer but "
                                            r"the top one must lie below the free surface$"):
        design(s, LoadCase("low", fill_level=2.5, layers=layers))
    # The spill level (4 m) below an interface given at 4.5 m: the capped level.
    with pytest.raises(LoadCaseError, match=r"^case 'over': the spill level 4 m is not above the "
                                            r"top of layer 1 'sewage' at 4\.5 m"):
        design(s, LoadCase("over", fill_level=SPILL,
                           layers=(LiquidLayer(SEWAGE, top=4.5), LiquidLayer(FAT))))
    with pytest.raises(LoadCaseError, match=r"^case 'capped': the fill level 4 m \(capped at the "
                                            r"spill level\) is not above the top of layer 1 "
                                            r"'sewage' at 4\.2 m"):
        design(s, LoadCase("capped", fill_level=5.0,
                           layers=(LiquidLayer(SEWAGE, top=4.2), LiquidLayer(FAT))))
    with pytest.raises(LoadCaseError, match=r"^case 'v': fill volume 3 m3 does not reach the top "
                                            r"interface at 2 m: the layers below it hold 4 m3$"):
        design(s, LoadCase("v", fill_volume=3.0,
                           layers=(LiquidLayer(SEWAGE, volume=4.0), LiquidLayer(FAT))))
    with pytest.raises(LoadCaseError, match=r"^case 'e': an 'empty' fill holds no layers"):
        design(s, LoadCase("e", fill_level=EMPTY, layers=layers))


# --------------------------------------------------------------------- gas
def test_gas_pressure_against_hand_values():
    # A closed tank 2 m wide and 4 m high, water 1 m deep under 20 kPa: the
    # floor carries (20000 + 1000 g) x 2, the roof 20000 x 2 upward; the net
    # of the gas over the closed cavity is zero (floor + support = weight).
    d = design(tank("roof"), LoadCase("gas", fill_level=1.0, gas_pressure=20000.0))
    r = d.solve("gas").solution
    assert r.gas_pressure == 20000.0
    assert r.max_pressure == pytest.approx(20000.0 + 1000 * G0, rel=1e-12)
    assert r.parts["floor"].down == pytest.approx(2 * (20000.0 + 1000 * G0), rel=1e-12)
    assert r.parts["roof"].down == pytest.approx(-2 * 20000.0, rel=1e-12)
    assert r.p_start[2] == r.p_end[2] == 20000.0  # the dry roof carries the gas
    assert r.floor_force + r.support_reaction == pytest.approx(r.fluid_weight, rel=1e-12)


def test_gas_refusals():
    with pytest.raises(LoadCaseError, match=r"^case 'g': a gas pressure needs a closed section "
                                            r"\(no 'open' edge\): an open section's surface is "
                                            r"at atmospheric pressure$"):
        design(tank(), LoadCase("g", gas_pressure=1000.0))
    with pytest.raises(LoadCaseError, match=r"^case 'g': gas pressure -101326 Pa is below a full "
                                            r"vacuum \(-101325 Pa gauge\)$"):
        LoadCase("g", gas_pressure=-101326.0)
    assert LoadCase("g", gas_pressure=-101325.0).gas_pressure == -101325.0
    with pytest.raises(LoadCaseError, match=r"^case 'g': gas pressure -90000 Pa gauge is below a "
                                            r"full vacuum under an atmosphere of 80000 Pa$"):
        LoadCase("g", gas_pressure=-90000.0, atmospheric_pressure=80000.0)
    with pytest.raises(LoadCaseError, match=r"^case 'g': atmospheric pressure must be a positive "
                                            r"number of Pa up to 1e\+09, not 0$"):
        LoadCase("g", atmospheric_pressure=0.0)
    with pytest.raises(LoadCaseError, match=r"^case 'g': pockets must be 'vented' or 'trapped', "
                                            r"not 'sealed'$"):
        LoadCase("g", pockets="sealed")


def test_the_base_carries_the_gas_in_its_net_upward_pressure():
    # An empty closed box under 5 kPa of gas, groundwater 2 m over its 0.3 m
    # thick base underside at z = -0.3: net = 1000 g 2.3 - 5000 (the gas
    # presses the floor down).
    s = tank("roof")
    st = Structure.build([[-0.3, -0.3], [2.3, -0.3], [2.3, 4.3], [-0.3, 4.3]], cavity=s)
    d = Design(Case(s, WATER, fill_level=0.0), st, cases=(
        LoadCase("empty under gas", fill_level=EMPTY, gas_pressure=5000.0,
                 groundwater=Groundwater(2.0)),))
    loads = d.solve().structure
    assert loads.base_net_max.net == pytest.approx(1000 * G0 * 2.3 - 5000.0, rel=1e-12)


# ----------------------------------------------------------- trapped pockets
def bell_interface(h, rho=1000.0, g=G0, p_atm=STANDARD_ATMOSPHERE):
    """The roof's air of :func:`chamber` at water level h, by hand (Boyle):
    sealed at the lip (1.5 m) with V0 = 2 m x 0.5 m; with an air height u
    under the roof (z = 2), V = 2 u and
    p_atm V0 = (p_atm + rho g (h - 2 + u)) 2 u, a quadratic in u:
    2 rho g u^2 + 2 (p_atm + rho g (h - 2)) u - p_atm V0 = 0."""
    a = 2 * rho * g
    b = 2 * (p_atm + rho * g * (h - 2))
    c = -p_atm * 1.0
    u = (-b + math.sqrt(b * b - 4 * a * c)) / (2 * a)
    return 2 - u


def test_trapped_air_under_the_roof_against_boyles_law():
    d = design(chamber(), LoadCase("vented", fill_level=3.5),
               LoadCase("trapped", fill_level=3.5, pockets="trapped"), level=3.5)
    vented, trapped = (s.solution for s in d.solve_all())
    z_i = bell_interface(3.5)
    (p,) = trapped.pockets
    assert p.sealed_at == 1.5
    assert p.interface == pytest.approx(z_i, rel=1e-9)
    assert p.air_pressure == pytest.approx(1000 * G0 * (3.5 - z_i), rel=1e-9)
    assert p.air_volume == pytest.approx(2 * (2 - z_i), rel=1e-9)
    # The roof carries the air's pressure, the vented roof the water's depth.
    assert trapped.parts["roof"].down == pytest.approx(-2 * p.air_pressure, rel=1e-9)
    assert vented.parts["roof"].down == pytest.approx(-2 * 1000 * G0 * 1.5, rel=1e-12)
    assert trapped.pocket_mode == "trapped" and vented.pockets == ()
    # Air is weightless: equilibrium with less liquid.
    assert trapped.volume == pytest.approx(vented.volume - p.air_volume, rel=1e-12)
    assert trapped.floor_force + trapped.support_reaction == pytest.approx(
        trapped.fluid_weight, rel=1e-12)


def test_a_fill_by_volume_stands_higher_with_the_air_in_place():
    s = chamber()
    v = volume_below(s, 2.5)
    d = design(s, LoadCase("v", fill_volume=v, pockets="trapped"), level=3.0)
    r = d.resolve()
    sol = r.solve()
    assert r.level > 3.0  # about 1 m3 of air under the roof, 0.8 m wide riser
    assert liquid_volume_below(s, r.level, sol.caps) == pytest.approx(v, rel=1e-9)
    assert sol.volume == pytest.approx(v, rel=1e-9)


def test_uplift_check_states_its_assumption_and_searches_both():
    s = chamber()
    res = {"roof": PartResistance(self_weight=30000.0)}
    d = Design(Case(s, WATER, fill_level=3.5, resistances=res), cases=(
        LoadCase("vented"), LoadCase("trapped", pockets="trapped")))
    (rv,) = d.resolve("vented").uplift()
    (rt,) = d.resolve("trapped").uplift()
    assert (rv.pockets, rv.worst_pockets, rv.assumption) == ("vented", "vented",
                                                             "pockets vented")
    # Vented, the worst is the riser full (4 m): 1000 g (4 - 2) x 2 up.
    assert rv.worst_level == pytest.approx(4.0)
    assert rv.worst_uplift == pytest.approx(1000 * G0 * 2 * 2, rel=1e-12)
    # Trapped, the air lifts the roof more; its worst is the riser full too.
    assert (rt.pockets, rt.worst_pockets) == ("trapped", "trapped")
    z_i = bell_interface(4.0)
    assert rt.worst_level == pytest.approx(4.0, abs=1e-6)
    assert rt.worst_uplift == pytest.approx(2 * 1000 * G0 * (4.0 - z_i), rel=1e-9)
    assert rt.worst_uplift > rv.worst_uplift
    assert rt.uplift == pytest.approx(2 * 1000 * G0 * (3.5 - bell_interface(3.5)), rel=1e-9)


def test_a_sampled_trapped_search_is_a_lower_bound_exact_at_its_level():
    # The drag preview's search (refine=False) samples the range: what it
    # finds is the uplift at a real level (Boyle's law for the roof's air,
    # the bell_interface closed form), never more than the full search's.
    from wetline.core.uplift import worst_uplifts_for

    s = chamber()
    for level in (2.2, 3.5):
        d = design(s, LoadCase("trapped", pockets="trapped", fill_level=level))
        sol = d.resolve("trapped").solve()
        full = worst_uplifts_for(sol, ["roof", "floor"])
        quick = worst_uplifts_for(sol, ["roof", "floor"], refine=False)
        for part in ("roof", "floor"):
            assert quick[part][1] <= full[part][1] * (1 + 1e-12)
        h, up, pockets = quick["roof"]
        assert pockets == "trapped" and h == pytest.approx(4.0)  # the range's end is sampled
        assert up == pytest.approx(2 * 1000 * G0 * (h - bell_interface(h)), rel=1e-9)


def test_a_search_on_given_samples_is_exact_at_its_level():
    # A live preview hands the search the chart's trapped-air table: the
    # worst found is the table's largest uplift (the table's levels and the
    # lips), the roof's uplift there the closed form of Boyle's law for its
    # air (bell_interface), a lower bound on the full search's.
    from wetline.core.uplift import worst_uplifts_for

    s = chamber()
    d = design(s, LoadCase("trapped", pockets="trapped", fill_level=2.5))
    r = d.resolve("trapped")
    sol = r.solve()
    _vented, trapped = r.level_tables(steps=7)
    quick = worst_uplifts_for(sol, ["roof"], refine=False,
                              trapped_samples=(trapped.levels, trapped.part_down))
    h, up, pockets = quick["roof"]
    assert pockets == "trapped" and h in trapped.levels.tolist()
    assert up == pytest.approx(max(-trapped.part_down["roof"].min(), 0.0), rel=1e-12)
    assert up == pytest.approx(2 * 1000 * G0 * (h - bell_interface(h)), rel=1e-9)
    assert up <= worst_uplifts_for(sol, ["roof"])["roof"][1] * (1 + 1e-12)


def test_level_tables_give_both_assumptions_where_air_can_be_trapped():
    s = chamber()
    d = design(s, LoadCase("c"), level=3.0)
    vented, trapped = d.resolve().level_tables(steps=9)
    assert (vented.pockets, trapped.pockets) == ("vented", "trapped")
    np.testing.assert_array_equal(vented.levels, trapped.levels)
    h = float(trapped.levels[-1])
    assert trapped.part_down["roof"][-1] == pytest.approx(
        -2 * 1000 * G0 * (h - bell_interface(h)), rel=1e-9)
    assert vented.part_down["roof"][-1] == pytest.approx(-2 * 1000 * G0 * (h - 2), rel=1e-12)
    assert trapped.air_volume[-1] == pytest.approx(2 * (2 - bell_interface(h)), rel=1e-9)
    # Below the lip nothing is trapped: the two agree.
    below = trapped.levels <= 1.5
    np.testing.assert_allclose(trapped.part_down["roof"][below], vented.part_down["roof"][below],
                               rtol=1e-12, atol=1e-9)
    assert len(design(tank(), LoadCase("c")).resolve().level_tables(steps=5)) == 1


def test_the_pocket_tree_is_cached_per_section():
    s = chamber()
    assert s.pocket_tree is s.pocket_tree and s.pocket_tree.may_trap
    s.forget_derived()
    assert "pocket_tree" not in vars(s)


def test_solve_law_refuses_pockets_of_another_law():
    from wetline.core.pockets import trap_air

    s = chamber()
    a = PressureLaw.single(1000.0, 3.0, gravity=G0)
    b = PressureLaw((Layer(1200.0, 1.0, "x"), Layer(1000.0, 3.0, "y")), gravity=G0)
    with pytest.raises(ValueError, match="the pockets were trapped under another pressure law"):
        solve_law(s, b, pockets=trap_air(s.pocket_tree, a))
