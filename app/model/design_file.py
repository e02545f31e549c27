"""The document's one seam to section files: a whole :class:`~wetline.core.load_cases.Design`
read from and written to ``*.section.json``.

The window (open, save) and the recovery copies (:mod:`wetline.app.model.recovery`)
read and write designs only through :func:`read`, :func:`write`, :func:`loads`
and :func:`dumps`, so switching the file functions underneath changes one
module.

Today core's section file module reads and writes format versions 1 and 2
(one case, no structure). Until core reads and writes version 3 itself
(``section-format-v3.md``), this module bridges the part of version 3 the
document model holds: ``structure``, ``ground`` and ``cases`` with their
``name``, ``fluid``, ``fill`` (a level, ``"spill"``, ``"empty"`` or a volume),
``gravity``, ``groundwater`` and ``load_factor``. Everything else of the file
is core's: the file-level keys go through
:func:`wetline.core.section_file.case_from_dict` and
:func:`~wetline.core.section_file.dumps_case` unchanged, and a file without
version 3 keys is read and written by core alone (so it is written at the
lowest version that holds its data, version 1 or 2). The case keys for
layers, gas pressure and trapped pockets are refused here with a clear
message, since :class:`~wetline.core.load_cases.LoadCase` does not hold them
yet. (For the lead: this bridge moves into ``core/section_file.py`` as its
version 3 functions, and :func:`read` / :func:`write` then call those.)
"""

from __future__ import annotations

import json
import math
import os
from pathlib import Path
from typing import Any

import numpy as np

from wetline.core import limits
from wetline.core.atomic_write import write_atomically
from wetline.core.case import Case
from wetline.core.liquids import LiquidError, liquid_from_spec, liquid_to_spec
from wetline.core.load_cases import Design, LoadCase, LoadCaseError
from wetline.core.section_file import (
    FORMAT,
    SectionFileError,
    _length_text,
    _parse,
    case_from_dict,
    dumps_case,
    read_section_file,
)
from wetline.core.structure import (
    DEFAULT_GROUNDWATER_DENSITY,
    DEFAULT_SOIL_DRY,
    DEFAULT_SOIL_SATURATED,
    DEFAULT_UNIT_WEIGHT,
    OUTER_WALL,
    Ground,
    Groundwater,
    Structure,
    StructureError,
)
from wetline.core.units import UnitError, length_factor, to_si_exactly

__all__ = ["VERSION", "read", "write", "loads", "dumps", "design_to_dict", "uses_version_3"]

VERSION = 3
"""The newest section file version read and written here."""

_V3_KEYS = ("structure", "ground", "cases")
_STRUCTURE_KEYS = {"outline", "parts", "unit_weight", "extra_weight", "anchorage"}
_GROUND_KEYS = {"level", "unit_weight_dry", "unit_weight_saturated"}
_CASE_KEYS = {"name", "fluid", "fill", "gravity", "groundwater", "load_factor"}
_CASE_KEYS_NOT_YET = ("layers", "gas_pressure", "pockets", "atmospheric_pressure")
_GROUNDWATER_KEYS = {"level", "density"}


# ------------------------------------------------------------------ reading
def read(path: str | os.PathLike[str]) -> Design:
    """The design in the section file at ``path`` (versions 1 to 3).

    Raises
    ------
    wetline.core.section_file.SectionFileError
        With a message that starts with the file name and says what is wrong.
    """
    path = Path(path)
    try:
        size = path.stat().st_size
        text = None
        if path.is_file() and size <= limits.MAX_FILE_BYTES:
            text = path.read_bytes().decode("utf-8-sig")
    except (OSError, UnicodeDecodeError):
        text = None
    if text is None or not _is_version_3(text):
        return Design(read_section_file(path))  # core's reader, core's messages
    try:
        return loads(text, source="the file")
    except SectionFileError as exc:
        raise SectionFileError(f"{path.name}: {exc}", edges=exc.edges, vertices=exc.vertices,
                               location=exc.location) from None


def _is_version_3(text: str) -> bool:
    """True if ``text`` is JSON of a section file of version 3 or later,
    or one of an earlier version with version 3 keys (refused by :func:`loads`)."""
    try:
        data = json.loads(text)
    except (ValueError, RecursionError):
        return False
    if not isinstance(data, dict) or data.get("format") != FORMAT:
        return False
    version = data.get("version")
    if isinstance(version, bool) or not isinstance(version, int):
        return False
    return version >= VERSION or any(k in data for k in _V3_KEYS)


def loads(text: str, source: str = "section file") -> Design:
    """The design of section file text (versions 1 to 3).

    Raises
    ------
    wetline.core.section_file.SectionFileError
        Naming the key, the case or the geometric fault.
    """
    if len(text) > limits.MAX_FILE_BYTES:
        raise SectionFileError(f"{source} is larger than the most Wetline reads")
    data = _parse(text, source)
    if not isinstance(data, dict):
        raise SectionFileError("the file must be a JSON object")
    version = data.get("version")
    present = [k for k in _V3_KEYS if k in data]
    if isinstance(version, int) and not isinstance(version, bool):
        if version > VERSION:
            raise SectionFileError(
                f"section file version {version} is newer than this program reads "
                f"(up to {VERSION}); use a newer Wetline")
        if version < VERSION and present:
            raise SectionFileError(f"key {present[0]!r} needs section file version 3 "
                                   f"(this file says version {version})")
    if version != VERSION:
        return Design(case_from_dict(data))
    base = {k: v for k, v in data.items() if k not in _V3_KEYS}
    base["version"] = 2
    case = case_from_dict(base)
    unit = case.length_unit
    try:
        scale = length_factor(unit)
    except UnitError as exc:  # pragma: no cover - case_from_dict has read it
        raise SectionFileError(f"length_unit: {exc}") from None
    structure = None
    if data.get("structure") is not None:
        structure = _read_structure(data["structure"], case, scale)
    ground = None
    if data.get("ground") is not None:
        ground = _read_ground(data["ground"], scale)
    cases: tuple[LoadCase, ...] = ()
    if "cases" in data:
        raw = data["cases"]
        if not isinstance(raw, list) or not raw:
            raise SectionFileError("cases must be a list of one or more case objects")
        cases = tuple(_read_case(c, i, scale) for i, c in enumerate(raw))
    try:
        return Design(case, structure=structure, ground=ground, cases=cases)
    except (LoadCaseError, StructureError) as exc:
        raise SectionFileError(str(exc)) from None


def _object(obj: object, allowed: set[str], where: str) -> dict[str, Any]:
    if not isinstance(obj, dict):
        raise SectionFileError(f"{where} must be a JSON object")
    for key in obj:
        if key not in allowed:
            raise SectionFileError(f"unknown key {key!r} in {where}")
    return obj


def _num(obj: dict[str, Any], key: str, where: str) -> float:
    v = obj[key]
    if isinstance(v, bool) or not isinstance(v, (int, float)):
        raise SectionFileError(f"{where}.{key} must be a number, not {json.dumps(v)}")
    value = float(v)
    if not math.isfinite(value):
        raise SectionFileError(f"{where}.{key} must be a finite number")
    return value


def _length(obj: dict[str, Any], key: str, where: str, scale: float) -> float:
    value = _num(obj, key, where)
    limit = limits.COORDINATE_LIMIT
    metres = float(to_si_exactly(value, scale))
    if not -limit <= metres <= limit:
        raise SectionFileError(f"{where}.{key} lies beyond {limit:g} m")
    return metres


def _read_structure(obj: object, case: Case, scale: float) -> Structure:
    s = _object(obj, _STRUCTURE_KEYS, "structure")
    if "outline" not in s:
        raise SectionFileError("missing key 'outline' in structure")
    outline = s["outline"]
    if not isinstance(outline, list):
        raise SectionFileError("structure.outline must be a list of [x, z] pairs")
    if len(outline) > limits.MAX_VERTICES:
        raise SectionFileError(f"structure.outline has {len(outline)} vertices, more than "
                               f"the {limits.MAX_VERTICES} allowed")
    for i, pt in enumerate(outline):
        if (not isinstance(pt, list) or len(pt) != 2
                or not all(isinstance(c, (int, float)) and not isinstance(c, bool)
                           for c in pt)):
            raise SectionFileError(f"structure.outline vertex {i} must be an [x, z] pair of "
                                   "numbers")
    pts = np.array(outline, dtype=np.float64).reshape(-1, 2)
    if not np.isfinite(pts).all():
        raise SectionFileError("structure.outline coordinates must be finite numbers")
    pts = np.asarray(to_si_exactly(pts.ravel(), scale), dtype=np.float64).reshape(-1, 2)
    parts = s.get("parts")
    if parts is not None and (not isinstance(parts, list)
                              or not all(isinstance(p, str) for p in parts)):
        raise SectionFileError("structure.parts must be a list of names, one per edge")
    values = {}
    for key, default in (("unit_weight", DEFAULT_UNIT_WEIGHT), ("extra_weight", 0.0),
                         ("anchorage", 0.0)):
        values[key] = _num(s, key, "structure") if key in s else default
    try:
        return Structure.build(pts, parts, cavity=case.section, **values)
    except StructureError as exc:
        raise SectionFileError(str(exc), edges=exc.edges, vertices=exc.vertices,
                               location=exc.location) from None


def _read_ground(obj: object, scale: float) -> Ground:
    g = _object(obj, _GROUND_KEYS, "ground")
    if "level" not in g:
        raise SectionFileError("missing key 'level' in ground")
    level = _length(g, "level", "ground", scale)
    dry = _num(g, "unit_weight_dry", "ground") if "unit_weight_dry" in g else DEFAULT_SOIL_DRY
    sat = (_num(g, "unit_weight_saturated", "ground") if "unit_weight_saturated" in g
           else DEFAULT_SOIL_SATURATED)
    try:
        return Ground(level, dry, sat)
    except ValueError as exc:
        raise SectionFileError(str(exc)) from None


def _read_case(obj: object, index: int, scale: float) -> LoadCase:
    where = f"cases[{index}]"
    if isinstance(obj, dict):
        for key in _CASE_KEYS_NOT_YET:
            if key in obj:
                raise SectionFileError(
                    f"{where}: {key!r} (layers, gas pressure, trapped pockets) is not read by "
                    "this version of the desktop program yet")
    c = _object(obj, _CASE_KEYS, where)
    name = c.get("name")
    if not isinstance(name, str) or not name.strip():
        raise SectionFileError(f"{where} needs a name (non-empty text)")
    where = f"case {name!r}"
    args: dict[str, Any] = {"name": name}
    try:
        if "fluid" in c:
            args["liquid"] = liquid_from_spec(c["fluid"])
        if "fill" in c:
            fill = _object(c["fill"], {"level", "volume"}, f"{where} fill")
            if len(fill) != 1:
                raise SectionFileError(
                    f"{where}: fill must give exactly one of \"level\" and \"volume\"")
            if "level" in fill:
                lvl = fill["level"]
                # a word LoadCase checks ('spill' or 'empty'), else a length
                args["fill_level"] = lvl if isinstance(lvl, str) \
                    else _length(fill, "level", f"{where} fill", scale)
            else:
                args["fill_volume"] = _num(fill, "volume", f"{where} fill")
        if "gravity" in c:
            args["gravity"] = _num(c, "gravity", where)
        gw = c.get("groundwater")
        if gw is not None:
            g = _object(gw, _GROUNDWATER_KEYS, f"{where} groundwater")
            if "level" not in g:
                raise SectionFileError(f"missing key 'level' in {where} groundwater")
            density = (_num(g, "density", f"{where} groundwater") if "density" in g
                       else DEFAULT_GROUNDWATER_DENSITY)
            args["groundwater"] = Groundwater(_length(g, "level", f"{where} groundwater",
                                                      scale), density)
        if "load_factor" in c:
            args["load_factor"] = _num(c, "load_factor", where)
        return LoadCase(**args)
    except LiquidError as exc:
        raise SectionFileError(f"{where}: {exc}") from None
    except SectionFileError:
        raise
    except ValueError as exc:  # LoadCaseError, and Groundwater's range checks
        text = str(exc)
        raise SectionFileError(text if text.startswith("case ") else f"{where}: {text}") \
            from None


# ------------------------------------------------------------------ writing
def uses_version_3(design: Design) -> bool:
    """True if ``design`` holds anything only version 3 can write."""
    return design.structure is not None or design.ground is not None or bool(design.cases)


def _len_out(v: float, scale: float) -> float:
    return float(_length_text(float(v), scale))


def design_to_dict(design: Design) -> dict[str, Any]:
    """The version 3 keys of ``design`` (``structure``, ``ground``, ``cases``,
    those it has) as JSON values, lengths in the file's length unit."""
    case = design.case
    scale = length_factor(case.length_unit)
    out: dict[str, Any] = {}
    s = design.structure
    if s is not None:
        st: dict[str, Any] = {
            "outline": [[_len_out(x, scale), _len_out(z, scale)] for x, z in s.outline.tolist()],
            "parts": list(s.parts),
        }
        if all(p == OUTER_WALL for p in s.parts):
            st.pop("parts")
        st["unit_weight"] = s.unit_weight
        if s.extra_weight:
            st["extra_weight"] = s.extra_weight
        if s.anchorage:
            st["anchorage"] = s.anchorage
        out["structure"] = st
    g = design.ground
    if g is not None:
        out["ground"] = {"level": _len_out(g.level, scale), "unit_weight_dry": g.unit_weight_dry,
                         "unit_weight_saturated": g.unit_weight_saturated}
    if design.cases:
        out["cases"] = [_case_to_dict(c, scale) for c in design.cases]
    return out


def _case_to_dict(c: LoadCase, scale: float) -> dict[str, Any]:
    d: dict[str, Any] = {"name": c.name}
    if c.liquid is not None:
        d["fluid"] = liquid_to_spec(c.liquid)
    if isinstance(c.fill_level, str):
        d["fill"] = {"level": c.fill_level}
    elif c.fill_level is not None:
        d["fill"] = {"level": _len_out(c.fill_level, scale)}
    elif c.fill_volume is not None:
        d["fill"] = {"volume": c.fill_volume}
    if c.gravity is not None:
        d["gravity"] = c.gravity
    if c.groundwater is not None:
        d["groundwater"] = {"level": _len_out(c.groundwater.level, scale),
                            "density": c.groundwater.density}
    if c.load_factor != 1.0:
        d["load_factor"] = c.load_factor
    return d


def dumps(design: Design) -> str:
    """The section file text of ``design``: core's (version 1 or 2) when it
    has no structure, ground or cases, else version 3 (core's text of the
    file-level case with the version 3 keys after it)."""
    text = dumps_case(design.case)
    if not uses_version_3(design):
        return text
    head, sep, rest = text.partition('"version": ')
    digits = len(rest) - len(rest.lstrip("0123456789"))
    text = head + sep + str(VERSION) + rest[digits:]
    body = text.rstrip()
    assert body.endswith("}")
    body = body[:-1].rstrip()
    extra = design_to_dict(design)
    lines = []
    for key, value in extra.items():
        if key == "cases":
            items = ",\n".join(f"    {json.dumps(c)}" for c in value)
            lines.append(f'  "cases": [\n{items}\n  ]')
        elif key == "structure":
            pts = ",\n".join(f"      {json.dumps(p)}" for p in value["outline"])
            rest_keys = {k: v for k, v in value.items() if k != "outline"}
            inner = [f'    "outline": [\n{pts}\n    ]'] + [
                f"    {json.dumps(k)}: {json.dumps(v)}" for k, v in rest_keys.items()]
            lines.append('  "structure": {\n' + ",\n".join(inner) + "\n  }")
        else:
            lines.append(f"  {json.dumps(key)}: {json.dumps(value)}")
    return body + ",\n" + ",\n".join(lines) + "\n}\n"


def write(design: Design, path: str | os.PathLike[str]) -> None:
    """Write ``design`` to ``path`` atomically (see :func:`dumps`).

    Raises
    ------
    wetline.core.atomic_write.WriteError
        An OSError naming the file and the reason.
    """
    write_atomically(path, dumps(design))
