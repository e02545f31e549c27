"""Side panels: the liquid, the fill, and the totals.

Each panel takes the document in ``__init__``, connects there, turns the
user's input into an edit (:mod:`wetline.app.model.editing`), and writes the document's
values back with its widgets' signals blocked. Bad input (not a number, a
negative density, more volume than the section holds) is shown in red
under the field; the field keeps what was typed and nothing else changes.
"""

from __future__ import annotations

import math

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QSlider,
    QVBoxLayout,
)

from wetline.app.model import editing
from wetline.app.model.gravity import format_gravity, gravity_from_display, gravity_label
from wetline.app.window.layers_panel import LayerList
from wetline.app.window.message_labels import message_label, show_message
from wetline.app.window.steady_labels import SteadyColumn, SteadyParagraph
from wetline.core.fill import FillError, capacity
from wetline.core.liquids import (
    LISTED_LIQUIDS,
    LiquidError,
    custom_liquid,
    fresh_water,
    liquid_from_specific_gravity,
    seawater,
)
from wetline.core.load_cases import LoadCaseError
from wetline.core.numbers import format_number

__all__ = ["LiquidPanel", "FillPanel", "TotalsPanel", "parse_number"]

NOTE_STYLE = "color: #8a5a00;"


def parse_number(text, what):
    """A finite float from typed text; ValueError with a plain message."""
    t = text.strip().replace(",", ".") if text.count(",") == 1 and "." not in text else \
        text.strip().replace(",", "")
    try:
        v = float(t)
    except ValueError:
        raise ValueError(f"{what}: '{text.strip()}' is not a number") from None
    if not math.isfinite(v):
        raise ValueError(f"{what} must be a finite number")
    return v


class LiquidPanel(QGroupBox):
    """Choose the liquid (fresh water, seawater, listed, custom) and gravity
    (in m/s2 or ft/s2, as the display system); with layers, the liquid of
    the layer selected in :attr:`layer_list`."""

    KINDS = ("Fresh water", "Seawater", "Listed liquid", "Custom density",
             "Specific gravity")

    def __init__(self, document, parent=None):
        super().__init__("Liquid", parent)
        self._doc = document
        form = QFormLayout(self)
        form.setFieldGrowthPolicy(QFormLayout.FieldGrowthPolicy.AllNonFixedFieldsGrow)
        self.kind = QComboBox()
        self.kind.addItems(self.KINDS)
        self.temperature = QLineEdit()
        self.salinity = QLineEdit()
        self.listed = QComboBox()
        for key in LISTED_LIQUIDS:
            self.listed.addItem(key, key)
        self.density = QLineEdit()
        self.sg = QLineEdit()
        self.gravity = QLineEdit()
        self.summary = QLabel()
        self.summary.setWordWrap(True)
        self.summary.setStyleSheet("color: #445;")
        self.error = message_label()
        self.layer_list = LayerList(document)
        form.addRow(self.layer_list)
        form.addRow("Liquid", self.kind)
        form.addRow("Temperature [C]", self.temperature)
        form.addRow("Salinity [g/kg]", self.salinity)
        form.addRow("Name", self.listed)
        self._density_label = QLabel()
        form.addRow(self._density_label, self.density)
        form.addRow("Specific gravity", self.sg)
        self._gravity_label = QLabel()
        self._gravity_shown = None
        form.addRow(self._gravity_label, self.gravity)
        form.addRow(self.summary)
        form.addRow(self.error)
        self._form = form

        self.kind.currentIndexChanged.connect(self._on_kind_changed)
        self.listed.currentIndexChanged.connect(self._on_field_edited)
        for edit in (self.temperature, self.salinity, self.density, self.sg):
            edit.editingFinished.connect(self._on_field_edited)
        self.gravity.editingFinished.connect(self._on_gravity_edited)
        document.liquidChanged.connect(self._on_liquidChanged)
        document.unitsChanged.connect(self._on_liquidChanged)
        document.activeCaseChanged.connect(self._on_liquidChanged)
        self.layer_list.selectionChanged.connect(self._on_liquidChanged)
        self._on_liquidChanged()

    def shown_liquid(self):
        """The liquid the chooser shows: the selected layer's."""
        layers = self.layer_list.layers()
        return layers[min(self.layer_list.selected, len(layers) - 1)].liquid

    def _rows(self, kind):
        vis = {"temperature": kind in (0, 1), "salinity": kind == 1, "listed": kind == 2,
               "density": kind == 3, "sg": kind == 4}
        for name, show in vis.items():
            self._form.setRowVisible(getattr(self, name), show)

    def _on_liquidChanged(self, *_):
        liquid = self.shown_liquid()
        units = self._doc.units
        widgets = (self.kind, self.temperature, self.salinity, self.listed, self.density,
                   self.sg, self.gravity)
        for w in widgets:
            w.blockSignals(True)
        try:
            if liquid.preset == "fresh water":
                kind = 0
            elif liquid.preset == "seawater":
                kind = 1
            elif liquid.preset in LISTED_LIQUIDS:
                kind = 2
                self.listed.setCurrentIndex(self.listed.findData(liquid.preset))
            elif liquid.source.startswith("specific gravity"):
                kind = 4
            else:
                kind = 3
            self.kind.setCurrentIndex(kind)
            self.temperature.setText(format_number(liquid.temperature, 4)
                                     if liquid.temperature is not None else "20")
            self.salinity.setText(format_number(liquid.salinity, 4)
                                  if liquid.salinity is not None else "35")
            self.density.setText(format_number(units.density(liquid.density), 6))
            self.sg.setText(format_number(liquid.specific_gravity, 5))
            g = self._doc.case.gravity
            text = format_gravity(units, g)
            self.gravity.setText(text)
            self._gravity_shown = (text, g, units.system)
            self._gravity_label.setText(f"Gravity [{gravity_label(units)}]")
            self._density_label.setText(f"Density [{units.units.label('density')}]")
            self._rows(kind)
        finally:
            for w in widgets:
                w.blockSignals(False)
        self.summary.setText(f"{liquid.name}: {units.fmt_density(liquid.density)} "
                             f"(SG {format_number(liquid.specific_gravity, 5)})\n{liquid.source}")
        show_message(self.error, "")

    def _on_kind_changed(self, kind):
        self._rows(kind)
        self._on_field_edited()

    def liquid_from_fields(self):
        """The liquid the fields describe; LiquidError / ValueError if bad."""
        kind = self.kind.currentIndex()
        if kind == 0:
            return fresh_water(parse_number(self.temperature.text(), "Temperature"))
        if kind == 1:
            return seawater(parse_number(self.temperature.text(), "Temperature"),
                            parse_number(self.salinity.text(), "Salinity"))
        if kind == 2:
            return LISTED_LIQUIDS[self.listed.currentData()]
        if kind == 3:
            value = parse_number(self.density.text(), "Density")
            return custom_liquid(self._doc.units.density_si(value))
        return liquid_from_specific_gravity(parse_number(self.sg.text(), "Specific gravity"))

    def _on_field_edited(self):
        try:
            liquid = self.liquid_from_fields()
        except (LiquidError, ValueError) as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        try:
            editing.set_layer_liquid(self._doc, self.layer_list.selected, liquid)
        except LoadCaseError as exc:  # a denser layer over a lighter one
            show_message(self.error, self._doc.units.explain(exc))
            return
        show_message(self.error, "")

    def _on_gravity_edited(self):
        text = self.gravity.text().strip()
        shown = self._gravity_shown
        units = self._doc.units
        if shown is not None and shown == (text, self._doc.case.gravity, units.system):
            show_message(self.error, "")  # the value shown, untouched: nothing to change
            return
        try:
            value = gravity_from_display(units, parse_number(text, "Gravity"))
            editing.set_gravity(self._doc, value)
        except ValueError as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        show_message(self.error, "")


class FillPanel(QGroupBox):
    """The fill: a slider and a box, by level, volume or percent of capacity."""

    STEPS = 1000
    MODES = ("Level", "Volume", "% of capacity")

    def __init__(self, document, parent=None):
        super().__init__("Fill", parent)
        self._doc = document
        self._drag = 0
        lay = QVBoxLayout(self)
        row = QHBoxLayout()
        self.mode = QComboBox()
        self.mode.addItems(self.MODES)
        self.value = QLineEdit()
        self.unit = QLabel()
        row.addWidget(self.mode)
        row.addWidget(self.value, 1)
        row.addWidget(self.unit)
        lay.addLayout(row)
        self.slider = QSlider(Qt.Orientation.Horizontal)
        self.slider.setRange(0, self.STEPS)
        self.slider.setPageStep(self.STEPS // 20)
        self.slider.setSingleStep(self.STEPS // 200)
        self.slider.setToolTip("Drag to fill; PageUp / PageDown step the level")
        lay.addWidget(self.slider)
        self.range_label = QLabel()
        self.range_label.setStyleSheet("color: #445;")
        self.range_label.setWordWrap(True)
        lay.addWidget(self.range_label)
        self.note = message_label()
        lay.addWidget(self.note)
        self.error = message_label()
        lay.addWidget(self.error)

        self.mode.currentIndexChanged.connect(self._on_mode_changed)
        self.value.editingFinished.connect(self._on_value_edited)
        self.slider.sliderPressed.connect(self._on_slider_pressed)
        self.slider.sliderReleased.connect(self._on_slider_released)
        self.slider.valueChanged.connect(self._on_slider_moved)
        document.fillChanged.connect(self._on_fillChanged)
        document.sectionChanged.connect(self._on_fillChanged)
        document.unitsChanged.connect(self._on_unitsChanged)
        document.solved.connect(self._on_solved)
        document.levelTableReady.connect(self._on_levelTableReady)
        self._range_key = None  # (section, units) of the range label's text
        self._on_fillChanged()

    # ------------------------------------------------------------ helpers
    def _slider_fraction_of(self, solution_level=None, volume=None):
        section = self._doc.section
        if self.mode.currentIndex() == 0:
            lo, hi = self._doc.level_range
            level = self._doc.case.level if solution_level is None else solution_level
            return (level - lo) / (hi - lo) if hi > lo else 0.0
        cap = capacity(section)
        if volume is None:
            sol = self._doc.solution
            volume = self._doc.case.fill_volume if self._doc.case.fill_volume is not None \
                else (sol.volume if sol is not None else 0.0)
        return volume / cap if cap > 0 else 0.0

    def _set_slider(self, fraction):
        self.slider.blockSignals(True)
        self.slider.setValue(int(round(min(max(fraction, 0.0), 1.0) * self.STEPS)))
        self.slider.blockSignals(False)

    def _shown_level(self):
        """The level [m] the box shows: the case's typed level, else the
        solved one (a fill by volume)."""
        case, sol = self._doc.case, self._doc.solution
        return case.fill_level if case.fill_level is not None else (
            sol.level if sol is not None else case.level)

    def _write_back(self):
        """The box shows the document's fill. A text it replaces was refused
        (the fill moved by other means since): its refusal goes with it."""
        doc = self._doc
        units = doc.units
        mode = self.mode.currentIndex()
        sol = doc.solution
        case = doc.case
        typed = self.value.text()
        self.value.blockSignals(True)
        if mode == 0:
            self.unit.setText(units.length_unit)
            level = self._shown_level()
            self.value.setText(format_number(units.length(level), 5))
            self._set_slider(self._slider_fraction_of(level))
        else:
            vol = case.fill_volume if case.fill_volume is not None else (
                sol.volume if sol is not None else None)
            if vol is None:
                self.value.setText("")
            elif mode == 1:
                self.value.setText(format_number(units.volume(vol), 5))
            else:
                cap = capacity(doc.section)
                self.value.setText(format_number(100 * vol / cap if cap else 0.0, 4))
            self.unit.setText(units.units.label("volume") if mode == 1 else "%")
            if vol is not None:
                self._set_slider(self._slider_fraction_of(volume=vol))
        self.value.blockSignals(False)
        if self.value.text() != typed and self.error.text():
            show_message(self.error, "")
        self._write_range(doc.section)

    def _write_range(self, section):
        """The spill level (or closed top) and capacity of ``section``: the
        document's, or the dragged outline's while a drag is solved. Written
        again only for another section or other units (a fill step keeps
        them; a change of units or precision forgets the last)."""
        units = self._doc.units
        key = self._range_key
        if key is not None and key[0] is section and key[1] is units:
            return
        self._range_key = (section, units)
        if section.is_open:
            text = f"Spill level {units.fmt_length(section.spill_level)}; " \
                   f"capacity {units.fmt_volume(capacity(section))}"
        else:
            text = (f"Closed section: top {units.fmt_length(section.z_max)}; a level above "
                    f"it is a head above the roof. Capacity {units.fmt_volume(capacity(section))}")
        if text != self.range_label.text():
            self.range_label.setText(text)

    # --------------------------------------------------------- document
    def _on_fillChanged(self):
        self._write_back()

    def _on_unitsChanged(self):
        self._range_key = None  # the units or the precision changed: write it again
        self._write_back()

    def _on_levelTableReady(self, _table):
        # The slider's range may have grown (a head above a closed section's
        # roof, typed or read): its handle moves, the texts stay.
        if self.mode.currentIndex() == 0:
            self._set_slider(self._slider_fraction_of(self._shown_level()))

    def _on_solved(self, solution):
        if self.mode.currentIndex() != 0 or self._doc.case.fill_level is None:
            self._write_back()
        self._write_range(solution.section)
        notes = []
        for w in solution.warnings:
            if "capped" in w:
                notes.append(f"Capped at the spill level "
                             f"{self._doc.units.fmt_length(solution.level)}: the level asked "
                             f"for ({self._doc.units.fmt_length(solution.requested_level)}) "
                             "would spill.")
            elif "standpipe" in w:
                notes.append(f"Head above the roof: "
                             f"{self._doc.units.fmt_length(solution.head_above_top)} "
                             "(the roof is pushed up).")
            elif "empty" in w:
                notes.append("The section is empty at this level.")
        show_message(self.note, "\n".join(notes), NOTE_STYLE)

    # -------------------------------------------------------------- user
    def _on_mode_changed(self, _mode):
        show_message(self.error, "")
        self._write_back()

    def _on_slider_pressed(self):
        self._drag += 1
        self._doc.begin_live_edit()  # the envelope over all cases waits for the release

    def _on_slider_released(self):
        self._doc.end_live_edit()

    def _on_slider_moved(self, value):
        key = ("slider", self._drag) if self.slider.isSliderDown() else ("slider-step",)
        self.apply_fraction(value / self.STEPS, key)

    def apply_fraction(self, fraction, merge_key=None):
        """Fill to ``fraction`` of the slider's range (as a slider move)."""
        doc = self._doc
        try:
            if self.mode.currentIndex() == 0:
                lo, hi = doc.level_range
                editing.fill_to_level(doc, lo + fraction * (hi - lo), merge_key)
            else:
                editing.fill_to_volume(doc, fraction * capacity(doc.section), merge_key)
        except ValueError as exc:  # a level core refuses: said, as a typed one is
            show_message(self.error, doc.units.explain(exc))
            return
        show_message(self.error, "")

    def step(self, direction):
        """Step the level up (+1) or down (-1) by a twentieth of the range;
        consecutive steps merge into one undo step."""
        fraction = self._slider_fraction_of()
        self.apply_fraction(min(max(fraction + direction / 20.0, 0.0), 1.0), ("fill-step",))

    def _on_value_edited(self):
        doc = self._doc
        mode = self.mode.currentIndex()
        what = ("Level", "Volume", "Percentage")[mode]
        try:
            v = parse_number(self.value.text(), what)
            if mode == 0:
                editing.fill_to_level(doc, doc.units.length_si(v))
            elif mode == 1:
                editing.fill_to_volume(doc, doc.units.volume_si(v))
            else:
                editing.fill_to_percent(doc, v)
        except (ValueError, FillError) as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        show_message(self.error, "")


def layer_totals_text(s, units, scope, scale):
    """Per layer (top first) its volume and weight; the gas and each pocket
    of trapped air; empty for one liquid at atmospheric pressure with
    nothing trapped."""
    lines = []
    layers = s.layers
    if len(layers) > 1:
        for i in reversed(range(len(layers))):
            ly = layers[i]
            lines.append(f"Layer {i + 1} {ly.name}: {units.fmt_volume(ly.volume)}, "
                         f"{scope.text(ly.weight, scale=scale)}")
    if s.gas_pressure != 0.0:
        lines.append(f"Gas over the surface: {units.fmt_pressure(s.gas_pressure)} gauge")
    for p in s.pockets:
        lines.append(f"Trapped air sealed at {units.fmt_length(p.sealed_at)}: "
                     f"{units.fmt_volume(p.air_volume)} at {units.fmt_pressure(p.air_pressure)}, "
                     f"interface {units.fmt_length(p.interface)}")
    return "\n".join(lines)


class TotalsPanel(QGroupBox):
    """The active case, its level, volume, weight, floor force, support
    reaction, maximum pressure, spill level (characteristic values)."""

    ROWS = (("case", "Case"), ("level", "Level"), ("volume", "Volume"),
            ("weight", "Liquid weight"),
            ("floor", "Floor force"), ("support", "Support reaction"),
            ("max_pressure", "Max. pressure"), ("spill", "Spill level"))

    def __init__(self, document, parent=None):
        super().__init__("Totals", parent)
        self._doc = document
        form = QFormLayout(self)
        self.values = {}
        self._column = SteadyColumn()  # a new value relays out the dock only if it is wider
        for key, title in self.ROWS:
            label = QLabel("-")
            label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
            label.setAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
            self.values[key] = self._column.add(label)
            form.addRow(title, label)
        self.layers = QLabel()
        self.layers.setWordWrap(True)
        self.layers.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.layers.hide()
        self._layers_text = SteadyParagraph(self.layers)
        form.addRow(self.layers)
        self.scope = QLabel()
        self.scope.setStyleSheet("color: #445;")
        self.scope.setWordWrap(True)
        form.addRow(self.scope)
        document.solved.connect(self._on_solved)
        document.unitsChanged.connect(self._on_unitsChanged)

    def _on_unitsChanged(self):
        if self._doc.solution is not None:
            self._on_solved(self._doc.solution)

    def _on_solved(self, s):
        doc = self._doc
        u = doc.units
        sec = s.section
        scope, scale = doc.force_scope(sec), doc.force_scale
        v = self.values
        put = self._column.set_text
        solved = doc.solved_case
        factor = 1.0 if solved is None else solved.load_factor
        put(v["case"], doc.active_name + ("" if factor == 1.0
                                             else f" (load factor {format_number(factor)})"))
        put(v["level"], u.fmt_length(s.level))
        area = u.units.text(s.volume / sec.width, "area")
        put(v["volume"], f"{u.fmt_volume(s.volume)}"
                            + ("" if sec.kind == "axisymmetric" else f" ({area} of section)"))
        put(v["weight"], scope.text(s.fluid_weight, scale=scale))
        put(v["floor"], scope.text(s.floor_force, scale=scale))
        held = s.support_reaction < -1e-9 * max(s.fluid_weight, 1e-300)
        put(v["support"], scope.text(s.support_reaction, scale=scale)
                             + ("  (held down)" if held else ""))
        if held != getattr(self, "_held", None):  # a style sheet change is costly
            self._held = held
            v["support"].setStyleSheet("color: #8e24aa; font-weight: 600;" if held else "")
            self._column.fit(v["support"])  # bold text is wider
        put(v["max_pressure"], u.fmt_pressure(s.max_pressure))
        put(v["spill"], u.fmt_length(sec.spill_level) if sec.spill_level is not None
                           else "none (closed)")
        text = layer_totals_text(s, u, scope, scale)
        self.layers.setVisible(bool(text))
        self._layers_text.set_text(text)
        self.scope.setText(f"Forces {scope.words}. Support reaction: what the "
                           "supports carry downward; negative means held down.")

