"""Start the desktop program: :func:`launch` and the error hook."""

from __future__ import annotations

import os
import sys
import traceback
from pathlib import Path

__all__ = ["launch", "excepthook", "default_case", "SAMPLE"]

SAMPLE = Path(__file__).resolve().parent.parent / "sample_sections" / "sump_with_lid.section.json"
"""The bundled section the program opens on when given no file."""


def default_case():
    """(case, path): the bundled sump sample if present, else the sump
    template (with no path)."""
    from core.case import Case
    from core.section_file import read_section_file
    from core.templates import TEMPLATES

    if SAMPLE.is_file():
        try:
            return read_section_file(SAMPLE), str(SAMPLE)
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
        from . import dialogs

        dialogs.show_error(None, "Unexpected error",
                           f"{exc_type.__name__}: {exc}\n\nYour work is still open; save it "
                           "under a new name if in doubt.\n\n" + text[-2000:])
    except Exception:  # pragma: no cover - never raise from the hook
        pass


def launch(path=None):
    """Open the main window on ``path`` (or the bundled sample) and run the
    event loop; return the exit status.

    A ``path`` given opens with that file as the document's file (an
    absolute path, so Save writes there whatever the working directory
    later is); if it cannot be read, the window says why and shows the
    bundled sample instead."""
    from PySide6.QtWidgets import QApplication

    from . import dialogs
    from .main_window import MainWindow

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setApplicationName("Wetline")
    app.setOrganizationName("Wetline")
    sys.excepthook = excepthook
    case, _sample_path = default_case()
    # The sample opens without its path, so Save asks where (the bundled
    # file is never overwritten by accident).
    window = MainWindow(case, None, saved=True)
    if path is not None:
        path = os.path.abspath(os.fspath(path))
        if not window.open_path(path, ask=False):
            dialogs.show_error(window, "Wetline", f"Started on the bundled sample instead of {path}.")
    window.show()
    return app.exec()
