"""The command line's CAD interchange: `wetline import` and `wetline export --dxf`.

Drawings are made with ezdxf in ``tmp_path``. Outside facts: $INSUNITS 4 is
millimetres (AutoCAD DXF Reference); fresh water at 20 C is 998.207 kg/m3
(IAPWS-95, as in tests/core/test_liquids.py).
"""

import json
import subprocess
import sys

import ezdxf
import numpy as np
import pytest

from wetline.app.cli.main import main
from wetline.core.section_file import read_section_file

SUMP_MM = [(0, 0), (2400, 0), (2400, 1600), (1900, 1600), (1900, 2800), (0, 2800)]


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


def sump_dxf(tmp_path, units=4, extra=False):
    doc = ezdxf.new("R2010")
    doc.units = units
    msp = doc.modelspace()
    msp.add_lwpolyline(SUMP_MM, close=True, dxfattribs={"layer": "OUTLINE"})
    if extra:
        msp.add_lwpolyline([(0, 0), (100, 0), (100, 50)], close=True,
                           dxfattribs={"layer": "HATCH"})
    path = tmp_path / "sump.dxf"
    doc.saveas(path)
    return path


def test_import_writes_a_section_file_in_the_drawing_unit(tmp_path, capsys):
    out_file = tmp_path / "sump.section.json"
    status, out, err = run(capsys, "import", sump_dxf(tmp_path), "-o", out_file)
    assert status == 0, err
    assert err == ""
    assert out == (f"wrote {out_file}: polyline #0 on layer OUTLINE, 6 vertices in mm, "
                   "all parts 'wall'\n")
    data = json.loads(out_file.read_text())
    assert data["length_unit"] == "mm" and data["name"] == "sump"
    assert data["outline"] == [list(p) for p in SUMP_MM]  # the drawing's own numbers
    assert data["parts"] == ["wall"] * 6
    assert data["geometry"] == {"kind": "plane", "width": 1000}  # 1 m, in mm
    assert data["fill"] == {"level": 2800}  # the top of the outline
    case = read_section_file(out_file)
    assert case.liquid.density == pytest.approx(998.207, abs=5e-4)


def test_import_options(tmp_path, capsys):
    out_file = tmp_path / "out.section.json"
    status, _, err = run(capsys, "import", sump_dxf(tmp_path), "-o", out_file,
                         "--axisymmetric", "--liquid-density", "1100", "--level", "1500",
                         "--unit", "cm")
    assert status == 0, err
    assert err == "warning: sump.dxf states its units as mm; read in cm as asked\n"
    case = read_section_file(out_file)
    assert case.section.kind == "axisymmetric" and case.length_unit == "cm"
    assert case.liquid.density == 1100.0
    assert case.fill_level == pytest.approx(15.0)  # 1500 cm
    assert case.section.outline[1, 0] == pytest.approx(24.0)


def test_import_unitless_drawing_warns_on_stderr(tmp_path, capsys):
    status, _, err = run(capsys, "import", sump_dxf(tmp_path, units=0), "-o",
                         tmp_path / "o.section.json")
    assert status == 0
    assert err.startswith("warning: sump.dxf states no units ($INSUNITS = 0); "
                          "read as millimetres")


def test_import_choice(tmp_path, capsys):
    path = sump_dxf(tmp_path, extra=True)
    out_file = tmp_path / "o.section.json"
    status, _, err = run(capsys, "import", path, "-o", out_file)
    assert status == 2 and not out_file.exists()
    assert err.startswith("error: 2 closed polylines in sump.dxf: #0 layer OUTLINE")
    assert err.count("\n") == 1
    for choice, n in [("OUTLINE", 6), ("hatch", 3), ("1", 3), ("#0", 6)]:
        status, _, err = run(capsys, "import", path, "-o", out_file, "--choose", choice)
        assert status == 0, err
        assert len(read_section_file(out_file).section.outline) == n


def test_export_dxf_then_import_gives_the_same_section(tmp_path, capsys, sample_path):
    case = read_section_file(sample_path)
    dxf = tmp_path / "out.dxf"
    status, out, err = run(capsys, "export", sample_path, "--dxf", dxf)
    assert status == 0, err
    assert out == f"wrote {dxf}\n"
    # in the file's own unit, coded as the DXF reference's $INSUNITS table
    code = {"in": 1, "ft": 2, "mm": 4, "cm": 5, "m": 6}[case.length_unit]
    assert ezdxf.readfile(dxf).header["$INSUNITS"] == code
    back_file = tmp_path / "back.section.json"
    kind = ["--axisymmetric"] if case.section.is_axisymmetric else []
    status, out, err = run(capsys, "import", dxf, "-o", back_file, *kind)
    assert status == 0, err
    assert out.endswith("parts from the drawing's part layers\n")
    back = read_section_file(back_file)
    assert back.length_unit == case.length_unit
    np.testing.assert_allclose(back.section.outline, case.section.outline, rtol=1e-9,
                               atol=1e-12)
    assert back.section.parts == case.section.parts


def test_export_needs_png_or_dxf(capsys, sample):
    status, _, err = run(capsys, "export", sample("chamber_under_riser"))
    assert status == 2
    assert err == "error: give --png OUT, --svg OUT and/or --dxf OUT\n"


@pytest.mark.parametrize("argv, words", [
    (["import", "{garbage}", "-o", "o.section.json"], "garbage.dxf is not a DXF file"),
    (["import", "nowhere.dxf", "-o", "o.section.json"], "nowhere.dxf: no such file"),
    (["import", "{sump}"], "required: -o/--output"),
    (["import", "{sump}", "-o", "o.section.json", "--liquid-density", "-5"],
     "--liquid-density must be a positive number of kg/m3, not -5"),
    (["import", "{sump}", "-o", "o.section.json", "--level", "nan"], "finite"),
    (["import", "{sump}", "-o", "o.section.json", "--unit", "cubits"],
     "unknown length unit 'cubits'"),
    (["import", "{sump}", "-o", "o.section.json", "--choose", "ROOF"],
     "has the number, handle or layer 'ROOF'"),
    (["import", "{empty}", "-o", "o.section.json"],
     "empty.dxf has no closed polyline in its modelspace"),
    (["export", "{sample}", "--dxf", "o.dxf", "--png", "o.png", "--size", "big"], "--size"),
])
def test_bad_input_exits_2_with_one_error_line(tmp_path, argv, words, sample):
    garbage = tmp_path / "garbage.dxf"
    garbage.write_text("not a drawing\n")
    empty = tmp_path / "empty.dxf"
    ezdxf.new().saveas(empty)
    sump = sump_dxf(tmp_path)
    argv = [a.format(garbage=garbage, sump=sump, empty=empty, sample=sample("chamber_under_riser"))
            for a in argv]
    proc = subprocess.run([sys.executable, "-m", "wetline", *argv], capture_output=True,
                          text=True, cwd=tmp_path)
    assert proc.returncode == 2
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("error: "), proc.stderr
    assert words in lines[0]
    assert not (tmp_path / "o.section.json").exists() and not (tmp_path / "o.dxf").exists()


def test_import_and_dxf_export_load_no_qt(tmp_path, sample):
    dxf = tmp_path / "s.dxf"
    code = ("import sys\nfrom wetline.app.cli.main import main\n"
            f"assert main(['export', {str(sample('chamber_under_riser'))!r}, "
            f"'--dxf', {str(dxf)!r}]) == 0\n"
            f"assert main(['import', {str(dxf)!r}, '-o', {str(tmp_path / 'b.section.json')!r}"
            "]) == 0\n"
            "print([m for m in sys.modules if m.startswith(('PySide6', 'pyqtgraph'))], "
            "file=sys.stderr)\n")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert proc.returncode == 0, proc.stderr
    assert proc.stderr.strip() == "[]"
