"""Read a cross-section outline from a DXF drawing, and write one back.

A drawing office hands over a section as a DXF file. The cavity outline is a
closed polyline in its modelspace: an ``LWPOLYLINE`` or a 2D ``POLYLINE``.
This module finds those polylines (:func:`list_outlines`), lets the caller
pick one (:func:`choose_outline`) and turns it into a validated
:class:`~wetline.core.section.Section` (:meth:`DxfOutline.to_section`);
:func:`read_outline` does all three in one call. :func:`write_outline` writes
a section as a DXF that any CAD program opens, and that this module reads back
with the same vertices and the same parts.

Conventions
-----------
- **Axes.** The section's x is the drawing's x and the section's z is the
  drawing's y: the drawing is a view of the cross-section with "up" up the
  sheet. Vertex order and direction are kept as drawn.
- **Units.** Coordinates are converted to metres from the drawing units the
  header states (``$INSUNITS``: 1 in, 2 ft, 4 mm, 5 cm, 6 m, 10 yd, 14 dm,
  ...); the caller may override them with ``unit=``. A drawing that states
  no units (``$INSUNITS`` 0, or missing) is read as **millimetres**, with a
  warning: drawing offices working in metric draw in mm, and a mistake shows
  at once as a section 1000 times too small or too large (a second warning
  says so when the outline is under 50 mm across). Conversion factors come
  from the program's pint registry (:func:`wetline.core.units.length_factor`), exact
  for inches and feet.
- **Closed.** A polyline counts as closed when it is flagged closed, or when
  its last vertex coincides with its first (the repeated vertex is then
  dropped). Consecutive repeated vertices are dropped too, with a warning.
  Closed polylines with fewer than 3 distinct vertices are not outlines;
  they are named in the messages, never silently used.
- **Damaged or too large.** A polyline with a non-finite coordinate or
  bulge, a vertex beyond :data:`~wetline.core.limits.COORDINATE_LIMIT`, or
  more than :data:`~wetline.core.limits.MAX_VERTICES` vertices (as drawn,
  or once its arcs are flattened, counted before any is built) is not
  read: it is named with the vertex at fault, in the message when nothing
  else is found, else in a warning ("skipped closed LWPOLYLINE 2F on layer
  0 with a non-finite coordinate at vertex 2"). Files over
  :data:`~wetline.core.limits.MAX_FILE_BYTES` are refused unread. A UTF-8
  byte-order mark before the text is skipped.
- **Arcs.** A polyline segment with a bulge is a circular arc. It is
  flattened into straight edges whose vertices lie on the arc and whose
  sagitta (largest gap between a chord and the arc) is at most
  ``arc_tolerance`` [m] (1 nm or more), by default :data:`ARC_SAGITTA_RATIO`
  (0.1 %) of the arc's radius; the outline carries a warning saying how many
  arcs became how many edges. Included angle 4 atan(bulge), radius and
  centre from the chord by circle geometry (see :func:`_arcs`), all arcs at
  once.
- **Cost.** Linear in the number of vertices; most of the time is ezdxf
  reading the file (``bench/bench_import.py``).
- **Parts.** :func:`write_outline` writes every edge as a ``LINE`` on a layer
  named after its part (``WETLINE-wall``, ``WETLINE-floor``, ``WETLINE-open``
  ...) with the exact part name also attached as extended data, plus the
  whole outline as one closed ``LWPOLYLINE`` on layer ``WETLINE-OUTLINE``.
  On reading, an outline whose every edge matches such a line gets those
  parts back; any other outline gets ``parts=None`` (all ``"wall"``).
- **Not read.** 3D polylines, meshes, polylines not lying in the drawing
  plane, and anything inside blocks (``INSERT``): explode blocks and join
  lines and arcs into one closed polyline in the CAD program first. The
  message when no outline is found says what the drawing holds instead.

Everything that goes wrong raises :class:`DxfError` (a ``ValueError``) with a
one-line message that names the file and says what and where.

References
----------
ezdxf documentation, "DXF Units" and the ``ezdxf.math`` bulge functions
(https://ezdxf.readthedocs.io). Autodesk, AutoCAD DXF Reference: header
variable ``$INSUNITS``; LWPOLYLINE and POLYLINE/VERTEX group codes (bulge =
tan(included angle / 4), positive counter-clockwise).
"""

from __future__ import annotations

import io
import math
import os
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass, field, replace
from pathlib import Path

import ezdxf
import ezdxf.math
import numpy as np
from ezdxf.document import Drawing
from ezdxf.entities import LWPolyline, Polyline
from ezdxf.layouts import Modelspace
from ezdxf.lldxf.validator import INVALID_LAYER_NAME_CHARACTERS

from .atomic_write import atomic_path
from .limits import COORDINATE_LIMIT, MAX_FILE_BYTES, MAX_VERTICES
from .numbers import count_of
from .section import Section, SectionError
from .units import UnitError, length_factor, to_si_exactly, ureg

__all__ = [
    "ARC_SAGITTA_RATIO",
    "OUTLINE_LAYER",
    "PART_LAYER_PREFIX",
    "DxfError",
    "DxfOutline",
    "list_outlines",
    "choose_outline",
    "read_outline",
    "write_outline",
    "insunits_code",
]

ARC_SAGITTA_RATIO = 0.001
"""Default largest sagitta of a flattened arc, as a fraction of its radius
[]. 0.1 % gives about 71 chords on a full circle and loses about 0.13 % of
the area between the arc and its chords (4/3 of the ratio, common practice
for chord approximations)."""

OUTLINE_LAYER = "WETLINE-OUTLINE"
"""Layer of the closed outline polyline :func:`write_outline` writes."""

PART_LAYER_PREFIX = "WETLINE-"
"""Prefix of the part layers :func:`write_outline` writes (``WETLINE-wall``)."""

_APPID = "WETLINE"
"""Application name of the extended data that carries exact part names."""

_SAME_POINT = 1e-9
"""Two vertices closer than this fraction [] of the outline's size are one."""

_MIN_ARC_TOLERANCE = 1e-9
"""Smallest arc tolerance accepted [m]: a nanometre, far below drawing
precision, and small enough chords stay countable before any is built."""

_INSUNITS = {
    1: "inch", 2: "foot", 3: "mile", 4: "millimeter", 5: "centimeter",
    6: "meter", 7: "kilometer", 8: "microinch", 9: "thou", 10: "yard",
    11: "angstrom", 12: "nanometer", 13: "micrometer", 14: "decimeter",
    15: "decameter", 16: "hectometer", 17: "gigameter",
    18: "astronomical_unit", 19: "light_year", 20: "parsec",
    21: "survey_foot", 24: "survey_mile",
}
"""``$INSUNITS`` code -> pint unit name (AutoCAD DXF Reference). Codes 22
and 23 (US survey inch and yard) have no pint unit and are refused unless
the caller gives the unit."""

_SHORT_UNIT = {"millimeter": "mm", "centimeter": "cm", "meter": "m", "kilometer": "km",
               "inch": "in", "foot": "ft", "yard": "yd", "mile": "mi",
               "decimeter": "dm", "micrometer": "um", "nanometer": "nm"}
"""Short names written to section files for the common units."""

_UNITLESS_DEFAULT = "mm"


class DxfError(ValueError):
    """A DXF file that cannot be read or written, with a one-line reason.

    Attributes
    ----------
    edges, vertices : tuple of int
        Indices of the edges or vertices at fault when the chosen outline is
        not a valid section (from :class:`~wetline.core.section.SectionError`).
    location : tuple of float or None
        A point [m] near the fault, for marking it on a drawing.
    """

    def __init__(self, message: str, *, edges: Iterable[int] = (),
                 vertices: Iterable[int] = (),
                 location: tuple[float, float] | None = None) -> None:
        super().__init__(message)
        self.edges = tuple(edges)
        self.vertices = tuple(vertices)
        self.location = location


@dataclass(frozen=True, eq=False)
class DxfOutline:
    """One closed polyline found in a drawing, converted to metres.

    Attributes
    ----------
    index : int
        Position among the drawing's outlines (0-based, drawing order); what
        ``choose`` takes as a number and messages show as ``#index``.
    handle : str
        The polyline's DXF handle (hexadecimal text, unique in the file).
    layer : str
        The polyline's layer.
    entity : str
        ``"LWPOLYLINE"`` or ``"POLYLINE"``.
    unit : str
        The drawing unit the coordinates were read in (``"mm"``, ``"in"`` ...).
    vertices : numpy.ndarray
        (N, 2) read-only ``[x, z]`` vertices [m]: x = drawing x, z = drawing
        y; closed implicitly, arcs flattened, repeated vertices dropped.
    parts : tuple of str or None
        One part name per edge when the outline came from
        :func:`write_outline`, else None.
    area : float
        Enclosed area [m2], positive (shoelace formula).
    bounds : tuple of float
        ``(x_min, z_min, x_max, z_max)`` [m].
    n_arcs : int
        Number of arc segments that were flattened.
    warnings : tuple of str
        What was assumed or changed on reading, one sentence each.
    unit_assumed : bool
        True if the drawing states no units and none was given, so ``unit``
        is the millimetre default: a program should ask.
    """

    index: int
    handle: str
    layer: str
    entity: str
    unit: str
    vertices: np.ndarray
    parts: tuple[str, ...] | None
    area: float
    bounds: tuple[float, float, float, float]
    n_arcs: int = 0
    warnings: tuple[str, ...] = ()
    unit_assumed: bool = False

    @property
    def n_vertices(self) -> int:
        """Number of vertices (= number of edges)."""
        return int(self.vertices.shape[0])

    @property
    def size(self) -> tuple[float, float]:
        """Width and height of the bounding box, ``(dx, dz)`` [m]."""
        x0, z0, x1, z1 = self.bounds
        return (x1 - x0, z1 - z0)

    def describe(self) -> str:
        """A short line for lists and messages.

        Examples
        --------
        ``"#0 layer OUTLINE (LWPOLYLINE 2F), 6 vertices, 2400 x 2800 mm"``
        """
        f = length_factor(self.unit)
        dx, dz = self.size
        return (f"#{self.index} layer {self.layer} ({self.entity} {self.handle}), "
                f"{self.n_vertices} vertices, {dx / f:.6g} x {dz / f:.6g} {self.unit}")

    def to_section(self, *, kind: str = "plane", width: float = 1.0,
                   name: str = "") -> Section:
        """The validated section of this outline.

        Parameters
        ----------
        kind : str
            ``"plane"`` or ``"axisymmetric"`` (x is then the radius, the
            drawing's x = 0 the axis).
        width : float
            Out-of-plane depth of a plane section [m].
        name : str
            Free text for titles.

        Returns
        -------
        Section
            Parts from a Wetline export, else all ``"wall"``.

        Raises
        ------
        DxfError
            If the outline is not a valid section ("polyline #0 on layer
            OUTLINE: outline crosses itself between edges 2 and 5"), with
            the edges, vertices and location of the fault.
        """
        try:
            return Section.build(self.vertices, parts=self.parts, kind=kind,
                                 width=width, name=name)
        except SectionError as exc:
            raise DxfError(f"polyline #{self.index} on layer {self.layer}: {exc}",
                           edges=exc.edges, vertices=exc.vertices,
                           location=exc.location) from None


# ------------------------------------------------------------------ units
def _unit_name(unit: str) -> str:
    """Short name of a pint length unit, for files and messages."""
    canonical = str(ureg.parse_units(unit))
    return _SHORT_UNIT.get(canonical, unit.strip())


def insunits_code(unit: str) -> int | None:
    """The DXF ``$INSUNITS`` code of a length unit, or None if it has none.

    Parameters
    ----------
    unit : str
        A length unit pint knows (``"mm"``, ``"millimeter"``, ``"in"``...).

    Returns
    -------
    int or None

    Raises
    ------
    DxfError
        If `unit` is not a known length unit.

    Examples
    --------
    >>> insunits_code("mm"), insunits_code("ft"), insunits_code("furlong")
    (4, 2, None)
    """
    try:
        length_factor(unit)
    except UnitError as exc:
        raise DxfError(str(exc)) from None
    canonical = str(ureg.parse_units(unit))
    for code, name in _INSUNITS.items():
        if name == canonical:
            return code
    return None


def _drawing_unit(doc: Drawing, name: str, unit: str | None) -> tuple[str, list[str], bool]:
    """Unit to read ``doc`` in, with the warnings that choice needs."""
    code = doc.header.get("$INSUNITS", 0)
    try:
        code = int(code)
    except (TypeError, ValueError):
        code = 0
    stated = _INSUNITS.get(code)
    if unit is not None:
        try:
            length_factor(unit)
        except UnitError as exc:
            raise DxfError(str(exc)) from None
        warnings = []
        if stated is not None and str(ureg.parse_units(unit)) != stated:
            warnings.append(f"{name} states its units as {_unit_name(stated)}; "
                            f"read in {unit.strip()} as asked")
        return unit.strip(), warnings, False
    if code == 0:
        return _UNITLESS_DEFAULT, [
            f"{name} states no units ($INSUNITS = 0); read as millimetres: "
            "give the unit if that is wrong"], True
    if stated is None:
        label = ezdxf.units.unit_name(code) if 0 <= code <= 24 else "unknown"
        raise DxfError(f"{name} states its units as $INSUNITS = {code} ({label}), which "
                       "Wetline cannot convert; give the unit (mm, m, in, ft ...)")
    return _unit_name(stated), [], False


# ---------------------------------------------------------------- reading
_UTF8_BOM = b"\xef\xbb\xbf"


def _open(path: Path) -> Drawing:
    """Read the DXF document at ``path``; DxfError naming the file if not.

    Files over :data:`~wetline.core.limits.MAX_FILE_BYTES` are refused before
    anything is read. A UTF-8 byte-order mark, which some editors put before
    the text, is skipped: the text after it is read as UTF-8.
    """
    name = path.name
    try:
        size = path.stat().st_size
        with open(path, "rb") as fh:
            head = fh.read(6)
    except FileNotFoundError:
        raise DxfError(f"{path}: no such file") from None
    except IsADirectoryError:
        raise DxfError(f"{path}: is a folder, not a DXF file") from None
    except OSError as exc:
        raise DxfError(f"{path}: cannot be read ({exc.strerror})") from None
    if size > MAX_FILE_BYTES:
        raise DxfError(f"{name} is larger than the {MAX_FILE_BYTES / 2**20:.0f} MiB Wetline "
                       f"reads ({size / 2**20:.1f} MiB)")
    if head.startswith(b"AC10"):
        raise DxfError(f"{name} is a DWG file, not DXF; save it as DXF in the CAD program")
    try:
        if head.startswith(_UTF8_BOM):
            return _read_marked(path)
        return ezdxf.readfile(path)
    except ezdxf.DXFStructureError as exc:
        reason = " ".join(str(exc).split())  # one line, whatever ezdxf wrote
        raise DxfError(f"{name} is not a readable DXF file ({reason})") from None
    except (OSError, UnicodeDecodeError, ValueError):
        raise DxfError(f"{name} is not a DXF file") from None


def _read_marked(path: Path) -> Drawing:
    """The drawing of a text file that starts with a UTF-8 byte-order mark."""
    with open(path, "rb") as fh:
        text = fh.read()[len(_UTF8_BOM):].decode("utf-8", errors="surrogateescape")
    if not ezdxf.is_dxf_stream(io.StringIO(text)):
        raise ValueError("not a DXF file")
    return ezdxf.read(io.StringIO(text))


def _check_arc_tolerance(arc_tolerance: object) -> float | None:
    """The arc tolerance [m] as a float, or None; DxfError if it is not a
    length of at least :data:`_MIN_ARC_TOLERANCE`."""
    if arc_tolerance is None:
        return None
    if (isinstance(arc_tolerance, bool) or not isinstance(arc_tolerance, (int, float))
            or not math.isfinite(arc_tolerance) or arc_tolerance < _MIN_ARC_TOLERANCE):
        raise DxfError(f"arc tolerance must be a positive length in metres "
                       f"({_MIN_ARC_TOLERANCE:g} or more), not {arc_tolerance!r}")
    return float(arc_tolerance)


@dataclass
class _Survey:
    """What a drawing's modelspace holds besides its outlines."""

    found: dict[tuple[str, str, str], int] = field(default_factory=dict)
    """(singular, plural, layer) -> count, of polylines that are not outlines."""
    others: dict[str, int] = field(default_factory=dict)
    """Entity type -> count, of other drawing entities worth a hint."""
    few: list[str] = field(default_factory=list)
    """Closed polylines with fewer than 3 distinct vertices (not outlines)."""
    faults: list[str] = field(default_factory=list)
    """Polylines refused for damaged or out-of-range data."""

    def count(self, one: str, many: str, layer: str) -> None:
        """Count a polyline that is not an outline, by kind and layer."""
        key = (one, many, layer)
        self.found[key] = self.found.get(key, 0) + 1

    def note_other(self, kind: str) -> None:
        """Count an entity that is not a polyline, if a hint names its kind."""
        if kind in ("LINE", "ARC", "CIRCLE", "SPLINE", "ELLIPSE", "INSERT"):
            self.others[kind] = self.others.get(kind, 0) + 1


@dataclass(frozen=True)
class _Reading:
    """What every polyline of one drawing is read with."""

    unit: str
    scale: float
    """Metres per drawing unit."""
    arc_tolerance: float | None
    """Largest sagitta of a chord [m], or None for a fraction of each radius."""
    warnings: tuple[str, ...]
    """Warnings about the whole drawing (its units)."""
    unit_assumed: bool


def _polyline_rows(entity: LWPolyline | Polyline) -> tuple[np.ndarray, bool]:
    """``(x, y, bulge)`` rows (N, 3) of a 2D polyline in its OCS, and its
    closed flag."""
    if isinstance(entity, LWPolyline):
        rows = np.array(entity.get_points("xyb"), dtype=np.float64)
        return rows.reshape(-1, 3), bool(entity.closed)
    vertices = [v for v in entity.vertices
                if not v.dxf.flags & 16]  # spline frame control points: not on the curve
    rows = np.empty((len(vertices), 3))
    for k, v in enumerate(vertices):
        loc = v.dxf.location
        rows[k] = (loc.x, loc.y, v.dxf.get("bulge", 0.0))
    return rows, bool(entity.is_closed)


def _not_an_outline(entity: LWPolyline | Polyline) -> tuple[str, str] | None:
    """Why a polyline cannot be a section outline, as (singular, plural)
    names, or None if it may be one (a 2D polyline in the drawing plane)."""
    kind = entity.dxftype()
    if isinstance(entity, Polyline) and not entity.is_2d_polyline:
        what = "3D POLYLINE" if entity.is_3d_polyline else "mesh POLYLINE"
        return what, what + "s"
    extrusion = ezdxf.math.Vec3(entity.dxf.get("extrusion", (0.0, 0.0, 1.0)))
    if not extrusion.is_null and not extrusion.normalize().isclose((0, 0, 1)) \
            and not extrusion.normalize().isclose((0, 0, -1)):
        return f"{kind} out of the drawing plane", f"{kind}s out of the drawing plane"
    return None


def _row_fault(rows: np.ndarray) -> str | None:
    """A non-finite coordinate or bulge, named with its vertex, or None."""
    bad = np.flatnonzero(~np.isfinite(rows[:, :2]).all(axis=1))
    if bad.size:
        return f"a non-finite coordinate at vertex {bad[0]}"
    bad = np.flatnonzero(~np.isfinite(rows[:, 2]))
    if bad.size:
        return f"a non-finite bulge at vertex {bad[0]}"
    return None


def _range_fault(rows: np.ndarray, scale: float) -> str | None:
    """The first vertex beyond :data:`~wetline.core.limits.COORDINATE_LIMIT`,
    named, or None."""
    reach = np.max(np.abs(rows[:, :2]), axis=1)
    bad = np.flatnonzero(reach > COORDINATE_LIMIT / scale)
    if bad.size:
        k = int(bad[0])
        return (f"vertex {k} at {float(reach[k]) * scale:.3g} m from the origin, beyond the "
                f"{COORDINATE_LIMIT:.3g} m Wetline reads")
    return None


@dataclass(frozen=True)
class _Arcs:
    """The bulged segments of a closed polyline and the chords they need.

    ``index`` are the segments (segment i runs from vertex i to i + 1) that
    are arcs, with their signed included angle ``sweep`` [rad]; ``counts``
    is the number of chords of every segment (1 for a straight one), as
    floats so that an absurd count is seen before it is built.
    """

    index: np.ndarray
    sweep: np.ndarray
    counts: np.ndarray


def _arcs(rows: np.ndarray, sagitta_ratio: float | None, sagitta: float | None) -> _Arcs:
    """The arcs of a closed polyline and their chord counts.

    An arc of included angle theta on a circle of radius r is cut into
    ceil(|theta| / phi) equal chords, phi = 4 asin(sqrt(s / 2r)) being the
    angle of a chord of sagitta s = r (1 - cos(phi / 2)) (circle geometry).
    With the chord c of the arc's end points, r = c / (2 |sin(theta / 2)|)
    and theta = 4 atan(bulge) (AutoCAD DXF Reference, bulge), so s / 2r is
    either half the ``sagitta_ratio`` or ``sagitta |sin(theta / 2)| / c``
    (``sagitta`` in drawing units), never needing r itself.
    """
    n = rows.shape[0]
    x, y, bulge = rows[:, 0], rows[:, 1], rows[:, 2]
    dx = np.roll(x, -1) - x
    dy = np.roll(y, -1) - y
    index = np.flatnonzero((bulge != 0.0) & ((dx != 0.0) | (dy != 0.0)))
    counts = np.ones(n)
    sweep = 4.0 * np.arctan(bulge[index])
    if index.size:
        if sagitta_ratio is not None:
            u = np.full(index.size, 0.5 * sagitta_ratio)
        else:
            chord = np.hypot(dx[index], dy[index])
            with np.errstate(over="ignore"):  # a huge tolerance: one chord anyway
                u = sagitta * np.abs(np.sin(0.5 * sweep)) / chord
        phi = 4.0 * np.arcsin(np.sqrt(np.minimum(u, 1.0)))
        # phi is 0 only if u underflowed, for an arc flat to round-off: 1 chord.
        ratio = np.abs(sweep) / np.where(phi > 0.0, phi, np.inf)
        counts[index] = np.maximum(np.ceil(ratio), 1.0)
    return _Arcs(index=index, sweep=sweep, counts=counts)


def _flatten(rows: np.ndarray, arcs: _Arcs) -> np.ndarray:
    """Vertices (M, 2) of a closed polyline with its arcs replaced by chords.

    The chords' ends lie on the arc, equally spaced in angle from the
    segment's start vertex. The centre is the chord's midpoint moved
    c / (2 tan(theta / 2)) along its left normal (to the left of travel for
    a counter-clockwise, positive bulge), the radius c / (2 |sin(theta / 2)|).
    """
    pts = rows[:, :2]
    counts = arcs.counts.astype(np.intp)
    split = counts[arcs.index] > 1
    if not split.any():
        return np.ascontiguousarray(pts)
    i, sweep = arcs.index[split], arcs.sweep[split]
    p0 = pts[i]
    d = pts[(i + 1) % len(pts)] - p0
    half = 0.5 * sweep
    reach = 0.5 / np.tan(half)  # times the chord's left normal (-dy, dx)
    centre = p0 + 0.5 * d + reach[:, None] * np.column_stack([-d[:, 1], d[:, 0]])
    radius = 0.5 * np.hypot(d[:, 0], d[:, 1]) / np.abs(np.sin(half))
    start = np.arctan2(p0[:, 1] - centre[:, 1], p0[:, 0] - centre[:, 0])
    # Output slots: every vertex, then count - 1 points inside each arc.
    first = np.concatenate([[0], np.cumsum(counts)[:-1]])
    out = np.empty((int(counts.sum()), 2))
    out[first] = pts
    k = counts[i] - 1  # inner points of each arc
    arc_of = np.repeat(np.arange(i.size), k)
    step = np.arange(arc_of.size) - np.repeat(np.cumsum(k) - k, k) + 1
    angle = start[arc_of] + sweep[arc_of] * step / counts[i][arc_of]
    slot = first[i][arc_of] + step
    out[slot, 0] = centre[arc_of, 0] + radius[arc_of] * np.cos(angle)
    out[slot, 1] = centre[arc_of, 1] + radius[arc_of] * np.sin(angle)
    return out


def _drop_repeats(pts: np.ndarray, tol: float) -> tuple[np.ndarray, int]:
    """Drop every vertex within ``tol`` of the one before it (cyclically,
    the first vertex is kept). Returns the kept points and the number dropped.
    """
    n = len(pts)
    if n < 2:
        return pts, 0
    step = np.hypot(*(pts - np.roll(pts, 1, axis=0)).T)
    keep = step > tol
    keep[0] = True
    kept = pts[keep]
    if len(kept) > 1 and np.hypot(*(kept[-1] - kept[0])) <= tol:
        kept = kept[:-1]
    return kept, n - len(kept)


def _to_world(entity: LWPolyline | Polyline, pts: np.ndarray) -> np.ndarray:
    """Points of a polyline's OCS in world x and y."""
    ocs = entity.ocs()
    if not ocs.transform:
        return pts
    if isinstance(entity, LWPolyline):
        z = float(entity.dxf.get("elevation", 0.0))
    else:
        z = float(entity.dxf.get("elevation", (0.0, 0.0, 0.0))[2])
    return np.array([(v.x, v.y) for v in ocs.points_to_wcs(
        [(x, y, z) for x, y in pts.tolist()])], dtype=np.float64)


@dataclass(frozen=True)
class _PartLines:
    """The part lines of a drawing: start and end points, one part each."""

    ends: np.ndarray
    """(L, 4) ``x0, y0, x1, y1`` in drawing units (world)."""
    parts: tuple[str, ...]


def _part_lines(msp: Modelspace) -> _PartLines:
    """The drawing's LINEs that name a Wetline part.

    A line counts when it carries Wetline extended data (the exact part
    name) or lies on a ``WETLINE-*`` layer other than the outline layer.
    """
    ends = []
    parts = []
    for e in msp.query("LINE"):
        part = None
        if e.has_xdata(_APPID):
            tags = e.get_xdata(_APPID)
            if tags and tags[0].code == 1000 and str(tags[0].value).strip():
                part = str(tags[0].value)
        if part is None:
            layer = e.dxf.layer
            if (layer.upper().startswith(PART_LAYER_PREFIX)
                    and layer.upper() != OUTLINE_LAYER and len(layer) > len(PART_LAYER_PREFIX)):
                part = layer[len(PART_LAYER_PREFIX):]
        if part is not None:
            s, t = e.dxf.start, e.dxf.end
            ends.append((s.x, s.y, t.x, t.y))
            parts.append(part)
    return _PartLines(ends=np.array(ends, dtype=np.float64).reshape(-1, 4),
                      parts=tuple(parts))


def _match_parts(pts: np.ndarray, lines: _PartLines,
                 tol: float) -> tuple[tuple[str, ...] | None, int]:
    """Parts of the edges of the closed outline ``pts`` (drawing units) from
    the part lines, matched by end points on a grid of ``tol``; returns
    (parts or None, number of edges unmatched)."""
    n = len(pts)
    if not lines.parts:
        return None, n
    with np.errstate(over="ignore", invalid="ignore"):  # lines far off never match
        grid = np.round(lines.ends / tol).tolist()
    table: dict[tuple[float, ...], str] = {}
    for (ax, ay, bx, by), part in zip(grid, lines.parts, strict=True):
        table.setdefault((ax, ay, bx, by), part)
        table.setdefault((bx, by, ax, ay), part)
    keys = np.round(np.hstack([pts, np.roll(pts, -1, axis=0)]) / tol).tolist()
    found = [table.get(tuple(k)) for k in keys]
    missing = sum(p is None for p in found)
    if missing:
        return None, missing
    return tuple(p for p in found if p is not None), 0


def _describe_polyline(entity: LWPolyline | Polyline, closed: bool) -> str:
    """``"closed LWPOLYLINE 2F on layer OUTLINE"``, for messages."""
    return (f"{'closed ' if closed else ''}{entity.dxftype()} {entity.dxf.handle} "
            f"on layer {entity.dxf.layer}")


def _closed_rows(entity: LWPolyline | Polyline, how: _Reading,
                 survey: _Survey) -> tuple[np.ndarray, float] | None:
    """Step 1: the ``(x, y, bulge)`` rows of a closed polyline, without a
    repeated closing vertex, and the distance [drawing units] under which two
    vertices are one; None (noted in ``survey``) if the polyline is open, has
    a non-finite number or a vertex out of range, or has too many vertices."""
    rows, closed = _polyline_rows(entity)
    fault = _row_fault(rows) or _range_fault(rows, how.scale)
    if fault:
        survey.faults.append(f"{_describe_polyline(entity, closed)} with {fault}")
        return None
    extent = float(np.max(np.abs(rows[:, :2]))) if rows.size else 0.0
    tol = _SAME_POINT * max(extent, 1e-290)  # > 0 for the tiniest drawing too
    ends_meet = len(rows) >= 2 and np.hypot(*(rows[-1, :2] - rows[0, :2])) <= tol
    if not (closed or ends_meet):
        kind = entity.dxftype()
        survey.count(f"open {kind}", f"open {kind}s", entity.dxf.layer)
        return None
    if ends_meet:
        rows = rows[:-1]  # a repeated closing vertex: its bulge spans nothing
    if len(rows) > MAX_VERTICES:
        survey.faults.append(f"{_describe_polyline(entity, True)} with {len(rows)} vertices, "
                             f"more than the {MAX_VERTICES} an outline may have")
        return None
    return rows, tol


def _counted_arcs(rows: np.ndarray, how: _Reading, what: str, survey: _Survey) -> _Arcs | None:
    """Step 2: the polyline's arcs and their chord counts; None (noted) if
    flattening would give more than :data:`~wetline.core.limits.MAX_VERTICES`."""
    if how.arc_tolerance is None:
        arcs = _arcs(rows, ARC_SAGITTA_RATIO, None)
    else:
        arcs = _arcs(rows, None, how.arc_tolerance / how.scale)
    total = float(arcs.counts.sum())
    if total > MAX_VERTICES:
        survey.faults.append(f"{what} with {total:.0f} vertices once its arcs are flattened, "
                             f"more than the {MAX_VERTICES} an outline may have: give a "
                             "larger arc tolerance")
        return None
    return arcs


def _read_polyline(entity: LWPolyline | Polyline, how: _Reading, survey: _Survey,
                   lines: Callable[[], _PartLines], index: int) -> DxfOutline | None:
    """The outline of one 2D polyline, or None (noted in ``survey``) if it
    is not one: open, damaged, too large, or with under 3 distinct vertices.

    The steps: closed rows, arcs counted, arcs flattened and repeats
    dropped, world coordinates, parts matched, metres.
    """
    closed = _closed_rows(entity, how, survey)
    what = _describe_polyline(entity, True)
    arcs = None if closed is None else _counted_arcs(closed[0], how, what, survey)
    if closed is None or arcs is None:
        return None
    rows, tol = closed
    pts, dropped = _drop_repeats(_flatten(rows, arcs), tol)
    if len(pts) < 3:
        survey.few.append(f"{what} with only "
                          f"{count_of(len(pts), 'distinct vertex', 'distinct vertices')}")
        return None
    pts = _to_world(entity, pts)
    parts, missing = _match_parts(pts, lines(), tol)
    vertices = np.array(to_si_exactly(pts, how.scale), dtype=np.float64)
    if _range_fault(vertices, 1.0):  # only an arc can reach beyond vertices that passed
        survey.faults.append(f"{what} with an arc that reaches beyond the "
                             f"{COORDINATE_LIMIT:.3g} m Wetline reads")
        return None
    vertices.setflags(write=False)
    layer = entity.dxf.layer
    from_wetline = layer.upper() == OUTLINE_LAYER or entity.has_xdata(_APPID)
    x, z = vertices[:, 0], vertices[:, 1]
    bounds = (float(x.min()), float(z.min()), float(x.max()), float(z.max()))
    notes = _outline_notes(how, dropped, arcs, missing if parts is None and from_wetline else 0,
                           max(bounds[2] - bounds[0], bounds[3] - bounds[1]))
    x, z = x - x[0], z - z[0]  # shoelace about the first vertex: no cancellation far away
    area = 0.5 * abs(float(np.dot(x, np.roll(z, -1)) - np.dot(np.roll(x, -1), z)))
    return DxfOutline(
        index=index, handle=entity.dxf.handle, layer=layer, entity=entity.dxftype(),
        unit=how.unit, vertices=vertices, parts=parts, area=area, bounds=bounds,
        n_arcs=int(arcs.index.size), warnings=notes, unit_assumed=how.unit_assumed)


def _outline_notes(how: _Reading, dropped: int, arcs: _Arcs, unmatched: int,
                   across: float) -> tuple[str, ...]:
    """The warnings of one outline: the drawing's, dropped vertices,
    flattened arcs, part lines missing, a suspiciously small size."""
    notes = list(how.warnings)
    if dropped:
        notes.append(f"{count_of(dropped, 'repeated vertex', 'repeated vertices')} dropped")
    if arcs.index.size:
        rule = (f"chords within {ARC_SAGITTA_RATIO:.1%} of the arc's radius"
                if how.arc_tolerance is None else
                f"chords within {how.arc_tolerance:g} m of the arc")
        chords = int(arcs.counts[arcs.index].sum())
        notes.append(f"{count_of(int(arcs.index.size), 'arc segment')} flattened into "
                     f"{count_of(chords, 'straight edge')} ({rule})")
    if unmatched:
        notes.append(f"{count_of(unmatched, 'edge')} of this Wetline outline "
                     f"{'has' if unmatched == 1 else 'have'} no part line; parts not "
                     "recovered (all 'wall')")
    if how.unit_assumed and across < 0.05:
        notes.append(f"read as millimetres the outline is only {across * 1000:.3g} mm "
                     "across; if the drawing is in metres, give the unit m")
    return tuple(notes)


def _scan(path: str | os.PathLike[str], unit: str | None,
          arc_tolerance: float | None) -> tuple[list[DxfOutline], _Survey]:
    """Every closed 2D polyline of the drawing, plus what else it holds."""
    path = Path(path)
    tolerance = _check_arc_tolerance(arc_tolerance)
    doc = _open(path)
    unit, drawing_warnings, assumed = _drawing_unit(doc, path.name, unit)
    how = _Reading(unit=unit, scale=length_factor(unit), arc_tolerance=tolerance,
                   warnings=tuple(drawing_warnings), unit_assumed=assumed)
    msp = doc.modelspace()
    survey = _Survey()
    cache: list[_PartLines] = []

    def lines() -> _PartLines:  # read once, and only if an outline needs them
        if not cache:
            cache.append(_part_lines(msp))
        return cache[0]

    outlines: list[DxfOutline] = []
    for entity in msp:
        if not isinstance(entity, (LWPolyline, Polyline)):
            survey.note_other(entity.dxftype())
            continue
        reason = _not_an_outline(entity)
        if reason is not None:
            survey.count(*reason, entity.dxf.layer)
            continue
        outline = _read_polyline(entity, how, survey, lines, len(outlines))
        if outline is not None:
            outlines.append(outline)
    skipped = tuple(f"skipped {fault}" for fault in survey.faults)
    return [replace(o, warnings=o.warnings + skipped) for o in outlines], survey


def _nothing_found(name: str, survey: _Survey) -> str:
    """The message for a drawing with no usable closed polyline."""
    bits = [f"{count_of(n, one, many)} on layer {layer}"
            for (one, many, layer), n in survey.found.items()]
    bits += survey.faults + survey.few
    if bits:
        shown = bits[:6] + ([f"{len(bits) - 6} more"] if len(bits) > 6 else [])
        what = ("usable closed polyline" if survey.faults else
                "closed polyline with 3 or more vertices" if survey.few else "closed polyline")
        message = f"{name} has no {what} (found {', '.join(shown)})"
    else:
        message = f"{name} has no closed polyline in its modelspace"
    hints = []
    others = survey.others
    loose = [count_of(others[k], k) for k in ("LINE", "ARC", "SPLINE", "ELLIPSE", "CIRCLE")
             if k in others]
    if loose:
        hints.append(f"it holds {', '.join(loose)}: join the outline into one closed "
                     "polyline in the CAD program")
    if "INSERT" in others:
        hints.append(f"{count_of(others['INSERT'], 'block reference')} not searched: "
                     "explode them first")
    if hints:
        message += "; " + "; ".join(hints)
    return message


def list_outlines(path: str | os.PathLike[str], *, unit: str | None = None,
                  arc_tolerance: float | None = None) -> list[DxfOutline]:
    """Every closed 2D polyline in a DXF drawing's modelspace.

    Parameters
    ----------
    path : str or os.PathLike
        The DXF file (ASCII or binary, any release ezdxf reads).
    unit : str, optional
        Length unit of the drawing's coordinates (``"mm"``, ``"m"``,
        ``"in"`` ...). Default: the unit the header states (``$INSUNITS``);
        millimetres, with a warning, if it states none.
    arc_tolerance : float, optional
        Largest sagitta of the chords that replace arc segments [m], at
        least 1e-9. Default: :data:`ARC_SAGITTA_RATIO` of each arc's radius.

    Returns
    -------
    list of DxfOutline
        In drawing order, ``index`` 0, 1, 2 ...; never empty. Polylines
        skipped as damaged or too large are named in every outline's
        warnings.

    Raises
    ------
    DxfError
        If the file is missing, not DXF or over
        :data:`~wetline.core.limits.MAX_FILE_BYTES`, its units cannot be
        converted, or it holds no usable closed polyline; the message then
        says what it holds ("drawing.dxf has no closed polyline (found 3
        open LWPOLYLINEs on layer WALLS)", "... (found closed LWPOLYLINE 2F
        on layer 0 with a non-finite coordinate at vertex 2)").

    Notes
    -----
    x = drawing x, z = drawing y. A polyline whose extrusion is (0, 0, -1)
    (drawn mirrored) is converted to world coordinates first.

    Examples
    --------
    >>> outlines = list_outlines("sump.dxf")                # doctest: +SKIP
    >>> [o.describe() for o in outlines]                    # doctest: +SKIP
    ['#0 layer OUTLINE (LWPOLYLINE 2F), 6 vertices, 2400 x 2800 mm']
    """
    outlines, survey = _scan(path, unit, arc_tolerance)
    if not outlines:
        raise DxfError(_nothing_found(Path(path).name, survey))
    return outlines


def _listing(outlines: Sequence[DxfOutline], limit: int = 8) -> str:
    shown = "; ".join(o.describe() for o in outlines[:limit])
    if len(outlines) > limit:
        shown += f"; and {len(outlines) - limit} more"
    return shown


def choose_outline(outlines: Sequence[DxfOutline], choose: int | str | None = None, *,
                   source: str = "the drawing") -> DxfOutline:
    """Pick one outline from :func:`list_outlines`.

    Parameters
    ----------
    outlines : list of DxfOutline
    choose : int or str, optional
        An ``int`` is an index. Text is tried in this order: ``"#2"`` or
        ``"2"`` (an index, when in range), a handle (``"2F"``, any case), a
        layer name (any case, as layer names are in DXF). None takes the
        only outline.
    source : str
        Name of the drawing for messages.

    Returns
    -------
    DxfOutline

    Raises
    ------
    DxfError
        When there are several and none is chosen, or the choice matches
        none or several; the message lists them ("3 closed polylines in
        sump.dxf: #0 layer OUTLINE (...), ...; choose one").
    """
    if not outlines:
        raise DxfError(f"{source} has no closed polyline")
    if choose is None:
        if len(outlines) == 1:
            return outlines[0]
        raise DxfError(f"{len(outlines)} closed polylines in {source}: "
                       f"{_listing(outlines)}; choose one by number, handle or layer")
    if isinstance(choose, bool) or not isinstance(choose, (int, str)):
        raise DxfError(f"choose an outline by number, handle or layer, not {choose!r}")
    if isinstance(choose, int):
        if 0 <= choose < len(outlines):
            return outlines[choose]
        raise DxfError(f"{source} has no closed polyline #{choose} "
                       f"(it has {len(outlines)}: {_listing(outlines)})")
    text = choose.strip()
    number = text[1:] if text.startswith("#") else text
    if number.isdigit():
        k = int(number)
        if 0 <= k < len(outlines):
            return outlines[k]
        if text.startswith("#"):
            raise DxfError(f"{source} has no closed polyline #{k} "
                           f"(it has {len(outlines)}: {_listing(outlines)})")
    for o in outlines:
        if o.handle.upper() == text.upper():
            return o
    on_layer = [o for o in outlines if o.layer.upper() == text.upper()]
    if len(on_layer) == 1:
        return on_layer[0]
    if len(on_layer) > 1:
        raise DxfError(f"{len(on_layer)} closed polylines on layer {text} in {source}: "
                       f"{_listing(on_layer)}; choose one by number or handle")
    raise DxfError(f"no closed polyline in {source} has the number, handle or layer "
                   f"{text!r} (there are {len(outlines)}: {_listing(outlines)})")


def read_outline(path: str | os.PathLike[str], *, choose: int | str | None = None,
                 unit: str | None = None, kind: str = "plane", width: float = 1.0,
                 name: str | None = None,
                 arc_tolerance: float | None = None) -> tuple[Section, list[str]]:
    """The section drawn as a closed polyline in a DXF file.

    Parameters
    ----------
    path : str or os.PathLike
        The DXF file.
    choose : int or str, optional
        Which closed polyline, when there are several: index, handle or
        layer name (see :func:`choose_outline`). The only one is taken
        without a choice.
    unit : str, optional
        Drawing unit, overriding the header's ``$INSUNITS`` (which, when
        0, is read as millimetres with a warning).
    kind : str
        ``"plane"`` or ``"axisymmetric"``.
    width : float
        Out-of-plane depth of a plane section [m].
    name : str, optional
        Section name; default the file name without ``.dxf``.
    arc_tolerance : float, optional
        Largest sagitta of flattened arcs [m]; default
        :data:`ARC_SAGITTA_RATIO` of the radius.

    Returns
    -------
    section : Section
        x = drawing x, z = drawing y [m]; parts from a Wetline export, else
        all ``"wall"``.
    warnings : list of str
        What was assumed or changed (units, flattened arcs ...).

    Raises
    ------
    DxfError
        Naming the file and the problem: not DXF, no closed polyline,
        several and no choice, an invalid outline.

    Examples
    --------
    >>> section, warnings = read_outline("sump.dxf", choose="OUTLINE")  # doctest: +SKIP
    """
    path = Path(path)
    outlines = list_outlines(path, unit=unit, arc_tolerance=arc_tolerance)
    outline = choose_outline(outlines, choose, source=path.name)
    if name is None:
        name = path.stem
    try:
        section = outline.to_section(kind=kind, width=width, name=name)
    except DxfError as exc:
        raise DxfError(f"{path.name}: {exc}", edges=exc.edges, vertices=exc.vertices,
                       location=exc.location) from None
    return section, list(outline.warnings)


# ---------------------------------------------------------------- writing
def _layer_name(part: str) -> str:
    """A valid DXF layer name for a part: invalid characters become ``_``."""
    clean = "".join("_" if (c in INVALID_LAYER_NAME_CHARACTERS or ord(c) < 32) else c
                    for c in part.strip())
    return PART_LAYER_PREFIX + (clean or "_")


def write_outline(section: Section, path: str | os.PathLike[str], *, unit: str = "m") -> None:
    """Write a section's outline to a DXF file (AutoCAD 2010 format).

    Parameters
    ----------
    section : Section
    path : str or os.PathLike
        The file to write; replaced atomically (a temporary file in the same
        folder, then a rename), so a failure never leaves half a file.
    unit : str
        Drawing unit of the coordinates written (``"m"``, ``"mm"``, ``"in"``
        ...); stated in the header's ``$INSUNITS``.

    Raises
    ------
    DxfError
        If `unit` is unknown or has no ``$INSUNITS`` code.

    Notes
    -----
    The drawing holds one ``LINE`` per edge, in edge order, on the layer
    ``WETLINE-<part>`` (characters DXF forbids in layer names become ``_``;
    the exact part name rides along as extended data of application
    ``WETLINE``), and the whole outline as one closed ``LWPOLYLINE`` on
    layer :data:`OUTLINE_LAYER`. Drawing x = section x, drawing y = section
    z. :func:`read_outline` on the file gives the same vertices (to the
    rounding of one unit conversion) and the same parts.
    """
    path = Path(path)
    code = insunits_code(unit)
    if code is None:
        raise DxfError(f"'{unit}' has no DXF unit code; write in mm, cm, m, in or ft")
    scale = length_factor(unit)
    pts = np.asarray(section.outline, dtype=np.float64) / scale
    doc = ezdxf.new("R2010", units=code)
    doc.header["$MEASUREMENT"] = 0 if code in (1, 2, 3, 8, 9, 10, 21, 24) else 1
    doc.appids.add(_APPID)
    msp = doc.modelspace()
    doc.layers.add(OUTLINE_LAYER, color=7)
    colours: dict[str, int] = {}
    for part in section.part_names:
        layer = _layer_name(part)
        if layer.upper() not in colours and layer.upper() != OUTLINE_LAYER:
            colours[layer.upper()] = 1 + len(colours) % 6
            if not doc.layers.has_entry(layer):
                doc.layers.add(layer, color=colours[layer.upper()])
    n = len(pts)
    for i, part in enumerate(section.parts):
        a, b = pts[i], pts[(i + 1) % n]
        line = msp.add_line((float(a[0]), float(a[1])), (float(b[0]), float(b[1])),
                            dxfattribs={"layer": _layer_name(part)})
        line.set_xdata(_APPID, [(1000, part), (1070, min(i, 32767))])
    poly = msp.add_lwpolyline([], close=True, dxfattribs={"layer": OUTLINE_LAYER})
    # All points at once: ezdxf's add_lwpolyline appends them one by one,
    # copying the whole array each time (quadratic: 2 minutes for 200,000).
    poly.lwpoints.set(np.column_stack([pts, np.zeros((n, 3))]))
    poly.set_xdata(_APPID, [(1000, "outline")])
    lo, hi = pts.min(axis=0), pts.max(axis=0)
    doc.header["$EXTMIN"] = (float(lo[0]), float(lo[1]), 0.0)
    doc.header["$EXTMAX"] = (float(hi[0]), float(hi[1]), 0.0)
    span = float(max(hi[1] - lo[1], (hi[0] - lo[0]) * 0.7, 1e-9))
    doc.set_modelspace_vport(height=1.2 * span,
                             center=(float(lo[0] + hi[0]) / 2, float(lo[1] + hi[1]) / 2))

    with atomic_path(path) as tmp:
        doc.saveas(tmp)
