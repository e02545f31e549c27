"""Section > Structure: the structure around the cavity and the ground.

Walls of a thickness (a base, a wall and a roof thickness, offset around the
cavity by :func:`wetline.core.structure.walls_of_thickness`; an open top
stays open), the material's unit weight (25 kN/m3 reinforced concrete by
default, EN 1991-1-1 Table A.1), an extra weight not drawn and an anchorage
(both in the units of the uplift check's resistances: per metre of width for
plane sections, totals for axisymmetric ones), and the ground: its level
and the dry and saturated unit weights of the soil (18 and 20 kN/m3 by
default, common practice; the site investigation governs). A structure
already there keeps its edited outline unless "Walls of a thickness" is
ticked. "Remove structure" takes it away with the ground (and the cases'
groundwater). The main window turns the answer into one undo step.
"""

from __future__ import annotations

from dataclasses import dataclass

from PySide6.QtWidgets import (
    QCheckBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QGroupBox,
    QLabel,
    QLineEdit,
    QPushButton,
    QVBoxLayout,
)

from wetline.app.window.message_labels import message_label, show_message
from wetline.app.window.panels import parse_number
from wetline.core.numbers import format_number
from wetline.core.structure import DEFAULT_SOIL_DRY, DEFAULT_SOIL_SATURATED, DEFAULT_UNIT_WEIGHT

__all__ = ["StructureDialog", "StructureChoice", "DEFAULT_THICKNESSES"]

DEFAULT_THICKNESSES = (0.4, 0.3, 0.3)
"""Base, wall and roof thickness [m] first offered (invented, a plausible
wet well in reinforced concrete)."""


@dataclass(frozen=True)
class StructureChoice:
    """What the dialog was told, in SI.

    Attributes
    ----------
    remove : bool
        Remove the structure (and the ground); the rest is then unused.
    walls : tuple of float or None
        (base, wall, roof) thickness [m] to build the outline from, or None
        to keep the structure's outline.
    unit_weight : float
        [N/m3]
    extra_weight, anchorage : float
        [N/m of width (plane) or N (axisymmetric)]
    ground : tuple of float or None
        (level [m], dry, saturated unit weight [N/m3]), or None: no ground.
    """

    remove: bool = False
    walls: tuple[float, float, float] | None = None
    unit_weight: float = DEFAULT_UNIT_WEIGHT
    extra_weight: float = 0.0
    anchorage: float = 0.0
    ground: tuple[float, float, float] | None = None


class StructureDialog(QDialog):
    """The structure's walls, material, extra weight, anchorage, and the ground."""

    def __init__(self, units, section, structure=None, ground=None, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Structure and ground")
        self._units = units
        self._section = section
        self.choice = None
        lay = QVBoxLayout(self)
        L = units.length_unit
        uw = units.unit_weight_label
        q, force = units.resistance_unit(section)
        self._force_q = q
        walls = QGroupBox("Walls of a thickness around the cavity")
        wf = QFormLayout(walls)
        self.rebuild = QCheckBox("Build the outline from these thicknesses")
        self.rebuild.setChecked(structure is None)
        self.rebuild.setEnabled(structure is not None)
        self.rebuild.setToolTip("A structure already there keeps its edited outline unless "
                                "this is ticked")
        wf.addRow(self.rebuild)
        self.base = QLineEdit()
        self.wall = QLineEdit()
        self.roof = QLineEdit()
        for edit, value in zip((self.base, self.wall, self.roof), DEFAULT_THICKNESSES,
                               strict=True):
            edit.setText(format_number(units.length(value), 6))
        wf.addRow(f"Base thickness [{L}]", self.base)
        wf.addRow(f"Wall thickness [{L}]", self.wall)
        wf.addRow(f"Roof thickness [{L}]", self.roof)
        note = QLabel("An open top stays open (flush with its rim). The outline can then be "
                      "edited vertex by vertex in the Vertices table (Structure).")
        note.setWordWrap(True)
        note.setStyleSheet("color: #445;")
        wf.addRow(note)
        lay.addWidget(walls)

        material = QGroupBox("Material and loads")
        mf = QFormLayout(material)
        scope = "total" if section.is_axisymmetric else "per m of width"
        self.unit_weight = QLineEdit(format_number(units.unit_weight(
            structure.unit_weight if structure is not None else DEFAULT_UNIT_WEIGHT), 6))
        self.unit_weight.setToolTip("25 kN/m3: reinforced concrete, EN 1991-1-1 Table A.1")
        self.extra = QLineEdit(format_number(units.units.to_display(
            0.0 if structure is None else structure.extra_weight, q), 6))
        self.extra.setToolTip(f"Equipment, ballast, a cover slab not drawn ({scope})")
        self.anchorage = QLineEdit(format_number(units.units.to_display(
            0.0 if structure is None else structure.anchorage, q), 6))
        self.anchorage.setToolTip(f"Tension piles or ground anchors holding it down ({scope})")
        mf.addRow(f"Unit weight [{uw}]", self.unit_weight)
        mf.addRow(f"Extra weight [{force}]", self.extra)
        mf.addRow(f"Anchorage [{force}]", self.anchorage)
        lay.addWidget(material)

        soil = QGroupBox("Ground around the structure")
        sf = QFormLayout(soil)
        self.has_ground = QCheckBox("Soil up to a ground level (vertical load on ledges and "
                                    "a buried roof; lateral earth pressure is not computed)")
        self.has_ground.setChecked(ground is not None or structure is None)
        sf.addRow(self.has_ground)
        top = float(section.outline[:, 1].max())
        self.ground_level = QLineEdit(format_number(units.length(
            top if ground is None else ground.level), 6))
        self.dry = QLineEdit(format_number(units.unit_weight(
            DEFAULT_SOIL_DRY if ground is None else ground.unit_weight_dry), 6))
        self.saturated = QLineEdit(format_number(units.unit_weight(
            DEFAULT_SOIL_SATURATED if ground is None else ground.unit_weight_saturated), 6))
        for edit in (self.dry, self.saturated):
            edit.setToolTip("Common practice; the site investigation governs")
        sf.addRow(f"Ground level [{L}]", self.ground_level)
        sf.addRow(f"Dry soil [{uw}]", self.dry)
        sf.addRow(f"Saturated soil [{uw}]", self.saturated)
        lay.addWidget(soil)

        self.error = message_label()
        lay.addWidget(self.error)
        buttons = QDialogButtonBox(
            QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        self.remove_button = QPushButton("Remove structure")
        self.remove_button.setEnabled(structure is not None)
        buttons.addButton(self.remove_button, QDialogButtonBox.ButtonRole.DestructiveRole)
        buttons.accepted.connect(self._on_ok)
        buttons.rejected.connect(self.reject)
        self.remove_button.clicked.connect(self._on_remove)
        lay.addWidget(buttons)
        self.rebuild.toggled.connect(self._on_rebuild_toggled)
        self.has_ground.toggled.connect(self._on_ground_toggled)
        self._on_rebuild_toggled(self.rebuild.isChecked())
        self._on_ground_toggled(self.has_ground.isChecked())
        # A refusal is of what OK read: it goes once a field is typed again.
        for edit in self.findChildren(QLineEdit):
            edit.textEdited.connect(self._forget_refusal)
        for box in (self.rebuild, self.has_ground):
            box.toggled.connect(self._forget_refusal)

    def _forget_refusal(self, *_):
        show_message(self.error, "")

    def _on_rebuild_toggled(self, on):
        for edit in (self.base, self.wall, self.roof):
            edit.setEnabled(on)

    def _on_ground_toggled(self, on):
        for edit in (self.ground_level, self.dry, self.saturated):
            edit.setEnabled(on)

    def read_choice(self):
        """The fields as a :class:`StructureChoice`; ValueError naming the
        field that is not a number or out of range."""
        u = self._units
        walls = None
        if self.rebuild.isChecked():
            walls = tuple(u.length_si(parse_number(e.text(), what)) for e, what in (
                (self.base, "Base thickness"), (self.wall, "Wall thickness"),
                (self.roof, "Roof thickness")))
            for value, what in zip(walls, ("Base", "Wall", "Roof"), strict=True):
                if not value > 0:
                    raise ValueError(f"{what} thickness must be positive")
        unit_weight = u.unit_weight_si(parse_number(self.unit_weight.text(), "Unit weight"))
        extra = u.units.from_display(parse_number(self.extra.text() or "0", "Extra weight"),
                                     self._force_q)
        anchorage = u.units.from_display(parse_number(self.anchorage.text() or "0",
                                                      "Anchorage"), self._force_q)
        for value, what in ((extra, "Extra weight"), (anchorage, "Anchorage")):
            if value < 0:
                raise ValueError(f"{what} must be >= 0")
        ground = None
        if self.has_ground.isChecked():
            ground = (u.length_si(parse_number(self.ground_level.text(), "Ground level")),
                      u.unit_weight_si(parse_number(self.dry.text(), "Dry soil")),
                      u.unit_weight_si(parse_number(self.saturated.text(), "Saturated soil")))
        return StructureChoice(False, walls, unit_weight, extra, anchorage, ground)

    def _on_ok(self):
        try:
            self.choice = self.read_choice()
        except ValueError as exc:
            show_message(self.error, self._units.explain(exc))
            return
        self.accept()

    def _on_remove(self):
        self.choice = StructureChoice(remove=True)
        self.accept()
