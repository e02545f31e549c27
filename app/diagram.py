"""Drawing geometry of the loads: pressure diagrams, arrows, resultants.

Pure numpy (no Qt), so the canvas and any renderer share it. Everything in
metres and pascals; the pressure ``scale`` turns a pressure into a drawing
length [m/Pa]. Diagrams are drawn outward from the wall (along the outward
normal, from the liquid into the wall).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.section import AXIS, OPEN

__all__ = ["WettedEdges", "wetted_edges", "auto_scale", "diagram_polygons",
           "pressure_arrows", "arrow_strokes", "PartRun", "part_runs", "run_resultants"]


@dataclass(frozen=True)
class WettedEdges:
    """The wetted part of every loaded edge at a level.

    ``index`` edge indices; ``ax, az`` / ``bx, bz`` ends of the wetted part
    [m]; ``pa, pb`` pressures there [Pa]; ``nx, nz`` outward normals.
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


def wetted_edges(solution):
    """:class:`WettedEdges` of a :class:`core.hydrostatics.Solution`
    (``open`` and ``axis`` edges left out: nothing there carries load)."""
    section = solution.section
    geo = section.geometry
    h = solution.level
    rg = solution.density * solution.gravity
    f = np.clip((h - geo.z_low) * geo.inv_abs_dz, 0.0, 1.0)
    carries = np.fromiter((p not in (OPEN, AXIS) for p in section.parts), bool,
                          count=section.n_edges)
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


def auto_scale(section, max_pressure, fraction=0.3):
    """A scale [m/Pa] drawing the largest pressure ``fraction`` of the
    section's size long (1e-6 when there is no pressure)."""
    size = max(float(np.ptp(section.outline[:, 0])), float(np.ptp(section.outline[:, 1])))
    if not max_pressure > 0:
        return 1e-6
    return fraction * size / max_pressure


def diagram_polygons(w, scale):
    """The diagrams as one point list for a path: per wetted edge the
    polygon wall A, A + pa n, B + pb n, wall B, A (5 points). Returns x, z and
    ``connect`` (False after each polygon's last point)."""
    m = w.index.size
    x = np.empty((m, 5))
    z = np.empty((m, 5))
    x[:, 0] = x[:, 4] = w.ax
    z[:, 0] = z[:, 4] = w.az
    x[:, 1] = w.ax + w.pa * scale * w.nx
    z[:, 1] = w.az + w.pa * scale * w.nz
    x[:, 2] = w.bx + w.pb * scale * w.nx
    z[:, 2] = w.bz + w.pb * scale * w.nz
    x[:, 3] = w.bx
    z[:, 3] = w.bz
    connect = np.ones((m, 5), dtype=bool)
    connect[:, 4] = False
    return x.ravel(), z.ravel(), connect.ravel()


def pressure_arrows(w, scale, count=48, limit=2000):
    """Arrow tails (on the wall), tips (at the diagram edge) for about
    ``count`` arrows spread evenly over the wetted perimeter (at most
    ``limit``). Returns tail_x, tail_z, tip_x, tip_z."""
    length = np.sqrt((w.bx - w.ax) ** 2 + (w.bz - w.az) ** 2)
    total = float(length.sum())
    if total <= 0:
        e = np.empty(0)
        return e, e, e, e
    spacing = total / count
    k = np.floor(length / spacing).astype(np.intp)
    k = np.maximum(k, 1)
    if k.sum() > limit:
        k = np.zeros_like(k)
        k[np.linspace(0, k.size - 1, limit).astype(np.intp)] = 1
    edge = np.repeat(np.arange(k.size), k)
    # Position j of k along each edge: (j + 0.5) / k.
    start = np.cumsum(k) - k
    j = np.arange(edge.size) - start[edge]
    t = (j + 0.5) / k[edge]
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
    pos = {int(e): k for k, e in enumerate(w.index)}
    for run in runs:
        idx = np.array([e for e in run.edges if e in pos], dtype=np.intp)
        if idx.size == 0:
            continue
        fz = float(solution.fz[idx].sum())
        if axi:
            k = np.array([pos[int(e)] for e in idx])
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
        if f2 > 0:
            moment = float(np.sum(cp[:, 0] * solution.fz[idx] - cp[:, 1] * solution.fx[idx]))
            t = (moment - (cx * fz - cz * fx)) / f2
            cx, cz = cx + t * fz, cz - t * fx
        out.append((run, fx, fz, cx, cz))
    return out
