"""The exported diagram (SVG and PNG through the DiagramScene) of a case
with layers, a gas or trapped air: the interfaces across the cavity,
labelled with the liquids and the level, the upper layer tinted, each pocket
of trapped air with its interface and "trapped air p", the gas's label, and
the legend and title block naming them; every label laid out, none over
another, the caution always there.

What is drawn is what core computed (the pocket's interface and pressure
from Boyle's law, checked against a textbook case in tests/core); here the
drawing is compared with core's own solution of the case.
"""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import datetime
import xml.etree.ElementTree as ET

import numpy as np
import pytest

from wetline.app.render.geometry import layer_interfaces
from wetline.app.render.png import render_diagram
from wetline.app.render.scene import DiagramScene
from wetline.app.render.section_layers import layer_texts
from wetline.app.render.style import INTERFACE_LINE
from wetline.app.render.svg import render_svg
from wetline.core.results import CAUTION
from wetline.core.section_file import read_design
from wetline.core.units import display_units

SVG = "{http://www.w3.org/2000/svg}"
DATE = datetime.date(2026, 1, 2)
SIZES = ((1600, 1131), (1000, 700), (900, 1270))


def _case(sample, name, index):
    design = read_design(sample(name))
    return design.resolve(design.names[index]).as_case()


def _texts(svg):
    root = ET.fromstring(svg)
    return root, [e.text or "" for e in root.iter(SVG + "text")]


@pytest.mark.parametrize("size", SIZES)
def test_grease_trap_draws_its_interface_labelled(sample, size):
    case = _case(sample, "grease_trap", 0)
    sol = case.solve()
    du = display_units("si")
    root, texts = _texts(render_svg(case, size=size, date=DATE))
    joined = " ".join(texts)
    label = f"fats, oils and grease on raw sewage {du.text(1.85, 'length')}"
    assert label in joined
    assert "upper liquid layer (tinted) and its interface" in joined
    assert "Layer 2" in texts and "Layer 1" in texts
    # The interface is a dashed line across the cavity at 1.85 m, in its colour.
    scene = DiagramScene(case, sol, "si", size, DATE)
    assert [f.level for f in layer_interfaces(sol)] == [pytest.approx(1.85)]
    lines = [g for g in root.iter(SVG + "g") if g.get("stroke") == INTERFACE_LINE
             and g.get("stroke-dasharray")]
    assert lines, "no dashed line in the interface's colour"
    assert layer_texts(scene) == [label]
    words = joined.split()
    assert all(w in words for w in CAUTION.split()[:3])  # the caution is there, whole


@pytest.mark.parametrize("size", SIZES)
def test_trapped_air_drawn_with_its_pressure_and_the_caution_kept(sample, size):
    case = _case(sample, "chamber_with_lip", 1)  # riser full, air trapped
    sol = case.solve()
    assert len(sol.pockets) == 1
    pocket = sol.pockets[0]
    du = display_units("si")
    _, texts = _texts(render_svg(case, size=size, date=DATE))
    joined = " ".join(texts)
    assert f"trapped air {du.text(pocket.air_pressure, 'pressure')}" in joined
    assert "trapped air and its interface" in joined
    assert f"{du.text(pocket.air_pressure, 'pressure')} at " \
           f"{du.text(pocket.interface, 'length')}" in joined
    # Nothing is cut at the foot of the title block: the caution and the date.
    words = joined.split()
    assert all(w in words for w in CAUTION.split()[:3]), joined[-400:]
    assert CAUTION.split()[-1] in words
    assert "2026-01-02" in joined


def test_gas_over_the_surface_is_labelled(sample):
    from dataclasses import replace

    design = read_design(sample("closed_tank"))
    cases = [replace(design.load_cases[0], gas_pressure=20e3, fill_level=1.5)]  # roof at 2 m
    design = design.with_cases(cases)
    case = design.resolve(design.names[0]).as_case()
    du = display_units("si")
    _, texts = _texts(render_svg(case, size=(1600, 1131), date=DATE))
    joined = " ".join(texts)
    assert f"gas {du.text(20e3, 'pressure')}" in joined
    assert f"{du.text(20e3, 'pressure')} (gauge)" in joined


def test_png_labels_of_a_pocket_do_not_overlap(sample):
    """The label boxes the diagram placed, read back from its layout: none
    over another (the one layout engine's rule)."""
    from wetline.app.render import diagram_view

    boxes = []
    original = diagram_view.DiagramView.draw

    def spy(self, p):
        original(self, p)
        boxes.extend(self.labels.layout.boxes)

    diagram_view.DiagramView.draw = spy
    try:
        render_diagram(_case(sample, "chamber_with_lip", 1), size=(1600, 1131), date=DATE)
    finally:
        diagram_view.DiagramView.draw = original
    b = np.array(boxes)
    assert len(b) > 5
    for i in range(len(b)):
        for j in range(i + 1, len(b)):
            overlap_x = min(b[i, 2], b[j, 2]) - max(b[i, 0], b[j, 0])
            overlap_y = min(b[i, 3], b[j, 3]) - max(b[i, 1], b[j, 1])
            assert not (overlap_x > 0.5 and overlap_y > 0.5), (b[i], b[j])
