"""Start the desktop program: :func:`launch` and the error hook."""

from __future__ import annotations

import os
import sys
import traceback
from pathlib import Path

__all__ = ["launch", "open_main_window", "excepthook", "default_case", "bundled_sample"]

SAMPLE_NAME = "sump_with_lid.section.json"
"""The bundled section the program opens on when given no file."""


def bundled_sample() -> Path:
    """Path of the bundled sample the program opens on (``wetline.samples``,
    the repository's ``sample_sections/``)."""
    from importlib import resources

    return Path(str(resources.files("wetline.samples") / SAMPLE_NAME))


def default_case():
    """(case, path): the bundled sump sample if present, else the sump
    template (with no path)."""
    from wetline.core.case import Case
    from wetline.core.section_file import read_section_file
    from wetline.core.templates import TEMPLATES

    sample = bundled_sample()
    if sample.is_file():
        try:
            return read_section_file(sample), str(sample)
        except ValueError:
            pass
    t = TEMPLATES["sump_with_lid"]
    section = t.build()
    return Case.default(section, t.default_level(section)), None


def excepthook(exc_type, exc, tb):
    """Show an unexpected error in a dialog instead of ending the program
    (the work stays open; the details go to stderr too)."""
    text = "".join(traceback.format_exception(exc_type, exc, tb))
    sys.stderr.write(text)
    try:
        from wetline.app.window import dialogs

        dialogs.show_error(None, "Unexpected error",
                           f"{exc_type.__name__}: {exc}\n\nYour work is still open; save it "
                           "under a new name if in doubt.\n\n" + text[-2000:])
    except Exception:  # pragma: no cover - never raise from the hook
        pass


def open_main_window(path=None):
    """(app, window): the application and the main window on ``path`` (or
    the bundled sample), built but not yet shown.

    The document is read before Qt is imported: PySide6 hooks every import
    that follows its own (it reads each module's source to look for its
    feature switches), so numpy, shapely and the core load faster first.
    A ``path`` given opens with that file as the document's file (an
    absolute path, so Save writes there whatever the working directory
    later is); if it cannot be read, the window says why and shows the
    bundled sample instead."""
    # The sample opens without its path, so Save asks where (the bundled
    # file is never overwritten by accident).
    case, _sample_path = default_case()

    from PySide6.QtWidgets import QApplication

    from wetline.app.model import recovery
    from wetline.app.window import dialogs
    from wetline.app.window.main_window import MainWindow

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("Wetline")
    app.setOrganizationName("Wetline")
    window = MainWindow(case, None, saved=True, recovery_folder=recovery.default_folder())
    if path is not None:
        path = os.path.abspath(os.fspath(path))
        if not window.open_path(path, ask=False):
            dialogs.show_error(window, "Wetline",
                               f"Started on the bundled sample instead of {path}.")
    return app, window


def launch(path=None):
    """Open the main window on ``path`` (or the bundled sample, see
    :func:`open_main_window`) and run the event loop; return the exit
    status. Recovery copies left by a crash are offered once the window
    shows (:mod:`wetline.app.model.recovery`)."""
    sys.excepthook = excepthook
    app, window = open_main_window(path)
    window.show()
    window.offer_recovery()
    return app.exec()
