"""Exact hydrostatic loads on every edge of a section at one fill level.

Model: one incompressible liquid of density rho under gravity g, gauge
pressure. Every wall point at height z at or below the free surface h carries

.. math:: p = \\rho g (h - z)

however convoluted the path to the surface (pockets under ceilings are taken
as vented). Each edge is straight, so along its wetted part p is linear in arc
length and every integral below is a closed-form polynomial, exact to
round-off:

- plane, per edge: :math:`\\mathbf F = w\\, L_w\\, \\bar p\\, \\mathbf n`, with
  :math:`L_w` the wetted length, :math:`\\bar p` the mean pressure over it and
  :math:`\\mathbf n` the outward unit normal; it acts at the centroid of the
  trapezoidal pressure diagram (the centre of pressure);
- axisymmetric, over the full revolution: :math:`F_z = 2\\pi n_z \\int p\\,r\\,ds`
  with p and r both linear along the edge, and the hoop (membrane) force
  :math:`N = p\\,r/\\cos\\alpha` at both ends, alpha the edge's angle from
  the vertical.

Signs follow the project's physics spec: x right, z up; a force is what the
liquid exerts on the wall [N] (per ``width`` for plane sections); "down" is
``-fz``, so a ceiling or overhang has down < 0 (it is pushed up).
``floor_force`` sums down over the ``floor`` part; ``support_reaction`` over
every other loaded part. For any vented section
``floor_force + support_reaction = rho g V`` and, for plane sections, the
horizontal forces sum to zero.

References: Cengel & Cimbala, *Fluid Mechanics*, sec. 3-1 to 3-4; Munson,
Young & Okiishi, *Fundamentals of Fluid Mechanics*, sec. 2.3 and 2.8
(pressure on plane and curved surfaces); membrane theory of shells of
revolution, Timoshenko & Woinowsky-Krieger, *Theory of Plates and Shells*.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from . import STANDARD_GRAVITY
from .fill import FLAT_INV_DZ, _green_sum
from .section import FLOOR, Section

__all__ = ["PartLoad", "Solution", "solve", "resolve_level"]


@dataclass(frozen=True)
class PartLoad:
    """Total load of the liquid on one named part.

    Attributes
    ----------
    fx : float or None
        Horizontal force [N] (per width for plane sections); None for
        axisymmetric sections, where it is zero over the revolution.
    fz : float
        Vertical force [N], positive up.
    down : float
        ``-fz`` [N]: positive downward, negative where the part is lifted.
    """

    fx: float | None
    fz: float
    down: float


@dataclass(frozen=True, eq=False)
class Solution:
    """Loads on a section at one level. Arrays have one entry per edge, in
    the section's (file's) edge order and direction.

    Attributes
    ----------
    section : Section
    density : float
        Liquid density [kg/m3].
    gravity : float
        Acceleration of gravity [m/s2].
    requested_level : float
        The level asked for [m].
    level : float
        The free surface actually used [m]: the request capped at the spill
        level for open sections.
    volume : float
        Liquid volume below the level [m3] (area x width for plane sections).
    fluid_weight : float
        ``rho g V`` [N].
    floor_force, support_reaction : float
        Downward load on the ``floor`` part, and on every other loaded part
        [N]; see the module notes.
    max_pressure : float
        Largest wall pressure [Pa], at the lowest wetted point.
    wetted_length : numpy.ndarray
        Length of each edge at or below the level [m]; a horizontal edge
        lying exactly at the free surface counts whole (at zero pressure).
    p_start, p_end : numpy.ndarray
        Pressure at each edge's start and end vertex [Pa], 0 where dry.
    fx, fz : numpy.ndarray
        Force of the liquid on each edge [N]; fx is all NaN for axisymmetric
        sections (reported as null).
    resultant : numpy.ndarray
        Magnitude of each edge's force [N].
    centre_of_pressure : numpy.ndarray
        (N, 2) point on each edge where its resultant acts [m]; NaN for dry
        edges and for axisymmetric sections. A horizontal edge at the free
        surface has its midpoint (the limit of a ledge just below it).
    hoop_start, hoop_end : numpy.ndarray
        Hoop force at both ends [N/m] (axisymmetric); NaN on horizontal
        edges and for plane sections.
    parts : dict of str to PartLoad
        Totals per loaded part (``open`` and ``axis`` left out).
    warnings : tuple of str
        Plain sentences (level capped, section empty ...).
    """

    section: Section
    density: float
    gravity: float
    requested_level: float
    level: float
    volume: float
    fluid_weight: float
    floor_force: float
    support_reaction: float
    max_pressure: float
    wetted_length: np.ndarray
    p_start: np.ndarray
    p_end: np.ndarray
    fx: np.ndarray
    fz: np.ndarray
    resultant: np.ndarray
    centre_of_pressure: np.ndarray
    hoop_start: np.ndarray
    hoop_end: np.ndarray
    parts: dict[str, PartLoad]
    warnings: tuple[str, ...]

    @property
    def spill_level(self) -> float | None:
        """The section's spill level [m] or None (closed section)."""
        return self.section.spill_level

    @property
    def head_above_top(self) -> float:
        """How far the level stands above the top of a closed section [m] (>= 0)."""
        if self.section.is_open:
            return 0.0
        return max(self.level - self.section.z_max, 0.0)


def checked_density_and_gravity(density: float, gravity: float) -> tuple[float, float]:
    """``(density, gravity)`` as floats; ValueError unless both are positive
    finite numbers [kg/m3], [m/s2]."""
    density = float(density)
    gravity = float(gravity)
    if not (np.isfinite(density) and density > 0):
        raise ValueError(f"density must be positive, not {density:g}")
    if not (np.isfinite(gravity) and gravity > 0):
        raise ValueError(f"gravity must be positive, not {gravity:g}")
    return density, gravity


def resolve_level(section: Section, level: float) -> tuple[float, list[str]]:
    """The level actually used for a requested one, and warnings.

    Open sections cannot fill above their spill level; a request above it is
    capped. Closed sections accept any level (above the top: the cavity is
    full under a standpipe head).

    Parameters
    ----------
    section : Section
    level : float
        Requested free-surface height [m].

    Returns
    -------
    level : float
        [m]
    warnings : list of str
    """
    level = float(level)
    if not np.isfinite(level):
        raise ValueError(f"level must be a finite number, not {level}")
    warnings = []
    spill = section.spill_level
    if spill is not None and level > spill:
        warnings.append(
            f"level {level:.6g} m is above the spill level {spill:.6g} m; "
            "capped at the spill level")
        level = spill
    elif spill is None and level > section.z_max:
        warnings.append(
            f"level {level:.6g} m is above the top of the closed section ({section.z_max:.6g} m): "
            f"the cavity is full under a standpipe head of {level - section.z_max:.6g} m")
    if level <= section.z_min:
        warnings.append(
            f"level {level:.6g} m is at or below the lowest point {section.z_min:.6g} m; "
            "the section is empty")
    return level, warnings


# Rows of the one work block a solve allocates for its per-edge results.
_ROWS = ("p_vertex", "wetted_length", "fx", "fz", "resultant", "cp_x", "cp_z",
         "hoop_start", "hoop_end")


def solve(section: Section, level: float, density: float,
          gravity: float = STANDARD_GRAVITY) -> Solution:
    """Loads of a liquid standing at ``level`` in ``section``.

    Parameters
    ----------
    section : Section
    level : float
        Requested height of the free surface [m], in the section's
        coordinates. Capped at the spill level of an open section.
    density : float
        Liquid density [kg/m3], > 0.
    gravity : float
        Acceleration of gravity [m/s2], > 0.

    Returns
    -------
    Solution

    Notes
    -----
    With clipped depths :math:`a_0, a_1 = \\max(h - z, 0)` at an edge's ends
    and the wetted fraction
    :math:`f = \\mathrm{clip}((h - z_\\mathrm{low})/|\\Delta z|, 0, 1)`, the
    wetted length is :math:`L_w = f L`, the mean depth over it is
    :math:`(a_0 + a_1)/2` (one of them is zero where the surface crosses the
    edge) and the centre of pressure lies at the centroid of the trapezoid,
    :math:`t = t_a + f (a_0 + 2 a_1) / (3 (a_0 + a_1))` along the edge.

    Examples
    --------
    Vertical wall 3 m high, water at 1000 kg/m3 (Cengel & Cimbala sec. 3-4):

    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> r = solve(s, 3.0, 1000.0)
    >>> round(float(r.fx[1]), 3), round(float(r.centre_of_pressure[1, 1]), 12)
    (44129.925, 1.0)
    """
    density, gravity = checked_density_and_gravity(density, gravity)
    h, warnings = resolve_level(section, level)
    geo = section.geometry
    n = section.n_edges
    rg = density * gravity
    axi = section.is_axisymmetric

    out = np.empty((len(_ROWS), n + 1))
    p_vertex, wetted, fx, fz, res, cpx, cpz, hoop0, hoop1 = out
    a = np.empty(n + 1)
    w1 = np.empty(n)
    w2 = np.empty(n)
    w3 = np.empty(n)

    # Depth at every vertex (first repeated last); a0 / a1 are views.
    np.subtract(h, geo.vertex_z, out=a)
    np.maximum(a, 0.0, out=a)
    a0 = a[:n]
    a1 = a[1:]
    np.multiply(a, rg, out=p_vertex)
    p_start = p_vertex[:n]
    p_end = p_vertex[1:]

    # Wetted fraction f of each edge; the product overflows to inf on an edge
    # rising under 1e-200 m (1 / |dz| is huge), which the clip makes 1.
    f = w1
    np.subtract(h, geo.z_low, out=f)
    with np.errstate(over="ignore", invalid="ignore"):
        np.multiply(f, geo.inv_abs_dz, out=f)
    np.clip(f, 0.0, 1.0, out=f)
    # Horizontal edges at or below the surface are wetted whole (z <= h),
    # also exactly at it, where (h - z_low) / |dz| would be 0 / 0.
    horizontal = np.flatnonzero(geo.inv_abs_dz >= FLAT_INV_DZ)
    flat = horizontal[geo.z_low[horizontal] <= h]
    f[flat] = 1.0
    wl = wetted[:n]
    np.multiply(f, geo.length, out=wl)

    # Sum of end depths; the wetted part's mean depth is half of it.
    s01 = w2
    np.add(a0, a1, out=s01)

    # Parameter where the wetted part starts: 1 - f on falling edges.
    ta = w3
    np.subtract(1.0, f, out=ta)
    np.multiply(ta, geo.falls, out=ta)
    # The force rows are free until the forces are computed: scratch here.
    volume = float(_green_sum(section, f, ta, work=(fx[:n], fz[:n], res[:n])))

    if not axi:
        # Normal force per edge = rg * width * Lw * (a0 + a1) / 2.
        fn = res[:n]
        np.multiply(wl, s01, out=fn)
        np.multiply(fn, 0.5 * rg * section.width, out=fn)
        np.multiply(fn, geo.nx, out=fx[:n])
        np.multiply(fn, geo.nz, out=fz[:n])
        # Centre of pressure: t = ta + f (a0 + 2 a1) / (3 (a0 + a1)).
        t = cpx[:n]
        np.add(s01, a1, out=t)
        np.multiply(t, f, out=t)
        with np.errstate(invalid="ignore", divide="ignore"):
            np.divide(t, s01, out=t)
        np.multiply(t, 1.0 / 3.0, out=t)
        np.add(t, ta, out=t)
        t[flat] = 0.5  # uniform pressure, even 0 at the surface
        cz = cpz[:n]
        np.multiply(t, geo.dz, out=cz)
        np.add(cz, geo.z0, out=cz)
        cx = t  # reuse in place last
        np.multiply(cx, geo.dx, out=cx)
        np.add(cx, geo.x0, out=cx)
        cp = out[5:7, :n].T  # (N, 2) view; NaN rows where dry (0/0)
        hoop0[:n] = np.nan
        hoop1[:n] = np.nan
        parts = _part_totals(section, fx[:n], fz[:n])
    else:
        # r at the wetted part's ends, ra = x0 + ta dx, rb = ra + f dx.
        ra = w3
        np.multiply(ta, geo.dx, out=ra)
        np.add(ra, geo.x0, out=ra)
        rb = cpz[:n]  # scratch: no centre of pressure for axisymmetric
        np.multiply(f, geo.dx, out=rb)
        np.add(rb, ra, out=rb)
        # int p r ds = rg Lw (2 a0 ra + a0 rb + a1 ra + 2 a1 rb) / 6
        #            = rg Lw ((2 a0 + a1) ra + (a0 + 2 a1) rb) / 6
        q = cpx[:n]
        np.add(s01, a0, out=q)
        np.multiply(q, ra, out=q)
        np.add(s01, a1, out=w2)
        np.multiply(w2, rb, out=w2)
        np.add(q, w2, out=q)
        np.multiply(q, wl, out=q)
        fzz = fz[:n]
        np.multiply(q, (2.0 * np.pi / 6.0) * rg, out=fzz)
        np.multiply(fzz, geo.nz, out=fzz)
        np.abs(fzz, out=res[:n])
        fx[:n] = np.nan
        cp = np.full((n, 2), np.nan)
        # Hoop force N = p r / cos(alpha), cos(alpha) = |dz| / L; not defined
        # on horizontal edges (nor on those rising under 1e-200 m, where
        # 1 / cos overflows): NaN there.
        with np.errstate(over="ignore", invalid="ignore"):
            sec = geo.length * geo.inv_abs_dz
            np.multiply(p_start, geo.x0, out=hoop0[:n])
            np.multiply(hoop0[:n], sec, out=hoop0[:n])
            np.multiply(p_end, np.roll(geo.x0, -1), out=hoop1[:n])
            np.multiply(hoop1[:n], sec, out=hoop1[:n])
        hoop0[:n][horizontal] = np.nan
        hoop1[:n][horizontal] = np.nan
        parts = _part_totals(section, None, fz[:n])

    floor = parts.get(FLOOR)
    floor_force = floor.down if floor is not None else 0.0
    support = sum(p.down for k, p in parts.items() if k != FLOOR)
    max_pressure = rg * max(h - section.z_min, 0.0)
    return Solution(
        section=section, density=density, gravity=gravity,
        requested_level=float(level), level=h, volume=volume,
        fluid_weight=rg * volume, floor_force=floor_force,
        support_reaction=float(support), max_pressure=max_pressure,
        wetted_length=wl, p_start=p_start, p_end=p_end,
        fx=fx[:n], fz=fz[:n], resultant=res[:n], centre_of_pressure=cp,
        hoop_start=hoop0[:n], hoop_end=hoop1[:n], parts=parts,
        warnings=tuple(warnings))


def _part_totals(section: Section, fx: np.ndarray | None,
                 fz: np.ndarray) -> dict[str, PartLoad]:
    """Sum edge forces by part; ``open`` and ``axis`` are left out."""
    idx = section.geometry.part_index
    m = len(section.part_names)
    sz = np.bincount(idx, weights=fz, minlength=m)
    sx = None if fx is None else np.bincount(idx, weights=fx, minlength=m)
    out = {}
    for k, name in enumerate(section.part_names):
        if name in section.loaded_part_names:
            z = float(sz[k])
            out[name] = PartLoad(fx=None if sx is None else float(sx[k]), fz=z,
                                 down=-z if z else 0.0)
    return out
