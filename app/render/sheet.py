"""The calculation sheet: one design case as a PDF for a calculation package.

:func:`write_report` is the whole feature, headless (``wetline report``) and
for the desktop program's menu. The sheet holds

1. inputs: the section (kind, width, outline with its vertices in the
   display length unit), the liquid with its density and the source of that
   value, gravity, the fill and how it was given, the uplift inputs;
2. the method: the formulas in plain notation, with the references;
3. results: totals, loads by part, the uplift check with its verdicts, the
   required factor and where its default comes from;
4. warnings, assumptions and cautions;
5. figures: the pressure diagram (:class:`wetline.app.render.scene.DiagramScene`) and
   the loads-against-level chart (:mod:`wetline.app.render.level_chart`), both
   painted as vectors;
6. the per-edge results: pressures, forces and centres of pressure (plane)
   or hoop forces (axisymmetric), one row per edge, as long as it needs to be.

Every table comes from :mod:`wetline.core.report_tables` and every number is written
with the one formatter, :func:`wetline.core.numbers.format_number`, so the sheet,
``wetline solve`` and the window print the same values; forces are shown as
:func:`wetline.core.force_scope.force_scope` says.

How the pages are made: the text of sections 1-4 and of section 6 is laid
out by two :class:`QTextDocument` objects whose page size is the body area of
an A4 page at 300 dpi (so their own pagination keeps table rows whole and
repeats table headers, from ``<thead>``); section 5 is one painted page.
With every page count known, each page is painted with :class:`QPainter` on
a :class:`QPdfWriter`: a header (project, section, job reference, prepared
by, date, "Page n of m"), the slice of a document that falls on that page
(translated and clipped) or the figures, and a footer. Qt embeds subsets of
the (DejaVu) fonts, so the text is extractable. The file is written
atomically.
"""

from __future__ import annotations

import html

import numpy as np
from PySide6.QtCore import QBuffer, QByteArray, QIODevice, QLineF, QMarginsF, QRectF, QSizeF, Qt
from PySide6.QtGui import (
    QColor,
    QFontMetricsF,
    QPageLayout,
    QPageSize,
    QPainter,
    QPdfWriter,
    QPen,
    QTextDocument,
)

from wetline.app.render.level_chart import paint_level_chart
from wetline.app.render.output import (
    ExportError,
    check_level,
    date_text,
    ensure_app,
    program_name,
    write_output,
)
from wetline.app.render.scene import DiagramScene
from wetline.app.render.style import INK, MUTED, NOT_OK_COLOUR, OK_COLOUR, RULE, point_font
from wetline.core.case import REVISION_KEYS
from wetline.core.force_scope import force_scale, force_scope, resistance_quantity
from wetline.core.load_cases import envelope
from wetline.core.numbers import (
    DEFAULT_DIGITS,
    Entered,
    figures,
    format_entered,
    format_number,
    using_figures,
)
from wetline.core.report_tables import (
    cell_text,
    edges_table,
    parts_table,
    totals_table,
    uplift_table,
    with_note,
)
from wetline.core.results import ASSUMPTIONS, CAUTION
from wetline.core.units import display_units
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, REQUIRED_FACTOR_SOURCE, UPLIFT_CAUTION

__all__ = ["DPI", "ReportError", "write_report", "report_pdf_bytes"]

DPI = 300
"""Resolution of the PDF's painting coordinates [dots per inch]."""

MAX_OUTLINE_ROWS = 80
"""Outlines with more vertices are listed only with the per-edge results."""

_EDGE_PT = 7.2  # font size of the per-edge table [pt] (no text on the sheet is smaller)
_MM = DPI / 25.4  # device units per millimetre
_PAGE_W, _PAGE_H = 210.0, 297.0  # A4 portrait [mm]
_LEFT_MM, _RIGHT_MM = 18.0, 15.0
_TOP_MM, _HEADER_MM, _GAP_MM = 10.0, 19.0, 5.0
_FOOTER_MM, _BOTTOM_MM = 8.0, 9.0

HEAD_FILL = "#e9eef3"
"""Background of a table's header row."""
FORMULA_FILL = "#f4f6f8"
"""Background of the method's formulas."""


class ReportError(ExportError):
    """A calculation sheet that cannot be made or written (a ValueError)."""


# ------------------------------------------------------------------ text
def _e(text):
    return html.escape(str(text), quote=True)


_SHORT_TABLE = 5
"""Rows of a table too short to repeat its header on a new page."""


def _table_html(header, rows, *, align=None, cls="t", widths=None, verdict_col=None,
                repeat_header=True, padding=3):
    """An HTML table; numbers right-aligned, the header of a table of more
    than :data:`_SHORT_TABLE` rows repeated on each page it runs onto.

    Qt repeats a ``<thead>`` on the next page as soon as any of the table
    (its bottom border) runs over, even with every row on the first page:
    the lone header then lies over the next heading. A short table has no
    header to repeat."""
    n = len(header)
    rows = list(rows)
    repeat_header = repeat_header and len(rows) > _SHORT_TABLE
    align = align or (["left"] + ["right"] * (n - 1))
    out = [f'<table class="{cls}" width="100%" cellspacing="0" cellpadding="{padding}" border="1" '
           f'style="border-collapse: collapse; border-color: {RULE};">']
    head = "".join(
        f'<th align="{a}" bgcolor="{HEAD_FILL}"'
        + (f' width="{widths[k]:.2f}%"' if widths else "") + f">{_e(h)}</th>"
        for k, (h, a) in enumerate(zip(header, align, strict=True)))
    out.append(f"<thead><tr>{head}</tr></thead>" if repeat_header else f"<tr>{head}</tr>")
    for row in rows:
        cells = []
        for k, (v, a) in enumerate(zip(row, align, strict=True)):
            text = _e(cell_text(v))
            if verdict_col is not None and k == verdict_col:
                colour = OK_COLOUR if v == "OK" else NOT_OK_COLOUR
                text = f'<b><span style="color: {colour};">{text}</span></b>'
            cells.append(f'<td align="{a}">{text}</td>')
        out.append("<tr>" + "".join(cells) + "</tr>")
    out.append("</table>")
    return "".join(out)


def _kv_html(rows):
    """A two-column table of labels and values (no borders)."""
    out = ['<table class="kv" width="100%" cellspacing="0" cellpadding="2">']
    for label, value in rows:
        out.append(f'<tr><td width="27%" style="color: {MUTED};">{_e(label)}</td>'
                   f"<td>{value}</td></tr>")
    out.append("</table>")
    return "".join(out)


_CSS = f"""
body {{ color: {INK}; }}
h1 {{ font-size: 15pt; font-weight: bold; margin-top: 0px; margin-bottom: 2px; }}
h2 {{ font-size: 11pt; font-weight: bold; margin-top: 14px; margin-bottom: 4px;
      color: {INK}; }}
h3 {{ font-size: 9pt; font-weight: bold; margin-top: 9px; margin-bottom: 3px; }}
p {{ margin-top: 2px; margin-bottom: 4px; }}
p.note {{ color: {MUTED}; font-size: 7.5pt; }}
p.f {{ margin-left: 14px; margin-top: 1px; margin-bottom: 1px; }}
p.sub {{ color: {MUTED}; font-size: 9pt; margin-bottom: 6px; }}
table.t {{ font-size: 7.5pt; margin-top: 2px; margin-bottom: 4px; }}
table.e {{ font-size: {_EDGE_PT}pt; margin-top: 2px; }}
table.kv {{ font-size: 8.5pt; }}
th {{ font-weight: bold; }}
li {{ margin-bottom: 2px; }}
"""


# --------------------------------------------------------------- content
def _loads_at(design, solved, solution):
    """The structure's loads of ``solved``'s case with the liquid at
    ``solution`` (a sheet at a level of its own)."""
    from wetline.core.structure import exterior_loads

    r = solved.resolved
    return exterior_loads(design.structure, design.section, groundwater=r.groundwater,
                          ground=design.ground, liquid_solution=solution,
                          required_factor=design.required_factor, geometry=design.exterior)


def _replace_solved(solved, solution, structure):
    from wetline.core.load_cases import SolvedCase

    return SolvedCase(resolved=solved.resolved, solution=solution, structure=structure)


def _as_design(subject):
    """A :class:`wetline.core.load_cases.Design` of a Design or a Case."""
    from wetline.core.case import Case
    from wetline.core.load_cases import Design

    if isinstance(subject, Design):
        return subject
    if isinstance(subject, Case):
        return Design(subject)
    raise TypeError(f"a calculation sheet is of a Design or a Case, not {type(subject).__name__}")


class _Sheet:
    """The content of one calculation sheet, as HTML and figure data.

    ``design`` is a :class:`wetline.core.load_cases.Design`: a file without
    load cases and without a structure gives the sheet of one case, as
    before; with cases (or a structure) the sheet also has the load-case
    table, each case's results with characteristic and design values side
    by side, the structure and flotation, and the envelope.
    """

    def __init__(self, design, level, units, date):
        self.design = design
        self.file_case = design.case
        self.multi = bool(design.cases) or design.structure is not None
        if level is not None and design.cases:
            raise ReportError("a level for the sheet is for a file without load cases; "
                              "the cases give their own levels")
        self.solved = design.solve_all()
        first = self.solved[0]
        self.case = first.resolved.case  # the first case's liquid and fill, as numbers
        self.sol = self.case.solve(level) if level is not None else first.solution
        self.structure = first.structure
        if level is not None and design.structure is not None:
            self.structure = _loads_at(design, first, self.sol)
            self.solved = (_replace_solved(first, self.sol, self.structure),)
        self.case_name = first.name if design.cases else None
        self.level_given = level is not None
        self.du = display_units(units)
        self.date = date_text(date)
        self.section = self.sol.section
        self.scope = force_scope(self.section, self.du, self.case.length_unit)
        self.force_scale = force_scale(self.sol)
        self.envelope = envelope(self.solved) if self.multi else None

    # ------------------------------------------------------------ units
    def length(self, m):
        return self.du.text(m, "length")

    def force(self, n):
        return self.scope.text(n, scale=self.force_scale)

    def force_scope(self):
        """For which width the forces are, in words."""
        return self.scope.words

    def unit_weight(self, n_m3):
        """A unit weight [N/m3] as entered: kN/m3 (and lbf/ft3 in US units)."""
        text = f"{format_entered(n_m3 / 1000.0)} kN/m3"
        if self.du.name == "us":
            per = self.du.factor("force") / self.du.factor("volume")
            text += f" ({format_number(n_m3 / per, 5)} lbf/ft3)"
        return text

    def pressure(self, pa):
        return self.du.text(pa, "pressure")

    def title(self):
        s = self.section
        name = s.name.strip() or "Untitled section"
        kind = ("axisymmetric section" if s.is_axisymmetric else "plane section")
        if self.design.cases:
            what = (f"in {len(self.solved)} load cases and their envelope"
                    if len(self.solved) > 1 else
                    f"in the load case {_e(self.solved[0].name)}")
        else:
            what = f"at a liquid level of {_e(self.length(self.sol.level))}"
        return (f"<h1>Hydrostatic loads: {_e(name)}</h1>"
                f'<p class="sub">Calculation sheet for a {kind} {what}; forces '
                f"{_e(self.force_scope())}.</p>" + self.document_control()
                + (self._cases_inputs() if self.multi else ""))

    def document_control(self):
        """The sheet's reference, revision, sign-off, revision history and
        the precision of its numbers."""
        info = self.file_case.report
        rows = [("Calculation reference", _e(info.calculation_reference or "-")),
                ("Revision", f"<b>{_e(info.current_revision or '-')}</b>"),
                ("Prepared by", _e(info.prepared_by or "-")),
                ("Checked by", _e(info.checked_by or "-")),
                ("Approved by", _e(info.approved_by or "-"))]
        out = ["<h2>Document control</h2>", _kv_html(rows), "<h3>Revision history</h3>"]
        if info.revisions:
            out.append(_table_html(
                ("revision", "date", "description", "prepared", "checked", "approved"),
                [tuple(getattr(r, k) or "-" for k in REVISION_KEYS) for r in info.revisions],
                align=["left"] * 6, widths=[10, 13, 41, 12, 12, 12]))
        else:
            out.append('<p class="note">No revision recorded.</p>')
        out.append(f'<p class="note">{_e(self.precision_text())}</p>')
        return "".join(out)

    @staticmethod
    def precision_text():
        """The precision policy, in words, as the sheet follows it."""
        n = figures()
        default = " (the program's default)" if n == DEFAULT_DIGITS else " (set for this document)"
        return (f"Numbers: results to {n} significant figures{default}; coordinates, "
                "dimensions and levels as entered (points drawn with the mouse rounded to "
                "the snap spacing); inputs echoed with the figures that identify them. The "
                "same numbers appear in the program, its command-line tables and this sheet; "
                "CSV files carry full precision.")

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
                            f"{_e(', '.join(st.part_names))}"),
                ("Unit weight", _e(self.unit_weight(st.unit_weight))),
                ("Self-weight", _e(self.force(loads.self_weight)) + " (between the outlines)"),
                ("Extra weight", _e(du.text(st.extra_weight, q)) + f" ({per})"),
                ("Anchorage", _e(du.text(st.anchorage, q)) + f" ({per})")]
        g = d.ground
        if g is not None:
            rows += [("Ground surface", _e(self.length(g.level))),
                     ("Soil unit weight", _e(f"dry {self.unit_weight(g.unit_weight_dry)}, "
                                        f"saturated {self.unit_weight(g.unit_weight_saturated)}"))]
        out = ["<h3>1.5 Structure and ground</h3>", _kv_html(rows)]
        pts = du.to_display(st.outline, "length")
        if st.n_edges <= MAX_OUTLINE_ROWS:
            xl = "r" if self.section.is_axisymmetric else "x"
            out.append(_table_html(("outer vertex", f"{xl} [{L}]", f"z [{L}]", "edge i part"),
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

    def _uses_full_law(self):
        """True if a case has layers, a gas or trapped air, or the section can
        trap air (the sheet then states the law and its inputs)."""
        return any(sc.resolved.is_layered or sc.resolved.gas_pressure != 0.0
                   or sc.resolved.pockets == "trapped" for sc in self.solved) \
            or self.section.pocket_tree.may_trap

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
            out.append(_table_html(("case", "layer", "liquid", "density [kg/m3]",
                                    "source of the density", "top"), layer_rows,
                                   align=["left", "right", "left", "right", "left", "left"],
                                   widths=[16, 7, 17, 10, 30, 20]))
        out.append(_table_html(("case", "gas pressure (gauge)", "air under ceilings",
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
                + _table_html(header, rows, align=["left", "left", "right", "right", "right"],
                              widths=[24, 30, 18, 16, 12]))

    def _section_inputs(self):
        s, du, case = self.section, self.du, self.case
        L = du.label("length")
        out = ["<h3>1.1 Section</h3>"]
        if s.is_axisymmetric:
            geometry = ("axisymmetric: the outline is a half-section revolved about the "
                        "axis x = 0 (x is the radius); forces over the full circumference")
        else:
            geometry = (f"plane: the outline is a cross-section {_e(self.length(s.width))} "
                        f"wide out of the drawing; forces {_e(self.force_scope())}")
        pts = du.to_display(s.outline, "length")
        parts = ", ".join(s.part_names)
        top = (f"spill level {_e(self.length(s.spill_level))} (open section)" if s.is_open
               else f"roof at {_e(self.length(s.z_max))} (closed section)")
        rows = [("Name", _e(s.name.strip() or "untitled")),
                ("Geometry", geometry),
                ("Outline", f"{s.n_edges} vertices and {s.n_edges} edges; coordinates "
                            f"below in {_e(L)} (the file gives them in "
                            f"{_e(case.length_unit)})"),
                ("Extent", f"x from {format_number(pts[:, 0].min())} to "
                           f"{format_number(pts[:, 0].max())} {_e(L)}, z from "
                           f"{format_number(pts[:, 1].min())} to "
                           f"{format_number(pts[:, 1].max())} {_e(L)}"),
                ("Parts", _e(parts)),
                ("Top", top)]
        out.append(_kv_html(rows))
        if s.n_edges <= MAX_OUTLINE_ROWS:
            out.append('<p class="note">Outline: vertex i and the part of edge i, which runs '
                       "from vertex i to vertex i + 1 (the last edge closes the outline). "
                       "x to the right, z up.</p>")
            xl = "r" if s.is_axisymmetric else "x"
            header = ("vertex", f"{xl} [{L}]", f"z [{L}]", "edge i part")
            rows = [(i, float(pts[i, 0]), float(pts[i, 1]), s.parts[i])
                    for i in range(s.n_edges)]
            out.append(_table_html(header, rows, align=["right", "right", "right", "left"],
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
        out.append(_kv_html([("Liquid", _e(liq.name)), ("Density", _e(density)),
                             ("Source of the density", _e(liq.source)),
                             ("Gravity", _e(gravity))]))
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
        rows.append(("Fill", _e(how)))
        rows.append(("Requested level", _e(self.length(sol.requested_level))))
        level = self.length(sol.level)
        if sol.level != sol.requested_level:
            level += ", capped at the spill level"
        rows.append(("Level used", f"<b>{_e(level)}</b>"))
        if sol.head_above_top > 0:
            rows.append(("Head above the roof", _e(self.length(sol.head_above_top)) +
                         " (the closed section is full under a standpipe head)"))
        rows.append(("Liquid volume", _e(du.text(sol.volume, "volume"))))
        out.append(_kv_html(rows))
        return "".join(out)

    def _uplift_inputs(self):
        s, du, case = self.section, self.du, self.case
        out = ["<h3>1.4 Uplift check inputs</h3>"]
        rows = [("Required factor", f"<b>{_e(format_number(case.required_uplift_factor))}</b>"),
                ("Source", _e(self._factor_source()))]
        out.append(_kv_html(rows))
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
            out.append(_table_html(header, rows))
        else:
            out.append('<p class="note">No self-weight or holding-down resistance entered: '
                       "no part is checked against uplift.</p>")
        return "".join(out)

    def method(self):
        s = self.section
        rows = [("Pressure", "<b>p = ρ g (h − z)</b> at or below the free surface "
                             "(z ≤ h); p = 0 above it")]
        if s.is_axisymmetric:
            rows += [
                ("Vertical force on an edge",
                 "<b>F<sub>z</sub> = 2π n<sub>z</sub> ∫ p r ds</b> = 2π n<sub>z</sub> ρ g L f "
                 "[(2a₀ + a₁) r<sub>a</sub> + (a₀ + 2a₁) r<sub>b</sub>] / 6, over the full "
                 "revolution; r<sub>a</sub>, r<sub>b</sub> the radii at the ends of the wetted "
                 "part, n<sub>z</sub> the vertical component of the outward unit normal; the "
                 "horizontal forces cancel over the revolution"),
                ("Hoop force", "<b>N = p r / cos α</b> at each end of an edge, α the edge's "
                               "angle from the vertical (membrane theory; not defined on "
                               "horizontal edges)"),
                ("Volume", "<b>V = π ∮ x² dz</b> (Green's theorem over the outline clipped "
                           "at the free surface)"),
            ]
        else:
            rows += [
                ("Force on an edge", "<b>F = w L f p̄ n</b>, p̄ = ρ g (a₀ + a₁) / 2 the mean "
                                     "pressure over the wetted length, n the outward unit "
                                     "normal, w the section's width"),
                ("Centre of pressure", "at the centroid of the trapezoidal pressure diagram: "
                                       "<b>t = t<sub>a</sub> + f (a₀ + 2a₁) / (3 (a₀ + a₁))</b> "
                                       "along the edge, t<sub>a</sub> = 1 − f on edges that "
                                       "fall, else 0"),
                ("Volume", "<b>V = w ∮ x dz</b> (Green's theorem over the outline clipped at "
                           "the free surface)"),
            ]
        rows += [
            ("Weight and totals", "<b>W = ρ g V</b>; a part's downward load <b>down = −Σ "
                                  "F<sub>z</sub></b> over its edges (negative: lifted); floor "
                                  "force: down on the part named floor; support reaction: down "
                                  "on all other wetted parts; check: floor force + support "
                                  "reaction = W (computed independently, not assumed)"),
        ]
        if self.design.structure is not None:
            rows += [
                ("Groundwater", "<b>p = ρ<sub>w</sub> g (z<sub>w</sub> − z)</b> on the outer "
                                "face below the groundwater level z<sub>w</sub>; its upward sum "
                                "is the buoyancy ρ<sub>w</sub> g V<sub>submerged</sub> "
                                "(Archimedes)"),
                ("Flotation", "<b>factor = R / U</b>, R = self-weight γ<sub>c</sub> × (area or "
                              "volume between the outlines) + extra weight + soil on the "
                              "ledges + anchorage, U the upward groundwater force; design: "
                              "R / (γ<sub>F</sub> U), γ<sub>F</sub> the case's load factor"),
                ("Base slab", "net upward pressure = groundwater pressure under the base − "
                              "liquid pressure on the floor above it, the largest along each "
                              "floor edge"),
            ]
        if self.multi and self._uses_full_law():
            rows += [
                ("Layers", "<b>p(z) = p<sub>gas</sub> + g ∫<sub>z</sub><sup>h</sup> ρ(s) ds</b> "
                           "with the densities of the immiscible layers (densest at the "
                           "bottom): linear within each layer, with a kink at each interface; "
                           "each edge is split at the interfaces, so every integral stays "
                           "exact; each layer's volume V<sub>k</sub> and weight ρ<sub>k</sub> "
                           "g V<sub>k</sub>, the liquid weight their sum"),
                ("Gas over the surface", "a uniform gauge pressure p<sub>gas</sub> (closed "
                                         "sections; down to a full vacuum) adds to every "
                                         "wetted point and loads the dry walls and roof of "
                                         "the gas space; its net force on the closed cavity "
                                         "is zero, so floor force + support reaction = W "
                                         "still holds"),
                ("Trapped air", "<b>(p<sub>atm</sub> + p<sub>gas</sub>) V<sub>0</sub> = "
                                "(p<sub>atm</sub> + p(z<sub>i</sub>)) V(z<sub>i</sub>)</b> "
                                "(Boyle's law, isothermal): V<sub>0</sub> the air above the lip "
                                "when the rising liquid sealed it, z<sub>i</sub> the compressed "
                                "interface, V(z<sub>i</sub>) the pocket's volume above it, "
                                "solved exactly; the pocket's ceiling and dry walls carry "
                                "p(z<sub>i</sub>); air is weightless. With trapped air the "
                                "worst uplift level is searched under both assumptions"),
            ]
        rows += [
            ("Uplift", "<b>factor = (G + R) / U</b>, U the upward load of the liquid on the "
                       "part, G its self-weight, R the holding-down resistance; at the current "
                       "level and at the worst level of the fill range (empty to the spill "
                       "level; for a closed section to the roof, or to the level if higher); "
                       "it must reach the required factor"),
        ]
        out = ["<h2>2 Method</h2>",
               ("<p>Hydrostatics of liquids at rest (one, or immiscible layers), gauge "
                "pressure (atmosphere = 0). " if self.multi and self._uses_full_law() else
                "<p>Hydrostatics of one liquid at rest, gauge pressure (atmosphere = 0). ") +
               "Each edge is straight, so the pressure varies linearly along its wetted part "
               "and every integral is evaluated exactly in closed form. Symbols: ρ density, "
               "g gravity, h level of the free surface, z height (up), L edge length, f "
               "wetted fraction of the edge, a₀ and a₁ depths of the edge's ends below the "
               "free surface (0 where dry).</p>",
               f'<table width="100%" cellspacing="0" cellpadding="4" bgcolor="{FORMULA_FILL}" '
               f'style="border-collapse: collapse;">']
        for label, formula in rows:
            out.append(f'<tr><td width="22%" bgcolor="{FORMULA_FILL}" '
                       f'style="color: {MUTED};">{_e(label)}</td>'
                       f'<td bgcolor="{FORMULA_FILL}">{formula}</td></tr>')
        out.append("</table>")
        out.append('<p class="note">References: Çengel &amp; Cimbala, <i>Fluid Mechanics</i>, '
                   "sec. 3-1 to 3-4; Munson, Young &amp; Okiishi, <i>Fundamentals of Fluid "
                   "Mechanics</i>, sec. 2.3 and 2.8 (pressure on plane and curved surfaces); "
                   "membrane theory of shells of revolution: Timoshenko &amp; "
                   "Woinowsky-Krieger, <i>Theory of Plates and Shells</i>; uplift limit "
                   "state: EN 1997-1 (Eurocode 7), 2.4.7.4.</p>")
        return "".join(out)

    def results(self):
        return self._multi_results() if self.multi else self._single_results()

    def _single_results(self):
        s, sol, du, case = self.section, self.sol, self.du, self.case
        out = ["<h2>3 Results</h2>",
               f"<h3>3.1 Totals</h3><p>Forces {_e(self.force_scope())}.</p>"]
        rows = [(name, with_note(value, note), unit)
                for name, value, unit, note in totals_table(sol, du, case.length_unit).rows]
        out.append(_table_html(("quantity", "value", "unit"), rows,
                               align=["left", "right", "left"], widths=[40, 30, 30]))
        out.append(f'<p class="note">Check: floor force + support reaction = '
                   f"{_e(self.force(sol.floor_force))} + ({_e(self.force(sol.support_reaction))}) "
                   f"= {_e(self.force(sol.floor_force + sol.support_reaction))}; liquid weight "
                   f"ρ g V = {_e(self.force(sol.fluid_weight))}.</p>")
        parts = parts_table(sol, du, case.length_unit)
        out.append("<h3>3.2 Loads by part</h3>")
        if parts.rows:
            out.append(_table_html(parts.header, parts.rows))
            note = ("fz positive up; down = −fz (negative: lifted)." if s.is_axisymmetric else
                    "fx positive to the right (a part on both sides nets out); fz positive "
                    "up; down = −fz (negative: lifted).")
            out.append(f'<p class="note">{_e(note)}</p>')
        else:
            out.append("<p>No loaded parts.</p>")
        out.append("<h3>3.3 Uplift check</h3>")
        up = uplift_table(case, du, sol)
        if up.rows:
            out.append(_table_html(up.header, up.rows, verdict_col=len(up.header) - 1,
                                   align=["left"] + ["right"] * (len(up.header) - 2)
                                   + ["center"]))
            verdicts = "; ".join(
                f"{r[0]}: {r[-1]} (worst factor {format_number(r[6])} against "
                f"{format_number(case.required_uplift_factor)} required)" for r in up.rows)
            out.append(f"<p><b>{_e(verdicts)}</b></p>")
            required = format_number(case.required_uplift_factor)
            out.append(f'<p class="note">Required factor {_e(required)}'
                       f": {_e(self._factor_source())}. The verdict is taken at the worst "
                       f"level. {_e(UPLIFT_CAUTION)}</p>")
        else:
            lifted = [f"{name} ({self.force(-p.down)})" for name, p in sol.parts.items()
                      if p.down < 0]
            text = "No resistance entered, so no part is checked."
            if lifted:
                text += " Parts lifted at this level: " + ", ".join(lifted) + "."
            out.append(f"<p>{_e(text)}</p>")
        return "".join(out)

    def _multi_results(self):
        out = ["<h2>3 Results</h2>",
               f"<p>Forces {_e(self.force_scope())}. Each case gives its characteristic "
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
        out = [f"<h3>3.{k} Case {_e(sc.name)} (load factor {_e(format_number(gamma))})</h3>"]
        loads = {"fluid weight", "floor force", "support reaction", "max pressure"}
        rows = []
        for name, value, unit, note in totals_table(sol, du, lu).rows:
            design = value * gamma if name in loads and value is not None else None
            rows.append((name, with_note(value, note), "-" if design is None
                         else cell_text(design), unit))
        out.append(_table_html(("quantity", "characteristic", "design", "unit"), rows,
                               align=["left", "right", "right", "left"],
                               widths=[34, 24, 24, 18]))
        out.append(self._layers_and_pockets_html(sc))
        parts = parts_table(sol, du, lu)
        if parts.rows:
            F = scope.label
            prow = [(r[0], r[1], r[2], r[3], None if r[3] is None else r[3] * gamma, r[4])
                    for r in parts.rows]
            out.append(_table_html(("part", f"fx [{F}]", f"fz [{F}]", f"down [{F}]",
                                    f"design down [{F}]", "note"), prow))
        up = uplift_table(sc.resolved.case, du, sol)
        if up.rows:
            out.append(_table_html(up.header, up.rows, verdict_col=len(up.header) - 1,
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
            out.append(_table_html(
                ("flotation", f"uplift U [{scope.label}]", f"resistance R [{scope.label}]",
                 "factor R / U", "design R / (γ U)", "required", "verdict"),
                [("whole structure", scope.to_display(fl.uplift),
                  scope.to_display(fl.resistance), fl.factor, design_factor, fl.required,
                  verdict)],
                verdict_col=6, align=["left"] + ["right"] * 5 + ["center"]))
            out.append(f'<p class="note">R = {_e(r_text)}; the liquid inside is not counted. '
                       "No factor where nothing lifts the structure.</p>")
            top = st.base_net_max
            if top is not None:
                P = du.label("pressure")
                x, z = (format_entered(v) for v in du.to_display(np.array(top.point),
                                                                     "length"))
                out.append(_table_html(
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
            out.append(_table_html(("layer", "liquid", f"bottom [{L}]", f"top [{L}]",
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
                out.append(_table_html(("pocket", f"lip, sealed at [{L}]",
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
        out.append(_table_html(("part", f"largest down [{F}]", "governing case",
                                f"largest uplift [{F}]", "governing case"), rows,
                               align=["left", "right", "left", "right", "left"]))
        i = int(np.argmax(env.edge_max_pressure)) if env.edge_max_pressure.size else None
        lines = []
        if i is not None:
            pmax, case = env.edge(i)
            lines.append(("Largest pressure", f"{_e(du.text(pmax, 'pressure'))} on edge {i}"
                          + (f", case {_e(case)}" if case else "")))
        fl = env.flotation
        if fl is not None:
            if fl.factor is None:
                lines.append(("Flotation", "no case lifts the structure: <b>OK</b>"))
            else:
                colour = OK_COLOUR if fl.ok else NOT_OK_COLOUR
                lines.append(("Lowest flotation factor",
                              f"<b>{_e(format_number(fl.factor))}</b> in case {_e(fl.case)} "
                              f"against {_e(format_number(fl.required))} required: "
                              f'<b><span style="color: {colour};">'
                              f"{'OK' if fl.ok else 'NOT OK'}</span></b>"))
        b = env.base
        if b is not None:
            if b.case is None:
                lines.append(("Base slab", "never lifted (net upward pressure 0)"))
            else:
                x, z = (format_entered(v) for v in du.to_display(np.array(b.point), "length"))
                lines.append(("Governing base pressure",
                              f"<b>{_e(du.text(b.net_upward_pressure, 'pressure'))}</b> net "
                              f"upward, case {_e(b.case)}, floor edge {b.index} at ({x}, {z}) "
                              f"{_e(du.label('length'))}"))
        if lines:
            out.append(_kv_html(lines))
        return "".join(out)

    def _factor_source(self):
        f = self.case.required_uplift_factor
        if f == DEFAULT_REQUIRED_FACTOR:
            return REQUIRED_FACTOR_SOURCE
        return f"given by the user (the program's {REQUIRED_FACTOR_SOURCE})"

    def notes(self):
        sol = self.sol
        out = ["<h2>4 Warnings, assumptions and cautions</h2>", "<h3>Warnings</h3>"]
        if self.multi:
            items = [f"case {sc.name}: {w}" for sc in self.solved for w in sc.warnings]
            out.append("<ul>" + "".join(f"<li>{_e(w)}</li>" for w in items) + "</ul>" if items
                       else "<p>None in any case.</p>")
        elif sol.warnings:
            out.append("<ul>" + "".join(f"<li>{_e(w)}</li>" for w in sol.warnings) + "</ul>")
        else:
            out.append("<p>None at this level.</p>")
        out.append("<h3>Assumptions</h3><ul>"
                   + "".join(f"<li>{_e(a)}</li>" for a in ASSUMPTIONS)
                   + "<li>forces are what the liquid exerts on the wall; x to the right, "
                     "z up</li>"
                   + ("<li>groundwater acts on the structure's outer face with p = ρ<sub>w</sub> "
                      "g (z<sub>w</sub> − z); soil stands on its ledges and roof (vertical "
                      "effective stress); <b>lateral earth pressure is not computed</b></li>"
                      if self.design.structure is not None else "")
                   + "</ul>")
        out.append("<h3>Cautions</h3>")
        out.append(f'<table width="100%" cellpadding="6" cellspacing="0" border="1" '
                   f'style="border-collapse: collapse; border-color: {NOT_OK_COLOUR};">'
                   f'<tr><td bgcolor="#fbeeee"><b>{_e(CAUTION)}</b><br/>'
                   f"{_e(UPLIFT_CAUTION)}</td></tr></table>")
        out.append('<p class="note">Figures (section 5) and the per-edge results '
                   "(section 6) follow.</p>")
        return "".join(out)

    def main_html(self):
        return (f"<html><head><style>{_CSS}</style></head><body>" + self.title()
                + self.inputs() + self.method() + self.results() + self.notes()
                + "</body></html>")

    def edges_html(self, writer, body):
        """Section 6: the per-edge table cut into one table per page.

        Qt lays out and paints a single long table in time that grows with
        its length on every page (minutes for thousands of rows), so the
        rows are split here: the height of a row and of the header is
        measured on a sample, each page gets the rows that fit and its own
        header, and each table after the first starts a new page. Should a
        row wrap and a table still run over, its ``<thead>`` repeats.
        """
        s, du = self.section, self.du
        t = edges_table(self.sol, du, self.case.length_unit)
        intro = ("<h2>6 Per-edge results</h2>"
                 f"<p>Edge i runs from vertex i to vertex i + 1; forces "
                 f"{_e(self.force_scope())}. Pressures at the edge's ends (0 where dry). ")
        if s.is_axisymmetric:
            intro += ("fz over the full revolution, positive up; hoop forces at the ends "
                      "(- on horizontal edges).</p>")
        else:
            intro += ("fx, fz: force of the liquid on the edge (x right, z up); cp: centre "
                      "of pressure (- on dry edges).</p>")
        # Headers wrap at the unit: "p start" over "[kPa]".
        header = [h.replace(" [", "\n[") for h in t.header]
        align = ["right", "left"] + ["right"] * (len(header) - 2)
        # Fixed column widths, from the longest entry of each column, so that
        # every page's table looks the same and every row has one height.
        fm = QFontMetricsF(point_font(_EDGE_PT), writer)
        fb = QFontMetricsF(point_font(_EDGE_PT, bold=True), writer)
        need = []
        for k, h in enumerate(header):
            texts = {cell_text(r[k]) for r in t.rows}
            need.append(max([fb.horizontalAdvance(w) for w in h.split()]
                            + [fm.horizontalAdvance(x) for x in texts]) + 2.5 * fm.height())
        widths = [100.0 * v / sum(need) for v in need]

        def table(rows, new_page=False):
            text = _table_html(header, rows, cls="e", align=align, widths=widths,
                               padding=2).replace("\n[", "<br/>[")
            if new_page:
                text = text.replace("<table ", '<table style="page-break-before: always;" ', 1)
            return text

        def page(content):
            return f"<html><head><style>{_CSS}</style></head><body>{content}</body></html>"

        rows = t.rows
        sample = sorted(rows, key=lambda r: -len(str(r[1])))[:10] or rows
        h_intro = _height(page(intro), writer, body)
        h1 = _height(page(intro + table(sample[:1])), writer, body)
        hn = _height(page(intro + table(sample)), writer, body)
        row_h = max((hn - h1) / max(len(sample) - 1, 1), 1.0)
        overhead = h1 - h_intro - row_h
        first = max(int((body.height() - h_intro - overhead) / row_h) - 1, 1)
        per_page = max(int((body.height() - overhead) / row_h) - 1, 1)
        parts = [intro, table(rows[:first])]
        for k in range(first, len(rows), per_page):
            parts.append(table(rows[k:k + per_page], new_page=True))
        return page("".join(parts))


def _height(html_text, writer, body):
    """Height of ``html_text`` laid out at the body's width, unpaginated."""
    doc = QTextDocument()
    doc.documentLayout().setPaintDevice(writer)
    doc.setDefaultFont(point_font(8.5))
    doc.setDocumentMargin(0)
    doc.setUseDesignMetrics(True)
    doc.setTextWidth(body.width())
    doc.setHtml(html_text)
    return doc.size().height()


# ----------------------------------------------------------------- pages
class _Pages:
    """Geometry of an A4 page in device units (1/300 inch), portrait or
    landscape (the per-edge table)."""

    def __init__(self, landscape=False):
        pw, ph = (_PAGE_H, _PAGE_W) if landscape else (_PAGE_W, _PAGE_H)
        self.landscape = landscape
        self.layout = QPageLayout(
            QPageSize(QPageSize.PageSizeId.A4),
            QPageLayout.Orientation.Landscape if landscape else QPageLayout.Orientation.Portrait,
            QMarginsF(0, 0, 0, 0))
        left, right = _LEFT_MM * _MM, (pw - _RIGHT_MM) * _MM
        self.header = QRectF(left, _TOP_MM * _MM, right - left, _HEADER_MM * _MM)
        top = (_TOP_MM + _HEADER_MM + _GAP_MM) * _MM
        bottom = (ph - _BOTTOM_MM - _FOOTER_MM - 2.0) * _MM
        self.body = QRectF(left, top, right - left, bottom - top)
        self.footer = QRectF(left, (ph - _BOTTOM_MM - _FOOTER_MM) * _MM, right - left,
                             _FOOTER_MM * _MM)


def _document(html_text, writer, body):
    doc = QTextDocument()
    doc.documentLayout().setPaintDevice(writer)
    doc.setDefaultFont(point_font(8.5))
    doc.setDocumentMargin(0)
    doc.setUseDesignMetrics(True)
    doc.setPageSize(QSizeF(body.width(), body.height()))
    doc.setHtml(html_text)
    return doc


def _header(p, rect, sheet, page, pages):
    case, s = sheet.case, sheet.section
    info = case.report
    lw = 0.25 * _MM
    label_font, value_font = point_font(7.2), point_font(8.0, bold=True)
    dev = p.device()
    lfm, vfm = QFontMetricsF(label_font, dev), QFontMetricsF(value_font, dev)
    title_h = 5.0 * _MM
    p.setFont(point_font(8.5, bold=True))
    p.setPen(QColor(INK))
    p.drawText(QRectF(rect.left(), rect.top(), rect.width(), title_h),
               Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter,
               "HYDROSTATIC LOAD CALCULATION")
    p.setFont(point_font(7.5))
    p.setPen(QColor(MUTED))
    p.drawText(QRectF(rect.left(), rect.top(), rect.width(), title_h),
               Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter, program_name())
    grid = QRectF(rect.left(), rect.top() + title_h, rect.width(), rect.height() - title_h)
    cells = [("Project", info.project or "-"), ("Job reference", info.job_reference or "-"),
             ("Calc. reference", info.calculation_reference or "-"),
             ("Revision", info.current_revision or "-"), ("Date", sheet.date),
             ("Section", s.name.strip() or "untitled"),
             ("Prepared by", info.prepared_by or "-"), ("Checked by", info.checked_by or "-"),
             ("Approved by", info.approved_by or "-"), ("Sheet", f"Page {page} of {pages}")]
    widths = [0.33, 0.16, 0.19, 0.16, 0.16]
    rh = grid.height() / 2
    pad = 1.4 * _MM
    p.setPen(QPen(QColor(INK), lw))
    p.setBrush(Qt.BrushStyle.NoBrush)
    p.drawRect(grid)
    x = grid.left()
    for col, w in enumerate(widths):
        cw = w * grid.width()
        for row in range(2):
            label, value = cells[row * len(widths) + col]
            r = QRectF(x, grid.top() + row * rh, cw, rh)
            p.setPen(QPen(QColor(RULE), lw))
            p.drawRect(r)
            p.setPen(QColor(MUTED))
            p.setFont(label_font)
            p.drawText(QRectF(r.left() + pad, r.top() + 0.6 * _MM, r.width() - 2 * pad,
                              lfm.height()), Qt.AlignmentFlag.AlignLeft, label.upper())
            p.setPen(QColor(INK))
            p.setFont(value_font)
            text = vfm.elidedText(value, Qt.TextElideMode.ElideRight, r.width() - 2 * pad)
            p.drawText(QRectF(r.left() + pad, r.bottom() - vfm.height() - 0.9 * _MM,
                              r.width() - 2 * pad, vfm.height()),
                       Qt.AlignmentFlag.AlignLeft, text)
        x += cw
    p.setPen(QPen(QColor(INK), 2 * lw))
    p.drawRect(grid)


def _footer(p, rect, sheet, page, pages):
    lw = 0.2 * _MM
    p.setPen(QPen(QColor(RULE), lw))
    p.drawLine(QLineF(rect.left(), rect.top(), rect.right(), rect.top()))
    p.setFont(point_font(7.2))
    p.setPen(QColor(MUTED))
    r = rect.adjusted(0, 1.2 * _MM, 0, 0)
    p.drawText(r, Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop,
               "Hydrostatic loads only; see the cautions in section 4. Verify against the "
               "governing code.")
    p.drawText(r, Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignTop,
               f"{sheet.date}  ·  page {page} of {pages}")


def _caption(p, body, y, title, note):
    """A figure's title and note at ``y``; returns the y below them."""
    f = 3.3 * _MM  # title height
    p.setPen(QColor(INK))
    p.setFont(point_font(8.5, bold=True))
    p.drawText(QRectF(body.left(), y, body.width(), f + _MM),
               Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop, title)
    p.setPen(QColor(MUTED))
    p.setFont(point_font(7.5))
    flags = int(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop) | int(
        Qt.TextFlag.TextWordWrap)
    r = p.boundingRect(QRectF(body.left(), y + f + 0.6 * _MM, body.width(), 20 * _MM), flags,
                       note)
    p.drawText(r, flags, note)
    return r.bottom() + 1.5 * _MM


_SKETCH_NOTE = ("The section with its vertex and edge numbers (as in every table), its "
                "dimensions and levels, and the gauge pressure on each wetted wall drawn "
                "outward from the wall; each part's total is labelled once, the runs of a part "
                "loaded on several runs by their edges; characteristic values to {n} "
                "significant figures, as in the tables.")


def _case_title(sheet, k, sc):
    if sheet.design.cases:
        return (f"Figure {k}. Case {sc.name}: sketch and pressure diagram (load factor "
                f"{format_number(sc.load_factor)})")
    return f"Figure {k}. Sketch and pressure diagram"


def _figures(p, body, sheet, units):
    """Section 5, first page: the sketch and pressure diagram of the first
    case over the whole page."""
    y = body.top()
    p.setPen(QColor(INK))
    p.setFont(point_font(11, bold=True))
    p.drawText(QRectF(body.left(), y, body.width(), 6 * _MM),
               Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop, "5 Figures")
    y += 8 * _MM
    first = sheet.solved[0]
    y = _caption(p, body, y, _case_title(sheet, 1, first), _SKETCH_NOTE.format(n=figures()))
    # The figure over the body, laid out in points (one unit of the scene is
    # 1 pt on the page), so its text is as large as it reads here.
    rect = QRectF(body.left(), y, body.width(), body.bottom() - y)
    _paint_figure(p, rect, sheet, units, sheet.case, sheet.sol, sheet.structure,
                  sheet.case_name)


def _chart_page(p, body, sheet, units, items):
    """Section 5, second page: the loads against level of the first case,
    then the sketch of the next case, if any (``items``)."""
    first = sheet.solved[0]
    what = f" (case {first.name})" if sheet.design.cases else ""
    y = _caption(p, body, body.top(), f"Figure 2. Loads against level{what}",
                 "Downward load on the floor and on the supports, the liquid weight and each "
                 "part's load as the free surface rises from empty (from the top interface "
                 "with layers); the current level is marked. Where the rising liquid can "
                 "trap air under a ceiling, the loads with the air trapped are drawn "
                 "dash-dot beside the vented ones.")
    bottom = body.top() + (0.42 if items else 0.6) * body.height()
    level = sheet.sol.level if sheet.level_given else None
    # The case's own law, both pocket assumptions where air can be trapped.
    chart_case = sheet.case if sheet.level_given else first.resolved.as_case()
    paint_level_chart(p, QRectF(body.left(), y + 1 * _MM, body.width(), bottom - y - _MM),
                      chart_case, level=level, units=units, font_px=8.2 / 72 * DPI)
    y = bottom + 6 * _MM
    for k, sc in items:
        y = _caption(p, body, y, _case_title(sheet, k, sc), _SKETCH_NOTE.format(n=figures()))
        _paint_figure(p, QRectF(body.left(), y, body.width(), body.bottom() - y), sheet, units,
                      sc.resolved.case, sc.solution, sc.structure, sc.name)


def _case_figures(p, body, sheet, units, items):
    """A further page of section 5: the sketches of one or two more cases,
    ``items`` (figure number, SolvedCase), each over its share of the page."""
    y = body.top()
    share = (body.bottom() - y) / len(items)
    for k, sc in items:
        top = y
        y = _caption(p, body, y, _case_title(sheet, k, sc), _SKETCH_NOTE.format(n=figures()))
        rect = QRectF(body.left(), y, body.width(), top + share - y - 4 * _MM)
        _paint_figure(p, rect, sheet, units, sc.resolved.case, sc.solution, sc.structure,
                      sc.name)
        y = top + share


FIGURE_FONT_PT = 8.7
"""Body text of the sheet's figures [pt]; their smallest text is 0.86 of it
(7.5 pt), never less than 7 pt at print size."""


MAX_CASE_FIGURES = 12
"""Cases drawn at most (the first this many); the tables give every case."""


def _paint_figure(p, rect, sheet, units, case, solution, structure=None, case_name=None):
    """The sketch and pressure diagram of ``solution`` into ``rect`` (device
    units of the PDF), at :data:`FIGURE_FONT_PT`."""
    pt = DPI / 72.0  # device units per point
    logical = (rect.width() / pt, rect.height() / pt)
    p.save()
    p.translate(rect.topLeft())
    p.scale(pt, pt)
    p.setClipRect(QRectF(0, 0, *logical))
    DiagramScene(case, solution, units, logical, sheet.date, structure=structure, figure=True,
                 font_px=FIGURE_FONT_PT, case_name=case_name).draw(p)
    p.restore()


def report_pdf_bytes(subject, *, level=None, units="si", date=None, progress=None, case=None):
    """The calculation sheet of ``subject`` as PDF bytes (see :func:`write_report`)."""
    level = check_level(level, ReportError)
    du = display_units(units)
    design = _as_design(subject)
    if case is not None:
        try:
            chosen = design.cases[design.index(case)] if design.cases else None
        except ValueError as exc:
            raise ReportError(str(exc)) from None
        if chosen is not None:
            design = design.with_cases([chosen])
    with using_figures(design.case.report.significant_figures):
        return _pdf(design, level, du, date, progress)


def _pdf(design, level, du, date, progress):
    ensure_app()
    steps = 4

    def tell(k, text):
        if progress is not None:
            progress(k, steps, text)

    tell(0, "solving")
    sheet = _Sheet(design, level, du.name, date)
    data = QByteArray()
    buffer = QBuffer(data)
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    writer = QPdfWriter(buffer)
    writer.setResolution(DPI)
    geo, wide = _Pages(), _Pages(landscape=True)
    writer.setPageLayout(geo.layout)
    name = design.section.name.strip() or "Untitled section"
    writer.setTitle(f"Hydrostatic loads: {name}")
    writer.setCreator(program_name())
    tell(1, "laying out the text")
    main = _document(sheet.main_html(), writer, geo.body)
    edges = _document(sheet.edges_html(writer, wide.body), writer, wide.body)
    n_main, n_edges = main.pageCount(), edges.pageCount()
    more = [(k, sc) for k, sc in enumerate(sheet.solved[1:MAX_CASE_FIGURES], start=3)]
    # Two cases a page; one where there is a structure: its drawing, its
    # dimension lines and its longer legend do not fit half a page.
    per = 1 if design.structure is not None else 2
    pairs = [more[k:k + per] for k in range(1, len(more), per)]
    total = n_main + 2 + len(pairs) + n_edges
    plan = ([("doc", main, k, geo) for k in range(n_main)] + [("figures", None, 0, geo)]
            + [("chart", more[:1], 0, geo)] + [("cases", pair, 0, geo) for pair in pairs]
            + [("doc", edges, k, wide) for k in range(n_edges)])
    tell(2, f"painting {total} pages")
    p = QPainter()
    if not p.begin(writer):
        raise ReportError("cannot start the PDF")
    try:
        p.setRenderHint(QPainter.RenderHint.Antialiasing, True)
        current = geo
        for number, (kind, doc, k, page) in enumerate(plan, start=1):
            if number > 1:
                if page is not current:
                    writer.setPageLayout(page.layout)  # applies from the next page
                    current = page
                writer.newPage()
            geo_ = page
            _header(p, geo_.header, sheet, number, total)
            if kind == "figures":
                _figures(p, geo_.body, sheet, du.name)
            elif kind == "chart":
                _chart_page(p, geo_.body, sheet, du.name, doc)
            elif kind == "cases":
                _case_figures(p, geo_.body, sheet, du.name, doc)
            else:
                body = geo_.body
                h = body.height()
                p.save()
                p.translate(body.left(), body.top() - k * h)
                doc.drawContents(p, QRectF(0, k * h, body.width(), h))
                p.restore()
            _footer(p, geo_.footer, sheet, number, total)
    finally:
        p.end()
    buffer.close()
    tell(3, "writing")
    return bytes(data.data())


def write_report(subject, path, *, level=None, units="si", date=None, progress=None,
                 case=None):
    """Write the calculation sheet of ``subject`` to a PDF file, atomically.

    Parameters
    ----------
    subject : wetline.core.load_cases.Design or wetline.core.case.Case
        Every design situation of a section file (a plain Case is
        ``Design(case)``: one case): the section, liquid, gravity, fill,
        uplift inputs, the structure and ground, the load cases, and the
        header, document control and precision policy
        (``design.case.report``). With load cases the sheet has the
        load-case table, every case's results (characteristic and design
        values) and sketch, and the envelope.
    path : str or os.PathLike
        The PDF to write; replaced if it exists.
    level : float, optional
        Free-surface height [m] for this sheet instead of the case's fill
        (a file without load cases only).
    units : str
        ``"si"`` (m, kPa, kN) or ``"us"`` (ft, psi, lbf).
    date : datetime.date or str, optional
        Date in the header; default today (ISO 8601).
    progress : callable, optional
        Called as ``progress(step, steps, text)`` as the work goes on
        (``step`` from 0 to ``steps - 1``), e.g. to move a progress bar.
    case : str, optional
        The sheet of this load case only (its name); default every case.

    Raises
    ------
    ReportError
        For a bad level (or a level with load cases), an unknown case, or a
        path that cannot be written (missing folder, a folder in the way, no
        permission, disk full); nothing is left behind. A ValueError, like
        every input error.
    core.units.UnitError
        For an unknown unit system.
    """
    write_output(path, "the PDF", lambda: report_pdf_bytes(
        subject, level=level, units=units, date=date, progress=progress, case=case),
        error=ReportError)
