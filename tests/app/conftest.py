"""Shared fixtures of the desktop program's tests (pytest-qt, offscreen)."""

import os

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

from pathlib import Path  # noqa: E402

import pytest  # noqa: E402

ROOT = Path(__file__).resolve().parents[2]
SAMPLES = ROOT / "sample_sections"


def sample_paths():
    """Every bundled sample section file."""
    return sorted(SAMPLES.glob("*.section.json"))


def template_case(key="sump_with_lid"):
    """A case from a template at its default level."""
    from core.case import Case
    from core.templates import TEMPLATES

    t = TEMPLATES[key]
    s = t.build()
    return Case.default(s, t.default_level(s))


@pytest.fixture
def settings(tmp_path):
    from PySide6.QtCore import QSettings

    return QSettings(str(tmp_path / "wetline-test.ini"), QSettings.IniFormat)


@pytest.fixture
def no_dialogs(monkeypatch):
    """Replace every modal dialog; records what would have been shown."""
    from app import dialogs

    shown = []
    monkeypatch.setattr(dialogs, "show_error", lambda parent, title, text: shown.append(
        (title, text)))
    monkeypatch.setattr(dialogs, "ask_save_changes", lambda parent, name: "discard")
    return shown


@pytest.fixture
def make_window(qtbot, settings, no_dialogs):
    """Factory: a shown main window on a case (default: the sump template)."""
    from app.main_window import MainWindow

    def make(case=None, path=None):
        w = MainWindow(case or template_case(), path, settings=settings)
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


@pytest.fixture
def case_factory():
    return template_case


def pytest_generate_tests(metafunc):
    if "sample_path" in metafunc.fixturenames:
        paths = sample_paths()
        metafunc.parametrize("sample_path", paths, ids=[p.name.split(".")[0] for p in paths])
