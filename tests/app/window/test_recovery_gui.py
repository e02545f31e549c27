"""Autosave and recovery through the main window: copies while edited,
none once saved or given up, the offer at start (restore, discard, later)
and the interval set in Edit > Preferences."""

import shutil
from datetime import UTC, datetime, timedelta

import numpy as np
import pytest

from wetline.app.model import editing, recovery
from wetline.app.window import dialogs
from wetline.core.section_file import read_section_file


@pytest.fixture
def fast(settings):
    """Autosave every second (the first copy a second after the first edit)."""
    settings.setValue("autosave_interval_s", 1)
    return settings


@pytest.fixture
def sump_file(tmp_path, sample):
    path = tmp_path / "job" / "sump.section.json"
    path.parent.mkdir()
    shutil.copy(sample("sump_with_lid"), path)
    return path


def copies_in(folder):
    return sorted(p.name for p in folder.glob("*.section.json")) if folder.is_dir() else []


def test_an_edited_document_gets_a_copy_and_a_save_removes_it(make_window, fast, sump_file,
                                                              recovery_folder, qtbot):
    w = make_window(recovery_folder=recovery_folder)
    assert w.open_path(str(sump_file), ask=False)
    assert copies_in(recovery_folder) == []
    editing.fill_to_level(w.doc, 1.25)
    qtbot.waitUntil(lambda: w.autosaver.copy is not None, timeout=5000)
    copy = w.autosaver.copy
    assert copy.section_path.parent == recovery_folder  # not beside the user's file
    assert copies_in(sump_file.parent) == ["sump.section.json"]
    assert read_section_file(copy.section_path).fill_level == 1.25
    assert copy.original_path == str(sump_file) and copy.name == "sump.section.json"
    assert w.save()
    assert copies_in(recovery_folder) == []


def test_closing_without_saving_removes_the_copy(make_window, fast, sump_file, recovery_folder,
                                                 qtbot, monkeypatch):
    w = make_window(recovery_folder=recovery_folder)
    assert w.open_path(str(sump_file), ask=False)
    editing.fill_to_level(w.doc, 1.25)
    qtbot.waitUntil(lambda: w.autosaver.copy is not None, timeout=5000)
    monkeypatch.setattr(dialogs, "ask_save_changes", lambda parent, name: "cancel")
    assert not w.close()  # cancelled: the copy stays while the work is open
    assert len(copies_in(recovery_folder)) == 1
    monkeypatch.setattr(dialogs, "ask_save_changes", lambda parent, name: "discard")
    assert w.close()
    assert list(recovery_folder.iterdir()) == []  # copy and lock gone
    assert read_section_file(sump_file).fill_level == 2.2  # the file as it was


def left_by_a_crash(folder, case, original, minutes_ago=3, copy_id="crashed"):
    when = datetime.now(UTC) - timedelta(minutes=minutes_ago)
    return recovery.write_copy(folder, copy_id, case, "sump.section.json", original,
                               saved_at=when)


def test_restore_opens_the_copy_modified_with_its_file(make_window, sump_file, recovery_folder,
                                                       monkeypatch, settle):
    edited = read_section_file(sump_file).with_level(1.75)
    old = left_by_a_crash(recovery_folder, edited, str(sump_file))
    offered = []
    monkeypatch.setattr(dialogs, "ask_recovery",
                        lambda parent, copies: offered.append(copies) or ("restore", 0))
    w = make_window(recovery_folder=recovery_folder)
    assert w.offer_recovery()
    settle(w)
    assert [c.id for c in offered[0]] == ["crashed"]
    assert w.doc.case == edited and w.doc.is_modified and w.isWindowModified()
    assert w.doc.path == str(sump_file)
    assert w.windowTitle().startswith("sump.section.json")
    # This program's own copy replaces the old one at once.
    assert not old.section_path.exists()
    assert w.autosaver.copy is not None and w.autosaver.copy.section_path.exists()
    assert recovery.list_copies(recovery_folder) == []  # held by this program
    # Save writes the original file.
    assert w.save()
    assert read_section_file(sump_file) == edited
    assert copies_in(recovery_folder) == []


def test_discard_deletes_and_later_keeps(make_window, sump_file, recovery_folder, monkeypatch,
                                         template_case):
    left_by_a_crash(recovery_folder, template_case(level=1.0), str(sump_file), 10, "older")
    left_by_a_crash(recovery_folder, template_case(level=1.5), None, 1, "newer")
    answers = [("discard", 1), ("later", None)]
    offered = []
    monkeypatch.setattr(dialogs, "ask_recovery", lambda parent, copies: offered.append(
        [c.id for c in copies]) or answers.pop(0))
    w = make_window(recovery_folder=recovery_folder)
    before = w.doc.case
    assert not w.offer_recovery()
    assert offered == [["newer", "older"], ["newer"]]
    assert w.doc.case is before
    assert [c.id for c in recovery.list_copies(recovery_folder)] == ["newer"]


def test_preferences_set_interval_and_undo_steps_and_zero_is_off(make_window, settings,
                                                            recovery_folder, monkeypatch, qtbot):
    w = make_window(recovery_folder=recovery_folder)
    assert w.autosaver.interval_s == recovery.DEFAULT_INTERVAL_S
    asked = []
    monkeypatch.setattr(dialogs, "ask_preferences", lambda parent, values: asked.append(
        values) or {"autosave_interval_s": 1, "undo_limit": 200})
    w.actions_by_name["preferences"].trigger()
    assert asked == [{"autosave_interval_s": recovery.DEFAULT_INTERVAL_S, "undo_limit": 1000}]
    assert int(settings.value("autosave_interval_s")) == 1 and w.autosaver.interval_s == 1
    assert int(settings.value("undo_limit")) == 200
    assert w.doc.undo_stack.undoLimit() == 200  # nothing to undo yet: at once
    editing.fill_to_level(w.doc, 1.0)
    qtbot.waitUntil(lambda: w.autosaver.copy is not None, timeout=5000)
    monkeypatch.setattr(dialogs, "ask_preferences", lambda parent, values: {
        "autosave_interval_s": 0, "undo_limit": 300})
    w.edit_preferences()
    assert w.autosaver.interval_s == 0 and copies_in(recovery_folder) == []
    assert w.doc.undo_stack.undoLimit() == 200 and w.doc.undo_limit == 300  # history kept
    # a later window starts with the stored limit
    assert make_window().doc.undo_stack.undoLimit() == 300
    assert "Pre&ferences..." in [a.text() for a in w.menuBar().actions()[1].menu().actions()]


def test_the_offer_lists_name_time_and_file_and_answers(qtbot, recovery_folder, template_case):
    from wetline.app.window.recovery_dialog import RecoveryDialog

    a = left_by_a_crash(recovery_folder, template_case(), "/jobs/a.section.json", 1, "a")
    b = left_by_a_crash(recovery_folder, template_case(), None, 9, "b")
    for button, answer in (("restore_button", ("restore", 1)),
                           ("discard_button", ("discard", 1)), ("later_button", ("later", None))):
        dlg = RecoveryDialog([a, b])
        qtbot.addWidget(dlg)
        lines = [dlg.list.item(i).text() for i in range(dlg.list.count())]
        assert lines == [a.describe(), b.describe()]
        assert "/jobs/a.section.json" in lines[0] and "never saved" in lines[1]
        assert a.saved_at.astimezone().strftime("%Y-%m-%d %H:%M") in lines[0]
        dlg.list.setCurrentRow(1)
        getattr(dlg, button).click()
        assert dlg.answer == answer


def test_the_preferences_dialog_edits_interval_and_undo_steps(qtbot):
    from wetline.app.window.preferences_dialog import PreferencesDialog

    dlg = PreferencesDialog({"autosave_interval_s": 60, "undo_limit": 1000})
    qtbot.addWidget(dlg)
    assert dlg.values() == {"autosave_interval_s": 60, "undo_limit": 1000}
    dlg.autosave.setValue(0)
    dlg.undo_limit.setValue(5)  # below the fewest offered
    assert dlg.autosave.text() == "off"
    assert dlg.values() == {"autosave_interval_s": 0, "undo_limit": 10}


def test_a_restored_copy_is_fitted_in_the_view(make_window, sump_file, recovery_folder,
                                               monkeypatch, settle, sample, qtbot):
    """The view fits the restored section as it fits a file opened. It took
    in the diagram of the file the window had opened as well (the canvas
    redrew the new outline before its results came, and fitted then), the
    restored floor's diagram cut off below the view; seen restoring a copy
    at start under Xvfb. The event loop runs as it does there (no flush)."""
    case = read_section_file(sump_file)
    low = case.with_section(case.section.replace(outline=case.section.outline + [0.0, -10.0]))
    left_by_a_crash(recovery_folder, low, str(sump_file))
    monkeypatch.setattr(dialogs, "ask_recovery", lambda parent, copies: ("restore", 0))
    w = make_window(read_section_file(sample("chamber_with_lip")),
                    recovery_folder=recovery_folder)
    settle(w)
    assert w.offer_recovery()
    qtbot.wait(300)  # the coalescing timers fire in their own order
    (x0, x1), (z0, z1) = w.canvas.getPlotItem().getViewBox().viewRange()
    outline = w.doc.section.outline
    assert x0 <= outline[:, 0].min() and outline[:, 0].max() <= x1
    assert z0 <= outline[:, 1].min() and outline[:, 1].max() <= z1
    # Fitted to it alone: not reaching up to the chamber (z 0 to 4) as well.
    assert z1 < 0.0 and z1 - z0 < 3.0 * np.ptp(outline[:, 1])
