"""Plain coordinate lists: pasted from a spreadsheet or read from a CSV file.

One vertex per line, ``x`` then ``z`` (z up), optionally a part name in a
third column: the part of the edge that starts at that vertex (edge *i* runs
from vertex *i* to *i + 1*, the last edge closes the outline).
:func:`parse_coordinates` turns such text into an outline in metres and
:func:`format_coordinates` writes one back as tab-separated text, which
spreadsheets paste into columns.

What the reader accepts
-----------------------
- **Separators**: tab, semicolon, comma, or spaces. One separator holds for
  the whole text, taken in that order of precedence: a tab anywhere means
  tab-separated, else a semicolon means semicolon-separated, else a comma
  means comma-separated, else runs of spaces separate. Values may be quoted
  as CSV files quote them (``"wall"``).
- **Decimal comma** (``1,25``) only when the separator is a semicolon or a
  tab, as spreadsheets in comma-decimal locales write them; with commas or
  spaces between values, decimals take a point. Thousands separators are not
  accepted.
- **A header row**: the first non-blank line is a header when neither of its
  first two fields is a number (``x;z;part``). A unit in brackets in the
  header (``x [mm]``) must agree with the unit the coordinates are read in,
  so a list written in millimetres is never read as metres.
- **Parts**: a third column names the part of each edge; lines that leave it
  empty get ``"wall"`` (the section file's default part). Without a third
  column the parts are None.
- **Blank lines** (or lines of empty fields) are skipped. A last vertex that
  repeats the first (a closing vertex) is dropped, with its part.
- **Limits** (:mod:`wetline.core.limits`): a number too large for a float,
  a coordinate beyond ``COORDINATE_LIMIT`` (in metres) are refused naming
  the line; more than ``MAX_VERTICES`` vertices, or a text longer than
  ``MAX_FILE_BYTES``, are refused before anything is converted.

Line numbers in messages count every line of the text from 1, blank ones
included, as a text editor does.
"""

from __future__ import annotations

import csv
import math
import re
from collections.abc import Sequence

import numpy as np
from numpy.typing import ArrayLike

from .limits import COORDINATE_LIMIT, MAX_FILE_BYTES, MAX_VERTICES
from .units import UnitError, length_factor, to_si_exactly

__all__ = ["CoordinateError", "parse_coordinates", "format_coordinates"]

DEFAULT_PART = "wall"

_NUMBER = re.compile(r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?")
_HEADER_UNIT = re.compile(r"[\[(]\s*([^\])]+?)\s*[\])]")


class CoordinateError(ValueError):
    """A coordinate list that cannot be read, with a one-line reason.

    Attributes
    ----------
    line : int or None
        The 1-based line of the text at fault, if one is.
    """

    def __init__(self, message: str, *, line: int | None = None) -> None:
        super().__init__(message)
        self.line = line


def _separator(lines: Sequence[str]) -> str | None:
    """The one separator of the text: tab, ';', ',' or None (spaces)."""
    text = "\n".join(lines)
    for sep in ("\t", ";", ","):
        if sep in text:
            return sep
    return None


def _fields(line: str, sep: str | None) -> list[str]:
    """The stripped fields of one line, trailing empty ones dropped."""
    if sep is None:
        fields = line.split(None, 2)
        if len(fields) == 3 and len(fields[2].split()) > 1 and all(
                _NUMBER.fullmatch(f) for f in fields[2].split()):
            fields = line.split()  # several numbers, not a part name with spaces
    else:
        fields = next(csv.reader([line], delimiter=sep, skipinitialspace=True))
    fields = [f.strip() for f in fields]
    while fields and not fields[-1]:
        fields.pop()
    return fields


def _number(field: str, decimal_comma: bool) -> float | None:
    """The float of a field, or None if it is not a plain decimal number."""
    text = field.replace("\u2212", "-")  # the minus sign some programs write
    if decimal_comma and text.count(",") == 1 and "." not in text:
        text = text.replace(",", ".")
    if not _NUMBER.fullmatch(text):
        return None
    return float(text)


def parse_coordinates(text: str, *,
                      unit: str = "m") -> tuple[np.ndarray, tuple[str, ...] | None]:
    """Vertices (and parts) from a pasted or CSV coordinate list.

    Parameters
    ----------
    text : str
        One vertex per line: ``x``, ``z`` and an optional part name (see the
        module notes for separators, the header and decimal commas).
    unit : str
        Length unit of the numbers (``"m"``, ``"mm"``, ``"in"``, ``"ft"``
        ...); any unit pint knows.

    Returns
    -------
    outline : numpy.ndarray
        (N, 2) vertices ``[x, z]`` [m], N >= 3, in the order given; a
        closing vertex that repeats the first is dropped.
    parts : tuple of str or None
        One part name per edge when the text has a third column (empty
        entries are ``"wall"``), else None.

    Raises
    ------
    CoordinateError
        Naming the line and the fault: "line 4: 'abc' is not a number",
        "line 7 has 1 value, need x and z".

    Examples
    --------
    >>> outline, parts = parse_coordinates("x;z\\n0;0\\n2,5;0\\n2,5;1,2", unit="m")
    >>> outline.tolist(), parts
    ([[0.0, 0.0], [2.5, 0.0], [2.5, 1.2]], None)
    >>> parse_coordinates("0 0 floor\\n2000 0\\n2000 1000 open", unit="mm")[1]
    ('floor', 'wall', 'open')
    """
    if not isinstance(text, str):
        raise CoordinateError(f"coordinates must be text, not {type(text).__name__}")
    if len(text) > MAX_FILE_BYTES:
        raise CoordinateError(f"the coordinate list is larger than the {_size(MAX_FILE_BYTES)} "
                              "Wetline reads")
    try:
        scale = length_factor(unit)
    except UnitError as exc:
        raise CoordinateError(str(exc)) from None
    lines = text.lstrip("\ufeff").splitlines()
    sep = _separator(lines)
    decimal_comma = sep in ("\t", ";")

    rows: list[tuple[int, float, float, str | None]] = []   # (line, x, z, part or None)
    seen_data = False
    for number, line in enumerate(lines, start=1):
        if not line.strip():
            continue
        fields = _fields(line, sep)
        if not fields:
            continue
        values = [_number(f, decimal_comma) for f in fields[:2]]
        if not seen_data and all(v is None for v in values):
            _check_header_unit(fields[:2], unit, scale, number)
            seen_data = True
            continue
        seen_data = True
        if len(fields) < 2:
            raise CoordinateError(f"line {number} has 1 value, need x and z", line=number)
        if len(fields) > 3:
            hint = ("; with commas between values, write decimals with a point"
                    if sep == "," else "")
            raise CoordinateError(
                f"line {number} has {len(fields)} values, need x, z and an optional "
                f"part name{hint}", line=number)
        x, z = (_checked(fields[k], values[k], "xz"[k], number) for k in (0, 1))
        part = fields[2] if len(fields) == 3 else None
        rows.append((number, x, z, part))
        if len(rows) > MAX_VERTICES + 1:  # one more may be a closing repeat
            raise CoordinateError(_too_many())

    if not rows:
        raise CoordinateError("no coordinates found (need one x, z pair per line)")
    named = [(r[0], r[3]) for r in rows if r[3]]
    if named and all(_number(p, decimal_comma) is not None for _, p in named):
        raise CoordinateError(
            f"line {named[0][0]} has 3 numbers; give x and z (and an optional part "
            "name), not x, y, z", line=named[0][0])
    if len(rows) > 1 and rows[-1][1:3] == rows[0][1:3]:
        rows.pop()  # the closing vertex repeats the first
    if len(rows) < 3:
        raise CoordinateError(f"found {len(rows)} vertices, need at least 3")
    if len(rows) > MAX_VERTICES:
        raise CoordinateError(_too_many())
    outline = to_si_exactly(np.array([(r[1], r[2]) for r in rows], dtype=np.float64), scale)
    far = np.flatnonzero(np.abs(outline) > COORDINATE_LIMIT)
    if far.size:
        k, column = divmod(int(far[0]), 2)
        raise CoordinateError(
            f"line {rows[k][0]}: {'xz'[column]} = {outline[k, column]:.3g} m is beyond the "
            f"{COORDINATE_LIMIT:.3g} m Wetline reads", line=rows[k][0])
    parts = tuple((r[3] or DEFAULT_PART) for r in rows) if named else None
    return outline, parts


def _checked(field: str, value: float | None, name: str, number: int) -> float:
    """The value of the x or z field of line ``number``; CoordinateError if
    the field is empty, not a number or not finite."""
    if not field:
        raise CoordinateError(f"line {number}: {name} is empty", line=number)
    if value is None:
        raise CoordinateError(f"line {number}: '{field}' is not a number", line=number)
    if not math.isfinite(value):
        raise CoordinateError(f"line {number}: '{field}' is not a finite number", line=number)
    return value


def _too_many() -> str:
    return f"the list has more than the {MAX_VERTICES} vertices an outline may have"


def _size(n: int) -> str:
    """``"64 MiB"``, ``"100 bytes"``."""
    return f"{n / 2**20:.0f} MiB" if n >= 2**20 else f"{n} bytes"


def _check_header_unit(fields: Sequence[str], unit: str, scale: float, number: int) -> None:
    """Refuse a header whose ``[unit]`` disagrees with ``unit``."""
    for field in fields:
        m = _HEADER_UNIT.search(field)
        if not m:
            continue
        try:
            stated = length_factor(m.group(1))
        except UnitError:
            continue  # "(right)", "[-]": not a length unit, just a label
        if stated != scale:
            raise CoordinateError(
                f"line {number}: the header gives the coordinates in {m.group(1)}, "
                f"but they are being read in {unit.strip()}", line=number)
        return


def _text(v: float, decimal_comma: bool) -> str:
    t = f"{float(v) + 0.0:.15g}"
    return t.replace(".", ",") if decimal_comma else t


def format_coordinates(outline: ArrayLike, parts: Sequence[str] | None = None, unit: str = "m", *,
                       header: bool = True, decimal_comma: bool = False) -> str:
    """Tab-separated text of an outline, for copying into a spreadsheet.

    Parameters
    ----------
    outline : array_like
        (N, 2) vertices ``[x, z]`` [m].
    parts : sequence of str, optional
        One part name per edge, written as a third column.
    unit : str
        Length unit to write the numbers in.
    header : bool
        Start with a header row ``x [unit]``, ``z [unit]`` (and ``part``).
    decimal_comma : bool
        Write ``1,25`` instead of ``1.25``.

    Returns
    -------
    str
        One line per vertex, numbers to 15 significant digits, ending in a
        newline. :func:`parse_coordinates` reads it back to the same
        vertices (within 5e-15 relative) and parts.

    Raises
    ------
    CoordinateError
        If `unit` is unknown or `parts` does not have one name per vertex.

    Examples
    --------
    >>> format_coordinates([[0, 0], [2.5, 0], [2.5, 1.2]], unit="mm").splitlines()
    ['x [mm]\\tz [mm]', '0\\t0', '2500\\t0', '2500\\t1200']
    """
    try:
        scale = length_factor(unit)
    except UnitError as exc:
        raise CoordinateError(str(exc)) from None
    pts = np.asarray(outline, dtype=np.float64).reshape(-1, 2) / scale
    if parts is not None and len(parts) != len(pts):
        raise CoordinateError(f"{len(parts)} part names for {len(pts)} vertices")
    lines = []
    if header:
        u = unit.strip()
        lines.append(f"x [{u}]\tz [{u}]" + ("\tpart" if parts is not None else ""))
    for i, (x, z) in enumerate(pts.tolist()):
        row = f"{_text(x, decimal_comma)}\t{_text(z, decimal_comma)}"
        if parts is not None:
            row += f"\t{parts[i]}"
        lines.append(row)
    return "\n".join(lines) + "\n"
