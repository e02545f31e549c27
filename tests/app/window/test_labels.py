"""Canvas labels do not cover each other or the resultant arrows: the most
important are placed first, the others step aside (if they must show) or
are left out."""

import itertools

import numpy as np
import pytest

from wetline.app.render.labels import LabelLayout, label_box
from wetline.app.window.canvas_labels import LABEL_MARGIN
from wetline.core.liquids import seawater
from wetline.core.section_file import read_section_file


def _text_rects(canvas):
    """Scene rectangles of the visible labels' text (without the margin)."""
    rects = []
    for item in canvas.labels.items[:canvas.labels.used]:
        r = item.box_in_scene()
        rects.append((item.toPlainText(), r.adjusted(LABEL_MARGIN, LABEL_MARGIN,
                                                      -LABEL_MARGIN, -LABEL_MARGIN)))
    return rects


@pytest.mark.parametrize("name", ["sump_with_lid", "chamber_under_riser", "cone_hopper",
                                  "flared_hopper", "seawater_intake_bay"])
def test_drawn_labels_do_not_overlap(make_window, settle, name, sample):
    case = read_section_file(sample(name))
    w = make_window(case)
    if name == "sump_with_lid":
        from wetline.app.model import editing

        editing.set_liquid(w.doc, seawater(10.0, 35.0))
        settle(w)
    c = w.canvas
    rects = _text_rects(c)
    assert rects
    for (ta, a), (tb, b) in itertools.combinations(rects, 2):
        assert not a.intersects(b), f"{ta!r} covers {tb!r}"
    # Every part's resultant is labelled, the free surface too.
    shown = c.shown_labels()
    for part, load in w.doc.solution.parts.items():
        if abs(load.fz) > 1e-6 * w.doc.solution.fluid_weight and part != "open":
            assert any(t.startswith(f"{part}:") for t in shown), (part, shown)
    assert any(t.startswith("free surface") for t in shown)


def test_sump_lid_labels_keep_off_the_arrows(make_window, settle, sample):
    case = read_section_file(sample("sump_with_lid"))
    w = make_window(case)
    c = w.canvas
    px, pz = c.labels.px
    boxes = c.label_boxes()
    # The resultant shafts (as drawn) do not pass through any label's text.
    for item in (c.load_layer.down, c.load_layer.up):
        x, z = item.getData()
        if x is None:
            continue
        for k in range(0, len(x), 6):  # shaft: points 0 -> 1 of each arrow
            for t in (0.1, 0.3, 0.5, 0.7, 0.9):
                sx = (x[k] + t * (x[k + 1] - x[k])) / px
                sz = (z[k] + t * (z[k + 1] - z[k])) / pz
                for b in boxes:
                    assert not (b[0] + 1 < sx < b[2] - 1 and b[1] + 1 < sz < b[3] - 1)
    # The pressure under the lid (equal at both its ends and at the top of
    # the wall below) is labelled once there, not three times.
    u = w.doc.units
    lid_p = u.fmt_pressure(w.doc.solution.p_start[2])
    assert c.shown_labels().count(lid_p) == 1


def test_layout_skips_optional_and_moves_required_labels():
    layout = LabelLayout()
    assert layout.place_anchored(0, 0, 100, 20, (0, 1)) == (0.0, 0.0)
    assert layout.place_anchored(10, 0, 60, 20, (0, 1)) is None  # optional: left out
    shift = layout.place_anchored(10, 0, 60, 20, (0, 1), required=True)
    assert shift is not None and shift != (0.0, 0.0)
    a, b = layout.boxes
    assert not (a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3])
    layout.add_obstacle(200, -5, 260, 5)
    assert layout.place_anchored(190, 0, 30, 10, (0, 0.5)) is None


def test_label_box_follows_the_anchor():
    # anchor (0, 1): the point is the box's bottom-left (y up)
    assert label_box(10, 20, 50, 12, (0, 1)) == (10, 20, 60, 32)
    # anchor (0.5, 0): the point is the middle of the top edge
    assert label_box(10, 20, 50, 12, (0.5, 0)) == (-15, 8, 35, 20)


def test_labels_fit_the_repaint_budget(make_window, settle):
    # Not a timing test: the layout works on a few dozen boxes, however many
    # vertices (handles are obstacles only on small outlines).
    from wetline.core.case import Case
    from wetline.core.section import Section

    t = np.linspace(np.pi, 2 * np.pi, 3000)
    pts = np.column_stack([2 + 2 * np.cos(t), 2 + 1.5 * np.sin(t)])
    pts = np.vstack([pts, [[4.0, 3.5], [0.0, 3.5]]])
    parts = ["floor"] * 2999 + ["wall", "open", "wall"]
    w = make_window(Case.default(Section.build(pts, parts=parts), 3.0))
    layout = w.canvas.labels.layout
    assert len(layout.obstacles) < 200 and len(layout.boxes) < 40


def test_a_vertex_dragged_a_million_sizes_away_keeps_the_layout_bounded(make_window, settle):
    # Issue 7 "under load": the label layout must not grow with the drawing.
    # Not a timing test: the layout's own count of item tests and kept
    # obstacles stays within fixed bounds.
    from wetline.app.model import editing
    from wetline.app.render.labels import MAX_CANDIDATES, MAX_LABELS

    w = make_window()
    size = float(np.ptp(w.doc.section.outline, axis=0).max())
    x, z = w.doc.section.outline[3]
    editing.move_vertex(w.doc, 3, x + 1e6 * size, z)
    settle(w)
    assert w.doc.section.outline[3, 0] == pytest.approx(x + 1e6 * size)
    layout = w.canvas.labels.layout
    requests = len(w.canvas.labels.requests)
    assert requests < MAX_LABELS
    assert layout.candidates_tried <= 2 * MAX_CANDIDATES * requests
    assert layout.box_tests < 20_000
    assert len(layout.obstacles) < 200


def test_the_layout_engine_bounds_its_work():
    # Lines a billion pixels long and ten thousand obstacles in one place:
    # each placement still tests a bounded number of items.
    from wetline.app.render.labels import MAX_PER_CELL, MAX_WIDE

    layout = LabelLayout(bounds=(-1000, -1000, 1000, 1000), cell=50)
    for k in range(300):
        layout.add_line(-1e9, k, 1e9, k + 1e3, soft=False)  # clipped to the bounds
    for _ in range(10_000):
        layout.add_obstacle(0, 0, 5, 5)
    before = layout.box_tests
    for k in range(50):
        layout.place([(300 + k, -900, 340 + k, -880)])
    per_place = (layout.box_tests - before) / 50
    assert per_place <= 2 * (MAX_WIDE + 4 * MAX_PER_CELL)
    assert layout.place([(0, 0, 4, 4)]) is None  # the crowded cell is full
