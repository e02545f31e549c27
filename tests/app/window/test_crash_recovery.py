"""The real program, killed: started offscreen on a section file, edited,
killed with SIGKILL once its recovery copy is written, started again: it
offers the copy, and the restored document is the edited one, modified and
with its file. The data and settings folders point at tmp_path (XDG_DATA_HOME,
XDG_CONFIG_HOME), so the user's own are never touched."""

import json
import os
import shutil
import signal
import subprocess
import sys
import time
from datetime import datetime

import pytest

from wetline.core.section_file import read_section_file

pytestmark = [
    pytest.mark.slow,
    pytest.mark.skipif(not sys.platform.startswith("linux"),
                       reason="the data folder is moved with XDG_DATA_HOME (Linux)"),
]

# Each driver starts the real entry point (``wetline FILE``) after scheduling
# what a user would do once the window is up; dialogs are answered by
# replacing their functions (no modal dialog can block).
EDIT_THEN_WAIT = r"""
import sys
from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QApplication
app = QApplication(sys.argv[:1])

def edit():
    from wetline.app.model import editing
    w = next(w for w in QApplication.topLevelWidgets() if type(w).__name__ == "MainWindow")
    editing.fill_to_level(w.doc, 1.25)
    print("EDITED", flush=True)

QTimer.singleShot(200, edit)
from wetline.__main__ import main
sys.exit(main([sys.argv[1]]))
"""

RESTART_AND_RESTORE = r"""
import json, sys
from PySide6.QtCore import QTimer
from PySide6.QtWidgets import QApplication
from wetline.app.window import dialogs
app = QApplication(sys.argv[:1])

def ask_recovery(parent, copies):
    print("OFFER " + json.dumps([{"name": c.name, "original_path": c.original_path,
                                  "saved_at": c.saved_at.isoformat()} for c in copies]),
          flush=True)
    return ("restore", 0)

dialogs.ask_recovery = ask_recovery
dialogs.ask_save_changes = lambda parent, name: "discard"

def report():
    w = next(w for w in QApplication.topLevelWidgets() if type(w).__name__ == "MainWindow")
    d = w.doc
    print("STATE " + json.dumps({"path": d.path, "modified": d.is_modified,
                                 "level": d.case.fill_level, "title": w.windowTitle()}),
          flush=True)
    w.close()  # discards: the program's own copy goes too
    app.quit()

QTimer.singleShot(0, report)
from wetline.__main__ import main
sys.exit(main([sys.argv[1]]))
"""


def _env(tmp_path):
    env = dict(os.environ)
    env.update(QT_QPA_PLATFORM="offscreen", XDG_DATA_HOME=str(tmp_path / "data"),
               XDG_CONFIG_HOME=str(tmp_path / "config"),
               XDG_RUNTIME_DIR=str(tmp_path / "runtime"))
    (tmp_path / "runtime").mkdir(mode=0o700)
    return env


def test_killed_program_offers_its_recovery_copy_at_the_next_start(tmp_path, sample):
    path = tmp_path / "job" / "sump.section.json"
    path.parent.mkdir()
    shutil.copy(sample("sump_with_lid"), path)
    saved = path.read_bytes()
    env = _env(tmp_path)
    folder = tmp_path / "data" / "Wetline" / "Wetline" / "recovery"
    started = time.time()
    proc = subprocess.Popen([sys.executable, "-c", EDIT_THEN_WAIT, str(path)], env=env,
                            stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    try:
        assert proc.stdout.readline().strip() == "EDITED"
        deadline = time.time() + 60  # the first copy is due 5 s after the edit
        while not list(folder.glob("*.recovery.json")) and time.time() < deadline:
            assert proc.poll() is None, proc.stderr.read()
            time.sleep(0.1)
        assert list(folder.glob("*.recovery.json")), "no recovery copy was written"
        written_after = time.time() - started
    finally:
        proc.send_signal(signal.SIGKILL)
        proc.wait(30)
        proc.stdout.close()
        proc.stderr.close()
    assert proc.returncode == -signal.SIGKILL
    assert written_after >= 5.0  # shortly after the first edit, not at once
    assert path.read_bytes() == saved  # the user's file is untouched
    assert {p.suffix for p in folder.iterdir()} == {".json", ".lock"}  # the lock is stale

    again = subprocess.run([sys.executable, "-c", RESTART_AND_RESTORE, str(path)], env=env,
                           capture_output=True, text=True, timeout=120)
    assert again.returncode == 0, again.stderr
    lines = {line.split(" ", 1)[0]: json.loads(line.split(" ", 1)[1])
             for line in again.stdout.splitlines() if line.startswith(("OFFER", "STATE"))}
    (offer,) = lines["OFFER"]
    assert offer["name"] == "sump.section.json" and offer["original_path"] == str(path)
    saved_at = datetime.fromisoformat(offer["saved_at"]).timestamp()
    assert started + 5.0 <= saved_at <= started + written_after + 1.0
    state = lines["STATE"]
    assert state == {"path": str(path), "modified": True, "level": 1.25,
                     "title": "sump.section.json[*] - Wetline"}
    assert read_section_file(path).fill_level == 2.2  # restored, not yet saved
    assert list(folder.iterdir()) == []  # discarded on close: nothing left
