"""Section 3 of the calculation sheet, the results (a part of the sheet in
:mod:`wetline.app.render.sheet`): the totals, loads by part and uplift check
of one case, or per load case its characteristic and design values, layers,
pockets of trapped air, flotation and base slab, then the envelope over the
cases."""

from __future__ import annotations

import numpy as np

from wetline.app.render.sheet_html import escape, kv_html, table_html
from wetline.app.render.style import NOT_OK_COLOUR, OK_COLOUR
from wetline.core.force_scope import force_scale
from wetline.core.numbers import format_entered, format_number
from wetline.core.report_tables import (
    cell_text,
    parts_table,
    totals_table,
    uplift_table,
    with_note,
)
from wetline.core.uplift import UPLIFT_CAUTION

__all__ = ["SheetResults"]


class SheetResults:
    """The HTML of the results, mixed into the sheet whose solved cases,
    envelope, units and number writers it reads."""

    def results(self):
        return self._multi_results() if self.multi else self._single_results()

    def _single_results(self):
        s, sol, du, case = self.section, self.sol, self.du, self.case
        out = ["<h2>3 Results</h2>",
               f"<h3>3.1 Totals</h3><p>Forces {escape(self.force_scope())}.</p>"]
        rows = [(name, with_note(value, note), unit)
                for name, value, unit, note in totals_table(sol, du, case.length_unit).rows]
        out.append(table_html(("quantity", "value", "unit"), rows,
                               align=["left", "right", "left"], widths=[40, 30, 30]))
        out.append(f'<p class="note">Check: floor force + support reaction = '
                   f"{escape(self.force(sol.floor_force))} + "
                   f"({escape(self.force(sol.support_reaction))}) "
                   f"= {escape(self.force(sol.floor_force + sol.support_reaction))}; liquid weight "
                   f"ρ g V = {escape(self.force(sol.fluid_weight))}.</p>")
        parts = parts_table(sol, du, case.length_unit)
        out.append("<h3>3.2 Loads by part</h3>")
        if parts.rows:
            out.append(table_html(parts.header, parts.rows))
            note = ("fz positive up; down = −fz (negative: lifted)." if s.is_axisymmetric else
                    "fx positive to the right (a part on both sides nets out); fz positive "
                    "up; down = −fz (negative: lifted).")
            out.append(f'<p class="note">{escape(note)}</p>')
        else:
            out.append("<p>No loaded parts.</p>")
        out.append("<h3>3.3 Uplift check</h3>")
        up = uplift_table(case, du, sol)
        if up.rows:
            out.append(table_html(up.header, up.rows, verdict_col=len(up.header) - 1,
                                   align=["left"] + ["right"] * (len(up.header) - 2)
                                   + ["center"]))
            verdicts = "; ".join(
                f"{r[0]}: {r[-1]} (worst factor {format_number(r[6])} against "
                f"{format_number(case.required_uplift_factor)} required)" for r in up.rows)
            out.append(f"<p><b>{escape(verdicts)}</b></p>")
            required = format_number(case.required_uplift_factor)
            out.append(f'<p class="note">Required factor {escape(required)}'
                       f": {escape(self._factor_source())}. The verdict is taken at the worst "
                       f"level. {escape(UPLIFT_CAUTION)}</p>")
        else:
            lifted = [f"{name} ({self.force(-p.down)})" for name, p in sol.parts.items()
                      if p.down < 0]
            text = "No resistance entered, so no part is checked."
            if lifted:
                text += " Parts lifted at this level: " + ", ".join(lifted) + "."
            out.append(f"<p>{escape(text)}</p>")
        return "".join(out)

    def _multi_results(self):
        out = ["<h2>3 Results</h2>",
               f"<p>Forces {escape(self.force_scope())}. Each case gives its characteristic "
               "values (the loads as computed) beside its design values (times the case's "
               "load factor)"
               + ("; the envelope over all cases is in design values" if len(self.solved) > 1
                  else "") + ".</p>"]
        n = len(self.solved)
        for k, sc in enumerate(self.solved, start=1):
            out.append(self._case_results(k, sc))
        if n > 1:  # the envelope of one case is that case
            out.append(self._envelope_html(n + 1))
        return "".join(out)

    def _case_results(self, k, sc):
        du, lu = self.du, self.case.length_unit
        sol, gamma = sc.solution, sc.load_factor
        scope, scale = self.scope, force_scale(sol)
        out = [f"<h3>3.{k} Case {escape(sc.name)} "
               f"(load factor {escape(format_number(gamma))})</h3>"]
        loads = {"fluid weight", "floor force", "support reaction", "max pressure"}
        rows = []
        for name, value, unit, note in totals_table(sol, du, lu).rows:
            design = value * gamma if name in loads and value is not None else None
            rows.append((name, with_note(value, note), "-" if design is None
                         else cell_text(design), unit))
        out.append(table_html(("quantity", "characteristic", "design", "unit"), rows,
                               align=["left", "right", "right", "left"],
                               widths=[34, 24, 24, 18]))
        out.append(self._layers_and_pockets_html(sc))
        parts = parts_table(sol, du, lu)
        if parts.rows:
            F = scope.label
            prow = [(r[0], r[1], r[2], r[3], None if r[3] is None else r[3] * gamma, r[4])
                    for r in parts.rows]
            out.append(table_html(("part", f"fx [{F}]", f"fz [{F}]", f"down [{F}]",
                                    f"design down [{F}]", "note"), prow))
        up = uplift_table(sc.resolved.case, du, sol)
        if up.rows:
            out.append(table_html(up.header, up.rows, verdict_col=len(up.header) - 1,
                                   align=["left"] + ["right"] * (len(up.header) - 2)
                                   + ["center"]))
        st = sc.structure
        if st is not None:
            fl = st.flotation
            r_text = (f"self-weight {scope.text(st.self_weight, scale=scale)} + extra "
                      f"{scope.text(st.extra_weight, scale=scale)} + soil "
                      f"{scope.text(st.soil_weight, scale=scale)} + anchorage "
                      f"{scope.text(st.anchorage, scale=scale)}")
            design_factor = (None if fl.factor is None or not fl.uplift > 0
                             else fl.resistance / (gamma * fl.uplift))
            verdict = ("OK" if design_factor is None or design_factor >= fl.required
                       else "NOT OK")
            out.append(table_html(
                ("flotation", f"uplift U [{scope.label}]", f"resistance R [{scope.label}]",
                 "factor R / U", "design R / (γ U)", "required", "verdict"),
                [("whole structure", scope.to_display(fl.uplift),
                  scope.to_display(fl.resistance), fl.factor, design_factor, fl.required,
                  verdict)],
                verdict_col=6, align=["left"] + ["right"] * 5 + ["center"]))
            out.append(f'<p class="note">R = {escape(r_text)}; the liquid inside is not counted. '
                       "No factor where nothing lifts the structure.</p>")
            top = st.base_net_max
            if top is not None:
                P = du.label("pressure")
                x, z = (format_entered(v) for v in du.to_display(np.array(top.point),
                                                                     "length"))
                out.append(table_html(
                    ("base slab", f"net upward [{P}]", f"design [{P}]", "floor edge",
                     f"at (x, z) [{du.label('length')}]"),
                    [("groundwater - liquid", du.to_display(top.net, "pressure"),
                      du.to_display(gamma * top.net, "pressure"), top.index, f"{x}, {z}")],
                    align=["left", "right", "right", "right", "right"]))
        return "".join(out)

    def _layers_and_pockets_html(self, sc):
        """A case's volume and weight per layer (top first, as in the tank)
        and each pocket of trapped air: its lip, the air it sealed there,
        the compressed interface, the air now and its pressure."""
        du, sol, gamma = self.du, sc.solution, sc.load_factor
        scope = self.scope
        L, V, P = (du.label(q) for q in ("length", "volume", "pressure"))
        F = scope.label
        out = []
        layers = list(sol.layers)
        if len(layers) > 1:
            rows = [(k + 1, ly.name, float(du.to_display(ly.bottom, "length")),
                     float(du.to_display(ly.top, "length")),
                     du.to_display(ly.volume, "volume"), scope.to_display(ly.weight),
                     scope.to_display(gamma * ly.weight))
                    for k, ly in reversed(list(enumerate(layers)))]
            out.append(table_html(("layer", "liquid", f"bottom [{L}]", f"top [{L}]",
                                    f"volume [{V}]", f"weight [{F}]", f"design weight [{F}]"),
                                   rows, align=["right", "left"] + ["right"] * 5))
        if sol.pocket_mode == "trapped":
            if not sol.pockets:
                out.append('<p class="note">Air trapped under ceilings: no pocket is sealed '
                           "at this level.</p>")
            else:
                atm, gas = sol.atmospheric_pressure, sol.gas_pressure
                rows = []
                for k, pk in enumerate(sol.pockets, start=1):
                    # Boyle: (p_atm + p_gas) V0 = (p_atm + p(z_i)) V(z_i).
                    v0 = (None if pk.split_at is not None or not atm + gas > 0
                          else (atm + pk.air_pressure) * pk.air_volume / (atm + gas))
                    rows.append((k, float(du.to_display(pk.sealed_at, "length")),
                                 None if v0 is None else du.to_display(v0, "volume"),
                                 float(du.to_display(pk.interface, "length")),
                                 du.to_display(pk.air_volume, "volume"),
                                 du.to_display(pk.air_pressure, "pressure")))
                out.append(table_html(("pocket", f"lip, sealed at [{L}]",
                                        f"air sealed [{V}]", f"interface [{L}]",
                                        f"air now [{V}]", f"air pressure [{P}]"), rows,
                                       align=["right"] * 6))
                out.append('<p class="note">Trapped air: the air sealed at the lip, compressed '
                           "isothermally to the interface where its pressure equals the "
                           "liquid's; its pressure acts on the pocket's ceiling and walls. Air "
                           "sealed is not given for a pocket whose air divided at a saddle."
                           "</p>")
        return "".join(out)

    def _envelope_html(self, k):
        env, du = self.envelope, self.du
        scope = self.scope
        F = scope.label
        scale = max(force_scale(sc.solution) for sc in self.solved)
        out = [f"<h3>3.{k} Envelope of the {len(self.solved)} cases (design values)</h3>"]
        rows = [(name, scope.to_display(0.0 if abs(e.max_down) < 1e-12 * scale
                                        else e.max_down), e.max_down_case or "-",
                 scope.to_display(0.0 if abs(e.max_up) < 1e-12 * scale else e.max_up),
                 e.max_up_case or "-") for name, e in env.parts.items()]
        out.append(table_html(("part", f"largest down [{F}]", "governing case",
                                f"largest uplift [{F}]", "governing case"), rows,
                               align=["left", "right", "left", "right", "left"]))
        i = int(np.argmax(env.edge_max_pressure)) if env.edge_max_pressure.size else None
        lines = []
        if i is not None:
            pmax, case = env.edge(i)
            lines.append(("Largest pressure", f"{escape(du.text(pmax, 'pressure'))} on edge {i}"
                          + (f", case {escape(case)}" if case else "")))
        fl = env.flotation
        if fl is not None:
            if fl.factor is None:
                lines.append(("Flotation", "no case lifts the structure: <b>OK</b>"))
            else:
                colour = OK_COLOUR if fl.ok else NOT_OK_COLOUR
                lines.append(("Lowest flotation factor",
                              f"<b>{escape(format_number(fl.factor))}</b> in case "
                              f"{escape(fl.case)} "
                              f"against {escape(format_number(fl.required))} required: "
                              f'<b><span style="color: {colour};">'
                              f"{'OK' if fl.ok else 'NOT OK'}</span></b>"))
        b = env.base
        if b is not None:
            if b.case is None:
                lines.append(("Base slab", "never lifted (net upward pressure 0)"))
            else:
                x, z = (format_entered(v) for v in du.to_display(np.array(b.point), "length"))
                lines.append(("Governing base pressure",
                              f"<b>{escape(du.text(b.net_upward_pressure, 'pressure'))}</b> net "
                              f"upward, case {escape(b.case)}, floor edge {b.index} at ({x}, {z}) "
                              f"{escape(du.label('length'))}"))
        if lines:
            out.append(kv_html(lines))
        return "".join(out)
