"""Layers, gas and trapped air in the window: the liquid panel's layer
list, the gas field, the canvas's interfaces, kinked diagrams and pockets,
the totals per layer, the chart's two assumptions and the uplift panel's
statement.

Every number shown is compared with core's own solve of the case
(``Design.solve``); core's numbers are checked against hand formulas in
tests/core (two-layer tank, Boyle's law). The hand value here: pressure at
an interface of fat 0.15 m deep over sewage, g * 900 * 0.15 (stratified
hydrostatics, Cengel & Cimbala, Fluid Mechanics, sec. 3-1).
"""

import numpy as np
import pytest

from wetline.app.render.geometry import wetted_edges
from wetline.core.load_cases import TRAPPED
from wetline.core.section_file import read_design


@pytest.fixture
def window_of(make_window, sample):
    def make(name, case=0):
        w = make_window(read_design(sample(name)))
        w.doc.select_case(case)
        w.doc.flush()
        w.canvas.redraw()
        return w
    return make


def _core(w):
    return w.doc.design.solve(w.doc.active_name).solution


def test_layer_list_edits_the_selected_layer_and_refuses_a_heavier_top(window_of, settle):
    w = window_of("grease_trap")
    panel = w.liquid_panel
    lst = panel.layer_list
    assert lst.list.count() == 2 and lst.list.isVisible()
    assert lst.list.item(0).text().startswith("2 fats, oils and grease")
    lst.list.setCurrentRow(0)  # the top layer
    assert lst.selected == 1
    assert panel.shown_liquid().name == "fats, oils and grease"
    panel.kind.setCurrentIndex(2)
    panel.listed.setCurrentIndex(panel.listed.findData("diesel fuel"))
    settle(w)
    assert w.doc.active_load_case.layers[1].liquid.name == "diesel fuel"
    n = w.doc.undo_stack.count()
    before = w.doc.design
    panel.listed.setCurrentIndex(panel.listed.findData("sulfuric acid 98 %"))
    settle(w)
    assert w.doc.design is before and w.doc.undo_stack.count() == n
    assert "which is lighter" in panel.error.text() and panel.error.isVisible()


def test_one_liquid_looks_as_before(window_of):
    w = window_of("grease_trap", 2)  # the water test: one liquid
    lst = w.liquid_panel.layer_list
    assert not lst.list.isVisible() and not lst.remove.isVisible()
    assert lst.add.isVisible()
    assert w.liquid_panel.shown_liquid() == w.doc.case.liquid
    assert not w.totals.layers.isVisible()


def test_add_and_remove_layer_buttons_are_undo_steps(window_of, settle):
    w = window_of("closed_tank")
    lst = w.liquid_panel.layer_list
    lst.add.click()
    settle(w)
    assert len(w.doc.active_load_case.layers) == 2 and lst.selected == 1
    assert lst.list.isVisible()
    lst.remove.click()
    settle(w)
    assert w.doc.active_load_case.layers is None
    w.doc.undo_stack.undo()
    w.doc.undo_stack.undo()
    settle(w)
    assert w.doc.undo_stack.index() == 0


def test_gas_field_disabled_on_an_open_section(window_of, settle):
    w = window_of("grease_trap")
    gas = w.gas_panel
    assert not gas.gas.isEnabled()
    assert "closed section" in gas.gas_reason.text() and gas.gas_reason.isVisible()
    t = window_of("closed_tank")
    assert t.gas_panel.gas.isEnabled() and not t.gas_panel.gas_reason.isVisible()
    t.gas_panel.gas.setText("20")  # kPa in SI
    t.gas_panel.gas.editingFinished.emit()
    settle(t)
    assert t.doc.active_load_case.gas_pressure == pytest.approx(20e3)
    t.gas_panel.gas.setText("-102")  # below a full vacuum
    t.gas_panel.gas.editingFinished.emit()
    assert "full vacuum" in t.gas_panel.error.text()
    assert t.doc.active_load_case.gas_pressure == pytest.approx(20e3)
    # The gas loads the dry roof: the canvas's diagram covers every wall.
    w_edges = wetted_edges(t.doc.solution)
    assert np.all(np.concatenate([w_edges.pa, w_edges.pb]) >= 20e3 * (1 - 1e-12))


def test_kinked_diagram_and_interface_on_the_canvas(window_of):
    w = window_of("grease_trap")
    sol = w.doc.solution
    g = w.doc.case.gravity
    we = wetted_edges(sol)
    wall = 1  # the right wall, 0 to 2 m, cut at the interface 1.85 m
    pieces = np.flatnonzero(we.index == wall)
    assert pieces.size == 2
    z_cut = we.bz[pieces[0]] if we.az[pieces[0]] < we.bz[pieces[0]] else we.az[pieces[0]]
    assert z_cut == pytest.approx(1.85, abs=1e-12)
    p_cut = [p for a, b, p in zip(we.az[pieces], we.bz[pieces], we.pb[pieces], strict=True)
             if abs(b - 1.85) < 1e-12] or list(we.pa[pieces][np.abs(we.az[pieces] - 1.85)
                                                              < 1e-12])
    assert p_cut[0] == pytest.approx(g * 900 * 0.15, rel=1e-12)
    layer = w.canvas.load_layer
    assert layer.interface_levels == [pytest.approx(1.85)]
    x, z = layer.interfaces.getData()
    assert np.allclose(z, 1.85) and x.min() == pytest.approx(0.0) and x.max() == \
        pytest.approx(2.5)
    # Totals per layer equal core's.
    core = _core(w)
    for ly in core.layers:
        assert w.doc.units.fmt_volume(ly.volume) in w.totals.layers.text()
    assert w.totals.layers.isVisible()


def test_pocket_drawn_at_its_interface_with_its_air_pressure(window_of):
    w = window_of("chamber_with_lip", 1)  # riser full, air trapped
    core = _core(w)
    assert core.pocket_mode == TRAPPED and len(core.pockets) == 1
    pocket = core.pockets[0]
    layer = w.canvas.load_layer
    x, z = layer.air_lines.getData()
    assert np.allclose(z, pocket.interface, rtol=0, atol=1e-12)
    assert x.min() == pytest.approx(1.0) and x.max() == pytest.approx(3.0)
    assert layer.air_texts == [f"trapped air {w.doc.units.fmt_pressure(pocket.air_pressure)}"]
    assert not layer.air.path().isEmpty()
    # The label is laid out (not dropped for want of room), as is the interface's.
    shown = w.canvas.labels.shown()
    assert layer.air_texts[0] in shown


def test_chart_shows_both_assumptions(window_of):
    w = window_of("chamber_with_lip", 0)
    names = [c.name() for c in w.chart._curves]
    assert "roof (down)" in names and "roof (down), air trapped" in names
    k = names.index("roof (down), air trapped")
    x, y = w.chart._curves[k].getData()
    trapped = w.doc.level_tables[1]
    scope = w.doc.force_scope(w.doc.section)
    np.testing.assert_allclose(y, scope.to_display(trapped.part_down["roof"]), rtol=1e-12)


def test_uplift_panel_states_its_assumption(window_of):
    w = window_of("chamber_with_lip", 1)
    text = w.uplift_panel.details.text()
    assert "Air trapped under ceilings" in text
    assert "vented and trapped" in text
    ref = w.doc.design.resolve(w.doc.active_name).uplift()
    roof = next(r for r in w.uplift_panel.results if r.part == "roof")
    core_roof = next(r for r in ref if r.part == "roof")
    assert roof.worst_uplift == pytest.approx(core_roof.worst_uplift, rel=1e-9)
    assert roof.worst_pockets == core_roof.worst_pockets
    v = window_of("chamber_with_lip", 0)
    assert "Air under ceilings vented" in v.uplift_panel.details.text()


def test_the_chart_says_which_level_it_moves_for_a_layered_case(window_of):
    # A layered case's loads against level move the free surface over the
    # layers below (core ResolvedCase.level_tables); the axis says so.
    layered = window_of("grease_trap")
    assert "top layer rising" in layered.chart._axis_labels[0]
    plain = window_of("grease_trap", 2)  # the water test: one liquid
    assert plain.chart._axis_labels[0] == "Level [m]"


def test_layer_list_rows_read_as_sentences(window_of):
    """Defect: each row read "2 fats, oils and grease  to the surface 2 m",
    a double space standing for punctuation; each now says where the layer
    reaches, with the level as the totals give it."""
    w = window_of("grease_trap")
    lst = w.liquid_panel.layer_list.list
    sol = _core(w)
    fmt = w.doc.units.fmt_length
    texts = [lst.item(k).text() for k in range(lst.count())]
    assert texts == [f"2 fats, oils and grease, up to the free surface at {fmt(sol.layers[1].top)}",
                     f"1 raw sewage, up to {fmt(sol.layers[0].top)}"]
    assert not any("  " in t for t in texts)


def test_a_refusal_of_core_reads_in_the_display_unit(window_of, settle):
    """A level under the grease trap's layer, typed in feet, is refused in
    feet: the window said "the fill level 1.56163 m is not above the top of
    layer 1 'raw sewage' at 1.85 m" (core's words, in metres) to a user
    working in feet."""
    from wetline.app.model import editing
    from wetline.app.model.display import DisplayChoice

    w = window_of("grease_trap")
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    settle(w)
    panel = w.fill_panel
    panel.value.setText("5.123456")
    panel.value.editingFinished.emit()
    settle(w)
    text = panel.error.text()
    assert "layer 1 'raw sewage' at 6.07 ft" in text, text
    assert "the fill level 5.123 ft" in text and " m " not in text and " m:" not in text


def test_the_slider_spans_the_levels_above_the_layers_below(window_of, settle):
    """The slider's lowest level is just above the top interface, where the
    chart's table starts: moved below it (the grease trap's sewage layer
    tops out at 1.85 m) the slider raised core's refusal in a slot, a
    traceback and the crash dialog (seen under Xvfb)."""
    w = window_of("grease_trap")
    settle(w)
    doc = w.doc
    top = doc.design.resolve(doc.active_name).law.interfaces[-1]
    assert top == 1.85
    lo, hi = doc.level_range
    assert top < lo < top + 1e-5 * (hi - top) and lo == doc.level_table.levels[0]
    slider = w.fill_panel.slider
    for value in (0, slider.maximum() // 4):
        slider.setValue(value)
        settle(w)
        assert doc.solution.level > top and w.fill_panel.error.text() == ""
    assert doc.solution.level == pytest.approx(lo + 0.25 * (hi - lo), abs=(hi - lo) / 500)
