"""Gravity shown in the display system's unit: m/s2 (SI) or ft/s2 (US).

Inside Wetline gravity is m/s2. An acceleration converts with the factor of
the system's base length (1 m, 0.3048 ft), whatever length unit (mm, in)
the window shows, through :meth:`wetline.core.units.DisplayUnits.from_display`,
so a typed value converts correctly rounded (32.174 ft/s2 is the float
nearest 9.8066352 m/s2) and the text shown for a value reads back as it.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from wetline.core.numbers import format_number
from wetline.core.units import display_units

if TYPE_CHECKING:
    from .display import DisplayChoice

__all__ = ["gravity_label", "gravity_to_display", "gravity_from_display", "format_gravity"]

_LABELS = {"si": "m/s2", "us": "ft/s2"}


def gravity_label(choice: DisplayChoice) -> str:
    """Unit label of gravity for a :class:`wetline.app.model.display.DisplayChoice`."""
    return _LABELS[choice.system]


def gravity_to_display(choice: DisplayChoice, gravity: float) -> float:
    """``gravity`` [m/s2] in the display system's unit (m/s2 or ft/s2)."""
    return display_units(choice.system).to_display(float(gravity), "length")


def gravity_from_display(choice: DisplayChoice, value: float) -> float:
    """A value typed in the display system's unit of gravity, in m/s2
    (correctly rounded)."""
    return display_units(choice.system).from_display(float(value), "length")


def format_gravity(choice: DisplayChoice, gravity: float, digits: int = 7,
                   exact_digits: int = 10) -> str:
    """``gravity`` [m/s2] as text in display units: the shortest text of at
    most ``exact_digits`` significant digits that converts back to exactly
    ``gravity`` (32.174 ft/s2, 9.80665 m/s2, 9.8066352 m/s2), else
    ``digits`` significant digits (9.80665 m/s2 is 32.17405 ft/s2: not the
    text of 32.174 ft/s2, which is another value)."""
    shown = gravity_to_display(choice, gravity)
    for d in range(1, exact_digits + 1):
        text = format_number(shown, d)
        try:
            if gravity_from_display(choice, float(text)) == gravity:
                return text
        except ValueError:  # pragma: no cover - format_number gives numbers
            break
    return format_number(shown, digits)
