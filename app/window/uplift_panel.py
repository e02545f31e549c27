"""The uplift check, live: what holds each part down, and whether it is enough.

For every loaded part of the section the panel has two fields, the part's
self-weight and any extra holding-down resistance (bolts, ballast), in
display units: per metre of width for plane sections (kN/m, lbf/ft), totals
for axisymmetric ones (kN, lbf); the document keeps them in N/m or N (see
:mod:`wetline.core.uplift`). Below them: the required factor, with where its default
comes from and the caution that the governing code sets it.

The results come from :meth:`wetline.core.case.Case.uplift` each time the document
is solved (a level, vertex or liquid change) and each time a resistance or
the required factor changes: the factor achieved at the current level and at
the worst level in the fill range, each with its verdict, OK or NOT OK.

Every edit is one undo command built by :mod:`wetline.app.model.editing`
(:func:`~wetline.app.model.editing.set_resistance`,
:func:`~wetline.app.model.editing.set_required_factor`); bad input (letters, a
negative value) turns its field red with the reason in its tooltip and in red
under the fields, and changes nothing. The field keeps what was typed until
it is corrected or the document's value of that field changes (an undo).
"""

from __future__ import annotations

import html
import math

import shiboken6
from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QGridLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QPushButton,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing
from wetline.app.render.style import MUTED, NOT_OK_COLOUR, OK_COLOUR
from wetline.app.window.panels import parse_number
from wetline.app.window.steady_labels import SteadyColumn, SteadyParagraph
from wetline.core.case import CaseError
from wetline.core.load_cases import TRAPPED, VENTED
from wetline.core.numbers import format_number
from wetline.core.uplift import (
    DEFAULT_REQUIRED_FACTOR,
    REQUIRED_FACTOR_SOURCE,
    UPLIFT_CAUTION,
    uplift_check,
    worst_uplifts,
    worst_uplifts_for,
)

__all__ = ["UpliftPanel", "UpliftChecker"]


INVALID_FIELD_STYLE = (f"QLineEdit {{ border: 1px solid {NOT_OK_COLOUR}; "
                       "background-color: #fdecee; }")
FIELDS = ("self_weight", "holding_down")


SAMPLED_TIP = ("Sampled at a few levels while the outline is dragged (the worst "
               "uplift may be a little larger); searched in full on release")


def verdict_html(ok, factor, level_text=None, sampled=False):
    """Rich text of one verdict: a coloured tag and below it the factor and,
    optionally, the level it applies at; ``sampled`` marks the factor as
    approximate (a worst level sampled during a drag: "~")."""
    colour = OK_COLOUR if ok else NOT_OK_COLOUR
    tag = (f'<span style="background-color:{colour}; color:white; font-weight:600;">'
           f'&nbsp;{"OK" if ok else "NOT OK"}&nbsp;</span>')
    value = "no uplift" if math.isinf(factor) else format_number(factor)
    if sampled:
        value = "~" + value
    text = f"{tag}<br>{value}"
    if level_text:
        text += f' <span style="color:{MUTED};">at {html.escape(level_text)}</span>'
    return text


def pockets_statement(solution, results):
    """What the check assumed about air under ceilings: now, and at the
    worst level (the search covers both assumptions where air is trapped)."""
    if solution.pocket_mode == TRAPPED:
        now = ("Air trapped under ceilings (compressed by the rising liquid, Boyle's law)"
               if solution.pockets else "Air trapped under ceilings (none sealed now)")
        worst = sorted({r.worst_pockets for r in results})
        return (f"{now}; the worst level is searched with the air vented and trapped, and "
                f"the larger uplift governs ({' and '.join(worst)} here).")
    if solution.section.pocket_tree.may_trap:
        return ("Air under ceilings vented (every pool at the level); the chart shows the "
                "trapped air too: choose trapped air if it cannot escape.")
    return "Air under ceilings vented: no ceiling of this section can trap air."


class UpliftChecker:
    """:func:`wetline.core.uplift.uplift_check`, keeping each part's worst level.

    The worst level depends on the outline and the liquid, not on the
    current level (:func:`wetline.core.uplift.worst_uplifts`): a slider drag then
    costs one look-up per part instead of a search over the range, which on
    a part of hundreds of edges takes milliseconds.
    """

    def __init__(self):
        self._key = None
        self._worst = {}
        self.sampled = False
        """True if the last check's worst levels were sampled, not searched
        (trapped air during a drag: a lower bound, searched on release)."""

    def check(self, case, solution, live=False, samples=None):
        """The same list of :class:`wetline.core.uplift.UpliftResult` as
        ``case.uplift(solution)``; under a law with layers, a gas or trapped
        air, the worst level searched for that law (both pocket assumptions
        where air is trapped, :func:`wetline.core.uplift.worst_uplifts_for`).

        ``live`` (a dragged outline's preview, a new outline at every step):
        the trapped-air search is sampled, not refined, and not kept;
        ``samples`` (the chart's trapped-air table of the same outline and
        law: its levels and each part's downward load) are its samples."""
        section = case.section
        density, gravity = case.liquid.density, case.gravity
        law = solution.law
        general = law is not None and (law.n_layers > 1 or law.gas_pressure != 0.0
                                       or solution.pocket_mode != VENTED)
        key = (section, density, gravity)
        if general:
            key += (law.densities, law.interfaces, law.gas_pressure, solution.pocket_mode,
                    solution.atmospheric_pressure)
        if self._key is None or self._key[0] is not section or self._key[1:] != key[1:]:
            self._key = key
            self._worst = {}
        resistances = case.resistance_map
        missing = [p for p in section.loaded_part_names
                   if p in resistances and p not in self._worst]
        worst = self._worst
        sampled = live and general and solution.pocket_mode == TRAPPED \
            and section.pocket_tree.may_trap
        if missing and sampled:
            worst = {**worst, **worst_uplifts_for(solution, missing, refine=False,
                                                  trapped_samples=samples)}
        elif missing:
            if general:
                self._worst.update(worst_uplifts_for(solution, missing))
            else:
                self._worst.update(worst_uplifts(section, missing, density, gravity))
        self.sampled = bool(missing) and sampled
        return uplift_check(case, resistances, case.required_uplift_factor, solution,
                            worst=worst)


class _PartRow:
    """The widgets of one part's row."""

    def __init__(self, part):
        self.part = part
        self.name = QLabel(part)
        self.edits = {}
        for field in FIELDS:
            edit = QLineEdit()
            edit.setAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
            edit.setMinimumWidth(48)
            edit.setMaximumWidth(84)
            edit.setObjectName(f"{part}:{field}")
            self.edits[field] = edit
        self.now = QLabel()
        self.worst = QLabel()
        for label in (self.now, self.worst):
            label.setTextFormat(Qt.TextFormat.RichText)
            label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        # a new verdict relays out the panel only if it is wider than any
        # before in its own cell (one width per label: a row's "now" and
        # "worst" sharing the wider of the two made the panel outgrow its dock)
        self.steady = {label: SteadyColumn() for label in (self.now, self.worst)}
        for label, column in self.steady.items():
            column.add(label)
        self.shown = {}  # field -> text written into the edit

    def show(self, label, text):
        """Write ``text`` into ``label`` (``now`` or ``worst``) through its column."""
        self.steady[label].set_text(label, text)

    def widgets(self):
        return (self.name, *self.edits.values(), self.now, self.worst)


class UpliftPanel(QGroupBox):
    """Self-weight and holding-down of each part, the required factor, and
    the factor achieved now and at the worst level, with verdicts."""

    def __init__(self, document, parent=None):
        super().__init__("Uplift check", parent)
        self._doc = document
        self._rows = {}
        self._parts = None
        self._checker = UpliftChecker()
        self.results = []
        lay = QVBoxLayout(self)
        self._grid_host = QWidget()
        self._grid = QGridLayout(self._grid_host)
        self._grid.setContentsMargins(0, 0, 0, 0)
        self._grid.setHorizontalSpacing(6)
        lay.addWidget(self._grid_host)
        self._invalid = {}  # (part, field) or "factor" -> (edit, reason, value it replaced)
        self.error = QLabel()  # the reasons of bad input, right under the fields
        self.error.setWordWrap(True)
        self.error.setStyleSheet(f"color: {NOT_OK_COLOUR};")
        self.error.hide()
        lay.addWidget(self.error)
        self.details = QLabel()
        self.details.setWordWrap(True)
        self.details.setStyleSheet("color: #445;")
        self.details.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self._details = SteadyParagraph(self.details)
        lay.addWidget(self.details)

        row = QHBoxLayout()
        row.addWidget(QLabel("Required factor"))
        self.factor = QLineEdit()
        self.factor.setAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        self.factor.setMaximumWidth(80)
        self.factor.setToolTip("Required factor against uplift: (self-weight + holding-down)"
                               " / upward load")
        row.addWidget(self.factor)
        self.default_button = QPushButton("Default")
        self.default_button.setToolTip(REQUIRED_FACTOR_SOURCE)
        row.addWidget(self.default_button)
        row.addStretch(1)
        lay.addLayout(row)
        self.source = QLabel()
        self.source.setWordWrap(True)
        self.source.setStyleSheet(f"color: {MUTED};")
        lay.addWidget(self.source)
        self.caution = QLabel(UPLIFT_CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setStyleSheet("color: #8a5a00;")
        lay.addWidget(self.caution)

        self.factor.editingFinished.connect(self._on_factor_edited)
        self.default_button.clicked.connect(self._on_default_clicked)
        document.sectionChanged.connect(self._on_sectionChanged)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.upliftInputsChanged.connect(self._on_upliftInputsChanged)
        document.solved.connect(self._on_solved)
        self._on_sectionChanged()

    # ----------------------------------------------------------- building
    def _new_row(self, part):
        row = _PartRow(part)
        for field in FIELDS:
            row.edits[field].editingFinished.connect(
                lambda p=part, f=field: self._on_resistance_edited(p, f))
        return row

    def _build_rows(self, parts):
        """Lay out one row per part: rows of parts still there are kept, the
        rows of parts gone are deleted at once (a deferred delete would wait
        for the event loop, and many edits in a row would pile them up)."""
        grid = self._grid
        while grid.count():
            grid.takeAt(0)  # layout items only: the widgets are placed again
        if not getattr(self, "_headers", None):
            self._headers = [QLabel() for _ in range(5)]
            for label in self._headers:
                label.setStyleSheet("font-weight: 600;")
        for c, label in enumerate(self._headers):
            grid.addWidget(label, 0, c)
        old, self._rows = self._rows, {}
        for r, part in enumerate(parts, start=1):
            row = old.pop(part, None) or self._new_row(part)
            grid.addWidget(row.name, r, 0)
            for c, field in enumerate(FIELDS, start=1):
                grid.addWidget(row.edits[field], r, c)
            grid.addWidget(row.now, r, 3)
            grid.addWidget(row.worst, r, 4)
            self._rows[part] = row
        for row in old.values():
            for field in FIELDS:
                self._invalid.pop((row.part, field), None)
            for widget in row.widgets():
                widget.hide()
                shiboken6.delete(widget)
        grid.setColumnStretch(4, 1)
        self._parts = parts

    def edit(self, part, field):
        """The field of ``part`` (``"self_weight"`` or ``"holding_down"``)."""
        return self._rows[part].edits[field]

    def row_texts(self, part):
        """(now, worst) result texts of ``part`` as plain text (tests, status)."""
        row = self._rows[part]
        return _plain(row.now.text()), _plain(row.worst.text())

    # ------------------------------------------------------- document -> view
    def _on_sectionChanged(self):
        parts = self._doc.section.loaded_part_names
        if parts != self._parts:
            self._build_rows(parts)
        self._write_back()

    def _on_unitsChanged(self):
        self._write_back()

    def _on_upliftInputsChanged(self):
        self._write_back()

    def _write_back(self):
        doc = self._doc
        units = doc.units.units
        q, label = doc.units.resistance_unit(doc.section)
        scope = "total" if doc.section.is_axisymmetric else "per m of width"
        titles = ("Part", f"Self-weight\n[{label}]", f"Holding-down\n[{label}]",
                  "Now", "Worst level")
        for header, title in zip(self._headers, titles, strict=True):
            header.setText(title)
        self._headers[1].setToolTip(f"Weight of the part itself, {scope}")
        self._headers[2].setToolTip(f"Extra resistance (bolts, ballast ...), {scope}")
        res = doc.case.resistance_map
        for part, row in self._rows.items():
            r = res.get(part)
            for field in FIELDS:
                edit = row.edits[field]
                value = 0.0 if r is None else getattr(r, field)
                text = format_number(units.to_display(value, q), 6)  # an input
                row.shown[field] = text
                if self._keeps_bad_input((part, field), value):
                    continue  # what was typed stays, red, until corrected
                edit.blockSignals(True)
                edit.setText(text)
                edit.blockSignals(False)
        f = doc.case.required_uplift_factor
        self._factor_shown = format_number(f)
        if not self._keeps_bad_input("factor", f):
            self.factor.blockSignals(True)
            self.factor.setText(format_number(f))
            self.factor.blockSignals(False)
        if f == DEFAULT_REQUIRED_FACTOR:
            self.source.setText(f"Required factor: {REQUIRED_FACTOR_SOURCE}.")
        else:
            self.source.setText(f"Required factor {format_number(f)} set for this case "
                                f"({REQUIRED_FACTOR_SOURCE}).")
        self.default_button.setEnabled(f != DEFAULT_REQUIRED_FACTOR)
        self._show_errors()
        self._update_results()

    def _on_solved(self, _solution):
        self._update_results()

    def _update_results(self):
        doc = self._doc
        sol = doc.solution
        case = doc.case
        if sol is None:
            return  # the first solve brings the results
        if sol.section is not case.section:
            # The results are of another outline (a drag being previewed, or
            # a solve still pending): check that outline with these inputs.
            try:
                case = case.with_section(sol.section)
            except ValueError:
                return
        live = doc.preview is not None
        samples = None
        tables = doc.level_tables
        if live and len(tables) > 1 and doc.level_tables_section is sol.section \
                and tables[1].pockets == TRAPPED:
            samples = (tables[1].levels, tables[1].part_down)  # the chart's, this outline's
        self.results = (self._checker.check(case, sol, live, samples) if case.resistances
                        else [])
        sampled = self._checker.sampled and bool(self.results)
        by_part = {r.part: r for r in self.results}
        units = doc.units
        scope, scale = doc.force_scope(case.section), doc.force_scale
        lines = []
        for part, row in self._rows.items():
            r = by_part.get(part)
            if r is None:
                load = sol.parts.get(part)
                lifted = load is not None and load.down < 0
                row.show(row.now, f'<span style="color:{MUTED};">-</span>')
                row.show(row.worst, "")
                row.now.setToolTip("Enter a self-weight or holding-down resistance to check "
                                   "this part" + (" (it is pushed up now)" if lifted else ""))
                continue
            level_now = units.fmt_length(sol.level)
            level_worst = units.fmt_length(r.worst_level)
            row.show(row.now, verdict_html(r.ok_now, r.factor))
            row.now.setToolTip(f"Factor at the current level {level_now}")
            row.show(row.worst, verdict_html(r.ok, r.worst_factor, level_worst, sampled))
            row.worst.setToolTip(SAMPLED_TIP if sampled else
                                 "The level in the fill range with the greatest uplift")
            lines.append(
                f"{part}: resistance {scope.text(r.resistance)}; uplift "
                f"{scope.text(r.uplift, scale=scale)} now, "
                f"{scope.text(r.worst_uplift)} at {level_worst} "
                f"({'worst of a few levels while dragging' if sampled else 'worst'}, air "
                f"{r.worst_pockets}); required {format_number(r.required_factor)}")
        if self.results:
            lines.append(pockets_statement(sol, self.results))
        if not lines:
            lines.append("Enter a self-weight or holding-down resistance of a part to check "
                         f"it against uplift. Forces {scope.words} ({scope.label}).")
        self._details.set_text("\n".join(lines))

    # ------------------------------------------------------- view -> document
    def _show_errors(self):
        text = "\n".join(reason for _, reason, _ in self._invalid.values())
        if self.error.text() != text:
            self.error.setText(text)
        self.error.setVisible(bool(text))

    def _mark(self, key, edit, reason, value):
        """Show ``edit`` as holding bad input (red, the reason as its tooltip);
        ``value`` is the document's value it did not replace."""
        if edit.property("base_tip") is None:
            edit.setProperty("base_tip", edit.toolTip())
        self._invalid[key] = (edit, reason, value)
        edit.setProperty("invalid", True)
        edit.setStyleSheet(INVALID_FIELD_STYLE)
        edit.setToolTip(reason)
        self._show_errors()

    def _unmark(self, key):
        entry = self._invalid.pop(key, None)
        if entry is not None:
            edit = entry[0]
            edit.setProperty("invalid", False)
            edit.setStyleSheet("")
            edit.setToolTip(edit.property("base_tip") or "")
        self._show_errors()

    def _keeps_bad_input(self, key, value):
        """True if the field ``key`` keeps its bad input while the document
        still has ``value`` there; else the mark goes (the value changed)."""
        entry = self._invalid.get(key)
        if entry is None:
            return False
        if entry[2] == value:
            return True
        self._unmark(key)
        return False

    def _on_resistance_edited(self, part, field):
        row = self._rows.get(part)
        if row is None:
            return
        edit = row.edits[field]
        key = (part, field)
        if edit.text().strip() == row.shown.get(field):
            self._unmark(key)
            return  # unchanged (focus passing through), or typed back
        what = "Self-weight" if field == "self_weight" else "Holding-down"
        doc = self._doc
        q, _ = doc.units.resistance_unit(doc.section)
        r = doc.case.resistance_map.get(part)
        current = 0.0 if r is None else getattr(r, field)
        try:
            text = edit.text().strip() or "0"
            value = doc.units.units.from_display(parse_number(text, f"{what} of {part}"), q)
            if value < 0:
                raise ValueError(f"{what} of {part} must be >= 0")
            self._unmark(key)  # before the edit: the document's change repaints the row
            editing.set_resistance(doc, part, field, value)
        except ValueError as exc:
            self._mark(key, edit, self._doc.units.explain(exc), current)

    def _on_factor_edited(self):
        if self.factor.text().strip() == self._factor_shown:
            self._unmark("factor")
            return
        current = self._doc.case.required_uplift_factor
        try:
            value = parse_number(self.factor.text(), "Required factor")
            if not value > 0:
                raise ValueError("Required factor must be positive")
            self._unmark("factor")
            self.set_required_factor(value)
        except (ValueError, CaseError) as exc:
            self._mark("factor", self.factor, str(exc), current)

    def _on_default_clicked(self):
        self._unmark("factor")
        self.set_required_factor(DEFAULT_REQUIRED_FACTOR)

    def set_required_factor(self, value):
        """Push the command that sets the required factor (if it changes)."""
        editing.set_required_factor(self._doc, value)


def _plain(rich):
    """Rich label text as plain text."""
    from PySide6.QtGui import QTextDocument

    d = QTextDocument()
    d.setHtml(rich)
    return " ".join(d.toPlainText().split())
