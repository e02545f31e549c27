"""The container cross-section: a validated, immutable outline with parts.

A :class:`Section` is the boundary of the cavity the liquid can occupy, as a
closed polygon of ``[x, z]`` vertices in metres (x to the right, z up), one
part name per edge, and the geometry kind:

- ``"plane"``: a prismatic section ``width`` deep out of the drawing;
- ``"axisymmetric"``: a half-section revolved about the vertical axis
  ``x = 0``, so x is the radius.

Edge *i* runs from vertex *i* to vertex *i + 1*; the last edge closes the
outline. The file's vertex order and direction are kept (results are reported
edge by edge in that order); the winding is only recorded, as
:attr:`Section.orientation`, so that outward normals point from the liquid
into the wall whichever way the outline was drawn.

Everything here is validated on construction. A fault raises
:class:`SectionError` whose message says what is wrong and where ("outline
crosses itself between edges 2 and 5"); the error also carries the edge and
vertex indices and a location, so a drawing view can mark the spot.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field
from functools import cached_property
from typing import TYPE_CHECKING, Any

import numpy as np
import numpy.typing as npt

from . import limits
from .number_input import number_text, range_text

if TYPE_CHECKING:  # pragma: no cover - types only
    from .fill import VolumeCurve
    from .pockets import PocketTree

__all__ = [
    "AXIS",
    "FLOOR",
    "OPEN",
    "RESERVED_PARTS",
    "KINDS",
    "Section",
    "SectionError",
    "too_many_vertices",
    "EdgeGeometry",
]

OPEN = "open"
"""Part name of an opening to the atmosphere; its lowest point is the spill level."""
FLOOR = "floor"
"""Part name of the part weighed on its own; its downward load is the floor force."""
AXIS = "axis"
"""Part name of an edge on the axis of an axisymmetric section; carries nothing."""
RESERVED_PARTS = (OPEN, FLOOR, AXIS)
KINDS = ("plane", "axisymmetric")

FloatArray = npt.NDArray[np.float64]

_AXIS_TOL = 1e-12
"""Relative tolerance [] (of the outline's size) for "lies on x = 0"."""


class SectionError(ValueError):
    """A section that cannot be built, with a message saying what and where.

    Attributes
    ----------
    edges : tuple of int
        Indices of the edges at fault (may be empty).
    vertices : tuple of int
        Indices of the vertices at fault (may be empty).
    location : tuple of float or None
        A point [m] near the fault, for marking it on a drawing.
    """

    def __init__(self, message: str, *, edges: Iterable[int] = (),
                 vertices: Iterable[int] = (),
                 location: Sequence[float] | FloatArray | None = None) -> None:
        super().__init__(message)
        self.edges = tuple(int(i) for i in edges)
        self.vertices = tuple(int(i) for i in vertices)
        self.location = None if location is None else (float(location[0]), float(location[1]))


@dataclass(frozen=True)
class EdgeGeometry:
    """Level-independent per-edge arrays, computed once per section.

    All arrays have one entry per edge, in file order. Lengths in [m].
    ``x0, z0`` start vertex; ``dx, dz`` edge vector; ``length``; ``nx, nz``
    unit outward normal (from the liquid into the wall); ``z_low`` height of
    the lower end; ``inv_abs_dz`` 1/|dz| (a huge finite number on horizontal
    edges, which makes their wetted fraction a clean 0 or 1); ``falls``
    1.0 where the edge runs downward (its wetted part starts away from the
    start vertex), else 0.0; ``part_index`` index into
    :attr:`Section.part_names`.
    """

    x0: FloatArray
    z0: FloatArray
    dx: FloatArray
    dz: FloatArray
    length: FloatArray
    nx: FloatArray
    nz: FloatArray
    z_low: FloatArray
    inv_abs_dz: FloatArray
    falls: FloatArray
    part_index: npt.NDArray[np.intp]
    vertex_z: FloatArray
    """Vertex heights [m] with the first repeated at the end (N + 1 values)."""


def _readonly(values: npt.ArrayLike) -> FloatArray:
    a = np.array(values, dtype=np.float64, copy=True)
    a.setflags(write=False)
    return a


_DERIVED_ARRAYS = ("geometry", "volume_curve", "pocket_tree")
"""Cached properties of a :class:`Section` that hold arrays as long as the outline."""


@dataclass(frozen=True, eq=False)
class Section:
    """A validated container cross-section.

    Build it with :meth:`Section.build`, which checks everything and raises
    :class:`SectionError`; the constructor itself is for trusted values.

    Parameters
    ----------
    outline : numpy.ndarray
        (N, 2) vertices ``[x, z]`` [m], read-only, in the order given.
    parts : tuple of str
        One part name per edge; edge *i* runs from vertex *i* to *i + 1*.
    kind : str
        ``"plane"`` or ``"axisymmetric"``.
    width : float
        Out-of-plane depth of a plane section [m]; 1.0 gives results per
        metre. Ignored (kept as 1.0) for axisymmetric sections.
    name : str
        Free text for titles.

    Examples
    --------
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> s.area, s.spill_level, s.n_edges
    (6.0, 3.0, 4)
    """

    outline: FloatArray
    parts: tuple[str, ...]
    kind: str = "plane"
    width: float = 1.0
    name: str = ""
    orientation: float = field(default=1.0)
    """+1.0 if the outline runs counter-clockwise (x right, z up), else -1.0."""

    # ------------------------------------------------------------------ build
    @classmethod
    def build(cls, outline: npt.ArrayLike, parts: Sequence[str] | None = None,
              kind: str = "plane", width: float = 1.0, name: str = "") -> Section:
        """Validate the inputs and return a :class:`Section`.

        Parameters
        ----------
        outline : array_like
            (N, 2) vertices ``[x, z]`` [m]; closed implicitly.
        parts : sequence of str, optional
            One name per edge; default all ``"wall"``.
        kind : str
            ``"plane"`` or ``"axisymmetric"``.
        width : float
            Out-of-plane depth [m] (plane only), > 0.
        name : str
            Free text.

        Raises
        ------
        SectionError
            With a one-line message naming the fault and where it is.
        """
        _check_kind(kind)
        pts = _vertex_array(outline)
        _check_vertex_count(pts)
        _check_finite(pts)
        _check_coordinate_range(pts)
        _check_distinct(pts)
        _check_extent(pts)
        names = _checked_parts(parts, pts.shape[0])
        width = _checked_width(width, kind)
        nxt = np.roll(pts, -1, axis=0)
        _check_edge_lengths(pts, nxt)
        size = float(np.max(np.abs(pts))) or 1.0
        _check_axis_edges(pts, nxt, names, kind, size)
        _check_simple(pts, size)
        return cls(outline=_readonly(pts), parts=names, kind=kind, width=width,
                   name=str(name), orientation=_orientation(pts, nxt))

    # ---------------------------------------------------------- equality
    def __eq__(self, other: object) -> bool:
        if not isinstance(other, Section):
            return NotImplemented
        return (self.kind == other.kind and self.width == other.width
                and self.name == other.name and self.parts == other.parts
                and np.array_equal(self.outline, other.outline))

    __hash__ = None  # type: ignore[assignment]  # equal by value, holds an array

    def replace(self, **changes: Any) -> Section:
        """Return a validated copy with some fields changed (see :meth:`build`)."""
        args: dict[str, Any] = dict(outline=self.outline, parts=self.parts, kind=self.kind,
                                    width=self.width, name=self.name)
        args.update(changes)
        return Section.build(**args)

    def forget_derived(self) -> None:
        """Drop the cached per-edge arrays (:attr:`geometry`, :attr:`volume_curve`,
        :attr:`pocket_tree`);
        they are computed again when next needed, with the same values.

        An undo history keeps many sections it does not compute with: without
        these arrays each costs little more than its outline.

        >>> s = Section.build([(0, 0), (2, 0), (2, 1), (0, 1)])
        >>> s.geometry.length.tolist()
        [2.0, 1.0, 2.0, 1.0]
        >>> s.forget_derived()
        >>> "geometry" in vars(s)
        False
        >>> s.geometry.length.tolist()
        [2.0, 1.0, 2.0, 1.0]
        """
        for name in _DERIVED_ARRAYS:
            self.__dict__.pop(name, None)

    # ---------------------------------------------------------- properties
    @property
    def n_edges(self) -> int:
        """Number of edges (= number of vertices)."""
        return int(self.outline.shape[0])

    @property
    def is_axisymmetric(self) -> bool:
        """True for a half-section revolved about x = 0."""
        return self.kind == "axisymmetric"

    @cached_property
    def part_names(self) -> tuple[str, ...]:
        """Distinct part names, in order of first appearance (tuple of str)."""
        return tuple(dict.fromkeys(self.parts))

    @cached_property
    def loaded_part_names(self) -> tuple[str, ...]:
        """Part names that carry load: all but ``open`` and ``axis``."""
        return tuple(p for p in self.part_names if p not in (OPEN, AXIS))

    @cached_property
    def z_min(self) -> float:
        """Height of the lowest vertex [m]."""
        return float(self.outline[:, 1].min())

    @cached_property
    def z_max(self) -> float:
        """Height of the highest vertex [m]."""
        return float(self.outline[:, 1].max())

    @cached_property
    def is_open(self) -> bool:
        """True if any edge is an ``open`` part (the section can spill)."""
        return OPEN in self.parts

    @cached_property
    def spill_level(self) -> float | None:
        """Lowest point of all ``open`` edges [m], or None for a closed section."""
        if not self.is_open:
            return None
        idx = np.flatnonzero(self.geometry.part_index == self.part_names.index(OPEN))
        z = self.outline[:, 1]
        return float(min(z[idx].min(), z[(idx + 1) % self.n_edges].min()))

    @cached_property
    def top_level(self) -> float:
        """The highest level the cavity can be filled to without spilling or
        pressurising: the spill level if open, else the top of the outline [m]."""
        spill = self.spill_level
        return self.z_max if spill is None else spill

    @cached_property
    def area(self) -> float:
        """Enclosed area of the outline [m2], positive.

        .. math:: A = \\tfrac12 \\left|\\sum_i (x_i z_{i+1} - x_{i+1} z_i)\\right|
        """
        x, z = self.outline[:, 0], self.outline[:, 1]
        return 0.5 * abs(float(np.dot(x, np.roll(z, -1)) - np.dot(np.roll(x, -1), z)))

    @cached_property
    def volume_curve(self) -> VolumeCurve:
        """Volumes at the distinct vertex heights (see :func:`wetline.core.fill.volume_curve`)."""
        from .fill import volume_curve

        curve: VolumeCurve = volume_curve(self)
        return curve

    @cached_property
    def pocket_tree(self) -> PocketTree:
        """Where the rising liquid can trap air (see
        :func:`wetline.core.pockets.find_pockets`), found once per section."""
        from .pockets import find_pockets

        tree: PocketTree = find_pockets(self)
        return tree

    @cached_property
    def geometry(self) -> EdgeGeometry:
        """Level-independent per-edge arrays (:class:`EdgeGeometry`)."""
        pts = self.outline
        x0 = np.ascontiguousarray(pts[:, 0])
        z0 = np.ascontiguousarray(pts[:, 1])
        x1 = np.roll(x0, -1)
        z1 = np.roll(z0, -1)
        dx = x1 - x0
        dz = z1 - z0
        length = np.sqrt(dx * dx + dz * dz)
        s = self.orientation
        nx = s * dz / length
        nz = -s * dx / length
        z_low = np.minimum(z0, z1)  # not z0 + dz, which may miss z1 by an ulp
        abs_dz = np.abs(dz)
        inv_abs_dz = np.full_like(dz, 1e200)
        np.divide(1.0, abs_dz, out=inv_abs_dz, where=abs_dz > 0)
        falls = (dz < 0).astype(np.float64)
        index = {p: k for k, p in enumerate(self.part_names)}
        part_index = np.fromiter(map(index.__getitem__, self.parts), dtype=np.intp,
                                 count=len(self.parts))
        vertex_z = np.append(z0, z0[0])
        arrays = dict(x0=x0, z0=z0, dx=dx, dz=dz, length=length, nx=nx, nz=nz,
                      z_low=z_low, inv_abs_dz=inv_abs_dz, falls=falls,
                      part_index=part_index, vertex_z=vertex_z)
        for a in arrays.values():
            a.setflags(write=False)
        return EdgeGeometry(**arrays)


# ------------------------------------------------------------- the checks
# Section.build runs these in this order; the first fault found is reported.


def _check_kind(kind: object) -> None:
    if kind not in KINDS:
        raise SectionError(f"geometry kind must be 'plane' or 'axisymmetric', not {kind!r}")


def _vertex_array(outline: object) -> FloatArray:
    """The outline as an (N, 2) float array [m]."""
    try:
        pts = np.array(outline, dtype=np.float64)
    except (TypeError, ValueError):
        raise SectionError("outline must be a list of [x, z] number pairs") from None
    if pts.ndim != 2 or pts.shape[1] != 2:
        raise SectionError("outline must be a list of [x, z] number pairs")
    return pts


def too_many_vertices(n: int) -> str:
    """The message refusing an outline of ``n`` vertices, more than
    :data:`~wetline.core.limits.MAX_VERTICES`."""
    return f"outline has {n} vertices; Wetline computes with at most {limits.MAX_VERTICES}"


def _check_vertex_count(pts: FloatArray) -> None:
    if pts.shape[0] > limits.MAX_VERTICES:
        raise SectionError(too_many_vertices(pts.shape[0]))


def _check_finite(pts: FloatArray) -> None:
    bad = np.flatnonzero(~np.isfinite(pts).all(axis=1))
    if bad.size:
        i = int(bad[0])
        raise SectionError(f"vertex {i} has a non-finite coordinate", vertices=(i,))


def _check_coordinate_range(pts: FloatArray) -> None:
    """|x|, |z| <= COORDINATE_LIMIT and each 0 or >= SMALLEST_COORDINATE [m]."""
    size = np.abs(pts)
    limit, smallest = limits.COORDINATE_LIMIT, limits.SMALLEST_COORDINATE
    large = size > limit
    bad = np.flatnonzero((large | ((size < smallest) & (size > 0))).ravel())
    if not bad.size:
        return
    i, axis = divmod(int(bad[0]), 2)
    where = f"vertex {i} has {'xz'[axis]} = {pts[i, axis]:g} m"
    if large[i, axis]:
        raise SectionError(f"{where}, outside {range_text(-limit, limit, 'm')}",
                           vertices=(i,), location=None)
    raise SectionError(f"{where}; a coordinate is 0 or at least {number_text(smallest)} m "
                       "in size", vertices=(i,), location=pts[i])


def _check_extent(pts: FloatArray) -> None:
    """Width and height of the outline within EXTENT_RANGE [m], and at least
    SMALLEST_RELATIVE_EXTENT of the outline's distance from the axes (a zero
    extent is left to the checks of area and self-intersection, which say
    more)."""
    lo, hi = limits.EXTENT_RANGE
    for axis, word, name in ((0, "wide", "x"), (1, "high", "z")):
        extent = float(np.ptp(pts[:, axis]))
        if extent > 0 and not lo <= extent <= hi:
            raise SectionError(f"outline is {extent:g} m {word}; an outline's width and "
                               f"height must be {range_text(lo, hi, 'm')}")
        reach = float(np.max(np.abs(pts[:, axis])))
        if extent > 0 and extent < limits.SMALLEST_RELATIVE_EXTENT * reach:
            raise SectionError(
                f"outline is {extent:g} m {word} but reaches {name} = {reach:g} m; so far "
                f"out it must be at least {number_text(limits.SMALLEST_RELATIVE_EXTENT)} of "
                "that, or its numbers lose their precision")


def _check_distinct(pts: FloatArray) -> None:
    distinct = _distinct_up_to_3(pts)
    if distinct < 3:
        raise SectionError(f"outline has {distinct} distinct vertices, need at least 3")


def _checked_parts(parts: Sequence[str] | None, n: int) -> tuple[str, ...]:
    """One part name per edge (default all ``"wall"``)."""
    if parts is None:
        return ("wall",) * n
    if isinstance(parts, str):
        raise SectionError("parts must be a list of names, one per edge")
    names = tuple(parts)
    # (Checked over the distinct names and types: a drag step builds a
    # section of the same 10,000 names again, and a Python loop over them
    # cost milliseconds.)
    if not all(issubclass(t, str) for t in set(map(type, names))):
        raise SectionError("parts must be a list of names, one per edge")
    if len(names) != n:
        raise SectionError(f"parts has {len(names)} names but the outline has {n} edges")
    if not all(p.strip() for p in set(names)):
        i = next(i for i, p in enumerate(names) if not p.strip())
        raise SectionError(f"edge {i} has an empty part name", edges=(i,))
    return names


def _checked_width(width: object, kind: str) -> float:
    """The width [m] as a float: 1.0 for axisymmetric sections."""
    if isinstance(width, bool) or not isinstance(width, (int, float, np.floating)):
        raise SectionError("width must be a number")
    value = float(width)
    if kind == "axisymmetric":
        return 1.0
    if not (np.isfinite(value) and value > 0):
        raise SectionError(f"width must be positive, not {value:g}")
    lo, hi = limits.WIDTH_RANGE
    if not lo <= value <= hi:
        raise SectionError(f"width must be {range_text(lo, hi, 'm')}, not {value:g} m")
    return value


def _check_edge_lengths(pts: FloatArray, nxt: FloatArray) -> None:
    zero = np.flatnonzero(((nxt - pts) == 0).all(axis=1))
    if zero.size:
        i = int(zero[0])
        j = (i + 1) % pts.shape[0]
        raise SectionError(
            f"edge {i} has zero length (vertices {i} and {j} coincide)",
            edges=(i,), vertices=(i, j), location=pts[i])


def _check_axis_edges(pts: FloatArray, nxt: FloatArray, parts: tuple[str, ...], kind: str,
                      size: float) -> None:
    """x >= 0 and ``axis`` edges on x = 0 (axisymmetric); no ``axis`` (plane)."""
    if kind != "axisymmetric":
        if AXIS in parts:
            i = parts.index(AXIS)
            raise SectionError(
                f"edge {i} is marked 'axis', which only an axisymmetric section has",
                edges=(i,))
        return
    neg = np.flatnonzero(pts[:, 0] < 0)
    if neg.size:
        i = int(neg[0])
        raise SectionError(
            f"vertex {i} has x = {pts[i, 0]:g} m < 0; an axisymmetric outline "
            "lies at x >= 0 (x is the radius)", vertices=(i,), location=pts[i])
    for i, p in enumerate(parts):
        if p == AXIS and (abs(pts[i, 0]) > _AXIS_TOL * size
                          or abs(nxt[i, 0]) > _AXIS_TOL * size):
            raise SectionError(
                f"edge {i} is marked 'axis' but does not lie on x = 0",
                edges=(i,), location=pts[i])


def _orientation(pts: FloatArray, nxt: FloatArray) -> float:
    """+1.0 counter-clockwise, -1.0 clockwise; a SectionError if no area."""
    twice_area = float(np.dot(pts[:, 0], nxt[:, 1]) - np.dot(nxt[:, 0], pts[:, 1]))
    if not twice_area > 0 and not twice_area < 0:
        raise SectionError("outline encloses no area (its vertices lie on one line)")
    return 1.0 if twice_area > 0 else -1.0


def _distinct_up_to_3(pts: FloatArray) -> int:
    """Number of distinct vertices, counted up to 3 (O(N), no sort)."""
    if pts.shape[0] == 0:
        return 0
    same0 = (pts == pts[0]).all(axis=1)
    if same0.all():
        return 1
    other = pts[int(np.argmin(same0))]
    return 2 if (same0 | (pts == other).all(axis=1)).all() else 3


def _check_simple(pts: FloatArray, size: float) -> None:
    """Raise SectionError unless the closed polygon ``pts`` is simple."""
    import shapely  # type: ignore[import-untyped]

    ring = shapely.LinearRing(pts)
    if shapely.is_simple(ring):
        return
    n = pts.shape[0]
    nxt = np.roll(pts, -1, axis=0)
    segs = shapely.linestrings(np.stack([pts, nxt], axis=1))
    tree = shapely.STRtree(segs)
    left, right = tree.query(segs, predicate="intersects")
    keep = left < right
    left, right = left[keep], right[keep]
    adjacent = (right - left == 1) | ((left == 0) & (right == n - 1))
    meets = shapely.intersection(segs[left], segs[right])
    # Neighbouring edges always share their common vertex; they are at fault
    # only if they overlap along a stretch (the outline doubles back).
    point_only = shapely.get_type_id(meets) == 0
    bad = ~(adjacent & point_only)
    if not bad.any():  # pragma: no cover - shapely said not simple
        raise SectionError("outline crosses itself")
    k = int(np.flatnonzero(bad)[0])
    i, j = int(left[k]), int(right[k])
    where = shapely.get_coordinates(meets[k])[0]
    if adjacent[k]:
        raise SectionError(
            f"outline doubles back on itself along edges {i} and {j}",
            edges=(i, j), location=where)
    raise SectionError(f"outline crosses itself between edges {i} and {j}",
                       edges=(i, j), location=where)
