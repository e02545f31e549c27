"""Benchmark (not a test): time from one fill-slider step, and from one
step of a vertex drag, to a finished repaint of the main window, offscreen,
1500 x 940 window, with a breakdown of where each step's time goes.

    QT_QPA_PLATFORM=offscreen python bench/bench_gui.py [--steps 60] [--only TEXT]
        [--forced] [--no-envelope]

Scenarios (issue 12): open bowls of 100, 2,000 and 10,000 vertices; the
buried wet well sample with its four load cases (the envelope follows the
release); the chamber with a downstand lip with its "riser half full, air
trapped under the roof" case active (pockets trapped: every step solves the
trapped air); the 100- and 2,000-vertex bowls in walls of a thickness, with
ground and 20 load cases of every kind.

Goals, median per step: at most 8 ms up to 100 vertices (the samples), 12 ms
at 2,000 and 30 ms at 10,000; the 90th percentile at most 1.5 x the median.
Printed per scenario: median, 90th percentile, their ratio, the goals met or
missed, and the time of the release (the work deferred to it: the full
level table, the envelope); then the breakdown per step, from the timers of
:mod:`wetline.app.model.step_timer` (off outside this script): solve and
cases (with the check of a dragged outline), envelope, level table, the edit
(the undo command applied), other views (totals, case list, flotation and
uplift panels, which listen to the document), label layout, the canvas's
layers, its paint, the chart's update and paint, the tables (models and
paint), and the rest (Qt's own event processing, the widgets not timed).

A slider step is the slider moved while held down (the envelope waits for
the release). A drag step is what a mouse move over a grabbed vertex handle
does: the handle's ``dragMoved`` signal, after which the document checks and
solves the dragged outline and the canvas, totals, tables and chart follow
it (at 10,000 vertices the handles are hidden and the signal is sent
directly: the same path, timed). ``--forced`` also times each step forcing a
synchronous repaint of the whole window (an upper bound).

After each scenario's timed steps, the same steps are done again untimed
with their paints logged (which widgets, which regions), and those repaints
are asked for once more with nothing changed or computed: "painting alone"
is printed beside the step's median, with the goal less it (what is left of
the goal for all the computing). It is a floor measured in the same run: no
change to the computing goes below it.

Then the envelope of 20 cases after an edit, in the document's own
recompute: after an edit of the active case (the other cases' results are
kept) and after an edit of the section (every case solved again), against
the budget of 8 ms at 2,000 vertices.

The machine may be shared: run the script more than once and compare.
"""

import argparse
import os
import sys
import time
from pathlib import Path

os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")

import numpy as np
from PySide6.QtCore import QEvent, QObject, QSettings
from PySide6.QtGui import QRegion
from PySide6.QtWidgets import QApplication

from wetline.app.model import editing, step_timer
from wetline.app.window import dialogs
from wetline.app.window.main_window import MainWindow
from wetline.core.case import Case
from wetline.core.liquids import custom_liquid
from wetline.core.load_cases import EMPTY, SPILL, Design, LoadCase
from wetline.core.section import Section
from wetline.core.section_file import read_design
from wetline.core.structure import Ground, Groundwater, Structure, walls_of_thickness

GOALS = ((100, 8.0), (2000, 12.0), (10000, 30.0))
"""(vertices up to, median per step [ms]): the goals of issue 12."""
STUTTER = 1.5
"""The 90th percentile may be at most this many times the median."""
ENVELOPE_TARGET = 8.0
"""Envelope of 20 cases at 2,000 vertices after an edit [ms]."""
SAMPLES = Path(__file__).resolve().parent.parent / "sample_sections"
PARTS = ("solve and cases", "envelope", "level table", "edit", "other views", "label layout",
         "canvas layers", "canvas paint", "chart update", "chart paint", "tables")
"""The breakdown's columns (step_timer names), then the rest."""
SHORT = ("solve", "envel", "table", "edit", "views", "label", "layers", "c.pnt", "chart",
         "ch.pnt", "tables", "rest")


def goal(n):
    """The median goal [ms] for a section of ``n`` vertices."""
    for up_to, ms in GOALS:
        if n <= up_to:
            return ms
    return GOALS[-1][1]


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
        if not (w.doc._timer.isActive() or w.canvas._redraw_timer.isActive()
                or w.canvas.labels._timer.isActive()):
            app.processEvents()  # the paint events the redraw posted
            return


def bowl_design(n, k=20):
    """The bowl of ``n`` vertices in walls of a thickness (0.3 m base,
    0.25 m walls), ground at its rim, and ``k`` load cases of every kind."""
    section = bowl(n)
    outline = walls_of_thickness(section, base=0.3, wall=0.25, roof=0.25)
    structure = Structure.build(outline, cavity=section)
    top = section.spill_level
    cases = []
    for i in range(k):
        kind = i % 5
        if kind == 0:
            cases.append(LoadCase(f"level {i}", fill_level=1.0 + 2.4 * i / k))
        elif kind == 1:
            cases.append(LoadCase(f"overflow {i}", fill_level=SPILL, load_factor=1.35))
        elif kind == 2:
            cases.append(LoadCase(f"empty, groundwater {i}", fill_level=EMPTY,
                                  groundwater=Groundwater(top * (0.4 + 0.6 * i / k))))
        elif kind == 3:
            cases.append(LoadCase(f"volume {i}", fill_volume=2.0 + 0.2 * i,
                                  groundwater=Groundwater(1.5), load_factor=1.2))
        else:
            cases.append(LoadCase(f"brine {i}", liquid=custom_liquid(1200.0, "brine"),
                                  groundwater=Groundwater(2.0 + 0.05 * i)))
    return Design(Case.default(section, 3.0), structure=structure, ground=Ground(top),
                  cases=tuple(cases))


_DESIGNS = {}


class Scenario:
    """A window's content to time: a title, how to make the design, which
    case is active, the vertex a drag moves and how far down [m]."""

    def __init__(self, title, make, active=0, vertex=None, depth=0.2):
        self.title, self.make, self.active = title, make, active
        self.vertex, self.depth = vertex, depth
        self._design = None

    @property
    def design(self):
        if self._design is None:
            self._design = self.make()
        return self._design

    @property
    def n(self):
        return self.design.section.n_edges


def scenarios():
    def sample(name):
        return lambda: read_design(SAMPLES / name)

    out = [Scenario(f"bowl, {n} vertices", lambda n=n: Case.default(bowl(n), 3.0),
                    vertex=(n - 2) // 2) for n in (100, 2000, 10000)]
    out.append(Scenario("buried wet well sample, 4 cases", sample("buried_wet_well.section.json"),
                        vertex=1, depth=0.1))
    out.append(Scenario("chamber with lip, air trapped", sample("chamber_with_lip.section.json"),
                        active=2, vertex=1, depth=0.1))
    out += [Scenario(f"bowl {n}, structure, 20 cases", lambda n=n: bowl_design(n),
                     vertex=(n - 2) // 2) for n in (100, 2000)]
    return out


def _window(design, active=0):
    settings = QSettings(os.devnull, QSettings.IniFormat)
    w = MainWindow(design, None, settings=settings, saved=True)
    w.resize(1500, 940)
    w.show()
    app = QApplication.instance()
    for _ in range(3):
        app.processEvents()
    if active:
        w.doc.select_case(active)
    w.doc.flush()
    w.canvas.redraw()
    w.repaint()
    _drain(app, w)
    return w, app


def _close(w, app):
    dialogs.ask_save_changes = lambda parent, name: "discard"
    w.close()
    w.deleteLater()
    app.processEvents()


class Timing:
    """Step times [ms], the breakdown per step [ms] and the release [ms]."""

    def __init__(self, times, parts, release, invalid=0, paint=(np.nan, np.nan)):
        self.paint = paint  # paint_only's (wall, CPU) medians [ms]
        self.times = np.asarray(times)
        self.cpu = np.asarray(_CPU[-len(times):])
        self.parts = parts
        self.release = release
        self.invalid = invalid

    @property
    def median(self):
        return float(np.median(self.times))

    @property
    def p90(self):
        return float(np.percentile(self.times, 90))

    def row(self):
        """The breakdown per step [ms] in the order of :data:`PARTS`, then the rest."""
        values = [1e3 * self.parts.get(k, 0.0) / len(self.times) for k in PARTS]
        total = float(np.mean(self.times))
        return values + [max(total - sum(values), 0.0)]


class PaintLog(QObject):
    """An application event filter that notes, step by step, which widgets
    were painted and where (so that :func:`paint_only` can ask for the same
    paints again with nothing changed)."""

    def __init__(self):
        super().__init__()
        self.steps = []

    def next_step(self):
        self.steps.append([])

    def eventFilter(self, obj, event):
        if self.steps and event.type() == QEvent.Type.Paint:
            self.steps[-1].append((obj, QRegion(event.region())))
        return False


def _paint_floor(app, w, acts):
    """The steps ``acts`` done again (untimed) with their paints logged,
    then :func:`paint_only` of them. The timed steps run without the log:
    an application event filter in Python would slow every event."""
    log = PaintLog()
    app.installEventFilter(log)
    try:
        for act in acts:
            _step(app, w, act, False, log)
    finally:
        app.removeEventFilter(log)
    return paint_only(app, log)


def paint_only(app, log):
    """Each logged step's paints asked for again, nothing changed or
    computed: the same widgets repaint the same regions (their content as
    the last step left it). Median wall and CPU time per step [ms]: the part
    of a step the painting itself sets, a floor under the step's time."""
    wall, cpu = [], []
    for paints in log.steps:
        c0 = time.process_time()
        t0 = time.perf_counter()
        for widget, region in paints:
            widget.update(region)
        app.processEvents()
        app.processEvents()
        wall.append((time.perf_counter() - t0) * 1e3)
        cpu.append((time.process_time() - c0) * 1e3)
    return float(np.median(wall)), float(np.median(cpu))


_CPU = []
"""CPU times of the steps of the last run [ms] (the wall time on a shared
machine includes waiting for a core; this process's CPU time does not)."""


def _step(app, w, act, forced, log=None):
    if log is not None:
        log.next_step()
    c0 = time.process_time()
    t0 = time.perf_counter()
    act()
    if forced:
        w.doc.flush()  # what the coalescing timers run: solve, then redraw
        w.canvas.redraw()
        w.repaint()  # the whole window, synchronously
    _drain(app, w)
    if log is None:  # a timed step
        _CPU.append((time.process_time() - c0) * 1e3)
    return (time.perf_counter() - t0) * 1e3


def run_slider(sc, steps=60, forced=False):
    """Slider steps while the slider is held down, then its release."""
    w, app = _window(sc.design, sc.active)
    slider = w.fill_panel.slider
    values = np.linspace(200, 980, steps).astype(int)
    slider.setSliderDown(True)  # a drag: the envelope waits for the release
    w.fill_panel._on_slider_pressed()
    step_timer.start()
    times = [_step(app, w, lambda v=v: slider.setValue(int(v)), forced) for v in values]
    parts = step_timer.take()
    step_timer.stop()
    paint = _paint_floor(app, w, [lambda v=v: slider.setValue(int(v)) for v in values])
    t0 = time.perf_counter()
    slider.setSliderDown(False)
    w.fill_panel._on_slider_released()
    _drain(app, w)
    release = (time.perf_counter() - t0) * 1e3
    assert w.doc.envelope_current, "the envelope follows the release"
    _close(w, app)
    return Timing(times, parts, release, paint=paint)


def run_drag(sc, steps=60, forced=False):
    """Steps of one drag of a vertex (one undo step on release)."""
    w, app = _window(sc.design, sc.active)
    handles = w.canvas.handles
    i = sc.vertex
    x, z = w.doc.section.outline[i]
    handles.dragStarted.emit(i)
    _drain(app, w)
    invalid = 0
    step_timer.start()
    times = []
    depths = -sc.depth * np.sin(np.pi * np.arange(1, steps + 1) / (steps + 1))  # down, back up
    moves = [lambda dz=float(dz): handles.dragMoved.emit(i, float(x), float(z + dz))
             for dz in depths]
    for move in moves:
        times.append(_step(app, w, move, forced))
        preview = w.doc.preview
        invalid += preview is None or preview.case is None
    parts = step_timer.take()
    step_timer.stop()
    paint = _paint_floor(app, w, moves)
    t0 = time.perf_counter()
    handles.dragFinished.emit(i, float(x), float(z - sc.depth))  # (on the snap grid)
    _drain(app, w)
    release = (time.perf_counter() - t0) * 1e3
    assert w.doc.undo_stack.count() == 1, "a drag is one undo step"
    assert w.doc.envelope_current, "the envelope follows the release"
    _close(w, app)
    return Timing(times, parts, release, invalid, paint)


def run_envelope(n, repeat=40):
    """The envelope after an edit, in the document's own recompute: (after
    an edit of the active case, after an edit of the section), medians
    [ms], and the same in CPU time."""
    w, app = _window(bowl_design(n))
    doc = w.doc
    results = []
    for kind in ("case", "section"):
        wall, cpu = [], []
        for k in range(repeat):
            doc.begin_live_edit()  # so that the flush below leaves the envelope
            if kind == "case":  # the active case's fill: the others' results are kept
                editing.fill_to_level(doc, 1.0 + 0.02 * (k % 7 + 1))
            else:  # the section's width: every case is solved again
                editing.set_width(doc, 1.0 + 0.01 * (k % 7 + 1))
            doc.flush()  # the active case's solve and table, as the edit's turn does
            assert not doc.envelope_current
            c0 = time.process_time()
            t0 = time.perf_counter()
            doc.envelope_cases, doc.envelope = doc._solver.envelope(doc.design)
            wall.append((time.perf_counter() - t0) * 1e3)
            cpu.append((time.process_time() - c0) * 1e3)
            doc._need_envelope = False
            doc.end_live_edit()
        results.append((float(np.median(wall)), float(np.median(cpu))))
    _close(w, app)
    return results


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--steps", type=int, default=60)
    ap.add_argument("--only", default="", help="scenarios whose title holds this text")
    ap.add_argument("--forced", action="store_true",
                    help="also time forcing a repaint of the whole window each step")
    ap.add_argument("--no-envelope", action="store_true", help="skip the envelope timing")
    args = ap.parse_args(argv)
    QApplication.instance() or QApplication([])
    print(f"offscreen, 1500 x 940 window, {args.steps} steps; {os.cpu_count()} cores, "
          f"load average {os.getloadavg()[0]:.1f}")
    ok = True
    chosen = [sc for sc in scenarios() if args.only in sc.title]
    rows = []
    for kind, fn in (("slider", run_slider), ("drag", run_drag)):
        print(f"{kind} step to finished repaint: median / 90th percentile (ratio), "
              "median CPU time, release; goals")
        for sc in chosen:
            t = fn(sc, args.steps)
            g = goal(sc.n)
            met = t.median <= g
            steady = t.p90 <= STUTTER * t.median
            ok = ok and met and steady
            note = f", {t.invalid} steps invalid" if t.invalid else ""
            print(f"  {sc.title:<34} {t.median:6.1f} / {t.p90:6.1f} ms ({t.p90 / t.median:4.2f})"
                  f"  CPU {float(np.median(t.cpu)):5.1f}  release {t.release:6.1f} ms;"
                  f"  <= {g:.0f} ms {'met' if met else 'MISSED'}"
                  f", p90 <= {STUTTER} x {'met' if steady else 'MISSED'}{note}")
            if args.forced:
                f = fn(sc, args.steps, forced=True)
                print(f"  {'':<34} forcing a repaint of the whole window: "
                      f"{f.median:6.1f} / {f.p90:6.1f} ms")
            rows.append((kind, sc, t))
    print("breakdown per step, mean [ms]:")
    print(f"  {'':<42}" + "".join(f"{h:>7}" for h in SHORT))
    for kind, sc, t in rows:
        print(f"  {kind:<7} {sc.title:<34}" + "".join(f"{v:7.2f}" for v in t.row()))
    print("painting alone: each step's repaints asked for again with nothing changed "
          "(median wall / CPU [ms]),\nthe step's median, and the goal less the painting "
          "(what is left for everything else)")
    for kind, sc, t in rows:
        pw, pc = t.paint
        g = goal(sc.n)
        print(f"  {kind:<7} {sc.title:<34} {pw:6.1f} / {pc:6.1f}   step {t.median:6.1f}"
              f"   goal {g:4.0f} less painting {g - pw:6.1f}")
    if not args.no_envelope:
        print("envelope of 20 cases after an edit, in the document (median wall / CPU)")
        for n in (100, 2000):
            (cw, cc), (sw, sc_) = run_envelope(n)
            verdict = ""
            if n == 2000:
                met = cw <= ENVELOPE_TARGET
                verdict = f"  target <= {ENVELOPE_TARGET:.0f} ms: {'met' if met else 'MISSED'}"
                ok = ok and met
            print(f"{n:>6} vertices: an edit of the active case {cw:6.2f} / {cc:6.2f} ms"
                  f"{verdict}")
            print(f"{'':>6}  an edit of the section (every case solved again) "
                  f"{sw:6.2f} / {sc_:6.2f} ms")
    print("goals:", "all met" if ok else "some MISSED")
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
