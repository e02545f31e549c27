"""How results are shown: the display unit choice of the window.

Values inside Wetline are SI floats; this module converts them for labels,
tables and the status bar only, and writes them with the one number
formatter (:func:`wetline.core.numbers.format_number`).

Forces follow the one rule of :mod:`wetline.core.force_scope`: a plane
section exactly one unit of run wide (1 m, or 1 ft in a file in ft) shows
forces per run (kN/m, lbf/ft), any other width the force for that width and
an axisymmetric section the full revolution (kN, lbf).
:meth:`DisplayChoice.force_scope` gives that scope for a section.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from wetline.core.force_scope import ForceScope, force_scope, resistance_quantity
from wetline.core.section import Section
from wetline.core.units import (
    SI_LENGTH_UNITS,
    US_LENGTH_UNITS,
    DisplayUnits,
    display_units,
    is_core_refusal,
    pint_factor,
)

__all__ = ["DisplayChoice", "LENGTH_UNITS_OF"]

LENGTH_UNITS_OF = {"si": SI_LENGTH_UNITS, "us": US_LENGTH_UNITS}
"""Display length units offered for each unit system."""

Value = float | np.ndarray
"""A float or a numpy array of them."""


@dataclass(frozen=True)
class DisplayChoice:
    """The unit system and the length unit the window shows values in.

    Attributes
    ----------
    system : str
        ``"si"`` or ``"us"``.
    length_unit : str
        ``"mm"`` or ``"m"`` (SI), ``"in"`` or ``"ft"`` (US).
    """

    system: str = "si"
    length_unit: str = "m"

    def __post_init__(self) -> None:
        if self.system not in LENGTH_UNITS_OF:
            raise ValueError(f"unit system must be 'si' or 'us', not {self.system!r}")
        if self.length_unit not in LENGTH_UNITS_OF[self.system]:
            raise ValueError(f"{self.length_unit!r} is not a length unit of {self.system}")

    @classmethod
    def of_length_unit(cls, unit: str) -> DisplayChoice | None:
        """The display of lengths in ``unit`` (a file's length unit): mm or m
        in SI, in or ft in US units; None for a unit the display does not
        offer (cm, yd ...)."""
        for system, units in LENGTH_UNITS_OF.items():
            if unit in units:
                return cls(system, unit)
        return None

    @property
    def units(self) -> DisplayUnits:
        """The :class:`wetline.core.units.DisplayUnits` with this length unit."""
        return _units(self.system, self.length_unit)

    @property
    def title(self) -> str:
        return f"{self.units.title}, {self.length_unit}"

    # --------------------------------------------------------- conversions
    def length(self, metres: Value) -> Value:
        return self.units.to_display(metres, "length")

    def length_si(self, value: Value) -> Value:
        return self.units.from_display(value, "length")

    def pressure(self, pa: Value) -> Value:
        return self.units.to_display(pa, "pressure")

    def pressure_si(self, value: Value) -> Value:
        return self.units.from_display(value, "pressure")

    def volume(self, m3: Value) -> Value:
        return self.units.to_display(m3, "volume")

    def volume_si(self, value: Value) -> Value:
        return self.units.from_display(value, "volume")

    def density(self, kg_m3: Value) -> Value:
        return self.units.to_display(kg_m3, "density")

    def density_si(self, value: Value) -> Value:
        return self.units.from_display(value, "density")

    def force_scope(self, section: Section, length_unit: str = "m") -> ForceScope:
        """How the forces of ``section`` (from a file in ``length_unit``) are
        shown in this system (:func:`wetline.core.force_scope.force_scope`)."""
        return force_scope(section, self.units, length_unit)

    def resistance_unit(self, section: Section) -> tuple[str, str]:
        """(quantity, label) of a part's self-weight and holding-down
        resistance: per metre of width for plane sections ("kN/m",
        "lbf/ft"), totals for axisymmetric ones ("kN", "lbf")."""
        q = resistance_quantity(section)
        return q, self.units.label(q)

    @property
    def unit_weight_label(self) -> str:
        """Label of unit weights (of concrete, of soil): kN/m3 or lbf/ft3."""
        return _UNIT_WEIGHTS[self.system][0]

    def unit_weight(self, n_m3: Value) -> Value:
        """A unit weight [N/m3] in the display system's unit."""
        return n_m3 / _unit_weight_factor(self.system)

    def unit_weight_si(self, value: Value) -> Value:
        """A unit weight typed in the display system's unit, in N/m3."""
        return value * _unit_weight_factor(self.system)

    # -------------------------------------------------------- formatting
    def fmt_length(self, metres: float) -> str:
        return self.units.text(metres, "length")

    def fmt_pressure(self, pa: float) -> str:
        return self.units.text(pa, "pressure")

    def fmt_volume(self, m3: float) -> str:
        return self.units.text(m3, "volume")

    def fmt_density(self, kg_m3: float) -> str:
        return self.units.text(kg_m3, "density")

    def message(self, text: str) -> str:
        """A message of core's (a refusal: lengths in metres, as core
        computes) with its lengths and points in the display length unit,
        as the window shows every other length: "at 1.85 m" reads "at
        6.07 ft" in feet, "(0.3048, 0) m" reads "(1, 0) ft"
        (:meth:`wetline.core.units.DisplayUnits.message`)."""
        return self.units.message(text)

    def explain(self, exc: BaseException) -> str:
        """What to show of the refusal ``exc``: one of core's (its lengths in
        metres) through :meth:`message`, any other (a typed number that does
        not parse, which quotes the text typed) as it is."""
        text = str(exc)
        return self.message(text) if is_core_refusal(exc) else text


_UNIT_WEIGHTS = {"si": ("kN/m3", "kN/m**3"), "us": ("lbf/ft3", "lbf/ft**3")}
"""Display label and pint expression of unit weights in each system."""
_UNIT_WEIGHT_FACTORS: dict[str, float] = {}


def _unit_weight_factor(system: str) -> float:
    """N/m3 in one display unit of unit weight (pint, rounded as every
    display factor is)."""
    f = _UNIT_WEIGHT_FACTORS.get(system)
    if f is None:
        f = _UNIT_WEIGHT_FACTORS[system] = pint_factor(_UNIT_WEIGHTS[system][1], "N/m**3")
    return f


_CACHE: dict[tuple[str, str], DisplayUnits] = {}


def _units(system: str, length_unit: str) -> DisplayUnits:
    key = (system, length_unit)
    u = _CACHE.get(key)
    if u is None:
        u = _CACHE[key] = display_units(system).with_length(length_unit)
    return u
