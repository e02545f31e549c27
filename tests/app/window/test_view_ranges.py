"""No view is ever handed a degenerate range (zero or below float
resolution), the cause of ZeroDivisionErrors in pyqtgraph's axis painting
seen in a soak: the chart when the level range collapses (an opening at the
lowest point, nothing to fill) and the canvas fitting a degenerate box (an
outline being drawn with one point, or on one line)."""

import math

import numpy as np
import pytest

from wetline.app.model.document import Draft
from wetline.core.case import Case
from wetline.core.section import Section, SectionError


def degenerate(lo, hi):
    """True if a view range is empty or too narrow to be resolved in float64
    (common practice: at least about a million units in the last place)."""
    span = hi - lo
    return not (math.isfinite(lo) and math.isfinite(hi)) or \
        span <= 1e-9 * max(abs(lo), abs(hi), 1e-300)


@pytest.fixture
def ranges(monkeypatch):
    """Spy on every range given to the chart's and the canvas's view boxes
    (pyqtgraph's own auto-range passes through the same call)."""
    seen = []

    def spy(w):
        for name, widget in (("chart", w.chart), ("canvas", w.canvas)):
            vb = widget.getPlotItem().getViewBox()
            original = vb.setRange

            def recording(*args, _orig=original, _name=name, **kwargs):
                rect = args[0] if args else kwargs.get("rect")
                xr = kwargs.get("xRange") if rect is None else (rect.left(), rect.right())
                yr = kwargs.get("yRange") if rect is None else (rect.top(), rect.bottom())
                for axis, r in (("x", xr), ("y", yr)):
                    if r is not None:
                        seen.append((_name, axis, float(min(r)), float(max(r))))
                return _orig(*args, **kwargs)

            monkeypatch.setattr(vb, "setRange", recording)

    return seen, spy


def paint(w):
    """Paint both views now (an exception in painting fails the test)."""
    w.chart.grab()
    w.canvas.grab()


def empty_box_open_at_the_floor():
    """A box whose opening is its floor: it spills at its lowest point, so the
    fill range collapses to one level and every load is zero."""
    s = Section.build([(0, 0), (2, 0), (2, 1), (0, 1)], parts=["open", "wall", "lid", "wall"],
                      name="Open at the floor")
    assert s.spill_level == s.z_min
    return Case.default(s, s.z_min)


def test_the_chart_of_a_collapsed_level_range(make_window, ranges, settle):
    seen, spy = ranges
    w = make_window()
    spy(w)
    w.doc.load(empty_box_open_at_the_floor())
    settle(w)
    paint(w)
    chart = [r for r in seen if r[0] == "chart"]
    assert chart  # the chart was given its ranges
    bad = [r for r in seen if degenerate(r[2], r[3])]
    assert not bad, bad
    (x0, x1), (y0, y1) = w.chart.getPlotItem().getViewBox().viewRange()
    assert not degenerate(x0, x1) and not degenerate(y0, y1)
    assert x0 <= 0.0 <= x1  # the one level is in view


@pytest.mark.parametrize("points", [[(1e6, 3.0)], [(5.0, 1.0), (5.0, 1.0 + 1e-12)],
                                    [(0.0, 0.0), (1.0, 0.0), (2.0, 0.0)]],
                         ids=["one point far out", "two points a picometre apart",
                              "three on a line"])
def test_the_canvas_fitting_a_degenerate_outline(make_window, ranges, settle, points):
    seen, spy = ranges
    w = make_window(empty_box_open_at_the_floor())  # no diagram to widen the box
    settle(w)
    spy(w)
    pts = np.array(points, dtype=float)
    parts = ("wall",) * len(pts)
    w.doc.set_draft(Draft(pts, parts, SectionError("an outline needs at least 3 vertices")))
    w.canvas.fit()
    settle(w)
    paint(w)
    canvas = [r for r in seen if r[0] == "canvas"]
    assert canvas
    bad = [r for r in canvas if degenerate(r[2], r[3])]
    assert not bad, bad
    (x0, x1), (z0, z1) = w.canvas.getPlotItem().getViewBox().viewRange()
    assert x0 <= pts[:, 0].min() and pts[:, 0].max() <= x1  # the points are in view
    assert z0 <= pts[:, 1].min() and pts[:, 1].max() <= z1


def test_a_drawing_with_one_point_fits_the_view_around_it(make_window, ranges, settle):
    seen, spy = ranges
    w = make_window(empty_box_open_at_the_floor())
    settle(w)
    spy(w)
    w.actions_by_name["draw"].trigger()
    w.canvas.add_drawn_point(1.0, 1.0)
    w.canvas.finish_drawing()  # one point: kept as an invalid outline
    w.canvas.fit()
    settle(w)
    paint(w)
    assert w.doc.draft is not None
    assert not [r for r in seen if degenerate(r[2], r[3])]


def test_zooming_in_stops_at_a_usable_span(make_window, settle):
    w = make_window()
    settle(w)
    for vb in (w.canvas.getPlotItem().getViewBox(), w.chart.getPlotItem().getViewBox()):
        for _ in range(60):
            vb.scaleBy(s=(0.01, 0.01))
        (x0, x1), (y0, y1) = vb.viewRange()
        assert not degenerate(x0, x1) and not degenerate(y0, y1)
    paint(w)


def test_usable_range_examples():
    from wetline.app.window.view_range import usable_range

    assert usable_range(3.0, 3.0, 1.0) == (2.5, 3.5)
    assert usable_range(float("nan"), 2.0, 1.0) == (1.5, 2.5)
    assert usable_range(5.0, 1.0, 0.1) == (1.0, 5.0)
    lo, hi = usable_range(1e6, 1e6 + 1e-9, 1e-12)  # widened to the resolution near 1e6
    assert hi - lo == pytest.approx(1.0)
