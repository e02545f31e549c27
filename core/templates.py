"""Parametric sections: the usual container shapes from a few dimensions.

Each template is a :class:`Template` with named dimensions [m] and defaults;
``template.build(**dims)`` returns a validated :class:`~wetline.core.section.Section`
and ``template.default_level(section)`` a sensible first fill. The GUI lists
:data:`TEMPLATES`; the bundled sample sections are made from them too.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

from .section import Section, SectionError

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
        outline, parts = self._outline(**values)
        return Section.build(outline, parts=parts, kind=self.kind,
                             width=width if self.kind == "plane" else 1.0,
                             name=self.title if name is None else name)

    def default_level(self, section: Section) -> float:
        """A first fill level for a section built from this template [m]."""
        return float(self._level(section))


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
