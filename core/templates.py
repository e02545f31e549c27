"""Parametric sections: the usual container shapes from a few dimensions.

Each template is a :class:`Template` with named dimensions [m] and defaults;
``template.build(**dims)`` returns a validated :class:`~wetline.core.section.Section`
and ``template.default_level(section)`` a sensible first fill. The GUI lists
:data:`TEMPLATES`; the bundled sample sections are made from them too.

``template.design(**dims)`` gives the whole design situation as a
:class:`~wetline.core.load_cases.Design`: for the buried structures (a wet
well at a pumping station, a chamber under a riser, a grease trap, a closed
chamber whose downstand lip traps air) the structure around the cavity
(:func:`~wetline.core.structure.walls_of_thickness` of the base, wall and
roof thicknesses), the ground, the roof's self-weight against uplift and the
usual load cases; for the others one case at the default level. The
scenarios are invented; the load factors are 1.0 (the governing code sets
them).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

from .section import Section, SectionError

if TYPE_CHECKING:  # pragma: no cover - types only
    from .load_cases import Design

__all__ = ["Dimension", "Template", "TEMPLATES", "template"]


@dataclass(frozen=True)
class Dimension:
    """One dimension of a template: key, label for people, default [m]."""

    key: str
    label: str
    default: float


@dataclass(frozen=True)
class Template:
    """A parametric section.

    Attributes
    ----------
    key : str
        Short identifier (``"open_tank"``).
    title : str
        Name shown to people.
    description : str
        One line on what it models.
    kind : str
        ``"plane"`` or ``"axisymmetric"``.
    dimensions : tuple of Dimension
    """

    key: str
    title: str
    description: str
    kind: str
    dimensions: tuple[Dimension, ...]
    _outline: Callable[..., tuple[list[list[float]], list[str]]]
    _level: Callable[[Section], float]
    _design: Callable[..., Design] | None = None

    @property
    def has_design(self) -> bool:
        """True if the template has a structure, ground and load cases."""
        return self._design is not None

    def defaults(self) -> dict[str, float]:
        """Default dimensions, ``{key: value [m]}``."""
        return {d.key: d.default for d in self.dimensions}

    def build(self, name: str | None = None, width: float = 1.0, **dims: float) -> Section:
        """The section for the given dimensions [m] (defaults for any left out).

        ``width`` is the section's out-of-plane width [m] (plane only); no
        template has a dimension of that name, so the two never collide.

        Raises
        ------
        SectionError
            For a dimension that is not positive or shapes that do not fit
            (an outlet wider than the top ...).
        """
        values = self._values(dims)
        outline, parts = self._outline(**values)
        return Section.build(outline, parts=parts, kind=self.kind,
                             width=width if self.kind == "plane" else 1.0,
                             name=self.title if name is None else name)

    def _values(self, dims: dict[str, float]) -> dict[str, float]:
        """Every dimension [m]: the defaults, with ``dims`` given, checked."""
        values = self.defaults()
        if any(d.key in ("name", "width") for d in self.dimensions):  # pragma: no cover
            raise AssertionError("a template dimension shadows a build() argument")
        for key, v in dims.items():
            if key not in values:
                raise SectionError(f"{self.title} has no dimension {key!r}")
            values[key] = float(v)
        labels = {d.key: d.label for d in self.dimensions}
        for key, v in values.items():
            if not v > 0:
                raise SectionError(f"{labels[key]} must be positive, not {v:g}")
        return values

    def default_level(self, section: Section) -> float:
        """A first fill level for a section built from this template [m]."""
        return float(self._level(section))

    def design(self, name: str | None = None, width: float = 1.0, **dims: float) -> Design:
        """The template's design situation (:class:`~wetline.core.load_cases.Design`)
        for the given dimensions [m]: its section, liquid and default fill,
        and, for the buried structures, the structure, the ground, the
        roof's self-weight against uplift and the load cases; otherwise one
        case of fresh water at 20 C at the default level.

        Raises
        ------
        SectionError
            As :meth:`build`.
        wetline.core.structure.StructureError
            If the thicknesses do not make a structure around the cavity.
        """
        from .case import Case
        from .load_cases import Design

        section = self.build(name=name, width=width, **dims)
        if self._design is None:
            return Design(Case.default(section, self.default_level(section)))
        return self._design(section, self._values(dims))


def _need(cond: bool, message: str) -> None:
    if not cond:
        raise SectionError(message)


Outline = tuple[list[list[float]], list[str]]
"""Vertices [m] and part names of a template's outline."""


def _open_tank(tank_width: float, height: float) -> Outline:
    return ([[0, 0], [tank_width, 0], [tank_width, height], [0, height]],
            ["floor", "wall", "open", "wall"])


def _flared_hopper(top_width: float, outlet_width: float, hopper_height: float,
                   upright_height: float) -> Outline:
    _need(outlet_width < top_width, "the outlet must be narrower than the top")
    a = (top_width - outlet_width) / 2
    b = (top_width + outlet_width) / 2
    top = hopper_height + upright_height
    return ([[a, 0], [b, 0], [top_width, hopper_height], [top_width, top],
             [0, top], [0, hopper_height]],
            ["floor", "hopper", "wall", "open", "wall", "hopper"])


def _chamber_under_riser(chamber_width: float, chamber_height: float, riser_width: float,
                         riser_height: float) -> Outline:
    _need(riser_width < chamber_width, "the riser must be narrower than the chamber")
    a = (chamber_width - riser_width) / 2
    b = (chamber_width + riser_width) / 2
    h, t = chamber_height, chamber_height + riser_height
    return ([[0, 0], [chamber_width, 0], [chamber_width, h], [b, h], [b, t], [a, t],
             [a, h], [0, h]],
            ["floor", "wall", "roof", "riser", "open", "riser", "roof", "wall"])


def _sump_with_lid(well_width: float, well_depth: float, shaft_width: float,
                   shaft_height: float) -> Outline:
    _need(shaft_width < well_width, "the access shaft must be narrower than the wet well")
    d, t = well_depth, well_depth + shaft_height
    return ([[0, 0], [well_width, 0], [well_width, d], [shaft_width, d], [shaft_width, t],
             [0, t]],
            ["floor", "wall", "lid", "wall", "open", "wall"])


def _closed_tank(tank_width: float, height: float) -> Outline:
    return ([[0, 0], [tank_width, 0], [tank_width, height], [0, height]],
            ["floor", "wall", "roof", "wall"])


def _cone_hopper(radius: float, outlet_radius: float, cone_height: float,
                 shell_height: float) -> Outline:
    _need(outlet_radius < radius, "the outlet must be smaller than the shell")
    t = cone_height + shell_height
    return ([[0, 0], [outlet_radius, 0], [radius, cone_height], [radius, t], [0, t]],
            ["floor", "cone", "shell", "open", "axis"])


def _buried_wet_well(well_width: float, well_depth: float, shaft_width: float,
                     shaft_height: float, **_: float) -> Outline:
    _need(shaft_width < well_width, "the access shaft must be narrower than the wet well")
    d, t = well_depth, well_depth + shaft_height
    return ([[0, 0], [well_width, 0], [well_width, d], [shaft_width, d], [shaft_width, t],
             [0, t]],
            ["floor", "wall", "roof", "shaft", "open", "wall"])


def _buried_chamber(chamber_width: float, chamber_height: float, riser_width: float,
                    riser_height: float, **_: float) -> Outline:
    return _chamber_under_riser(chamber_width, chamber_height, riser_width, riser_height)


def _grease_trap(trap_width: float, trap_depth: float, **_: float) -> Outline:
    return ([[0, 0], [trap_width, 0], [trap_width, trap_depth], [0, trap_depth]],
            ["floor", "wall", "open", "wall"])


def _chamber_with_lip(chamber_width: float, chamber_height: float, riser_width: float,
                      riser_height: float, lip_depth: float, lip_thickness: float,
                      **_: float) -> Outline:
    _need(riser_width + lip_thickness < chamber_width,
          "the riser and its lip must be narrower than the chamber")
    _need(lip_depth < chamber_height, "the lip must end above the floor")
    r, t = riser_width, riser_width + lip_thickness
    h, lip, top = chamber_height, chamber_height - lip_depth, chamber_height + riser_height
    return ([[0, 0], [chamber_width, 0], [chamber_width, h], [t, h], [t, lip], [r, lip],
             [r, top], [0, top]],
            ["floor", "wall", "roof", "lip", "lip", "riser", "open", "riser"])


def _outer_parts(outline: Any, cavity: Section) -> list[str]:
    """Part names of a structure's outer edges: ``base`` facing down,
    ``outer roof`` facing up, ``top`` where it spans the cavity's opening,
    ``outer wall`` elsewhere (by the outward normal, as
    :func:`~wetline.core.structure.walls_of_thickness` picks thicknesses)."""
    import numpy as np

    from .structure import Structure

    probe = Structure.build(outline, cavity=cavity)
    s = probe.section(cavity)
    geo = s.geometry
    spill = cavity.spill_level
    names = []
    for i in range(s.n_edges):
        nz = float(geo.nz[i])
        z0, z1 = float(s.outline[i, 1]), float(s.outline[(i + 1) % s.n_edges, 1])
        if nz < -np.sqrt(0.5):
            names.append("base")
        elif nz > np.sqrt(0.5):
            names.append("top" if spill is not None and z0 == z1 == spill else "outer roof")
        else:
            names.append("outer wall")
    return names


def _roof_resistance(section: Section, thickness: float, span: float) -> Any:
    """What holds a buried roof slab down, per metre of width [N/m]: its
    self-weight, 25 kN/m3 (EN 1991-1-1 Table A.1) x thickness x span, and
    the dry soil over it up to the ground at the top of the opening,
    18 kN/m3 (common practice) x depth x span, as holding-down."""
    from .structure import DEFAULT_SOIL_DRY, DEFAULT_UNIT_WEIGHT
    from .uplift import PartResistance

    roofs = [i for i, p in enumerate(section.parts) if p == "roof"]
    soffit = max(float(section.outline[i, 1]) for i in roofs)
    soil = max(section.top_level - soffit - thickness, 0.0)
    return PartResistance(self_weight=DEFAULT_UNIT_WEIGHT * thickness * span,
                          holding_down=DEFAULT_SOIL_DRY * soil * span)


def _buried(section: Section, values: dict[str, float], liquid: Any, level: float,
            cases: tuple[Any, ...], roof_span: float | None) -> Design:
    """A buried structure's design: walls of the template's thicknesses,
    the ground at the top of the opening, the roof held down by its
    self-weight and the soil over it, the file-level ``liquid`` at
    ``level`` [m], and ``cases``."""
    from .case import Case
    from .load_cases import Design
    from .structure import Ground, Structure, walls_of_thickness

    outline = walls_of_thickness(section, base=values["base_thickness"],
                                 wall=values["wall_thickness"],
                                 roof=values.get("roof_thickness", values["wall_thickness"]))
    structure = Structure.build(outline, _outer_parts(outline, section), cavity=section)
    resistances: tuple[tuple[str, Any], ...] = ()
    if roof_span is not None:
        resistances = (("roof", _roof_resistance(section, values["roof_thickness"],
                                                 roof_span)),)
    base = Case(section, liquid, fill_level=level, resistances=resistances)
    return Design(base, structure, Ground(section.top_level), cases)


def _wet_well_design(section: Section, values: dict[str, float]) -> Design:
    from .liquids import fresh_water, listed_liquid
    from .load_cases import EMPTY, SPILL, LoadCase
    from .structure import Groundwater

    ground = section.top_level
    normal = Groundwater(ground - 0.5 * (ground - section.z_min))
    cases = (
        LoadCase("normal top water", fill_level=0.6 * values["well_depth"], groundwater=normal),
        LoadCase("overflow to the spill level", fill_level=SPILL, groundwater=normal),
        LoadCase("water test (full, no groundwater)", liquid=fresh_water(10.0),
                 fill_level=SPILL),
        LoadCase("empty, flood groundwater at ground level", fill_level=EMPTY,
                 groundwater=Groundwater(ground)),
    )
    span = values["well_width"] - values["shaft_width"]
    return _buried(section, values, listed_liquid("raw sewage"), 0.6 * values["well_depth"],
                   cases, span)


def _chamber_design(section: Section, values: dict[str, float]) -> Design:
    from .liquids import fresh_water
    from .load_cases import EMPTY, SPILL, LoadCase
    from .structure import Groundwater

    ground = section.top_level
    normal = Groundwater(values["chamber_height"])
    cases = (
        LoadCase("normal top water", fill_level=values["chamber_height"]
                 + 0.5 * values["riser_height"], groundwater=normal),
        LoadCase("overflow to the spill level", fill_level=SPILL, groundwater=normal),
        LoadCase("water test (full, no groundwater)", fill_level=SPILL),
        LoadCase("empty, flood groundwater at ground level", fill_level=EMPTY,
                 groundwater=Groundwater(ground)),
    )
    span = values["chamber_width"] - values["riser_width"]
    level = values["chamber_height"] + 0.5 * values["riser_height"]
    return _buried(section, values, fresh_water(10.0), level, cases, span)


def _grease_trap_design(section: Section, values: dict[str, float]) -> Design:
    from .liquids import fresh_water, listed_liquid
    from .load_cases import EMPTY, SPILL, LiquidLayer, LoadCase
    from .structure import Groundwater

    sewage, fat = listed_liquid("raw sewage"), listed_liquid("fats, oils and grease")
    depth = values["trap_depth"]
    ground = section.top_level
    cases = (
        LoadCase("normal operation: grease on sewage", fill_level=SPILL,
                 layers=(LiquidLayer(sewage, top=depth - values["grease_thickness"]),
                         LiquidLayer(fat)),
                 groundwater=Groundwater(0.5 * depth)),
        LoadCase("grease at its largest thickness", fill_level=SPILL,
                 layers=(LiquidLayer(sewage, top=depth - values["grease_storage"]),
                         LiquidLayer(fat)),
                 groundwater=Groundwater(0.5 * depth)),
        LoadCase("water test (clean water, full)", liquid=fresh_water(10.0), fill_level=SPILL),
        LoadCase("empty, flood groundwater at ground level", fill_level=EMPTY,
                 groundwater=Groundwater(ground)),
    )
    return _buried(section, values, sewage, section.top_level - values["grease_thickness"],
                   cases, None)


def _chamber_with_lip_design(section: Section, values: dict[str, float]) -> Design:
    from .liquids import fresh_water
    from .load_cases import EMPTY, SPILL, LoadCase
    from .structure import Groundwater

    ground = section.top_level
    half = values["chamber_height"] + 0.5 * values["riser_height"]
    cases = (
        LoadCase("riser full, pockets vented", fill_level=SPILL),
        LoadCase("riser full, air trapped under the roof", fill_level=SPILL, pockets="trapped"),
        LoadCase("riser half full, air trapped under the roof", fill_level=half,
                 pockets="trapped"),
        LoadCase("empty, flood groundwater at ground level", fill_level=EMPTY,
                 groundwater=Groundwater(ground)),
    )
    span = values["chamber_width"] - values["riser_width"] - values["lip_thickness"]
    return _buried(section, values, fresh_water(10.0), half, cases, span)


def _thicknesses(base: float, wall: float, roof: float | None = None) -> tuple[Dimension, ...]:
    out: tuple[Dimension, ...] = (Dimension("base_thickness", "Base slab thickness", base),
           Dimension("wall_thickness", "Wall thickness", wall))
    if roof is not None:
        out += (Dimension("roof_thickness", "Roof slab thickness", roof),)
    return out


TEMPLATES = {
    t.key: t for t in (
        Template("open_tank", "Open rectangular tank",
                 "A flat floor, two upright walls, open at the top.", "plane",
                 (Dimension("tank_width", "Inside width", 3.0),
                  Dimension("height", "Wall height", 2.5)),
                 _open_tank, lambda s: 0.8 * s.top_level),
        Template("flared_hopper", "Flared hopper with outlet gate",
                 "Sloping sides down to a small outlet gate, which is the floor.", "plane",
                 (Dimension("top_width", "Top width", 4.0),
                  Dimension("outlet_width", "Outlet gate width", 0.6),
                  Dimension("hopper_height", "Sloping part height", 2.5),
                  Dimension("upright_height", "Upright part height", 1.5)),
                 _flared_hopper, lambda s: 0.9 * s.top_level),
        Template("chamber_under_riser", "Chamber under a narrow riser",
                 "A wide chamber whose roof is pushed up by the head in a narrow riser.",
                 "plane",
                 (Dimension("chamber_width", "Chamber width", 4.0),
                  Dimension("chamber_height", "Chamber height", 2.0),
                  Dimension("riser_width", "Riser width", 0.8),
                  Dimension("riser_height", "Riser height", 3.0)),
                 _chamber_under_riser, lambda s: s.top_level - 0.5),
        Template("sump_with_lid", "Pump sump with overhanging lid",
                 "A wet well whose lid overhangs the water, reached by a narrower shaft.",
                 "plane",
                 (Dimension("well_width", "Wet well width", 2.4),
                  Dimension("well_depth", "Wet well depth", 1.6),
                  Dimension("shaft_width", "Access shaft width", 1.9),
                  Dimension("shaft_height", "Shaft height above the lid", 1.2)),
                 _sump_with_lid, lambda s: s.top_level - 0.6),
        Template("closed_tank", "Closed tank under a standpipe",
                 "A sealed box; the level may stand above its roof (a standpipe head).",
                 "plane",
                 (Dimension("tank_width", "Inside width", 3.0),
                  Dimension("height", "Inside height", 2.0)),
                 _closed_tank, lambda s: s.z_max + 1.5),
        Template("cone_hopper", "Cone hopper with cylindrical shell",
                 "A vertical silo-type vessel: cone down to an outlet gate, cylinder above.",
                 "axisymmetric",
                 (Dimension("radius", "Shell radius", 1.5),
                  Dimension("outlet_radius", "Outlet gate radius", 0.2),
                  Dimension("cone_height", "Cone height", 2.0),
                  Dimension("shell_height", "Shell height", 2.5)),
                 _cone_hopper, lambda s: 0.9 * s.top_level),
        Template("buried_wet_well", "Buried wet well (pumping station)",
                 "A wet well below ground under a roof slab with an access shaft: structure, "
                 "ground and the usual four load cases.", "plane",
                 (Dimension("well_width", "Wet well width", 3.0),
                  Dimension("well_depth", "Wet well depth to the roof slab", 3.5),
                  Dimension("shaft_width", "Access shaft width", 1.2),
                  Dimension("shaft_height", "Shaft height above the roof slab", 1.0))
                 + _thicknesses(0.5, 0.35, 0.3),
                 _buried_wet_well, lambda s: 0.6 * (s.top_level - s.z_min) + s.z_min,
                 _wet_well_design),
        Template("buried_chamber", "Buried chamber under a riser",
                 "A chamber below ground whose roof carries soil and is pushed up by the head "
                 "in its riser: structure, ground and the usual four load cases.", "plane",
                 (Dimension("chamber_width", "Chamber width", 4.0),
                  Dimension("chamber_height", "Chamber height", 2.0),
                  Dimension("riser_width", "Riser width", 0.9),
                  Dimension("riser_height", "Riser height", 2.5))
                 + _thicknesses(0.4, 0.3, 0.3),
                 _buried_chamber, lambda s: s.top_level - 0.5, _chamber_design),
        Template("grease_trap", "Grease trap",
                 "A buried chamber where fats, oils and grease float on the sewage: two "
                 "liquid layers, structure, ground and four load cases.", "plane",
                 (Dimension("trap_width", "Inside width", 2.5),
                  Dimension("trap_depth", "Depth to the outlet", 2.0),
                  Dimension("grease_thickness", "Grease layer, in operation", 0.15),
                  Dimension("grease_storage", "Grease layer, at its largest", 0.5))
                 + _thicknesses(0.3, 0.25),
                 _grease_trap, lambda s: s.top_level, _grease_trap_design),
        Template("chamber_with_lip", "Closed chamber under a riser with a downstand lip",
                 "The riser's wall reaches down below the roof: the rising water seals the lip "
                 "and traps the roof's air, vented and trapped cases side by side.", "plane",
                 (Dimension("chamber_width", "Chamber width", 3.0),
                  Dimension("chamber_height", "Chamber height", 2.0),
                  Dimension("riser_width", "Riser width", 0.8),
                  Dimension("riser_height", "Riser height", 2.0),
                  Dimension("lip_depth", "Lip depth below the roof", 0.5),
                  Dimension("lip_thickness", "Lip thickness", 0.2))
                 + _thicknesses(0.4, 0.3, 0.3),
                 _chamber_with_lip, lambda s: s.top_level, _chamber_with_lip_design),
    )
}
"""All templates by key, in the order a menu lists them."""


def template(key: str) -> Template:
    """The template called ``key``; SectionError naming the known ones."""
    try:
        return TEMPLATES[key]
    except KeyError:
        raise SectionError(
            f"no template {key!r}; known: {', '.join(TEMPLATES)}") from None
