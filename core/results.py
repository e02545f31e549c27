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

import math
from typing import TYPE_CHECKING, Any

import numpy as np
import numpy.typing as npt

if TYPE_CHECKING:  # pragma: no cover - types only
    from .case import Case
    from .hydrostatics import Solution

__all__ = ["ASSUMPTIONS", "CAUTION", "results_record"]

ASSUMPTIONS = (
    "hydrostatic, one liquid, pockets vented",
    "gauge pressure (atmosphere = 0) at the free surface",
    "straight edges; curved walls are represented by their polygon",
)

CAUTION = (
    "Hydrostatic loads only: no sloshing, seismic, wind, surge, thermal or "
    "structural capacity checks. Verify against local codes and licensed practice."
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


def results_record(case: Case, solution: Solution | None = None) -> dict[str, Any]:
    """The results record of ``case`` (solved at its fill unless a
    ``solution`` is given), as a dict ready for :func:`json.dumps`.

    Parameters
    ----------
    case : wetline.core.case.Case
    solution : wetline.core.hydrostatics.Solution, optional

    Returns
    -------
    dict
    """
    sol = case.solve() if solution is None else solution
    sec = sol.section
    axi = sec.is_axisymmetric
    pts = sec.outline
    n = sec.n_edges
    edges = []
    for i in range(n):
        j = (i + 1) % n
        edges.append({
            "index": i,
            "part": sec.parts[i],
            "start": _point(pts[i]),
            "end": _point(pts[j]),
            "wetted_length": _num(sol.wetted_length[i]),
            "p_start": _num(sol.p_start[i]),
            "p_end": _num(sol.p_end[i]),
            "fx": None if axi else _num(sol.fx[i]),
            "fz": _num(sol.fz[i]),
            "resultant": _num(sol.resultant[i]),
            "centre_of_pressure": None if axi else _point(sol.centre_of_pressure[i]),
            "hoop_start": _num(sol.hoop_start[i]) if axi else None,
            "hoop_end": _num(sol.hoop_end[i]) if axi else None,
        })
    parts = {name: {"fx": None if axi else _num(p.fx), "fz": _num(p.fz), "down": _num(p.down)}
             for name, p in sol.parts.items()}
    return {
        "format": "wetline-results",
        "version": 1,
        "name": sec.name,
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
        "parts": parts,
        "edges": edges,
        "warnings": list(sol.warnings),
        "assumptions": list(ASSUMPTIONS),
        "cautions": CAUTION,
    }
