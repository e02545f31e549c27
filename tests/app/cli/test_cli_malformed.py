"""Malformed section files on the real command line: `solve`, `table`,
`export` and `report` each end with exit status 2 and one line on standard
error, and nothing else reaches it (no traceback, no numpy or Qt warning).

Each class was found by fuzzing these commands with mutated section files
(tests/core/test_malformed_files.py checks the messages themselves). One
subprocess per class runs the five commands with Python's default warning
filters, as a user's shell would.
"""

import json
import os
import subprocess
import sys
import textwrap

import pytest

DRIVER = textwrap.dedent("""\
    import sys
    from wetline.app.cli.main import main

    path, out = sys.argv[1], sys.argv[2]
    runs = [["solve", path], ["solve", path, "--json"], ["table", path, "--csv"],
            ["export", path, "--png", out + ".png", "--svg", out + ".svg", "--dxf",
             out + ".dxf"],
            ["report", path, "-o", out + ".pdf"]]
    for argv in runs:
        status = main(argv)
        sys.stderr.flush()
        print(status, flush=True)
""")


def base():
    return {
        "format": "wetline-section",
        "version": 1,
        "name": "Settled-water tank",
        "length_unit": "m",
        "geometry": {"kind": "plane", "width": 1},
        "outline": [[0, 0], [6, 0], [6, 3.2], [0, 3.2]],
        "parts": ["floor", "wall", "open", "wall"],
        "fluid": {"preset": "fresh water", "temperature": 12.0},
        "gravity": 9.80665,
        "fill": {"level": 2.8},
    }


def text_with(**changes):
    data = base()
    data.update(changes)
    return json.dumps(data)


CLASSES = {
    "nested 1000 deep": ('{"format": "wetline-section", "version": 1, "name": '
                         + "[" * 1000 + "]" * 1000 + "}", "nests lists or objects too deeply"),
    "400-digit coordinate": (text_with().replace("[6, 3.2]", "[6, " + "9" * 400 + "]"),
                             "outside -1e7 to 1e7 m"),
    "400-digit width": (text_with().replace('"width": 1', '"width": ' + "9" * 400),
                        "geometry.width must be 1e-6 to 1e7 m"),
    "5e-324 coordinates": (text_with(outline=[[0, 0], [5e-324, 0], [5e-324, 5e-324],
                                              [0, 5e-324]], fill={"level": 5e-324}),
                           "a coordinate is 0 or at least 1e-100 m"),
    "density 1e308": (text_with(fluid={"density": 1e308}), "fluid density must be 0.001"),
    "coordinates times 1e300": (text_with(outline=[[0, 0], [6e300, 0], [6e300, 3.2e300],
                                                   [0, 3.2e300]], fill={"level": 2.8e300}),
                                "outside -1e7 to 1e7 m"),
    "density 5e-324": (text_with(fluid={"density": 5e-324}), "fluid density must be 0.001"),
    "NaN": (text_with().replace("[6, 3.2]", "[6, NaN]"), "NaN is not a number JSON allows"),
    "not a section file": ('{"hello": 1}', 'not a Wetline section file (no "format": '
                                           '"wetline-section")'),
}


@pytest.mark.slow
@pytest.mark.parametrize("kind", list(CLASSES))
def test_each_command_gives_one_line_and_exit_2(kind, tmp_path):
    text, words = CLASSES[kind]
    path = tmp_path / "bad.section.json"
    path.write_text(text, encoding="utf-8")
    proc = subprocess.run([sys.executable, "-c", DRIVER, str(path), str(tmp_path / "out")],
                          capture_output=True, text=True, timeout=240,
                          env={**os.environ, "QT_QPA_PLATFORM": "offscreen"})
    assert proc.stdout.split() == ["2"] * 5, proc.stderr
    lines = proc.stderr.splitlines()
    assert len(lines) == 5, proc.stderr
    for line in lines:
        assert line.startswith("error: bad.section.json: ") and words in line, line
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bad.section.json"]  # nothing written


RANGE_SLIPS_THROUGH = textwrap.dedent("""\
    import sys
    import numpy as np
    import wetline.core.load_cases as load_cases
    from wetline.app.cli.main import main

    def overflowing_solve(self):
        return np.float64(1e308) * np.float64(10.0)  # as if a range check were missing

    # The one place a load case is solved (the command line solves load cases).
    load_cases.ResolvedCase.solve = overflowing_solve
    print(main(["solve", sys.argv[1]]))
""")


def test_a_numeric_warning_ends_the_run_in_one_line(sample):
    proc = subprocess.run([sys.executable, "-c", RANGE_SLIPS_THROUGH, str(sample("open_tank"))],
                          capture_output=True, text=True, timeout=120)
    assert proc.stdout.strip() == "2"
    assert proc.stderr == ("error: a computation went out of range (overflow encountered in "
                           "scalar multiply); the input is outside what Wetline computes with\n")
