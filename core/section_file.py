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
from decimal import Decimal, localcontext
from pathlib import Path

import numpy as np

from . import STANDARD_GRAVITY
from .atomic_write import write_atomically
from .case import Case, CaseError, ReportInfo
from .fill import FillError
from .liquids import LiquidError, liquid_from_spec, liquid_to_spec
from .section import Section, SectionError
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
_RESISTANCE_KEYS = {"self_weight", "holding_down"}
_REPORT_KEYS = {"project", "job_reference", "prepared_by"}


class SectionFileError(ValueError):
    """A section file that cannot be read, with a one-line reason.

    ``edges`` / ``vertices`` / ``location`` carry over from a
    :class:`~wetline.core.section.SectionError`, when that is the cause.
    """

    def __init__(self, message, *, edges=(), vertices=(), location=None):
        super().__init__(message)
        self.edges = tuple(edges)
        self.vertices = tuple(vertices)
        self.location = location


def _is_number(v):
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def _number(obj, key, where):
    v = obj[key]
    if not _is_number(v):
        raise SectionFileError(f"{where}{key} must be a number, not {json.dumps(v)}")
    if not math.isfinite(v):
        raise SectionFileError(f"{where}{key} must be a finite number")
    return float(v)


def _check_keys(obj, allowed, where):
    if not isinstance(obj, dict):
        label = where.rstrip(".") or "the file"
        raise SectionFileError(f"{label} must be a JSON object")
    for key in obj:
        if key not in allowed:
            inside = f" in {where.rstrip('.')}" if where else ""
            raise SectionFileError(f"unknown key {key!r}{inside}")


def case_from_dict(data):
    """Build a :class:`~wetline.core.case.Case` from a parsed section file.

    Raises
    ------
    SectionFileError
        Naming the key or the geometric fault.
    """
    _check_keys(data, _TOP_KEYS | _V2_KEYS, "")
    if data.get("format") != FORMAT:
        if "format" not in data:
            raise SectionFileError(f"missing key 'format' (a section file says \"{FORMAT}\")")
        raise SectionFileError(f"format must be \"{FORMAT}\", not {json.dumps(data['format'])}")
    if "version" not in data:
        raise SectionFileError("missing key 'version'")
    version = data["version"]
    if not isinstance(version, int) or isinstance(version, bool) or version < 1:
        raise SectionFileError(f"version must be a whole number >= 1, not {json.dumps(version)}")
    if version > VERSION:
        raise SectionFileError(
            f"section file version {version} is newer than this program reads "
            f"(up to {VERSION}); use a newer Wetline")

    if version < 2:
        for key in _V2_KEYS:
            if key in data:
                raise SectionFileError(
                    f"key {key!r} needs section file version 2 (this file says version 1)")

    name = data.get("name", "")
    if not isinstance(name, str):
        raise SectionFileError("name must be text")
    unit = data.get("length_unit", "m")
    if not isinstance(unit, str):
        raise SectionFileError("length_unit must be text such as \"m\" or \"mm\"")
    try:
        scale = length_factor(unit)
    except UnitError as exc:
        raise SectionFileError(f"length_unit: {exc}") from None

    if "geometry" not in data:
        raise SectionFileError("missing key 'geometry'")
    geometry = data["geometry"]
    _check_keys(geometry, _GEOMETRY_KEYS, "geometry.")
    if "kind" not in geometry:
        raise SectionFileError("missing key 'kind' in geometry")
    kind = geometry["kind"]
    if kind not in ("plane", "axisymmetric"):
        raise SectionFileError(
            f"geometry.kind must be \"plane\" or \"axisymmetric\", not {json.dumps(kind)}")
    width = 1.0
    if "width" in geometry:
        if kind == "axisymmetric":
            raise SectionFileError("geometry.width applies to plane sections only")
        width = _number(geometry, "width", "geometry.")
        if width <= 0:
            raise SectionFileError(f"geometry.width must be positive, not {width:g}")

    if "outline" not in data:
        raise SectionFileError("missing key 'outline'")
    outline = data["outline"]
    if not isinstance(outline, list):
        raise SectionFileError("outline must be a list of [x, z] pairs")
    for i, pt in enumerate(outline):
        if (not isinstance(pt, list) or len(pt) != 2
                or not all(_is_number(c) for c in pt)):
            raise SectionFileError(f"outline vertex {i} must be an [x, z] pair of numbers, "
                                   f"not {json.dumps(pt)}", vertices=(i,))
    parts = data.get("parts")
    if parts is not None:
        if not isinstance(parts, list) or not all(isinstance(p, str) for p in parts):
            raise SectionFileError("parts must be a list of names, one per edge")
    try:
        pts = np.array(outline, dtype=np.float64).reshape(-1, 2)
        if scale != 1.0 and np.isfinite(pts).all():
            # from the parsed numbers themselves: they remember their text
            pts = np.array([[_to_metres(x, scale), _to_metres(z, scale)] for x, z in outline],
                           dtype=np.float64).reshape(-1, 2)
        section = Section.build(pts, parts=parts, kind=kind, width=_to_metres(width, scale),
                                name=name)
    except SectionError as exc:
        raise SectionFileError(str(exc), edges=exc.edges, vertices=exc.vertices,
                               location=exc.location) from None

    if "fluid" not in data:
        raise SectionFileError("missing key 'fluid'")
    try:
        liquid = liquid_from_spec(data["fluid"])
    except LiquidError as exc:
        raise SectionFileError(str(exc)) from None

    gravity = STANDARD_GRAVITY
    if "gravity" in data:
        gravity = _number(data, "gravity", "")
        if gravity <= 0:
            raise SectionFileError(f"gravity must be positive, not {gravity:g}")

    if "fill" not in data:
        raise SectionFileError("missing key 'fill' (give \"level\" or \"volume\")")
    fill = data["fill"]
    _check_keys(fill, _FILL_KEYS, "fill.")
    if len(fill) != 1:
        raise SectionFileError("fill must give exactly one of \"level\" and \"volume\"")
    level = volume = None
    if "level" in fill:
        level = _to_metres(_number(fill, "level", "fill."), scale)
    else:
        volume = _number(fill, "volume", "fill.")
        if volume < 0:
            raise SectionFileError(f"fill.volume must be >= 0, not {volume:g}")
    resistances, factor = _read_uplift(data.get("uplift", {}), section)
    report = _read_report(data.get("report", {}))
    try:
        return Case(section=section, liquid=liquid, gravity=gravity, fill_level=level,
                    fill_volume=volume, length_unit=unit, resistances=resistances,
                    required_uplift_factor=factor, report=report)
    except (CaseError, FillError) as exc:
        raise SectionFileError(str(exc)) from None


def _read_uplift(uplift, section):
    """Resistances by part and the required factor from a version 2 file."""
    _check_keys(uplift, _UPLIFT_KEYS, "uplift.")
    factor = DEFAULT_REQUIRED_FACTOR
    if "required_factor" in uplift:
        factor = _number(uplift, "required_factor", "uplift.")
        if factor <= 0:
            raise SectionFileError(f"uplift.required_factor must be positive, not {factor:g}")
    parts = uplift.get("parts", {})
    if not isinstance(parts, dict):
        raise SectionFileError("uplift.parts must be an object of part names")
    resistances = []
    for name, res in parts.items():
        where = f"uplift.parts.{name}."
        if name not in section.loaded_part_names:
            raise SectionFileError(
                f"uplift.parts names {name!r}, which is not a loaded part of the outline "
                f"(parts: {', '.join(section.loaded_part_names)})")
        _check_keys(res, _RESISTANCE_KEYS, where)
        values = {}
        for key in _RESISTANCE_KEYS:
            if key in res:
                values[key] = _number(res, key, where)
                if values[key] < 0:
                    raise SectionFileError(f"{where}{key} must be >= 0, not {values[key]:g}")
        resistances.append((name, PartResistance(**values)))
    return tuple(resistances), factor


def _read_report(report):
    _check_keys(report, _REPORT_KEYS, "report.")
    for key, v in report.items():
        if not isinstance(v, str):
            raise SectionFileError(f"report.{key} must be text")
    return ReportInfo(**report)


class _Exact(float):
    """A float read from file text that remembers the text, so a length in
    another unit converts to metres from the exact decimal written."""

    def __new__(cls, text):
        self = super().__new__(cls, text)
        self.text = text
        return self


def _to_metres(value, scale):
    """``value`` in a unit of ``scale`` metres, converted to metres with one
    correctly rounded decimal product (a binary multiply can miss by an ulp:
    2300 * 0.001 = 2.3000000000000003)."""
    if scale == 1.0:
        return float(value)
    exact = Decimal(getattr(value, "text", None) or repr(float(value)))
    return float(exact * Decimal(repr(scale)))


def _decimal_text(d):
    """Plain JSON text of a Decimal: no trailing zeros, no exponent for
    ordinary magnitudes."""
    d = d.normalize()
    if d == d.to_integral_value() and abs(d) < 2 ** 53:
        return str(int(d))
    if -7 <= d.adjusted() < 16:
        return f"{d:f}"
    return f"{d:e}"


def _length_text(v, scale=1.0):
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


def case_to_dict(case):
    """The section-file object of ``case``: version 1 unless the case holds
    uplift or report data, which need version 2."""
    scale = length_factor(case.length_unit)
    s = case.section
    geometry = {"kind": s.kind}
    if s.kind == "plane":
        geometry["width"] = float(_length_text(s.width, scale))
    data = {
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
        uplift = {"required_factor": case.required_uplift_factor}
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


def dumps_case(case):
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
    if "level" in fill:
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


def _dumps(obj):
    """json.dumps for small objects whose numbers may be :class:`_Raw` text."""
    if isinstance(obj, _Raw):
        return str(obj)
    if isinstance(obj, dict):
        return "{" + ", ".join(f"{json.dumps(k)}: {_dumps(v)}" for k, v in obj.items()) + "}"
    return json.dumps(obj)


def loads_case(text, source="section file"):
    """Parse section file text into a :class:`~wetline.core.case.Case`."""
    try:
        data = json.loads(text, parse_float=_Exact)
    except json.JSONDecodeError as exc:
        raise SectionFileError(
            f"{source} is not valid JSON (line {exc.lineno}, column {exc.colno}: {exc.msg})"
        ) from None
    return case_from_dict(data)


def read_section_file(path):
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
        raw = path.read_bytes()
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


def write_section_file(case, path):
    """Write ``case`` to ``path`` atomically (a temporary file in the same
    folder, then a rename), so a failed save never leaves a half file.

    Raises
    ------
    core.atomic_write.WriteError
        An OSError naming the file and the reason.
    """
    write_atomically(path, dumps_case(case))
