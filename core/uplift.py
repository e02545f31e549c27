"""Uplift check: is each lifted part held down with enough margin?

A part (a lid, a roof, a whole container on its supports ...) pushed up by
the liquid needs holding down by its own weight and any extra resistance
(bolts, ballast, a cast-in anchor). For each part with resistance entered,
the check compares

.. math:: \\text{factor} = \\frac{G + R}{U}

with the required factor, where U is the upward load of the liquid on the
part (``-down`` where positive), G the part's self-weight and R the extra
holding-down resistance, at the current level and at the worst level in the
fill range (the level of greatest uplift).

The required factor is an input. Its default, 1/0.9 = 1.11, follows EN 1997-1
(Eurocode 7) for the uplift limit state UPL, clause 2.4.7.4 eq. (2.8),
V_dst,d <= G_stb,d + R_d, with the recommended partial factors of Annex A,
Table A.15: gamma_G,dst = 1.0 on the liquid (as a permanent action) and
gamma_G,stb = 0.9 on self-weight, so that G >= U / 0.9. National Annexes may
change these values; US practice uses factors of safety of about 1.1 to 1.3
against flotation depending on the load case (USACE EM 1110-2-2100 sec. 3-8;
values from memory). The governing code sets the value.

Units: self-weight and resistance of a plane section's part are per metre of
width [N/m] and are multiplied by the section's width here, like the liquid
loads; for axisymmetric sections they are totals [N].
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

import numpy as np
import numpy.typing as npt

from . import STANDARD_GRAVITY, limits
from .level_table import part_down_at
from .number_input import number_text

if TYPE_CHECKING:  # pragma: no cover - types only
    from .case import Case
    from .hydrostatics import Solution
    from .section import Section

__all__ = [
    "DEFAULT_REQUIRED_FACTOR",
    "REQUIRED_FACTOR_SOURCE",
    "UPLIFT_CAUTION",
    "PartResistance",
    "UpliftResult",
    "fill_range",
    "uplift_check",
    "worst_uplift",
    "worst_uplifts",
    "worst_uplifts_for",
]

DEFAULT_REQUIRED_FACTOR = 1.0 / 0.9
"""Default required factor against uplift [] (EN 1997-1 UPL, see module notes)."""

REQUIRED_FACTOR_SOURCE = (
    "default 1.11 = 1/0.9: EN 1997-1 (Eurocode 7) UPL, 2.4.7.4 eq. 2.8, recommended "
    "partial factors of Annex A Table A.15 (gamma_G,dst = 1.0, gamma_G,stb = 0.9)")
UPLIFT_CAUTION = "The governing code and its National Annex set the required factor."


@dataclass(frozen=True)
class PartResistance:
    """What holds a part down.

    Attributes
    ----------
    self_weight : float
        Weight of the part [N/m of width for plane sections, N for
        axisymmetric], >= 0.
    holding_down : float
        Extra holding-down resistance: bolts, ballast ... (same units), >= 0.
    """

    self_weight: float = 0.0
    holding_down: float = 0.0

    def __post_init__(self) -> None:
        for name in ("self_weight", "holding_down"):
            v = getattr(self, name)
            if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
                raise ValueError(f"{name.replace('_', ' ')} must be a number, not {v!r}")
            if v < 0:
                raise ValueError(f"{name.replace('_', ' ')} must be >= 0, not {v:g}")
            if v > limits.FORCE_LIMIT:
                raise ValueError(f"{name.replace('_', ' ')} must be at most "
                                 f"{number_text(limits.FORCE_LIMIT)}, not {v:g}")
            object.__setattr__(self, name, float(v))

    @property
    def total(self) -> float:
        """Self-weight plus holding-down resistance [N/m or N]."""
        return self.self_weight + self.holding_down


@dataclass(frozen=True)
class UpliftResult:
    """Uplift check of one part.

    Attributes
    ----------
    part : str
    resistance : float
        G + R for the section [N] (times the width for plane sections).
    required_factor : float
        []
    uplift : float
        Upward load at the current level [N] (0 if the part is pressed down).
    factor : float
        resistance / uplift at the current level [] (inf without uplift).
    worst_level : float
        The level in the fill range with the greatest uplift [m].
    worst_uplift : float
        Upward load at that level [N].
    worst_factor : float
        resistance / worst_uplift [].
    pockets : str
        The assumption about air under ceilings at the current level: the
        case's, ``"vented"`` or ``"trapped"``.
    worst_pockets : str
        The assumption that gives the worst uplift: ``"vented"``, or
        ``"trapped"`` where the case traps air and the trapped air lifts the
        part more (both are searched then).
    """

    part: str
    resistance: float
    required_factor: float
    uplift: float
    factor: float
    worst_level: float
    worst_uplift: float
    worst_factor: float
    pockets: str = "vented"
    worst_pockets: str = "vented"

    @property
    def assumption(self) -> str:
        """The assumption of the worst level, in words (``"pockets vented"``)."""
        return f"pockets {self.worst_pockets}"

    @property
    def ok(self) -> bool:
        """True if the worst factor meets the required factor."""
        return self.worst_factor >= self.required_factor

    @property
    def ok_now(self) -> bool:
        """True if the factor at the current level meets the required one."""
        return self.factor >= self.required_factor

    @property
    def verdict(self) -> str:
        """"OK" or "NOT OK" at the worst level, for reports."""
        return "OK" if self.ok else "NOT OK"


def _ratio(resistance: float, uplift: float) -> float:
    if uplift <= 0:
        return math.inf
    return resistance / uplift


def fill_range(section: Section, level: float) -> tuple[float, float]:
    """The range of levels the check covers [m]: from empty to the spill
    level (open sections) or to the higher of the roof and ``level``
    (closed sections, where a standpipe head may stand above the roof)."""
    top = section.top_level if section.is_open else max(section.z_max, float(level))
    return section.z_min, top


def worst_uplift(section: Section, part: str, density: float, gravity: float = STANDARD_GRAVITY,
                 *, z_lo: float | None = None, z_hi: float | None = None) -> tuple[float, float]:
    """Greatest upward load on ``part`` over a range of levels, and where.

    The part's downward load is a polynomial in the level between the heights
    of its own vertices (degree 2 plane, 3 axisymmetric). In each band the
    polynomial is fitted through 4 exact values and its stationary points
    found; the candidates (band ends and stationary points) are evaluated
    exactly and the largest upward load wins.

    Parameters
    ----------
    section : Section
    part : str
    density : float
        [kg/m3]
    gravity : float
        [m/s2]
    z_lo, z_hi : float, optional
        The range [m]; default :func:`fill_range` at the top level.

    Returns
    -------
    level : float
        [m]
    uplift : float
        Upward load there [N], >= 0.
    """
    if z_lo is None or z_hi is None:
        lo, hi = fill_range(section, section.top_level)
        z_lo = lo if z_lo is None else z_lo
        z_hi = hi if z_hi is None else z_hi
    idx = np.flatnonzero(np.asarray(section.parts) == part)
    zs = section.outline[:, 1]
    heights = np.unique(np.concatenate([zs[idx], zs[(idx + 1) % section.n_edges]]))
    inner = heights[(heights > z_lo) & (heights < z_hi)]
    bounds = np.concatenate([[z_lo], inner, [z_hi]])
    band_lo, band_hi = bounds[:-1], bounds[1:]
    u = np.array([0.0, 1.0 / 3.0, 2.0 / 3.0, 1.0])
    nodes = band_lo[:, None] + (band_hi - band_lo)[:, None] * u
    y = -part_down_at(section, part, nodes.ravel(), density, gravity).reshape(nodes.shape)
    # Cubic through the 4 nodes of each band, as a0 + a1 u + a2 u^2 + a3 u^3.
    d1 = (y[:, 1] - y[:, 0]) * 3.0
    d2 = (y[:, 2] - 2.0 * y[:, 1] + y[:, 0]) * 4.5
    d3 = (y[:, 3] - 3.0 * y[:, 2] + 3.0 * y[:, 1] - y[:, 0]) * 4.5
    a1 = d1 - d2 / 3.0 + 2.0 * d3 / 9.0
    a2 = d2 - d3
    a3 = d3
    candidates: list[npt.NDArray[np.float64]] = [bounds]
    for k in range(band_lo.size):
        # roots of a1 + 2 a2 u + 3 a3 u^2 inside (0, 1)
        if not (a3[k] or a2[k]):
            continue
        for r in np.atleast_1d(np.roots([3.0 * a3[k], 2.0 * a2[k], a1[k]])):
            if abs(r.imag) < 1e-12 and 0.0 < r.real < 1.0:
                candidates.append(np.array([band_lo[k] + (band_hi[k] - band_lo[k]) * r.real]))
    cand = np.unique(np.concatenate(candidates))
    up = -part_down_at(section, part, cand, density, gravity)
    k = int(np.argmax(up))
    return float(cand[k]), max(float(up[k]), 0.0)


def worst_uplifts(section: Section, parts: Iterable[str], density: float,
                  gravity: float = STANDARD_GRAVITY) -> dict[str, tuple[float, float]]:
    """:func:`worst_uplift` of each part over the levels from empty to the
    top level (spill level or roof), ``{part: (level [m], uplift [N])}``.

    It depends on the outline and the liquid only, not on the current level,
    so a caller may keep it while only the fill changes and pass it to
    :func:`uplift_check`. Above the roof of a closed section every edge is
    fully wetted and a part's load is linear in the level, so the worst over
    a range reaching a standpipe head is this or the load at the head.
    """
    lo, hi = section.z_min, section.top_level
    return {name: worst_uplift(section, name, density, gravity, z_lo=lo, z_hi=hi)
            for name in parts}


def _is_one_liquid(solution: Solution) -> bool:
    law = solution.law
    return law is None or (law.n_layers == 1 and law.gas_pressure == 0.0)


def worst_uplifts_for(solution: Solution, parts: Iterable[str], *, refine: bool = True,
                      trapped_samples: Samples | None = None
                      ) -> dict[str, tuple[float, float, str]]:
    """The worst level of each part for the pressure law and pocket
    assumption of ``solution``, ``{part: (level [m], uplift [N], pockets)}``.

    The level of the top layer moves from just above the top interface (the
    lowest point for one liquid) to the top level (spill level or roof); the
    layers below it, the gas and gravity stay as they are. With vented
    pockets the uplift is the one-liquid uplift of the top layer's density
    plus a constant (the lower layers and the gas do not move), so
    :func:`worst_uplift` finds its level exactly. With trapped pockets both
    assumptions are searched and the larger uplift governs; the trapped one
    is sampled at 64 levels and at every lip, then refined by golden-section
    search between the best sample's neighbours (to 1e-9 of the range, not
    in closed form: the air's compression follows Boyle's law).

    Parameters
    ----------
    solution : wetline.core.hydrostatics.Solution
    parts : iterable of str
    refine : bool
        False: the trapped search takes only 12 samples and the lips, with
        no refinement (about 1/8 of the work; the uplift found is then a
        lower bound on the worst, exact at the level it names). For a live
        preview, never for a result.
    trapped_samples : (levels, part_down), optional
        With ``refine=False``: levels [m] and each part's downward load at
        them [N] (negative: lifted) with the air trapped, under this
        solution's law, as :func:`wetline.core.level_table.law_level_table`
        gives them (the chart's table of a live preview): the samples, in
        place of the 12 levels solved (the lips are still solved). Levels
        outside the range searched are left out.

    Returns
    -------
    dict
        ``pockets`` is ``"vented"`` or ``"trapped"``: the assumption of the
        worst level.
    """
    from .hydrostatics import TRAPPED, VENTED

    section = solution.section
    parts = list(parts)
    if _is_one_liquid(solution):
        found = worst_uplifts(section, parts, solution.density, solution.gravity)
        out = {k: (lvl, up, VENTED) for k, (lvl, up) in found.items()}
    else:
        out = _worst_vented_law(solution, parts)
    if solution.pocket_mode == TRAPPED and section.pocket_tree.may_trap and parts:
        samples = trapped_samples if not refine else None
        for name, (lvl, up) in _worst_trapped(solution, parts, refine, samples).items():
            if up > out[name][1] * (1.0 + 1e-12):
                out[name] = (lvl, up, TRAPPED)
    return out


def _law_range(solution: Solution) -> tuple[float, float]:
    """Levels the top layer's surface can take [m]: above the top
    interface (or from the lowest point) to the top level."""
    section = solution.section
    law = solution.law
    lo = section.z_min
    if law is not None and law.n_layers > 1:
        lo = max(lo, float(np.nextafter(law.interfaces[-1], np.inf)))
    return lo, max(section.top_level, lo)


def _part_downs_at(solution: Solution, level: float, trapped: bool) -> dict[str, float]:
    """Downward load on every loaded part at ``level`` [N], the law of
    ``solution`` (its lower layers, gas, gravity) with pockets vented or
    trapped."""
    from .hydrostatics import solve_law
    from .pockets import trap_air

    assert solution.law is not None  # every Solution of solve() and solve_law() has one
    law = solution.law.with_level(level)
    state = trap_air(solution.section.pocket_tree, law, solution.atmospheric_pressure) \
        if trapped else None
    sol = solve_law(solution.section, law, pockets=state)
    return {k: p.down for k, p in sol.parts.items()}


def _worst_vented_law(solution: Solution, parts: list[str]
                      ) -> dict[str, tuple[float, float, str]]:
    lo, hi = _law_range(solution)
    assert solution.law is not None
    top = solution.law.layers[-1]
    out = {}
    for name in parts:
        level, _ = worst_uplift(solution.section, name, top.density, solution.gravity,
                                z_lo=lo, z_hi=hi)
        out[name] = (level, max(-_part_downs_at(solution, level, False)[name], 0.0), "vented")
    return out


Samples = tuple[npt.NDArray[np.float64], Mapping[str, npt.NDArray[np.float64]]]
"""Levels [m] and each part's downward load at them [N] (a level table's)."""

_TRAPPED_SAMPLES = 64
_COARSE_SAMPLES = 12
_GOLDEN = (math.sqrt(5.0) - 1.0) / 2.0


def _worst_trapped(solution: Solution, parts: list[str], refine: bool = True,
                   samples: Samples | None = None
                   ) -> dict[str, tuple[float, float]]:
    """Greatest uplift of each part with trapped pockets over the range of
    levels: samples (solved here, or ``samples`` given: see
    :func:`worst_uplifts_for`), then (``refine``) golden-section search
    around the best."""
    section = solution.section
    tree = section.pocket_tree
    lo, hi = _law_range(solution)
    if not hi > lo:
        downs = _part_downs_at(solution, lo, True)
        return {name: (lo, max(-downs[name], 0.0)) for name in parts}
    lips = [float(z) for k, z in enumerate(tree.level.tolist())
            if tree.children[k] and lo < z < hi]
    if samples is not None and all(name in samples[1] for name in parts):
        given = np.asarray(samples[0], dtype=np.float64)
        inside = (given >= lo) & (given <= hi)
        rows = [{name: float(samples[1][name][k]) for name in parts}
                for k in np.flatnonzero(inside)]
        levels = np.concatenate([given[inside], lips])
        table = rows + [_part_downs_at(solution, h, True) for h in lips]
        order = np.argsort(levels, kind="stable")
        levels, table = levels[order], [table[k] for k in order]
    else:
        n = _TRAPPED_SAMPLES if refine else _COARSE_SAMPLES
        levels = np.unique(np.concatenate([np.linspace(lo, hi, n), lips]))
        table = [_part_downs_at(solution, float(h), True) for h in levels]
    if not levels.size:
        downs = _part_downs_at(solution, hi, True)
        return {name: (hi, max(-downs[name], 0.0)) for name in parts}
    out = {}
    for name in parts:
        up = np.array([max(-row[name], 0.0) for row in table])
        k = int(np.argmax(up))
        if not refine:
            out[name] = (float(levels[k]), float(up[k]))
            continue
        a = float(levels[max(k - 1, 0)])
        b = float(levels[min(k + 1, levels.size - 1)])
        best_h, best_u = float(levels[k]), float(up[k])

        def uplift(h: float, name: str = name) -> float:
            return max(-_part_downs_at(solution, h, True)[name], 0.0)

        c, d = b - _GOLDEN * (b - a), a + _GOLDEN * (b - a)
        fc, fd = uplift(c), uplift(d)
        while b - a > 1e-9 * (hi - lo):
            if fc >= fd:
                b, d, fd = d, c, fc
                c = b - _GOLDEN * (b - a)
                fc = uplift(c)
            else:
                a, c, fc = c, d, fd
                d = a + _GOLDEN * (b - a)
                fd = uplift(d)
        for h, u in ((c, fc), (d, fd)):
            if u > best_u:
                best_h, best_u = h, u
        out[name] = (best_h, best_u)
    return out


def uplift_check(case: Case, resistances: Mapping[str, PartResistance],
                 required_factor: float = DEFAULT_REQUIRED_FACTOR,
                 solution: Solution | None = None,
                 worst: Mapping[str, tuple[Any, ...]] | None = None) -> list[UpliftResult]:
    """Check every part that has a resistance entered.

    Parameters
    ----------
    case : wetline.core.case.Case
    resistances : mapping of str to PartResistance
        Per part name; parts not in the section are ignored.
    required_factor : float
        Required factor against uplift [], > 0.
    solution : wetline.core.hydrostatics.Solution, optional
        The case's solution at its current level, if already computed; its
        pressure law (layers, gas) and pocket assumption are the check's
        (default: the case's one liquid, pockets vented).
    worst : mapping, optional
        :func:`worst_uplifts` (``(level, uplift)``) or
        :func:`worst_uplifts_for` (``(level, uplift, pockets)``) of the
        case's section and liquid, if already computed (it does not change
        with the level).

    Returns
    -------
    list of UpliftResult
        In the section's part order. Each states the pocket assumption it
        used now and at its worst level; with trapped pockets the worst
        level search covers both assumptions.
    """
    required_factor = float(required_factor)
    if not (math.isfinite(required_factor) and required_factor > 0):
        raise ValueError(f"required factor must be positive, not {required_factor:g}")
    sol = case.solve() if solution is None else solution
    section = case.section
    scale = 1.0 if section.is_axisymmetric else section.width
    checked = [name for name in section.loaded_part_names if name in resistances]
    found: Mapping[str, tuple[Any, ...]]
    if worst is not None:
        found = worst
    elif solution is None or (_is_one_liquid(sol) and sol.pocket_mode == "vented"):
        found = worst_uplifts(section, checked, sol.density, sol.gravity)
    else:
        found = worst_uplifts_for(sol, checked)
    out = []
    for name in checked:
        resistance = resistances[name].total * scale
        uplift = max(-sol.parts[name].down, 0.0)
        wl, wu = float(found[name][0]), float(found[name][1])
        mode = str(found[name][2]) if len(found[name]) > 2 else "vented"
        if uplift > wu:  # a standpipe head above the roof of a closed section
            wl, wu, mode = sol.level, uplift, sol.pocket_mode
        out.append(UpliftResult(part=name, resistance=resistance,
                                required_factor=required_factor, uplift=uplift,
                                factor=_ratio(resistance, uplift), worst_level=wl,
                                worst_uplift=wu, worst_factor=_ratio(resistance, wu),
                                pockets=sol.pocket_mode, worst_pockets=mode))
    return out
