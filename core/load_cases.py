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
from .fill import FillError, level_for_volume, volume_below
from .hydrostatics import POCKET_MODES, TRAPPED, VENTED, Solution, resolve_level, solve, solve_law
from .level_table import DEFAULT_STEPS, LevelTable, law_level_table, level_table
from .limits import COORDINATE_LIMIT, GRAVITY_RANGE, PRESSURE_LIMIT
from .liquids import Liquid
from .pockets import STANDARD_ATMOSPHERE, PocketError, level_for_liquid_volume, trap_air
from .pressure_law import ABSOLUTE_ZERO_GAUGE, Layer, PressureLaw, PressureLawError, layer_tops
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
from .uplift import UpliftResult, uplift_check

__all__ = [
    "CaseView",
    "EMPTY",
    "FILL_WORDS",
    "MAX_LOAD_FACTOR",
    "SPILL",
    "BaseEnvelope",
    "Design",
    "Envelope",
    "FlotationEnvelope",
    "LiquidLayer",
    "LoadCase",
    "LoadCaseError",
    "PartEnvelope",
    "POCKET_MODES",
    "ResolvedCase",
    "TRAPPED",
    "VENTED",
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


def _layer_label(index: int, liquid: Liquid) -> str:
    """``layer 2 'fat'``: 1-based from the bottom, as the pressure law names layers."""
    return Layer(1.0, 0.0, liquid.name).label(index)


@dataclass(frozen=True)
class LiquidLayer:
    """One immiscible liquid of a layered load case, as the file gives it.

    Parameters
    ----------
    liquid : Liquid
    top : float, optional
        Level of the layer's upper interface [m].
    volume : float, optional
        The layer's own liquid volume [m3] (area x width for plane
        sections), >= 0; its interface is solved exactly (as a fill by
        volume, pockets vented).

    Every layer of a case but the top one gives exactly one of ``top`` and
    ``volume``; the top layer gives neither (its top is the case's fill).

    Examples
    --------
    >>> from wetline.core.liquids import custom_liquid
    >>> LiquidLayer(custom_liquid(1010.0, "sewage"), top=2.9).top
    2.9
    """

    liquid: Liquid
    top: float | None = None
    volume: float | None = None

    def __post_init__(self):
        if not isinstance(self.liquid, Liquid):
            raise LoadCaseError("a layer's liquid must be a Liquid")
        if self.top is not None and self.volume is not None:
            raise LoadCaseError("a layer gives one of top and volume, not both")
        if self.top is not None:
            top = _float(self.top, "layer top", None)
            if abs(top) > COORDINATE_LIMIT:
                raise LoadCaseError(f"layer top {top:g} m lies beyond {COORDINATE_LIMIT:g} m")
            object.__setattr__(self, "top", top)
        if self.volume is not None:
            v = _float(self.volume, "layer volume", None)
            if v < 0:
                raise LoadCaseError(f"layer volume must be >= 0, not {v:g}")
            object.__setattr__(self, "volume", v)

    @property
    def bound(self) -> tuple[str, float] | None:
        """``("top", z)`` or ``("volume", v)``, None for the top layer."""
        if self.top is not None:
            return ("top", self.top)
        if self.volume is not None:
            return ("volume", self.volume)
        return None


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
    layers : tuple of LiquidLayer, optional
        Immiscible liquids bottom up, instead of ``liquid``: every layer but
        the top one gives its top or its volume; the top layer's top is the
        case's fill level (or the fill volume is all the liquid). Densities
        must not increase upward; tops given as levels must rise.
    gas_pressure : float
        Gauge pressure of a gas over the free surface [Pa], default 0;
        closed sections only, at least -101325 (a full vacuum).
    pockets : str
        ``"vented"`` (default: every pool below the level stands at the
        level) or ``"trapped"`` (air caught under ceilings is compressed,
        :func:`wetline.core.pockets.trap_air`).
    atmospheric_pressure : float
        [Pa] absolute, default 101325; used by trapped pockets.

    Notes
    -----
    :meth:`Design.resolve` carries everything into :class:`ResolvedCase`,
    and :meth:`ResolvedCase.solve` is the one place that turns a case into
    a solution.

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
    layers: tuple[LiquidLayer, ...] | None = None
    gas_pressure: float = 0.0
    pockets: str = VENTED
    atmospheric_pressure: float = STANDARD_ATMOSPHERE

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
        if self.layers is not None:
            object.__setattr__(self, "layers", self._checked_layers())
        p_gas = _float(self.gas_pressure, "gas pressure", name)
        if p_gas < ABSOLUTE_ZERO_GAUGE:
            raise LoadCaseError(f"case {name!r}: gas pressure {p_gas:g} Pa is below a full "
                                f"vacuum ({ABSOLUTE_ZERO_GAUGE:g} Pa gauge)", case=name)
        if p_gas > PRESSURE_LIMIT:
            raise LoadCaseError(f"case {name!r}: gas pressure {p_gas:g} Pa is above the limit "
                                f"of {PRESSURE_LIMIT:g} Pa", case=name)
        object.__setattr__(self, "gas_pressure", p_gas)
        if self.pockets not in POCKET_MODES:
            raise LoadCaseError(f"case {name!r}: pockets must be 'vented' or 'trapped', not "
                                f"{self.pockets!r}", case=name)
        p_atm = _float(self.atmospheric_pressure, "atmospheric pressure", name)
        if not 0 < p_atm <= PRESSURE_LIMIT:
            raise LoadCaseError(f"case {name!r}: atmospheric pressure must be a positive number "
                                f"of Pa up to {PRESSURE_LIMIT:g}, not {p_atm:g}", case=name)
        if p_atm + p_gas < 0:
            raise LoadCaseError(f"case {name!r}: gas pressure {p_gas:g} Pa gauge is below a "
                                f"full vacuum under an atmosphere of {p_atm:g} Pa", case=name)
        object.__setattr__(self, "atmospheric_pressure", p_atm)

    def _checked_layers(self):
        name = self.name
        if self.liquid is not None:
            raise LoadCaseError(f"case {name!r}: give a liquid or layers, not both", case=name)
        layers = tuple(self.layers)
        if not layers:
            raise LoadCaseError(f"case {name!r}: layers must hold at least one layer", case=name)
        if not all(isinstance(layer, LiquidLayer) for layer in layers):
            raise LoadCaseError(f"case {name!r}: layers must be LiquidLayer values", case=name)
        for i, layer in enumerate(layers):
            label = _layer_label(i, layer.liquid)
            if i == len(layers) - 1:
                if layer.bound is not None:
                    raise LoadCaseError(
                        f"case {name!r}: the top layer ({label}) reaches the case's fill "
                        f"level: give the fill (level or volume), not a {layer.bound[0]} of "
                        "the top layer", case=name)
            elif layer.bound is None:
                raise LoadCaseError(
                    f"case {name!r}: {label} needs a top (the level of its upper interface) "
                    "or a volume", case=name)
            if i:
                below = layers[i - 1]
                if layer.liquid.density > below.liquid.density:
                    raise LoadCaseError(
                        f"case {name!r}: {label} ({layer.liquid.density:g} kg/m3) lies on "
                        f"{_layer_label(i - 1, below.liquid)} ({below.liquid.density:g} "
                        "kg/m3), which is lighter: immiscible liquids settle densest at the "
                        "bottom", case=name)
                if layer.top is not None and below.top is not None and layer.top <= below.top:
                    raise LoadCaseError(
                        f"case {name!r}: {label} has its top at {layer.top:.6g} m, not above "
                        f"the top of {_layer_label(i - 1, below.liquid)} at {below.top:.6g} m: "
                        "layer tops must rise", case=name)
        return layers

    @property
    def is_plain(self) -> bool:
        """True if the case changes nothing but may have a name (the file-level situation)."""
        return (self.liquid is None and self.fill_level is None and self.fill_volume is None
                and self.gravity is None and self.groundwater is None
                and self.load_factor == 1.0 and self.layers is None
                and self.gas_pressure == 0.0 and self.pockets == VENTED
                and self.atmospheric_pressure == STANDARD_ATMOSPHERE)


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
    law : PressureLaw
        The pressure law at the level used (the request capped at the spill
        level of an open section): each layer's density and top, the gas
        pressure and gravity.
    liquids : tuple of Liquid
        The liquid of each layer, bottom up (one for a case of one liquid;
        the first is ``case.liquid``).
    pockets : str
        ``"vented"`` or ``"trapped"``.
    atmospheric_pressure : float
        [Pa] absolute.
    """

    name: str
    index: int
    case: Case
    level: float
    fill: str | None
    groundwater: Groundwater | None
    load_factor: float
    law: PressureLaw | None = None
    liquids: tuple[Liquid, ...] = ()
    pockets: str = VENTED
    atmospheric_pressure: float = STANDARD_ATMOSPHERE

    @property
    def gas_pressure(self) -> float:
        """Gauge pressure of the gas over the free surface [Pa]."""
        return 0.0 if self.law is None else self.law.gas_pressure

    @property
    def is_layered(self) -> bool:
        """True for more than one liquid layer."""
        return len(self.liquids) > 1

    @property
    def is_one_liquid(self) -> bool:
        """True for one liquid under no gas with vented pockets (the version 1 law)."""
        return (len(self.liquids) <= 1 and self.gas_pressure == 0.0
                and self.pockets == VENTED)

    @property
    def solution_key(self) -> tuple[object, ...]:
        """What this case's liquid solution depends on, beyond the section:
        the level, the bottom liquid's density, gravity, an ``"empty"``
        fill, the pressure law (densities, interfaces, gas), the pocket
        assumption and the atmosphere. Cases of one section with equal keys
        have the same solution (:meth:`Design.solve_all` and the document's
        solver share it)."""
        law = self.law
        return (self.level, self.case.liquid.density, self.case.gravity, self.fill == EMPTY,
                None if law is None else (law.densities, law.interfaces, law.gas_pressure),
                self.pockets, self.atmospheric_pressure)

    def solve(self) -> Solution:
        """The liquid's loads in this case (:class:`~wetline.core.hydrostatics.Solution`).

        One liquid under no gas with vented pockets is
        :func:`~wetline.core.hydrostatics.solve` (bit for bit as version 1);
        otherwise :func:`~wetline.core.hydrostatics.solve_law` with the
        case's layers and gas, and with trapped pockets the air of
        :func:`~wetline.core.pockets.trap_air` in place. An ``"empty"`` case
        carries no "section is empty" warning: it asked for that.
        """
        c = self.case
        if self.law is None or self.is_one_liquid:
            sol = solve(c.section, self.level, c.liquid.density, c.gravity)
        else:
            _, warnings = resolve_level(c.section, self.level)
            state = None
            if self.pockets == TRAPPED:
                state = trap_air(c.section.pocket_tree, self.law, self.atmospheric_pressure)
            sol = solve_law(c.section, self.law, requested_level=self.level, pockets=state,
                            warnings=warnings)
        if self.fill == EMPTY and sol.warnings:
            sol = replace(sol, warnings=tuple(w for w in sol.warnings if "is empty" not in w))
        return sol

    def as_case(self, note: str = "") -> CaseView:
        """This case as a :class:`CaseView` (a Case whose ``solve`` gives
        this case's solution); ``note`` is added to its warnings."""
        c = self.case
        return CaseView(section=c.section, liquid=c.liquid, gravity=c.gravity,
                        fill_level=c.fill_level, fill_volume=c.fill_volume,
                        length_unit=c.length_unit, resistances=c.resistances,
                        required_uplift_factor=c.required_uplift_factor, report=c.report,
                        resolved=self, note=note)

    def uplift(self, solution: Solution | None = None) -> list[UpliftResult]:
        """The uplift check of the parts with a resistance entered (the
        file's ``uplift``), under this case's pressure law; with trapped
        pockets the worst level search covers both assumptions (list of
        :class:`~wetline.core.uplift.UpliftResult`)."""
        c = self.case
        sol = self.solve() if solution is None else solution
        return uplift_check(c, c.resistance_map, c.required_uplift_factor, sol)

    def level_tables(self, steps: int = DEFAULT_STEPS) -> tuple[LevelTable, ...]:
        """Loads against level for the chart, from just above the top
        interface (the lowest point) to the top level: pockets vented, then,
        where the section can trap air, trapped too (both assumptions, so the
        governing one shows). Tuple of
        :class:`~wetline.core.level_table.LevelTable`, each naming its
        ``pockets``."""
        c = self.case
        section = c.section
        if self.law is None or (len(self.liquids) <= 1 and self.gas_pressure == 0.0):
            tables = [level_table(section, c.liquid.density, c.gravity, steps)]
        else:
            tables = [law_level_table(section, self.law, steps)]
        if section.pocket_tree.may_trap and self.law is not None:
            tables.append(law_level_table(section, self.law, steps, pockets=TRAPPED,
                                          atmospheric_pressure=self.atmospheric_pressure))
        return tuple(tables)

    def solve_at(self, level: float, pockets: str | None = None) -> Solution:
        """This case's liquid at another level [m] (the layers below the
        top one where they are), with its own pocket assumption or
        ``pockets`` (``"vented"`` or ``"trapped"``); the level is capped at
        the spill level of an open section and must stand above the top
        interface."""
        c = self.case
        mode = self.pockets if pockets is None else pockets
        if mode not in POCKET_MODES:
            raise LoadCaseError(f"pockets must be 'vented' or 'trapped', not {mode!r}")
        if self.law is None or (len(self.liquids) <= 1 and self.gas_pressure == 0.0
                                and mode == VENTED):
            return solve(c.section, level, c.liquid.density, c.gravity)
        h, warnings = resolve_level(c.section, level)
        law = self.law.with_level(h)
        state = trap_air(c.section.pocket_tree, law, self.atmospheric_pressure) \
            if mode == TRAPPED else None
        return solve_law(c.section, law, requested_level=float(level), pockets=state,
                         warnings=warnings)


@dataclass(frozen=True, eq=False)
class CaseView(Case):
    """The file-level :class:`~wetline.core.case.Case` seen through one load
    case: its liquid (the bottom layer's), gravity and fill, and ``solve``
    giving that case's own solution (layers, gas, trapped pockets), for code
    that takes a Case (the drawings and the calculation sheet).

    Build it with :meth:`ResolvedCase.as_case`.

    Attributes
    ----------
    resolved : ResolvedCase or None
    note : str
        A sentence added to every solution's warnings (e.g. what a drawing
        of this case leaves out); empty for none.
    """

    resolved: ResolvedCase | None = None
    note: str = ""

    def solve(self, level: float | None = None) -> Solution:
        """The load case's loads at its fill, or at ``level`` [m] (the
        layers below the top one where they are).

        A copy made by a ``with_*`` method solves what it says: another
        fill (a level, a volume) moves the free surface over the case's
        layers (:meth:`ResolvedCase.solve_at`); another section, liquid or
        gravity is no longer the load case, so a case of one vented liquid
        solves as a plain :class:`~wetline.core.case.Case` and one with
        layers, a gas or trapped pockets is refused (LoadCaseError: build
        the view again from the design).
        """
        r = self.resolved
        if r is None:
            return super().solve(level)
        c = r.case
        if not ((self.section is c.section or self.section == c.section)
                and self.liquid == c.liquid and self.gravity == c.gravity):
            if not r.is_one_liquid:
                raise LoadCaseError(
                    f"case {r.name!r}: this view's section, liquid or gravity was changed, "
                    "so it is no longer the load case (its layers, gas or pockets); build "
                    "it again from the design", case=r.name)
            sol = super().solve(level)
        elif level is None and self.fill_level == c.fill_level \
                and self.fill_volume == c.fill_volume:
            sol = r.solve()
        else:
            sol = r.solve_at(self.level if level is None else level)
        if self.note:
            sol = replace(sol, warnings=tuple(sol.warnings) + (self.note,))
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
        self._check()
        if self.structure is not None:
            object.__setattr__(self, "_exterior",
                               exterior_geometry(self.structure, self.case.section))
        resolved = tuple(self._resolve(c, i) for i, c in enumerate(self.load_cases))
        object.__setattr__(self, "_resolved", resolved)

    def _check(self):
        """The inputs' types, the ground's structure and unique case names."""
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
        self.restore_derived()
        return self._solve(self.resolve(name), {}, {})

    def solve_all(self) -> tuple[SolvedCase, ...]:
        """Every case solved, in order (tuple of :class:`SolvedCase`).

        Cases with the same liquid situation (level, density, gravity: every
        ``"empty"`` case, say) share one solution, and cases with the same
        groundwater share its loads on the structure; all are immutable.
        """
        self.restore_derived()
        liquids: dict = {}
        outside: dict = {}
        return tuple(self._solve(r, liquids, outside) for r in self._resolved)

    # ------------------------------------------------------------ copies
    def updated(self, *, case: Case | None = None,
                cases: Iterable[LoadCase] | None = None) -> Design:
        """Copy with another file-level ``case`` and/or ``cases``, checked as
        a new Design is (LoadCaseError naming the case at fault), equal to
        ``Design(case, structure, ground, cases)`` built afresh.

        What does not change is reused, not made again: the structure's
        exterior geometry while the cavity is the same :class:`Section`
        object (checking the structure against the cavity and cutting its
        soil and base pieces takes milliseconds at 2,000 vertices; a fill
        slider step must not pay it), and, while the file-level case is the
        same object, each case that is the same :class:`LoadCase` object at
        the same place (a slider step changes one case).
        """
        new_case = self.case if case is None else case
        new_cases = self.cases if cases is None else tuple(cases)
        if not isinstance(new_case, Case) or (
                self.structure is not None and new_case.section is not self.section):
            return Design(new_case, structure=self.structure, ground=self.ground,
                          cases=new_cases)
        self.restore_derived()
        out = object.__new__(Design)
        for key, value in (("case", new_case), ("structure", self.structure),
                           ("ground", self.ground), ("cases", new_cases),
                           ("_exterior", self._exterior), ("_resolved", ())):
            object.__setattr__(out, key, value)
        out._check()
        kept: dict[int, ResolvedCase] = {}
        if new_case is self.case:
            kept = {id(c): r for c, r in zip(self.load_cases, self._resolved, strict=True)}
        resolved = []
        for i, c in enumerate(out.load_cases):
            r = kept.get(id(c))
            resolved.append(r if r is not None and r.index == i else out._resolve(c, i))
        object.__setattr__(out, "_resolved", tuple(resolved))
        return out

    def with_case(self, case: Case) -> Design:
        """Copy with another file-level case (checked again; see :meth:`updated`)."""
        return self.updated(case=case)

    def with_structure(self, structure: Structure | None,
                       ground: Ground | None = None) -> Design:
        """Copy with another structure (None removes it and the ground)."""
        return replace(self, structure=structure,
                       ground=None if structure is None else (ground or self.ground))

    def with_ground(self, ground: Ground | None) -> Design:
        return replace(self, ground=ground)

    def with_cases(self, cases: Iterable[LoadCase]) -> Design:
        """Copy with other load cases (checked again; see :meth:`updated`)."""
        return self.updated(cases=cases)

    # ------------------------------------------------------- derived data
    def forget_derived(self) -> None:
        """Drop the structure's exterior geometry (its soil and base pieces,
        some hundred kB at 2,000 vertices), e.g. for a design kept only in an
        undo history; :meth:`restore_derived` makes it again with the same
        values, and solving does so first. (As
        :meth:`wetline.core.section.Section.forget_derived`.)"""
        if self.structure is not None:
            object.__setattr__(self, "_exterior", None)

    def restore_derived(self) -> Design:
        """This design, with its exterior geometry made again if it was
        forgotten (the structure was checked when the design was made)."""
        if self.structure is not None and self._exterior is None:
            object.__setattr__(self, "_exterior", exterior_geometry(
                self.structure, self.section, checked=True))
        return self

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
            if lc.layers is not None and len(lc.layers) > 1:
                raise LoadCaseError(f"case {name!r}: an 'empty' fill holds no layers of liquid",
                                    case=name)
            fill, level = EMPTY, section.z_min
        elif lc.fill_level is not None:
            level = lc.fill_level
        elif lc.fill_volume is not None:
            volume = lc.fill_volume
        else:
            level, volume = base.fill_level, base.fill_volume
        if lc.gas_pressure != 0.0 and section.is_open:
            raise LoadCaseError(
                f"case {name!r}: a gas pressure needs a closed section (no 'open' edge): an "
                "open section's surface is at atmospheric pressure", case=name)
        liquids = ((base.liquid if lc.liquid is None else lc.liquid,) if lc.layers is None
                   else tuple(layer.liquid for layer in lc.layers))
        gravity = base.gravity if lc.gravity is None else lc.gravity
        trapped = lc.pockets == TRAPPED
        try:
            interfaces = self._interfaces(lc, section)
            # A fill by volume with layers or trapped air: the level is solved
            # here; the Case keeps the volume it was given.
            case = replace(base, liquid=liquids[0], gravity=gravity, fill_level=level,
                           fill_volume=volume)
            if volume is not None and (interfaces or trapped):
                requested = self._level_for_volume(lc, section, liquids, interfaces, gravity,
                                                   volume)
            else:
                requested = case.level
        except (ValueError, PocketError) as e:
            if isinstance(e, LoadCaseError):
                raise
            raise LoadCaseError(f"case {name!r}: {e}", case=name) from None
        law = self._law(lc, section, liquids, interfaces, gravity, float(requested), fill)
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
                            fill=fill, groundwater=gw, load_factor=lc.load_factor, law=law,
                            liquids=liquids, pockets=lc.pockets,
                            atmospheric_pressure=lc.atmospheric_pressure)

    @staticmethod
    def _interfaces(lc, section):
        """Interface levels [m] of a layered case, bottom up (empty for one liquid)."""
        if lc.layers is None or len(lc.layers) < 2:
            return []
        bounds = [layer.bound for layer in lc.layers[:-1]]
        names = [layer.liquid.name for layer in lc.layers]
        return layer_tops(section, bounds, names)

    @staticmethod
    def _level_for_volume(lc, section, liquids, interfaces, gravity, volume):
        """The level [m] at which ``volume`` [m3] of liquid stands: above the
        layers below the top one; with trapped pockets, with their air in place."""
        if interfaces:
            below = volume_below(section, interfaces[-1])
            if volume <= below:
                raise FillError(
                    f"fill volume {volume:.6g} m3 does not reach the top interface at "
                    f"{interfaces[-1]:.6g} m: the layers below it hold {below:.6g} m3")
        if lc.pockets != TRAPPED:
            return level_for_volume(section, volume)
        top = section.top_level
        if interfaces and not top > interfaces[-1]:
            raise FillError(f"the top interface at {interfaces[-1]:.6g} m is not below the "
                            f"top of the section at {top:.6g} m")
        law = PressureLaw(tuple(Layer(rho.density, z, rho.name) for rho, z in
                                zip(liquids, interfaces + [top], strict=True)),
                          gas_pressure=lc.gas_pressure, gravity=gravity)
        return level_for_liquid_volume(section.pocket_tree, law, volume,
                                       lc.atmospheric_pressure)

    @staticmethod
    def _law(lc, section, liquids, interfaces, gravity, requested, fill):
        """The case's PressureLaw at the level used (capped at the spill level)."""
        name = lc.name
        h, _ = resolve_level(section, requested)
        if interfaces and not h > interfaces[-1]:
            k = len(interfaces) - 1
            if fill == SPILL:
                what = f"the spill level {h:.6g} m"
            elif h != requested:
                what = f"the fill level {h:.6g} m (capped at the spill level)"
            else:
                what = f"the fill level {h:.6g} m"
            raise LoadCaseError(
                f"case {name!r}: {what} is not above the top of "
                f"{_layer_label(k, liquids[k])} at {interfaces[-1]:.6g} m: every layer but "
                "the top one must lie below the free surface", case=name)
        layers = tuple(Layer(rho.density, z, rho.name)
                       for rho, z in zip(liquids, interfaces + [h], strict=True))
        try:
            return PressureLaw(layers, gas_pressure=lc.gas_pressure, gravity=gravity)
        except PressureLawError as e:
            raise LoadCaseError(f"case {name!r}: {e}", case=name) from None

    def _solve(self, r, liquids, outside):
        key = r.solution_key
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
    :func:`wetline.core.results.results_record` with its ``case``,
    ``load_factor`` and ``structure`` (the object of
    :func:`wetline.core.structure.structure_record`, or null), the
    structure's warnings after the liquid's."""
    from .results import building_records, results_record

    loads = solved.structure
    with building_records():
        outside = None if loads is None else structure_record(loads)
    rec = results_record(solved.resolved.case, solved.solution, name=solved.name,
                         load_factor=solved.load_factor, structure=outside)
    if loads is not None:
        rec["warnings"] = list(rec["warnings"]) + list(loads.warnings)
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
    from .results import building_records

    solved = design.solve_all() if solved is None else tuple(solved)
    with building_records():
        return {"format": CASES_FORMAT, "version": CASES_VERSION,
                "cases": [case_record(s) for s in solved],
                "envelope": envelope_record(envelope(solved))}
