"""The README's first command starts the program on a machine with a display:
``tools/setup.sh`` must install every system library Qt's X11 platform
plugin (xcb) loads, not only those the offscreen tests need. Without
libxcb-icccm4 and libxcb-keysyms1 (absent on a Debian machine that has only
an X server) the window never opens: "Could not load the Qt platform plugin
"xcb"".

The check: every shared library the plugin and its Qt library link against
resolves (``ldd``), and the one Qt opens at run time (libxcb-cursor, Qt 6.5
and later) is present. It needs a Debian-like machine where ``tools/setup.sh``
has run, as CI's is; elsewhere it is skipped.
"""

import re
import shutil
import subprocess
import sys
from pathlib import Path

import PySide6
import pytest

ROOT = Path(__file__).resolve().parents[2]
QT = Path(PySide6.__file__).parent / "Qt"
PLUGIN = QT / "plugins" / "platforms" / "libqxcb.so"

pytestmark = pytest.mark.skipif(
    not sys.platform.startswith("linux") or shutil.which("ldd") is None
    or shutil.which("dpkg") is None or not PLUGIN.exists(),
    reason="needs Linux with ldd and dpkg, and PySide6's xcb plugin")


def _unresolved(path):
    out = subprocess.run(["ldd", str(path)], capture_output=True, text=True, check=True).stdout
    return sorted({line.split()[0] for line in out.splitlines() if "not found" in line})


def _setup_packages():
    text = (ROOT / "tools" / "setup.sh").read_text()
    block = re.search(r"for pkg in (.*?); do", text, re.S).group(1)
    return set(block.replace("\\\n", " ").split())


def test_the_xcb_plugin_finds_every_library_it_links():
    libs = [PLUGIN, *sorted((QT / "lib").glob("libQt6XcbQpa.so*"))[:1]]
    missing = sorted({name for lib in libs for name in _unresolved(lib)})
    assert not missing, (f"Qt's xcb plugin cannot load: {', '.join(missing)} not found; "
                         "tools/setup.sh must install them")


def test_setup_installs_the_library_qt_opens_at_run_time():
    # Qt >= 6.5 opens libxcb-cursor with dlopen: ldd does not list it.
    assert "libxcb-cursor0" in _setup_packages()
    done = subprocess.run(["dpkg", "-s", "libxcb-cursor0"], capture_output=True)
    assert done.returncode == 0, "libxcb-cursor0 is not installed"
