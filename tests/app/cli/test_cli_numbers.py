"""Numbers on the command line: negative values, strict decimals, ranges.

argparse takes a token after an option for another option when it starts
with "-" and is not a plain negative number such as -1 or -0.5 (its
negative-number pattern, Python 3.11 argparse.py), so `--level -1e308` and
`--size -10x10` failed with "expected one argument"; and `float()` takes
`1_0` and digits of other scripts. Every numeric option now reads a typed
decimal (core.number_input.parse_decimal) and refuses values out of range
in one line.
"""

import json
import subprocess
import sys

import ezdxf
import pytest

from wetline.app.cli.main import main


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


def one_error(capsys, *argv):
    status, out, err = run(capsys, *argv)
    assert status == 2 and out == "", out
    lines = err.splitlines()
    assert len(lines) == 1 and lines[0].startswith("error: "), err
    return lines[0][len("error: "):]


@pytest.fixture
def tank(sample):
    return sample("open_tank")  # metres, floor at 0, spill level 3.2 m


@pytest.fixture
def mm_file(sample):
    return sample("flared_hopper")  # millimetres


def test_a_negative_level_in_exponent_form_is_a_value(capsys, tank):
    assert one_error(capsys, "solve", tank, "--level", "-1e308") == (
        "--level must be -1e7 to 1e7 m, not -1e308")


def test_a_negative_level_below_the_floor_gives_an_empty_section(capsys, tank):
    status, out, err = run(capsys, "solve", tank, "--level", "-0.5", "--json")
    assert status == 0, err
    record = json.loads(out)
    assert record["requested_level"] == -0.5 and record["volume"] == 0.0
    assert any("empty" in w for w in record["warnings"])


def test_a_level_in_exponent_form_is_read(capsys, tank):
    status, out, _ = run(capsys, "solve", tank, "--level", "-2.5e-1", "--json")
    assert status == 0 and json.loads(out)["requested_level"] == -0.25


def test_a_decimal_comma_is_read(capsys, tank):
    status, out, _ = run(capsys, "solve", tank, "--level", "2,5", "--json")
    assert status == 0 and json.loads(out)["level"] == 2.5


def test_the_level_range_is_said_in_the_files_unit_too(capsys, mm_file):
    assert one_error(capsys, "solve", mm_file, "--level", "2e10") == (
        "--level must be -1e10 to 1e10 mm (-1e7 to 1e7 m), not 2e10")


@pytest.mark.parametrize("text", ["1_0", "\u0661\u0662", "\uff13", "inf", "-inf", "nan",
                                  "1,000.5", "0x1", "2.5m", ""])
def test_what_no_one_types_as_a_number_is_refused(capsys, tank, text):
    assert one_error(capsys, "solve", tank, "--level", text) == (
        f"--level must be a finite decimal number such as 2.5, -0.5 or 1e3, not {text!r}")


def test_the_option_may_be_joined_with_an_equals_sign(capsys, tank):
    status, out, _ = run(capsys, "solve", tank, "--level=-1e-1", "--json")
    assert status == 0 and json.loads(out)["requested_level"] == -0.1


def test_a_negative_volume(capsys, tank):
    assert one_error(capsys, "solve", tank, "--volume", "-1e3") == (
        "--volume must be a number >= 0, not -1e3")


@pytest.mark.parametrize("steps, message", [
    ("-5", "--steps must be at least 2, not -5"),
    ("1_0", "--steps must be a finite decimal number such as 2.5, -0.5 or 1e3, not '1_0'"),
    ("2.5", "--steps must be a whole number, not 2.5"),
    ("1e9", "--steps must be at most 100000, not 1e9"),
])
def test_steps(capsys, tank, steps, message):
    assert one_error(capsys, "table", tank, "--steps", steps) == message


def test_steps_in_exponent_form(capsys, tank):
    status, out, _ = run(capsys, "table", tank, "--steps", "1e1", "--csv")
    assert status == 0 and len(out.strip().splitlines()) == 1 + 10


@pytest.mark.parametrize("size, message", [
    ("-10x10", "--size must give a positive width and height in pixels, not '-10x10'"),
    ("10x-10", "--size must give a positive width and height in pixels, not '10x-10'"),
    ("1_000x800", "--size must look like 3508x2480, not '1_000x800'"),
    ("800.5x600", "--size must look like 3508x2480, not '800.5x600'"),
    ("800x", "--size must look like 3508x2480, not '800x'"),
])
def test_image_sizes(capsys, tank, tmp_path, size, message):
    assert one_error(capsys, "export", tank, "--png", tmp_path / "d.png", "--size", size) == (
        message)
    assert not (tmp_path / "d.png").exists()


@pytest.fixture
def drawing(tmp_path):
    doc = ezdxf.new("R2010")
    doc.units = 4  # mm (AutoCAD DXF Reference, $INSUNITS)
    doc.modelspace().add_lwpolyline([(0, 0), (2000, 0), (2000, 1500), (0, 1500)], close=True)
    path = tmp_path / "box.dxf"
    doc.saveas(path)
    return path


@pytest.mark.parametrize("option, value, message", [
    ("--liquid-density", "-1e3", "--liquid-density must be a positive number of kg/m3, not -1e3"),
    ("--liquid-density", "1e308", "--liquid-density must be 0.001 to 100000 kg/m3, not 1e308"),
    ("--liquid-density", "1_000", "--liquid-density must be a finite decimal number such as "
                                  "2.5, -0.5 or 1e3, not '1_000'"),
    ("--level", "-1e308", "--level must be -1e10 to 1e10 mm (-1e7 to 1e7 m), not -1e308"),
])
def test_import_numbers(capsys, drawing, tmp_path, option, value, message):
    out = tmp_path / "box.section.json"
    assert one_error(capsys, "import", drawing, "-o", out, option, value) == message
    assert not out.exists()


def test_import_reads_a_negative_level(capsys, drawing, tmp_path):
    out = tmp_path / "box.section.json"
    status, _, err = run(capsys, "import", drawing, "-o", out, "--level", "-1e2")
    assert status == 0, err
    assert json.loads(out.read_text())["fill"] == {"level": -100}


def test_a_missing_value_is_still_a_missing_value(capsys, tank, tmp_path):
    # Only number-like tokens are taken as values: "--png --svg x" still
    # lacks its value rather than writing a file called "--svg".
    message = one_error(capsys, "export", tank, "--png", "--svg", tmp_path / "x.svg")
    assert "expected one argument" in message
    assert list(tmp_path.iterdir()) == []


def test_from_the_real_program(tank):
    proc = subprocess.run([sys.executable, "-m", "wetline", "solve", str(tank), "--level",
                           "-1e308"], capture_output=True, text=True)
    assert proc.returncode == 2
    assert proc.stderr == "error: --level must be -1e7 to 1e7 m, not -1e308\n"


def test_the_spill_level_reads_as_in_the_window_and_the_drawing(capsys, sample):
    """Defect: the totals of `solve` (and the sheet's, the same table) gave
    the spill level "as entered", so a metre file read in feet printed
    "spill level 6.56167979003 ft" beside "level 6.562 ft", where the
    window's totals and the drawings say 6.562 ft. The outline's
    coordinates, which it comes from, are still echoed in full."""
    from wetline.core.numbers import format_number
    from wetline.core.section_file import read_design

    path = sample("grease_trap")
    status, out, _ = run(capsys, "solve", path, "--units", "us")
    assert status == 0
    spill = read_design(path).section.spill_level / 0.3048
    row = next(line for line in out.splitlines() if line.strip().startswith("spill level"))
    assert row.split()[2:] == [format_number(spill), "ft"]
    assert "6.56167979003" in out  # the edges' z end, a coordinate
