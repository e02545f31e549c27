"""Malformed section files: one clear line each, never a traceback or a warning.

Each class here was found by fuzzing ``wetline solve/table/export/report``
with mutated section files; each has a regression test. The range Wetline
computes with is core.limits (decided for Wetline, see DEVELOPERS.md); the
float facts used are IEEE 754 binary64 (largest finite 1.8e308, smallest
subnormal 5e-324) and Python's json module (reads NaN and Infinity, any
integer, and recurses on nesting).

Warnings are errors in this suite (pyproject.toml), so a numpy warning on
the way fails the test that meets it.
"""

import json
import math
import re

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from wetline.core import limits
from wetline.core.case import Case, CaseError
from wetline.core.liquids import Liquid, LiquidError, custom_liquid
from wetline.core.report_tables import level_load_table
from wetline.core.results import results_record
from wetline.core.section import Section, SectionError
from wetline.core.section_file import SectionFileError, loads_case
from wetline.core.units import SI
from wetline.core.uplift import PartResistance


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
    data.update(changes)
    return data


def refused(text):
    """The one-line message reading ``text`` (or a dict, dumped) gives."""
    if not isinstance(text, str):
        text = json.dumps(text)
    with pytest.raises(SectionFileError) as info:
        loads_case(text)
    message = str(info.value)
    assert "\n" not in message
    return message


def replace_number(data, old, new_text):
    """The JSON text of ``data`` with the number ``old`` written as ``new_text``."""
    text = json.dumps(data)
    assert text.count(old) == 1, text
    return text.replace(old, new_text)


# ------------------------------------------------------- the classes found


def test_nested_1000_deep_is_one_line_not_a_recursion_error():
    text = '{"format": "wetline-section", "version": 1, "name": ' + "[" * 1000 + "]" * 1000 + "}"
    assert refused(text) == "section file nests lists or objects too deeply to be a section file"


def test_nested_deeply_inside_a_vertex_is_shown_briefly():
    text = replace_number(tank(), "[2, 3]", "[2, " + "[" * 900 + "]" * 900 + "]")
    m = refused(text)
    assert m.startswith("outline vertex 2 must be an [x, z] pair of numbers, not [2, [[[[")
    assert len(m) < 120


def test_a_400_digit_integer_coordinate():
    text = replace_number(tank(), "[2, 3]", "[2, " + "9" * 400 + "]")
    assert refused(text) == ("outline vertex 2 has z = 999999999999999999999... m, "
                             "outside -1e7 to 1e7 m")


def test_a_5000_digit_integer_is_refused_the_same_way():
    # Beyond Python's 4300-digit limit for int(str), which json.loads would hit.
    text = replace_number(tank(), "[2, 3]", "[2, " + "9" * 5000 + "]")
    assert refused(text).startswith("outline vertex 2 has z = 9999")


def test_a_400_digit_integer_width():
    data = tank(geometry={"kind": "plane", "width": 7})
    text = replace_number(data, '"width": 7', '"width": ' + "9" * 400)
    assert refused(text) == "geometry.width must be 1e-6 to 1e7 m, not 999999999999999999999... m"


def test_coordinates_of_5e_324():
    tiny = tank(outline=[[0, 0], [5e-324, 0], [5e-324, 5e-324], [0, 5e-324]],
                fill={"level": 5e-324})
    assert refused(tiny) == ("outline vertex 1 has x = 5e-324 m; a coordinate is 0 or "
                             "at least 1e-100 m in size")


def test_one_coordinate_of_5e_324_in_a_good_outline():
    # 1 / (5e-324 - 0) overflows: the edge's inverse height would be inf.
    m = refused(tank(outline=[[0, 0], [2, 5e-324], [2, 3], [0, 3]]))
    assert m == ("outline vertex 1 has z = 5e-324 m; a coordinate is 0 or at least "
                 "1e-100 m in size")


def test_an_outline_too_small_to_compute_with():
    m = refused(tank(outline=[[0, 0], [1e-7, 0], [1e-7, 1e-7], [0, 1e-7]], fill={"level": 0}))
    assert m == "outline is 1e-07 m wide; an outline's width and height must be 1e-6 to 1e7 m"


def test_an_outline_too_large_to_compute_with():
    m = refused(tank(outline=[[-6e6, 0], [6e6, 0], [6e6, 3], [-6e6, 3]]))
    assert m == "outline is 1.2e+07 m wide; an outline's width and height must be 1e-6 to 1e7 m"


def test_a_small_outline_far_from_the_origin():
    # 0.5 m at 9e6 m: the coordinates keep only 9 digits of its size.
    m = refused(tank(outline=[[9e6, 0], [9e6 + 0.5, 0], [9e6 + 0.5, 3], [9e6, 3]]))
    assert m == ("outline is 0.5 m wide but reaches x = 9e+06 m; so far out it must be at "
                 "least 1e-7 of that, or its numbers lose their precision")


def test_a_density_of_1e308():
    assert refused(tank(fluid={"density": 1e308})) == (
        "fluid density must be 0.001 to 100000 kg/m3, not 1e+308 kg/m3")  # the file's text


def test_a_density_of_5e_324():
    assert refused(tank(fluid={"density": 5e-324})) == (
        "fluid density must be 0.001 to 100000 kg/m3, not 5e-324 kg/m3")


def test_coordinates_times_1e300():
    data = tank(outline=[[0, 0], [2e300, 0], [2e300, 3e300], [0, 3e300]],
                fill={"level": 1.5e300})
    assert refused(data) == "outline vertex 1 has x = 2e+300 m, outside -1e7 to 1e7 m"


def test_coordinates_in_a_unit_are_limited_in_metres():
    # 2e10 mm = 2e7 m: outside; 9e9 mm = 9e6 m: inside.
    data = tank(length_unit="mm", outline=[[0, 0], [2e10, 0], [2e10, 3000], [0, 3000]],
                geometry={"kind": "plane", "width": 1000}, fill={"level": 1500})
    assert refused(data) == "outline vertex 1 has x = 20000000000.0 mm, outside -1e7 to 1e7 m"


@pytest.mark.parametrize("token", ["NaN", "Infinity", "-Infinity"])
def test_nan_and_infinity_are_not_json_numbers(token):
    text = replace_number(tank(), "[2, 3]", f"[2, {token}]")
    assert refused(text) == (f"section file is not valid JSON (line 1, column "
                             f"{text.index(token) + 1}: {token} is not a number JSON allows)")


def test_nan_inside_a_string_is_text():
    case = loads_case(json.dumps(tank(name="NaN Infinity tank")))
    assert case.name == "NaN Infinity tank"


def test_nan_is_located_on_its_own_line():
    text = '{\n  "name": "NaN",\n  "gravity":   NaN\n}'
    assert refused(text) == ("section file is not valid JSON (line 3, column 16: NaN is not a "
                             "number JSON allows)")


def test_a_number_too_large_for_a_float_is_out_of_range():
    text = replace_number(tank(), '"gravity": 9.80665', '"gravity": 1e400')
    assert refused(text) == "gravity must be 0.001 to 1000 m/s2, not 1e400"


def test_a_json_object_that_is_not_a_section_file():
    assert refused({"hello": 1}) == (
        'not a Wetline section file (no "format": "wetline-section")')


def test_not_a_section_file_comes_before_anything_else():
    assert refused({"hello": 1, "version": "x", "outline": 5}) == (
        'not a Wetline section file (no "format": "wetline-section")')


def test_a_newer_version_is_said_before_its_unknown_keys():
    m = refused(tank(version=4, pumps={"walls": []}))
    assert m.startswith("section file version 4 is newer than this program reads")


# ------------------------------------------------------- every range, by key


@pytest.mark.parametrize("changes, expected", [
    ({"gravity": 1e-4}, "gravity must be 0.001 to 1000 m/s2, not 0.0001"),
    ({"gravity": 2000}, "gravity must be 0.001 to 1000 m/s2, not 2000"),
    ({"fluid": {"density": 1e-4}}, "fluid density must be 0.001 to 100000 kg/m3, "
                                   "not 0.0001 kg/m3"),
    ({"fluid": {"density": 200000}}, "fluid density must be 0.001 to 100000 kg/m3, "
                                     "not 200000 kg/m3"),
    ({"geometry": {"kind": "plane", "width": 1e-7}},
     "geometry.width must be 1e-6 to 1e7 m, not 1e-07 m"),
    ({"geometry": {"kind": "plane", "width": 2e7}},
     "geometry.width must be 1e-6 to 1e7 m, not 20000000.0 m"),
    ({"fill": {"level": 2e7}}, "fill.level must be -1e7 to 1e7 m, not 20000000.0 m"),
    ({"fill": {"level": -1e300}}, "fill.level must be -1e7 to 1e7 m, not -1e+300 m"),
    ({"outline": [[0, 0], [2, 0], [2, 3], [-2e7, 3]]},
     "outline vertex 3 has x = -20000000.0 m, outside -1e7 to 1e7 m"),
])
def test_out_of_range_values_name_the_key_and_the_range(changes, expected):
    assert refused(tank(**changes)) == expected


def test_resistances_are_limited():
    data = tank(version=2, uplift={"parts": {"wall": {"self_weight": 1e20}}})
    assert refused(data) == "uplift.parts.wall.self_weight must be at most 1e15 N/m, not 1e+20"
    axi = tank(version=2, geometry={"kind": "axisymmetric"},
               uplift={"parts": {"wall": {"holding_down": 2e15}}})
    assert refused(axi) == ("uplift.parts.wall.holding_down must be at most 1e15 N, "
                            "not 2000000000000000.0")


def test_huge_integers_in_the_fluid_are_refused_in_one_line():
    text = replace_number(tank(fluid={"preset": "fresh water", "temperature": 7}),
                          '"temperature": 7', '"temperature": ' + "9" * 400)
    assert refused(text) == "'temperature' in fluid must be a finite number, not inf"


def test_a_huge_version_is_shown_briefly():
    text = replace_number(tank(), '"version": 1', '"version": ' + "9" * 290)
    assert refused(text) == ("section file version 999999999999999999999... is newer than "
                             "this program reads (up to 3); use a newer Wetline")


# -------------------------------------------- the same ranges, in the engine


def test_section_build_limits_in_metres():
    with pytest.raises(SectionError, match=r"^vertex 1 has x = 2e\+07 m, outside -1e7 to 1e7 m$"):
        Section.build([[0, 0], [2e7, 0], [0, 1]])
    with pytest.raises(SectionError, match="a coordinate is 0 or at least 1e-100 m"):
        Section.build([[0, 0], [1, 1e-200], [0, 1]])
    with pytest.raises(SectionError, match=r"^outline is 5e-07 m high;"):
        Section.build([[0, 0], [1, 0], [1, 5e-7], [0, 5e-7]])
    with pytest.raises(SectionError, match=r"^width must be 1e-6 to 1e7 m, not 1e-09 m$"):
        Section.build([[0, 0], [1, 0], [0, 1]], width=1e-9)


def test_liquid_case_and_resistance_limits():
    with pytest.raises(LiquidError, match=r"^density must be 0.001 to 100000 kg/m3, not "):
        custom_liquid(1e6)
    with pytest.raises(LiquidError, match="0.001 to 100000 kg/m3"):
        Liquid("vapour", 1e-5, "given")
    s = Section.build([[0, 0], [2, 0], [2, 3], [0, 3]])
    with pytest.raises(CaseError, match=r"^gravity must be 0.001 to 1000 m/s2, not 1e\+06$"):
        Case(section=s, liquid=custom_liquid(1000.0), gravity=1e6, fill_level=1.0)
    with pytest.raises(CaseError, match=r"^fill level must be -1e7 to 1e7 m, not 1e\+08 m$"):
        Case(section=s, liquid=custom_liquid(1000.0), fill_level=1e8)
    with pytest.raises(ValueError, match=r"^self weight must be at most 1e15, not 1e\+16$"):
        PartResistance(self_weight=1e16)


def test_the_limits_are_those_of_core_limits():
    assert limits.COORDINATE_LIMIT == 1e7 and limits.EXTENT_RANGE == (1e-6, 1e7)
    assert limits.DENSITY_RANGE == (1e-3, 1e5) and limits.GRAVITY_RANGE == (1e-3, 1e3)
    assert limits.WIDTH_RANGE == (1e-6, 1e7) and limits.FORCE_LIMIT == 1e15


# ---------------------------------------- the corners of the range compute


CORNERS = [
    # (outline size [m], its distance from the origin [m], density [kg/m3], gravity [m/s2])
    (1e-6, 0.0, 1e-3, 1e-3),
    (1e-6, 0.0, 1e5, 1e3),
    (1e7, 0.0, 1e-3, 1e-3),
    (1e7, 0.0, 1e5, 1e3),
    (1.0, 1e7 - 1.0, 1e-3, 1e3),  # as far out as a 1 m outline may be
]


@pytest.mark.parametrize("axisymmetric", [False, True])
@pytest.mark.parametrize("size, offset, density, gravity", CORNERS)
def test_every_corner_of_the_range_gives_finite_results(size, offset, density, gravity,
                                                        axisymmetric):
    # A sump with an overhanging lid: every kind of edge (floor, walls,
    # a lid pushed up, an opening), at the extremes of every input.
    shape = np.array([[0, 0], [1, 0], [1, 0.6], [0.8, 0.6], [0.8, 1], [0, 1]])
    dx = 0.0 if axisymmetric else offset
    data = tank(outline=(shape * size + [dx, -offset]).tolist(),
                parts=["floor", "wall", "lid", "wall", "open", "axis" if axisymmetric else "wall"],
                geometry={"kind": "axisymmetric"} if axisymmetric else
                {"kind": "plane", "width": min(size, limits.WIDTH_RANGE[1])},
                fluid={"density": density}, gravity=gravity,
                fill={"level": 0.9 * size - offset})
    case = loads_case(json.dumps(data))
    record = results_record(case)
    json.dumps(record, allow_nan=False)  # no inf anywhere (NaN is written as null)
    assert record["fluid_weight"] > 0 and math.isfinite(record["fluid_weight"])
    assert record["parts"]["lid"]["down"] < 0  # pushed up
    # Equilibrium (physics-and-results.md) to round-off, which grows with the
    # distance from the origin (1e-7 of it: about 2e-9 of the loads).
    equilibrium = record["floor_force"] + record["support_reaction"]
    assert equilibrium == pytest.approx(record["fluid_weight"], rel=1e-9 if not offset else 1e-7)


# ------------------------------------------------------ fuzzing, kept as a test

NASTY = ["0", "-0", "-0.0", "5e-324", "-5e-324", "1e-310", "1e-100", "1e-7", "1e-6",
         "2.2250738585072014e-308", "1e7", "1.0000001e7", "1e15", "1e16", "1e300", "1e308",
         "1.8e308", "1e400", "-1e400", "9" * 40, "9" * 400, "-" + "9" * 400, "123456789012345678",
         "0.1", "-3.5", "1e5", "1e-3", "100001", "0.0009999"]
NUMBER = re.compile(r"-?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?")


@pytest.fixture(scope="module")
def sample_texts():
    from pathlib import Path

    folder = Path(__file__).resolve().parents[2] / "sample_sections"
    return [p.read_text(encoding="utf-8") for p in sorted(folder.glob("*.section.json"))]


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(data=st.data())
def test_mutated_numbers_are_refused_in_one_line_or_give_finite_results(sample_texts, data):
    # Any number of a bundled sample replaced by a value at or beyond the
    # edges of the range: reading refuses it in one line, or the solve and
    # its results record are finite (warnings are errors in this suite).
    text = data.draw(st.sampled_from(sample_texts))
    spans = [m.span() for m in NUMBER.finditer(text)]
    for _ in range(data.draw(st.integers(1, 3))):
        a, b = data.draw(st.sampled_from(spans))
        new = data.draw(st.sampled_from(NASTY))
        text = text[:a] + new + text[b:]
        spans = [m.span() for m in NUMBER.finditer(text)]
    try:
        case = loads_case(text)
    except ValueError as exc:
        assert "\n" not in str(exc) and len(str(exc)) < 300
        return
    try:
        record = results_record(case)
    except ValueError as exc:  # a fill volume the section cannot hold ...
        assert "\n" not in str(exc)
        return
    json.dumps(record, allow_nan=False)
    table = level_load_table(case, SI, 5)  # `wetline table`
    assert np.isfinite(np.asarray(table.rows, dtype=float)).all()
    for result in case.uplift():
        assert math.isfinite(result.worst_uplift) and math.isfinite(result.resistance)


@pytest.mark.parametrize("value", [10 ** 400, -(10 ** 400)])
def test_an_integer_beyond_any_float_given_as_a_value(value):
    # As a parsed object (not text): float() of it raises OverflowError.
    from wetline.core.liquids import liquid_from_spec

    finite = r"^'density' in fluid must be a finite number, not -?inf$"
    with pytest.raises(LiquidError, match=finite):
        liquid_from_spec({"density": value})
    with pytest.raises(LiquidError, match="must be a finite number"):
        liquid_from_spec({"preset": "fresh water", "temperature": value})
