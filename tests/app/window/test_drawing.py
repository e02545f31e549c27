"""Drawing to exact dimensions (issue 11): snap on round numbers of the
display unit, typed vertices placed exactly, parts proposed on closing, and
the display unit on the axes, the vertex table, the snap and the status bar
(issue 7)."""

from decimal import Decimal

import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.window.draw_input import VertexInputError, parse_vertex
from wetline.app.window.parts_proposal import proposal_text
from wetline.core.numbers import format_entered
from wetline.core.uplift import PartResistance

FT = 0.3048  # m, exactly (international foot, 1959)


def _display(w, metres):
    return w.doc.units.length(metres)


def _is_multiple(value, step):
    """True if ``value`` (display units, as entered) is a whole multiple of ``step``."""
    q = Decimal(format_entered(value)) / Decimal(format_entered(step))
    return q == q.to_integral_value()


@pytest.mark.parametrize("system, unit, step", [("si", "m", 0.1), ("si", "mm", 100.0),
                                                ("us", "ft", 0.1), ("us", "in", 1.0)])
def test_a_drawn_outline_with_snap_has_round_coordinates(make_window, settle, system, unit,
                                                        step):
    w = make_window()
    editing.set_units(w.doc, DisplayChoice(system, unit))
    settle(w)
    c = w.canvas
    assert c.snap_enabled  # on by default
    assert c.snap_grid.step == step and c.snap_grid.unit == unit
    c.set_mode("draw")
    # Clicks off the grid, as a hand gives them (0.0031588654 m and the like).
    for x, z in ((0.0031588654, 0.0021), (2.4137, -0.0188), (2.3869, 1.6233), (0.0102, 1.5911)):
        c.add_drawn_point(x, z)
    assert c.finish_drawing()
    settle(w)
    s = w.doc.section
    for x, z in s.outline:
        for v in (x, z):
            shown = _display(w, v)
            assert _is_multiple(shown, step), (v, shown)
            # Exactly the metres of that round number (decimal, not 23 x 0.1).
            factor = float(w.doc.units.length_si(1.0))
            assert v == float(Decimal(format_entered(shown)) * Decimal(repr(factor))) + 0.0
    # The vertex table shows them as entered.
    model = w.vertices_table.model()
    for i in range(model.rowCount()):
        for col in (0, 1):
            text = model.index(i, col).data()
            assert text == format_entered(_display(w, s.outline[i, col]))
            assert len(text.replace("-", "").replace(".", "")) <= 5


def test_typed_vertices_place_exactly(make_window, settle):
    w = make_window()
    c, field = w.canvas, w.draw_input
    c.set_mode("draw")
    assert field.isVisible()
    for text in ("0 0", "2.4; 0", "1.6 up", "0.5 left", "1.2 at 90", "1.9 at 180"):
        field.field.setText(text)
        assert field.enter(), field.last_error
    assert c.editor.drawn == [(0.0, 0.0), (2.4, 0.0), (2.4, 1.6), (1.9, 1.6), (1.9, 2.8),
                              (0.0, 2.8)]
    field.field.setText("")
    assert field.enter()  # an empty Enter closes the outline
    settle(w)
    s = w.doc.section
    assert s.outline.tolist() == [[0.0, 0.0], [2.4, 0.0], [2.4, 1.6], [1.9, 1.6],
                                  [1.9, 2.8], [0.0, 2.8]]
    assert s.parts == ("floor", "wall", "wall", "wall", "open", "wall")
    assert w.canvas.mode == "edit" and not field.isVisible()


def test_typed_lengths_at_an_angle_and_towards_the_pointer():
    # A 3-4-5 triangle: 5 at atan2(4, 3) from the origin lands on (3, 4).
    import math

    x, z = parse_vertex(f"5 at {math.degrees(math.atan2(4, 3))!r}", (0.0, 0.0), 1.0)
    assert (x, z) == pytest.approx((3.0, 4.0), abs=1e-12)
    assert parse_vertex("2", (1.0, 1.0), 1.0, pointer=(1.0, 7.5)) == (1.0, 3.0)
    assert parse_vertex("2,5 0", None, 1.0) == (2.5, 0.0)  # a decimal comma
    # In feet: 2.3 ft is 0.70104 m exactly (the decimal product), and 0.1 ft
    # up from 2.3 ft is 2.4 ft, not 2.4000000000000004.
    assert parse_vertex("2.3 0", None, FT) == (0.70104, 0.0)
    x, z = parse_vertex("0.1 right", (0.70104, 0.0), FT)
    assert x == float(Decimal("2.4") * Decimal("0.3048"))
    for text, message in (("1 up", "first vertex"), ("", "type a vertex"),
                          ("1_0 2", "x must be a finite decimal"),
                          ("3", "first vertex")):
        with pytest.raises(VertexInputError, match=message):
            parse_vertex(text, None, 1.0)
    with pytest.raises(VertexInputError, match="is not a vertex"):
        parse_vertex("1 2 3 4", (0.0, 0.0), 1.0)
    with pytest.raises(VertexInputError, match="towards the pointer"):
        parse_vertex("3", (0.0, 0.0), 1.0)


def test_bad_typed_text_is_refused_in_the_field(make_window, settle):
    w = make_window()
    w.canvas.set_mode("draw")
    field = w.draw_input
    field.field.setText("2 up")
    assert not field.enter()
    assert "first vertex" in field.last_error and field.field.styleSheet()
    assert w.canvas.editor.drawn == []


def test_typing_on_the_canvas_starts_the_field_and_esc_cancels(make_window, settle, qtbot):
    w = make_window()
    c = w.canvas
    c.set_mode("draw")
    c.setFocus()
    qtbot.keyClicks(c, "1")
    assert w.draw_input.field.text() == "1"
    qtbot.keyClicks(w.draw_input.field, ".5 0")
    qtbot.keyClick(w.draw_input.field, Qt.Key_Return)
    assert c.editor.drawn == [(1.5, 0.0)]
    qtbot.keyClick(w.draw_input.field, Qt.Key_Escape)
    assert c.mode == "edit" and c.editor.drawn == []


def test_closing_proposes_parts_with_one_click_to_change(make_window, settle):
    w = make_window()
    doc = w.doc
    # The sump's floor and lid carry uplift inputs; the floor survives the
    # new outline, the lid does not.
    doc.set_case(doc.case.with_resistance("floor", PartResistance(1000.0, 0.0))
                 .with_resistance("lid", PartResistance(1800.0, 2500.0)))
    c = w.canvas
    c.set_mode("draw")
    for p in ((0, 0), (3, 0), (3, 2), (0, 2)):
        c.add_drawn_point(*p)
    assert c.finish_drawing()
    settle(w)
    assert doc.section.parts == ("floor", "wall", "open", "wall")
    assert set(doc.case.resistance_map) == {"floor"}
    bar = c.proposal
    assert bar.isVisible()
    assert bar.text.text() == "Parts proposed: floor on edge 0, open top on edge 2, walls on " \
                              "the rest"
    bar.closed.click()
    assert doc.section.parts == ("floor", "wall", "roof", "wall")
    assert doc.undo_stack.undoText() == "Parts: top closed (roof)" and not bar.isVisible()
    doc.undo_stack.undo()
    assert doc.section.parts == ("floor", "wall", "open", "wall")
    doc.undo_stack.undo()  # the drawing itself
    assert doc.section.n_edges == 6
    # The drawing hint left the status bar when the outline was closed.
    assert "Click the vertices" not in w.statusBar().currentMessage()


def test_proposals_for_other_shapes():
    from wetline.app.model.editing import propose_parts

    # A hopper: no flat bottom edge to call the floor but its outlet.
    assert propose_parts([[1, 0], [2, 0], [3, 2], [3, 3], [0, 3], [0, 2]]) == (
        "floor", "wall", "wall", "open", "wall", "wall")
    # A V: no horizontal edge at the bottom, none is a floor.
    assert propose_parts([[0, 2], [1, 0], [2, 2]]) == ("wall", "wall", "open")
    assert proposal_text(("wall", "wall", "open")) == \
        "Parts proposed: open top on edge 2, walls on the rest"


def test_display_units_on_axes_table_snap_and_status_in_us(make_window, settle):
    w = make_window()
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    settle(w)
    c = w.canvas
    plot = c.getPlotItem()
    for name, label in (("bottom", "x [ft]"), ("left", "z [ft]")):
        axis = plot.getAxis(name)
        assert axis.labelText == label
        assert axis.scale == pytest.approx(1 / FT)
        # Ticks at round numbers of feet.
        (lo, hi) = c.getPlotItem().getViewBox().viewRange()[0 if name == "bottom" else 1]
        levels = axis.tickValues(lo, hi, 600)
        spacing, values = levels[0]
        step_ft = spacing / FT
        assert step_ft == pytest.approx(round(step_ft * 10) / 10, rel=1e-9)
    # The grid lines fall on round feet too.
    xs, _ = c._grid.getData()
    feet = [x / FT for x in xs[:6]]
    assert all(abs(f - round(f * 10) / 10) < 1e-9 for f in feet)
    # Snap: 0.1 ft, never 0.3281 ft; the toolbar says so.
    assert c.snap_grid.text() == "0.1 ft"
    assert w.snap_spacing.text() == "0.1" and w.snap_unit.text().strip() == "ft"
    # The vertex table in feet, as entered.
    model = w.vertices_table.model()
    from PySide6.QtCore import Qt as _Qt

    assert model.headerData(0, _Qt.Horizontal, _Qt.DisplayRole) == "x [ft]"
    assert model.index(1, 0).data() == format_entered(2.4 / FT)
    # The status bar while drawing: where the click lands, in feet, and the snap.
    c.set_mode("draw")
    text = c.describe_point(0.5, 0.2)
    assert text.startswith("x 1.6 ft   z 0.7 ft") and "(snap 0.1 ft)" in text
    assert w.draw_input.unit.text() == "ft"


def test_snap_spacing_follows_the_unit_and_can_be_typed(make_window, settle):
    w = make_window()
    c = w.canvas
    w.snap_spacing.setText("0,05")
    w.snap_spacing.editingFinished.emit()
    assert c.snap_grid.step == 0.05 and c.snap_spacing == 0.05
    editing.set_units(w.doc, DisplayChoice("us", "in"))
    settle(w)
    # 0.05 m is 1.97 in: the nearest 1-2-5 number of inches.
    assert c.snap_grid.step == 2.0 and w.snap_spacing.text() == "2"
    w.snap_spacing.setText("abc")
    w.snap_spacing.editingFinished.emit()
    assert c.snap_grid.step == 2.0 and w.snap_spacing.text() == "2"
    w.snap_box.setChecked(False)
    assert not c.snap_enabled
