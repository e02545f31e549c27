"""Load cases on the command line: ``wetline cases`` in every format and
``--case`` on solve, table, export and report.

The JSON is checked against the shape the shared spec gives
(``section-format-v3.md``, "Results"), and the envelope against the maximum
over the per-case records of the same run.
"""

import csv
import io
import json

import pytest

from wetline.app.cli.main import main
from wetline.core.section_file import read_design

WELL = {
    "format": "wetline-section", "version": 3, "name": "Wet well, pumping station 3",
    "length_unit": "m", "geometry": {"kind": "plane", "width": 1.0},
    "outline": [[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
    "parts": ["floor", "wall", "roof", "riser", "open", "wall"],
    "fluid": {"preset": "fresh water", "temperature": 10}, "fill": {"level": 3.2},
    "structure": {
        "outline": [[-0.3, -0.4], [3.3, -0.4], [3.3, 2.8], [2.5, 2.8], [2.5, 4], [-0.3, 4]],
        "parts": ["base", "outer wall", "outer roof", "outer riser", "top", "outer wall"]},
    "ground": {"level": 4.0},
    "cases": [
        {"name": "normal top water"},
        {"name": "overflow", "fill": {"level": "spill"}, "load_factor": 1.35},
        {"name": "empty, flood groundwater", "fill": {"level": "empty"},
         "groundwater": {"level": 4.0}},
        {"name": "grease on sewage", "layers": [
            {"fluid": {"name": "sewage", "density": 1010}, "top": 2.9},
            {"fluid": {"name": "fat and grease", "density": 900}}]},
        {"name": "groundwater at half", "groundwater": {"level": 2.0}, "load_factor": 1.2},
    ],
}
NAMES = [c["name"] for c in WELL["cases"]]


@pytest.fixture()
def well(tmp_path):
    path = tmp_path / "well.section.json"
    path.write_text(json.dumps(WELL), encoding="utf-8")
    return path


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


# ------------------------------------------------------------------- solve
def test_solve_json_gives_the_first_case_and_names_all(capsys, well):
    status, out, err = run(capsys, "solve", well, "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert rec["case"] == "normal top water" and rec["cases"] == NAMES
    assert rec["structure"]["flotation"]["ok"] is True
    for key in ("case", "load_factor", "gas_pressure", "layers", "pockets", "structure"):
        assert key in rec


def test_solve_case_picks_that_case(capsys, well):
    status, out, err = run(capsys, "solve", well, "--case", "grease on sewage", "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert rec["case"] == "grease on sewage"
    assert [la["name"] for la in rec["layers"]] == ["sewage", "fat and grease"]
    status, out, err = run(capsys, "solve", well, "--case", "grease on sewage")
    assert status == 0, err
    assert "load case 'grease on sewage' (4 of 5" in out
    assert "layers, bottom up:" in out and "1 sewage: 1010 kg/m3, 0 m to 2.9 m" in out
    assert "Structure" in out and "flotation:" in out
    assert "Lateral earth pressure on the structure is not computed" in out
    status, out, err = run(capsys, "solve", well, "--case", "overflow", "--csv")
    assert status == 0, err
    assert out.splitlines()[0].startswith("edge,part,x start [m]")


def test_an_unknown_case_is_one_line_naming_the_cases(capsys, well):
    for command in (["solve"], ["table"], ["export", "--dxf", "x.dxf"], ["report", "-o", "x.pdf"]):
        status, out, err = run(capsys, command[0], well, *command[1:], "--case", "floods")
        assert status == 2 and out == ""
        assert err == ("error: no load case named 'floods' (cases: 'normal top water', "
                       "'overflow', 'empty, flood groundwater', 'grease on sewage', "
                       "'groundwater at half')\n")


def test_level_applies_to_the_chosen_case(capsys, well):
    status, out, err = run(capsys, "solve", well, "--case", "overflow", "--level", "1.5",
                           "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert rec["case"] == "overflow" and rec["level"] == 1.5 and rec["load_factor"] == 1.35


def test_solve_shows_gas_and_pockets(capsys, tmp_path):
    chamber = dict(WELL, outline=[[0, 0], [3, 0], [3, 2], [1, 2], [1, 1.5], [0.8, 1.5],
                                  [0.8, 4], [0, 4]],
                   parts=["floor", "wall", "roof", "lip", "lip", "riser", "lid", "riser"],
                   fill={"level": 3.5}, cases=[{"name": "air", "pockets": "trapped",
                                                "gas_pressure": 2000}])
    for key in ("structure", "ground"):
        chamber.pop(key)
    path = tmp_path / "chamber.section.json"
    path.write_text(json.dumps(chamber))
    status, out, err = run(capsys, "solve", path)
    assert status == 0, err
    assert "gas over the surface: 2 kPa gauge" in out
    assert "pockets trapped (atmosphere 101.325 kPa absolute):" in out
    assert "sealed at 1.5 m, interface 1.5" in out
    assert "worst with pockets" not in out  # no resistance entered: no uplift table


# ------------------------------------------------------------------- cases
def test_cases_json_has_the_spec_shape(capsys, well):
    status, out, err = run(capsys, "cases", well, "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert rec["format"] == "wetline-cases" and rec["version"] == 1
    assert [c["case"] for c in rec["cases"]] == NAMES
    env = rec["envelope"]
    assert set(env["parts"]) == {"floor", "wall", "roof", "riser"}
    for p in env["parts"].values():
        assert set(p) == {"max_down", "max_down_case", "max_up", "max_up_case"}
    assert [e["index"] for e in env["edges"]] == list(range(6))
    assert set(env["edges"][0]) == {"index", "max_pressure", "case"}
    assert {"factor", "case"} <= set(env["flotation"])


def test_the_envelope_is_the_maximum_over_the_case_records(capsys, well):
    status, out, err = run(capsys, "cases", well, "--json")
    assert status == 0, err
    rec = json.loads(out)
    cases, env = rec["cases"], rec["envelope"]
    for part, p in env["parts"].items():
        downs = [(c["load_factor"] * c["parts"][part]["down"], c["case"]) for c in cases]
        best = max(downs, key=lambda t: t[0])
        assert p["max_down"] == pytest.approx(max(best[0], 0.0), rel=1e-12)
        assert p["max_down_case"] == (best[1] if best[0] > 0 else None)
        worst = min(downs, key=lambda t: t[0])
        assert p["max_up"] == pytest.approx(max(-worst[0], 0.0), rel=1e-12)
        assert p["max_up_case"] == (worst[1] if worst[0] < 0 else None)
    for e in env["edges"]:
        values = [(c["load_factor"] * max(c["edges"][e["index"]]["p_start"],
                                          c["edges"][e["index"]]["p_end"]), c["case"])
                  for c in cases]
        best = max(values, key=lambda t: t[0])
        assert e["max_pressure"] == pytest.approx(best[0], rel=1e-12)
        assert e["case"] == (best[1] if best[0] > 0 else None)  # dry in every case: null
    lifts = [(c["structure"]["flotation"]["resistance"]
              / (c["load_factor"] * c["structure"]["flotation"]["uplift"]), c["case"])
             for c in cases if c["structure"]["flotation"]["uplift"] > 0]
    low = min(lifts, key=lambda t: t[0])
    assert env["flotation"]["factor"] == pytest.approx(low[0], rel=1e-12)
    assert env["flotation"]["case"] == low[1]


def test_cases_readable_table(capsys, well):
    status, out, err = run(capsys, "cases", well)
    assert status == 0, err
    assert out.startswith("Wet well, pumping station 3: 5 load cases\n")
    for name in NAMES:
        assert name in out
    assert "sewage + fat and grease" in out
    assert "Envelope by part (design values)" in out
    assert "lowest flotation factor" in out and "net upward pressure on the base" in out
    assert "largest pressure on an edge" in out
    assert "floor force design [kN/m]" in out


def test_cases_csv_and_us_units(capsys, well):
    status, out, err = run(capsys, "cases", well, "--csv")
    assert status == 0, err
    rows = list(csv.reader(io.StringIO(out)))
    assert rows[0][:6] == ["case", "liquid", "level [m]", "groundwater [m]", "load factor",
                           "floor force [kN/m]"]
    assert [r[0] for r in rows[1:]] == NAMES
    d = read_design(well)
    overflow = d.solve("overflow").solution
    assert float(rows[2][5]) == pytest.approx(overflow.floor_force / 1000, rel=1e-12)
    assert float(rows[2][6]) == pytest.approx(1.35 * overflow.floor_force / 1000, rel=1e-12)
    status, out, err = run(capsys, "cases", well, "--csv", "--units", "us")
    assert status == 0, err
    header = next(csv.reader(io.StringIO(out)))
    assert "level [ft]" in header and "floor force [lbf/ft]" in header
    assert "max pressure [psi]" in header
    status, out, err = run(capsys, "cases", well, "--json", "--csv")
    assert status == 2 and err == "error: give --json or --csv, not both\n"


def test_cases_of_a_version_1_file_is_its_one_case(capsys, sample):
    status, out, err = run(capsys, "cases", sample("open_tank"), "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert [c["case"] for c in rec["cases"]] == ["Settled-water holding tank, filter block"]
    assert rec["envelope"]["flotation"] is None


def test_cases_bad_input_is_one_line(capsys, tmp_path):
    status, out, err = run(capsys, "cases", tmp_path / "none.section.json")
    assert status == 2 and err.count("\n") == 1 and err.startswith("error: ")
    bad = tmp_path / "bad.section.json"
    bad.write_text(json.dumps(dict(WELL, cases=[{"name": "x", "levle": 1}])))
    status, out, err = run(capsys, "cases", bad)
    assert status == 2 and err == "error: bad.section.json: case 'x': unknown key 'levle'\n"


# ------------------------------------------------------------ table, export, report
def test_table_of_a_layered_case(capsys, well):
    status, out, err = run(capsys, "table", well, "--case", "grease on sewage", "--steps", "3")
    assert status == 0, err
    first = out.splitlines()[0]
    assert first == ("Wet well, pumping station 3: case 'grease on sewage', loads against "
                     "level, pockets vented (sewage + fat and grease)")
    status, out, err = run(capsys, "table", well, "--case", "grease on sewage", "--csv",
                           "--steps", "3")
    rows = list(csv.reader(io.StringIO(out)))
    assert float(rows[1][0]) == pytest.approx(2.9)  # from the interface up
    assert float(rows[-1][0]) == pytest.approx(4.0)


def test_export_and_report_of_a_case(capsys, well, tmp_path):
    png, pdf = tmp_path / "d.png", tmp_path / "s.pdf"
    status, out, err = run(capsys, "export", well, "--case", "overflow", "--png", png,
                           "--size", "400x300")
    assert status == 0, err
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    status, out, err = run(capsys, "report", well, "--case", "grease on sewage", "-o", pdf)
    assert status == 0, err
    assert pdf.read_bytes()[:5] == b"%PDF-"


def test_a_drawing_of_a_layered_case_is_of_the_case_itself(well):
    """The renderers draw a layered case's own solution (its kinks, layers,
    gas and air are drawn: tests/app/render/test_layered_drawing.py), with
    no sentence saying part of it is left out."""
    from wetline.app.cli.main import _load
    from wetline.app.render.case_drawing import case_drawing

    for name in ("grease on sewage", None):
        design, resolved = _load(well, case=name)
        view = case_drawing(design, resolved.name).solution
        own = resolved.solve()
        assert view.warnings == own.warnings
        assert view.fz.tolist() == own.fz.tolist()
        assert [ly.top for ly in view.layers] == [ly.top for ly in own.layers]
