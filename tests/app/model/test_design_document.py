"""The document holds a design: load cases, the active case, the structure,
the envelope; every case-list and structure edit is one undo step.

Reference values come from core itself solving each case independently
(``Design.solve``, ``Design.solve_all``, ``envelope``): the document must
show exactly what core computes for the case chosen. Core's own numbers are
checked against textbooks and Archimedes in tests/core.
"""

from dataclasses import replace

import numpy as np
import pytest

from wetline.app.model import editing
from wetline.app.model.cases import rebuild, same_design
from wetline.app.model.document import STRUCTURE, Document
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import EMPTY, SPILL, Design, LoadCase, LoadCaseError, envelope
from wetline.core.structure import Ground, Groundwater


@pytest.fixture
def doc(qtbot, buried_wet_well):
    d = Document(buried_wet_well())
    d.flush()
    return d


def _undo_all_and_back(doc, before, before_active):
    n = doc.undo_stack.count()
    for _ in range(n):
        doc.undo_stack.undo()
    doc.flush()
    assert doc.design is before and doc.active_index == before_active
    for _ in range(n):
        doc.undo_stack.redo()
    doc.flush()


# ------------------------------------------------------------ the case list
def test_add_case_copies_the_active_one_and_undo_removes_it(doc):
    before = doc.design
    doc.select_case(1)  # overflow: not an edit
    assert doc.undo_stack.count() == 0
    editing.add_case(doc)
    assert doc.case_names[-1] == "case 5"
    assert doc.active_index == 4
    assert doc.active_load_case.fill_level == SPILL
    assert doc.active_load_case.load_factor == 1.35
    assert doc.undo_stack.undoText() == "Add case case 5"
    doc.undo_stack.undo()
    assert doc.design is before and doc.active_index == 1


def test_duplicate_rename_delete_and_move_are_one_step_each(doc):
    before = doc.design
    editing.duplicate_case(doc, 0)
    assert doc.case_names[:2] == ("normal top water", "normal top water copy")
    assert doc.active_index == 1
    assert editing.rename_case(doc, 1, "normal, low level")
    assert doc.case_names[1] == "normal, low level"
    assert editing.move_case(doc, 1, +1)
    assert doc.case_names[1:3] == ("overflow", "normal, low level")
    assert doc.active_name == "normal, low level"  # the active case moved with it
    assert not editing.move_case(doc, 0, -1)  # not past the top
    editing.delete_case(doc, 2)
    assert "normal, low level" not in doc.case_names
    assert doc.undo_stack.count() == 4
    _undo_all_and_back(doc, before, 0)
    assert doc.case_names == ("normal top water", "overflow", "water test",
                              "empty, flood groundwater")


def test_rename_to_a_taken_or_empty_name_is_refused(doc):
    with pytest.raises(LoadCaseError, match="unique"):
        editing.rename_case(doc, 0, "overflow")
    with pytest.raises(LoadCaseError, match="name"):
        editing.rename_case(doc, 0, "  ")
    assert doc.undo_stack.count() == 0


def test_the_last_case_is_never_deleted(doc):
    for _ in range(3):
        editing.delete_case(doc, 0)
    assert len(doc.case_names) == 1
    with pytest.raises(ValueError, match="last load case"):
        editing.delete_case(doc, 0)


def test_a_design_without_cases_gains_its_case_when_one_is_added(qtbot, buried_wet_well):
    d = Document(buried_wet_well(cases=False))
    name = d.case_names[0]
    assert name == "Wet well, pumping station 3"  # named after the section
    editing.add_case(d)
    assert [c.name for c in d.design.cases] == [name, "case 2"]
    d.undo_stack.undo()
    assert d.design.cases == ()


# ------------------------------------------------- the active case's values
def test_fill_and_liquid_edit_the_active_cases_overrides(doc):
    doc.select_case(1)
    file_case = doc.file_case
    editing.fill_to_level(doc, 2.0)
    assert doc.design.cases[1].fill_level == 2.0
    assert doc.file_case is file_case  # the file level is untouched
    assert doc.undo_stack.undoText() == "Fill to 2 m (overflow)"
    brine = custom_liquid(1200.0, "brine")
    editing.set_liquid(doc, brine)
    assert doc.design.cases[1].liquid == brine and doc.case.liquid == brine
    assert doc.design.cases[0].liquid is None  # the other cases keep the file's liquid
    editing.fill_to_word(doc, EMPTY)
    assert doc.design.cases[1].fill_level == EMPTY
    assert doc.case.fill_level == doc.section.z_min
    editing.set_liquid(doc, file_case.liquid)  # back to the file's: no override left
    assert doc.design.cases[1].liquid is None


def test_without_cases_the_fill_edits_the_file_level(qtbot, buried_wet_well):
    d = Document(buried_wet_well(cases=False))
    editing.fill_to_level(d, 2.0)
    assert d.design.cases == () and d.file_case.fill_level == 2.0
    assert d.case is d.file_case
    editing.fill_to_word(d, SPILL)
    assert d.file_case.fill_level == d.section.spill_level


def test_groundwater_and_load_factor_are_the_active_cases(doc):
    doc.select_case(0)
    editing.set_groundwater(doc, Groundwater(2.0, 1010.0))
    assert doc.design.cases[0].groundwater == Groundwater(2.0, 1010.0)
    editing.set_load_factor(doc, 1.5)
    assert doc.design.cases[0].load_factor == 1.5
    with pytest.raises(LoadCaseError, match="load factor"):
        editing.set_load_factor(doc, 0.0)
    # Above the open riser's spill level: the water would flood the cavity.
    with pytest.raises(LoadCaseError, match="spill"):
        editing.set_groundwater(doc, Groundwater(4.5))
    editing.set_groundwater(doc, None)
    assert doc.design.cases[0].groundwater is None
    assert doc.undo_stack.count() == 3


def test_groundwater_without_cases_makes_the_one_case_explicit(qtbot, buried_wet_well):
    d = Document(buried_wet_well(cases=False))
    editing.set_groundwater(d, Groundwater(3.0))
    (c,) = d.design.cases
    assert c.name == "Wet well, pumping station 3" and c.groundwater == Groundwater(3.0)


# ------------------------------------------------ every view follows the case
@pytest.mark.parametrize("index", range(4))
def test_switching_cases_gives_cores_per_case_solve(doc, index):
    doc.select_case(index)
    doc.flush()
    ref = doc.design.solve(doc.case_names[index])
    assert doc.solved_case.name == ref.name
    np.testing.assert_array_equal(doc.solution.fx, ref.solution.fx)
    np.testing.assert_array_equal(doc.solution.fz, ref.solution.fz)
    assert doc.solution.level == ref.solution.level
    assert doc.case.fill_level == ref.resolved.case.fill_level
    f, g = doc.solved_case.structure.flotation, ref.structure.flotation
    assert (f.uplift, f.resistance, f.factor) == (g.uplift, g.resistance, g.factor)
    np.testing.assert_array_equal(doc.solved_case.structure.fz, ref.structure.fz)


def test_selecting_a_case_is_not_an_edit_and_signals_the_views(doc, qtbot):
    with qtbot.waitSignals([doc.activeCaseChanged, doc.fillChanged, doc.solved], timeout=500):
        doc.select_case(3)
        doc.flush()
    assert doc.undo_stack.count() == 0 and not doc.is_modified
    with qtbot.assertNotEmitted(doc.activeCaseChanged):
        doc.select_case(3)


def test_the_envelope_is_cores(doc):
    ref = envelope(doc.design.solve_all())
    env = doc.envelope
    assert doc.envelope_current
    assert env.case_names == ref.case_names
    np.testing.assert_array_equal(env.edge_max_pressure, ref.edge_max_pressure)
    np.testing.assert_array_equal(env.edge_case, ref.edge_case)
    assert env.parts == ref.parts
    assert env.flotation == ref.flotation
    assert env.base == ref.base
    assert env.flotation.case == "empty, flood groundwater"
    assert env.parts["floor"].max_down_case == "overflow"


def test_the_envelope_follows_an_edit_of_any_case(doc, qtbot):
    doc.select_case(3)
    with qtbot.waitSignal(doc.envelopeReady, timeout=1000):
        editing.set_groundwater(doc, Groundwater(3.0))
    ref = envelope(doc.design.solve_all())
    assert doc.envelope.flotation == ref.flotation
    assert doc.envelope.flotation.factor > 0.7660591734739571  # less water, less uplift


def test_the_envelope_waits_for_a_slider_drag_to_end(doc):
    doc.select_case(0)
    doc.begin_live_edit()
    for level in np.linspace(0.5, 3.9, 8):
        editing.fill_to_level(doc, level, merge_key=("slider", 1))
        doc.flush()
    old = doc.envelope
    assert not doc.envelope_current and doc.envelope is old
    assert doc.solution.level == 3.9  # the active case follows live
    doc.end_live_edit()
    doc.flush()
    assert doc.envelope_current and doc.envelope is not old
    ref = envelope(doc.design.solve_all())
    np.testing.assert_array_equal(doc.envelope.edge_max_pressure, ref.edge_max_pressure)
    assert doc.undo_stack.count() == 1


def test_the_envelope_waits_for_a_vertex_drag(doc):
    x, z = doc.section.outline[1]
    doc.preview_outline(np.array([[0, 0], [3.05, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]]))
    doc.flush()
    assert doc.preview.design is not None
    assert doc.envelope_current  # the design itself has not changed yet
    doc.end_preview()
    assert editing.move_vertex(doc, 1, 3.05, 0.0)
    doc.flush()
    assert doc.envelope_current
    assert doc.envelope.edge_max_pressure.size == doc.section.n_edges


# ---------------------------------------------- the structure holds the cavity
def test_an_outline_the_structure_no_longer_holds_is_a_marked_draft(doc):
    before = doc.design
    # Pull the cavity's corner (3, 0) out through the structure's wall at x = 3.3.
    assert not editing.move_vertex(doc, 1, 3.6, 0.0)
    assert doc.design is before and doc.undo_stack.count() == 0
    draft = doc.draft
    assert draft is not None and draft.target == "cavity"
    assert "structure" in str(draft.error) or "outside" in str(draft.error)
    assert draft.error.location is not None
    outline, error = doc.fault()
    assert error is draft.error


def test_closing_the_top_the_structure_meets_is_a_draft(doc):
    # Edge 4 is the riser's open top, flush with the structure's top: as a
    # lid it would be a wall of no thickness.
    assert not editing.set_edge_part(doc, 4, "lid")
    assert "no thickness" in str(doc.draft.error)
    assert doc.draft.error.location == (1.1, 4.0)


def test_removing_the_open_edge_a_spill_case_needs_is_a_draft(qtbot, buried_wet_well):
    w = buried_wet_well()
    d = Document(Design(w.case, cases=tuple(replace(c, groundwater=None) for c in w.cases)))
    assert not editing.set_edge_part(d, 4, "lid")  # "overflow" fills to the spill level
    assert "'spill' needs an open section" in str(d.draft.error)
    assert d.undo_stack.count() == 0


def test_the_structure_dialogs_edit_builds_walls_and_undo_removes_it(qtbot, buried_wet_well):
    design = buried_wet_well(cases=False)
    d = Document(design.with_structure(None))
    assert d.structure is None
    s = editing.walls_structure(d, 0.4, 0.3, 0.3, unit_weight=24000.0, extra_weight=1000.0)
    assert editing.set_structure(d, s, Ground(4.0))
    np.testing.assert_array_equal(d.structure.outline, design.structure.outline)
    assert d.structure.unit_weight == 24000.0 and d.ground == Ground(4.0)
    assert d.undo_stack.count() == 1
    d.undo_stack.undo()
    assert d.structure is None and d.ground is None


def test_removing_the_structure_drops_the_groundwater_in_one_step(doc):
    before = doc.design
    assert editing.remove_structure(doc)
    assert doc.structure is None and doc.ground is None
    assert all(c.groundwater is None for c in doc.design.cases)
    assert doc.undo_stack.undoText() == "Remove the structure (and the groundwater of 1 case)"
    doc.undo_stack.undo()
    assert doc.design is before


def test_an_invalid_structure_outline_is_refused_and_marked(doc):
    before = doc.design
    # The structure's vertex 1 (3.3, -0.4) pulled inside the cavity.
    assert not editing.move_structure_vertex(doc, 1, 2.0, 1.0)
    assert doc.design is before
    assert doc.draft.target == STRUCTURE
    assert doc.draft.error.location is not None
    outline, parts = doc.working_structure_outline()
    np.testing.assert_array_equal(outline[1], [2.0, 1.0])
    np.testing.assert_array_equal(doc.working_outline()[0], doc.section.outline)
    # Moved to a valid place: one step, the draft goes.
    assert editing.move_structure_vertex(doc, 1, 3.5, -0.4)
    assert doc.draft is None and doc.structure.outline[1, 0] == 3.5
    assert doc.undo_stack.undoText() == "Move structure vertex 1"


def test_a_structure_outline_crossing_the_cavity_is_refused(doc):
    # Structure vertex 2 (3.3, 2.8) pulled to (2.6, 1.0): the cavity's corner
    # (3, 2.5) is left outside.
    assert not editing.move_structure_vertex(doc, 2, 2.6, 1.0)
    assert str(doc.draft.error) == ("cavity vertex 2 at (3, 2.5) m lies outside the structure "
                                    "outline")
    assert doc.draft.error.location == (3.0, 2.5)
    # Edits go on from the draft (nothing typed is lost); discarded, the
    # structure's own outline is edited again.
    editing.discard_draft(doc)
    # Vertex 3 (2.5, 2.8) pulled into the riser: its roof edge crosses the riser wall.
    assert not editing.move_structure_vertex(doc, 3, 2.1, 2.8)
    assert "structure vertex 3" in str(doc.draft.error)
    assert "inside the cavity" in str(doc.draft.error)


# ------------------------------------------------------------ modified state
def test_modified_compares_design_values(qtbot, buried_wet_well, tmp_path):
    d = Document(buried_wet_well(), path=tmp_path / "w.section.json", saved=True)
    editing.add_case(d)
    assert d.is_modified
    d.undo_stack.undo()
    assert not d.is_modified


def test_rebuild_keeps_the_structures_geometry_and_equals_a_fresh_design(buried_wet_well):
    design = buried_wet_well()
    cases = list(design.cases) + [LoadCase("half", fill_level=2.0)]
    fast = rebuild(design, cases=cases)
    assert fast.exterior is design.exterior
    fresh = Design(design.case, structure=design.structure, ground=design.ground,
                   cases=tuple(cases))
    assert same_design(fast, fresh)
    assert fast.names == fresh.names
    with pytest.raises(LoadCaseError, match="unique"):
        rebuild(design, cases=cases + [LoadCase("half")])
    with pytest.raises(LoadCaseError, match="spill"):
        rebuild(design, cases=[LoadCase("x", groundwater=Groundwater(5.0))])


def test_designs_left_in_the_history_drop_their_exterior_geometry(doc):
    first = doc.design
    x, z = doc.section.outline[1]
    assert editing.move_vertex(doc, 1, x + 0.05, z)
    doc.flush()
    assert first.exterior is None  # kept light while it waits in the history
    assert doc.design.exterior is not None
    doc.undo_stack.undo()
    doc.flush()
    assert doc.design is first and first.exterior is not None  # made again on its return
    ref = envelope(first.solve_all())
    assert doc.envelope.flotation == ref.flotation
    np.testing.assert_array_equal(doc.envelope.edge_max_pressure, ref.edge_max_pressure)


def test_a_design_from_another_documents_history_opens_whole(qtbot, buried_wet_well):
    design = buried_wet_well()
    first = Document(design)
    assert editing.move_vertex(first, 1, 3.05, 0.0)
    assert design.exterior is None  # in first's history
    second = Document(design)
    second.flush()
    assert second.design.exterior is not None
    assert second.envelope.flotation == envelope(design.solve_all()).flotation
    third = Document(buried_wet_well(cases=False))
    third.load(first.undo_stack.command(0)._old)
    third.flush()
    assert third.design.exterior is not None
