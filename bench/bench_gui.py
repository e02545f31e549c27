"""Benchmark (not a test): time from one fill-slider step to a finished
repaint of the main window, offscreen, at 100, 2,000 and 10,000 vertices.

    QT_QPA_PLATFORM=offscreen python bench/bench_gui.py

Targets: at most 16 ms at 2,000 vertices (60 frames per second) and at most
40 ms at 10,000. Prints the median and 90th percentile of each, timed two
ways: the event loop as in use (the coalescing timers fire, then the
widgets that changed repaint), and, as an upper bound, forcing a
synchronous repaint of the whole window after every step.
"""

import os
import sys
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

import numpy as np  # noqa: E402
from PySide6.QtCore import QSettings  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

from app import dialogs  # noqa: E402
from app.main_window import MainWindow  # noqa: E402
from core.case import Case  # noqa: E402
from core.section import Section  # noqa: E402

TARGETS = {2000: 16.0, 10000: 40.0}


def bowl(n):
    """An open bowl of ``n`` vertices: a wavy half-round bottom (floor in
    the middle, walls either side) under an open top, 4 m wide."""
    k = n - 2
    t = np.linspace(np.pi, 2 * np.pi, k)
    r = 2.0 + 0.05 * np.sin(40 * t)
    x = 2.0 + r * np.cos(t)
    z = 2.0 + 1.5 * np.sin(t)
    pts = np.column_stack([x, z])
    pts = np.vstack([pts, [[4.0, 3.5], [0.0, 3.5]]])
    parts = ["floor" if abs(x[i] - 2.0) < 0.8 else "wall" for i in range(k - 1)]
    parts += ["wall", "open", "wall"]
    return Section.build(pts, parts=parts, name=f"bowl of {n} vertices")


def _drain(app, w):
    """Turn the event loop until the coalescing timers have fired and the
    updates they caused are painted."""
    for _ in range(10):
        app.processEvents()
        if not (w.doc._timer.isActive() or w.canvas._redraw_timer.isActive()):
            app.processEvents()  # the paint events the redraw posted
            return


def run(n, steps=60, forced=False):
    section = bowl(n)
    case = Case.default(section, 3.0)
    settings = QSettings(os.devnull, QSettings.IniFormat)
    w = MainWindow(case, None, settings=settings, saved=True)
    w.resize(1500, 940)
    w.show()
    app = QApplication.instance()
    for _ in range(3):
        app.processEvents()
    w.doc.flush()
    w.canvas.redraw()
    w.repaint()
    slider = w.fill_panel.slider
    times = []
    values = np.linspace(200, 980, steps).astype(int)
    for v in values:
        t0 = time.perf_counter()
        slider.setValue(int(v))
        if forced:
            w.doc.flush()  # what the coalescing timers run: solve, then redraw
            w.canvas.redraw()
            w.repaint()  # the whole window, synchronously
        _drain(app, w)
        times.append((time.perf_counter() - t0) * 1e3)
    dialogs.ask_save_changes = lambda parent, name: "discard"
    w.close()
    w.deleteLater()
    app.processEvents()
    return np.median(times), np.percentile(times, 90)


def main():
    QApplication.instance() or QApplication([])
    print("slider step to finished repaint, offscreen, 1500 x 940 window "
          "(median / 90th percentile)")
    ok = True
    for n in (100, 2000, 10000):
        med, p90 = run(n)
        fmed, fp90 = run(n, forced=True)
        target = TARGETS.get(n)
        verdict = "" if target is None else (
            f"  target <= {target:.0f} ms: {'met' if med <= target else 'MISSED'}")
        ok = ok and (target is None or med <= target)
        print(f"{n:>6} vertices: {med:6.1f} ms / {p90:6.1f} ms{verdict}")
        print(f"{'':>6}  forcing a repaint of the whole window: {fmed:6.1f} ms / {fp90:6.1f} ms")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
