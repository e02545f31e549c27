"""Gravity is shown and typed in the display system's unit: m/s2 (SI) or
ft/s2 (US), converted correctly rounded both ways."""

from decimal import Decimal

import pytest

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.model.gravity import format_gravity, gravity_from_display, gravity_to_display
from wetline.core.units import display_units

US_FT = DisplayChoice("us", "ft")
US_IN = DisplayChoice("us", "in")


def _type(panel, text):
    panel.gravity.setText(text)
    panel.gravity.editingFinished.emit()


def test_si_shows_metres_per_second_squared(make_window):
    w = make_window()
    p = w.liquid_panel
    assert p._gravity_label.text() == "Gravity [m/s2]"
    assert p.gravity.text() == "9.80665"


@pytest.mark.parametrize("choice", [US_FT, US_IN], ids=["ft", "in"])
def test_us_gravity_in_feet_per_second_squared_round_trips_exactly(make_window, settle,
                                                                  choice):
    w = make_window()
    doc, p = w.doc, w.liquid_panel
    g0 = doc.case.gravity
    editing.set_units(doc, choice)
    assert p._gravity_label.text() == "Gravity [ft/s2]"  # ft/s2 even when lengths are in
    # 9.80665 m/s2 / 0.3048 (the international foot, exact) = 32.17404856 ft/s2
    assert p.gravity.text() == "32.17405"  # 7 figures: not 32.174, another value
    count = doc.undo_stack.count()
    p.gravity.editingFinished.emit()  # the shown text, untouched: no change at all
    assert doc.case.gravity == g0 and doc.undo_stack.count() == count
    _type(p, "32.174")
    exact = float(Decimal("32.174") * Decimal("0.3048"))  # correctly rounded product
    assert doc.case.gravity == exact == display_units("us").from_display(32.174, "length")
    assert p.gravity.text() == "32.174"  # reads back as typed
    assert doc.undo_stack.undoText() == "Gravity 32.174 ft/s2"
    p.gravity.editingFinished.emit()
    assert doc.case.gravity == exact and doc.undo_stack.count() == count + 1
    # To SI and back: the value stays exact, the text comes back the same.
    editing.set_units(doc, DisplayChoice("si", "m"))
    assert p._gravity_label.text() == "Gravity [m/s2]"
    assert float(p.gravity.text()) == exact  # 9.8066352 m/s2, shortest exact text
    editing.set_units(doc, choice)
    assert p.gravity.text() == "32.174"
    doc.undo_stack.undo()  # units
    doc.undo_stack.undo()  # units
    doc.undo_stack.undo()  # gravity
    settle(w)
    assert doc.case.gravity == g0


def test_format_gravity_reads_back_exactly_when_it_can():
    for choice in (DisplayChoice(), US_FT):
        for typed in (9.81, 32.2, 32.174, 1.62, 30.0):
            g = gravity_from_display(choice, typed)
            text = format_gravity(choice, g)
            assert gravity_from_display(choice, float(text)) == g
            assert float(text) == pytest.approx(gravity_to_display(choice, g), rel=1e-15)


def test_bad_gravity_is_refused_with_a_message(make_window):
    w = make_window()
    editing.set_units(w.doc, US_FT)
    g0 = w.doc.case.gravity
    _type(w.liquid_panel, "-32")
    assert w.doc.case.gravity == g0
    assert "positive" in w.liquid_panel.error.text()
    _type(w.liquid_panel, "fast")
    assert "not a number" in w.liquid_panel.error.text()
