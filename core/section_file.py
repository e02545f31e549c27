"""Read and write section files (``*.section.json``, format versions 1 to 3).

The format is specified in the project's shared spec (``section-format.md``).
Reading is strict: an unknown key, a value of the wrong type or a newer
version is refused with a message naming the key; nothing is guessed. Writing
then reading gives the same case.

Decisions where the spec is silent (also in DEVELOPERS.md):

- ``geometry.width`` is refused on an axisymmetric section (it would be
  silently meaningless there).
- ``fill`` is required and holds exactly one of ``level`` and ``volume``.
- ``fluid.preset`` without a ``temperature`` takes 20 C (fresh water) or
  10 C and 35 g/kg (seawater).
- Version 2 (Wetline's extension, documented in ``docs/section-format-v2.md``)
  adds ``uplift`` (required factor and each part's self-weight and
  holding-down resistance) and ``report`` (calculation sheet header fields).
  Version 1 files read as version 2 files without them. A case is written
  as version 1 whenever it holds nothing that needs version 2, so files stay
  readable by tools that know only version 1.
- Version 3 (``section-format-v3.md`` of the shared spec) adds the
  ``structure`` around the cavity, the ``ground`` and the load ``cases``
  (each with its liquid or layers, fill, gravity, groundwater, load factor,
  gas pressure, pockets and atmospheric pressure). :func:`read_design`
  reads any version into a :class:`~wetline.core.load_cases.Design`;
  :func:`read_section_file` gives the file-level
  :class:`~wetline.core.case.Case` (checking the version 3 keys too).
  :func:`write_design` writes the lowest version that holds the design.
- Lengths in another unit are converted to metres with a correctly rounded
  decimal product (2300 mm is exactly the float 2.3 m), and written back as
  the shortest decimal that reads back to exactly the same metres (15 digits
  where they suffice), so saving and reading never changes a section.
"""

from __future__ import annotations

import json
import math
import os
import re
import stat
from collections.abc import Callable, Collection, Iterable
from decimal import Decimal, localcontext
from pathlib import Path
from typing import Any, TypeVar

import numpy as np

from . import STANDARD_GRAVITY, limits
from .atomic_write import write_atomically
from .case import REPORT_KEYS, Case, CaseError, ReportInfo
from .fill import FillError
from .hydrostatics import POCKET_MODES, VENTED
from .liquids import Liquid, LiquidError, liquid_from_spec, liquid_to_spec
from .load_cases import FILL_WORDS, Design, LiquidLayer, LoadCase
from .number_input import number_text, range_text, shown
from .pockets import STANDARD_ATMOSPHERE
from .section import FloatArray, Section, SectionError, too_many_vertices
from .structure import (
    DEFAULT_GROUNDWATER_DENSITY,
    Ground,
    Groundwater,
    Structure,
    StructureError,
)
from .units import UnitError, length_factor, message_in_length_unit
from .uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

__all__ = [
    "FORMAT",
    "VERSION",
    "SectionFileError",
    "case_from_dict",
    "case_to_dict",
    "design_from_dict",
    "design_to_dict",
    "design_version",
    "dumps_case",
    "dumps_design",
    "loads_case",
    "loads_design",
    "read_design",
    "read_section_file",
    "write_design",
    "write_section_file",
]

_T = TypeVar("_T")

FORMAT = "wetline-section"
VERSION = 3
"""The newest version this program reads and writes."""

_TOP_KEYS = {"format", "version", "name", "length_unit", "geometry", "outline",
             "parts", "fluid", "gravity", "fill"}
_GEOMETRY_KEYS = {"kind", "width"}
_FILL_KEYS = {"level", "volume"}
_V2_KEYS = {"uplift", "report"}
_UPLIFT_KEYS = {"required_factor", "parts"}
_RESISTANCE_KEYS = ("self_weight", "holding_down")  # checked in this order
_REPORT_KEYS = set(REPORT_KEYS)
_V3_KEYS = {"structure", "ground", "cases"}
_STRUCTURE_KEYS = {"outline", "parts", "unit_weight", "extra_weight", "anchorage"}
_GROUND_KEYS = {"level", "unit_weight_dry", "unit_weight_saturated"}
_CASE_KEYS = {"name", "fluid", "fill", "gravity", "layers", "gas_pressure", "pockets",
              "atmospheric_pressure", "groundwater", "load_factor"}
_LAYER_KEYS = {"fluid", "top", "volume"}
_GROUNDWATER_KEYS = {"level", "density"}


class SectionFileError(ValueError):
    """A section file that cannot be read, with a one-line reason.

    ``edges`` / ``vertices`` / ``location`` carry over from a
    :class:`~wetline.core.section.SectionError`, when that is the cause.
    """

    def __init__(self, message: str, *, edges: Iterable[int] = (),
                 vertices: Iterable[int] = (),
                 location: tuple[float, float] | None = None) -> None:
        super().__init__(message)
        self.edges = tuple(edges)
        self.vertices = tuple(vertices)
        self.location = location


def _is_number(v: object) -> bool:
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def _number(obj: dict[str, Any], key: str, where: str, *, ranged: bool = False) -> float:
    """``obj[key]`` as a float, refused unless it is a number.

    NaN and infinities are refused as not finite, except, with ``ranged``, a
    number the file writes too large for a float (``1e400``, 400 digits):
    it reads as an infinity that the caller's range check then refuses,
    showing the file's text.
    """
    v = obj[key]
    if not _is_number(v):
        raise SectionFileError(f"{where}{key} must be a number, not {shown(v)}")
    value = float(v)
    if not math.isfinite(value) and not (ranged and math.isinf(value) and hasattr(v, "text")):
        raise SectionFileError(f"{where}{key} must be a finite number")
    return value


def _length_number(obj: dict[str, Any], key: str, where: str) -> float:
    """``obj[key]``, a length in the file's unit, checked as :func:`_number`
    (ranged) does, as the value the file holds: a float read from text keeps
    its text, so :func:`_to_metres` converts the exact decimal written (a
    float's repr may hold fewer digits than the text)."""
    value = _number(obj, key, where, ranged=True)
    raw = obj[key]
    return raw if isinstance(raw, _Exact) and math.isfinite(value) else value


def _object(obj: object, allowed: Collection[str], where: str) -> dict[str, Any]:
    """``obj`` if it is a JSON object holding only ``allowed`` keys."""
    if not isinstance(obj, dict):
        label = where.rstrip(".") or "the file"
        raise SectionFileError(f"{label} must be a JSON object")
    for key in obj:
        if key not in allowed:
            inside = f" in {where.rstrip('.')}" if where else ""
            raise SectionFileError(f"unknown key {key!r}{inside}")
    return obj


def case_from_dict(data: object) -> Case:
    """Build a :class:`~wetline.core.case.Case` from a parsed section file:
    the file-level section, liquid, gravity, fill, uplift and report.

    The keys are read group by group, in this order: the header (format,
    version, known keys), name and length unit, geometry, outline and parts,
    fluid, gravity, fill, then the version 2 groups uplift and report, then
    the version 3 groups structure, ground and cases (read and checked as
    :func:`design_from_dict` does; the Case leaves them out). The first
    fault found is reported.

    Raises
    ------
    SectionFileError
        Naming the key or the geometric fault.
    """
    case, data, scale = _read_file_level(data)
    if any(key in data for key in _V3_KEYS):
        _read_design(case, data, scale)
    return case


def design_from_dict(data: object) -> Design:
    """Build a :class:`~wetline.core.load_cases.Design` from a parsed section
    file of any version: the file-level case (:func:`case_from_dict`), then
    the version 3 groups ``structure``, ``ground`` and ``cases``, each read
    by its own small reader; the design then checks the cases against the
    section and the structure (unique names, a spill fill only on an open
    section, groundwater only with a structure ...).

    Raises
    ------
    SectionFileError
        Naming the key (and the case) or the fault.
    """
    case, data, scale = _read_file_level(data)
    return _read_design(case, data, scale)


def _read_file_level(data: object) -> tuple[Case, dict[str, Any], float]:
    """The file-level Case, the file's object and metres per length unit."""
    data = _read_header(data)
    name = _read_name(data)
    unit, scale = _read_length_unit(data)
    kind, width = _read_geometry(data, unit, scale)
    section = _read_section(data, kind, width, name, unit, scale)
    liquid = _read_fluid(data)
    gravity = _read_gravity(data)
    level, volume = _read_fill(data, unit, scale)
    resistances, factor = _read_uplift(data.get("uplift", {}), section)
    report = _read_report(data.get("report", {}))
    try:
        case = Case(section=section, liquid=liquid, gravity=gravity, fill_level=level,
                    fill_volume=volume, length_unit=unit, resistances=resistances,
                    required_uplift_factor=factor, report=report)
    except (CaseError, FillError) as exc:
        raise _refusal(exc, unit) from None
    return case, data, scale


def _refusal(exc: Exception, unit: str, **where: Any) -> SectionFileError:
    """Core's refusal ``exc`` of what a file gives, its lengths (in metres,
    as core computes) in the file's length ``unit``: the numbers the file's
    author wrote (:func:`wetline.core.units.message_in_length_unit`)."""
    return SectionFileError(message_in_length_unit(str(exc), unit), **where)


def _required(data: dict[str, Any], key: str, hint: str = "") -> object:
    """``data[key]``, or a "missing key" SectionFileError."""
    if key not in data:
        raise SectionFileError(f"missing key {key!r}{hint}")
    return data[key]


def _read_header(obj: object) -> dict[str, Any]:
    """The file's object, after checking its format, version and keys (in
    this order: a file that is no section file, or a newer one, says so
    before anything else)."""
    if not isinstance(obj, dict):
        raise SectionFileError("the file must be a JSON object")
    if "format" not in obj:
        raise SectionFileError(f'not a Wetline section file (no "format": "{FORMAT}")')
    if obj["format"] != FORMAT:
        raise SectionFileError(f"format must be \"{FORMAT}\", not {shown(obj['format'])}")
    version = _required(obj, "version")
    if not isinstance(version, int) or isinstance(version, bool) or version < 1:
        raise SectionFileError(f"version must be a whole number >= 1, not {shown(version)}")
    if version > VERSION:
        raise SectionFileError(
            f"section file version {shown(version)} is newer than this program reads "
            f"(up to {VERSION}); use a newer Wetline")
    data = _object(obj, _TOP_KEYS | _V2_KEYS | _V3_KEYS, "")
    for needs, keys in ((2, _V2_KEYS), (3, _V3_KEYS)):
        if version < needs:
            for key in sorted(keys):
                if key in data:
                    raise SectionFileError(
                        f"key {key!r} needs section file version {needs} (this file says "
                        f"version {version})")
    return data


def _read_name(data: dict[str, Any]) -> str:
    name = data.get("name", "")
    if not isinstance(name, str):
        raise SectionFileError("name must be text")
    return name


def _read_length_unit(data: dict[str, Any]) -> tuple[str, float]:
    """The file's length unit and metres in one of it."""
    unit = data.get("length_unit", "m")
    if not isinstance(unit, str):
        raise SectionFileError("length_unit must be text such as \"m\" or \"mm\"")
    try:
        return unit, length_factor(unit)
    except UnitError as exc:
        raise SectionFileError(f"length_unit: {exc}") from None


def _read_geometry(data: dict[str, Any], unit: str, scale: float) -> tuple[str, float]:
    """The kind and the width [m] (1 of the file's unit if not given)."""
    geometry = _object(_required(data, "geometry"), _GEOMETRY_KEYS, "geometry.")
    kind = _required(geometry, "kind", " in geometry")
    if kind not in ("plane", "axisymmetric"):
        raise SectionFileError(
            f"geometry.kind must be \"plane\" or \"axisymmetric\", not {shown(kind)}")
    width = 1.0
    if "width" in geometry:
        if kind == "axisymmetric":
            raise SectionFileError("geometry.width applies to plane sections only")
        width = _length_number(geometry, "width", "geometry.")
        if width <= 0:
            raise SectionFileError(f"geometry.width must be positive, not {width:g}")
    metres = _to_metres(width, scale)
    lo, hi = limits.WIDTH_RANGE
    if not lo <= metres <= hi:
        raise SectionFileError(f"geometry.width must be {range_text(lo, hi, 'm')}, "
                               f"not {shown(geometry['width'])} {unit}")
    return str(kind), metres


def _read_outline(data: dict[str, Any]) -> list[list[float]]:
    """The outline's vertices as the file gives them (checked pairs)."""
    outline = _required(data, "outline")
    if not isinstance(outline, list):
        raise SectionFileError("outline must be a list of [x, z] pairs")
    if len(outline) > limits.MAX_VERTICES:
        raise SectionFileError(too_many_vertices(len(outline)))
    for i, pt in enumerate(outline):
        if (not isinstance(pt, list) or len(pt) != 2
                or not all(_is_number(c) for c in pt)):
            raise SectionFileError(f"outline vertex {i} must be an [x, z] pair of numbers, "
                                   f"not {shown(pt)}", vertices=(i,))
    return outline


def _read_parts(data: dict[str, Any]) -> list[str] | None:
    parts = data.get("parts")
    if parts is not None:
        if not isinstance(parts, list) or not all(isinstance(p, str) for p in parts):
            raise SectionFileError("parts must be a list of names, one per edge")
    return None if parts is None else list(parts)


def _check_coordinates(outline: list[list[float]], pts: FloatArray, unit: str,
                       scale: float) -> None:
    """Every coordinate within +-COORDINATE_LIMIT [m], and 0 or at least
    SMALLEST_COORDINATE [m] in size; the message shows the file's number."""
    size = np.abs(pts) * scale
    limit, smallest = limits.COORDINATE_LIMIT, limits.SMALLEST_COORDINATE
    large = size > limit
    small = (size < smallest) & (size > 0)
    bad = np.flatnonzero((large | small).ravel())
    if not bad.size:
        return
    i, axis = divmod(int(bad[0]), 2)
    where = f"outline vertex {i} has {'xz'[axis]} = {shown(outline[i][axis])} {unit}"
    if large[i, axis]:
        raise SectionFileError(f"{where}, outside {range_text(-limit, limit, 'm')}",
                               vertices=(i,))
    raise SectionFileError(f"{where}; a coordinate is 0 or at least {number_text(smallest)} m "
                           "in size", vertices=(i,))


def _read_section(data: dict[str, Any], kind: str, width: float, name: str, unit: str,
                  scale: float) -> Section:
    """The validated Section of the outline and parts; ``width`` [m]."""
    outline = _read_outline(data)
    parts = _read_parts(data)
    try:
        pts = np.array(outline, dtype=np.float64).reshape(-1, 2)
        _check_coordinates(outline, pts, unit, scale)
        if scale != 1.0 and np.isfinite(pts).all():
            # from the parsed numbers themselves: they remember their text
            pts = np.array([[_to_metres(x, scale), _to_metres(z, scale)] for x, z in outline],
                           dtype=np.float64).reshape(-1, 2)
        return Section.build(pts, parts=parts, kind=kind, width=width, name=name)
    except SectionError as exc:
        raise _refusal(exc, unit, edges=exc.edges, vertices=exc.vertices,
                       location=exc.location) from None


def _read_fluid(data: dict[str, Any]) -> Liquid:
    try:
        return liquid_from_spec(_required(data, "fluid"))
    except LiquidError as exc:
        raise SectionFileError(str(exc)) from None


def _read_gravity(data: dict[str, Any]) -> float:
    if "gravity" not in data:
        return STANDARD_GRAVITY
    gravity = _number(data, "gravity", "", ranged=True)
    if gravity <= 0:
        raise SectionFileError(f"gravity must be positive, not {gravity:g}")
    lo, hi = limits.GRAVITY_RANGE
    if not lo <= gravity <= hi:
        raise SectionFileError(f"gravity must be {range_text(lo, hi, 'm/s2')}, "
                               f"not {shown(data['gravity'])}")
    return gravity


def _read_fill(data: dict[str, Any], unit: str, scale: float) -> tuple[float | None, float | None]:
    """``(level [m], None)`` or ``(None, volume [m3])``."""
    fill = _object(_required(data, "fill", " (give \"level\" or \"volume\")"), _FILL_KEYS,
                   "fill.")
    if len(fill) != 1:
        raise SectionFileError("fill must give exactly one of \"level\" and \"volume\"")
    if "level" in fill:
        level = _to_metres(_length_number(fill, "level", "fill."), scale)
        limit = limits.COORDINATE_LIMIT
        if not -limit <= level <= limit:
            raise SectionFileError(f"fill.level must be {range_text(-limit, limit, 'm')}, "
                                   f"not {shown(fill['level'])} {unit}")
        return level, None
    volume = _number(fill, "volume", "fill.")
    if volume < 0:
        raise SectionFileError(f"fill.volume must be >= 0, not {volume:g}")
    return None, volume


def _read_uplift(obj: object, section: Section) -> tuple[tuple[tuple[str, PartResistance], ...],
                                                         float]:
    """Resistances by part and the required factor from a version 2 file."""
    uplift = _object(obj, _UPLIFT_KEYS, "uplift.")
    factor = DEFAULT_REQUIRED_FACTOR
    if "required_factor" in uplift:
        factor = _number(uplift, "required_factor", "uplift.")
        if factor <= 0:
            raise SectionFileError(f"uplift.required_factor must be positive, not {factor:g}")
    parts = uplift.get("parts", {})
    if not isinstance(parts, dict):
        raise SectionFileError("uplift.parts must be an object of part names")
    return tuple((str(name), _read_resistance(name, res, section))
                 for name, res in parts.items()), factor


def _read_resistance(name: str, obj: object, section: Section) -> PartResistance:
    """What holds the part ``name`` down (``uplift.parts.NAME``)."""
    where = f"uplift.parts.{name}."
    if name not in section.loaded_part_names:
        raise SectionFileError(
            f"uplift.parts names {name!r}, which is not a loaded part of the outline "
            f"(parts: {', '.join(section.loaded_part_names)})")
    res = _object(obj, _RESISTANCE_KEYS, where)
    unit = "N" if section.is_axisymmetric else "N/m"
    values = {}
    for key in _RESISTANCE_KEYS:
        if key in res:
            values[key] = _number(res, key, where, ranged=True)
            if values[key] < 0:
                raise SectionFileError(f"{where}{key} must be >= 0, not {values[key]:g}")
            if values[key] > limits.FORCE_LIMIT:
                raise SectionFileError(
                    f"{where}{key} must be at most {number_text(limits.FORCE_LIMIT)} {unit}, "
                    f"not {shown(res[key])}")
    return PartResistance(**values)


def _read_report(report: object) -> ReportInfo:
    report = _object(report, _REPORT_KEYS, "report.")
    try:
        return ReportInfo.from_dict(report)
    except CaseError as exc:
        raise SectionFileError(str(exc)) from None


# ------------------------------------------------------------------ version 3
def _read_design(case: Case, data: dict[str, Any], scale: float) -> Design:
    """The Design of a file whose file-level ``case`` is read: structure,
    ground and cases, then the design's own checks."""
    section = case.section
    unit = case.length_unit
    structure = None
    if "structure" in data:
        structure = _read_structure(data["structure"], section, unit, scale)
    ground = None
    if "ground" in data:
        ground = _read_ground(data["ground"], unit, scale)
    cases: tuple[LoadCase, ...] = ()
    if "cases" in data:
        cases = _read_cases(data["cases"], unit, scale)
    try:
        return Design(case, structure, ground, cases)
    except StructureError as exc:
        raise _refusal(exc, unit, location=exc.location) from None
    except ValueError as exc:
        raise _refusal(exc, unit) from None


def _pairs(value: object, what: str) -> list[list[float]]:
    """``value`` checked as a list of [x, z] number pairs (``what`` names it)."""
    if not isinstance(value, list):
        raise SectionFileError(f"{what} must be a list of [x, z] pairs")
    if len(value) > limits.MAX_VERTICES:
        raise SectionFileError(f"{what}: {too_many_vertices(len(value))}")
    for i, pt in enumerate(value):
        if (not isinstance(pt, list) or len(pt) != 2
                or not all(_is_number(c) for c in pt)):
            raise SectionFileError(f"{what} vertex {i} must be an [x, z] pair of numbers, "
                                   f"not {shown(pt)}")
    return value


def _metres_pairs(value: list[list[float]], what: str, unit: str, scale: float) -> FloatArray:
    """The pairs in metres, each coordinate within the representable range."""
    limit, smallest = limits.COORDINATE_LIMIT, limits.SMALLEST_COORDINATE
    out = []
    for i, (x, z) in enumerate(value):
        pair = []
        for axis, c in enumerate((x, z)):
            m = _to_metres(float(c), scale) if scale == 1.0 else _to_metres(c, scale)
            where = f"{what} vertex {i} has {'xz'[axis]} = {shown(c)} {unit}"
            if not math.isfinite(m) or abs(m) > limit:
                raise SectionFileError(f"{where}, outside {range_text(-limit, limit, 'm')}")
            if 0 < abs(m) < smallest:
                raise SectionFileError(f"{where}; a coordinate is 0 or at least "
                                       f"{number_text(smallest)} m in size")
            pair.append(m)
        out.append(pair)
    return np.array(out, dtype=np.float64).reshape(-1, 2)


def _level_value(obj: dict[str, Any], key: str, where: str, unit: str, scale: float) -> float:
    """A level ``obj[key]`` in the file's unit, as metres within range."""
    level = _to_metres(_length_number(obj, key, where), scale)
    limit = limits.COORDINATE_LIMIT
    if not -limit <= level <= limit:
        raise SectionFileError(f"{where}{key} must be {range_text(-limit, limit, 'm')}, "
                               f"not {shown(obj[key])} {unit}")
    return level


def _read_structure(obj: object, section: Section, unit: str, scale: float) -> Structure:
    """``structure``: the outer outline, its parts and the material."""
    st = _object(obj, _STRUCTURE_KEYS, "structure.")
    outline = _pairs(_required(st, "outline", " in structure"), "structure.outline")
    pts = _metres_pairs(outline, "structure.outline", unit, scale)
    parts = st.get("parts")
    if parts is not None and (not isinstance(parts, list)
                              or not all(isinstance(p, str) for p in parts)):
        raise SectionFileError("structure.parts must be a list of names, one per outer edge")
    values: dict[str, float] = {}
    for key in ("unit_weight", "extra_weight", "anchorage"):
        if key in st:
            values[key] = _number(st, key, "structure.", ranged=True)
    try:
        return Structure.build(pts, parts, cavity=section, **values)
    except StructureError as exc:
        raise _refusal(exc, unit, location=exc.location) from None


def _read_ground(obj: object, unit: str, scale: float) -> Ground:
    """``ground``: the ground surface and the soil's unit weights."""
    gr = _object(obj, _GROUND_KEYS, "ground.")
    _required(gr, "level", " in ground")
    level = _level_value(gr, "level", "ground.", unit, scale)
    values = {key: _number(gr, key, "ground.", ranged=True)
              for key in ("unit_weight_dry", "unit_weight_saturated") if key in gr}
    try:
        return Ground(level, **values)
    except ValueError as exc:
        raise _refusal(exc, unit) from None


def _read_cases(obj: object, unit: str, scale: float) -> tuple[LoadCase, ...]:
    """``cases``: the load cases in file order, each by :func:`_read_case`."""
    if not isinstance(obj, list):
        raise SectionFileError("cases must be a list of load cases")
    if not obj:
        raise SectionFileError("cases is empty: leave it out for one case made of the "
                               "file-level fluid and fill")
    return tuple(_read_case(c, i, unit, scale) for i, c in enumerate(obj))


def _read_case(obj: object, index: int, unit: str, scale: float) -> LoadCase:
    """One load case: what it changes from the file level."""
    if not isinstance(obj, dict):
        raise SectionFileError(f"cases[{index}] must be a JSON object")
    if "name" not in obj:
        raise SectionFileError(f"cases[{index}]: missing key 'name'")
    name = obj["name"]
    if not isinstance(name, str) or not name.strip():
        raise SectionFileError(f"cases[{index}]: name must be non-empty text, not {shown(name)}")
    where = f"case {name!r}: "
    for key in obj:
        if key not in _CASE_KEYS:
            raise SectionFileError(f"{where}unknown key {key!r}")
    try:
        values: dict[str, Any] = {}
        if "fluid" in obj and "layers" in obj:
            raise SectionFileError("give 'fluid' or 'layers', not both")
        if "fluid" in obj:
            values["liquid"] = _read_fluid(obj)
        if "fill" in obj:
            values.update(_read_case_fill(obj["fill"], unit, scale))
        if "gravity" in obj:
            values["gravity"] = _read_gravity(obj)
        if "layers" in obj:
            values["layers"] = _read_layers(obj["layers"], unit, scale)
        if "gas_pressure" in obj:
            values["gas_pressure"] = _number(obj, "gas_pressure", "", ranged=True)
        if "pockets" in obj:
            values["pockets"] = _read_pockets(obj["pockets"])
        if "atmospheric_pressure" in obj:
            values["atmospheric_pressure"] = _number(obj, "atmospheric_pressure", "",
                                                     ranged=True)
        if "groundwater" in obj:
            values["groundwater"] = _read_groundwater(obj["groundwater"], unit, scale)
        if "load_factor" in obj:
            values["load_factor"] = _number(obj, "load_factor", "", ranged=True)
    except SectionFileError as exc:
        raise SectionFileError(f"{where}{exc}") from None
    try:
        return LoadCase(name, **values)
    except ValueError as exc:
        raise _refusal(exc, unit) from None


def _read_case_fill(obj: object, unit: str, scale: float) -> dict[str, Any]:
    """A case's ``fill``: a level (a number, ``"spill"`` or ``"empty"``) or a volume."""
    fill = _object(obj, _FILL_KEYS, "fill.")
    if len(fill) != 1:
        raise SectionFileError("fill must give exactly one of \"level\" and \"volume\"")
    if "level" in fill:
        if fill["level"] in FILL_WORDS:
            return {"fill_level": fill["level"]}
        if not _is_number(fill["level"]):
            raise SectionFileError(f"fill.level must be a number, \"spill\" or \"empty\", "
                                   f"not {shown(fill['level'])}")
        return {"fill_level": _level_value(fill, "level", "fill.", unit, scale)}
    volume = _number(fill, "volume", "fill.")
    if volume < 0:
        raise SectionFileError(f"fill.volume must be >= 0, not {volume:g}")
    return {"fill_volume": volume}


def _read_layers(obj: object, unit: str, scale: float) -> tuple[LiquidLayer, ...]:
    """A case's ``layers``: liquids from the bottom up, each with its top or volume."""
    if not isinstance(obj, list):
        raise SectionFileError("layers must be a list of {\"fluid\": ..., \"top\": z} "
                               "objects, bottom up")
    if not obj:
        raise SectionFileError("layers must hold at least one layer")
    out = []
    for i, layer in enumerate(obj):
        where = f"layers[{i}]."
        la = _object(layer, _LAYER_KEYS, where)
        try:
            liquid = liquid_from_spec(_required(la, "fluid", f" in layers[{i}]"))
        except LiquidError as exc:
            raise SectionFileError(f"layers[{i}]: {exc}") from None
        if "top" in la and "volume" in la:
            raise SectionFileError(f"layers[{i}] gives both 'top' and 'volume'; give one")
        top = volume = None
        if "top" in la:
            top = _level_value(la, "top", where, unit, scale)
        if "volume" in la:
            volume = _number(la, "volume", where)
            if volume < 0:
                raise SectionFileError(f"{where}volume must be >= 0, not {volume:g}")
        out.append(LiquidLayer(liquid, top=top, volume=volume))
    return tuple(out)


def _read_pockets(value: object) -> str:
    if value not in POCKET_MODES:
        raise SectionFileError(f"pockets must be \"vented\" or \"trapped\", not {shown(value)}")
    return str(value)


def _read_groundwater(obj: object, unit: str, scale: float) -> Groundwater | None:
    """A case's ``groundwater``: null (dry ground) or a level and a density."""
    if obj is None:
        return None
    gw = _object(obj, _GROUNDWATER_KEYS, "groundwater.")
    _required(gw, "level", " in groundwater")
    level = _level_value(gw, "level", "groundwater.", unit, scale)
    values = {}
    if "density" in gw:
        values["density"] = _number(gw, "density", "groundwater.", ranged=True)
    try:
        return Groundwater(level, **values)
    except ValueError as exc:
        raise _refusal(exc, unit) from None


class _Exact(float):
    """A float read from file text that remembers the text, so a length in
    another unit converts to metres from the exact decimal written."""

    text: str

    def __new__(cls, text: str) -> _Exact:
        self = super().__new__(cls, text)
        self.text = text
        return self


def _to_metres(value: float, scale: float) -> float:
    """``value`` in a unit of ``scale`` metres, converted to metres with one
    correctly rounded decimal product (a binary multiply can miss by an ulp:
    2300 * 0.001 = 2.3000000000000003)."""
    if scale == 1.0:
        return float(value)
    exact = Decimal(getattr(value, "text", None) or repr(float(value)))
    return float(exact * Decimal(repr(scale)))


def _decimal_text(d: Decimal) -> str:
    """Plain JSON text of a Decimal: no trailing zeros, no exponent for
    ordinary magnitudes."""
    d = d.normalize()
    if d == d.to_integral_value() and abs(d) < 2 ** 53:
        return str(int(d))
    if -7 <= d.adjusted() < 16:
        return f"{d:f}"
    return f"{d:e}"


def _length_text(v: float, scale: float = 1.0) -> str:
    """The number to write for the SI length ``v`` [m] in a unit of ``scale``
    metres: the shortest decimal (15 significant digits where they suffice,
    at most 25) that :func:`_to_metres` reads back as exactly ``v``."""
    if scale == 1.0:
        return _decimal_text(Decimal(repr(v)))
    with localcontext() as ctx:
        ctx.prec = 40
        y = Decimal(repr(v)) / Decimal(repr(scale))
        for digits in range(15, 26):
            text = _decimal_text(Decimal(format(y, f".{digits - 1}e")))
            if _to_metres(_Exact(text), scale) == v:
                return text
    return _decimal_text(y)  # pragma: no cover - 25 digits always suffice


def case_to_dict(case: Case) -> dict[str, Any]:
    """The section-file object of ``case``: version 1 unless the case holds
    uplift or report data, which need version 2."""
    scale = length_factor(case.length_unit)
    s = case.section
    geometry: dict[str, Any] = {"kind": s.kind}
    if s.kind == "plane":
        geometry["width"] = float(_length_text(s.width, scale))
    data: dict[str, Any] = {
        "format": FORMAT,
        "version": 2 if case.uses_version_2 else 1,
        "name": s.name,
        "length_unit": case.length_unit,
        "geometry": geometry,
        "outline": [[float(_length_text(x, scale)), float(_length_text(z, scale))]
                    for x, z in s.outline.tolist()],
        "parts": list(s.parts),
        "fluid": liquid_to_spec(case.liquid),
        "gravity": case.gravity,
    }
    if case.fill_level is not None:
        data["fill"] = {"level": float(_length_text(case.fill_level, scale))}
    else:
        data["fill"] = {"volume": case.fill_volume}
    if case.uses_version_2:
        uplift: dict[str, Any] = {"required_factor": case.required_uplift_factor}
        if case.resistances:
            uplift["parts"] = {name: {"self_weight": r.self_weight,
                                      "holding_down": r.holding_down}
                               for name, r in case.resistances}
        data["uplift"] = uplift
        if not case.report.is_empty:
            data["report"] = case.report.to_dict()
    return data


def dumps_case(case: Case) -> str:
    """The section file text of ``case``: JSON, one vertex per line, lengths
    written so that reading gives back exactly the same case."""
    data = case_to_dict(case)
    scale = length_factor(case.length_unit)
    s = case.section
    outline = [f"[{_length_text(x, scale)}, {_length_text(z, scale)}]"
               for x, z in s.outline.tolist()]
    data.pop("outline")
    if "width" in data["geometry"]:
        data["geometry"] = {"kind": s.kind, "width": _Raw(_length_text(s.width, scale))}
    parts = data.pop("parts")
    fill = data.pop("fill")
    if case.fill_level is not None:
        fill = {"level": _Raw(_length_text(case.fill_level, scale))}
    tail = {k: data.pop(k) for k in ("uplift", "report") if k in data}
    lines = ["{"]
    body = [f"  {json.dumps(k)}: {_dumps(v)}" for k, v in data.items()]
    body.append('  "outline": [\n' + ",\n".join(f"    {p}" for p in outline) + "\n  ]")
    body.append(f'  "parts": {json.dumps(parts)}')
    body.append(f'  "fill": {_dumps(fill)}')
    body += [f"  {json.dumps(k)}: {json.dumps(v)}" for k, v in tail.items()]
    lines.append(",\n".join(body))
    lines.append("}")
    return "\n".join(lines) + "\n"


def design_version(design: Design) -> int:
    """The lowest section file version that holds ``design``: 3 with a
    structure, ground or cases; else 2 if the file-level case needs it
    (uplift resistances, a required factor, report fields); else 1."""
    if design.structure is not None or design.ground is not None or design.cases:
        return 3
    return 2 if design.case.uses_version_2 else 1


def design_to_dict(design: Design) -> dict[str, Any]:
    """The section-file object of ``design``, at :func:`design_version`.

    Lengths (coordinates and levels) are in the file-level case's length
    unit, as the shortest decimals that read back to exactly the same
    metres; other numbers are SI, written as Python's shortest repr.
    """
    data = case_to_dict(design.case)
    version = design_version(design)
    data["version"] = version
    if version < 3:
        return data
    scale = length_factor(design.case.length_unit)
    data.update(_v3_groups(design, scale, _length))
    return data


def _v3_groups(design: Design, scale: float, length: Any) -> dict[str, Any]:
    """``structure``, ``ground`` and ``cases`` of a design, lengths written by
    ``length(v, scale)``."""
    out: dict[str, Any] = {}
    if design.structure is not None:
        out["structure"] = _structure_to_dict(design.structure, scale, length)
    if design.ground is not None:
        out["ground"] = _ground_to_dict(design.ground, scale, length)
    if design.cases:
        out["cases"] = [_case_to_dict(c, scale, length) for c in design.cases]
    return out


def _length(v: float, scale: float) -> float:
    """A length [m] as the number the file holds in its unit (a float)."""
    return float(_length_text(v, scale))


def _length_raw(v: float, scale: float) -> _Raw:
    """A length [m] as the exact text the file holds in its unit."""
    return _Raw(_length_text(v, scale))


def _structure_to_dict(s: Structure, scale: float, length: Any) -> dict[str, Any]:
    out: dict[str, Any] = {
        "outline": [[length(x, scale), length(z, scale)] for x, z in s.outline.tolist()],
        "parts": list(s.parts),
        "unit_weight": s.unit_weight,
    }
    if s.extra_weight:
        out["extra_weight"] = s.extra_weight
    if s.anchorage:
        out["anchorage"] = s.anchorage
    return out


def _ground_to_dict(g: Ground, scale: float, length: Any) -> dict[str, Any]:
    return {"level": length(g.level, scale), "unit_weight_dry": g.unit_weight_dry,
            "unit_weight_saturated": g.unit_weight_saturated}


def _case_to_dict(c: LoadCase, scale: float, length: Any) -> dict[str, Any]:
    """One load case: its name and what it changes (defaults left out)."""
    out: dict[str, Any] = {"name": c.name}
    if c.liquid is not None:
        out["fluid"] = liquid_to_spec(c.liquid)
    if c.layers is not None:
        layers = []
        for layer in c.layers:
            item: dict[str, Any] = {"fluid": liquid_to_spec(layer.liquid)}
            if layer.top is not None:
                item["top"] = length(layer.top, scale)
            if layer.volume is not None:
                item["volume"] = layer.volume
            layers.append(item)
        out["layers"] = layers
    if isinstance(c.fill_level, str):
        out["fill"] = {"level": c.fill_level}
    elif c.fill_level is not None:
        out["fill"] = {"level": length(c.fill_level, scale)}
    elif c.fill_volume is not None:
        out["fill"] = {"volume": c.fill_volume}
    if c.gravity is not None:
        out["gravity"] = c.gravity
    if c.gas_pressure != 0.0:
        out["gas_pressure"] = c.gas_pressure
    if c.pockets != VENTED:
        out["pockets"] = c.pockets
    if c.atmospheric_pressure != STANDARD_ATMOSPHERE:
        out["atmospheric_pressure"] = c.atmospheric_pressure
    if c.groundwater is not None:
        gw: dict[str, Any] = {"level": length(c.groundwater.level, scale)}
        if c.groundwater.density != DEFAULT_GROUNDWATER_DENSITY:
            gw["density"] = c.groundwater.density
        out["groundwater"] = gw
    if c.load_factor != 1.0:
        out["load_factor"] = c.load_factor
    return out


def dumps_design(design: Design) -> str:
    """The section file text of ``design`` at :func:`design_version`: the
    file-level keys as :func:`dumps_case` writes them, then ``structure``
    (one outer vertex per line), ``ground`` and ``cases`` (one case per
    line). Reading it gives back exactly the same design."""
    text = dumps_case(design.case)
    version = design_version(design)
    if version < 3:
        return text
    text = text.replace(f'"version": {2 if design.case.uses_version_2 else 1},',
                        f'"version": {version},', 1)
    scale = length_factor(design.case.length_unit)
    data = _v3_groups(design, scale, _length_raw)
    tail = []
    if "structure" in data:
        st = dict(data["structure"])
        rows = [f"[{x}, {z}]" for x, z in st.pop("outline")]
        parts = st.pop("parts")
        rest = "".join(f",\n    {json.dumps(k)}: {_dumps(v)}" for k, v in st.items())
        tail.append('  "structure": {\n    "outline": [\n'
                    + ",\n".join(f"      {r}" for r in rows) + "\n    ],\n"
                    f'    "parts": {json.dumps(parts)}' + rest + "\n  }")
    if "ground" in data:
        tail.append(f'  "ground": {_dumps(data["ground"])}')
    if "cases" in data:
        tail.append('  "cases": [\n' + ",\n".join(f"    {_dumps(c)}"
                                                  for c in data["cases"]) + "\n  ]")
    body = text.rstrip()
    assert body.endswith("}")
    return body[:-1].rstrip() + ",\n" + ",\n".join(tail) + "\n}\n"


def write_design(design: Design, path: str | os.PathLike[str]) -> None:
    """Write ``design`` to ``path`` atomically (see :func:`write_section_file`),
    at the lowest version that holds it.

    Raises
    ------
    core.atomic_write.WriteError
        An OSError naming the file and the reason.
    """
    write_atomically(path, dumps_design(design))


class _Raw(str):
    """Number text to write as it is."""


def _dumps(obj: object) -> str:
    """json.dumps for small objects whose numbers may be :class:`_Raw` text."""
    if isinstance(obj, _Raw):
        return str(obj)
    if isinstance(obj, dict):
        return "{" + ", ".join(f"{json.dumps(k)}: {_dumps(v)}" for k, v in obj.items()) + "}"
    if isinstance(obj, list):
        return "[" + ", ".join(_dumps(v) for v in obj) + "]"
    return json.dumps(obj)


class _NotAJSONNumber(Exception):
    """NaN, Infinity or -Infinity met while parsing (Python's json reads them)."""


def _refuse_constant(token: str) -> float:
    raise _NotAJSONNumber(token)


_LONGEST_INT = 300
"""Integers of more digits are read as floats (infinite beyond 1e308), which
the range checks refuse; int() of a very long text is slow, and refused by
Python beyond 4300 digits."""


def _parse_int(text: str) -> int | float:
    if len(text) > _LONGEST_INT:
        return _Exact(text)
    return int(text)


_CONSTANT_OUTSIDE_STRINGS = re.compile(r'"(?:[^"\\]+|\\.)*"|(-?Infinity|NaN)')


def _where_constant(text: str, token: str) -> tuple[int, int]:
    """Line and column (from 1) of the first ``token`` outside a string."""
    for match in _CONSTANT_OUTSIDE_STRINGS.finditer(text):
        if match.group(1) == token:
            pos = match.start(1)
            return text.count("\n", 0, pos) + 1, pos - text.rfind("\n", 0, pos)
    return 1, 1  # pragma: no cover - the parser met it, so it is there


def _parse(text: str, source: str) -> object:
    """The JSON value of ``text``; strict about what JSON allows."""
    try:
        return json.loads(text, parse_float=_Exact, parse_int=_parse_int,
                          parse_constant=_refuse_constant)
    except json.JSONDecodeError as exc:
        raise SectionFileError(
            f"{source} is not valid JSON (line {exc.lineno}, column {exc.colno}: {exc.msg})"
        ) from None
    except _NotAJSONNumber as exc:
        token = str(exc)
        line, column = _where_constant(text, token)
        raise SectionFileError(f"{source} is not valid JSON (line {line}, column {column}: "
                               f"{token} is not a number JSON allows)") from None
    except RecursionError:
        raise SectionFileError(
            f"{source} nests lists or objects too deeply to be a section file") from None


def loads_case(text: str, source: str = "section file") -> Case:
    """Parse section file text into a :class:`~wetline.core.case.Case`.

    Raises
    ------
    SectionFileError
        For text that is not strict JSON (NaN and Infinity included), that
        nests too deeply, or any fault :func:`case_from_dict` finds.
    """
    if len(text) > limits.MAX_FILE_BYTES:
        raise SectionFileError(f"{source} {_TOO_LARGE}")
    _refuse_too_many_vertices(text)
    return case_from_dict(_parse(text, source))


def loads_design(text: str, source: str = "section file") -> Design:
    """Parse section file text of any version into a
    :class:`~wetline.core.load_cases.Design` (see :func:`loads_case`).

    Raises
    ------
    SectionFileError
    """
    if len(text) > limits.MAX_FILE_BYTES:
        raise SectionFileError(f"{source} {_TOO_LARGE}")
    _refuse_too_many_vertices(text)
    return design_from_dict(_parse(text, source))


_BRACKETS_BESIDE_VERTICES = 1000
"""More ``[`` than vertices a file may hold: the outline's own, ``parts``,
and any in its names (a vertex needs one each)."""


def _refuse_too_many_vertices(text: str) -> None:
    """Refuse an outline of more than MAX_VERTICES vertices (or a file that
    is no section file) before the careful parse, which costs a Python call
    per number.

    Counting ``[`` (each vertex needs one) clears every ordinary file at
    once; a file with more is parsed by the C parser alone, its header
    checked and its vertices counted exactly.
    """
    if text.count("[") <= limits.MAX_VERTICES + _BRACKETS_BESIDE_VERTICES:
        return
    try:
        data = json.loads(text, parse_constant=_refuse_constant)
    except (ValueError, RecursionError, _NotAJSONNumber):
        return  # the careful parse says what is wrong
    outline = _read_header(data).get("outline")
    if isinstance(outline, list) and len(outline) > limits.MAX_VERTICES:
        raise SectionFileError(too_many_vertices(len(outline)))


_TOO_LARGE = (f"is larger than {limits.MAX_FILE_BYTES // 2 ** 20} MB, the most Wetline reads "
              "from a section file")


class _TooLarge(Exception):
    """More than MAX_FILE_BYTES to read."""


def _read_capped(path: Path) -> bytes:
    """The bytes of ``path``, refused past :data:`~wetline.core.limits.MAX_FILE_BYTES`:
    by its size if it is a regular file, else after reading one byte more
    than the limit (a pipe, or /dev/zero, which says it holds 0 bytes)."""
    limit = limits.MAX_FILE_BYTES
    with open(path, "rb") as fh:
        status = os.fstat(fh.fileno())
        if stat.S_ISREG(status.st_mode) and status.st_size > limit:
            raise _TooLarge
        data = fh.read(limit + 1)
    if len(data) > limit:
        raise _TooLarge
    return data


def read_section_file(path: str | os.PathLike[str]) -> Case:
    """Read a section file: its file-level case (a version 3 file's
    structure, ground and cases are checked and left out; see
    :func:`read_design`).

    Parameters
    ----------
    path : str or os.PathLike

    Returns
    -------
    Case

    Raises
    ------
    SectionFileError
        With a message that starts with the file name and says what is wrong.
    """
    return _read_path(path, loads_case)


def read_design(path: str | os.PathLike[str]) -> Design:
    """Read a section file of any version into a
    :class:`~wetline.core.load_cases.Design`: the file-level case, the
    structure, the ground and the load cases (one, named after the file's
    ``name``, without ``cases``).

    Raises
    ------
    SectionFileError
        With a message that starts with the file name and says what is wrong.
    """
    return _read_path(path, loads_design)


def _read_path(path: str | os.PathLike[str], parse: Callable[..., _T]) -> _T:
    path = Path(path)
    try:
        raw = _read_capped(path)
    except _TooLarge:
        raise SectionFileError(f"{path}: {_TOO_LARGE}") from None
    except FileNotFoundError:
        raise SectionFileError(f"{path}: no such file") from None
    except IsADirectoryError:
        raise SectionFileError(f"{path}: is a folder, not a section file") from None
    except OSError as exc:
        raise SectionFileError(f"{path}: cannot be read ({exc.strerror})") from None
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        raise SectionFileError(f"{path}: is not a text (UTF-8) file") from None
    try:
        return parse(text, source="the file")
    except SectionFileError as exc:
        raise SectionFileError(f"{path.name}: {exc}", edges=exc.edges,
                               vertices=exc.vertices, location=exc.location) from None


def write_section_file(case: Case, path: str | os.PathLike[str]) -> None:
    """Write ``case`` to ``path`` atomically (a temporary file in the same
    folder, then a rename), so a failed save never leaves a half file.

    Raises
    ------
    core.atomic_write.WriteError
        An OSError naming the file and the reason.
    """
    write_atomically(path, dumps_case(case))
