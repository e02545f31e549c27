"""Every refusal of the version 3 groups of a section file, word for word.

The version 3 keys (``structure``, ``ground``, ``cases`` and each case's
keys) are read by one small reader each; these pin each message, with the
case it names, so that a change of structure cannot change what a user
reads. The format is the shared spec's ``section-format-v3.md``; where it
is silent, the decisions are in DEVELOPERS.md.
"""

import copy

import pytest

from wetline.core.section_file import (
    SectionFileError,
    case_from_dict,
    design_from_dict,
    loads_design,
)

STRUCTURE = [[-0.3, -0.4], [3.3, -0.4], [3.3, 2.8], [2.5, 2.8], [2.5, 4], [-0.3, 4]]


def well(**changes):
    """The wet well of the spec's example, version 3, one case."""
    data = {
        "format": "wetline-section", "version": 3, "name": "Wet well",
        "length_unit": "m", "geometry": {"kind": "plane", "width": 1.0},
        "outline": [[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
        "parts": ["floor", "wall", "roof", "riser", "open", "wall"],
        "fluid": {"density": 1000.0}, "fill": {"level": 3.2},
        "structure": {"outline": STRUCTURE},
        "ground": {"level": 4.0},
        "cases": [{"name": "normal"}],
    }
    for key, value in changes.items():
        if value is None:
            del data[key]
        else:
            data[key] = value
    return data


def case(**keys):
    """The well with one case 'c' holding ``keys``."""
    return well(cases=[dict({"name": "c"}, **keys)])


def closed(*cases):
    """The well with a lid over its riser (closed), no structure."""
    return well(parts=["floor", "wall", "roof", "riser", "lid", "wall"], structure=None,
                ground=None, cases=list(cases))


SEWAGE = {"name": "sewage", "density": 1010}
FAT = {"name": "fat", "density": 900}


def message(data):
    with pytest.raises(SectionFileError) as info:
        design_from_dict(copy.deepcopy(data))
    text = str(info.value)
    # The file-level reader checks the version 3 keys the same way.
    with pytest.raises(SectionFileError) as again:
        case_from_dict(copy.deepcopy(data))
    assert str(again.value) == text
    return text


@pytest.mark.parametrize("data, expected", [
    # versions
    (well(version=2), "key 'cases' needs section file version 3 (this file says version 2)"),
    (well(version=1, cases=None, ground=None),
     "key 'structure' needs section file version 3 (this file says version 1)"),
    (well(version=4), "section file version 4 is newer than this program reads (up to 3); "
                      "use a newer Wetline"),
    # structure
    (well(structure=[1]), "structure must be a JSON object"),
    (well(structure={"outline": STRUCTURE, "colour": 1}), "unknown key 'colour' in structure"),
    (well(structure={}), "missing key 'outline' in structure"),
    (well(structure={"outline": 5}), "structure.outline must be a list of [x, z] pairs"),
    (well(structure={"outline": [[0, 0], [1, "a"]]}),
     'structure.outline vertex 1 must be an [x, z] pair of numbers, not [1, "a"]'),
    (well(structure={"outline": [[0, 0], [1e8, 0], [0, 1]]}),
     "structure.outline vertex 1 has x = 100000000.0 m, outside -1e7 to 1e7 m"),
    (well(structure={"outline": [[0, 0], [1, 0], [0, 1]]}),
     "cavity vertex 1 at (3, 0) m lies outside the structure outline"),
    (well(structure={"outline": STRUCTURE, "parts": "x"}),
     "structure.parts must be a list of names, one per outer edge"),
    (well(structure={"outline": STRUCTURE, "parts": ["floor"] * 6}),
     "structure edge 0 is marked 'floor', a name only the cavity's edges take"),
    (well(structure={"outline": STRUCTURE, "unit_weight": -1}),
     "structure unit weight must be between 1 and 1e+06 N/m3, not -1"),
    (well(structure={"outline": STRUCTURE, "unit_weight": "heavy"}),
     'structure.unit_weight must be a number, not "heavy"'),
    (well(structure={"outline": STRUCTURE, "anchorage": -5}),
     "structure anchorage must be between 0 and 1e+15 N, not -5"),
    # ground
    (well(ground=5), "ground must be a JSON object"),
    (well(ground={"level": 4, "wet": 1}), "unknown key 'wet' in ground"),
    (well(ground={}), "missing key 'level' in ground"),
    (well(ground={"level": "4"}), 'ground.level must be a number, not "4"'),
    (well(ground={"level": 4, "unit_weight_dry": 0}),
     "ground unit weight dry must be between 1 and 1e+06 N/m3, not 0"),
    (well(structure=None), "ground needs a structure: soil stands on the structure's ledges"),
    # the list of cases
    (well(cases={"a": 1}), "cases must be a list of load cases"),
    (well(cases=[]), "cases is empty: leave it out for one case made of the file-level fluid "
                     "and fill"),
    (well(cases=[5]), "cases[0] must be a JSON object"),
    (well(cases=[{"fill": {"level": 1}}]), "cases[0]: missing key 'name'"),
    (well(cases=[{"name": ""}]), 'cases[0]: name must be non-empty text, not ""'),
    (well(cases=[{"name": 3}]), "cases[0]: name must be non-empty text, not 3"),
    (well(cases=[{"name": "a"}, {"name": "a"}]),
     "two load cases are named 'a'; names must be unique"),
    (well(cases=[{"name": "overflow", "levle": 1}]), "case 'overflow': unknown key 'levle'"),
    # a case's fill, liquid, gravity and load factor
    (case(fill={"levle": "spill"}), "case 'c': unknown key 'levle' in fill"),
    (case(fill={"level": "full"}),
     'case \'c\': fill.level must be a number, "spill" or "empty", not "full"'),
    (case(fill={"level": 1, "volume": 2}),
     'case \'c\': fill must give exactly one of "level" and "volume"'),
    (case(fill={"volume": -1}), "case 'c': fill.volume must be >= 0, not -1"),
    (case(fill={"level": 2e7}), "case 'c': fill.level must be -1e7 to 1e7 m, not 20000000.0 m"),
    (closed({"name": "c", "fill": {"level": "spill"}}),
     "case 'c': fill level 'spill' needs an open section (one with an 'open' edge)"),
    (case(fluid={"densty": 1000}), "case 'c': unknown key 'densty' in fluid"),
    (case(fluid={"density": 1000}, layers=[]), "case 'c': give 'fluid' or 'layers', not both"),
    (case(gravity=0), "case 'c': gravity must be positive, not 0"),
    (case(load_factor=0), "case 'c': load factor must be > 0 and at most 100, not 0"),
    (case(load_factor="1.2"), 'case \'c\': load_factor must be a number, not "1.2"'),
    # groundwater
    (case(groundwater=4.0), "case 'c': groundwater must be a JSON object"),
    (case(groundwater={}), "case 'c': missing key 'level' in groundwater"),
    (case(groundwater={"level": 4.0, "rho": 1}), "case 'c': unknown key 'rho' in groundwater"),
    (case(groundwater={"level": 5.0}),
     "case 'c': groundwater level 5 m is above the spill level 4 m of the open section: the "
     "water would flood the cavity"),
    (case(groundwater={"level": 3.0, "density": -1}),
     "case 'c': groundwater density must be between 0.001 and 100000 kg/m3, not -1"),
    (closed({"name": "c", "groundwater": {"level": 1}}),
     "case 'c': groundwater needs a structure (the structure's outline is what the water "
     "acts on)"),
    # layers
    (case(layers={}),
     'case \'c\': layers must be a list of {"fluid": ..., "top": z} objects, bottom up'),
    (case(layers=[]), "case 'c': layers must hold at least one layer"),
    (case(layers=[5]), "case 'c': layers[0] must be a JSON object"),
    (case(layers=[{"top": 1}]), "case 'c': missing key 'fluid' in layers[0]"),
    (case(layers=[{"fluid": SEWAGE, "depth": 1}, {"fluid": FAT}]),
     "case 'c': unknown key 'depth' in layers[0]"),
    (case(layers=[{"fluid": {"densty": 1010}, "top": 1}, {"fluid": FAT}]),
     "case 'c': layers[0]: unknown key 'densty' in fluid"),
    (case(layers=[{"fluid": SEWAGE, "top": 1, "volume": 2}, {"fluid": FAT}]),
     "case 'c': layers[0] gives both 'top' and 'volume'; give one"),
    (case(layers=[{"fluid": SEWAGE}, {"fluid": FAT}]),
     "case 'c': layer 1 'sewage' needs a top (the level of its upper interface) or a volume"),
    (case(layers=[{"fluid": SEWAGE, "top": 1}, {"fluid": FAT, "top": 2}]),
     "case 'c': the top layer (layer 2 'fat') reaches the case's fill level: give the fill "
     "(level or volume), not a top of the top layer"),
    (case(layers=[{"fluid": FAT, "top": 1}, {"fluid": SEWAGE}]),
     "case 'c': layer 2 'sewage' (1010 kg/m3) lies on layer 1 'fat' (900 kg/m3), which is "
     "lighter: immiscible liquids settle densest at the bottom"),
    (case(layers=[{"fluid": SEWAGE, "top": 2}, {"fluid": FAT, "top": 1},
                  {"fluid": {"name": "oil", "density": 800}}]),
     "case 'c': layer 2 'fat' has its top at 1 m, not above the top of layer 1 'sewage' at "
     "2 m: layer tops must rise"),
    (case(layers=[{"fluid": SEWAGE, "top": 3.5}, {"fluid": FAT}]),
     "case 'c': the fill level 3.2 m is not above the top of layer 1 'sewage' at 3.5 m: "
     "every layer but the top one must lie below the free surface"),
    (case(layers=[{"fluid": SEWAGE, "top": 4.5}, {"fluid": FAT}], fill={"level": "spill"}),
     "case 'c': the spill level 4 m is not above the top of layer 1 'sewage' at 4.5 m: "
     "every layer but the top one must lie below the free surface"),
    (case(layers=[{"fluid": SEWAGE, "volume": -1}, {"fluid": FAT}]),
     "case 'c': layers[0].volume must be >= 0, not -1"),
    (case(layers=[{"fluid": SEWAGE, "volume": 100}, {"fluid": FAT}]),
     "case 'c': layer 1 'sewage' volume 100 m3 with the layers below it makes 100 m3, more "
     "than the section holds"),
    (case(layers=[{"fluid": SEWAGE, "top": 1}, {"fluid": FAT}], fill={"level": "empty"}),
     "case 'c': an 'empty' fill holds no layers of liquid"),
    # gas, pockets, atmosphere
    (case(gas_pressure=1000),
     "case 'c': a gas pressure needs a closed section (no 'open' edge): an open section's "
     "surface is at atmospheric pressure"),
    (case(gas_pressure="x"), 'case \'c\': gas_pressure must be a number, not "x"'),
    (closed({"name": "c", "gas_pressure": -2e5}),
     "case 'c': gas pressure -200000 Pa is below a full vacuum (-101325 Pa gauge)"),
    (closed({"name": "c", "gas_pressure": -9e4, "atmospheric_pressure": 8e4}),
     "case 'c': gas pressure -90000 Pa gauge is below a full vacuum under an atmosphere of "
     "80000 Pa"),
    (case(pockets="sealed"), 'case \'c\': pockets must be "vented" or "trapped", not "sealed"'),
    (case(pockets=True), 'case \'c\': pockets must be "vented" or "trapped", not true'),
    (case(atmospheric_pressure=0),
     "case 'c': atmospheric pressure must be a positive number of Pa up to 1e+09, not 0"),
])
def test_each_version_3_refusal_says_exactly_this(data, expected):
    assert message(data) == expected


def test_a_full_vacuum_is_accepted_on_a_closed_section():
    d = design_from_dict(closed({"name": "c", "gas_pressure": -101325}))
    assert d.cases[0].gas_pressure == -101325.0


def test_a_structure_fault_carries_where():
    import json

    with pytest.raises(SectionFileError) as info:
        loads_design(json.dumps(well(structure={"outline": [[0, 0], [1, 0], [0, 1]]})))
    assert info.value.location == (3.0, 0.0)
