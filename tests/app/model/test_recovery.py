"""Recovery copies: written, listed, restored and removed, in a temporary
data folder; the autosaver's timing and clean-up."""

import json
from datetime import UTC, datetime, timedelta

import pytest

from wetline.app.model import editing, recovery
from wetline.app.model.document import Document
from wetline.core.section_file import SectionFileError, read_section_file
from wetline.core.uplift import PartResistance


def test_write_list_read_remove(tmp_path, template_case):
    folder = tmp_path / "recovery"
    case = template_case(level=1.25)
    when = datetime(2026, 3, 1, 9, 30, tzinfo=UTC)
    copy = recovery.write_copy(folder, "a1", case, "sump.section.json",
                               "/jobs/sump.section.json", saved_at=when)
    assert copy.section_path == folder / "a1.section.json"
    # The copy is a normal section file: it opens like any other.
    assert read_section_file(copy.section_path) == case
    sidecar = json.loads(copy.sidecar_path.read_text())
    assert sidecar == {"format": "wetline-recovery", "version": 1,
                       "name": "sump.section.json", "saved_at": when.isoformat(),
                       "original_path": "/jobs/sump.section.json"}
    (found,) = recovery.list_copies(folder)  # no program holds it: an orphan
    assert found == copy
    assert "sump.section.json" in found.describe()
    assert "/jobs/sump.section.json" in found.describe()
    assert recovery.read_copy(found).case == case
    recovery.remove_copy(folder, "a1")
    assert recovery.list_copies(folder) == []
    assert list(folder.iterdir()) == []
    recovery.remove_copy(folder, "a1")  # already gone: nothing happens


def test_list_is_newest_first_and_an_untitled_copy_has_no_path(tmp_path, template_case):
    folder = tmp_path / "recovery"
    t0 = datetime(2026, 3, 1, 9, 0, tzinfo=UTC)
    recovery.write_copy(folder, "old", template_case(), "a", None, saved_at=t0)
    recovery.write_copy(folder, "new", template_case("open_tank"), "b", None,
                        saved_at=t0 + timedelta(minutes=5))
    copies = recovery.list_copies(folder)
    assert [c.id for c in copies] == ["new", "old"]
    assert copies[0].original_path is None and "never saved" in copies[0].describe()


def test_a_copy_without_a_readable_sidecar_is_still_offered(tmp_path, template_case):
    folder = tmp_path / "recovery"
    copy = recovery.write_copy(folder, "x", template_case(), "a", None)
    copy.sidecar_path.write_text("{not json")
    (found,) = recovery.list_copies(folder)
    assert found.id == "x" and found.original_path is None
    assert recovery.read_copy(found).case == template_case()
    copy.sidecar_path.unlink()
    assert [c.id for c in recovery.list_copies(folder)] == ["x"]


def test_a_damaged_copy_says_why(tmp_path, template_case):
    folder = tmp_path / "recovery"
    copy = recovery.write_copy(folder, "x", template_case(), "a", None)
    copy.section_path.write_text("{")
    with pytest.raises(SectionFileError, match="x.section.json"):
        recovery.read_copy(copy)


def test_missing_folder_lists_nothing(tmp_path):
    assert recovery.list_copies(tmp_path / "none") == []


def test_resistances_of_parts_not_in_the_outline_are_not_written(tmp_path, template_case):
    case = template_case().with_resistance("lid", PartResistance(self_weight=1000.0))
    case = case.with_resistance("gone", PartResistance(self_weight=5.0))
    copy = recovery.write_copy(tmp_path, "r", case, "a", None)
    read = recovery.read_copy(copy).case
    assert read.resistance_map == {"lid": PartResistance(self_weight=1000.0)}
    assert recovery.case_to_save(case) == read


# -------------------------------------------------------------- autosaver
@pytest.fixture
def doc(template_case):
    return Document(template_case(), "/jobs/sump.section.json", saved=True)


def test_autosaver_writes_soon_after_the_first_edit_and_cleans_up(doc, tmp_path, qtbot):
    folder = tmp_path / "recovery"
    saver = recovery.Autosaver(doc, folder, interval_s=60, first_delay_s=0.05)
    assert saver.copy is None  # nothing to keep yet
    with qtbot.waitSignal(saver.written, timeout=5000) as got:
        editing.fill_to_level(doc, 1.0)
    copy = got.args[0]
    assert copy is saver.copy and not saver.pending
    assert recovery.read_copy(copy).case == doc.case
    assert copy.original_path == "/jobs/sump.section.json"
    assert copy.name == "sump.section.json"
    # This program holds the copy: another start would not offer it.
    assert recovery.list_copies(folder) == []
    # The next edit waits for the interval (60 s), not the first delay.
    editing.fill_to_level(doc, 1.1)
    assert saver.pending
    assert saver._timer.isActive() and saver._timer.remainingTime() > 50_000
    # A clean save removes the copy.
    doc.mark_saved("/jobs/sump.section.json")
    assert saver.copy is None and not saver.pending and not copy.section_path.exists()
    saver.close()
    assert list(folder.iterdir()) == []  # the lock is released too


def test_undo_back_to_the_saved_state_removes_the_copy(doc, tmp_path):
    saver = recovery.Autosaver(doc, tmp_path, first_delay_s=60)
    editing.fill_to_level(doc, 1.0)
    copy = saver.write_now()
    assert copy.section_path.exists()
    doc.undo_stack.undo()
    assert not doc.is_modified and not copy.section_path.exists()


def test_interval_zero_is_off_and_removes_the_copy(doc, tmp_path, qtbot):
    saver = recovery.Autosaver(doc, tmp_path, interval_s=0, first_delay_s=0.01)
    editing.fill_to_level(doc, 1.0)
    assert not saver._timer.isActive()
    qtbot.wait(50)
    assert saver.copy is None
    saver.set_interval(30)  # on again: the pending change is copied soon
    with qtbot.waitSignal(saver.written, timeout=5000):
        pass
    path = saver.copy.section_path
    saver.set_interval(0)
    assert not path.exists()


def test_a_write_that_fails_is_reported_and_retried(doc, tmp_path, qtbot):
    blocker = tmp_path / "recovery"
    blocker.write_text("a file where the folder should be")
    saver = recovery.Autosaver(doc, blocker, interval_s=60, first_delay_s=0.01)
    with qtbot.waitSignal(saver.failed, timeout=5000) as got:
        editing.fill_to_level(doc, 1.0)
    assert got.args[0].startswith("Recovery copy not written:")
    assert saver.pending and saver._timer.isActive()  # tried again an interval later


def test_an_untitled_document_is_named_by_its_section(template_case, tmp_path):
    doc = Document(template_case(), None, saved=False)
    saver = recovery.Autosaver(doc, tmp_path, first_delay_s=60)
    assert saver.pending  # modified from the start
    copy = saver.write_now()
    assert copy.original_path is None and copy.name == doc.section.name
