"""Load cases: the named design situations of one section file, and their envelope.

A section file (format version 3) may list ``cases``: design situations
that each start from the file-level liquid, fill and gravity and override
what they name (a fill ``"spill"`` or ``"empty"``, another liquid, a
groundwater level, a load factor). Without ``cases`` the file holds one
case, named after the file's ``name``, made of the file-level fluid and
fill.

- :class:`LoadCase` holds one case's overrides, as the file gives them.
- :class:`Design` holds the whole file's situations: the file-level
  :class:`~wetline.core.case.Case`, the optional
  :class:`~wetline.core.structure.Structure` and
  :class:`~wetline.core.structure.Ground`, and the load cases. It checks
  them all on construction (unique names, a spill fill only on an open
  section, groundwater only with a structure and not above an open
  section's spill level ...), and resolves and solves each case.
- :func:`envelope` takes the solved cases and gives, in design values
  (characteristic x the case's ``load_factor``), the largest downward load
  and uplift of every loaded part, the largest pressure on every cavity
  edge, the lowest flotation factor and the governing net upward pressure
  on the base slab, each with the case that governs it.
- :func:`case_record`, :func:`envelope_record` and :func:`cases_record`
  give the records of ``wetline cases FILE --json``
  (``{"format": "wetline-cases", "version": 1, "cases": [...],
  "envelope": {...}}``).

Design values: the ``load_factor`` of a case is the partial factor that
turns its characteristic liquid and groundwater loads into design values
(the governing code sets it). Self-weight, soil and anchorage are not
factored by it: the flotation factor in design values is
``R / (load_factor * U)``, checked against the required factor (which
stands for the factors on the stabilising side, EN 1997-1 UPL).
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass, field, replace

import numpy as np

from .case import Case
from .hydrostatics import Solution, solve
from .limits import COORDINATE_LIMIT, GRAVITY_RANGE
from .liquids import Liquid
from .section import Section
from .structure import (
    ExteriorGeometry,
    Ground,
    Groundwater,
    Structure,
    StructureLoads,
    exterior_geometry,
    exterior_loads,
    structure_record,
)

__all__ = [
    "EMPTY",
    "FILL_WORDS",
    "MAX_LOAD_FACTOR",
    "SPILL",
    "BaseEnvelope",
    "Design",
    "Envelope",
    "FlotationEnvelope",
    "LoadCase",
    "LoadCaseError",
    "PartEnvelope",
    "ResolvedCase",
    "SolvedCase",
    "case_record",
    "cases_record",
    "envelope",
    "envelope_record",
]

SPILL = "spill"
"""Fill level word: the spill level of an open section."""
EMPTY = "empty"
"""Fill level word: no liquid."""
FILL_WORDS = (SPILL, EMPTY)

MAX_LOAD_FACTOR = 100.0
"""Largest load factor accepted [] (decided for Wetline: codes use about
1.0 to 1.5; anything near 100 is a slip of the keyboard)."""

CASES_FORMAT = "wetline-cases"
CASES_VERSION = 1


class LoadCaseError(ValueError):
    """A load case, or a set of them, that cannot be used.

    Attributes
    ----------
    case : str or None
        Name of the case at fault (None for the whole set).
    """

    def __init__(self, message, *, case=None):
        super().__init__(message)
        self.case = case


def _float(value, what, case):
    if isinstance(value, bool) or not isinstance(value, (int, float, np.integer, np.floating)):
        raise LoadCaseError(f"{_where(case)}{what} must be a number, not "
                            f"{type(value).__name__}", case=case)
    v = float(value)
    if not math.isfinite(v):
        raise LoadCaseError(f"{_where(case)}{what} must be a finite number, not {v}", case=case)
    return v


def _where(case):
    return "" if case is None else f"case {case!r}: "


@dataclass(frozen=True)
class LoadCase:
    """One named design situation: what it changes from the file level.

    Every field but ``name`` left at None keeps the file-level value.

    Parameters
    ----------
    name : str
        Required, non-empty, unique in the file.
    liquid : Liquid, optional
        Another liquid than the file's ``fluid``.
    fill_level : float or str, optional
        Free-surface height [m], or ``"spill"`` (the spill level; open
        sections only) or ``"empty"`` (no liquid). At most one of
        ``fill_level`` and ``fill_volume``; either replaces the file's fill.
    fill_volume : float, optional
        Liquid volume [m3] (area x width for plane sections), >= 0.
    gravity : float, optional
        [m/s2], within :data:`wetline.core.limits.GRAVITY_RANGE`.
    groundwater : Groundwater, optional
        Water outside the structure in this case (needs a structure).
        None: dry ground. (Groundwater is given per case only.)
    load_factor : float
        Partial factor turning this case's characteristic liquid and
        groundwater loads into design values [], > 0, at most
        :data:`MAX_LOAD_FACTOR`; default 1.0.

    Notes
    -----
    Extension point: layers of immiscible liquids, gas pressure over the
    surface, trapped pockets and the atmospheric pressure (section format
    version 3, a later issue) become further fields here, defaulting to one
    liquid, no gas, vented pockets and 101325 Pa. :meth:`Design.resolve`
    carries them into :class:`ResolvedCase`, and :meth:`ResolvedCase.solve`
    is the one place that turns a case into a solution.

    Examples
    --------
    >>> LoadCase("overflow", fill_level="spill").fill_level
    'spill'
    """

    name: str
    liquid: Liquid | None = None
    fill_level: float | str | None = None
    fill_volume: float | None = None
    gravity: float | None = None
    groundwater: Groundwater | None = None
    load_factor: float = 1.0

    def __post_init__(self):
        if not isinstance(self.name, str) or not self.name.strip():
            raise LoadCaseError("a load case needs a name (non-empty text)")
        name = self.name
        if self.liquid is not None and not isinstance(self.liquid, Liquid):
            raise LoadCaseError(f"case {name!r}: liquid must be a Liquid", case=name)
        if self.fill_level is not None and self.fill_volume is not None:
            raise LoadCaseError(f"case {name!r}: a fill gives one of level and volume, not both",
                                case=name)
        lvl = self.fill_level
        if isinstance(lvl, str):
            if lvl not in FILL_WORDS:
                raise LoadCaseError(
                    f"case {name!r}: fill level must be a number, 'spill' or 'empty', "
                    f"not {lvl!r}", case=name)
        elif lvl is not None:
            lvl = _float(lvl, "fill level", name)
            if abs(lvl) > COORDINATE_LIMIT:
                raise LoadCaseError(f"case {name!r}: fill level {lvl:g} m lies beyond "
                                    f"{COORDINATE_LIMIT:g} m", case=name)
            object.__setattr__(self, "fill_level", lvl)
        if self.fill_volume is not None:
            v = _float(self.fill_volume, "fill volume", name)
            if v < 0:
                raise LoadCaseError(f"case {name!r}: fill volume must be >= 0, not {v:g}",
                                    case=name)
            object.__setattr__(self, "fill_volume", v)
        if self.gravity is not None:
            g = _float(self.gravity, "gravity", name)
            lo, hi = GRAVITY_RANGE
            if not lo <= g <= hi:
                raise LoadCaseError(f"case {name!r}: gravity must be between {lo:g} and "
                                    f"{hi:g} m/s2, not {g:g}", case=name)
            object.__setattr__(self, "gravity", g)
        if self.groundwater is not None and not isinstance(self.groundwater, Groundwater):
            raise LoadCaseError(f"case {name!r}: groundwater must be a Groundwater", case=name)
        f = _float(self.load_factor, "load factor", name)
        if not 0 < f <= MAX_LOAD_FACTOR:
            raise LoadCaseError(f"case {name!r}: load factor must be > 0 and at most "
                                f"{MAX_LOAD_FACTOR:g}, not {f:g}", case=name)
        object.__setattr__(self, "load_factor", f)

    @property
    def is_plain(self) -> bool:
        """True if the case changes nothing but may have a name (the file-level situation)."""
        return (self.liquid is None and self.fill_level is None and self.fill_volume is None
                and self.gravity is None and self.groundwater is None
                and self.load_factor == 1.0)


@dataclass(frozen=True, eq=False)
class ResolvedCase:
    """A load case made concrete: everything a solve needs.

    Attributes
    ----------
    name : str
    index : int
        Position in the design's cases (0-based).
    case : Case
        The section with this case's liquid, gravity and fill as numbers
        (a ``"spill"`` fill as the spill level, ``"empty"`` as the lowest
        point), for :func:`wetline.core.results.results_record`.
    level : float
        The requested level [m] (from the volume, for a fill by volume).
    fill : str or None
        ``"spill"`` or ``"empty"`` where the case said so, else None.
    groundwater : Groundwater or None
    load_factor : float
    """

    name: str
    index: int
    case: Case
    level: float
    fill: str | None
    groundwater: Groundwater | None
    load_factor: float

    def solve(self) -> Solution:
        """The liquid's loads in this case (:class:`~wetline.core.hydrostatics.Solution`).

        An ``"empty"`` case carries no "section is empty" warning: it asked
        for that.
        """
        c = self.case
        sol = solve(c.section, self.level, c.liquid.density, c.gravity)
        if self.fill == EMPTY and sol.warnings:
            sol = replace(sol, warnings=tuple(w for w in sol.warnings if "is empty" not in w))
        return sol


@dataclass(frozen=True, eq=False)
class SolvedCase:
    """One case's results.

    Attributes
    ----------
    resolved : ResolvedCase
    solution : wetline.core.hydrostatics.Solution
        The liquid in the cavity (characteristic).
    structure : wetline.core.structure.StructureLoads or None
        Loads from outside (characteristic); None without a structure.
    """

    resolved: ResolvedCase
    solution: Solution
    structure: StructureLoads | None

    @property
    def name(self) -> str:
        return self.resolved.name

    @property
    def load_factor(self) -> float:
        return self.resolved.load_factor

    @property
    def warnings(self) -> tuple[str, ...]:
        """The liquid's warnings, then the structure's (tuple of str)."""
        extra = () if self.structure is None else self.structure.warnings
        return tuple(self.solution.warnings) + tuple(extra)


@dataclass(frozen=True, eq=False)
class Design:
    """All design situations of one section file, checked on construction.

    Parameters
    ----------
    case : Case
        The file-level section, liquid, gravity, fill, required uplift
        factor (also the required flotation factor) and report fields.
    structure : Structure, optional
        The structure around the cavity.
    ground : Ground, optional
        The ground around it (needs a structure).
    cases : tuple of LoadCase
        The file's cases, in file order; empty: one case named after the
        section (``"case 1"`` if it has no name) with the file-level values.

    Raises
    ------
    LoadCaseError
        Naming the case at fault: duplicate names, ``"spill"`` on a closed
        section, a volume the section cannot hold, groundwater without a
        structure or above an open section's spill level, ground without a
        structure, saturated soil lighter than the groundwater.
    StructureError
        If the structure does not hold the cavity.

    Examples
    --------
    >>> from wetline.core.liquids import custom_liquid
    >>> from wetline.core.section import Section
    >>> s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]],
    ...                   parts=["floor", "wall", "open", "wall"], name="tank")
    >>> d = Design(Case(s, custom_liquid(1000.0), fill_level=2.0),
    ...            cases=(LoadCase("normal"), LoadCase("overflow", fill_level="spill",
    ...                                                load_factor=1.2)))
    >>> env = envelope(d.solve_all())
    >>> env.parts["floor"].max_down_case, round(env.parts["floor"].max_down, 3)
    ('overflow', 70607.88)
    """

    case: Case
    structure: Structure | None = None
    ground: Ground | None = None
    cases: tuple[LoadCase, ...] = ()
    _resolved: tuple[ResolvedCase, ...] = field(init=False, repr=False, default=())
    _exterior: ExteriorGeometry | None = field(init=False, repr=False, default=None)

    def __post_init__(self):
        if not isinstance(self.case, Case):
            raise TypeError("case must be a Case")
        cases = tuple(self.cases)
        object.__setattr__(self, "cases", cases)
        for c in cases:
            if not isinstance(c, LoadCase):
                raise TypeError("cases must be LoadCase values")
        if self.structure is not None and not isinstance(self.structure, Structure):
            raise TypeError("structure must be a Structure")
        if self.ground is not None:
            if not isinstance(self.ground, Ground):
                raise TypeError("ground must be a Ground")
            if self.structure is None:
                raise LoadCaseError("ground needs a structure: soil stands on the structure's "
                                    "ledges")
        seen = set()
        for c in cases:
            if c.name in seen:
                raise LoadCaseError(f"two load cases are named {c.name!r}; names must be unique",
                                    case=c.name)
            seen.add(c.name)
        section = self.case.section
        if self.structure is not None:
            object.__setattr__(self, "_exterior", exterior_geometry(self.structure, section))
        resolved = tuple(self._resolve(c, i) for i, c in enumerate(self.load_cases))
        object.__setattr__(self, "_resolved", resolved)

    # ------------------------------------------------------------ access
    @property
    def section(self) -> Section:
        return self.case.section

    @property
    def load_cases(self) -> tuple[LoadCase, ...]:
        """The cases to solve: the file's, or the one default case (tuple of LoadCase)."""
        if self.cases:
            return self.cases
        return (LoadCase(self.section.name.strip() or "case 1"),)

    @property
    def names(self) -> tuple[str, ...]:
        """Case names in order (tuple of str)."""
        return tuple(r.name for r in self._resolved)

    @property
    def required_factor(self) -> float:
        """Required factor against flotation [] (the file's ``uplift.required_factor``)."""
        return self.case.required_uplift_factor

    @property
    def exterior(self) -> ExteriorGeometry | None:
        """The structure's :class:`~wetline.core.structure.ExteriorGeometry`, or None."""
        return self._exterior

    def index(self, name: str) -> int:
        """Position of the case called ``name``; LoadCaseError if there is none."""
        for i, r in enumerate(self._resolved):
            if r.name == name:
                return i
        listed = ", ".join(repr(n) for n in self.names)
        raise LoadCaseError(f"no load case named {name!r} (cases: {listed})", case=name)

    def resolve(self, name: str | None = None) -> ResolvedCase:
        """The :class:`ResolvedCase` called ``name`` (default: the first)."""
        return self._resolved[0 if name is None else self.index(name)]

    def solve(self, name: str | None = None) -> SolvedCase:
        """The :class:`SolvedCase` called ``name`` (default: the first)."""
        return self._solve(self.resolve(name), {}, {})

    def solve_all(self) -> tuple[SolvedCase, ...]:
        """Every case solved, in order (tuple of :class:`SolvedCase`).

        Cases with the same liquid situation (level, density, gravity: every
        ``"empty"`` case, say) share one solution, and cases with the same
        groundwater share its loads on the structure; all are immutable.
        """
        liquids: dict = {}
        outside: dict = {}
        return tuple(self._solve(r, liquids, outside) for r in self._resolved)

    # ------------------------------------------------------------ copies
    def with_case(self, case: Case) -> Design:
        """Copy with another file-level case (checked again)."""
        return replace(self, case=case)

    def with_structure(self, structure: Structure | None,
                       ground: Ground | None = None) -> Design:
        """Copy with another structure (None removes it and the ground)."""
        return replace(self, structure=structure,
                       ground=None if structure is None else (ground or self.ground))

    def with_ground(self, ground: Ground | None) -> Design:
        return replace(self, ground=ground)

    def with_cases(self, cases: Iterable[LoadCase]) -> Design:
        return replace(self, cases=tuple(cases))

    # ------------------------------------------------------------ internals
    def _resolve(self, lc, index):
        base = self.case
        section = base.section
        name = lc.name
        fill = None
        level = volume = None
        if lc.fill_level == SPILL:
            if not section.is_open:
                raise LoadCaseError(f"case {name!r}: fill level 'spill' needs an open section "
                                    "(one with an 'open' edge)", case=name)
            fill, level = SPILL, section.spill_level
        elif lc.fill_level == EMPTY:
            fill, level = EMPTY, section.z_min
        elif lc.fill_level is not None:
            level = lc.fill_level
        elif lc.fill_volume is not None:
            volume = lc.fill_volume
        else:
            level, volume = base.fill_level, base.fill_volume
        try:
            case = replace(base, liquid=base.liquid if lc.liquid is None else lc.liquid,
                           gravity=base.gravity if lc.gravity is None else lc.gravity,
                           fill_level=level, fill_volume=volume)
            requested = case.level
        except ValueError as e:
            raise LoadCaseError(f"case {name!r}: {e}", case=name) from None
        gw = lc.groundwater
        if gw is not None:
            if self.structure is None:
                raise LoadCaseError(f"case {name!r}: groundwater needs a structure (the "
                                    "structure's outline is what the water acts on)", case=name)
            if section.is_open and gw.level > section.spill_level:
                raise LoadCaseError(
                    f"case {name!r}: groundwater level {gw.level:.6g} m is above the spill "
                    f"level {section.spill_level:.6g} m of the open section: the water would "
                    "flood the cavity", case=name)
            if self.ground is not None:
                rw = gw.unit_weight(case.gravity)
                if self.ground.unit_weight_saturated < rw:
                    raise LoadCaseError(
                        f"case {name!r}: saturated soil unit weight "
                        f"{self.ground.unit_weight_saturated:g} N/m3 is less than the "
                        f"groundwater's {rw:.6g} N/m3 (rho_w g): the soil would float",
                        case=name)
        return ResolvedCase(name=name, index=index, case=case, level=float(requested),
                            fill=fill, groundwater=gw, load_factor=lc.load_factor)

    def _solve(self, r, liquids, outside):
        key = (r.level, r.case.liquid.density, r.case.gravity, r.fill == EMPTY)
        sol = liquids.get(key)
        if sol is None:
            sol = liquids[key] = r.solve()
        loads = None
        if self.structure is not None:
            loads = exterior_loads(self.structure, self.section, groundwater=r.groundwater,
                                   ground=self.ground, liquid_solution=sol,
                                   required_factor=self.required_factor,
                                   geometry=self._exterior, cache=outside)
        return SolvedCase(resolved=r, solution=sol, structure=loads)


# ------------------------------------------------------------------ envelope
@dataclass(frozen=True)
class PartEnvelope:
    """Extremes of one loaded part over the cases, design values [N].

    Attributes
    ----------
    max_down : float
        Largest downward load, >= 0 (0 if never pressed down).
    max_down_case : str or None
        The case giving it (None if never pressed down).
    max_up : float
        Largest uplift as a positive number, >= 0 (0 if never lifted).
    max_up_case : str or None
    """

    max_down: float
    max_down_case: str | None
    max_up: float
    max_up_case: str | None


@dataclass(frozen=True)
class FlotationEnvelope:
    """Lowest flotation factor over the cases, in design values.

    Attributes
    ----------
    factor : float or None
        min over the cases of R / (load_factor x U) []; None if no case
        lifts the structure.
    case : str or None
    required : float
    """

    factor: float | None
    case: str | None
    required: float

    @property
    def ok(self) -> bool:
        return self.factor is None or self.factor >= self.required


@dataclass(frozen=True)
class BaseEnvelope:
    """Governing net upward pressure on the base slab, design value.

    Attributes
    ----------
    net_upward_pressure : float
        Largest load_factor x (p_groundwater - p_liquid) over the floor
        edges and cases [Pa], >= 0 (0 if the base is never lifted).
    case : str or None
    index : int or None
        The cavity floor edge where it governs.
    point : tuple of float or None
        ``(x, z)`` on that floor edge [m].
    """

    net_upward_pressure: float
    case: str | None
    index: int | None
    point: tuple | None


@dataclass(frozen=True, eq=False)
class Envelope:
    """Design values over all cases, each with its governing case.

    Attributes
    ----------
    case_names : tuple of str
    parts : dict of str to PartEnvelope
        Every loaded part of the cavity (``open`` and ``axis`` left out).
    edge_max_pressure : numpy.ndarray
        (N,) largest design pressure on each cavity edge [Pa].
    edge_case : numpy.ndarray
        (N,) index into ``case_names`` of the case giving it, -1 where the
        edge is dry in every case.
    flotation : FlotationEnvelope or None
        None without a structure.
    base : BaseEnvelope or None
        None without a structure or without floor edges over the base.
    """

    case_names: tuple
    parts: dict
    edge_max_pressure: np.ndarray
    edge_case: np.ndarray
    flotation: FlotationEnvelope | None
    base: BaseEnvelope | None

    def edge(self, index: int) -> tuple[float, str | None]:
        """``(max_pressure [Pa], case name or None)`` of cavity edge ``index``."""
        k = int(self.edge_case[index])
        return float(self.edge_max_pressure[index]), (None if k < 0 else self.case_names[k])


def envelope(solved: Iterable[SolvedCase]) -> Envelope:
    """The envelope of solved cases (see :class:`Envelope`).

    Parameters
    ----------
    solved : sequence of SolvedCase
        Cases of one design (one section), e.g. :meth:`Design.solve_all`.

    Returns
    -------
    Envelope

    Notes
    -----
    Every value is a design value, ``load_factor x`` the characteristic
    one, and the governing case is the first in order among equal values.
    An edge's largest pressure is at one of its ends (pressure is linear
    along a straight edge). The flotation factor in design values is
    ``R / (load_factor x U)``: the resistance (self-weight, soil, anchorage)
    is not a liquid or groundwater load and is not factored.
    """
    solved = tuple(solved)
    if not solved:
        raise ValueError("the envelope needs at least one solved case")
    names = tuple(s.name for s in solved)
    section = solved[0].solution.section
    n = section.n_edges
    for s in solved:
        if s.solution.section is not section and s.solution.section != section:
            raise ValueError("the envelope's cases must be of one section")
    gamma = np.array([s.load_factor for s in solved])
    # Edges: (C, N) design pressures.
    p = np.empty((len(solved), n))
    for k, s in enumerate(solved):
        np.maximum(s.solution.p_start, s.solution.p_end, out=p[k])
    p *= gamma[:, None]
    best = np.argmax(p, axis=0)
    edge_max = p[best, np.arange(n)]
    edge_case = np.where(edge_max > 0, best, -1)
    # Parts: design downward loads, (C, P).
    part_names = section.loaded_part_names
    down = np.array([[s.solution.parts[name].down for name in part_names] for s in solved])
    down = down.reshape(len(solved), len(part_names)) * gamma[:, None]
    parts = {}
    for j, name in enumerate(part_names):
        col = down[:, j]
        kd, ku = int(np.argmax(col)), int(np.argmin(col))
        dmax, umax = float(col[kd]), float(-col[ku])
        parts[name] = PartEnvelope(
            max_down=dmax if dmax > 0 else 0.0, max_down_case=names[kd] if dmax > 0 else None,
            max_up=umax if umax > 0 else 0.0, max_up_case=names[ku] if umax > 0 else None)
    flotation: FlotationEnvelope | None = None
    base: BaseEnvelope | None = None
    outside = [(s.name, s.load_factor, s.structure) for s in solved if s.structure is not None]
    if outside:
        fl_factor: float | None = None
        fl_case: str | None = None
        for name, lf, loads in outside:
            f = loads.flotation
            if f.uplift > 0:
                value = f.resistance / (lf * f.uplift)
                if fl_factor is None or value < fl_factor:
                    fl_factor, fl_case = value, name
        flotation = FlotationEnvelope(factor=fl_factor, case=fl_case,
                                      required=outside[0][2].flotation.required)
        if any(len(loads._base_inputs[0].floor_edges) for _, _, loads in outside):
            b_val, b_case, b_pick = 0.0, None, None
            for name, lf, loads in outside:
                if not loads.base_can_lift:  # its largest net is <= 0: never governs
                    continue
                top = loads.base_net_max
                if top is not None and lf * top.net > b_val:
                    b_val, b_case, b_pick = lf * top.net, name, top
            base = BaseEnvelope(net_upward_pressure=b_val, case=b_case,
                                index=None if b_pick is None else b_pick.index,
                                point=None if b_pick is None else b_pick.point)
    edge_max.setflags(write=False)
    edge_case.setflags(write=False)
    return Envelope(case_names=names, parts=parts, edge_max_pressure=edge_max,
                    edge_case=edge_case, flotation=flotation, base=base)


# ------------------------------------------------------------------ records
def _num(v):
    if v is None:
        return None
    v = float(v)
    return None if math.isnan(v) else v + 0.0


def envelope_record(env: Envelope) -> dict:
    """The ``envelope`` object of ``wetline cases --json`` (section format v3).

    Parameters
    ----------
    env : Envelope

    Returns
    -------
    dict
        ``parts``: part -> ``{"max_down", "max_down_case", "max_up",
        "max_up_case"}``; ``edges``: per cavity edge ``{"index",
        "max_pressure", "case"}``; ``flotation``: ``{"factor", "case"}``
        (both null when no case has an uplift) with, added, ``"required"``
        and ``"ok"``, or null without a structure; added: ``base``:
        ``{"index", "net_upward_pressure", "case", "point"}`` (index, case and
        point null when the base is never lifted), or null without a
        structure or floor. Design values, SI (N, Pa).
    """
    names = env.case_names
    edges = [{"index": i, "max_pressure": _num(env.edge_max_pressure[i]),
              "case": None if k < 0 else names[k]}
             for i, k in enumerate(env.edge_case.tolist())]
    fl = env.flotation
    b = env.base
    return {
        "parts": {name: {"max_down": _num(p.max_down), "max_down_case": p.max_down_case,
                         "max_up": _num(p.max_up), "max_up_case": p.max_up_case}
                  for name, p in env.parts.items()},
        "edges": edges,
        "flotation": None if fl is None else {"factor": _num(fl.factor), "case": fl.case,
                                              "required": _num(fl.required), "ok": fl.ok},
        "base": None if b is None else {
            "index": b.index, "net_upward_pressure": _num(b.net_upward_pressure),
            "case": b.case,
            "point": None if b.point is None else [_num(b.point[0]), _num(b.point[1])]},
    }


def case_record(solved: SolvedCase) -> dict:
    """The record of one solved case: the results record of
    :func:`wetline.core.results.results_record` plus ``case``,
    ``load_factor`` and ``structure`` (the object of
    :func:`wetline.core.structure.structure_record`, or null)."""
    from .results import results_record

    rec = results_record(solved.resolved.case, solved.solution)
    rec["case"] = solved.name
    rec["load_factor"] = _num(solved.load_factor)
    if solved.structure is not None:
        rec["warnings"] = list(rec["warnings"]) + list(solved.structure.warnings)
    rec["structure"] = None if solved.structure is None else structure_record(solved.structure)
    return rec


def cases_record(design: Design, solved: Iterable[SolvedCase] | None = None) -> dict:
    """The whole record of ``wetline cases FILE --json``.

    Parameters
    ----------
    design : Design
    solved : sequence of SolvedCase, optional
        ``design.solve_all()`` if already computed.

    Returns
    -------
    dict
        ``{"format": "wetline-cases", "version": 1, "cases": [record, ...],
        "envelope": {...}}`` (see :func:`case_record`, :func:`envelope_record`).
    """
    solved = design.solve_all() if solved is None else tuple(solved)
    return {"format": CASES_FORMAT, "version": CASES_VERSION,
            "cases": [case_record(s) for s in solved],
            "envelope": envelope_record(envelope(solved))}
