"""`wetline report` (one sheet or a batch), and the CSV outputs' headers."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import csv
import io
import shutil

import pypdf
import pytest

from wetline.app.cli.main import _stem, main


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


def pdf_text(path):
    return " ".join(" ".join(p.extract_text().split()) for p in pypdf.PdfReader(path).pages[:2])


def test_one_file_writes_the_named_pdf(tmp_path, capsys, sample):
    out = tmp_path / "calc.pdf"
    status, o, err = run(capsys, "report", sample("sump_with_lid"), "-o", out,
                         "--level", "2.0")
    assert status == 0, err
    assert o == f"wrote {out}\n" and err == ""
    text = pdf_text(out)
    assert "Pump sump, inlet works north bay" in text
    assert "level given for this sheet" not in text  # --level sets the case's fill
    assert "Level used 2 m" in text


def test_batch_with_a_broken_file_finishes_the_rest_and_exits_2(tmp_path, capsys, sample):
    src = tmp_path / "in"
    src.mkdir()
    good = ["open_tank", "sump_with_lid", "cone_hopper"]
    for name in good:
        shutil.copy(sample(name), src)
    broken = src / "broken.section.json"
    broken.write_text('{"format": "wetline-section", "version": 1}')
    files = [src / "open_tank.section.json", broken, src / "sump_with_lid.section.json",
             src / "cone_hopper.section.json"]
    out = tmp_path / "sheets" / "new"  # made, parents too
    status, o, err = run(capsys, "report", *files, "-o", out, "--units", "us")
    assert status == 2
    assert sorted(p.name for p in out.iterdir()) == sorted(f"{n}.pdf" for n in good)
    for name in good:
        assert (out / f"{name}.pdf").read_bytes().startswith(b"%PDF")
    lines = err.splitlines()
    assert "[1/4] open_tank.section.json ... ok" in lines
    assert "[2/4] broken.section.json ... failed" in lines
    assert "[4/4] cone_hopper.section.json ... ok" in lines
    errors = [line for line in lines if line.startswith("error: ")]
    assert len(errors) == 1 and errors[0].startswith(f"error: {broken}: ")
    assert "missing key" in errors[0]
    assert lines[-1] == f"failed: 1 of 4: {broken}"
    assert o == f"wrote 3 of 4 sheets to {out}\n"
    assert "lbf" in pdf_text(out / "cone_hopper.pdf")


def test_batch_all_good_exits_0(tmp_path, capsys, sample):
    files = [sample("open_tank"), sample("closed_tank")]
    status, o, err = run(capsys, "report", *files, "-o", tmp_path)
    assert status == 0, err
    assert sorted(p.name for p in tmp_path.iterdir()) == ["closed_tank.pdf", "open_tank.pdf"]
    assert "failed" not in err


def test_batch_refuses_a_file_as_the_folder_and_same_stems(tmp_path, capsys, sample):
    f = tmp_path / "x.pdf"
    f.write_text("")
    files = [sample("open_tank"), sample("closed_tank")]
    status, _, err = run(capsys, "report", *files, "-o", f)
    assert status == 2 and err.startswith("error: ") and "not a folder" in err
    status, _, err = run(capsys, "report", files[0], files[0], "-o", tmp_path / "d")
    assert status == 2
    assert "same sheet name open_tank.pdf" in err
    assert (tmp_path / "d" / "open_tank.pdf").exists()


def test_one_bad_file_is_one_error_line(tmp_path, capsys, sample):
    status, o, err = run(capsys, "report", tmp_path / "none.section.json", "-o",
                         tmp_path / "x.pdf")
    assert status == 2 and o == ""
    assert err.count("\n") == 1 and err.startswith("error: ")
    status, _, err = run(capsys, "report", sample("open_tank"), "-o",
                         tmp_path / "missing" / "x.pdf")
    assert status == 2 and "does not exist" in err
    status, _, err = run(capsys, "report", sample("open_tank"))
    assert status == 2 and err.startswith("error: ") and "-o" in err
    assert list(tmp_path.iterdir()) == []


def test_stem_of_a_section_file():
    assert _stem("a/b/sump.section.json") == "sump"
    assert _stem("tank.json") == "tank"
    assert _stem("plain") == "plain"


@pytest.mark.parametrize("argv", [["solve", "--csv"], ["table", "--csv"]])
def test_csv_header_rows_name_their_units(capsys, argv, sample):
    status, o, err = run(capsys, argv[0], sample("sump_with_lid"), argv[1])
    assert status == 0, err
    header = next(csv.reader(io.StringIO(o)))
    unitless = {"edge", "part"}
    for name in header:
        assert name in unitless or ("[" in name and name.endswith("]")), name


def _all_pages(path):
    return [" ".join(p.extract_text().split()) for p in pypdf.PdfReader(path).pages]


def test_a_file_with_load_cases_gives_one_sheet_of_every_case_and_the_envelope(
        tmp_path, capsys, sample):
    # Issue 9: `wetline report` prints every case and the envelope in one sheet,
    # with the load-case table up front and the flotation check of each case.
    out = tmp_path / "well.pdf"
    status, _, err = run(capsys, "report", sample("buried_wet_well"), "-o", out)
    assert status == 0, err
    pages = _all_pages(out)
    text = " ".join(pages)
    assert "4 load cases and their envelope" in pages[0]
    assert "Load cases" in pages[0]
    for name in ("normal top water", "overflow to the spill level",
                 "water test (full, no groundwater)"):
        assert f"Case {name}" in text
    assert "Envelope of the 4 cases" in text and "Lowest flotation factor" in text
    # Every case's sketch has a page of its own (its legend is not clipped).
    sketches = [k for k, t in enumerate(pages) if ": sketch and pressure diagram" in t]
    assert len(sketches) == 4 and len(set(sketches)) == 4
    for k in sketches:
        assert "groundwater pressure on the outer face" in pages[k] or "empty" not in pages[k]


def test_case_picks_one_case_for_the_sheet(tmp_path, capsys, sample):
    out = tmp_path / "one.pdf"
    status, _, err = run(capsys, "report", sample("buried_wet_well"), "-o", out,
                         "--case", "overflow to the spill level")
    assert status == 0, err
    text = " ".join(_all_pages(out))
    assert "Case overflow to the spill level" in text or "overflow to the spill level" in text
    assert "Envelope of the" not in text
