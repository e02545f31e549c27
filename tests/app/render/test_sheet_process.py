"""The calculation sheet's own process (``python -m wetline.app.render.sheet_process``):
its request on standard input, its progress and answer on standard output,
exit statuses, and SIGTERM as a cancel that leaves nothing behind."""

import io
import json
import os
import signal
import subprocess
import sys

import pypdf

from wetline.app.render import sheet_process
from wetline.app.render.sheet import report_pdf_bytes
from wetline.core.section_file import dumps_design, loads_design


def request(path, design, units="si", case=None):
    head = json.dumps({"path": str(path), "units": units, "case": case})
    return head + "\n" + dumps_design(design)


def answers(text):
    return [json.loads(line) for line in text.splitlines()]


def pdf_text(data):
    reader = pypdf.PdfReader(io.BytesIO(data))
    return [" ".join(p.extract_text().split()) for p in reader.pages]


def test_the_design_it_reads_is_the_design_sent(buried_wet_well):
    design = buried_wet_well()
    head, text = sheet_process.read_request(io.StringIO(request("x.pdf", design)))
    assert head == {"path": "x.pdf", "units": "si", "case": None}
    got = loads_design(text)
    # Design's own fields (its cached geometry holds arrays): as the file tests compare.
    assert (got.case, got.structure, got.ground, got.cases) == (
        design.case, design.structure, design.ground, design.cases)


def test_it_writes_the_same_sheet_as_the_program_and_says_so(buried_wet_well, tmp_path):
    design = buried_wet_well()
    out = tmp_path / "well.pdf"
    said = io.StringIO()
    assert sheet_process.main(io.StringIO(request(out, design, units="us")), said) == 0
    items = answers(said.getvalue())
    assert items[-1] == ["ok", str(out)]
    steps = [i for i in items[:-1] if i[0] == "progress"]
    assert [s[1] for s in steps] == [0, 1, 2, 3] and {s[2] for s in steps} == {4}
    assert pdf_text(out.read_bytes()) == pdf_text(report_pdf_bytes(design, units="us"))


def test_a_refusal_is_one_line_and_nothing_is_written(buried_wet_well, tmp_path):
    said = io.StringIO()
    out = tmp_path / "missing" / "well.pdf"
    assert sheet_process.main(io.StringIO(request(out, buried_wet_well())), said) == \
        sheet_process.FAILED
    kind, message = answers(said.getvalue())[-1]
    assert kind == "failed" and "does not exist" in message and "Traceback" not in message
    said = io.StringIO()
    assert sheet_process.main(io.StringIO(request(tmp_path / "a.pdf", buried_wet_well(),
                                                  case="no such case")), said) == \
        sheet_process.FAILED
    assert "no such case" in answers(said.getvalue())[-1][1]
    assert list(tmp_path.iterdir()) == []


def test_a_request_it_cannot_read_is_refused(tmp_path):
    for bad in ("not json\n", '{"path": "a.pdf"}\n', "[1, 2]\n"):
        said = io.StringIO()
        assert sheet_process.main(io.StringIO(bad), said) == sheet_process.BAD_REQUEST
        kind, message = answers(said.getvalue())[-1]
        assert kind == "failed" and "request" in message


def test_sigterm_cancels_and_leaves_no_file(tmp_path, bowl_case):
    """A long sheet (2,000 vertices) in a real process, stopped by SIGTERM once
    it reports its first step: exit status 3, no PDF and no temporary file."""
    from wetline.core.load_cases import Design

    design = Design(bowl_case(2000))
    out = tmp_path / "bowl.pdf"
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    with subprocess.Popen([sys.executable, "-m", "wetline.app.render.sheet_process"],
                          stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                          stderr=subprocess.PIPE, text=True, env=env) as proc:
        proc.stdin.write(request(out, design))
        proc.stdin.close()
        first = json.loads(proc.stdout.readline())
        assert first[0] == "progress"
        proc.send_signal(signal.SIGTERM)
        proc.wait(timeout=120)
        rest, err = proc.stdout.read(), proc.stderr.read()
    assert proc.returncode == sheet_process.CANCELLED, err[-2000:]
    assert all(json.loads(line)[0] == "progress" for line in rest.splitlines())
    assert list(tmp_path.iterdir()) == []
    assert err == ""
