"""The results record: a solution as plain JSON-ready values, always SI.

Follows the project's shared spec (``physics-and-results.md``): format
``"wetline-results"`` version 1; m, m2, m3, Pa, N, N/m whatever unit the file
or the screen uses; edges in the file's order and direction; ``null`` where a
value is not defined (fx and centre of pressure on axisymmetric sections,
hoop force on horizontal edges and on plane sections, centre of pressure on a
dry edge).

Keys added beyond the spec's list (the spec allows additions):
``requested_level``, ``top_level``, ``liquid`` (name and the source of its
density), ``cautions``. For axisymmetric sections ``width`` is null and an
edge's ``resultant`` is |fz| (the net force over the revolution is vertical).
"""

from __future__ import annotations

import gc
import math
from collections.abc import Iterator
from contextlib import contextmanager
from typing import TYPE_CHECKING, Any

import numpy as np
import numpy.typing as npt

from .number_input import number_text

if TYPE_CHECKING:  # pragma: no cover - types only
    from .case import Case
    from .hydrostatics import Solution

__all__ = ["ASSUMPTIONS", "CAUTION", "EARTH_PRESSURE_ASSUMPTION", "EARTH_PRESSURE_CAUTION",
           "assumptions", "building_records", "results_record"]

ASSUMPTIONS = (
    "hydrostatic, one liquid, pockets vented",
    "gauge pressure (atmosphere = 0) at the free surface",
    "straight edges; curved walls are represented by their polygon",
)

CAUTION = (
    "Hydrostatic loads only: no sloshing, seismic, wind, surge, thermal, lateral earth "
    "pressure or structural capacity checks. Verify against local codes and licensed "
    "practice."
)
"""The one caution of every output: the record's ``cautions``, the readable
table, the window, the diagram and the calculation sheet."""


def _num(v: float | None) -> float | None:
    """Plain float, None for NaN, 0.0 for -0.0."""
    if v is None:
        return None
    v = float(v)
    if math.isnan(v):
        return None
    return v + 0.0


def _point(p: npt.NDArray[np.float64] | None) -> list[float | None] | None:
    if p is None or not np.isfinite(p).all():
        return None
    return [_num(p[0]), _num(p[1])]


def assumptions(solution: Solution, structure: bool = False) -> list[str]:
    """The assumptions of a result, in words: the pressure law (one liquid
    or layers, gauge pressure or a gas, pockets vented or trapped) and, with
    a structure, that lateral earth pressure is not computed.

    Parameters
    ----------
    solution : wetline.core.hydrostatics.Solution
    structure : bool
        True if the result includes a structure around the cavity.

    Returns
    -------
    list of str
        :data:`ASSUMPTIONS` for one liquid at atmospheric pressure with
        pockets vented and no structure.

    Examples
    --------
    >>> from wetline.core.hydrostatics import solve
    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"])
    >>> assumptions(solve(s, 2.0, 1000.0)) == list(ASSUMPTIONS)
    True
    """
    law = solution.law
    layers = () if law is None else law.layers
    trapped = solution.pocket_mode == "trapped"
    gas = solution.gas_pressure
    if len(layers) <= 1 and gas == 0.0 and not trapped and not structure:
        return list(ASSUMPTIONS)
    if len(layers) > 1:
        names = ", ".join(layer.name or f"layer {k + 1}" for k, layer in enumerate(layers))
        liquid = (f"hydrostatic, {len(layers)} immiscible liquid layers bottom up ({names}), "
                  "the pressure kinked at each interface")
    else:
        liquid = "hydrostatic, one liquid"
    if trapped:
        liquid += (", pockets trapped: air caught under a ceiling when the liquid seals its "
                   "lip is compressed isothermally (Boyle's law, air weightless) from "
                   f"{number_text(solution.atmospheric_pressure)} Pa absolute")
    else:
        liquid += ", pockets vented"
    if gas != 0.0:
        surface = (f"a gas at {number_text(gas)} Pa gauge over the free surface, acting on "
                   "every wetted point and on the dry edges of the gas space")
    else:
        surface = "gauge pressure (atmosphere = 0) at the free surface"
    out = [liquid, surface, ASSUMPTIONS[2]]
    if structure:
        out.append(EARTH_PRESSURE_ASSUMPTION)
    return out


EARTH_PRESSURE_ASSUMPTION = (
    "lateral earth pressure is not computed: the structure carries groundwater on its "
    "outer edges and soil only vertically, on its ledges and roof")
"""The assumption (and caution) of every result with a structure."""


def _nums(a: npt.NDArray[np.float64]) -> list[float | None]:
    """Plain floats of an array, None for NaN, 0.0 for -0.0 (no per-element float())."""
    values: list[float | None] = (np.asarray(a, dtype=np.float64) + 0.0).tolist()
    if np.isnan(a).any():
        return [None if v != v else v for v in values]
    return values


def _points(a: npt.NDArray[np.float64]) -> list[list[float] | None]:
    """[x, z] pairs of an (N, 2) array, None for a row that is not finite."""
    rows: list[list[float] | None] = (np.asarray(a, dtype=np.float64) + 0.0).tolist()
    bad = ~np.isfinite(a).all(axis=1)
    if bad.any():
        for i in np.flatnonzero(bad).tolist():
            rows[i] = None
    return rows


@contextmanager
def building_records() -> Iterator[None]:
    """Pause Python's cyclic garbage collector while large records are built.

    A record of 2,000 edges is thousands of small dicts and lists; each
    allocation burst triggers collections that walk everything built so far
    (about 40 % of the time of 20 such records, measured in
    bench/bench_cases.py). The records hold no reference cycles, so nothing
    is left for the collector; it is switched back on (if it was on) after.
    """
    was = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was:
            gc.enable()


def _case_name(case: Case) -> str:
    """The name of a file's one case: the section's name, else "case 1"
    (as :class:`wetline.core.load_cases.Design` names it)."""
    return case.section.name.strip() or "case 1"


def results_record(case: Case, solution: Solution | None = None, *, name: str | None = None,
                   load_factor: float = 1.0,
                   structure: dict[str, Any] | None = None) -> dict[str, Any]:
    """The results record of ``case`` (solved at its fill unless a
    ``solution`` is given), as a dict ready for :func:`json.dumps`.

    Parameters
    ----------
    case : wetline.core.case.Case
    solution : wetline.core.hydrostatics.Solution, optional
    name : str, optional
        The load case's name (default: the section's name, else "case 1").
    load_factor : float
        The case's load factor [].
    structure : dict, optional
        :func:`wetline.core.structure.structure_record` of the case's loads
        on the structure; None (null) without a structure.

    Returns
    -------
    dict
        Every key of version 1 with its meaning, and the version 3 keys
        ``case``, ``load_factor``, ``gas_pressure``, ``layers`` (name,
        density, bottom, top, volume, weight of each, bottom up),
        ``pockets`` (``sealed_at``, ``interface``, ``air_pressure``,
        ``air_volume``; added: ``split_at``) and ``structure``.
    """
    sol = case.solve() if solution is None else solution
    with building_records():
        return _record(case, sol, name, load_factor, structure)


def _record(case: Case, sol: Solution, name: str | None, load_factor: float,
            structure: dict[str, Any] | None) -> dict[str, Any]:
    sec = sol.section
    axi = sec.is_axisymmetric
    pts = _points(sec.outline)
    n = sec.n_edges
    nothing = [None] * n
    fx = nothing if axi else _nums(sol.fx)
    cp = nothing if axi else _points(sol.centre_of_pressure)
    h0, h1 = (_nums(sol.hoop_start), _nums(sol.hoop_end)) if axi else (nothing, nothing)
    edges = [{"index": i, "part": part, "start": start, "end": end, "wetted_length": wl,
              "p_start": p0, "p_end": p1, "fx": x, "fz": z, "resultant": r,
              "centre_of_pressure": c, "hoop_start": a, "hoop_end": b}
             for i, (part, start, end, wl, p0, p1, x, z, r, c, a, b) in enumerate(zip(
                 sec.parts, pts, pts[1:] + pts[:1], _nums(sol.wetted_length),
                 _nums(sol.p_start), _nums(sol.p_end), fx, _nums(sol.fz),
                 _nums(sol.resultant), cp, h0, h1, strict=True))]
    parts = {k: {"fx": None if axi else _num(p.fx), "fz": _num(p.fz), "down": _num(p.down)}
             for k, p in sol.parts.items()}
    layers = [{"name": layer.name or (case.liquid.name if k == 0 else ""),
               "density": _num(layer.density), "bottom": _num(layer.bottom),
               "top": _num(layer.top), "volume": _num(layer.volume),
               "weight": _num(layer.weight)}
              for k, layer in enumerate(sol.layers)]
    pockets = [{"sealed_at": _num(p.sealed_at), "interface": _num(p.interface),
                "air_pressure": _num(p.air_pressure), "air_volume": _num(p.air_volume),
                "split_at": _num(p.split_at)} for p in sol.pockets]
    return {
        "format": "wetline-results",
        "version": 1,
        "name": sec.name,
        "case": _case_name(case) if name is None else name,
        "load_factor": _num(load_factor),
        "geometry": sec.kind,
        "width": None if axi else _num(sec.width),
        "density": _num(sol.density),
        "gravity": _num(sol.gravity),
        "liquid": {"name": case.liquid.name, "source": case.liquid.source},
        "requested_level": _num(sol.requested_level),
        "level": _num(sol.level),
        "spill_level": _num(sec.spill_level),
        "top_level": _num(sec.top_level),
        "volume": _num(sol.volume),
        "fluid_weight": _num(sol.fluid_weight),
        "floor_force": _num(sol.floor_force),
        "support_reaction": _num(sol.support_reaction),
        "max_pressure": _num(sol.max_pressure),
        "gas_pressure": _num(sol.gas_pressure),
        "pockets_assumption": sol.pocket_mode,
        "layers": layers,
        "pockets": pockets,
        "parts": parts,
        "edges": edges,
        "structure": structure,
        "warnings": list(sol.warnings),
        "assumptions": assumptions(sol, structure is not None),
        "cautions": CAUTION if structure is None else f"{CAUTION} {EARTH_PRESSURE_CAUTION}",
    }


EARTH_PRESSURE_CAUTION = ("Lateral earth pressure on the structure is not computed: check the "
                          "walls for it separately.")
