"""The flotation check of the whole structure, live, beside the uplift check.

For the active case: the uplift U (the groundwater's net upward force on the
structure), what resists it (R = self-weight + extra weight + soil on the
ledges + anchorage; the liquid inside is not counted), the factor R / U
against the required factor with its verdict, and, where the case's load
factor is not 1, the design factor R / (load factor x U). Below it, the
lowest design factor over every case and the case giving it (from the
document's envelope), and the base slab's governing net upward pressure
(groundwater under it minus the liquid on it) in the active case and over
all cases. Every number is
:class:`wetline.core.structure.StructureLoads`' or
:class:`wetline.core.load_cases.Envelope`'s, shown in the display units
through the one force rule (:mod:`wetline.core.force_scope`).

Without a structure the panel says how to add one. The required factor is
the uplift check's (one file value, edited in the uplift panel).
"""

from __future__ import annotations

import html

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QGridLayout, QGroupBox, QLabel, QVBoxLayout, QWidget

from wetline.app.render.style import MUTED, NOT_OK_COLOUR, OK_COLOUR
from wetline.app.window.steady_labels import SteadyParagraph
from wetline.core.numbers import format_number

__all__ = ["FlotationPanel"]

ROWS = (("uplift", "Uplift U (groundwater)"), ("self_weight", "Self-weight"),
        ("extra_weight", "Extra weight"), ("soil", "Soil on ledges"),
        ("anchorage", "Anchorage"), ("resistance", "Resistance R"),
        ("factor", "Factor R / U"), ("design_factor", "Design factor R / (factor x U)"),
        ("lowest", "Lowest over all cases"), ("base", "Base slab, net upward"),
        ("base_envelope", "Base slab, all cases"))


def _tag(ok):
    colour = OK_COLOUR if ok else NOT_OK_COLOUR
    return (f'<span style="background-color:{colour}; color:white; font-weight:600;">'
            f'&nbsp;{"OK" if ok else "NOT OK"}&nbsp;</span>')


def _muted(text):
    return f'<span style="color:{MUTED};">{html.escape(text)}</span>'


class FlotationPanel(QGroupBox):
    """Uplift, resistance, factor and verdict of the whole structure."""

    def __init__(self, document, parent=None):
        super().__init__("Flotation of the structure", parent)
        self._doc = document
        lay = QVBoxLayout(self)
        self.note = QLabel()
        self.note.setWordWrap(True)
        self.note.setStyleSheet(f"color: {MUTED};")
        lay.addWidget(self.note)
        self._grid_host = QWidget()
        grid = QGridLayout(self._grid_host)
        grid.setContentsMargins(0, 0, 0, 0)
        grid.setHorizontalSpacing(10)
        self.values = {}
        self.titles = {}
        self._steady = {}
        for r, (key, title) in enumerate(ROWS):
            name = QLabel(title)
            value = QLabel()
            value.setTextFormat(Qt.TextFormat.RichText)
            value.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
            value.setWordWrap(True)
            self._steady[key] = SteadyParagraph(value)
            grid.addWidget(name, r, 0, Qt.AlignmentFlag.AlignTop)
            grid.addWidget(value, r, 1)
            self.titles[key] = name
            self.values[key] = value
        grid.setColumnStretch(1, 1)
        lay.addWidget(self._grid_host)
        document.solved.connect(self._on_solved)
        document.envelopeReady.connect(self._on_envelopeReady)
        document.casesChanged.connect(self._on_envelopeReady)  # now waiting: say so
        document.sectionChanged.connect(self._on_envelopeReady)
        document.structureChanged.connect(self._on_changed)
        document.unitsChanged.connect(self._on_changed)
        document.upliftInputsChanged.connect(self._on_changed)
        self._on_changed()

    # ------------------------------------------------------------ reading
    def text(self, key):
        """The value shown in row ``key`` as plain text (tests, status)."""
        from PySide6.QtGui import QTextDocument

        d = QTextDocument()
        d.setHtml(self.values[key].text())
        return " ".join(d.toPlainText().split())

    def shown(self, key):
        """True if row ``key`` is shown."""
        return not self.values[key].isHidden()

    # ------------------------------------------------------- document -> view
    def _on_solved(self, _solution):
        self._update_case()

    def _on_envelopeReady(self, *_):
        self._update_envelope()

    def _on_changed(self, *_):
        self._update_case()
        self._update_envelope()

    def _row(self, key, text, show=True):
        label = self.values[key]
        for w in (label, self.titles[key]):
            if w.isHidden() == show:
                w.setVisible(show)
        self._steady[key].set_text(text)

    def _update_case(self):
        doc = self._doc
        has = doc.structure is not None
        self._grid_host.setVisible(has)
        if not has:
            self.note.setText("No structure around the cavity. Section > Structure adds walls "
                              "of a thickness; with groundwater in a case its flotation is "
                              "checked here.")
            return
        solved = doc.solved_case
        loads = None if solved is None else solved.structure
        if loads is None:
            return  # the first solve brings the results
        units = doc.units
        scope, scale = doc.force_scope(loads.cavity), doc.force_scale
        f = loads.flotation
        factor = solved.load_factor
        gw = loads.groundwater
        where = "dry ground" if gw is None else \
            f"groundwater at {units.fmt_length(gw.level)}"
        self.note.setText(f"Case {solved.name}: {where}. The liquid inside is not counted as "
                          f"resistance. Forces {scope.words} ({scope.label}).")
        self._row("uplift", html.escape(scope.text(f.uplift, scale=scale)))
        self._row("self_weight", html.escape(scope.text(loads.self_weight)))
        self._row("extra_weight", html.escape(scope.text(loads.extra_weight)))
        self._row("soil", html.escape(scope.text(loads.soil_weight)))
        self._row("anchorage", html.escape(scope.text(loads.anchorage)))
        self._row("resistance", "<b>" + html.escape(scope.text(f.resistance)) + "</b>")
        required = f"required {format_number(f.required)}"
        if f.factor is None:
            self._row("factor", f"{_tag(True)} {_muted('nothing lifts the structure')}")
            self._row("design_factor", "", show=False)
        else:
            self._row("factor", f"{_tag(f.ok)} <b>{format_number(f.factor)}</b> "
                                f"{_muted(required)}")
            if factor != 1.0:
                design = f.resistance / (factor * f.uplift)
                self._row("design_factor",
                          f"{_tag(design >= f.required)} <b>{format_number(design)}</b> "
                          + _muted(f"load factor {format_number(factor)}, {required}"))
            else:
                self._row("design_factor", "", show=False)
        base = loads.base_net_max
        if base is None:
            self._row("base", _muted("no floor over the base"))
        elif base.net <= 0:
            self._row("base", _muted(f"{units.fmt_pressure(base.net)}: pressed down, "
                                     "not lifted"))
        else:
            text = units.fmt_pressure(base.net)
            if factor != 1.0:
                text += f" (design {units.fmt_pressure(factor * base.net)})"
            self._row("base", "<b>" + html.escape(text) + "</b> " + _muted(
                f"under floor edge {base.index} at x {units.fmt_length(base.point[0])}"))

    def _update_envelope(self):
        doc = self._doc
        env = doc.envelope
        if doc.structure is None or env is None or env.flotation is None:
            self._row("lowest", "", show=False)
            self._row("base_envelope", "", show=False)
            return
        units = doc.units
        stale = "" if doc.envelope_current else " " + _muted("(updates on release)")
        fl = env.flotation
        if fl.factor is None:
            self._row("lowest", f"{_tag(True)} {_muted('no case lifts the structure')}{stale}")
        else:
            self._row("lowest", f"{_tag(fl.ok)} <b>{format_number(fl.factor)}</b> "
                                + _muted(f"in {fl.case} (design value)") + stale)
        b = env.base
        if b is None:
            self._row("base_envelope", _muted("no floor over the base"))
        elif b.case is None:
            self._row("base_envelope", _muted("never lifted") + stale)
        else:
            self._row("base_envelope",
                      "<b>" + html.escape(units.fmt_pressure(b.net_upward_pressure)) + "</b> "
                      + _muted(f"in {b.case}, floor edge {b.index} (design value)") + stale)
