"""Read and write section files (``*.section.json``, format versions 1 and 2).

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
from collections.abc import Collection, Iterable
from decimal import Decimal, localcontext
from pathlib import Path
from typing import Any

import numpy as np

from . import STANDARD_GRAVITY, limits
from .atomic_write import write_atomically
from .case import Case, CaseError, ReportInfo
from .fill import FillError
from .liquids import Liquid, LiquidError, liquid_from_spec, liquid_to_spec
from .number_input import number_text, range_text, shown
from .section import FloatArray, Section, SectionError, too_many_vertices
from .units import UnitError, length_factor
from .uplift import DEFAULT_REQUIRED_FACTOR, PartResistance

__all__ = [
    "FORMAT",
    "VERSION",
    "SectionFileError",
    "case_from_dict",
    "case_to_dict",
    "read_section_file",
    "write_section_file",
    "loads_case",
    "dumps_case",
]

FORMAT = "wetline-section"
VERSION = 2
"""The newest version this program reads and writes."""

_TOP_KEYS = {"format", "version", "name", "length_unit", "geometry", "outline",
             "parts", "fluid", "gravity", "fill"}
_GEOMETRY_KEYS = {"kind", "width"}
_FILL_KEYS = {"level", "volume"}
_V2_KEYS = {"uplift", "report"}
_UPLIFT_KEYS = {"required_factor", "parts"}
_RESISTANCE_KEYS = ("self_weight", "holding_down")  # checked in this order
_REPORT_KEYS = {"project", "job_reference", "prepared_by"}


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
    """Build a :class:`~wetline.core.case.Case` from a parsed section file.

    The keys are read group by group, in this order: the header (format,
    version, known keys), name and length unit, geometry, outline and parts,
    fluid, gravity, fill, then the version 2 groups uplift and report. The
    first fault found is reported.

    Raises
    ------
    SectionFileError
        Naming the key or the geometric fault.
    """
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
        return Case(section=section, liquid=liquid, gravity=gravity, fill_level=level,
                    fill_volume=volume, length_unit=unit, resistances=resistances,
                    required_uplift_factor=factor, report=report)
    except (CaseError, FillError) as exc:
        raise SectionFileError(str(exc)) from None


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
    data = _object(obj, _TOP_KEYS | _V2_KEYS, "")
    if version < 2:
        for key in _V2_KEYS:
            if key in data:
                raise SectionFileError(
                    f"key {key!r} needs section file version 2 (this file says version 1)")
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
        width = _number(geometry, "width", "geometry.", ranged=True)
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
        raise SectionFileError(str(exc), edges=exc.edges, vertices=exc.vertices,
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
        level = _to_metres(_number(fill, "level", "fill.", ranged=True), scale)
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
    for key, v in report.items():
        if not isinstance(v, str):
            raise SectionFileError(f"report.{key} must be text")
    return ReportInfo(**report)


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
            r = case.report
            data["report"] = {"project": r.project, "job_reference": r.job_reference,
                              "prepared_by": r.prepared_by}
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


class _Raw(str):
    """Number text to write as it is."""


def _dumps(obj: object) -> str:
    """json.dumps for small objects whose numbers may be :class:`_Raw` text."""
    if isinstance(obj, _Raw):
        return str(obj)
    if isinstance(obj, dict):
        return "{" + ", ".join(f"{json.dumps(k)}: {_dumps(v)}" for k, v in obj.items()) + "}"
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
    """Read a section file.

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
        return loads_case(text, source="the file")
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
