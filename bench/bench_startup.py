"""Benchmark (not a test): how long Wetline takes to start, as whole processes.

    python bench/bench_startup.py [--runs N] [--imports] [--sample FILE]

(a) ``wetline solve SAMPLE --json`` (run as ``python -m wetline``) against
    the floor every such process pays, ``python -c "import numpy, shapely"``;
    goal: at most 2.5 times the floor.
(b) the main window's first paint on the same sample, opened the way
    ``wetline SAMPLE`` opens it, against a bare PySide6 QMainWindow shown
    and painted by a script; both offscreen; goal: at most 2.5 times.

Each figure is the median of ``--runs`` runs (default 7), the commands
taking turns so that a busy machine slows both alike. ``--imports`` also
lists the imports that cost the most in each wetline process (python -X
importtime), which is where to look when a ratio grows.
"""

import argparse
import os
import statistics
import subprocess
import sys
import textwrap
import time
from pathlib import Path

SAMPLE = Path(__file__).resolve().parents[1] / "sample_sections" / "sump_with_lid.section.json"
GOALS = {"solve": 2.5, "window": 2.5}

FLOOR = "import numpy, shapely"

BARE_WINDOW = textwrap.dedent("""\
    import os
    from PySide6.QtCore import QEvent, QObject, QTimer
    from PySide6.QtWidgets import QApplication, QLabel, QMainWindow

    app = QApplication([])
    window = QMainWindow()
    window.setCentralWidget(QLabel("bare"))
    window.resize(1500, 940)


    class FirstPaint(QObject):
        def eventFilter(self, obj, event):
            if obj is window and event.type() == QEvent.Type.Paint:
                QTimer.singleShot(0, lambda: os._exit(0))
            return False


    spy = FirstPaint()
    app.installEventFilter(spy)
    window.show()
    app.exec()
""")

WETLINE_WINDOW = textwrap.dedent("""\
    import os, sys

    from wetline.app.window.launch import open_main_window

    # What wetline.app.window.launch.launch(path) does, up to app.exec().
    app, window = open_main_window(sys.argv[1])
    if window.doc.path != os.path.abspath(sys.argv[1]):
        os._exit(3)

    from PySide6.QtCore import QEvent, QObject, QTimer


    class FirstPaint(QObject):
        def eventFilter(self, obj, event):
            if obj is window and event.type() == QEvent.Type.Paint:
                QTimer.singleShot(0, lambda: os._exit(0))
            return False


    spy = FirstPaint()
    app.installEventFilter(spy)
    window.show()
    app.exec()
""")


def commands(sample=SAMPLE):
    py = sys.executable
    return {
        "floor": [py, "-c", FLOOR],
        "solve": [py, "-m", "wetline", "solve", str(sample), "--json"],
        "bare window": [py, "-c", BARE_WINDOW],
        "window": [py, "-c", WETLINE_WINDOW, str(sample)],
    }


def wall_time(argv, env):
    start = time.perf_counter()
    proc = subprocess.run(argv, env=env, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                          text=True, timeout=120)
    elapsed = time.perf_counter() - start
    if proc.returncode != 0:
        raise SystemExit(f"{argv[:3]} failed ({proc.returncode}): {proc.stderr[-2000:]}")
    return elapsed


def compile_bytecode():
    """Write the bytecode of Wetline's own modules, as installing the wheel
    does (pip compiles it); an editable install under
    PYTHONDONTWRITEBYTECODE=1 would otherwise compile every module from
    source at each start. Returns the folders compiled."""
    import compileall

    import wetline
    import wetline.app
    import wetline.core

    folders = sorted({p for m in (wetline, wetline.core, wetline.app) for p in m.__path__})
    for folder in folders:
        if not compileall.compile_dir(folder, quiet=1):
            raise SystemExit(f"could not compile the bytecode in {folder}")
    return folders


def costly_imports(argv, env, top=8):
    """The ``top`` imports of most cumulative time, as (seconds, module)."""
    proc = subprocess.run([argv[0], "-X", "importtime", *argv[1:]], env=env,
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)
    rows = []
    for line in proc.stderr.splitlines():
        if not line.startswith("import time:") or "|" not in line:
            continue
        _, cumulative, name = line[len("import time:"):].split("|")
        if cumulative.strip().isdigit() and not name.startswith("  "):  # top level only
            rows.append((int(cumulative) / 1e6, name.strip()))
    return sorted(rows, reverse=True)[:top]


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--runs", type=int, default=7)
    ap.add_argument("--imports", action="store_true")
    ap.add_argument("--sample", type=Path, default=SAMPLE)
    args = ap.parse_args()
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    cmds = commands(args.sample.resolve())
    compile_bytecode()
    times = {name: [] for name in cmds}
    for argv in cmds.values():  # one warm-up run each: the file cache
        wall_time(argv, env)
    for _ in range(args.runs):
        for name, argv in cmds.items():
            times[name].append(wall_time(argv, env))
    med = {name: statistics.median(t) for name, t in times.items()}
    print(f"whole-process start-up, median of {args.runs} runs "
          f"(Python {sys.version.split()[0]}, {os.cpu_count()} cores, offscreen, "
          "bytecode compiled as an installed wheel has it)")
    for name in cmds:
        print(f"  {name:12s} {med[name] * 1000:7.0f} ms   "
              f"(min {min(times[name]) * 1000:.0f}, max {max(times[name]) * 1000:.0f})")
    for label, name, floor in (("(a) wetline solve --json / import numpy, shapely", "solve",
                                "floor"),
                               ("(b) main window first paint / bare QMainWindow", "window",
                                "bare window")):
        ratio = med[name] / med[floor]
        goal = GOALS[name]
        verdict = "meets" if ratio <= goal else "misses"
        print(f"{label}: {ratio:.2f}x  (goal at most {goal}x: {verdict} it)")
    if args.imports:
        for name in ("solve", "window"):
            print(f"costliest top-level imports of '{name}' (cumulative):")
            for seconds, module in costly_imports(cmds[name], env):
                print(f"  {seconds * 1000:6.0f} ms  {module}")


if __name__ == "__main__":
    main()
