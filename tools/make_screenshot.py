"""Render the main window offscreen on the sump sample and save
``resources/screenshot.png`` (the README's picture).

    python tools/make_screenshot.py [OUT.png]
"""

import os
import sys
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
ROOT = Path(__file__).resolve().parents[1]

from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication


def main(argv=None):
    argv = sys.argv[1:] if argv is None else argv
    out = Path(argv[0]) if argv else ROOT / "resources" / "screenshot.png"
    app = QApplication.instance() or QApplication([])
    from wetline.app.model import editing
    from wetline.app.window.launch import default_case
    from wetline.app.window.main_window import MainWindow
    from wetline.core.liquids import seawater

    case, _ = default_case()
    window = MainWindow(case, None, settings=QSettings(os.devnull, QSettings.IniFormat),
                        saved=True)
    window.resize(1600, 1000)
    window.show()
    editing.set_liquid(window.doc, seawater(10.0, 35.0))
    window.doc.select_edge(2)
    for _ in range(5):
        app.processEvents()
    window.doc.flush()
    window.canvas.redraw()
    window.canvas.fit()
    window.tabs.setCurrentIndex(1)
    app.processEvents()
    out.parent.mkdir(parents=True, exist_ok=True)
    if not window.grab().save(str(out)):
        print(f"could not write {out}", file=sys.stderr)
        return 1
    window.doc.load(window.doc.case, None, saved=True)
    window.close()
    print(f"wrote {out}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
