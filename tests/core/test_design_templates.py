"""The design templates (buried wet well, buried chamber, grease trap,
closed chamber with a downstand lip) and their samples, against hand values.

Hand values are derived in the comments from first principles: hydrostatics
of layers (Cengel & Cimbala, Fluid Mechanics, sec. 3-1 to 3-4), Archimedes'
principle (sec. 3-6), Boyle's law for the trapped air (sec. 2-2), the
effective soil stress (Craig's Soil Mechanics, ch. 3), unit weights
25 kN/m3 (EN 1991-1-1 Table A.1) and 18 / 20 kN/m3 (common practice).
"""

import pytest
from test_case_laws import bell_interface

from wetline.core.load_cases import EMPTY, SPILL
from wetline.core.section_file import read_design
from wetline.core.structure import self_weight
from wetline.core.templates import TEMPLATES

G0 = 9.80665
RW = 1000.0 * G0
DESIGNS = ("buried_wet_well", "buried_chamber", "grease_trap", "chamber_with_lip")


@pytest.mark.parametrize("key", DESIGNS)
def test_each_design_template_builds_a_checked_design(key):
    t = TEMPLATES[key]
    assert t.has_design
    d = t.design()
    assert d.structure is not None and d.ground is not None
    assert d.ground.level == d.section.top_level  # the ground at the top of the opening
    assert len(d.cases) == 4
    for s in d.solve_all():
        sol = s.solution
        assert sol.floor_force + sol.support_reaction == pytest.approx(sol.fluid_weight,
                                                                       rel=1e-9, abs=1e-6)
    assert set(d.structure.parts) <= {"base", "outer wall", "outer roof", "top"}
    assert d.structure.parts[0] == "base"


def test_templates_without_a_design_give_one_case():
    t = TEMPLATES["open_tank"]
    assert not t.has_design
    d = t.design()
    assert d.names == ("Open rectangular tank",) and d.structure is None


@pytest.mark.parametrize("key", ["buried_wet_well", "buried_chamber"])
def test_the_usual_four_cases(key):
    normal, overflow, test, empty = TEMPLATES[key].design().cases
    assert normal.name == "normal top water" and normal.groundwater is not None
    assert overflow.fill_level == SPILL and overflow.groundwater is not None
    assert test.fill_level == SPILL and test.groundwater is None
    assert test.name == "water test (full, no groundwater)"
    assert empty.fill_level == EMPTY
    assert empty.groundwater.level == TEMPLATES[key].design().ground.level


def test_the_buried_wet_well_floats_by_hand(sample):
    # Cavity 3 m x 3.5 m under a roof, shaft 1.2 m x 1 m to ground at 4.5 m;
    # walls 0.35 m, base 0.5 m, roof 0.3 m. Outer outline: 3.7 m x 4.3 m to
    # the roof top (3.8 m), plus the shaft's 1.9 m x 0.7 m; 17.24 m2.
    # Concrete 17.24 - (3 x 3.5 + 1.2 x 1) = 5.54 m2: G = 25 kN/m3 x 5.54.
    # Flood groundwater at ground level: U = rho_w g 17.24 (all submerged);
    # soil on the roof, 1.8 m wide, 0.7 m deep, submerged: (20000 - rho_w g).
    d = read_design(sample("buried_wet_well"))
    s = d.solve("empty, flood groundwater at ground level")
    loads = s.structure
    G = 25000.0 * 5.54
    soil = 1.8 * 0.7 * (20000.0 - RW)
    U = RW * 17.24
    assert self_weight(d.structure, d.section) == pytest.approx(G, rel=1e-12)
    assert loads.soil_weight == pytest.approx(soil, rel=1e-12)
    assert loads.flotation.uplift == pytest.approx(U, rel=1e-12)
    assert loads.flotation.factor == pytest.approx((G + soil) / U, rel=1e-12)
    assert not loads.flotation.ok  # 0.895 < 1.111: the designer sees it
    # The base slab: groundwater 5 m above its underside at -0.5 m, no liquid.
    assert loads.base_net_max.net == pytest.approx(RW * 5.0, rel=1e-12)


def test_the_grease_trap_sample_by_hand(sample):
    # Fat 900 kg/m3 0.15 m thick on raw sewage 1010 kg/m3 to the outlet at
    # 2 m, 2.5 m wide: p(1.85) = 900 g 0.15, p(0) = p(1.85) + 1010 g 1.85;
    # the floor carries 2.5 p(0), the weight of both layers.
    d = read_design(sample("grease_trap"))
    s = d.solve("normal operation: grease on sewage").solution
    p0 = G0 * (900 * 0.15 + 1010 * 1.85)
    assert [la.name for la in s.layers] == ["raw sewage", "fats, oils and grease"]
    assert s.max_pressure == pytest.approx(p0, rel=1e-12)
    assert s.floor_force == pytest.approx(2.5 * p0, rel=1e-12)
    assert [la.volume for la in s.layers] == pytest.approx([2.5 * 1.85, 2.5 * 0.15], rel=1e-12)
    # The wall's force: the kinked diagram's area, per metre run.
    wall = G0 * (900 * 0.15 ** 2 / 2 + 900 * 0.15 * 1.85 + 1010 * 1.85 ** 2 / 2)
    assert s.fx[1] == pytest.approx(wall, rel=1e-12)


def test_the_closed_chamber_traps_air_under_its_roof(sample):
    # The roof's air (x from 1 to 3 m, above the lip at 1.5 m under the roof
    # at 2 m) is sealed with 1 m2 at atmospheric pressure; with the riser full
    # (4 m) its interface solves Boyle's law (bell_interface, by hand). The
    # roof is lifted by the air's pressure over its 2 m: more than the vented
    # roof, by the depth the air is pushed down.
    d = read_design(sample("chamber_with_lip"))
    vented = d.solve("riser full, pockets vented").solution
    trapped = d.solve("riser full, air trapped under the roof").solution
    rho = vented.density  # fresh water at 10 C (IAPWS-95)
    z_i = bell_interface(4.0, rho=rho)
    (p,) = trapped.pockets
    assert (p.sealed_at, p.interface) == (1.5, pytest.approx(z_i, rel=1e-9))
    assert trapped.parts["roof"].down == pytest.approx(-2 * rho * G0 * (4.0 - z_i), rel=1e-9)
    assert vented.parts["roof"].down == pytest.approx(-2 * rho * G0 * 2.0, rel=1e-12)
    (rv,) = d.resolve("riser full, pockets vented").uplift()
    (rt,) = d.resolve("riser full, air trapped under the roof").uplift()
    assert rt.worst_pockets == "trapped" and rt.worst_uplift > rv.worst_uplift
    # The roof's resistance: a 0.3 m slab over its 2 m span and 1.7 m of dry soil.
    assert rt.resistance == pytest.approx(25000 * 0.3 * 2.0 + 18000 * 1.7 * 2.0, rel=1e-12)
