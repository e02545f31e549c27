"""Section 1 of the calculation sheet, the inputs (a part of the sheet in
:mod:`wetline.app.render.sheet`): the section and its outline, the liquid
and gravity, the fill and how it was given, the uplift inputs, the structure
and ground, and the load cases with their layers, gas and air."""

from __future__ import annotations

from wetline.app.render.sheet_html import escape, kv_html, table_html
from wetline.core.force_scope import resistance_quantity
from wetline.core.numbers import Entered, format_entered, format_number

__all__ = ["SheetInputs", "MAX_OUTLINE_ROWS"]

MAX_OUTLINE_ROWS = 80
"""Outlines with more vertices are listed only with the per-edge results."""


class SheetInputs:
    """The HTML of the inputs, mixed into the sheet whose design, solved
    cases, units and number writers it reads."""

    def inputs(self):
        """Section 1: the section, the liquid and gravity, the fill, the uplift
        inputs; the structure and ground, and the load cases, where there are."""
        out = ("<h2>1 Inputs</h2>" + self._section_inputs() + self._liquid_inputs()
               + self._fill_inputs() + self._uplift_inputs())
        if self.design.structure is not None:
            out += self._structure_inputs()
        return out

    def _structure_inputs(self):
        d, du = self.design, self.du
        st = d.structure
        L = du.label("length")
        loads = self.structure
        q = resistance_quantity(self.section)
        per = "totals" if self.section.is_axisymmetric else "per unit width"
        rows = [("Outline", f"{st.n_edges} vertices around the cavity; parts "
                            f"{escape(', '.join(st.part_names))}"),
                ("Unit weight", escape(self.unit_weight(st.unit_weight))),
                ("Self-weight", escape(self.force(loads.self_weight)) + " (between the outlines)"),
                ("Extra weight", escape(du.text(st.extra_weight, q)) + f" ({per})"),
                ("Anchorage", escape(du.text(st.anchorage, q)) + f" ({per})")]
        g = d.ground
        if g is not None:
            rows += [("Ground surface", escape(self.length(g.level))),
                     ("Soil unit weight", escape(f"dry {self.unit_weight(g.unit_weight_dry)}, "
                                        f"saturated {self.unit_weight(g.unit_weight_saturated)}"))]
        out = ["<h3>1.5 Structure and ground</h3>", kv_html(rows)]
        pts = du.to_display(st.outline, "length")
        if st.n_edges <= MAX_OUTLINE_ROWS:
            xl = "r" if self.section.is_axisymmetric else "x"
            out.append(table_html(("outer vertex", f"{xl} [{L}]", f"z [{L}]", "edge i part"),
                                   [(i, Entered(float(pts[i, 0])), Entered(float(pts[i, 1])),
                                     st.parts[i]) for i in range(st.n_edges)],
                                   align=["right", "right", "right", "left"],
                                   widths=[16, 21, 21, 42]))
        return "".join(out)

    def _cases_inputs(self):
        du = self.du
        L = du.label("length")
        rows = []
        for sc in self.solved:
            r = sc.resolved
            liq = r.case.liquid
            level = Entered(float(du.to_display(r.level, "length")))
            fill = {"spill": "spill level", "empty": "empty"}.get(r.fill or "", "")
            if not fill and r.case.fill_volume is not None:
                fill = f"volume {du.text(r.case.fill_volume, 'volume')}"
            gw = r.groundwater
            what = (f"{liq.name}, {format_number(liq.density, 5)} kg/m3" if not r.is_layered
                    else "layers: " + ", ".join(f"{x.name} {format_number(x.density, 5)}"
                                                for x in r.liquids) + " kg/m3, bottom up")
            rows.append((sc.name, what,
                         level if not fill else f"{format_entered(level)} ({fill})",
                         "none" if gw is None else Entered(float(du.to_display(gw.level,
                                                                                  "length"))),
                         sc.load_factor))
        header = ("case", "liquid", f"level [{L}]", f"groundwater [{L}]", "load factor")
        return (self._cases_table_html(header, rows) + self._law_inputs())

    def _law_inputs(self):
        """Per case: its layers bottom up (liquid, density, source, top level
        or own volume), the gas pressure, the pockets assumption and the
        atmospheric pressure."""
        if not self._uses_full_law():
            return ""
        du = self.du
        layer_rows, air_rows = [], []
        for sc in self.solved:
            r = sc.resolved
            given = self.design.load_cases[r.index].layers or ()
            tops = [] if r.law is None else list(r.law.interfaces)
            if r.is_layered:
                for k, liq in enumerate(r.liquids):
                    if k == len(r.liquids) - 1:
                        top = "the free surface (the case's fill)"
                    elif k < len(given) and given[k].volume is not None:
                        top = (f"own volume {du.text(given[k].volume, 'volume')}; its top "
                               f"solved at {self.length(tops[k])}")
                    else:
                        top = f"top at {self.length(tops[k])}"
                    layer_rows.append((sc.name if k == 0 else "", k + 1, liq.name,
                                       format_number(liq.density, 5), liq.source, top))
            pockets = ("trapped: compressed by the rising liquid (Boyle's law)"
                       if r.pockets == "trapped" else "vented (every pool at the level)")
            air_rows.append((sc.name, du.text(r.gas_pressure, "pressure"), pockets,
                             du.text(r.atmospheric_pressure, "pressure")))
        out = ["<h3>Layers, gas and air of the cases</h3>"]
        if layer_rows:
            out.append('<p class="note">Immiscible liquids of each case, bottom up (layer 1 '
                       "at the bottom); densities do not increase upward.</p>")
            out.append(table_html(("case", "layer", "liquid", "density [kg/m3]",
                                    "source of the density", "top"), layer_rows,
                                   align=["left", "right", "left", "right", "left", "left"],
                                   widths=[16, 7, 17, 10, 30, 20]))
        out.append(table_html(("case", "gas pressure (gauge)", "air under ceilings",
                                "atmospheric pressure (absolute)"), air_rows,
                               align=["left", "right", "left", "right"],
                               widths=[28, 18, 34, 20]))
        return "".join(out)

    def _cases_table_html(self, header, rows):
        return ("<h2>Load cases</h2>"
                '<p class="note">Each case starts from the file-level liquid and fill above '
                "and changes what it names. Design values are the characteristic liquid and "
                "groundwater loads times the case's load factor (self-weight, soil and "
                "anchorage are not factored).</p>"
                + table_html(header, rows, align=["left", "left", "right", "right", "right"],
                              widths=[24, 30, 18, 16, 12]))

    def _section_inputs(self):
        s, du, case = self.section, self.du, self.case
        L = du.label("length")
        out = ["<h3>1.1 Section</h3>"]
        if s.is_axisymmetric:
            geometry = ("axisymmetric: the outline is a half-section revolved about the "
                        "axis x = 0 (x is the radius); forces over the full circumference")
        else:
            geometry = (f"plane: the outline is a cross-section {escape(self.length(s.width))} "
                        f"wide out of the drawing; forces {escape(self.force_scope())}")
        pts = du.to_display(s.outline, "length")
        parts = ", ".join(s.part_names)
        top = (f"spill level {escape(self.length(s.spill_level))} (open section)" if s.is_open
               else f"roof at {escape(self.length(s.z_max))} (closed section)")
        rows = [("Name", escape(s.name.strip() or "untitled")),
                ("Geometry", geometry),
                ("Outline", f"{s.n_edges} vertices and {s.n_edges} edges; coordinates "
                            f"below in {escape(L)} (the file gives them in "
                            f"{escape(case.length_unit)})"),
                ("Extent", f"x from {format_entered(pts[:, 0].min())} to "
                           f"{format_entered(pts[:, 0].max())} {escape(L)}, z from "
                           f"{format_entered(pts[:, 1].min())} to "
                           f"{format_entered(pts[:, 1].max())} {escape(L)}"),
                ("Parts", escape(parts)),
                ("Top", top)]
        out.append(kv_html(rows))
        if s.n_edges <= MAX_OUTLINE_ROWS:
            out.append('<p class="note">Outline: vertex i and the part of edge i, which runs '
                       "from vertex i to vertex i + 1 (the last edge closes the outline). "
                       "x to the right, z up.</p>")
            xl = "r" if s.is_axisymmetric else "x"
            header = ("vertex", f"{xl} [{L}]", f"z [{L}]", "edge i part")
            rows = [(i, Entered(float(pts[i, 0])), Entered(float(pts[i, 1])), s.parts[i])
                    for i in range(s.n_edges)]
            out.append(table_html(header, rows, align=["right", "right", "right", "left"],
                                   widths=[12, 22, 22, 44]))
        else:
            out.append(f'<p class="note">The {s.n_edges} vertices are listed with the per-edge '
                       f"results in section 6 (x start and z start of each edge, with its "
                       f"part).</p>")
        return "".join(out)

    def _liquid_inputs(self):
        du, case = self.du, self.case
        liq = case.liquid
        out = ["<h3>1.2 Liquid and gravity</h3>"]
        # Inputs are echoed with the digits that identify them.
        density = du.text(liq.density, "density", 5)
        if du.name != "si":
            density += f" ({format_number(liq.density, 5)} kg/m3)"
        gravity = f"{format_number(case.gravity, 7)} m/s2"
        if du.name == "us":
            gravity += f" ({du.text(case.gravity, 'length', 7)}/s2)"
        out.append(kv_html([("Liquid", escape(liq.name)), ("Density", escape(density)),
                             ("Source of the density", escape(liq.source)),
                             ("Gravity", escape(gravity))]))
        return "".join(out)

    def _fill_inputs(self):
        sol, du, case = self.sol, self.du, self.case
        out = ["<h3>1.3 Fill</h3>"]
        rows = []
        if self.level_given:
            how = "level given for this sheet"
        elif case.fill_volume is not None:
            how = (f"volume given: {du.text(case.fill_volume, 'volume')}; the level holding "
                   "it was solved exactly")
        else:
            how = "level given"
        rows.append(("Fill", escape(how)))
        requested = self.length(sol.requested_level)
        if case.fill_volume is None or self.level_given:  # typed: echoed as typed
            requested = (f"{format_entered(du.to_display(sol.requested_level, 'length'))} "
                         f"{du.label('length')}")
        rows.append(("Requested level", escape(requested)))
        level = self.length(sol.level)
        if sol.level != sol.requested_level:
            level += ", capped at the spill level"
        rows.append(("Level used", f"<b>{escape(level)}</b>"))
        if sol.head_above_top > 0:
            rows.append(("Head above the roof", escape(self.length(sol.head_above_top)) +
                         " (the closed section is full under a standpipe head)"))
        rows.append(("Liquid volume", escape(du.text(sol.volume, "volume"))))
        out.append(kv_html(rows))
        return "".join(out)

    def _uplift_inputs(self):
        s, du, case = self.section, self.du, self.case
        out = ["<h3>1.4 Uplift check inputs</h3>"]
        rows = [("Required factor", f"<b>{escape(format_number(case.required_uplift_factor))}</b>"),
                ("Source", escape(self._factor_source()))]
        out.append(kv_html(rows))
        res = case.resistance_map
        if res:
            q = resistance_quantity(s)
            unit = du.label(q)
            per = "totals" if s.is_axisymmetric else "per unit width"
            header = ("part", f"self-weight G [{unit}]", f"holding-down R [{unit}]",
                      f"G + R [{unit}]")
            rows = [(name, du.to_display(r.self_weight, q), du.to_display(r.holding_down, q),
                     du.to_display(r.total, q)) for name, r in sorted(res.items())]
            out.append(f'<p class="note">Resistance holding each part down ({per}).</p>')
            out.append(table_html(header, rows))
        else:
            out.append('<p class="note">No self-weight or holding-down resistance entered: '
                       "no part is checked against uplift.</p>")
        return "".join(out)
