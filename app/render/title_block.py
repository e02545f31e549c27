"""The title block of the exported diagram: what the drawing is of.

Section name and kind, the liquid with its density and where that comes
from, gravity, the level (and whether it was capped), key totals, the loads
by part, the legend, then at the foot the caution, the units, the date and
the program. Blocks of text (:mod:`wetline.app.render.text_blocks`) flow
into one column beside the drawing or two or three below it; the panel grows
before its text shrinks.
"""

from __future__ import annotations

from PySide6.QtCore import QRectF

from wetline.app.render.output import program_name
from wetline.app.render.style import (
    AIR_LINE,
    DIAGRAM_LINE,
    DIMENSION,
    GROUND,
    GROUNDWATER,
    INK,
    INTERFACE_LINE,
    LIQUID,
    LOAD,
    LOAD_EDGE,
    MUTED,
    OPEN_EDGE,
    SURFACE,
    UPLIFT,
    Fonts,
)
from wetline.app.render.text_blocks import Caution, Heading, Legend, Note, Rows, Space, Table, Title
from wetline.core.numbers import format_number
from wetline.core.results import CAUTION
from wetline.core.section import OPEN

__all__ = ["TitleBlock"]

_SIDE_SHARES = (0.30, 0.33, 0.36, 0.40, 0.45)
"""Widths tried for a title block beside the drawing (fractions of the frame)."""
_BELOW_SHARES = (0.36, 0.40, 0.45, 0.50)
"""Heights tried for a title block below the drawing."""


class TitleBlock:
    """The title block of a :class:`wetline.app.render.scene.DiagramScene`."""

    def __init__(self, scene):
        self.scene = scene

    # --------------------------------------------------------- content
    def blocks(self):
        """The blocks of the title block, top to bottom (the footer apart)."""
        return (self._title() + self._liquid() + self._fill() + self._totals()
                + self._parts() + self._legend())

    def _title(self):
        s = self.scene.section
        name = s.name.strip() or "Untitled section"
        if s.is_axisymmetric:
            sub = "Axisymmetric section, revolved about the axis x = 0 (x is the radius)"
        else:
            sub = f"Plane section, {self.scene.length(s.width)} wide out of the drawing"
        if self.scene.case_name:
            sub = f"Load case {self.scene.case_name}. {sub}"
        return [Title(name, sub)]

    def _liquid(self):
        sc = self.scene
        du, liq = sc.units, sc.case.liquid
        # Inputs are echoed with the digits that identify them.
        density = du.text(liq.density, "density", 5)
        if du.name == "us":
            density += f"  ({format_number(liq.density, 5)} kg/m3)"
        gravity = f"{du.text(sc.solution.gravity, 'length', 6)}/s2"
        layers = list(getattr(sc.solution, "layers", ()) or ())
        if len(layers) > 1:  # top first, as in the tank
            rows = [(f"Layer {k + 1}", f"{ly.name}, {du.text(ly.density, 'density', 5)}, "
                     f"{sc.length(ly.bottom)} to {sc.length(ly.top)}", None)
                    for k, ly in reversed(list(enumerate(layers)))]
            return [Heading("Liquid layers"), Rows(rows + [("Gravity", gravity, None)]),
                    Note("Layers bottom up from 1; densities and their sources are in the "
                         "calculation sheet.")]
        return [Heading("Liquid"),
                Rows([("Liquid", liq.name, None), ("Density", density, None),
                      ("Gravity", gravity, None)]),
                Note(f"Density source: {liq.source}")]

    def _fill(self):
        sc = self.scene
        s, sol = sc.section, sc.solution
        rows = [("Level", sc.length(sol.level), None)]
        notes = []
        capped = sol.spill_level is not None and sol.requested_level > sol.level + 1e-12
        if capped:
            rows[0] = ("Level", f"{sc.length(sol.level)}, capped at spill level", None)
            notes.append(f"Requested level {sc.length(sol.requested_level)} is above the "
                         "spill level; the liquid spills there.")
        if sol.spill_level is not None:
            rows.append(("Spill level", sc.length(sol.spill_level), None))
        else:
            rows.append(("Spill level", "none (closed section)", None))
        if sol.head_above_top > 0:
            rows.append(("Head above roof", sc.length(sol.head_above_top), UPLIFT))
            notes.append("The level stands above the roof of the closed section: the cavity "
                         "is full under a standpipe head and the roof is pushed up.")
        if sol.level <= s.z_min:
            notes.append("The section is empty at this level: no loads.")
        gas = float(getattr(sol, "gas_pressure", 0.0) or 0.0)
        if gas != 0.0:
            rows.append(("Gas pressure", f"{sc.pressure(gas)} (gauge)", None))
        if getattr(sol, "pocket_mode", "vented") == "trapped":
            rows.append(("Air under ceilings", "trapped", None))
            for pocket in sol.pockets:
                rows.append(("Trapped air", f"{sc.pressure(pocket.air_pressure)} at "
                             f"{sc.length(pocket.interface)}", AIR_LINE))
        return [Heading("Fill"), Rows(rows)] + [Note(t) for t in notes]

    def _totals(self):
        sc = self.scene
        sol = sc.solution
        support = sc.without_noise(sol.support_reaction)
        if support < 0:
            support_text, support_colour = f"{sc.force(-support)} held down", UPLIFT
        else:
            support_text, support_colour = sc.force(support), None
        heading = "Totals" if sc.axisymmetric else f"Totals ({sc.scope.words})"
        blocks = [Heading(heading),
                  Rows([("Liquid volume", sc.units.text(sol.volume, "volume"), None),
                        ("Liquid weight", sc.force(sol.fluid_weight), None),
                        ("Floor force", sc.force(sol.floor_force), None),
                        ("Support reaction", support_text, support_colour),
                        ("Max. pressure", sc.pressure(sol.max_pressure), None)])]
        if sc.axisymmetric:
            blocks.append(Note("Forces are for the full circumference."))
        return blocks

    def _parts(self):
        sc = self.scene
        sol, scope = sc.solution, sc.scope
        if not sol.parts:
            return []
        header = ["Part", f"Horiz. {scope.label}", f"Down {scope.label}"]
        table = []
        for part, load in sol.parts.items():
            h = "-" if load.fx is None else format_number(
                scope.to_display(sc.without_noise(load.fx)))
            down = sc.without_noise(load.down)
            if down < 0:
                value = (f"{format_number(scope.to_display(-down))} uplift", UPLIFT)
            else:
                value = (format_number(scope.to_display(down)), None)
            table.append([(part, sc.colours.get(part)), (h, None), value])
        note = ("No net horizontal force over the full circumference." if sc.axisymmetric
                else "Horizontal: net, positive to the right; a part on both sides nets out.")
        return [Heading("Loads by part"), Table(header, table), Note(note)]

    def _legend(self):
        return [Heading("Legend"), self.legend_block()]

    def legend_block(self):
        """The legend's items as one :class:`Legend` block."""
        sc = self.scene
        s = sc.section
        items = [("line", sc.colours[part], part) for part in s.loaded_part_names]
        if OPEN in s.parts:
            items.append(("dash", OPEN_EDGE, "open (no wall)"))
        if sc.axisymmetric:
            items.append(("dashdot", MUTED, "axis of revolution"))
        items += [("fill", LIQUID, "liquid")]
        sol = sc.solution
        if len(getattr(sol, "layers", ()) or ()) > 1:
            items.append(("layer", INTERFACE_LINE, "upper liquid layer (tinted) and its "
                          "interface"))
        if getattr(sol, "pockets", ()):
            items.append(("air", AIR_LINE, "trapped air and its interface"))
        items += [
                  ("surface", SURFACE, "free surface"),
                  ("diagram", DIAGRAM_LINE, "pressure on the wall, drawn outward"),
                  ("arrow_down", LOAD, "resultant on a part (its total, bold)"),
                  ("arrow_up", UPLIFT, "resultant lifting a part (uplift)"),
                  ("arrow_edge", LOAD_EDGE, "one run of a part, named by its edges"),
                  ("vertex", INK, "vertex number"),
                  ("edge", MUTED, "edge number (edge i: vertex i to i + 1)"),
                  ("dimension", DIMENSION, "dimension line, level")]
        if sc.structure is not None:
            items.append(("structure", MUTED, "structure around the cavity"))
            if sc.ground_level is not None:
                items.append(("ground", GROUND, "ground surface"))
            if sc.groundwater_level is not None:
                items += [("groundwater", GROUNDWATER, "groundwater level"),
                          ("groundwater_diagram", GROUNDWATER,
                           "groundwater pressure on the outer face")]
        return Legend(items)

    def footer(self):
        """The blocks at the foot of the last column: caution, units, date, program."""
        sc = self.scene
        du = sc.units
        units = (f"{du.title}: {du.label('length')}, {du.label('pressure')}, "
                 f"{sc.scope.label} ({sc.scope.words})")
        return [Space(0.4),
                Caution(CAUTION),
                Rows([("Units", units, None), ("Date", sc.date, None),
                      ("Program", program_name(), None)])]

    # ---------------------------------------------------------- layout
    def flow(self, fonts, panel, columns, painter=None):
        """Lay the blocks out in ``columns`` of ``panel`` (and draw them with
        ``painter``, if given); True if everything fits."""
        pad = 0.9 * fonts.base
        gap = 1.2 * fonts.base
        inner = panel.adjusted(pad, pad, -pad, -pad)
        cw = (inner.width() - gap * (columns - 1)) / columns
        if cw <= 4 * fonts.base:
            return False
        footer = self.footer()
        fh = sum(b.measure(fonts, cw) for b in footer)
        col, y = 0, inner.top()
        fits = True
        blocks = self.blocks()
        for k, b in enumerate(blocks):
            if isinstance(b, Table) and not b.fits(fonts, cw):
                fits = False
                break
            h = b.measure(fonts, cw)
            if isinstance(b, Heading) and k + 1 < len(blocks):
                # A heading stays with the block it heads.
                h_next = blocks[k + 1].measure(fonts, cw)
                limit = inner.bottom() - (fh if col == columns - 1 else 0.0)
                if y + h + h_next > limit and y > inner.top():
                    col += 1
                    y = inner.top()
                    if col >= columns:
                        fits = False
                        break
            limit = inner.bottom() - (fh if col == columns - 1 else 0.0)
            if y + h > limit:
                if isinstance(b, Heading) or y > inner.top():
                    col += 1
                    y = inner.top()
                    if col >= columns:
                        fits = False
                        break
                    limit = inner.bottom() - (fh if col == columns - 1 else 0.0)
                if y + h > limit:
                    fits = False
                    break
            if painter is not None:
                b.draw(painter, fonts, inner.left() + col * (cw + gap), y, cw)
            y += h
        # The caution, units and date are drawn whatever did not fit above.
        if painter is not None:
            x = inner.left() + (columns - 1) * (cw + gap)
            y = inner.bottom() - fh
            for b in footer:
                b.draw(painter, fonts, x, y, cw)
                y += b.measure(fonts, cw)
        return fits

    def fit(self, frame):
        """Where the title block goes in ``frame`` and in which fonts.

        Returns
        -------
        panel : QRectF
        columns : int
        fonts : wetline.app.render.style.Fonts
        beside : bool
            True if the panel is beside the drawing (a wide page), False if
            below it.
        """
        base = self.scene.base_font
        beside = self.scene.width >= 1.15 * self.scene.height
        if beside:
            columns = 1
            pw0 = max(0.3 * frame.width(), min(24 * base, 0.42 * frame.width()))
            panels = [QRectF(frame.right() - pw, frame.top(), pw, frame.height())
                      for pw in sorted({max(pw0, s * frame.width()) for s in _SIDE_SHARES})]
        else:
            columns = max(2, min(3, int(frame.width() // (20 * base))))
            ph0 = max(0.36 * frame.height(), min(18 * base, 0.5 * frame.height()))
            panels = [QRectF(frame.left(), frame.bottom() - ph, frame.width(), ph)
                      for ph in sorted({max(ph0, s * frame.height()) for s in _BELOW_SHARES})]
        tries = [(r, columns) for r in panels]
        if beside:  # a long block beside the drawing: two columns rather than cut
            tries += [(r, 2) for r in panels if r.width() >= 0.4 * frame.width()]
        floor = max(7.0, self.scene.min_font)
        # Shrink in steps down to the floor itself (a step past it is not
        # skipped: the floor may be only a few per cent below the base); at
        # the floor, still too long (a structure's legend, several notes):
        # one more column of blocks, in the narrowest panel that holds them.
        while True:
            fonts = Fonts(base)
            found = next((t for t in tries if self.flow(fonts, *t)), None)
            if found is not None:
                return found[0], found[1], fonts, beside
            if base <= floor:
                wider = next((r for r in panels if self.flow(fonts, r, columns + 1)), None)
                if wider is not None:
                    return wider, columns + 1, fonts, beside
                return panels[-1], columns, fonts, beside
            base = max(base * 0.93, floor)

    def draw(self, p, panel, columns, fonts):
        """Paint the title block into ``panel``."""
        self.flow(fonts, panel, columns, painter=p)
