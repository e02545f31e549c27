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
