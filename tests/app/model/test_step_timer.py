"""The step timers of bench/bench_gui.py: off by default (one shared no-op),
exclusive times while recording, figures from zero after each take."""

import time

import pytest

from wetline.app.model import step_timer


@pytest.fixture(autouse=True)
def _off_after():
    yield
    step_timer.stop()


def test_off_by_default_is_one_shared_no_op():
    assert not step_timer.recording()
    a, b = step_timer.span("solve and cases"), step_timer.span("label layout")
    assert a is b
    with a:
        pass
    assert step_timer.take() == {}


def test_inner_time_is_not_counted_twice():
    step_timer.start()
    t0 = time.perf_counter()
    with step_timer.span("outer"):
        time.sleep(0.002)
        with step_timer.span("inner"):
            time.sleep(0.002)
    wall = time.perf_counter() - t0
    got = step_timer.take()
    assert set(got) == {"outer", "inner"}
    assert got["inner"] >= 0.002 and got["outer"] >= 0.002
    assert got["inner"] + got["outer"] <= wall  # exclusive: they add up to the whole


def test_take_starts_again_and_stop_turns_it_off():
    step_timer.start()
    with step_timer.span("a"):
        pass
    assert list(step_timer.take()) == ["a"]
    assert step_timer.take() == {}
    step_timer.stop()
    assert not step_timer.recording()
    with step_timer.span("a"):
        pass
    assert step_timer.take() == {}


def test_an_error_inside_a_span_still_closes_it():
    step_timer.start()
    with pytest.raises(ValueError), step_timer.span("outer"):
        with step_timer.span("inner"):
            raise ValueError("bad input")
    with step_timer.span("after"):
        pass
    assert set(step_timer.take()) == {"outer", "inner", "after"}


def test_the_window_records_its_parts(make_window, settle):
    """A slider step in a window records the named parts the benchmark prints."""
    w = make_window()
    settle(w)
    step_timer.start()
    w.fill_panel.slider.setValue(w.fill_panel.slider.value() - 50)
    settle(w)
    w.canvas.repaint()
    got = step_timer.take()
    for name in ("solve and cases", "edit", "canvas layers", "label layout", "canvas paint"):
        assert name in got, name
