"""Every bundled sample opens in ``wetline solve``, ``wetline cases`` and
``wetline report`` (the samples README's promise)."""

import json

from wetline.app.cli.main import main
from wetline.core.section_file import read_design


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


def test_every_sample_opens_in_solve_and_cases(capsys, sample_path):
    status, out, err = run(capsys, "solve", sample_path)
    assert status == 0, err
    status, out, err = run(capsys, "cases", sample_path, "--json")
    assert status == 0, err
    rec = json.loads(out)
    assert [c["case"] for c in rec["cases"]] == list(read_design(sample_path).names)
    for name in rec["envelope"]["parts"]:
        assert name in read_design(sample_path).section.loaded_part_names
    status, out, err = run(capsys, "cases", sample_path)
    assert status == 0, err and "Envelope by part" in out


def test_every_case_of_the_design_samples_solves(capsys, sample):
    for stem in ("buried_wet_well", "buried_chamber", "grease_trap", "chamber_with_lip"):
        for name in read_design(sample(stem)).names:
            status, out, err = run(capsys, "solve", sample(stem), "--case", name, "--json")
            assert status == 0, (stem, name, err)
            assert json.loads(out)["case"] == name


def test_every_sample_opens_in_report(capsys, samples_dir, tmp_path):
    files = sorted(samples_dir.glob("*.section.json"))
    status, out, err = run(capsys, "report", *files, "-o", tmp_path / "sheets")
    assert status == 0, err
    sheets = sorted((tmp_path / "sheets").iterdir())
    assert len(sheets) == len(files)
    for pdf in sheets:
        assert pdf.read_bytes()[:5] == b"%PDF-"
