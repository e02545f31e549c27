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

from collections.abc import Iterable
from dataclasses import dataclass
from functools import cached_property
from typing import TYPE_CHECKING

import numpy as np

from . import STANDARD_GRAVITY
from .pressure_law import PressureLaw, _one_liquid, integrate_edges
from .section import FLOOR, Section

if TYPE_CHECKING:  # pragma: no cover - types only
    from .pockets import Pocket, PocketState

__all__ = ["POCKET_MODES", "TRAPPED", "VENTED", "LayerLoad", "PartLoad", "Solution", "solve",
           "solve_law", "resolve_level"]

STANDARD_ATMOSPHERE = 101325.0
"""[Pa] (ISO 2533), as :data:`wetline.core.pockets.STANDARD_ATMOSPHERE`."""


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


VENTED = "vented"
TRAPPED = "trapped"
POCKET_MODES = (VENTED, TRAPPED)
"""The values of a load case's ``pockets`` (section format v3)."""


@dataclass(frozen=True)
class LayerLoad:
    """One liquid layer of a solution.

    Attributes
    ----------
    name : str
    density : float
        [kg/m3]
    bottom, top : float
        Levels of its lower and upper boundary [m]: the lowest point of the
        section or the interface below; the interface above or the free
        surface.
    volume : float
        Its liquid volume [m3] (area x width for plane sections), trapped
        air left out.
    weight : float
        rho g V [N].
    """

    name: str
    density: float
    bottom: float
    top: float
    volume: float
    weight: float


@dataclass(frozen=True, eq=False)
class Solution:
    """Loads on a section at one level. Arrays have one entry per edge, in
    the section's (file's) edge order and direction.

    Attributes
    ----------
    section : Section
    density : float
        Liquid density [kg/m3]: the bottom layer's.
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
        ``rho g V`` [N], of all layers.
    floor_force, support_reaction : float
        Downward load on the ``floor`` part, and on every other loaded part
        [N]; see the module notes.
    max_pressure : float
        Largest wall pressure [Pa], at the lowest wetted point (the gas
        pressure included).
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
    law : PressureLaw
        The pressure law used: layers (their tops, the last the level),
        gas pressure, gravity.
    layer_volumes, layer_weights : numpy.ndarray
        (n_layers,) volume [m3] and weight [N] of each layer, bottom up
        (see :attr:`layers`).
    gas_pressure : float
        Gauge pressure of the gas over the free surface [Pa]; it acts on
        every wetted point and on the dry edges of the main gas space, so
        ``p_start`` / ``p_end`` carry it (or a pocket's air pressure) where
        dry, and ``max_pressure`` includes it.
    pockets : tuple of wetline.core.pockets.Pocket
        Air trapped under ceilings (empty with vented pockets).
    caps : numpy.ndarray or None
        (N,) each edge's liquid surface [m] with trapped pockets, None when
        none is sealed (see :attr:`wetline.core.pockets.PocketState.caps`).
    pocket_mode : str
        ``"vented"`` or ``"trapped"``: the assumption the solution used.
    atmospheric_pressure : float
        [Pa] absolute, used by trapped pockets.
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
    law: PressureLaw | None = None
    layer_volumes: np.ndarray | None = None
    layer_weights: np.ndarray | None = None
    gas_pressure: float = 0.0
    pockets: tuple[Pocket, ...] = ()
    caps: np.ndarray | None = None
    pocket_mode: str = "vented"
    atmospheric_pressure: float = 101325.0

    @cached_property
    def layers(self) -> tuple[LayerLoad, ...]:
        """Each liquid layer bottom up with its volume and weight (tuple of
        :class:`LayerLoad`)."""
        if self.law is None or self.layer_volumes is None or self.layer_weights is None:
            return ()
        bottom = self.section.z_min
        out = []
        for layer, v, w in zip(self.law.layers, self.layer_volumes.tolist(),
                               self.layer_weights.tolist(), strict=True):
            out.append(LayerLoad(name=layer.name, density=layer.density, bottom=bottom,
                                 top=layer.top, volume=v, weight=w))
            bottom = max(bottom, layer.top)
        return tuple(out)

    @property
    def air_volume(self) -> float:
        """All air trapped in pockets [m3] (0 with vented pockets)."""
        return float(sum(p.air_volume for p in self.pockets))

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


def solve(section: Section, level: float, density: float,
          gravity: float = STANDARD_GRAVITY) -> Solution:
    """Loads of a liquid standing at ``level`` in ``section``.

    One liquid, no gas, pockets vented: a thin wrapper over
    :func:`wetline.core.pressure_law.integrate_edges` with a one-layer
    :class:`~wetline.core.pressure_law.PressureLaw` (see :func:`solve_law`
    for layers, gas and trapped air).

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
    law = PressureLaw._single_trusted(density, h, gravity)
    # integrate_edges' one-liquid path, without its checks: the level is
    # resolved (capped at the spill level) and there is no gas.
    return _solution(section, law, _one_liquid(section, law), None, float(level),
                     tuple(warnings), VENTED, STANDARD_ATMOSPHERE)


def solve_law(section: Section, law: PressureLaw, *, requested_level: float | None = None,
              pockets: PocketState | None = None, warnings: Iterable[str] = ()) -> Solution:
    """Loads of a full pressure law (layers, gas) in ``section``, with the
    pockets of trapped air of ``pockets`` in place.

    Parameters
    ----------
    section : Section
    law : PressureLaw
        Its free surface is the level used (already capped at the spill
        level of an open section, :func:`resolve_level`).
    requested_level : float, optional
        The level asked for [m] (default: the law's level).
    pockets : PocketState, optional
        From :func:`wetline.core.pockets.trap_air` for this law; None:
        pockets vented.
    warnings : iterable of str
        Carried into the solution (from :func:`resolve_level`).

    Returns
    -------
    Solution

    Raises
    ------
    PressureLawError
        For a gas over an open section or a level above its spill level.

    Examples
    --------
    Fat (900 kg/m3) 0.5 m deep on sewage (1010 kg/m3) to 3 m in a tank
    2 m wide, g = 10 m/s2 (hand values: 4500 Pa at the interface, 29750 Pa
    at the floor, which carries 59500 N per metre, the weight of both):

    >>> from wetline.core.pressure_law import Layer
    >>> s = Section.build([[0, 0], [2, 0], [2, 4], [0, 4]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> law = PressureLaw((Layer(1010.0, 2.5, "sewage"), Layer(900.0, 3.0, "fat")),
    ...                   gravity=10.0)
    >>> r = solve_law(s, law)
    >>> r.max_pressure, round(r.floor_force, 6), [layer.volume for layer in r.layers]
    (29750.0, 59500.0, [5.0, 1.0])
    """
    if pockets is not None:
        if pockets.law is not law and (pockets.law.layers != law.layers
                                       or pockets.law.gas_pressure != law.gas_pressure
                                       or pockets.law.gravity != law.gravity):
            raise ValueError("the pockets were trapped under another pressure law")
        state, caps, atm = pockets, pockets.caps, pockets.atmospheric_pressure
        mode = TRAPPED
    else:
        state, caps, atm, mode = None, None, STANDARD_ATMOSPHERE, VENTED
    edges = integrate_edges(section, law, caps)
    level = law.level if requested_level is None else float(requested_level)
    return _solution(section, law, edges, state, level, tuple(warnings), mode, atm)


def _solution(section, law, edges, state, requested_level, warnings, mode, atm):
    """The :class:`Solution` of integrated edge loads."""
    if section.is_axisymmetric:
        parts = _part_totals(section, None, edges.fz)
    else:
        parts = _part_totals(section, edges.fx, edges.fz)
    floor = parts.get(FLOOR)
    floor_force = floor.down if floor is not None else 0.0
    support = sum(p.down for k, p in parts.items() if k != FLOOR)
    return Solution(
        section=section, density=law.layers[0].density, gravity=law.gravity,
        requested_level=requested_level, level=law.level, volume=edges.volume,
        fluid_weight=edges.fluid_weight, floor_force=floor_force,
        support_reaction=float(support), max_pressure=edges.max_pressure,
        wetted_length=edges.wetted_length, p_start=edges.p_start, p_end=edges.p_end,
        fx=edges.fx, fz=edges.fz, resultant=edges.resultant,
        centre_of_pressure=edges.centre_of_pressure, hoop_start=edges.hoop_start,
        hoop_end=edges.hoop_end, parts=parts, warnings=warnings, law=law,
        layer_volumes=edges.layer_volumes, layer_weights=edges.layer_weights,
        gas_pressure=law.gas_pressure,
        pockets=() if state is None else state.pockets,
        caps=None if state is None else state.caps, pocket_mode=mode,
        atmospheric_pressure=atm)


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
