"""Where the time of a live step goes: named timers around the parts of a
step (solve, envelope, label layout, paints ...), off by default.

No widgets. The document, the canvas, the chart and the tables wrap their
work in :func:`span`; while nothing records (the default) :func:`span`
returns one shared object whose ``__enter__`` and ``__exit__`` do nothing,
so the cost off is one global read and two empty calls (well under a
microsecond a step). ``bench/bench_gui.py`` turns it on with :func:`start`
and reads the figures with :func:`take`.

Times are *exclusive*: a span inside another (the label layout inside the
canvas's redraw) is counted under its own name only, so the figures of one
step add up to at most the step's wall time; what is left is Qt's own
event processing and the widgets that are not timed.

>>> start()
>>> with span("outer"):
...     with span("inner"):
...         pass
>>> sorted(take())
['inner', 'outer']
>>> stop()
>>> span("anything") is span("else")  # off: the one shared no-op
True
"""

from __future__ import annotations

import time
from types import TracebackType

__all__ = ["span", "start", "stop", "take", "recording"]

_totals: dict[str, float] | None = None
_stack: list[_Span] = []


class _Nothing:
    """The span while nothing records: does nothing."""

    __slots__ = ()

    def __enter__(self) -> None:
        return None

    def __exit__(self, kind: type[BaseException] | None, exc: BaseException | None,
                 tb: TracebackType | None) -> None:
        return None


_NOTHING = _Nothing()


class _Span:
    """One timed part of a step; its time less that of the spans inside it
    goes to its name."""

    __slots__ = ("name", "t0", "inner")

    def __init__(self, name: str) -> None:
        self.name = name
        self.t0 = 0.0
        self.inner = 0.0

    def __enter__(self) -> None:
        _stack.append(self)
        self.t0 = time.perf_counter()

    def __exit__(self, kind: type[BaseException] | None, exc: BaseException | None,
                 tb: TracebackType | None) -> None:
        elapsed = time.perf_counter() - self.t0
        if _stack and _stack[-1] is self:
            _stack.pop()
        if _stack:
            _stack[-1].inner += elapsed
        totals = _totals
        if totals is not None:
            totals[self.name] = totals.get(self.name, 0.0) + elapsed - self.inner


def span(name: str) -> _Span | _Nothing:
    """A context manager timing the work inside it under ``name`` while
    recording (:func:`start`); a shared no-op otherwise."""
    if _totals is None:
        return _NOTHING
    return _Span(name)


def recording() -> bool:
    """True between :func:`start` and :func:`stop`."""
    return _totals is not None


def start() -> None:
    """Record from now on (figures from zero)."""
    global _totals
    _totals = {}
    _stack.clear()


def take() -> dict[str, float]:
    """Exclusive seconds per name [s] since :func:`start` or the last
    :func:`take`; the figures start again from zero."""
    global _totals
    out = {} if _totals is None else dict(_totals)
    if _totals is not None:
        _totals = {}
    return out


def stop() -> None:
    """Stop recording: :func:`span` is the no-op again."""
    global _totals
    _totals = None
    _stack.clear()
