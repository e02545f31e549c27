"""The command line never writes over its own input, nor over a non-file.

Every output option (`export --png/--svg/--dxf`, `report -o`, `import -o`)
is checked against every input before anything is read or written: the
same path, the same file by another path, through a symbolic link or a
hard link (os.path.samefile). The refusal is one line and exit status 2, and
the input file is left byte for byte as it was.
"""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import shutil
import stat
import subprocess
import sys

import ezdxf
import pytest

from wetline.app.cli.main import main

posix_only = pytest.mark.skipif(os.name != "posix", reason="POSIX links and pipes")


def run(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    return status, out, err


@pytest.fixture
def section(tmp_path, sample):
    """A copy of a bundled sample in tmp_path, and its bytes."""
    path = tmp_path / "A.section.json"
    shutil.copy(sample("sump_with_lid"), path)
    return path


@pytest.fixture
def drawing(tmp_path):
    doc = ezdxf.new("R2010")
    doc.units = 4  # mm (AutoCAD DXF Reference, $INSUNITS)
    doc.modelspace().add_lwpolyline([(0, 0), (2000, 0), (2000, 1500), (0, 1500)], close=True)
    path = tmp_path / "sump.dxf"
    doc.saveas(path)
    return path


def refused_in_one_line(capsys, argv, protected, words):
    before = {p: p.read_bytes() for p in protected}
    status, out, err = run(capsys, *argv)
    assert status == 2, (out, err)
    lines = err.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("error: "), err
    assert words in lines[0], lines[0]
    for p, data in before.items():
        assert p.read_bytes() == data, f"{p} was changed"
    return lines[0]


@pytest.mark.parametrize("option", ["--png", "--svg", "--dxf"])
def test_export_refuses_to_write_over_its_input(capsys, section, option):
    line = refused_in_one_line(capsys, ["export", section, option, section], [section],
                               "is the input file")
    assert line == (f"error: {option} {section} is the input file {section}; "
                    "give another output file")


def test_report_refuses_to_write_over_its_input(capsys, section):
    refused_in_one_line(capsys, ["report", section, "-o", section], [section],
                        "is the input file")


def test_import_refuses_to_write_over_the_drawing(capsys, drawing):
    refused_in_one_line(capsys, ["import", drawing, "-o", drawing], [drawing],
                        "is the input file")


def test_the_same_file_by_another_path(capsys, section, monkeypatch):
    monkeypatch.chdir(section.parent)
    other = f"../{section.parent.name}/./{section.name}"
    refused_in_one_line(capsys, ["export", section.name, "--png", other], [section],
                        "is the input file")


@posix_only
def test_the_same_file_through_a_symbolic_link(capsys, section, tmp_path):
    link = tmp_path / "diagram.png"
    link.symlink_to(section)
    refused_in_one_line(capsys, ["export", section, "--png", link], [section],
                        "is the input file")
    assert link.is_symlink()


@posix_only
def test_an_input_given_through_a_link_is_still_the_input(capsys, section, tmp_path):
    link = tmp_path / "B.section.json"
    link.symlink_to(section)
    refused_in_one_line(capsys, ["report", link, "-o", section], [section],
                        "is the input file")


@posix_only
def test_the_same_file_through_a_hard_link(capsys, section, tmp_path):
    hard = tmp_path / "hard.svg"
    os.link(section, hard)
    refused_in_one_line(capsys, ["export", section, "--svg", hard], [section],
                        "is the input file")


@posix_only
def test_import_over_the_drawing_through_a_link(capsys, drawing, tmp_path):
    link = tmp_path / "out.section.json"
    link.symlink_to(drawing)
    refused_in_one_line(capsys, ["import", drawing, "-o", link], [drawing],
                        "is the input file")


def test_a_batch_refuses_a_sheet_that_would_be_one_of_its_inputs(capsys, section, tmp_path):
    # "tank.pdf" as a section file: its sheet in the same folder is itself.
    odd = tmp_path / "tank.pdf"
    shutil.copy(section, odd)
    refused_in_one_line(capsys, ["report", section, odd, "-o", tmp_path], [section, odd],
                        "is the input file")


def test_two_outputs_naming_one_file_are_refused(capsys, section, tmp_path):
    out = tmp_path / "d.out"
    line = refused_in_one_line(capsys, ["export", section, "--png", out, "--svg", out],
                               [section], "name the same file")
    assert line == f"error: --png and --svg name the same file {out}; give two files"
    assert not out.exists()


def test_a_folder_given_for_one_file_is_refused(capsys, section, tmp_path):
    folder = tmp_path / "drawings"
    folder.mkdir()
    refused_in_one_line(capsys, ["export", section, "--dxf", folder], [section],
                        "it is a folder")
    assert list(folder.iterdir()) == []


@posix_only
def test_a_pipe_given_for_a_file_is_refused(capsys, section, tmp_path):
    fifo = tmp_path / "out.dxf"
    os.mkfifo(fifo)
    refused_in_one_line(capsys, ["export", section, "--dxf", fifo], [section],
                        "not a regular file")
    assert stat.S_ISFIFO(os.lstat(fifo).st_mode)


def test_other_outputs_still_work(capsys, section, tmp_path):
    out = tmp_path / "A.dxf"
    status, o, err = run(capsys, "export", section, "--dxf", out)
    assert status == 0, err
    assert o == f"wrote {out}\n" and out.is_file()


def test_the_refusal_is_one_line_from_the_real_program(section):
    before = section.read_bytes()
    proc = subprocess.run([sys.executable, "-m", "wetline", "report", str(section), "-o",
                           str(section)], capture_output=True, text=True)
    assert proc.returncode == 2
    assert proc.stderr == (f"error: -o {section} is the input file {section}; "
                           "give another output file\n")
    assert section.read_bytes() == before
