"""Loads against level: the totals at many fill levels at once.

For a chart of loads from empty to full and for the CSV export. The same
closed-form edge integrals as :func:`wetline.core.hydrostatics.solve`, evaluated for
M levels and N edges as (M, N) arrays in chunks (memory bounded), then summed
per part with one matrix product.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np
from numpy.typing import ArrayLike

from . import STANDARD_GRAVITY
from .fill import _clipped, _green_sum
from .hydrostatics import checked_density_and_gravity
from .section import FLOOR, Section

if TYPE_CHECKING:  # pragma: no cover - types only
    from .pressure_law import PressureLaw

__all__ = ["LevelTable", "level_table", "law_level_table", "part_down_at", "DEFAULT_STEPS"]

DEFAULT_STEPS = 51
"""Default number of levels in a table (50 equal steps)."""


@dataclass(frozen=True, eq=False)
class LevelTable:
    """Totals at a series of levels, all SI, one entry per level.

    Attributes
    ----------
    levels : numpy.ndarray
        Free-surface heights [m], ascending from the lowest point to the top
        level (spill level if open, roof if closed).
    volume : numpy.ndarray
        Liquid volume [m3].
    fluid_weight : numpy.ndarray
        rho g V [N].
    floor_force, support_reaction : numpy.ndarray
        Downward loads on the ``floor`` part and on all other loaded parts [N].
    part_down : dict of str to numpy.ndarray
        Downward load on each loaded part [N] (negative: lifted).
    max_pressure : numpy.ndarray
        [Pa].
    pockets : str
        The assumption about air under ceilings: ``"vented"`` or
        ``"trapped"``.
    air_volume : numpy.ndarray or None
        Air trapped in pockets at each level [m3] (trapped pockets only).
    """

    levels: np.ndarray
    volume: np.ndarray
    fluid_weight: np.ndarray
    floor_force: np.ndarray
    support_reaction: np.ndarray
    part_down: dict[str, np.ndarray]
    max_pressure: np.ndarray
    pockets: str = "vented"
    air_volume: np.ndarray | None = None

    def columns(self) -> list[tuple[str, np.ndarray]]:
        """Column names and arrays, in table order: level, volume, weight,
        floor force, support reaction, then one per part."""
        cols = [("level", self.levels), ("volume", self.volume),
                ("fluid_weight", self.fluid_weight), ("floor_force", self.floor_force),
                ("support_reaction", self.support_reaction),
                ("max_pressure", self.max_pressure)]
        cols += [(f"down:{name}", arr) for name, arr in self.part_down.items()]
        return cols


def level_table(section: Section, density: float, gravity: float = STANDARD_GRAVITY,
                steps: int = DEFAULT_STEPS, *, levels: ArrayLike | None = None,
                chunk_elements: int = 1_000_000) -> LevelTable:
    """Totals at ``steps`` equally spaced levels from empty to the top level.

    Parameters
    ----------
    section : Section
    density : float
        [kg/m3]
    gravity : float
        [m/s2]
    steps : int
        Number of levels, >= 2, from ``section.z_min`` to
        ``section.top_level`` inclusive.
    levels : array_like, optional
        Explicit levels [m] instead of ``steps`` (not capped: give levels at
        or below the spill level for an open section).
    chunk_elements : int
        Largest levels x edges block computed at once.

    Returns
    -------
    LevelTable

    Examples
    --------
    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> t = level_table(s, 1000.0, steps=4)
    >>> t.levels.tolist(), t.volume.tolist()
    ([0.0, 1.0, 2.0, 3.0], [0.0, 2.0, 4.0, 6.0])
    """
    density, gravity = checked_density_and_gravity(density, gravity)
    if levels is None:
        steps = int(steps)
        if steps < 2:
            raise ValueError(f"a level table needs at least 2 steps, not {steps}")
        levels = np.linspace(section.z_min, section.top_level, steps)
    else:
        levels = np.asarray(levels, dtype=np.float64).ravel()
        if not np.isfinite(levels).all():
            raise ValueError("levels must be finite numbers")
    geo = section.geometry
    n = section.n_edges
    rg = density * gravity
    names = section.loaded_part_names
    onehot = np.zeros((n, len(names)))
    col = {name: k for k, name in enumerate(names)}
    for i, p in enumerate(section.parts):
        if p in col:
            onehot[i, col[p]] = 1.0
    part_fz = np.empty((levels.size, len(names)))
    volume = np.empty(levels.size)
    rows = max(1, chunk_elements // max(n, 1))
    for i in range(0, levels.size, rows):
        h = levels[i:i + rows, None]
        f, ta = _clipped(geo, h)
        volume[i:i + rows] = _green_sum(section, f, ta)
        part_fz[i:i + rows] = _edge_fz(section, h, f, ta, rg) @ onehot
    part_down = {name: -part_fz[:, k] for k, name in enumerate(names)}
    zero = np.zeros(levels.size)
    floor = part_down.get(FLOOR, zero)
    support = sum((v for k, v in part_down.items() if k != FLOOR), zero.copy())
    return LevelTable(levels=levels, volume=volume, fluid_weight=rg * volume,
                      floor_force=floor, support_reaction=support, part_down=part_down,
                      max_pressure=rg * np.maximum(levels - section.z_min, 0.0))


def law_level_table(section: Section, law: PressureLaw, steps: int = DEFAULT_STEPS, *,
                    levels: ArrayLike | None = None, pockets: str = "vented",
                    atmospheric_pressure: float = 101325.0) -> LevelTable:
    """Totals against level for a full pressure law: layers, gas and, with
    ``pockets="trapped"``, the air trapped under ceilings at each level.

    The top layer's surface moves; the layers below it, the gas and gravity
    stay. Each level is solved exactly
    (:func:`wetline.core.pressure_law.integrate_edges`, with
    :func:`wetline.core.pockets.trap_air` for trapped pockets): about 0.4 ms
    a level at 2,000 vertices with trapped air.

    Parameters
    ----------
    section : Section
    law : PressureLaw
    steps : int
        Number of levels, >= 2, from just above the top interface (the
        lowest point for one liquid) to ``section.top_level``.
    levels : array_like, optional
        Explicit levels [m] instead (above the top interface, at or below
        the spill level of an open section).
    pockets : str
        ``"vented"`` or ``"trapped"``.
    atmospheric_pressure : float
        [Pa] absolute (trapped pockets).

    Returns
    -------
    LevelTable
        With ``pockets`` and, for trapped pockets, ``air_volume``.

    Examples
    --------
    The chamber of :func:`wetline.core.pockets.trap_air` full to the riser's
    top: the roof's air, trapped at the lip (1.5 m) and compressed to about
    1.6 m, presses the whole roof with the pressure at its interface, 2.4 m
    down, where vented water would give the 2 m below the surface.

    >>> from wetline.core.pressure_law import PressureLaw
    >>> s = Section.build([[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5],
    ...                    [0.8, 1.5], [0.8, 4], [0, 4]],
    ...                   parts=["floor", "wall", "roof", "wall", "wall", "wall",
    ...                          "open", "wall"])
    >>> law = PressureLaw.single(1000.0, 4.0, gravity=10.0)
    >>> v = law_level_table(s, law, levels=[4.0])
    >>> t = law_level_table(s, law, levels=[4.0], pockets="trapped")
    >>> round(float(v.part_down["roof"][0])), round(float(t.part_down["roof"][0]))
    (-40000, -48082)
    """
    from .pockets import trap_air
    from .pressure_law import integrate_edges

    if pockets not in ("vented", "trapped"):
        raise ValueError(f"pockets must be 'vented' or 'trapped', not {pockets!r}")
    lo = section.z_min
    if law.n_layers > 1:
        lo = max(lo, float(np.nextafter(law.interfaces[-1], np.inf)))
    if levels is None:
        steps = int(steps)
        if steps < 2:
            raise ValueError(f"a level table needs at least 2 steps, not {steps}")
        levels = np.linspace(lo, max(section.top_level, lo), steps)
    else:
        levels = np.asarray(levels, dtype=np.float64).ravel()
        if not np.isfinite(levels).all():
            raise ValueError("levels must be finite numbers")
    names = section.loaded_part_names
    idx = section.geometry.part_index
    keep = [k for k, name in enumerate(section.part_names) if name in names]
    m = len(section.part_names)
    part_fz = np.empty((levels.size, len(names)))
    volume = np.empty(levels.size)
    weight = np.empty(levels.size)
    pmax = np.empty(levels.size)
    air = np.zeros(levels.size) if pockets == "trapped" else None
    tree = section.pocket_tree if pockets == "trapped" else None
    for i, h in enumerate(levels.tolist()):
        at = law.with_level(h)
        caps = None
        if tree is not None:
            state = trap_air(tree, at, atmospheric_pressure)
            caps = state.caps
            air[i] = state.air_volume
        e = integrate_edges(section, at, caps)
        part_fz[i] = np.bincount(idx, weights=e.fz, minlength=m)[keep]
        volume[i], weight[i], pmax[i] = e.volume, e.fluid_weight, e.max_pressure
    part_down = {name: 0.0 - part_fz[:, k] for k, name in enumerate(names)}
    zero = np.zeros(levels.size)
    floor = part_down.get(FLOOR, zero)
    support = sum((v for k, v in part_down.items() if k != FLOOR), zero.copy())
    return LevelTable(levels=levels, volume=volume, fluid_weight=weight, floor_force=floor,
                      support_reaction=support, part_down=part_down, max_pressure=pmax,
                      pockets=pockets, air_volume=air)


def _edge_fz(section: Section, h: np.ndarray, f: np.ndarray, ta: np.ndarray, rg: float,
             idx: np.ndarray | None = None) -> np.ndarray:
    """Vertical force on each edge [N] for levels ``h`` (an (M, 1) column),
    given the clipped fractions ``f`` and starts ``ta`` of the same edges;
    ``idx`` restricts the edges (f and ta then hold only those)."""
    geo = section.geometry
    n = section.n_edges
    if idx is None:
        vz0, vz1 = geo.vertex_z[:n], geo.vertex_z[1:]
        x0, dx, length, nz = geo.x0, geo.dx, geo.length, geo.nz
    else:
        vz0, vz1 = geo.vertex_z[idx], geo.vertex_z[idx + 1]
        x0, dx, length, nz = geo.x0[idx], geo.dx[idx], geo.length[idx], geo.nz[idx]
    a0 = np.maximum(h - vz0, 0.0)
    a1 = np.maximum(h - vz1, 0.0)
    wl = f * length
    if section.is_axisymmetric:
        ra = ta * dx + x0
        rb = f * dx + ra
        q = ((2.0 * a0 + a1) * ra + (a0 + 2.0 * a1) * rb) * wl
        return q * ((2.0 * np.pi / 6.0) * rg) * nz
    return (wl * (a0 + a1)) * (0.5 * rg * section.width) * nz


def part_down_at(section: Section, part: str, levels: ArrayLike, density: float,
                 gravity: float = STANDARD_GRAVITY) -> np.ndarray:
    """Downward load on one part at many levels [N], from its own edges only.

    Parameters
    ----------
    section : Section
    part : str
        A loaded part name of ``section``.
    levels : array_like
        (M,) free-surface heights [m] (not capped).
    density : float
        [kg/m3]
    gravity : float
        [m/s2]

    Returns
    -------
    numpy.ndarray
        (M,) ``-fz`` summed over the part's edges [N].
    """
    idx = np.flatnonzero(np.asarray(section.parts) == part)
    if idx.size == 0:
        raise ValueError(f"the section has no part {part!r}")
    levels = np.asarray(levels, dtype=np.float64).ravel()
    h = levels[:, None]
    f, ta = _clipped(section.geometry, h, idx)
    return -_edge_fz(section, h, f, ta, float(density) * float(gravity), idx).sum(axis=1)
