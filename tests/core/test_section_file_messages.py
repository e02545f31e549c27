"""Every refusal of the section file reader, word for word.

The reader is split into one small reader per key group; these pin each
message (and which fault wins when a file has several) so that a change of
structure cannot change what a user reads. The format is the project's own
(section-format.md v1, docs/section-format-v2.md).
"""

import json

import pytest

from wetline.core.section_file import SectionFileError, case_from_dict, loads_case


def tank(**changes):
    data = {
        "format": "wetline-section",
        "version": 1,
        "name": "Open rectangular tank",
        "length_unit": "m",
        "geometry": {"kind": "plane", "width": 1.0},
        "outline": [[0, 0], [2, 0], [2, 3], [0, 3]],
        "parts": ["floor", "wall", "open", "wall"],
        "fluid": {"density": 1000.0},
        "gravity": 9.80665,
        "fill": {"level": 1.5},
    }
    for key, value in changes.items():
        if value is None:
            del data[key]
        else:
            data[key] = value
    return data


def v2(**changes):
    return tank(version=2, **changes)


def message(data):
    with pytest.raises(SectionFileError) as info:
        case_from_dict(data)
    return str(info.value)


@pytest.mark.parametrize("data, expected", [
    # the file as a whole, in the order the reader checks
    ([1, 2], "the file must be a JSON object"),
    (tank(format="wetline-results"), 'format must be "wetline-section", not "wetline-results"'),
    (tank(version=None), "missing key 'version'"),
    (tank(version=-1), "version must be a whole number >= 1, not -1"),
    (tank(version=4), "section file version 4 is newer than this program reads (up to 3); "
                      "use a newer Wetline"),
    (tank(colour="blue"), "unknown key 'colour'"),
    (tank(report={"project": "x"}),
     "key 'report' needs section file version 2 (this file says version 1)"),
    (tank(name=["a"]), "name must be text"),
    (tank(length_unit=None, name=None, parts=None, gravity=None) | {"length_unit": 1},
     'length_unit must be text such as "m" or "mm"'),
    (tank(length_unit=""), "length_unit: no length unit given"),
    (tank(length_unit="kg"), "length_unit: 'kg' is not a length unit"),
    # geometry
    (tank(geometry=None), "missing key 'geometry'"),
    (tank(geometry="plane"), "geometry must be a JSON object"),
    (tank(geometry={"kind": "plane", "depth": 1}), "unknown key 'depth' in geometry"),
    (tank(geometry={}), "missing key 'kind' in geometry"),
    (tank(geometry={"kind": None}), 'geometry.kind must be "plane" or "axisymmetric", not null'),
    (tank(geometry={"kind": "axisymmetric", "width": 1}),
     "geometry.width applies to plane sections only"),
    (tank(geometry={"kind": "plane", "width": None}), "geometry.width must be a number, not null"),
    (tank(geometry={"kind": "plane", "width": -2}), "geometry.width must be positive, not -2"),
    # outline and parts
    (tank(outline=None), "missing key 'outline'"),
    (tank(outline={"0": [0, 0]}), "outline must be a list of [x, z] pairs"),
    (tank(outline=[[0, 0], [2, 0], [2, True], [0, 3]]),
     "outline vertex 2 must be an [x, z] pair of numbers, not [2, true]"),
    (tank(outline=[[0, 0], [2, 0], 7, [0, 3]]),
     "outline vertex 2 must be an [x, z] pair of numbers, not 7"),
    (tank(parts=[1, 2, 3, 4]), "parts must be a list of names, one per edge"),
    (tank(parts=["floor", "wall", "open", " "]), "edge 3 has an empty part name"),
    (tank(outline=[[0, 0], [2, 0], [2, 3], [0, 3], [0, 3]], parts=None),
     "edge 3 has zero length (vertices 3 and 4 coincide)"),
    # fluid
    (tank(fluid=None), "missing key 'fluid'"),
    (tank(fluid={"preset": "brine"}), "unknown preset 'brine' in fluid "
                                      "(use 'fresh water' or 'seawater')"),
    (tank(fluid={"preset": "fresh water", "temperature": 120}),
     "fresh water is not liquid at 120 C and one atmosphere (it boils at 99.97 C)"),
    # gravity
    (tank(gravity="g"), 'gravity must be a number, not "g"'),
    (tank(gravity=-1), "gravity must be positive, not -1"),
    # fill
    (tank(fill=None), "missing key 'fill' (give \"level\" or \"volume\")"),
    (tank(fill=[1.5]), "fill must be a JSON object"),
    (tank(fill={"depth": 1}), "unknown key 'depth' in fill"),
    (tank(fill={}), 'fill must give exactly one of "level" and "volume"'),
    (tank(fill={"level": "1"}), 'fill.level must be a number, not "1"'),
    (tank(fill={"volume": -0.5}), "fill.volume must be >= 0, not -0.5"),
    (tank(fill={"volume": 7}),
     "fill volume 7 m3 is more than the section holds below its spill level (6 m3)"),
    # uplift (version 2)
    (v2(uplift=[1]), "uplift must be a JSON object"),
    (v2(uplift={"factor": 1}), "unknown key 'factor' in uplift"),
    (v2(uplift={"required_factor": "1"}), 'uplift.required_factor must be a number, not "1"'),
    (v2(uplift={"required_factor": -1}), "uplift.required_factor must be positive, not -1"),
    (v2(uplift={"parts": []}), "uplift.parts must be an object of part names"),
    (v2(uplift={"parts": {"open": {}}}),
     "uplift.parts names 'open', which is not a loaded part of the outline "
     "(parts: floor, wall)"),
    (v2(uplift={"parts": {"wall": 5}}), "uplift.parts.wall must be a JSON object"),
    (v2(uplift={"parts": {"wall": {"weight": 5}}}), "unknown key 'weight' in uplift.parts.wall"),
    (v2(uplift={"parts": {"wall": {"self_weight": "5"}}}),
     'uplift.parts.wall.self_weight must be a number, not "5"'),
    (v2(uplift={"parts": {"wall": {"holding_down": -5}}}),
     "uplift.parts.wall.holding_down must be >= 0, not -5"),
    # report (version 2)
    (v2(report="x"), "report must be a JSON object"),
    (v2(report={"author": "x"}), "unknown key 'author' in report"),
    (v2(report={"project": 5}), "report.project must be text"),
])
def test_each_refusal_says_exactly_this(data, expected):
    assert message(data) == expected


def test_a_good_version_2_file_reads():
    case = case_from_dict(v2(uplift={"required_factor": 1.5,
                                     "parts": {"wall": {"self_weight": 10.0}}},
                             report={"project": "Works", "prepared_by": "A. N. Engineer"}))
    assert case.required_uplift_factor == 1.5
    assert case.resistance_map["wall"].self_weight == 10.0
    assert case.report.project == "Works" and case.report.job_reference == ""


def test_the_section_error_carries_where():
    with pytest.raises(SectionFileError) as info:
        loads_case(json.dumps(tank(outline=[[0, 0], [2, 0], [2, 3], [2, 3]])))
    assert info.value.edges == (2,) and info.value.vertices == (2, 3)
    assert info.value.location == (2.0, 3.0)
