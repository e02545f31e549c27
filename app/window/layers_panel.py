"""The active case's liquid layers, and its gas and trapped air.

:class:`LayerList` sits at the top of the liquid panel: the case's liquids
as a stack, the top of the list the top of the tank ("2 fats, oils and
grease", "1 raw sewage"), with Add, Remove, Up and Down (each one undo step,
:mod:`wetline.app.model.editing`). The liquid panel's chooser edits the
selected layer; a non-top layer's top is given as a level or as its own
volume; the top layer's top is the case's fill. A case of one liquid shows
only the Add button, and the panel looks as it always did.

:class:`GasPanel` holds the gauge pressure of a gas over the free surface
(closed sections only: disabled with the reason on an open one), whether
air under ceilings is vented or trapped, and the atmospheric pressure the
trapped air starts from.

Bad input (not a number, a denser liquid over a lighter one, a vacuum below
absolute zero) is shown in red under the fields, with core's message, and
nothing changes.
"""

from __future__ import annotations

from PySide6.QtCore import Signal
from PySide6.QtWidgets import (
    QComboBox,
    QFormLayout,
    QGroupBox,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QListWidget,
    QListWidgetItem,
    QPushButton,
    QVBoxLayout,
    QWidget,
)

from wetline.app.model import editing
from wetline.app.window.message_labels import message_label, show_message
from wetline.core.fill import FillError
from wetline.core.load_cases import TRAPPED, VENTED, LoadCaseError
from wetline.core.numbers import format_number

__all__ = ["LayerList", "GasPanel", "layer_word"]

NOTE_STYLE = "color: #445;"


def _number(text, what):
    from wetline.app.window.panels import parse_number

    return parse_number(text, what)


def layer_word(index, name):
    """``1 raw sewage``: a layer as the list and the canvas name it (1 = bottom)."""
    return f"{index + 1} {name}"


class LayerList(QWidget):
    """The active case's layers: a stack, add / remove / reorder, each
    non-top layer's top as a level or a volume."""

    selectionChanged = Signal(int)
    """The selected layer's index (0 = the bottom one)."""

    def __init__(self, document, parent=None):
        super().__init__(parent)
        self._doc = document
        self._selected = 0
        lay = QVBoxLayout(self)
        lay.setContentsMargins(0, 0, 0, 0)
        self.list = QListWidget()
        self.list.setToolTip("The case's liquids, the top of the list the top of the tank; "
                             "the liquid chosen below is the selected layer's")
        self.list.setMaximumHeight(92)
        lay.addWidget(self.list)
        buttons = QHBoxLayout()
        self.add = QPushButton("Add layer")
        self.add.setToolTip("A lighter liquid on top: a new layer over the top one "
                            "(choose its liquid below)")
        self.remove = QPushButton("Remove")
        self.up = QPushButton("Up")
        self.down = QPushButton("Down")
        for b in (self.add, self.remove, self.up, self.down):
            buttons.addWidget(b)
        buttons.addStretch(1)
        lay.addLayout(buttons)
        top_row = QHBoxLayout()
        self.top_mode = QComboBox()
        self.top_mode.addItems(("Top at level", "Own volume"))
        self.top_value = QLineEdit()
        self.top_unit = QLabel()
        top_row.addWidget(self.top_mode)
        top_row.addWidget(self.top_value, 1)
        top_row.addWidget(self.top_unit)
        self.top_box = QWidget()
        self.top_box.setLayout(top_row)
        top_row.setContentsMargins(0, 0, 0, 0)
        lay.addWidget(self.top_box)
        self.top_note = QLabel()
        self.top_note.setStyleSheet(NOTE_STYLE)
        self.top_note.setWordWrap(True)
        lay.addWidget(self.top_note)
        self.error = message_label()
        lay.addWidget(self.error)

        self.add.clicked.connect(self._on_add)
        self.remove.clicked.connect(self._on_remove)
        self.up.clicked.connect(lambda: self._on_move(+1))
        self.down.clicked.connect(lambda: self._on_move(-1))
        self.list.currentRowChanged.connect(self._on_row_changed)
        self.top_mode.currentIndexChanged.connect(self._on_top_mode_changed)
        self.top_value.editingFinished.connect(self._on_top_edited)
        for signal in (document.liquidChanged, document.casesChanged,
                       document.activeCaseChanged, document.unitsChanged, document.solved):
            signal.connect(self._on_documentChanged)
        self._on_documentChanged()

    # ------------------------------------------------------------ reading
    @property
    def selected(self):
        """The selected layer (0 = the bottom one)."""
        return self._selected

    def layers(self):
        return editing.case_layers(self._doc)

    def _row_of(self, index, n):
        return n - 1 - index  # the top layer is the first row

    # ----------------------------------------------------------- document
    def _on_documentChanged(self, *_):
        layers = self.layers()
        n = len(layers)
        self._selected = min(max(self._selected, 0), n - 1)
        many = n > 1
        for w in (self.list, self.remove, self.up, self.down):
            if w.isHidden() == many:
                w.setVisible(many)
        sol = self._doc.solution
        loads = sol.layers if sol is not None and len(sol.layers) == n else None
        units = self._doc.units
        self.list.blockSignals(True)
        try:
            texts = []
            for i in reversed(range(n)):
                text = layer_word(i, layers[i].liquid.name)
                if loads is not None:
                    top = loads[i].top
                    text += (", up to the free surface at " if i == n - 1 else ", up to ") + \
                        units.fmt_length(top)
                texts.append(text)
            if [self.list.item(k).text() for k in range(self.list.count())] != texts:
                self.list.clear()
                for t in texts:
                    self.list.addItem(QListWidgetItem(t))
            self.list.setCurrentRow(self._row_of(self._selected, n))
        finally:
            self.list.blockSignals(False)
        self._write_top(layers)

    def _write_top(self, layers):
        n = len(layers)
        i = self._selected
        units = self._doc.units
        show = n > 1 and i < n - 1
        self.top_box.setVisible(show)
        self.up.setEnabled(i < n - 1)
        self.down.setEnabled(i > 0)
        if n > 1 and i == n - 1:
            self.top_note.setText("The top layer reaches the free surface: its top is the "
                                  "fill (above).")
        elif n > 1:
            self.top_note.setText("")
        self.top_note.setVisible(bool(self.top_note.text()) and n > 1)
        if not show:
            return
        layer = layers[i]
        for w in (self.top_mode, self.top_value):
            w.blockSignals(True)
        try:
            by_volume = layer.volume is not None
            self.top_mode.setCurrentIndex(1 if by_volume else 0)
            if by_volume:
                self.top_value.setText(format_number(units.volume(layer.volume), 6))
                self.top_unit.setText(units.units.label("volume"))
            else:
                self.top_value.setText(format_number(units.length(layer.top), 6))
                self.top_unit.setText(units.length_unit)
        finally:
            for w in (self.top_mode, self.top_value):
                w.blockSignals(False)

    # --------------------------------------------------------------- user
    def _run(self, edit):
        try:
            edit()
        except (LoadCaseError, FillError, ValueError) as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return False
        show_message(self.error, "")
        return True

    def _on_add(self):
        if self._run(lambda: editing.add_layer(self._doc)):
            self._selected = len(self.layers()) - 1
            self._on_documentChanged()
            self.selectionChanged.emit(self._selected)

    def _on_remove(self):
        i = self._selected
        if self._run(lambda: editing.remove_layer(self._doc, i)):
            self._selected = max(i - 1, 0)
            self._on_documentChanged()
            self.selectionChanged.emit(self._selected)

    def _on_move(self, step):
        i = self._selected
        if self._run(lambda: editing.move_layer(self._doc, i, step)):
            self._selected = i + step
            self._on_documentChanged()
            self.selectionChanged.emit(self._selected)

    def select(self, index):
        """Select layer ``index`` (0 = the bottom one)."""
        n = len(self.layers())
        self._selected = min(max(int(index), 0), n - 1)
        show_message(self.error, "")
        self._on_documentChanged()
        self.selectionChanged.emit(self._selected)

    def _on_row_changed(self, row):
        if row < 0:
            return
        self.select(self._row_of(row, len(self.layers())))

    def _on_top_mode_changed(self, _mode):
        self._on_top_edited()

    def _on_top_edited(self):
        doc = self._doc
        i = self._selected
        by_volume = self.top_mode.currentIndex() == 1
        layer = self.layers()[i]
        units = doc.units
        sol = doc.solution
        known = sol is not None and i < len(sol.layers)
        try:
            if by_volume and layer.volume is None:
                # Switching to a volume keeps the interface: the layer's volume now.
                args = (editing.set_layer_volume, sol.layers[i].volume if known else 0.0)
            elif not by_volume and layer.top is None:
                args = (editing.set_layer_top, sol.layers[i].top if known else 0.0)
            else:
                value = _number(self.top_value.text(), "Volume" if by_volume else "Level")
                args = ((editing.set_layer_volume, units.volume_si(value)) if by_volume
                        else (editing.set_layer_top, units.length_si(value)))
        except ValueError as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        function, value = args
        self._run(lambda: function(doc, i, float(value)))


class GasPanel(QGroupBox):
    """Gas over the surface (closed sections) and air under ceilings."""

    POCKET_CHOICES = ((VENTED, "Vented"), (TRAPPED, "Trapped"))

    def __init__(self, document, parent=None):
        super().__init__("Gas and trapped air", parent)
        self._doc = document
        form = QFormLayout(self)
        form.setFieldGrowthPolicy(QFormLayout.FieldGrowthPolicy.AllNonFixedFieldsGrow)
        self.gas = QLineEdit()
        self.gas.setToolTip("Gauge pressure over the free surface: positive, or a vacuum "
                            "down to -101.325 kPa")
        self._gas_label = QLabel()
        form.addRow(self._gas_label, self.gas)
        self.gas_reason = QLabel()
        self.gas_reason.setStyleSheet(NOTE_STYLE)
        self.gas_reason.setWordWrap(True)
        form.addRow(self.gas_reason)
        self.pockets = QComboBox()
        for key, text in self.POCKET_CHOICES:
            self.pockets.addItem(text, key)
        self.pockets.setToolTip("Vented: every pool stands at the level. Trapped: air under a "
                                "ceiling is compressed as the liquid rises (Boyle's law)")
        form.addRow("Air under ceilings", self.pockets)
        self.atmosphere = QLineEdit()
        self._atm_label = QLabel()
        form.addRow(self._atm_label, self.atmosphere)
        self.air_note = QLabel()
        self.air_note.setStyleSheet(NOTE_STYLE)
        self.air_note.setWordWrap(True)
        form.addRow(self.air_note)
        self.error = message_label()
        form.addRow(self.error)
        self._shown = None

        self.gas.editingFinished.connect(self._on_gas_edited)
        self.atmosphere.editingFinished.connect(self._on_atmosphere_edited)
        self.pockets.currentIndexChanged.connect(self._on_pockets_changed)
        for signal in (document.liquidChanged, document.casesChanged,
                       document.activeCaseChanged, document.unitsChanged,
                       document.sectionChanged):
            signal.connect(self._on_documentChanged)
        self._on_documentChanged()

    def _on_documentChanged(self, *_):
        doc = self._doc
        lc = doc.active_load_case
        units = doc.units
        section = doc.section
        label = units.units.label("pressure")
        self._gas_label.setText(f"Gas [{label} gauge]")
        self._atm_label.setText(f"Atmosphere [{label}]")
        widgets = (self.gas, self.pockets, self.atmosphere)
        for w in widgets:
            w.blockSignals(True)
        try:
            gas = format_number(units.pressure(lc.gas_pressure), 6)
            atm = format_number(units.pressure(lc.atmospheric_pressure), 7)
            self.gas.setText(gas)
            self.atmosphere.setText(atm)
            self._shown = (gas, atm, units.system, lc.gas_pressure, lc.atmospheric_pressure)
            self.pockets.setCurrentIndex(self.pockets.findData(lc.pockets))
        finally:
            for w in widgets:
                w.blockSignals(False)
        is_open = section.is_open
        self.gas.setEnabled(not is_open or lc.gas_pressure != 0.0)
        self.gas_reason.setText("Open section: its surface is at atmospheric pressure (a gas "
                                "pressure needs a closed section)." if is_open else "")
        self.gas_reason.setVisible(is_open)
        trapped = lc.pockets == TRAPPED
        self.atmosphere.setEnabled(trapped)
        if section.pocket_tree.may_trap:
            note = ("Air can be trapped under a ceiling of this section; the chart shows "
                    "both assumptions.")
        else:
            note = "No ceiling of this section can trap air: both assumptions agree."
        self.air_note.setText(note)
        show_message(self.error, "")

    def _run(self, edit):
        try:
            edit()
        except (LoadCaseError, ValueError) as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        show_message(self.error, "")

    def _on_gas_edited(self):
        doc = self._doc
        text = self.gas.text().strip()
        if self._shown is not None and text == self._shown[0] \
                and self._shown[3] == doc.active_load_case.gas_pressure:
            show_message(self.error, "")
            return
        try:
            value = doc.units.pressure_si(_number(text, "Gas pressure"))
        except ValueError as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        self._run(lambda: editing.set_gas_pressure(doc, float(value)))

    def _on_atmosphere_edited(self):
        doc = self._doc
        text = self.atmosphere.text().strip()
        if self._shown is not None and text == self._shown[1] \
                and self._shown[4] == doc.active_load_case.atmospheric_pressure:
            show_message(self.error, "")
            return
        try:
            value = doc.units.pressure_si(_number(text, "Atmospheric pressure"))
        except ValueError as exc:
            show_message(self.error, self._doc.units.explain(exc))
            return
        self._run(lambda: editing.set_atmospheric_pressure(doc, float(value)))

    def _on_pockets_changed(self, _index):
        mode = self.pockets.currentData()
        self._run(lambda: editing.set_pockets(self._doc, mode))
        self._on_documentChanged()

