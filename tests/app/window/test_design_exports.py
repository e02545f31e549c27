"""What the window exports of a design with load cases and a structure.

The task of issue 9 as a new user does it: open the buried wet well sample,
see its four cases and the envelope, find the governing case of the base
slab and the lowest flotation factor in the flotation panel, then export
one PDF sheet from File > Export and find the same in it. The PNG and SVG
diagrams of the active case carry its structure and groundwater, and are
the ones ``wetline export FILE --case NAME`` writes.

The numbers are core's (``Design.solve_all``, ``envelope``), which
tests/core checks against Archimedes and hand-worked flotation examples;
here the window must pass them through, not a case without its structure.
"""

import re
import shutil
import subprocess

import pytest

from wetline.app.cli.main import main as cli_main
from wetline.app.window import dialogs
from wetline.core.load_cases import envelope
from wetline.core.numbers import format_number
from wetline.core.section_file import read_design

SAMPLE = "buried_wet_well"
NAMES = ["normal top water", "overflow to the spill level",
         "water test (full, no groundwater)", "empty, flood groundwater at ground level"]


@pytest.fixture
def well(make_window, settle, sample):
    w = make_window()
    assert w.open_path(str(sample(SAMPLE)))
    settle(w)
    return w


def wait_pdf(qtbot, window, timeout=60000):
    """(status, text) once the window has handled the end of the sheet."""
    qtbot.waitUntil(lambda: window.transfer.pdf_result is not None, timeout=timeout)
    return window.transfer.pdf_result


def pdf_text(path):
    """The sheet's text by pdftotext (poppler), one string per page, words
    joined by single spaces."""
    if shutil.which("pdftotext") is None:
        pytest.skip("pdftotext (poppler-utils) is not installed")
    out = subprocess.run(["pdftotext", "-layout", str(path), "-"], check=True,
                         capture_output=True, text=True).stdout
    return [" ".join(page.split()) for page in out.split("\f")]


def test_a_new_user_finds_the_governing_cases_and_exports_them_on_one_sheet(
        well, qtbot, tmp_path, sample):
    w = well
    doc = w.doc
    # The four cases in the list, and the envelope on the toolbar switch.
    m = w.case_list.model
    assert [m.data(m.index(r, 0)) for r in range(m.rowCount())] == NAMES
    w.set_view_mode("envelope")
    assert doc.view_mode == "envelope" and doc.envelope_current
    design = read_design(sample(SAMPLE))
    env = envelope(design.solve_all())
    fl, base = env.flotation, env.base
    # Where the user reads them: the flotation panel.
    panel = w.flotation_panel
    assert panel.text("lowest") == (f"{'OK' if fl.ok else 'NOT OK'} {format_number(fl.factor)} "
                                    f"in {fl.case} (design value)")
    assert f"in {base.case}, floor edge {base.index}" in panel.text("base_envelope")
    # One PDF from File > Export: every case, the envelope, flotation and base.
    out = tmp_path / "wet well.pdf"
    w.transfer.export_pdf_to(out)
    assert wait_pdf(qtbot, w) == ("ok", str(out))
    pages = pdf_text(out)
    text = " ".join(pages)
    assert "Load cases" in text
    for k, name in enumerate(NAMES, start=1):
        assert f"3.{k} Case {name}" in text, name
    assert "Envelope of the 4 cases (design values)" in text
    assert (f"Lowest flotation factor {format_number(fl.factor)} in case {fl.case} against "
            f"{format_number(fl.required)} required: {'OK' if fl.ok else 'NOT OK'}") in text
    assert (f"Governing base pressure {format_number(base.net_upward_pressure / 1000)} kPa "
            f"net upward, case {base.case}") in text
    # The base slab's case and the flotation case are the flood case here
    # (empty well, groundwater at ground level): common practice.
    assert fl.case == base.case == NAMES[3]
    # Every case is drawn with its structure.
    for name in NAMES:
        assert any(f"Case {name}: sketch and pressure diagram" in p for p in pages), name
    flood = next(p for p in pages if f"Case {NAMES[3]}: sketch" in p)
    assert "structure around" in flood and "groundwater = ground 4.5 m" in flood
    assert "groundwater level" in flood and "49.03 kPa" in flood
    # 49.03 kPa: rho_w g h under the base, 1000 kg/m3 x 9.80665 m/s2 x (4.5 m
    # - (-0.5 m)) = 49.033 kPa, worked by hand from the sample's levels.


def test_the_diagrams_are_of_the_active_case_with_its_structure(well, tmp_path, sample,
                                                                 capsys):
    w = well
    w.doc.select_case(3)
    w.doc.flush()
    svg = tmp_path / "gui.svg"
    assert w.transfer.export_svg_to(svg)
    text = svg.read_text(encoding="utf-8")
    # The drawing's words, its wrapped lines joined.
    words = " ".join(t.strip() for t in re.findall(r">([^<>]+)<", text) if t.strip())
    assert f"Load case {NAMES[3]}" in words
    assert "structure around the cavity" in text
    assert "spill level = groundwater = ground 4.5 m" in text
    # The command line draws the same diagram of the same case.
    cli = tmp_path / "cli.svg"
    assert cli_main(["export", str(sample(SAMPLE)), "--case", NAMES[3], "--svg",
                     str(cli)]) == 0
    assert cli.read_bytes() == svg.read_bytes()
    png, cli_png = tmp_path / "gui.png", tmp_path / "cli.png"
    assert w.export_to(png, size=(900, 640))
    assert cli_main(["export", str(sample(SAMPLE)), "--case", NAMES[3], "--png",
                     str(cli_png), "--size", "900x640"]) == 0
    assert png.read_bytes() == cli_png.read_bytes()
    capsys.readouterr()


def test_the_png_export_asks_for_a_path_and_draws_the_active_case(well, tmp_path,
                                                                   monkeypatch):
    w = well
    w.doc.select_case(1)
    w.doc.flush()
    out = tmp_path / "d.png"
    monkeypatch.setattr(dialogs, "ask_export_path", lambda parent, suggested: str(out))
    assert w.export_dialog()
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_an_export_in_the_envelope_view_says_it_is_of_the_active_case(well, tmp_path):
    """The window may show the envelope while a diagram or per-edge export is
    of one case: the status line names the case and says the envelope is not
    what was written (it read only "Exported PATH", the file then showing a
    case the window did not)."""
    w = well
    w.doc.select_case(1)
    w.set_view_mode("envelope")
    w.doc.flush()
    status = w.statusBar()
    for export, name in ((w.export_to, "d.png"), (w.transfer.export_svg_to, "d.svg"),
                         (w.transfer.export_edges_csv_to, "e.csv")):
        path = tmp_path / name
        assert export(path)
        text = status.currentMessage()
        assert f"of case '{NAMES[1]}' to {path}" in text
        assert "not the envelope" in text and "calculation sheet" in text
    w.set_view_mode("case")
    assert w.export_to(tmp_path / "c.png")
    assert status.currentMessage() == (f"Exported the diagram of case '{NAMES[1]}' to "
                                       f"{tmp_path / 'c.png'}")
