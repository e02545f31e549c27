"""The structure around the cavity: self-weight, groundwater, soil, flotation.

A :class:`Structure` is the outer face of the walls, base and roof that hold
the cavity (the :class:`~wetline.core.section.Section`): a closed polygon of
``[x, z]`` vertices [m] around the cavity outline, one part name per outer
edge, and the unit weight of its material. It lives in the cavity's
coordinates and takes its kind (plane or axisymmetric) and width from the
cavity; outer edge *i* runs from vertex *i* to vertex *i + 1*, in the order
given.

Loads from outside, per design situation (all characteristic values):

- **Self-weight** ``G = gamma_c (A_outer - A_cavity) w`` (plane, w the
  width) or ``gamma_c (V_outer - V_cavity)`` (axisymmetric, revolved volumes,
  Pappus: V = 2 pi x_c A), from the exact Green sums of
  :mod:`wetline.core.fill`.
- **Groundwater** at level z_w pushes on every outer edge below it with
  ``p = rho_w g (z_w - z)``. The force on the structure is minus the force
  that water standing inside the outer outline would exert on it, so the
  closed forms of :func:`wetline.core.hydrostatics.solve` are reused as they
  are. Their sum is the buoyancy, ``rho_w g V_submerged`` upward
  (Archimedes), and the horizontal forces of a plane section cancel.
- **Soil on ledges**: every upward-facing outer edge carries the vertical
  effective stress of the soil column above it, up to the ground surface G,

  .. math:: \\sigma'_v(z) = \\gamma_d (G - \\max(z, z_w))^+
            + (\\gamma_{sat} - \\rho_w g) (\\min(G, z_w) - z)^+

  integrated exactly over the edge's horizontal projection (sigma is linear
  in x between the levels z_w and G, where each edge is split). In dry
  ground (no groundwater) z_w is taken as -infinity: the first term becomes
  ``gamma_d (G - z)+`` and the second vanishes. With groundwater above the
  ground surface the first term vanishes and the submerged weight acts over
  the whole depth; the water itself is in the groundwater term. The part of
  an outer edge that spans the cavity's opening (an open tank's mouth)
  carries no soil. Lateral earth pressure is not computed.
- **Flotation** of the whole structure: uplift ``U`` = the upward net
  groundwater force; resistance ``R`` = self-weight + extra weight + soil
  on ledges + anchorage. The liquid inside is a variable action and is not
  counted (favourable variable actions are taken as zero; from memory of
  EN 1990's combination rules). Factor = R / U, checked against the
  required factor (default 1/0.9, :data:`wetline.core.uplift.DEFAULT_REQUIRED_FACTOR`,
  EN 1997-1 UPL).
- **Net upward pressure on the base**: per cavity ``floor`` edge, the
  groundwater pressure on the structure's underside straight below it minus
  the liquid's pressure on the floor, the load a base slab is designed for;
  see :func:`exterior_loads`.

Forces are N per ``width`` for plane sections (``extra_weight`` and
``anchorage`` are entered per metre of width and multiplied by it, like
every force) and totals over the revolution for axisymmetric ones. Signs
follow the cavity's: (fx, fz) is the force on the structure, "down" = -fz.

References: Archimedes' principle, Cengel & Cimbala, *Fluid Mechanics*,
sec. 3-6; effective stress (Terzaghi), e.g. Craig's *Soil Mechanics*,
ch. 3; EN 1991-1-1 Table A.1 (25 kN/m3 reinforced concrete); EN 1997-1
2.4.7.4 (UPL).
"""

from __future__ import annotations

import math
from collections.abc import Sequence, Sized
from dataclasses import dataclass, field
from functools import cached_property
from typing import TYPE_CHECKING, Any

import numpy as np
from numpy.typing import ArrayLike

from . import STANDARD_GRAVITY
from .fill import volume_below
from .hydrostatics import PartLoad, solve
from .limits import (
    COORDINATE_LIMIT,
    DENSITY_RANGE,
    FORCE_LIMIT,
    GRAVITY_RANGE,
    MAX_VERTICES,
    UNIT_WEIGHT_RANGE,
)
from .section import AXIS, FLOOR, OPEN, Section, SectionError
from .uplift import DEFAULT_REQUIRED_FACTOR

if TYPE_CHECKING:
    from .hydrostatics import Solution

__all__ = [
    "DEFAULT_GROUNDWATER_DENSITY",
    "DEFAULT_SOIL_DRY",
    "DEFAULT_SOIL_SATURATED",
    "DEFAULT_UNIT_WEIGHT",
    "MITRE_LIMIT",
    "OUTER_WALL",
    "BasePressure",
    "BasePressures",
    "ExteriorGeometry",
    "Flotation",
    "Ground",
    "Groundwater",
    "Structure",
    "StructureError",
    "StructureLoads",
    "exterior_geometry",
    "exterior_loads",
    "self_weight",
    "soil_stress",
    "structure_record",
    "walls_of_thickness",
]

DEFAULT_UNIT_WEIGHT = 25000.0
"""Unit weight of reinforced concrete [N/m3] (EN 1991-1-1 Table A.1: 25 kN/m3)."""
DEFAULT_SOIL_DRY = 18000.0
"""Unit weight of dry soil [N/m3] (common practice; the site investigation governs)."""
DEFAULT_SOIL_SATURATED = 20000.0
"""Unit weight of saturated soil [N/m3] (common practice; the site investigation governs)."""
DEFAULT_GROUNDWATER_DENSITY = 1000.0
"""Density of groundwater [kg/m3] (common practice)."""
OUTER_WALL = "outer wall"
"""Default part name of an outer edge."""
MITRE_LIMIT = 5.0
"""Longest mitre of :func:`walls_of_thickness`, in wall thicknesses (shapely's default)."""

_REFUSED_PARTS = (OPEN, FLOOR)


class StructureError(ValueError):
    """A structure that cannot be built, with a message saying what and where.

    Attributes
    ----------
    edges, vertices : tuple of int
        Indices of the structure's outer edges and vertices at fault.
    cavity_edges, cavity_vertices : tuple of int
        Indices of the cavity's edges and vertices at fault.
    location : tuple of float or None
        A point [m] near the fault, for marking it on a drawing.
    """

    def __init__(self, message, *, edges=(), vertices=(), cavity_edges=(), cavity_vertices=(),
                 location=None):
        super().__init__(message)
        self.edges = tuple(int(i) for i in edges)
        self.vertices = tuple(int(i) for i in vertices)
        self.cavity_edges = tuple(int(i) for i in cavity_edges)
        self.cavity_vertices = tuple(int(i) for i in cavity_vertices)
        self.location = None if location is None else (float(location[0]), float(location[1]))


def _number(value, what, lo, hi, unit, *, lo_open=False):
    """``value`` as a float in [lo, hi] (or (lo, hi]), else a ValueError naming ``what``."""
    if isinstance(value, bool) or not isinstance(value, (int, float, np.integer, np.floating)):
        raise ValueError(f"{what} must be a number, not {type(value).__name__}")
    v = float(value)
    if not math.isfinite(v):
        raise ValueError(f"{what} must be a finite number, not {v}")
    if v < lo or (lo_open and v == lo) or v > hi:
        if lo_open and lo == 0.0 and v <= 0.0:
            raise ValueError(f"{what} must be positive, not {v:g}")
        if hi == math.inf:
            raise ValueError(f"{what} must be at least {lo:g} {unit}, not {v:g}".replace("  ", " "))
        raise ValueError(f"{what} must be between {lo:g} and {hi:g} {unit}, not {v:g}")
    return v


def _level(value, what):
    return _number(value, what, -COORDINATE_LIMIT, COORDINATE_LIMIT, "m")


def _readonly(a):
    a = np.array(a, dtype=np.float64, copy=True)
    a.setflags(write=False)
    return a


# ----------------------------------------------------------------- ground
@dataclass(frozen=True)
class Ground:
    """The ground around the structure.

    Parameters
    ----------
    level : float
        Height of the ground surface [m], in the cavity's coordinates.
    unit_weight_dry : float
        Unit weight of the soil above the groundwater [N/m3], default
        18000 (common practice; check the site investigation).
    unit_weight_saturated : float
        Unit weight of the soil below the groundwater [N/m3], default
        20000 (common practice). Its submerged (effective) unit weight is
        ``unit_weight_saturated - rho_w g``.

    Examples
    --------
    >>> Ground(4.0).unit_weight_dry
    18000.0
    """

    level: float
    unit_weight_dry: float = DEFAULT_SOIL_DRY
    unit_weight_saturated: float = DEFAULT_SOIL_SATURATED

    def __post_init__(self):
        object.__setattr__(self, "level", _level(self.level, "ground level"))
        lo, hi = UNIT_WEIGHT_RANGE
        for name in ("unit_weight_dry", "unit_weight_saturated"):
            what = "ground " + name.replace("_", " ")
            object.__setattr__(self, name, _number(getattr(self, name), what, lo, hi, "N/m3"))


@dataclass(frozen=True)
class Groundwater:
    """Water standing in the ground outside the structure.

    Parameters
    ----------
    level : float
        Height of the groundwater surface [m].
    density : float
        [kg/m3], default 1000 (common practice).

    Examples
    --------
    >>> Groundwater(3.5).density
    1000.0
    """

    level: float
    density: float = DEFAULT_GROUNDWATER_DENSITY

    def __post_init__(self):
        object.__setattr__(self, "level", _level(self.level, "groundwater level"))
        lo, hi = DENSITY_RANGE
        object.__setattr__(self, "density",
                           _number(self.density, "groundwater density", lo, hi, "kg/m3"))

    def unit_weight(self, gravity: float = STANDARD_GRAVITY) -> float:
        """``rho_w g`` [N/m3] under ``gravity`` [m/s2]."""
        return self.density * float(gravity)


# -------------------------------------------------------------- structure
@dataclass(frozen=True, eq=False)
class Structure:
    """The validated outer outline of the structure around a cavity.

    Build it with :meth:`Structure.build`, which checks it against its
    cavity and raises :class:`StructureError`; the constructor itself is
    for trusted values.

    Parameters
    ----------
    outline : numpy.ndarray
        (N, 2) outer vertices ``[x, z]`` [m], read-only, in the order given.
    parts : tuple of str
        One part name per outer edge (default all ``"outer wall"``).
    unit_weight : float
        Unit weight of the material [N/m3], default 25000 (reinforced
        concrete, EN 1991-1-1 Table A.1).
    extra_weight : float
        Weight not drawn (equipment, ballast, a cover slab) [N per metre
        of width for plane sections, N for axisymmetric], >= 0. Counted in
        the flotation resistance, reported apart from the self-weight.
    anchorage : float
        Tension piles or ground anchors holding the structure down [same
        units], >= 0.
    orientation : float
        +1.0 if the outline runs counter-clockwise, else -1.0.

    Examples
    --------
    >>> cav = Section.build([[0, 0.4], [2.4, 0.4], [2.4, 4], [0, 4]],
    ...                     parts=["floor", "wall", "open", "wall"])
    >>> s = Structure.build([[-0.3, 0], [2.7, 0], [2.7, 4], [-0.3, 4]], cavity=cav)
    >>> s.parts[0], round(self_weight(s, cav), 6)
    ('outer wall', 84000.0)
    """

    outline: np.ndarray
    parts: tuple
    unit_weight: float = DEFAULT_UNIT_WEIGHT
    extra_weight: float = 0.0
    anchorage: float = 0.0
    orientation: float = field(default=1.0)

    @classmethod
    def build(cls, outline: ArrayLike, parts: Sequence[str] | None = None, *, cavity: Section,
              unit_weight: float = DEFAULT_UNIT_WEIGHT, extra_weight: float = 0.0,
              anchorage: float = 0.0) -> Structure:
        """Validate the inputs against ``cavity`` and return a :class:`Structure`.

        Parameters
        ----------
        outline : array_like
            (N, 2) outer vertices ``[x, z]`` [m]; closed implicitly, either
            winding; axisymmetric: x >= 0.
        parts : sequence of str, optional
            One name per outer edge; default all ``"outer wall"``. ``open``
            and ``floor`` are refused; ``axis`` only on an edge on x = 0 of
            an axisymmetric structure.
        cavity : Section
            The cavity the structure holds; gives the kind and width.
        unit_weight : float
            [N/m3], within :data:`wetline.core.limits.UNIT_WEIGHT_RANGE`.
        extra_weight, anchorage : float
            [N/m of width (plane) or N (axisymmetric)], 0 to
            :data:`wetline.core.limits.FORCE_LIMIT`.

        Raises
        ------
        StructureError
            With a one-line message naming the fault and where it is: the
            outline's own faults (as :meth:`Section.build` words them,
            prefixed "structure": "structure outline crosses itself ...",
            "structure edge 3 has zero length ..."), a reserved part name, a
            number out of range, or an outline that does not hold the cavity
            (see :meth:`check`).
        """
        if not isinstance(outline, Sized):
            raise StructureError("structure outline must be a list of [x, z] number pairs")
        n = len(outline)
        if n > MAX_VERTICES:
            raise StructureError(
                f"structure outline has {n} vertices, more than the {MAX_VERTICES} allowed")
        if parts is None:
            parts = (OUTER_WALL,) * n
        outer = _outer_section(outline, parts, cavity)
        lo, hi = UNIT_WEIGHT_RANGE
        try:
            unit_weight = _number(unit_weight, "structure unit weight", lo, hi, "N/m3")
            extra_weight = _number(extra_weight, "structure extra weight", 0.0, FORCE_LIMIT, "N")
            anchorage = _number(anchorage, "structure anchorage", 0.0, FORCE_LIMIT, "N")
        except ValueError as e:
            raise StructureError(str(e)) from None
        s = cls(outline=outer.outline, parts=outer.parts, unit_weight=unit_weight,
                extra_weight=extra_weight, anchorage=anchorage, orientation=outer.orientation)
        own = s._own(cavity)
        own.validated = True  # as a Section of the cavity's kind, above
        _check_encloses(s.outline, cavity, own)
        return s

    def check(self, cavity: Section) -> None:
        """Raise :class:`StructureError` unless the structure holds ``cavity``.

        The outline must suit the cavity's kind (x >= 0 and ``axis`` only on
        x = 0 for axisymmetric) and contain the cavity outline. It may meet
        the cavity only along the cavity's ``open`` edges (an open tank's
        mouth) and, for axisymmetric sections, on the axis x = 0 (a revolved
        cavity and its structure both close there); every ``open`` edge must
        lie on it (the cavity opens through the structure, not into it).
        Anywhere else the walls need a thickness: touching is refused.
        Points closer than 1e-9 of the structure's extent count as touching.
        """
        _check_encloses(self.outline, cavity, self._own(cavity, checked=True))

    def replace(self, cavity: Section, **changes: Any) -> Structure:
        """A validated copy with some fields changed (see :meth:`build`)."""
        args: dict[str, Any] = dict(outline=self.outline, parts=self.parts,
                                    unit_weight=self.unit_weight,
                                    extra_weight=self.extra_weight, anchorage=self.anchorage)
        args.update(changes)
        return Structure.build(cavity=cavity, **args)

    def __eq__(self, other):
        if not isinstance(other, Structure):
            return NotImplemented
        return (self.parts == other.parts and self.unit_weight == other.unit_weight
                and self.extra_weight == other.extra_weight
                and self.anchorage == other.anchorage
                and np.array_equal(self.outline, other.outline))

    __hash__ = None  # type: ignore[assignment]  # equal by value (arrays): not hashable

    @property
    def n_edges(self) -> int:
        """Number of outer edges (= number of vertices)."""
        return int(self.outline.shape[0])

    @cached_property
    def part_names(self) -> tuple[str, ...]:
        """Distinct part names, in order of first appearance (tuple of str)."""
        return tuple(dict.fromkeys(self.parts))

    def section(self, cavity: Section) -> Section:
        """The outer outline as a :class:`Section` of the cavity's kind and
        width (trusted: built without checks), for the hydrostatic solver."""
        return self._own(cavity).outer

    @cached_property
    def _memo(self) -> dict:
        """{(kind, width): _Own}: what depends on the structure alone."""
        return {}

    def _own(self, cavity: Section, checked: bool = False) -> _Own:
        """The structure's own geometry for a cavity's kind and width, made
        once per structure (a drag of the cavity makes a new cavity at every
        step, the structure stays; its outline is read-only). With
        ``checked`` the outline is first validated as a Section of that kind
        (StructureError as :func:`_outer_section`), once."""
        if not isinstance(cavity, Section):
            raise TypeError("cavity must be a Section")
        key = (cavity.kind, cavity.width)
        own = self._memo.get(key)
        if own is None:
            own = _Own(Section(outline=self.outline, parts=self.parts, kind=cavity.kind,
                               width=cavity.width, name="structure",
                               orientation=self.orientation))
            self._memo[key] = own
        if checked and not own.validated:
            _outer_section(self.outline, self.parts, cavity)
            own.validated = True
        return own


def _outer_section(outline, parts, cavity):
    """The outline validated as a Section of the cavity's kind, or StructureError."""
    if not isinstance(cavity, Section):
        raise TypeError("cavity must be a Section")
    if not isinstance(parts, str):
        for i, p in enumerate(parts):
            if p in _REFUSED_PARTS:
                raise StructureError(
                    f"structure edge {i} is marked {p!r}, a name only the cavity's edges take",
                    edges=(i,))
    try:
        outer = Section.build(outline, parts=parts, kind=cavity.kind, width=cavity.width)
    except SectionError as e:
        # Section's messages start with what is at fault: "outline ...",
        # "edge 3 ...", "vertex 2 ...", "parts ...".
        raise StructureError("structure " + str(e), edges=e.edges, vertices=e.vertices,
                             location=e.location) from None
    return outer  # Section.build has checked the coordinate range too


class _Own:
    """A structure's own geometry for one kind and width of cavity, made on
    first use: its Section, edges as shapely segments, polygon (prepared),
    touching tolerance, rim band and overhung edges. Private to this
    module; values as the functions that used to make them at every call."""

    def __init__(self, outer):
        self.outer = outer
        self.validated = False

    @cached_property
    def segments(self):
        return _segments(self.outer.outline)

    @cached_property
    def polygon(self):
        import shapely

        poly = shapely.Polygon(self.outer.outline)
        shapely.prepare(poly)
        return poly

    @cached_property
    def tolerance(self):
        return _tolerance(self.outer.outline)

    @cached_property
    def rim(self):
        import shapely

        rim = shapely.buffer(self.polygon.exterior, 4.0 * self.tolerance)
        shapely.prepare(rim)
        return rim

    @cached_property
    def overhung(self):
        return _overhung(self.outer)


def _segments(pts):
    import shapely

    return shapely.linestrings(np.stack([pts, np.roll(pts, -1, axis=0)], axis=1))


def _tolerance(pts):
    """Distance [m] below which two outlines count as touching."""
    extent = float(np.ptp(pts, axis=0).max())
    return 1e-9 * extent + 8.0 * np.finfo(float).eps * float(np.abs(pts).max())


def _fmt(p):
    return f"({p[0]:.6g}, {p[1]:.6g}) m"


def _check_encloses(pts, cavity, own=None):
    """Raise StructureError unless the polygon ``pts`` holds the cavity
    (see :meth:`Structure.check`); ``own``: the structure's own geometry
    (:class:`_Own` of ``pts``), reused if given."""
    import shapely

    cpts = cavity.outline
    if own is None:
        own = _Own(Section(outline=pts, parts=(OUTER_WALL,) * len(pts), kind=cavity.kind,
                           width=cavity.width, name="structure"))
    spoly = own.polygon
    cpoly = shapely.Polygon(cpts)
    tol = own.tolerance
    is_open = np.array([p == OPEN for p in cavity.parts])
    s_segs = own.segments
    c_segs = _segments(cpts)
    open_union = shapely.union_all(c_segs[is_open]) if is_open.any() else None

    shapely.prepare(cpoly)
    # 1. every cavity vertex inside the structure (or on it, within tol)
    maybe = np.flatnonzero(~shapely.contains_xy(spoly, cpts[:, 0], cpts[:, 1]))
    if maybe.size:
        d = shapely.distance(spoly, shapely.points(cpts[maybe]))
        out = maybe[d > tol]
    else:
        out = maybe
    if out.size:
        i = int(out[0])
        raise StructureError(
            f"cavity vertex {i} at {_fmt(cpts[i])} lies outside the structure outline",
            cavity_vertices=(i,), location=cpts[i])
    # 2. no structure vertex inside the cavity
    inside = np.flatnonzero(shapely.contains_xy(cpoly, pts[:, 0], pts[:, 1]))
    if inside.size:
        deep = shapely.distance(cpoly.exterior, shapely.points(pts[inside])) > tol
        if deep.any():
            j = int(inside[np.argmax(deep)])
            raise StructureError(
                f"structure vertex {j} at {_fmt(pts[j])} lies inside the cavity",
                vertices=(j,), location=pts[j])
    tree = shapely.STRtree(c_segs)
    # 3. no outer edge crossing a cavity edge (except by round-off at the mouth)
    si, ci = tree.query(s_segs, predicate="crosses")
    if si.size:
        where = shapely.intersection(s_segs[si], c_segs[ci])
        ok = np.zeros(si.size, dtype=bool)
        if open_union is not None:
            ok = shapely.distance(where, open_union) <= tol
        bad = np.flatnonzero(~ok)
        if bad.size:
            k = int(bad[0])
            p = shapely.get_coordinates(where[k])[0]
            raise StructureError(
                f"structure edge {si[k]} crosses cavity edge {ci[k]} at {_fmt(p)}",
                edges=(si[k],), cavity_edges=(ci[k],), location=p)
    # 4. no touching except along the open edges (and the axis, x = 0, which
    # a revolved cavity and its structure may share)
    si, ci = tree.query(s_segs, predicate="dwithin", distance=tol)
    keep = ~is_open[ci]
    if keep.any():
        si, ci = si[keep], ci[keep]
        near = shapely.intersection(c_segs[ci], shapely.buffer(s_segs[si], tol))
        allowed = []
        if open_union is not None:
            allowed.append(shapely.buffer(shapely.union_all(
                c_segs[is_open][shapely.dwithin(c_segs[is_open], shapely.union_all(near),
                                                8.0 * tol)]), 4.0 * tol))
        if cavity.is_axisymmetric:
            lo, hi = np.min(cpts[:, 1]) - 1.0, np.max(cpts[:, 1]) + 1.0
            allowed.append(shapely.box(-4.0 * tol, lo, 4.0 * tol, hi))
        if allowed:
            near = shapely.difference(near, shapely.union_all(allowed))
        bad = np.flatnonzero(~shapely.is_empty(near))
        if bad.size:
            # name the longest stretch of contact (a corner point last)
            k = int(bad[np.argmax(shapely.length(near[bad]))])
            if shapely.length(near[k]) > 4.0 * tol:  # a stretch: its middle
                p = shapely.get_coordinates(near[k]).mean(axis=0)
            else:  # a point: where the two outlines meet
                p = shapely.get_coordinates(shapely.shortest_line(near[k], s_segs[si[k]]))[0]
            raise StructureError(
                f"structure edge {si[k]} touches cavity edge {ci[k]} at {_fmt(p)}: the wall "
                "there has no thickness (the structure may meet the cavity only along its "
                "open edges)", edges=(si[k],), cavity_edges=(ci[k],), location=p)
    # 5. every open edge on the structure outline (it opens through the top)
    if open_union is not None:
        rim = own.rim
        opens = np.flatnonzero(is_open)
        covered = ~shapely.covers(rim, c_segs[opens])
        if covered.any():
            i = int(opens[np.argmax(covered)])
            p = 0.5 * (cpts[i] + cpts[(i + 1) % len(cpts)])
            raise StructureError(
                f"cavity edge {i} is open but the structure covers it: an open edge "
                "must lie on the structure outline (the cavity opens through it)",
                cavity_edges=(i,), location=p)


# -------------------------------------------------------- walls by thickness
def walls_of_thickness(cavity: Section, base: float, wall: float, roof: float, *,
                       mitre_limit: float = MITRE_LIMIT) -> np.ndarray:
    """An outer outline around ``cavity`` with the given thicknesses [m].

    Every cavity edge is offset outward by its own thickness: ``base`` on
    edges facing down (outward normal within 45 degrees of straight down:
    floors and flat bottoms), ``roof`` on edges facing up (within 45 degrees
    of straight up: closed tops and the tops of steps), ``wall`` on the rest,
    and nothing on ``open`` edges (an open top stays flush with its rim, so
    the opening is not roofed over) nor on ``axis`` edges. Neighbouring
    offsets meet in mitred corners: with one thickness everywhere this is
    shapely's ``buffer(cavity, wall, join_style="mitre")``. A mitre longer
    than ``mitre_limit`` thicknesses is bevelled. The region is the union of
    the cavity, the offset strips and the corner pieces (shapely), so narrow
    features merge cleanly; whatever of it lies straight outward of an open
    edge is cut away, so that the mouth stays open however the rim curves;
    an axisymmetric structure is cut at x = 0, so it closes on the axis
    instead of reaching across it.

    Parameters
    ----------
    cavity : Section
    base, wall, roof : float
        Thicknesses [m], > 0.
    mitre_limit : float
        Longest mitre, in thicknesses, >= 1.

    Returns
    -------
    numpy.ndarray
        (M, 2) vertices [m] with the cavity's winding, starting at the
        lowest (then leftmost) vertex, collinear vertices removed: a
        starting point for :meth:`Structure.build`, to be edited at will.

    Examples
    --------
    The wet well of the section format's example (version 3):

    >>> cav = Section.build([[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
    ...                     parts=["floor", "wall", "roof", "riser", "open", "wall"])
    >>> walls_of_thickness(cav, base=0.4, wall=0.3, roof=0.3).round(12).tolist()
    [[-0.3, -0.4], [3.3, -0.4], [3.3, 2.8], [2.5, 2.8], [2.5, 4.0], [-0.3, 4.0]]
    """
    import shapely

    if not isinstance(cavity, Section):
        raise TypeError("cavity must be a Section")
    hi = COORDINATE_LIMIT
    base = _number(base, "base thickness", 0.0, hi, "m", lo_open=True)
    wall = _number(wall, "wall thickness", 0.0, hi, "m", lo_open=True)
    roof = _number(roof, "roof thickness", 0.0, hi, "m", lo_open=True)
    mitre_limit = _number(mitre_limit, "mitre limit", 1.0, math.inf, "")
    geo = cavity.geometry
    pts = cavity.outline
    nx, nz = geo.nx, geo.nz
    t = np.full(cavity.n_edges, wall)
    t[nz < -np.abs(nx)] = base
    t[nz > np.abs(nx)] = roof
    is_open = np.array([p == OPEN for p in cavity.parts])
    t[is_open | np.array([p == AXIS for p in cavity.parts])] = 0.0
    reach = mitre_limit * max(base, wall, roof)
    region = shapely.union_all([shapely.Polygon(pts)] + _offset_pieces(cavity, t, mitre_limit))
    if is_open.any():
        # Keep the mouth open: nothing of the walls' offsets may reach over
        # an open edge (a rippled or curved rim would otherwise be covered).
        mouth = np.where(is_open, reach, 0.0)
        cut = shapely.union_all(_offset_pieces(cavity, mouth, mitre_limit, corners_of=is_open))
        region = shapely.difference(region, shapely.difference(cut, shapely.Polygon(pts)))
    if cavity.is_axisymmetric:
        lo = np.min(pts, axis=0) - 2.0 * reach
        up = np.max(pts, axis=0) + 2.0 * reach
        region = shapely.intersection(region, shapely.box(0.0, lo[1], up[0], up[1]))
    if region.geom_type == "MultiPolygon":  # the part that holds the cavity
        region = max(region.geoms, key=lambda g: g.area)
    ring = np.asarray(region.exterior.coords)[:-1]
    return _tidy_ring(ring, cavity.orientation)


def _offset_pieces(cavity, t, mitre_limit, corners_of=None):
    """Polygons covering the offset of every edge of ``cavity`` outward by
    its thickness ``t[i]`` [m]: one strip per edge and a mitred corner
    piece at every convex vertex (only between two ``corners_of`` edges,
    if given). Their union with the cavity is the offset region."""
    import shapely

    geo = cavity.geometry
    pts = cavity.outline
    n = cavity.n_edges
    nrm = np.column_stack([geo.nx, geo.nz])
    d = np.column_stack([geo.dx, geo.dz])
    p0 = pts
    p1 = np.roll(pts, -1, axis=0)
    off = nrm * t[:, None]
    strips = np.stack([p0, p1, p1 + off, p0 + off], axis=1)[t > 0]
    pieces = list(shapely.polygons(strips))
    # Corner k joins edge k-1 (ending at vertex k) and edge k.
    prev = np.roll(np.arange(n), 1)
    a = p0 + off[prev]
    b = p0 + off
    cross = d[prev, 0] * d[:, 1] - d[prev, 1] * d[:, 0]
    take = (cross * cavity.orientation > 0) & ((t[prev] > 0) | (t > 0))
    if corners_of is not None:
        take &= corners_of & corners_of[prev]
    for k in np.flatnonzero(take):
        dp, dk = d[prev[k]], d[k]
        # The offset lines n . x = n . p + t of both edges, by Cramer's rule
        # (exact where the edges are horizontal and vertical).
        m1, m2 = nrm[prev[k]], nrm[k]
        c1 = m1 @ p0[k] + t[prev[k]]
        c2 = m2 @ p0[k] + t[k]
        det = m1[0] * m2[1] - m1[1] * m2[0]
        x = np.array([(c1 * m2[1] - m1[1] * c2) / det, (m1[0] * c2 - c1 * m2[0]) / det])
        if t[k] == 0.0:  # flush with an open edge: stay exactly on its line
            x = p0[k] + (x - p0[k]) @ dk / (dk @ dk) * dk
        elif t[prev[k]] == 0.0:
            x = p0[k] + (x - p0[k]) @ dp / (dp @ dp) * dp
        if np.hypot(*(x - p0[k])) <= mitre_limit * max(t[k], t[prev[k]]):
            corner = [p0[k], a[k], x, b[k]]
        else:
            corner = [p0[k], a[k], b[k]]
        # A convex quadrilateral (or triangle) in every proper case.
        pieces.append(shapely.convex_hull(shapely.multipoints(corner)))
    return [g for g in pieces if g.area > 0]


def _tidy_ring(ring, orientation):
    """Drop repeated and collinear vertices, set the winding, start low-left."""
    r = ring
    while len(r) > 3:
        # Removing a vertex on the straight line between its neighbours leaves
        # every other vertex's straightness as it was: drop them all at once.
        prv, nxt = np.roll(r, 1, axis=0), np.roll(r, -1, axis=0)
        u, v = r - prv, nxt - r
        scale = np.maximum(np.abs(u).sum(axis=1) * np.abs(v).sum(axis=1), 1e-300)
        flat = np.abs(u[:, 0] * v[:, 1] - u[:, 1] * v[:, 0]) <= 1e-13 * scale
        flat &= (u * v).sum(axis=1) >= 0  # straight on, not doubling back
        flat |= (u == 0).all(axis=1)
        if not flat.any() or flat.all():
            break
        r = r[~flat]
    twice_area = float(np.dot(r[:, 0], np.roll(r[:, 1], -1)) - np.dot(np.roll(r[:, 0], -1),
                                                                       r[:, 1]))
    if (twice_area > 0) != (orientation > 0):
        r = r[::-1]
    start = int(np.lexsort((r[:, 0], r[:, 1]))[0])
    return np.array(np.roll(r, -start, axis=0), dtype=np.float64)


# ------------------------------------------------------------- self-weight
def self_weight(structure: Structure, cavity: Section) -> float:
    """Weight of the structure's material [N] (per ``width`` for plane sections).

    .. math:: G = \\gamma_c\\,(V_\\mathrm{outer} - V_\\mathrm{cavity})

    with V = A w for plane sections (A by the shoelace formula) and the
    revolved volume ``pi * integral of x^2 dz`` around the outline (Green's
    theorem; equal to Pappus' 2 pi x_c A) for axisymmetric ones, both from
    :func:`wetline.core.fill.volume_below`. The extra weight is not in it.

    Parameters
    ----------
    structure : Structure
    cavity : Section

    Returns
    -------
    float
        [N]
    """
    outer = structure.section(cavity)
    v_out = volume_below(outer, outer.z_max)
    v_in = volume_below(cavity, cavity.z_max)
    return structure.unit_weight * (v_out - v_in)


def soil_stress(z: ArrayLike, ground: Ground, groundwater: Groundwater | None = None,
                gravity: float = STANDARD_GRAVITY) -> float | np.ndarray:
    """Vertical effective stress of the soil column above height ``z`` [Pa].

    .. math:: \\sigma'_v = \\gamma_d (G - \\max(z, z_w))^+
              + (\\gamma_{sat} - \\rho_w g) (\\min(G, z_w) - z)^+

    Dry ground (``groundwater`` None): ``gamma_d (G - z)+``.

    Parameters
    ----------
    z : float or array_like
        [m]
    ground : Ground
    groundwater : Groundwater or None
    gravity : float
        [m/s2]

    Returns
    -------
    float or numpy.ndarray
        [Pa]

    Examples
    --------
    Dry 18 kN/m3 soil 2 m above and saturated 20 kN/m3 soil 1.6 m below the
    water table (common practice, Terzaghi's effective stress):

    >>> round(float(soil_stress(0.4, Ground(4.0), Groundwater(2.0), 9.80665)), 6)
    52309.36
    """
    z = np.asarray(z, dtype=np.float64)
    g_level = ground.level
    if groundwater is None:
        out = ground.unit_weight_dry * np.maximum(g_level - z, 0.0)
    else:
        zw = groundwater.level
        sub = ground.unit_weight_saturated - groundwater.unit_weight(gravity)
        out = (ground.unit_weight_dry * np.maximum(g_level - np.maximum(z, zw), 0.0)
               + sub * np.maximum(min(g_level, zw) - z, 0.0))
    return out if out.ndim else float(out)


# ---------------------------------------------------------- exterior geometry
@dataclass(frozen=True, eq=False)
class ExteriorGeometry:
    """Case-independent geometry of a structure around its cavity, computed
    once by :func:`exterior_geometry` and reused for every load case.

    Attributes
    ----------
    structure : Structure
    cavity : Section
    outer : Section
        The outer outline as a section of the cavity's kind and width.
    self_weight : float
        [N], see :func:`self_weight`.
    soil_segments : numpy.ndarray
        (K, 4) pieces ``[x0, z0, x1, z1]`` [m] of the upward-facing outer
        edges that can carry soil; the pieces spanning the cavity's
        opening are left out (an edge along a rim is cut into its parts
        over the walls).
    soil_owner : numpy.ndarray
        (K,) index of the outer edge each piece lies on.
    overhung : dict of int to int
        Upward-facing outer edges with the structure above them (a ledge
        under an overhang), each with one edge above it.
    floor_edges : tuple of int
        Indices of the cavity's ``floor`` edges that have the structure's
        underside below them.
    base_pieces : numpy.ndarray
        (P, 7) ``[owner, x0, x1, z_floor0, z_floor1, z_under0, z_under1]``:
        stretches of the floor edges (``owner`` indexes ``floor_edges``) over
        which both the floor and the underside straight below it are
        straight, in floor order.
    """

    structure: Structure
    cavity: Section
    outer: Section
    self_weight: float
    soil_segments: np.ndarray
    soil_owner: np.ndarray
    overhung: dict
    floor_edges: tuple
    base_pieces: np.ndarray

    @cached_property
    def _soil_arrays(self):
        """``x0, z0, x1, z1, z_low, z_high`` of the soil pieces."""
        x0, z0, x1, z1 = (np.ascontiguousarray(c) for c in self.soil_segments.T)
        return x0, z0, x1, z1, np.minimum(z0, z1), np.maximum(z0, z1)

    @cached_property
    def _overhung_edges(self):
        return np.fromiter(self.overhung, dtype=np.intp, count=len(self.overhung))

    @cached_property
    def base_lowest_underside(self):
        """Lowest point of the structure's underside below the floor edges
        [m] (inf without floor edges): groundwater at or below it cannot
        lift the base."""
        if self.base_pieces.shape[0] == 0:
            return math.inf
        return float(self.base_pieces[:, 5:7].min())

    @cached_property
    def _base_columns(self):
        """The base pieces' columns: owner (int), x0, x1, zf0, zf1, zu0, zu1."""
        pcs = self.base_pieces
        return (pcs[:, 0].astype(np.intp),) + tuple(np.ascontiguousarray(c)
                                                    for c in pcs[:, 1:].T)


def exterior_geometry(structure: Structure, cavity: Section, *,
                      checked: bool = False) -> ExteriorGeometry:
    """Precompute what :func:`exterior_loads` needs of a structure and cavity.

    Parameters
    ----------
    structure : Structure
    cavity : Section
    checked : bool
        True if ``structure.check(cavity)`` has already passed (skips it).

    Returns
    -------
    ExteriorGeometry

    Raises
    ------
    StructureError
        If the structure does not hold the cavity (see :meth:`Structure.check`).
    """
    if not checked:
        structure.check(cavity)
    own = structure._own(cavity)
    outer = own.outer
    seg, owner = _soil_segments(outer, cavity)
    floor_edges, pieces = _base_pieces(outer, cavity)
    for a in (seg, owner, pieces):
        a.setflags(write=False)
    return ExteriorGeometry(structure=structure, cavity=cavity, outer=outer,
                            self_weight=self_weight(structure, cavity), soil_segments=seg,
                            soil_owner=owner, overhung=dict(own.overhung),
                            floor_edges=floor_edges, base_pieces=pieces)


def _soil_segments(outer, cavity):
    """Upward-facing outer edges as pieces, minus the cavity's opening."""
    geo = outer.geometry
    up = np.flatnonzero((geo.nz > 0) & (geo.dx != 0))
    nxt = np.roll(outer.outline, -1, axis=0)[up]  # the end vertices themselves
    seg = np.column_stack([geo.x0[up], geo.z0[up], nxt[:, 0], nxt[:, 1]])
    owner = up.astype(np.intp)
    if not cavity.is_open or up.size == 0:
        return seg, owner
    # Parameter ranges [s_a, s_b] of each upward edge lying on an open edge.
    import shapely

    tol = _tolerance(outer.outline)
    cpts = cavity.outline
    opens = np.array([k for k, p in enumerate(cavity.parts) if p == OPEN])
    ends = np.stack([cpts[opens], cpts[(opens + 1) % len(cpts)]], axis=1)  # (O, 2, 2)
    tree = shapely.STRtree(shapely.linestrings(ends))
    ui, oi = tree.query(shapely.linestrings(seg.reshape(-1, 2, 2)), predicate="dwithin",
                        distance=4.0 * tol)
    if ui.size == 0:
        return seg, owner
    d = np.column_stack([geo.dx[up], geo.dz[up]])
    dd = (d * d).sum(axis=1)
    length = np.sqrt(dd)
    rel = ends[oi] - seg[ui, None, :2]  # (pairs, 2, 2)
    dk = d[ui, None, :]
    dist = np.abs(rel[..., 0] * dk[..., 1] - rel[..., 1] * dk[..., 0]) / length[ui, None]
    t = (rel * dk).sum(axis=2) / dd[ui, None]
    sa = np.clip(t.min(axis=1), 0.0, 1.0)
    sb = np.clip(t.max(axis=1), 0.0, 1.0)
    on = (dist <= 4.0 * tol).all(axis=1) & ((sb - sa) * length[ui] > tol)
    if not on.any():
        return seg, owner
    ui, sa, sb = ui[on], sa[on], sb[on]
    order = np.lexsort((sa, ui))
    ui, sa, sb = ui[order].tolist(), sa[order].tolist(), sb[order].tolist()
    cuts = {}
    for j, a, b in zip(ui, sa, sb, strict=True):
        cuts.setdefault(j, []).append((a, b))
    keep = np.ones(up.size, dtype=bool)
    extra, extra_owner = [], []
    for j, spans in cuts.items():
        keep[j] = False
        t0 = 0.0
        for ta, tb in spans + [(1.0, 1.0)]:
            if ta > t0:
                pa = seg[j, :2] + t0 * d[j]
                pb = seg[j, :2] + ta * d[j] if ta < 1.0 else seg[j, 2:]
                extra.append(np.r_[pa, pb])
                extra_owner.append(owner[j])
            t0 = max(t0, tb)
    seg = np.concatenate([seg[keep], np.array(extra, dtype=np.float64).reshape(-1, 4)])
    owner = np.concatenate([owner[keep], np.array(extra_owner, dtype=np.intp)])
    return seg, owner


def _overhung(outer, max_pairs=1_000_000):
    """{lower edge: an edge above it} for upward-facing outer edges whose
    horizontal projections overlap (the lower one lies under the structure)."""
    geo = outer.geometry
    up = np.flatnonzero((geo.nz > 0) & (geo.dx != 0))
    if up.size < 2:
        return {}
    xa = np.minimum(geo.x0[up], geo.x0[up] + geo.dx[up])
    xb = np.maximum(geo.x0[up], geo.x0[up] + geo.dx[up])
    order = np.argsort(xa, kind="stable")
    xa_s, xb_s = xa[order], xb[order]
    # Pairs (k, j), j after k in start order, starting before k ends.
    stop = np.searchsorted(xa_s, xb_s, side="left")
    count = np.maximum(stop - np.arange(up.size) - 1, 0)
    total = int(count.sum())
    if total == 0 or total > max_pairs:
        return {}
    k = np.repeat(np.arange(up.size), count)
    first = np.repeat(np.cumsum(count) - count, count)
    j = np.arange(total) - first + k + 1
    lo = np.maximum(xa_s[k], xa_s[j])
    hi = np.minimum(xb_s[k], xb_s[j])
    real = hi > lo
    k, j, xm = k[real], j[real], 0.5 * (lo[real] + hi[real])
    ek, ej = up[order[k]], up[order[j]]

    def z_at(e, x):
        return geo.z0[e] + (x - geo.x0[e]) / geo.dx[e] * geo.dz[e]

    zk, zj = z_at(ek, xm), z_at(ej, xm)
    lower = np.where(zk < zj, ek, ej)
    upper = np.where(zk < zj, ej, ek)
    out = {}
    for a, b in zip(lower.tolist(), upper.tolist(), strict=True):
        out.setdefault(a, b)
    return dict(sorted(out.items()))


def _base_pieces(outer, cavity):
    """Floor edges and the stretches of them over a straight underside.

    Each floor edge is cut at the x of every outer vertex inside its span;
    over each stretch the first outer edge straight below the floor is the
    same (the outline is simple), found at the stretch's middle.
    """
    cpts = cavity.outline
    n = cavity.n_edges
    floor = np.array([i for i, p in enumerate(cavity.parts) if p == FLOOR], dtype=np.intp)
    if floor.size == 0:
        return (), np.empty((0, 7))
    a, b = cpts[floor], cpts[(floor + 1) % n]
    swap = a[:, 0] > b[:, 0]
    lo = np.where(swap[:, None], b, a)
    hi = np.where(swap[:, None], a, b)
    vertical = lo[:, 0] == hi[:, 0]
    low_z = np.minimum(a[:, 1], b[:, 1])
    lo[vertical, 1] = hi[vertical, 1] = low_z[vertical]  # its lowest point only
    geo = outer.geometry
    ox = np.unique(geo.x0)
    i0 = np.searchsorted(ox, lo[:, 0], side="right")
    i1 = np.searchsorted(ox, hi[:, 0], side="left")
    inner = np.where(vertical, 0, np.maximum(i1 - i0, 0))
    m = inner + 1
    owner = np.repeat(np.arange(floor.size), m)
    k = np.arange(int(m.sum())) - np.repeat(np.cumsum(m) - m, m)  # stretch within its edge
    io = i0[owner] + k
    last = k == inner[owner]
    xl = np.where(k == 0, lo[owner, 0], ox[np.clip(io - 1, 0, ox.size - 1)])
    xr = np.where(last, hi[owner, 0], ox[np.clip(io, 0, ox.size - 1)])
    span_x = hi[owner, 0] - lo[owner, 0]
    slope = np.zeros_like(span_x)
    np.divide(hi[owner, 1] - lo[owner, 1], span_x, out=slope, where=span_x != 0)

    def z_floor(x):
        return lo[owner, 1] + (x - lo[owner, 0]) * slope

    zfl, zfr = z_floor(xl), z_floor(xr)
    xm = 0.5 * (xl + xr)
    zfm = z_floor(xm)
    # The first outer edge below each stretch's middle: the highest of the
    # slanted outer edges a vertical ray down from the floor meets. An edge
    # meets the ray at xm if its x-span holds xm: the pairs come from the
    # middles sorted by x, a range of them per edge (a vertical line crosses
    # a simple outline a few times, so there are a few pairs per middle).
    e = np.flatnonzero(geo.dx != 0)
    ends = np.column_stack([geo.x0[e], geo.x0[e] + geo.dx[e]])
    by_x = np.argsort(xm, kind="stable")
    start = np.searchsorted(xm[by_x], ends.min(axis=1), side="left")
    count = np.searchsorted(xm[by_x], ends.max(axis=1), side="right") - start
    ek = np.repeat(e, count)
    pi = by_x[np.arange(int(count.sum())) - np.repeat(np.cumsum(count) - count, count)
              + np.repeat(start, count)]
    ze = geo.z0[ek] + (xm[pi] - geo.x0[ek]) / geo.dx[ek] * geo.dz[ek]
    below = ze < zfm[pi]
    pi, ek, ze = pi[below], ek[below], ze[below]
    order = np.lexsort((ze, pi))  # the highest of each ray's hits last
    last = order[np.r_[pi[order][1:] != pi[order][:-1], True]] if order.size else order
    best = np.full(xm.size, -1, dtype=np.intp)
    best[pi[last]] = ek[last]
    hit = best >= 0
    owner, xl, xr, zfl, zfr, best = owner[hit], xl[hit], xr[hit], zfl[hit], zfr[hit], best[hit]

    def z_under(x):
        return geo.z0[best] + (x - geo.x0[best]) / geo.dx[best] * geo.dz[best]

    kept, owner = np.unique(owner, return_inverse=True)
    pieces = np.column_stack([owner.astype(np.float64), xl, xr, zfl, zfr, z_under(xl),
                              z_under(xr)])
    return tuple(int(i) for i in floor[kept]), pieces


# ------------------------------------------------------------------ results
@dataclass(frozen=True)
class Flotation:
    """Flotation check of the whole structure.

    Attributes
    ----------
    uplift : float
        U, the upward net groundwater force [N] (0 in dry ground).
    resistance : float
        R = self-weight + extra weight + soil on ledges + anchorage [N].
    factor : float or None
        R / U [], None where U <= 0 (nothing lifts the structure).
    required : float
        The required factor [].
    """

    uplift: float
    resistance: float
    factor: float | None
    required: float

    @property
    def ok(self) -> bool:
        """True if nothing lifts the structure or the factor meets the required one."""
        return self.factor is None or self.factor >= self.required

    @property
    def verdict(self) -> str:
        """"OK" or "NOT OK", for reports."""
        return "OK" if self.ok else "NOT OK"


@dataclass(frozen=True)
class BasePressure:
    """Governing net upward pressure on the base below one floor edge.

    Attributes
    ----------
    index : int
        The cavity's floor edge.
    net : float
        ``p_groundwater - p_liquid`` [Pa], the largest along the edge;
        negative where the liquid presses the slab down harder than the
        groundwater lifts it.
    point : tuple of float
        ``(x, z)`` on the floor where it governs [m].
    underside : float
        Height of the structure's underside straight below that point [m].
    p_groundwater, p_liquid : float
        The two pressures there [Pa].
    """

    index: int
    net: float
    point: tuple
    underside: float
    p_groundwater: float
    p_liquid: float


@dataclass(frozen=True, eq=False)
class BasePressures:
    """Governing net upward pressure on the base below every floor edge,
    as arrays (one entry per cavity floor edge with the base below it, in
    edge order); iterating or indexing gives :class:`BasePressure` values.

    Attributes
    ----------
    index : numpy.ndarray
        Cavity floor edges (int).
    net, p_groundwater, p_liquid : numpy.ndarray
        [Pa], see :class:`BasePressure`.
    x, z, underside : numpy.ndarray
        The governing point on the floor and the underside below it [m].
    """

    index: np.ndarray
    net: np.ndarray
    x: np.ndarray
    z: np.ndarray
    underside: np.ndarray
    p_groundwater: np.ndarray
    p_liquid: np.ndarray

    def __len__(self) -> int:
        return int(self.index.size)

    def __getitem__(self, k: int) -> BasePressure:
        if not -len(self) <= k < len(self):
            raise IndexError(k)
        return BasePressure(index=int(self.index[k]), net=float(self.net[k]) + 0.0,
                            point=(float(self.x[k]), float(self.z[k])),
                            underside=float(self.underside[k]),
                            p_groundwater=float(self.p_groundwater[k]),
                            p_liquid=float(self.p_liquid[k]))

    def __iter__(self):
        return (self[k] for k in range(len(self)))

    @property
    def governing(self) -> BasePressure | None:
        """The :class:`BasePressure` with the largest net (the first among
        equals), or None without floor edges."""
        return self[int(np.argmax(self.net))] if len(self) else None


@dataclass(frozen=True, eq=False)
class StructureLoads:
    """Loads on the structure from outside in one situation (characteristic).

    Arrays have one entry per outer edge, in the structure's edge order and
    direction. Forces are N per ``width`` (plane) or totals (axisymmetric).

    Attributes
    ----------
    structure : Structure
    cavity : Section
        The cavity the structure holds (gives the kind and width).
    groundwater : Groundwater or None
        None: dry ground.
    ground : Ground or None
        None: no soil on the structure.
    gravity : float
        [m/s2]
    self_weight : float
        [N], see :func:`self_weight`.
    extra_weight, anchorage : float
        The structure's entries times the width (plane) [N].
    soil_weight : float
        Total soil on the ledges [N], >= 0 (downward).
    buoyancy : float
        Sum of the groundwater's fz [N], positive upward.
    fx, fz : numpy.ndarray
        Groundwater force on each outer edge [N]; fx is NaN for
        axisymmetric sections (null in records).
    p_water_start, p_water_end : numpy.ndarray
        Groundwater pressure at each edge's ends [Pa], 0 above the water.
    soil_fz : numpy.ndarray
        Vertical force of the soil on each outer edge [N], <= 0 (down).
    flotation : Flotation
    warnings : tuple of str
    base : BasePressures
        (Property.) One entry per cavity floor edge with the base below it,
        in edge order.
    """

    structure: Structure
    cavity: Section
    groundwater: Groundwater | None
    ground: Ground | None
    gravity: float
    self_weight: float
    extra_weight: float
    anchorage: float
    soil_weight: float
    buoyancy: float
    fx: np.ndarray
    fz: np.ndarray
    p_water_start: np.ndarray
    p_water_end: np.ndarray
    soil_fz: np.ndarray
    flotation: Flotation
    warnings: tuple
    _base_inputs: tuple = field(default=(None, None, None, None), repr=False)

    @property
    def groundwater_level(self) -> float | None:
        """[m] or None in dry ground."""
        return None if self.groundwater is None else self.groundwater.level

    @property
    def base_can_lift(self) -> bool:
        """False if the net upward pressure on the base cannot be positive
        (dry ground, or groundwater at or below the base's lowest underside:
        no groundwater pressure there, and the liquid only presses down)."""
        geometry = self._base_inputs[0]
        return (self.groundwater is not None and geometry is not None
                and self.groundwater.level > geometry.base_lowest_underside)

    @cached_property
    def parts(self) -> dict[str, PartLoad]:
        """Groundwater plus soil per outer part, ``{name: PartLoad}``
        (``axis`` left out); ``down`` = -fz [N]."""
        s = self.structure
        names = s.part_names
        index = {p: k for k, p in enumerate(names)}
        idx = np.fromiter((index[p] for p in s.parts), dtype=np.intp, count=len(s.parts))
        fz = np.bincount(idx, weights=self.fz + self.soil_fz, minlength=len(names))
        fx = None if self.cavity.is_axisymmetric \
            else np.bincount(idx, weights=self.fx, minlength=len(names))
        return {p: PartLoad(fx=None if fx is None else float(fx[k]), fz=float(fz[k]),
                            down=-float(fz[k]) if fz[k] else 0.0)
                for k, p in enumerate(names) if p != AXIS}

    @cached_property
    def base(self) -> BasePressures:
        """Net upward pressure on the base under every floor edge
        (:class:`BasePressures`, computed when first asked for)."""
        return _base_pressures(*self._base_inputs)

    @cached_property
    def base_net_max(self) -> BasePressure | None:
        """The governing :class:`BasePressure` (largest net over all floor
        edges, the first among equals), or None without floor edges; equal
        to ``base.governing`` without building the table."""
        if "base" in self.__dict__:
            return self.base.governing
        return _base_governing(*self._base_inputs)


def exterior_loads(structure: Structure, cavity: Section, *,
                   groundwater: Groundwater | None = None, ground: Ground | None = None,
                   gravity: float | None = None, liquid_solution: Solution | None = None,
                   required_factor: float = DEFAULT_REQUIRED_FACTOR,
                   geometry: ExteriorGeometry | None = None,
                   cache: dict | None = None) -> StructureLoads:
    """Everything outside the cavity in one situation: groundwater, soil,
    self-weight, flotation and the net pressure on the base.

    Parameters
    ----------
    structure : Structure
    cavity : Section
    groundwater : Groundwater, optional
        None: dry ground. For an open cavity a level above its spill level is
        refused (the water would flood the cavity).
    ground : Ground, optional
        None: no soil on the structure.
    gravity : float, optional
        [m/s2]; default the liquid solution's, else standard gravity.
    liquid_solution : wetline.core.hydrostatics.Solution, optional
        The liquid in the cavity in this situation (for the net pressure on
        the base); None: the cavity is empty.
    required_factor : float
        Required factor against flotation [], > 0.
    geometry : ExteriorGeometry, optional
        From :func:`exterior_geometry` for this structure and cavity, to
        skip recomputing it for every case.
    cache : dict, optional
        A dict shared by the calls for one geometry: situations with the
        same groundwater, gravity and ground reuse its groundwater and soil
        results (immutable) instead of computing them again.

    Returns
    -------
    StructureLoads

    Raises
    ------
    ValueError
        For groundwater above the spill level of an open cavity, a saturated
        soil lighter than the groundwater, or inputs that do not belong
        together (a solution of another section, two gravities).

    Notes
    -----
    Groundwater: ``(fx, fz) = -solve(outer, z_w, rho_w, g).(fx, fz)`` per
    edge, exact for straight edges; ``buoyancy = sum fz``.

    Soil: each upward-facing piece is split at z_w and G, where the stress
    has its kinks; on each straight part sigma is linear in x, so
    ``integral of sigma dx = |dx| (sigma_a + sigma_b) / 2`` (plane, times
    the width) and ``2 pi integral of sigma r dr = 2 pi |dr| (sigma_a (2 r_a
    + r_b) + sigma_b (r_a + 2 r_b)) / 6`` (axisymmetric) are exact.

    Base: along each floor edge the net pressure
    ``rho_w g (z_w - z_u(x))+ - p_liquid(z_f(x))`` is piecewise linear in x,
    z_f the floor and z_u the first point of the outer outline straight
    below it; its largest value is at an end of a straight stretch or where
    the free surface crosses a sloping floor, and those points are all
    checked, so the governing value is exact. (A floor with more cavity
    below it than structure is not treated specially: its underside is the
    outer outline's.)

    Flotation: ``U = max(buoyancy, 0)``, ``R = G + extra + soil +
    anchorage``, factor ``R / U`` (None for U = 0).

    Examples
    --------
    An open concrete box 3 m wide and 4 m deep per metre, walls 0.3 m,
    base 0.4 m, groundwater at its rim (derived from first principles,
    common practice): U = 9806.65 x 12 = 117679.8 N, G = 25000 x 3.36 =
    84000 N, factor 0.714.

    >>> cav = Section.build([[0.3, 0.4], [2.7, 0.4], [2.7, 4], [0.3, 4]],
    ...                     parts=["floor", "wall", "open", "wall"])
    >>> box = Structure.build([[0, 0], [3, 0], [3, 4], [0, 4]], cavity=cav)
    >>> f = exterior_loads(box, cav, groundwater=Groundwater(4.0)).flotation
    >>> round(f.uplift, 6), round(f.resistance, 6), round(f.factor, 4), f.ok
    (117679.8, 84000.0, 0.7138, False)
    """
    if geometry is None:
        geometry = exterior_geometry(structure, cavity)
    else:
        same_structure = geometry.structure is structure or geometry.structure == structure
        same_cavity = geometry.cavity is cavity or geometry.cavity == cavity
        if not (same_structure and same_cavity):
            raise ValueError(
                "the exterior geometry was computed for another structure or cavity")
    required_factor = _number(required_factor, "required flotation factor", 0.0, math.inf,
                              "", lo_open=True)
    if liquid_solution is not None:
        if liquid_solution.section is not cavity and liquid_solution.section != cavity:
            raise ValueError("the liquid solution is of another section than the cavity")
        if gravity is not None and float(gravity) != liquid_solution.gravity:
            raise ValueError(
                f"gravity {float(gravity):g} m/s2 differs from the liquid solution's "
                f"{liquid_solution.gravity:g} m/s2")
        gravity = liquid_solution.gravity
    elif gravity is None:
        gravity = STANDARD_GRAVITY
    gravity = _number(gravity, "gravity", *GRAVITY_RANGE, "m/s2")
    if groundwater is not None and cavity.is_open and groundwater.level > cavity.spill_level:
        raise ValueError(
            f"groundwater level {groundwater.level:.6g} m is above the spill level "
            f"{cavity.spill_level:.6g} m of the open section: the water would flood the cavity")
    if ground is not None and groundwater is not None:
        rw = groundwater.unit_weight(gravity)
        if ground.unit_weight_saturated < rw:
            raise ValueError(
                f"saturated soil unit weight {ground.unit_weight_saturated:g} N/m3 is less than "
                f"the groundwater's {rw:.6g} N/m3 (rho_w g): the soil would float")

    axi = cavity.is_axisymmetric
    scale = 1.0 if axi else cavity.width
    key = (None if groundwater is None else (groundwater.level, groundwater.density), gravity,
           ground)
    outside = None if cache is None else cache.get(key)
    if outside is None:
        outside = _outside(geometry, groundwater, ground, gravity, axi, scale)
        if cache is not None:
            cache[key] = outside
    fx, fz, p0, p1, buoyancy, soil_fz, soil_weight, warnings = outside

    extra = structure.extra_weight * scale
    anchorage = structure.anchorage * scale
    uplift = max(buoyancy, 0.0)
    resistance = geometry.self_weight + extra + soil_weight + anchorage
    factor = resistance / uplift if uplift > 0.0 else None
    flotation = Flotation(uplift=uplift, resistance=resistance, factor=factor,
                          required=required_factor)
    return StructureLoads(
        structure=structure, cavity=cavity, groundwater=groundwater, ground=ground, gravity=gravity,
        self_weight=geometry.self_weight, extra_weight=extra, anchorage=anchorage,
        soil_weight=soil_weight, buoyancy=buoyancy, fx=fx, fz=fz, p_water_start=p0,
        p_water_end=p1, soil_fz=soil_fz, flotation=flotation, warnings=warnings,
        _base_inputs=(geometry, groundwater, gravity, liquid_solution))


def _outside(geometry, groundwater, ground, gravity, axi, scale):
    """Groundwater and soil on the outer edges: (fx, fz, p_water_start,
    p_water_end, buoyancy, soil_fz, soil_weight, warnings), arrays read-only."""
    outer = geometry.outer
    n = outer.n_edges
    if groundwater is None:
        zero = np.zeros(n)
        fx = np.full(n, np.nan) if axi else zero.copy()
        fz, p0, p1 = zero.copy(), zero.copy(), zero.copy()
        buoyancy = 0.0
    else:
        sol = solve(outer, groundwater.level, groundwater.density, gravity)
        fx = np.subtract(0.0, sol.fx)  # not -fx, which gives -0.0 when dry
        fz = np.subtract(0.0, sol.fz)
        p0, p1 = sol.p_start, sol.p_end
        buoyancy = float(fz.sum())
    soil_fz = np.zeros(n)
    warnings = []
    if ground is not None and geometry.soil_owner.size:
        w = _soil_on_pieces(geometry, ground, groundwater, gravity, axi)
        w *= -scale
        soil_fz = np.bincount(geometry.soil_owner, weights=w, minlength=n) + 0.0  # no -0.0
        hung = geometry._overhung_edges
        under = hung[soil_fz[hung] < 0.0]
        if under.size:
            listed = ", ".join(str(k) for k in under[:5].tolist()) \
                + (" ..." if under.size > 5 else "")
            warnings.append(
                f"soil on structure edge(s) {listed} is taken up to the ground surface, but the "
                f"structure lies above (edge {geometry.overhung[under[0]]} over edge {under[0]}): "
                "the soil weight there is overstated")
    soil_weight = float(-soil_fz.sum()) + 0.0
    for a in (fx, fz, p0, p1, soil_fz):
        a.setflags(write=False)
    return fx, fz, p0, p1, buoyancy, soil_fz, soil_weight, tuple(warnings)


def _soil_on_pieces(geometry, ground, groundwater, gravity, axi):
    """Integral of the soil stress over each piece's horizontal projection
    [N/m for plane, N for axisymmetric], exact (see :func:`exterior_loads`).

    The stress is linear along a piece between the levels z_w and G, so a
    piece lying within one band is integrated from its end values at once;
    only the pieces that straddle z_w or G are split there first.
    """
    x0, z0, x1, z1, z_lo, z_hi = geometry._soil_arrays
    gl = ground.level
    gd = ground.unit_weight_dry
    if groundwater is None:
        kinks = (gl,)

        def sigma(z):
            out = np.subtract(gl, z)
            np.maximum(out, 0.0, out=out)
            out *= gd
            return out
    else:
        zw = groundwater.level
        sub = ground.unit_weight_saturated - groundwater.unit_weight(gravity)
        low = min(gl, zw)
        kinks = (gl, zw)

        def sigma(z):
            out = np.maximum(z, zw)
            np.subtract(gl, out, out=out)
            np.maximum(out, 0.0, out=out)
            out *= gd
            wet = np.subtract(low, z)
            np.maximum(wet, 0.0, out=wet)
            wet *= sub
            out += wet
            return out

    w = _trapezoids(x0, x1, sigma(z0), sigma(z1), axi)
    straddle = np.zeros(z0.shape, dtype=bool)
    for zk in kinks:
        straddle |= (z_lo < zk) & (z_hi > zk)
    idx = np.flatnonzero(straddle)
    if idx.size:
        xa, za, xb, zb = x0[idx], z0[idx], x1[idx], z1[idx]
        dz = zb - za  # not zero: the piece straddles a level
        t = np.empty((len(kinks) + 2, idx.size))
        t[0] = 0.0
        t[-1] = 1.0
        for j, zk in enumerate(kinks):
            np.clip((zk - za) / dz, 0.0, 1.0, out=t[j + 1])
        t.sort(axis=0)
        x = xa + t * (xb - xa)
        sg = sigma(za + t * dz)
        w[idx] = _trapezoids(x[:-1], x[1:], sg[:-1], sg[1:], axi).sum(axis=0)
    return w


def _trapezoids(xa, xb, sa, sb, axi):
    """Exact integral of a stress linear from ``sa`` at x = ``xa`` to ``sb`` at
    ``xb`` over the horizontal projection: per unit width (plane) or over the
    revolution, ``2 pi int sigma r dr`` (axisymmetric) [N/m or N]."""
    span = np.abs(xb - xa)
    if not axi:
        out = sa + sb
        out *= span
        out *= 0.5
        return out
    out = (sa * (2.0 * xa + xb) + sb * (xa + 2.0 * xb))
    out *= span
    out *= 2.0 * np.pi / 6.0
    return out


def _liquid_pressure(solution, z):
    """Pressure of the cavity's liquid (and gas) on the floor at heights ``z`` [Pa].

    The solution's pressure law: ``p_gas + sum_k c_k (b_k - z)+`` (one liquid
    under no gas: ``rho g (h - z)+``). A floor lies under the liquid, never
    in a pocket of trapped air.
    """
    if solution is None:
        return np.zeros_like(z)
    law = solution.law
    if law is None or (law.n_layers == 1 and law.gas_pressure == 0.0):
        return solution.density * solution.gravity * np.maximum(solution.level - z, 0.0)
    return law.pressure(z)


def _kink_levels(solution):
    """Levels where the liquid's pressure kinks [m]: the free surface and the
    interfaces with a density step (empty without a solution)."""
    if solution is None:
        return ()
    law = solution.law
    if law is None or (law.n_layers == 1 and law.gas_pressure == 0.0):
        return (solution.level,)
    return tuple(law.ramp_levels.tolist())


def _base_candidates(geometry, groundwater, gravity, solution):
    """(P, 2 + K) candidate points of the base pieces: x, z_floor, z_under,
    p_gw, p_liquid, net; the columns after the two ends are where the free
    surface and each interface with a density step (K levels in all) cross a
    sloping floor inside the piece (the left end again where they do not)."""
    owner, xa, xb, fa, fb, ua, ub = geometry._base_columns
    m = xa.size
    kinks = _kink_levels(solution)
    cols = 2 + max(len(kinks), 1)
    xs, zf, zu = np.empty((m, cols)), np.empty((m, cols)), np.empty((m, cols))
    xs[:, 0], zf[:, 0], zu[:, 0] = xa, fa, ua
    xs[:, 1], zf[:, 1], zu[:, 1] = xb, fb, ub
    for c in range(2, cols):
        xs[:, c], zf[:, c], zu[:, c] = xa, fa, ua
    for c, h in enumerate(kinks, start=2):
        cross = np.flatnonzero((fa - h) * (fb - h) < 0)
        if cross.size:
            t = (h - fa[cross]) / (fb[cross] - fa[cross])
            xs[cross, c] = xa[cross] + t * (xb[cross] - xa[cross])
            zf[cross, c] = h
            zu[cross, c] = ua[cross] + t * (ub[cross] - ua[cross])
    if groundwater is None:
        pg = np.zeros_like(zu)
    else:
        pg = np.maximum(groundwater.level - zu, 0.0)
        pg *= groundwater.unit_weight(gravity)
    pl = _liquid_pressure(solution, zf)
    return owner, xs, zf, zu, pg, pl, pg - pl


def _base_pressures(geometry, groundwater, gravity, solution):
    owner, xs, zf, zu, pg, pl, net = _base_candidates(geometry, groundwater, gravity, solution)
    if owner.size == 0:
        empty = np.empty(0)
        return BasePressures(index=np.empty(0, dtype=np.intp), net=empty, x=empty, z=empty,
                             underside=empty, p_groundwater=empty, p_liquid=empty)
    best = np.argmax(net, axis=1)
    row = np.arange(net.shape[0])
    net_b = net[row, best]
    # Largest per floor edge (pieces are grouped by owner, in order; the
    # first piece among equals).
    order = np.lexsort((-net_b, owner))
    first = order[np.r_[True, owner[order][1:] != owner[order][:-1]]]
    c = best[first]
    out = dict(index=np.asarray(geometry.floor_edges, dtype=np.intp), net=net_b[first] + 0.0,
               x=xs[first, c], z=zf[first, c], underside=zu[first, c],
               p_groundwater=pg[first, c], p_liquid=pl[first, c])
    for a in out.values():
        a.setflags(write=False)
    return BasePressures(**out)


def _base_governing(geometry, groundwater, gravity, solution):
    """The :class:`BasePressure` of the largest net over all floor edges
    (the first floor edge, piece and point among equals), or None."""
    owner, xs, zf, zu, pg, pl, net = _base_candidates(geometry, groundwater, gravity, solution)
    if owner.size == 0:
        return None
    k = int(np.argmax(net))  # row-major: pieces in order, then their points
    p, c = divmod(k, net.shape[1])
    return BasePressure(index=geometry.floor_edges[owner[p]], net=float(net[p, c]) + 0.0,
                        point=(float(xs[p, c]), float(zf[p, c])), underside=float(zu[p, c]),
                        p_groundwater=float(pg[p, c]), p_liquid=float(pl[p, c]))


# ------------------------------------------------------------------ record
def _num(v):
    """Plain float for JSON: None for None or NaN, 0.0 for -0.0."""
    if v is None:
        return None
    v = float(v)
    return None if math.isnan(v) else v + 0.0


def structure_record(loads: StructureLoads) -> dict:
    """The ``structure`` object of a case record (section format v3, results).

    Parameters
    ----------
    loads : StructureLoads

    Returns
    -------
    dict
        ``self_weight``, ``extra_weight``, ``soil_weight``, ``anchorage``,
        ``groundwater_level`` (null in dry ground), ``buoyancy``,
        ``exterior_edges`` (per outer edge: ``index``, ``part``, ``fx``
        (null for axisymmetric), ``fz``, ``p_water_start``, ``p_water_end``,
        ``soil_fz``), ``flotation`` (``uplift``, ``resistance``, ``factor``
        (null without uplift), ``required``, ``ok``), as the spec lists them;
        and, added: ``ground_level`` (null without ground), ``base`` (per
        floor edge: ``index``, ``net_upward_pressure``, ``point``,
        ``underside``, ``p_groundwater``, ``p_liquid``) and ``warnings``.
        SI values: N, Pa, m.
    """
    s = loads.structure
    axi = loads.cavity.is_axisymmetric
    b = loads.base
    fx = [None] * s.n_edges if axi else (loads.fx + 0.0).tolist()
    edges = [{"index": i, "part": part, "fx": x, "fz": z, "p_water_start": p0,
              "p_water_end": p1, "soil_fz": soil}
             for i, (part, x, z, p0, p1, soil) in enumerate(zip(
                 s.parts, fx, (loads.fz + 0.0).tolist(), (loads.p_water_start + 0.0).tolist(),
                 (loads.p_water_end + 0.0).tolist(), (loads.soil_fz + 0.0).tolist(),
                 strict=True))]
    f = loads.flotation
    return {
        "self_weight": _num(loads.self_weight),
        "extra_weight": _num(loads.extra_weight),
        "soil_weight": _num(loads.soil_weight),
        "anchorage": _num(loads.anchorage),
        "groundwater_level": _num(loads.groundwater_level),
        "ground_level": None if loads.ground is None else _num(loads.ground.level),
        "buoyancy": _num(loads.buoyancy),
        "exterior_edges": edges,
        "flotation": {"uplift": _num(f.uplift), "resistance": _num(f.resistance),
                      "factor": _num(f.factor), "required": _num(f.required), "ok": f.ok},
        "base": [{"index": i, "net_upward_pressure": net + 0.0, "point": [x + 0.0, z + 0.0],
                  "underside": u + 0.0, "p_groundwater": pg + 0.0, "p_liquid": pl + 0.0}
                 for i, net, x, z, u, pg, pl in zip(
                     b.index.tolist(), b.net.tolist(), b.x.tolist(), b.z.tolist(),
                     b.underside.tolist(), b.p_groundwater.tolist(), b.p_liquid.tolist(),
                     strict=True)],
        "warnings": list(loads.warnings),
    }
