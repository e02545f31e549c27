"""How results are shown: the display unit choice and number formatting.

Values inside Wetline are SI floats; this module converts and formats them
for labels, tables and the status bar only.

Forces of a plane section are the loads on its full ``width``. When the
width is exactly 1 m (the section file's "results per metre" convention) the
values are labelled as force per length (kN/m, lbf/ft), converted as
force / width; otherwise they are labelled as forces (kN, lbf) for the width.
Axisymmetric forces are for the full revolution (kN, lbf).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from wetline.core.report_tables import force_scope
from wetline.core.units import SI_LENGTH_UNITS, US_LENGTH_UNITS, display_units

__all__ = ["DisplayChoice", "format_number", "LENGTH_UNITS_OF"]

LENGTH_UNITS_OF = {"si": SI_LENGTH_UNITS, "us": US_LENGTH_UNITS}
"""Display length units offered for each unit system."""


def format_number(value, digits=4):
    """``value`` with ``digits`` significant digits, plain notation when
    reasonable (``12.35``, ``-0.004120``, ``1.235e+07``); "-" for NaN/None."""
    if value is None:
        return "-"
    v = float(value)
    if not math.isfinite(v):
        return "-"
    if v == 0:
        return "0"
    a = abs(v)
    if a >= 1e7 or a < 1e-4:
        return f"{v:.{digits - 1}e}"
    decimals = max(0, digits - 1 - int(math.floor(math.log10(a))))
    return f"{v:.{decimals}f}"


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

    def __post_init__(self):
        if self.system not in LENGTH_UNITS_OF:
            raise ValueError(f"unit system must be 'si' or 'us', not {self.system!r}")
        if self.length_unit not in LENGTH_UNITS_OF[self.system]:
            raise ValueError(f"{self.length_unit!r} is not a length unit of {self.system}")

    @classmethod
    def for_system(cls, system):
        """The system with its usual length unit (m or ft)."""
        return cls(system, "m" if system == "si" else "ft")

    @property
    def units(self):
        """The :class:`wetline.core.units.DisplayUnits` with this length unit."""
        return _units(self.system, self.length_unit)

    @property
    def title(self):
        return f"{self.units.title}, {self.length_unit}"

    # --------------------------------------------------------- conversions
    def length(self, metres):
        return self.units.to_display(metres, "length")

    def length_si(self, value):
        return self.units.from_display(value, "length")

    def pressure(self, pa):
        return self.units.to_display(pa, "pressure")

    def volume(self, m3):
        return self.units.to_display(m3, "volume")

    def volume_si(self, value):
        return self.units.from_display(value, "volume")

    def density(self, kg_m3):
        return self.units.to_display(kg_m3, "density")

    def density_si(self, value):
        return self.units.from_display(value, "density")

    # ------------------------------------------------------------- forces
    @staticmethod
    def per_length(section):
        """True if the forces of ``section`` are shown per length (a plane
        section exactly 1 m wide)."""
        return section.kind == "plane" and section.width == 1.0

    def force_label(self, section):
        q = "force_per_length" if self.per_length(section) else "force"
        return self.units.label(q)

    def force(self, section, newtons):
        """A force [N] of ``section`` in display units (see module notes)."""
        if self.per_length(section):
            return self.units.to_display(np.asarray(newtons) / section.width,
                                         "force_per_length")
        return self.units.to_display(newtons, "force")

    def force_scope(self, section):
        """Plain words saying what the force values cover."""
        return force_scope(section, self.units)

    # -------------------------------------------------------- formatting
    def fmt_length(self, metres):
        return f"{format_number(self.length(metres))} {self.length_unit}"

    def fmt_pressure(self, pa):
        return f"{format_number(self.pressure(pa))} {self.units.label('pressure')}"

    def fmt_volume(self, m3):
        return f"{format_number(self.volume(m3))} {self.units.label('volume')}"

    def fmt_density(self, kg_m3):
        return f"{format_number(self.density(kg_m3))} {self.units.label('density')}"

    def fmt_force(self, section, newtons):
        return f"{format_number(self.force(section, newtons))} {self.force_label(section)}"


_CACHE = {}


def _units(system, length_unit):
    key = (system, length_unit)
    u = _CACHE.get(key)
    if u is None:
        u = _CACHE[key] = display_units(system).with_length(length_unit)
    return u
