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
from wetline.app.render.sheet_html import (
    EDGE_PT,
    FORMULA_FILL,
    SHEET_CSS,
    escape,
    kv_html,
    table_html,
)
from wetline.app.render.sheet_inputs import SheetInputs
from wetline.app.render.sheet_results import SheetResults
from wetline.app.render.style import INK, MUTED, NOT_OK_COLOUR, RULE, point_font
from wetline.core.case import REVISION_KEYS
from wetline.core.force_scope import force_scale, force_scope
from wetline.core.load_cases import envelope
from wetline.core.numbers import (
    DEFAULT_DIGITS,
    figures,
    format_entered,
    format_number,
    using_figures,
)
from wetline.core.report_tables import (
    cell_text,
    edges_table,
)
from wetline.core.results import ASSUMPTIONS, CAUTION
from wetline.core.units import display_units
from wetline.core.uplift import DEFAULT_REQUIRED_FACTOR, REQUIRED_FACTOR_SOURCE, UPLIFT_CAUTION

__all__ = ["DPI", "ReportError", "write_report", "report_pdf_bytes"]

DPI = 300
"""Resolution of the PDF's painting coordinates [dots per inch]."""

_MM = DPI / 25.4  # device units per millimetre
_PAGE_W, _PAGE_H = 210.0, 297.0  # A4 portrait [mm]
_LEFT_MM, _RIGHT_MM = 18.0, 15.0
_TOP_MM, _HEADER_MM, _GAP_MM = 10.0, 19.0, 5.0
_FOOTER_MM, _BOTTOM_MM = 8.0, 9.0


class ReportError(ExportError):
    """A calculation sheet that cannot be made or written (a ValueError)."""


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


class _Sheet(SheetInputs, SheetResults):
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
                    f"in the load case {escape(self.solved[0].name)}")
        else:
            what = f"at a liquid level of {escape(self.length(self.sol.level))}"
        return (f"<h1>Hydrostatic loads: {escape(name)}</h1>"
                f'<p class="sub">Calculation sheet for a {kind} {what}; forces '
                f"{escape(self.force_scope())}.</p>" + self.document_control()
                + (self._cases_inputs() if self.multi else ""))

    def document_control(self):
        """The sheet's reference, revision, sign-off, revision history and
        the precision of its numbers."""
        info = self.file_case.report
        rows = [("Calculation reference", escape(info.calculation_reference or "-")),
                ("Revision", f"<b>{escape(info.current_revision or '-')}</b>"),
                ("Prepared by", escape(info.prepared_by or "-")),
                ("Checked by", escape(info.checked_by or "-")),
                ("Approved by", escape(info.approved_by or "-"))]
        out = ["<h2>Document control</h2>", kv_html(rows), "<h3>Revision history</h3>"]
        if info.revisions:
            out.append(table_html(
                ("revision", "date", "description", "prepared", "checked", "approved"),
                [tuple(getattr(r, k) or "-" for k in REVISION_KEYS) for r in info.revisions],
                align=["left"] * 6, widths=[10, 13, 41, 12, 12, 12]))
        else:
            out.append('<p class="note">No revision recorded.</p>')
        out.append(f'<p class="note">{escape(self.precision_text())}</p>')
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

    def _uses_full_law(self):
        """True if a case has layers, a gas or trapped air, or the section can
        trap air (the sheet then states the law and its inputs)."""
        return any(sc.resolved.is_layered or sc.resolved.gas_pressure != 0.0
                   or sc.resolved.pockets == "trapped" for sc in self.solved) \
            or self.section.pocket_tree.may_trap

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
                       f'style="color: {MUTED};">{escape(label)}</td>'
                       f'<td bgcolor="{FORMULA_FILL}">{formula}</td></tr>')
        out.append("</table>")
        out.append('<p class="note">References: Çengel &amp; Cimbala, <i>Fluid Mechanics</i>, '
                   "sec. 3-1 to 3-4; Munson, Young &amp; Okiishi, <i>Fundamentals of Fluid "
                   "Mechanics</i>, sec. 2.3 and 2.8 (pressure on plane and curved surfaces); "
                   "membrane theory of shells of revolution: Timoshenko &amp; "
                   "Woinowsky-Krieger, <i>Theory of Plates and Shells</i>; uplift limit "
                   "state: EN 1997-1 (Eurocode 7), 2.4.7.4.</p>")
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
            items = [f"case {sc.name}: {self.du.message(w)}" for sc in self.solved
                     for w in sc.warnings]
            out.append("<ul>" + "".join(f"<li>{escape(w)}</li>" for w in items) + "</ul>" if items
                       else "<p>None in any case.</p>")
        elif sol.warnings:
            out.append("<ul>" + "".join(f"<li>{escape(self.du.message(w))}</li>"
                                        for w in sol.warnings) + "</ul>")
        else:
            out.append("<p>None at this level.</p>")
        out.append("<h3>Assumptions</h3><ul>"
                   + "".join(f"<li>{escape(a)}</li>" for a in ASSUMPTIONS)
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
                   f'<tr><td bgcolor="#fbeeee"><b>{escape(CAUTION)}</b><br/>'
                   f"{escape(UPLIFT_CAUTION)}</td></tr></table>")
        out.append('<p class="note">Figures (section 5) and the per-edge results '
                   "(section 6) follow.</p>")
        return "".join(out)

    def main_html(self):
        return (f"<html><head><style>{SHEET_CSS}</style></head><body>" + self.title()
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
                 f"{escape(self.force_scope())}. Pressures at the edge's ends (0 where dry). ")
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
        fm = QFontMetricsF(point_font(EDGE_PT), writer)
        fb = QFontMetricsF(point_font(EDGE_PT, bold=True), writer)
        need = []
        for k, h in enumerate(header):
            texts = {cell_text(r[k]) for r in t.rows}
            need.append(max([fb.horizontalAdvance(w) for w in h.split()]
                            + [fm.horizontalAdvance(x) for x in texts]) + 2.5 * fm.height())
        widths = [100.0 * v / sum(need) for v in need]

        def table(rows, new_page=False):
            text = table_html(header, rows, cls="e", align=align, widths=widths,
                               padding=2).replace("\n[", "<br/>[")
            if new_page:
                text = text.replace("<table ", '<table style="page-break-before: always;" ', 1)
            return text

        def page(content):
            return f"<html><head><style>{SHEET_CSS}</style></head><body>{content}</body></html>"

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
