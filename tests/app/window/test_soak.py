"""Soak: thousands of random edits (extreme drags among them), slider moves,
undos and redos through the window, with redraws. The document must stay valid throughout and
nothing may raise; it also exercises many wrapped void Qt methods, which
catches binding-level crashes such as PySide6 6.12's none_dealloc on
Python 3.11 (see STACK-NOTES).

It prints the process's resident memory after 1,000 and 5,000 actions and
bounds its growth between them: the undo history is bounded (1,000 steps)
and each step light, so memory levels off once the history is full (each
step used to keep about 26 MB per 1,000 actions: widgets waiting for a
deferred delete that only an event loop performs)."""

import os
import resource
import sys

import numpy as np
import pytest

from wetline.app.model import editing
from wetline.app.model.display import DisplayChoice
from wetline.core.liquids import LISTED_LIQUIDS, fresh_water, seawater
from wetline.core.section import Section

STEPS = 5000
CHECKPOINTS = (1000, 5000)
GROWTH_PER_ACTION = 4096
"""Bytes of resident memory an action may add once the history is full
(generous: about 1 kB is measured; the old leak was 6 kB and more)."""


def rss_bytes():
    """Resident memory of this process now (Linux), else its peak."""
    try:
        with open("/proc/self/statm") as fh:
            return int(fh.read().split()[1]) * os.sysconf("SC_PAGE_SIZE")
    except (OSError, ValueError, IndexError):
        peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
        return peak if sys.platform == "darwin" else peak * 1024


@pytest.mark.slow
def test_soak_random_edits(make_window, settle):
    rng = np.random.default_rng(20261202)
    w = make_window()
    doc = w.doc
    liquids = [fresh_water(4), seawater(10, 35), *list(LISTED_LIQUIDS.values())[:4]]
    units = [DisplayChoice("si", "m"), DisplayChoice("si", "mm"), DisplayChoice("us", "ft"),
             DisplayChoice("us", "in")]
    rss = {}
    for step in range(STEPS):
        if step in CHECKPOINTS:
            rss[step] = rss_bytes()
        op = rng.integers(0, 12)
        outline, parts = doc.working_outline()
        n = len(outline)
        size = float(np.ptp(outline, axis=0).max())
        if op == 0:
            i = int(rng.integers(n))
            # One nudge in twenty is an extreme drag, up to a million times the
            # section's size (past the coordinate limit it becomes a draft):
            # label layout and view ranges must stay bounded whatever the shape.
            spread = 1e6 * size if rng.random() < 0.05 else 0.05 * size
            x, z = outline[i] + rng.normal(0, spread, 2)
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
    settle(w)
    rss[STEPS] = rss_bytes()
    for n in CHECKPOINTS:
        print(f"soak: resident memory after {n} actions {rss[n] / 1e6:.1f} MB, "
              f"undo steps {doc.undo_stack.count()}")
    first, last = CHECKPOINTS[0], CHECKPOINTS[-1]
    per_action = (rss[last] - rss[first]) / (last - first)
    print(f"soak: {per_action / 1e3:.2f} kB per action from {first} to {last}")
    assert doc.undo_stack.count() <= doc.undo_limit == 1000
    assert per_action < GROWTH_PER_ACTION
    # undo everything kept: back to the design before the oldest step exactly
    first = doc.undo_stack.command(0)
    while doc.undo_stack.canUndo():
        doc.undo_stack.undo()
    settle(w)
    assert first is None or doc.design is first._old
