"""What a section's force values cover, and the unit they are shown in.

The one rule, asked by every output (command line, window, tables, chart,
diagram, SVG, PDF and CSV):

- a plane section whose width is exactly one unit of run (1 m, or 1 ft in a
  file whose length unit is ft) gives forces per run: they are shown per run
  in the display system, kN/m in SI and lbf/ft in US, converted (a 1 ft run
  shown in SI is in kN/m, a 1 m run shown in US in lbf/ft);
- any other width gives the force on that width: kN, lbf;
- an axisymmetric section gives the force over the full circumference: kN, lbf.

Inside Wetline (and in the JSON results record) forces stay N on the
section's whole width; only their display changes. Hoop forces are N/m
whatever the width and are not affected, nor are the self-weight and
holding-down resistance a user enters against uplift: per metre of width
on a plane section, totals on an axisymmetric one
(:func:`resistance_quantity`).

Round-off: :func:`force_scale` gives the largest force of a solution, the
``scale`` below which :func:`wetline.core.numbers.format_number` shows a
force as 0 (sums of opposite forces leave round-off; hoop forces are
products, not sums, and need no scale).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from .numbers import format_number, is_noise

__all__ = ["ForceScope", "force_scope", "force_scale", "resistance_quantity", "RUN_LENGTHS"]

RUN_LENGTHS = {"m": 1.0, "ft": 0.3048}
"""The unit of run [m] a file in each length unit may be exactly as wide as:
1 m in any file, 1 ft in a file whose length unit is ft (the international
foot, 0.3048 m exactly)."""

_RUN_WORDS = {"si": "per m run", "us": "per ft run"}


@dataclass(frozen=True)
class ForceScope:
    """How the force values of one section are shown in one display system.

    Attributes
    ----------
    per_run : bool
        True if the values are per unit of run (a plane section one unit of
        run wide), shown as force per length.
    words : str
        What the values cover, for a sentence: ``"per m run"``, ``"per ft
        run"``, ``"for a width of 2.5 m"``, ``"over the full circumference"``.
    quantity : str
        ``"force_per_length"`` or ``"force"``: the display quantity.
    label : str
        The display unit: ``"kN/m"``, ``"lbf/ft"``, ``"kN"``, ``"lbf"``.
    divisor : float
        Newtons on the section's width in one display unit [N]; a force
        [N] shows as ``force / divisor``.

    Examples
    --------
    >>> scope = ForceScope(True, "per ft run", "force_per_length", "lbf/ft", 14.5939)
    >>> scope.text(1459.39)
    '100 lbf/ft'
    """

    per_run: bool
    words: str
    quantity: str
    label: str
    divisor: float

    def to_display(self, newtons):
        """``newtons`` [N on the section's width] in the display unit
        (float or numpy array)."""
        return newtons / self.divisor

    def number(self, newtons, digits: int | None = None, scale: float | None = None) -> str:
        """``"12.35"``: the value in the display unit, for people. ``scale``
        [N]: the case's largest force; round-off below it shows as 0."""
        v = 0.0 if is_noise(newtons, scale) else self.to_display(newtons)
        return format_number(v, digits)

    def text(self, newtons, digits: int | None = None, scale: float | None = None) -> str:
        """``"12.35 kN/m"``: :meth:`number` and the unit."""
        return f"{self.number(newtons, digits, scale)} {self.label}"


def force_scope(section, units, length_unit: str = "m") -> ForceScope:
    """The :class:`ForceScope` of ``section`` shown in ``units``.

    Parameters
    ----------
    section : wetline.core.section.Section
    units : wetline.core.units.DisplayUnits
        The display system (its length unit words the width).
    length_unit : str
        The length unit of the section's file: a plane section 1 ft wide is
        per run only in a file in ft.

    Returns
    -------
    ForceScope

    Examples
    --------
    >>> from wetline.core.section import Section
    >>> from wetline.core.units import SI, US
    >>> tank = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                      parts=["floor", "wall", "open", "wall"])
    >>> force_scope(tank, SI).label, force_scope(tank, US).words
    ('kN/m', 'per ft run')
    >>> foot = tank.replace(width=0.3048)
    >>> force_scope(foot, SI, "ft").words, force_scope(foot, US, "m").words
    ('per m run', 'for a width of 1 ft')
    """
    if section.is_axisymmetric:
        return ForceScope(False, "over the full circumference", "force", units.label("force"),
                          units.factor("force"))
    width = float(section.width)
    runs = [RUN_LENGTHS["m"]]
    if length_unit == "ft":
        runs.append(RUN_LENGTHS["ft"])
    if any(abs(width - run) <= 1e-12 * run for run in runs):
        return ForceScope(True, _RUN_WORDS.get(units.name, "per m run"), "force_per_length",
                          units.label("force_per_length"),
                          width * units.factor("force_per_length"))
    shown = format_number(units.to_display(width, "length"))
    return ForceScope(False, f"for a width of {shown} {units.label('length')}", "force",
                      units.label("force"), units.factor("force"))


def _largest(*arrays) -> float:
    big = 0.0
    for a in arrays:
        a = np.abs(np.asarray(a, dtype=np.float64))
        if a.size:
            big = max(big, float(np.nanmax(a, initial=0.0)))
    return big


def force_scale(solution) -> float:
    """The largest force of a solution [N]: over its edges (fx, fz,
    resultant), parts and totals; the scale of its round-off."""
    parts = [(0.0 if p.fx is None else p.fx, p.fz, p.down) for p in solution.parts.values()]
    return _largest(solution.fx, solution.fz, solution.resultant, parts,
                    [solution.fluid_weight, solution.floor_force, solution.support_reaction])


def resistance_quantity(section) -> str:
    """The display quantity of a part's self-weight and holding-down
    resistance (:class:`wetline.core.uplift.PartResistance`): per metre of
    width, ``"force_per_length"`` (kN/m, lbf/ft), on a plane section;
    totals, ``"force"`` (kN, lbf), on an axisymmetric one."""
    return "force" if section.is_axisymmetric else "force_per_length"
