"""Tests of core.coordinates: coordinate lists pasted or read from CSV.

Outside facts used: 1 in = 0.0254 m and 1 ft = 0.3048 m exactly
(international yard and pound agreement, 1959); spreadsheets in
comma-decimal locales write "1,5" and separate CSV fields with ";" and
pasted cells with tabs (common practice); RFC 4180 quoting of CSV fields.
"""

import numpy as np
import pytest

from wetline.core.coordinates import CoordinateError, format_coordinates, parse_coordinates

BOX = [[0.0, 0.0], [2.5, 0.0], [2.5, 1.25], [0.0, 1.25]]


@pytest.mark.parametrize("text", [
    "0\t0\n2.5\t0\n2.5\t1.25\n0\t1.25\n",
    "0,0\n2.5,0\n2.5,1.25\n0,1.25",
    "0, 0\n2.5, 0\n2.5, 1.25\n0, 1.25",
    "0;0\n2.5;0\n2.5;1.25\n0;1.25\n",
    "0 0\n2.5   0\n  2.5 1.25\n0\t\t1.25\n".replace("\t\t", "  "),
    "0;0\r\n2,5;0\r\n2,5;1,25\r\n0;1,25\r\n",     # decimal comma, Windows line ends
    "0\t0\n2,5\t0\n2,5\t1,25\n0\t1,25\n",         # decimal comma, pasted cells
    "\ufeffx;z\n0;0\n2.5;0\n2.5;1.25\n0;1.25",    # byte order mark and a header
])
def test_separators_decimal_commas_and_headers(text):
    outline, parts = parse_coordinates(text)
    np.testing.assert_array_equal(outline, BOX)
    assert parts is None


def test_header_row_is_skipped_when_its_fields_are_not_numbers():
    outline, parts = parse_coordinates("x [m],z [m]\n0,0\n1,0\n1,1\n")
    assert outline.shape == (3, 2) and parts is None
    # a header may be any words; a line of numbers never is a header
    outline, _ = parse_coordinates("easting\theight\n0\t0\n1\t0\n1\t1\n")
    assert outline.shape == (3, 2)


def test_units_are_converted_to_metres():
    outline, _ = parse_coordinates("0 0\n100 0\n100 50", unit="in")
    assert outline[1, 0] == pytest.approx(2.54, rel=1e-15)  # 100 x 0.0254 m
    outline, _ = parse_coordinates("0 0\n10 0\n10 5", unit="ft")
    assert outline[2, 1] == pytest.approx(1.524, rel=1e-15)  # 5 x 0.3048 m
    outline, _ = parse_coordinates("0 0\n2400 0\n2400 1600", unit="mm")
    np.testing.assert_allclose(outline, [[0, 0], [2.4, 0], [2.4, 1.6]], rtol=1e-15)


def test_header_unit_must_agree_with_the_unit_read_in():
    text = "x [mm]\tz [mm]\n0\t0\n2400\t0\n2400\t1600\n"
    assert parse_coordinates(text, unit="mm")[0][1, 0] == pytest.approx(2.4)
    assert parse_coordinates(text, unit="millimeter")[0][1, 0] == pytest.approx(2.4)
    with pytest.raises(CoordinateError) as err:
        parse_coordinates(text, unit="m")
    assert str(err.value) == ("line 1: the header gives the coordinates in mm, but they "
                              "are being read in m")
    assert err.value.line == 1
    # a bracket that is not a length unit is only a label
    assert parse_coordinates("x (right);z (up)\n0;0\n1;0\n1;1")[0].shape == (3, 2)


def test_repeated_closing_vertex_is_dropped_with_its_part():
    outline, parts = parse_coordinates("0,0,floor\n2,0,wall\n2,1,open\n0,1,wall\n0,0,floor\n")
    assert outline.shape == (4, 2)
    assert parts == ("floor", "wall", "open", "wall")


def test_parts_column_blank_entries_are_wall():
    text = "x\tz\tpart\n0\t0\tfloor\n2\t0\t\n2\t1\topen\n0\t1\n"
    outline, parts = parse_coordinates(text)
    assert parts == ("floor", "wall", "open", "wall")


def test_part_names_with_spaces_and_quotes():
    outline, parts = parse_coordinates("0 0 north wall\n2 0 floor\n2 1 open")
    assert parts == ("north wall", "floor", "open")
    outline, parts = parse_coordinates('0,0,"lid, hinged"\n2,0,floor\n2,1,"open"\n')
    assert parts == ("lid, hinged", "floor", "open")  # RFC 4180 quoting


def test_blank_lines_spreadsheet_tails_and_unicode_minus():
    text = "\n0\t0\t\t\n\n\t\t\n2\t\u22121\t\n2\t1\n"
    outline, parts = parse_coordinates(text)
    np.testing.assert_array_equal(outline, [[0, 0], [2, -1], [2, 1]])
    assert parts is None


@pytest.mark.parametrize("text, message, line", [
    ("0 0\n1 0\n1 1\nabc 2\n", "line 4: 'abc' is not a number", 4),
    ("0 0\n1 0\n\n1 1\n\n\n5\n", "line 7 has 1 value, need x and z", 7),
    ("0;0\n1;0\n1;1;wall;x\n", "line 3 has 4 values, need x, z and an optional part name", 3),
    ("0,0\n1,5,0\n1,5,1,5\n", "line 3 has 4 values, need x, z and an optional part name; "
     "with commas between values, write decimals with a point", 3),
    ("0;0\n;1\n1;1\n", "line 2: x is empty", 2),
    ("0 0\n1 nan\n1 1\n", "line 2: 'nan' is not a number", 2),
    ("0 0\n1 inf\n1 1\n", "line 2: 'inf' is not a number", 2),
    ("0 0\n1_000 0\n1 1\n", "line 2: '1_000' is not a number", 2),
    ("0\t0\n1.000,5\t0\n1\t1\n", "line 2: '1.000,5' is not a number", 2),
    ("0,0,0\n1,0,0\n1,1,2\n", "line 1 has 3 numbers; give x and z (and an optional part "
     "name), not x, y, z", 1),
    ("x;z\n", "no coordinates found (need one x, z pair per line)", None),
    ("", "no coordinates found (need one x, z pair per line)", None),
    ("0 0\n1 1\n0 0\n", "found 2 vertices, need at least 3", None),
])
def test_every_error_says_the_line_and_the_fault(text, message, line):
    with pytest.raises(CoordinateError) as err:
        parse_coordinates(text)
    assert str(err.value) == message
    assert err.value.line == line
    assert isinstance(err.value, ValueError)


def test_unknown_unit_and_non_text_are_refused():
    with pytest.raises(CoordinateError, match="unknown length unit 'cubits'"):
        parse_coordinates("0 0\n1 0\n1 1", unit="cubits")
    with pytest.raises(CoordinateError, match="coordinates must be text, not bytes"):
        parse_coordinates(b"0 0\n1 0\n1 1")


# ------------------------------------------------------------------ format
def test_format_writes_tab_separated_text_with_a_header():
    text = format_coordinates([[0, 0], [2.4, 0], [2.4, 1.6]], ["floor", "wall", "open"],
                              unit="mm")
    assert text == ("x [mm]\tz [mm]\tpart\n0\t0\tfloor\n2400\t0\twall\n2400\t1600\topen\n")
    assert format_coordinates(BOX, header=False).splitlines()[1] == "2.5\t0"
    assert format_coordinates(BOX, decimal_comma=True).splitlines()[3] == "2,5\t1,25"


@pytest.mark.parametrize("unit", ["m", "mm", "in", "ft"])
@pytest.mark.parametrize("decimal_comma", [False, True])
def test_format_then_parse_round_trips(unit, decimal_comma):
    rng = np.random.default_rng(7)
    outline = rng.uniform(-50, 50, size=(30, 2))
    parts = tuple(rng.choice(["floor", "wall", "open", "north wall"], size=30))
    text = format_coordinates(outline, parts, unit, decimal_comma=decimal_comma)
    back, back_parts = parse_coordinates(text, unit=unit)
    np.testing.assert_allclose(back, outline, rtol=5e-15, atol=0)
    assert back_parts == parts


def test_format_refuses_mismatched_parts_and_unknown_units():
    with pytest.raises(CoordinateError, match="2 part names for 4 vertices"):
        format_coordinates(BOX, ["wall", "wall"])
    with pytest.raises(CoordinateError, match="unknown length unit"):
        format_coordinates(BOX, unit="cubits")


# ------------------------------------------------ core.limits ranges
def test_a_number_too_large_for_a_float_names_its_line():
    with pytest.raises(CoordinateError) as err:
        parse_coordinates("0 0\n1 0\n1 1e999\n")
    assert str(err.value) == "line 3: '1e999' is not a finite number" and err.value.line == 3


def test_a_coordinate_beyond_the_limit_names_its_line():
    # core.limits.COORDINATE_LIMIT is 1e7 m; 2e10 mm is 2e7 m.
    with pytest.raises(CoordinateError) as err:
        parse_coordinates("0;0\n1000;0\n1000;2e10\n", unit="mm")
    assert str(err.value) == ("line 3: z = 2e+07 m is beyond the 1e+07 m Wetline reads")
    assert err.value.line == 3
    parse_coordinates("0;0\n1000;0\n1000;1e10\n", unit="mm")  # the limit itself is allowed


def test_more_vertices_than_the_limit_are_refused(monkeypatch):
    # core.limits.MAX_VERTICES (200,000) lowered, so that the text stays small.
    import wetline.core.coordinates as coordinates

    monkeypatch.setattr(coordinates, "MAX_VERTICES", 5)
    text = "".join(f"{k} {k * k}\n" for k in range(6))
    with pytest.raises(CoordinateError, match=r"^the list has more than the 5 vertices an "
                                              r"outline may have$"):
        parse_coordinates(text)
    assert parse_coordinates(text[: text.index("5 25")])[0].shape == (5, 2)


def test_text_over_the_size_limit_is_refused_unread(monkeypatch):
    import wetline.core.coordinates as coordinates

    monkeypatch.setattr(coordinates, "MAX_FILE_BYTES", 100)
    with pytest.raises(CoordinateError, match=r"^the coordinate list is larger than the "
                                              r"100 bytes Wetline reads$"):
        parse_coordinates("0 0\n" * 30)
