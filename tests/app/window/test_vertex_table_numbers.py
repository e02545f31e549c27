"""Numbers typed into the vertex table are read by the one parser of typed
decimals (:func:`wetline.core.number_input.parse_decimal`): the syntax the
command line and the other fields accept, no more and no less.

Reference: the accepted syntax is the parser's own (tests/core/
test_number_input.py checks it against Python's ``float`` on decimals);
here the table must use it.
"""

import pytest
from PySide6.QtCore import Qt

from wetline.core.number_input import NumberError, parse_decimal


@pytest.mark.parametrize("text", ["1_5", "1,000.5", "\u0661\u0665", "1.5.", "inf", "0x2"])
def test_text_the_parser_refuses_moves_no_vertex(make_window, text):
    with pytest.raises(NumberError):
        parse_decimal(text, "x")
    w = make_window()
    model = w.vertices_table.model()
    before = w.doc.section.outline.copy()
    steps = w.doc.undo_stack.count()
    assert not model.setData(model.index(1, 0), text, Qt.EditRole)
    assert model.last_error.startswith("x must be a finite decimal number")
    assert (w.doc.section.outline == before).all()
    assert w.doc.undo_stack.count() == steps


@pytest.mark.parametrize("text, value", [("2,5", 2.5), (" 2.25 ", 2.25), ("25e-1", 2.5),
                                         (".5", 0.5)])
def test_decimals_the_parser_reads_move_the_vertex_exactly(make_window, text, value):
    w = make_window()
    model = w.vertices_table.model()
    assert model.setData(model.index(1, 0), text, Qt.EditRole), model.last_error
    assert w.doc.section.outline[1, 0] == value == parse_decimal(text)


def test_an_outline_refused_by_core_is_told_in_the_display_unit(make_window, sample, settle):
    """A vertex typed in feet that leaves the structure is refused in feet:
    the table said "cavity vertex 2 at (3, 9.144) m lies outside the
    structure outline" for 30 ft typed (seen under Xvfb)."""
    from wetline.app.model import editing
    from wetline.app.model.display import DisplayChoice
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("buried_wet_well")))
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    settle(w)
    m = w.vertices_table.model()
    assert m.setData(m.index(2, 1), "30", Qt.ItemDataRole.EditRole)
    settle(w)
    assert m.last_error == ("Invalid outline: cavity vertex 2 at (9.843, 30) ft lies outside "
                            "the structure outline")


def test_a_coordinate_of_twelve_figures_fits_its_column(make_window, sample, settle):
    """A metre file shown in feet gives its coordinates to 12 figures (as
    entered, converted): the table's x and z columns are wide enough to show
    them whole (they read "9.842519685..." under Xvfb)."""
    from wetline.app.model import editing
    from wetline.app.model.display import DisplayChoice
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("buried_wet_well")))
    editing.set_units(w.doc, DisplayChoice("us", "ft"))
    settle(w)
    table = w.vertices_table
    m = table.model()
    assert m.index(1, 0).data() == "9.84251968504"
    for column in (0, 1):
        assert table.columnWidth(column) >= table.sizeHintForColumn(column)
