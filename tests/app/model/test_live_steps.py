"""What a live step leaves for the release: the chart's coarse table during
a drag (the full one follows on release: tests/app/window/test_live_drag.py),
and the doctests of the live-step helpers and of the slider's range."""

import doctest

from wetline.app.model import document, recompute, step_timer
from wetline.app.model.document import CHART_STEPS, PREVIEW_MIN_STEPS, preview_steps


def test_the_drag_table_is_coarser_for_larger_outlines_within_its_bounds():
    steps = [preview_steps(n) for n in (3, 100, 400, 2000, 10_000, 1_000_000)]
    assert steps == sorted(steps, reverse=True)
    assert steps[0] == steps[1] == CHART_STEPS
    assert steps[-1] == steps[-2] == PREVIEW_MIN_STEPS
    for n in (500, 2000, 4000):  # levels x edges within the budget of a frame
        assert preview_steps(n) * n <= document.PREVIEW_TABLE_ELEMENTS


def test_the_doctests_hold():
    for obj, module in ((step_timer, step_timer), (document.preview_steps, document),
                        (recompute.level_range, recompute)):
        finder = doctest.DocTestFinder()
        runner = doctest.DocTestRunner()
        for test in finder.find(obj, globs=vars(module).copy()):
            runner.run(test)
        assert runner.failures == 0 and runner.tries > 0, obj
