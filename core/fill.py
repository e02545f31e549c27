"""Liquid volume below a level, and the level that holds a given volume.

The region of the cavity below a level h is bounded by the outline's edges
clipped to z <= h and by the free surface z = h. Along the free surface
dz = 0, so by Green's theorem only the clipped edges contribute:

.. math::

    A(h) = s \\sum_e \\int_{e,\\,z \\le h} x\\,dz, \\qquad
    V(h) = s\\,\\pi \\sum_e \\int_{e,\\,z \\le h} x^2\\,dz

for plane (times the width) and axisymmetric sections, s = +1 for a
counter-clockwise outline. With x linear along each edge these are exact:
A(h) is piecewise quadratic and V(h) piecewise cubic in h between vertex
heights. Both sums are taken with x relative to the outline's first vertex
(see :func:`_green_sum`), so a section far from the origin, or a ring far
from the axis, keeps the accuracy of the same shape near it; z enters only
as differences (h - z, dz) already.

The inverse, :func:`level_for_volume`, looks up the band of vertex heights
holding the volume in a table built once per section by a sweep over the
sorted vertex heights (O(N log N)), then solves the band's exact polynomial,
found from exact volumes at a few levels inside the band (O(N)). Bisection is
used only as a fallback if the table, which is only a search aid, ever
brackets the wrong band.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

import numpy as np
from numpy.typing import ArrayLike

if TYPE_CHECKING:
    from .section import EdgeGeometry, Section

__all__ = [
    "FillError",
    "VolumeCurve",
    "capacity",
    "level_for_volume",
    "volume_below",
    "volume_below_many",
    "volume_curve",
]


FLAT_INV_DZ = 1e200
"""Edges whose 1/|dz| is at least this [1/m] count as horizontal: those
rising less than 1e-200 m, and the truly horizontal ones, which
:class:`~wetline.core.section.EdgeGeometry` gives 1e200. At or below the
level they are wetted whole (z <= h, physics spec)."""


class FillError(ValueError):
    """A fill that cannot be met (more liquid than the section holds ...)."""


def _clipped(geo: EdgeGeometry, h: float | np.ndarray, idx: np.ndarray | None = None, *,
             flat: bool = True) -> tuple[np.ndarray, np.ndarray]:
    """Wetted fraction ``f`` and start parameter ``ta`` of every edge (or
    of the edges ``idx``) at level(s) ``h`` (scalar, or a column of shape
    (M, 1) for many levels).

    f = clip((h - z_low) / |dz|, 0, 1); with ``flat``, a horizontal edge at
    or below the surface is wetted whole (points with z <= h are wetted,
    physics spec), also when it lies exactly at the surface. Volumes do not
    need that (dz = 0 there): they pass ``flat=False``.
    """
    z_low, inv, falls = geo.z_low, geo.inv_abs_dz, geo.falls
    if idx is not None:
        z_low, inv, falls = z_low[idx], inv[idx], falls[idx]
    f = np.subtract(h, z_low)
    with np.errstate(over="ignore", invalid="ignore"):  # inf on near-flat edges: clipped
        np.multiply(f, inv, out=f)
    np.clip(f, 0.0, 1.0, out=f)
    if flat:
        np.copyto(f, 1.0, where=_flat_wetted(inv, z_low, h))
    ta = np.subtract(1.0, f)
    np.multiply(ta, falls, out=ta)
    return f, ta


def _flat_wetted(inv_abs_dz: np.ndarray, z_low: np.ndarray,
                 h: float | np.ndarray) -> np.ndarray:
    """Mask of the horizontal edges (see :data:`FLAT_INV_DZ`) at or below
    the level(s) ``h`` [m], which are wetted over their whole length."""
    below = np.less_equal(z_low, h)  # (N,) or (M, N)
    below &= inv_abs_dz >= FLAT_INV_DZ
    return below


def _green_sum(section: Section, f: np.ndarray, ta: np.ndarray,
               work: Sequence[np.ndarray] | None = None) -> Any:
    """Sum over edges of the clipped Green integral, scaled to a volume [m3].

    ``f`` and ``ta`` are (N,) or (M, N); returns a float or an (M,) array.
    ``work`` are 3 scratch arrays of their shape (else allocated here).

    The sums are taken relative to the first vertex's x, xr, so that they
    do not depend on where the section lies: the clipped boundary is closed,
    so the sum of the clipped dz vanishes and, with X = x - xr,

    .. math::

        \\sum \\int x\\,dz = \\sum \\int X\\,dz, \\qquad
        \\sum \\int x^2 dz = \\sum \\int X^2 dz + 2 x_r \\sum \\int X\\,dz

    (the revolved volume as the volume about the reference radius plus a
    Pappus term, 2 pi xr times the area). Each sum is then of terms of the
    section's own size, whatever the coordinates' magnitude.
    """
    geo = section.geometry
    xr = float(geo.x0[0])
    axi = section.is_axisymmetric
    if work is not None:
        q, a, b = work
    else:  # the plane sum needs only q and one row of x - xr
        q, a, b = (np.empty(f.shape), np.empty(f.shape if axi else f.shape[-1:]),
                   np.empty(f.shape if axi else 0))
    if not axi:
        # int X dz over the clipped part = dz f (X0 + dx (ta + f / 2))
        np.multiply(f, 0.5, out=q)
        q += ta
        q *= geo.dx
        np.subtract(geo.x0, xr, out=a)
        q += a
        q *= f
        return _not_negative((q @ geo.dz) * (section.orientation * section.width))
    # With Xa, Xb the clipped part's ends relative to xr:
    # int x^2 dz = dz f ((Xa^2 + Xa Xb + Xb^2) / 3 + xr (Xa + Xb) + xr^2), the
    # last term summing to zero; 3 (...) = Xa (Xa + Xb + 3 xr) + Xb (Xb + 3 xr).
    np.subtract(geo.x0, xr, out=a)
    np.multiply(ta, geo.dx, out=b)
    a += b  # Xa
    np.multiply(f, geo.dx, out=b)
    b += a  # Xb
    np.add(a, b, out=q)
    q += 3.0 * xr
    q *= a
    np.add(b, 3.0 * xr, out=a)
    a *= b
    q += a
    q *= f
    return _not_negative((q @ geo.dz) * (section.orientation * np.pi / 3.0))


def _not_negative(v: Any) -> Any:
    """A volume or volumes, with round-off below zero (a sliver's few ulps
    of cancellation) made 0: no region holds a negative volume."""
    if np.ndim(v) == 0:
        return max(float(v), 0.0)
    return np.maximum(v, 0.0, out=v)


def volume_below(section: Section, level: float) -> float:
    """Volume of the cavity below ``level`` [m3].

    Parameters
    ----------
    section : Section
    level : float
        Height of the free surface [m]. Above the top of the outline the
        whole cavity counts; no spill cap is applied here.

    Returns
    -------
    float
        Area x width for plane sections, the revolved volume for
        axisymmetric ones [m3].

    Examples
    --------
    Cone of radius 1 m and height 2 m, apex down, filled 1 m: pi/12
    (V = pi r^2 h / 3; compare ``fluids.geometry.V_vertical_conical``).

    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [1, 2], [0, 2]], kind="axisymmetric")
    >>> abs(volume_below(s, 1.0) - np.pi / 12) < 1e-15
    True
    """
    f, ta = _clipped(section.geometry, float(level), flat=False)
    return float(_green_sum(section, f, ta))


def volume_below_many(section: Section, levels: ArrayLike, *,
                      chunk_elements: int = 2_000_000) -> np.ndarray:
    """:func:`volume_below` at many levels at once [m3] (vectorised).

    Parameters
    ----------
    section : Section
    levels : array_like
        (M,) heights [m].
    chunk_elements : int
        Largest M x N block computed at once (bounds the memory used).

    Returns
    -------
    numpy.ndarray
        (M,) volumes [m3].
    """
    levels = np.asarray(levels, dtype=np.float64).ravel()
    out = np.empty(levels.shape)
    rows = max(1, chunk_elements // max(section.n_edges, 1))
    for i in range(0, levels.size, rows):
        f, ta = _clipped(section.geometry, levels[i:i + rows, None], flat=False)
        out[i:i + rows] = _green_sum(section, f, ta)
    return out


def capacity(section: Section) -> float:
    """Volume the section holds at its top level [m3]: below the spill
    level if open, the whole cavity if closed."""
    return volume_below(section, section.top_level)


@dataclass(frozen=True)
class VolumeCurve:
    """Volumes at the distinct vertex heights, a search aid for the inverse.

    Attributes
    ----------
    heights : numpy.ndarray
        Distinct vertex heights, ascending [m].
    volumes : numpy.ndarray
        Volume below each height [m3], non-decreasing. From a sweep; it may
        differ from :func:`volume_below` by round-off (more on near-horizontal
        edges), which is why :func:`level_for_volume` checks its bracket.
    """

    heights: np.ndarray
    volumes: np.ndarray


def volume_curve(section: Section) -> VolumeCurve:
    """Build the :class:`VolumeCurve` of ``section`` by one sweep, O(N log N).

    Each edge adds, between its end heights, a polynomial in u = h - z_min
    (degree 2 plane, 3 axisymmetric) and above them a constant; difference
    arrays of the coefficients at the sorted heights, summed cumulatively,
    give the polynomial of every band. Edges whose height span is below
    1e-9 of the section's height are added as steps.
    """
    geo = section.geometry
    z = geo.z0
    heights = np.unique(z)
    m = heights.size
    zmin = heights[0]
    span = heights[-1] - zmin
    xr = float(geo.x0[0])  # x relative to the first vertex, as in _green_sum
    x0, dz = geo.x0 - xr, geo.dz
    x1 = np.roll(x0, -1)
    z1 = np.roll(z, -1)
    up = dz > 0
    zl = np.where(up, z, z1) - zmin
    zh = np.where(up, z1, z) - zmin
    xl = np.where(up, x0, x1)
    xh = np.where(up, x1, x0)
    sigma = section.orientation * np.sign(dz)
    il = np.searchsorted(heights, zl + zmin)
    ih = np.searchsorted(heights, zh + zmin)
    axi = section.is_axisymmetric
    deg = 3 if axi else 2
    band = zh - zl
    steep = band > 1e-9 * span
    with np.errstate(divide="ignore", invalid="ignore"):
        k = np.where(steep, (xh - xl) / np.where(steep, band, 1.0), 0.0)
    alpha = xl - k * zl
    # int X dz (plane), and int X^2 dz + 2 xr int X dz (axisymmetric).
    const = band * (xl + xh) * 0.5
    c = np.stack([-(alpha * zl + 0.5 * k * zl ** 2), alpha, 0.5 * k, np.zeros_like(k)])
    if axi:
        const = band * (xl * xl + xl * xh + xh * xh) / 3.0 + 2.0 * xr * const
        c = np.stack([-(alpha * alpha * zl + alpha * k * zl ** 2 + k * k * zl ** 3 / 3.0),
                      alpha * alpha, alpha * k, k * k / 3.0]) + 2.0 * xr * c
        scale = sigma * np.pi
    else:
        c = c[:3]
        scale = sigma * section.width
    const = const * scale
    c = c * scale
    c = np.where(steep, c, 0.0)
    diff = np.empty((deg + 1, m + 1))
    for d in range(deg + 1):
        diff[d] = (np.bincount(il, c[d], minlength=m + 1)
                   - np.bincount(ih, c[d], minlength=m + 1))
    diff[0] += np.bincount(ih, const, minlength=m + 1)
    coeffs = np.cumsum(diff[:, :m], axis=1)
    u = heights - zmin
    vol = coeffs[deg].copy()
    for d in range(deg - 1, -1, -1):
        vol = vol * u + coeffs[d]
    vol[0] = 0.0
    np.maximum.accumulate(vol, out=vol)
    heights.setflags(write=False)
    vol.setflags(write=False)
    return VolumeCurve(heights=heights, volumes=vol)


def level_for_volume(section: Section, volume: float) -> float:
    """The level at which the section holds ``volume`` [m], exact.

    Parameters
    ----------
    section : Section
    volume : float
        Liquid volume [m3], 0 <= volume <= :func:`capacity`.

    Returns
    -------
    float
        Free-surface height [m].

    Raises
    ------
    FillError
        For a negative volume, or more than the section holds below its
        spill level (open) or in all (closed).

    Examples
    --------
    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> level_for_volume(s, 3.0)
    1.5
    """
    volume = float(volume)
    if not np.isfinite(volume) or volume < 0:
        raise FillError(f"fill volume must be a number >= 0, not {volume:g}")
    if volume == 0.0:
        return section.z_min
    cap = capacity(section)
    if volume > cap * (1.0 + 1e-12):
        where = "below its spill level" if section.is_open else "in all (it is closed)"
        raise FillError(
            f"fill volume {volume:.6g} m3 is more than the section holds {where}: {cap:.6g} m3")
    if volume >= cap:
        return section.top_level
    curve = section.volume_curve
    heights, vols = curve.heights, curve.volumes
    m = heights.size
    k = int(np.searchsorted(vols, volume, side="left")) - 1
    k = min(max(k, 0), m - 2)
    nodes = _band_nodes(section, heights[k], heights[k + 1])
    if not (nodes[0] <= volume <= nodes[-1]):
        k = _bisect_band(section, heights, volume)
        nodes = _band_nodes(section, heights[k], heights[k + 1])
    u = _solve_band(nodes, volume)
    return float(heights[k] + u * (heights[k + 1] - heights[k]))


def _band_nodes(section: Section, z_lo: float, z_hi: float) -> np.ndarray:
    """Exact volumes at equally spaced levels across one band (3 or 4)."""
    npts = 4 if section.is_axisymmetric else 3
    levels = z_lo + (z_hi - z_lo) * np.linspace(0.0, 1.0, npts)
    levels[-1] = z_hi
    return volume_below_many(section, levels)


def _bisect_band(section: Section, heights: np.ndarray, volume: float) -> int:
    """Index k with V(heights[k]) <= volume <= V(heights[k+1]), by exact
    bisection over the vertex heights (fallback, O(N log N))."""
    lo, hi = 0, heights.size - 1
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if volume_below(section, heights[mid]) < volume:
            lo = mid
        else:
            hi = mid
    return lo


def _solve_band(y: np.ndarray, target: float) -> float:
    """Root u in [0, 1] of the band polynomial through the node values ``y``
    (equally spaced in u) equal to ``target``; the polynomial increases."""
    if y.size == 3:
        c0 = y[0]
        c2 = 2.0 * (y[0] - 2.0 * y[1] + y[2])
        c1 = y[2] - y[0] - c2
        r = target - c0
        disc = max(c1 * c1 + 4.0 * c2 * r, 0.0)
        den = c1 + np.sqrt(disc)
        u = 2.0 * r / den if den > 0 else 0.0
        return min(max(u, 0.0), 1.0)
    # Cubic through 4 nodes at u = 0, 1/3, 2/3, 1 (Newton form), then a
    # safeguarded Newton iteration on the monotone bracket [0, 1].
    y0, y1, y2, y3 = y
    d1 = (y1 - y0) * 3.0
    d2 = (y2 - 2.0 * y1 + y0) * 4.5
    d3 = (y3 - 3.0 * y2 + 3.0 * y1 - y0) * 4.5
    a = (d1 - d2 / 3.0 + 2.0 * d3 / 9.0, d2 - d3, d3)  # p(u) = y0 + a1 u + a2 u^2 + a3 u^3

    def p(u: float) -> float:
        return y0 + u * (a[0] + u * (a[1] + u * a[2])) - target

    def dp(u: float) -> float:
        return a[0] + u * (2.0 * a[1] + 3.0 * u * a[2])

    lo, hi = 0.0, 1.0
    span = y3 - y0
    u = (target - y0) / span if span > 0 else 0.0
    for _ in range(100):
        v = p(u)
        if v == 0.0:
            break
        if v < 0:
            lo = u
        else:
            hi = u
        d = dp(u)
        nu = u - v / d if d > 0 else 0.5 * (lo + hi)
        if not (lo < nu < hi):
            nu = 0.5 * (lo + hi)
        if abs(nu - u) <= 4e-16 * max(1.0, abs(u)):
            u = nu
            break
        u = nu
    return min(max(u, 0.0), 1.0)
