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
- **Arcs.** A polyline segment with a bulge is a circular arc. It is
  flattened into straight edges whose vertices lie on the arc and whose
  sagitta (largest gap between a chord and the arc) is at most
  ``arc_tolerance`` [m], by default :data:`ARC_SAGITTA_RATIO` (0.1 %) of the
  arc's radius; the outline carries a warning saying how many arcs became
  how many edges. The arc's centre and radius come from
  :func:`ezdxf.math.bulge_to_arc`, the number of chords from
  :func:`ezdxf.math.arc_segment_count`.
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

import math
from dataclasses import dataclass
from pathlib import Path

import ezdxf
import ezdxf.math
import numpy as np
from ezdxf.lldxf.validator import INVALID_LAYER_NAME_CHARACTERS

from .atomic_write import atomic_path
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

    def __init__(self, message, *, edges=(), vertices=(), location=None):
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
    parts: tuple | None
    area: float
    bounds: tuple
    n_arcs: int = 0
    warnings: tuple = ()
    unit_assumed: bool = False

    @property
    def n_vertices(self):
        """Number of vertices (= number of edges)."""
        return int(self.vertices.shape[0])

    @property
    def size(self):
        """Width and height of the bounding box, ``(dx, dz)`` [m]."""
        x0, z0, x1, z1 = self.bounds
        return (x1 - x0, z1 - z0)

    def describe(self):
        """A short line for lists and messages.

        Examples
        --------
        ``"#0 layer OUTLINE (LWPOLYLINE 2F), 6 vertices, 2400 x 2800 mm"``
        """
        f = length_factor(self.unit)
        dx, dz = self.size
        return (f"#{self.index} layer {self.layer} ({self.entity} {self.handle}), "
                f"{self.n_vertices} vertices, {dx / f:.6g} x {dz / f:.6g} {self.unit}")

    def to_section(self, *, kind="plane", width=1.0, name=""):
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
def _unit_name(unit):
    """Short name of a pint length unit, for files and messages."""
    canonical = str(ureg.parse_units(unit))
    return _SHORT_UNIT.get(canonical, unit.strip())


def insunits_code(unit):
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


def _drawing_unit(doc, name, unit):
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
def _open(path):
    """Read the DXF document at ``path``; DxfError naming the file if not."""
    path = Path(path)
    name = path.name
    try:
        with open(path, "rb") as fh:
            head = fh.read(6)
    except FileNotFoundError:
        raise DxfError(f"{path}: no such file") from None
    except IsADirectoryError:
        raise DxfError(f"{path}: is a folder, not a DXF file") from None
    except OSError as exc:
        raise DxfError(f"{path}: cannot be read ({exc.strerror})") from None
    if head.startswith(b"AC10"):
        raise DxfError(f"{name} is a DWG file, not DXF; save it as DXF in the CAD program")
    try:
        return ezdxf.readfile(path)
    except ezdxf.DXFStructureError as exc:
        reason = " ".join(str(exc).split())  # one line, whatever ezdxf wrote
        raise DxfError(f"{name} is not a readable DXF file ({reason})") from None
    except (OSError, UnicodeDecodeError, ValueError):
        raise DxfError(f"{name} is not a DXF file") from None


def _plural(n, word, words=None):
    """``"1 edge"``, ``"3 edges"``; ``words`` for irregular plurals."""
    return f"{n} {word}" if n == 1 else f"{n} {words or word + 's'}"


def _polyline_points(entity):
    """``(x, y, bulge)`` rows of a 2D polyline in its OCS, and its closed flag."""
    if entity.dxftype() == "LWPOLYLINE":
        rows = [(float(x), float(y), float(b)) for x, y, b in entity.get_points("xyb")]
        return rows, bool(entity.closed)
    rows = []
    for v in entity.vertices:
        if v.dxf.flags & 16:  # spline frame control point: not on the curve
            continue
        loc = v.dxf.location
        rows.append((float(loc.x), float(loc.y), float(v.dxf.get("bulge", 0.0))))
    return rows, bool(entity.is_closed)


def _elevation(entity):
    if entity.dxftype() == "LWPOLYLINE":
        return float(entity.dxf.get("elevation", 0.0))
    return float(entity.dxf.get("elevation", (0.0, 0.0, 0.0))[2])


def _flatten(rows, sagitta):
    """Vertices of a closed polyline with its arcs replaced by chords.

    ``sagitta(radius)`` gives the largest sagitta allowed for an arc of that
    radius, in drawing units. Returns the (M, 2) points in the OCS, the number
    of arcs and the number of chords they became.
    """
    out = []
    n_arcs = n_chords = 0
    n = len(rows)
    for i in range(n):
        x0, y0, bulge = rows[i]
        x1, y1, _ = rows[(i + 1) % n]
        out.append((x0, y0))
        if bulge == 0.0 or (x0 == x1 and y0 == y1):
            continue
        centre, _, _, radius = ezdxf.math.bulge_to_arc((x0, y0), (x1, y1), bulge)
        sweep = 4.0 * math.atan(bulge)  # signed included angle, + counter-clockwise
        count = max(ezdxf.math.arc_segment_count(radius, abs(sweep), sagitta(radius)), 1)
        start = math.atan2(y0 - centre.y, x0 - centre.x)
        for k in range(1, count):
            a = start + sweep * k / count
            out.append((centre.x + radius * math.cos(a), centre.y + radius * math.sin(a)))
        n_arcs += 1
        n_chords += count
    return np.array(out, dtype=np.float64).reshape(-1, 2), n_arcs, n_chords


def _drop_repeats(pts, tol):
    """Drop vertices within ``tol`` of the one before (cyclically).

    Returns the kept points and the number dropped.
    """
    if len(pts) == 0:
        return pts, 0
    dropped = 0
    keep = [pts[0]]
    for p in pts[1:]:
        if np.hypot(*(p - keep[-1])) > tol:
            keep.append(p)
        else:
            dropped += 1
    if len(keep) > 1 and np.hypot(*(keep[-1] - keep[0])) <= tol:
        keep.pop()
        dropped += 1
    return np.array(keep).reshape(-1, 2), dropped


def _part_lines(msp):
    """Map from a LINE's end points to its Wetline part name.

    A line counts when it carries Wetline extended data (the exact part
    name) or lies on a ``WETLINE-*`` layer other than the outline layer.
    Returns a list of ``(start_xy, end_xy, part)``.
    """
    lines = []
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
            lines.append(((float(s.x), float(s.y)), (float(t.x), float(t.y)), part))
    return lines


def _match_parts(pts, lines, tol):
    """Parts of the edges of the closed outline ``pts`` (drawing units) from
    the part lines; returns (parts or None, number of edges unmatched)."""
    if not lines:
        return None, len(pts)

    def key(p):
        return (round(p[0] / tol), round(p[1] / tol))

    table = {}
    for a, b, part in lines:
        table.setdefault((key(a), key(b)), part)
        table.setdefault((key(b), key(a)), part)
    parts = []
    missing = 0
    n = len(pts)
    for i in range(n):
        part = table.get((key(pts[i]), key(pts[(i + 1) % n])))
        if part is None:
            missing += 1
        parts.append(part)
    return (tuple(parts) if missing == 0 else None), missing


def _scan(path, unit, arc_tolerance):
    """Every closed 2D polyline of the drawing, plus what else it holds."""
    path = Path(path)
    name = path.name
    if arc_tolerance is not None:
        if (isinstance(arc_tolerance, bool) or not isinstance(arc_tolerance, (int, float))
                or not math.isfinite(arc_tolerance) or arc_tolerance <= 0):
            raise DxfError(f"arc tolerance must be a positive length in metres, "
                           f"not {arc_tolerance!r}")
    doc = _open(path)
    unit, drawing_warnings, assumed = _drawing_unit(doc, name, unit)
    scale = length_factor(unit)
    msp = doc.modelspace()

    if arc_tolerance is None:
        def sagitta(radius):
            return ARC_SAGITTA_RATIO * radius
    else:
        def sagitta(radius, t=arc_tolerance / scale):
            return t

    found = {}      # (singular, plural, layer) -> count, of polylines not outlines
    others = {}     # entity type -> count, of other drawing entities
    outlines = []
    rejected = []   # closed polylines with too few vertices
    lines = None
    for entity in msp:
        kind = entity.dxftype()
        if kind not in ("LWPOLYLINE", "POLYLINE"):
            if kind in ("LINE", "ARC", "CIRCLE", "SPLINE", "ELLIPSE", "INSERT"):
                others[kind] = others.get(kind, 0) + 1
            continue
        layer = entity.dxf.layer
        if kind == "POLYLINE" and not entity.is_2d_polyline:
            what = "3D POLYLINE" if entity.is_3d_polyline else "mesh POLYLINE"
            key = (what, what + "s", layer)
            found[key] = found.get(key, 0) + 1
            continue
        extrusion = ezdxf.math.Vec3(entity.dxf.get("extrusion", (0.0, 0.0, 1.0)))
        if not extrusion.is_null and not extrusion.normalize().isclose((0, 0, 1)) \
                and not extrusion.normalize().isclose((0, 0, -1)):
            key = (f"{kind} out of the drawing plane", f"{kind}s out of the drawing plane",
                   layer)
            found[key] = found.get(key, 0) + 1
            continue
        rows, closed = _polyline_points(entity)
        raw = np.array([r[:2] for r in rows], dtype=np.float64).reshape(-1, 2)
        extent = float(np.max(np.abs(raw))) if raw.size else 0.0
        tol = _SAME_POINT * (extent or 1.0)
        if not closed and len(rows) >= 2 and np.hypot(*(raw[-1] - raw[0])) <= tol:
            closed = True
        if not closed:
            key = (f"open {kind}", f"open {kind}s", layer)
            found[key] = found.get(key, 0) + 1
            continue
        if len(rows) >= 2 and np.hypot(*(raw[-1] - raw[0])) <= tol:
            rows = rows[:-1]  # a repeated closing vertex: its bulge spans nothing
        pts, n_arcs, n_chords = _flatten(rows, sagitta)
        pts, dropped = _drop_repeats(pts, tol)
        handle = entity.dxf.handle
        if len(pts) < 3:
            rejected.append(f"closed {kind} {handle} on layer {layer} with only "
                            f"{_plural(len(pts), 'distinct vertex', 'distinct vertices')}")
            continue
        warnings = list(drawing_warnings)
        if dropped:
            warnings.append(f"{_plural(dropped, 'repeated vertex', 'repeated vertices')}"
                            " dropped")
        if n_arcs:
            how = (f"chords within {ARC_SAGITTA_RATIO:.1%} of the arc's radius"
                   if arc_tolerance is None else
                   f"chords within {arc_tolerance:g} m of the arc")
            warnings.append(f"{_plural(n_arcs, 'arc segment')} flattened into "
                            f"{_plural(n_chords, 'straight edge')} ({how})")
        ocs = entity.ocs()
        if ocs.transform:
            z = _elevation(entity)
            pts = np.array([(v.x, v.y) for v in ocs.points_to_wcs(
                [(x, y, z) for x, y in pts])], dtype=np.float64)
        if lines is None:
            lines = _part_lines(msp)
        parts, missing = _match_parts(pts, lines, tol)
        from_wetline = layer.upper() == OUTLINE_LAYER or entity.has_xdata(_APPID)
        if parts is None and from_wetline:
            warnings.append(f"{_plural(missing, 'edge')} of this Wetline outline "
                            "{} no part line; parts not recovered (all 'wall')".format(
                                "has" if missing == 1 else "have"))
        vertices = to_si_exactly(pts, scale)
        vertices.setflags(write=False)
        x, z = vertices[:, 0], vertices[:, 1]
        area = 0.5 * abs(float(np.dot(x, np.roll(z, -1)) - np.dot(np.roll(x, -1), z)))
        bounds = (float(x.min()), float(z.min()), float(x.max()), float(z.max()))
        if assumed and max(bounds[2] - bounds[0], bounds[3] - bounds[1]) < 0.05:
            warnings.append(
                f"read as millimetres the outline is only "
                f"{max(bounds[2] - bounds[0], bounds[3] - bounds[1]) * 1000:.3g} mm across; "
                "if the drawing is in metres, give the unit m")
        outlines.append(DxfOutline(
            index=len(outlines), handle=handle, layer=layer, entity=kind, unit=unit,
            vertices=vertices, parts=parts, area=area, bounds=bounds, n_arcs=n_arcs,
            warnings=tuple(warnings), unit_assumed=assumed))
    return outlines, found, others, rejected


def _nothing_found(name, found, others, rejected):
    """The message for a drawing with no usable closed polyline."""
    bits = [f"{_plural(n, one, many)} on layer {layer}"
            for (one, many, layer), n in found.items()]
    bits += rejected
    if bits:
        shown = bits[:6] + ([f"{len(bits) - 6} more"] if len(bits) > 6 else [])
        what = "closed polyline with 3 or more vertices" if rejected else "closed polyline"
        message = f"{name} has no {what} (found {', '.join(shown)})"
    else:
        message = f"{name} has no closed polyline in its modelspace"
    hints = []
    loose = [_plural(others[k], k) for k in ("LINE", "ARC", "SPLINE", "ELLIPSE", "CIRCLE")
             if k in others]
    if loose:
        hints.append(f"it holds {', '.join(loose)}: join the outline into one closed "
                     "polyline in the CAD program")
    if "INSERT" in others:
        hints.append(f"{_plural(others['INSERT'], 'block reference')} not searched: "
                     "explode them first")
    if hints:
        message += "; " + "; ".join(hints)
    return message


def list_outlines(path, *, unit=None, arc_tolerance=None):
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
        Largest sagitta of the chords that replace arc segments [m].
        Default: :data:`ARC_SAGITTA_RATIO` of each arc's radius.

    Returns
    -------
    list of DxfOutline
        In drawing order, ``index`` 0, 1, 2 ...; never empty.

    Raises
    ------
    DxfError
        If the file is missing or not DXF, its units cannot be converted, or
        it holds no closed polyline; the message then says what it holds
        ("drawing.dxf has no closed polyline (found 3 open LWPOLYLINEs on
        layer WALLS)").

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
    outlines, found, others, rejected = _scan(path, unit, arc_tolerance)
    if not outlines:
        raise DxfError(_nothing_found(Path(path).name, found, others, rejected))
    return outlines


def _listing(outlines, limit=8):
    shown = "; ".join(o.describe() for o in outlines[:limit])
    if len(outlines) > limit:
        shown += f"; and {len(outlines) - limit} more"
    return shown


def choose_outline(outlines, choose=None, *, source="the drawing"):
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


def read_outline(path, *, choose=None, unit=None, kind="plane", width=1.0, name=None,
                 arc_tolerance=None):
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
def _layer_name(part):
    """A valid DXF layer name for a part: invalid characters become ``_``."""
    clean = "".join("_" if (c in INVALID_LAYER_NAME_CHARACTERS or ord(c) < 32) else c
                    for c in part.strip())
    return PART_LAYER_PREFIX + (clean or "_")


def write_outline(section, path, *, unit="m"):
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
    colours = {}
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
    poly = msp.add_lwpolyline([(float(x), float(z)) for x, z in pts], format="xy",
                              close=True, dxfattribs={"layer": OUTLINE_LAYER})
    poly.set_xdata(_APPID, [(1000, "outline")])
    lo, hi = pts.min(axis=0), pts.max(axis=0)
    doc.header["$EXTMIN"] = (float(lo[0]), float(lo[1]), 0.0)
    doc.header["$EXTMAX"] = (float(hi[0]), float(hi[1]), 0.0)
    span = float(max(hi[1] - lo[1], (hi[0] - lo[0]) * 0.7, 1e-9))
    doc.set_modelspace_vport(height=1.2 * span,
                             center=(float(lo[0] + hi[0]) / 2, float(lo[1] + hi[1]) / 2))

    with atomic_path(path) as tmp:
        doc.saveas(tmp)
