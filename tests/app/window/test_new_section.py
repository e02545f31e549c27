"""Starting a new section (New from template, Draw new outline, File > Import)
never overwrites the file that was open: unsaved changes are asked about
first (Save / Discard / Cancel), then the window works on an untitled
document that Save asks a name for, starting in the last folder used."""

import shutil

import ezdxf
import pytest
from PySide6.QtCore import Qt

from wetline.app.model import editing
from wetline.app.window import dialogs
from wetline.core.section_file import read_section_file
from wetline.core.templates import TEMPLATES

SUMP_MM = [(0, 0), (2400, 0), (2400, 1600), (1900, 1600), (1900, 2800), (0, 2800)]


@pytest.fixture
def opened(make_window, tmp_path, sample, settle):
    """A window on a copy of the sump sample in tmp_path/job, with one unsaved
    edit; returns (window, path, the file's bytes)."""
    folder = tmp_path / "job"
    folder.mkdir()
    path = folder / "sump.section.json"
    shutil.copy(sample("sump_with_lid"), path)
    w = make_window()
    assert w.open_path(str(path))
    editing.fill_to_level(w.doc, 1.5)
    settle(w)
    assert w.doc.is_modified
    return w, path, path.read_bytes()


@pytest.fixture
def answers(monkeypatch):
    """Record the unsaved-changes questions and answer them from a list."""
    asked = []
    replies = []

    def ask(parent, name):
        asked.append(name)
        return replies.pop(0) if replies else "discard"  # the window closing at teardown

    monkeypatch.setattr(dialogs, "ask_save_changes", ask)
    return asked, replies


def open_tank(monkeypatch):
    t = TEMPLATES["open_tank"]
    section = t.build()
    monkeypatch.setattr(dialogs, "ask_template", lambda parent, units, kind=None: (
        section, t.default_level(section)))
    return section


def draw_square(w):
    w.actions_by_name["draw"].trigger()
    assert w.canvas.mode == "draw"
    for x, z in ((0.0, 0.0), (3.0, 0.0), (3.0, 2.0), (0.0, 2.0)):
        w.canvas.add_drawn_point(x, z)
    return w.canvas.finish_drawing()


def dxf_file(tmp_path):
    doc = ezdxf.new("R2010")
    doc.units = 4  # mm
    doc.modelspace().add_lwpolyline(SUMP_MM, close=True)
    path = tmp_path / "new.dxf"
    doc.saveas(path)
    return path


def start_new(entry, w, monkeypatch, tmp_path):
    """Start a new section through one of the three entry points."""
    if entry == "template":
        open_tank(monkeypatch)
        return w.actions_by_name["new"].trigger() or True
    if entry == "draw":
        return draw_square(w)
    path = dxf_file(tmp_path)
    monkeypatch.setattr(dialogs, "ask_import_file", lambda *a: str(path))
    w.actions_by_name["import_dxf"].trigger()
    return True


def title_names_untitled(w, old_name):
    title = w.windowTitle()
    return title.startswith("Untitled") and old_name not in title


ENTRIES = ["template", "draw", "import"]


@pytest.mark.parametrize("entry", ENTRIES)
def test_discard_detaches_and_save_asks_a_name(entry, opened, answers, monkeypatch, tmp_path,
                                                settle):
    w, path, saved_bytes = opened
    asked, replies = answers
    replies.append("discard")
    old_case = w.doc.case
    start_new(entry, w, monkeypatch, tmp_path)
    settle(w)
    assert asked == ["sump.section.json"]
    assert w.doc.case.section != old_case.section  # the new outline is shown
    assert w.doc.path is None and w.windowFilePath() == ""
    assert title_names_untitled(w, "sump.section.json")
    assert w.doc.is_modified and w.isWindowModified()
    # Save asks for a name, starting in the folder last used; the old file
    # is never touched.
    suggested = []
    target = tmp_path / "job" / "second.section.json"
    monkeypatch.setattr(dialogs, "ask_save_path",
                        lambda parent, s="": suggested.append(s) or str(target))
    w.actions_by_name["save"].trigger()
    assert len(suggested) == 1
    from pathlib import Path
    assert Path(suggested[0]).parent == path.parent
    assert path.read_bytes() == saved_bytes
    assert read_section_file(target) == w.doc.case
    assert w.doc.path == str(target) and not w.doc.is_modified


@pytest.mark.parametrize("entry", ENTRIES)
def test_cancel_leaves_everything_as_it_was(entry, opened, answers, monkeypatch, tmp_path,
                                             settle):
    w, path, saved_bytes = opened
    asked, replies = answers
    replies.append("cancel")
    before, count, title = w.doc.case, w.doc.undo_stack.count(), w.windowTitle()
    if entry == "template":
        monkeypatch.setattr(dialogs, "ask_template",
                            lambda *a, **k: pytest.fail("asked for a template after Cancel"))
    if entry == "import":
        monkeypatch.setattr(dialogs, "ask_import_file",
                            lambda *a: pytest.fail("asked for a drawing after Cancel"))
    if entry == "draw":
        assert draw_square(w) is False
        # the drawing is kept: Save, then finish it again
        assert w.canvas.mode == "draw" and len(w.canvas.editor.drawn) == 4
    else:
        start_new(entry, w, monkeypatch, tmp_path)
    settle(w)
    assert asked == ["sump.section.json"]
    assert w.doc.case is before and w.doc.undo_stack.count() == count
    assert w.doc.path == str(path) and w.windowTitle() == title and w.doc.is_modified
    assert path.read_bytes() == saved_bytes


@pytest.mark.parametrize("entry", ENTRIES)
def test_save_writes_the_old_file_first(entry, opened, answers, monkeypatch, tmp_path, settle):
    w, path, saved_bytes = opened
    asked, replies = answers
    replies.append("save")
    edited = w.doc.case
    start_new(entry, w, monkeypatch, tmp_path)
    settle(w)
    assert read_section_file(path) == edited  # the edit is in the old file
    assert w.doc.path is None and title_names_untitled(w, "sump.section.json")


def test_an_unmodified_file_is_left_without_a_question(make_window, sample, tmp_path,
                                                       monkeypatch, answers, settle):
    asked, _ = answers
    path = tmp_path / "sump.section.json"
    shutil.copy(sample("sump_with_lid"), path)
    w = make_window()
    assert w.open_path(str(path), ask=False)
    open_tank(monkeypatch)
    w.actions_by_name["new"].trigger()
    settle(w)
    assert asked == [] and w.doc.path is None
    assert title_names_untitled(w, "sump.section.json")


def test_undo_of_a_new_section_returns_to_the_file(make_window, sample, tmp_path, monkeypatch,
                                                   settle):
    path = tmp_path / "sump.section.json"
    shutil.copy(sample("sump_with_lid"), path)
    w = make_window()
    assert w.open_path(str(path))
    before = w.doc.case
    open_tank(monkeypatch)
    w.actions_by_name["new"].trigger()
    assert w.doc.path is None
    w.actions_by_name["undo"].trigger()
    settle(w)
    assert w.doc.case is before and w.doc.path == str(path)
    assert not w.doc.is_modified and w.windowTitle().startswith("sump.section.json")
    w.actions_by_name["redo"].trigger()
    assert w.doc.path is None and w.doc.is_modified


def test_paste_coordinates_is_an_edit_of_the_open_file(opened, answers, settle):
    w, path, _ = opened
    asked, _ = answers
    assert w.transfer.paste_coordinates_text("0 0\n2 0\n2 1\n0 1\n")
    assert asked == [] and w.doc.path == str(path)


def test_save_as_starts_in_the_last_folder_used(make_window, settings, tmp_path, monkeypatch,
                                                template_case):
    folder = tmp_path / "calcs"
    folder.mkdir()
    w = make_window()  # an untitled section
    suggested = []
    monkeypatch.setattr(dialogs, "ask_save_path", lambda parent, s="": suggested.append(s)
                        or str(folder / "a.section.json"))
    assert w.save()
    # another window, later: Save As of an untitled section starts there too
    w2 = make_window(template_case("open_tank"))
    assert w2.save_as()
    from pathlib import Path
    assert Path(suggested[1]).parent == folder
    assert Path(suggested[1]).name.endswith(".section.json")
    # Open starts there as well
    folders = []
    monkeypatch.setattr(dialogs, "ask_open_path", lambda parent, f="": folders.append(f))
    w2.doc.load(template_case(), None)
    w2.open_dialog()
    assert folders == [str(folder)]


def test_draw_key_enter_asks_too(opened, answers, qtbot, settle):
    w, path, _ = opened
    asked, replies = answers
    replies.append("discard")
    w.actions_by_name["draw"].trigger()
    for x, z in ((0.0, 0.0), (3.0, 0.0), (3.0, 2.0)):
        w.canvas.add_drawn_point(x, z)
    qtbot.keyClick(w.canvas, Qt.Key_Return)
    settle(w)
    assert asked == ["sump.section.json"] and w.doc.path is None
    assert w.doc.section.n_edges == 3


def test_an_invalid_drawn_outline_is_an_untitled_section_to_fix(opened, answers, settle):
    w, path, _ = opened
    asked, replies = answers
    replies.append("discard")
    before = w.doc.case
    w.actions_by_name["draw"].trigger()
    for x, z in ((0.0, 0.0), (2.0, 2.0), (2.0, 0.0), (0.0, 2.0)):  # crosses itself
        w.canvas.add_drawn_point(x, z)
    assert not w.canvas.finish_drawing()
    settle(w)
    assert w.doc.draft is not None and w.doc.case is before
    assert w.doc.path is None and title_names_untitled(w, "sump.section.json")
    w.undo()  # drops the invalid outline
    w.undo()  # back to the file
    assert w.doc.draft is None and w.doc.path == str(path) and w.doc.case is before


def test_exports_start_beside_the_file_else_in_the_last_folder(opened, monkeypatch, tmp_path,
                                                               template_case):
    w, path, _ = opened
    suggested = []
    monkeypatch.setattr(dialogs, "ask_export_path", lambda parent, s="": suggested.append(s))
    monkeypatch.setattr(dialogs, "ask_export_file",
                        lambda parent, title, s, *a: suggested.append(s))
    w.actions_by_name["export"].trigger()
    w.actions_by_name["export_svg"].trigger()
    from pathlib import Path
    assert [Path(s).parent for s in suggested] == [path.parent] * 2
    assert Path(suggested[0]).name == "sump.png"
    w.doc.load(template_case(), None)  # untitled: the folder last used (the file's)
    suggested.clear()
    w.actions_by_name["export"].trigger()
    w.actions_by_name["export_svg"].trigger()
    assert [Path(s).parent for s in suggested] == [path.parent] * 2
