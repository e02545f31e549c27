"""New section from a template: pick a shape, type its dimensions in the
display length unit, and (plane sections) the width; a labelled sketch of
the shape shows what each dimension measures, as typed."""

from __future__ import annotations

from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QVBoxLayout,
)

from wetline.app.window.message_labels import ERROR_STYLE
from wetline.app.window.panels import parse_number
from wetline.app.window.template_sketch import TemplateSketch
from wetline.core.numbers import format_number
from wetline.core.section import SectionError
from wetline.core.templates import TEMPLATES

__all__ = ["TemplateDialog", "build_from_fields"]


def build_from_fields(template, texts, width_text, units, name=""):
    """The section and first level from typed dimension texts (display
    length unit). Raises ValueError / SectionError with a plain message."""
    dims = {}
    for d in template.dimensions:
        dims[d.key] = units.length_si(parse_number(texts[d.key], d.label))
    width = 1.0
    if template.kind == "plane":
        width = units.length_si(parse_number(width_text, "Width"))
        if not width > 0:
            raise ValueError("Width must be positive")
    section = template.build(name=name or template.title, width=width, **dims)
    return section, template.default_level(section)


class TemplateDialog(QDialog):
    """Choose a template and its dimensions."""

    def __init__(self, units, parent=None):
        super().__init__(parent)
        self.setWindowTitle("New section from a template")
        self._units = units
        self.result_section = None
        self.result_level = None
        outer = QHBoxLayout(self)
        lay = QVBoxLayout()
        outer.addLayout(lay, 0)
        self.sketch = TemplateSketch()
        outer.addWidget(self.sketch, 1)
        self.choice = QComboBox()
        for key, t in TEMPLATES.items():
            self.choice.addItem(f"{t.title} ({t.kind})", key)
        lay.addWidget(self.choice)
        self.description = QLabel()
        self.description.setWordWrap(True)
        lay.addWidget(self.description)
        self.form = QFormLayout()
        self.form.setFieldGrowthPolicy(QFormLayout.FieldGrowthPolicy.AllNonFixedFieldsGrow)
        lay.addLayout(self.form)
        self.error = QLabel()
        self.error.setStyleSheet(ERROR_STYLE)
        self.error.setWordWrap(True)
        lay.addWidget(self.error)
        buttons = QDialogButtonBox(
            QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        lay.addStretch(1)
        lay.addWidget(buttons)
        self.fields = {}
        self.width_field = None
        self.name_field = None
        self.choice.currentIndexChanged.connect(self._on_choice_changed)
        self._on_choice_changed()

    @property
    def template(self):
        return TEMPLATES[self.choice.currentData()]

    def _on_choice_changed(self, *_):
        while self.form.rowCount():
            self.form.removeRow(0)
        t = self.template
        L = self._units.length_unit
        self.description.setText(t.description)
        self.fields = {}
        self.name_field = QLineEdit(t.title)
        # Wide enough for a template's own name and a little more.
        self.name_field.setMinimumWidth(
            max(260, self.name_field.fontMetrics().horizontalAdvance(t.title + "MMMM")))
        self.form.addRow("Name", self.name_field)
        for d in t.dimensions:
            edit = QLineEdit(format_number(self._units.length(d.default), 6))
            edit.textEdited.connect(self._update_sketch)
            self.fields[d.key] = edit
            self.form.addRow(f"{d.label} [{L}]", edit)
        self.width_field = QLineEdit(format_number(self._units.length(1.0), 6))
        # A refusal is of the texts OK read: it goes once one is typed again.
        for edit in (self.name_field, self.width_field, *self.fields.values()):
            edit.textEdited.connect(self._forget_refusal)
        if t.kind == "plane":
            self.form.addRow(f"Width out of the drawing [{L}]", self.width_field)
        self.error.setText("")
        self._update_sketch()

    def _forget_refusal(self, *_):
        if self.error.text():
            self.error.setText("")

    def _update_sketch(self, *_):
        """The sketch at the dimensions typed (the last good one while a
        field does not read)."""
        values = {}
        for d in self.template.dimensions:
            try:
                values[d.key] = self._units.length_si(parse_number(self.fields[d.key].text(),
                                                                   d.label))
            except ValueError:
                return
        self.sketch.show_template(self.template, values, self._units)

    def select(self, key):
        self.choice.setCurrentIndex(self.choice.findData(key))

    def accept(self):
        try:
            texts = {k: e.text() for k, e in self.fields.items()}
            self.result_section, self.result_level = build_from_fields(
                self.template, texts, self.width_field.text(), self._units,
                self.name_field.text().strip())
        except (ValueError, SectionError) as exc:
            self.error.setText(self._units.explain(exc))
            return
        super().accept()
