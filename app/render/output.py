"""What every headless output shares: its error, a Qt application to paint
with, checks of its size and level, the program and date it names, and the
one way it is written to a file.

An output is painted with QtGui only (no widgets), so it runs with
``QT_QPA_PLATFORM=offscreen`` and from the command line on a bare server.
Images, drawings and sheets are made in memory, then written by
:func:`write_output` through :mod:`wetline.core.atomic_write`: a failure
leaves no file behind and any old file as it was.
"""

from __future__ import annotations

import datetime
import math

import numpy as np
from PySide6.QtGui import QGuiApplication

from wetline.core.atomic_write import WriteError, check_target, write_atomically

__all__ = ["ExportError", "MIN_SIDE", "MAX_SIDE", "ensure_app", "check_size", "check_level",
           "program_name", "date_text", "write_output"]

MIN_SIDE = 200
"""Smallest image side [px] that still holds a legible diagram."""
MAX_SIDE = 20000
"""Largest image side [px] (a 20000 px square already needs 1.6 GB)."""

_APP = None


class ExportError(ValueError):
    """An export that cannot be made (bad size, unwritable path); the
    message names the problem."""


def ensure_app():
    """The running QGuiApplication, or a new offscreen one (headless use)."""
    global _APP
    app = QGuiApplication.instance()
    if app is None:
        # An export never needs a display: "-platform offscreen" overrides
        # any QT_QPA_PLATFORM, so the command line runs on a bare server.
        app = _APP = QGuiApplication(["wetline-export", "-platform", "offscreen"])
    return app


def check_size(size):
    """``(width, height)`` [px] as two ints, each :data:`MIN_SIDE` to
    :data:`MAX_SIDE`; :class:`ExportError` naming the fault otherwise."""
    try:
        w, h = size
    except (TypeError, ValueError):
        raise ExportError(f"image size must be a pair (width, height) in pixels, "
                          f"not {size!r}") from None
    for what, v in (("width", w), ("height", h)):
        if isinstance(v, bool) or not isinstance(v, (int, np.integer)):
            if isinstance(v, float) and v.is_integer():
                continue
            raise ExportError(f"image {what} must be a whole number of pixels, not {v!r}")
    w, h = int(w), int(h)
    for what, v in (("width", w), ("height", h)):
        if v <= 0:
            raise ExportError(f"image {what} must be positive, not {v} px")
        if v < MIN_SIDE:
            raise ExportError(f"image {what} of {v} px is too small to draw a legible "
                              f"diagram (at least {MIN_SIDE} px)")
        if v > MAX_SIDE:
            raise ExportError(f"image {what} of {v} px is too large (at most {MAX_SIDE} px)")
    return w, h


def check_level(level, error=ExportError):
    """``level`` [m] as a float (or None); ``error`` if it is not finite."""
    if level is None:
        return None
    level = float(level)
    if not math.isfinite(level):
        raise error(f"level must be a finite number, not {level}")
    return level


def program_name():
    """``Wetline`` and its version, when the package is installed."""
    from importlib import metadata

    try:
        return f"Wetline {metadata.version('wetline')}"
    except metadata.PackageNotFoundError:
        return "Wetline"


def date_text(date):
    """The date an output states: ``date`` (a date or text) or today, ISO 8601."""
    if date is None:
        return datetime.date.today().isoformat()
    if isinstance(date, (datetime.date, datetime.datetime)):
        return date.isoformat()[:10]
    return str(date)


def write_output(path, what, make, error=ExportError):
    """Write the bytes ``make()`` returns to ``path``, atomically.

    The target is checked first (``what`` names it in the message: "the
    PNG"), so nothing is painted for a path that cannot be written.

    Raises
    ------
    ExportError
        (or ``error``, a subclass) naming the path and the problem; any
        :class:`ExportError` from ``make`` passes on.
    """
    try:
        check_target(path, what)
        write_atomically(path, make())
    except WriteError as exc:
        raise error(str(exc)) from None
