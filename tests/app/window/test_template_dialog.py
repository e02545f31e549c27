"""New from template: a labelled sketch of each template with its named
dimensions, and a name field wide enough for the name."""

import pytest

from wetline.app.model.display import DisplayChoice
from wetline.app.window.template_dialog import TemplateDialog
from wetline.app.window.template_sketch import dimension_spans
from wetline.core.numbers import format_entered
from wetline.core.templates import TEMPLATES


@pytest.mark.parametrize("key", list(TEMPLATES))
def test_every_dimension_is_found_on_the_outline(key):
    t = TEMPLATES[key]
    spans = dimension_spans(t)
    # Every dimension that shapes the cavity is found on its outline (a
    # structure's thickness or a liquid layer's is listed under the sketch).
    structure = {"base_thickness", "wall_thickness", "roof_thickness"}
    shaping = [d.key for d in t.dimensions
               if d.key not in structure and not d.key.startswith("grease_")]
    assert [s.key for s in spans] == shaping
    pts = t.build().outline
    defaults = {d.key: d.default for d in t.dimensions}
    for s in spans:
        assert pts[s.second, s.axis] - pts[s.first, s.axis] == pytest.approx(defaults[s.key])


@pytest.mark.parametrize("key", list(TEMPLATES))
def test_the_dialog_sketches_the_template_with_its_dimensions(qtbot, key):
    dlg = TemplateDialog(DisplayChoice("si", "m"))
    qtbot.addWidget(dlg)
    dlg.select(key)
    dlg.show()
    qtbot.waitExposed(dlg)
    dlg.sketch.repaint()
    t = TEMPLATES[key]
    assert dlg.sketch.texts == [f"{d.label} {format_entered(d.default)} m" for d in t.dimensions]
    # The name field shows the whole name.
    field = dlg.name_field
    assert field.fontMetrics().horizontalAdvance(field.text()) < field.width() - 8


def test_the_sketch_follows_the_typed_dimensions_in_the_display_unit(qtbot):
    dlg = TemplateDialog(DisplayChoice("us", "ft"))
    qtbot.addWidget(dlg)
    dlg.select("sump_with_lid")
    dlg.show()
    qtbot.waitExposed(dlg)
    qtbot.keyClicks(dlg.fields["shaft_width"], "")
    dlg.fields["shaft_width"].setText("5")
    dlg.fields["shaft_width"].textEdited.emit("5")
    dlg.sketch.repaint()
    assert "Access shaft width 5 ft" in dlg.sketch.texts
    dlg.fields["shaft_width"].setText("x")
    dlg.fields["shaft_width"].textEdited.emit("x")
    dlg.sketch.repaint()
    assert "Access shaft width 5 ft" in dlg.sketch.texts  # the last good sketch stays


def test_a_refusal_goes_when_its_field_is_typed_again(qtbot):
    """OK with a width of -3 is refused under the fields; typing a good width
    sketches it and takes the refusal away (it stayed under a width of 4
    and the new sketch; seen under Xvfb, keys typed into the dialog)."""
    from PySide6.QtCore import Qt

    dlg = TemplateDialog(DisplayChoice("si", "m"))
    qtbot.addWidget(dlg)
    dlg.select("open_tank")
    dlg.show()
    qtbot.waitExposed(dlg)
    width = next(iter(dlg.fields.values()))
    width.selectAll()
    qtbot.keyClicks(width, "-3")
    dlg.accept()
    assert "must be positive, not -3" in dlg.error.text() and dlg.isVisible()
    width.selectAll()
    qtbot.keyClicks(width, "4")
    qtbot.keyClick(width, Qt.Key.Key_Tab)
    assert dlg.error.text() == ""
