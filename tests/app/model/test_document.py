"""The document model and its undo commands (no window needed)."""

import numpy as np
import pytest

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.app.model.document import Document
from wetline.core.liquids import seawater
from wetline.core.templates import TEMPLATES


@pytest.fixture
def doc(qtbot, template_case):
    d = Document(template_case())
    d.flush()
    return d


def test_solution_is_core_solution(doc):
    assert doc.solution.fluid_weight == doc.case.solve().fluid_weight


def test_move_vertex_changes_results_and_undo_is_exact(doc):
    before = doc.case
    weight = doc.solution.fluid_weight
    x, z = doc.section.outline[1]
    assert editing.move_vertex(doc, 1, x + 0.3, z)
    doc.flush()
    assert doc.solution.fluid_weight > weight
    assert doc.undo_stack.undoText() == "Move vertex 1"
    doc.undo_stack.undo()
    assert doc.case is before
    doc.undo_stack.redo()
    assert doc.section.outline[1, 0] == pytest.approx(x + 0.3)


def test_nudges_of_one_vertex_merge_into_one_step(doc):
    before = doc.case
    for _ in range(5):
        x, z = doc.section.outline[2]
        editing.move_vertex(doc, 2, x + 0.01, z, merge_key=("nudge", 2))
    assert doc.undo_stack.count() == 1
    doc.undo_stack.undo()
    assert doc.case == before


def test_slider_drag_is_one_fill_step(doc):
    before = doc.case
    for level in np.linspace(0.5, 2.0, 30):
        editing.fill_to_level(doc, level, merge_key=("slider", 1))
    assert doc.undo_stack.count() == 1
    assert doc.case.fill_level == 2.0
    doc.undo_stack.undo()
    assert doc.case == before


def test_signals_only_on_real_changes(doc, qtbot):
    with qtbot.assertNotEmitted(doc.sectionChanged):
        with qtbot.waitSignal(doc.fillChanged, timeout=100):
            editing.fill_to_level(doc, 1.0)
    with qtbot.assertNotEmitted(doc.fillChanged):
        editing.fill_to_level(doc, 1.0)
    with qtbot.assertNotEmitted(doc.liquidChanged):
        editing.set_liquid(doc, doc.case.liquid)


def test_invalid_outline_is_a_draft_and_results_keep(doc):
    before = doc.case
    solution = doc.solution
    # Pull vertex 1 across the far wall: the outline crosses itself.
    assert not editing.move_vertex(doc, 1, -1.0, 2.5)
    assert doc.draft is not None
    assert "crosses" in str(doc.draft.error) or "doubles back" in str(doc.draft.error)
    assert doc.draft.error.location is not None
    doc.flush()
    assert doc.case is before and doc.solution is solution
    # Moving it back makes the outline valid: the draft goes, no change pushed.
    x, z = before.section.outline[1]
    assert editing.move_vertex(doc, 1, x, z)
    assert doc.draft is None
    assert doc.case == before


def test_delete_down_to_two_vertices_is_refused_as_draft(qtbot):
    from wetline.core.case import Case
    from wetline.core.section import Section

    d = Document(Case.default(Section.build([[0, 0], [1, 0], [0, 1]])))
    assert not editing.delete_vertex(d, 0)
    assert "distinct vertices" in str(d.draft.error)


def test_liquid_and_units_commands_have_readable_text(doc):
    editing.set_liquid(doc, seawater(10.0, 35.0))
    assert doc.undo_stack.undoText() == "Liquid: seawater 10 C, 35 g/kg"
    editing.set_units(doc, DisplayChoice("us", "in"))
    assert doc.undo_stack.undoText() == "Units: US customary, in"
    doc.undo_stack.undo()
    assert doc.units == DisplayChoice()


def test_modified_follows_saved_case(tmp_path, template_case, qtbot):
    d = Document(template_case(), path=tmp_path / "a.section.json")
    assert not d.is_modified
    editing.fill_to_level(d, 0.5)
    assert d.is_modified
    d.undo_stack.undo()
    assert not d.is_modified


def test_part_change_moves_load_from_support_to_floor(doc):
    # The sump's right wall (edge 1) carries no vertical load; the lid
    # (edge 2) is pushed up. Calling the lid 'floor' moves its uplift from
    # the support reaction into the floor force, with the same total.
    s0 = doc.solution
    lid = s0.parts["lid"].down
    editing.set_edge_part(doc, 2, "floor")
    doc.flush()
    s1 = doc.solution
    assert s1.floor_force == pytest.approx(s0.floor_force + lid, rel=1e-12)
    assert s1.support_reaction == pytest.approx(s0.support_reaction - lid, abs=1e-9)
    assert s1.floor_force + s1.support_reaction == pytest.approx(s1.fluid_weight, rel=1e-9)


@pytest.mark.parametrize("key", list(TEMPLATES))
def test_every_template_solves_in_a_document(key, qtbot):
    from wetline.core.case import Case

    t = TEMPLATES[key]
    s = t.build()
    d = Document(Case.default(s, t.default_level(s)))
    d.flush()
    assert d.solution.floor_force + d.solution.support_reaction == pytest.approx(
        d.solution.fluid_weight, rel=1e-9)
    assert d.level_table.levels[0] == s.z_min


# ------------------------------------------------------------ drag preview
def _moved(doc, index, dx, dz):
    outline = np.array(doc.section.outline)
    outline[index] += (dx, dz)
    return outline


def test_preview_publishes_the_dragged_outline_results(doc, qtbot):
    from wetline.core.fill import volume_below

    before = doc.case
    committed = doc.solution
    outline = _moved(doc, 1, 0.4, 0.0)
    seen = []
    doc.solved.connect(seen.append)
    with qtbot.waitSignal(doc.previewChanged, timeout=1000):
        doc.preview_outline(outline)
    doc.flush()
    dragged = before.section.replace(outline=outline)
    assert len(seen) == 1 and doc.solution is seen[0]
    assert doc.solution.section == dragged
    # The volume is core's exact volume of the dragged section (not the old one).
    assert doc.solution.volume == volume_below(dragged, before.level)
    assert doc.solution.volume > committed.volume
    assert doc.level_table.levels[0] == dragged.z_min
    assert doc.shown_case.section == dragged
    # Nothing is an edit yet: same case, no undo step, not modified.
    assert doc.case is before and doc.undo_stack.count() == 0 and not doc.is_modified
    doc.end_preview()
    doc.flush()
    assert doc.preview is None and doc.solution.volume == committed.volume
    assert doc.level_table.levels.size == 121


def test_preview_bursts_solve_once_per_event_loop_turn(doc):
    seen = []
    doc.solved.connect(seen.append)
    for dx in np.linspace(0.01, 0.3, 25):
        doc.preview_outline(_moved(doc, 1, dx, 0.0))
    doc.flush()
    assert len(seen) == 1
    assert doc.solution.section.outline[1, 0] == pytest.approx(doc.section.outline[1, 0] + 0.3)


def test_invalid_preview_keeps_last_valid_results_and_gives_the_fault(doc):
    doc.preview_outline(_moved(doc, 1, 0.2, 0.0))
    doc.flush()
    last_valid = doc.solution
    outline = np.array(doc.section.outline)
    outline[1] = (-1.0, 2.5)  # across the far wall: the outline crosses itself
    doc.preview_outline(outline)
    doc.flush()
    assert doc.solution is last_valid
    fault_outline, error = doc.fault()
    assert "crosses" in str(error) and np.array_equal(fault_outline, outline)
    assert doc.draft is None  # a preview, not a draft: nothing is kept after the drag
    doc.end_preview()
    doc.flush()
    assert doc.fault() is None and doc.solution.section == doc.section


def test_drag_release_pushes_one_command_from_the_preview(doc):
    before = doc.case
    for dx in np.linspace(0.05, 0.5, 10):
        doc.preview_outline(_moved(doc, 1, dx, 0.0))
        doc.flush()
    x, z = before.section.outline[1]
    doc.end_preview()
    assert editing.move_vertex(doc, 1, x + 0.5, z, merge_key=None)
    doc.flush()
    assert doc.undo_stack.count() == 1
    assert doc.solution.section is doc.section and doc.preview is None
    doc.undo_stack.undo()
    assert doc.case is before


def test_set_case_during_a_preview_ends_it(doc):
    doc.preview_outline(_moved(doc, 1, 0.3, 0.0))
    doc.flush()
    editing.fill_to_level(doc, 1.0)
    doc.flush()
    assert doc.preview is None
    assert doc.solution.section is doc.section and doc.solution.level == 1.0


def test_uplift_inputs_are_edits_with_readable_text(doc):
    from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR

    before = doc.case
    editing.set_resistance(doc, "lid", "self_weight", 1800.0)
    assert doc.undo_stack.undoText() == "Lid self-weight 1.8 kN/m"
    editing.set_resistance(doc, "lid", "self_weight", 1800.0)  # unchanged: no step
    assert doc.undo_stack.count() == 1
    with pytest.raises(ValueError):
        editing.set_resistance(doc, "lid", "holding_down", -1.0)
    with pytest.raises(ValueError, match="no resistance field"):
        editing.set_resistance(doc, "lid", "bolts", 1.0)
    editing.set_required_factor(doc, 1.25)
    assert doc.undo_stack.undoText() == "Required uplift factor 1.25"
    editing.set_required_factor(doc, DEFAULT_REQUIRED_FACTOR)
    assert doc.undo_stack.undoText() == "Required uplift factor: default"
    assert doc.case.resistance_map["lid"].self_weight == 1800.0
    for _ in range(3):
        doc.undo_stack.undo()
    assert doc.case is before


def test_sheet_header_is_one_edit_naming_what_changed(doc):
    from wetline.core.case import ReportInfo

    assert editing.set_report_info(doc, ReportInfo(project="Inlet works", prepared_by="team"))
    assert doc.undo_stack.undoText() == "Sheet header: project, prepared by"
    assert not editing.set_report_info(doc, doc.case.report)  # unchanged: no step
    assert doc.undo_stack.count() == 1


def test_imported_outline_keeps_the_fill_it_can(doc):
    from wetline.core.section import Section

    level = doc.case.fill_level
    tall = Section.build([[0, 0], [4, 0], [4, 9], [0, 9]], parts=["floor", "wall", "open", "wall"])
    editing.import_section(doc, tall, "Import 4 vertices")
    assert doc.case.fill_level == level and doc.undo_stack.undoText() == "Import 4 vertices"
    low = Section.build([[0, 0], [4, 0], [4, 0.5], [0, 0.5]], parts=["floor", "wall", "open",
                                                                     "wall"])
    editing.import_section(doc, low, "Import 4 vertices")
    assert doc.case.fill_level == low.top_level  # the old level would spill: filled to the top


def test_drawn_outline_becomes_the_section_or_the_draft(doc):
    assert editing.draw_outline(doc, [(0, 0), (3, 0), (3, 2), (0, 2)])
    # Proposed parts: the lowest edge the floor, the highest the open top.
    assert doc.section.n_edges == 4
    assert doc.section.parts == ("floor", "wall", "open", "wall")
    assert doc.undo_stack.undoText() == "Draw new outline"
    assert not editing.draw_outline(doc, [(0, 0), (3, 0), (0, 2), (3, 2)])  # crosses itself
    assert doc.draft is not None and "crosses" in str(doc.draft.error)
