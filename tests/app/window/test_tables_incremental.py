"""The tables after live steps show what a model made afresh shows (the
values kept as shown are never stale), and a refresh tells the views only
of the cells whose value changed."""

from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.window.tables import EdgesModel, PartsModel, VerticesModel

ROLES = (Qt.DisplayRole, Qt.EditRole, Qt.ForegroundRole, Qt.BackgroundRole,
         Qt.TextAlignmentRole)


def _cells(model):
    return [[[model.data(model.index(r, c), role) for role in ROLES]
             for c in range(model.columnCount())] for r in range(model.rowCount())]


def _headers(model):
    return [model.headerData(c, Qt.Horizontal) for c in range(model.columnCount())]


def _same_as_fresh(w):
    for table, cls in ((w.parts_table, PartsModel), (w.edges_table, EdgesModel),
                       (w.vertices_table, VerticesModel)):
        model = table.model()
        fresh = cls(w.doc)
        if cls is not VerticesModel:
            fresh._on_viewModeChanged()  # its rows from the document as it is
        assert _headers(model) == _headers(fresh), cls.__name__
        assert _cells(model) == _cells(fresh), cls.__name__


def test_tables_after_live_steps_show_what_fresh_models_show(make_window, settle, sample):
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("buried_wet_well")))
    for table in (w.parts_table, w.edges_table, w.vertices_table):
        _cells(table.model())  # every cell asked once: all kept as shown
    slider = w.fill_panel.slider
    slider.setSliderDown(True)
    w.fill_panel._on_slider_pressed()
    for v in (900, 150, 600, 0, 1000):
        slider.setValue(v)
        settle(w)
        _same_as_fresh(w)
    slider.setSliderDown(False)
    w.fill_panel._on_slider_released()
    settle(w)
    _same_as_fresh(w)
    # The envelope view, another case, other units, an outline edit, undo.
    w.doc.set_view_mode("envelope")
    settle(w)
    _same_as_fresh(w)
    w.doc.set_view_mode("case")
    w.doc.select_case(3)
    settle(w)
    _same_as_fresh(w)
    x, z = w.doc.section.outline[1]
    editing.move_vertex(w.doc, 1, x + 0.1, z)
    settle(w)
    _same_as_fresh(w)
    editing.move_vertex(w.doc, 1, 1e6, 1e6)  # an invalid outline: a draft, marked
    settle(w)
    assert w.doc.draft is not None
    _same_as_fresh(w)
    w.doc.undo_stack.undo()
    w.doc.undo_stack.undo()
    settle(w)
    _same_as_fresh(w)


def test_a_refresh_tells_only_of_the_cells_that_changed(make_window, settle):
    w = make_window()
    model = w.edges_table.model()
    _cells(model)
    signals = []
    model.dataChanged.connect(lambda a, b, *_: signals.append(
        (a.row(), a.column(), b.row(), b.column())))
    model.refresh()
    assert signals == [], "nothing changed: nothing to repaint"
    level = w.doc.solution.level
    editing.fill_to_level(w.doc, level - 0.1)
    settle(w)
    assert signals
    for r0, c0, r1, _c1 in signals:
        assert r0 == r1  # row by row
        assert c0 >= 2, "the part and length columns do not change with the fill"
    # Every row whose values changed was told of.
    told = {r for r, *_ in signals}
    sol = w.doc.solution
    wet = {i for i in range(sol.section.n_edges) if sol.wetted_length[i] > 0}
    assert wet <= told
