"""The undo history is bounded (1,000 steps unless set otherwise) and each
step is light: a command keeps the Design values before and after, never
results, and the sections it keeps drop their derived arrays."""

import tracemalloc

import pytest

from wetline.app.model import editing
from wetline.app.model.commands import DesignCommand
from wetline.app.model.document import UNDO_LIMIT, Document
from wetline.core.load_cases import Design


@pytest.fixture
def doc(qtbot, template_case):
    d = Document(template_case())
    d.flush()
    return d


def levels(doc, n, start=0.5):
    for k in range(n):
        editing.fill_to_level(doc, start + k * 1e-4)


def test_default_limit_keeps_the_last_thousand_steps(doc):
    assert UNDO_LIMIT == 1000 and doc.undo_stack.undoLimit() == UNDO_LIMIT
    levels(doc, 1200)
    assert doc.undo_stack.count() == 1000
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    assert doc.case.fill_level == pytest.approx(0.5 + 199 * 1e-4)  # 200 steps fell off


def test_a_new_limit_applies_now_if_empty_else_from_the_next_load(doc, template_case):
    doc.set_undo_limit(50)
    assert doc.undo_stack.undoLimit() == 50  # nothing to undo yet: at once
    levels(doc, 60)
    assert doc.undo_stack.count() == 50
    doc.set_undo_limit(20)
    assert doc.undo_stack.undoLimit() == 50 and doc.undo_limit == 20  # history kept
    doc.load(template_case("open_tank"))
    assert doc.undo_stack.undoLimit() == 20
    with pytest.raises(ValueError, match="undo"):
        doc.set_undo_limit(0)


def test_commands_keep_design_values_only(doc):
    editing.fill_to_level(doc, 1.0)
    x, z = doc.section.outline[1]
    editing.move_vertex(doc, 1, x + 0.1, z)
    doc.flush()
    for i in range(doc.undo_stack.count()):
        cmd = doc.undo_stack.command(i)
        assert isinstance(cmd, DesignCommand)
        kept = {k: v for k, v in vars(cmd).items() if k not in ("_doc", "_key")}
        # the designs before and after, and which case was active: never results
        assert all(isinstance(v, (Design, int)) for v in kept.values()), kept


def test_sections_left_in_the_history_drop_their_derived_arrays(doc):
    for _ in range(5):
        x, z = doc.section.outline[1]
        editing.move_vertex(doc, 1, x + 0.05, z)
        doc.flush()  # solved: the current section has its edge geometry
    current = doc.section
    assert "geometry" in vars(current)
    old = [doc.undo_stack.command(i)._old.section for i in range(doc.undo_stack.count())]
    assert all(s is not current for s in old)
    assert not any("geometry" in vars(s) or "volume_curve" in vars(s) for s in old)
    doc.undo_stack.undo()
    doc.flush()  # recomputed on demand, the same numbers
    assert doc.solution.fluid_weight == doc.case.solve().fluid_weight


def test_one_step_of_a_large_section_costs_about_its_outline(qtbot, bowl_case):
    n = 2000
    doc = Document(bowl_case(n))
    doc.flush()
    steps = 40
    tracemalloc.start()
    try:
        base = tracemalloc.get_traced_memory()[0]
        for _ in range(steps):
            x, z = doc.section.outline[5]
            editing.move_vertex(doc, 5, x + 1e-3, z)
            doc.flush()  # solved, with the chart's level table, every step
        grown = tracemalloc.get_traced_memory()[0] - base
    finally:
        tracemalloc.stop()
    outline_bytes = doc.section.outline.nbytes  # 32 kB
    # The outline of each step (and its read-only copy's small overhead);
    # before, each step also kept its edge geometry (about 13 arrays of n).
    print(f"undo step of a {n}-vertex section: {grown / steps / 1e3:.1f} kB")
    assert grown / steps < 2.5 * outline_bytes, f"{grown / steps / 1e3:.0f} kB per step"
