"""Starting the desktop program: the README's first command opens that file
with its path; bare ``wetline`` opens the bundled sample without one."""

import os
import sys

import pytest
from PySide6.QtWidgets import QApplication

from wetline.core.section_file import read_section_file


@pytest.fixture
def started(qtbot, monkeypatch, no_dialogs):
    """Run ``python -m app ARGS`` (its main) without entering the event
    loop; return the main window it opened."""
    from wetline import __main__ as entry

    monkeypatch.setattr(sys, "excepthook", sys.excepthook)  # launch installs its own
    windows = []

    def fake_exec(*_args):
        windows.extend(w for w in QApplication.topLevelWidgets()
                       if w.__class__.__name__ == "MainWindow" and w.isVisible())
        return 0

    monkeypatch.setattr(QApplication, "exec", fake_exec)

    def start(*args):
        before = list(QApplication.topLevelWidgets())
        assert entry.main(list(args)) == 0
        new = [w for w in windows if not any(w is b for b in before)]
        assert len(new) == 1
        w = new[0]
        qtbot.addWidget(w)
        w.doc.flush()
        return w

    return start


def test_readme_first_command_opens_that_file_with_its_path(started, monkeypatch, sample,
                                                            repo_root):
    monkeypatch.chdir(repo_root)
    relative = "sample_sections/sump_with_lid.section.json"  # as in the README
    w = started(relative)
    assert w.doc.path == os.path.abspath(relative) == str(sample("sump_with_lid"))
    assert w.doc.case == read_section_file(relative)
    assert not w.doc.is_modified and w.doc.undo_stack.count() == 0
    assert w.windowTitle().startswith("sump_with_lid.section.json")
    assert w.windowFilePath() == w.doc.path
    # Save writes back to that file, wherever the working directory is now.
    monkeypatch.chdir(repo_root / "tests")
    assert os.path.isfile(w.doc.path)


def test_another_file_is_opened_not_the_sample(started, tmp_path, monkeypatch, sample):
    import shutil

    target = tmp_path / "mine.section.json"
    shutil.copy(sample("cone_hopper"), target)
    monkeypatch.chdir(tmp_path)
    w = started("mine.section.json")
    assert w.doc.path == str(target)
    assert w.doc.section.is_axisymmetric
    assert w.windowTitle().startswith("mine.section.json")


def test_bare_start_opens_the_sample_without_a_path(started, sample):
    w = started()
    assert w.doc.path is None
    assert w.doc.case == read_section_file(sample("sump_with_lid"))
    assert not w.doc.is_modified


def test_unreadable_file_says_why_and_shows_the_sample(started, tmp_path, no_dialogs):
    w = started(str(tmp_path / "missing.section.json"))
    assert w.doc.path is None
    assert any("missing.section.json" in text for _, text in no_dialogs)
