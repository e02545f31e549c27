"""Benchmark (not a test): time from one fill-slider step, and from one
step of a vertex drag, to a finished repaint of the main window, offscreen,
at 100, 2,000 and 10,000 vertices.

    QT_QPA_PLATFORM=offscreen python bench/bench_gui.py

Targets for both: at most 16 ms at 2,000 vertices (60 frames per second)
and at most 40 ms at 10,000. Prints the median and 90th percentile of each,
timed two ways: the event loop as in use (the coalescing timers fire, then
the widgets that changed repaint), and, as an upper bound, forcing a
synchronous repaint of the whole window after every step.

A drag step is what a mouse move over a grabbed vertex handle does: the
handle's ``dragMoved`` signal, after which the document checks and solves
the dragged outline and the canvas, totals, tables and chart follow it (at
10,000 vertices the handles are hidden and the signal is sent directly:
the same path, timed).
"""

import os
import sys
import time

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import numpy as np
from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication

from wetline.app.window import dialogs
from wetline.app.window.main_window import MainWindow
from wetline.core.case import Case
from wetline.core.section import Section

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


def _window(n):
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
    return w, app


def _close(w, app):
    dialogs.ask_save_changes = lambda parent, name: "discard"
    w.close()
    w.deleteLater()
    app.processEvents()


def run(n, steps=60, forced=False):
    """Slider steps: (median, 90th percentile) [ms]."""
    w, app = _window(n)
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
    _close(w, app)
    return np.median(times), np.percentile(times, 90)


def run_drag(n, steps=60, forced=False):
    """Steps of one drag of a floor vertex (one undo step on release):
    (median, 90th percentile) [ms]."""
    w, app = _window(n)
    handles = w.canvas.handles
    i = (n - 2) // 2  # the bottom of the bowl
    x, z = w.doc.section.outline[i]
    handles.dragStarted.emit(i)
    _drain(app, w)
    times = []
    for k in range(steps):
        dz = -0.2 * np.sin(np.pi * (k + 1) / (steps + 1))  # down and back up
        t0 = time.perf_counter()
        handles.dragMoved.emit(i, float(x), float(z + dz))
        if forced:
            w.doc.flush()
            w.canvas.redraw()
            w.repaint()
        _drain(app, w)
        times.append((time.perf_counter() - t0) * 1e3)
    handles.dragFinished.emit(i, float(x), float(z - 0.01))
    _drain(app, w)
    assert w.doc.undo_stack.count() == 1, "a drag is one undo step"
    _close(w, app)
    return np.median(times), np.percentile(times, 90)


def main():
    QApplication.instance() or QApplication([])
    ok = True
    for title, fn in (("slider step", run), ("drag step", run_drag)):
        print(f"{title} to finished repaint, offscreen, 1500 x 940 window "
              "(median / 90th percentile)")
        for n in (100, 2000, 10000):
            med, p90 = fn(n)
            fmed, fp90 = fn(n, forced=True)
            target = TARGETS.get(n)
            verdict = "" if target is None else (
                f"  target <= {target:.0f} ms: {'met' if med <= target else 'MISSED'}")
            ok = ok and (target is None or med <= target)
            print(f"{n:>6} vertices: {med:6.1f} ms / {p90:6.1f} ms{verdict}")
            print(f"{'':>6}  forcing a repaint of the whole window: "
                  f"{fmed:6.1f} ms / {fp90:6.1f} ms")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
