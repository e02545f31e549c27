"""Section files (``*.section.json``, version 1): reading, writing, refusals.

The format is the project's own (shared spec section-format.md); the results
that a file gives are those of physics-and-results.md. Each refusal the
format spec lists has a test here that checks its message; the geometric
ones are checked in more detail against Section.build in
test_section_validation.py.
"""

import json
import math
import os

import numpy as np
import pytest

import wetline.core.atomic_write as atomic_write
import wetline.core.section_file as section_file
from wetline.core.case import Case
from wetline.core.liquids import custom_liquid, fresh_water, seawater
from wetline.core.section import Section
from wetline.core.section_file import (
    SectionFileError,
    case_from_dict,
    dumps_case,
    loads_case,
    read_section_file,
    write_section_file,
)
from wetline.core.templates import TEMPLATES

TIGHT = 1e-9

# The example file of the format spec (section-format.md), verbatim.
SPEC_EXAMPLE = """\
{
  "format": "wetline-section",
  "version": 1,
  "name": "Pump sump, north bay",
  "length_unit": "m",
  "geometry": {"kind": "plane", "width": 1.0},
  "outline": [[0, 0], [2.4, 0], [2.4, 1.6], [1.9, 1.6], [1.9, 2.8], [0, 2.8]],
  "parts":   ["floor", "wall", "lid", "wall", "open", "wall"],
  "fluid":   {"name": "fresh water", "density": 998.2},
  "gravity": 9.80665,
  "fill":    {"level": 2.2}
}
"""


def tank_file(**changes):
    """The open rectangular tank of the results example in the physics spec:
    outline (0,0) (2,0) (2,3) (0,3), parts floor, wall, open, wall, water at
    1000 kg/m3, level 1.5 m, 1 m wide. ``changes`` replace top-level keys
    (None deletes one)."""
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


def refused(data):
    """The message of the SectionFileError that reading ``data`` raises."""
    text = data if isinstance(data, str) else json.dumps(data)
    with pytest.raises(SectionFileError) as info:
        loads_case(text)
    message = str(info.value)
    assert "\n" not in message  # one line
    return message


# --------------------------------------------------------- the spec's files


def test_spec_example_file_reads():
    case = loads_case(SPEC_EXAMPLE)
    s = case.section
    assert s.name == "Pump sump, north bay"
    assert s.kind == "plane" and s.width == 1.0
    np.testing.assert_array_equal(
        s.outline, [[0, 0], [2.4, 0], [2.4, 1.6], [1.9, 1.6], [1.9, 2.8], [0, 2.8]])
    assert s.parts == ("floor", "wall", "lid", "wall", "open", "wall")
    assert case.liquid.name == "fresh water" and case.liquid.density == 998.2
    assert case.gravity == 9.80665
    assert case.fill_level == 2.2 and case.fill_volume is None
    assert case.length_unit == "m"
    assert s.spill_level == 2.8  # the lowest point of the open edge
    r = case.solve()
    assert r.level == 2.2 and r.warnings == ()
    # The lid overhangs the water: pushed up by rho g (2.2 - 1.6) x 0.5 m.
    assert r.parts["lid"].down == pytest.approx(-998.2 * 9.80665 * 0.6 * 0.5, rel=TIGHT)


def test_results_example_of_the_physics_spec():
    # physics-and-results.md, "Results record": the numbers printed there.
    r = case_from_dict(tank_file()).solve()
    assert r.level == 1.5 and r.spill_level == 3.0
    assert r.volume == pytest.approx(3.0, rel=TIGHT)
    assert r.fluid_weight == pytest.approx(29419.95, rel=TIGHT)
    assert r.floor_force == pytest.approx(29419.95, rel=TIGHT)
    assert r.support_reaction == pytest.approx(0.0, abs=TIGHT * 29419.95)
    assert r.max_pressure == pytest.approx(14709.975, rel=TIGHT)
    assert r.parts["floor"].fz == pytest.approx(-29419.95, rel=TIGHT)
    assert r.parts["floor"].down == pytest.approx(29419.95, rel=TIGHT)
    assert r.parts["wall"].fx == pytest.approx(0.0, abs=TIGHT * 29419.95)
    assert r.parts["wall"].fz == 0.0
    assert set(r.parts) == {"floor", "wall"}  # open left out
    # Edge 0, the floor.
    assert r.wetted_length[0] == pytest.approx(2.0, rel=TIGHT)
    assert r.p_start[0] == pytest.approx(14709.975, rel=TIGHT)
    assert r.p_end[0] == pytest.approx(14709.975, rel=TIGHT)
    assert r.fx[0] == 0.0
    assert r.fz[0] == pytest.approx(-29419.95, rel=TIGHT)
    assert r.resultant[0] == pytest.approx(29419.95, rel=TIGHT)
    np.testing.assert_allclose(r.centre_of_pressure[0], [1.0, 0.0], rtol=TIGHT, atol=TIGHT)
    # Edge 1, the right wall.
    assert r.wetted_length[1] == pytest.approx(1.5, rel=TIGHT)
    assert r.p_start[1] == pytest.approx(14709.975, rel=TIGHT)
    assert r.p_end[1] == 0.0
    assert r.fx[1] == pytest.approx(11032.48125, rel=TIGHT)
    assert r.fz[1] == 0.0
    assert r.resultant[1] == pytest.approx(11032.48125, rel=TIGHT)
    np.testing.assert_allclose(r.centre_of_pressure[1], [2.0, 0.5], rtol=TIGHT, atol=TIGHT)
    assert np.all(np.isnan(r.hoop_start)) and np.all(np.isnan(r.hoop_end))
    assert r.warnings == ()


# ------------------------------------------------------------ fill levels


def test_level_above_spill_is_capped_with_a_warning():
    case = case_from_dict(tank_file(fill={"level": 4.0}))
    assert case.fill_level == 4.0  # the request is kept as written
    r = case.solve()
    assert r.requested_level == 4.0
    assert r.level == 3.0
    assert r.warnings == ("level 4 m is above the spill level 3 m; capped at the spill level",)
    assert r.fluid_weight == pytest.approx(1000 * 9.80665 * 6.0, rel=TIGHT)


def test_closed_section_accepts_a_level_above_its_top():
    data = tank_file(parts=["floor", "wall", "roof", "wall"], fill={"level": 4.5})
    r = case_from_dict(data).solve()
    assert r.level == 4.5
    assert len(r.warnings) == 1 and "standpipe head of 1.5 m" in r.warnings[0]
    assert r.head_above_top == 1.5
    # Full cavity; the roof pushed up by the 1.5 m head over its 2 m.
    assert r.volume == pytest.approx(6.0, rel=TIGHT)
    assert r.parts["roof"].down == pytest.approx(-1000 * 9.80665 * 1.5 * 2.0, rel=TIGHT)


def test_fill_by_volume_is_solved_for_the_level():
    case = case_from_dict(tank_file(fill={"volume": 4.5}))
    assert case.fill_volume == 4.5 and case.fill_level is None
    assert case.level == pytest.approx(2.25, rel=TIGHT)
    assert case.solve().volume == pytest.approx(4.5, rel=TIGHT)


def test_fill_volume_in_m3_whatever_the_length_unit():
    # Format spec: fill.volume is in m3 (area x width), not in the file's unit.
    data = tank_file(length_unit="mm", outline=[[0, 0], [2000, 0], [2000, 3000], [0, 3000]],
                     geometry={"kind": "plane", "width": 1000}, fill={"volume": 3.0})
    assert case_from_dict(data).level == pytest.approx(1.5, rel=TIGHT)


# ---------------------------------------------------- refusals, with messages


def test_fewer_than_three_distinct_vertices():
    m = refused(tank_file(outline=[[0, 0], [2, 0]], parts=["floor", "wall"]))
    assert m == "outline has 2 distinct vertices, need at least 3"


@pytest.mark.parametrize("token", ["NaN", "Infinity", "-Infinity"])
def test_non_finite_coordinate(token):
    # Strict JSON (RFC 8259, section 6) cannot hold NaN, but Python's json
    # module reads NaN and Infinity; the reader refuses them as JSON does.
    text = json.dumps(tank_file()).replace("[2, 3]", f"[2, {token}]")
    assert token in text
    assert refused(text) == (f"section file is not valid JSON (line 1, column "
                             f"{text.index(token) + 1}: {token} is not a number JSON allows)")


def test_non_finite_coordinate_given_as_a_value():
    data = tank_file()
    data["outline"][2] = [2, math.nan]
    with pytest.raises(SectionFileError, match="^vertex 2 has a non-finite coordinate$"):
        case_from_dict(data)


@pytest.mark.parametrize("key, where", [("gravity", ""), ("width", "geometry."),
                                        ("level", "fill.")])
def test_non_finite_numbers_elsewhere(key, where):
    data = tank_file()
    target = {"gravity": data, "width": data["geometry"], "level": data["fill"]}[key]
    target[key] = math.nan
    with pytest.raises(SectionFileError) as info:
        case_from_dict(data)  # a parsed object; as text NaN is not JSON
    assert str(info.value) == f"{where}{key} must be a finite number"


def test_non_finite_density():
    with pytest.raises(SectionFileError) as info:
        case_from_dict(tank_file(fluid={"density": math.inf}))
    assert str(info.value) == "'density' in fluid must be a finite number, not inf"


def test_self_intersecting_outline_names_the_edges():
    m = refused(tank_file(outline=[[0, 0], [2, 3], [2, 0], [0, 3]]))
    assert m == "outline crosses itself between edges 0 and 2"


def test_self_intersection_carries_where_from_the_file():
    with pytest.raises(SectionFileError) as info:
        loads_case(json.dumps(tank_file(outline=[[0, 0], [2, 3], [2, 0], [0, 3]])))
    assert info.value.edges == (0, 2)
    assert info.value.location == pytest.approx((1.0, 1.5))


def test_zero_area_outline():
    m = refused(tank_file(outline=[[0, 0], [1, 0], [2, 0]], parts=None))
    assert m == "outline doubles back on itself along edges 0 and 2"


def test_zero_length_edge():
    m = refused(tank_file(outline=[[0, 0], [2, 0], [2, 3], [2, 3]]))
    assert m == "edge 2 has zero length (vertices 2 and 3 coincide)"


def test_parts_of_the_wrong_length():
    m = refused(tank_file(parts=["floor", "wall", "open"]))
    assert m == "parts has 3 names but the outline has 4 edges"


@pytest.mark.parametrize("density, shown", [(0, "0"), (-998.2, "-998.2")])
def test_density_not_positive(density, shown):
    m = refused(tank_file(fluid={"density": density}))
    assert m == f"fluid density must be positive, not {shown} kg/m3"


@pytest.mark.parametrize("gravity, shown", [(0, "0"), (-9.81, "-9.81")])
def test_gravity_not_positive(gravity, shown):
    assert refused(tank_file(gravity=gravity)) == f"gravity must be positive, not {shown}"


@pytest.mark.parametrize("width, shown", [(0, "0"), (-1.5, "-1.5")])
def test_width_not_positive(width, shown):
    m = refused(tank_file(geometry={"kind": "plane", "width": width}))
    assert m == f"geometry.width must be positive, not {shown}"


def test_width_on_an_axisymmetric_section():
    m = refused(tank_file(geometry={"kind": "axisymmetric", "width": 1.0}))
    assert m == "geometry.width applies to plane sections only"


def test_negative_x_in_an_axisymmetric_outline():
    m = refused(tank_file(geometry={"kind": "axisymmetric"},
                          outline=[[-1, 0], [2, 0], [2, 3], [0, 3]]))
    assert m == ("vertex 0 has x = -1 m < 0; an axisymmetric outline lies at x >= 0 "
                 "(x is the radius)")


def test_negative_x_in_file_units_is_reported_in_the_files_unit():
    # Core checks the outline in metres; the file's author reads the value
    # written in the file's unit (it said "-0.5 m" for a file in mm).
    m = refused(tank_file(geometry={"kind": "axisymmetric"}, length_unit="mm",
                          outline=[[-500, 0], [2000, 0], [2000, 3000], [0, 3000]]))
    assert m.startswith("vertex 0 has x = -500 mm < 0")


def test_fill_volume_larger_than_below_the_spill_level():
    m = refused(tank_file(fill={"volume": 6.5}))
    assert m == "fill volume 6.5 m3 is more than the section holds below its spill level (6 m3)"


def test_fill_volume_larger_than_a_closed_section():
    m = refused(tank_file(parts=["floor", "wall", "roof", "wall"], fill={"volume": 7}))
    assert m == "fill volume 7 m3 is more than the section holds in all (6 m3)"


def test_negative_fill_volume():
    assert refused(tank_file(fill={"volume": -1})) == "fill.volume must be >= 0, not -1"


@pytest.mark.parametrize("unit", ["mtr", "metres per second", "2 m", "kg", "psi"])
def test_unknown_unit(unit):
    m = refused(tank_file(length_unit=unit))
    assert m.startswith("length_unit: ")
    assert repr(unit) in m


def test_unknown_unit_message():
    assert refused(tank_file(length_unit="mtr")) == "length_unit: unknown length unit 'mtr'"


def test_unit_with_stray_punctuation_is_refused():
    # "mm!" is no unit; pint's parser reads it as "mm", so a typo in a file
    # would be accepted silently (and written back as "mm!").
    assert refused(tank_file(length_unit="mm!")) == "length_unit: unknown length unit 'mm!'"


def test_unknown_top_level_key():
    data = tank_file()
    data["colour"] = "blue"
    assert refused(data) == "unknown key 'colour'"


@pytest.mark.parametrize("section, key", [
    ("fluid", "densty"),
    ("geometry", "depth"),
    ("fill", "height"),
])
def test_unknown_nested_key(section, key):
    data = tank_file()
    if section == "fluid":
        data["fluid"] = {"densty": 1000.0}  # the spec's own example of a misspelling
    else:
        data[section][key] = 1.0
    assert refused(data) == f"unknown key {key!r} in {section}"


def test_misspelt_density_next_to_a_good_one_is_still_refused():
    assert refused(tank_file(fluid={"density": 1000.0, "densty": 998.2})) == (
        "unknown key 'densty' in fluid")


def test_newer_version():
    newer = section_file.VERSION + 1
    m = refused(tank_file(version=newer))
    assert m == (f"section file version {newer} is newer than this program reads "
                 f"(up to {section_file.VERSION}); use a newer Wetline")


def test_much_newer_version():
    assert refused(tank_file(version=99)).startswith("section file version 99 is newer")


@pytest.mark.parametrize("version", [0, "1", 1.0, True, None])
def test_version_of_the_wrong_type(version):
    data = tank_file()
    data["version"] = version
    m = refused(data)
    assert m == f"version must be a whole number >= 1, not {json.dumps(version)}"


def test_missing_version():
    assert refused(tank_file(version=None)) == "missing key 'version'"


@pytest.mark.parametrize("fmt", ["wetline-results", 1])
def test_wrong_format(fmt):
    m = refused(tank_file(format=fmt))
    assert m == f"format must be \"wetline-section\", not {json.dumps(fmt)}"


def test_missing_format():
    assert refused(tank_file(format=None)) == (
        'not a Wetline section file (no "format": "wetline-section")')


@pytest.mark.parametrize("key", ["geometry", "outline", "fluid", "fill"])
def test_missing_required_key(key):
    assert refused(tank_file(**{key: None})).startswith(f"missing key '{key}'")


def test_missing_kind():
    assert refused(tank_file(geometry={"width": 1.0})) == "missing key 'kind' in geometry"


@pytest.mark.parametrize("data, message", [
    (tank_file(gravity="9.81"), 'gravity must be a number, not "9.81"'),
    (tank_file(gravity=True), "gravity must be a number, not true"),
    (tank_file(geometry={"kind": "plane", "width": "1"}),
     'geometry.width must be a number, not "1"'),
    (tank_file(fill={"level": [1.5]}), "fill.level must be a number, not [1.5]"),
    (tank_file(fill={"volume": "3"}), 'fill.volume must be a number, not "3"'),
    (tank_file(fluid={"density": "1000"}), "'density' in fluid must be a number, not str"),
    (tank_file(name=5), "name must be text"),
    (tank_file(length_unit=0.001), 'length_unit must be text such as "m" or "mm"'),
    (tank_file(geometry={"kind": "prism"}),
     'geometry.kind must be "plane" or "axisymmetric", not "prism"'),
    (tank_file(geometry=[1.0]), "geometry must be a JSON object"),
    (tank_file(fill=1.5), "fill must be a JSON object"),
    (tank_file(fluid=1000), "fluid must be an object, not int"),
    (tank_file(outline="square"), "outline must be a list of [x, z] pairs"),
    (tank_file(outline=[[0, 0], [2, 0], [2, "3"], [0, 3]]),
     'outline vertex 2 must be an [x, z] pair of numbers, not [2, "3"]'),
    (tank_file(outline=[[0, 0], [2, 0, 1], [2, 3], [0, 3]]),
     "outline vertex 1 must be an [x, z] pair of numbers, not [2, 0, 1]"),
    (tank_file(parts="wall"), "parts must be a list of names, one per edge"),
    (tank_file(parts=["floor", "wall", None, "wall"]),
     "parts must be a list of names, one per edge"),
])
def test_wrong_types_name_the_key(data, message):
    assert refused(data) == message


def test_not_an_object():
    assert refused("[1, 2, 3]") == "the file must be a JSON object"


def test_fill_with_both_level_and_volume():
    m = refused(tank_file(fill={"level": 1.0, "volume": 2.0}))
    assert m == 'fill must give exactly one of "level" and "volume"'


def test_invalid_json_says_where():
    m = refused('{"format": "wetline-section",\n "version": 1,,}')
    assert m.startswith("section file is not valid JSON (line 2, column")


# ------------------------------------------------------------- reading files


def test_read_error_starts_with_the_file_name(tmp_path):
    path = tmp_path / "bad.section.json"
    path.write_text(json.dumps(tank_file(version=99)), encoding="utf-8")
    with pytest.raises(SectionFileError) as info:
        read_section_file(path)
    assert str(info.value).startswith("bad.section.json: section file version 99 is newer")


def test_read_keeps_the_fault_location(tmp_path):
    path = tmp_path / "cross.section.json"
    path.write_text(json.dumps(tank_file(outline=[[0, 0], [2, 3], [2, 0], [0, 3]])))
    with pytest.raises(SectionFileError) as info:
        read_section_file(path)
    assert str(info.value) == "cross.section.json: outline crosses itself between edges 0 and 2"
    assert info.value.edges == (0, 2)


def test_missing_file(tmp_path):
    with pytest.raises(SectionFileError, match="no such file"):
        read_section_file(tmp_path / "none.section.json")


def test_folder_instead_of_a_file(tmp_path):
    with pytest.raises(SectionFileError, match="is a folder"):
        read_section_file(tmp_path)


def test_not_utf8(tmp_path):
    path = tmp_path / "latin.section.json"
    path.write_bytes(b'{"name": "\xe9"}')
    with pytest.raises(SectionFileError, match="is not a text \\(UTF-8\\) file"):
        read_section_file(path)


def test_a_byte_order_mark_is_accepted(tmp_path):
    path = tmp_path / "bom.section.json"
    path.write_bytes(b"\xef\xbb\xbf" + json.dumps(tank_file()).encode("utf-8"))
    assert read_section_file(path) == case_from_dict(tank_file())


# --------------------------------------------------------- write then read


def template_cases():
    cases = []
    for key, t in TEMPLATES.items():
        s = t.build()
        cases.append(pytest.param(Case.default(s, t.default_level(s)), id=key))
    return cases


@pytest.mark.parametrize("case", template_cases())
def test_write_then_read_every_template(case, tmp_path):
    # Issue 2 / section-format.md: writing then reading gives the same case.
    path = tmp_path / "t.section.json"
    write_section_file(case, path)
    back = read_section_file(path)
    assert back == case


@pytest.mark.parametrize("case", template_cases())
def test_write_then_read_every_template_filled_by_volume(case):
    case = case.with_volume(0.5 * case.solve().volume)
    assert loads_case(dumps_case(case)) == case


def test_write_then_read_keeps_metre_coordinates_exactly():
    # Minimal form of the template failures above (if they fail): a vertex
    # at 0.1 + 0.2 = 0.30000000000000004 m, written in metres, must come
    # back as the same float; rounding to 15 significant digits writes 0.3.
    s = Section.build([[0, 0], [0.1 + 0.2, 0], [0.3, 1]], parts=["floor", "wall", "wall"])
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=0.1 + 0.6)
    back = loads_case(dumps_case(case))
    np.testing.assert_array_equal(back.section.outline, s.outline)
    assert back.fill_level == case.fill_level
    assert back == case


@pytest.mark.parametrize("metres, unit", [(2.3, "mm"), (1.9, "cm"), (3.0, "ft"), (3.5, "in")])
def test_metre_values_saved_in_another_unit_read_back_exactly(metres, unit):
    # A case drawn in metres (a template, the GUI) and saved in mm or ft
    # must read back as the same case. Reading multiplies by the unit's
    # factor, and no float c has c * 0.001 == 2.3 exactly (2300 * 0.001 is
    # 2.3000000000000003), so the written number must convert exactly
    # (e.g. decimally), not by one float multiplication.
    s = Section.build([[0, 0], [metres, 0], [metres, metres], [0, metres]],
                      parts=["floor", "wall", "open", "wall"])
    case = Case(section=s, liquid=custom_liquid(1000.0), fill_level=metres / 2,
                length_unit=unit)
    back = loads_case(dumps_case(case))
    np.testing.assert_array_equal(back.section.outline, s.outline)
    assert back == case


def test_write_then_read_every_sample_file(sample_path, tmp_path):
    # The bundled samples, in m, mm and ft: read, write, read gives the same
    # case, and the numbers written are the numbers the file holds. (A
    # version 3 sample is written as its Design, which holds its cases.)
    from wetline.core.section_file import read_design, write_design

    case = read_section_file(sample_path)
    out = tmp_path / sample_path.name
    design = read_design(sample_path)
    assert design.case == case
    if design.cases or design.structure is not None:
        write_design(design, out)
    else:
        write_section_file(case, out)
    assert read_section_file(out) == case
    original, written = json.loads(sample_path.read_text(encoding="utf-8")), json.loads(
        out.read_text(encoding="utf-8"))
    for key in ("version", "length_unit", "outline", "parts", "fill", "geometry"):
        assert written[key] == original[key], key


def test_there_are_sample_files_in_several_units(samples_dir):
    units = {json.loads(p.read_text(encoding="utf-8")).get("length_unit", "m")
             for p in samples_dir.glob("*.section.json")}
    assert {"m", "mm", "ft"} <= units


MM_FILE = """\
{
  "format": "wetline-section",
  "version": 1,
  "name": "Sump in millimetres",
  "length_unit": "mm",
  "geometry": {"kind": "plane", "width": 1250},
  "outline": [[0, 0], [2400, 0], [2400, 1600], [1900.5, 1600], [1900.5, 2800], [0, 2800]],
  "parts": ["floor", "wall", "lid", "wall", "open", "wall"],
  "fluid": {"preset": "seawater", "temperature": 12, "salinity": 35},
  "gravity": 9.81,
  "fill": {"level": 2199.9}
}
"""

FT_FILE = """\
{
  "format": "wetline-section",
  "version": 1,
  "name": "Cone hopper in feet",
  "length_unit": "ft",
  "geometry": {"kind": "axisymmetric"},
  "outline": [[0, 0], [0.75, 0], [4.9, 6.5], [4.9, 14.2], [0, 14.2]],
  "parts": ["floor", "cone", "shell", "open", "axis"],
  "fluid": {"preset": "fresh water", "temperature": 15},
  "fill": {"volume": 12.5}
}
"""


@pytest.mark.parametrize("text", [MM_FILE, FT_FILE], ids=["mm", "ft"])
def test_write_then_read_files_in_other_units(text, tmp_path):
    case = loads_case(text)
    path = tmp_path / "u.section.json"
    write_section_file(case, path)
    back = read_section_file(path)
    assert back == case
    # Written in the file's unit, with the numbers as they were.
    original, written = json.loads(text), json.loads(path.read_text(encoding="utf-8"))
    assert written["length_unit"] == original["length_unit"]
    assert written["outline"] == original["outline"]
    assert written["fill"] == original["fill"]
    assert written["fluid"] == {k: float(v) if not isinstance(v, str) else v
                                for k, v in original["fluid"].items()}
    # Twice round gives the same text.
    assert dumps_case(back) == dumps_case(case)


def test_millimetre_file_converts_to_metres():
    case = loads_case(MM_FILE)
    s = case.section
    np.testing.assert_allclose(s.outline[3], [1.9005, 1.6], rtol=1e-15)
    assert s.width == pytest.approx(1.25, rel=1e-15)
    assert case.fill_level == pytest.approx(2.1999, rel=1e-15)
    assert case.liquid == seawater(12.0, 35.0)
    assert case.gravity == 9.81


def test_foot_file_converts_to_metres():
    # 1 ft = 0.3048 m exactly (international foot, 1959).
    case = loads_case(FT_FILE)
    np.testing.assert_allclose(case.section.outline[2], [4.9 * 0.3048, 6.5 * 0.3048],
                               rtol=1e-15)
    assert case.liquid == fresh_water(15.0)
    assert case.gravity == 9.80665  # the default (section-format.md)


def test_defaults_of_optional_keys():
    data = tank_file(name=None, length_unit=None, parts=None, gravity=None,
                     geometry={"kind": "plane"})
    case = case_from_dict(data)
    assert case.section.name == ""
    assert case.length_unit == "m"
    assert case.section.parts == ("wall",) * 4
    assert case.gravity == 9.80665
    assert case.section.width == 1.0


# ------------------------------------------------------------ atomic writes


def test_write_leaves_no_temporary_file(tmp_path):
    case = case_from_dict(tank_file())
    path = tmp_path / "tank.section.json"
    write_section_file(case, path)
    write_section_file(case.with_level(2.0), path)  # over an existing file
    assert [p.name for p in tmp_path.iterdir()] == ["tank.section.json"]
    assert read_section_file(path).fill_level == 2.0


@pytest.mark.parametrize("step", ["replace", "fsync"])
def test_failed_write_leaves_the_old_file_intact(tmp_path, monkeypatch, step):
    path = tmp_path / "tank.section.json"
    write_section_file(case_from_dict(tank_file()), path)
    before = path.read_bytes()

    def fail(*args, **kwargs):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(atomic_write.os, step, fail)
    with pytest.raises(OSError, match="No space left"):
        write_section_file(case_from_dict(tank_file(fill={"level": 2.5})), path)
    monkeypatch.undo()
    assert path.read_bytes() == before
    assert os.listdir(tmp_path) == ["tank.section.json"]


def test_failed_first_write_leaves_nothing(tmp_path, monkeypatch):
    path = tmp_path / "new.section.json"
    monkeypatch.setattr(atomic_write.os, "replace",
                        lambda *a: (_ for _ in ()).throw(OSError(13, "Permission denied")))
    with pytest.raises(OSError):
        write_section_file(case_from_dict(tank_file()), path)
    assert list(tmp_path.iterdir()) == []
