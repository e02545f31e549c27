"""The command line refuses a file in feet in feet: core's refusals (lengths
in metres, as core computes) are given in the file's length unit, the unit
of its tables and of ``--level`` (1 ft = 0.3048 m exactly, 1959 yard and
pound agreement, NIST SP 811 appendix B). The grease trap sample written in
feet was refused "the fill level 0.4572 m is not above the top of layer 1
'raw sewage' at 0.56388 m" for a typed ``--level 1.5``.
"""

import json

from wetline.app.cli.main import main


def _trap_in_feet(tmp_path, sample, change=None):
    data = json.loads(sample("grease_trap").read_text(encoding="utf-8"))
    data["length_unit"] = "ft"  # the same numbers, now in feet
    if change is not None:
        change(data)
    path = tmp_path / "trap.section.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    return path


def test_a_typed_level_is_refused_in_the_files_unit(tmp_path, sample, capsys):
    assert main(["solve", str(_trap_in_feet(tmp_path, sample)), "--level", "1.5"]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and err.startswith("error: ")
    assert "the fill level 1.5 ft is not above the top of layer 1 'raw sewage' at 1.85 ft" in err


def test_a_file_is_refused_in_its_unit(tmp_path, sample, capsys):
    def high(data):
        data["cases"][0]["groundwater"]["level"] = 5
    path = _trap_in_feet(tmp_path, sample, high)
    for command in ("cases", "solve"):
        assert main([command, str(path)]) == 2
        err = capsys.readouterr().err
        assert err.count("\n") == 1
        assert "groundwater level 5 ft is above the spill level 2 ft" in err


def test_warnings_are_written_in_the_tables_units(tmp_path, sample, capsys):
    """A level above the spill level is capped with a warning; in US units
    it read "level 7.62 m is above the spill level 5.4864 m" under tables
    in feet (the seawater intake bay, a file in feet, filled to 25 ft)."""
    data = json.loads(sample("seawater_intake_bay").read_text(encoding="utf-8"))
    data["fill"] = {"level": 25}
    path = tmp_path / "intake.section.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    assert main(["solve", str(path), "--units", "us"]) == 0
    out = capsys.readouterr().out
    assert "level 25 ft is above the spill level 18 ft; capped at the spill level" in out
    assert main(["solve", str(path)]) == 0  # SI: metres, as its tables
    assert "level 7.62 m is above the spill level 5.4864 m" in capsys.readouterr().out
