"""Drawing geometry of the loads: the liquid, the free surface, pressure
diagrams, arrows, resultants and where pressure values are written.

Pure numpy and shapely (no Qt): the live canvas and the exported diagram
draw from these same functions, so they show the same thing. Everything in
metres and pascals; the pressure ``scale`` turns a pressure into a drawing
length [m/Pa]. Diagrams are drawn outward from the wall (along the outward
normal, from the liquid into the wall).
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass
from functools import cached_property

import numpy as np
import shapely

from wetline.core.section import AXIS, OPEN

__all__ = ["CORNER_COS", "is_corner", "WettedEdges", "wetted_edges", "auto_scale",
           "diagram_polygons", "chain_starts", "carrying_edges", "axis_edges",
           "pressure_arrows", "arrow_strokes", "PartRun", "part_runs", "run_resultants",
           "LoadMark", "load_marks", "edges_words", "Level", "dimension_levels",
           "numbered", "groundwater_solution", "outer_wetted", "outer_wetted_edges",
           "surface_spans", "liquid_rings", "PressureSite", "pressure_sites",
           "envelope_wetted_edges", "soil_blocks", "LayerInterface", "layer_interfaces",
           "layer_bands", "AirMark", "air_marks", "GasMark", "gas_mark"]


CORNER_COS = math.cos(math.radians(10.0))
"""Two walls meeting at more than 10 degrees make a corner: the diagram
returns to the wall there and the pressure is written there. Below it the
walls are a smooth bend (a curve drawn as a polyline)."""


def is_corner(nx0, nz0, nx1, nz1):
    """True (elementwise) where walls with outward normals (nx0, nz0) and
    (nx1, nz1) meet at a corner, not a smooth bend (see :data:`CORNER_COS`)."""
    return nx0 * nx1 + nz0 * nz1 < CORNER_COS


@dataclass(frozen=True)
class WettedEdges:
    """The wetted (loaded) part of every loaded edge at a level.

    ``index`` edge indices; ``ax, az`` / ``bx, bz`` ends of the wetted part
    [m]; ``pa, pb`` pressures there [Pa]; ``nx, nz`` outward normals.

    Under a law with layers, a gas or trapped air an edge may come in
    several pieces, one after the other along it, cut where the pressure
    kinks (an interface with a density step, the free surface under a gas,
    its pocket's interface): ``index`` repeats, and ``a_inside`` /
    ``b_inside`` mark the piece ends that lie inside their edge (None: no
    edge is cut).
    """

    index: np.ndarray
    ax: np.ndarray
    az: np.ndarray
    bx: np.ndarray
    bz: np.ndarray
    pa: np.ndarray
    pb: np.ndarray
    nx: np.ndarray
    nz: np.ndarray
    a_inside: np.ndarray | None = None
    b_inside: np.ndarray | None = None


def axis_edges(section):
    """Boolean mask of the edges drawn as the axis: parts named ``axis`` and,
    on an axisymmetric section, every edge lying on x = 0."""
    mask = np.fromiter((p == AXIS for p in section.parts), bool, count=section.n_edges)
    if section.is_axisymmetric:
        x = section.outline[:, 0]
        mask |= (x == 0) & (np.roll(x, -1) == 0)
    return mask


def carrying_edges(section):
    """Boolean mask of the edges that carry a pressure diagram: walls, not
    ``open`` edges or the axis (:func:`axis_edges`)."""
    walls = np.fromiter((p != OPEN for p in section.parts), bool, count=section.n_edges)
    return walls & ~axis_edges(section)


def is_general(solution):
    """True if ``solution`` is not one liquid at atmospheric pressure with
    every pocket vented (it has layers of different densities, a gas or
    trapped air), so its pressure may kink inside an edge or act above the
    free surface."""
    law = solution.law
    if law is None:
        return False
    return (law.ramp_levels.size > 1 or law.gas_pressure != 0.0
            or solution.caps is not None)


def wetted_edges(solution, carries=None):
    """:class:`WettedEdges` of a :class:`wetline.core.hydrostatics.Solution`
    (``open`` and ``axis`` edges left out: nothing there carries load).
    ``carries`` is :func:`carrying_edges` of the section, if known.

    One liquid: the wetted part of each edge, p = rho g (h - z)+. Under a
    general law (:func:`is_general`) every loaded edge is cut into the
    pieces along which the pressure P(min(z, cap)) is linear (see
    :mod:`wetline.core.pressure_law`), so the diagram shows the kinks; dry
    edges of a gas space carry the gas pressure, a pocket's ceiling the air
    pressure.
    """
    if is_general(solution):
        return _law_wetted_edges(solution, carries)
    section = solution.section
    geo = section.geometry
    h = solution.level
    rg = solution.density * solution.gravity
    f = np.clip((h - geo.z_low) * geo.inv_abs_dz, 0.0, 1.0)
    if carries is None:
        carries = carrying_edges(section)
    keep = np.flatnonzero((f > 0) & carries & (solution.wetted_length > 0))
    f = f[keep]
    ta = (1.0 - f) * geo.falls[keep]
    tb = ta + f
    x0, z0, dx, dz = geo.x0[keep], geo.z0[keep], geo.dx[keep], geo.dz[keep]
    ax, az = x0 + ta * dx, z0 + ta * dz
    bx, bz = x0 + tb * dx, z0 + tb * dz
    pa = rg * np.maximum(h - az, 0.0)
    pb = rg * np.maximum(h - bz, 0.0)
    return WettedEdges(keep, ax, az, bx, bz, pa, pb, geo.nx[keep], geo.nz[keep])


def edge_caps(solution):
    """Each edge's liquid surface [m]: its pocket's interface, else h."""
    n = solution.section.n_edges
    if solution.caps is not None:
        return np.asarray(solution.caps, dtype=np.float64)
    return np.full(n, float(solution.level))


def _law_wetted_edges(solution, carries):
    section = solution.section
    geo = section.geometry
    law = solution.law
    if carries is None:
        carries = carrying_edges(section)
    keep = np.flatnonzero(carries)
    caps = edge_caps(solution)[keep]
    z0, dz = geo.z0[keep], geo.dz[keep]
    safe = np.where(dz != 0.0, dz, 1.0)
    cols = [np.zeros(keep.size), np.ones(keep.size)]
    for level in np.append(law.ramp_levels, np.inf):
        lv = caps if not np.isfinite(level) else np.minimum(level, caps)
        t = (lv - z0) / safe
        cols.append(np.where((dz != 0.0) & (t > 0.0) & (t < 1.0), t, np.nan))
    ts = np.sort(np.column_stack(cols), axis=1)  # NaN last
    t0, t1 = ts[:, :-1], ts[:, 1:]
    with np.errstate(invalid="ignore"):
        piece = np.isfinite(t0) & np.isfinite(t1) & (t1 > t0)
    rows, cols_ = np.nonzero(piece)  # edge-major, then along the edge
    ta, tb = t0[rows, cols_], t1[rows, cols_]
    edge = keep[rows]
    x0, dx = geo.x0[edge], geo.dx[edge]
    ez0, edz = geo.z0[edge], geo.dz[edge]
    ax, az = x0 + ta * dx, ez0 + ta * edz
    bx, bz = x0 + tb * dx, ez0 + tb * edz
    cap = caps[rows]
    pa = law.pressure_under_cap(az, cap)
    pb = law.pressure_under_cap(bz, cap)
    loaded = (pa != 0.0) | (pb != 0.0)
    # A piece along the wall at exactly its cap is its own neighbour's end.
    loaded &= (bx - ax) ** 2 + (bz - az) ** 2 > 0.0
    k = np.flatnonzero(loaded)
    return WettedEdges(edge[k], ax[k], az[k], bx[k], bz[k], pa[k], pb[k],
                       geo.nx[edge[k]], geo.nz[edge[k]],
                       a_inside=ta[k] > 0.0, b_inside=tb[k] < 1.0)


def pressure_along(solution, index, z):
    """The pressure [Pa] at heights ``z`` [m] of edges ``index`` of
    ``solution``, whatever its law (one liquid, layers, gas, trapped air)."""
    z = np.asarray(z, dtype=np.float64)
    if is_general(solution):
        return solution.law.pressure_under_cap(z, edge_caps(solution)[index])
    return solution.density * solution.gravity * np.maximum(solution.level - z, 0.0)


def auto_scale(section, max_pressure, fraction=0.3):
    """A scale [m/Pa] drawing the largest pressure ``fraction`` of the
    section's size long (1e-6 when there is no pressure)."""
    size = max(float(np.ptp(section.outline[:, 0])), float(np.ptp(section.outline[:, 1])))
    if not max_pressure > 0:
        return 1e-6
    return fraction * size / max_pressure


def diagram_polygons(w, scale, closed=True):
    """The diagrams as few polygons: one per chain of consecutive wetted
    edges (the diagram's outer edge forward from the wall, then back along
    the wall), so a wall of ten thousand edges fills as one polygon (a path
    of thousands of small overlapping polygons takes hundreds of ms to fill).
    ``closed=False``: only the outer edges, from the wall out and back to it
    (to outline the diagrams without stroking the walls again).

    Returns x, z and ``connect`` (False after each polygon's or line's last
    point), for :func:`pyqtgraph.arrayToQPath`.
    """
    m = w.index.size
    if m == 0:
        e = np.empty(0)
        return e, e, np.empty(0, dtype=bool)
    # Each chain: its outer edge forward (outer A, outer B of every edge,
    # dipping to the wall vertex at real kinks so the corner between two
    # diagrams stays empty), then back along the wall. Dipping at every
    # vertex would be exact too, but a path doubling back ten thousand
    # times fills a hundred times slower.
    starts = chain_starts(w)
    kink = np.zeros(m, dtype=bool)  # after edge k
    kink[:-1] = is_corner(w.nx[:-1], w.nz[:-1], w.nx[1:], w.nz[1:])
    nan = np.full(m, np.nan)
    fx = np.column_stack([w.ax + w.pa * scale * w.nx, w.bx + w.pb * scale * w.nx,
                          np.where(kink, w.bx, nan)])
    fz = np.column_stack([w.az + w.pa * scale * w.nz, w.bz + w.pb * scale * w.nz,
                          np.where(kink, w.bz, nan)])
    bounds = np.append(starts, m)
    xs, zs, cs = [], [], []
    for k0, k1 in itertools.pairwise(bounds):
        ox = fx[k0:k1].ravel()
        oz = fz[k0:k1].ravel()
        keep = ~np.isnan(ox)
        keep[-1] = False  # the chain's end is added with the wall below
        back_x = [w.bx[k0:k1][::-1], w.ax[k0:k0 + 1]] if closed else []
        back_z = [w.bz[k0:k1][::-1], w.az[k0:k0 + 1]] if closed else []
        x = np.concatenate([w.ax[k0:k0 + 1], ox[keep], w.bx[k1 - 1:k1], *back_x])
        z = np.concatenate([w.az[k0:k0 + 1], oz[keep], w.bz[k1 - 1:k1], *back_z])
        c = np.ones(x.size, dtype=bool)
        c[-1] = False
        xs.append(x)
        zs.append(z)
        cs.append(c)
    return np.concatenate(xs), np.concatenate(zs), np.concatenate(cs)


def chain_starts(w):
    """Positions in ``w`` where a chain of joined wetted edges starts (the
    previous wetted edge is not the previous edge, or they do not meet).
    The arrays are used in order; a chain wrapping past the last edge is
    split there."""
    m = w.index.size
    if m == 0:
        return np.empty(0, dtype=np.intp)
    size = max(float(np.ptp(np.concatenate([w.ax, w.bx]))),
               float(np.ptp(np.concatenate([w.az, w.bz]))), 1e-300)
    joined = np.zeros(m, dtype=bool)
    step = w.index[1:] - w.index[:-1]
    joined[1:] = (((step == 1) | (step == 0))
                  & (np.abs(w.ax[1:] - w.bx[:-1]) <= 1e-12 * size)
                  & (np.abs(w.az[1:] - w.bz[:-1]) <= 1e-12 * size))
    return np.flatnonzero(~joined)


def pressure_arrows(w, scale, count=48):
    """Tails (on the wall) and tips (at the diagram's outer edge) of
    ``count`` arrows spread evenly along the wetted perimeter, whatever the
    number of edges. Returns tail_x, tail_z, tip_x, tip_z."""
    length = np.sqrt((w.bx - w.ax) ** 2 + (w.bz - w.az) ** 2)
    total = float(length.sum())
    if total <= 0:
        e = np.empty(0)
        return e, e, e, e
    cum = np.cumsum(length)
    s = (np.arange(count) + 0.5) * (total / count)
    edge = np.minimum(np.searchsorted(cum, s, side="right"), length.size - 1)
    t = (s - (cum[edge] - length[edge])) / np.where(length[edge] > 0, length[edge], 1.0)
    px = w.ax[edge] + t * (w.bx[edge] - w.ax[edge])
    pz = w.az[edge] + t * (w.bz[edge] - w.az[edge])
    p = w.pa[edge] + t * (w.pb[edge] - w.pa[edge])
    d = p * scale
    return px, pz, px + d * w.nx[edge], pz + d * w.nz[edge]


def arrow_strokes(tail_x, tail_z, tip_x, tip_z, head):
    """Line segments (pairs of points) drawing arrows: a shaft and two head
    strokes per arrow. ``head`` is the head length [m] (scalar or per
    arrow). Returns x, z for a ``connect='pairs'`` curve."""
    dx = tip_x - tail_x
    dz = tip_z - tail_z
    length = np.sqrt(dx * dx + dz * dz)
    safe = np.where(length > 0, length, 1.0)
    ux, uz = dx / safe, dz / safe
    hl = np.minimum(head, 0.45 * length)
    # Head strokes at +-25 degrees back from the tip.
    c, s = 0.9063, 0.4226
    lx1 = tip_x - hl * (c * ux - s * uz)
    lz1 = tip_z - hl * (s * ux + c * uz)
    lx2 = tip_x - hl * (c * ux + s * uz)
    lz2 = tip_z - hl * (-s * ux + c * uz)
    m = tail_x.size
    x = np.empty((m, 6))
    z = np.empty((m, 6))
    x[:, 0], z[:, 0] = tail_x, tail_z
    x[:, 1], z[:, 1] = tip_x, tip_z
    x[:, 2], z[:, 2] = tip_x, tip_z
    x[:, 3], z[:, 3] = lx1, lz1
    x[:, 4], z[:, 4] = tip_x, tip_z
    x[:, 5], z[:, 5] = lx2, lz2
    return x.ravel(), z.ravel()


@dataclass(frozen=True)
class PartRun:
    """A run of consecutive edges with one part name (edge indices, in
    order; a run may wrap past the last edge)."""

    part: str
    edges: tuple

    @cached_property
    def index(self):
        """The edges as an array of indices (made once: the runs of a
        section's parts outlive a drag of its outline)."""
        return np.asarray(self.edges, dtype=np.intp)


def part_runs(section):
    """The outline split into runs of consecutive edges with the same part;
    ``open`` and ``axis`` runs left out."""
    parts = section.parts
    n = len(parts)
    # Start at an edge whose predecessor has another part, so no run wraps.
    start = next((i for i in range(n) if parts[i] != parts[i - 1]), 0)
    runs, cur = [], [start]
    for k in range(1, n):
        i = (start + k) % n
        if parts[i] == parts[cur[-1]]:
            cur.append(i)
        else:
            runs.append(cur)
            cur = [i]
    runs.append(cur)
    return [PartRun(parts[r[0]], tuple(r)) for r in runs if parts[r[0]] not in (OPEN, AXIS)]


def run_resultants(solution, runs, w=None):
    """Resultant of each run: list of (run, fx, fz, px, pz) with (px, pz)
    the point where it acts [m] and forces [N] (fx NaN for axisymmetric).
    Dry runs are left out.

    Plane: the point on the resultant's line of action nearest the
    force-weighted mean of the edges' centres of pressure (exact line of
    action from the moments). Axisymmetric: the mid-point of the run's
    wetted edges (no single point of action over a revolution).
    """
    out = []
    axi = solution.section.is_axisymmetric
    if w is None:
        w = wetted_edges(solution)
    pos = np.full(solution.section.n_edges, -1, dtype=np.intp)
    pos[w.index] = np.arange(w.index.size)
    for run in runs:
        edges = run.index
        idx = edges[pos[edges] >= 0]
        if idx.size == 0:
            continue
        fz = float(solution.fz[idx].sum())
        if axi:
            k = pos[idx]
            mx = np.concatenate([w.ax[k], w.bx[k]])
            mz = np.concatenate([w.az[k], w.bz[k]])
            length = np.sqrt((w.bx[k] - w.ax[k]) ** 2 + (w.bz[k] - w.az[k]) ** 2)
            wt = np.concatenate([length, length]) + 1e-300
            out.append((run, float("nan"), fz, float(np.average(mx, weights=wt)),
                        float(np.average(mz, weights=wt))))
            continue
        fx = float(solution.fx[idx].sum())
        cp = solution.centre_of_pressure[idx]
        mag = solution.resultant[idx]
        if not mag.sum() > 0:
            continue
        cx = float(np.average(cp[:, 0], weights=mag))
        cz = float(np.average(cp[:, 1], weights=mag))
        f2 = fx * fx + fz * fz
        # Forces that (nearly) cancel have no line of action: keep the
        # force-weighted centre of the edges' centres of pressure.
        if f2 > (1e-9 * float(mag.sum())) ** 2:
            moment = float(np.sum(cp[:, 0] * solution.fz[idx] - cp[:, 1] * solution.fx[idx]))
            t = (moment - (cx * fz - cz * fx)) / f2
            cx, cz = cx + t * fz, cz - t * fx
        out.append((run, fx, fz, cx, cz))
    return out


@dataclass(frozen=True)
class LoadMark:
    """A force to label on a drawing: a part's total or one run of it.

    Attributes
    ----------
    part : str
    edges : tuple of int
        The edges the force acts on (the run's, or every edge of the part).
    fx, fz : float
        The force [N] (fx NaN on an axisymmetric section).
    x, z : float
        Where it acts [m] (see :func:`run_resultants`).
    total : bool
        True: the part's total; False: one run of a part that has several.
    arrow : bool
        Draw an arrow for it: every run, and the total of a part loaded on
        one run only (there the run is the part). The total of a part loaded
        on several runs is a label at its resultant, without an arrow.
    """

    part: str
    edges: tuple
    fx: float
    fz: float
    x: float
    z: float
    total: bool
    arrow: bool

    @property
    def magnitude(self):
        """|F| [N]."""
        return math.hypot(0.0 if math.isnan(self.fx) else self.fx, self.fz)

    def is_uplift(self, biggest):
        """True if the force points up (more than round-off of ``biggest`` [N])."""
        return self.fz > 1e-9 * biggest

    def text(self, value, biggest, upward=None):
        """The label for people with the force written ``value`` ("72.35
        kN/m"): ``floor: 131.8 kN/m`` for a part loaded on one run,
        ``roof: total uplift 35.69 kN/m`` for the total of a part loaded on
        several runs, ``edge 2: uplift 17.85 kN/m`` for one of its runs.

        ``upward``: the force's upward part ``fz``, written as ``value`` is.
        A force that lifts is labelled with its uplift, that upward part
        (what a hold-down resists; the parts table's Fz): ``lip: uplift
        4.902 kN/m`` for the lip of a chamber pushed up and sideways by a
        resultant of 12.07 kN/m, whose arrow shows its slant. Without
        ``upward`` the resultant's size is written."""
        up = self.is_uplift(biggest)
        shown = f"uplift {upward if upward is not None else value}" if up else value
        if self.total:
            return f"{self.part}: {'' if self.arrow else 'total '}{shown}"
        return f"{edges_words(self.edges)}: {shown}"


def edges_words(edges):
    """``"edge 2"``, ``"edges 2, 3"``, ``"edges 5 to 9"``: the edges of a run, in order."""
    if not isinstance(edges, (tuple, list, np.ndarray)):
        edges = tuple(edges)
    first, last = int(edges[0]), int(edges[-1])  # (a run may hold 10,000 edges)
    if len(edges) == 1:
        return f"edge {first}"
    if len(edges) == 2:
        return f"edges {first}, {last}"
    return f"edges {first} to {last}"


def load_marks(solution, runs, w=None):
    """What a drawing labels of the loads, in order of importance: each
    part's total once, then the runs of the parts loaded on several runs.

    A part loaded on one run (its other runs dry, or it has one) gives one
    mark, its total, with an arrow at the run's resultant. A part loaded on
    several runs (a tank's two side walls, a roof either side of a riser)
    gives its total at the resultant of all its wetted edges, without an
    arrow (the line of action of the sum; the force-weighted centre where
    the runs cancel), and one mark per run, with an arrow, named by its
    edges. Totals come largest first, then the runs largest first.

    Parameters
    ----------
    solution : wetline.core.hydrostatics.Solution
    runs : list of PartRun
    w : WettedEdges, optional

    Returns
    -------
    list of LoadMark
    """
    if w is None:
        w = wetted_edges(solution)
    loaded = [(run, fx, fz, x, z) for run, fx, fz, x, z in run_resultants(solution, runs, w)
              if math.hypot(0.0 if math.isnan(fx) else fx, fz) > 0]
    by_part = {}
    for item in loaded:
        by_part.setdefault(item[0].part, []).append(item)
    totals, pieces = [], []
    for part, items in by_part.items():
        if len(items) == 1:
            run, fx, fz, x, z = items[0]
            totals.append(LoadMark(part, run.edges, fx, fz, x, z, total=True, arrow=True))
            continue
        edges = tuple(itertools.chain.from_iterable(run.edges for run, *_ in items))
        (_, fx, fz, x, z), = run_resultants(solution, [PartRun(part, edges)], w) or [
            (None, 0.0, 0.0, float(np.mean([i[3] for i in items])),
             float(np.mean([i[4] for i in items])))]
        totals.append(LoadMark(part, edges, fx, fz, x, z, total=True, arrow=False))
        pieces += [LoadMark(part, run.edges, rfx, rfz, rx, rz, total=False, arrow=True)
                   for run, rfx, rfz, rx, rz in items]
    totals.sort(key=lambda m: -m.magnitude)
    pieces.sort(key=lambda m: -m.magnitude)
    return totals + pieces


def surface_spans(section, level):
    """x-ranges [m] where the free surface z = ``level`` crosses the cavity,
    as a list of (x0, x1); empty below the section and above its roof."""
    pts = section.outline
    size = max(section.z_max - section.z_min, 1e-12)
    h = level - 1e-9 * size
    x0, z0 = pts[:, 0], pts[:, 1]
    x1, z1 = np.roll(x0, -1), np.roll(z0, -1)
    cross = (z0 > h) != (z1 > h)
    with np.errstate(divide="ignore", invalid="ignore"):
        xs = x0[cross] + (h - z0[cross]) * (x1[cross] - x0[cross]) / (z1[cross] - z0[cross])
    xs = np.sort(xs)
    return [(float(xs[k]), float(xs[k + 1])) for k in range(0, len(xs) - 1, 2)]


def liquid_rings(section, level, polygon=None):
    """The liquid: the cavity below ``level`` [m], as rings of (N, 2) points
    [m] (each polygon's outline, then its holes) for an odd-even fill.
    ``polygon`` is ``shapely.Polygon(section.outline)`` if already built."""
    if level <= section.z_min:
        return []
    if polygon is None:
        polygon = shapely.Polygon(section.outline)
    pts = section.outline
    x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
    pad = 1.0 + (x1 - x0) + (section.z_max - section.z_min)
    wet = shapely.clip_by_rect(polygon, x0 - pad, section.z_min - pad, x1 + pad, level)
    rings = []
    for poly in shapely.get_parts(wet):
        if poly.geom_type != "Polygon" or poly.is_empty:
            continue
        for ring in [poly.exterior, *poly.interiors]:
            rings.append(shapely.get_coordinates(ring))
    return rings


@dataclass(frozen=True)
class PressureSite:
    """A place where a pressure value is written: a corner or end of a
    wetted wall, or the middle of a uniform diagram (a horizontal wall).

    ``x, z`` the wall point [m]; ``pressure`` there [Pa]; ``normals`` the
    outward unit normals of the walls meeting there; ``uniform`` True for
    the middle of a uniform diagram, whose wetted part runs from ``along[:2]``
    to ``along[2:]`` [m].
    """

    x: float
    z: float
    pressure: float
    normals: tuple
    uniform: bool = False
    along: tuple = ()

    @property
    def direction(self):
        """The unit direction the value is written in: the mean of the normals."""
        sx = sum(n[0] for n in self.normals)
        sz = sum(n[1] for n in self.normals)
        norm = math.hypot(sx, sz)
        if norm < 1e-6:
            return self.normals[0]
        return sx / norm, sz / norm

    def tip(self, scale):
        """The point [m] at the diagram's outer edge along :attr:`direction`."""
        dx, dz = self.direction
        reach = max(scale * self.pressure * (nx * dx + nz * dz) for nx, nz in self.normals)
        reach = max(reach, 0.0)
        return self.x + dx * reach, self.z + dz * reach


def pressure_sites(w, n_vertices, limit=16):
    """Where the pressure values of the diagrams are written, deepest first.

    The middle of every uniform diagram (a horizontal wall), and each wetted
    end or corner of the other walls (where two walls meet at less than a
    corner, :func:`is_corner`, only the deepest such vertex). At most
    ``limit``: the deepest, then others spread over the range of pressures.

    Parameters
    ----------
    w : WettedEdges
    n_vertices : int
        Vertices of the section (to close the outline).
    limit : int

    Returns
    -------
    list of PressureSite
    """
    m = w.index.size
    if m == 0:
        return []
    pmax = float(max(w.pa.max(), w.pb.max()))
    if not pmax > 0:
        return []
    tol = 1e-9 * pmax
    uniform = (np.abs(w.pa - w.pb) <= tol) & (w.pa > tol)
    # Every wetted end with pressure of the other walls: edge k starts at
    # vertex index[k] and ends at vertex index[k] + 1; grouped by vertex.
    ka = np.flatnonzero(~uniform & (w.pa > tol))
    kb = np.flatnonzero(~uniform & (w.pb > tol))
    vert = np.concatenate([w.index[ka], (w.index[kb] + 1) % n_vertices])
    inside = np.zeros(vert.size, dtype=bool)
    if w.a_inside is not None:
        # A piece end inside its edge (an interface, a pocket's interface):
        # the pieces meeting there share a key past the vertices, and the
        # kink's pressure is written.
        inside = np.concatenate([w.a_inside[ka], w.b_inside[kb]])
        vert = np.where(inside, n_vertices + np.concatenate([ka, kb + 1]), vert)
    order = np.argsort(vert, kind="stable")
    inside = inside[order]
    vert = vert[order]
    edge = np.concatenate([ka, kb])[order]
    pres = np.concatenate([w.pa[ka], w.pb[kb]])[order]
    px = np.concatenate([w.ax[ka], w.bx[kb]])[order]
    pz = np.concatenate([w.az[ka], w.bz[kb]])[order]
    starts = np.flatnonzero(np.r_[True, vert[1:] != vert[:-1]]) if vert.size else vert
    last = np.r_[starts[1:], vert.size] - 1 if vert.size else vert
    e0, e1 = edge[starts], edge[last]
    at = np.maximum(pres[starts], pres[last])
    keep = (last == starts) | is_corner(w.nx[e0], w.nz[e0], w.nx[e1], w.nz[e1])
    if vert.size:
        keep |= inside[starts]
    if starts.size:
        keep[int(np.argmax(at))] = True  # the deepest is written even on a bend
    cu = np.flatnonzero(uniform)
    cv = np.flatnonzero(keep)
    order = np.argsort(-np.concatenate([w.pa[cu], at[cv]]), kind="stable")
    if order.size > limit:
        spread = np.unique(np.linspace(1, order.size - 1, max(limit - 1, 1)).astype(int))
        order = np.concatenate([order[:1], order[spread]])[:limit]
    sites = []
    for j in order.tolist():
        if j < cu.size:
            k = int(cu[j])
            ax, az, bx, bz = float(w.ax[k]), float(w.az[k]), float(w.bx[k]), float(w.bz[k])
            sites.append(PressureSite(0.5 * (ax + bx), 0.5 * (az + bz), float(w.pa[k]),
                                      ((float(w.nx[k]), float(w.nz[k])),), True,
                                      (ax, az, bx, bz)))
            continue
        g = int(cv[j - cu.size])
        ks = sorted({int(e0[g]), int(e1[g])})
        sites.append(PressureSite(float(px[starts[g]]), float(pz[starts[g]]), float(at[g]),
                                  tuple((float(w.nx[k]), float(w.nz[k])) for k in ks)))
    return sites


@dataclass(frozen=True)
class Level:
    """A level a drawing dimensions: its height [m] and what is there
    (``"floor"``, ``"free surface"`` ... joined by " = " where they meet)."""

    z: float
    name: str

    def text(self, units) -> str:
        """Its name and height as the drawing writes them, ``"floor 0 m"``:
        the height to the policy's figures, as the window's labels and the
        dimension lines give it (a free surface found from a volume is a
        result; a level converted to feet is not 12 figures of an input)."""
        return f"{self.name} {units.text(self.z, 'length')}"


def dimension_levels(section, solution, *, groundwater=None, ground=None, interfaces=()):
    """The levels that matter, lowest first: the floor (the section's lowest
    point), the free surface, the spill level (open) or the top (closed),
    liquid interfaces, the groundwater and the ground surface where there
    are any. Levels within a millionth of the section's height of each other
    are one, named by all.

    Parameters
    ----------
    section : Section
    solution : Solution
    groundwater : float, optional
        Groundwater level [m].
    ground : float, optional
        Ground surface level [m].
    interfaces : sequence of (str, float)
        Interfaces between liquid layers: (name, level [m]).

    Returns
    -------
    list of Level
    """
    size = max(section.z_max - section.z_min, 1e-12)
    found = [(section.z_min, "floor")]
    if solution.level > section.z_min:
        found.append((solution.level, "free surface (standpipe)" if solution.head_above_top > 0
                      else "free surface"))
    if section.is_open:
        found.append((section.spill_level, "spill level"))
        if section.z_max > section.spill_level + 1e-6 * size:
            found.append((section.z_max, "top"))
    else:
        found.append((section.z_max, "top"))
    found += [(float(z), str(name)) for name, z in interfaces]
    if groundwater is not None:
        found.append((float(groundwater), "groundwater"))
    if ground is not None:
        found.append((float(ground), "ground"))
    found.sort(key=lambda zn: zn[0])
    out = []
    for z, name in found:
        if out and abs(z - out[-1].z) <= 1e-6 * size:
            if name not in out[-1].name.split(" = "):
                out[-1] = Level(out[-1].z, f"{out[-1].name} = {name}")
            continue
        out.append(Level(float(z), name))
    return out


def numbered(section, limit=48):
    """The vertices and edges a sketch numbers: all of them up to ``limit``,
    else every k-th (k = ceil(n / limit)) and every corner (walls meeting at
    more than 10 degrees), vertex 0 and edge 0 always.

    Returns
    -------
    vertices, edges : numpy.ndarray of int
        Indices, ascending.
    """
    n = section.n_edges
    if n <= limit:
        every = np.arange(n)
        return every, every
    k = math.ceil(n / limit)
    geo = section.geometry
    corner = is_corner(np.roll(geo.nx, 1), np.roll(geo.nz, 1), geo.nx, geo.nz)
    picks = np.zeros(n, dtype=bool)
    picks[::k] = True
    vertices = np.flatnonzero(picks | corner)
    if vertices.size > 2 * limit:  # a jagged outline: every k-th only
        vertices = np.flatnonzero(picks)
    return vertices, np.flatnonzero(picks)


def groundwater_solution(structure, cavity, level, density, gravity):
    """The groundwater standing at ``level`` [m] around a structure (a
    :class:`wetline.core.structure.Structure` around ``cavity``) as a
    :class:`wetline.core.hydrostatics.Solution` of its outer outline: the
    pressure rho g (level - z) on every outer edge below it, with the
    outline's outward normals (what
    :func:`wetline.core.structure.exterior_loads` solves; its forces on the
    structure are the solution's with the sign changed). ``density``
    [kg/m3], ``gravity`` [m/s2].

    The one source of the groundwater's diagram for the canvas
    (:mod:`wetline.app.window.structure_layer`) and the exported diagram
    (:class:`wetline.app.render.diagram_view.DiagramView`).
    """
    from wetline.core.hydrostatics import solve

    return solve(structure.section(cavity), float(level), float(density), float(gravity))


def outer_wetted(solution):
    """:class:`WettedEdges` of a :func:`groundwater_solution`: every outer
    edge below the water but those on the axis (an outer outline has no
    ``open`` edge), normals pointing away from the structure, so its
    diagram is drawn outside the structure, in the ground."""
    outer = solution.section
    return wetted_edges(solution, ~axis_edges(outer))


def outer_wetted_edges(structure, cavity, level, density, gravity):
    """:class:`WettedEdges` of the groundwater on the outer face of a
    structure around ``cavity`` standing at ``level`` [m]:
    :func:`outer_wetted` of :func:`groundwater_solution`.

    Returns
    -------
    WettedEdges
    """
    return outer_wetted(groundwater_solution(structure, cavity, level, density, gravity))


def envelope_wetted_edges(solutions, factors, carries=None):
    """The envelope diagram of several solutions of one section: per wetted
    edge, the largest design pressure over the cases at each end.

    Each case's pressure along an edge is ``rho g (h - z)+`` times its load
    factor; the wetted part of an edge grows with the level, so the ends are
    those of the highest case's wetted part, and the pressure at each end is
    the largest of ``factor * rho * g * (h - z)+`` over the cases there (the
    envelope is exact at the ends; between them the straight line drawn is
    never below it, a maximum of linear functions being convex).
    ``max(pa, pb)`` of each edge is
    :attr:`wetline.core.load_cases.Envelope.edge_max_pressure`.

    Parameters
    ----------
    solutions : sequence of wetline.core.hydrostatics.Solution
        Of one section, one per case.
    factors : sequence of float
        The cases' load factors [].
    carries : numpy.ndarray, optional
        :func:`carrying_edges` of the section.

    Returns
    -------
    WettedEdges
        Design pressures [Pa].
    """
    if not solutions:
        raise ValueError("the envelope needs at least one solution")
    top = max(range(len(solutions)), key=lambda k: solutions[k].level)
    general = any(is_general(s) for s in solutions)
    w = wetted_edges(solutions[top], carries)
    if general:
        # Some case has layers, a gas or trapped air: each loaded edge whole.
        section = solutions[top].section
        geo = section.geometry
        if carries is None:
            carries = carrying_edges(section)
        keep = np.flatnonzero(carries)
        w = WettedEdges(keep, geo.x0[keep], geo.z0[keep], geo.x0[keep] + geo.dx[keep],
                        geo.z0[keep] + geo.dz[keep], np.zeros(keep.size), np.zeros(keep.size),
                        geo.nx[keep], geo.nz[keep])
    pa = np.zeros_like(w.pa)
    pb = np.zeros_like(w.pb)
    for sol, factor in zip(solutions, factors, strict=True):
        np.maximum(pa, float(factor) * pressure_along(sol, w.index, w.az), out=pa)
        np.maximum(pb, float(factor) * pressure_along(sol, w.index, w.bz), out=pb)
    if general:  # the edges no case loads are left out
        k = np.flatnonzero((pa != 0.0) | (pb != 0.0))
        return WettedEdges(w.index[k], w.ax[k], w.az[k], w.bx[k], w.bz[k], pa[k], pb[k],
                           w.nx[k], w.nz[k])
    return WettedEdges(w.index, w.ax, w.az, w.bx, w.bz, pa, pb, w.nx, w.nz)


def soil_blocks(segments, ground_level):
    """The soil standing on upward-facing outer edges: one polygon per piece
    ``[x0, z0, x1, z1]`` [m] (the pieces of
    :attr:`wetline.core.structure.ExteriorGeometry.soil_segments`), from the
    piece up to the ground surface, the part of the piece above the ground
    left out. Returns a list of (N, 2) arrays [m]."""
    blocks = []
    g = float(ground_level)
    for x0, z0, x1, z1 in np.asarray(segments, dtype=float).reshape(-1, 4):
        if z0 >= g and z1 >= g:
            continue
        if (z0 - g) * (z1 - g) < 0:  # cut where it rises through the ground
            t = (g - z0) / (z1 - z0)
            xg = x0 + t * (x1 - x0)
            if z0 > g:
                x0, z0 = xg, g
            else:
                x1, z1 = xg, g
        if x1 == x0:
            continue
        blocks.append(np.array([[x0, z0], [x1, z1], [x1, g], [x0, g]]))
    return blocks


@dataclass(frozen=True)
class LayerInterface:
    """An interface between two liquid layers of a solution.

    ``level`` [m]; ``lower`` / ``upper`` the layers' names; ``spans`` the
    x-ranges [m] where it crosses the cavity; ``pressure`` there [Pa].
    """

    level: float
    lower: str
    upper: str
    spans: list
    pressure: float

    @property
    def text(self):
        """``fats, oils and grease on raw sewage``: what the label names."""
        return f"{self.upper} on {self.lower}"


def layer_interfaces(solution):
    """The interfaces of ``solution``'s layers, bottom up (empty for one
    liquid), each crossing the cavity (list of :class:`LayerInterface`)."""
    layers = solution.layers
    if len(layers) < 2:
        return []
    section = solution.section
    law = solution.law
    out = []
    for below, above in itertools.pairwise(layers):
        z = float(below.top)
        p = law.pressure_at(z) if law is not None else 0.0
        out.append(LayerInterface(z, below.name or "liquid", above.name or "liquid",
                                  surface_spans(section, z), float(p)))
    return out


def layer_bands(solution, polygon=None):
    """The cavity's part of each layer above the bottom one: a list of
    rings (as :func:`liquid_rings`) per layer from the second up (the
    bottom layer is the liquid drawn below everything)."""
    layers = solution.layers
    if len(layers) < 2:
        return []
    section = solution.section
    if polygon is None:
        polygon = shapely.Polygon(section.outline)
    pts = section.outline
    x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
    pad = 1.0 + (x1 - x0) + (section.z_max - section.z_min)
    out = []
    for layer in layers[1:]:
        band = shapely.clip_by_rect(polygon, x0 - pad, float(layer.bottom), x1 + pad,
                                    float(layer.top))
        rings = []
        for poly in shapely.get_parts(band):
            if poly.geom_type != "Polygon" or poly.is_empty:
                continue
            for ring in [poly.exterior, *poly.interiors]:
                rings.append(shapely.get_coordinates(ring))
        out.append(rings)
    return out


@dataclass(frozen=True)
class AirMark:
    """A pocket of trapped air as drawn: ``rings`` its air region (as
    :func:`liquid_rings`), ``interface`` its air-liquid interface [m] and
    ``spans`` where that crosses the pocket, ``air_pressure`` [Pa] gauge,
    ``air_volume`` [m3], ``sealed_at`` its lip [m], ``at`` a point inside
    the air for its label (x, z) [m]."""

    rings: list
    interface: float
    spans: list
    air_pressure: float
    air_volume: float
    sealed_at: float
    at: tuple


def air_marks(solution):
    """The pockets of trapped air of ``solution`` (list of :class:`AirMark`;
    empty with vented pockets). Costs a polygon intersection per pocket."""
    out = []
    section = solution.section
    for pocket in solution.pockets:
        region = pocket.air_region(section)
        rings = []
        for poly in shapely.get_parts(region):
            if poly.geom_type != "Polygon" or poly.is_empty:
                continue
            for ring in [poly.exterior, *poly.interiors]:
                rings.append(shapely.get_coordinates(ring))
        if not rings:
            continue
        z = float(pocket.interface)
        xs = np.concatenate([r[:, 0] for r in rings])
        xmin, xmax = float(xs.min()), float(xs.max())
        spans = [(a, b) for a, b in surface_spans(section, z)
                 if b > xmin - 1e-9 and a < xmax + 1e-9]
        spans = [(max(a, xmin), min(b, xmax)) for a, b in spans]
        inside = region.representative_point()
        out.append(AirMark(rings, z, spans, float(pocket.air_pressure),
                           float(pocket.air_volume), float(pocket.sealed_at),
                           (float(inside.x), float(inside.y))))
    return out


@dataclass(frozen=True)
class GasMark:
    """The gas over the free surface of a closed section as labelled:
    ``at`` a point (x, z) [m] inside the main gas space (above the free
    surface, outside any trapped air) and ``pressure`` its gauge pressure
    [Pa], which also loads the dry walls and roof of that space."""

    at: tuple
    pressure: float


def gas_mark(solution, polygon=None):
    """Where to label the gas over the free surface of ``solution``
    (:class:`GasMark`), or None: no gas pressure, an open section, or no gas
    space left (full, or a standpipe head)."""
    section = solution.section
    p = float(getattr(solution, "gas_pressure", 0.0) or 0.0)
    h = float(solution.level)
    if p == 0.0 or section.is_open or not h < section.z_max:
        return None
    if polygon is None:
        polygon = shapely.Polygon(section.outline)
    pts = section.outline
    x0, x1 = float(pts[:, 0].min()), float(pts[:, 0].max())
    pad = 1.0 + (x1 - x0) + (section.z_max - section.z_min)
    space = shapely.clip_by_rect(polygon, x0 - pad, max(h, section.z_min), x1 + pad,
                                 section.z_max + pad)
    for pocket in solution.pockets:
        space = shapely.difference(space, pocket.air_region(section))
    parts = [g for g in shapely.get_parts(space) if g.geom_type == "Polygon" and g.area > 0]
    if not parts:
        return None
    best = max(parts, key=lambda g: g.area)
    inside = best.representative_point()
    return GasMark((float(inside.x), float(inside.y)), p)
