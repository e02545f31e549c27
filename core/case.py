"""A design case: a section with its liquid, gravity and fill.

This is everything a section file holds and everything a result depends on.
Coordinates inside are in metres; ``length_unit`` only records the unit the
file was written in, so that saving writes the same numbers back.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace
from typing import TYPE_CHECKING, Any

from . import STANDARD_GRAVITY, limits
from .fill import FillError, capacity, level_for_volume
from .hydrostatics import solve
from .liquids import Liquid, fresh_water
from .number_input import range_text
from .numbers import DEFAULT_DIGITS, FIGURES_RANGE
from .section import Section
from .uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

if TYPE_CHECKING:  # pragma: no cover - types only
    from .hydrostatics import Solution
    from .uplift import UpliftResult

__all__ = ["Case", "CaseError", "ReportInfo", "Revision", "REVISION_KEYS", "REPORT_KEYS"]


REVISION_KEYS = ("revision", "date", "description", "prepared", "checked", "approved")
"""The fields of one row of a sheet's revision history, in order."""

_REPORT_TEXT_KEYS = ("project", "job_reference", "prepared_by", "calculation_reference",
                     "revision", "checked_by", "approved_by")

REPORT_KEYS = (*_REPORT_TEXT_KEYS, "revisions", "significant_figures")
"""The keys of a section file's ``report`` object (docs/section-format-v2.md)."""


@dataclass(frozen=True)
class Revision:
    """One row of a calculation sheet's revision history (all text).

    Attributes
    ----------
    revision : str
        The revision's mark ("A", "P1", "0") [].
    date : str
        When it was issued (ISO 8601 by habit, any text allowed).
    description : str
        What changed ("first issue", "levels to the new survey").
    prepared, checked, approved : str
        Who prepared, checked and approved it (initials or names).
    """

    revision: str = ""
    date: str = ""
    description: str = ""
    prepared: str = ""
    checked: str = ""
    approved: str = ""

    def __post_init__(self) -> None:
        for name in REVISION_KEYS:
            if not isinstance(getattr(self, name), str):
                raise CaseError(f"revision {name} must be text")

    @property
    def is_empty(self) -> bool:
        """True if no field is filled in."""
        return not any(getattr(self, k) for k in REVISION_KEYS)


@dataclass(frozen=True)
class ReportInfo:
    """Fields of a calculation sheet's header and document control, and the
    precision policy of the document's numbers; kept with the case.

    Attributes
    ----------
    project, job_reference, prepared_by : str
        Header fields of every page.
    calculation_reference : str
        The sheet's own reference in the calculation package.
    revision : str
        The current revision; empty: the last row of ``revisions``.
    checked_by, approved_by : str
        Sign-off fields beside ``prepared_by``.
    revisions : tuple of Revision
        The revision history, oldest first.
    significant_figures : int
        Significant figures of every result shown to people (tables,
        labels, the sheet), within
        :data:`wetline.core.numbers.FIGURES_RANGE`; default 4. Coordinates
        and dimensions are shown as entered whatever this says, and files
        and CSV keep full precision.
    """

    project: str = ""
    job_reference: str = ""
    prepared_by: str = ""
    calculation_reference: str = ""
    revision: str = ""
    checked_by: str = ""
    approved_by: str = ""
    revisions: tuple[Revision, ...] = ()
    significant_figures: int = DEFAULT_DIGITS

    def __post_init__(self) -> None:
        for name in _REPORT_TEXT_KEYS:
            if not isinstance(getattr(self, name), str):
                raise CaseError(f"report {name.replace('_', ' ')} must be text")
        revs = tuple(self.revisions)
        for r in revs:
            if not isinstance(r, Revision):
                raise CaseError("report revisions must be Revision values")
        object.__setattr__(self, "revisions", revs)
        n = self.significant_figures
        lo, hi = FIGURES_RANGE
        if isinstance(n, bool) or not isinstance(n, int) or not lo <= n <= hi:
            raise CaseError(f"report significant figures must be a whole number from {lo} "
                            f"to {hi}, not {n!r}")

    @property
    def is_empty(self) -> bool:
        """True if no field is filled in and the precision is the default."""
        return (not any(getattr(self, k) for k in _REPORT_TEXT_KEYS) and not self.revisions
                and self.significant_figures == DEFAULT_DIGITS)

    @property
    def current_revision(self) -> str:
        """The revision the sheet is at: ``revision``, else the last
        history row's mark, else empty."""
        if self.revision:
            return self.revision
        return self.revisions[-1].revision if self.revisions else ""

    def to_dict(self) -> dict[str, Any]:
        """The section file's ``report`` object (format version 2): only
        the keys that are filled in or differ from the default, in the
        order of the format's description (``docs/section-format-v2.md``)."""
        out: dict[str, Any] = {k: getattr(self, k) for k in _REPORT_TEXT_KEYS
                               if getattr(self, k)}
        if self.revisions:
            out["revisions"] = [{k: getattr(r, k) for k in REVISION_KEYS if getattr(r, k)}
                                for r in self.revisions]
        if self.significant_figures != DEFAULT_DIGITS:
            out["significant_figures"] = self.significant_figures
        return out

    @classmethod
    def from_dict(cls, data: object) -> ReportInfo:
        """The fields of a section file's ``report`` object, checked: every
        key known, texts text, ``revisions`` a list of objects of
        :data:`REVISION_KEYS`, ``significant_figures`` a whole number in
        range; CaseError naming the key otherwise ("report.revisions[1]:
        unknown key 'dte'").

        >>> ReportInfo.from_dict({"checked_by": "RS", "revisions": [{"revision": "A"}]}
        ...                      ).current_revision
        'A'
        """
        if not isinstance(data, dict):
            raise CaseError("report must be an object")
        for key in data:
            if key not in REPORT_KEYS:
                raise CaseError(f"report: unknown key {key!r}")
        values: dict[str, Any] = {}
        for key in _REPORT_TEXT_KEYS:
            if key in data:
                if not isinstance(data[key], str):
                    raise CaseError(f"report.{key} must be text")
                values[key] = data[key]
        rows = data.get("revisions", [])
        if not isinstance(rows, list):
            raise CaseError("report.revisions must be a list")
        revs = []
        for k, row in enumerate(rows):
            where = f"report.revisions[{k}]"
            if not isinstance(row, dict):
                raise CaseError(f"{where} must be an object")
            for key, v in row.items():
                if key not in REVISION_KEYS:
                    raise CaseError(f"{where}: unknown key {key!r}")
                if not isinstance(v, str):
                    raise CaseError(f"{where}.{key} must be text")
            revs.append(Revision(**row))
        values["revisions"] = tuple(revs)
        if "significant_figures" in data:
            n = data["significant_figures"]
            if isinstance(n, float) and n.is_integer():
                n = int(n)
            lo, hi = FIGURES_RANGE
            if isinstance(n, bool) or not isinstance(n, int) or not lo <= n <= hi:
                raise CaseError(f"report.significant_figures must be a whole number from "
                                f"{lo} to {hi}, not {n!r}")
            values["significant_figures"] = n
        return cls(**values)


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
    resistances : tuple of (str, PartResistance)
        What holds each named part down, for the uplift check, sorted by
        part name (see :mod:`wetline.core.uplift`).
    required_uplift_factor : float
        Required factor against uplift [].
    report : ReportInfo
        Calculation sheet header fields.
    """

    section: Section
    liquid: Liquid
    gravity: float = STANDARD_GRAVITY
    fill_level: float | None = None
    fill_volume: float | None = None
    length_unit: str = "m"
    resistances: tuple[tuple[str, PartResistance], ...] = ()
    required_uplift_factor: float = DEFAULT_REQUIRED_FACTOR
    report: ReportInfo = ReportInfo()

    def __post_init__(self) -> None:
        given: Any = self.resistances  # a dict is accepted too
        pairs = given.items() if isinstance(given, dict) else given
        res = tuple(sorted(((str(k), v) for k, v in pairs), key=lambda kv: kv[0]))
        for k, v in res:
            if not isinstance(v, PartResistance):
                raise CaseError(f"resistance of part {k!r} must be a PartResistance")
        object.__setattr__(self, "resistances", res)
        f = self.required_uplift_factor
        if isinstance(f, bool) or not isinstance(f, (int, float)) or not math.isfinite(f) or f <= 0:
            raise CaseError(f"required uplift factor must be a positive number, not {f!r}")
        g = self.gravity
        if isinstance(g, bool) or not isinstance(g, (int, float)) or not math.isfinite(g) or g <= 0:
            raise CaseError(f"gravity must be a positive number, not {g!r}")
        lo, hi = limits.GRAVITY_RANGE
        if not lo <= g <= hi:
            raise CaseError(f"gravity must be {range_text(lo, hi, 'm/s2')}, not {g:g}")
        if (self.fill_level is None) == (self.fill_volume is None):
            raise CaseError("a fill gives exactly one of level and volume")
        if self.fill_level is not None:
            level, limit = self.fill_level, limits.COORDINATE_LIMIT
            if not math.isfinite(level):
                raise CaseError(f"fill level must be a finite number, not {level!r}")
            if not -limit <= level <= limit:
                raise CaseError(f"fill level must be {range_text(-limit, limit, 'm')}, "
                                f"not {level:g} m")
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
    def default(cls, section: Section, level: float | None = None) -> Case:
        """A case with fresh water at 20 C, standard gravity and the given
        level (default: the section's top level)."""
        return cls(section=section, liquid=fresh_water(20.0),
                   fill_level=section.top_level if level is None else float(level))

    def __eq__(self, other: object) -> bool:
        if not isinstance(other, Case):
            return NotImplemented
        return (self.section == other.section and self.liquid == other.liquid
                and self.gravity == other.gravity and self.fill_level == other.fill_level
                and self.fill_volume == other.fill_volume
                and self.length_unit == other.length_unit
                and self.resistances == other.resistances
                and self.required_uplift_factor == other.required_uplift_factor
                and self.report == other.report)

    __hash__ = None  # type: ignore[assignment]  # equal by value, holds a Section

    @property
    def name(self) -> str:
        """The section's name."""
        return self.section.name

    @property
    def level(self) -> float:
        """The requested level [m]: as given, or solved from the volume."""
        if self.fill_level is not None:
            return self.fill_level
        assert self.fill_volume is not None  # exactly one of level and volume is given
        level: float = level_for_volume(self.section, self.fill_volume)
        return level

    def solve(self, level: float | None = None) -> Solution:
        """Loads at the case's fill, or at ``level`` [m] if given."""
        solution: Solution = solve(self.section, self.level if level is None else level,
                                   self.liquid.density, self.gravity)
        return solution

    def with_level(self, level: float) -> Case:
        """Copy filled to ``level`` [m]."""
        return replace(self, fill_level=float(level), fill_volume=None)

    def with_volume(self, volume: float) -> Case:
        """Copy filled with ``volume`` [m3]."""
        return replace(self, fill_level=None, fill_volume=float(volume))

    def with_section(self, section: Section) -> Case:
        """Copy with another section; a fill by volume that the new section
        cannot hold becomes a fill to its top level."""
        if self.fill_volume is not None and self.fill_volume > capacity(section):
            return replace(self, section=section, fill_volume=None,
                           fill_level=section.top_level)
        return replace(self, section=section)

    @property
    def resistance_map(self) -> dict[str, PartResistance]:
        """``{part: PartResistance}`` for the uplift check."""
        return dict(self.resistances)

    @property
    def uses_version_2(self) -> bool:
        """True if the case holds data that only format version 2 can store."""
        return bool(self.resistances or not self.report.is_empty
                    or self.required_uplift_factor != DEFAULT_REQUIRED_FACTOR)

    def uplift(self, solution: Solution | None = None) -> list[UpliftResult]:
        """The uplift check of every part with a resistance entered
        (list of :class:`~wetline.core.uplift.UpliftResult`)."""
        from .uplift import uplift_check

        return uplift_check(self, self.resistance_map, self.required_uplift_factor, solution)

    def with_resistance(self, part: str, resistance: PartResistance | None) -> Case:
        """Copy with ``part`` held down by ``resistance`` (None removes it)."""
        res = self.resistance_map
        if resistance is None:
            res.pop(part, None)
        else:
            res[part] = resistance
        return replace(self, resistances=tuple(res.items()))

    def with_required_uplift_factor(self, factor: float) -> Case:
        """Copy with another required factor against uplift []."""
        return replace(self, required_uplift_factor=float(factor))

    def with_report(self, report: ReportInfo) -> Case:
        """Copy with other calculation sheet header fields."""
        return replace(self, report=report)

    def with_liquid(self, liquid: Liquid) -> Case:
        """Copy with another liquid."""
        return replace(self, liquid=liquid)

    def with_gravity(self, gravity: float) -> Case:
        """Copy with another acceleration of gravity [m/s2]."""
        return replace(self, gravity=float(gravity))

    def with_length_unit(self, unit: str) -> Case:
        """Copy that saves its coordinates in another length unit."""
        return replace(self, length_unit=str(unit))
