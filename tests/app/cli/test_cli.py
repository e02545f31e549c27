"""The headless command line: `wetline solve`, `wetline table`, errors.

Runs the real entry point in a subprocess where the exit status and the
absence of Qt matter, and in-process (``wetline.app.cli.main.main``) elsewhere for speed.
"""

import csv
import io
import json
import math
import subprocess
import sys

import pytest

from wetline.app.cli.main import main
from wetline.core.hydrostatics import solve
from wetline.core.section_file import read_section_file


def run(capsys, *argv):
    status = main(list(argv))
    out, err = capsys.readouterr()
    return status, out, err


def test_there_are_at_least_six_samples(samples_dir):
    assert len(list(samples_dir.glob("*.section.json"))) >= 6


def test_solve_json_follows_the_results_spec(capsys, sample_path):
    status, out, err = run(capsys, "solve", str(sample_path), "--json")
    assert status == 0, err
    rec = json.loads(out)
    case = read_section_file(sample_path)
    sec = case.section
    # Keys and meanings from the shared spec, physics-and-results.md.
    for key in ("format", "version", "name", "geometry", "width", "density", "gravity",
                "level", "spill_level", "volume", "fluid_weight", "floor_force",
                "support_reaction", "max_pressure", "parts", "edges", "warnings",
                "assumptions"):
        assert key in rec, key
    assert rec["format"] == "wetline-results" and rec["version"] == 1
    assert rec["geometry"] == sec.kind
    assert len(rec["edges"]) == sec.n_edges
    for i, e in enumerate(rec["edges"]):
        assert e["index"] == i and e["part"] == sec.parts[i]
        assert e["start"] == pytest.approx(sec.outline[i].tolist(), abs=1e-12)
        if sec.is_axisymmetric:
            assert e["fx"] is None and e["centre_of_pressure"] is None
        else:
            assert e["hoop_start"] is None and e["hoop_end"] is None
    assert "open" not in rec["parts"] and "axis" not in rec["parts"]
    # The spec's equilibrium check, to round-off.
    w = rec["fluid_weight"]
    assert rec["floor_force"] + rec["support_reaction"] == pytest.approx(w, rel=1e-9, abs=1e-9)
    # Section format v3: the weight of all layers; density is the bottom one's.
    layers = rec["layers"]
    assert rec["fluid_weight"] == pytest.approx(
        sum(la["density"] * rec["gravity"] * la["volume"] for la in layers), rel=1e-12)
    assert rec["volume"] == pytest.approx(sum(la["volume"] for la in layers), rel=1e-12)
    assert rec["density"] == layers[0]["density"]
    if len(layers) == 1:
        assert rec["fluid_weight"] == pytest.approx(
            rec["density"] * rec["gravity"] * rec["volume"], rel=1e-12)
    floor = sum(e["fz"] for e in rec["edges"] if e["part"] == "floor")
    assert rec["floor_force"] == pytest.approx(-floor, rel=1e-12, abs=1e-12)
    if not sec.is_axisymmetric:
        assert sum(e["fx"] for e in rec["edges"]) == pytest.approx(0.0, abs=1e-9 * w)


def test_solve_prints_a_readable_table_with_the_caution(capsys, sample_path):
    status, out, _ = run(capsys, "solve", str(sample_path))
    assert status == 0
    assert "Totals" in out and "Edges" in out and "floor force" in out
    assert "Verify against local codes and licensed practice" in out


def test_solve_level_override_is_in_the_files_length_unit(capsys, sample):
    path = sample("flared_hopper")  # millimetres
    case = read_section_file(path)
    assert case.length_unit == "mm"
    status, out, _ = run(capsys, "solve", str(path), "--level", "2500", "--json")
    assert status == 0
    rec = json.loads(out)
    assert rec["level"] == pytest.approx(2.5, rel=1e-15)
    assert rec["volume"] == pytest.approx(solve(case.section, 2.5, case.liquid.density).volume)


def test_solve_volume_override_round_trips_the_level(capsys, sample):
    path = sample("cone_hopper")
    status, out, _ = run(capsys, "solve", str(path), "--volume", "3.0", "--json")
    assert status == 0
    rec = json.loads(out)
    assert rec["volume"] == pytest.approx(3.0, rel=1e-12)


def test_solve_us_units_label_the_table(capsys, sample):
    status, out, _ = run(capsys, "solve", str(sample("chamber_under_riser")), "--units", "us")
    assert status == 0
    assert "psi" in out and "lbf" in out and "[ft]" in out


def test_level_above_spill_is_capped_with_a_warning(capsys, sample):
    path = sample("open_tank")
    status, out, _ = run(capsys, "solve", str(path), "--level", "99", "--json")
    rec = json.loads(out)
    assert status == 0
    assert rec["level"] == rec["spill_level"]
    assert any("spill level" in w for w in rec["warnings"])


def test_table_csv_has_units_in_the_header_and_matches_solve(capsys, sample):
    path = sample("chamber_under_riser")
    status, out, _ = run(capsys, "table", str(path), "--csv", "--steps", "11")
    assert status == 0
    rows = list(csv.reader(io.StringIO(out)))
    header, body = rows[0], rows[1:]
    # The chamber is 1 m wide: forces per m run.
    assert header[0] == "level [m]" and "floor force [kN/m]" in header
    assert len(body) == 11
    case = read_section_file(path)
    assert case.section.width == 1.0
    k = header.index("floor force [kN/m]")
    for r in body:
        level = float(r[0])
        ref = solve(case.section, level, case.liquid.density, case.gravity)
        assert float(r[k]) == pytest.approx(ref.floor_force / 1000.0, rel=1e-9, abs=1e-9)


def test_table_readable(capsys, sample):
    status, out, _ = run(capsys, "table", str(sample("chamber_under_riser")), "--steps", "5")
    assert status == 0
    assert "loads against level" in out
    assert len(out.strip().splitlines()) == 1 + 2 + 5


@pytest.mark.parametrize("argv, words", [
    (["solve", "no/such/file.section.json"], "no such file"),
    (["solve"], "required"),
    (["solve", "{f}", "--level", "1", "--volume", "2"], "not allowed with"),
    (["solve", "{f}", "--volume", "1e9"], "more than the section holds"),
    (["solve", "{f}", "--level", "nan"], "finite"),
    (["table", "{f}", "--steps", "1"], "at least 2"),
    (["frobnicate", "x"], "unknown command"),
    (["solve", "{bad}"], "unknown key 'densty' in fluid"),
    (["solve", "{cross}"], "crosses itself between edges"),
    (["export", "{f}", "--png", "out.png", "--size", "big"], "--size"),
])
def test_bad_input_exits_2_with_one_error_line(tmp_path, argv, words, sample):
    good = sample("open_tank")  # 4 edges
    bad = tmp_path / "bad.section.json"
    data = json.loads(good.read_text())
    data["fluid"] = {"densty": 1000}
    bad.write_text(json.dumps(data))
    cross = tmp_path / "cross.section.json"
    data = json.loads(good.read_text())
    data["outline"] = [[0, 0], [2, 0], [0, 2], [2, 2]]
    cross.write_text(json.dumps(data))
    argv = [a.format(f=good, bad=bad, cross=cross) for a in argv]
    proc = subprocess.run([sys.executable, "-m", "wetline", *argv], capture_output=True,
                          text=True, cwd=tmp_path)
    assert proc.returncode == 2
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("error: "), proc.stderr
    assert words in lines[0]
    assert "Traceback" not in proc.stderr


def test_solve_path_imports_no_qt(sample):
    code = ("import sys\nfrom wetline.app.cli.main import main\n"
            f"main(['solve', {str(sample('chamber_under_riser'))!r}, '--json'])\n"
            "print([m for m in sys.modules if m.startswith(('PySide6', 'pyqtgraph'))], "
            "file=sys.stderr)\n")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert proc.returncode == 0
    assert proc.stderr.strip() == "[]"
    assert math.isfinite(json.loads(proc.stdout)["fluid_weight"])


@pytest.mark.parametrize("unit", ["m", "ft"])
def test_us_units_on_a_unit_run_are_per_foot_run(capsys, tmp_path, unit, run_case):
    # run_case (tests/conftest.py): per run the floor carries 29419.95 N/m
    # = 2016 lbf/ft (NIST SP 811: 1 lbf/ft = 14.5939029372 N/m).
    from wetline.core.section_file import write_section_file

    path = tmp_path / f"tank_{unit}.section.json"
    write_section_file(run_case(unit), path)
    status, out, _ = run(capsys, "solve", str(path), "--units", "us")
    assert status == 0
    assert "forces per ft run (lbf/ft)" in out and "per m run" not in out
    floor = next(line for line in out.splitlines() if line.strip().startswith("floor force"))
    assert floor.split()[2:4] == ["2016", "lbf/ft"]
    assert "fx [lbf/ft]" in out
    status, out, _ = run(capsys, "solve", str(path), "--units", "us", "--csv")
    rows = list(csv.reader(io.StringIO(out)))
    k = rows[0].index("fz [lbf/ft]")
    fz = sum(float(r[k]) for r in rows[1:] if r[1] == "floor")
    assert fz == pytest.approx(-29419.95 / (4.4482216152605 / 0.3048), rel=1e-12)
    status, out, _ = run(capsys, "table", str(path), "--units", "us", "--csv", "--steps", "3")
    header = next(csv.reader(io.StringIO(out)))
    assert "floor force [lbf/ft]" in header and "level [ft]" in header
    # The results record stays SI: N on the section's width.
    status, out, _ = run(capsys, "solve", str(path), "--json")
    width = 1.0 if unit == "m" else 0.3048
    assert json.loads(out)["floor_force"] == pytest.approx(29419.95 * width, rel=1e-12)
