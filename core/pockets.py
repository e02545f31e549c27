"""Air trapped under ceilings: which pockets the rising liquid seals, and
where their compressed air stands.

The geometry (level independent, :func:`find_pockets`)
------------------------------------------------------
The cavity is a simple polygon. As a level s falls, the components of its
part above s, {z > s}, change only at boundary extrema (a run of equal z
counts as one vertex):

- a local maximum with the cavity below it (a ceiling apex, a convex
  vertex) starts a component;
- a local minimum with the cavity below it (the tip of a lip or downstand,
  a reflex vertex) is a saddle: two components meet there;
- a local maximum with the cavity above it (a floor spike, reflex) and a
  local minimum with the cavity above it (a V floor, convex) change nothing.

Between consecutive extrema the boundary is a monotone chain, and at any
level each chain belongs to the component holding its top. Sweeping the
extrema downward with a union-find over the chains gives the merge tree: a
leaf per apex, an inner node per saddle; a floor spike's chains join the
component directly above it (a vertical ray to the first edge above). The
main gas space is the component holding the ``open`` edges (open sections)
or the highest point (closed sections); every tree node holding it is
*vented*.

The air (level dependent, :func:`trap_air`)
-------------------------------------------
Walking up from the bottom as the liquid rises: at each saddle below the
free surface h where a vented component splits, each child without the vent
is a pocket sealed at the saddle level z_lip, holding the "air mass"
K = (p_atm + p_gas) V0, V0 its volume above z_lip. The pocket's volume
above z, V(z), is the Green sum over the edges of its subtree clipped above z
(the chords across the cavity are horizontal and add nothing):

.. math:: V(z) = s \\sum_e \\int_{e,\\,z' \\ge z} x\\,dz' \\;(\\times w), \\qquad
          s\\,\\pi \\sum_e \\int_{e,\\,z' \\ge z} x^2\\,dz'

piecewise quadratic (plane) or cubic (axisymmetric) between vertex heights.
At level h the interface z_i solves Boyle's law (isothermal, air weightless)

.. math:: (p_\\mathrm{atm} + P(z_i))\\, V(z_i) = K

whose left side falls as z_i rises. It is bracketed between the pocket's
vertex heights and the layer interfaces (where P kinks), then solved in that
band from the band's exact polynomial (fitted through exact volumes at
equally spaced levels, as :mod:`wetline.core.fill` does). If z_i passes a
saddle inside the pocket, the pocket split there: the air divides in
proportion to the children's volumes at that saddle (all at the pressure of
that moment), and each child is solved on its own.

Every wall point of a pocket then feels P(min(z, z_i)) (see
:mod:`wetline.core.pressure_law`): :attr:`PocketState.caps` gives each edge
its liquid surface level for :func:`wetline.core.pressure_law.integrate_edges`.

References: Boyle's law (isothermal ideal gas, p V = const) and hydrostatics,
Cengel & Cimbala, *Fluid Mechanics*, sec. 3-1 and 2-2; the merge tree of a
height function (superlevel-set components, changes only at critical
points): Carr, Snoeyink & Axen, "Computing contour trees in all
dimensions", Computational Geometry 24 (2003), from memory.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from .fill import FillError, capacity, level_for_volume, volume_below
from .pressure_law import PressureLaw, _check_law_fits
from .section import OPEN, Section

__all__ = [
    "STANDARD_ATMOSPHERE",
    "Pocket",
    "PocketError",
    "PocketState",
    "PocketTree",
    "find_pockets",
    "level_for_liquid_volume",
    "trap_air",
]

STANDARD_ATMOSPHERE = 101325.0
"""Standard atmospheric pressure [Pa] (ISO 2533; the default of the section
format's ``atmospheric_pressure``)."""

_APEX, _SADDLE, _SPIKE, _VALLEY = 0, 1, 2, 3


class PocketError(ValueError):
    """Trapped air that cannot be computed (an absolute pressure below zero,
    more liquid than the section holds with its air ...). One-line message."""


@dataclass(frozen=True, eq=False)
class PocketTree:
    """Where the rising liquid can trap air in a section (level independent).

    Build it with :func:`find_pockets`. Nodes are components of the cavity
    above a level: leaves start at ceiling apexes, inner nodes at saddles
    (lips and downstand tips) where their children meet.

    Attributes
    ----------
    section : Section
    may_trap : bool
        False when no level can seal a pocket (no saddle, or every part
        that a saddle cuts off holds the vent).
    level : numpy.ndarray
        (M,) apex height of a leaf, saddle height of an inner node [m].
    parent : numpy.ndarray
        (M,) index of the parent node, -1 for the root.
    children : tuple of tuple of int
        Child nodes of each node (empty for a leaf).
    top : numpy.ndarray
        (M,) highest point of each node's subtree [m].
    apex : numpy.ndarray
        (M, 2) a highest vertex of each node's subtree [m].
    vented : numpy.ndarray
        (M,) True where the node holds the vent (the main gas space).
    root : int
        The node holding the whole cavity below the lowest saddle (-1 when
        the tree is empty).
    edge_order : numpy.ndarray
        (N,) edge indices grouped by subtree: node k's subtree holds edges
        ``edge_order[edge_start[k]:edge_end[k]]``.
    edge_start, edge_end : numpy.ndarray
        (M,) ranges into ``edge_order``.
    """

    section: Section
    may_trap: bool
    level: np.ndarray
    parent: np.ndarray
    children: tuple
    top: np.ndarray
    apex: np.ndarray
    vented: np.ndarray
    root: int
    edge_order: np.ndarray
    edge_start: np.ndarray
    edge_end: np.ndarray
    _edges: dict = field(default_factory=dict, repr=False)
    _bands: dict = field(default_factory=dict, repr=False)
    _fixed: dict = field(default_factory=dict, repr=False)

    @property
    def n_nodes(self):
        return int(self.level.size)

    def subtree_edges(self, node):
        """Edge indices of ``node``'s subtree (read-only array)."""
        return self.edge_order[self.edge_start[node]:self.edge_end[node]]

    def volume_above(self, node, z):
        """Volume of ``node``'s subtree above height ``z`` [m3] (times the
        width for plane sections); meaningful for z at or above the level
        where the node joins its parent.

        .. math:: V(z) = s \\sum_e \\int_{e,\\,z' \\ge z} x\\,dz'

        Examples
        --------
        A closed box with a downstand: the left dome (1 m wide, 0.5 m from
        the tip at z = 1.5 to the roof at 2) holds 0.3 m2 above z = 1.7.

        >>> s = Section.build([[0, 0], [3, 0], [3, 2], [1.2, 2], [1.2, 1.5],
        ...                    [1, 1.5], [1, 2], [0, 2]])
        >>> t = find_pockets(s)
        >>> left = [k for k in range(t.n_nodes) if not t.children[k] and t.apex[k, 0] < 1][0]
        >>> round(t.volume_above(left, 1.7), 12)
        0.3
        """
        return self._volume_above(node, float(z))

    # --------------------------------------------------------- internals
    def _arrays(self, node):
        """The edges of ``node``'s subtree that reach above the level where it
        joins its parent (no others bound it there), as arrays."""
        got = self._edges.get(node)
        if got is None:
            geo = self.section.geometry
            e = self.subtree_edges(node)
            z0 = geo.z0[e]
            z1 = geo.vertex_z[e + 1]
            zh = np.maximum(z0, z1)
            p = self.parent[node]
            if p >= 0:
                keep = zh > self.level[p]
                e, z0, z1, zh = e[keep], z0[keep], z1[keep], zh[keep]
            got = dict(edges=e, zh=zh, inv=geo.inv_abs_dz[e],
                       heights=np.unique(np.concatenate([z0, z1])))
            got.update(self._coefficients(e))
            got["edges"].setflags(write=False)
            self._edges[node] = got
        return got

    def _coefficients(self, e):
        """Per-edge vectors that make V(z) a few dot products in the clipped
        fraction fa = clip((z_high - z) / |dz|, 0, 1) of each edge above z.

        The part above z runs from the edge's upper end X (its end, rising;
        its start, falling) a fraction fa of the edge along it, to
        Y = X + fa D (D = -dx rising, dx falling). Green's integrals over it:

        - plane, int x dz = dz fa (X + fa D / 2): V = s w (fa . dz X + fa^2 . dz D / 2),
          with x measured from a reference x_ref (the chords close every
          boundary, so sum dz = 0 and the shift changes nothing but round-off);
        - axisymmetric, int x^2 dz = dz fa (X^2 + X Y + Y^2) / 3
          = dz (fa X^2 + fa^2 X D + fa^3 D^2 / 3): V = s pi (...).
        """
        geo = self.section.geometry
        s = self.section
        dx, dz = geo.dx[e], geo.dz[e]
        rises = dz > 0
        x_end = geo.x0[(e + 1) % s.n_edges]
        if not s.is_axisymmetric:
            x_ref = self._edges.get("x_ref")
            if x_ref is None:
                x_ref = self._edges["x_ref"] = 0.5 * (float(s.outline[:, 0].min())
                                                      + float(s.outline[:, 0].max()))
            x_top = np.where(rises, x_end, geo.x0[e]) - x_ref
            d = np.where(rises, -dx, dx)
            scale = s.orientation * s.width
            return dict(c=(dz * x_top * scale, dz * d * (0.5 * scale)))
        x_top = np.where(rises, x_end, geo.x0[e])
        d = np.where(rises, -dx, dx)
        scale = s.orientation * np.pi
        return dict(c=(dz * x_top * x_top * scale, dz * x_top * d * scale,
                       dz * d * d * (scale / 3.0)))

    def pocket_edges(self, node):
        """Edges of ``node``'s subtree that reach above the level where the
        node joins its parent: the walls of the pocket it makes (read-only)."""
        return self._arrays(node)["edges"]

    def _volume_above(self, node, z):
        return float(self._volumes_above(node, np.array([z]))[0])

    def _volumes_above(self, node, zs):
        """:meth:`volume_above` at the levels ``zs`` (M,) at once [m3]."""
        a = self._arrays(node)
        c = a["c"]
        if c[0].size == 0:
            return np.zeros(zs.shape)
        fa = np.subtract(a["zh"], zs[:, None])
        np.multiply(fa, a["inv"], out=fa)
        np.maximum(fa, 0.0, out=fa)  # clip to [0, 1]; np.clip costs more on small arrays
        np.minimum(fa, 1.0, out=fa)
        v = fa @ c[0]
        fk = fa * fa
        v += fk @ c[1]
        if len(c) > 2:
            fk *= fa
            v += fk @ c[2]
        return v

    def _volume_at_critical(self, node, z):
        """:meth:`volume_above` at a level of the tree itself (a lip or a
        saddle): the same at every free surface, so kept."""
        key = (node, z)
        v = self._fixed.get(key)
        if v is None:
            v = self._fixed[key] = self._volume_above(node, z)
        return v

    def _heights_between(self, node, lo, hi):
        """Distinct vertex heights of ``node``'s subtree strictly inside (lo, hi)."""
        h = self._arrays(node)["heights"]
        i = np.searchsorted(h, lo, side="right")
        j = np.searchsorted(h, hi, side="left")
        return h[i:j]


def find_pockets(section):
    """The merge tree of the cavity's parts above each level (see the module
    notes): where air can be trapped, built once per section.

    Parameters
    ----------
    section : Section

    Returns
    -------
    PocketTree
        ``may_trap`` is False, and the tree empty, when the outline has no
        saddle (classification only, O(N) vectorised).

    Examples
    --------
    A chamber whose roof (at 2 m) lies below the top of a riser (to 4 m,
    open) and whose riser wall reaches down to 1.5 m:

    >>> s = Section.build([[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5],
    ...                    [0.8, 1.5], [0.8, 4], [0, 4]],
    ...                   parts=["floor", "wall", "roof", "wall", "wall", "wall",
    ...                          "open", "wall"])
    >>> t = find_pockets(s)
    >>> t.may_trap, t.n_nodes, float(t.level[t.root])
    (True, 3, 1.5)
    """
    geo = section.geometry
    n = section.n_edges
    eff = np.sign(geo.dz)
    flat = np.flatnonzero(eff == 0)
    if flat.size:
        # Horizontal edges take the sign of the last sloping edge before them.
        idx = np.arange(n)
        idx[flat] = -1
        np.maximum.accumulate(idx, out=idx)
        idx[idx < 0] = int(np.flatnonzero(eff)[-1])
        eff = eff[idx]
    change = np.empty(n, dtype=bool)
    np.not_equal(eff[1:], eff[:-1], out=change[1:])
    change[0] = eff[0] != eff[-1]
    turns = np.flatnonzero(change)  # vertex v starts the first sloping edge after a turn
    before = turns - 1  # the edge arriving at the turn (-1: the last edge)
    cross = geo.dx[before] * geo.dz[turns] - geo.dz[before] * geo.dx[turns]
    convex = section.orientation * cross > 0
    is_max = eff[turns] < 0
    kind = np.where(is_max, np.where(convex, _APEX, _SPIKE), np.where(convex, _VALLEY, _SADDLE))
    if not np.any(kind == _SADDLE):
        return _empty_tree(section)
    return _build_tree(section, turns, kind)


def _empty_tree(section):
    e = np.empty(0, dtype=np.intp)
    f = np.empty(0)
    return PocketTree(section=section, may_trap=False, level=f, parent=e, children=(),
                      top=f, apex=np.empty((0, 2)), vented=np.empty(0, dtype=bool), root=-1,
                      edge_order=e, edge_start=e, edge_end=e)


def _build_tree(section, turns, kind):
    geo = section.geometry
    n = section.n_edges
    m = turns.size
    # Chain j is the monotone run of edges turns[j] .. turns[j + 1] - 1 (cyclic).

    def chain_of(edges):
        return (np.searchsorted(turns, edges, side="right") - 1) % m

    z_turn = geo.z0[turns]
    order = np.lexsort((kind, -z_turn))  # by level, falling; at a level apex, saddle, spike

    # Floor spikes: the edge directly above each one. Below the lowest saddle
    # the cavity is one component (the root), so those need no ray.
    lowest_saddle = float(z_turn[kind == _SADDLE].min())
    spikes = np.flatnonzero((kind == _SPIKE) & (z_turn >= lowest_saddle))
    above = _edges_above(section, turns[spikes]) if spikes.size else np.empty(0, dtype=np.intp)
    edge_above = dict(zip(spikes.tolist(), above.tolist(), strict=True))

    uf = list(range(m))

    def find(c):
        while uf[c] != c:
            uf[c] = uf[uf[c]]
            c = uf[c]
        return c

    node_of_root = {}
    birth = [-1] * m
    level, parent, children, apex = [], [], [], []
    root = -1
    for j in order.tolist():
        k = int(kind[j])
        if k == _VALLEY:
            continue
        a, b = (j - 1) % m, j
        v = int(turns[j])
        z = float(z_turn[j])
        if k == _APEX:
            node = len(level)
            level.append(z)
            parent.append(-1)
            children.append(())
            apex.append((float(geo.x0[v]), z))
            uf[find(a)] = find(b)
            node_of_root[find(b)] = node
            birth[a] = birth[b] = node
        elif k == _SADDLE:
            ra, rb = find(a), find(b)
            na, nb = node_of_root.get(ra), node_of_root.get(rb)
            if na is None or nb is None or na == nb:  # pragma: no cover - topology
                continue
            node = len(level)
            level.append(z)
            parent.append(-1)
            children.append((na, nb))
            parent[na] = parent[nb] = node
            apex.append(apex[na] if apex[na][1] >= apex[nb][1] else apex[nb])
            uf[ra] = rb
            node_of_root[rb] = node
            root = node
        else:  # spike: join the component directly above
            if z < lowest_saddle:
                node = root
            else:
                e = edge_above.get(j, -1)
                node = node_of_root.get(find(int(chain_of(e)))) if e >= 0 else None
                if node is None:  # pragma: no cover - the cavity is above a reflex maximum
                    node = root
            birth[a] = birth[b] = node
    n_nodes = len(level)
    level_a = np.array(level)
    top = level_a.copy()
    size = np.ones(n_nodes, dtype=np.intp)
    # Children are created before their parents: one pass fills the subtrees.
    for k in range(n_nodes):
        if parent[k] >= 0:
            top[parent[k]] = max(top[parent[k]], top[k])
            size[parent[k]] += size[k]

    # Vent: the node where a chain holding an open edge starts (open
    # sections), or every apex at the very top (closed); and their ancestors.
    vented = np.zeros(n_nodes, dtype=bool)
    if section.is_open:
        open_edges = np.flatnonzero(geo.part_index == section.part_names.index(OPEN))
        seeds = {birth[c] for c in np.unique(chain_of(open_edges)).tolist()}
    else:
        seeds = {k for k in range(n_nodes) if not children[k] and level[k] == section.z_max}
    for k in seeds:
        while k >= 0 and not vented[k]:
            vented[k] = True
            k = parent[k]
    may_trap = bool(any(not vented[c] for k in range(n_nodes) for c in children[k]))

    # Preorder: each subtree is a contiguous run of nodes, and of edges when
    # the chains are laid out node by node.
    rank = [0] * n_nodes
    preorder = []
    stack = [root]
    while stack:
        k = stack.pop()
        rank[k] = len(preorder)
        preorder.append(k)
        stack.extend(reversed(children[k]))
    chains_of_node = [[] for _ in range(n_nodes)]
    for c, k in enumerate(birth):
        chains_of_node[k if k >= 0 else root].append(c)
    starts = turns.tolist()
    pieces, counts = [], []
    for k in preorder:
        count = 0
        for c in chains_of_node[k]:
            a, b = starts[c], starts[(c + 1) % m]
            if b > a:
                pieces.append(np.arange(a, b))
                count += b - a
            else:  # the chain that wraps past the last edge
                pieces.append(np.arange(a, n))
                pieces.append(np.arange(0, b))
                count += n - a + b
        counts.append(count)
    edge_order = np.concatenate(pieces)
    offsets = np.concatenate([[0], np.cumsum(counts)])
    rank_a = np.array(rank, dtype=np.intp)
    edge_start = offsets[rank_a]
    edge_end = offsets[rank_a + size]
    arrays = dict(level=level_a, parent=np.array(parent, dtype=np.intp), top=top,
                  apex=np.array(apex), vented=vented, edge_order=edge_order,
                  edge_start=edge_start, edge_end=edge_end)
    for arr in arrays.values():
        arr.setflags(write=False)
    return PocketTree(section=section, may_trap=may_trap, children=tuple(children), root=root,
                      **arrays)


def _edges_above(section, vertices):
    """For each vertex, the edge first hit by a vertical ray going up from
    it (-1 if none)."""
    geo = section.geometry
    x0 = geo.x0
    x1 = np.roll(x0, -1)
    xl, xh = np.minimum(x0, x1), np.maximum(x0, x1)
    out = np.full(vertices.size, -1, dtype=np.intp)
    for i, v in enumerate(vertices.tolist()):
        xs, zs = float(geo.x0[v]), float(geo.z0[v])
        cand = np.flatnonzero((xl <= xs) & (xs <= xh))
        dx, dz = geo.dx[cand], geo.dz[cand]
        with np.errstate(invalid="ignore", divide="ignore"):
            zc = geo.z0[cand] + (xs - geo.x0[cand]) * (dz / dx)
        zc = np.where(dx == 0, geo.z_low[cand], zc)
        ok = zc > zs
        if ok.any():
            out[i] = cand[ok][int(np.argmin(zc[ok]))]
    return out


@dataclass(frozen=True)
class Pocket:
    """One pocket of trapped air at the current level.

    Attributes
    ----------
    node : int
        Its node in the :class:`PocketTree`.
    sealed_at : float
        The lip level [m]: where its air was last connected to the main gas
        space (the rising liquid sealed it there).
    interface : float
        Level of the compressed air-liquid interface z_i [m], above the lip.
    air_pressure : float
        Gauge pressure of the air, P(z_i) [Pa].
    air_volume : float
        [m3] (area x width for plane sections).
    split_at : float or None
        Where the pocket's air divided from a neighbour's, if the pocket is
        part of a larger one that the interface split at a saddle [m].
    edges : numpy.ndarray
        Indices of the edges in the pocket (they see the interface as their
        liquid surface).
    apex : tuple of float
        A highest point of the pocket (x, z) [m].
    """

    node: int
    sealed_at: float
    interface: float
    air_pressure: float
    air_volume: float
    split_at: float | None
    edges: np.ndarray = field(repr=False)
    apex: tuple = ()

    def air_region(self, section):
        """The air, as a shapely (Multi)Polygon in the section's plane [m]: the
        cavity above the interface, in this pocket (empty when it holds no air).

        For drawing; costs a polygon intersection (milliseconds at 10,000
        vertices), so it is computed only when asked for.
        """
        import shapely

        cavity = shapely.Polygon(section.outline)
        xmin, zmin, xmax, zmax = cavity.bounds
        if not self.interface < self.apex[1]:
            return shapely.Polygon()
        pad = 1.0 + (xmax - xmin) + (zmax - zmin)
        band = shapely.box(xmin - pad, self.interface, xmax + pad, zmax + pad)
        parts = shapely.get_parts(shapely.intersection(cavity, band))
        point = shapely.Point(self.apex)
        dist = shapely.distance(parts, point)
        keep = parts[dist <= 1e-9 * pad]
        if keep.size == 0:  # pragma: no cover - the apex is a vertex of its part
            keep = parts[[int(np.argmin(dist))]]
        return shapely.union_all(keep) if keep.size > 1 else keep[0]


@dataclass(frozen=True, eq=False)
class PocketState:
    """Trapped air at one level of one pressure law.

    Attributes
    ----------
    law : PressureLaw
    atmospheric_pressure : float
        [Pa] absolute.
    pockets : tuple of Pocket
        Bottom up by lip, then left to right; empty when none is sealed.
    caps : numpy.ndarray or None
        (N,) each edge's liquid surface level for
        :func:`wetline.core.pressure_law.integrate_edges` [m]: the interface
        of its pocket, h elsewhere; None when no pocket is sealed.
    """

    law: PressureLaw
    atmospheric_pressure: float
    pockets: tuple
    caps: np.ndarray | None

    @property
    def air_volume(self):
        """All trapped air [m3]."""
        return float(sum(p.air_volume for p in self.pockets))


def _checked_atmosphere(law, atmospheric_pressure):
    p_atm = float(atmospheric_pressure)
    if not (np.isfinite(p_atm) and p_atm > 0):
        raise PocketError(f"atmospheric pressure must be a positive number of Pa, not {p_atm:g}")
    if p_atm + law.gas_pressure < 0:
        raise PocketError(
            f"gas pressure {law.gas_pressure:g} Pa gauge is below a full vacuum under an "
            f"atmosphere of {p_atm:g} Pa")
    return p_atm


def trap_air(tree, law, atmospheric_pressure=STANDARD_ATMOSPHERE):
    """The pockets of air trapped at the level of ``law`` and their interfaces.

    Parameters
    ----------
    tree : PocketTree
        From :func:`find_pockets` for the section.
    law : PressureLaw
        Layers, free surface h and gas pressure (the gas the air was sealed
        under).
    atmospheric_pressure : float
        [Pa] absolute, > 0.

    Returns
    -------
    PocketState

    Raises
    ------
    PocketError
        For a non-positive atmospheric pressure, or a gas pressure below a
        full vacuum under it.
    PressureLawError
        For a gas over an open section or a level above its spill level.

    Notes
    -----
    A pocket sealed at z_lip holds K = (p_atm + p_gas) V(z_lip); its
    interface solves (p_atm + P(z_i)) V(z_i) = K (Boyle's law, the air's
    weight neglected). Its air pressure is P(z_i), gauge.

    Examples
    --------
    The chamber of :func:`find_pockets`, water at 10 m/s2 up the riser to
    3.5 m: the roof's air (2 m wide, sealed at 1.5 m with 1 m2) is
    compressed to about 0.84 m2, its interface 8 cm above the lip.

    >>> s = Section.build([[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5],
    ...                    [0.8, 1.5], [0.8, 4], [0, 4]],
    ...                   parts=["floor", "wall", "roof", "wall", "wall", "wall",
    ...                          "open", "wall"])
    >>> law = PressureLaw.single(1000.0, 3.5, gravity=10.0)
    >>> st = trap_air(find_pockets(s), law)
    >>> p = st.pockets[0]
    >>> p.sealed_at, round(p.interface, 4), round(p.air_volume, 4)
    (1.5, 1.5797, 0.8407)
    """
    _check_law_fits(tree.section, law)
    p_atm = _checked_atmosphere(law, atmospheric_pressure)
    pockets = _pockets_at(tree, law, p_atm)
    if not pockets:
        return PocketState(law=law, atmospheric_pressure=p_atm, pockets=(), caps=None)
    caps = np.full(tree.section.n_edges, law.level)
    for p in pockets:
        caps[p.edges] = p.interface
    caps.setflags(write=False)
    return PocketState(law=law, atmospheric_pressure=p_atm, pockets=pockets, caps=caps)


def _pockets_at(tree, law, p_atm):
    """The pockets sealed below the level of ``law``, solved (a tuple)."""
    if not tree.may_trap or p_atm + law.gas_pressure == 0.0:
        return ()
    h = law.level
    pockets = []
    for child, lip in _sealable(tree, h):
        k_air = (p_atm + law.gas_pressure) * tree._volume_at_critical(child, lip)
        _solve_pocket(tree, law, p_atm, child, lip, lip, k_air, None, pockets)
    pockets.sort(key=lambda p: (p.sealed_at, p.apex[0]))
    return tuple(pockets)


def _sealable(tree, h):
    """(node, lip) of every part cut off from the vent at a saddle below h."""
    out = []
    stack = [tree.root]
    while stack:
        node = stack.pop()
        if not tree.children[node] or not tree.level[node] < h:
            continue
        lip = float(tree.level[node])
        for child in tree.children[node]:
            if tree.vented[child]:
                stack.append(child)
            else:
                out.append((child, lip))
    return out


def _solve_pocket(tree, law, p_atm, node, lip, lo, k_air, split_at, out):
    """Interface of the air ``k_air`` [Pa m3] in ``node``'s subtree, at or
    above ``lo``; recurse into the children if it passes the node's saddle."""
    h = law.level
    top = float(tree.top[node])
    if k_air <= 0.0:
        return
    hi = min(h, top)
    saddle = float(tree.level[node]) if tree.children[node] else None
    if saddle is not None and saddle < hi:
        if (p_atm + law.pressure_at(saddle)) * tree._volume_at_critical(node, saddle) > k_air:
            v_split = [tree._volume_at_critical(c, saddle) for c in tree.children[node]]
            v_all = sum(v_split)
            for c, v in zip(tree.children[node], v_split, strict=True):
                if v > 0:
                    _solve_pocket(tree, law, p_atm, c, lip, saddle, k_air * v / v_all, saddle,
                                  out)
            return
        hi = saddle
    z_i = _interface(tree, law, p_atm, node, lo, hi, k_air)
    e = tree.pocket_edges(node)
    p_air = law.pressure_at(z_i)
    out.append(Pocket(
        node=int(node), sealed_at=lip, interface=z_i, air_pressure=p_air,
        air_volume=k_air / (p_atm + p_air), split_at=split_at, edges=e,
        apex=tuple(float(c) for c in tree.apex[node])))


_BRACKET_POINTS = 24
"""Levels evaluated at once in each round of the bracket search."""


def _interface(tree, law, p_atm, node, lo, hi, k_air):
    """Root z in [lo, hi] of g(z) = (p_atm + P(z)) V(z) - K, which falls."""

    def g_many(zs):
        return (p_atm + law.pressure(zs)) * tree._volumes_above(node, zs) - k_air

    kinks = [b for b in law.ramp_levels.tolist() if lo < b < hi]
    # The band of the last solve first: successive levels (a slider, the
    # steps of a fill by volume) mostly leave the interface in it.
    last = tree._bands.get(node)
    if last is not None and lo <= last[0] and last[1] <= hi and not any(
            last[0] < k < last[1] for k in kinks):
        g = g_many(np.array(last))
        if g[0] > 0 > g[1]:
            return _solve_band(tree, law, p_atm, node, last[0], last[1], float(g[0]),
                               float(g[1]), k_air)
    # Bracket between the pocket's vertex heights and the layer interfaces
    # (where P kinks): a few rounds of evaluations at many levels at once,
    # the first with the ends.
    breaks = tree._heights_between(node, lo, hi)
    if kinks:
        breaks = np.unique(np.concatenate([breaks, kinks]))
    a, b = lo, hi
    first = True
    while True:
        if breaks.size <= _BRACKET_POINTS:
            pick = breaks
        else:
            pick = breaks[np.arange(_BRACKET_POINTS) * (breaks.size - 1) // (_BRACKET_POINTS - 1)]
        if first:
            pick = np.concatenate([[lo], pick, [hi]])
        g = g_many(pick)
        if first:
            g_lo, g_hi = float(g[0]), float(g[-1])
            if g_lo <= 0.0:
                return lo
            if g_hi >= 0.0:
                return hi
            first = False
        zero = np.flatnonzero(g == 0)
        if zero.size:
            return float(pick[zero[0]])
        k = int(np.searchsorted(-g, 0.0))  # g falls: g[:k] > 0 > g[k:]
        if k > 0:
            a, g_lo = float(pick[k - 1]), float(g[k - 1])
        if k < pick.size:
            b, g_hi = float(pick[k]), float(g[k])
        if breaks.size <= _BRACKET_POINTS:
            break
        breaks = breaks[(breaks > a) & (breaks < b)]
    tree._bands[node] = (a, b)
    return _solve_band(tree, law, p_atm, node, a, b, g_lo, g_hi, k_air)


def _solve_band(tree, law, p_atm, node, a, b, g_a, g_b, k_air):
    """Root of g in the band [a, b], where V is one polynomial (degree 2
    plane, 3 axisymmetric) and P is linear: V from exact values at equally
    spaced levels (Newton's forward differences), then a safeguarded Newton
    iteration on the product polynomial, bracketed in [0, 1]."""
    axi = tree.section.is_axisymmetric
    span = b - a
    p_a, p_b = law.pressure_at(a), law.pressure_at(b)
    inner = np.array([a + span / 3.0, a + 2.0 * span / 3.0] if axi else [a + 0.5 * span])
    v_in = tree._volumes_above(node, inner).tolist()
    v_a = (g_a + k_air) / (p_atm + p_a)
    v_b = (g_b + k_air) / (p_atm + p_b)
    if axi:  # V(u) = c0 + c1 u + c2 u^2 + c3 u^3 through u = 0, 1/3, 2/3, 1
        y0, y1, y2, y3 = v_a, v_in[0], v_in[1], v_b
        d1 = (y1 - y0) * 3.0
        d2 = (y2 - 2.0 * y1 + y0) * 4.5
        d3 = (y3 - 3.0 * y2 + 3.0 * y1 - y0) * 4.5
        c = [y0, d1 - d2 / 3.0 + 2.0 * d3 / 9.0, d2 - d3, d3]
    else:  # through u = 0, 1/2, 1
        y0, y1, y2 = v_a, v_in[0], v_b
        c2 = 2.0 * (y0 - 2.0 * y1 + y2)
        c = [y0, y2 - y0 - c2, c2]
    # g(u) = (p0 + p1 u) V(u) - K
    p0, p1 = p_atm + p_a, p_b - p_a
    poly = [p0 * c[0] - k_air]
    for i in range(1, len(c)):
        poly.append(p0 * c[i] + p1 * c[i - 1])
    poly.append(p1 * c[-1])
    dpoly = [i * poly[i] for i in range(1, len(poly))]

    def val(coef, u):
        r = 0.0
        for ci in reversed(coef):
            r = r * u + ci
        return r

    lo, hi = 0.0, 1.0
    u = g_a / (g_a - g_b)  # secant start from the exact end values
    for _ in range(200):
        gu = val(poly, u)
        if gu > 0:
            lo = u
        elif gu < 0:
            hi = u
        else:
            break
        d = val(dpoly, u)
        nu = u - gu / d if d < 0 else 0.5 * (lo + hi)
        if not lo < nu < hi:
            nu = 0.5 * (lo + hi)
        if abs(nu - u) <= 4e-16 * max(1.0, abs(u)) or hi - lo <= 4e-16:
            u = nu
            break
        u = nu
    u = min(max(u, 0.0), 1.0)
    return float(a + u * span) if u < 1.0 else b


def level_for_liquid_volume(tree, law, volume, atmospheric_pressure=STANDARD_ATMOSPHERE):
    """The free surface at which the section holds ``volume`` of liquid with
    its pockets of trapped air in place [m].

    Parameters
    ----------
    tree : PocketTree
    law : PressureLaw
        Layers and gas; its own level is replaced by the one solved for (the
        interfaces of the lower layers stay where they are).
    volume : float
        Liquid volume [m3] (area x width for plane sections).
    atmospheric_pressure : float
        [Pa] absolute.

    Returns
    -------
    float
        The level h [m] with liquid volume(h) = cavity volume below h - the
        air below h = ``volume``.

    Raises
    ------
    FillError
        For a negative volume, more than the section holds (below its spill
        level if open, up to its top if closed) with its air in place, or
        less than the layers below the top one hold.

    Notes
    -----
    The liquid volume rises with h (more cavity, and more pressure on the
    air). The level is bracketed between the vented level (no air) and the
    top, then between vertex heights by exact evaluations, then solved in
    the band by Brent's method (bracketed, to round-off).
    """
    section = tree.section
    volume = float(volume)
    if not np.isfinite(volume) or volume < 0:
        raise FillError(f"fill volume must be a number >= 0, not {volume:g}")
    lo = level_for_volume(section, volume)  # no air: the lowest possible level
    bottom = max(law.interfaces) if law.n_layers > 1 else -np.inf
    # Round-off of volumes is relative to what the section holds.
    tol = 1e-12 * capacity(section)
    if lo <= bottom:
        # Without air the layers below the top one hold this volume already:
        # refused (with air in pockets below the interface, as found below),
        # unless only by round-off (the free surface then just above them).
        below = volume_below(section, bottom)
        if below - volume > tol and not tree.may_trap:
            raise FillError(
                f"fill volume {volume:.6g} m3 does not reach the top interface at "
                f"{bottom:.6g} m: the layers below it hold {below:.6g} m3")
        lo = float(np.nextafter(bottom, np.inf))
    if not tree.may_trap or (volume == 0.0 and law.n_layers == 1):
        return lo
    top = section.top_level
    _check_law_fits(section, law.with_level(top))
    p_atm = _checked_atmosphere(law, atmospheric_pressure)

    def liquid(h):
        # The cavity below h less the air below h (a pocket's air above h
        # is V_P(h) when its top is higher).
        v = volume_below(section, h)
        for p in _pockets_at(tree, law.with_level(h), p_atm):
            above = tree.volume_above(p.node, h) if h < tree.top[p.node] else 0.0
            v -= p.air_volume - above
        return v

    v_top = liquid(top)
    if volume > v_top * (1.0 + 1e-12):
        where = "below its spill level" if section.is_open else "up to its top (it is closed)"
        raise FillError(
            f"fill volume {volume:.6g} m3 is more than the section holds {where} with air "
            f"trapped in its pockets: {v_top:.6g} m3")
    if volume >= v_top:
        return top
    # The air is at most what every pocket held when it sealed: the level is
    # at most the vented level of the volume plus all of it.
    most_air = sum(tree._volume_at_critical(c, lip) for c, lip in _sealable(tree, np.inf))
    hi = level_for_volume(section, min(volume + most_air, capacity(section)))
    a = max(lo, float(np.nextafter(bottom, np.inf)))
    b = max(min(hi, top), a)
    f_lo = liquid(a) - volume
    if f_lo > tol:
        raise FillError(
            f"fill volume {volume:.6g} m3 does not reach the top interface at {bottom:.6g} m: "
            f"the layers below it hold {volume + f_lo:.6g} m3")
    if f_lo >= 0:
        return a
    f_hi = liquid(b) - volume if b < top else v_top - volume
    if f_hi <= 0:
        return b
    # Between the vertex heights inside the bracket, then Brent in the band.
    heights = section.volume_curve.heights
    inside = heights[(heights > a) & (heights < b)]
    i, j = -1, inside.size
    while j - i > 1:
        mid = (i + j) // 2
        fm = liquid(float(inside[mid])) - volume
        if fm < 0:
            i, a, f_lo = mid, float(inside[mid]), fm
        elif fm > 0:
            j, b, f_hi = mid, float(inside[mid]), fm
        else:
            return float(inside[mid])
    return _brent(lambda h: liquid(h) - volume, a, b, f_lo, f_hi)


def _brent(fun, a, b, fa, fb, max_iter=200):
    """Brent's method on a bracket [a, b] with fa < 0 < fb, to round-off
    (R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
    ch. 4, from memory)."""
    c, fc = a, fa
    d = e = b - a
    for _ in range(max_iter):
        if (fb > 0) == (fc > 0):
            c, fc = a, fa
            d = e = b - a
        if abs(fc) < abs(fb):
            a, b, c = b, c, b
            fa, fb, fc = fb, fc, fb
        tol = 2.0 * np.finfo(float).eps * abs(b) + 1e-300
        m = 0.5 * (c - b)
        if abs(m) <= tol or fb == 0:
            return b
        if abs(e) >= tol and abs(fa) > abs(fb):
            s = fb / fa
            if a == c:
                p, q = 2.0 * m * s, 1.0 - s
            else:
                q, r = fa / fc, fb / fc
                p = s * (2.0 * m * q * (q - r) - (b - a) * (r - 1.0))
                q = (q - 1.0) * (r - 1.0) * (s - 1.0)
            if p > 0:
                q = -q
            p = abs(p)
            if 2.0 * p < min(3.0 * m * q - abs(tol * q), abs(e * q)):
                e, d = d, p / q
            else:
                d = e = m
        else:
            d = e = m
        a, fa = b, fb
        b += d if abs(d) > tol else (tol if m > 0 else -tol)
        fb = fun(b)
    return b  # pragma: no cover - Brent converges well within max_iter
