"""The next vertex, typed while drawing: a small field in the status bar.

While the canvas is in draw mode, the field beside "Next vertex" takes

- ``x z``: the vertex at those coordinates (``2.5 0``; the two numbers
  apart by a space, a semicolon or a comma and a space: ``2.5; 0``,
  ``2.5, 0``; a decimal comma is fine: ``2,5 0``);
- ``length at angle``: that far from the last vertex, the angle in degrees
  from the x axis, counter-clockwise (``1.2 at 90`` is 1.2 straight up);
- ``length up`` / ``down`` / ``left`` / ``right``: that far straight that way;
- ``length`` alone: that far towards the pointer.

Lengths and coordinates are in the display length unit, read by
:func:`wetline.core.number_input.parse_decimal` (the one typed-number
reader) and turned into metres exactly (:func:`wetline.core.units.to_si_exactly`):
``2.3`` ft is the metre value that reads back as 2.3 ft, a vertex 0.1 up from
2.3 is at 2.4. Enter places the vertex (Enter on an empty field closes the
outline), Esc drops the outline. Typing a number on the canvas while
drawing starts the field with it.
"""

from __future__ import annotations

import math
import re
from decimal import Decimal

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QHBoxLayout, QLabel, QLineEdit, QWidget

from wetline.app.window.message_labels import ERROR_STYLE
from wetline.core.number_input import NumberError, parse_decimal
from wetline.core.numbers import format_entered
from wetline.core.units import to_si_exactly

__all__ = ["DrawInput", "parse_vertex", "VertexInputError", "HINT", "STARTS"]

HINT = "x z, or length at angle, or length up / down / left / right"
"""What the field takes, in a few words (its placeholder)."""

STARTS = frozenset("0123456789.,-+")
"""Keys that, typed on the canvas while drawing, start the field."""

_DIRECTIONS = {"right": (1, 0), "left": (-1, 0), "up": (0, 1), "down": (0, -1)}


class VertexInputError(ValueError):
    """Typed text that does not give a vertex; the message says why, plainly."""


def _number(text, what):
    try:
        return parse_decimal(text, what)
    except NumberError as exc:
        raise VertexInputError(str(exc)) from None


def _exact_sum(last_display, step):
    """``last_display + step`` in decimals, the last vertex as entered."""
    return float(Decimal(format_entered(last_display)) + Decimal(repr(float(step))))


def parse_vertex(text, last, factor, pointer=None):
    """The vertex [m] that ``text`` asks for (see the module's description).

    Parameters
    ----------
    text : str
        What was typed.
    last : (float, float) or None
        The last vertex placed [m]; None before the first.
    factor : float
        Metres per display length unit.
    pointer : (float, float), optional
        Where the pointer is [m]: the direction of a length typed alone.

    Returns
    -------
    (float, float)
        x, z [m].

    Raises
    ------
    VertexInputError
        With a plain reason: "type the first vertex as x z (for example 0 0)".

    Examples
    --------
    >>> parse_vertex("2.5 0", None, 1.0)
    (2.5, 0.0)
    >>> parse_vertex("0.1 up", (2.5, 2.3), 1.0)
    (2.5, 2.4)
    >>> parse_vertex("2 at 180", (2.5, 0.0), 1.0)
    (0.5, 0.0)
    """
    body = text.strip()
    if not body:
        raise VertexInputError("type a vertex: " + HINT)
    words = [w for w in re.split(r"\s*;\s*|,\s+|\s+", body) if w]
    lower = [w.lower() for w in words]
    if len(words) == 2 and lower[1] not in _DIRECTIONS:
        x = _number(words[0], "x")
        z = _number(words[1], "z")
        return to_si_exactly(x, factor) + 0.0, to_si_exactly(z, factor) + 0.0
    if last is None:
        raise VertexInputError("type the first vertex as x z (for example 0 0)")
    lx, lz = (v / factor for v in last)
    if len(words) == 2:  # length and a direction word
        length = _number(words[0], "the length")
        dx, dz = _DIRECTIONS[lower[1]]
        return _step(last, lx, lz, length, dx, dz, factor)
    if len(words) == 3 and lower[1] == "at":
        length = _number(words[0], "the length")
        angle = _number(words[2], "the angle")
        quarter = angle / 90.0
        if quarter == round(quarter):  # straight along an axis: exact
            dx, dz = ((1, 0), (0, 1), (-1, 0), (0, -1))[int(round(quarter)) % 4]
            return _step(last, lx, lz, length, dx, dz, factor)
        a = math.radians(angle)
        return ((lx + length * math.cos(a)) * factor + 0.0,
                (lz + length * math.sin(a)) * factor + 0.0)
    if len(words) == 1:
        length = _number(words[0], "the length")
        if pointer is None:
            raise VertexInputError("a length alone goes towards the pointer: move the "
                                   "pointer the way to go, or type length at angle")
        px, pz = (v / factor for v in pointer)
        d = math.hypot(px - lx, pz - lz)
        if not d > 0:
            raise VertexInputError("the pointer is on the last vertex: no way to go")
        ux, uz = (px - lx) / d, (pz - lz) / d
        for dx, dz in _DIRECTIONS.values():  # along an axis: exact
            if abs(ux - dx) < 1e-12 and abs(uz - dz) < 1e-12:
                return _step(last, lx, lz, length, dx, dz, factor)
        return (lx + length * ux) * factor + 0.0, (lz + length * uz) * factor + 0.0
    raise VertexInputError(f"{body!r} is not a vertex; type {HINT}")


def _step(last, lx, lz, length, dx, dz, factor):
    """The last vertex ``last`` [m], (lx, lz) in display units, moved
    ``length`` along the axis direction (dx, dz), exactly, in metres; the
    other coordinate stays the last vertex's own."""
    x = to_si_exactly(_exact_sum(lx, dx * length), factor) + 0.0 if dx else float(last[0])
    z = to_si_exactly(_exact_sum(lz, dz * length), factor) + 0.0 if dz else float(last[1])
    return x, z


class _Field(QLineEdit):
    """The line edit: Esc is the widget's, not the window's."""

    def __init__(self, owner):
        super().__init__()
        self._owner = owner

    def keyPressEvent(self, ev):
        if ev.key() == Qt.Key.Key_Escape:
            self._owner.cancel()
            return
        super().keyPressEvent(ev)


class DrawInput(QWidget):
    """"Next vertex" and its field, for the status bar; shown in draw mode.

    Parameters
    ----------
    canvas : wetline.app.window.canvas.SectionCanvas
    """

    def __init__(self, canvas, parent=None):
        super().__init__(parent)
        self._canvas = canvas
        lay = QHBoxLayout(self)
        lay.setContentsMargins(4, 0, 4, 0)
        self.label = QLabel("Next vertex")
        self.field = _Field(self)
        self.field.setPlaceholderText(HINT)
        self.field.setMinimumWidth(300)
        self.field.setToolTip("Enter places the vertex (on an empty field: closes the "
                              "outline); Esc drops the outline")
        self.unit = QLabel()
        lay.addWidget(self.label)
        lay.addWidget(self.field)
        lay.addWidget(self.unit)
        self.last_error = ""
        self.field.returnPressed.connect(self.enter)
        self.field.textEdited.connect(self._on_textEdited)
        canvas.modeChanged.connect(self._on_modeChanged)
        canvas.typedStart.connect(self.start)
        self.setVisible(canvas.mode == "draw")

    def _on_modeChanged(self, mode):
        self.field.clear()
        self._show_error("")
        self.unit.setText(self._canvas.display_units.length_unit)
        self.setVisible(mode == "draw")

    def _on_textEdited(self, _):
        if self.last_error:
            self._show_error("")

    def _show_error(self, text):
        self.last_error = text
        self.field.setStyleSheet(ERROR_STYLE if text else "")
        self.field.setToolTip(text or "Enter places the vertex (on an empty field: closes the "
                                      "outline); Esc drops the outline")
        if text:
            self._canvas.message.emit(text)

    def start(self, text):
        """Begin typing with ``text`` (a key typed on the canvas)."""
        if not self.isVisible():
            return
        self.field.setFocus()
        self.field.setText(self.field.text() + text)

    def enter(self):
        """Place the typed vertex; an empty field closes the outline."""
        canvas = self._canvas
        text = self.field.text()
        if not text.strip():
            canvas.finish_drawing()
            canvas.setFocus()
            return True
        editor = canvas.editor
        last = editor.drawn[-1] if editor.drawn else None
        factor = float(canvas.display_units.length_si(1.0))
        try:
            x, z = parse_vertex(text, last, factor, canvas.pointer)
        except VertexInputError as exc:
            self._show_error(str(exc))
            return False
        self._show_error("")
        editor.add_point(x, z)
        self.field.clear()
        return True

    def cancel(self):
        """Drop the outline being drawn (Esc)."""
        self.field.clear()
        self._canvas.cancel_drawing()
        self._canvas.setFocus()
