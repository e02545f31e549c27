"""Soak: thousands of random edits, slider moves, undos and redos through
the window, with redraws. The document must stay valid throughout and
nothing may raise; it also exercises many wrapped void Qt methods, which
catches binding-level crashes such as PySide6 6.12's none_dealloc on
Python 3.11 (see STACK-NOTES)."""

import numpy as np
import pytest

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.core.liquids import LISTED_LIQUIDS, fresh_water, seawater
from wetline.core.section import Section

STEPS = 1500


@pytest.mark.slow
def test_soak_random_edits(make_window, settle):
    rng = np.random.default_rng(20261202)
    w = make_window()
    doc = w.doc
    liquids = [fresh_water(4), seawater(10, 35), *list(LISTED_LIQUIDS.values())[:4]]
    units = [DisplayChoice("si", "m"), DisplayChoice("si", "mm"), DisplayChoice("us", "ft"),
             DisplayChoice("us", "in")]
    for step in range(STEPS):
        op = rng.integers(0, 12)
        outline, parts = doc.working_outline()
        n = len(outline)
        size = float(np.ptp(outline, axis=0).max())
        if op == 0:
            i = int(rng.integers(n))
            x, z = outline[i] + rng.normal(0, 0.05 * size, 2)
            editing.move_vertex(doc, i, x, z, merge_key=("nudge", i) if rng.random() < .5
                                else None)
        elif op == 1 and n < 40:
            e = int(rng.integers(n))
            a, b = outline[e], outline[(e + 1) % n]
            t = rng.uniform(0.2, 0.8)
            editing.insert_vertex(doc, e, *(a + t * (b - a)))
        elif op == 2 and n > 4:
            editing.delete_vertex(doc, int(rng.integers(n)))
        elif op == 3:
            editing.set_edge_part(doc, int(rng.integers(n)),
                                  str(rng.choice(["wall", "floor", "lid", "open", "baffle"])))
        elif op in (4, 5):
            w.fill_panel.slider.setValue(int(rng.integers(0, 1001)))
        elif op == 6:
            w.actions_by_name["undo"].trigger()
        elif op == 7:
            w.actions_by_name["redo"].trigger()
        elif op == 8:
            editing.set_liquid(doc, liquids[int(rng.integers(len(liquids)))])
        elif op == 9:
            editing.set_units(doc, units[int(rng.integers(len(units)))])
        elif op == 10:
            doc.select_edge(int(rng.integers(doc.section.n_edges)))
            w.actions_by_name["raise" if rng.random() < .5 else "lower"].trigger()
        else:
            w.fill_panel.mode.setCurrentIndex(int(rng.integers(3)))
        if step % 5 == 0:
            settle(w)
            assert isinstance(doc.section, Section)
            s = doc.solution
            assert s.floor_force + s.support_reaction == pytest.approx(
                s.fluid_weight, rel=1e-6, abs=1e-6 * max(s.fluid_weight, 1.0))
            w.canvas.describe_point(*doc.section.outline[0])
    # undo everything: back to the first case exactly
    first = doc.undo_stack.command(0)
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    settle(w)
    assert first is None or doc.case is first._old
