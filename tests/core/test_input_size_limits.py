"""How much Wetline reads: at most 64 MB of section file, 200,000 vertices.

Both are refused at once, before the work that grows with them (a million
vertices took 145 s and wrote 524 MB before these limits). The file is read
with a size cap, not judged by its size on disk alone: /dev/zero says it
holds 0 bytes and never ends (Linux, null(4)).
"""

import json
import os
import subprocess
import sys

import numpy as np
import pytest

from wetline.core import limits
from wetline.core.section import Section, SectionError
from wetline.core.section_file import SectionFileError, loads_case, read_section_file


def polygon_file(n):
    """A section file whose outline is a regular polygon of ``n`` vertices."""
    ang = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False)
    pts = np.c_[5.0 + 4.0 * np.cos(ang), 5.0 + 4.0 * np.sin(ang)].round(9)
    return json.dumps({"format": "wetline-section", "version": 1,
                       "geometry": {"kind": "plane"}, "outline": pts.tolist(),
                       "fluid": {"density": 1000.0}, "fill": {"level": 5.0}})


def test_the_limits():
    assert limits.MAX_FILE_BYTES == 64 * 1024 * 1024
    assert limits.MAX_VERTICES == 200_000


def test_an_outline_of_more_than_200000_vertices_is_refused():
    with pytest.raises(SectionFileError) as info:
        loads_case(polygon_file(limits.MAX_VERTICES + 1))
    assert str(info.value) == ("outline has 200001 vertices; Wetline computes with at most "
                               "200000")


def test_section_build_refuses_them_too():
    # DXF import, pasted coordinates and the editor all build a Section.
    pts = np.zeros((limits.MAX_VERTICES + 1, 2))
    with pytest.raises(SectionError, match="^outline has 200001 vertices; Wetline computes "
                                           "with at most 200000$"):
        Section.build(pts)


@pytest.mark.slow
def test_an_outline_of_200000_vertices_is_read():
    case = loads_case(polygon_file(limits.MAX_VERTICES))
    assert case.section.n_edges == limits.MAX_VERTICES


def test_a_file_larger_than_64_mb_is_refused_before_it_is_read(tmp_path):
    path = tmp_path / "huge.section.json"
    with open(path, "wb") as fh:
        fh.truncate(limits.MAX_FILE_BYTES + 1)  # sparse: no time, no disk
    with pytest.raises(SectionFileError) as info:
        read_section_file(path)
    assert str(info.value) == (f"{path}: is larger than 64 MB, the most Wetline reads "
                               "from a section file")


def test_a_file_of_exactly_64_mb_is_read_as_usual(tmp_path):
    path = tmp_path / "padded.section.json"
    text = polygon_file(8)
    path.write_bytes(text.encode() + b" " * (limits.MAX_FILE_BYTES - len(text)))
    assert read_section_file(path).section.n_edges == 8


@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="needs /dev/zero")
def test_an_endless_file_is_refused_after_64_mb():
    assert os.stat("/dev/zero").st_size == 0
    with pytest.raises(SectionFileError, match="^/dev/zero: is larger than 64 MB"):
        read_section_file("/dev/zero")


def test_too_long_a_text_is_refused_too():
    with pytest.raises(SectionFileError, match="is larger than 64 MB"):
        loads_case(" " * (limits.MAX_FILE_BYTES + 1))


@pytest.mark.skipif(not os.path.exists("/dev/zero"), reason="needs /dev/zero")
def test_solve_dev_zero_is_one_line():
    proc = subprocess.run([sys.executable, "-m", "wetline", "solve", "/dev/zero"],
                          capture_output=True, text=True, timeout=60)
    assert proc.returncode == 2
    assert proc.stderr == ("error: /dev/zero: is larger than 64 MB, the most Wetline reads "
                           "from a section file\n")


@pytest.mark.skipif(not os.path.exists("/dev/stdin"), reason="needs /dev/stdin")
def test_a_pipe_is_still_read(sample):
    # Not a regular file, and no size to stat: read up to the cap all the same.
    proc = subprocess.run([sys.executable, "-m", "wetline", "solve", "/dev/stdin", "--json"],
                          input=sample("open_tank").read_text(), capture_output=True,
                          text=True, timeout=60)
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout)["format"] == "wetline-results"


def test_a_large_file_that_is_no_section_file_says_so_first():
    text = json.dumps({"hello": [[0, 0]] * (limits.MAX_VERTICES + 2000)})
    with pytest.raises(SectionFileError, match="^not a Wetline section file"):
        loads_case(text)


def test_many_brackets_in_names_are_no_vertices():
    text = polygon_file(8).replace('"version": 1', '"version": 1, "name": "'
                                   + "[" * (limits.MAX_VERTICES + 5000) + '"')
    assert loads_case(text).section.n_edges == 8
