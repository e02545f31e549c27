"""View ranges a plot can draw: finite, ordered, and never narrower than
the caller's smallest span or a millionth of their distance from zero.

A view handed an empty range (the levels of a section that spills at its
lowest point, a box around one drawn point) or one below float resolution
leaves pyqtgraph's axes to divide by a zero tick spacing while painting.
The chart and the canvas pass every range through :func:`usable_range`
and bound the user's zoom with :func:`smallest_span`.
"""

from __future__ import annotations

import math

__all__ = ["usable_range", "smallest_span", "RELATIVE_RESOLUTION"]

RELATIVE_RESOLUTION = 1e-6
"""Narrowest span drawn, relative to the largest coordinate's magnitude
(float64 resolves about 1e-16 of it: ten orders of magnitude to spare)."""


def smallest_span(magnitude, floor):
    """The narrowest span worth showing near coordinates of ``magnitude``,
    and at least ``floor`` (> 0), in the caller's units."""
    magnitude = abs(float(magnitude)) if math.isfinite(magnitude) else 0.0
    return max(float(floor), RELATIVE_RESOLUTION * magnitude)


def usable_range(lo, hi, min_span, pad=0.0):
    """(lo, hi) padded by ``pad`` of its span and, if narrower than
    ``min_span`` (or the resolution near it), widened about its middle.

    >>> usable_range(2.0, 2.0, 0.5)
    (1.75, 2.25)
    >>> usable_range(0.0, 10.0, 0.5, pad=0.1)
    (-1.0, 11.0)
    """
    lo, hi = float(lo), float(hi)
    if not math.isfinite(lo):
        lo = hi if math.isfinite(hi) else 0.0
    if not math.isfinite(hi):
        hi = lo
    if hi < lo:
        lo, hi = hi, lo
    p = (hi - lo) * pad
    lo, hi = lo - p, hi + p
    need = smallest_span(max(abs(lo), abs(hi)), min_span)
    if hi - lo >= need:
        return lo, hi
    mid = 0.5 * (lo + hi)
    return mid - 0.5 * need, mid + 0.5 * need
