"""Shared fixtures of the desktop program's tests (pytest-qt, offscreen)."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import pytest


@pytest.fixture
def settings(tmp_path):
    from PySide6.QtCore import QSettings

    return QSettings(str(tmp_path / "wetline-test.ini"), QSettings.IniFormat)


@pytest.fixture
def no_dialogs(monkeypatch):
    """Replace every modal dialog; records what would have been shown."""
    from wetline.app.window import dialogs

    shown = []
    monkeypatch.setattr(dialogs, "show_error", lambda parent, title, text: shown.append(
        (title, text)))
    monkeypatch.setattr(dialogs, "ask_save_changes", lambda parent, name: "discard")
    return shown


@pytest.fixture(autouse=True)
def recovery_folder(tmp_path, monkeypatch):
    """The program's recovery folder, in the test's own tmp_path: nothing a
    test runs reads or writes the user's application data."""
    from wetline.app.model import recovery

    folder = tmp_path / "app-data" / "recovery"
    monkeypatch.setattr(recovery, "default_folder", lambda: folder)
    return folder


@pytest.fixture
def make_window(qtbot, settings, no_dialogs, template_case):
    """Factory: a shown main window on a case (default: the sump template);
    ``recovery_folder`` turns autosave on into that folder."""
    from wetline.app.window.main_window import MainWindow

    def make(case=None, path=None, recovery_folder=None):
        w = MainWindow(case or template_case(), path, settings=settings,
                       recovery_folder=recovery_folder)
        qtbot.addWidget(w)
        w.show()
        qtbot.waitExposed(w)
        settle(w)
        return w

    return make


def settle(window):
    """Run pending recomputes and redraws now."""
    from PySide6.QtWidgets import QApplication

    window.doc.flush()
    window.canvas.redraw()
    QApplication.processEvents()


@pytest.fixture(name="settle")
def _settle_fixture():
    return settle


@pytest.fixture(autouse=True)
def _qt(qapp):
    """A QApplication from pytest-qt for every test of the program, so that no
    bare QGuiApplication is made first in a session that also builds widgets."""
    return qapp
