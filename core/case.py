"""A design case: a section with its liquid, gravity and fill.

This is everything a section file holds and everything a result depends on.
Coordinates inside are in metres; ``length_unit`` only records the unit the
file was written in, so that saving writes the same numbers back.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

from . import STANDARD_GRAVITY
from .fill import FillError, capacity, level_for_volume
from .hydrostatics import solve
from .liquids import Liquid, fresh_water
from .section import Section

__all__ = ["Case", "CaseError"]


class CaseError(ValueError):
    """A case value that cannot be used (gravity not positive ...)."""


@dataclass(frozen=True, eq=False)
class Case:
    """A section with its liquid, gravity and fill.

    Parameters
    ----------
    section : Section
    liquid : Liquid
    gravity : float
        Acceleration of gravity [m/s2], > 0.
    fill_level : float or None
        Requested free-surface height [m]; exactly one of ``fill_level`` and
        ``fill_volume`` is given.
    fill_volume : float or None
        Requested liquid volume [m3] (area x width for plane sections).
    length_unit : str
        The unit the section file states its coordinates in (``"m"``,
        ``"mm"``, ``"ft"`` ...); kept for saving.
    """

    section: Section
    liquid: Liquid
    gravity: float = STANDARD_GRAVITY
    fill_level: float | None = None
    fill_volume: float | None = None
    length_unit: str = "m"

    def __post_init__(self):
        g = self.gravity
        if isinstance(g, bool) or not isinstance(g, (int, float)) or not math.isfinite(g) or g <= 0:
            raise CaseError(f"gravity must be a positive number, not {g!r}")
        if (self.fill_level is None) == (self.fill_volume is None):
            raise CaseError("a fill gives exactly one of level and volume")
        if self.fill_level is not None and not math.isfinite(self.fill_level):
            raise CaseError(f"fill level must be a finite number, not {self.fill_level!r}")
        if self.fill_volume is not None:
            v = self.fill_volume
            if not math.isfinite(v) or v < 0:
                raise CaseError(f"fill volume must be a number >= 0, not {v!r}")
            cap = capacity(self.section)
            if v > cap * (1 + 1e-12):
                where = "below its spill level" if self.section.is_open else "in all"
                raise FillError(
                    f"fill volume {v:.6g} m3 is more than the section holds {where} "
                    f"({cap:.6g} m3)")

    @classmethod
    def default(cls, section, level=None):
        """A case with fresh water at 20 C, standard gravity and the given
        level (default: the section's top level)."""
        return cls(section=section, liquid=fresh_water(20.0),
                   fill_level=section.top_level if level is None else float(level))

    def __eq__(self, other):
        if not isinstance(other, Case):
            return NotImplemented
        return (self.section == other.section and self.liquid == other.liquid
                and self.gravity == other.gravity and self.fill_level == other.fill_level
                and self.fill_volume == other.fill_volume
                and self.length_unit == other.length_unit)

    __hash__ = None

    @property
    def name(self):
        return self.section.name

    @property
    def level(self):
        """The requested level [m]: as given, or solved from the volume."""
        if self.fill_level is not None:
            return self.fill_level
        return level_for_volume(self.section, self.fill_volume)

    def solve(self, level=None):
        """Loads at the case's fill, or at ``level`` [m] if given."""
        return solve(self.section, self.level if level is None else level,
                     self.liquid.density, self.gravity)

    def with_level(self, level):
        """Copy filled to ``level`` [m]."""
        return replace(self, fill_level=float(level), fill_volume=None)

    def with_volume(self, volume):
        """Copy filled with ``volume`` [m3]."""
        return replace(self, fill_level=None, fill_volume=float(volume))

    def with_section(self, section):
        """Copy with another section; a fill by volume that the new section
        cannot hold becomes a fill to its top level."""
        if self.fill_volume is not None and self.fill_volume > capacity(section):
            return replace(self, section=section, fill_volume=None,
                           fill_level=section.top_level)
        return replace(self, section=section)

    def with_liquid(self, liquid):
        return replace(self, liquid=liquid)

    def with_gravity(self, gravity):
        return replace(self, gravity=float(gravity))

    def with_length_unit(self, unit):
        return replace(self, length_unit=str(unit))
