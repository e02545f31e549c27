"""Nothing stale is exported as current: while the outline being edited is
invalid, every export (PDF, PNG, SVG, the two CSVs, DXF) refuses, says why
and writes nothing; once the outline is fixed or discarded they write."""

import pytest

from wetline.app.model import editing
from wetline.app.window import dialogs

EXPORTS = [
    # action, extension, the function behind it taking a path
    ("export_pdf", ".pdf", lambda w: w.transfer.export_pdf_to),
    ("export", ".png", lambda w: w.export_to),
    ("export_svg", ".svg", lambda w: w.transfer.export_svg_to),
    ("export_edges_csv", ".csv", lambda w: w.transfer.export_edges_csv_to),
    ("export_level_csv", ".csv", lambda w: w.transfer.export_level_csv_to),
    ("export_dxf", ".dxf", lambda w: w.transfer.export_dxf_to),
]


@pytest.fixture
def invalid(make_window, settle):
    """A window whose outline is being edited into a crossing shape."""
    w = make_window()
    assert not editing.move_vertex(w.doc, 1, -1.0, 2.5)  # kept as a draft
    settle(w)
    assert w.doc.draft is not None
    return w


@pytest.mark.parametrize("action, ext, to", EXPORTS, ids=[e[0] for e in EXPORTS])
def test_export_refuses_an_invalid_outline(invalid, no_dialogs, monkeypatch, tmp_path, action,
                                           ext, to):
    w = invalid
    out = tmp_path / f"out{ext}"
    asked = []
    for name in ("ask_export_file", "ask_export_path"):
        monkeypatch.setattr(dialogs, name, lambda *a: asked.append(a) or str(out))
    w.actions_by_name[action].trigger()
    assert asked == []  # refused before asking where to write
    assert not to(w)(str(out))  # and when called with a path
    assert not out.exists() and list(tmp_path.iterdir()) == []
    assert len(no_dialogs) == 2
    title, text = no_dialogs[0]
    assert title.startswith("Cannot export")
    assert str(w.doc.draft.error) in text and "nothing was written" in text
    assert w.transfer.pdf_job is None
    message = w.statusBar().currentMessage()
    assert "Wrote" not in message and "Exported" not in message


@pytest.mark.parametrize("action, ext, to", EXPORTS, ids=[e[0] for e in EXPORTS])
def test_export_writes_once_the_outline_is_discarded(invalid, no_dialogs, qtbot, tmp_path,
                                                      action, ext, to):
    w = invalid
    w.actions_by_name["discard"].trigger()
    out = tmp_path / f"out{ext}"
    result = to(w)(str(out))
    if action == "export_pdf":
        qtbot.waitUntil(lambda: w.transfer.pdf_result is not None, timeout=60000)
        assert w.transfer.pdf_result[0] == "ok"
    else:
        assert result
    assert out.stat().st_size > 0 and not no_dialogs
