"""Where a point made with the mouse lands: on the snap grid, a round number
of the display length unit.

:class:`SnapGrid` holds the snap spacing as a number of the display unit
(0.1 m, 100 mm, 0.1 ft, 1 in by default; never 0.3281 ft) and puts points on
it exactly: the multiple is formed in decimals and converted to metres by
:func:`wetline.core.units.to_si_exactly`, so a point snapped to 2.3 ft is
the metre value that reads back as 2.3 ft, and one snapped to 2.3 m is the
float 2.3 (not 23 x 0.1 = 2.3000000000000003). With snapping off a point is
still rounded, to the 1-2-5 step just under the size of a screen pixel: as
exact as the pointer can be, and never eight spurious digits.
"""

from __future__ import annotations

import math
from decimal import Decimal

from wetline.core.numbers import format_entered, nice_step
from wetline.core.units import to_si_exactly

__all__ = ["SnapGrid", "DEFAULT_STEPS"]

DEFAULT_STEPS = {"m": 0.1, "mm": 100.0, "ft": 0.1, "in": 1.0}
"""Default snap spacing in each display length unit."""


class SnapGrid:
    """The snap grid of a canvas, in the display length unit.

    Attributes
    ----------
    enabled : bool
        Snap points to the grid (on by default).
    step : float
        The spacing in display units (``unit``).
    unit : str
        The display length unit (``"m"``, ``"mm"``, ``"ft"``, ``"in"``).
    factor : float
        Metres per display unit.
    """

    def __init__(self, unit="m", factor=1.0, enabled=True):
        self.enabled = enabled
        self.unit = unit
        self.factor = float(factor)
        self.step = DEFAULT_STEPS.get(unit, 0.1)

    # ------------------------------------------------------------ spacing
    @property
    def spacing(self):
        """The spacing [m]."""
        return to_si_exactly(self.step, self.factor)

    def set_spacing(self, metres):
        """Set the spacing from metres (> 0): the display value as entered."""
        if not (metres > 0 and math.isfinite(metres)):
            raise ValueError("the snap spacing must be a positive number")
        self.step = float(format_entered(metres / self.factor))

    def set_step(self, step):
        """Set the spacing in display units (> 0)."""
        if not (step > 0 and math.isfinite(step)):
            raise ValueError("the snap spacing must be a positive number")
        self.step = float(step)

    def follow_units(self, units):
        """Switch to the display unit of ``units`` (a
        :class:`wetline.app.model.display.DisplayChoice`): the default
        spacing becomes the new unit's default, any other the 1-2-5 number
        of the new unit nearest it (never 0.3281 ft)."""
        unit = units.length_unit
        if unit == self.unit:
            return
        factor = float(units.length_si(1.0))
        was_default = self.step == DEFAULT_STEPS.get(self.unit)
        metres = self.spacing
        self.unit, self.factor = unit, factor
        if was_default or unit not in DEFAULT_STEPS:
            self.step = DEFAULT_STEPS.get(unit, 0.1)
        else:
            raw = metres / factor
            up, down = nice_step(raw), nice_step(raw, down=True)
            self.step = up if up / raw < raw / down else down

    # ------------------------------------------------------------- points
    def _round(self, value_m, step):
        """``value_m`` [m] on the nearest multiple of ``step`` display units."""
        d = value_m / self.factor
        n = round(d / step)
        exact = Decimal(n) * Decimal(repr(float(step)))
        return to_si_exactly(float(exact), self.factor) + 0.0

    def point(self, x, z, pixel=None):
        """(x, z) [m] snapped: on the grid if :attr:`enabled`, else (with
        ``pixel``, metres per screen pixel) on the 1-2-5 step of the display
        unit just under a pixel; unchanged without either."""
        if self.enabled and self.step > 0:
            return self._round(x, self.step), self._round(z, self.step)
        if pixel is not None and pixel > 0 and math.isfinite(pixel):
            step = nice_step(pixel / self.factor, down=True)
            return self._round(x, step), self._round(z, step)
        return float(x), float(z)

    def text(self):
        """The spacing for people: ``"0.1 ft"``."""
        return f"{format_entered(self.step)} {self.unit}"
