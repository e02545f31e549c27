"""The document's designs in section files: read and written by core's
version 3 functions (structure, ground and cases), and recovery copies keep
every case. Every refusal and the versions 1 and 2 are tested in
tests/core/test_section_file_v3*.py."""

import json
from dataclasses import replace

import numpy as np

from wetline.app.model import editing, recovery
from wetline.app.model.cases import same_design
from wetline.app.model.document import Document
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import LoadCase
from wetline.core.section_file import (
    dumps_design,
    loads_design,
    read_design,
    write_design,
)
from wetline.core.structure import Groundwater

# The example of section-format-v3.md, without its layered and trapped-air
# cases (tested in tests/core/test_section_file_v3.py).
SPEC_EXAMPLE = {
    "format": "wetline-section", "version": 3, "name": "Wet well, pumping station 3",
    "length_unit": "m", "geometry": {"kind": "plane", "width": 1.0},
    "outline": [[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
    "parts": ["floor", "wall", "roof", "riser", "open", "wall"],
    "fluid": {"preset": "fresh water", "temperature": 10},
    "fill": {"level": 3.2},
    "structure": {
        "outline": [[-0.3, -0.4], [3.3, -0.4], [3.3, 2.8], [2.5, 2.8], [2.5, 4], [-0.3, 4]],
        "parts": ["base", "outer wall", "outer roof", "outer riser", "top", "outer wall"],
        "unit_weight": 25000, "extra_weight": 0, "anchorage": 0},
    "ground": {"level": 4.0, "unit_weight_dry": 18000, "unit_weight_saturated": 20000},
    "cases": [
        {"name": "normal top water"},
        {"name": "overflow", "fill": {"level": "spill"}},
        {"name": "empty, flood groundwater", "fill": {"level": "empty"},
         "groundwater": {"level": 4.0}},
    ],
}


def test_the_spec_example_reads(tmp_path):
    path = tmp_path / "well.section.json"
    path.write_text(json.dumps(SPEC_EXAMPLE))
    d = read_design(path)
    assert d.names == ("normal top water", "overflow", "empty, flood groundwater")
    assert d.structure.parts[0] == "base" and d.structure.unit_weight == 25000.0
    assert d.ground.level == 4.0
    assert d.cases[2].groundwater == Groundwater(4.0, 1000.0)  # density default (spec)
    assert d.resolve("overflow").level == 4.0  # the riser's open top


def test_a_design_round_trips_exactly_at_version_3(buried_wet_well, tmp_path):
    d = buried_wet_well()
    cases = list(d.cases) + [
        LoadCase("brine, half full", liquid=custom_liquid(1200.0, "brine"), fill_volume=4.5,
                 gravity=9.81, groundwater=Groundwater(1.5, 1025.0), load_factor=1.2)]
    s = d.structure.replace(d.section, extra_weight=2500.0, anchorage=10000.0,
                            parts=("base",) + ("outer wall",) * 5)
    from wetline.core.load_cases import Design

    d = Design(d.case, structure=s, ground=d.ground, cases=tuple(cases))
    path = tmp_path / "well.section.json"
    write_design(d, path)
    text = path.read_text()
    assert json.loads(text)["version"] == 3
    back = read_design(path)
    assert same_design(back, d)
    assert dumps_design(back) == text


def test_lengths_in_mm_round_trip_exactly(buried_wet_well, tmp_path):
    d = buried_wet_well()
    d = d.with_case(d.case.with_length_unit("mm"))
    text = dumps_design(d)
    data = json.loads(text)
    assert data["structure"]["outline"][0] == [-300, -400]
    assert data["ground"]["level"] == 4000
    back = loads_design(text)
    assert same_design(back, d)
    np.testing.assert_array_equal(back.structure.outline, d.structure.outline)


def test_a_design_without_cases_is_written_at_the_lowest_version(buried_wet_well):
    d = buried_wet_well(cases=False).with_structure(None)
    assert json.loads(dumps_design(d))["version"] == 1


def test_a_recovery_copy_keeps_the_cases_and_the_structure(buried_wet_well, tmp_path):
    d = buried_wet_well()
    copy = recovery.write_copy(tmp_path, "w", d, "well", None)
    assert same_design(recovery.read_copy(copy), d)


def test_the_autosaver_writes_the_whole_design(qtbot, buried_wet_well, tmp_path):
    doc = Document(buried_wet_well(), "/jobs/well.section.json", saved=True)
    saver = recovery.Autosaver(doc, tmp_path, interval_s=60, first_delay_s=0.05)
    with qtbot.waitSignal(saver.written, timeout=5000) as got:
        editing.add_case(doc)
    back = recovery.read_copy(got.args[0])
    assert back.names[-1] == "case 5"
    assert same_design(back, doc.design)
    saver.close()


def test_resistances_of_gone_parts_are_not_written_with_the_cases(buried_wet_well):
    from wetline.core.uplift import PartResistance

    d = buried_wet_well()
    d = d.with_case(d.case.with_resistance("gone", PartResistance(self_weight=5.0))
                    .with_resistance("roof", PartResistance(self_weight=7500.0)))
    saved = recovery.design_to_save(d)
    assert dict(saved.case.resistances) == {"roof": PartResistance(self_weight=7500.0)}
    assert saved.cases == d.cases
    assert replace(saved.case, resistances=d.case.resistances) == d.case
