"""Layers, gas and trapped air of a load case: every edit one undo step,
refusals with core's message, and the document's results equal to core's
own solve of the case.

Hand values: hydrostatics of stratified liquids, p(z) = p_gas + g * sum of
rho_k * (thickness of layer k above z) (Cengel & Cimbala, Fluid Mechanics,
sec. 3-1, pressure in a fluid of layers); Boyle's law for the trapped air is
checked against a hand computation in tests/core/test_pockets.py.
"""

import math

import numpy as np
import pytest

from wetline.app.model import editing
from wetline.app.model.document import Document
from wetline.core.liquids import LISTED_LIQUIDS, custom_liquid
from wetline.core.load_cases import TRAPPED, VENTED, LoadCaseError
from wetline.core.section_file import read_design

FAT = LISTED_LIQUIDS["fats, oils and grease"]
SEWAGE = LISTED_LIQUIDS["raw sewage"]


@pytest.fixture
def doc_of(qtbot, sample):
    def make(name):
        d = Document(read_design(sample(name)))
        d.flush()
        return d
    return make


def _undo_redo(doc, before):
    n = doc.undo_stack.count()
    for _ in range(n):
        doc.undo_stack.undo()
    doc.flush()
    assert doc.design is before
    for _ in range(n):
        doc.undo_stack.redo()
    doc.flush()


def _core_solution(doc):
    """Core's own solve of the active case (independent of the document)."""
    return doc.design.solve(doc.active_name).solution


def test_add_layer_splits_the_liquid_at_mid_depth_and_undoes(doc_of):
    doc = doc_of("closed_tank")
    before = doc.design
    h = doc.solution.level
    z0 = doc.section.z_min
    editing.add_layer(doc)
    doc.flush()
    assert doc.undo_stack.count() == 1
    layers = doc.active_load_case.layers
    assert len(layers) == 2
    assert layers[0].top == pytest.approx(0.5 * (z0 + h), abs=1e-12)
    # Two layers of one liquid: the loads of one liquid (no density step).
    one = before.solve(before.names[0]).solution
    assert doc.solution.floor_force == pytest.approx(one.floor_force, rel=1e-12)
    assert [ly.name for ly in doc.solution.layers] == [doc.case.liquid.name] * 2
    _undo_redo(doc, before)


def test_layer_liquid_gives_the_hand_pressures(doc_of):
    # Grease trap, first case: raw sewage (1010) to 1.85 m under fat (900)
    # to the spill level 2 m. Base pressure (hand, stratified hydrostatics):
    # g (900 * 0.15 + 1010 * 1.85); at the interface g * 900 * 0.15.
    doc = doc_of("grease_trap")
    sol = doc.solution
    g = doc.case.gravity
    assert doc.active_load_case.layers[1].liquid.density == 900.0
    i_floor = doc.section.parts.index("floor")
    assert sol.p_start[i_floor] == pytest.approx(g * (900 * 0.15 + 1010 * 1.85), rel=1e-12)
    # Change the fat to diesel (835): the base pressure follows.
    before = doc.design
    diesel = LISTED_LIQUIDS["diesel fuel"]
    editing.set_layer_liquid(doc, 1, diesel)
    doc.flush()
    assert doc.undo_stack.count() == 1
    assert "diesel" in doc.undo_stack.text(0)
    assert doc.solution.p_start[i_floor] == pytest.approx(g * (835 * 0.15 + 1010 * 1.85),
                                                          rel=1e-12)
    core = _core_solution(doc)
    assert doc.solution.floor_force == core.floor_force
    assert [(ly.volume, ly.weight) for ly in doc.solution.layers] == \
        [(ly.volume, ly.weight) for ly in core.layers]
    _undo_redo(doc, before)


def test_a_denser_layer_over_a_lighter_one_is_refused_with_cores_message(doc_of):
    doc = doc_of("grease_trap")
    before = doc.design
    with pytest.raises(LoadCaseError, match="which is lighter"):
        editing.move_layer(doc, 0, +1)  # sewage over fat
    with pytest.raises(LoadCaseError, match="settle densest at the bottom"):
        editing.set_layer_liquid(doc, 0, custom_liquid(850.0))
    assert doc.design is before and doc.undo_stack.count() == 0


def test_reorder_keeps_the_interfaces_and_swaps_the_liquids(doc_of):
    doc = doc_of("grease_trap")
    clear = custom_liquid(1010.0, "clarified water")  # as dense as the sewage
    editing.set_layer_liquid(doc, 1, clear)
    before = doc.design
    top = doc.active_load_case.layers[0].top
    assert editing.move_layer(doc, 1, -1) is True
    doc.flush()
    layers = doc.active_load_case.layers
    assert [ly.liquid.name for ly in layers] == ["clarified water", "raw sewage"]
    assert layers[0].top == top and layers[1].top is None
    assert doc.undo_stack.count() == 2
    assert doc.undo_stack.text(1).startswith("Move layer 2 'clarified water' down")
    assert [ly.name for ly in doc.solution.layers] == ["clarified water", "raw sewage"]
    assert editing.move_layer(doc, 1, +1) is False  # past the top: nothing
    assert editing.move_layer(doc, 0, -1) is False
    doc.undo_stack.undo()
    doc.flush()
    assert doc.design is before


def test_remove_layer_back_to_one_liquid(doc_of):
    doc = doc_of("grease_trap")
    before = doc.design
    editing.remove_layer(doc, 1)  # the fat goes; sewage up to the spill level
    doc.flush()
    lc = doc.active_load_case
    assert lc.layers is None and doc.case.liquid == SEWAGE
    assert len(doc.solution.layers) == 1
    g = doc.case.gravity
    i_floor = doc.section.parts.index("floor")
    assert doc.solution.p_start[i_floor] == pytest.approx(g * 1010 * 2.0, rel=1e-12)
    with pytest.raises(LoadCaseError, match="at least one liquid"):
        editing.remove_layer(doc, 0)
    _undo_redo(doc, before)


def test_layer_given_by_its_volume(doc_of):
    # Rectangular trap 2.5 m wide, 1 m run: 3 m3 of sewage stands 1.2 m deep.
    doc = doc_of("grease_trap")
    editing.set_layer_volume(doc, 0, 3.0)
    doc.flush()
    layers = doc.solution.layers
    assert layers[0].top == pytest.approx(1.2, abs=1e-12)
    assert layers[0].volume == pytest.approx(3.0, rel=1e-12)
    assert doc.active_load_case.layers[0].volume == 3.0
    editing.set_layer_top(doc, 0, 1.0, merge_key=("drag", 1))
    editing.set_layer_top(doc, 0, 1.1, merge_key=("drag", 1))
    doc.flush()
    assert doc.undo_stack.count() == 2  # the drag steps merge into one
    assert doc.solution.layers[0].top == 1.1
    with pytest.raises(LoadCaseError, match="top layer"):
        editing.set_layer_top(doc, 1, 1.9)


def test_gas_pressure_on_a_closed_section_only(doc_of):
    tank = doc_of("closed_tank")
    before = tank.design
    editing.set_gas_pressure(tank, 20e3)
    tank.flush()
    sol = tank.solution
    assert sol.gas_pressure == 20e3
    # Hand: the gas adds 20 kPa at every wetted point and on the dry roof.
    one = before.solve(before.names[0]).solution
    np.testing.assert_allclose(sol.p_start, np.where(one.p_start > 0, one.p_start, 0) + 20e3,
                               rtol=1e-12)
    editing.set_gas_pressure(tank, -101325.0)  # a full vacuum is accepted
    with pytest.raises(LoadCaseError, match="below a full vacuum"):
        editing.set_gas_pressure(tank, -101326.0)
    _undo_redo(tank, before)
    trap = doc_of("grease_trap")
    with pytest.raises(LoadCaseError, match="needs a closed section"):
        editing.set_gas_pressure(trap, 1000.0)


def test_trapped_air_and_atmosphere(doc_of):
    doc = doc_of("chamber_with_lip")
    before = doc.design
    assert doc.solution.pockets == ()
    editing.set_pockets(doc, TRAPPED)
    doc.flush()
    sol = doc.solution
    assert sol.pocket_mode == TRAPPED and len(sol.pockets) == 1
    core = _core_solution(doc)
    assert [p.interface for p in sol.pockets] == [p.interface for p in core.pockets]
    for p in sol.pockets:
        # Boyle (Cengel & Cimbala sec. 3-1 with p V = const): the air's
        # absolute pressure times its volume is the sealed air's.
        assert p.sealed_at == pytest.approx(1.5)
        assert p.air_pressure == pytest.approx(doc.design.resolve(
            doc.active_name).law.pressure_at(p.interface), rel=1e-12)
        # The roof's air sealed at the lip: 2 m x 0.5 m x 1 m run = 1 m3 at
        # one atmosphere; now (p_atm + p_air) V = p_atm * 1 m3, V = 2 m x
        # (2 m - z_i) (hand, a rectangle under the roof).
        assert p.air_volume == pytest.approx(2.0 * (2.0 - p.interface), rel=1e-12)
        assert (101325.0 + p.air_pressure) * p.air_volume == pytest.approx(101325.0, rel=1e-9)
    editing.set_atmospheric_pressure(doc, 90e3)
    doc.flush()
    assert doc.solution.atmospheric_pressure == 90e3
    with pytest.raises(LoadCaseError, match="atmospheric pressure"):
        editing.set_atmospheric_pressure(doc, 0.0)
    editing.set_pockets(doc, VENTED)
    doc.flush()
    assert doc.solution.pockets == ()
    assert doc.undo_stack.count() == 3
    _undo_redo(doc, before)


def test_chart_tables_show_both_assumptions_where_air_can_be_trapped(doc_of):
    doc = doc_of("chamber_with_lip")
    tables = doc.level_tables
    assert [t.pockets for t in tables] == [VENTED, TRAPPED]
    # Above the lip the trapped air presses the roof up harder than vented
    # water at the same level (the interface is below the roof, the roof
    # feels the pressure of the deeper interface: issue 10's point).
    roof_v, roof_t = tables[0].part_down["roof"], tables[1].part_down["roof"]
    high = tables[0].levels > 2.5
    assert np.all(roof_t[high] < roof_v[high])  # more uplift (negative down)
    r = doc.design.resolve(doc.active_name)
    k = int(np.argmin(np.abs(tables[1].levels - 3.0)))
    ref = r.solve_at(float(tables[1].levels[k]), TRAPPED)
    assert roof_t[k] == pytest.approx(ref.parts["roof"].down, rel=1e-9)
    open_tank = doc_of("open_tank")
    assert len(open_tank.level_tables) == 1
    assert math.isfinite(float(open_tank.level_tables[0].floor_force[-1]))
