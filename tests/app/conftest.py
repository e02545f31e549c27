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


def make_buried_wet_well(cases=True):
    """A buried wet well (invented: a pumping station's wet well): the
    cavity of the section format v3 example, 3 m wide and 4 m deep with a
    riser 2.2 m wide from a roof at 2.5 m, in 0.4 m base and 0.3 m wall and
    roof concrete (25 kN/m3, EN 1991-1-1 Table A.1), ground at the top (4 m,
    18 / 20 kN/m3 soil, common practice), and four cases: normal top water,
    overflow to the spill level, the water test (factor 1.0) and the empty
    well in flood groundwater up to the ground, with a load factor of 1.35 on
    the liquid cases (a partial factor of the governing code, invented here)."""
    from wetline.core.case import Case
    from wetline.core.liquids import fresh_water
    from wetline.core.load_cases import EMPTY, SPILL, Design, LoadCase
    from wetline.core.section import Section
    from wetline.core.structure import Ground, Groundwater, Structure, walls_of_thickness

    cavity = Section.build([[0, 0], [3, 0], [3, 2.5], [2.2, 2.5], [2.2, 4], [0, 4]],
                           parts=["floor", "wall", "roof", "riser", "open", "wall"],
                           name="Wet well, pumping station 3")
    outer = walls_of_thickness(cavity, base=0.4, wall=0.3, roof=0.3)
    structure = Structure.build(outer, cavity=cavity)
    case = Case(section=cavity, liquid=fresh_water(10.0), fill_level=3.2)
    load_cases = (
        LoadCase("normal top water", load_factor=1.35),
        LoadCase("overflow", fill_level=SPILL, load_factor=1.35),
        LoadCase("water test", fill_level=SPILL),
        LoadCase("empty, flood groundwater", fill_level=EMPTY, groundwater=Groundwater(4.0)),
    ) if cases else ()
    return Design(case, structure=structure, ground=Ground(4.0), cases=load_cases)


@pytest.fixture
def buried_wet_well():
    """Factory: :func:`make_buried_wet_well` (``cases=False``: no cases)."""
    return make_buried_wet_well
