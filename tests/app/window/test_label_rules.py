"""Labels and legends on screen, one test per rule, measured on what is
drawn (the text items' scene rectangles, the legends' and view boxes'):
no two labels overlap, no label is cut by the edge of the view, no legend
lies over the data, and each part's total is written once.

The chamber under a riser at a level of 2.688 m, in a small window, is the
case that showed the faults: its two roof labels overlapped each other and
the riser arrows, and a wall label ran past the canvas edge."""

import itertools
import math

import pytest

from wetline.app.window.canvas_labels import LABEL_MARGIN
from wetline.core.section_file import read_section_file

SAMPLES = ["chamber_under_riser", "sump_with_lid", "cone_hopper", "flared_hopper",
           "seawater_intake_bay", "open_tank", "closed_tank"]
SIZES = [(1500, 940), (1280, 800), (1100, 750)]


def text_rects(canvas):
    """(text, scene rectangle of its text) of every label shown."""
    out = []
    for item in canvas.labels.items[:canvas.labels.used]:
        r = item.box_in_scene()
        out.append((item.toPlainText(), r.adjusted(LABEL_MARGIN, LABEL_MARGIN,
                                                    -LABEL_MARGIN, -LABEL_MARGIN)))
    return out


@pytest.fixture
def window_on(make_window, settle, sample):
    def make(name, size, level=None):
        case = read_section_file(sample(name))
        if level is not None:
            case = case.with_level(level)
        w = make_window(case)
        w.resize(*size)
        settle(w)
        w.canvas.fit()
        settle(w)
        w.canvas.labels.lay_out()
        return w

    return make


@pytest.mark.parametrize("size", SIZES)
@pytest.mark.parametrize("name", SAMPLES)
def test_no_two_labels_overlap(window_on, name, size):
    w = window_on(name, size, 2.688 if name == "chamber_under_riser" else None)
    rects = text_rects(w.canvas)
    assert rects
    for (ta, a), (tb, b) in itertools.combinations(rects, 2):
        assert not a.intersects(b), f"{ta!r} covers {tb!r} at {size}"


@pytest.mark.parametrize("size", SIZES)
@pytest.mark.parametrize("name", SAMPLES)
def test_no_label_is_cut_by_the_edge_of_the_view(window_on, name, size):
    w = window_on(name, size, 2.688 if name == "chamber_under_riser" else None)
    view = w.canvas.getPlotItem().getViewBox().sceneBoundingRect()
    for text, r in text_rects(w.canvas):
        assert view.contains(r), f"{text!r} {r} runs past the view {view} at {size}"


def test_the_small_chamber_still_shows_its_key_labels(window_on):
    # Room is short: the parts' totals and the free surface come first.
    w = window_on("chamber_under_riser", (1100, 750), 2.688)
    shown = w.canvas.shown_labels()
    assert any(t.startswith("floor:") for t in shown)
    assert any(t.startswith("roof: total uplift") for t in shown)
    assert any(t.startswith("free surface") for t in shown)


@pytest.mark.parametrize("name", SAMPLES)
def test_no_legend_lies_over_the_data(window_on, name):
    # Measured on the rendered items: each legend lies outside its plot's
    # view box, where the curves, outline and labels are drawn (and clipped).
    w = window_on(name, (1100, 750))
    for plot, legend in ((w.canvas.getPlotItem(), w.canvas.outline_layer._legend),
                         (w.chart.getPlotItem(), w.chart._legend)):
        view = plot.getViewBox().sceneBoundingRect()
        box = legend.sceneBoundingRect()
        assert legend.isVisible() and box.width() > 0 and box.height() > 0
        assert not box.adjusted(1, 1, -1, -1).intersects(view), (name, box, view)
        # Every entry fits inside the legend (none cut off).
        for _sample, label in legend.items:
            assert box.contains(label.sceneBoundingRect().adjusted(1, 1, -1, -1)), \
                label.text
    names = [label.text for _, label in w.chart._legend.items]
    assert "floor force" in names


def test_each_part_total_is_written_once_and_runs_name_their_edges(window_on):
    w = window_on("chamber_under_riser", (1500, 940), 2.688)
    shown = w.canvas.shown_labels()
    sol = w.doc.solution
    # roof: loaded on two runs (either side of the riser): one total, at
    # its resultant, and each run named by its edge in a lighter style.
    assert [t for t in shown if t.startswith("roof:")] == [
        f"roof: total uplift {w.doc.force_scope(sol.section).text(sol.parts['roof'].fz)}"]
    for edge in (2, 6):
        assert any(t.startswith(f"edge {edge}: uplift ") for t in shown), shown
    # floor: one run, so its one label is the part's total.
    assert [t for t in shown if t.startswith("floor:")] == ["floor: 131.8 kN/m"]
    # No label reads "wall: <a run's value>" as if it were the part's.
    assert not any(t.startswith("wall:") and "total" not in t for t in shown)
    items = {i.toPlainText(): i for i in w.canvas.labels.items[:w.canvas.labels.used]}
    total, run = items[shown[1]], next(items[t] for t in shown if t.startswith("edge 2"))
    assert total.bold and not run.bold


@pytest.mark.parametrize("name", ["chamber_with_lip", "buried_wet_well"])
def test_labels_keep_off_the_structure_handles(make_window, settle, sample, name):
    # Seen on the chamber with a lip: "free surface 4 m" and "edge 5" lay
    # over the square handles of the structure's vertices. Boxes and handles
    # are compared in the layout's own pixel frame (y up), handles 8 px.
    import numpy as np

    from wetline.core.section_file import read_design

    w = make_window(read_design(sample(name)))
    settle(w)
    labels = w.canvas.labels
    sx, sz = labels.px
    handles = w.doc.structure.outline / np.array([sx, sz])
    for x0, y0, x1, y1 in labels.boxes():
        inside = ((handles[:, 0] > x0 - 4) & (handles[:, 0] < x1 + 4)
                  & (handles[:, 1] > y0 - 4) & (handles[:, 1] < y1 + 4))
        assert not inside.any(), (x0, y0, x1, y1)


def test_a_slanted_lift_is_labelled_with_its_uplift(make_window, settle, sample):
    """The chamber's lip (a ledge and its downstand) is pushed up and
    sideways: its resultant is inclined. Its label read "lip: uplift 12.07
    kN/m", the resultant's size, where the uplift (its upward part, the
    parts table's Fz) is 4.902 kN/m. The label now names the uplift, the
    number a hold-down must resist (common practice); its arrow shows the
    slant."""
    from wetline.core.section_file import read_design

    w = make_window(read_design(sample("chamber_with_lip")))
    w.resize(1500, 940)
    settle(w)
    sol = w.doc.solution
    scope = w.doc.force_scope(sol.section)
    lip = sol.parts["lip"]
    assert abs(lip.fx) > 0.5 * lip.fz > 0  # inclined, lifting
    assert scope.text(math.hypot(lip.fx, lip.fz)) != scope.text(lip.fz)
    shown = [t for t in w.canvas.shown_labels() if t.startswith("lip:")]
    assert shown == [f"lip: uplift {scope.text(lip.fz)}"], shown
    # The parts table says the same.
    parts = w.parts_table.model()
    row = [parts.data(parts.index(r, 0)) for r in range(parts.rowCount())].index("lip")
    assert parts.data(parts.index(row, 2)) == scope.number(lip.fz)
    # A vertical lift: its size and its uplift are one number.
    assert f"roof: uplift {scope.text(sol.parts['roof'].fz)}" in w.canvas.shown_labels()
