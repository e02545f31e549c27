"""What `wetline solve FILE --json` imports: only what the answer needs.

A start-up cost in a test is a benchmark's business (bench/bench_startup.py
prints the times); this checks the cause instead: for every bundled sample
(lengths in m, mm and ft; fresh water at whole degrees, seawater, a listed
liquid) the command builds no pint registry, imports neither iapws nor scipy
(0.3 s), nor Qt, pyqtgraph, ezdxf or importlib.metadata.
"""

import json
import subprocess
import sys

import pytest

HEAVY = ("pint", "iapws", "scipy", "PySide6", "pyqtgraph", "ezdxf", "importlib.metadata")

CODE = """\
import contextlib, io, json, sys
from wetline.app.cli.main import main
with contextlib.redirect_stdout(io.StringIO()) as out:
    status = main(["solve", sys.argv[1], "--json"])
heavy = sorted({m for m in sys.modules for h in HEAVY if m == h or m.startswith(h + ".")})
print(json.dumps({"status": status, "heavy": heavy, "weight": json.loads(out.getvalue())[
    "fluid_weight"]}))
""".replace("HEAVY", repr(HEAVY))


def test_solve_imports_nothing_heavy(sample_path):
    proc = subprocess.run([sys.executable, "-c", CODE, str(sample_path)], capture_output=True,
                          text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    result = json.loads(proc.stdout)
    assert result["status"] == 0 and result["weight"] > 0
    assert result["heavy"] == []


@pytest.mark.parametrize("unit", ["yd", "km"])
def test_other_units_still_go_through_pint(tmp_path, sample, unit):
    data = json.loads(sample("open_tank").read_text())
    data["length_unit"] = unit
    path = tmp_path / "t.section.json"
    path.write_text(json.dumps(data))
    proc = subprocess.run([sys.executable, "-c", CODE, str(path)], capture_output=True,
                          text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert "pint" in json.loads(proc.stdout)["heavy"]
