"""The results record's version 3 keys (section format v3, "Results"):
``case``, ``load_factor``, ``gas_pressure``, ``layers``, ``pockets`` and
``structure``, beside every version 1 key with its meaning.

Values are checked against hand calculations (hydrostatics of layers and a
gas, Cengel & Cimbala, Fluid Mechanics, sec. 3-1 to 3-4) and against the
solution the record is made from.
"""

import json

import pytest

from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import Design, LiquidLayer, LoadCase, case_record
from wetline.core.results import (
    ASSUMPTIONS,
    CAUTION,
    EARTH_PRESSURE_ASSUMPTION,
    EARTH_PRESSURE_CAUTION,
    results_record,
)
from wetline.core.section import Section
from wetline.core.structure import Groundwater, Structure

G0 = 9.80665
V1_KEYS = ("format", "version", "name", "geometry", "width", "density", "gravity", "level",
           "spill_level", "volume", "fluid_weight", "floor_force", "support_reaction",
           "max_pressure", "parts", "edges", "warnings", "assumptions")
V3_KEYS = ("case", "load_factor", "gas_pressure", "layers", "pockets", "structure")


def tank(top="open", name="tank"):
    return Section.build([[0, 0], [2, 0], [2, 4], [0, 4]], parts=["floor", "wall", top, "wall"],
                         name=name)


def record(design, name=None):
    rec = case_record(design.solve(name))
    json.dumps(rec, allow_nan=False)  # plain JSON
    return rec


def test_a_version_1_case_gets_the_version_3_keys_with_their_defaults():
    case = Case(tank(), custom_liquid(1000.0, "water"), fill_level=3.0)
    rec = results_record(case)
    for key in V1_KEYS + V3_KEYS:
        assert key in rec, key
    assert rec["case"] == "tank" and rec["load_factor"] == 1.0 and rec["gas_pressure"] == 0.0
    assert rec["layers"] == [{"name": "water", "density": 1000.0, "bottom": 0.0, "top": 3.0,
                              "volume": 6.0, "weight": pytest.approx(1000 * G0 * 6.0,
                                                                     rel=1e-12)}]
    assert rec["pockets"] == [] and rec["structure"] is None
    assert rec["assumptions"] == list(ASSUMPTIONS) and rec["cautions"] == CAUTION
    unnamed = Case(tank(name=""), custom_liquid(1000.0), fill_level=3.0)
    assert results_record(unnamed)["case"] == "case 1"


def test_layers_in_the_record_by_hand():
    # Fat 900 kg/m3 from 2.9 to 3.2 m on sewage 1010 kg/m3, 2 m wide: the
    # layers hold 5.8 and 0.6 m3; the record's density is the bottom one's and
    # its fluid weight the sum of both.
    d = Design(Case(tank(), custom_liquid(1000.0), fill_level=3.2), cases=(
        LoadCase("grease", load_factor=1.3,
                 layers=(LiquidLayer(custom_liquid(1010.0, "sewage"), top=2.9),
                         LiquidLayer(custom_liquid(900.0, "fat")))),))
    rec = record(d)
    assert (rec["case"], rec["load_factor"], rec["density"]) == ("grease", 1.3, 1010.0)
    assert [(la["name"], la["bottom"], la["top"]) for la in rec["layers"]] == [
        ("sewage", 0.0, 2.9), ("fat", 2.9, 3.2)]
    assert [la["volume"] for la in rec["layers"]] == pytest.approx([5.8, 0.6], rel=1e-12)
    assert rec["fluid_weight"] == pytest.approx(sum(la["weight"] for la in rec["layers"]),
                                                rel=1e-12)
    assert rec["fluid_weight"] == pytest.approx(G0 * (1010 * 5.8 + 900 * 0.6), rel=1e-12)
    assert rec["max_pressure"] == pytest.approx(G0 * (900 * 0.3 + 1010 * 2.9), rel=1e-12)
    assert rec["assumptions"][0].startswith(
        "hydrostatic, 2 immiscible liquid layers bottom up (sewage, fat)")


def test_gas_in_the_record_by_hand():
    # 15 kPa of gas over 1 m of water in a closed tank: the dry roof and the
    # dry parts of the walls carry the gas; the floor 15000 + 1000 g.
    d = Design(Case(tank("roof"), custom_liquid(1000.0, "water"), fill_level=1.0),
               cases=(LoadCase("gas", gas_pressure=15000.0),))
    rec = record(d)
    roof = rec["edges"][2]
    assert rec["gas_pressure"] == 15000.0
    assert roof["p_start"] == roof["p_end"] == 15000.0 and roof["wetted_length"] == 0.0
    assert rec["max_pressure"] == pytest.approx(15000.0 + 1000 * G0, rel=1e-12)
    assert rec["floor_force"] + rec["support_reaction"] == pytest.approx(rec["fluid_weight"],
                                                                         rel=1e-12)
    assert rec["assumptions"][1].startswith("a gas at 15000 Pa gauge over the free surface")


def test_trapped_pockets_in_the_record():
    chamber = Section.build([[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5], [0.8, 1.5], [0.8, 4],
                             [0, 4]],
                            parts=["floor", "wall", "roof", "lip", "lip", "riser", "open",
                                   "riser"], name="chamber")
    d = Design(Case(chamber, custom_liquid(1000.0, "water"), fill_level=3.5),
               cases=(LoadCase("air", pockets="trapped"),))
    solved = d.solve()
    rec = record(d)
    (p,) = solved.solution.pockets
    assert rec["pockets"] == [{"sealed_at": 1.5, "interface": p.interface,
                               "air_pressure": p.air_pressure, "air_volume": p.air_volume,
                               "split_at": None}]
    assert p.sealed_at < p.interface < 2.0
    assert "pockets trapped" in rec["assumptions"][0]
    assert rec["pockets_assumption"] == "trapped"


def test_a_structure_in_the_record_and_its_assumption():
    s = tank()
    box = Structure.build([[-0.3, -0.4], [2.3, -0.4], [2.3, 4], [-0.3, 4]], cavity=s)
    d = Design(Case(s, custom_liquid(1000.0), fill_level=2.0), box,
               cases=(LoadCase("flood", fill_level="empty", groundwater=Groundwater(4.0)),))
    rec = record(d)
    st = rec["structure"]
    # Buoyancy of the submerged box, 2.6 m x 4.4 m per metre (Archimedes).
    assert st["buoyancy"] == pytest.approx(1000 * G0 * 2.6 * 4.4, rel=1e-12)
    assert st["flotation"]["uplift"] == st["buoyancy"]
    assert EARTH_PRESSURE_ASSUMPTION in rec["assumptions"]
    assert rec["cautions"] == f"{CAUTION} {EARTH_PRESSURE_CAUTION}"
    for key in V1_KEYS + V3_KEYS:
        assert key in rec, key


def test_the_record_keeps_the_version_1_values_of_a_one_liquid_case(sample_path):
    from wetline.core.section_file import read_design

    d = read_design(sample_path)
    for name in d.names:
        rec = record(d, name)
        sol = d.solve(name).solution
        assert rec["volume"] == sol.volume and rec["max_pressure"] == sol.max_pressure
        assert [e["fz"] for e in rec["edges"]] == pytest.approx(sol.fz.tolist(), rel=0, abs=0)
        assert rec["floor_force"] + rec["support_reaction"] == pytest.approx(
            rec["fluid_weight"], rel=1e-9, abs=1e-9)
